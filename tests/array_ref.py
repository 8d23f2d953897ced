"""array_ref.py - an independent check of the N-element array model.

Each line of the file named on the command line is one array and what
libcoaxline computed for it:
    kind freq_hz elevation_deg n  (x y z delay_s weight_db reversed) * n
    forward_gain_dbi front_to_back_db null_depth_db rdf_forward_db
    rdf_peak_db beamwidth_deg
kind 0 is isotropic elements in free space, 2 short verticals over perfect
ground (element and image: cos(el) 2 cos(k z sin el), nothing below ground).

The pattern is summed here from the plane-wave phases, written from the
textbook array factor (Balanis, Antenna Theory, 3rd ed., ch. 6: the field
of each element times exp(j k u.r)), with azimuth a compass bearing (x
forward, y right).  The sphere and hemisphere means use a different rule
from the library: the midpoint rule on a dense grid uniform in sin(el) and
azimuth (equal solid angle per cell).  The peak is the grid maximum refined
by scipy.optimize.minimize; the rear null a dense scan refined by
scipy.optimize.minimize_scalar; the beamwidth edges scipy.optimize.brentq.
Exit 1 with a message on the first disagreement beyond the tolerances
below (stated beside each check).
"""
import sys

import numpy as np
from scipy import optimize

C = 299792458.0


def parse(line):
    v = [float(t) for t in line.split()]
    kind, f, el, n = int(v[0]), v[1], v[2], int(v[3])
    elems = np.array(v[4:4 + 6 * n]).reshape(n, 6)
    got = v[4 + 6 * n:]
    return kind, f, el, elems, got


class Array:
    def __init__(self, kind, f, elems):
        self.kind = kind
        self.k = 2 * np.pi * f / C
        x, y, z, tau, wdb, rev = elems.T
        amp = 10 ** (wdb / 20) * np.where(rev > 0.5, -1.0, 1.0)
        self.w = amp * np.exp(-1j * 2 * np.pi * f * tau)
        self.x, self.y, self.z = x, y, z

    def power(self, az, el):
        """|F|^2 for arrays az, el (radians) of the same shape."""
        az = np.asarray(az, dtype=float)
        el = np.asarray(el, dtype=float)
        ux = np.cos(el) * np.cos(az)
        uy = np.cos(el) * np.sin(az)
        uz = np.sin(el)
        s = np.zeros(np.broadcast(az, el).shape, dtype=complex)
        for i in range(len(self.w)):
            if self.kind == 2:
                ph = self.k * (self.x[i] * ux + self.y[i] * uy)
                s = s + self.w[i] * np.exp(1j * ph) * 2 * np.cos(self.k * self.z[i] * uz)
            else:
                ph = self.k * (self.x[i] * ux + self.y[i] * uy + self.z[i] * uz)
                s = s + self.w[i] * np.exp(1j * ph)
        p = np.abs(s) ** 2
        if self.kind == 2:
            p = p * np.cos(el) ** 2 * (el >= 0)
        return p

    def mean(self, lo_z, hi_z, nz=800, naz=1600):
        """Mean of |F|^2 over sin(el) in lo_z..hi_z and all azimuths."""
        zs = lo_z + (np.arange(nz) + 0.5) * (hi_z - lo_z) / nz
        azs = (np.arange(naz) + 0.5) * 2 * np.pi / naz
        total = 0.0
        for chunk in np.array_split(zs, 4):
            el = np.arcsin(chunk)[:, None]
            total += self.power(azs[None, :], el).sum()
        return total / (nz * naz)

    def peak(self, lo_el, hi_el):
        azs = np.linspace(0, 2 * np.pi, 721)
        els = np.linspace(lo_el, hi_el, 181)
        grid = self.power(azs[None, :], els[:, None])
        best = grid.max()
        order = np.argsort(grid, axis=None)[::-1][:3]
        for idx in order:
            i, j = np.unravel_index(idx, grid.shape)

            def neg(v):
                e = min(max(v[1], lo_el), hi_el)
                return -float(self.power(v[0], e))

            r = optimize.minimize(neg, [azs[j], els[i]], method="Nelder-Mead",
                                  options={"xatol": 1e-9, "fatol": 1e-15,
                                           "maxiter": 1000})
            best = max(best, -r.fun)
        return best


def db(x):
    return 10 * np.log10(x)


def check(name, got, want, tol, case):
    if not abs(got - want) <= tol:
        print("case %d: %s: library %.6f, reference %.6f (tolerance %g)"
              % (case, name, got, want, tol))
        sys.exit(1)


def main():
    cases = 0
    with open(sys.argv[1]) as fp:
        for case, line in enumerate(fp):
            if not line.strip():
                continue
            kind, f, el_deg, elems, got = parse(line)
            a = Array(kind, f, elems)
            el = np.radians(el_deg)
            g_fwd, fb, null_db, rdf_fwd, rdf_peak, bw = got
            front = float(a.power(0.0, el))
            back = float(a.power(np.pi, el))
            sphere = a.mean(-1.0, 1.0) if kind == 0 else a.mean(0.0, 1.0) / 2
            hemi = a.mean(0.0, 1.0)
            # midpoint rule on 800 x 1600 cells: error of order 1e-5
            # relative for arrays this size (h^2), so 0.001 dB
            check("forward gain", g_fwd, db(front / sphere), 1e-3, case)
            check("forward RDF", rdf_fwd, db(front / hemi), 1e-3, case)
            # front-to-back: two plane-wave sums, no integral
            check("front-to-back", fb, db(front / back), 1e-6, case)
            peak = a.peak(0.0, np.pi / 2)
            check("peak RDF", rdf_peak, db(peak / hemi), 2e-3, case)
            # rear null: the deepest of a 0.05-degree scan over 90..270,
            # refined; compared where it is above -60 dB (deeper nulls move
            # by rounding)
            azs = np.radians(np.linspace(90, 270, 3601))
            cut = a.power(azs, el)
            i = int(np.argmin(cut))
            lo, hi = azs[max(i - 1, 0)], azs[min(i + 1, len(azs) - 1)]
            r = optimize.minimize_scalar(lambda t: float(a.power(t, el)),
                                         bounds=(lo, hi), method="bounded",
                                         options={"xatol": 1e-12})
            deepest = min(cut[i], r.fun)
            want_null = db(deepest / front)
            if want_null > -60:
                check("null depth", null_db, want_null, 0.01, case)
            # beamwidth: first crossings of half the forward response
            half = 0.5 * front

            def edge(sign):
                ts = np.radians(np.linspace(0, 180, 3601))
                p = a.power(sign * ts, el)
                below = np.nonzero(p <= half)[0]
                if len(below) == 0:
                    return None
                j = below[0]
                return optimize.brentq(lambda t: float(a.power(sign * t, el)) - half,
                                       ts[j - 1], ts[j], xtol=1e-12)

            e1, e2 = edge(1.0), edge(-1.0)
            want_bw = 360.0 if e1 is None or e2 is None else np.degrees(e1 + e2)
            check("beamwidth", bw, want_bw, 0.01, case)
            cases += 1
    print("%d arrays agree" % cases)
    if cases == 0:
        sys.exit(1)


main()
