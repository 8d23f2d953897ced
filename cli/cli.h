/* cli.h - shared pieces of the coaxline command-line tool.
 *
 * Every command declares its options once (cli_optdef).  The same names
 * serve as long options (--offset) and as batch CSV column headers
 * (offset), so `--input FILE` works for every command without extra code:
 * each CSV row is one invocation whose cells override the command-line
 * values (which act as defaults for columns a file does not have).
 */
#ifndef COAXLINE_CLI_H
#define COAXLINE_CLI_H

#include <stddef.h>
#include <stdio.h>
#include "coaxline.h"

#define CLI_MAX_OPTS 40     /* options per command, common ones included */
#define CLI_MAX_REPEAT 32   /* values of one repeatable option */
#define CLI_MAX_ITEMS 64    /* items of a comma list after splitting */

/* Exit codes (coaxline(1), EXIT STATUS). */
enum { CLI_EXIT_OK = 0, CLI_EXIT_TOLERANCE = 1, CLI_EXIT_USAGE = 2 };

typedef enum { CLI_TEXT, CLI_CSV, CLI_JSON } cli_format;

typedef struct cli_optdef {
    const char *name;   /* long option and batch column name */
    const char *arg;    /* argument placeholder for help, NULL for a flag */
    const char *help;   /* one line */
    int repeat;         /* may be given more than once / as a comma list */
} cli_optdef;

typedef struct cli_args cli_args;
typedef struct cli_ctx cli_ctx;

typedef struct cli_command {
    const char *name;
    const char *summary;             /* one line for `coaxline --help` */
    const char *synopsis;            /* usage line after "coaxline NAME " */
    const cli_optdef *opts;          /* terminated by {NULL} */
    /* Optional: called once before the first row (headers) and after
     * the last (totals, footers).  May be NULL. */
    void (*begin)(cli_ctx *ctx);
    int (*end)(cli_ctx *ctx);
    /* One invocation (a command line, or one batch row).  Returns a
     * CLI_EXIT_* code; on CLI_EXIT_USAGE it has already called
     * cli_error() and printed nothing else for this row. */
    int (*run)(cli_ctx *ctx, const cli_args *args);
    int batch;                       /* accepts --input */
} cli_command;

/* One invocation's option values: a batch row's cells first, then the
 * values from the command line. */
struct cli_args {
    const cli_command *cmd;
    const char *val[CLI_MAX_OPTS][CLI_MAX_REPEAT];
    size_t nval[CLI_MAX_OPTS];
    const char *const *row;  /* per option: a batch cell, or NULL */
};

struct cli_ctx {
    const cli_command *cmd;
    cli_format format;
    cxl_units units;
    FILE *out;
    const char *input_name;  /* batch file name, NULL when not batching */
    size_t line;             /* batch line of the current row */
    size_t rows_out;         /* data rows written (CSV/JSON) */
    int header_done;
    void *state;             /* command's own state across rows */
    const char *cables_path; /* --cables FILE */
    const char *loss_path;   /* --cable-loss FILE */
    cxl_catalog *catalog;    /* loaded on first use by cli_catalog() */
    int catalog_failed;
    cxl_bands *bands;        /* loaded on first use by cli_bands() */
};

/* ---- errors: one line on stderr -------------------------------------- */

/* "coaxline: CMD: [FILE line N: ]FIELD: PROBLEM (expected EXPECTED)".
 * field or expected may be NULL.  Returns CLI_EXIT_USAGE. */
