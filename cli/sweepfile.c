/* sweepfile.c - read an analyzer sweep named on the command line or in a
 * batch cell (shared by sweep and fault, and by vf and trim with --sweep),
 * with a one-line error naming the file and line; the resonances of a
 * sweep as the readings of vf and trim. */
#include <config.h>
#include <errno.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

int cli_sweep_load(const cli_ctx *ctx, const cli_args *a, cxl_sweep **sweep,
                   const char **path_out)
{
    return cli_sweep_load_field(ctx, "file", cli_get(a, "file", 0), sweep, path_out);
}

int cli_sweep_load_field(const cli_ctx *ctx, const char *field, const char *path,
                         cxl_sweep **sweep, const char **path_out)
{
    char expected[160];
    snprintf(expected, sizeof expected, "a one-port Touchstone (.s1p, .ts) or CSV sweep file, "
             "e.g. --%s stub.s1p", field);
    if (!path) return cli_error(ctx, field, expected, "no sweep file given");
    if (!path[0]) return cli_error(ctx, field, expected, "file name is empty");
    FILE *fp = strcmp(path, "-") == 0 ? stdin : fopen(path, "rb");
    if (!fp) return cli_error(ctx, field, expected, "cannot open '%s': %s", path, strerror(errno));
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
    if (line) return cli_error(ctx, field, NULL, "%s:%zu: %s", name, line, text);
    return cli_error(ctx, field, NULL, "%s: %s", name, text);
}

/* The sweep kind that gives a reading of this kind. */
static cxl_sweep_kind kind_of_reading(cxl_dip_kind kind)
{
    return kind == CXL_DIP_MIN_Z ? CXL_SWEEP_Z_MIN
           : kind == CXL_DIP_MIN_SWR ? CXL_SWEEP_SWR_MIN : CXL_SWEEP_X_ZERO;
}

/* An swr column holds neither reactance nor |Z|, and is tied to the
 * analyzer's own reference. */
static int refuse_swr_column(const cli_ctx *ctx, const char *name, cxl_sweep_kind sk,
                             double ref, double file_ref)
{
    if (sk != CXL_SWEEP_SWR_MIN)
        return cli_error(ctx, "sweep", "--reading min-swr for a file with only an swr column",
                         "%s holds no reactance (an swr column)", name);
    if (ref != file_ref)
        return cli_error(ctx, "analyzer-z0", "the file's own reference for an swr column",
                         "%s: an swr column cannot be moved to another reference", name);
    return 0;
}

/* The series resonances of one kind, all of them. */
static size_t count_series(const cxl_sweep_res *r, cxl_sweep_kind sk)
{
    size_t all = 0;
    for (size_t i = 0; i < cxl_sweep_res_count(r); i++) {
        cxl_sweep_kind ki;
        int series;
        cxl_sweep_res_get(r, i, &ki, &series, NULL, NULL, NULL, NULL);
        if (ki == sk && series) all++;
    }
    return all;
}

/* The readings of kind sk, at most max: none, or more than max (counted,
 * so that they are refused, not cut short), is an error. */
static int take_readings(const cli_ctx *ctx, const char *name, const cxl_sweep_res *r,
                         cxl_sweep_kind sk, double *freq_hz, int *order, int max, int *n)
{
    size_t k = 0;
    cxl_sweep_res_readings(r, sk, freq_hz, order, (size_t)max, &k);
    size_t all = count_series(r, sk);
    *n = (int)k;
    if (k == 0)
        return cli_error(ctx, "sweep", "a sweep over at least one series resonance of the line",
                         "%s shows no %s series resonance", name, cli_sweep_kind_name(sk));
    if (all > (size_t)max)
        return cli_error(ctx, "sweep", "a sweep over fewer resonances (narrow it to the lowest)",
                         "%s shows %zu %s series resonances; at most %d are taken", name, all,
                         cli_sweep_kind_name(sk), max);
    return 0;
}

int cli_sweep_readings(const cli_ctx *ctx, const char *path, cxl_dip_kind kind, double ref_ohm,
                       cxl_stub_end end, double *freq_hz, int *order, int max, int *n,
                       double *step_hz)
{
    cxl_sweep *s = NULL;
    const char *name;
    if (cli_sweep_load_field(ctx, "sweep", path, &s, &name)) return CLI_EXIT_USAGE;
    double start, stop, file_ref;
    int has_phase;
    cxl_sweep_info(s, &start, &stop, &file_ref, NULL, &has_phase);
    size_t points = cxl_sweep_count(s);
    cxl_sweep_kind sk = kind_of_reading(kind);
    /* the SWR is against the analyzer's reference; a reactance zero or a
     * |Z| minimum is the same against any */
    double ref = kind == CXL_DIP_MIN_SWR ? ref_ohm : file_ref;
    int rc = has_phase ? 0 : refuse_swr_column(ctx, name, sk, ref, file_ref);
    cxl_sweep_res *r = NULL;
    if (!rc) {
        cxl_status st = cxl_sweep_resonances(s, ref, end, 0.0, 0.0, &r);
        if (st != CXL_OK) rc = cli_error(ctx, "sweep", NULL, "%s: %s", name, cxl_strerror(st));
    }
    if (!rc) {
        rc = take_readings(ctx, name, r, sk, freq_hz, order, max, n);
        *step_hz = points > 1 ? (stop - start) / (double)(points - 1) : 0.0;
    }
    cxl_sweep_res_free(r);
    cxl_sweep_free(s);
    return rc ? CLI_EXIT_USAGE : 0;
}

const char *cli_sweep_kind_name(cxl_sweep_kind kind)
{
    switch (kind) {
    case CXL_SWEEP_X_ZERO: return "reactance-zero";
    case CXL_SWEEP_Z_MIN: return "impedance-min";
    default: return "swr-min";
    }
}
