"""progress.py - progress of a long batch on stderr, only on a terminal.

Run by tests/progress.sh with the system Python (pty from its standard
library).  A cut batch runs three ways: stderr a pseudo-terminal
(progress shown: "coaxline: cut: N rows", the line cleared at the end),
the same with --quiet (nothing), and stderr a file (nothing: the same
bytes as the --quiet run); stdout is the same bytes in all three.
COAXLINE_PROGRESS_DELAY=0 shows progress from the first rows, so the
test does not depend on the machine's speed.
"""
import os
import pty
import subprocess
import sys
import tempfile

BIN = sys.argv[1]


def run_tty(args, env):
    """Run with stderr on a pseudo-terminal; return (stdout, tty bytes, rc)."""
    master, slave = pty.openpty()
    with tempfile.TemporaryFile() as out:
        p = subprocess.Popen([BIN] + args, stdin=subprocess.DEVNULL, stdout=out,
                             stderr=slave, env=env)
        os.close(slave)
        got = b""
        while True:
            try:
                chunk = os.read(master, 65536)
            except OSError:  # EIO once the child has closed the terminal
                break
            if not chunk:
                break
            got += chunk
        rc = p.wait()
        os.close(master)
        out.seek(0)
        return out.read(), got, rc


def main():
    tmp = tempfile.mkdtemp()
    path = os.path.join(tmp, "big.csv")
    with open(path, "w") as f:
        f.write("label,offset,vf\n")
        for i in range(20000):
            f.write("p%d,%d.%03dm,0.66\n" % (i, 1 + i % 50, i % 1000))
        f.write("bad,-1m,0.66\n")  # one error line, written over the progress line
    env = dict(os.environ, COAXLINE_PROGRESS_DELAY="0", LC_ALL="C")
    args = ["cut", "--input", path, "--format", "csv"]
    fails = 0

    out_tty, tty, rc_tty = run_tty(args, env)
    if b"coaxline: cut: " not in tty or b" rows" not in tty:
        print("progress: no progress line on the terminal: %r" % tty[:200])
        fails += 1
    if not tty.endswith(b"\r\x1b[K") and b"\r\x1b[K" not in tty:
        print("progress: the progress line is not cleared: %r" % tty[-200:])
        fails += 1
    if b"-1m" not in tty:
        print("progress: the error line of the bad row is missing on the terminal")
        fails += 1

    out_q, tty_q, rc_q = run_tty(args + ["--quiet"], env)
    if b" rows" in tty_q or b"\x1b[K" in tty_q:
        print("progress: --quiet still shows progress: %r" % tty_q[:200])
        fails += 1

    p = subprocess.run([BIN] + args, stdin=subprocess.DEVNULL, capture_output=True, env=env)
    pq = subprocess.run([BIN] + args + ["--quiet"], stdin=subprocess.DEVNULL,
                        capture_output=True, env=env)
    if p.stderr != pq.stderr or b"\r" in p.stderr or b"\x1b" in p.stderr:
        print("progress: stderr to a file differs from the --quiet run: %r" % p.stderr[:200])
        fails += 1
    if not (p.stdout == pq.stdout == out_tty == out_q) or len(p.stdout) < 20000 * 40:
        print("progress: stdout differs between the terminal, --quiet and file runs")
        fails += 1
    if not (p.returncode == pq.returncode == rc_tty == rc_q == 2):
        print("progress: exit statuses %d %d %d %d, expected 2 (one bad row)"
              % (p.returncode, pq.returncode, rc_tty, rc_q))
        fails += 1
    os.remove(path)
    os.rmdir(tmp)
    if fails == 0:
        print("progress: shown on a terminal, cleared, off with --quiet and off a terminal")
    return 1 if fails else 0


sys.exit(main())
