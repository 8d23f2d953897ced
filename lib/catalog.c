/* catalog.c - the cable catalog: built-in rows parsed at run time from the
 * compiled-in data/cables.csv and data/cable_loss.csv, plus user rows read
 * from files of the same formats by the same code.
 *
 * A load first parses and checks the whole file into a staging area and
 * only then appends it, so a bad row leaves the catalog as it was.  Names
 * are unique without regard to ASCII case; nothing ever replaces a row
 * that is already there.
 */
#include <config.h>
#include <math.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

#define NPROPS (CXL_CABLE_CORE_RELATIVE_PERMEABILITY + 1)
#define NAME_MAX_CHARS 64
#define TEXT_MAX_CHARS 1024

struct loss_point {
    double freq_hz, loss_db_per_m;
    char *source;
};

struct cable {
    char *name, *dielectric, *source;
    double value[NPROPS]; /* NaN when not given */
    int builtin;
    struct loss_point *points;
    size_t npoints;
};

struct cxl_catalog {
    struct cable *rows;
    size_t n, cap;
};

/* ---- column tables ----------------------------------------------------- */

enum { COL_NAME = -1, COL_DIELECTRIC = -2, COL_SOURCE = -3, COL_FREQ = -4,
       COL_LOSS = -5 };

struct column {
    const char *header;
    int prop;      /* cxl_cable_prop, or a COL_ text/loss column */
    double scale;  /* file unit to SI */
    int required;
};

static const struct column cable_columns[] = {
    {"name", COL_NAME, 1.0, 1},
    {"z0_ohm", CXL_CABLE_Z0_OHM, 1.0, 0},
    {"vf", CXL_CABLE_VF, 1.0, 1},
    {"dielectric", COL_DIELECTRIC, 1.0, 0},
    {"inner_diameter_mm", CXL_CABLE_INNER_DIAMETER_M, 1e-3, 0},
    {"dielectric_diameter_mm", CXL_CABLE_DIELECTRIC_DIAMETER_M, 1e-3, 0},
    {"relative_permittivity", CXL_CABLE_RELATIVE_PERMITTIVITY, 1.0, 0},
    {"loss_tangent", CXL_CABLE_LOSS_TANGENT, 1.0, 0},
    {"conductivity_s_per_m", CXL_CABLE_CONDUCTIVITY_S_PER_M, 1.0, 0},
    {"conductor_loss_factor", CXL_CABLE_CONDUCTOR_LOSS_FACTOR, 1.0, 0},
    {"clad_thickness_mm", CXL_CABLE_CLAD_THICKNESS_M, 1e-3, 0},
    {"core_conductivity_s_per_m", CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M, 1.0, 0},
    {"core_relative_permeability", CXL_CABLE_CORE_RELATIVE_PERMEABILITY, 1.0, 0},
    {"source", COL_SOURCE, 1.0, 0},
};
#define N_CABLE_COLUMNS (sizeof cable_columns / sizeof cable_columns[0])

static const struct column loss_columns[] = {
    {"name", COL_NAME, 1.0, 1},
    {"freq_mhz", COL_FREQ, 1e6, 1},
    {"loss_db_per_100m", COL_LOSS, 0.01, 1},
    {"source", COL_SOURCE, 1.0, 0},
};
#define N_LOSS_COLUMNS (sizeof loss_columns / sizeof loss_columns[0])
#define MAX_COLUMNS N_CABLE_COLUMNS

/* Is v a valid value of property prop (already in SI units)? */
static int prop_in_range(int prop, double v)
{
    switch (prop) {
    case CXL_CABLE_VF: return cxl__valid_vf(v);
    case CXL_CABLE_RELATIVE_PERMITTIVITY: return v >= 1.0;
    case CXL_CABLE_LOSS_TANGENT: return v >= 0.0 && v < 1.0;
    case CXL_CABLE_CORE_RELATIVE_PERMEABILITY: return v >= 1.0;
    default: return v > 0.0; /* impedances, diameters, conductivities ... */
    }
}

