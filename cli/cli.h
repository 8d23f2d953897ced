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
#define CLI_MAX_JOBS 64     /* --jobs: threads running batch rows */

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
    /* Optional: the option one bare argument fills ("file" makes
     * `coaxline sweep FILE` the same as --file FILE), or NULL. */
    const char *positional;
} cli_command;

/* Option indices already looked up (common.c), by the address of the
 * option table's own name string; written by the look-ups although they
 * take a const cli_args, so a cli_args is never defined const.  Zeroed
 * with the cli_args; each copy (one per thread) has its own. */
#define CLI_OPTCACHE 64
#define CLI_OPTCACHE_TEXT 64
typedef struct cli_optcache {
    const cli_command *cmd;  /* the command the entries belong to */
    /* by the address of the table's own string */
    struct { const char *name; int index; } slot[CLI_OPTCACHE];
    /* by content: names built at run time ("line-a"), names the command
     * does not declare (index -1) */
    struct { char text[24]; int index; } text[CLI_OPTCACHE_TEXT];
} cli_optcache;

/* One invocation's option values: a batch row's cells first, then the
 * values from the command line. */
struct cli_args {
    const cli_command *cmd;
    const char *val[CLI_MAX_OPTS][CLI_MAX_REPEAT];
    size_t nval[CLI_MAX_OPTS];
    const char *const *row;  /* per option: a batch cell, or NULL */
    int text_labels;         /* text output: cli_label() shows control bytes escaped */
    cli_optcache optcache;   /* look-ups by name resolved once (common.c) */
};

/* Band edges already looked up, by the item as typed (bandsel.c): a batch
 * names a handful of bands over and over.  Held by value in cli_ctx, so a
 * copy of a ctx (one per thread) has its own. */
#define CLI_BAND_MEMO 64
typedef struct cli_band_memo {
    char item[16];          /* as typed, "" for a free slot */
    char name[16];          /* the table's own name, as cli_freq_point keeps it */
    int region, footnotes;
    double low_hz, high_hz;
} cli_band_memo;

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
    cli_band_memo band_memo[CLI_BAND_MEMO]; /* cli_freq_points(): edges by band item */
    int band_memo_n;
    int progress;            /* stderr is a terminal and no --quiet */
    int jobs;                /* --jobs: threads running batch rows (1: rows in turn) */
    struct cli_capture *capture; /* a --jobs worker's row output in memory, or NULL */
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
/* A note about the whole run (no batch line): "coaxline: CMD: note: ...". */
void cli_note(const cli_ctx *ctx, const char *fmt, ...)
    __attribute__((format(printf, 2, 3)));
/* Where a one-line message goes: stderr (stdout flushed first, so the
 * two streams stay in order), or, for a --jobs worker's row, its memory
 * capture, replayed in input order (jobs.c). */
FILE *cli_report_stream(const cli_ctx *ctx);
/* Open a file an option names for reading.  NULL after a
 * one-line error naming field (cannot open, a directory), or without one
 * when optional and the file does not exist. */
FILE *cli_open_read(const cli_ctx *ctx, const char *field, const char *path,
                    const char *expected, int optional);

/* Progress of a long run on stderr (batch rows, Monte-Carlo trials):
 * only when ctx->progress (stderr a terminal, no --quiet), only once the
 * run has lasted a second (CLI_PROGRESS_DELAY_ENV), at most a few updates a second, one line
 * rewritten in place and cleared at the end, so that nothing of it is
 * left in the terminal or ever reaches a file or a pipe. */
#define CLI_PROGRESS_DELAY_ENV "COAXLINE_PROGRESS_DELAY" /* seconds, default 1 */
typedef struct cli_progress {
    const char *unit;        /* "rows", "trials" */
    double delay_s;          /* shown once the run has lasted this long */
    double start_s, last_s;  /* monotonic clock */
    int shown;
} cli_progress;
void cli_progress_start(const cli_ctx *ctx, cli_progress *p, const char *unit);
/* done so far; cheap to call per row (looks at the clock every 256). */
void cli_progress_step(const cli_ctx *ctx, cli_progress *p, size_t done);
void cli_progress_end(const cli_ctx *ctx, cli_progress *p);

/* ---- option values ---------------------------------------------------- */

/* The look-ups below take only names the command's table declares (its
 * own options and the shared groups it includes): any other name aborts
 * with a message naming the command and the option, a mistake in the
 * program that every test reaching it reports (tests/option_names.sh
 * checks the literal names of cli/cmd_*.c without running them).  Shared
 * helpers read an option some of their commands lack with cli_get_if(). */
/* 1 when the command declares the option name. */
int cli_declared(const cli_args *a, const char *name);
/* The first value, count or flag of an option the command may not
 * declare (NULL, 0, 0 when it does not). */
