# Sourced by the memory tests, after fail() is defined:
#   peak COMMAND [ARG...]  runs the command, which must succeed, and prints
#                          its peak resident memory in KiB: the child's
#                          ru_maxrss (getrusage RUSAGE_CHILDREN, through
#                          Python's resource module);
#   below PEAK KIB WHAT    fails unless PEAK < KIB. Under AddressSanitizer
#                          (make sanitize) the bound means nothing: it says
#                          so and ends the test there, passed.
# Not timed: memory only.
PY=/usr/bin/python3
[ -x "$PY" ] || fail "python3 is needed to measure the peak memory"

peak() {
    "$PY" -c 'import resource, subprocess, sys
subprocess.run(sys.argv[1:], check=True, stdout=subprocess.DEVNULL)
print(resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss)' "$@"
}

below() {
    if ldd "$CORAX" 2> /dev/null | grep -q libasan; then
        echo "SKIP: the memory bound under AddressSanitizer (peak $1 KiB)"
        exit 0
    fi
    [ "$1" -lt "$2" ] || fail "$3 peaked at $1 KiB, above $(($2 / 1024)) MiB"
}
