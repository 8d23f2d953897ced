/* check_pair.c - phase error and pair tolerance.
 *
 * The identity tested: a line dL longer than its reference delays by
 * dL / (VF c), i.e. 360 f dL / (VF c) degrees at f (Pozar, Microwave
 * Engineering, 4th ed., sec. 2.1: phase velocity v_p = omega / beta; with
 * v_p = VF c the phase of a length l is beta l = 2 pi f l / (VF c)).
 */
#include <config.h>
#include <check.h>
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
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref + 0.10, 0.66, 90.0, 1.83e6, 3.6e6, &ph),
                     CXL_OK);
    ck_assert_double_eq_tol(ph, 0.655, 5e-4);
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref, 0.66, 0.0, 1.83e6, 3.6e6, &ph),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_phase_error_ref_deg(ref, 0.66, 90.0, NAN, 3.6e6, &ph),
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
        ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, f160[i], 2.0, 0.0, 0.0, &d, &ph, &u, &v),
                         CXL_OK);
        ck_assert_double_eq_tol(d, 0.30, 1e-12);          /* 20.30 - 20.00 */
        ck_assert_double_eq_tol(ph, want160[i], 5e-4);    /* hand values above */
        ck_assert_double_eq_tol(u, 0.0, 1e-12);
        ck_assert_int_eq(v, CXL_VERDICT_PASS);
    }
    const double f40[] = { 7.0e6, 7.2e6 };
    for (int i = 0; i < 2; i++) {
        ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, f40[i], 2.0, 0.0, 0.0, &d, &ph, &u, &v),
                         CXL_OK);
        ck_assert_int_eq(v, CXL_VERDICT_FAIL);
    }
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 7.0e6, 2.0, 0.0, 0.0, &d, &ph, &u, &v),
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
    ck_assert_int_eq(cxl_pair_check(len, 4, 0.66, 1.83e6, 2.0, 0.0, 0.0, &d, &ph, &u, &v),
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
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 2.0e6, 2.0, 0.25, 0.0, &d, &ph, &u, &v),
                     CXL_OK);
    ck_assert_double_eq_tol(ph + u, 2.911, 5e-4);
    ck_assert_int_eq(v, CXL_VERDICT_PASS_UNCERTAIN);
    /* a tight tape makes it certain: 0.31 m worst = 1.128 deg */
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 2.0e6, 2.0, 0.005, 0.0, &d, &ph, &u, &v),
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
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 7.3e6, 0.6, 0.005, 0.01, &d, &e, &u, &w),
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
    ck_assert_int_eq(cxl_pair_check(len, 1, 0.66, 1.8e6, 2.0, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(NULL, 2, 0.66, 1.8e6, 2.0, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(bad, 2, 0.66, 1.8e6, 2.0, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(neg, 2, 0.66, 1.8e6, 2.0, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 1.8e6, 0.0, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 1.8e6, NAN, 0, 0, &d, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 1.8e6, 2.0, 0, 0, NULL, &ph, &u, &v),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_pair_check(len, 2, 0.66, 1.8e6, 2.0, 0, 0, &d, &ph, &u, NULL),
                     CXL_EINVAL);
    ck_assert_double_eq(d, 5.0);
    ck_assert_double_eq(ph, 5.0);
    ck_assert_double_eq(u, 5.0);
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
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
