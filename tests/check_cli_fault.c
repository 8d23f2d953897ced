/* check_cli_fault - end-to-end tests of `coaxline fault` on the run of
 * tests/sweep_gen.py fault (scikit-rf): 1.5 m of 75 ohm cable spliced into
 * a 50 ohm line at 12 m, the far end open at 21.5 m, VF 0.66; the profile
 * against scikit-rf's own time-domain transform of the same file. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

static char g_dir[256];
static char g_args[2048];

START_TEST(peaks_in_text_and_csv)
{
    snprintf(g_args, sizeof g_args, "fault %s/lowpass.s1p --vf 0.66 --label run", g_dir);
    cli_result r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "mode        low-pass (0.500000 to 500.000000 MHz in 500.000 kHz steps)");
    /* 0.66 c / (2 x 500 MHz) and 0.66 c / (2 x 0.5 MHz), hand computed */
    has(r.out, "resolution  0.198 m");
    has(r.out, "range       197.863 m");
    has(r.out, "12.000 m (39 ft 4 7/16 in)");
    has(r.out, "13.500 m (44 ft 3 1/2 in)");
    has(r.out, "21.500 m (70 ft 6 7/16 in)");
    cli_result_free(&r);
    snprintf(g_args, sizeof g_args, "fault %s/bandpass.s1p --vf 0.66 --format csv", g_dir);
    r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    python_holds_text("import csv,sys\n"
                      "rows=list(csv.DictReader(open(sys.argv[1])))\n"
                      "assert all(r[\"row\"]==\"peak\" and r[\"mode\"]==\"band-pass\" for r in rows)\n"
                      "d=[float(r[\"distance_m\"]) for r in rows]\n"
                      "res=float(rows[0][\"resolution_m\"])\n"
                      "for want in (12.0,13.5,21.5):\n"
                      "  assert min(abs(x-want) for x in d) < res/4, (want, d)\n"
                      "for r in rows:\n"
                      "  assert abs(float(r[\"distance_ft\"])*0.3048-float(r[\"distance_m\"]))<1e-3\n",
                      r.out);
    cli_result_free(&r);
}
END_TEST

/* The low-pass impulse response with no window against scikit-rf 0.15.4's
 * Network.impulse_response(window=None, n=N) of the same file (from 0 Hz):
 * numpy's irfft scaled by 1/N where coaxline divides by the window's sum
 * (2 x 1000 - 1 for a rectangular window), so the two agree after that
 * factor, point for point over the first half period. */
START_TEST(profile_matches_scikit_rf)
{
    snprintf(g_args, sizeof g_args, "fault %s/dc.s1p --vf 0.66 --window none --profile "
             "--format csv", g_dir);
    cli_result r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    char code[2048];
    snprintf(code, sizeof code,
             "import csv,sys,numpy as np,skrf\n"
             "rows=[r for r in csv.DictReader(open(sys.argv[1])) if r[\"row\"]==\"profile\"]\n"
             "mine=np.array([float(r[\"reflection\"]) for r in rows])\n"
             "n=len(mine)\n"
             "assert n==8192, n\n"
             "net=skrf.Network(\"%s/dc.s1p\")\n"
             "t,y=net.impulse_response(window=None,n=n,pad=0)\n"
             "ref=y[n//2:]*n/(2*len(net)-1)\n"
             "err=np.max(np.abs(mine[:len(ref)]-ref))\n"
             "assert err < 2e-6, err\n"
             "assert np.max(np.abs(ref)) > 0.5\n", g_dir);
    python_holds_text(code, r.out);
    cli_result_free(&r);
}
END_TEST

START_TEST(plot_in_feet)
{
    char svg[600];
    snprintf(svg, sizeof svg, "%s/f.svg", g_dir);
    snprintf(g_args, sizeof g_args, "fault %s/lowpass.s1p --vf 0.66 --units imperial --plot %s",
             g_dir, svg);
    cli_result r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    cli_result_free(&r);
    /* 12 m = 39.37 ft (12 / 0.3048) marked */
    svg_holds(svg, "assert \"distance (ft)\" in texts\nassert \"39.37\" in texts\n"
                   "assert len(paths) == 1");
}
END_TEST

START_TEST(same_bytes_in_comma_locale)
{
    char a[2][1024];
    snprintf(a[0], sizeof a[0], "fault %s/lowpass.s1p --vf 0.66 --window kaiser --beta 8", g_dir);
    snprintf(a[1], sizeof a[1], "fault %s/bandpass.s1p --vf 0.66 --format json", g_dir);
    const char *cases[2] = { a[0], a[1] };
    expect_same_bytes_in_comma_locale(cases, 2, 0);
}
END_TEST

static Suite *suite(void)
{
    Suite *s = suite_create("cli_fault");
    TCase *tc = tcase_create("fault");
    tcase_set_timeout(tc, 90);
    tcase_add_test(tc, peaks_in_text_and_csv);
    tcase_add_test(tc, profile_matches_scikit_rf);
    tcase_add_test(tc, plot_in_feet);
    tcase_add_test(tc, same_bytes_in_comma_locale);
    suite_add_tcase(s, tc);
    return s;
}

int main(void)
{
    static const char *const gen[] = { "fault '%s'" };
    return run_suite_with_sweeps(suite(), g_dir, sizeof g_dir, "check_cli_fault", gen,
                                 sizeof gen / sizeof gen[0]);
}
