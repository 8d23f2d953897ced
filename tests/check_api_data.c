/* check_api_data.c - the walk's adapters for csv.c, band.c and catalog.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* csv.c */
ADAPTER(reader_new_stream)
{
    (void)a;
    FILE *fp = text_stream("a,b\n");
    cxl_csv_reader *r = SENT_PTR;
    cxl_status st = cxl_csv_reader_new_stream(P(0, fp), P(1, &r));
    o[0] = ptr_out(r);
    if (st == CXL_OK) cxl_csv_reader_free(r);
    fclose(fp);
    return st;
}
ADAPTER(reader_new_buffer)
{
    static const char text[] = "a,b\n1,2\n";
    cxl_csv_reader *r = SENT_PTR;
    cxl_status st = cxl_csv_reader_new_buffer(P(0, text), to_size(a[0]), P(1, &r));
    o[0] = ptr_out(r);
    if (st == CXL_OK) cxl_csv_reader_free(r);
    return st;
}
ADAPTER(reader_next)
{
    (void)a;
    static const char text[] = "a,b\n1,2\n";
    cxl_csv_reader *r = NULL;
    ck_assert_int_eq(cxl_csv_reader_new_buffer(text, sizeof text - 1, &r), CXL_OK);
    int has = (int)SENT;
    cxl_status st = cxl_csv_reader_next(P(0, r), P(1, &has));
    o[0] = has;
    cxl_csv_reader_free(r);
    return st;
}
ADAPTER(write_field)
{
    (void)o;
    FILE *fp = tmpfile();
    ck_assert_ptr_nonnull(fp);
    cxl_status st = cxl_csv_write_field(P(0, fp), P(1, "=1+2, \"x\""), to_int(a[0]));
    fclose(fp);
    return st;
}


/* band.c */
NEW_ADAPTER(bands_new, cxl_bands, cxl_bands_new(P(0, &h)), cxl_bands_free)
ADAPTER(bands_new_stream)
{
    (void)a;
    FILE *fp = text_stream(good_bands_csv);
    cxl_bands *b = SENT_PTR;
    size_t line = (size_t)SENT;
    cxl_status st = cxl_bands_new_stream(P(0, fp), P(1, &b), P(2, &line));
    o[0] = ptr_out(b);
    o[1] = (double)line;
    if (st == CXL_OK) cxl_bands_free(b);
    fclose(fp);
    return st;
}
ADAPTER(bands_get)
{
    const char *name = sentinel_text, *foot = sentinel_text, *src = sentinel_text;
    cxl_service service = (cxl_service)SENT;
    int region = (int)SENT;
    cxl_status st = cxl_bands_get(P(0, g_bands), to_size(a[0]), P(1, &name), P(2, &service),
                                  P(3, &region), P(4, &o[0]), P(5, &o[1]), P(6, &foot),
                                  P(7, &src));
    o[2] = ptr_out(name);
    o[3] = (double)service;
    o[4] = region;
    o[5] = ptr_out(foot);
    o[6] = ptr_out(src);
    return st;
}
ADAPTER(bands_name)
{
    (void)a;
    const char *name = sentinel_text;
    cxl_status st = cxl_bands_name(P(0, g_bands), P(1, "160"), P(2, &name));
    o[0] = ptr_out(name);
    return st;
}
ADAPTER(bands_edges)
{
    return cxl_bands_edges(P(0, g_bands), P(1, "160m"), to_int(a[0]), to_int(a[1]),
                           P(2, &o[0]), P(3, &o[1]));
}


/* catalog.c */
NEW_ADAPTER(catalog_new, cxl_catalog, cxl_catalog_new(P(0, &h)), cxl_catalog_free)
ADAPTER(catalog_load_cables)
{
    (void)a;
    cxl_catalog *c = NULL;
    ck_assert_int_eq(cxl_catalog_new(&c), CXL_OK);
    FILE *fp = text_stream(good_cables_csv);
    char text[128];
    size_t line = (size_t)SENT;
    memset(text, 'Z', sizeof text);
    cxl_status st = cxl_catalog_load_cables(P(0, c), P(1, fp), P(2, "bench.csv"), P(3, &line),
                                            P(4, text), sizeof text);
    if (st != CXL_OK) o[0] = (double)line; /* written on error only */
    fclose(fp);
    cxl_catalog_free(c);
    return st;
}
ADAPTER(catalog_load_loss)
{
    (void)a;
    cxl_catalog *c = NULL;
    ck_assert_int_eq(cxl_catalog_new(&c), CXL_OK);
    FILE *fp = text_stream(good_cables_csv);
    ck_assert_int_eq(cxl_catalog_load_cables(c, fp, NULL, NULL, NULL, 0), CXL_OK);
    fclose(fp);
    fp = text_stream(good_loss_csv);
    char text[128];
    size_t line = (size_t)SENT;
    cxl_status st = cxl_catalog_load_loss(P(0, c), P(1, fp), P(2, "loss.csv"), P(3, &line),
                                          P(4, text), sizeof text);
    if (st != CXL_OK) o[0] = (double)line;
    fclose(fp);
    cxl_catalog_free(c);
    return st;
}
ADAPTER(catalog_find)
{
    (void)a;
    size_t i = (size_t)SENT;
    cxl_status st = cxl_catalog_find(P(0, g_cat), P(1, "bench-spool"), P(2, &i));
    o[0] = (double)i;
    return st;
}
#define CATALOG_TEXT(name, fn)                                               \
    ADAPTER(name)                                                            \
    {                                                                        \
        const char *s = sentinel_text;                                       \
        cxl_status st = fn(P(0, g_cat), to_size(a[0]), P(1, &s));            \
        o[0] = ptr_out(s);                                                   \
        return st;                                                           \
    }
CATALOG_TEXT(catalog_name, cxl_catalog_name)
CATALOG_TEXT(catalog_dielectric, cxl_catalog_dielectric)
CATALOG_TEXT(catalog_source, cxl_catalog_source)
ADAPTER(catalog_is_builtin)
{
    int b = (int)SENT;
    cxl_status st = cxl_catalog_is_builtin(P(0, g_cat), to_size(a[0]), P(1, &b));
    o[0] = b;
    return st;
}
ADAPTER(catalog_value)
{
    return cxl_catalog_value(P(0, g_cat), to_size(a[0]), (cxl_cable_prop)to_int(a[1]),
                             P(1, &o[0]));
}
ADAPTER(catalog_loss_point)
{
    const char *src = sentinel_text;
    cxl_status st = cxl_catalog_loss_point(P(0, g_cat), to_size(a[0]), to_size(a[1]),
                                           P(1, &o[0]), P(2, &o[1]), P(3, &src));
    o[2] = ptr_out(src);
    return st;
}
