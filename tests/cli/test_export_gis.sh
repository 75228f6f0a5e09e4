#!/bin/sh
# corax export to GIS and CAD formats, read back by GDAL's own reader (the
# Python bindings of Debian's python3-gdal, an independent general-purpose
# library): layer names, feature counts, geometry types, coordinates and
# attributes against the converted table and `corax trace`; the CRS; DXF
# through OGR's DXF reader; interval desurvey against `corax trace --at` at
# the same depths; contacts on an invented hole with planted orientations;
# and bad input: unknown format, missing driver, layer name clash,
# overlapping and reversed intervals, a bad CRS, nothing left by failures.
set -eu
T=$TMPDIR_CLI/export_gis
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

if ! /usr/bin/python3 -c 'from osgeo import ogr' 2>/dev/null; then
    echo "SKIP: /usr/bin/python3 cannot import GDAL (apt-get install python3-gdal)"
    exit 0
fi

# ---- bad input first: each leaves nothing behind ----
nothing_left() { # nothing under $T/bad but the files named
    left=$(ls -A "$T/bad")
    [ -z "$left" ] || fail "$1 left $left"
}
mkdir -p "$T/bad"
set +e
"$CORAX" export --format shapefile $D -o "$T/bad/x.shp" 2> "$T/err"; rc=$?
set -e
[ $rc = 2 ] || fail "unknown format: exit $rc"
grep -q "'shapefile' is not csv, vtk, gpkg, geojson, dxf, shp nor a vector driver" "$T/err" \
    || fail "unknown format: $(cat "$T/err")"
grep -q "GPKG" "$T/err" && grep -q "ESRI Shapefile" "$T/err" || fail "unknown format lists no drivers"
set +e
GDAL_SKIP=GPKG "$CORAX" export --format gpkg $D -o "$T/bad/x.gpkg" 2> "$T/err"; rc=$?
set -e
[ $rc = 2 ] && grep -q "this machine's GDAL has no driver that writes gpkg" "$T/err" \
    || fail "missing driver: exit $rc, $(cat "$T/err")"
set +e
"$CORAX" export --format gpkg $D data/converted.csv --intervals structures=data/intervals.csv \
    -o "$T/bad/x.gpkg" 2> "$T/err"; rc=$?
set -e
[ $rc = 2 ] && grep -q "two layers named 'structures'" "$T/err" || fail "layer clash: $(cat "$T/err")"
set +e
"$CORAX" export --format gpkg $D --intervals data/intervals.csv --intervals data/intervals.csv \
    -o "$T/bad/x.gpkg" 2> "$T/err"; rc=$?
set -e
[ $rc = 2 ] && grep -q "layer 'intervals' is given twice" "$T/err" || fail "same layer twice: $(cat "$T/err")"
for crs in EPSG:99999999 EPSG:4326; do
    set +e
    "$CORAX" export --format gpkg $D -o "$T/bad/x.gpkg" --crs $crs 2> "$T/err"; rc=$?
    set -e
    [ $rc = 2 ] || fail "crs $crs: exit $rc"
done
grep -q "not a projected coordinate reference system" "$T/err" || fail "a geographic CRS is not refused as such"
# a faulty converted table fails the whole file, after layers were begun
set +e
"$CORAX" export --format gpkg $D data/bad_converted.csv -o "$T/bad/x.gpkg" 2> /dev/null; rc=$?
set -e
[ $rc = 1 ] || fail "bad converted table: exit $rc"
# GeoJSON holds one layer: without --layers, a clear message
set +e
"$CORAX" export --format geojson $D data/converted.csv -o "$T/bad/x.geojson" 2> "$T/err"; rc=$?
set -e
[ $rc = 1 ] && grep -q "one layer per file" "$T/err" || fail "geojson layers: $(cat "$T/err")"
nothing_left "failed runs"

# overlapping and reversed intervals: warnings naming the lines, a status per row
"$CORAX" export --format csv $D --intervals data/intervals_bad.csv -o "$T/bad_iv.csv" 2> "$T/err"
grep -q "data/intervals_bad.csv:3: warning: 8.000-20.000 overlaps 0.000-10.000 on line 2" "$T/err" \
    || fail "overlap not named: $(cat "$T/err")"
