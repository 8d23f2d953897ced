/* sweep.c - one-port analyzer sweeps: Touchstone 1.0/2.0 and CSV in,
 * Z(f) and Gamma(f) against any reference, resonances by interpolation.
 *
 * Everything is stored as the reflection coefficient against the file's
 * reference R (finite even for an open circuit); another reference R' is
 * reached without going through an infinite Z:
 *   Gamma' = ((1 + G) R - (1 - G) R') / ((1 + G) R + (1 - G) R').
 * Pozar, Microwave Engineering, 4th ed., sec. 2.3 (Gamma = (Z - Z0)/(Z + Z0)). */
#include <config.h>
#include <complex.h>
#include <float.h>
#include <stdint.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

struct cxl_sweep {
    size_t n, cap;
    double *freq;     /* Hz */
    double *gre, *gim; /* Gamma against ref */
    double ref;
    cxl_sweep_source source;
    int has_phase;
};

/* ---- lines ------------------------------------------------------------ */

typedef struct reader {
    FILE *fp;
    const char *buf;
    size_t size, pos;
    size_t line;
    char text[CXL_SWEEP_MAX_LINE + 2];
    size_t *error_line;
    char *error_text;
    size_t error_size;
} reader;

static cxl_status fail_at(reader *r, size_t line, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));

#include <stdarg.h>
static cxl_status fail_at(reader *r, size_t line, const char *fmt, ...)
{
    if (r->error_line) *r->error_line = line;
    if (r->error_text && r->error_size > 0) {
        va_list ap;
        va_start(ap, fmt);
        vsnprintf(r->error_text, r->error_size, fmt, ap);
        va_end(ap);
    }
    return CXL_EPARSE;
}

static int next_byte(reader *r)
{
    if (r->fp) return getc(r->fp);
    if (r->pos >= r->size) return EOF;
    return (unsigned char)r->buf[r->pos++];
}

/* Next line into r->text without its end of line; 0 at end of input, 1 for
 * a line, or a negative status after fail_at. */
/* A read error: the status and its message. */
static int read_failed(reader *r, cxl_status *st)
{
    *st = CXL_EIO;
    if (r->error_line) *r->error_line = r->line;
    if (r->error_text && r->error_size) snprintf(r->error_text, r->error_size,
                                                 "read error (expected a readable file)");
    return -1;
}

/* After a CR: CR LF or a lone CR ends the line; the byte after a lone CR
 * is put back for the next line. */
static void end_at_cr(reader *r)
{
    int c = next_byte(r);
    if (c != '\n' && c != EOF) {
        if (r->fp) ungetc(c, r->fp);
        else r->pos--;
    }
}

/* Whether byte c may stand at offset len of a line; else 0 after fail_at. */
static int line_byte_ok(reader *r, int c, size_t len, cxl_status *st)
{
    if ((c < 0x20 && c != '\t') || c == 0x7f) {
        *st = fail_at(r, r->line, "binary data, byte 0x%02x (expected a text file)", c);
        return 0;
    }
    if (len >= CXL_SWEEP_MAX_LINE) {
        *st = fail_at(r, r->line, "line longer than %d bytes (expected a text sweep file)",
                      CXL_SWEEP_MAX_LINE);
        return 0;
    }
    return 1;
}

static int read_line(reader *r, cxl_status *st)
{
    size_t len = 0;
    int c = next_byte(r);
    if (c == EOF) return r->fp && ferror(r->fp) ? read_failed(r, st) : 0;
    r->line++;
    while (c != EOF && c != '\n') {
        if (c == '\r') {
            end_at_cr(r);
            break;
        }
        if (!line_byte_ok(r, c, len, st)) return -1;
        r->text[len++] = (char)c;
        c = next_byte(r);
    }
    r->text[len] = '\0';
    /* a UTF-8 byte-order mark before the first line */
    if (r->line == 1 && (unsigned char)r->text[0] == 0xef &&
        (unsigned char)r->text[1] == 0xbb && (unsigned char)r->text[2] == 0xbf)
        memmove(r->text, r->text + 3, len - 2);
    return 1;
}

/* ---- storage ---------------------------------------------------------- */

static cxl_status add_point(cxl_sweep *s, double f, double gre, double gim)
{
    if (s->n == s->cap) {
        size_t cap = s->cap ? 2 * s->cap : 256;
        double *a = realloc(s->freq, cap * sizeof *a);
        if (!a) return CXL_ENOMEM;
        s->freq = a;
        a = realloc(s->gre, cap * sizeof *a);
        if (!a) return CXL_ENOMEM;
        s->gre = a;
        a = realloc(s->gim, cap * sizeof *a);
        if (!a) return CXL_ENOMEM;
        s->gim = a;
        s->cap = cap;
    }
    s->freq[s->n] = f;
    s->gre[s->n] = gre;
    s->gim[s->n] = gim;
    s->n++;
    return CXL_OK;
}

void cxl_sweep_free(cxl_sweep *sweep)
{
    if (!sweep) return;
    free(sweep->freq);
    free(sweep->gre);
    free(sweep->gim);
    free(sweep);
}

/* ---- tokens ----------------------------------------------------------- */

static int is_space(char c) { return c == ' ' || c == '\t'; }

/* Split s in place on spaces/tabs (sep 0) or on commas; up to max tokens.
 * Returns the count (max + 1 when there are more). */
/* split() on spaces and tabs. */
static size_t split_blanks(char *s, char **tok, size_t max)
{
    size_t n = 0;
    char *p = s;
    for (;;) {
        while (is_space(*p)) p++;
        if (!*p) break;
        if (n == max) return max + 1;
        tok[n++] = p;
        while (*p && !is_space(*p)) p++;
        if (*p) *p++ = '\0';
    }
    return n;
}

/* One cell from start to its end (a NUL written there): blanks around it
 * and one pair of enclosing double quotes taken off. */
static char *cell_text(char *start, char *end)
{
    *end = '\0';
    while (is_space(*start)) start++;
    while (end > start && is_space(end[-1])) *--end = '\0';
    if (end - start >= 2 && *start == '"' && end[-1] == '"') {
        end[-1] = '\0';
        start++;
    }
    return start;
}

static size_t split(char *s, char sep, char **tok, size_t max)
{
    if (!sep) return split_blanks(s, tok, max);
    size_t n = 0;
    char *p = s;
    for (;;) {
        if (n == max) return max + 1;
        char *start = p;
        while (*p && *p != sep) p++;
        int last = *p == '\0';
        tok[n++] = cell_text(start, p);
        if (last) break;
        p++;
    }
    return n;
}

static int caseeq(const char *a, const char *b)
{
    size_t n = strlen(b);
    return strlen(a) == n && cxl__ascii_ncaseeq(a, b, n);
}

