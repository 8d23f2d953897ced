/* check_line.c - delay, length and electrical degrees. */
#include <config.h>
#include <check.h>
#include <float.h>
#include <math.h>
#include <stdlib.h>
#include "coaxline.h"

#define REL(x) (8 * DBL_EPSILON * fabs(x))

START_TEST(speed_of_light)
{
    /* SI Brochure, 9th ed. (BIPM 2019), sec. 2.3.1: c = 299 792 458 m/s exactly */
    ck_assert_double_eq(CXL_C_M_PER_S, 299792458.0);
}
END_TEST

START_TEST(identities)
{
    /* v = VF * c (any transmission-line text, e.g. Pozar, Microwave
     * Engineering, 4th ed., sec. 2.1: v_p = 1/sqrt(LC) = c/sqrt(eps_r));
     * delay = L / v; degrees = 360 f delay.  Round trips must be exact to
     * a few ulps. */
    const double vfs[] = { 0.66, 0.78, 0.83, 1.0 };
    const double lens[] = { 0.05, 8.0, 61.5, 400.0 };
    const double freqs[] = { 137e3, 1.83e6, 7.1e6, 50.1e6 };
    for (size_t i = 0; i < 4; i++)
        for (size_t j = 0; j < 4; j++)
            for (size_t k = 0; k < 4; k++) {
                double d, l, deg, l2, deg2;
                ck_assert_int_eq(cxl_line_delay_from_length(lens[j], vfs[i], &d), CXL_OK);
                ck_assert_int_eq(cxl_line_length_from_delay(d, vfs[i], &l), CXL_OK);
                ck_assert_double_eq_tol(l, lens[j], REL(lens[j]));
                ck_assert_int_eq(cxl_line_degrees_from_length(lens[j], vfs[i], freqs[k], &deg), CXL_OK);
                ck_assert_int_eq(cxl_line_degrees_from_delay(d, freqs[k], &deg2), CXL_OK);
                ck_assert_double_eq_tol(deg, deg2, REL(deg));
                ck_assert_int_eq(cxl_line_length_from_degrees(deg, vfs[i], freqs[k], &l2), CXL_OK);
                ck_assert_double_eq_tol(l2, lens[j], REL(lens[j]));
            }
}
END_TEST

START_TEST(hand_worked_cut)
{
    /* Hand worked with c exact (SI) and v = VF c:
     * offset 10 m -> delay 10/299792458 s = 33.3564 ns;
     * cable for the same delay at VF 0.80: 0.80 * 10 = 8.000 m;
     * 360 * 1.83e6 * 33.3564e-9 = 21.9752 degrees;
     * open stub first series resonance at a quarter wave (Pozar, 4th ed.,
     * sec. 2.3, Z_in = -j Z0 cot(beta l) = 0 at beta l = pi/2):
     * f = VF c / (4 L) = 0.8 * 299792458 / 32 = 7.49481 MHz. */
    double d, cut, deg, qw;
    ck_assert_int_eq(cxl_line_delay_from_offset(10.0, &d), CXL_OK);
    ck_assert_double_eq_tol(d * 1e9, 33.3564095, 1e-7);
    ck_assert_int_eq(cxl_line_cut_length(d, 0.80, 0.0, 0.80, &cut), CXL_OK);
    ck_assert_double_eq_tol(cut, 8.0, REL(8.0));
    ck_assert_int_eq(cxl_line_degrees_from_delay(d, 1.83e6, &deg), CXL_OK);
    ck_assert_double_eq_tol(deg, 21.97520, 1e-5);
    ck_assert_int_eq(cxl_line_quarter_wave_freq(cut, 0.80, &qw), CXL_OK);
    ck_assert_double_eq_tol(qw, 7494811.45, 0.01);
}
END_TEST

START_TEST(allowance)
{
    /* 0.20 m of fixture at VF 0.66 delays 0.20/(0.66 c); hand worked:
     * wanted 100 ns at VF 0.83 is 0.83 c 100 ns = 24.88277 m of cable; the
     * fixture is worth 0.20 * 0.83 / 0.66 = 0.25152 m of it -> 24.63126 m. */
    double cut;
    ck_assert_int_eq(cxl_line_cut_length(100e-9, 0.83, 0.20, 0.66, &cut), CXL_OK);
    double want = (100e-9 - 0.20 / (0.66 * CXL_C_M_PER_S)) * 0.83 * CXL_C_M_PER_S;
    ck_assert_double_eq_tol(cut, want, REL(want));
    ck_assert_double_eq_tol(cut, 24.63126, 1e-5);
    /* an allowance longer than the whole delay cannot be cut */
    ck_assert_int_eq(cxl_line_cut_length(1e-9, 0.83, 0.5, 0.83, &cut), CXL_ERANGE);
}
END_TEST

START_TEST(bad_arguments)
{
    double x = 42.0;
    ck_assert_int_eq(cxl_line_delay_from_length(1.0, 0.0, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_delay_from_length(1.0, 1.01, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_delay_from_length(-1.0, 0.8, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_delay_from_length(NAN, 0.8, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_delay_from_length(1.0, 0.8, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_degrees_from_length(1.0, 0.8, 0.0, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_degrees_from_length(1.0, 0.8, INFINITY, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_length_from_degrees(90.0, 0.8, -1.0, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_cut_length(0.0, 0.8, 0.0, 0.8, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_cut_length(1e-8, 0.8, -0.1, 0.8, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_cut_length(1e-8, 0.8, 0.1, 0.0, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_quarter_wave_freq(0.0, 0.8, &x), CXL_EINVAL);
    ck_assert_int_eq(cxl_line_delay_from_offset(NAN, &x), CXL_EINVAL);
    ck_assert_double_eq(x, 42.0); /* untouched on failure */
    ck_assert_str_eq(cxl_strerror(CXL_EINVAL), "invalid argument");
    ck_assert_str_eq(cxl_strerror((cxl_status)999), "unknown status");
}
END_TEST

START_TEST(version)
{
    char want[32];
    snprintf(want, sizeof want, "%d.%d.%d", CXL_VERSION_MAJOR, CXL_VERSION_MINOR, CXL_VERSION_PATCH);
    ck_assert_str_eq(cxl_version(), want);
    ck_assert_str_eq(CXL_VERSION_STRING, want);
    ck_assert_str_eq(PACKAGE_VERSION, want); /* configure.ac and the header agree */
}
END_TEST

int main(void)
{
    Suite *s = suite_create("line");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, speed_of_light);
    tcase_add_test(tc, identities);
    tcase_add_test(tc, hand_worked_cut);
    tcase_add_test(tc, allowance);
    tcase_add_test(tc, bad_arguments);
    tcase_add_test(tc, version);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