grep -q "data/intervals_bad.csv:4: warning: from 30.000 is below to 25.000" "$T/err" \
    || fail "reversed interval not named: $(cat "$T/err")"
[ "$(cut -d, -f16 "$T/bad_iv.csv" | tr '\n' ' ')" = "status ok overlaps reversed ok " ] \
    || fail "interval statuses: $(cut -d, -f16 "$T/bad_iv.csv" | tr '\n' ' ')"

# ---- the files ----
"$CORAX" check $D data/log.csv -o "$T/findings.csv" 2> /dev/null
"$CORAX" trace $D --step 5 -o "$T/trace.csv"
ALL="data/converted_lines.csv --findings $T/findings.csv --intervals data/intervals.csv"
"$CORAX" export --format gpkg $D $ALL --crs EPSG:32754 -o "$T/all.gpkg" 2> /dev/null
"$CORAX" export --format dxf $D data/converted_lines.csv --intervals data/intervals.csv \
    -o "$T/all.dxf" 2> /dev/null
"$CORAX" export --format shp $D $ALL --crs EPSG:32754 -o "$T/shapes" 2> /dev/null
"$CORAX" export --format geojson $D data/converted_lines.csv --layers structures \
    -o "$T/structures.geojson" 2> /dev/null
"$CORAX" export --format csv $D --intervals data/intervals.csv -o "$T/intervals.csv" 2> /dev/null
ls -A "$T" | grep -q '^\.' && fail "a private folder was left: $(ls -A "$T" | grep '^\.')"

# the interval depths for corax trace --at: from, middle and to of every row
awk -F, 'NR > 1 { printf "%s,%s\n%s,%.10g\n%s,%s\n", $1, $2, $1, ($2 + $3) / 2, $1, $3 }
         NR == 1 { print "hole,depth" }' data/intervals.csv > "$T/at.csv"
"$CORAX" trace $D --at "$T/at.csv" -o "$T/at_out.csv"

# the planted contacts: hole P1 runs straight (azimuth 90, dip -60) from its
# collar; units A (0-50), B (50-120), C (120-170), D (175-200). Five
# contact readings scatter symmetrically about 40/250 near 50 m and about
# 65/020 near 120 m; a bedding reading near 50 m and a contact reading 10 m
# away must not count; nothing lies near the C-D gap.
/usr/bin/python3 - "$T/planted.csv" <<'EOF'
import math, sys
rows = []
def add(depth, kind, dip, dd):
    t = (0.5, 0.0, -math.sqrt(3) / 2)
    x, y, z = 5000 + depth * t[0], 8000 + depth * t[1], 400 + depth * t[2]
    a, b = math.radians(dip), math.radians(dd)
    n = (math.sin(a) * math.sin(b), math.sin(a) * math.cos(b), math.cos(a))
    rows.append(f"P1,{depth},{kind},{x:.3f},{y:.3f},{z:.3f},{dip:.2f},{dd % 360:.2f},{n[0]:.6f},{n[1]:.6f},{n[2]:.6f}")
for (depth, dip, dd) in [(49.0, 40, 250), (49.5, 41, 252), (50.5, 39, 248), (51.0, 40.5, 249), (51.5, 39.5, 251)]:
    add(depth, "contact", dip, dd)
add(50.2, "bedding", 80, 100)
add(60.0, "contact", 10, 10)
for (depth, dip, dd) in [(119.0, 65, 20), (119.6, 66, 22), (120.4, 64, 18), (121.0, 65.5, 19), (121.5, 64.5, 21)]:
    add(depth, "contact", dip, dd)
with open(sys.argv[1], "w") as f:
    f.write("hole,depth,kind,x,y,z,dip,dip_direction,nx,ny,nz\n" + "\n".join(rows) + "\n")
EOF
P="--collars data/contact_collars.csv --surveys data/header_only_surveys.csv"
"$CORAX" export --format gpkg $P "$T/planted.csv" --contacts data/contact_units.csv \
    --youngest-first A,C,B -o "$T/contacts.gpkg" 2> /dev/null
"$CORAX" export --format csv $P "$T/planted.csv" --contacts data/contact_units.csv \
    --youngest-first A,C,B -o "$T/contacts.csv" 2> /dev/null

