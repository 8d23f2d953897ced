/* cmd_array.c - coaxline array: what an array of any number of elements
 * described by a layout CSV does per band (forward gain, front-to-back,
 * rear null, RDF, beamwidth), as designed, as built, and with each element
 * reversed in turn (a feed box wired the other way round); polar and
 * sweep plots.  The model is the library's (coaxline.h, array.c). */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

#define RDF_TEXT "upper-hemisphere average"
#define AZ_TEXT "compass bearing: 0 forward, clockwise seen from above"
#define PLOT_POINTS 360
#define MAX_PLOT_CURVES 8

static const cli_optdef array_opts[] = {
    CLI_LAYOUT_OPTDEFS,
    CLI_ARRAY_MODEL_OPTDEFS,
    { "reverse-each", NULL, "also evaluate with each element reversed in turn", 0 },
    { "as-built", "FILE", "per-element errors: label,line,phase_error,imbalance", 0 },
    { "actual-vf", "X", "as built: the spool's real VF (the lines were cut for --vf/--cable)", 0 },
    CLI_DUO_BAND_OPTDEFS,
    { "plot", "FILE", "write azimuth patterns as an SVG polar plot", 0 },
    { "plot-freq", "LIST", "frequencies of the plot (default: each band centre or --freq)", 1 },
    { "plot-range", "DB", "dB from the outer ring to the plot centre (default 40)", 0 },
    { "sweep-plot", "FILE", "write front-to-back against frequency across each --band as SVG", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col array_cols[] = {
    { "label", -1 }, { "case", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "elevation_deg", 1 }, { "forward_gain_dbi", 2 }, { "front_to_back_db", 2 },
    { "null_depth_db", 2 }, { "null_azimuth_deg", 1 }, { "rdf_forward_db", 2 },
    { "rdf_db", 2 }, { "beamwidth_deg", 1 }, { "model", -1 }, { "rdf_reference", -1 },
    { "azimuth", -1 },
};
#define NCOLS (sizeof array_cols / sizeof array_cols[0])

typedef struct {
    cli_layout lay;
    double vf, actual_vf;
    cxl_loss_model *model;   /* --line-loss */
    int kind;
    double wire_length_m, wire_vf;
    double elevation_deg;
    int as_built, reverse_each;
    const char *model_text;
} array_spec;

typedef struct {
    double gain, fb, null_db, null_az, rdf_fwd, rdf, bw;
    int has_null, has_bw;   /* 0: undefined (no forward response) */
} array_row;

/* Case c: 0 design, 1 as built (when given), then one per reversed
 * element. */
static int ncases(const array_spec *s)
{
    return 1 + s->as_built + (s->reverse_each ? (int)s->lay.n : 0);
}

static void case_name(const array_spec *s, int c, char *buf, size_t size)
{
    if (c == 0) snprintf(buf, size, "design");
    else if (c == 1 && s->as_built) snprintf(buf, size, "as-built");
    else snprintf(buf, size, "reversed %s", s->lay.el[c - 1 - s->as_built].label);
}

static cxl_status build(const array_spec *s, int c, cxl_array **out)
{
    const cli_array_model m = { s->kind, s->wire_length_m, s->wire_vf, s->elevation_deg,
                                s->model_text };
    return cli_layout_array(&s->lay, &m, s->vf, s->actual_vf, s->model, c == 1 && s->as_built,
                            c > s->as_built ? c - 1 - s->as_built : -1, out);
}

/* The frequency bound of the geometry, as a one-line error above it. */
static int size_limit(cli_ctx *ctx, const char *field, const cxl_array *a, double f)
{
    double max_hz;
    if (cxl_array_max_freq(a, &max_hz) != CXL_OK || f <= max_hz) return 0;
    char b1[32], b2[32], want[96];
    snprintf(want, sizeof want, "a frequency up to %s MHz for this layout",
             cli_fmt(b1, sizeof b1, max_hz / 1e6, 3));
    return cli_error(ctx, field, want,
                     "at %s MHz the layout is too large for the pattern model "
                     "(electrical size k D above %g, about %s wavelengths)",
                     cli_fmt(b2, sizeof b2, f / 1e6, 6), CXL_ARRAY_MAX_KSIZE,
                     cli_fmt(b1, sizeof b1, CXL_ARRAY_MAX_KSIZE / (2.0 * M_PI), 1));
}

static int evaluate(cli_ctx *ctx, const array_spec *s, int c, double f, array_row *r)
{
    cxl_array *a;
    cxl_status st = build(s, c, &a);
    if (st == CXL_OK && size_limit(ctx, "freq", a, f)) {
        cxl_array_free(a);
        return CLI_EXIT_USAGE;
    }
    double el = s->elevation_deg;
    r->has_null = r->has_bw = 1;
    if (st == CXL_OK) st = cxl_array_eval_gain(a, f, 0.0, el, &r->gain);
    if (st == CXL_OK) st = cxl_array_eval_front_to_back(a, f, el, &r->fb);
    if (st == CXL_OK) st = cxl_array_eval_rdf(a, f, el, &r->rdf_fwd, &r->rdf);
    if (st == CXL_OK) {
        /* a case with no forward response (a reversed element can do
         * that) has no null depth or beamwidth referred to forward: those
         * cells stay empty */
        st = cxl_array_eval_rear_null(a, f, el, &r->null_az, &r->null_db);
        if (st == CXL_ERANGE && c > 0) r->has_null = 0, st = CXL_OK;
    }
    if (st == CXL_OK) {
        st = cxl_array_eval_beamwidth(a, f, el, &r->bw);
        if (st == CXL_ERANGE && c > 0) r->has_bw = 0, st = CXL_OK;
    }
    cxl_array_free(a);
    if (st != CXL_OK) {
        char b[32], name[96];
        case_name(s, c, name, sizeof name);
        return cli_error(ctx, "freq", "a frequency and elevation at which the array has a forward response",
                         "at %s MHz the %s array cannot be evaluated: %s",
                         cli_fmt(b, sizeof b, f / 1e6, 6), name, cxl_strerror(st));
    }
    return 0;
}

static int parse_element(cli_ctx *ctx, const cli_args *a, array_spec *s)
{
    cli_array_model m;
    if (cli_array_model_parse(ctx, a, &m)) return CLI_EXIT_USAGE;
    s->kind = m.kind;
    s->wire_length_m = m.wire_length_m;
    s->wire_vf = m.wire_vf;
    s->elevation_deg = m.elevation_deg;
    s->model_text = m.model_text;
    return 0;
}

/* --actual-vf: the spool's VF, which needs the design VF. */
static int parse_actual_vf(cli_ctx *ctx, const cli_args *a, array_spec *s)
{
    int given;
    if (cli_actual_vf(ctx, a, s->vf > 0.0, s->vf, &s->actual_vf, &given)) return CLI_EXIT_USAGE;
    if (given) s->as_built = 1;
    return 0;
}

/* The layout file, and the lines as built (--as-built, or as designed). */
static int parse_layout(cli_ctx *ctx, const cli_args *a, array_spec *s, double design_hz)
{
    if (cli_layout_load(ctx, "layout", cli_get(a, "layout", 0), s->vf, design_hz, &s->lay))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "as-built")) {
        if (cli_layout_as_built(ctx, "as-built", cli_get(a, "as-built", 0), &s->lay))
            return CLI_EXIT_USAGE;
        s->as_built = 1;
    } else {
        for (size_t i = 0; i < s->lay.n; i++) s->lay.el[i].built_line_m = s->lay.el[i].line_m;
    }
    return 0;
}