/* ---- error reporting --------------------------------------------------- */

struct load_ctx {
    const char *file_name;
    size_t *error_line;
    char *error_text;
    size_t error_size;
    const cxl_csv_reader *rd;  /* its separator tells how decimals are written */
};

static cxl_status report(const struct load_ctx *ctx, cxl_status st,
                         size_t line, const char *fmt, ...)
{
    if (ctx->error_line) *ctx->error_line = line;
    if (ctx->error_text && ctx->error_size > 0) {
        int n = snprintf(ctx->error_text, ctx->error_size, "%s:%zu: ",
                         ctx->file_name ? ctx->file_name : "(input)", line);
        if (n >= 0 && (size_t)n < ctx->error_size) {
            va_list ap;
            va_start(ap, fmt);
            vsnprintf(ctx->error_text + n, ctx->error_size - (size_t)n, fmt, ap);
            va_end(ap);
        }
    }
    return st;
}

/* ---- small helpers ----------------------------------------------------- */

static int name_eq(const char *a, const char *b)
{
    return cxl__ascii_ncaseeq(a, b, SIZE_MAX);
}

/* A trimmed copy of text (spaces and tabs at both ends removed). */
static char *trimmed_dup(const char *text)
{
    while (*text == ' ' || *text == '\t') text++;
    size_t n = strlen(text);
    while (n > 0 && (text[n - 1] == ' ' || text[n - 1] == '\t')) n--;
    char *p = malloc(n + 1);
    if (!p) return NULL;
    memcpy(p, text, n);
    p[n] = '\0';
    return p;
}

static int is_blank(const char *text)
{
    for (; *text; text++)
        if (*text != ' ' && *text != '\t') return 0;
    return 1;
}

static void cable_clear(struct cable *c)
{
    free(c->name);
    free(c->dielectric);
    free(c->source);
    for (size_t k = 0; k < c->npoints; k++) free(c->points[k].source);
    free(c->points);
    memset(c, 0, sizeof *c);
}

static int find_row(const struct cable *rows, size_t n, const char *name,
                    size_t *index)
{
    for (size_t i = 0; i < n; i++)
        if (name_eq(rows[i].name, name)) {
            if (index) *index = i;
            return 1;
        }
    return 0;
}

/* What went wrong with a record the reader refused: a read error and an
 * endless line stop it, anything else is the record's own fault. */
static const char *reader_problem(const cxl_csv_reader *rd, const char *own)
{
    cxl_status why = cxl_csv_reader_stopped(rd);
    if (why == CXL_EIO) return "read error";
    if (why == CXL_ETOOLONG) return "no line end for over 1 MiB; reading stopped";
    return own;
}

/* Map header fields to columns: map[i] is the column of field i. */
static cxl_status read_header(cxl_csv_reader *rd, const struct column *cols,
                              size_t ncols, size_t *map, size_t *nfields,
                              const struct load_ctx *ctx)
{
    int has_row = 0;
    cxl_status st = cxl_csv_reader_next(rd, &has_row);
    size_t line = cxl_csv_reader_line(rd);
    if (st == CXL_ENOMEM) return st;
    if (st != CXL_OK) return report(ctx, st, line, "%s", reader_problem(rd, "malformed header row"));
    if (!has_row) return report(ctx, CXL_EPARSE, line, "empty file: no header row");
    size_t n = cxl_csv_reader_nfields(rd);
    if (n > ncols)
        return report(ctx, CXL_EPARSE, line, "%zu columns, at most %zu known", n, ncols);
    int seen[MAX_COLUMNS] = {0};
    for (size_t i = 0; i < n; i++) {
        const char *h = cxl_csv_reader_field(rd, i);
        size_t c;
        for (c = 0; c < ncols; c++)
            if (strcmp(h, cols[c].header) == 0) break;
        if (c == ncols)
            return report(ctx, CXL_EPARSE, line, "unknown column: %.64s", h);
        if (seen[c])
            return report(ctx, CXL_EPARSE, line, "column %s given twice", h);
        seen[c] = 1;
        map[i] = c;
    }
    for (size_t c = 0; c < ncols; c++)
        if (cols[c].required && !seen[c])
            return report(ctx, CXL_EPARSE, line, "missing column %s", cols[c].header);
    *nfields = n;
    return CXL_OK;
}

