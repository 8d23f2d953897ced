/* check_cli_jobs.c - --jobs N: every batch command gives the same stdout,
 * stderr, stdout and stderr together (2>&1), exit status and plot files
 * with --jobs 1, 2, 3 and 8, on batches of thousands of rows with bad
 * rows among them (the golden inputs repeated), with --plot {line}
 * patterns, a byte-order mark, ';' files with decimal commas, and with a
 * file every row needs that fails once for the whole run.  The expected
 * output is --jobs 1's, itself the one-thread driver whose bytes
 * tests/golden/run.sh pins (common practice, no source: a parallel run
 * must equal the serial one). */
#include <config.h>
#include <check.h>
#include <dirent.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <sys/wait.h>
#include "testutil.h"

static const int jobs[] = { 2, 3, 8 };

/* The golden input NAME repeated until it has at least rows data rows,
 * in a temporary file (path owned); prefix (may be "") before the header. */
static char *repeated_input(const char *name, size_t rows, const char *prefix)
{
    const char *src = getenv("COAXLINE_SRCDIR");
    char path[4096];
    snprintf(path, sizeof path, "%s/tests/golden/input/%s", src ? src : ".", name);
    FILE *fp = fopen(path, "rb");
    ck_assert_msg(fp != NULL, "cannot open %s", path);
    static char text[1 << 16];
    size_t n = fread(text, 1, sizeof text - 1, fp);
    fclose(fp);
    text[n] = '\0';
    char *body = strchr(text, '\n');
    ck_assert_ptr_nonnull(body);
    body++;
    int per = count_lines(body);
    ck_assert_int_gt(per, 0);
    size_t copies = (rows + (size_t)per - 1) / (size_t)per;
    size_t plen = strlen(prefix), hlen = (size_t)(body - text), blen = strlen(body);
    char *all = malloc(plen + hlen + copies * blen + 1);
    ck_assert_ptr_nonnull(all);
    memcpy(all, prefix, plen);
    memcpy(all + plen, text, hlen);
    for (size_t i = 0; i < copies; i++) memcpy(all + plen + hlen + i * blen, body, blen);
    size_t total = plen + hlen + copies * blen;
    char *file = temp_file(all, total);
    free(all);
    return file;
}

/* The names and bytes of the files in dir, in name order (owned), and
 * the folder emptied. */
static char *dir_contents(const char *dir)
{
    struct dirent **list;
    int n = scandir(dir, &list, NULL, alphasort);
    ck_assert_int_ge(n, 0);
    size_t size = 1, used = 0;
    char *all = calloc(1, size);
    for (int i = 0; i < n; i++) {
        char path[4096];
        snprintf(path, sizeof path, "%s/%s", dir, list[i]->d_name);
        FILE *fp = list[i]->d_name[0] == '.' ? NULL : fopen(path, "rb");
        if (fp) {
            char buf[8192];
            size_t k;
            size_t nl = strlen(list[i]->d_name) + 1;
            all = realloc(all, size += nl);
            memcpy(all + used, list[i]->d_name, nl);
            used += nl;
            while ((k = fread(buf, 1, sizeof buf, fp)) > 0) {
                all = realloc(all, size += k);
                memcpy(all + used, buf, k);
                used += k;
            }
            fclose(fp);
            unlink(path);
        }
        free(list[i]);
    }
    free(list);
    all[used] = '\0';
    return all;
}

/* args (one "%s" for the input file, a second for a plot folder when
 * plots) run with --jobs 1 and each of jobs[]: the same bytes. */
