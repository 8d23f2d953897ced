/* band.c - amateur and broadcast band edges per ITU Region.
 *
 * The built-in table is data/bands.csv, compiled in as a string and read
 * with the library's own CSV reader, the same path a user's band file
 * takes.  A row is one segment: the general allocation of a band in one
 * Region (empty footnote) or a segment that holds only in the countries a
 * Radio Regulations footnote lists.  Edges asked for without a Region are
 * the envelope over all Regions, footnote segments included by default,
 * so a tolerance check run on them is never too lenient.
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

#define NAME_MAX_CHARS 15
#define FOOTNOTE_MAX_CHARS 15

typedef struct band_row {
    char name[NAME_MAX_CHARS + 1];          /* canonical: "160m", "mw" */
    char footnote[FOOTNOTE_MAX_CHARS + 1];  /* "" for the general allocation */
    char *source;
    cxl_service service;
    int region;
    double low_hz, high_hz;
} band_row;

struct cxl_bands {
    band_row *rows;
    size_t count, cap;
};

enum { COL_BAND, COL_SERVICE, COL_REGION, COL_LOW, COL_HIGH, COL_FOOTNOTE,
       COL_SOURCE, NCOLS };
static const char *const column_names[NCOLS] = {
    "band", "service", "region", "low_khz", "high_khz", "footnote", "source"
};

static int is_space(char c) { return c == ' ' || c == '\t'; }

/* Canonical band name: ASCII lower case, surrounding blanks dropped, and a
 * bare wavelength gets its unit ("160", "160 M" -> "160m").  Returns 0 when
 * the name is empty or too long. */
/* A bare wavelength of n bytes ("160", "160 M") as "160m" into out; 0
 * when in is not one (or too long: *bad set). */
static int wavelength_name(const char *in, size_t n, char out[NAME_MAX_CHARS + 1], int *bad)
{
    size_t digits = 0;
    while (digits < n && in[digits] >= '0' && in[digits] <= '9') digits++;
    if (digits == 0) return 0;
    size_t i = digits;
    while (i < n && is_space(in[i])) i++;
    int unit_only = (i == n) || (i + 1 == n && (in[i] == 'm' || in[i] == 'M'));
    if (!unit_only) return 0;
    if (digits + 1 > NAME_MAX_CHARS) {
        *bad = 1;
        return 0;
    }
    memcpy(out, in, digits);
    out[digits] = 'm';
    out[digits + 1] = '\0';
    return 1;
}

static int canonical_name(const char *in, char out[NAME_MAX_CHARS + 1])
{
    while (is_space(*in)) in++;
    size_t n = strlen(in);
    while (n > 0 && is_space(in[n - 1])) n--;
    int bad = 0;
    if (wavelength_name(in, n, out, &bad)) return 1;
    if (bad || n == 0 || n > NAME_MAX_CHARS) return 0;
    for (size_t k = 0; k < n; k++) {
        char c = in[k];
        out[k] = (c >= 'A' && c <= 'Z') ? (char)(c - 'A' + 'a') : c;
    }
    out[n] = '\0';
    return 1;
}

void cxl_bands_free(cxl_bands *bands)
{
    if (!bands) return;
    for (size_t i = 0; i < bands->count; i++) free(bands->rows[i].source);
    free(bands->rows);
    free(bands);
}

static cxl_status parse_khz(const char *text, double *hz)
{
    double khz;
    if (cxl_units_parse_number(text, &khz, NULL) != CXL_OK) return CXL_EPARSE;
    if (!cxl__finite_pos(khz) || !isfinite(khz * 1e3)) return CXL_EPARSE;
    *hz = khz * 1e3;
    return CXL_OK;
}

