#!/bin/sh
# corax export --format vtk, read back by an independent general-purpose
# reader: VTK's own legacy reader (vtkPolyDataReader, Kitware's VTK 9 Python
# bindings, Debian package python3-vtk9). The reader gets default settings,
# as a modelling package would. Checked against what corax wrote elsewhere:
# point and cell counts, trace positions and depths equal to `corax trace
# --step`, dips and dip directions equal to the converted table, kind codes,
# normals, and ASCII equal to binary.
#
# meshio (python3-meshio 7.0) cannot serve here: its legacy VTK reader
# refuses DATASET POLYDATA ("Only VTK 'UNSTRUCTURED_GRID', ... supported").
set -eu
T=$TMPDIR_CLI/export_vtk
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

if ! /usr/bin/python3 -c 'import vtkmodules.vtkIOLegacy, numpy' 2>/dev/null; then
    echo "SKIP: /usr/bin/python3 cannot import VTK with numpy (apt-get install python3-vtk9 python3-numpy)"
    exit 0
fi

"$CORAX" export --format vtk $D --step 5 data/converted.csv -o "$T/discs.vtk" 2>/dev/null
"$CORAX" export --format vtk $D --step 5 --binary data/converted.csv -o "$T/discs-bin.vtk" 2>/dev/null
"$CORAX" export --format vtk $D --step 5 --shape points data/converted.csv -o "$T/points.vtk" 2>/dev/null
"$CORAX" export --format vtk $D --step 5 --shape points --binary data/converted.csv -o "$T/points-bin.vtk" 2>/dev/null
"$CORAX" export --format vtk $D --step 5 --binary -o "$T/traces.vtk"
"$CORAX" trace $D --step 5 -o "$T/trace.csv"
# an interval table as lines from, middle, to; and where trace --at puts those depths
"$CORAX" export --format vtk $D --intervals data/intervals.csv -o "$T/intervals.vtk" 2>/dev/null
awk -F, 'NR > 1 { printf "%s,%s\n%s,%.10g\n%s,%s\n", $1, $2, $1, ($2 + $3) / 2, $1, $3 }
         NR == 1 { print "hole,depth" }' data/intervals.csv > "$T/at.csv"
"$CORAX" trace $D --at "$T/at.csv" -o "$T/at_out.csv"
# lineations and the Monte Carlo columns: arrays, and arrows 2 m long
"$CORAX" export --format vtk $D --step 5 --arrows 2 data/converted_lines.csv -o "$T/lines.vtk" 2>/dev/null
"$CORAX" export --format vtk $D --step 5 --arrows 2 --binary data/converted_lines.csv -o "$T/lines-bin.vtk" 2>/dev/null

/usr/bin/python3 - "$T" data/converted.csv <<'EOF'
import csv, math, sys
from vtkmodules.vtkIOLegacy import vtkPolyDataReader
from vtkmodules.util.numpy_support import vtk_to_numpy

out, converted = sys.argv[1], sys.argv[2]
failures = []
def check(cond, what):
    if not cond:
        failures.append(what)

def read(name):
    r = vtkPolyDataReader()
    r.SetFileName(f"{out}/{name}")
    r.Update()
    pd = r.GetOutput()
    check(pd is not None and pd.GetNumberOfPoints() > 0, f"{name}: VTK read no points")
    return pd

def array(data, name):
    a = data.GetArray(name)
    check(a is not None, f"array {name} missing")
    return vtk_to_numpy(a)

# what corax trace --step 5 says: the holes with a path, their samples in order
trace = [r for r in csv.DictReader(open(f"{out}/trace.csv")) if r["status"] != "no-survey"]
holes = []
for r in trace:
    if not holes or holes[-1] != r["hole"]:
        holes.append(r["hole"])
structures = [r for r in csv.DictReader(open(converted)) if r["x"] and r["dip"]]
kinds = {"bedding": 1, "foliation": 2, "vein": 4, "fault": 5}
n_tr, n_st = len(trace), len(structures)

def check_traces(pd, name):
    depth = array(pd.GetPointData(), "depth")
    pts = vtk_to_numpy(pd.GetPoints().GetData())
    check(pd.GetNumberOfLines() == len(holes), f"{name}: {pd.GetNumberOfLines()} lines, want {len(holes)}")
    for i, r in enumerate(trace):
        check(abs(depth[i] - float(r["depth"])) < 1e-6, f"{name}: depth of trace point {i}")
        for k, c in enumerate("xyz"):
            check(abs(pts[i][k] - float(r[c])) < 2e-3, f"{name}: {c} of trace point {i}")
    lines = pd.GetLines()
    lines.InitTraversal()
    from vtkmodules.vtkCommonCore import vtkIdList
    ids = vtkIdList()
    first = 0
    for h in holes:
        lines.GetNextCell(ids)
        want = sum(1 for r in trace if r["hole"] == h)
        check(ids.GetNumberOfIds() == want, f"{name}: line of {h} has {ids.GetNumberOfIds()} points, want {want}")
        check(ids.GetId(0) == first, f"{name}: line of {h} starts at point {ids.GetId(0)}")
        first += want
    return depth, pts

