/* check_cli_phasepair.c - end-to-end tests of phase and pair with a load
 * (--load, --z0), a tolerance from a wanted null depth (--null-depth,
 * --imbalance), plots (--plot) and the input limits.
 *
 * Sources of the check values:
 *   [POZAR] Pozar, Microwave Engineering, 4th ed., Wiley 2012, sec. 2.3:
 *           on a lossless line V(z) = V+ (e^{-j beta z} + G e^{j beta z}),
 *           G = (ZL - Z0)/(ZL + Z0), load at z = 0, so
 *           V_load / V_in = (1 + G) / (e^{j beta l} + G e^{-j beta l});
 *           a matched load (G = 0) gives e^{-j beta l}; a quarter wave
 *           gives -j ZL / Z0.  beta l = 360 f l / (VF c) degrees (sec. 2.1).
 *   [NULL]  Null depth of two equal signals with phase error d:
 *           20 log10 sin(d/2) (common practice, no source; the closed form
 *           tests/check_array.c uses).
 *   [SKRF]  For the physical cable model the reference is the library's
 *           own cxl_transfer_model, which tests/test_skrf_transfer.sh
 *           checks against scikit-rf; here the CLI must give the same.
 *   c = 299 792 458 m/s exactly (SI definition of the metre).
 * Python (/usr/bin/python3) re-evaluates [POZAR] with complex numbers as an
 * independent implementation, and parses JSON and SVG (xml.etree). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "coaxline.h"
#include "testutil.h"

/* Python: V_load/V_in of a lossless line [POZAR] as (delay deg, dB, beta l
 * deg), the delay taken within half a turn of beta l. */
#define PY_TR "C=299792458.0\n" \
    "def tr(L,f,vf,z0,zl):\n" \
    " b=2*math.pi*f/(vf*C); G=(zl-z0)/(zl+z0)\n" \
    " r=(1+G)/(cmath.exp(1j*b*L)+G*cmath.exp(-1j*b*L))\n" \
    " el=math.degrees(b*L); ph=-math.degrees(cmath.phase(r))\n" \
    " return ph+360*round((el-ph)/360), 20*math.log10(abs(r)), el\n"

/* Run args (JSON output, exit status rc), then check with Python
 * (json_prelude_holds, testutil.h): d is the document, and prelude (may be
 * "") runs first. */
static void json_run_prelude_holds(const char *args, int rc, const char *prelude,
                                   const char *check)
{
    char full[2048];
    snprintf(full, sizeof full, "%s --format json", args);
    cli_result r = run_cli(NULL, full, NULL);
    ck_assert_msg(r.rc == rc, "'%s' exit %d: %s", full, r.rc, r.err);
    json_prelude_holds(r.out, prelude, check);
    cli_result_free(&r);
}

static void json_run_holds(const char *args, int rc, const char *check)
{
    json_run_prelude_holds(args, rc, "", check);
}

/* ---- phase into a load ------------------------------------------------ */

START_TEST(phase_matched_load_is_plain)
{
    /* G = 0: V_load / V_in = e^{-j beta l}, so the delay into the load is
     * the electrical length and the error the plain one [POZAR] */
    const char *base[] = {
        "phase --length 20.10m --reference 20.00m --vf 0.66 --band 160m,40m --freq 1.83MHz",
        "phase --length 19.70m --reference-deg 90 --reference-freq 2.5MHz --vf 0.80 --band 80m",
    };
    const char *load[] = { "--load 50 --z0 50", "--load 75 --z0 75" };
    for (size_t i = 0; i < 2; i++) {
        char plain[512], loaded[512];
        snprintf(plain, sizeof plain, "%s --format json", base[i]);
        cli_result p = run_cli(NULL, plain, NULL);
        ck_assert_int_eq(p.rc, 0);
        char *path = temp_file(p.out, strlen(p.out));
        snprintf(loaded, sizeof loaded, "%s %s", base[i], load[i]);
        char check[2048];
        snprintf(check, sizeof check,
                 "all(abs(a[\"phase_error_deg\"]-b[\"phase_error_deg\"])<1e-9 "
                 "and abs(a[\"transfer_deg\"]-a[\"electrical_deg\"])<1e-9 "
                 "and abs(a[\"reference_transfer_deg\"]-b[\"reference_electrical_deg\"])<1e-9 "
                 "and abs(a[\"transfer_db\"])<1e-9 and abs(a[\"reference_transfer_db\"])<1e-9 "
                 "and b[\"transfer_deg\"] is None for a,b in zip(d,json.load(open(\"%s\")))) "
                 "and len(d)==%d", path, i ? 3 : 7);
        json_run_holds(loaded, 0, check);
        unlink(path);
        free(path);
        cli_result_free(&p);
    }
}
END_TEST

