#!/usr/bin/env bash
# The parallel sweep tests under ThreadSanitizer: the evaluator's sweep
# tests (1, 2 and 4 workers, rows and streamed bytes) and the CLI's sweep
# and determinism tests against a ThreadSanitizer build of heatdeck.
set -euo pipefail
cd "$(dirname "$0")/.."
tools/install-deps.sh --test
cmake -S . -B build-tsan -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DCMAKE_CXX_FLAGS="-fsanitize=thread -fno-omit-frame-pointer" \
  -DCMAKE_EXE_LINKER_FLAGS="-fsanitize=thread" >/dev/null
cmake --build build-tsan -j"$(nproc)" --target eval_tests cli_tests heatdeck
export TSAN_OPTIONS="halt_on_error=1 second_deadlock_stack=1"
./build-tsan/tests/eval_tests --gtest_filter='Sweep.*'
./build-tsan/tests/cli_tests --gtest_filter='SweepCli.*:*Determinism.*'
echo "tsan: no data race reported"
