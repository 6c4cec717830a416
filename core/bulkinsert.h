// SPDX-License-Identifier: MIT
#pragma once

#include "core/sqlitedb.h"

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

/// Inserts many rows into one table through a raw prepared statement that carries
/// `rowsPerStatement` rows at a time (INSERT … VALUES (…),(…),…). SQLite spends most of a
/// one-row insert on running the statement rather than on the B-tree, so 64 rows a
/// statement more than doubles bulk throughput. Values are buffered per row; finish() sends
/// the last partial statement and must be called (the destructor discards what is left,
/// as a rolled-back transaction would). Throws SqliteError.
class BulkInsert {
public:
    /// `verb` is "INSERT" or e.g. "INSERT OR REPLACE".
    BulkInsert(const SqliteDb& db, std::string_view table, std::vector<std::string_view> columns,
        int rowsPerStatement = 64, std::string_view verb = "INSERT");
    ~BulkInsert();
    BulkInsert(const BulkInsert&) = delete;
    BulkInsert& operator=(const BulkInsert&) = delete;

    /// Column values of the current row, 1-based as in SQLite.
    BulkInsert& i64(int column, std::int64_t v);
    BulkInsert& real(int column, double v);
    BulkInsert& null(int column);
    BulkInsert& text(int column, std::string_view v);
    /// Ends the current row; sends a full statement's worth.
    void run();
    /// Sends the rows not sent yet.
    void finish();

private:
    struct Value {
        enum class Type : std::uint8_t { Null, Int, Real, Text } type = Type::Null;
        std::int64_t i = 0;
        double d = 0.0;
        std::string s;
    };
    sqlite3_stmt* prepare(int rows) const;
    void send(sqlite3_stmt* stmt, int rows);

    sqlite3* m_db;
    std::string m_head; ///< "INSERT INTO t(a,b) VALUES"
    std::string m_tuple; ///< "(?,?)"
    int m_columns;
    int m_perStatement;
    sqlite3_stmt* m_full = nullptr;
    std::vector<Value> m_values; ///< m_perStatement rows × m_columns
    int m_rows = 0; ///< complete rows buffered
};

} // namespace slatewise::core
