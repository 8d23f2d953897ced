/* check_units.c - parsing and formatting of lengths, frequencies, times. */
#include <config.h>
#include <check.h>
#include <float.h>
#include <locale.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

/* Inch and foot are exact by definition: 1 in = 25.4 mm, 1 ft = 0.3048 m
 * (International Yard and Pound Agreement, 1959). */
#define IN 0.0254
#define FT 0.3048
#define TOL(x) (4 * DBL_EPSILON * fabs(x))

static double len(const char *s, cxl_units u)
{
    double v = -999.0;
    size_t pos = 0;
    ck_assert_msg(cxl_units_parse_length(s, u, &v, &pos) == CXL_OK, "parse '%s' failed at %zu", s, pos);
    return v;
}

START_TEST(lengths_metric)
{
    /* SI prefixes m, c (SI Brochure, 9th ed., BIPM 2019, table of SI
     * prefixes, table number not checked); a bare
     * number is metres in metric and feet in imperial (the library's own
     * convention, coaxline.h) */
    ck_assert_double_eq_tol(len("12.5m", CXL_UNITS_METRIC), 12.5, TOL(12.5));
    ck_assert_double_eq_tol(len("1250mm", CXL_UNITS_METRIC), 1.25, TOL(1.25));
    ck_assert_double_eq_tol(len("125 cm", CXL_UNITS_METRIC), 1.25, TOL(1.25));
    ck_assert_double_eq(len("  8 M ", CXL_UNITS_METRIC), 8.0);
    ck_assert_double_eq(len("8", CXL_UNITS_METRIC), 8.0);
    ck_assert_double_eq_tol(len("8", CXL_UNITS_IMPERIAL), 8 * FT, TOL(8 * FT));
    ck_assert_double_eq(len("1e1m", CXL_UNITS_METRIC), 10.0);
    ck_assert_double_eq(len("-3m", CXL_UNITS_METRIC), -3.0);
}
END_TEST

START_TEST(lengths_imperial)
{
    /* definitions above; sums worked by hand */
    ck_assert_double_eq_tol(len("41ft", CXL_UNITS_METRIC), 41 * FT, TOL(41 * FT));
    ck_assert_double_eq_tol(len("498in", CXL_UNITS_METRIC), 498 * IN, TOL(498 * IN));
    ck_assert_double_eq_tol(len("41ft 6in", CXL_UNITS_METRIC), 498 * IN, TOL(498 * IN));
    ck_assert_double_eq_tol(len("41'6\"", CXL_UNITS_METRIC), 498 * IN, TOL(498 * IN));
    ck_assert_double_eq_tol(len("41' 6 3/8\"", CXL_UNITS_METRIC), 498.375 * IN, TOL(498.375 * IN));
    ck_assert_double_eq_tol(len("41ft 6 3/8in", CXL_UNITS_METRIC), 498.375 * IN, TOL(498.375 * IN));
    ck_assert_double_eq_tol(len("6 3/8in", CXL_UNITS_METRIC), 6.375 * IN, TOL(6.375 * IN));
    ck_assert_double_eq_tol(len("3/8\"", CXL_UNITS_METRIC), 0.375 * IN, TOL(0.375 * IN));
    ck_assert_double_eq_tol(len("2 FT 1 IN", CXL_UNITS_METRIC), 25 * IN, TOL(25 * IN));
    ck_assert_double_eq_tol(len("41' 6", CXL_UNITS_METRIC), 498 * IN, TOL(498 * IN));
}
END_TEST

static void bad_length(const char *s, cxl_status want, size_t want_pos)
{
    double v = 12345.0;
    size_t pos = 999;
    cxl_status st = cxl_units_parse_length(s, CXL_UNITS_METRIC, &v, &pos);
    ck_assert_msg(st == want, "'%s': status %d, wanted %d", s, st, want);
    ck_assert_msg(pos == want_pos, "'%s': error at %zu, wanted %zu", s, pos, want_pos);
    ck_assert_double_eq(v, 12345.0); /* no silent zero, output untouched */
}

