// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/run.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Intra-list diversity over genre sets: the mean Jaccard distance
/// 1 - |G_i ∩ G_j| / |G_i ∪ G_j| over unordered pairs of a list (0 for two empty sets)
/// (Ziegler, McNee, Konstan & Lausen, WWW 2005, with Jaccard distance as the dissimilarity).
/// With at most 64 genres each item's set is a bit mask, so a pair costs two popcounts.
class ListDiversity {
public:
    explicit ListDiversity(const std::vector<Item>& items, std::size_t genreCount);

    /// Genre lists must be sorted ascending (as Item::genres is).
    static double jaccardDistance(std::span<const std::int32_t> a, std::span<const std::int32_t> b);

    /// Mean pairwise distance over the list; NaN for lists of fewer than two items.
    double ild(std::span<const ListEntry> list) const;

private:
    const std::vector<Item>* m_items;
    std::vector<std::uint64_t> m_masks; ///< empty when there are more than 64 genres
};

} // namespace slatewise::core
