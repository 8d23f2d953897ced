/* check_csv.c - the RFC 4180 reader and writer. */
#include <config.h>
#include <check.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "failstream.h"

static cxl_csv_reader *open_text(const char *text, size_t size)
{
    cxl_csv_reader *r = NULL;
    ck_assert_int_eq(cxl_csv_reader_new_buffer(text, size, &r), CXL_OK);
    return r;
}

static void expect_row(cxl_csv_reader *r, size_t line, size_t n, const char *const *fields)
{
    int has = 0;
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 1);
    ck_assert_uint_eq(cxl_csv_reader_line(r), line);
    ck_assert_uint_eq(cxl_csv_reader_nfields(r), n);
    for (size_t i = 0; i < n; i++) ck_assert_str_eq(cxl_csv_reader_field(r, i), fields[i]);
}

static void expect_end(cxl_csv_reader *r)
{
    int has = 1;
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 0);
}

START_TEST(rfc4180_examples)
{
    /* RFC 4180 sec. 2, rules 1-7: CRLF records, optional final line break,
     * quoted fields with commas, line breaks and doubled quotes. */
    const char text[] = "aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n\"a,b\",\"line\r\nbreak\",\"say \"\"hi\"\"\"\r\nlast,,";
    cxl_csv_reader *r = open_text(text, sizeof text - 1);
    expect_row(r, 1, 3, (const char *[]){ "aaa", "bbb", "ccc" });
    expect_row(r, 2, 3, (const char *[]){ "zzz", "yyy", "xxx" });
    expect_row(r, 3, 3, (const char *[]){ "a,b", "line\r\nbreak", "say \"hi\"" });
    expect_row(r, 5, 3, (const char *[]){ "last", "", "" });
    expect_end(r);
    cxl_csv_reader_free(r);
}
END_TEST

START_TEST(spreadsheet_export)
{
    /* what a spreadsheet writes: UTF-8 BOM, CRLF, blank line at the end
     * (common practice, no source) */
    const char text[] = "\xEF\xBB\xBFlabel,offset\r\n\"west, rear\",10m\r\n\r\n";
    cxl_csv_reader *r = open_text(text, sizeof text - 1);
    expect_row(r, 1, 2, (const char *[]){ "label", "offset" });
    expect_row(r, 2, 2, (const char *[]){ "west, rear", "10m" });
    expect_end(r);
    cxl_csv_reader_free(r);
}
END_TEST

