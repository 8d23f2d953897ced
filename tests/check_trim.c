/* check_trim - the cut-long-then-trim loop: exact inversions on an ideal
 * line, and a simulated bench (readings from the library's own physical
 * model of a catalog cable, cut, read again). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"

#define C0 299792458.0 /* m/s, exact (SI) */

static cxl_trim *piece(cxl_stub_end end, double length_m)
{
    cxl_trim *t = NULL;
    ck_assert_int_eq(cxl_trim_new(end, length_m, &t), CXL_OK);
    return t;
}

static cxl_trim_result *solve(const cxl_trim *t)
{
    cxl_trim_result *r = NULL;
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_OK);
    return r;
}

START_TEST(ideal_line_inverts_exactly)
{
    /* A line of constant VF read through a fixture of another VF: the n-th
     * resonance is k_n c / (L/VF + Lf/VFf) (REFERENCES.md, stub
     * resonances), so the trim must return the VF exactly, a remaining
     * length deg/360 VF c / f (cxl_line_length_from_degrees, the DESIGN.md
     * electrical-length formula) and predict the readings of that piece. */
    const double vf = 0.8, len = 55.0, fix = 0.1, fix_vf = 0.7;
    for (int e = 0; e < 2; e++) {
        cxl_stub_end end = e ? CXL_STUB_SHORT : CXL_STUB_OPEN;
        cxl_trim *t = piece(end, len);
        ck_assert_int_eq(cxl_trim_set_fixture(t, fix, fix_vf, 0.0), CXL_OK);
        for (int n = 3; n >= 1; n--) { /* any order of entry */
            double f;
            ck_assert_int_eq(cxl_stub_resonance_freq(end, n, len, vf, fix, fix_vf, &f), CXL_OK);
            ck_assert_int_eq(cxl_trim_add_reading(t, f, n), CXL_OK);
        }
        ck_assert_int_eq(cxl_trim_target_degrees(t, 135.0, 1.83e6), CXL_OK);
        cxl_trim_result *r = solve(t);
        double cut, rem, res, want, vf_fit, vf_t, ft;
        cxl_trim_action act;
        ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, &res, &act), CXL_OK);
        ck_assert_int_eq(cxl_trim_result_vf(r, &vf_fit, &vf_t, &ft), CXL_OK);
        ck_assert_int_eq(cxl_line_length_from_degrees(135.0, vf, 1.83e6, &want), CXL_OK);
        ck_assert_double_eq_tol(vf_fit, vf, 1e-12);
        ck_assert_double_eq_tol(vf_t, vf, 1e-9);
        ck_assert_double_eq(ft, 1.83e6);
        ck_assert_double_eq_tol(rem, want, 1e-9 * want);
        ck_assert_double_eq_tol(cut, len - want, 1e-9 * want);
        ck_assert_int_eq(act, CXL_TRIM_CUT);
        ck_assert_double_eq_tol(res, 0.0, 1e-12); /* no resolution given */
        ck_assert_uint_eq(cxl_trim_result_count(r), 3);
        for (size_t i = 0; i < 3; i++) {
            double f, v, exp_hz, after;
            int order;
            ck_assert_int_eq(cxl_trim_result_reading(r, i, &f, &order, &v, &exp_hz, NULL), CXL_OK);
            ck_assert_int_eq(order, (int)i + 1); /* sorted by frequency */
            ck_assert_double_eq_tol(v, vf, 1e-12);
            ck_assert_int_eq(cxl_stub_resonance_freq(end, order, want, vf, fix, fix_vf, &after),
                             CXL_OK);
            ck_assert_double_eq_tol(exp_hz, after, 1e-9 * after);
        }
        cxl_trim_result_free(r);
        cxl_trim_free(t);
    }
}
END_TEST

