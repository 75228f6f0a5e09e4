#!/bin/sh
# corax check on whole invented programs (tools/invent_program.c): ten holes
# drilled all round the compass through two fabrics (Fisher kappa 40-60 as
# logged), logged sparsely (a reading every 5 to 6 m), from fixed seeds.
# - clean programs raise no warning at all: the false-alarm rate, measured
#   over 20 seeds of sparse logging and 3 of dense (a reading every 0.5 m);
# - a program logged against a top-of-hole line, or anticlockwise, or with
#   its surveys left magnetic (declination 7 east), or with three holes'
#   surveys alone left magnetic, raises its own program-wide finding (empty
#   hole column) naming the cause, with its numbers, and nothing else;
# - holes nearly parallel cannot tell the conventions, and a note says so;
# - slips of two or three readings in sparse logging (beta + 180, 360 -
#   beta) are found with the default options, at their depths: the
#   detection rate over 20 seeds, and no other warning.
# The conventions, the declination's sign and the kappa range are common
# practice: docs/check-values.md, "QA of a drill program".
set -eu
T=$TMPDIR_CLI/check_program
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
INVENT=${BUILD:?}/tools/invent_program

# invent VARIANT SEED [options]: the program into $T, checked into $T/f.csv
invent() {
    v=$1 seed=$2
    shift 2
    "$INVENT" --variant "$v" --seed "$seed" "$@" "$T/c.csv" "$T/s.csv" "$T/l.csv" 2> "$T/made" ||
        fail "invent_program $v $seed"
    "$CORAX" check -q --collars "$T/c.csv" --surveys "$T/s.csv" "$T/l.csv" -o "$T/f.csv" ||
        fail "check of the $v program"
}
# rows of warnings and errors (not the header)
serious() { awk -F, 'NR > 1 && ($4 == "warning" || $4 == "error")' "$T/f.csv"; }
# the program-wide rows of a check
wide() { awk -F, -v c="$1" 'NR > 1 && $1 == "" && $5 == c' "$T/f.csv"; }

# ---- the false-alarm rate on clean programs ----
alarms=0 readings=0 programs=0
for spacing in 5.5 0.5; do
    seeds=20
    [ "$spacing" = 0.5 ] && seeds=3
    for seed in $(seq 1 $seeds); do
        invent clean "$seed" --spacing "$spacing"
        # the fabrics as logged scatter as a real log's do: kappa 40 to 60
        for k in $(sed -n 's/.*bedding kappa \([0-9]*\); foliation kappa \([0-9]*\).*/\1 \2/p' "$T/made"); do
            [ "$k" -ge 40 ] && [ "$k" -le 60 ] || fail "seed $seed: a fabric's kappa is $k, not 40-60"
        done
        n=$(serious | wc -l)
        [ "$n" = 0 ] || serious | sed 's/^/    /'
        alarms=$((alarms + n))
        readings=$((readings + $(tail -n +2 "$T/l.csv" | wc -l)))
        programs=$((programs + 1))
    done
done
echo "clean programs: $alarms warnings or errors in $programs programs ($readings readings)"
[ "$alarms" = 0 ] || fail "clean programs raised $alarms warnings"

# ---- each program-wide mistake raises its own finding, and nothing else ----
only() { # only CHECK WORDS: the one warning is program-wide, of CHECK, with WORDS
    [ "$(serious | wc -l)" = 1 ] || { serious | sed 's/^/    /'; fail "$v: not one warning"; }
    wide "$1" | grep -q "$2" || { cat "$T/f.csv"; fail "$v: no program-wide $1 naming '$2'"; }
    wide "$1" | cut -c1-240 | sed "s/^/  $v: /"
}
invent top-line 1
only program-conventions 'as if the orientation line marked the top of the hole'
wide program-conventions | grep -q 'bedding and foliation cluster across the holes with kappa' ||
    fail "the kappas are not told"
invent anticlockwise 1
only program-conventions 'as if beta was measured anticlockwise looking down the hole'
invent magnetic 1
only azimuth-offset 'degrees west of the collar set-ups in 10 of 10 holes'
wide azimuth-offset | grep -q 'a declination or grid correction not applied' || fail "no cause"
mean=$(wide azimuth-offset | sed -n 's/.*sit \([0-9.]*\) +- .*/\1/p')
awk -v m="$mean" 'BEGIN { exit !(m >= 6.5 && m <= 7.5) }' || fail "offset $mean, not 7.0"
invent some-magnetic 1
wide azimuth-offset | grep -q 'the survey azimuths of 3 holes (IP02, IP05 and IP08) sit' ||
    { cat "$T/f.csv"; fail "no offset of the three holes"; }
wide azimuth-offset | cut -c1-240 | sed 's/^/  some-magnetic: /'

# ---- holes nearly parallel cannot tell ----
invent top-line 1 --parallel
wide program-conventions | grep -q ',note,.*cannot tell whether its conventions are right' ||
    { cat "$T/f.csv"; fail "parallel holes: no note"; }
[ "$(serious | wc -l)" = 0 ] || fail "parallel holes: a warning"

# ---- slips in sparse logging ----
found=0 planted=0 others=0
for seed in $(seq 1 20); do
    invent slips "$seed"
    while read -r tag hole from to how; do
        [ "$tag" = slip ] || continue
        planted=$((planted + 1))
        words="adding 180 to beta"
        [ "$how" = 360-beta ] && words="mirroring beta"
        if awk -F, -v h="$hole" -v a="$from" -v b="$to" -v w="$words" '
            $1 == h && $5 == "run-disagrees" && $2 <= b + 0.01 && $3 >= a - 0.01 &&
            index($0, w) { hit = 1 } END { exit !hit }' "$T/f.csv"; then
            found=$((found + 1))
        else
            echo "  seed $seed: the slip $how in $hole $from-$to m is not named"
        fi
    done < "$T/made"
    others=$((others + $(serious | grep -vc ',run-disagrees,' || true)))
done
echo "slips of 2-3 readings in sparse logging: $found of $planted found; $others other warnings"
[ "$others" = 0 ] || fail "warnings besides the slips"
[ $((found * 100)) -ge $((planted * 90)) ] || fail "only $found of $planted slips found"
echo ok
