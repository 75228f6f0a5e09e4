#!/bin/sh
# make demo's GIS deliverable, read back by GDAL (python3-gdal): the
# GeoPackage of the Quillon Creek program holds its structures, hole traces,
# collars, QA findings, the lithology log desurveyed and the contacts, each
# layer as many features as the tables it came from have rows, in 3-D.
set -eu
T=$TMPDIR_CLI/demo
fail() { echo "FAIL: $*"; exit 1; }
if ! /usr/bin/python3 -c 'from osgeo import ogr' 2>/dev/null; then
    echo "SKIP: /usr/bin/python3 cannot import GDAL (apt-get install python3-gdal)"
    exit 0
fi
DEMO_OUT="$T" sh ../../tools/demo.sh > "$T.log" 2>&1 || { cat "$T.log"; fail "make demo failed"; }
[ -s "$T/quillon_creek.gpkg" ] || fail "no GeoPackage"
ogrinfo -ro -so "$T/quillon_creek.gpkg" > "$T/ogrinfo.txt" 2>&1 || fail "ogrinfo cannot open it"
/usr/bin/python3 - "$T" <<'PY'
import csv, sys
from osgeo import ogr
ogr.UseExceptions()
out = sys.argv[1]
failures = []
def check(cond, what):
    if not cond:
        failures.append(what)
def rows(p):
    return list(csv.DictReader(open(p)))
ds = ogr.Open(f"{out}/quillon_creek.gpkg")
names = [ds.GetLayer(i).GetName() for i in range(ds.GetLayerCount())]
check(names == ["structures", "traces", "collars", "findings", "lithology", "contacts"], f"layers {names}")
structures = [r for r in rows(f"{out}/structures.csv") if r["x"] and ((r["dip"] and r["dip_direction"]) or r["trend"])]
traces = {r["hole"] for r in rows(f"{out}/traces.csv") if r["status"] != "no-survey"}
want = {"structures": len(structures), "traces": len(traces),
        "collars": len(rows("../../surveys/collars.csv")), "findings": len(rows(f"{out}/findings.csv")),
        "lithology": len(rows("../../examples/lithology.csv")), "contacts": len(rows(f"{out}/contacts.csv"))}
types = {"structures": ogr.wkbPoint25D, "traces": ogr.wkbLineStringZM, "collars": ogr.wkbPoint25D,
         "findings": ogr.wkbPoint25D, "lithology": ogr.wkbLineString25D, "contacts": ogr.wkbPoint25D}
for name, n in want.items():
    lyr = ds.GetLayerByName(name)
    check(lyr.GetFeatureCount() == n, f"{name}: {lyr.GetFeatureCount()} features, want {n}")
    check(lyr.GetGeomType() == types[name], f"{name}: {ogr.GeometryTypeToName(lyr.GetGeomType())}")
lyr = ds.GetLayerByName("structures")
for r, f in zip(structures[:200], lyr):
    p = f.GetGeometryRef().GetPoint(0)
    check(all(abs(p[k] - float(r[c])) < 1e-9 for k, c in enumerate("xyz")) and f["hole"] == r["hole"], f"structure {r['hole']} {r['depth']}")
    check(r["dip_sd"] == "" or abs(f["dip_sd"] - float(r["dip_sd"])) < 1e-9, "dip_sd carried")
oriented = [f for f in ds.GetLayerByName("contacts") if f["status"] == "oriented"]
check(len(oriented) > 20, f"only {len(oriented)} oriented contacts")
if failures:
    print("\n".join(failures[:20]))
    sys.exit(1)
PY
