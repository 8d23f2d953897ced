/* cmd_pattern.c - coaxline pattern: what a two-element receive pair does
 * per band (forward gain, front-to-back, rear null, RDF), as designed and
 * as built, so the cost of each error shows; optionally an SVG polar plot
 * of both.  The model is free space: no ground, no mutual coupling. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

#define MODEL_TEXT "free space, no ground, no mutual coupling"
#define RDF_TEXT "peak over upper-hemisphere average"
#define PLOT_POINTS 360

static const cli_optdef pattern_opts[] = {
    CLI_DUO_OPTDEFS,
    { "measured-a", "LEN", "as built: A's line as measured (replaces its design length)", 0 },
    { "measured-b", "LEN", "as built: B's line as measured", 0 },
    { "actual-vf", "X", "as built: the spool's real VF (the lines were cut for --vf/--cable)", 0 },
    { "phase-error", "DEG", "as built: B lags A by this many degrees more than designed", 0 },
    { "imbalance", "DB", "as built: B weaker than A by this many dB", 0 },
    { "line-loss", NULL, "as built: add the loss difference of the two lines (--cable)", 0 },
    CLI_DUO_BAND_OPTDEFS,
    { "plot", "FILE", "write the azimuth pattern (ideal and as built) as an SVG file", 0 },
    { "plot-freq", "F", "frequency of the plot (default: first band centre or first --freq)", 0 },
    { "plot-range", "DB", "dB from the outer ring to the plot centre (default 40)", 0 },
    { "sweep-plot", "FILE", "write front-to-back against frequency across each --band as SVG", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col pattern_cols[] = {
    { "label", -1 }, { "case", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "elevation_deg", 1 }, { "phase_error_deg", 2 }, { "imbalance_db", 2 },
    { "forward_gain_dbi", 2 }, { "front_to_back_db", 2 }, { "null_depth_db", 2 },
    { "null_azimuth_deg", 1 }, { "rdf_db", 2 }, { "model", -1 }, { "rdf_reference", -1 },
};
#define NCOLS (sizeof pattern_cols / sizeof pattern_cols[0])

typedef struct {
    double phase_deg, imbalance_db;
    double gain_dbi, fb_db, null_db, null_az_deg, rdf_db;
} pattern_row;

static const char *const case_name[2] = { "ideal", "as-built" };

/* Above the frequency at which the pair's electrical size reaches the
 * model's bound (CXL_ARRAY_MAX_KSIZE), say so with the limit; 0 below. */
static int size_limit(cli_ctx *ctx, const char *field, const cli_duo_spec *s, double f)
{
    double size_m = hypot(s->spacing_m, s->stagger_m) + (s->wire ? s->wire_length_m : 0.0);
    if (!(size_m > 0.0)) return 0;
    double max_hz = CXL_ARRAY_MAX_KSIZE * CXL_C_M_PER_S / (2.0 * M_PI * size_m);
    if (f <= max_hz) return 0;
    char b1[32], b2[32], b3[32], want[96];
    snprintf(want, sizeof want, "a frequency up to %s MHz for this geometry",
             cli_fmt(b1, sizeof b1, max_hz / 1e6, 3));
    return cli_error(ctx, field, want,
                     "at %s MHz the pair spans %s wavelengths; the pattern model stops at %s "
                     "(electrical size k D <= %g)",
                     cli_fmt(b2, sizeof b2, f / 1e6, 6),
                     cli_fmt(b3, sizeof b3, size_m * f / CXL_C_M_PER_S, 1),
                     cli_fmt(b1, sizeof b1, CXL_ARRAY_MAX_KSIZE / (2.0 * M_PI), 1),
                     CXL_ARRAY_MAX_KSIZE);
}

/* The pair of one case at one frequency and what it does. */
static int evaluate(cli_ctx *ctx, const cli_duo_spec *s, int as_built, double f,
                    pattern_row *r)
{
    cxl_duo *p;
    if (size_limit(ctx, "freq", s, f)) return CLI_EXIT_USAGE;
    if (cli_duo_spec_build(ctx, s, as_built, f, &p, &r->phase_deg, &r->imbalance_db))
        return CLI_EXIT_USAGE;
    double el = s->elevation_deg;
    cxl_status st = cxl_duo_forward_gain(p, f, el, &r->gain_dbi);
    if (st == CXL_OK) st = cxl_duo_front_to_back(p, f, el, &r->fb_db);
    if (st == CXL_OK) st = cxl_duo_rear_null(p, f, el, &r->null_az_deg, &r->null_db);
    if (st == CXL_OK) st = cxl_duo_rdf(p, f, &r->rdf_db);
    cxl_duo_free(p);
    if (st == CXL_OK && (!isfinite(r->gain_dbi) || !isfinite(r->fb_db) || !isfinite(r->null_db) ||
                         !isfinite(r->null_az_deg) || !isfinite(r->rdf_db)))
        st = CXL_ERANGE;
    if (st != CXL_OK) {
        char b[32];
        return cli_error(ctx, "freq", "a frequency and elevation at which the pair has a forward response",
                         "at %s MHz the %s pair cannot be evaluated: %s",
                         cli_fmt(b, sizeof b, f / 1e6, 6), case_name[as_built], cxl_strerror(st));
    }
    return 0;
}

