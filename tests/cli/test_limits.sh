#!/bin/sh
# Input limits: endless input with no line end, an over-long line, too many
# fields, a very wide header, and a NUL byte anywhere, each an error naming
# the file and line (memory stays bounded and the header check is not
# quadratic).
set -eu
T=$TMPDIR_CLI/limits
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
S="--surveys data/surveys.csv"

expect() { # expect MESSAGE COMMAND...: the command fails with MESSAGE
    want=$1; shift
    if "$@" > /dev/null 2> "$T/err"; then fail "accepted: $*"; fi
    grep -q -- "$want" "$T/err" || fail "$*: $(head -c 300 "$T/err")"
}
expect "^corax: /dev/zero:1: the file holds NUL bytes" "$CORAX" trace --collars /dev/zero $S
head -c 3000000 /dev/zero | tr '\0' 'a' > "$T/long.csv"
expect "^corax: $T/long.csv:1: the line is longer than 1 MiB" "$CORAX" trace --collars "$T/long.csv" $S
awk 'BEGIN { printf "hole"; for (i = 0; i < 20000; i++) printf ",c%d", i; print "" }' > "$T/wide.csv"
expect "^corax: $T/wide.csv:1: the row has more than 10000 fields" "$CORAX" trace --collars "$T/wide.csv" $S
# 9,999 columns, two of them the same name far apart: found and named
awk 'BEGIN { printf "hole,x,y,z"; for (i = 0; i < 9990; i++) printf ",c%d", i; print ",C17" }' > "$T/dup.csv"
expect "column name 'c17' appears twice in the header (columns 22 and 9995)" "$CORAX" trace --collars "$T/dup.csv" $S
# a NUL byte past the first MiB read (found by tests/fuzz: reader): refused
# with its line, not carried into the output as a hole name cut short
awk 'BEGIN { print "hole,depth,alpha,beta"; for (i = 0; i < 90000; i++) print "T1,10,30,90" }' \
    > "$T/late_nul.csv"
printf 'T1\000X,10,30,90\n' >> "$T/late_nul.csv"
expect "^corax: $T/late_nul.csv:90002: the file holds NUL bytes" \
    "$CORAX" convert --collars data/collars.csv $S -o "$T/late_nul.out" "$T/late_nul.csv"
[ ! -e "$T/late_nul.out" ] || fail "a table with a NUL byte was converted"
echo ok
