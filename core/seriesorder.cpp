// SPDX-License-Identifier: MIT
#include "core/seriesorder.h"

#include <algorithm>

namespace slatewise::core {

SeriesOrder::SeriesOrder(const std::vector<Item>& items) : m_items(&items)
{
    std::int32_t maxSeries = -1;
    for (const auto& item : items)
        maxSeries = std::max(maxSeries, item.series);
    const std::size_t seriesCount = static_cast<std::size_t>(maxSeries + 1);
    m_offsets.assign(seriesCount + 1, 0);
    for (const auto& item : items)
        if (item.series >= 0)
            ++m_offsets[static_cast<std::size_t>(item.series) + 1];
    for (std::size_t s = 0; s < seriesCount; ++s)
        m_offsets[s + 1] += m_offsets[s];
    m_partItems.resize(m_offsets.back());
    std::vector<std::uint32_t> fill(m_offsets.begin(), m_offsets.end() - 1);
    for (std::size_t i = 0; i < items.size(); ++i)
        if (items[i].series >= 0)
            m_partItems[fill[static_cast<std::size_t>(items[i].series)]++] = ItemIndex(static_cast<std::uint32_t>(i));
    for (std::size_t s = 0; s < seriesCount; ++s)
        std::sort(m_partItems.begin() + m_offsets[s], m_partItems.begin() + m_offsets[s + 1],
                  [&](ItemIndex a, ItemIndex b) {
                      const auto pa = items[a.value].seriesPart;
                      const auto pb = items[b.value].seriesPart;
                      return pa != pb ? pa < pb : a < b;
                  });
}

std::span<const ItemIndex> SeriesOrder::parts(std::int32_t series) const
{
    if (series < 0 || static_cast<std::size_t>(series) + 1 >= m_offsets.size())
        return {};
    const auto s = static_cast<std::size_t>(series);
    return {m_partItems.data() + m_offsets[s], m_partItems.data() + m_offsets[s + 1]};
}

std::vector<SeriesOrder::Violation> SeriesOrder::check(std::span<const ListEntry> list, const ItemMarks& seen) const
{
    const auto& items = *m_items;
    std::vector<Violation> out;
    for (std::size_t pos = 0; pos < list.size(); ++pos) {
        const ItemIndex item = list[pos].item;
        const Item& info = items[item.value];
        if (info.series < 0 || info.seriesPart <= 1)
            continue;
        Violation v;
        for (const ItemIndex earlier : parts(info.series)) {
            const std::int32_t part = items[earlier.value].seriesPart;
            if (part >= info.seriesPart)
                break;
            if (part < 1 || seen.contains(earlier))
                continue;
            const auto above = list.subspan(0, pos);
            if (std::any_of(above.begin(), above.end(), [&](const ListEntry& e) { return e.item == earlier; }))
                continue;
            // Two catalog items with the same part number: the part is missing only when
            // neither is seen or ranked above, so look for a sibling before recording it.
            bool siblingCovered = false;
            for (const ItemIndex sibling : parts(info.series)) {
                if (sibling == earlier || items[sibling.value].seriesPart != part)
                    continue;
                if (seen.contains(sibling) ||
                    std::any_of(above.begin(), above.end(), [&](const ListEntry& e) { return e.item == sibling; }))
                    siblingCovered = true;
            }
            if (siblingCovered || (!v.missingParts.empty() && v.missingParts.back() == part))
                continue;
            v.missingParts.push_back(part);
            v.missingItems.push_back(earlier);
        }
        if (!v.missingParts.empty()) {
            v.rank = static_cast<std::int32_t>(pos + 1);
            v.item = item;
            v.series = info.series;
            v.part = info.seriesPart;
            out.push_back(std::move(v));
        }
    }
    return out;
}

} // namespace slatewise::core
