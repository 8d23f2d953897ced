/* check_cli_cables.c - end-to-end tests of `coaxline cables` and
 * `coaxline loss`, and of user cable files (--cables, --cable-loss,
 * COAXLINE_CABLE_DIR) in `cut`. */
#define _POSIX_C_SOURCE 200809L
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

/* A measured spool: name and VF only (the bench's usual case). */
static const char spool_csv[] = "name,vf,z0_ohm,source\nmyspool,0.831,75,drum 4 measured at the bench\n";
/* Its loss points: chosen so that a sqrt(f) + b f fits them exactly with
 * a = 3 dB/100 m/sqrt(MHz), b = 0 (3 at 1 MHz, 6 at 4 MHz), so the
 * expected values below can be worked by hand. */
static const char spool_loss_csv[] = "name,freq_mhz,loss_db_per_100m,source\n"
                                     "myspool,1,3,bench\nmyspool,4,6,bench\n";

/* A number from the CSV cell of column col (0-based) in the data row that
 * starts with prefix. */
static double csv_cell(const char *csv, const char *prefix, int col)
{
    const char *row = strstr(csv, prefix);
    ck_assert_msg(row != NULL, "no row '%s' in:\n%s", prefix, csv);
    for (int c = 0; c < col; c++) {
        row = strchr(row, ',');
        ck_assert_ptr_nonnull(row);
        row++;
    }
    return strtod(row, NULL); /* test process runs in the C locale */
}

/* ---- cables ------------------------------------------------------------ */

/* --cables from a decimal-comma spreadsheet: ';' and 0,80 (common
 * practice, no source); 100 ns at VF 0.8 is 0.8 c 100 ns = 23.983 m
 * [hand worked] */
START_TEST(cables_spreadsheet_file)
{
    const char semi[] = "name;vf\nshed drum;0,80\n";
    cli_result r = run_cli_with_file("cut --cables %s --cable 'shed drum' --delay 100ns --format csv",
                                     semi, sizeof semi - 1);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",0.8000,23.983,");
    cli_result_free(&r);
}
END_TEST

START_TEST(cables_list)
{
    /* data/cables.csv has 12 rows (common practice, no source: the file) */
    cli_result r = run_cli(NULL, "cables", NULL);
    ck_assert_int_eq(r.rc, 0);
    const char *names[] = { "RG-174", "RG-58", "RG-8X", "RG-213", "RG-59", "RG-6-foam",
                            "RG-11-foam", "RG-316", "RG-142", "RG-179" };
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++)
        has(r.out, names[i]);
    has(r.out, "15 built in, 0 from user files");
    /* RG-6-foam's table: 1, 10 and 100 MHz (data/cable_loss.csv) */
    has(r.out, "1.000-100.000 MHz");
    ck_assert_str_eq(r.err, "");
    cli_result_free(&r);
}
END_TEST

