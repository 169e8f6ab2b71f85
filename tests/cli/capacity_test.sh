#!/usr/bin/env bash
# --capacity end to end: the built program on the sample cohort with a share (10%) and a rate
# (40/week over the discharge dates), its JSON and printed lines checked against counts made
# independently from the CSV with pandas 1.5 (/usr/bin/python3); and every bad capacity text
# refused with exit 2 and a message saying what to do. The sample cohort may change: only
# properties are asserted, never numbers written here.
set -uo pipefail
cli=$1
samples=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
sample=$samples/readmissions.csv
scores=(--score supplier_score --score local_score)

run() { # run NAME -- command... (stdout to NAME.out)
  local name=$1; shift 2
  if ! "$@" >"$work/$name.out" 2>"$work/$name.err"; then
    echo "FAIL: $name did not run: $*"; tail -3 "$work/$name.err"; failures=$((failures+1))
  else
    echo "ok: $name ran"
  fi
}
run share -- "$cli" validate "$sample" --outcome readmitted_30d "${scores[@]}" --capacity 10% --json "$work/share.json"
run rate -- "$cli" validate "$sample" --outcome readmitted_30d "${scores[@]}" --capacity 40/week --period discharge_date \
  --json "$work/rate.json" --csv-dir "$work/rate-tables"
run quarter -- "$cli" validate "$sample" --outcome readmitted_30d "${scores[@]}" --capacity 160/month --period discharge_date \
  --period-unit quarter --json "$work/quarter.json"

/usr/bin/python3 - "$sample" "$work" <<'PY' || failures=$((failures+1))
import json, math, sys
import pandas as pd

sample, work = sys.argv[1], sys.argv[2]
raw = pd.read_csv(sample, dtype=str, keep_default_na=False)
# The rows the intake uses: an outcome of yes or no and both scores numbers in [0, 1].
df = pd.DataFrame({"y": raw["readmitted_30d"].str.strip()})
ok = df["y"].isin(["yes", "no"])
def number(text):
    # Python's float() rounds correctly, as the program's reader does (pandas' fast parser may not).
    try:
        return float(text.strip())
    except ValueError:
        return math.nan
for col in ["supplier_score", "local_score"]:
    df[col] = raw[col].map(number)
    ok &= df[col].between(0.0, 1.0)
df["date"] = pd.to_datetime(raw["discharge_date"], format="%Y-%m-%d", errors="coerce")
df = df[ok].copy()
df["event"] = (df["y"] == "yes").astype(int)
failures = []

def check(cond, what):
    if not cond:
        failures.append(what)