/* A finite number, or fail_at naming what. */
static cxl_status number(reader *r, const char *tok, const char *what, double *v)
{
    double x;
    cxl_status st = cxl_units_parse_number(tok, &x, NULL);
    if (st != CXL_OK || !isfinite(x))
        return fail_at(r, r->line, "%s: '%.40s' is not a finite number (expected e.g. 1.5e6)",
                       what, tok);
    *v = x;
    return CXL_OK;
}

/* ---- conversion ------------------------------------------------------- */

typedef enum { P_S, P_Z, P_Y } param_kind;
typedef enum { F_RI, F_MA, F_DB } value_format;

static double complex pair_value(value_format fmt, double a, double b)
{
    if (fmt == F_RI) return a + I * b;
    double mag = fmt == F_MA ? a : pow(10.0, a / 20.0);
    double rad = b * (M_PI / 180.0);
    return mag * cos(rad) + I * mag * sin(rad);
}

/* Store a point; z or y normalised to the reference. */
static cxl_status store(reader *r, cxl_sweep *s, double f, param_kind pk, double complex v)
{
    double complex g;
    if (pk == P_S) g = v;
    else if (pk == P_Z) g = (v - 1.0) / (v + 1.0);
    else g = (1.0 - v) / (1.0 + v);
    if (!isfinite(creal(g)) || !isfinite(cimag(g)))
        return fail_at(r, r->line, "the value gives no finite reflection coefficient "
                                   "(expected a one-port other than a negative of the reference)");
    if (s->n > 0 && !(f > s->freq[s->n - 1]))
        return fail_at(r, r->line, "frequency %.9g Hz is not above the previous %.9g Hz "
                                   "(expected increasing frequencies)", f, s->freq[s->n - 1]);
    cxl_status st = add_point(s, f, creal(g), cimag(g));
    if (st != CXL_OK) {
        if (r->error_line) *r->error_line = r->line;
        if (r->error_text && r->error_size)
            snprintf(r->error_text, r->error_size, "out of memory (expected a smaller sweep)");
    }
    return st;
}

/* ---- Touchstone ------------------------------------------------------- */

typedef struct tsopt {
    double mult;
    param_kind pk;
    value_format fmt;
    double ref;
} tsopt;

/* A unit, parameter or format word of the option line into o; 0 when t
 * is none of them. */
static int option_word(const char *t, tsopt *o)
{
    if (caseeq(t, "hz")) o->mult = 1.0;
    else if (caseeq(t, "khz")) o->mult = 1e3;
    else if (caseeq(t, "mhz")) o->mult = 1e6;
    else if (caseeq(t, "ghz")) o->mult = 1e9;
    else if (caseeq(t, "s")) o->pk = P_S;
    else if (caseeq(t, "z")) o->pk = P_Z;
    else if (caseeq(t, "y")) o->pk = P_Y;
    else if (caseeq(t, "ri")) o->fmt = F_RI;
    else if (caseeq(t, "ma")) o->fmt = F_MA;
    else if (caseeq(t, "db")) o->fmt = F_DB;
    else return 0;
    return 1;
}

/* The value after R on the option line (tok[*i] is the R). */
static cxl_status option_ref(reader *r, char **tok, size_t n, size_t *i, tsopt *o)
{
    if (*i + 1 >= n) return fail_at(r, r->line, "R without a value (expected R 50)");
    double v = 0.0;
    cxl_status st = number(r, tok[++*i], "reference R", &v);
    if (st != CXL_OK) return st;
    if (!(v > 0.0)) return fail_at(r, r->line, "reference R must be above 0 (expected R 50)");
    o->ref = v;
    return CXL_OK;
}

static cxl_status option_line(reader *r, char *text, tsopt *o)
{
    char *tok[16];
    size_t n = split(text + 1, 0, tok, 15);
    if (n > 15) return fail_at(r, r->line, "option line too long (expected # MHz S RI R 50)");
    for (size_t i = 0; i < n; i++) {
        const char *t = tok[i];
        if (option_word(t, o)) continue;
        if (caseeq(t, "g") || caseeq(t, "h"))
            return fail_at(r, r->line, "%s parameters describe a two-port "
                                       "(expected a one-port file: S, Z or Y)", t);
        if (!caseeq(t, "r"))
            return fail_at(r, r->line, "unknown option '%.20s' (expected # Hz|kHz|MHz|GHz "
                                       "S|Z|Y RI|MA|DB R n)", t);
        cxl_status st = option_ref(r, tok, n, &i, o);
        if (st != CXL_OK) return st;
    }
    return CXL_OK;
}

static cxl_status data_line(reader *r, cxl_sweep *s, char *text, const tsopt *o,
                            int version2)
{
    char *tok[4];
    size_t n = split(text, 0, tok, 3);
    if (n != 3) {
        if (n > 3)
            return fail_at(r, r->line, "more than 3 numbers on a data line: a file of more than "
                                       "one port? (expected frequency and one value pair)");
        return fail_at(r, r->line, "%zu number%s on a data line (expected frequency and one "
                                   "value pair)", n, n == 1 ? "" : "s");
    }
    double f = 0.0, a = 0.0, b = 0.0;
    cxl_status st = number(r, tok[0], "frequency", &f);
    if (st == CXL_OK) st = number(r, tok[1], "first value", &a);
    if (st == CXL_OK) st = number(r, tok[2], "second value", &b);
    if (st != CXL_OK) return st;
    f *= o->mult;
    if (!(f >= 0.0) || !isfinite(f))
        return fail_at(r, r->line, "frequency below 0 (expected 0 or more)");
    double complex v = pair_value(o->fmt, a, b);
    if (version2) {
        /* 2.0: Z in ohms and Y in siemens, not normalised */
        if (o->pk == P_Z) v /= o->ref;
        else if (o->pk == P_Y) v *= o->ref;
    }
    return store(r, s, f, o->pk, v);
}

/* Keyword at the start of text: its name (lower case compare) and the
 * rest of the line after ']'. */
static int keyword(char *text, const char *name, char **rest)
{
    size_t n = strlen(name);
    if (!cxl__ascii_ncaseeq(text, name, n)) return 0;
    *rest = text + n;
    return 1;
}

static void strip_comment(char *text)
{
    char *c = strchr(text, '!');
    if (c) *c = '\0';
}

static int blank(const char *t)
{
    while (is_space(*t)) t++;
    return *t == '\0';
}

static char *trim_left(char *t)
{
    while (is_space(*t)) t++;
    return t;
}

/* Where a Touchstone reading stands between lines. */
typedef struct tsstate {
    tsopt o;
    int version2, have_option, in_data, in_info, ended, ports_seen, pending_ref;
    long nfreq;
    double ref_override;
} tsstate;

