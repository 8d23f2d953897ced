/* measured.c - pieces shared by the measured-lines commands (vf, phase,
 * pair): where a velocity factor comes from (--vf, a catalog cable, or the
 * fit a `coaxline vf --format csv` run wrote: --vf-from FILE, or - for a
 * pipe), and signed numbers for text output. */
#include <config.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

#define VF_FROM_EXPECTED "the CSV that coaxline vf --format csv writes"

/* One usable row of the file: a fit, the only reading, or a VF at a
 * frequency (at_hz > 0: a row `coaxline vf --at F` wrote). */
typedef struct vf_row {
    char *label;
    double vf, at_hz;
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

static int add_row(vf_file *f, const char *label, double vf, double at_hz)
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
    f->rows[f->n].at_hz = at_hz;
    f->rows[f->n++].vf = vf;
    return 0;
}

/* A number cell of the file; a ';' file (a decimal-comma spreadsheet's
 * export) writes 0,66 and never a '.'. */
static int number(const cxl_csv_reader *rd, const char *text, double *v)
{
    char buf[128];
    if (cxl_csv_reader_separator(rd) == ';') {
        size_t len = strlen(text);
        if (strchr(text, '.') || len >= sizeof buf) return -1;
        memcpy(buf, text, len + 1);
        char *p = strchr(buf, ',');
        if (p) *p = '.';
        text = buf;
    }
    return cxl_units_parse_number(text, v, NULL) == CXL_OK ? 0 : -1;
}

static int column(const cxl_csv_reader *rd, const char *name)
{
    for (size_t i = 0; i < cxl_csv_reader_nfields(rd); i++)
        if (strcmp(cxl_csv_reader_field(rd, i), name) == 0) return (int)i;
    return -1;
}

/* One read of a vf CSV: its reader, the columns its header names, and the
 * file's first reading, which stands for the fit when it is the only one. */
typedef struct vf_load {
    const cli_ctx *ctx;
    vf_file *f;
    cxl_csv_reader *rd;
    const char *name;   /* the file as messages name it */
    int col_label, col_res, col_vf, col_at, col_vf_at;
    int readings;
    char single_label[256];
    double single_vf;
    size_t single_line;
} vf_load;

/* The cell of column col in the current record, "" when it is missing. */
static const char *cell(const vf_load *ld, int col)
{
    return col >= 0 && (size_t)col < cxl_csv_reader_nfields(ld->rd)
               ? cxl_csv_reader_field(ld->rd, (size_t)col) : "";
}

static int keep_row(const vf_load *ld, const char *label, double vf, double at_hz)
{
    if (add_row(ld->f, label, vf, at_hz))
        return cli_error(ld->ctx, "vf-from", NULL, "out of memory");
    return 0;
}

/* An 'at' row, the VF at a frequency: both cells must hold numbers. */
static int at_row(const vf_load *ld, const char *label)
{
    double at_mhz = 0.0, vf;
    if (number(ld->rd, cell(ld, ld->col_at), &at_mhz) != 0 || !(at_mhz > 0.0) ||
        !(at_mhz * 1e6 <= CLI_MAX_FREQ_HZ) ||
        number(ld->rd, cell(ld, ld->col_vf_at), &vf) != 0 || !(vf > 0.0 && vf <= 1.0))
        return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s line %zu: an 'at' row needs at_freq_mhz and vf_at numbers",
                         ld->name, cxl_csv_reader_line(ld->rd));
    return keep_row(ld, label, vf, at_mhz * 1e6);
}

/* One record after the header: a fit, an 'at' row or a reading. */
static int data_row(vf_load *ld)
{
    size_t nf = cxl_csv_reader_nfields(ld->rd);
    if ((size_t)ld->col_res >= nf || (size_t)ld->col_vf >= nf) return 0;
    const char *res = cell(ld, ld->col_res), *text = cell(ld, ld->col_vf);
    const char *label = cell(ld, ld->col_label);
    if (strcmp(res, "at") == 0) return at_row(ld, label);
    double vf;
    int valid = number(ld->rd, text, &vf) == 0 && vf > 0.0 && vf <= 1.0;
    if (strcmp(res, "fit") != 0) {
        /* a reading's own VF may lie outside (0, 1] (vf flags it); it
         * matters only when it is the file's one reading */
        if (ld->readings++ == 0) {
            snprintf(ld->single_label, sizeof ld->single_label, "%s", label);
            ld->single_vf = valid ? vf : 0.0;
            ld->single_line = cxl_csv_reader_line(ld->rd);
        }
        return 0;
    }
    if (!valid)
        return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s line %zu: vf '%s' is not a velocity factor", ld->name,
                         cxl_csv_reader_line(ld->rd), text);
    return keep_row(ld, label, vf, 0.0);
}

/* The reader stopped on a bad record: any bad record ends the file, as a
 * VF must not come from half of it. */
