/* csv.c - RFC 4180 reader and writer.
 *
 * The reader keeps one record buffer and one field-offset array that grow
 * to the largest record seen and are then reused, so reading a stream of
 * any length allocates nothing per row.  It is lenient where spreadsheets
 * are (byte-order mark, CRLF or LF, blank lines, a quote inside an unquoted
 * field) and strict where data would be lost (a quote never closed, text
 * after a closing quote, a NUL byte, a record over the size limit): such a
 * record is reported and skipped to its end (quotes still count, so a
 * line inside a rejected quoted cell never becomes a row of its own), and
 * reading goes on with the next one.  A read error, or a rejected record
 * that runs on without end, stops the reader for good.
 */
#include <config.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

#define CHUNK 65536

struct cxl_csv_reader {
    FILE *stream;              /* NULL for a buffer reader */
    cxl_status stopped;        /* CXL_OK while reading can go on */
    int read_failed;           /* the stream reported an error: no more reads */
    int sep;                   /* field separator; 0 until the first record sets it */
    int bom;                   /* the input began with a byte-order mark */
    const char *data;          /* current chunk */
    size_t size, pos;
    char *chunk;               /* owned chunk buffer for a stream */
    int at_start;              /* BOM check pending */
    size_t line;               /* physical line of the next byte */
    size_t row_line;           /* line where the current record began */
    char *rec;                 /* NUL-separated fields */
    size_t rec_len, rec_cap;
    size_t *offs;
    size_t nfields, offs_cap;
};

static cxl_status reader_alloc(cxl_csv_reader **out, cxl_csv_reader **r)
{
    if (!out) return CXL_EINVAL;
    *r = calloc(1, sizeof **r);
    if (!*r) return CXL_ENOMEM;
    (*r)->at_start = 1;
    (*r)->line = 1;
    (*r)->sep = ',';
    return CXL_OK;
}

cxl_status cxl_csv_reader_new_stream(FILE *stream, cxl_csv_reader **reader)
{
    cxl_csv_reader *r;
    if (!stream) return CXL_EINVAL;
    cxl_status st = reader_alloc(reader, &r);
    if (st != CXL_OK) return st;
    r->chunk = malloc(CHUNK);
    if (!r->chunk) { free(r); return CXL_ENOMEM; }
    r->stream = stream;
    r->data = r->chunk;
    *reader = r;
    return CXL_OK;
}

cxl_status cxl_csv_reader_new_buffer(const char *text, size_t size,
                                     cxl_csv_reader **reader)
{
    cxl_csv_reader *r;
    if (!text && size > 0) return CXL_EINVAL;
    cxl_status st = reader_alloc(reader, &r);
    if (st != CXL_OK) return st;
    r->data = text ? text : "";
    r->size = size;
    *reader = r;
    return CXL_OK;
}

void cxl_csv_reader_free(cxl_csv_reader *r)
{
    if (!r) return;
    free(r->chunk);
    free(r->rec);
    free(r->offs);
    free(r);
}

/* Next byte or -1 at end of input or once reading has stopped (a read
 * error sets r->read_failed; the bytes read before it are still
 * delivered). */
static int get_byte(cxl_csv_reader *r)
{
    if (r->pos >= r->size) {
        if (!r->stream || r->read_failed || r->stopped != CXL_OK) return -1;
        r->size = fread(r->chunk, 1, CHUNK, r->stream);
        r->pos = 0;
        if (ferror(r->stream)) r->read_failed = 1;
        if (r->size == 0) return -1;
    }
    return (unsigned char)r->data[r->pos++];
}

static int peek_byte(cxl_csv_reader *r)
{
    int c = get_byte(r);
    if (c >= 0) r->pos--; /* the byte stays in the current chunk */
    return c;
}

static int push_char(cxl_csv_reader *r, char c)
{
    if (r->rec_len + 1 >= r->rec_cap) {
        size_t cap = r->rec_cap ? r->rec_cap * 2 : 256;
        if (cap > CXL_CSV_MAX_RECORD + 2) cap = CXL_CSV_MAX_RECORD + 2;
        if (r->rec_len + 1 >= cap) return 0;
        char *p = realloc(r->rec, cap);
        if (!p) return -1;
        r->rec = p;
        r->rec_cap = cap;
    }
    r->rec[r->rec_len++] = c;
    return 1;
}

static int end_field(cxl_csv_reader *r)
{
    if (r->nfields + 1 >= r->offs_cap) {
        size_t cap = r->offs_cap ? r->offs_cap * 2 : 16;
        size_t *p = realloc(r->offs, cap * sizeof *p);
        if (!p) return -1;
        r->offs = p;
        r->offs_cap = cap;
    }
    int ok = push_char(r, '\0');
    if (ok <= 0) return ok;
    r->nfields++;
    r->offs[r->nfields] = r->rec_len;
    return 1;
}

