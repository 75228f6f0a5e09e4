#!/bin/sh
# corax convert --orient-by: an invented curved hole whose readings are the
# inverse of two known planes (bedding 50/110, joints 80/015), written by
# corax's own inverse at each reading's place; four runs carry no orientation
# mark and their betas are turned by arbitrary angles. Oriented by the
# bedding's known plane, or by the mean of the oriented bedding nearby, every
# reading of those runs comes back to its plane within 0.05 degrees; a run
# with no bedding reading stays unoriented and says why; without --orient-by
# the runs are unoriented; with draws they get their spread.
set -eu
T=$TMPDIR_CLI/convert_orient
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }

printf 'hole,x,y,z,azimuth,dip,length\nO1,1000,1000,300,60,-55,200\n' > "$T/c.csv"
printf 'hole,depth,azimuth,dip\nO1,0,60,-55\nO1,100,70,-60\nO1,200,80,-62\n' > "$T/s.csv"
D="--collars $T/c.csv --surveys $T/s.csv"
# ten 3 m runs from 20 m; runs 2, 5, 7 and 9 have no mark (run 9 no bedding)
turn_of() { case $1 in 2) echo 137.3 ;; 5) echo 251.9 ;; 7) echo 18.6 ;; 9) echo 300 ;; *) echo 0 ;; esac; }
echo "hole,from,to,confidence" > "$T/runs.csv"
for k in 0 1 2 3 4 5 6 7 8 9; do
    f=$((20 + 3 * k)) conf=good
    [ "$(turn_of $k)" = 0 ] || conf=unoriented
    echo "O1,$f,$((f + 3)),$conf" >> "$T/runs.csv"
done
# three readings a run, at 0.5, 1.5 and 2.5 m into it
awk 'BEGIN { print "hole,depth"
    for (k = 0; k < 10; k++) for (o = 0.5; o < 3; o += 1) printf "O1,%.1f\n", 20 + 3 * k + o }' \
    > "$T/depths.csv"
"$CORAX" trace $D --at "$T/depths.csv" > "$T/places.csv"
# each reading's alpha and beta by the inverse at its place, the turned betas
invent() { # invent BEDDING LOG: the log with bedding of that plane and joints 80/015
    echo "hole,depth,alpha,beta,kind,confidence" > "$2"
    i=0
    tail -n +2 "$T/places.csv" | while IFS=, read -r hole depth x y z az dip status note; do
        k=$((i / 3)) o=$((i % 3)) i=$((i + 1))
        turn=$(turn_of $k)
        if [ "$o" = 1 ] || [ "$k" = 9 ]; then kind=joint plane=80/15; else kind=bedding plane=$1; fi
        conf=good
        [ "$turn" = 0 ] || conf=unoriented
        "$CORAX" convert --hole-azimuth "$az" --hole-dip "$dip" --plane "$plane" |
            awk -v h="$hole" -v d="$depth" -v k="$kind" -v c="$conf" -v t="$turn" '
                /^would show/ { a = $4; b = $6; sub(",", "", a)
                    b = b - t; while (b < 0) b += 360
                    printf "%s,%s,%s,%.2f,%s,%s\n", h, d, a, b, k, c }' >> "$2"
    done
}
invent 50/110 "$T/log.csv"
[ "$(wc -l < "$T/log.csv")" = 31 ] || fail "the invented log has $(wc -l < "$T/log.csv") lines"

# every reading back on its plane within 0.05 degrees
check() { # check FILE: rows oriented or converted lie on their planes; count by status
    awk -F, -v want_ref="$2" '
        NR == 1 { for (i = 1; i <= NF; i++) col[$i] = i; next }
        function gap(a, b) { d = a - b; if (d < 0) d = -d; if (d > 180) d = 360 - d; return d }
        {
            st = $col["status"]
            if (st == "oriented-by-reference") ref++
            if (st != "converted" && st != "oriented-by-reference") { other++; next }
            dip = $col["dip"]; dd = $col["dip_direction"]
            if ($col["kind"] == "bedding") { wd = 50; wdd = 110 } else { wd = 80; wdd = 15 }
            if (gap(dip, wd) > 0.05 || gap(dd, wdd) > 0.05) {
                print "off its plane: " $0; bad = 1 }
        }
        END { if (ref != want_ref) { print ref " rows oriented by reference, not " want_ref; bad = 1 }
              exit bad }' "$1"
}
"$CORAX" convert $D --runs "$T/runs.csv" --orient-by bedding=50/110 -q "$T/log.csv" \
    -o "$T/fixed.csv" || fail "convert --orient-by failed"
check "$T/fixed.csv" 9 || fail "a known plane does not bring the runs back"
grep -q '^O1,27.5,.*,oriented-by-reference,.*run 26.00-29.00 m oriented by bedding 50.0/110.0: 2 reference readings, misfit 0.0' \
    "$T/fixed.csv" || fail "the note lacks the reference, its count or misfit"
grep -q '^O1,47.5,.*,unoriented,.*no reading of bedding in the run to orient it by' "$T/fixed.csv" ||
    fail "a run with no reference reading does not say why"
"$CORAX" convert $D --runs "$T/runs.csv" --orient-by bedding=nearby -q "$T/log.csv" \
    -o "$T/nearby.csv" || fail "convert --orient-by nearby failed"
check "$T/nearby.csv" 9 || fail "the nearby mean does not bring the runs back"
grep -q 'the mean of [0-9]* oriented readings within 30 m' "$T/nearby.csv" || fail "nearby note"
# without a runs table the rows' own confidence makes the runs (consecutive rows)
"$CORAX" convert $D --orient-by bedding=50/110 -q "$T/log.csv" -o "$T/rows.csv"
check "$T/rows.csv" 9 || fail "runs from the rows' confidence"
# without --orient-by they are unoriented, whatever beta says
"$CORAX" convert $D --runs "$T/runs.csv" -q "$T/log.csv" -o "$T/plain.csv"
[ "$(grep -c ',unoriented,beta runs from an arbitrary line' "$T/plain.csv")" = 12 ] ||
    fail "runs without a mark are not all unoriented"
# bedding nearly across the core (alpha about 86): every turn fits about as
# well, so the runs stay unoriented and say so
invent 36/240 "$T/across.csv"
"$CORAX" convert $D --runs "$T/runs.csv" --orient-by bedding=36/240 -q "$T/across.csv" \
    -o "$T/across_out.csv"
check "$T/across_out.csv" 0 || fail "a reference across the core oriented a run"
[ "$(grep -c 'fit as well .* the reference lies nearly across the core, or nearly along it, here; left unoriented' \
    "$T/across_out.csv")" = 9 ] || fail "ambiguous turns are not said"
# draws: the oriented rows get a spread, from the fit (no gravity mark)
"$CORAX" convert $D --runs "$T/runs.csv" --orient-by bedding=nearby --draws 100 -q \
    "$T/log.csv" -o "$T/drawn.csv"
awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) col[$i] = i; next }
    $col["status"] == "oriented-by-reference" && $col["cone95"] == "" { bad = 1 }
    END { exit bad }' "$T/drawn.csv" || fail "oriented rows without a spread"
exit 0
