"""Reference batch for the benchmark: the script a user would write.

The same batch as `coaxline phase|pair|cut --input FILE --format csv`,
done the usual way in Python: the csv module reads the rows, a small
regular expression parses the units, band edges come from data/bands.csv,
numpy does the arithmetic on whole columns, and csv.writer writes the
result with fixed decimals.  It writes the same columns as coaxline, and
computes in the same order, so on the generated files its output is the
same bytes (tests/bench/bench_batch.c compares them).  Nothing here is
tuned; it is the yardstick that `make bench` times coaxline against.

Usage: reference.py phase|pair|cut|budget BANDS_CSV INPUT_CSV   (output on stdout)
Exit status: 0, or 1 when a pair row fails its tolerance or a budget point
misses its goal (as coaxline).

budget takes the closed-form goal (--null-vs-inphase): with a = 10^(-imb/20)
and r = 10^(goal/20), the null of two signals d degrees apart is
(1 - a)^2 + 4 a sin^2(d/2) = r^2 (1 + a)^2 (law of cosines on the two
phasors), solved for d; the length is d/360 VF c / f.

Formulas (DESIGN.md, "Physics the library must do for real"):
electrical length 360 f L / (VF c); a stagger offset is a free-space
distance, delay = offset / c, so the cut length is VF c delay; an open
line is a quarter wave at VF c / (4 L).  c = 299 792 458 m/s (SI).
"""
import csv
import math
import re
import sys

import numpy as np

C = 299792458.0
M_PER_UNIT = {"": 1.0, "m": 1.0, "cm": 0.01, "mm": 0.001,
              "ft": 0.3048, "in": 0.0254}
LENGTH_RE = re.compile(r"^\s*([0-9]*\.?[0-9]+)\s*([a-z]*)\s*$", re.IGNORECASE)


def parse_length(text):
    m = LENGTH_RE.match(text)
    if not m or m.group(2).lower() not in M_PER_UNIT:
        raise ValueError("bad length %r" % text)
    return float(m.group(1)) * M_PER_UNIT[m.group(2).lower()]


def band_name(text):
    name = text.strip().lower()
    return name + "m" if name.isdigit() else name


def load_bands(path):
    """(band, region) -> (low_hz, high_hz), footnote segments included,
    and band -> widest edges over all regions (region 0)."""
    edges = {}
    with open(path, newline="", encoding="utf-8") as f:
        for row in csv.DictReader(f):
            lo = float(row["low_khz"]) * 1e3
            hi = float(row["high_khz"]) * 1e3
            name = band_name(row["band"])
            for key in ((name, int(row["region"])), (name, 0)):
                if key in edges:
                    old = edges[key]
                    edges[key] = (min(old[0], lo), max(old[1], hi))
                else:
                    edges[key] = (lo, hi)
    return edges


def read_rows(path):
    with open(path, newline="", encoding="utf-8-sig") as f:
        return list(csv.DictReader(f))


def band_freqs(edges, bands, regions):
    """n x 3 array of low edge, centre and high edge per row."""
    lo = np.empty(len(bands))
    hi = np.empty(len(bands))
    for i, (b, r) in enumerate(zip(bands, regions)):
        lo[i], hi[i] = edges[(b, r)]
    return np.stack([lo, 0.5 * (lo + hi), hi], axis=1)


EDGES = ("low", "centre", "high")


def write_csv(out, header, rows):
    w = csv.writer(out, lineterminator="\n")
    w.writerow(header)
    w.writerows(rows)


def phase(edges, rows, out):
    labels = [r["label"] for r in rows]
    bands = [band_name(r["band"]) for r in rows]
    regions = [int(r["region"]) if r.get("region", "").strip() else 0 for r in rows]
    length = np.array([parse_length(r["length"]) for r in rows])
    ref = np.array([parse_length(r["reference"]) for r in rows])
    vf = np.array([float(r["vf"]) for r in rows])
    f = band_freqs(edges, bands, regions)
    delta = length - ref
    speed = (vf * C)[:, None]
    err = 360.0 * f * delta[:, None] / speed
    elec = 360.0 * f * length[:, None] / speed
    ref_elec = 360.0 * f * ref[:, None] / speed
    region_text = ["all" if r == 0 else str(r) for r in regions]
    write_csv(out, ["label", "band", "edge", "freq_mhz", "length_m", "reference_m",
                    "delta_m", "phase_error_deg", "vf", "region", "transfer_deg",
                    "electrical_deg", "transfer_db", "reference_transfer_deg",
                    "reference_electrical_deg", "reference_transfer_db"],
              ([labels[i], bands[i], EDGES[k], "%.6f" % (f[i, k] / 1e6), "%.3f" % length[i],
                "%.3f" % ref[i], "%.3f" % delta[i], "%.3f" % err[i, k], "%.4f" % vf[i],
                region_text[i], "", "%.3f" % elec[i, k], "", "", "%.3f" % ref_elec[i, k], ""]
               for i in range(len(rows)) for k in range(3)))
    return 0