START_TEST(cables_csv_and_json)
{
    cli_result r = run_cli(NULL, "cables --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_int_eq(count_lines(r.out), 16); /* header + 15 rows of data/cables.csv */
    static const char header[] =
        "name,z0_ohm,vf,dielectric,inner_diameter_mm,dielectric_diameter_mm,relative_permittivity,"
        "loss_tangent,builtin,loss_points,loss_min_mhz,loss_max_mhz,source,conductivity_s_per_m,"
        "conductor_loss_factor,clad_thickness_mm,core_conductivity_s_per_m,core_relative_permeability\n";
    ck_assert(strncmp(r.out, header, sizeof header - 1) == 0);
    /* the RG-213 rows of data/cables.csv and data/cable_loss.csv (4 points,
     * 1 to 150 MHz); copper default 58 MS/m (IEC 60028) */
    has(r.out,
        "\nRG-213,50.0,0.6600,solid-PE,2.073,7.240,2.2500,0.000200,yes,4,1.000,150.000,\"inner_diameter_mm is the effective");
    has(r.out, ",58000000,1.000,,,\n");
    /* a row without a loss table leaves its range empty */
    has(r.out, "\nRG-316,50.0,0.6900,PTFE,0.454,1.520,2.1000,0.000300,yes,0,,,");
    cli_result_free(&r);

    r = run_cli(NULL, "cables --format json", NULL);
    ck_assert_int_eq(r.rc, 0);
    /* Python's json module is an independent parser */
    python_holds_text("import json,sys; d=json.load(open(sys.argv[1])); "
                      "assert len(d)==15 and all(c[\"builtin\"]==\"yes\" for c in d); "
                      "c=[c for c in d if c[\"name\"]==\"RG-6-foam\"][0]; "
                      "assert c[\"z0_ohm\"]==75 and c[\"vf\"]==0.82 and c[\"loss_points\"]==3; "
                      "assert c[\"loss_min_mhz\"]==1 and c[\"loss_max_mhz\"]==100; "
                      "r=[c for c in d if c[\"name\"]==\"RG-316\"][0]; "
                      "assert r[\"loss_min_mhz\"] is None and r[\"clad_thickness_mm\"] is None",
                      r.out);
    cli_result_free(&r);

    r = run_cli(NULL, "cables --cable rg-213 --format json", NULL);
    ck_assert_int_eq(r.rc, 0);
    python_holds_text("import json,sys; d=json.load(open(sys.argv[1])); "
                      "assert len(d)==1 and d[0][\"name\"]==\"RG-213\" and abs(d[0][\"inner_diameter_mm\"]-2.073)<1e-9",
                      r.out);
    cli_result_free(&r);
}
END_TEST

START_TEST(cables_detail)
{
    cli_result r = run_cli(NULL, "cables --cable rg-6-foam", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "cable RG-6-foam (built-in)");
    has(r.out, "3 points");
    /* 1 MHz point: 0.2 dB/100 ft = 0.6562 dB/100 m (data/cable_loss.csv) */
    has(r.out, "1.000 MHz     0.6562");
    has(r.out, "from memory");
    has(r.out, "largest residual");
    has(r.out, "physical model   holds");
    cli_result_free(&r);
    bad_also("cables --cable RG-2130", "cable", "RG-2130");
    bad("cables --bogus", "--bogus");
}
END_TEST

/* ---- loss --------------------------------------------------------------- */

START_TEST(loss_matches_table_interpolation)
{
    /* Done criterion: within 0.1 dB of the table interpolated independently
     * (tests/loss_interp.py: numpy.interp of log loss on log f over
     * data/cable_loss.csv).  Runs a batch so one JSON array holds every case. */
    const char batch[] =
        "label,cable,length,band,freq\n"
        "a,RG-6-foam,100m,160m,\n"
        "b,RG-6-foam,100m,80m,\n"
        "c,RG-6-foam,30m,,\"50MHz,100MHz\"\n"
        "d,RG-213,30m,,\"3.5MHz,7MHz,14MHz,30MHz,150MHz\"\n"
        "e,RG-213,100m,160m,\n"
        "f,RG-58,20m,40m,\n"
        "g,RG-58,100m,80m,\n";
    cli_result r = run_cli_with_file("loss --input %s --format json", batch, sizeof batch - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.err, "");
    char *json = temp_file(r.out, strlen(r.out));
    const char *src = getenv("COAXLINE_SRCDIR");
    ck_assert_ptr_nonnull(src);
    char cmd[2048];
    snprintf(cmd, sizeof cmd, "%s %s/tests/loss_interp.py %s/data/cable_loss.csv %s 0.1",
             python3(), src, src, json);
    ck_assert_int_eq(system(cmd), 0);
    unlink(json);
    free(json);
    cli_result_free(&r);
}
END_TEST

START_TEST(loss_160m_text)
{
    cli_result r = run_cli(NULL, "loss --cable RG-6-foam --length 100m --band 160m", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "fitted model: a*sqrt(f) + b*f fitted to 3 table points "
               "1.000-100.000 MHz (usable 0.909-110.000 MHz)");
    has(r.out, "  160m centre ");
    has(r.out, "100.000 m (328 ft 1 in)"); /* 100 m / 0.3048 = 328 ft 0.97 in */
    lacks(r.out, "extrapolated");
    cli_result_free(&r);
    /* no loss table: the physical model, and the text says why */
    r = run_cli(NULL, "loss --cable RG-316 --length 10m --band 80m", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "  physical model: ");
    has(r.out, "chosen because the cable has no loss table");
    cli_result_free(&r);
}
END_TEST

START_TEST(loss_physical_vs_fitted)
{
    /* Physical model against the low-loss formulas (Pozar, Microwave
     * Engineering, 4th ed., sec. 2.7, from memory; REFERENCES.md):
     * alpha_c = R/(2 Z0), R = Rs/(2 pi) (1/a + 1/b), Rs = sqrt(pi f mu0/sigma),
     * Z0 = 59.9585/sqrt(eps_r) ln(b/a), alpha_d = pi sqrt(eps_r) f tan(d)/c,
     * 8.6859 dB/Np; R with the first curvature terms of the round conductors,
     * + 1/(4 sigma pi a^2) - 1/(4 sigma pi b^2), from z I0/(2 I1) = z/2 + 1/4
     * + ... and z K0/K1 = z - 1/2 + ... (Abramowitz and Stegun 9.7.1, 9.7.2;
     * tests/check_loss.c).  Geometry of the RG-213 row of data/cables.csv:
     * 2.073 mm effective centre, 7.24 mm dielectric, eps_r 2.25, tan(d) 2e-4,
     * copper 58.0 MS/m (IEC 60028).  The exact propagation constant agrees
     * to 1 % where R << omega L (tests/check_loss.c, same comparison). */
    const double f = 10e6, a = 1.0365e-3, b = 3.62e-3, eps = 2.25, tan_d = 2e-4;
    const double mu0 = 4e-7 * M_PI, sigma = 58.0e6, c0 = 299792458.0;
    double rs = sqrt(M_PI * f * mu0 / sigma);
    double r_ohm = rs / (2 * M_PI) * (1 / a + 1 / b) +
                   (1 / (a * a) - 1 / (b * b)) / (4 * sigma * M_PI);
    double z0 = 59.9585 / sqrt(eps) * log(b / a);
    double alpha = r_ohm / (2 * z0) + M_PI * sqrt(eps) * f * tan_d / c0;
    double want_db_100m = 100.0 * 20.0 * log10(exp(1.0)) * alpha; /* about 1.45 */

    cli_result ext = run_cli(NULL, "loss --cable RG-213 --length 100m --freq 10MHz --model physical "
                                   "--external-inductance-only --format csv", NULL);
    cli_result phys = run_cli(NULL, "loss --cable RG-213 --length 100m --freq 10MHz --model physical "
                                    "--format csv", NULL);
    cli_result fit = run_cli(NULL, "loss --cable RG-213 --length 100m --freq 10MHz --format csv", NULL);
    ck_assert_int_eq(ext.rc, 0);
    ck_assert_int_eq(phys.rc, 0);
    ck_assert_int_eq(fit.rc, 0);
    has(ext.out, ",freq,physical,");
    has(fit.out, ",freq,fitted,");
    double l_ext = csv_cell(ext.out, ",RG-213,", 5);
    double l_phys = csv_cell(phys.out, ",RG-213,", 5);
    double l_fit = csv_cell(fit.out, ",RG-213,", 5);
    ck_assert_double_eq_tol(l_ext, want_db_100m, 0.01 * want_db_100m);
    /* Internal inductance L_int = R/omega raises L by R/(omega L_ext),
     * about 1 % here, so Z0 rises by about 0.5 % and alpha_c falls by as
     * much (Ramo, Whinnery and Van Duzer, 3rd ed., ch. 5, from memory). */
    ck_assert(l_phys < l_ext && l_phys > 0.99 * l_ext);
    /* ideal smooth copper is a lower bound on a real braided cable: 20-60 %
     * more (common practice, from memory; tests/check_loss.c) */
    ck_assert(l_phys < l_fit && l_phys > l_fit / 1.8);
    cli_result_free(&ext);
    cli_result_free(&phys);
    cli_result_free(&fit);
}
END_TEST

/* Run `coaxline loss ARGS` with the spool files above as --cables and
 * --cable-loss. */
static cli_result run_spool_loss(const char *args)
{
    char *cables = temp_file(spool_csv, sizeof spool_csv - 1);
    char *loss = temp_file(spool_loss_csv, sizeof spool_loss_csv - 1);
    char cmd[1024];
    snprintf(cmd, sizeof cmd, "loss --cables %s --cable-loss %s %s", cables, loss, args);
    cli_result r = run_cli(NULL, cmd, NULL);
    unlink(cables); unlink(loss);
    free(cables); free(loss);
    return r;
}

START_TEST(loss_swr_total)
{
    /* Matched loss: 3 dB/100 m at 1 MHz on 100 m = 3.000 dB (the user table,
     * fitted exactly).  Total with SWR 3 at the load (REFERENCES.md, derivable
     * from Pozar, 4th ed., sec. 2.7): A = 10^0.3 = 1.99526, |G| = 0.5,
     * 10 log10[(A^2 - 0.25) / (0.75 A)] = 10 log10(2.49328) = 3.968 dB
     * (hand worked). */
    cli_result r = run_spool_loss("--cable myspool --length 100m --freq 1MHz --swr 3 --format csv");
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out,
        "label,cable,band,freq_mhz,length_m,matched_loss_db,swr,total_loss_db,edge,model,loss_db_per_100m,extrapolated\n"
        ",myspool,,1.000000,100.000,3.000,3.000,3.968,freq,fitted,3.0000,no\n");
    cli_result_free(&r);
    /* 2.25 MHz: 3 * sqrt(2.25) = 4.5 dB/100 m; on 40 m 1.800 dB; SWR 1 adds
     * nothing (definition of matched loss) */
    r = run_spool_loss("--cable MYSPOOL --length 40m --freq 2.25MHz --format csv --label 'north run'");
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "\nnorth run,myspool,,2.250000,40.000,1.800,1.000,1.800,freq,fitted,4.5000,no\n");
    cli_result_free(&r);
    /* text: the far-end line says the last column includes the standing
     * wave; the point's line shows matched-line and total loss as the CSV
     * does, in a layout of our own */
    r = run_spool_loss("--cable myspool --length 100m --freq 1MHz --swr 3");
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "  far end at SWR 3.000: the last column adds its standing-wave loss");
    has(r.out, "  at                    MHz   dB/100 m  matched-line dB  dB at SWR 3.000\n");
    has(r.out, "  given freq       1.000000      3.000            3.000            3.968\n");
    lacks(r.out, "load SWR");
    lacks(r.out, "total dB");
    cli_result_free(&r);
}
END_TEST

