#!/bin/sh
# GDAL is loaded only when a GIS file is asked for: its libraries take tens of
# milliseconds to load, which every command paid at start when corax was
# linked with it. The dynamic loader's own account of the libraries it loads
# (LD_DEBUG=files, glibc's) says whether libgdal came in: not for convert,
# trace or a CSV export; for a GeoPackage export, which must still work.
set -eu
T=$TMPDIR_CLI/gdal_on_demand
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

loads_gdal() { # loads_gdal LOG: the loader brought in a GDAL library
    grep -q 'file=libgdal\.so' "$1"
}

LD_DEBUG=files "$CORAX" convert -q $D -o "$T/conv.csv" data/log.csv 2> "$T/convert.log" ||
    fail "convert failed: $(grep -v 'file=\|^ *[0-9]*:' "$T/convert.log" | head -3)"
grep -q 'file=' "$T/convert.log" || { echo "SKIP: the loader gives no account (LD_DEBUG)"; exit 0; }
loads_gdal "$T/convert.log" && fail "convert loaded GDAL"

LD_DEBUG=files "$CORAX" trace $D --step 10 -o "$T/trace.csv" 2> "$T/trace.log" || fail "trace failed"
loads_gdal "$T/trace.log" && fail "trace loaded GDAL"

LD_DEBUG=files "$CORAX" export --format csv $D "$T/conv.csv" -o "$T/out.csv" 2> "$T/csv.log" ||
    fail "export csv failed"
loads_gdal "$T/csv.log" && fail "a CSV export loaded GDAL"

LD_DEBUG=files "$CORAX" export --format gpkg $D "$T/conv.csv" -o "$T/out.gpkg" 2> "$T/gpkg.log" ||
    fail "export gpkg failed: $(grep -v 'file=\|^ *[0-9]*:' "$T/gpkg.log" | head -3)"
loads_gdal "$T/gpkg.log" || fail "a GeoPackage export did not load GDAL"
[ -s "$T/out.gpkg" ] || fail "no GeoPackage written"
echo "ok: GDAL loaded for the GeoPackage export alone"
