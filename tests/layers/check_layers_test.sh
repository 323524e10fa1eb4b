#!/usr/bin/env bash
# The layer check (cmake/check_layers.cmake) accepts the project's tree and refuses a copy in
# which a lower layer includes a higher one (model/ including a header of analysis/), naming the
# file and the include; and it refuses cli/ and ui/ including each other.
# usage: check_layers_test.sh SOURCE_DIR WORK_DIR
set -euo pipefail
src=$1; work=$2
rm -rf "$work"; mkdir -p "$work"
cmake -DROOT="$src" -P "$src/cmake/check_layers.cmake" || { echo "FAIL: the project's own tree is refused"; exit 1; }
for d in util model scenario run analysis output report cli ui; do mkdir -p "$work/$d"; cp "$src/$d"/*.?pp "$work/$d/" 2>/dev/null || true; done
printf '#include "analysis/sweep.hpp"\n' >> "$work/model/atmosphere.cpp"
if out=$(cmake -DROOT="$work" -P "$src/cmake/check_layers.cmake" 2>&1); then
  echo "FAIL: model/ including analysis/ was accepted"; exit 1
fi
grep -q 'model/atmosphere.cpp: includes "analysis/sweep.hpp"' <<<"$out" || { echo "FAIL: message does not name the file: $out"; exit 1; }
sed -i '$d' "$work/model/atmosphere.cpp"
printf '#include "ui/app.hpp"\n' >> "$work/cli/cli.cpp"
if cmake -DROOT="$work" -P "$src/cmake/check_layers.cmake" > /dev/null 2>&1; then
  echo "FAIL: cli/ including ui/ was accepted"; exit 1
fi
echo "layer check: accepts the tree, refuses model -> analysis and cli -> ui"
