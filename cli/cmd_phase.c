/* cmd_phase.c - coaxline phase: a measured line against its reference
 * length, as a phase error at each band's low edge, centre and high edge;
 * with --load, as the difference of the phase each line delivers into that
 * load.  Built for long batches: without --load a row parses its cells,
 * reuses the band table, catalog and --vf-from file the run has already
 * loaded, and allocates nothing (--load with --cable builds the cable's
 * model for the row). */
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
    CLI_LOAD_OPTDEFS,
    { "plot", "FILE", "write the phase error across the bands as an SVG file", 0 },
    { "label", "TEXT", "name of the line, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col phase_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "length_m", 3 }, { "reference_m", 3 }, { "delta_m", 3 }, { "phase_error_deg", 3 },
    { "vf", 4 }, { "region", -1 },
    /* electrical length, and with --load the delay and gain into it */
    { "transfer_deg", 3 }, { "electrical_deg", 3 }, { "transfer_db", 3 },
    { "reference_transfer_deg", 3 }, { "reference_electrical_deg", 3 },
    { "reference_transfer_db", 3 },
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
        return cli_line_length(ctx, "reference", len, reference_m);
    }
    if (!d) return cli_error(ctx, "reference", expected, "the reference is needed");
    if (cli_bounded(ctx, "reference-deg", d, CLI_BOUND_DEGREES, "electrical degrees above 0, such as 90", deg))
        return CLI_EXIT_USAGE;
    if (!(*deg > 0.0))
        return cli_error(ctx, "reference-deg", "electrical degrees above 0, such as 90",
                         "'%s' must be greater than zero", d);
    if (!f) return cli_error(ctx, "reference-freq", expected, "--reference-deg needs its frequency");
    if (cli_freq(ctx, "reference-freq", f, deg_freq_hz)) return CLI_EXIT_USAGE;
    if (cxl_line_length_from_degrees(*deg, vf, *deg_freq_hz, reference_m) != CXL_OK ||
        !isfinite(*reference_m) || !(*reference_m > 0.0))
        return cli_error(ctx, "reference-deg", "a smaller value", "gives no usable length");
    return cli_line_length_check(ctx, "reference-deg", d, *reference_m);
}

/* One invocation's line, reference and load. */
typedef struct phase_line {
    double length_m, reference_m, vf;
    cli_load load;
} phase_line;

/* Results at one frequency; the transfer figures only with --load. */
typedef struct phase_point {
    double err_deg;
    double elec_deg, ref_elec_deg;
    double xfer_deg, xfer_db, ref_xfer_deg, ref_xfer_db;
} phase_point;

static int evaluate(cli_ctx *ctx, const phase_line *p, double freq_hz, phase_point *r)
{
    if (p->load.given) {
        if (cli_load_transfer(ctx, &p->load, p->length_m, freq_hz, &r->xfer_db, &r->xfer_deg,
                              &r->elec_deg) ||
            cli_load_transfer(ctx, &p->load, p->reference_m, freq_hz, &r->ref_xfer_db,
                              &r->ref_xfer_deg, &r->ref_elec_deg))
            return CLI_EXIT_USAGE;
        r->err_deg = r->xfer_deg - r->ref_xfer_deg;
        return 0;
    }
    /* within the input limits every figure is finite (linelimits.c) */
    if (cxl_pair_phase_error(p->length_m, p->reference_m, p->vf, freq_hz, &r->err_deg) != CXL_OK ||
        cxl_line_degrees_from_length(p->length_m, p->vf, freq_hz, &r->elec_deg) != CXL_OK ||
        cxl_line_degrees_from_length(p->reference_m, p->vf, freq_hz, &r->ref_elec_deg) != CXL_OK ||
        !isfinite(r->err_deg) || !isfinite(r->elec_deg) || !isfinite(r->ref_elec_deg))
        return cli_error(ctx, "freq", "a smaller frequency", "gives no finite phase error");
    return 0;
}

/* The plot's curves: the error, and with a load the electrical difference. */
static int plot_point(cli_ctx *ctx, void *user, double freq_hz, double *err_deg,
                      double *second_deg)
{
    phase_point r;
    if (evaluate(ctx, user, freq_hz, &r)) return CLI_EXIT_USAGE;
    *err_deg = r.err_deg;
    *second_deg = r.elec_deg - r.ref_elec_deg;
    return 0;
}

