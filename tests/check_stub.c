/* check_stub.c - velocity factor from stub resonances.
 *
 * Physics source: D. M. Pozar, Microwave Engineering, 4th ed., Wiley 2012,
 * sec. 2.3 (terminated lossless line): input impedance of a shorted line
 * Z_in = j Z0 tan(beta l), of an open line Z_in = -j Z0 cot(beta l), with
 * beta = 2 pi f / (VF c).  The series resonances below are found as the
 * zeros of those reactances with a GSL root finder, not from the closed
 * form the library uses.
 */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_roots.h>
#include "coaxline.h"

#define C0 299792458.0 /* m/s, exact: SI definition of the metre */

/* ---- resonances from Pozar's Z_in ------------------------------------ */

typedef struct line_params {
    double length_m, vf;
    int shorted;
} line_params;

/* Normalised input reactance X/Z0 of the line at f (Pozar sec. 2.3). */
static double reactance(double f, void *p)
{
    const line_params *lp = p;
    double bl = 2.0 * M_PI * f * lp->length_m / (lp->vf * C0);
    return lp->shorted ? tan(bl) : -1.0 / tan(bl);
}

/* The n-th zero of the reactance, bracketed between the poles around it:
 * open: zeros of cot between beta l = (n-1) pi and n pi; shorted: zeros of
 * tan between (n - 1/2) pi and (n + 1/2) pi. */
static double pozar_resonance(double length_m, double vf, int shorted, int n)
{
    line_params lp = { length_m, vf, shorted };
    double bl_lo = shorted ? (n - 0.5) * M_PI : (n - 1.0) * M_PI;
    double bl_hi = bl_lo + M_PI;
    double to_f = vf * C0 / (2.0 * M_PI * length_m);
    double eps = 1e-6;
    gsl_function fn = { reactance, &lp };
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    ck_assert_ptr_nonnull(s);
    ck_assert_int_eq(gsl_root_fsolver_set(s, &fn, (bl_lo + eps) * to_f, (bl_hi - eps) * to_f),
                     GSL_SUCCESS);
    double root = 0.0;
    for (int it = 0; it < 200; it++) {
        ck_assert_int_eq(gsl_root_fsolver_iterate(s), GSL_SUCCESS);
        root = gsl_root_fsolver_root(s);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s),
                                   0.0, 1e-14) == GSL_SUCCESS)
            break;
    }
    gsl_root_fsolver_free(s);
    return root;
}

START_TEST(test_pozar_resonances)
{
    /* Pozar sec. 2.3: zeros of -j Z0 cot(beta l) at odd quarter waves, of
     * j Z0 tan(beta l) at whole half waves; the library's closed form and
     * its inverse must agree with the numerical zeros. */
    const double vfs[] = { 0.66, 0.82 }; /* solid and foam PE, typical values */
    for (size_t v = 0; v < 2; v++) {
        for (int shorted = 0; shorted <= 1; shorted++) {
            cxl_stub_end end = shorted ? CXL_STUB_SHORT : CXL_STUB_OPEN;
            for (int n = 1; n <= 5; n++) {
                double f_root = pozar_resonance(10.0, vfs[v], shorted, n);
                double f_lib, vf_back, k;
                ck_assert_int_eq(cxl_stub_resonance_freq(end, n, 10.0, vfs[v], 0.0, 0.0, &f_lib),
                                 CXL_OK);
                ck_assert_double_eq_tol(f_lib, f_root, 1e-8 * f_root);
                ck_assert_int_eq(cxl_stub_vf_from_resonance(end, n, 10.0, f_root, 0.0, 0.0,
                                                            &vf_back), CXL_OK);
                ck_assert_double_eq_tol(vf_back, vfs[v], 1e-8);
                /* and the wavelengths at that zero */
                ck_assert_int_eq(cxl_stub_wavelengths(end, n, &k), CXL_OK);
                ck_assert_double_eq_tol(k, 10.0 * f_root / (vfs[v] * C0), 1e-8);
            }
        }
    }
}
END_TEST

