#!/usr/bin/python3
"""Writes the spreadsheet fixtures of tests/data/spreadsheets/ and, beside each, a JSON of what
openpyxl reads from it (load_workbook(data_only=True): cached formula values, dates as dates).
The Catch2 tests of core/intake/xlsx_table compare the reader cell by cell with those JSONs.

  make_spreadsheet_fixtures.py WRITER            write the fixtures and their JSONs
  make_spreadsheet_fixtures.py --check WRITER    prove the committed JSONs are still openpyxl's
                                                 reading of the committed files and of freshly
                                                 written ones (ctest runs this)

WRITER is the compiled tests/reference/xlsxwriter_fixtures.cpp (libxlsxwriter 1.1.4). Every value is
invented. Run with /usr/bin/python3 (Debian's openpyxl 3.0.9)."""
import datetime
import json
import os
import subprocess
import sys
import tempfile

import openpyxl
from openpyxl.utils.datetime import CALENDAR_MAC_1904

HERE = os.path.dirname(os.path.abspath(__file__))
FIXTURES = os.path.join(HERE, "..", "data", "spreadsheets")
OPENPYXL_FILES = ["openpyxl_cohort.xlsx", "openpyxl_1904.xlsx"]
XLSXWRITER_FILES = ["xlsxwriter_inline.xlsx", "xlsxwriter_shared.xlsx"]


def write_cohort(path):
    """Inline strings (openpyxl 3.0 writes every string inline), dates in the 1900 system,
    a header on row 2, skipped rows, empty cells, booleans, an error value, a formula without a
    saved value (openpyxl stores none), a cell beyond the header, and three sheets, one named "2"."""
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Cohort"
    ws.append([])
    ws.append(["patient", "admitted", "age", "risk", "readmitted", "ward", 2024, "doubled"])
    date_style = "yyyy-mm-dd"
    rows = {
        3: ["P001", datetime.datetime(2021, 3, 14), 71, 0.083, True, "North", 1.5, "=C3*2"],
        4: ["P002", datetime.datetime(1900, 1, 15), None, 0.41, False, "South", None, None],
        7: ["P003", datetime.datetime(1900, 3, 1), 55, "#N/A", True, "East", -2, None],
        8: ["P004", None, 64, 0.2, None, "Ward \u00dcst & <West>", 0, None],
        10: ["P005", datetime.datetime(2020, 2, 29, 23, 59), 80, "#DIV/0!", False, "North", 3, None],
    }
    for r, values in rows.items():
        for c, value in enumerate(values, start=1):
            if value is None:
                continue
            cell = ws.cell(row=r, column=c, value=value)
            if isinstance(value, datetime.datetime):
                cell.number_format = date_style
    ws.cell(row=8, column=10, value="beyond the header")
    notes = wb.create_sheet("Notes")
    notes.append(["note"])
    notes.append(["Invented demo data"])
    numbered = wb.create_sheet("2")
    numbered.append(["sheet", "value"])
    numbered.append(["named 2", 2])
    wb.save(path)


def write_1904(path):
    """The 1904 date system (workbookPr date1904), with the built-in date format 14."""
    wb = openpyxl.Workbook()
    wb.epoch = CALENDAR_MAC_1904
    ws = wb.active
    ws.title = "Dates"
    ws.append(["when", "count"])
    for when, count in [(datetime.datetime(1904, 1, 2), 1), (datetime.datetime(1970, 1, 1), 2),
                        (datetime.datetime(2023, 12, 31, 12, 0), 3)]:
        ws.append([when, count])
        ws.cell(row=ws.max_row, column=1).number_format = "mm-dd-yy"
    wb.save(path)


def reading(path):
    """openpyxl's reading: every cell that holds a value, with its kind."""
    wb = openpyxl.load_workbook(path, data_only=True)
    out = {"reader": "openpyxl %s load_workbook(data_only=True)" % openpyxl.__version__,
           "sheets": wb.sheetnames, "date1904": wb.epoch == CALENDAR_MAC_1904, "cells": {}}
    for ws in wb.worksheets:
        cells = []
        for row in ws.iter_rows():
            for cell in row:
                value = cell.value
                if value is None:
                    continue
                if cell.data_type == "e":
                    cells.append([cell.coordinate, "error", value])
                elif isinstance(value, bool):
                    cells.append([cell.coordinate, "bool", value])
                elif isinstance(value, datetime.datetime):
                    days = (value.date() - datetime.date(1970, 1, 1)).days
                    cells.append([cell.coordinate, "date", value.isoformat(), days])
                elif isinstance(value, (int, float)):
                    cells.append([cell.coordinate, "number", value])
                elif isinstance(value, str):
                    cells.append([cell.coordinate, "text", value])
                else:
                    raise SystemExit("%s %s: openpyxl read a %s, which the fixtures do not use"
                                     % (path, cell.coordinate, type(value).__name__))
        out["cells"][ws.title] = cells
    return out


def write_all(folder, writer):
    write_cohort(os.path.join(folder, OPENPYXL_FILES[0]))
    write_1904(os.path.join(folder, OPENPYXL_FILES[1]))
    subprocess.run([writer, folder], check=True)


def json_path(name):
    return os.path.join(FIXTURES, name[:-len(".xlsx")] + ".json")


def main(argv):
    check = argv[1:2] == ["--check"]
    writer = argv[-1]
    if not check:
        write_all(FIXTURES, writer)
        for name in OPENPYXL_FILES + XLSXWRITER_FILES:
            with open(json_path(name), "w", encoding="utf-8") as out:
                json.dump(reading(os.path.join(FIXTURES, name)), out, indent=1, ensure_ascii=False)
                out.write("\n")
        return 0
    failures = 0
    with tempfile.TemporaryDirectory() as fresh:
        write_all(fresh, writer)
        for name in OPENPYXL_FILES + XLSXWRITER_FILES:
            with open(json_path(name), encoding="utf-8") as committed:
                expected = json.load(committed)
            for where in (FIXTURES, fresh):
                got = reading(os.path.join(where, name))
                if got != expected:
                    print("DIFFERS: openpyxl's reading of %s in %s is not the committed %s"
                          % (name, where, os.path.basename(json_path(name))))
                    failures += 1
                else:
                    print("same: %s (%s)" % (name, "committed" if where == FIXTURES else "written again"))
    print("%d passed, %d failed" % (2 * len(OPENPYXL_FILES + XLSXWRITER_FILES) - failures, failures))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
