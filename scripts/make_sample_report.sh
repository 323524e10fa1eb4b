#!/usr/bin/env bash
# make_sample_report.sh — regenerate the sample report committed under docs/sample-report/:
# `floatpitch report` on the aft-CG demo (scenarios/orvane_aft_cg.toml), where the stick-held
# airplane is stable and the hands-off one diverges. The date line is the date of the last
# commit (SOURCE_DATE_EPOCH), so that regenerating without changes gives the same files.
# Usage: scripts/make_sample_report.sh [--pdf]   (--pdf also prints report.pdf, not committed)
# FLOATPITCH_BUILD names the build directory (default: build; configured and built if needed).
set -euo pipefail
cd "$(dirname "$0")/.."
build=${FLOATPITCH_BUILD:-build}
if [[ ! -x "$build/floatpitch" ]]; then
  cmake -S . -B "$build" -DFLOATPITCH_WINDOW=OFF > /dev/null
  cmake --build "$build" -j2 --target floatpitch > /dev/null
fi
export SOURCE_DATE_EPOCH=${SOURCE_DATE_EPOCH:-$(git log -1 --format=%ct 2> /dev/null || date +%s)}
out=docs/sample-report
rm -rf "$out"
"$build/floatpitch" report scenarios/orvane_aft_cg.toml --out "$out" --jobs 2 "$@"
echo "sample report: $out/report.html"
