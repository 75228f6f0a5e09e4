#!/bin/sh
# corax check holds a core log in a compact record per reading (a few dozen
# bytes), not the whole table: on an invented program of 100 holes and
# 200,000 readings in random hole order its peak resident memory, with the
# report, stays below 100 MB (measured about 45 MB; holding the table whole
# took about 135 MB). The peak is measured as peak.sh says. Not a timed test.
# Under AddressSanitizer (make sanitize) the bound means nothing and is not
# asserted; the run still must succeed.
set -eu
T=$TMPDIR_CLI/check_memory
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
. ./peak.sh

awk -v dir="$T" 'BEGIN {
    srand(5)
    c = dir "/c.csv"; s = dir "/s.csv"
    print "hole,x,y,z,azimuth,dip,length" > c
    print "hole,depth,azimuth,dip" > s
    for (h = 0; h < 100; h++) {
        az = 360 * rand(); dip = -50 - 30 * rand()
        printf "M%03d,%.1f,%.1f,400,%.1f,%.1f,500\n", h, 5000 * rand(), 5000 * rand(), az,
            dip > c
        for (k = 0; k <= 10; k++)
            printf "M%03d,%d,%.1f,%.1f\n", h, 50 * k, az + k * 0.3, dip + k * 0.2 > s
    } }'
awk 'BEGIN {
    srand(7)
    print "hole,depth,alpha,beta,kind,confidence"
    split("bedding foliation vein joint fault", kind, " ")
    for (i = 0; i < 200000; i++)
        printf "M%03d,%.2f,%.1f,%.1f,%s,%s\n", int(100 * rand()), 500 * rand(),
            5 + 85 * rand(), 359.9 * rand(), kind[1 + i % 5], i % 7 ? "good" : "fair"
    }' > "$T/l.csv"
[ "$(wc -l < "$T/l.csv")" -eq 200001 ] || fail "the invented log is not 200,000 readings"

peak=$(peak "$CORAX" check -q --collars "$T/c.csv" --surveys "$T/s.csv" -o "$T/f.csv" \
    --report "$T/r.html" "$T/l.csv") || fail "check of 200,000 readings"
[ "$(wc -l < "$T/f.csv")" -gt 1 ] || fail "no findings on random readings"
below "$peak" 102400 "check of 200,000 readings"
