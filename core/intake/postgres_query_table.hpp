#pragma once

#include "intake/query_result_table.hpp"

#include <expected>
#include <memory>
#include <string>
#include <vector>

struct pg_conn;

namespace plumbline {

// One query's result from a PostgreSQL server through libpq. Opening connects, makes the
// session read-only and prepares the query (one statement: the extended protocol refuses
// more), which gives the columns and reports a query error before any row is read. Each visit
// executes it in single-row mode, so no more than one row is held.
// Cells: bool, integer, float and numeric types are Numbers (their text read with
// std::from_chars; a non-finite value stays Text, "NaN" or "Infinity", for the intake to
// refuse), date and timestamp (with or without time zone) Dates, NULL Missing, anything else
// the server's text.
class PostgresQueryTable final : public QueryResultTable {
public:
    // `conninfo`: a libpq URI or keyword/value string; a password in it is refused.
    static std::expected<std::unique_ptr<PostgresQueryTable>, InputError>
    open(const std::string& conninfo, const std::string& displayName, const std::string& query);
    ~PostgresQueryTable() override;

private:
    PostgresQueryTable(std::string displayName, std::vector<TypedColumn> columns, pg_conn* connection,
                       std::vector<unsigned> types);
    std::expected<StreamEnd, InputError> streamRows(const Visit& visit) override;
    void abandonQuery();

    pg_conn* m_connection;
    std::vector<unsigned> m_types; // the columns' type OIDs
};

} // namespace plumbline
