// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "core/progress.h"

#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Seeded nonparametric bootstrap over the rows of a table (one row per user): each
/// resample draws n rows with replacement (Efron & Tibshirani, An Introduction to the
/// Bootstrap, 1993, ch. 6 and 13 for the percentile interval).
///
/// Resample b draws from its own random stream derived from (seed, b), so the result
/// does not depend on the number of threads and the same seed always gives the same
/// intervals. Any statistic that is a function of column sums (a mean, a ratio of sums, a
/// mean over a subset via an indicator column) is computed from resampleColumnSums().
class Bootstrap {
public:
    Bootstrap(std::int32_t resamples, std::uint64_t seed);

    std::int32_t resamples() const { return m_resamples; }
    std::uint64_t seed() const { return m_seed; }

    /// `table` is row-major, rows × cols. Returns resamples × cols sums, row-major: entry
    /// [b * cols + c] is the sum of column c over the rows drawn in resample b.
    /// Parallel over resamples. Returns an empty vector when cancelled.
    std::vector<double> resampleColumnSums(std::span<const double> table, std::size_t rows, std::size_t cols,
                                           const Progress& progress = {}) const;

    /// The row indices drawn in resample b (for callers that need more than sums).
    std::vector<std::uint32_t> resampleIndices(std::int32_t b, std::size_t rows) const;

    /// Percentile interval of the mean of `values` (NaN values are not allowed; filter first).
    /// NaN interval when `values` is empty.
    Interval meanInterval(std::span<const double> values, double level = 0.95) const;

    /// Percentile interval of resampled statistics: the (1−level)/2 and (1+level)/2
    /// quantiles with linear interpolation between order statistics (numpy's default
    /// "linear" method). NaN statistics are dropped; NaN interval when none is left.
    static Interval percentileInterval(std::vector<double> statistics, double level = 0.95);

private:
    std::int32_t m_resamples;
    std::uint64_t m_seed;
};

} // namespace slatewise::core
