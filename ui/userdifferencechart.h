// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"
#include "ui/chartview.h"
#include "ui/differencedistribution.h"

#include <QString>

#include <vector>

namespace slatewise::ui {

/// Per-user differences of one metric between two runs (candidate − base), sorted from the
/// users who lost most to those who gained most; the area is coloured by better / worse
/// off, with the counts of wins, ties and losses in the legend.
class UserDifferenceChart : public ChartView {
    Q_OBJECT
public:
    explicit UserDifferenceChart(QWidget* parent = nullptr);
    /// `differences`: candidate − base per user (NaN ignored). `metric` decides which sign is better.
    void setData(const std::vector<double>& differences, core::Metric metric, const QString& baseName,
                 const QString& candidateName, double tieTolerance = 1e-9);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    DifferenceDistribution m_dist;
    core::Metric m_metric = core::Metric::Ndcg;
    QString m_base, m_candidate;
};

} // namespace slatewise::ui
