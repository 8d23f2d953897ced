#!/bin/sh
# quickstart.sh demo|test - set up a fresh Debian 12 machine, build, then
# run the demo or the whole test suite.  Run from the source tree as root
# (or as a user with sudo).
set -eu
what="${1:-demo}"
case "$what" in demo|test) ;; *) echo "usage: $0 demo|test" >&2; exit 2 ;; esac
cd "$(dirname "$0")/.."

SUDO=""
if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi

# Build needs; the tests also need Python's reference libraries (Debian's,
# seen by /usr/bin/python3), a comma-decimal locale and a spreadsheet engine
# (gnumeric's ssconvert opens the CSV output).
pkgs="build-essential autoconf automake libtool pkg-config libgsl-dev check"
if [ "$what" = test ]; then
    pkgs="$pkgs python3 python3-numpy python3-scipy python3-scikit-rf locales gnumeric pmccabe"
fi
missing=""
for p in $pkgs; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing="$missing $p"
done
if [ -n "$missing" ]; then
    echo "quickstart: installing:$missing"
    $SUDO apt-get update -qq
    DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq $missing >/dev/null
fi
if [ "$what" = test ] && ! locale -a 2>/dev/null | grep -qi '^de_DE\.utf-\?8$'; then
    $SUDO sh -c "sed -i 's/^# *de_DE.UTF-8 UTF-8/de_DE.UTF-8 UTF-8/' /etc/locale.gen && locale-gen >/dev/null"
fi

jobs=$(nproc 2>/dev/null || echo 2)
[ -x configure ] || autoreconf -fi
[ -f Makefile ] || ./configure --enable-werror
make -j"$jobs"
if [ "$what" = demo ]; then
    ./cli/coaxline demo
else
    make -j"$jobs" check
fi