def expect_row(row, sub, col, requested, label):
    """The capacity row against counts made here: the requested-th highest risk, row by row."""
    risks = sub[col].sort_values(ascending=False).to_numpy()
    check(row["patients"] == len(sub), f"{label}: patients {row['patients']} != {len(sub)}")
    check(row["requested"] == requested, f"{label}: requested {row['requested']} != {requested}")
    if requested == 0:
        check(row["threshold"] is None and row["flagged"] == 0, f"{label}: nobody requested but something flagged")
        return
    k = min(requested, len(risks))
    kth = risks[k - 1]
    # A capacity is a ceiling: the lowest risk whose threshold flags at most k (pandas, by hand).
    candidates = [v for v in sorted(set(risks)) if int((sub[col] >= v).sum()) <= k]
    over = int((sub[col] >= kth).sum())
    if over > k:
        check(row["next_risk_down"] == kth, f"{label}: next risk down {row['next_risk_down']} != {kth}")
        check(row["tied_at_next_risk_down"] == int((sub[col] == kth).sum()), f"{label}: tied at next risk down")
        check(row["flagged_at_next_risk_down"] == over, f"{label}: flagged at next risk down")
    else:
        check(row["tied_at_next_risk_down"] == 0 and row["next_risk_down"] is None, f"{label}: ties reported without a tie")
    if not candidates:
        check(row["threshold"] is None and row["flagged"] == 0, f"{label}: nothing fits yet something flagged")
        return None
    t = candidates[0]
    flagged = sub[col] >= t
    tp = int((flagged & (sub["event"] == 1)).sum())
    n_flagged = int(flagged.sum())
    tied = int((sub[col] == t).sum())
    check(row["threshold"] == t, f"{label}: threshold {row['threshold']} != {t}")
    check(row["flagged"] == n_flagged, f"{label}: flagged {row['flagged']} != {n_flagged}")
    check(row["tied_at_threshold"] == tied, f"{label}: tied {row['tied_at_threshold']} != {tied}")
    check(row["flagged_above_ties"] == n_flagged - tied, f"{label}: above ties")
    check(row["exact"] == (n_flagged == requested), f"{label}: exact")
    check(row["tp"] == tp and row["fp"] == n_flagged - tp, f"{label}: tp/fp {row['tp']}/{row['fp']} != {tp}/{n_flagged - tp}")
    events = int(sub["event"].sum())
    check(abs(row["sensitivity"] - tp / events) < 1e-12, f"{label}: sensitivity")
    check(abs(row["ppv"] - tp / n_flagged) < 1e-12, f"{label}: ppv")
    check(abs(row["events_per_100_flagged"] - 100.0 * tp / n_flagged) < 1e-9, f"{label}: events per 100")
    # Net benefit = TP/N - FP/N * t/(1-t) (Vickers & Elkin 2006, Med Decis Making 26:565).
    nb = tp / len(sub) - (n_flagged - tp) / len(sub) * t / (1 - t)
    check(abs(row["net_benefit"] - nb) < 1e-12, f"{label}: net benefit {row['net_benefit']} != {nb}")
    # The threshold flags at most the capacity, and when it flags fewer, a tie crossing it is the reason.
    check(n_flagged <= requested and (n_flagged == k or over > k), f"{label}: fewer flagged without ties")
    return t

share = json.load(open(f"{work}/share.json"))
check(share["cohort"]["rows_used"] == len(df), f"rows used {share['cohort']['rows_used']} != pandas {len(df)}")
c = share["capacity"]
check(c["kind"] == "share" and c["asked"] == "10%", "share: kind")
check(c["periods"] == [], "share without --period has no periods")
for row, col in zip(c["models"], ["supplier_score", "local_score"]):
    check(row["model"] == col, "model order")
    expect_row(row, df, col, math.floor(0.10 * len(df) + 1e-9), f"10% {col}")

def rate_checks(path, per_unit, unit_days, quarter):
    r = json.load(open(path))
    c = r["capacity"]
    first, last = df["date"].min(), df["date"].max()
    span = (last - first).days + 1
    check(c["span_days"] == span, f"{path}: span {c['span_days']} != {span}")
    check(c["first_date"] == first.strftime("%Y-%m-%d") and c["last_date"] == last.strftime("%Y-%m-%d"), "dates")
    overall = {}
    for row, col in zip(c["models"], ["supplier_score", "local_score"]):
        overall[col] = expect_row(row, df, col, math.floor(per_unit * span / unit_days + 1e-9), f"{path} {col}")
    period = df["date"].dt.to_period("Q" if quarter else "M")
    names = sorted(period.unique())
    check(len(c["periods"]) == 2 * len(names), f"{path}: {len(c['periods'])} period rows for {len(names)} periods")
    for row in c["periods"]:
        col = row["model"]
        p = next(q for q in names if (f"{q.year}-Q{q.quarter}" if quarter else q.strftime("%Y-%m")) == row["period"])
        sub = df[period == p]
        days = (min(p.end_time.normalize(), last) - max(p.start_time, first)).days + 1
        requested = math.floor(per_unit * days / unit_days + 1e-9)
        expect_row(row, sub, col, requested, f"{path} {row['period']} {col}")
        by_overall = int((sub[col] >= overall[col]).sum())
        check(row["flagged_by_overall_threshold"] == by_overall, f"{path} {row['period']}: by overall threshold")
        # Over capacity: more than the capacity by more than the stated 10 % margin (common practice).
        check(row["overall_threshold_overflows"] == (by_overall > 1.1 * requested), f"{path} {row['period']}: overflow")
    return r