START_TEST(targets_and_actions)
{
    const double vf = 0.66, len = 20.0;
    double f1, f2, cut, rem, res, want, vf_fit;
    cxl_trim_action act;
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_OPEN, 1, len, vf, 0.0, 1.0, &f1), CXL_OK);
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_OPEN, 2, len, vf, 0.0, 1.0, &f2), CXL_OK);

    /* a delay without a frequency: length = delay VF c (DESIGN.md) */
    cxl_trim *t = piece(CXL_STUB_OPEN, len);
    ck_assert_int_eq(cxl_trim_add_reading(t, f2, 0), CXL_OK); /* orders inferred */
    ck_assert_int_eq(cxl_trim_add_reading(t, f1, 0), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_delay(t, 80e-9, 0.0), CXL_OK);
    cxl_trim_result *r = solve(t);
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, NULL, &act), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_vf(r, &vf_fit, NULL, NULL), CXL_OK);
    ck_assert_double_eq_tol(rem, 80e-9 * vf * C0, 1e-9);   /* 15.8290 m */
    int order;
    unsigned flags;
    ck_assert_int_eq(cxl_trim_result_reading(r, 1, NULL, &order, NULL, NULL, NULL), CXL_OK);
    ck_assert_int_eq(order, 2);
    ck_assert_int_eq(cxl_trim_result_flags(r, &flags), CXL_OK);
    ck_assert(flags & CXL_STUB_FLAG_ORDERS_ASSUMED);
    ck_assert(!(flags & CXL_TRIM_FLAG_DRIFT));
    cxl_trim_result_free(r);

    /* match a reference piece of 18.5 m of the same cable: its first open
     * resonance through the same (no) fixture */
    double fref;
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_OPEN, 1, 18.5, vf, 0.0, 1.0, &fref), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_resonance(t, CXL_STUB_OPEN, 1, fref), CXL_OK);
    r = solve(t);
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, NULL, NULL), CXL_OK);
    ck_assert_double_eq_tol(rem, 18.5, 1e-9);   /* the reference piece */
    ck_assert_double_eq_tol(cut, 1.5, 1e-9);    /* 20 - 18.5 m */
    cxl_trim_result_free(r);
    /* the same reference read shorted at its first (half-wave) resonance */
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_SHORT, 1, 18.5, vf, 0.0, 1.0, &fref), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_resonance(t, CXL_STUB_SHORT, 1, fref), CXL_OK);
    r = solve(t);
    ck_assert_int_eq(cxl_trim_result_cut(r, NULL, &rem, NULL, NULL), CXL_OK);
    ck_assert_double_eq_tol(rem, 18.5, 1e-9);
    cxl_trim_result_free(r);

    /* longer than the piece: it needs lengthening */
    ck_assert_int_eq(cxl_line_length_from_degrees(200.0, vf, 1.83e6, &want), CXL_OK);
    ck_assert(want > len);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 200.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_set_resolution(t, 1e3), CXL_OK);
    r = solve(t);
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, &res, &act), CXL_OK);
    ck_assert_int_eq(act, CXL_TRIM_SHORT);
    ck_assert_double_eq_tol(cut, len - want, 1e-6);
    cxl_trim_result_free(r);

    /* A frequency step df at order n resolves (L) df / f_n of cable
     * (trim.c header: k c df / f^2 times VF); 1 kHz at 2.47 MHz on 20 m:
     * 8.1 mm, at the second order 2.7 mm (hand computed). */
    ck_assert_int_eq(cxl_trim_target_degrees(t, 360.0 * 1.83e6 * (len - 0.002) / (vf * C0),
                                             1.83e6), CXL_OK);
    r = solve(t);
    double r1, r2;
    ck_assert_int_eq(cxl_trim_result_reading(r, 0, NULL, NULL, NULL, NULL, &r1), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_reading(r, 1, NULL, NULL, NULL, NULL, &r2), CXL_OK);
    ck_assert_double_eq_tol(r1, len * 1e3 / f1, 1e-9);
    ck_assert_double_eq_tol(r2, len * 1e3 / f2, 1e-9);
    ck_assert_double_eq_tol(r1, 8.1e-3, 0.05e-3);
    ck_assert_double_eq_tol(r2, 2.7e-3, 0.05e-3);
    /* The length to keep inherits the trend's error at 1.83 MHz: a line
     * through two points (x_i, VF_i +- e_i), x = 1/sqrt(f), e_i = VF df/f_i,
     * has at x the variance ((x2 - x)^2 e1^2 + (x - x1)^2 e2^2)/(x2 - x1)^2
     * (first-order error propagation: Taylor, An Introduction to Error
     * Analysis, 2nd ed., ch. 3, from memory).  A 2 mm cut is within it. */
    double x1 = 1 / sqrt(f1), x2 = 1 / sqrt(f2), xt = 1 / sqrt(1.83e6);
    double e1 = vf * 1e3 / f1, e2 = vf * 1e3 / f2;
    double sd = sqrt(pow((x2 - xt) * e1, 2) + pow((xt - x1) * e2, 2)) / fabs(x2 - x1);
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, &res, &act), CXL_OK);
    ck_assert_double_eq_tol(cut, 0.002, 1e-9);
    ck_assert_double_eq_tol(res, rem * sd / vf, 1e-9);
    printf("20 m, orders 1-2, 1 kHz steps: resolves %.1f mm (order 1), %.1f mm (order 2), "
           "%.1f mm at 1.83 MHz\n", r1 * 1e3, r2 * 1e3, res * 1e3);
    ck_assert_int_eq(act, CXL_TRIM_WITHIN);
    cxl_trim_result_free(r);
    /* the fixture's uncertainty adds in quadrature: 3 mm of the same cable */
    double res0 = res;
    ck_assert_int_eq(cxl_trim_set_fixture(t, 0.0, 0.0, 0.003), CXL_OK);
    r = solve(t);
    ck_assert_int_eq(cxl_trim_result_cut(r, NULL, NULL, &res, NULL), CXL_OK);
    ck_assert_double_eq_tol(res, hypot(res0, 0.003), 1e-12);
    cxl_trim_result_free(r);
    cxl_trim_free(t);
}
END_TEST

