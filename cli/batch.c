/* batch.c - option parsing and the --input batch driver shared by every
 * command. */
#include <config.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "cli.h"

enum { OPT_FORMAT = 1000, OPT_UNITS, OPT_INPUT, OPT_JOBS, OPT_CABLES, OPT_CABLE_LOSS, OPT_QUIET,
       OPT_HELP };

const cli_optdef cli_common_opts[] = {
    { "format", "text|csv|json", "output format (default text)", 0 },
    { "units", "metric|imperial", "bare lengths and text output (default metric)", 0 },
    { "input", "FILE|-", "run once per row of a CSV whose header names the options", 0 },
    { "jobs", "N", "run --input rows on N threads, output in input order (default 1)", 0 },
    { "cables", "FILE", "user cables (CSV, same columns as data/cables.csv)", 0 },
    { "cable-loss", "FILE", "user attenuation points (CSV, as data/cable_loss.csv)", 0 },
    { "quiet", NULL, "no progress on a terminal during long runs", 0 },
    { "help", NULL, "show this help", 0 },
    { NULL, NULL, NULL, 0 }
};

/* Common options only a command that takes --input shows. */
int cli_batch_only(const char *name)
{
    return strcmp(name, "input") == 0 || strcmp(name, "jobs") == 0;
}

void cli_print_command_help(const cli_command *cmd, FILE *fp)
{
    fprintf(fp, "usage: coaxline %s %s\n%s\n\noptions:\n", cmd->name, cmd->synopsis,
            cmd->summary);
    for (int pass = 0; pass < 2; pass++) {
        const cli_optdef *o = pass ? cli_common_opts : cmd->opts;
        for (; o->name; o++) {
            if (pass && !cmd->batch && cli_batch_only(o->name)) continue;
            char left[64];
            snprintf(left, sizeof left, "--%s%s%s", o->name, o->arg ? " " : "",
                     o->arg ? o->arg : "");
            fprintf(fp, "  %-28s %s%s\n", left, o->help, o->repeat ? " (repeatable)" : "");
        }
    }
    fprintf(fp, "\nSee coaxline(1) for details.\n");
}

static int worse(int a, int b)
{
    if (a == CLI_EXIT_USAGE || b == CLI_EXIT_USAGE) return CLI_EXIT_USAGE;
    return a > b ? a : b;
}

/* ASCII-only, so a Turkish locale's dotless i cannot change a match; '_'
 * and '-' are the same, so output column names (allowance_vf) match. */
static int ascii_caseeq(const char *a, const char *b, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        char x = a[i], y = b[i];
        if (x >= 'A' && x <= 'Z') x = (char)(x - 'A' + 'a');
        if (y >= 'A' && y <= 'Z') y = (char)(y - 'A' + 'a');
        if (x == '_') x = '-';
        if (y == '_') y = '-';
        if (x != y) return 0;
    }
    return 1;
}

static int option_named(const cli_command *cmd, const char *name, size_t len)
{
    for (int i = 0; cmd->opts[i].name; i++)
        if (strlen(cmd->opts[i].name) == len && ascii_caseeq(cmd->opts[i].name, name, len))
            return i;
    return -1;
}

/* The unit endings of output column names, the kind of option (its
 * placeholder in --help) they fit, and what a bare number in such a
 * column gets appended. */
static const struct {
    const char *suffix, *arg, *unit;
} unit_columns[] = {
    { "_m", "LEN", "m" }, { "_mm", "LEN", "mm" }, { "_ft", "LEN", "ft" }, { "_in", "LEN", "in" },
    { "_hz", "F", "Hz" }, { "_khz", "F", "kHz" }, { "_mhz", "F", "MHz" },
    { "_ns", "TIME", "ns" }, { "_us", "TIME", "us" }, { "_s", "TIME", "s" },
    { "_deg", "DEG", "" }, { "_db", "DB", "" }, { "_ohm", "OHM", "" },
};

/* Option index of a header name, or -1.  The option's own name, with '_'
 * for '-' (allowance_vf), or an output column name: the option with a unit
 * ending (offset_m, freq_mhz, delay_ns), whose bare numbers take that unit
 * (*unit, NULL when none), and cut's cut_length_* for a line's length. */