static int plot(cli_ctx *ctx, const cli_args *a, phase_line *p, const cli_freq_point *pts, int np)
{
    char title[300], n1[160], n2[200], b1[48], b2[48], b3[48];
    const char *label = cli_label(a);
    snprintf(title, sizeof title, "%s%sPhase error of the line against its reference", label,
             label[0] ? ": " : "");
    snprintf(n1, sizeof n1, "Line %s m, reference %s m, VF %s; positive: the line lags.",
             cli_fmt(b1, sizeof b1, p->length_m, 3), cli_fmt(b2, sizeof b2, p->reference_m, 3),
             cli_fmt(b3, sizeof b3, p->vf, 4));
    cli_errplot spec = {
        .title = title,
        .name = p->load.given ? "into the load" : "electrical length",
        .second = p->load.given ? "electrical length only (a matched load)" : NULL,
        .note = { n1, NULL, NULL },
    };
    if (p->load.given) {
        char l[160];
        snprintf(n2, sizeof n2, "Load %s.", cli_fmt_load(l, sizeof l, &p->load));
        spec.note[1] = n2;
    }
    return cli_errplot_save(ctx, "plot", cli_get(a, "plot", 0), pts, np, plot_point, p, &spec);
}

/* The text output's lines above its table. */
static void text_head(cli_ctx *ctx, const cli_args *a, const phase_line *p, const char *from,
                      double ref_deg, double ref_freq_hz, int region)
{
    char b1[200], b2[96], b3[96];
    FILE *o = ctx->out;
    const char *label = cli_label(a);
    double delta_m = p->length_m - p->reference_m;
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "phase%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  line              %s\n", cli_fmt_length(ctx, b1, sizeof b1, p->length_m));
    if (ref_deg > 0.0)
        fprintf(o, "  reference         %s deg at %s MHz = %s\n", cli_fmt(b1, sizeof b1, ref_deg, 3),
                cli_fmt(b2, sizeof b2, ref_freq_hz / 1e6, 6),
                cli_fmt_length(ctx, b3, sizeof b3, p->reference_m));
    else
        fprintf(o, "  reference         %s\n", cli_fmt_length(ctx, b1, sizeof b1, p->reference_m));
    fprintf(o, "  difference        %s%s, %s\n", delta_m < 0.0 ? "-" : "+",
            cli_fmt_length(ctx, b1, sizeof b1, fabs(delta_m)),
            delta_m > 0.0 ? "longer: the line lags" : delta_m < 0.0 ? "shorter: the line leads"
                                                                    : "equal");
    fprintf(o, "  velocity factor   %s%s%s\n", cli_fmt(b1, sizeof b1, p->vf, 4), from[0] ? "  " : "",
            from);
    if (p->load.given)
        fprintf(o, "  load              %s\n"
                   "                    phase error = delay of the line into it - delay of the reference\n",
                cli_fmt_load(b1, sizeof b1, &p->load));
    if (region) fprintf(o, "  band edges        ITU Region %d", region);
    else fprintf(o, "  band edges        widest across ITU Regions");
    fprintf(o, ", footnote segments %s\n", cli_flag(a, "exclude-footnotes") ? "left out" : "included");
}

/* With --load, the line's and the reference's figures under a point. */
static void text_load_lines(FILE *o, const phase_point *r)
{
    char b2[96], b3[96], b4[96], b5[96];
    fprintf(o, "%35s%-15s %10s %10s %10s %9s\n", "", "  line", cli_fmt(b2, sizeof b2, r->elec_deg, 3),
            cli_fmt(b3, sizeof b3, r->xfer_deg, 3),
            cli_fmt_signed(b4, sizeof b4, r->xfer_deg - r->elec_deg, 3),
            cli_fmt(b5, sizeof b5, r->xfer_db, 3));
    fprintf(o, "%35s%-15s %10s %10s %10s %9s\n", "", "  reference",
            cli_fmt(b2, sizeof b2, r->ref_elec_deg, 3), cli_fmt(b3, sizeof b3, r->ref_xfer_deg, 3),
            cli_fmt_signed(b4, sizeof b4, r->ref_xfer_deg - r->ref_elec_deg, 3),
            cli_fmt(b5, sizeof b5, r->ref_xfer_db, 3));
}

