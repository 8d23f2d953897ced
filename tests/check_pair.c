/* check_pair.c - phase error and pair tolerance.
 *
 * The identity tested: a line dL longer than its reference delays by
 * dL / (VF c), i.e. 360 f dL / (VF c) degrees at f (Pozar, Microwave
 * Engineering, 4th ed., sec. 2.1: phase velocity v_p = omega / beta; with
 * v_p = VF c the phase of a length l is beta l = 2 pi f l / (VF c)).
 */
#include <config.h>
#include <check.h>
#include <complex.h>
#include <math.h>
#include <stdlib.h>
#include "coaxline.h"

#define C0 299792458.0 /* m/s, exact: SI definition of the metre */

START_TEST(test_phase_error_example)
{
    /* 20.10 m against 20.00 m, VF 0.66, 1.8 MHz:
     * 360 * 1.8e6 * 0.10 / (0.66 * 299792458) = 0.327 deg (hand arithmetic
     * with the identity above) */
    double ph;
    ck_assert_int_eq(cxl_pair_phase_error(20.10, 20.00, 0.66, 1.8e6, &ph), CXL_OK);
    ck_assert_double_eq_tol(ph, 0.327, 5e-4);
    /* the shorter line leads: same size, other sign */
    double ph2;
    ck_assert_int_eq(cxl_pair_phase_error(20.00, 20.10, 0.66, 1.8e6, &ph2), CXL_OK);
    ck_assert_double_eq_tol(ph2, -ph, 1e-12);
}
END_TEST

START_TEST(test_phase_error_identity)
{
    /* phase error = electrical length of L minus that of Lref, each from
     * line.c (degrees = 360 f L / (VF c)); and it scales with f */
    const double vfs[] = { 0.66, 0.78, 0.85 };
    const double fs[] = { 137e3, 1.83e6, 7.1e6, 28.5e6 };
    for (size_t i = 0; i < 3; i++) {
        for (size_t j = 0; j < 4; j++) {
            double ph, a, b;
            ck_assert_int_eq(cxl_pair_phase_error(33.3, 32.9, vfs[i], fs[j], &ph), CXL_OK);
            ck_assert_int_eq(cxl_line_degrees_from_length(33.3, vfs[i], fs[j], &a), CXL_OK);
            ck_assert_int_eq(cxl_line_degrees_from_length(32.9, vfs[i], fs[j], &b), CXL_OK);
            ck_assert_double_eq_tol(ph, a - b, 1e-9 * fabs(a));
            ck_assert_double_eq_tol(ph, 360.0 * fs[j] * 0.4 / (vfs[i] * C0), 1e-9 * fabs(ph));
        }
    }
}
END_TEST

START_TEST(test_reference_in_degrees)
{
    /* reference 90 deg at 1.83 MHz on VF 0.66 is a quarter wave:
     * 0.25 * 0.66 * c / 1.83e6 = 27.030 m (hand arithmetic); a line 0.10 m
     * longer is off by 360 * 3.6e6 * 0.10 / (0.66 c) = 0.655 deg at
     * 3.6 MHz (the identity above) */
    double ph;
    double ref = 0.25 * 0.66 * C0 / 1.83e6;
    ck_assert_double_eq_tol(ref, 27.030, 5e-4);
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref + 0.10, 90.0, 1.83e6, 0.66, 3.6e6, &ph),
                     CXL_OK);
    ck_assert_double_eq_tol(ph, 0.655, 5e-4);
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref, 0.0, 1.83e6, 0.66, 3.6e6, &ph),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref, 90.0, NAN, 0.66, 3.6e6, &ph),
                     CXL_EINVAL);
}
END_TEST

START_TEST(test_max_mismatch)
{
    /* delta_max = T VF c / (360 f): 2 deg, VF 0.66, 2.0 MHz
     * -> 2 * 0.66 * 299792458 / 7.2e8 = 0.5496 m (hand arithmetic) */
    double d, ph;
    ck_assert_int_eq(cxl_pair_max_mismatch(2.0, 0.66, 2.0e6, &d), CXL_OK);
    ck_assert_double_eq_tol(d, 0.5496, 5e-5);
    /* inverse of the phase error: that mismatch gives exactly 2 deg */
    ck_assert_int_eq(cxl_pair_phase_error(20.0 + d, 20.0, 0.66, 2.0e6, &ph), CXL_OK);
    ck_assert_double_eq_tol(ph, 2.0, 1e-12);
}
END_TEST

