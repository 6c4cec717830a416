// SPDX-License-Identifier: MIT
#pragma once

#include "core/comparisonresult.h"
#include "core/error.h"
#include "core/sqlitedb.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace slatewise::core {

/// A stored comparison as listed by the GUI (without its result).
struct StoredComparison {
    std::int64_t id = 0;
    std::string base;
    std::string candidate;
    std::string settings; ///< RunComparison::settingsKey()
    std::string computedAt;
};

/// Reads and writes the workspace's `comparisons` table: one row per (base run, candidate run,
/// settings), the whole RunComparison (per-user values included) as JSON in `result`.
class ComparisonStore {
public:
    explicit ComparisonStore(SqliteDb& db) : m_db(db) {}

    /// Stores `c` in one transaction, replacing an earlier result for the same runs and
    /// settings; sets computed_at to now (UTC). Returns the row id.
    Result<std::int64_t> store(const RunComparison& c);
    /// The stored comparison for these runs and RunComparison::settingsKey(), if any.
    Result<std::optional<RunComparison>> load(std::int64_t baseRunId, std::int64_t candidateRunId,
                                              const std::string& settingsKey) const;
    /// Every stored comparison, newest first.
    Result<std::vector<StoredComparison>> list() const;

private:
    SqliteDb& m_db;
};

} // namespace slatewise::core