/* Simulated bench: a piece of catalog cable read with the library's
 * physical model (reactance zeros of the lossy stub), readings rounded to
 * the analyzer's step, trimmed, read again. */
enum { LAND = 1, MODEL = 2, REREAD = 4 };

static void bench(const char *cable, double len, double fixture_m, int orders,
                  double target_deg, double target_hz, double df, int how)
{
    const int must_land = how & LAND;
    cxl_catalog *cat;
    cxl_loss_model *m;
    size_t idx;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, cable, &idx), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, idx, &m), CXL_OK);
    cxl_trim *t = piece(CXL_STUB_OPEN, len);
    /* the fixture is a jumper of the same cable: part of the line read */
    ck_assert_int_eq(cxl_trim_set_fixture(t, fixture_m, 0.0, 0.0), CXL_OK);
    ck_assert_int_eq(cxl_trim_set_resolution(t, df), CXL_OK);
    if (how & MODEL) ck_assert_int_eq(cxl_trim_set_model(t, m), CXL_OK);
    for (int n = 1; n <= orders; n++) {
        double f;
        ck_assert_int_eq(cxl_transfer_stub_resonance(m, 0, CXL_STUB_OPEN, n, len + fixture_m, &f),
                         CXL_OK);
        ck_assert_int_eq(cxl_trim_add_reading(t, df * floor(f / df + 0.5), 0), CXL_OK);
    }
    ck_assert_int_eq(cxl_trim_target_degrees(t, target_deg, target_hz), CXL_OK);
    cxl_trim_result *r = solve(t);
    double cut, rem, res, vf_t, alpha, beta;
    cxl_trim_action act;
    unsigned flags;
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, &rem, &res, &act), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_vf(r, NULL, &vf_t, NULL), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_flags(r, &flags), CXL_OK);
    ck_assert(flags & CXL_TRIM_FLAG_DRIFT);
    ck_assert_int_eq(act, CXL_TRIM_CUT);
    /* the truth: beta(f) L = target (the model's own phase constant) */
    ck_assert_int_eq(cxl_loss_model_gamma(m, target_hz, 0, &alpha, &beta), CXL_OK);
    double truth = target_deg * M_PI / 180.0 / beta;
    double landed_deg = beta * rem * 180.0 / M_PI;
    double res_deg = beta * res * 180.0 / M_PI;
    printf("%-9s %.3f m + %.2f m jumper, %d orders, %.0f Hz steps%s: cut %.4f m, keep %.4f m "
           "(model %.4f m, off %+.1f mm, resolution %.1f mm); %.3f deg at %.3f MHz (+-%.3f)\n",
           cable, len, fixture_m, orders, df, how & MODEL ? ", offset corrected" : "", cut, rem,
           truth, (rem - truth) * 1e3, res * 1e3, landed_deg, target_hz / 1e6, res_deg);
    ck_assert(!(how & MODEL) == !(flags & CXL_TRIM_FLAG_MODEL));
    double vf_model;
    ck_assert_int_eq(cxl_loss_model_vf(m, target_hz, 0, &vf_model), CXL_OK);
    printf("    VF at target: trim %.6f, model %.6f (%+.1e)\n", vf_t, vf_model, vf_t / vf_model - 1);
    double misfit = 0.0; /* the drift law's largest VF error at the readings */
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double f, v, vm;
        ck_assert_int_eq(cxl_trim_result_reading(r, i, &f, NULL, &v, NULL, NULL), CXL_OK);
        ck_assert_int_eq(cxl_loss_model_vf(m, f, 0, &vm), CXL_OK);
        printf("    reading %.6f MHz: VF %.6f, model %.6f (%+.1e)\n", f / 1e6, v, vm, v / vm - 1);
        if (fabs(v / vm - 1) > misfit) misfit = fabs(v / vm - 1);
    }
    if (must_land) ck_assert(fabs(rem - truth) <= res);
    /* read the trimmed piece again: each order within two steps of the
     * frequency the trim said the analyzer would show (each reading was
     * rounded by up to half a step, and the prediction rests on them:
     * common practice, no source), plus twice the drift law's own VF error
     * at the readings: vf_hf - drop/sqrt(f) is not the exact shape of the
     * Bessel internal impedance's VF(f), some 1e-5 on RG-58 near 2 MHz,
     * which at 100 Hz steps is as large as the rounding */
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double expected, again;
        int order;
        ck_assert_int_eq(cxl_trim_result_reading(r, i, NULL, &order, NULL, &expected, NULL),
                         CXL_OK);
        ck_assert_int_eq(cxl_transfer_stub_resonance(m, 0, CXL_STUB_OPEN, order, rem + fixture_m,
                                                     &again), CXL_OK);
        printf("    order %d: expected %.6f MHz, read after the cut %.6f MHz\n", order,
               expected / 1e6, again / 1e6);
        if (how & REREAD) ck_assert(fabs(again - expected) <= 2.0 * df + 2.0 * misfit * again);
    }
    cxl_trim_result_free(r);
    cxl_trim_free(t);
    cxl_loss_model_free(m);
    cxl_catalog_free(cat);
}

