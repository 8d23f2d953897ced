"""Compare libcoaxline's line-into-load transfer with scikit-rf.

scikit-rf 0.15.4 (Debian python3-scikit-rf) builds the same physical coax
(external inductance only; its G is too small by 4 pi^2 in that version, so
tan_delta = 0).  The reference is a network cascade: the line, then the load
as a shunt element to ground, with port impedance 50 ohm; with the far port
open, V2 / V1 = 1 / A of the cascade's ABCD matrix.  The line is built with
its own characteristic impedance embedded in the 50 ohm ports
(line(..., z0=Z0, embed=True)): without that, scikit-rf 0.15.4 makes the
line's impedance the port impedance.  That is scikit-rf's own
S-parameter algebra, independent of the formula
V_L / V_in = (1 + G)/(e^{gamma l} + G e^{-gamma l}) (Pozar, Microwave
Engineering, 4th ed., sec. 2.3 and 2.7) that the library evaluates.

The stub resonances are checked the same way: the input impedance of the
line ** open (or short) network, its reactance zero found with scipy's
brentq.

Usage: skrf_transfer.py PATH/TO/transfer_values
"""
import subprocess
import sys

import numpy as np
import scipy.optimize
import skrf
from skrf.media import Coaxial, DefinedGammaZ0

SIGMA_CU = 58.0e6  # S/m, annealed copper, IEC 60028
TOL_RATIO = 1e-6   # relative, complex ratio (both are double-precision evaluations)
TOL_DEG = 1e-4     # degrees
TOL_F = 1e-7       # relative, resonance frequency (both root finders converge far below)

# (label, inner diameter m, dielectric diameter m, eps_r): sizes as in
# data/cables.csv (from memory of the constructions)
GEOMETRIES = [
    ("RG-58 size", 0.81e-3, 2.95e-3, 2.25),
    ("RG-6 foam size", 1.024e-3, 4.57e-3, 1.4516),
]
# (length m, load ohm): a phasing line into a matched, a reactive and a
# high-impedance receiver input
CASES = [(27.03, 50 + 0j), (13.7, 21 + 20j), (41.2, 5 - 300j), (8.0, 1e4 + 0j), (62.5, 75 + 0j)]

passed = failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL:", what)


def run(args):
    out = subprocess.run(args, check=True, capture_output=True, text=True).stdout
    return np.array([[float(x) for x in line.split()] for line in out.splitlines()])


def skrf_ratio(media, length, zl):
    """V_load / V_in of media.line(length) loaded by zl, by network cascade."""
    z0 = 50.0
    gamma_l = (zl - z0) / (zl + z0)
    line = media.line(length, "m", z0=media.Z0, embed=True)
    cascade = line ** media.shunt(media.load(gamma_l))
    return 1.0 / cascade.a[:, 0, 0]


def delay_deg(ratio, electrical):
    phi = -np.angle(ratio, deg=True)
    return phi + 360.0 * np.floor((electrical - phi) / 360.0 + 0.5)


def compare(label, rows, ref, electrical_ref):
    d_ratio = np.max(np.abs(rows[:, 1] + 1j * rows[:, 2] - ref) / np.abs(ref))
    d_db = np.max(np.abs(rows[:, 3] - 20 * np.log10(np.abs(ref))))
    d_delay = np.max(np.abs(rows[:, 4] - delay_deg(ref, electrical_ref)))
    d_el = np.max(np.abs(rows[:, 5] - electrical_ref))
    check(d_ratio < TOL_RATIO, label + ": ratio")
    check(d_db < TOL_DEG, label + ": dB")
    check(d_delay < TOL_DEG, label + ": delay")
    check(d_el < TOL_DEG, label + ": electrical length")
    return d_ratio, d_delay


def main():
    helper = sys.argv[1]
    freq = skrf.Frequency(0.5, 30, 25, "MHz")
    f = freq.f
    worst_r = worst_d = 0.0
    for label, dint, dout, eps in GEOMETRIES:
        media = Coaxial(frequency=freq, Dint=dint, Dout=dout, epsilon_r=eps, tan_delta=0,
                        sigma=SIGMA_CU, z0=50)
        for length, zl in CASES:
            rows = run([helper, "coax", repr(dint), repr(dout), repr(eps), repr(SIGMA_CU),
                        repr(length), repr(zl.real), repr(zl.imag)] + [repr(float(x)) for x in f])
            ref = skrf_ratio(media, length, zl)
            el = np.degrees(media.gamma.imag * length)
            d_r, d_d = compare("%s %g m into %s" % (label, length, zl), rows, ref, el)
            worst_r, worst_d = max(worst_r, d_r), max(worst_d, d_d)
        # series resonances of open and shorted stubs of 20 m
        for end, term in (("open", media.open), ("short", media.short)):
            for order in (1, 2, 3):
                got = run([helper, "stub", repr(dint), repr(dout), repr(eps), repr(SIGMA_CU),
                           "20", end, str(order)])[0, 0]

                def reactance(fx):
                    one = Coaxial(frequency=skrf.Frequency(fx, fx, 1, "Hz"), Dint=dint,
                                  Dout=dout, epsilon_r=eps, tan_delta=0, sigma=SIGMA_CU, z0=50)
                    abcd = one.line(20.0, "m", z0=one.Z0, embed=True).a[0]
                    # open far end: Zin = A / C; shorted: Zin = B / D
                    zin = abcd[0, 0] / abcd[1, 0] if end == "open" else abcd[0, 1] / abcd[1, 1]
                    return zin.imag

                ref_f = scipy.optimize.brentq(reactance, got * 0.97, got * 1.03, xtol=1e-6,
                                              rtol=1e-13)
                d_f = abs(got - ref_f) / ref_f
                check(d_f < TOL_F, "%s 20 m %s stub order %d: %.6f vs %.6f MHz"
                      % (label, end, order, got / 1e6, ref_f / 1e6))
                print("%-15s 20 m %-5s order %d: %.6f MHz (scikit-rf %.6f, rel. diff %.1e)"
                      % (label, end, order, got / 1e6, ref_f / 1e6, d_f))
    # lossless 75 ohm line in the 50 ohm environment: gamma = j beta
    vf, z0 = 0.66, 75.0
    beta = 2 * np.pi * f / (vf * 299792458.0)
    lossless = DefinedGammaZ0(frequency=freq, z0=50, gamma=1j * beta, Z0=z0)
    for length, zl in CASES:
        rows = run([helper, "lossless", repr(z0), repr(vf), repr(length), repr(zl.real),
                    repr(zl.imag)] + [repr(float(x)) for x in f])
        ref = skrf_ratio(lossless, length, zl)
        d_r, d_d = compare("lossless %g m into %s" % (length, zl), rows, ref,
                           np.degrees(beta * length))
        worst_r, worst_d = max(worst_r, d_r), max(worst_d, d_d)
    print("worst vs scikit-rf cascade 0.5-30 MHz: ratio %.1e relative, delay %.1e deg"
          % (worst_r, worst_d))
    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
