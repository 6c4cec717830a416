// SPDX-License-Identifier: MIT
#include "core/seriesorderreranker.h"

#include "core/runassembly.h"

#include <algorithm>
#include <unordered_set>

namespace slatewise::core {

namespace {

bool contains(std::span<const std::uint32_t> sorted, std::uint32_t item)
{
    return std::binary_search(sorted.begin(), sorted.end(), item);
}

std::vector<std::uint32_t> sortedTrainItems(const Dataset& data, UserIndex u)
{
    std::vector<std::uint32_t> items;
    for (const auto& row : data.train.of(u))
        items.push_back(row.item.value);
    std::sort(items.begin(), items.end());
    items.erase(std::unique(items.begin(), items.end()), items.end());
    return items;
}

} // namespace

std::vector<std::vector<std::uint32_t>> SeriesOrderReranker::seriesIndex(const Dataset& data)
{
    std::vector<std::vector<std::uint32_t>> series(data.seriesNames.size());
    for (std::uint32_t i = 0; i < data.itemCount(); ++i) {
        const Item& item = data.items[i];
        if (item.series >= 0 && static_cast<std::size_t>(item.series) < series.size() && item.seriesPart >= 1)
            series[static_cast<std::size_t>(item.series)].push_back(i);
    }
    for (auto& parts : series)
        std::stable_sort(parts.begin(), parts.end(), [&](std::uint32_t a, std::uint32_t b) {
            return data.items[a].seriesPart < data.items[b].seriesPart;
        });
    return series;
}

std::vector<ListEntry> SeriesOrderReranker::rerankList(const Dataset& data,
                                                       const std::vector<std::vector<std::uint32_t>>& series,
                                                       std::span<const std::uint32_t> seen,
                                                       std::span<const ListEntry> list)
{
    std::vector<ListEntry> out;
    out.reserve(list.size());
    std::unordered_set<std::uint32_t> placed;
    // First position of each item still waiting further down the parent's list.
    auto positionInList = [&](std::uint32_t item) -> std::ptrdiff_t {
        for (std::size_t k = 0; k < list.size(); ++k)
            if (list[k].item.value == item)
                return static_cast<std::ptrdiff_t>(k);
        return -1;
    };
    auto earliestMissing = [&](std::uint32_t item) -> std::int64_t {
        const Item& it = data.items[item];
        if (it.series < 0 || it.seriesPart <= 1 || static_cast<std::size_t>(it.series) >= series.size())
            return -1;
        for (std::uint32_t part : series[static_cast<std::size_t>(it.series)]) {
            if (data.items[part].seriesPart >= it.seriesPart)
                break;
            if (!contains(seen, part) && !placed.count(part))
                return part;
        }
        return -1;
    };
    for (const ListEntry& entry : list) {
        if (placed.count(entry.item.value))
            continue;
        bool replaced = false;
        for (std::int64_t e = earliestMissing(entry.item.value); e >= 0; e = earliestMissing(entry.item.value)) {
            const auto missing = static_cast<std::uint32_t>(e);
            const std::ptrdiff_t pos = positionInList(missing);
            if (pos >= 0) {
                // Earlier parts of `missing` are all seen or placed (it is the earliest).
                out.push_back(list[static_cast<std::size_t>(pos)]);
                placed.insert(missing);
            } else {
                out.push_back({ItemIndex(missing), entry.score});
                placed.insert(missing);
                replaced = true;
                break;
            }
        }
        if (!replaced) {
            out.push_back(entry);
            placed.insert(entry.item.value);
        }
    }
    // Moving parts up can push the list past its length only when replacements and moves
    // coincide; keep the parent's length.
    if (out.size() > list.size())
        out.resize(list.size());
    return out;
}

Result<RunData> SeriesOrderReranker::apply(const Dataset& data, const RunData& parent, const RerankSettings&,
                                           const Progress& progress)
{
    const auto series = seriesIndex(data);
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const bool ok =
        RunAssembly::forEach(data.userCount(), progress, "series-order", 0.0, 1.0, [&](std::size_t u, unsigned) {
            const UserIndex user(static_cast<std::uint32_t>(u));
            const auto seen = sortedTrainItems(data, user);
            lists[u] = rerankList(data, series, seen, parent.listOf(user));
        });
    if (!ok)
        return RunAssembly::cancelled("re-ranking with series-order");
    return RunAssembly::derive(data, parent, std::move(lists));
}

} // namespace slatewise::core
