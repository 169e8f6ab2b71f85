"""Writes the statistical-file fixtures of tests/data/statistical/ and, beside each, the values a
general-purpose reader finds in it (JSON), which statistical_file_table_tests compares cell by cell.

    /usr/bin/python3 tests/reference/make_statistical_fixtures.py          # write the fixtures
    /usr/bin/python3 tests/reference/make_statistical_fixtures.py --check  # re-read, compare JSON

The data are invented (a dozen demo rows). The files and their oracles:
- cohort.dta: written by pandas 1.5.3 DataFrame.to_stata (format 118; value labels through
  value_labels=, a %td and a %tc column through convert_dates), then two values of `risk` set to
  Stata's extended missing codes .a and .z by replacing their eight bytes (pandas writes only
  `.`). Oracle: pandas 1.5.3 read_stata(convert_missing=True, convert_categoricals=False) and
  StataReader.value_labels().
- cohort.sav: written by the ReadStat 1.1.8 command-line tool from a CSV and a metadata JSON
  (value labels, 9 as a user-missing code of `died`, dates as seconds since 1582-10-14), the
  date column's format then set to DATE11 in the file's bytes (the tool leaves it F8.2). pandas reads .sav only
  through pyreadstat (not in Debian 12), so the oracle is the CSV the file was made from, as
  pandas 1.5.3 read_csv parses it (dates with to_datetime).
- cohort.sas7bdat and cohort.xpt: converted by the ReadStat 1.1.8 tool from cohort.dta as
  pandas wrote it (before the .a/.z patch, which ReadStat's writers do not carry over faithfully). Their
  formats are Stata's, which SAS does not know, so the day counts stay numbers. Oracle for the
  sas7bdat: pandas 1.5.3 read_sas (values by position; pandas misreads the column names ReadStat
  writes, so names come from the .dta). pandas cannot read the SAS transport version 8 files
  ReadStat writes, so the xpt's oracle is pandas' reading of the .dta it was converted from, as stored.
--check re-reads the committed files with pandas and fails if the JSON differs (ctest runs it),
so the expected values are provably pandas'.
"""
import json
import math
import os
import struct
import subprocess
import sys
import tempfile

import pandas as pd

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "data", "statistical")
EPOCH = pd.Timestamp("1970-01-01")

# Stata's double missing codes (Stata 15 Data File Format, "Missing values"): . is 0x7fe0...,
# .a to .z follow at steps of 2**40.
STATA_DOUBLE_MISSING = {".a": 0x7FE0010000000000, ".z": 0x7FE01A0000000000}
# Values no other cell holds, replaced in the file's bytes by those codes.
SENTINELS = {0.123456789012345: ".a", 0.987654321098765: ".z"}


def source_frame():
    return pd.DataFrame({
        "id": pd.Series(range(1, 13), dtype="int32"),
        "risk": [0.05, 0.12, None, 0.123456789012345, 0.33, 0.41, 0.5, 0.987654321098765, 0.72, 0.08, 0.91, 1.0 / 3.0],
        "died": pd.Series([0, 1, 0, 0, 1, 0, 1, 1, 0, 0, 1, 0], dtype="int8"),
        "admitted": pd.to_datetime(["1959-12-31", "1960-01-01", "1970-01-01", "2021-03-04", None, "2000-02-29",
                                    "1969-12-31", "2024-12-31", "1999-01-01", "2010-06-15", "1960-01-02", "1900-03-01"]),
        "seen_at": pd.to_datetime(["2021-03-04 13:45:00", "1960-01-01 00:00:00", "1959-12-31 23:59:59", None,
                                   "2022-01-01 00:00:01", "1970-01-01 12:00:00", "2023-07-01 08:30:00",
                                   "2001-09-09 01:46:40", "1999-12-31 23:59:59", "2015-05-05 05:05:05",
                                   "1980-02-29 00:00:00", "2030-01-01 00:00:00"]),
        "ward": ["north", "süd", "", "east", "west", "north", "Øst", "east", "west", "north", "east", "west"],
    })


def write_plain_dta(path):
    source_frame().to_stata(path, write_index=False, version=118, convert_dates={"admitted": "td", "seen_at": "tc"},
                            value_labels={"died": {0: "alive", 1: "died"}})


