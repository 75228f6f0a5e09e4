#!/bin/sh
# Work split by hole across machines: convert --shard K/N on 4 shards, run by
# GNU parallel as a batch scheduler would run them, merged by corax merge,
# gives the single run's table byte for byte; plainly and with draws (each
# hole's Monte Carlo stream is seeded by its name), on a log in random hole
# order; and the single run is the same on 1 and 2 threads. A merge of
# shards out of order, of the wrong count or of another log writes nothing.
set -eu
T=$TMPDIR_CLI/shard
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
command -v parallel > /dev/null || fail "GNU parallel is needed (apt-get install parallel)"
"${BUILD:?}/tools/invent_program" --holes 40 --seed 7 --spacing 2 "$T/c.csv" "$T/s.csv" \
    "$T/sorted.csv" 2> /dev/null || fail "invent_program"
# the rows in random hole order, as real multi-hole logs are
{ head -n 1 "$T/sorted.csv"; tail -n +2 "$T/sorted.csv" | awk 'BEGIN { srand(11) }
    { print rand() "\t" $0 }' | sort -k1,1 | cut -f2-; } > "$T/log.csv"
P="--collars $T/c.csv --surveys $T/s.csv"
rows=$(($(wc -l < "$T/log.csv") - 1))
[ "$rows" -gt 1000 ] || fail "the invented log is too small: $rows rows"

for extra in "" "--draws 20"; do
    # shellcheck disable=SC2086
    OMP_NUM_THREADS=1 "$CORAX" convert -q $P $extra -o "$T/one.csv" "$T/log.csv" ||
        fail "single run ($extra)"
    # shellcheck disable=SC2086
    OMP_NUM_THREADS=2 "$CORAX" convert -q $P $extra -o "$T/two.csv" "$T/log.csv" ||
        fail "single run on 2 threads ($extra)"
    cmp -s "$T/one.csv" "$T/two.csv" || fail "1 and 2 threads differ ($extra)"
    rm -f "$T"/part*.csv
    # shellcheck disable=SC2086
    parallel --halt now,fail=1 "$CORAX" convert -q $P $extra --shard {}/4 \
        -o "$T/part{}.csv" "$T/log.csv" ::: 1 2 3 4 || fail "shards by GNU parallel ($extra)"
    for k in 1 2 3 4; do
        n=$(($(wc -l < "$T/part$k.csv") - 1))
        [ "$n" -gt 0 ] && [ "$n" -lt "$rows" ] || fail "shard $k holds $n of $rows rows"
    done
    "$CORAX" merge -q --structures "$T/log.csv" -o "$T/merged.csv" \
        "$T/part1.csv" "$T/part2.csv" "$T/part3.csv" "$T/part4.csv" || fail "merge ($extra)"
    cmp -s "$T/one.csv" "$T/merged.csv" || fail "merged shards differ from the single run ($extra)"
done

# every hole's rows in one shard, by the documented hash: shard K holds the
# holes whose FNV-1a 64 of the name, mod 4, is K - 1 (computed here apart)
tail -n +2 "$T/log.csv" | cut -d, -f1 | sort -u | python3 -c 'import sys
for name in sys.stdin.read().split():
    h = 14695981039346656037
    for b in name.encode():
        h = ((h ^ b) * 1099511628211) % 2**64
    print(h % 4 + 1, name)' > "$T/hashed.txt"
for k in 1 2 3 4; do
    want=$(awk -v k="$k" '$1 == k { print $2 }' "$T/hashed.txt" | tr '\n' ' ')
    got=$(tail -n +2 "$T/part$k.csv" | cut -d, -f1 | sort -u | tr '\n' ' ')
    [ "$want" = "$got" ] || fail "shard $k holds holes $got, the hash gives $want"
done

# faults: nothing written
for args in "part2.csv part1.csv part3.csv part4.csv" "part1.csv part2.csv part3.csv" \
    "part1.csv part2.csv part3.csv part4.csv part4.csv"; do
    # shellcheck disable=SC2086
    if (cd "$T" && "$CORAX" merge -q --structures log.csv -o bad.csv $args 2> err.txt); then
        fail "merge of $args succeeded"
    fi
    [ ! -e "$T/bad.csv" ] || fail "merge of $args wrote its output"
    grep -q "not given in order 1 to\|more rows than" "$T/err.txt" || fail "merge of $args: $(cat "$T/err.txt")"
done
if "$CORAX" merge -q --structures "$T/sorted.csv" -o "$T/bad.csv" "$T/part1.csv" "$T/part2.csv" \
    "$T/part3.csv" "$T/part4.csv" 2> /dev/null; then
    fail "merge against the log in another order succeeded"
fi
# a shard that no reader would take (a NUL byte; a line of over 1 MiB), or
# with a row that would not read back as convert wrote it (a field too many,
# a '#' first, which makes it a comment, a quote in a bare field), is refused,
# not copied into a merged table
for fault in nul long wide comment quote; do
    cp "$T/part1.csv" "$T/faulty.csv"
    case $fault in
    nul) printf 'x\000y\n' >> "$T/faulty.csv"; want="holds NUL bytes" ;;
    long) head -c 1100000 /dev/zero | tr '\0' a >> "$T/faulty.csv"; want="longer than 1 MiB" ;;
    wide) sed -i '2s/$/,more/' "$T/faulty.csv"; want="fields but the header has" ;;
    comment) sed -i '2s/^/#/' "$T/faulty.csv"; want="not as convert writes one" ;;
    quote) sed -i '2s/^\([^,]*\),/\1x"y"z,/' "$T/faulty.csv"; want="not as convert writes one" ;;
    esac
    if "$CORAX" merge -q --structures "$T/log.csv" -o "$T/bad.csv" "$T/faulty.csv" \
        "$T/part2.csv" "$T/part3.csv" "$T/part4.csv" 2> "$T/err.txt"; then
        fail "merge of a shard with $fault succeeded"
    fi
    [ ! -e "$T/bad.csv" ] || fail "merge of a shard with $fault wrote its output"
    grep -q "faulty.csv:[0-9]*: .*$want" "$T/err.txt" || fail "shard with $fault: $(cat "$T/err.txt")"
done
if "$CORAX" convert -q $P --shard 5/4 -o "$T/bad.csv" "$T/log.csv" 2> "$T/err.txt"; then
    fail "--shard 5/4 accepted"
fi
grep -q "is not K/N" "$T/err.txt" || fail "--shard 5/4: $(cat "$T/err.txt")"
echo ok