static int header_index(const cli_command *cmd, const char *name, const char **unit)
{
    while (*name == ' ') name++;
    size_t len = strlen(name);
    while (len > 0 && name[len - 1] == ' ') len--;
    *unit = NULL;
    int k = option_named(cmd, name, len);
    if (k >= 0) return k;
    for (size_t u = 0; u < sizeof unit_columns / sizeof unit_columns[0]; u++) {
        size_t sl = strlen(unit_columns[u].suffix);
        if (len <= sl || !ascii_caseeq(name + len - sl, unit_columns[u].suffix, sl)) continue;
        size_t stem = len - sl;
        if (stem == 10 && ascii_caseeq(name, "cut_length", 10)) {
            name = "length"; /* cut's output column: the length the line was cut to */
            stem = 6;
        }
        k = option_named(cmd, name, stem);
        if (k < 0 || !cmd->opts[k].arg || strcmp(cmd->opts[k].arg, unit_columns[u].arg) != 0)
            return -1;
        *unit = unit_columns[u].unit;
        return k;
    }
    return -1;
}

/* Options whose cells are numbers (a comma-decimal file's commas become
 * points there): not text, names, files, lists or choices. */
static int numeric_option(const cli_optdef *o)
{
    static const char *const text_args[] = { "TEXT", "NAME", "LIST", "FILE" };
    if (!o->arg || strchr(o->arg, '|')) return 0;
    for (size_t i = 0; i < sizeof text_args / sizeof text_args[0]; i++)
        if (strcmp(o->arg, text_args[i]) == 0) return 0;
    return 1;
}

enum { CELL_SIZE = 96 };

/* A cell as the option parsers read it: comma decimals of a ';' file
 * turned into points, the column's unit after a bare number.  Returns the
 * text to use (cell itself or buf), or NULL after cli_error(). */
static const char *convert_cell(const cli_ctx *ctx, const char *column, const char *cell,
                                int comma_decimals, const char *unit, char *buf)
{
    if (cell[0] == '\0' || (!comma_decimals && !unit)) return cell;
    size_t len = strlen(cell);
    if (len + 8 > CELL_SIZE) return cell; /* no number is that long: the parser says why */
    memcpy(buf, cell, len + 1);
    if (comma_decimals) {
        if (strchr(buf, '.')) {
            cli_error(ctx, column, "a number with a decimal comma, such as 0,66, and no '.'",
                      "'%s' has a '.', but this ';'-separated file writes decimals "
                      "with a comma ('.' would be a thousands separator)", cell);
            return NULL;
        }
        for (char *p = buf; (p = strchr(p, ',')) != NULL; p++)
            if (p[1] >= '0' && p[1] <= '9') *p = '.';
    }
    double v;
    if (unit && unit[0] && cxl_units_parse_number(buf, &v, NULL) == CXL_OK)
        strcat(buf, unit);
    return buf;
}

/* One line on stderr when the reader stopped: a read error, or no line
 * end for CXL_CSV_MAX_SKIP bytes.  err is errno after the failed read. */
static int reader_stopped(const cli_ctx *ctx, const char *path, cxl_status st, int err)
{
    if (st == CXL_EIO)
        return cli_error(ctx, "input", "a file that can be read to its end",
                         "read error in '%s': %s; the rows after this line were not read",
                         path, err ? strerror(err) : "input/output error");
    return cli_error(ctx, "input", "a CSV text file with a line end at least every 1 MiB",
                     "no line end in '%s' for over 1 MiB; reading stopped",
                     path);
}

/* Options that name a file the command writes (--plot, --sweep-plot). */
static int writes_file(const cli_optdef *o)
{
    size_t n = strlen(o->name);
    return strcmp(o->name, "plot") == 0 || (n > 5 && strcmp(o->name + n - 5, "-plot") == 0);
}

/* One row's name from a command-line pattern: {line} becomes the batch
 * line, {label} the row's label with '/', control bytes and a leading '.'
 * made '_' (a label cannot leave the folder the pattern names).  Returns
 * 0, or -1 when the name does not fit. */