def write_dta(path):
    write_plain_dta(path)
    with open(path, "rb") as f:
        data = f.read()
    for value, code in SENTINELS.items():
        packed = struct.pack("<d", value)
        assert data.count(packed) == 1, "sentinel must occur once"
        data = data.replace(packed, struct.pack("<Q", STATA_DOUBLE_MISSING[code]))
    with open(path, "wb") as f:
        f.write(data)


def days(timestamp):
    return int((timestamp.normalize() - EPOCH).days)


def cell(value, kind):
    """One cell as the test expects it: number, text, date (days since 1970) or missing."""
    if isinstance(value, pd.io.stata.StataMissingValue):
        return ["missing", value.string]
    if value is None or (isinstance(value, float) and math.isnan(value)) or value is pd.NaT:
        return ["missing", "."]
    if kind == "date":
        return ["date", days(value)]
    if kind == "text":
        return ["text", value] if value != "" else ["missing", ""]
    return ["number", float(value)]


def read_dta(path):
    # pandas converts dates only without convert_missing: the missing codes come from one
    # reading, the dates from another.
    frame = pd.read_stata(path, convert_missing=True, convert_categoricals=False, convert_dates=False)
    dated = pd.read_stata(path, convert_categoricals=False)
    kinds = {"admitted": "date", "seen_at": "date", "ward": "text"}
    rows = [[cell(row[c] if kinds.get(c) != "date" or isinstance(row[c], pd.io.stata.StataMissingValue)
                  else dated.loc[i, c], kinds.get(c, "number")) for c in frame.columns]
            for i, row in frame.iterrows()]
    with pd.io.stata.StataReader(path) as reader:
        labels = reader.value_labels()
    return {"source": "pandas 1.5.3 read_stata", "columns": list(frame.columns),
            "labels": {"died": sorted([float(k), v] for k, v in labels["died"].items())}, "rows": rows}


def read_dta_as_stored(path):
    """The .dta's stored numbers, dates as day and millisecond counts: what a SAS file converted
    from it holds."""
    frame = pd.read_stata(path, convert_dates=False, convert_categoricals=False)
    rows = [[cell(row[c], "text" if c == "ward" else "number") for c in frame.columns] for _, row in frame.iterrows()]
    return {"source": "pandas 1.5.3 read_stata(convert_dates=False) of the .dta it was converted from",
            "columns": list(frame.columns), "labels": {}, "rows": rows}


def read_sas7bdat(path, dta_expected):
    frame = pd.read_sas(path, format="sas7bdat", encoding="utf-8")
    rows = []
    for (_, row), dta_row in zip(frame.iterrows(), dta_expected["rows"]):
        out = []
        for i, name in enumerate(dta_expected["columns"]):
            kind = "text" if name == "ward" else "number"
            value = row.iloc[i]
            out.append(cell(value if not (kind == "text" and isinstance(value, float)) else "", kind))
        rows.append(out)
    # ReadStat writes no value labels into a sas7bdat (SAS keeps them in a catalog file).
    return {"source": "pandas 1.5.3 read_sas", "columns": dta_expected["columns"], "labels": {}, "rows": rows}


SAV_METADATA = {"type": "SPSS", "variables": [
    {"type": "NUMERIC", "name": "id", "format": "NUMBER"},
    {"type": "NUMERIC", "name": "risk", "format": "NUMBER", "decimals": 6},
    {"type": "NUMERIC", "name": "died", "format": "NUMBER", "missing": {"type": "DISCRETE", "values": [9]},
     "categories": [{"code": 0, "label": "alive"}, {"code": 1, "label": "died"}, {"code": 9, "label": "not known"}]},
    {"type": "NUMERIC", "name": "admitted", "format": "DATE"},
    {"type": "STRING", "name": "ward"}]}


def sav_source_csv(path):
    frame = source_frame()
    frame = frame.drop(columns=["seen_at"])
    frame["risk"] = frame["risk"].map(lambda v: "" if v is None or math.isnan(v) else repr(round(v, 6)))
    frame["died"] = frame["died"].astype(int)
    frame.loc[4, "died"] = 9  # the user-missing code
    frame["admitted"] = frame["admitted"].map(lambda t: "" if t is pd.NaT else t.strftime("%Y-%m-%d"))
    frame.to_csv(path, index=False)


