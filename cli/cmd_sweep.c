/* cmd_sweep.c - coaxline sweep: what an analyzer's one-port sweep file
 * holds and the resonances in it (reactance zeros, |Z| and SWR minima),
 * numbered for an open or shorted far end; with --length, the VF each one
 * implies and the line fitted to the whole sweep (VF and loss at --at
 * frequencies, Z0, how well it fits); --plot draws |Z| (or SWR) and the
 * phase with the resonances marked. */
#include <config.h>
#include <complex.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

static const cli_optdef sweep_opts[] = {
    { "file", "FILE", "one-port sweep: Touchstone (.s1p, .ts) or CSV (also the bare argument)", 0 },
    { "reference", "OHM", "reference impedance for Gamma and SWR (default: the file's)", 0 },
    { "end", "open|short|load", "far end of the line (default open; load: --load R+jX)", 0 },
    { "length", "LEN", "physical length of the line: the VF each resonance implies, and the fitted line", 0 },
    { "load", "R[+-jX]", "with --end load: the far end's impedance in ohm, e.g. 12-j30", 0 },
    { "at", "F", "with --length: the fitted VF and loss at this frequency (default mid-band)", 1 },
    { "fixture-vf", "X", "with --length: fit a fixture of this VF between reference plane and line", 0 },
    { "vf-guess", "X", "with --length: number the resonances for this VF (default: from their spacing)", 0 },
    { "kind", "LIST", "reactance-zero, impedance-min, swr-min (default all)", 1 },
    { "plot", "FILE.svg", "draw |Z| (or SWR) and the phase against frequency", 0 },
    { "plot-y", "impedance|swr", "what the plot draws (default impedance, swr without phase)", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col sweep_cols[] = {
    { "label", -1 }, { "file", -1 }, { "points", 0 }, { "start_mhz", 6 }, { "stop_mhz", 6 },
    { "reference_ohm", 3 }, { "kind", -1 }, { "resonance", -1 }, { "order", 0 },
    { "freq_mhz", 6 }, { "uncertainty_khz", 3 }, { "r_ohm", 3 }, { "z_ohm", 3 }, { "swr", 3 },
    { "vf", 5 }, { "vf_err", 7 }, { "loss_db_per_100m", 3 }, { "loss_err_db_per_100m", 5 },
    { "z0_ohm", 3 }, { "z0_err_ohm", 5 }, { "fixture_m", 4 }, { "fixture_err_m", 6 },
    { "rms_residual", 6 }, { "max_residual", 6 }, { "max_residual_mhz", 6 },
};
#define NCOLS (sizeof sweep_cols / sizeof sweep_cols[0])

static const char *const source_names[] = { "Touchstone 1.0", "Touchstone 2.0", "CSV" };

/* --kind as a bit mask of cxl_sweep_kind. */
static int parse_kinds(const cli_ctx *ctx, const cli_args *a, unsigned *mask)
{
    static const char expected[] = "reactance-zero, impedance-min or swr-min, comma-separated";
    char buf[512];
    const char *items[CLI_MAX_ITEMS];
    int n = cli_items(ctx, a, "kind", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (n < 0) return CLI_EXIT_USAGE;
    if (n == 0) {
        *mask = 7u;
        return 0;
    }
    *mask = 0;
    for (int i = 0; i < n; i++) {
        int k = -1;
        for (int j = 0; j < 3; j++)
            if (strcmp(items[i], cli_sweep_kind_name((cxl_sweep_kind)j)) == 0) k = j;
        if (k < 0) return cli_error(ctx, "kind", expected, "unknown kind '%s'", items[i]);
        *mask |= 1u << k;
    }
    return 0;
}

/* What the options ask for. */
typedef struct sweep_req {
    cxl_stub_end end;
    int on_load;              /* --end load: resonances not numbered */
    double length_m, vf_guess, ref_ohm;
    unsigned mask;            /* --kind */
} sweep_req;

/* The sweep read and what it holds; ref_ohm is the reference used. */
typedef struct sweep_view {
    const cxl_sweep *s;
    const char *path, *label;
    size_t n;
    double start_hz, stop_hz, file_ref_ohm, ref_ohm;
    cxl_sweep_source src;
    int has_phase;
} sweep_view;

/* A resonance's order, or "?" when it could not be numbered. */
static const char *order_text(char *buf, size_t size, int order)
{
    if (order > 0) snprintf(buf, size, "%d", order);
    else snprintf(buf, size, "?");
    return buf;
}

/* ---- the plot ------------------------------------------------------------ */

/* --plot-y as 1 for SWR, 0 for |Z|; without it SWR only when the file
 * holds no phase. */
static int parse_plot_y(const cli_ctx *ctx, const cli_args *a, int has_phase, int *swr)
{
    const char *what = cli_get(a, "plot-y", 0);
    *swr = !has_phase;
    if (!what) return 0;
    if (strcmp(what, "swr") == 0) *swr = 1;
    else if (strcmp(what, "impedance") == 0) {
        if (!has_phase)
            return cli_error(ctx, "plot-y", "swr for a file with only an swr column",
                             "the file holds no impedance");
        *swr = 0;
    } else return cli_error(ctx, "plot-y", "impedance or swr", "unknown value '%s'", what);
    return 0;
}

/* Frequency in MHz, |Z| or SWR, and the phase of Z (or of Gamma) in
 * degrees at each point; NAN where a point gives none. */
static void plot_points(const sweep_view *v, int swr, double *x, double *y, double *ph)
{
    for (size_t i = 0; i < v->n; i++) {
        double f, g, gr = 0.0, gi = 0.0, zr = NAN, zi = NAN;
        y[i] = ph[i] = NAN;
        if (cxl_sweep_magnitude(v->s, i, v->ref_ohm, &f, &g) != CXL_OK) continue;
        x[i] = f / 1e6;
        if (v->has_phase &&
            cxl_sweep_point(v->s, i, v->ref_ohm, NULL, &gr, &gi, &zr, &zi) != CXL_OK)
            zr = zi = NAN;
        if (swr) {
            y[i] = g < 1.0 ? (1.0 + g) / (1.0 - g) : NAN;
            if (v->has_phase) ph[i] = atan2(gi, gr) * 180.0 / M_PI;
        } else {
            y[i] = hypot(zr, zi);
            ph[i] = atan2(zi, zr) * 180.0 / M_PI;
        }
    }
}

/* A marker at each series resonance of the kinds shown, named by its
 * order; returns how many. */
static size_t plot_marks(const cxl_sweep_res *r, unsigned mask, cli_svg_span *marks,
                         char (*names)[24])
{
    size_t nm = 0;
    for (size_t i = 0; i < cxl_sweep_res_count(r); i++) {
        cxl_sweep_kind kind;
        int series, order;
        double f;
        if (cxl_sweep_res_get(r, i, &kind, &series, &order, &f, NULL, NULL) != CXL_OK) continue;
        if (!((mask >> kind) & 1u) || !series) continue;
        order_text(names[nm], sizeof names[nm], order);
        marks[nm] = (cli_svg_span){ f / 1e6, f / 1e6, names[nm] };
        nm++;
    }
    return nm;
}

/* The plot: |Z| in ohm or SWR against frequency, the phase of Z (or of
 * Gamma) on the right axis, and a marker line at each resonance shown. */
static int plot(const cli_ctx *ctx, const cli_args *a, const sweep_view *v,
                const cxl_sweep_res *r, unsigned mask)
{
    int swr;
    if (parse_plot_y(ctx, a, v->has_phase, &swr)) return CLI_EXIT_USAGE;
    size_t n = v->n, nr = cxl_sweep_res_count(r);
    double *x = malloc(3 * n * sizeof *x);
    cli_svg_span *marks = malloc((nr + 1) * sizeof *marks);
    char (*names)[24] = malloc((nr + 1) * sizeof *names);
    int rc = CLI_EXIT_OK;
    if (!x || !marks || !names) rc = cli_error(ctx, "plot", NULL, "out of memory");
    if (rc == CLI_EXIT_OK) {
        plot_points(v, swr, x, x + n, x + 2 * n);
        size_t nm = plot_marks(r, mask, marks, names);
        cli_svg_curve main_curve = { swr ? "SWR" : "|Z| (ohm)", x, x + n, n, 0, 0 };
        cli_svg_curve phase_curve = { "phase", x, x + 2 * n, n, 1, 0 };
        char note[160];
        snprintf(note, sizeof note, "dashed: phase of %s (deg, right axis); grey lines: series "
                 "resonances, by order", swr ? "Gamma" : "Z");
        cli_svg_xy p = {
            .title = "sweep",
            .note = { note, NULL, NULL },
            .x_label = "frequency (MHz)",
            .y_label = swr ? "SWR" : "|Z| (ohm)",
            .curves = &main_curve, .ncurves = 1,
            .spans = marks, .nspans = nm,
            .y2_label = "phase (deg)",
            .curves2 = &phase_curve, .ncurves2 = v->has_phase ? 1 : 0,
        };
        rc = cli_svg_save(ctx, "plot", cli_get(a, "plot", 0), NULL, &p);
    }
    free(x);
    free(marks);
    free(names);
    return rc;
}

/* ---- the line fitted to the whole sweep (--length) ---------------------- */

typedef struct fit_opts {
    double load_re, load_im, fixture_vf;
    int fixture;
    double at[CLI_MAX_ITEMS];
    int nat;
} fit_opts;

/* --load: given exactly when the far end is on a load, which also needs
 * --length (the load is only used by the fitted line). */
static int parse_load(const cli_ctx *ctx, const cli_args *a, int on_load, int has_length,
                      fit_opts *fo)
{
    const char *load = cli_get(a, "load", 0);
    if (on_load && !load)
        return cli_error(ctx, "load", "--end load --load 12-j30", "--end load needs the load");
    if (load && !on_load)
        return cli_error(ctx, "load", "--end load --load 12-j30", "given without --end load");
    if (load && cli_load_impedance(ctx, load, &fo->load_re, &fo->load_im)) return CLI_EXIT_USAGE;
    if (on_load && !has_length)
        return cli_error(ctx, "length", "--end load --load 12-j30 --length 9m",
                         "--end load is for the fitted line, which needs the line's --length");
    return 0;
}

/* --at: the frequencies to give the fitted VF and loss at. */
static int parse_at(const cli_ctx *ctx, const cli_args *a, int has_length, fit_opts *fo)
{
    char buf[512];
    const char *items[CLI_MAX_ITEMS];
    int n = cli_items(ctx, a, "at", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (n < 0) return CLI_EXIT_USAGE;
    if (n > 0 && !has_length)
        return cli_error(ctx, "at", "--length 10m --at 7MHz",
                         "the VF at a frequency comes from the fitted line, which needs --length");
    for (int i = 0; i < n; i++)
        if (cli_freq(ctx, "at", items[i], &fo->at[i])) return CLI_EXIT_USAGE;
    fo->nat = n;
    return 0;
}

static int parse_fit_opts(const cli_ctx *ctx, const cli_args *a, int on_load, fit_opts *fo)
{
    memset(fo, 0, sizeof *fo);
    int has_length = cli_count(a, "length") > 0;
    if (parse_load(ctx, a, on_load, has_length, fo)) return CLI_EXIT_USAGE;
    if (cli_count(a, "fixture-vf")) {
        if (!has_length)
            return cli_error(ctx, "fixture-vf", "--length 10m --fixture-vf 0.7",
                             "a fixture is fitted with the line, which needs --length");
        if (cli_vf(ctx, "fixture-vf", cli_get(a, "fixture-vf", 0), &fo->fixture_vf))
            return CLI_EXIT_USAGE;
        fo->fixture = 1;
    }
    return parse_at(ctx, a, has_length, fo);
}

/* An uncertainty with two significant digits, at least min_dec decimals. */
static const char *fmt_err(char *buf, size_t size, double v, int min_dec)
{
    int dec = min_dec;
    if (v > 0.0 && isfinite(v)) {
        int need = 1 - (int)floor(log10(v));
        if (need > dec) dec = need > 9 ? 9 : need;
    }
    return cli_fmt(buf, size, v, dec);
}

static const char *fit_failure(cxl_status st)
{
    switch (st) {
    case CXL_EEXTRAPOLATE:
        return "fewer than two series resonances of one kind in the sweep (nothing to start "
               "the VF from; sweep wider)";
    case CXL_ENOTFOUND: return "the file holds no phase (an swr column)";
    case CXL_ENOCONV:
        return "the fit did not settle on a line (not a uniform line of this length and end?)";
    default: return cxl_strerror(st);
    }
}

/* What a fitted line is, all in one place for its text and its rows. */
typedef struct fit_line {
    double vh, vhe, drop, drope, z0, z0e, fixture_m, fixture_err_m, rms, mx, mx_hz;
    int fixture;
} fit_line;

/* A cell for a value that may be missing. */
static cli_cell opt_cell(double v)
{
    return isfinite(v) ? CLI_NUM(v) : CLI_NONE;
}

/* A text cell for a value that may be missing. */
static const char *opt_text(char *buf, size_t size, double v, int dec, int is_err)
{
    if (!isfinite(v)) return "?";
    return is_err ? fmt_err(buf, size, v, dec) : cli_fmt(buf, size, v, dec);
}

/* The cells every row starts with: the file and its span; the rest empty. */
static void row_start(const sweep_view *v, cli_cell cells[NCOLS])
{
    for (size_t i = 0; i < NCOLS; i++) cells[i] = CLI_NONE;
    cells[0] = CLI_TXT(v->label);
    cells[1] = CLI_TXT(v->path);
    cells[2] = CLI_NUM((double)v->n);
    cells[3] = CLI_NUM(v->start_hz / 1e6);
    cells[4] = CLI_NUM(v->stop_hz / 1e6);
    cells[5] = CLI_NUM(v->ref_ohm);
}

static void fit_text_head(FILE *o, const sweep_view *v, const sweep_req *q, const fit_line *L)
{
    char b1[64], b2[64], b3[64], b4[64];
    fprintf(o, "\n  fitted line  every point, far end %s, against %s ohm (+/-: one standard "
               "deviation)\n",
            q->on_load ? "on the load" : q->end == CXL_STUB_OPEN ? "open" : "short",
            cli_fmt(b1, sizeof b1, v->ref_ohm, 2));
    fprintf(o, "    Z0          %s +/- %s ohm\n", cli_fmt(b1, sizeof b1, L->z0, 2),
            fmt_err(b2, sizeof b2, L->z0e, 2));
    fprintf(o, "    VF trend    %s +/- %s - (%s +/- %s) / sqrt(f in Hz)\n",
            cli_fmt(b1, sizeof b1, L->vh, 5), fmt_err(b2, sizeof b2, L->vhe, 5),
            cli_fmt(b3, sizeof b3, L->drop, 2), fmt_err(b4, sizeof b4, L->drope, 2));
    if (L->fixture)
        fprintf(o, "    fixture     %s +/- %s m\n", cli_fmt(b1, sizeof b1, L->fixture_m, 3),
                fmt_err(b2, sizeof b2, L->fixture_err_m, 3));
    fprintf(o, "    residual    rms %s, largest %s at %s MHz (|Gamma| units)\n",
            cli_fmt(b1, sizeof b1, L->rms, 5), cli_fmt(b2, sizeof b2, L->mx, 5),
            cli_fmt(b3, sizeof b3, L->mx_hz / 1e6, 6));
    fprintf(o, "\n  %12s %9s %11s  %16s %9s\n", "at MHz", "VF", "+/-", "loss dB/100 m", "+/-");
}

/* The fitted VF and loss (dB per 100 m) at one frequency: a text line or
 * a table row. */
static void fit_at(cli_ctx *ctx, const sweep_view *v, const cxl_sweepfit *fit,
                   const fit_line *L, double at_hz)
{
    double vf = NAN, vfe = NAN, loss = NAN, losse = NAN;
    if (cxl_sweepfit_vf(fit, at_hz, &vf, &vfe) != CXL_OK) vf = vfe = NAN;
    if (cxl_sweepfit_loss(fit, at_hz, &loss, &losse) != CXL_OK) loss = losse = NAN;
    if (ctx->format == CLI_TEXT) {
        char b1[64], b2[64], b3[64], b4[64], b5[64];
        fprintf(ctx->out, "  %12s %9s %11s  %16s %9s\n", cli_fmt(b1, sizeof b1, at_hz / 1e6, 6),
                opt_text(b2, sizeof b2, vf, 5, 0), opt_text(b3, sizeof b3, vfe, 5, 1),
                opt_text(b4, sizeof b4, loss * 100.0, 3, 0),
                opt_text(b5, sizeof b5, losse * 100.0, 3, 1));
        return;
    }
    cli_cell cells[NCOLS];
    row_start(v, cells);
    cells[6] = CLI_TXT("fitted-line");
    cells[9] = CLI_NUM(at_hz / 1e6);
    cells[14] = opt_cell(vf);
    cells[15] = opt_cell(vfe);
    cells[16] = opt_cell(loss * 100.0);
    cells[17] = opt_cell(losse * 100.0);
    cells[18] = CLI_NUM(L->z0);
    cells[19] = CLI_NUM(L->z0e);
    if (L->fixture) {
        cells[20] = CLI_NUM(L->fixture_m);
        cells[21] = CLI_NUM(L->fixture_err_m);
    }
    cells[22] = CLI_NUM(L->rms);
    cells[23] = CLI_NUM(L->mx);
    cells[24] = CLI_NUM(L->mx_hz / 1e6);
    cli_table_row(ctx, sweep_cols, NCOLS, cells);
}

static int fitted_line(cli_ctx *ctx, const sweep_view *v, const sweep_req *q, const fit_opts *fo)
{
    cxl_sweepfit *fit = NULL;
    unsigned flags = (q->on_load ? CXL_SWEEPFIT_LOAD : 0u) |
                     (fo->fixture ? CXL_SWEEPFIT_FIXTURE : 0u);
    cxl_status st = cxl_sweepfit_new(v->s, q->length_m, q->end, fo->load_re, fo->load_im,
                                     fo->fixture_vf, flags, &fit);
    if (st != CXL_OK) {
        if (ctx->format == CLI_TEXT)
            fprintf(ctx->out, "\n  fitted line  none: %s\n", fit_failure(st));
        else
            cli_warn(ctx, "%s: no line fitted: %s", v->path, fit_failure(st));
        return CLI_EXIT_OK;
    }
    fit_line L = { .fixture = fo->fixture };
    cxl_sweepfit_line(fit, &L.vh, &L.vhe, &L.drop, &L.drope, &L.z0, &L.z0e);
    cxl_sweepfit_fixture(fit, &L.fixture_m, &L.fixture_err_m);
    cxl_sweepfit_quality(fit, &L.rms, &L.mx, &L.mx_hz, NULL, NULL);
    if (ctx->format == CLI_TEXT) fit_text_head(ctx->out, v, q, &L);
    /* without --at: mid-band */
    double mid = 0.5 * (v->start_hz + v->stop_hz);
    for (int i = 0; i < (fo->nat ? fo->nat : 1); i++)
        fit_at(ctx, v, fit, &L, fo->nat ? fo->at[i] : mid);
    if (ctx->format == CLI_TEXT)
        fprintf(ctx->out, "  (the model: a uniform line, VF falling as 1/sqrt(f), loss a sqrt(f) "
                          "+ b f; a residual\n   well above the analyzer's noise says the line "
                          "is not that)\n");
    cxl_sweepfit_free(fit);
    return CLI_EXIT_OK;
}

/* ---- the options, the sweep, its resonances ------------------------------ */

static int parse_end(const cli_ctx *ctx, const cli_args *a, sweep_req *q)
{
    const char *end_text = cli_get(a, "end", 0);
    q->end = CXL_STUB_OPEN;
    q->on_load = 0;
    if (!end_text || strcmp(end_text, "open") == 0) return 0;
    if (strcmp(end_text, "short") == 0) q->end = CXL_STUB_SHORT;
    else if (strcmp(end_text, "load") == 0) q->on_load = 1;
    else return cli_error(ctx, "end", "open, short or load", "unknown end '%s'", end_text);
    return 0;
}

/* Every option but --file, checked before the file is read. */
static int parse_request(const cli_ctx *ctx, const cli_args *a, sweep_req *q, fit_opts *fo)
{
    if (parse_end(ctx, a, q) || parse_fit_opts(ctx, a, q->on_load, fo)) return CLI_EXIT_USAGE;
    q->length_m = q->vf_guess = q->ref_ohm = 0.0;
    if (cli_count(a, "length") &&
        cli_length(ctx, "length", cli_get(a, "length", 0), CLI_POSITIVE, &q->length_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "vf-guess")) {
        if (!cli_count(a, "length"))
            return cli_error(ctx, "vf-guess", "--length 10m --vf-guess 0.66",
                             "a VF guess needs the line's --length");
        if (cli_vf(ctx, "vf-guess", cli_get(a, "vf-guess", 0), &q->vf_guess))
            return CLI_EXIT_USAGE;
    }
    if (cli_count(a, "reference") &&
        cli_bounded(ctx, "reference", cli_get(a, "reference", 0), CLI_BOUND_IMPEDANCE,
                   "a reference impedance in ohm, such as 50", &q->ref_ohm))
        return CLI_EXIT_USAGE;
    if (parse_kinds(ctx, a, &q->mask)) return CLI_EXIT_USAGE;
    if (cli_count(a, "plot-y") && !cli_count(a, "plot"))
        return cli_error(ctx, "plot-y", "--plot sweep.svg --plot-y swr", "given without --plot");
    return 0;
}

/* What the file holds, set against the options: the reference used, and
 * the refusals that need the file. */
static int view_sweep(const cli_ctx *ctx, const cli_args *a, const cxl_sweep *s,
                      const char *path, const sweep_req *q, sweep_view *v)
{
    *v = (sweep_view){ .s = s, .path = path, .label = cli_label(a), .n = cxl_sweep_count(s) };
    cxl_sweep_info(s, &v->start_hz, &v->stop_hz, &v->file_ref_ohm, &v->src, &v->has_phase);
    v->ref_ohm = q->ref_ohm == 0.0 ? v->file_ref_ohm : q->ref_ohm;
    if (!v->has_phase && v->ref_ohm != v->file_ref_ohm)
        return cli_error(ctx, "reference", "no --reference for an swr column",
                         "an swr column cannot be moved to another reference");
    if (q->on_load && q->vf_guess > 0)
        return cli_error(ctx, "vf-guess", "--end open or short with --vf-guess",
                         "resonances of a loaded line are not numbered");
    return 0;
}

static void text_head(FILE *o, const sweep_view *v, const sweep_req *q)
{
    char b1[64], b2[64], b3[64];
    fprintf(o, "sweep: %s%s%s\n", v->path, v->label[0] ? ", " : "", v->label);
    fprintf(o, "  points      %zu, %s to %s MHz", v->n, cli_fmt(b1, sizeof b1, v->start_hz / 1e6, 6),
            cli_fmt(b2, sizeof b2, v->stop_hz / 1e6, 6));
    if (v->n > 1)
        fprintf(o, " (mean step %s kHz)",
                cli_fmt(b3, sizeof b3, (v->stop_hz - v->start_hz) / (double)(v->n - 1) / 1e3, 3));
    fprintf(o, "\n  file        %s, reference %s ohm\n", source_names[v->src],
            cli_fmt(b1, sizeof b1, v->file_ref_ohm, 2));
    if (!v->has_phase)
        fprintf(o, "  note        an swr column gives the size of the mismatch only: no "
                   "reactance, no |Z|, no\n              sign, so only SWR minima are found\n");
    if (q->on_load)
        fprintf(o, "  resonances  against %s ohm, far end on a load: not numbered\n",
                cli_fmt(b1, sizeof b1, v->ref_ohm, 2));
    else
        fprintf(o, "  resonances  against %s ohm, far end %s, orders %s\n",
                cli_fmt(b1, sizeof b1, v->ref_ohm, 2), q->end == CXL_STUB_OPEN ? "open" : "short",
                q->vf_guess > 0 ? "for the VF guess" : "from the spacing of the series resonances");
    fprintf(o, "\n  %12s %11s  %-15s %-9s %5s  %-20s%s\n", "freq MHz", "+/- kHz", "kind",
            "resonance", "order", "value", q->length_m > 0 ? "     VF" : "");
}

/* One resonance as read from the sweep. */
typedef struct resonance {
    cxl_sweep_kind kind;
    int series, order;
    double f_hz, err_hz, value;
} resonance;

/* The VF a numbered resonance implies for the line's length; NAN if none. */
static double resonance_vf(const sweep_req *q, const resonance *rs)
{
    double vf = NAN;
    if (!(q->length_m > 0 && rs->order > 0)) return NAN;
    /* a parallel resonance of one end is where the other end's series one
     * would be */
    cxl_stub_end e = rs->series ? q->end
                                : (q->end == CXL_STUB_OPEN ? CXL_STUB_SHORT : CXL_STUB_OPEN);
    if (cxl_stub_vf_from_resonance(e, rs->order, q->length_m, rs->f_hz, 0.0, 0.0, &vf) != CXL_OK)
        return NAN;
    return vf;
}

static void resonance_text(FILE *o, const sweep_req *q, const resonance *rs, double vf)
{
    char b1[64], b2[64], b3[64], b4[64], val[40], ord[16];
    if (rs->kind == CXL_SWEEP_X_ZERO)
        snprintf(val, sizeof val, "R %s ohm", cli_fmt(b1, sizeof b1, rs->value, 2));
    /* a lossless line's |Z| minimum is 0: "0.00" would read as a
     * rounded number, so say what two decimals can show */
    else if (rs->kind == CXL_SWEEP_Z_MIN && rs->value < 0.005)
        snprintf(val, sizeof val, "|Z| < 0.005 ohm");
    else if (rs->kind == CXL_SWEEP_Z_MIN)
        snprintf(val, sizeof val, "|Z| %s ohm", cli_fmt(b1, sizeof b1, rs->value, 2));
    else snprintf(val, sizeof val, "SWR %s", cli_fmt(b1, sizeof b1, rs->value, 3));
    int with_vf = q->length_m > 0;
    fprintf(o, "  %12s %11s  %-15s %-9s %5s  %-20s%s%s\n",
            cli_fmt(b2, sizeof b2, rs->f_hz / 1e6, 6), cli_fmt(b3, sizeof b3, rs->err_hz / 1e3, 3),
            cli_sweep_kind_name(rs->kind), rs->series ? "series" : "parallel",
            order_text(ord, sizeof ord, rs->order), val, with_vf ? " " : "",
            with_vf ? (isfinite(vf) ? cli_fmt(b4, sizeof b4, vf, 5) : "     ?") : "");
}

static void resonance_row(cli_ctx *ctx, const sweep_view *v, const resonance *rs, double vf)
{
    cli_cell cells[NCOLS];
    row_start(v, cells);
    cells[6] = CLI_TXT(cli_sweep_kind_name(rs->kind));
    cells[7] = CLI_TXT(rs->series ? "series" : "parallel");
    cells[8] = rs->order > 0 ? CLI_NUM((double)rs->order) : CLI_NONE;
    cells[9] = CLI_NUM(rs->f_hz / 1e6);
    cells[10] = CLI_NUM(rs->err_hz / 1e3);
    /* the value goes in the column of its kind: r_ohm, z_ohm or swr */
    cells[11 + rs->kind] = CLI_NUM(rs->value);
    cells[14] = opt_cell(vf);
    cli_table_row(ctx, sweep_cols, NCOLS, cells);
}

/* The resonances of the kinds asked for, as text lines or table rows. */
static void resonances(cli_ctx *ctx, const sweep_view *v, const sweep_req *q,
                       const cxl_sweep_res *r)
{
    size_t shown = 0;
    for (size_t i = 0; i < cxl_sweep_res_count(r); i++) {
        resonance rs;
        cxl_sweep_res_get(r, i, &rs.kind, &rs.series, &rs.order, &rs.f_hz, &rs.err_hz, &rs.value);
        if (!((q->mask >> rs.kind) & 1u)) continue;
        if (q->on_load) rs.order = 0;
        shown++;
        double vf = resonance_vf(q, &rs);
        if (ctx->format == CLI_TEXT) resonance_text(ctx->out, q, &rs, vf);
        else resonance_row(ctx, v, &rs, vf);
    }
    if (ctx->format == CLI_TEXT) {
        if (!shown) fprintf(ctx->out, "  (none found)\n");
        fprintf(ctx->out, "  (+/-: half the point spacing; an order of ? needs --length and "
                          "--vf-guess, or two series resonances)\n");
    }
}

static int sweep_run(cli_ctx *ctx, const cli_args *a)
{
    sweep_req q;
    fit_opts fo;
    if (parse_request(ctx, a, &q, &fo)) return CLI_EXIT_USAGE;
    cxl_sweep *s = NULL;
    const char *path;
    if (cli_sweep_load(ctx, a, &s, &path)) return CLI_EXIT_USAGE;
    sweep_view v;
    cxl_sweep_res *r = NULL;
    int code = view_sweep(ctx, a, s, path, &q, &v);
    if (code == CLI_EXIT_OK) {
        cxl_status st = cxl_sweep_resonances(s, v.ref_ohm, q.end,
                                             q.vf_guess > 0 ? q.length_m : 0.0, q.vf_guess, &r);
        if (st != CXL_OK) code = cli_error(ctx, "file", NULL, "%s: %s", path, cxl_strerror(st));
    }
    if (code == CLI_EXIT_OK && cli_count(a, "plot")) code = plot(ctx, a, &v, r, q.mask);
    if (code == CLI_EXIT_OK) {
        if (ctx->format == CLI_TEXT && ctx->rows_out++) putc('\n', ctx->out);
        if (ctx->format == CLI_TEXT) text_head(ctx->out, &v, &q);
        resonances(ctx, &v, &q, r);
        if (q.length_m > 0) code = fitted_line(ctx, &v, &q, &fo);
    }
    cxl_sweep_res_free(r);
    cxl_sweep_free(s);
    return code;
}

const cli_command cli_cmd_sweep = {
    .name = "sweep",
    .summary = "an analyzer's one-port sweep file: what it holds, its resonances",
    .synopsis = "FILE [--end open|short|load [--load R+jX]] [--length L [--vf-guess X] [--at F]] "
                "[--plot F.svg] [OPTIONS]",
    .opts = sweep_opts,
    .run = sweep_run,
    .batch = 1,
    .positional = "file",
};