static int expand_plot_name(const char *pattern, size_t line, const char *label, char *out,
                            size_t size)
{
    size_t n = 0;
    for (const char *p = pattern; *p; ) {
        char piece[32];
        const char *add = NULL;
        size_t len = 1;
        if (strncmp(p, "{line}", 6) == 0) {
            snprintf(piece, sizeof piece, "%zu", line);
            add = piece;
            p += 6;
        } else if (strncmp(p, "{label}", 7) == 0) {
            add = label[0] ? label : "unlabelled";
            p += 7;
        }
        if (add) {
            for (size_t k = 0; add[k]; k++) {
                if (n + 1 >= size) return -1;
                char c = add[k];
                int bad = c == '/' || (unsigned char)c < 0x20 || c == 0x7f || (k == 0 && c == '.');
                out[n++] = bad ? '_' : c;
            }
            continue;
        }
        if (n + len >= size) return -1;
        out[n++] = *p++;
    }
    out[n] = '\0';
    return 0;
}

/* The files a batch has written so far, so that no row overwrites another
 * row's plot (two rows with one label). */
typedef struct name_list {
    char **name;
    size_t *line;
    size_t n, cap;
} name_list;

/* 1 (and *line: where) when name was written before; otherwise records it
 * and returns 0.  Out of memory is reported as seen at line 0. */
static int seen_name(name_list *l, const char *name, size_t *line)
{
    for (size_t i = 0; i < l->n; i++)
        if (strcmp(l->name[i], name) == 0) { *line = l->line[i]; return 1; }
    if (l->n == l->cap) {
        size_t cap = l->cap ? 2 * l->cap : 16;
        char **nn = realloc(l->name, cap * sizeof *nn);
        if (nn) l->name = nn;
        size_t *nl = realloc(l->line, cap * sizeof *nl);
        if (nl) l->line = nl;
        if (!nn || !nl) { *line = 0; return 1; }
        l->cap = cap;
    }
    if (!(l->name[l->n] = strdup(name))) { *line = 0; return 1; }
    l->line[l->n++] = *line;
    return 0;
}

static void list_columns(const cli_command *cmd, char *buf, size_t size)
{
    size_t used = 0;
    buf[0] = '\0';
    for (int i = 0; cmd->opts[i].name && used + 2 < size; i++) {
        int w = snprintf(buf + used, size - used, "%s%s", i ? "," : "", cmd->opts[i].name);
        if (w < 0) break;
        used += (size_t)w;
    }
}

/* An open --input batch: its reader, the header's columns, the files
 * written so far, the row buffers of the row being read. */
struct cli_batch {
    const cli_command *cmd;
    const cli_args *args;        /* the command line's values */
    const char *pattern[CLI_MAX_OPTS]; /* --plot patterns as given */
    const char *path;
    FILE *fp;
    cxl_csv_reader *rd;
    int ncols, comma_decimals;
    int col_opt[CLI_MAX_OPTS];
    const char *col_unit[CLI_MAX_OPTS];
    name_list written;
    size_t rows;                 /* data rows met so far */
    int stopped;                 /* the reader stopped: no row after */
    cli_progress progress;
    const char *row[CLI_MAX_OPTS];
    const char *plot[CLI_MAX_OPTS];
    char cellbuf[CLI_MAX_OPTS][CELL_SIZE];
    char plot_names[CLI_MAX_OPTS][4096];
};

/* The header row: each column an option (col_opt), its unit ending;
 * 0, or CLI_EXIT_USAGE after cli_error(). */
static int read_columns(cli_ctx *ctx, cli_batch *b, const char *expected_header)
{
    const cli_command *cmd = b->cmd;
    size_t nf = cxl_csv_reader_nfields(b->rd);
    while (nf > 0 && cxl_csv_reader_field(b->rd, nf - 1)[0] == '\0')
        nf--; /* empty columns a spreadsheet leaves at the end */
    if (nf == 0) return cli_error(ctx, "input", expected_header, "the header row names no columns");
    if (nf > CLI_MAX_OPTS)
        return cli_error(ctx, "input", expected_header, "the header has %zu columns", nf);
    for (size_t i = 0; i < nf; i++) {
        const char *name = cxl_csv_reader_field(b->rd, i);
        int k = header_index(cmd, name, &b->col_unit[i]);
        if (k < 0) return cli_error(ctx, "input", expected_header, "unknown column '%s'", name);
        if (writes_file(&cmd->opts[k]))
            /* a file's cells must not choose where the tool writes */
            return cli_error(ctx, "input", "--" "plot 'plots/{label}.svg' on the command line",
                             "column '%s' would let the batch file name the files written; "
                             "give --%s with {line} or {label} on the command line",
                             name, cmd->opts[k].name);
        for (size_t j = 0; j < i; j++)
            if (b->col_opt[j] == k)
                return cli_error(ctx, "input", expected_header, "column '%s' appears twice", name);
        b->col_opt[i] = k;
    }
    b->ncols = (int)nf;
    return 0;
}

