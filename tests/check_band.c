/* check_band.c - the built-in band table and band-file reader.
 *
 * Edge values: ITU Radio Regulations, Edition 2020, Vol. I, Article 5,
 * Table of Frequency Allocations ("RR Art. 5" below); where the value was
 * checked only against a published quotation of the table or is from
 * memory, the comment says so.
 */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

/* Table values are given to 0.1 kHz; 1 mHz is far below that. */
#define EDGE_TOL_HZ 1e-3

static cxl_bands *bands;

static void setup(void)
{
    ck_assert_int_eq(cxl_bands_new(&bands), CXL_OK);
}

static void teardown(void)
{
    cxl_bands_free(bands);
    bands = NULL;
}

static void expect_edges(const char *band, int region, int footnotes,
                         double low_khz, double high_khz)
{
    double lo = -1.0, hi = -1.0;
    ck_assert_msg(cxl_bands_edges(bands, band, region, footnotes, &lo, &hi) == CXL_OK,
                  "edges of %s region %d", band, region);
    ck_assert_double_eq_tol(lo, low_khz * 1e3, EDGE_TOL_HZ);
    ck_assert_double_eq_tol(hi, high_khz * 1e3, EDGE_TOL_HZ);
}

START_TEST(test_160m_by_region)
{
    /* RR Art. 5: Region 1 1810-1850 kHz; Regions 2 and 3 1800-2000 kHz
     * (Region 1: checked against a published quotation of the table;
     * Regions 2 and 3: from memory) */
    expect_edges("160m", 1, 0, 1810.0, 1850.0);
    expect_edges("160m", 2, 0, 1800.0, 2000.0);
    expect_edges("160m", 3, 0, 1800.0, 2000.0);
    /* RR No. 5.96: up to 200 kHz within 1715-1800 and 1850-2000 kHz in
     * listed Region 1 countries (checked against a published quotation) */
    expect_edges("160m", 1, 1, 1715.0, 2000.0);
    /* widest across Regions: without footnotes 1800-2000, with 1715-2000 */
    expect_edges("160m", 0, 0, 1800.0, 2000.0);
    expect_edges("160m", 0, 1, 1715.0, 2000.0);
}
END_TEST

START_TEST(test_low_bands)
{
    /* RR Art. 5: 80 m R1 3500-3800, R2 3500-4000, R3 3500-3900 kHz
     * (checked against a published quotation of the table) */
    expect_edges("80m", 1, 1, 3500.0, 3800.0);
    expect_edges("80m", 2, 1, 3500.0, 4000.0);
    expect_edges("80m", 3, 1, 3500.0, 3900.0);
    expect_edges("80m", 0, 1, 3500.0, 4000.0);
    /* RR Art. 5: 40 m R1 and R3 7000-7200, R2 7000-7300 kHz (checked
     * against a published quotation; R2 upper part see RR No. 5.142) */
    expect_edges("40m", 1, 1, 7000.0, 7200.0);
    expect_edges("40m", 2, 1, 7000.0, 7300.0);
    expect_edges("40m", 0, 1, 7000.0, 7300.0);
    /* RR Art. 5: 2200 m 135.7-137.8 kHz in all Regions (checked against a
     * published quotation); 630 m 472-479 kHz (from memory); 60 m
     * 5351.5-5366.5 kHz, WRC-15 (checked against published summaries) */
    expect_edges("2200m", 0, 1, 135.7, 137.8);
    expect_edges("630m", 2, 1, 472.0, 479.0);
    expect_edges("60m", 3, 1, 5351.5, 5366.5);
}
END_TEST

START_TEST(test_high_bands)
{
    /* RR Art. 5, from memory: 30 m 10100-10150, 20 m 14000-14350, 17 m
     * 18068-18168, 15 m 21000-21450, 12 m 24890-24990, 10 m 28000-29700 */
    expect_edges("30m", 0, 1, 10100.0, 10150.0);
    expect_edges("20m", 1, 1, 14000.0, 14350.0);
    expect_edges("17m", 2, 1, 18068.0, 18168.0);
    expect_edges("15m", 3, 1, 21000.0, 21450.0);
    expect_edges("12m", 0, 1, 24890.0, 24990.0);
    expect_edges("10m", 0, 1, 28000.0, 29700.0);
    /* RR Art. 5 after WRC-19: 6 m Region 1 50-52 MHz; RR No. 5.169: 50-54
     * MHz in listed countries; Regions 2 and 3 50-54 MHz (checked against
     * published summaries of WRC-19) */
    expect_edges("6m", 1, 0, 50000.0, 52000.0);
    expect_edges("6m", 1, 1, 50000.0, 54000.0);
    expect_edges("6m", 2, 0, 50000.0, 54000.0);
}
END_TEST