/* The azimuth patterns of both cases at one frequency, as an SVG file. */
static int plot(cli_ctx *ctx, const cli_args *a, const cli_duo_spec *s, double f)
{
    double range_db = 40.0;
    if (cli_count(a, "plot-range") &&
        cli_number(ctx, "plot-range", cli_get(a, "plot-range", 0), 10.0, 200.0,
                   "10 to 200 dB, such as 40", &range_db))
        return CLI_EXIT_USAGE;
    static _Thread_local double az[PLOT_POINTS], gain[2][PLOT_POINTS];
    char names[2][96], title[200], b1[32], b2[32], b3[32];
    cli_svg_curve curves[2];
    int ncases = s->has_errors ? 2 : 1;
    if (size_limit(ctx, "plot-freq", s, f)) return CLI_EXIT_USAGE;
    for (int i = 0; i < PLOT_POINTS; i++) az[i] = 360.0 * i / PLOT_POINTS;
    for (int c = 0; c < ncases; c++) {
        cxl_duo *p;
        double rdf;
        if (cli_duo_spec_build(ctx, s, c, f, &p, NULL, NULL)) return CLI_EXIT_USAGE;
        cxl_status st = cxl_duo_pattern(p, f, s->elevation_deg, PLOT_POINTS, gain[c]);
        if (st == CXL_OK) st = cxl_duo_rdf(p, f, &rdf);
        cxl_duo_free(p);
        if (st != CXL_OK)
            return cli_error(ctx, "plot-freq", "a frequency at which the pair can be modelled",
                             "at %s MHz: %s", cli_fmt(b1, sizeof b1, f / 1e6, 6), cxl_strerror(st));
        snprintf(names[c], sizeof names[c], "%s (RDF %s dB)", c ? "as built" : "ideal",
                 cli_fmt(b1, sizeof b1, rdf, 2));
        curves[c] = (cli_svg_curve){ names[c], az, gain[c], PLOT_POINTS, c, 0 };
    }
    const char *label = cli_label(a);
    snprintf(title, sizeof title, "%s%sAzimuth pattern at %s MHz, elevation %s deg", label,
             label[0] ? ": " : "", cli_fmt(b2, sizeof b2, f / 1e6, 4),
             cli_fmt(b3, sizeof b3, s->elevation_deg, 1));
    cli_svg_polar polar = {
        .title = title,
        .note = { "Model: free space, no ground, no mutual coupling, lossless ideal combiner; "
                  "gain in dBi.",
                  "RDF = peak gain over the average over the upper hemisphere (elevation 0-90 deg).",
                  "Azimuth 0 is the forward axis, clockwise seen from above (a compass bearing)." },
        .unit = "dBi",
        .range_db = range_db,
        .ring_step_db = range_db >= 30.0 ? 10.0 : 5.0,
        .curves = curves,
        .ncurves = (size_t)ncases,
    };
    return cli_svg_save(ctx, "plot", cli_get(a, "plot", 0), &polar, NULL);
}

/* Front-to-back of both cases across each band, as an x-y SVG file. */
static int pair_fb(cli_ctx *ctx, void *user, int c, double f, double *fb_db)
{
    const cli_duo_spec *s = user;
    cxl_duo *p;
    char b1[32];
    if (cli_duo_spec_build(ctx, s, c, f, &p, NULL, NULL)) return CLI_EXIT_USAGE;
    cxl_status st = cxl_duo_front_to_back(p, f, s->elevation_deg, fb_db);
    cxl_duo_free(p);
    if (st != CXL_OK)
        return cli_error(ctx, "sweep-plot", "bands on which the pair can be modelled",
                         "at %s MHz: %s", cli_fmt(b1, sizeof b1, f / 1e6, 6), cxl_strerror(st));
    return 0;
}