START_TEST(phase_quarter_wave_into_load)
{
    /* 90 deg at 1.83 MHz on VF 0.66: a quarter wave gives -j ZL / Z0
     * [POZAR]: into 21+j20 ohm on 50 ohm the delay is 90 - atan(20/21) =
     * 46.397 deg (the load's angle is 43.603 deg) and the gain
     * 20 log10(|21+j20| / 50) = 20 log10(29 / 50) = -4.731 dB; into 21-j20
     * 90 + 43.603 = 133.603 deg (hand worked) */
    const char *args = "phase --length 27.1m --reference-deg 90 --reference-freq 1.83MHz "
                       "--vf 0.66 --z0 50 --freq 1.83MHz";
    char full[512];
    snprintf(full, sizeof full, "%s --load 21+j20 --format csv", args);
    cli_result r = run_cli(NULL, full, NULL);
    ck_assert_msg(r.rc == 0, "%s", r.err);
    has(r.out, ",90.000,-4.731\n");          /* reference electrical, dB */
    has(r.out, ",all,");
    has(r.out, ",46.397,90.000,-4.731\n");
    cli_result_free(&r);
    snprintf(full, sizeof full, "%s --load '21 - j 20'", args);
    json_run_holds(full, 0, "abs(d[0][\"reference_transfer_deg\"]-133.603)<5e-4 "
                            "and abs(d[0][\"reference_electrical_deg\"]-90)<1e-9");
    /* matched: exactly the electrical length [POZAR] */
    snprintf(full, sizeof full, "%s --load 50", args);
    json_run_holds(full, 0, "abs(d[0][\"reference_transfer_deg\"]-90)<1e-9");
    /* text: the delay into the load against the electrical length */
    snprintf(full, sizeof full, "%s --load 21+j20", args);
    r = run_cli(NULL, full, NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "load              21+j20 ohm, lossless line, Z0 50 ohm");
    has(r.out, "reference         90.000     46.397    -43.603    -4.731\n");
    cli_result_free(&r);
}
END_TEST

START_TEST(phase_and_pair_against_python)
{
    /* 20.00 m and 20.30 m on VF 0.66 and 50 ohm into 21+j20 ohm across
     * 40 m (7.0-7.3 MHz [ITU RR Art. 5]): the delay difference, gain
     * spread and electrical difference from [POZAR] in Python; at 7.3 MHz
     * 1.623 deg against 3.985 electrical (hand checked) */
    json_run_prelude_holds("pair --length 20.00m,20.30m --vf 0.66 --tolerance 2 --band 40m --z0 50 "
                           "--load 21+j20", 0, PY_TR,
                           "all(abs(r[\"phase_error_deg\"]-(tr(20.3,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[0]"
                           "-tr(20.0,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[0]))<1e-6 and "
                           "abs(r[\"transfer_imbalance_db\"]-abs(tr(20.3,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[1]"
                           "-tr(20.0,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[1]))<1e-6 and "
                           "abs(r[\"electrical_error_deg\"]-360*r[\"freq_mhz\"]*1e6*0.3/(0.66*C))<1e-6 "
                           "for r in d) and len(d)==3 and abs(d[2][\"phase_error_deg\"]-1.623)<5e-4");
    /* phase gives the same error for the same two lines */
    json_run_prelude_holds("phase --length 20.30m --reference 20.00m --vf 0.66 --band 40m --z0 50 "
                           "--load 21+j20", 0, PY_TR,
                           "all(abs(r[\"phase_error_deg\"]-(tr(20.3,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[0]"
                           "-tr(20.0,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[0]))<1e-6 and "
                           "abs(r[\"transfer_db\"]-tr(20.3,r[\"freq_mhz\"]*1e6,0.66,50,21+20j)[1])<1e-6 "
                           "for r in d) and len(d)==3");
}
END_TEST

