#!/usr/bin/env bash
# The sample cohort as SPSS (.sav, .zsav) and SAS (.xpt, .sas7bdat) files, converted from the
# shipped Stata file by ReadStat 1.1.8's own command-line tool (Debian package readstat), validates
# to the CSV's result apart from the provenance, with observation numbers = CSV line - 1.
# No --period: the tool carries Stata's %td format into these files, which neither SPSS nor SAS
# knows as a date (the readers' date formats are checked on fixtures in statistical_file_table_tests).
set -euo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
options=(--outcome readmitted_30d --score supplier_score --score local_score --group hospital --group payer
         --id encounter_id --bootstrap 50 --seed 7)
"$cli" validate "$samples/readmissions.csv" "${options[@]}" --json "$work/csv.json" >/dev/null
for kind in sav zsav xpt sas7bdat; do
  readstat "$samples/readmissions.dta" "$work/readmissions.$kind" >/dev/null
  "$cli" validate "$work/readmissions.$kind" "${options[@]}" --json "$work/$kind.json" >/dev/null
done
/usr/bin/python3 - "$work" <<'PY'
import copy, json, sys
work = sys.argv[1]

def without_provenance(result):
    r = copy.deepcopy(result)
    r.pop("plumbline", None)
    r.pop("inputs", None)
    for key in ("cohort_file", "sheet", "database", "query", "delimiter"):
        r["settings"].pop(key, None)
    cohort = r["cohort"]
    for key in ("delimiter", "delimiter_sniffed", "first_lines_count"):
        cohort.pop(key, None)
    for exclusion in cohort["exclusions"]:
        exclusion.pop("file")
        exclusion.pop("first_lines")
    return r

csv = json.load(open(f"{work}/csv.json"))
assert csv["cohort"]["exclusions"], "the sample cohort should have exclusions"
for kind in ("sav", "zsav", "xpt", "sas7bdat"):
    other = json.load(open(f"{work}/{kind}.json"))
    assert without_provenance(csv) == without_provenance(other), f"the {kind} result differs from the CSV's"
    for a, b in zip(csv["cohort"]["exclusions"], other["cohort"]["exclusions"]):
        assert [line - 1 for line in a["first_lines"]] == b["first_lines"], (kind, a, b)
    assert other["inputs"][0]["kind"] == "statistical file" and other["cohort"]["first_lines_count"] == "row"
    print(f"ok: the {kind} result equals the CSV's apart from the source (observation = line - 1)")
PY
