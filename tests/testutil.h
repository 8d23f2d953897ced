/* testutil.h - run the built coaxline binary from a Check test, and the
 * checks the CLI end-to-end suites share. */
#ifndef COAXLINE_TESTUTIL_H
#define COAXLINE_TESTUTIL_H

#include <stddef.h>
#include <check.h>

/* ---- running the binary ------------------------------------------------ */

typedef struct cli_result {
    int rc;        /* exit status */
    char *out;     /* stdout, NUL-terminated (owned) */
    char *err;     /* stderr, NUL-terminated (owned) */
} cli_result;

/* Run "$COAXLINE_BIN ARGS" through /bin/sh with stdin_text (or nothing) on
 * standard input and the extra environment assignments env (or NULL),
 * e.g. "LC_ALL=de_DE.UTF-8". */
cli_result run_cli(const char *env, const char *args, const char *stdin_text);
/* The same with n bytes of standard input, which may hold NUL bytes. */
cli_result run_cli_bytes(const char *env, const char *args, const char *stdin_bytes,
                         size_t n);
void cli_result_free(cli_result *r);
/* run_cli(NULL, args, NULL), which must exit with rc (the test fails
 * otherwise, showing stderr); the result is the caller's to free. */
cli_result run_expect(const char *args, int rc);
/* Number of lines in text. */
int count_lines(const char *text);
/* Write text to a new temporary file; returns its path (owned). */
char *temp_file(const char *text, size_t size);
/* Write size bytes of text to a temporary file, run "coaxline ARGS" (no
 * environment, no standard input) where the first "%s" in args stands for
 * that file's path, and remove the file again. */
cli_result run_cli_with_file(const char *args, const char *text, size_t size);

/* ---- assertions ---------------------------------------------------------- */

/* text contains want (the failure message shows both). */
void has(const char *text, const char *want);
/* text does not contain unwanted. */
void lacks(const char *text, const char *unwanted);

/* Check that "coaxline ARGS" (with env, or NULL) fails as bad usage: exit 2,
 * nothing on stdout, exactly one stderr line "coaxline: ..." that names
 * field, contains also (unless NULL) and gives an example "(expected ...)". */
void expect_usage_error(const char *env, const char *args, const char *field,
                        const char *also);
/* The general form: stdin_text (or NULL) on standard input, and the one
 * stderr line must start with prefix (expect_usage_error's is "coaxline: ";
 * a command test may ask for "coaxline: trim: "). */
void expect_usage_error_at(const char *env, const char *args, const char *stdin_text,
                           const char *prefix, const char *field, const char *also);
/* expect_usage_error(NULL, args, field, NULL): the usual bad-input line. */
void bad(const char *args, const char *field);
/* expect_usage_error(NULL, args, field, also). */
void bad_also(const char *args, const char *field, const char *also);
/* bad_also on "coaxline ARGS" where the first "%s" in args is a temporary
 * file holding size bytes of text (as run_cli_with_file). */
void bad_with_file(const char *args, const char *text, size_t size, const char *field,
                   const char *also);
/* bad_with_file on "coaxline COMMAND FILE OPTS" where FILE holds text, e.g.
 * bad_file_opts("array --layout", layout, "--vf 0.66", "label", "line 3"). */
void bad_file_opts(const char *command, const char *text, const char *opts, const char *field,
                   const char *also);

/* ---- the comma locale ---------------------------------------------------- */

/* 1 when de_DE.UTF-8 is installed (the process stays in the C locale);
 * otherwise notes on stderr that the locale check is skipped and gives 0. */
int have_comma_locale(void);
/* Run each of the n argument strings under LC_ALL=C and under
 * LC_ALL=de_DE.UTF-8 (skipped as have_comma_locale says): in C it exits 0
 * .. max_rc and prints something, in de_DE it exits the same, and standard
 * output is the same bytes. */
void expect_same_bytes_in_comma_locale(const char *const *cases, size_t n, int max_rc);

/* ---- independent checks in Python ---------------------------------------- */

/* The Python with numpy/scipy: $PYTHON3_SYSTEM (set by make check), else
 * /usr/bin/python3. */
const char *python3(void);
/* "python3 -c CODE PATH" exits 0 (sys.argv[1] is path); code must not hold
 * a single quote. */
void python_holds(const char *code, const char *path);
/* python_holds on a temporary file holding text. */
void python_holds_text(const char *code, const char *text);
/* Python's json module, an independent parser, loads json as d; prelude
 * (Python statements ending in a newline, or "") runs before, with json,
 * sys, math and cmath imported; the expression check must be true. */
void json_prelude_holds(const char *json, const char *prelude, const char *check);
void json_holds(const char *json, const char *check);
/* Python's xml.etree parses the SVG file at path (a well-formed document)
 * and runs asserts with these names bound: t (the tree), n (the SVG
 * namespace in braces), r (the root), paths (the <path>s under the root),
 * texts (every <text>'s content), dashed (the <line>s with a dash pattern),
 * rects (the shaded band rectangles, fill #e6e6e6). */
void svg_holds(const char *path, const char *asserts);
/* "coaxline ARGS" exits 0 and python_holds_text(code, its stdout). */
void output_holds(const char *args, const char *code);
/* "coaxline ARGS" (which writes the SVG file svg) exits 0 and
 * svg_holds(svg, asserts). */
void plot_holds(const char *args, const char *svg, const char *asserts);

/* The number after "key": in the row-th object of a JSON array. */
double json_number(const char *json, int row, const char *key);
/* json_number of "coaxline ARGS --format json" (exit 0 or 1). */
double run_json_number(const char *args, int row, const char *key);

/* ---- main ---------------------------------------------------------------- */

/* Run every test of s; EXIT_FAILURE when any failed, else EXIT_SUCCESS. */
int run_suite(Suite *s);

/* ---- sweeps written by tests/sweep_gen.py ------------------------------- */

/* Make a fresh folder "$TMPDIR/NAME.XXXXXX" into dir (size bytes), run
 * "python3 tests/sweep_gen.py GEN" for each of the ngen strings gen (printf
 * formats where %s stands for the folder, e.g. "fault '%s'"), then s, and
 * remove the folder; EXIT_FAILURE when the folder or a sweep cannot be
 * made or a test failed. */
int run_suite_with_sweeps(Suite *s, char *dir, size_t size, const char *name,
                          const char *const *gen, size_t ngen);
/* The sweep dir/name, which must read (the test fails otherwise). */
struct cxl_sweep *load_sweep(const char *dir, const char *name);

#endif
