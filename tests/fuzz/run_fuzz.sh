#!/usr/bin/env bash
# run_fuzz.sh [SECONDS] — fuzz the scenario loader for SECONDS (default 60).
#
# Configures build-fuzz/ with clang-14 (FLOATPITCH_FUZZ=ON: address and undefined-behaviour
# sanitizers, toml++ compiled in), builds only fuzz_scenario, and runs it over a fresh copy of
# the seed corpus (tests/fuzz/corpus) plus every scenarios/**/*.toml, with a dictionary of the
# scenario keys taken from the key table. Any crash, sanitizer report, leak or timeout fails
# the script; the input that caused it is left in build-fuzz/artifacts/.
set -euo pipefail
seconds="${1:-60}"
root="$(cd "$(dirname "$0")/../.." && pwd)"
build="$root/build-fuzz"

echo "== configure and build fuzz_scenario (clang-14)"
CC=clang-14 CXX=clang++-14 cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER=clang++-14 \
  -DCMAKE_BUILD_TYPE=RelWithDebInfo -DFLOATPITCH_FUZZ=ON -DFLOATPITCH_WINDOW=OFF \
  -DFLOATPITCH_TESTS=OFF -DFLOATPITCH_BENCH=OFF > "$build.log" 2>&1 || { cat "$build.log"; exit 1; }
cmake --build "$build" -j2 --target fuzz_scenario >> "$build.log" 2>&1 || { tail -60 "$build.log"; exit 1; }

corpus="$build/corpus"
artifacts="$build/artifacts"
rm -rf "$corpus" "$artifacts"
mkdir -p "$corpus" "$artifacts"
cp "$root"/tests/fuzz/corpus/* "$corpus"/
if [[ -d "$root/scenarios" ]]; then
  while IFS= read -r -d '' f; do
    rel="${f#"$root"/}"
    cp "$f" "$corpus/${rel//\//_}"
  done < <(find "$root/scenarios" -name '*.toml' -print0)
fi

# Dictionary: table names, short key names and choice strings from the key table.
dict="$build/scenario.dict"
{
  grep -o '\.name = "[a-z_.]*"' "$root/scenario/keys.cpp" | sed 's/.*"\(.*\)"/\1/' | tr '.' '\n'
  grep -o '\.choices = {[^}]*}' "$root/scenario/keys.cpp" | grep -o '"[a-z_]*"' | tr -d '"'
  printf '%s\n' include event gust auto deg kt ft lb lbf in % true false '[[' ']]'
} | sort -u | sed 's/.*/"&"/' > "$dict"

echo "== fuzz for $seconds s over $(ls "$corpus" | wc -l) seed files"
"$build/fuzz_scenario" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
  -dict="$dict" -artifact_prefix="$artifacts/" -print_final_stats=1 "$corpus"
echo "fuzzing found nothing in $seconds s"
