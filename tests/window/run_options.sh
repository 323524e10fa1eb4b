#!/usr/bin/env bash
# run_options.sh — the window's command line, without a display (every case stops before a
# window would open): --help exits 0 and names every option of the table in ui/README.md; bad
# usage exits 2 and names what is wrong.
#   run_options.sh VIEW SOURCE_DIR WORK_DIR
set -uo pipefail
view=$1 src=$2 work=$3
rm -rf "$work"
mkdir -p "$work"
fail() { echo "$*"; exit 1; }

DISPLAY= "$view" --help > "$work/help.txt" 2> "$work/help_err.txt"
status=$?
[[ $status -eq 0 ]] || fail "--help: expected status 0, got $status"
options=$(grep -o '^| `--[a-z-]*' "$src/ui/README.md" | sed 's/^| `//' | sort -u)
[[ -n $options ]] || fail "no options found in the table of ui/README.md"
for o in $options; do
  grep -q -- "$o" "$work/help.txt" || fail "--help does not name $o (documented in ui/README.md)"
done

# bad usage: status 2 and a message that names the option or the problem
check_bad() {  # check_bad NAME PATTERN ARGS...
  local name=$1 pattern=$2
  shift 2
  DISPLAY= "$view" "$@" > "$work/$name.out" 2> "$work/$name.err"
  local s=$?
  [[ $s -eq 2 ]] || fail "$name ($*): expected status 2, got $s"
  grep -q -- "$pattern" "$work/$name.err" || { cat "$work/$name.err"; fail "$name ($*): the message lacks '$pattern'"; }
}
check_bad size_small "640x480" --size 100x100 --frames 1
check_bad size_form "WxH" --size 1280by800 --frames 1
check_bad frames_range "0..1000000" --frames 2000000
check_bad frames_text "0..1000000" --frames many
check_bad frames_missing "frames" --frames
check_bad two_scenarios "one scenario at a time" a.toml b.toml --frames 1
check_bad screenshot_name "png" --screenshot a.p --frames 1
check_bad unknown "no-such-option" --frames 2 --no-such-option
echo "ok"