START_TEST(pair_equal_lines_into_load)
{
    /* equal lines deliver equal voltages into the same load: no error, no
     * gain spread, whatever the load or model [POZAR] */
    const char *cases[] = {
        "pair --length 20m,20m,20m --vf 0.66 --tolerance 2 --band 160m,40m --z0 50 --load 21+j20",
        "pair --length 20m,20m --vf 0.66 --tolerance 2 --band 160m --z0 75 --load 1e9",
        "pair --length 20m,20m --cable RG-58 --tolerance 2 --band 160m,80m --load 12-j300",
    };
    for (size_t i = 0; i < 3; i++)
        json_run_holds(cases[i], 0, "all(r[\"phase_error_deg\"]==0 and r[\"verdict\"]==\"pass\" "
                                    "and r[\"transfer_imbalance_db\"]==0 "
                                    "and r[\"electrical_error_deg\"]==0 for r in d)");
}
END_TEST

START_TEST(cable_model_into_load)
{
    /* --cable RG-58 with --load uses the cable's physical model [SKRF]:
     * the CLI's figures equal cxl_transfer_model's, and the model's
     * electrical length exceeds the nominal-VF one at 1.715 MHz (its lower
     * phase velocity at low frequency, Pozar sec. 2.7) */
    cxl_catalog *cat;
    cxl_loss_model *m;
    size_t idx;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-58", &idx), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, idx, &m), CXL_OK);
    double db, delay, el, rdb, rdelay, rel;
    ck_assert_int_eq(cxl_transfer_model(m, 20.1, 1.715e6, 0, 21.0, 20.0, &db, &delay, &el), CXL_OK);
    ck_assert_int_eq(cxl_transfer_model(m, 20.0, 1.715e6, 0, 21.0, 20.0, &rdb, &rdelay, &rel), CXL_OK);
    cxl_loss_model_free(m);
    cxl_catalog_free(cat);
    char check[1024];
    snprintf(check, sizeof check,
             "abs(d[0][\"transfer_deg\"]-(%.17g))<1e-9 and abs(d[0][\"transfer_db\"]-(%.17g))<1e-9 "
             "and abs(d[0][\"electrical_deg\"]-(%.17g))<1e-9 "
             "and abs(d[0][\"phase_error_deg\"]-(%.17g))<1e-9 "
             "and d[0][\"electrical_deg\"]>360*1.715e6*20.1/(0.66*299792458)",
             delay, db, el, delay - rdelay);
    json_run_holds("phase --length 20.1m --reference 20m --cable RG-58 --load 21+j20 --band 160m",
                   0, check);
    /* a user cable without diameters: lossless at its VF and z0 */
    const char spools[] = "name,vf,z0_ohm\nspool-a,0.80,75\n";
    char *path = temp_file(spools, strlen(spools));
    char args[512];
    snprintf(args, sizeof args, "phase --cables %s --cable spool-a --length 25m --reference 25m "
                                "--load 75 --freq 3MHz", path);
    /* matched: delay = 360 * 3e6 * 25 / (0.8 c) = 112.578 deg [POZAR] */
    json_run_holds(args, 0, "abs(d[0][\"transfer_deg\"]-112.578)<5e-4 and abs(d[0][\"transfer_db\"])<1e-9");
    unlink(path);
    free(path);
}
END_TEST

/* ---- tolerance from a null depth -------------------------------------- */

/* Text output of ARGS: exit 1 (a band fails), nothing on stderr, and the
 * texts want (and also, unless NULL) on stdout. */
static void text_fails_with(const char *args, const char *want, const char *also)
{
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_int_eq(r.rc, 1);
    ck_assert_str_eq(r.err, "");
    has(r.out, want);
    if (also) has(r.out, also);
    cli_result_free(&r);
}

