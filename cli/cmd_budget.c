/* cmd_budget.c - coaxline budget: the inverse of pattern.  For a wanted
 * rear null depth or front-to-back ratio, the phase error each band point
 * allows and the length mismatch of the feed lines that makes it. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef budget_opts[] = {
    CLI_BUDGET_OPTDEFS,
    { "front-to-back", "DB", "wanted front-to-back ratio of the pair described below, e.g. 20", 0 },
    CLI_DUO_OPTDEFS,
    CLI_DUO_BAND_OPTDEFS,
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col budget_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 }, { "goal", -1 },
    { "goal_db", 2 }, { "elevation_deg", 1 }, { "imbalance_db", 2 }, { "error_free_db", 2 },
    { "phase_tolerance_deg", 3 }, { "vf", 4 }, { "length_tolerance_m", 4 },
    { "length_tolerance_in", 3 },
};
#define NCOLS (sizeof budget_cols / sizeof budget_cols[0])

typedef struct {
    double freq_hz, error_free_db, tol_deg, len_m;
    int reachable;
} budget_point;

/* Error-free result and tolerance at every point; CLI_EXIT_USAGE after an
 * error, else CLI_EXIT_TOLERANCE when a point misses the goal, else 0. */
static int budget_points(cli_ctx *ctx, const cli_goal *g, const cli_freq_point *pts, int n,
                         budget_point *res)
{
    const cli_duo_spec *spec = &g->spec;
    int result = CLI_EXIT_OK;
    for (int i = 0; i < n; i++) {
        budget_point *r = &res[i];
        double f = pts[i].freq_hz;
        r->freq_hz = f;
        int code = cli_goal_tolerance(ctx, g, f, &r->error_free_db, &r->tol_deg);
        if (code == CLI_EXIT_USAGE) return code;
        r->reachable = code == 0;
        if (!r->reachable) result = CLI_EXIT_TOLERANCE;
        r->len_m = NAN;
        if (r->reachable && spec->has_vf &&
            cxl_budget_length_for_phase(r->tol_deg, spec->vf, f, &r->len_m) != CXL_OK)
            r->len_m = NAN;
    }
    return result;
}

/* The goal's lines of the text output. */
static void goal_text(cli_ctx *ctx, const cli_goal *g)
{
    FILE *o = ctx->out;
    char b1[96], b2[96];
    const cli_duo_spec *s = &g->spec;
    if (g->kind == CLI_GOAL_FB) {
        fprintf(o, "  goal          front-to-back at least %s dB at elevation %s deg; the error is\n"
                   "                added to B's feed; free space, no ground, no mutual coupling\n",
                cli_fmt(b1, sizeof b1, g->goal_db, 2), cli_fmt(b2, sizeof b2, s->elevation_deg, 1));
        return;
    }
    if (g->kind == CLI_GOAL_INPHASE) {
        fprintf(o, "  goal          null at or below %s dB relative to the two signals adding in\n"
                   "                phase (closed form 20 log10 sin(d/2), any geometry; a compact\n"
                   "                pair's null against its forward response is much shallower)\n",
                cli_fmt(b1, sizeof b1, g->goal_db, 2));
        return;
    }
    fprintf(o, "  goal          rear null at or below %s dB against the forward response of\n"
               "                the pair below (deepest over azimuth 90-270 at elevation %s deg,\n"
               "                as pattern measures it); the error is added to B's feed; free\n"
               "                space, no ground, no mutual coupling\n",
            cli_fmt(b1, sizeof b1, g->goal_db, 2), cli_fmt(b2, sizeof b2, s->elevation_deg, 1));
    fprintf(o, "  pair          stagger %s, spacing %s\n"
               "                feed %s, %s elements\n",
            cli_fmt_length(ctx, b1, sizeof b1, s->stagger_m),
            cli_fmt_length(ctx, b2, sizeof b2, s->spacing_m), s->feed,
            s->wire ? "long-wire" : "isotropic");
}

static void budget_table(cli_ctx *ctx, const cli_args *a, const cli_goal *g,
                         const cli_freq_point *pts, int n, const budget_point *res)
{
    const char *label = cli_label(a);
    const cli_duo_spec *spec = &g->spec;
    int geo = g->kind != CLI_GOAL_INPHASE;
    for (int i = 0; i < n; i++) {
        const budget_point *r = &res[i];
        int has_len = isfinite(r->len_m);
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
            CLI_NUM(r->freq_hz / 1e6), CLI_TXT(g->option), CLI_NUM(g->goal_db),
            geo ? CLI_NUM(spec->elevation_deg) : CLI_NONE, CLI_NUM(g->imbalance_db),
            CLI_NUM(r->error_free_db), r->reachable ? CLI_NUM(r->tol_deg) : CLI_NONE,
            spec->has_vf ? CLI_NUM(spec->vf) : CLI_NONE,
            has_len ? CLI_NUM(r->len_m) : CLI_NONE,
            has_len ? CLI_NUM(r->len_m / 0.0254) : CLI_NONE,
        };
        cli_table_row(ctx, budget_cols, NCOLS, cells);
    }
}

