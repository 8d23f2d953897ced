/* layout.c - the layout CSV of an array (array, harness): one row per
 * element with label,x,y,z,delay,line,degrees,invert,weight, and the
 * as-built file of the array command (label,line,phase_error,imbalance).
 * Every problem is one line naming the file line and the column. */
#include <config.h>
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

enum { COL_LABEL, COL_X, COL_Y, COL_Z, COL_DELAY, COL_LINE, COL_DEGREES, COL_INVERT,
       COL_WEIGHT, NCOL };
static const char *const col_name[NCOL] = { "label", "x", "y", "z", "delay", "line",
                                            "degrees", "invert", "weight" };
#define HEADER_EXAMPLE "a header such as label,x,y,z,delay,line,degrees,invert,weight"

/* Two elements closer than this are at the same place. */
#define SAME_PLACE_M 1e-3
/* A delay and a line given together must agree this closely. */
#define DELAY_MATCH_REL 1e-3
#define DELAY_MATCH_ABS_S 1e-11

/* Column indexes of a header; -1 for a column the file lacks.  Unknown
 * non-empty names are refused (a typo must not silently drop a value). */
static int map_header(const cli_ctx *ctx, const char *field, const cxl_csv_reader *rd,
                      const char *const *names, int n, int *map, const char *example)
{
    for (int c = 0; c < n; c++) map[c] = -1;
    for (size_t i = 0; i < cxl_csv_reader_nfields(rd); i++) {
        const char *h = cxl_csv_reader_field(rd, i);
        if (!h[0]) continue;   /* a trailing empty column */
        int found = -1;
        for (int c = 0; c < n; c++)
            if (strcmp(h, names[c]) == 0) found = c;
        if (found < 0)
            return cli_error(ctx, field, example, "unknown column '%s'", h);
        if (map[found] >= 0)
            return cli_error(ctx, field, example, "column '%s' appears twice", h);
        map[found] = (int)i;
    }
    return 0;
}

static const char *cell(const cxl_csv_reader *rd, const int *map, int c)
{
    if (map[c] < 0 || (size_t)map[c] >= cxl_csv_reader_nfields(rd)) return "";
    return cxl_csv_reader_field(rd, (size_t)map[c]);
}

/* yes/no (also true/false, 1/0, and an empty cell for no). */
static int parse_yes_no(const cli_ctx *ctx, const char *field, const char *text, int *out)
{
    static const char *const yes[] = { "yes", "true", "1", "y" };
    static const char *const no[] = { "no", "false", "0", "n", "" };
    for (size_t i = 0; i < sizeof yes / sizeof yes[0]; i++)
        if (strcmp(text, yes[i]) == 0) return *out = 1, 0;
    for (size_t i = 0; i < sizeof no / sizeof no[0]; i++)
        if (strcmp(text, no[i]) == 0) return *out = 0, 0;
    return cli_error(ctx, field, "yes or no", "'%s' is neither yes nor no", text);
}

/* The element's label (E1, E2, ... when the cell is empty) and position. */
static int row_place(cli_ctx *rc, const cxl_csv_reader *rd, const int *map, size_t index,
                     cli_layout_elem *e)
{
    const char *t = cell(rd, map, COL_LABEL);
    if (strlen(t) >= sizeof e->label)
        return cli_error(rc, "label", "a label of at most 63 bytes", "label is too long");
    if (t[0]) snprintf(e->label, sizeof e->label, "%s", t);
    else snprintf(e->label, sizeof e->label, "E%zu", index + 1);
    for (int c = COL_X; c <= COL_Y; c++)
        if (!cell(rd, map, c)[0])
            return cli_error(rc, col_name[c], "a position such as 12.5m",
                             "element '%s' has no %s position", e->label, col_name[c]);
    if (cli_length(rc, "x", cell(rd, map, COL_X), CLI_ANY, &e->x_m) ||
        cli_length(rc, "y", cell(rd, map, COL_Y), CLI_ANY, &e->y_m))
        return CLI_EXIT_USAGE;
    if (cell(rd, map, COL_Z)[0] && cli_length(rc, "z", cell(rd, map, COL_Z), CLI_ANY, &e->z_m))
        return CLI_EXIT_USAGE;
    return 0;
}

/* Two ways of giving the feed delay disagree beyond rounding. */
static int delays_differ(double d_s, double delay_s)
{
    return fabs(d_s - delay_s) > fmax(DELAY_MATCH_REL * delay_s, DELAY_MATCH_ABS_S);
}

