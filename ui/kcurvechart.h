// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "ui/chartview.h"
#include "ui/kcurveseries.h"

#include <vector>

namespace slatewise::ui {

/// Precision@k, recall@k and NDCG@k for k = 1..50, one panel per measure, one line per run;
/// a dashed line marks the k the evaluation used.
class KCurveChart : public ChartView {
    Q_OBJECT
public:
    explicit KCurveChart(QWidget* parent = nullptr);
    void setData(const std::vector<core::RunEvaluation>& runs, int maxK = 50);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    KCurveSeries m_series;
};

} // namespace slatewise::ui
