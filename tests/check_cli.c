/* check_cli.c - end-to-end tests of the coaxline binary: output formats,
 * bad input, batches and locale independence. */
#include <config.h>
#include <check.h>
#include <unistd.h>
#include <string.h>
#include <stdio.h>
#include <stdlib.h>
#include "testutil.h"

#define CUT_10M "cut --offset 10m --vf 0.80 --freq 1.83MHz"

START_TEST(cut_csv_values)
{
    /* Hand worked (SI c exact; v = VF c; open stub resonates at a quarter
     * wave, Pozar, Microwave Engineering, 4th ed., sec. 2.3):
     * delay 10 m / c = 33.356 ns; cut 0.80 * 10 m = 8.000 m;
     * 360 * 1.83 MHz * 33.356 ns = 21.975 deg; 0.8 c / (4 * 8 m) = 7.4948 MHz */
    cli_result r = run_cli(NULL, CUT_10M " --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out,
        "label,offset_m,delay_ns,vf,cut_length_m,cut_length_ft,freq_mhz,electrical_deg,quarter_wave_mhz,allowance_m\n"
        ",10.000,33.356,0.8000,8.000,26.2467,1.830000,21.975,7.4948,0.000\n");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
}
END_TEST

START_TEST(cut_text)
{
    /* 8 m = 26 ft 2.9606 in, to the nearest sixteenth 2 15/16 (1 in = 25.4 mm exact) */
    /* 8.000 m, 7.4948 MHz and 21.975 deg: the hand working in cut_csv_values */
    cli_result r = run_cli(NULL, CUT_10M " --label 'east delay'", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "cut: east delay");
    has(r.out, "8.000 m (26 ft 2 15/16 in)");
    has(r.out, "7.4948 MHz");
    has(r.out, "21.975 deg at 1.830000 MHz");
    cli_result_free(&r);
    r = run_cli(NULL, CUT_10M " --units imperial", NULL);
    has(r.out, "26 ft 2 15/16 in (8.000 m)");
    cli_result_free(&r);
}
END_TEST

