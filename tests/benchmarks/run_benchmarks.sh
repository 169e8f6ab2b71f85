#!/usr/bin/env bash
# Benchmark harness (not part of ctest): reports numbers, never pass/fail.
#   tests/benchmarks/run_benchmarks.sh BUILD_DIR      (or: ./plumbline.sh bench)
# Intake of a 1,000,000-row simulated cohort, then pandas.read_csv on the same file for scale.
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
ours=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$plumbline")
theirs=$(sed -E 's/.*median_s=([0-9.]+).*/\1/' <<<"$pandas")
rss=$(sed -E 's/.*rss_over_file=([0-9.]+).*/\1/' <<<"$plumbline")
printf '%-34s %10s %12s\n' "step" "median s" "goal"
printf '%-34s %10s %12s\n' "intake, 1,000,000 rows" "$ours" "<= 0.5 s"
printf '%-34s %10s %12s\n' "peak memory / file size" "$rss" "<= 3"
printf '%-34s %10s %12s\n' "pandas.read_csv, same file" "$theirs" "-"
awk -v a="$ours" -v b="$theirs" 'BEGIN { printf "%-34s %10.1fx\n", "pandas time / plumbline time", b / a }'
