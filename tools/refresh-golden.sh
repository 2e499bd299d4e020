#!/usr/bin/env bash
# Rewrites the expected files of the CLI golden tests from what the current
# heatdeck binary prints.  Review the diff (git diff tests/cli/golden) before
# committing: every change in it is a change in what users see.
#
#   tools/refresh-golden.sh [PATH/TO/heatdeck]
#
# For each tests/cli/golden/NAME.deck (run inside tests/cli/golden), each
# tests/cli/golden/mutated/NAME.deck (run inside that folder; the decks are
# written by tools/mutate-examples.py) and each examples/NAME.deck (run from
# the repository root, expected files in tests/cli/golden/examples/) it runs `heatdeck run DECK -f json -o -` and
# writes NAME.stderr, NAME.status and, when the deck evaluated (status 0 or
# 1), NAME.json.  The command line matches tests/cli/golden_test.cpp.
set -euo pipefail
repo="$(cd "$(dirname "$0")/.." && pwd)"
bin="${1:-}"
if [[ -z "$bin" ]]; then
  for candidate in "$repo"/build/heatdeck "$repo"/build-*/heatdeck; do
    if [[ -x "$candidate" ]]; then bin="$candidate"; break; fi
  done
fi
if [[ -z "$bin" || ! -x "$bin" ]]; then
  echo "refresh-golden: no heatdeck binary; build first or pass its path" >&2
  exit 3
fi
bin="$(cd "$(dirname "$bin")" && pwd)/$(basename "$bin")"
export NO_COLOR=1

# run_one DIR DECK EXPECTED: runs DECK inside DIR, writes EXPECTED.{stderr,status,json}.
run_one() {
  local dir="$1" deck="$2" expected="$3" status=0
  (cd "$dir" && "$bin" run "$deck" -f json -o - <"/dev/null" >"$expected.json.tmp" 2>"$expected.stderr") ||
    status=$?
  echo "$status" >"$expected.status"
  if [[ $status -eq 0 || $status -eq 1 ]]; then
    mv "$expected.json.tmp" "$expected.json"
  else
    rm -f "$expected.json.tmp" "$expected.json"
  fi
  echo "$deck: $status"
}

golden="$repo/tests/cli/golden"
for deck in "$golden"/*.deck; do
  name="$(basename "$deck" .deck)"
  run_one "$golden" "$name.deck" "$golden/$name"
done
for deck in "$golden"/mutated/*.deck; do
  [[ -e "$deck" ]] || continue
  name="$(basename "$deck" .deck)"
  run_one "$golden/mutated" "$name.deck" "$golden/mutated/$name"
done
mkdir -p "$golden/examples"
for deck in "$repo"/examples/*.deck; do
  name="$(basename "$deck" .deck)"
  run_one "$repo" "examples/$name.deck" "$golden/examples/$name"
done
