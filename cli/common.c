/* common.c - errors, option values, number parsing with field names, and
 * CSV/JSON table output shared by every coaxline command. */
#include <config.h>
#include <errno.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <math.h>
#include <sys/stat.h>
#include <time.h>
#include "cli.h"

static void prefix(const cli_ctx *ctx, FILE *fp)
{
    fprintf(fp, "coaxline: %s: ", ctx && ctx->cmd ? ctx->cmd->name : "error");
    if (ctx && ctx->input_name)
        fprintf(fp, "%s line %zu: ", ctx->input_name, ctx->line);
}

/* Print text with control bytes shown as '?', so one error stays one line
 * whatever the user typed. */
static void put_clean(FILE *fp, const char *s)
{
    for (; *s; s++) putc((unsigned char)*s < 0x20 || *s == 0x7f ? '?' : *s, fp);
}

/* One line on stderr: prefix, optional "warning: " or "FIELD: ", the
 * message, optional "(expected ...)".  Pending stdout goes first so the
 * two streams stay in order. */
static void vreport(const cli_ctx *ctx, const char *tag, const char *field,
                    const char *expected, const char *fmt, va_list ap)
{
    char msg[512];
    vsnprintf(msg, sizeof msg, fmt, ap);
    FILE *fp = cli_report_stream(ctx);
    prefix(ctx, fp);
    if (tag) fputs(tag, fp);
    if (field) fprintf(fp, "%s: ", field);
    put_clean(fp, msg);
    if (expected) {
        fputs(" (expected ", fp);
        put_clean(fp, expected);
        putc(')', fp);
    }
    putc('\n', fp);
}

int cli_error(const cli_ctx *ctx, const char *field, const char *expected,
              const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vreport(ctx, NULL, field, expected, fmt, ap);
    va_end(ap);
    return CLI_EXIT_USAGE;
}

void cli_warn(const cli_ctx *ctx, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vreport(ctx, "warning: ", NULL, NULL, fmt, ap);
    va_end(ap);
}

void cli_note(const cli_ctx *ctx, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    cli_ctx top = *ctx;
    top.input_name = NULL;
    vreport(&top, "note: ", NULL, NULL, fmt, ap);
    va_end(ap);
}

FILE *cli_open_read(const cli_ctx *ctx, const char *field, const char *path,
                    const char *expected, int optional)
{
    FILE *fp = fopen(path, "rb");
    if (!fp) {
        if (!(optional && errno == ENOENT))
            cli_error(ctx, field, expected, "cannot open '%s': %s", path, strerror(errno));
        return NULL;
    }
    struct stat sb;
    if (fstat(fileno(fp), &sb) == 0 && S_ISDIR(sb.st_mode)) {
        fclose(fp);
        cli_error(ctx, field, expected, "'%s' is a directory", path);
        return NULL;
    }
    return fp;
}

/* ---- progress --------------------------------------------------------- */

static double now_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

void cli_progress_start(const cli_ctx *ctx, cli_progress *p, const char *unit)
{
    p->unit = unit;
    p->shown = 0;
    p->delay_s = 1.0;
    const char *d = getenv(CLI_PROGRESS_DELAY_ENV);
    double v;
    if (d && cxl_units_parse_number(d, &v, NULL) == CXL_OK && v >= 0.0 && v <= 3600.0)
        p->delay_s = v;
    p->start_s = p->last_s = ctx->progress ? now_s() : 0.0;
}

void cli_progress_step(const cli_ctx *ctx, cli_progress *p, size_t done)
{
    if (!ctx->progress || done % 256 != 0) return;
    double t = now_s();
    if (t - p->start_s < p->delay_s || (p->shown && t - p->last_s < 0.25)) return;
    fflush(ctx->out);
    fprintf(stderr, "\rcoaxline: %s: %zu %s, %.0f s", ctx->cmd->name, done, p->unit,
            t - p->start_s);
    fflush(stderr);
    p->last_s = t;
    p->shown = 1;
}

void cli_progress_end(const cli_ctx *ctx, cli_progress *p)
{
    if (!ctx->progress || !p->shown) return;
    fputs("\r\033[K", stderr); /* the line cleared: nothing left behind */
    fflush(stderr);
    p->shown = 0;
}

