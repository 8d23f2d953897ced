#!/bin/sh
# same_bytes_rows.sh - the row paths of vf, trim and loss give the same
# bytes as another build: a ROWS-row batch of each (tests/rows_gen.sh,
# with refused rows among the good ones), in text and CSV, run by both
# binaries; stdout, stderr and exit status are compared.
# usage: same_bytes_rows.sh OTHER_BINARY [ROWS]   (from the build tree)
# e.g.   sh tests/bench/same_bytes_rows.sh /work/base/cli/coaxline 100000
set -u
other=${1:?usage: same_bytes_rows.sh OTHER_BINARY [ROWS]}
rows=${2:-100000}
here=$(cd "$(dirname "$0")/../.." && pwd)
gen=$here/tests/rows_gen.sh
bin=${COAXLINE_BIN:-$here/cli/coaxline}
dir=$(mktemp -d) || exit 1
trap 'rm -rf "$dir"' EXIT
fail=0
cd "$dir" || exit 1
for cmd in vf trim loss; do
    sh "$gen" "$cmd" "$rows" bad > "$cmd.csv"
    for fmt in text csv; do
        "$other" "$cmd" --input "$cmd.csv" --format "$fmt" > a.out 2> a.err; echo $? > a.rc
        "$bin" "$cmd" --input "$cmd.csv" --format "$fmt" > b.out 2> b.err; echo $? > b.rc
        for part in out err rc; do
            if ! cmp -s "a.$part" "b.$part"; then
                echo "FAIL: $cmd --format $fmt: $part differs"
                diff "a.$part" "b.$part" | head -5
                fail=1
            fi
        done
        echo "$cmd $fmt: $rows rows, $(wc -c < b.out) bytes out, $(wc -l < b.err) error lines, exit $(cat b.rc)"
    done
done
[ "$fail" = 0 ] && echo "same bytes: vf, trim, loss"
exit "$fail"