/* The delay of the line column at vf; it must agree with a delay column
 * (*have_delay). */
static int line_delay(cli_ctx *rc, const char *text, double vf, cli_layout_elem *e,
                      int have_delay, double *delay_s)
{
    if (!(vf > 0.0))
        return cli_error(rc, "line", "--vf 0.66 or --cable NAME with a line column",
                         "element '%s': a line length needs the cable's velocity factor",
                         e->label);
    if (cli_length(rc, "line", text, CLI_NONNEG, &e->line_m)) return CLI_EXIT_USAGE;
    e->has_line = 1;
    double d = e->line_m / (vf * CXL_C_M_PER_S);
    if (have_delay && delays_differ(d, *delay_s)) {
        char b1[32], b2[32], b3[32], b4[32];
        return cli_error(rc, "delay", "a delay the line makes at its VF, or only one of them",
                         "element '%s': delay %s ns but line %s m at VF %s makes %s ns",
                         e->label, cli_fmt(b1, sizeof b1, *delay_s * 1e9, 3),
                         cli_fmt(b2, sizeof b2, e->line_m, 3), cli_fmt(b3, sizeof b3, vf, 4),
                         cli_fmt(b4, sizeof b4, d * 1e9, 3));
    }
    *delay_s = d;
    return 0;
}

/* The delay of the degrees column at design_hz; it must agree with the
 * delay the element has from its column `from` (NULL: none). */
static int degrees_delay(cli_ctx *rc, const char *text, double design_hz,
                         const cli_layout_elem *e, const char *from, double *delay_s)
{
    double deg;
    if (cli_bounded(rc, "degrees", text, CLI_BOUND_DEGREES,
                   "electrical degrees, 0 or more, such as 90", &deg))
        return CLI_EXIT_USAGE;
    if (!(design_hz > 0.0))
        return cli_error(rc, "degrees", "--design-freq 1.83MHz with a degrees column",
                         "element '%s': electrical degrees need the frequency they hold at",
                         e->label);
    double d = deg / (360.0 * design_hz);
    if (from && delays_differ(d, *delay_s))
        return cli_error(rc, "degrees", "the degrees the delay makes at --design-freq, or one of them",
                         "element '%s': %s deg at the design frequency disagrees with its %s",
                         e->label, text, from);
    *delay_s = d;
    return 0;
}

/* The feed delay: any of delay, line, degrees; those given must agree. */
static int row_delay(cli_ctx *rc, const cxl_csv_reader *rd, const int *map, double vf,
                     double design_hz, cli_layout_elem *e)
{
    double delay = 0.0;
    const char *from = NULL;
    if (cell(rd, map, COL_DELAY)[0]) {
        if (cli_time(rc, "delay", cell(rd, map, COL_DELAY), CLI_NONNEG, &delay))
            return CLI_EXIT_USAGE;
        from = "delay";
    }
    if (cell(rd, map, COL_LINE)[0]) {
        if (line_delay(rc, cell(rd, map, COL_LINE), vf, e, from != NULL, &delay))
            return CLI_EXIT_USAGE;
        from = "line";
    }
    if (cell(rd, map, COL_DEGREES)[0] &&
        degrees_delay(rc, cell(rd, map, COL_DEGREES), design_hz, e, from, &delay))
        return CLI_EXIT_USAGE;
    if (!(delay <= CLI_MAX_TIME_S))
        return cli_error(rc, "delay", "a feed delay up to 1 s", "element '%s': delay too long",
                         e->label);
    e->delay_s = delay;
    return 0;
}

static int row(cli_ctx *rc, const cxl_csv_reader *rd, const int *map, size_t index,
               double vf, double design_hz, cli_layout_elem *e)
{
    memset(e, 0, sizeof *e);
    e->file_line = cxl_csv_reader_line(rd);
    if (row_place(rc, rd, map, index, e) || row_delay(rc, rd, map, vf, design_hz, e))
        return CLI_EXIT_USAGE;
    if (parse_yes_no(rc, "invert", cell(rd, map, COL_INVERT), &e->invert)) return CLI_EXIT_USAGE;
    if (cell(rd, map, COL_WEIGHT)[0] &&
        cli_bounded(rc, "weight", cell(rd, map, COL_WEIGHT), CLI_BOUND_LEVEL_DB,
                   "a relative amplitude in dB, -60 to 60, such as -3", &e->weight_db))
        return CLI_EXIT_USAGE;
    return 0;
}