enum { FIELD_START, UNQUOTED, QUOTED, QUOTE_END };

/* The parser state after byte c of a quoted cell, while skipping: a
 * doubled quote stays inside, a lone one closes the cell. */
static int skip_quoted_byte(cxl_csv_reader *r, int c)
{
    if (c == '"') {
        if (peek_byte(r) != '"') return QUOTE_END;
        get_byte(r);
    } else if (c == '\n' || (c == '\r' && peek_byte(r) != '\n')) {
        r->line++;
    }
    return QUOTED;
}

/* Discard the rest of a rejected record, from parser state `state` on:
 * quotes keep their meaning, so a line break inside a quoted cell does
 * not end the record and no line of the cell's text is taken for a row.
 * After a closing quote, text up to the next separator is read as
 * unquoted.  A remainder longer than CXL_CSV_MAX_SKIP bytes (an endless
 * stream with no line end, such as /dev/zero) stops the reader. */
static void skip_record(cxl_csv_reader *r, int state)
{
    int c;
    size_t n = 0;
    while ((c = get_byte(r)) >= 0) {
        if (++n > CXL_CSV_MAX_SKIP) {
            if (r->stopped == CXL_OK) r->stopped = CXL_ETOOLONG;
            return;
        }
        if (state == QUOTED) {
            state = skip_quoted_byte(r, c);
        } else if (c == '\n' || c == '\r') {
            if (c == '\r' && peek_byte(r) == '\n') get_byte(r);
            r->line++;
            return;
        } else if (c == r->sep) {
            state = FIELD_START;
        } else if (c == '"' && state == FIELD_START) {
            state = QUOTED;
        } else {
            state = UNQUOTED;
        }
    }
}

/* A record rejected with status st: skip its rest and report st (or the
 * reason reading stopped, if it stopped on the way). */
static cxl_status reject(cxl_csv_reader *r, int state, cxl_status st)
{
    skip_record(r, state);
    if (r->read_failed && r->stopped == CXL_OK) r->stopped = CXL_EIO;
    return r->stopped != CXL_OK ? r->stopped : st;
}

/* Skips a byte-order mark at the very start; only a whole BOM is
 * skipped, anything else is data. */
static void skip_bom(cxl_csv_reader *r)
{
    r->at_start = 0;
    if (peek_byte(r) == 0xEF && r->pos + 3 <= r->size &&
        (unsigned char)r->data[r->pos + 1] == 0xBB &&
        (unsigned char)r->data[r->pos + 2] == 0xBF) {
        r->pos += 3;
        r->bom = 1;
    }
}

/* Empties the record buffer for a new record; 0 when out of memory. */
static int begin_record(cxl_csv_reader *r)
{
    r->rec_len = 0;
    r->nfields = 0;
    if (!r->offs) {
        r->offs = malloc(16 * sizeof *r->offs);
        if (!r->offs) return 0;
        r->offs_cap = 16;
    }
    r->offs[0] = 0;
    r->row_line = r->line;
    return 1;
}

/* Byte c of a quoted cell: a doubled quote is one quote, a lone one
 * closes the cell.  Returns as push_char does. */
static int quoted_byte(cxl_csv_reader *r, int c, int *state)
{
    if (c != '"') {
        if (c == '\n' || (c == '\r' && peek_byte(r) != '\n')) r->line++;
        return push_char(r, (char)c);
    }
    if (peek_byte(r) == '"') {
        get_byte(r);
        return push_char(r, '"');
    }
    *state = QUOTE_END;
    return 1;
}

/* Whether c separates cells: the separator, or while detecting it (no
 * separator yet) any of ',' ';' and TAB. */
static int is_separator(const cxl_csv_reader *r, int c)
{
    return c == r->sep || (r->sep == 0 && (c == ',' || c == ';' || c == '\t'));
}

/* Byte c (not NUL, not the end) of a record in parser state *state.
 * Returns 1 to read on, 0 at the record's line end, -1 with *st set when
 * the record is rejected or memory runs out. */
static int record_byte(cxl_csv_reader *r, int c, int *state, cxl_status *st)
{
    int ok = 1;
    if (*state == QUOTED) {
        ok = quoted_byte(r, c, state);
    } else if (is_separator(r, c)) {
        r->sep = c; /* the first record's first separator, when detecting */
        ok = end_field(r);
        *state = FIELD_START;
    } else if (c == '\n' || c == '\r') {
        if (c == '\r' && peek_byte(r) == '\n') get_byte(r);
        r->line++;
        return 0;
    } else if (*state == QUOTE_END) {
        *st = reject(r, UNQUOTED, CXL_EPARSE);
        return -1;
    } else if (c == '"' && *state == FIELD_START) {
        *state = QUOTED;
    } else {
        *state = UNQUOTED;
        ok = push_char(r, (char)c);
    }
    if (ok < 0) *st = CXL_ENOMEM;
    else if (ok == 0) *st = reject(r, *state, CXL_ETOOLONG);
    return ok > 0 ? 1 : -1;
}