def pair(edges, rows, out):
    labels = [r["label"] for r in rows]
    bands = [band_name(r["band"]) for r in rows]
    lengths = [[parse_length(x) for x in re.split("[,;]", r["length"]) if x.strip()]
               for r in rows]
    delta = np.array([max(ls) - min(ls) for ls in lengths])
    vf = np.array([float(r["vf"]) for r in rows])
    tol = np.array([float(r["tolerance"]) for r in rows])
    f = band_freqs(edges, bands, [0] * len(rows))
    err = 360.0 * f * delta[:, None] / (vf * C)[:, None]
    ok = err <= tol[:, None]
    # no length or VF tolerance: no uncertainty
    allowed = (tol * vf * C)[:, None] / (360.0 * f)
    write_csv(out, ["label", "band", "edge", "freq_mhz", "delta_m", "phase_error_deg",
                    "tolerance_deg", "verdict", "allowed_mismatch_m", "uncertainty_deg",
                    "electrical_error_deg", "transfer_imbalance_db"],
              ([labels[i], bands[i], EDGES[k], "%.6f" % (f[i, k] / 1e6), "%.3f" % delta[i],
                "%.3f" % err[i, k], "%.3f" % tol[i], "pass" if ok[i, k] else "fail",
                "%.3f" % allowed[i, k], "0.000", "%.3f" % err[i, k], ""]
               for i in range(len(rows)) for k in range(3)))
    return 0 if ok.all() else 1


def cut(edges, rows, out):
    labels = [r["label"] for r in rows]
    offset = np.array([parse_length(r["offset"]) for r in rows])
    vf = np.array([float(r["vf"]) for r in rows])
    delay = offset / C
    length = delay * vf * C
    qw = vf * C / (4.0 * length)
    write_csv(out, ["label", "offset_m", "delay_ns", "vf", "cut_length_m", "cut_length_ft",
                    "freq_mhz", "electrical_deg", "quarter_wave_mhz", "allowance_m"],
              ([labels[i], "%.3f" % offset[i], "%.3f" % (delay[i] * 1e9), "%.4f" % vf[i],
                "%.3f" % length[i], "%.4f" % (length[i] / 0.3048), "", "",
                "%.4f" % (qw[i] / 1e6), "0.000"] for i in range(len(rows))))
    return 0


def power_db(ratio):
    """10 log10 of a power ratio, held within +-300 dB as the library does."""
    floor = 10.0 ** (-300.0 / 10.0)
    if not ratio > floor:
        return -300.0
    return 300.0 if ratio > 1.0 / floor else 10.0 * math.log10(ratio)


def budget(edges, rows, out):
    bands = [band_name(r["band"]) for r in rows]
    f = band_freqs(edges, bands, [0] * len(rows))
    table, missed = [], 0
    for i, r in enumerate(rows):
        goal = float(r["null-vs-inphase"])
        imb = float(r["imbalance"]) if r["imbalance"].strip() else 0.0
        vf = float(r["vf"])
        a = math.pow(10.0, -imb / 20.0)
        free_db = power_db((1.0 - a) * (1.0 - a) / ((1.0 + a) * (1.0 + a)))
        g = math.pow(10.0, goal / 20.0)
        s2 = (g * g * (1.0 + a) * (1.0 + a) - (1.0 - a) * (1.0 - a)) / (4.0 * a)
        tol = 2.0 * math.asin(min(math.sqrt(s2), 1.0)) / (math.pi / 180.0) if s2 >= 0 else None
        missed |= tol is None
        for k in range(3):
            length = tol / 360.0 * vf * C / f[i, k] if tol is not None else None
            table.append([r["label"], bands[i], EDGES[k], "%.6f" % (f[i, k] / 1e6),
                          "null-vs-inphase", "%.2f" % goal, "", "%.2f" % imb, "%.2f" % free_db,
                          "%.3f" % tol if tol is not None else "", "%.4f" % vf,
                          "%.4f" % length if length is not None else "",
                          "%.3f" % (length / 0.0254) if length is not None else ""])
    write_csv(out, ["label", "band", "edge", "freq_mhz", "goal", "goal_db", "elevation_deg",
                    "imbalance_db", "error_free_db", "phase_tolerance_deg", "vf",
                    "length_tolerance_m", "length_tolerance_in"], table)
    return 1 if missed else 0


def main():
    if len(sys.argv) != 4 or sys.argv[1] not in ("phase", "pair", "cut", "budget"):
        sys.stderr.write("usage: reference.py phase|pair|cut|budget BANDS_CSV INPUT_CSV\n")
        return 2
    edges = load_bands(sys.argv[2])
    rows = read_rows(sys.argv[3])
    run = {"phase": phase, "pair": pair, "cut": cut, "budget": budget}[sys.argv[1]]
    return run(edges, rows, sys.stdout)


if __name__ == "__main__":
    sys.exit(main())
