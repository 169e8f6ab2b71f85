#include "intake/query_table.hpp"

#include "intake/database_address.hpp"
#include "intake/odbc_query_table.hpp"
#include "intake/postgres_query_table.hpp"
#include "intake/sqlite_query_table.hpp"

namespace plumbline {

namespace {

template <typename Table>
std::expected<std::unique_ptr<TypedTable>, InputError> asTypedTable(std::expected<std::unique_ptr<Table>, InputError> table)
{
    if (!table)
        return std::unexpected(std::move(table.error()));
    return std::unique_ptr<TypedTable>(std::move(*table));
}

} // namespace

std::expected<std::unique_ptr<TypedTable>, InputError> openQueryTable(const std::string& database,
                                                                    const std::string& query)
{
    auto address = readDatabaseAddress(database);
    if (!address)
        return std::unexpected(std::move(address.error()));
    if (query.find_first_not_of(" \t\r\n") == std::string::npos) {
        InputError empty;
        empty.file = address->displayName;
        empty.problem = "no query was given.";
        empty.remedy = "give the query that returns the cohort's rows, e.g. SELECT * FROM cohort.";
        return std::unexpected(empty);
    }
    switch (address->kind) {
    case DatabaseKind::Postgres:
        return asTypedTable(PostgresQueryTable::open(address->target, address->displayName, query));
    case DatabaseKind::Sqlite:
        return asTypedTable(SqliteQueryTable::open(address->target, address->displayName, query));
    case DatabaseKind::Odbc:
        return asTypedTable(OdbcQueryTable::open(address->target, address->displayName, query));
    }
    return std::unexpected(InputError{});
}

std::string databaseDisplayName(const std::string& database) { return secretFreeAddress(database); }

} // namespace plumbline
