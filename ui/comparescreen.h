// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <QWidget>

#include <memory>

class QComboBox;
class QLabel;
class QPushButton;
class QTableView;

namespace slatewise::core {
struct RunComparison;
}

namespace slatewise::ui {

class ComparisonModel;
class SegmentModel;
class UserDifferenceChart;
class WorkspaceDocument;
class WorseUsersModel;

/// "Compare runs": is the candidate better than the base, for whom, and is the difference
/// real? The paired comparison table, the per-user difference chart, the segment breakdown
/// and the who-got-worse list (double-click opens the user in the inspector).
class CompareScreen : public QWidget {
    Q_OBJECT
public:
    explicit CompareScreen(WorkspaceDocument* document, QWidget* parent = nullptr);
    ~CompareScreen() override;

    /// Chooses the runs and starts the comparison in the background; false when busy.
    bool compare(const QString& base, const QString& candidate);
    std::shared_ptr<const core::RunComparison> comparison() const { return m_comparison; }
    ComparisonModel* comparisonModel() const { return m_model; }
    SegmentModel* segmentModel() const { return m_segments; }
    WorseUsersModel* worseModel() const { return m_worse; }

signals:
    void openUser(const QString& runName, core::UserIndex user);
    void comparisonReady();

private:
    void rebuildRuns();
    void start();
    void show(std::shared_ptr<const core::RunComparison> comparison);
    void updateDetail();

    WorkspaceDocument* m_document;
    std::shared_ptr<const core::RunComparison> m_comparison;
    QComboBox* m_base;
    QComboBox* m_candidate;
    QComboBox* m_segmentKind;
    QComboBox* m_detailMetric;
    QPushButton* m_go;
    QLabel* m_headline;
    ComparisonModel* m_model;
    SegmentModel* m_segments;
    WorseUsersModel* m_worse;
    QTableView* m_table;
    QTableView* m_segmentView;
    QTableView* m_worseView;
    QLabel* m_worseCaption;
    UserDifferenceChart* m_chart;
};

} // namespace slatewise::ui
