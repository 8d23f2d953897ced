/* check_cli_harness.c - end-to-end tests of coaxline harness: the cut
 * list of a four-element layout against lengths worked out here and
 * against coaxline cut, equal feed runs, packing onto drums (exit 1 when
 * they cannot hold it, the list still printed), text/CSV/JSON, and bad
 * input (one line naming the field, exit 2). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "coaxline.h"
#include "testutil.h"

/* Four elements on a 19 m x 24 m rectangle around the combiner, the rear
 * pair delayed by 15.77 m of line (the golden tests' invented site). */
#define SITE "label,x,y,line,invert\nNW,9.5m,-12m,,no\nNE,9.5m,12m,,no\n" \
             "SW,-9.5m,-12m,15.77m,yes\nSE,-9.5m,12m,15.77m,yes\n"
#define VF 0.83

static double site_num(const char *opts, int row, const char *key)
{
    char *path = temp_file(SITE, strlen(SITE));
    char args[1024];
    snprintf(args, sizeof args, "harness --layout %s --vf 0.83 %s", path, opts);
    double v = run_json_number(args, row, key);
    unlink(path);
    free(path);
    return v;
}

/* Each element is sqrt(9.5^2 + 12^2) m from the combiner (Pythagoras):
 * every feed run is that plus 2 m slack, cut 5 cm short for the
 * connectors (the meaning of cut --allowance); the delay lines are the
 * layout's 15.77 m less the allowance.  Per element, the pieces with
 * their allowances make feed + line = delay x VF c (delay = L / (VF c),
 * common practice). */
START_TEST(site_cut_list)
{
    const char *o = "--combiner 0,0 --slack 2m --allowance 5cm --drum 100m,50m";
    double run = hypot(9.5, 12.0) + 2.0;
    double want[] = { run - 0.05, run - 0.05, run - 0.05, 15.72, run - 0.05, 15.72 };
    for (int row = 0; row < 6; row++) {
        double len = site_num(o, row, "length_m");
        ck_assert_double_eq_tol(len, want[row], 1e-9);
        /* quarter-wave open stub: f = VF c / (4 L) */
        ck_assert_double_eq_tol(site_num(o, row, "check_mhz"),
                                VF * CXL_C_M_PER_S / (4.0 * want[row]) / 1e6, 1e-9);
    }
    /* the delay piece is what coaxline cut gives for the line's delay with
     * the same allowance */
    double delay_ns = 15.77 / (VF * CXL_C_M_PER_S) * 1e9;
    char cargs[256];
    snprintf(cargs, sizeof cargs, "cut --delay %.12fns --vf 0.83 --allowance 5cm", delay_ns);
    ck_assert_double_eq_tol(run_json_number(cargs, 0, "cut_length_m"), site_num(o, 3, "length_m"),
                            1e-6);
    /* packed: 6 pieces of 102.4 m in all on 100 m + 50 m; each drum row
     * says what is left, and used + left is the drum */
    double used1 = site_num(o, 6, "drum_used_m"), left1 = site_num(o, 6, "length_m");
    double used2 = site_num(o, 7, "drum_used_m"), left2 = site_num(o, 7, "length_m");
    ck_assert_double_eq_tol(used1 + left1, 100.0, 1e-9);
    ck_assert_double_eq_tol(used2 + left2, 50.0, 1e-9);
    ck_assert_double_eq_tol(used1 + used2, 4 * (run - 0.05) + 2 * 15.72, 1e-9);
}
END_TEST

/* The text and CSV forms, equal electrical feed runs with --freq, the
 * kinds of piece in order. */
START_TEST(text_and_csv)
{
    cli_result r = run_cli_with_file("harness --layout %s --vf 0.83 --combiner 0,0 --slack 2m "
                                     "--drum 120m --freq 1.83MHz --format csv", SITE, strlen(SITE));
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "label,element,piece,length_m,length_ft,tape,check_mhz,electrical_deg,drum,drum_used_m\n");
    has(r.out, ",NW,feed,17.305,56.7757,56 ft 9 5/16 in,");
    has(r.out, ",SE,delay,15.770,");
    has(r.out, ",,left,");
    ck_assert_int_eq(count_lines(r.out), 8);
    cli_result_free(&r);
    /* feed runs all the same electrical length at 1.83 MHz:
     * 360 f L / (VF c) (common practice) */
    double deg = 360.0 * 1.83e6 * (hypot(9.5, 12.0) + 2.0) / (VF * CXL_C_M_PER_S);
    for (int row = 0; row < 6; row++)
        if (row != 3 && row != 5)
            ck_assert_double_eq_tol(site_num("--combiner 0,0 --slack 2m --freq 1.83MHz", row,
                                             "electrical_deg"), deg, 1e-9);
    char *path = temp_file(SITE, strlen(SITE));
    char args[1024];
    snprintf(args, sizeof args, "harness --layout %s --cable RG-6-CCS --combiner 0,0 --slack 2m "
             "--drum 120m --label 'site A'", path);
    r = run_cli(NULL, args, NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "harness: site A: 4 elements, VF 0.8300, cable RG-6-CCS");
    has(r.out, "NW         feed       17.305");
    has(r.out, "SW         delay      15.770");
    has(r.out, "straight ground distance");
    /* 4 x 17.305228 + 2 x 15.77 = 100.761 m used, 19.239 m left (by hand) */
    has(r.out, "  1        120.000    100.761     19.239");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
    const char *same[] = { args };
    expect_same_bytes_in_comma_locale(same, 1, 0);
    unlink(path);
    free(path);
}
END_TEST