static int unreadable(const vf_load *ld, int err)
{
    cxl_status why = cxl_csv_reader_stopped(ld->rd);
    char what[160];
    if (why == CXL_EIO)
        snprintf(what, sizeof what, "read error (%s)", err ? strerror(err) : "input/output error");
    else if (why == CXL_ETOOLONG)
        snprintf(what, sizeof what, "no line end for over %d bytes; reading stopped",
                 CXL_CSV_MAX_SKIP);
    else
        snprintf(what, sizeof what, "malformed CSV");
    return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED, "%s line %zu: %s",
                     ld->name, cxl_csv_reader_line(ld->rd), what);
}

static size_t count_fits(const vf_file *f)
{
    size_t fits = 0;
    for (size_t i = 0; i < f->n; i++) fits += f->rows[i].at_hz == 0.0;
    return fits;
}

/* The whole file read: a file of one reading and no fit stands for its
 * reading's VF; otherwise it needs a fit. */
static int finish(const vf_load *ld)
{
    if (count_fits(ld->f) == 0 && ld->readings == 1) {
        if (!(ld->single_vf > 0.0))
            return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED,
                             "%s line %zu: the vf of its one reading is not a velocity factor",
                             ld->name, ld->single_line);
        if (keep_row(ld, ld->single_label, ld->single_vf, 0.0)) return CLI_EXIT_USAGE;
    }
    if (count_fits(ld->f) == 0)
        return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s holds no fitted row (resonance 'fit')", ld->name);
    return 0;
}

/* The header's columns; resonance and vf must be there. */
static int header(vf_load *ld, int has_row)
{
    if (has_row) {
        ld->col_label = column(ld->rd, "label");
        ld->col_res = column(ld->rd, "resonance");
        ld->col_vf = column(ld->rd, "vf");
        ld->col_at = column(ld->rd, "at_freq_mhz");
        ld->col_vf_at = column(ld->rd, "vf_at");
    }
    if (ld->col_res < 0 || ld->col_vf < 0)
        return cli_error(ld->ctx, "vf-from", VF_FROM_EXPECTED,
                         "%s has no resonance and vf columns", ld->name);
    return 0;
}

/* Read the fitted rows (or the single reading) of a vf CSV.  Problems are
 * reported against the file, not against a batch line. */
