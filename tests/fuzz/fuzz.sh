#!/bin/sh
# Fuzz each harness named for FUZZ_SECONDS, one at a time (`make fuzz`).
# Needs BUILD (the folder holding fuzz/HARNESS, built with libFuzzer).
#
# Each harness starts from its seed corpus (tests/fuzz/corpus/HARNESS) and
# the corpus of earlier runs (BUILD/corpus/HARNESS, where new inputs go),
# with its dictionary (tests/fuzz/dict/HARNESS.dict, or commands.dict). A
# crash, leak, hang (over 20 s) or sanitizer report stops that harness: its
# input is kept as BUILD/findings/HARNESS-..., and the script goes on to the
# next harness and fails at the end. Then: add the input to the seed corpus
# (it becomes a regression test of `make check`), fix, and add a test of
# the project's own (a cmocka test or a tests/cli case).
set -u
cd "$(dirname "$0")/../.." || exit 1
: "${BUILD:?set BUILD to the fuzzing build folder}"
seconds=${FUZZ_SECONDS:-50}
mkdir -p "$BUILD/findings" "$BUILD/logs" "$BUILD/tmp"
# the harnesses' scratch folders: here, and gone at the end even after a crash
export TMPDIR="$BUILD/tmp"
trap 'rm -rf "$BUILD/tmp"' EXIT
# one thread a run (the machine is shared; threads add nothing the
# sanitizers check); leaks are checked after every input
export OMP_NUM_THREADS=1
export ASAN_OPTIONS=${ASAN_OPTIONS:-detect_leaks=1}
export UBSAN_OPTIONS=${UBSAN_OPTIONS:-print_stacktrace=1}
failed=""
printf '%-10s %10s %8s %8s %8s  %s\n' harness runs exec/s cov ft result
for h in "$@"; do
    corpus="$BUILD/corpus/$h"
    mkdir -p "$corpus"
    dict=tests/fuzz/dict/$h.dict
    [ -f "$dict" ] || dict=tests/fuzz/dict/commands.dict
    log="$BUILD/logs/$h.log"
    "$BUILD/fuzz/$h" -max_total_time="$seconds" -timeout=20 -rss_limit_mb=2048 \
        -close_fd_mask=3 -print_final_stats=1 -artifact_prefix="$BUILD/findings/$h-" \
        -dict="$dict" "$corpus" "tests/fuzz/corpus/$h" > "$log" 2>&1
    rc=$?
    runs=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -n 1)
    rate=$(sed -n 's/^stat::average_exec_per_sec: *//p' "$log" | tail -n 1)
    cov=$(grep -o 'cov: [0-9]*' "$log" | tail -n 1 | cut -d' ' -f2)
    ft=$(grep -o 'ft: [0-9]*' "$log" | tail -n 1 | cut -d' ' -f2)
    result=clean
    if [ $rc != 0 ]; then
        result="FOUND (exit $rc): $log"
        failed="$failed $h"
    fi
    printf '%-10s %10s %8s %8s %8s  %s\n' "$h" "${runs:-?}" "${rate:-?}" "${cov:-?}" \
        "${ft:-?}" "$result"
done
if [ -n "$failed" ]; then
    echo "fuzzing found something in:$failed (inputs in $BUILD/findings)"
    exit 1
fi
echo "fuzzing: every harness ran ${seconds} s clean"