/usr/bin/python3 - "$T" <<'EOF'
import csv, math, os, sys
from osgeo import ogr
ogr.UseExceptions()
out = sys.argv[1]
failures = []
def check(cond, what):
    if not cond:
        failures.append(what)

def layers(ds):
    return [ds.GetLayer(i).GetName() for i in range(ds.GetLayerCount())]
def rows(path):
    return list(csv.DictReader(open(path)))
def num(s):
    return float(s) if s not in ("", None) else None

converted = rows("data/converted_lines.csv")
usable = [r for r in converted if r["x"] and (r["dip"] or r["trend"])]
trace = [r for r in rows(f"{out}/trace.csv") if r["status"] != "no-survey"]
holes = []
for r in trace:
    if not holes or holes[-1] != r["hole"]:
        holes.append(r["hole"])

def check_structures(lyr, name, full):
    check(lyr.GetFeatureCount() == len(usable), f"{name}: {lyr.GetFeatureCount()} structures, want {len(usable)}")
    check(lyr.GetGeomType() in (ogr.wkbPoint25D, ogr.wkbPoint), f"{name}: geometry {ogr.GeometryTypeToName(lyr.GetGeomType())}")
    feats = list(lyr)
    for r, f in zip(usable, feats):
        g = f.GetGeometryRef()
        where = f"{name} {r['hole']} {r['depth']}"
        check(g.GetGeometryType() == ogr.wkbPoint25D, f"{where}: not a 3-D point")
        for k, c in enumerate("xyz"):
            check(abs(g.GetPoint(0)[k] - float(r[c])) < 1e-9, f"{where}: {c}")
        if not full:
            continue
        check(f["hole"] == r["hole"] and f["kind"] == r["kind"] and f["status"] == r["status"], f"{where}: text fields")
        check(abs(f["depth"] - float(r["depth"])) < 1e-9, f"{where}: depth")
        if r["dip"]:
            # the plane comes from the normal (more digits than dip rounded to 0.01)
            check(abs(f["dip"] - float(r["dip"])) < 0.006, f"{where}: dip {f['dip']}")
            dd = (f["dip_direction"] - float(r["dip_direction"]) + 180) % 360 - 180
            check(abs(dd) < 0.006, f"{where}: dip_direction {f['dip_direction']}")
            check(abs((f["strike"] - float(r["strike"]) + 180) % 360 - 180) < 0.006, f"{where}: strike")
            for c in ("nx", "ny", "nz"):
                check(abs(f[c] - float(r[c])) < 2e-6, f"{where}: {c}")
        else:
            check(f["dip"] is None and f["nx"] is None, f"{where}: a line alone has no plane")
        if r["trend"]:
            tr, pl = math.radians(float(r["trend"])), math.radians(float(r["plunge"]))
            want = (math.sin(tr) * math.cos(pl), math.cos(tr) * math.cos(pl), -math.sin(pl))
            check(abs(f["trend"] - float(r["trend"])) < 1e-9 and abs(f["plunge"] - float(r["plunge"])) < 1e-9, f"{where}: trend, plunge")
            for c, w in zip(("lx", "ly", "lz"), want):
                check(abs(f[c] - w) < 1e-12, f"{where}: {c}")
        else:
            check(f["trend"] is None and f["lx"] is None, f"{where}: no line")
        for c in ("dip_sd", "dip_direction_sd", "cone95", "kappa", "position_sd"):
            want = num(r[c])
            check((f[c] is None and want is None) or (want is not None and abs(f[c] - want) < 1e-9), f"{where}: {c}")
        pol = {"upright": 1, "overturned": -1}.get(r["younging"])
        check(f["polarity"] == pol, f"{where}: polarity {f['polarity']}, want {pol}")
        for c in ("confidence", "note", "hole_azimuth"):
            check((f[c] or "") == r[c], f"{where}: carried {c}")

