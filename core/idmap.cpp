// SPDX-License-Identifier: MIT
#include "core/idmap.h"

#include <cstring>

namespace slatewise::core {

IdMap::IdMap() : m_offsets{0}, m_slots(1024, 0), m_mask(1023) {}

std::uint64_t IdMap::hash(std::string_view s)
{
    // 8 bytes at a time with a multiply-xorshift mix; ids are short so this is a few cycles.
    std::uint64_t h = 0x9E3779B97F4A7C15ULL ^ (s.size() * 0xC2B2AE3D27D4EB4FULL);
    std::size_t i = 0;
    for (; i + 8 <= s.size(); i += 8) {
        std::uint64_t w = 0;
        std::memcpy(&w, s.data() + i, 8);
        h = (h ^ w) * 0xFF51AFD7ED558CCDULL;
        h ^= h >> 32;
    }
    std::uint64_t tail = 0;
    std::memcpy(&tail, s.data() + i, s.size() - i);
    h = (h ^ tail) * 0xC4CEB9FE1A85EC53ULL;
    h ^= h >> 29;
    h *= 0x9E3779B97F4A7C15ULL;
    return h ^ (h >> 32);
}

std::uint32_t IdMap::find(std::string_view key) const
{
    const std::uint64_t h = hash(key);
    const std::uint64_t tag = h & 0xFFFFFFFF00000000ULL;
    for (std::uint64_t pos = h & m_mask;; pos = (pos + 1) & m_mask) {
        const std::uint64_t slot = m_slots[pos];
        if (slot == 0)
            return kMissing;
        if ((slot & 0xFFFFFFFF00000000ULL) == tag && id(static_cast<std::uint32_t>(slot) - 1) == key)
            return static_cast<std::uint32_t>(slot) - 1;
    }
}

IdMap::Insert IdMap::insert(std::string_view key)
{
    const std::uint64_t h = hash(key);
    const std::uint64_t tag = h & 0xFFFFFFFF00000000ULL;
    std::uint64_t pos = h & m_mask;
    for (;; pos = (pos + 1) & m_mask) {
        const std::uint64_t slot = m_slots[pos];
        if (slot == 0)
            break;
        if ((slot & 0xFFFFFFFF00000000ULL) == tag && id(static_cast<std::uint32_t>(slot) - 1) == key)
            return {static_cast<std::uint32_t>(slot) - 1, false};
    }
    const std::uint32_t index = size();
    m_arena.append(key);
    m_offsets.push_back(m_arena.size());
    m_slots[pos] = tag | (index + 1);
    if (static_cast<std::uint64_t>(size()) * 2 > m_mask)
        grow();
    return {index, true};
}

void IdMap::grow()
{
    const std::uint64_t capacity = (m_mask + 1) * 2;
    std::vector<std::uint64_t> slots(capacity, 0);
    const std::uint64_t mask = capacity - 1;
    for (std::uint32_t i = 0; i < size(); ++i) {
        const std::uint64_t h = hash(id(i));
        std::uint64_t pos = h & mask;
        while (slots[pos] != 0)
            pos = (pos + 1) & mask;
        slots[pos] = (h & 0xFFFFFFFF00000000ULL) | (i + 1);
    }
    m_slots.swap(slots);
    m_mask = mask;
}

void IdMap::reserve(std::size_t n)
{
    m_offsets.reserve(n + 1);
    while ((m_mask + 1) < n * 2 + 2)
        grow();
}

std::vector<std::string> IdMap::ids() const
{
    std::vector<std::string> out;
    out.reserve(size());
    for (std::uint32_t i = 0; i < size(); ++i)
        out.emplace_back(id(i));
    return out;
}

} // namespace slatewise::core