/* ---- option values ---------------------------------------------------- */

static int opt_index(const cli_command *cmd, const char *name)
{
    /* A batch row makes two dozen look-ups.  Names are string literals
     * both here and at the call sites, and the linker merges equal
     * literals, so one pass comparing pointers finds almost every one; the
     * pass by content (first byte before strcmp) is the fallback for a
     * name built at run time.  strcmp calls were 8 % of a phase batch
     * (tests/bench, callgrind). */
    const cli_optdef *o = cmd->opts;
    for (int i = 0; o[i].name; i++)
        if (o[i].name == name) return i;
    for (int i = 0; o[i].name; i++)
        if (o[i].name[0] == name[0] && strcmp(o[i].name, name) == 0) return i;
    return -1;
}

/* opt_index through the args' cache.  A name that is the table's own
 * string (found by pointer) is kept by its address: its bytes never
 * change.  Any other name (one built in a buffer, which may hold another
 * name at the same address later, or one the command does not declare)
 * is kept by its content, hashed, and compared in full on a hit. */
static int cached_index(const cli_args *a, const char *name)
{
    cli_optcache *c = (cli_optcache *)&a->optcache; /* see cli.h */
    if (c->cmd != a->cmd) {
        memset(c, 0, sizeof *c);
        c->cmd = a->cmd;
    }
    size_t h = (size_t)(((uint64_t)(uintptr_t)name * 0x9E3779B97F4A7C15u) >> 58); /* 64 */
    if (c->slot[h].name == name) return c->slot[h].index;
    uint32_t fh = 2166136261u; /* FNV-1a */
    size_t len = 0;
    for (; name[len] && len < sizeof c->text[0].text; len++)
        fh = (fh ^ (unsigned char)name[len]) * 16777619u;
    int fits = len < sizeof c->text[0].text;
    size_t t = fh % CLI_OPTCACHE_TEXT;
    if (fits && c->text[t].text[0] && strcmp(c->text[t].text, name) == 0)
        return c->text[t].index;
    int i = opt_index(a->cmd, name);
    if (i >= 0 && a->cmd->opts[i].name == name) {
        c->slot[h].name = name;
        c->slot[h].index = i;
    } else if (fits && len > 0) {
        memcpy(c->text[t].text, name, len + 1);
        c->text[t].index = i;
    }
    return i;
}

int cli_declared(const cli_args *a, const char *name)
{
    return cached_index(a, name) >= 0;
}

/* The index of a name the command declares.  Looking up one it does not
 * declare is a mistake in the program (a misspelt name would otherwise
 * read as "absent" for ever): say which and stop, so every test that
 * reaches it fails. */
static int declared_index(const cli_args *a, const char *name)
{
    int i = cached_index(a, name);
    if (i < 0) {
        fflush(stdout);
        fprintf(stderr, "coaxline: %s: internal error: option '%s' is looked up but not "
                        "declared in the command's option table\n", a->cmd->name, name);
        abort();
    }
    return i;
}

/* Option i's count and k-th value: a batch cell first, then the command
 * line's values. */
static size_t count_at(const cli_args *a, int i)
{
    if (a->row && a->row[i] && a->row[i][0] != '\0') return 1;
    return a->nval[i];
}

static const char *value_at(const cli_args *a, int i, size_t k)
{
    if (a->row && a->row[i] && a->row[i][0] != '\0') return k == 0 ? a->row[i] : NULL;
    return k < a->nval[i] ? a->val[i][k] : NULL;
}

size_t cli_count(const cli_args *a, const char *name)
{
    return count_at(a, declared_index(a, name));
}

const char *cli_get(const cli_args *a, const char *name, size_t k)
{
    return value_at(a, declared_index(a, name), k);
}

const char *cli_get_if(const cli_args *a, const char *name)
{
    int i = cached_index(a, name);
    return i >= 0 ? value_at(a, i, 0) : NULL;
}

size_t cli_count_if(const cli_args *a, const char *name)
{
    int i = cached_index(a, name);
    return i >= 0 ? count_at(a, i) : 0;
}

int cli_flag_if(const cli_args *a, const char *name)
{
    return cli_declared(a, name) && cli_flag(a, name);
}

