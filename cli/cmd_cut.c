/* cmd_cut.c - coaxline cut: stagger offset, delay or electrical degrees
 * to a cable cut length, with the analyzer check frequency. */
#include <config.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef cut_opts[] = {
    { "offset", "LEN", "free-space stagger offset the line must make up (e.g. 10m)", 0 },
    { "delay", "TIME", "wanted delay (e.g. 33.4ns)", 0 },
    { "degrees", "DEG", "wanted electrical length at the first --freq", 0 },
    { "vf", "X", "velocity factor of the cable, 0 < X <= 1", 0 },
    { "cable", "NAME", "take the velocity factor from the catalog (instead of --vf)", 0 },
    { "vf-from", "FILE|-", "take the VF from coaxline vf --format csv output (its --at row at the first --freq)", 0 },
    { "allowance", "LEN", "length already in connectors, adapters or fixture", 0 },
    { "allowance-vf", "X", "velocity factor of the allowance (default: --vf)", 0 },
    { "freq", "F", "frequency for the electrical-degrees column", 1 },
    { "label", "TEXT", "name of the piece, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col cut_cols[] = {
    { "label", -1 }, { "offset_m", 3 }, { "delay_ns", 3 }, { "vf", 4 },
    { "cut_length_m", 3 }, { "cut_length_ft", 4 }, { "freq_mhz", 6 },
    { "electrical_deg", 3 }, { "quarter_wave_mhz", 4 }, { "allowance_m", 3 },
};
#define NCOLS (sizeof cut_cols / sizeof cut_cols[0])

/* One invocation's inputs and results. */
typedef struct cut_job {
    int given;                      /* 0 offset, 1 delay, 2 degrees */
    const char *text;               /* its value */
    int nfreq;
    double freq_hz[CLI_MAX_ITEMS];
    double vf, allowance_m, allowance_vf;
    double delay_s, offset_m, cut_m, qw_hz;
    char from[512];                 /* where the VF came from (text output) */
} cut_job;

static const char *const kinds[] = { "offset", "delay", "degrees" };

/* Exactly one of --offset, --delay, --degrees. */
static int which_given(const cli_ctx *ctx, const cli_args *a, int *given)
{
    int ngiven = 0;
    for (int i = 0; i < 3; i++)
        if (cli_count(a, kinds[i])) { *given = i; ngiven++; }
    if (ngiven != 1)
        return cli_error(ctx, "offset/delay/degrees", "--offset 10m, --delay 33.4ns or --degrees 90 --freq 1.83MHz",
                         ngiven ? "give only one of them" : "one of them is needed");
    return 0;
}

/* --freq, the VF and the allowance. */
static int read_line(cli_ctx *ctx, const cli_args *a, cut_job *j)
{
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    j->nfreq = cli_items(ctx, a, "freq", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (j->nfreq < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < j->nfreq; i++)
        if (cli_freq(ctx, "freq", items[i], &j->freq_hz[i])) return CLI_EXIT_USAGE;
    j->from[0] = '\0';
    j->allowance_m = 0.0;
    /* where the VF came from is only printed as text */
    if (cli_vf_source_at(ctx, a, j->nfreq ? j->freq_hz[0] : 0.0, &j->vf,
                         ctx->format == CLI_TEXT ? j->from : NULL, sizeof j->from))
        return CLI_EXIT_USAGE;
    j->allowance_vf = j->vf;
    if (cli_count(a, "allowance") &&
        cli_length(ctx, "allowance", cli_get(a, "allowance", 0), CLI_NONNEG, &j->allowance_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "allowance-vf") &&
        cli_vf(ctx, "allowance-vf", cli_get(a, "allowance-vf", 0), &j->allowance_vf))
        return CLI_EXIT_USAGE;
    return 0;
}

/* The delay the given option asks for. */
static int read_delay(const cli_ctx *ctx, const cli_args *a, cut_job *j)
{
    double value;
    j->delay_s = 0.0;
    j->text = cli_get(a, kinds[j->given], 0);
    if (j->given == 0) {
        if (cli_length(ctx, "offset", j->text, CLI_POSITIVE, &value)) return CLI_EXIT_USAGE;
        cxl_line_delay_from_offset(value, &j->delay_s);
        return 0;
    }
    if (j->given == 1) return cli_time(ctx, "delay", j->text, CLI_POSITIVE, &j->delay_s);
    if (cli_bounded(ctx, "degrees", j->text, CLI_BOUND_DEGREES,
                    "electrical degrees above 0, such as 90", &value))
        return CLI_EXIT_USAGE;
    if (!(value > 0.0))
        return cli_error(ctx, "degrees", "electrical degrees above 0, such as 90",
                         "'%s' must be greater than zero", j->text);
    if (j->nfreq == 0)
        return cli_error(ctx, "freq", "--degrees 90 --freq 1.83MHz",
                         "--degrees needs the frequency it holds at");
    j->delay_s = value / (360.0 * j->freq_hz[0]);
    return 0;
}

/* The cut length and its check frequency, within the bounds of a line. */
static int cut_length(const cli_ctx *ctx, cut_job *j)
{
    double allowance_s = 0.0;
    if (j->allowance_m > 0.0 &&
        (cxl_line_delay_from_length(j->allowance_m, j->allowance_vf, &allowance_s) != CXL_OK ||
         !(allowance_s < j->delay_s)))
        return cli_error(ctx, "allowance", "an allowance shorter than the line it is part of",
                         "the allowance alone already gives more than the wanted delay");
    /* the library's CXL_ERANGE here is an overflow, not the allowance */
    j->cut_m = 0.0;
    j->qw_hz = 0.0;
    j->offset_m = j->delay_s * CXL_C_M_PER_S;
    /* the cut is a line of cable (cli_bounds[CLI_BOUND_LINE]); name the
     * bound the value misses: a failure of the library for a tiny delay
     * (underflow) is a length under the minimum, not over the maximum */
    const cli_bound *line = &cli_bounds[CLI_BOUND_LINE];
    char len[64] = "", b1[96];
    if (!(j->offset_m <= CLI_MAX_LENGTH_M) || j->offset_m * j->vf > line->max)
        snprintf(len, sizeof len, "over %s", line->max_text);
    else if (cxl_line_cut_length(j->delay_s, j->vf, j->allowance_m, j->allowance_vf, &j->cut_m) != CXL_OK ||
             !(j->cut_m >= line->min) || cxl_line_quarter_wave_freq(j->cut_m, j->vf, &j->qw_hz) != CXL_OK)
        snprintf(len, sizeof len, "of %s m, under %s", cli_fmt(b1, sizeof b1, j->cut_m, 6),
                 line->min_text);
    else if (j->cut_m > line->max)
        snprintf(len, sizeof len, "over %s", line->max_text);
    if (!len[0]) return 0;
    char range[96], expected[128];
    snprintf(expected, sizeof expected, "a cut length %s",
             cli_bound_range(range, sizeof range, CLI_BOUND_LINE));
    return cli_error(ctx, kinds[j->given], expected, "'%s' gives a cut length %s", j->text, len);
}

static void cut_table(cli_ctx *ctx, const char *label, const cut_job *j)
{
    int nrows = j->nfreq ? j->nfreq : 1;
    for (int i = 0; i < nrows; i++) {
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_NUM(j->offset_m), CLI_NUM(j->delay_s * 1e9), CLI_NUM(j->vf),
            CLI_NUM(j->cut_m), CLI_NUM(j->cut_m / 0.3048), CLI_NONE, CLI_NONE,
            CLI_NUM(j->qw_hz / 1e6), CLI_NUM(j->allowance_m),
        };
        if (j->nfreq) {
            cells[6] = CLI_NUM(j->freq_hz[i] / 1e6);
            cells[7] = CLI_NUM(360.0 * j->freq_hz[i] * j->delay_s);
        }
        cli_table_row(ctx, cut_cols, NCOLS, cells);
    }
}

