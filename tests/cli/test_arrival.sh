#!/bin/sh
# Tables as they arrive (examples/arrival: semicolons and decimal commas,
# feet and inclination from vertical, a tab-separated log with a byte-order
# mark and CRLF, from/to intervals, code words, a top-of-hole line, comment
# lines, blank rows and padded names) convert to the same answers, row for
# row, as the same program in corax's plain form; and the converted table
# reads back into every command that takes one, with no options beyond the
# project file that made it.
set -eu
T=$TMPDIR_CLI/arrival
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
EX=../../examples/arrival
CLEAN=data/arrival_clean

"$CORAX" convert -p $EX/arrival.ini -o "$T/messy.csv" 2> "$T/messy.err"
"$CORAX" convert -p $CLEAN/clean.ini -o "$T/clean.csv" 2> "$T/clean.err"
# every skipped line is said, and no code is left without a word
grep -q "collars.txt: 2 comment lines and 1 blank row skipped" "$T/messy.err" || fail "collar skips not said"
grep -q "core_log.txt: 1 comment line and 1 blank row skipped" "$T/messy.err" || fail "log skips not said"
if grep -q "warning" "$T/messy.err"; then fail "warnings on a fully mapped log: $(cat "$T/messy.err")"; fi
# the record says how each table was read
grep -q "^surveys = .*surveys.txt (delimiter comma, found; decimal mark point, found; feet;" "$T/messy.csv.about" || fail "surveys' format not recorded"
grep -q "^structures = .*core_log.txt (delimiter tab, found;" "$T/messy.csv.about" || fail "log's format not recorded"
grep -q "^surveys_dip_convention = from-vertical$" "$T/messy.csv.about" || fail "surveys' dip convention not recorded"

[ -x /usr/bin/python3 ] || { echo "SKIP: no /usr/bin/python3 for the row-by-row comparison"; exit 0; }
/usr/bin/python3 - "$T/messy.csv" "$T/clean.csv" <<'PY'
import csv, sys
messy = list(csv.DictReader(open(sys.argv[1])))
clean = list(csv.DictReader(open(sys.argv[2])))
assert len(messy) == len(clean) == 182, (len(messy), len(clean))
same = ["x", "y", "z", "hole_azimuth", "hole_plunge", "dip", "dip_direction", "strike",
        "pole_trend", "pole_plunge", "nx", "ny", "nz", "trend", "plunge", "status", "note",
        "kind", "confidence"]
for i, (m, c) in enumerate(zip(messy, clean)):
    assert m["Hole ID"] == c["hole"], (i, m["Hole ID"], c["hole"])
    assert abs(float(m["depth"]) - float(c["depth"])) < 1e-9, (i, m["depth"], c["depth"])
    for k in same:
        assert m[k] == c[k], (i + 2, k, m[k], c[k])
print("182 rows equal")
PY

# the converted table reads back: section, stereonet (the same Terzaghi
# weighted count as the plain form's), export and check
"$CORAX" section -p $EX/arrival.ini --origin 10300,50100 --azimuth 135 --width 400 "$T/messy.csv" -o "$T/s.csv" 2>/dev/null || fail "section cannot read it"
"$CORAX" section -p $CLEAN/clean.ini --origin 10300,50100 --azimuth 135 --width 400 "$T/clean.csv" -o "$T/s2.csv" 2>/dev/null
[ "$(wc -l < "$T/s.csv")" -gt 100 ] || fail "the section holds too few structures"
last5() { awk -F, '{ print $(NF-4), $(NF-3), $(NF-2), $(NF-1), $NF }' "$1"; }
last5 "$T/s.csv" > "$T/s.cut"; last5 "$T/s2.csv" > "$T/s2.cut"
cmp -s "$T/s.cut" "$T/s2.cut" || fail "the sections differ"
"$CORAX" stereonet -p $EX/arrival.ini --terzaghi --group-by kind "$T/messy.csv" --stats "$T/m.stats" -o "$T/m.svg" 2>/dev/null || fail "stereonet cannot read it"
"$CORAX" stereonet -p $CLEAN/clean.ini --terzaghi --group-by kind "$T/clean.csv" --stats "$T/c.stats" -o "$T/c.svg" 2>/dev/null
cmp -s "$T/m.stats" "$T/c.stats" || fail "stereonet statistics differ: $(diff "$T/m.stats" "$T/c.stats" | head -5)"
"$CORAX" export -p $EX/arrival.ini --format csv "$T/messy.csv" -o "$T/m.model.csv" 2>/dev/null || fail "export cannot read it"
"$CORAX" export -p $CLEAN/clean.ini --format csv "$T/clean.csv" -o "$T/c.model.csv" 2>/dev/null
cut -d, -f1-9 "$T/m.model.csv" > "$T/m.cut"; cut -d, -f1-9 "$T/c.model.csv" > "$T/c.cut"
cmp -s "$T/m.cut" "$T/c.cut" || fail "exported positions and planes differ"
"$CORAX" check -p $EX/arrival.ini -o "$T/m.findings.csv" 2>/dev/null || fail "check cannot read the tables"
"$CORAX" check -p $CLEAN/clean.ini -o "$T/c.findings.csv" 2>/dev/null
cut -d, -f1-5 "$T/m.findings.csv" | sort > "$T/m.f"; cut -d, -f1-5 "$T/c.findings.csv" | sort > "$T/c.f"
cmp -s "$T/m.f" "$T/c.f" || fail "check finds otherwise: $(diff "$T/m.f" "$T/c.f" | head -5)"

# the spreadsheet form (semicolons, decimal commas) reads back just the same
"$CORAX" convert -p $EX/arrival.ini --output-delimiter semicolon --output-decimal-mark comma -o "$T/sheet.csv" 2>/dev/null
grep -q '^QC001;6.01;6.11;6;209;;FT;G;MK;;6,0600;fault;good;10252,144;' "$T/sheet.csv" || fail "spreadsheet form: $(sed -n 2p "$T/sheet.csv")"
"$CORAX" stereonet --terzaghi --group-by kind "$T/sheet.csv" --stats "$T/s.stats" -o "$T/s3.svg" 2>/dev/null || fail "spreadsheet form does not read back"
cmp -s "$T/s.stats" "$T/c.stats" || fail "spreadsheet form reads back otherwise"

# bad settings or tables: a message naming file and line, and no output at all
D="--collars data/collars.csv --surveys data/surveys.csv"
for bad in "--surveys-dip-convention from-vertical" "--columns depth=DEPTH_M" \
           "--collars data/ambiguous_collars.csv"; do
    rm -f "$T/bad.csv" "$T/bad.csv.about"
    if "$CORAX" trace $D $bad -o "$T/bad.csv" 2> "$T/bad.err"; then fail "accepted: $bad"; fi
    grep -q '^corax: data/[a-z_]*\.csv:[0-9]*: ' "$T/bad.err" || fail "no FILE:LINE for $bad: $(cat "$T/bad.err")"
    [ ! -e "$T/bad.csv" ] && [ ! -e "$T/bad.csv.about" ] || fail "a file was written for: $bad"
done

# the README lists every column name corax takes, as `corax help columns` does
"$CORAX" help columns | awk '/^  [a-z_]+ / { print $1 }' > "$T/columns"
[ "$(wc -l < "$T/columns")" -gt 20 ] || fail "help columns lists too few"
while read -r c; do
    grep -q "^  | \`$c\` |" ../../README.md || fail "README lacks the column $c"
done < "$T/columns"
echo ok
