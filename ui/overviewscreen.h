// SPDX-License-Identifier: MIT
#pragma once

#include <QWidget>

class QDoubleSpinBox;
class QLabel;
class QSpinBox;
class QTableView;
class QTimer;

namespace slatewise::ui {

class BandErrorChart;
class ErrorDistributionChart;
class KCurveChart;
class RunMetricsModel;
class WarningPrevalenceChart;
class WorkspaceDocument;

/// "Runs overview": the metrics table of every run and the four run-level charts, with the
/// k and relevance-threshold controls that recompute everything in the background.
class OverviewScreen : public QWidget {
    Q_OBJECT
public:
    explicit OverviewScreen(WorkspaceDocument* document, QWidget* parent = nullptr);

    RunMetricsModel* metricsModel() const { return m_model; }
    QTableView* table() const { return m_table; }

signals:
    /// A run row was double-clicked: browse its users.
    void browseRun(const QString& runName);

private:
    void refresh();
    void refreshErrors();
    void syncControls();
    void applySettings();

    WorkspaceDocument* m_document;
    RunMetricsModel* m_model;
    QTableView* m_table;
    QSpinBox* m_k;
    QDoubleSpinBox* m_relevantAt;
    QLabel* m_caption;
    QTimer* m_debounce;
    BandErrorChart* m_bandChart;
    ErrorDistributionChart* m_errorChart;
    KCurveChart* m_kChart;
    WarningPrevalenceChart* m_warningChart;
};

} // namespace slatewise::ui
