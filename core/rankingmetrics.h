// SPDX-License-Identifier: MIT
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>

namespace slatewise::core {

/// One position of a user's ranked list, judged against the user's withheld items.
struct ListHit {
    bool relevant = false; ///< the item is in R_u (withheld with rating >= relevant_at)
    double rating = 0.0;   ///< its withheld rating when relevant (the graded gain)
};

/// Top-k ranking metrics of one user (definitions in docs/metrics.md).
struct UserRanking {
    std::int32_t hits = 0;   ///< |L_u ∩ R_u|
    double precision = 0.0;  ///< hits / k, k even when the list is shorter
    double recall = 0.0;     ///< hits / |R_u|
    double ap = 0.0;         ///< (1 / min(k, |R_u|)) Σ_{hit positions j} hits(1..j) / j
    double rr = 0.0;         ///< 1 / rank of the first hit, 0 when none
    double ndcg = 0.0;       ///< binary gains; IDCG from min(k, |R_u|) hits at the top
    double ndcgGraded = 0.0; ///< gain = rating of a relevant item; IDCG from R_u's ratings, descending
};

/// Position discount 1 / log2(j + 1) for 1-based position j.
double dcgDiscount(std::size_t position);

/// Ranking metrics of one user. `list` is L_u in rank order (entries past k are ignored);
/// `relevantRatingsDesc` holds the ratings of R_u sorted descending and must not be empty;
/// k >= 1. A user without a list passes an empty `list` and scores 0 everywhere.
/// An item must appear at most once in `list` (the caller drops repeats).
UserRanking rankUser(std::span<const ListHit> list, std::span<const double> relevantRatingsDesc, std::int32_t k);

} // namespace slatewise::core
