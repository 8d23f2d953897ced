#!/bin/sh
# Every exported function is documented in libcoaxline(3).
lib="${COAXLINE_BUILDDIR:-.}/lib/.libs/libcoaxline.so"
man="${COAXLINE_SRCDIR:-.}/man/libcoaxline.3"
if [ ! -f "$lib" ]; then echo "SKIP: no shared library at $lib"; exit 77; fi
pass=0; fail=0
for f in $(nm -D --defined-only "$lib" | awk '$2 == "T" {print $3}'); do
    if grep -q "$f" "$man"; then pass=$((pass + 1)); else echo "FAIL: $f is not in libcoaxline.3"; fail=$((fail + 1)); fi
done
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
