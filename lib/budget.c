/* budget.c - tolerance budget: how much phase error (and so how much cable
 * length mismatch) a wanted null depth or front-to-back ratio allows.
 * The inverse of the pattern results in array.c. */
#include <config.h>
#include <math.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_roots.h>
#include "coaxline.h"
#include "internal.h"

#define DEG (M_PI / 180.0)

cxl_status cxl_budget_phase_for_null(double depth_db, double imbalance_db,
                                     double *phase_error_deg)
{
    if (!phase_error_deg || !isfinite(depth_db) || !(depth_db < 0.0) ||
        depth_db < -CXL_DB_LIMIT || !isfinite(imbalance_db) ||
        fabs(imbalance_db) > 200.0)
        return CXL_EINVAL;
    double r = pow(10.0, depth_db / 20.0);   /* null amplitude / (1 + a) */
    double a = pow(10.0, -imbalance_db / 20.0);
    /* (1 - a)^2 + 4 a sin^2(d/2) = r^2 (1 + a)^2, solved for sin(d/2). */
    double s2 = (r * r * (1.0 + a) * (1.0 + a) - (1.0 - a) * (1.0 - a)) /
                (4.0 * a);
    if (s2 < 0.0)
        return CXL_ERANGE;   /* the imbalance alone misses depth_db */
    *phase_error_deg = 2.0 * asin(fmin(sqrt(s2), 1.0)) / DEG;
    return CXL_OK;
}

typedef struct {
    const cxl_duo *pair;
    double freq_hz, elevation_deg, ratio_db, sign;
    cxl_status status;   /* first failure inside the root finder */
} fb_params;

/* Smallest d in (0, 180] where g(d) turns from <= 0 to > 0 (g reports a
 * failure through *failed): scan in 0.25-degree steps, refine the bracket with
 * gsl_root_fsolver_brent; 180 when it never turns. */
static cxl_status first_rise(double (*g)(double, void *), void *params,
                             const cxl_status *failed, double *limit_deg)
{
    const double step = 0.25;
    const int n = (int)(180.0 / step);
    double lo = 0.0, g_lo = g(0.0, params);
    for (int i = 1; i <= n && !*failed; i++) {
        double hi = i * step, g_hi = g(hi, params);
        if (*failed)
            break;
        if (!(g_hi > 0.0)) {
            lo = hi;
            g_lo = g_hi;
            continue;
        }
        if (g_lo == 0.0) {
            *limit_deg = lo;
            return CXL_OK;
        }
        gsl_function fn = { g, params };
        gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
        if (!s)
            return CXL_ENOMEM;
        cxl_status st = CXL_ENOCONV;
        /* g(lo) < 0 < g(hi): a valid bracket for GSL */
        if (gsl_root_fsolver_set(s, &fn, lo, hi) == GSL_SUCCESS) {
            for (int it = 0; it < 200 && !*failed; it++) {
                if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS)
                    break;
                double xl = gsl_root_fsolver_x_lower(s);
                double xu = gsl_root_fsolver_x_upper(s);
                if (gsl_root_test_interval(xl, xu, 1e-12, 0.0) ==
                    GSL_SUCCESS) {
                    *limit_deg = gsl_root_fsolver_root(s);
                    st = CXL_OK;
                    break;
                }
            }
        }
        gsl_root_fsolver_free(s);
        return *failed ? *failed : st;
    }
    if (*failed)
        return *failed;
    *limit_deg = 180.0;
    return CXL_OK;
}

/* The wanted front-to-back ratio minus the ratio with an error of
 * sign * d_deg on element 1: positive once the ratio falls short. */
static double fb_shortfall(double d_deg, void *params)
{
    fb_params *fp = params;
    double fb;
    cxl_status st = cxl__array_front_to_back(fp->pair, fp->freq_hz,
                                             fp->elevation_deg,
                                             fp->sign * d_deg * DEG, &fb);
    if (st) {
        if (!fp->status)
            fp->status = st;
        return 0.0;
    }
    return fp->ratio_db - fb;
}

