// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <vector>

namespace slatewise::core {

/// A set of catalog items that clears in O(1): each slot stores the generation in which it
/// was marked. One per worker thread, reused for every user, so membership tests on a
/// user's history cost one array read instead of a hash lookup or a sort.
class ItemMarks {
public:
    explicit ItemMarks(std::size_t items = 0) : m_stamp(items, 0) {}

    void clear()
    {
        if (++m_generation == 0) {
            std::fill(m_stamp.begin(), m_stamp.end(), 0u);
            m_generation = 1;
        }
    }
    /// Marks `item`; true when it was not marked before.
    bool insert(ItemIndex item)
    {
        auto& slot = m_stamp[item.value];
        if (slot == m_generation)
            return false;
        slot = m_generation;
        return true;
    }
    bool contains(ItemIndex item) const { return m_stamp[item.value] == m_generation; }
    std::size_t capacity() const { return m_stamp.size(); }

private:
    std::vector<std::uint32_t> m_stamp;
    std::uint32_t m_generation = 1;
};

} // namespace slatewise::core
