#!/usr/bin/env bash
# Benchmark harness (not part of ctest): reports numbers, never pass/fail.
#   tests/benchmarks/run_benchmarks.sh BUILD_DIR      (or: ./plumbline.sh bench)
# On a 1,000,000-row simulated cohort: intake against pandas.read_csv, and the whole metric panel
# (two models, ICI included) against the Python peer (scikit-learn + statsmodels computing C,
# Brier, O/E, calibration intercept and slope).
set -euo pipefail
build=${1:-build}
work="$build/bench"
mkdir -p "$work"
data="$work/cohort-1m.csv"
if [[ ! -f $data ]]; then
  "$build/app/plumbline-cli" simulate --rows 1000000 --seed 7 --out "$data" >/dev/null
fi
echo "machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //')"
echo "file: $data ($(du -m "$data" | cut -f1) MB)"
echo
echo "== plumbline intake (2 score columns, audit, SHA-256), 5 runs"
plumbline=$("$build/tests/benchmarks/plumbline-bench" intake "$data" 5 | tee /dev/stderr | tail -1)
echo
echo "== pandas.read_csv (Debian python3-pandas), 3 runs"
pandas=$(/usr/bin/python3 - "$data" <<'PY'
import resource, statistics, sys, time
import pandas as pd
times = []
for _ in range(3):
    start = time.perf_counter()
    frame = pd.read_csv(sys.argv[1])
    times.append(time.perf_counter() - start)
peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
print(f"pandas read_csv: rows={len(frame)} pandas={pd.__version__} median_s={statistics.median(times):.3f} peak_rss_mb={peak:.1f}")
PY
)
echo "$pandas"
echo
echo "== plumbline metric panel after intake, both models, 5 runs"
panel=$("$build/tests/benchmarks/plumbline-bench" panel "$data" 5 | tee /dev/stderr | tail -1)
echo
echo "== Python peer: C, Brier, O/E, intercept, slope for both models (after read_csv), 3 runs"
peer=$(/usr/bin/python3 - "$data" <<'PY'
import statistics, sys, time
import numpy as np, pandas as pd, statsmodels.api as sm
from sklearn.metrics import brier_score_loss, roc_auc_score
frame = pd.read_csv(sys.argv[1])
frame = frame[frame.readmitted_30d.notna()]
for column in ("supplier_score", "local_score"):
    frame[column] = pd.to_numeric(frame[column], errors="coerce")
frame = frame.dropna(subset=["supplier_score", "local_score"])
frame = frame[(frame.supplier_score >= 0) & (frame.supplier_score <= 1)]
y = (frame.readmitted_30d == "yes").to_numpy().astype(int)
times = []
for _ in range(3):
    start = time.perf_counter()
    for column in ("supplier_score", "local_score"):
        p = frame[column].to_numpy()
        lp = np.log(p / (1 - p))
        roc_auc_score(y, p); brier_score_loss(y, p); y.sum() / p.sum()
        sm.GLM(y, np.ones((len(y), 1)), family=sm.families.Binomial(), offset=lp).fit()
        sm.Logit(y, sm.add_constant(lp)).fit(disp=0)
    times.append(time.perf_counter() - start)
print(f"python peer: rows={len(y)} median_s={statistics.median(times):.3f}")
PY
)
echo "$peer"
echo
echo "== plumbline bootstrap, supplier score, B = 1000, 2 threads: without and with ICI and both bands"
boot=$("$build/tests/benchmarks/plumbline-bench" bootstrap "$data" 1000 | tee /dev/stderr)
bootcurve=$("$build/tests/benchmarks/plumbline-bench" bootstrap "$data" 1000 curve | tee /dev/stderr)
echo
echo "== Python peer bootstrap: resample rows, recompute C, Brier, O/E, intercept, slope; 3 replicates"
# The peer's loop on a cohort file: seconds per replicate, extrapolated to 1000.
peer_bootstrap() {
  /usr/bin/python3 - "$1" <<'PY'
import sys, time
import numpy as np, pandas as pd, statsmodels.api as sm
from sklearn.metrics import brier_score_loss, roc_auc_score
frame = pd.read_csv(sys.argv[1], usecols=["supplier_score", "readmitted_30d"])
frame["supplier_score"] = pd.to_numeric(frame["supplier_score"], errors="coerce")
frame = frame.dropna()
frame = frame[(frame.supplier_score >= 0) & (frame.supplier_score <= 1)]
y_all = (frame.readmitted_30d == "yes").to_numpy().astype(int)
p_all = frame.supplier_score.to_numpy()
rng = np.random.default_rng(1)
start = time.perf_counter()
for _ in range(3):
    rows = rng.integers(0, len(y_all), len(y_all))
    y, p = y_all[rows], p_all[rows]
    lp = np.log(p / (1 - p))
    roc_auc_score(y, p); brier_score_loss(y, p); y.sum() / p.sum()
    sm.GLM(y, np.ones((len(y), 1)), family=sm.families.Binomial(), offset=lp).fit()
    sm.Logit(y, sm.add_constant(lp)).fit(disp=0)
per = (time.perf_counter() - start) / 3
print(f"python peer bootstrap: per_replicate_s={per:.3f} extrapolated_1000_s={per * 1000:.0f}")
PY
}
bootpeer=$(peer_bootstrap "$data")
echo "$bootpeer"
echo
boot_s=$(sed -E 's/.*wall_s=([0-9.]+).*/\1/' <<<"$boot")
bootcurve_s=$(sed -E 's/.*wall_s=([0-9.]+).*/\1/' <<<"$bootcurve")
bootmem=$(sed -E 's/.*extra_bytes_per_row=([0-9.]+).*/\1/' <<<"$bootcurve")
bootpeer_s=$(sed -E 's/.*extrapolated_1000_s=([0-9.]+).*/\1/' <<<"$bootpeer")
panel_s=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$panel")
peer_s=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$peer")
ours=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$plumbline")
theirs=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$pandas")
rss=$(sed -E 's/.*rss_over_file=([0-9.]+).*/\1/' <<<"$plumbline")
# CPU per replicate from two runs, so the fixed part (the jackknife for BCa's acceleration) drops
# out: prints "per-replicate-ms fixed-s".
replicate_cost() {
  local short long
  short=$("$build/tests/benchmarks/plumbline-bench" bootstrap "$1" 20 curve | tee /dev/stderr)
  long=$("$build/tests/benchmarks/plumbline-bench" bootstrap "$1" 220 curve | tee /dev/stderr)
  awk -v a="$(sed -E 's/.*cpu_s=([0-9.]+).*/\1/' <<<"$short")" -v b="$(sed -E 's/.*cpu_s=([0-9.]+).*/\1/' <<<"$long")" \
    'BEGIN { printf "%.1f %.2f\n", (b - a) / 200 * 1000, a - 20 * (b - a) / 200 }'
}
echo "== continuous risks: 1,000,000 rows written with 6 decimals (about 440,000 distinct risks)"
medium="$work/cohort-1m-6dp.csv"
if [[ ! -f $medium ]]; then
  "$build/app/plumbline-cli" simulate --rows 1000000 --seed 7 --decimals 6 --out "$medium" >/dev/null
