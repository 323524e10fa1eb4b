#!/usr/bin/env bash
# update_readme_keys.sh — regenerate the scenario key reference in README.md from the key table
# (scenario/keys.cpp, printed by `floatpitch keys`), between the keys:begin / keys:end markers.
set -euo pipefail
cd "$(dirname "$0")/.."
exe=${1:-build/floatpitch}
ref=$("$exe" keys)
python3 - "$ref" <<'PY'
import sys, re
ref = sys.argv[1].rstrip("\n")
s = open("README.md").read()
new = re.sub(r"<!-- keys:begin -->.*<!-- keys:end -->",
             lambda m: "<!-- keys:begin -->\n" + ref + "\n<!-- keys:end -->", s, flags=re.S)
open("README.md", "w").write(new)
PY
echo "README.md key reference updated"
