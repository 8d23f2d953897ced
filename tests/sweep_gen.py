"""sweep_gen.py - one-port sweeps of textbook lines for tests/check_sweep.c and
tests/check_cli_sweep.c, written by scikit-rf (run with /usr/bin/python3).

Line model (the reference the tests check against):
  gamma(f) = alpha(f) + j 2 pi f / (VF(f) c),  VF(f) = vf_hf - drop / sqrt(f),
  alpha(f) = (a sqrt(f) + b f) / (20 log10 e) Np/m,  real Z0;
scikit-rf's DefinedGammaZ0 media cascades line ** line ** termination (all
ports at 50 ohm, a line of another Z0 embedded with line(..., z0=Z0,
embed=True)), which is the lossy-line input impedance
Z0 (ZL + Z0 tanh(gamma l)) / (Z0 + ZL tanh(gamma l))
(Pozar, Microwave Engineering, 4th ed., sec. 2.7, from memory).  The
resonance truths are found with scipy.optimize on that closed form, apart
from scikit-rf.

usage: sweep_gen.py formats DIR | resonances DIR SEED COUNT | fault DIR | fit DIR | demo DIR
"""
import math
import os
import sys

import numpy as np
from scipy import optimize

import skrf
from skrf.media import DefinedGammaZ0

C = 299792458.0
DB_PER_NP = 20.0 * math.log10(math.e)


def gamma_of(f, vf_hf, drop, a, b):
    vf = vf_hf - drop / np.sqrt(f)
    alpha = (a * np.sqrt(f) + b * f) / DB_PER_NP
    return alpha + 1j * 2 * np.pi * f / (vf * C)


def media(freq, vf_hf, drop, a, b):
    """Ports at 50 ohm; a line of another impedance is embedded in them."""
    f = np.maximum(freq.f, 1.0)
    return DefinedGammaZ0(frequency=freq, z0=50, Z0=50,
                          gamma=gamma_of(f, vf_hf, drop, a, b))


def zin(f, length, end, z0_line, vf_hf, drop, a, b, load=None):
    g = gamma_of(f, vf_hf, drop, a, b) * length
    if end == 'open':
        return z0_line / np.tanh(g)
    if end == 'short':
        return z0_line * np.tanh(g)
    t = np.tanh(g)
    return z0_line * (load + z0_line * t) / (z0_line + load * t)


def stub(freq, length, end, z0_line=50.0, vf_hf=0.66, drop=0.0, a=0.0, b=0.0):
    m = media(freq, vf_hf, drop, a, b)
    term = m.open() if end == 'open' else m.short()
    n = m.line(length, 'm', z0=z0_line, embed=True) ** term
    n.name = 'line'
    return n


def write_rows(path, header, rows):
    with open(path, 'w') as fp:
        fp.write(header + '\n')
        for r in rows:
            fp.write(','.join('%.15g' % v for v in r) + '\n')


