/* check_hybrid.c - in-phase combiner and transformer values (hybrid.c).
 * Beside every check value: where it comes from. */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"

static void gsl_abort(const char *reason, const char *file, int line,
                      int gsl_errno)
{
    (void)reason; (void)file; (void)line; (void)gsl_errno;
    abort();
}

START_TEST(test_inphase_values)
{
    double r, zc;
    /* Isolation resistor 2 Z, common port Z / 2: Pozar, Microwave
     * Engineering, 4th ed., sec. 7.3 (Wilkinson); 75 -> 150 and 37.5 ohm. */
    ck_assert_int_eq(cxl_hybrid_inphase(75.0, &r, &zc), CXL_OK);
    ck_assert_double_eq_tol(r, 150.0, 1e-12);
    ck_assert_double_eq_tol(zc, 37.5, 1e-12);
    ck_assert_int_eq(cxl_hybrid_inphase(50.0, &r, &zc), CXL_OK);
    ck_assert_double_eq_tol(r, 100.0, 1e-12);
    ck_assert_double_eq_tol(zc, 25.0, 1e-12);
}
END_TEST

START_TEST(test_turns_ratio)
{
    double n;
    /* A 2:1 impedance step needs sqrt(2) turns (ideal transformer,
     * Z ratio = turns ratio squared; common practice, no source). */
    ck_assert_int_eq(cxl_hybrid_turns_ratio(37.5, 75.0, &n), CXL_OK);
    ck_assert_double_eq_tol(n, 1.41421356, 1e-8);
    ck_assert_int_eq(cxl_hybrid_turns_ratio(75.0, 37.5, &n), CXL_OK);
    ck_assert_double_eq_tol(n, 0.70710678, 1e-8);
}
END_TEST

START_TEST(test_match_five_seven)
{
    double zx, swr, rl;
    /* 5:7 from 37.5 ohm: 37.5 (7/5)^2 = 73.5 ohm, SWR 75/73.5 = 1.0204
     * against 75 ohm (common practice, no source); return loss
     * -20 log10(1.5/148.5) = 39.91 dB (Gamma = (Zx - Z)/(Zx + Z)). */
    ck_assert_int_eq(cxl_hybrid_match(37.5, 75.0, 5, 7, &zx, &swr, &rl),
                     CXL_OK);
    ck_assert_double_eq_tol(zx, 73.5, 1e-12);
    ck_assert_double_eq_tol(swr, 75.0 / 73.5, 1e-12);
    ck_assert_double_eq_tol(swr, 1.02, 0.001);
    ck_assert_double_eq_tol(rl, -20.0 * log10(1.5 / 148.5), 1e-9);
    ck_assert_double_eq_tol(rl, 39.91, 0.01);
    /* A perfect match reports the clamp, not infinity. */
    ck_assert_int_eq(cxl_hybrid_match(37.5, 75.0, 1, 1, &zx, &swr, &rl),
                     CXL_OK);
    ck_assert_double_eq_tol(swr, 2.0, 1e-12);   /* 75/37.5 */
    ck_assert_int_eq(cxl_hybrid_match(75.0, 75.0, 3, 3, &zx, &swr, &rl),
                     CXL_OK);
    ck_assert_double_eq(swr, 1.0);
    ck_assert_double_eq(rl, CXL_DB_LIMIT);
}
END_TEST

START_TEST(test_turns_search)
{
    unsigned p[6], q[6];
    size_t n = 0;
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 12, 6, p, q, &n),
                     CXL_OK);
    ck_assert_uint_eq(n, 6);
    /* 5:7 (73.5 ohm) and 7:10 (76.53 ohm) have the same |Gamma| = 1/99
     * because (7/5)(10/7) = 2 makes the two impedances reciprocal about
     * 75 ohm; the tie goes to fewer turns (ranking defined in coaxline.h). */
    ck_assert_uint_eq(p[0], 5);
    ck_assert_uint_eq(q[0], 7);
    ck_assert_uint_eq(p[1], 7);
    ck_assert_uint_eq(q[1], 10);
    /* Next: 8:11 gives 70.90 ohm; nothing else with both <= 12 is closer
     * to sqrt(2) in |Gamma| (checked by the ordering below). */
    ck_assert_uint_eq(p[2], 8);
    ck_assert_uint_eq(q[2], 11);
    double last = 0.0;
    for (size_t i = 0; i < n; i++) {
        double zx, swr, rl;
        ck_assert_int_eq(cxl_hybrid_match(37.5, 75.0, p[i], q[i], &zx, &swr,
                                          &rl), CXL_OK);
        double g = fabs((zx - 75.0) / (zx + 75.0));
        ck_assert(g >= last - 1e-12);
        last = g;
        for (unsigned k = 2; k <= 12; k++)
            ck_assert(p[i] % k || q[i] % k);   /* lowest terms */
    }
    /* Capacity larger than the candidates: max_turns 1 gives only 1:1. */
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 1, 6, p, q, &n),
                     CXL_OK);
    ck_assert_uint_eq(n, 1);
    ck_assert_uint_eq(p[0], 1);
    ck_assert_uint_eq(q[0], 1);
}
END_TEST