const char *cli_get_if(const cli_args *a, const char *name);
size_t cli_count_if(const cli_args *a, const char *name);
int cli_flag_if(const cli_args *a, const char *name);
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

/* ---- bounds (bounds.c): the one table every command applies ------------ */

/* Each quantity's bounds, in SI units (m, s, Hz, ohm, dB, deg, counts),
 * printed into coaxline(1)'s LIMITS section (coaxline --generate limits);
 * messages name them through min_text/max_text. */
typedef enum {
    CLI_BOUND_DISTANCE, CLI_BOUND_LINE, CLI_BOUND_TIME, CLI_BOUND_FREQ, CLI_BOUND_VF,
    CLI_BOUND_DEGREES, CLI_BOUND_IMPEDANCE, CLI_BOUND_LINE_Z0, CLI_BOUND_ANALYZER_Z0,
    CLI_BOUND_RATIO, CLI_BOUND_SWR, CLI_BOUND_LEVEL_DB, CLI_BOUND_GOAL_DB,
    CLI_BOUND_PHASE_DEG, CLI_BOUND_ORDER, CLI_BOUND_ITEMS, CLI_BOUND_REPEAT,
    CLI_BOUND_ELEMENTS, CLI_BOUND_JOBS, CLI_NBOUNDS
} cli_bound_id;

typedef struct cli_bound {
    const char *quantity;  /* "line of cable" */
    const char *applies;   /* what takes it, for the man page */
    double min, max;       /* magnitude bounds (min 0: above zero or any) */
    const char *min_text;  /* "1 mm", NULL when min is 0 */
    const char *max_text;  /* "1000 km" */
} cli_bound;

extern const cli_bound cli_bounds[CLI_NBOUNDS];
/* cli_number() with the bounds of row id. */
int cli_bounded(const cli_ctx *ctx, const char *field, const char *text, cli_bound_id id,
                const char *expected, double *value);
/* "from 1 mm to 1000 km" or "up to 10000 km". */
const char *cli_bound_range(char *buf, size_t size, cli_bound_id id);
/* coaxline(1)'s LIMITS entries, text through put (troff escaping). */
void cli_bounds_print_man(FILE *fp, void (*put)(FILE *, const char *));

/* The rows most code reads, by name. */
#define CLI_MAX_LENGTH_M (cli_bounds[CLI_BOUND_DISTANCE].max)
#define CLI_MAX_TIME_S (cli_bounds[CLI_BOUND_TIME].max)
#define CLI_MIN_FREQ_HZ (cli_bounds[CLI_BOUND_FREQ].min)
#define CLI_MAX_FREQ_HZ (cli_bounds[CLI_BOUND_FREQ].max)
#define CLI_MIN_VF (cli_bounds[CLI_BOUND_VF].min)
#define CLI_LINE_MIN_M (cli_bounds[CLI_BOUND_LINE].min)
#define CLI_LINE_MAX_M (cli_bounds[CLI_BOUND_LINE].max)
#define CLI_LINE_MIN_VF CLI_MIN_VF

/* Parsers that report a one-line error naming the field.  Each returns 0
 * on success, CLI_EXIT_USAGE after cli_error(); each applies its row of
 * cli_bounds (cli_length: CLI_BOUND_DISTANCE). */
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
 * --exclude-footnotes), then each --freq.  *region (may be NULL) gets
 * --region as cli_region() reads it.  Returns the number of points, or -1
 * after cli_error() (also when there is none at all). */
int cli_freq_points(cli_ctx *ctx, const cli_args *a, cli_freq_point *pts, size_t max,
                    int *region);
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
/* Length of the well-formed UTF-8 sequence at s (RFC 3629: no overlong
 * forms, surrogates or code points above U+10FFFF), 0 when the byte there
 * starts none (or is the terminating NUL). */
size_t cli_utf8_len(const char *s);

/* ---- text output helpers ---------------------------------------------- */

/* Fixed-decimal number into a static-free caller buffer; "?" on failure. */
const char *cli_fmt(char *buf, size_t size, double value, int decimals);
/* A length in metres to the mm and as a tape reading, in the order the
 * --units setting prefers: "8.000 m (26 ft 2 15/16 in)". */
const char *cli_fmt_length(const cli_ctx *ctx, char *buf, size_t size,
                           double length_m);
/* The row's label ("" when none).  For text output (a->text_labels) control
 * bytes, C1 controls and bytes that are not UTF-8 are shown escaped (\e,
 * \r, \n, \t, \xHH, \u0085), so a label can neither colour the terminal
 * nor forge a line; CSV and JSON get it as it is (they quote and escape). */
const char *cli_label(const cli_args *a);
/* text into buf with control bytes, C1 controls and bytes that are not
 * UTF-8 escaped as cli_label() shows them (\e, \r, \n, \t, \xHH,
 * \u0085); cut short at a whole character when buf is full. */
