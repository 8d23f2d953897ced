"""The physical loss model's conductor impedance against scipy's Bessel
functions.

Reference: the internal impedance of a solid round wire of radius a and of
a thick outer conductor from radius b outward,
  Z_a = (eta_s / (2 pi a)) I0(tau a) / I1(tau a),
  Z_b = (eta_s / (2 pi b)) K0(tau b) / K1(tau b),
  tau = (1 + j)/delta, eta_s = (1 + j)/(sigma delta)
(Ramo, Whinnery and Van Duzer, Fields and Waves in Communication
Electronics, 3rd ed., ch. 5, from memory), with scipy.special.ive and kve
of complex argument (their exponential scaling cancels in each ratio), and
gamma = sqrt((R + j w L)(G + j w C)) (Pozar, Microwave Engineering, 4th ed.,
sec. 2.1).  Limits: R -> 1/(sigma pi a^2) and L_int -> mu0/(8 pi) at DC
(Ramo, Whinnery and Van Duzer, same section, from memory); the thin-skin
(1 + j) Rs/(2 pi r) at large r/delta (Pozar, Table 2.1).

Usage: bessel_compare.py PATH/TO/bessel_values PATH/TO/loss_values PATH/TO/cables.csv
"""
import csv
import subprocess
import sys

import numpy as np
import scipy.constants as sc
from scipy.special import ive, kve

TOL = 0.01        # 1 %: the agreement asked of the model (common practice, no source)
TOL_RATIO = 1e-8  # each Bessel branch within 1 of its switch-over (common practice, no source)
SIGMA_CU = 58.0e6  # S/m, annealed copper, IEC 60028
MU0 = sc.mu_0
F_LO, F_HI = 50e3, 150e6  # the span asked of every copper cable

passed = failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL:", what)


def ref_i(z):
    return z * ive(0, z) / (2.0 * ive(1, z))


def ref_k(z):
    return z * kve(0, z) / kve(1, z)


def bessel_rows(helper, zs):
    args = [helper]
    for z in zs:
        args += [repr(float(z.real)), repr(float(z.imag))]
    out = subprocess.run(args, check=True, capture_output=True, text=True).stdout
    rows = []
    for line in out.splitlines():
        v = [float(x) if x else np.nan for x in line.split(" ")]
        rows.append([v[2] + 1j * v[3], v[4] + 1j * v[5], v[6] + 1j * v[7],
                     v[8] + 1j * v[9], v[10] + 1j * v[11], v[12] + 1j * v[13]])
    return np.array(rows)  # i series, i asympt, i used, k series, k asympt, k used


def check_branches(helper):
    # the conductors use arguments on the 45-degree ray, r/delta (1 + j)
    rays = np.exp(1j * np.pi / 4)
    # both forms near each switch-over (lib/internal.h: I at 20, K at 10)
    for name, col_s, col_a, ref, switch in (("I", 0, 1, ref_i, 20.0),
                                            ("K", 3, 4, ref_k, 10.0)):
        zs = rays * np.linspace(switch - 1.0, switch + 1.0, 41)
        rows = bessel_rows(helper, zs)
        r = ref(zs)
        e_s = np.abs(rows[:, col_s] / r - 1)
        e_a = np.abs(rows[:, col_a] / r - 1)
        print("%s ratio, |z| %.0f..%.0f: series worst %.1e, asymptotic worst %.1e"
              % (name, switch - 1, switch + 1, np.max(e_s), np.max(e_a)))
        check(np.all(e_s < TOL_RATIO), name + " series within 1e-8 near the switch-over")
        check(np.all(e_a < TOL_RATIO), name + " asymptotic form within 1e-8 near the switch-over")
    # as used, over the whole span of arguments a cable can meet
    zs = rays * np.logspace(-4, 4, 161)
    rows = bessel_rows(helper, zs)
    e_i = np.abs(rows[:, 2] / ref_i(zs) - 1)
    e_k = np.abs(rows[:, 5] / ref_k(zs) - 1)
    print("as used, |z| 1e-4..1e4: I worst %.1e, K worst %.1e" % (np.max(e_i), np.max(e_k)))
    check(np.all(e_i < TOL_RATIO), "I ratio as used within 1e-9")
    check(np.all(e_k < TOL_RATIO), "K ratio as used within 1e-9")
    # limits: small argument z I0/(2 I1) -> 1 + z^2/8 (A&S 9.6.10), so
    # R -> R_dc and L_int -> mu0/(8 pi); z K0/K1 -> 0; large argument both
    # tend to the thin-skin z/2 and z with corrections 1/4 and -1/2
    # (A&S 9.7.1, 9.7.2: z I0/(2 I1) = z/2 + 1/4 + ..., z K0/K1 = z - 1/2 + ...)
    small = rays * np.array([1e-3, 1e-2])
    rows = bessel_rows(helper, small)
    check(np.all(np.abs(rows[:, 2] - (1 + small ** 2 / 8)) < 1e-9), "I ratio: DC limit 1 + z^2/8")
    check(np.all(np.abs(rows[:, 5]) < 1e-3), "K ratio: tends to 0 at DC")
    big = rays * np.array([1e3, 1e4])
    rows = bessel_rows(helper, big)
    check(np.all(np.abs(rows[:, 2] - (big / 2 + 0.25)) < 1e-3), "I ratio: thin-skin limit z/2 + 1/4")
    check(np.all(np.abs(rows[:, 5] - (big - 0.5)) < 1e-3), "K ratio: thin-skin limit z - 1/2")


