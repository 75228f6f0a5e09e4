#!/bin/sh
# corax plan --svg: the score picture renders in a browser. Headless Chromium
# takes a screenshot, which must hold a real drawing: the score bands, the
# sets' colours, and a fair share of pixels that are not background. Skips
# (and passes) only when chromium is not installed; CI installs it.
set -eu
T=$TMPDIR_CLI/plan_render
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
if ! command -v chromium >/dev/null 2>&1; then
    echo "SKIP: chromium is not installed"
    exit 0
fi
. ./render.sh

"$CORAX" plan --holes data/plan_holes.csv --sets data/plan_sets.csv \
    --targets data/plan_targets.csv --sweep azimuth=0:360:5,dip=0:-90:5 \
    -o "$T/s.csv" --svg "$T/score.svg" -q
shot "$T/score.svg" "$T/score.png" 1000 760
set -- $("$T/png_colours" "$T/score.png")
echo "score: ${1}x$2, $3 colours, $4% inked"
[ "$1" = 1000 ] && [ "$2" = 760 ] || fail "screenshot is ${1}x$2"
[ "$3" -gt 50 ] || fail "the picture rendered with only $3 colours"
awk -v p="$4" 'BEGIN { exit !(p > 15 && p < 90) }' || fail "the picture covers $4% of the page"
echo ok
