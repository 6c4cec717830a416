// SPDX-License-Identifier: MIT
#include "core/rankingcurves.h"

#include <algorithm>
#include <cmath>

namespace slatewise::core {

RankingCurves::RankingCurves(std::int32_t maxK)
    : m_maxK(std::max(0, maxK)), m_precision(static_cast<std::size_t>(m_maxK), 0.0),
      m_recall(static_cast<std::size_t>(m_maxK), 0.0), m_ndcg(static_cast<std::size_t>(m_maxK), 0.0)
{
}

void RankingCurves::add(std::span<const ListHit> list, std::size_t nRelevant)
{
    if (nRelevant == 0)
        return;
    ++m_users;
    double hits = 0.0, dcg = 0.0, idcg = 0.0;
    for (std::size_t k = 1; k <= static_cast<std::size_t>(m_maxK); ++k) {
        if (k <= list.size() && list[k - 1].relevant) {
            hits += 1.0;
            dcg += dcgDiscount(k);
        }
        if (k <= nRelevant)
            idcg += dcgDiscount(k);
        m_precision[k - 1] += hits / static_cast<double>(k);
        m_recall[k - 1] += hits / static_cast<double>(nRelevant);
        m_ndcg[k - 1] += dcg / idcg;
    }
}

void RankingCurves::merge(const RankingCurves& other)
{
    m_users += other.m_users;
    for (std::size_t i = 0; i < m_precision.size() && i < other.m_precision.size(); ++i) {
        m_precision[i] += other.m_precision[i];
        m_recall[i] += other.m_recall[i];
        m_ndcg[i] += other.m_ndcg[i];
    }
}

Curves RankingCurves::result() const
{
    Curves c;
    const double n = m_users > 0 ? static_cast<double>(m_users) : std::nan("");
    for (std::int32_t k = 1; k <= m_maxK; ++k) {
        const auto i = static_cast<std::size_t>(k - 1);
        c.k.push_back(k);
        c.precision.push_back(m_precision[i] / n);
        c.recall.push_back(m_recall[i] / n);
        c.ndcg.push_back(m_ndcg[i] / n);
    }
    return c;
}

} // namespace slatewise::core