int cli_flag(const cli_args *a, const char *name)
{
    const char *v = cli_get(a, name, 0);
    if (!v) return 0;
    return strcmp(v, "0") != 0 && strcmp(v, "no") != 0 && strcmp(v, "false") != 0;
}

static int is_digit_byte(char c)
{
    return c >= '0' && c <= '9';
}

/* In a list of numbers with units a comma straight between two digits is
 * a decimal comma (1,83 for 1.83) or a thousands separator (1,830kHz) as
 * often as a list (1 and 83): refused.  Band names (160,80) and orders
 * (1,2,3) have no decimals.  Returns -1 after cli_error. */
static int decimal_comma(const cli_ctx *ctx, const char *name, const char *v)
{
    if (strcmp(name, "band") == 0 || strcmp(name, "order") == 0) return 0;
    for (const char *dc = v; *dc; dc++) {
        if ((*dc != ',' && *dc != ';') || dc == v || !is_digit_byte(dc[-1]) ||
            !is_digit_byte(dc[1]))
            continue;
        cli_error(ctx, name, strcmp(name, "length") == 0
                      ? "'.' as the decimal mark and units or a space between "
                        "items, e.g. 20.3m, or 20m,3m for two lines"
                      : "'.' as the decimal mark and units or a space between "
                        "items, e.g. 1.83MHz,3.5MHz or 1.83, 3.5",
                  "'%s': a comma between digits may be a decimal comma or a "
                  "thousands separator", v);
        return -1;
    }
    return 0;
}

/* The items of copy (split in place on ',' and ';', empty ones and
 * leading blanks dropped, as strtok_r would) after the *n already in
 * items.  Returns -1 after cli_error. */
static int split_items(const cli_ctx *ctx, const char *name, char *p, const char **items,
                       size_t *n, size_t max)
{
    size_t before = *n;
    for (;;) {
        while (*p == ',' || *p == ';') p++;
        if (*p == '\0') break;
        char *tok = p;
        while (*p && *p != ',' && *p != ';') p++;
        int last = *p == '\0';
        *p = '\0';
        while (*tok == ' ') tok++;
        if (*tok != '\0') {
            if (*n == max) {
                cli_error(ctx, name, "fewer items", "more than %zu items", max);
                return -1;
            }
            items[(*n)++] = tok;
        }
        if (last) break;
        p++;
    }
    if (*n == before) {
        /* --freq '' or ',,' must not pass as "no frequency given" */
        cli_error(ctx, name, "one or more values separated by commas", "value is empty");
        return -1;
    }
    return 0;
}

int cli_items(const cli_ctx *ctx, const cli_args *a, const char *name,
              char *buf, size_t bufsize, const char **items, size_t max)
{
    int oi = declared_index(a, name);
    size_t n = 0, used = 0, nv = count_at(a, oi);
    for (size_t k = 0; k < nv; k++) {
        const char *v = value_at(a, oi, k);
        size_t len = strlen(v);
        if (used + len + 1 > bufsize) {
            cli_error(ctx, name, "a shorter list", "list is too long");
            return -1;
        }
        if (decimal_comma(ctx, name, v)) return -1;
        char *copy = buf + used;
        memcpy(copy, v, len + 1);
        used += len + 1;
        if (split_items(ctx, name, copy, items, &n, max)) return -1;
    }
    return (int)n;
}

/* ---- parsers with field names ----------------------------------------- */

/* The hints for a unit or separator written the way another convention
 * writes it, at text[pos] where parsing stopped: cli_error's exit status,
 * or 0 when none fits. */
static int report_unit_hint(const cli_ctx *ctx, const char *field, const char *text,
                            size_t pos, const char *expected)
{
    int at_text = pos < strlen(text);
    if (at_text && text[pos] == 'm' && (text[pos + 1] == 'h' || text[pos + 1] == 'H'))
        return cli_error(ctx, field, expected,
                         "'%s': mHz would be millihertz; write MHz for megahertz", text);
    if (at_text && (text[pos] == 'M' || text[pos] == 'P') &&
        strchr("sSmM", text[pos + 1]) && text[pos + 1] != '\0')
        return cli_error(ctx, field, expected,
                         "'%s': a capital %c is a mega or peta prefix; write the unit in "
                         "lower case (ms, mm, ps)", text, text[pos]);
    if (pos > 0 && text[pos - 1] == '\'' && strspn(text + pos, "0123456789") >= 3)
        return cli_error(ctx, field, expected,
                         "'%s': an apostrophe before three digits looks like a thousands "
                         "separator", text);
    return 0;
}

