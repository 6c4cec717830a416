// SPDX-License-Identifier: MIT
#include "core/bootstrap.h"

#include "core/parallel.h"

#include <Eigen/Core>

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

using FloatMatrix = Eigen::Matrix<float, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;

/// How often each row is drawn in resamples b0 .. b0+batch-1, row-major batch × rows.
/// Returns false when a count overflowed its type.
template <typename Count>
bool fillCounts(std::vector<Count>& counts, std::size_t b0, std::size_t batch, std::size_t rows, std::uint64_t seed)
{
    counts.assign(batch * rows, 0);
    bool overflow = false;
    for (std::size_t b = 0; b < batch; ++b) {
        SplitMix64 rng = streamFor(seed, static_cast<std::int32_t>(b0 + b));
        Count* row = counts.data() + b * rows;
        for (std::size_t i = 0; i < rows; ++i)
            overflow |= ++row[boundedIndex(rng.next(), rows)] == 0;
    }
    return !overflow;
}

/// acc += counts · x, in blocks of rows so that each block of x is reused from cache.
template <typename Count>
void multiplyInBlocks(const std::vector<Count>& counts, std::size_t batch, std::size_t rows, const FloatMatrix& x,
                      FloatMatrix& block, Eigen::MatrixXd& acc)
{
    using CountMatrix = Eigen::Matrix<Count, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;
    constexpr std::size_t kBlock = 4096;
    for (std::size_t r0 = 0; r0 < rows; r0 += kBlock) {
        const auto len = static_cast<Eigen::Index>(std::min(kBlock, rows - r0));
        const Eigen::Map<const CountMatrix, 0, Eigen::OuterStride<>> c(counts.data() + r0,
                                                                      static_cast<Eigen::Index>(batch), len,
                                                                      Eigen::OuterStride<>(static_cast<Eigen::Index>(rows)));
        block.noalias() = c.template cast<float>() * x.middleRows(static_cast<Eigen::Index>(r0), len);
        acc += block.cast<double>();
    }
}

} // namespace

Bootstrap::Bootstrap(std::int32_t resamples, std::uint64_t seed) : m_resamples(std::max(0, resamples)), m_seed(seed) {}

std::vector<double> Bootstrap::resampleColumnSums(std::span<const double> table, std::size_t rows, std::size_t cols,
                                                  const Progress& progress) const
{
    const auto B = static_cast<std::size_t>(m_resamples);
    std::vector<double> sums(B * cols, 0.0);
    if (rows == 0 || cols == 0 || B == 0)
        return sums;

    // Resample sums are C · X with C[b][i] = how often row i was drawn in resample b. Counting
    // the draws (random increments into a row that stays in cache) and multiplying blocks of C
    // with blocks of X is far faster than gathering random rows of X: the product runs as a
    // blocked matrix multiplication. X is held in single precision (each block sum is
    // accumulated into double), which moves an interval by far less than its last printed digit.
    const FloatMatrix x =
        Eigen::Map<const Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>>(table.data(),
                                                                                              static_cast<Eigen::Index>(rows),
                                                                                              static_cast<Eigen::Index>(cols))
            .cast<float>();
    constexpr std::size_t kBatch = 32; // resamples per task
    const std::size_t tasks = (B + kBatch - 1) / kBatch;

    std::atomic<std::size_t> done{0};
    std::atomic<bool> stopped{false};
    parallelFor(tasks, [&](std::size_t begin, std::size_t end, unsigned worker) {
        std::vector<std::uint8_t> counts8;
        std::vector<std::uint16_t> counts16;
        FloatMatrix block;
        Eigen::MatrixXd acc;
        for (std::size_t task = begin; task < end; ++task) {
            if (progress.cancelled()) {
                stopped = true;
                return;
            }
            const std::size_t b0 = task * kBatch;
            const std::size_t batch = std::min(kBatch, B - b0);
            acc.setZero(static_cast<Eigen::Index>(batch), static_cast<Eigen::Index>(cols));
            // One-byte counts keep a resample's row in cache; a count above 255 (practically
            // impossible: a row is drawn Binomial(n, 1/n) times) redoes the batch with two bytes.
            if (fillCounts(counts8, b0, batch, rows, m_seed))
                multiplyInBlocks<std::uint8_t>(counts8, batch, rows, x, block, acc);
            else {
                fillCounts(counts16, b0, batch, rows, m_seed);
                multiplyInBlocks<std::uint16_t>(counts16, batch, rows, x, block, acc);
            }
            for (std::size_t b = 0; b < batch; ++b)
                for (std::size_t col = 0; col < cols; ++col)
                    sums[(b0 + b) * cols + col] = acc(static_cast<Eigen::Index>(b), static_cast<Eigen::Index>(col));
            const std::size_t finished = done += batch;
            if (worker == 0)
                progress(static_cast<double>(finished) / static_cast<double>(B), "bootstrap");
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
