#!/bin/sh
# The Python module (python/corax) with Debian's /usr/bin/python3:
# tests/python/test_corax.py compares it with the command line on the same
# tables (and checks it against docs/check-values.md), once with numpy when it
# can be imported and once without (CORAX_NO_NUMPY=1: lists); then the module
# finds the library next to itself, without CORAX_LIBRARY.
set -eu
: "${BUILD:?}" "${CORAX:?}"
fail() { echo "FAIL: $*"; exit 1; }
if [ ! -x /usr/bin/python3 ]; then
    echo "SKIP: no /usr/bin/python3 (apt-get install python3)"
    exit 0
fi
ROOT=$(cd ../.. && pwd)
T=$TMPDIR_CLI/python
mkdir -p "$T"
LIB=$BUILD/libcorax.so.0
export CORAX PYTHONPATH="$ROOT/python" PYTHONDONTWRITEBYTECODE=1
# A library built with AddressSanitizer (make sanitize) needs its runtime
# loaded first; Python's own allocations are not ours to report as leaks.
if ldd "$LIB" | grep -q libasan; then
    LD_PRELOAD=$(${CC:-cc} -print-file-name=libasan.so)
    export LD_PRELOAD ASAN_OPTIONS=detect_leaks=0
fi

CORAX_LIBRARY=$LIB /usr/bin/python3 -m unittest discover -s "$ROOT/tests/python" 2>"$T/numpy.log" ||
    fail "with numpy: $(tail -30 "$T/numpy.log")"
/usr/bin/python3 -c 'import numpy' 2>/dev/null ||
    echo "note: numpy cannot be imported; both runs used lists (apt-get install python3-numpy)"
CORAX_NO_NUMPY=1 CORAX_LIBRARY=$LIB /usr/bin/python3 -m unittest discover -s "$ROOT/tests/python" \
    2>"$T/lists.log" || fail "without numpy: $(tail -30 "$T/lists.log")"

# next to the package: the way an installed copy may carry its library
mkdir -p "$T/site"
cp -R "$ROOT/python/corax" "$T/site/"
cp -L "$LIB" "$T/site/corax/libcorax.so.0"
found=$(cd "$T" && env -u CORAX_LIBRARY PYTHONPATH="$T/site" /usr/bin/python3 -c \
    'import corax; print(corax.library_path())')
[ "$found" = "$T/site/corax/libcorax.so.0" ] || fail "the library next to the package was not taken: $found"
# a CORAX_LIBRARY that names nothing is an error, not a silent fall-back
if (cd "$T" && CORAX_LIBRARY=$T/nothing.so PYTHONPATH="$T/site" /usr/bin/python3 -c 'import corax') \
    2>"$T/missing.err"; then
    fail "a missing CORAX_LIBRARY was ignored"
fi
grep -q "CORAX_LIBRARY names $T/nothing.so" "$T/missing.err" || fail "no word of the missing library"
echo "ok"
