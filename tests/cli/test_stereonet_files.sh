#!/bin/sh
# corax stereonet: the files it writes (valid XML, whole or not at all, the
# side file), equivalences between runs, the sampling bias that Terzaghi
# weighting corrects, and a large table.
set -eu
T=$TMPDIR_CLI/stereonet_files
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
INVENT=${BUILD:?}/tools/invent_structures
xml_ok() { # the file parses as XML (xmllint from libxml2-utils, installed in CI)
    if command -v xmllint >/dev/null 2>&1; then
        xmllint --noout "$1" || fail "$1 is not well-formed XML"
    else
        echo "note: xmllint absent, XML check of $1 skipped"
    fi
}

"$INVENT" 3000 7 > "$T/structures.csv"

# a net, its statistics and the side file
"$CORAX" stereonet "$T/structures.csv" --group-by kind -o "$T/kind.svg" --stats "$T/kind.csv" -q
xml_ok "$T/kind.svg"
grep -q '<svg xmlns="http://www.w3.org/2000/svg"' "$T/kind.svg" || fail "no svg root"
[ "$(grep -c 'class="primitive"' "$T/kind.svg")" = 1 ] || fail "all groups should share one net"
for k in bedding fault foliation joint vein; do
    grep -q "^$k,planes," "$T/kind.csv" || fail "no statistics row for $k"
done
grep -q '^lineation,lines,' "$T/kind.csv" || fail "no statistics row for the lines"
grep -q '^projection = equal-area$' "$T/kind.svg.about" || fail "about file lacks the projection"
grep -q '^group_by = kind$' "$T/kind.svg.about" || fail "about file lacks the grouping"
grep -q '^contours = Kamb (1959) counting' "$T/kind.svg.about" || fail "about file lacks the method"

# one net per hole; both projections, both ways of showing planes, both methods
"$CORAX" stereonet "$T/structures.csv" --group-by hole --net-per-group -o "$T/hole.svg" -q
xml_ok "$T/hole.svg"
holes=$(tail -n +2 "$T/structures.csv" | cut -d, -f1 | sort -u | wc -l)
[ "$(grep -c 'class="primitive"' "$T/hole.svg")" = "$holes" ] || fail "not one net per hole"
"$CORAX" stereonet "$T/structures.csv" --projection equal-angle --planes both --contours smooth \
    --contour-step 3 -o "$T/angle.svg" -q
xml_ok "$T/angle.svg"
grep -q 'smoothed Kamb (Vollmer 1995), interval [0-9]* σ' "$T/angle.svg" || fail "smooth legend missing"

# --where gives what filtering the table first gives
"$CORAX" stereonet "$T/structures.csv" --where kind=vein -o "$T/w.svg" --stats "$T/w.csv" -q
awk -F, 'NR == 1 || $6 == "vein"' "$T/structures.csv" > "$T/veins.csv"
"$CORAX" stereonet "$T/veins.csv" -o "$T/v.svg" --stats "$T/v.csv" -q
cmp -s "$T/w.csv" "$T/v.csv" || fail "--where differs from a filtered table"
# each group of a grouped run (its readings met among the others' and kept in
# one array with them) has the statistics of the table filtered to it
for k in bedding fault foliation joint lineation vein; do
    "$CORAX" stereonet "$T/structures.csv" --where kind=$k --group-by kind -o "$T/k.svg" \
        --stats "$T/k.csv" -q
    tail -n +2 "$T/k.csv" > "$T/k_rows.csv"
    grep "^$k," "$T/kind.csv" | cmp -s - "$T/k_rows.csv" || fail "group $k differs from --where"
done
# several inputs are read as one table
head -n 1501 "$T/structures.csv" > "$T/part1.csv"
{ head -n 1 "$T/structures.csv"; tail -n +1502 "$T/structures.csv"; } > "$T/part2.csv"
"$CORAX" stereonet "$T/structures.csv" --group-by kind -o "$T/a.svg" --stats "$T/whole.csv" -q
"$CORAX" stereonet "$T/part1.csv" "$T/part2.csv" --group-by kind -o "$T/b.svg" --stats "$T/parts.csv" -q
cmp -s "$T/whole.csv" "$T/parts.csv" || fail "two inputs differ from the same rows in one"

