// SPDX-License-Identifier: MIT
#include "core/exposure.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace slatewise::core {

void Exposure::merge(const Exposure& other)
{
    if (m_counts.size() < other.m_counts.size())
        m_counts.resize(other.m_counts.size(), 0);
    for (std::size_t i = 0; i < other.m_counts.size(); ++i)
        m_counts[i] += other.m_counts[i];
}

std::int64_t Exposure::total() const { return std::accumulate(m_counts.begin(), m_counts.end(), std::int64_t{0}); }

std::size_t Exposure::distinctShown() const
{
    return static_cast<std::size_t>(std::count_if(m_counts.begin(), m_counts.end(), [](std::int64_t c) { return c > 0; }));
}

double Exposure::coverage() const
{
    if (m_counts.empty())
        return std::nan("");
    return static_cast<double>(distinctShown()) / static_cast<double>(m_counts.size());
}

double Exposure::gini() const
{
    // Counts are integers: sorting them is a counting sort in disguise, but n log n on the
    // catalog size is already negligible next to the per-user work.
    return gini(std::vector<double>(m_counts.begin(), m_counts.end()));
}

double Exposure::gini(std::vector<double> values)
{
    const std::size_t n = values.size();
    if (n == 0)
        return std::nan("");
    std::sort(values.begin(), values.end());
    double weighted = 0.0;
    double sum = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        weighted += (2.0 * static_cast<double>(i + 1) - static_cast<double>(n) - 1.0) * values[i];
        sum += values[i];
    }
    if (sum <= 0.0)
        return std::nan("");
    return weighted / (static_cast<double>(n) * sum);
}

} // namespace slatewise::core