/* Next data record with the header's field count; *has_row 0 at the end. */
static cxl_status next_record(cxl_csv_reader *rd, size_t nfields, int *has_row,
                              const struct load_ctx *ctx)
{
    cxl_status st = cxl_csv_reader_next(rd, has_row);
    size_t line = cxl_csv_reader_line(rd);
    if (st == CXL_ENOMEM) return st;
    if (st == CXL_ETOOLONG && cxl_csv_reader_stopped(rd) == CXL_OK)
        return report(ctx, st, line, "record too long");
    if (st != CXL_OK) return report(ctx, st, line, "%s", reader_problem(rd, "malformed CSV record"));
    if (*has_row && cxl_csv_reader_nfields(rd) != nfields)
        return report(ctx, CXL_EPARSE, line, "%zu fields, the header has %zu",
                      cxl_csv_reader_nfields(rd), nfields);
    return CXL_OK;
}

/* Longest numeric cell read with a decimal comma (longer: not a number). */
#define NUMBER_CELL_MAX 128

/* Parse a numeric cell into SI units and check its range. */
static cxl_status parse_cell(const char *text, const struct column *col,
                             size_t line, double *value,
                             const struct load_ctx *ctx)
{
    double v;
    char comma[NUMBER_CELL_MAX];
    if (cxl_csv_reader_separator(ctx->rd) == ';' && text[0]) {
        /* a ';' file is a spreadsheet's of a decimal-comma locale: 0,66 */
        if (strchr(text, '.'))
            return report(ctx, CXL_EPARSE, line,
                          "column %s: '%.64s' has a '.', but this ';'-separated file "
                          "writes decimals with a comma, such as 0,66",
                          col->header, text);
        size_t len = strlen(text);
        if (len < sizeof comma) {
            memcpy(comma, text, len + 1);
            char *p = strchr(comma, ',');
            if (p) *p = '.';
            text = comma;
        }
    }
    cxl_status st = cxl_units_parse_number(text, &v, NULL);
    if (st != CXL_OK)
        return report(ctx, st == CXL_ERANGE ? CXL_ERANGE : CXL_EPARSE, line,
                      "column %s: not a number: %.64s", col->header, text);
    v *= col->scale; /* 1e305 MHz is finite, but not in Hz */
    if (!isfinite(v) || (col->prop >= 0 ? !prop_in_range(col->prop, v) : !(v > 0.0)))
        return report(ctx, CXL_ERANGE, line, "column %s: out of range: %.64s",
                      col->header, text);
    *value = v;
    return CXL_OK;
}

static cxl_status copy_text(const char *text, size_t line, const char *header,
                            size_t limit, char **out, const struct load_ctx *ctx)
{
    if (strlen(text) > limit)
        return report(ctx, CXL_ETOOLONG, line, "column %s: longer than %zu bytes",
                      header, limit);
    *out = trimmed_dup(text);
    return *out ? CXL_OK : CXL_ENOMEM;
}

static int grow(void **p, size_t *cap, size_t need, size_t size)
{
    if (need <= *cap) return 1;
    size_t c = *cap ? *cap * 2 : 16;
    while (c < need) c *= 2;
    void *q = realloc(*p, c * size);
    if (!q) return 0;
    *p = q;
    *cap = c;
    return 1;
}

/* ---- cables ------------------------------------------------------------ */

/* The reader's current row, where it comes from and how its fields map
 * to columns: what every row parser reads. */