static int parse_spec(cli_ctx *ctx, const cli_args *a, array_spec *s)
{
    memset(s, 0, sizeof *s);
    if (!cli_count(a, "layout"))
        return cli_error(ctx, "layout", "--layout array.csv", "the array needs its layout file");
    if (parse_element(ctx, a, s)) return CLI_EXIT_USAGE;
    const char *cable = NULL;
    if ((cli_count(a, "vf") || cli_count(a, "cable")) && cli_vf_or_cable(ctx, a, &s->vf, &cable))
        return CLI_EXIT_USAGE;
    double design_hz = 0.0;
    if (cli_count(a, "design-freq") &&
        cli_freq(ctx, "design-freq", cli_get(a, "design-freq", 0), &design_hz))
        return CLI_EXIT_USAGE;
    if (parse_actual_vf(ctx, a, s)) return CLI_EXIT_USAGE;
    if (cli_line_loss_model(ctx, a, cable, &s->model)) return CLI_EXIT_USAGE;
    if (parse_layout(ctx, a, s, design_hz)) return CLI_EXIT_USAGE;
    s->reverse_each = cli_flag(a, "reverse-each");
    return 0;
}

static void free_spec(array_spec *s)
{
    cli_layout_free(&s->lay);
    cxl_loss_model_free(s->model);
    s->model = NULL;
}

