#!/usr/bin/env bash
# The PDF report never breaks a number across lines ("0.\n317", "60848 ±\n4878"): the built program
# writes a capacity report and a monitoring report (--period); pdftotext's text of each PDF must
# hold no line that is the head of a split number (a cell line "0." or one ending in "±"), and
# every number of the capacity table (its CSV, written with the same digits) must appear whole on
# one line.
set -uo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
sample=$samples/readmissions.csv
for run in capacity monitoring; do
  extra=(--period discharge_date)
  [[ $run == capacity ]] && extra+=(--capacity 10%)
  if ! "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --score local_score "${extra[@]}" \
       --report "$work/$run.pdf" --csv-dir "$work/$run" >"$work/$run.out" 2>"$work/$run.err"; then
    echo "FAIL: $run report not written"; tail -3 "$work/$run.err"; failures=$((failures+1)); continue
  fi
  pdftotext "$work/$run.pdf" "$work/$run.txt" || { echo "FAIL: pdftotext on $run"; failures=$((failures+1)); continue; }
  /usr/bin/python3 - "$work/$run" "$work/$run.txt" "$run" <<'PY' || failures=$((failures+1))
import csv, pathlib, re, sys
folder, text, run = pathlib.Path(sys.argv[1]), pathlib.Path(sys.argv[2]).read_text(encoding="utf-8"), sys.argv[3]
lines = set(l.strip() for l in text.splitlines())
checked, broken = 0, []
# Heads of split numbers: a line that is only digits and a point, or that ends in "±".
for l in lines:
    if re.fullmatch(r"-?\d+\.", l) or l.endswith("±"):
        broken.append(f"split: {l!r}")
if run == "capacity":
    with open(folder / "capacity.csv", newline="", encoding="utf-8") as f:
        for row in csv.reader(f):
            for cell in row[1:]:
                cell = cell.strip()
                if not re.fullmatch(r"-?\d+\.\d+", cell):
                    continue
                checked += 1
                if not any(cell in l for l in lines):
                    broken.append(f"capacity.csv: {cell!r}")
else:
    checked = sum(1 for l in lines if re.search(r"\d\.\d", l))
if checked == 0:
    print(f"FAIL: {run}: no numeric cells found to check"); sys.exit(1)
if broken:
    print(f"FAIL: {run}: {len(broken)} of {checked} numbers are not whole on one line of the PDF, e.g. " + "; ".join(broken[:8]))
    sys.exit(1)
print(f"ok: {run}: {checked} numbers whole on one line of the PDF")
PY
done
[[ $failures -eq 0 ]] || { echo "$failures failure(s)"; exit 1; }
echo "all PDF numbers unbroken"