def formats(d):
    """One lossy open line written in every format the reader takes."""
    args = dict(length=7.3, end='open', z0_line=52.0, vf_hf=0.70, drop=30.0,
                a=2e-6, b=1e-10)
    freqs = {}
    for unit in ('Hz', 'kHz', 'MHz', 'GHz'):
        freqs[unit] = skrf.Frequency(1, 61, 121, 'MHz')
        freqs[unit].unit = unit
    net = stub(freqs['MHz'], **args)
    s = net.s[:, 0, 0]
    f = net.f
    # truth: Gamma against 50 ohm at full precision
    write_rows(os.path.join(d, 'truth.csv'), 'f,re,im', zip(f, s.real, s.imag))
    # scikit-rf's own writer: S in RI, MA, DB with each frequency unit
    for unit, form in (('Hz', 'ri'), ('kHz', 'ma'), ('MHz', 'db'), ('GHz', 'ri')):
        n = stub(freqs[unit], **args)
        n.write_touchstone(os.path.join(d, 's_%s_%s' % (form, unit.lower())), form=form)
    z = 50.0 * (1 + s) / (1 - s)
    y = 1 / z
    # Touchstone 1.0 Z and Y, normalised to R (here R 50 and R 75)
    with open(os.path.join(d, 'z_ri.s1p'), 'w') as fp:
        fp.write('! Z parameters, normalised to R\n# MHz Z RI R 50\n')
        for fi, zi in zip(f, z):
            fp.write('%.15g %.15g %.15g\n' % (fi / 1e6, (zi / 50).real, (zi / 50).imag))
    with open(os.path.join(d, 'y_ma.s1p'), 'w') as fp:
        fp.write('# kHz Y MA R 75\n')
        for fi, yi in zip(f, y):
            yn = yi * 75
            fp.write('%.15g %.15g %.15g\n' % (fi / 1e3, abs(yn), np.degrees(np.angle(yn))))
    # no option line: GHz S MA R 50
    with open(os.path.join(d, 'default.s1p'), 'w') as fp:
        fp.write('! no option line\n')
        for fi, si in zip(f, s):
            fp.write('%.15g %.15g %.15g\n' % (fi / 1e9, abs(si), np.degrees(np.angle(si))))
    # any reference: S against 75 ohm
    s75 = (z - 75) / (z + 75)
    with open(os.path.join(d, 's_ref75.s1p'), 'w') as fp:
        fp.write('# Hz S RI R 75\n')
        for fi, si in zip(f, s75):
            fp.write('%.15g %.15g %.15g\n' % (fi, si.real, si.imag))
    # Touchstone 2.0: S against [Reference] 75, and Z in ohms
    with open(os.path.join(d, 'v2_s.ts'), 'w') as fp:
        fp.write('! version 2.0 one-port\n[Version] 2.0\n# MHz S DB R 50\n'
                 '[Number of Ports] 1\n[Number of Frequencies] %d\n[Reference]\n75\n'
                 '[Begin Information]\nanything here\n[End Information]\n'
                 '[Network Data]\n' % len(f))
        for fi, si in zip(f, s75):
            fp.write('%.15g %.15g %.15g\n' % (fi / 1e6, 20 * np.log10(abs(si)),
                                             np.degrees(np.angle(si))))
        fp.write('[End]\n')
    with open(os.path.join(d, 'v2_z.ts'), 'w') as fp:
        fp.write('[Version] 2.0\n# Hz Z RI R 75\n[Number of Ports] 1\n[Network Data]\n')
        for fi, zi in zip(f, z):
            fp.write('%.15g %.15g %.15g\n' % (fi, zi.real, zi.imag))
        fp.write('[End]\n')
    # CSV
    write_rows(os.path.join(d, 'rx.csv'), 'freq_hz,r_ohm,x_ohm', zip(f, z.real, z.imag))
    write_rows(os.path.join(d, 'zdeg.csv'), 'freq_mhz,z_ohm,z_deg',
               zip(f / 1e6, abs(z), np.degrees(np.angle(z))))
    write_rows(os.path.join(d, 'sri.csv'), 's11_re,s11_im,freq_hz', zip(s.real, s.imag, f))
    write_rows(os.path.join(d, 'sdb.csv'), 'freq_mhz,s11_db,s11_deg',
               zip(f / 1e6, 20 * np.log10(abs(s)), np.degrees(np.angle(s))))
    swr = (1 + abs(s)) / (1 - abs(s))
    write_rows(os.path.join(d, 'swr.csv'), 'freq_mhz,swr', zip(f / 1e6, swr))


