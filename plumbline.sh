#!/usr/bin/env bash
# Plumbline's one entry point for people and CI.
#   ./plumbline.sh run     install what is missing, build, open the sample cohort
#   ./plumbline.sh test    install what is missing, build, run every test (ctest)
#   ./plumbline.sh bench   install what is missing, build, run the benchmark harness
#   ./plumbline.sh sanitize   the core and CLI tests on an ASan + UBSan build (part of test)
#   ./plumbline.sh fuzz [S]   the libFuzzer harnesses, S seconds each (part of test: 45 s each, four harnesses)
#   ./plumbline.sh mutants [--only ID,...] [--skip RE] [--check]
#                  mutation score of the tests (not part of test): each mutation of
#                  tests/mutants/mutations.txt applied in a scratch copy (build-mutants/), rebuilt
#                  and tested; the table and score also go to build-mutants/mutants-result.txt
# A second call is quick: installed packages are skipped and the build is incremental.
set -euo pipefail
cd "$(dirname "$(readlink -f "$0")")"

BUILD_PACKAGES=(g++ cmake ninja-build pkg-config libssl-dev
  qt6-base-dev qt6-charts-dev qt6-svg-dev libqt6opengl6-dev libgl-dev
  libeigen3-dev libboost-dev nlohmann-json3-dev libcli11-dev libxlsxwriter-dev catch2
  libreadstat-dev libminizip-dev libexpat1-dev libpq-dev libsqlite3-dev unixodbc-dev)
# Reference libraries for the cross-check tests and the benchmark peers (Debian's, not pip's);
# a PostgreSQL server and ODBC drivers for the database tests, ReadStat's tool for the fixtures.
TEST_PACKAGES=(python3 python3-pandas python3-sklearn python3-statsmodels python3-scipy python3-jsonschema python3-openpyxl dpkg-dev poppler-utils time
  readstat postgresql odbc-postgresql libsqliteodbc unixodbc)
# The fuzzing build needs clang with libFuzzer; clang 19 is the first of Debian 12's that
# compiles libstdc++ 12's <expected>.
CHECK_PACKAGES=(clang-19 libclang-rt-19-dev)

say() { printf '\033[1mplumbline:\033[0m %s\n' "$*"; }

install_missing() {
  local missing=() p
  for p in "$@"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
  done
  [[ ${#missing[@]} -eq 0 ]] && return 0
  say "installing ${#missing[@]} Debian packages: ${missing[*]}"
  local sudo=()
  if [[ $(id -u) -ne 0 ]]; then
    command -v sudo >/dev/null || { say "need root or sudo to install: ${missing[*]}"; exit 1; }
    sudo=(sudo)
  fi
  "${sudo[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}"
}

build() {
  if [[ ! -f build/CMakeCache.txt ]]; then
    cmake -S . -B build -G Ninja -DCMAKE_BUILD_TYPE=Release
  fi
  cmake --build build --parallel "$(nproc)"
}

# The core and CLI tests on a build with AddressSanitizer (leaks included) and
# UndefinedBehaviorSanitizer; every finding fails. The bootstrap coverage simulation and the
# latency checks are left to the optimised build (too slow, or timing, under instrumentation).
sanitize() {
  if [[ ! -f build-sanitize/CMakeCache.txt ]]; then
    cmake -S . -B build-sanitize -G Ninja -DCMAKE_BUILD_TYPE=None -DPLUMBLINE_SANITIZE=ON
  fi
  cmake --build build-sanitize --parallel "$(nproc)" --target core_tests plumbline-cli
  export ASAN_OPTIONS=detect_leaks=1:strict_string_checks=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 PLUMBLINE_SANITIZED=1
  say "sanitized core tests"
  build-sanitize/tests/core_tests "~[coverage]~[timing]~[slow]"
  say "sanitized CLI tests"
  local cli=build-sanitize/app/plumbline-cli
  bash tests/cli/hostile_inputs_test.sh "$cli" sample-data
  bash tests/cli/cli_exit_statuses_test.sh "$cli" sample-data
  bash tests/cli/analysis_file_round_trip_test.sh "$cli" sample-data
  unset ASAN_OPTIONS UBSAN_OPTIONS PLUMBLINE_SANITIZED
}

# The libFuzzer harnesses of the intake and the analysis-file reader, from the committed seeds
# with a fixed seed, after replaying every committed regression input.
fuzz() {
  if [[ ! -f build-fuzz/CMakeCache.txt ]]; then
    cmake -S . -B build-fuzz -G Ninja -DCMAKE_BUILD_TYPE=None -DCMAKE_CXX_COMPILER=clang++-19 -DPLUMBLINE_FUZZ=ON -DBUILD_TESTING=OFF
  fi
  cmake --build build-fuzz --parallel "$(nproc)"
  tests/fuzz/run_fuzzers.sh build-fuzz "${1:-60}"
}

has_display() { [[ -n ${DISPLAY:-} || -n ${WAYLAND_DISPLAY:-} ]]; }

run_headless_sample() {
  local out=plumbline-output
  mkdir -p "$out"
  say "no display (or no workbench yet): validating the sample cohort headless"
  build/app/plumbline-cli validate sample-data/readmissions.csv \
    --outcome readmitted_30d --score supplier_score --score local_score \
    --group hospital --group payer \
    --json "$out/sample-validation.json" | tee "$out/sample-validation.txt"
  say "outputs written to $(pwd)/$out/ (sample-validation.json, sample-validation.txt)"
}

cmd=${1:-}
case "$cmd" in
  run)
    install_missing "${BUILD_PACKAGES[@]}"
    build
    if has_display && [[ -x build/app/plumbline ]]; then
      exec build/app/plumbline sample-data/readmissions.csv --outcome readmitted_30d \
        --score supplier_score --score local_score --group hospital --group payer
    fi
    run_headless_sample
    ;;
  test)
    install_missing "${BUILD_PACKAGES[@]}" "${TEST_PACKAGES[@]}" "${CHECK_PACKAGES[@]}"
    build
    ctest --test-dir build --output-on-failure --schedule-random -j "$(nproc)"
    sanitize
    fuzz 45
    ;;
  sanitize)
    install_missing "${BUILD_PACKAGES[@]}" "${TEST_PACKAGES[@]}"
    sanitize
    ;;
  fuzz)
    install_missing "${BUILD_PACKAGES[@]}" "${CHECK_PACKAGES[@]}"
    fuzz "${2:-60}"
    ;;
  mutants)
    install_missing "${BUILD_PACKAGES[@]}" "${TEST_PACKAGES[@]}"
    shift
    exec python3 tests/mutants/run_mutants.py "$@"
    ;;
  bench)
    install_missing "${BUILD_PACKAGES[@]}" "${TEST_PACKAGES[@]}"
    build
    tests/benchmarks/run_benchmarks.sh build
    ;;
  *)
    echo "usage: ./plumbline.sh run | test | bench | sanitize | fuzz [SECONDS] | mutants [--only ID,...] [--skip RE] [--check]" >&2
    exit 2
    ;;
esac