START_TEST(simulated_bench)
{
    /* 90 degrees at 1.83 MHz (a 160 m quarter-wave phasing line) and 135
     * degrees at 3.6 MHz, from pieces cut long; 1 kHz and 100 Hz analyzer
     * steps (common practice, no source).  The remaining piece must be the
     * model's true length within the resolution the trim states. */
    bench("RG-213", 30.0, 0.0, 3, 90.0, 1.83e6, 1e3, LAND | REREAD);
    bench("RG-6-foam", 40.0, 0.0, 3, 90.0, 1.83e6, 1e3, LAND | REREAD);
    /* A lossy line's reactance zero sits above its exact quarter wave by
     * 1e-4 to 5e-4 at the low bands (smaller cable, more): a few mm, more
     * than a fine resolution.  Uncorrected: the re-read lands, the length
     * is printed only; corrected with the cable model, the length must
     * land within the stated resolution too. */
    bench("RG-58", 22.0, 0.0, 3, 135.0, 3.6e6, 1e3, REREAD);
    bench("RG-58", 22.0, 0.0, 3, 135.0, 3.6e6, 1e3, LAND | MODEL | REREAD);
    bench("RG-213", 30.0, 0.25, 4, 90.0, 1.83e6, 100.0, REREAD);
    bench("RG-213", 30.0, 0.25, 4, 90.0, 1.83e6, 100.0, LAND | MODEL | REREAD);
    bench("RG-58", 22.0, 0.0, 3, 135.0, 3.6e6, 100.0, LAND | MODEL | REREAD);
    /* copper-clad steel: the VF keeps falling below the crossover faster
     * than 1/sqrt(f), and the reactance-zero offset is large; figures
     * printed, no claim */
    bench("RG-6-CCS", 40.0, 0.0, 3, 90.0, 1.83e6, 1e3, 0);
    bench("RG-6-CCS", 40.0, 0.0, 3, 90.0, 1.83e6, 1e3, MODEL);
}
END_TEST