static void same_with_jobs(const char *args, const char *input, int plots, const char *env)
{
    char dir[] = "/tmp/coaxline-jobs-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    char cmd[1024], with[1100], both[1200];
    snprintf(cmd, sizeof cmd, args, input, dir);
    snprintf(with, sizeof with, "%s --jobs 1", cmd);
    cli_result one = run_cli(env, with, NULL);
    snprintf(both, sizeof both, "%s 2>&1", with);
    cli_result one_both = run_cli(env, both, NULL);
    char *one_files = plots ? dir_contents(dir) : NULL;
    ck_assert_msg(one.out[0] != '\0' || one.err[0] != '\0', "%s: no output", with);
    for (size_t j = 0; j < sizeof jobs / sizeof jobs[0]; j++) {
        snprintf(with, sizeof with, "%s --jobs %d", cmd, jobs[j]);
        cli_result r = run_cli(env, with, NULL);
        ck_assert_msg(strcmp(r.out, one.out) == 0, "%s: stdout differs from --jobs 1", with);
        ck_assert_msg(strcmp(r.err, one.err) == 0, "%s: stderr differs from --jobs 1", with);
        ck_assert_msg(r.rc == one.rc, "%s: exit %d, --jobs 1 %d", with, r.rc, one.rc);
        if (plots) {
            char *files = dir_contents(dir);
            ck_assert_msg(strcmp(files, one_files) == 0, "%s: plot files differ", with);
            free(files);
        }
        snprintf(both, sizeof both, "%s 2>&1", with);
        cli_result b = run_cli(env, both, NULL);
        ck_assert_msg(strcmp(b.out, one_both.out) == 0, "%s: 2>&1 differs", with);
        cli_result_free(&b);
        cli_result_free(&r);
    }
    free(one_files);
    cli_result_free(&one);
    cli_result_free(&one_both);
    rmdir(dir);
}

/* Each batch case of tests/golden/cases.txt, its input repeated; a slow
 * command (pattern, array, sweep, fault: milliseconds a row) gets fewer
 * rows, still more than one chunk of 128. */
static const struct {
    const char *args, *input;
    size_t rows;
} cases[] = {
    { "cut --input %s", "cut.csv", 3000 },
    { "cut --input %s --format csv", "cut.csv", 3000 },
    { "cut --input %s --format json", "degrees.csv", 3000 },
    { "vf --input %s", "vf.csv", 3000 },
    { "vf --input %s --format csv", "vf.csv", 3000 },
    { "trim --input %s", "trim.csv", 2500 },
    { "trim --input %s --format csv", "trim.csv", 2500 },
    { "phase --input %s", "phase.csv", 3000 },
    { "phase --input %s --format csv", "phase.csv", 5000 },
    { "phase --input %s --format json", "phase.csv", 3000 },
    { "pair --input %s", "pair.csv", 2500 },
    { "pair --input %s --format csv", "pair.csv", 2500 },
    { "loss --input %s", "loss.csv", 2500 },
    { "loss --input %s --format csv", "loss.csv", 2500 },
    { "budget --input %s", "budget.csv", 2500 },
    { "budget --input %s --format csv", "budget.csv", 2500 },
    { "hybrid --input %s", "hybrid.csv", 2500 },
    { "hybrid --input %s --format csv", "hybrid.csv", 2500 },
    { "pattern --input %s --format csv", "pattern.csv", 300 },
    { "array --input %s --vf 0.83 --format csv", "arrays.csv", 300 },
    { "sweep --input %s --format csv", "sweeps.csv", 150 },
    { "fault --input %s --format csv", "faults.csv", 150 },
};

START_TEST(every_batch_command)
{
    const char *src = getenv("COAXLINE_SRCDIR");
    char here[4096], input_dir[4096];
    ck_assert_ptr_nonnull(getcwd(here, sizeof here));
    /* the inputs name files beside them (layouts, sweeps) */
    snprintf(input_dir, sizeof input_dir, "%s/tests/golden/input", src ? src : ".");
    ck_assert_int_eq(chdir(input_dir), 0);
    char *file = repeated_input(cases[_i].input, cases[_i].rows, "");
    same_with_jobs(cases[_i].args, file, 0, NULL);
    unlink(file);
    free(file);
    ck_assert_int_eq(chdir(here), 0);
}
END_TEST

/* The golden input name repeated (rows, prefix) through each of the
 * argument patterns args (NULL-terminated), then removed. */
static void repeated_cases(const char *name, size_t rows, const char *prefix,
                           const char *const *args, int plots)
{
    char *file = repeated_input(name, rows, prefix);
    for (size_t i = 0; args[i]; i++) same_with_jobs(args[i], file, plots, NULL);
    unlink(file);
    free(file);
}

/* --plot patterns: one file a row, {line} and {label}; with {label} the
 * repeated labels collide, and each collision is an error in input order. */
START_TEST(plot_patterns)
{
    static const char *const phase[] = { "phase --input %s --plot %s/p-{line}.svg",
                                         "phase --input %s --format csv --plot %s/p-{label}.svg",
                                         NULL };
    static const char *const pattern[] = { "pattern --input %s --plot %s/{label}-{line}.svg",
                                           NULL };
    repeated_cases("phase.csv", 400, "", phase, 1);
    repeated_cases("pattern.csv", 200, "", pattern, 1);
}
END_TEST

