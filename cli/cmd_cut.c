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

static int cut_run(cli_ctx *ctx, const cli_args *a)
{
    const char *kinds[] = { "offset", "delay", "degrees" };
    int given = -1, ngiven = 0;
    for (int i = 0; i < 3; i++)
        if (cli_count(a, kinds[i])) { given = i; ngiven++; }
    if (ngiven != 1)
        return cli_error(ctx, "offset/delay/degrees", "--offset 10m, --delay 33.4ns or --degrees 90 --freq 1.83MHz",
                         ngiven ? "give only one of them" : "one of them is needed");

    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    double freq_hz[CLI_MAX_ITEMS];
    int nfreq = cli_items(ctx, a, "freq", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nfreq < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < nfreq; i++)
        if (cli_freq(ctx, "freq", items[i], &freq_hz[i])) return CLI_EXIT_USAGE;

    double vf, allowance_m = 0.0, allowance_vf;
    char from[512] = "";
    const char *cable = from;
    if (cli_vf_source_at(ctx, a, nfreq ? freq_hz[0] : 0.0, &vf, from, sizeof from))
        return CLI_EXIT_USAGE;
    allowance_vf = vf;
    if (cli_count(a, "allowance") &&
        cli_length(ctx, "allowance", cli_get(a, "allowance", 0), CLI_NONNEG, &allowance_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "allowance-vf") &&
        cli_vf(ctx, "allowance-vf", cli_get(a, "allowance-vf", 0), &allowance_vf))
        return CLI_EXIT_USAGE;

    double delay_s = 0.0, value;
    const char *text = cli_get(a, kinds[given], 0);
    if (given == 0) {
        if (cli_length(ctx, "offset", text, CLI_POSITIVE, &value)) return CLI_EXIT_USAGE;
        cxl_line_delay_from_offset(value, &delay_s);
    } else if (given == 1) {
        if (cli_time(ctx, "delay", text, CLI_POSITIVE, &delay_s)) return CLI_EXIT_USAGE;
    } else {
        if (cli_bounded(ctx, "degrees", text, CLI_BOUND_DEGREES,
                        "electrical degrees above 0, such as 90", &value))
            return CLI_EXIT_USAGE;
        if (!(value > 0.0))
            return cli_error(ctx, "degrees", "electrical degrees above 0, such as 90",
                             "'%s' must be greater than zero", text);
        if (nfreq == 0)
            return cli_error(ctx, "freq", "--degrees 90 --freq 1.83MHz",
                             "--degrees needs the frequency it holds at");
        delay_s = value / (360.0 * freq_hz[0]);
    }

    char b1[96], b2[96];
    double allowance_s = 0.0;
    if (allowance_m > 0.0 &&
        (cxl_line_delay_from_length(allowance_m, allowance_vf, &allowance_s) != CXL_OK ||
         !(allowance_s < delay_s)))
        return cli_error(ctx, "allowance", "an allowance shorter than the line it is part of",
                         "the allowance alone already gives more than the wanted delay");
    /* the library's CXL_ERANGE here is an overflow, not the allowance */
    double cut_m = 0.0, qw_hz = 0.0, offset_m = delay_s * CXL_C_M_PER_S;
    /* the cut is a line of cable (cli_bounds[CLI_BOUND_LINE]); name the
     * bound the value misses: a failure of the library for a tiny delay
     * (underflow) is a length under the minimum, not over the maximum */
    const cli_bound *line = &cli_bounds[CLI_BOUND_LINE];
    char len[64] = "";
    if (!(offset_m <= CLI_MAX_LENGTH_M) || offset_m * vf > line->max)
        snprintf(len, sizeof len, "over %s", line->max_text);
    else if (cxl_line_cut_length(delay_s, vf, allowance_m, allowance_vf, &cut_m) != CXL_OK ||
             !(cut_m >= line->min) || cxl_line_quarter_wave_freq(cut_m, vf, &qw_hz) != CXL_OK)
        snprintf(len, sizeof len, "of %s m, under %s", cli_fmt(b1, sizeof b1, cut_m, 6),
                 line->min_text);
    else if (cut_m > line->max)
        snprintf(len, sizeof len, "over %s", line->max_text);
    if (len[0]) {
        char range[96], expected[128];
        snprintf(expected, sizeof expected, "a cut length %s",
                 cli_bound_range(range, sizeof range, CLI_BOUND_LINE));
        return cli_error(ctx, kinds[given], expected, "'%s' gives a cut length %s", text, len);
    }

    const char *label = cli_label(a);
    if (ctx->format != CLI_TEXT) {
        int nrows = nfreq ? nfreq : 1;
        for (int i = 0; i < nrows; i++) {
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_NUM(offset_m), CLI_NUM(delay_s * 1e9), CLI_NUM(vf),
                CLI_NUM(cut_m), CLI_NUM(cut_m / 0.3048), CLI_NONE, CLI_NONE,
                CLI_NUM(qw_hz / 1e6), CLI_NUM(allowance_m),
            };
            if (nfreq) {
                cells[6] = CLI_NUM(freq_hz[i] / 1e6);
                cells[7] = CLI_NUM(360.0 * freq_hz[i] * delay_s);
            }
            cli_table_row(ctx, cut_cols, NCOLS, cells);
        }
        return CLI_EXIT_OK;
    }

    FILE *o = ctx->out;
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "cut%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  free-space offset   %s\n", cli_fmt_length(ctx, b1, sizeof b1, offset_m));
    fprintf(o, "  delay               %s ns\n", cli_fmt(b1, sizeof b1, delay_s * 1e9, 3));
    fprintf(o, "  velocity factor     %s%s%s\n", cli_fmt(b1, sizeof b1, vf, 4),
            cable[0] ? "  " : "", cable);
    if (allowance_m > 0.0)
        fprintf(o, "  allowance           %s at VF %s\n",
                cli_fmt_length(ctx, b1, sizeof b1, allowance_m),
                cli_fmt(b2, sizeof b2, allowance_vf, 4));
    fprintf(o, "  cut length          %s\n", cli_fmt_length(ctx, b1, sizeof b1, cut_m));
    fprintf(o, "  analyzer check      %s MHz  first low-impedance dip of the cut piece, far end open\n",
            cli_fmt(b1, sizeof b1, qw_hz / 1e6, 4));
    if (allowance_m > 0.0) {
        double with_hz = 1.0 / (4.0 * delay_s);
        fprintf(o, "                      %s MHz  the same with the allowance in place\n",
                cli_fmt(b1, sizeof b1, with_hz / 1e6, 4));
    }
    for (int i = 0; i < nfreq; i++)
        fprintf(o, "  electrical length   %s deg at %s MHz\n",
                cli_fmt(b1, sizeof b1, 360.0 * freq_hz[i] * delay_s, 3),
                cli_fmt(b2, sizeof b2, freq_hz[i] / 1e6, 6));
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
