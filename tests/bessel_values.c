/* bessel_values - print lib/bessel.c's ratios for complex arguments, for
 * tests/bessel_compare.py.  Built with lib/bessel.c itself (its functions
 * are internal, not exported).
 * Usage: bessel_values RE IM [RE IM]...
 * One line per argument: re im, then real and imaginary parts of
 * z I0/(2 I1) by series, by asymptotic form, as used; then z K0/K1 the same.
 */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <gsl/gsl_complex_math.h>
#include "coaxline.h"
#include "internal.h"

static void put(double v, const char *sep)
{
    char buf[64];
    if (cxl_units_format_roundtrip(v, buf, sizeof buf) != CXL_OK) buf[0] = '\0';
    printf("%s%s", buf, sep);
}

static void put_c(gsl_complex c, const char *sep)
{
    put(GSL_REAL(c), " ");
    put(GSL_IMAG(c), sep);
}

int main(int argc, char **argv)
{
    if (argc < 3 || argc % 2 == 0) {
        fprintf(stderr, "usage: bessel_values RE IM [RE IM]...\n");
        return 2;
    }
    for (int i = 1; i + 1 < argc; i += 2) {
        double re, im;
        if (cxl_units_parse_number(argv[i], &re, NULL) != CXL_OK ||
            cxl_units_parse_number(argv[i + 1], &im, NULL) != CXL_OK) {
            fprintf(stderr, "bessel_values: not a number: %s %s\n", argv[i], argv[i + 1]);
            return 2;
        }
        gsl_complex z = gsl_complex_rect(re, im);
        put(re, " ");
        put(im, " ");
        put_c(cxl__bessel_i_ratio_series(z), " ");
        put_c(cxl__bessel_i_ratio_asympt(z), " ");
        put_c(cxl__bessel_i_ratio(z), " ");
        put_c(cxl__bessel_k_ratio_series(z), " ");
        put_c(cxl__bessel_k_ratio_asympt(z), " ");
        put_c(cxl__bessel_k_ratio(z), "\n");
    }
    return 0;
}