/* ---- single readings ----------------------------------------------- */

START_TEST(test_quarter_wave_open)
{
    /* 10 m open, first resonance 5 MHz: VF = 4 L f / c = 0.667128
     * (common practice; the quarter-wave condition of Pozar sec. 2.3) */
    double vf;
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10.0, 5e6, 0.0, 0.0, &vf),
                     CXL_OK);
    ck_assert_double_eq_tol(vf, 0.667128, 5e-7);
    /* 10 m shorted, first resonance 10 MHz: half wave, VF = 2 L f / c
     * = 0.667128 (Pozar sec. 2.3, tan(beta l) = 0 at beta l = pi) */
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_SHORT, 1, 10.0, 10e6, 0.0, 0.0, &vf),
                     CXL_OK);
    ck_assert_double_eq_tol(vf, 0.667128, 5e-7);
}
END_TEST

/* Worked by hand (invented bench scenario):
 *   15.000 m of cable, far end open, analyzer dip at 3.150 MHz (1st order),
 *   fixture 0.100 m of adapter line with VF 0.80.
 *   quarter wave in free space: c / (4 f) = 299792458 / 12.6e6 = 23.793052 m
 *   fixture, free-space equivalent:  0.100 / 0.80              =  0.125000 m
 *   cable electrical length:         23.793052 - 0.125000      = 23.668052 m
 *   VF = 15.000 / 23.668052                                    =  0.633766
 * Uncertainty with a 10 mm tape and a 1 kHz frequency step:
 *   from length:    dVF = VF dL / L = 0.633766 * 0.010 / 15     = 0.000423
 *   from frequency: VF = L / (k c / f - Lf),  dVF/df = VF^2 (k c/f) / (L f)
 *                   = 0.633766^2 * 23.793052 / (15 * 3.15e6) * 1e3 = 0.000202
 *   total (root sum of squares)                                 = 0.000468 */
START_TEST(test_fixture_by_hand)
{
    double vf;
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 15.0, 3.15e6, 0.1, 0.8, &vf),
                     CXL_OK);
    ck_assert_double_eq_tol(vf, 0.633766, 5e-7); /* hand working above */

    cxl_stub *s;
    cxl_stub_result *r;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_fixture(s, 0.1, 0.8), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_tolerances(s, 0.010, 1e3), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 15.0, 3.15e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    double err, e_fit, e_len, e_freq;
    ck_assert_int_eq(cxl_stub_result_vf(r, &vf, &err), CXL_OK);
    ck_assert_double_eq_tol(vf, 0.633766, 5e-7);          /* hand working above */
    ck_assert_int_eq(cxl_stub_result_vf_budget(r, &e_fit, &e_len, &e_freq), CXL_OK);
    ck_assert_double_eq(e_fit, 0.0);                      /* one reading: no scatter */
    ck_assert_double_eq_tol(e_len, 0.000423, 5e-7);       /* hand working above */
    ck_assert_double_eq_tol(e_freq, 0.000202, 5e-7);      /* hand working above */
    ck_assert_double_eq_tol(err, 0.000468, 5e-7);         /* hand working above */
    unsigned flags;
    ck_assert_int_eq(cxl_stub_result_flags(r, &flags), CXL_OK);
    ck_assert_uint_eq(flags, 0);
    double x;
    ck_assert_int_eq(cxl_stub_result_fixture(r, &x, NULL, NULL), CXL_ENOTFOUND);
    cxl_stub_result_free(r);
    cxl_stub_free(s);
}
END_TEST

/* ---- several readings ---------------------------------------------- */

