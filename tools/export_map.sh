#!/bin/sh
# The version script of libcorax.so: of the global symbols the library's
# objects define, those that a public header (include/corax/*.h) names are
# exported; every other one (the helpers modules share inside the library)
# stays local.
set -eu
cd "$(dirname "$0")/.."
tmp=${TMPDIR:-/tmp}/corax-export.$$
trap 'rm -f "$tmp".*' EXIT
nm -g --defined-only "$@" | awk 'NF == 3 && $2 ~ /^[TDRBGSV]$/ { print $3 }' | sort -u > "$tmp.defined"
grep -ohw 'corax_[A-Za-z0-9_]*' include/corax/*.h | sort -u > "$tmp.public"
echo "CORAX_0 {"
echo "  global:"
comm -12 "$tmp.defined" "$tmp.public" | sed 's/^/    /; s/$/;/'
echo "  local:"
echo "    *;"
echo "};"