START_TEST(test_pair_160m_passes_40m_fails)
{
    /* 20.00 and 20.30 m, VF 0.66, tolerance 2 deg.  By the identity:
     * 1.8 MHz 0.982 deg, 1.9 MHz 1.037 deg, 2.0 MHz 1.092 deg
     * (360 f 0.30 / (0.66 c); 160 m, ITU RR Art. 5 Regions 2
     * and 3: 1800-2000 kHz) -> pass; 7.0 MHz 3.821 deg -> fail. */
    const double len[] = { 20.00, 20.30 };
    const double f160[] = { 1.8e6, 1.9e6, 2.0e6 };
    const double want160[] = { 0.982, 1.037, 1.092 };
    double d, ph, u;
    cxl_verdict v;
    for (int i = 0; i < 3; i++) {
        ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, f160[i], 0.0, 0.0, &d, &ph, &u, &v),
                         CXL_OK);
        ck_assert_double_eq_tol(d, 0.30, 1e-12);          /* 20.30 - 20.00 */
        ck_assert_double_eq_tol(ph, want160[i], 5e-4);    /* hand values above */
        ck_assert_double_eq_tol(u, 0.0, 1e-12);
        ck_assert_int_eq(v, CXL_VERDICT_PASS);
    }
    const double f40[] = { 7.0e6, 7.2e6 };
    for (int i = 0; i < 2; i++) {
        ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, f40[i], 0.0, 0.0, &d, &ph, &u, &v),
                         CXL_OK);
        ck_assert_int_eq(v, CXL_VERDICT_FAIL);
    }
    ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, 7.0e6, 0.0, 0.0, &d, &ph, &u, &v),
                     CXL_OK);
    ck_assert_double_eq_tol(ph, 3.821, 5e-4);
}
END_TEST

START_TEST(test_pair_many_lines)
{
    /* four lines: the worst pair is the longest against the shortest */
    const double len[] = { 20.05, 19.98, 20.10, 20.01 };
    double d, ph, u;
    cxl_verdict v;
    ck_assert_int_eq(cxl_pair_check(len, 4, 2.0, 0.66, 1.83e6, 0.0, 0.0, &d, &ph, &u, &v),
                     CXL_OK);
    ck_assert_double_eq_tol(d, 0.12, 1e-12);   /* 20.10 - 19.98 */
    /* the identity in the file header comment (Pozar sec. 2.1) */
    ck_assert_double_eq_tol(ph, 360.0 * 1.83e6 * 0.12 / (0.66 * C0), 1e-12);
}
END_TEST

START_TEST(test_uncertainty)
{
    /* Worst case over the tolerance box (formula in pair.c):
     * 20.10 vs 20.00 m, VF 0.66 +- 0.01, each length +- 0.005 m, 1.8 MHz:
     *   nominal  360 * 1.8e6 * 0.10 / (0.66 c)         = 0.32750 deg
     *   worst    360 * 1.8e6 * 0.105 / (0.65 c)        = 0.34917 deg
     *   u = 0.02167 deg (one measured line; hand arithmetic)
     *   first order: 360 f tol_L/(VF c) + |ph| tol_VF/VF
     *              = 0.016375 + 0.004962 = 0.021337 deg */
    double u;
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20.10, 20.00, 0.66, 1.8e6, 0.005, 0.01, &u),
                     CXL_OK);
    ck_assert_double_eq_tol(u, 0.02167, 5e-5);
    ck_assert_double_eq_tol(u, 0.021337, 0.02 * 0.021337); /* first order, within 2 % */
    /* no tolerances, no uncertainty */
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20.10, 20.00, 0.66, 1.8e6, 0.0, 0.0, &u),
                     CXL_OK);
    ck_assert_double_eq_tol(u, 0.0, 1e-12);
}
END_TEST

START_TEST(test_pass_not_certain)
{
    /* 20.00 / 20.30 m at 2.0 MHz is 1.092 deg; with each length +- 0.25 m
     * the worst difference is 0.80 m = 2.911 deg > 2 deg, so the pass is
     * not certain (hand arithmetic with the identity) */
    const double len[] = { 20.00, 20.30 };
    double d, ph, u;
    cxl_verdict v;
    ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, 2.0e6, 0.25, 0.0, &d, &ph, &u, &v),
                     CXL_OK);
    ck_assert_double_eq_tol(ph + u, 2.911, 5e-4);
    ck_assert_int_eq(v, CXL_VERDICT_PASS_UNCERTAIN);
    /* a tight tape makes it certain: 0.31 m worst = 1.128 deg */
    ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, 2.0e6, 0.005, 0.0, &d, &ph, &u, &v),
                     CXL_OK);
    ck_assert_int_eq(v, CXL_VERDICT_PASS);
}
END_TEST

