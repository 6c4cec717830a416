// SPDX-License-Identifier: MIT
#pragma once

#include <QDialog>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QSpinBox;

namespace slatewise::ui {

class BackgroundTask;
class FitLossChart;

/// "Fit a reference model": the settings of `slatewise fit`, a live per-iteration loss chart
/// (train and withheld RMSE), progress and cancel. The fitted run is stored in the workspace
/// (cancel stores nothing) and evaluated like any imported run.
class FitDialog : public QDialog {
    Q_OBJECT
public:
    FitDialog(const QString& workspacePath, QWidget* parent = nullptr);
    ~FitDialog() override;

    /// Chooses the model by its command-line key ("bias", "als", ...); the run name follows.
    void setModel(const QString& key);
    void setRunName(const QString& name);
    void setRank(int rank);
    void setLambda(double lambda);
    void setIterations(int iterations);
    QString runName() const;
    QString statusText() const;
    FitLossChart* chart() const { return m_chart; }

    bool startFit();
    void cancel();
    BackgroundTask* task() const { return m_task; }

signals:
    void fitted(const QString& runName);

protected:
    void reject() override;

private:
    void updateEnabled();

    QString m_path;
    QComboBox* m_model;
    QLineEdit* m_name;
    QSpinBox* m_rank;
    QDoubleSpinBox* m_lambda;
    QSpinBox* m_iterations;
    QSpinBox* m_neighbours;
    QSpinBox* m_seed;
    FitLossChart* m_chart;
    QProgressBar* m_progress;
    QLabel* m_status;
    QPushButton* m_start;
    QPushButton* m_cancel;
    BackgroundTask* m_task;
};

} // namespace slatewise::ui
