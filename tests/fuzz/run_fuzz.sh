#!/usr/bin/env bash
# run_fuzz.sh [SECONDS] [EACH] — fuzz every parser of the project: the scenario loader and the
# window's action-script parser.
#
# SECONDS (default 60) is the total, shared between the two targets (two thirds to the scenario
# loader, whose input space is larger); with EACH given as "each", every target gets SECONDS
# (the long local run: `bash tests/fuzz/run_fuzz.sh 600 each`).
#
# Configures build-fuzz/ with clang-14 (FLOATPITCH_FUZZ=ON: address and undefined-behaviour
# sanitizers, toml++ compiled in), builds only fuzz_scenario and fuzz_script, and runs
# fuzz_scenario over a fresh copy of the seed corpus (tests/fuzz/corpus) plus every
# scenarios/**/*.toml, with a dictionary of the scenario keys taken from the key table, then
# fuzz_script over tests/fuzz/script_corpus with a dictionary of the script's words. Any crash,
# sanitizer report, leak or timeout fails the script; the input that caused it is left in
# build-fuzz/artifacts/ (build-fuzz/artifacts-script/ for the script parser).
set -euo pipefail
total="${1:-60}"
if [[ "${2:-}" == each ]]; then
  seconds=$total; script_seconds=$total
else
  seconds=$(( total * 2 / 3 )); script_seconds=$(( total - seconds ))
  (( seconds >= 1 && script_seconds >= 1 )) || { echo "run_fuzz.sh: give at least 3 seconds"; exit 2; }
fi
root="$(cd "$(dirname "$0")/../.." && pwd)"
build="$root/build-fuzz"

echo "== configure and build fuzz_scenario and fuzz_script (clang-14)"
CC=clang-14 CXX=clang++-14 cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER=clang++-14 \
  -DCMAKE_BUILD_TYPE=RelWithDebInfo -DFLOATPITCH_FUZZ=ON -DFLOATPITCH_WINDOW=OFF \
  -DFLOATPITCH_TESTS=OFF -DFLOATPITCH_BENCH=OFF > "$build.log" 2>&1 || { cat "$build.log"; exit 1; }
cmake --build "$build" -j2 --target fuzz_scenario fuzz_script >> "$build.log" 2>&1 || { tail -60 "$build.log"; exit 1; }

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
echo "fuzzing the scenario loader found nothing in $seconds s"

# The window's action scripts: seeds in tests/fuzz/script_corpus, words of the format as dictionary.
scorpus="$build/script_corpus"
sartifacts="$build/artifacts-script"
rm -rf "$scorpus" "$sartifacts"
mkdir -p "$scorpus" "$sartifacts"
cp "$root"/tests/fuzz/script_corpus/* "$scorpus"/
sdict="$build/script.dict"
printf '"%s"\n' at let_go take_hold gust tab pulse cg set reset speed jump span view exaggeration pause \
  panel roots hover 1-cosine one_minus_cosine sharp sharp_edge ramp vertical horizontal superposed \
  side_by_side scenario edit inputs analysis airframe all slow m/s kt ft m deg rad N lbf s '#' > "$sdict"
echo "== fuzz the script parser for $script_seconds s over $(ls "$scorpus" | wc -l) seed files"
"$build/fuzz_script" -max_total_time="$script_seconds" -timeout=10 -rss_limit_mb=2048 \
  -dict="$sdict" -artifact_prefix="$sartifacts/" -print_final_stats=1 "$scorpus"
echo "fuzzing the script parser found nothing in $script_seconds s"
