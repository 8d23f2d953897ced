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

cxl_status cxl_pair_phase_error_ref_deg(double length_m, double vf,
                                        double reference_deg,
                                        double reference_freq_hz,
                                        double freq_hz, double *phase_error_deg)
{
    double reference_m;
    if (!phase_error_deg || !cxl__finite_pos(reference_deg))
        return CXL_EINVAL;
    cxl_status st = cxl_line_length_from_degrees(reference_deg, reference_freq_hz,
                                                 vf, &reference_m);
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

cxl_status cxl_pair_check(const double *lengths_m, size_t count, double vf,
                          double freq_hz, double tolerance_deg,
                          double length_tol_m, double vf_tol,
                          double *delta_m, double *phase_error_deg,
                          double *uncertainty_deg, cxl_verdict *verdict)
{
    if (!lengths_m || count < 2 || !delta_m || !phase_error_deg || !uncertainty_deg ||
        !verdict || !cxl__valid_vf(vf) || !cxl__finite_pos(freq_hz) ||
        !cxl__finite_pos(tolerance_deg) || !valid_tolerances(length_tol_m, vf, vf_tol))
        return CXL_EINVAL;
    double lo = lengths_m[0], hi = lengths_m[0];
    for (size_t i = 0; i < count; i++) {
        if (!cxl__finite_pos(lengths_m[i])) return CXL_EINVAL;
        if (lengths_m[i] < lo) lo = lengths_m[i];
        if (lengths_m[i] > hi) hi = lengths_m[i];
    }
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
