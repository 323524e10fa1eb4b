#!/usr/bin/env bash
# test.sh — set up on a fresh Debian 12 machine (as root), build, and run the whole test suite:
# the unit and published-value tests (CTest), the same tests under address and undefined-
# behaviour sanitizers, and a bounded fuzz run of the parsers (scenario loader, window scripts).
# FLOATPITCH_FUZZ_SECONDS (default 60) sets the fuzz time; FLOATPITCH_QUICK=1 skips the
# sanitizer build and the fuzz run (for a quick local check).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/deps.sh test
jobs=2

echo "== build (release)"
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release > build.log 2>&1 || { cat build.log; exit 1; }
cmake --build build -j$jobs >> build.log 2>&1 || { tail -80 build.log; exit 1; }
echo "== tests (release)"
(cd build && ctest --output-on-failure -j$jobs)

if [[ "${FLOATPITCH_QUICK:-0}" != 1 ]]; then
  # -O1 -g1: the sanitized build compiles faster than -O2 -g and still names
  # file and line in every report (CI's time limit is shared by both builds)
  echo "== tests (address + undefined-behaviour sanitizers)"
  cmake -S . -B build-asan -DCMAKE_BUILD_TYPE=Debug -DCMAKE_CXX_FLAGS_DEBUG="-O1 -g1" -DFLOATPITCH_SANITIZE=ON -DFLOATPITCH_WINDOW=OFF \
        -DFLOATPITCH_BENCH=OFF > build-asan.log 2>&1 || { cat build-asan.log; exit 1; }
  cmake --build build-asan -j$jobs >> build-asan.log 2>&1 || { tail -80 build-asan.log; exit 1; }
  (cd build-asan && ASAN_OPTIONS=detect_leaks=0 UBSAN_OPTIONS=halt_on_error=1:print_stacktrace=1 \
     ctest --output-on-failure -j$jobs -E 'window|readme_commands')

  echo "== fuzz the scenario loader and the window script parser (${FLOATPITCH_FUZZ_SECONDS:-60} s in all)"
  bash tests/fuzz/run_fuzz.sh "${FLOATPITCH_FUZZ_SECONDS:-60}"
fi
echo "all test stages passed"