START_TEST(bad_records_are_skipped)
{
    const char text[] = "a,b\n\"x\"y,1\nc,d\n\"open,2\nnever closed";
    cxl_csv_reader *r = open_text(text, sizeof text - 1);
    int has = 0;
    expect_row(r, 1, 2, (const char *[]){ "a", "b" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EPARSE); /* text after closing quote */
    ck_assert_uint_eq(cxl_csv_reader_line(r), 2);
    expect_row(r, 3, 2, (const char *[]){ "c", "d" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EPARSE); /* quote never closed */
    ck_assert_uint_eq(cxl_csv_reader_line(r), 4);
    cxl_csv_reader_free(r);

    const char nul[] = "a,b\nx\0y,1\nc,d\n";
    r = open_text(nul, sizeof nul - 1);
    expect_row(r, 1, 2, (const char *[]){ "a", "b" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EPARSE);
    expect_row(r, 3, 2, (const char *[]){ "c", "d" });
    cxl_csv_reader_free(r);
}
END_TEST

START_TEST(long_record)
{
    size_t n = CXL_CSV_MAX_RECORD + 100;
    char *text = malloc(n + 16);
    ck_assert_ptr_nonnull(text);
    memset(text, 'x', n);
    memcpy(text + n, "\nok,1\n", 6);
    cxl_csv_reader *r = open_text(text, n + 6);
    int has = 0;
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    expect_row(r, 2, 2, (const char *[]){ "ok", "1" });
    expect_end(r);
    cxl_csv_reader_free(r);
    free(text);
}
END_TEST

START_TEST(stream_reader)
{
    FILE *fp = tmpfile();
    ck_assert_ptr_nonnull(fp);
    for (int i = 0; i < 20000; i++) fprintf(fp, "row%d,\"%d\"\n", i, i);
    rewind(fp);
    cxl_csv_reader *r = NULL;
    ck_assert_int_eq(cxl_csv_reader_new_stream(fp, &r), CXL_OK);
    int has = 0, count = 0;
    char want[32];
    while (cxl_csv_reader_next(r, &has) == CXL_OK && has) {
        snprintf(want, sizeof want, "%d", count);
        ck_assert_str_eq(cxl_csv_reader_field(r, 1), want);
        count++;
    }
    ck_assert_int_eq(count, 20000);
    cxl_csv_reader_free(r);
    fclose(fp);
}
END_TEST

/* A rejected multi-line quoted cell is skipped to the end of its record:
 * none of its lines comes back as a row, and the row after it is read
 * (common practice, no source: RFC 4180 sec. 2 rule 6, a line break
 * inside quotes belongs to the field). */
START_TEST(rejected_quoted_cell_skips_its_record)
{
    size_t big = CXL_CSV_MAX_RECORD + 500;
    static const char head[] = "label,offset,vf\na,10m,0.66\n\"";
    static const char tail[] = "\nghost,5m,0.66\n\",10m,0.66\nreal,7m,0.66\n";
    char *text = malloc(big + sizeof head + sizeof tail);
    ck_assert_ptr_nonnull(text);
    size_t n = 0;
    memcpy(text, head, sizeof head - 1);
    n += sizeof head - 1;
    memset(text + n, 'y', big);
    n += big;
    memcpy(text + n, tail, sizeof tail - 1);
    n += sizeof tail - 1;
    cxl_csv_reader *r = open_text(text, n);
    int has = 0;
    expect_row(r, 1, 3, (const char *[]){ "label", "offset", "vf" });
    expect_row(r, 2, 3, (const char *[]){ "a", "10m", "0.66" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    ck_assert_uint_eq(cxl_csv_reader_line(r), 3);
    ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_OK);
    expect_row(r, 6, 3, (const char *[]){ "real", "7m", "0.66" });
    expect_end(r);
    cxl_csv_reader_free(r);
    free(text);

    /* the same with a NUL inside the quoted cell */
    static const char nul[] = "a,b\n\"x\0y\nghost,1\n\",2\nreal,3\n";
    r = open_text(nul, sizeof nul - 1);
    expect_row(r, 1, 2, (const char *[]){ "a", "b" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EPARSE);
    ck_assert_uint_eq(cxl_csv_reader_line(r), 2);
    expect_row(r, 5, 2, (const char *[]){ "real", "3" });
    expect_end(r);
    cxl_csv_reader_free(r);

    /* text after a closing quote: the rest of the record, a quoted line
     * break included, goes with it */
    static const char after[] = "a,b\n\"x\"y,\"1\nghost,2\"\nreal,3\n";
    r = open_text(after, sizeof after - 1);
    expect_row(r, 1, 2, (const char *[]){ "a", "b" });
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EPARSE);
    expect_row(r, 4, 2, (const char *[]){ "real", "3" });
    expect_end(r);
    cxl_csv_reader_free(r);
}
END_TEST

/* A read error is reported (CXL_EIO), the record it cut short is not a
 * row, and the reader stays stopped. */
START_TEST(read_error_is_reported)
{
    static const char text[] = "a,b\n1,2\n3,4\n5,6";
    for (size_t fail_at = 0; fail_at < sizeof text; fail_at++) {
        FILE *fp = failstream_open(text, fail_at);
        ck_assert_ptr_nonnull(fp);
        cxl_csv_reader *r = NULL;
        ck_assert_int_eq(cxl_csv_reader_new_stream(fp, &r), CXL_OK);
        int has = 0, rows = 0;
        cxl_status st;
        while ((st = cxl_csv_reader_next(r, &has)) == CXL_OK && has) {
            /* only whole records come back */
            ck_assert_uint_eq(cxl_csv_reader_nfields(r), 2);
            rows++;
        }
        ck_assert_msg(st == CXL_EIO, "failing at byte %zu: %s after %d rows", fail_at,
                      cxl_strerror(st), rows);
        ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_EIO);
        ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_EIO);
        /* every record ending before the failing byte was delivered */
        int complete = 0;
        for (size_t i = 0; i < fail_at && i < sizeof text - 1; i++) complete += text[i] == '\n';
        ck_assert_int_eq(rows, complete);
        cxl_csv_reader_free(r);
        fclose(fp);
    }
    /* an error after many rows: 6000 rows, EIO part-way (as in a report of
     * a batch cut short on a failing disk) */
    static char big[6000 * 8 + 1];
    size_t n = 0;
    for (int i = 0; i < 6000; i++) n += (size_t)snprintf(big + n, sizeof big - n, "r%04d,1\n", i);
    FILE *fp = failstream_open(big, 3677 * 8 + 3);
    cxl_csv_reader *r = NULL;
    ck_assert_int_eq(cxl_csv_reader_new_stream(fp, &r), CXL_OK);
    int has = 0, rows = 0;
    cxl_status st;
    while ((st = cxl_csv_reader_next(r, &has)) == CXL_OK && has) rows++;
    ck_assert_int_eq(st, CXL_EIO);
    ck_assert_int_eq(rows, 3677);
    ck_assert_uint_eq(cxl_csv_reader_line(r), 3678);
    cxl_csv_reader_free(r);
    fclose(fp);
}
END_TEST

/* Endless input with no line end stops the reader quickly. */
START_TEST(endless_line_stops)
{
    /* a NUL first (as /dev/zero gives), then bytes without a line end */
    size_t n = 3 * (size_t)CXL_CSV_MAX_SKIP;
    char *zeros = calloc(n, 1);
    ck_assert_ptr_nonnull(zeros);
    cxl_csv_reader *r = open_text(zeros, n);
    int has = 0;
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_ETOOLONG);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    cxl_csv_reader_free(r);
    /* an endless run of text: too long, then stopped */
    memset(zeros, 'x', n);
    r = open_text(zeros, n);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_ETOOLONG);
    cxl_csv_reader_free(r);
    /* a long line that does end is skipped and reading goes on */
    memset(zeros, 'x', CXL_CSV_MAX_SKIP);
    memcpy(zeros + CXL_CSV_MAX_SKIP, "\nok,1\n", 6);
    r = open_text(zeros, CXL_CSV_MAX_SKIP + 6);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_OK);
    expect_row(r, 2, 2, (const char *[]){ "ok", "1" });
    cxl_csv_reader_free(r);
    free(zeros);
}
END_TEST

