// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/run.h"
#include "core/sqlitedb.h"

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

namespace slatewise::core {

/// Counts shown by `slatewise info` and the GUI's status line.
struct WorkspaceSummary {
    int schemaVersion = 0;
    std::int64_t items = 0, users = 0, genres = 0, series = 0;
    std::int64_t trainRows = 0, withheldRows = 0;
    RatingScale scale;
    std::vector<RunInfo> runs;
};

/// An open workspace file. Owns the SQLite connection; not thread-safe (one per thread).
/// Readers and evaluators take the plain structs it loads, never the Workspace itself.
class Workspace {
public:
    /// Opens an existing workspace, migrating it forward to kSchemaVersion inside one
    /// transaction. A file written by a newer Slatewise is refused (ErrorKind::Workspace).
    static Result<Workspace> open(const std::string& path, bool readOnly = false);

    Workspace(Workspace&&) noexcept = default;
    Workspace& operator=(Workspace&&) noexcept = default;
    ~Workspace();

    const std::string& path() const { return m_path; }
    SqliteDb& db() { return m_db; }
    const SqliteDb& db() const { return m_db; }

    Result<WorkspaceSummary> summary() const;
    Result<std::vector<RunInfo>> runs() const;
    Result<RunInfo> run(const std::string& name) const;

    /// The whole dataset (catalog, users, train, withheld) in memory.
    Result<Dataset> loadDataset() const;
    /// One run aligned with `data` (which must come from this workspace).
    Result<RunData> loadRun(const std::string& name, const Dataset& data) const;

    /// Stores a computed run (fitted or re-ranked) in one transaction. The run's scores
    /// are aligned with data.withheld, its lists by user.
    Result<std::int64_t> storeRun(const RunData& run, const Dataset& data);
    Status deleteRun(const std::string& name);

private:
    Workspace(std::string path, SqliteDb db) : m_path(std::move(path)), m_db(std::move(db)) {}
    std::string m_path;
    SqliteDb m_db;
};

} // namespace slatewise::core