const char *cli_escape(char *buf, size_t size, const char *text);

/* ---- driver ----------------------------------------------------------- */

int cli_run_command(const cli_command *cmd, int argc, char **argv);

/* ---- --input batches, in turn or on --jobs threads (batch.c, jobs.c) -- */

/* An open batch past its header row (batch.c). */
typedef struct cli_batch cli_batch;
enum { CLI_ROW_END, CLI_ROW_SKIP, CLI_ROW_RUN };
/* The next data row, read on the calling thread in input order: its line
 * in ctx->line; CLI_ROW_RUN with its cells and its plot names (the
 * duplicate-name check done) until the next call; CLI_ROW_SKIP after a
 * one-line error through ctx (*code set); CLI_ROW_END.  Shows progress. */
int cli_batch_next(cli_batch *b, cli_ctx *ctx, cli_args *args, int *code);
/* Per option: the row's cell or NULL, its plot file name or NULL. */
const char *const *cli_batch_row(const cli_batch *b);
const char *const *cli_batch_plots(const cli_batch *b);
/* args as the row sees them: its cells, its plot names for the patterns. */
void cli_batch_apply(const cli_command *cmd, cli_args *args, const char *const *row,
                     const char *const *plot);
/* The exit status of two results together (usage errors first). */
int cli_batch_worse(int a, int b);
/* Every row in turn on this thread; the exit status. */
int cli_batch_run_rows(cli_batch *b, cli_ctx *ctx, cli_args *args);
/* The rows on ctx->jobs threads, stdout and stderr written in input order
 * as cli_batch_run_rows() writes them (jobs.c); the exit status. */
int cli_jobs_run(cli_batch *b, cli_ctx *ctx, cli_args *args);
void cli_print_command_help(const cli_command *cmd, FILE *fp);
/* Non-zero for a common option only commands with batches take (--input, --jobs). */
int cli_batch_only(const char *name);
/* The options every command takes besides its own (batch.c). */
extern const cli_optdef cli_common_opts[];

/* ---- generated from the tables (tables.c) ------------------------------ */

/* `coaxline --generate WHAT` (not in --help: a build and test tool):
 * "limits" (coaxline(1)'s LIMITS entries, from cli_bounds), "options"
 * (its OPTION INDEX, from each command's table) or "completion" (the bash
 * completion script: commands, options, --band names, --cable names,
 * files, choices).  Returns a CLI_EXIT_* code. */
int cli_generate(const char *what, const cli_command *const *cmds, size_t ncmds, FILE *fp);

extern const cli_command cli_cmd_cut;
extern const cli_command cli_cmd_demo;
/* ---- cmd_trim.c: cut long, read, trim ---- */
extern const cli_command cli_cmd_trim;

/* ---- pattern, budget, hybrid, plots (duospec.c, budgettol.c, svg.c) --- */

/* Plain SVG plots written without any external program (svg.c).  Numbers
 * go through cxl_units_format_fixed, so a file is the same bytes in every
 * locale; text is XML-escaped. */
typedef struct cli_svg_curve {
    const char *name;       /* legend text */
    const double *x;        /* polar: azimuth in degrees; x-y: x values */
    const double *y;        /* polar: dB; x-y: y values (a non-finite
                             * value breaks the line) */
    size_t n;
    int dashed;
    int markers;            /* x-y plot: a dot at each point */
} cli_svg_curve;

typedef struct cli_svg_polar {
    const char *title;
    const char *note[3];    /* lines under the plot (NULL: none) */
    const char *unit;       /* ring unit, e.g. "dBi" */
    double range_db;        /* centre is this far below the outer ring */
    double ring_step_db;    /* e.g. 10 */
    const cli_svg_curve *curves;
    size_t ncurves;
} cli_svg_polar;

typedef struct cli_svg_span {  /* shaded x segment (a band) */
    double x0, x1;
    const char *name;
} cli_svg_span;

typedef struct cli_svg_hline { /* horizontal line (a tolerance) */
    double y;
    const char *name;
} cli_svg_hline;

typedef struct cli_svg_xy {
    const char *title;
    const char *note[3];
    const char *x_label;    /* with its unit, e.g. "frequency (MHz)" */
    const char *y_label;    /* e.g. "phase error (deg)" */
    const cli_svg_curve *curves;
    size_t ncurves;
    const cli_svg_span *spans;
    size_t nspans;
    const cli_svg_hline *hlines;
    size_t nhlines;
    /* optional second y axis on the right, fitted to its own curves
     * (drawn dashed, after the others in the legend) */
    const char *y2_label;
    const cli_svg_curve *curves2;
    size_t ncurves2;
} cli_svg_xy;

/* Write a polar plot (azimuth 0 at the top, clockwise as seen from above
 * like a compass bearing, rings in dB) or an x-y plot (axes fitted to the data, spans and
 * lines) to fp.  Return 0, or -1 when writing failed. */
