/* pair.c - phase error of measured lines against a reference, and the
 * tolerance check of a set of lines meant to be equal.
 *
 * A line longer than its reference by dL delays the signal by dL/(VF c),
 * which at frequency f is
 *     phase_error_deg = 360 f (L - Lref) / (VF c)
 * (positive: the line lags).  The error grows in proportion to f, so a
 * band's worst case is its high edge.  Turned round, a tolerance of T
 * degrees at f allows a mismatch of T VF c / (360 f).
 *
 * Uncertainty.  Length and VF tolerances are taken as bounds (what a tape
 * or a data sheet promises), not standard deviations, and the uncertainty
 * is the exact worst case over that box:
 *     u = 360 f (|dL| + m tol_L) / ((VF - tol_VF) c) - |phase_error|
 * with m = 1 when only the measured line carries a length tolerance (the
 * reference is a design figure), m = 2 when both lines of a pair were
 * measured.  To first order this is
 *     u ~ 360 f m tol_L / (VF c) + |phase_error| tol_VF / VF.
 * A check passes with certainty only when |phase_error| + u <= T.
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include "coaxline.h"
#include "internal.h"

static double phase_deg(double delta_m, double vf, double freq_hz)
{
    return 360.0 * freq_hz * delta_m / (vf * CXL_C_M_PER_S);
}

/* Worst-case growth of |phase| over the tolerance box (see top). */
static double phase_uncertainty(double delta_m, double vf, double freq_hz,
                                double length_tol_m, int ends, double vf_tol)
{
    double worst = phase_deg(fabs(delta_m) + ends * length_tol_m, vf - vf_tol, freq_hz);
    return worst - fabs(phase_deg(delta_m, vf, freq_hz));
}

