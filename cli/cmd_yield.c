/* cmd_yield.c - coaxline yield: Monte-Carlo of arrays built from a layout
 * file within tolerances of line length, drum VF, amplitude and phase:
 * per band point the share of builds meeting a front-to-back or rear-null
 * goal, with its standard error, and the median and 5 % levels.  The
 * model and the random numbers are the library's (coaxline.h, yield.c). */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

#define RNG_TEXT "GSL mt19937, one generator per block of 1024 trials"
/* CLI bounds (common practice, no source): an amplitude tolerance beyond
 * 20 dB or a VF tolerance beyond 0.5 describes no real build. */
#define MAX_IMBALANCE_TOL_DB 20.0
#define MAX_VF_TOL 0.5

static const cli_optdef yield_opts[] = {
    CLI_LAYOUT_OPTDEFS,
    CLI_ARRAY_MODEL_OPTDEFS,
    CLI_DUO_BAND_OPTDEFS,
    { "length-tol", "LEN", "each line cut within +-LEN of its length (default 0)", 0 },
    { "vf-tol", "X", "the drum's VF within +-X of the nominal, one error for all lines (default 0)", 0 },
    { "imbalance-tol", "DB", "each element's amplitude within +-DB (default 0)", 0 },
    { "phase-tol", "DEG", "each element's extra phase within +-DEG (default 0)", 0 },
    { "goal-front-to-back", "DB", "a build passes with front-to-back of at least DB, e.g. 20", 0 },
    { "goal-null", "DB", "a build passes with its rear null at or below DB, e.g. -25", 0 },
    { "with-null", NULL, "also the null statistics with a front-to-back goal (slower)", 0 },
    { "trials", "N", "builds drawn per point, 1 to 100000000 (default 10000)", 0 },
    { "seed", "S", "random seed, 0 to 4294967295 (default 1)", 0 },
    { "threads", "N", "worker threads, 0 for one per processor (default 0); same result for any", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col yield_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 }, { "elevation_deg", 1 },
    { "goal", -1 }, { "goal_db", 2 }, { "trials", 0 }, { "seed", 0 }, { "yield_pct", 2 },
    { "yield_se_pct", 2 }, { "front_to_back_nominal_db", 2 }, { "front_to_back_median_db", 2 },
    { "front_to_back_p5_db", 2 }, { "null_nominal_db", 2 }, { "null_median_db", 2 },
    { "null_p5_db", 2 },
};
#define NCOLS (sizeof yield_cols / sizeof yield_cols[0])

typedef struct {
    cli_layout lay;
    cli_array_model m;
    double vf;
    cxl_loss_model *model;
    double length_tol_m, vf_tol, imbalance_tol_db, phase_tol_deg;
    int goal_null;
    double goal_db;
    int with_null;
    double trials, seed, threads;
} yield_spec;

typedef struct {
    double p, se, fb_nom, fb_med, fb_p5, null_nom, null_med, null_p5;
} yield_row;

/* A whole number within lo..hi. */
static int whole(cli_ctx *ctx, const cli_args *a, const char *name, double lo, double hi,
                 const char *expected, double *out)
{
    if (!cli_count(a, name)) return 0;
    if (cli_number(ctx, name, cli_get(a, name, 0), lo, hi, expected, out)) return CLI_EXIT_USAGE;
    if (*out != floor(*out))
        return cli_error(ctx, name, expected, "'%s' is not a whole number", cli_get(a, name, 0));
    return 0;
}

static int parse_goal(cli_ctx *ctx, const cli_args *a, yield_spec *s)
{
    int fb = cli_count(a, "goal-front-to-back") > 0, nl = cli_count(a, "goal-null") > 0;
    if (fb == nl)
        return cli_error(ctx, fb ? "goal-null" : "goal-front-to-back",
                         "exactly one of --goal-front-to-back 20 or --goal-null -25",
                         fb ? "two goals given" : "the yield needs a goal");
    s->goal_null = nl;
    if (fb)
        return cli_number(ctx, "goal-front-to-back", cli_get(a, "goal-front-to-back", 0), -299.0,
                          299.0, "a front-to-back ratio in dB, such as 20", &s->goal_db);
    if (cli_number(ctx, "goal-null", cli_get(a, "goal-null", 0), -300.0, 0.0,
                   "a null depth below the forward response, negative dB, such as -25", &s->goal_db))
        return CLI_EXIT_USAGE;
    if (!(s->goal_db < 0.0))
        return cli_error(ctx, "goal-null", "a negative depth in dB, such as -25",
                         "a null of 0 dB is no null");
    return 0;
}

