#!/usr/bin/env bash
# End-to-end checks of plumbline-cli: exit statuses (0 done, 2 unusable input, 3 impossible
# analysis) and that each message names file, line, column and value and says what to do.
set -uo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0

expect() { # expect STATUS "needle in stderr" -- command...
  local want=$1 needle=$2; shift 3
  local out status
  out=$("$@" 2>&1 >/dev/null); status=$?
  if [[ $status -ne $want ]]; then
    echo "FAIL: exit $status, wanted $want: $*"; echo "  stderr: $out"; failures=$((failures+1)); return
  fi
  if [[ -n $needle && $out != *"$needle"* ]]; then
    echo "FAIL: message lacks '$needle': $*"; echo "  stderr: $out"; failures=$((failures+1)); return
  fi
  echo "ok: exit $status $*"
}

sample=$samples/readmissions.csv
# Options that cannot act on this run are not silently ignored: a warning names what they need.
expect 0 "--cusum-odds has no effect without --period" -- "$cli" validate "$sample" --outcome readmitted_30d \
  --score supplier_score --cusum-odds 3,0.4
expect 0 "--cusum-years has no effect without --period" -- "$cli" validate "$sample" --outcome readmitted_30d \
  --score supplier_score --cusum-years 2
expect 0 "--acceptable has no effect without --cluster" -- "$cli" validate "$sample" --outcome readmitted_30d \
  --score supplier_score --acceptable c=0.7
out=$("$cli" validate "$sample" --outcome readmitted_30d --score supplier_score 2>&1 >/dev/null)
if [[ $out == *"has no effect"* ]]; then echo "FAIL: a plain run warns of an ineffective option: $out"; failures=$((failures+1)); fi
# Done, and the JSON holds the interface's blocks with a balanced audit.
expect 0 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --score local_score \
  --bootstrap 200 --seed 11 --threads 1 --json "$work/r.json"
expect 0 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --score local_score \
  --bootstrap 200 --seed 11 --threads 2 --json "$work/r2.json"
/usr/bin/python3 - "$work/r.json" "$work/r2.json" <<'PY' || failures=$((failures+1))
import json, sys
one, two = (open(p).read() for p in sys.argv[1:3])
# Bit-identical apart from the creation time: the thread count changes nothing.
strip = lambda text: "\n".join(l for l in text.splitlines() if '"created"' not in l)
assert strip(one) == strip(two), "JSON differs between --threads 1 and --threads 2"
r = json.loads(one)
assert r["bootstrap"]["seed"] == 11 and r["bootstrap"]["replicates"] == 200
for model in r["models"]:
    for key, metric in model["metrics"].items():
        assert metric["ci_method"].startswith("bootstrap_"), key
        assert metric["bootstrap"]["percentile"] and metric["bootstrap"]["acceleration_from"], key
    assert model["calibration_curve"][0]["ci_lower"] is not None and len(model["roc_band"]) == 101
print("ok: bootstrap JSON identical for 1 and 2 threads, every metric with its interval")
for block in ("plumbline", "inputs", "settings", "cohort", "bootstrap", "models", "warnings"):
    assert block in r, block
c = r["cohort"]
assert c["rows_read"] == c["rows_used"] + sum(e["rows"] for e in c["exclusions"]), "audit does not balance"
assert len(r["inputs"][0]["sha256"]) == 64
assert c["events"] + c["non_events"] == c["rows_used"]
print("ok: result JSON has every block and the audit balances")
PY

