// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"
#include "core/metric.h"

#include <QWidget>

#include <array>
#include <functional>
#include <map>
#include <memory>
#include <optional>
#include <string>

class QComboBox;
class QLabel;
class QListWidget;
class QPushButton;
class QTableView;

namespace slatewise::ui {

class GenreTimelineChart;
class InspectorListModel;
class ScoreRatingChart;
class UserMetricsModel;
class WithheldModel;
class WorkspaceDocument;
struct UserInspection;

/// "User inspector": one user under one run. Their top-k list beside their withheld items
/// (favourites first), hits, already-seen titles and series-order problems marked in both,
/// every warning sentence, their metrics against the run's average, a score-against-rating
/// chart and a genre timeline of their history. A run switcher shows the same user under
/// another run; previous/next step through the browse list's order.
class InspectorScreen : public QWidget {
    Q_OBJECT
public:
    /// Gives the neighbour of a user in the browse order (step -1 or +1).
    using NeighbourFn = std::function<std::optional<core::UserIndex>(core::UserIndex, int)>;

    explicit InspectorScreen(WorkspaceDocument* document, QWidget* parent = nullptr);
    ~InspectorScreen() override;

    void setNeighbourFunction(NeighbourFn fn) { m_neighbour = std::move(fn); }
    /// Shows `user` under `runName`; false when the data is not loaded yet or the run is unknown.
    bool showUser(const QString& runName, core::UserIndex user);
    std::optional<core::UserIndex> currentUser() const { return m_user; }
    QString currentRun() const;
    std::shared_ptr<const UserInspection> inspection() const { return m_inspection; }

    InspectorListModel* listModel() const { return m_listModel; }
    WithheldModel* withheldModel() const { return m_withheldModel; }
    UserMetricsModel* metricsModel() const { return m_metricsModel; }
    /// The warning sentences as shown.
    QStringList warningTexts() const;

signals:
    /// Previous/next moved to another user (the browse list follows).
    void userStepped(const QString& runName, core::UserIndex user);

private:
    void step(int delta);
    void rebuildRuns();
    void refresh();
    void updateButtons();

    WorkspaceDocument* m_document;
    NeighbourFn m_neighbour;
    std::optional<core::UserIndex> m_user;
    std::shared_ptr<const UserInspection> m_inspection;
    // Run means per evaluation, computed once (they read every user's row).
    std::map<const void*, std::array<double, core::kMetricCount>> m_meanCache;

    QLabel* m_heading;
    QComboBox* m_run;
    QPushButton* m_previous;
    QPushButton* m_next;
    QLabel* m_summary;
    InspectorListModel* m_listModel;
    WithheldModel* m_withheldModel;
    UserMetricsModel* m_metricsModel;
    QTableView* m_listView;
    QTableView* m_withheldView;
    QTableView* m_metricsView;
    QListWidget* m_warnings;
    ScoreRatingChart* m_scoreChart;
    GenreTimelineChart* m_timeline;
};

} // namespace slatewise::ui
