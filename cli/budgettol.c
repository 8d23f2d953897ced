/* budgettol.c - the phase tolerance a wanted result allows: a rear null
 * depth (closed form, any pair) or a front-to-back ratio (the described
 * pair at one frequency).  Shared by budget and by any command that takes
 * a goal instead of a tolerance in degrees. */
#include <config.h>
#include <string.h>
#include "cli.h"

static int parse_imbalance(const cli_ctx *ctx, const cli_args *a, double *imbalance_db)
{
    *imbalance_db = 0.0;
    if (!cli_count(a, "imbalance")) return 0;
    return cli_number(ctx, "imbalance", cli_get(a, "imbalance", 0), -60.0, 60.0,
                      "dB by which B is weaker than A, such as 0.5", imbalance_db);
}

static int null_tolerance(const cli_ctx *ctx, const cli_args *a, double *tolerance_deg)
{
    static const char expected[] = "a depth below 0 dB, such as -25";
    const char *text = cli_get(a, "null-depth", 0);
    double depth_db, imbalance_db, tol;
    if (cli_number(ctx, "null-depth", text, -(CXL_DB_LIMIT - 1.0), 0.0, expected, &depth_db) ||
        parse_imbalance(ctx, a, &imbalance_db))
        return CLI_EXIT_USAGE;
    if (!(depth_db < 0.0))
        return cli_error(ctx, "null-depth", expected, "'%s' must be below 0 dB", text);
    cxl_status st = cxl_budget_phase_for_null(depth_db, imbalance_db, &tol);
    if (st == CXL_ERANGE) return CLI_EXIT_TOLERANCE;
    if (st != CXL_OK)
        return cli_error(ctx, "null-depth", expected, "%s", cxl_strerror(st));
    *tolerance_deg = tol;
    return 0;
}

static int fb_tolerance(cli_ctx *ctx, const cli_args *a, double freq_hz, double *tolerance_deg)
{
    static const char expected[] = "a ratio in dB above 0, such as 20";
    const char *text = cli_get(a, "front-to-back", 0);
    double goal_db, fb0, tol;
    if (cli_number(ctx, "front-to-back", text, 0.0, CXL_DB_LIMIT - 1.0, expected, &goal_db))
        return CLI_EXIT_USAGE;
    /* a goal of 0 dB or less asks for nothing: any pair meets it */
    if (!(goal_db > 0.0))
        return cli_error(ctx, "front-to-back", expected, "'%s' must be above 0 dB", text);
    cli_pair_spec spec;
    cxl_array_pair *pair = NULL;
    if (cli_pair_spec_parse(ctx, a, &spec)) return CLI_EXIT_USAGE;
    int code = cli_pair_spec_build(ctx, &spec, 1, freq_hz, &pair, NULL, NULL);
    if (code == 0) {
        char f[32];
        cxl_status st = cxl_array_front_to_back(pair, freq_hz, spec.elevation_deg, &fb0);
        if (st == CXL_OK && fb0 < goal_db)
            code = CLI_EXIT_TOLERANCE;
        else if (st == CXL_OK)
            st = cxl_budget_phase_for_front_to_back(pair, freq_hz, spec.elevation_deg, goal_db,
                                                    &tol);
        if (code == 0 && st != CXL_OK)
            code = cli_error(ctx, "front-to-back", "a pair that can be modelled at this frequency",
                             "at %s MHz: %s", cli_fmt(f, sizeof f, freq_hz / 1e6, 6),
                             cxl_strerror(st));
        else if (code == 0)
            *tolerance_deg = tol;
    }
    cxl_array_pair_free(pair);
    cli_pair_spec_free(&spec);
    return code;
}

int cli_budget_tolerance(cli_ctx *ctx, const cli_args *a, double freq_hz,
                         double *tolerance_deg)
{
    int null = cli_count(a, "null-depth") > 0, fb = cli_count(a, "front-to-back") > 0;
    if (null + fb != 1)
        return cli_error(ctx, "null-depth", "--null-depth -25 or --front-to-back 20",
                         null ? "give only one goal" : "a goal is needed");
    return null ? null_tolerance(ctx, a, tolerance_deg)
                : fb_tolerance(ctx, a, freq_hz, tolerance_deg);
}
