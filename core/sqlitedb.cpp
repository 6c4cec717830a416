// SPDX-License-Identifier: MIT
#include "core/sqlitedb.h"

#include <sqlite3.h>

#include <cmath>
#include <utility>

namespace slatewise::core {

namespace {
[[noreturn]] void fail(sqlite3* db, std::string_view what)
{
    std::string message(what);
    if (db) {
        message += ": ";
        message += sqlite3_errmsg(db);
    }
    throw SqliteError(message);
}
} // namespace

SqliteDb SqliteDb::open(const std::string& path, bool create, bool readOnly)
{
    sqlite3* db = nullptr;
    int flags = readOnly ? SQLITE_OPEN_READONLY : SQLITE_OPEN_READWRITE;
    if (create && !readOnly)
        flags |= SQLITE_OPEN_CREATE;
    flags |= SQLITE_OPEN_NOMUTEX;
    if (sqlite3_open_v2(path.c_str(), &db, flags, nullptr) != SQLITE_OK) {
        std::string message = "cannot open workspace " + path;
        if (db) {
            message += ": ";
            message += sqlite3_errmsg(db);
            sqlite3_close(db);
        }
        throw SqliteError(message);
    }
    SqliteDb result(db);
    sqlite3_busy_timeout(db, 5000);
    result.exec("PRAGMA foreign_keys = ON");
    return result;
}

SqliteDb::SqliteDb(SqliteDb&& other) noexcept : m_db(std::exchange(other.m_db, nullptr)) {}

SqliteDb& SqliteDb::operator=(SqliteDb&& other) noexcept
{
    if (this != &other) {
        close();
        m_db = std::exchange(other.m_db, nullptr);
    }
    return *this;
}

SqliteDb::~SqliteDb() { close(); }

void SqliteDb::close()
{
    if (m_db) {
        sqlite3_close_v2(m_db);
        m_db = nullptr;
    }
}

void SqliteDb::exec(std::string_view sql)
{
    char* err = nullptr;
    const std::string text(sql);
    if (sqlite3_exec(m_db, text.c_str(), nullptr, nullptr, &err) != SQLITE_OK) {
        std::string message = err ? err : "unknown error";
        sqlite3_free(err);
        throw SqliteError("SQL failed (" + text.substr(0, 60) + "): " + message);
    }
}

std::int64_t SqliteDb::lastInsertId() const { return sqlite3_last_insert_rowid(m_db); }

Statement::Statement(const SqliteDb& db, std::string_view sql) : m_db(db.handle())
{
    if (sqlite3_prepare_v2(m_db, sql.data(), static_cast<int>(sql.size()), &m_stmt, nullptr) != SQLITE_OK)
        fail(m_db, "cannot prepare statement");
}

Statement::Statement(Statement&& other) noexcept
    : m_stmt(std::exchange(other.m_stmt, nullptr)), m_db(other.m_db)
{
}

Statement::~Statement()
{
    if (m_stmt)
        sqlite3_finalize(m_stmt);
}

Statement& Statement::bind(int index, std::int64_t v)
{
    if (sqlite3_bind_int64(m_stmt, index, v) != SQLITE_OK)
        fail(m_db, "bind failed");
    return *this;
}

Statement& Statement::bind(int index, double v)
{
    if (sqlite3_bind_double(m_stmt, index, v) != SQLITE_OK)
        fail(m_db, "bind failed");
    return *this;
}

Statement& Statement::bind(int index, std::string_view v)
{
    if (sqlite3_bind_text(m_stmt, index, v.data(), static_cast<int>(v.size()), SQLITE_TRANSIENT) != SQLITE_OK)
        fail(m_db, "bind failed");
    return *this;
}

Statement& Statement::bindNull(int index)
{
    if (sqlite3_bind_null(m_stmt, index) != SQLITE_OK)
        fail(m_db, "bind failed");
    return *this;
}

Statement& Statement::bindOptional(int index, double v)
{
    return std::isnan(v) ? bindNull(index) : bind(index, v);
}

bool Statement::step()
{
    const int rc = sqlite3_step(m_stmt);
    if (rc == SQLITE_ROW)
        return true;
    if (rc == SQLITE_DONE)
        return false;
    fail(m_db, "statement failed");
}

void Statement::run()
{
    step();
    reset();
}

void Statement::reset()
{
    sqlite3_reset(m_stmt);
    sqlite3_clear_bindings(m_stmt);
}

bool Statement::isNull(int column) const { return sqlite3_column_type(m_stmt, column) == SQLITE_NULL; }

std::int64_t Statement::int64(int column) const { return sqlite3_column_int64(m_stmt, column); }

double Statement::real(int column) const
{
    return isNull(column) ? std::nan("") : sqlite3_column_double(m_stmt, column);
}

std::string Statement::text(int column) const
{
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(m_stmt, column));
    return p ? std::string(p, static_cast<std::size_t>(sqlite3_column_bytes(m_stmt, column))) : std::string();
}

Transaction::Transaction(SqliteDb& db) : m_db(db) { m_db.exec("BEGIN IMMEDIATE"); }

Transaction::~Transaction()
{
    if (!m_done) {
        try {
            m_db.exec("ROLLBACK");
        } catch (const SqliteError&) { // NOLINT(bugprone-empty-catch): nothing more to undo
        }
    }
}

void Transaction::commit()
{
    m_db.exec("COMMIT");
    m_done = true;
}

} // namespace slatewise::core
