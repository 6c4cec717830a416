// SPDX-License-Identifier: MIT
#pragma once

#include "ui/chartview.h"

#include <QString>

#include <vector>

namespace slatewise::ui {

/// Train and withheld RMSE per iteration while a model is fitted; appendIteration() adds a
/// point live (call from the GUI thread).
class FitLossChart : public ChartView {
    Q_OBJECT
public:
    struct Iteration {
        int iteration = 0;       ///< 1-based
        double trainRmse = 0.0;
        double withheldRmse = 0.0; ///< NaN when not measured
    };

    explicit FitLossChart(QWidget* parent = nullptr);
    void setData(std::vector<Iteration> iterations, const QString& modelLabel);
    void appendIteration(const Iteration& it);
    void clear();
    const std::vector<Iteration>& iterations() const { return m_iterations; }

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    std::vector<Iteration> m_iterations;
    QString m_model;
};

} // namespace slatewise::ui