def model(helper, dint, dout, eps, tan_d, sigma, mode, freqs):
    args = [helper, repr(dint), repr(dout), repr(eps), repr(tan_d), repr(sigma), str(mode)]
    out = subprocess.run(args + [repr(float(f)) for f in freqs], check=True,
                         capture_output=True, text=True).stdout
    return np.array([[float(x) for x in line.split()] for line in out.splitlines()])


def model_range(helper, dint, dout, eps, tan_d, sigma):
    args = [helper, repr(dint), repr(dout), repr(eps), repr(tan_d), repr(sigma), "1", "range"]
    out = subprocess.run(args, check=True, capture_output=True, text=True).stdout
    lo, hi = (float(x) for x in out.split())
    return lo, hi


def reference(f, a, b, eps, tan_d, sigma):
    w = 2 * np.pi * f
    delta = np.sqrt(2.0 / (w * MU0 * sigma))
    tau = (1 + 1j) / delta
    eta_s = (1 + 1j) / (sigma * delta)
    z_int = (eta_s / (2 * np.pi * a)) * ive(0, tau * a) / ive(1, tau * a) \
        + (eta_s / (2 * np.pi * b)) * kve(0, tau * b) / kve(1, tau * b)
    ln_ba = np.log(b / a)
    r = z_int.real
    l_int = z_int.imag / w
    l = MU0 / (2 * np.pi) * ln_ba + l_int
    c = 2 * np.pi * sc.epsilon_0 * eps / ln_ba
    g = w * c * tan_d
    gamma = np.sqrt((r + 1j * w * l) * (g + 1j * w * c))
    return r, l_int, gamma.real


def num(text, default):
    return float(text) if text.strip() else default


