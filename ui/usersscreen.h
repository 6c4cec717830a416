// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"
#include "core/metric.h"

#include <QWidget>

#include <optional>

class QComboBox;
class QLabel;
class QLineEdit;
class QTableView;

namespace slatewise::ui {

class UserBrowserModel;
class UserBrowserProxy;
class WorkspaceDocument;

/// "Users": every evaluated user of one run, worst served first by the chosen metric, with
/// filters by warning, segment and user id. Selecting a row opens the user in the inspector.
class UsersScreen : public QWidget {
    Q_OBJECT
public:
    explicit UsersScreen(WorkspaceDocument* document, QWidget* parent = nullptr);

    QString currentRun() const;
    void setRun(const QString& runName);
    /// Sorts worst first by `column` of UserBrowserModel.
    void sortWorstFirst(int column);
    void sortWorstFirst(core::Metric metric);
    UserBrowserModel* model() const { return m_model; }
    UserBrowserProxy* proxy() const { return m_proxy; }
    QTableView* table() const { return m_table; }

    /// The neighbour of `user` in the current (sorted, filtered) order; nullopt at either end.
    std::optional<core::UserIndex> neighbour(core::UserIndex user, int step) const;
    /// Selects and scrolls to `user` when visible.
    void selectUser(core::UserIndex user);
    /// The first user in the current order (the worst served).
    std::optional<core::UserIndex> firstUser() const;

signals:
    /// `open`: the user pressed Enter or double-clicked (show the inspector), otherwise the
    /// selection merely moved (update the inspector in place).
    void userChosen(const QString& runName, core::UserIndex user, bool open);

private:
    void rebuildRuns();
    void loadRun();
    void updateCount();
    void emitCurrent(bool open);

    WorkspaceDocument* m_document;
    UserBrowserModel* m_model;
    UserBrowserProxy* m_proxy;
    QComboBox* m_run;
    QComboBox* m_sortBy;
    QComboBox* m_warning;
    QComboBox* m_segment;
    QLineEdit* m_text;
    QLabel* m_count;
    QTableView* m_table;
};

} // namespace slatewise::ui
