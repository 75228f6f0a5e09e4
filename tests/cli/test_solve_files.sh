#!/bin/sh
# corax solve: every reading in the residuals table, the side file, the same
# answer from a file and from standard input, reproducible draws, and an
# invented set in another dip convention solved the same.
set -eu
T=$TMPDIR_CLI/solve_files
mkdir -p "$T"
D="--collars data/solve_collars.csv --surveys data/solve_surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

"$CORAX" solve $D --draws 100 --seed 5 data/solve_readings.csv -o "$T/sets.csv" \
    --residuals "$T/res.csv" 2> "$T/err"
# nothing lost: one residual row per reading, in order, its own columns first
[ "$(wc -l < "$T/res.csv")" = "$(wc -l < data/solve_readings.csv)" ] || fail "readings lost"
cut -d, -f1-4 data/solve_readings.csv | tail -n +2 > "$T/in"
tail -n +2 "$T/res.csv" | cut -d, -f1-4 > "$T/out"
cmp -s "$T/in" "$T/out" || fail "the readings' own columns changed"
head -1 "$T/res.csv" | grep -q ',hole_azimuth,hole_plunge,residual,status,note$' || fail "residual header"
# an exact reading sits on its cone; the left-out rows say why
grep -q '^S1,60,20.67,tuff top,,45.00,60.00,0.00,used,$' "$T/res.csv" || fail "residual of an exact reading"
grep -q '^S1,200,95,broken,out of range,45.00,60.00,,invalid,"alpha 95 is outside \[0, 90\]"$' \
    "$T/res.csv" || fail "an alpha out of range is not named"
grep -q '^NOPE,.*,unknown-hole,' "$T/res.csv" || fail "an unknown hole is not named"
grep -q '^S3,75,40,broken,ragged,,,,invalid,the row has 6 fields but the header has 5; extra fields: surplus$' \
    "$T/res.csv" || fail "a ragged row's surplus field is lost"
[ "$(grep -c '; left out$' "$T/err")" = 5 ] || fail "left-out rows not reported: $(cat "$T/err")"

# the side file says what was assumed
grep -q '^parallel_limit = 15$' "$T/sets.csv.about" || fail "about: parallel limit"
grep -q '^draws = 100$' "$T/sets.csv.about" || fail "about: draws"
grep -q '^alpha_error = 2$' "$T/sets.csv.about" || fail "about: alpha error"

# standard input gives the same table; the same seed the same cones
"$CORAX" solve $D --draws 100 --seed 5 -q - < data/solve_readings.csv > "$T/stdin.csv" 2>/dev/null
cmp -s "$T/sets.csv" "$T/stdin.csv" || fail "standard input or the seed changes the answer"
"$CORAX" solve $D --draws 100 --seed 6 -q data/solve_readings.csv > "$T/seed6.csv" 2>/dev/null
cmp -s "$T/sets.csv" "$T/seed6.csv" && fail "another seed gives the same cones"
# the planes themselves do not depend on the draws
cut -d, -f1-7 "$T/sets.csv" > "$T/a"
cut -d, -f1-7 "$T/seed6.csv" > "$T/b"
cmp -s "$T/a" "$T/b" || fail "the seed moved a plane"

# the same holes written with positive-down dips give the same planes
awk -F, 'BEGIN{OFS=","} NR>1 {$6=-$6} {print}' data/solve_collars.csv > "$T/c_pos.csv"
awk -F, 'BEGIN{OFS=","} NR>1 {$4=-$4} {print}' data/solve_surveys.csv > "$T/s_pos.csv"
"$CORAX" solve --collars "$T/c_pos.csv" --surveys "$T/s_pos.csv" --dip-convention positive-down \
    --draws 0 -q data/solve_readings.csv > "$T/pos.csv" 2>/dev/null
"$CORAX" solve $D --draws 0 -q data/solve_readings.csv > "$T/neg.csv" 2>/dev/null
cmp -s "$T/pos.csv" "$T/neg.csv" || fail "the dip convention changes the planes"
exit 0
