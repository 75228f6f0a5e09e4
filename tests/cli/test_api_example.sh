#!/bin/sh
# The installed library as a program outside the tree uses it: the staged
# `make install` (STAGE, under /usr/local) holds the headers, both libraries
# and corax.pc; examples/api/convert_log.c builds through pkg-config against
# the shared library and, with --static, the static one; both agree with
# `corax convert` on the same tables. The shared library exports only the
# public headers' functions, under its soname.
set -eu
: "${STAGE:?}" "${CORAX:?}"
T=$TMPDIR_CLI/api
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
ROOT=$(cd ../.. && pwd)
LIBDIR=$STAGE/usr/local/lib
export PKG_CONFIG_PATH="$LIBDIR/pkgconfig" PKG_CONFIG_SYSROOT_DIR="$STAGE"

[ -f "$STAGE/usr/local/include/corax/corax.h" ] || fail "no headers installed"
[ -f "$STAGE/usr/local/share/man/man3/corax.3" ] || fail "no corax(3) installed"
[ "$(readlink "$LIBDIR/libcorax.so")" = libcorax.so.0 ] || fail "libcorax.so is not a link to the soname"
readelf -d "$LIBDIR/libcorax.so.0" | grep -q 'SONAME.*\[libcorax\.so\.0\]' || fail "no soname libcorax.so.0"
pkg-config --exists corax || fail "pkg-config does not find corax"
[ "$(pkg-config --modversion corax)" = "$("$CORAX" --version | sed 's/^corax //')" ] ||
    fail "corax.pc's version is not the command's"
# exported: the public functions; not the helpers the modules share inside
nm -D --defined-only "$LIBDIR/libcorax.so.0" > "$T/exported"
for f in corax_program_load corax_convert_reading corax_mc_hole corax_arrays_convert; do
    grep -q " $f@@CORAX_0$" "$T/exported" || fail "$f is not exported"
done
for f in corax_field_number corax_grow corax_vformat corax_setup_table mc_cone95; do
    grep -q " $f@" "$T/exported" && fail "$f (internal) is exported"
done

CC=${CC:-cc}
# shellcheck disable=SC2086 # the flags are words
$CC ${TEST_SANITIZE:-} -o "$T/convert_log" "$ROOT/examples/api/convert_log.c" \
    $(pkg-config --cflags --libs corax) || fail "the example does not build against the shared library"
# the static library with what corax.pc says it needs (Requires.private,
# linked as shared libraries, and Libs.private): nothing left undefined.
# (`pkg-config --static` would also ask for the static closure of GDAL's own
# private libraries, which Debian does not ship for every one.)
PC=$LIBDIR/pkgconfig/corax.pc
# shellcheck disable=SC2086
$CC ${TEST_SANITIZE:-} -o "$T/convert_log_static" "$ROOT/examples/api/convert_log.c" \
    $(pkg-config --cflags corax) "$LIBDIR/libcorax.a" \
    $(pkg-config --libs $(sed -n 's/^Requires.private: //p' "$PC")) \
    $(sed -n 's/^Libs.private: //p' "$PC") ||
    fail "the example does not build against the static library"
LD_LIBRARY_PATH=$LIBDIR ldd "$T/convert_log" | grep -q "libcorax.so.0 => $LIBDIR/" ||
    fail "the example does not load the staged libcorax.so.0"

# The columns of `corax convert` the example writes, by name from its header
# (quoted fields, the notes, dropped first: they are not compared).
columns() {
    sed 's/"[^"]*"//g' "$1" | awk -F, '
        NR == 1 { for (i = 1; i <= NF; i++) at[$i] = i; next }
        { printf "%s,%s,%s,%s,%s,%s,%s,%s\n", $at["hole"], $at["depth"], $at["x"], $at["y"],
                  $at["z"], $at["dip"], $at["dip_direction"], $at["status"] }'
}
compare() { # NAME COLLARS SURVEYS LOG DECLINATION
    "$CORAX" convert --collars "$2" --surveys "$3" --declination "$5" "$4" > "$T/$1.cli" 2>/dev/null
    LD_LIBRARY_PATH=$LIBDIR "$T/convert_log" "$2" "$3" "$4" "$5" > "$T/$1.api" 2>"$T/$1.err" ||
        fail "$1: the example failed: $(cat "$T/$1.err")"
    "$T/convert_log_static" "$2" "$3" "$4" "$5" > "$T/$1.static" 2>/dev/null ||
        fail "$1: the static example failed"
    cmp -s "$T/$1.api" "$T/$1.static" || fail "$1: the static and shared builds differ"
    columns "$T/$1.cli" > "$T/$1.cli.cols"
    tail -n +2 "$T/$1.api" > "$T/$1.api.cols"
    # rows the command line found invalid: the status alone (its own parse
    # places some of them; the example does not)
    awk -F, 'NR == FNR { want[FNR] = $0; next }
             { split(want[FNR], w, ",") }
             w[8] == "invalid" { if ($8 != "invalid") { print "row " FNR ": " $0; bad = 1 }; next }
             $0 != want[FNR] { print "row " FNR ": " $0 " <> " want[FNR]; bad = 1 }
             END { exit bad }' "$T/$1.cli.cols" "$T/$1.api.cols" > "$T/$1.diff" ||
        fail "$1: the example and corax convert differ: $(head -5 "$T/$1.diff")"
    [ "$(wc -l < "$T/$1.cli.cols")" = "$(wc -l < "$T/$1.api.cols")" ] || fail "$1: row counts differ"
}
compare log data/collars.csv data/surveys.csv data/log.csv 0
compare log2 data/collars.csv data/surveys.csv data/log2.csv 7.5
# the demo program's tables, with a constant declination (its project file
# takes the World Magnetic Model), and the log's oriented runs
grep -v ',unoriented,' "$ROOT/examples/core_log.csv" > "$T/demo_log.csv"
compare demo "$ROOT/surveys/collars.csv" "$ROOT/surveys/surveys.csv" "$T/demo_log.csv" 19.5
[ "$(wc -l < "$T/demo.api")" -gt 4000 ] || fail "demo: too few rows converted"
grep -q ',converted$' "$T/demo.api" || fail "demo: nothing converted"
echo "ok"
