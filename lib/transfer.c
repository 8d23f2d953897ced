/* transfer.c - a line into a load: voltage transfer, input impedance and
 * the series resonances of a lossy stub.
 *
 * On a line with propagation constant gamma and characteristic impedance
 * Z0, V(z) = V+ (e^{-gamma z} + G e^{gamma z}) with the load at z = 0 and
 * G = (ZL - Z0)/(ZL + Z0); the input sits at z = -l, so
 *     V_load / V_in = (1 + G) / (e^{gamma l} + G e^{-gamma l})
 *     Z_in = Z0 (1 + G e^{-2 gamma l}) / (1 - G e^{-2 gamma l})
 * (Pozar, Microwave Engineering, 4th ed., sec. 2.3 lossless, sec. 2.7
 * lossy).  Both are evaluated with e^{-gamma l} only, so a long lossy line
 * cannot overflow.  With a complex Z0 these are the voltage-wave forms, so
 * they are exact for the low bands, where Z0 is far from real.
 */
#include <config.h>
#include <math.h>
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>
#include "coaxline.h"
#include "internal.h"

#define RAD_TO_DEG (180.0 / M_PI)
/* below this |V_load / V_in| the phase means nothing (a shorted load) */
#define MIN_RATIO 1e-300
/* e^{-2 alpha l} below this is 0 for every load: alpha l > 345 Np */
#define MAX_ATTENUATION_NP 345.0

/* e^{-gamma l} and Gamma of a load, with the arguments checked. */
typedef struct terminated {
    gsl_complex z0, g, e1; /* Z0, Gamma_L, e^{-gamma l} */
    gsl_complex g1;        /* 1 + Gamma_L, as 2 ZL / (ZL + Z0) */
} terminated;

static int valid_line(double z0_re, double z0_im, double alpha, double beta,
                      double length_m)
{
    return cxl__finite_pos(z0_re) && isfinite(z0_im) && cxl__finite_nonneg(alpha) &&
           cxl__finite_pos(beta) && cxl__finite_nonneg(length_m);
}

static cxl_status terminate(double z0_re, double z0_im, double alpha, double beta,
                            double length_m, double load_re, double load_im,
                            terminated *t)
{
    if (!valid_line(z0_re, z0_im, alpha, beta, length_m) ||
        !cxl__finite_nonneg(load_re) || !isfinite(load_im))
        return CXL_EINVAL;
    double a_l = alpha * length_m, b_l = beta * length_m;
    if (!isfinite(b_l) || a_l > MAX_ATTENUATION_NP) return CXL_ERANGE;
    t->z0 = gsl_complex_rect(z0_re, z0_im);
    gsl_complex zl = gsl_complex_rect(load_re, load_im);
    gsl_complex den = gsl_complex_add(zl, t->z0);
    /* Re Z0 > 0 and Re ZL >= 0, so |ZL + Z0| > 0 */
    t->g = gsl_complex_div(gsl_complex_sub(zl, t->z0), den);
    /* not 1 + G: for a shorted load that leaves a rounding residue of
     * 1e-17 with a meaningless phase instead of an exact 0 */
    t->g1 = gsl_complex_div(gsl_complex_mul_real(zl, 2.0), den);
    t->e1 = gsl_complex_polar(exp(-a_l), -b_l);
    return CXL_OK;
}

cxl_status cxl_transfer_ratio(double length_m, double z0_re_ohm,
                              double z0_im_ohm, double alpha_np_per_m,
                              double beta_rad_per_m, double load_re_ohm,
                              double load_im_ohm, double *ratio_re,
                              double *ratio_im)
{
    terminated t;
    if (!ratio_re || !ratio_im) return CXL_EINVAL;
    cxl_status st = terminate(z0_re_ohm, z0_im_ohm, alpha_np_per_m, beta_rad_per_m,
                              length_m, load_re_ohm, load_im_ohm, &t);
    if (st != CXL_OK) return st;
    /* (1 + G) e^{-gl} / (1 + G e^{-2gl}) */
    gsl_complex num = gsl_complex_mul(t.g1, t.e1);
    gsl_complex den = gsl_complex_add_real(
        gsl_complex_mul(t.g, gsl_complex_mul(t.e1, t.e1)), 1.0);
    double dn = gsl_complex_abs(den), nn = gsl_complex_abs(num);
    /* a reactive load that the line turns into a short at its input, or a
     * shorted load: no finite ratio with a phase */
    if (!(dn > 1e-15 * (nn > 1.0 ? nn : 1.0)) || !(nn > MIN_RATIO * dn)) return CXL_ERANGE;
    gsl_complex r = gsl_complex_div(num, den);
    if (!isfinite(GSL_REAL(r)) || !isfinite(GSL_IMAG(r))) return CXL_ERANGE;
    *ratio_re = GSL_REAL(r);
    *ratio_im = GSL_IMAG(r);
    return CXL_OK;
}

