// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>

struct sqlite3;
struct sqlite3_stmt;

namespace slatewise::core {

/// Thrown by the thin SQLite wrappers below; callers at the workspace boundary turn it
/// into an Error{ErrorKind::Workspace}. It never crosses into the UI or the command line.
class SqliteError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

/// An owned connection.
class SqliteDb {
public:
    SqliteDb() = default;
    /// Opens (read-write, creating when `create`) and turns foreign keys on.
    static SqliteDb open(const std::string& path, bool create, bool readOnly = false);
    SqliteDb(SqliteDb&& other) noexcept;
    SqliteDb& operator=(SqliteDb&& other) noexcept;
    SqliteDb(const SqliteDb&) = delete;
    SqliteDb& operator=(const SqliteDb&) = delete;
    ~SqliteDb();

    sqlite3* handle() const { return m_db; }
    bool isOpen() const { return m_db != nullptr; }
    void exec(std::string_view sql);
    std::int64_t lastInsertId() const;
    void close();

private:
    explicit SqliteDb(sqlite3* db) : m_db(db) {}
    sqlite3* m_db = nullptr;
};

/// A prepared statement; bind indices are 1-based as in SQLite.
class Statement {
public:
    Statement(const SqliteDb& db, std::string_view sql);
    Statement(Statement&& other) noexcept;
    Statement& operator=(Statement&&) = delete;
    Statement(const Statement&) = delete;
    Statement& operator=(const Statement&) = delete;
    ~Statement();

    Statement& bind(int index, std::int64_t v);
    Statement& bind(int index, int v) { return bind(index, static_cast<std::int64_t>(v)); }
    Statement& bind(int index, double v);
    Statement& bind(int index, std::string_view v);
    Statement& bind(int index, const char* v) { return bind(index, std::string_view(v)); }
    Statement& bindNull(int index);
    /// Binds NULL for NaN, otherwise the value.
    Statement& bindOptional(int index, double v);

    /// true while a row is available.
    bool step();
    /// Steps once, expecting SQLITE_DONE.
    void run();
    void reset();

    bool isNull(int column) const;
    std::int64_t int64(int column) const;
    double real(int column) const; ///< NaN for NULL
    std::string text(int column) const;

private:
    sqlite3_stmt* m_stmt = nullptr;
    sqlite3* m_db = nullptr;
};

/// BEGIN IMMEDIATE on construction, ROLLBACK on destruction unless commit() was called,
/// so an exception or early return loses nothing and writes nothing.
class Transaction {
public:
    explicit Transaction(SqliteDb& db);
    Transaction(const Transaction&) = delete;
    Transaction& operator=(const Transaction&) = delete;
    ~Transaction();
    void commit();

private:
    SqliteDb& m_db;
    bool m_done = false;
};

} // namespace slatewise::core
