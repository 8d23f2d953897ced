/* cmd_fault.c - coaxline fault: reflection against distance along a line
 * from an analyzer's one-port sweep (distance to fault): the peaks, the
 * whole profile with --profile, and a plot. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

#define M_PER_FT 0.3048

static const cli_optdef fault_opts[] = {
    { "file", "FILE", "one-port sweep with phase: Touchstone (.s1p, .ts) or CSV (also the bare argument)", 0 },
    { "vf", "X", "velocity factor of the line", 0 },
    { "cable", "NAME", "the line's cable from the catalog (its VF, and its loss for --compensate)", 0 },
    { "reference", "OHM", "reference impedance for Gamma (default: the file's)", 0 },
    { "window", "none|hann|kaiser", "window over the band (default hann)", 0 },
    { "beta", "B", "Kaiser window's beta, 0 to 50 (default 6)", 0 },
    { "loss", "DB", "matched loss of the line in dB per 100 m at mid-band, compensated", 0 },
    { "compensate", NULL, "with --cable: compensate the catalog cable's loss at mid-band", 0 },
    { "bandpass", NULL, "band-pass even when the sweep starts near DC on a harmonic grid", 0 },
    { "profile", NULL, "after the peaks, every point of the profile", 0 },
    { "plot", "FILE.svg", "draw the reflection against distance with the peaks marked", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col fault_cols[] = {
    { "label", -1 }, { "file", -1 }, { "mode", -1 }, { "vf", 5 }, { "resolution_m", 4 },
    { "range_m", 3 }, { "row", -1 }, { "distance_m", 4 }, { "distance_ft", 4 },
    { "reflection", 6 }, { "return_loss_db", 2 }, { "change", -1 }, { "step", 6 },
};
#define NCOLS (sizeof fault_cols / sizeof fault_cols[0])

static const char *change_name(int change)
{
    return change > 0 ? "higher" : change < 0 ? "lower" : NULL;
}

static int plot(const cli_ctx *ctx, const cli_args *a, const cxl_fault *f)
{
    size_t n = cxl_fault_count(f), np = cxl_fault_peak_count(f);
    double *x = malloc(2 * n * sizeof *x);
    cli_svg_span *marks = malloc((np + 1) * sizeof *marks);
    char (*names)[32] = malloc((np + 1) * sizeof *names);
    if (!x || !marks || !names) {
        free(x);
        free(marks);
        free(names);
        return cli_error(ctx, "plot", NULL, "out of memory");
    }
    double *y = x + n, scale = ctx->units == CXL_UNITS_IMPERIAL ? 1.0 / M_PER_FT : 1.0;
    for (size_t i = 0; i < n; i++) {
        cxl_fault_point(f, i, &x[i], &y[i], NULL, NULL);
        x[i] *= scale;
    }
    char b[32];
    for (size_t i = 0; i < np; i++) {
        double d;
        cxl_fault_peak(f, i, &d, NULL, NULL, NULL);
        snprintf(names[i], sizeof names[i], "%s", cli_fmt(b, sizeof b, d * scale, 2));
        marks[i] = (cli_svg_span){ d * scale, d * scale, names[i] };
    }
    cli_svg_curve c = { "reflection", x, y, n, 0, 0 };
    cli_svg_xy p = {
        .title = "reflection against distance",
        .note = { "grey lines: peaks, labelled with their distance", NULL, NULL },
        .x_label = scale == 1.0 ? "distance (m)" : "distance (ft)",
        .y_label = "reflection (|Gamma|)",
        .curves = &c, .ncurves = 1,
        .spans = marks, .nspans = np,
    };
    int rc = cli_svg_save(ctx, "plot", cli_get(a, "plot", 0), NULL, &p);
    free(x);
    free(marks);
    free(names);
    return rc;
}

/* What the options ask of the transform. */
typedef struct {
    double vf, ref, beta, loss_100m;
    const char *cable;
    cxl_fault_window window;
} fault_setup;