START_TEST(pair_null_depth)
{
    /* 20 log10 sin(d/2) = -21.19 dB gives d = 2 asin(10^(-21.19/20)) =
     * 10.005 deg, the 10-degree figure [NULL].  20 m against 21 m on VF
     * 0.66: 360 f / (0.66 c) per metre: 3.12-3.64 deg on 160 m, 6.37-7.28
     * on 80 m, 12.74-13.28 on 40 m [POZAR, hand worked]: none near 10 */
    const char *lines = "pair --length 20m,21m --vf 0.66 --band 160m,80m,40m";
    char a1[512], a2[512];
    snprintf(a1, sizeof a1, "%s --tolerance 10 --format csv", lines);
    cli_result t = run_cli(NULL, a1, NULL);
    ck_assert_int_eq(t.rc, 1);
    char *path = temp_file(t.out, strlen(t.out));
    snprintf(a2, sizeof a2, "%s --null-vs-inphase -21.19", lines);
    char check[1024];
    snprintf(check, sizeof check,
             "[r[\"verdict\"] for r in d]==[x.split(\",\")[7] for x in open(\"%s\").read().split()[1:]] "
             "and [r[\"verdict\"] for r in d].count(\"fail\")==3 "
             "and all(abs(r[\"tolerance_deg\"]-10.0047)<1e-3 for r in d)", path);
    json_run_holds(a2, 1, check);
    unlink(path);
    free(path);
    cli_result_free(&t);
    /* text names the goal */
    cli_result r = run_cli(NULL, a2, NULL);
    ck_assert_int_eq(r.rc, 1);
    has(r.out, "tolerance         10.005 deg, for a null of -21.19 dB with 0.00 dB imbalance");
    cli_result_free(&r);
    /* 1 dB imbalance alone leaves -24.81 dB [NULL, the same closed form
     * with amplitudes 1 and 0.891]: -30 dB is out of reach: every verdict
     * fails, no tolerance, nothing on stderr, exit 1 */
    snprintf(a2, sizeof a2, "%s --null-vs-inphase -30 --imbalance 1", lines);
    json_run_holds(a2, 1, "all(r[\"verdict\"]==\"fail\" and r[\"tolerance_deg\"] is None "
                          "and r[\"allowed_mismatch_m\"] is None for r in d)");
    text_fails_with(a2, "even an error-free pair nulls only to -24.81 dB, not -30.00 dB", NULL);
    /* with --imbalance the tolerance shrinks */
    snprintf(a2, sizeof a2, "%s --null-vs-inphase -21.19 --imbalance 0.5", lines);
    json_run_holds(a2, 1, "all(0<r[\"tolerance_deg\"]<10.0047 for r in d)");
    /* one of the two ways, and --imbalance only with --null-vs-inphase */
    snprintf(a2, sizeof a2, "%s --null-vs-inphase -21.19 --tolerance 10", lines);
    expect_usage_error(NULL, a2, "tolerance", NULL);
    snprintf(a2, sizeof a2, "%s --tolerance 10 --imbalance 1", lines);
    expect_usage_error(NULL, a2, "imbalance", NULL);
    snprintf(a2, sizeof a2, "%s --null-vs-inphase 3", lines);
    expect_usage_error(NULL, a2, "null-vs-inphase", NULL);
    snprintf(a2, sizeof a2, "%s --null-vs-inphase x", lines);
    expect_usage_error(NULL, a2, "null-vs-inphase", NULL);
    snprintf(a2, sizeof a2, "%s", lines);
    expect_usage_error(NULL, a2, "tolerance", "--null-depth");
    /* --null-depth is against the pair's forward response: without the
     * pair's geometry it is refused, naming the options */
    snprintf(a2, sizeof a2, "%s --null-depth -21.19", lines);
    expect_usage_error(NULL, a2, "null-depth", "--stagger");
    /* with it the tolerance is the budget's per point: a crossfire pair
     * 20 m along the axis allows 2 atan(r sin kd / (1 - r cos kd)) at each
     * frequency (array factor, Balanis, Antenna Theory, 3rd ed., ch. 6;
     * tests/check_array.c), so the tolerance grows with the band */
    snprintf(a2, sizeof a2, "%s --null-depth -21.19 --stagger 20m --feed crossfire", lines);
    json_run_holds(a2, 1, "all(abs(r[\"tolerance_deg\"]-2*math.degrees(math.atan(10**(-21.19/20)"
                          "*math.sin(2*math.pi*r[\"freq_mhz\"]*1e6*20/299792458)/(1-10**(-21.19/20)"
                          "*math.cos(2*math.pi*r[\"freq_mhz\"]*1e6*20/299792458)))))<1e-4 for r in d)");
    text_fails_with(a2, "across the points,", "against the forward response of the pair: stagger 20.000 m");
}
END_TEST

