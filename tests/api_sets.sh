#!/bin/sh
# The public API is one set of functions, named the same in four places:
#   - the functions lib/coaxline.h declares,
#   - the functions lib/.libs/libcoaxline.so exports (nm -D --defined-only),
#   - the names listed in the version node of lib/libcoaxline.map,
#   - the functions man/libcoaxline.3 documents: a prototype in one of its
#     .nf/.fi blocks (prose mentions do not count).
# Names are compared exactly (no substring matches), and each prototype in
# the man page must be the header's, up to spaces.  The library exports no
# data, and every symbol carries the map's version node (where the linker
# took the script).  tests/api_coverage.sh checks that each function is
# walked by tests/check_api; tests/api_order.sh the order of arguments.
src="${COAXLINE_SRCDIR:-.}"
lib="${COAXLINE_BUILDDIR:-.}/lib/.libs/libcoaxline.so"
hdr="$src/lib/coaxline.h"
man="$src/man/libcoaxline.3"
map="$src/lib/libcoaxline.map"
if [ ! -f "$lib" ]; then echo "SKIP: no shared library at $lib"; exit 77; fi
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT

# Header: comments and preprocessor lines removed, one declaration a line.
awk -f "$src/tests/api_decls.awk" "$hdr" >"$tmp/hdr.decl"

# Man page: the text of the .nf/.fi blocks, roff escapes undone, each
# block ending a declaration, one declaration a line.
awk '/^\.nf/ { inblk = 1; next }
     /^\.fi/ { inblk = 0; t = t ";"; next }
     inblk && !/^\./ && !/^[ \t]*#/ { gsub(/\\-/, "-"); gsub(/\\e/, "\\"); t = t " " $0 }
     END { m = split(t, decl, ";"); for (k = 1; k <= m; k++) print decl[k] }' "$man" >"$tmp/man.decl"

# "name<TAB>prototype" for each declaration of a cxl_ function (a pointer
# to one has a ')' after its name), spaces normalised.
protos() {
    grep -E '(^|[^A-Za-z0-9_])cxl_[a-z][a-z0-9_]*[[:space:]]*\(' "$1" |
    sed -E 's/[[:space:]]+/ /g; s/ ?([*(),]) ?/\1/g; s/^ //; s/ $//; s/^extern "C" ?\{ ?//' |
    sed -E 's/^(.*[^A-Za-z0-9_])?(cxl_[a-z][a-z0-9_]*)\(/\2	&/' | sort -u
}
protos "$tmp/hdr.decl" >"$tmp/hdr.proto"
protos "$tmp/man.decl" >"$tmp/man.proto"
cut -f1 "$tmp/hdr.proto" | sort -u >"$tmp/header"
cut -f1 "$tmp/man.proto" | sort -u >"$tmp/manpage"
nm -D --defined-only "$lib" | awk '$2 ~ /^[TWi]$/ {sub(/@.*/, "", $3); print $3}' | sort -u >"$tmp/exported"
# the map's names: between "global:" and "local:", comments removed
sed 's#/\*.*\*/##; /\/\*/,/\*\//d' "$map" |
    awk '/global:/ { on = 1; next } /local:/ { on = 0 } on' | tr -d ' \t;' | grep . | sort >"$tmp/mapfile"

pass=0; fail=0
# one line per name that is in $1 and not in $2
missing() {
    comm -23 "$tmp/$1" "$tmp/$2" | while read -r f; do echo "FAIL: $f: $3"; done
}
check() {
    out=$(missing "$@")
    if [ -n "$out" ]; then echo "$out"; fail=$((fail + $(echo "$out" | wc -l)))
    else pass=$((pass + 1)); fi
}
check exported header "exported by the library but not declared in lib/coaxline.h"
check header exported "declared in lib/coaxline.h but not exported (not defined, or not cxl_[a-z])"
check header manpage "declared in lib/coaxline.h but has no prototype in man/libcoaxline.3"
check manpage header "has a prototype in man/libcoaxline.3 but is not declared in lib/coaxline.h"
check exported manpage "exported but not documented in man/libcoaxline.3"
check header mapfile "declared in lib/coaxline.h but not listed in lib/libcoaxline.map"
check mapfile header "listed in lib/libcoaxline.map but not declared in lib/coaxline.h"
check mapfile exported "listed in lib/libcoaxline.map but not exported"
# no data, and every symbol under the map's version node
data=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[DBRVdbr]$/ {print $3}')
if [ -n "$data" ]; then
    echo "FAIL: data symbols are exported (the API is functions only):"; echo "$data"; fail=$((fail + 1))
else pass=$((pass + 1)); fi
node=$(sed -n 's/^\([A-Z][A-Z0-9_.]*\)[[:space:]]*{.*/\1/p' "$map" | tail -n 1)
if nm -D --defined-only "$lib" | awk '$2 == "A"' | grep -q .; then
    unversioned=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[TWi]$/ {print $3}' | grep -v "@@$node\$" || true)
    if [ -z "$node" ] || [ -n "$unversioned" ]; then
        echo "FAIL: not under the version node '$node' of $map:"; echo "$unversioned"; fail=$((fail + 1))
    else pass=$((pass + 1)); fi
else
    echo "note: no symbol versions (the linker took no version script)"
fi
# every prototype the man page shows is the header's
comm -13 "$tmp/hdr.proto" "$tmp/man.proto" >"$tmp/differ"
while IFS='	' read -r f p; do
    grep -q "^$f	" "$tmp/hdr.proto" || continue
    echo "FAIL: $f: man/libcoaxline.3 shows"
    echo "        $p"
    echo "      lib/coaxline.h declares"
    grep "^$f	" "$tmp/hdr.proto" | cut -f2 | sed 's/^/        /'
    fail=$((fail + 1))
done <"$tmp/differ"
[ -s "$tmp/differ" ] || pass=$((pass + 1))
if [ ! -s "$tmp/header" ] || [ ! -s "$tmp/exported" ]; then
    echo "FAIL: no functions found (header $(wc -l <"$tmp/header"), library $(wc -l <"$tmp/exported"))"
    fail=$((fail + 1))
fi
echo "functions: $(wc -l <"$tmp/header") declared, $(wc -l <"$tmp/exported") exported, $(wc -l <"$tmp/mapfile") in the map (node ${node:-none}), $(wc -l <"$tmp/manpage") documented"
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