/* Reads the header of b (opened on path): 0, or CLI_EXIT_USAGE after
 * cli_error(). */
static int read_header(cli_ctx *ctx, cli_batch *b)
{
    char columns[512];
    list_columns(b->cmd, columns, sizeof columns);
    char expected_header[600];
    snprintf(expected_header, sizeof expected_header, "a header row naming options, from: %s",
             columns);
    int has_row = 0;
    errno = 0;
    cxl_status st = cxl_csv_reader_next(b->rd, &has_row);
    int err = errno;
    ctx->input_name = strcmp(b->path, "-") == 0 ? "stdin" : b->path;
    ctx->line = cxl_csv_reader_line(b->rd);
    if (cxl_csv_reader_stopped(b->rd) != CXL_OK)
        return reader_stopped(ctx, b->path, cxl_csv_reader_stopped(b->rd), err);
    if (st != CXL_OK || !has_row)
        return cli_error(ctx, "input", expected_header,
                         st != CXL_OK ? "the header row is malformed" : "the file is empty");
    if (read_columns(ctx, b, expected_header)) return CLI_EXIT_USAGE;
    int sep = cxl_csv_reader_separator(b->rd);
    b->comma_decimals = sep == ';';
    if (sep != ',')
        cli_note(ctx, "'%s' is %s; reading it so", b->path,
                 b->comma_decimals ? "';'-separated with decimal commas (a spreadsheet's CSV "
                                     "under a comma-decimal locale)"
                                   : "tab-separated");
    if (cxl_csv_reader_bom(b->rd) && ctx->format == CLI_CSV)
        fputs("\xEF\xBB\xBF", ctx->out); /* keep the byte-order mark for the spreadsheet */
    return 0;
}

/* The next record: 1 when there is one (has_row), 0 at the end, -1 after
 * a one-line error for a refused record (*code updated). */
static int next_record(cli_ctx *ctx, cli_batch *b, int *code)
{
    int has_row = 0;
    errno = 0;
    cxl_status st = cxl_csv_reader_next(b->rd, &has_row);
    int err = errno;
    ctx->line = cxl_csv_reader_line(b->rd);
    if (cxl_csv_reader_stopped(b->rd) != CXL_OK) {
        *code = reader_stopped(ctx, b->path, cxl_csv_reader_stopped(b->rd), err);
        b->stopped = 1;
        b->rows++;
        return -1;
    }
    if (st == CXL_ETOOLONG || st != CXL_OK) {
        *code = st == CXL_ETOOLONG
            ? cli_error(ctx, "row", "rows shorter than 65536 bytes", "the row is too long")
            : cli_error(ctx, "row", "RFC 4180 CSV: quotes closed before the next comma, no NUL bytes",
                        "malformed CSV (unbalanced quote, text after a closing quote or a NUL byte)");
        b->rows++;
        return -1;
    }
    return has_row;
}

/* The cells of the record read into b->row: 0, or CLI_EXIT_USAGE after
 * cli_error(). */
static int convert_cells(cli_ctx *ctx, cli_batch *b)
{
    const cli_command *cmd = b->cmd;
    for (int i = 0; i < CLI_MAX_OPTS; i++) b->row[i] = NULL;
    for (int i = 0; i < b->ncols; i++) {
        int k = b->col_opt[i];
        const char *cell = cxl_csv_reader_field(b->rd, (size_t)i);
        b->row[k] = convert_cell(ctx, cmd->opts[k].name, cell,
                                 b->comma_decimals && numeric_option(&cmd->opts[k]),
                                 b->col_unit[i], b->cellbuf[i]);
        if (!b->row[k]) return CLI_EXIT_USAGE;
    }
    return 0;
}

/* This row's own file for each --plot pattern (b->plot): 0, or
 * CLI_EXIT_USAGE after cli_error() (too long, or written before). */
