#!/bin/sh
# Output that never destroys data: no output may be an input or another
# output; devices, pipes and standard output are written straight and their
# write errors reported; a symlink is written through and a file keeps its
# mode; a failed run changes nothing (the record of the run included); a run
# stopped by a signal leaves no temporary file.
set -eu
T=$TMPDIR_CLI/outputs
mkdir -p "$T"
fail() { echo "FAIL: $*"; exit 1; }
D="--collars data/collars.csv --surveys data/surveys.csv"
cp data/log2.csv "$T/log.csv"
cp data/collars.csv "$T/collars.csv"
leftovers() { ls -A "$T" | grep '\.part$' || true; }

# an output that is an input, or another output: refused, nothing touched
refused() { # refused WHAT COMMAND...
    what=$1; shift
    cp "$T/log.csv" "$T/before.csv"
    if "$@" 2> "$T/err"; then fail "$what accepted"; fi
    grep -q "corax never writes over its own inputs\|each output needs a file of its own" "$T/err" || fail "$what: $(cat "$T/err")"
    cmp -s "$T/log.csv" "$T/before.csv" || fail "$what changed the log"
    cmp -s "$T/collars.csv" data/collars.csv || fail "$what changed the collars"
}
refused "convert -o LOG LOG" "$CORAX" convert $D -o "$T/log.csv" "$T/log.csv"
refused "trace -o COLLARS" "$CORAX" trace --collars "$T/collars.csv" --surveys data/surveys.csv -o "$T/collars.csv"
refused "--about LOG" "$CORAX" convert $D --about "$T/log.csv" -o "$T/out.csv" "$T/log.csv"
refused "--cloud = -o" "$CORAX" convert $D --draws 10 --cloud "$T/same.csv" -o "$T/same.csv" "$T/log.csv"
refused "--report = -o" "$CORAX" check $D "$T/log.csv" --report "$T/same.csv" -o "$T/same.csv"
refused "--stats = -o" "$CORAX" stereonet data/converted.csv --stats "$T/same.svg" -o "$T/same.svg"
ln -s log.csv "$T/alias.csv" # another name for an input is the same file
refused "-o a symlink to the input" "$CORAX" convert $D -o "$T/alias.csv" "$T/log.csv"
ln "$T/log.csv" "$T/hard.csv"
refused "-o a hard link to the input" "$CORAX" convert $D -o "$T/hard.csv" "$T/log.csv"
[ -z "$(leftovers)" ] || fail "temporaries left: $(leftovers)"

# devices: /dev/full says the disk is full, /dev/null stays a device
if [ -w /dev/full ]; then
    if "$CORAX" trace $D -o /dev/full 2> "$T/err"; then fail "a full disk went unnoticed"; fi
    grep -q "^corax: /dev/full: cannot write: No space left on device$" "$T/err" || fail "full: $(cat "$T/err")"
    [ -c /dev/full ] || fail "/dev/full is no longer a device"
fi
"$CORAX" trace $D -o /dev/null
[ -c /dev/null ] || fail "/dev/null is no longer a device"
[ ! -e /dev/null.about ] || fail "a record was written beside /dev/null"
# /dev/stdout is the descriptor as it stands: appended to what the shell wrote
{ echo before; "$CORAX" trace $D -o /dev/stdout; } > "$T/stdout.txt"
[ "$(head -n 1 "$T/stdout.txt")" = before ] || fail "/dev/stdout replaced what stood before"
[ "$(wc -l < "$T/stdout.txt")" -gt 5 ] || fail "/dev/stdout lost the table"
# a pipe by name
mkfifo "$T/fifo"
cat "$T/fifo" > "$T/from_fifo.txt" &
"$CORAX" trace $D -o "$T/fifo"
wait
[ -p "$T/fifo" ] || fail "the pipe was replaced"
[ "$(wc -l < "$T/from_fifo.txt")" -gt 5 ] || fail "nothing came through the pipe"

# a symlink is written through to its file; the file keeps its mode
echo old > "$T/target.csv"
chmod 600 "$T/target.csv"
ln -s target.csv "$T/link.csv"
"$CORAX" trace $D -o "$T/link.csv"
[ -L "$T/link.csv" ] || fail "the symlink was replaced by a file"
grep -q '^hole,depth,x,' "$T/target.csv" || fail "the file behind the symlink was not written"
[ "$(stat -c %a "$T/target.csv")" = 600 ] || fail "mode 600 became $(stat -c %a "$T/target.csv")"

# GIS files are made whole by GDAL in a private folder, then put in place:
# never over a pipe or a device (a rename would replace it), through a
# symlink to its file, keeping a file's mode (found by tests/fuzz: export)
if "$CORAX" export --format geojson --no-traces -o "$T/fifo" data/converted.csv 2> "$T/err"; then
    fail "a GIS file onto a pipe accepted"
fi
grep -q "writes a file: give -o FILE (not standard output, a device or a pipe)" "$T/err" \
    || fail "GIS onto a pipe: $(cat "$T/err")"
[ -p "$T/fifo" ] || fail "a GIS export replaced the pipe"
echo old > "$T/target.geojson"
chmod 600 "$T/target.geojson"
ln -s target.geojson "$T/link.geojson"
"$CORAX" export --format geojson --no-traces -q -o "$T/link.geojson" data/converted.csv
[ -L "$T/link.geojson" ] || fail "a GIS export replaced the symlink by a file"
grep -q FeatureCollection "$T/target.geojson" || fail "the GIS file behind the symlink was not written"
[ "$(stat -c %a "$T/target.geojson")" = 600 ] \
    || fail "GIS: mode 600 became $(stat -c %a "$T/target.geojson")"
rm -f "$T/link.geojson" "$T/link.geojson.about"

# no file name, a folder: clear messages naming them
if "$CORAX" trace $D -o "" 2> "$T/err"; then fail "an empty name accepted"; fi
grep -q "cannot write: the file name is empty" "$T/err" || fail "empty: $(cat "$T/err")"
if "$CORAX" trace $D -o "$T" 2> "$T/err"; then fail "a folder accepted"; fi
grep -q "^corax: $T: cannot write: it is a folder$" "$T/err" || fail "folder: $(cat "$T/err")"

# the record cannot be written: the run fails and the output stays as it was
echo old > "$T/kept.csv"
if "$CORAX" trace $D -o "$T/kept.csv" --about "$T/no/such/folder/x.about" 2> "$T/err"; then
    fail "a lost record went unnoticed"
fi
[ "$(cat "$T/kept.csv")" = old ] || fail "the output was replaced although the run failed"
grep -q "x.about: cannot write" "$T/err" || fail "record: $(cat "$T/err")"

# stopped by a signal while writing: no temporary is left, the old output stays
for sig in INT TERM; do
    rm -f "$T/in.fifo"
    mkfifo "$T/in.fifo"
    echo old > "$T/stopped.csv"
    "$CORAX" convert $D -o "$T/stopped.csv" "$T/in.fifo" 2>/dev/null &
    pid=$!
    exec 3> "$T/in.fifo"          # the log arrives slowly: the run waits for it
    printf 'hole,depth,alpha,beta\nT1,10,30,90\n' >&3
    n=0
    while [ -z "$(leftovers)" ] && [ $n -lt 100 ]; do sleep 0.1; n=$((n + 1)); done
    [ -n "$(leftovers)" ] || fail "the run never opened its output"
    kill -$sig $pid
    wait $pid || true
    exec 3>&-
    [ -z "$(leftovers)" ] || fail "SIG$sig left $(leftovers)"
    [ "$(cat "$T/stopped.csv")" = old ] || fail "SIG$sig changed the output"
done
echo ok
