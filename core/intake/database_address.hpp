#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>

namespace plumbline {

enum class DatabaseKind { Postgres, Sqlite, Odbc };

// A database as the user named it, split into the client library and what that library takes:
//   postgresql://… or postgres://…   a libpq connection URI (target: the URI)
//   postgresql:KEY=VALUE …           a libpq keyword/value string, e.g. postgresql:service=cohort
//   sqlite:PATH                      a database file (target: the path)
//   odbc:CONNECTION-STRING           e.g. odbc:DSN=Warehouse;UID=analyst (target: the string)
struct DatabaseAddress {
    DatabaseKind kind = DatabaseKind::Sqlite;
    std::string target;
    std::string displayName; // the address with every secret left out
};

// The address, or an InputError for a form not listed above, an empty target or, for ODBC, a
// password or SAVEFILE in the connection string (libpq's own parser checks PostgreSQL's).
std::expected<DatabaseAddress, InputError> readDatabaseAddress(const std::string& database);

// The address without passwords: a URI's user:password@ loses ":password", and password,
// sslpassword (libpq) and PWD, PASSWORD (ODBC) settings are left out. Anything else unchanged.
std::string secretFreeAddress(const std::string& database);

} // namespace plumbline
