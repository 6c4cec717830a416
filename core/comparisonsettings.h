// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/metric.h"
#include "core/segmentspec.h"

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

/// Everything that determines a paired comparison of two evaluated runs; stored with the
/// result so the same question is never answered twice with different settings.
struct ComparisonSettings {
    std::vector<Metric> metrics;        ///< empty: defaultMetrics()
    std::int32_t bootstrap = 2000;      ///< resamples of users for the interval of the mean difference
    std::uint64_t seed = 20261206;      ///< bootstrap seed (fixed: the same data gives the same interval)
    double level = 0.95;                ///< interval level
    double alpha = 0.05;                ///< significance level applied to Holm-adjusted p-values
    double tolerance = 1e-9;            ///< |difference| <= tolerance counts as a tie
    std::int32_t minSegmentSize = 30;   ///< smaller segments are reported as too small to judge
    std::int32_t worst = 10;            ///< length of the who-got-worse list
    std::vector<SegmentSpec> segments;

    /// ndcg, precision, recall, map, rmse, ild, novelty.
    static std::vector<Metric> defaultMetrics();
    /// The metrics actually asked for (defaults when none were given).
    std::vector<Metric> effectiveMetrics() const;

    /// Canonical JSON object (stable key order); part of the workspace key of a stored comparison.
    std::string toJson() const;
    static Result<ComparisonSettings> fromJson(const std::string& json);
};

/// The name a metric carries in comparison output: the registry key, except that the mean of
/// per-user AP is "map" and the mean of per-user RR is "mrr", as on the command line.
std::string_view comparisonMetricKey(Metric m);

} // namespace slatewise::core
