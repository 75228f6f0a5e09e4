#!/bin/sh
# corax plan: the four outputs written whole, one row per hole and set, per
# hole and target and per swept direction (best first); the side file; the
# picture well-formed with its parts; and a failed sweep that writes nothing.
set -eu
T=$TMPDIR_CLI/plan_files
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
P="--holes data/plan_holes.csv --sets data/plan_sets.csv --targets data/plan_targets.csv"

"$CORAX" plan $P -o "$T/s.csv" --pierce "$T/p.csv" --sweep azimuth=0:360:10,dip=-40:-90:10 \
    --best "$T/b.csv" --svg "$T/score.svg" --title "Test plan" 2> "$T/err"
[ "$(wc -l < "$T/s.csv")" = 7 ] || fail "sampling: $(wc -l < "$T/s.csv") lines, not 1 + 3 x 2"
[ "$(wc -l < "$T/p.csv")" = 7 ] || fail "pierce: $(wc -l < "$T/p.csv") lines, not 1 + 3 x 2"
# 36 azimuths x 5 dips (-40 .. -80) and the vertical once
[ "$(wc -l < "$T/b.csv")" = 182 ] || fail "best: $(wc -l < "$T/b.csv") lines, not 1 + 181"
head -n 1 "$T/b.csv" | grep -qx 'azimuth,dip,score,worst_set,worst_alpha' || fail "best header"
tail -n +2 "$T/b.csv" | cut -d, -f3 | sort -rg -c || fail "best: scores not best first"
[ "$(grep -c ',-90.00,' "$T/b.csv")" = 1 ] || fail "the vertical direction is listed more than once"
grep -q '^score = ' "$T/s.csv.about" || fail "the side file lacks the score"
grep -q '^directions = azimuth=0:360:10,dip=-40:-90:10 (181 directions)$' "$T/s.csv.about" ||
    fail "the side file lacks the sweep"
grep -q 'best direction of the sweep: azimuth' "$T/err" || fail "no best direction on stderr"
/usr/bin/python3 -c 'import sys, xml.dom.minidom; xml.dom.minidom.parse(sys.argv[1])' "$T/score.svg" ||
    fail "the picture is not well-formed XML"
for want in '>Test plan<' 'class="best"' 'class="setplane k0"' 'class="setplane k1"' \
    'class="cone k1"' '>PA<' '>PB<' '>PC<' 'Best direction (ring)' 'local practice'; do
    grep -qF "$want" "$T/score.svg" || fail "the picture lacks $want"
done
cells=$(grep -o 'class="cell s[0-9][ "]' "$T/score.svg" | wc -l)
[ "$cells" = $((181 + 8)) ] || fail "$cells cells drawn, not 181 and the key's 8"

# a failed sweep (a set parallel to every direction) leaves no file behind
rm -f "$T"/x.*
"$CORAX" plan --holes data/plan_q7_10_hole.csv --sets data/plan_vertical_set.csv \
    --sweep azimuth=90:270:180,dip=0:-90:15 -o "$T/x.csv" --best "$T/x.best.csv" \
    --svg "$T/x.svg" 2>/dev/null && fail "a sweep that cannot rank succeeded"
ls "$T"/x.* 2>/dev/null && fail "a failed run left files"

# the same run twice gives the same tables
"$CORAX" plan $P -o "$T/s2.csv" --pierce "$T/p2.csv" --sweep azimuth=0:360:10,dip=-40:-90:10 \
    --best "$T/b2.csv" -q
cmp -s "$T/s.csv" "$T/s2.csv" && cmp -s "$T/p.csv" "$T/p2.csv" && cmp -s "$T/b.csv" "$T/b2.csv" ||
    fail "two runs differ"
echo ok
