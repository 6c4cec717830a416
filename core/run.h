// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <cmath>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace slatewise::core {

/// How a run came to be.
enum class RunKind { Imported, Fitted, Reranked };

/// A run's identity and provenance as stored in the workspace.
struct RunInfo {
    std::int64_t id = 0;
    std::string name;
    RunKind kind = RunKind::Imported;
    std::string createdAt;    ///< ISO 8601, UTC
    std::string parentName;   ///< for derived runs; empty otherwise
    std::string method;       ///< model or re-ranking method; empty for imported runs
    std::string settingsJson; ///< the settings used, as a JSON object
    std::int64_t scoreCount = 0;
    std::int64_t listRowCount = 0;
    std::int64_t listUserCount = 0;
};

struct ListEntry {
    ItemIndex item;
    float score = std::nanf(""); ///< NaN when the lists file had no score column
};

/// A model run in memory, aligned with a Dataset:
/// - scores[r] is the run's score for withheld row r (NaN when the run gave none);
/// - lists are compressed rows by user, sorted by rank (rank = position + 1). A user with an
///   empty range has no list. Ranks in the file must be 1..n without gaps once sorted;
///   the reader keeps their order, not their values.
struct RunData {
    RunInfo info;
    bool hasScores = false;
    bool hasLists = false;
    std::vector<float> scores;          ///< size = withheld rows when hasScores
    std::vector<ListEntry> listRows;
    std::vector<std::uint32_t> listOffsets; ///< size = user count + 1 when hasLists

    std::span<const ListEntry> listOf(UserIndex u) const
    {
        if (!hasLists)
            return {};
        return {listRows.data() + listOffsets[u.value], listRows.data() + listOffsets[u.value + 1]};
    }
};

std::string_view toString(RunKind kind);

} // namespace slatewise::core
