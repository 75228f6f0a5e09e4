#!/bin/sh
# corax trace: output files whole or not at all, the side file of assumptions,
# conventions and mappings that must not change the answer, and a big table.
set -eu
T=$TMPDIR_CLI/trace_files
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

# -o writes the table and, beside it, what the run assumed
"$CORAX" trace $D --declination 4.5 --convergence -1.25 -o "$T/traces.csv"
[ -s "$T/traces.csv" ] || fail "no output file"
grep -q '^declination = 4.5$' "$T/traces.csv.about" || fail "about file lacks the declination"
grep -q '^convergence = -1.25$' "$T/traces.csv.about" || fail "about file lacks the convergence"
grep -q '^azimuth_correction = 5.75 ' "$T/traces.csv.about" || fail "about file lacks the correction"
grep -q '^surveys_dip_convention = negative-down$' "$T/traces.csv.about" || fail "about file lacks the convention"
grep -q '^collars_dip_convention = negative-down$' "$T/traces.csv.about" || fail "about file lacks the collars' convention"
grep -q '^surveys = data/surveys.csv (delimiter comma, found; decimal mark point, found; metres)$' "$T/traces.csv.about" || fail "about file lacks how the surveys were read"
grep -q '^corax_version = ' "$T/traces.csv.about" || fail "about file lacks the version"
# the correction turns every surveyed azimuth: T1's first station reads 90 + 5.75
grep -q '^T1,0.000,1000.000,2000.000,300.000,95.750,-60.000,' "$T/traces.csv" || fail "correction not applied"

# a failed run leaves the earlier output alone and no temporary files
cp "$T/traces.csv" "$T/before.csv"
if "$CORAX" trace --collars data/bad_collars.csv --surveys data/bad_surveys.csv -o "$T/traces.csv" 2>/dev/null; then
    fail "bad tables accepted"
fi
cmp -s "$T/traces.csv" "$T/before.csv" || fail "a failed run changed the earlier output"
[ -z "$(ls -A "$T" | grep -v -e '^traces.csv' -e '^before.csv')" ] || fail "temporary files left: $(ls -A "$T")"

# an unwritable destination is a clear error
if "$CORAX" trace $D -o /nonexistent/dir/out.csv 2> "$T/err"; then fail "wrote to nowhere"; fi
grep -q '^corax: /nonexistent/dir/out.csv: cannot write' "$T/err" || fail "unclear write error: $(cat "$T/err")"
# a full standard output is an error too
if [ -w /dev/full ]; then
    if "$CORAX" trace $D > /dev/full 2> "$T/err"; then fail "a failed write to stdout went unnoticed"; fi
    grep -q 'cannot write' "$T/err" || fail "unclear stdout error: $(cat "$T/err")"
fi

# the same holes in the other dip conventions give the same traces
awk -F, 'BEGIN{OFS=","} NR>1 && $6!="" {$6=-$6} {print}' data/collars.csv > "$T/c_pos.csv"
awk -F, 'BEGIN{OFS=","} NR>1 {$4=-$4} {print}' data/surveys.csv > "$T/s_pos.csv"
awk -F, 'BEGIN{OFS=","} NR>1 && $6!="" {$6=90+$6} {print}' data/collars.csv > "$T/c_inc.csv"
awk -F, 'BEGIN{OFS=","} NR>1 {$4=90+$4} {print}' data/surveys.csv > "$T/s_inc.csv"
"$CORAX" trace $D --step 10 | cut -d, -f1-6 > "$T/neg.csv"
"$CORAX" trace --collars "$T/c_pos.csv" --surveys "$T/s_pos.csv" --dip-convention positive-down --step 10 | cut -d, -f1-6 > "$T/pos.csv"
"$CORAX" trace --collars "$T/c_inc.csv" --surveys "$T/s_inc.csv" --dip-convention from-vertical --step 10 | cut -d, -f1-6 > "$T/inc.csv"
cmp -s "$T/neg.csv" "$T/pos.csv" || fail "positive-down convention changes the trace"
cmp -s "$T/neg.csv" "$T/inc.csv" || fail "from-vertical convention changes the trace"

# shuffled survey rows, and renamed columns mapped back, change nothing
{ head -n 1 data/surveys.csv; tail -n +2 data/surveys.csv | sort -r; } > "$T/shuffled.csv"
"$CORAX" trace --collars data/collars.csv --surveys "$T/shuffled.csv" --step 10 | cut -d, -f1-6 > "$T/shuf.csv"
cmp -s "$T/neg.csv" "$T/shuf.csv" || fail "survey row order changes the trace"
sed '1s/.*/HOLE_NO,DEPTH_M,AZI,Dip/' data/surveys.csv > "$T/renamed.csv"
"$CORAX" trace --collars data/collars.csv --surveys "$T/renamed.csv" --surveys-columns hole=HOLE_NO,depth=DEPTH_M --step 10 | cut -d, -f1-6 > "$T/ren.csv"
cmp -s "$T/neg.csv" "$T/ren.csv" || fail "a column mapping changes the trace"

# a million-row --at table: every row comes out, in order
awk 'BEGIN { print "id,hole,depth"; for (i = 0; i < 1000000; i++) printf "%d,T%d,%.2f\n", i, i % 3 + 1, (i % 2000) / 10 }' > "$T/million.csv"
"$CORAX" trace $D --at "$T/million.csv" -o "$T/million_out.csv"
[ "$(wc -l < "$T/million_out.csv")" = 1000001 ] || fail "rows lost in a million-row table"
tail -n 1 "$T/million_out.csv" | grep -q '^999999,T1,199.90,' || fail "last row out of place"
awk -F, 'NR > 1 && $1 != NR - 2 { bad = 1 } END { exit bad }' "$T/million_out.csv" || fail "rows out of order"
rm -f "$T/million.csv" "$T/million_out.csv"
echo ok
