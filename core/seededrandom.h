// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <cstdint>

namespace slatewise::core {

/// A small counter-based generator (splitmix64). One stream per (seed, index) makes every
/// user's or item's random draws independent of how work is split between threads, so
/// results are reproducible on any number of cores and with any standard library.
class SeededRandom {
public:
    SeededRandom(std::uint64_t seed, std::uint64_t stream) : m_state(mix(seed ^ mix(stream + 0x632be59bd9b4e019ULL))) {}

    std::uint64_t next()
    {
        m_state += 0x9e3779b97f4a7c15ULL;
        return mix(m_state);
    }
    /// Uniform in [0, 1).
    double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
    /// Uniform integer in [0, n).
    std::uint64_t below(std::uint64_t n) { return n == 0 ? 0 : next() % n; }
    /// Standard normal (Box–Muller).
    double normal()
    {
        const double u1 = 1.0 - uniform();
        const double u2 = uniform();
        return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
    }

private:
    static std::uint64_t mix(std::uint64_t z)
    {
        z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
        z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
        return z ^ (z >> 31);
    }
    std::uint64_t m_state;
};

} // namespace slatewise::core