def set_spss_date_format(path, name):
    """ReadStat's CSV path stores the dates (seconds since 1582-10-14) but leaves the column's
    format F8.2: the variable record's print and write formats (the two int32 before its
    eight-byte name; PSPP manual, "System File Format", Variable Record) are set to DATE11
    (format type 20, width 11, no decimals)."""
    with open(path, "rb") as f:
        data = bytearray(f.read())
    short = name.upper().encode().ljust(8)  # the record's short name; the long one is elsewhere
    f82 = struct.pack("<i", 5 << 16 | 8 << 8 | 2)
    at = data.find(f82 + f82 + short) + 8
    assert at > 8 and data.count(f82 + f82 + short) == 1
    data[at - 8:at] = struct.pack("<i", 20 << 16 | 11 << 8) * 2
    with open(path, "wb") as f:
        f.write(data)


def read_sav_source(csv_path):
    frame = pd.read_csv(csv_path, keep_default_na=False, dtype=str)
    rows = []
    for _, row in frame.iterrows():
        rows.append([
            ["number", float(row["id"])],
            ["number", float(row["risk"])] if row["risk"] else ["missing", "."],
            ["missing", "user"] if row["died"] == "9" else ["number", float(row["died"])],
            ["date", days(pd.to_datetime(row["admitted"]))] if row["admitted"] else ["missing", "."],
            ["text", row["ward"]] if row["ward"] else ["missing", ""],
        ])
    return {"source": "pandas 1.5.3 read_csv of the file's source", "columns": list(frame.columns),
            "labels": {"died": [[0.0, "alive"], [1.0, "died"], [9.0, "not known"]]}, "rows": rows}


def expected_values(work):
    dta = os.path.join(DATA, "cohort.dta")
    expected = {"cohort.dta": read_dta(dta)}
    expected["cohort.sas7bdat"] = read_sas7bdat(os.path.join(DATA, "cohort.sas7bdat"), expected["cohort.dta"])
    plain = os.path.join(work, "plain.dta")
    write_plain_dta(plain)
    expected["cohort.xpt"] = read_dta_as_stored(plain)
    csv = os.path.join(work, "cohort_sav_source.csv")
    sav_source_csv(csv)
    expected["cohort.sav"] = read_sav_source(csv)
    return expected


def main():
    check = "--check" in sys.argv
    with tempfile.TemporaryDirectory() as work:
        if not check:
            os.makedirs(DATA, exist_ok=True)
            write_dta(os.path.join(DATA, "cohort.dta"))
            # ReadStat's writers do not carry Stata's .a-.z over faithfully (its transport writer
            # turns .z into an infinity): the SAS files come from the .dta before the patch.
            plain = os.path.join(work, "plain.dta")
            write_plain_dta(plain)
            for target in ("cohort.sas7bdat", "cohort.xpt"):
                out = os.path.join(DATA, target)
                if os.path.exists(out):
                    os.remove(out)
                subprocess.run(["readstat", plain, out], check=True, capture_output=True)
            csv, meta = os.path.join(work, "source.csv"), os.path.join(work, "source.json")
            sav_source_csv(csv)
            with open(meta, "w") as f:
                json.dump(SAV_METADATA, f)
            out = os.path.join(DATA, "cohort.sav")
            if os.path.exists(out):
                os.remove(out)
            subprocess.run(["readstat", csv, meta, out], check=True, capture_output=True)
            set_spss_date_format(out, "admitted")
        expected = expected_values(work)
    failures = 0
    for name, values in expected.items():
        path = os.path.join(DATA, name + ".json")
        text = json.dumps(values, indent=1, ensure_ascii=False) + "\n"
        if check:
            with open(path, encoding="utf-8") as f:
                if f.read() != text:
                    print(f"{name}.json differs from what {values['source']} reads now")
                    failures += 1
        else:
            with open(path, "w", encoding="utf-8") as f:
                f.write(text)
    if check and not failures:
        print(f"{len(expected)} fixtures: the committed JSON equals pandas' reading")
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
