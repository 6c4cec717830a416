// SPDX-License-Identifier: MIT
#include "core/burstdetector.h"

#include <algorithm>

namespace slatewise::core {

BurstDetector::BurstDetector(const std::vector<Item>& items, std::size_t genreCount, Params params)
    : m_items(&items), m_genreCount(genreCount), m_params(params)
{
}

double BurstDetector::listShare(std::span<const ListEntry> list, std::int32_t genre) const
{
    if (list.empty())
        return 0.0;
    std::size_t with = 0;
    for (const auto& entry : list) {
        const auto& genres = (*m_items)[entry.item.value].genres;
        if (std::binary_search(genres.begin(), genres.end(), genre))
            ++with;
    }
    return static_cast<double>(with) / static_cast<double>(list.size());
}

BurstDetector::Finding BurstDetector::detect(std::span<const Interaction> train, std::span<const ListEntry> list) const
{
    Finding f;
    for (const auto& row : train)
        if (row.timestamp == kNoTimestamp) {
            f.hasTimestamps = false;
            return f;
        }
    const std::size_t window = static_cast<std::size_t>(std::max(0, m_params.window));
    if (window == 0 || train.size() <= window)
        return f;
    const std::size_t older = train.size() - window;
    f.enoughHistory = older >= static_cast<std::size_t>(std::max(0, m_params.minHistory));
    if (!f.enoughHistory)
        return f;

    std::vector<std::int32_t> recentCount(m_genreCount, 0);
    std::vector<std::int32_t> olderCount(m_genreCount, 0);
    const auto& items = *m_items;
    for (std::size_t r = 0; r < train.size(); ++r) {
        auto& counts = r < older ? olderCount : recentCount;
        for (const std::int32_t g : items[train[r].item.value].genres)
            if (g >= 0 && static_cast<std::size_t>(g) < m_genreCount)
                ++counts[static_cast<std::size_t>(g)];
    }
    for (std::size_t g = 0; g < m_genreCount; ++g) {
        const double windowShare = static_cast<double>(recentCount[g]) / static_cast<double>(window);
        const double priorShare = static_cast<double>(olderCount[g]) / static_cast<double>(older);
        if (windowShare >= m_params.minShare && priorShare <= m_params.maxPrior)
            f.bursts.push_back({static_cast<std::int32_t>(g), windowShare, priorShare});
    }
    std::stable_sort(f.bursts.begin(), f.bursts.end(),
                     [](const Burst& a, const Burst& b) { return a.windowShare > b.windowShare; });
    for (const auto& burst : f.bursts) {
        const double share = listShare(list, burst.genre);
        if (share >= m_params.echoShare && !list.empty()) {
            f.echoes = true;
            f.echoed = burst;
            f.listShare = share;
            return f;
        }
    }
    if (!f.bursts.empty()) {
        f.echoed = f.bursts.front();
        f.listShare = listShare(list, f.echoed.genre);
    }
    return f;
}

} // namespace slatewise::core
