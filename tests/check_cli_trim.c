/* check_cli_trim - end-to-end tests of `coaxline trim`: values, formats,
 * bad input, batches and locale independence. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

/* A 20.000 m piece of VF 0.66 cable, open: its quarter-wave resonance is
 * 0.66 c / (4 x 20 m) = 2.4732877785 MHz and the next 3 times that (VF
 * from an open stub = 4 L f / c, DESIGN.md; odd multiples, REFERENCES.md
 * stub resonances).  Target 60 degrees at 1.83 MHz: 60/360 x 0.66 c / 1.83
 * MHz = 18.0203 m to keep, 1.9797 m = 6.4950 ft = 6 ft 5 15/16 in to cut
 * off; the kept piece is then a quarter wave at 1.83 x 90/60 = 2.745 MHz
 * and 3 x that = 8.235 MHz (hand computed).  One 1 kHz step resolves
 * L df / f: 8.1 mm at order 1, 2.7 mm at order 2; the length to keep
 * inherits 10.1 mm from the two-point trend (trim.c, first-order error
 * propagation, evaluated by hand in Python). */
#define PIECE "trim --length 20m --resonance 2.4732877785MHz,7.4198633355MHz --resolution 1kHz"
#define TARGET " --degrees 60 --freq 1.83MHz"
#define HEADER "label,length_m,end,order,order_source,freq_mhz,vf,target_freq_mhz,target_vf," \
               "cut_off_m,cut_off_ft,cut_off_tape,remaining_m,expected_mhz,resolution_mm," \
               "remaining_res_mm,action,reading\n"

