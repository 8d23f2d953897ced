#!/bin/sh
# complexity.sh - no function in cli/ or lib/ longer than 60 lines or above
# a cyclomatic complexity of 15 (pmccabe, Debian package pmccabe: its
# traditional McCabe number and its line count), except those named in
# tests/complexity_allow.txt, the list still to be split up.  An allowed
# function that has come within the limits must leave the list, so that it
# only shrinks.  Skipped when pmccabe is not installed.
srcdir=${COAXLINE_SRCDIR:-${srcdir:-.}}
MAX_LINES=60
MAX_CC=15
if ! command -v pmccabe >/dev/null 2>&1; then
    echo "complexity: pmccabe not installed, skipped"
    exit 77
fi
allow="$srcdir/tests/complexity_allow.txt"
tmp=$(mktemp) || exit 99
trap 'rm -f "$tmp"' EXIT
(cd "$srcdir" && pmccabe cli/*.c lib/*.c) |
    awk -v L=$MAX_LINES -v C=$MAX_CC '
        { split($6, f, "("); print f[1] " " $7 " " (($2 > C || $5 > L) ? "over" : "within") " " $2 " " $5 }' \
    > "$tmp"
status=0
over=0
while read -r file func verdict cc lines; do
    allowed=$(grep -v '^#' "$allow" | grep -c -x -F "$file $func")
    if [ "$verdict" = over ]; then
        over=$((over + 1))
        if [ "$allowed" = 0 ]; then
            echo "complexity: $file: $func has $lines lines and complexity $cc (at most $MAX_LINES and $MAX_CC)"
            status=1
        fi
    elif [ "$allowed" != 0 ]; then
        echo "complexity: $file: $func is within the limits now ($lines lines, complexity $cc): take it off $allow"
        status=1
    fi
done < "$tmp"
grep -v '^#' "$allow" | while read -r file func; do
    [ -n "$file" ] || continue
    grep -q "^$file $func " "$tmp" || { echo "complexity: $allow names $file $func, which does not exist"; exit 1; }
done || status=1
echo "complexity: $(wc -l < "$tmp") functions, $over over the limits (all on the allow-list when this passes)"
exit $status