def check_traces(lyr, name, measured):
    check(lyr.GetFeatureCount() == len(holes), f"{name}: {lyr.GetFeatureCount()} traces, want {len(holes)}")
    want_type = ogr.wkbLineStringZM if measured else ogr.wkbLineString25D
    check(lyr.GetGeomType() == want_type, f"{name}: traces are {ogr.GeometryTypeToName(lyr.GetGeomType())}")
    for h, f in zip(holes, lyr):
        samples = [r for r in trace if r["hole"] == h]
        g = f.GetGeometryRef()
        check(f["hole"] == h and g.GetPointCount() == len(samples), f"{name}: trace of {h}")
        for i, r in enumerate(samples[:g.GetPointCount()]):
            p = g.GetPoint(i)
            for k, c in enumerate("xyz"):
                check(abs(p[k] - float(r[c])) < 5e-4, f"{name}: {h} vertex {i} {c}")
            if measured:
                check(abs(g.GetM(i) - float(r["depth"])) < 1e-9, f"{name}: {h} vertex {i} depth")

# ---- GeoPackage: every layer ----
ds = ogr.Open(f"{out}/all.gpkg")
check(layers(ds) == ["structures", "traces", "collars", "findings", "intervals"], f"gpkg layers {layers(ds)}")
for i in range(ds.GetLayerCount()):
    srs = ds.GetLayer(i).GetSpatialRef()
    check(srs is not None and srs.GetAuthorityCode(None) == "32754", f"gpkg {layers(ds)[i]}: CRS")
check_structures(ds.GetLayerByName("structures"), "gpkg", True)
check_traces(ds.GetLayerByName("traces"), "gpkg", True)
collars = rows("data/collars.csv")
lyr = ds.GetLayerByName("collars")
check(lyr.GetFeatureCount() == len(collars), "gpkg: collars")
for r, f in zip(collars, lyr):
    p = f.GetGeometryRef().GetPoint(0)
    check(f["hole"] == r["hole"] and all(abs(p[k] - float(r[c])) < 1e-9 for k, c in enumerate("xyz")), f"gpkg collar {r['hole']}")
findings = rows(f"{out}/findings.csv")
lyr = ds.GetLayerByName("findings")
check(lyr.GetFeatureCount() == len(findings), f"gpkg: {lyr.GetFeatureCount()} findings, want {len(findings)}")
for r, f in zip(findings, lyr):
    check(f["message"] == r["message"] and f["severity"] == r["severity"], f"gpkg finding {r['message'][:30]}")

# intervals: at from, middle and to, where corax trace --at puts those depths
at = rows(f"{out}/at_out.csv")
ivs = rows("data/intervals.csv")
lyr = ds.GetLayerByName("intervals")
check(lyr.GetFeatureCount() == len(ivs), "gpkg: every interval row is a feature")
for k, (r, f) in enumerate(zip(ivs, lyr)):
    check(f["unit"] == r["unit"] and (f["cu_pct"] == num(r["cu_pct"])), f"gpkg interval {k}: attributes")
    g = f.GetGeometryRef()
    placed = at[3 * k]["status"] in ("ok", "extrapolated", "collar-only", "beyond-end")
    check((g is not None) == placed, f"gpkg interval {k}: geometry {g is not None}, status {at[3 * k]['status']}")
    if g is None:
        continue
    check(g.GetGeometryType() == ogr.wkbLineString25D and g.GetPointCount() == 3, f"gpkg interval {k}: a 3-D line of 3 points")
    for j in range(3):
        for i, c in enumerate("xyz"):
            check(abs(g.GetPoint(j)[i] - float(at[3 * k + j][c])) < 5e-4, f"gpkg interval {k} point {j} {c}")
csv_iv = rows(f"{out}/intervals.csv")
check(len(csv_iv) == len(ivs), "csv: every interval row")
for k, r in enumerate(csv_iv):
    for j, part in enumerate(("from", "mid", "to")):
        for c in "xyz":
            got, want = r[f"{part}_{c}"], at[3 * k + j][c]
            check((got == want == "") or (got and want and abs(float(got) - float(want)) <= 1e-9),
                  f"csv interval {k} {part}_{c}: {got} vs trace --at {want}")
    if r["mid_azimuth"]:
        check(abs(float(r["mid_azimuth"]) - float(at[3 * k + 1]["azimuth"])) <= 1e-9 and
              abs(float(r["mid_plunge"]) + float(at[3 * k + 1]["dip"])) <= 1e-9, f"csv interval {k}: direction at mid")
    want_status = {"unknown-hole": "unknown-hole", "no-survey": "no-survey"}.get(at[3 * k]["status"])
    if want_status:
        check(r["status"] == want_status, f"csv interval {k}: status {r['status']}")

