// SPDX-License-Identifier: MIT
#include "core/demorandom.h"

#include <algorithm>

namespace slatewise::core {

namespace {
std::uint64_t splitmix64(std::uint64_t& x)
{
    std::uint64_t z = (x += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}

std::uint64_t rotl(std::uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
} // namespace

DemoRandom::DemoRandom(std::uint64_t seed)
{
    std::uint64_t x = seed;
    for (auto& s : m_s)
        s = splitmix64(x);
}

DemoRandom DemoRandom::fork(std::uint64_t stream) const
{
    // Mix the parent's state with the stream number through splitmix64 again.
    std::uint64_t x = m_s[0] ^ rotl(m_s[1], 17) ^ (stream * 0xd1342543de82ef95ULL);
    DemoRandom child;
    for (auto& s : child.m_s)
        s = splitmix64(x);
    return child;
}

std::uint64_t DemoRandom::next()
{
    const std::uint64_t result = rotl(m_s[1] * 5, 7) * 9;
    const std::uint64_t t = m_s[1] << 17;
    m_s[2] ^= m_s[0];
    m_s[3] ^= m_s[1];
    m_s[1] ^= m_s[2];
    m_s[0] ^= m_s[3];
    m_s[2] ^= t;
    m_s[3] = rotl(m_s[3], 45);
    return result;
}

double DemoRandom::uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }

std::uint32_t DemoRandom::below(std::uint32_t n)
{
    // Lemire's multiply-shift; the tiny bias (< n / 2^32) does not matter for a demo.
    return static_cast<std::uint32_t>(((next() >> 32) * static_cast<std::uint64_t>(n)) >> 32);
}

std::int32_t DemoRandom::between(std::int32_t lo, std::int32_t hi)
{
    return lo + static_cast<std::int32_t>(below(static_cast<std::uint32_t>(hi - lo + 1)));
}

double DemoRandom::normal()
{
    double sum = 0.0;
    for (int i = 0; i < 12; ++i)
        sum += uniform();
    return sum - 6.0;
}

std::size_t DemoRandom::pickCumulative(std::span<const double> cumulative)
{
    const double target = uniform() * cumulative.back();
    const auto it = std::upper_bound(cumulative.begin(), cumulative.end(), target);
    return std::min<std::size_t>(static_cast<std::size_t>(it - cumulative.begin()), cumulative.size() - 1);
}

} // namespace slatewise::core
