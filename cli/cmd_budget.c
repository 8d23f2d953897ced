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
    CLI_PAIR_OPTDEFS,
    CLI_PAIR_BAND_OPTDEFS,
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

static int budget_run(cli_ctx *ctx, const cli_args *a)
{
    cli_freq_point pts[3 * CLI_MAX_ITEMS + CLI_MAX_ITEMS];
    budget_point res[sizeof pts / sizeof pts[0]];
    int fb = cli_count(a, "front-to-back") > 0;
    double goal_db = 0.0;
    cli_pair_spec spec;

    if (cli_pair_spec_parse(ctx, a, &spec)) return CLI_EXIT_USAGE;
    int n = cli_freq_points(ctx, a, pts, sizeof pts / sizeof pts[0], NULL);
    if (n < 0) {
        cli_pair_spec_free(&spec);
        return CLI_EXIT_USAGE;
    }
    int result = CLI_EXIT_OK;
    for (int i = 0; i < n; i++) {
        budget_point *r = &res[i];
        double f = pts[i].freq_hz;
        r->freq_hz = f;
        cxl_array_pair *pair = NULL;
        cxl_status st;
        if (fb) {
            if (cli_pair_spec_build(ctx, &spec, 1, f, &pair, NULL, NULL)) goto usage;
            st = cxl_array_front_to_back(pair, f, spec.elevation_deg, &r->error_free_db);
            cxl_array_pair_free(pair);
        } else {
            st = cxl_array_null_depth(0.0, spec.imbalance_db, &r->error_free_db);
        }
        char fs[32];
        if (st != CXL_OK) {
            cli_error(ctx, "freq", "a frequency at which the pair can be modelled", "at %s MHz: %s",
                      cli_fmt(fs, sizeof fs, f / 1e6, 6), cxl_strerror(st));
            goto usage;
        }
        int code = cli_budget_tolerance(ctx, a, f, &r->tol_deg);
        if (code == CLI_EXIT_USAGE) goto usage;
        /* the helper has checked the goal's number */
        cxl_units_parse_number(cli_get(a, fb ? "front-to-back" : "null-depth", 0), &goal_db, NULL);
        r->reachable = code == 0;
        if (!r->reachable) result = CLI_EXIT_TOLERANCE;
        r->len_m = NAN;
        if (r->reachable && spec.has_vf &&
            cxl_budget_length_for_phase(r->tol_deg, f, spec.vf, &r->len_m) != CXL_OK)
            r->len_m = NAN;
    }

    const char *label = cli_label(a), *goal = fb ? "front-to-back" : "null-depth";
    if (ctx->format != CLI_TEXT) {
        for (int i = 0; i < n; i++) {
            const budget_point *r = &res[i];
            int has_len = isfinite(r->len_m);
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
                CLI_NUM(r->freq_hz / 1e6), CLI_TXT(goal), CLI_NUM(goal_db),
                fb ? CLI_NUM(spec.elevation_deg) : CLI_NONE, CLI_NUM(spec.imbalance_db),
                CLI_NUM(r->error_free_db), r->reachable ? CLI_NUM(r->tol_deg) : CLI_NONE,
                spec.has_vf ? CLI_NUM(spec.vf) : CLI_NONE,
                has_len ? CLI_NUM(r->len_m) : CLI_NONE,
                has_len ? CLI_NUM(r->len_m / 0.0254) : CLI_NONE,
            };
            cli_table_row(ctx, budget_cols, NCOLS, cells);
        }
        cli_pair_spec_free(&spec);
        return result;
    }

    FILE *o = ctx->out;
    char b1[96], b2[96], b3[96];
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "budget%s%s\n", label[0] ? ": " : "", label);
    if (fb)
        fprintf(o, "  goal          front-to-back at least %s dB at elevation %s deg; the error is\n"
                   "                added to B's feed; free space, no ground, no mutual coupling\n",
                cli_fmt(b1, sizeof b1, goal_db, 2), cli_fmt(b2, sizeof b2, spec.elevation_deg, 1));
    else
        fprintf(o, "  goal          rear null at or below %s dB against the forward response\n"
                   "                (closed form: two signals with a phase error, any geometry)\n",
                cli_fmt(b1, sizeof b1, goal_db, 2));
    fprintf(o, "  imbalance     %s dB\n", cli_fmt(b1, sizeof b1, spec.imbalance_db, 2));
    if (spec.has_vf)
        fprintf(o, "  feed-line VF  %s%s%s\n", cli_fmt(b1, sizeof b1, spec.vf, 4),
                spec.cable[0] ? "  cable " : "", spec.cable);
    else
        fprintf(o, "  feed-line VF  not given: phase only (add --vf or --cable for lengths)\n");
    fprintf(o, "\n  %-6s %-7s %11s %15s %11s  %s\n", "band", "edge", "freq MHz",
            fb ? "error-free F/B" : "error-free null", "phase deg", "length mismatch within");
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
    /* per band, the tightest of its points sets the limit */
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
    cli_pair_spec_free(&spec);
    return result;

usage:
    cli_pair_spec_free(&spec);
    return CLI_EXIT_USAGE;
}

const cli_command cli_cmd_budget = {
    .name = "budget",
    .summary = "phase error and length mismatch a wanted null depth or front-to-back allows",
    .synopsis = "(--null-depth DB | --front-to-back DB [PAIR OPTIONS]) (--band LIST | --freq F) [OPTIONS]",
    .opts = budget_opts,
    .end = cli_vf_source_end,
    .run = budget_run,
    .batch = 1,
};
