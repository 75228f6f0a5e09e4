#!/bin/sh
# Progress, with the time left, shows on standard error when it is a terminal
# (here a pseudo-terminal from script(1)), and never in a pipe or with -q.
set -eu
T=$TMPDIR_CLI/progress
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
command -v script > /dev/null || { echo "SKIP: no script(1) for a terminal"; exit 0; }
P=../../examples/quillon_creek.ini
# CORAX_PROGRESS_AFTER=0: show from the start, so a short run shows it too
CORAX_PROGRESS_AFTER=0 script -qec "\"$CORAX\" convert -p $P --draws 50 -o $T/a.csv" /dev/null \
    > "$T/tty.txt" 2>&1 || fail "convert under a terminal failed"
tr '\r' '\n' < "$T/tty.txt" | grep -q '^corax: uncertainty: *[0-9]*% of [0-9]* readings, about [0-9]* s left' ||
    fail "no progress with the time left on a terminal: $(tr '\r' '\n' < "$T/tty.txt" | head -5)"
tr '\r' '\n' < "$T/tty.txt" | grep -q '^corax: uncertainty: done in [0-9]* s' || fail "no end of progress"
CORAX_PROGRESS_AFTER=0 script -qec "\"$CORAX\" convert -q -p $P --draws 50 -o $T/b.csv" /dev/null \
    > "$T/quiet.txt" 2>&1 || fail "quiet convert failed"
if grep -q 'uncertainty' "$T/quiet.txt"; then fail "progress despite -q"; fi
CORAX_PROGRESS_AFTER=0 "$CORAX" convert -p $P --draws 50 -o "$T/c.csv" 2> "$T/pipe.txt"
if grep -q 'uncertainty\|left' "$T/pipe.txt"; then fail "progress in a pipe: $(cat "$T/pipe.txt")"; fi
echo ok
