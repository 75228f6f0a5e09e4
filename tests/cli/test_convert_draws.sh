#!/bin/sh
# corax convert --draws: byte-identical output and cloud whatever the number of
# threads; zero errors give zero spread and the plain conversion; the record of
# the run names the generator and the seed.
set -eu
T=$TMPDIR_CLI/convert_draws
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

awk 'BEGIN { srand(11); print "hole,depth,alpha,beta,confidence";
             for (i = 0; i < 600; i++) printf "%s,%.2f,%.0f,%.0f,%s\n", (i % 3 ? "T1" : (i % 2 ? "T2" : "UP1")), (i % 550) / 10, 5 + rand() * 85, rand() * 359, (i % 4 ? "good" : "poor") }' > "$T/log.csv"
OMP_NUM_THREADS=1 "$CORAX" convert -q $D --draws 64 --seed 99 --cloud "$T/cloud1.csv" -o "$T/one.csv" "$T/log.csv"
OMP_NUM_THREADS=2 "$CORAX" convert -q $D --draws 64 --seed 99 --cloud "$T/cloud2.csv" -o "$T/two.csv" "$T/log.csv"
cmp -s "$T/one.csv" "$T/two.csv" || fail "output depends on the number of threads"
cmp -s "$T/cloud1.csv" "$T/cloud2.csv" || fail "cloud depends on the number of threads"
# without a cloud the holes finish in any order: still the same output, on
# one thread, two and three
OMP_NUM_THREADS=2 "$CORAX" convert -q $D --draws 64 --seed 99 -o "$T/two-nocloud.csv" "$T/log.csv"
OMP_NUM_THREADS=3 "$CORAX" convert -q $D --draws 64 --seed 99 -o "$T/three-nocloud.csv" "$T/log.csv"
cmp -s "$T/one.csv" "$T/two-nocloud.csv" || fail "output without a cloud depends on the threads"
cmp -s "$T/one.csv" "$T/three-nocloud.csv" || fail "output on three threads differs"
[ "$(wc -l < "$T/cloud1.csv")" -gt 30000 ] || fail "cloud too small"
head -n 1 "$T/cloud1.csv" | grep -q '^hole,depth,draw,dip,dip_direction,x,y,z$' || fail "cloud header"
grep -q '^seed = 99$' "$T/one.csv.about" || fail "about lacks the seed"
grep -q '^generator = GSL taus2' "$T/one.csv.about" || fail "about lacks the generator"
grep -q '^draws = 64$' "$T/one.csv.about" || fail "about lacks the draws"

# another seed, another sample
OMP_NUM_THREADS=2 "$CORAX" convert -q $D --draws 64 --seed 100 -o "$T/other.csv" "$T/log.csv"
cmp -s "$T/two.csv" "$T/other.csv" && fail "the seed changes nothing"

# zero errors: zero spread, and the same conversion as without draws
Z="--alpha-error 0 --beta-error 0 --line-error 0 --gravity-error 0 --depth-error 0 --azimuth-error 0 --dip-error 0 --azimuth-error-per-hole 0 --dip-error-per-hole 0 --confidence-errors good=0,poor=0"
"$CORAX" convert -q $D --draws 20 $Z -o "$T/zero.csv" "$T/log.csv"
"$CORAX" convert -q $D -o "$T/plain.csv" "$T/log.csv"
cut -d, -f1-18 "$T/zero.csv" > "$T/zero_cols.csv"
cut -d, -f1-18 "$T/plain.csv" > "$T/plain_cols.csv"
cmp -s "$T/zero_cols.csv" "$T/plain_cols.csv" || fail "zero errors change the conversion"
awk -F, 'NR > 1 && $19 != "" { n++; if ($19 != "0.00" || $21 != "0.00" || $23 != "0.000") bad = 1 }
         END { exit bad || n < 300 }' "$T/zero.csv" || fail "zero errors give a spread"
echo ok
