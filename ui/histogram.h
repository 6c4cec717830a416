// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::ui {

/// Equal-width bins over [start, start + binWidth * counts.size()). A value equal to a bin's
/// upper edge falls into the next bin (half-open bins); the very last edge belongs to the
/// last bin. Values outside the range are counted in `below` / `above`, never dropped silently.
struct Histogram {
    double start = 0.0;
    double binWidth = 1.0;
    std::vector<std::int64_t> counts;
    std::int64_t below = 0;
    std::int64_t above = 0;
    std::int64_t ignored = 0; ///< NaN values

    /// Bins with fixed edges: `bins` bins from `low` to `high`.
    static Histogram build(std::span<const double> values, double low, double high, int bins);
    /// Bins of a "nice" width (NiceAxis::niceNumber) covering every finite value with
    /// about `targetBins` bins; edges are whole multiples of the width.
    static Histogram buildAuto(std::span<const double> values, int targetBins = 20);

    std::int64_t total() const;         ///< counted values, inside and outside the range
    double binCentre(std::size_t i) const;
    double binLow(std::size_t i) const { return start + binWidth * static_cast<double>(i); }
    double end() const { return binLow(counts.size()); }
    /// counts[i] / total(), 0 when empty.
    double share(std::size_t i) const;
};

} // namespace slatewise::ui
