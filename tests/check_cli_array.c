/* check_cli_array.c - end-to-end tests of coaxline array: a two-element
 * layout gives what pattern gives, a reversed element, as-built errors,
 * plots, the size bound, and bad layouts (one line naming the file line
 * and the column, exit 2). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "coaxline.h"
#include "testutil.h"

/* A crossfire pair 20 m staggered (pattern's geometry: A in front, B
 * behind, the rear element delayed by the stagger and inverted), its line
 * 13.2 m at VF 0.66 = 20 m / c of delay (DESIGN.md: delay = L / (VF c)). */
#define PAIR_LAYOUT "label,x,y,line,invert\nA,10m,0,,no\nB,-10m,0,13.2m,yes\n"

static double array_num(const char *layout, const char *opts, int row, const char *key)
{
    char *path = temp_file(layout, strlen(layout));
    char args[1024];
    snprintf(args, sizeof args, "array --layout %s %s", path, opts);
    double v = run_json_number(args, row, key);
    unlink(path);
    free(path);
    return v;
}

START_TEST(two_elements_as_pattern)
{
    /* The same pair through both commands: equal to the printed digits. */
    static const char *const keys[] = { "forward_gain_dbi", "front_to_back_db", "null_depth_db",
                                        "null_azimuth_deg" };
    const char *bands = "--vf 0.66 --band 160m,80m --elevation 10";
    for (int row = 0; row < 6; row++) {
        for (size_t k = 0; k < sizeof keys / sizeof keys[0]; k++) {
            char pargs[256];
            snprintf(pargs, sizeof pargs, "pattern --stagger 20m --feed crossfire %s", bands);
            double p = run_json_number(pargs, row, keys[k]);
            double a = array_num(PAIR_LAYOUT, bands, row, keys[k]);
            ck_assert_msg(fabs(p - a) < 1e-9, "row %d %s: pattern %g, array %g", row, keys[k], p, a);
        }
        char pargs[256];
        snprintf(pargs, sizeof pargs, "pattern --stagger 20m --feed crossfire %s", bands);
        ck_assert_double_eq_tol(run_json_number(pargs, row, "rdf_db"),
                                array_num(PAIR_LAYOUT, bands, row, "rdf_db"), 1e-9);
    }
    /* as built: B's line measured 13.35 m */
    const char *ab = "label,line\nB,13.35m\n";
    char *abp = temp_file(ab, strlen(ab));
    char opts[512];
    snprintf(opts, sizeof opts, "--vf 0.66 --freq 1.83MHz --as-built %s", abp);
    double a = array_num(PAIR_LAYOUT, opts, 1, "front_to_back_db");
    double p = run_json_number("pattern --stagger 20m --feed crossfire --vf 0.66 --freq 1.83MHz "
                               "--measured-b 13.35m", 1, "front_to_back_db");
    ck_assert_double_eq_tol(a, p, 1e-9);
    ck_assert(a < 60.0);   /* the error fills the perfect rear null */
    unlink(abp);
    free(abp);
}
END_TEST

START_TEST(reverse_each_and_compass)
{
    /* Two elements side by side across the forward axis, in phase: a
     * broadside pair.  Reversing either puts a null on the forward axis
     * (|1 - 1| = 0, Balanis ch. 6 array factor): its forward RDF is the
     * model's floor. */
    const char *lay = "label,x,y\nL,0,-20m\nR,0,20m\n";
    double design = array_num(lay, "--freq 3.5MHz --reverse-each", 0, "rdf_forward_db");
    double rev = array_num(lay, "--freq 3.5MHz --reverse-each", 1, "rdf_forward_db");
    ck_assert(design > 0.0);
    ck_assert(rev <= -250.0);
    /* compass bearings: an end-fire pair along y, delayed on the right by
     * the spacing (10 m = 33.356 ns): a wave from the right reaches R
     * first and R's delay brings it level with L, so the peak is at
     * azimuth 90 (right) and the null at 270 (left) */
    const char *side = "label,x,y,delay\nL,0,-5m,\nR,0,5m,33.3564095ns\n";
    ck_assert_double_eq_tol(array_num(side, "--freq 7MHz", 0, "null_azimuth_deg"), 270.0, 0.01);
}
END_TEST

START_TEST(text_csv_and_plots)
{
    char *path = temp_file(PAIR_LAYOUT, strlen(PAIR_LAYOUT));
    char *svg = temp_file("", 0);
    char args[1024];
    snprintf(args, sizeof args, "array --layout %s --vf 0.66 --band 160m,80m --plot %s", path, svg);
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_msg(r.rc == 0, "%s", r.err);
    has(r.out, "compass bearing");
    has(r.out, "upper hemisphere");
    cli_result_free(&r);
    /* one curve per band centre, each labelled with its frequency */
    svg_holds(svg, "assert len(paths)==2, len(paths); "
              "assert any(x.startswith(\"1.8575 MHz\") for x in texts); "
              "assert any(\"clockwise\" in x for x in texts)");
    snprintf(args, sizeof args, "array --layout %s --vf 0.66 --band 160m --format csv --sweep-plot %s",
             path, svg);
    r = run_cli(NULL, args, NULL);
    ck_assert_msg(r.rc == 0, "%s", r.err);
    has(r.out, "label,case,band,edge,freq_mhz,elevation_deg,forward_gain_dbi,front_to_back_db,"
               "null_depth_db,null_azimuth_deg,rdf_forward_db,rdf_db,beamwidth_deg");
    ck_assert_int_eq(count_lines(r.out), 4);
    cli_result_free(&r);
    svg_holds(svg, "assert len(paths)==1; assert \"160m\" in texts");
    unlink(svg);
    free(svg);
    unlink(path);
    free(path);
}
END_TEST

