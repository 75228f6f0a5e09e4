#!/bin/sh
# Make the seed corpus of the fuzzing harnesses (tests/fuzz/corpus/HARNESS)
# from the command-line tests' data (tests/cli/data: invented) and a few
# hand-made files. The corpus is committed; run this again after changing
# it, then add back the inputs of past findings (named finding-*, which
# this script leaves alone).
#
# A command harness's input: byte 0 picks its argument line, byte 1 where
# the main output goes (bits 0-2: 0 a new file, 1 over a file, 2 in a
# missing folder, 3 through a symlink, 4 a new file and an output operation
# fails with ENOSPC, 5 over a file and one fails with EIO, 6 a symlink to
# /dev/full, 7 standard output on /dev/full; bits 3-7: which operation
# fails, 0 the first), then its files separated by 0x1e (see
# tests/fuzz/commands.c for the order).
set -eu
cd "$(dirname "$0")"
D=../cli/data
C=corpus
mkdir -p "$C"
for h in reader names project trace convert check stereonet section export plan solve merge; do
    mkdir -p "$C/$h"
    find "$C/$h" -type f ! -name 'finding-*' -delete
done

byte() { printf "\\$(printf %o "$1")"; }
sep() { printf '\036'; }

# seed HARNESS NAME VARIANT SINK FILE... (- for an empty file)
seed() {
    h=$1 name=$2 v=$3 s=$4
    shift 4
    {
        byte "$v"
        byte "$s"
        first=1
        for file in "$@"; do
            [ $first = 1 ] || sep
            first=0
            [ "$file" = - ] || cat "$file"
        done
    } > "$C/$h/$name"
}

T=$(mktemp -d)
trap 'rm -rf "$T"' EXIT

# ---- hand-made files ----
cat > "$T/trace.ini" <<'EOF'
; the fuzzing folder is the project file's folder
[inputs]
collars = collars.csv
surveys = surveys.csv

[survey]
dip_convention = negative-down
declination = 2.5
convergence = -0.5
reject = T1@50

[collars]
units = metres

[output]
delimiter = semicolon
decimal_mark = comma
EOF
cat > "$T/convert.ini" <<'EOF'
[inputs]
collars = collars.csv
surveys = surveys.csv
structures = log.csv

[core]
reference_line = bottom
beta_end = down-hole
near_parallel = 12

[structures]
interval_depth = mid
hole = hole
depth = depth

[kind_codes]
BD = bedding
VN = vein

[confidence_codes]
G = good
P = poor

[uncertainty]
draws = 4
seed = 9
EOF
cat > "$T/check.ini" <<'EOF'
[inputs]
collars = collars.csv
surveys = surveys.csv
structures = log.csv

[check]
title = Fuzzed program
gap = 40
dogleg = 2
runs = runs.csv
low_confidence = poor,low

[columns]
depth = depth
EOF
cat > "$T/net.ini" <<'EOF'
[converted]
delimiter = comma
decimal_mark = auto

[core]
near_parallel = 10
EOF
cat > "$T/section.ini" <<'EOF'
[inputs]
collars = collars.csv
surveys = surveys.csv

[section]
azimuth = 90

[tables]
delimiter = auto
EOF
cat > "$T/export.ini" <<'EOF'
[inputs]
collars = collars.csv
surveys = surveys.csv
structures = converted.csv

[survey]
crs = EPSG:28355
EOF
cat > "$T/plan.ini" <<'EOF'
[survey]
dip_convention = negative-down
declination = 3

[core]
near_parallel = 15
EOF
cat > "$T/runs.csv" <<'EOF'
hole,from,to,confidence
T1,0,30,good
T1,30,60,fair
T1,60,90,poor
T2,0,50,good
EOF
cat > "$T/other.csv" <<'EOF'
hole,depth,kind,hole_azimuth,hole_plunge,dip,dip_direction,trend,plunge,status
T2,10,joint,180,80,30,200,,,ok
T2,20,lineation,180,80,,,40,180,ok
T2,30,joint,180,80,35,210,,,ok
EOF
printf 'hole;x;y;z;azimuth;dip;length\nT1;1000,5;2000;300;90;-60;200\n' > "$T/semi_collars.csv"
printf 'hole;depth;azimuth;dip\nT1;0;90;-60\nT1;50,5;91;-59\n' > "$T/semi_surveys.csv"
printf 'hole,depth,alpha,beta\r\n"T1",10,30,90\r\n# a comment\r\nT1,"20,5",45,\r\n' > "$T/crlf_log.csv"

# ---- trace: collars, surveys, at, project ----
i=0
for v in 0 1 2 3 4 5 6 7; do
    seed trace "v$v" $v 0 $D/collars.csv $D/surveys.csv $D/at.csv "$T/trace.ini"
