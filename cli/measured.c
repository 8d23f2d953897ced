/* measured.c - pieces shared by the measured-lines commands (vf, phase,
 * pair): where a velocity factor comes from (--vf, a catalog cable, or the
 * fit a `coaxline vf --format csv` run wrote: --vf-from FILE, or - for a
 * pipe), and signed numbers for text output. */
#include <config.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

#define VF_FROM_EXPECTED "the CSV that coaxline vf --format csv writes"

/* One usable row of the file: a fit, or the only reading. */
typedef struct vf_row {
    char *label;
    double vf;
} vf_row;

typedef struct vf_file {
    char *path;     /* as given; "-" is standard input */
    int failed;     /* reported once; later rows fail quietly */
    vf_row *rows;
    size_t n, cap;
} vf_file;

static void vf_file_free(vf_file *file)
{
    if (!file) return;
    for (size_t i = 0; i < file->n; i++) free(file->rows[i].label);
    free(file->rows);
    free(file->path);
    free(file);
}

static int add_row(vf_file *f, const char *label, double vf)
{
    if (f->n == f->cap) {
        size_t cap = f->cap ? 2 * f->cap : 4;
        vf_row *p = realloc(f->rows, cap * sizeof *p);
        if (!p) return -1;
        f->rows = p;
        f->cap = cap;
    }
    f->rows[f->n].label = strdup(label);
    if (!f->rows[f->n].label) return -1;
    f->rows[f->n++].vf = vf;
    return 0;
}

static int column(const cxl_csv_reader *rd, const char *name)
{
    for (size_t i = 0; i < cxl_csv_reader_nfields(rd); i++)
        if (strcmp(cxl_csv_reader_field(rd, i), name) == 0) return (int)i;
    return -1;
}

/* Read the fitted rows (or the single reading) of a vf CSV.  Problems are
 * reported against the file, not against a batch line. */
