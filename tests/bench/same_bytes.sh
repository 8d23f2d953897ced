#!/bin/sh
# same_bytes.sh - a changed coaxline writes the same bytes as a reference
# build on a big generated batch of every row-path command.
#
#   sh tests/bench/same_bytes.sh [NEW_BINARY [OLD_BINARY [ROWS]]]
#
# NEW_BINARY defaults to ./cli/coaxline, OLD_BINARY to
# /work/base/cli/coaxline, ROWS to 100000.  For phase, cut, pair, budget
# and hybrid it writes ROWS rows (about one in 250 of them bad in some
# way: a misspelt number, a unit left out, an unknown band, a comma
# decimal, a missing cell, a value out of range; and labels that need
# quotes or neutralising), runs both binaries with --format csv on all
# of them and with text and json on the first tenth, and compares stdout,
# stderr and the exit status byte for byte.  Exit 0 when all are the
# same, 1 otherwise.  Needs python3 (any) for the generator.
set -u
NEW=${1:-./cli/coaxline}
OLD=${2:-/work/base/cli/coaxline}
ROWS=${3:-100000}
PY=${PYTHON3:-python3}
for b in "$NEW" "$OLD"; do
    [ -x "$b" ] || { echo "same_bytes: no binary at $b" >&2; exit 2; }
done
TMP=$(mktemp -d "${TMPDIR:-/tmp}/same-bytes-XXXXXX") || exit 2
trap 'rm -rf "$TMP"' EXIT INT TERM

"$PY" - "$TMP" "$ROWS" <<'PYEOF'
import random
import sys

tmp, rows = sys.argv[1], int(sys.argv[2])
rnd = random.Random(20261202)
bands = ["2200m", "630m", "160m", "80", "60m", "40m", "30m", "20m", "17m", "15m", "mw", "160M"]
vfs = ["0.66", "0.78", "0.80", "0.82", "0.85", "0.69", "0.659"]
labels = ["", "a b", "x,y", "=sum", "+1", "q\"uote", "semi;colon", "-minus", "@at", "plain",
          "tab\there", "caf\u00e9"]
bad_len = ["abc", "12,5m", "-3m", "", "5", "1e9m", "3 m m"]


def label(i):
    return "r%d" % i if rnd.random() < 0.9 else labels[rnd.randrange(len(labels))] + str(i)


def q(cell):
    if any(c in cell for c in ',"\r\n'):
        return '"' + cell.replace('"', '""') + '"'
    return cell


def write(name, header, make):
    with open("%s/%s.csv" % (tmp, name), "w", encoding="utf-8", newline="") as f:
        f.write(header + "\n")
        for i in range(1, rows + 1):
            f.write(",".join(q(c) for c in make(i, rnd.random() < 0.004)) + "\n")


def length(cm):
    return "%d.%02dm" % (cm // 100, cm % 100)


def phase(i, bad):
    ref = 500 + rnd.randrange(5500)
    row = [label(i), length(ref + rnd.randrange(61) - 30), length(ref), rnd.choice(vfs),
           rnd.choice(bands), rnd.choice(["", "1", "2", "3"])]
    if bad:
        k = rnd.randrange(6)
        row[k] = rnd.choice(bad_len + ["7m", "4", "1.5", "0"])
    return row


def cut(i, bad):
    row = [label(i), length(100 + rnd.randrange(3900)), rnd.choice(vfs)]
    if bad:
        row[1 + rnd.randrange(2)] = rnd.choice(bad_len + ["1.5", "66"])
    return row


def pair(i, bad):
    base = 500 + rnd.randrange(5500)
    ls = ";".join(length(base + rnd.randrange(6)) for _ in range(2 + rnd.randrange(3)))
    row = [label(i), ls, rnd.choice(vfs), rnd.choice(["5", "1", "0.5", "10"]), rnd.choice(bands)]
    if bad:
        row[1 + rnd.randrange(4)] = rnd.choice(bad_len + ["7m", "-1"])
    return row


def budget(i, bad):
    imb = rnd.randrange(61)
    row = [label(i), "-%d" % (10 + rnd.randrange(31)), "0.%02d" % imb if imb else "",
           rnd.choice(vfs + [""]), rnd.choice(bands)]
    if bad:
        row[1 + rnd.randrange(4)] = rnd.choice(["abc", "5", "-400", "1,5", "7m", "2"])
    return row


def hybrid(i, bad):
    row = [label(i), rnd.choice(["50", "75", "100", "25", "37.5", "300"]),
           rnd.choice(["", "50", "75", "", "100", "12.5"]), "",
           rnd.choice(["", "", "8", "12", "16", "30"]), rnd.choice(["", "3", "5", "1", "8"]),
           rnd.choice(["", "", "1.5", "2"])]
    if rnd.random() < 0.2 and not row[2]:
        row[3] = rnd.choice(["2", "2.5", "1.5"])
    if bad:
        row[1 + rnd.randrange(6)] = rnd.choice(["abc", "0", "-50", "7.5", "1,5", "1000"])
    return row


write("phase", "label,length,reference,vf,band,region", phase)
write("cut", "label,offset,vf", cut)
write("pair", "label,length,vf,tolerance,band", pair)
write("budget", "label,null-vs-inphase,imbalance,vf,band", budget)
write("hybrid", "label,impedance,to,ratio,max-turns,pairs,load-swr", hybrid)
PYEOF
[ $? -eq 0 ] || { echo "same_bytes: the generator failed" >&2; exit 2; }

status=0
compare() { # name cmd input format
    for w in new old; do
        b=$NEW; [ $w = old ] && b=$OLD
        LC_ALL=C "$b" "$2" --input "$3" --format "$4" >"$TMP/$w.out" 2>"$TMP/$w.err"
        echo $? >"$TMP/$w.rc"
    done
    if cmp -s "$TMP/new.out" "$TMP/old.out" && cmp -s "$TMP/new.err" "$TMP/old.err" &&
       cmp -s "$TMP/new.rc" "$TMP/old.rc"; then
        echo "same   $1 $4: $(wc -l <"$TMP/new.out") lines out, $(wc -l <"$TMP/new.err") errors, exit $(cat "$TMP/new.rc")"
    else
        echo "DIFFER $1 $4:"
        for s in out err rc; do
            cmp "$TMP/new.$s" "$TMP/old.$s" >/dev/null 2>&1 || cmp "$TMP/new.$s" "$TMP/old.$s" | sed 's/^/    /'
        done
        status=1
    fi
}
for c in phase cut pair budget hybrid; do
    compare "$c" "$c" "$TMP/$c.csv" csv
    head -n $((ROWS / 10 + 1)) "$TMP/$c.csv" >"$TMP/$c-tenth.csv"
    compare "$c (tenth)" "$c" "$TMP/$c-tenth.csv" text
    compare "$c (tenth)" "$c" "$TMP/$c-tenth.csv" json
done
exit $status
