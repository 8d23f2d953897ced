/* linelimits.c - bounds on what phase and pair accept, so that every number
 * they print (text, CSV, JSON, plot) is finite and readable: a phase error
 * of 360 f dL / (VF c) stays below about 1e14 degrees within them. */
#include <config.h>
#include <stdio.h>
#include "cli.h"

#define LENGTH_EXPECTED "a line length from 1 mm to 1000 km, such as 20.10m"

int cli_line_length_check(const cli_ctx *ctx, const char *field, const char *text,
                          double length_m)
{
    if (length_m < CLI_LINE_MIN_M)
        return cli_error(ctx, field, LENGTH_EXPECTED, "'%s' gives a line shorter than 1 mm", text);
    if (!(length_m <= CLI_LINE_MAX_M))
        return cli_error(ctx, field, LENGTH_EXPECTED, "'%s' gives a line longer than 1000 km", text);
    return 0;
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
    if (!(vf >= CLI_LINE_MIN_VF))
        return cli_error(ctx, "vf", "a velocity factor from 0.01 to 1, such as 0.66",
                         "'%s' is below 0.01", text ? text : cli_fmt(v, sizeof v, vf, 6));
    return 0;
}
