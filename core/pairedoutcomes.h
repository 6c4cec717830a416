// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"

#include <cstdint>
#include <span>

namespace slatewise::core {

/// Per-user wins, ties and losses of a candidate against a base on one metric.
/// A tie is |candidate - base| <= tolerance. For a "higher is better" metric an increase is a
/// win; for a "lower is better" metric (rmse, mae, ...) a decrease is a win. For a metric with
/// no better direction (mean_error, popularity_lift) "wins" count increases and "losses"
/// decreases, and callers must say so.
struct PairedOutcomes {
    std::int64_t wins = 0;
    std::int64_t ties = 0;
    std::int64_t losses = 0;
};

/// `differences` are candidate - base.
PairedOutcomes countPairedOutcomes(std::span<const double> differences, Better better, double tolerance);

} // namespace slatewise::core
