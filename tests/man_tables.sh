#!/bin/sh
# man_tables.sh - coaxline(1)'s OPTION INDEX and LIMITS sections are the
# option tables and the bounds table of the built binary, line for line.
#
# Each section holds a block between
#   .\" BEGIN GENERATED WHAT      and      .\" END GENERATED WHAT
# that `coaxline --generate WHAT` prints (WHAT: options, limits).  With
# --update (make man-update) the blocks are rewritten instead of compared.
srcdir=${COAXLINE_SRCDIR:-${srcdir:-.}}
bin=${COAXLINE_BIN:-./cli/coaxline}
page="$srcdir/man/coaxline.1"
update=0
[ "${1:-}" = "--update" ] && update=1
tmp=$(mktemp -d) || exit 99
trap 'rm -rf "$tmp"' EXIT
status=0
for what in options limits; do
    if ! "$bin" --generate "$what" > "$tmp/$what.want"; then
        echo "man_tables: $bin --generate $what failed"
        exit 1
    fi
    begin=".\\\" BEGIN GENERATED $what"
    end=".\\\" END GENERATED $what"
    if [ "$(grep -c -F -x "$begin" "$page")" != 1 ] || [ "$(grep -c -F -x "$end" "$page")" != 1 ]; then
        echo "man_tables: $page needs exactly one '$begin' and one '$end' line"
        status=1
        continue
    fi
    # markers through the environment: awk -v would take their backslash
    # as an escape
    export begin end
    awk '$0 == ENVIRON["end"] { on = 0 } on { print } $0 == ENVIRON["begin"] { on = 1 }' \
        "$page" > "$tmp/$what.have"
    if [ $update = 1 ]; then
        want="$tmp/$what.want" && export want
        awk '$0 == ENVIRON["end"] { while ((getline l < ENVIRON["want"]) > 0) print l; on = 0 }
             !on { print }
             $0 == ENVIRON["begin"] { on = 1 }' "$page" > "$tmp/page" && cat "$tmp/page" > "$page"
        echo "man_tables: $what block of $page rewritten"
    elif ! diff -u "$tmp/$what.have" "$tmp/$what.want"; then
        echo "man_tables: the $what block of $page differs from $bin --generate $what" \
             "(above: - the page, + the tables); run make man-update and review the diff"
        status=1
    fi
done
[ $status = 0 ] && [ $update = 0 ] && echo "man_tables: OPTION INDEX and LIMITS match the tables"
exit $status
