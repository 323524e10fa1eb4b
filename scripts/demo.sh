#!/usr/bin/env bash
# demo.sh — set up on a fresh Debian 12 machine (as root), build, and run the bundled demo:
# the Orvane T2 trainer at an aft CG, between its stick-free and stick-fixed neutral points,
# flown through the same gust with the stick held and with it free.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/deps.sh build
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release > build.log 2>&1 || { cat build.log; exit 1; }
cmake --build build -j2 --target floatpitch >> build.log 2>&1 || { tail -50 build.log; exit 1; }
./build/floatpitch run scenarios/orvane_aft_cg.toml --out out/orvane_aft_cg