START_TEST(length_errors)
{
    /* positions are byte offsets of the first character that does not fit */
    bad_length("12xyz", CXL_EPARSE, 2);
    bad_length("", CXL_EPARSE, 0);
    bad_length("   ", CXL_EPARSE, 3);
    bad_length("m", CXL_EPARSE, 0);
    bad_length("1,5m", CXL_EPARSE, 1);
    bad_length("3m 2ft", CXL_EPARSE, 3);
    bad_length("3/0in", CXL_ERANGE, 2);
    bad_length("1e999m", CXL_ERANGE, 0);
    bad_length("nan", CXL_EPARSE, 0);
    bad_length("inf m", CXL_EPARSE, 0);
    bad_length("0x10m", CXL_EPARSE, 1);
    bad_length("3/8m", CXL_EPARSE, 3);
    bad_length("12 m m", CXL_EPARSE, 5);
}
END_TEST

START_TEST(frequencies_and_times)
{
    /* SI prefixes k, M, G, n, u (SI Brochure, 9th ed., BIPM 2019, table of SI
     * prefixes, table number not checked);
     * unit names case-insensitive and a bare frequency in MHz are the
     * library's own conventions (coaxline.h): self-consistency */
    double v;
    ck_assert_int_eq(cxl_units_parse_freq("1830kHz", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 1.83e6, TOL(1.83e6));
    ck_assert_int_eq(cxl_units_parse_freq("1.83 Mhz", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 1.83e6, TOL(1.83e6));
    /* m is milli and M mega (SI Brochure, 9th ed., table of SI prefixes):
     * the one letter whose case changes the value is refused in the wrong
     * case instead of read as the other prefix */
    size_t pos = 0;
    v = -1.0;
    ck_assert_int_eq(cxl_units_parse_freq("5mHz", &v, &pos), CXL_EPARSE);
    ck_assert_uint_eq(pos, 1);
    ck_assert_int_eq(cxl_units_parse_freq("1.83 mhz", &v, NULL), CXL_EPARSE);
    ck_assert_double_eq(v, -1.0); /* untouched */
    ck_assert_int_eq(cxl_units_parse_time("1MS", &v, NULL), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_time("1PS", &v, NULL), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_length("5Mm", CXL_UNITS_METRIC, &v, NULL), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_length("5MM", CXL_UNITS_METRIC, &v, NULL), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_time("1mS", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 1e-3, TOL(1e-3));
    /* 1'000 is a thousands separator in Swiss usage (common practice, no
     * source), not 1 ft 0 in */
    ck_assert_int_eq(cxl_units_parse_length("1'000", CXL_UNITS_METRIC, &v, NULL), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_length("1'06", CXL_UNITS_METRIC, &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 0.3048 + 6 * 0.0254, TOL(0.4572)); /* 1 ft = 0.3048 m exactly (international foot, 1959) */
    ck_assert_int_eq(cxl_units_parse_freq("1830000HZ", &v, NULL), CXL_OK);
    ck_assert_double_eq(v, 1.83e6);
    ck_assert_int_eq(cxl_units_parse_freq("1.83", &v, NULL), CXL_OK); /* bare is MHz */
    ck_assert_double_eq_tol(v, 1.83e6, TOL(1.83e6));
    ck_assert_int_eq(cxl_units_parse_freq("0.05GHz", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 50e6, TOL(50e6));
    ck_assert_int_eq(cxl_units_parse_time("33.356ns", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 33.356e-9, TOL(33.356e-9));
    ck_assert_int_eq(cxl_units_parse_time("0.5us", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 0.5e-6, TOL(0.5e-6));
    ck_assert_int_eq(cxl_units_parse_time("0.5\xc2\xb5s", &v, NULL), CXL_OK);
    ck_assert_double_eq_tol(v, 0.5e-6, TOL(0.5e-6));
    ck_assert_int_eq(cxl_units_parse_time("12", &v, NULL), CXL_OK); /* bare is ns */
    ck_assert_double_eq_tol(v, 12e-9, TOL(12e-9));
    pos = 0;
    v = 7.0;
    ck_assert_int_eq(cxl_units_parse_freq("1.8 MHzz", &v, &pos), CXL_EPARSE);
    ck_assert_uint_eq(pos, 4);
    ck_assert_int_eq(cxl_units_parse_freq("1.8m", &v, &pos), CXL_EPARSE);
    ck_assert_int_eq(cxl_units_parse_time("5 parsecs", &v, &pos), CXL_EPARSE);
    /* a non-zero number that underflows to 0 is out of range, not zero */
    ck_assert_int_eq(cxl_units_parse_freq("1e-400", &v, &pos), CXL_ERANGE);
    ck_assert_int_eq(cxl_units_parse_freq("0e-400", &v, &pos), CXL_OK);
    ck_assert(v == 0.0);
    ck_assert_int_eq(cxl_units_parse_freq("1e400", &v, &pos), CXL_ERANGE);
    ck_assert_int_eq(cxl_units_parse_freq(NULL, &v, &pos), CXL_EINVAL);
    ck_assert_int_eq(cxl_units_parse_freq("1", NULL, &pos), CXL_EINVAL);
}
END_TEST

START_TEST(format_fixed_and_roundtrip)
{
    char b[64];
    ck_assert_int_eq(cxl_units_format_fixed(8.0, 3, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "8.000");
    ck_assert_int_eq(cxl_units_format_fixed(-0.0001, 3, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "0.000");
    ck_assert_int_eq(cxl_units_format_fixed(-2.5, 1, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "-2.5");
    ck_assert_int_eq(cxl_units_format_fixed(NAN, 3, b, sizeof b), CXL_EINVAL);
    ck_assert_int_eq(cxl_units_format_fixed(INFINITY, 3, b, sizeof b), CXL_EINVAL);
    ck_assert_int_eq(cxl_units_format_fixed(123456.0, 3, b, 5), CXL_ETOOLONG);
    /* round trip: every value formatted and parsed back is bit-identical */
    const double values[] = { 0.1, 1.0 / 3.0, 299792458.0, 33.3564095198152, 6.02e23, -1e-300, 5e-324 };
    for (size_t i = 0; i < sizeof values / sizeof values[0]; i++) {
        double back = 0;
        ck_assert_int_eq(cxl_units_format_roundtrip(values[i], b, sizeof b), CXL_OK);
        ck_assert_int_eq(cxl_units_parse_number(b, &back, NULL), CXL_OK);
        ck_assert_msg(back == values[i], "%s did not round-trip", b);
    }
}
END_TEST

START_TEST(format_imperial)
{
    char b[64];
    /* 8 m = 314.96 in = 26 ft 2.9606 in -> nearest 1/16 is 2 15/16 (hand worked) */
    ck_assert_int_eq(cxl_units_format_imperial(8.0, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "26 ft 2 15/16 in");
    ck_assert_int_eq(cxl_units_format_imperial(498.375 * IN, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "41 ft 6 3/8 in");
    ck_assert_int_eq(cxl_units_format_imperial(12 * IN, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "1 ft 0 in");
    ck_assert_int_eq(cxl_units_format_imperial(-0.5 * IN, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "-0 ft 0 1/2 in");
    /* round trip through the parser at 1/16 in resolution */
    for (double m = 0.01; m < 100.0; m *= 1.37) {
        double back = 0;
        ck_assert_int_eq(cxl_units_format_imperial(m, b, sizeof b), CXL_OK);
        char tape[80];
        /* "26 ft 2 15/16 in" -> "26ft 2 15/16in" is what a user types */
        long ft, in, num = 0, den = 1;
        int n = sscanf(b, "%ld ft %ld %ld/%ld in", &ft, &in, &num, &den);
        ck_assert_int_ge(n, 2);
        if (n == 4) snprintf(tape, sizeof tape, "%ldft %ld %ld/%ldin", ft, in, num, den);
        else snprintf(tape, sizeof tape, "%ld' %ld\"", ft, in);
        ck_assert_int_eq(cxl_units_parse_length(tape, CXL_UNITS_METRIC, &back, NULL), CXL_OK);
        ck_assert_double_le(fabs(back - m), IN / 32.0 + 1e-12);
    }
}
END_TEST

START_TEST(comma_locale_does_not_matter)
{
    const char *old = setlocale(LC_ALL, NULL);
    char saved[128];
    snprintf(saved, sizeof saved, "%s", old ? old : "C");
    if (!setlocale(LC_ALL, "de_DE.UTF-8")) {
        /* CI generates the locale; elsewhere this check cannot run */
        fprintf(stderr, "note: de_DE.UTF-8 not available, locale check skipped\n");
        return;
    }
    char b[64];
    double v = 0;
    ck_assert_int_eq(cxl_units_format_fixed(21.975202, 3, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "21.975");
    ck_assert_int_eq(cxl_units_format_roundtrip(0.25, b, sizeof b), CXL_OK);
    ck_assert_str_eq(b, "0.25");
    ck_assert_int_eq(cxl_units_parse_length("12.5m", CXL_UNITS_METRIC, &v, NULL), CXL_OK);
    ck_assert_double_eq(v, 12.5);
    ck_assert_int_eq(cxl_units_parse_length("12,5m", CXL_UNITS_METRIC, &v, NULL), CXL_EPARSE);
    ck_assert_str_eq(setlocale(LC_NUMERIC, NULL), "de_DE.UTF-8"); /* caller's locale unchanged */
    setlocale(LC_ALL, saved);
}
END_TEST

/* ---- format_fixed fast path (tests/bench) ----
 * cxl_units_format_fixed prints most values from an integer instead of
 * snprintf; the bytes must stay those of "%.*f" (ISO C11 7.21.6.1, the f
 * conversion; the check values come from the C library's own snprintf in
 * the "C" locale), with "-0.000" shown as "0.000" as before. */
static void expect_printf(double v, int d)
{
    char want[512], got[512];
    snprintf(want, sizeof want, "%.*f", d, v);
    const char *w = want;
    if (w[0] == '-' && strspn(w + 1, "0.") == strlen(w + 1)) w++;
    ck_assert_int_eq(cxl_units_format_fixed(v, d, got, sizeof got), CXL_OK);
    ck_assert_msg(strcmp(got, w) == 0, "%.17g with %d decimals: got %s, printf %s", v, d,
                  got, w);
}

START_TEST(format_fixed_matches_printf)
{
    /* exact binary ties (0.125, 2.5), values just off a tie (1.0005 is
     * 1.000499999...), the 2^52 limit of the fast path, tiny, huge,
     * negative and negative zero */
    const double special[] = { 0.0, -0.0, 0.125, 2.5, 3.5, -2.5, 0.0005, 1.0005, 3.5815,
                               5.51 * 0.65, 0.1, 0.7, 999.9995, 1e-320, -1e-320, 0.49999999999999994,
                               4503599627370495.5, 4503599627370496.0, 9007199254740993.0,
                               1e15 + 0.5, 123456789.0125, 1e22, -7.25e-5, 299792458.0 };
    for (size_t i = 0; i < sizeof special / sizeof special[0]; i++)
        for (int d = 0; d <= 17; d++) expect_printf(special[i], d);
    /* many pseudo-random values (xorshift64*, fixed seed): any magnitude,
     * and decimal numbers whose next digit is a 5, where rounding is
     * closest to a tie */
    unsigned long long x = 88172645463325252ULL;
    for (int i = 0; i < 200000; i++) {
        x ^= x >> 12; x ^= x << 25; x ^= x >> 27;
        unsigned long long r = x * 2685821657736338717ULL;
        double u = (double)(r >> 11) / 9007199254740992.0;
        int d = (int)(r % 10);
        double v = ldexp(u, (int)((r >> 4) % 80) - 30);
        if (r & 1) v = -v;
        expect_printf(v, d);
        double tie = (double)(r >> 24 & 0xFFFFF) * 10.0 + 5.0;
        expect_printf(tie / pow(10.0, d + 1), d);
    }
    /* the same bytes under a comma-decimal locale, for the fast path and
     * for a tie that takes the snprintf path */
    const char *old = setlocale(LC_ALL, NULL);
    char saved[128], b[64];
    snprintf(saved, sizeof saved, "%s", old ? old : "C");
    if (setlocale(LC_ALL, "de_DE.UTF-8")) {
        ck_assert_int_eq(cxl_units_format_fixed(3.14159, 3, b, sizeof b), CXL_OK);
        ck_assert_str_eq(b, "3.142"); /* pi to 3 decimals, from memory */
        ck_assert_int_eq(cxl_units_format_fixed(0.125, 2, b, sizeof b), CXL_OK);
        ck_assert_str_eq(b, "0.12"); /* exact tie, even digit: glibc "%.2f" in the C locale */
        setlocale(LC_ALL, saved);
    }
    ck_assert_int_eq(cxl_units_format_fixed(123.456, 3, b, 7), CXL_ETOOLONG);
    ck_assert_int_eq(cxl_units_format_fixed(123.456, 3, b, 8), CXL_OK);
    ck_assert_str_eq(b, "123.456");
}
END_TEST

/* ---- parse fast path (tests/bench) ----
 * Decimal numbers with few digits are converted without strtod; the
 * result must be the same double as the C library's strtod (ISO C11
 * 7.22.1.3; glibc rounds correctly), bit for bit. */
static void expect_strtod(const char *text)
{
    double got = -1.0;
    ck_assert_int_eq(cxl_units_parse_number(text, &got, NULL), CXL_OK);
    double want = strtod(text, NULL);
    ck_assert_msg(memcmp(&got, &want, sizeof got) == 0, "%s: got %.17g, strtod %.17g", text,
                  got, want);
}

START_TEST(parse_number_matches_strtod)
{
    /* around the limits of the fast path: 2^53 and 2^53 + 1, 10^22 and
     * 10^23, many digits, many leading and trailing zeros */
    const char *special[] = { "0", "0.0", "20.10", "0.1", "0.3", "1e22", "1e23", "1e-22",
                              "1e-23", "9007199254740992", "9007199254740993",
                              "9007199254740993e-5", "123456789012345678901234567890",
                              "0.000000000000000000000000000001", "4.9e-324", "2.5e-300",
                              "1.7976931348623157e308", "299792458", "0.66", "1.0005",
                              "00000000000000000000000000000000001.5", "1E5", "1e+5",
                              "18446744073709551615", "18446744073709551616" };
    for (size_t i = 0; i < sizeof special / sizeof special[0]; i++) expect_strtod(special[i]);
    /* pseudo-random decimals (xorshift64*, fixed seed): 1 to 20 digits, a
     * point anywhere, and sometimes an exponent */
    unsigned long long x = 0x2545F4914F6CDD1DULL;
    char text[64];
    for (int n = 0; n < 200000; n++) {
        size_t k = 0;
        x ^= x >> 12; x ^= x << 25; x ^= x >> 27;
        unsigned long long r = x * 2685821657736338717ULL;
        int ndig = 1 + (int)(r % 20), point = (int)((r >> 8) % (unsigned)(ndig + 1));
        for (int d = 0; d < ndig; d++) {
            if (d == point && d > 0) text[k++] = '.';
            x ^= x >> 12; x ^= x << 25; x ^= x >> 27;
            text[k++] = (char)('0' + (x * 2685821657736338717ULL >> 60) % 10);
        }
        if ((r >> 16) % 4 == 0)
            k += (size_t)snprintf(text + k, sizeof text - k, "e%d", (int)((r >> 20) % 61) - 30);
        text[k] = '\0';
        expect_strtod(text);
    }
}
END_TEST

int main(void)
{
    Suite *s = suite_create("units");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, lengths_metric);
    tcase_add_test(tc, lengths_imperial);
    tcase_add_test(tc, length_errors);
    tcase_add_test(tc, frequencies_and_times);
    tcase_add_test(tc, format_fixed_and_roundtrip);
    tcase_add_test(tc, format_imperial);
    tcase_add_test(tc, comma_locale_does_not_matter);
    suite_add_tcase(s, tc);
    /* The two comparisons with the C library run 400,000 and 200,000
     * values: about 1 s of CPU time each on a 2-core machine, alone.  On
     * that machine with a dozen other builds running, or under a
     * sanitizer, the wall time is many times that and Check's default 4 s
     * timeout (wall clock) fails them for no fault of the code.  The loop
     * sizes are what the fast paths of units.c are checked on, so they
     * keep their size and get a timeout sized for a loaded machine. */
    TCase *wide = tcase_create("against the C library");
    tcase_set_timeout(wide, 120);
    tcase_add_test(wide, format_fixed_matches_printf);
    tcase_add_test(wide, parse_number_matches_strtod);
    suite_add_tcase(s, wide);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