int cli_svg_polar_write(FILE *fp, const cli_svg_polar *plot);
int cli_svg_xy_write(FILE *fp, const cli_svg_xy *plot);
/* Write either plot (exactly one of polar, xy non-NULL) to the file path.
 * Returns 0, or CLI_EXIT_USAGE after a one-line error naming field. */
int cli_svg_save(const cli_ctx *ctx, const char *field, const char *path,
                 const cli_svg_polar *polar, const cli_svg_xy *xy);

/* A two-element receive pair as pattern and budget describe it
 * (duospec.c).  Element A is the library's element 0, B element 1. */
#define CLI_DUO_OPTDEFS \
    CLI_DUO_PLACE_OPTDEFS, \
    { "line-a", "LEN", "line making A's feed delay, at --vf or --cable", 0 }, \
    { "line-b", "LEN", "line making B's feed delay", 0 }, \
    CLI_DUO_FEED_OPTDEFS, \
    { "vf", "X", "velocity factor of the feed lines", 0 }, \
    { "cable", "NAME", "feed-line cable from the catalog (VF, and loss for --line-loss)", 0 }, \
    { "vf-from", "FILE|-", "feed-line VF from coaxline vf --format csv output (its --at row at --design-freq)", 0 }, \
    CLI_DUO_ELEMENT_OPTDEFS
/* The pair's geometry without feed lines (pair takes these for
 * --null-depth; its --vf and --cable are the measured lines'). */
#define CLI_DUO_GEOMETRY_OPTDEFS \
    CLI_DUO_PLACE_OPTDEFS, CLI_DUO_FEED_OPTDEFS, CLI_DUO_ELEMENT_OPTDEFS
#define CLI_DUO_PLACE_OPTDEFS \
    { "spacing", "LEN", "broadside distance between elements A and B (default 0)", 0 }, \
    { "stagger", "LEN", "how far B sits behind A along the forward axis, negative: in front (default 0)", 0 }, \
    { "feed", "crossfire|endfire", "design feed worked out from the stagger", 0 }, \
    { "design-freq", "F", "frequency for --degrees-a/--degrees-b and --feed endfire", 0 }
#define CLI_DUO_FEED_OPTDEFS \
    { "delay-a", "TIME", "feed delay of A", 0 }, \
    { "delay-b", "TIME", "feed delay of B", 0 }, \
    { "degrees-a", "DEG", "feed delay of A in electrical degrees at --design-freq", 0 }, \
    { "degrees-b", "DEG", "feed delay of B in electrical degrees at --design-freq", 0 }, \
    { "invert", "a|b", "reverse one element's polarity (crossfire)", 0 }
#define CLI_DUO_ELEMENT_OPTDEFS \
    { "element", "isotropic|wire", "element type (default isotropic)", 0 }, \
    { "wire-length", "LEN", "length of each traveling-wave wire", 0 }, \
    { "wire-vf", "X", "velocity factor along the wire (0.45-0.8 on the ground, 0.95-0.99 raised)", 0 }, \
    { "elevation", "DEG", "elevation of the azimuth cut (default 0; 20 for wires)", 0 }

/* The per-band options of cli_freq_points(), as pattern and budget take
 * them. */
#define CLI_DUO_BAND_OPTDEFS \
    { "band", "LIST", "bands to evaluate, e.g. 160m,80m", 1 }, \
    { "region", "N", "ITU Region 1, 2 or 3 (default: widest edges of all)", 0 }, \
    { "exclude-footnotes", NULL, "leave out band segments allowed only by footnote", 0 }, \
    { "freq", "F", "a single frequency to evaluate", 1 }

/* Option values a pair command parsed; lengths in m, delays in s. */
typedef struct cli_duo_spec {
    double spacing_m, stagger_m;
    const char *feed;           /* "crossfire", "endfire" or "manual" */
    double delay_s[2];          /* design feed delays */
    double line_m[2];           /* design lines (0 where no line) */
    int has_line[2];            /* the line length is known */
    int flip[2];
    int wire;
    double wire_length_m, wire_vf;
    double elevation_deg;
    int elevation_default;
    int has_vf;
    double vf;
    const char *cable;          /* "" when none */
    /* as built (pattern): measured lines, actual VF, fixed errors */
    int has_errors;
    double built_delay_s[2];
    double built_line_m[2];
    double actual_vf;
    double phase_error_deg;     /* B lags by this much more */
    double imbalance_db;        /* B weaker by this much */
    int line_loss;              /* add the lines' loss difference */
    cxl_loss_cable *loss;       /* owned; the lines' loss for line_loss */
} cli_duo_spec;