/* One data row into *row; CXL_EPARSE when a field is not valid. */
static cxl_status parse_row(const cxl_csv_reader *r, const size_t col[NCOLS],
                            band_row *row)
{
    const char *f[NCOLS];
    size_t nf = cxl_csv_reader_nfields(r);
    for (int c = 0; c < NCOLS; c++) {
        if (col[c] >= nf) return CXL_EPARSE;
        f[c] = cxl_csv_reader_field(r, col[c]);
    }
    if (!canonical_name(f[COL_BAND], row->name)) return CXL_EPARSE;
    if (strcmp(f[COL_SERVICE], "amateur") == 0) row->service = CXL_SERVICE_AMATEUR;
    else if (strcmp(f[COL_SERVICE], "broadcast") == 0) row->service = CXL_SERVICE_BROADCAST;
    else return CXL_EPARSE;
    double region;
    if (cxl_units_parse_number(f[COL_REGION], &region, NULL) != CXL_OK ||
        !(region == 1.0 || region == 2.0 || region == 3.0))
        return CXL_EPARSE;
    row->region = (int)region;
    if (parse_khz(f[COL_LOW], &row->low_hz) != CXL_OK ||
        parse_khz(f[COL_HIGH], &row->high_hz) != CXL_OK ||
        !(row->high_hz > row->low_hz))
        return CXL_EPARSE;
    if (strlen(f[COL_FOOTNOTE]) > FOOTNOTE_MAX_CHARS) return CXL_EPARSE;
    strcpy(row->footnote, f[COL_FOOTNOTE]);
    if (f[COL_SOURCE][0] == '\0') return CXL_EPARSE; /* every row names its source */
    return CXL_OK;
}

static cxl_status add_row(cxl_bands *b, const band_row *row, const char *source)
{
    if (b->count == b->cap) {
        size_t cap = b->cap ? b->cap * 2 : 64;
        band_row *p = realloc(b->rows, cap * sizeof *p);
        if (!p) return CXL_ENOMEM;
        b->rows = p;
        b->cap = cap;
    }
    size_t n = strlen(source) + 1;
    char *s = malloc(n);
    if (!s) return CXL_ENOMEM;
    memcpy(s, source, n);
    b->rows[b->count] = *row;
    b->rows[b->count].source = s;
    b->count++;
    return CXL_OK;
}

/* Header row: where each required column is (any order, extra columns
 * ignored). */
static cxl_status read_header(cxl_csv_reader *r, size_t col[NCOLS])
{
    int has_row = 0;
    cxl_status st = cxl_csv_reader_next(r, &has_row);
    if (st != CXL_OK) return st;
    if (!has_row) return CXL_EPARSE;
    for (int c = 0; c < NCOLS; c++) {
        col[c] = (size_t)-1;
        for (size_t i = 0; i < cxl_csv_reader_nfields(r); i++)
            if (strcmp(cxl_csv_reader_field(r, i), column_names[c]) == 0) col[c] = i;
        if (col[c] == (size_t)-1) return CXL_EPARSE;
    }
    return CXL_OK;
}

/* Read a whole band table: the header, then one segment per row.  On a
 * bad row *error_line (if not NULL) gets its line number. */
static cxl_status read_table(cxl_csv_reader *r, cxl_bands **out,
                             size_t *error_line)
{
    size_t col[NCOLS];
    int has_row = 0;
    cxl_bands *b = NULL;
    cxl_status st = read_header(r, col);
    if (st == CXL_OK) {
        b = calloc(1, sizeof *b);
        if (!b) return CXL_ENOMEM;
    }
    while (st == CXL_OK) {
        st = cxl_csv_reader_next(r, &has_row);
        if (st != CXL_OK || !has_row) break;
        band_row row;
        st = parse_row(r, col, &row);
        if (st == CXL_OK)
            st = add_row(b, &row, cxl_csv_reader_field(r, col[COL_SOURCE]));
    }
    if (st == CXL_OK && b->count == 0) st = CXL_EPARSE;
    if (st != CXL_OK) {
        cxl_bands_free(b);
        if (error_line && (st == CXL_EPARSE || st == CXL_ETOOLONG))
            *error_line = cxl_csv_reader_line(r);
        return st;
    }
    *out = b;
    return CXL_OK;
}