rate = rate_checks(f"{work}/rate.json", 40, 7, False)
# The report's capacity table holds the same counts where it prints them (the small-cell rule
# may suppress a period's; the whole cohort's are large).
import csv
with open(f"{work}/rate-tables/capacity.csv", newline="", encoding="utf-8") as f:
    printed = list(csv.DictReader(f))
check(len(printed) == len(rate["capacity"]["models"]) + len(rate["capacity"]["periods"]), "capacity table rows")
for row in rate["capacity"]["models"]:
    line = next(p for p in printed if p["Model"] == row["model"] and p["Period"] == "all patients")
    check(line["TP"] == str(row["tp"]) and line["Flagged"] == str(row["flagged"]), f"report table: {row['model']} counts")
rate_checks(f"{work}/quarter.json", 160, 365.25 / 12, True)
if failures:
    print("FAIL: " + "\n  ".join(failures[:20]))
    sys.exit(1)
print("ok: capacity thresholds, counts and metrics agree with pandas, overall and per period")
PY

# The printed summary says the capacity, the rule and, per period, the overflow column.
grep -q "^Capacity 10% (flagged if risk >= threshold" "$work/share.out" || { echo "FAIL: no capacity line in the summary"; failures=$((failures+1)); }
grep -q "note: A threshold chosen to flag a capacity" "$work/share.out" || { echo "FAIL: no capacity caution in the summary"; failures=$((failures+1)); }
# A capacity is a ceiling: every printed "capacity C patients; threshold T flags F" has F <= C.
awk '/: capacity [0-9]+ patients; threshold .* flags [0-9]+/ { c = $0; sub(/.*: capacity /, "", c); sub(/ .*/, "", c);
     f = $0; sub(/.* flags /, "", f); sub(/ .*/, "", f); n++; if (f + 0 > c + 0) bad++ }
     END { exit (n == 0 || bad > 0) }' "$work/share.out" "$work/rate.out" \
  || { echo "FAIL: a printed capacity threshold flags more than the capacity"; failures=$((failures+1)); }
grep -q "\[over capacity\]: the whole-cohort threshold flags more than the period's capacity by more than 10%" "$work/rate.out" \
  || { echo "FAIL: no legend for [over capacity]"; failures=$((failures+1)); }
grep -q "whole-cohort threshold" "$work/rate.out" || { echo "FAIL: no per-period capacity table"; failures=$((failures+1)); }

expect_refusal() { # expect_refusal "needle" -- capacity arguments...
  local needle=$1; shift 2
  local out status
  out=$("$cli" validate "$sample" --outcome readmitted_30d --score supplier_score "$@" 2>&1 >/dev/null); status=$?
  if [[ $status -ne 2 || $out != *"$needle"* || $out != *"What to do"* ]]; then
    echo "FAIL: $* gave exit $status: $out"; failures=$((failures+1))
  else
    echo "ok: $* refused"
  fi
}
expect_refusal "no exponent" -- --capacity "1e9/day"
expect_refusal "at most 1000000000" -- --capacity "0/week"
# Spaces are accepted alike before '%' and around '/'.
for spaced in "10 %" "40 / week"; do
  if "$cli" validate "$sample" --outcome readmitted_30d --score supplier_score --period discharge_date --capacity "$spaced" >/dev/null 2>&1; then
    echo "ok: --capacity '$spaced' accepted"
  else
    echo "FAIL: --capacity '$spaced' refused"; failures=$((failures+1))
  fi
done
expect_refusal "'fortnight' is none of them" -- --capacity 40/fortnight
expect_refusal "must lie above 0% and at most 100%" -- --capacity 0%
expect_refusal "must lie above 0% and at most 100%" -- --capacity 101%
expect_refusal "must be a number of patients above 0" -- --capacity -5/week
expect_refusal "has no number before '/'" -- --capacity /week
expect_refusal "needs the cohort's dates" -- --capacity 40/week

[[ $failures -eq 0 ]] || { echo "$failures failure(s)"; exit 1; }
echo "all capacity checks passed"