/* Parse CLI_DUO_OPTDEFS (and, where the command declares them,
 * measured-a, measured-b, actual-vf, phase-error, imbalance, line-loss).
 * Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_duo_spec_parse(cli_ctx *ctx, const cli_args *a, cli_duo_spec *spec);
/* --actual-vf, the VF of the spool the lines were cut from, for the duo
 * and array commands: *actual_vf is design_vf when it is absent; refused
 * without a design VF.  *given is 1 when it was given. */
int cli_actual_vf(cli_ctx *ctx, const cli_args *a, int has_design_vf, double design_vf,
                  double *actual_vf, int *given);
/* --wire-length and --wire-vf: both needed for a wire element (wire != 0),
 * neither for elements of another kind (named in the error).  Returns 0,
 * or CLI_EXIT_USAGE after cli_error(). */
int cli_wire_parse(cli_ctx *ctx, const cli_args *a, int wire, const char *kind,
                   double *length_m, double *vf);
void cli_duo_spec_free(cli_duo_spec *spec);
/* The design pair (as_built 0) or the as-built one at freq_hz, with the
 * as-built phase error (deg, B lagging positive, wrapped to +-180) and
 * amplitude imbalance (dB, B weaker positive) relative to the design.
 * Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_duo_spec_build(cli_ctx *ctx, const cli_duo_spec *spec, int as_built,
                        double freq_hz, cxl_duo **pair,
                        double *phase_error_deg, double *imbalance_db);

/* Phase tolerance from a wanted result (budgettol.c).  A command declares
 * CLI_BUDGET_OPTDEFS and CLI_DUO_GEOMETRY_OPTDEFS (or CLI_DUO_OPTDEFS);
 * one goal is given:
 *   --null-depth DB (< 0): the rear null of the described pair relative to
 *     its forward response, as pattern measures it
 *     (cxl_budget_phase_for_rear_null); needs --stagger or --spacing;
 *   --null-vs-inphase DB (< 0): the closed form relative to the two signals
 *     adding in phase, any geometry (cxl_budget_phase_for_null);
 *   --front-to-back DB (> 0), where the command declares it: the pair's
 *     front-to-back ratio (cxl_budget_phase_for_front_to_back).
 * --imbalance (B weaker, dB) counts in every goal. */
#define CLI_BUDGET_OPTDEFS \
    { "null-depth", "DB", "wanted worst rear null, e.g. -25 (dB below the forward response of the pair described)", 0 }, \
    { "null-vs-inphase", "DB", "wanted null relative to the in-phase sum of the two signals, any geometry (closed form)", 0 }, \
    { "imbalance", "DB", "amplitude imbalance between the elements (default 0)", 0 }

typedef enum { CLI_GOAL_NULL, CLI_GOAL_INPHASE, CLI_GOAL_FB } cli_goal_kind;
typedef struct cli_goal {
    cli_goal_kind kind;
    const char *option;         /* "null-depth", "null-vs-inphase", "front-to-back" */
    double goal_db;
    double imbalance_db;
    cli_duo_spec spec;         /* the pair (geometric goals), the feed lines' VF */
    int has_spec;
} cli_goal;
/* Exactly one goal, its number, --imbalance, and for a geometric goal the
 * pair (a one-line error naming the options when no geometry is given).
 * Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_goal_parse(cli_ctx *ctx, const cli_args *a, cli_goal *goal);
void cli_goal_free(cli_goal *goal);
/* At freq_hz: the error-free result (null depth or front-to-back, dB) and
 * the tolerance in degrees.  Returns 0 with both set; CLI_EXIT_TOLERANCE
 * (nothing printed, *error_free_db set) when even an error-free pair misses
 * the goal; CLI_EXIT_USAGE after cli_error(). */
int cli_goal_tolerance(cli_ctx *ctx, const cli_goal *goal, double freq_hz,
                       double *error_free_db, double *tolerance_deg);

extern const cli_command cli_cmd_pattern;
extern const cli_command cli_cmd_budget;
extern const cli_command cli_cmd_hybrid;
/* ---- cables and loss (cableinfo.c, cmd_cables.c, cmd_loss.c) ----------- */

extern const cli_command cli_cmd_cables;
extern const cli_command cli_cmd_loss;
/* Copy of text escaped as cli_escape() does, for one-line text output. */
const char *cli_clean(char *buf, size_t size, const char *text);
/* "1.000-100.000 MHz". */
const char *cli_fmt_range_mhz(char *buf, size_t size, double lo_hz, double hi_hz);
/* The fitted loss model of catalog cable index (caller frees), or NULL when
 * its table has fewer than two points. */
cxl_loss_fit *cli_cable_fit(const cxl_catalog *cat, size_t index);
/* One line describing a fit: points, table range, usable range, residual. */
const char *cli_fmt_fit(char *buf, size_t size, const cxl_loss_fit *fit);
/* A batch's cables: the fitted table and the physical model of each
 * catalog cable, built on the first row that needs them and kept for the
 * rows after (per ctx, so per thread; NULL is an empty cache).  _fit gives
 * NULL as cli_cable_fit does; _model cxl_loss_model_new_cable's status.
 * The cache owns what they return. */