struct row_in {
    const cxl_catalog *cat;
    cxl_csv_reader *rd;
    const size_t *map;
    size_t nfields;
    int builtin;
    const struct load_ctx *ctx;
};

/* The fields of one cable record into *c, each as its column reads it. */
static cxl_status read_cable_fields(const struct row_in *in, size_t line, struct cable *c)
{
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < in->nfields && st == CXL_OK; i++) {
        const struct column *col = &cable_columns[in->map[i]];
        const char *text = cxl_csv_reader_field(in->rd, i);
        if (col->prop == COL_NAME)
            st = copy_text(text, line, col->header, NAME_MAX_CHARS, &c->name, in->ctx);
        else if (col->prop == COL_DIELECTRIC)
            st = copy_text(text, line, col->header, NAME_MAX_CHARS, &c->dielectric, in->ctx);
        else if (col->prop == COL_SOURCE)
            st = copy_text(text, line, col->header, TEXT_MAX_CHARS, &c->source, in->ctx);
        else if (!is_blank(text))
            st = parse_cell(text, col, line, &c->value[col->prop], in->ctx);
    }
    return st;
}

/* A clad centre needs all three of its values, and a cladding thinner
 * than the centre's radius. */
static cxl_status check_clad(const struct cable *c, size_t line, const struct load_ctx *ctx)
{
    int nclad = !isnan(c->value[CXL_CABLE_CLAD_THICKNESS_M]) +
                !isnan(c->value[CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M]) +
                !isnan(c->value[CXL_CABLE_CORE_RELATIVE_PERMEABILITY]);
    if (nclad != 0 && nclad != 3) {
        const char *miss = isnan(c->value[CXL_CABLE_CLAD_THICKNESS_M]) ? "clad_thickness_mm"
                         : isnan(c->value[CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M])
                             ? "core_conductivity_s_per_m" : "core_relative_permeability";
        return report(ctx, CXL_EPARSE, line, "column %s: missing value (clad centre)", miss);
    }
    double d_in = c->value[CXL_CABLE_INNER_DIAMETER_M];
    if (nclad == 3 && !isnan(d_in) &&
        !(2.0 * c->value[CXL_CABLE_CLAD_THICKNESS_M] < d_in))
        return report(ctx, CXL_ERANGE, line,
                      "column clad_thickness_mm: not smaller than the centre radius");
    return CXL_OK;
}

/* One cable record into *c (fields already checked for count). */
static cxl_status parse_cable(const struct row_in *in, struct cable *c)
{
    size_t line = cxl_csv_reader_line(in->rd);
    const struct load_ctx *ctx = in->ctx;
    for (size_t p = 0; p < NPROPS; p++) c->value[p] = NAN;
    c->builtin = in->builtin;
    cxl_status st = read_cable_fields(in, line, c);
    if (st != CXL_OK) return st;
    if (!c->dielectric && !(c->dielectric = trimmed_dup(""))) return CXL_ENOMEM;
    if (!c->source && !(c->source = trimmed_dup(""))) return CXL_ENOMEM;
    if (c->name[0] == '\0')
        return report(ctx, CXL_EPARSE, line, "column name: missing value");
    if (isnan(c->value[CXL_CABLE_VF]))
        return report(ctx, CXL_EPARSE, line, "column vf: missing value");
    if (in->builtin && c->source[0] == '\0')
        return report(ctx, CXL_EPARSE, line, "column source: missing value");
    double d_in = c->value[CXL_CABLE_INNER_DIAMETER_M];
    double d_diel = c->value[CXL_CABLE_DIELECTRIC_DIAMETER_M];
    if (!isnan(d_in) && !isnan(d_diel) && !(d_in < d_diel))
        return report(ctx, CXL_ERANGE, line,
                      "column inner_diameter_mm: not smaller than dielectric_diameter_mm");
    return check_clad(c, line, ctx);
}

/* One staged record: parse the reader's current row into slot; staged
 * holds the n records before it. */
