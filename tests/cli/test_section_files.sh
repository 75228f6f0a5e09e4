#!/bin/sh
# corax section and export: files written whole or not at all, the drawing's
# parts, the drawing to scale, the side file, and a large export that keeps
# every row in order.
set -eu
T=$TMPDIR_CLI/section_files
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
S="--origin 1000,2000 --azimuth 90 --width 20"
fail() { echo "FAIL: $*"; exit 1; }

# the table, the drawing and the side file
"$CORAX" section $D $S data/converted.csv -o "$T/s.csv" --svg "$T/s.svg" 2>/dev/null
[ "$(wc -l < "$T/s.csv")" = 7 ] || fail "section table: $(wc -l < "$T/s.csv") lines"
grep -q '^azimuth = 90 ' "$T/s.csv.about" || fail "about file lacks the azimuth"
grep -q '^width = 20 ' "$T/s.csv.about" || fail "about file lacks the width"
grep -q '^offset_sign = positive on the right' "$T/s.csv.about" || fail "about file lacks the offset sign"
grep -q '^structures_in_slab = 6$' "$T/s.csv.about" || fail "about file lacks the count"
# well-formed XML, with the parts the drawing must have
/usr/bin/python3 -c 'import sys, xml.dom.minidom; xml.dom.minidom.parse(sys.argv[1])' "$T/s.svg" ||
    fail "the drawing is not well-formed XML"
for want in '>270°</text>' '>090°</text>' '>Elevation (m)</text>' 'class="scale-bar"' \
    '>50 m</text>' 'class="in"' 'class="out"' '>T1</text>' '>T2</text>' 'class="tick c0"' \
    'class="open ' '>bedding (2)</text>' 'reviewed by a competent person' \
    'no vertical exaggeration'; do
    grep -qF "$want" "$T/s.svg" || fail "the drawing lacks $want"
done
grep -qF '>T4</text>' "$T/s.svg" && fail "a hole without a path is drawn"
grep -q 'No structures' "$T/s.svg" && fail "a slab with structures says it has none"

# an empty slab: holes only, and the note in the picture
"$CORAX" section $D --origin 1000,1900 --azimuth 0 --width 20 --from 95 --to 130 data/converted.csv \
    -o "$T/e.csv" --svg "$T/e.svg" 2>/dev/null
grep -q 'No structures lie in this slab' "$T/e.svg" || fail "an empty slab has no note"
grep -q 'class="in"' "$T/e.svg" || fail "an empty slab lost its holes"
grep -q '<line[^>]*class="tick' "$T/e.svg" && fail "ticks in an empty slab"

# to scale: a straight hole drilled along the section shows its true plunge in
# the picture (one scale across and down, common practice), 60 degrees here
printf 'hole,x,y,z,azimuth,dip,length\nS1,500,500,100,90,-60,200\n' > "$T/straight_collars.csv"
printf 'hole,depth,azimuth,dip\n' > "$T/straight_surveys.csv"
printf 'hole,depth,kind,x,y,z,dip,dip_direction\n' > "$T/none.csv"
"$CORAX" section --collars "$T/straight_collars.csv" --surveys "$T/straight_surveys.csv" \
    --origin 500,500 --azimuth 90 --width 10 "$T/none.csv" -o "$T/n.csv" --svg "$T/n.svg" 2>/dev/null
/usr/bin/python3 - "$T/n.svg" <<'EOF' || fail "the straight hole does not show its true plunge"
import math, re, sys
d = re.search(r'<path class="in" d="([^"]+)"', open(sys.argv[1]).read()).group(1)
pts = [tuple(map(float, p.split(","))) for p in re.findall(r"-?[\d.]+,-?[\d.]+", d)]
(x0, y0), (x1, y1) = pts[0], pts[-1]
angle = math.degrees(math.atan2(y1 - y0, x1 - x0))  # picture y grows downward
print(f"drawn plunge {angle:.3f}")
sys.exit(0 if abs(angle - 60) < 0.05 else 1)
EOF

# --scale 1000: one metre of ground is 96 / (1000 x 0.0254) pixels, an SVG
# pixel being 1/96 inch (CSS absolute lengths, W3C CSS 2.1: common practice);
# the scale bar's length in pixels says so
"$CORAX" section $D $S --scale 1000 data/converted.csv -o "$T/k.csv" --svg "$T/k.svg" 2>/dev/null
/usr/bin/python3 - "$T/k.svg" <<'EOF' || fail "the scale bar does not measure 1:1000"
import re, sys
doc = open(sys.argv[1]).read()
bar = doc[doc.index('<g class="scale-bar">'):]
bar = bar[:bar.index("</g>")]
widths = [float(w) for w in re.findall(r'<rect [^>]*width="([\d.]+)"', bar)]
metres = float(re.findall(r">([\d.]+) m</text>", bar)[0])
want = metres * 96 / (1000 * 0.0254)
print(f"bar {sum(widths):.2f} px for {metres} m, want {want:.2f}")
sys.exit(0 if len(widths) == 4 and abs(sum(widths) - want) < 0.05 and "1:1000" in bar else 1)
EOF

# a failed run leaves earlier files alone and no temporary files
cp "$T/s.csv" "$T/keep.csv"
cp "$T/s.svg" "$T/keep.svg"
if "$CORAX" section $D $S data/bad_converted.csv -o "$T/s.csv" --svg "$T/s.svg" 2>/dev/null; then
    fail "bad rows accepted"
fi
cmp -s "$T/s.csv" "$T/keep.csv" || fail "a failed run changed the table"
cmp -s "$T/s.svg" "$T/keep.svg" || fail "a failed run changed the drawing"
if "$CORAX" export --format vtk $D data/bad_converted.csv -o "$T/x.vtk" 2>/dev/null; then
    fail "bad rows exported"
fi
[ ! -e "$T/x.vtk" ] || fail "a failed export left a file"
ls -A "$T" | grep -q '\.part$' && fail "temporary files left: $(ls -A "$T")"
# an unwritable drawing is a clear error, and the table was still whole
if "$CORAX" section $D $S data/converted.csv -o "$T/t.csv" --svg /nonexistent/dir/s.svg 2> "$T/err"; then
    fail "drew to nowhere"
fi
grep -q '^corax: /nonexistent/dir/s.svg: cannot write' "$T/err" || fail "unclear error: $(cat "$T/err")"

# a large export streams every row, in order, and the modelling columns match
awk 'BEGIN { print "id,hole,depth,kind,x,y,z,dip,dip_direction";
             for (i = 0; i < 200000; i++)
                 printf "%d,T1,%d,vein,%.3f,%.3f,%.3f,%.2f,%.2f\n", i, i % 200, 1000 + i % 97,
                        2000 + i % 89, 300 - i % 83, i % 91, (i * 7) % 360 }' > "$T/big.csv"
"$CORAX" export --format csv "$T/big.csv" -o "$T/big_out.csv"
[ "$(wc -l < "$T/big_out.csv")" = 200001 ] || fail "rows lost in a large export"
awk -F, 'NR > 1 && ($10 != NR - 2 || $4 != sprintf("%.2f", (NR - 2) % 91)) { bad = 1 } END { exit bad }' \
    "$T/big_out.csv" || fail "large export out of order or altered"
"$CORAX" export --format vtk --binary --no-traces "$T/big.csv" -o "$T/big.vtk"
grep -a -q '^POLYGONS 200000 5000000$' "$T/big.vtk" || fail "large VTK export lacks its discs"
rm -f "$T/big.csv" "$T/big_out.csv" "$T/big.vtk"
echo ok
