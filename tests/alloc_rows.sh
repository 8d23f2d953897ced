#!/bin/sh
# alloc_rows.sh - no heap allocation per batch row after the first rows:
# vf, trim and loss each run on 10 and on 1,000 rows (tests/rows_gen.sh)
# under the preload module tests/alloc_count.la, which counts malloc,
# calloc and realloc.  vf and loss must count the same for both runs;
# trim may add at most 3 a row, the work vector GSL's SVD (gsl_linalg_
# bidiag_decomp, GSL 2.7) allocates inside the trend fit of each piece.
# Skipped (77) where a preload cannot count: sanitizer builds, valgrind.
srcdir=${COAXLINE_SRCDIR:-.}
builddir=${COAXLINE_BUILDDIR:-.}
bin=${COAXLINE_BIN:-$builddir/cli/coaxline}
module=$builddir/tests/.libs/alloc_count.so
if [ ! -f "$module" ]; then
    echo "alloc_rows: $module not built; skipped"
    exit 77
fi
if ldd "$builddir/cli/.libs/coaxline" 2>/dev/null | grep -q 'libasan\|libubsan\|libtsan'; then
    echo "alloc_rows: a sanitizer build replaces malloc itself; skipped"
    exit 77
fi
dir=$(mktemp -d) || exit 1
trap 'rm -rf "$dir"' EXIT
count() { # command rows -> allocations of the coaxline process
    sh "$srcdir/tests/rows_gen.sh" "$1" "$2" > "$dir/in.csv"
    rm -f "$dir/count"
    ALLOC_COUNT_FILE=$dir/count LD_PRELOAD=$module "$bin" "$1" --input "$dir/in.csv" \
        > /dev/null 2> "$dir/err" || { echo "alloc_rows: $1 on $2 rows failed:"; cat "$dir/err"; return 1; }
    [ -s "$dir/count" ] || return 2
    cat "$dir/count"
}
fail=0
for cmd in vf loss trim; do
    small=$(count "$cmd" 10); rc=$?
    [ "$rc" = 2 ] && { echo "alloc_rows: the preload counted nothing (valgrind or a static build?); skipped"; exit 77; }
    [ "$rc" = 0 ] || exit 1
    large=$(count "$cmd" 1000) || exit 1
    per_row=$(awk -v a="$small" -v b="$large" 'BEGIN { printf "%.2f", (b - a) / 990 }')
    echo "alloc_rows: $cmd: $small allocations on 10 rows, $large on 1000 ($per_row a row)"
    limit=0
    [ "$cmd" = trim ] && limit=3
    if [ $((large - small)) -gt $((990 * limit)) ]; then
        echo "FAIL: $cmd allocates $per_row times a row (at most $limit)"
        fail=1
    fi
done
exit "$fail"