/* What the output rows and the text share: the setup, the sweep and the
 * transform's grid. */
typedef struct {
    const fault_setup *set;
    const char *path, *label, *mode;
    int lowpass;
    double start, stop, res, range, step;
} fault_view;

/* --window and --beta: only the Kaiser window takes a beta. */
static int parse_window(cli_ctx *ctx, const cli_args *a, fault_setup *set)
{
    const char *w = cli_get(a, "window", 0);
    if (w) {
        if (strcmp(w, "none") == 0) set->window = CXL_FAULT_RECT;
        else if (strcmp(w, "hann") == 0) set->window = CXL_FAULT_HANN;
        else if (strcmp(w, "kaiser") == 0) set->window = CXL_FAULT_KAISER;
        else return cli_error(ctx, "window", "none, hann or kaiser", "unknown window '%s'", w);
    }
    if (!cli_count(a, "beta")) return CLI_EXIT_OK;
    if (set->window != CXL_FAULT_KAISER)
        return cli_error(ctx, "beta", "--window kaiser --beta 6", "only the Kaiser window has a beta");
    if (cli_number(ctx, "beta", cli_get(a, "beta", 0), 0.0, CXL_FAULT_MAX_BETA,
                   "a Kaiser beta from 0 to 50, such as 6", &set->beta))
        return CLI_EXIT_USAGE;
    return CLI_EXIT_OK;
}

/* --loss and --compensate: one source of the loss, not both. */
static int parse_loss(cli_ctx *ctx, const cli_args *a, fault_setup *set)
{
    if (cli_count(a, "loss") && cli_flag(a, "compensate"))
        return cli_error(ctx, "loss", "--loss 5 or --cable NAME --compensate, not both",
                         "both --loss and --compensate are given");
    if (cli_count(a, "loss") &&
        cli_number(ctx, "loss", cli_get(a, "loss", 0), 0.0, 1e4,
                   "a matched loss in dB per 100 m, such as 4.5", &set->loss_100m))
        return CLI_EXIT_USAGE;
    if (cli_flag(a, "compensate") && !set->cable[0])
        return cli_error(ctx, "compensate", "--cable RG-213 --compensate",
                         "the loss to compensate comes from a --cable");
    return CLI_EXIT_OK;
}

static int parse_setup(cli_ctx *ctx, const cli_args *a, fault_setup *set)
{
    *set = (fault_setup){ .beta = 6.0, .cable = "", .window = CXL_FAULT_HANN };
    if (cli_vf_or_cable(ctx, a, &set->vf, &set->cable)) return CLI_EXIT_USAGE;
    if (cli_count(a, "reference") &&
        cli_bounded(ctx, "reference", cli_get(a, "reference", 0), CLI_BOUND_IMPEDANCE,
                   "a reference impedance in ohm, such as 50", &set->ref))
        return CLI_EXIT_USAGE;
    if (parse_window(ctx, a, set)) return CLI_EXIT_USAGE;
    return parse_loss(ctx, a, set);
}

/* --compensate: the catalog cable's loss at mid-band of the sweep. */
static int cable_loss(cli_ctx *ctx, fault_setup *set, double start, double stop)
{
    size_t idx;
    double per_m;
    if (cli_cable_index(ctx, set->cable, &idx)) return CLI_EXIT_USAGE;
    cxl_loss_fit *fit = cli_cable_fit(cli_catalog(ctx), idx);
    int bad = !fit || cxl_loss_fit_eval(fit, 0.5 * (start + stop), CXL_LOSS_EXTRAPOLATE, &per_m);
    cxl_loss_fit_free(fit);
    if (bad)
        return cli_error(ctx, "compensate", "a cable with loss points, or --loss",
                         "cable %s has no loss table", set->cable);
    set->loss_100m = per_m * 100.0;
    return CLI_EXIT_OK;
}