static int name_plots(cli_ctx *ctx, cli_batch *b, cli_args *args)
{
    const cli_command *cmd = b->cmd;
    for (int i = 0; cmd->opts[i].name; i++) {
        b->plot[i] = NULL;
        if (!writes_file(&cmd->opts[i]) || b->args->nval[i] == 0) continue;
        args->row = b->row;
        const char *label = cli_get_if(args, "label");
        size_t dup_line = ctx->line;
        if (expand_plot_name(b->pattern[i], ctx->line, label ? label : "",
                             b->plot_names[i], sizeof b->plot_names[i]) != 0)
            return cli_error(ctx, cmd->opts[i].name, "a shorter file name pattern",
                             "the file name for this row is too long");
        if (seen_name(&b->written, b->plot_names[i], &dup_line))
            return cli_error(ctx, cmd->opts[i].name, "{line} in the name, or a label per row",
                             "'%s' was written for line %zu already", b->plot_names[i],
                             dup_line);
        b->plot[i] = b->plot_names[i];
    }
    return 0;
}

int cli_batch_next(cli_batch *b, cli_ctx *ctx, cli_args *args, int *code)
{
    for (;;) {
        cli_progress_step(ctx, &b->progress, b->rows);
        if (b->stopped) return CLI_ROW_END;
        int r = next_record(ctx, b, code);
        if (r < 0) return CLI_ROW_SKIP;
        if (r == 0) return CLI_ROW_END;
        size_t nf = cxl_csv_reader_nfields(b->rd), used = nf;
        while (used > 0 && cxl_csv_reader_field(b->rd, used - 1)[0] == '\0') used--;
        if (used == 0) continue; /* a row of separators only */
        b->rows++;
        if (used > (size_t)b->ncols || nf < (size_t)b->ncols) {
            *code = cli_error(ctx, "row", "one cell per header column; leave a cell empty to use the default",
                              "has %zu fields but the header has %d", nf, b->ncols);
            return CLI_ROW_SKIP;
        }
        if (convert_cells(ctx, b) || name_plots(ctx, b, args)) {
            *code = CLI_EXIT_USAGE;
            return CLI_ROW_SKIP;
        }
        return CLI_ROW_RUN;
    }
}

const char *const *cli_batch_row(const cli_batch *b) { return b->row; }
const char *const *cli_batch_plots(const cli_batch *b) { return b->plot; }

void cli_batch_apply(const cli_command *cmd, cli_args *args, const char *const *row,
                     const char *const *plot)
{
    args->row = row;
    for (int i = 0; cmd->opts[i].name; i++)
        if (plot[i]) args->val[i][0] = plot[i];
}

int cli_batch_worse(int a, int b) { return worse(a, b); }

/* The rows in turn on this thread. */
int cli_batch_run_rows(cli_batch *b, cli_ctx *ctx, cli_args *args)
{
    int code = CLI_EXIT_OK;
    for (;;) {
        int rc = CLI_EXIT_OK, kind = cli_batch_next(b, ctx, args, &rc);
        if (kind == CLI_ROW_END) break;
        if (kind == CLI_ROW_RUN) {
            cli_batch_apply(b->cmd, args, b->row, b->plot);
            rc = b->cmd->run(ctx, args);
        }
        code = worse(code, rc);
    }
    return code;
}

static int run_batch(cli_ctx *ctx, cli_args *args, const char *path)
{
    const cli_command *cmd = ctx->cmd;
    FILE *fp = strcmp(path, "-") == 0
                   ? stdin
                   : cli_open_read(ctx, "input", path,
                                   "a readable CSV file, or - for standard input", 0);
    if (!fp) return CLI_EXIT_USAGE;
    cli_batch *b = calloc(1, sizeof *b);
    if (!b || cxl_csv_reader_new_stream(fp, &b->rd) != CXL_OK) {
        free(b);
        if (fp != stdin) fclose(fp);
        return cli_error(ctx, "input", NULL, "out of memory");
    }
    b->cmd = cmd;
    b->args = args;
    b->path = path;
    b->fp = fp;
    cxl_csv_reader_set_separator(b->rd, 0); /* ',' ';' or TAB, from the header */
    const char **patterns = b->pattern;
    for (int i = 0; cmd->opts[i].name; i++)
        patterns[i] = args->nval[i] ? args->val[i][0] : NULL;
    int code = read_header(ctx, b);
    if (code == CLI_EXIT_OK) {
        cli_progress_start(ctx, &b->progress, "rows");
        code = ctx->jobs > 1 ? cli_jobs_run(b, ctx, args) : cli_batch_run_rows(b, ctx, args);
        cli_progress_end(ctx, &b->progress);
        if (b->rows == 0) {
            ctx->line = 0;
            ctx->input_name = NULL;
            code = cli_error(ctx, "input", "one data row per piece under the header",
                             "'%s' has a header but no data rows", path);
        }
    }
    for (size_t i = 0; i < b->written.n; i++) free(b->written.name[i]);
    free(b->written.name);
    free(b->written.line);
    for (int i = 0; cmd->opts[i].name; i++)
        if (patterns[i]) args->val[i][0] = patterns[i];
    args->row = NULL;
    cxl_csv_reader_free(b->rd);
    free(b);
    if (fp != stdin) fclose(fp);
    ctx->input_name = NULL;
    return code;
}

