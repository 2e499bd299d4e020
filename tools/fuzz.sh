#!/usr/bin/env bash
# Builds the libFuzzer targets with clang 14 and runs each one.
#   tools/fuzz.sh SECONDS [RUNS]   run each target for SECONDS (or RUNS executions)
# Prints, per target, the executions done and whether anything was found.
# FUZZ_MAX_LEN (default 4096) bounds the input size; FUZZ_TARGETS picks
# targets (default: deck units table pipeline).  A finding exits 1 and
# leaves its input as build-fuzz/crash_TARGET_*.
# Seeds: the example decks, the golden decks, stdlib and the tests' CSVs.
set -euo pipefail
cd "$(dirname "$0")/.."
secs=${1:-60}
runs=${2:--1}
tools/install-deps.sh
command -v clang++-14 >/dev/null || { sudo_=""; [[ $(id -u) -ne 0 ]] && sudo_=sudo; $sudo_ apt-get install -y -qq clang-14 libclang-rt-14-dev >/dev/null; }
CC=clang-14 CXX=clang++-14 cmake -S . -B build-fuzz -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DHEATDECK_FUZZ=ON -DHEATDECK_TESTS=OFF >/dev/null
cmake --build build-fuzz -j"$(nproc)" --target fuzz_deck fuzz_units fuzz_table fuzz_pipeline >/dev/null

work=build-fuzz/corpus
mkdir -p "$work"/{deck,units,table,pipeline}
for f in examples/*.deck stdlib/*.deck tests/cli/golden/*.deck tests/cli/stdlib/*.deck; do
  [[ -f $f ]] || continue
  cp -n "$f" "$work/deck/" 2>/dev/null || true
  cp -n "$f" "$work/pipeline/" 2>/dev/null || true
done
for u in "kW" "W/(m^2*K)" "kJ/(kg*K)" "degC" "Btu/(h*ft^2*degF)" "1/m" "%" "Δ°C" "µm" "m²·K/W"; do
  printf '%s' "$u" > "$work/units/$(printf '%s' "$u" | md5sum | cut -c1-8)"
done
printf 'T [degC],cp [kJ/(kg*K)],mu [cP]\n20,1.9,80\n60,2.0,20\n120,2.2,5\n' > "$work/table/seed1.csv"
for f in examples/*.csv tests/library/data/*.csv; do [[ -f $f ]] && cp -n "$f" "$work/table/"; done

# Smaller allocation stacks and quarantine: the same checks, more runs a second.
export ASAN_OPTIONS=${ASAN_OPTIONS:-malloc_context_size=0:quarantine_size_mb=16}
max_len=${FUZZ_MAX_LEN:-4096}
status=0
printf '%-14s %14s %10s %s\n' target executions seconds result
for t in ${FUZZ_TARGETS:-deck units table pipeline}; do
  log=build-fuzz/fuzz_$t.log
  start=$(date +%s)
  set +e
  ./build-fuzz/tests/fuzz/fuzz_$t "$work/$t" -max_total_time="$secs" -runs="$runs" \
    -max_len="$max_len" -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
    -artifact_prefix=build-fuzz/crash_${t}_ >"$log" 2>&1
  rc=$?
  set -e
  end=$(date +%s)
  execs=$(grep -Eo 'stat::number_of_executed_units: *[0-9]+' "$log" | grep -Eo '[0-9]+$' || echo 0)
  if [[ $rc -eq 0 ]]; then result="no findings"; else result="FINDING (exit $rc, see $log)"; status=1; fi
  printf '%-14s %14s %10s %s\n' "fuzz_$t" "$execs" "$((end - start))" "$result"
done
exit $status
