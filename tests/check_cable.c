/* check_cable - the cable catalog: built-in data, user files, errors. */
#define _POSIX_C_SOURCE 200809L
#include <config.h>
#include <check.h>
#include <locale.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"
#include "failstream.h"

static cxl_catalog *cat;

static void setup(void)
{
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
}

static void teardown(void)
{
    cxl_catalog_free(cat);
    cat = NULL;
}

static size_t count(void)
{
    size_t n = 0;
    n = cxl_catalog_count(cat);
    return n;
}

/* Load text as a user cable (or loss) file. */
static cxl_status load(const char *text, int cables, size_t *line, char *msg, size_t size)
{
    FILE *f = fmemopen((void *)text, strlen(text), "r");
    ck_assert_ptr_nonnull(f);
    cxl_status st = cables ? cxl_catalog_load_cables(cat, f, "user.csv", line, msg, size)
                           : cxl_catalog_load_loss(cat, f, "user.csv", line, msg, size);
    fclose(f);
    return st;
}

/* A load that must fail with status st on line `line`, name `word` in the
 * message, and leave the catalog as it was. */
static void expect_error(const char *text, int cables, cxl_status st, size_t line,
                         const char *word)
{
    size_t before = count(), got_line = 0;
    char msg[256];
    ck_assert_int_eq(load(text, cables, &got_line, msg, sizeof msg), st);
    ck_assert_uint_eq(got_line, line);
    ck_assert_msg(strstr(msg, word) != NULL, "message '%s' lacks '%s'", msg, word);
    ck_assert_msg(strncmp(msg, "user.csv:", 9) == 0, "message '%s' lacks the file name", msg);
    ck_assert_uint_eq(count(), before);
}

/* ---- built-in data -------------------------------------------------------- */

START_TEST(test_builtin_rows_have_sources)
{
    /* common practice, no source: every built-in row and point names its source */
    size_t n = count();
    ck_assert_uint_ge(n, 12);
    for (size_t i = 0; i < n; i++) {
        const char *src, *name;
        int builtin;
        ck_assert_int_eq(cxl_catalog_name(cat, i, &name), CXL_OK);
        ck_assert_int_eq(cxl_catalog_source(cat, i, &src), CXL_OK);
        ck_assert_int_eq(cxl_catalog_is_builtin(cat, i, &builtin), CXL_OK);
        ck_assert_int_eq(builtin, 1);
        ck_assert_msg(strlen(src) > 20, "%s has no source", name);
        /* nominal or maximum must be said */
        ck_assert_msg(strstr(src, "nominal") || strstr(src, "typical"), "%s: %s", name, src);
        size_t np;
        np = cxl_catalog_loss_count(cat, i);
        double prev = 0.0;
        for (size_t k = 0; k < np; k++) {
            double f, l;
            ck_assert_int_eq(cxl_catalog_loss_point(cat, i, k, &f, &l, &src), CXL_OK);
            ck_assert_msg(strstr(src, "typical") || strstr(src, "nominal") ||
                          strstr(src, "maximum"), "%s point %zu: %s", name, k, src);
            ck_assert(f > prev); /* sorted, no repeats */
            prev = f;
        }
    }
}
END_TEST

