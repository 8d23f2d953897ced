/* testutil.c - run the built coaxline binary from a Check test. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <unistd.h>
#include "testutil.h"

static char *slurp(const char *path)
{
    FILE *fp = fopen(path, "rb");
    ck_assert_ptr_nonnull(fp);
    size_t cap = 4096, n = 0;
    char *buf = malloc(cap);
    size_t got;
    while ((got = fread(buf + n, 1, cap - n - 1, fp)) > 0) {
        n += got;
        if (cap - n - 1 == 0) buf = realloc(buf, cap *= 2);
    }
    buf[n] = '\0';
    fclose(fp);
    return buf;
}

char *temp_file(const char *text, size_t size)
{
    char *path = strdup("/tmp/coaxline-test-XXXXXX");
    int fd = mkstemp(path);
    ck_assert_int_ge(fd, 0);
    ck_assert_int_eq(write(fd, text, size), (ssize_t)size);
    close(fd);
    return path;
}

cli_result run_cli(const char *env, const char *args, const char *stdin_text)
{
    return run_cli_bytes(env, args, stdin_text ? stdin_text : "",
                         stdin_text ? strlen(stdin_text) : 0);
}

cli_result run_cli_bytes(const char *env, const char *args, const char *stdin_bytes,
                         size_t n)
{
    const char *bin = getenv("COAXLINE_BIN");
    ck_assert_msg(bin != NULL, "COAXLINE_BIN is not set (run through make check)");
    char *in = temp_file(stdin_bytes, n);
    char *out = temp_file("", 0), *err = temp_file("", 0);
    size_t len = strlen(bin) + strlen(args) + (env ? strlen(env) : 0) + 3 * 64 + 64;
    char *cmd = malloc(len);
    snprintf(cmd, len, "%s '%s' %s <%s >%s 2>%s", env ? env : "", bin, args, in, out, err);
    int status = system(cmd);
    cli_result r;
    r.rc = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    r.out = slurp(out);
    r.err = slurp(err);
    unlink(in); unlink(out); unlink(err);
    free(in); free(out); free(err); free(cmd);
    return r;
}

void cli_result_free(cli_result *r)
{
    free(r->out);
    free(r->err);
}

int count_lines(const char *text)
{
    int n = 0;
    for (; *text; text++) n += *text == '\n';
    return n;
}

void expect_usage_error(const char *env, const char *args, const char *field,
                        const char *also)
{
    cli_result r = run_cli(env, args, NULL);
    ck_assert_msg(r.rc == 2, "'%s' exit %d", args, r.rc);
    ck_assert_msg(count_lines(r.err) == 1, "'%s' stderr: %s", args, r.err);
    ck_assert_msg(strncmp(r.err, "coaxline: ", 10) == 0, "'%s': %s", args, r.err);
    ck_assert_msg(strstr(r.err, field) != NULL, "'%s' does not name %s: %s", args, field, r.err);
    ck_assert_msg(!also || strstr(r.err, also) != NULL, "'%s' lacks '%s': %s", args, also, r.err);
    ck_assert_msg(strstr(r.err, "(expected ") != NULL, "'%s' gives no example: %s", args, r.err);
    ck_assert_msg(r.out[0] == '\0', "'%s' printed: %s", args, r.out);
    cli_result_free(&r);
}
