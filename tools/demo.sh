#!/bin/sh
# make demo: the main job on the shipped demo program (Quillon Creek, an
# invented prospect). Writes everything under demo-output/.
set -eu
: "${CORAX:?}"
cd "$(dirname "$0")/.."
OUT=${DEMO_OUT:-demo-output} # the tests write it elsewhere
mkdir -p "$OUT"
# The demo program lies on a local mine grid of its own, tied to UTM zone 8N by
# two control points; its surveys (magnetic multishots, and two north-seeking
# gyros) ran from 2025 to 2027. The project file says so: the declination comes
# from the World Magnetic Model at each station's date and place, the grid
# convergence from the projection, with the inputs and the core conventions.
PROJECT=examples/quillon_creek.ini

"$CORAX" trace -p "$PROJECT" -o "$OUT/stations.csv" --corrections "$OUT/corrections.csv"
"$CORAX" trace -p "$PROJECT" --step 5 -o "$OUT/traces.csv"
# Every reading drawn 500 times through its errors (the defaults, and the
# log's confidence column for the orientation line): the uncertainty columns.
summary=$("$CORAX" convert -p "$PROJECT" --section-azimuth 135 --draws 500 --seed 2026 \
    -o "$OUT/structures.csv" 2>&1)

# The runs without an orientation mark (betas from a line drawn on the run),
# each turned to fit the hole's oriented bedding or foliation nearby.
oriented=$("$CORAX" convert -p "$PROJECT" --orient-by bedding=nearby --orient-by foliation=nearby \
    -o "$OUT/structures-oriented.csv" 2>&1)
# Planes from alpha alone: the marker bed and the vein read in several holes.
solved=$("$CORAX" solve -p "$PROJECT" examples/markers.csv -o "$OUT/markers.csv" \
    --residuals "$OUT/markers-residuals.csv" --svg "$OUT/markers.svg" \
    --title "Quillon Creek: planes from alpha alone" 2>&1)

# Stereonets of the converted structures: all structures, by feature kind on
# one net, one net per hole, with the statistics of each grouping.
S="$OUT/structures.csv"
"$CORAX" stereonet "$S" --title "Quillon Creek: all structures" \
    -o "$OUT/net_all.svg" --stats "$OUT/net_all_stats.csv"
"$CORAX" stereonet "$S" --group-by kind --title "Quillon Creek: by feature kind" \
    -o "$OUT/net_by_kind.svg" --stats "$OUT/net_by_kind_stats.csv"
"$CORAX" stereonet "$S" --group-by hole --net-per-group --terzaghi \
    --title "Quillon Creek: by hole, Terzaghi weighted" \
    -o "$OUT/net_by_hole.svg" --stats "$OUT/net_by_hole_stats.csv"
# Hole traces for 3-D modelling packages (VTK polydata, ASCII and binary).
"$CORAX" export --format vtk -p "$PROJECT" -o "$OUT/traces.vtk"
"$CORAX" export --format vtk --binary -p "$PROJECT" -o "$OUT/traces-binary.vtk"
# A cross-section along the 135-degree fence through the south-west holes
# (bedding and faults, at 1:2500), and the structures for modelling.
"$CORAX" section -p "$PROJECT" --origin 10300,50200 --azimuth 135 --width 200 \
    --kinds bedding,fault --scale 2500 "$S" -o "$OUT/section.csv" --svg "$OUT/section.svg"
"$CORAX" export --format csv "$S" -o "$OUT/structures-model.csv"
"$CORAX" export --format vtk -p "$PROJECT" "$S" -o "$OUT/structures.vtk"