static cxl_stub_result *fit_readings(cxl_stub_end end, double length_m,
                                     const double *f, const int *orders, size_t n)
{
    cxl_stub *s;
    cxl_stub_result *r = NULL;
    ck_assert_int_eq(cxl_stub_new(end, &s), CXL_OK);
    for (size_t i = 0; i < n; i++)
        ck_assert_int_eq(cxl_stub_add_reading(s, length_m, f[i], orders ? orders[i] : 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    cxl_stub_free(s);
    return r;
}

START_TEST(test_three_orders)
{
    /* 10 m open at 5, 15, 25 MHz = 1st, 2nd, 3rd resonance: odd quarter
     * waves 1/4, 3/4, 5/4 (Pozar sec. 2.3), each VF = 0.667128 as above */
    const double f[] = { 5e6, 15e6, 25e6 };
    const int orders[] = { 1, 2, 3 };
    for (int given = 0; given <= 1; given++) {
        cxl_stub_result *r = fit_readings(CXL_STUB_OPEN, 10.0, f, given ? orders : NULL, 3);
        double vf, e_fit;
        ck_assert_int_eq(cxl_stub_result_vf(r, &vf, NULL), CXL_OK);
        ck_assert_double_eq_tol(vf, 0.667128, 5e-7);
        ck_assert_int_eq(cxl_stub_result_vf_budget(r, &e_fit, NULL, NULL), CXL_OK);
        ck_assert_double_le(e_fit, 1e-12); /* exact data: no scatter */
        ck_assert_uint_eq(cxl_stub_result_count(r), 3);
        for (size_t i = 0; i < 3; i++) {
            double fi, vfi, res_hz, res_m;
            int n;
            ck_assert_int_eq(cxl_stub_result_reading(r, i, NULL, &fi, &n, &vfi, &res_hz,
                                                     &res_m), CXL_OK);
            ck_assert_int_eq(n, orders[i]);
            ck_assert_double_eq_tol(vfi, 0.667128, 5e-7);
            ck_assert_double_le(fabs(res_hz), 1e-6);
            ck_assert_double_le(fabs(res_m), 1e-12);
        }
        unsigned flags;
        ck_assert_int_eq(cxl_stub_result_flags(r, &flags), CXL_OK);
        ck_assert_uint_eq(flags, given ? 0u : CXL_STUB_FLAG_ORDERS_ASSUMED);
        cxl_stub_result_free(r);
    }
}
END_TEST

START_TEST(test_two_lengths_fixture)
{
    /* Invented scenario: cable VF 0.80, a known fixture 0.100 m at VF 0.50
     * (0.200 m free space) and an unknown extra 0.300 m free space.  The
     * cable is measured at 12.000 m, trimmed to 9.000 m and measured again;
     * frequencies from eq. (1) of stub.c, k c / f = L/VF + 0.2 + 0.3, i.e.
     * Pozar sec. 2.3's quarter-wave condition on the whole path.  The fit
     * must give back VF and the extra length (model round trip; common
     * practice, no source). */
    const double lengths[] = { 12.0, 9.0 };
    cxl_stub *s;
    cxl_stub_result *r;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_fixture(s, 0.1, 0.5), CXL_OK);
    for (int j = 0; j < 2; j++)
        for (int n = 1; n <= 2; n++)
            ck_assert_int_eq(cxl_stub_add_reading(s, lengths[j],
                             (2 * n - 1) / 4.0 * C0 / (lengths[j] / 0.8 + 0.5), n), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    double vf, x, x_err, x_cable;
    ck_assert_int_eq(cxl_stub_result_vf(r, &vf, NULL), CXL_OK);
    ck_assert_double_eq_tol(vf, 0.8, 1e-9);
    ck_assert_int_eq(cxl_stub_result_fixture(r, &x, &x_err, &x_cable), CXL_OK);
    ck_assert_double_eq_tol(x, 0.3, 1e-9);
    ck_assert_double_eq_tol(x_cable, 0.3 * 0.8, 1e-9); /* as cable: x VF */
    ck_assert_double_le(x_err, 1e-9);
    unsigned flags;
    ck_assert_int_eq(cxl_stub_result_flags(r, &flags), CXL_OK);
    ck_assert_uint_eq(flags, CXL_STUB_FLAG_FIXTURE_FITTED);
    cxl_stub_result_free(r);
    cxl_stub_free(s);

    /* ignoring the extra length on one length biases VF low: with only the
     * 12 m readings, VF = 12 / (12/0.8 + 0.3) = 0.784314 (hand arithmetic) */
    cxl_stub *one;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &one), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_fixture(one, 0.1, 0.5), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(one, 12.0, 0.25 * C0 / (15.0 + 0.5), 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(one, &r), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_vf(r, &vf, NULL), CXL_OK);
    ck_assert_double_eq_tol(vf, 0.784314, 5e-7);
    cxl_stub_result_free(r);
    cxl_stub_free(one);
}
END_TEST

START_TEST(test_inconsistent_is_a_warning)
{
    /* 5, 15, 27 MHz are not 1 : 3 : 5 (27 is 8 % off 25): the fit still
     * answers, with the inconsistency flagged (common practice, no source) */
    const double f[] = { 5e6, 15e6, 27e6 };
    const int orders[] = { 1, 2, 3 };
    cxl_stub_result *r = fit_readings(CXL_STUB_OPEN, 10.0, f, orders, 3);
    unsigned flags;
    double e_fit;
    ck_assert_int_eq(cxl_stub_result_flags(r, &flags), CXL_OK);
    ck_assert(flags & CXL_STUB_FLAG_INCONSISTENT);
    ck_assert_int_eq(cxl_stub_result_vf_budget(r, &e_fit, NULL, NULL), CXL_OK);
    ck_assert_double_gt(e_fit, 0.0); /* the scatter shows in the fit error */
    cxl_stub_result_free(r);

    /* numbered consecutively, 15 and 25 MHz on 10 m would imply VF 2.0 for
     * the first: flagged, not failed (the order-2 reading of 15 MHz is
     * plausible) */
    const double g[] = { 15e6, 25e6 };
    r = fit_readings(CXL_STUB_OPEN, 10.0, g, NULL, 2);
    ck_assert_int_eq(cxl_stub_result_flags(r, &flags), CXL_OK);
    ck_assert(flags & CXL_STUB_FLAG_VF_RANGE);
    ck_assert(flags & CXL_STUB_FLAG_INCONSISTENT);
    cxl_stub_result_free(r);
}
END_TEST

START_TEST(test_implausible_is_range_error)
{
    cxl_stub *s;
    cxl_stub_result *r = NULL;
    /* Shorted 10 m: even at VF 0.5 the first half wave is at
     * 0.5 c / (2 * 10 m) = 7.4948 MHz (Pozar sec. 2.3, tan(beta l) = 0 at
     * beta l = pi), so a dip at 5 MHz fits no order. */
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_SHORT, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 5e6, 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_ERANGE);
    ck_assert_ptr_null(r);
    int order = -1;
    ck_assert_int_eq(cxl_stub_infer_orders(s, &order, 1), CXL_ERANGE);
    ck_assert_int_eq(order, -1);
    /* a wider plausible range lets it through (VF 0.333564 at order 1) */
    ck_assert_int_eq(cxl_stub_set_vf_range(s, 0.3, 1.0), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    cxl_stub_result_free(r);
    cxl_stub_free(s);

    /* open 10 m, 15 MHz declared 1st: VF = 2.0, impossible for that order */
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_ERANGE);
    cxl_stub_free(s);
    double vf = -1.0;
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10.0, 15e6, 0.0, 0.0, &vf),
                     CXL_ERANGE);
    /* a fixture longer than the whole quarter wave */
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10.0, 5e6, 20.0, 1.0, &vf),
                     CXL_ERANGE);
    ck_assert_double_eq(vf, -1.0);
}
END_TEST