/* A [Reference] value: a number above 0. */
static cxl_status reference_value(reader *r, const char *tok, double *ref)
{
    double v = 0.0;
    cxl_status st = number(r, tok, "[Reference]", &v);
    if (st != CXL_OK) return st;
    if (!(v > 0.0)) return fail_at(r, r->line, "[Reference] must be above 0 (expected 50)");
    *ref = v;
    return CXL_OK;
}

/* The line after a bare [Reference]: its one value. */
static cxl_status ts_pending_reference(reader *r, char *text, tsstate *ts)
{
    char *tok[3];
    if (split(text, 0, tok, 2) != 1)
        return fail_at(r, r->line, "[Reference] needs one value for a one-port "
                                   "(expected e.g. 50)");
    ts->pending_ref = 0;
    return reference_value(r, tok[0], &ts->ref_override);
}

/* The first option line counts (before any data); later ones are ignored. */
static cxl_status ts_option(reader *r, const cxl_sweep *s, char *text, tsstate *ts)
{
    if (ts->have_option) return CXL_OK;
    if (s->n > 0)
        return fail_at(r, r->line, "option line after data (expected it before the first "
                                   "point)");
    cxl_status st = option_line(r, text, &ts->o);
    if (st == CXL_OK) ts->have_option = 1;
    return st;
}

static cxl_status kw_version(reader *r, char *rest, const tsstate *ts)
{
    if (ts->ports_seen || ts->have_option || ts->in_data)
        return fail_at(r, r->line, "[Version] twice or late (expected it first)");
    double v = 0.0;
    char *tok[3];
    if (split(rest, 0, tok, 2) != 1 || number(r, tok[0], "[Version]", &v) != CXL_OK ||
        !(v >= 2.0 && v < 3.0))
        return fail_at(r, r->line, "unsupported version (expected [Version] 2.0)");
    return CXL_OK;
}

static cxl_status kw_ports(reader *r, char *rest, tsstate *ts)
{
    double v = 0.0;
    char *tok[3];
    if (split(rest, 0, tok, 2) != 1 || number(r, tok[0], "[Number of Ports]", &v) != CXL_OK)
        return fail_at(r, r->line, "bad port count (expected [Number of Ports] 1)");
    if (v != 1.0)
        return fail_at(r, r->line, "a %.0f-port file (expected [Number of Ports] 1: "
                                   "a one-port sweep)", v);
    ts->ports_seen = 1;
    return CXL_OK;
}

static cxl_status kw_frequencies(reader *r, char *rest, tsstate *ts)
{
    double v = 0.0;
    char *tok[3];
    if (split(rest, 0, tok, 2) != 1 ||
        number(r, tok[0], "[Number of Frequencies]", &v) != CXL_OK ||
        !(v >= 1.0 && v <= 1e12) || v != floor(v))
        return fail_at(r, r->line, "bad frequency count (expected e.g. "
                                   "[Number of Frequencies] 201)");
    ts->nfreq = (long)v;
    return CXL_OK;
}

/* [Reference] with its value, or alone with the value on the next line. */
static cxl_status kw_reference(reader *r, char *rest, tsstate *ts)
{
    char *tok[3];
    size_t n = split(rest, 0, tok, 2);
    if (n == 0) {
        ts->pending_ref = 1;
        return CXL_OK;
    }
    if (n != 1) return fail_at(r, r->line, "[Reference] needs one value for a "
                                           "one-port (expected [Reference] 50)");
    return reference_value(r, tok[0], &ts->ref_override);
}

static cxl_status kw_network_data(reader *r, tsstate *ts)
{
    if (!ts->ports_seen)
        return fail_at(r, r->line, "[Network Data] before [Number of Ports] "
                                   "(expected [Number of Ports] 1 first)");
    if (ts->ref_override > 0.0) ts->o.ref = ts->ref_override;
    ts->in_data = 1;
    return CXL_OK;
}

/* Keywords that only files of more than one port have. */
static int multiport_keyword(char *text)
{
    char *rest;
    return keyword(text, "[two-port data order]", &rest) ||
           keyword(text, "[number of noise frequencies]", &rest) ||
           keyword(text, "[noise data]", &rest) || keyword(text, "[mixed-mode order]", &rest);
}

static cxl_status ts_keyword(reader *r, char *text, tsstate *ts)
{
    char *rest;
    if (!ts->version2)
        return fail_at(r, r->line, "keyword in a version 1.0 file (expected [Version] "
                                   "2.0 as the first keyword)");
    if (keyword(text, "[version]", &rest)) return kw_version(r, rest, ts);
    if (keyword(text, "[number of ports]", &rest)) return kw_ports(r, rest, ts);
    if (keyword(text, "[number of frequencies]", &rest)) return kw_frequencies(r, rest, ts);
    if (keyword(text, "[reference]", &rest)) return kw_reference(r, rest, ts);
    /* one value per point: any matrix format is the same */
    if (keyword(text, "[matrix format]", &rest)) return CXL_OK;
    if (keyword(text, "[begin information]", &rest)) {
        ts->in_info = 1;
        return CXL_OK;
    }
    if (keyword(text, "[network data]", &rest)) return kw_network_data(r, ts);
    if (keyword(text, "[end]", &rest)) {
        ts->ended = 1;
        return CXL_OK;
    }
    if (multiport_keyword(text))
        return fail_at(r, r->line, "a keyword of multi-port files (expected a one-port file)");
    return fail_at(r, r->line, "unknown keyword '%.30s' (expected [Version], [Number "
                               "of Ports], [Reference], [Network Data], [End])", text);
}

/* One line of a Touchstone file, blanks on the left taken off. */
static cxl_status ts_line(reader *r, cxl_sweep *s, char *text, tsstate *ts)
{
    if (ts->in_info) {
        char *rest;
        if (keyword(text, "[end information]", &rest)) ts->in_info = 0;
        return CXL_OK;
    }
    strip_comment(text);
    if (blank(text)) return CXL_OK;
    if (ts->ended) return fail_at(r, r->line, "text after [End] (expected nothing but comments)");
    if (ts->pending_ref) return ts_pending_reference(r, text, ts);
    if (text[0] == '#') return ts_option(r, s, text, ts);
    if (text[0] == '[') return ts_keyword(r, text, ts);
    if (!ts->in_data)
        return fail_at(r, r->line, "data before [Network Data] (expected the keyword first)");
    return data_line(r, s, text, &ts->o, ts->version2);
}

/* The checks at the end of the file, and the sweep's reference and source. */
static cxl_status ts_finish(reader *r, cxl_sweep *s, const tsstate *ts)
{
    if (ts->in_info) return fail_at(r, r->line, "[Begin Information] without [End Information]");
    if (s->n == 0) return fail_at(r, r->line, "no data points (expected frequency and value "
                                              "pairs)");
    if (ts->version2 && ts->nfreq >= 0 && (size_t)ts->nfreq != s->n)
        return fail_at(r, r->line, "%zu points but [Number of Frequencies] says %ld", s->n,
                       ts->nfreq);
    s->ref = ts->o.ref;
    s->source = ts->version2 ? CXL_SWEEP_TOUCHSTONE2 : CXL_SWEEP_TOUCHSTONE1;
    return CXL_OK;
}