fi
read -r per_replicate_ms fixed_s < <(replicate_cost "$medium")
medium_run=$( { /usr/bin/time -f "cli B=1000: wall_s=%e" "$build/app/plumbline-cli" validate "$medium" --outcome readmitted_30d \
  --score supplier_score --bootstrap 1000 >/dev/null; } 2>&1 | tail -1 | tee /dev/stderr)
wall_1000_s=$(sed -E 's/.*wall_s=([0-9.]+).*/\1/' <<<"$medium_run")
medium_peer=$(peer_bootstrap "$medium" | tee /dev/stderr)
medium_peer_s=$(sed -E 's/.*extrapolated_1000_s=([0-9.]+).*/\1/' <<<"$medium_peer")
echo
echo "== continuous risks: 1,000,000 rows written with 9 decimals (nearly every risk distinct)"
continuous="$work/cohort-1m-continuous.csv"
if [[ ! -f $continuous ]]; then
  "$build/app/plumbline-cli" simulate --rows 1000000 --seed 7 --decimals 9 --out "$continuous" >/dev/null
fi
read -r distinct_per_replicate_ms distinct_fixed_s < <(replicate_cost "$continuous")
echo
echo "== the window's path on the continuous cohort, B = 200 (offscreen, fresh settings): Run to first charts, Run to end; the CLI's same run"
window_run=$(QT_QPA_PLATFORM=offscreen XDG_CONFIG_HOME=$(mktemp -d) "$build/tests/benchmarks/plumbline-window-bench" "$continuous" 200 2>/dev/null | tail -1 | tee /dev/stderr)
cli_run=$( { /usr/bin/time -f "cli: wall_s=%e" "$build/app/plumbline-cli" validate "$continuous" --outcome readmitted_30d \
  --score supplier_score --bootstrap 200 >/dev/null; } 2>&1 | tail -1 | tee /dev/stderr)
