/* check_cli_io.c - every byte honest: no row invented or lost when a batch
 * record is refused, read errors and endless files stop with an error,
 * output that cannot be written is an error, and CSV as spreadsheets save
 * it (';' with decimal commas, tabs, byte-order mark, trailing empty
 * columns, output column names) is read as meant.  Where Gnumeric's
 * ssconvert is installed, the CSV of every command is opened in it. */
#include <config.h>
#include <check.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <sys/wait.h>
#include "testutil.h"

/* cut rows hand worked as in tests/check_cli.c: cut length = offset * VF,
 * delay = offset / c, quarter wave = VF c / (4 L) (Pozar, Microwave
 * Engineering, 4th ed., sec. 2.3: an open stub's first series resonance
 * is at a quarter wave). */
#define ROW_A ",10.000,33.356,0.6600,6.600,21.6535,,,7.4948,0.000\n"    /* 10 m, VF 0.66 */
#define ROW_REAL ",7.000,23.349,0.6600,4.620,15.1575,,,10.7069,0.000\n" /* 7 m */

static int stderr_lines(const cli_result *r)
{
    return count_lines(r->err);
}

/* A rejected multi-line quoted cell (over 64 KiB, or with a NUL) is
 * skipped to the end of its record: the line of its text that looks like
 * a row (ghost) is never computed, and the real row after it is. */
START_TEST(rejected_cell_invents_no_row)
{
    size_t big = 70000;
    static const char head[] = "label,offset,vf\na,10m,0.66\n\"";
    static const char tail[] = "\nghost,5m,0.66\n\",10m,0.66\nreal,7m,0.66\n";
    char *text = malloc(big + sizeof head + sizeof tail);
    ck_assert_ptr_nonnull(text);
    size_t n = sizeof head - 1;
    memcpy(text, head, n);
    memset(text + n, 'y', big);
    n += big;
    memcpy(text + n, tail, sizeof tail - 1);
    n += sizeof tail - 1;
    cli_result r = run_cli_with_file("cut --input %s --format csv", text, n);
    ck_assert_int_eq(r.rc, 2);
    has(r.out, "\na" ROW_A);
    has(r.out, "\nreal" ROW_REAL);
    lacks(r.out, "ghost");
    ck_assert_int_eq(count_lines(r.out), 3);
    ck_assert_int_eq(stderr_lines(&r), 1);
    has(r.err, " line 3: row: the row is too long");
    cli_result_free(&r);
    free(text);

    static const char nul[] = "label,offset,vf\na,10m,0.66\n\"x\0y\nghost,5m,0.66\n\",10m,0.66\n"
                              "real,7m,0.66\n";
    r = run_cli_with_file("cut --input %s --format csv", nul, sizeof nul - 1);
    ck_assert_int_eq(r.rc, 2);
    has(r.out, "\na" ROW_A);
    has(r.out, "\nreal" ROW_REAL);
    lacks(r.out, "ghost");
    ck_assert_int_eq(stderr_lines(&r), 1);
    has(r.err, " line 3: row: malformed CSV");
    cli_result_free(&r);
}
END_TEST

/* Every reader: a directory is named as one, an endless file with no line
 * end (/dev/zero) stops at once with an error, both exit 2. */
