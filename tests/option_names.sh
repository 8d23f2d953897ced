#!/bin/sh
# option_names.sh - every option name a command file looks up is declared.
#
# For each cli/cmd_*.c, the preprocessed source (shared option groups such
# as CLI_DUO_OPTDEFS expanded) gives the names of its cli_optdef tables
# and the string literals passed to cli_get, cli_count, cli_flag and
# cli_items.  A literal that no table of the file declares fails the test:
# at run time such a look-up aborts (cli/common.c), and this finds it on
# paths no test runs.  Names built at run time are left to that abort.
set -u
srcdir=${srcdir:-.}
top_builddir=${top_builddir:-.}
cc=${CC:-cc}
tmp=$(mktemp -d) || exit 99
trap 'rm -rf "$tmp"' EXIT

status=0
checked=0
for f in "$srcdir"/cli/cmd_*.c; do
    name=$(basename "$f" .c)
    if ! $cc -E -P -I"$top_builddir" -I"$srcdir/lib" -I"$top_builddir/lib" -I"$srcdir/cli" \
        "$f" > "$tmp/$name.i" 2> "$tmp/$name.err"; then
        echo "option_names: cannot preprocess $f:" >&2
        cat "$tmp/$name.err" >&2
        exit 99
    fi
    # declared: the first string of each { "name", ... } inside a
    # cli_optdef array initializer
    awk '
        /cli_optdef[ \t]+[a-z_0-9]+[ \t]*\[[^]]*\][ \t]*=/ { in_table = 1 }
        in_table {
            line = $0
            while (match(line, /\{ *"[^"]*"/)) {
                s = substr(line, RSTART, RLENGTH)
                sub(/^\{ *"/, "", s); sub(/"$/, "", s)
                print s
                line = substr(line, RSTART + RLENGTH)
            }
            if ($0 ~ /\};/) in_table = 0
        }' "$tmp/$name.i" | sort -u > "$tmp/$name.decl"
    # looked up: cli_get(a, "x", ...), cli_count(a, "x"), cli_flag(a, "x"),
    # cli_items(ctx, a, "x", ...)
    grep -o 'cli_\(get\|count\|flag\|items\)([^;()"]*"[^"]*"' "$tmp/$name.i" |
        sed 's/.*"\([^"]*\)"$/\1/' | sort -u > "$tmp/$name.used"
    if ! grep -q 'cli_optdef' "$tmp/$name.i"; then
        echo "option_names: $f: no cli_optdef table found" >&2
        status=1
        continue
    fi
    for opt in $(comm -23 "$tmp/$name.used" "$tmp/$name.decl"); do
        echo "option_names: $f looks up '$opt', which its option table does not declare" >&2
        status=1
    done
    checked=$((checked + $(wc -l < "$tmp/$name.used")))
done
echo "option_names: $checked look-ups checked in $(ls "$srcdir"/cli/cmd_*.c | wc -l) command files"
exit $status
