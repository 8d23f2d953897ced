"""yield_ref.py - an independent Monte-Carlo of as-built arrays, against
which tests/check_yield compares libcoaxline's cxl_yield_eval.

Each line of the file named on the command line is one case and what the
library computed for it:
    kind goal_kind goal_db freq_hz elevation_deg length_tol_m vf_tol
    imbalance_tol_db phase_tol_deg trials n
    (x y z delay_s line_m line_vf weight_db reversed) * n
    yield yield_se fb_median fb_p5 null_median null_p5
kind 0: isotropic elements in free space; 2: short verticals over perfect
ground (element and image: cos(el) 2 cos(k z sin el)).  goal_kind 0:
front-to-back >= goal_db; 1: rear null <= goal_db.  line_m 0: no line.

Here the builds are drawn with numpy's own generator (PCG64, not the
library's GSL Mersenne Twister) from the same distributions (coaxline.h:
each line length +-length_tol, one VF error +-vf_tol for all lines, each
amplitude +-imbalance_tol dB, each phase +-phase_tol deg, all uniform and
independent), and the pattern is summed from the plane-wave phases of the
textbook array factor (Balanis, Antenna Theory, 3rd ed., ch. 6: each
element's field times exp(j k u.r)), with azimuth a compass bearing (x
forward, y right).  Front-to-back: azimuth 0 over azimuth 180 at the
elevation; rear null: a 1-degree scan of azimuth 90..270 refined by
scipy.optimize.minimize_scalar around its two deepest local minima, in dB
relative to azimuth 0.

Checks (exit 1 with a message on the first failure):
  - yield: |library - here| <= 4 sqrt(se_lib^2 + se_here^2), the binomial
    standard errors sqrt(p (1 - p) / n) of both runs (two independent
    estimates of one probability; 4 standard deviations, so a correct
    library fails by chance about once in 15,000 runs of a case);
  - quantiles (median, and the level 95 % of builds reach): the fraction
    of this run's trials on the worse side of the library's value must be
    within 4 sqrt(q (1 - q) (1 / n_lib + 1 / n_here)) + 0.002 of q, the
    distribution-free sampling error of two independent sample quantiles
    (the delta method: the CDF at a sample q-quantile has variance
    q (1 - q) / n), the library's value widened by its histogram bin
    (+-0.005 dB) and 0.002 for the bin's share of ties.
The dB differences of the quantiles are printed for the record.
"""
import sys

import numpy as np
from scipy import optimize

C = 299792458.0
SEED = 20261202   # this script's own seed (numpy PCG64)
BIN_HALF_DB = 0.005


def parse(line):
    v = [float(t) for t in line.split()]
    head = v[:11]
    kind, goal_kind = int(head[0]), int(head[1])
    goal_db, f, el, ltol, vtol, atol, ptol = head[2:9]
    trials, n = int(head[9]), int(head[10])
    elems = np.array(v[11:11 + 8 * n]).reshape(n, 8)
    got = v[11 + 8 * n:]
    return dict(kind=kind, goal_kind=goal_kind, goal_db=goal_db, f=f, el=el,
                ltol=ltol, vtol=vtol, atol=atol, ptol=ptol, trials=trials,
                elems=elems, got=got)


def weights(case, rng, m):
    """m builds: complex weights, shape (m, n)."""
    x, y, z, tau, line, vf, wdb, rev = case['elems'].T
    n = len(x)
    omega = 2 * np.pi * case['f']
    dv = rng.uniform(-case['vtol'], case['vtol'], size=(m, 1))
    dl = rng.uniform(-case['ltol'], case['ltol'], size=(m, n))
    da = rng.uniform(-case['atol'], case['atol'], size=(m, n))
    dp = np.radians(rng.uniform(-case['ptol'], case['ptol'], size=(m, n)))
    has = line > 0
    length = np.where(has, line + dl, 0.0)
    vel = np.where(has, vf + dv, 1.0)
    delay = tau + length / (vel * C)
    amp = 10 ** ((wdb + da) / 20) * np.where(rev > 0.5, -1.0, 1.0)
    return amp * np.exp(1j * (dp - omega * delay))


