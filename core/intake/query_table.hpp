#pragma once

#include "intake/input_error.hpp"
#include "intake/typed_table.hpp"

#include <expected>
#include <memory>
#include <string>

namespace plumbline {

// The result of one query as a TypedTable. The database is named by an address:
//   postgresql://[user@]host[:port]/db[?params]  or  postgres://…  or  postgresql:service=NAME
//   sqlite:PATH  (a file; opened read-only, never created)
//   odbc:CONNECTION-STRING  e.g. odbc:DSN=Warehouse;UID=analyst
// A password in the address is refused (an InputError naming where to put it: PGPASSWORD,
// ~/.pgpass or a pg_service.conf service for PostgreSQL; the DSN's own configuration or the
// PLUMBLINE_ODBC_PASSWORD environment variable, appended as PWD by the program, for ODBC).
// Opening connects and prepares the query, so the columns are known and a query error shows
// before any row is read; the query runs when forEachRecord is called, once per call.
// sourceName() is "query result (DISPLAY)" with DISPLAY = databaseDisplayName(database);
// positionNoun() is "row of the result".
std::expected<std::unique_ptr<TypedTable>, InputError> openQueryTable(const std::string& database,
                                                                    const std::string& query);

// The address with nothing secret in it, for the audit and the analysis file.
std::string databaseDisplayName(const std::string& database);

} // namespace plumbline
