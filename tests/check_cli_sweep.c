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
    cli_result r = run_expect(in_dir("sweep %s --length 7.3m --label stub", "s_ri_hz.s1p"), 0);
    has(r.out, "points      121, 1.000000 to 61.000000 MHz (mean step 500.000 kHz)");
    has(r.out, "Touchstone 1.0, reference 50.00 ohm");
    has(r.out, "far end open");
    has(r.out, "reactance-zero  series        1");
    has(r.out, "impedance-min   series        1");
    has(r.out, "reactance-zero  parallel      1");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
    /* --file and the bare argument are the same */
    cli_result a = run_expect(in_dir("sweep %s --format csv", "s_db_mhz.s1p"), 0);
    cli_result b = run_cli(NULL, in_dir("sweep --file %s --format csv", "s_db_mhz.s1p"), NULL);
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
    cli_result r = run_expect(in_dir("sweep %s --length 7.3m --kind reactance-zero --format csv",
                                     "z_ri.s1p"), 0);
    static const char header[] = "label,file,points,start_mhz,stop_mhz,reference_ohm,kind,"
                                 "resonance,order,freq_mhz,uncertainty_khz,r_ohm,z_ohm,swr,vf,"
                                 "vf_err,loss_db_per_100m,loss_err_db_per_100m,z0_ohm,z0_err_ohm,"
                                 "fixture_m,fixture_err_m,rms_residual,max_residual,"
                                 "max_residual_mhz\n";
    ck_assert(strncmp(r.out, header, sizeof header - 1) == 0);
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

/* The line fitted to the whole sweep against sweep_gen.py's line (formats:
 * 7.3 m open, VF 0.70 - 30/sqrt(f), loss 2e-6 sqrt(f) + 1e-10 f dB/m, Z0
 * 52 ohm, no noise): VF within 0.1 % (the goal), loss within 1 %,
 * Z0 within 0.1 % (common practice, no source). */
START_TEST(fitted_line_matches_the_generated_one)
{
    cli_result r = run_expect(in_dir("sweep %s --length 7.3m --at 5MHz,20MHz,55MHz --format csv",
                                     "s_ri_hz.s1p"), 0);
    ck_assert_str_eq(r.err, "");
    python_holds_text("import csv,sys,math\n"
                      "rows=[r for r in csv.DictReader(open(sys.argv[1])) if r[\"kind\"]==\"fitted-line\"]\n"
                      "assert [float(r[\"freq_mhz\"]) for r in rows]==[5,20,55], rows\n"
                      "for r in rows:\n"
                      "  f=float(r[\"freq_mhz\"])*1e6\n"
                      "  vf=0.70-30/math.sqrt(f)\n"
                      "  loss=(2e-6*math.sqrt(f)+1e-10*f)*100\n"
                      "  assert abs(float(r[\"vf\"])/vf-1)<1e-3, (r, vf)\n"
                      "  assert abs(float(r[\"loss_db_per_100m\"])/loss-1)<1e-2, (r, loss)\n"
                      "  assert abs(float(r[\"z0_ohm\"])/52-1)<1e-3, r\n"
                      "  assert float(r[\"max_residual\"])<1e-4, r\n", r.out);
    cli_result_free(&r);
    /* text: the block and its numbers */
    r = run_expect(in_dir("sweep %s --length 7.3m --at 10MHz", "s_ri_hz.s1p"), 0);
    has(r.out, "fitted line  every point, far end open, against 50.00 ohm");
    has(r.out, "    Z0          52.00 +/- ");
    has(r.out, "     10.000000   0.69051 "); /* 0.70 - 30/sqrt(1e7) = 0.690513 */
    cli_result_free(&r);
}
END_TEST

/* A loaded line (sweep_gen.py fit: 9 m, far end 12-j30 ohm, noise 1e-3)
 * and too narrow a sweep: the fit says why there is none. */
START_TEST(fitted_line_on_a_load_and_its_limit)
{
    char args[1200];
    snprintf(args, sizeof args, "sweep %s/g/fit_load.s1p --length 9m --end load --load 12-j30 "
             "--at 30MHz --format json", g_dir);
    cli_result r = run_expect(args, 0);
    /* the truth: VF 0.70 - 20/sqrt(f), Z0 52 (sweep_gen.py fit) */
    json_holds(r.out, "[x for x in d if x[\"kind\"]==\"fitted-line\"][0][\"vf\"] - "
                      "(0.70-20/math.sqrt(30e6)) < 1e-3*0.7 and "
                      "abs([x for x in d if x[\"kind\"]==\"fitted-line\"][0][\"z0_ohm\"]-52) < 0.3");
    cli_result_free(&r);
    /* 1 to 61 MHz of a line one resonance long: write the first 20 points */
    snprintf(args, sizeof args, "head -n 14 %s/f/rx.csv > %s/short.csv", g_dir, g_dir);
    ck_assert_int_eq(system(args), 0);
    snprintf(args, sizeof args, "sweep %s/short.csv --length 7.3m", g_dir);
    r = run_expect(args, 0);
    has(r.out, "fitted line  none: fewer than two series resonances of one kind");
    cli_result_free(&r);
    snprintf(args, sizeof args, "sweep %s/short.csv --length 7.3m --format csv", g_dir);
    r = run_expect(args, 0);
    has(r.err, "warning: ");
    has(r.err, "no line fitted: fewer than two series resonances");
    lacks(r.out, "fitted-line");
    cli_result_free(&r);
}
END_TEST

