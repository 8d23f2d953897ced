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

/* The plot: |Z| in ohm or SWR against frequency, the phase of Z (or of
 * Gamma) on the right axis, and a marker line at each resonance shown. */
static int plot(const cli_ctx *ctx, const cli_args *a, const cxl_sweep *s, double ref,
                const cxl_sweep_res *r, unsigned mask, int has_phase)
{
    const char *what = cli_get(a, "plot-y", 0);
    int swr = !has_phase;
    if (what) {
        if (strcmp(what, "swr") == 0) swr = 1;
        else if (strcmp(what, "impedance") == 0) {
            if (!has_phase)
                return cli_error(ctx, "plot-y", "swr for a file with only an swr column",
                                 "the file holds no impedance");
            swr = 0;
        } else return cli_error(ctx, "plot-y", "impedance or swr", "unknown value '%s'", what);
    }
    size_t n = cxl_sweep_count(s), nr = cxl_sweep_res_count(r);
    double *x = malloc(3 * n * sizeof *x);
    cli_svg_span *marks = malloc((nr + 1) * sizeof *marks);
    char (*names)[24] = malloc((nr + 1) * sizeof *names);
    if (!x || !marks || !names) {
        free(x);
        free(marks);
        free(names);
        return cli_error(ctx, "plot", NULL, "out of memory");
    }
    double *y = x + n, *ph = x + 2 * n;
    for (size_t i = 0; i < n; i++) {
        double f, g, gr = 0.0, gi = 0.0, zr = NAN, zi = NAN;
        y[i] = ph[i] = NAN;
        if (cxl_sweep_magnitude(s, i, ref, &f, &g) != CXL_OK) continue;
        x[i] = f / 1e6;
        if (has_phase) {
            if (cxl_sweep_point(s, i, ref, NULL, &gr, &gi, &zr, &zi) != CXL_OK) zr = zi = NAN;
        }
        if (swr) {
            y[i] = g < 1.0 ? (1.0 + g) / (1.0 - g) : NAN;
            if (has_phase) ph[i] = atan2(gi, gr) * 180.0 / M_PI;
        } else {
            y[i] = hypot(zr, zi);
            ph[i] = atan2(zi, zr) * 180.0 / M_PI;
        }
    }
    size_t nm = 0;
    for (size_t i = 0; i < nr; i++) {
        cxl_sweep_kind kind;
        int series, order;
        double f;
        if (cxl_sweep_res_get(r, i, &kind, &series, &order, &f, NULL, NULL) != CXL_OK) continue;
        if (!((mask >> kind) & 1u) || !series) continue;
        if (order > 0) snprintf(names[nm], sizeof names[nm], "%d", order);
        else snprintf(names[nm], sizeof names[nm], "?");
        marks[nm] = (cli_svg_span){ f / 1e6, f / 1e6, names[nm] };
        nm++;
    }
    cli_svg_curve main_curve = { swr ? "SWR" : "|Z| (ohm)", x, y, n, 0, 0 };
    cli_svg_curve phase_curve = { "phase", x, ph, n, 1, 0 };
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
        .curves2 = &phase_curve, .ncurves2 = has_phase ? 1 : 0,
    };
    int rc = cli_svg_save(ctx, "plot", cli_get(a, "plot", 0), NULL, &p);
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

