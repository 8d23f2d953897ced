/* check_cli_bad.c - bad input to the coaxline binary, table driven: every
 * case of tests/bad_inputs.tsv (its header describes the columns) gives
 * the expected exit status, exactly one error line per bad input naming
 * its field (and its batch line), no NaN or infinity on stdout, and in a
 * batch every good row still printed.  Each case runs again under
 * LC_ALL=de_DE.UTF-8 and must print the same bytes.
 *
 * Also here: CSV output cannot carry a spreadsheet formula in a label.
 * Expected values come from the command's documented contract
 * (man/coaxline.1, DESIGN.md); the few computed numbers a case expects
 * (column 9) have their working in the header of tests/bad_inputs.tsv. */
#include <config.h>
#include <check.h>
#include <ctype.h>
#include <locale.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

#define NCOLS 9
#define MAX_CASES 2000

typedef struct bad_case {
    size_t line;          /* in the .tsv */
    char *col[NCOLS];     /* raw columns */
} bad_case;

static bad_case cases[MAX_CASES];
static size_t ncases;
static int german; /* de_DE.UTF-8 is installed */

/* ---- reading the table -------------------------------------------------- */

typedef struct bytes {
    char *p;
    size_t n, cap;
} bytes;

static void put(bytes *b, const char *s, size_t n)
{
    if (b->n + n + 1 > b->cap) {
        while (b->n + n + 1 > b->cap) b->cap = b->cap ? b->cap * 2 : 256;
        b->p = realloc(b->p, b->cap);
        ck_assert_ptr_nonnull(b->p);
    }
    memcpy(b->p + b->n, s, n);
    b->n += n;
    b->p[b->n] = '\0';
}

static int hexval(char c)
{
    return c >= '0' && c <= '9' ? c - '0' : c >= 'a' && c <= 'f' ? c - 'a' + 10
         : c >= 'A' && c <= 'F' ? c - 'A' + 10 : -1;
}

/* Expand the escapes of the table (see its header) into bytes. */
static bytes expand(const char *s, const char *id)
{
    bytes b = { NULL, 0, 0 };
    put(&b, "", 0);
    while (*s) {
        if (s[0] == '{' && s[1] == '{') {
            char *end;
            long n = strtol(s + 2, &end, 10);
            const char *close = strstr(s, "}}");
            ck_assert_msg(*end == '*' && close && n > 0 && n <= 16L << 20,
                          "%s: bad {{N*TEXT}}", id);
            bytes unit = { NULL, 0, 0 };
            char *text = strndup(end + 1, (size_t)(close - end - 1));
            unit = expand(text, id);
            for (long i = 0; i < n; i++) put(&b, unit.p, unit.n);
            free(text);
            free(unit.p);
            s = close + 2;
            continue;
        }
        if (*s != '\\') {
            put(&b, s++, 1);
            continue;
        }
        char c = s[1];
        s += 2;
        if (c == 'n') put(&b, "\n", 1);
        else if (c == 'r') put(&b, "\r", 1);
        else if (c == 't') put(&b, "\t", 1);
        else if (c == '\\') put(&b, "\\", 1);
        else if (c == '0') put(&b, "", 1);
        else if (c == 'x' && hexval(s[0]) >= 0 && hexval(s[1]) >= 0) {
            char byte = (char)(hexval(s[0]) * 16 + hexval(s[1]));
            put(&b, &byte, 1);
            s += 2;
        } else {
            ck_abort_msg("%s: unknown escape \\%c", id, c);
        }
    }
    return b;
}

static void read_table(void)
{
    const char *dir = getenv("COAXLINE_SRCDIR");
    char path[4096];
    snprintf(path, sizeof path, "%s/tests/bad_inputs.tsv", dir ? dir : ".");
    FILE *fp = fopen(path, "r");
    if (!fp) {
        perror(path);
        exit(EXIT_FAILURE);
    }
    char *line = NULL;
    size_t cap = 0, lineno = 0;
    ssize_t len;
    while ((len = getline(&line, &cap, fp)) >= 0) {
        lineno++;
        while (len > 0 && (line[len - 1] == '\n' || line[len - 1] == '\r')) line[--len] = '\0';
        if (len == 0 || line[0] == '#') continue;
        if (ncases == MAX_CASES) {
            fprintf(stderr, "%s: more than %d cases\n", path, MAX_CASES);
            exit(EXIT_FAILURE);
        }
        bad_case *c = &cases[ncases++];
        c->line = lineno;
        char *p = line;
        for (int k = 0; k < NCOLS; k++) {
            char *tab = strchr(p, '\t');
            if ((k < NCOLS - 1) != (tab != NULL)) {
                fprintf(stderr, "%s:%zu: %d columns expected\n", path, lineno, NCOLS);
                exit(EXIT_FAILURE);
            }
            if (tab) *tab = '\0';
            c->col[k] = strdup(p);
            p = tab ? tab + 1 : p + strlen(p);
        }
    }
    free(line);
    fclose(fp);
}