START_TEST(test_medium_wave)
{
    /* RR Art. 5 broadcasting: R1 and R3 526.5-1606.5 kHz, R2 525-1705 kHz
     * (525-535 kHz RR No. 5.86, 1605-1705 kHz RR No. 5.89; checked against
     * a published quotation of the table) */
    expect_edges("mw", 1, 1, 526.5, 1606.5);
    expect_edges("mw", 2, 1, 525.0, 1705.0);
    expect_edges("mw", 3, 1, 526.5, 1606.5);
    expect_edges("MW", 0, 1, 525.0, 1705.0);
}
END_TEST

START_TEST(test_every_band_every_region)
{
    static const char *const names[] = {
        "2200m", "630m", "160m", "80m", "60m", "40m", "30m", "20m", "17m",
        "15m", "12m", "10m", "6m", "mw"
    };
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
        for (int region = 0; region <= 3; region++) {
            double lo, hi;
            ck_assert_int_eq(cxl_bands_edges(bands, names[i], region, 0, &lo, &hi), CXL_OK);
            ck_assert(lo > 0.0 && hi > lo);
        }
    }
    /* every row names its source and its service; footnote rows are R1 */
    size_t n = cxl_bands_count(bands);
    ck_assert_uint_eq(n, 45);   /* the rows of data/bands.csv (self-consistency) */
    for (size_t i = 0; i < n; i++) {
        const char *name, *footnote, *source;
        cxl_service service;
        int region;
        double lo, hi;
        ck_assert_int_eq(cxl_bands_get(bands, i, &name, &service, &region, &lo, &hi,
                                       &footnote, &source), CXL_OK);
        ck_assert(strstr(source, "ITU Radio Regulations, Edition 2020") != NULL);
        ck_assert(service == (strcmp(name, "mw") == 0 ? CXL_SERVICE_BROADCAST
                                                        : CXL_SERVICE_AMATEUR));
        if (footnote[0] != '\0') ck_assert_int_eq(region, 1);
    }
}
END_TEST

