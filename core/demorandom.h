// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <span>

namespace slatewise::core {

/// The demo generator's random source: xoshiro256** seeded through splitmix64
/// (Blackman & Vigna, "Scrambled linear pseudorandom number generators", 2021).
/// Everything derived from it uses only +, -, *, / and sqrt, which IEEE 754 rounds the
/// same everywhere, so the demo files are byte-for-byte the same on every platform;
/// the standard library's distributions are not (their algorithms differ by vendor).
class DemoRandom {
public:
    explicit DemoRandom(std::uint64_t seed);

    /// An independent stream for one purpose (a member, a run), so that adding draws in
    /// one place does not shift every later number.
    DemoRandom fork(std::uint64_t stream) const;

    std::uint64_t next();
    /// Uniform in [0, 1) with 53 random bits.
    double uniform();
    /// Uniform integer in [0, n); n > 0.
    std::uint32_t below(std::uint32_t n);
    /// Uniform integer in [lo, hi].
    std::int32_t between(std::int32_t lo, std::int32_t hi);
    bool chance(double p) { return uniform() < p; }
    /// Approximately standard normal: the Irwin-Hall sum of 12 uniforms minus 6
    /// (mean 0, variance 1, tails cut at +-6), chosen because it needs no log or cos.
    double normal();
    double normal(double mean, double sd) { return mean + sd * normal(); }
    /// Index drawn with probability proportional to `cumulative` weights
    /// (cumulative[i] = sum of weights 0..i, last element > 0).
    std::size_t pickCumulative(std::span<const double> cumulative);

private:
    DemoRandom() = default;
    std::uint64_t m_s[4] = {0, 0, 0, 0};
};

} // namespace slatewise::core
