/* testutil.c - run the built coaxline binary from a Check test, and the
 * checks the CLI end-to-end suites share (see testutil.h). */
#include <config.h>
#include <check.h>
#include <locale.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <unistd.h>
#include "coaxline.h"
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

/* args with its first "%s" replaced by path (owned). */
static char *with_path(const char *args, const char *path)
{
    const char *at = strstr(args, "%s");
    ck_assert_msg(at != NULL, "no %%s for the file in '%s'", args);
    size_t len = strlen(args) - 2 + strlen(path) + 1;
    char *full = malloc(len);
    ck_assert_ptr_nonnull(full);
    snprintf(full, len, "%.*s%s%s", (int)(at - args), args, path, at + 2);
    return full;
}

cli_result run_cli_with_file(const char *args, const char *text, size_t size)
{
    char *path = temp_file(text, size);
    char *full = with_path(args, path);
    cli_result r = run_cli(NULL, full, NULL);
    unlink(path);
    free(path);
    free(full);
    return r;
}

cli_result run_expect(const char *args, int rc)
{
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_msg(r.rc == rc, "coaxline %s: exit %d, not %d; stderr:\n%s", args, r.rc, rc,
                  r.err);
    return r;
}

void has(const char *text, const char *want)
{
    ck_assert_msg(strstr(text, want) != NULL, "missing '%s' in:\n%s", want, text);
}

void lacks(const char *text, const char *unwanted)
{
    ck_assert_msg(strstr(text, unwanted) == NULL, "unexpected '%s' in:\n%s", unwanted, text);
}

void expect_usage_error_at(const char *env, const char *args, const char *stdin_text,
                           const char *prefix, const char *field, const char *also)
{
    cli_result r = run_cli(env, args, stdin_text);
    ck_assert_msg(r.rc == 2, "'%s' exit %d", args, r.rc);
    ck_assert_msg(count_lines(r.err) == 1, "'%s' stderr: %s", args, r.err);
    ck_assert_msg(strncmp(r.err, prefix, strlen(prefix)) == 0, "'%s': %s", args, r.err);
    ck_assert_msg(strstr(r.err, field) != NULL, "'%s' does not name %s: %s", args, field, r.err);
    ck_assert_msg(!also || strstr(r.err, also) != NULL, "'%s' lacks '%s': %s", args, also, r.err);
    ck_assert_msg(strstr(r.err, "(expected ") != NULL, "'%s' gives no example: %s", args, r.err);
    ck_assert_msg(r.out[0] == '\0', "'%s' printed: %s", args, r.out);
    cli_result_free(&r);
}

void expect_usage_error(const char *env, const char *args, const char *field,
                        const char *also)
{
    expect_usage_error_at(env, args, NULL, "coaxline: ", field, also);
}

void bad(const char *args, const char *field)
{
    expect_usage_error(NULL, args, field, NULL);
}

void bad_also(const char *args, const char *field, const char *also)
{
    expect_usage_error(NULL, args, field, also);
}

void bad_with_file(const char *args, const char *text, size_t size, const char *field,
                   const char *also)
{
    char *path = temp_file(text, size);
    char *full = with_path(args, path);
    expect_usage_error(NULL, full, field, also);
    unlink(path);
    free(path);
    free(full);
}

void bad_file_opts(const char *command, const char *text, const char *opts, const char *field,
                   const char *also)
{
    char args[1024];
    snprintf(args, sizeof args, "%s %%s %s", command, opts);
    bad_with_file(args, text, strlen(text), field, also);
}

int have_comma_locale(void)
{
    int ok = setlocale(LC_ALL, "de_DE.UTF-8") != NULL;
    setlocale(LC_ALL, "C");
    if (!ok)
        fprintf(stderr, "note: de_DE.UTF-8 not available, locale check skipped\n");
    return ok;
}

void expect_same_bytes_in_comma_locale(const char *const *cases, size_t n, int max_rc)
{
    if (!have_comma_locale())
        return;
    for (size_t i = 0; i < n; i++) {
        cli_result c = run_cli("LC_ALL=C", cases[i], NULL);
        cli_result d = run_cli("LC_ALL=de_DE.UTF-8", cases[i], NULL);
        ck_assert_msg(c.rc >= 0 && c.rc <= max_rc, "'%s' exit %d: %s", cases[i], c.rc, c.err);
        ck_assert_msg(d.rc == c.rc, "'%s' exit %d under de_DE, %d in C: %s", cases[i], d.rc,
                      c.rc, d.err);
        ck_assert_msg(c.out[0] != '\0', "'%s' printed nothing", cases[i]);
        ck_assert_msg(strcmp(c.out, d.out) == 0, "'%s' differs under de_DE:\n%s\n----\n%s",
                      cases[i], c.out, d.out);
        cli_result_free(&c);
        cli_result_free(&d);
    }
}

const char *python3(void)
{
    const char *p = getenv("PYTHON3_SYSTEM");
    return p && p[0] ? p : "/usr/bin/python3";
}

/* Exit status of "python3 -c CODE PATH" as system() gives it. */
static int python_status(const char *code, const char *path)
{
    size_t len = strlen(python3()) + strlen(code) + strlen(path) + 16;
    char *cmd = malloc(len);
    ck_assert_ptr_nonnull(cmd);
    snprintf(cmd, len, "%s -c '%s' %s", python3(), code, path);
    int rc = system(cmd);
    free(cmd);
    return rc;
}