/* Edit distance between a and b (at most 63 bytes each), for the nearest
 * real option to a mistyped one. */
static size_t edit_distance(const char *a, size_t na, const char *b)
{
    size_t nb = strlen(b), row[64];
    if (na > 63) na = 63;
    if (nb > 63) nb = 63;
    for (size_t j = 0; j <= nb; j++) row[j] = j;
    for (size_t i = 1; i <= na; i++) {
        size_t diag = row[0];
        row[0] = i;
        for (size_t j = 1; j <= nb; j++) {
            size_t up = row[j];
            size_t best = diag + (a[i - 1] != b[j - 1]);
            if (up + 1 < best) best = up + 1;
            if (row[j - 1] + 1 < best) best = row[j - 1] + 1;
            row[j] = best;
            diag = up;
        }
    }
    return row[nb];
}

/* The option (command's or common) whose name is exactly name[0..len), as
 * an index into the command's options or OPT_FORMAT + k; -1 when none.
 * Only exact names count: "--freq" never stands for "--freq-step". */
static int exact_option(const cli_command *cmd, const char *name, size_t len)
{
    for (int i = 0; cmd->opts[i].name; i++)
        if (strlen(cmd->opts[i].name) == len && memcmp(cmd->opts[i].name, name, len) == 0)
            return i;
    for (int k = 0; cli_common_opts[k].name; k++)
        if (strlen(cli_common_opts[k].name) == len && memcmp(cli_common_opts[k].name, name, len) == 0)
            return OPT_FORMAT + k;
    return -1;
}

static int unknown_option(const cli_ctx *ctx, const char *arg, const char *name, size_t len)
{
    const cli_command *cmd = ctx->cmd;
    const char *best = NULL;
    size_t best_d = (size_t)-1;
    for (int pass = 0; pass < 2; pass++)
        for (const cli_optdef *o = pass ? cli_common_opts : cmd->opts; o->name; o++) {
            if (pass && !cmd->batch && cli_batch_only(o->name)) continue;
            size_t d = edit_distance(name, len, o->name);
            /* a typed beginning of a longer name is near it */
            if (len > 0 && strncmp(o->name, name, len) == 0 && d > 1) d = 1;
            if (d < best_d) { best_d = d; best = o->name; }
        }
    char expected[160];
    if (best && best_d <= 1 + len / 3)
        snprintf(expected, sizeof expected, "--%s, or another option of coaxline %s --help", best,
                 cmd->name);
    else
        snprintf(expected, sizeof expected, "an option listed by coaxline %s --help", cmd->name);
    return cli_error(ctx, NULL, expected, "unknown option '%s'", arg);
}

/* What the command line says besides the command's own options. */
typedef struct cmdline {
    const char *format, *units, *input, *jobs;
    int help, quiet;
    int first_operand, n_operands;  /* argv index of the first bare word, how many */
    unsigned common_seen;           /* a common option given twice is an error, as for others */
} cmdline;

/* Store one option's value: a common option into cl or ctx, the
 * command's own into args.  Returns 0, or CLI_EXIT_USAGE after an error. */
