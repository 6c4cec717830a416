// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

/// Maps opaque external ids (user or item ids) to dense indices 0..n-1 in order of insertion.
/// The ids live in one character arena and the table is open-addressed, so millions of
/// lookups cost no allocation; far faster than std::unordered_map<std::string, ...>.
class IdMap {
public:
    static constexpr std::uint32_t kMissing = 0xFFFFFFFFu;

    IdMap();
    std::uint32_t find(std::string_view id) const;
    /// Returns the index of `id`, adding it at the end when new; `added` tells which.
    struct Insert {
        std::uint32_t index;
        bool added;
    };
    Insert insert(std::string_view id);
    std::string_view id(std::uint32_t index) const
    {
        return {m_arena.data() + m_offsets[index], m_offsets[index + 1] - m_offsets[index]};
    }
    std::uint32_t size() const { return static_cast<std::uint32_t>(m_offsets.size() - 1); }
    std::vector<std::string> ids() const;
    void reserve(std::size_t n);

private:
    static std::uint64_t hash(std::string_view s);
    void grow();
    std::string m_arena;
    std::vector<std::uint64_t> m_offsets; ///< size() + 1 entries
    /// Per slot: upper 32 bits of the id's hash (to skip most compares) and index + 1 in the
    /// lower 32 bits; 0 = empty. One array, so a probe costs one cache miss.
    std::vector<std::uint64_t> m_slots;
    std::uint64_t m_mask = 0;
};

} // namespace slatewise::core