/* ---- checks ------------------------------------------------------------- */

/* "nan" or "inf" (or "infinity") as a word, in any case. */
static const char *nonfinite_word(const char *s)
{
    for (const char *p = s; *p;) {
        if (!isalpha((unsigned char)*p)) { p++; continue; }
        const char *w = p;
        while (isalpha((unsigned char)*p)) p++;
        size_t n = (size_t)(p - w);
        if ((n == 3 && (strncasecmp(w, "nan", 3) == 0 || strncasecmp(w, "inf", 3) == 0)) ||
            (n == 8 && strncasecmp(w, "infinity", 8) == 0))
            return w;
    }
    return NULL;
}

/* The i-th of the |-separated items of list (a fresh copy), or NULL. */
static char *item(const char *list, size_t i)
{
    const char *p = list;
    for (size_t k = 0; k < i; k++) {
        p = strchr(p, '|');
        if (!p) return NULL;
        p++;
    }
    const char *end = strchr(p, '|');
    return strndup(p, end ? (size_t)(end - p) : strlen(p));
}

/* CSV records in text: line ends outside double quotes. */
static int count_records(const char *text)
{
    int n = 0, quoted = 0;
    for (; *text; text++) {
        if (*text == '"') quoted = !quoted;
        else if (*text == '\n' && !quoted) n++;
    }
    return n;
}

static size_t count_items(const char *list, char sep)
{
    size_t n = 1;
    for (; *list; list++) n += *list == sep;
    return n;
}

/* Replace @FILE@ in args by path. */
static char *with_file(const char *args, const char *path)
{
    const char *at = strstr(args, "@FILE@");
    if (!at) return strdup(args);
    ck_assert_ptr_nonnull(path);
    size_t n = strlen(args) + strlen(path) + 1;
    char *s = malloc(n);
    snprintf(s, n, "%.*s%s%s", (int)(at - args), args, path, at + 6);
    ck_assert_msg(strstr(s, "@FILE@") == NULL, "only one @FILE@ per case");
    return s;
}

