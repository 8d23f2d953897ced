/* bench_lib.c - what one call of the core library functions costs on this
 * machine (run by `make bench`, never by make check).
 *
 * Each figure is the median over REPEATS timed loops (CLOCK_MONOTONIC) of
 * the loop time divided by its number of calls; the loop length is chosen
 * so that one loop lasts about TARGET_S.  Inputs change from call to call
 * (so nothing can be hoisted out of the loop), every result is added into
 * an accumulator that ends in a volatile sink (so the work cannot be
 * removed), and every status is checked (so an error path is never what
 * gets timed).  Calls go through the shared library, as a host program's
 * would.
 *
 *   bench_lib [--quick]     (--quick: shorter loops, fewer repeats)
 */
#include <config.h>
#include <complex.h>
#include <time.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include "coaxline.h"
#include "timing.h"

static double target_s = 0.02;
static int repeats = 11;

static void check(cxl_status st, const char *what)
{
    if (st != CXL_OK) {
        fprintf(stderr, "bench_lib: %s: %s\n", what, cxl_strerror(st));
        exit(2);
    }
}

/* The objects the timed functions use, made once. */
typedef struct fixture {
    cxl_loss_fit *fit;
    cxl_loss_model *model;
    cxl_duo *pair;
    cxl_array *arr2, *arr8, *arr8v, *arr64;
    cxl_array *arr4;           /* yield: two end-fire pairs fed by lines */
    cxl_yield *yield1, *yield_all, *yield_null;
    const cxl_bands *bands;
    cxl_bands *bands_owned;
} fixture;


/* A small input change per call: 0 .. 0.255 in steps of 0.001. */
#define WIGGLE(i) ((double)((i) & 255) * 1e-3)

static double empty_loop(void *ctx, long n)
{
    (void)ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) acc += 20.0 + WIGGLE(i);
    return acc;
}

/* A timed body: n calls of CALL, which leaves its result in `out`. */
#define BENCH_BODY(name, what, call)                                  \
    static double name(void *ctx, long n)                             \
    {                                                                 \
        const fixture *fx = ctx;                                      \
        double acc = 0.0, out;                                        \
        (void)fx;                                                     \
        for (long i = 0; i < n; i++) {                                \
            check(call, what);                                        \
            acc += out;                                               \
        }                                                             \
        return acc;                                                   \
    }

BENCH_BODY(line_degrees, "degrees",
           cxl_line_degrees_from_length(20.0 + WIGGLE(i), 0.66, 1.83e6, &out))
/* 33.356 ns (a 10 m stagger) with 5 cm of connectors at VF 0.66 */
BENCH_BODY(line_cut, "cut",
           cxl_line_cut_length(33.356e-9 + WIGGLE(i) * 1e-9, 0.8, 0.05, 0.66, &out))
BENCH_BODY(pair_phase, "phase",
           cxl_pair_phase_error(20.1 + WIGGLE(i), 20.0, 0.66, 1.83e6, &out))
/* inside the table's range (30 MHz and up for RG-213) */
BENCH_BODY(loss_fit, "fit eval",
           cxl_loss_fit_eval(fx->fit, 50e6 + WIGGLE(i) * 1e6, 0, &out))
BENCH_BODY(loss_model, "model attenuation",
           cxl_loss_model_attenuation(fx->model, 1.83e6 + WIGGLE(i) * 1e5, 0, &out))
BENCH_BODY(array_rdf, "rdf", cxl_duo_rdf(fx->pair, 1.83e6 + WIGGLE(i) * 1e4, &out))
static cxl_status rdf_n(const cxl_array *a, long i, double *out)
{
    double fwd;
    return cxl_array_eval_rdf(a, 1.83e6 + WIGGLE(i) * 1e4, 0.0, &fwd, out);
}
BENCH_BODY(array_rdf2, "rdf 2", rdf_n(fx->arr2, i, &out))
BENCH_BODY(array_rdf8, "rdf 8", rdf_n(fx->arr8, i, &out))
BENCH_BODY(array_rdf8v, "rdf 8 vertical", rdf_n(fx->arr8v, i, &out))
BENCH_BODY(array_rdf64, "rdf 64", rdf_n(fx->arr64, i, &out))
/* What `coaxline pattern` computes for one row of 3 band points (160 m's
 * low edge, centre, high edge) of one pair: forward gain, front-to-back,
 * rear null and RDF at each. */