static int parse_fit_opts(const cli_ctx *ctx, const cli_args *a, int on_load, fit_opts *fo)
{
    memset(fo, 0, sizeof *fo);
    int has_length = cli_count(a, "length") > 0;
    const char *load = cli_get(a, "load", 0);
    if (on_load && !load)
        return cli_error(ctx, "load", "--end load --load 12-j30", "--end load needs the load");
    if (load && !on_load)
        return cli_error(ctx, "load", "--end load --load 12-j30", "given without --end load");
    if (load && cli_load_impedance(ctx, load, &fo->load_re, &fo->load_im)) return CLI_EXIT_USAGE;
    if (on_load && !has_length)
        return cli_error(ctx, "length", "--end load --load 12-j30 --length 9m",
                         "--end load is for the fitted line, which needs the line's --length");
    if (cli_count(a, "fixture-vf")) {
        if (!has_length)
            return cli_error(ctx, "fixture-vf", "--length 10m --fixture-vf 0.7",
                             "a fixture is fitted with the line, which needs --length");
        if (cli_vf(ctx, "fixture-vf", cli_get(a, "fixture-vf", 0), &fo->fixture_vf))
            return CLI_EXIT_USAGE;
        fo->fixture = 1;
    }
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

static int fitted_line(cli_ctx *ctx, const cxl_sweep *s, const char *path, const char *label,
                       double length, cxl_stub_end end, int on_load, const fit_opts *fo,
                       double start, double stop, double ref)
{
    cxl_sweepfit *fit = NULL;
    unsigned flags = (on_load ? CXL_SWEEPFIT_LOAD : 0u) | (fo->fixture ? CXL_SWEEPFIT_FIXTURE : 0u);
    cxl_status st = cxl_sweepfit_new(s, length, end, fo->load_re, fo->load_im, fo->fixture_vf,
                                     flags, &fit);
    FILE *o = ctx->out;
    if (st != CXL_OK) {
        if (ctx->format == CLI_TEXT)
            fprintf(o, "\n  fitted line  none: %s\n", fit_failure(st));
        else
            cli_warn(ctx, "%s: no line fitted: %s", path, fit_failure(st));
        return CLI_EXIT_OK;
    }
    double vh, vhe, drop, drope, z0, z0e, fl, fle, rms, mx, mxf;
    cxl_sweepfit_line(fit, &vh, &vhe, &drop, &drope, &z0, &z0e);
    cxl_sweepfit_fixture(fit, &fl, &fle);
    cxl_sweepfit_quality(fit, &rms, &mx, &mxf, NULL, NULL);
    double mid = 0.5 * (start + stop);
    const double *at = fo->nat ? fo->at : &mid;
    int nat = fo->nat ? fo->nat : 1;
    char b1[64], b2[64], b3[64], b4[64], b5[64];
    if (ctx->format == CLI_TEXT) {
        fprintf(o, "\n  fitted line  every point, far end %s, against %s ohm (+/-: one standard "
                   "deviation)\n", on_load ? "on the load" : end == CXL_STUB_OPEN ? "open" : "short",
                cli_fmt(b1, sizeof b1, ref, 2));
        fprintf(o, "    Z0          %s +/- %s ohm\n", cli_fmt(b1, sizeof b1, z0, 2),
                fmt_err(b2, sizeof b2, z0e, 2));
        fprintf(o, "    VF trend    %s +/- %s - (%s +/- %s) / sqrt(f in Hz)\n",
                cli_fmt(b1, sizeof b1, vh, 5), fmt_err(b2, sizeof b2, vhe, 5),
                cli_fmt(b3, sizeof b3, drop, 2), fmt_err(b4, sizeof b4, drope, 2));
        if (fo->fixture)
            fprintf(o, "    fixture     %s +/- %s m\n", cli_fmt(b1, sizeof b1, fl, 3),
                    fmt_err(b2, sizeof b2, fle, 3));
        fprintf(o, "    residual    rms %s, largest %s at %s MHz (|Gamma| units)\n",
                cli_fmt(b1, sizeof b1, rms, 5), cli_fmt(b2, sizeof b2, mx, 5),
                cli_fmt(b3, sizeof b3, mxf / 1e6, 6));
        fprintf(o, "\n  %12s %9s %11s  %16s %9s\n", "at MHz", "VF", "+/-", "loss dB/100 m", "+/-");
    }
    for (int i = 0; i < nat; i++) {
        double vf = NAN, vfe = NAN, loss = NAN, losse = NAN;
        if (cxl_sweepfit_vf(fit, at[i], &vf, &vfe) != CXL_OK) vf = vfe = NAN;
        if (cxl_sweepfit_loss(fit, at[i], &loss, &losse) != CXL_OK) loss = losse = NAN;
        if (ctx->format == CLI_TEXT) {
            fprintf(o, "  %12s %9s %11s  %16s %9s\n", cli_fmt(b1, sizeof b1, at[i] / 1e6, 6),
                    isfinite(vf) ? cli_fmt(b2, sizeof b2, vf, 5) : "?",
                    isfinite(vfe) ? fmt_err(b3, sizeof b3, vfe, 5) : "?",
                    isfinite(loss) ? cli_fmt(b4, sizeof b4, loss * 100.0, 3) : "?",
                    isfinite(losse) ? fmt_err(b5, sizeof b5, losse * 100.0, 3) : "?");
            continue;
        }
        size_t n = cxl_sweep_count(s);
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(path), CLI_NUM((double)n), CLI_NUM(start / 1e6),
            CLI_NUM(stop / 1e6), CLI_NUM(ref), CLI_TXT("fitted-line"), CLI_NONE, CLI_NONE,
            CLI_NUM(at[i] / 1e6), CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
            isfinite(vf) ? CLI_NUM(vf) : CLI_NONE, isfinite(vfe) ? CLI_NUM(vfe) : CLI_NONE,
            isfinite(loss) ? CLI_NUM(loss * 100.0) : CLI_NONE,
            isfinite(losse) ? CLI_NUM(losse * 100.0) : CLI_NONE,
            CLI_NUM(z0), CLI_NUM(z0e), fo->fixture ? CLI_NUM(fl) : CLI_NONE,
            fo->fixture ? CLI_NUM(fle) : CLI_NONE, CLI_NUM(rms), CLI_NUM(mx), CLI_NUM(mxf / 1e6),
        };
        cli_table_row(ctx, sweep_cols, NCOLS, cells);
    }
    if (ctx->format == CLI_TEXT)
        fprintf(o, "  (the model: a uniform line, VF falling as 1/sqrt(f), loss a sqrt(f) + b f; "
                   "a residual\n   well above the analyzer's noise says the line is not that)\n");
    cxl_sweepfit_free(fit);
    return CLI_EXIT_OK;
}

