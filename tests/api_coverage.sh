#!/bin/sh
# Every exported cxl_ function must be called in tests/check_api.c or the
# adapters' files tests/check_api_*.c, the walk of error paths, so a new
# API function without an error-path test fails the build.
lib="${COAXLINE_BUILDDIR:-.}/lib/.libs/libcoaxline.so"
srcdir="${COAXLINE_SRCDIR:-.}/tests"
src="$srcdir/check_api.c"
if [ ! -f "$lib" ]; then
    echo "SKIP: no shared library at $lib"
    exit 77
fi
if [ ! -f "$src" ]; then
    echo "FAIL: $src not found"
    echo "0 passed, 1 failed"
    exit 1
fi
pass=0
fail=0
for sym in $(nm -D --defined-only "$lib" | awk '$2 == "T" && $3 ~ /^cxl_[a-z]/ {sub(/@.*/, "", $3); print $3}' | sort -u); do
    # a call: the name followed by an opening parenthesis
    if cat "$srcdir"/check_api.c "$srcdir"/check_api_*.c |
        grep -Eq "(^|[^A-Za-z0-9_])$sym[[:space:]]*\("; then
        pass=$((pass + 1))
    else
        echo "FAIL: $sym has no error-path test in tests/check_api*.c"
        fail=$((fail + 1))
    fi
done
if [ $((pass + fail)) -eq 0 ]; then
    echo "FAIL: no cxl_ functions exported by $lib"
    fail=1
fi
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