typedef cxl_status (*row_parser)(const struct row_in *in, void *slot, const void *staged,
                                 size_t n);

/* Read the header and every record into a growing array of elem_size
 * records (*staged, *n), zeroed before parsing, until the end or the first
 * error.  The caller commits or frees what was staged. */
static cxl_status stage_rows(const struct row_in *in_header, const struct column *cols,
                             size_t ncols, size_t elem_size, row_parser parse,
                             void **staged, size_t *n)
{
    size_t map[MAX_COLUMNS], nfields = 0, cap = 0;
    const struct load_ctx *ctx = in_header->ctx;
    cxl_status st = read_header(in_header->rd, cols, ncols, map, &nfields, ctx);
    struct row_in in = *in_header;
    in.map = map;
    in.nfields = nfields;
    while (st == CXL_OK) {
        int has_row = 0;
        st = next_record(in.rd, nfields, &has_row, ctx);
        if (st != CXL_OK || !has_row) break;
        if (!grow(staged, &cap, *n + 1, elem_size)) return CXL_ENOMEM;
        char *slot = (char *)*staged + *n * elem_size;
        memset(slot, 0, elem_size);
        (*n)++;
        st = parse(&in, slot, *staged, *n - 1);
    }
    return st;
}

static cxl_status cable_row(const struct row_in *in, void *slot, const void *staged, size_t n)
{
    struct cable *c = slot;
    cxl_status st = parse_cable(in, c);
    if (st != CXL_OK) return st;
    size_t line = cxl_csv_reader_line(in->rd);
    if (find_row(in->cat->rows, in->cat->n, c->name, NULL))
        return report(in->ctx, CXL_EDUPLICATE, line,
                      "column name: %s is already in the catalog (give this cable its own name)",
                      c->name);
    if (find_row(staged, n, c->name, NULL))
        return report(in->ctx, CXL_EDUPLICATE, line, "column name: %s appears twice", c->name);
    return CXL_OK;
}

static cxl_status load_cables(cxl_catalog *cat, cxl_csv_reader *rd, int builtin,
                              const struct load_ctx *ctx)
{
    void *buf = NULL;
    size_t n = 0;
    struct row_in in = {cat, rd, NULL, 0, builtin, ctx};
    cxl_status st = stage_rows(&in, cable_columns, N_CABLE_COLUMNS, sizeof(struct cable),
                               cable_row, &buf, &n);
    struct cable *staged = buf;
    if (st == CXL_OK && !grow((void **)&cat->rows, &cat->cap, cat->n + n, sizeof *cat->rows))
        st = CXL_ENOMEM;
    if (st == CXL_OK) {
        if (n > 0) /* a header without rows stages nothing: staged is NULL */
            memcpy(cat->rows + cat->n, staged, n * sizeof *staged);
        cat->n += n;
    } else {
        for (size_t i = 0; i < n; i++) cable_clear(&staged[i]);
    }
    free(staged);
    return st;
}

/* ---- loss points ------------------------------------------------------- */

struct staged_point {
    size_t row;
    struct loss_point pt;
    size_t line;
};

static int point_cmp(const void *x, const void *y)
{
    const struct loss_point *a = x, *b = y;
    return (a->freq_hz > b->freq_hz) - (a->freq_hz < b->freq_hz);
}

/* Append the staged points to their cables, keeping each table sorted. */
static cxl_status commit_points(cxl_catalog *cat, struct staged_point *sp, size_t n)
{
    /* grow every touched table first, so a failure changes nothing */
    for (size_t r = 0; r < cat->n; r++) {
        size_t add = 0;
        for (size_t k = 0; k < n; k++) add += sp[k].row == r;
        if (add == 0) continue;
        struct cable *c = &cat->rows[r];
        struct loss_point *p = realloc(c->points, (c->npoints + add) * sizeof *p);
        if (!p) return CXL_ENOMEM;
        c->points = p;
    }
    for (size_t k = 0; k < n; k++) {
        struct cable *c = &cat->rows[sp[k].row];
        c->points[c->npoints++] = sp[k].pt;
        sp[k].pt.source = NULL; /* now owned by the cable */
    }
    for (size_t r = 0; r < cat->n; r++)
        if (cat->rows[r].npoints > 1) /* qsort's pointer must not be NULL */
            qsort(cat->rows[r].points, cat->rows[r].npoints, sizeof(struct loss_point), point_cmp);
    return CXL_OK;
}