cxl_status cxl_transfer_delay(double ratio_re, double ratio_im,
                              double electrical_deg, double *transfer_db,
                              double *delay_deg)
{
    if (!transfer_db || !delay_deg || !isfinite(ratio_re) || !isfinite(ratio_im) ||
        !isfinite(electrical_deg))
        return CXL_EINVAL;
    double mag = hypot(ratio_re, ratio_im);
    if (!(mag > 0.0)) return CXL_ERANGE;
    /* the delay is minus the phase angle, taken within half a turn of the
     * line's own electrical length so that whole turns are kept */
    double phi = -atan2(ratio_im, ratio_re) * RAD_TO_DEG;
    double turns = floor((electrical_deg - phi) / 360.0 + 0.5);
    /* a ratio whose magnitude overflows (|re|, |im| near DBL_MAX), or a
     * delay pushed past DBL_MAX by the whole turns: CXL_ERANGE */
    double db = 20.0 * log10(mag), delay = phi + 360.0 * turns;
    if (!isfinite(db) || !isfinite(delay)) return CXL_ERANGE;
    *transfer_db = db;
    *delay_deg = delay;
    return CXL_OK;
}

/* Ratio, dB and delay for a line given by Z0, gamma; electrical = beta l. */
static cxl_status transfer_all(double z0_re, double z0_im, double alpha, double beta,
                               double length_m, double load_re, double load_im,
                               double *transfer_db, double *delay_deg,
                               double *electrical_deg)
{
    double rr, ri, db, dl, el = beta * length_m * RAD_TO_DEG;
    if (!transfer_db || !delay_deg) return CXL_EINVAL;
    cxl_status st = cxl_transfer_ratio(length_m, z0_re, z0_im, alpha, beta, load_re,
                                       load_im, &rr, &ri);
    /* a line so long that its length in degrees overflows */
    if (st == CXL_OK && !isfinite(el)) st = CXL_ERANGE;
    if (st == CXL_OK) st = cxl_transfer_delay(rr, ri, el, &db, &dl);
    if (st != CXL_OK) return st;
    *transfer_db = db;
    *delay_deg = dl;
    if (electrical_deg) *electrical_deg = el;
    return CXL_OK;
}

cxl_status cxl_transfer_lossless(double length_m, double z0_ohm, double vf,
                                 double freq_hz, double load_re_ohm,
                                 double load_im_ohm, double *transfer_db,
                                 double *delay_deg, double *electrical_deg)
{
    if (!cxl__valid_vf(vf) || !cxl__finite_pos(freq_hz) ||
        !valid_line(z0_ohm, 0.0, 0.0, 1.0, length_m) || !cxl__finite_nonneg(load_re_ohm) ||
        !isfinite(load_im_ohm))
        return CXL_EINVAL;
    double beta = 2.0 * M_PI * freq_hz / (vf * CXL_C_M_PER_S);
    /* valid arguments whose phase constant over- or underflows */
    if (!cxl__finite_pos(beta)) return CXL_ERANGE;
    return transfer_all(z0_ohm, 0.0, 0.0, beta, length_m, load_re_ohm, load_im_ohm,
                        transfer_db, delay_deg, electrical_deg);
}

/* gamma and Z0 of a model at a frequency. */
static cxl_status model_line(const cxl_loss_model *model, double freq_hz,
                             unsigned flags, double *alpha, double *beta,
                             double *z0_re, double *z0_im)
{
    cxl_status st = cxl_loss_model_gamma(model, freq_hz, flags, alpha, beta);
    if (st == CXL_OK) st = cxl_loss_model_z0(model, freq_hz, flags, z0_re, z0_im);
    return st;
}

cxl_status cxl_transfer_model(const cxl_loss_model *model, double length_m,
                              double freq_hz, unsigned flags,
                              double load_re_ohm, double load_im_ohm,
                              double *transfer_db, double *delay_deg,
                              double *electrical_deg)
{
    double alpha, beta, zr, zi;
    if (!model || !transfer_db || !delay_deg) return CXL_EINVAL;
    cxl_status st = model_line(model, freq_hz, flags, &alpha, &beta, &zr, &zi);
    if (st != CXL_OK) return st;
    return transfer_all(zr, zi, alpha, beta, length_m, load_re_ohm, load_im_ohm,
                        transfer_db, delay_deg, electrical_deg);
}