/* ---- plots ------------------------------------------------------------- */

/* Run "ARGS --plot FILE" (exit code rc) into a new file and return its
 * path (caller unlinks and frees); run again under a comma locale, the
 * file must be the same bytes. */
static char *plot_same_bytes(const char *args, int rc)
{
    char *path = temp_file("", 0), *path2 = temp_file("", 0);
    char full[1024];
    snprintf(full, sizeof full, "%s --plot %s", args, path);
    cli_result r = run_cli(NULL, full, NULL);
    ck_assert_msg(r.rc == rc, "'%s' exit %d: %s", full, r.rc, r.err);
    cli_result_free(&r);
    if (have_comma_locale()) {
        snprintf(full, sizeof full, "%s --plot %s", args, path2);
        r = run_cli("LC_ALL=de_DE.UTF-8", full, NULL);
        ck_assert_int_eq(r.rc, rc);
        cli_result_free(&r);
        snprintf(full, sizeof full, "cmp -s %s %s", path, path2);
        ck_assert_msg(system(full) == 0, "'%s': the plot differs under de_DE", args);
    }
    unlink(path2);
    free(path2);
    return path;
}

START_TEST(pair_plot)
{
    /* two bands of 50 samples each: 49 segments each, one break between;
     * the tolerance 10.005 deg of pair_null_depth [NULL] */
    char *path = plot_same_bytes("pair --length 20m,20.3m --vf 0.66 --null-vs-inphase -21.19 "
                                 "--band 160m,40m --label 'east <&> set'", 0);
    svg_holds(path, "assert len(paths)==1, len(paths); d=paths[0].get(\"d\"); "
              "assert d.count(\"L\")==2*49 and d.count(\"M\")==2, d; "
              "assert len(rects)==2 and \"160m\" in texts and \"40m\" in texts; "
              "assert len(dashed)==2 and \"+10.005 deg tolerance\" in texts and \"-10.005 deg\" in texts; "
              "assert any(x.startswith(\"east <&> set: \") for x in texts); "
              "assert \"phase error (deg)\" in texts and \"frequency (MHz)\" in texts");
    unlink(path);
    free(path);
    /* uncertainty: a second, dashed curve; --freq points are markers */
    path = plot_same_bytes("pair --length 20m,20.3m --vf 0.66 --tolerance 3 --band 80m "
                           "--freq 1.83MHz,2.5MHz --length-tol 1cm", 0);
    svg_holds(path, "assert len(paths)==3, len(paths); "
              "assert paths[1].get(\"stroke-dasharray\"); "
              "assert len(r.findall(n+\"circle\"))==2; "
              "assert \"error + uncertainty (worst case)\" in texts");
    unlink(path);
    free(path);
    expect_usage_error(NULL, "pair --length 20m,20.3m --vf 0.66 --tolerance 2 --band 80m "
                             "--plot /nonexistent-dir/p.svg", "plot", "/nonexistent-dir/p.svg");
}
END_TEST

START_TEST(phase_plot)
{
    /* into the load and, dashed, the electrical length; no tolerance */
    char *path = plot_same_bytes("phase --length 20.3m --reference 20m --vf 0.66 --z0 50 "
                                 "--load 21+j20 --band 160m,80m,40m", 0);
    svg_holds(path, "assert len(paths)==2; "
              "assert all(p.get(\"d\").count(\"L\")==3*49 for p in paths); "
              "assert len(rects)==3 and len(dashed)==1; "  /* the legend's */
              "assert \"into the load\" in texts; "
              "assert \"Load 21+j20 ohm, lossless line, Z0 50 ohm.\" in texts");
    unlink(path);
    free(path);
    expect_usage_error(NULL, "phase --length 20.3m --reference 20m --vf 0.66 --band 80m "
                             "--plot /nonexistent-dir/p.svg", "plot", NULL);
    expect_usage_error(NULL, "phase --length 20.3m --reference 20m --vf 0.66 --band 80m "
                             "--plot ''", "plot", NULL);
}
END_TEST

