/* cmd_phase.c - coaxline phase: a measured line against its reference
 * length, as a phase error at each band's low edge, centre and high edge.
 * Built for long batches: a row parses its cells, reuses the band table,
 * catalog and --vf-from file the run has already loaded, and allocates
 * nothing. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef phase_opts[] = {
    { "length", "LEN", "measured length of the line", 0 },
    { "reference", "LEN", "length the line should have", 0 },
    { "reference-deg", "DEG", "or: electrical length it should have at --reference-freq", 0 },
    { "reference-freq", "F", "frequency of --reference-deg", 0 },
    { "vf", "X", "velocity factor of the cable, 0 < X <= 1", 0 },
    { "cable", "NAME", "take the velocity factor from the catalog", 0 },
    { "vf-from", "FILE|-", "take the fitted VF from coaxline vf --format csv output", 0 },
    { "band", "LIST", "bands to evaluate, e.g. 160m,80m", 1 },
    { "region", "N", "ITU Region 1, 2 or 3 (default: widest edges across Regions)", 0 },
    { "exclude-footnotes", NULL, "band edges without footnote segments", 0 },
    { "freq", "F", "a single frequency to evaluate", 1 },
    { "label", "TEXT", "name of the line, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col phase_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "length_m", 3 }, { "reference_m", 3 }, { "delta_m", 3 }, { "phase_error_deg", 3 },
    { "vf", 4 }, { "region", -1 },
};
#define NCOLS (sizeof phase_cols / sizeof phase_cols[0])
#define MAX_POINTS (4 * CLI_MAX_ITEMS)

static const char *const region_text[4] = { "all", "1", "2", "3" };

/* The reference length: given directly, or as degrees at a frequency on
 * the same cable.  *deg gets the degrees (0 when given as a length). */
static int reference_length(const cli_ctx *ctx, const cli_args *a, double vf,
                            double *reference_m, double *deg, double *deg_freq_hz)
{
    static const char expected[] = "--reference 20m, or --reference-deg 90 --reference-freq 1.83MHz";
    const char *len = cli_get(a, "reference", 0), *d = cli_get(a, "reference-deg", 0);
    const char *f = cli_get(a, "reference-freq", 0);
    *deg = 0.0;
    if (len && d)
        return cli_error(ctx, "reference", expected, "give --reference or --reference-deg, not both");
    if (len) {
        if (f)
            return cli_error(ctx, "reference-freq", expected, "goes with --reference-deg only");
        return cli_length(ctx, "reference", len, CLI_POSITIVE, reference_m);
    }
    if (!d) return cli_error(ctx, "reference", expected, "the reference is needed");
    if (cli_number(ctx, "reference-deg", d, 0.0, 1e9, "electrical degrees above 0, such as 90", deg))
        return CLI_EXIT_USAGE;
    if (!(*deg > 0.0))
        return cli_error(ctx, "reference-deg", "electrical degrees above 0, such as 90",
                         "'%s' must be greater than zero", d);
    if (!f) return cli_error(ctx, "reference-freq", expected, "--reference-deg needs its frequency");
    if (cli_freq(ctx, "reference-freq", f, deg_freq_hz)) return CLI_EXIT_USAGE;
    if (cxl_line_length_from_degrees(*deg, *deg_freq_hz, vf, reference_m) != CXL_OK ||
        !isfinite(*reference_m) || !(*reference_m > 0.0))
        return cli_error(ctx, "reference-deg", "a smaller value", "gives no usable length");
    return 0;
}