START_TEST(csv_values)
{
    cli_result r = run_cli(NULL, PIECE TARGET " --format csv --label east", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out, HEADER
        "east,20.0000,open,1,inferred,2.473288,0.66000,1.830000,0.66000,1.9797,6.4950,"
        "6 ft 5 15/16 in,18.0203,2.745000,8.1,10.1,cut,zero-x\n"
        "east,20.0000,open,2,inferred,7.419863,0.66000,1.830000,0.66000,1.9797,6.4950,"
        "6 ft 5 15/16 in,18.0203,8.235000,2.7,10.1,cut,zero-x\n");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
    /* orders given, entered high first: same rows, "given" */
    r = run_cli(NULL, "trim --length 20m --resonance 7.4198633355MHz --resonance 2.4732877785MHz "
                      "--order 2,1 --resolution 1kHz" TARGET " --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "\n,20.0000,open,1,given,2.473288,");
    has(r.out, "\n,20.0000,open,2,given,7.419863,");
    cli_result_free(&r);
}
END_TEST

START_TEST(text_output)
{
    cli_result r = run_cli(NULL, PIECE TARGET " --label 'east delay'", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "trim: east delay");
    has(r.out, "20.000 m (65 ft 7 3/8 in), far end open");
    has(r.out, "8.1 mm");
    has(r.out, "2.7 mm");
    has(r.out, "orders inferred");
    has(r.out, "VF at 1.830 MHz     0.66000");
    has(r.out, "keep                18.020 m");
    has(r.out, "cut off             1.980 m (6 ft 5 15/16 in)");
    has(r.out, "2.745000 MHz (order 1), 8.235000 MHz (order 2)");
    cli_result_free(&r);
    /* imperial: the same piece given in feet (65 ft 7.4 in = 20.0 m to the
     * mm, 1 in = 25.4 mm exact) prints feet first */
    r = run_cli(NULL, "trim --length \"65' 7 3/8\\\"\" --resonance 2.4732877785MHz"
                      " --delay 91.07468ns --units imperial", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "cut off             6 ft 5 15/16 in (1.980 m)");
    cli_result_free(&r);
}
END_TEST

START_TEST(other_targets)
{
    /* a reference piece that read 2.745 MHz (order 1, open) is the same
     * 18.0203 m of this cable; read shorted its first (half-wave)
     * resonance would be 5.49 MHz (hand computed) */
    cli_result r = run_cli(NULL, PIECE " --match-resonance 2.745MHz --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",18.0203,2.745000,");
    cli_result_free(&r);
    r = run_cli(NULL, PIECE " --match-resonance 5.49MHz --match-end short --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",18.0203,2.745000,");
    cli_result_free(&r);
    /* 60 degrees at 1.83 MHz is a delay of 60 / (360 x 1.83 MHz) =
     * 91.07468 ns (DESIGN.md: degrees = 360 f delay), the same 18.0203 m */
    r = run_cli(NULL, PIECE " --delay 91.07468ns --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",18.0203,2.745000,");
    has(r.out, "0.66000,,0.66000,"); /* no target frequency */
    cli_result_free(&r);
    /* a fixture of 0.30 m of the same cable is read with the piece: the
     * readings of 20.30 m, 0.66 c / (4 x 20.3 m) = 2.4367367276 MHz, give
     * the same piece (hand computed) */
    r = run_cli(NULL, "trim --length 20m --resonance 2.4367367276MHz --fixture 0.3m"
                      " --delay 91.07468ns --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",0.66000,,0.66000,1.9797,");
    cli_result_free(&r);
}
END_TEST

START_TEST(short_and_within)
{
    /* 90 degrees at 1.83 MHz is 27.0305 m of VF 0.66 (tests/check_cli.c,
     * 27.030 m): the 20 m piece is 7.0305 m short: exit 1 (coaxline(1),
     * EXIT STATUS) */
    cli_result r = run_cli(NULL, PIECE " --degrees 90 --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(r.rc, 1);
    has(r.out, ",-7.0305,");
    has(r.out, ",short,zero-x\n");
    cli_result_free(&r);
    r = run_cli(NULL, PIECE " --degrees 90 --freq 1.83MHz", NULL);
    ck_assert_int_eq(r.rc, 1);
    has(r.out, "SHORT");
    has(r.out, "7.030 m");
    cli_result_free(&r);
    /* 3 mm to cut (66.5815 deg at 1.83 MHz is 19.997 m, hand computed) is
     * below the 10 mm the readings resolve: a warning, exit 0 */
    r = run_cli(NULL, PIECE " --degrees 66.58153427656 --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",0.0030,");
    has(r.out, ",within,zero-x\n");
    ck_assert_int_eq(count_lines(r.err), 1);
    has(r.err, "warning: the cut (3.0 mm) is below");
    cli_result_free(&r);
    /* the fixture's uncertainty widens it: 20 mm */
    r = run_cli(NULL, PIECE " --degrees 60 --freq 1.83MHz --fixture-tol 20mm --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",22.4,cut,zero-x\n"); /* hypot(10.1, 20) */
    cli_result_free(&r);
}
END_TEST

START_TEST(cable_model)
{
    /* with a catalog cable the readings are corrected for the lossy-line
     * offset; the flag shows in the text */
    cli_result r = run_cli(NULL, PIECE TARGET " --cable RG-213", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "corrected for the lossy-line offset");
    has(r.out, "(model of cable RG-213)");
    cli_result_free(&r);
}
END_TEST

START_TEST(json_output)
{
    cli_result r = run_cli(NULL, PIECE TARGET " --format json --label 'x\"y'", NULL);
    ck_assert_int_eq(r.rc, 0);
    /* Python's json module is an independent JSON parser */
    json_holds(r.out, "len(d)==2 and d[0][\"label\"]==\"x\\\"y\" and abs(d[0][\"remaining_m\"]-18.0203117)<1e-6 "
                      "and d[1][\"order\"]==2 and abs(d[1][\"expected_mhz\"]-8.235)<1e-9 and d[0][\"action\"]==\"cut\"");
    cli_result_free(&r);
}
END_TEST

/* A usage error (testutil.h) whose line also names the command. */
static void trim_bad(const char *args, const char *field)
{
    expect_usage_error_at(NULL, args, NULL, "coaxline: trim: ", field, NULL);
}

START_TEST(bad_input)
{
    trim_bad("trim --resonance 2.47MHz" TARGET, "length");
    trim_bad("trim --length -2m --resonance 2.47MHz" TARGET, "length");
    trim_bad("trim --length 20m" TARGET, "resonance");
    trim_bad("trim --length 20m --resonance 2.47MHz,abc" TARGET, "resonance");
    trim_bad("trim --length 20m --resonance 0Hz" TARGET, "resonance");
    trim_bad("trim --length 20m --resonance 2.47MHz,2.47MHz" TARGET, "resonance");
    trim_bad("trim --length 20m --resonance 2.47MHz --end closed" TARGET, "end");
    trim_bad("trim --length 20m --resonance 2.47MHz,7.4MHz --order 1" TARGET, "order");
    trim_bad("trim --length 20m --resonance 2.47MHz,7.4MHz --order 1,1.5" TARGET, "order");
    trim_bad("trim --length 20m --resonance 2.47MHz,7.4MHz --order 0,1" TARGET, "order");
    trim_bad("trim --length 20m --resonance 2.47MHz,7.4MHz --order 2,1" TARGET, "order");
    trim_bad("trim --length 20m --resonance 2.47MHz", "degrees/delay/match-resonance");
    trim_bad("trim --length 20m --resonance 2.47MHz --delay 50ns" TARGET, "degrees/delay/match-resonance");
    trim_bad("trim --length 20m --resonance 2.47MHz --degrees 60", "freq");
    trim_bad("trim --length 20m --resonance 2.47MHz --degrees -60 --freq 1.83MHz", "degrees");
    trim_bad("trim --length 20m --resonance 2.47MHz --match-resonance 2.7MHz --freq 1.8MHz", "freq");
    trim_bad("trim --length 20m --resonance 2.47MHz --match-resonance 2.7MHz --match-order x", "match-order");
    trim_bad("trim --length 20m --resonance 2.47MHz --match-resonance 2.7MHz --match-end x", "match-end");
    trim_bad("trim --length 20m --resonance 2.47MHz --fixture-vf 1.5" TARGET, "fixture-vf");
    trim_bad("trim --length 20m --resonance 2.47MHz --fixture -1m" TARGET, "fixture");
    trim_bad("trim --length 20m --resonance 2.47MHz --resolution fast" TARGET, "resolution");
    trim_bad("trim --length 20m --resonance 2.47MHz --cable nosuchcable" TARGET, "cable");
    /* 20 m open reading 12 MHz: a VF of 3.2 at the first order and 1.07 at
     * the second: given as order 1, faster than light */
    trim_bad("trim --length 20m --resonance 12MHz --order 1" TARGET, "resonance");
}
END_TEST

START_TEST(cable_without_geometry)
{
    /* the file holds exactly its text (a stray NUL made it a malformed
     * CSV, which also names "cable") */
    const char csv[] = "name,vf\nspool7,0.83\n";
    char *cables = temp_file(csv, sizeof csv - 1);
    char args[400];
    snprintf(args, sizeof args, "trim --cables %s --cable spool7 --length 20m --resonance 2.47MHz"
             TARGET, cables);
    expect_usage_error_at(NULL, args, NULL, "coaxline: trim: ", "cable", "no geometry");
    unlink(cables);
    free(cables);
}
END_TEST

START_TEST(batch)
{
    /* spreadsheet export: BOM, CRLF, quoted list cells, one bad row */
    const char csv[] =
        "\xEF\xBB\xBFlabel,length,resonance,order,degrees,freq\r\n"
        "a,20m,\"2.4732877785MHz,7.4198633355MHz\",,60,1.83MHz\r\n"
        "b,20m,2.47MHz;2.46MHz,1;2,60,1.83MHz\r\n"
        "\"c, rear\",20m,2.4732877785MHz,1,60,1.83MHz\r\n"
        "d,20m,2.4732877785MHz,,90,1.83MHz\r\n"
        "=x,twenty,2.47MHz,,60,1.83MHz\r\n";
    cli_result r = run_cli_with_file("trim --input %s --format csv --resolution 1kHz", csv,
                                     sizeof csv - 1);
    ck_assert_int_eq(r.rc, 2); /* a bad row wins over a short piece */
    ck_assert_int_eq(count_lines(r.out), 1 + 2 + 1 + 1);
    has(r.out, "\na,20.0000,open,1,inferred,");
    has(r.out, "\na,20.0000,open,2,inferred,");
    has(r.out, "\n\"c, rear\",20.0000,open,1,given,");
    has(r.out, "\nd,20.0000,");
    has(r.out, ",short,zero-x\n");
    ck_assert_int_eq(count_lines(r.err), 2);
    has(r.err, "line 3: order:");     /* b: orders fall */
    has(r.err, "line 6: length: 'twenty'");
    cli_result_free(&r);
    /* only good rows, one short: exit 1 */
    const char good[] = "label,length,resonance,degrees\np,20m,2.4732877785MHz,60\n"
                        "q,20m,2.4732877785MHz,90\n";
    r = run_cli(NULL, "trim --input - --freq 1.83MHz --format csv", good);
    ck_assert_int_eq(r.rc, 1);
    ck_assert_int_eq(count_lines(r.out), 3);
    cli_result_free(&r);
}
END_TEST

START_TEST(comma_locale_same_bytes)
{
    const char *cases[] = { PIECE TARGET " --format csv", PIECE TARGET " --format json",
                            PIECE TARGET, PIECE TARGET " --cable RG-213 --units imperial" };
    expect_same_bytes_in_comma_locale(cases, sizeof cases / sizeof cases[0], 0);
}
END_TEST

START_TEST(help)
{
    cli_result r = run_cli(NULL, "trim --help", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "--match-resonance");
    cli_result_free(&r);
    r = run_cli(NULL, "--help", NULL);
    has(r.out, "trim");
    cli_result_free(&r);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_trim");
    TCase *tc = tcase_create("trim");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, csv_values);
    tcase_add_test(tc, text_output);
    tcase_add_test(tc, other_targets);
    tcase_add_test(tc, short_and_within);
    tcase_add_test(tc, cable_model);
    tcase_add_test(tc, json_output);
    tcase_add_test(tc, bad_input);
    tcase_add_test(tc, cable_without_geometry);
    tcase_add_test(tc, batch);
    tcase_add_test(tc, comma_locale_same_bytes);
    tcase_add_test(tc, help);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
