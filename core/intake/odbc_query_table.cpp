#include "intake/odbc_query_table.hpp"

#include "intake/sql_date_text.hpp"
#include "intake/utf16_text.hpp"

#include <sql.h>
#include <sqlext.h>

#include <charconv>
#include <cmath>
#include <cstdlib>
#include <utility>

namespace plumbline {

namespace {

bool succeeded(SQLRETURN code) { return code == SQL_SUCCESS || code == SQL_SUCCESS_WITH_INFO; }

const SQLWCHAR* wide(const std::u16string& text) { return reinterpret_cast<const SQLWCHAR*>(text.c_str()); }

// Every diagnostic record of a handle, "[SQLSTATE] message; ...": the driver's and the
// server's own words.
std::string diagnostics(SQLSMALLINT handleType, SQLHANDLE handle)
{
    std::string text;
    for (SQLSMALLINT record = 1; record <= 8; ++record) {
        SQLWCHAR state[6] = {};
        SQLWCHAR message[1024] = {};
        SQLINTEGER native = 0;
        SQLSMALLINT length = 0;
        if (!succeeded(SQLGetDiagRecW(handleType, handle, record, state, &native, message, 1024, &length)))
            break;
        const auto words = std::u16string_view(reinterpret_cast<const char16_t*>(message),
                                               static_cast<std::size_t>(std::min<SQLSMALLINT>(length, 1023)));
        text += (text.empty() ? "[" : "; [") + utf8FromUtf16(reinterpret_cast<const char16_t*>(state)) + "] "
              + utf8FromUtf16(words);
    }
    while (!text.empty() && (text.back() == '\n' || text.back() == ' '))
        text.pop_back();
    return text.empty() ? "the driver gave no message" : text;
}

// The connection string with PWD={password} from the environment, '}' doubled inside braces.
std::u16string withPassword(const std::string& connectionString)
{
    std::string full = connectionString;
    if (const char* password = std::getenv("PLUMBLINE_ODBC_PASSWORD")) {
        if (!full.empty() && full.back() != ';')
            full += ';';
        full += "PWD={";
        for (const char* c = password; *c; ++c)
            full += *c == '}' ? std::string("}}") : std::string(1, *c);
        full += '}';
    }
    std::u16string result = utf16FromUtf8(full);
    std::fill(full.begin(), full.end(), '\0'); // the password lives no longer than needed
    return result;
}

bool integerType(SQLSMALLINT type)
{
    return type == SQL_TINYINT || type == SQL_SMALLINT || type == SQL_INTEGER || type == SQL_BIGINT || type == SQL_BIT;
}

} // namespace

std::expected<std::unique_ptr<OdbcQueryTable>, InputError>
OdbcQueryTable::open(const std::string& connectionString, const std::string& displayName, const std::string& query)
{
    SQLHANDLE environment = SQL_NULL_HANDLE, connection = SQL_NULL_HANDLE, statement = SQL_NULL_HANDLE;
    auto release = [&] {
        if (statement)
            SQLFreeHandle(SQL_HANDLE_STMT, statement);
        if (connection) {
            SQLDisconnect(connection);
            SQLFreeHandle(SQL_HANDLE_DBC, connection);
        }
        if (environment)
            SQLFreeHandle(SQL_HANDLE_ENV, environment);
    };
    auto give_up = [&](std::string problem, std::string remedy) {
        release();
        return std::unexpected(databaseError(displayName, std::move(problem), std::move(remedy)));
    };
    if (!succeeded(SQLAllocHandle(SQL_HANDLE_ENV, SQL_NULL_HANDLE, &environment))
        || !succeeded(SQLSetEnvAttr(environment, SQL_ATTR_ODBC_VERSION, reinterpret_cast<SQLPOINTER>(SQL_OV_ODBC3), 0))
        || !succeeded(SQLAllocHandle(SQL_HANDLE_DBC, environment, &connection)))
        return give_up("the ODBC driver manager could not be started.", "check the unixODBC installation.");
    SQLSetConnectAttr(connection, SQL_ATTR_ACCESS_MODE, reinterpret_cast<SQLPOINTER>(SQL_MODE_READ_ONLY), 0);
    SQLSetConnectAttr(connection, SQL_ATTR_LOGIN_TIMEOUT, reinterpret_cast<SQLPOINTER>(20), 0);
    std::u16string full = withPassword(connectionString);
    const SQLRETURN connected = SQLDriverConnectW(connection, nullptr, const_cast<SQLWCHAR*>(wide(full)),
                                                  static_cast<SQLSMALLINT>(std::min<std::size_t>(full.size(), 32767)),
                                                  nullptr, 0, nullptr, SQL_DRIVER_NOPROMPT);
    std::fill(full.begin(), full.end(), u'\0');
    if (!succeeded(connected)) {
        const std::string said = diagnostics(SQL_HANDLE_DBC, connection);
        SQLFreeHandle(SQL_HANDLE_DBC, connection);
        connection = SQL_NULL_HANDLE;
        return give_up("cannot connect through ODBC: " + said,
                       "check the data source or driver, the server, the user and the password (the DSN's own "
                       "configuration or PLUMBLINE_ODBC_PASSWORD).");
    }
    const std::u16string text = utf16FromUtf8(query);
    SQLSMALLINT count = 0;
    if (!succeeded(SQLAllocHandle(SQL_HANDLE_STMT, connection, &statement))
        || !succeeded(SQLPrepareW(statement, const_cast<SQLWCHAR*>(wide(text)), static_cast<SQLINTEGER>(text.size())))
        || !succeeded(SQLNumResultCols(statement, &count)))
        return give_up("the query was refused: " + diagnostics(SQL_HANDLE_STMT, statement),
                       "correct the query; it must be one SELECT statement.");
    std::vector<std::string> names;
    std::vector<short> types;
    for (SQLUSMALLINT column = 1; column <= count; ++column) {
        SQLWCHAR name[512] = {};
        SQLSMALLINT nameLength = 0, type = 0, digits = 0, nullable = 0;
        SQLULEN size = 0;
        if (!succeeded(SQLDescribeColW(statement, column, name, 512, &nameLength, &type, &size, &digits, &nullable)))
            return give_up("the query's columns could not be described: " + diagnostics(SQL_HANDLE_STMT, statement),
                           "check the query and the driver.");
        names.push_back(utf8FromUtf16(std::u16string_view(reinterpret_cast<const char16_t*>(name),
                                                          static_cast<std::size_t>(std::min<SQLSMALLINT>(nameLength, 511)))));
        types.push_back(type);
    }
    if (names.empty())
        return give_up("the query returns no columns.", "give a query that returns the cohort's rows, e.g. SELECT * FROM cohort.");
    auto columns = namedResultColumns(names, displayName);
    if (!columns) {
        release();
        return std::unexpected(columns.error());
    }
    return std::unique_ptr<OdbcQueryTable>(
        new OdbcQueryTable(displayName, std::move(*columns), environment, connection, statement, std::move(types)));
}

OdbcQueryTable::OdbcQueryTable(std::string displayName, std::vector<TypedColumn> columns, void* environment,
                               void* connection, void* statement, std::vector<short> types)
    : QueryResultTable(std::move(displayName), std::move(columns))
    , m_environment(environment)
    , m_connection(connection)
    , m_statement(statement)
    , m_types(std::move(types))
    , m_text(m_types.size())
{
}

OdbcQueryTable::~OdbcQueryTable()
{
    SQLFreeHandle(SQL_HANDLE_STMT, m_statement);
    SQLDisconnect(m_connection);
    SQLFreeHandle(SQL_HANDLE_DBC, m_connection);
    SQLFreeHandle(SQL_HANDLE_ENV, m_environment);
}

// The cell's text in pieces: a truncated piece (01004) fills the buffer but its terminator.
std::expected<bool, InputError> OdbcQueryTable::fetchText(std::size_t column, std::size_t row)
{
    constexpr std::size_t pieceChars = 2048;
    char16_t piece[pieceChars];
    std::u16string whole;
    for (;;) {
        SQLLEN indicator = 0;
        const SQLRETURN got = SQLGetData(m_statement, static_cast<SQLUSMALLINT>(column + 1), SQL_C_WCHAR, piece,
                                         sizeof piece, &indicator);
        if (got == SQL_NO_DATA)
            break;
        if (!succeeded(got)) {
            InputError failed = error(row, "a cell could not be read: " + diagnostics(SQL_HANDLE_STMT, m_statement),
                                      "the rows read so far are not used; check the column's type or convert it in the query.");
            failed.column = columns()[column].name;
            return std::unexpected(failed);
        }
        if (indicator == SQL_NULL_DATA)
            return false;
        const bool truncated = indicator == SQL_NO_TOTAL || indicator >= static_cast<SQLLEN>(sizeof piece);
        whole.append(piece, truncated ? pieceChars - 1 : static_cast<std::size_t>(indicator) / sizeof(char16_t));
        if (got == SQL_SUCCESS)
            break;
    }
    m_text[column] = utf8FromUtf16(whole);
    return true;
}

std::expected<TypedCell, InputError> OdbcQueryTable::cellOf(std::size_t column, std::size_t row)
{
    const SQLSMALLINT type = m_types[column];
    const auto number = static_cast<SQLUSMALLINT>(column + 1);
    SQLLEN indicator = 0;
    auto fetched = [&](SQLSMALLINT target, void* value, SQLLEN size) -> std::expected<bool, InputError> {
        if (succeeded(SQLGetData(m_statement, number, target, value, size, &indicator)))
            return indicator != SQL_NULL_DATA;
        InputError failed = error(row, "a cell could not be read: " + diagnostics(SQL_HANDLE_STMT, m_statement),
                                  "the rows read so far are not used; convert the column in the query, e.g. CAST(x AS TEXT).");
        failed.column = columns()[column].name;
        return std::unexpected(failed);
    };
    if (integerType(type)) {
        SQLBIGINT value = 0;
        auto present = fetched(SQL_C_SBIGINT, &value, sizeof value);
        if (!present)
            return std::unexpected(present.error());
        return *present ? TypedCell::ofNumber(static_cast<double>(value)) : TypedCell::missing();
    }
    if (type == SQL_REAL || type == SQL_FLOAT || type == SQL_DOUBLE) {
        double value = 0.0;
        auto present = fetched(SQL_C_DOUBLE, &value, sizeof value);
        if (!present)
            return std::unexpected(present.error());
        if (!*present)
            return TypedCell::missing();
        return std::isfinite(value) ? TypedCell::ofNumber(value) : TypedCell::ofText(value > 0 ? "Inf" : value < 0 ? "-Inf" : "NaN");
    }
    if (type == SQL_TYPE_DATE || type == SQL_DATE || type == SQL_TYPE_TIMESTAMP || type == SQL_TIMESTAMP) {
        SQL_TIMESTAMP_STRUCT value{};
        auto present = fetched(SQL_C_TYPE_TIMESTAMP, &value, sizeof value);
        if (!present)
            return std::unexpected(present.error());
        return *present ? TypedCell::ofDate(civilDay(value.year, value.month, value.day)) : TypedCell::missing();
    }
    auto present = fetchText(column, row);
    if (!present)
        return std::unexpected(present.error());
    if (!*present)
        return TypedCell::missing();
    const std::string& text = m_text[column];
    if (type == SQL_NUMERIC || type == SQL_DECIMAL) {
        double value = 0.0;
        auto [end, failed] = std::from_chars(text.data(), text.data() + text.size(), value);
        if (failed == std::errc{} && end == text.data() + text.size() && std::isfinite(value))
            return TypedCell::ofNumber(value);
    }
    return TypedCell::ofText(text);
}

std::expected<QueryResultTable::StreamEnd, InputError> OdbcQueryTable::streamRows(const Visit& visit)
{
    const std::string lost = "the rows read so far are not used; check the connection and run again.";
    SQLFreeStmt(m_statement, SQL_CLOSE);
    const SQLRETURN executed = SQLExecute(m_statement);
    if (!succeeded(executed) && executed != SQL_NO_DATA)
        return std::unexpected(error(0, "the query failed: " + diagnostics(SQL_HANDLE_STMT, m_statement), lost));
    std::vector<TypedCell> cells(m_types.size());
    std::size_t row = 0;
    for (SQLRETURN fetched = executed == SQL_NO_DATA ? SQL_NO_DATA : SQLFetch(m_statement); fetched != SQL_NO_DATA;
         fetched = SQLFetch(m_statement)) {
        if (!succeeded(fetched)) {
            InputError failed = error(row + 1, "reading the query result failed: " + diagnostics(SQL_HANDLE_STMT, m_statement), lost);
            SQLFreeStmt(m_statement, SQL_CLOSE);
            return std::unexpected(failed);
        }
        ++row;
        for (std::size_t column = 0; column < cells.size(); ++column) {
            auto cell = cellOf(column, row);
            if (!cell) {
                SQLFreeStmt(m_statement, SQL_CLOSE);
                return std::unexpected(cell.error());
            }
            cells[column] = *cell;
        }
        if (!visit(cells, row)) {
            SQLFreeStmt(m_statement, SQL_CLOSE);
            return StreamEnd::Stopped;
        }
    }
    SQLFreeStmt(m_statement, SQL_CLOSE);
    return StreamEnd::Complete;
}

} // namespace plumbline
