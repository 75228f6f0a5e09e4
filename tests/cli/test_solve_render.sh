#!/bin/sh
# corax solve --svg: the net of alpha-only readings renders in a browser.
# Headless Chromium takes a screenshot of two sets' nets; the picture must
# hold the readings' small circles and the solved poles in their sets'
# colours (the palette's first two, #12467f and #e07b00), and the SVG must be
# well-formed. Skips (and passes) only when chromium is not installed.
set -eu
T=$TMPDIR_CLI/solve_render
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
D="--collars data/solve_collars.csv --surveys data/solve_surveys.csv"

"$CORAX" solve $D --draws 200 -q data/solve_readings.csv -o "$T/sets.csv" --svg "$T/net.svg" \
    --draw-sets "tuff top,q7.8" --title "Two sets" 2>/dev/null
[ "$(grep -c 'class="net"' "$T/net.svg")" = 2 ] || fail "not one net per chosen set"
grep -q 'class="pickcone k1"' "$T/net.svg" || fail "no cone about a solved pole"
grep -q '>2: dip 83.6° toward 048.1°, cone ' "$T/net.svg" || fail "Q7.8's second plane not listed"
if command -v xmllint >/dev/null 2>&1; then
    xmllint --noout "$T/net.svg" || fail "the SVG is not well-formed"
fi
# a set name that is not there is an error, and nothing is drawn
if "$CORAX" solve $D --draws 0 -q data/solve_readings.csv -o "$T/x.csv" --svg "$T/none.svg" \
    --draw-sets nothing 2> "$T/err"; then fail "an unknown set was drawn"; fi
grep -q 'names no set' "$T/err" || fail "unclear message: $(cat "$T/err")"
[ ! -e "$T/none.svg" ] || fail "a net was written for no set"

if ! command -v chromium >/dev/null 2>&1; then
    echo "SKIP: chromium is not installed"
    exit 0
fi
. ./render.sh
shot "$T/net.svg" "$T/net.png" 1450 560
set -- $("$T/png_colours" "$T/net.png" '#12467f' '#e07b00')
echo "solve net: ${1}x$2, $3 colours, $4% inked, set colours $5 and $6 pixels"
[ "$3" -gt 30 ] || fail "the net rendered with only $3 colours"
awk -v p="$4" 'BEGIN { exit !(p > 3 && p < 60) }' || fail "the net covers $4% of the picture"
[ "$5" -gt 40 ] || fail "the first set's pole is not drawn in its colour"
[ "$6" -gt 80 ] || fail "the second set's poles are not drawn in its colour"
echo ok