/* Drums too short: exit 1 with one line naming the drums, the whole list
 * printed, the pieces no drum holds without a drum. */
START_TEST(drums_too_short)
{
    cli_result r = run_cli_with_file("harness --layout %s --vf 0.83 --combiner 0,0 --slack 2m "
                                     "--drum 40m --drum 30m --format csv", SITE, strlen(SITE));
    ck_assert_int_eq(r.rc, 1);
    ck_assert_int_eq(count_lines(r.err), 1);
    has(r.err, "drum");
    has(r.err, "cannot hold");
    has(r.err, "(expected ");
    ck_assert_int_eq(count_lines(r.out), 9);
    cli_result_free(&r);
    /* 40 m takes two 17.305 m runs (34.61), 30 m one more: the rest fits
     * nowhere (first fit on these drums, worked by hand) */
    ck_assert_double_eq_tol(site_num("--combiner 0,0 --slack 2m --drum 40m,30m", 6,
                                     "drum_used_m"), 2 * 17.305228, 1e-5);
    ck_assert_double_eq_tol(site_num("--combiner 0,0 --slack 2m --drum 40m,30m", 7,
                                     "drum_used_m"), 17.305228, 1e-5);
}
END_TEST

static void bad_layout_h(const char *layout, const char *opts, const char *field, const char *also)
{
    bad_file_opts("harness --layout", layout, opts, field, also);
}

/* options every bad_input case but the one under test gets right */
#define OK_OPTS "--vf 0.83 --combiner 0,0"

START_TEST(bad_input)
{
    bad("harness --vf 0.83 --combiner 0,0", "layout");
    bad_layout_h(SITE, "--vf 0.83", "combiner", NULL);
    bad_layout_h(SITE, "--vf 0.83 --combiner 3m", "combiner", NULL);
    bad_layout_h(SITE, "--vf 0.83 --combiner 1,2,3", "combiner", NULL);
    bad_layout_h(SITE, "--vf 0.83 --combiner x,0", "combiner", NULL);
    bad_layout_h(SITE, "--vf 0.83 --combiner 0,nan", "combiner", NULL);
    bad_layout_h(SITE, "--combiner 0,0", "vf", NULL);
    bad_layout_h(SITE, "--vf 1.5 --combiner 0,0", "vf", NULL);
    bad_layout_h(SITE, OK_OPTS " --drum -5m", "drum", NULL);
    bad_layout_h(SITE, OK_OPTS " --drum 0", "drum", NULL);
    bad_layout_h(SITE, OK_OPTS " --kerf nan", "kerf", NULL);
    bad_layout_h(SITE, OK_OPTS " --slack -1m", "slack", NULL);
    /* the allowance takes a whole 0.3 m delay line */
    bad_layout_h("label,x,y,line\nA,5m,0,\nB,-5m,0,0.3m\n", OK_OPTS " --allowance 0.5m",
                 "allowance", NULL);
    /* the layout's own errors name the file line */
    bad_layout_h("label,x,y\nA,0,0\nA,5m,0\n", OK_OPTS, "label", "line 3");
    bad_layout_h("label,x,y\nA,0,0\nB,,3m\n", OK_OPTS, "x", "line 3");
    bad_layout_h("label,x,y,degrees\nA,0,0,90\n", OK_OPTS, "degrees", "line 2");
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_harness");
    TCase *tc = tcase_create("harness");
    tcase_set_timeout(tc, 300);
    tcase_add_test(tc, site_cut_list);
    tcase_add_test(tc, text_and_csv);
    tcase_add_test(tc, drums_too_short);
    tcase_add_test(tc, bad_input);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
