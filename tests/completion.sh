#!/bin/sh
# completion.sh - the bash completion script generated from the option
# tables completes what the tables say: commands, every command's options
# (the same set as COMMAND --help lists), --band names of the band table,
# --cable names of the catalog, files after a file option, the choices of
# --format and of choice options.  Words are completed by calling the
# script's function with COMP_WORDS set, as bash does on TAB.
bin=${COAXLINE_BIN:-./cli/coaxline}
if ! command -v bash >/dev/null 2>&1; then
    echo "completion: bash not installed, skipped"
    exit 77
fi
tmp=$(mktemp -d) || exit 99
trap 'rm -rf "$tmp"' EXIT
"$bin" --generate completion > "$tmp/coaxline" || { echo "completion: generate failed"; exit 1; }
mkdir "$tmp/files" && : > "$tmp/files/spools.csv" && : > "$tmp/files/sweep.s1p"

status=0
# complete WORDS...: the candidates for the last word, sorted, one a line
complete_words() {
    (cd "$tmp/files" && bash -c '
        . "$1"; shift
        COMP_WORDS=("$@"); COMP_CWORD=$(($# - 1)); COMPREPLY=()
        _coaxline
        printf "%s\n" "${COMPREPLY[@]}" | sort' x "$tmp/coaxline" coaxline "$@")
}
# expect NAME CANDIDATE... -- WORDS...: each candidate is offered
expect() {
    name=$1; shift
    want=""
    while [ "$1" != "--" ]; do want="$want $1"; shift; done
    shift
    got=$(complete_words "$@")
    for w in $want; do
        if ! printf '%s\n' "$got" | grep -qx -- "$w"; then
            echo "completion: $name: '$w' not offered for: coaxline $*"
            echo "  offered: $(printf '%s' "$got" | tr '\n' ' ')"
            status=1
        fi
    done
}

# the script registers itself
if ! bash -c '. "$1"; complete -p coaxline' x "$tmp/coaxline" | grep -q -- '-F _coaxline coaxline'; then
    echo "completion: complete -p coaxline does not name _coaxline"
    status=1
fi
# commands (every one coaxline --help lists), then options
cmds=$("$bin" --help | awk '/^commands:/ { on = 1; next } on && /^$/ { exit } on { print $1 }')
expect commands $cmds --help --version -- ''
expect prefix cut cables -- c
for c in $cmds; do
    # exactly the options of COMMAND --help
    "$bin" "$c" --help | sed -n 's/^  \(--[a-z0-9-]*\).*/\1/p' | sort > "$tmp/help"
    complete_words "$c" -- | grep '^--' > "$tmp/offered"
    if ! cmp -s "$tmp/help" "$tmp/offered"; then
        echo "completion: options of $c differ from coaxline $c --help:"
        diff "$tmp/help" "$tmp/offered"
        status=1
    fi
done
expect option-prefix --allowance --allowance-vf -- cut --allow
# values: band names from the table, cable names from the catalog
# (band names: the ITU band table, data/bands.csv; cable: data/cables.csv)
expect band 160m 80m 40m -- pair --length 1m,2m --vf 0.66 --band ''
expect band-prefix 160m -- phase --band 16
expect cable RG-58 RG-213 -- loss --cable RG-
expect format text csv json -- cut --format ''
expect units metric imperial -- vf --units ''
expect choice crossfire endfire -- pattern --feed ''
expect file spools.csv -- cut --input sp
expect file sweep.s1p -- sweep --file sw
expect cables-file spools.csv -- loss --cables ''
# a number is not completed with option names
if [ -n "$(complete_words cut --offset '')" ]; then
    echo "completion: something offered after --offset (a number)"
    status=1
fi
[ $status = 0 ] && echo "completion: commands, options, bands, cables, files and choices complete"
exit $status