/* Open path ("-": standard input) for reading, or report it. */
static FILE *open_input(const cli_ctx *ctx, const char *field, const char *path)
{
    if (strcmp(path, "-") == 0) return stdin;
    FILE *fp = fopen(path, "rb");
    if (!fp) cli_error(ctx, field, "a readable CSV file", "cannot open '%s': %s", path, strerror(errno));
    return fp;
}

/* A CSV file being read: its stream, reader and a context whose errors
 * name the file and the current line. */
typedef struct {
    FILE *fp;
    cxl_csv_reader *rd;
    cli_ctx rc;
} csv_in;

/* Open path, read its header and map it to names; 0, or CLI_EXIT_USAGE
 * after cli_error() (nothing left open). */
static int csv_open(cli_ctx *ctx, const char *field, const char *path, const char *const *names,
                    int n, int *map, const char *example, csv_in *in)
{
    in->fp = open_input(ctx, field, path);
    if (!in->fp) return CLI_EXIT_USAGE;
    in->rc = *ctx;
    in->rc.input_name = strcmp(path, "-") == 0 ? "standard input" : path;
    in->rc.line = 0;
    if (cxl_csv_reader_new_stream(in->fp, &in->rd) != CXL_OK) {
        if (in->fp != stdin) fclose(in->fp);
        return cli_error(ctx, field, NULL, "out of memory");
    }
    int has_row = 0, code;
    cxl_status st = cxl_csv_reader_next(in->rd, &has_row);
    if (st == CXL_OK && !has_row) {
        code = cli_error(ctx, field, example, "'%s' is empty", path);
    } else if (st == CXL_OK) {
        in->rc.line = cxl_csv_reader_line(in->rd);
        code = map_header(&in->rc, field, in->rd, names, n, map, example);
    } else {
        code = cli_error(&in->rc, field, example, "malformed header (%s)", cxl_strerror(st));
    }
    if (code) {
        cxl_csv_reader_free(in->rd);
        if (in->fp != stdin) fclose(in->fp);
    }
    return code;
}

/* The next record (0 at the end or after a malformed one: see *st). */
static int csv_next(csv_in *in, cxl_status *st)
{
    int has_row = 0;
    *st = cxl_csv_reader_next(in->rd, &has_row);
    if (*st != CXL_OK || !has_row) return 0;
    in->rc.line = cxl_csv_reader_line(in->rd);
    return 1;
}

/* Close the file: a malformed record or a read error is reported unless
 * code already holds an error. */
static int csv_close(csv_in *in, const char *field, cxl_status st, int code)
{
    if (!code && st != CXL_OK)
        code = cli_error(&in->rc, field, "an RFC 4180 CSV file", "malformed CSV (%s)",
                         cxl_strerror(st));
    if (!code && ferror(in->fp))
        code = cli_error(&in->rc, field, "a readable CSV file", "read error");
    cxl_csv_reader_free(in->rd);
    if (in->fp != stdin) fclose(in->fp);
    return code;
}

/* Room for one more element: 0, or CLI_EXIT_USAGE after cli_error(). */
static int make_room(cli_ctx *ctx, cli_ctx *rc, const char *field, cli_layout *out, size_t *cap)
{
    if (out->n >= CXL_ARRAY_MAX_ELEMENTS)
        return cli_error(rc, "label", "at most 256 elements", "more than %d elements",
                         CXL_ARRAY_MAX_ELEMENTS);
    if (out->n < *cap) return 0;
    size_t ncap = *cap ? 2 * *cap : 8;
    cli_layout_elem *p = realloc(out->el, ncap * sizeof *p);
    if (!p) return cli_error(ctx, field, NULL, "out of memory");
    out->el = p;
    *cap = ncap;
    return 0;
}

/* Element e against those before it: no label twice, no two at one place. */
static int distinct(cli_ctx *rc, const cli_layout *out, const cli_layout_elem *e)
{
    for (size_t j = 0; j < out->n; j++) {
        const cli_layout_elem *o = &out->el[j];
        if (strcmp(o->label, e->label) == 0)
            return cli_error(rc, "label", "a label no other element has",
                             "label '%s' is already used on line %zu", e->label, o->file_line);
        if (fabs(o->x_m - e->x_m) < SAME_PLACE_M && fabs(o->y_m - e->y_m) < SAME_PLACE_M &&
            fabs(o->z_m - e->z_m) < SAME_PLACE_M)
            return cli_error(rc, "x", "elements at least 1 mm apart",
                             "element '%s' is at the same place as '%s' (line %zu)", e->label,
                             o->label, o->file_line);
    }
    return 0;
}

