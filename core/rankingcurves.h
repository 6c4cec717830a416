// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "core/rankingmetrics.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Sums precision@k, recall@k and binary NDCG@k for every k = 1..maxK over users, for the
/// chart of metric against k. Same definitions as rankUser() at each k.
class RankingCurves {
public:
    explicit RankingCurves(std::int32_t maxK);

    /// Adds one user with at least one relevant withheld item; `list` is L_u in rank order
    /// (empty when the run has no list for the user).
    void add(std::span<const ListHit> list, std::size_t nRelevant);
    void merge(const RankingCurves& other);
    std::int64_t users() const { return m_users; }
    /// Means over the users added (NaN when none).
    Curves result() const;

private:
    std::int32_t m_maxK;
    std::int64_t m_users = 0;
    std::vector<double> m_precision, m_recall, m_ndcg;
};

} // namespace slatewise::core