/* vf --sweep and trim --sweep: the file's reactance zeros as readings,
 * against the same line (VF 0.70 - 30/sqrt(f); the keep length for 90
 * degrees at 10 MHz is VF c / (4 f) = 5.1753 m, DESIGN.md). */
START_TEST(vf_and_trim_take_the_sweep)
{
    output_holds(in_dir("vf --sweep %s --length 7.3m --end open --at 10MHz --format csv",
                        "s_ri_hz.s1p"),
                 "import csv,sys,math\n"
                 "rows=list(csv.DictReader(open(sys.argv[1])))\n"
                 "rd=[r for r in rows if r[\"resonance\"] not in (\"fit\",\"at\")]\n"
                 "assert len(rd)==4 and all(r[\"reading\"]==\"zero-x\" for r in rd), rd\n"
                 "assert [int(r[\"resonance\"]) for r in rd]==[1,2,3,4]\n"
                 "at=[r for r in rows if r[\"resonance\"]==\"at\"][0]\n"
                 "vf=0.70-30/math.sqrt(10e6)\n"
                 "assert abs(float(at[\"vf_at\"])-vf)<=float(at[\"vf_at_err\"]), at\n"
                 "assert abs(float(at[\"vf_at\"])/vf-1)<1e-3, at\n");
    output_holds(in_dir("trim --sweep %s --length 7.3m --degrees 90 --freq 10MHz --format csv",
                        "s_ri_hz.s1p"),
                 "import csv,sys\n"
                 "rows=list(csv.DictReader(open(sys.argv[1])))\n"
                 "assert len(rows)==4 and all(r[\"order_source\"]==\"sweep\" for r in rows)\n"
                 "keep=float(rows[0][\"remaining_m\"])\n"
                 "res=float(rows[0][\"remaining_res_mm\"])/1e3\n"
                 "assert abs(keep-5.1753)<=max(res,0.005), (keep,res)\n");
    /* text says where the readings came from */
    cli_result r = run_expect(in_dir("vf --sweep %s --length 7.3m --end open", "s_ri_hz.s1p"), 0);
    has(r.out, "s_ri_hz.s1p: its series resonances of this kind are the readings");
    has(r.out, "orders            from the spacing of the sweep's resonances");
    cli_result_free(&r);
}
END_TEST

/* bad() on args where %s stands for the formats' s_ri_hz.s1p */
static void bad_on_sweep(const char *args, const char *field)
{
    bad(in_dir(args, "s_ri_hz.s1p"), field);
}

START_TEST(sweep_options_refused)
{
    bad_on_sweep("vf --sweep %s --resonance 5MHz --length 7.3m --end open", "sweep");
    bad_on_sweep("vf --sweep %s --end open", "length");
    bad_on_sweep("trim --sweep %s --order 1 --length 7.3m --degrees 90 --freq 10MHz", "sweep");
    bad_also(in_dir("vf --sweep %s --length 7.3m --end open", "swr.csv"), "sweep",
             "holds no reactance");
    bad_on_sweep("sweep %s --end load --length 7.3m", "load");
    bad_on_sweep("sweep %s --load 12-j30 --length 7.3m", "load");
    bad_on_sweep("sweep %s --end load --load 12-j30", "length");
    bad_on_sweep("sweep %s --at 10MHz", "at");
    bad_on_sweep("sweep %s --fixture-vf 0.7", "fixture-vf");
    bad_on_sweep("sweep %s --length 7.3m --end load --load -5", "load");
    /* a bad file through vf and trim: file and line */
    cli_result r = run_cli_with_file("vf --sweep %s --length 7m --end open",
                                     "# MHz S RI R 50\n1 0.1 0.2\n2 0.1\n", 32);
    ck_assert_int_eq(r.rc, 2);
    has(r.err, "coaxline: vf: sweep: ");
    has(r.err, ":3: ");
    ck_assert_int_eq(count_lines(r.err), 1);
    cli_result_free(&r);
}
END_TEST

START_TEST(json_parses)
{
    cli_result r = run_expect(in_dir("sweep %s --format json --label 'a \"b\"'", "v2_s.ts"), 0);
    json_holds(r.out, "len(d) >= 8 and d[0][\"label\"] == \"a \\\"b\\\"\" and "
                      "d[0][\"reference_ohm\"] == 75 and d[0][\"points\"] == 121");
    cli_result_free(&r);
}
END_TEST

START_TEST(swr_column_says_what_it_cannot_give)
{
    cli_result r = run_expect(in_dir("sweep %s", "swr.csv"), 0);
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
    /* four series reactance zeros marked 1-4, |Z| and the phase drawn */
    plot_holds(g_args, svg, "assert len(rects) == 4, len(rects)\n"
                   "assert len(paths) == 2\n"
                   "assert all(str(k) in texts for k in (1, 2, 3, 4))\n"
                   "assert \"phase (deg)\" in texts");
    snprintf(g_args, sizeof g_args, "sweep %s/f/swr.csv --plot %s", g_dir, svg);
    plot_holds(g_args, svg, "assert len(paths) == 1\nassert \"SWR\" in texts");
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
    tcase_add_test(tc, fitted_line_matches_the_generated_one);
    tcase_add_test(tc, fitted_line_on_a_load_and_its_limit);
    tcase_add_test(tc, vf_and_trim_take_the_sweep);
    tcase_add_test(tc, sweep_options_refused);
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
    static const char *const gen[] = { "formats '%s/f'", "fit '%s/g'" };
    return run_suite_with_sweeps(suite(), g_dir, sizeof g_dir, "check_cli_sweep", gen,
                                 sizeof gen / sizeof gen[0]);
}
