// SPDX-License-Identifier: MIT
#include "core/dataset.h"

#include <algorithm>
#include <numeric>

namespace slatewise::core {

DatasetStats computeStats(const Dataset& data)
{
    DatasetStats stats;
    const std::size_t users = data.userCount();
    const std::size_t items = data.itemCount();
    stats.itemTrainUsers.assign(items, 0);
    stats.userTrainCount.assign(users, 0);
    std::vector<std::uint32_t> lastUserSeen(items, UINT32_MAX);
    for (std::size_t u = 0; u < users; ++u) {
        const auto rows = data.train.of(UserIndex(static_cast<std::uint32_t>(u)));
        stats.userTrainCount[u] = static_cast<std::int32_t>(rows.size());
        if (!rows.empty())
            ++stats.trainUsers;
        for (const auto& row : rows) {
            // Count distinct users: a re-watch by the same user counts once.
            if (lastUserSeen[row.item.value] != u) {
                lastUserSeen[row.item.value] = static_cast<std::uint32_t>(u);
                ++stats.itemTrainUsers[row.item.value];
            }
        }
    }
    // Percentile rank with ties sharing their mean rank: 100 * (rank - 0.5) / n, so the
    // least and most popular items sit symmetrically inside 0..100.
    stats.itemPopularityPercentile.assign(items, 0.0);
    std::vector<std::uint32_t> order(items);
    std::iota(order.begin(), order.end(), 0u);
    std::sort(order.begin(), order.end(),
              [&](std::uint32_t a, std::uint32_t b) { return stats.itemTrainUsers[a] < stats.itemTrainUsers[b]; });
    for (std::size_t i = 0; i < items;) {
        std::size_t j = i;
        while (j < items && stats.itemTrainUsers[order[j]] == stats.itemTrainUsers[order[i]])
            ++j;
        const double meanRank = (static_cast<double>(i + 1) + static_cast<double>(j)) / 2.0;
        for (std::size_t t = i; t < j; ++t)
            stats.itemPopularityPercentile[order[t]] = 100.0 * (meanRank - 0.5) / static_cast<double>(items);
        i = j;
    }
    return stats;
}

std::int64_t findWithheld(const Dataset& data, UserIndex u, ItemIndex item)
{
    const auto begin = data.withheld.rows.begin() + data.withheld.offsets[u.value];
    const auto end = data.withheld.rows.begin() + data.withheld.offsets[u.value + 1];
    auto it = std::lower_bound(begin, end, item, [](const Interaction& row, ItemIndex i) { return row.item < i; });
    if (it == end || it->item != item)
        return -1;
    return it - data.withheld.rows.begin();
}

} // namespace slatewise::core
