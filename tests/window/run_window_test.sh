#!/usr/bin/env bash
# run_window_test.sh — the window under Xvfb with Mesa's software OpenGL: a scripted gust on
# the Orvane demo case, a screenshot at the end, the run's CSVs; then the screenshot is checked
# against the CSVs (check_screenshot.cpp).
#   run_window_test.sh VIEW CHECKER SOURCE_DIR WORK_DIR
set -euo pipefail
view=$1 checker=$2 src=$3 work=$4
rm -rf "$work"
mkdir -p "$work"
cat > "$work/gust.fps" <<'SCRIPT'
# a gust of our own before the scenario's, shown over 8 s of history
at 0 speed 2
at 0 span 8
at 0.4 gust 1-cosine 8 m/s 25 m
SCRIPT
export LIBGL_ALWAYS_SOFTWARE=1
xvfb-run -a -s "-screen 0 1280x800x24" "$view" "$src/scenarios/orvane_gust.toml" --frames 240 \
  --script "$work/gust.fps" --screenshot "$work/shot.png" --csv-dir "$work/run" --layout "$work/layout.txt" \
  > "$work/stdout.txt" 2> "$work/stderr.txt" || { echo "floatpitch-view failed:"; cat "$work/stderr.txt"; exit 1; }
test -s "$work/shot.png" || { echo "no screenshot"; exit 1; }
test -s "$work/run/held.csv" && test -s "$work/run/free.csv" || { echo "no CSVs"; exit 1; }
# the run covers 240 frames x 2/60 s = 8 s of simulated time at the 0.01 s output step
rows=$(($(wc -l < "$work/run/held.csv") - 1))
[[ $rows -eq 801 ]] || { echo "held.csv has $rows rows, expected 801 (8 s at 0.01 s)"; exit 1; }
grep -q "gust 1-cosine 8 m/s 25 m" "$work/run/actions.fps" || { echo "the gust is not in actions.fps"; exit 1; }
# the pitch attitude: held and free part clearly after the gust
"$checker" "$work/shot.png" "$work/layout.txt" "$work/run/held.csv" "$work/run/free.csv" theta "theta [deg]"