static cxl_status read_touchstone(reader *r, cxl_sweep *s, char *first, int version2)
{
    tsstate ts = { .o = { 1e9, P_S, F_MA, 50.0 }, .version2 = version2, .in_data = !version2,
                   .nfreq = -1 };
    cxl_status st = CXL_OK;
    char *text = first;
    for (;;) {
        if ((st = ts_line(r, s, trim_left(text), &ts)) != CXL_OK) return st;
        int got = read_line(r, &st);
        if (got < 0) return st;
        if (got == 0) break;
        text = r->text;
    }
    return ts_finish(r, s, &ts);
}

/* ---- CSV -------------------------------------------------------------- */

enum { C_FHZ, C_FMHZ, C_R, C_X, C_ZMAG, C_ZDEG, C_SRE, C_SIM, C_SDB, C_SDEG, C_SWR, C_N };
static const char *const csv_names[C_N] = {
    "freq_hz", "freq_mhz", "r_ohm", "x_ohm", "z_ohm", "z_deg", "s11_re", "s11_im",
    "s11_db", "s11_deg", "swr"
};
#define CSV_EXPECTED "freq_hz or freq_mhz and one of r_ohm,x_ohm | z_ohm,z_deg | " \
                     "s11_re,s11_im | s11_db,s11_deg | swr"
#define CSV_MAXCOL 8

/* A CSV sweep's impedances are in ohms, normalised to this. */
#define CSV_REF_OHM 50.0
#define HAS(k) ((seen >> (k)) & 1u)

/* The column kind named name, or -1. */
static int csv_column(const char *name)
{
    int k = -1;
    for (int j = 0; j < C_N; j++)
        if (caseeq(name, csv_names[j])) k = j;
    return k;
}

/* The header's column kinds into col[]; *n their count, *seen a bit for
 * each kind present. */
static cxl_status csv_header(reader *r, char *header, int *col, size_t *n, unsigned *seen)
{
    char *tok[CSV_MAXCOL + 1];
    *n = split(header, ',', tok, CSV_MAXCOL);
    if (*n > CSV_MAXCOL)
        return fail_at(r, r->line, "too many columns in the header (expected %s)", CSV_EXPECTED);
    *seen = 0;
    for (size_t i = 0; i < *n; i++) {
        int k = csv_column(tok[i]);
        if (k < 0)
            return fail_at(r, r->line, "unknown column '%.30s' (expected %s)", tok[i], CSV_EXPECTED);
        if (*seen & (1u << k))
            return fail_at(r, r->line, "column %s appears twice", csv_names[k]);
        *seen |= 1u << k;
        col[i] = k;
    }
    return CXL_OK;
}

/* How many value column sets the header touches. */
static int csv_value_sets(unsigned seen)
{
    return (HAS(C_R) || HAS(C_X)) + (HAS(C_ZMAG) || HAS(C_ZDEG)) + (HAS(C_SRE) || HAS(C_SIM)) +
           (HAS(C_SDB) || HAS(C_SDEG)) + HAS(C_SWR);
}

/* Whether some value column set is complete. */
static int csv_set_complete(unsigned seen)
{
    return (HAS(C_R) && HAS(C_X)) || (HAS(C_ZMAG) && HAS(C_ZDEG)) ||
           (HAS(C_SRE) && HAS(C_SIM)) || (HAS(C_SDB) && HAS(C_SDEG)) || HAS(C_SWR);
}

/* The point of one row at frequency f from its values v[] by column kind. */
static cxl_status csv_store(reader *r, cxl_sweep *s, double f, const double *v, unsigned seen)
{
    if (HAS(C_SWR)) {
        if (!(v[C_SWR] >= 1.0))
            return fail_at(r, r->line, "swr %.6g is below 1 (expected 1 or more)", v[C_SWR]);
        double mag = (v[C_SWR] - 1.0) / (v[C_SWR] + 1.0);
        return store(r, s, f, P_S, mag);
    }
    if (HAS(C_SRE)) return store(r, s, f, P_S, v[C_SRE] + I * v[C_SIM]);
    if (HAS(C_SDB)) return store(r, s, f, P_S, pair_value(F_DB, v[C_SDB], v[C_SDEG]));
    double complex z;
    if (HAS(C_R)) {
        z = v[C_R] + I * v[C_X];
    } else {
        if (v[C_ZMAG] < 0.0) return fail_at(r, r->line, "z_ohm below 0 (expected a magnitude)");
        z = pair_value(F_MA, v[C_ZMAG], v[C_ZDEG]);
    }
    return store(r, s, f, P_Z, z / CSV_REF_OHM);
}

/* One data row (in r->text) of n cells of the kinds col[]. */
static cxl_status csv_row(reader *r, cxl_sweep *s, const int *col, size_t n, unsigned seen)
{
    char *cell[CSV_MAXCOL + 1];
    size_t m = split(r->text, ',', cell, CSV_MAXCOL);
    if (m != n)
        return fail_at(r, r->line, "%s%zu fields but the header has %zu (expected one value "
                                   "per column)", m > n ? "more than " : "",
                       m > n ? n : m, n);
    double v[C_N] = { 0 };
    cxl_status st;
    for (size_t i = 0; i < n; i++)
        if ((st = number(r, cell[i], csv_names[col[i]], &v[col[i]])) != CXL_OK) return st;
    double f = HAS(C_FHZ) ? v[C_FHZ] : v[C_FMHZ] * 1e6;
    if (!(f >= 0.0) || !isfinite(f))
        return fail_at(r, r->line, "frequency below 0 (expected 0 or more)");
    return csv_store(r, s, f, v, seen);
}

static cxl_status read_csv(reader *r, cxl_sweep *s, char *header)
{
    int col[CSV_MAXCOL];
    size_t n = 0;
    unsigned seen = 0;
    cxl_status st = csv_header(r, header, col, &n, &seen);
    if (st != CXL_OK) return st;
    if (HAS(C_FHZ) + HAS(C_FMHZ) != 1 || csv_value_sets(seen) != 1 || !csv_set_complete(seen))
        return fail_at(r, r->line, "the header needs one frequency column and one complete "
                                   "column set (expected %s)", CSV_EXPECTED);
    for (;;) {
        int got = read_line(r, &st);
        if (got < 0) return st;
        if (got == 0) break;
        if (blank(r->text)) continue;
        if ((st = csv_row(r, s, col, n, seen)) != CXL_OK) return st;
    }
    if (s->n == 0) return fail_at(r, r->line, "a header but no data rows (expected %s values)",
                                  "one row per frequency");
    s->ref = CSV_REF_OHM;
    s->source = CXL_SWEEP_CSV;
    s->has_phase = !HAS(C_SWR);
    return CXL_OK;
}
#undef HAS