/* Z_in = Z0 (1 + G e^{-2gl}) / (1 - G e^{-2gl}) for a given G. */
static cxl_status input_impedance(gsl_complex z0, gsl_complex g, gsl_complex e1,
                                  gsl_complex *zin)
{
    gsl_complex ge2 = gsl_complex_mul(g, gsl_complex_mul(e1, e1));
    gsl_complex den = gsl_complex_sub(gsl_complex_rect(1.0, 0.0), ge2);
    if (!(gsl_complex_abs(den) > 1e-15)) return CXL_ERANGE; /* open at the input */
    *zin = gsl_complex_mul(z0, gsl_complex_div(gsl_complex_add_real(ge2, 1.0), den));
    if (!isfinite(GSL_REAL(*zin)) || !isfinite(GSL_IMAG(*zin))) return CXL_ERANGE;
    return CXL_OK;
}

cxl_status cxl_transfer_input_impedance(double length_m, double z0_re_ohm,
                                        double z0_im_ohm,
                                        double alpha_np_per_m, double beta_rad_per_m,
                                        double load_re_ohm, double load_im_ohm,
                                        double *zin_re_ohm, double *zin_im_ohm)
{
    terminated t;
    gsl_complex zin;
    if (!zin_re_ohm || !zin_im_ohm) return CXL_EINVAL;
    cxl_status st = terminate(z0_re_ohm, z0_im_ohm, alpha_np_per_m, beta_rad_per_m,
                              length_m, load_re_ohm, load_im_ohm, &t);
    if (st == CXL_OK) st = input_impedance(t.z0, t.g, t.e1, &zin);
    if (st != CXL_OK) return st;
    *zin_re_ohm = GSL_REAL(zin);
    *zin_im_ohm = GSL_IMAG(zin);
    return CXL_OK;
}

/* ---- series resonances of a stub of a modelled cable -------------------- */

typedef struct stub_eval {
    const cxl_loss_model *model;
    unsigned flags;
    double length_m, k;      /* k: wavelengths at the resonance */
    double gamma_l;          /* +1 open far end, -1 shorted */
    cxl_status st;           /* first failure inside a GSL callback */
    cxl_dip_kind kind;       /* the dip to find after the reactance zero */
    double ref_ohm;          /* analyzer reference for CXL_DIP_MIN_SWR */
} stub_eval;

/* beta l / (2 pi) - k: zero where the line is k wavelengths long. */
static double wavelength_gap(double f, void *p)
{
    stub_eval *e = p;
    double alpha, beta;
    cxl_status st = cxl_loss_model_gamma(e->model, f, e->flags, &alpha, &beta);
    if (st != CXL_OK) {
        if (e->st == CXL_OK) e->st = st;
        return GSL_NAN;
    }
    return beta * e->length_m / (2.0 * M_PI) - e->k;
}

/* Input impedance of the stub at f and |Z0| there; 0 on failure (kept in
 * e->st). */
static int stub_zin(double f, stub_eval *e, gsl_complex *zin, double *z0_abs)
{
    double alpha, beta, zr, zi;
    cxl_status st = model_line(e->model, f, e->flags, &alpha, &beta, &zr, &zi);
    if (st == CXL_OK) {
        gsl_complex e1 = gsl_complex_polar(exp(-alpha * e->length_m), -beta * e->length_m);
        st = input_impedance(gsl_complex_rect(zr, zi), gsl_complex_rect(e->gamma_l, 0.0),
                             e1, zin);
    }
    if (st != CXL_OK) {
        if (e->st == CXL_OK) e->st = st;
        return 0;
    }
    *z0_abs = hypot(zr, zi);
    return 1;
}

/* Input reactance of the stub at f, in units of |Z0|. */
static double stub_reactance(double f, void *p)
{
    gsl_complex zin;
    double z0;
    if (!stub_zin(f, p, &zin, &z0)) return GSL_NAN;
    return GSL_IMAG(zin) / z0;
}

/* What a dip of another kind minimises: |Z_in| / |Z0|, or |Gamma| of
 * Z_in against the analyzer's real reference impedance. */
static double stub_dip_value(double f, void *p)
{
    stub_eval *e = p;
    gsl_complex zin;
    double z0;
    if (!stub_zin(f, e, &zin, &z0)) return GSL_NAN;
    if (e->kind == CXL_DIP_MIN_Z) return gsl_complex_abs(zin) / z0;
    return gsl_complex_abs(gsl_complex_div(gsl_complex_add_real(zin, -e->ref_ohm),
                                           gsl_complex_add_real(zin, e->ref_ohm)));
}

