#!/usr/bin/env bash
# Everything a file or an option can do to plumbline-cli that should not lose data, hang, read
# what it should not, or run silently wrong: each case's exit status and message, and that no
# input file changed (SHA-256 before and after). Every command runs under a time limit, so a
# hang fails the test instead of stalling it.
set -uo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
columns=(--outcome readmitted_30d --score supplier_score --bootstrap 0)

expect() { # expect STATUS "needle in stderr" -- command...
  local want=$1 needle=$2; shift 3
  local out status
  out=$(timeout 60 "$@" 2>&1 >/dev/null); status=$?
  if [[ $status -ne $want ]]; then
    echo "FAIL: exit $status, wanted $want: $*"; echo "  stderr: ${out:0:600}"; failures=$((failures+1)); return
  fi
  if [[ -n $needle && $out != *"$needle"* ]]; then
    echo "FAIL: message lacks '$needle': $*"; echo "  stderr: ${out:0:600}"; failures=$((failures+1)); return
  fi
  echo "ok: exit $status ${*:2:4}"
}
fingerprints() { (cd "$work/inputs" && sha256sum x.csv readmission-scores.csv readmission-outcomes.csv); }

mkdir -p "$work/inputs" "$work/out"
cp "$samples/readmissions.csv" "$work/inputs/x.csv"
cp "$samples/readmission-scores.csv" "$samples/readmission-outcomes.csv" "$work/inputs/"
x=$work/inputs/x.csv
before=$(fingerprints)

echo "== 1. an output never replaces an input"
expect 2 "--json names an input" -- "$cli" validate "$x" "${columns[@]}" --json "$x"
expect 2 "--save-settings names an input" -- "$cli" validate "$x" "${columns[@]}" --save-settings "$x"
expect 2 "--report names an input" -- "$cli" validate "$x" "${columns[@]}" --report "$x"
expect 2 "--xlsx names an input" -- "$cli" validate "$x" "${columns[@]}" --xlsx "$x"
ln -s "$x" "$work/out/soft.csv"; ln "$x" "$work/out/hard.csv"
expect 2 "names an input" -- "$cli" validate "$x" "${columns[@]}" --json "$work/out/soft.csv"
expect 2 "names an input" -- "$cli" validate "$x" "${columns[@]}" --json "$work/out/hard.csv"
expect 2 "--out names an input" -- "$cli" update "$x" --outcome readmitted_30d --score supplier_score --id encounter_id --out "$x"
cp "$x" "$work/inputs/settings.csv" # named like a report table
expect 2 "--csv-dir names an input" -- "$cli" validate "$work/inputs/settings.csv" "${columns[@]}" --csv-dir "$work/inputs"
rm "$work/inputs/settings.csv"
[[ ! -e "$work/out/r.json" ]] || { echo "FAIL: an output was written"; failures=$((failures+1)); }

echo "== 2-5. analysis files: devices, pipes, bounds, types, outside paths"
"$cli" validate "$x" "${columns[@]}" --save-settings "$work/inputs/a.plumbline.json" >/dev/null
edit() { # edit NAME PYTHON-EXPRESSION-ON-a : writes $work/NAME.plumbline.json beside the inputs
  /usr/bin/python3 - "$work/inputs/a.plumbline.json" "$work/inputs/$1.plumbline.json" "$2" <<'PY'
import json, sys
a = json.load(open(sys.argv[1]))
exec(sys.argv[3])
open(sys.argv[2], "w").write(json.dumps(a) if isinstance(a, dict) else a)
PY
}
edit zero 'a["inputs"][0]["path"] = "/dev/zero"'
expect 2 "outside the analysis file's folder" -- "$cli" validate --settings "$work/inputs/zero.plumbline.json"
expect 2 "not a regular file" -- "$cli" validate --settings "$work/inputs/zero.plumbline.json" --allow-outside-paths
mkfifo "$work/inputs/pipe.csv"
edit fifo 'a["inputs"][0]["path"] = "pipe.csv"'
expect 2 "not a regular file" -- "$cli" validate --settings "$work/inputs/fifo.plumbline.json"
rm "$work/inputs/pipe.csv"
edit passwd 'a["inputs"][0]["path"] = "../../../../../../../etc/passwd"'
expect 2 "outside the analysis file's folder" -- "$cli" validate --settings "$work/inputs/passwd.plumbline.json"
out=$(timeout 60 "$cli" validate --settings "$work/inputs/passwd.plumbline.json" --allow-outside-paths 2>&1 >/dev/null)
[[ $out != *"/bin/bash"* && $out != *"nologin"* ]] && echo "ok: a file that is not a table is quoted by a short excerpt only" \
  || { echo "FAIL: a line of /etc/passwd reached the message: $out"; failures=$((failures+1)); }