START_TEST(test_verdict_rule)
{
    /* The rule of DESIGN.md's pair check (common practice, no source): fail
     * above the tolerance, pass not certain when error + uncertainty is
     * above it, else pass; the sign of the error does not matter. */
    cxl_verdict v = (cxl_verdict)77;
    ck_assert_int_eq(cxl_pair_verdict(1.0, 0.5, 2.0, &v), CXL_OK);
    ck_assert_int_eq(v, CXL_VERDICT_PASS);
    ck_assert_int_eq(cxl_pair_verdict(-1.8, 0.5, 2.0, &v), CXL_OK);
    ck_assert_int_eq(v, CXL_VERDICT_PASS_UNCERTAIN);
    ck_assert_int_eq(cxl_pair_verdict(2.1, 0.0, 2.0, &v), CXL_OK);
    ck_assert_int_eq(v, CXL_VERDICT_FAIL);
    ck_assert_int_eq(cxl_pair_verdict(2.0, 0.0, 2.0, &v), CXL_OK);
    ck_assert_int_eq(v, CXL_VERDICT_PASS);   /* at the tolerance: within */
    v = (cxl_verdict)77;
    ck_assert_int_eq(cxl_pair_verdict(1.0, -0.1, 2.0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_verdict(1.0, 0.1, 0.0, &v), CXL_EINVAL);
    ck_assert_int_eq((int)v, 77);
    /* cxl_pair_check gives the same verdict as the rule on its own error */
    const double len[2] = { 20.0, 20.02 };
    double d, e, u;
    cxl_verdict w;
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.6, 0.66, 7.3e6, 0.005, 0.01, &d, &e, &u, &w),
                     CXL_OK);
    ck_assert_int_eq(cxl_pair_verdict(e, u, 0.6, &v), CXL_OK);
    ck_assert_int_eq(v, w);
}
END_TEST

