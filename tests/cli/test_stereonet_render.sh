#!/bin/sh
# corax stereonet: the SVG renders in a browser. Headless Chromium takes a
# screenshot of a net, and the picture must hold a real drawing: many
# colours, and a fair share of pixels that are not background. Skips (and
# passes) only when chromium is not installed; CI installs it.
set -eu
T=$TMPDIR_CLI/stereonet_render
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
if ! command -v chromium >/dev/null 2>&1; then
    echo "SKIP: chromium is not installed"
    exit 0
fi
. ./render.sh

"${BUILD:?}/tools/invent_structures" 800 5 > "$T/structures.csv"
"$CORAX" stereonet "$T/structures.csv" --group-by kind -o "$T/net.svg" -q
: > "$T/empty.csv"
"$CORAX" stereonet "$T/empty.csv" -o "$T/empty.svg" -q

shot "$T/net.svg" "$T/net.png" 900 800
set -- $("$T/png_colours" "$T/net.png")
echo "net: ${1}x$2, $3 colours, $4% inked"
[ "$1" = 900 ] && [ "$2" = 800 ] || fail "screenshot is ${1}x$2"
[ "$3" -gt 50 ] || fail "the net rendered with only $3 colours"
awk -v p="$4" 'BEGIN { exit !(p > 10 && p < 90) }' || fail "the net covers $4% of the picture"

shot "$T/empty.svg" "$T/empty.png" 900 800
set -- $("$T/png_colours" "$T/empty.png")
echo "empty net: $3 colours, $4% inked"
[ "$3" -gt 2 ] || fail "the empty net rendered blank"
echo ok