START_TEST(cut_other_inputs)
{
    /* a delay of 33.3564 ns and 21.975 deg at 1.83 MHz are the same line */
    cli_result r = run_cli(NULL, "cut --delay 33.3564095ns --vf 0.8 --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",8.000,");
    cli_result_free(&r);
    r = run_cli(NULL, "cut --degrees 21.9752026 --freq 1.83MHz --vf 0.8 --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",8.000,");
    cli_result_free(&r);
    /* 90 degrees at 1.83 MHz, VF 0.66: 0.25 * 0.66 * c / 1.83 MHz = 27.030 m (hand worked) */
    r = run_cli(NULL, "cut --degrees 90 --freq 1.83MHz --vf 0.66 --format csv", NULL);
    has(r.out, ",27.030,");
    cli_result_free(&r);
    /* imperial input: 32 ft 9 11/16 in = 393.6875 in * 25.4 mm = 9.9997 m,
     * 10.000 m to the mm (1 in = 25.4 mm exact) */
    r = run_cli(NULL, "cut --offset \"32' 9 11/16\\\"\" --vf 0.8 --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",10.000,");
    cli_result_free(&r);
}
END_TEST

START_TEST(cut_json)
{
    cli_result r = run_cli(NULL, CUT_10M " --freq 3.5MHz --format json --label 'x\"y'", NULL);
    ck_assert_int_eq(r.rc, 0);
    /* Python's json module is an independent JSON parser */
    json_holds(r.out, "len(d)==2 and d[0][\"label\"]==\"x\\\"y\" and abs(d[0][\"cut_length_m\"]-8)<1e-12 "
                      "and abs(d[1][\"freq_mhz\"]-3.5)<1e-12");
    cli_result_free(&r);
}
END_TEST

START_TEST(cut_bad_input)
{
    bad("cut --offset -3m --vf 0.8", "offset");
    bad("cut --offset 0m --vf 0.8", "offset");
    bad("cut --offset 10m --vf 1.4", "vf");
    bad("cut --offset 10m --vf 0", "vf");
    bad("cut --offset 10m --vf nan", "vf");
    bad("cut --offset 12xyz --vf 0.8", "offset");
    bad("cut --offset 1,5m --vf 0.8", "offset");
    bad("cut --offset '3m 2ft' --vf 0.8", "offset");
    bad("cut --offset 1e999m --vf 0.8", "offset");
    bad("cut --offset 10m --delay 30ns --vf 0.8", "offset/delay/degrees");
    bad("cut --offset 10m --degrees 90 --freq 1.8MHz --vf 0.8", "offset/delay/degrees");
    bad("cut --vf 0.8", "offset/delay/degrees");
    bad("cut --offset 10m", "vf");
    bad("cut --degrees 90 --vf 0.8", "freq");
    bad("cut --degrees -90 --freq 1.8MHz --vf 0.8", "degrees");
    bad("cut --offset 10m --vf 0.8 --freq 0Hz", "freq");
    bad("cut --offset 10m --vf 0.8 --freq 7parsecs", "freq");
    bad("cut --offset 1m --vf 0.8 --allowance 2m", "allowance");
    bad("cut --offset 1m --vf 0.8 --format xml", "format");
    bad("cut --offset 1m --vf 0.8 --units furlongs", "units");
    bad("cut --offset 1m --vf 0.8 --frobnicate", "--frobnicate");
    bad("cut --offset", "--offset");
    bad("cut --offset 1m --offset 2m --vf 0.8", "offset");
    bad("nosuchcommand", "nosuchcommand");
}
END_TEST

START_TEST(batch_keeps_good_rows)
{
    const char csv[] =
        "label,offset,vf\r\n"
        "a,10m,0.8\r\n"
        "b,12xyz,0.8\r\n"
        "c,5m\r\n"
        "\"d, rear\",3m,0.66\r\n"
        "=cmd(),1m,0.8\r\n";
    cli_result r = run_cli_with_file("cut --input %s --format csv --freq 1.83MHz", csv, sizeof csv - 1);
    ck_assert_int_eq(r.rc, 2);
    ck_assert_int_eq(count_lines(r.out), 4); /* header + 3 good rows */
    has(r.out, "\na,10.000,33.356,0.8000,8.000,");
    has(r.out, "\n\"d, rear\",3.000,");
    has(r.out, "\n'=cmd(),1.000,"); /* neutralised label */
    ck_assert_int_eq(count_lines(r.err), 2);
    has(r.err, "line 3: offset: '12xyz'");
    has(r.err, "line 4: row:");
    cli_result_free(&r);
    /* the same through standard input, with a byte-order mark */
    char bom[512];
    snprintf(bom, sizeof bom, "\xEF\xBB\xBF%s", csv);
    r = run_cli(NULL, "cut --input - --format csv", bom);
    ck_assert_int_eq(r.rc, 2);
    ck_assert_int_eq(count_lines(r.out), 4);
    has(r.err, "stdin line 3:");
    cli_result_free(&r);
}
END_TEST

START_TEST(batch_bad_files)
{
    bad_with_file("cut --input %s", "", 0, "input", NULL);
    bad_with_file("cut --input %s", "label,offset,vf\n", 16, "input", NULL);
    bad_with_file("cut --input %s", "label,length\nx,1m\n", 18, "input", NULL);
    bad("cut --input /nonexistent/file.csv", "input");
}
END_TEST

START_TEST(batch_many_rows)
{
    size_t n = 5000, cap = n * 32 + 64, used = 0;
    char *csv = malloc(cap);
    used += (size_t)snprintf(csv, cap, "label,offset\n");
    for (size_t i = 1; i <= n; i++)
        used += (size_t)snprintf(csv + used, cap - used, "p%zu,%zu.5m\n", i, i);
    cli_result r = run_cli_with_file("cut --input %s --vf 0.5 --format csv", csv, used);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_int_eq(count_lines(r.out), (int)n + 1);
    /* half of 5000.5 m (VF 0.5) is 2500.250 m */
    has(r.out, "\np5000,5000.500,");
    has(r.out, ",2500.250,");
    cli_result_free(&r);
    free(csv);
}
END_TEST

START_TEST(comma_locale_same_bytes)
{
    const char *cases[] = { CUT_10M " --format csv", CUT_10M " --format json", CUT_10M,
                            "demo" };
    expect_same_bytes_in_comma_locale(cases, sizeof cases / sizeof cases[0], 0);
}
END_TEST

START_TEST(help_and_version)
{
    cli_result r = run_cli(NULL, "--version", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, PACKAGE_VERSION);
    cli_result_free(&r);
    r = run_cli(NULL, "--help", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "cut");
    cli_result_free(&r);
    r = run_cli(NULL, "cut --help", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "--offset");
    cli_result_free(&r);
    r = run_cli(NULL, "", NULL);
    ck_assert_int_eq(r.rc, 2);
    cli_result_free(&r);
    r = run_cli(NULL, "demo", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "imaginary");
    cli_result_free(&r);
}
END_TEST

START_TEST(demo_story_holds)
{
    /* The demo's commands, run as printed, give the demo's numbers: its
     * readings through vf --at 1.83MHz into cut --vf-from give the cut
     * length it states (common practice, no source: one story). */
    cli_result d = run_cli(NULL, "demo", NULL);
    ck_assert_int_eq(d.rc, 0);
    const char *p = strstr(d.out, "--resonance ");
    ck_assert_ptr_nonnull(p);
    char dips[128];
    ck_assert_int_eq(sscanf(p + strlen("--resonance "), "%127s", dips), 1);
    const char *c = strstr(d.out, "cut length            ");
    ck_assert_ptr_nonnull(c);
    char cut_len[32];
    ck_assert_int_eq(sscanf(c + strlen("cut length            "), "%31s", cut_len), 1);
    char args[512];
    snprintf(args, sizeof args, "vf --length 12m --end open --freq-step 100Hz --at 1.83MHz "
             "--resonance %s --format csv", dips);
    cli_result v = run_cli(NULL, args, NULL);
    ck_assert_int_eq(v.rc, 0);
    char *path = temp_file(v.out, strlen(v.out));
    snprintf(args, sizeof args, "cut --offset 18m --vf-from %s --allowance 0.12m --freq 1.83MHz", path);
    cli_result k = run_cli(NULL, args, NULL);
    ck_assert_int_eq(k.rc, 0);
    char want[64];
    snprintf(want, sizeof want, "cut length          %s m", cut_len);
    has(k.out, want);
    unlink(path);
    free(path);
    cli_result_free(&k);
    cli_result_free(&v);
    cli_result_free(&d);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli");
    TCase *tc = tcase_create("cut");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, cut_csv_values);
    tcase_add_test(tc, cut_text);
    tcase_add_test(tc, cut_other_inputs);
    tcase_add_test(tc, cut_json);
    tcase_add_test(tc, cut_bad_input);
    tcase_add_test(tc, batch_keeps_good_rows);
    tcase_add_test(tc, batch_bad_files);
    tcase_add_test(tc, batch_many_rows);
    tcase_add_test(tc, comma_locale_same_bytes);
    tcase_add_test(tc, help_and_version);
    tcase_add_test(tc, demo_story_holds);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
