#!/bin/sh
# The shared library exports only the documented cxl_ API.
lib="${COAXLINE_BUILDDIR:-.}/lib/.libs/libcoaxline.so"
if [ ! -f "$lib" ]; then
    echo "SKIP: no shared library at $lib"
    exit 77
fi
bad=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[TDBR]$/ {print $3}' | grep -v '^cxl_[a-z]' || true)
if [ -n "$bad" ]; then
    echo "FAIL: symbols outside the cxl_ API are exported:"; echo "$bad"
    exit 1
fi
n=$(nm -D --defined-only "$lib" | awk '$2 ~ /^[TDBR]$/' | wc -l)
echo "exported cxl_ symbols: $n"
echo "1 passed, 0 failed"
