#!/usr/bin/env bash
# Query results from a real PostgreSQL 15 server (Debian's postgresql package) through libpq and
# through ODBC (odbc-postgresql), and from SQLite directly and through ODBC (libsqliteodbc).
#   database_sources_test.sh DATABASE_SERVER_TESTS PLUMBLINE_CLI SAMPLE_DATA
# Starts a server in a temporary folder on a free port (a unix socket in that folder and
# 127.0.0.1), with scram-sha-256 password authentication for the role the tests read as,
# loads a small invented cohort into it and into an SQLite file, and runs the [postgres] cases
# (tests/core/intake/query_table_server_tests.cpp). The server is stopped and the folder removed
# however the script ends. Then the sample cohort, loaded into the server with SQL types, is
# validated by plumbline-cli through libpq, through ODBC and from the CSV itself: the three
# results must be the same apart from where the rows came from.
set -euo pipefail
server_tests=$(readlink -f "$1")
cli=$(readlink -f "$2")
samples=$(readlink -f "$3")
here=$(dirname "$(readlink -f "$0")")
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

# The sample cohort as a warehouse would hold it: scores as double precision, the outcome and
# groups as text, the discharge date as date, an empty entry as NULL, and the CSV's line number
# as the load's row key. An entry that is not a number cannot be a double: its score is NULL and
# the entry itself is kept, verbatim, in <score>_entered (a load keeps what it could not type
# rather than losing it) — 'NA' is the source's missing marker and needs no keeping.
# The query gives that entry back as the score's text, so the cohort is the CSV's exactly: the
# four '#VALUE!' rows stay "score is not a number" rather than becoming missing scores.
/usr/bin/python3 - "$samples/readmissions.csv" "$work/cohort-load.csv" <<'PY'
import csv, sys
def number(entry):
    try:
        float(entry)
        return True
    except ValueError:
        return False
with open(sys.argv[1], newline="") as source, open(sys.argv[2], "w", newline="") as load:
    rows = csv.reader(source)
    header = next(rows)
    out = csv.writer(load)
    # Every record of the sample is one line (no quoted line breaks), so line = record + 1.
    for line, row in enumerate(rows, start=2):
        r = dict(zip(header, row))
        cells = [line, r["encounter_id"]]
        for score in ("supplier_score", "local_score"):
            entry = r[score]
            kept = entry if entry and not number(entry) and entry != "NA" else ""
            cells += [entry if number(entry) else "", kept]
        cells += [r[k] for k in ("readmitted_30d", "hospital", "age_band", "sex", "payer", "discharge_date")]
        out.writerow(cells)
PY
"${psql[@]}" -d cohort <<SQL
CREATE TABLE readmissions (line integer PRIMARY KEY, encounter_id text NOT NULL,
  supplier_score double precision, supplier_score_entered text,
  local_score double precision, local_score_entered text,
  readmitted_30d text, hospital text, age_band text, sex text, payer text, discharge_date date);
\copy readmissions FROM '$work/cohort-load.csv' WITH (FORMAT csv)
GRANT SELECT ON readmissions TO reader;
SQL
cohort_query="SELECT encounter_id, COALESCE(supplier_score::text, supplier_score_entered) AS supplier_score,
  COALESCE(local_score::text, local_score_entered) AS local_score, readmitted_30d, hospital, age_band, sex, payer,
  discharge_date FROM readmissions ORDER BY line"
typed_query="SELECT encounter_id, supplier_score, local_score, readmitted_30d, hospital, age_band, sex, payer,
  discharge_date FROM readmissions ORDER BY line"
odbc_address="odbc:Driver=/usr/lib/x86_64-linux-gnu/odbc/psqlodbcw.so;Server=127.0.0.1;Port=$port;Database=cohort;UID=reader"
analysis=(--outcome readmitted_30d --score supplier_score --score local_score --group hospital --group payer
          --period discharge_date --id encounter_id --bootstrap 200 --seed 7 --threads 2)
mkdir "$work/results"
timeout 60 "$cli" validate "$samples/readmissions.csv" "${analysis[@]}" --json "$work/results/csv.json" >/dev/null
timeout 60 "$cli" validate --database "postgresql://reader@127.0.0.1:$port/cohort" --query "$cohort_query" \
  "${analysis[@]}" --json "$work/results/libpq.json" >/dev/null
timeout 60 "$cli" validate --database "$odbc_address" --query "$cohort_query" "${analysis[@]}" \
  --json "$work/results/odbc.json" >/dev/null
# The scores as double precision columns: the same but for the four entries kept as text,
# which are then missing scores.
timeout 60 "$cli" validate --database "postgresql://reader@127.0.0.1:$port/cohort" --query "$typed_query" \
  "${analysis[@]}" --json "$work/results/typed.json" >/dev/null
/usr/bin/python3 "$here/same_result_apart_from_source.py" "$work/results"

# A connection ended mid-result: the server pauses in the middle of the rows (pg_sleep at row
# 5000), a second session ends it, and the CLI says so and writes no result.
stall_query="SELECT g % 2 AS readmitted_30d, (g % 100) / 100.0 AS supplier_score,
  CASE WHEN g = 5000 THEN pg_sleep(30)::text END AS pause FROM generate_series(1, 10000) AS g"
timeout 60 "$cli" validate --database "postgresql://reader@127.0.0.1:$port/cohort?application_name=plumbline_cli_dropped" \
  --query "$stall_query" --outcome readmitted_30d --score supplier_score --bootstrap 0 \
  --json "$work/results/dropped.json" >/dev/null 2>"$work/dropped.err" &
validating=$!
for _ in $(seq 300); do # until the server is inside the pause, at most 30 s
  paused=$("${psql[@]}" -d postgres -tAc "SELECT count(*) FROM pg_stat_activity
    WHERE application_name = 'plumbline_cli_dropped' AND wait_event = 'PgSleep'")
  [ "$paused" = 1 ] && break
  sleep 0.1
done
[ "$paused" = 1 ] || { echo "the query never reached its pause" >&2; exit 1; }
"${psql[@]}" -d postgres -tAc "SELECT pg_terminate_backend(pid) FROM pg_stat_activity
  WHERE application_name = 'plumbline_cli_dropped'" >/dev/null
status=0
wait "$validating" || status=$?
message=$(cat "$work/dropped.err")
echo "dropped connection: exit $status: $message"
[ "$status" = 2 ] || { echo "a dropped connection gave exit $status, not 2" >&2; exit 1; }
[[ $message == *"postgresql://reader@127.0.0.1:$port/cohort"*", row of the result "*"terminating connection due to administrator command"*"What to do:"* ]] \
  || { echo "the message does not name the database, the row and the server's reason" >&2; exit 1; }
[ "$(grep -c '' "$work/dropped.err")" = 1 ] || { echo "the message is not one line" >&2; exit 1; }
[ ! -e "$work/results/dropped.json" ] || { echo "a result was written from a dropped connection" >&2; exit 1; }
echo "database sources: a dropped connection is exit 2 with the server's reason and no result"
