"""Compare `coaxline loss --format json` rows with an independent
interpolation of the attenuation table.

Usage: loss_interp.py TABLE.csv OUTPUT.json TOLERANCE_DB

TABLE.csv has the columns of data/cable_loss.csv (name, freq_mhz,
loss_db_per_100m, ...).  For every JSON row the table of its cable is
interpolated with numpy.interp on log(frequency) and log(loss): between two
table points the loss is taken as a power of frequency, which is how
conductor loss (sqrt f) and dielectric loss (f) behave (Pozar, Microwave
Engineering, 4th ed., sec. 2.7, from memory).  The row's matched_loss_db
must be within TOLERANCE_DB of that value times length_m / 100.
Prints one line per row and a final line "N passed, N failed"; exits 1 when
any row fails.
"""
import csv
import json
import sys

import numpy as np


def main():
    table_path, json_path, tol = sys.argv[1], sys.argv[2], float(sys.argv[3])
    table = {}
    with open(table_path, newline="", encoding="utf-8-sig") as fp:
        for row in csv.DictReader(fp):
            table.setdefault(row["name"].strip().lower(), []).append(
                (float(row["freq_mhz"]), float(row["loss_db_per_100m"])))
    with open(json_path, encoding="utf-8") as fp:
        rows = json.load(fp)
    passed = failed = 0
    for r in rows:
        pts = sorted(table[r["cable"].lower()])
        f = np.array([p[0] for p in pts])
        loss = np.array([p[1] for p in pts])
        # no extrapolation: the frequency must lie within the table
        ok = f[0] <= r["freq_mhz"] <= f[-1]
        want = np.exp(np.interp(np.log(r["freq_mhz"]), np.log(f), np.log(loss))) * r["length_m"] / 100
        diff = r["matched_loss_db"] - want
        ok = ok and abs(diff) <= tol
        passed += ok
        failed += not ok
        print("%s %s %.6f MHz %.3f m: coaxline %.4f dB, table interpolation %.4f dB, diff %+.4f %s"
              % ("ok  " if ok else "FAIL", r["cable"], r["freq_mhz"], r["length_m"],
                 r["matched_loss_db"], want, diff, "" if ok else "(outside the table?)"))
    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed or not rows else 0


if __name__ == "__main__":
    sys.exit(main())