/* The fields of one loss point: *name is its cable's name as written,
 * *freq and *loss the numbers, sp->pt.source its source. */
static cxl_status read_point_fields(const struct row_in *in, size_t line, const char **name,
                                    double *freq, double *loss, struct staged_point *sp)
{
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < in->nfields && st == CXL_OK; i++) {
        const struct column *col = &loss_columns[in->map[i]];
        const char *text = cxl_csv_reader_field(in->rd, i);
        if (col->prop == COL_NAME) *name = text;
        else if (col->prop == COL_SOURCE)
            st = copy_text(text, line, col->header, TEXT_MAX_CHARS, &sp->pt.source, in->ctx);
        else if (is_blank(text))
            st = report(in->ctx, CXL_EPARSE, line, "column %s: missing value", col->header);
        else
            st = parse_cell(text, col, line, col->prop == COL_FREQ ? freq : loss, in->ctx);
    }
    return st;
}

/* The cable a loss point names, into sp->row: it must exist, and a user
 * table may not add to a built-in cable's. */
static cxl_status point_cable(const struct row_in *in, size_t line, const char *name,
                              struct staged_point *sp)
{
    char *trimmed = trimmed_dup(name);
    if (!trimmed) return CXL_ENOMEM;
    cxl_status st = CXL_OK;
    int found = trimmed[0] != '\0' && find_row(in->cat->rows, in->cat->n, trimmed, &sp->row);
    if (trimmed[0] == '\0')
        st = report(in->ctx, CXL_EPARSE, line, "column name: missing value");
    else if (!found)
        st = report(in->ctx, CXL_ENOTFOUND, line, "column name: no cable named %s", trimmed);
    else if (!in->builtin && in->cat->rows[sp->row].builtin)
        st = report(in->ctx, CXL_EDUPLICATE, line,
                    "column name: %s is built in and has its own table; add a user cable", trimmed);
    free(trimmed);
    return st;
}

static cxl_status parse_point(const struct row_in *in, struct staged_point *sp)
{
    size_t line = cxl_csv_reader_line(in->rd);
    const char *name = NULL;
    double freq = NAN, loss = NAN;
    sp->line = line;
    cxl_status st = read_point_fields(in, line, &name, &freq, &loss, sp);
    if (st != CXL_OK) return st;
    if (!sp->pt.source && !(sp->pt.source = trimmed_dup(""))) return CXL_ENOMEM;
    if (in->builtin && sp->pt.source[0] == '\0')
        return report(in->ctx, CXL_EPARSE, line, "column source: missing value");
    st = point_cable(in, line, name, sp);
    sp->pt.freq_hz = freq;
    sp->pt.loss_db_per_m = loss;
    return st;
}

static cxl_status point_row(const struct row_in *in, void *slot, const void *staged, size_t n)
{
    struct staged_point *sp = slot;
    const struct staged_point *before = staged;
    cxl_status st = parse_point(in, sp);
    if (st != CXL_OK) return st;
    const struct cable *c = &in->cat->rows[sp->row];
    int dup = 0;
    for (size_t k = 0; k < c->npoints; k++) dup |= c->points[k].freq_hz == sp->pt.freq_hz;
    for (size_t k = 0; k < n; k++)
        dup |= before[k].row == sp->row && before[k].pt.freq_hz == sp->pt.freq_hz;
    if (dup)
        return report(in->ctx, CXL_EDUPLICATE, sp->line,
                      "column freq_mhz: %s already has a point at this frequency", c->name);
    return CXL_OK;
}

