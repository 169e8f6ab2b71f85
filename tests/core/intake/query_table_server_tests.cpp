// Query results from a real PostgreSQL 15 server, through libpq and through ODBC, and from
// SQLite through ODBC. Their own executable (database_server_tests): tests/cli/database_sources_test.sh
// starts the server, loads the cohort and runs these with the addresses in the environment.
#include "intake/query_table.hpp"

#include <catch2/catch.hpp>

#include <charconv>
#include <cstdlib>
#include <string>
#include <vector>

using namespace plumbline;

namespace {

std::string environment(const char* name)
{
    const char* value = std::getenv(name);
    INFO("set by tests/cli/database_sources_test.sh: " << name);
    REQUIRE(value);
    return value;
}

std::string port() { return environment("PLUMBLINE_TEST_PG_PORT"); }
std::string libpqAddress() { return "postgresql://reader@127.0.0.1:" + port() + "/cohort"; }
std::string adminAddress() { return "postgresql:host=" + environment("PLUMBLINE_TEST_PG_SOCKET_DIR") + " port=" + port() + " user=admin dbname=cohort"; }
std::string odbcPostgresAddress()
{
    return "odbc:Driver=/usr/lib/x86_64-linux-gnu/odbc/psqlodbcw.so;Server=127.0.0.1;Port=" + port()
         + ";Database=cohort;UID=reader;BoolsAsChar=0;UseDeclareFetch=1;Fetch=100";
}

struct Read {
    std::vector<std::string> columns;
    std::vector<std::vector<std::string>> rows; // "kind value" per cell
    std::string fingerprint;
};

std::string shown(const TypedCell& cell)
{
    switch (cell.kind) {
    case CellKind::Missing: return "missing";
    case CellKind::Number: {
        char digits[64];
        return "number " + std::string(digits, std::to_chars(digits, digits + sizeof digits, cell.number).ptr);
    }
    case CellKind::Text: return "text " + std::string(cell.text);
    case CellKind::Date: return "date " + std::to_string(cell.day);
    }
    return "?";
}

Read readAll(const std::string& database, const std::string& query)
{
    auto table = openQueryTable(database, query);
    INFO(database << ": " << (table ? std::string() : table.error().message()));
    REQUIRE(table);
    Read read;
    for (const TypedColumn& column : (*table)->columns())
        read.columns.push_back(column.name);
    auto done = (*table)->forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        CHECK(position == read.rows.size() + 1);
        read.rows.emplace_back();
        for (const TypedCell& cell : cells)
            read.rows.back().push_back(shown(cell));
        return true;
    });
    INFO((done ? std::string() : done.error().message()));
    REQUIRE(done);
    read.fingerprint = (*table)->fingerprint().value();
    return read;
}

const char* const cohortQuery = "SELECT id, risk, score, died, site, admitted, seen, stay FROM cohort ORDER BY id";

} // namespace

TEST_CASE("One cohort through libpq, ODBC to PostgreSQL, SQLite and ODBC to SQLite gives the same cells and fingerprint", "[postgres]")
{
    const Read libpq = readAll(libpqAddress(), cohortQuery);
    // The values loaded by database_sources_test.sh, stated here; day numbers from Python 3.11's
    // datetime.date differences to 1970-01-01.
    REQUIRE(libpq.rows.size() == 4);
    CHECK(libpq.rows[0] == std::vector<std::string>{"number 1", "number 0.125", "number 0.25", "number 0", "text North",
                                                    "date 18690", "date 18690", "number 3"});
    CHECK(libpq.rows[1] == std::vector<std::string>{"number 2", "number 0.731", "number 12.5", "number 1", "text Zürich",
                                                    "date 18321", "date 18321", "number 9007199254740992"});
    CHECK(libpq.rows[2] == std::vector<std::string>{"number 3", "missing", "missing", "missing", "missing", "missing",
                                                    "missing", "missing"});
    CHECK(libpq.rows[3][1] == "number -2.5");
    CHECK(libpq.rows[3][4] == "text a'b");
    CHECK(libpq.rows[3][5] == "date -1");
    CHECK(libpq.rows[3][6] == "date -1");

    const Read odbcPostgres = readAll(odbcPostgresAddress(), cohortQuery);
    const std::string sqlite = "sqlite:" + environment("PLUMBLINE_TEST_SQLITE_DB");
    const Read sqliteDirect = readAll(sqlite, cohortQuery);
    const Read odbcSqlite = readAll("odbc:Driver=/usr/lib/x86_64-linux-gnu/odbc/libsqlite3odbc.so;Database="
                                        + environment("PLUMBLINE_TEST_SQLITE_DB"), cohortQuery);
    for (const Read* other : {&odbcPostgres, &sqliteDirect, &odbcSqlite}) {
        CHECK(other->columns == libpq.columns);
        CHECK(other->rows == libpq.rows);
        CHECK(other->fingerprint == libpq.fingerprint);
    }
}

