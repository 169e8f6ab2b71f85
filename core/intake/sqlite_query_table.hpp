#pragma once

#include "intake/query_result_table.hpp"

#include <expected>
#include <memory>
#include <string>
#include <vector>

struct sqlite3;
struct sqlite3_stmt;

namespace plumbline {

// One query's result from an SQLite database file. The file is opened read-only and never
// created (SQLITE_OPEN_READONLY without SQLITE_OPEN_CREATE); ATTACH is refused, so the query
// cannot open or create another file either. Opening prepares the query (exactly one
// statement), which gives the columns; each visit steps through the rows one at a time.
// Cells follow each value's storage class: INTEGER and REAL are Numbers (a REAL that is not
// finite stays Text, "Inf"), TEXT is Text, except that in a column declared DATE, DATETIME or
// TIMESTAMP a text "YYYY-MM-DD" (a time may follow) is a Date; NULL is Missing. A BLOB is an
// InputError: it is not a value a cohort holds.
class SqliteQueryTable final : public QueryResultTable {
public:
    static std::expected<std::unique_ptr<SqliteQueryTable>, InputError>
    open(const std::string& path, const std::string& displayName, const std::string& query);
    ~SqliteQueryTable() override;

private:
    SqliteQueryTable(std::string displayName, std::vector<TypedColumn> columns, sqlite3* database,
                     sqlite3_stmt* statement, std::vector<bool> dateColumns);
    std::expected<StreamEnd, InputError> streamRows(const Visit& visit) override;
    std::expected<TypedCell, InputError> cellOf(int column, std::size_t row);

    sqlite3* m_database;
    sqlite3_stmt* m_statement;
    std::vector<bool> m_dateColumns; // declared DATE, DATETIME or TIMESTAMP
};

} // namespace plumbline
