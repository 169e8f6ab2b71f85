#!/usr/bin/env bash
# An analysis saved with --save-settings re-runs to identical results with --settings, and
# options typed on the command line override the saved ones; a changed input is warned about.
set -euo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
cp "$samples/readmissions.csv" "$work/cohort.csv"
mkdir "$work/analyses"
"$cli" validate "$work/cohort.csv" --outcome readmitted_30d --score supplier_score --score local_score \
  --bootstrap 60 --seed 3 --thresholds 0.15,0.25 --json "$work/first.json" --save-settings "$work/analyses/a.plumbline.json" >/dev/null
grep -q '"path": "../cohort.csv"' "$work/analyses/a.plumbline.json" || { echo "FAIL: input path not relative"; exit 1; }
# An input outside the analysis file's folder is read only when the user says so.
set +e
"$cli" validate --settings "$work/analyses/a.plumbline.json" >/dev/null 2>"$work/stderr"
status=$?
set -e
[[ $status -eq 2 ]] && grep -q "outside the analysis file's folder" "$work/stderr" \
  && echo "ok: an input outside the analysis file's folder needs --allow-outside-paths" \
  || { echo "FAIL: outside input read without consent (exit $status)"; cat "$work/stderr"; exit 1; }
"$cli" validate --settings "$work/analyses/a.plumbline.json" --allow-outside-paths --json "$work/second.json" >/dev/null
/usr/bin/python3 - "$work/first.json" "$work/second.json" <<'PY'
import json, sys
a, b = (json.load(open(p)) for p in sys.argv[1:3])
for block in ("cohort", "bootstrap", "models", "comparisons"):
    assert a[block] == b[block], f"{block} differs after the round trip"
print("ok: the saved analysis re-runs to identical results")
PY
"$cli" validate --settings "$work/analyses/a.plumbline.json" --allow-outside-paths --bootstrap 0 --json "$work/third.json" >/dev/null
/usr/bin/python3 -c "import json,sys; r=json.load(open(sys.argv[1])); assert r['bootstrap']['replicates']==0 and r['settings']['panel']['thresholds']==[0.15,0.25]; print('ok: options override the saved analysis')" "$work/third.json"
echo "readmission,extra" >> "$work/cohort.csv"
"$cli" validate --settings "$work/analyses/a.plumbline.json" --allow-outside-paths --bootstrap 0 --json "$work/changed.json" 2>"$work/stderr" >/dev/null
grep -q "has changed since the analysis was saved" "$work/stderr" && echo "ok: a changed input is warned about" || { echo "FAIL: no warning"; cat "$work/stderr"; exit 1; }
/usr/bin/python3 -c "import json,sys; w=json.load(open(sys.argv[1]))['warnings']; assert any('has changed since the analysis was saved' in x for x in w), w; print('ok: the change is a warning of the result')" "$work/changed.json"
set +e
"$cli" validate --settings "$work/analyses/a.plumbline.json" --allow-outside-paths --strict-inputs --bootstrap 0 >/dev/null 2>"$work/stderr"
status=$?
set -e
[[ $status -eq 2 ]] && grep -q "strict-inputs" "$work/stderr" && echo "ok: --strict-inputs refuses a changed input" \
  || { echo "FAIL: --strict-inputs ran on a changed input (exit $status)"; cat "$work/stderr"; exit 1; }
echo "0 failure(s)"
