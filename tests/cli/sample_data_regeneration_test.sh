#!/usr/bin/env bash
# The committed sample files are exactly what `simulate` writes with the documented command.
set -euo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
"$cli" simulate --rows 24000 --seed 20240101 --out "$work/readmissions.csv" \
  --scores-out "$work/readmission-scores.csv" --outcomes-out "$work/readmission-outcomes.csv" \
  --xlsx-out "$work/readmissions.xlsx" --dta-out "$work/readmissions.dta" >/dev/null
for f in readmissions.csv readmission-scores.csv readmission-outcomes.csv readmissions.xlsx readmissions.dta; do
  if ! cmp "$work/$f" "$samples/$f"; then
    echo "FAIL: $f differs from what simulate writes (see sample-data/README.md for the command)"
    exit 1
  fi
done
echo "all five sample files regenerate byte for byte"