static void budget_text_points(cli_ctx *ctx, const cli_goal *g, const cli_freq_point *pts,
                               int n, const budget_point *res)
{
    FILE *o = ctx->out;
    char b1[96], b2[96], b3[96];
    fprintf(o, "\n  %-6s %-7s %11s %15s %11s  %s\n", "band", "edge", "freq MHz",
            g->kind == CLI_GOAL_FB ? "error-free F/B" : "error-free null", "phase deg",
            "length mismatch within");
    for (int i = 0; i < n; i++) {
        const budget_point *r = &res[i];
        fprintf(o, "  %-6s %-7s %11s %12s dB ", pts[i].band, pts[i].edge,
                cli_fmt(b1, sizeof b1, r->freq_hz / 1e6, 6),
                cli_fmt(b2, sizeof b2, r->error_free_db, 2));
        if (!r->reachable)
            fprintf(o, "%11s  %s\n", "-", "goal out of reach even without phase error");
        else
            fprintf(o, "%11s  %s\n", cli_fmt(b3, sizeof b3, r->tol_deg, 2),
                    isfinite(r->len_m) ? cli_fmt_length(ctx, b2, sizeof b2, r->len_m) : "-");
    }
}

/* Per band, the tightest of its points sets the limit. */
static void budget_text_bands(cli_ctx *ctx, const cli_freq_point *pts, int n,
                              const budget_point *res)
{
    FILE *o = ctx->out;
    char b1[96], b2[96];
    int first = 1;
    for (int i = 0; i < n; i++) {
        if (!pts[i].band[0] || (i > 0 && strcmp(pts[i].band, pts[i - 1].band) == 0)) continue;
        double tol = INFINITY, len = INFINITY;
        int all = 1;
        for (int j = i; j < n && strcmp(pts[j].band, pts[i].band) == 0; j++) {
            if (!res[j].reachable) { all = 0; continue; }
            tol = fmin(tol, res[j].tol_deg);
            if (isfinite(res[j].len_m)) len = fmin(len, res[j].len_m);
        }
        if (first) fputc('\n', o);
        first = 0;
        if (!all)
            fprintf(o, "  %s: the goal is out of reach on part of the band\n", pts[i].band);
        else
            fprintf(o, "  %s whole band: phase error within %s deg%s%s\n", pts[i].band,
                    cli_fmt(b1, sizeof b1, tol, 2), isfinite(len) ? ", lines matched within " : "",
                    isfinite(len) ? cli_fmt_length(ctx, b2, sizeof b2, len) : "");
    }
}

static void budget_text(cli_ctx *ctx, const cli_args *a, const cli_goal *g,
                        const cli_freq_point *pts, int n, const budget_point *res, int result)
{
    FILE *o = ctx->out;
    char b1[96];
    const char *label = cli_label(a);
    const cli_duo_spec *spec = &g->spec;
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "budget%s%s\n", label[0] ? ": " : "", label);
    goal_text(ctx, g);
    fprintf(o, "  imbalance     %s dB\n", cli_fmt(b1, sizeof b1, g->imbalance_db, 2));
    if (spec->has_vf)
        fprintf(o, "  feed-line VF  %s%s%s\n", cli_fmt(b1, sizeof b1, spec->vf, 4),
                spec->cable[0] ? "  cable " : "", spec->cable);
    else
        fprintf(o, "  feed-line VF  not given: phase only (add --vf or --cable for lengths)\n");
    budget_text_points(ctx, g, pts, n, res);
    if (result == CLI_EXIT_TOLERANCE && g->kind != CLI_GOAL_FB)
        fprintf(o, "  (where out of reach the error-free pair's null is already shallower\n"
                   "  than %s dB: the imbalance or the geometry fills it, whatever the lines)\n",
                cli_fmt(b1, sizeof b1, g->goal_db, 2));
    budget_text_bands(ctx, pts, n, res);
}

static int budget_run(cli_ctx *ctx, const cli_args *a)
{
    cli_freq_point pts[3 * CLI_MAX_ITEMS + CLI_MAX_ITEMS];
    budget_point res[sizeof pts / sizeof pts[0]];
    cli_goal g;

    if (cli_goal_parse(ctx, a, &g)) {
        cli_goal_free(&g);
        return CLI_EXIT_USAGE;
    }
    int n = cli_freq_points(ctx, a, pts, sizeof pts / sizeof pts[0], NULL);
    int result = n < 0 ? CLI_EXIT_USAGE : budget_points(ctx, &g, pts, n, res);
    if (result != CLI_EXIT_USAGE) {
        if (ctx->format != CLI_TEXT) budget_table(ctx, a, &g, pts, n, res);
        else budget_text(ctx, a, &g, pts, n, res, result);
    }
    cli_goal_free(&g);
    return result;
}

const cli_command cli_cmd_budget = {
    .name = "budget",
    .summary = "phase error and length mismatch a wanted null depth or front-to-back allows",
    .synopsis = "(--null-depth DB | --front-to-back DB) PAIR OPTIONS (--band LIST | --freq F) [OPTIONS], "
                "or --null-vs-inphase DB (--band LIST | --freq F) [OPTIONS]",
    .opts = budget_opts,
    .end = cli_vf_source_end,
    .run = budget_run,
    .batch = 1,
};
