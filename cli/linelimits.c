/* linelimits.c - a line of cable and its velocity factor as phase, pair
 * and loss take them, by the rows CLI_BOUND_LINE and CLI_BOUND_VF of
 * cli_bounds (bounds.c). */
#include <config.h>
#include <stdio.h>
#include "cli.h"

int cli_line_length_check(const cli_ctx *ctx, const char *field, const char *text,
                          double length_m)
{
    const cli_bound *b = &cli_bounds[CLI_BOUND_LINE];
    if (length_m >= b->min && length_m <= b->max) return 0;
    char range[96], expected[160];
    snprintf(expected, sizeof expected, "a line length %s, such as 20.10m",
             cli_bound_range(range, sizeof range, CLI_BOUND_LINE));
    return cli_error(ctx, field, expected, "'%s' gives a line %s %s", text,
                     length_m < b->min ? "shorter than" : "longer than",
                     length_m < b->min ? b->min_text : b->max_text);
}

int cli_line_length(const cli_ctx *ctx, const char *field, const char *text,
                    double *length_m)
{
    double v;
    if (cli_length(ctx, field, text, CLI_POSITIVE, &v) ||
        cli_line_length_check(ctx, field, text, v))
        return CLI_EXIT_USAGE;
    *length_m = v;
    return 0;
}

int cli_line_freq_items(const cli_ctx *ctx, const cli_args *a)
{
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    double f;
    int n = cli_items(ctx, a, "freq", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (n < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < n; i++)
        if (cli_freq(ctx, "freq", items[i], &f)) return CLI_EXIT_USAGE;
    return 0;
}

int cli_line_vf_check(const cli_ctx *ctx, const cli_args *a, double vf)
{
    char v[64];
    const char *text = cli_get(a, "vf", 0);
    if (!(vf >= CLI_MIN_VF))
        return cli_error(ctx, "vf", "a velocity factor from 0.01 to 1, such as 0.66",
                         "'%s' is below %s", text ? text : cli_fmt(v, sizeof v, vf, 6),
                         cli_bounds[CLI_BOUND_VF].min_text);
    return 0;
}