/* ---- bad input and limits ---------------------------------------------- */

START_TEST(bad_load)
{
    const char *bad[] = {
        "21+20", "21+j", "j20", "+j20", "21++j20", "21+j-20", "21 j20", "21+j20j", "abc",
        "", "-5", "-5+j20", "0", "0+j0", "1e13", "21+j1e13", "21,5+j20", "21+x20",
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        char args[256];
        snprintf(args, sizeof args, "phase --length 20.1m --reference 20m --vf 0.66 --z0 50 "
                                    "--band 160m --load '%s'", bad[i]);
        expect_usage_error(NULL, args, "load", NULL);
        snprintf(args, sizeof args, "pair --length 20m,20.1m --vf 0.66 --z0 50 --tolerance 2 "
                                    "--band 160m --load '%s'", bad[i]);
        expect_usage_error(NULL, args, "load", NULL);
    }
    const char *base = "phase --length 20.1m --reference 20m --band 160m";
    const char *cases[][2] = {
        { "--vf 0.66 --load 21+j20", "z0" },             /* a --vf line needs its Z0 */
        { "--vf 0.66 --z0 50", "z0" },                   /* --z0 without --load */
        { "--vf 0.66 --load 50 --z0 0", "z0" },
        { "--vf 0.66 --load 50 --z0 5000", "z0" },
        { "--vf 0.66 --load 50 --z0 fifty", "z0" },
        { "--cable RG-58 --load 50 --z0 50", "z0" },     /* the model gives Z0 */
        { "--cable nosuch --load 50", "cable" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char args[512];
        snprintf(args, sizeof args, "%s %s", base, cases[i][0]);
        expect_usage_error(NULL, args, cases[i][1], NULL);
    }
    /* outside the physical model's range: RG-174's 0.435 mm effective
     * centre is one skin depth in radius at 92 kHz (skin depth 66.1 um at
     * 1 MHz, REFERENCES.md, scaled by 1/sqrt(f)) */
    expect_usage_error(NULL, "phase --length 20.1m --reference 20m --freq 60kHz --cable RG-174 "
                             "--load 50", "cable", "range");
    /* a shorted load has no voltage to take a phase from */
    expect_usage_error(NULL, "pair --length 20m,20.1m --vf 0.66 --z0 50 --tolerance 2 --freq 1MHz "
                             "--load 0+j0", "load", "short");
}
END_TEST

START_TEST(limits_no_nan)
{
    /* out of range: one line each, like cut (1 mm to 1000 km, up to 1 THz;
     * common practice, no source) */
    const char *cases[][2] = {
        { "phase --length 1e300m --reference 20m --vf 0.66 --freq 1.8MHz", "length" },
        { "phase --length 1001000m --reference 20m --vf 0.66 --freq 1.8MHz", "length" },
        { "phase --length 0.5mm --reference 20m --vf 0.66 --freq 1.8MHz", "length" },
        { "phase --length 20m --reference 1e300m --vf 0.66 --freq 1.8MHz", "reference" },
        { "phase --length 20m --reference 20m --vf 0.66 --freq 1e300Hz", "freq" },
        { "phase --length 20m --reference 20m --vf 0.66 --freq 1.1e12Hz", "freq" },
        { "phase --length 20m --reference 21m --vf 1e-300 --freq 1MHz", "vf" },
        { "phase --length 20m --reference 21m --vf 0.009 --freq 1MHz", "vf" },
        { "phase --length 20m --reference-deg 1e9 --reference-freq 1Hz --vf 0.66 --freq 1MHz",
          "reference-deg" },
        { "phase --length 20m --reference-deg 90 --reference-freq 1e300Hz --vf 0.66 --freq 1MHz",
          "reference-freq" },
        { "pair --length 20m,1e300m --vf 0.66 --tolerance 2 --freq 1MHz", "length" },
        { "pair --length 20m,20.1m --vf 0.66 --tolerance 2 --freq 1e300Hz", "freq" },
        { "pair --length 20m,20.1m --vf 1e-300 --tolerance 2 --freq 1MHz", "vf" },
        { "pair --length 20m,20.1m --vf 0.66 --tolerance 2 --freq 1MHz --length-tol 1e300m",
          "length-tol" },
        { "pair --length 20m,20.1m --vf 0.66 --tolerance 2 --freq 1MHz --vf-tol 0.655", "vf-tol" },
        { "pair --length 20m,20.1m --vf 0.66 --tolerance 1e-300 --freq 1MHz", "tolerance" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++)
        expect_usage_error(NULL, cases[i][0], cases[i][1], NULL);
    /* the corners of the limits: every output cell a finite number */
    const char *edge[] = {
        "phase --length 1000000m --reference 1mm --vf 0.01 --freq 1000GHz",
        "phase --length 1mm --reference 1000000m --vf 1 --freq 1Hz --freq 1000GHz",
        "phase --length 1000000m --reference 1mm --vf 0.01 --freq 1000GHz --z0 1 --load 1e12-j1e12",
        "phase --length 1mm --reference 2mm --vf 1 --freq 1Hz --z0 1000 --load 0.001",
        "pair --length 1mm,1000000m --vf 0.02 --vf-tol 0.01 --length-tol 1000000m --tolerance 360 "
        "--freq 1000GHz --freq 1Hz",
        "pair --length 1mm,1000000m --vf 0.01 --tolerance 0.001 --freq 1000GHz --z0 50 --load 1e9",
        "pair --length 1mm,1mm --vf 1 --null-vs-inphase -299 --freq 1Hz --z0 50 --load 21+j20",
    };
    const char *fmt[] = { "", " --format csv", " --format json" };
    for (size_t i = 0; i < sizeof edge / sizeof edge[0]; i++)
        for (size_t k = 0; k < 3; k++) {
            char args[512];
            snprintf(args, sizeof args, "%s%s", edge[i], fmt[k]);
            cli_result r = run_cli(NULL, args, NULL);
            ck_assert_msg(r.rc == 0 || r.rc == 1, "'%s' exit %d: %s", args, r.rc, r.err);
            ck_assert_msg(strchr(r.out, '?') == NULL && strstr(r.out, "nan") == NULL &&
                              strstr(r.out, "inf") == NULL && strstr(r.out, "NaN") == NULL &&
                              strstr(r.out, "Infinity") == NULL,
                          "'%s' printed a non-number:\n%s", args, r.out);
            cli_result_free(&r);
        }
}
END_TEST

/* ---- batches, locale, help -------------------------------------------- */

START_TEST(batch_with_load_and_goal)
{
    /* as a spreadsheet saves it: BOM, CRLF, quoted cells; a bad load and a
     * missing z0 are reported by line, the good rows still printed */
    const char csv[] =
        "\xEF\xBB\xBF" "label,length,vf,z0,load,null-vs-inphase,tolerance,band\r\n"
        "a,\"20.00m;20.30m\",0.66,50,\"21+j20\",-21.19,,40m\r\n"
        "b,20.00m;20.30m,0.66,50,21+20,,2,40m\r\n"
        "c,20.00m;20.00m,0.66,75,1e9,,2,40m\r\n"
        "d,20.00m;20.30m,0.66,,21+j20,,2,40m\r\n"
        "e,20.00m;20.30m,0.66,,,,2,40m\r\n";
    cli_result r = run_cli(NULL, "pair --input - --format csv", csv);
    ck_assert_int_eq(r.rc, 2);
    ck_assert_int_eq(count_lines(r.out), 1 + 3 * 3);
    /* a: 1.623 deg into the load at 7.3 MHz (phase_and_pair_against_python)
     * against 10.005 [NULL]; e: the plain 3.985 against 2 (check_cli_measured) */
    has(r.out, "\na,40m,high,7.300000,0.300,1.623,10.005,pass,");
    has(r.out, "\nc,40m,high,7.300000,0.000,0.000,2.000,pass,");
    has(r.out, "\ne,40m,high,7.300000,0.300,3.985,2.000,fail,0.151,0.000,3.985,\n");
    ck_assert_int_eq(count_lines(r.err), 2);
    has(r.err, "stdin line 3: load:");
    has(r.err, "stdin line 5: z0:");
    cli_result_free(&r);
    /* phase: a --plot pattern gives each row its own file (a plot column
     * in the batch file is refused: coaxline(1), --input) */
    char dir[] = "/tmp/coaxline-pp-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    char rows[1024], args[256], p1[96], p2[96];
    snprintf(rows, sizeof rows, "label,length,reference,vf,z0,load,band\n"
                                "x,20.3m,20m,0.66,50,21+j20,160m\n"
                                "y,20.3m,20m,0.66,,,80m\n");
    snprintf(args, sizeof args, "phase --input - --format csv --plot '%s/{label}.svg'", dir);
    r = run_cli(NULL, args, rows);
    ck_assert_msg(r.rc == 0, "%s", r.err);
    ck_assert_int_eq(count_lines(r.out), 1 + 2 * 3);
    cli_result_free(&r);
    snprintf(p1, sizeof p1, "%s/x.svg", dir);
    snprintf(p2, sizeof p2, "%s/y.svg", dir);
    svg_holds(p1, "assert \"160m\" in texts and \"into the load\" in texts");
    svg_holds(p2, "assert \"80m\" in texts and \"electrical length\" in texts");
    unlink(p1);
    unlink(p2);
    rmdir(dir);
}
END_TEST

START_TEST(comma_locale_same_bytes)
{
    const char *cases[] = {
        "phase --length 20.3m --reference 20m --vf 0.66 --z0 50 --load 21.5-j20.25 --band 160m",
        "phase --length 20.3m --reference 20m --vf 0.66 --z0 50 --load 21.5-j20.25 --band 160m --format csv",
        "phase --length 20.3m --reference 20m --cable RG-58 --load 21.5+j20 --band 160m --format json",
        "pair --length 20m,20.3m --vf 0.66 --null-vs-inphase -21.19 --imbalance 0.5 --band 40m --z0 50 "
        "--load 21.5+j20 --length-tol 1cm",
        "pair --length 20m,20.3m --vf 0.66 --null-vs-inphase -21.19 --band 40m --format csv",
        "pair --length 20m,20.3m --cable RG-58 --tolerance 2.5 --band 40m --load 1e9 --format json",
    };
    expect_same_bytes_in_comma_locale(cases, sizeof cases / sizeof cases[0], 1);
}
END_TEST

START_TEST(help_lists_options)
{
    const char *cmds[] = { "phase --help", "pair --help" };
    for (size_t i = 0; i < 2; i++) {
        cli_result r = run_cli(NULL, cmds[i], NULL);
        ck_assert_int_eq(r.rc, 0);
        has(r.out, "--load");
        has(r.out, "--z0");
        has(r.out, "--plot");
        if (i) has(r.out, "--null-depth");
        cli_result_free(&r);
    }
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_phasepair");
    TCase *tl = tcase_create("load");
    tcase_set_timeout(tl, 60);
    tcase_add_test(tl, phase_matched_load_is_plain);
    tcase_add_test(tl, phase_quarter_wave_into_load);
    tcase_add_test(tl, phase_and_pair_against_python);
    tcase_add_test(tl, pair_equal_lines_into_load);
    tcase_add_test(tl, cable_model_into_load);
    suite_add_tcase(s, tl);
    TCase *tn = tcase_create("null-depth");
    tcase_set_timeout(tn, 60);
    tcase_add_test(tn, pair_null_depth);
    suite_add_tcase(s, tn);
    TCase *tp = tcase_create("plot");
    tcase_set_timeout(tp, 60);
    tcase_add_test(tp, pair_plot);
    tcase_add_test(tp, phase_plot);
    suite_add_tcase(s, tp);
    TCase *tb = tcase_create("input");
    tcase_set_timeout(tb, 120);
    tcase_add_test(tb, bad_load);
    tcase_add_test(tb, limits_no_nan);
    tcase_add_test(tb, batch_with_load_and_goal);
    tcase_add_test(tb, comma_locale_same_bytes);
    tcase_add_test(tb, help_lists_options);
    suite_add_tcase(s, tb);
    return run_suite(s);
}