static cxl_status pattern_row(const cxl_duo *p, long i, double *out)
{
    static const double f_hz[3] = { 1.8e6, 1.9e6, 2.0e6 };
    cxl_status st = CXL_OK;
    *out = 0.0;
    for (int k = 0; k < 3 && st == CXL_OK; k++) {
        double f = f_hz[k] + WIGGLE(i) * 1e3, g, fb, az, nd, rdf;
        st = cxl_duo_forward_gain(p, f, 0.0, &g);
        if (st == CXL_OK) st = cxl_duo_front_to_back(p, f, 0.0, &fb);
        if (st == CXL_OK) st = cxl_duo_rear_null(p, f, 0.0, &az, &nd);
        if (st == CXL_OK) st = cxl_duo_rdf(p, f, &rdf);
        *out += g + fb + nd + rdf;
    }
    return st;
}
BENCH_BODY(array_pattern_row, "pattern row", pattern_row(fx->pair, i, &out))
BENCH_BODY(array_fb8, "f/b 8",
           cxl_array_eval_front_to_back(fx->arr8, 1.83e6 + WIGGLE(i) * 1e4, 0.0, &out))
/* Monte-Carlo yield: one call runs yield_trials trials at one frequency. */
static size_t yield_trials = 100000;
static cxl_status yield_run(const cxl_yield *y, const cxl_array *a, long i, double *out)
{
    double se, med, p5;
    return cxl_yield_eval(y, a, 1.83e6 + WIGGLE(i) * 1e4, 0.0, out, &se, &med, &p5, NULL, NULL);
}
BENCH_BODY(yield_fb1, "yield 1 thread", yield_run(fx->yield1, fx->arr4, i, &out))
BENCH_BODY(yield_fball, "yield all threads", yield_run(fx->yield_all, fx->arr4, i, &out))
BENCH_BODY(yield_null, "yield null", yield_run(fx->yield_null, fx->arr4, i, &out))
static const char *const length_text[4] = { "20.10m", "41ft 6in", "1250mm", "20.00m" };
BENCH_BODY(parse_length, "parse",
           cxl_units_parse_length(length_text[i & 3], CXL_UNITS_METRIC, &out, NULL))
static const char *const band_names[4] = { "160m", "80m", "mw", "40m" };
static cxl_status band_low(const fixture *fx, long i, double *low_hz)
{
    double hi;
    return cxl_bands_edges(fx->bands, band_names[i & 3], (int)(i % 3) + 1, 1, low_hz, &hi);
}
BENCH_BODY(band_edges, "edges", band_low(fx, i, &out))

static double stub_fit(void *ctx, long n)
{
    (void)ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        /* 10 m open stub, VF about 0.66: resonances at 1, 3 and 5 times
         * VF c / (4 L) (quarter, three-quarter and five-quarter waves) */
        double f1 = 0.66 * CXL_C_M_PER_S / 40.0 * (1.0 + WIGGLE(i) * 1e-2);
        cxl_stub *s;
        cxl_stub_result *res;
        double vf, vf_err;
        check(cxl_stub_new(CXL_STUB_OPEN, &s), "stub new");
        for (int k = 1; k <= 3; k++)
            check(cxl_stub_add_reading(s, 10.0, (2 * k - 1) * f1, k), "stub reading");
        check(cxl_stub_fit(s, &res), "stub fit");
        check(cxl_stub_result_vf(res, &vf, &vf_err), "stub vf");
        cxl_stub_result_free(res);
        cxl_stub_free(s);
        acc += vf;
    }
    return acc;
}

static double format_fixed(void *ctx, long n)
{
    (void)ctx;
    char buf[64];
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        check(cxl_units_format_fixed(20.0 + WIGGLE(i) * 3.7, 3, buf, sizeof buf), "format");
        acc += (double)buf[3];
    }
    return acc;
}

static double bands_new(void *ctx, long n)
{
    (void)ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cxl_bands *b;
        check(cxl_bands_new(&b), "bands new");
        acc += (double)cxl_bands_count(b);
        cxl_bands_free(b);
    }
    return acc;
}

