#!/bin/sh
# check_cycles.sh OBJECT...: no circles in the code's dependencies. Three
# graphs are checked, each with tsort (which names every loop it meets):
#   files    A.o -> B.o when A uses a function or variable that B defines
#            (from nm: A's undefined symbols, B's defined ones);
#   modules  the same between folders (src/io -> src/survey, ...);
#   headers  X -> Y when X #includes the project's header Y.
# Exit 0 when all three are free of loops, 1 (the loops on standard error)
# when not. Run by `make check`; see DEVELOPERS.md.
set -u
[ $# -gt 0 ] || { echo "usage: check_cycles.sh OBJECT..." >&2; exit 2; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/corax-cycles.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT

# Every object's defined (D) and undefined (U) global symbols: "obj kind sym".
for o in "$@"; do
    nm "$o" | awk -v o="$o" '
        NF == 3 && $2 ~ /^[TDBRCGSV]$/ { print o, "D", $3 }
        NF == 2 && $1 == "U" { print o, "U", $2 }'
done > "$tmp/symbols" || exit 2

# Edges user -> definer, for files and for their folders.
awk '
    $2 == "D" { def[$3] = $1 }
    $2 == "U" { use[++n] = $1 " " $3 }
    function dir(p) { sub(/\/[^\/]*$/, "", p); return p }
    END {
        for (i = 1; i <= n; i++) {
            split(use[i], u, " ")
            if (!(u[2] in def) || def[u[2]] == u[1])
                continue
            print u[1], def[u[2]] > "'"$tmp"'/files"
            if (dir(u[1]) != dir(def[u[2]]))
                print dir(u[1]), dir(def[u[2]]) > "'"$tmp"'/modules"
        }
    }' "$tmp/symbols"
touch "$tmp/files" "$tmp/modules"

# Edges between the project's own headers (and the sources including them).
root=$(cd "$(dirname "$0")/.." && pwd)
(cd "$root" && for f in src/*/*.c src/*/*.h include/corax/*.h; do
    [ -f "$f" ] || continue
    sed -n 's/^#include "\([^"]*\)".*/\1/p' "$f" | while read -r h; do
        if [ -f "include/$h" ]; then echo "$f include/$h"; elif [ -f "src/$h" ]; then echo "$f src/$h"; fi
    done
done) > "$tmp/headers"

status=0
for graph in files modules headers; do
    if ! tsort "$tmp/$graph" > /dev/null 2> "$tmp/loops" || [ -s "$tmp/loops" ]; then
        echo "check_cycles: the $graph depend on each other in a circle:" >&2
        sed 's/^/  /' "$tmp/loops" >&2
        status=1
    fi
done
[ $status = 0 ] && echo "check_cycles: no circles among $# objects, their folders and headers"
exit $status
