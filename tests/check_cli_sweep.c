/* check_cli_sweep - end-to-end tests of `coaxline sweep` on sweeps that
 * scikit-rf writes at test time (tests/sweep_gen.py): a 7.3 m open line
 * with VF(f) = 0.70 - 30/sqrt(f), loss 2e-6 sqrt(f) + 1e-10 f dB/m and
 * Z0 52 ohm, swept 1-61 MHz in 121 points. */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

static char g_dir[256];
static char g_args[1024];

static const char *in_dir(const char *fmt, const char *file)
{
    static char buf[1024];
    char path[512];
    snprintf(path, sizeof path, "%s/f/%s", g_dir, file);
    snprintf(buf, sizeof buf, fmt, path);
    return buf;
}

START_TEST(text_summary_and_resonances)
{
    cli_result r = run_cli(NULL, in_dir("sweep %s --length 7.3m --label stub", "s_ri_hz.s1p"), NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "points      121, 1.000000 to 61.000000 MHz (mean step 500.000 kHz)");
    has(r.out, "Touchstone 1.0, reference 50.00 ohm");
    has(r.out, "far end open");
    has(r.out, "reactance-zero  series        1");
    has(r.out, "impedance-min   series        1");
    has(r.out, "reactance-zero  parallel      1");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
    /* --file and the bare argument are the same */
    cli_result a = run_cli(NULL, in_dir("sweep %s --format csv", "s_db_mhz.s1p"), NULL);
    cli_result b = run_cli(NULL, in_dir("sweep --file %s --format csv", "s_db_mhz.s1p"), NULL);
    ck_assert_int_eq(a.rc, 0);
    ck_assert_str_eq(a.out, b.out);
    cli_result_free(&a);
    cli_result_free(&b);
}
END_TEST

/* The VF of each series reactance zero with --length 7.3m against the
 * line's VF(f) = 0.70 - 30/sqrt(f) there: within 0.1 % (tests/sweep_gen.py
 * model; VF = 4 L f / ((2n - 1) c), DESIGN.md). */
