#!/bin/sh
# Command-line tests. Runs every data-driven case in cases/*.case, then every
# shell test in test_*.sh. Needs CORAX (the command) in the environment.
#
# A case file:
#   # what it checks (comments anywhere before the first section)
#   args: trace --collars data/collars.csv ...    (shell words; run from tests/cli)
#   rc: 1                                         (exit status, default 0)
#   --- stdin                                     (optional sections, each exact)
#   --- stdout
#   --- stderr
set -u
cd "$(dirname "$0")" || exit 1
: "${CORAX:?set CORAX to the corax command}"
export CORAX
TMPDIR_CLI=$(mktemp -d "${TMPDIR:-/tmp}/corax-cli.XXXXXX") || exit 1
trap 'rm -rf "$TMPDIR_CLI"' EXIT
export TMPDIR_CLI
pass=0 failed=0

section() { # section NAME FILE -> the section's text on stdout
    awk -v want="--- $1" '
        /^--- / { on = ($0 == want); next }
        on { print }' "$2"
}
has_section() { grep -qx -- "--- $1" "$2"; }

for case in cases/*.case; do
    name=$(basename "$case" .case)
    args=$(sed -n 's/^args: //p' "$case" | head -n 1)
    want_rc=$(sed -n 's/^rc: //p' "$case" | head -n 1)
    want_rc=${want_rc:-0}
    out="$TMPDIR_CLI/$name.out" err="$TMPDIR_CLI/$name.err"
    if has_section stdin "$case"; then
        section stdin "$case" > "$TMPDIR_CLI/$name.in"
    else
        : > "$TMPDIR_CLI/$name.in"
    fi
    eval "\"\$CORAX\" $args" < "$TMPDIR_CLI/$name.in" > "$out" 2> "$err"
    rc=$?
    ok=1
    if [ "$rc" != "$want_rc" ]; then
        echo "FAIL $name: exit status $rc, expected $want_rc"; ok=0
    fi
    for s in stdout stderr; do
        has_section $s "$case" || continue
        got=$out; [ $s = stderr ] && got=$err
        section $s "$case" > "$TMPDIR_CLI/$name.want"
        if ! diff -u "$TMPDIR_CLI/$name.want" "$got" > "$TMPDIR_CLI/$name.diff"; then
            echo "FAIL $name: $s differs"; sed 's/^/    /' "$TMPDIR_CLI/$name.diff" | head -40; ok=0
        fi
    done
    if [ $ok = 1 ]; then pass=$((pass + 1)); else failed=$((failed + 1)); fi
done

for t in test_*.sh; do
    [ -f "$t" ] || continue
    if sh "$t" > "$TMPDIR_CLI/script.log" 2>&1; then
        pass=$((pass + 1))
    else
        echo "FAIL $t:"; sed 's/^/    /' "$TMPDIR_CLI/script.log" | tail -30
        failed=$((failed + 1))
    fi
done

echo "command-line tests: $pass passed, $failed failed"
[ $failed = 0 ]