def steer(case, az, el):
    """Element signals for unit weights from (az, el) in radians."""
    x, y, z = case['elems'][:, 0], case['elems'][:, 1], case['elems'][:, 2]
    k = 2 * np.pi * case['f'] / C
    ux, uy, uz = np.cos(el) * np.cos(az), np.cos(el) * np.sin(az), np.sin(el)
    if case['kind'] == 2:
        g = np.cos(el) * 2 * np.cos(k * z * uz)
        return g * np.exp(1j * k * (x * ux + y * uy))
    return np.exp(1j * k * (x * ux + y * uy + z * uz))


def front_to_back(case, w):
    el = np.radians(case['el'])
    f = w @ steer(case, 0.0, el)
    b = w @ steer(case, np.pi, el)
    return 10 * np.log10(np.abs(f) ** 2 / np.abs(b) ** 2)


def rear_null(case, w):
    el = np.radians(case['el'])
    az = np.radians(np.arange(90.0, 270.0 + 1e-9, 1.0))
    s = np.array([steer(case, a, el) for a in az])      # (181, n)
    p = np.abs(w @ s.T) ** 2                             # (m, 181)
    front = np.abs(w @ steer(case, 0.0, el)) ** 2
    out = np.empty(len(w))
    for t in range(len(w)):
        row = p[t]
        best = row.min()
        mins = [i for i in range(1, len(row) - 1)
                if row[i] < row[i - 1] and row[i] < row[i + 1]]
        mins.sort(key=lambda i: row[i])
        for i in mins[:2]:
            fn = lambda a: abs(w[t] @ steer(case, a, el)) ** 2
            r = optimize.minimize_scalar(fn, bounds=(az[i - 1], az[i + 1]),
                                         method='bounded',
                                         options={'xatol': 1e-10})
            best = min(best, r.fun)
        out[t] = 10 * np.log10(max(best, 1e-30) / front[t])
    return out


def check_quantile(name, lib_value, sample, q, n_lib, worst_low):
    """q-quantile counted from the worst side."""
    m = len(sample)
    if worst_low:
        lo = np.mean(sample < lib_value - BIN_HALF_DB)
        hi = np.mean(sample <= lib_value + BIN_HALF_DB)
    else:
        lo = np.mean(sample > lib_value + BIN_HALF_DB)
        hi = np.mean(sample >= lib_value - BIN_HALF_DB)
    tol = 4 * np.sqrt(q * (1 - q) * (1 / n_lib + 1 / m)) + 0.002
    srt = np.sort(sample) if worst_low else -np.sort(-sample)
    here = srt[max(int(np.ceil(q * m)) - 1, 0)]
    ok = lo - tol <= q <= hi + tol
    print(f"  {name}: library {lib_value:.3f} dB, here {here:.3f} dB "
          f"(difference {lib_value - here:+.3f} dB); worse side here "
          f"{lo:.4f}..{hi:.4f} for q {q} +- {tol:.4f}: {'ok' if ok else 'FAIL'}")
    return ok


def main():
    rng = np.random.default_rng(SEED)
    failures = 0
    with open(sys.argv[1]) as fp:
        for number, line in enumerate(fp, 1):
            if not line.strip():
                continue
            case = parse(line)
            got = case['got']
            m = case['trials']
            w = weights(case, rng, m)
            fb = front_to_back(case, w)
            want_null = case['goal_kind'] == 1 or np.isfinite(got[4])
            null = rear_null(case, w) if want_null else None
            if case['goal_kind'] == 0:
                p = np.mean(fb >= case['goal_db'])
            else:
                p = np.mean(null <= case['goal_db'])
            se = np.sqrt(p * (1 - p) / m)
            n_lib = case['trials']
            tol = 4 * np.sqrt(got[1] ** 2 + se ** 2)
            ok = abs(got[0] - p) <= tol
            print(f"case {number}: {len(case['elems'])} elements, yield library "
                  f"{got[0]:.4f} +- {got[1]:.4f}, here {p:.4f} +- {se:.4f} "
                  f"(|difference| {abs(got[0] - p):.4f} <= {tol:.4f}): "
                  f"{'ok' if ok else 'FAIL'}")
            failures += not ok
            failures += not check_quantile("front-to-back median", got[2], fb, 0.5, n_lib, True)
            failures += not check_quantile("front-to-back p5", got[3], fb, 0.05, n_lib, True)
            if want_null:
                failures += not check_quantile("null median", got[4], null, 0.5, n_lib, False)
                failures += not check_quantile("null p5", got[5], null, 0.05, n_lib, False)
    if failures:
        print(f"yield_ref.py: {failures} disagreement(s)")
        return 1
    return 0


if __name__ == '__main__':
    sys.exit(main())