static double catalog_new(void *ctx, long n)
{
    (void)ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cxl_catalog *c;
        size_t count;
        check(cxl_catalog_new(&c), "catalog new");
        count = cxl_catalog_count(c);
        acc += (double)count;
        cxl_catalog_free(c);
    }
    return acc;
}

static double fit_new(void *ctx, long n)
{
    (void)ctx;
    double acc = 0.0, a, b;
    cxl_catalog *c;
    size_t idx;
    check(cxl_catalog_new(&c), "catalog new");
    check(cxl_catalog_find(c, "RG-213", &idx), "find RG-213");
    for (long i = 0; i < n; i++) {
        cxl_loss_fit *f;
        check(cxl_loss_fit_new_cable(c, idx, &f), "fit new");
        check(cxl_loss_fit_coefficients(f, &a, &b), "fit coefficients");
        acc += a;
        cxl_loss_fit_free(f);
    }
    cxl_catalog_free(c);
    return acc;
}

/* A 10,001-point sweep of an open 30 m line (VF 0.66, |Gamma| 0.98) from
 * 0.1 MHz in 0.1 MHz steps, as Touchstone text: a harmonic grid, so the
 * fault profile is the low-pass one.  Invented values for timing only. */
static char *sweep_text(size_t *size)
{
    size_t n = 10001, cap = n * 48 + 64, used = 0;
    char *t = malloc(cap);
    if (!t) exit(2);
    used += (size_t)snprintf(t, cap, "# kHz S RI R 50\n");
    for (size_t i = 0; i < n; i++) {
        double f = 1e5 * (double)(i + 1), ph = -4.0 * M_PI * f * 30.0 / (0.66 * CXL_C_M_PER_S);
        used += (size_t)snprintf(t + used, cap - used, "%zu %ld %ld\n", 100 * (i + 1),
                                 lround(0.98e6 * cos(ph)), lround(0.98e6 * sin(ph)));
    }
    *size = used;
    return t;
}

static double sweep_read_res(void *ctx, long n)
{
    (void)ctx;
    size_t size;
    char *text = sweep_text(&size);
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cxl_sweep *s;
        cxl_sweep_res *r;
        check(cxl_sweep_read_buffer(text, size, &s, NULL, NULL, 0), "sweep read");
        check(cxl_sweep_resonances(s, 50.0, CXL_STUB_OPEN, 0, 0, &r), "resonances");
        acc += (double)cxl_sweep_res_count(r);
        cxl_sweep_res_free(r);
        cxl_sweep_free(s);
    }
    free(text);
    return acc;
}

static double sweep_fault(void *ctx, long n)
{
    (void)ctx;
    size_t size;
    char *text = sweep_text(&size);
    cxl_sweep *s;
    check(cxl_sweep_read_buffer(text, size, &s, NULL, NULL, 0), "sweep read");
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cxl_fault *f;
        check(cxl_fault_new(s, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0.0, 0.0, 0, &f), "fault");
        acc += (double)cxl_fault_peak_count(f);
        cxl_fault_free(f);
    }
    cxl_sweep_free(s);
    free(text);
    return acc;
}

/* A 10,001-point sweep of a lossy open 30 m line for the whole-sweep fit:
 * Z0 75 ohm against 50, VF 0.66 - 20/sqrt(f), 1e-5 sqrt(f) dB/m, 0.1 to
 * 100 MHz (the lossy-line input impedance, Pozar 4th ed. eq. 2.44 with
 * tanh).  Invented values for timing only. */
static char *fit_text(size_t *size)
{
    size_t n = 10001, cap = n * 64 + 64, used = 0;
    char *t = malloc(cap);
    if (!t) exit(2);
    used += (size_t)snprintf(t, cap, "# Hz S RI R 50\n");
    for (size_t i = 0; i < n; i++) {
        double f = 1e5 + 1e4 * (double)i * 9.99, vf = 0.66 - 20.0 / sqrt(f);
        double complex gam = 1e-5 * sqrt(f) / 8.685889638065035 +
                             I * 2.0 * M_PI * f / (vf * CXL_C_M_PER_S);
        double complex z = 75.0 / ctanh(gam * 30.0), g = (z - 50.0) / (z + 50.0);
        used += (size_t)snprintf(t + used, cap - used, "%.10g %.9f %.9f\n", f, creal(g), cimag(g));
    }
    *size = used;
    return t;
}