static int report_parse(const cli_ctx *ctx, const char *field, const char *text,
                        cxl_status st, size_t pos, const char *kind,
                        const char *expected)
{
    if (st == CXL_ERANGE)
        return cli_error(ctx, field, expected, "'%s' is too large or too small", text);
    if (strchr(text, ',') && strspn(text, "0123456789,. \t") >= (size_t)(strchr(text, ',') - text))
        return cli_error(ctx, field, expected,
                         "'%s' uses a comma; the decimal mark is '.'", text);
    if (text[0] == '\0' || strspn(text, " \t") == strlen(text))
        return cli_error(ctx, field, expected, "value is empty");
    int hinted = report_unit_hint(ctx, field, text, pos, expected);
    if (hinted) return hinted;
    return cli_error(ctx, field, expected, "'%s' is not a %s (stuck at character %zu)",
                     text, kind, pos + 1);
}

static int check_sign(const cli_ctx *ctx, const char *field, const char *text,
                      double v, int sign_rule, const char *expected)
{
    if (sign_rule == CLI_POSITIVE && !(v > 0.0))
        return cli_error(ctx, field, expected, "'%s' must be greater than zero", text);
    if (sign_rule == CLI_NONNEG && v < 0.0)
        return cli_error(ctx, field, expected, "'%s' must not be negative", text);
    return 0;
}

/* What one kind of quantity needs for its messages; its bounds are its
 * row of cli_bounds. */
typedef struct quantity {
    const char *kind;            /* "length" */
    const char *expected;        /* example for a parse or sign error */
    cli_bound_id bound;
    const char *example;         /* ", such as 1.83MHz" after the range, or "" */
    const char *below, *above;   /* "below", "longer than" before the bound */
} quantity;

static const quantity LENGTH = {
    "length", "a length such as 12.5m, 1250mm, 41ft 6in or 41' 6 3/8\"",
    CLI_BOUND_DISTANCE, "", "shorter than", "longer than" };
static const quantity FREQUENCY = {
    "frequency", "a frequency such as 1.83MHz, 1830kHz or 1830000Hz",
    CLI_BOUND_FREQ, ", such as 1.83MHz", "below", "above" };
static const quantity TIME = {
    "time", "a time such as 33.4ns or 0.0334us",
    CLI_BOUND_TIME, ", such as 33.4ns", "shorter than", "longer than" };

/* The steps every quantity shares: report a parse error, check the sign
 * and the bounds, store. */
static int finish_quantity(const cli_ctx *ctx, const char *field, const char *text,
                           cxl_status st, size_t pos, double v, int sign_rule,
                           const quantity *q, double *out)
{
    if (st != CXL_OK) return report_parse(ctx, field, text, st, pos, q->kind, q->expected);
    if (check_sign(ctx, field, text, v, sign_rule, q->expected)) return CLI_EXIT_USAGE;
    const cli_bound *b = &cli_bounds[q->bound];
    if (fabs(v) > b->max || fabs(v) < b->min) {
        char range[96], expected[160];
        snprintf(expected, sizeof expected, "a %s %s%s", q->kind,
                 cli_bound_range(range, sizeof range, q->bound), q->example);
        return cli_error(ctx, field, expected, "'%s' is %s %s", text,
                         fabs(v) > b->max ? q->above : q->below,
                         fabs(v) > b->max ? b->max_text : b->min_text);
    }
    *out = v;
    return 0;
}

int cli_length(const cli_ctx *ctx, const char *field, const char *text,
               int sign_rule, double *length_m)
{
    size_t pos = 0;
    double v = 0.0;
    cxl_status st = cxl_units_parse_length(text, ctx->units, &v, &pos);
    return finish_quantity(ctx, field, text, st, pos, v, sign_rule, &LENGTH, length_m);
}