/* ---- entry points ----------------------------------------------------- */

/* The first line that is neither blank nor a comment: 1, 0 at the end of
 * input, -1 on an error. */
static int first_line(reader *r, cxl_status *st)
{
    for (;;) {
        int got = read_line(r, st);
        if (got <= 0) return got;
        char *t = trim_left(r->text);
        if (*t != '!' && *t != '\0') return 1;
    }
}

/* Whether a first line opens a version 1.0 Touchstone file: an option
 * line, a keyword or a number. */
static int touchstone1_start(const char *t)
{
    return *t == '#' || *t == '[' || *t == '+' || *t == '-' || *t == '.' ||
           (*t >= '0' && *t <= '9');
}

static cxl_status read_any(reader *r, cxl_sweep **out)
{
    if (r->error_line) *r->error_line = 0;
    if (r->error_text && r->error_size) r->error_text[0] = '\0';
    cxl_sweep *s = calloc(1, sizeof *s);
    if (!s) return CXL_ENOMEM;
    s->has_phase = 1;
    cxl_status st = CXL_OK;
    int got = first_line(r, &st);
    if (got == 0) {
        st = fail_at(r, 0, "empty file (expected a Touchstone or CSV sweep)");
    } else if (got > 0) {
        char *t = trim_left(r->text);
        if (cxl__ascii_ncaseeq(t, "[version]", 9)) st = read_touchstone(r, s, t, 1);
        else if (touchstone1_start(t)) st = read_touchstone(r, s, t, 0);
        else st = read_csv(r, s, t);
    }
    if (st != CXL_OK) {
        cxl_sweep_free(s);
        return st;
    }
    *out = s;
    return CXL_OK;
}

/* Read from a stream or a buffer (exactly one of fp, text). */
static cxl_status read_from(FILE *fp, const char *text, size_t size, cxl_sweep **sweep,
                            size_t *error_line, char *error_text, size_t error_size)
{
    reader *r = calloc(1, sizeof *r);
    if (!r) return CXL_ENOMEM;
    *r = (reader){ .fp = fp, .buf = text, .size = size, .error_line = error_line,
                   .error_text = error_text, .error_size = error_size };
    cxl_status st = read_any(r, sweep);
    free(r);
    return st;
}

cxl_status cxl_sweep_read(FILE *stream, cxl_sweep **sweep, size_t *error_line,
                          char *error_text, size_t error_size)
{
    if (!stream || !sweep) return CXL_EINVAL;
    return read_from(stream, NULL, 0, sweep, error_line, error_text, error_size);
}

cxl_status cxl_sweep_read_buffer(const char *text, size_t size, cxl_sweep **sweep,
                                 size_t *error_line, char *error_text, size_t error_size)
{
    if (!text || !sweep) return CXL_EINVAL;
    return read_from(NULL, text, size, sweep, error_line, error_text, error_size);
}

size_t cxl_sweep_count(const cxl_sweep *sweep)
{
    return sweep ? sweep->n : 0;
}

cxl_status cxl_sweep_info(const cxl_sweep *sweep, double *start_hz, double *stop_hz,
                          double *reference_ohm, cxl_sweep_source *source, int *has_phase)
{
    if (!sweep) return CXL_EINVAL;
    if (start_hz) *start_hz = sweep->freq[0];
    if (stop_hz) *stop_hz = sweep->freq[sweep->n - 1];
    if (reference_ohm) *reference_ohm = sweep->ref;
    if (source) *source = sweep->source;
    if (has_phase) *has_phase = sweep->has_phase;
    return CXL_OK;
}

/* Gamma of point i against ref (valid arguments). */
static double complex gamma_at(const cxl_sweep *s, size_t i, double ref)
{
    double complex g = s->gre[i] + I * s->gim[i];
    if (ref == s->ref) return g;
    double complex a = (1.0 + g) * s->ref, b = (1.0 - g) * ref;
    double complex d = a + b;
    if (cabs(d) == 0.0) return 1.0;
    return (a - b) / d;
}

cxl_status cxl__sweep_gamma(const cxl_sweep *s, size_t i, double ref, double *re, double *im)
{
    double complex g = gamma_at(s, i, ref);
    *re = creal(g);
    *im = cimag(g);
    return isfinite(*re) && isfinite(*im) ? CXL_OK : CXL_ERANGE;
}

const double *cxl__sweep_freqs(const cxl_sweep *s)
{
    return s->freq;
}

/* The impedance of reflection coefficient g against ref; 0 when none is
 * finite. */
static int impedance_of(double complex g, double ref, double *zr, double *zi)
{
    double complex d = 1.0 - g;
    if (cabs(d) == 0.0) return 0;
    double complex z = ref * (1.0 + g) / d;
    *zr = creal(z);
    *zi = cimag(z);
    return isfinite(*zr) && isfinite(*zi);
}

cxl_status cxl_sweep_point(const cxl_sweep *sweep, size_t index, double reference_ohm,
                           double *freq_hz, double *gamma_re, double *gamma_im,
                           double *z_re_ohm, double *z_im_ohm)
{
    if (!sweep || !cxl__finite_pos(reference_ohm)) return CXL_EINVAL;
    if (index >= sweep->n) return CXL_ERANGE;
    if (!sweep->has_phase) return CXL_ENOTFOUND;
    double complex g = gamma_at(sweep, index, reference_ohm);
    if (!isfinite(creal(g)) || !isfinite(cimag(g))) return CXL_ERANGE;
    double zr = 0.0, zi = 0.0;
    if ((z_re_ohm || z_im_ohm) && !impedance_of(g, reference_ohm, &zr, &zi)) return CXL_ERANGE;
    if (freq_hz) *freq_hz = sweep->freq[index];
    if (gamma_re) *gamma_re = creal(g);
    if (gamma_im) *gamma_im = cimag(g);
    if (z_re_ohm) *z_re_ohm = zr;
    if (z_im_ohm) *z_im_ohm = zi;
    return CXL_OK;
}

cxl_status cxl_sweep_magnitude(const cxl_sweep *sweep, size_t index, double reference_ohm,
                               double *freq_hz, double *gamma_mag)
{
    if (!sweep || !cxl__finite_pos(reference_ohm) || !gamma_mag) return CXL_EINVAL;
    if (index >= sweep->n) return CXL_ERANGE;
    double m;
    if (!sweep->has_phase) {
        if (reference_ohm != sweep->ref) return CXL_ENOTFOUND;
        m = sweep->gre[index];
    } else {
        m = cabs(gamma_at(sweep, index, reference_ohm));
    }
    if (!isfinite(m)) return CXL_ERANGE;
    if (freq_hz) *freq_hz = sweep->freq[index];
    *gamma_mag = m;
    return CXL_OK;
}

