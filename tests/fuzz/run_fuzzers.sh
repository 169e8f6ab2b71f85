#!/usr/bin/env bash
# Runs each libFuzzer harness for a fixed time from the committed seed corpus (with a fixed
# seed, so a run can be repeated), after replaying every committed regression input once.
#   tests/fuzz/run_fuzzers.sh BUILD_DIR [SECONDS]
# A crash leaves its input in BUILD_DIR/fuzz-artifacts/; copy it into tests/fuzz/regressions/
# <harness>/ with the fix, so that it is replayed on every run from then on.
set -euo pipefail
build=$(cd "$1" && pwd)
seconds=${2:-60}
here=$(cd "$(dirname "$0")" && pwd)
artifacts="$build/fuzz-artifacts"
mkdir -p "$artifacts"
for harness in intake_fuzzer analysis_file_fuzzer statistical_file_fuzzer xlsx_fuzzer; do
  corpus=${harness%_fuzzer}
  regressions="$here/regressions/$corpus"
  if compgen -G "$regressions/*" >/dev/null; then
    echo "== $harness: replaying $(ls "$regressions" | wc -l) regression inputs"
    "$build/tests/fuzz/$harness" -runs=1 "$regressions"/* 2>&1 | tail -n 2
  fi
  # The working corpus grows during the run; the committed seeds are never changed.
  work=$(mktemp -d)
  cp "$here/corpus/$corpus"/* "$work/"
  echo "== $harness: $seconds s from $(ls "$work" | wc -l) seeds"
  (cd "$work" && "$build/tests/fuzz/$harness" -seed=1 -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
      -max_len=65536 -artifact_prefix="$artifacts/$harness-" -print_final_stats=1 "$work" 2>&1 | tail -n 12)
  rm -rf "$work"
done
echo "fuzzing: no crash, hang or leak"
