#!/usr/bin/env bash
# Builds the libFuzzer targets with clang (AddressSanitizer + UndefinedBehaviorSanitizer, the
# core library instrumented too) in build-fuzz/ and runs each for SECONDS_PER_TARGET seconds
# (default 60), starting from the seeds (tests/fuzz/seeds/<target>/ and the WAV/UFF seeds the
# build writes). Exits non-zero when any target finds a crash, a leak, undefined behaviour, a
# timeout or an out-of-memory; the input is saved as build-fuzz/artifacts/<target>/crash-...
# (reproduce: build-fuzz/tests/fuzz/fuzz_<target> FILE). DEVELOPERS.md, "Fuzzing".
#   bash tests/fuzz/run-fuzzers.sh [SECONDS_PER_TARGET] [TARGET...]
set -uo pipefail

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
seconds=${1:-60}
shift || true
targets=("$@")
if ((${#targets[@]} == 0)); then targets=(wav csv uff manifest fleet args); fi
build="${HUMWISE_FUZZ_BUILD_DIR:-$root/build-fuzz}"
jobs=${HUMWISE_FUZZ_JOBS:-1}

if ! command -v clang++ >/dev/null; then
  echo "run-fuzzers: clang++ is needed (Debian: clang and libclang-rt-dev)" >&2
  exit 2
fi

set -e
cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DCMAKE_CXX_FLAGS="-fsanitize=fuzzer-no-link,address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer" \
  -DHUMWISE_FUZZ=ON -DHUMWISE_BUILD_TESTS=OFF -DHUMWISE_BUILD_BENCH=OFF >/dev/null
cmake --build "$build" --target humwise_fuzz -j"$jobs"
"$build/tests/fuzz/humwise_fuzz_seeds" "$build/fuzz-seeds"
set +e

export ASAN_OPTIONS=${ASAN_OPTIONS:-detect_leaks=1:abort_on_error=1:symbolize=1}
export UBSAN_OPTIONS=${UBSAN_OPTIONS:-print_stacktrace=1:halt_on_error=1}
failed=()
for t in "${targets[@]}"; do
  exe="$build/tests/fuzz/fuzz_$t"
  if [ ! -x "$exe" ]; then echo "run-fuzzers: no target '$t'" >&2; failed+=("$t"); continue; fi
  corpus="$build/corpus/$t"            # grows across runs; the seeds stay read-only
  artifacts="$build/artifacts/$t"
  mkdir -p "$corpus" "$artifacts"
  seeds=()
  for d in "$root/tests/fuzz/seeds/$t" "$build/fuzz-seeds/$t"; do [ -d "$d" ] && seeds+=("$d"); done
  dict=()
  case "$t" in
    wav) dict=(-dict="$root/tests/fuzz/dict/wav.dict") ;;
    uff) dict=(-dict="$root/tests/fuzz/dict/uff.dict") ;;
    csv|manifest) dict=(-dict="$root/tests/fuzz/dict/csv.dict") ;;
    fleet) dict=(-dict="$root/tests/fuzz/dict/fleet.dict") ;;
    args) dict=(-dict="$root/tests/fuzz/dict/args.dict") ;;
  esac
  log="$build/fuzz-$t.log"
  echo "=== fuzz_$t: ${seconds} s (log: $log)"
  "$exe" "$corpus" "${seeds[@]}" "${dict[@]}" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
    -max_len=65536 -print_final_stats=1 -artifact_prefix="$artifacts/" >"$log" 2>&1
  rc=$?
  grep -E "^stat::number_of_executed_units|^stat::peak_rss_mb|^#[0-9]+ +DONE" "$log" | sed 's/^/    /'
  if [ $rc -ne 0 ]; then
    echo "    FAILED (exit $rc): $(grep -m1 -E 'ERROR|SUMMARY|property violated|deadly signal' "$log")"
    ls "$artifacts" | sed 's/^/    artifact: /'
    failed+=("$t")
  fi
done

if ((${#failed[@]})); then
  echo "run-fuzzers: crashes in: ${failed[*]}" >&2
  exit 1
fi
echo "run-fuzzers: ${#targets[@]} target(s), ${seconds} s each, no crash"