static int parse_tolerance_options(cli_ctx *ctx, const cli_args *a, yield_spec *s)
{
    if (cli_count(a, "length-tol") &&
        cli_length(ctx, "length-tol", cli_get(a, "length-tol", 0), CLI_NONNEG, &s->length_tol_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "vf-tol") &&
        cli_number(ctx, "vf-tol", cli_get(a, "vf-tol", 0), 0.0, MAX_VF_TOL,
                   "a VF tolerance from 0 to 0.5, such as 0.01", &s->vf_tol))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "imbalance-tol") &&
        cli_number(ctx, "imbalance-tol", cli_get(a, "imbalance-tol", 0), 0.0, MAX_IMBALANCE_TOL_DB,
                   "an amplitude tolerance from 0 to 20 dB, such as 0.5", &s->imbalance_tol_db))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "phase-tol") &&
        cli_number(ctx, "phase-tol", cli_get(a, "phase-tol", 0), 0.0, 180.0,
                   "a phase tolerance from 0 to 180 degrees, such as 3", &s->phase_tol_deg))
        return CLI_EXIT_USAGE;
    return 0;
}

static int parse_tolerances(cli_ctx *ctx, const cli_args *a, yield_spec *s)
{
    if (parse_tolerance_options(ctx, a, s)) return CLI_EXIT_USAGE;
    /* what the lines can take: no negative length, a VF in (0, 1] */
    double shortest = INFINITY;
    int lines = 0;
    for (size_t i = 0; i < s->lay.n; i++)
        if (s->lay.el[i].has_line && s->lay.el[i].line_m > 0.0) {
            shortest = fmin(shortest, s->lay.el[i].line_m);
            lines = 1;
        }
    char b1[64], b2[96];
    if (lines && s->length_tol_m > shortest) {
        snprintf(b2, sizeof b2, "at most the shortest line, %s", cli_fmt_length(ctx, b1, sizeof b1, shortest));
        return cli_error(ctx, "length-tol", b2, "longer than a line of the layout");
    }
    if (lines && s->vf > 0.0 && (s->vf - s->vf_tol <= 0.0 || s->vf + s->vf_tol > 1.0)) {
        snprintf(b2, sizeof b2, "a tolerance keeping VF %s within 0 to 1",
                 cli_fmt(b1, sizeof b1, s->vf, 4));
        return cli_error(ctx, "vf-tol", b2, "takes the lines' VF outside 0 to 1");
    }
    return 0;
}

static int parse_spec(cli_ctx *ctx, const cli_args *a, yield_spec *s)
{
    memset(s, 0, sizeof *s);
    s->trials = CXL_YIELD_DEFAULT_TRIALS;
    s->seed = (double)CXL_YIELD_DEFAULT_SEED;
    if (!cli_count(a, "layout"))
        return cli_error(ctx, "layout", "--layout array.csv", "the yield needs the array's layout file");
    if (parse_goal(ctx, a, s) || cli_array_model_parse(ctx, a, &s->m)) return CLI_EXIT_USAGE;
    const char *cable = NULL;
    if ((cli_count(a, "vf") || cli_count(a, "cable")) && cli_vf_or_cable(ctx, a, &s->vf, &cable))
        return CLI_EXIT_USAGE;
    double design_hz = 0.0;
    if (cli_count(a, "design-freq") &&
        cli_freq(ctx, "design-freq", cli_get(a, "design-freq", 0), &design_hz))
        return CLI_EXIT_USAGE;
    if (cli_line_loss_model(ctx, a, cable, &s->model)) return CLI_EXIT_USAGE;
    if (whole(ctx, a, "trials", 1.0, CXL_YIELD_MAX_TRIALS, "a whole number of trials from 1 to 100000000",
              &s->trials) ||
        whole(ctx, a, "seed", 0.0, 4294967295.0, "a whole number from 0 to 4294967295", &s->seed) ||
        whole(ctx, a, "threads", 0.0, CXL_YIELD_MAX_THREADS, "0 (one per processor) to 256 threads",
              &s->threads))
        return CLI_EXIT_USAGE;
    s->with_null = s->goal_null || cli_flag(a, "with-null");
    if (cli_layout_load(ctx, "layout", cli_get(a, "layout", 0), s->vf, design_hz, &s->lay))
        return CLI_EXIT_USAGE;
    return parse_tolerances(ctx, a, s);
}

static void free_spec(yield_spec *s)
{
    cli_layout_free(&s->lay);
    cxl_loss_model_free(s->model);
    s->model = NULL;
}