/* Separators ';' and TAB, detected from the first record; the BOM flag. */
START_TEST(separators_and_bom)
{
    static const char semi[] = "\xEF\xBB\xBFlabel;offset\r\n\"a;b\";1,5m\r\nc,d;2\r\n";
    cxl_csv_reader *r = open_text(semi, sizeof semi - 1);
    ck_assert_int_eq(cxl_csv_reader_separator(r), ',');
    ck_assert_int_eq(cxl_csv_reader_set_separator(r, 0), CXL_OK);
    ck_assert_int_eq(cxl_csv_reader_separator(r), 0);
    expect_row(r, 1, 2, (const char *[]){ "label", "offset" });
    ck_assert_int_eq(cxl_csv_reader_separator(r), ';');
    ck_assert_int_eq(cxl_csv_reader_bom(r), 1);
    expect_row(r, 2, 2, (const char *[]){ "a;b", "1,5m" });
    expect_row(r, 3, 2, (const char *[]){ "c,d", "2" });
    expect_end(r);
    ck_assert_int_eq(cxl_csv_reader_set_separator(r, ','), CXL_EINVAL); /* too late */
    cxl_csv_reader_free(r);

    static const char tab[] = "label\toffset\nx,y\t2m\n";
    r = open_text(tab, sizeof tab - 1);
    ck_assert_int_eq(cxl_csv_reader_set_separator(r, '|'), CXL_EINVAL);
    ck_assert_int_eq(cxl_csv_reader_set_separator(r, 0), CXL_OK);
    expect_row(r, 1, 2, (const char *[]){ "label", "offset" });
    ck_assert_int_eq(cxl_csv_reader_separator(r), '\t');
    ck_assert_int_eq(cxl_csv_reader_bom(r), 0);
    expect_row(r, 2, 2, (const char *[]){ "x,y", "2m" });
    cxl_csv_reader_free(r);

    /* a one-column first record: ',' */
    static const char one[] = "\n\nlabel\na;b,c\n";
    r = open_text(one, sizeof one - 1);
    ck_assert_int_eq(cxl_csv_reader_set_separator(r, 0), CXL_OK);
    expect_row(r, 3, 1, (const char *[]){ "label" });
    ck_assert_int_eq(cxl_csv_reader_separator(r), ',');
    expect_row(r, 4, 2, (const char *[]){ "a;b", "c" });
    cxl_csv_reader_free(r);
}
END_TEST

