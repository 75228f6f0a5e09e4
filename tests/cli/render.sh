# Sourced by the render tests: builds png_colours into $T and defines
# shot FILE PNG WIDTH HEIGHT [CHROMIUM-OPTION...], a headless Chromium
# screenshot of a page or picture. The caller has checked that chromium is
# installed and defined fail().
${CC:-cc} -O2 -o "$T/png_colours" png_colours.c -lpng || fail "cannot build png_colours (libpng-dev)"

shot() {
    file=$1 png=$2 size="$3,$4"
    shift 4
    profile=$(mktemp -d "$T/profile.XXXXXX")
    timeout 120 chromium --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
        --disable-background-networking --disable-component-update --disable-sync \
        --user-data-dir="$profile" --screenshot="$png" --window-size="$size" "$@" \
        "file://$file" > "$T/chromium.log" 2>&1 || true
    rm -rf "$profile"
    [ -s "$png" ] || { cat "$T/chromium.log"; fail "no screenshot of $file"; }
}
