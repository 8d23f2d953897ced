/* fuzz_units.c - libFuzzer target for the length, frequency, time and
 * number parsers and the formatters they feed. */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = malloc(size + 1);
    if (!text) return 0;
    memcpy(text, data, size);
    text[size] = '\0';
    double v = 0.0, back = 0.0;
    size_t pos = 0;
    char buf[600];
    cxl_status st;
    for (int mode = 0; mode < 5; mode++) {
        pos = 0;
        switch (mode) {
        case 0: st = cxl_units_parse_length(text, CXL_UNITS_METRIC, &v, &pos); break;
        case 1: st = cxl_units_parse_length(text, CXL_UNITS_IMPERIAL, &v, &pos); break;
        case 2: st = cxl_units_parse_freq(text, &v, &pos); break;
        case 3: st = cxl_units_parse_time(text, &v, &pos); break;
        default: st = cxl_units_parse_number(text, &v, &pos); break;
        }
        if (st == CXL_OK) {
            if (!isfinite(v)) abort();              /* never NaN or inf */
            if (cxl_units_format_roundtrip(v, buf, sizeof buf) != CXL_OK) abort();
            if (cxl_units_parse_number(buf, &back, NULL) != CXL_OK || back != v) abort();
            cxl_units_format_fixed(v, 3, buf, sizeof buf);
            cxl_units_format_imperial(v, buf, sizeof buf);
        } else if (pos > strlen(text)) {
            abort();                                 /* error position inside the text */
        }
    }
    free(text);
    return 0;
}