# an empty file still gives a net, with a note
: > "$T/empty.csv"
"$CORAX" stereonet "$T/empty.csv" -o "$T/empty.svg" -q
xml_ok "$T/empty.svg"
grep -q '>no readings</text>' "$T/empty.svg" || fail "empty net has no note"

# a failed run leaves the earlier output alone and no temporary files
cp "$T/kind.svg" "$T/before.svg"
if "$CORAX" stereonet "$T/structures.csv" --group-by colour -o "$T/kind.svg" 2>/dev/null; then
    fail "unknown column accepted"
fi
cmp -s "$T/kind.svg" "$T/before.svg" || fail "a failed run changed the earlier output"
! ls -A "$T" | grep -q '\.part$' || fail "temporary files left: $(ls -A "$T")"
if "$CORAX" stereonet "$T/structures.csv" -o /nonexistent/dir/net.svg 2> "$T/err"; then
    fail "wrote to nowhere"
fi
grep -q '^corax: /nonexistent/dir/net.svg: cannot write' "$T/err" || fail "unclear write error"

# grouping by a column of (nearly) unique values is refused, not drawn
if "$CORAX" stereonet "$T/structures.csv" --group-by x -o "$T/many.svg" 2> "$T/err"; then
    fail "thousands of groups accepted"
fi
grep -q 'more than 500 groups by x: filter with --where' "$T/err" || fail "unclear group limit: $(cat "$T/err")"
[ ! -e "$T/many.svg" ] || fail "a refused run wrote its net"

# Terzaghi (1965): the invented holes meet each family of planes in proportion
# to |cos| of the angle between pole and hole, while the families are equally
# common in the ground; the weighted counts must undo most of that bias.
"$CORAX" stereonet "$T/structures.csv" --group-by kind --terzaghi -o "$T/t.svg" \
    --stats "$T/t.csv" -q
grep -q '^weighting = Terzaghi (1965)' "$T/t.svg.about" || fail "about file lacks the weighting"
awk -F, '$2 == "planes" { n[++k] = $3; w[k] = $4 }
    function spread(a,   i, s, s2) { for (i = 1; i <= k; i++) { s += a[i]; s2 += a[i] * a[i] }
        return sqrt(s2 / k - (s / k) ^ 2) / (s / k) }
    END { if (k != 5) exit 2; cu = spread(n); cw = spread(w)
        printf "family spread: unweighted %.3f, weighted %.3f\n", cu, cw
        exit !(cw < 0.5 * cu) }' "$T/t.csv" || fail "Terzaghi weighting did not even out the families"

# a large table: every reading counted
"$INVENT" 200000 11 > "$T/big.csv"
"$CORAX" stereonet "$T/big.csv" --stats "$T/big_stats.csv" -o "$T/big.svg" -q
xml_ok "$T/big.svg"
rows=$(awk -F, 'NR > 1 { n += $3; s = $5 } END { print n + s }' "$T/big_stats.csv")
[ "$rows" = 200000 ] || fail "readings lost in a large table: $rows of 200000"
rm -f "$T/big.csv"

# --small-circles: readings with alpha and no plane (here the dip-only rows of
# a vertical hole) are drawn as small circles about their holes, one each;
# without the option they are only skipped
"$CORAX" convert -q --collars data/vertical_collars.csv --surveys data/vertical_surveys.csv \
    data/log_vertical.csv -o "$T/vertical.csv"
"$CORAX" stereonet -q "$T/vertical.csv" --small-circles -o "$T/circles.svg" --stats "$T/circles.csv"
xml_ok "$T/circles.svg"
[ "$(grep -c 'class="sc k0"' "$T/circles.svg")" = 4 ] || fail "not one small circle per reading"
grep -q '>4 readings by alpha alone</text>' "$T/circles.svg" || fail "the legend lacks the circles"
grep -q '^all,planes,1,1.000,0,' "$T/circles.csv" || fail "drawn circles are not skipped rows"
"$CORAX" stereonet -q "$T/vertical.csv" -o "$T/plain.svg" --stats "$T/plain.csv"
grep -q 'class="sc ' "$T/plain.svg" && fail "small circles drawn unasked"
grep -q '^all,planes,1,1.000,4,' "$T/plain.csv" || fail "the rows without planes are not skipped"
echo ok