START_TEST(test_builtin_geometry_matches_nominal_z0)
{
    /* Lossless coax: Z0 = (eta0 / (2 pi sqrt(eps_r))) ln(D/d), eta0/(2 pi) =
     * 59.9585 ohm (Pozar, Microwave Engineering, 4th ed., sec. 2.1, from
     * memory).  The catalog gives stranded centres at their effective
     * (solid-equivalent) diameter, so every row's geometry must give its
     * nominal Z0 within 2 % (the physical loss model and --cable into a
     * nominal load use these diameters; 2 % is common practice, no
     * source).  VF = 1/sqrt(eps_r)
     * for a TEM line (Pozar sec. 2.1); solid PE's 0.66 vs 1/1.5: 2 %. */
    size_t n = count();
    for (size_t i = 0; i < n; i++) {
        double d, dd, eps, z0, vf;
        const char *name;
        cxl_catalog_name(cat, i, &name);
        ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_INNER_DIAMETER_M, &d), CXL_OK);
        ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_DIELECTRIC_DIAMETER_M, &dd), CXL_OK);
        ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_RELATIVE_PERMITTIVITY, &eps), CXL_OK);
        ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_Z0_OHM, &z0), CXL_OK);
        ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_VF, &vf), CXL_OK);
        double ideal = 59.9585 / sqrt(eps) * log(dd / d);
        printf("%-16s %.2f ohm from geometry, %.0f nominal (%+.2f %%)\n", name, ideal, z0,
               100.0 * (ideal / z0 - 1.0));
        ck_assert_msg(fabs(ideal - z0) / z0 < 0.02, "%s: %.1f ohm from geometry, %.1f nominal",
                      name, ideal, z0);
        ck_assert_msg(fabs(1.0 / sqrt(eps) - vf) / vf < 0.02, "%s: vf %.3f eps_r %.3f",
                      name, vf, eps);
        ck_assert(d > 0.2e-3 && dd < 10e-3); /* miniature to large, in metres */
    }
}
END_TEST

START_TEST(test_defaults_and_lookup)
{
    size_t i, j;
    double v;
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-213", &i), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "rg-213", &j), CXL_OK);
    ck_assert_uint_eq(i, j);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-2130", &j), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-21", &j), CXL_ENOTFOUND);
    /* annealed copper, 100 % IACS: 58.0 MS/m (IEC 60028) */
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_CONDUCTIVITY_S_PER_M, &v), CXL_OK);
    ck_assert_double_eq_tol(v, 58.0e6, 1.0);
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_CONDUCTOR_LOSS_FACTOR, &v), CXL_OK);
    ck_assert_double_eq(v, 1.0); /* documented default, common practice */
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_CLAD_THICKNESS_M, &v), CXL_ENOTFOUND);
    const char *diel;
    ck_assert_int_eq(cxl_catalog_dielectric(cat, i, &diel), CXL_OK);
    ck_assert_str_eq(diel, "solid-PE");
    /* bad arguments */
    ck_assert_int_eq(cxl_catalog_value(cat, 9999, CXL_CABLE_VF, &v), CXL_ERANGE);
    ck_assert_int_eq(cxl_catalog_value(cat, i, (cxl_cable_prop)99, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_catalog_value(NULL, i, CXL_CABLE_VF, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_catalog_find(cat, NULL, &j), CXL_EINVAL);
    ck_assert_int_eq(cxl_catalog_new(NULL), CXL_EINVAL);
}
END_TEST

/* ---- user rows -------------------------------------------------------------- */

START_TEST(test_measured_spool_cut_length)
{
    size_t before = count(), i;
    ck_assert_int_eq(load("name,vf\nspool 7,0.831\n", 1, NULL, NULL, 0), CXL_OK);
    ck_assert_uint_eq(count(), before + 1);
    ck_assert_int_eq(cxl_catalog_find(cat, "SPOOL 7", &i), CXL_OK);
    double vf, z0, cut;
    int builtin;
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_VF, &vf), CXL_OK);
    ck_assert_double_eq(vf, 0.831);   /* as written in the file */
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_Z0_OHM, &z0), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_catalog_is_builtin(cat, i, &builtin), CXL_OK);
    ck_assert_int_eq(builtin, 0);
    /* L = VF c t (DESIGN.md, electrical length): 0.831 * 299792458 m/s * 100 ns */
    ck_assert_int_eq(cxl_line_cut_length(100e-9, vf, 0.0, 1.0, &cut), CXL_OK);
    ck_assert_double_eq_tol(cut, 24.91275326, 1e-7);   /* = 24.91275326 m by hand */
    /* no geometry: no physical model */
    cxl_loss_model *m;
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, i, &m), CXL_ENOTFOUND);
}
END_TEST

