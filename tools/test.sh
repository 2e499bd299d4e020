#!/usr/bin/env bash
# Every test on a fresh Debian machine: install what is missing, build with
# warnings as errors, run the whole suite under ctest.
set -euo pipefail
cd "$(dirname "$0")/.."
tools/install-deps.sh --test
cmake -S . -B build-test -DCMAKE_BUILD_TYPE=RelWithDebInfo -DHEATDECK_WERROR=ON >/dev/null
cmake --build build-test -j"$(nproc)"
ctest --test-dir build-test --output-on-failure -j"$(nproc)"
