#!/bin/sh
# The QA report: the sample page of an invented program parses as HTML (and
# as XML: every element closed, every text escaped) and renders in a
# browser. Headless Chromium takes a screenshot of its top, which must hold
# a real drawing: many colours, ink but not all ink, the caution's red
# border and the three severities' colours. Skips (and passes) only when
# xmllint or chromium is not installed; CI installs them.
set -eu
T=$TMPDIR_CLI/report_render
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }

"${BUILD:?}/tools/report_sample" "$T/report.html" 2> "$T/sample.log" ||
    { cat "$T/sample.log"; fail "report_sample failed"; }
cat "$T/sample.log"
[ -s "$T/report.html" ] || fail "no report"

if command -v xmllint >/dev/null 2>&1; then
    # libxml2's HTML parser predates HTML5 and inline SVG: it calls their
    # tags (section, figure, svg, path...) invalid. Anything else it says
    # is a fault of ours.
    xmllint --html --noout "$T/report.html" > "$T/html.log" 2>&1 || true
    grep 'parser error' "$T/html.log" | grep -v 'Tag [a-zA-Z]* invalid$' > "$T/html.faults" || true
    [ -s "$T/html.faults" ] && { head -20 "$T/html.faults"; fail "xmllint --html finds faults"; }
    xmllint --noout "$T/report.html" > "$T/xml.log" 2>&1 ||
        { head -20 "$T/xml.log"; fail "the page is not well-formed"; }
    echo "xmllint: parses as HTML and as XML"
else
    echo "SKIP: xmllint is not installed (libxml2-utils)"
fi

if ! command -v chromium >/dev/null 2>&1; then
    echo "SKIP: chromium is not installed"
    exit 0
fi
. ./render.sh
shot "$T/report.html" "$T/report.png" 1400 3000 --hide-scrollbars
# the caution's border and the error tile (#a3271e), the warning tile
# (#e07b00), the note tile (#6fc0ea)
set -- $("$T/png_colours" "$T/report.png" '#a3271e' '#e07b00' '#6fc0ea')
echo "report: ${1}x$2, $3 colours, $4% inked; severity colours $5, $6, $7 pixels"
[ "$1" = 1400 ] && [ "$2" = 3000 ] || fail "screenshot is ${1}x$2"
[ "$3" -gt 50 ] || fail "the page rendered with only $3 colours"
awk -v p="$4" 'BEGIN { exit !(p > 5 && p < 95) }' || fail "the page covers $4% of the picture"
[ "$5" -gt 1000 ] || fail "no caution box or error tile ($5 pixels of its red)"
[ "$6" -gt 300 ] && [ "$7" -gt 300 ] || fail "the warning and note colours are missing"
echo ok
