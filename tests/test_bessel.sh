#!/bin/sh
# The physical loss model's conductor impedance against scipy's Bessel
# functions of complex argument (tests/bessel_compare.py).
py="${PYTHON3_SYSTEM:-/usr/bin/python3}"
src="${COAXLINE_SRCDIR:-.}"
build="${COAXLINE_BUILDDIR:-.}"
if [ -z "$py" ] || ! "$py" -c 'import scipy.special, numpy' >/dev/null 2>&1; then
    echo "SKIP: scipy not importable by ${py:-python3}"
    exit 77
fi
exec "$py" "$src/tests/bessel_compare.py" "$build/tests/bessel_values" \
    "$build/tests/loss_values" "$src/data/cables.csv"
