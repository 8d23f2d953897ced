/* check_threads.c - the library's main functions called from several
 * threads at once give exactly the single-threaded results (run under
 * ThreadSanitizer in CI: build-aux/harden.sh tsan). */
#include <config.h>
#include <check.h>
#include <locale.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

#define NTHREADS 4
#define ROUNDS 200

/* One unit of work: everything a batch row of `cut` does, plus a small
 * CSV parse; returns a digest of the results as text. */
static void work(int seed, char *digest, size_t size)
{
    char text[64], out[64], tape[64];
    double len_m, delay_s, cut_m, qw_hz, deg;
    snprintf(text, sizeof text, "%d' %d %d/16\"", 10 + seed % 50, seed % 12, seed % 16);
    size_t used = 0;
    if (cxl_units_parse_length(text, CXL_UNITS_METRIC, &len_m, NULL) != CXL_OK ||
        cxl_line_delay_from_offset(len_m, &delay_s) != CXL_OK ||
        cxl_line_cut_length(delay_s, 0.66 + (seed % 30) / 100.0, 0.05, 0.7, &cut_m) != CXL_OK ||
        cxl_line_quarter_wave_freq(cut_m, 0.8, &qw_hz) != CXL_OK ||
        cxl_line_degrees_from_delay(delay_s, 1.83e6, &deg) != CXL_OK ||
        cxl_units_format_roundtrip(cut_m, out, sizeof out) != CXL_OK ||
        cxl_units_format_imperial(cut_m, tape, sizeof tape) != CXL_OK) {
        snprintf(digest, size, "error");
        return;
    }
    used += (size_t)snprintf(digest + used, size - used, "%s|%s|", out, tape);
    cxl_units_format_fixed(qw_hz, 1, out, sizeof out);
    used += (size_t)snprintf(digest + used, size - used, "%s|", out);
    char csv[128];
    int n = snprintf(csv, sizeof csv, "a,\"b,%d\"\r\n%s,x\n", seed, text);
    cxl_csv_reader *r = NULL;
    int has = 0;
    if (cxl_csv_reader_new_buffer(csv, (size_t)n, &r) == CXL_OK) {
        while (cxl_csv_reader_next(r, &has) == CXL_OK && has)
            used += (size_t)snprintf(digest + used, size - used, "%s;",
                                     cxl_csv_reader_field(r, 1));
        cxl_csv_reader_free(r);
    }
}

static char expected[ROUNDS][256];

/* Per-thread locale for thread_main: (locale_t)0 keeps the global one. */
static locale_t thread_locale;

static void *thread_main(void *arg)
{
    long id = (long)arg;
    if (thread_locale) uselocale(thread_locale);
    char got[256];
    long mismatches = 0;
    for (int round = 0; round < ROUNDS; round++) {
        int seed = (int)((round + id * 37) % ROUNDS);
        work(seed, got, sizeof got);
        if (strcmp(got, expected[seed]) != 0) mismatches++;
    }
    return (void *)mismatches;
}

START_TEST(same_results_in_threads)
{
    for (int i = 0; i < ROUNDS; i++) work(i, expected[i], sizeof expected[i]);
    pthread_t th[NTHREADS];
    for (long t = 0; t < NTHREADS; t++)
        ck_assert_int_eq(pthread_create(&th[t], NULL, thread_main, (void *)t), 0);
    for (int t = 0; t < NTHREADS; t++) {
        void *res = NULL;
        pthread_join(th[t], &res);
        ck_assert_int_eq((long)res, 0);
    }
    ck_assert_str_ne(expected[0], "error");
}
END_TEST

/* The same under a per-thread comma-decimal locale (uselocale changes what
 * strtod and printf do in that thread only, so a process-wide check would
 * not see a library that leans on them). */
START_TEST(same_results_under_thread_locale)
{
    thread_locale = newlocale(LC_ALL_MASK, "de_DE.UTF-8", (locale_t)0);
    if (!thread_locale) {
        fprintf(stderr, "note: de_DE.UTF-8 not available, per-thread locale check skipped\n");
        return;
    }
    for (int i = 0; i < ROUNDS; i++) work(i, expected[i], sizeof expected[i]);
    pthread_t th[NTHREADS];
    for (long t = 0; t < NTHREADS; t++)
        ck_assert_int_eq(pthread_create(&th[t], NULL, thread_main, (void *)t), 0);
    for (int t = 0; t < NTHREADS; t++) {
        void *res = NULL;
        pthread_join(th[t], &res);
        ck_assert_int_eq((long)res, 0);
    }
    ck_assert_str_ne(expected[0], "error");
    freelocale(thread_locale);
    thread_locale = (locale_t)0;
}
END_TEST

int main(void)
{
    Suite *s = suite_create("threads");
    TCase *tc = tcase_create("core");
    tcase_set_timeout(tc, 120);
    tcase_add_test(tc, same_results_in_threads);
    tcase_add_test(tc, same_results_under_thread_locale);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