int cli_error(const cli_ctx *ctx, const char *field, const char *expected,
              const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
/* A warning line: "coaxline: CMD: [FILE line N: ]warning: ...". */
void cli_warn(const cli_ctx *ctx, const char *fmt, ...)
    __attribute__((format(printf, 2, 3)));

/* ---- option values ---------------------------------------------------- */

/* Number of values of an option in this invocation (0 when absent). */
size_t cli_count(const cli_args *a, const char *name);
/* i-th value, or NULL. */
const char *cli_get(const cli_args *a, const char *name, size_t i);
/* 1 when a flag option is set (a batch cell of 1/yes/true sets it too). */
int cli_flag(const cli_args *a, const char *name);
/* All values of a repeatable option split on ',' and ';' into items,
 * copied into buf.  Returns the number of items or -1 after cli_error. */
int cli_items(const cli_ctx *ctx, const cli_args *a, const char *name,
              char *buf, size_t bufsize, const char **items, size_t max);

/* Parsers that report a one-line error naming the field.  Each returns 0
 * on success, CLI_EXIT_USAGE after cli_error(). */
enum { CLI_ANY = 0, CLI_POSITIVE = 1, CLI_NONNEG = 2 };
int cli_length(const cli_ctx *ctx, const char *field, const char *text,
               int sign_rule, double *length_m);
int cli_freq(const cli_ctx *ctx, const char *field, const char *text,
             double *freq_hz);
int cli_time(const cli_ctx *ctx, const char *field, const char *text,
             int sign_rule, double *delay_s);
int cli_number(const cli_ctx *ctx, const char *field, const char *text,
               double lo, double hi, const char *expected, double *value);
int cli_vf(const cli_ctx *ctx, const char *field, const char *text,
           double *vf);

/* ---- cables ---------------------------------------------------------- */

/* Environment variable naming a folder whose cables.csv and cable_loss.csv
 * (each optional) are loaded as user cables when --cables/--cable-loss are
 * not given. */
#define CLI_CABLE_DIR_ENV "COAXLINE_CABLE_DIR"

/* The catalog: built-in rows plus the user's files, loaded once per
 * process.  NULL after a one-line error (bad file). */
const cxl_catalog *cli_catalog(cli_ctx *ctx);
/* Velocity factor from --vf, or from --cable NAME in the catalog (exactly
 * one of the two).  *cable_name (may be NULL) gets the cable's name or "".
 * Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_vf_or_cable(cli_ctx *ctx, const cli_args *a, double *vf,
                    const char **cable_name);
/* Index of --cable NAME (or of the given name) in the catalog. */
int cli_cable_index(cli_ctx *ctx, const char *name, size_t *index);

/* ---- bands (bandsel.c) ---------------------------------------------- */

/* Options a per-band command declares to use cli_freq_points():
 *   { "band", "LIST", ..., 1 }, { "region", "N", ..., 0 },
 *   { "exclude-footnotes", NULL, ..., 0 }, { "freq", "F", ..., 1 } */
typedef struct cli_freq_point {
    char band[16];      /* canonical band name, "" for a --freq point */
    const char *edge;   /* "low", "centre", "high" or "freq" */
    double freq_hz;
} cli_freq_point;

/* The built-in band table, loaded once per process; NULL after an error. */
const cxl_bands *cli_bands(cli_ctx *ctx);
/* --region as 1-3, or 0 when absent (widest across Regions). */
int cli_region(const cli_ctx *ctx, const cli_args *a, int *region);
/* Low edge, centre and high edge of each --band (for --region, or the
 * widest across Regions; footnote segments counted unless
 * --exclude-footnotes), then each --freq.  Returns the number of points,
 * or -1 after cli_error() (also when there is none at all). */
int cli_freq_points(cli_ctx *ctx, const cli_args *a, cli_freq_point *pts, size_t max);
/* Edges of one band the user typed (for region 1-3, or 0: widest across
 * Regions) and the table's own name for it (*name: "160m" for "160").
 * Returns 0, or CLI_EXIT_USAGE after cli_error() for an unknown band. */
int cli_band_lookup(cli_ctx *ctx, const char *item, int region, int footnotes,
                    double *low_hz, double *high_hz, const char **name);

/* ---- tabular output (CSV and JSON) ------------------------------------ */

typedef struct cli_col {
    const char *name;   /* CSV header / JSON key, unit in the name */
    int decimals;       /* fixed decimals in CSV; -1 for a text column */
} cli_col;

typedef struct cli_cell {
    const char *text;   /* text columns */
    double value;       /* numeric columns */
    int present;        /* 0: empty CSV cell / JSON null */
} cli_cell;

#define CLI_NUM(v) ((cli_cell){ NULL, (v), 1 })
#define CLI_TXT(s) ((cli_cell){ (s), 0.0, (s) != NULL })
#define CLI_NONE   ((cli_cell){ NULL, 0.0, 0 })

/* Writes the CSV header (once per output) or opens the JSON array. */
void cli_table_header(cli_ctx *ctx, const cli_col *cols, size_t ncols);
void cli_table_row(cli_ctx *ctx, const cli_col *cols, size_t ncols,
                   const cli_cell *cells);
/* Closes the JSON array; call once at the end. */
void cli_table_close(cli_ctx *ctx);

/* ---- text output helpers ---------------------------------------------- */

/* Fixed-decimal number into a static-free caller buffer; "?" on failure. */
const char *cli_fmt(char *buf, size_t size, double value, int decimals);
/* A length in metres to the mm and as a tape reading, in the order the
 * --units setting prefers: "8.000 m (26 ft 2 15/16 in)". */
const char *cli_fmt_length(const cli_ctx *ctx, char *buf, size_t size,
                           double length_m);
/* The row's label for text output ("" when none). */
const char *cli_label(const cli_args *a);

/* ---- driver ----------------------------------------------------------- */

int cli_run_command(const cli_command *cmd, int argc, char **argv);
void cli_print_command_help(const cli_command *cmd, FILE *fp);

extern const cli_command cli_cmd_cut;
extern const cli_command cli_cmd_demo;

/* ---- measured lines: bands, vf, phase, pair (measured.c) ------------- */

/* Velocity factor from exactly one of --vf, --cable NAME or --vf-from
 * FILE|- (a `coaxline vf --format csv` output: the fitted row, or the one
 * whose label is this row's --label when the file holds several fits).
 * The file is read once per run and kept in ctx->state, so a command that
 * offers --vf-from has no state of its own and sets .end to
 * cli_vf_source_end.  from (may be NULL) gets where the value came from,
 * for text output: "", "cable NAME" or "from FILE".  Returns 0, or
 * CLI_EXIT_USAGE after cli_error(). */
int cli_vf_source(cli_ctx *ctx, const cli_args *a, double *vf, char *from,
                  size_t from_size);
int cli_vf_source_end(cli_ctx *ctx);

/* A number with its sign always shown ("+0.327", "-0.100"), for text. */
const char *cli_fmt_signed(char *buf, size_t size, double value, int decimals);

extern const cli_command cli_cmd_bands;
extern const cli_command cli_cmd_vf;
extern const cli_command cli_cmd_phase;
extern const cli_command cli_cmd_pair;

#endif
