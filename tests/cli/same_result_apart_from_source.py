"""The sample cohort's results from the CSV, from PostgreSQL through libpq and through ODBC are the
same analysis: equal in every key but those that say where the rows came from.
    same_result_apart_from_source.py FOLDER   (csv.json, libpq.json, odbc.json, typed.json)
Provenance, left out of the comparison: plumbline (version, time), inputs (paths, hashes),
settings.cohort_file / sheet / database / query / delimiter, cohort.delimiter /
delimiter_sniffed / first_lines_count / line_noun, and each exclusion's file and first_lines;
those are checked instead against the relation between the two: the load's row key is the CSV's
line number and the query keeps its order, so row of the result = line of the CSV - 1.
typed.json reads the scores as double precision columns: the four entries that are not
numbers are NULL there, so it differs from the CSV only in those rows' exclusion reason.
"""
import copy
import json
import sys

folder = sys.argv[1]
results = {name: json.load(open(f"{folder}/{name}.json")) for name in ("csv", "libpq", "odbc", "typed")}


def positions(result):
    """Each exclusion's (reason, column) → its first positions, for the row/line relation."""
    return {(e["reason"], e.get("column")): e["first_lines"] for e in result["cohort"]["exclusions"]}


def without_source(result):
    r = copy.deepcopy(result)
    del r["plumbline"], r["inputs"]
    for key in ("cohort_file", "sheet", "database", "query", "delimiter"):
        r["settings"].pop(key, None)
    for key in ("delimiter", "delimiter_sniffed", "first_lines_count", "line_noun"):
        r["cohort"].pop(key, None)
    for exclusion in r["cohort"]["exclusions"]:
        exclusion.pop("file", None)
        exclusion.pop("first_lines", None)
    return r


def differences(a, b, path=""):
    if isinstance(a, dict) and isinstance(b, dict):
        for key in sorted(set(a) | set(b)):
            if key not in a or key not in b:
                yield f"{path}.{key}: only in {'the first' if key in a else 'the second'}"
            else:
                yield from differences(a[key], b[key], f"{path}.{key}")
    elif isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
        for i, (x, y) in enumerate(zip(a, b)):
            yield from differences(x, y, f"{path}[{i}]")
    elif a != b or type(a) is not type(b):
        yield f"{path}: {json.dumps(a)[:120]} != {json.dumps(b)[:120]}"


csv = results["csv"]
assert csv["cohort"]["exclusions"], "the sample cohort has exclusions to compare positions of"
for name in ("libpq", "odbc"):
    found = list(differences(without_source(csv), without_source(results[name])))
    assert not found, f"{name} differs from the CSV:\n" + "\n".join(found[:20])
    lines, rows = positions(csv), positions(results[name])
    assert lines.keys() == rows.keys(), (name, lines.keys(), rows.keys())
    for key, first in lines.items():
        assert rows[key] == [line - 1 for line in first], (name, key, first[:5], rows[key][:5])
    print(f"ok: {name}: the same result as the CSV; every exclusion's rows are its lines - 1")

# Scores read as doubles: the '#VALUE!' rows move from "not a number" to "missing score", at the
# same positions; nothing else changes.
typed, expected = without_source(results["typed"]), without_source(csv)
typed_exclusions, expected_exclusions = typed["cohort"].pop("exclusions"), expected["cohort"].pop("exclusions")
found = list(differences(expected, typed))
assert not found, "typed differs from the CSV:\n" + "\n".join(found[:20])
by_key = lambda exclusions: {(e["reason"], e["column"]): e for e in exclusions}
lines, rows = by_key(csv["cohort"]["exclusions"]), by_key(results["typed"]["cohort"]["exclusions"])
entered = lines.pop(("score is not a number", "supplier_score"))
assert entered["rows"] == 4 and ("score is not a number", "supplier_score") not in rows, rows.keys()
lines[("missing score", "supplier_score")] = entered
assert lines.keys() == rows.keys(), (lines.keys(), rows.keys())
for key, exclusion in lines.items():
    assert rows[key]["rows"] == exclusion["rows"], key
    assert rows[key]["first_lines"] == [line - 1 for line in exclusion["first_lines"]], key
print("ok: scores as double precision: the four entries kept as text are missing scores, all else the same")