/* ---- resonances ------------------------------------------------------- */

typedef struct res_item {
    cxl_sweep_kind kind;
    int series, order;
    double f, err, value;
} res_item;

struct cxl_sweep_res {
    size_t n, cap;
    res_item *item;
};

void cxl_sweep_res_free(cxl_sweep_res *res)
{
    if (!res) return;
    free(res->item);
    free(res);
}

size_t cxl_sweep_res_count(const cxl_sweep_res *res)
{
    return res ? res->n : 0;
}

static cxl_status res_add(cxl_sweep_res *r, res_item it)
{
    if (!isfinite(it.f) || !isfinite(it.value) || !isfinite(it.err)) return CXL_OK;
    if (r->n == r->cap) {
        size_t cap = r->cap ? 2 * r->cap : 16;
        res_item *a = realloc(r->item, cap * sizeof *a);
        if (!a) return CXL_ENOMEM;
        r->item = a;
        r->cap = cap;
    }
    r->item[r->n++] = it;
    return CXL_OK;
}

static int cmp_double_early(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return x < y ? -1 : x > y;
}

/* Vertex of the parabola through (x0,y0), (x1,y1), (x2,y2); *y the value
 * there.  Falls back to x1 when the points are collinear. */
static double vertex(double x0, double y0, double x1, double y1, double x2, double y2, double *y)
{
    double d0 = (y1 - y0) / (x1 - x0), d1 = (y2 - y1) / (x2 - x1);
    double a = (d1 - d0) / (x2 - x0);
    if (!(a > 0.0)) {
        *y = y1;
        return x1;
    }
    /* y = y1 + b (x - x1) + a (x - x1)^2, b the slope at x1 */
    double b = d0 + a * (x1 - x0);
    double x = x1 - b / (2.0 * a);
    if (x < x0) x = x0;
    if (x > x2) x = x2;
    *y = y1 + b * (x - x1) + a * (x - x1) * (x - x1);
    if (*y < 0.0) *y = 0.0;
    return x;
}

/* A feature counts when it stands out of the noise by this many standard
 * deviations (common practice, no source). */
#define CXL__NOISE_K 5.0

/* Standard deviation of the noise on each part of Gamma, from the median
 * of |second difference|^2 over the sweep: white noise of deviation s per
 * part gives a second difference whose |.|^2 is 6 s^2 times a chi-square of
 * two degrees of freedom (median 2 ln 2).  The line's own curvature adds to
 * it, so on a coarse sweep this overstates the noise: a conservative
 * figure. */
static double gamma_noise(const double *gr, const double *gi, size_t n, double *work)
{
    if (n < 3) return 0.0;
    size_t m = 0;
    for (size_t i = 1; i + 1 < n; i++) {
        double dr = gr[i + 1] - 2.0 * gr[i] + gr[i - 1];
        double di = gi[i + 1] - 2.0 * gi[i] + gi[i - 1];
        double d = dr * dr + di * di;
        if (isfinite(d)) work[m++] = d;
    }
    if (m == 0) return 0.0;
    qsort(work, m, sizeof *work, cmp_double_early);
    double med = m % 2 ? work[m / 2] : 0.5 * (work[m / 2 - 1] + work[m / 2]);
    return sqrt(med / (12.0 * log(2.0)));
}

/* The quantity whose ratio counts as prominence, squared: |Z|^2 as it is,
 * SWR^2 from |Gamma|^2 (infinite at |Gamma| >= 1). */
static double prom_value(cxl_sweep_kind kind, double v)
{
    if (kind == CXL_SWEEP_Z_MIN) return v;
    double g = sqrt(v);
    if (!(g < 1.0)) return INFINITY;
    double swr = (1.0 + g) / (1.0 - g);
    return swr * swr;
}

/* Prominent local minima of v[] (squared magnitudes): both sides must rise
 * by CXL_SWEEP_MIN_PROMINENCE^2 before a lower value. */
/* What a search for minima reads: squared magnitudes v[] at f[], their
 * noise, and the resistance (|Z| minima) or NULL. */
typedef struct min_in {
    const double *f, *v, *noise, *res;
    size_t n;
    cxl_sweep_kind kind;
} min_in;

/* Whether v[i] rises on one side (0 below, 1 above), before a lower
 * point, by the ratio need (squared, against here) and by a rise that
 * stands out of the noise at both points. */
static int rises_on_side(const min_in *m, size_t i, int side, double need, double here)
{
    const double *v = m->v;
    double h = sqrt(here);
    int ratio = 0, sig = 0;
    for (size_t j = i;;) {
        if (side == 0) { if (j == 0) break; j--; }
        else { if (j + 1 >= m->n) break; j++; }
        if (v[j] < v[i]) break;
        double pj = prom_value(m->kind, v[j]);
        if (pj >= need * here) ratio = 1;
        if (sqrt(pj) - h >= CXL__NOISE_K * hypot(m->noise[j], m->noise[i])) sig = 1;
        if (ratio && sig) break;
    }
    return ratio && sig;
}

static int prominent(const min_in *m, size_t i)
{
    const double need = CXL_SWEEP_MIN_PROMINENCE * CXL_SWEEP_MIN_PROMINENCE;
    double here = prom_value(m->kind, m->v[i]);
    if (!(here > 0.0)) here = DBL_MIN;
    return rises_on_side(m, i, 0, need, here) && rises_on_side(m, i, 1, need, here);
}

/* The frequency of the minimum at point i (the parabola's vertex), and
 * *value there: |Z| or the SWR. */
static double minimum_at(const min_in *m, size_t i, double *value)
{
    const double *f = m->f, *v = m->v;
    double y;
    double x = vertex(f[i - 1], v[i - 1], f[i], v[i], f[i + 1], v[i + 1], &y);
    if (m->res) {
        /* |Z| = sqrt(R^2 + X^2) is never below the resistance there:
         * where the reactance is far from linear across the three
         * points the parabola's vertex can undershoot it (down to 0
         * on a lossy line), so the resistance interpolated at the
         * vertex bounds it from below */
        size_t k = x < f[i] ? i - 1 : i;
        double t = (x - f[k]) / (f[k + 1] - f[k]);
        double rx = m->res[k] + t * (m->res[k + 1] - m->res[k]);
        if (isfinite(rx) && rx * rx > y) y = rx * rx;
    }
    if (m->kind == CXL_SWEEP_Z_MIN) {
        *value = sqrt(y);
    } else {
        double g = sqrt(y);
        *value = g < 1.0 ? (1.0 + g) / (1.0 - g) : INFINITY;
    }
    return x;
}