START_TEST(test_user_cable_full_row_and_loss)
{
    size_t i, n;
    const char *cables =
        "source,name,vf,z0_ohm,inner_diameter_mm,dielectric_diameter_mm,"
        "relative_permittivity,loss_tangent,conductivity_s_per_m,conductor_loss_factor,"
        "clad_thickness_mm,core_conductivity_s_per_m,core_relative_permeability,dielectric\r\n"
        "\"bench, drum 3\", drop 75 , 0.85 ,75,1.02,4.57,1.384,1e-4,,1.2,0.03,5.8e6,100,foam-PE\r\n";
    ck_assert_int_eq(load(cables, 1, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "drop 75", &i), CXL_OK); /* trimmed */
    double v;
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_INNER_DIAMETER_M, &v), CXL_OK);
    ck_assert_double_eq_tol(v, 1.02e-3, 1e-15);   /* 1.02 mm in the file, in metres */
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_CLAD_THICKNESS_M, &v), CXL_OK);
    ck_assert_double_eq_tol(v, 0.03e-3, 1e-15);   /* 0.03 mm in the file */
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_CONDUCTOR_LOSS_FACTOR, &v), CXL_OK);
    ck_assert_double_eq(v, 1.2);   /* as written in the file */
    const char *src;
    ck_assert_int_eq(cxl_catalog_source(cat, i, &src), CXL_OK);
    ck_assert_str_eq(src, "bench, drum 3");
    const char *loss = "name,loss_db_per_100m,freq_mhz\n"
                       "drop 75,12.5,100\nDROP 75,2.1,3.5\ndrop 75,4,10\n";
    ck_assert_int_eq(load(loss, 0, NULL, NULL, 0), CXL_OK);
    n = cxl_catalog_loss_count(cat, i);
    ck_assert_uint_eq(n, 3);
    double f, l;
    ck_assert_int_eq(cxl_catalog_loss_point(cat, i, 0, &f, &l, NULL), CXL_OK);
    ck_assert_double_eq_tol(f, 3.5e6, 1e-6);    /* lowest of the three, sorted */
    ck_assert_double_eq_tol(l, 0.021, 1e-15);   /* 2.1 dB/100 m in dB/m */
    ck_assert_int_eq(cxl_catalog_loss_point(cat, i, 3, &f, &l, NULL), CXL_ERANGE);
    /* a later point for the same cable at a new frequency is accepted ... */
    ck_assert_int_eq(load("name,freq_mhz,loss_db_per_100m\ndrop 75,30,7\n", 0, NULL, NULL, 0), CXL_OK);
    /* ... but not one at a frequency it already has */
    expect_error("name,freq_mhz,loss_db_per_100m\ndrop 75,50,9\ndrop 75,10,4.1\n", 0,
                 CXL_EDUPLICATE, 3, "freq_mhz");
    cxl_loss_model *m;
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, i, &m), CXL_OK);
    cxl_loss_model_free(m);
}
END_TEST

/* ---- malformed files ---------------------------------------------------------- */

START_TEST(test_cable_file_errors)
{
    expect_error("name,vf,colour\nx,0.8,red\n", 1, CXL_EPARSE, 1, "colour");
    expect_error("name,vf,vf\nx,0.8,0.8\n", 1, CXL_EPARSE, 1, "vf");
    expect_error("name,z0_ohm\nx,50\n", 1, CXL_EPARSE, 1, "vf");
    expect_error("name,vf\nrg-58,0.66\n", 1, CXL_EDUPLICATE, 2, "rg-58");
    expect_error("name,vf\nnew a,0.8\n\nNEW A,0.8\n", 1, CXL_EDUPLICATE, 4, "NEW A");
    expect_error("name,vf\nok,0.8\nno vf,\n", 1, CXL_EPARSE, 3, "column vf: missing");
    expect_error("name,vf\n ,0.8\n", 1, CXL_EPARSE, 2, "column name: missing");
    expect_error("name,vf\nx,\"0,83\"\n", 1, CXL_EPARSE, 2, "column vf: not a number");
    expect_error("name,vf\nx,1.2\n", 1, CXL_ERANGE, 2, "column vf: out of range");
    expect_error("name,vf,z0_ohm\nx,0.8,-50\n", 1, CXL_ERANGE, 2, "z0_ohm");
    expect_error("name,vf\nx,0.8,3\n", 1, CXL_EPARSE, 2, "fields");
    expect_error("name,vf,inner_diameter_mm,dielectric_diameter_mm\nx,0.8,3,2.9\n", 1,
                 CXL_ERANGE, 2, "inner_diameter_mm");
    expect_error("name,vf,clad_thickness_mm\nx,0.8,0.03\n", 1, CXL_EPARSE, 2,
                 "core_conductivity_s_per_m");
    expect_error("name,vf\nx,0.8\n\"y,0.8\n", 1, CXL_EPARSE, 3, "malformed");
    expect_error("", 1, CXL_EPARSE, 1, "header");
}
END_TEST