static int sweep_plot(cli_ctx *ctx, const cli_args *a, const cli_duo_spec *s,
                      const cli_freq_point *pts, int n)
{
    cli_fb_sweep plot = {
        .names = { "ideal", "as built" },
        .ncurves = s->has_errors ? 2 : 1,
        .note = { "Model: free space, no ground, no mutual coupling, lossless ideal combiner.",
                  "Ratios beyond +-60 dB are drawn at +-60 dB (a perfect null is infinite).",
                  "RDF and gain are in the text, CSV and JSON output." },
        .elevation_deg = s->elevation_deg,
    };
    return cli_fb_sweep_save(ctx, a, pts, n, &plot, pair_fb, (void *)s);
}

/* The as-built line of describe(): what differs from the design. */
static void describe_as_built(cli_ctx *ctx, const cli_duo_spec *s)
{
    FILE *o = ctx->out;
    char b1[96];
    const char *sep = "  as built     ";
    for (int k = 0; k < 2; k++)
        if (s->built_line_m[k] != s->line_m[k]) {
            fprintf(o, "%s%c line %s", sep, k ? 'B' : 'A',
                    cli_fmt_length(ctx, b1, sizeof b1, s->built_line_m[k]));
            sep = "; ";
        }
    if (s->actual_vf != s->vf) {
        fprintf(o, "%sspool VF %s", sep, cli_fmt(b1, sizeof b1, s->actual_vf, 4));
        sep = "; ";
    }
    if (s->phase_error_deg != 0.0) {
        fprintf(o, "%sB lags %s deg more", sep, cli_fmt(b1, sizeof b1, s->phase_error_deg, 2));
        sep = "; ";
    }
    if (s->imbalance_db != 0.0) {
        fprintf(o, "%sB %s dB weaker", sep, cli_fmt(b1, sizeof b1, s->imbalance_db, 2));
        sep = "; ";
    }
    if (s->line_loss) fprintf(o, "%sloss of the %s lines", sep, s->cable);
    putc('\n', o);
}

static void describe(cli_ctx *ctx, const cli_duo_spec *s, const char *label)
{
    FILE *o = ctx->out;
    char b1[96], b2[96], b3[96];
    fprintf(o, "pattern%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  model        %s; lossless ideal combiner\n", MODEL_TEXT);
    fprintf(o, "  RDF          peak gain over the average over the upper hemisphere (elevation 0-90)\n");
    if (s->wire)
        fprintf(o, "  elements     traveling-wave wires %s, wire VF %s, along the forward axis\n",
                cli_fmt_length(ctx, b1, sizeof b1, s->wire_length_m),
                cli_fmt(b2, sizeof b2, s->wire_vf, 3));
    else
        fprintf(o, "  elements     isotropic\n");
    fprintf(o, "  spacing      %s across the forward axis\n",
            cli_fmt_length(ctx, b1, sizeof b1, s->spacing_m));
    fprintf(o, "  stagger      %s, B %s A\n",
            cli_fmt_length(ctx, b1, sizeof b1, fabs(s->stagger_m)),
            s->stagger_m >= 0.0 ? "behind" : "in front of");
    fprintf(o, "  feed         %s\n", s->feed);
    for (int k = 0; k < 2; k++) {
        fprintf(o, "    %c          delay %s ns", k ? 'B' : 'A',
                cli_fmt(b1, sizeof b1, s->delay_s[k] * 1e9, 3));
        if (s->has_line[k])
            fprintf(o, ", line %s at VF %s", cli_fmt_length(ctx, b2, sizeof b2, s->line_m[k]),
                    cli_fmt(b3, sizeof b3, s->vf, 4));
        fprintf(o, "%s\n", s->flip[k] ? ", inverted" : "");
    }
    if (s->has_errors) describe_as_built(ctx, s);
    fprintf(o, "  azimuth cut  elevation %s deg%s\n", cli_fmt(b1, sizeof b1, s->elevation_deg, 1),
            s->wire && s->elevation_default
                ? " (default for wires: a wire hears nothing along its own axis at 0)" : "");
}

typedef pattern_row pattern_rows[4 * CLI_MAX_ITEMS][2];

/* Every row (frequency x case), then the plots. */
static int compute(cli_ctx *ctx, const cli_args *a, const cli_duo_spec *s,
                   const cli_freq_point *pts, int n, pattern_rows rows)
{
    double plot_hz = 0.0;
    int code = cli_plot_options_check(ctx, a);
    if (!code && cli_count(a, "plot-freq"))
        code = cli_freq(ctx, "plot-freq", cli_get(a, "plot-freq", 0), &plot_hz);
    int ncases = s->has_errors ? 2 : 1;
    for (int i = 0; !code && i < n; i++)
        for (int c = 0; !code && c < ncases; c++)
            code = evaluate(ctx, s, c, pts[i].freq_hz, &rows[i][c]);
    if (!code && cli_count(a, "plot")) {
        if (!(plot_hz > 0.0))   /* a band's centre, or the first --freq */
            plot_hz = pts[0].band[0] && n > 1 ? pts[1].freq_hz : pts[0].freq_hz;
        code = plot(ctx, a, s, plot_hz);
    }
    if (!code && cli_count(a, "sweep-plot")) code = sweep_plot(ctx, a, s, pts, n);
    return code;
}