/* Minimum of fn in [lo, hi] around guess (fn(guess) below both ends) by
 * Brent's method. */
/* When fn(guess) is not below both ends: the lowest of a few interior
 * samples into *guess and *fg (the dip sits off the reactance zero). */
static void lowest_sample(gsl_function *fn, double lo, double hi, double *guess, double *fg)
{
    double best = *fg;
    for (int i = 1; i < 32; i++) {
        double x = lo + (hi - lo) * i / 32.0, v = GSL_FN_EVAL(fn, x);
        if (isfinite(v) && v < best) { best = v; *guess = x; *fg = v; }
    }
}

/* Brent's iterations from a bracket of values; CXL_OK with *at. */
static cxl_status brent_iterate(gsl_function *fn, double guess, double fg, double lo,
                                double fl, double hi, double fh, double *at)
{
    gsl_min_fminimizer *m = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!m) return CXL_ENOMEM;
    cxl_status st = CXL_ENOCONV;
    if (gsl_min_fminimizer_set_with_values(m, fn, guess, fg, lo, fl, hi, fh) == GSL_SUCCESS) {
        for (int i = 0; i < 200; i++) {
            if (gsl_min_fminimizer_iterate(m) != GSL_SUCCESS) break;
            double a = gsl_min_fminimizer_x_lower(m), b = gsl_min_fminimizer_x_upper(m);
            if (gsl_min_test_interval(a, b, 0.0, 1e-7) == GSL_SUCCESS) {
                /* a minimum is flat: x only to about sqrt(eps) */
                *at = gsl_min_fminimizer_x_minimum(m);
                st = CXL_OK;
                break;
            }
        }
    }
    gsl_min_fminimizer_free(m);
    return st;
}

static cxl_status brent_min(gsl_function *fn, stub_eval *e, double guess, double lo,
                            double hi, double *at)
{
    double fg = GSL_FN_EVAL(fn, guess), fl = GSL_FN_EVAL(fn, lo), fh = GSL_FN_EVAL(fn, hi);
    if (e->st != CXL_OK) return e->st;
    if (!isfinite(fg) || !isfinite(fl) || !isfinite(fh)) return CXL_ENOCONV;
    if (!(fg < fl && fg < fh)) {
        lowest_sample(fn, lo, hi, &guess, &fg);
        if (e->st != CXL_OK) return e->st;
        if (!(fg < fl && fg < fh)) return CXL_ENOCONV; /* no interior minimum */
    }
    cxl_status st = brent_iterate(fn, guess, fg, lo, fl, hi, fh, at);
    if (st == CXL_OK && e->st != CXL_OK) st = e->st;
    return st;
}

/* Root of fn in [lo, hi] (signs already opposite) by Brent's method. */
static cxl_status brent_root(gsl_function *fn, double lo, double hi, double *root)
{
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!s) return CXL_ENOMEM;
    cxl_status st = CXL_ENOCONV;
    if (gsl_root_fsolver_set(s, fn, lo, hi) == GSL_SUCCESS) {
        for (int i = 0; i < 200; i++) {
            if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS) break;
            double a = gsl_root_fsolver_x_lower(s), b = gsl_root_fsolver_x_upper(s);
            if (gsl_root_test_interval(a, b, 0.0, 1e-13) == GSL_SUCCESS) {
                *root = gsl_root_fsolver_root(s);
                st = CXL_OK;
                break;
            }
        }
    }
    gsl_root_fsolver_free(s);
    return st;
}

/* [lo, hi] around guess where fn changes sign.  grow > 1 widens the
 * interval from half (a monotonic fn), grow < 1 narrows it (a sign change
 * expected close to the guess).  At most 40 steps. */
static cxl_status bracket(gsl_function *fn, stub_eval *e, double guess, double half,
                          double grow, double *lo, double *hi)
{
    for (int i = 0; i < 40; i++, half *= grow) {
        double a = guess - half, b = guess + half;
        if (!(a > 0.0)) a = guess * 0.5;
        double fa = GSL_FN_EVAL(fn, a), fb = GSL_FN_EVAL(fn, b);
        if (e->st != CXL_OK) return e->st;
        if (!isfinite(fa) || !isfinite(fb)) return CXL_ENOCONV;
        if ((fa < 0.0) != (fb < 0.0)) {
            *lo = a;
            *hi = b;
            return CXL_OK;
        }
    }
    return CXL_ENOCONV;
}

