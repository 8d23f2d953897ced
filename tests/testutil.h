/* testutil.h - run the built coaxline binary from a Check test. */
#ifndef COAXLINE_TESTUTIL_H
#define COAXLINE_TESTUTIL_H

#include <stddef.h>

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
/* Number of lines in text. */
int count_lines(const char *text);
/* Write text to a new temporary file; returns its path (owned). */
char *temp_file(const char *text, size_t size);

/* Check that "coaxline ARGS" (with env, or NULL) fails as bad usage: exit 2,
 * nothing on stdout, exactly one stderr line "coaxline: ..." that names
 * field, contains also (unless NULL) and gives an example "(expected ...)". */
void expect_usage_error(const char *env, const char *args, const char *field,
                        const char *also);

#endif
