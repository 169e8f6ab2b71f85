#!/usr/bin/env bash
# Every result the CLI writes matches docs/result.schema.json, including the edge cases where
# values become null: the golden result, the sample cohort with every block filled, and small
# cohorts built here (one event, a constant score, risks that separate the outcomes, a
# contradicted risk of 0, a points score, outcomes in a second file, no bootstrap, an update).
# The cohorts are generated test inputs, not data about anyone.
set -uo pipefail
cli=$1
source=$2
schema=$source/docs/result.schema.json
validate="/usr/bin/python3 $source/tests/cli/validate_against_schema.py $schema"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
run() { # run NAME -- command... ; the command writes $work/NAME.json
  local name=$1; shift 2
  if ! "$@" >"$work/$name.log" 2>&1; then
    echo "FAIL: $name did not run: $*"; tail -3 "$work/$name.log"; failures=$((failures+1))
  fi
}
sample=$source/sample-data/readmissions.csv

# Lines of "outcome,risk_a,risk_b,group,date" from a few rules, deterministic.
/usr/bin/python3 - "$work" <<'PY'
import sys, os
w = sys.argv[1]
def write(name, rows, header="id,outcome,a,b,site,day"):
    with open(os.path.join(w, name), "w") as f:
        f.write(header + "\n")
        for i, r in enumerate(rows):
            f.write(f"p{i}," + ",".join(str(v) for v in r) + "\n")
# 40 patients, 1 event.
write("one_event.csv", [(1 if i == 0 else 0, round(0.05 + 0.01 * (i % 20), 3), round(0.04 + 0.012 * (i % 17), 3),
                         "AB"[i % 2], f"2024-0{1 + i % 6}-15") for i in range(40)])
# Every risk equal.
write("constant.csv", [(1 if i % 4 == 0 else 0, 0.25, 0.25, "AB"[i % 2], "2024-01-15") for i in range(40)])
# Risks that separate the outcomes (model a), beside an ordinary one.
write("separating.csv", [(1 if i < 10 else 0, round(0.6 + 0.01 * i, 3) if i < 10 else round(0.1 + 0.01 * (i - 10), 3),
                          round(0.2 + 0.003 * ((i * 7) % 30), 3), "AB"[i % 2], "2024-01-15") for i in range(30)])
# An event at a risk of exactly 0.
write("contradicted.csv", [(1 if i % 5 == 0 else 0, 0.0 if i == 0 else round(0.05 + 0.008 * (i % 40), 3),
                            round(0.1 + 0.005 * (i % 30), 3), "AB"[i % 2], "2024-02-15") for i in range(120)])
# Integer points scores.
write("points.csv", [(1 if (i * 37) % 7 < 2 else 0, (i * 13) % 11, (i * 5) % 9, "AB"[i % 2], "2024-03-15") for i in range(150)])
# Outcomes in a second file.
write("scores.csv", [(round(0.05 + 0.004 * (i % 100), 4), round(0.06 + 0.0035 * (i % 90), 4)) for i in range(200)], header="id,a,b")
write("outcomes.csv", [(1 if (i * 31) % 100 < 20 + (i % 100) // 5 else 0,) for i in range(200)], header="id,outcome")
PY

run golden -- cp "$source/tests/golden/validation-result.json" "$work/golden.json"
run full -- "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --score local_score --group hospital \
  --cluster hospital --period discharge_date --add-updated closed-test --bootstrap 30 --seed 3 --capacity 40/week --json "$work/full.json"
run one_event -- "$cli" validate "$work/one_event.csv" --outcome outcome --score a --score b --group site --period day \
  --cluster site --bootstrap 200 --seed 11 --json "$work/one_event.json"
run constant -- "$cli" validate "$work/constant.csv" --outcome outcome --score a --score b --bootstrap 50 --seed 1 --json "$work/constant.json"
run separating -- "$cli" validate "$work/separating.csv" --outcome outcome --score a --score b --add-updated logistic \
  --bootstrap 50 --seed 2 --json "$work/separating.json"
run contradicted -- "$cli" validate "$work/contradicted.csv" --outcome outcome --score a --score b --json "$work/contradicted.json"
run points -- "$cli" validate "$work/points.csv" --outcome outcome --score a --score b --scale points --bootstrap 50 --seed 4 \
  --capacity 10% --cluster site --json "$work/points.json"
run joined -- "$cli" validate "$work/scores.csv" --outcomes "$work/outcomes.csv" --id id --score a --score b --outcome outcome \
  --bootstrap 0 --json "$work/joined.json"
run update -- "$cli" update "$sample" --outcome readmitted_30d --score supplier_score --id encounter_id --method closed-test \
  --out "$work/updated.csv" --json "$work/update.json"

results=()
for name in golden full one_event constant separating contradicted points joined; do
  [[ -f $work/$name.json ]] && results+=("$work/$name.json")
done
$validate result "${results[@]}" || failures=$((failures+1))
[[ -f $work/update.json ]] && { $validate update_result "$work/update.json" || failures=$((failures+1)); }

# The edge cases make the nulls the schema allows: check they are nulls and not missing keys.
/usr/bin/python3 - "$work" <<'PY' || failures=$((failures+1))
import json, sys, os
w = sys.argv[1]
load = lambda n: json.load(open(os.path.join(w, n + ".json")))
bad = 0
def check(ok, what):
    global bad
    print(("ok: " if ok else "FAIL: ") + what)
    bad += not ok
sep = load("separating")
tests = sep["models"][0]["tests"]
check(tests["likelihood_ratio_joint"] is None and tests["likelihood_ratio_slope_given_intercept"] is None,
      "separating risks: the joint and slope LR tests are null")
check(tests["likelihood_ratio_calibration_in_the_large"] is not None, "separating risks: the calibration-in-the-large LR test stays")
check(sep["comparisons"][0]["metrics"]["calibration_slope_difference"]["estimate"] is None, "separating risks: slope difference null")
const = load("constant")
c = const["models"][0]["metrics"]["c_statistic"]
check(c["estimate"] == 0.5 and c["ci_lower"] is None and c["interval_note"], "constant score: C 0.5 without an interval, with a note")
check(all(p["metric"] != "c_statistic" or p["model"] != "a" for p in const["precision"]), "constant score: no precision row for C")
one = load("one_event")
oe = one["models"][0]["metrics"]["oe_ratio"]
check(oe["ci_method"] == "exact_poisson" and oe["bootstrap"] is not None, "one event: exact Poisson O/E, bootstrap kept beside it")
check(one["bootstrap"]["interval_rule"], "the bootstrap block states the interval rule")
pts = load("points")
m = pts["comparisons"][0]["metrics"]
check(m["c_statistic_difference"]["estimate"] is not None and m["idi"]["estimate"] is None, "points scores: only the C difference")
joined = load("joined")
check(joined["cohort"]["join"] is not None and load("full")["cohort"]["join"] is None, "join block filled only for two files")
check(joined["bootstrap"]["seed"] is None and joined["models"][0]["metrics"]["c_statistic"]["bootstrap"] is None,
      "no bootstrap: the bootstrap keys are null")
for name in ["full", "one_event", "joined"]:
    for model in load(name)["models"]:
        oe = model["metrics"]["oe_ratio"]
        if oe["se"] is not None:
            check(abs(oe["se"] - oe["estimate"] * oe["se_log"]) < 1e-12, f"{name}/{model['name']}: O/E se is on the ratio scale")
sys.exit(1 if bad else 0)
PY
echo "$failures failure(s)"
[[ $failures -eq 0 ]]