START_TEST(test_bad_arguments)
{
    double out = 5.0, d = 5.0, ph = 5.0, u = 5.0;
    cxl_verdict v = CXL_VERDICT_PASS;
    const double len[] = { 20.0, 20.3 };
    const double bad[] = { 20.0, NAN };
    const double neg[] = { 20.0, -1.0 };
    ck_assert_int_eq(cxl_pair_phase_error(20, 20, 0.66, 1.8e6, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(NAN, 20, 0.66, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(20, INFINITY, 0.66, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(20, 20, 1.2, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(20, 20, 0.0, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(20, 20, 0.66, 0.0, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error(-20, 20, 0.66, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_max_mismatch(0.0, 0.66, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_max_mismatch(2.0, NAN, 1.8e6, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_max_mismatch(2.0, 0.66, -1.0, &out), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_max_mismatch(2.0, 0.66, 1.8e6, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20, 20, 0.66, 1.8e6, -0.1, 0.0, &out),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20, 20, 0.66, 1.8e6, 0.0, 0.66, &out),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20, 20, 0.66, 1.8e6, 0.0, NAN, &out),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_uncertainty(20, 20, 0.66, 1.8e6, 0.0, 0.0, NULL),
                     CXL_EINVAL);
    ck_assert_double_eq(out, 5.0);
    ck_assert_int_eq(cxl_pair_check(len, 1, 2.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(NULL, 2, 2.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(bad, 2, 2.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(neg, 2, 2.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, NAN, 0.66, 1.8e6, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, 1.8e6, 0, 0, NULL, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 2.0, 0.66, 1.8e6, 0, 0, &d, &ph, &u, NULL),
                     CXL_EINVAL);
    ck_assert_double_eq(d, 5.0);
    ck_assert_double_eq(ph, 5.0);
    ck_assert_double_eq(u, 5.0);
}
END_TEST


/* ---- lines into a load ------------------------------------------------
 * Reference: the ABCD matrix of a length l of line with propagation
 * constant gamma and characteristic impedance Z0 (Pozar, Microwave
 * Engineering, 4th ed., Table 4.1, lossless form with gamma = j beta;
 * the lossy form with cosh/sinh from the telegrapher solution of sec. 2.1):
 *     V_in = V_L (cosh(gamma l) + (Z0 / Z_L) sinh(gamma l)),
 * the same relation that gives the input impedance of a loaded line,
 *     Z_in = Z0 (Z_L + Z0 tanh(gamma l)) / (Z0 + Z_L tanh(gamma l))
 * (Pozar 4th ed., eq. 2.44 for the lossless case; eq. 2.91 lossy).  The
 * delay is minus the phase of V_L / V_in, with whole turns kept near beta l. */

/* Delay (deg) and transfer (dB) of V_L / V_in by the ABCD form. */
static void abcd_delay(double complex z0, double complex gamma_l, double complex zl,
                       double electrical_deg, double *delay_deg, double *db)
{
    double complex vin = ccosh(gamma_l) + z0 / zl * csinh(gamma_l);
    double complex ratio = 1.0 / vin;
    double d = -carg(ratio) * 180.0 / M_PI;
    d += 360.0 * round((electrical_deg - d) / 360.0);
    *delay_deg = d;
    *db = 20.0 * log10(cabs(ratio));
}

static double beta_l(double length_m, double vf, double f)
{
    return 2.0 * M_PI * f * length_m / (vf * C0);
}

START_TEST(test_load_transfer_lossless_abcd)
{
    /* lossless 50 ohm line, VF 0.66, into a handful of loads and lengths */
    const double loads[][2] = { { 50, 0 }, { 21, 20 }, { 21, -20 }, { 200, 0 }, { 1e9, 0 } };
    const double lens[] = { 3.0, 20.0, 20.3, 27.05, 60.0 };
    const double f = 1.83e6, vf = 0.66;
    for (size_t i = 0; i < 5; i++) {
        cxl_pair_load *l = NULL;
        ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, loads[i][0], loads[i][1], &l), CXL_OK);
        for (size_t j = 0; j < 5; j++) {
            double db, d, e, rd, rdb;
            ck_assert_int_eq(cxl_pair_load_transfer(l, lens[j], vf, f, &db, &d, &e), CXL_OK);
            double bl = beta_l(lens[j], vf, f);
            ck_assert_double_eq_tol(e, bl * 180.0 / M_PI, 1e-9);
            abcd_delay(50.0, I * bl, loads[i][0] + I * loads[i][1], e, &rd, &rdb);
            ck_assert_double_eq_tol(d, rd, 1e-7);
            ck_assert_double_eq_tol(db, rdb, 1e-7);
        }
        cxl_pair_load_free(l);
    }
}
END_TEST

START_TEST(test_load_quarter_wave)
{
    /* a lossless quarter wave gives V_L / V_in = -j Z_L / Z0 (Pozar 4th ed.
     * sec. 2.5, the quarter-wave transformer, from eq. 2.44): into 100 ohm
     * on a 50 ohm line the delay is exactly 90 deg and the gain 20 log10 2 */
    const double f = 1.83e6, vf = 0.66;
    double quarter = vf * C0 / (4.0 * f), db, d, e;
    cxl_pair_load *l = NULL;
    ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, 100.0, 0.0, &l), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_transfer(l, quarter, vf, f, &db, &d, NULL), CXL_OK);
    ck_assert_double_eq_tol(d, 90.0, 1e-9);
    ck_assert_double_eq_tol(db, 20.0 * log10(2.0), 1e-9);
    /* into 21+j20: -j(21+j20)/50 = (20 - j21)/50, a delay of atan2(21, 20) */
    cxl_pair_load_free(l);
    ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, 21.0, 20.0, &l), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_transfer(l, quarter, vf, f, &db, &d, &e), CXL_OK);
    ck_assert_double_eq_tol(d, atan2(21.0, 20.0) * 180.0 / M_PI, 1e-9);
    ck_assert_double_eq_tol(e, 90.0, 1e-9);
    cxl_pair_load_free(l);
}
END_TEST

START_TEST(test_load_check_matched_is_electrical)
{
    /* into a matched load the delay is the electrical length, so the check
     * into the load is cxl_pair_check: error, uncertainty (the same corner
     * box) and verdict (Pozar 4th ed. sec. 2.3: Gamma = 0 leaves only the
     * travelling wave e^{-j beta z}) */
    const double len[] = { 20.00, 20.30, 20.12 };
    const double fs[] = { 1.83e6, 3.7e6, 7.1e6 };
    cxl_pair_load *l = NULL;
    ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, 50.0, 0.0, &l), CXL_OK);
    for (size_t i = 0; i < 3; i++) {
        double dm, err, unc, lerr, lunc, elec, imb;
        cxl_verdict v, lv;
        ck_assert_int_eq(cxl_pair_check(len, 3, 2.0, 0.66, fs[i], 0.005, 0.01, &dm, &err, &unc, &v),
                         CXL_OK);
        ck_assert_int_eq(cxl_pair_load_check(l, len, 3, 2.0, 0.66, fs[i], 0.005, 0.01, &lerr, &lunc,
                                             &elec, &imb, &lv), CXL_OK);
        ck_assert_double_eq_tol(lerr, err, 1e-9);
        ck_assert_double_eq_tol(elec, err, 1e-9);
        ck_assert_double_eq_tol(lunc, unc, 1e-9);
        ck_assert_double_eq_tol(imb, 0.0, 1e-12);
        ck_assert_int_eq(lv, v);
        /* and the allowed mismatch is tolerance VF c / (360 f) */
        double allowed, ref;
        ck_assert_int_eq(cxl_pair_load_max_mismatch(l, 2.0, 20.0, 0.66, fs[i], &allowed), CXL_OK);
        ck_assert_int_eq(cxl_pair_max_mismatch(2.0, 0.66, fs[i], &ref), CXL_OK);
        ck_assert_double_eq_tol(allowed, ref, 1e-9 * ref);
    }
    cxl_pair_load_free(l);
}
END_TEST

START_TEST(test_load_check_mismatched)
{
    /* 20.00 m and 20.30 m of VF 0.66, 50 ohm, into 21+j20 at 1.83 MHz:
     * each delay by the ABCD form; the error is their difference, the
     * imbalance the difference of the gains; a tolerance between the
     * electrical error and the error into the load flips the verdict */
    const double len[] = { 20.00, 20.30 }, f = 1.83e6, vf = 0.66;
    const double complex zl = 21.0 + 20.0 * I;
    double d[2], g[2], e[2];
    for (int i = 0; i < 2; i++) {
        e[i] = beta_l(len[i], vf, f) * 180.0 / M_PI;
        abcd_delay(50.0, I * beta_l(len[i], vf, f), zl, e[i], &d[i], &g[i]);
    }
    cxl_pair_load *l = NULL;
    double err, unc, elec, imb;
    cxl_verdict v;
    ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, 21.0, 20.0, &l), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_check(l, len, 2, 5.0, vf, f, 0.0, 0.0, &err, &unc, &elec, &imb, &v),
                     CXL_OK);
    ck_assert_double_eq_tol(err, fabs(d[1] - d[0]), 1e-7);
    ck_assert_double_eq_tol(elec, e[1] - e[0], 1e-9);
    ck_assert_double_eq_tol(imb, fabs(g[1] - g[0]), 1e-7);
    ck_assert_double_eq(unc, 0.0);
    /* the mismatched load makes the error differ from the electrical one */
    ck_assert(fabs(err - elec) > 0.01);
    double mid = 0.5 * (err + elec);
    ck_assert_int_eq(cxl_pair_load_check(l, len, 2, mid, vf, f, 0.0, 0.0, &err, &unc, &elec, &imb, &v),
                     CXL_OK);
    ck_assert_int_eq(v, err > elec ? CXL_VERDICT_FAIL : CXL_VERDICT_PASS);
    /* the allowed mismatch: the delay grows by the tolerance over it */
    double allowed, a0, a1, gdb;
    ck_assert_int_eq(cxl_pair_load_max_mismatch(l, 3.0, 20.0, vf, f, &allowed), CXL_OK);
    abcd_delay(50.0, I * beta_l(20.0, vf, f), zl, beta_l(20.0, vf, f) * 180 / M_PI, &a0, &gdb);
    abcd_delay(50.0, I * beta_l(20.0 + allowed, vf, f), zl,
               beta_l(20.0 + allowed, vf, f) * 180 / M_PI, &a1, &gdb);
    ck_assert_double_eq_tol(a1 - a0, 3.0, 1e-6);
    cxl_pair_load_free(l);
}
END_TEST

