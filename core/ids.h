// SPDX-License-Identifier: MIT
#pragma once

#include <compare>
#include <cstdint>
#include <functional>

namespace slatewise::core {

/// A dense 0-based index that cannot be mixed up with an index of another kind.
/// Users and items are numbered 0..n-1 in memory; the workspace stores the same
/// numbers as its integer surrogate keys.
template <typename Tag>
struct StrongIndex {
    std::uint32_t value = 0;

    constexpr StrongIndex() = default;
    constexpr explicit StrongIndex(std::uint32_t v) : value(v) {}
    constexpr auto operator<=>(const StrongIndex&) const = default;
};

using UserIndex = StrongIndex<struct UserTag>;
using ItemIndex = StrongIndex<struct ItemTag>;

/// Sentinel for "no series" / "no genre" style optional small indices.
inline constexpr std::int32_t kNone = -1;

} // namespace slatewise::core

template <typename Tag>
struct std::hash<slatewise::core::StrongIndex<Tag>> {
    std::size_t operator()(slatewise::core::StrongIndex<Tag> i) const noexcept { return i.value; }
};