def check_cells(pd, name, trace_first):
    cd = pd.GetCellData()
    kind, dip, dd = array(cd, "kind"), array(cd, "dip"), array(cd, "dip_direction")
    hole, pol = array(cd, "hole"), array(cd, "polarity")
    check(len(kind) == len(holes) + n_st, f"{name}: {len(kind)} cells")
    st = range(n_st) if not trace_first else range(len(holes), len(holes) + n_st)
    tr = range(n_st, n_st + len(holes)) if not trace_first else range(len(holes))
    for c in tr:
        check(kind[c] == -1 and dip[c] == -1 and dd[c] == -1, f"{name}: trace cell {c} marked as no plane")
    for c, r in zip(st, structures):
        # the plane comes from the table's unit normal (more digits than dip and
        # dip direction rounded to hundredths), so it agrees with both
        nx, ny, nz = (float(r[k]) for k in ("nx", "ny", "nz"))
        want_dip = math.degrees(math.atan2(math.hypot(nx, ny), nz))
        want_dd = math.degrees(math.atan2(nx, ny)) % 360
        check(abs(dip[c] - want_dip) < 1e-6, f"{name}: dip of cell {c} from the normal")
        check(abs((dd[c] - want_dd + 180) % 360 - 180) < 1e-6, f"{name}: dip direction of cell {c} from the normal")
        check(abs(dip[c] - float(r["dip"])) < 0.006, f"{name}: dip of cell {c}")
        check(abs((dd[c] - float(r["dip_direction"]) + 180) % 360 - 180) < 0.006, f"{name}: dip direction of cell {c}")
        check(kind[c] == kinds.get(r["kind"].lower(), 100), f"{name}: kind of cell {c}")
        want_hole = holes.index(r["hole"]) + 1 if r["hole"] in holes else 0
        check(hole[c] == want_hole, f"{name}: hole of cell {c}: {hole[c]} want {want_hole}")
        want_pol = {"upright": 1, "overturned": -1}.get(r["younging"], 0)
        check(pol[c] == want_pol, f"{name}: polarity of cell {c}")
    return kind, dip, dd

for name in ("discs.vtk", "discs-bin.vtk"):
    pd = read(name)
    check(pd.GetNumberOfPoints() == n_tr + 24 * n_st, f"{name}: {pd.GetNumberOfPoints()} points")
    check(pd.GetNumberOfPolys() == n_st, f"{name}: {pd.GetNumberOfPolys()} discs, want {n_st}")
    depth, pts = check_traces(pd, name)
    check_cells(pd, name, True)
    # each disc: 24 corners 5 m from its structure, in its plane
    for j, r in enumerate(structures):
        d, a = math.radians(float(r["dip"])), math.radians(float(r["dip_direction"]))
        n = (math.sin(d) * math.sin(a), math.sin(d) * math.cos(a), math.cos(d))
        c = (float(r["x"]), float(r["y"]), float(r["z"]))
        for k in range(24):
            p = pts[n_tr + 24 * j + k]
            v = [p[i] - c[i] for i in range(3)]
            check(abs(math.sqrt(sum(x * x for x in v)) - 5) < 1e-5, f"{name}: disc {j} radius")
            check(abs(sum(v[i] * n[i] for i in range(3))) < 1e-5, f"{name}: disc {j} corner off its plane")
            check(abs(depth[n_tr + 24 * j + k] - float(r["depth"])) < 1e-9, f"{name}: disc {j} depth")

for name in ("points.vtk", "points-bin.vtk"):
    pd = read(name)
    check(pd.GetNumberOfPoints() == n_tr + n_st, f"{name}: {pd.GetNumberOfPoints()} points")
    check(pd.GetNumberOfVerts() == n_st, f"{name}: {pd.GetNumberOfVerts()} vertices")
    check_traces(pd, name)
    check_cells(pd, name, False)
    normals = pd.GetPointData().GetNormals()
    check(normals is not None and normals.GetName() == "normal", f"{name}: normals missing")
    nrm = vtk_to_numpy(normals)
    for j, r in enumerate(structures):
        for k, c in enumerate(("nx", "ny", "nz")):
            check(abs(nrm[n_tr + j][k] - float(r[c])) < 1e-6, f"{name}: normal {c} of structure {j}")

pd = read("traces.vtk")
check(pd.GetNumberOfPoints() == n_tr and pd.GetNumberOfPolys() == 0, "traces only: counts")
check_traces(pd, "traces.vtk")