static int store_option(cli_ctx *ctx, cli_args *args, cmdline *cl, int c, const char *value)
{
    const cli_command *cmd = ctx->cmd;
    if (c >= OPT_FORMAT && c < OPT_HELP) {
        unsigned bit = 1u << (c - OPT_FORMAT);
        if (cl->common_seen & bit)
            return cli_error(ctx, cli_common_opts[c - OPT_FORMAT].name, "it once",
                             "given more than once");
        cl->common_seen |= bit;
    }
    if (c == OPT_FORMAT) cl->format = value;
    else if (c == OPT_UNITS) cl->units = value;
    else if (c == OPT_INPUT) cl->input = value;
    else if (c == OPT_JOBS) cl->jobs = value;
    else if (c == OPT_CABLES) ctx->cables_path = value;
    else if (c == OPT_CABLE_LOSS) ctx->loss_path = value;
    else if (c == OPT_QUIET) cl->quiet = 1;
    else if (c == OPT_HELP) cl->help = 1;
    else {
        if (args->nval[c] > 0 && !cmd->opts[c].repeat)
            return cli_error(ctx, cmd->opts[c].name, "it once", "given more than once");
        if (args->nval[c] == CLI_MAX_REPEAT)
            return cli_error(ctx, cmd->opts[c].name, "at most 32 values",
                             "given too many times");
        args->val[c][args->nval[c]++] = value;
    }
    return 0;
}

/* The option at argv[*argi - 1] (--NAME or --NAME=VALUE) and its value,
 * the next word when it takes one. */
static int read_option(cli_ctx *ctx, cli_args *args, cmdline *cl, int argc, char **argv,
                       int *argi)
{
    const cli_command *cmd = ctx->cmd;
    const char *arg = argv[*argi - 1], *name = arg + 2, *eq = strchr(name, '=');
    size_t len = eq ? (size_t)(eq - name) : strlen(name);
    int c = exact_option(cmd, name, len);
    if (c < 0) return unknown_option(ctx, arg, name, len);
    const cli_optdef *def = c >= OPT_FORMAT ? &cli_common_opts[c - OPT_FORMAT] : &cmd->opts[c];
    const char *value = "1";
    if (def->arg && eq) value = eq + 1;
    else if (def->arg && *argi < argc) value = argv[(*argi)++];
    else if (def->arg)
        return cli_error(ctx, NULL, "a value after it, such as --vf 0.66",
                         "option '%s' needs a value", arg);
    else if (eq)
        return cli_error(ctx, def->name, "the option alone, without =VALUE",
                         "'%s' takes no value", arg);
    return store_option(ctx, args, cl, c, value);
}

/* Our own scan rather than getopt_long, which takes any unambiguous
 * beginning of a name ("--freq" for "--freq-step"): --NAME VALUE,
 * --NAME=VALUE, --NAME for a flag, "--" ends the options.  A value is the
 * next word whatever it looks like (--offset -3m).  Returns 0, or
 * CLI_EXIT_USAGE after an error. */
static int parse_argv(cli_ctx *ctx, cli_args *args, int argc, char **argv, cmdline *cl)
{
    int argi = 1;
    while (argi < argc) {
        const char *arg = argv[argi++];
        if (strcmp(arg, "--") == 0) {
            if (argi < argc && !cl->first_operand) cl->first_operand = argi;
            cl->n_operands += argc - argi;
            break;
        }
        if (strncmp(arg, "--", 2) == 0 && arg[2] != '\0') {
            if (read_option(ctx, args, cl, argc, argv, &argi)) return CLI_EXIT_USAGE;
            continue;
        }
        if (arg[0] == '-' && arg[1] != '\0')
            return unknown_option(ctx, arg, arg + 1 + (arg[1] == '-'), strlen(arg + 1));
        if (!cl->first_operand) cl->first_operand = argi - 1;
        cl->n_operands++;
    }
    return 0;
}

/* One bare argument is the command's positional option (sweep FILE);
 * any other bare word is an error. */
static int take_operands(cli_ctx *ctx, cli_args *args, char **argv, cmdline *cl)
{
    const cli_command *cmd = ctx->cmd;
    if (cl->first_operand && cmd->positional && cl->n_operands == 1) {
        int k = 0;
        while (cmd->opts[k].name && strcmp(cmd->opts[k].name, cmd->positional) != 0) k++;
        if (cmd->opts[k].name && args->nval[k] == 0) {
            args->val[k][args->nval[k]++] = argv[cl->first_operand];
            cl->first_operand = 0;
        }
    }
    if (cl->first_operand)
        return cli_error(ctx, NULL, "options only, such as --offset 10m",
                         "unexpected argument '%s'", argv[cl->first_operand]);
    return 0;
}