/* Azimuth patterns at each plot frequency (design, and as built dashed). */
static int plot(cli_ctx *ctx, const cli_args *a, const array_spec *s, const double *freqs,
                int nf)
{
    double range_db = 40.0;
    if (cli_count(a, "plot-range") &&
        cli_number(ctx, "plot-range", cli_get(a, "plot-range", 0), 10.0, 200.0,
                   "10 to 200 dB, such as 40", &range_db))
        return CLI_EXIT_USAGE;
    static _Thread_local double az[PLOT_POINTS], gain[MAX_PLOT_CURVES][PLOT_POINTS];
    char names[MAX_PLOT_CURVES][96], title[200], b1[32], b2[32];
    cli_svg_curve curves[MAX_PLOT_CURVES];
    size_t nc = 0;
    for (int i = 0; i < PLOT_POINTS; i++) az[i] = 360.0 * i / PLOT_POINTS;
    for (int k = 0; k < nf; k++)
        for (int c = 0; c <= s->as_built && nc < MAX_PLOT_CURVES; c++) {
            cxl_array *arr;
            double fwd, rdf;
            cxl_status st = build(s, c, &arr);
            if (st == CXL_OK && size_limit(ctx, "plot-freq", arr, freqs[k])) {
                cxl_array_free(arr);
                return CLI_EXIT_USAGE;
            }
            if (st == CXL_OK)
                st = cxl_array_eval_pattern(arr, freqs[k], s->elevation_deg, PLOT_POINTS, gain[nc]);
            if (st == CXL_OK) st = cxl_array_eval_rdf(arr, freqs[k], s->elevation_deg, &fwd, &rdf);
            cxl_array_free(arr);
            if (st != CXL_OK)
                return cli_error(ctx, "plot-freq", "a frequency at which the array can be modelled",
                                 "at %s MHz: %s", cli_fmt(b1, sizeof b1, freqs[k] / 1e6, 6),
                                 cxl_strerror(st));
            snprintf(names[nc], sizeof names[nc], "%s MHz%s (RDF %s dB)",
                     cli_fmt(b1, sizeof b1, freqs[k] / 1e6, 4), c ? " as built" : "",
                     cli_fmt(b2, sizeof b2, rdf, 2));
            curves[nc] = (cli_svg_curve){ names[nc], az, gain[nc], PLOT_POINTS, c, 0 };
            nc++;
        }
    const char *label = cli_label(a);
    snprintf(title, sizeof title, "%s%sAzimuth pattern of %zu elements, elevation %s deg", label,
             label[0] ? ": " : "", s->lay.n, cli_fmt(b2, sizeof b2, s->elevation_deg, 1));
    char note0[160];
    snprintf(note0, sizeof note0, "Model: %s, lossless ideal combiner; gain in dBi.", s->model_text);
    cli_svg_polar polar = {
        .title = title,
        .note = { note0,
                  "RDF = peak gain over the average over the upper hemisphere (elevation 0-90 deg).",
                  "Azimuth is a compass bearing: 0 forward (+x), clockwise seen from above." },
        .unit = "dBi",
        .range_db = range_db,
        .ring_step_db = range_db >= 30.0 ? 10.0 : 5.0,
        .curves = curves,
        .ncurves = nc,
    };
    return cli_svg_save(ctx, "plot", cli_get(a, "plot", 0), &polar, NULL);
}