/* The first guess at the frequency where the line is k wavelengths: the
 * phase velocity at the top of the range, where it is nearly the
 * high-frequency value, then two fixed-point steps. */
static cxl_status wave_guess(const cxl_loss_model *model, unsigned flags, double k,
                             double length_m, double f_max, double *guess)
{
    *guess = f_max;
    for (int i = 0; i < 3; i++) {
        double vf;
        cxl_status st = cxl_loss_model_vf(model, *guess, flags | CXL_LOSS_EXTRAPOLATE, &vf);
        if (st != CXL_OK) return st;
        *guess = k * vf * CXL_C_M_PER_S / length_m;
        if (!isfinite(*guess) || !(*guess > 0.0)) return CXL_ERANGE;
    }
    return CXL_OK;
}

/* The root of fn in the interval bracket() finds around guess. */
static cxl_status bracketed_root(gsl_function *fn, stub_eval *e, double guess, double half,
                                 double grow, double *root)
{
    double lo, hi;
    cxl_status st = bracket(fn, e, guess, half, grow, &lo, &hi);
    if (st == CXL_OK) st = brent_root(fn, lo, hi, root);
    if (st == CXL_OK && e->st != CXL_OK) st = e->st;
    return st;
}

cxl_status cxl__transfer_stub_points(const cxl_loss_model *model, unsigned flags,
                                     cxl_stub_end end, int order, double length_m,
                                     cxl_dip_kind kind, double ref_ohm,
                                     double *wave_hz, double *dip_hz)
{
    double k, guess, root, f_min, f_max;
    if (!model || !cxl__finite_pos(length_m) ||
        (kind != CXL_DIP_ZERO_X && kind != CXL_DIP_MIN_Z && kind != CXL_DIP_MIN_SWR) ||
        !cxl__finite_pos(ref_ohm))
        return CXL_EINVAL;
    cxl_status st = cxl_stub_wavelengths(end, order, &k);
    if (st == CXL_OK) st = cxl_loss_model_range(model, &f_min, &f_max);
    if (st == CXL_OK) st = wave_guess(model, flags, k, length_m, f_max, &guess);
    if (st != CXL_OK) return st;
    stub_eval e = { model, flags, length_m, k, end == CXL_STUB_OPEN ? 1.0 : -1.0, CXL_OK,
                    kind, ref_ohm };
    /* where the line is exactly k wavelengths (beta l grows with f) */
    gsl_function gap = { wavelength_gap, &e };
    st = bracketed_root(&gap, &e, guess, 1e-3 * guess, 2.0, &guess);
    if (st != CXL_OK) return st;
    /* the input reactance crosses zero close to it: +-1/8 wavelength
     * (+-pi/4 of beta l, guess / (8 k) in frequency) holds no
     * anti-resonance */
    gsl_function react = { stub_reactance, &e };
    st = bracketed_root(&react, &e, guess, guess / (8.0 * k), 0.5, &root);
    if (st != CXL_OK) return st;
    if (kind != CXL_DIP_ZERO_X) {
        /* the minimum lies near the reactance zero: within 1/16
         * wavelength of it |Z_in| has grown to several times its value */
        gsl_function dip = { stub_dip_value, &e };
        double h = root / (16.0 * k);
        st = brent_min(&dip, &e, root, root - h, root + h, &root);
        if (st != CXL_OK) return st;
    }
    *wave_hz = guess;
    *dip_hz = root;
    return CXL_OK;
}

cxl_status cxl_transfer_stub_resonance(const cxl_loss_model *model, unsigned flags,
                                       cxl_stub_end end, int order, double length_m,
                                       double *resonance_hz)
{
    double wave, react;
    if (!resonance_hz) return CXL_EINVAL;
    cxl_status st = cxl__transfer_stub_points(model, flags, end, order, length_m,
                                              CXL_DIP_ZERO_X, 50.0, &wave, &react);
    if (st == CXL_OK) *resonance_hz = react;
    return st;
}

cxl_status cxl_transfer_stub_dip(const cxl_loss_model *model, unsigned flags,
                                 cxl_stub_end end, int order, double length_m,
                                 cxl_dip_kind kind, double ref_ohm, double *dip_hz,
                                 double *wave_hz)
{
    double wave, dip;
    if (!dip_hz) return CXL_EINVAL;
    cxl_status st = cxl__transfer_stub_points(model, flags, end, order, length_m, kind,
                                              ref_ohm, &wave, &dip);
    if (st != CXL_OK) return st;
    *dip_hz = dip;
    if (wave_hz) *wave_hz = wave;
    return CXL_OK;
}
