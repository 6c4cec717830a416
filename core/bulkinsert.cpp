// SPDX-License-Identifier: MIT
#include "core/bulkinsert.h"

#include <algorithm>
#include <sqlite3.h>

namespace slatewise::core {

BulkInsert::BulkInsert(const SqliteDb& db, std::string_view table, std::vector<std::string_view> columns,
    int rowsPerStatement, std::string_view verb)
    : m_db(db.handle())
    , m_columns(static_cast<int>(columns.size()))
    ,
    // SQLite allows 32,766 parameters per statement.
    m_perStatement(std::clamp(rowsPerStatement, 1, 32766 / std::max<int>(1, static_cast<int>(columns.size()))))
{
    m_head = std::string(verb) + " INTO " + std::string(table) + "(";
    m_tuple = "(";
    for (std::size_t c = 0; c < columns.size(); ++c) {
        m_head += (c ? "," : "") + std::string(columns[c]);
        m_tuple += c ? ",?" : "?";
    }
    m_head += ") VALUES";
    m_tuple += ")";
    m_values.resize(static_cast<std::size_t>(m_perStatement) * static_cast<std::size_t>(m_columns));
    m_full = prepare(m_perStatement);
}

BulkInsert::~BulkInsert()
{
    sqlite3_finalize(m_full);
}

sqlite3_stmt* BulkInsert::prepare(int rows) const
{
    std::string sql = m_head;
    sql.reserve(m_head.size() + static_cast<std::size_t>(rows) * (m_tuple.size() + 1));
    for (int r = 0; r < rows; ++r) {
        if (r)
            sql += ',';
        sql += m_tuple;
    }
    sqlite3_stmt* stmt = nullptr;
    if (sqlite3_prepare_v2(m_db, sql.c_str(), static_cast<int>(sql.size()), &stmt, nullptr) != SQLITE_OK) {
        const std::string message = sqlite3_errmsg(m_db);
        sqlite3_finalize(stmt);
        throw SqliteError("cannot prepare insert: " + message);
    }
    return stmt;
}

BulkInsert& BulkInsert::i64(int column, std::int64_t v)
{
    Value& x = m_values[static_cast<std::size_t>(m_rows * m_columns + column - 1)];
    x.type = Value::Type::Int;
    x.i = v;
    return *this;
}

BulkInsert& BulkInsert::real(int column, double v)
{
    Value& x = m_values[static_cast<std::size_t>(m_rows * m_columns + column - 1)];
    x.type = Value::Type::Real;
    x.d = v;
    return *this;
}

BulkInsert& BulkInsert::null(int column)
{
    m_values[static_cast<std::size_t>(m_rows * m_columns + column - 1)].type = Value::Type::Null;
    return *this;
}

BulkInsert& BulkInsert::text(int column, std::string_view v)
{
    Value& x = m_values[static_cast<std::size_t>(m_rows * m_columns + column - 1)];
    x.type = Value::Type::Text;
    x.s.assign(v);
    return *this;
}

void BulkInsert::run()
{
    if (++m_rows < m_perStatement)
        return;
    send(m_full, m_rows);
    m_rows = 0;
}

void BulkInsert::finish()
{
    if (m_rows == 0)
        return;
    sqlite3_stmt* stmt = prepare(m_rows);
    try {
        send(stmt, m_rows);
    } catch (...) {
        sqlite3_finalize(stmt);
        throw;
    }
    sqlite3_finalize(stmt);
    m_rows = 0;
}

void BulkInsert::send(sqlite3_stmt* stmt, int rows)
{
    const int count = rows * m_columns;
    for (int k = 0; k < count; ++k) {
        Value& x = m_values[static_cast<std::size_t>(k)];
        switch (x.type) {
        case Value::Type::Null:
            sqlite3_bind_null(stmt, k + 1);
            break;
        case Value::Type::Int:
            sqlite3_bind_int64(stmt, k + 1, x.i);
            break;
        case Value::Type::Real:
            sqlite3_bind_double(stmt, k + 1, x.d);
            break;
        case Value::Type::Text:
            sqlite3_bind_text(stmt, k + 1, x.s.data(), static_cast<int>(x.s.size()), SQLITE_STATIC);
            break;
        }
        x.type = Value::Type::Null; // a column left unset in a later row is NULL, as with a fresh statement
    }
    if (sqlite3_step(stmt) != SQLITE_DONE) {
        const std::string message = sqlite3_errmsg(m_db);
        sqlite3_reset(stmt);
        throw SqliteError("insert failed: " + message);
    }
    sqlite3_reset(stmt);
}

} // namespace slatewise::core