START_TEST(loss_json)
{
    cli_result r = run_cli(NULL, "loss --cable RG-213 --length 30m --band 80m --swr 2 --format json "
                                 "--label 'rear \"B\"'", NULL);
    ck_assert_int_eq(r.rc, 0);
    /* three rows: low edge, centre, high edge; total > matched with SWR 2 */
    python_holds_text("import json,sys; d=json.load(open(sys.argv[1])); "
                      "assert [x[\"edge\"] for x in d]==[\"low\",\"centre\",\"high\"]; "
                      "assert all(x[\"band\"]==\"80m\" and x[\"label\"]==\"rear \\\"B\\\"\" for x in d); "
                      "assert all(x[\"total_loss_db\"]>x[\"matched_loss_db\"]>0 and x[\"swr\"]==2 for x in d); "
                      "assert d[0][\"freq_mhz\"]==3.5 and d[0][\"length_m\"]==30; "
                      "assert list(d[0])[:8]==[\"label\",\"cable\",\"band\",\"freq_mhz\",\"length_m\","
                      "\"matched_loss_db\",\"swr\",\"total_loss_db\"]",
                      r.out);
    cli_result_free(&r);
}
END_TEST

START_TEST(loss_extrapolate)
{
    /* RG-59 keeps only its 30 and 150 MHz points: 160 m is outside */
    bad_also("loss --cable RG-59 --length 30m --band 160m", "band", "30.000-150.000 MHz");
    bad_also("loss --cable RG-59 --length 30m --band 160m", "band", "160m low edge");
    cli_result r = run_cli(NULL, "loss --cable RG-59 --length 30m --band 160m --extrapolate --format csv", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, ",low,fitted,");
    has(r.out, ",yes\n");
    cli_result_free(&r);
    r = run_cli(NULL, "loss --cable RG-59 --length 30m --freq 1.9MHz --extrapolate", NULL);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "* outside the loss table");
    cli_result_free(&r);
}
END_TEST

