#!/bin/sh
# check --shard K/N: 4 shards run by GNU parallel, as a batch scheduler would
# run them, on invented programs in random hole order (one with three holes'
# surveys left magnetic, whose holes fit the rest turned; one with slips in
# its runs, and a runs table). The shards' findings tables, put together
# without their headers, hold every finding of the single run about a hole
# of the per-hole checks once, and nothing else: the checks that compare
# holes (program-conventions, azimuth-offset, holes-turned-alike, and
# hole-spread and hole-turned, about one hole against the rest) are left
# out, and each shard says so. Every hole's findings are in its name's
# shard (corax_shard_of, computed here apart). A shard's report is refused.
set -eu
T=$TMPDIR_CLI/check_shard
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
command -v parallel > /dev/null || fail "GNU parallel is needed (apt-get install parallel)"
wide="^[^,]*,[^,]*,[^,]*,[^,]*,(program-conventions|azimuth-offset|holes-turned-alike|hole-spread|hole-turned),"

for variant in some-magnetic slips; do
    "${BUILD:?}/tools/invent_program" --variant "$variant" --holes 40 --seed 5 --spacing 2 \
        "$T/c.csv" "$T/s.csv" "$T/sorted.csv" 2> /dev/null || fail "invent_program $variant"
    { head -n 1 "$T/sorted.csv"; tail -n +2 "$T/sorted.csv" | awk 'BEGIN { srand(3) }
        { print rand() "\t" $0 }' | sort -k1,1 | cut -f2-; } > "$T/log.csv"
    # runs of 3 m down every hole, from the log's own depths
    tail -n +2 "$T/log.csv" | awk -F, 'BEGIN { print "hole,from,to,confidence" }
        !($1 in seen) { seen[$1] = 1; for (d = 0; d < 400; d += 3)
            print $1 "," d "," d + 3 "," (d == 30 ? "poor" : "good") }' > "$T/runs.csv"
    for runs in "" "--runs $T/runs.csv"; do
        P="--collars $T/c.csv --surveys $T/s.csv $runs"
        # shellcheck disable=SC2086
        "$CORAX" check -q $P -o "$T/single.csv" "$T/log.csv" || fail "single run ($variant)"
        rm -f "$T"/part*.csv "$T"/err*.txt
        # shellcheck disable=SC2086
        parallel --halt now,fail=1 "$CORAX" check $P --shard {}/4 -o "$T/part{}.csv" \
            "$T/log.csv" 2> "$T/err.txt" ::: 1 2 3 4 || fail "shards by GNU parallel ($variant)"
        [ "$(grep -c "each hole's own checks only; the program-wide checks" "$T/err.txt")" -eq 4 ] ||
            fail "the shards do not say what they leave out: $(cat "$T/err.txt")"
        tail -n +2 "$T/single.csv" | grep -v '^,' | grep -Ev "$wide" | sort > "$T/want.txt"
        for k in 1 2 3 4; do tail -n +2 "$T/part$k.csv"; done | sort > "$T/got.txt"
        [ -s "$T/want.txt" ] || fail "no findings about holes ($variant)"
        cmp -s "$T/want.txt" "$T/got.txt" ||
            fail "the shards' findings are not the single run's per-hole findings ($variant $runs):
$(diff "$T/want.txt" "$T/got.txt" | head -n 10)"
        [ "$variant" != some-magnetic ] || grep -Eq "$wide" "$T/single.csv" ||
            fail "the single run of $variant has no program-wide finding to leave out"
    done
    # each shard holds the findings of its holes alone, by the documented hash
    for k in 1 2 3 4; do
        tail -n +2 "$T/part$k.csv" | cut -d, -f1 | sort -u | python3 -c 'import sys
k = int(sys.argv[1])
for name in sys.stdin.read().split():
    h = 14695981039346656037
    for b in name.encode():
        h = ((h ^ b) * 1099511628211) % 2**64
    if h % 4 + 1 != k:
        print(name)' "$k" > "$T/strays.txt"
        [ ! -s "$T/strays.txt" ] || fail "shard $k holds findings of $(cat "$T/strays.txt")"
    done
done
if "$CORAX" check -q $P --shard 2/4 --report "$T/r.html" -o "$T/bad.csv" "$T/log.csv" \
    2> "$T/err.txt"; then
    fail "a shard's report was made"
fi
[ ! -e "$T/r.html" ] && [ ! -e "$T/bad.csv" ] || fail "a refused shard wrote something"
grep -q -- "--report cannot go with --shard" "$T/err.txt" || fail "report of a shard: $(cat "$T/err.txt")"
echo ok