/* The transform of the sweep, its refusals said in terms of the file. */
static int transform(cli_ctx *ctx, const cli_args *a, const fault_setup *set,
                     const cxl_sweep *s, const char *path, cxl_fault **f)
{
    unsigned flags = cli_flag(a, "bandpass") ? CXL_FAULT_BANDPASS : 0u;
    cxl_status st = cxl_fault_new(s, set->ref, set->vf, NULL, set->window, set->beta,
                                  set->loss_100m / 100.0, flags, f);
    if (st == CXL_ENOTFOUND)
        return cli_error(ctx, "file", "a sweep with phase (S, Z or Y; not an swr column)",
                         "%s holds no phase", path);
    if (st == CXL_EINCONSISTENT)
        return cli_error(ctx, "file", "a sweep with evenly spaced points",
                         "%s: the points are not evenly spaced", path);
    if (st != CXL_OK)
        return cli_error(ctx, "file", "a sweep of two or more evenly spaced points",
                         "%s: %s", path, cxl_strerror(st));
    return CLI_EXIT_OK;
}

/* Table, CSV or JSON: the peaks, then with --profile every point. */
static void print_rows(cli_ctx *ctx, const cli_args *a, const cxl_fault *f, const fault_view *v)
{
    for (int pass = 0; pass < 2; pass++) {
        size_t n = pass ? (cli_flag(a, "profile") ? cxl_fault_count(f) : 0)
                        : cxl_fault_peak_count(f);
        for (size_t i = 0; i < n; i++) {
            double d, refl, rl = NAN, sr = 0.0, stp = 0.0;
            int change = 0;
            if (pass) cxl_fault_point(f, i, &d, &refl, &sr, &stp);
            else cxl_fault_peak(f, i, &d, &refl, &rl, &change);
            if (pass && refl > 0.0) rl = -20.0 * log10(refl);
            int signed_step = pass && v->lowpass;
            cli_cell cells[NCOLS] = {
                CLI_TXT(v->label), CLI_TXT(v->path), CLI_TXT(v->mode), CLI_NUM(v->set->vf),
                CLI_NUM(v->res), CLI_NUM(v->range), CLI_TXT(pass ? "profile" : "peak"),
                CLI_NUM(d), CLI_NUM(d / M_PER_FT), CLI_NUM(signed_step ? sr : refl),
                isfinite(rl) ? CLI_NUM(rl) : CLI_NONE, CLI_TXT(change_name(change)),
                signed_step ? CLI_NUM(stp) : CLI_NONE,
            };
            cli_table_row(ctx, fault_cols, NCOLS, cells);
        }
    }
}

/* Text: the head lines saying how the transform was made. */
static void print_head(cli_ctx *ctx, const fault_view *v)
{
    const fault_setup *set = v->set;
    FILE *o = ctx->out;
    char b1[64], b2[64], b3[64];
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "fault: %s%s%s\n", v->path, v->label[0] ? ", " : "", v->label);
    fprintf(o, "  mode        %s (%s to %s MHz in %s kHz steps)\n", v->mode,
            cli_fmt(b1, sizeof b1, v->start / 1e6, 6), cli_fmt(b2, sizeof b2, v->stop / 1e6, 6),
            cli_fmt(b3, sizeof b3, v->step / 1e3, 3));
    fprintf(o, "  VF          %s%s%s\n", cli_fmt(b1, sizeof b1, set->vf, 5),
            set->cable[0] ? ", cable " : "", set->cable);
    fprintf(o, "  resolution  %s (VF c / 2 span; the window widens peaks)\n",
            cli_fmt_length(ctx, b1, sizeof b1, v->res));
    fprintf(o, "  range       %s (VF c / 2 step; a longer line folds back)\n",
            cli_fmt_length(ctx, b1, sizeof b1, v->range));
    fprintf(o, "  window      %s%s%s, loss compensated %s dB/100 m\n",
            set->window == CXL_FAULT_RECT ? "none"
            : set->window == CXL_FAULT_HANN ? "hann" : "kaiser, beta ",
            set->window == CXL_FAULT_KAISER ? cli_fmt(b2, sizeof b2, set->beta, 2) : "", "",
            cli_fmt(b3, sizeof b3, set->loss_100m, 3));
}