static int evaluate(cli_ctx *ctx, const yield_spec *s, const cxl_array *arr, const cxl_yield *y,
                    double f, yield_row *r)
{
    double el = s->m.elevation_deg, az;
    double max_hz;
    char b1[32], b2[32], want[96];
    if (cxl_array_max_freq(arr, &max_hz) == CXL_OK && f > max_hz) {
        snprintf(want, sizeof want, "a frequency up to %s MHz for this layout",
                 cli_fmt(b1, sizeof b1, max_hz / 1e6, 3));
        return cli_error(ctx, "freq", want, "at %s MHz the layout is too large for the pattern model",
                         cli_fmt(b2, sizeof b2, f / 1e6, 6));
    }
    cxl_status st = cxl_array_eval_front_to_back(arr, f, el, &r->fb_nom);
    if (!st && s->with_null) st = cxl_array_eval_rear_null(arr, f, el, &az, &r->null_nom);
    if (!st)
        st = cxl_yield_eval(y, arr, f, el, &r->p, &r->se, &r->fb_med, &r->fb_p5,
                            s->with_null ? &r->null_med : NULL, s->with_null ? &r->null_p5 : NULL);
    if (st == CXL_ERANGE && s->model)
        return cli_error(ctx, "vf-tol", "tolerances the lines can take at every frequency",
                         "at %s MHz: %s", cli_fmt(b1, sizeof b1, f / 1e6, 6), cxl_strerror(st));
    if (st)
        return cli_error(ctx, "freq", "a frequency and elevation at which the array has a forward response",
                         "at %s MHz the array cannot be evaluated: %s",
                         cli_fmt(b1, sizeof b1, f / 1e6, 6), cxl_strerror(st));
    return 0;
}

static void describe(cli_ctx *ctx, const yield_spec *s, const char *label)
{
    FILE *o = ctx->out;
    char b[4][96];
    fprintf(o, "yield%s%s: %zu elements, %.0f trials per point, seed %.0f\n", label[0] ? ": " : "",
            label, s->lay.n, s->trials, s->seed);
    fprintf(o, "  goal         %s %s dB at elevation %s deg\n",
            s->goal_null ? "rear null (deepest, azimuth 90-270, against azimuth 0) at or below"
                         : "front-to-back (azimuth 0 over 180) at least",
            cli_fmt(b[0], sizeof b[0], s->goal_db, 2), cli_fmt(b[1], sizeof b[1], s->m.elevation_deg, 1));
    fprintf(o, "  tolerances   each line +-%s; drum VF +-%s (one for all lines); each amplitude\n"
               "               +-%s dB; each phase +-%s deg; uniform, independent\n",
            cli_fmt_length(ctx, b[0], sizeof b[0], s->length_tol_m), cli_fmt(b[1], sizeof b[1], s->vf_tol, 4),
            cli_fmt(b[2], sizeof b[2], s->imbalance_tol_db, 2),
            cli_fmt(b[3], sizeof b[3], s->phase_tol_deg, 2));
    fprintf(o, "  model        %s; lossless ideal combiner\n", s->m.model_text);
    fprintf(o, "  random       %s; the same for any number of threads\n", RNG_TEXT);
}

/* The nominal array and the Monte-Carlo plan, then every frequency. */
static int compute(cli_ctx *ctx, const yield_spec *s, const cli_freq_point *pts, int n,
                   yield_row **rows)
{
    int code = 0;
    cxl_array *arr = NULL;
    cxl_yield *y = NULL;
    if (cli_layout_array(&s->lay, &s->m, s->vf, s->vf, s->model, 0, -1, &arr) != CXL_OK ||
        cxl_yield_new(&y) != CXL_OK || !(*rows = calloc((size_t)n, sizeof **rows)))
        code = cli_error(ctx, "layout", NULL, "out of memory");
    if (!code &&
        (cxl_yield_set_tolerances(y, s->length_tol_m, s->vf_tol, s->imbalance_tol_db,
                                  s->phase_tol_deg) ||
         (s->goal_null ? cxl_yield_set_goal_null(y, s->goal_db)
                       : cxl_yield_set_goal_front_to_back(y, s->goal_db)) ||
         cxl_yield_set_run(y, (size_t)s->trials, (unsigned long)s->seed, (unsigned)s->threads)))
        code = cli_error(ctx, "layout", NULL, "tolerances, goal or run refused by the library");
    for (int i = 0; !code && i < n; i++)
        code = evaluate(ctx, s, arr, y, pts[i].freq_hz, &(*rows)[i]);
    cxl_yield_free(y);
    cxl_array_free(arr);
    return code;
}