int cli_freq(const cli_ctx *ctx, const char *field, const char *text,
             double *freq_hz)
{
    size_t pos = 0;
    double v = 0.0;
    cxl_status st = cxl_units_parse_freq(text, &v, &pos);
    return finish_quantity(ctx, field, text, st, pos, v, CLI_POSITIVE, &FREQUENCY, freq_hz);
}

int cli_time(const cli_ctx *ctx, const char *field, const char *text,
             int sign_rule, double *delay_s)
{
    size_t pos = 0;
    double v = 0.0;
    cxl_status st = cxl_units_parse_time(text, &v, &pos);
    return finish_quantity(ctx, field, text, st, pos, v, sign_rule, &TIME, delay_s);
}

int cli_number(const cli_ctx *ctx, const char *field, const char *text,
               double lo, double hi, const char *expected, double *value)
{
    size_t pos = 0;
    double v;
    cxl_status st = cxl_units_parse_number(text, &v, &pos);
    if (st != CXL_OK) return report_parse(ctx, field, text, st, pos, "number", expected);
    if (v < lo || v > hi) {
        char a[32], b[32];
        return cli_error(ctx, field, expected, "'%s' is outside %s to %s", text,
                         cli_fmt(a, sizeof a, lo, 4), cli_fmt(b, sizeof b, hi, 4));
    }
    *value = v;
    return 0;
}

int cli_vf(const cli_ctx *ctx, const char *field, const char *text, double *vf)
{
    static const char expected[] = "a velocity factor from 0.01 to 1, such as 0.66";
    size_t pos = 0;
    double v;
    cxl_status st = cxl_units_parse_number(text, &v, &pos);
    if (st != CXL_OK) return report_parse(ctx, field, text, st, pos, "number", expected);
    if (v > 1.0 && v <= 100.0)
        return cli_error(ctx, field, expected, "%s is above 1%s", text,
                         v > 40.0 ? " (a percentage? write it as a ratio)" : "");
    if (!(v > 0.0) || v > 1.0)
        return cli_error(ctx, field, expected, "%s is out of range", text);
    if (v < CLI_MIN_VF)
        return cli_error(ctx, field, expected, "%s is below %s, slower than any line", text,
                         cli_bounds[CLI_BOUND_VF].min_text);
    *vf = v;
    return 0;
}

/* ---- cables ---------------------------------------------------------- */

typedef cxl_status (*load_fn)(cxl_catalog *, FILE *, const char *, size_t *, char *, size_t);

/* Load one user file; a missing optional file is not an error. */
static int load_user_file(cli_ctx *ctx, const char *field, const char *path,
                          int optional, load_fn load)
{
    FILE *fp = cli_open_read(ctx, field, path, "a readable CSV file", optional);
    if (!fp) return optional && errno == ENOENT ? 0 : -1;
    char msg[400];
    size_t line = 0;
    msg[0] = '\0';
    cxl_status st = load(ctx->catalog, fp, path, &line, msg, sizeof msg);
    fclose(fp);
    if (st != CXL_OK) {
        cli_error(ctx, field, strcmp(field, "cables") == 0
                      ? "columns as in data/cables.csv: name,vf required, e.g. myspool,0.83"
                      : "columns name,freq_mhz,loss_db_per_100m for a user cable",
                  "%s", msg[0] ? msg : cxl_strerror(st));
        return -1;
    }
    return 0;
}

const cxl_catalog *cli_catalog(cli_ctx *ctx)
{
    if (ctx->catalog || ctx->catalog_failed) return ctx->catalog;
    if (cxl_catalog_new(&ctx->catalog) != CXL_OK) {
        ctx->catalog_failed = 1;
        cli_error(ctx, "cables", NULL, "cannot build the cable catalog");
        return NULL;
    }
    /* user files are not per row: report them without a batch line */
    cli_ctx top = *ctx;
    top.input_name = NULL;
    char cables[4096], loss[4096];
    const char *dir = getenv(CLI_CABLE_DIR_ENV);
    const char *cables_path = ctx->cables_path, *loss_path = ctx->loss_path;
    int optional_cables = 0, optional_loss = 0;
    if (!cables_path && dir && dir[0]) {
        snprintf(cables, sizeof cables, "%s/cables.csv", dir);
        cables_path = cables;
        optional_cables = 1;
    }
    if (!loss_path && dir && dir[0]) {
        snprintf(loss, sizeof loss, "%s/cable_loss.csv", dir);
        loss_path = loss;
        optional_loss = 1;
    }
    if ((cables_path && load_user_file(&top, "cables", cables_path, optional_cables,
                                       cxl_catalog_load_cables)) ||
        (loss_path && load_user_file(&top, "cable-loss", loss_path, optional_loss,
                                     cxl_catalog_load_loss))) {
        cxl_catalog_free(ctx->catalog);
        ctx->catalog = NULL;
        ctx->catalog_failed = 1;
    }
    return ctx->catalog;
}