# ---- shapefiles: a folder, one file a layer ----
for name in ("structures", "traces", "collars", "findings", "intervals"):
    check(os.path.exists(f"{out}/shapes/{name}.shp"), f"shp: no {name}.shp")
ds = ogr.Open(f"{out}/shapes")
check_structures(ds.GetLayerByName("structures"), "shp", False)
check_traces(ds.GetLayerByName("traces"), "shp", True)
check(ds.GetLayerByName("structures").GetSpatialRef().GetAuthorityCode(None) == "32754", "shp: CRS")

# ---- GeoJSON: one layer ----
ds = ogr.Open(f"{out}/structures.geojson")
check(layers(ds) == ["structures"], f"geojson layers {layers(ds)}")
check_structures(ds.GetLayer(0), "geojson", True)

# ---- DXF, through OGR's DXF reader: entities by CAD layer ----
ds = ogr.Open(f"{out}/all.dxf")
count = {}
for f in ds.GetLayer(0):
    g = f.GetGeometryRef()
    key = (f["Layer"], g.GetGeometryName())
    count[key] = count.get(key, 0) + 1
    if f["Layer"] == "discs":
        check(g.GetPointCount() == 25 and g.GetPoint(0) == g.GetPoint(24), "dxf: a disc is a closed ring of 24 corners")
planes = [r for r in usable if r["dip"]]
lines = [r for r in usable if r["trend"]]
placed_iv = [k for k in range(len(ivs)) if at[3 * k]["status"] in ("ok", "extrapolated", "collar-only")]
want = {("structures", "POINT"): len(usable), ("discs", "LINESTRING"): len(planes),
        ("lineations", "LINESTRING"): len(lines), ("traces", "LINESTRING"): len(holes),
        ("collars", "POINT"): len(collars), ("intervals", "LINESTRING"): len(placed_iv)}
check(count == want, f"dxf entities {count}, want {want}")

# ---- contacts: the planted orientations recovered ----
ds = ogr.Open(f"{out}/contacts.gpkg")
lyr = ds.GetLayerByName("contacts")
got = list(lyr)
check(len(got) == 3, f"contacts: {len(got)}, want 3")
want = [(50.0, "A", "B", 40, 250, 1), (120.0, "B", "C", 65, 20, -1)]
for f, (depth, above, below, dip, dd, pol) in zip(got, want):
    where = f"contact at {depth}"
    check(abs(f["depth"] - depth) < 1e-9 and f["above"] == above and f["below"] == below, f"{where}: place and units")
    check(f["count"] == 5 and f["status"] == "oriented", f"{where}: {f['count']} readings, {f['status']}")
    check(abs(f["dip"] - dip) < 0.3 and abs((f["dip_direction"] - dd + 180) % 360 - 180) < 0.5,
          f"{where}: recovered {f['dip']:.2f}/{f['dip_direction']:.2f}, planted {dip}/{dd}")
    check(f["kappa"] > 500, f"{where}: kappa {f['kappa']}")
    check(f["polarity"] == pol, f"{where}: polarity {f['polarity']}, want {pol}")
    n = (f["nx"], f["ny"], f["nz"])
    y = (f["younging_x"], f["younging_y"], f["younging_z"])
    check(all(abs(a - pol * b) < 1e-9 for a, b in zip(y, n)), f"{where}: younging is the normal toward the younger unit")
    p = f.GetGeometryRef().GetPoint(0)
    check(abs(p[0] - (5000 + depth / 2)) < 1e-6 and abs(p[2] - (400 - depth * math.sqrt(3) / 2)) < 1e-6, f"{where}: position")
gap = got[2]
check(abs(gap["depth"] - 172.5) < 1e-9 and abs(gap["gap"] - 5) < 1e-9 and gap["status"] == "none-near"
      and gap["dip"] is None and gap["count"] == 0, "contact across the C-D gap")
csv_ct = rows(f"{out}/contacts.csv")
check([r["status"] for r in csv_ct] == ["oriented", "oriented", "none-near"], "contacts csv statuses")
for r, f in zip(csv_ct, got):
    check(r["dip"] == "" or abs(float(r["dip"]) - f["dip"]) < 0.005, "contacts csv equals gpkg")

if failures:
    print("\n".join(failures[:40]))
    sys.exit(1)
EOF