static cxl_status minima(cxl_sweep_res *r, const double *f, const double *v,
                         const double *noise, const double *res, size_t n, cxl_sweep_kind kind)
{
    const min_in m = { f, v, noise, res, n, kind };
    for (size_t i = 1; i + 1 < n; i++) {
        if (!(v[i] <= v[i - 1] && v[i] < v[i + 1])) continue;
        if (!prominent(&m, i)) continue;
        double value;
        double x = minimum_at(&m, i, &value);
        double step = fmax(f[i] - f[i - 1], f[i + 1] - f[i]);
        cxl_status st = res_add(r, (res_item){ kind, 1, 0, x, step / 2.0, value });
        if (st != CXL_OK) return st;
    }
    return CXL_OK;
}

/* Noise near X = 0 makes a crossing and its reverse within a few points;
 * a real line's crossings alternate a quarter wavelength apart.  Drop
 * each pair of opposite crossings fewer than CXL__PAIR_POINTS points
 * apart, again until none is left (an odd cluster keeps one crossing). */
#define CXL__PAIR_POINTS 3
static void drop_noise_pairs(cxl_sweep_res *r, size_t *xi)
{
    int changed = 1;
    while (changed && r->n >= 2) {
        changed = 0;
        for (size_t k = 0; k + 1 < r->n; k++) {
            if (r->item[k].series == r->item[k + 1].series) continue;
            if (xi[k + 1] - xi[k] >= CXL__PAIR_POINTS) continue;
            memmove(r->item + k, r->item + k + 2, (r->n - k - 2) * sizeof *r->item);
            memmove(xi + k, xi + k + 2, (r->n - k - 2) * sizeof *xi);
            r->n -= 2;
            changed = 1;
            break;
        }
    }
}

static int cmp_item(const void *a, const void *b)
{
    const res_item *x = a, *y = b;
    if (x->f < y->f) return -1;
    if (x->f > y->f) return 1;
    return (int)x->kind - (int)y->kind;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return x < y ? -1 : x > y;
}

/* Order of a resonance at q quarter-waves. */
static int order_at(double q, int series, cxl_stub_end end)
{
    int odd = (end == CXL_STUB_OPEN) == (series != 0); /* (2n-1)/4 */
    double n = odd ? (q + 1.0) / 2.0 : q / 2.0;
    if (!(n >= 0.5) || n > CXL_STUB_MAX_ORDER) return 0;
    return (int)floor(n + 0.5);
}

/* Half-wave spacing from the median gap between consecutive series
 * resonances: of the |Z| minima (checked against the noise) when there
 * are two or more, else of the reactance zeros, else of the SWR minima;
 * 0 when none. */
static double spacing(const cxl_sweep_res *r)
{
    static const int pref[3] = { CXL_SWEEP_Z_MIN, CXL_SWEEP_X_ZERO, CXL_SWEEP_SWR_MIN };
    double best = 0.0;
    size_t best_n = 0;
    for (int pi = 0; pi < 3 && best_n == 0; pi++) {
        int k = pref[pi];
        size_t m = 0;
        for (size_t i = 0; i < r->n; i++)
            if ((int)r->item[i].kind == k && r->item[i].series) m++;
        if (m < 2) continue;
        double *gap = malloc((m - 1) * sizeof *gap);
        if (!gap) return 0.0;
        double prev = NAN;
        size_t g = 0;
        for (size_t i = 0; i < r->n; i++) {
            if ((int)r->item[i].kind != k || !r->item[i].series) continue;
            if (!isnan(prev)) gap[g++] = r->item[i].f - prev;
            prev = r->item[i].f;
        }
        qsort(gap, g, sizeof *gap, cmp_double);
        best = g % 2 ? gap[g / 2] : 0.5 * (gap[g / 2 - 1] + gap[g / 2]);
        best_n = m;
        free(gap);
    }
    return best;
}

/* Work arrays of a resonance search, n points each. */
typedef struct res_work {
    double *buf;
    double *zz, *xx, *gg, *gr, *gi, *nz, *ns, *rr;
    size_t *xi; /* point before each crossing */
} res_work;

static int work_alloc(res_work *w, size_t n)
{
    w->buf = calloc(8 * n + 1, sizeof *w->buf);
    w->xi = malloc((n + 1) * sizeof *w->xi);
    if (!w->buf || !w->xi) {
        free(w->buf);
        free(w->xi);
        return 0;
    }
    double *b = w->buf;
    w->zz = b, w->xx = b + n, w->gg = b + 2 * n, w->gr = b + 3 * n, w->gi = b + 4 * n;
    w->nz = b + 5 * n, w->ns = b + 6 * n, w->rr = b + 7 * n;
    return 1;
}

/* Gamma of each point against ref (a magnitude-only sweep: |Gamma|). */
static void fill_gamma(const cxl_sweep *s, double ref, res_work *w)
{
    for (size_t i = 0; i < s->n; i++) {
        double complex g = s->has_phase ? gamma_at(s, i, ref) : (double complex)s->gre[i];
        w->gr[i] = creal(g);
        w->gi[i] = cimag(g);
    }
}

/* Noise of Gamma per part (see gamma_noise). */
static double sweep_noise(const cxl_sweep *s, res_work *w)
{
    double sg = gamma_noise(w->gr, w->gi, s->n, w->nz);
    /* magnitudes only: the second difference of |G| (one part) */
    return s->has_phase ? sg : sg * sqrt(2.0);
}

/* |Gamma|^2, |Z|^2, X and R of each point, and what the noise sg of Gamma
 * makes of |Z| (and X) and of the SWR:
 * d|Z| <= 2 Zref dG / |1 - G|^2, dSWR = 2 d|G| / (1 - |G|)^2 */
static void fill_derived(size_t n, double ref, double sg, res_work *w)
{
    for (size_t i = 0; i < n; i++) {
        double complex g = w->gr[i] + I * w->gi[i];
        double m1 = cabs(1.0 - g), mg = cabs(g);
        w->nz[i] = 2.0 * ref * sg / (m1 * m1);
        w->ns[i] = mg < 1.0 ? 2.0 * sg / ((1.0 - mg) * (1.0 - mg)) : INFINITY;
        w->gg[i] = creal(g) * creal(g) + cimag(g) * cimag(g);
        double complex d = 1.0 - g;
        double complex z = ref * (1.0 + g) / d;
        if (cabs(d) == 0.0 || !isfinite(creal(z)) || !isfinite(cimag(z))) {
            w->zz[i] = INFINITY;
            w->xx[i] = w->rr[i] = NAN;
        } else {
            w->zz[i] = creal(z) * creal(z) + cimag(z) * cimag(z);
            w->xx[i] = cimag(z);
            w->rr[i] = creal(z);
        }
    }
}