/* --format and --units into ctx. */
static int apply_common(cli_ctx *ctx, const cmdline *cl)
{
    if (cl->format) {
        if (strcmp(cl->format, "text") == 0) ctx->format = CLI_TEXT;
        else if (strcmp(cl->format, "csv") == 0) ctx->format = CLI_CSV;
        else if (strcmp(cl->format, "json") == 0) ctx->format = CLI_JSON;
        else return cli_error(ctx, "format", "text, csv or json", "unknown format '%s'", cl->format);
    }
    if (cl->jobs) {
        double n;
        if (cli_bounded(ctx, "jobs", cl->jobs, CLI_BOUND_JOBS, "a whole number of threads, such as 2",
                        &n))
            return CLI_EXIT_USAGE;
        if (n != (double)(int)n)
            return cli_error(ctx, "jobs", "a whole number of threads, such as 2",
                             "'%s' is not a whole number", cl->jobs);
        ctx->jobs = (int)n;
    }
    if (cl->units) {
        if (strcmp(cl->units, "metric") == 0) ctx->units = CXL_UNITS_METRIC;
        else if (strcmp(cl->units, "imperial") == 0) ctx->units = CXL_UNITS_IMPERIAL;
        else return cli_error(ctx, "units", "metric or imperial", "unknown units '%s'", cl->units);
    }
    return 0;
}

/* --input: the command must take it, and each file an option writes
 * must be one per row, or none: a fixed name would keep only the last. */
static int check_input(cli_ctx *ctx, const cli_args *args, const char *input)
{
    const cli_command *cmd = ctx->cmd;
    if (input && !cmd->batch)
        return cli_error(ctx, "input", "the command without --input",
                         "the %s command does not take a batch file", cmd->name);
    if (ctx->jobs > 1 && !cmd->batch)
        return cli_error(ctx, "jobs", "the command without --jobs",
                         "the %s command runs no batch to share out", cmd->name);
    for (int i = 0; input && cmd->opts[i].name; i++)
        if (writes_file(&cmd->opts[i]) && args->nval[i] &&
            !strstr(args->val[i][0], "{line}") && !strstr(args->val[i][0], "{label}"))
            return cli_error(ctx, cmd->opts[i].name, "a name with {line} or {label}, such as "
                                                     "'plots/{label}.svg'",
                             "with --input every row writes its own file; '%s' names only one",
                             args->val[i][0]);
    return 0;
}

int cli_run_command(const cli_command *cmd, int argc, char **argv)
{
    static cli_args args; /* large; one per process */
    memset(&args, 0, sizeof args);
    args.cmd = cmd;
    cli_ctx ctx = { .cmd = cmd, .format = CLI_TEXT, .units = CXL_UNITS_METRIC, .out = stdout,
                    .jobs = 1 };
    cmdline cl = { 0 };
    if (parse_argv(&ctx, &args, argc, argv, &cl)) return CLI_EXIT_USAGE;
    if (cl.help) {
        cli_print_command_help(cmd, stdout);
        return CLI_EXIT_OK; /* main checks that stdout was written */
    }
    if (take_operands(&ctx, &args, argv, &cl) || apply_common(&ctx, &cl))
        return CLI_EXIT_USAGE;
    args.text_labels = ctx.format == CLI_TEXT;
    ctx.progress = !cl.quiet && isatty(fileno(stderr));
    if (check_input(&ctx, &args, cl.input)) return CLI_EXIT_USAGE;

    /* files named on the command line are read (and checked) even when no
     * row ends up needing the catalog */
    if ((ctx.cables_path || ctx.loss_path) && !cli_catalog(&ctx)) return CLI_EXIT_USAGE;

    if (cmd->begin) cmd->begin(&ctx);
    int code = cl.input ? run_batch(&ctx, &args, cl.input) : cmd->run(&ctx, &args);
    if (cmd->end) code = worse(code, cmd->end(&ctx));
    cli_table_close(&ctx);
    cxl_catalog_free(ctx.catalog);
    cxl_bands_free(ctx.bands);
    if (fflush(stdout) != 0 || ferror(stdout)) {
        fprintf(stderr, "coaxline: %s: output: write failed\n", cmd->name);
        return CLI_EXIT_USAGE;
    }
    return code;
}
