#!/bin/sh
# corax export does not hold its structures: legacy VTK, which must give each
# block's size before its values, keeps them in a spool (a buffer, beyond it
# an unnamed temporary file beside the output) and reads them back once per
# block; the modelling CSV and the GeoPackage stream. On an invented table of
# 200,000 converted rows, each export's peak resident memory may exceed that
# of the same export of its first 2,000 rows by at most 40 bytes a row, the
# house rule's "a few dozen" (measured: about 0 for VTK and CSV, about 15 for
# the GeoPackage, through GDAL and SQLite; holding the structures for VTK took
# about 75). The peak is the child's ru_maxrss (getrusage RUSAGE_CHILDREN,
# through Python's resource module). Not a timed test. Under AddressSanitizer
# (make sanitize) the bound means nothing and is not asserted; the runs still
# must succeed.
set -eu
T=$TMPDIR_CLI/export_memory
mkdir -p "$T/small" "$T/big"
fail() { echo "FAIL: $*"; exit 1; }
PY=/usr/bin/python3
[ -x "$PY" ] || fail "python3 is needed to measure the peak memory"
ROWS=200000

# the holes invent_structures draws from (tools/invent_structures.c)
cat > "$T/c.csv" <<'EOF'
hole,x,y,z,azimuth,dip,length
LB001,5120,8340,412,300,-60,400
LB002,5260,8410,409,120,-55,400
LB003,5050,8520,415,30,-70,400
LB004,5390,8290,404,210,-50,400
LB005,5180,8620,418,90,-85,400
LB006,5310,8560,411,330,-45,400
EOF
awk -F, 'NR > 1 { print $1 ",0," $5 "," $6; print $1 ",400," $5 + 2 "," $6 + 1 }' \
    "$T/c.csv" | sed '1i hole,depth,azimuth,dip' > "$T/s.csv"
"${BUILD:?}/tools/invent_structures" $ROWS 11 > "$T/big/t.csv"
head -n 2001 "$T/big/t.csv" > "$T/small/t.csv"
[ "$(wc -l < "$T/big/t.csv")" -eq $((ROWS + 1)) ] || fail "the invented table is not $ROWS rows"

# peak DIR FORMAT OUTPUT: the export's peak resident memory in KiB
peak() {
    "$PY" - "$CORAX" "$T" "$1" "$2" "$3" <<'PYEOF'
import resource, subprocess, sys
corax, t, d, fmt, out = sys.argv[1:6]
subprocess.run([corax, "export", "-q", "--format", fmt, "--collars", t + "/c.csv",
                "--surveys", t + "/s.csv", "-o", d + "/" + out, d + "/t.csv"], check=True)
print(resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss)
PYEOF
}

asan=0
if ldd "$CORAX" 2> /dev/null | grep -q libasan; then asan=1; fi
for f in vtk:out.vtk csv:out.csv gpkg:out.gpkg; do
    fmt=${f%%:*} out=${f#*:}
    small=$(peak "$T/small" "$fmt" "$out") || fail "export --format $fmt of 2,000 rows"
    big=$(peak "$T/big" "$fmt" "$out") || fail "export --format $fmt of $ROWS rows"
    n=$(sed -n 's/^structures = \([0-9]*\).*/\1/p' "$T/big/$out.about")
    [ "${n:-0}" -gt 150000 ] || fail "export --format $fmt wrote ${n:-no} structures"
    if [ $asan = 1 ]; then
        echo "SKIP: the bound under AddressSanitizer ($fmt: $small KiB, then $big KiB)"
        continue
    fi
    grown=$(((big - small) * 1024 / ROWS))
    [ "$grown" -le 40 ] ||
        fail "export --format $fmt grew by $grown bytes a row ($small KiB, then $big KiB)"
done
# the binary VTK came back from its spool whole: every structure, and the end
n=$(sed -n 's/^structures = //p' "$T/big/out.vtk.about")
[ "$(sed -n 3p "$T/big/out.vtk")" = BINARY ] || fail "the large VTK is not binary"
grep -aq "^POLYGONS $n $((25 * n))\$" "$T/big/out.vtk" || fail "the VTK's discs are not $n"
grep -aq "^hole 1 $((n + 6)) int\$" "$T/big/out.vtk" || fail "the VTK lacks the holes' array"
# and its spool left nothing beside the output
left=$(ls -A "$T/big" | grep -v -e '^t\.csv$' -e '^out\.' || true)
[ -z "$left" ] || fail "files left beside the output: $left"
rm -rf "$T"