typedef struct cli_cable_cache cli_cable_cache;
const cxl_loss_fit *cli_cable_cache_fit(cli_cable_cache **cache, const cxl_catalog *cat,
                                        size_t index);
cxl_status cli_cable_cache_model(cli_cable_cache **cache, const cxl_catalog *cat,
                                 size_t index, const cxl_loss_model **model);
void cli_cable_cache_free(cli_cable_cache *cache);

/* ---- measured lines: bands, vf, phase, pair (measured.c) ------------- */

/* Velocity factor from exactly one of --vf, --cable NAME or --vf-from
 * FILE|- (a `coaxline vf --format csv` output: the fitted row, or the one
 * whose label is this row's --label when the file holds several fits).
 * The file is read once per run and kept in ctx->state, so a command that
 * offers --vf-from has no state of its own and sets .end to
 * cli_vf_source_end.  from (may be NULL) gets where the value came from,
 * for text output: "", "cable NAME" or "from FILE".  Returns 0, or
 * CLI_EXIT_USAGE after cli_error(). */
/* The same for a command that works at freq_hz (0: none): a file with
 * `vf --at` rows gives the VF at that frequency (within 1 %), refuses one
 * whose rows are for other frequencies, and without a frequency gives the
 * one 'at' row of the label when there is exactly one; otherwise the
 * fitted VF. */
int cli_vf_source_at(cli_ctx *ctx, const cli_args *a, double freq_hz, double *vf,
                     char *from, size_t from_size);
int cli_vf_source(cli_ctx *ctx, const cli_args *a, double *vf, char *from,
                  size_t from_size);
int cli_vf_source_end(cli_ctx *ctx);
/* --reading zero-x|min-z|min-swr (default zero-x) and --analyzer-z0 OHM
 * (default 50, only with min-swr), shared by trim and vf; a kind other
 * than zero-x needs a line model (have_model: --cable given).  *name gets
 * the kind's name. */
int cli_reading_kind(cli_ctx *ctx, const cli_args *a, int have_model, cxl_dip_kind *kind,
                     double *ref_ohm, const char **name);

/* A number with its sign always shown ("+0.327", "-0.100"), for text. */
const char *cli_fmt_signed(char *buf, size_t size, double value, int decimals);

extern const cli_command cli_cmd_bands;
extern const cli_command cli_cmd_vf;
extern const cli_command cli_cmd_phase;
extern const cli_command cli_cmd_pair;

/* ---- phase and pair: input limits, a line into a load, error plots
 *      (linelimits.c, intoload.c, errplot.c) ---------------------------- */

/* A line of cable (cli_bounds[CLI_BOUND_LINE]) and its velocity factor,
 * for phase, pair and loss.  Each returns 0, or CLI_EXIT_USAGE after
 * cli_error(). */
int cli_line_length(const cli_ctx *ctx, const char *field, const char *text,
                    double *length_m);
/* A length worked out from other values (e.g. --reference-deg). */
int cli_line_length_check(const cli_ctx *ctx, const char *field, const char *text,
                          double length_m);
/* Every --freq item through cli_freq(), before cli_freq_points() reads
 * them, so a bad --freq is reported ahead of a bad --band. */
int cli_line_freq_items(const cli_ctx *ctx, const cli_args *a);
int cli_line_vf_check(const cli_ctx *ctx, const cli_args *a, double vf);

/* --load R[+-jX] and --z0 OHM: the lines are judged by the phase of the
 * voltage they deliver into the load (cxl_transfer_*), not by electrical
 * length alone.  With --cable NAME whose catalog row has diameters, the
 * cable's physical model (complex Z0, loss); otherwise a lossless line of
 * the velocity factor and --z0 (or the catalog row's z0). */
#define CLI_LOAD_OPTDEFS \
    { "load", "R[+-jX]", "judge by the voltage into this load (ohm), e.g. 21+j20, 21-j20, 50 or 1e9", 0 }, \
    { "z0", "OHM", "impedance of a --vf line for --load, e.g. 50 or 75", 0 }

typedef struct cli_load {
    int given;                /* --load was given */
    double re_ohm, im_ohm;    /* the load */
    double vf;                /* lossless form */
    double z0_ohm;            /* lossless form */
    cxl_loss_model *model;    /* owned; the physical form, or NULL */
    cxl_pair_load *handle;    /* owned; the library's load and line */
    const char *cable;        /* catalog name, "" for --vf / --vf-from */
} cli_load;

/* Parse --load and --z0 for a line of velocity factor vf.  Without --load
 * load->given is 0 and nothing else is needed.  Returns 0, or
 * CLI_EXIT_USAGE after cli_error(); free with cli_load_free() either way. */
