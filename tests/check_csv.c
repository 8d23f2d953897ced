/* check_csv.c - the RFC 4180 reader and writer. */
#include <config.h>
#include <check.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

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
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