START_TEST(loss_bad_input)
{
    bad("loss --cable RG-6-foam --length 0m --band 160m", "length");
    bad("loss --cable RG-6-foam --length -5m --band 160m", "length");
    bad_also("loss --cable RG-6-foam --length 10m --band 160m --swr 0.9", "swr", "0.9");
    bad_also("loss --cable RG-6-foam --length 10m --band 160m --swr 1,5", "swr", "comma");
    bad("loss --cable RG-6-foam --length 10m --band 160m --swr nan", "swr");
    bad_also("loss --cable nosuch --length 10m --band 160m", "cable", "nosuch");
    bad("loss --length 10m --band 160m", "cable");
    bad("loss --cable RG-6-foam --band 160m", "length");
    bad("loss --cable RG-6-foam --length 10m", "band");
    bad_also("loss --cable RG-6-foam --length 10m --band 17x", "band", "17x");
    bad("loss --cable RG-6-foam --length 10m --band 160m --region 4", "region");
    bad_also("loss --cable RG-6-foam --length 10m --freq 500MHz", "freq", "1.000-100.000 MHz");
    bad_also("loss --cable RG-6-foam --length 10m --band 2200m", "band", "2200m");
    bad("loss --cable RG-6-foam --length 10m --band 160m --model quantum", "model");
    bad_also("loss --cable RG-316 --length 10m --band 160m --model fitted", "model", "RG-316");
    bad("loss --cable RG-6-foam --length 10m --band 160m --model physical --extrapolate",
        "extrapolate");
    bad("loss --cable RG-6-foam --length 10m --band 160m --external-inductance-only",
        "external-inductance-only");
    /* the physical model's range: one skin depth in a 0.454 mm-diameter
     * (effective) centre is about 85 kHz (skin depth 66.1 um at 1 MHz,
     * REFERENCES.md, scaled by 1/sqrt(f)) */
    bad_also("loss --cable RG-316 --length 10m --freq 50kHz", "freq", "physical model");
    bad_with_file("loss --cables %s --cable myspool --length 10m --band 80m", spool_csv,
                  sizeof spool_csv - 1, "cable", "no loss table and no diameters");
}
END_TEST