done
for s in 1 2 3 6 7; do
    seed trace "sink$s" 1 $s $D/collars.csv $D/surveys.csv $D/at.csv "$T/trace.ini"
done
for k in 0 1 2 3 5 8 9; do # output operation k fails: writes, syncs, renames
    seed trace "fail$k" 2 $((4 + 8 * k)) $D/collars.csv $D/surveys.csv $D/at.csv "$T/trace.ini"
    seed trace "eio$k" 0 $((5 + 8 * k)) $D/collars.csv $D/surveys.csv $D/at.csv "$T/trace.ini"
done
seed trace semi 5 0 "$T/semi_collars.csv" "$T/semi_surveys.csv" - -
seed trace bad 0 0 $D/bad_collars.csv $D/bad_surveys.csv - -
seed trace bom 0 0 $D/bom_collars.csv $D/bom_surveys.csv - -
seed trace long 2 0 $D/long_collars.csv $D/header_only_surveys.csv - -
seed trace orphan 0 0 $D/collars.csv $D/orphan_surveys.csv - -

# ---- convert: collars, surveys, log, project ----
for v in 0 1 2 3 4 5 6 7; do
    seed convert "v$v" $v 0 $D/collars.csv $D/surveys.csv $D/log.csv "$T/convert.ini"
done
for s in 1 3 6 7 4 12 20 28 5 45 61 77; do
    seed convert "sink$s" 2 $s $D/collars.csv $D/surveys.csv $D/log_mc.csv "$T/convert.ini"
done
seed convert crlf 0 0 $D/collars.csv $D/surveys.csv "$T/crlf_log.csv" -
seed convert dup 0 0 $D/collars.csv $D/surveys.csv $D/log_dup_header.csv -
seed convert arrival 1 0 $D/arrival_clean/collars.csv $D/arrival_clean/surveys.csv \
    $D/arrival_clean/core_log.csv $D/arrival_clean/clean.ini

# ---- check: collars, surveys, log, runs, project ----
for v in 0 1 2 3 4 5 6; do
    seed check "v$v" $v 0 $D/collars.csv $D/surveys.csv $D/log.csv "$T/runs.csv" "$T/check.ini"
done
for s in 1 3 6 7 4 12 20 5 69 85; do
    seed check "sink$s" 1 $s $D/collars.csv $D/surveys.csv $D/log.csv "$T/runs.csv" \
        "$T/check.ini"
done
seed check bad 0 0 $D/bad_collars.csv $D/bad_surveys.csv $D/log.csv - -

# ---- stereonet: converted, other, project ----
for v in 0 1 2 3 4 5 6 7; do
    seed stereonet "v$v" $v 0 $D/converted_checks.csv "$T/other.csv" "$T/net.ini"
done
for s in 1 3 6 7 4 12 5 53 69; do
    seed stereonet "sink$s" 1 $s $D/converted.csv "$T/other.csv" "$T/net.ini"
done
seed stereonet lines 2 0 $D/converted_lines.csv $D/converted_bad_hole.csv -
seed stereonet bad 0 0 $D/converted_bad_rows.csv - -

# ---- section: collars, surveys, converted, project ----
for v in 0 1 2 3; do
    seed section "v$v" $v 0 $D/collars.csv $D/surveys.csv $D/converted.csv "$T/section.ini"
done
for s in 1 3 6 7 4 12 20 5 69 85; do
    seed section "sink$s" 1 $s $D/collars.csv $D/surveys.csv $D/converted.csv "$T/section.ini"
done
seed section bad 0 0 $D/collars.csv $D/surveys.csv $D/bad_converted.csv -

# ---- export: collars, surveys, converted, intervals, project ----
for v in 0 1 2 3 4 5 6 7; do
    seed export "v$v" $v 0 $D/collars.csv $D/surveys.csv $D/converted.csv $D/intervals.csv \
        "$T/export.ini"
done
for s in 1 3 6 7 4 12 20 5 37 53; do
    seed export "sink$s" 3 $s $D/collars.csv $D/surveys.csv $D/converted.csv $D/intervals.csv \
        "$T/export.ini"
done
seed export bad 6 0 $D/collars.csv $D/surveys.csv $D/bad_converted.csv $D/intervals_bad.csv -
seed export contacts 6 0 $D/contact_collars.csv $D/surveys.csv $D/converted.csv \
    $D/contact_units.csv -

# ---- plan: holes, sets, targets, project ----
for v in 0 1 2 3 4 5; do
    seed plan "v$v" $v 0 $D/plan_holes.csv $D/plan_sets.csv $D/plan_targets.csv "$T/plan.ini"
