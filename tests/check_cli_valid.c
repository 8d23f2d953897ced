/* check_cli_valid.c - output is valid for what reads it: text output shows
 * a label's control bytes escaped (no terminal escape or forged line gets
 * through), JSON is strict UTF-8 (RFC 8259 sec. 8.1; RFC 3629 for what
 * well-formed UTF-8 is), SVG is well-formed XML (XML 1.0, sec. 2.2, Char),
 * checked by Python's own decoders and parsers. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include "testutil.h"

/* ESC [31m (a colour), CR, LF, a C1 CSI (U+009B) and a stray byte */
#define NASTY "\"$(printf 'a\\033[31mRED\\rb\\nc\\302\\233d\\377e')\""

START_TEST(text_label_escaped)
{
    const char *cmds[] = {
        "cut --offset 10m --vf 0.66 --label " NASTY,
        "phase --reference 10m --length 10.1m --vf 0.66 --band 160m --label " NASTY,
        "loss --cable RG-58 --length 30m --freq 1.83MHz --label " NASTY,
    };
    for (size_t i = 0; i < sizeof cmds / sizeof cmds[0]; i++) {
        cli_result r = run_cli(NULL, cmds[i], NULL);
        ck_assert_msg(r.rc == 0, "%s: exit %d: %s", cmds[i], r.rc, r.err);
        /* the label's line as written, escapes spelled out */
        has(r.out, ": a\\e[31mRED\\rb\\nc\\u009bd\\xffe\n");
        ck_assert_msg(strchr(r.out, '\033') == NULL && strchr(r.out, '\r') == NULL,
                      "%s: a raw ESC or CR reached the terminal", cmds[i]);
        lacks(r.out, "\302\233");
        lacks(r.out, "\nc");
        cli_result_free(&r);
    }
}
END_TEST

START_TEST(json_strict_utf8)
{
    /* a surrogate (ED A0 80), overlong forms (C0 AF, E0 80 AF, F0 80 80 AF),
     * above U+10FFFF (F4 90 80 80), a stray continuation byte (80) and FF:
     * none is UTF-8 (RFC 3629, sec. 3 and 4); then e-acute and U+1F600,
     * which are */
    static const char label[] =
        "$(printf 'x\\355\\240\\200\\300\\257\\340\\200\\257\\360\\200\\200\\257"
        "\\364\\220\\200\\200\\200\\377|\\303\\251\\360\\237\\230\\200')";
    char args[512];
    snprintf(args, sizeof args, "cut --offset 10m --vf 0.66 --format json --label %s", label);
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_int_eq(r.rc, 0);
    char *path = temp_file(r.out, strlen(r.out));
    /* strict decoding: any ill-formed sequence raises */
    python_holds("import sys,json; b=open(sys.argv[1],\"rb\").read(); "
                 "d=json.loads(b.decode(\"utf-8\",\"strict\")); l=d[0][\"label\"]; "
                 "assert l.startswith(\"x\\ufffd\") and l.endswith(\"|\\u00e9\\U0001f600\"), ascii(l); "
                 "assert all(not 0xd800 <= ord(c) <= 0xdfff for c in l)",
                 path);
    unlink(path);
    free(path);
    cli_result_free(&r);
}
END_TEST

/* JSON numbers never "-0": a value of zero is written 0 whatever its
 * sign bit (RFC 8259 allows -0, but readers differ on it). */
START_TEST(json_no_negative_zero)
{
    const char *cmds[] = {
        "phase --reference 10m --length 10m --vf 0.66 --band 160m --format json",
        "pair --length 10m,10m --vf 0.66 --tolerance 5 --band 160m,80m --format json",
        "pattern --band 160m --stagger 20m --feed crossfire --format json",
        "budget --null-depth -25 --stagger 5m --feed crossfire --band 160m --format json",
        "hybrid --impedance 75 --format json",
        "cut --offset 10m --vf 0.66 --freq 1.83MHz --format json",
    };
    for (size_t i = 0; i < sizeof cmds / sizeof cmds[0]; i++) {
        cli_result r = run_cli(NULL, cmds[i], NULL);
        ck_assert_msg(r.rc <= 1, "%s: exit %d: %s", cmds[i], r.rc, r.err);
        json_holds(r.out, "all(not (isinstance(v,float) and v==0 and math.copysign(1,v)<0) "
                          "for row in d for v in row.values())");
        cli_result_free(&r);
    }
}
END_TEST

START_TEST(svg_forbidden_chars)
{
    /* U+FFFE (EF BF BE), U+FFFF (EF BF BF), a surrogate and controls are
     * not XML characters (XML 1.0, sec. 2.2) */
    char dir[] = "/tmp/coaxline-valid-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    char args[768], svg[64];
    snprintf(svg, sizeof svg, "%s/p.svg", dir);
    snprintf(args, sizeof args,
             "phase --reference 10m --length 10.1m --vf 0.66 --band 160m --plot %s --format csv "
             "--label \"$(printf 'y\\357\\277\\276\\357\\277\\277\\355\\240\\200\\001\\033z')\"",
             svg);
    cli_result r = run_cli(NULL, args, NULL);
    ck_assert_msg(r.rc == 0, "exit %d: %s", r.rc, r.err);
    svg_holds(svg, "assert any(x.startswith(\"y\\ufffd\\ufffd\") and \"z\" in x for x in texts), texts");
    cli_result_free(&r);
    unlink(svg);
    rmdir(dir);
}
END_TEST

/* A batch with --plot writes one file per row, named by the pattern; a
 * second row of the same label is refused rather than overwrite the
 * first's file (self-consistency with coaxline(1), no outside source). */
START_TEST(batch_plot_per_row)
{
    char dir[] = "/tmp/coaxline-plots-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    char args[512], path[128];
    snprintf(args, sizeof args,
             "phase --input - --vf 0.66 --band 160m --format csv --plot '%s/{label}-{line}.svg'",
             dir);
    cli_result r = run_cli(NULL, args, "label,reference,length\nn/1,10m,10.1m\nn2,10m,10.2m\n");
    ck_assert_msg(r.rc == 0, "exit %d: %s", r.rc, r.err);
    cli_result_free(&r);
    /* '/' in a label cannot reach another folder */
    snprintf(path, sizeof path, "%s/n_1-2.svg", dir);
    svg_holds(path, "assert any(\"n/1\" in x for x in texts), texts");
    unlink(path);
    snprintf(path, sizeof path, "%s/n2-3.svg", dir);
    svg_holds(path, "assert any(\"n2\" in x for x in texts), texts");
    unlink(path);
    snprintf(args, sizeof args,
             "phase --input - --vf 0.66 --band 160m --format csv --plot '%s/{label}.svg'", dir);
    r = run_cli(NULL, args, "label,reference,length\na,10m,10.1m\na,10m,10.2m\n");
    ck_assert_int_eq(r.rc, 2);
    has(r.err, "line 3: plot: '");
    has(r.err, "/a.svg' was written for line 2 already");
    ck_assert_int_eq(count_lines(r.err), 1);
    cli_result_free(&r);
    snprintf(path, sizeof path, "%s/a.svg", dir);
    ck_assert_int_eq(unlink(path), 0);
    ck_assert_int_eq(rmdir(dir), 0); /* nothing else was written */
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_valid");
    TCase *tc = tcase_create("valid");
    tcase_set_timeout(tc, 120);
    tcase_add_test(tc, text_label_escaped);
    tcase_add_test(tc, json_strict_utf8);
    tcase_add_test(tc, json_no_negative_zero);
    tcase_add_test(tc, svg_forbidden_chars);
    tcase_add_test(tc, batch_plot_per_row);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