static void write_table(cli_ctx *ctx, const yield_spec *s, const char *label,
                        const cli_freq_point *pts, int n, const yield_row *rows)
{
    const char *goal = s->goal_null ? "null" : "front-to-back";
    for (int i = 0; i < n; i++) {
        const yield_row *r = &rows[i];
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
            CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(s->m.elevation_deg), CLI_TXT(goal),
            CLI_NUM(s->goal_db), CLI_NUM(s->trials), CLI_NUM(s->seed), CLI_NUM(100.0 * r->p),
            CLI_NUM(100.0 * r->se), CLI_NUM(r->fb_nom), CLI_NUM(r->fb_med), CLI_NUM(r->fb_p5),
            s->with_null ? CLI_NUM(r->null_nom) : CLI_NONE,
            s->with_null ? CLI_NUM(r->null_med) : CLI_NONE,
            s->with_null ? CLI_NUM(r->null_p5) : CLI_NONE,
        };
        cli_table_row(ctx, yield_cols, NCOLS, cells);
    }
}

static void text_row(cli_ctx *ctx, const yield_spec *s, const cli_freq_point *pt,
                     const yield_row *r)
{
    FILE *o = ctx->out;
    char f[32], v[8][32], pct[48];
    snprintf(pct, sizeof pct, "%s +- %s", cli_fmt(v[0], sizeof v[0], 100.0 * r->p, 2),
             cli_fmt(v[1], sizeof v[1], 100.0 * r->se, 2));
    fprintf(o, "  %-6s %-6s %10s  %15s  %7s %7s %7s", pt->band, pt->edge,
            cli_fmt(f, sizeof f, pt->freq_hz / 1e6, 6), pct,
            cli_fmt(v[2], sizeof v[2], r->fb_nom, 2), cli_fmt(v[3], sizeof v[3], r->fb_med, 2),
            cli_fmt(v[4], sizeof v[4], r->fb_p5, 2));
    if (s->with_null)
        fprintf(o, "  %7s %7s %7s", cli_fmt(v[5], sizeof v[5], r->null_nom, 2),
                cli_fmt(v[6], sizeof v[6], r->null_med, 2), cli_fmt(v[7], sizeof v[7], r->null_p5, 2));
    putc('\n', o);
}

static void write_text(cli_ctx *ctx, const yield_spec *s, const char *label,
                       const cli_freq_point *pts, int n, const yield_row *rows)
{
    FILE *o = ctx->out;
    if (ctx->rows_out++) putc('\n', o);
    describe(ctx, s, label);
    fprintf(o, "\n  %-6s %-6s %10s  %15s  %s", "band", "edge", "freq MHz", "yield %",
            s->with_null ? "front-to-back dB         rear null dB" : "front-to-back dB");
    fprintf(o, "\n  %-6s %-6s %10s  %15s  %7s %7s %7s", "", "", "", "+- 1 se", "nominal", "median",
            "95% >=");
    if (s->with_null) fprintf(o, "  %7s %7s %7s", "nominal", "median", "95% <=");
    putc('\n', o);
    for (int i = 0; i < n; i++) text_row(ctx, s, &pts[i], &rows[i]);
    fprintf(o, "  (95%% >=: 95 %% of the builds reach at least this front-to-back%s)\n",
            s->with_null ? "; 95% <=: a null at least this deep" : "");
    int all_or_none = 0, at_limit = 0;
    for (int i = 0; i < n; i++) {
        all_or_none |= rows[i].se == 0.0;
        at_limit |= cli_at_db_limit(rows[i].fb_nom) ||
                    (s->with_null && cli_at_db_limit(rows[i].null_nom));
    }
    cli_db_limit_note(ctx, at_limit);
    if (all_or_none)
        fprintf(o, "  (+- 0: every build or none passed; about 300/trials %% is then a 95 %% bound)\n");
}

static int yield_run(cli_ctx *ctx, const cli_args *a)
{
    static cli_freq_point pts[4 * CLI_MAX_ITEMS];
    yield_spec s;
    yield_row *rows = NULL;
    int code = parse_spec(ctx, a, &s) ? CLI_EXIT_USAGE : 0;
    int n = code ? 0 : cli_freq_points(ctx, a, pts, sizeof pts / sizeof pts[0], NULL);
    if (!code && n < 0) code = CLI_EXIT_USAGE;
    if (!code) code = compute(ctx, &s, pts, n, &rows);
    if (!code && ctx->format != CLI_TEXT)
        write_table(ctx, &s, cli_label(a), pts, n, rows);
    else if (!code)
        write_text(ctx, &s, cli_label(a), pts, n, rows);
    free(rows);
    free_spec(&s);
    return code ? code : CLI_EXIT_OK;
}

const cli_command cli_cmd_yield = {
    .name = "yield",
    .summary = "Monte-Carlo of arrays built within tolerances: how many meet a goal",
    .synopsis = "--layout FILE.csv (--band LIST | --freq F) (--goal-front-to-back DB | --goal-null DB) "
                "[--vf X | --cable NAME] [OPTIONS]",
    .opts = yield_opts,
    .run = yield_run,
    .batch = 0,
};