/* Front-to-back across each band, design and as built. */
typedef struct {
    cxl_array *arr[2];
    double elevation_deg;
} array_sweep;

static int array_fb(cli_ctx *ctx, void *user, int c, double f, double *fb_db)
{
    const array_sweep *sw = user;
    char b1[32];
    cxl_status st = cxl_array_eval_front_to_back(sw->arr[c], f, sw->elevation_deg, fb_db);
    if (st != CXL_OK)
        return cli_error(ctx, "sweep-plot", "bands on which the array can be modelled",
                         "at %s MHz: %s", cli_fmt(b1, sizeof b1, f / 1e6, 6), cxl_strerror(st));
    return 0;
}

static int sweep_plot(cli_ctx *ctx, const cli_args *a, const array_spec *s,
                      const cli_freq_point *pts, int n)
{
    array_sweep sw = { { NULL, NULL }, s->elevation_deg };
    cli_fb_sweep plot = {
        .names = { "design", "as built" },
        .ncurves = 1 + s->as_built,
        .note = { "Model: no mutual coupling, lossless ideal combiner.",
                  "Ratios beyond +-60 dB are drawn at +-60 dB (a perfect null is infinite).",
                  "Front-to-back: azimuth 0 over azimuth 180 (compass bearing)." },
        .elevation_deg = s->elevation_deg,
    };
    int code = 0;
    for (int c = 0; c < plot.ncurves && !code; c++)
        if (build(s, c, &sw.arr[c]) != CXL_OK)
            code = cli_error(ctx, "sweep-plot", NULL, "out of memory");
    if (!code) code = cli_fb_sweep_save(ctx, a, pts, n, &plot, array_fb, &sw);
    for (int c = 0; c < 2; c++) cxl_array_free(sw.arr[c]);
    return code;
}

/* --plot-freq, or each band's centre and each --freq. */
static int plot_freqs(cli_ctx *ctx, const cli_args *a, const cli_freq_point *pts, int n,
                      double *freqs)
{
    int nf = 0;
    if (cli_count(a, "plot-freq")) {
        static _Thread_local char buf[4096];
        const char *items[CLI_MAX_ITEMS];
        int ni = cli_items(ctx, a, "plot-freq", buf, sizeof buf, items, CLI_MAX_ITEMS);
        if (ni < 0) return -1;
        if (ni > MAX_PLOT_CURVES)
            return cli_error(ctx, "plot-freq", "at most 8 frequencies", "%d plot frequencies", ni), -1;
        for (int i = 0; i < ni; i++)
            if (cli_freq(ctx, "plot-freq", items[i], &freqs[nf++])) return -1;
        return nf;
    }
    for (int i = 0; i < n && nf < MAX_PLOT_CURVES; i++)
        if (!pts[i].band[0] || strcmp(pts[i].edge, "centre") == 0) freqs[nf++] = pts[i].freq_hz;
    return nf;
}