int cli_cable_index(cli_ctx *ctx, const char *name, size_t *index)
{
    const cxl_catalog *cat = cli_catalog(ctx);
    if (!cat) return CLI_EXIT_USAGE;
    if (cxl_catalog_find(cat, name, index) != CXL_OK)
        return cli_error(ctx, "cable", "a name listed by coaxline cables, or one from --cables FILE",
                         "unknown cable '%s'", name);
    return 0;
}

int cli_vf_or_cable(cli_ctx *ctx, const cli_args *a, double *vf, const char **cable_name)
{
    const char *v = cli_get(a, "vf", 0), *c = cli_get(a, "cable", 0);
    if (cable_name) *cable_name = "";
    if (v && c)
        return cli_error(ctx, "vf", "--vf 0.66 or --cable NAME, not both",
                         "both --vf and --cable are given");
    if (v) return cli_vf(ctx, "vf", v, vf);
    if (!c)
        return cli_error(ctx, "vf", "--vf 0.66, or --cable NAME from coaxline cables",
                         "velocity factor is needed");
    size_t i;
    if (cli_cable_index(ctx, c, &i)) return CLI_EXIT_USAGE;
    const char *name = "";
    cxl_catalog_name(cli_catalog(ctx), i, &name);
    if (cxl_catalog_value(cli_catalog(ctx), i, CXL_CABLE_VF, vf) != CXL_OK)
        return cli_error(ctx, "cable", "a cable with a vf value", "cable '%s' has no velocity factor", c);
    if (*vf < CLI_MIN_VF) /* a user file's row: the same floor as --vf */
        return cli_error(ctx, "cable", "a cable with a velocity factor of 0.01 or more",
                         "cable '%s' has a velocity factor below %s", c,
                         cli_bounds[CLI_BOUND_VF].min_text);
    if (cable_name) *cable_name = name;
    return 0;
}

/* ---- output ----------------------------------------------------------- */

const char *cli_fmt(char *buf, size_t size, double value, int decimals)
{
    if (cxl_units_format_fixed(value, decimals, buf, size) != CXL_OK)
        snprintf(buf, size, "?");
    return buf;
}

const char *cli_fmt_length(const cli_ctx *ctx, char *buf, size_t size,
                           double length_m)
{
    char m[48], imp[48];
    cli_fmt(m, sizeof m, length_m, 3);
    if (cxl_units_format_imperial(length_m, imp, sizeof imp) != CXL_OK)
        snprintf(imp, sizeof imp, "?");
    if (ctx->units == CXL_UNITS_IMPERIAL)
        snprintf(buf, size, "%s (%s m)", imp, m);
    else
        snprintf(buf, size, "%s m (%s)", m, imp);
    return buf;
}

/* A control character at s (one byte, or len 2 for a C1 control) as an
 * escape at out; *written gets its length.  Returns the bytes of s used. */
static size_t escape_control(char *out, size_t room, const char *s, size_t len,
                             size_t *written)
{
    unsigned char c = (unsigned char)*s;
    if (len == 2) { /* C1 control, e.g. U+009B (CSI) */
        *written = (size_t)snprintf(out, room, "\\u%04x", (unsigned char)s[1]);
        return 2;
    }
    const char *e = c == 0x1b ? "\\e" : c == '\r' ? "\\r" : c == '\n' ? "\\n"
                  : c == '\t' ? "\\t" : NULL;
    if (e) *written = (size_t)snprintf(out, room, "%s", e);
    else *written = (size_t)snprintf(out, room, "\\x%02x", c);
    return 1;
}