static int load(const cli_ctx *row_ctx, vf_file *f, FILE *fp)
{
    cli_ctx top = *row_ctx;
    top.input_name = NULL;
    const cli_ctx *ctx = &top;
    cxl_csv_reader *rd;
    if (cxl_csv_reader_new_stream(fp, &rd) != CXL_OK)
        return cli_error(ctx, "vf-from", NULL, "out of memory");
    int has_row = 0, code = 0, readings = 0;
    int col_label = -1, col_res = -1, col_vf = -1;
    char single_label[256] = "", name[300];
    double single_vf = 0.0;
    size_t single_line = 0;
    if (strcmp(f->path, "-") == 0) snprintf(name, sizeof name, "standard input");
    else snprintf(name, sizeof name, "'%s'", f->path);
    errno = 0;
    cxl_status st = cxl_csv_reader_next(rd, &has_row);
    int err = errno;
    if (st != CXL_OK) goto unreadable;
    if (has_row) {
        col_label = column(rd, "label");
        col_res = column(rd, "resonance");
        col_vf = column(rd, "vf");
    }
    if (col_res < 0 || col_vf < 0) {
        code = cli_error(ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s has no resonance and vf columns", name);
        goto done;
    }
    while ((errno = 0, st = cxl_csv_reader_next(rd, &has_row)) == CXL_OK && has_row) {
        size_t nf = cxl_csv_reader_nfields(rd);
        if ((size_t)col_res >= nf || (size_t)col_vf >= nf) continue;
        const char *res = cxl_csv_reader_field(rd, (size_t)col_res);
        const char *text = cxl_csv_reader_field(rd, (size_t)col_vf);
        const char *label = col_label >= 0 && (size_t)col_label < nf
                                ? cxl_csv_reader_field(rd, (size_t)col_label) : "";
        double vf;
        int valid = cxl_units_parse_number(text, &vf, NULL) == CXL_OK && vf > 0.0 && vf <= 1.0;
        if (strcmp(res, "fit") != 0) {
            /* a reading's own VF may lie outside (0, 1] (vf flags it); it
             * matters only when it is the file's one reading */
            if (readings++ == 0) {
                snprintf(single_label, sizeof single_label, "%s", label);
                single_vf = valid ? vf : 0.0;
                single_line = cxl_csv_reader_line(rd);
            }
            continue;
        }
        if (!valid) {
            code = cli_error(ctx, "vf-from", VF_FROM_EXPECTED,
                             "%s line %zu: vf '%s' is not a velocity factor", name,
                             cxl_csv_reader_line(rd), text);
            goto done;
        }
        if (add_row(f, label, vf)) {
            code = cli_error(ctx, "vf-from", NULL, "out of memory");
            goto done;
        }
    }
    err = errno;
unreadable:
    if (st != CXL_OK) {
        /* any bad record ends the file: a VF must not come from half of it */
        cxl_status why = cxl_csv_reader_stopped(rd);
        char what[160];
        if (why == CXL_EIO)
            snprintf(what, sizeof what, "read error (%s)", err ? strerror(err) : "input/output error");
        else if (why == CXL_ETOOLONG)
            snprintf(what, sizeof what, "no line end for over %d bytes; reading stopped",
                     CXL_CSV_MAX_SKIP);
        else
            snprintf(what, sizeof what, "malformed CSV");
        code = cli_error(ctx, "vf-from", VF_FROM_EXPECTED, "%s line %zu: %s",
                         name, cxl_csv_reader_line(rd), what);
        goto done;
    }
    if (f->n == 0 && readings == 1) {
        if (!(single_vf > 0.0)) {
            code = cli_error(ctx, "vf-from", VF_FROM_EXPECTED,
                             "%s line %zu: the vf of its one reading is not a velocity factor",
                             name, single_line);
            goto done;
        }
        if (add_row(f, single_label, single_vf)) {
            code = cli_error(ctx, "vf-from", NULL, "out of memory");
            goto done;
        }
    }
    if (f->n == 0)
        code = cli_error(ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s holds no fitted row (resonance 'fit')", name);
done:
    cxl_csv_reader_free(rd);
    return code;
}

/* The file's data for path, read on first use and kept in ctx->state. */
static vf_file *open_cached(cli_ctx *ctx, const char *path)
{
    vf_file *cached = ctx->state;
    if (cached && strcmp(cached->path, path) == 0)
        return cached->failed ? NULL : cached;
    vf_file_free(cached);
    vf_file *f = ctx->state = calloc(1, sizeof *f);
    if (!f || !(f->path = strdup(path))) {
        cli_error(ctx, "vf-from", NULL, "out of memory");
        vf_file_free(f);
        ctx->state = NULL;
        return NULL;
    }
    cli_ctx top = *ctx;
    top.input_name = NULL;
    int is_stdin = strcmp(path, "-") == 0;
    if (is_stdin && ctx->input_name && strcmp(ctx->input_name, "stdin") == 0) {
        cli_error(&top, "vf-from", "--vf-from FILE when the batch comes from --input -",
                  "standard input already holds the batch");
        f->failed = 1;
        return NULL;
    }
    FILE *fp = is_stdin ? stdin : cli_open_read(&top, "vf-from", path, VF_FROM_EXPECTED, 0);
    if (!fp) {
        f->failed = 1;
        return NULL;
    }
    f->failed = load(ctx, f, fp) != 0;
    if (!is_stdin) fclose(fp);
    return f->failed ? NULL : f;
}

/* A label as it stands in the file: CSV output puts an apostrophe before
 * text a spreadsheet would take for a formula. */
static int same_label(const char *in_file, const char *label)
{
    return strcmp(in_file, label) == 0 ||
           (in_file[0] == '\'' && strcmp(in_file + 1, label) == 0);
}

static int vf_from_file(cli_ctx *ctx, const cli_args *a, const char *path, double *vf)
{
    vf_file *f = open_cached(ctx, path);
    if (!f) return CLI_EXIT_USAGE;
    if (f->n == 1) {
        *vf = f->rows[0].vf;
        return 0;
    }
    const char *label = cli_get(a, "label", 0); /* as typed, not as shown */
    if (!label) label = "";
    const vf_row *hit = NULL;
    for (size_t i = 0; i < f->n; i++) {
        if (!same_label(f->rows[i].label, label)) continue;
        if (hit)
            return cli_error(ctx, "vf-from", "one fit per label",
                             "'%s' holds more than one fit labelled '%s'", path, label);
        hit = &f->rows[i];
    }
    if (!hit)
        return cli_error(ctx, "label", "the label of one of the fits in the --vf-from file",
                         "'%s' holds %zu fits and none is labelled '%s'", path, f->n, label);
    *vf = hit->vf;
    return 0;
}

int cli_vf_source(cli_ctx *ctx, const cli_args *a, double *vf, char *from,
                  size_t from_size)
{
    const char *path = cli_get(a, "vf-from", 0);
    if (path) {
        if (cli_get(a, "vf", 0) || cli_get(a, "cable", 0))
            return cli_error(ctx, "vf-from", "one of --vf, --cable or --vf-from",
                             "--vf-from is given with --%s", cli_get(a, "vf", 0) ? "vf" : "cable");
        if (vf_from_file(ctx, a, path, vf)) return CLI_EXIT_USAGE;
        if (from) snprintf(from, from_size, "from %s", strcmp(path, "-") == 0 ? "standard input" : path);
        return 0;
    }
    const char *cable;
    if (cli_vf_or_cable(ctx, a, vf, &cable)) return CLI_EXIT_USAGE;
    if (from) snprintf(from, from_size, "%s%s", cable[0] ? "cable " : "", cable);
    return 0;
}

int cli_vf_source_end(cli_ctx *ctx)
{
    vf_file_free(ctx->state);
    ctx->state = NULL;
    return CLI_EXIT_OK;
}

const char *cli_fmt_signed(char *buf, size_t size, double value, int decimals)
{
    char num[64];
    cli_fmt(num, sizeof num, value, decimals);
    snprintf(buf, size, "%s%s", num[0] == '-' || num[0] == '?' ? "" : "+", num);
    return buf;
}
