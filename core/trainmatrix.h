// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// The train ratings as a sparse matrix, stored both by user (rows) and by item (columns),
/// which is what the alternating fits sweep over. A (user, item) pair rated more than once
/// keeps its latest rating (train rows are ordered by timestamp within a user).
struct TrainMatrix {
    std::uint32_t users = 0;
    std::uint32_t items = 0;
    double globalMean = 0.0; ///< mean train rating; 0 when there is none

    // By user, items ascending within a user.
    std::vector<std::uint32_t> userOffsets; ///< size users + 1
    std::vector<std::uint32_t> userItems;
    std::vector<float> userRatings;

    // By item, users ascending within an item.
    std::vector<std::uint32_t> itemOffsets; ///< size items + 1
    std::vector<std::uint32_t> itemUsers;
    std::vector<float> itemRatings;

    std::size_t nnz() const { return userItems.size(); }
    std::uint32_t userCount(std::uint32_t u) const { return userOffsets[u + 1] - userOffsets[u]; }
    std::uint32_t itemCount(std::uint32_t i) const { return itemOffsets[i + 1] - itemOffsets[i]; }
    std::span<const std::uint32_t> itemsOf(std::uint32_t u) const
    {
        return {userItems.data() + userOffsets[u], userItems.data() + userOffsets[u + 1]};
    }
    std::span<const float> ratingsOf(std::uint32_t u) const
    {
        return {userRatings.data() + userOffsets[u], userRatings.data() + userOffsets[u + 1]};
    }
    std::span<const std::uint32_t> usersOf(std::uint32_t i) const
    {
        return {itemUsers.data() + itemOffsets[i], itemUsers.data() + itemOffsets[i + 1]};
    }
    std::span<const float> itemRatingsOf(std::uint32_t i) const
    {
        return {itemRatings.data() + itemOffsets[i], itemRatings.data() + itemOffsets[i + 1]};
    }
    /// True when u has a train rating for item (bisects u's row).
    bool seen(std::uint32_t u, std::uint32_t item) const;

    /// Builds both orientations; parallel over users.
    static TrainMatrix build(const Dataset& data);
};

} // namespace slatewise::core
