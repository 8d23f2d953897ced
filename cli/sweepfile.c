/* sweepfile.c - read an analyzer sweep named on the command line or in a
 * batch cell (shared by sweep and fault), with a one-line error naming the
 * file and line. */
#include <config.h>
#include <errno.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

int cli_sweep_load(const cli_ctx *ctx, const cli_args *a, cxl_sweep **sweep,
                   const char **path_out)
{
    static const char expected[] = "a one-port Touchstone (.s1p, .ts) or CSV sweep file, e.g. "
                                   "--file stub.s1p";
    const char *path = cli_get(a, "file", 0);
    if (!path) return cli_error(ctx, "file", expected, "no sweep file given");
    if (!path[0]) return cli_error(ctx, "file", expected, "file name is empty");
    FILE *fp = strcmp(path, "-") == 0 ? stdin : fopen(path, "rb");
    if (!fp) return cli_error(ctx, "file", expected, "cannot open '%s': %s", path, strerror(errno));
    size_t line = 0;
    char text[300] = "";
    cxl_status st = cxl_sweep_read(fp, sweep, &line, text, sizeof text);
    if (fp != stdin) fclose(fp);
    if (st == CXL_OK) {
        if (path_out) *path_out = strcmp(path, "-") == 0 ? "stdin" : path;
        return 0;
    }
    const char *name = strcmp(path, "-") == 0 ? "stdin" : path;
    if (!text[0]) snprintf(text, sizeof text, "%s (expected a readable sweep file)",
                           cxl_strerror(st));
    /* text already ends with "(expected ...)" */
    /* NAME:LINE, so that it never reads as a batch file's "line N" */
    if (line) return cli_error(ctx, "file", NULL, "%s:%zu: %s", name, line, text);
    return cli_error(ctx, "file", NULL, "%s: %s", name, text);
}

const char *cli_sweep_kind_name(cxl_sweep_kind kind)
{
    switch (kind) {
    case CXL_SWEEP_X_ZERO: return "reactance-zero";
    case CXL_SWEEP_Z_MIN: return "impedance-min";
    default: return "swr-min";
    }
}
