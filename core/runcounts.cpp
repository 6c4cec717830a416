// SPDX-License-Identifier: MIT
#include "core/runcounts.h"

namespace slatewise::core {

void recordRunCounts(
    const SqliteDb& db, std::int64_t runId, std::int64_t scoreCount, std::int64_t listRows, std::int64_t listUsers)
{
    Statement q(db, "UPDATE runs SET score_count = ?, list_rows = ?, list_users = ? WHERE run_id = ?");
    q.bind(1, scoreCount).bind(2, listRows).bind(3, listUsers).bind(4, runId).run();
}

} // namespace slatewise::core
