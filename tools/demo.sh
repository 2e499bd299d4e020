#!/usr/bin/env bash
# The main job on a fresh Debian machine: install what is missing, build,
# evaluate the example deck, and print where the report and workbook are.
set -euo pipefail
cd "$(dirname "$0")/.."
tools/install-deps.sh
log=$(mktemp)
if ! { cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DHEATDECK_TESTS=OFF &&
       cmake --build build -j"$(nproc)" --target heatdeck; } >"$log" 2>&1; then
  cat "$log"
  exit 1
fi
rm -f "$log"
deck=${1:-examples/trim_cooler.deck}
./build/heatdeck run "$deck" -o out -f html,md,xlsx,json