static void write_table(cli_ctx *ctx, const cli_duo_spec *s, const char *label,
                        const cli_freq_point *pts, int n, pattern_rows rows)
{
    int ncases = s->has_errors ? 2 : 1;
    for (int i = 0; i < n; i++)
        for (int c = 0; c < ncases; c++) {
            const pattern_row *r = &rows[i][c];
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(case_name[c]), CLI_TXT(pts[i].band),
                CLI_TXT(pts[i].edge), CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(s->elevation_deg),
                CLI_NUM(r->phase_deg), CLI_NUM(r->imbalance_db), CLI_NUM(r->gain_dbi),
                CLI_NUM(r->fb_db), CLI_NUM(r->null_db), CLI_NUM(r->null_az_deg),
                CLI_NUM(r->rdf_db), CLI_TXT(MODEL_TEXT), CLI_TXT(RDF_TEXT),
            };
            cli_table_row(ctx, pattern_cols, NCOLS, cells);
        }
}

static void write_text(cli_ctx *ctx, const cli_duo_spec *s, const char *label,
                       const cli_freq_point *pts, int n, pattern_rows rows)
{
    FILE *o = ctx->out;
    int ncases = s->has_errors ? 2 : 1;
    if (ctx->rows_out++) putc('\n', o);
    describe(ctx, s, label);
    fprintf(o, "\n  %-6s %-6s %10s  %-8s %7s %7s %8s %7s %8s %6s %6s\n", "band", "edge",
            "freq MHz", "case", "B lag", "B weak", "gain", "F/B", "null", "at az", "RDF");
    fprintf(o, "  %-6s %-6s %10s  %-8s %7s %7s %8s %7s %8s %6s %6s\n", "", "", "", "", "deg",
            "dB", "dBi", "dB", "dB", "deg", "dB");
    int at_limit = 0;
    for (int i = 0; i < n; i++)
        for (int c = 0; c < ncases; c++) {
            const pattern_row *r = &rows[i][c];
            char f[32], v[7][32];
            at_limit |= cli_at_db_limit(r->fb_db) || cli_at_db_limit(r->null_db);
            fprintf(o, "  %-6s %-6s %10s  %-8s %7s %7s %8s %7s %8s %6s %6s\n",
                    c ? "" : pts[i].band, c ? "" : pts[i].edge,
                    c ? "" : cli_fmt(f, sizeof f, pts[i].freq_hz / 1e6, 6), case_name[c],
                    cli_fmt(v[0], sizeof v[0], r->phase_deg, 2),
                    cli_fmt(v[1], sizeof v[1], r->imbalance_db, 2),
                    cli_fmt(v[2], sizeof v[2], r->gain_dbi, 2),
                    cli_fmt(v[3], sizeof v[3], r->fb_db, 2),
                    cli_fmt(v[4], sizeof v[4], r->null_db, 2),
                    cli_fmt(v[5], sizeof v[5], r->null_az_deg, 1),
                    cli_fmt(v[6], sizeof v[6], r->rdf_db, 2));
        }
    cli_db_limit_note(ctx, at_limit);
}

static int pattern_run(cli_ctx *ctx, const cli_args *a)
{
    static _Thread_local cli_freq_point pts[4 * CLI_MAX_ITEMS];
    static _Thread_local pattern_rows rows;
    cli_duo_spec s;
    if (cli_duo_spec_parse(ctx, a, &s)) return CLI_EXIT_USAGE;
    int n = cli_freq_points(ctx, a, pts, sizeof pts / sizeof pts[0], NULL);
    int code = n < 0 ? CLI_EXIT_USAGE : compute(ctx, a, &s, pts, n, rows);
    if (!code && ctx->format != CLI_TEXT)
        write_table(ctx, &s, cli_label(a), pts, n, rows);
    else if (!code)
        write_text(ctx, &s, cli_label(a), pts, n, rows);
    cli_duo_spec_free(&s);
    return code ? code : CLI_EXIT_OK;
}

const cli_command cli_cmd_pattern = {
    .name = "pattern",
    .summary = "pattern of a two-element receive pair per band, ideal and as built",
    .synopsis = "[--spacing LEN] [--stagger LEN] [FEED] [AS-BUILT ERRORS] (--band LIST | --freq F) [OPTIONS]",
    .opts = pattern_opts,
    .end = cli_vf_source_end,
    .run = pattern_run,
    .batch = 1,
};
