// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"

#include <cstdint>
#include <vector>

namespace slatewise::ui {

/// Per-user differences (candidate - base) of one metric, sorted, with each user classed as
/// better off, tied or worse off given which direction of the metric is better.
struct DifferenceDistribution {
    std::vector<double> sorted;      ///< ascending, NaN removed
    std::int64_t improved = 0;       ///< users for whom the candidate is better
    std::int64_t tied = 0;           ///< |difference| <= tolerance
    std::int64_t worsened = 0;
    std::int64_t ignored = 0;        ///< NaN differences
    double mean = 0.0;
    double median = 0.0;
    core::Better better = core::Better::Higher;

    static DifferenceDistribution build(const std::vector<double>& differences, core::Better better,
                                        double tieTolerance = 1e-9);

    std::int64_t count() const { return static_cast<std::int64_t>(sorted.size()); }
    /// Percent of users (0..100) at the centre of sorted position i, for the x axis.
    double percentAt(std::size_t i) const;
    /// Quantile q in [0, 1] of the differences by linear interpolation (numpy's default,
    /// "linear" method); NaN when empty.
    double quantile(double q) const;
};

} // namespace slatewise::ui
