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

/* One sampled curve and its second value (plot->second), NAN rows as
 * breaks. */
typedef struct err_series {
    double *x_mhz, *y, *y2;
    size_t n;
} err_series;

/* What the plot draws: the bands sampled densely, the --freq points as
 * markers, and the bands' shading. */
typedef struct errplot_data {
    err_series band, mark;
    cli_svg_span spans[CLI_MAX_ITEMS];
    size_t nspans;
} errplot_data;

/* A row of NANs: no line across it. */
static void series_break(err_series *s)
{
    s->x_mhz[s->n] = s->y[s->n] = s->y2[s->n] = NAN;
    s->n++;
}

/* CLI_ERRPLOT_SAMPLES from lo_hz to hi_hz, then a break. */
static int sample_band(cli_ctx *ctx, cli_err_fn fn, void *user, double lo_hz, double hi_hz,
                       err_series *s)
{
    int code = 0;
    for (int k = 0; k < CLI_ERRPLOT_SAMPLES && !code; k++, s->n++) {
        double f = lo_hz + (hi_hz - lo_hz) * k / (CLI_ERRPLOT_SAMPLES - 1);
        s->x_mhz[s->n] = f / 1e6;
        code = fn(ctx, user, f, &s->y[s->n], &s->y2[s->n]);
    }
    series_break(s);
    return code;
}

/* Every band (its low, centre and high edge in a row) and --freq point. */
static int sample(cli_ctx *ctx, const cli_freq_point *pts, int n, cli_err_fn fn, void *user,
                  errplot_data *d)
{
    int code = 0;
    for (int i = 0; i < n && !code; i++) {
        if (!pts[i].band[0]) {
            err_series *m = &d->mark;
            m->x_mhz[m->n] = pts[i].freq_hz / 1e6;
            code = fn(ctx, user, pts[i].freq_hz, &m->y[m->n], &m->y2[m->n]);
            m->n++;
            series_break(m);   /* a marker, not a line */
            continue;
        }
        if (strcmp(pts[i].edge, "low") != 0 || i + 2 >= n || d->nspans == CLI_MAX_ITEMS) continue;
        double lo = pts[i].freq_hz, hi = pts[i + 2].freq_hz;
        d->spans[d->nspans++] = (cli_svg_span){ lo / 1e6, hi / 1e6, pts[i].band };
        code = sample_band(ctx, fn, user, lo, hi, &d->band);
    }
    return code;
}

/* The sampled curves, the tolerance either side of zero, into the SVG. */
static int draw(cli_ctx *ctx, const char *field, const char *path, const cli_errplot *plot,
                const errplot_data *d)
{
    const err_series *b = &d->band, *m = &d->mark;
    cli_svg_curve curves[4];
    size_t nc = 0;
    if (b->n) curves[nc++] = (cli_svg_curve){ plot->name, b->x_mhz, b->y, b->n, 0, 0 };
    if (b->n && plot->second)
        curves[nc++] = (cli_svg_curve){ plot->second, b->x_mhz, b->y2, b->n, 1, 0 };
    if (m->n) curves[nc++] = (cli_svg_curve){ "at --freq", m->x_mhz, m->y, m->n, 0, 1 };
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
        .spans = d->spans,
        .nspans = d->nspans,
        .hlines = lines,
        .nhlines = plot->has_tolerance ? 2 : 0,
    };
    return cli_svg_save(ctx, field, path, NULL, &xy);
}

int cli_errplot_save(cli_ctx *ctx, const char *field, const char *path,
                     const cli_freq_point *pts, int n, cli_err_fn fn, void *user,
                     const cli_errplot *plot)
{
    /* per band: the samples and a break; per --freq point: one and a break */
    size_t cap = (size_t)n * (CLI_ERRPLOT_SAMPLES + 2) + 2;
    double *buf = malloc(6 * cap * sizeof *buf);
    if (!buf) return cli_error(ctx, field, NULL, "out of memory");
    errplot_data d = {
        .band = { buf, buf + cap, buf + 2 * cap, 0 },
        .mark = { buf + 3 * cap, buf + 4 * cap, buf + 5 * cap, 0 },
    };
    int code = sample(ctx, pts, n, fn, user, &d);
    if (!code) code = draw(ctx, field, path, plot, &d);
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
