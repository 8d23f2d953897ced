/* bench_cli.c - what the CLI's shared per-row helpers cost (cli/common.c,
 * cli/bandsel.c), timed in-process the way bench_lib times the library.
 * Run by `make bench`, never by make check.
 *
 * The batch driver calls a command's run() once per CSV row; a per-band
 * command such as phase does, per row: option look-ups, two lengths and a
 * velocity factor parsed, the band's edge frequencies (cli_freq_points),
 * three phase errors and three CSV rows.  The last line times exactly that
 * sequence, built from the shared helpers, as a projection of a phase row
 * for as long as the phase command itself is not there to time.
 */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include "cli.h"
#include "timing.h"

static const cli_optdef opts[] = {
    { "length", "LEN", "", 0 }, { "reference", "LEN", "", 0 }, { "vf", "X", "", 0 },
    { "cable", "NAME", "", 0 }, { "band", "LIST", "", 1 }, { "region", "N", "", 0 },
    { "exclude-footnotes", NULL, "", 0 }, { "freq", "F", "", 1 }, { "label", "TEXT", "", 0 },
    { NULL, NULL, NULL, 0 }
};
enum { O_LENGTH, O_REFERENCE, O_VF, O_CABLE, O_BAND, O_REGION, O_EXCL, O_FREQ, O_LABEL };

static int dummy_run(cli_ctx *ctx, const cli_args *a) { (void)ctx; (void)a; return 0; }
static const cli_command cmd = { .name = "bench", .summary = "", .synopsis = "",
                                 .opts = opts, .run = dummy_run, .batch = 1 };

static const cli_col cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 }, { "length_m", 3 },
    { "reference_m", 3 }, { "delta_m", 3 }, { "phase_error_deg", 3 },
};
#define NCOLS (sizeof cols / sizeof cols[0])

typedef struct bench {
    cli_ctx ctx;
    cli_args args;
    const char *row[CLI_MAX_OPTS];
} bench;

static void set_row(bench *b, const char *band, const char *region)
{
    memset(b->row, 0, sizeof b->row);
    b->row[O_LABEL] = "p1";
    b->row[O_LENGTH] = "20.10m";
    b->row[O_REFERENCE] = "20.00m";
    b->row[O_VF] = "0.66";
    b->row[O_BAND] = band;
    b->row[O_REGION] = region;
}

static double lookups(void *ctx, long n)
{
    bench *b = ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        /* the look-ups a phase row makes: each option, once or twice */
        acc += (double)cli_count(&b->args, "length") + (double)cli_count(&b->args, "reference");
        acc += cli_get(&b->args, "vf", 0) != NULL;
        acc += cli_get(&b->args, "cable", 0) != NULL;
        acc += (double)cli_count(&b->args, "band") + (double)cli_count(&b->args, "freq");
        acc += cli_get(&b->args, "region", 0) != NULL;
        acc += cli_flag(&b->args, "exclude-footnotes");
        acc += (double)strlen(cli_label(&b->args));
    }
    return acc;
}

static double freq_points(void *ctx, long n)
{
    bench *b = ctx;
    cli_freq_point pts[8];
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        int np = cli_freq_points(&b->ctx, &b->args, pts, 8, NULL);
        if (np != 3) { fprintf(stderr, "bench_cli: cli_freq_points failed\n"); exit(2); }
        acc += pts[0].freq_hz;
    }
    return acc;
}

static double table_rows(void *ctx, long n)
{
    bench *b = ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        cli_cell cells[NCOLS] = { CLI_TXT("p1"), CLI_TXT("160m"), CLI_TXT("centre"),
                                  CLI_NUM(1.9 + (double)(i & 255) * 1e-6), CLI_NUM(20.1),
                                  CLI_NUM(20.0), CLI_NUM(0.1), CLI_NUM(0.3456) };
        cli_table_row(&b->ctx, cols, NCOLS, cells);
        acc += 1.0;
    }
    return acc;
}

static double phase_row(void *ctx, long n)
{
    bench *b = ctx;
    double acc = 0.0;
    for (long i = 0; i < n; i++) {
        const cli_args *a = &b->args;
        double len, ref, vf, err;
        cli_freq_point pts[8];
        if (cli_length(&b->ctx, "length", cli_get(a, "length", 0), CLI_POSITIVE, &len) ||
            cli_length(&b->ctx, "reference", cli_get(a, "reference", 0), CLI_POSITIVE, &ref) ||
            cli_vf_or_cable(&b->ctx, a, &vf, NULL))
            exit(2);
        int np = cli_freq_points(&b->ctx, a, pts, 8, NULL);
        if (np != 3) exit(2);
        const char *label = cli_label(a);
        for (int k = 0; k < np; k++) {
            if (cxl_pair_phase_error(len, ref, vf, pts[k].freq_hz, &err) != CXL_OK) exit(2);
            cli_cell cells[NCOLS] = { CLI_TXT(label), CLI_TXT(pts[k].band), CLI_TXT(pts[k].edge),
                                      CLI_NUM(pts[k].freq_hz / 1e6), CLI_NUM(len), CLI_NUM(ref),
                                      CLI_NUM(len - ref), CLI_NUM(err) };
            cli_table_row(&b->ctx, cols, NCOLS, cells);
            acc += err;
        }
    }
    return acc;
}

static void measure(const char *name, bench_body fn, bench *b, double target_s, int repeats)
{
    char med[32], min[32];
    bench_timing t = bench_time(fn, b, target_s, repeats);
    printf("  %-52s %12s %12s\n", name, bench_fmt_ns(med, sizeof med, t.median_ns),
           bench_fmt_ns(min, sizeof min, t.min_ns));
    fflush(stdout);
}

int main(int argc, char **argv)
{
    double target_s = 0.02;
    int repeats = 11;
    if (argc > 1 && strcmp(argv[1], "--quick") == 0) {
        target_s = 0.002;
        repeats = 3;
    }
    gsl_set_error_handler_off();
    bench b;
    memset(&b, 0, sizeof b);
    b.ctx = (cli_ctx){ .cmd = &cmd, .format = CLI_CSV, .units = CXL_UNITS_METRIC };
    b.ctx.out = fopen("/dev/null", "w");
    if (!b.ctx.out) return 2;
    b.args.cmd = &cmd;
    b.args.row = b.row;
    b.ctx.input_name = "bench.csv";

    printf("\nCLI per-row helpers (cli/common.c, cli/bandsel.c), in-process, CSV to /dev/null\n");
    printf("  %-52s %12s %12s\n", "", "median", "min");
    set_row(&b, "160m", "2");
    measure("option look-ups of one phase row (9)", lookups, &b, target_s, repeats);
    measure("cli_freq_points --band 160m --region 2", freq_points, &b, target_s, repeats);
    set_row(&b, "20m", "");
    measure("cli_freq_points --band 20m (widest)", freq_points, &b, target_s, repeats);
    set_row(&b, "mw", "3");
    measure("cli_freq_points --band mw --region 3", freq_points, &b, target_s, repeats);
    measure("cli_table_row, CSV, 8 columns (5 numbers)", table_rows, &b, target_s, repeats);
    set_row(&b, "160m", "2");
    measure("phase-like row, 160m (projection, 3 output rows)", phase_row, &b, target_s, repeats);
    set_row(&b, "mw", "");
    measure("phase-like row, mw (projection, 3 output rows)", phase_row, &b, target_s, repeats);
    cxl_bands_free(b.ctx.bands);
    fclose(b.ctx.out);
    return 0;
}