edit step 'a["options"]["decision_range"] = [0, 1, 1e-12]'
expect 2 "options.decision_range" -- "$cli" validate --settings "$work/inputs/step.plumbline.json"
edit many 'a["options"]["thresholds"] = [0.2] * 5000000'
expect 2 "" -- "$cli" validate --settings "$work/inputs/many.plumbline.json"
for case in 'confidence=0' 'confidence=-0.95' 'confidence=2' 'risk_groups=-5' 'risk_groups=0' 'thresholds=[-1]' \
            'thresholds=[2]' 'thresholds=[1e308]' 'bootstrap=2.5' 'bootstrap=-1' 'ci_method="bogus"' \
            'minimum_cell=0' 'decision_threshold=7' 'capacity="101%"' 'capacity="40/fortnight"' 'capacity=7' 'capacity="-5/week"' \
            'cusum_odds=[0.5,2]' 'cusum_odds=[2]' 'cusum_odds=[1e308,0.5]' 'cusum_odds=[1.0001,0.9999]' \
            'cusum_years=0' 'cusum_years=1e9'; do
  key=${case%%=*}; value=${case#*=}
  edit bad "a['options']['$key'] = $value"
  expect 2 "key 'options.$key'" -- "$cli" validate --settings "$work/inputs/bad.plumbline.json"
done
edit scale 'a["reading"]["scale"] = "dollars"'
expect 2 "key 'reading.scale'" -- "$cli" validate --settings "$work/inputs/scale.plumbline.json"
edit role 'a["inputs"][0]["role"] = "scores"'
expect 2 "key 'inputs[0].role'" -- "$cli" validate --settings "$work/inputs/role.plumbline.json"
edit version 'a["plumbline_analysis"] = 99'
expect 2 "newer Plumbline" -- "$cli" validate --settings "$work/inputs/version.plumbline.json"
edit huge 'a = json.dumps(a).replace("\"confidence\": 0.95", "\"confidence\": 1e400")'
expect 2 "not valid JSON" -- "$cli" validate --settings "$work/inputs/huge.plumbline.json"
expect 2 "--seed" -- "$cli" validate "$x" "${columns[@]}" --seed -5
expect 2 "--cusum-odds takes two odds ratios" -- "$cli" validate "$x" "${columns[@]}" --cusum-odds 2
expect 2 "--cusum-odds takes two odds ratios" -- "$cli" validate "$x" "${columns[@]}" --cusum-odds 2,abc
expect 2 "--cusum-odds takes two odds ratios: the first from 1.1 to 20" -- "$cli" validate "$x" "${columns[@]}" --cusum-odds 0.5,2
# Odds ratios so near 1 that a chart could never signal are refused.
expect 2 "nearer 1 a chart cannot signal" -- "$cli" validate "$x" "${columns[@]}" --cusum-odds 1.0001,0.9999
expect 2 "--cusum-years must lie between 0.1 and 50" -- "$cli" validate "$x" "${columns[@]}" --cusum-years 1000000
# The capacity's bound and its number form are said alike (plain digits, no exponent).
expect 2 "at most 1000000000" -- "$cli" validate "$x" "${columns[@]}" --capacity 0/week
expect 2 "no exponent" -- "$cli" validate "$x" "${columns[@]}" --capacity 1e9/day
expect 2 "at most 1000000000" -- "$cli" validate "$x" "${columns[@]}" --capacity 1000000001/day

echo "== 6. a changed or unfingerprinted input is a warning of the result"
edit nohash 'del a["inputs"][0]["sha256"]'
expect 0 "" -- "$cli" validate --settings "$work/inputs/nohash.plumbline.json" --json "$work/out/nohash.json"
grep -q "records no SHA-256" "$work/out/nohash.json" && echo "ok: a missing SHA-256 is in the result's warnings" \
  || { echo "FAIL: no warning for a missing SHA-256"; failures=$((failures+1)); }
expect 2 "--strict-inputs" -- "$cli" validate --settings "$work/inputs/nohash.plumbline.json" --strict-inputs

echo "== 7. the CSV tables are written as a set"
mkdir -p "$work/out/tables/settings.csv" # a folder where a table should go
expect 2 "could not be put in place" -- "$cli" validate "$x" "${columns[@]}" --csv-dir "$work/out/tables"

echo "== 9-10. files that are not tables, and messages that say what is wrong"
head -c 30000000 /dev/zero | tr '\0' 'x' > "$work/out/oneline.csv"
out=$( { timeout 60 /usr/bin/time -f "peak_kb=%M" "$cli" validate "$work/out/oneline.csv" "${columns[@]}" >/dev/null; } 2>&1 )
peak=$(sed -nE 's/.*peak_kb=([0-9]+).*/\1/p' <<<"$out")
# (A sanitizer build's shadow memory makes its peak meaningless: only the message is checked there.)
[[ -n ${PLUMBLINE_SANITIZED:-} ]] && peak=0
[[ $out == *"longer than 1048576 bytes"* && ${peak:-999999} -lt 80000 ]] \
  && echo "ok: a 30 MB line is refused in bounded memory (peak ${peak} KB)" \
  || { echo "FAIL: long line: $out"; failures=$((failures+1)); }
expect 2 "this is a folder" -- "$cli" validate "$work/out" "${columns[@]}"
printf 'readmitted_30d,supplier_score\n' > "$work/out/header.csv"
expect 2 "no data rows" -- "$cli" validate "$work/out/header.csv" "${columns[@]}"
printf 'encounter_id,supplier_score\nA,0.2\nA,0.3\nB,0.4\nB,0.5\n' > "$work/out/dup.csv"
printf 'encounter_id,readmitted_30d\nA,1\nB,0\n' > "$work/out/dup-outcomes.csv"
expect 3 "none of the 4 rows can be used" -- "$cli" validate "$work/out/dup.csv" --outcomes "$work/out/dup-outcomes.csv" \
  --id encounter_id "${columns[@]}"
printf 'readmitted_30d,supplier_score\n1,0.5\n0,0.25\n' | iconv -f UTF-8 -t UTF-16LE > "$work/out/utf16.csv"
expect 2 "UTF-16" -- "$cli" validate "$work/out/utf16.csv" "${columns[@]}"
printf 'readmitted_30d,supplier_score\n1,0.5\n0,Z\xe9rich\n' > "$work/out/latin1.csv"
out=$("$cli" validate "$work/out/latin1.csv" "${columns[@]}" 2>&1 >/dev/null)
[[ $out == *'\xE9'* ]] && ! grep -q $'\xe9' <<<"$out" && echo "ok: a Latin-1 byte is shown as \\xE9, never raw" \
  || { echo "FAIL: raw bytes in the message: $out"; failures=$((failures+1)); }
# A sanitizer build reserves far more address space than any limit here allows: not under it.
if [[ -z ${PLUMBLINE_SANITIZED:-} ]]; then
  "$cli" simulate --rows 1000000 --seed 3 --out "$work/out/big.csv" >/dev/null
  out=$( (ulimit -v 150000; "$cli" validate "$work/out/big.csv" "${columns[@]}") 2>&1 >/dev/null ); status=$?
  [[ $status -eq 2 && $out == *"ran out of memory"* && $out == *"rows"* ]] && echo "ok: running out of memory says rows and memory needed" \
    || { echo "FAIL: out of memory: exit $status $out"; failures=$((failures+1)); }
  rm -f "$work/out/big.csv"
fi

echo "== 11. bidirectional controls are shown, not obeyed"
printf 'readmitted_30d,supplier_score,site\n1,0.5,A\xe2\x80\xaegnp.exe\n0,0.25,B\n1,0.7,A\xe2\x80\xaegnp.exe\n0,0.1,B\n' > "$work/out/bidi.csv"
"$cli" validate "$work/out/bidi.csv" "${columns[@]}" --group site --min-cell 1 --csv-dir "$work/out/bidi" --report "$work/out/bidi.html" >/dev/null 2>&1
if grep -rq $'\xe2\x80\xae' "$work/out/bidi" "$work/out/bidi.html"; then echo "FAIL: a raw U+202E reached a report"; failures=$((failures+1))
elif grep -rq 'U+202E' "$work/out/bidi" "$work/out/bidi.html"; then echo "ok: U+202E is written as <U+202E>"
else echo "FAIL: the bidi label is missing from the report"; failures=$((failures+1)); fi

echo "== 12. numbers too small for a double are read one way"
printf 'readmitted_30d,supplier_score\n1,1e-400\n0,-1e-310\n1,0.5\n0,0.25\n' > "$work/out/tiny.csv"
expect 0 "" -- "$cli" validate "$work/out/tiny.csv" "${columns[@]}" --json "$work/out/tiny.json"
/usr/bin/python3 -c "
import json, sys
r = json.load(open(sys.argv[1]))
assert r['cohort']['rows_used'] == 4, r['cohort']
assert any('2 scores are nearer to 0' in w for w in r['warnings']), r['warnings']
print('ok: 1e-400 and -1e-310 are both read as 0 and counted')" "$work/out/tiny.json" || failures=$((failures+1))

after=$(fingerprints)
[[ "$before" == "$after" ]] && echo "ok: no input changed" || { echo "FAIL: an input file changed"; failures=$((failures+1)); }
echo "$failures failure(s)"
[[ $failures -eq 0 ]]
