#!/bin/sh
# corax convert: conventions that must equal their mappings, the project file
# against the command line, standard input, output whole or not at all, and
# byte-identical output whatever the number of threads.
set -eu
T=$TMPDIR_CLI/convert_files
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }
orient() { cut -d, -f1,2,13,14; } # hole, depth, dip, dip_direction

# a log in which beta is read from the top-of-hole line equals the default log
# with beta + 180 (the geometry contract's mapping); likewise anticlockwise = -beta
awk -F, 'BEGIN { OFS = "," } NR > 1 && $4 != "" && $4 + 0 == $4 { $4 = ($4 + 180) % 360 } { print }' data/log2.csv > "$T/top.csv"
"$CORAX" convert -q $D data/log2.csv | orient > "$T/default.out"
"$CORAX" convert -q $D --reference-line top "$T/top.csv" | orient > "$T/top.out"
cmp -s "$T/default.out" "$T/top.out" || fail "top-of-hole line is not beta + 180"
awk -F, 'BEGIN { OFS = "," } NR > 1 { $4 = (360 - $4) % 360 } { print }' data/log2.csv > "$T/anti.csv"
"$CORAX" convert -q $D --beta-sense anticlockwise "$T/anti.csv" | orient > "$T/anti.out"
cmp -s "$T/default.out" "$T/anti.out" || fail "anticlockwise beta is not -beta"
"$CORAX" convert -q $D --beta-end up-hole data/log2.csv | orient > "$T/up.out"
cmp -s "$T/default.out" "$T/up.out" && fail "the up-hole end changed nothing"

# the command line overrides the project file
"$CORAX" convert -q -p data/project/demo.ini --reference-line top "$T/top.csv" | orient > "$T/proj.out"
cmp -s "$T/default.out" "$T/proj.out" || fail "command line did not override the project"

# standard input
"$CORAX" convert -q $D - < data/log2.csv | orient > "$T/stdin.out"
cmp -s "$T/default.out" "$T/stdin.out" || fail "standard input differs"

# -o writes the table and its record of assumptions; a failed run leaves nothing
"$CORAX" convert -q $D --beta-sense anticlockwise --section-azimuth 30 -o "$T/out.csv" "$T/anti.csv"
grep -q '^beta_sense = anticlockwise' "$T/out.csv.about" || fail "about lacks beta_sense"
grep -q '^section_azimuth = 30$' "$T/out.csv.about" || fail "about lacks the section azimuth"
grep -q "^structures = $T/anti.csv\$" "$T/out.csv.about" || fail "about lacks the log"
if "$CORAX" convert -q $D -o "$T/bad.csv" data/log2.csv data/log_other_header.csv 2>/dev/null; then
    fail "mismatched logs accepted"
fi
[ ! -e "$T/bad.csv" ] || fail "a failed run left an output file"
[ -z "$(ls -A "$T" | grep '\.part$' || true)" ] || fail "temporary files left"

# the same output on one thread and on two, for a log long enough for many batches
awk 'BEGIN { srand(7); print "hole,depth,alpha,beta,kind";
             for (i = 0; i < 60000; i++) printf "T%d,%.2f,%.1f,%.1f,k%d\n", i % 3 + 1, (i % 1900) / 10, rand() * 90, rand() * 359.9, i % 5 }' > "$T/big.csv"
OMP_NUM_THREADS=1 "$CORAX" convert -q $D "$T/big.csv" > "$T/one.csv"
OMP_NUM_THREADS=2 "$CORAX" convert -q $D "$T/big.csv" > "$T/two.csv"
cmp -s "$T/one.csv" "$T/two.csv" || fail "output depends on the number of threads"
[ "$(wc -l < "$T/one.csv")" = 60001 ] || fail "rows lost"
echo ok
