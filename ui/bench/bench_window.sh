#!/usr/bin/env bash
# bench_window.sh — frame time of floatpitch-view under Xvfb with Mesa's software OpenGL on the
# benchmark scene (bench_scene.fps: 9 time plots of 60 s history at 100 Hz, held and free
# airplanes both live). Prints the median frame time over the frames after the first 30.
#   ui/bench/bench_window.sh BUILD_DIR [FRAMES]
# The frame time is measured from the start of a frame to the end of its rendering (glFinish),
# the buffer swap included; there is no frame-rate limit when --frames is given.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
build=${1:?usage: bench_window.sh BUILD_DIR [FRAMES]}
frames=${2:-330}
view="$build/ui/floatpitch-view"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
xvfb-run -a -s "-screen 0 1280x800x24" "$view" "$here/../../scenarios/orvane_gust.toml" --frames "$frames" \
  --script "$here/bench_scene.fps" --frame-log "$work/frames.csv" > "$work/out.txt" 2> "$work/err.txt" ||
  { cat "$work/err.txt"; exit 1; }
# skip the warm-up frames (the first one simulates the 60 s at once)
tail -n +32 "$work/frames.csv" | cut -d, -f2 | sort -g | awk '
  { v[NR] = $1 } END {
    if (NR == 0) { print "no frames"; exit 1 }
    m = (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2
    printf "median frame time: %.1f ms over %d frames (10th %.1f, 90th %.1f percentile)\n", m, NR, v[int(NR * 0.1) + 1], v[int(NR * 0.9)]
  }'
echo "load average: $(cut -d' ' -f1-3 /proc/loadavg) (other work on the machine slows the software renderer)"
