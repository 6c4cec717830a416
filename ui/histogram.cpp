// SPDX-License-Identifier: MIT
#include "ui/histogram.h"

#include "ui/niceaxis.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace slatewise::ui {

Histogram Histogram::build(std::span<const double> values, double low, double high, int bins)
{
    Histogram h;
    bins = std::max(1, bins);
    if (!(high > low))
        high = low + 1.0;
    h.start = low;
    h.binWidth = (high - low) / bins;
    h.counts.assign(static_cast<std::size_t>(bins), 0);
    for (const double v : values) {
        if (std::isnan(v)) {
            ++h.ignored;
            continue;
        }
        if (v < low) {
            ++h.below;
            continue;
        }
        if (v > high) {
            ++h.above;
            continue;
        }
        auto i = static_cast<std::int64_t>(std::floor((v - low) / h.binWidth));
        // The top edge belongs to the last bin; guard against rounding at either end.
        i = std::clamp<std::int64_t>(i, 0, bins - 1);
        // floor((v-low)/w) can land one bin low when v sits exactly on an inner edge that
        // is not representable; compare with the edges themselves.
        if (i + 1 < bins && v >= h.binLow(static_cast<std::size_t>(i + 1)))
            ++i;
        else if (i > 0 && v < h.binLow(static_cast<std::size_t>(i)))
            --i;
        ++h.counts[static_cast<std::size_t>(i)];
    }
    return h;
}

Histogram Histogram::buildAuto(std::span<const double> values, int targetBins)
{
    double lo = std::numeric_limits<double>::infinity();
    double hi = -std::numeric_limits<double>::infinity();
    for (const double v : values) {
        if (std::isfinite(v)) {
            lo = std::min(lo, v);
            hi = std::max(hi, v);
        }
    }
    if (!std::isfinite(lo))
        return build(values, 0.0, 1.0, 1);
    targetBins = std::max(1, targetBins);
    double width = hi > lo ? NiceAxis::niceNumber((hi - lo) / targetBins, false) : 1.0;
    const double start = std::floor(lo / width) * width;
    // Half-open bins: a maximum sitting on an edge needs one more bin above it.
    auto bins = static_cast<int>(std::floor((hi - start) / width + 1e-9)) + 1;
    return build(values, start, start + width * bins, bins);
}

std::int64_t Histogram::total() const
{
    std::int64_t t = below + above;
    for (const auto c : counts)
        t += c;
    return t;
}

double Histogram::binCentre(std::size_t i) const
{
    return start + binWidth * (static_cast<double>(i) + 0.5);
}

double Histogram::share(std::size_t i) const
{
    const auto t = total();
    return t > 0 ? static_cast<double>(counts[i]) / static_cast<double>(t) : 0.0;
}

} // namespace slatewise::ui