START_TEST(test_response)
{
    double c, iso;
    /* All ports matched, one input active: half the power reaches the
     * common port, -3.01 dB; the inputs are perfectly isolated (ideal
     * Wilkinson S-matrix, Pozar, Microwave Engineering, 4th ed., sec. 7.3). */
    ck_assert_int_eq(cxl_hybrid_response(0.0, 0.0, 0.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(c, 10.0 * log10(0.5), 1e-12);
    ck_assert_double_eq(iso, CXL_DB_LIMIT);
    /* Open common port: b3 = S31 * 1 * S12 = 1/2, isolation 6.02 dB
     * (derived from the same S-matrix); no power into an open. */
    ck_assert_int_eq(cxl_hybrid_response(1.0, 0.0, 0.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(iso, 20.0 * log10(2.0), 1e-12);
    ck_assert_double_eq(c, -CXL_DB_LIMIT);
    /* Shorted common port: same magnitude. */
    ck_assert_int_eq(cxl_hybrid_response(-1.0, 0.0, 0.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(iso, 6.0206, 1e-4);   /* 20 log10 2, |b3| = 1/2 */
    /* Common port return loss 20 dB (|Gamma| = 0.1): isolation
     * 6.02 + 20 = 26.02 dB (same derivation). */
    ck_assert_int_eq(cxl_hybrid_response(0.0, 0.1, 0.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(iso, 20.0 * log10(2.0) + 20.0, 1e-9);
    /* An open idle input with the common port matched changes nothing:
     * S33 = S32 = 0, so no wave leaves port 3 (same S-matrix). */
    ck_assert_int_eq(cxl_hybrid_response(0.0, 0.0, 1.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(c, 10.0 * log10(0.5), 1e-12);
    ck_assert_double_eq(iso, CXL_DB_LIMIT);
    /* Both open: b1 = s/(1 - 1/2) = sqrt(2), b3 = 1: 0 dB isolation. */
    ck_assert_int_eq(cxl_hybrid_response(1.0, 0.0, 1.0, 0.0, &c, &iso),
                     CXL_OK);
    ck_assert_double_eq_tol(iso, 0.0, 1e-12);
}
END_TEST

START_TEST(test_invalid_arguments)
{
    double a = 7.0, b = 8.0, c;
    unsigned p[2], q[2];
    size_t n;
    ck_assert_int_eq(cxl_hybrid_inphase(0.0, &a, &b), CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_inphase(NAN, &a, &b), CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_inphase(75.0, NULL, &b), CXL_EINVAL);
    ck_assert_double_eq(a, 7.0);   /* untouched on failure */
    ck_assert_double_eq(b, 8.0);
    ck_assert_int_eq(cxl_hybrid_turns_ratio(-37.5, 75.0, &a), CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_turns_ratio(37.5, INFINITY, &a), CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_match(37.5, 75.0, 0, 7, &a, &b, &c),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_match(37.5, NAN, 5, 7, &a, &b, &c),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 12, 0, p, q, &n),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 0, 2, p, q, &n),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 1000, 2, p, q, &n),
                     CXL_ERANGE);
    ck_assert_int_eq(cxl_hybrid_turns_search(37.5, 75.0, 12, 2, NULL, q, &n),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_response(1.1, 0.0, 0.0, 0.0, &a, &b),
                     CXL_EINVAL);   /* |Gamma| > 1: not a passive load */
    ck_assert_int_eq(cxl_hybrid_response(0.0, 0.0, NAN, 0.0, &a, &b),
                     CXL_EINVAL);
    ck_assert_int_eq(cxl_hybrid_response(0.0, 0.0, 0.0, 0.0, NULL, &b),
                     CXL_EINVAL);
}
END_TEST

int main(void)
{
    gsl_set_error_handler(gsl_abort);
    Suite *s = suite_create("hybrid");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, test_inphase_values);
    tcase_add_test(tc, test_turns_ratio);
    tcase_add_test(tc, test_match_five_seven);
    tcase_add_test(tc, test_turns_search);
    tcase_add_test(tc, test_response);
    tcase_add_test(tc, test_invalid_arguments);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