START_TEST(bad_input)
{
    cxl_trim *t = NULL;
    cxl_trim_result *r = (cxl_trim_result *)0x1;
    ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, 0.0, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, NAN, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_new((cxl_stub_end)7, 1.0, &t), CXL_EINVAL);
    t = piece(CXL_STUB_OPEN, 20.0);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINVAL); /* no readings, no target */
    ck_assert_int_eq(cxl_trim_add_reading(t, 2.47e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINVAL); /* no target */
    ck_assert_ptr_eq(r, (cxl_trim_result *)0x1);
    ck_assert_int_eq(cxl_trim_add_reading(t, 2.47e6, 2), CXL_EINVAL);  /* same frequency */
    ck_assert_int_eq(cxl_trim_add_reading(t, 7.4e6, 1), CXL_EINVAL);   /* same order */
    ck_assert_int_eq(cxl_trim_add_reading(t, 7.4e6, 0), CXL_EINVAL);   /* mixed */
    ck_assert_int_eq(cxl_trim_add_reading(t, -7.4e6, 2), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_add_reading(t, 7.4e6, CXL_STUB_MAX_ORDER + 1), CXL_ERANGE);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 0.0, 1.83e6), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_target_delay(t, 50e-9, -1.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_target_resonance(t, CXL_STUB_OPEN, 0, 2e6), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_set_fixture(t, 0.1, 1.5, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_set_fixture(t, -0.1, 0.7, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_set_resolution(t, NAN), CXL_EINVAL);
    /* a lower order at a higher frequency cannot be */
    ck_assert_int_eq(cxl_trim_add_reading(t, 1.2e6, 2), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINCONSISTENT);
    cxl_trim_free(t);
    /* 20 m open reading 9 MHz at order 1: VF 2.4, faster than light */
    t = piece(CXL_STUB_OPEN, 20.0);
    ck_assert_int_eq(cxl_trim_add_reading(t, 9e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_ERANGE);
    /* a fixture longer than the whole reading: no length left for the target */
    cxl_trim_free(t);
    t = piece(CXL_STUB_OPEN, 20.0);
    ck_assert_int_eq(cxl_trim_add_reading(t, 2.47e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_trim_set_fixture(t, 25.0, 0.66, 0.0), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_ERANGE);
    cxl_trim_free(t);
    cxl_trim_free(NULL);
    cxl_trim_result_free(NULL);
    ck_assert_uint_eq(cxl_trim_result_count(NULL), 0);
    ck_assert_int_eq(cxl_trim_result_cut(NULL, NULL, NULL, NULL, NULL), CXL_EINVAL);
}
END_TEST

/* Simulated bench for trim (common practice, no source: an uncertainty
 * is a promise): 1500 pieces of lines whose VF follows a (1 - c / sqrt(f))
 * (a 0.6-0.88, c 0-80 sqrt(Hz): the span of the built-in cables' physical
 * models, see drift.c), read at one to three orders rounded to an analyzer
 * step of 100 Hz to 10 kHz; targets of 80-95 % of the piece at 1.8-4 MHz,
 * from well below the readings (one reading 1.6 times above the target,
 * or several 1.5-3 times above) to among them.  The true length to keep
 * must lie within the stated +- in at least 95 % of the cases. */
static unsigned long long rng_state = 88172645463325252ULL;
static double uniform(void)
{
    rng_state ^= rng_state << 13;
    rng_state ^= rng_state >> 7;
    rng_state ^= rng_state << 17;
    return (double)(rng_state >> 11) / 9007199254740992.0;
}

START_TEST(keep_covers_simulated_spools)
{
    const double c0 = 299792458.0;
    int inside = 0, cases = 0;
    for (int t = 0; t < 1500; t++) {
        double a = 0.6 + 0.28 * uniform(), c = 80.0 * uniform();
        double step = floor(pow(10.0, 2.0 + 2.0 * uniform()));
        double ft = (1.8 + 2.2 * uniform()) * 1e6, vt = a * (1.0 - c / sqrt(ft));
        int mode = t % 3, orders = mode == 0 ? 1 : 3;
        /* mode 0: one reading 1.6 x above; 1: three, 1.5-3 x above; 2: around */
        double ratio = mode == 0 ? 1.6 : mode == 1 ? 1.5 + 1.5 * uniform() : 0.6 + 0.6 * uniform();
        double len = 0.25 * vt * c0 / (ratio * ft);
        cxl_trim *tr;
        ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, len, &tr), CXL_OK);
        ck_assert_int_eq(cxl_trim_set_resolution(tr, step), CXL_OK);
        for (int n = 1; n <= orders; n++) {
            double k = (2 * n - 1) / 4.0, f = k * a * c0 / len;
            for (int i = 0; i < 60; i++) f = k * a * (1.0 - c / sqrt(f)) * c0 / len;
            ck_assert_int_eq(cxl_trim_add_reading(tr, floor(f / step + 0.5) * step, 0), CXL_OK);
        }
        double frac = 0.8 + 0.15 * uniform();
        double deg = 360.0 * frac * len / vt * ft / c0; /* frac of the piece at ft */
        ck_assert_int_eq(cxl_trim_target_degrees(tr, deg, ft), CXL_OK);
        cxl_trim_result *r;
        if (cxl_trim_solve(tr, &r) == CXL_OK) {
            double keep, res;
            ck_assert_int_eq(cxl_trim_result_cut(r, NULL, &keep, &res, NULL), CXL_OK);
            cases++;
            inside += fabs(keep - frac * len) <= res;
            cxl_trim_result_free(r);
        }
        cxl_trim_free(tr);
    }
    ck_assert_int_ge(cases, 1400);
    ck_assert_msg(inside >= 0.95 * cases, "truth inside +- in %d of %d cases", inside, cases);
}
END_TEST

/* Readings of min |Z| on a lossy line lie off the reactance zero; with
 * --reading min-z and the model, trim corrects them and finds the piece
 * the model's own resonances describe (the model is the reference here:
 * its readings come from cxl_transfer_stub_dip, its VF from
 * cxl_loss_model_vf, both derived at run time). */
START_TEST(min_z_readings_corrected)
{
    cxl_catalog *cat;
    cxl_loss_model *m;
    size_t idx;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-58", &idx), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, idx, &m), CXL_OK);
    const double len = 25.0, ft = 1.83e6;
    double vt, keep[2];
    ck_assert_int_eq(cxl_loss_model_vf(m, ft, CXL_LOSS_EXTRAPOLATE, &vt), CXL_OK);
    for (int corrected = 0; corrected < 2; corrected++) {
        cxl_trim *tr;
        ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, len, &tr), CXL_OK);
        ck_assert_int_eq(cxl_trim_set_resolution(tr, 1.0), CXL_OK);
        if (corrected) {
            ck_assert_int_eq(cxl_trim_set_model(tr, m), CXL_OK);
            ck_assert_int_eq(cxl_trim_set_reading(tr, CXL_DIP_MIN_Z, 50.0), CXL_OK);
        }
        for (int n = 1; n <= 3; n++) {
            double f, wave;
            ck_assert_int_eq(cxl_transfer_stub_dip(m, CXL_LOSS_EXTRAPOLATE, CXL_STUB_OPEN, n, len,
                                                   CXL_DIP_MIN_Z, 50.0, &f, &wave), CXL_OK);
            ck_assert(f != wave);
            ck_assert_int_eq(cxl_trim_add_reading(tr, f, n), CXL_OK);
        }
        /* 90 % of the piece's electrical length at ft (the model's VF) */
        ck_assert_int_eq(cxl_trim_target_degrees(tr, 360.0 * 0.9 * len / vt * ft / 299792458.0, ft),
                         CXL_OK);
        cxl_trim_result *r;
        double res;
        ck_assert_int_eq(cxl_trim_solve(tr, &r), CXL_OK);
        ck_assert_int_eq(cxl_trim_result_cut(r, NULL, &keep[corrected], &res, NULL), CXL_OK);
        ck_assert_msg(fabs(keep[corrected] - 0.9 * len) <= res || !corrected,
                      "keep %.4f +- %.4f, model %.4f", keep[corrected], res, 0.9 * len);
        cxl_trim_result_free(r);
        cxl_trim_free(tr);
    }
    /* the correction brings the answer closer to the model's piece */
    ck_assert(fabs(keep[1] - 0.9 * len) < fabs(keep[0] - 0.9 * len));
    cxl_loss_model_free(m);
    cxl_catalog_free(cat);
}
END_TEST

int main(void)
{
    gsl_set_error_handler(NULL); /* GSL's default: abort, so a stray error is loud */
    Suite *s = suite_create("trim");
    TCase *tc = tcase_create("trim");
    tcase_set_timeout(tc, 30);
    tcase_add_test(tc, ideal_line_inverts_exactly);
    tcase_add_test(tc, targets_and_actions);
    tcase_add_test(tc, simulated_bench);
    tcase_add_test(tc, bad_input);
    tcase_add_test(tc, keep_covers_simulated_spools);
    tcase_add_test(tc, min_z_readings_corrected);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