/* A user file that must be refused with one line naming it and the line. */
static void bad_file(const char *option, const char *text, const char *where, const char *word)
{
    char *path = temp_file(text, strlen(text));
    char args[1024], want[600];
    if (strcmp(option, "cable-loss") == 0)
        snprintf(args, sizeof args, "loss --cable-loss %s --cable RG-58 "
                 "--length 1m --freq 7MHz", path);
    else
        snprintf(args, sizeof args, "cables --%s %s", option, path);
    snprintf(want, sizeof want, "%s%s", path, where);
    bad_also(args, option, want);
    bad_also(args, option, word);
    unlink(path);
    free(path);
}

START_TEST(user_file_errors)
{
    bad_file("cables", "name,vf,colour\nx,0.8,red\n", ":1:", "colour");
    bad_file("cables", "name,vf\nspool a,0.8\nSPOOL A,0.81\n", ":3:", "SPOOL A");
    bad_file("cables", "name,vf\nrg-58,0.66\n", ":2:", "rg-58");
    bad_file("cables", "name,vf\nok,0.8\nno vf,\n", ":3:", "missing");
    bad_file("cables", "name,vf\nx,\"0,83\"\n", ":2:", "vf");
    bad_file("cables", "name,vf\r\nx,1.3\r\n", ":2:", "vf");
    bad_file("cable-loss", "name,freq_mhz,loss_db_per_100m\nnobody,7,2\n", ":2:", "nobody");
    bad_file("cable-loss", "name,freq_mhz,loss_db_per_100m\nRG-58,7,2\n", ":2:", "built in");
    bad_file("cable-loss", "name,freq_mhz\nRG-58,7\n", ":1:", "loss_db_per_100m");
    bad_also("cables --cables /nonexistent/cables.csv", "cables", "/nonexistent/cables.csv");
    bad_also("cut --cables /nonexistent/cables.csv --cable x --offset 1m", "cables", "/nonexistent/cables.csv");
    /* through the environment: the folder's cables.csv is read */
    char dir[] = "/tmp/coaxline-dir-XXXXXX", path[128], env[160];
    ck_assert_ptr_nonnull(mkdtemp(dir));
    snprintf(path, sizeof path, "%s/cables.csv", dir);
    FILE *fp = fopen(path, "w");
    fputs("name,vf\nx,0.8\nx,0.8\n", fp);
    fclose(fp);
    snprintf(env, sizeof env, "COAXLINE_CABLE_DIR=%s", dir);
    expect_usage_error(env, "cables", "cables", path);
    unlink(path);
    rmdir(dir);
}
END_TEST