/* Whether X crosses zero between points i and i + 1: *t the crossing's
 * fraction of the step, *up whether X rises. */
static int x_crossing(const res_work *w, size_t i, double *t, int *up)
{
    double x0 = w->xx[i], x1 = w->xx[i + 1];
    if (isnan(x0) || isnan(x1)) return 0;
    int rise = x0 < 0.0 && x1 >= 0.0, fall = x0 > 0.0 && x1 <= 0.0;
    if (!rise && !fall) return 0;
    if (rise) {
        *t = x0 / (x0 - x1);
    } else {
        /* susceptance B = -X / |Z|^2 rises through zero */
        double b0 = -x0 / w->zz[i], b1 = -x1 / w->zz[i + 1];
        *t = b0 / (b0 - b1);
    }
    if (!(*t >= 0.0 && *t <= 1.0)) *t = 0.5;
    *up = rise;
    return 1;
}

/* The reactance zero crossings, with the resistance there. */
static cxl_status x_zeros(cxl_sweep_res *r, const cxl_sweep *s, double ref, res_work *w)
{
    const double *f = s->freq;
    cxl_status st = CXL_OK;
    for (size_t i = 0; st == CXL_OK && i + 1 < s->n; i++) {
        double t;
        int up;
        if (!x_crossing(w, i, &t, &up)) continue;
        double complex g0 = gamma_at(s, i, ref);
        double complex g1 = gamma_at(s, i + 1, ref);
        double complex z0 = ref * (1.0 + g0) / (1.0 - g0);
        double complex z1 = ref * (1.0 + g1) / (1.0 - g1);
        double value = creal(z0) + t * (creal(z1) - creal(z0));
        double fx = f[i] + t * (f[i + 1] - f[i]);
        size_t before = r->n;
        st = res_add(r, (res_item){ CXL_SWEEP_X_ZERO, up, 0, fx, (f[i + 1] - f[i]) / 2.0,
                                    value });
        if (r->n > before) w->xi[r->n - 1] = i;
    }
    return st;
}

static cxl_status find_resonances(cxl_sweep_res *r, const cxl_sweep *s, double ref,
                                  res_work *w)
{
    size_t n = s->n;
    fill_gamma(s, ref, w);
    fill_derived(n, ref, sweep_noise(s, w), w);
    cxl_status st = CXL_OK;
    if (s->has_phase) {
        st = x_zeros(r, s, ref, w);
        if (st == CXL_OK) drop_noise_pairs(r, w->xi);
        if (st == CXL_OK) st = minima(r, s->freq, w->zz, w->nz, w->rr, n, CXL_SWEEP_Z_MIN);
    }
    if (st == CXL_OK) st = minima(r, s->freq, w->gg, w->ns, NULL, n, CXL_SWEEP_SWR_MIN);
    return st;
}

/* Orders from the quarter-wave frequency: of the given length and VF,
 * else from the spacing of the resonances found. */
static void set_orders(cxl_sweep_res *r, cxl_stub_end end, double length_m, double vf_guess)
{
    double quarter_hz = 0.0; /* frequency of one quarter wave */
    if (length_m > 0.0) {
        quarter_hz = vf_guess * CXL_C_M_PER_S / (4.0 * length_m);
    } else {
        double half = spacing(r);
        if (half > 0.0) quarter_hz = half / 2.0;
    }
    if (isfinite(quarter_hz) && quarter_hz > 0.0)
        for (size_t i = 0; i < r->n; i++)
            r->item[i].order = order_at(r->item[i].f / quarter_hz, r->item[i].series, end);
}

static cxl_status resonance_args(const cxl_sweep *sweep, cxl_sweep_res **res, double ref,
                                 cxl_stub_end end, double length_m, double vf_guess)
{
    if (!sweep || !res || !cxl__finite_pos(ref)) return CXL_EINVAL;
    if (end != CXL_STUB_OPEN && end != CXL_STUB_SHORT) return CXL_EINVAL;
    if (!cxl__finite_nonneg(length_m) || !isfinite(vf_guess) || vf_guess < 0.0 || vf_guess > 1.0)
        return CXL_EINVAL;
    if ((length_m > 0.0) != (vf_guess > 0.0)) return CXL_EINVAL;
    if (sweep->n > SIZE_MAX / (8 * sizeof(double)) - 1) return CXL_ENOMEM;
    return CXL_OK;
}

cxl_status cxl_sweep_resonances(const cxl_sweep *sweep, double reference_ohm, cxl_stub_end end,
                                double length_m, double vf_guess, cxl_sweep_res **res)
{
    cxl_status st = resonance_args(sweep, res, reference_ohm, end, length_m, vf_guess);
    if (st != CXL_OK) return st;
    cxl_sweep_res *r = calloc(1, sizeof *r);
    res_work w;
    if (!r || !work_alloc(&w, sweep->n)) {
        free(r);
        return CXL_ENOMEM;
    }
    st = find_resonances(r, sweep, reference_ohm, &w);
    free(w.buf);
    free(w.xi);
    if (st != CXL_OK) {
        cxl_sweep_res_free(r);
        return st;
    }
    if (r->n) qsort(r->item, r->n, sizeof *r->item, cmp_item);
    set_orders(r, end, length_m, vf_guess);
    *res = r;
    return CXL_OK;
}

cxl_status cxl_sweep_res_get(const cxl_sweep_res *res, size_t index, cxl_sweep_kind *kind,
                             int *series, int *order, double *freq_hz, double *freq_err_hz,
                             double *value)
{
    if (!res) return CXL_EINVAL;
    if (index >= res->n) return CXL_ERANGE;
    const res_item *it = &res->item[index];
    if (kind) *kind = it->kind;
    if (series) *series = it->series;
    if (order) *order = it->order;
    if (freq_hz) *freq_hz = it->f;
    if (freq_err_hz) *freq_err_hz = it->err;
    if (value) *value = it->value;
    return CXL_OK;
}

cxl_status cxl_sweep_res_readings(const cxl_sweep_res *res, cxl_sweep_kind kind, double *freq_hz,
                                  int *order, size_t max, size_t *count)
{
    if (!res || !freq_hz || !order || !count) return CXL_EINVAL;
    if (kind != CXL_SWEEP_X_ZERO && kind != CXL_SWEEP_Z_MIN && kind != CXL_SWEEP_SWR_MIN)
        return CXL_EINVAL;
    size_t k = 0;
    for (size_t i = 0; i < res->n && k < max; i++) {
        const res_item *it = &res->item[i];
        if (it->kind != kind || !it->series) continue;
        freq_hz[k] = it->f;
        order[k] = it->order;
        k++;
    }
    *count = k;
    return CXL_OK;
}