cxl_status cxl_budget_phase_for_front_to_back(const cxl_duo *pair,
                                              double ratio_db,
                                              double freq_hz,
                                              double elevation_deg,
                                              double *phase_error_deg)
{
    double fb0, limit[2];
    if (!pair || !phase_error_deg || !isfinite(ratio_db) ||
        fabs(ratio_db) >= CXL_DB_LIMIT)
        return CXL_EINVAL;
    cxl_status st = cxl_duo_front_to_back(pair, freq_hz, elevation_deg,
                                            &fb0);
    if (st)
        return st;
    if (fb0 < ratio_db)
        return CXL_ERANGE;
    for (int k = 0; k < 2; k++) {
        fb_params fp = { pair, freq_hz, elevation_deg, ratio_db,
                         k ? -1.0 : 1.0, CXL_OK };
        st = first_rise(fb_shortfall, &fp, &fp.status, &limit[k]);
        if (st)
            return st;
    }
    *phase_error_deg = fmin(limit[0], limit[1]);
    return CXL_OK;
}

/* Rear null (as cxl_duo_rear_null measures it) with element 1's fixed
 * phase offset set to -sign * d_deg (B lagging by sign * d_deg, the way
 * pattern applies --phase-error), minus the wanted depth: negative while
 * the null is deep enough, positive once it is not or once the error has
 * cancelled the forward response itself. */
typedef struct {
    cxl_duo *trial;   /* a copy of the caller's pair */
    double freq_hz, elevation_deg, depth_db, sign;
    cxl_status status;
} null_params;

static double null_excess(double d_deg, void *params)
{
    null_params *np = params;
    double az, depth;
    cxl_status st = cxl_duo_set_phase_offset(np->trial, 1,
                                                    -np->sign * d_deg);
    if (st == CXL_OK)
        st = cxl_duo_rear_null(np->trial, np->freq_hz, np->elevation_deg,
                                 &az, &depth);
    /* no forward response left at this error: nothing to null against */
    if (st == CXL_ERANGE)
        return 1.0;
    if (st) {
        if (!np->status)
            np->status = st;
        return 0.0;
    }
    return depth - np->depth_db;
}

cxl_status cxl_budget_phase_for_rear_null(const cxl_duo *pair,
                                          double depth_db,
                                          double freq_hz,
                                          double elevation_deg,
                                          double *phase_error_deg)
{
    double az, depth0, limit[2];
    if (!pair || !phase_error_deg || !isfinite(depth_db) ||
        !(depth_db < 0.0) || depth_db < -CXL_DB_LIMIT)
        return CXL_EINVAL;
    cxl_duo *trial = NULL;
    cxl_status st = cxl_duo_copy(pair, &trial);
    if (st)
        return st;
    st = cxl_duo_set_phase_offset(trial, 1, 0.0);
    if (st == CXL_OK)
        st = cxl_duo_rear_null(trial, freq_hz, elevation_deg, &az,
                                 &depth0);
    if (st == CXL_OK && depth0 > depth_db)
        st = CXL_ERANGE;   /* even the error-free pair misses the goal */
    for (int k = 0; k < 2 && st == CXL_OK; k++) {
        null_params np = { trial, freq_hz, elevation_deg, depth_db,
                           k ? -1.0 : 1.0, CXL_OK };
        st = first_rise(null_excess, &np, &np.status, &limit[k]);
    }
    cxl_duo_free(trial);
    if (st)
        return st;
    *phase_error_deg = fmin(limit[0], limit[1]);
    return CXL_OK;
}

cxl_status cxl_budget_length_for_phase(double phase_error_deg,
                                       double vf, double freq_hz,
                                       double *length_m)
{
    if (!length_m || !cxl__finite_nonneg(phase_error_deg))
        return CXL_EINVAL;
    return cxl_line_length_from_degrees(phase_error_deg, vf, freq_hz,
                                        length_m);
}
