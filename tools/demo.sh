#!/bin/sh
# make demo: the main job on the shipped demo program (Quillon Creek, an
# invented prospect). Writes everything under demo-output/.
set -eu
: "${CORAX:?}"
cd "$(dirname "$0")/.."
OUT=demo-output
mkdir -p "$OUT"
# The demo surveys are magnetic; the local grid is 0.8 degrees east of true north
# and the declination 6.2 degrees east (both invented for the demo).
P="--collars surveys/collars.csv --surveys surveys/surveys.csv --declination 6.2 --convergence 0.8"

"$CORAX" trace $P -o "$OUT/stations.csv"
"$CORAX" trace $P --step 5 -o "$OUT/traces.csv"
# Hole traces for 3-D modelling packages (VTK polydata, ASCII and binary).
"$CORAX" export --format vtk $P -o "$OUT/traces.vtk"
"$CORAX" export --format vtk --binary $P -o "$OUT/traces-binary.vtk"
# A cross-section along the 135-degree fence through the south-west holes (bedding
# and faults, at 1:2500), and the structures for modelling, once the converted
# structures are there.
STRUCTURES="$OUT/structures.csv"
if [ -f "$STRUCTURES" ]; then
    "$CORAX" section $P --origin 10300,50200 --azimuth 135 --width 200 \
        --kinds bedding,fault --scale 2500 "$STRUCTURES" \
        -o "$OUT/section.csv" --svg "$OUT/section.svg"
    "$CORAX" export --format csv "$STRUCTURES" -o "$OUT/structures-model.csv"
    "$CORAX" export --format vtk $P "$STRUCTURES" -o "$OUT/structures.vtk"
fi

holes=$(tail -n +2 surveys/collars.csv | wc -l)
echo "corax demo: Quillon Creek, $holes holes"
echo "  desurveyed stations:     $OUT/stations.csv"
echo "  traces every 5 m:        $OUT/traces.csv"
echo "  traces for 3-D (VTK):    $OUT/traces.vtk, $OUT/traces-binary.vtk"
if [ -f "$STRUCTURES" ]; then
    echo "  cross-section:           $OUT/section.svg, $OUT/section.csv"
    echo "  structures for 3-D:      $OUT/structures.vtk, $OUT/structures-model.csv"
fi
echo "  what each run assumed:   $OUT/*.about"
