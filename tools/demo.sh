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

holes=$(tail -n +2 surveys/collars.csv | wc -l)
echo "corax demo: Quillon Creek, $holes holes"
echo "  desurveyed stations:     $OUT/stations.csv"
echo "  traces every 5 m:        $OUT/traces.csv"
echo "  what each run assumed:   $OUT/*.about"
