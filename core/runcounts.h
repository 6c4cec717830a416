// SPDX-License-Identifier: MIT
#pragma once

#include "core/sqlitedb.h"

#include <cstdint>

namespace slatewise::core {

/// Records a stored run's row counts in its `runs` row (schema version 3), so listing runs
/// need not count millions of list rows. Called inside the transaction that wrote the rows.
void recordRunCounts(
    const SqliteDb& db, std::int64_t runId, std::int64_t scoreCount, std::int64_t listRows, std::int64_t listUsers);

} // namespace slatewise::core