START_TEST(table_case)
{
    const bad_case *c = &cases[_i];
    char id[160];
    snprintf(id, sizeof id, "bad_inputs.tsv:%zu %s", c->line, c->col[0]);

    bytes file = expand(c->col[3], id), in = expand(c->col[2], id);
    int has_file = strcmp(c->col[3], "-") != 0, has_in = strcmp(c->col[2], "-") != 0;
    char *path = has_file ? temp_file(file.p, file.n) : NULL;
    bytes rawargs = expand(c->col[1], id);
    ck_assert_msg(strlen(rawargs.p) == rawargs.n, "%s: NUL byte in args", id);
    char *args = with_file(rawargs.p, path);

    cli_result r = run_cli_bytes("LC_ALL=C", args, has_in ? in.p : "", has_in ? in.n : 0);

    /* exit status */
    int want_exit = atoi(c->col[4]);
    ck_assert_msg(r.rc == want_exit, "%s: exit %d, expected %d; stderr: %s", id, r.rc,
                  want_exit, r.err);

    /* error lines: how many, and what each says */
    const char *lines = c->col[6];
    size_t want_lines = strcmp(lines, "-") == 0 ? 1 : strcmp(lines, "0") == 0
                      ? 0 : count_items(lines, ',');
    ck_assert_msg(count_lines(r.err) == (int)want_lines, "%s: %d error lines, expected %zu: %s",
                  id, count_lines(r.err), want_lines, r.err);
    ck_assert_msg(r.err[0] == '\0' || r.err[strlen(r.err) - 1] == '\n',
                  "%s: stderr does not end a line: %s", id, r.err);
    size_t nfields = count_items(c->col[5], '|');
    ck_assert_msg(nfields == 1 || nfields == want_lines,
                  "%s: %zu field texts for %zu error lines", id, nfields, want_lines);
    const char *ln = r.err;
    const char *next_num = lines;
    for (size_t i = 0; i < want_lines; i++) {
        const char *eol = strchr(ln, '\n');
        char *one = strndup(ln, (size_t)(eol - ln));
        char *field = item(c->col[5], nfields == 1 ? 0 : i);
        ck_assert_msg(strncmp(one, "coaxline: ", 10) == 0, "%s: '%s'", id, one);
        ck_assert_msg(strstr(one, "(expected ") != NULL, "%s: no example in '%s'", id, one);
        ck_assert_msg(strstr(one, field) != NULL, "%s: '%s' does not name %s", id, one, field);
        ck_assert_msg(strlen(one) < 4096, "%s: error line of %zu bytes", id, strlen(one));
        if (strcmp(lines, "-") == 0) {
            /* a command-line error names no batch line */
            const char *l = strstr(one, " line ");
            ck_assert_msg(!l || !isdigit((unsigned char)l[6]), "%s: '%s' names a line", id, one);
        } else {
            char want[32];
            int n = (int)strtol(next_num, (char **)&next_num, 10);
            if (*next_num == ',') next_num++;
            snprintf(want, sizeof want, "line %d: ", n);
            ck_assert_msg(strstr(one, want) != NULL, "%s: '%s' does not say '%s'", id, one, want);
        }
        free(field);
        free(one);
        ln = eol + 1;
    }

    /* stdout: no NaN or infinity, the good rows and what they must hold */
    const char *w = nonfinite_word(r.out);
    ck_assert_msg(w == NULL, "%s: stdout holds '%.8s': %s", id, w, r.out);
    int good = atoi(c->col[7]);
    if (good == 0)
        ck_assert_msg(r.out[0] == '\0', "%s: printed %s", id, r.out);
    else
        ck_assert_msg(count_records(r.out) == good + 1, "%s: %d records on stdout, expected "
                      "a header and %d rows: %s", id, count_records(r.out), good, r.out);
    if (strcmp(c->col[8], "-") != 0) {
        for (size_t i = 0; i < count_items(c->col[8], '|'); i++) {
            char *raw = item(c->col[8], i);
            bytes keep = expand(raw, id);
            ck_assert_msg(strstr(r.out, keep.p) != NULL, "%s: stdout lacks '%s': %s", id,
                          raw, r.out);
            free(keep.p);
            free(raw);
        }
    }

    /* the same bytes under a locale whose decimal mark is a comma */
    if (german) {
        cli_result d = run_cli_bytes("LC_ALL=de_DE.UTF-8", args, has_in ? in.p : "",
                                     has_in ? in.n : 0);
        ck_assert_msg(d.rc == r.rc, "%s: exit %d under de_DE.UTF-8", id, d.rc);
        ck_assert_msg(strcmp(d.out, r.out) == 0, "%s: other stdout under de_DE.UTF-8", id);
        ck_assert_int_eq(count_lines(d.err), count_lines(r.err));
        cli_result_free(&d);
    }

    cli_result_free(&r);
    if (path) unlink(path);
    free(path);
    free(args);
    free(rawargs.p);
    free(file.p);
    free(in.p);
}
END_TEST

/* The table must not be padded with duplicates: every id is unique. */
START_TEST(table_ids_unique)
{
    ck_assert_uint_ge(ncases, 40);
    for (size_t i = 0; i < ncases; i++)
        for (size_t j = i + 1; j < ncases; j++)
            ck_assert_msg(strcmp(cases[i].col[0], cases[j].col[0]) != 0,
                          "id %s twice (lines %zu and %zu)", cases[i].col[0], cases[i].line,
                          cases[j].line);
}
END_TEST

/* ---- spreadsheet safety --------------------------------------------------
 * A label is text.  In CSV a text cell whose first character is = + - @, a
 * TAB or a CR makes a spreadsheet run it as a formula (OWASP, "CSV
 * Injection"), so the writer puts an apostrophe before it.  Decision: a
 * label that IS a plain number ("-3", "+3", "-2.5e3") is left alone: a
 * spreadsheet reads it as that number, which is harmless, and rewriting it
 * would change a label the user gave.  Numbers in numeric columns are
 * written plain (digits, a '.', a leading '-' only for negative values),
 * never with an apostrophe.  JSON is not for spreadsheets: its labels are
 * the exact text. */