START_TEST(test_loss_file_errors)
{
    ck_assert_int_eq(load("name,vf\nmine,0.8\n", 1, NULL, NULL, 0), CXL_OK);
    expect_error("name,freq_mhz\nmine,10\n", 0, CXL_EPARSE, 1, "loss_db_per_100m");
    expect_error("name,freq_mhz,loss_db_per_100m,remark\n", 0, CXL_EPARSE, 1, "remark");
    expect_error("name,freq_mhz,loss_db_per_100m\nnobody,10,1\n", 0, CXL_ENOTFOUND, 2, "nobody");
    expect_error("name,freq_mhz,loss_db_per_100m\nRG-58,10,1\n", 0, CXL_EDUPLICATE, 2, "built in");
    expect_error("name,freq_mhz,loss_db_per_100m\nmine,10,1\nmine,20,\n", 0, CXL_EPARSE, 3,
                 "loss_db_per_100m: missing");
    expect_error("name,freq_mhz,loss_db_per_100m\nmine,-10,1\n", 0, CXL_ERANGE, 2, "freq_mhz");
    expect_error("name,freq_mhz,loss_db_per_100m\nmine,10,1\nmine,10.0,1\n", 0,
                 CXL_EDUPLICATE, 3, "freq_mhz");
}
END_TEST

START_TEST(test_error_text_truncated_and_optional)
{
    char small[12];
    size_t line = 0;
    memset(small, 'x', sizeof small);
    ck_assert_int_eq(load("name,vf,bogus\n", 1, &line, small, sizeof small), CXL_EPARSE);
    ck_assert_uint_eq(strlen(small), sizeof small - 1);
    ck_assert_uint_eq(line, 1);
    ck_assert_int_eq(load("name,vf,bogus\n", 1, NULL, NULL, 0), CXL_EPARSE);
    ck_assert_int_eq(cxl_catalog_load_cables(cat, NULL, NULL, NULL, NULL, 0), CXL_EINVAL);
    ck_assert_int_eq(cxl_catalog_load_loss(NULL, stdin, NULL, NULL, NULL, 0), CXL_EINVAL);
}
END_TEST

/* A read error part-way through a user file fails the load (CXL_EIO, the
 * line reached, "read error") and leaves the catalog as it was; so does an
 * endless line (a NUL, then bytes with no line end). */
START_TEST(test_read_errors)
{
    static const char text[] = "name,vf\nspool-a,0.80\nspool-b,0.81\nspool-c,0.82\n";
    size_t before = 0, after = 0;
    before = cxl_catalog_count(cat);
    for (size_t fail_at = 0; fail_at <= strlen(text); fail_at += 5) {
        FILE *fp = failstream_open(text, fail_at);
        ck_assert_ptr_nonnull(fp);
        char msg[200] = "";
        size_t line = 0;
        cxl_status st = cxl_catalog_load_cables(cat, fp, "spools.csv", &line, msg, sizeof msg);
        fclose(fp);
        ck_assert_msg(st == CXL_EIO, "failing at byte %zu: %s", fail_at, cxl_strerror(st));
        ck_assert_msg(strstr(msg, "read error") != NULL, "%s", msg);
        ck_assert_uint_ge(line, 1);
        after = cxl_catalog_count(cat);
        ck_assert_uint_eq(after, before);
    }
    size_t n = 3 * (size_t)CXL_CSV_MAX_SKIP;
    char *zeros = calloc(n + 1, 1);
    ck_assert_ptr_nonnull(zeros);
    memset(zeros + 1, 'z', n - 1);
    FILE *fp = fmemopen(zeros, n, "r");
    ck_assert_ptr_nonnull(fp);
    char msg[200] = "";
    ck_assert_int_eq(cxl_catalog_load_loss(cat, fp, "zero", NULL, msg, sizeof msg), CXL_ETOOLONG);
    ck_assert_msg(strstr(msg, "no line end") != NULL, "%s", msg);
    fclose(fp);
    free(zeros);
}
END_TEST

