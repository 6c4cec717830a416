// SPDX-License-Identifier: MIT
#include "core/migrate.h"

#include "core/schema.h"
#include "core/timestamp.h"

#include <chrono>

namespace slatewise::core {

int storedSchemaVersion(const SqliteDb& db)
{
    Statement has(db, "SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = 'meta'");
    if (!has.step() || has.int64(0) == 0)
        return 0;
    Statement q(db, "SELECT value FROM meta WHERE key = 'schema_version'");
    if (!q.step())
        return 0;
    try {
        return std::stoi(q.text(0));
    } catch (const std::exception&) {
        return 0;
    }
}

void migrateSchema(SqliteDb& db, int from)
{
    const auto& steps = migrations();
    for (int v = from; v < kSchemaVersion; ++v)
        db.exec(steps[static_cast<std::size_t>(v - 1)]);
}

std::string utcNow()
{
    const auto now = std::chrono::system_clock::now();
    return formatIso8601(std::chrono::duration_cast<std::chrono::seconds>(now.time_since_epoch()).count());
}

} // namespace slatewise::core