static void describe(cli_ctx *ctx, const array_spec *s, const char *label)
{
    FILE *o = ctx->out;
    char b[5][96];
    fprintf(o, "array%s%s: %zu elements\n", label[0] ? ": " : "", label, s->lay.n);
    fprintf(o, "  model        %s; lossless ideal combiner\n", s->model_text);
    fprintf(o, "  azimuth      %s\n", AZ_TEXT);
    fprintf(o, "  RDF          over the average over the upper hemisphere (elevation 0-90): "
               "rdf_forward from azimuth 0, rdf from the peak\n");
    if (s->kind == CXL_ELEMENT_WIRE)
        fprintf(o, "  elements     traveling-wave wires %s, wire VF %s, along the forward axis\n",
                cli_fmt_length(ctx, b[0], sizeof b[0], s->wire_length_m),
                cli_fmt(b[1], sizeof b[1], s->wire_vf, 3));
    else
        fprintf(o, "  elements     %s\n", s->kind == CXL_ELEMENT_VERTICAL
                                              ? "short verticals over perfect ground" : "isotropic");
    fprintf(o, "\n  %-10s %9s %9s %8s %10s %-22s %s\n", "element", "x m", "y m", "z m", "delay ns",
            "line", "");
    for (size_t i = 0; i < s->lay.n; i++) {
        const cli_layout_elem *e = &s->lay.el[i];
        char line[128] = "";
        if (e->has_line)
            snprintf(line, sizeof line, "%s", cli_fmt_length(ctx, b[4], sizeof b[4], e->line_m));
        fprintf(o, "  %-10s %9s %9s %8s %10s %-22s %s%s%s\n", e->label,
                cli_fmt(b[0], sizeof b[0], e->x_m, 3), cli_fmt(b[1], sizeof b[1], e->y_m, 3),
                cli_fmt(b[2], sizeof b[2], e->z_m, 3), cli_fmt(b[3], sizeof b[3], e->delay_s * 1e9, 3),
                line, e->invert ? "inverted " : "", e->weight_db != 0.0 ? "weight " : "",
                e->weight_db != 0.0 ? cli_fmt(b[0], sizeof b[0], e->weight_db, 2) : "");
    }
    if (s->as_built) {
        fprintf(o, "  as built    ");
        if (s->actual_vf != s->vf)
            fprintf(o, " spool VF %s;", cli_fmt(b[0], sizeof b[0], s->actual_vf, 4));
        for (size_t i = 0; i < s->lay.n; i++) {
            const cli_layout_elem *e = &s->lay.el[i];
            if (e->built_line_m != e->line_m)
                fprintf(o, " %s line %s;", e->label, cli_fmt(b[0], sizeof b[0], e->built_line_m, 3));
            if (e->phase_error_deg != 0.0)
                fprintf(o, " %s lags %s deg;", e->label, cli_fmt(b[0], sizeof b[0], e->phase_error_deg, 2));
            if (e->imbalance_db != 0.0)
                fprintf(o, " %s %s dB weaker;", e->label, cli_fmt(b[0], sizeof b[0], e->imbalance_db, 2));
        }
        putc('\n', o);
    }
    fprintf(o, "  azimuth cut  elevation %s deg\n", cli_fmt(b[0], sizeof b[0], s->elevation_deg, 1));
}

/* Every row (frequency x case), then the plots; *rows is the caller's to
 * free. */
static int compute(cli_ctx *ctx, const cli_args *a, const array_spec *s,
                   const cli_freq_point *pts, int n, array_row **rows)
{
    int code = cli_plot_options_check(ctx, a);
    int nc = ncases(s);
    if (!code) {
        *rows = calloc((size_t)n * (size_t)nc, sizeof **rows);
        if (!*rows) code = cli_error(ctx, "layout", NULL, "out of memory");
    }
    for (int i = 0; !code && i < n; i++)
        for (int c = 0; !code && c < nc; c++)
            code = evaluate(ctx, s, c, pts[i].freq_hz, &(*rows)[(size_t)i * nc + c]);
    if (!code && cli_count(a, "plot")) {
        double freqs[MAX_PLOT_CURVES];
        int nf = plot_freqs(ctx, a, pts, n, freqs);
        code = nf < 0 ? CLI_EXIT_USAGE : plot(ctx, a, s, freqs, nf);
    }
    if (!code && cli_count(a, "sweep-plot")) code = sweep_plot(ctx, a, s, pts, n);
    return code;
}

static void write_table(cli_ctx *ctx, const array_spec *s, const char *label,
                        const cli_freq_point *pts, int n, const array_row *rows)
{
    char name[96];
    int nc = ncases(s);
    for (int i = 0; i < n; i++)
        for (int c = 0; c < nc; c++) {
            const array_row *r = &rows[(size_t)i * nc + c];
            case_name(s, c, name, sizeof name);
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(name), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
                CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(s->elevation_deg), CLI_NUM(r->gain),
                CLI_NUM(r->fb), r->has_null ? CLI_NUM(r->null_db) : CLI_NONE,
                r->has_null ? CLI_NUM(r->null_az) : CLI_NONE, CLI_NUM(r->rdf_fwd),
                CLI_NUM(r->rdf), r->has_bw ? CLI_NUM(r->bw) : CLI_NONE,
                CLI_TXT(s->model_text), CLI_TXT(RDF_TEXT),
                CLI_TXT(AZ_TEXT),
            };
            cli_table_row(ctx, array_cols, NCOLS, cells);
        }
}

