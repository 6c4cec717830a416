// SPDX-License-Identifier: MIT
#include "core/listdiversity.h"

#include <bit>
#include <cmath>

namespace slatewise::core {

ListDiversity::ListDiversity(const std::vector<Item>& items, std::size_t genreCount) : m_items(&items)
{
    if (genreCount > 64)
        return;
    m_masks.resize(items.size(), 0);
    for (std::size_t i = 0; i < items.size(); ++i)
        for (const std::int32_t g : items[i].genres)
            if (g >= 0 && g < 64)
                m_masks[i] |= std::uint64_t{1} << g;
}

double ListDiversity::jaccardDistance(std::span<const std::int32_t> a, std::span<const std::int32_t> b)
{
    std::size_t common = 0;
    auto ia = a.begin();
    auto ib = b.begin();
    while (ia != a.end() && ib != b.end()) {
        if (*ia < *ib) {
            ++ia;
        } else if (*ib < *ia) {
            ++ib;
        } else {
            ++common;
            ++ia;
            ++ib;
        }
    }
    const std::size_t unionSize = a.size() + b.size() - common;
    if (unionSize == 0)
        return 0.0;
    return 1.0 - static_cast<double>(common) / static_cast<double>(unionSize);
}

double ListDiversity::ild(std::span<const ListEntry> list) const
{
    const std::size_t n = list.size();
    if (n < 2)
        return std::nan("");
    double sum = 0.0;
    if (!m_masks.empty()) {
        for (std::size_t a = 0; a < n; ++a) {
            const std::uint64_t ma = m_masks[list[a].item.value];
            for (std::size_t b = a + 1; b < n; ++b) {
                const std::uint64_t mb = m_masks[list[b].item.value];
                const int unionSize = std::popcount(ma | mb);
                if (unionSize > 0)
                    sum += 1.0 - static_cast<double>(std::popcount(ma & mb)) / unionSize;
            }
        }
    } else {
        const auto& items = *m_items;
        for (std::size_t a = 0; a < n; ++a)
            for (std::size_t b = a + 1; b < n; ++b)
                sum += jaccardDistance(items[list[a].item.value].genres, items[list[b].item.value].genres);
    }
    return sum / (static_cast<double>(n) * static_cast<double>(n - 1) / 2.0);
}

} // namespace slatewise::core