static int sweep_run(cli_ctx *ctx, const cli_args *a)
{
    cxl_stub_end end = CXL_STUB_OPEN;
    int on_load = 0;
    const char *end_text = cli_get(a, "end", 0);
    if (end_text) {
        if (strcmp(end_text, "open") == 0) end = CXL_STUB_OPEN;
        else if (strcmp(end_text, "short") == 0) end = CXL_STUB_SHORT;
        else if (strcmp(end_text, "load") == 0) on_load = 1;
        else return cli_error(ctx, "end", "open, short or load", "unknown end '%s'", end_text);
    }
    fit_opts fo;
    if (parse_fit_opts(ctx, a, on_load, &fo)) return CLI_EXIT_USAGE;
    double length = 0.0, vf_guess = 0.0, ref = 0.0;
    if (cli_count(a, "length") &&
        cli_length(ctx, "length", cli_get(a, "length", 0), CLI_POSITIVE, &length))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "vf-guess")) {
        if (!cli_count(a, "length"))
            return cli_error(ctx, "vf-guess", "--length 10m --vf-guess 0.66",
                             "a VF guess needs the line's --length");
        if (cli_vf(ctx, "vf-guess", cli_get(a, "vf-guess", 0), &vf_guess)) return CLI_EXIT_USAGE;
    }
    if (cli_count(a, "reference") &&
        cli_bounded(ctx, "reference", cli_get(a, "reference", 0), CLI_BOUND_IMPEDANCE,
                   "a reference impedance in ohm, such as 50", &ref))
        return CLI_EXIT_USAGE;
    unsigned mask;
    if (parse_kinds(ctx, a, &mask)) return CLI_EXIT_USAGE;
    if (cli_count(a, "plot-y") && !cli_count(a, "plot"))
        return cli_error(ctx, "plot-y", "--plot sweep.svg --plot-y swr", "given without --plot");

    cxl_sweep *s = NULL;
    const char *path;
    if (cli_sweep_load(ctx, a, &s, &path)) return CLI_EXIT_USAGE;
    double start, stop, file_ref;
    cxl_sweep_source src;
    int has_phase;
    cxl_sweep_info(s, &start, &stop, &file_ref, &src, &has_phase);
    if (ref == 0.0) ref = file_ref;
    if (!has_phase && ref != file_ref) {
        cxl_sweep_free(s);
        return cli_error(ctx, "reference", "no --reference for an swr column",
                         "an swr column cannot be moved to another reference");
    }
    if (on_load && vf_guess > 0) {
        cxl_sweep_free(s);
        return cli_error(ctx, "vf-guess", "--end open or short with --vf-guess",
                         "resonances of a loaded line are not numbered");
    }
    cxl_sweep_res *r = NULL;
    cxl_status st = cxl_sweep_resonances(s, ref, end, vf_guess > 0 ? length : 0.0, vf_guess, &r);
    if (st != CXL_OK) {
        cxl_sweep_free(s);
        return cli_error(ctx, "file", NULL, "%s: %s", path, cxl_strerror(st));
    }
    int code = CLI_EXIT_OK;
    if (cli_count(a, "plot")) code = plot(ctx, a, s, ref, r, mask, has_phase);
    if (code != CLI_EXIT_OK) goto done;

    size_t n = cxl_sweep_count(s), nr = cxl_sweep_res_count(r);
    const char *label = cli_label(a);
    FILE *o = ctx->out;
    char b1[64], b2[64], b3[64], b4[64];
    if (ctx->format == CLI_TEXT) {
        if (ctx->rows_out++) putc('\n', o);
        fprintf(o, "sweep: %s%s%s\n", path, label[0] ? ", " : "", label);
        fprintf(o, "  points      %zu, %s to %s MHz", n, cli_fmt(b1, sizeof b1, start / 1e6, 6),
                cli_fmt(b2, sizeof b2, stop / 1e6, 6));
        if (n > 1)
            fprintf(o, " (mean step %s kHz)",
                    cli_fmt(b3, sizeof b3, (stop - start) / (double)(n - 1) / 1e3, 3));
        fprintf(o, "\n  file        %s, reference %s ohm\n", source_names[src],
                cli_fmt(b1, sizeof b1, file_ref, 2));
        if (!has_phase)
            fprintf(o, "  note        an swr column gives the size of the mismatch only: no "
                       "reactance, no |Z|, no\n              sign, so only SWR minima are found\n");
        if (on_load)
            fprintf(o, "  resonances  against %s ohm, far end on a load: not numbered\n",
                    cli_fmt(b1, sizeof b1, ref, 2));
        else
            fprintf(o, "  resonances  against %s ohm, far end %s, orders %s\n",
                    cli_fmt(b1, sizeof b1, ref, 2), end == CXL_STUB_OPEN ? "open" : "short",
                    vf_guess > 0 ? "for the VF guess" : "from the spacing of the series resonances");
        fprintf(o, "\n  %12s %11s  %-15s %-9s %5s  %-20s%s\n", "freq MHz", "+/- kHz", "kind",
                "resonance", "order", "value", length > 0 ? "     VF" : "");
    }
    size_t shown = 0;
    for (size_t i = 0; i < nr; i++) {
        cxl_sweep_kind kind;
        int series, order;
        double f, err, value;
        cxl_sweep_res_get(r, i, &kind, &series, &order, &f, &err, &value);
        if (!((mask >> kind) & 1u)) continue;
        if (on_load) order = 0;
        shown++;
        double vf = NAN;
        if (length > 0 && order > 0) {
            /* a parallel resonance of one end is where the other end's
             * series one would be */
            cxl_stub_end e = series ? end : (end == CXL_STUB_OPEN ? CXL_STUB_SHORT : CXL_STUB_OPEN);
            if (cxl_stub_vf_from_resonance(e, order, length, f, 0.0, 0.0, &vf) != CXL_OK) vf = NAN;
        }
        if (ctx->format != CLI_TEXT) {
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(path), CLI_NUM((double)n), CLI_NUM(start / 1e6),
                CLI_NUM(stop / 1e6), CLI_NUM(ref), CLI_TXT(cli_sweep_kind_name(kind)),
                CLI_TXT(series ? "series" : "parallel"),
                order > 0 ? CLI_NUM((double)order) : CLI_NONE, CLI_NUM(f / 1e6),
                CLI_NUM(err / 1e3),
                kind == CXL_SWEEP_X_ZERO ? CLI_NUM(value) : CLI_NONE,
                kind == CXL_SWEEP_Z_MIN ? CLI_NUM(value) : CLI_NONE,
                kind == CXL_SWEEP_SWR_MIN ? CLI_NUM(value) : CLI_NONE,
                isfinite(vf) ? CLI_NUM(vf) : CLI_NONE,
                CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
                CLI_NONE, CLI_NONE,
            };
            cli_table_row(ctx, sweep_cols, NCOLS, cells);
            continue;
        }
        char val[40], ord[16];
        if (kind == CXL_SWEEP_X_ZERO) snprintf(val, sizeof val, "R %s ohm", cli_fmt(b1, sizeof b1, value, 2));
        /* a lossless line's |Z| minimum is 0: "0.00" would read as a
         * rounded number, so say what two decimals can show */
        else if (kind == CXL_SWEEP_Z_MIN && value < 0.005) snprintf(val, sizeof val, "|Z| < 0.005 ohm");
        else if (kind == CXL_SWEEP_Z_MIN) snprintf(val, sizeof val, "|Z| %s ohm", cli_fmt(b1, sizeof b1, value, 2));
        else snprintf(val, sizeof val, "SWR %s", cli_fmt(b1, sizeof b1, value, 3));
        if (order > 0) snprintf(ord, sizeof ord, "%d", order);
        else snprintf(ord, sizeof ord, "?");
        fprintf(o, "  %12s %11s  %-15s %-9s %5s  %-20s%s%s\n", cli_fmt(b2, sizeof b2, f / 1e6, 6),
                cli_fmt(b3, sizeof b3, err / 1e3, 3), cli_sweep_kind_name(kind),
                series ? "series" : "parallel", ord, val, length > 0 ? " " : "",
                length > 0 ? (isfinite(vf) ? cli_fmt(b4, sizeof b4, vf, 5) : "     ?") : "");
    }
    if (ctx->format == CLI_TEXT) {
        if (!shown) fprintf(o, "  (none found)\n");
        fprintf(o, "  (+/-: half the point spacing; an order of ? needs --length and --vf-guess, "
                   "or two series resonances)\n");
    }
    if (length > 0)
        code = fitted_line(ctx, s, path, label, length, end, on_load, &fo, start, stop, ref);
done:
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
