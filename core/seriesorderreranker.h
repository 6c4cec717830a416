// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/progress.h"
#include "core/reranksettings.h"
#include "core/run.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Puts series in order. Walking the parent's list top down, an item that is part p > 1 of
/// a series while an earlier part is neither in the user's train history nor already
/// placed is handled through e, the earliest such part:
/// - e is further down the same list: e is moved up to this place and the item follows
///   it (repeated until no earlier part is missing);
/// - e is not in the list: e takes the item's place (with the item's score) and the item
///   leaves the list.
/// The result therefore has no order violations as the beyond-accuracy measures define
/// them, keeps the list's length and contains no seen item.
class SeriesOrderReranker {
public:
    /// Catalog items of each series sorted by part (then item index).
    static std::vector<std::vector<std::uint32_t>> seriesIndex(const Dataset& data);

    /// `seen` holds the user's train items, ascending.
    static std::vector<ListEntry> rerankList(const Dataset& data, const std::vector<std::vector<std::uint32_t>>& series,
                                             std::span<const std::uint32_t> seen, std::span<const ListEntry> list);

    static Result<RunData> apply(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                                 const Progress& progress);
};

} // namespace slatewise::core
