#!/bin/sh
# corax trace --corrections: the companion table adds up (declination -
# convergence - rotation, the surveyed azimuth plus it), the .about file
# records the model, the CRS and the sign convention, and the forms that must
# agree do: the two local-grid forms, the series and its part, constants.
set -eu
T=$TMPDIR_CLI/corrections
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
G="--collars data/dated_collars.csv --surveys data/dated_surveys.csv --survey-date 2026-09-01"
CRS="--crs EPSG:32608 --convergence projection"
M="--declination model $CRS --local-grid origin=582000,6890000,rotation=-12.5"

"$CORAX" trace $G $M -o "$T/st.csv" --corrections "$T/corr.csv"
[ "$(wc -l < "$T/corr.csv")" = 8 ] || fail "one row per station: $(wc -l < "$T/corr.csv")"
head -n 1 "$T/corr.csv" | grep -q '^hole,depth,date,reference,surveyed_azimuth,declination,convergence,rotation,correction,azimuth,latitude,longitude,model,model_total_field,model_field_dip,total_field,field_dip$' \
    || fail "header: $(head -n 1 "$T/corr.csv")"
# every row: correction = declination - convergence - rotation (to rounding),
# azimuth = surveyed azimuth + correction (mod 360)
awk -F, 'NR > 1 {
    d = $6 - $7 - $8 - $9; if (d < 0) d = -d; if (d > 0.0015) { print "sum " NR; bad = 1 }
    a = ($5 + $9) - $10; a -= 360 * int(a / 360 + (a < 0 ? -0.5 : 0.5)); if (a < 0) a = -a
    if (a > 0.0015) { print "azimuth " NR; bad = 1 } } END { exit bad }' "$T/corr.csv" \
    || fail "the corrections do not add up"
# what each north gets: a true-north station no declination, a grid one nothing
grep -q '^D2,0.000,2026-08-15,true,200.000,0.000,' "$T/corr.csv" || fail "true north: $(grep '^D2,0' "$T/corr.csv")"
grep -q '^D3,0.000,2026-09-01,grid,300.000,0.000,0.000,0.000,0.000,300.000,' "$T/corr.csv" || fail "grid: $(grep '^D3,0' "$T/corr.csv")"
grep -q '^D1,0.000,2025-07-01,magnetic,.*,-12.500,.*,WMM2025,' "$T/corr.csv" || fail "collar date, rotation, model"
grep -q '^D1,100.000,2027-06-30,magnetic,' "$T/corr.csv" || fail "the station's own date"
# two years apart, the declination at D1 has moved by more than a tenth of a degree
awk -F, '$1 == "D1" && $2 == "0.000" { a = $6 } $1 == "D1" && $2 == "100.000" { b = $6 }
    END { d = a - b; if (d < 0) d = -d; exit !(d > 0.1) }' "$T/corr.csv" || fail "no drift in two years"
# the measured field beside the model's
grep -q '^D1,50.000,.*,56910.0,77.42$' "$T/corr.csv" || fail "the measured field"
# the trace took the corrections: D1's first station is its surveyed 100 plus the correction
c=$(awk -F, '$1 == "D1" && $2 == "0.000" { print $10 }' "$T/corr.csv")
grep -q "^D1,0.000,10000.000,50000.000,500.000,$c," "$T/st.csv" || fail "trace and table disagree ($c)"

# the record of the run
A="$T/st.csv.about"
grep -q '^declination = model: WMM, valid 2015-01-01 to 2029-12-31' "$A" || fail "about: model"
grep -q '^convergence = projection' "$A" || fail "about: convergence"
grep -q '^crs = EPSG:32608 (WGS 84 / UTM zone 8N)$' "$A" || fail "about: crs"
grep -q '^local_grid_rotation = -12.500000 ' "$A" || fail "about: rotation"
grep -q '^sign_convention = total correction added to a magnetic survey azimuth = declination' "$A" || fail "about: sign"
grep -q '^corrections = ' "$A" || fail "about: the companion table"