const char *cli_escape(char *buf, size_t size, const char *s)
{
    size_t n = 0;
    if (size == 0) return "";
    while (s && *s && n + 7 < size) {
        unsigned char c = (unsigned char)*s;
        size_t len = cli_utf8_len(s);
        if (c >= 0x20 && c != 0x7f && len == 1) {
            buf[n++] = *s++;
        } else if (len > 1 && !(c == 0xC2 && (unsigned char)s[1] < 0xA0)) {
            memcpy(buf + n, s, len);
            n += len;
            s += len;
        } else {
            size_t written = 0;
            s += escape_control(buf + n, size - n, s, len, &written);
            n += written;
        }
    }
    buf[n] = '\0';
    return buf;
}

/* Escaped copy of a label for a terminal (cli_label); a label is at most
 * a batch cell (64 KiB) or an argument, and each byte takes at most 6. */
static const char *escape_label(const char *s)
{
    static _Thread_local char buf[6 * 65536 + 1]; /* one per --jobs thread */
    return cli_escape(buf, sizeof buf, s);
}

const char *cli_label(const cli_args *a)
{
    const char *l = cli_get_if(a, "label");
    if (!l) return "";
    if (a->text_labels)
        for (const char *p = l; *p; p++) {
            unsigned char c = (unsigned char)*p;
            if (c < 0x20 || c >= 0x7f) return escape_label(l);
        }
    return l;
}

/* The length of the UTF-8 sequence a lead byte c >= 0x80 starts, or 0
 * when c cannot start one. */
static inline size_t utf8_lead_len(unsigned char c)
{
    size_t n = (c & 0xE0) == 0xC0 ? 2 : (c & 0xF0) == 0xE0 ? 3 : (c & 0xF8) == 0xF0 ? 4 : 0;
    return c == 0xC0 || c == 0xC1 || c >= 0xF5 ? 0 : n;
}

/* Second-byte ranges of RFC 3629, section 4: no overlong forms
 * (E0 80-9F, F0 80-8F), no surrogates (ED A0-BF), nothing above
 * U+10FFFF (F4 90-BF). */
static inline int utf8_second_ok(unsigned char lead, unsigned char second)
{
    return !((lead == 0xE0 && second < 0xA0) || (lead == 0xED && second > 0x9F) ||
             (lead == 0xF0 && second < 0x90) || (lead == 0xF4 && second > 0x8F));
}

size_t cli_utf8_len(const char *s)
{
    const unsigned char *p = (const unsigned char *)s;
    unsigned char c = p[0];
    if (c < 0x80) return c ? 1 : 0;
    size_t n = utf8_lead_len(c);
    if (n == 0) return 0;
    for (size_t k = 1; k < n; k++)
        if ((p[k] & 0xC0) != 0x80) return 0;
    return utf8_second_ok(c, p[1]) ? n : 0;
}

/* JSON string with escapes; bytes that are not valid UTF-8 become U+FFFD
 * so the document always parses. */
static void json_string(FILE *fp, const char *s)
{
    const unsigned char *p = (const unsigned char *)s;
    putc('"', fp);
    while (*p) {
        unsigned char c = *p;
        if (c == '"' || c == '\\') { putc('\\', fp); putc(c, fp); p++; continue; }
        if (c < 0x20) { fprintf(fp, "\\u%04x", c); p++; continue; }
        size_t n = cli_utf8_len((const char *)p);
        if (n) { fwrite(p, 1, n, fp); p += n; }
        else { fputs("\xEF\xBF\xBD", fp); p++; }
    }
    putc('"', fp);
}

void cli_table_header(cli_ctx *ctx, const cli_col *cols, size_t ncols)
{
    if (ctx->header_done) return;
    ctx->header_done = 1;
    if (ctx->format == CLI_CSV) {
        for (size_t i = 0; i < ncols; i++) {
            if (i) putc(',', ctx->out);
            fputs(cols[i].name, ctx->out);
        }
        putc('\n', ctx->out);
    } else if (ctx->format == CLI_JSON) {
        fputs("[\n", ctx->out);
    }
}