START_TEST(test_load_uncertainty_corners)
{
    /* error + uncertainty is the largest spread over the tolerance box:
     * no draw inside the box (each length within +-tol_L, the VF within
     * +-tol_VF, a lossless line at VF' holding the electrical length of
     * the same line at VF scaled by VF / VF') spreads the delays more, and
     * the corners reach it (common practice, no source: bounds as a worst
     * case; the delays by the ABCD form above) */
    const double len[] = { 20.00, 20.30 }, f = 3.7e6, vf = 0.66, tl = 0.01, tv = 0.01;
    const double complex zl = 30.0 - 15.0 * I;
    cxl_pair_load *l = NULL;
    double err, unc, elec, imb;
    cxl_verdict v;
    ck_assert_int_eq(cxl_pair_load_new_lossless(50.0, 30.0, -15.0, &l), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_check(l, len, 2, 10.0, vf, f, tl, tv, &err, &unc, &elec, &imb, &v),
                     CXL_OK);
    ck_assert(unc > 0.0);
    double worst = 0.0;
    unsigned seed = 12345u;
    for (int n = 0; n < 20000; n++) {
        double u[3];
        for (int k = 0; k < 3; k++) {
            seed = seed * 1103515245u + 12345u;
            u[k] = 2.0 * ((seed >> 8) & 0xFFFF) / 65535.0 - 1.0;
            if (n < 8) u[k] = ((n >> k) & 1) ? 1.0 : -1.0; /* the corners first */
        }
        double vfp = vf + u[2] * tv, gd[2], gg;
        double hi = len[1] + u[0] * tl, lo = len[0] - u[1] * tl;
        double ls[2] = { lo, hi };
        for (int i = 0; i < 2; i++) {
            double bl = beta_l(ls[i] * vf / vfp, vf, f);
            abcd_delay(50.0, I * bl, zl, bl * 180 / M_PI, &gd[i], &gg);
        }
        double spread = fabs(gd[1] - gd[0]);
        ck_assert(spread <= err + unc + 1e-7);
        worst = fmax(worst, spread);
    }
    ck_assert_double_eq_tol(worst, err + unc, 1e-7);
    cxl_pair_load_free(l);
}
END_TEST