# Unusable inputs: exit 2 with file, line, column and a remedy.
expect 2 "readmissions.csv, line 1, column 'supplier_scor'" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_scor
expect 2 "did you mean 'supplier_score'" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_scor
expect 2 "cannot be opened" -- "$cli" validate "$work/none.csv" --outcome y --score p
printf 'y,p\n1,30\n0,45\n1,80\n' > "$work/percent.csv"
expect 2 "--scale percent" -- "$cli" validate "$work/percent.csv" --outcome y --score p
printf 'y,p\nyes,0.2\nno,0.3\nmaybe,0.5\n' > "$work/three.csv"
expect 2 "'maybe' (1 rows, first on line 4)" -- "$cli" validate "$work/three.csv" --outcome y --score p
printf 'y,p\nZ\xfcrich,0.2\n' > "$work/latin1.csv"
expect 2 "line 2, column 'y'" -- "$cli" validate "$work/latin1.csv" --outcome y --score p
expect 2 "delimiter" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --delimiter ';'
expect 2 "" -- "$cli" validate "$sample" --outcome readmitted_30d
expect 2 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --scale odds
expect 2 "strictly between 0 and 1" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --thresholds 0.1,1.5
expect 2 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --groups 1
# The printed panel names its metrics, intervals and readings, and the cautions close it.
out=$("$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --bootstrap 0)
for needle in "C statistic" "Calibration slope" "predictions clearly too extreme" "positive if risk >= t" "Cautions:"; do
  [[ $out == *"$needle"* ]] && echo "ok: table shows '$needle'" || { echo "FAIL: table lacks '$needle'"; failures=$((failures+1)); }
done
# Edge cases give nulls and warnings, never a crash or a NaN.
{ echo "y,pts"; for i in $(seq 1 60); do echo "$((i % 3 == 0 ? 1 : 0)),$((i % 7))"; done; } > "$work/points.csv"
expect 0 "" -- "$cli" validate "$work/points.csv" --outcome y --score pts --scale points --json "$work/points.json"
{ echo "y,p"; for i in $(seq 1 40); do echo "$((i % 4 == 0 ? 1 : 0)),0.25"; done; } > "$work/flat.csv"
expect 0 "" -- "$cli" validate "$work/flat.csv" --outcome y --score p --json "$work/flat.json"
/usr/bin/python3 - "$work/points.json" "$work/flat.json" <<'PY' || failures=$((failures+1))
import json, sys
points, flat = (json.load(open(f)) for f in sys.argv[1:3])
m = points["models"][0]["metrics"]
assert m["c_statistic"]["estimate"] is not None and m["calibration_slope"]["estimate"] is None
assert any("points scale" in w for w in points["warnings"])
f = flat["models"][0]["metrics"]
assert f["c_statistic"]["estimate"] == 0.5 and f["calibration_slope"]["estimate"] is None
assert any("calibration slope cannot be estimated" in w for w in flat["warnings"])
for path in sys.argv[1:3]:
    assert "NaN" not in open(path).read()
print("ok: points and flat scores give nulls with reasons")
PY
# Charts as PNG and SVG, tables, workbook and report in one run.
expect 0 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score local_score --bootstrap 0 --chart-dir "$work/charts" --report "$work/r.html"
for f in roc.png roc.svg calibration.png calibration.svg; do
  [[ -s "$work/charts/$f" ]] && echo "ok: chart $f written" || { echo "FAIL: chart $f missing"; failures=$((failures+1)); }
done
expect 2 "pdf" -- "$cli" validate "$sample" --outcome readmitted_30d --score local_score --bootstrap 0 --report "$work/r.docx"
# Impossible analyses: exit 3.
printf 'y,p\n0,0.2\n0,0.3\n' > "$work/oneclass.csv"
expect 3 "both patients with and without the event" -- "$cli" validate "$work/oneclass.csv" --outcome y --score p
# Inputs are never modified.
before=$(sha256sum "$sample")
"$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --bootstrap 0 >/dev/null
[[ "$(sha256sum "$sample")" == "$before" ]] && echo "ok: input unchanged" || { echo "FAIL: input changed"; failures=$((failures+1)); }
# inspect and the two-file join.
expect 0 "" -- "$cli" inspect "$sample"
"$cli" inspect "$sample" | grep -q "readmitted_30d.*binary" && echo "ok: inspect types the outcome" || { echo "FAIL: inspect"; failures=$((failures+1)); }
# inspect on a Stata file shows the value labels pandas 1.5.3 wrote into the fixture
# (tests/data/statistical/cohort.dta.json), and on a workbook names the sheet.
statistical=$(dirname "$0")/../data/statistical
spreadsheets=$(dirname "$0")/../data/spreadsheets
"$cli" inspect "$statistical/cohort.dta" | grep -q "died .*binary.*labels: 0 = alive, 1 = died" \
  && echo "ok: inspect shows a Stata file's value labels" || { echo "FAIL: inspect of a .dta"; failures=$((failures+1)); }
"$cli" inspect "$spreadsheets/openpyxl_cohort.xlsx" --sheet Notes | grep -q "sheet 'Notes'" \
  && echo "ok: inspect reads the sheet asked for" || { echo "FAIL: inspect --sheet"; failures=$((failures+1)); }
expect 2 "sheet" -- "$cli" inspect "$spreadsheets/openpyxl_cohort.xlsx" --sheet "No such sheet"
expect 2 "nothing to describe" -- "$cli" inspect
expect 0 "" -- "$cli" validate "$samples/readmission-scores.csv" --outcomes "$samples/readmission-outcomes.csv" \
  --id encounter_id --outcome readmitted_30d --score supplier_score --bootstrap 0 --json "$work/join.json"
/usr/bin/python3 - "$work/join.json" <<'PY' || failures=$((failures+1))
import json, sys
c = json.load(open(sys.argv[1]))["cohort"]
j = c["join"]
assert c["rows_read"] == c["rows_used"] + sum(e["rows"] for e in c["exclusions"])
assert j["outcome_rows"] == j["matched"] + j["outcomes_without_score"] + sum(e["rows"] for e in j["outcome_file_exclusions"])
assert j["scores_without_outcome"] > 0 and j["outcomes_without_score"] > 0
print("ok: join balances on both sides")
PY
expect 2 "need an id" -- "$cli" validate "$samples/readmission-scores.csv" --outcomes "$samples/readmission-outcomes.csv" --outcome readmitted_30d --score supplier_score

# Subgroups, periods and the planner.
printf 'y,p,d\n1,0.2,2025-01-03\n0,0.1,03/04/2025\n' > "$work/ambiguous.csv"
expect 2 "line 3, column 'd', value '03/04/2025'" -- "$cli" validate "$work/ambiguous.csv" --outcome y --score p --period d --bootstrap 0
expect 2 "between 0 and 1" -- "$cli" plan --prevalence 1.5 --c-statistic 0.7
# The worked example of docs/methods.md §22 (Riley et al. 2021 criteria, formulas from memory;
# computed with numpy and scipy 1.10): slope-driven.
plan=$("$cli" plan --prevalence 0.15 --c-statistic 0.70 --threshold 0.15)
if [[ $plan == *"driven by the calibration slope criterion"* && $plan == *"2185"* ]]; then echo "ok: plan prints the criteria"
else echo "FAIL: plan output: $plan"; failures=$((failures+1)); fi
expect 0 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --group hospital \
  --period discharge_date --period-unit quarter --bootstrap 0 --json "$work/groups.json"
/usr/bin/python3 - "$work/groups.json" <<'PY' || failures=$((failures+1))
import json, sys
r = json.load(open(sys.argv[1]))
levels = {s["level"] for s in r["subgroups"]}
assert levels == {"Ashford Regional", "Harbour General", "Linnet Hill Memorial", "Millbrook Community",
                  "Saltmarsh District"}, levels
assert [p["period"] for p in r["periods"]][:2] == ["2024-Q1", "2024-Q2"]
assert len(r["models"][0]["net_benefit"]) == 46
print("ok: subgroups, periods and net benefit in the JSON")
PY

# --report twice: a PDF and an HTML file from one run, with one timestamp; the HTML holds an
# inline SVG for each chart listed below.
expect 0 "" -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --group hospital --period discharge_date \
  --bootstrap 50 --report "$work/both.pdf" --report "$work/both.html"
if [[ -s $work/both.pdf && -s $work/both.html ]]; then
  stamp=$(grep -o 'Plumbline [0-9.]* - [0-9T:-]*Z' "$work/both.html" | head -1)
  pdftotext "$work/both.pdf" "$work/both.txt"
  grep -qF "$stamp" "$work/both.txt" && echo "ok: one timestamp in both reports" \
    || { echo "FAIL: the PDF and the HTML differ in time ($stamp)"; failures=$((failures+1)); }
  svgs=$(grep -o '<svg' "$work/both.html" | wc -l)
  # ROC, calibration, decision curve; for the one subgroup column and model the forests of C, O/E
  # and slope, the curves by level and the funnel; O/E and C over time; monitoring's expected minus
  # observed and its two CUSUMs.
  [[ $svgs -eq 13 ]] && echo "ok: thirteen inline charts" || { echo "FAIL: $svgs inline charts, wanted 13"; failures=$((failures+1)); }
  # Bookmarks as a PDF reader sees them (poppler's outline), one per section, and page numbers.
  outline=$(pdftohtml -xml -i -q -stdout "$work/both.pdf" | sed -n '/<outline>/,/<\/outline>/p')
  items=$(grep -c '<item page=' <<<"$outline")
  grep -q '<item page="1">1. Decision summary</item>' <<<"$outline" && [[ $items -eq 11 ]] \
    && echo "ok: the PDF has a bookmark per section" || { echo "FAIL: PDF bookmarks: $items entries"; failures=$((failures+1)); }
  grep -q "page 1 of" "$work/both.txt" && echo "ok: page N of M" || { echo "FAIL: no 'page 1 of' in the PDF"; failures=$((failures+1)); }
  # No internal name leaks into what people read: no key of the result JSON written with an
  # underscore (c_statistic, bootstrap_bca...) appears in the PDF's or the HTML's text.
  "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --group hospital --period discharge_date \
    --bootstrap 50 --json "$work/keys.json" >/dev/null 2>&1
  if ! /usr/bin/python3 - "$work/keys.json" "$work/both.txt" "$work/both.html" <<'PY'
import html, json, re, sys
keys = set()
def walk(value):
    if isinstance(value, dict):
        for k, v in value.items():
            keys.add(k)
            walk(v)
    elif isinstance(value, list):
        for v in value:
            walk(v)
    elif isinstance(value, str) and re.fullmatch(r"[a-z]+(_[a-z0-9]+)+", value):
        keys.add(value)  # enumerated values such as "bootstrap_bca"
walk(json.load(open(sys.argv[1])))
# Column names of the data are the user's own words and may be snake_case: they may appear.
data_words = {"supplier_score", "local_score", "readmitted_30d", "discharge_date", "age_band", "encounter_id"}
tokens = sorted(k for k in keys if "_" in k and k not in data_words)
pdf = open(sys.argv[2], encoding="utf-8").read()
page = open(sys.argv[3], encoding="utf-8").read()
page = html.unescape(re.sub(r"<[^>]+>", " ", re.sub(r"<(style|svg)[^>]*>.*?</>", " ", page, flags=re.S)))
bad = [(t, name) for t in tokens for name, text in (("PDF", pdf), ("HTML", page)) if re.search(r"\b" + re.escape(t) + r"\b", text)]
print(f"{len(tokens)} internal names checked")
for t, name in bad:
    print(f"internal name {t} in the {name}")
sys.exit(1 if bad or not tokens else 0)
PY
  then failures=$((failures+1)); else echo "ok: no internal name in the report's text"; fi
else
  echo "FAIL: --report given twice did not write both files"; failures=$((failures+1))
fi

echo "$failures failure(s)"
[[ $failures -eq 0 ]]