static double sweep_fit(void *ctx, long n)
{
    (void)ctx;
    size_t size;
    char *text = fit_text(&size);
    cxl_sweep *s;
    check(cxl_sweep_read_buffer(text, size, &s, NULL, NULL, 0), "sweep read");
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cxl_sweepfit *f;
        double vf;
        check(cxl_sweepfit_new(s, 30.0, CXL_STUB_OPEN, 0, 0, 0, 0, &f), "sweep fit");
        check(cxl_sweepfit_vf(f, 10e6, &vf, NULL), "fitted vf");
        acc += vf;
        cxl_sweepfit_free(f);
    }
    cxl_sweep_free(s);
    free(text);
    return acc;
}

/* Process CPU time per call over `calls` calls (user + system of every
 * thread): on a machine shared with other work the wall-clock figures
 * above grow, this one much less. */
static void cpu_time(const char *name, bench_body fn, const fixture *fx, long calls)
{
    struct timespec a, b;
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &a);
    volatile double sink = fn((void *)fx, calls);
    (void)sink;
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &b);
    double ns = ((double)(b.tv_sec - a.tv_sec) * 1e9 + (double)(b.tv_nsec - a.tv_nsec)) /
                (double)calls;
    char buf[32];
    printf("  %-34s %11s  process CPU per call over %ld calls (set-up included)\n", name,
           bench_fmt_ns(buf, sizeof buf, ns), calls);
    fflush(stdout);
}

static void measure(const char *name, const char *note, bench_body fn, const fixture *fx)
{
    char med[32], min[32];
    bench_timing t = bench_time(fn, (void *)fx, target_s, repeats);
    printf("  %-34s %11s %11s %11ld  %s\n", name, bench_fmt_ns(med, sizeof med, t.median_ns),
           bench_fmt_ns(min, sizeof min, t.min_ns), t.calls, note);
    fflush(stdout);
}

/* The same, and the rate in trial-frequencies per second. */
static void measure_rate(const char *name, const char *note, bench_body fn, const fixture *fx,
                         size_t trials)
{
    char med[32], min[32];
    bench_timing t = bench_time(fn, (void *)fx, target_s, repeats);
    printf("  %-34s %11s %11s %11ld  %s: %.0f trial-frequencies/s\n", name,
           bench_fmt_ns(med, sizeof med, t.median_ns), bench_fmt_ns(min, sizeof min, t.min_ns),
           t.calls, note, (double)trials / t.median_ns * 1e9);
    fflush(stdout);
}

static void cpu_model(char *buf, size_t size)
{
    FILE *fp = fopen("/proc/cpuinfo", "r");
    char line[512];
    snprintf(buf, size, "unknown CPU");
    if (!fp) return;
    while (fgets(line, sizeof line, fp))
        if (strncmp(line, "model name", 10) == 0) {
            char *p = strchr(line, ':');
            if (p) {
                p += 1 + strspn(p + 1, " \t");
                p[strcspn(p, "\n")] = '\0';
                snprintf(buf, size, "%s", p);
            }
            break;
        }
    fclose(fp);
}

