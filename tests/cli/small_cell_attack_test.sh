#!/usr/bin/env bash
# No suppressed count of a report can be worked out from what the report prints: the sample
# cohort with a high minimum (--min-cell 120, so that many cells are small), both models, two
# subgroup columns and monthly periods; then a small generated cohort with the usual minimum.
# tests/cli/suppression_attack.py plays the reader who tries.
set -uo pipefail
cli=$1
source=$2
attack="/usr/bin/python3 $source/tests/cli/suppression_attack.py"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
sample=$source/sample-data/readmissions.csv

check() { # check NAME -- validate arguments...
  local name=$1; shift 2
  if ! "$cli" validate "$@" --bootstrap 0 --csv-dir "$work/$name" --report "$work/$name.html" >"$work/$name.log" 2>&1; then
    echo "FAIL: $name did not run"; tail -3 "$work/$name.log"; failures=$((failures+1)); return
  fi
  if ! $attack "$work/$name" "$work/$name.html" > "$work/$name.attack" 2>&1; then
    echo "FAIL: $name: suppressed counts come back"; cat "$work/$name.attack"; failures=$((failures+1))
  else
    echo "ok: $name: $(head -1 "$work/$name.attack")"
  fi
}

check sample120 -- "$sample" --outcome readmitted_30d --score supplier_score --score local_score \
  --group hospital --group age_band --period discharge_date --min-cell 120
check sample11 -- "$sample" --outcome readmitted_30d --score supplier_score --score local_score \
  --group hospital --group sex --period discharge_date
check sample60 -- "$sample" --outcome readmitted_30d --score supplier_score --score local_score \
  --group hospital --group payer --period discharge_date --min-cell 60

# 600 generated rows, three sites of which one is tiny, risks from a fixed rule.
/usr/bin/python3 - "$work/small.csv" <<'PY'
import sys
rows = ["outcome,risk_a,risk_b,site,discharged"]
for i in range(600):
    site = "North" if i < 400 else ("South" if i < 590 else "Islands")
    a = 0.03 + 0.7 * ((i * 37) % 100) / 100
    b = min(0.95, max(0.02, a * 0.8 + 0.1 * ((i * 11) % 7) / 7))
    event = 1 if ((i * 53) % 100) < int(a * 100) else 0
    month = 1 + i % 12
    rows.append(f"{event},{a:.4f},{b:.4f},{site},2025-{month:02d}-15")
open(sys.argv[1], "w").write("\n".join(rows) + "\n")
PY
check small -- "$work/small.csv" --outcome outcome --score risk_a --score risk_b --group site --period discharged --min-cell 11

[ "$failures" -eq 0 ] || { echo "$failures failure(s)"; exit 1; }
echo "every suppressed count stays suppressed"
