#!/bin/sh
# corax stereonet reads its tables row by row and keeps a compact record per
# reading (its unit vector, weight and group: a few dozen bytes), not the
# whole table: on an invented converted table of 200,000 readings in five
# groups, Terzaghi weighted, its peak resident memory stays below 80 MiB
# (measured about 42 MiB, of which about 38 MiB is the process and its
# libraries before any row; holding the table whole took about 144 MiB).
# The peak is measured as peak.sh says (not under AddressSanitizer, where
# the run still must succeed). Not a timed test.
set -eu
T=$TMPDIR_CLI/stereonet_memory
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
. ./peak.sh

# rows as wide as convert writes them; every fifth reading has a line too
awk 'BEGIN {
    srand(9)
    print "hole,depth,alpha,beta,kind,confidence,x,y,z,hole_azimuth,hole_plunge,dip," \
        "dip_direction,strike,pole_trend,pole_plunge,nx,ny,nz,trend,plunge,status,note"
    split("bedding foliation vein joint fault", kind, " ")
    for (i = 0; i < 200000; i++) {
        dd = (60 * (i % 5) + 40 * rand()) % 360
        line = i % 5 == 1 ? sprintf("%.2f,%.2f", 360 * rand(), 90 * rand()) : ","
        printf "M%03d,%.2f,%.1f,%.1f,%s,good,%.3f,%.3f,%.3f,%.2f,%.2f,%.2f,%.2f,%.2f,%.2f," \
            "%.2f,%.5f,%.5f,%.5f,%s,converted,\n", int(100 * rand()), 500 * rand(),
            5 + 85 * rand(), 359.9 * rand(), kind[1 + i % 5], 5000 * rand(), 5000 * rand(),
            400 * rand(), 360 * rand(), 40 + 50 * rand(), 20 + 60 * rand(), dd, (dd + 270) % 360,
            (dd + 180) % 360, 30 * rand(), rand(), rand(), rand(), line
    } }' > "$T/t.csv"
[ "$(wc -l < "$T/t.csv")" -eq 200001 ] || fail "the invented table is not 200,000 readings"

peak=$(peak "$CORAX" stereonet -q --group-by kind --terzaghi -o "$T/n.svg" --stats "$T/s.csv" \
    "$T/t.csv") || fail "stereonet of 200,000 readings"
# five groups of planes, and the foliation's lines: every reading counted
[ "$(wc -l < "$T/s.csv")" -eq 7 ] || fail "not a row for each group's planes and lines"
[ "$(awk -F, 'NR > 1 { n += $3 } END { print n }' "$T/s.csv")" -eq 240000 ] ||
    fail "the statistics do not count every reading"
below "$peak" 81920 "stereonet of 200,000 readings"