# the two forms of one local grid give the same answers: two of its points
pts=$(awk 'BEGIN { r = -12.5 * atan2(1, 1) / 45; c = cos(r); s = sin(r)
    printf "10000,50000,%.4f,%.4f,11000,51000,%.4f,%.4f", 582000 + 10000 * c + 50000 * s,
        6890000 - 10000 * s + 50000 * c, 582000 + 11000 * c + 51000 * s, 6890000 - 11000 * s + 51000 * c }')
"$CORAX" trace $G --declination model $CRS --local-grid "$pts" --corrections "$T/corr2.csv" > "$T/st2.csv"
"$CORAX" trace $G $M > "$T/st1.csv"
cmp -s "$T/st1.csv" "$T/st2.csv" || fail "two points and origin/rotation disagree"
cut -d, -f1-10 "$T/corr.csv" > "$T/a.csv"
cut -d, -f1-10 "$T/corr2.csv" > "$T/b.csv"
cmp -s "$T/a.csv" "$T/b.csv" || fail "the tables of the two forms disagree"

# the series picks WMM2025 for these dates: naming it changes nothing
"$CORAX" trace $G $M --magnetic-model WMM2025 > "$T/st3.csv"
cmp -s "$T/st1.csv" "$T/st3.csv" || fail "WMM2025 by name differs from the series"
# ... and WMM2020 cannot serve them
if "$CORAX" trace $G $M --magnetic-model WMM2020 > /dev/null 2> "$T/err"; then fail "WMM2020 served 2025-2027"; fi
grep -q 'outside the validity of the magnetic model WMM2020 (2020-01-01 to 2024-12-31)' "$T/err" || fail "$(cat "$T/err")"
# a model file in the COF layout serves as well as the built-in copy
"$CORAX" trace $G $M --magnetic-model ../../data/magnetic/WMM2025.COF > "$T/st4.csv"
cmp -s "$T/st1.csv" "$T/st4.csv" || fail "the COF file differs from the built-in model"

# constants: the table says so, and every magnetic station gets the same
"$CORAX" trace $G --declination 18 --convergence 1.5 --corrections "$T/const.csv" > /dev/null
awk -F, 'NR > 1 && $4 == "magnetic" && $9 != "16.500" { bad = 1 } END { exit bad }' "$T/const.csv" \
    || fail "constants not applied alike"
grep -q '^D2,0.000,2026-08-15,true,200.000,0.000,1.500,0.000,-1.500,' "$T/const.csv" || fail "a true station under constants"
# --survey-reference true: every station without its own reference is true north
"$CORAX" trace $G --declination 18 --survey-reference true --corrections "$T/ref.csv" > /dev/null
grep -q '^D1,0.000,2025-07-01,true,100.000,0.000,' "$T/ref.csv" || fail "--survey-reference"

# a failed run writes neither file
rm -f "$T/x.csv" "$T/xc.csv"
if "$CORAX" trace --collars data/dated_collars.csv --surveys data/dated_surveys_late.csv $M \
    -o "$T/x.csv" --corrections "$T/xc.csv" 2>/dev/null; then fail "a late date accepted"; fi
[ ! -e "$T/x.csv" ] && [ ! -e "$T/xc.csv" ] || fail "a failed run wrote files"
if "$CORAX" trace $G --corrections - 2> "$T/err"; then fail "two outputs on stdout"; fi
grep -q 'cannot both go to standard output' "$T/err" || fail "$(cat "$T/err")"
# a command that reads collars but no surveys corrects nothing, and says so
"$CORAX" export --format csv data/converted.csv --collars data/dated_collars.csv \
    --declination model -o "$T/model.csv" -q || fail "export with --declination model and no surveys"
grep -q '^declination = model (not used: no survey table read)$' "$T/model.csv.about" || fail "about without surveys"
echo ok