static int load(const cli_ctx *row_ctx, vf_file *f, FILE *fp)
{
    cli_ctx top = *row_ctx;
    top.input_name = NULL;
    char name[300];
    vf_load ld = { .ctx = &top, .f = f, .name = name, .col_label = -1, .col_res = -1,
                   .col_vf = -1, .col_at = -1, .col_vf_at = -1 };
    if (cxl_csv_reader_new_stream(fp, &ld.rd) != CXL_OK)
        return cli_error(&top, "vf-from", NULL, "out of memory");
    cxl_csv_reader_set_separator(ld.rd, 0); /* ',' ';' or TAB, from the header */
    if (strcmp(f->path, "-") == 0) snprintf(name, sizeof name, "standard input");
    else snprintf(name, sizeof name, "'%s'", f->path);
    int has_row = 0, code = 0;
    errno = 0;
    cxl_status st = cxl_csv_reader_next(ld.rd, &has_row);
    if (st == CXL_OK) {
        code = header(&ld, has_row);
        while (!code && (errno = 0, st = cxl_csv_reader_next(ld.rd, &has_row)) == CXL_OK &&
               has_row)
            code = data_row(&ld);
    }
    if (!code) code = st != CXL_OK ? unreadable(&ld, errno) : finish(&ld);
    cxl_csv_reader_free(ld.rd);
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

/* The file's fit for this row's label: the only one, or the one whose
 * label matches. */
static int pick_fit(cli_ctx *ctx, const cli_args *a, const vf_file *f, const char *path,
                    const vf_row **fit)
{
    size_t fits = 0;
    const vf_row *only = NULL, *hit = NULL;
    const char *label = cli_get_if(a, "label"); /* as typed, not as shown */
    if (!label) label = "";
    for (size_t i = 0; i < f->n; i++) {
        if (f->rows[i].at_hz != 0.0) continue;
        fits++;
        only = &f->rows[i];
        if (!same_label(f->rows[i].label, label)) continue;
        if (hit)
            return cli_error(ctx, "vf-from", "one fit per label",
                             "'%s' holds more than one fit labelled '%s'", path, label);
        hit = &f->rows[i];
    }
    if (fits == 1) hit = only;
    if (!hit)
        return cli_error(ctx, "label", "the label of one of the fits in the --vf-from file",
                         "'%s' holds %zu fits and none is labelled '%s'", path, fits, label);
    *fit = hit;
    return 0;
}

/* Relative distance within which an 'at' row counts as written for the
 * command's frequency (common practice, no source: the drift over 1 % of
 * frequency is far below any VF's uncertainty). */
#define AT_MATCH 0.01

/* The 'at' rows of the same label as the fit: how many, the first, and in
 * *at the one nearest freq_hz within AT_MATCH (the only one when freq_hz
 * is 0), or NULL. */
static size_t pick_at(const vf_file *f, const vf_row *fit, double freq_hz, const vf_row **at,
                      const vf_row **first)
{
    size_t nat = 0;
    for (size_t i = 0; i < f->n; i++) {
        const vf_row *r = &f->rows[i];
        if (r->at_hz == 0.0 || strcmp(r->label, fit->label) != 0) continue;
        if (!nat++) *first = r;
        if (freq_hz > 0.0 && fabs(r->at_hz / freq_hz - 1.0) <= AT_MATCH &&
            (!*at || fabs(r->at_hz - freq_hz) < fabs((*at)->at_hz - freq_hz)))
            *at = r;
    }
    if (freq_hz == 0.0 && nat == 1) *at = *first;
    return nat;
}

static int vf_from_file(cli_ctx *ctx, const cli_args *a, const char *path, double freq_hz,
                        double *vf, double *at_hz)
{
    vf_file *f = open_cached(ctx, path);
    const vf_row *fit = NULL, *at = NULL, *first = NULL;
    if (!f || pick_fit(ctx, a, f, path, &fit)) return CLI_EXIT_USAGE;
    size_t nat = pick_at(f, fit, freq_hz, &at, &first);
    if (nat && !at) {
        char b1[48], b2[48];
        return cli_error(ctx, "vf-from", "a file from coaxline vf --at at this command's frequency",
                         "'%s' holds the VF at %s MHz%s, not at %s MHz", path,
                         cli_fmt(b1, sizeof b1, first->at_hz / 1e6, 4), nat > 1 ? " and others" : "",
                         freq_hz > 0.0 ? cli_fmt(b2, sizeof b2, freq_hz / 1e6, 4) : "?");
    }
    *vf = at ? at->vf : fit->vf;
    *at_hz = at ? at->at_hz : 0.0;
    return 0;
}

int cli_vf_source_at(cli_ctx *ctx, const cli_args *a, double freq_hz, double *vf, char *from,
                     size_t from_size)
{
    const char *path = cli_get(a, "vf-from", 0);
    if (path) {
        double at_hz = 0.0;
        char b1[48];
        if (cli_get(a, "vf", 0) || cli_get(a, "cable", 0))
            return cli_error(ctx, "vf-from", "one of --vf, --cable or --vf-from",
                             "--vf-from is given with --%s", cli_get(a, "vf", 0) ? "vf" : "cable");
        if (vf_from_file(ctx, a, path, freq_hz, vf, &at_hz)) return CLI_EXIT_USAGE;
        if (*vf < CLI_MIN_VF) /* the same floor as --vf (cli_bounds) */
            return cli_error(ctx, "vf-from", "a file whose VF is 0.01 or more",
                             "'%s' gives a velocity factor below %s", path,
                             cli_bounds[CLI_BOUND_VF].min_text);
        if (from)
            snprintf(from, from_size, "from %s%s%s%s", strcmp(path, "-") == 0 ? "standard input" : path,
                     at_hz > 0.0 ? ", the VF at " : "",
                     at_hz > 0.0 ? cli_fmt(b1, sizeof b1, at_hz / 1e6, 4) : "",
                     at_hz > 0.0 ? " MHz" : "");
        return 0;
    }
    const char *cable;
    if (cli_vf_or_cable(ctx, a, vf, &cable)) return CLI_EXIT_USAGE;
    if (from) snprintf(from, from_size, "%s%s", cable[0] ? "cable " : "", cable);
    return 0;
}

int cli_vf_source(cli_ctx *ctx, const cli_args *a, double *vf, char *from,
                  size_t from_size)
{
    return cli_vf_source_at(ctx, a, 0.0, vf, from, from_size);
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

int cli_reading_kind(cli_ctx *ctx, const cli_args *a, int have_model, cxl_dip_kind *kind,
                     double *ref_ohm, const char **name)
{
    static const char expected[] = "zero-x, min-z or min-swr";
    const char *t = cli_get(a, "reading", 0), *z = cli_get(a, "analyzer-z0", 0);
    *kind = CXL_DIP_ZERO_X;
    *ref_ohm = 50.0;
    *name = "zero-x";
    if (t) {
        if (strcmp(t, "zero-x") == 0) *kind = CXL_DIP_ZERO_X;
        else if (strcmp(t, "min-z") == 0) *kind = CXL_DIP_MIN_Z;
        else if (strcmp(t, "min-swr") == 0) *kind = CXL_DIP_MIN_SWR;
        else return cli_error(ctx, "reading", expected, "unknown kind of reading '%s'", t);
        *name = t;
    }
    if (z) {
        if (*kind != CXL_DIP_MIN_SWR)
            return cli_error(ctx, "analyzer-z0", "--reading min-swr --analyzer-z0 50",
                             "given without --reading min-swr");
        if (cli_bounded(ctx, "analyzer-z0", z, CLI_BOUND_ANALYZER_Z0, "an impedance in ohm such as 50 or 75",
                       ref_ohm))
            return CLI_EXIT_USAGE;
    }
    /* a minimum of |Z| or SWR lies off the reactance zero by an amount
     * only the line model knows */
    if (*kind != CXL_DIP_ZERO_X && !have_model)
        return cli_error(ctx, "reading", "--reading min-z with --cable NAME (the line model places the dip)",
                         "--reading %s needs --cable to correct the readings", *name);
    return 0;
}
