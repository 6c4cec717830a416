// SPDX-License-Identifier: MIT
#include "core/workspace.h"

#include "core/bulkinsert.h"
#include "core/migrate.h"
#include "core/parallel.h"
#include "core/runcounts.h"
#include "core/schema.h"

#include <algorithm>
#include <charconv>
#include <filesystem>
#include <sqlite3.h>
#include <thread>

namespace slatewise::core {

namespace {

Error workspaceError(const std::string& path, std::string message, std::string expected = {})
{
    Error e;
    e.kind = ErrorKind::Workspace;
    e.file = path;
    e.message = std::move(message);
    e.expected = std::move(expected);
    return e;
}

Error usageError(std::string message, std::string value = {})
{
    Error e;
    e.kind = ErrorKind::Usage;
    e.message = std::move(message);
    e.value = std::move(value);
    return e;
}

/// Raw statement for the bulk read and write loops.
class Raw {
public:
    Raw(sqlite3* db, std::string_view sql)
        : m_db(db)
    {
        if (sqlite3_prepare_v2(db, sql.data(), static_cast<int>(sql.size()), &m_stmt, nullptr) != SQLITE_OK)
            throw SqliteError(std::string("cannot prepare statement: ") + sqlite3_errmsg(db));
    }
    ~Raw() { sqlite3_finalize(m_stmt); }
    Raw(const Raw&) = delete;
    Raw& operator=(const Raw&) = delete;
    sqlite3_stmt* get() const { return m_stmt; }
    bool step()
    {
        const int rc = sqlite3_step(m_stmt);
        if (rc == SQLITE_ROW)
            return true;
        if (rc == SQLITE_DONE)
            return false;
        throw SqliteError(std::string("query failed: ") + sqlite3_errmsg(m_db));
    }
    void done()
    {
        if (step())
            throw SqliteError("statement returned rows unexpectedly");
        sqlite3_reset(m_stmt);
    }
    std::int64_t i64(int c) const { return sqlite3_column_int64(m_stmt, c); }
    double real(int c) const { return sqlite3_column_double(m_stmt, c); }
    bool null(int c) const { return sqlite3_column_type(m_stmt, c) == SQLITE_NULL; }

private:
    sqlite3* m_db;
    sqlite3_stmt* m_stmt = nullptr;
};

double parseDouble(const std::string& s, double fallback)
{
    double v = fallback;
    auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    return ec == std::errc() ? v : fallback;
}

RatingScale readScale(const SqliteDb& db)
{
    RatingScale scale;
    Statement q(db, "SELECT key, value FROM meta WHERE key IN ('scale_min','scale_max','scale_step','scale_source')");
    while (q.step()) {
        const std::string key = q.text(0), value = q.text(1);
        if (key == "scale_min")
            scale.min = parseDouble(value, scale.min);
        else if (key == "scale_max")
            scale.max = parseDouble(value, scale.max);
        else if (key == "scale_step")
            scale.step = parseDouble(value, scale.step);
        else if (key == "scale_source")
            scale.inferred = value == "inferred";
    }
    return scale;
}

RunKind kindFromText(const std::string& s)
{
    if (s == "fitted")
        return RunKind::Fitted;
    if (s == "reranked")
        return RunKind::Reranked;
    return RunKind::Imported;
}

std::int64_t scalarInt(const SqliteDb& db, std::string_view sql)
{
    Statement q(db, sql);
    return q.step() ? q.int64(0) : 0;
}

} // namespace

Result<Workspace> Workspace::open(const std::string& path, bool readOnly)
{
    std::error_code ec;
    if (!std::filesystem::is_regular_file(path, ec))
        return workspaceError(path, "workspace file not found", "a workspace created by 'slatewise import'");
    try {
        SqliteDb db = SqliteDb::open(path, false, readOnly);
        int version = 0;
        try {
            version = storedSchemaVersion(db);
        } catch (const SqliteError& e) {
            return workspaceError(
                path, std::string("not a Slatewise workspace: ") + e.what(), "an SQLite workspace file");
        }
        if (version <= 0)
            return workspaceError(path, "not a Slatewise workspace (no schema version in its meta table)",
                "a workspace created by 'slatewise import'");
        if (version > kSchemaVersion)
            return workspaceError(path,
                "workspace has schema version " + std::to_string(version)
                    + ", newer than this Slatewise understands (up to version " + std::to_string(kSchemaVersion) + ")",
                "a newer version of Slatewise to open it");
        if (version < kSchemaVersion) {
            if (readOnly)
                return workspaceError(path,
                    "workspace has schema version " + std::to_string(version)
                        + " and must be migrated; open it once without read-only mode");
            Transaction tx(db);
            migrateSchema(db, version);
            tx.commit();
        }
        return Workspace(path, std::move(db));
    } catch (const SqliteError& e) {
        return workspaceError(path, e.what());
    }
}

Workspace::~Workspace() = default;

Result<WorkspaceSummary> Workspace::summary() const
{
    try {
        WorkspaceSummary s;
        s.schemaVersion = storedSchemaVersion(m_db);
        s.items = scalarInt(m_db, "SELECT count(*) FROM items");
        s.users = scalarInt(m_db, "SELECT count(*) FROM users");
        s.genres = scalarInt(m_db, "SELECT count(*) FROM genres");
        s.series = scalarInt(m_db, "SELECT count(*) FROM series");
        s.trainRows = scalarInt(m_db, "SELECT count(*) FROM train");
        s.withheldRows = scalarInt(m_db, "SELECT count(*) FROM withheld");
        s.scale = readScale(m_db);
        auto r = runs();
        if (!r)
            return r.errors();
        s.runs = std::move(r.value());
        return s;
    } catch (const SqliteError& e) {
        return workspaceError(m_path, e.what());
    }
}

Result<std::vector<RunInfo>> Workspace::runs() const
{
    try {
        std::vector<RunInfo> out;
        // Counts recorded when the run was stored; a run added by other means is counted here
        // (coalesce evaluates its second argument only when the first is NULL). Every user's
        // list has exactly one rank-1 entry, so counting rank 1 counts users with a list.
        Statement q(m_db,
            "SELECT r.run_id, r.name, r.kind, r.created_at, p.name, r.method, r.settings,"
            " coalesce(r.score_count, (SELECT count(*) FROM run_scores s WHERE s.run_id = r.run_id)),"
            " coalesce(r.list_rows, (SELECT count(*) FROM run_lists l WHERE l.run_id = r.run_id)),"
            " coalesce(r.list_users,"
            "   (SELECT count(*) FROM run_lists l WHERE l.run_id = r.run_id AND l.rank = 1))"
            " FROM runs r LEFT JOIN runs p ON p.run_id = r.parent_run_id ORDER BY r.run_id");
        while (q.step()) {
            RunInfo info;
            info.id = q.int64(0);
            info.name = q.text(1);
            info.kind = kindFromText(q.text(2));
            info.createdAt = q.text(3);
            info.parentName = q.text(4);
            info.method = q.text(5);
            info.settingsJson = q.text(6);
            info.scoreCount = q.int64(7);
            info.listRowCount = q.int64(8);
            info.listUserCount = q.int64(9);
            out.push_back(std::move(info));
        }
        return out;
    } catch (const SqliteError& e) {
        return workspaceError(m_path, e.what());
    }
}

Result<RunInfo> Workspace::run(const std::string& name) const
{
    auto all = runs();
    if (!all)
        return all.errors();
    for (auto& info : all.value())
        if (info.name == name)
            return info;
    return usageError("no run named '" + name + "' in " + m_path, name);
}

Result<Dataset> Workspace::loadDataset() const
{
    try {
        Dataset data;
        data.scale = readScale(m_db);
        const auto dense = [&](std::int64_t id, std::size_t expected, const char* table) {
            if (id != static_cast<std::int64_t>(expected))
                throw SqliteError(std::string(table) + " keys are not 0..n-1; the workspace is damaged");
        };
        {
            Statement q(m_db, "SELECT genre_id, name FROM genres ORDER BY genre_id");
            while (q.step()) {
                dense(q.int64(0), data.genreNames.size(), "genre");
                data.genreNames.push_back(q.text(1));
            }
        }
        {
            Statement q(m_db, "SELECT series_id, name FROM series ORDER BY series_id");
            while (q.step()) {
                dense(q.int64(0), data.seriesNames.size(), "series");
                data.seriesNames.push_back(q.text(1));
            }
        }
        {
            Statement q(
                m_db, "SELECT item_id, external_id, title, year, series_id, series_part FROM items ORDER BY item_id");
            while (q.step()) {
                dense(q.int64(0), data.items.size(), "item");
                Item item;
                item.externalId = q.text(1);
                item.title = q.text(2);
                item.year = q.isNull(3) ? 0 : static_cast<std::int32_t>(q.int64(3));
                item.series = q.isNull(4) ? kNone : static_cast<std::int32_t>(q.int64(4));
                item.seriesPart = q.isNull(5) || item.series == kNone ? 0 : static_cast<std::int32_t>(q.int64(5));
                data.items.push_back(std::move(item));
            }
            Statement g(m_db, "SELECT item_id, genre_id FROM item_genres ORDER BY item_id, genre_id");
            while (g.step()) {
                const auto item = static_cast<std::size_t>(g.int64(0));
                if (item < data.items.size())
                    data.items[item].genres.push_back(static_cast<std::int32_t>(g.int64(1)));
            }
        }
        {
            Statement q(m_db, "SELECT user_id, external_id FROM users ORDER BY user_id");
            while (q.step()) {
                dense(q.int64(0), data.userIds.size(), "user");
                data.userIds.push_back(q.text(1));
            }
        }
        const std::size_t users = data.userIds.size();

        // Train: read rowid ranges on one connection per worker (SQLite's step is the cost
        // here), then a counting sort by user.
        struct Part {
            std::vector<Interaction> rows;
            std::vector<std::uint32_t> users;
            std::string error;
        };
        const std::int64_t maxRowid = scalarInt(m_db, "SELECT coalesce(max(rowid), 0) FROM train");
        const unsigned workers = maxRowid > 200000 ? workerCount() : 1;
        std::vector<Part> parts(workers);
        const std::int64_t span = maxRowid / workers + 1;
        parallelFor(
            workers,
            [&](std::size_t begin, std::size_t end, unsigned) {
                for (std::size_t w = begin; w < end; ++w) {
                    Part& part = parts[w];
                    try {
                        // :memory: paths cannot be shared; fall back to this connection for them.
                        SqliteDb own;
                        sqlite3* handle = m_db.handle();
                        if (workers > 1) {
                            own = SqliteDb::open(m_path, false, true);
                            handle = own.handle();
                        }
                        Raw q(handle, "SELECT user_id, item_id, rating, ts FROM train WHERE rowid >= ? AND rowid < ?");
                        sqlite3_bind_int64(q.get(), 1, static_cast<std::int64_t>(w) * span);
                        sqlite3_bind_int64(q.get(), 2, static_cast<std::int64_t>(w + 1) * span);
                        part.rows.reserve(static_cast<std::size_t>(span));
                        part.users.reserve(static_cast<std::size_t>(span));
                        while (q.step()) {
                            part.users.push_back(static_cast<std::uint32_t>(q.i64(0)));
                            part.rows.push_back(Interaction { ItemIndex(static_cast<std::uint32_t>(q.i64(1))),
                                static_cast<float>(q.real(2)), q.null(3) ? kNoTimestamp : q.i64(3) });
                        }
                    } catch (const SqliteError& e) {
                        part.error = e.what();
                    }
                }
            },
            workers);
        for (const Part& part : parts)
            if (!part.error.empty())
                throw SqliteError(part.error);
        std::vector<std::uint32_t> offsets(users + 1, 0);
        for (const Part& part : parts)
            for (std::uint32_t u : part.users) {
                if (u >= users)
                    throw SqliteError("train row for an unknown user; the workspace is damaged");
                ++offsets[u + 1];
            }
        for (std::size_t u = 0; u < users; ++u)
            offsets[u + 1] += offsets[u];
        data.train.rows.resize(offsets[users]);
        {
            std::vector<std::uint32_t> next(offsets.begin(), offsets.end() - 1);
            for (Part& part : parts) {
                for (std::size_t r = 0; r < part.rows.size(); ++r)
                    data.train.rows[next[part.users[r]]++] = part.rows[r];
                std::vector<Interaction>().swap(part.rows);
                std::vector<std::uint32_t>().swap(part.users);
            }
        }
        data.train.offsets = std::move(offsets);
        parallelFor(users, [&](std::size_t begin, std::size_t end, unsigned) {
            for (std::size_t u = begin; u < end; ++u)
                std::sort(data.train.rows.begin() + data.train.offsets[u],
                    data.train.rows.begin() + data.train.offsets[u + 1],
                    [](const Interaction& a, const Interaction& b) {
                        return a.timestamp != b.timestamp ? a.timestamp < b.timestamp : a.item < b.item;
                    });
        });

        // Withheld: the primary key order is (user, item) already.
        {
            data.withheld.offsets.assign(users + 1, 0);
            Raw q(m_db.handle(), "SELECT user_id, item_id, rating, ts FROM withheld ORDER BY user_id, item_id");
            while (q.step()) {
                const auto u = static_cast<std::uint32_t>(q.i64(0));
                if (u >= users)
                    throw SqliteError("withheld row for an unknown user; the workspace is damaged");
                ++data.withheld.offsets[u + 1];
                data.withheld.rows.push_back(Interaction { ItemIndex(static_cast<std::uint32_t>(q.i64(1))),
                    static_cast<float>(q.real(2)), q.null(3) ? kNoTimestamp : q.i64(3) });
            }
            for (std::size_t u = 0; u < users; ++u)
                data.withheld.offsets[u + 1] += data.withheld.offsets[u];
        }
        return data;
    } catch (const SqliteError& e) {
        return workspaceError(m_path, std::string("cannot load the dataset: ") + e.what());
    }
}

Result<RunData> Workspace::loadRun(const std::string& name, const Dataset& data) const
{
    auto info = run(name);
    if (!info)
        return info.errors();
    try {
        RunData out;
        out.info = info.value();
        const std::int64_t runId = out.info.id;
        const std::size_t users = data.userCount();
        out.hasScores = out.info.scoreCount > 0;
        out.hasLists = out.info.listRowCount > 0;
        if (out.hasScores) {
            out.scores.assign(data.withheld.size(), std::nanf(""));
            Raw q(m_db.handle(),
                "SELECT user_id, item_id, score FROM run_scores WHERE run_id = ? ORDER BY user_id, item_id");
            sqlite3_bind_int64(q.get(), 1, runId);
            while (q.step()) {
                const auto u = static_cast<std::uint32_t>(q.i64(0));
                if (u >= users)
                    continue; // a user added after `data` was loaded
                const auto r = findWithheld(data, UserIndex(u), ItemIndex(static_cast<std::uint32_t>(q.i64(1))));
                if (r >= 0)
                    out.scores[static_cast<std::size_t>(r)] = static_cast<float>(q.real(2));
            }
        }
        if (out.hasLists) {
            out.listOffsets.assign(users + 1, 0);
            out.listRows.reserve(static_cast<std::size_t>(out.info.listRowCount));
            Raw q(
                m_db.handle(), "SELECT user_id, item_id, score FROM run_lists WHERE run_id = ? ORDER BY user_id, rank");
            sqlite3_bind_int64(q.get(), 1, runId);
            while (q.step()) {
                const auto u = static_cast<std::uint32_t>(q.i64(0));
                if (u >= users)
                    continue;
                ++out.listOffsets[u + 1];
                out.listRows.push_back(ListEntry { ItemIndex(static_cast<std::uint32_t>(q.i64(1))),
                    q.null(2) ? std::nanf("") : static_cast<float>(q.real(2)) });
            }
            for (std::size_t u = 0; u < users; ++u)
                out.listOffsets[u + 1] += out.listOffsets[u];
        }
        return out;
    } catch (const SqliteError& e) {
        return workspaceError(m_path, std::string("cannot load run '") + name + "': " + e.what());
    }
}

Result<std::int64_t> Workspace::storeRun(const RunData& run, const Dataset& data)
{
    if (run.info.name.empty())
        return usageError("a run needs a name");
    if (run.hasScores && run.scores.size() != data.withheld.size())
        return usageError("run scores are not aligned with the withheld rows");
    if (run.hasLists && run.listOffsets.size() != data.userCount() + 1)
        return usageError("run lists are not aligned with the users");
    try {
        {
            Statement exists(m_db, "SELECT count(*) FROM runs WHERE name = ?");
            exists.bind(1, run.info.name);
            if (exists.step() && exists.int64(0) > 0)
                return usageError("a run named '" + run.info.name + "' already exists", run.info.name);
        }
        Transaction tx(m_db);
        std::optional<std::int64_t> parent;
        if (!run.info.parentName.empty()) {
            Statement p(m_db, "SELECT run_id FROM runs WHERE name = ?");
            p.bind(1, run.info.parentName);
            if (!p.step())
                return usageError("no parent run named '" + run.info.parentName + "'", run.info.parentName);
            parent = p.int64(0);
        }
        Statement ins(
            m_db, "INSERT INTO runs(name, created_at, settings, kind, parent_run_id, method) VALUES(?,?,?,?,?,?)");
        ins.bind(1, run.info.name)
            .bind(2, run.info.createdAt.empty() ? utcNow() : run.info.createdAt)
            .bind(3, run.info.settingsJson.empty() ? std::string("{}") : run.info.settingsJson)
            .bind(4, toString(run.info.kind));
        if (parent)
            ins.bind(5, *parent);
        else
            ins.bindNull(5);
        if (run.info.method.empty())
            ins.bindNull(6);
        else
            ins.bind(6, run.info.method);
        ins.run();
        const std::int64_t runId = m_db.lastInsertId();
        std::int64_t scoreCount = 0, listRows = 0, listUsers = 0;
        if (run.hasScores) {
            BulkInsert ins(m_db, "run_scores", { "run_id", "user_id", "item_id", "score" });
            for (std::size_t u = 0; u < data.userCount(); ++u) {
                for (auto r = data.withheld.offsets[u]; r < data.withheld.offsets[u + 1]; ++r) {
                    if (std::isnan(run.scores[r]))
                        continue;
                    ins.i64(1, runId).i64(2, static_cast<std::int64_t>(u)).i64(3, data.withheld.rows[r].item.value);
                    ins.real(4, run.scores[r]).run();
                    ++scoreCount;
                }
            }
            ins.finish();
        }
        if (run.hasLists) {
            BulkInsert ins(m_db, "run_lists", { "run_id", "user_id", "rank", "item_id", "score" });
            for (std::size_t u = 0; u < data.userCount(); ++u) {
                const auto list = run.listOf(UserIndex(static_cast<std::uint32_t>(u)));
                listRows += static_cast<std::int64_t>(list.size());
                listUsers += list.empty() ? 0 : 1;
                for (std::size_t j = 0; j < list.size(); ++j) {
                    ins.i64(1, runId).i64(2, static_cast<std::int64_t>(u)).i64(3, static_cast<std::int64_t>(j + 1));
                    ins.i64(4, list[j].item.value);
                    if (std::isnan(list[j].score))
                        ins.null(5);
                    else
                        ins.real(5, list[j].score);
                    ins.run();
                }
            }
            ins.finish();
        }
        recordRunCounts(m_db, runId, scoreCount, listRows, listUsers);
        tx.commit();
        return runId;
    } catch (const SqliteError& e) {
        return workspaceError(m_path, std::string("cannot store run '") + run.info.name + "': " + e.what());
    }
}

Status Workspace::deleteRun(const std::string& name)
{
    try {
        Transaction tx(m_db);
        Statement del(m_db, "DELETE FROM runs WHERE name = ?");
        del.bind(1, name).run();
        if (sqlite3_changes(m_db.handle()) == 0)
            return usageError("no run named '" + name + "' in " + m_path, name);
        tx.commit();
        return Done {};
    } catch (const SqliteError& e) {
        return workspaceError(m_path, std::string("cannot delete run '") + name + "': " + e.what());
    }
}

} // namespace slatewise::core
