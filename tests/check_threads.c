/* check_threads.c - the library's main functions called from several
 * threads at once give exactly the single-threaded results (run under
 * ThreadSanitizer in CI: build-aux/harden.sh tsan).
 *
 * Two kinds of work: what a batch row of `cut` does (parsing, line math,
 * formatting, a CSV parse), and a pass over the main functions on a
 * catalog of the thread's own: each unit builds its catalog and band
 * table, loads a user cable and its loss points from a buffer through
 * fmemopen, and computes fitted and physical loss, a stub fit, a pair
 * check, a band lookup, an array RDF, a transfer and a trim solve.  The
 * results are compared bit for bit with those of the same unit run
 * alone.  No values are checked against a reference here (the module
 * suites do that); the invented cable is only made plausible. */
#include <config.h>
#include <check.h>
#include <locale.h>
#include <math.h>
#include <pthread.h>
#include <stdint.h>
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

/* NTHREADS threads of fn at once; each returns its count of mismatches. */
static void run_threads(void *(*fn)(void *))
{
    pthread_t th[NTHREADS];
    for (long t = 0; t < NTHREADS; t++)
        ck_assert_int_eq(pthread_create(&th[t], NULL, fn, (void *)t), 0);
    for (int t = 0; t < NTHREADS; t++) {
        void *res = NULL;
        pthread_join(th[t], &res);
        ck_assert_int_eq((long)res, 0);
    }
}

START_TEST(same_results_in_threads)
{
    for (int i = 0; i < ROUNDS; i++) work(i, expected[i], sizeof expected[i]);
    run_threads(thread_main);
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
    run_threads(thread_main);
    ck_assert_str_ne(expected[0], "error");
    freelocale(thread_locale);
    thread_locale = (locale_t)0;
}
END_TEST


/* ---- main functions on a catalog of the thread's own ---------------------- */

#define NSEEDS 12
#define NRESULTS 32
#define C CXL_C_M_PER_S

typedef struct catalog_result {
    int status[16];          /* status of each step, CXL_OK when it ran */
    int nstatus, nv;         /* steps and results written */
    double v[NRESULTS];
} catalog_result;

