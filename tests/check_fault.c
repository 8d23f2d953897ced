/* check_fault - distance to fault on sweeps scikit-rf writes at test time
 * (tests/sweep_gen.py fault): a 50 ohm run, VF 0.66, with 1.5 m of 75 ohm
 * cable spliced in at 12 m and the far end open at 21.5 m. */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"
#include "testutil.h"

#define C0 299792458.0
static char g_dir[256];

static cxl_sweep *load(const char *name)
{
    return load_sweep(g_dir, name);
}

/* The three changes of the run, where sweep_gen.py put them: 50 to 75 ohm
 * at 12 m (higher), back to 50 at 13.5 m (lower), open at 21.5 m (higher);
 * each found within a quarter of the resolution.  |Gamma| of a 50 to 75
 * ohm step is 25/125 = 0.2 (Pozar 4th ed. eq. 2.35, Gamma = (ZL - Z0) /
 * (ZL + Z0), from memory), less the line's loss. */
static void expect_run(const char *file, cxl_fault_window w, int lowpass_expected)
{
    cxl_sweep *s = load(file);
    cxl_fault *f = NULL;
    ck_assert_int_eq(cxl_fault_new(s, 50.0, 0.66, NULL, w, 6.0, 0.0, 0, &f), CXL_OK);
    int lowpass;
    double vf, res, range, step, start, stop;
    ck_assert_int_eq(cxl_fault_info(f, &lowpass, &vf, &res, &range, &step), CXL_OK);
    ck_assert_int_eq(cxl_sweep_info(s, &start, &stop, NULL, NULL, NULL), CXL_OK);
    ck_assert_int_eq(lowpass, lowpass_expected);
    /* VF c / (2 span) and VF c / (2 step), the definitions in coaxline.h */
    double span = lowpass ? stop : stop - start;
    ck_assert_double_eq_tol(res, 0.66 * C0 / (2 * span), 1e-9 * res);
    ck_assert_double_eq_tol(range, 0.66 * C0 / (2 * step), 1e-9 * range);
    ck_assert_double_eq_tol(step, 0.5e6, 1e-3);
    const double want[3] = { 12.0, 13.5, 21.5 };
    const int sign[3] = { 1, -1, 1 };
    size_t found = 0;
    for (size_t i = 0; i < cxl_fault_peak_count(f); i++) {
        double d, refl, rl;
        int change;
        ck_assert_int_eq(cxl_fault_peak(f, i, &d, &refl, &rl, &change), CXL_OK);
        ck_assert_double_eq_tol(rl, -20 * log10(refl), 1e-9);
        for (int k = 0; k < 3; k++) {
            if (fabs(d - want[k]) > res / 4) continue;
            found |= 1u << k;
            if (lowpass) ck_assert_int_eq(change, sign[k]);
            else ck_assert_int_eq(change, 0);
            if (k < 2) ck_assert_msg(refl > 0.12 && refl < 0.21, "%s: peak %g at %g m", file,
                                     refl, d);
        }
    }
    ck_assert_msg(found == 7, "%s window %d: found mask %zu", file, (int)w, found);
    /* nothing else before the end stands out (beyond it come the echoes
     * between the end and the splice: 23.0, 29.5, 31.0 m ...) */
    for (size_t i = 0; i < cxl_fault_peak_count(f); i++) {
        double d, refl;
        ck_assert_int_eq(cxl_fault_peak(f, i, &d, &refl, NULL, NULL), CXL_OK);
        int near = fabs(d - 12.0) < res || fabs(d - 13.5) < res || d > 21.5 - 3 * res;
        if (!near) ck_assert_msg(refl < 0.03, "%s: stray peak %g at %g m", file, refl, d);
    }
    cxl_fault_free(f);
    cxl_sweep_free(s);
}

START_TEST(lowpass_finds_the_splice_and_the_end)
{
    expect_run("lowpass.s1p", CXL_FAULT_HANN, 1);
    expect_run("lowpass.s1p", CXL_FAULT_KAISER, 1);
    expect_run("noisy.s1p", CXL_FAULT_HANN, 1);
}
END_TEST

START_TEST(bandpass_finds_them_too)
{
    expect_run("bandpass.s1p", CXL_FAULT_HANN, 0);
    expect_run("bandpass.s1p", CXL_FAULT_KAISER, 0);
}
END_TEST