int main(int argc, char **argv)
{
    if (argc > 1 && strcmp(argv[1], "--quick") == 0) {
        target_s = 0.002;
        repeats = 3;
        yield_trials = 10000;
    } else if (argc > 1) {
        fprintf(stderr, "usage: bench_lib [--quick]\n");
        return 2;
    }
    /* this process owns GSL's error handler, as the CLI does */
    gsl_set_error_handler_off();
    fixture fx;
    cxl_catalog *cat;
    size_t idx;
    check(cxl_catalog_new(&cat), "catalog");
    check(cxl_catalog_find(cat, "RG-213", &idx), "find RG-213");
    check(cxl_loss_fit_new_cable(cat, idx, &fx.fit), "fit RG-213");
    check(cxl_loss_model_new_cable(cat, idx, &fx.model), "model RG-213");
    check(cxl_bands_new(&fx.bands_owned), "bands");
    fx.bands = fx.bands_owned;
    /* end-fire pair, a quarter wave apart at 1.83 MHz along the forward
     * axis, the front element delayed by the stagger's travel time: the
     * textbook cardioid (common practice, no source) */
    double lambda_m = CXL_C_M_PER_S / 1.83e6, delay_s;
    check(cxl_duo_new(&fx.pair), "pair");
    check(cxl_duo_set_geometry(fx.pair, 0.0, 0.25 * lambda_m), "geometry");
    check(cxl_line_delay_from_offset(0.25 * lambda_m, &delay_s), "delay");
    check(cxl_duo_set_delay(fx.pair, 0, delay_s), "set delay");

    /* N-element arrays at 1.83 MHz: the same end-fire pair; 8 elements as
     * four such pairs side by side, half a wavelength apart (isotropic,
     * and short verticals on the ground); 64 as 32 pairs (demo layouts) */
    cxl_array **arrs[4] = { &fx.arr2, &fx.arr8, &fx.arr8v, &fx.arr64 };
    const int ncols[4] = { 1, 4, 4, 32 };
    for (int a = 0; a < 4; a++) {
        check(cxl_array_new(arrs[a]), "array");
        for (int c = 0; c < ncols[a]; c++) {
            size_t k;
            double y = (c - 0.5 * (ncols[a] - 1)) * 0.5 * lambda_m;
            check(cxl_array_add(*arrs[a], 0.125 * lambda_m, y, 0.0, &k), "add");
            check(cxl_array_set_delay(*arrs[a], k, delay_s), "delay");
            check(cxl_array_add(*arrs[a], -0.125 * lambda_m, y, 0.0, NULL), "add");
        }
    }
    check(cxl_array_set_element(fx.arr8v, CXL_ELEMENT_VERTICAL, 0.0, 1.0), "vertical");
    /* yield: two such pairs half a wavelength apart, every element fed by
     * 5 m of VF 0.66 line and the front ones by a delay line as well;
     * tolerances 5 cm, VF 0.01, 0.5 dB, 3 degrees (demo values) */
    check(cxl_array_new(&fx.arr4), "array");
    for (int c = 0; c < 2; c++) {
        size_t k;
        double y = (c - 0.5) * 0.5 * lambda_m;
        check(cxl_array_add(fx.arr4, 0.125 * lambda_m, y, 0.0, &k), "add");
        check(cxl_array_set_line(fx.arr4, k, 5.0 + delay_s * 0.66 * CXL_C_M_PER_S, 0.66), "line");
        check(cxl_array_add(fx.arr4, -0.125 * lambda_m, y, 0.0, &k), "add");
        check(cxl_array_set_line(fx.arr4, k, 5.0, 0.66), "line");
    }
    cxl_yield **ys[3] = { &fx.yield1, &fx.yield_all, &fx.yield_null };
    for (int k = 0; k < 3; k++) {
        check(cxl_yield_new(ys[k]), "yield");
        check(cxl_yield_set_tolerances(*ys[k], 0.05, 0.01, 0.5, 3.0), "tolerances");
        check(cxl_yield_set_run(*ys[k], k == 2 ? yield_trials / 100 : yield_trials, 1,
                                k == 1 ? 0 : 1), "run");
    }
    check(cxl_yield_set_goal_null(fx.yield_null, -25.0), "null goal");

    char cpu[256];
    cpu_model(cpu, sizeof cpu);
    printf("library cost per call: libcoaxline %s, %s\n", cxl_version(), cpu);
    printf("  median of %d loops of about %.0f ms each (CLOCK_MONOTONIC); "
           "results summed into a volatile sink\n\n", repeats, target_s * 1e3);
    printf("  %-34s %11s %11s %11s  %s\n", "function", "median", "min", "calls/loop", "input");
    measure("(empty loop, for scale)", "the input arithmetic alone", empty_loop, &fx);
    measure("cxl_line_degrees_from_length", "20 m, VF 0.66, 1.83 MHz", line_degrees, &fx);
    measure("cxl_line_cut_length", "33.4 ns, VF 0.8, 5 cm allowance", line_cut, &fx);
    measure("cxl_pair_phase_error", "20.1 m vs 20.0 m, 1.83 MHz", pair_phase, &fx);
    measure("cxl_loss_fit_eval", "RG-213 table fit, 50 MHz", loss_fit, &fx);
    measure("cxl_loss_model_attenuation", "RG-213 geometry, 1.83 MHz", loss_model, &fx);
    measure("cxl_stub_fit (3 readings)", "new, 3 readings, fit, vf, free", stub_fit, &fx);
    measure("cxl_duo_rdf", "end-fire cardioid pair, 1.83 MHz", array_rdf, &fx);
    measure("pattern row (3 band points)", "gain, F/B, rear null, RDF of that pair (target 0.5 ms)",
            array_pattern_row, &fx);
    measure("cxl_array_eval_rdf (2 elements)", "the same pair as a cxl_array (target 0.3 ms)",
            array_rdf2, &fx);
    measure("cxl_array_eval_rdf (8 elements)", "4 such pairs, lambda/2 apart (target 2 ms)",
            array_rdf8, &fx);
    measure("cxl_array_eval_rdf (8 verticals)", "the same over perfect ground", array_rdf8v, &fx);
    measure("cxl_array_eval_rdf (64 elements)", "32 such pairs, lambda/2 apart", array_rdf64, &fx);
    measure("cxl_array_eval_front_to_back (8)", "4 pairs, no integral", array_fb8, &fx);
    printf("  -- Monte-Carlo yield, 4 isotropic elements (target >= 1 million trial-frequencies/s) --\n");
    char note[96];
    snprintf(note, sizeof note, "%zu trials, front-to-back, 1 thread", yield_trials);
    measure_rate("cxl_yield_eval", note, yield_fb1, &fx, yield_trials);
    snprintf(note, sizeof note, "the same, one thread per processor");
    measure_rate("cxl_yield_eval", note, yield_fball, &fx, yield_trials);
    snprintf(note, sizeof note, "%zu trials, rear-null goal, 1 thread", yield_trials / 100);
    measure_rate("cxl_yield_eval", note, yield_null, &fx, yield_trials / 100);
    printf("  -- the batch path and per-process set-up --\n");
    measure("cxl_units_parse_length", "20.10m, 41ft 6in, 1250mm", parse_length, &fx);
    measure("cxl_units_format_fixed", "3 decimals", format_fixed, &fx);
    measure("cxl_bands_edges", "160m/80m/mw/40m, Regions 1-3", band_edges, &fx);
    measure("cxl_bands_new + free", "built-in band table", bands_new, &fx);
    measure("cxl_catalog_new + free", "built-in cable catalog", catalog_new, &fx);
    measure("cxl_loss_fit_new_cable + free", "RG-213 (GSL least squares)", fit_new, &fx);
    printf("  -- analyzer sweeps (targets: read + resonances <= 5 ms, profile <= 10 ms, "
           "fit <= 50 ms) --\n");
    measure("sweep read + resonances", "10,001 points, text in memory", sweep_read_res, &fx);
    measure("cxl_fault_new (profile, peaks)", "10,001 points, low-pass, Hann", sweep_fault, &fx);
    measure("cxl_sweepfit_new (whole sweep)", "10,001 points, lossy open line, 5 parameters",
            sweep_fit, &fx);
    long cpu_calls = target_s < 0.01 ? 2 : 20;
    cpu_time("  CPU: read + resonances", sweep_read_res, &fx, cpu_calls);
    cpu_time("  CPU: fault profile", sweep_fault, &fx, cpu_calls);
    cpu_time("  CPU: whole-sweep fit", sweep_fit, &fx, cpu_calls);

    cxl_duo_free(fx.pair);
    for (int a = 0; a < 4; a++) cxl_array_free(*arrs[a]);
    cxl_array_free(fx.arr4);
    for (int k = 0; k < 3; k++) cxl_yield_free(*ys[k]);
    cxl_bands_free(fx.bands_owned);
    cxl_loss_model_free(fx.model);
    cxl_loss_fit_free(fx.fit);
    cxl_catalog_free(cat);
    return 0;
}