START_TEST(unreadable_inputs)
{
    static const char *const readers[] = {
        "cut --offset 1m --vf 0.66 --input %s",
        "cut --offset 1m --cable RG-58 --cables %s",
        "cut --offset 1m --cable RG-58 --cable-loss %s",
        "phase --length 1m --reference 2m --band 160m --vf-from %s",
    };
    static const char *const fields[] = { "input", "cables", "cable-loss", "vf-from" };
    char dir[] = "/tmp/coaxline-io-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    for (size_t i = 0; i < sizeof readers / sizeof readers[0]; i++) {
        char args[256], also[300];
        snprintf(args, sizeof args, readers[i], dir);
        snprintf(also, sizeof also, "'%s' is a directory", dir);
        expect_usage_error(NULL, args, fields[i], also);
        snprintf(args, sizeof args, readers[i], "/dev/zero");
        expect_usage_error(NULL, args, fields[i], "no line end");
    }
    rmdir(dir);
    /* a read error: Linux gives EIO for a read of /proc/self/mem at offset 0
     * (proc(5), /proc/pid/mem: unmapped addresses) */
    static const char *const eio[] = {
        "cut --offset 1m --vf 0.66 --input /proc/self/mem",
        "cut --offset 1m --cable RG-58 --cables /proc/self/mem",
        "cut --offset 1m --cable RG-58 --cable-loss /proc/self/mem",
        "phase --length 1m --reference 2m --band 160m --vf-from /proc/self/mem",
    };
    for (size_t i = 0; i < sizeof eio / sizeof eio[0]; i++)
        expect_usage_error(NULL, eio[i], fields[i], "read error");
}
END_TEST

/* "coaxline ARGS" with standard output on /dev/full (run_cli sends it to a
 * file of its own). */
static cli_result run_to_full(const char *args)
{
    const char *bin = getenv("COAXLINE_BIN");
    ck_assert_ptr_nonnull(bin);
    char *err = temp_file("", 0);
    char cmd[1024];
    snprintf(cmd, sizeof cmd, "'%s' %s </dev/null >/dev/full 2>%s", bin, args, err);
    int status = system(cmd);
    cli_result r = { WIFEXITED(status) ? WEXITSTATUS(status) : -1, strdup(""), NULL };
    FILE *fp = fopen(err, "rb");
    ck_assert_ptr_nonnull(fp);
    char buf[4096];
    size_t n = fread(buf, 1, sizeof buf - 1, fp);
    buf[n] = '\0';
    fclose(fp);
    r.err = strdup(buf);
    unlink(err);
    free(err);
    return r;
}

/* A full disk is an error for every output: tables, text, help, version,
 * plots (exit 2, one line on stderr). */
START_TEST(full_disk_is_an_error)
{
    static const char *const cases[] = {
        "--help",
        "--version",
        "cut --help",
        "cut --offset 10m --vf 0.66",
        "cut --offset 10m --vf 0.66 --format csv",
        "cut --offset 10m --vf 0.66 --format json",
        "bands --band 160m",
        "pattern --stagger 20m --feed crossfire --vf 0.83 --band 160m --plot /dev/full",
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        cli_result r = run_to_full(cases[i]);
        ck_assert_msg(r.rc == 2, "%s: exit %d", cases[i], r.rc);
        ck_assert_msg(count_lines(r.err) == 1 && strncmp(r.err, "coaxline: ", 10) == 0,
                      "%s: stderr '%s'", cases[i], r.err);
        ck_assert_msg(strstr(r.err, "fail") != NULL, "%s: stderr '%s'", cases[i], r.err);
        cli_result_free(&r);
    }
}
END_TEST

/* The same rows saved by a spreadsheet under a comma-decimal locale (';'
 * separators, decimal commas, BOM, CRLF, empty trailing columns, a row of
 * separators) and as tab-separated text give the same output as the plain
 * file, with a note on stderr. */