static char *write_to_string(const char *text, int neutralise)
{
    static char buf[256];
    FILE *fp = tmpfile();
    ck_assert_int_eq(cxl_csv_write_field(fp, text, neutralise), CXL_OK);
    rewind(fp);
    size_t n = fread(buf, 1, sizeof buf - 1, fp);
    buf[n] = '\0';
    fclose(fp);
    return buf;
}

START_TEST(writer)
{
    ck_assert_str_eq(write_to_string("plain", 1), "plain");
    ck_assert_str_eq(write_to_string("a,b", 1), "\"a,b\"");
    ck_assert_str_eq(write_to_string("say \"hi\"", 1), "\"say \"\"hi\"\"\"");
    /* formula starters are neutralised (OWASP, "CSV Injection"; common practice) */
    ck_assert_str_eq(write_to_string("=1+2", 1), "'=1+2");
    ck_assert_str_eq(write_to_string("@SUM(A1)", 1), "'@SUM(A1)");
    ck_assert_str_eq(write_to_string("+cmd", 1), "'+cmd");
    ck_assert_str_eq(write_to_string("-2+3", 1), "'-2+3");
    ck_assert_str_eq(write_to_string("=1,2", 1), "\"'=1,2\"");
    /* but plain numbers stay numbers */
    ck_assert_str_eq(write_to_string("-3.5", 1), "-3.5");
    ck_assert_str_eq(write_to_string("+4", 1), "+4");
    ck_assert_str_eq(write_to_string("=1+2", 0), "=1+2");
    /* blanks before a formula, and a formula after a ';' or TAB, where a
     * spreadsheet whose list separator is ';' splits the cell (OWASP, "CSV
     * Injection": leading whitespace; the ';' case common practice, no
     * source); such cells are quoted too */
    ck_assert_str_eq(write_to_string("  =1+2", 1), "'  =1+2");
    ck_assert_str_eq(write_to_string(" @SUM(A1)", 1), "' @SUM(A1)");
    ck_assert_str_eq(write_to_string("x;=1+2", 1), "\"'x;=1+2\"");
    ck_assert_str_eq(write_to_string("x; -cmd", 1), "\"'x; -cmd\"");
    ck_assert_str_eq(write_to_string("x\t+1", 1), "\"'x\t+1\"");
    ck_assert_str_eq(write_to_string("a;b", 1), "\"a;b\"");
    ck_assert_str_eq(write_to_string(" -3.5", 1), " -3.5");
    ck_assert_str_eq(write_to_string("x;=1+2", 0), "\"x;=1+2\"");
    ck_assert_int_eq(cxl_csv_write_field(NULL, "x", 1), CXL_EINVAL);
}
END_TEST

int main(void)
{
    Suite *s = suite_create("csv");
    TCase *tc = tcase_create("core");
    tcase_add_test(tc, rfc4180_examples);
    tcase_add_test(tc, spreadsheet_export);
    tcase_add_test(tc, bad_records_are_skipped);
    tcase_add_test(tc, long_record);
    tcase_add_test(tc, stream_reader);
    tcase_add_test(tc, writer);
    tcase_add_test(tc, rejected_quoted_cell_skips_its_record);
    tcase_add_test(tc, read_error_is_reported);
    tcase_add_test(tc, endless_line_stops);
    tcase_add_test(tc, separators_and_bom);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
