#!/usr/bin/env bash
# report_render.sh — the report as a browser shows it: make the aft-CG demo's report (with
# --pdf), check that the page references nothing outside itself, render it in headless Chromium
# to a PNG and check the picture, and check in Chromium's network log that the page made no
# request. A control page that does fetch shows that the network check can see a request.
# Usage: report_render.sh FLOATPITCH SOURCE_DIR WORK_DIR. Exit 77 (skipped) without Chromium.
set -euo pipefail
exe=$1 src=$2 work=$3
chromium=${FLOATPITCH_CHROMIUM:-$(command -v chromium || command -v chromium-browser || true)}
if [[ -z "$chromium" ]]; then
  echo "skipped: headless Chromium is not installed (Debian package chromium; scripts/deps.sh test installs it)"
  exit 77
fi
if ! command -v python3 > /dev/null; then
  echo "skipped: python3 is not installed"
  exit 77
fi
check="python3 $src/tests/report_render_check.py"
rm -rf "$work"
mkdir -p "$work"
cd "$src"

"$exe" report scenarios/orvane_aft_cg.toml --out "$work/report" --pdf --jobs 2
test -s "$work/report/report.html"
head -c 5 "$work/report/report.pdf" | grep -q '%PDF-' || { echo "FAIL: report.pdf is not a PDF"; exit 1; }
pdf_bytes=$(stat -c %s "$work/report/report.pdf")
((pdf_bytes > 50000)) || { echo "FAIL: report.pdf is only $pdf_bytes bytes"; exit 1; }
echo "ok: report.pdf, $pdf_bytes bytes"
$check html "$work/report/report.html"

shot() {  # shot PAGE PNG NETLOG
  local profile
  profile=$(mktemp -d)
  local root_flag=()
  [[ $(id -u) -eq 0 ]] && root_flag=(--no-sandbox)
  timeout 120 "$chromium" --headless "${root_flag[@]}" --disable-gpu --disable-quic --no-first-run \
    --disable-background-networking --disable-component-update --disable-sync --user-data-dir="$profile" \
    --host-resolver-rules="MAP * ~NOTFOUND" --hide-scrollbars --window-size=1000,1400 \
    --log-net-log="$3" --net-log-capture-mode=Everything --screenshot="$2" "file://$1" > "$work/chromium.log" 2>&1 || {
      cat "$work/chromium.log"; rm -rf "$profile"; echo "FAIL: chromium failed on $1"; exit 1; }
  rm -rf "$profile"
}

shot "$work/report/report.html" "$work/report.png" "$work/netlog.json"
$check png "$work/report.png" 1000 1400
$check netlog "$work/netlog.json"

# the control: a page that fetches an image and a style sheet must show up in the same check
cat > "$work/control.html" <<'HTML'
<!DOCTYPE html><html><body><p>control</p><img src="http://example.invalid/p.png" alt="">
<link rel="stylesheet" href="https://example.invalid/s.css"></body></html>
HTML
shot "$work/control.html" "$work/control.png" "$work/netlog_control.json"
$check netlog-expect "$work/netlog_control.json"
echo "report rendered; screenshot at $work/report.png"