/* Bytes a CSV text cell cannot carry as they are (cxl_csv_write_field
 * quotes them); first bytes it neutralises; both as lib/csv.c has them. */
static int csv_special(unsigned char c)
{
    return c == ',' || c == '"' || c == '\r' || c == '\n' || c == ';' || c == '\t';
}

enum { CSV_PLAIN_MAX = 64 }; /* longer text goes through cxl_csv_write_field */

/* Copies text s to dst (room for CSV_PLAIN_MAX bytes) when it needs
 * neither quotes nor neutralising, in one pass with its length; returns
 * the length, or -1 when cxl_csv_write_field must write it. */
static int csv_plain(char *dst, const char *s)
{
    unsigned char c = (unsigned char)s[0];
    if (c == '=' || c == '+' || c == '-' || c == '@' || c == ' ' || c == '\t' || c == '\r')
        return -1;
    int n = 0;
    for (; (c = (unsigned char)s[n]) != '\0'; n++) {
        if (n == CSV_PLAIN_MAX || csv_special(c)) return -1;
        dst[n] = (char)c;
    }
    return n;
}

/* The row is assembled in one buffer and written with one fwrite: a putc
 * or fputs per cell was a fifth of a batch's time (tests/bench).  Numbers
 * are formatted straight into it; text that needs neither quotes nor
 * neutralising is copied as it is, which is what cxl_csv_write_field
 * would write; other text goes through it after the buffer is flushed.
 * If the writer's rules change (lib/csv.c), change csv_plain with them. */
static void csv_row(cli_ctx *ctx, const cli_col *cols, size_t ncols, const cli_cell *cells)
{
    char line[1024];
    size_t used = 0;
    for (size_t i = 0; i < ncols; i++) {
        if (used + CSV_PLAIN_MAX + 2 > sizeof line) {
            fwrite(line, 1, used, ctx->out);
            used = 0;
        }
        if (i) line[used++] = ',';
        if (!cells[i].present) continue;
        char *dst = line + used;
        if (cols[i].decimals >= 0) {
            if (cxl_units_format_fixed(cells[i].value, cols[i].decimals, dst, CSV_PLAIN_MAX) != CXL_OK)
                memcpy(dst, "?", 2);
            used += strlen(dst);
            continue;
        }
        int len = csv_plain(dst, cells[i].text);
        if (len >= 0) {
            used += (size_t)len;
            continue;
        }
        fwrite(line, 1, used, ctx->out);
        used = 0;
        cxl_csv_write_field(ctx->out, cells[i].text, 1);
    }
    line[used++] = '\n';
    fwrite(line, 1, used, ctx->out);
}

static void json_row(cli_ctx *ctx, const cli_col *cols, size_t ncols, const cli_cell *cells)
{
    char num[64];
    fputs(ctx->rows_out ? ",\n  {" : "  {", ctx->out);
    for (size_t i = 0; i < ncols; i++) {
        if (i) fputs(", ", ctx->out);
        json_string(ctx->out, cols[i].name);
        putc(':', ctx->out);
        if (!cells[i].present) fputs("null", ctx->out);
        else if (cols[i].decimals < 0) json_string(ctx->out, cells[i].text);
        else if (cxl_units_format_roundtrip(cells[i].value == 0.0 ? 0.0 : cells[i].value,
                                            num, sizeof num) == CXL_OK)
            fputs(num, ctx->out); /* -0.0 prints as 0: no "-0" in JSON */
        else fputs("null", ctx->out);
    }
    putc('}', ctx->out);
}

void cli_table_row(cli_ctx *ctx, const cli_col *cols, size_t ncols,
                   const cli_cell *cells)
{
    cli_table_header(ctx, cols, ncols);
    if (ctx->format == CLI_CSV) csv_row(ctx, cols, ncols, cells);
    else if (ctx->format == CLI_JSON) json_row(ctx, cols, ncols, cells);
    ctx->rows_out++;
}

void cli_table_close(cli_ctx *ctx)
{
    if (ctx->format != CLI_JSON) return;
    if (!ctx->header_done) fputs("[", ctx->out);
    fputs(ctx->rows_out ? "\n]\n" : "]\n", ctx->out);
}
