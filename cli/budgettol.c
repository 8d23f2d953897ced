/* budgettol.c - the phase tolerance a wanted result allows: a rear null
 * relative to the forward response of the pair described (root finding on
 * the pattern model), a null relative to the in-phase sum (closed form, any
 * geometry) or a front-to-back ratio.  Shared by budget and pair. */
#include <config.h>
#include <string.h>
#include "cli.h"

static const char *const goal_options[3] = { "null-depth", "null-vs-inphase", "front-to-back" };

static int parse_goal_number(cli_ctx *ctx, const cli_args *a, cli_goal *g)
{
    const char *text = cli_get(a, g->option, 0);
    if (g->kind == CLI_GOAL_FB) {
        static const char expected[] = "a ratio in dB above 0, such as 20";
        if (cli_number(ctx, g->option, text, 0.0, cli_bounds[CLI_BOUND_GOAL_DB].max, expected,
                       &g->goal_db))
            return CLI_EXIT_USAGE;
        /* a goal of 0 dB or less asks for nothing: any pair meets it */
        if (!(g->goal_db > 0.0))
            return cli_error(ctx, g->option, expected, "'%s' must be above 0 dB", text);
        return 0;
    }
    static const char expected[] = "a depth below 0 dB, such as -25";
    if (cli_number(ctx, g->option, text, cli_bounds[CLI_BOUND_GOAL_DB].min, 0.0, expected,
                   &g->goal_db))
        return CLI_EXIT_USAGE;
    if (!(g->goal_db < 0.0))
        return cli_error(ctx, g->option, expected, "'%s' must be below 0 dB", text);
    return 0;
}

int cli_goal_parse(cli_ctx *ctx, const cli_args *a, cli_goal *g)
{
    int n = 0;
    memset(g, 0, sizeof *g);
    for (int k = 0; k < 3; k++)
        if (cli_count_if(a, goal_options[k])) {
            n++;
            g->kind = (cli_goal_kind)k;
        }
    g->option = goal_options[g->kind];
    if (n != 1)
        return cli_error(ctx, "null-depth",
                         "one of --null-depth -25, --null-vs-inphase -25 or --front-to-back 20",
                         n ? "give only one goal" : "a goal is needed");
    if (parse_goal_number(ctx, a, g)) return CLI_EXIT_USAGE;
    if (cli_count(a, "imbalance") &&
        cli_bounded(ctx, "imbalance", cli_get(a, "imbalance", 0), CLI_BOUND_LEVEL_DB,
                   "dB by which B is weaker than A, such as 0.5", &g->imbalance_db))
        return CLI_EXIT_USAGE;
    /* the null and the ratio belong to a geometry: never assume one */
    if (g->kind != CLI_GOAL_INPHASE && !cli_count(a, "stagger") && !cli_count(a, "spacing"))
        return cli_error(ctx, g->option,
                         g->kind == CLI_GOAL_NULL
                             ? "--stagger LEN and/or --spacing LEN with --feed crossfire|endfire "
                               "(--design-freq F) or the feed per element, as pattern takes them; "
                               "or --null-vs-inphase DB for the closed form"
                             : "--stagger LEN and/or --spacing LEN with --feed crossfire|endfire "
                               "(--design-freq F) or the feed per element, as pattern takes them",
                         "--%s is relative to the forward response of a pair: its geometry is needed",
                         g->option);
    if (cli_duo_spec_parse(ctx, a, &g->spec)) return CLI_EXIT_USAGE;
    g->has_spec = 1;
    return 0;
}

void cli_goal_free(cli_goal *g)
{
    if (g->has_spec) cli_duo_spec_free(&g->spec);
    g->has_spec = 0;
}

/* The error-free pair's result for a geometric goal. */
static cxl_status error_free(const cli_goal *g, const cxl_duo *pair, double freq_hz,
                             double *db)
{
    double az;
    if (g->kind == CLI_GOAL_FB)
        return cxl_duo_front_to_back(pair, freq_hz, g->spec.elevation_deg, db);
    return cxl_duo_rear_null(pair, freq_hz, g->spec.elevation_deg, &az, db);
}

static int geometric_tolerance(cli_ctx *ctx, const cli_goal *g, double freq_hz,
                               double *error_free_db, double *tolerance_deg)
{
    cxl_duo *pair = NULL;
    double free_db = 0.0, tol = 0.0;
    if (cli_duo_spec_build(ctx, &g->spec, 0, freq_hz, &pair, NULL, NULL)) return CLI_EXIT_USAGE;
    cxl_status st = cxl_duo_set_imbalance(pair, g->imbalance_db);
    if (st == CXL_OK) st = error_free(g, pair, freq_hz, &free_db);
    int code = 0;
    if (st == CXL_OK && (g->kind == CLI_GOAL_FB ? free_db < g->goal_db : free_db > g->goal_db))
        code = CLI_EXIT_TOLERANCE;
    else if (st == CXL_OK && g->kind == CLI_GOAL_FB)
        st = cxl_budget_phase_for_front_to_back(pair, g->goal_db, freq_hz, g->spec.elevation_deg,
                                                &tol);
    else if (st == CXL_OK)
        st = cxl_budget_phase_for_rear_null(pair, g->goal_db, freq_hz, g->spec.elevation_deg, &tol);
    cxl_duo_free(pair);
    if (st != CXL_OK) {
        char f[32];
        return cli_error(ctx, g->option, "a pair that can be modelled at this frequency",
                         "at %s MHz: %s", cli_fmt(f, sizeof f, freq_hz / 1e6, 6),
                         cxl_strerror(st));
    }
    *error_free_db = free_db;
    if (code == 0) *tolerance_deg = tol;
    return code;
}

int cli_goal_tolerance(cli_ctx *ctx, const cli_goal *g, double freq_hz,
                       double *error_free_db, double *tolerance_deg)
{
    if (g->kind != CLI_GOAL_INPHASE)
        return geometric_tolerance(ctx, g, freq_hz, error_free_db, tolerance_deg);
    double free_db, tol;
    cxl_status st = cxl_duo_null_depth(0.0, g->imbalance_db, &free_db);
    if (st != CXL_OK)
        return cli_error(ctx, g->option, "a depth below 0 dB, such as -25", "%s", cxl_strerror(st));
    *error_free_db = free_db;
    st = cxl_budget_phase_for_null(g->goal_db, g->imbalance_db, &tol);
    if (st == CXL_ERANGE) return CLI_EXIT_TOLERANCE;
    if (st != CXL_OK)
        return cli_error(ctx, g->option, "a depth below 0 dB, such as -25", "%s", cxl_strerror(st));
    *tolerance_deg = tol;
    return 0;
}
