/* errplot.c - phase error against frequency as an x-y SVG plot for phase
 * and pair: every chosen band sampled densely (the error is not a straight
 * line into a mismatched load), bands shaded, --freq points as markers and
 * the tolerance drawn either side of zero; and the front-to-back ratio
 * against frequency that pattern and array draw for --sweep-plot. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

int cli_errplot_save(cli_ctx *ctx, const char *field, const char *path,
                     const cli_freq_point *pts, int n, cli_err_fn fn, void *user,
                     const cli_errplot *plot)
{
    /* per band: the samples and a break; per --freq point: one and a break */
    size_t cap = (size_t)n * (CLI_ERRPLOT_SAMPLES + 2) + 2;
    double *buf = malloc(6 * cap * sizeof *buf);
    if (!buf) return cli_error(ctx, field, NULL, "out of memory");
    double *bx = buf, *by = buf + cap, *b2 = buf + 2 * cap;
    double *fx = buf + 3 * cap, *fy = buf + 4 * cap, *f2 = buf + 5 * cap;
    size_t nb = 0, nf = 0, nspans = 0;
    cli_svg_span spans[CLI_MAX_ITEMS];
    int code = 0;
    for (int i = 0; i < n && !code; i++) {
        if (!pts[i].band[0]) {
            fx[nf] = pts[i].freq_hz / 1e6;
            code = fn(ctx, user, pts[i].freq_hz, &fy[nf], &f2[nf]);
            nf++;
            fx[nf] = fy[nf] = f2[nf] = NAN;   /* a marker, not a line */
            nf++;
            continue;
        }
        /* a band: low, centre and high edge in a row */
        if (strcmp(pts[i].edge, "low") != 0 || i + 2 >= n || nspans == CLI_MAX_ITEMS) continue;
        double lo = pts[i].freq_hz, hi = pts[i + 2].freq_hz;
        spans[nspans++] = (cli_svg_span){ lo / 1e6, hi / 1e6, pts[i].band };
        for (int k = 0; k < CLI_ERRPLOT_SAMPLES && !code; k++, nb++) {
            double f = lo + (hi - lo) * k / (CLI_ERRPLOT_SAMPLES - 1);
            bx[nb] = f / 1e6;
            code = fn(ctx, user, f, &by[nb], &b2[nb]);
        }
        bx[nb] = by[nb] = b2[nb] = NAN;       /* no line across to the next band */
        nb++;
    }
    if (code) {
        free(buf);
        return code;
    }
    cli_svg_curve curves[4];
    size_t nc = 0;
    if (nb) curves[nc++] = (cli_svg_curve){ plot->name, bx, by, nb, 0, 0 };
    if (nb && plot->second) curves[nc++] = (cli_svg_curve){ plot->second, bx, b2, nb, 1, 0 };
    if (nf) curves[nc++] = (cli_svg_curve){ "at --freq", fx, fy, nf, 0, 1 };
    char plus[64], minus[64], t[48];
    cli_svg_hline lines[2];
    if (plot->has_tolerance) {
        snprintf(plus, sizeof plus, "+%s deg tolerance", cli_fmt(t, sizeof t, plot->tolerance_deg, 3));
        snprintf(minus, sizeof minus, "-%s deg", t);
        lines[0] = (cli_svg_hline){ plot->tolerance_deg, plus };
        lines[1] = (cli_svg_hline){ -plot->tolerance_deg, minus };
    }
    cli_svg_xy xy = {
        .title = plot->title,
        .note = { plot->note[0], plot->note[1], plot->note[2] },
        .x_label = "frequency (MHz)",
        .y_label = "phase error (deg)",
        .curves = curves,
        .ncurves = nc,
        .spans = spans,
        .nspans = nspans,
        .hlines = lines,
        .nhlines = plot->has_tolerance ? 2 : 0,
    };
    code = cli_svg_save(ctx, field, path, NULL, &xy);
    free(buf);
    return code;
}

/* Front-to-back against frequency for pattern and array: CLI_FB_SWEEP_POINTS
 * per band, clamped to +-CLI_FB_SWEEP_CEILING_DB, a break between bands. */
int cli_fb_sweep_save(cli_ctx *ctx, const cli_args *a, const cli_freq_point *pts, int n,
                      const cli_fb_sweep *plot, cli_fb_fn fn, void *user)
{
    static _Thread_local double mhz[CLI_MAX_ITEMS * (CLI_FB_SWEEP_POINTS + 1)];
    static _Thread_local double fb[2][CLI_MAX_ITEMS * (CLI_FB_SWEEP_POINTS + 1)];
    cli_svg_span spans[CLI_MAX_ITEMS];
    size_t m = 0, nspans = 0;
    char title[200], b1[32];
    for (int i = 0; i + 2 < n; i++) {
        if (!pts[i].band[0] || strcmp(pts[i].edge, "low") != 0) continue;
        double lo = pts[i].freq_hz, hi = pts[i + 2].freq_hz;
        spans[nspans++] = (cli_svg_span){ lo / 1e6, hi / 1e6, pts[i].band };
        for (int k = 0; k < CLI_FB_SWEEP_POINTS; k++, m++) {
            double f = lo + (hi - lo) * k / (CLI_FB_SWEEP_POINTS - 1);
            mhz[m] = f / 1e6;
            for (int c = 0; c < plot->ncurves; c++) {
                if (fn(ctx, user, c, f, &fb[c][m])) return CLI_EXIT_USAGE;
                fb[c][m] = fmax(fmin(fb[c][m], CLI_FB_SWEEP_CEILING_DB), -CLI_FB_SWEEP_CEILING_DB);
            }
        }
        mhz[m] = NAN;   /* no line across the gap to the next band */
        fb[0][m] = fb[1][m] = NAN;
        m++;
    }
    if (nspans == 0)
        return cli_error(ctx, "sweep-plot", "--sweep-plot FILE with --band 160m,80m",
                         "a sweep needs at least one --band");
    cli_svg_curve curves[2] = { { plot->names[0], mhz, fb[0], m, 0, 0 },
                                { plot->names[1], mhz, fb[1], m, 1, 0 } };
    const char *label = cli_label(a);
    snprintf(title, sizeof title, "%s%sFront-to-back ratio across the bands, elevation %s deg", label,
             label[0] ? ": " : "", cli_fmt(b1, sizeof b1, plot->elevation_deg, 1));
    cli_svg_xy xy = {
        .title = title,
        .note = { plot->note[0], plot->note[1], plot->note[2] },
        .x_label = "frequency (MHz)",
        .y_label = "front-to-back ratio (dB)",
        .curves = curves,
        .ncurves = (size_t)plot->ncurves,
        .spans = spans,
        .nspans = nspans,
    };
    return cli_svg_save(ctx, "sweep-plot", cli_get(a, "sweep-plot", 0), NULL, &xy);
}