START_TEST(spreadsheet_files)
{
    static const char plain[] = "label,offset,vf\nwest,12.5m,0.66\neast,7m,0.7\n";
    cli_result want = run_cli_with_file("cut --input %s --format csv", plain, sizeof plain - 1);
    ck_assert_int_eq(want.rc, 0);
    ck_assert_str_eq(want.err, "");

    static const char semi[] = "label;offset;vf;;\r\nwest;12,5m;0,66;;\r\n;;;;\r\n"
                               "east;7m;0,7;;\r\n";
    cli_result r = run_cli_with_file("cut --input %s --format csv", semi, sizeof semi - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out, want.out);
    ck_assert_int_eq(stderr_lines(&r), 1);
    has(r.err, "note: ");
    has(r.err, "';'-separated with decimal commas");
    cli_result_free(&r);

    static const char tab[] = "label\toffset\tvf\t\nwest\t12.5m\t0.66\t\n\t\t\t\neast\t7m\t.7\t\n";
    r = run_cli_with_file("cut --input %s --format csv", tab, sizeof tab - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out, want.out);
    has(r.err, "tab-separated");
    cli_result_free(&r);

    /* a '.' in a comma-decimal file would be a thousands separator there */
    static const char dot[] = "label;offset;vf\nw;1.500m;0,66\n";
    r = run_cli_with_file("cut --input %s", dot, sizeof dot - 1);
    ck_assert_int_eq(r.rc, 2);
    ck_assert_str_eq(r.out, "");
    ck_assert_int_eq(stderr_lines(&r), 2); /* the note and the error */
    has(r.err, "line 2: offset: '1.500m' has a '.'");
    cli_result_free(&r);
    /* a row with more cells than the header is still an error unless the
     * extra cells are empty */
    static const char extra[] = "label,offset,vf\nw,1m,0.66,x\n";
    bad_with_file("cut --input %s", extra, sizeof extra - 1, "row", "has 4 fields");
    cli_result_free(&want);
}
END_TEST

/* Output column names as headers: '_' for '-', unit endings that bare
 * numbers take, cut_length_* as a line's length. */
