/* fuzz_csv.c - libFuzzer target for the CSV reader and writer. */
#include <config.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    cxl_csv_reader *r = NULL;
    if (cxl_csv_reader_new_buffer((const char *)data, size, &r) != CXL_OK) return 0;
    FILE *sink = fopen("/dev/null", "w");
    size_t last_line = 0;
    for (int guard = 0; guard < 1000000; guard++) {
        int has = 0;
        cxl_status st = cxl_csv_reader_next(r, &has);
        size_t line = cxl_csv_reader_line(r);
        if (line < last_line) abort();               /* lines never go backwards */
        last_line = line;
        if (st == CXL_OK && !has) break;
        if (st != CXL_OK && st != CXL_EPARSE && st != CXL_ETOOLONG) abort();
        if (st != CXL_OK) {
            if (st == CXL_EPARSE && cxl_csv_reader_next(r, &has) != CXL_OK) { /* resync */ }
            continue;
        }
        size_t n = cxl_csv_reader_nfields(r);
        if (n == 0) abort();
        for (size_t i = 0; i < n; i++) {
            const char *f = cxl_csv_reader_field(r, i);
            if (!f || strlen(f) > CXL_CSV_MAX_RECORD) abort();
            if (sink) cxl_csv_write_field(sink, f, 1);
        }
    }
    if (sink) fclose(sink);
    cxl_csv_reader_free(r);
    return 0;
}