/* A unit of work on seed: results into *r (all bits compared). */
static void catalog_work(int seed, catalog_result *r)
{
    memset(r, 0, sizeof *r);
    for (int k = 0; k < NRESULTS; k++) r->v[k] = NAN;
    int s = 0, k = 0;
    cxl_bands *bands = NULL;
    cxl_catalog *cat = NULL;
    cxl_loss_fit *fit = NULL;
    cxl_loss_model *model = NULL;
    cxl_stub *stub = NULL;
    cxl_stub_result *sres = NULL;
    cxl_duo *pair = NULL;
    cxl_trim *trim = NULL;
    cxl_trim_result *tres = NULL;

    /* an invented foam cable per seed, with two loss points */
    char name[32], cables[512], loss[256];
    double vf = 0.78 + (seed % 10) * 0.01;
    snprintf(name, sizeof name, "bench-%d", seed);
    snprintf(cables, sizeof cables,
             "name,z0_ohm,vf,inner_diameter_mm,dielectric_diameter_mm,source\n"
             "%s,75,%.2f,%.2f,4.57,invented thread-test spool\n", name, vf,
             0.9 + (seed % 5) * 0.02);
    snprintf(loss, sizeof loss,
             "name,freq_mhz,loss_db_per_100m,source\n"
             "%s,5,%.1f,invented\n%s,50,%.1f,invented\n", name, 1.5 + seed % 3 * 0.1, name,
             5.0 + seed % 4 * 0.2);
    r->status[s++] = cxl_bands_new(&bands);
    r->status[s++] = cxl_catalog_new(&cat);
    if (!bands || !cat) goto done;
    FILE *fp = fmemopen(cables, strlen(cables), "r");
    r->status[s++] = fp ? cxl_catalog_load_cables(cat, fp, "cables.csv", NULL, NULL, 0) : CXL_EIO;
    if (fp) fclose(fp);
    fp = fmemopen(loss, strlen(loss), "r");
    r->status[s++] = fp ? cxl_catalog_load_loss(cat, fp, "loss.csv", NULL, NULL, 0) : CXL_EIO;
    if (fp) fclose(fp);
    size_t idx = 0;
    r->status[s++] = cxl_catalog_find(cat, name, &idx);

    /* band lookup: 160 m in Region 1 + seed % 3 */
    double lo = NAN, hi = NAN;
    r->status[s++] = cxl_bands_edges(bands, "160m", 1 + seed % 3, 1, &lo, &hi);
    double f = 0.5 * (lo + hi);
    r->v[k++] = lo;
    r->v[k++] = hi;

    /* fitted and physical loss at the band centre */
    r->status[s++] = cxl_loss_fit_new_cable(cat, idx, &fit);
    if (fit) cxl_loss_fit_eval(fit, f, CXL_LOSS_EXTRAPOLATE, &r->v[k]);
    k++;
    r->status[s++] = cxl_loss_model_new_cable(cat, idx, &model);
    if (model) {
        cxl_loss_model_attenuation(model, f, CXL_LOSS_EXTRAPOLATE, &r->v[k]);
        cxl_loss_model_vf(model, f, CXL_LOSS_EXTRAPOLATE, &r->v[k + 1]);
    }
    k += 2;

    /* stub fit: 10 m open, its first three resonances at the cable's VF */
    r->status[s++] = cxl_stub_new(CXL_STUB_OPEN, &stub);
    for (int n = 1; stub && n <= 3; n++)
        cxl_stub_add_reading(stub, 10.0, (2 * n - 1) / 4.0 * vf * C / 10.0 * (1.0 + n * 1e-4), 0);
    if (stub) r->status[s] = cxl_stub_fit(stub, &sres);
    s++;
    if (sres) cxl_stub_result_vf(sres, &r->v[k], &r->v[k + 1]);
    k += 2;

    /* pair check of three lines */
    double lengths[3] = { 20.0, 20.0 + seed * 1e-3, 19.99 };
    cxl_verdict verdict = CXL_VERDICT_FAIL;
    r->status[s++] = cxl_pair_check(lengths, 3, 5.0, vf, f, 0.002, 0.005, &r->v[k],
                                    &r->v[k + 1], &r->v[k + 2], &verdict);
    r->v[k + 3] = verdict;
    k += 4;

    /* array RDF of a crossfire pair staggered 10 + seed m */
    double stagger = 10.0 + seed;
    r->status[s++] = cxl_duo_new(&pair);
    if (pair) {
        cxl_duo_set_geometry(pair, 0.0, stagger);
        cxl_duo_set_delay(pair, 1, stagger / C);
        cxl_duo_set_flip(pair, 1, 1);
        r->status[s] = cxl_duo_rdf(pair, f, &r->v[k]);
    }
    s++;
    k++;

    /* transfer of 30 m of the modelled cable into 100 - j20 ohm */
    if (model)
        r->status[s] = cxl_transfer_model(model, 30.0, f, CXL_LOSS_EXTRAPOLATE, 100.0, -20.0,
                                          &r->v[k], &r->v[k + 1], &r->v[k + 2]);
    s++;
    k += 3;

    /* trim 30 m read at two orders to 90 degrees at the band centre,
     * readings corrected with the model */
    r->status[s++] = cxl_trim_new(CXL_STUB_OPEN, 30.0, &trim);
    if (trim) {
        cxl_trim_set_resolution(trim, 100.0);
        cxl_trim_add_reading(trim, 0.25 * vf * C / 30.0, 1);
        cxl_trim_add_reading(trim, 0.75 * vf * C / 30.0 * (1.0 - 2e-4), 2);
        cxl_trim_target_degrees(trim, 90.0, f);
        cxl_trim_set_model(trim, model);
        r->status[s] = cxl_trim_solve(trim, &tres);
    }
    s++;
    if (tres) {
        cxl_trim_action act = CXL_TRIM_SHORT;
        cxl_trim_result_cut(tres, &r->v[k], &r->v[k + 1], &r->v[k + 2], &act);
        cxl_trim_result_vf(tres, NULL, &r->v[k + 3], NULL);
        r->v[k + 4] = act;
        cxl_trim_result_reading(tres, 1, NULL, NULL, NULL, &r->v[k + 5], NULL);
    }
    k += 6;
    r->nstatus = s;
    r->nv = k;

done:
    cxl_trim_result_free(tres);
    cxl_trim_free(trim);
    cxl_duo_free(pair);
    cxl_stub_result_free(sres);
    cxl_stub_free(stub);
    cxl_loss_model_free(model);
    cxl_loss_fit_free(fit);
    cxl_catalog_free(cat);
    cxl_bands_free(bands);
}

static catalog_result catalog_expected[NSEEDS];

static void *catalog_thread(void *arg)
{
    long id = (long)arg, mismatches = 0;
    catalog_result got;
    for (int i = 0; i < 3 * NSEEDS; i++) {
        int seed = (int)((i + id * 5) % NSEEDS);
        catalog_work(seed, &got);
        /* bit for bit: NaN where a step did not run compares equal too */
        if (memcmp(&got, &catalog_expected[seed], sizeof got) != 0) mismatches++;
    }
    return (void *)mismatches;
}

START_TEST(catalogs_in_threads)
{
    for (int i = 0; i < NSEEDS; i++) {
        catalog_work(i, &catalog_expected[i]);
        /* every step ran and gave a finite number (else the comparison
         * would only compare failures) */
        ck_assert_int_eq(catalog_expected[i].nstatus, 16);
        ck_assert_int_eq(catalog_expected[i].nv, 21);
        for (int st = 0; st < catalog_expected[i].nstatus; st++)
            ck_assert_msg(catalog_expected[i].status[st] == CXL_OK, "seed %d step %d: %s", i, st,
                          cxl_strerror(catalog_expected[i].status[st]));
        for (int k = 0; k < catalog_expected[i].nv; k++)
            ck_assert_msg(isfinite(catalog_expected[i].v[k]), "seed %d result %d", i, k);
    }
    run_threads(catalog_thread);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("threads");
    TCase *tc = tcase_create("core");
    tcase_set_timeout(tc, 120);
    tcase_add_test(tc, same_results_in_threads);
    tcase_add_test(tc, same_results_under_thread_locale);
    tcase_add_test(tc, catalogs_in_threads);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