START_TEST(step_response_is_the_impedance_seen)
{
    /* low-pass step response: about 0 (50 ohm) before 12 m, about +0.2
     * (75 ohm seen through a 50 ohm reference, Gamma = 0.2) between 12.3
     * and 13.2 m, about 0 again up to the open end */
    cxl_sweep *s = load("lowpass.s1p");
    cxl_fault *f = NULL;
    ck_assert_int_eq(cxl_fault_new(s, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &f), CXL_OK);
    for (size_t i = 0; i < cxl_fault_count(f); i++) {
        double d, stp;
        ck_assert_int_eq(cxl_fault_point(f, i, &d, NULL, NULL, &stp), CXL_OK);
        if (d > 1.0 && d < 11.5) ck_assert_msg(fabs(stp) < 0.03, "%g m: %g", d, stp);
        if (d > 12.4 && d < 13.1) ck_assert_msg(fabs(stp - 0.2) < 0.03, "%g m: %g", d, stp);
        if (d > 14.0 && d < 21.0) ck_assert_msg(fabs(stp) < 0.04, "%g m: %g", d, stp);
    }
    /* forcing band-pass gives no step and no sign */
    cxl_fault *b = NULL;
    ck_assert_int_eq(cxl_fault_new(s, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0, 0, CXL_FAULT_BANDPASS,
                                   &b), CXL_OK);
    int lowpass = 9;
    ck_assert_int_eq(cxl_fault_info(b, &lowpass, NULL, NULL, NULL, NULL), CXL_OK);
    ck_assert_int_eq(lowpass, 0);
    cxl_fault_free(b);
    cxl_fault_free(f);
    cxl_sweep_free(s);
}
END_TEST

START_TEST(loss_compensation_raises_far_peaks)
{
    /* the loss sweep_gen.py put in: 2e-6 sqrt(f) dB/m, at mid-band
     * (250 MHz) 0.0316 dB/m; compensated, the open end (|Gamma| 1 seen
     * through the splice twice: (1 - 0.2^2)^2 = 0.92) comes out near 0.92 */
    cxl_sweep *s = load("lowpass.s1p");
    double loss = 2e-6 * sqrt(250.25e6), plain = 0, comp = 0;
    for (int k = 0; k < 2; k++) {
        cxl_fault *f = NULL;
        ck_assert_int_eq(cxl_fault_new(s, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0, k ? loss : 0.0, 0,
                                       &f), CXL_OK);
        for (size_t i = 0; i < cxl_fault_peak_count(f); i++) {
            double d, refl;
            ck_assert_int_eq(cxl_fault_peak(f, i, &d, &refl, NULL, NULL), CXL_OK);
            if (fabs(d - 21.5) < 0.1) *(k ? &comp : &plain) = refl;
        }
        cxl_fault_free(f);
    }
    ck_assert(plain > 0.5 && plain < 0.85);
    ck_assert_msg(fabs(comp - 0.92) < 0.05, "compensated %g", comp);
    cxl_sweep_free(s);
}
END_TEST

START_TEST(refused_sweeps)
{
    cxl_fault *f = (cxl_fault *)&f;
    const char uneven[] = "# MHz S RI R 50\n1 0.1 0.2\n2 0.1 0.2\n4 0.1 0.2\n";
    const char swr[] = "freq_mhz,swr\n1,1.5\n2,1.6\n3,1.7\n";
    const char one[] = "# MHz S RI R 50\n1 0.1 0.2\n";
    cxl_sweep *s = NULL;
    ck_assert_int_eq(cxl_sweep_read_buffer(uneven, sizeof uneven - 1, &s, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_fault_new(s, 50, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &f),
                     CXL_EINCONSISTENT);
    cxl_sweep_free(s);
    ck_assert_int_eq(cxl_sweep_read_buffer(swr, sizeof swr - 1, &s, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_fault_new(s, 50, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &f), CXL_ENOTFOUND);
    cxl_sweep_free(s);
    ck_assert_int_eq(cxl_sweep_read_buffer(one, sizeof one - 1, &s, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_fault_new(s, 50, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &f), CXL_ERANGE);
    ck_assert_int_eq(cxl_fault_new(s, 50, 0.0, NULL, CXL_FAULT_HANN, 0, 0, 0, &f), CXL_EINVAL);
    cxl_sweep_free(s);
    ck_assert_ptr_eq(f, (cxl_fault *)&f);
}
END_TEST

static Suite *suite(void)
{
    Suite *s = suite_create("fault");
    TCase *tc = tcase_create("fault");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, lowpass_finds_the_splice_and_the_end);
    tcase_add_test(tc, bandpass_finds_them_too);
    tcase_add_test(tc, step_response_is_the_impedance_seen);
    tcase_add_test(tc, loss_compensation_raises_far_peaks);
    tcase_add_test(tc, refused_sweeps);
    suite_add_tcase(s, tc);
    return s;
}

int main(void)
{
    gsl_set_error_handler(NULL);
    static const char *const gen[] = { "fault '%s'" };
    return run_suite_with_sweeps(suite(), g_dir, sizeof g_dir, "check_fault", gen,
                                 sizeof gen / sizeof gen[0]);
}