int cli_layout_load(cli_ctx *ctx, const char *field, const char *path, double vf,
                    double design_hz, cli_layout *out)
{
    memset(out, 0, sizeof *out);
    csv_in in;
    int map[NCOL];
    if (csv_open(ctx, field, path, col_name, NCOL, map, HEADER_EXAMPLE, &in))
        return CLI_EXIT_USAGE;
    int code = 0;
    if (map[COL_X] < 0 || map[COL_Y] < 0)
        code = cli_error(&in.rc, map[COL_X] < 0 ? "x" : "y", HEADER_EXAMPLE,
                         "the layout has no %s column: every element needs its position",
                         map[COL_X] < 0 ? "x" : "y");
    size_t cap = 0;
    cxl_status st = CXL_OK;
    while (!code && csv_next(&in, &st)) {
        code = make_room(ctx, &in.rc, field, out, &cap);
        if (code) break;
        cli_layout_elem *e = &out->el[out->n];
        code = row(&in.rc, in.rd, map, out->n, vf, design_hz, e);
        if (!code) code = distinct(&in.rc, out, e);
        if (!code) out->n++;
    }
    code = csv_close(&in, field, st, code);
    if (!code && out->n == 0)
        code = cli_error(ctx, field, "one row per element under the header",
                         "'%s' holds no element", path);
    if (code) cli_layout_free(out);
    return code;
}

void cli_layout_free(cli_layout *layout)
{
    free(layout->el);
    layout->el = NULL;
    layout->n = 0;
}

/* ---- the as-built file ------------------------------------------------ */

enum { AB_LABEL, AB_LINE, AB_PHASE, AB_IMBALANCE, NAB };
static const char *const ab_name[NAB] = { "label", "line", "phase_error", "imbalance" };
#define AB_EXAMPLE "a header such as label,line,phase_error,imbalance"

/* One row of the as-built file onto its element of the layout. */
static int as_built_row(cli_ctx *rc, const cxl_csv_reader *rd, const int *map,
                        cli_layout *layout)
{
    const char *label = cell(rd, map, AB_LABEL);
    cli_layout_elem *e = NULL;
    for (size_t i = 0; i < layout->n; i++)
        if (strcmp(layout->el[i].label, label) == 0) e = &layout->el[i];
    if (!e)
        return cli_error(rc, "label", "a label of the layout", "no element '%s' in the layout",
                         label);
    if (cell(rd, map, AB_LINE)[0]) {
        if (!e->has_line)
            return cli_error(rc, "line", "a measured line for an element the layout gives a line",
                             "element '%s' has no line in the layout", label);
        if (cli_length(rc, "line", cell(rd, map, AB_LINE), CLI_NONNEG, &e->built_line_m))
            return CLI_EXIT_USAGE;
    }
    if (cell(rd, map, AB_PHASE)[0] &&
        cli_bounded(rc, "phase_error", cell(rd, map, AB_PHASE), CLI_BOUND_PHASE_DEG,
                   "degrees the element lags by, -180 to 180", &e->phase_error_deg))
        return CLI_EXIT_USAGE;
    if (cell(rd, map, AB_IMBALANCE)[0] &&
        cli_bounded(rc, "imbalance", cell(rd, map, AB_IMBALANCE), CLI_BOUND_LEVEL_DB,
                   "dB the element is weaker by, -60 to 60", &e->imbalance_db))
        return CLI_EXIT_USAGE;
    return 0;
}

int cli_layout_as_built(cli_ctx *ctx, const char *field, const char *path, cli_layout *layout)
{
    for (size_t i = 0; i < layout->n; i++) {
        cli_layout_elem *e = &layout->el[i];
        e->built_line_m = e->line_m;
        e->phase_error_deg = 0.0;
        e->imbalance_db = 0.0;
    }
    csv_in in;
    int map[NAB];
    if (csv_open(ctx, field, path, ab_name, NAB, map, AB_EXAMPLE, &in)) return CLI_EXIT_USAGE;
    int code = 0;
    if (map[AB_LABEL] < 0)
        code = cli_error(&in.rc, "label", AB_EXAMPLE, "the as-built file has no label column");
    cxl_status st = CXL_OK;
    while (!code && csv_next(&in, &st))
        code = as_built_row(&in.rc, in.rd, map, layout);
    return csv_close(&in, field, st, code);
}
