// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <cmath>
#include <cstdint>
#include <limits>
#include <span>
#include <string>
#include <vector>

namespace slatewise::core {

/// The rating scale of a workspace, e.g. 1..5 in steps of 1.
struct RatingScale {
    double min = 1.0;
    double max = 5.0;
    double step = 1.0; ///< 0 means continuous
    bool inferred = false; ///< true when read off the data rather than given with --scale
};

/// Unix seconds; kNoTimestamp when the input left the cell empty.
using Timestamp = std::int64_t;
inline constexpr Timestamp kNoTimestamp = std::numeric_limits<std::int64_t>::min();

struct Item {
    std::string externalId;
    std::string title;
    std::int32_t year = 0;            ///< 0 when unknown
    std::vector<std::int32_t> genres; ///< indices into Dataset::genreNames, ascending
    std::int32_t series = kNone;      ///< index into Dataset::seriesNames or kNone
    std::int32_t seriesPart = 0;      ///< 1-based order within the series; 0 when not in one
};

struct Interaction {
    ItemIndex item;
    float rating = 0.0f;
    Timestamp timestamp = kNoTimestamp;
};

/// Interactions grouped by user (compressed rows): the rows of user u are
/// rows[offsets[u] .. offsets[u+1]). Within a user, train rows are sorted by timestamp
/// (then item) and withheld rows by item index, so lookups can bisect.
struct InteractionTable {
    std::vector<Interaction> rows;
    std::vector<std::uint32_t> offsets; ///< size = user count + 1

    std::span<const Interaction> of(UserIndex u) const
    {
        return {rows.data() + offsets[u.value], rows.data() + offsets[u.value + 1]};
    }
    std::size_t size() const { return rows.size(); }
};

/// Everything about the data a run is judged on, loaded once from a workspace.
/// Plain values; safe to share read-only between threads.
struct Dataset {
    RatingScale scale;
    std::vector<std::string> userIds; ///< external ids, by UserIndex
    std::vector<Item> items;          ///< by ItemIndex
    std::vector<std::string> genreNames;
    std::vector<std::string> seriesNames;
    InteractionTable train;
    InteractionTable withheld;

    std::size_t userCount() const { return userIds.size(); }
    std::size_t itemCount() const { return items.size(); }
};

/// Derived, per-item and per-user facts that several measures need.
struct DatasetStats {
    std::vector<std::int32_t> itemTrainUsers;   ///< n_i: distinct train users per item
    std::int32_t trainUsers = 0;                ///< N: users with at least one train row
    std::vector<double> itemPopularityPercentile; ///< percentile of n_i among all catalog items, 0..100
    std::vector<std::int32_t> userTrainCount;   ///< train rows per user
};

DatasetStats computeStats(const Dataset& data);

/// Index of the withheld row for (u, item) within data.withheld.rows, or -1.
std::int64_t findWithheld(const Dataset& data, UserIndex u, ItemIndex item);

} // namespace slatewise::core
