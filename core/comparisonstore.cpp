// SPDX-License-Identifier: MIT
#include "core/comparisonstore.h"

#include <chrono>
#include <ctime>

namespace slatewise::core {

namespace {

std::string nowUtc()
{
    const std::time_t t = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm tm{};
    gmtime_r(&t, &tm);
    char buffer[32];
    std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
    return buffer;
}

Error workspaceError(const std::string& what, const std::exception& e)
{
    Error err;
    err.kind = ErrorKind::Workspace;
    err.message = what + ": " + e.what();
    return err;
}

} // namespace

Result<std::int64_t> ComparisonStore::store(const RunComparison& c)
{
    try {
        RunComparison stamped = c;
        stamped.computedAt = nowUtc();
        Transaction tx(m_db);
        Statement st(m_db, "INSERT INTO comparisons(base_run_id, candidate_run_id, settings, computed_at, result) "
                           "VALUES (?1, ?2, ?3, ?4, ?5) "
                           "ON CONFLICT(base_run_id, candidate_run_id, settings) "
                           "DO UPDATE SET computed_at = excluded.computed_at, result = excluded.result");
        st.bind(1, stamped.baseRunId)
            .bind(2, stamped.candidateRunId)
            .bind(3, stamped.settingsKey())
            .bind(4, stamped.computedAt)
            .bind(5, stamped.toJson(true, -1));
        st.run();
        Statement id(m_db, "SELECT comparison_id FROM comparisons WHERE base_run_id = ?1 AND candidate_run_id = ?2 "
                           "AND settings = ?3");
        id.bind(1, stamped.baseRunId).bind(2, stamped.candidateRunId).bind(3, stamped.settingsKey());
        if (!id.step())
            throw SqliteError("comparison row vanished after insert");
        const std::int64_t rowId = id.int64(0);
        tx.commit();
        return rowId;
    } catch (const SqliteError& e) {
        return workspaceError("cannot store the comparison of '" + c.base + "' and '" + c.candidate + "'", e);
    }
}

Result<std::optional<RunComparison>> ComparisonStore::load(std::int64_t baseRunId, std::int64_t candidateRunId,
                                                           const std::string& settingsKey) const
{
    try {
        Statement st(m_db, "SELECT result FROM comparisons WHERE base_run_id = ?1 AND candidate_run_id = ?2 "
                           "AND settings = ?3");
        st.bind(1, baseRunId).bind(2, candidateRunId).bind(3, settingsKey);
        if (!st.step())
            return std::optional<RunComparison>();
        auto parsed = RunComparison::fromJson(st.text(0));
        if (!parsed.ok())
            return parsed.errors();
        return std::optional<RunComparison>(std::move(*parsed));
    } catch (const SqliteError& e) {
        return workspaceError("cannot read stored comparisons", e);
    }
}

Result<std::vector<StoredComparison>> ComparisonStore::list() const
{
    try {
        Statement st(m_db, "SELECT c.comparison_id, b.name, k.name, c.settings, c.computed_at FROM comparisons c "
                           "JOIN runs b ON b.run_id = c.base_run_id JOIN runs k ON k.run_id = c.candidate_run_id "
                           "ORDER BY c.computed_at DESC, c.comparison_id DESC");
        std::vector<StoredComparison> out;
        while (st.step())
            out.push_back({st.int64(0), st.text(1), st.text(2), st.text(3), st.text(4)});
        return out;
    } catch (const SqliteError& e) {
        return workspaceError("cannot list stored comparisons", e);
    }
}

} // namespace slatewise::core