/* A spreadsheet's export: ';' with decimal commas, or TAB; a '.' in a ';'
 * file is refused (it would be a thousands separator there). */
START_TEST(test_spreadsheet_separators)
{
    size_t i;
    double v;
    ck_assert_int_eq(load("name;vf;z0_ohm\nsemi spool;0,81;75\n", 1, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "semi spool", &i), CXL_OK);
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_VF, &v), CXL_OK);
    ck_assert_double_eq(v, 0.81);   /* as written in the file */
    ck_assert_int_eq(load("name\tvf\ntab spool\t0.79\n", 1, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "tab spool", &i), CXL_OK);
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_VF, &v), CXL_OK);
    ck_assert_double_eq(v, 0.79);   /* as written in the file */
    ck_assert_int_eq(load("name;freq_mhz;loss_db_per_100m\nsemi spool;1,8;0,9\nsemi spool;30;4,25\n",
                          0, NULL, NULL, 0), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "semi spool", &i), CXL_OK);
    double f, l;
    ck_assert_int_eq(cxl_catalog_loss_point(cat, i, 0, &f, &l, NULL), CXL_OK);
    ck_assert_double_eq_tol(f, 1.8e6, 1e-6);    /* 1,8 MHz in the file */
    ck_assert_double_eq_tol(l, 0.009, 1e-15);   /* 0,9 dB/100 m in dB/m */
    expect_error("name;vf\ndot spool;0.81\n", 1, CXL_EPARSE, 2, "decimals with a comma");
}
END_TEST

START_TEST(test_comma_locale)
{
    /* numbers are read without the C locale: under a comma-decimal locale
     * the built-in 0.66 stays 0.66 (STYLE.md, locale-free numbers) */
    if (!setlocale(LC_ALL, "de_DE.UTF-8") && !setlocale(LC_ALL, "de_DE.utf8")) {
        printf("de_DE locale not installed: comma-locale check not run\n");
        return;
    }
    cxl_catalog *c2;
    size_t i;
    double vf;
    ck_assert_int_eq(cxl_catalog_new(&c2), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(c2, "RG-58", &i), CXL_OK);
    ck_assert_int_eq(cxl_catalog_value(c2, i, CXL_CABLE_VF, &vf), CXL_OK);
    ck_assert_double_eq(vf, 0.66);   /* RG-58's row in data/cables.csv */
    ck_assert_str_eq(localeconv()->decimal_point, ",");
    cxl_catalog_free(c2);
    setlocale(LC_ALL, "C");
}
END_TEST

int main(void)
{
    gsl_set_error_handler(NULL); /* GSL's default: abort, so a stray error is loud */
    Suite *s = suite_create("cable");
    TCase *tc = tcase_create("catalog");
    tcase_add_checked_fixture(tc, setup, teardown);
    tcase_add_test(tc, test_builtin_rows_have_sources);
    tcase_add_test(tc, test_builtin_geometry_matches_nominal_z0);
    tcase_add_test(tc, test_defaults_and_lookup);
    tcase_add_test(tc, test_measured_spool_cut_length);
    tcase_add_test(tc, test_user_cable_full_row_and_loss);
    tcase_add_test(tc, test_cable_file_errors);
    tcase_add_test(tc, test_loss_file_errors);
    tcase_add_test(tc, test_error_text_truncated_and_optional);
    tcase_add_test(tc, test_comma_locale);
    tcase_add_test(tc, test_spreadsheet_separators);
    tcase_add_test(tc, test_read_errors);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