# ASCII and binary hold the same numbers
a, b = read("discs.vtk"), read("discs-bin.vtk")
pa, pb = vtk_to_numpy(a.GetPoints().GetData()), vtk_to_numpy(b.GetPoints().GetData())
check(abs(pa - pb).max() < 1e-6, "ASCII and binary points differ")

# lineations (VTK draws planes: the line alone is left out) and uncertainty
lined = [r for r in csv.DictReader(open("data/converted_lines.csv")) if r["x"] and r["dip"]]
with_line = [r for r in lined if r["trend"]]
for name in ("lines.vtk", "lines-bin.vtk"):
    pd = read(name)
    n_ar = len(with_line)
    check(pd.GetNumberOfPolys() == len(lined), f"{name}: {pd.GetNumberOfPolys()} discs, want {len(lined)}")
    check(pd.GetNumberOfLines() == len(holes) + n_ar, f"{name}: {pd.GetNumberOfLines()} lines, want traces and {n_ar} arrows")
    cd = pd.GetCellData()
    vec, trend, plunge = array(cd, "lineation"), array(cd, "trend"), array(cd, "plunge")
    sd = {c: array(cd, c) for c in ("dip_sd", "dip_direction_sd", "cone95", "kappa", "position_sd")}
    pts = vtk_to_numpy(pd.GetPoints().GetData())
    first_arrow = n_tr + 24 * len(lined)
    # cells: traces, arrows, discs
    for j, r in enumerate(with_line):
        c = len(holes) + j
        tr, pl = math.radians(float(r["trend"])), math.radians(float(r["plunge"]))
        want = (math.sin(tr) * math.cos(pl), math.cos(tr) * math.cos(pl), -math.sin(pl))
        check(all(abs(vec[c][k] - want[k]) < 1e-6 for k in range(3)), f"{name}: arrow {j} lineation")
        a, b = pts[first_arrow + 2 * j], pts[first_arrow + 2 * j + 1]
        check(all(abs(b[k] - a[k] - 2 * want[k]) < 1e-5 for k in range(3)), f"{name}: arrow {j} 2 m down-plunge")
        check(abs(a[0] - float(r["x"])) < 1e-6, f"{name}: arrow {j} starts at its structure")
    for j, r in enumerate(lined):
        c = len(holes) + len(with_line) + j
        if r["trend"]:
            check(abs(trend[c] - float(r["trend"])) < 1e-4 and abs(plunge[c] - float(r["plunge"])) < 1e-4, f"{name}: disc {j} trend, plunge")
        else:
            check(trend[c] == -1 and plunge[c] == -1 and not any(vec[c]), f"{name}: disc {j} has no line")
        for k, v in sd.items():
            want = float(r[k]) if r[k] else -1
            check(abs(v[c] - want) < 1e-4, f"{name}: disc {j} {k} {v[c]} want {want}")
    for c in range(len(holes)):
        check(trend[c] == -1 and sd["kappa"][c] == -1, f"{name}: trace {c} has no line or spread")

# intervals: one line of three points per placed interval, at trace --at's points
at = list(csv.DictReader(open(f"{out}/at_out.csv")))
ivs = list(csv.DictReader(open("data/intervals.csv")))
placed = [k for k in range(len(ivs)) if at[3 * k]["status"] in ("ok", "extrapolated", "collar-only", "beyond-end")]
pd = read("intervals.vtk")
check(pd.GetNumberOfLines() == len(placed), f"intervals.vtk: {pd.GetNumberOfLines()} lines, want {len(placed)}")
pts = vtk_to_numpy(pd.GetPoints().GetData())
depth = array(pd.GetPointData(), "depth")
cd = pd.GetCellData()
unit, cu = array(cd, "unit"), array(cd, "cu_pct")
codes = {}
for line in open(f"{out}/intervals.vtk.about"):
    if line.startswith("unit."):
        k, v = line.split(" = ")
        codes[int(k[5:])] = v.strip()
for j, k in enumerate(placed):
    for i in range(3):
        for c, name in enumerate("xyz"):
            check(abs(pts[3 * j + i][c] - float(at[3 * k + i][name])) < 5e-4, f"intervals.vtk: interval {k} point {i} {name}")
        check(abs(depth[3 * j + i] - float(at[3 * k + i]["depth"])) < 1e-9, f"intervals.vtk: interval {k} depth {i}")
    check(codes.get(int(unit[j])) == ivs[k]["unit"], f"intervals.vtk: unit of interval {k}")
    check(abs(cu[j] - (float(ivs[k]["cu_pct"]) if ivs[k]["cu_pct"] else -1)) < 1e-9, f"intervals.vtk: cu_pct of interval {k}")

if failures:
    print("\n".join(failures[:20]))
    sys.exit(1)
print(f"VTK read back: {len(holes)} traces, {n_tr} trace points, {n_st} structures")
EOF
echo ok
