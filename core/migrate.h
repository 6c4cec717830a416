// SPDX-License-Identifier: MIT
#pragma once

#include "core/sqlitedb.h"

#include <string>

namespace slatewise::core {

/// The schema version a workspace records in meta ('schema_version'); 0 when the file has no
/// meta table (not a Slatewise workspace). Throws SqliteError on unreadable files.
int storedSchemaVersion(const SqliteDb& db);

/// Applies migrations()[from-1 .. kSchemaVersion-2] in order. The caller owns the transaction.
void migrateSchema(SqliteDb& db, int from);

/// Current UTC time as ISO 8601 ("2026-03-04T20:15:00Z").
std::string utcNow();

} // namespace slatewise::core
