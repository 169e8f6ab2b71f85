"""Compares the validation results of the sample cohort's three formats, and the shipped
workbook and Stata file with the CSV cell for cell (run by sample_formats_agree_test.sh)."""
import copy
import csv
import datetime
import json
import math
import sys

samples, work = sys.argv[1], sys.argv[2]
results = {kind: json.load(open(f"{work}/{kind}.json")) for kind in ("csv", "xlsx", "dta")}

# --- 1. the results agree apart from where the rows came from ---------------------------------
SOURCE_NAMES = ("readmissions.csv", "readmissions.xlsx", "readmissions.dta")


def without_provenance(result):
    """The result with every key that names or describes the source removed."""
    r = copy.deepcopy(result)
    r.pop("plumbline", None)
    r.pop("inputs", None)
    for key in ("cohort_file", "sheet", "database", "query", "delimiter"):
        r.get("settings", {}).pop(key, None)
    cohort = r.get("cohort", {})
    for key in ("delimiter", "delimiter_sniffed", "first_lines_count"):
        cohort.pop(key, None)
    for exclusion in cohort.get("exclusions", []):
        exclusion.pop("file", None)
        exclusion.pop("first_lines", None)
    r["warnings"] = [w for w in r.get("warnings", []) if not any(name in w for name in SOURCE_NAMES)]
    return r


def first_differences(a, b, path="", found=None):
    found = [] if found is None else found
    if len(found) >= 5:
        return found
    if isinstance(a, dict) and isinstance(b, dict):
        for key in sorted(set(a) | set(b)):
            if key not in a or key not in b:
                found.append(f"{path}.{key}: only in one result")
            else:
                first_differences(a[key], b[key], f"{path}.{key}", found)
    elif isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
        for i, (x, y) in enumerate(zip(a, b)):
            first_differences(x, y, f"{path}[{i}]", found)
    elif a != b:
        found.append(f"{path}: {str(a)[:80]} != {str(b)[:80]}")
    return found


reference = without_provenance(results["csv"])
for kind in ("xlsx", "dta"):
    differences = first_differences(reference, without_provenance(results[kind]))
    assert not differences, f"the {kind} result differs from the CSV's: " + "; ".join(differences)
    print(f"ok: the {kind} result equals the CSV's apart from the source")

# The exclusions name the same records: a sheet's row number is the CSV's line number (both
# count the header as 1); a Stata observation number is the CSV's line number minus 1.
csv_exclusions = results["csv"]["cohort"]["exclusions"]
assert csv_exclusions and any(e.get("first_lines") for e in csv_exclusions), "the sample cohort should have exclusions"
for kind, shift in (("xlsx", 0), ("dta", -1)):
    other = results[kind]["cohort"]["exclusions"]
    assert len(other) == len(csv_exclusions)
    for a, b in zip(csv_exclusions, other):
        assert [line + shift for line in a["first_lines"]] == b["first_lines"], (kind, a, b)
        assert b["file"].endswith(f"readmissions.{kind}") or f"readmissions.{kind}" in b["file"], (kind, b["file"])
    print(f"ok: the {kind} exclusions name the CSV's records (position = line {shift:+d})")

# --- 2. the shipped files hold the CSV's cells, as outside readers see them ---------------------
with open(f"{samples}/readmissions.csv", newline="") as f:
    rows = list(csv.reader(f))
header, records = rows[0], rows[1:]
MISSING = ("", "NA")


def same_cell(csv_text, value, column):
    """Whether an outside reader's value is the CSV field: numbers by value, a missing field
    (empty or NA) as an empty cell or missing number, dates as the same day, text as text."""
    if csv_text in MISSING:
        return value is None or value == "" or (isinstance(value, float) and math.isnan(value))
    if column == "discharge_date":
        if isinstance(value, datetime.datetime):
            value = value.date()
        return value == datetime.date.fromisoformat(csv_text)
    try:
        number = float(csv_text)
    except ValueError:
        return value == csv_text
    if isinstance(value, str):  # a number in a text column (the Stata score column with '#VALUE!')
        return float(value) == number
    return isinstance(value, (int, float)) and float(value) == number


def compare(kind, table_header, table_rows):
    assert table_header == header, f"{kind}: header {table_header} != {header}"
    assert len(table_rows) == len(records), f"{kind}: {len(table_rows)} rows, CSV {len(records)}"
    for r, (fields, values) in enumerate(zip(records, table_rows)):
        for column, text, value in zip(header, fields, values):
            assert same_cell(text, value, column), f"{kind}: record {r + 1}, {column}: CSV '{text}', read {value!r}"
    print(f"ok: every cell of readmissions.{kind} equals the CSV's ({len(records)} records)")


# openpyxl 3.0.9 load_workbook: the sheet "Cohort", numbers as float, date cells as datetime.
import openpyxl

workbook = openpyxl.load_workbook(f"{samples}/readmissions.xlsx", read_only=True)
assert workbook.sheetnames == ["Cohort"], workbook.sheetnames
sheet_rows = [list(row) for row in workbook["Cohort"].iter_rows(values_only=True)]
sheet_rows = [row + [None] * (len(header) - len(row)) for row in sheet_rows]
date_cells = [row[header.index("discharge_date")] for row in sheet_rows[1:]]
assert all(isinstance(d, datetime.datetime) for d in date_cells), "the discharge dates should be date cells"
score_kinds = {type(row[header.index("local_score")]) for row in sheet_rows[1:]}
assert score_kinds == {float, type(None)}, f"local_score cells should be numbers or empty: {score_kinds}"
compare("xlsx", sheet_rows[0], sheet_rows[1:])

# pandas 1.5.3 read_stata: %td columns as datetime64, `.` as NaN, str columns as text.
import pandas

frame = pandas.read_stata(f"{samples}/readmissions.dta", convert_missing=False)
assert str(frame["discharge_date"].dtype).startswith("datetime64"), frame.dtypes
assert str(frame["local_score"].dtype) == "float64", frame.dtypes
assert frame["readmitted_30d"].dtype == object and frame["supplier_score"].dtype == object, frame.dtypes
stata_rows = [[None if (isinstance(v, float) and math.isnan(v)) else (v.to_pydatetime() if isinstance(v, pandas.Timestamp) else v)
               for v in record] for record in frame.itertuples(index=False)]
compare("dta", list(frame.columns), stata_rows)