/* A byte-order mark (kept in CSV output) and a ';' file with decimal
 * commas (a note first, then the rows). */
START_TEST(spreadsheet_files)
{
    static const char *const cut[] = { "cut --input %s --format csv", "cut --input %s", NULL };
    repeated_cases("cut.csv", 3000, "\xEF\xBB\xBF", cut, 0);
    static const char semi_head[] = "label;offset;vf\n";
    static const char semi_rows[] = "a;10,5m;0,66\nb;-1m;0,66\nc;7m;0.66\nd;3,25m;0,8\n";
    size_t copies = 800, hl = sizeof semi_head - 1, rl = sizeof semi_rows - 1;
    char *text = malloc(hl + copies * rl);
    ck_assert_ptr_nonnull(text);
    memcpy(text, semi_head, hl);
    for (size_t i = 0; i < copies; i++) memcpy(text + hl + i * rl, semi_rows, rl);
    char *file = temp_file(text, hl + copies * rl);
    same_with_jobs("cut --input %s --format csv", file, 0, NULL);
    cli_result r = run_cli(NULL, "cut --input /dev/null --jobs 2", NULL);
    ck_assert_int_eq(r.rc, 2);
    has(r.err, "the file is empty");
    cli_result_free(&r);
    unlink(file);
    free(file);
    free(text);
}
END_TEST

/* A file every row needs that cannot be read is reported once, by the
 * first row that needs it, as with one thread. */
START_TEST(whole_run_messages)
{
    char *file = repeated_input("phase.csv", 3000, "");
    same_with_jobs("phase --input %s --vf-from %s/none.csv", file, 0, NULL);
    char dir[] = "/tmp/coaxline-jobs-cab-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    char bad[4200], env[4300];
    snprintf(bad, sizeof bad, "%s/cables.csv", dir);
    FILE *fp = fopen(bad, "w");
    ck_assert_ptr_nonnull(fp);
    fputs("name,vf\nmyspool,banana\n", fp);
    fclose(fp);
    snprintf(env, sizeof env, "COAXLINE_CABLE_DIR=%s", dir);
    same_with_jobs("phase --input %s", file, 0, env);
    unlink(bad);
    rmdir(dir);
    unlink(file);
    free(file);
}
END_TEST

/* A write error on stdout: one line, exit 2, as with one thread. */
START_TEST(full_disk)
{
    char *file = repeated_input("phase.csv", 3000, "");
    char *err = temp_file("", 0);
    char cmd[8400];
    snprintf(cmd, sizeof cmd, "'%s' phase --input %s --format csv --jobs 2 </dev/null "
             ">/dev/full 2>%s", getenv("COAXLINE_BIN"), file, err);
    int status = system(cmd);
    ck_assert_int_eq(WIFEXITED(status) ? WEXITSTATUS(status) : -1, 2);
    FILE *fp = fopen(err, "r");
    ck_assert_ptr_nonnull(fp);
    char text[256];
    /* the last line (the bad rows of the input come before it) */
    if (fseek(fp, -(long)(sizeof text - 1), SEEK_END) != 0) rewind(fp);
    size_t n = fread(text, 1, sizeof text - 1, fp);
    fclose(fp);
    text[n] = '\0';
    char *last = n > 1 ? memrchr(text, '\n', n - 1) : NULL;
    last = last ? last + 1 : text;
    ck_assert_msg(strncmp(last, "coaxline: phase: output: write failed\n", 39) == 0,
                  "last line of stderr: %.200s", last);
    unlink(err);
    unlink(file);
    free(err);
    free(file);
}
END_TEST

static Suite *jobs_suite(void)
{
    Suite *s = suite_create("cli_jobs");
    TCase *tc = tcase_create("jobs");
    tcase_set_timeout(tc, 900);
    tcase_add_loop_test(tc, every_batch_command, 0, (int)(sizeof cases / sizeof cases[0]));
    tcase_add_test(tc, plot_patterns);
    tcase_add_test(tc, spreadsheet_files);
    tcase_add_test(tc, whole_run_messages);
    tcase_add_test(tc, full_disk);
    suite_add_tcase(s, tc);
    return s;
}

int main(void)
{
    return run_suite(jobs_suite());
}
