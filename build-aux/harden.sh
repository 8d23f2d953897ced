#!/bin/sh
# harden.sh asan|valgrind|tsan|fuzz [SECONDS] - the hardening runs CI does,
# runnable by hand from the source tree after a normal build
# (sh build-aux/quickstart.sh test).  Each exits non-zero on any finding.
set -eu
what="${1:?usage: harden.sh asan|valgrind|tsan|fuzz [SECONDS]}"
cd "$(dirname "$0")/.."
top="$PWD"
jobs=$(nproc 2>/dev/null || echo 2)

# A copy of the tracked tree, so a second configuration does not collide
# with the in-tree build.
fresh_copy() {
    rm -rf "$1"
    mkdir -p "$1"
    git ls-files -z --cached --others --exclude-standard | xargs -0 tar -cf - --ignore-failed-read 2>/dev/null | tar -xf - -C "$1"
    (cd "$1" && autoreconf -fi >/dev/null 2>&1)
}

case "$what" in
asan)
    # AddressSanitizer + UndefinedBehaviorSanitizer over the whole make check.
    fresh_copy "$top/_build-asan"
    cd "$top/_build-asan"
    san="-fsanitize=address,undefined -fno-sanitize-recover=undefined -fno-omit-frame-pointer"
    ./configure --enable-werror CFLAGS="-O1 -g $san" LDFLAGS="$san" >/dev/null
    make -j"$jobs" >/dev/null
    ASAN_OPTIONS=detect_leaks=1:abort_on_error=0 UBSAN_OPTIONS=print_stacktrace=1 \
        make -j"$jobs" check || { cat test-suite.log; exit 1; }
    grep -h -E '^[0-9]+%: Checks:' tests/*.log | sed 's/^/asan+ubsan: /'
    ;;
valgrind)
    # memcheck over the library's Check suites (no fork, so it sees the tests).
    # COAXLINE_UNDER_VALGRIND=1: the heavy statistical tests run a smaller
    # size (each suite says what it still checks).
    export COAXLINE_UNDER_VALGRIND=1
    fail=0
    for t in tests/check_*; do
        case "$t" in *.c|*.o|*.log|*.trs|tests/check_cli|tests/check_cli_*) continue ;; esac
        [ -x "$t" ] || continue
        if CK_FORK=no ./libtool --mode=execute valgrind -q --error-exitcode=3 \
               --leak-check=full --errors-for-leak-kinds=definite,indirect \
               "$t" >"$t.valgrind.log" 2>&1; then
            echo "valgrind: $(basename "$t"): clean ($(grep -E '^[0-9]+%: Checks:' "$t.valgrind.log" | tail -n 1))"
        else
            echo "valgrind: $(basename "$t"): FAILED"; cat "$t.valgrind.log"; fail=1
        fi
    done
    exit "$fail"
    ;;
tsan)
    # ThreadSanitizer over the multi-threaded test.
    fresh_copy "$top/_build-tsan"
    cd "$top/_build-tsan"
    ./configure CFLAGS="-O1 -g -fsanitize=thread" LDFLAGS="-fsanitize=thread" >/dev/null
    make -j"$jobs" >/dev/null
    make tests/check_threads >/dev/null
    TSAN_OPTIONS=halt_on_error=1 CK_FORK=no ./tests/check_threads
    # coaxline --jobs 3 on every batch case of tests/golden/cases.txt, its
    # input repeated (5000 rows for cut and phase: more than one block of
    # 2048, so reading, running and writing overlap; 300 for the others:
    # several chunks of 128 at once), plus {line} plots; a race exits 66,
    # and the bytes must be --jobs 1's.
    tmp=$(mktemp -d)
    cp tests/golden/input/* "$tmp"/
    bin="$PWD/cli/coaxline"
    grep -- '--input' tests/golden/cases.txt | grep -v '^#' | sed 's/^coaxline //' |
    while read -r line; do
        in=$(echo "$line" | sed 's/.*--input \([^ ]*\).*/\1/')
        case "$line" in cut*|phase*) rows=5000 ;; *) rows=300 ;; esac
        (cd "$tmp" && awk -v want="$rows" 'NR == 1 { print; next } { body[++n] = $0 }
            END { for (k = 0; k < want; k += n) for (i = 1; i <= n; i++) print body[i] }' \
            "$in" > "big-$in")
        args=$(echo "$line" | sed "s/--input $in/--input big-$in/")
        case "$line" in phase*|pattern*) args="$args --plot p-{line}.svg" ;; esac
        for j in 1 3; do
            rc=0
            (cd "$tmp" && TSAN_OPTIONS="halt_on_error=1 exitcode=66" \
                $bin $args --jobs $j > "out.$j" 2> "err.$j") || rc=$?
            if [ "$rc" = 66 ]; then echo "tsan: coaxline $args --jobs $j: race"; cat "$tmp/err.$j"; exit 1; fi
        done
        cmp -s "$tmp/out.1" "$tmp/out.3" && cmp -s "$tmp/err.1" "$tmp/err.3" ||
            { echo "tsan: coaxline $args: --jobs 3 differs from --jobs 1"; exit 1; }
        echo "tsan: coaxline $args --jobs 3: no race, same bytes"
        rm -f "$tmp"/p-*.svg
    done
    rm -rf "$tmp"
    ;;
fuzz)
    # Each libFuzzer target for a bounded time, from the seed corpus; new
    # inputs go to a scratch folder, never into the tree.
    secs="${2:-20}"
    make fuzz >/dev/null
    for t in tests/fuzz/fuzz_*; do
        case "$t" in *.c) continue ;; esac
        name=$(basename "$t" | sed 's/^fuzz_//')
        scratch="$top/_fuzz/$name"
        mkdir -p "$scratch"
        "$t" -max_total_time="$secs" -close_fd_mask=2 -print_final_stats=0 \
            "$scratch" "tests/fuzz/corpus/$name" >"$scratch.log" 2>&1 || {
            echo "fuzz: $name: FINDING"; tail -n 40 "$scratch.log"; exit 1; }
        echo "fuzz: $name: $(grep -E '^Done [0-9]+ runs' "$scratch.log" | tail -n 1)"
    done
    ;;
*)
    echo "usage: harden.sh asan|valgrind|tsan|fuzz [SECONDS]" >&2; exit 2 ;;
esac
