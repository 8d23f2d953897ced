/* check_cli_output.c - CSV rows as cli_table_row assembles them: plain
 * cells copied into one buffer per row, everything else through the
 * library's RFC 4180 writer.  Labels of every kind, short and long (past
 * the row buffer), must come out as the writer would write them. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "testutil.h"

/* cut --offset 10m --vf 0.8 without --freq, hand worked as in
 * tests/check_cli.c: delay 10 m / c = 33.356 ns, cut 8.000 m = 26.2467 ft,
 * quarter wave 0.8 c / (4 * 8 m) = 7.4948 MHz (Pozar, Microwave
 * Engineering, 4th ed., sec. 2.3: open stub resonance at a quarter wave) */
#define ROW_TAIL ",10.000,33.356,0.8000,8.000,26.2467,,,7.4948,0.000\n"

static char *run_labels(const char *const *labels, size_t n, int *rc)
{
    size_t cap = 16384, used = 0;
    char *csv = malloc(cap);
    ck_assert_ptr_nonnull(csv);
    used += (size_t)snprintf(csv, cap, "label,offset,vf\n");
    for (size_t i = 0; i < n; i++)
        used += (size_t)snprintf(csv + used, cap - used, "%s,10m,0.8\n", labels[i]);
    ck_assert_uint_lt(used, cap);
    cli_result r = run_cli_with_file("cut --input %s --format csv", csv, used);
    *rc = r.rc;
    ck_assert_str_eq(r.err, "");
    free(csv);
    free(r.err);
    return r.out;
}

static void expect_row(const char *out, const char *label_out)
{
    size_t len = strlen(label_out) + sizeof ROW_TAIL + 1;
    char *want = malloc(len);
    ck_assert_ptr_nonnull(want);
    snprintf(want, len, "\n%s" ROW_TAIL, label_out);
    ck_assert_msg(strstr(out, want) != NULL, "row for label '%.40s...' not found", label_out);
    free(want);
}

START_TEST(labels_as_rfc4180)
{
    char long_label[1501], mid_label[71];
    memset(long_label, 'k', sizeof long_label - 1);
    long_label[sizeof long_label - 1] = '\0';
    memset(mid_label, 'm', sizeof mid_label - 1);
    mid_label[sizeof mid_label - 1] = '\0';
    /* input cells (CSV-quoted where they hold a comma or a quote) */
    const char *labels[] = { "plain", mid_label, long_label, "\"x,y\"", "\"say \"\"hi\"\"\"",
                             "-x", "@sum", "+1", "\"\"", "p1" };
    int rc;
    char *out = run_labels(labels, sizeof labels / sizeof labels[0], &rc);
    ck_assert_int_eq(rc, 0);
    ck_assert_int_eq(count_lines(out), 11); /* header + 10 rows */
    expect_row(out, "plain");
    expect_row(out, mid_label);  /* longer than one number cell */
    expect_row(out, long_label); /* longer than the row buffer */
    /* RFC 4180 sec. 2, rules 6 and 7: a comma or a quote makes a quoted
     * field, a quote inside is doubled */
    expect_row(out, "\"x,y\"");
    expect_row(out, "\"say \"\"hi\"\"\"");
    /* a text cell that starts like a formula gets a leading apostrophe,
     * a plain number does not (DESIGN.md, output contract; common
     * practice against CSV formula injection, no source) */
    expect_row(out, "'-x");
    expect_row(out, "'@sum");
    expect_row(out, "+1");
    has(out, "\n" ROW_TAIL); /* empty label: the row starts with a comma */
    ck_assert_str_eq(out + strlen(out) - strlen("p1" ROW_TAIL), "p1" ROW_TAIL);
    free(out);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_output");
    TCase *tc = tcase_create("csv");
    tcase_set_timeout(tc, 60);
    tcase_add_test(tc, labels_as_rfc4180);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
