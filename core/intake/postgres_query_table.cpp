#include "intake/postgres_query_table.hpp"

#include "intake/sql_date_text.hpp"

#include <libpq-fe.h>

#include <charconv>
#include <cmath>
#include <cstdlib>
#include <utility>

namespace plumbline {

namespace {

// Type OIDs of PostgreSQL's built-in types (src/include/catalog/pg_type.dat, PostgreSQL 15).
constexpr Oid boolOid = 16, int8Oid = 20, int2Oid = 21, int4Oid = 23, oidOid = 26, float4Oid = 700,
              float8Oid = 701, numericOid = 1700, dateOid = 1082, timestampOid = 1114, timestamptzOid = 1184;

const char* const passwordRemedy =
    "give the password through PGPASSWORD, a ~/.pgpass line or a service in pg_service.conf, never in the address.";

// libpq's messages end in a line break and may span lines; one line reads better in a message.
std::string oneLine(const char* message)
{
    std::string text = message ? message : "";
    while (!text.empty() && (text.back() == '\n' || text.back() == ' '))
        text.pop_back();
    for (char& c : text)
        if (c == '\n')
            c = ' ';
    return text;
}

// A password written into the address, found by libpq's own parser (URI or keyword/value).
std::expected<void, InputError> refusePassword(const std::string& conninfo, const std::string& displayName)
{
    char* parseError = nullptr;
    PQconninfoOption* options = PQconninfoParse(conninfo.c_str(), &parseError);
    if (!options) {
        InputError error = databaseError(displayName, "libpq cannot read the address: " + oneLine(parseError),
                                   "write postgresql://[user@]host[:port]/database or postgresql:service=NAME.");
        PQfreemem(parseError);
        return std::unexpected(error);
    }
    bool secret = false;
    for (PQconninfoOption* option = options; option->keyword; ++option)
        if (option->val && *option->val && (std::string_view(option->keyword) == "password"
                                            || std::string_view(option->keyword) == "sslpassword"))
            secret = true;
    PQconninfoFree(options);
    if (secret)
        return std::unexpected(databaseError(displayName, "the address holds a password; it would show in the process list and the shell history.",
                                       passwordRemedy));
    return {};
}

bool connectTimeoutGiven(const std::string& conninfo)
{
    return conninfo.find("connect_timeout") != std::string::npos || std::getenv("PGCONNECT_TIMEOUT");
}

std::string connectionProblem(PGconn* connection)
{
    return "cannot connect to the PostgreSQL server: " + oneLine(PQerrorMessage(connection));
}

std::string connectionRemedy(const std::string& message)
{
    if (message.find("password") != std::string::npos || message.find("authentication") != std::string::npos)
        return "check the user name and the password given through PGPASSWORD, ~/.pgpass or pg_service.conf.";
    return "check the host, port and database name, and that the server is running and accepts connections from here.";
}

// A Number from the server's text of a number; a text from_chars cannot read as a finite double
// (NaN, Infinity, a numeric beyond the double range) stays Text so the intake names it.
TypedCell numberCell(std::string_view text)
{
    double value = 0.0;
    auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (error != std::errc{} || end != text.data() + text.size() || !std::isfinite(value))
        return TypedCell::ofText(text);
    return TypedCell::ofNumber(value);
}

TypedCell cellOf(Oid type, std::string_view text)
{
    switch (type) {
    case boolOid:
        return TypedCell::ofNumber(text == "t" ? 1.0 : 0.0);
    case int8Oid: case int2Oid: case int4Oid: case oidOid: case float4Oid: case float8Oid: case numericOid:
        return numberCell(text);
    case dateOid: case timestampOid: case timestamptzOid:
        if (auto day = sqlDateDay(text))
            return TypedCell::ofDate(*day);
        return TypedCell::ofText(text); // infinity, -infinity
    default:
        return TypedCell::ofText(text);
    }
}

} // namespace

std::expected<std::unique_ptr<PostgresQueryTable>, InputError>
PostgresQueryTable::open(const std::string& conninfo, const std::string& displayName, const std::string& query)
{
    if (auto refused = refusePassword(conninfo, displayName); !refused)
        return std::unexpected(refused.error());
    // A server that never answers must not hang the program: 20 s unless the user chose.
    const bool timeout = !connectTimeoutGiven(conninfo);
    const char* keywords[] = {"dbname", "fallback_application_name", timeout ? "connect_timeout" : nullptr, nullptr};
    const char* values[] = {conninfo.c_str(), "plumbline", timeout ? "20" : nullptr, nullptr};
    PGconn* connection = PQconnectdbParams(keywords, values, 1);
    auto give_up = [&](std::string problem, std::string remedy) {
        PQfinish(connection);
        return std::unexpected(databaseError(displayName, std::move(problem), std::move(remedy)));
    };
    if (!connection || PQstatus(connection) != CONNECTION_OK) {
        const std::string message = connection ? oneLine(PQerrorMessage(connection)) : "out of memory";
        return give_up(connectionProblem(connection), connectionRemedy(message));
    }
    // Nothing the query does may write; dates and numbers come in the forms read below, and
    // floats with every digit (PostgreSQL 15 documentation, 20.11.2 extra_float_digits).
    PGresult* setup = PQexec(connection, "SET default_transaction_read_only = on; SET DateStyle = ISO; "
                                         "SET extra_float_digits = 3; SET client_encoding = 'UTF8'");
    const bool setUp = PQresultStatus(setup) == PGRES_COMMAND_OK;
    PQclear(setup);
    if (!setUp)
        return give_up("the PostgreSQL session could not be set up: " + oneLine(PQerrorMessage(connection)),
                       "check that the server is PostgreSQL 9.6 or later and reachable.");
    PGresult* prepared = PQprepare(connection, "", query.c_str(), 0, nullptr);
    if (PQresultStatus(prepared) != PGRES_COMMAND_OK) {
        std::string problem = "the server refused the query: " + oneLine(PQresultErrorMessage(prepared));
        if (const char* where = PQresultErrorField(prepared, PG_DIAG_STATEMENT_POSITION))
            problem += " (at character " + std::string(where) + " of the query)";
        PQclear(prepared);
        return give_up(problem, "correct the query; it must be one SELECT (or WITH ... SELECT) statement.");
    }
    PQclear(prepared);
    PGresult* described = PQdescribePrepared(connection, "");
    std::vector<std::string> names;
    std::vector<unsigned> types;
    for (int column = 0; column < PQnfields(described); ++column) {
        names.emplace_back(PQfname(described, column));
        types.push_back(PQftype(described, column));
    }
    const bool describedOk = PQresultStatus(described) == PGRES_COMMAND_OK;
    PQclear(described);
    if (!describedOk || names.empty())
        return give_up(describedOk ? "the query returns no columns." : connectionProblem(connection),
                       "give a query that returns the cohort's rows, e.g. SELECT * FROM cohort.");
    auto columns = namedResultColumns(names, displayName);
    if (!columns) {
        PQfinish(connection);
        return std::unexpected(columns.error());
    }
    return std::unique_ptr<PostgresQueryTable>(
        new PostgresQueryTable(displayName, std::move(*columns), connection, std::move(types)));
}

PostgresQueryTable::PostgresQueryTable(std::string displayName, std::vector<TypedColumn> columns,
                                       pg_conn* connection, std::vector<unsigned> types)
    : QueryResultTable(std::move(displayName), std::move(columns))
    , m_connection(connection)
    , m_types(std::move(types))
{
}

PostgresQueryTable::~PostgresQueryTable() { PQfinish(m_connection); }

// A visit that stops early cancels the rest on the server and reads what is already on its
// way, so the connection is ready for the next query.
void PostgresQueryTable::abandonQuery()
{
    if (PGcancel* cancel = PQgetCancel(m_connection)) {
        char ignored[256];
        PQcancel(cancel, ignored, sizeof ignored);
        PQfreeCancel(cancel);
    }
    while (PGresult* rest = PQgetResult(m_connection))
        PQclear(rest);
}

std::expected<QueryResultTable::StreamEnd, InputError> PostgresQueryTable::streamRows(const Visit& visit)
{
    const std::string lost = "the rows read so far are not used; run again once the server is reachable.";
    if (PQstatus(m_connection) != CONNECTION_OK
        || !PQsendQueryPrepared(m_connection, "", 0, nullptr, nullptr, nullptr, 0)) {
        return std::unexpected(error(0, "the query could not be sent: " + oneLine(PQerrorMessage(m_connection)), lost));
    }
    PQsetSingleRowMode(m_connection);
    std::vector<TypedCell> cells(m_types.size());
    std::size_t row = 0;
    std::optional<InputError> failed;
    while (PGresult* result = PQgetResult(m_connection)) {
        const ExecStatusType status = PQresultStatus(result);
        if (status == PGRES_SINGLE_TUPLE && !failed) {
            ++row;
            for (std::size_t column = 0; column < cells.size(); ++column) {
                const int c = static_cast<int>(column);
                cells[column] = PQgetisnull(result, 0, c)
                    ? TypedCell::missing()
                    : cellOf(m_types[column], std::string_view(PQgetvalue(result, 0, c),
                                                               static_cast<std::size_t>(PQgetlength(result, 0, c))));
            }
            const bool more = visit(cells, row);
            PQclear(result);
            if (!more) {
                abandonQuery();
                return StreamEnd::Stopped;
            }
            continue;
        }
        if (status != PGRES_TUPLES_OK && status != PGRES_SINGLE_TUPLE && !failed)
            failed = error(row + 1, "reading the query result failed: " + oneLine(PQresultErrorMessage(result)), lost);
        PQclear(result);
    }
    if (!failed && PQstatus(m_connection) != CONNECTION_OK)
        failed = error(row + 1, "the connection to the server was lost: " + oneLine(PQerrorMessage(m_connection)), lost);
    if (failed)
        return std::unexpected(*failed);
    return StreamEnd::Complete;
}

} // namespace plumbline
