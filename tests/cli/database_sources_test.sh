#!/usr/bin/env bash
# Query results from a real PostgreSQL 15 server (Debian's postgresql package) through libpq and
# through ODBC (odbc-postgresql), and from SQLite directly and through ODBC (libsqliteodbc).
#   database_sources_test.sh DATABASE_SERVER_TESTS
# Starts a server in a temporary folder on a free port (a unix socket in that folder and
# 127.0.0.1), with scram-sha-256 password authentication for the role the tests read as,
# loads a small invented cohort into it and into an SQLite file, and runs the [postgres] cases
# (tests/core/intake/query_table_server_tests.cpp). The server is stopped and the folder removed
# however the script ends.
set -euo pipefail
server_tests=$(readlink -f "$1")
bin=/usr/lib/postgresql/15/bin
work=$(mktemp -d /tmp/plumbline-databases-XXXXXX)
# PostgreSQL refuses to run as root: the server runs as nobody, owner of the folder.
as_server=()
if [ "$(id -u)" = 0 ]; then
    as_server=(runuser -u nobody --)
    chown nobody "$work"
fi
stop() {
    "${as_server[@]}" "$bin/pg_ctl" -D "$work/data" -m immediate stop >/dev/null 2>&1 || true
    rm -rf "$work"
}
trap stop EXIT
cd "$work"

port=$(python3 -c 'import socket; s = socket.socket(); s.bind(("127.0.0.1", 0)); print(s.getsockname()[1])')
"${as_server[@]}" "$bin/initdb" -D "$work/data" -U admin -E UTF8 --locale=C \
    --auth-local=trust --auth-host=scram-sha-256 >"$work/initdb.log" 2>&1 || { cat "$work/initdb.log"; exit 1; }
"${as_server[@]}" "$bin/pg_ctl" -D "$work/data" -l "$work/server.log" -w -t 30 \
    -o "-p $port -k $work -c listen_addresses=127.0.0.1 -c fsync=off" start >/dev/null || { cat "$work/server.log"; exit 1; }

psql=("$bin/psql" -X -q -v ON_ERROR_STOP=1 -h "$work" -p "$port" -U admin)
"${psql[@]}" -d postgres -c "CREATE ROLE reader LOGIN PASSWORD 'reader-pass-7'" -c "CREATE DATABASE cohort"
# Invented demo rows; every value exact in 15 significant digits (SQLite's ODBC driver reads
# REAL through text of that many digits).
"${psql[@]}" -d cohort <<'SQL'
CREATE TABLE cohort (id integer, risk double precision, score numeric(6,3), died boolean, site text,
                     admitted date, seen timestamp, stay bigint);
INSERT INTO cohort VALUES
  (1, 0.125, 0.25, false, 'North', '2021-03-04', '2021-03-04 10:30:00', 3),
  (2, 0.731, 12.5, true, 'Zürich', '2020-02-29', '2020-02-29 23:59:59', 9007199254740993),
  (3, NULL, NULL, NULL, NULL, NULL, NULL, NULL),
  (4, -2.5, 0, false, 'a''b', '1969-12-31', '1969-12-31 00:00:01', 0);
GRANT SELECT ON cohort TO reader;
SQL
sqlite3 "$work/cohort.db" <<'SQL'
CREATE TABLE cohort (id INTEGER, risk REAL, score REAL, died INTEGER, site TEXT,
                     admitted DATE, seen TIMESTAMP, stay INTEGER);
INSERT INTO cohort VALUES
  (1, 0.125, 0.25, 0, 'North', '2021-03-04', '2021-03-04 10:30:00', 3),
  (2, 0.731, 12.5, 1, 'Zürich', '2020-02-29', '2020-02-29 23:59:59', 9007199254740993),
  (3, NULL, NULL, NULL, NULL, NULL, NULL, NULL),
  (4, -2.5, 0, 0, 'a''b', '1969-12-31', '1969-12-31 00:00:01', 0);
SQL
sqlite_sum=$(sha256sum "$work/cohort.db")

# The driver manager reads no system or user configuration: drivers are named by path.
mkdir "$work/odbc"
: >"$work/odbc/odbcinst.ini"
: >"$work/odbc/odbc.ini"
export ODBCSYSINI="$work/odbc" ODBCINI="$work/odbc/odbc.ini"
export PLUMBLINE_TEST_PG_PORT="$port" PLUMBLINE_TEST_PG_SOCKET_DIR="$work" PLUMBLINE_TEST_SQLITE_DB="$work/cohort.db"
export PGPASSWORD='reader-pass-7' PLUMBLINE_ODBC_PASSWORD='reader-pass-7'
unset PGSERVICE PGSERVICEFILE PGHOST PGPORT PGUSER PGDATABASE PGCONNECT_TIMEOUT || true
timeout 120 "$server_tests" -w NoAssertions

# Reading never changes the SQLite file.
[ "$(sha256sum "$work/cohort.db")" = "$sqlite_sum" ] || { echo "the SQLite file changed" >&2; exit 1; }
echo "database sources: all paths agree"