static void cut_text(cli_ctx *ctx, const char *label, const cut_job *j)
{
    char b1[96], b2[96];
    FILE *o = ctx->out;
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "cut%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  free-space offset   %s\n", cli_fmt_length(ctx, b1, sizeof b1, j->offset_m));
    fprintf(o, "  delay               %s ns\n", cli_fmt(b1, sizeof b1, j->delay_s * 1e9, 3));
    fprintf(o, "  velocity factor     %s%s%s\n", cli_fmt(b1, sizeof b1, j->vf, 4),
            j->from[0] ? "  " : "", j->from);
    if (j->allowance_m > 0.0)
        fprintf(o, "  allowance           %s at VF %s\n",
                cli_fmt_length(ctx, b1, sizeof b1, j->allowance_m),
                cli_fmt(b2, sizeof b2, j->allowance_vf, 4));
    fprintf(o, "  cut length          %s\n", cli_fmt_length(ctx, b1, sizeof b1, j->cut_m));
    fprintf(o, "  analyzer check      %s MHz  first low-impedance dip of the cut piece, far end open\n",
            cli_fmt(b1, sizeof b1, j->qw_hz / 1e6, 4));
    if (j->allowance_m > 0.0) {
        double with_hz = 1.0 / (4.0 * j->delay_s);
        fprintf(o, "                      %s MHz  the same with the allowance in place\n",
                cli_fmt(b1, sizeof b1, with_hz / 1e6, 4));
    }
    for (int i = 0; i < j->nfreq; i++)
        fprintf(o, "  electrical length   %s deg at %s MHz\n",
                cli_fmt(b1, sizeof b1, 360.0 * j->freq_hz[i] * j->delay_s, 3),
                cli_fmt(b2, sizeof b2, j->freq_hz[i] / 1e6, 6));
}

static int cut_run(cli_ctx *ctx, const cli_args *a)
{
    cut_job j;
    if (which_given(ctx, a, &j.given) || read_line(ctx, a, &j) || read_delay(ctx, a, &j) ||
        cut_length(ctx, &j))
        return CLI_EXIT_USAGE;
    const char *label = cli_label(a);
    if (ctx->format != CLI_TEXT) cut_table(ctx, label, &j);
    else cut_text(ctx, label, &j);
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_cut = {
    .name = "cut",
    .summary = "cable cut length for a stagger offset, a delay or electrical degrees",
    .synopsis = "(--offset LEN | --delay TIME | --degrees DEG --freq F) "
                "(--vf X | --cable NAME | --vf-from FILE|-) [OPTIONS]",
    .opts = cut_opts,
    .run = cut_run,
    .end = cli_vf_source_end,
    .batch = 1,
};
