/* check_drift - velocity factor against frequency: the 1/sqrt(f) trend
 * fitted to resonances synthesized with the library's physical model. */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"

START_TEST(exact_law_is_recovered)
{
    /* points on VF = 0.66 - 0.5 / sqrt(f) exactly: a least-squares line
     * through collinear points returns that line (common practice, no
     * source); 0.5 / sqrt(1.83e6) = 3.696e-4 (hand computed) */
    const double f[4] = { 2.0e6, 6.0e6, 10.0e6, 14.0e6 };
    double v[4];
    for (int i = 0; i < 4; i++) v[i] = 0.66 - 0.5 / sqrt(f[i]);
    cxl_drift *d = NULL;
    ck_assert_int_eq(cxl_drift_new(f, v, NULL, 4, &d), CXL_OK);
    double hf, drop, vf, err, lo, hi;
    ck_assert_int_eq(cxl_drift_coefficients(d, &hf, &drop), CXL_OK);
    ck_assert_double_eq_tol(hf, 0.66, 1e-12);   /* the law's constant */
    ck_assert_double_eq_tol(drop, 0.5, 1e-9);   /* the law's 1/sqrt(f) term */
    ck_assert_int_eq(cxl_drift_vf(d, 1.83e6, &vf, &err), CXL_OK);
    ck_assert_double_eq_tol(vf, 0.66 - 3.696e-4, 1e-7);
    /* no scatter; 1.83 MHz lies below the readings, so only the law term
     * of drift.c remains: 0.25 drop (1/sqrt(1.83e6) - 1/sqrt(2e6)) =
     * 0.25 * 0.5 * 3.21145e-5 = 4.0143e-6 (hand computed) */
    ck_assert_double_eq_tol(err, 4.0143e-6, 1e-9);
    ck_assert_int_eq(cxl_drift_vf(d, 5e6, &vf, &err), CXL_OK);
    ck_assert_double_eq_tol(err, 0.0, 1e-12); /* inside the readings: none */
    ck_assert_int_eq(cxl_drift_range(d, &lo, &hi), CXL_OK);
    ck_assert_double_eq(lo, 2.0e6);    /* lowest reading */
    ck_assert_double_eq(hi, 14.0e6);   /* highest reading */
    cxl_drift_free(d);
    /* with stated errors the prediction carries one, larger away from the
     * readings (variance [1 x] Cov [1 x]^T grows with x) */
    const double e[4] = { 1e-4, 5e-5, 3e-5, 2e-5 };
    double err_in, err_out;
    ck_assert_int_eq(cxl_drift_new(f, v, e, 4, &d), CXL_OK);
    ck_assert_int_eq(cxl_drift_vf(d, 8e6, &vf, &err_in), CXL_OK);
    ck_assert_int_eq(cxl_drift_vf(d, 0.5e6, &vf, &err_out), CXL_OK);
    ck_assert(err_in > 0.0 && err_out > err_in);
    cxl_drift_free(d);
}
END_TEST

/* Resonances of an open stub of a catalog cable, per-reading VFs from the
 * stub fit, the drift trend, and the VF at target against the model's own
 * phase velocity there; returns |trend - model| and |mean - model|. */
static void synthesize(const char *cable, double length_m, int orders, double target_hz,
                       double *err_trend, double *err_mean)
{
    cxl_catalog *cat;
    cxl_loss_model *m;
    size_t idx;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, cable, &idx), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, idx, &m), CXL_OK);
    cxl_stub *s;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    for (int n = 1; n <= orders; n++) {
        double f;
        ck_assert_int_eq(cxl_transfer_stub_resonance(m, 0, CXL_STUB_OPEN, n, length_m, &f),
                         CXL_OK);
        ck_assert_int_eq(cxl_stub_add_reading(s, length_m, f, n), CXL_OK);
    }
    cxl_stub_result *r;
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_OK);
    double mean = 0.0, v;
    for (int i = 0; i < orders; i++) {
        ck_assert_int_eq(cxl_stub_result_reading(r, (size_t)i, NULL, NULL, NULL, &v, NULL, NULL),
                         CXL_OK);
        mean += v / orders;
    }
    cxl_drift *d;
    ck_assert_int_eq(cxl_drift_new_stub(r, 0.0, &d), CXL_OK);
    double truth, trend, hf, drop;
    ck_assert_int_eq(cxl_loss_model_vf(m, target_hz, 0, &truth), CXL_OK);
    ck_assert_int_eq(cxl_drift_vf(d, target_hz, &trend, NULL), CXL_OK);
    ck_assert_int_eq(cxl_drift_coefficients(d, &hf, &drop), CXL_OK);
    *err_trend = fabs(trend - truth);
    *err_mean = fabs(mean - truth);
    printf("%-10s %4.1f m, orders 1-%d, VF at %.3f MHz: model %.6f, trend %.6f (err %.1e), "
           "mean %.6f (err %.1e); vf_hf %.5f, drop %.2f sqrt(Hz)\n",
           cable, length_m, orders, target_hz / 1e6, truth, trend, *err_trend, mean,
           *err_mean, hf, drop);
    cxl_drift_free(d);
    cxl_stub_result_free(r);
    cxl_stub_free(s);
    cxl_loss_model_free(m);
    cxl_catalog_free(cat);
}

