#!/bin/sh
# man_lint.sh - the manual pages format without a troff warning (groff -ww,
# at the default width and at the narrow and wide widths man(1) uses), and
# no option entry runs on from the paragraph above it (a missing .TP, which
# troff does not warn about).
srcdir=${COAXLINE_SRCDIR:-${srcdir:-.}}
status=0
if ! command -v groff >/dev/null 2>&1; then
    echo "man_lint: groff not installed, skipped"
    exit 77
fi
for page in "$srcdir/man/coaxline.1" "$srcdir/man/libcoaxline.3"; do
    for width in default 60n 200n; do
        if [ "$width" = default ]; then
            warn=$(groff -man -ww -z "$page" 2>&1)
        else
            warn=$(groff -man -ww -z -rLL="$width" "$page" 2>&1)
        fi
        if [ -n "$warn" ]; then
            echo "man_lint: $page (line length $width):"
            echo "$warn"
            status=1
        fi
    done
    # an option entry (".B \-\-name", then a sentence of its own) straight
    # after a sentence of running text: a missing .TP
    runon=$(awk '{ line[NR] = $0 }
                 END { for (i = 2; i < NR; i++)
                           if (line[i] ~ /^\.B \\-\\-/ && line[i-1] !~ /^\./ &&
                               line[i-1] ~ /[.)]$/ && line[i+1] ~ /^[A-Z]/)
                               print FILENAME ":" i ": " line[i] " follows text without .TP" }' "$page")
    if [ -n "$runon" ]; then
        echo "$runon"
        status=1
    fi
done
# the --cables entry names every command that looks a cable up (--cable)
bin=${COAXLINE_BIN:-}
if [ -n "$bin" ] && [ -x "$bin" ]; then
    entry=$(awk '/^\.B \\-\\-cables FILE/ { on = 1; next } on && /^\.TP/ { exit } on' \
            "$srcdir/man/coaxline.1")
    for cmd in $("$bin" --help | awk '/^commands:/ { on = 1; next } on && /^$/ { exit } on { print $1 }'); do
        "$bin" "$cmd" --help | grep -q '^  --cable ' || continue
        if ! printf '%s\n' "$entry" | grep -q "^\.B[R]* $cmd\( \|\$\)"; then
            echo "man_lint: coaxline.1: --cables does not name '$cmd', which takes --cable"
            status=1
        fi
    done
fi
[ $status -eq 0 ] && echo "man_lint: both pages format cleanly"
exit $status