START_TEST(batch_spreadsheet)
{
    /* what a spreadsheet saves: byte-order mark, CRLF, quoted cells with
     * commas, a label that looks like a formula, and two bad rows */
    const char csv[] =
        "\xEF\xBB\xBF" "label,cable,length,band,swr\r\n"
        "\"north, main\",RG-6-foam,100m,160m,\r\n"
        "south,RG-6-foam,0m,160m,\r\n"
        "=1+1,RG-213,30m,\"80m,40m\",1.5\r\n"
        "east,RG-9999,30m,80m,\r\n"
        "west,rg-58,20m,40m,2\r\n";
    cli_result r = run_cli_with_file("loss --input %s --format csv", csv, sizeof csv - 1);
    ck_assert_int_eq(r.rc, 2);
    /* header + 3 (north) + 6 (=1+1) + 3 (west) rows */
    ck_assert_int_eq(count_lines(r.out), 13);
    has(r.out, "\n\"north, main\",RG-6-foam,160m,");
    has(r.out, "\n'=1+1,RG-213,40m,");
    has(r.out, "\nwest,RG-58,40m,7.000000,20.000,");
    ck_assert_int_eq(count_lines(r.err), 2);
    has(r.err, "line 3: length:");
    has(r.err, "line 5: cable: unknown cable 'RG-9999'");
    cli_result_free(&r);
}
END_TEST

/* ---- user spools in cut ------------------------------------------------- */

