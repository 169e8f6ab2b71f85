#!/usr/bin/env bash
# The sample cohort validates to the same result from its CSV, its workbook and its Stata file,
# and the shipped workbook and Stata file hold the CSV's values cell for cell as outside readers
# (openpyxl, pandas) see them.
set -euo pipefail
cli=$1
samples=$2
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
options=(--outcome readmitted_30d --score supplier_score --score local_score --group hospital --group payer
         --period discharge_date --id encounter_id --bootstrap 50 --seed 7)
for kind in csv xlsx dta; do
  "$cli" validate "$samples/readmissions.$kind" "${options[@]}" --json "$work/$kind.json" >/dev/null
done
/usr/bin/python3 "$here/sample_formats_agree.py" "$samples" "$work"
