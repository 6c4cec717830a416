// SPDX-License-Identifier: MIT
#include "core/trainmatrix.h"

#include "core/parallel.h"

#include <algorithm>
#include <cstring>
#include <numeric>

namespace slatewise::core {

bool TrainMatrix::seen(std::uint32_t u, std::uint32_t item) const
{
    const auto row = itemsOf(u);
    return std::binary_search(row.begin(), row.end(), item);
}

TrainMatrix TrainMatrix::build(const Dataset& data)
{
    TrainMatrix m;
    m.users = static_cast<std::uint32_t>(data.userCount());
    m.items = static_cast<std::uint32_t>(data.itemCount());
    const auto& rows = data.train.rows;
    const auto& offsets = data.train.offsets;

    // Sort each user's rows by item into a scratch copy, keep the last of equal items,
    // then compact. Each user writes only inside its own range, so no locks are needed.
    std::vector<std::uint32_t> items(rows.size());
    std::vector<float> ratings(rows.size());
    std::vector<std::uint32_t> kept(m.users, 0);
    parallelFor(m.users, [&](std::size_t begin, std::size_t end, unsigned) {
        std::vector<std::uint32_t> order;
        for (std::size_t u = begin; u < end; ++u) {
            const std::uint32_t from = offsets[u], to = offsets[u + 1];
            order.resize(to - from);
            std::iota(order.begin(), order.end(), from);
            // Stable: equal items stay in timestamp order, so the last one is the latest.
            std::stable_sort(order.begin(), order.end(),
                             [&](std::uint32_t a, std::uint32_t b) { return rows[a].item < rows[b].item; });
            std::uint32_t out = from;
            for (std::size_t k = 0; k < order.size(); ++k) {
                const auto& row = rows[order[k]];
                if (k + 1 < order.size() && rows[order[k + 1]].item == row.item)
                    continue;
                items[out] = row.item.value;
                ratings[out] = row.rating;
                ++out;
            }
            kept[u] = out - from;
        }
    });

    m.userOffsets.assign(m.users + 1, 0);
    for (std::uint32_t u = 0; u < m.users; ++u)
        m.userOffsets[u + 1] = m.userOffsets[u] + kept[u];
    m.userItems.resize(m.userOffsets[m.users]);
    m.userRatings.resize(m.userOffsets[m.users]);
    for (std::uint32_t u = 0; u < m.users; ++u) {
        std::memcpy(m.userItems.data() + m.userOffsets[u], items.data() + offsets[u], kept[u] * sizeof(std::uint32_t));
        std::memcpy(m.userRatings.data() + m.userOffsets[u], ratings.data() + offsets[u], kept[u] * sizeof(float));
    }
    items = {};
    ratings = {};

    double sum = 0.0;
    for (float r : m.userRatings)
        sum += r;
    m.globalMean = m.userRatings.empty() ? 0.0 : sum / static_cast<double>(m.userRatings.size());

    // Columns by counting sort; walking users in order keeps users ascending per item.
    m.itemOffsets.assign(m.items + 1, 0);
    for (std::uint32_t i : m.userItems)
        ++m.itemOffsets[i + 1];
    std::partial_sum(m.itemOffsets.begin(), m.itemOffsets.end(), m.itemOffsets.begin());
    m.itemUsers.resize(m.nnz());
    m.itemRatings.resize(m.nnz());
    std::vector<std::uint32_t> cursor(m.itemOffsets.begin(), m.itemOffsets.end() - 1);
    for (std::uint32_t u = 0; u < m.users; ++u) {
        for (std::uint32_t p = m.userOffsets[u]; p < m.userOffsets[u + 1]; ++p) {
            const std::uint32_t slot = cursor[m.userItems[p]]++;
            m.itemUsers[slot] = u;
            m.itemRatings[slot] = m.userRatings[p];
        }
    }
    return m;
}

} // namespace slatewise::core
