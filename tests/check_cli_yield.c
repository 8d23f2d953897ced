/* check_cli_yield.c - end-to-end tests of coaxline yield: the command
 * gives what the library gives for the array its layout describes, the
 * same bytes for any number of threads, 100 % or 0 % with no tolerance,
 * text/CSV/JSON, and bad input (one line naming the option, exit 2). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "coaxline.h"
#include "testutil.h"

/* A crossfire pair 20 m staggered: B behind, delayed by the stagger and
 * inverted; its line 13.2 m at VF 0.66 = 20 m / c of delay (DESIGN.md:
 * delay = L / (VF c)); A fed by 2 m of line, B by 2 m more. */
#define PAIR_LAYOUT "label,x,y,line,invert\nA,10m,0,2m,no\nB,-10m,0,15.2m,yes\n"
#define TOLS "--length-tol 5cm --vf-tol 0.01 --imbalance-tol 0.5 --phase-tol 3"

static cli_result run_layout(const char *layout, const char *opts)
{
    char args[1024];
    snprintf(args, sizeof args, "yield --layout %%s %s", opts);
    return run_cli_with_file(args, layout, strlen(layout));
}

static double yield_num(const char *layout, const char *opts, int row, const char *key)
{
    cli_result r = run_layout(layout, opts);
    ck_assert_msg(r.rc == 0, "yield %s: exit %d: %s", opts, r.rc, r.err);
    double v = json_number(r.out, row, key);
    cli_result_free(&r);
    return v;
}

START_TEST(command_is_the_library)
{
    /* The layout as the library sees it: the same yield, median and 5 %
     * level, to the printed digits (self-consistency, no outside source;
     * the library itself is checked against tests/yield_ref.py). */
    cxl_array *a;
    ck_assert_int_eq(cxl_array_new(&a), CXL_OK);
    ck_assert_int_eq(cxl_array_add(a, 10.0, 0.0, 0.0, NULL), CXL_OK);
    ck_assert_int_eq(cxl_array_add(a, -10.0, 0.0, 0.0, NULL), CXL_OK);
    ck_assert_int_eq(cxl_array_set_line(a, 0, 2.0, 0.66), CXL_OK);
    ck_assert_int_eq(cxl_array_set_line(a, 1, 15.2, 0.66), CXL_OK);
    ck_assert_int_eq(cxl_array_set_reversed(a, 1, 1), CXL_OK);
    cxl_yield *y;
    ck_assert_int_eq(cxl_yield_new(&y), CXL_OK);
    ck_assert_int_eq(cxl_yield_set_tolerances(y, 0.05, 0.01, 0.5, 3.0), CXL_OK);
    ck_assert_int_eq(cxl_yield_set_goal_front_to_back(y, 25.0), CXL_OK);
    ck_assert_int_eq(cxl_yield_set_run(y, 3000, 9, 1), CXL_OK);
    double p, se, med, p5, nmed, n5;
    ck_assert_int_eq(cxl_yield_eval(y, a, 1.83e6, 0.0, &p, &se, &med, &p5, &nmed, &n5), CXL_OK);
    const char *opts = "--vf 0.66 --freq 1.83MHz " TOLS
                       " --goal-front-to-back 25 --trials 3000 --seed 9 --with-null --format json";
    ck_assert(p > 0.05 && p < 0.95);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "yield_pct"), 100.0 * p, 0.0051);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "yield_se_pct"), 100.0 * se, 0.0051);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "front_to_back_median_db"), med, 0.0051);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "front_to_back_p5_db"), p5, 0.0051);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "null_median_db"), nmed, 0.0051);
    ck_assert_double_eq_tol(yield_num(PAIR_LAYOUT, opts, 0, "null_p5_db"), n5, 0.0051);
    cxl_yield_free(y);
    cxl_array_free(a);
}
END_TEST

START_TEST(threads_seed_and_zero_tolerance)
{
    /* The same bytes for 1, 2 and every thread; another seed, another
     * sample (coaxline.h: one generator per block of trials). */
    const char *common = "--vf 0.66 --band 160m " TOLS " --goal-front-to-back 25 --trials 2500";
    char opts[512];
    cli_result r[4];
    const char *extra[4] = { "--threads 1", "--threads 2", "--threads 0", "--threads 2 --seed 2" };
    for (int i = 0; i < 4; i++) {
        snprintf(opts, sizeof opts, "%s %s --format csv", common, extra[i]);
        r[i] = run_layout(PAIR_LAYOUT, opts);
        ck_assert_int_eq(r[i].rc, 0);
    }
    ck_assert_str_eq(r[0].out, r[1].out);
    ck_assert_str_eq(r[0].out, r[2].out);
    ck_assert_str_ne(r[0].out, r[3].out);
    for (int i = 0; i < 4; i++) cli_result_free(&r[i]);
    /* No tolerance: every build is the nominal one, whose front-to-back
     * the array command gives; a goal just under it passes always, just
     * over it never (common practice, no source). */
    const char *lay = "label,x,y,line,invert,weight\nA,10m,0,2m,no,\nB,-10m,0,15.2m,yes,-1\n";
    double nominal = yield_num(lay, "--vf 0.66 --freq 1.83MHz --goal-front-to-back 1 --format json",
                               0, "front_to_back_nominal_db");
    char *path = temp_file(lay, strlen(lay));
    char args[512];
    snprintf(args, sizeof args, "array --layout %s --vf 0.66 --freq 1.83MHz", path);
    ck_assert_double_eq_tol(run_json_number(args, 0, "front_to_back_db"), nominal, 1e-9);
    unlink(path);
    free(path);
    for (int above = 0; above < 2; above++) {
        snprintf(opts, sizeof opts, "--vf 0.66 --freq 1.83MHz --goal-front-to-back %.2f --format json",
                 nominal + (above ? 0.5 : -0.5));
        ck_assert(yield_num(lay, opts, 0, "yield_pct") == (above ? 0.0 : 100.0));
        ck_assert(yield_num(lay, opts, 0, "yield_se_pct") == 0.0);
        ck_assert_double_eq_tol(yield_num(lay, opts, 0, "front_to_back_median_db"), nominal, 0.0051);
    }
}
END_TEST

