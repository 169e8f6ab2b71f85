#pragma once

#include "intake/query_result_table.hpp"

#include <expected>
#include <memory>
#include <string>
#include <vector>

namespace plumbline {

// One query's result through an ODBC driver (unixODBC's driver manager). Opening connects with
// the connection string (PWD taken from the environment variable PLUMBLINE_ODBC_PASSWORD when
// set, never from the string), asks for a read-only connection (SQL_MODE_READ_ONLY: a hint the
// driver may ignore, so give a read-only account), prepares the query and describes its
// columns. Each visit executes it and fetches row by row with SQLFetch and SQLGetData; whether
// the driver itself holds the whole result is its own setting (psqlodbc: UseDeclareFetch=1).
// Cells by the column's SQL type: integer, bit, float, real, double, decimal and numeric are
// Numbers (decimal text read with std::from_chars), date and timestamp Dates, NULL Missing,
// anything else the driver's text (fetched as UTF-16 and kept as UTF-8).
class OdbcQueryTable final : public QueryResultTable {
public:
    static std::expected<std::unique_ptr<OdbcQueryTable>, InputError>
    open(const std::string& connectionString, const std::string& displayName, const std::string& query);
    ~OdbcQueryTable() override;

private:
    OdbcQueryTable(std::string displayName, std::vector<TypedColumn> columns, void* environment, void* connection,
                   void* statement, std::vector<short> types);
    std::expected<StreamEnd, InputError> streamRows(const Visit& visit) override;
    std::expected<TypedCell, InputError> cellOf(std::size_t column, std::size_t row);
    std::expected<bool, InputError> fetchText(std::size_t column, std::size_t row); // false: NULL

    void* m_environment;
    void* m_connection;
    void* m_statement;
    std::vector<short> m_types;      // the columns' SQL data types
    std::vector<std::string> m_text; // per column, the text a cell shows during the visit
};

} // namespace plumbline