static const char *const hostile[] = {
    "=1+2", "+1+2", "-1+2", "@SUM(A1)", "\tTAB", "\rCR", "=HYPERLINK(\"x\",\"y\")",
    "-", "@", "-3 ", "=", "-3", "+3", "-2.5e3", "plain", "'quoted already",
};
#define NHOSTILE (sizeof hostile / sizeof hostile[0])

START_TEST(csv_labels_cannot_be_formulas)
{
    /* a batch file with one row per label, every label quoted */
    bytes csv = { NULL, 0, 0 };
    put(&csv, "label,offset,vf\r\n", 17);
    for (size_t i = 0; i < NHOSTILE; i++) {
        put(&csv, "\"", 1);
        for (const char *p = hostile[i]; *p; p++)
            put(&csv, *p == '"' ? "\"\"" : p, *p == '"' ? 2 : 1);
        put(&csv, "\",10m,0.8\r\n", 11);
    }
    char *in = temp_file(csv.p, csv.n);
    char args[512];
    snprintf(args, sizeof args, "cut --input %s --format csv --freq 1.83MHz", in);
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_msg(r.rc == 0, "exit %d: %s", r.rc, r.err);
    char *out = temp_file(r.out, strlen(r.out));
    /* Python's csv module reads both files independently of our reader and
     * applies the rule stated above. */
    char cmd[2048];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import csv, re, sys\n"
             "src = list(csv.reader(open(sys.argv[1], newline=\"\")))[1:]\n"
             "out = list(csv.reader(open(sys.argv[2], newline=\"\")))\n"
             "assert out[0][0] == \"label\", out[0]\n"
             "num = re.compile(r\"^[+-]?([0-9]+[.]?[0-9]*|[.][0-9]+)([eE][+-]?[0-9]+)?$\")\n"
             "plain = re.compile(r\"^-?[0-9]+([.][0-9]+)?$\")\n"
             "assert len(out) == len(src) + 1, (len(out), len(src))\n"
             "for s, o in zip(src, out[1:]):\n"
             "    label = s[0]\n"
             "    risky = label[:1] in (\"=\", \"+\", \"-\", \"@\", \"\\t\", \"\\r\") and not num.match(label)\n"
             "    want = \"\\x27\" + label if risky else label\n"
             "    assert o[0] == want, (label, o[0])\n"
             "    for cell in o[1:]:\n"
             "        assert cell == \"\" or plain.match(cell), (label, cell)\n"
             "print(len(src), \"labels checked\")\n"
             "' %s %s",
             getenv("PYTHON3_SYSTEM") && *getenv("PYTHON3_SYSTEM") ? getenv("PYTHON3_SYSTEM")
                                                                   : "/usr/bin/python3",
             in, out);
    ck_assert_int_eq(system(cmd), 0);
    unlink(in);
    unlink(out);
    free(in);
    free(out);
    free(csv.p);
    cli_result_free(&r);

    /* the same rule for a label from the command line */
    r = run_cli(NULL, "cut --offset 10m --vf 0.8 --format csv --label '@SUM(A1)'", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_ptr_nonnull(strstr(r.out, "\n'@SUM(A1),10.000,"));
    cli_result_free(&r);
    r = run_cli(NULL, "cut --offset 10m --vf 0.8 --format csv --label -3", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_ptr_nonnull(strstr(r.out, "\n-3,10.000,"));
    cli_result_free(&r);
    /* JSON keeps the exact text */
    r = run_cli(NULL, "cut --offset 10m --vf 0.8 --format json --label '=1+2'", NULL);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_ptr_nonnull(strstr(r.out, "\"label\":\"=1+2\""));
    cli_result_free(&r);
}
END_TEST

int main(void)
{
    read_table();
    german = setlocale(LC_ALL, "de_DE.UTF-8") != NULL;
    setlocale(LC_ALL, "C");
    if (!german)
        fprintf(stderr, "note: de_DE.UTF-8 not available, locale comparison skipped\n");
    printf("%zu bad-input cases in tests/bad_inputs.tsv\n", ncases);

    Suite *s = suite_create("cli_bad");
    TCase *tc = tcase_create("table");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, table_ids_unique);
    tcase_add_loop_test(tc, table_case, 0, (int)ncases);
    suite_add_tcase(s, tc);
    TCase *sheet = tcase_create("spreadsheet");
    tcase_set_timeout(sheet, 60);
    tcase_add_test(sheet, csv_labels_cannot_be_formulas);
    suite_add_tcase(s, sheet);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    for (size_t i = 0; i < ncases; i++)
        for (int k = 0; k < NCOLS; k++) free(cases[i].col[k]);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
