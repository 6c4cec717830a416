// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/ids.h"
#include "core/itemmarks.h"
#include "core/run.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Finds list items offered before their series' earlier parts: a list item that is part
/// p > 1 of a series violates the order when some catalog item of part q < p of the same
/// series is neither in the user's train history nor placed higher in the same list.
/// Parts missing from the catalog cannot be asked for and are ignored.
class SeriesOrder {
public:
    struct Violation {
        std::int32_t rank = 0; ///< 1-based position in the list
        ItemIndex item;
        std::int32_t series = kNone;
        std::int32_t part = 0;
        std::vector<std::int32_t> missingParts; ///< ascending, unique
        std::vector<ItemIndex> missingItems;    ///< one catalog item per missing part (the first found)
    };

    explicit SeriesOrder(const std::vector<Item>& items);

    /// `seen` holds the user's train items.
    std::vector<Violation> check(std::span<const ListEntry> list, const ItemMarks& seen) const;

    /// Catalog items of series s ordered by part (then item index).
    std::span<const ItemIndex> parts(std::int32_t series) const;

private:
    const std::vector<Item>* m_items;
    std::vector<ItemIndex> m_partItems;     ///< items grouped by series, ascending part
    std::vector<std::uint32_t> m_offsets;   ///< size = series count + 1
};

} // namespace slatewise::core
