#!/bin/sh
# Golden outputs: every command line of the README's and coaxline(1)'s
# examples and of tests/golden/cases.txt, run against the built binary;
# stdout, stderr, exit status and the files a command writes are compared
# byte for byte with tests/golden/expected/*.txt.
#
#   run.sh           compare (make check); a unified diff on mismatch
#   run.sh update    rewrite tests/golden/expected/ (make golden-update)
#
# The examples are found by themselves: in README.md, lines "$ coaxline ..."
# of code blocks and inline `coaxline ...` spans (without "..."); in
# man/coaxline.1, the lines of the EXAMPLES section.  A line ending in
# "\" or "|" continues on the next.  Each command runs under /bin/sh in a
# fresh folder holding a copy of tests/golden/input/, with LC_ALL=C, no
# COAXLINE_CABLE_DIR, stdin from /dev/null.  Every command of
# `coaxline --help` must appear at least once, and every command that
# takes --input with an --input case.
set -u
src="${COAXLINE_SRCDIR:-.}"
bin="${COAXLINE_BIN:-./cli/coaxline}"
mode="${1:-check}"
gold="$src/tests/golden"
case "$mode" in check|update) ;; *) echo "usage: $0 [check|update]" >&2; exit 2 ;; esac
if [ ! -x "$bin" ]; then echo "SKIP: no coaxline binary at $bin"; exit 77; fi
case "$bin" in /*) ;; *) bin="$PWD/$bin" ;; esac

tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
mkdir "$tmp/bin" "$tmp/actual" "$tmp/home"
# The libtool wrapper costs a shell start per call; run the binary behind
# it when it is there, with the build's library first on the path.
real="$(dirname "$bin")/.libs/coaxline"
libs="${COAXLINE_BUILDDIR:-.}/lib/.libs"
if [ -x "$real" ] && [ -d "$libs" ]; then
    case "$libs" in /*) ;; *) libs="$PWD/$libs" ;; esac
    printf '#!/bin/sh\nLD_LIBRARY_PATH="%s${LD_LIBRARY_PATH:+:$LD_LIBRARY_PATH}" exec "%s" "$@"\n' \
        "$libs" "$real" >"$tmp/bin/coaxline"
else
    printf '#!/bin/sh\nexec "%s" "$@"\n' "$bin" >"$tmp/bin/coaxline"
fi
chmod +x "$tmp/bin/coaxline"

# ---- the command lists, one command a line ------------------------------

# join a line ending in "\" (the backslash dropped) or "|" with the next
join_lines() {
    awk '{ sub(/^[ \t]+/, "", $0)
           if (cont != "") $0 = cont ($0)
           if ($0 ~ /\\$/) { cont = substr($0, 1, length($0) - 1); next }
           if ($0 ~ /\|$/) { cont = $0 " "; next }
           cont = ""; print }'
}

readme_cases() {
    awk '/^```/ { code = !code; next }
         code && /^\$ coaxline/ { sub(/^\$ /, ""); take = 1 }
         code && take { print; take = ($0 ~ /(\\|\|)$/); next }
         !code { s = $0
                 while (match(s, /`coaxline[^`]*`/)) {
                     c = substr(s, RSTART + 1, RLENGTH - 2)
                     if (index(c, "...") == 0) print c
                     s = substr(s, RSTART + RLENGTH) } }' "$src/README.md" | join_lines
}

man_cases() {
    awk '/^\.SH/ { ex = ($0 ~ /^\.SH "?EXAMPLES/); next }
         ex && /^\.nf/ { nf = 1; next }
         ex && /^\.fi/ { nf = 0; next }
         ex && nf && !/^\./ { gsub(/\\-/, "-"); gsub(/\\e/, "\\"); print }' \
        "$src/man/coaxline.1" | join_lines
}

list_cases() {
    grep -v '^[[:space:]]*\(#\|$\)' "$gold/cases.txt"
}

# ---- running one command ----------------------------------------------

# section "NAME, N bytes" then the bytes, with a newline added (and said)
# when the last line has none
put() {
    n=$(wc -c <"$2")
    n=$((n + 0))
    if [ "$n" -gt 0 ] && [ -n "$(tail -c 1 "$2")" ]; then
        echo "---- $1, $n bytes, no newline at the end"; cat "$2"; echo
    else
        echo "---- $1, $n bytes"; cat "$2"
    fi
}

run_case() {
    rm -rf "$tmp/run" && mkdir "$tmp/run" && cp "$gold"/input/* "$tmp/run/"
    (cd "$tmp/run" && env -u COAXLINE_CABLE_DIR LC_ALL=C TZ=UTC HOME="$tmp/home" \
        PATH="$tmp/bin:$PATH" sh -c "$1" </dev/null >"$tmp/stdout" 2>"$tmp/stderr")
    status=$?
    echo "==== \$ $1"
    echo "---- exit $status"
    put stdout "$tmp/stdout"
    put stderr "$tmp/stderr"
    (cd "$tmp/run" && LC_ALL=C ls) | while IFS= read -r f; do
        [ -f "$gold/input/$f" ] && cmp -s "$gold/input/$f" "$tmp/run/$f" && continue
        put "file $f" "$tmp/run/$f"
    done
}

# one record per source; a command already run from that source is
# not run again
record_runs() {
    : >"$tmp/seen"
    while IFS= read -r c; do
        grep -Fxq -- "$c" "$tmp/seen" && continue
        printf '%s\n' "$c" >>"$tmp/seen"
        run_case "$c"
    done
    cat "$tmp/seen" >>"$tmp/all"
}

: >"$tmp/all"
readme_cases | record_runs >"$tmp/actual/readme.txt"
man_cases | record_runs >"$tmp/actual/man.txt"
list_cases | record_runs >"$tmp/actual/cases.txt"

# ---- every command covered -------------------------------------------

uncovered=0
for cmd in $("$bin" --help | awk '/^commands:/ { c = 1; next } c && /^  [a-z]+  / { print $1 }'); do
    if ! grep -Eq "^coaxline $cmd( |\$)" "$tmp/all"; then
        echo "FAIL: no golden case runs 'coaxline $cmd': add one to tests/golden/cases.txt"
        uncovered=$((uncovered + 1))
    elif "$bin" "$cmd" --help 2>&1 | grep -q -- '--input' &&
         ! grep -Eq "^coaxline $cmd .*--input" "$tmp/all"; then
        echo "FAIL: no golden case runs a batch of 'coaxline $cmd': add 'coaxline $cmd --input $cmd.csv'"
        echo "      to tests/golden/cases.txt and the file to tests/golden/input/"
        uncovered=$((uncovered + 1))
    fi
done

if [ "$mode" = update ]; then
    mkdir -p "$gold/expected"
    cp "$tmp/actual/"*.txt "$gold/expected/"
    echo "golden: wrote $(cat "$tmp/all" | wc -l | tr -d ' ') cases to $gold/expected/"
    [ "$uncovered" -eq 0 ]
    exit
fi

pass=0; fail=$uncovered
for t in readme man cases; do
    n=$(grep -c '^==== ' "$tmp/actual/$t.txt")
    if [ ! -f "$gold/expected/$t.txt" ]; then
        echo "FAIL: $gold/expected/$t.txt is missing (make golden-update)"
        fail=$((fail + 1))
    elif diff -u "$gold/expected/$t.txt" "$tmp/actual/$t.txt" >"$tmp/diff"; then
        echo "PASS: $t: $n commands, the same bytes"
        pass=$((pass + 1))
    else
        echo "FAIL: $t: output differs from tests/golden/expected/$t.txt:"
        cat "$tmp/diff"
        fail=$((fail + 1))
    fi
done
[ "$fail" -eq 0 ] || echo "If the change is meant: make golden-update, and review the diff of tests/golden/expected/."
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