START_TEST(test_infer_orders)
{
    /* open 10 m, VF 0.667128: 15 and 25 MHz are the 3/4- and 5/4-wave
     * resonances (Pozar sec. 2.3) */
    cxl_stub *s;
    int orders[3];
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 25e6, 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_infer_orders(s, orders, 2), CXL_OK);
    ck_assert_int_eq(orders[0], 2);
    ck_assert_int_eq(orders[1], 3);
    /* the fit with best-fit numbering then agrees with the single reading */
    cxl_stub_result *r;
    double vf;
    ck_assert_int_eq(cxl_stub_set_orders(s, CXL_STUB_ORDERS_BEST_FIT), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_vf(r, &vf, NULL), CXL_OK);
    ck_assert_double_eq_tol(vf, 0.667128, 5e-7); /* 4 L f / c as above */
    cxl_stub_result_free(r);
    cxl_stub_free(s);

    /* shorted 10 m with VF 0.66: the 2nd, 3rd and 5th half-wave dips
     * (n VF c / 2L), read 0.3 % high as a coarse analyzer might */
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_SHORT, &s), CXL_OK);
    const int truth[] = { 2, 3, 5 };
    for (int i = 0; i < 3; i++)
        ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 1.003 * truth[i] * 0.66 * C0 / 20.0, 0),
                         CXL_OK);
    ck_assert_int_eq(cxl_stub_infer_orders(s, orders, 3), CXL_OK);
    for (int i = 0; i < 3; i++) ck_assert_int_eq(orders[i], truth[i]);
    ck_assert_int_eq(cxl_stub_infer_orders(s, orders, 2), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_infer_orders(s, NULL, 3), CXL_EINVAL);
    cxl_stub_free(s);
}
END_TEST