static cxl_status load_loss(cxl_catalog *cat, cxl_csv_reader *rd, int builtin,
                            const struct load_ctx *ctx)
{
    void *buf = NULL;
    size_t n = 0;
    struct row_in in = {cat, rd, NULL, 0, builtin, ctx};
    cxl_status st = stage_rows(&in, loss_columns, N_LOSS_COLUMNS, sizeof(struct staged_point),
                               point_row, &buf, &n);
    struct staged_point *staged = buf;
    if (st == CXL_OK) st = commit_points(cat, staged, n);
    for (size_t k = 0; k < n; k++) free(staged[k].pt.source);
    free(staged);
    return st;
}

/* ---- public API -------------------------------------------------------- */

static cxl_status load_builtin(cxl_catalog *cat, const char *text, size_t size,
                               const char *name, int cables)
{
    cxl_csv_reader *rd;
    cxl_status st = cxl_csv_reader_new_buffer(text, size, &rd);
    if (st != CXL_OK) return st;
    struct load_ctx ctx = {name, NULL, NULL, 0, rd};
    st = cables ? load_cables(cat, rd, 1, &ctx) : load_loss(cat, rd, 1, &ctx);
    cxl_csv_reader_free(rd);
    return st;
}

cxl_status cxl_catalog_new(cxl_catalog **catalog)
{
    if (!catalog) return CXL_EINVAL;
    cxl_catalog *cat = calloc(1, sizeof *cat);
    if (!cat) return CXL_ENOMEM;
    cxl_status st = load_builtin(cat, cxl__data_cables, cxl__data_cables_size,
                                 "cables.csv", 1);
    if (st == CXL_OK)
        st = load_builtin(cat, cxl__data_cable_loss, cxl__data_cable_loss_size,
                          "cable_loss.csv", 0);
    if (st != CXL_OK) {
        cxl_catalog_free(cat);
        return st;
    }
    *catalog = cat;
    return CXL_OK;
}

void cxl_catalog_free(cxl_catalog *catalog)
{
    if (!catalog) return;
    for (size_t i = 0; i < catalog->n; i++) cable_clear(&catalog->rows[i]);
    free(catalog->rows);
    free(catalog);
}

static cxl_status load_stream(cxl_catalog *cat, FILE *stream, const char *file_name,
                              size_t *error_line, char *error_text,
                              size_t error_size, int cables)
{
    if (!cat || !stream) return CXL_EINVAL;
    if (error_text && error_size > 0) error_text[0] = '\0';
    cxl_csv_reader *rd;
    cxl_status st = cxl_csv_reader_new_stream(stream, &rd);
    if (st != CXL_OK) return st;
    /* a user's file may come from a spreadsheet: ',' ';' or TAB, from
     * its header */
    cxl_csv_reader_set_separator(rd, 0);
    struct load_ctx ctx = {file_name, error_line, error_text, error_size, rd};
    st = cables ? load_cables(cat, rd, 0, &ctx) : load_loss(cat, rd, 0, &ctx);
    if (st == CXL_OK && ferror(stream))
        st = report(&ctx, CXL_EIO, cxl_csv_reader_line(rd), "read error");
    cxl_csv_reader_free(rd);
    return st;
}

cxl_status cxl_catalog_load_cables(cxl_catalog *catalog, FILE *stream,
                                   const char *file_name, size_t *error_line,
                                   char *error_text, size_t error_size)
{
    return load_stream(catalog, stream, file_name, error_line, error_text,
                       error_size, 1);
}

cxl_status cxl_catalog_load_loss(cxl_catalog *catalog, FILE *stream,
                                 const char *file_name, size_t *error_line,
                                 char *error_text, size_t error_size)
{
    return load_stream(catalog, stream, file_name, error_line, error_text,
                       error_size, 0);
}