def resonances(d, seed, count):
    """Random lines, coarse and fine steps, with the true resonances."""
    rng = np.random.default_rng(seed)
    truth = open(os.path.join(d, 'truth.csv'), 'w')
    truth.write('case,kind,series,f\n')
    for k in range(count):
        length = rng.uniform(3.0, 40.0)
        vf_hf = rng.uniform(0.62, 0.9)
        drop = rng.uniform(0.0, 40.0)
        a = rng.uniform(0.0, 5e-6)
        b = rng.uniform(0.0, 2e-10)
        z0_line = rng.uniform(45.0, 80.0)
        end = 'open' if k % 2 == 0 else 'short'
        f_q = vf_hf * C / (4 * length)         # about one quarter wave
        stop = f_q * rng.uniform(6.0, 14.0)
        npts = int(rng.integers(60, 800))
        freq = skrf.Frequency(f_q * 0.3, stop, npts, 'Hz')
        net = stub(freq, length, end, z0_line, vf_hf, drop, a, b)
        noise = 0.0 if k % 3 else 3e-4
        if noise:
            net.s = net.s + noise * (rng.standard_normal(net.s.shape) +
                                     1j * rng.standard_normal(net.s.shape))
        net.name = 'case%d' % k
        net.write_touchstone(os.path.join(d, 'case%d' % k), form='ri')
        with open(os.path.join(d, 'case%d.txt' % k), 'w') as fp:
            fp.write('%s %.17g %.17g %.17g %.17g %.17g %.17g %d %.17g\n'
                     % (end, length, vf_hf, drop, a, b, z0_line, npts, noise))
        args = (length, end, z0_line, vf_hf, drop, a, b)
        fgrid = np.linspace(freq.f[0], freq.f[-1], 200000)
        x = zin(fgrid, *args).imag
        for i in np.nonzero(np.sign(x[:-1]) != np.sign(x[1:]))[0]:
            x0, x1 = x[i], x[i + 1]
            series = 1 if x1 > x0 else 0
            fn = (lambda ff: zin(ff, *args).imag) if series else \
                 (lambda ff: (1 / zin(ff, *args)).imag)
            lo, hi = fgrid[i], fgrid[i + 1]
            if np.sign(fn(lo)) == np.sign(fn(hi)):
                continue
            truth.write('%d,x,%d,%.17g\n' % (k, series, optimize.brentq(fn, lo, hi, xtol=1e-9)))
        zmag = abs(zin(fgrid, *args))
        gmag = abs((zin(fgrid, *args) - 50) / (zin(fgrid, *args) + 50))
        for name, v in (('z', zmag), ('swr', gmag)):
            for i in range(1, len(v) - 1):
                if v[i] <= v[i - 1] and v[i] < v[i + 1]:
                    fn = (lambda ff: abs(zin(ff, *args))) if name == 'z' else \
                         (lambda ff: abs((zin(ff, *args) - 50) / (zin(ff, *args) + 50)))
                    r = optimize.minimize_scalar(fn, bounds=(fgrid[i - 1], fgrid[i + 1]),
                                                 method='bounded',
                                                 options={'xatol': 1e-6})
                    truth.write('%d,%s,1,%.17g\n' % (k, name, r.x))
    truth.close()


def fault(d):
    """A 50 ohm run (VF 0.66, 2e-6 sqrt(f) dB/m) with 1.5 m of 75 ohm cable
    spliced in at 12 m and the far end open at 21.5 m; the same swept on a
    harmonic grid from 0.5 MHz (low-pass), from 2.3 MHz (band-pass) and
    from 0 Hz (for scikit-rf's own transform), and with noise."""
    def run(freq):
        m = media(freq, 0.66, 0.0, 2e-6, 0.0)
        n = (m.line(12.0, 'm') ** m.line(1.5, 'm', z0=75, embed=True) ** m.line(8.0, 'm') **
             m.open())
        n.name = 'run'
        return n
    grids = {'lowpass': (0.5e6, 500e6, 1000), 'bandpass': (2.3e6, 501.8e6, 1000),
             'dc': (0.0, 499.5e6, 1000)}
    rng = np.random.default_rng(5)
    for name, (a, b, n) in grids.items():
        net = run(skrf.Frequency(a, b, n, 'Hz'))
        net.write_touchstone(os.path.join(d, name), form='ri')
        if name == 'lowpass':
            net.s = net.s + 2e-3 * (rng.standard_normal(net.s.shape) +
                                    1j * rng.standard_normal(net.s.shape))
            net.write_touchstone(os.path.join(d, 'noisy'), form='ri')


