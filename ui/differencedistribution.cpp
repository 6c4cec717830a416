// SPDX-License-Identifier: MIT
#include "ui/differencedistribution.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace slatewise::ui {

DifferenceDistribution DifferenceDistribution::build(const std::vector<double>& differences, core::Better better,
                                                     double tieTolerance)
{
    DifferenceDistribution d;
    d.better = better;
    d.sorted.reserve(differences.size());
    for (const double v : differences) {
        if (std::isnan(v)) {
            ++d.ignored;
            continue;
        }
        d.sorted.push_back(v);
        if (std::abs(v) <= tieTolerance)
            ++d.tied;
        else if ((v > 0) == (better != core::Better::Lower))
            ++d.improved;
        else
            ++d.worsened;
    }
    // A metric without a better direction has no winners or losers: all non-ties count as
    // "improved" for positive differences above, which would mislead, so move them to ties.
    if (better == core::Better::Neither) {
        d.tied += d.improved + d.worsened;
        d.improved = d.worsened = 0;
    }
    std::sort(d.sorted.begin(), d.sorted.end());
    if (!d.sorted.empty()) {
        d.mean = std::accumulate(d.sorted.begin(), d.sorted.end(), 0.0) / static_cast<double>(d.sorted.size());
        d.median = d.quantile(0.5);
    }
    return d;
}

double DifferenceDistribution::percentAt(std::size_t i) const
{
    if (sorted.empty())
        return 0.0;
    return 100.0 * (static_cast<double>(i) + 0.5) / static_cast<double>(sorted.size());
}

double DifferenceDistribution::quantile(double q) const
{
    if (sorted.empty())
        return std::numeric_limits<double>::quiet_NaN();
    q = std::clamp(q, 0.0, 1.0);
    const double pos = q * static_cast<double>(sorted.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(pos));
    const auto hi = std::min(lo + 1, sorted.size() - 1);
    const double frac = pos - static_cast<double>(lo);
    return sorted[lo] + (sorted[hi] - sorted[lo]) * frac;
}

} // namespace slatewise::ui