cxl_status cxl_bands_new(cxl_bands **bands)
{
    if (!bands) return CXL_EINVAL;
    cxl_csv_reader *r;
    cxl_status st = cxl_csv_reader_new_buffer(cxl__data_bands,
                                              cxl__data_bands_size, &r);
    if (st != CXL_OK) return st;
    st = read_table(r, bands, NULL);
    cxl_csv_reader_free(r);
    return st;
}

cxl_status cxl_bands_new_stream(FILE *stream, cxl_bands **bands,
                                size_t *error_line)
{
    if (!stream || !bands) return CXL_EINVAL;
    cxl_csv_reader *r;
    cxl_status st = cxl_csv_reader_new_stream(stream, &r);
    if (st != CXL_OK) return st;
    st = read_table(r, bands, error_line);
    if (st == CXL_OK && ferror(stream)) {
        cxl_bands_free(*bands);
        st = CXL_EIO;
    }
    cxl_csv_reader_free(r);
    return st;
}

size_t cxl_bands_count(const cxl_bands *bands)
{
    return bands ? bands->count : 0;
}

cxl_status cxl_bands_get(const cxl_bands *bands, size_t index,
                         const char **name, cxl_service *service,
                         int *region, double *low_hz, double *high_hz,
                         const char **footnote, const char **source)
{
    if (!bands || index >= bands->count) return CXL_EINVAL;
    const band_row *row = &bands->rows[index];
    if (name) *name = row->name;
    if (service) *service = row->service;
    if (region) *region = row->region;
    if (low_hz) *low_hz = row->low_hz;
    if (high_hz) *high_hz = row->high_hz;
    if (footnote) *footnote = row->footnote;
    if (source) *source = row->source;
    return CXL_OK;
}

cxl_status cxl_bands_name(const cxl_bands *bands, const char *band,
                          const char **name)
{
    char want[NAME_MAX_CHARS + 1];
    if (!bands || !band || !name) return CXL_EINVAL;
    if (!canonical_name(band, want)) return CXL_ENOTFOUND;
    for (size_t i = 0; i < bands->count; i++)
        if (strcmp(bands->rows[i].name, want) == 0) {
            *name = bands->rows[i].name;
            return CXL_OK;
        }
    return CXL_ENOTFOUND;
}

/* Whether a row is of band want (canonical), of the region (0: any) and,
 * unless footnotes count, without a footnote. */
static int row_counts(const band_row *row, const char *want, int region, int include_footnotes)
{
    /* first byte before strcmp: this runs once per band in every row of a
     * per-band batch (tests/bench) */
    if (row->name[0] != want[0] || strcmp(row->name, want) != 0) return 0;
    if (region != 0 && row->region != region) return 0;
    return include_footnotes || row->footnote[0] == '\0';
}

cxl_status cxl_bands_edges(const cxl_bands *bands, const char *band,
                           int region, int include_footnotes,
                           double *low_hz, double *high_hz)
{
    char want[NAME_MAX_CHARS + 1];
    if (!bands || !band || !low_hz || !high_hz) return CXL_EINVAL;
    if (region < 0 || region > 3) return CXL_ERANGE;
    if (!canonical_name(band, want)) return CXL_ENOTFOUND;
    double lo = 0.0, hi = 0.0;
    int found = 0;
    for (size_t i = 0; i < bands->count; i++) {
        const band_row *row = &bands->rows[i];
        if (!row_counts(row, want, region, include_footnotes)) continue;
        if (!found || row->low_hz < lo) lo = row->low_hz;
        if (!found || row->high_hz > hi) hi = row->high_hz;
        found = 1;
    }
    if (!found) return CXL_ENOTFOUND;
    *low_hz = lo;
    *high_hz = hi;
    return CXL_OK;
}