START_TEST(test_names)
{
    double lo, hi;
    ck_assert_int_eq(cxl_bands_edges(bands, "160", 2, 0, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(lo, 1800e3, EDGE_TOL_HZ); /* RR Art. 5 as above */
    ck_assert_int_eq(cxl_bands_edges(bands, " 160M ", 2, 0, &lo, &hi), CXL_OK);
    ck_assert_int_eq(cxl_bands_edges(bands, "160 m", 2, 0, &lo, &hi), CXL_OK);
    ck_assert_int_eq(cxl_bands_edges(bands, "Mw", 2, 0, &lo, &hi), CXL_OK);
    ck_assert_int_eq(cxl_bands_edges(bands, "11m", 0, 1, &lo, &hi), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_bands_edges(bands, "", 0, 1, &lo, &hi), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_bands_edges(bands, "160mm", 0, 1, &lo, &hi), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_bands_edges(bands, "a-very-long-band-name", 0, 1, &lo, &hi),
                     CXL_ENOTFOUND);
}
END_TEST

START_TEST(test_bad_arguments)
{
    double lo = 7.0, hi = 8.0;
    ck_assert_int_eq(cxl_bands_new(NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_edges(bands, "160m", 4, 1, &lo, &hi), CXL_ERANGE);
    ck_assert_int_eq(cxl_bands_edges(bands, "160m", -1, 1, &lo, &hi), CXL_ERANGE);
    ck_assert_int_eq(cxl_bands_edges(NULL, "160m", 1, 1, &lo, &hi), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_edges(bands, NULL, 1, 1, &lo, &hi), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_edges(bands, "160m", 1, 1, NULL, &hi), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_edges(bands, "160m", 1, 1, &lo, NULL), CXL_EINVAL);
    /* outputs untouched on failure */
    ck_assert_double_eq(lo, 7.0);
    ck_assert_double_eq(hi, 8.0);
    ck_assert_int_eq(cxl_bands_get(bands, cxl_bands_count(bands), NULL, NULL, NULL,
                                   NULL, NULL, NULL, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_get(NULL, 0, NULL, NULL, NULL, NULL, NULL, NULL, NULL),
                     CXL_EINVAL);
    ck_assert_uint_eq(cxl_bands_count(NULL), 0);
    cxl_bands_free(NULL);
    cxl_bands *b = NULL;
    ck_assert_int_eq(cxl_bands_new_stream(NULL, &b, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_bands_new_stream(stdin, NULL, NULL), CXL_EINVAL);
}
END_TEST

/* A user band file in a temporary stream. */
static FILE *text_stream(const char *text)
{
    FILE *f = tmpfile();
    ck_assert_ptr_nonnull(f);
    ck_assert_int_eq(fputs(text, f) >= 0, 1);
    rewind(f);
    return f;
}

START_TEST(test_user_file)
{
    /* an invented local plan: columns in another order, an extra column */
    FILE *f = text_stream(
        "source,band,note,region,service,low_khz,high_khz,footnote\r\n"
        "local plan (invented test data),160m,x,2,amateur,1830,1850,\r\n"
        "local plan (invented test data),160m,x,2,amateur,1900,1950,L1\r\n");
    cxl_bands *b = NULL;
    size_t line = 0;
    ck_assert_int_eq(cxl_bands_new_stream(f, &b, &line), CXL_OK);
    fclose(f);
    ck_assert_uint_eq(cxl_bands_count(b), 2);
    double lo, hi;
    ck_assert_int_eq(cxl_bands_edges(b, "160", 2, 0, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(lo, 1830e3, EDGE_TOL_HZ); /* the file's own rows */
    ck_assert_double_eq_tol(hi, 1850e3, EDGE_TOL_HZ);
    ck_assert_int_eq(cxl_bands_edges(b, "160", 0, 1, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(hi, 1950e3, EDGE_TOL_HZ);
    ck_assert_int_eq(cxl_bands_edges(b, "160", 1, 1, &lo, &hi), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_bands_edges(b, "80m", 0, 1, &lo, &hi), CXL_ENOTFOUND);
    cxl_bands_free(b);
}
END_TEST

static void expect_bad_file(const char *text, size_t want_line)
{
    FILE *f = text_stream(text);
    cxl_bands *b = NULL;
    size_t line = 0;
    ck_assert_int_eq(cxl_bands_new_stream(f, &b, &line), CXL_EPARSE);
    ck_assert_ptr_null(b);
    ck_assert_uint_eq(line, want_line);
    fclose(f);
}

START_TEST(test_user_file_errors)
{
    const char *h = "band,service,region,low_khz,high_khz,footnote,source\n";
    char buf[512];
    /* missing column */
    expect_bad_file("band,service,region,low_khz,high_khz,source\n160m,amateur,1,1,2,s\n", 1);
    /* region 4 */
    snprintf(buf, sizeof buf, "%s160m,amateur,1,1810,1850,,s\n160m,amateur,4,1800,2000,,s\n", h);
    expect_bad_file(buf, 3);
    /* low >= high */
    snprintf(buf, sizeof buf, "%s160m,amateur,1,1850,1810,,s\n", h);
    expect_bad_file(buf, 2);
    /* comma decimal mark, unknown service, empty source, no rows */
    snprintf(buf, sizeof buf, "%s160m,amateur,1,\"1810,5\",1850,,s\n", h);
    expect_bad_file(buf, 2);
    snprintf(buf, sizeof buf, "%s160m,fixed,1,1810,1850,,s\n", h);
    expect_bad_file(buf, 2);
    snprintf(buf, sizeof buf, "%s160m,amateur,1,1810,1850,,\n", h);
    expect_bad_file(buf, 2);
    expect_bad_file(h, 2); /* header only: no row where line 2 should be */
    /* a short row */
    snprintf(buf, sizeof buf, "%s160m,amateur,1,1810\n", h);
    expect_bad_file(buf, 2);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("band");
    TCase *tc = tcase_create("table");
    tcase_add_checked_fixture(tc, setup, teardown);
    tcase_add_test(tc, test_160m_by_region);
    tcase_add_test(tc, test_low_bands);
    tcase_add_test(tc, test_high_bands);
    tcase_add_test(tc, test_medium_wave);
    tcase_add_test(tc, test_every_band_every_region);
    tcase_add_test(tc, test_names);
    tcase_add_test(tc, test_bad_arguments);
    suite_add_tcase(s, tc);
    TCase *tf = tcase_create("file");
    tcase_add_test(tf, test_user_file);
    tcase_add_test(tf, test_user_file_errors);
    suite_add_tcase(s, tf);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
