#!/bin/sh
# A line into a load against scikit-rf's cascade of a line and a shunt load
# (tests/skrf_transfer.py).
py="${PYTHON3_SYSTEM:-/usr/bin/python3}"
src="${COAXLINE_SRCDIR:-.}"
build="${COAXLINE_BUILDDIR:-.}"
if [ -z "$py" ] || ! "$py" -c 'import skrf, scipy' >/dev/null 2>&1; then
    echo "SKIP: scikit-rf or scipy not importable by ${py:-python3}"
    exit 77
fi
exec "$py" "$src/tests/skrf_transfer.py" "$build/tests/transfer_values"