/* Text: the peaks, then with --profile every point. */
static void print_text(cli_ctx *ctx, const cli_args *a, const cxl_fault *f, const fault_view *v)
{
    FILE *o = ctx->out;
    char b1[64], b2[64], b3[64];
    size_t np = cxl_fault_peak_count(f);
    print_head(ctx, v);
    fprintf(o, "\n  %-36s %10s %14s  %s\n", "distance", "reflection", "return loss dB",
            v->lowpass ? "impedance beyond" : "");
    for (size_t i = 0; i < np; i++) {
        double d, refl, rl;
        int change;
        cxl_fault_peak(f, i, &d, &refl, &rl, &change);
        fprintf(o, "  %-36s %10s %14s  %s\n", cli_fmt_length(ctx, b1, sizeof b1, d),
                cli_fmt(b2, sizeof b2, refl, 4), cli_fmt(b3, sizeof b3, rl, 2),
                change ? change_name(change) : "");
    }
    if (!np) fprintf(o, "  (no peak above -60 dB)\n");
    if (!cli_flag(a, "profile")) return;
    fprintf(o, "\n  profile: distance m, reflection%s\n", v->lowpass ? " (signed), step" : "");
    for (size_t i = 0; i < cxl_fault_count(f); i++) {
        double d, refl, sr, stp;
        cxl_fault_point(f, i, &d, &refl, &sr, &stp);
        if (v->lowpass)
            fprintf(o, "  %s %s %s\n", cli_fmt(b1, sizeof b1, d, 4),
                    cli_fmt(b2, sizeof b2, sr, 6), cli_fmt(b3, sizeof b3, stp, 6));
        else
            fprintf(o, "  %s %s\n", cli_fmt(b1, sizeof b1, d, 4), cli_fmt(b2, sizeof b2, refl, 6));
    }
}

static int fault_run(cli_ctx *ctx, const cli_args *a)
{
    fault_setup set;
    if (parse_setup(ctx, a, &set)) return CLI_EXIT_USAGE;
    cxl_sweep *s = NULL;
    fault_view v = { .set = &set, .label = cli_label(a) };
    if (cli_sweep_load(ctx, a, &s, &v.path)) return CLI_EXIT_USAGE;
    double file_ref;
    cxl_sweep_info(s, &v.start, &v.stop, &file_ref, NULL, NULL);
    if (set.ref == 0.0) set.ref = file_ref;
    cxl_fault *f = NULL;
    int code = cli_flag(a, "compensate") ? cable_loss(ctx, &set, v.start, v.stop) : CLI_EXIT_OK;
    if (code == CLI_EXIT_OK) code = transform(ctx, a, &set, s, v.path, &f);
    cxl_sweep_free(s);
    if (code != CLI_EXIT_OK) return code;
    cxl_fault_info(f, &v.lowpass, NULL, &v.res, &v.range, &v.step);
    v.mode = v.lowpass ? "low-pass" : "band-pass";
    if (cli_count(a, "plot")) code = plot(ctx, a, f);
    if (code == CLI_EXIT_OK) {
        if (ctx->format != CLI_TEXT) print_rows(ctx, a, f, &v);
        else print_text(ctx, a, f, &v);
    }
    cxl_fault_free(f);
    return code;
}

const cli_command cli_cmd_fault = {
    .name = "fault",
    .summary = "distance to fault: reflection against distance from a one-port sweep",
    .synopsis = "FILE (--vf X | --cable NAME) [--window none|hann|kaiser] [--profile] [--plot F.svg] [OPTIONS]",
    .opts = fault_opts,
    .run = fault_run,
    .batch = 1,
    .positional = "file",
};