static void bad_layout(const char *layout, const char *opts, const char *field, const char *also)
{
    bad_file_opts("array --layout", layout, opts, field, also);
}

START_TEST(bad_layouts)
{
    const char *f = "--vf 0.66 --freq 1.83MHz";
    bad_layout("label,x,y\nA,0,0\nA,5m,0\n", f, "label", "line 3");
    bad_layout("label,x,y\nA,0,0\nB,0,0.0004m\n", f, "x", "same place");
    bad_layout("label,x\nA,0\nB,5m\n", f, "y", "line 1");
    bad_layout("label,x,y\nA,0,0\nB,,3m\n", f, "x", "line 3");
    bad_layout("label,x,y,delay,line\nA,0,0,,\nB,-20m,0,10ns,13.2m\n", f, "delay", "line 3");
    bad_layout("label,x,y,line\nA,0,0,\nB,-20m,0,13.2m\n", "--freq 1.83MHz", "line", "line 3");
    bad_layout("label,x,y,degrees\nA,0,0,\nB,-20m,0,90\n", f, "degrees", "line 3");
    bad_layout("label,x,y,delay\nA,0,0,\nB,-20m,0,-3ns\n", f, "delay", "line 3");
    bad_layout("label,x,y,invert\nA,0,0,maybe\n", f, "invert", "line 2");
    bad_layout("label,x,y,weight\nA,0,0,-99\n", f, "weight", "line 2");
    bad_layout("label,x,y,colour\nA,0,0,red\n", f, "layout", "colour");
    bad_layout("label,x,y\n", f, "layout", "no element");
    bad_layout("label,x,y\nA,0,0\nB,500m,0\n", "--freq 100MHz", "freq", "too large");
    /* too many: 257 elements */
    size_t cap = 300 * 32, used = 0;
    char *big = malloc(cap);
    used += (size_t)snprintf(big, cap, "label,x,y\n");
    for (int i = 0; i < CXL_ARRAY_MAX_ELEMENTS + 1; i++)
        used += (size_t)snprintf(big + used, cap - used, "E%d,%dm,0\n", i, i);
    bad_layout(big, f, "label", "line 258");
    free(big);
    bad("array --freq 1.83MHz", "layout");
    bad("array --layout /nonexistent/x.csv --freq 1.83MHz", "layout");
}
END_TEST

/* array --input: one row per layout file and frequency; good rows are
 * computed as the same command line computes them, a bad row is one error
 * line naming its batch line and no row is invented for it. */
START_TEST(batch_of_layouts)
{
    char *lay = temp_file(PAIR_LAYOUT, strlen(PAIR_LAYOUT));
    char batch[1024];
    snprintf(batch, sizeof batch,
             "label,layout,freq\none,%s,1.83MHz\nmissing,/nonexistent/l.csv,1.83MHz\n"
             "two,%s,3.6MHz\nbadfreq,%s,0Hz\n", lay, lay, lay);
    char *in = temp_file(batch, strlen(batch));
    char args[1024];
    snprintf(args, sizeof args, "array --input %s --vf 0.66 --format csv", in);
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_int_eq(r.rc, 2);
    ck_assert_int_eq(count_lines(r.out), 3);   /* header and the two good rows */
    has(r.out, "\none,design,,freq,1.830000,");
    has(r.out, "\ntwo,design,,freq,3.600000,");
    ck_assert_int_eq(count_lines(r.err), 2);
    has(r.err, "line 3: layout");
    has(r.err, "line 5: freq");
    cli_result_free(&r);
    /* each good row is what its own command line gives */
    unlink(in);
    free(in);
    snprintf(batch, sizeof batch, "label,layout,freq\none,%s,1.83MHz\ntwo,%s,3.6MHz\n", lay, lay);
    in = temp_file(batch, strlen(batch));
    const char *keys[] = { "front_to_back_db", "rdf_db" };
    for (size_t k = 0; k < 2; k++) {
        snprintf(args, sizeof args, "array --input %s --vf 0.66", in);
        double b = run_json_number(args, 1, keys[k]);
        double one = array_num(PAIR_LAYOUT, "--vf 0.66 --freq 3.6MHz", 0, keys[k]);
        ck_assert_double_eq_tol(b, one, 1e-12);
    }
    unlink(in);
    free(in);
    unlink(lay);
    free(lay);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_array");
    TCase *tc = tcase_create("array");
    tcase_set_timeout(tc, 300);
    tcase_add_test(tc, two_elements_as_pattern);
    tcase_add_test(tc, reverse_each_and_compass);
    tcase_add_test(tc, text_csv_and_plots);
    tcase_add_test(tc, bad_layouts);
    tcase_add_test(tc, batch_of_layouts);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