def fit(d):
    """Pieces for the whole-sweep fit: open, short and loaded ends, one
    behind a fixture (a lossless 50 ohm line of VF 0.7 between the
    reference plane and the piece), noise on each; parameters in NAME.txt
    as end length vf_hf drop a b z0 load_r load_x fixture noise."""
    cases = (
        ('fit_open', 'open', 12.0, 0.66, 25.0, 1.2e-5, 2e-10, 51.0, 0, 0, 0.0, 1e-3),
        ('fit_short', 'short', 7.5, 0.78, 15.0, 8e-6, 1e-10, 75.0, 0, 0, 0.0, 1e-3),
        ('fit_load', 'load', 9.0, 0.70, 20.0, 1e-5, 0.0, 52.0, 12.0, -30.0, 0.0, 1e-3),
        ('fit_fixture', 'open', 10.0, 0.66, 20.0, 1e-5, 1e-10, 75.0, 0, 0, 0.4, 1e-3),
    )
    rng = np.random.default_rng(29)
    for (name, end, length, vf_hf, drop, a, b, z0, lr, lx, fix, noise) in cases:
        freq = skrf.Frequency(1, 80, 801, 'MHz')
        m = media(freq, vf_hf, drop, a, b)
        if end == 'open':
            term = m.open()
        elif end == 'short':
            term = m.short()
        else:
            term = m.load((lr + 1j * lx - 50.0) / (lr + 1j * lx + 50.0))
        n = m.line(length, 'm', z0=z0, embed=True) ** term
        if fix > 0:
            mf = DefinedGammaZ0(frequency=freq, z0=50, Z0=50,
                                gamma=1j * 2 * np.pi * freq.f / (0.7 * C))
            n = mf.line(fix, 'm') ** n
        n.s = n.s + noise * (rng.standard_normal(n.s.shape) +
                             1j * rng.standard_normal(n.s.shape))
        n.name = name
        n.write_touchstone(os.path.join(d, name), form='ri')
        with open(os.path.join(d, name + '.txt'), 'w') as fp:
            fp.write('%s %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g\n'
                     % (end, length, vf_hf, drop, a, b, z0, lr, lx, fix, noise))


def demo(d):
    """The demo's phasing piece (an invented scenario): 12 m of line, far end
    open, VF 0.66 - 25/sqrt(f), 1.2e-5 sqrt(f) + 2e-10 f dB/m, Z0 51 ohm,
    swept 1 to 60 MHz in 237 points with noise 1e-3 (seed 41)."""
    freq = skrf.Frequency(1, 60, 237, 'MHz')
    m = media(freq, 0.66, 25.0, 1.2e-5, 2e-10)
    n = m.line(12.0, 'm', z0=51.0, embed=True) ** m.open()
    rng = np.random.default_rng(41)
    n.s = n.s + 1e-3 * (rng.standard_normal(n.s.shape) + 1j * rng.standard_normal(n.s.shape))
    with open(os.path.join(d, 'phasing-stub.s1p'), 'w') as fp:
        fp.write('! phasing piece, 12 m cut long, far end open (demo)\n# MHz S RI R 50\n')
        for fi, si in zip(n.f, n.s[:, 0, 0]):
            fp.write('%.6f %.6f %.6f\n' % (fi / 1e6, si.real, si.imag))


def main():
    cmd, d = sys.argv[1], sys.argv[2]
    os.makedirs(d, exist_ok=True)
    if cmd == 'formats':
        formats(d)
    elif cmd == 'fault':
        fault(d)
    elif cmd == 'fit':
        fit(d)
    elif cmd == 'demo':
        demo(d)
    elif cmd == 'resonances':
        resonances(d, int(sys.argv[3]), int(sys.argv[4]))
    else:
        sys.exit('unknown command ' + cmd)


if __name__ == '__main__':
    main()
