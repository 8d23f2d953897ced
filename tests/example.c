/* example.c - a program using an installed libcoaxline:
 *   cc example.c $(pkg-config --cflags --libs libcoaxline)
 * Cut length of a delay line for a 10 m stagger on cable with VF 0.80. */
#include <stdio.h>
#include <string.h>
#include <coaxline.h>

int main(void)
{
    double delay_s, cut_m, check_hz;
    char cut_text[32], tape[32];
    if (strcmp(cxl_version(), CXL_VERSION_STRING) != 0) {
        fprintf(stderr, "header %s but library %s\n", CXL_VERSION_STRING, cxl_version());
        return 1;
    }
    cxl_status st = cxl_line_delay_from_offset(10.0, &delay_s);
    if (st == CXL_OK) st = cxl_line_cut_length(delay_s, 0.80, 0.0, 0.80, &cut_m);
    if (st == CXL_OK) st = cxl_line_quarter_wave_freq(cut_m, 0.80, &check_hz);
    if (st == CXL_OK) st = cxl_units_format_fixed(cut_m, 3, cut_text, sizeof cut_text);
    if (st == CXL_OK) st = cxl_units_format_imperial(cut_m, tape, sizeof tape);
    if (st != CXL_OK) {
        fprintf(stderr, "example: %s\n", cxl_strerror(st));
        return 1;
    }
    printf("libcoaxline %s: cut %s m (%s), check %.4f MHz\n", cxl_version(), cut_text, tape,
           check_hz / 1e6);
    return strcmp(cut_text, "8.000") == 0 ? 0 : 1;
}