/* Reads one record's bytes up to its line end or the end of input.
 * *any says whether there was a byte at all; *state is the parser state
 * at the end. */
static cxl_status read_record(cxl_csv_reader *r, int *state, int *any)
{
    *state = FIELD_START;
    *any = 0;
    for (;;) {
        int c = get_byte(r);
        if (c == 0) return reject(r, *state, CXL_EPARSE);
        if (c < 0) {
            /* a read error: the record so far is not a row */
            if (r->read_failed) return r->stopped = CXL_EIO;
            return *state == QUOTED ? CXL_EPARSE : CXL_OK;
        }
        *any = 1;
        cxl_status st = CXL_OK;
        int go = record_byte(r, c, state, &st);
        if (go <= 0) return st;
    }
}

cxl_status cxl_csv_reader_next(cxl_csv_reader *r, int *has_row)
{
    if (!r || !has_row) return CXL_EINVAL;
    if (r->stopped != CXL_OK) return r->stopped;
    if (r->at_start) skip_bom(r);
    for (;;) {
        int state, any;
        if (!begin_record(r)) return CXL_ENOMEM;
        cxl_status st = read_record(r, &state, &any);
        if (st != CXL_OK) return st;
        if (!any) { *has_row = 0; return CXL_OK; } /* end of input */
        int ok = end_field(r);
        if (ok < 0) return CXL_ENOMEM;
        if (ok == 0) return CXL_ETOOLONG;
        if (r->nfields == 1 && r->rec_len == 1 && state == FIELD_START)
            continue; /* blank line */
        if (r->sep == 0) r->sep = ','; /* a first record of one column */
        *has_row = 1;
        return CXL_OK;
    }
}

cxl_status cxl_csv_reader_stopped(const cxl_csv_reader *r)
{
    return r ? r->stopped : CXL_EINVAL;
}

cxl_status cxl_csv_reader_set_separator(cxl_csv_reader *r, int separator)
{
    if (!r) return CXL_EINVAL;
    if (separator != 0 && separator != ',' && separator != ';' && separator != '\t')
        return CXL_EINVAL;
    if (!r->at_start) return CXL_EINVAL; /* only before the first record */
    r->sep = separator;
    return CXL_OK;
}

int cxl_csv_reader_separator(const cxl_csv_reader *r)
{
    return r ? r->sep : 0;
}

int cxl_csv_reader_bom(const cxl_csv_reader *r)
{
    return r ? r->bom : 0;
}

size_t cxl_csv_reader_nfields(const cxl_csv_reader *r)
{
    return r ? r->nfields : 0;
}

const char *cxl_csv_reader_field(const cxl_csv_reader *r, size_t i)
{
    if (!r || i >= r->nfields) return NULL;
    return r->rec + r->offs[i];
}

size_t cxl_csv_reader_line(const cxl_csv_reader *r)
{
    return r ? r->row_line : 0;
}

/* Text a spreadsheet could run as a formula: = + - @ first, after any
 * blanks, or first in a piece after a ';' or TAB (a spreadsheet whose
 * list separator is ';' splits the cell there). */
static int formula_like(const char *text)
{
    for (const char *p = text; p; p = strpbrk(p, ";\t"), p = p ? p + 1 : NULL) {
        while (*p == ' ' || *p == '\t') p++;
        if (*p && strchr("=+-@", *p)) return 1;
    }
    return 0;
}

/* Whether text needs a leading apostrophe so that no spreadsheet runs
 * it as a formula. */
static int needs_apostrophe(const char *text)
{
    if (text[0] == '\t' || text[0] == '\r') return 1;
    if (!formula_like(text)) return 0;
    double v;
    /* a plain number such as -3.5 stays a number */
    return !(cxl_units_parse_number(text, &v, NULL) == CXL_OK &&
             text[strlen(text) - 1] != ' ');
}

cxl_status cxl_csv_write_field(FILE *stream, const char *text, int neutralise)
{
    if (!stream || !text) return CXL_EINVAL;
    int risky = neutralise && needs_apostrophe(text);
    /* ';' and TAB are quoted too, so no spreadsheet splits the cell */
    int quote = strpbrk(text, ",\"\r\n;\t") != NULL;
    if (quote && putc('"', stream) == EOF) return CXL_EIO;
    if (risky && putc('\'', stream) == EOF) return CXL_EIO;
    for (const char *p = text; *p; p++) {
        if (*p == '"' && quote && putc('"', stream) == EOF) return CXL_EIO;
        if (putc(*p, stream) == EOF) return CXL_EIO;
    }
    if (quote && putc('"', stream) == EOF) return CXL_EIO;
    return CXL_OK;
}