START_TEST(trend_beats_the_average)
{
    /* The model's phase velocity falls toward low frequency with the
     * internal inductance (DESIGN.md; REFERENCES.md: Ramo, Whinnery and Van
     * Duzer, 3rd ed., ch. 5); the trend must predict the VF at a target
     * frequency better than the plain average of the readings.  Targets
     * below, between and above the readings. */
    double et, em;
    synthesize("RG-213", 20.0, 4, 1.83e6, &et, &em); /* below 2.47 MHz: extrapolated */
    ck_assert(et < em);
    synthesize("RG-213", 20.0, 4, 10.1e6, &et, &em);
    ck_assert(et < em);
    synthesize("RG-58", 27.0, 3, 1.83e6, &et, &em);
    ck_assert(et < em);
    synthesize("RG-6-foam", 30.0, 3, 3.6e6, &et, &em);
    ck_assert(et < em);
    synthesize("RG-213", 20.0, 4, 28.5e6, &et, &em); /* above: extrapolated upward */
    ck_assert(et < em);
    /* a clad centre does not follow the 1/sqrt(f) law below its crossover
     * (18.8 MHz): figures printed, no claim */
    synthesize("RG-6-CCS", 30.0, 3, 1.83e6, &et, &em);
}
END_TEST

START_TEST(bad_arguments)
{
    const double f[2] = { 2e6, 6e6 }, v[2] = { 0.66, 0.661 }, bad_v[2] = { 0.66, 1.2 };
    const double same[2] = { 2e6, 2e6 }, bad_e[2] = { 1e-4, 0.0 };
    cxl_drift *d = (cxl_drift *)0x1;
    ck_assert_int_eq(cxl_drift_new(f, v, NULL, 1, &d), CXL_ERANGE);
    ck_assert_int_eq(cxl_drift_new(same, v, NULL, 2, &d), CXL_ERANGE);
    ck_assert_int_eq(cxl_drift_new(f, bad_v, NULL, 2, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_new(f, v, bad_e, 2, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_new(NULL, v, NULL, 2, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_new(f, v, NULL, 0, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_new(f, v, NULL, 2, NULL), CXL_EINVAL);
    ck_assert_ptr_eq(d, (cxl_drift *)0x1); /* untouched */
    ck_assert_int_eq(cxl_drift_new_stub(NULL, 0.0, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_new(f, v, NULL, 2, &d), CXL_OK);
    double x, e;
    ck_assert_int_eq(cxl_drift_vf(d, 0.0, &x, &e), CXL_EINVAL);
    ck_assert_int_eq(cxl_drift_vf(d, NAN, &x, &e), CXL_EINVAL);
    /* the trend leaves (0, 1] far below the readings: a VF rising by 0.001
     * from 2 to 6 MHz is 0.6624 - 0.003346 / sqrt(f in MHz), zero near
     * 25 Hz (hand computed) */
    ck_assert_int_eq(cxl_drift_vf(d, 100.0, &x, &e), CXL_OK);
    ck_assert_int_eq(cxl_drift_vf(d, 10.0, &x, &e), CXL_ERANGE);
    ck_assert_int_eq(cxl_drift_coefficients(d, NULL, &x), CXL_EINVAL);
    cxl_drift_free(d);
    cxl_drift_free(NULL);
}
END_TEST

int main(void)
{
    gsl_set_error_handler(NULL); /* GSL's default: abort, so a stray error is loud */
    Suite *s = suite_create("drift");
    TCase *tc = tcase_create("drift");
    tcase_set_timeout(tc, 30);
    tcase_add_test(tc, exact_law_is_recovered);
    tcase_add_test(tc, trend_beats_the_average);
    tcase_add_test(tc, bad_arguments);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