done
for s in 1 3 6 7 4 12 5 69 85; do
    seed plan "sink$s" 1 $s $D/plan_holes.csv $D/plan_sets.csv $D/plan_targets.csv "$T/plan.ini"
done
seed plan bad 0 0 $D/plan_bad_holes.csv $D/plan_sets.csv - -
seed plan steep 5 0 $D/plan_steep_holes.csv $D/plan_vertical_set.csv $D/plan_targets.csv -
seed plan q7 1 0 $D/plan_q7_10_hole.csv $D/plan_q7_10_sets.csv $D/plan_targets.csv -

# ---- solve: collars, surveys, readings, project ----
for v in 0 1 2 3; do
    seed solve "v$v" $v 0 $D/solve_collars.csv $D/solve_surveys.csv $D/solve_readings.csv \
        "$T/plan.ini"
done
for s in 1 3 6 7 4 12 5 69; do
    seed solve "sink$s" 0 $s $D/solve_collars.csv $D/solve_surveys.csv $D/solve_readings.csv \
        "$T/plan.ini"
done

# ---- merge: log, shard 1 of 2, shard 2 of 2, project (the shards made by
# corax itself, CORAX or the build's) ----
CORAX=${CORAX:-../../build/corax}
for k in 1 2; do
    "$CORAX" convert -q --collars $D/collars.csv --surveys $D/surveys.csv --shard $k/2 \
        -o "$T/part$k.csv" $D/log.csv
done
for v in 0 1 2; do
    seed merge "v$v" $v 0 $D/log.csv "$T/part1.csv" "$T/part2.csv" "$T/trace.ini"
done
for s in 1 3 6 7 4 12 5 69; do
    seed merge "sink$s" 0 $s $D/log.csv "$T/part1.csv" "$T/part2.csv" -
done
seed merge swapped 0 0 $D/log.csv "$T/part2.csv" "$T/part1.csv" -
seed merge short 0 0 $D/log2.csv "$T/part1.csv" "$T/part2.csv" -

# ---- project: byte 0 the command (bits 0-2) and line (bits 3-7), byte 1 the
# sink and the handler's stop (bits 4-7), then the project file ----
cmd=0
for f in trace convert check net section export plan; do # each with its command
    seed project "$f" $cmd 0 "$T/$f.ini"
    seed project "$f-first" $((cmd + 8)) 0 "$T/$f.ini"
    cmd=$((cmd + 1))
done
n=0
for f in $D/project/*.ini $D/arrival_clean/clean.ini; do # and the tests' own, turn about
    seed project "$(basename "$f" .ini)" $((n % 7 + 8 * (n % 3))) 0 "$f"
    seed project "$(basename "$f" .ini)-2" $(((n + 3) % 7)) 0 "$f"
    n=$((n + 1))
done
seed project stop 1 48 "$T/convert.ini"

# ---- reader: byte 0 the delimiter (bits 0-1), decimal mark (2-3) and
# small read block (4-7), then the table ----
n=0
for f in $D/*.csv $D/arrival_clean/*.csv "$T"/*.csv; do
    {
        byte $(((n * 37) % 256))
        cat "$f"
    } > "$C/reader/$(basename "$f" .csv)"
    n=$((n + 1))
done
{ byte 0; printf 'a,"b\n"",c",d\r\ne,"f""\r\n"\n'; } > "$C/reader/quoted"
{ byte 114; printf '\357\273\277# comment\n\n  ; \nhole;depth\nT1;"1,5"\n;\n'; } > "$C/reader/bom_semi"
{ byte 58; printf 'x\ty\n1,5\t2\n\n"3"\t 4 \n'; } > "$C/reader/tab"

# ---- names: a column map, a second, a header, code words, values ----
{
    printf 'hole=HOLE_ID, depth = Depth (m),alpha=a'; sep
    printf 'depth=From,kind=Type'; sep
    printf 'HOLE_ID,Depth (m),a,beta,hole id,Hole-ID,x,X,,log_x'; sep
    printf 'BD=bedding,VN=vein, G = good ,bd=Bedding plane'; sep
    printf 'BD,vn,bedding,xx, Vein ,,G,good,xx'
} > "$C/names/basic"
{
    printf 'x=east'; sep
    printf 'y=north,z=rl'; sep
    printf 'East,north,RL,dip,dip_direction,status,note,hole_azimuth'; sep
    printf 'a=b,c=d,A=e'; sep
    printf 'a,C,b,e,f'
} > "$C/names/coordinates"
{ sep; sep; printf 'a,a'; sep; printf '=x,y='; sep; printf ','; } > "$C/names/empty"
