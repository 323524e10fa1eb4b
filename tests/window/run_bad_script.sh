#!/usr/bin/env bash
# run_bad_script.sh — a script with a bad line: floatpitch-view must stop before opening a
# window, with status 2 and a message naming the file and the line.
#   run_bad_script.sh VIEW SOURCE_DIR WORK_DIR
set -uo pipefail
view=$1 src=$2 work=$3
rm -rf "$work"
mkdir -p "$work"
printf 'at 0 let_go\n# fine so far\nat 1 gust 1-cosine 5 furlongs 20 m\n' > "$work/bad.fps"
DISPLAY= "$view" "$src/scenarios/orvane_gust.toml" --frames 5 --script "$work/bad.fps" 2> "$work/err.txt"
status=$?
cat "$work/err.txt"
[[ $status -eq 2 ]] || { echo "expected status 2, got $status"; exit 1; }
grep -q "$work/bad.fps:3: \"furlongs\" is not a unit of speed" "$work/err.txt" || { echo "message lacks file:line"; exit 1; }
# and an unknown option is bad usage too
DISPLAY= "$view" --frames 2 --no-such-option 2> "$work/err2.txt"
status=$?
[[ $status -eq 2 ]] || { echo "unknown option: expected status 2, got $status"; exit 1; }
echo "ok"
