#!/usr/bin/env bash
# deps.sh — install the Debian 12 packages floatpitch needs (as root), only those missing.
# Usage: scripts/deps.sh [build|test]   (test adds what the test suite needs)
set -euo pipefail
want=(build-essential cmake pkg-config libboost-dev libeigen3-dev libsfml-dev libimgui-dev
      doctest-dev libtomlplusplus-dev libcli11-dev nlohmann-json3-dev libbenchmark-dev
      fonts-dejavu-core xvfb xauth libgl1-mesa-dri)
if [[ "${1:-build}" == test ]]; then
  want+=(imagemagick clang-14 libclang-rt-14-dev python3 python3-scipy chromium)
fi
missing=()
for p in "${want[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  if [[ $(id -u) -ne 0 ]]; then
    echo "floatpitch needs these Debian packages: ${missing[*]}" >&2
    echo "run this script as root (it uses apt-get), or install them yourself." >&2
    exit 1
  fi
  echo "installing: ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -q
  apt-get install -y -q --no-install-recommends "${missing[@]}"
fi