int cli_load_parse(cli_ctx *ctx, const cli_args *a, double vf, cli_load *load);
void cli_load_free(cli_load *load);
/* One load impedance R[+-jX] (field "load", the same rules as --load):
 * 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_load_impedance(const cli_ctx *ctx, const char *text, double *re_ohm, double *im_ohm);
/* length_m of the line into the load at freq_hz: transfer in dB, delay in
 * degrees (the phase lag of V_load behind V_in) and the electrical length
 * in degrees.  Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_load_transfer(const cli_ctx *ctx, const cli_load *load, double length_m,
                      double freq_hz, double *transfer_db, double *delay_deg,
                      double *electrical_deg);
/* The one-line error of a library status st for the load at freq_hz;
 * returns CLI_EXIT_USAGE. */
int cli_load_error(const cli_ctx *ctx, const cli_load *load, double freq_hz, cxl_status st);
/* "21.000+j20.000 ohm into a lossless line, Z0 50.000 ohm" and the like. */
const char *cli_fmt_load(char *buf, size_t size, const cli_load *load);

/* Phase error against frequency (errplot.c): each band of pts (as
 * cli_freq_points gives them) sampled CLI_ERRPLOT_SAMPLES times and
 * shaded, each --freq point a marker.  fn gives the error at a frequency
 * (and, when the plot has a second curve, its value); it returns 0 or
 * CLI_EXIT_USAGE after cli_error(). */
#define CLI_ERRPLOT_SAMPLES 50
typedef int (*cli_err_fn)(cli_ctx *ctx, void *user, double freq_hz,
                          double *err_deg, double *second_deg);
typedef struct cli_errplot {
    const char *title;
    const char *name;         /* the curve */
    const char *second;       /* a dashed second curve, or NULL */
    const char *note[3];
    int has_tolerance;        /* draw +-tolerance_deg */
    double tolerance_deg;
} cli_errplot;
int cli_errplot_save(cli_ctx *ctx, const char *field, const char *path,
                     const cli_freq_point *pts, int n, cli_err_fn fn, void *user,
                     const cli_errplot *plot);

/* Front-to-back ratio against frequency across each band of pts (pattern,
 * array): fn gives curve c's ratio at freq_hz (0, or CLI_EXIT_USAGE after
 * cli_error()); ratios beyond +-CLI_FB_SWEEP_CEILING_DB are drawn there.
 * Written to --sweep-plot.  Returns 0, or CLI_EXIT_USAGE after cli_error()
 * (also when pts holds no band). */
#define CLI_FB_SWEEP_POINTS 41     /* per band */
#define CLI_FB_SWEEP_CEILING_DB 60.0
typedef int (*cli_fb_fn)(cli_ctx *ctx, void *user, int curve, double freq_hz, double *fb_db);
typedef struct cli_fb_sweep {
    const char *names[2];     /* legend: first curve solid, second dashed */
    int ncurves;              /* 1 or 2 */
    const char *note[3];
    double elevation_deg;
} cli_fb_sweep;
int cli_fb_sweep_save(cli_ctx *ctx, const cli_args *a, const cli_freq_point *pts, int n,
                      const cli_fb_sweep *plot, cli_fb_fn fn, void *user);

/* ---- analyzer sweeps: sweep, fault (sweepfile.c) ---------------------- */

/* The sweep named by --file (or the bare argument; "-" for standard
 * input).  *path_out (may be NULL) gets the name to print.  Returns 0, or
 * CLI_EXIT_USAGE after a one-line error "file: NAME:N: what (expected
 * ...)", N the line of the file. */
int cli_sweep_load(const cli_ctx *ctx, const cli_args *a, cxl_sweep **sweep,
                   const char **path_out);
/* The same for a sweep named in option field (path NULL: none given). */
int cli_sweep_load_field(const cli_ctx *ctx, const char *field, const char *path,
                         cxl_sweep **sweep, const char **path_out);
/* --sweep FILE as readings for vf and trim: the series resonances of the
 * file of the kind --reading names (zero-x: reactance zeros, min-z: |Z|
 * minima, min-swr: SWR minima against ref_ohm), ascending, numbered for end
 * from their spacing (0 with fewer than two); *step_hz the mean point
 * spacing.  More than max is refused.  0, or CLI_EXIT_USAGE after
 * cli_error() on field "sweep". */
int cli_sweep_readings(const cli_ctx *ctx, const char *path, cxl_dip_kind kind, double ref_ohm,
                       cxl_stub_end end, double *freq_hz, int *order, int max, int *n,
                       double *step_hz);
/* "reactance-zero", "impedance-min" or "swr-min". */
const char *cli_sweep_kind_name(cxl_sweep_kind kind);

extern const cli_command cli_cmd_sweep;
extern const cli_command cli_cmd_fault;


/* ---- array layouts (layout.c): shared by array and harness ------------ */

