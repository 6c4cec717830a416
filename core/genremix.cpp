// SPDX-License-Identifier: MIT
#include "core/genremix.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace slatewise::core {

void GenreMix::clear()
{
    std::fill(m_weight.begin(), m_weight.end(), 0.0);
    m_total = 0.0;
}

void GenreMix::add(std::span<const std::int32_t> genres)
{
    if (genres.empty())
        return;
    const double share = 1.0 / static_cast<double>(genres.size());
    for (const std::int32_t g : genres)
        if (g >= 0 && static_cast<std::size_t>(g) < m_weight.size())
            m_weight[static_cast<std::size_t>(g)] += share;
    m_total += 1.0;
}

std::int32_t GenreMix::dominant() const
{
    if (m_total <= 0.0)
        return -1;
    const auto it = std::max_element(m_weight.begin(), m_weight.end());
    return static_cast<std::int32_t>(it - m_weight.begin());
}

double GenreMix::calibrationKl(std::span<const double> p, std::span<const double> q, double alpha)
{
    if (p.size() != q.size())
        return std::nan("");
    const double sp = std::accumulate(p.begin(), p.end(), 0.0);
    const double sq = std::accumulate(q.begin(), q.end(), 0.0);
    if (!(sp > 0.0) || !(sq > 0.0))
        return std::nan("");
    double kl = 0.0;
    for (std::size_t g = 0; g < p.size(); ++g) {
        const double pg = p[g] / sp;
        if (pg <= 0.0)
            continue;
        const double qg = (1.0 - alpha) * (q[g] / sq) + alpha * pg;
        kl += pg * std::log(pg / qg);
    }
    // Rounding can leave a tiny negative value when p == q.
    return std::max(0.0, kl);
}

} // namespace slatewise::core