static void text_output(cli_ctx *ctx, const cli_args *a, const phase_line *p, const char *from,
                        double ref_deg, double ref_freq_hz, int region,
                        const cli_freq_point *pts, const phase_point *r, int np)
{
    char b1[200], b2[96];
    FILE *o = ctx->out;
    text_head(ctx, a, p, from, ref_deg, ref_freq_hz, region);
    if (!p->load.given) {
        fprintf(o, "  %-6s %-7s %16s  %s\n", "band", "edge", "frequency", "phase error");
    } else {
        fprintf(o, "  %-6s %-7s %16s  %-15s %10s %10s %10s %9s\n", "band", "edge", "frequency",
                "phase error", "electrical", "into load", "departure", "transfer");
        fprintf(o, "  %-6s %-7s %16s  %-15s %10s %10s %10s %9s\n", "", "", "", "", "deg", "deg",
                "deg", "dB");
    }
    for (int i = 0; i < np; i++) {
        int first = i == 0 || strcmp(pts[i].band, pts[i - 1].band) != 0 || !pts[i].band[0];
        fprintf(o, "  %-6s %-7s %12s MHz  %s deg\n", first ? pts[i].band : "", pts[i].edge,
                cli_fmt(b1, sizeof b1, pts[i].freq_hz / 1e6, 6),
                cli_fmt_signed(b2, sizeof b2, r[i].err_deg, 3));
        if (p->load.given) text_load_lines(o, &r[i]);
    }
}

static void phase_table(cli_ctx *ctx, const cli_args *a, const phase_line *p, int region,
                        const cli_freq_point *pts, const phase_point *r, int np)
{
    const char *label = cli_label(a);
    int l = p->load.given;
    for (int i = 0; i < np; i++) {
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
            CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(p->length_m), CLI_NUM(p->reference_m),
            CLI_NUM(p->length_m - p->reference_m), CLI_NUM(r[i].err_deg), CLI_NUM(p->vf),
            CLI_TXT(region_text[region]),
            l ? CLI_NUM(r[i].xfer_deg) : CLI_NONE, CLI_NUM(r[i].elec_deg),
            l ? CLI_NUM(r[i].xfer_db) : CLI_NONE,
            l ? CLI_NUM(r[i].ref_xfer_deg) : CLI_NONE, CLI_NUM(r[i].ref_elec_deg),
            l ? CLI_NUM(r[i].ref_xfer_db) : CLI_NONE,
        };
        cli_table_row(ctx, phase_cols, NCOLS, cells);
    }
}

/* The measured length, its VF (and where it came from, for text) and the
 * reference. */
static int read_line(cli_ctx *ctx, const cli_args *a, phase_line *p, char *from, size_t from_size,
                     double *ref_deg, double *ref_freq_hz)
{
    const char *len = cli_get(a, "length", 0);
    if (!len)
        return cli_error(ctx, "length", "--length 20.10m", "the measured length is needed");
    if (cli_line_length(ctx, "length", len, &p->length_m)) return CLI_EXIT_USAGE;
    int rc = cli_vf_source(ctx, a, &p->vf, ctx->format == CLI_TEXT ? from : NULL, from_size);
    if (rc || cli_line_vf_check(ctx, a, p->vf)) return CLI_EXIT_USAGE;
    return reference_length(ctx, a, p->vf, &p->reference_m, ref_deg, ref_freq_hz);
}

static int phase_run(cli_ctx *ctx, const cli_args *a)
{
    phase_line p;
    double ref_deg, ref_freq_hz = 0.0;
    char from[256];
    if (read_line(ctx, a, &p, from, sizeof from, &ref_deg, &ref_freq_hz)) return CLI_EXIT_USAGE;

    int region;
    cli_freq_point pts[MAX_POINTS];
    if (cli_line_freq_items(ctx, a)) return CLI_EXIT_USAGE;
    int np = cli_freq_points(ctx, a, pts, MAX_POINTS, &region);
    if (np < 0) return CLI_EXIT_USAGE;

    phase_point r[MAX_POINTS];
    int code = cli_load_parse(ctx, a, p.vf, &p.load);
    for (int i = 0; !code && i < np; i++) code = evaluate(ctx, &p, pts[i].freq_hz, &r[i]);
    if (!code && cli_count(a, "plot")) code = plot(ctx, a, &p, pts, np);
    if (!code && ctx->format == CLI_TEXT)
        text_output(ctx, a, &p, from, ref_deg, ref_freq_hz, region, pts, r, np);
    else if (!code)
        phase_table(ctx, a, &p, region, pts, r, np);
    cli_load_free(&p.load);
    return code ? code : CLI_EXIT_OK;
}

const cli_command cli_cmd_phase = {
    .name = "phase",
    .summary = "phase error of a measured line against its reference, per band edge",
    .synopsis = "--length LEN (--reference LEN | --reference-deg DEG --reference-freq F) "
                "(--vf X | --cable NAME | --vf-from FILE|-) (--band LIST | --freq F) "
                "[--load R+jX [--z0 OHM]] [--plot FILE.svg] [OPTIONS]",
    .opts = phase_opts,
    .end = cli_vf_source_end,
    .run = phase_run,
    .batch = 1,
};
