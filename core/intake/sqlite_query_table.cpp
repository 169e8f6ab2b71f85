#include "intake/sqlite_query_table.hpp"

#include "intake/sql_date_text.hpp"

#include <sqlite3.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <utility>

namespace plumbline {

namespace {

// The query may read the one database opened read-only; attaching another could create a file.
int refuseAttach(void*, int action, const char*, const char*, const char*, const char*)
{
    return action == SQLITE_ATTACH ? SQLITE_DENY : SQLITE_OK;
}

bool declaredDate(const char* declared)
{
    if (!declared)
        return false;
    std::string type(declared);
    std::ranges::transform(type, type.begin(), [](unsigned char c) { return static_cast<char>(std::toupper(c)); });
    return type == "DATE" || type == "DATETIME" || type == "TIMESTAMP";
}

// Whether more than blanks, semicolons and comments follow the first statement.
bool anotherStatement(sqlite3* database, const char* tail)
{
    while (tail && *tail) {
        sqlite3_stmt* next = nullptr;
        const char* after = nullptr;
        const int prepared = sqlite3_prepare_v2(database, tail, -1, &next, &after);
        sqlite3_finalize(next);
        if (prepared != SQLITE_OK || next || after == tail)
            return true;
        tail = after;
    }
    return false;
}

} // namespace

std::expected<std::unique_ptr<SqliteQueryTable>, InputError>
SqliteQueryTable::open(const std::string& path, const std::string& displayName, const std::string& query)
{
    sqlite3* database = nullptr;
    // "./" keeps a path that begins "file:" a path, not an SQLite URI with its own options.
    const std::string filename = path.starts_with("file:") ? "./" + path : path;
    const int opened = sqlite3_open_v2(filename.c_str(), &database, SQLITE_OPEN_READONLY, nullptr);
    auto give_up = [&](std::string problem, std::string remedy) {
        sqlite3_close(database);
        return std::unexpected(databaseError(displayName, std::move(problem), std::move(remedy)));
    };
    if (opened != SQLITE_OK)
        return give_up("SQLite cannot open the database file: " + std::string(database ? sqlite3_errmsg(database) : "out of memory"),
                       "check the path after sqlite: and that the file exists and can be read.");
    sqlite3_busy_timeout(database, 5000);
    sqlite3_set_authorizer(database, refuseAttach, nullptr);
    sqlite3_stmt* statement = nullptr;
    const char* tail = nullptr;
    if (sqlite3_prepare_v2(database, query.c_str(), static_cast<int>(query.size()), &statement, &tail) != SQLITE_OK)
        return give_up("SQLite refused the query: " + std::string(sqlite3_errmsg(database)),
                       "correct the query; it must be one SELECT statement on this database.");
    auto give_up_prepared = [&](std::string problem, std::string remedy) {
        sqlite3_finalize(statement);
        return give_up(std::move(problem), std::move(remedy));
    };
    if (!statement || anotherStatement(database, tail))
        return give_up_prepared(statement ? "the query holds more than one statement." : "the query is empty.",
                                "give exactly one SELECT statement.");
    if (sqlite3_column_count(statement) == 0 || !sqlite3_stmt_readonly(statement))
        return give_up_prepared("the query returns no rows to read (it is not a SELECT).",
                                "give a query that returns the cohort's rows, e.g. SELECT * FROM cohort.");
    std::vector<std::string> names;
    std::vector<bool> dates;
    for (int column = 0; column < sqlite3_column_count(statement); ++column) {
        const char* name = sqlite3_column_name(statement, column);
        names.emplace_back(name ? name : "");
        dates.push_back(declaredDate(sqlite3_column_decltype(statement, column)));
    }
    auto columns = namedResultColumns(names, displayName);
    if (!columns) {
        sqlite3_finalize(statement);
        sqlite3_close(database);
        return std::unexpected(columns.error());
    }
    return std::unique_ptr<SqliteQueryTable>(
        new SqliteQueryTable(displayName, std::move(*columns), database, statement, std::move(dates)));
}

SqliteQueryTable::SqliteQueryTable(std::string displayName, std::vector<TypedColumn> columns, sqlite3* database,
                                   sqlite3_stmt* statement, std::vector<bool> dateColumns)
    : QueryResultTable(std::move(displayName), std::move(columns))
    , m_database(database)
    , m_statement(statement)
    , m_dateColumns(std::move(dateColumns))
{
}

SqliteQueryTable::~SqliteQueryTable()
{
    sqlite3_finalize(m_statement);
    sqlite3_close(m_database);
}

std::expected<TypedCell, InputError> SqliteQueryTable::cellOf(int column, std::size_t row)
{
    switch (sqlite3_column_type(m_statement, column)) {
    case SQLITE_NULL:
        return TypedCell::missing();
    case SQLITE_INTEGER:
        return TypedCell::ofNumber(static_cast<double>(sqlite3_column_int64(m_statement, column)));
    case SQLITE_FLOAT: {
        const double value = sqlite3_column_double(m_statement, column);
        if (std::isfinite(value))
            return TypedCell::ofNumber(value);
        return TypedCell::ofText(value > 0 ? "Inf" : value < 0 ? "-Inf" : "NaN");
    }
    case SQLITE_TEXT: {
        const auto* bytes = reinterpret_cast<const char*>(sqlite3_column_text(m_statement, column));
        const std::string_view text(bytes ? bytes : "", static_cast<std::size_t>(sqlite3_column_bytes(m_statement, column)));
        if (m_dateColumns[static_cast<std::size_t>(column)])
            if (auto day = sqlDateDay(text))
                return TypedCell::ofDate(*day);
        return TypedCell::ofText(text);
    }
    default: {
        InputError blob = error(row, "this cell holds a BLOB (bytes), which is no value of a cohort.",
                                "leave the column out of the query or convert it, e.g. CAST(x AS TEXT).");
        blob.column = columns()[static_cast<std::size_t>(column)].name;
        return std::unexpected(blob);
    }
    }
}

std::expected<QueryResultTable::StreamEnd, InputError> SqliteQueryTable::streamRows(const Visit& visit)
{
    sqlite3_reset(m_statement);
    std::vector<TypedCell> cells(columns().size());
    std::size_t row = 0;
    for (;;) {
        const int stepped = sqlite3_step(m_statement);
        if (stepped == SQLITE_DONE)
            break;
        if (stepped != SQLITE_ROW) {
            const std::string message = sqlite3_errmsg(m_database);
            sqlite3_reset(m_statement);
            return std::unexpected(error(row + 1, "reading the query result failed: " + message,
                                         "the rows read so far are not used; check the database file and run again."));
        }
        ++row;
        for (std::size_t column = 0; column < cells.size(); ++column) {
            auto cell = cellOf(static_cast<int>(column), row);
            if (!cell) {
                sqlite3_reset(m_statement);
                return std::unexpected(cell.error());
            }
            cells[column] = *cell;
        }
        if (!visit(cells, row)) {
            sqlite3_reset(m_statement);
            return StreamEnd::Stopped;
        }
    }
    sqlite3_reset(m_statement);
    return StreamEnd::Complete;
}

} // namespace plumbline
