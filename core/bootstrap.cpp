// SPDX-License-Identifier: MIT
#include "core/bootstrap.h"

#include "core/parallel.h"

#include <algorithm>
#include <atomic>
#include <cmath>

namespace slatewise::core {

namespace {

// SplitMix64 (Steele, Lea & Flood, OOPSLA 2014): tiny, fast and good enough to draw
// resample indices; one independent stream per resample.
struct SplitMix64 {
    std::uint64_t state;
    std::uint64_t next()
    {
        std::uint64_t z = (state += 0x9E3779B97F4A7C15ULL);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
        return z ^ (z >> 31);
    }
};

__extension__ using Uint128 = unsigned __int128;

// Uniform index in [0, n) by multiply-high (Lemire 2019); the bias n / 2^64 is negligible.
inline std::uint32_t boundedIndex(std::uint64_t random, std::uint64_t n)
{
    return static_cast<std::uint32_t>((static_cast<Uint128>(random) * n) >> 64);
}

SplitMix64 streamFor(std::uint64_t seed, std::int32_t b)
{
    SplitMix64 mixer{seed ^ (0xD1B54A32D192ED03ULL * (static_cast<std::uint64_t>(b) + 1))};
    return SplitMix64{mixer.next()};
}

} // namespace

Bootstrap::Bootstrap(std::int32_t resamples, std::uint64_t seed) : m_resamples(std::max(0, resamples)), m_seed(seed) {}

std::vector<double> Bootstrap::resampleColumnSums(std::span<const double> table, std::size_t rows, std::size_t cols,
                                                  const Progress& progress) const
{
    std::vector<double> sums(static_cast<std::size_t>(m_resamples) * cols, 0.0);
    if (rows == 0 || cols == 0 || m_resamples == 0)
        return sums;
    std::atomic<std::int32_t> done{0};
    std::atomic<bool> stopped{false};
    parallelFor(static_cast<std::size_t>(m_resamples), [&](std::size_t begin, std::size_t end, unsigned worker) {
        std::vector<double> acc(cols);
        for (std::size_t b = begin; b < end; ++b) {
            if (progress.cancelled()) {
                stopped = true;
                return;
            }
            std::fill(acc.begin(), acc.end(), 0.0);
            SplitMix64 rng = streamFor(m_seed, static_cast<std::int32_t>(b));
            const double* base = table.data();
            for (std::size_t i = 0; i < rows; ++i) {
                const double* row = base + static_cast<std::size_t>(boundedIndex(rng.next(), rows)) * cols;
                for (std::size_t c = 0; c < cols; ++c)
                    acc[c] += row[c];
            }
            std::copy(acc.begin(), acc.end(), sums.begin() + static_cast<std::ptrdiff_t>(b * cols));
            const std::int32_t finished = ++done;
            if (worker == 0 && finished % 16 == 0)
                progress(static_cast<double>(finished) / m_resamples, "bootstrap");
        }
    });
    if (stopped)
        return {};
    return sums;
}

std::vector<std::uint32_t> Bootstrap::resampleIndices(std::int32_t b, std::size_t rows) const
{
    std::vector<std::uint32_t> indices(rows);
    SplitMix64 rng = streamFor(m_seed, b);
    for (auto& index : indices)
        index = boundedIndex(rng.next(), rows);
    return indices;
}

Interval Bootstrap::meanInterval(std::span<const double> values, double level) const
{
    if (values.empty())
        return {};
    const std::vector<double> sums = resampleColumnSums(values, values.size(), 1);
    std::vector<double> means(sums.size());
    const double n = static_cast<double>(values.size());
    std::transform(sums.begin(), sums.end(), means.begin(), [n](double s) { return s / n; });
    return percentileInterval(std::move(means), level);
}

Interval Bootstrap::percentileInterval(std::vector<double> statistics, double level)
{
    std::erase_if(statistics, [](double v) { return std::isnan(v); });
    if (statistics.empty())
        return {};
    std::sort(statistics.begin(), statistics.end());
    auto quantile = [&](double p) {
        const double h = p * static_cast<double>(statistics.size() - 1);
        const auto lo = static_cast<std::size_t>(std::floor(h));
        const std::size_t hi = std::min(lo + 1, statistics.size() - 1);
        return statistics[lo] + (h - static_cast<double>(lo)) * (statistics[hi] - statistics[lo]);
    };
    return {quantile((1.0 - level) / 2.0), quantile((1.0 + level) / 2.0)};
}

} // namespace slatewise::core