size_t cxl_catalog_count(const cxl_catalog *catalog)
{
    return catalog ? catalog->n : 0;
}

cxl_status cxl_catalog_find(const cxl_catalog *catalog, const char *name,
                            size_t *index)
{
    if (!catalog || !name || !index) return CXL_EINVAL;
    return find_row(catalog->rows, catalog->n, name, index) ? CXL_OK : CXL_ENOTFOUND;
}

/* The row at index in *row; out is the caller's out-parameter. */
static cxl_status row_at(const cxl_catalog *cat, size_t index, const void *out,
                         const struct cable **row)
{
    if (!cat || !out) return CXL_EINVAL;
    if (index >= cat->n) return CXL_ERANGE;
    *row = &cat->rows[index];
    return CXL_OK;
}

enum { TEXT_NAME, TEXT_DIELECTRIC, TEXT_SOURCE };

static cxl_status get_text(const cxl_catalog *catalog, size_t index, int which,
                           const char **text)
{
    const struct cable *c;
    cxl_status st = row_at(catalog, index, text, &c);
    if (st != CXL_OK) return st;
    *text = which == TEXT_NAME ? c->name : which == TEXT_DIELECTRIC ? c->dielectric
                                                                     : c->source;
    return CXL_OK;
}

cxl_status cxl_catalog_name(const cxl_catalog *catalog, size_t index,
                            const char **name)
{
    return get_text(catalog, index, TEXT_NAME, name);
}

cxl_status cxl_catalog_dielectric(const cxl_catalog *catalog, size_t index,
                                  const char **dielectric)
{
    return get_text(catalog, index, TEXT_DIELECTRIC, dielectric);
}

cxl_status cxl_catalog_source(const cxl_catalog *catalog, size_t index,
                              const char **source)
{
    return get_text(catalog, index, TEXT_SOURCE, source);
}

cxl_status cxl_catalog_is_builtin(const cxl_catalog *catalog, size_t index,
                                  int *builtin)
{
    const struct cable *c;
    cxl_status st = row_at(catalog, index, builtin, &c);
    if (st != CXL_OK) return st;
    *builtin = c->builtin;
    return CXL_OK;
}

cxl_status cxl_catalog_value(const cxl_catalog *catalog, size_t index,
                             cxl_cable_prop prop, double *value)
{
    const struct cable *c;
    cxl_status st = row_at(catalog, index, value, &c);
    if (st != CXL_OK) return st;
    if ((int)prop < 0 || (int)prop >= NPROPS) return CXL_EINVAL;
    double v = c->value[prop];
    if (isnan(v) && prop == CXL_CABLE_CONDUCTIVITY_S_PER_M)
        v = CXL_COPPER_CONDUCTIVITY_S_PER_M;
    if (isnan(v) && prop == CXL_CABLE_CONDUCTOR_LOSS_FACTOR)
        v = 1.0;
    if (isnan(v)) return CXL_ENOTFOUND;
    *value = v;
    return CXL_OK;
}

size_t cxl_catalog_loss_count(const cxl_catalog *catalog, size_t index)
{
    size_t count = 0;
    const struct cable *c;
    if (row_at(catalog, index, &count, &c) != CXL_OK) return 0;
    return c->npoints;
}

cxl_status cxl_catalog_loss_point(const cxl_catalog *catalog, size_t index,
                                  size_t point, double *freq_hz,
                                  double *loss_db_per_m, const char **source)
{
    const struct cable *c;
    cxl_status st = row_at(catalog, index, freq_hz, &c);
    if (st != CXL_OK) return st;
    if (!loss_db_per_m) return CXL_EINVAL;
    if (point >= c->npoints) return CXL_ERANGE;
    *freq_hz = c->points[point].freq_hz;
    *loss_db_per_m = c->points[point].loss_db_per_m;
    if (source) *source = c->points[point].source;
    return CXL_OK;
}