START_TEST(output_names_as_headers)
{
    cli_result want = run_cli(NULL, "cut --label w --offset 10m --vf 0.66 --allowance 0.1m "
                                    "--allowance-vf 0.8 --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(want.rc, 0);
    static const char named[] = "label,offset_m,vf,allowance_m,allowance_vf,freq_mhz\n"
                                "w,10,0.66,0.1,0.8,1.83\n";
    cli_result r = run_cli_with_file("cut --input %s --format csv", named, sizeof named - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.err, "");
    ck_assert_str_eq(r.out, want.out);
    cli_result_free(&r);
    cli_result_free(&want);
    /* feet and kHz endings; a cell with its own unit keeps it */
    want = run_cli(NULL, "cut --label w --offset 40ft --vf 0.66 --allowance 0.1m "
                         "--allowance-vf 0.8 --freq 1.83MHz --format csv", NULL);
    ck_assert_int_eq(want.rc, 0);
    static const char feet[] = "label,offset_ft,vf,allowance_m,allowance-vf,freq_khz\n"
                               "w,40,0.66,10cm,0.8,1830\n";
    r = run_cli_with_file("cut --input %s --format csv", feet, sizeof feet - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out, want.out);
    cli_result_free(&r);
    cli_result_free(&want);
    /* cut's output column cut_length_m is a line's length for phase */
    want = run_cli(NULL, "phase --length 6.6m --reference 6.5m --vf 0.66 --band 160m "
                         "--format csv", NULL);
    ck_assert_int_eq(want.rc, 0);
    r = run_cli_with_file("phase --input %s --reference 6.5m --band 160m --format csv",
                          "cut_length_m,vf\n6.6,0.66\n", 24);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_str_eq(r.out, want.out);
    cli_result_free(&r);
    cli_result_free(&want);
    /* a unit ending on an option of another kind is not a match */
    bad_with_file("cut --input %s", "label,vf_m\nw,0.66\n", 18, "input", "unknown column 'vf_m'");
}
END_TEST

/* Labels a ';'-separating spreadsheet would split into a formula, or with
 * blanks before one, come out quoted and neutralised. */
START_TEST(formula_cells)
{
    static const char in[] = "label,offset,vf\n\"x;=1+2\",10m,0.66\n\"  =1+2\",10m,0.66\n"
                             "\"y\t@SUM(A1)\",10m,0.66\n";
    cli_result r = run_cli_with_file("cut --input %s --format csv", in, sizeof in - 1);
    ck_assert_int_eq(r.rc, 0);
    has(r.out, "\n\"'x;=1+2\"" ROW_A);
    has(r.out, "\n'  =1+2" ROW_A);
    has(r.out, "\n\"'y\t@SUM(A1)\"" ROW_A);
    cli_result_free(&r);
}
END_TEST

/* A byte-order mark survives: vf reads a file with one and writes its CSV
 * with one; phase reads that back through --vf-from. */
START_TEST(bom_round_trip)
{
    static const char in[] = "\xEF\xBB\xBFlabel,length,end,resonance\r\nspool,10m,open,4.9MHz\r\n";
    cli_result r = run_cli_with_file("vf --input %s --format csv", in, sizeof in - 1);
    ck_assert_int_eq(r.rc, 0);
    ck_assert_msg(strncmp(r.out, "\xEF\xBB\xBFlabel,", 9) == 0, "no BOM: %.20s", r.out);
    /* VF of an open quarter-wave stub: 4 L f / c = 4 * 10 * 4.9e6 /
     * 299792458 = 0.6538 (DESIGN.md, length constants; common practice) */
    has(r.out, ",0.6538,");
    cli_result back = run_cli_with_file("phase --vf-from %s --length 10m --reference 9.9m "
                                        "--band 160m --format csv", r.out, strlen(r.out));
    ck_assert_int_eq(back.rc, 0);
    ck_assert_str_eq(back.err, "");
    has(back.out, ",0.6538");
    cli_result_free(&back);
    cli_result_free(&r);
    /* without a BOM in, none out */
    r = run_cli(NULL, "vf --length 10m --end open --resonance 4.9MHz --format csv", NULL);
    ck_assert(strncmp(r.out, "label,", 6) == 0);
    cli_result_free(&r);
}
END_TEST

/* Gnumeric's ssconvert (an independent spreadsheet engine, Debian package
 * gnumeric) opens the CSV of every command: numbers stay numbers, labels
 * stay text, neutralised cells stay text and are never formulas. */
START_TEST(spreadsheet_engine_opens_every_command)
{
    if (system("command -v ssconvert >/dev/null 2>&1") != 0) {
        fprintf(stderr, "note: ssconvert (Debian package gnumeric) is not installed; "
                        "the spreadsheet-engine check is skipped\n");
        return;
    }
    static const char *const runs[] = {
        "cut --label '=1+2' --offset 10m --vf 0.66 --freq 1.83MHz",
        "cut --label 'x;=1+2' --offset 10m --vf 0.66",
        "vf --label '  @SUM(A1)' --length 10m --end open --resonance 4.9MHz,14.7MHz",
        "trim --label '-cmd' --length 30m --resonance 1.645MHz --degrees 90 --freq 1.83MHz",
        "phase --label '+x' --length 20m --reference 20.2m --vf 0.66 --band 160m",
        "pair --label '=A1' --length 20m --length 20.3m --vf 0.66 --tolerance 5 --band 160m",
        "bands --band 160m,80m",
        "cables",
        "loss --label '@x' --cable RG-213 --length 100m --band 160m --swr 1.5",
        "pattern --label '=x' --stagger 20m --feed crossfire --vf 0.83 --band 160m",
        "budget --label '=y' --null-depth -25 --stagger 5m --feed crossfire --vf 0.83 --band 160m",
        "hybrid --label '=z' --impedance 75",
    };
    char dir[] = "/tmp/coaxline-ss-XXXXXX";
    ck_assert_ptr_nonnull(mkdtemp(dir));
    for (size_t i = 0; i < sizeof runs / sizeof runs[0]; i++) {
        char args[512];
        snprintf(args, sizeof args, "%s --format csv", runs[i]);
        cli_result r = run_cli(NULL, args, NULL);
        ck_assert_msg(r.rc <= 1, "%s: exit %d: %s", runs[i], r.rc, r.err);
        char path[128];
        snprintf(path, sizeof path, "%s/out.csv", dir);
        FILE *fp = fopen(path, "wb");
        ck_assert_ptr_nonnull(fp);
        ck_assert_uint_eq(fwrite(r.out, 1, strlen(r.out), fp), strlen(r.out));
        ck_assert_int_eq(fclose(fp), 0);
        cli_result_free(&r);
        char cmd[600];
        snprintf(cmd, sizeof cmd, "ssconvert %s/out.csv %s/out.ods >/dev/null 2>&1", dir, dir);
        ck_assert_msg(system(cmd) == 0, "%s: ssconvert failed", runs[i]);
        /* The ODS file's cell types (OpenDocument 1.2, part 1, 19.385
         * office:value-type) against the CSV as Python's csv module reads
         * it: a cell that is a plain number there must be a float, any
         * other non-empty cell a string, and no cell a formula. */
        char code[3072];
        snprintf(code, sizeof code,
                 "import csv, zipfile, re, sys\n"
                 "import xml.etree.ElementTree as ET\n"
                 "d = sys.argv[1]\n"
                 "rows = list(csv.reader(open(d + \"/out.csv\", newline=\"\", encoding=\"utf-8-sig\")))\n"
                 "T = \"{urn:oasis:names:tc:opendocument:xmlns:table:1.0}\"\n"
                 "O = \"{urn:oasis:names:tc:opendocument:xmlns:office:1.0}\"\n"
                 "X = \"{urn:oasis:names:tc:opendocument:xmlns:text:1.0}\"\n"
                 "root = ET.fromstring(zipfile.ZipFile(d + \"/out.ods\").read(\"content.xml\"))\n"
                 "def words(p):\n"
                 "    out = p.text or \"\"\n"
                 "    for e in p:\n"
                 "        if e.tag == X + \"s\":\n"
                 "            out += \" \" * int(e.get(X + \"c\", \"1\"))\n"
                 "        else:\n"
                 "            out += \"\".join(e.itertext())\n"
                 "        out += e.tail or \"\"\n"
                 "    return out\n"
                 "got = []\n"
                 "for row in root.iter(T + \"table-row\"):\n"
                 "    cells = []\n"
                 "    for c in row.iter(T + \"table-cell\"):\n"
                 "        n = int(c.get(T + \"number-columns-repeated\", \"1\"))\n"
                 "        assert c.get(T + \"formula\") is None, c.attrib\n"
                 "        text = \"\".join(words(p) for p in c.iter(X + \"p\"))\n"
                 "        cells += [(c.get(O + \"value-type\"), text)] * min(n, 64)\n"
                 "    got.append(cells)\n"
                 "num = re.compile(r\"^-?[0-9]+(\\.[0-9]+)?$\")\n"
                 "assert len(rows) >= 2, rows\n"
                 "for r, row in enumerate(rows):\n"
                 "    for k, cell in enumerate(row):\n"
                 "        t, text = got[r][k]\n"
                 "        if cell == \"\":\n"
                 "            assert t is None, (r, k, t)\n"
                 "        elif num.match(cell) and r > 0:\n"
                 "            assert t == \"float\", (r, k, cell, t)\n"
                 "        else:\n"
                 "            assert t == \"string\", (r, k, cell, t)\n"
                 "            assert text == cell or chr(39) + text == cell, (r, k, cell, text)\n");
        python_holds(code, dir);
    }
    char cmd[600];
    snprintf(cmd, sizeof cmd, "rm -rf %s", dir);
    ck_assert_int_eq(system(cmd), 0);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("cli_io");
    TCase *tc = tcase_create("io");
    tcase_set_timeout(tc, 120);
    tcase_add_test(tc, rejected_cell_invents_no_row);
    tcase_add_test(tc, unreadable_inputs);
    tcase_add_test(tc, full_disk_is_an_error);
    tcase_add_test(tc, spreadsheet_files);
    tcase_add_test(tc, output_names_as_headers);
    tcase_add_test(tc, formula_cells);
    tcase_add_test(tc, bom_round_trip);
    tcase_add_test(tc, spreadsheet_engine_opens_every_command);
    suite_add_tcase(s, tc);
    return run_suite(s);
}