void python_holds(const char *code, const char *path)
{
    int rc = python_status(code, path);
    ck_assert_msg(rc == 0, "Python check failed (status %d): %s", rc, code);
}

void python_holds_text(const char *code, const char *text)
{
    char *path = temp_file(text, strlen(text));
    python_holds(code, path);
    unlink(path);
    free(path);
}

void json_prelude_holds(const char *json, const char *prelude, const char *check)
{
    static const char fmt[] = "import json,sys,math,cmath\n%sd=json.load(open(sys.argv[1]))\n"
                              "sys.exit(0 if (%s) else 1)";
    size_t len = sizeof fmt + strlen(prelude) + strlen(check);
    char *code = malloc(len);
    ck_assert_ptr_nonnull(code);
    snprintf(code, len, fmt, prelude, check);
    char *path = temp_file(json, strlen(json));
    ck_assert_msg(python_status(code, path) == 0, "JSON check failed: %s\n%s", check, json);
    unlink(path);
    free(path);
    free(code);
}

void json_holds(const char *json, const char *check)
{
    json_prelude_holds(json, "", check);
}

void svg_holds(const char *path, const char *asserts)
{
    static const char prelude[] =
        "import sys, xml.etree.ElementTree as E; t=E.parse(sys.argv[1]); "
        "n=\"{http://www.w3.org/2000/svg}\"; r=t.getroot(); paths=r.findall(n+\"path\"); "
        "texts=[x.text or \"\" for x in t.iter(n+\"text\")]; "
        "dashed=[x for x in r.findall(n+\"line\") if x.get(\"stroke-dasharray\")]; "
        "rects=[x for x in r.findall(n+\"rect\") if x.get(\"fill\")==\"#e6e6e6\"]; ";
    size_t len = sizeof prelude + strlen(asserts);
    char *code = malloc(len);
    ck_assert_ptr_nonnull(code);
    snprintf(code, len, "%s%s", prelude, asserts);
    python_holds(code, path);
    free(code);
}

void output_holds(const char *args, const char *code)
{
    cli_result r = run_expect(args, 0);
    python_holds_text(code, r.out);
    cli_result_free(&r);
}

void plot_holds(const char *args, const char *svg, const char *asserts)
{
    cli_result r = run_expect(args, 0);
    cli_result_free(&r);
    svg_holds(svg, asserts);
}

int run_suite(Suite *s)
{
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}

/* ---- JSON numbers ---------------------------------------------------------- */

/* The number after "key": in the row-th object of a JSON array. */
double json_number(const char *json, int row, const char *key)
{
    char pat[80];
    snprintf(pat, sizeof pat, "\"%s\":", key);
    const char *p = json;
    for (int i = 0; i <= row; i++) {
        p = strstr(p, pat);
        ck_assert_msg(p != NULL, "no %s in row %d of %s", key, row, json);
        p += strlen(pat);
    }
    char tok[64];
    size_t n = strcspn(p, ",}");
    ck_assert(n < sizeof tok);
    memcpy(tok, p, n);
    tok[n] = '\0';
    double v;
    ck_assert_msg(cxl_units_parse_number(tok, &v, NULL) == CXL_OK, "%s is %s", key, tok);
    return v;
}

double run_json_number(const char *args, int row, const char *key)
{
    char full[1024];
    snprintf(full, sizeof full, "%s --format json", args);
    cli_result r = run_cli(NULL, full, NULL);
    ck_assert_msg(r.rc == 0 || r.rc == 1, "'%s' exit %d: %s", args, r.rc, r.err);
    double v = json_number(r.out, row, key);
    cli_result_free(&r);
    return v;
}

/* ---- sweeps written by tests/sweep_gen.py ------------------------------- */

int run_suite_with_sweeps(Suite *s, char *dir, size_t size, const char *name,
                          const char *const *gen, size_t ngen)
{
    const char *tmp = getenv("TMPDIR");
    snprintf(dir, size, "%s/%s.XXXXXX", tmp && *tmp ? tmp : "/tmp", name);
    if (!mkdtemp(dir)) {
        perror("mkdtemp");
        return EXIT_FAILURE;
    }
    const char *src = getenv("COAXLINE_SRCDIR");
    char args[1024], cmd[2048];
    for (size_t i = 0; i < ngen; i++) {
        snprintf(args, sizeof args, gen[i], dir);
        snprintf(cmd, sizeof cmd, "%s '%s/tests/sweep_gen.py' %s 2>/dev/null", python3(),
                 src ? src : ".", args);
        if (system(cmd) != 0) {
            fprintf(stderr, "sweep_gen.py failed: %s\n", cmd);
            return EXIT_FAILURE;
        }
    }
    int rc = run_suite(s);
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
    if (system(cmd) != 0) fprintf(stderr, "could not remove %s\n", dir);
    return rc;
}

cxl_sweep *load_sweep(const char *dir, const char *name)
{
    char path[1024];
    snprintf(path, sizeof path, "%s/%s", dir, name);
    FILE *fp = fopen(path, "rb");
    ck_assert_msg(fp != NULL, "cannot open %s", path);
    cxl_sweep *s = NULL;
    size_t line = 0;
    char text[200] = "";
    cxl_status st = cxl_sweep_read(fp, &s, &line, text, sizeof text);
    fclose(fp);
    ck_assert_msg(st == CXL_OK, "%s: status %d line %zu: %s", name, st, line, text);
    return s;
}
