#!/bin/sh
# corax check: the findings table and the HTML report from real files; exit 0
# whatever is found; the report self-contained, every hole in it, the caution
# at head and foot; a failed run leaves nothing behind.
set -eu
T=$TMPDIR_CLI/check_report
mkdir -p "$T"
D="--collars data/collars.csv --surveys data/surveys.csv"
fail() { echo "FAIL: $*"; exit 1; }

"$CORAX" check -q $D data/log.csv -o "$T/findings.csv" --report "$T/report.html" --title 'Test <program>'
[ -s "$T/findings.csv" ] || fail "no findings table"
[ -s "$T/report.html" ] || fail "no report"
grep -q '^# *\|^; What this corax run assumed' "$T/findings.csv.about" || fail "no record of the run"
for hole in T1 T2 T3 T4 UP1 NOPE; do
    grep -q ">$hole<" "$T/report.html" || fail "hole $hole missing from the report"
done
grep -q 'Test &lt;program&gt;' "$T/report.html" || fail "the title is not escaped"
[ "$(grep -c 'competent person' "$T/report.html")" -ge 2 ] || fail "the caution is not at head and foot"
if grep -qi '<script' "$T/report.html"; then fail "the report has a script"; fi
if grep -o 'https\?://[^"]*' "$T/report.html" | grep -v '^http://www.w3.org/2000/svg$' | grep -q .; then
    fail "the report refers outside itself"
fi
# every finding's message is in the report (HTML-escaped as the report writes it)
tail -n +2 "$T/findings.csv" | while IFS= read -r line; do
    check=$(printf '%s\n' "$line" | awk -F, '{ print $5 }')
    grep -q "$check" "$T/report.html" || fail "check $check missing from the report"
done

# a report that cannot be written: exit 1, and no half files
if "$CORAX" check -q $D data/log.csv -o "$T/f2.csv" --report /nonexistent/r.html 2> "$T/err"; then
    fail "wrote a report to nowhere"
fi
grep -q 'cannot write' "$T/err" || fail "unclear error: $(cat "$T/err")"
[ -z "$(ls -A "$T" | grep '\.part$' || true)" ] || fail "temporary files left"
echo ok