TEST_CASE("A wrong password is an InputError with the server's message, through libpq and ODBC", "[postgres]")
{
    const std::string right = environment("PGPASSWORD");
    setenv("PGPASSWORD", "not-the-password", 1);
    setenv("PLUMBLINE_ODBC_PASSWORD", "not-the-password", 1);
    auto libpq = openQueryTable(libpqAddress(), cohortQuery);
    auto odbc = openQueryTable(odbcPostgresAddress(), cohortQuery);
    setenv("PGPASSWORD", right.c_str(), 1);
    setenv("PLUMBLINE_ODBC_PASSWORD", right.c_str(), 1);
    REQUIRE_FALSE(libpq);
    CHECK(libpq.error().message().find("password authentication failed for user \"reader\"") != std::string::npos);
    CHECK(libpq.error().remedy.find("PGPASSWORD") != std::string::npos);
    REQUIRE_FALSE(odbc);
    CHECK(odbc.error().message().find("password authentication failed") != std::string::npos);
    CHECK(odbc.error().message().find("not-the-password") == std::string::npos);
}

TEST_CASE("A query error is an InputError with the server's message, through libpq and ODBC", "[postgres]")
{
    auto libpq = openQueryTable(libpqAddress(), "SELECT id FROM admissions");
    REQUIRE_FALSE(libpq);
    CHECK(libpq.error().message().find("relation \"admissions\" does not exist") != std::string::npos);
    CHECK(libpq.error().message().find("at character 16") != std::string::npos);
    auto syntax = openQueryTable(libpqAddress(), "SELECT id FROM cohort; DELETE FROM cohort");
    REQUIRE_FALSE(syntax);
    CHECK(syntax.error().message().find("cannot insert multiple commands into a prepared statement") != std::string::npos);
    // Even the owner's session is read-only: the write prepares but is refused when it runs.
    const Read before = readAll(adminAddress(), "SELECT count(*) AS n FROM cohort");
    auto refused = openQueryTable(adminAddress(), "DELETE FROM cohort RETURNING id");
    REQUIRE(refused);
    auto ran = (*refused)->forEachRecord([](std::span<const TypedCell>, std::size_t) { return true; });
    REQUIRE_FALSE(ran);
    CHECK(ran.error().message().find("cannot execute DELETE in a read-only transaction") != std::string::npos);
    CHECK(readAll(adminAddress(), "SELECT count(*) AS n FROM cohort").rows == before.rows);
    auto odbc = openQueryTable(odbcPostgresAddress(), "SELECT id FROM admissions");
    bool failed = !odbc;
    std::string message = odbc ? std::string() : odbc.error().message();
    if (odbc) { // a driver may send the query only when it runs
        auto done = (*odbc)->forEachRecord([](std::span<const TypedCell>, std::size_t) { return true; });
        failed = !done;
        message = done ? std::string() : done.error().message();
    }
    CHECK(failed);
    CHECK(message.find("relation \"admissions\" does not exist") != std::string::npos);
}

TEST_CASE("A connection ended by the server mid-result is an InputError naming the row reached", "[postgres]")
{
    auto table = openQueryTable(libpqAddress() + "?application_name=plumbline_dropped",
                                "SELECT g AS n FROM generate_series(1, 3000000) AS g");
    REQUIRE(table);
    std::size_t seen = 0;
    auto done = (*table)->forEachRecord([&](std::span<const TypedCell>, std::size_t position) {
        seen = position;
        if (position == 1000)
            readAll(adminAddress(), "SELECT pg_terminate_backend(pid) AS ended FROM pg_stat_activity "
                                    "WHERE application_name = 'plumbline_dropped'");
        return true;
    });
    REQUIRE_FALSE(done);
    CHECK(seen >= 1000);
    CHECK(seen < 3000000);
    CHECK(done.error().line == seen + 1);
    // The server sends its reason only when it is not blocked writing rows to us: a backend
    // that gets pg_terminate_backend's signal while its send buffer is full (we were busy in
    // the admin query, or the machine is loaded) stops sending and just closes the connection
    // (PostgreSQL 15 postgres.c, ProcessClientWriteInterrupt), and libpq then reports the
    // closed connection. Which of the two happens is timing, so either is right; both must say
    // the row reached and what to do.
    const std::string message = done.error().message();
    INFO(message);
    CHECK((message.find("terminating connection due to administrator command") != std::string::npos
           || message.find("server closed the connection unexpectedly") != std::string::npos));
    CHECK(message.find("run again once the server is reachable") != std::string::npos);
    CHECK_FALSE((*table)->fingerprint());
    // Another visit on the dead connection is an error too, not a crash.
    CHECK_FALSE((*table)->forEachRecord([](std::span<const TypedCell>, std::size_t) { return true; }));
}

TEST_CASE("A visit stopped early cancels the rest; the next visit reads everything", "[postgres]")
{
    auto table = openQueryTable(libpqAddress(), "SELECT g AS n FROM generate_series(1, 200000) AS g");
    REQUIRE(table);
    std::size_t seen = 0;
    REQUIRE((*table)->forEachRecord([&](std::span<const TypedCell>, std::size_t position) {
        seen = position;
        return position < 10;
    }));
    CHECK(seen == 10);
    CHECK_FALSE((*table)->fingerprint());
    double sum = 0;
    REQUIRE((*table)->forEachRecord([&](std::span<const TypedCell> cells, std::size_t) {
        sum += cells[0].number;
        return true;
    }));
    CHECK(sum == 200000.0 * 200001.0 / 2); // 1 + ... + n = n(n+1)/2
    CHECK((*table)->fingerprint());
}