static int phase_run(cli_ctx *ctx, const cli_args *a)
{
    double length_m, vf, reference_m, ref_deg, ref_freq_hz = 0.0;
    const char *len = cli_get(a, "length", 0);
    if (!len)
        return cli_error(ctx, "length", "--length 20.10m", "the measured length is needed");
    if (cli_length(ctx, "length", len, CLI_POSITIVE, &length_m)) return CLI_EXIT_USAGE;

    char from[256];
    int rc = cli_vf_source(ctx, a, &vf, ctx->format == CLI_TEXT ? from : NULL, sizeof from);
    if (rc) return CLI_EXIT_USAGE;
    if (reference_length(ctx, a, vf, &reference_m, &ref_deg, &ref_freq_hz)) return CLI_EXIT_USAGE;

    int region;
    cli_freq_point pts[MAX_POINTS];
    int np = cli_freq_points(ctx, a, pts, MAX_POINTS);
    if (np < 0 || cli_region(ctx, a, &region)) return CLI_EXIT_USAGE;

    double err[MAX_POINTS];
    for (int i = 0; i < np; i++)
        if (cxl_pair_phase_error(length_m, reference_m, vf, pts[i].freq_hz, &err[i]) != CXL_OK ||
            !isfinite(err[i]))
            return cli_error(ctx, "freq", "a smaller frequency", "gives no finite phase error");

    const char *label = cli_label(a);
    double delta_m = length_m - reference_m;
    if (ctx->format != CLI_TEXT) {
        for (int i = 0; i < np; i++) {
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
                CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(length_m), CLI_NUM(reference_m),
                CLI_NUM(delta_m), CLI_NUM(err[i]), CLI_NUM(vf), CLI_TXT(region_text[region]),
            };
            cli_table_row(ctx, phase_cols, NCOLS, cells);
        }
        return CLI_EXIT_OK;
    }

    char b1[96], b2[96], b3[96];
    FILE *o = ctx->out;
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "phase%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  line              %s\n", cli_fmt_length(ctx, b1, sizeof b1, length_m));
    if (ref_deg > 0.0)
        fprintf(o, "  reference         %s deg at %s MHz = %s\n", cli_fmt(b1, sizeof b1, ref_deg, 3),
                cli_fmt(b2, sizeof b2, ref_freq_hz / 1e6, 6),
                cli_fmt_length(ctx, b3, sizeof b3, reference_m));
    else
        fprintf(o, "  reference         %s\n", cli_fmt_length(ctx, b1, sizeof b1, reference_m));
    fprintf(o, "  difference        %s%s, %s\n", delta_m < 0.0 ? "-" : "+",
            cli_fmt_length(ctx, b1, sizeof b1, fabs(delta_m)),
            delta_m > 0.0 ? "longer: the line lags" : delta_m < 0.0 ? "shorter: the line leads"
                                                                    : "equal");
    fprintf(o, "  velocity factor   %s%s%s\n", cli_fmt(b1, sizeof b1, vf, 4), from[0] ? "  " : "", from);
    if (region) fprintf(o, "  band edges        ITU Region %d", region);
    else fprintf(o, "  band edges        widest across ITU Regions");
    fprintf(o, ", footnote segments %s\n", cli_flag(a, "exclude-footnotes") ? "left out" : "included");
    fprintf(o, "  %-6s %-7s %16s  %s\n", "band", "edge", "frequency", "phase error");
    for (int i = 0; i < np; i++) {
        int first = i == 0 || strcmp(pts[i].band, pts[i - 1].band) != 0 || !pts[i].band[0];
        fprintf(o, "  %-6s %-7s %12s MHz  %s deg\n", first ? pts[i].band : "", pts[i].edge,
                cli_fmt(b1, sizeof b1, pts[i].freq_hz / 1e6, 6), cli_fmt_signed(b2, sizeof b2, err[i], 3));
    }
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_phase = {
    .name = "phase",
    .summary = "phase error of a measured line against its reference, per band edge",
    .synopsis = "--length LEN (--reference LEN | --reference-deg DEG --reference-freq F) "
                "(--vf X | --cable NAME | --vf-from FILE|-) (--band LIST | --freq F) [OPTIONS]",
    .opts = phase_opts,
    .end = cli_vf_source_end,
    .run = phase_run,
    .batch = 1,
};
