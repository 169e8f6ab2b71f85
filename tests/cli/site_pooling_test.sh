#!/usr/bin/env bash
# Pooling across sites from the command line: `validate --cluster hospital` on the sample cohort
# gives the site_pooling block (whatever the number of hospitals, at least 3), the printed
# summary, and an analysis file that keeps --cluster and --acceptable; bad --cluster and
# --acceptable values stop the run with exit 2 and a message naming what was wrong.
set -uo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
sample=$samples/readmissions.csv
columns=(--outcome readmitted_30d --score supplier_score --score local_score)

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

if ! "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable c=0.65,oe=0.85:1.15 --seed 5 \
    --json "$work/r.json" --save-settings "$work/a.plumbline.json" >"$work/out.txt" 2>"$work/err.txt"; then
  echo "FAIL: validate --cluster hospital did not run"; cat "$work/err.txt"; failures=$((failures+1))
fi
grep -q "Across sites (hospital, " "$work/out.txt" || { echo "FAIL: no printed summary across sites"; failures=$((failures+1)); }
grep -q "acceptable in a new site (c=0.65,oe=0.85:1.15,slope=0.8:1.2)" "$work/out.txt" \
  || { echo "FAIL: printed summary lacks the criteria"; failures=$((failures+1)); }
/usr/bin/python3 - "$work/r.json" <<'PY' || failures=$((failures+1))
import json, sys
r = json.load(open(sys.argv[1]))
s = r["site_pooling"]
assert s["column"] == "hospital" and s["sites"] >= 3, s["sites"]
assert s["acceptable"] == {"c_min": 0.65, "oe": [0.85, 1.15], "slope": [0.8, 1.2]}, s["acceptable"]
assert r["settings"]["cluster"] == "hospital"
for model in s["models"]:
    names = [m["measure"] for m in model["measures"]]
    assert names == ["c_statistic", "oe_ratio", "calibration_slope"], names
    for m in model["measures"]:
        assert len(m["sites"]) == s["sites"], m["measure"]
        low, high = m["hksj_interval"]
        assert low < m["pooled"] < high, m["measure"]
        plow, phigh = m["prediction_interval"]
        assert plow < m["pooled"] < phigh, m["measure"]
        assert m["tau2_reml"] >= 0 and m["tau2_dl"] >= 0 and 0 <= m["i2"] <= 1
    a = model["acceptability"]
    assert a["seed"] == 5 and a["draws"] == 100000 and a["method"].startswith("joint simulation from the predictive distribution")
    assert all(a["joint"] <= p for p in a["probabilities"].values())
print("ok: site_pooling block for", s["sites"], "hospitals")
PY
# The saved analysis re-runs with the same site column and criteria.
if "$cli" validate --settings "$work/a.plumbline.json" --allow-outside-paths --json "$work/again.json" >/dev/null 2>"$work/err2.txt"; then
  /usr/bin/python3 - "$work/r.json" "$work/again.json" <<'PY' || failures=$((failures+1))
import json, sys
a, b = (json.load(open(p))["site_pooling"] for p in sys.argv[1:3])
assert a == b, "the saved analysis gives another site_pooling block"
print("ok: the analysis file keeps --cluster, --acceptable and the seed")
PY
else
  echo "FAIL: the saved analysis did not re-run"; cat "$work/err2.txt"; failures=$((failures+1))
fi

# A site per row (an id given as the site column): every site too small, counted, the run ends
# normally, and the result keeps at most 21 notes a measure.
/usr/bin/python3 -c "
import sys
with open(sys.argv[1], 'w') as f:
    f.write('y,p,site\n')
    for i in range(3000):
        f.write(f'{i % 3 == 0:d},{0.1 + (i % 7) / 10:.2f},row{i}\n')
" "$work/site_per_row.csv"
if "$cli" validate "$work/site_per_row.csv" --outcome y --score p --cluster site --json "$work/per_row.json" >"$work/per_row.txt" 2>&1; then
  grep -q "3000 left out" "$work/per_row.txt" || { echo "FAIL: the sites left out are not counted"; failures=$((failures+1)); }
  grep -q "Most sites (3000 of 3000) have fewer than 11 patients: is 'site' a site column?" "$work/per_row.txt" \
    || { echo "FAIL: a site per row is not questioned"; failures=$((failures+1)); }
  /usr/bin/python3 -c "
import json, sys
r = json.load(open(sys.argv[1]))
m = r['site_pooling']['models'][0]['measures'][0]
# Sites below the small-cell number are counted, never named with their outcome.
assert m['sites_left_out'] == 3000 and m['pooled'] is None, m['sites_left_out']
assert m['left_out'] == ['3000 sites with fewer than 11 patients (not named: small-cell rule).'], m['left_out']
assert not any('row' in w for w in r['warnings'] + m['left_out']), r['warnings']
print('ok: a site per row is counted, not listed')
" "$work/per_row.json" || failures=$((failures+1))
else
  echo "FAIL: a site per row stopped the run"; cat "$work/per_row.txt"; failures=$((failures+1))
fi

# A saved analysis edited by hand: criteria out of range are refused naming the key.
/usr/bin/python3 - "$work/a.plumbline.json" "$work/bad.plumbline.json" <<'PY'
import json, sys
a = json.load(open(sys.argv[1]))
a["options"]["acceptable"] = "c=2"
json.dump(a, open(sys.argv[2], "w"))
PY
expect 2 "key 'options.acceptable'" -- "$cli" validate --settings "$work/bad.plumbline.json" --allow-outside-paths

expect 2 "there is no cluster column of that name" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospitl
expect 2 "'hospital'" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospitl
expect 2 "--cluster names no column" -- "$cli" validate "$sample" "${columns[@]}" --cluster ""
expect 2 "--cluster names the outcome or a score column" -- "$cli" validate "$sample" "${columns[@]}" --cluster supplier_score
expect 2 "--acceptable knows the measures c, oe and slope only" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable auc=0.7
expect 2 "--acceptable takes oe as low:high" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable oe=0.8
expect 2 "--acceptable takes oe as low:high with 0 < low < high" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable oe=1.2:0.8
expect 2 "--acceptable takes c as a C statistic strictly between 0 and 1" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable c=70
expect 2 "--acceptable names c twice" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable c=0.7,c=0.8
expect 2 "--acceptable names no criterion" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable ""
expect 2 "--acceptable takes slope as low:high" -- "$cli" validate "$sample" "${columns[@]}" --cluster hospital --acceptable "slope=nan:1"

echo "$failures failure(s)"
[[ $failures -eq 0 ]]