first_charts=$(sed -E 's/.*first_charts_s=([0-9.]+).*/\1/' <<<"$window_run")
window_total=$(sed -E 's/.*total_s=([0-9.]+).*/\1/' <<<"$window_run")
cli_total=$(sed -E 's/.*wall_s=([0-9.]+).*/\1/' <<<"$cli_run")
echo
echo "== 10,000,000 rows, 9 decimals, 2 models, --group hospital, --period discharge_date, no bootstrap: whole CLI run"
large="$work/cohort-10m.csv"
if [[ ! -f $large ]]; then
  "$build/app/plumbline-cli" simulate --rows 10000000 --seed 7 --decimals 9 --out "$large" >/dev/null
fi
large_run=$( { /usr/bin/time -f "large: wall_s=%e peak_kb=%M" "$build/app/plumbline-cli" validate "$large" \
  --outcome readmitted_30d --score supplier_score --score local_score --group hospital --period discharge_date \
  --bootstrap 0 --json "$work/large-result.json" >/dev/null; } 2>&1 | tail -1 | tee /dev/stderr)
large_wall=$(sed -E 's/.*wall_s=([0-9.]+).*/\1/' <<<"$large_run")
large_peak_gb=$(sed -E 's/.*peak_kb=([0-9]+).*/\1/' <<<"$large_run" | awk '{ printf "%.2f", $1 / 1024 / 1024 }')
echo
echo "== sample-size planner, one answer per typed change (63 changes)"
planner=$("$build/tests/benchmarks/plumbline-bench" planner | tee /dev/stderr)
planner_mean=$(sed -E 's/.*mean_ms=([0-9.]+).*/\1/' <<<"$planner")
planner_max=$(sed -E 's/.*max_ms=([0-9.]+).*/\1/' <<<"$planner")
echo
printf '%-34s %10s %12s\n' "step" "median s" "goal"
printf '%-34s %10s %12s\n' "intake, 1,000,000 rows" "$ours" "<= 0.5 s"
printf '%-34s %10s %12s\n' "peak memory / file size" "$rss" "<= 3"
printf '%-34s %10s %12s\n' "pandas.read_csv, same file" "$theirs" "-"
awk -v a="$ours" -v b="$theirs" 'BEGIN { printf "%-34s %10.1fx\n", "pandas time / plumbline time", b / a }'
printf '%-34s %10s %12s\n' "metric panel, 2 models, with ICI" "$panel_s" "<= 0.6 s"
printf '%-34s %10s %12s\n' "Python peer (5 metrics, 2 models)" "$peer_s" "-"
awk -v a="$panel_s" -v b="$peer_s" 'BEGIN { printf "%-34s %10.1fx\n", "peer time / plumbline panel time", b / a }'
printf '%-34s %10s %12s\n' "bootstrap B=1000, no ICI" "$boot_s" "<= 6 s"
printf '%-34s %10s %12s\n' "bootstrap B=1000, ICI + bands" "$bootcurve_s" "<= 15 s"
printf '%-34s %10s %12s\n' "  extra memory, bytes per row" "$bootmem" "few"
printf '%-34s %10s %12s\n' "Python peer, 5 metrics, B=1000" "$bootpeer_s" "-"
awk -v a="$boot_s" -v b="$bootpeer_s" 'BEGIN { printf "%-34s %10.0fx\n", "peer time / plumbline bootstrap", b / a }'
printf '%-34s %10s %12s\n' "planner, mean / slowest answer, ms" "$planner_mean / $planner_max" "<= 50 ms"
printf '%-34s %10s %12s\n' "6 decimals 1M: CPU ms per replicate" "$per_replicate_ms" "<= 15"
printf '%-34s %10s %12s\n' "6 decimals 1M: fixed part, CPU s" "$fixed_s" "<= 0.3"
printf '%-34s %10s %12s\n' "6 decimals 1M: B=1000 CLI wall, s" "$wall_1000_s" "<= 9"
awk -v a="$wall_1000_s" -v b="$medium_peer_s" 'BEGIN { printf "%-34s %10.0fx %12s\n", "  Python peer loop / that run", b / a, ">= 200x" }'
printf '%-34s %10s %12s\n' "9 decimals 1M: CPU ms per replicate" "$distinct_per_replicate_ms" "-"
printf '%-34s %10s %12s\n' "9 decimals 1M: fixed part, CPU s" "$distinct_fixed_s" "-"
printf '%-34s %10s %12s\n' "10M rows, 2 models, group+period, wall" "$large_wall" "<= 8"
printf '%-34s %10s %12s\n' "  peak memory, GB" "$large_peak_gb" "<= 0.8"
printf '%-34s %10s %12s\n' "window: Run to first charts, s" "$first_charts" "<= 2"
awk -v a="$window_total" -v b="$cli_total" 'BEGIN { printf "%-34s %10s %12s\n", "window total / CLI total (B=200)", sprintf("%.2f", a / b), "<= 1.10" }'