/* VF error from a 1 kHz frequency step for one reading on 10 m, open. */
static double freq_error_one_reading(double freq_hz, int order)
{
    cxl_stub *s;
    cxl_stub_result *r;
    double e;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_tolerances(s, 0.0, 1e3), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, freq_hz, order), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_vf_budget(r, NULL, NULL, &e), CXL_OK);
    cxl_stub_result_free(r);
    cxl_stub_free(s);
    return e;
}

START_TEST(test_higher_orders_weigh_more)
{
    /* A frequency step df moves an order-n reading's length by y df / f,
     * so the 5/4-wave dip at 25 MHz is five times sharper in length than
     * the 1/4-wave dip at 5 MHz (common practice: higher-order resonances
     * resolve length more finely).  The first dip is read 0.2 % high. */
    cxl_stub *s;
    cxl_stub_result *r;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_tolerances(s, 0.0, 10e3), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 5.01e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 25e6, 3), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    double vf, vf1, vf3;
    ck_assert_int_eq(cxl_stub_result_vf(r, &vf, NULL), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_reading(r, 0, NULL, NULL, NULL, &vf1, NULL, NULL), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_reading(r, 1, NULL, NULL, NULL, &vf3, NULL, NULL), CXL_OK);
    /* weights (y df / f)^-2 are in the ratio 25 : 1 */
    ck_assert_double_lt(fabs(vf - vf3), fabs(vf - vf1) / 10.0);
    cxl_stub_result_free(r);
    cxl_stub_free(s);

    /* one reading: dVF / VF = df / f, so the 3rd order at 25 MHz has a
     * fifth of the 1st order's relative error at 5 MHz (same df) */
    double e1 = freq_error_one_reading(5e6, 1);
    double e3 = freq_error_one_reading(25e6, 3);
    /* VF = 4 L f / c is linear in f, so dVF = VF df / f exactly:
     * 0.667128 * 1e3 / 5e6 = 1.334e-4 (hand arithmetic) */
    ck_assert_double_eq_tol(e1, 1.334e-4, 1e-7);
    ck_assert_double_eq_tol(e3 / e1, 0.2, 1e-3);
}
END_TEST

START_TEST(test_reading_order_rules)
{
    cxl_stub *s;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 2), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 5e6, 1), CXL_EINVAL);   /* descending */
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 3), CXL_EINVAL);  /* repeated */
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 25e6, 2), CXL_EINVAL);  /* order repeated */
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 25e6, 0), CXL_EINVAL);  /* mixed */
    ck_assert_int_eq(cxl_stub_add_reading(s, 9.0, 5e6, 1), CXL_OK);        /* other length */
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 25e6, 3), CXL_OK);
    ck_assert_uint_eq(cxl_stub_count(s), 3);
    cxl_stub_free(s);
}
END_TEST

