// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "ui/chartview.h"

#include <vector>

namespace slatewise::ui {

/// Error by withheld rating band: per band and run, RMSE bars (top) and mean signed error
/// bars (bottom, score − rating, positive = over-prediction), so over-predicted low ratings
/// and under-predicted favourites are visible. Runs without scores are named as skipped.
class BandErrorChart : public ChartView {
    Q_OBJECT
public:
    explicit BandErrorChart(QWidget* parent = nullptr);
    void setData(const std::vector<core::RunEvaluation>& runs);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    std::vector<core::RunEvaluation> m_runs; // only the summaries are kept (users stripped)
};

} // namespace slatewise::ui
