#!/bin/sh
# progress.sh - progress on stderr only on a terminal (tests/progress.py,
# run with the system Python for its pty module).
srcdir=${COAXLINE_SRCDIR:-${srcdir:-.}}
bin=${COAXLINE_BIN:-./cli/coaxline}
py=${PYTHON3_SYSTEM:-/usr/bin/python3}
if ! "$py" -c 'import pty' 2>/dev/null; then
    echo "progress: no Python with pty at $py, skipped"
    exit 77
fi
exec "$py" "$srcdir/tests/progress.py" "$bin"