START_TEST(test_load_model_abcd)
{
    /* the physical model's complex gamma and Z0 in the lossy ABCD form */
    cxl_loss_model *m = NULL;
    cxl_pair_load *l = NULL;
    ck_assert_int_eq(cxl_loss_model_new(0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0, &m), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_new_model(m, 21.0, 20.0, &l), CXL_OK);
    const double f = 1.83e6, len = 20.3;
    double alpha, beta, zr, zi, db, d, e, rd, rdb;
    ck_assert_int_eq(cxl_loss_model_gamma(m, f, 0, &alpha, &beta), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_z0(m, f, 0, &zr, &zi), CXL_OK);
    ck_assert_int_eq(cxl_pair_load_transfer(l, len, 0.66, f, &db, &d, &e), CXL_OK);
    ck_assert_double_eq_tol(e, beta * len * 180.0 / M_PI, 1e-9);
    abcd_delay(zr + I * zi, (alpha + I * beta) * len, 21.0 + 20.0 * I, e, &rd, &rdb);
    ck_assert_double_eq_tol(d, rd, 1e-7);
    ck_assert_double_eq_tol(db, rdb, 1e-7);
    /* outside the model's range: extrapolation refused */
    ck_assert_int_eq(cxl_pair_load_transfer(l, len, 0.66, 1.0, &db, &d, &e), CXL_EEXTRAPOLATE);
    cxl_pair_load_free(l);
    cxl_loss_model_free(m);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("pair");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, test_phase_error_example);
    tcase_add_test(tc, test_phase_error_identity);
    tcase_add_test(tc, test_reference_in_degrees);
    tcase_add_test(tc, test_max_mismatch);
    tcase_add_test(tc, test_pair_160m_passes_40m_fails);
    tcase_add_test(tc, test_pair_many_lines);
    tcase_add_test(tc, test_uncertainty);
    tcase_add_test(tc, test_pass_not_certain);
    tcase_add_test(tc, test_bad_arguments);
    tcase_add_test(tc, test_verdict_rule);
    tcase_add_test(tc, test_load_transfer_lossless_abcd);
    tcase_add_test(tc, test_load_quarter_wave);
    tcase_add_test(tc, test_load_check_matched_is_electrical);
    tcase_add_test(tc, test_load_check_mismatched);
    tcase_add_test(tc, test_load_uncertainty_corners);
    tcase_add_test(tc, test_load_model_abcd);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