/* One element of a layout CSV (label,x,y,z,delay,line,degrees,invert,
 * weight; only x and y are required). */
typedef struct cli_layout_elem {
    char label[64];         /* the label column, or E1, E2, ... */
    double x_m, y_m, z_m;   /* x forward, y right, z up */
    double delay_s;         /* feed delay from delay, line or degrees */
    double line_m;          /* the line column (when has_line) */
    int has_line;
    int invert;             /* polarity reversed */
    double weight_db;       /* relative voltage amplitude */
    size_t file_line;       /* line of the row in the file */
    double built_line_m;    /* as built (cli_layout_as_built) */
    double phase_error_deg; /* as built: lags by this much */
    double imbalance_db;    /* as built: weaker by this much */
} cli_layout_elem;

typedef struct cli_layout {
    size_t n;
    cli_layout_elem *el;
} cli_layout;

/* Read a layout file (path, or "-" for standard input).  A line column
 * needs vf > 0, a degrees column design_hz > 0 (0: not given).  Duplicate
 * labels, two elements within 1 mm, more than CXL_ARRAY_MAX_ELEMENTS, a
 * missing position and a delay that disagrees with the line or degrees of
 * its row are one-line errors naming the file line and the column.
 * Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_layout_load(cli_ctx *ctx, const char *field, const char *path, double vf,
                    double design_hz, cli_layout *layout);
void cli_layout_free(cli_layout *layout);
/* Read an as-built file (label,line,phase_error,imbalance) into the
 * layout's built_line_m, phase_error_deg and imbalance_db (elements it
 * does not name keep the design values). */
int cli_layout_as_built(cli_ctx *ctx, const char *field, const char *path, cli_layout *layout);
extern const cli_command cli_cmd_array;
extern const cli_command cli_cmd_harness;

/* ---- arrays from a layout (arrayspec.c): shared by array and yield ---- */

/* The layout and its lines, as array and yield declare them. */
#define CLI_LAYOUT_OPTDEFS \
    { "layout", "FILE", "layout CSV: label,x,y,z,delay,line,degrees,invert,weight", 0 }, \
    { "vf", "X", "velocity factor of the layout's line lengths", 0 }, \
    { "cable", "NAME", "feed-line cable from the catalog (its VF; its loss with --line-loss)", 0 }, \
    { "line-loss", NULL, "lines lose as the cable's model says (the loss sets each amplitude)", 0 }, \
    { "design-freq", "F", "frequency at which the degrees column holds", 0 }
/* --element isotropic|wire|vertical, --wire-length, --wire-vf and
 * --elevation (default 0, 20 for wires) as array and yield declare them. */
#define CLI_ARRAY_MODEL_OPTDEFS \
    { "element", "isotropic|wire|vertical", "element pattern (default isotropic)", 0 }, \
    { "wire-length", "LEN", "length of each traveling-wave wire", 0 }, \
    { "wire-vf", "X", "velocity factor along the wire", 0 }, \
    { "elevation", "DEG", "elevation of the azimuth cut (default 0, 20 for wires)", 0 }
typedef struct cli_array_model {
    int kind;                   /* a cxl_element_kind */
    double wire_length_m, wire_vf;
    double elevation_deg;       /* of the azimuth cut the results use */
    const char *model_text;     /* one line for the output */
} cli_array_model;
/* Returns 0, or CLI_EXIT_USAGE after cli_error(). */
int cli_array_model_parse(cli_ctx *ctx, const cli_args *a, cli_array_model *m);
/* The array of a layout: lines of velocity factor vf (or, with model, the
 * loss model's line of the same delay), as designed or (built) with the
 * as-built lengths, actual_vf and per-element errors; element `reversed`
 * (-1: none) has its polarity turned over. */
cxl_status cli_layout_array(const cli_layout *lay, const cli_array_model *m, double vf,
                            double actual_vf, const cxl_loss_model *model, int built,
                            int reversed, cxl_array **out);
/* --line-loss: the loss model of the --cable the lines are cut from
 * (cable: its name, or NULL/"" for --vf, an error then); *model stays
 * NULL without --line-loss.  Returns 0, or CLI_EXIT_USAGE after
 * cli_error(). */
int cli_line_loss_model(cli_ctx *ctx, const cli_args *a, const char *cable,
                        cxl_loss_model **model);
/* A ratio at the model's limit (|db| >= CXL_DB_LIMIT), and the note array,
 * yield and pattern print under a text table that holds one. */
int cli_at_db_limit(double db);
void cli_db_limit_note(cli_ctx *ctx, int at_limit);
/* --plot-freq and --plot-range need --plot (array, pattern): 0, or
 * CLI_EXIT_USAGE after cli_error(). */
int cli_plot_options_check(cli_ctx *ctx, const cli_args *a);
extern const cli_command cli_cmd_yield;

#endif