START_TEST(csv_vf_within_a_tenth_of_a_percent)
{
    cli_result r = run_cli(NULL, in_dir("sweep %s --length 7.3m --kind reactance-zero "
                                        "--format csv", "z_ri.s1p"), NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert(strncmp(r.out, "label,file,points,start_mhz,stop_mhz,reference_ohm,kind,resonance,"
                             "order,freq_mhz,uncertainty_khz,r_ohm,z_ohm,swr,vf\n", 111) == 0);
    python_holds_text("import csv,sys,math\n"
                      "rows=list(csv.DictReader(open(sys.argv[1])))\n"
                      "s=[r for r in rows if r[\"resonance\"]==\"series\"]\n"
                      "assert len(s)==4, len(s)\n"
                      "for k,r in enumerate(s):\n"
                      "  f=float(r[\"freq_mhz\"])*1e6\n"
                      "  assert int(r[\"order\"])==k+1\n"
                      "  vf=0.70-30/math.sqrt(f)\n"
                      "  assert abs(float(r[\"vf\"])/vf-1)<1e-3, (r, vf)\n"
                      "  assert float(r[\"uncertainty_khz\"])==250\n", r.out);
    cli_result_free(&r);
}
END_TEST

START_TEST(json_parses)
{
    cli_result r = run_cli(NULL, in_dir("sweep %s --format json --label 'a \"b\"'", "v2_s.ts"), NULL);
    ck_assert_int_eq(r.rc, 0);
    json_holds(r.out, "len(d) >= 8 and d[0][\"label\"] == \"a \\\"b\\\"\" and "
                      "d[0][\"reference_ohm\"] == 75 and d[0][\"points\"] == 121");
    cli_result_free(&r);
}
END_TEST

START_TEST(swr_column_says_what_it_cannot_give)
{
    cli_result r = run_cli(NULL, in_dir("sweep %s", "swr.csv"), NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "an swr column gives the size of the mismatch only");
    lacks(r.out, "reactance-zero");
    lacks(r.out, "impedance-min");
    cli_result_free(&r);
}
END_TEST

START_TEST(plot_marks_resonances)
{
    char svg[600];
    snprintf(svg, sizeof svg, "%s/p.svg", g_dir);
    snprintf(g_args, sizeof g_args, "sweep %s/f/s_ma_khz.s1p --plot %s --kind reactance-zero",
             g_dir, svg);
    cli_result r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    cli_result_free(&r);
    /* four series reactance zeros marked 1-4, |Z| and the phase drawn */
    svg_holds(svg, "assert len(rects) == 4, len(rects)\n"
                   "assert len(paths) == 2\n"
                   "assert all(str(k) in texts for k in (1, 2, 3, 4))\n"
                   "assert \"phase (deg)\" in texts");
    snprintf(g_args, sizeof g_args, "sweep %s/f/swr.csv --plot %s", g_dir, svg);
    r = run_cli(NULL, g_args, NULL);
    ck_assert_int_eq(r.rc, 0);
    svg_holds(svg, "assert len(paths) == 1\nassert \"SWR\" in texts");
    cli_result_free(&r);
}
END_TEST

START_TEST(batch_of_files)
{
    char csv[1400];
    snprintf(csv, sizeof csv, "label,file,end\nfirst,%s/f/rx.csv,open\nsecond,%s/f/zdeg.csv,open\n"
             "third,%s/f/none.csv,open\n", g_dir, g_dir, g_dir);
    cli_result r = run_cli(NULL, "sweep --input - --format csv", csv);
    ck_assert_int_eq(r.rc, 2);
    has(r.out, "\nfirst,");
    has(r.out, "\nsecond,");
    has(r.err, "line 4: file: cannot open");
    ck_assert_int_eq(count_lines(r.err), 1);
    cli_result_free(&r);
}
END_TEST

START_TEST(bad_file_names_file_and_line)
{
    cli_result r = run_cli_with_file("sweep %s", "# MHz S RI R 50\n1 0.1 0.2\n0.5 0.1 0.2\n", 38);
    ck_assert_int_eq(r.rc, 2);
    has(r.err, "coaxline: sweep: file: ");
    has(r.err, ":3: frequency 500000 Hz is not above the previous 1000000 Hz (expected "
               "increasing frequencies)");
    ck_assert_str_eq(r.out, "");
    cli_result_free(&r);
}
END_TEST

START_TEST(same_bytes_in_comma_locale)
{
    char a[3][1024];
    snprintf(a[0], sizeof a[0], "sweep %s/f/s_ri_hz.s1p --length 7.3m", g_dir);
    snprintf(a[1], sizeof a[1], "sweep %s/f/sdb.csv --format csv", g_dir);
    snprintf(a[2], sizeof a[2], "sweep %s/f/y_ma.s1p --format json --end short", g_dir);
    const char *cases[3] = { a[0], a[1], a[2] };
    expect_same_bytes_in_comma_locale(cases, 3, 0);
}
END_TEST

static Suite *suite(void)
{
    Suite *s = suite_create("cli_sweep");
    TCase *tc = tcase_create("sweep");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, text_summary_and_resonances);
    tcase_add_test(tc, csv_vf_within_a_tenth_of_a_percent);
    tcase_add_test(tc, json_parses);
    tcase_add_test(tc, swr_column_says_what_it_cannot_give);
    tcase_add_test(tc, plot_marks_resonances);
    tcase_add_test(tc, batch_of_files);
    tcase_add_test(tc, bad_file_names_file_and_line);
    tcase_add_test(tc, same_bytes_in_comma_locale);
    suite_add_tcase(s, tc);
    return s;
}

int main(void)
{
    static const char *const gen[] = { "formats '%s/f'" };
    return run_suite_with_sweeps(suite(), g_dir, sizeof g_dir, "check_cli_sweep", gen,
                                 sizeof gen / sizeof gen[0]);
}
