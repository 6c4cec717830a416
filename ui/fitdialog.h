// SPDX-License-Identifier: MIT
#pragma once

#include "ui/runjobdialog.h"

class QComboBox;
class QDoubleSpinBox;
class QLineEdit;
class QSpinBox;

namespace slatewise::ui {

class FitLossChart;

/// "Fit a reference model": the settings of `slatewise fit`, a live per-iteration loss chart
/// (train and withheld RMSE), progress and cancel. The fitted run is stored in the workspace
/// (cancel stores nothing) and evaluated like any imported run.
class FitDialog : public RunJobDialog {
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
    FitLossChart* chart() const { return m_chart; }

    bool startFit();

signals:
    void fitted(const QString& runName);

private:
    void updateEnabled();

    QComboBox* m_model;
    QLineEdit* m_name;
    QSpinBox* m_rank;
    QDoubleSpinBox* m_lambda;
    QSpinBox* m_iterations;
    QSpinBox* m_neighbours;
    QSpinBox* m_seed;
    FitLossChart* m_chart;
};

} // namespace slatewise::ui