# Planning the next holes (QP01-QP03, invented): what each would see of the two
# main fabrics (the means and kappas the stereonet gives for bedding and
# foliation), where each meets the Quillon lode, and the best direction within
# the rig's limits (dip -45 to -90).
planned=$("$CORAX" plan --holes examples/plan_holes.csv --sets examples/plan_sets.csv \
    --targets examples/plan_targets.csv -o "$OUT/plan_sampling.csv" --pierce "$OUT/plan_pierce.csv" \
    --sweep azimuth=0:360:5,dip=-45:-90:5 --best "$OUT/plan_best.csv" --svg "$OUT/plan_score.svg" \
    --title "Quillon Creek: planned holes QP01 to QP03" 2>&1 | grep 'best direction')

# The QA of the program: every survey and orientation finding, and the report.
checked=$("$CORAX" check -p "$PROJECT" -o "$OUT/findings.csv" --report "$OUT/report.html" 2>&1)

# The GIS deliverable: one GeoPackage with layers of structures, hole traces,
# collars, the QA findings, the lithology log desurveyed, and the contacts
# between its units, oriented by the bedding measured within 3 m of each (the
# units youngest first). The same for CAD as DXF, and the intervals as CSV.
LITH=examples/lithology.csv
ORDER=sandstone,siltstone,conglomerate,schist
"$CORAX" export --format gpkg -p "$PROJECT" "$S" --findings "$OUT/findings.csv" \
    --intervals "$LITH" --contacts "$LITH" --contact-kinds bedding --contact-window 3 \
    --youngest-first "$ORDER" -o "$OUT/quillon_creek.gpkg" -q
"$CORAX" export --format dxf -p "$PROJECT" "$S" --intervals "$LITH" \
    -o "$OUT/quillon_creek.dxf" -q
"$CORAX" export --format csv -p "$PROJECT" --intervals "$LITH" -o "$OUT/lithology.csv" -q
"$CORAX" export --format csv -p "$PROJECT" "$S" --contacts "$LITH" --contact-kinds bedding \
    --contact-window 3 --youngest-first "$ORDER" -o "$OUT/contacts.csv" -q

holes=$(tail -n +2 surveys/collars.csv | wc -l)
rows=$(tail -n +2 examples/core_log.csv | wc -l)
echo "corax demo: Quillon Creek, $holes holes, $rows core readings"
echo "  desurveyed stations:     $OUT/stations.csv"
echo "  azimuth corrections:     $OUT/corrections.csv (declination, convergence, rotation)"
echo "  traces every 5 m:        $OUT/traces.csv"
echo "  converted structures:    $OUT/structures.csv"
echo "      ${summary#corax: }"
echo "      with dip_sd, dip_direction_sd, cone95, kappa and position_sd from 500 draws each"
echo "  runs oriented by reference: $OUT/structures-oriented.csv"
echo "      ${oriented#corax: }"
echo "  planes from alpha alone: $OUT/markers.csv, markers-residuals.csv, markers.svg"
echo "      ${solved#corax: }"
echo "  stereonets:              $OUT/net_all.svg, net_by_kind.svg, net_by_hole.svg"
echo "  orientation statistics:  $OUT/net_*_stats.csv"
echo "  traces for 3-D (VTK):    $OUT/traces.vtk, $OUT/traces-binary.vtk"
echo "  cross-section:           $OUT/section.svg, $OUT/section.csv"
echo "  structures for 3-D:      $OUT/structures.vtk, $OUT/structures-model.csv"
echo "  GIS (GeoPackage, open it): $OUT/quillon_creek.gpkg"
echo "      layers structures, traces, collars, findings, lithology, contacts"
echo "  CAD (DXF):               $OUT/quillon_creek.dxf"
echo "  lithology desurveyed:    $OUT/lithology.csv; contacts: $OUT/contacts.csv"
echo "  QA findings:             $OUT/findings.csv"
echo "      ${checked#corax: }"
echo "  QA report (open it):     $OUT/report.html"
echo "  drill plan:              $OUT/plan_sampling.csv, plan_pierce.csv, plan_best.csv, plan_score.svg"
echo "      ${planned#corax: note: }"
echo "  what each run assumed:   $OUT/*.about"