cxl_status cxl_pair_phase_error(double length_m, double reference_m, double vf,
                                double freq_hz, double *phase_error_deg)
{
    if (!phase_error_deg || !cxl__finite_pos(length_m) || !cxl__finite_pos(reference_m) ||
        !cxl__valid_vf(vf) || !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    return cxl__put_finite(phase_deg(length_m - reference_m, vf, freq_hz), phase_error_deg);
}

cxl_status cxl_pair_phase_error_ref_deg(double length_m, double reference_deg,
                                        double reference_freq_hz,
                                        double vf,
                                        double freq_hz, double *phase_error_deg)
{
    double reference_m;
    if (!phase_error_deg || !cxl__finite_pos(reference_deg))
        return CXL_EINVAL;
    cxl_status st = cxl_line_length_from_degrees(reference_deg, vf,
                                                 reference_freq_hz, &reference_m);
    if (st != CXL_OK) return st;
    /* a reference of a few subnormal degrees rounds to no length at all */
    if (!(reference_m > 0.0)) return CXL_ERANGE;
    return cxl_pair_phase_error(length_m, reference_m, vf, freq_hz, phase_error_deg);
}

cxl_status cxl_pair_max_mismatch(double tolerance_deg, double vf, double freq_hz,
                                 double *delta_m)
{
    if (!delta_m || !cxl__finite_pos(tolerance_deg) || !cxl__valid_vf(vf) ||
        !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    return cxl__put_finite(tolerance_deg * vf * CXL_C_M_PER_S / (360.0 * freq_hz), delta_m);
}

static int valid_tolerances(double length_tol_m, double vf, double vf_tol)
{
    return cxl__finite_nonneg(length_tol_m) && cxl__finite_nonneg(vf_tol) && vf_tol < vf;
}

cxl_status cxl_pair_phase_uncertainty(double length_m, double reference_m,
                                      double vf, double freq_hz,
                                      double length_tol_m, double vf_tol,
                                      double *uncertainty_deg)
{
    double err;
    if (!uncertainty_deg) return CXL_EINVAL;
    cxl_status st = cxl_pair_phase_error(length_m, reference_m, vf, freq_hz, &err);
    if (st != CXL_OK) return st;
    if (!valid_tolerances(length_tol_m, vf, vf_tol)) return CXL_EINVAL;
    return cxl__put_finite(phase_uncertainty(length_m - reference_m, vf, freq_hz,
                                             length_tol_m, 1, vf_tol),
                           uncertainty_deg);
}

cxl_status cxl_pair_verdict(double phase_error_deg, double uncertainty_deg,
                            double tolerance_deg, cxl_verdict *verdict)
{
    if (!verdict || !isfinite(phase_error_deg) || !cxl__finite_nonneg(uncertainty_deg) ||
        !cxl__finite_pos(tolerance_deg))
        return CXL_EINVAL;
    double err = fabs(phase_error_deg);
    if (err > tolerance_deg) *verdict = CXL_VERDICT_FAIL;
    else if (err + uncertainty_deg > tolerance_deg) *verdict = CXL_VERDICT_PASS_UNCERTAIN;
    else *verdict = CXL_VERDICT_PASS;
    return CXL_OK;
}

/* The shortest and longest of count >= 2 finite positive lengths; 0 when
 * one is not. */
static int length_bounds(const double *lengths_m, size_t count, double *lo_m, double *hi_m)
{
    double lo = lengths_m[0], hi = lengths_m[0];
    for (size_t i = 0; i < count; i++) {
        if (!cxl__finite_pos(lengths_m[i])) return 0;
        lo = fmin(lo, lengths_m[i]);
        hi = fmax(hi, lengths_m[i]);
    }
    *lo_m = lo;
    *hi_m = hi;
    return 1;
}

/* A line's VF, a frequency, a tolerance and the tolerances of length and
 * VF that a check of lines can use. */
static int valid_check(double vf, double freq_hz, double tolerance_deg, double length_tol_m,
                       double vf_tol)
{
    return cxl__valid_vf(vf) && cxl__finite_pos(freq_hz) && cxl__finite_pos(tolerance_deg) &&
           valid_tolerances(length_tol_m, vf, vf_tol);
}

cxl_status cxl_pair_check(const double *lengths_m, size_t count, double tolerance_deg,
                          double vf, double freq_hz,
                          double length_tol_m, double vf_tol,
                          double *delta_m, double *phase_error_deg,
                          double *uncertainty_deg, cxl_verdict *verdict)
{
    double lo, hi;
    if (!lengths_m || count < 2 || !delta_m || !phase_error_deg || !uncertainty_deg ||
        !verdict || !valid_check(vf, freq_hz, tolerance_deg, length_tol_m, vf_tol) ||
        !length_bounds(lengths_m, count, &lo, &hi))
        return CXL_EINVAL;
    /* the worst pair is the longest against the shortest */
    double delta = hi - lo;
    double err = phase_deg(delta, vf, freq_hz);
    double u = phase_uncertainty(delta, vf, freq_hz, length_tol_m, 2, vf_tol);
    if (!isfinite(delta) || !isfinite(err) || !isfinite(u))
        return CXL_ERANGE; /* huge lengths or tolerances overflow */
    cxl_status st = cxl_pair_verdict(err, u, tolerance_deg, verdict);
    if (st != CXL_OK) return st;
    *delta_m = delta;
    *phase_error_deg = err;
    *uncertainty_deg = u;
    return CXL_OK;
}

/* ---- lines into a load ----------------------------------------------
 *
 * A phasing line is judged by the phase of the voltage it delivers into
 * what it feeds (a combiner input, a preamplifier), which departs from its
 * electrical length whenever the load does not match the line:
 *     V_load / V_in = (1 + G) / (e^{gamma l} + G e^{-gamma l})
 * (Pozar, Microwave Engineering, 4th ed., sec. 2.3; cxl_transfer_*).  The
 * error of a set of lines is the largest delay into the load minus the
 * smallest; its uncertainty the worst spread over the corners of the
 * tolerance box, each length within length_tol_m and the VF within vf_tol
 * (taken as the same electrical length on a line scaled by VF / VF':
 * exact for the lossless form, Z0 and loss held for the physical one). */

struct cxl_pair_load {
    const cxl_loss_model *model; /* borrowed; NULL: the lossless form */
    double z0_ohm;               /* the lossless form */
    double re_ohm, im_ohm;       /* the load */
};

static int valid_load(double re_ohm, double im_ohm)
{
    return cxl__finite_nonneg(re_ohm) && isfinite(im_ohm) && (re_ohm > 0.0 || im_ohm != 0.0);
}

static cxl_status load_alloc(const cxl_loss_model *model, double z0_ohm, double re_ohm,
                             double im_ohm, cxl_pair_load **load)
{
    cxl_pair_load *l = malloc(sizeof *l);
    if (!l) return CXL_ENOMEM;
    l->model = model;
    l->z0_ohm = z0_ohm;
    l->re_ohm = re_ohm;
    l->im_ohm = im_ohm;
    *load = l;
    return CXL_OK;
}

cxl_status cxl_pair_load_new_lossless(double z0_ohm, double load_re_ohm, double load_im_ohm,
                                      cxl_pair_load **load)
{
    if (!load || !cxl__finite_pos(z0_ohm) || !valid_load(load_re_ohm, load_im_ohm))
        return CXL_EINVAL;
    return load_alloc(NULL, z0_ohm, load_re_ohm, load_im_ohm, load);
}

cxl_status cxl_pair_load_new_model(const cxl_loss_model *model, double load_re_ohm,
                                   double load_im_ohm, cxl_pair_load **load)
{
    if (!load || !model || !valid_load(load_re_ohm, load_im_ohm)) return CXL_EINVAL;
    return load_alloc(model, 0.0, load_re_ohm, load_im_ohm, load);
}

void cxl_pair_load_free(cxl_pair_load *load)
{
    free(load);
}

cxl_status cxl_pair_load_transfer(const cxl_pair_load *load, double length_m, double vf,
                                  double freq_hz, double *transfer_db, double *delay_deg,
                                  double *electrical_deg)
{
    double db, delay, el;
    if (!load || !transfer_db || !delay_deg || !cxl__valid_vf(vf)) return CXL_EINVAL;
    cxl_status st = load->model
        ? cxl_transfer_model(load->model, length_m, freq_hz, 0, load->re_ohm, load->im_ohm,
                             &db, &delay, &el)
        : cxl_transfer_lossless(length_m, load->z0_ohm, vf, freq_hz, load->re_ohm,
                                load->im_ohm, &db, &delay, &el);
    if (st != CXL_OK) return st;
    if (!isfinite(db) || !isfinite(delay) || !isfinite(el)) return CXL_ERANGE;
    *transfer_db = db;
    *delay_deg = delay;
    if (electrical_deg) *electrical_deg = el;
    return CXL_OK;
}

/* The delay into the load of each corner of the tolerance box: the worst
 * spread between the longest and the shortest line. */
static cxl_status load_worst_spread(const cxl_pair_load *load, double lo_m, double hi_m,
                                    double vf, double freq_hz, double length_tol_m,
                                    double vf_tol, double *worst_deg)
{
    double db, da, dl;
    *worst_deg = 0.0;
    for (int v = -1; v <= 1; v += 2) {
        double k = vf / (vf + v * vf_tol);
        for (int sign = -1; sign <= 1; sign += 2) {
            double a = (hi_m + sign * length_tol_m) * k;
            double b = fmax(lo_m - sign * length_tol_m, 0.0) * k;
            if (!isfinite(a) || !isfinite(b)) return CXL_ERANGE; /* huge tolerances */
            cxl_status st = cxl_pair_load_transfer(load, fmax(a, 0.0), vf, freq_hz, &db, &da, NULL);
            if (st == CXL_OK) st = cxl_pair_load_transfer(load, b, vf, freq_hz, &db, &dl, NULL);
            if (st != CXL_OK) return st;
            *worst_deg = fmax(*worst_deg, fabs(da - dl));
        }
    }
    return CXL_OK;
}

/* Delays and gains of every line into the load: the spread of the delays
 * (the error), of the gains, and the electrical length of the longest line
 * minus the shortest's (lo_m, hi_m). */
static cxl_status load_spreads(const cxl_pair_load *load, const double *lengths_m, size_t count,
                               double vf, double freq_hz, double lo_m, double hi_m,
                               double *err_deg, double *elec_deg, double *imbalance_db)
{
    double dmin = INFINITY, dmax = -INFINITY, gmin = INFINITY, gmax = -INFINITY;
    double elo = 0.0, ehi = 0.0;
    for (size_t i = 0; i < count; i++) {
        double g, d, e;
        cxl_status st = cxl_pair_load_transfer(load, lengths_m[i], vf, freq_hz, &g, &d, &e);
        if (st != CXL_OK) return st;
        dmin = fmin(dmin, d);
        dmax = fmax(dmax, d);
        gmin = fmin(gmin, g);
        gmax = fmax(gmax, g);
        if (lengths_m[i] == lo_m) elo = e;
        if (lengths_m[i] == hi_m) ehi = e;
    }
    *err_deg = dmax - dmin;
    *elec_deg = ehi - elo;
    *imbalance_db = gmax - gmin;
    return CXL_OK;
}

static int all_finite4(double a, double b, double c, double d)
{
    return isfinite(a) && isfinite(b) && isfinite(c) && isfinite(d);
}

/* The uncertainty of the error err: the worst spread over the corners of
 * the tolerances less err (0 without tolerances). */
static cxl_status load_uncertainty(const cxl_pair_load *load, double lo, double hi, double vf,
                                   double freq_hz, double length_tol_m, double vf_tol,
                                   double err, double *unc)
{
    if (!(length_tol_m > 0.0 || vf_tol > 0.0)) return CXL_OK;
    double worst = 0.0;
    cxl_status st = load_worst_spread(load, lo, hi, vf, freq_hz, length_tol_m, vf_tol, &worst);
    *unc = fmax(worst - err, 0.0);
    return st;
}

cxl_status cxl_pair_load_check(const cxl_pair_load *load, const double *lengths_m,
                               size_t count, double tolerance_deg, double vf,
                               double freq_hz, double length_tol_m, double vf_tol,
                               double *phase_error_deg, double *uncertainty_deg,
                               double *electrical_error_deg, double *imbalance_db,
                               cxl_verdict *verdict)
{
    double lo, hi, err, elec, imb, unc = 0.0;
    /* every result is wanted: the verdict means little without them */
    if (!phase_error_deg || !uncertainty_deg || !electrical_error_deg || !imbalance_db)
        return CXL_EINVAL;
    if (!load || !lengths_m || count < 2 || !verdict ||
        !valid_check(vf, freq_hz, tolerance_deg, length_tol_m, vf_tol) ||
        !length_bounds(lengths_m, count, &lo, &hi))
        return CXL_EINVAL;
    cxl_status st = load_spreads(load, lengths_m, count, vf, freq_hz, lo, hi, &err, &elec, &imb);
    if (st == CXL_OK)
        st = load_uncertainty(load, lo, hi, vf, freq_hz, length_tol_m, vf_tol, err, &unc);
    if (st != CXL_OK) return st;
    if (!all_finite4(err, unc, elec, imb)) return CXL_ERANGE;
    st = cxl_pair_verdict(err, unc, tolerance_deg, verdict);
    if (st != CXL_OK) return st;
    *phase_error_deg = err;
    *uncertainty_deg = unc;
    *electrical_error_deg = elec;
    *imbalance_db = imb;
    return CXL_OK;
}

/* The delay grows with length, by exactly 180 degrees per half wavelength
 * on a lossless line, so the answer lies within ceil(tol / 180) + 1 half
 * wavelengths of the shortest line: bisection on that bracket. */
cxl_status cxl_pair_load_max_mismatch(const cxl_pair_load *load, double tolerance_deg,
                                      double length_m, double vf, double freq_hz,
                                      double *delta_m)
{
    double db, d0, e0, d, e;
    if (!load || !delta_m || !cxl__finite_pos(tolerance_deg) || !cxl__finite_pos(length_m))
        return CXL_EINVAL;
    cxl_status st = cxl_pair_load_transfer(load, length_m, vf, freq_hz, &db, &d0, &e0);
    if (st != CXL_OK) return st;
    if (!(e0 > 0.0)) return CXL_ENOCONV;
    double lo = 0.0, hi = length_m * 180.0 / e0 * (ceil(tolerance_deg / 180.0) + 1.0);
    if (!isfinite(length_m + hi)) return CXL_ERANGE;
    st = cxl_pair_load_transfer(load, length_m + hi, vf, freq_hz, &db, &d, &e);
    if (st != CXL_OK) return st;
    if (!(d - d0 >= tolerance_deg)) return CXL_ENOCONV;
    for (int i = 0; i < 200 && hi - lo > 1e-12 * (length_m + hi); i++) {
        double mid = 0.5 * (lo + hi);
        st = cxl_pair_load_transfer(load, length_m + mid, vf, freq_hz, &db, &d, &e);
        if (st != CXL_OK) return st;
        if (d - d0 >= tolerance_deg) hi = mid;
        else lo = mid;
    }
    return cxl__put_finite(0.5 * (lo + hi), delta_m);
}