START_TEST(user_spool_cut)
{
    /* A measured VF kept as a named cable gives the same cut as --vf with
     * that value: L = VF c t (DESIGN.md), 0.831 * 299792458 m/s * 100 ns =
     * 24.913 m (hand worked) */
    char *cables = temp_file(spool_csv, sizeof spool_csv - 1);
    char args[512];
    cli_result direct = run_cli(NULL, "cut --vf 0.831 --delay 100ns --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(direct.rc, 0);
    has(direct.out, ",24.913,");
    snprintf(args, sizeof args, "cut --cables %s --cable myspool --delay 100ns --freq 1.83MHz --format csv",
             cables);
    cli_result named = run_cli(NULL, args, NULL);
    ck_assert_int_eq(named.rc, 0);
    ck_assert_str_eq(named.out, direct.out);
    /* the same through COAXLINE_CABLE_DIR (cables.csv in that folder) */
    char dir[] = "/tmp/coaxline-dir-XXXXXX", path[128], env[160];
    ck_assert_ptr_nonnull(mkdtemp(dir));
    snprintf(path, sizeof path, "%s/cables.csv", dir);
    FILE *fp = fopen(path, "w");
    fputs(spool_csv, fp);
    fclose(fp);
    snprintf(env, sizeof env, "COAXLINE_CABLE_DIR=%s", dir);
    cli_result viaenv = run_cli(env, "cut --cable MySpool --delay 100ns --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(viaenv.rc, 0);
    ck_assert_str_eq(viaenv.out, direct.out);
    cli_result_free(&viaenv);
    /* and its loss points, from cable_loss.csv in the same folder */
    snprintf(path, sizeof path, "%s/cable_loss.csv", dir);
    fp = fopen(path, "w");
    fputs(spool_loss_csv, fp);
    fclose(fp);
    viaenv = run_cli(env, "loss --cable myspool --length 100m --freq 1MHz --format csv", NULL);
    ck_assert_int_eq(viaenv.rc, 0);
    has(viaenv.out, ",myspool,,1.000000,100.000,3.000,"); /* as loss_swr_total */
    cli_result_free(&viaenv);
    /* the listing shows the user row */
    viaenv = run_cli(env, "cables --format csv", NULL);
    ck_assert_int_eq(viaenv.rc, 0);
    has(viaenv.out, "\nmyspool,75.0,0.8310,,,,,,no,2,1.000,4.000,drum 4 measured at the bench,");
    cli_result_free(&viaenv);
    viaenv = run_cli(env, "cables", NULL);
    has(viaenv.out, "15 built in, 1 from user files");
    cli_result_free(&viaenv);
    unlink(path);
    snprintf(path, sizeof path, "%s/cables.csv", dir);
    unlink(path);
    rmdir(dir);
    cli_result_free(&direct);
    cli_result_free(&named);
    unlink(cables);
    free(cables);
}
END_TEST

START_TEST(comma_locale_same_bytes)
{
    const char *cases[] = {
        "cables", "cables --format csv", "cables --format json", "cables --cable RG-6-foam",
        "loss --cable RG-6-foam --length 100m --band 160m,80m --swr 1.5",
        "loss --cable RG-6-foam --length 100m --band 160m,80m --swr 1.5 --format csv",
        "loss --cable RG-213 --length 41ft --freq 7.1MHz --model physical --format json",
    };
    expect_same_bytes_in_comma_locale(cases, sizeof cases / sizeof cases[0], 0);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_cables");
    TCase *tc = tcase_create("cables_loss");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, cables_list);
    tcase_add_test(tc, cables_spreadsheet_file);
    tcase_add_test(tc, cables_csv_and_json);
    tcase_add_test(tc, cables_detail);
    tcase_add_test(tc, loss_matches_table_interpolation);
    tcase_add_test(tc, loss_160m_text);
    tcase_add_test(tc, loss_physical_vs_fitted);
    tcase_add_test(tc, loss_swr_total);
    tcase_add_test(tc, loss_json);
    tcase_add_test(tc, loss_extrapolate);
    tcase_add_test(tc, loss_bad_input);
    tcase_add_test(tc, user_file_errors);
    tcase_add_test(tc, batch_spreadsheet);
    tcase_add_test(tc, user_spool_cut);
    tcase_add_test(tc, comma_locale_same_bytes);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