def check_cables(helper, table):
    worst = {"R": 0.0, "L_int": 0.0, "alpha": 0.0}
    worst_thin = {"R": 0.0, "alpha": 0.0}
    with open(table, newline="") as fh:
        rows = list(csv.DictReader(fh))
    copper = [r for r in rows if not r["clad_thickness_mm"].strip()]
    check(len(copper) >= 12, "at least 12 copper rows in the catalog")
    for row in copper:
        name = row["name"]
        dint = float(row["inner_diameter_mm"]) * 1e-3
        dout = float(row["dielectric_diameter_mm"]) * 1e-3
        vf = float(row["vf"])
        eps = num(row["relative_permittivity"], 1.0 / vf ** 2)
        tan_d = num(row["loss_tangent"], 0.0)
        sigma = num(row["conductivity_s_per_m"], SIGMA_CU)
        factor = num(row["conductor_loss_factor"], 1.0)
        check(factor == 1.0, name + ": no conductor loss factor (the comparison assumes 1)")
        lo, hi = model_range(helper, dint, dout, eps, tan_d, sigma)
        # the span asked for, and the printed range of the model
        f = np.unique(np.concatenate([np.logspace(np.log10(F_LO), np.log10(F_HI), 60),
                                      np.logspace(np.log10(lo), np.log10(hi), 30)]))
        m = model(helper, dint, dout, eps, tan_d, sigma, 1, f)
        m_ext = model(helper, dint, dout, eps, tan_d, sigma, 0, f)
        thin = model(helper, dint, dout, eps, tan_d, sigma, 3, f)
        r, l_int, alpha = reference(f, dint / 2, dout / 2, eps, tan_d, sigma)
        e_r = np.abs(m[:, 6] / r - 1)
        e_l = np.abs((m[:, 7] - m_ext[:, 7]) / l_int - 1)
        e_a = np.abs(m[:, 1] / alpha - 1)
        t_r = np.abs(thin[:, 6] / r - 1)
        t_a = np.abs(thin[:, 1] / alpha - 1)
        print("%-16s range %.4g-%.4g MHz; Bessel model worst R %.1e, L_int %.1e, alpha %.1e;"
              " thin-skin worst R %.1f %%, alpha %.1f %% (at %.3g MHz)"
              % (name, lo / 1e6, hi / 1e6, np.max(e_r), np.max(e_l), np.max(e_a),
                 100 * np.max(t_r), 100 * np.max(t_a), f[np.argmax(t_a)] / 1e6))
        for k, e in (("R", e_r), ("L_int", e_l), ("alpha", e_a)):
            check(np.all(e < TOL), "%s: %s within 1 %% of the Bessel reference" % (name, k))
            worst[k] = max(worst[k], np.max(e))
        worst_thin["R"] = max(worst_thin["R"], np.max(t_r))
        worst_thin["alpha"] = max(worst_thin["alpha"], np.max(t_a))
        # the thin-skin form must be the one that departs: the comparison can fail
        check(np.max(t_a) > 10 * np.max(e_a), name + ": thin-skin form departs more than the model")
        # the DC limit through the library: R -> 1/(sigma pi a^2) + thick-wall term
        fd = np.array([1.0])
        md = model(helper, dint, dout, eps, tan_d, sigma, 1, fd)
        r_dc = 1.0 / (sigma * np.pi * (dint / 2) ** 2)
        check(abs(md[0, 6] / r_dc - 1) < 1e-3, name + ": R at 1 Hz is the DC resistance of the centre")
    print("worst over the copper rows, %g kHz-%g MHz and each printed range: "
          "Bessel model R %.1e, L_int %.1e, alpha %.1e; thin-skin R %.1f %%, alpha %.1f %%"
          % (F_LO / 1e3, F_HI / 1e6, worst["R"], worst["L_int"], worst["alpha"],
             100 * worst_thin["R"], 100 * worst_thin["alpha"]))
    # named points (figures of the thin-skin form against the reference)
    for name, fpt in (("RG-58", 1.83e6), ("RG-58", 475e3), ("RG-11-foam", 60e3)):
        row = next(r for r in copper if r["name"] == name)
        dint = float(row["inner_diameter_mm"]) * 1e-3
        dout = float(row["dielectric_diameter_mm"]) * 1e-3
        eps = num(row["relative_permittivity"], 1.0 / float(row["vf"]) ** 2)
        tan_d = num(row["loss_tangent"], 0.0)
        fa = np.array([fpt])
        _, _, alpha = reference(fa, dint / 2, dout / 2, eps, tan_d, SIGMA_CU)
        thin = model(helper, dint, dout, eps, tan_d, SIGMA_CU, 3, fa)
        new = model(helper, dint, dout, eps, tan_d, SIGMA_CU, 1, fa)
        print("%-10s %8.4g kHz: alpha thin-skin %+.2f %%, Bessel model %+.1e"
              % (name, fpt / 1e3, 100 * (thin[0, 1] / alpha[0] - 1), new[0, 1] / alpha[0] - 1))


def main():
    check_branches(sys.argv[1])
    check_cables(sys.argv[2], sys.argv[3])
    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
