#!/bin/sh
# The shared library exports only the cxl_ API, every symbol under the
# version node of lib/libcoaxline.map (when the linker took the script),
# and no data.  tests/man_coverage.sh checks which functions.
lib="${COAXLINE_BUILDDIR:-.}/lib/.libs/libcoaxline.so"
map="${COAXLINE_SRCDIR:-.}/lib/libcoaxline.map"
if [ ! -f "$lib" ]; then
    echo "SKIP: no shared library at $lib"
    exit 77
fi
pass=0; fail=0
syms=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[TDBRVW]$/ {print $3}')
bad=$(printf '%s\n' "$syms" | sed 's/@.*//' | grep -v '^cxl_[a-z]' || true)
if [ -n "$bad" ]; then
    echo "FAIL: symbols outside the cxl_ API are exported:"; echo "$bad"; fail=$((fail + 1))
else pass=$((pass + 1)); fi
data=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[DBRV]$/ {print $3}')
if [ -n "$data" ]; then
    echo "FAIL: data symbols are exported (the API is functions only):"; echo "$data"; fail=$((fail + 1))
else pass=$((pass + 1)); fi
# The version node the map file defines, e.g. LIBCOAXLINE_0.
node=$(sed -n 's/^\([A-Z][A-Z0-9_.]*\)[[:space:]]*{.*/\1/p' "$map" | tail -n 1)
if nm -D --defined-only "$lib" | awk '$2 == "A"' | grep -q .; then
    unversioned=$(printf '%s\n' "$syms" | grep -v "@@$node\$" || true)
    if [ -z "$node" ] || [ -n "$unversioned" ]; then
        echo "FAIL: not under the version node '$node' of $map:"; echo "$unversioned"; fail=$((fail + 1))
    else pass=$((pass + 1)); fi
else
    echo "note: no symbol versions (the linker took no version script)"
fi
echo "exported cxl_ symbols: $(printf '%s\n' "$syms" | grep -c .) (version node ${node:-none})"
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