START_TEST(test_bad_arguments)
{
    double v = 42.0;
    cxl_stub *s;
    ck_assert_int_eq(cxl_stub_wavelengths(CXL_STUB_OPEN, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_wavelengths(CXL_STUB_OPEN, CXL_STUB_MAX_ORDER + 1, &v),
                     CXL_ERANGE);
    ck_assert_int_eq(cxl_stub_wavelengths((cxl_stub_end)7, 1, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_wavelengths(CXL_STUB_OPEN, 1, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, NAN, 5e6, 0, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10, INFINITY, 0, 0, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, -10, 5e6, 0, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10, 5e6, 0.1, 0, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10, 5e6, 0.1, 1.5, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10, 5e6, -0.1, 0.5, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_vf_from_resonance(CXL_STUB_OPEN, 1, 10, 5e6, 0, 0, NULL),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_SHORT, 1, 10, 0.0, 0, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_SHORT, 1, 10, NAN, 0, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_SHORT, -1, 10, 0.66, 0, 0, &v), CXL_EINVAL);
    ck_assert_double_eq(v, 42.0);

    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_new((cxl_stub_end)-1, &s), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_fixture(NULL, 0, 0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_fixture(s, NAN, 0.5), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_tolerances(s, -1e-3, 0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_tolerances(s, 0, NAN), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_vf_range(s, 0.9, 0.5), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_vf_range(s, 0.5, 1.2), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_vf_range(s, 0.0, 1.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_consistency(s, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_consistency(s, 0.7), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_set_orders(s, (cxl_stub_orders)5), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(NULL, 10, 5e6, 1), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 0.0, 5e6, 1), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10, -5e6, 1), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10, NAN, 1), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10, 5e6, -2), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10, 5e6, CXL_STUB_MAX_ORDER + 1), CXL_ERANGE);
    cxl_stub_result *r = NULL;
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_EINVAL); /* no readings */
    ck_assert_int_eq(cxl_stub_fit(s, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_fit(NULL, &r), CXL_EINVAL);
    int o;
    ck_assert_int_eq(cxl_stub_infer_orders(s, &o, 0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10, 5e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    ck_assert_int_eq(cxl_stub_result_vf(NULL, &v, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_vf(r, NULL, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_vf_budget(NULL, NULL, NULL, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_fixture(r, NULL, NULL, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_flags(r, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_reading(r, 1, NULL, NULL, NULL, NULL, NULL, NULL),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_result_reading(NULL, 0, NULL, NULL, NULL, NULL, NULL, NULL),
                     CXL_EINVAL);
    ck_assert_uint_eq(cxl_stub_result_count(NULL), 0);
    ck_assert_uint_eq(cxl_stub_count(NULL), 0);
    cxl_stub_result_free(r);
    cxl_stub_result_free(NULL);
    cxl_stub_free(s);
    cxl_stub_free(NULL);
}
END_TEST

int main(void)
{
    /* a stray GSL error must be loud in tests: keep GSL's aborting default */
    gsl_set_error_handler(NULL);
    Suite *s = suite_create("stub");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, test_pozar_resonances);
    tcase_add_test(tc, test_quarter_wave_open);
    tcase_add_test(tc, test_fixture_by_hand);
    tcase_add_test(tc, test_three_orders);
    tcase_add_test(tc, test_two_lengths_fixture);
    tcase_add_test(tc, test_inconsistent_is_a_warning);
    tcase_add_test(tc, test_implausible_is_range_error);
    tcase_add_test(tc, test_infer_orders);
    tcase_add_test(tc, test_higher_orders_weigh_more);
    tcase_add_test(tc, test_reading_order_rules);
    tcase_add_test(tc, test_bad_arguments);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
