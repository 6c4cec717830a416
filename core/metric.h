// SPDX-License-Identifier: MIT
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string_view>

namespace slatewise::core {

/// Every per-user measure Slatewise computes. The order is the column order of the
/// per-user CSV and of the workspace's user_results table.
enum class Metric {
    Rmse,
    Mae,
    MeanError,
    Precision,
    Recall,
    Ap,
    Rr,
    Ndcg,
    NdcgGraded,
    HeldoutTopk,
    Ild,
    Novelty,
    PopularityLift,
    CalibrationKl,
    SeriesShare,
    OrderViolations,
    BurstEcho,
    SeenInList,
    Count
};

inline constexpr std::size_t kMetricCount = static_cast<std::size_t>(Metric::Count);

/// Which direction is "better" — worst-first sorting and win/loss counting depend on it.
enum class Better { Higher, Lower, Neither };

struct MetricInfo {
    Metric metric;
    std::string_view key;     ///< as in JSON, CSV and the command line
    std::string_view label;   ///< short column header
    Better better;
    std::string_view summary; ///< one sentence with the formula, for tooltips and help
};

const MetricInfo& metricInfo(Metric m);
const std::array<MetricInfo, kMetricCount>& allMetrics();
/// Accepts the key ("ndcg_graded"); also "map" for Ap and "mrr" for Rr.
std::optional<Metric> metricFromKey(std::string_view key);

} // namespace slatewise::core
