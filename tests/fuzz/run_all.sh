#!/usr/bin/env bash
# Builds the libFuzzer targets with clang in build-fuzz and runs each for SECONDS (default 60).
# Exit status is nonzero when any target finds a crash, hang, sanitizer report or equivalence failure;
# the reproducer is left in build-fuzz/fuzz-artifacts/.
set -euo pipefail
seconds=${1:-60}
# A fixed seed makes a CI run repeatable (WHITTLE_FUZZ_SEED=0 lets libFuzzer pick one).
seed=${WHITTLE_FUZZ_SEED:-1}
root=$(cd "$(dirname "$0")/../.." && pwd)
build=${WHITTLE_FUZZ_BUILD:-$root/build-fuzz}
cxx=${WHITTLE_FUZZ_CXX:-$(command -v clang++-14 || command -v clang++ || true)}
if [ -z "$cxx" ]; then
  echo "run_all.sh: clang++ not found (Debian: apt-get install clang libclang-rt-14-dev)" >&2
  exit 2
fi

cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER="$cxx" -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DWHITTLE_FUZZ=ON -DWHITTLE_BENCHMARKS=OFF -DWHITTLE_PYTHON=OFF >/dev/null
cmake --build "$build" -j2 --target fuzz_wq_parser fuzz_qasm_import fuzz_compile_equiv

mkdir -p "$build/fuzz-artifacts"
status=0
run() {  # run NAME SEED_DIR...
  local name=$1; shift
  local work="$build/fuzz-corpus/$name"
  mkdir -p "$work"
  echo "== fuzz_$name for ${seconds}s"
  if ! ASAN_OPTIONS=detect_leaks=1:allocator_may_return_null=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
      "$build/tests/fuzz/fuzz_$name" -max_total_time="$seconds" -seed="$seed" -timeout=20 -rss_limit_mb=2048 -max_len=8192 \
      -print_final_stats=1 -artifact_prefix="$build/fuzz-artifacts/$name-" "$work" "$@"; then
    echo "fuzz_$name: FAILED (see $build/fuzz-artifacts)" >&2
    status=1
  fi
}

wq_seeds=("$root/tests/fuzz/corpus/wq")
[ -d "$root/samples" ] && wq_seeds+=("$root/samples")
run wq_parser "${wq_seeds[@]}"
run qasm_import "$root/tests/fuzz/corpus/qasm"
run compile_equiv "${wq_seeds[@]}" "$root/tests/fuzz/corpus/qasm"
exit $status
