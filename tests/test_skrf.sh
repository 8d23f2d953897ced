#!/bin/sh
# The physical loss model against scikit-rf's coaxial line (tests/skrf_compare.py).
py="${PYTHON3_SYSTEM:-/usr/bin/python3}"
src="${COAXLINE_SRCDIR:-.}"
build="${COAXLINE_BUILDDIR:-.}"
if [ -z "$py" ] || ! "$py" -c 'import skrf, scipy' >/dev/null 2>&1; then
    echo "SKIP: scikit-rf or scipy not importable by ${py:-python3}"
    exit 77
fi
exec "$py" "$src/tests/skrf_compare.py" "$build/tests/loss_values"