START_TEST(text_csv_json)
{
    cli_result r = run_layout(PAIR_LAYOUT, "--vf 0.66 --band 160m " TOLS
                                           " --goal-null -25 --trials 500 --label north");
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "yield: north: 2 elements, 500 trials per point, seed 1");
    has(r.out, "rear null (deepest, azimuth 90-270, against azimuth 0) at or below -25.00 dB");
    has(r.out, "GSL mt19937");
    has(r.out, "160m   centre");
    has(r.out, "+-");
    cli_result_free(&r);
    r = run_layout(PAIR_LAYOUT, "--vf 0.66 --freq 1.83MHz --goal-front-to-back 20 --trials 300 "
                                "--format csv");
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "label,band,edge,freq_mhz,elevation_deg,goal,goal_db,trials,seed,yield_pct,"
               "yield_se_pct,front_to_back_nominal_db,front_to_back_median_db,front_to_back_p5_db,"
               "null_nominal_db,null_median_db,null_p5_db\n");
    has(r.out, ",,freq,1.830000,0.0,front-to-back,20.00,300,1,100.00,0.00,");
    has(r.out, ",,,\n");   /* no null statistics without --with-null */
    ck_assert_int_eq(count_lines(r.out), 2);
    cli_result_free(&r);
    r = run_layout(PAIR_LAYOUT, "--vf 0.66 --band 160m,80m " TOLS
                                " --goal-null -25 --trials 300 --format json");
    ck_assert_int_eq(r.rc, 0);
    json_holds(r.out, "len(d) == 6 and all(0 <= x[\"yield_pct\"] <= 100 and x[\"null_p5_db\"] >= "
                      "x[\"null_median_db\"] and x[\"front_to_back_p5_db\"] <= "
                      "x[\"front_to_back_median_db\"] for x in d)");
    cli_result_free(&r);
    /* numbers never go through the locale */
    char *path = temp_file(PAIR_LAYOUT, strlen(PAIR_LAYOUT));
    char c0[512], c1[600];
    snprintf(c0, sizeof c0, "yield --layout %s --vf 0.66 --band 160m %s --goal-null -25 --trials 200",
             path, TOLS);
    snprintf(c1, sizeof c1, "%s --format csv", c0);
    const char *const cases[] = { c0, c1 };
    expect_same_bytes_in_comma_locale(cases, 2, 0);
    unlink(path);
    free(path);
}
END_TEST

START_TEST(bad_options)
{
    const char *base = "yield --layout %s --vf 0.66 --freq 1.83MHz";
    char args[512];
    const struct { const char *opt, *field; } c[] = {
        { "", "goal-front-to-back" },
        { "--goal-front-to-back 20 --goal-null -25", "goal-null" },
        { "--goal-null 3", "goal-null" },
        { "--goal-front-to-back 20 --trials 0", "trials" },
        { "--goal-front-to-back 20 --trials 1.5", "trials" },
        { "--goal-front-to-back 20 --seed -1", "seed" },
        { "--goal-front-to-back 20 --threads 257", "threads" },
        { "--goal-front-to-back 20 --vf-tol 0.4", "vf-tol" },
        { "--goal-front-to-back 20 --length-tol 2.5m", "length-tol" },
        { "--goal-front-to-back 20 --phase-tol 200", "phase-tol" },
        { "--goal-front-to-back 20 --imbalance-tol 21", "imbalance-tol" },
    };
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
        snprintf(args, sizeof args, "%s %s", base, c[i].opt);
        bad_with_file(args, PAIR_LAYOUT, strlen(PAIR_LAYOUT), c[i].field, NULL);
    }
    bad("yield --freq 1.83MHz --goal-front-to-back 20", "layout");
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_yield");
    TCase *tc = tcase_create("yield");
    tcase_set_timeout(tc, 300);
    tcase_add_test(tc, command_is_the_library);
    tcase_add_test(tc, threads_seed_and_zero_tolerance);
    tcase_add_test(tc, text_csv_json);
    tcase_add_test(tc, bad_options);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