static void write_text(cli_ctx *ctx, const array_spec *s, const char *label,
                       const cli_freq_point *pts, int n, const array_row *rows)
{
    FILE *o = ctx->out;
    char name[96];
    int nc = ncases(s);
    if (ctx->rows_out++) putc('\n', o);
    describe(ctx, s, label);
    fprintf(o, "\n  %-6s %-6s %10s  %-16s %8s %7s %8s %6s %8s %6s %6s\n", "band", "edge",
            "freq MHz", "case", "gain", "F/B", "null", "at az", "RDF fwd", "RDF", "-3 dB");
    fprintf(o, "  %-6s %-6s %10s  %-16s %8s %7s %8s %6s %8s %6s %6s\n", "", "", "", "", "dBi",
            "dB", "dB", "deg", "dB", "dB", "deg");
    int at_limit = 0, undefined = 0;
    for (int i = 0; i < n; i++)
        for (int c = 0; c < nc; c++) {
            const array_row *r = &rows[(size_t)i * nc + c];
            char f[32], v[7][32];
            case_name(s, c, name, sizeof name);
            at_limit |= cli_at_db_limit(r->fb) || (r->has_null && cli_at_db_limit(r->null_db));
            undefined |= !r->has_null || !r->has_bw;
            fprintf(o, "  %-6s %-6s %10s  %-16s %8s %7s %8s %6s %8s %6s %6s\n",
                    c ? "" : pts[i].band, c ? "" : pts[i].edge,
                    c ? "" : cli_fmt(f, sizeof f, pts[i].freq_hz / 1e6, 6), name,
                    cli_fmt(v[0], sizeof v[0], r->gain, 2), cli_fmt(v[1], sizeof v[1], r->fb, 2),
                    r->has_null ? cli_fmt(v[2], sizeof v[2], r->null_db, 2) : "-",
                    r->has_null ? cli_fmt(v[3], sizeof v[3], r->null_az, 1) : "-",
                    cli_fmt(v[4], sizeof v[4], r->rdf_fwd, 2), cli_fmt(v[5], sizeof v[5], r->rdf, 2),
                    r->has_bw ? cli_fmt(v[6], sizeof v[6], r->bw, 1) : "-");
        }
    cli_db_limit_note(ctx, at_limit);
    if (undefined)
        fprintf(o, "  (-: no forward response, so no null depth or beamwidth referred to it)\n");
}

static int array_run(cli_ctx *ctx, const cli_args *a)
{
    static _Thread_local cli_freq_point pts[4 * CLI_MAX_ITEMS];
    array_spec s;
    array_row *rows = NULL;
    int code = parse_spec(ctx, a, &s) ? CLI_EXIT_USAGE : 0;
    int n = code ? 0 : cli_freq_points(ctx, a, pts, sizeof pts / sizeof pts[0], NULL);
    if (!code && n < 0) code = CLI_EXIT_USAGE;
    if (!code) code = compute(ctx, a, &s, pts, n, &rows);
    if (!code && ctx->format != CLI_TEXT)
        write_table(ctx, &s, cli_label(a), pts, n, rows);
    else if (!code)
        write_text(ctx, &s, cli_label(a), pts, n, rows);
    free(rows);
    free_spec(&s);
    return code ? code : CLI_EXIT_OK;
}

const cli_command cli_cmd_array = {
    .name = "array",
    .summary = "pattern of an array of any size from a layout file, designed, as built, reversed",
    .synopsis = "--layout FILE.csv (--band LIST | --freq F) [--vf X | --cable NAME] [OPTIONS]",
    .opts = array_opts,
    .run = array_run,
    .batch = 1,
};
