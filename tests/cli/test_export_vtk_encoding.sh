#!/bin/sh
# corax export --format vtk chooses its encoding by size: text up to 100,000
# structures (readable, comparable), binary above (half the size, faster to
# read); --binary and --ascii choose for themselves. The third line of a
# legacy VTK file names the encoding (VTK File Formats, Kitware).
set -eu
T=$TMPDIR_CLI/export_vtk_encoding
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
encoding() { sed -n 3p "$1"; }

"$CORAX" export -q --format vtk --no-traces data/converted.csv -o "$T/small.vtk"
[ "$(encoding "$T/small.vtk")" = ASCII ] || fail "a small export is not text"
"$CORAX" export -q --format vtk --no-traces --binary data/converted.csv -o "$T/small-bin.vtk"
[ "$(encoding "$T/small-bin.vtk")" = BINARY ] || fail "--binary is not binary"
grep -q '^encoding = ascii up to 100000 structures, binary (big-endian) above$' \
    "$T/small.vtk.about" || fail "the .about file does not give the rule"

# 120,000 rows: about 115,000 located structures (the rest unoriented)
"${BUILD:?}/tools/invent_structures" 120000 3 > "$T/big.csv"
"$CORAX" export -q --format vtk --no-traces --shape points "$T/big.csv" -o "$T/big.vtk"
[ "$(encoding "$T/big.vtk")" = BINARY ] || fail "a large export is not binary"
"$CORAX" export -q --format vtk --no-traces --shape points --ascii "$T/big.csv" -o "$T/big-text.vtk"
[ "$(encoding "$T/big-text.vtk")" = ASCII ] || fail "--ascii is not text"
n=$(sed -n 's/^structures = //p' "$T/big.vtk.about")
[ "$n" -gt 100000 ] || fail "only $n structures: not past the rule's bound"
binary=$(wc -c < "$T/big.vtk")
text=$(wc -c < "$T/big-text.vtk")
[ "$binary" -lt "$text" ] || fail "binary ($binary bytes) is not smaller than text ($text)"
rm -rf "$T"
