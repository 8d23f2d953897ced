/* loss_values - print the physical loss model's values for a geometry, for
 * tests/skrf_compare.py.
 * Usage: loss_values DINT_M DOUT_M EPS_R TAN_D SIGMA_S_PER_M INTERNAL_L FREQ_HZ...
 * INTERNAL_L is 1 (with internal inductance) or 0 (external only).
 * One line per frequency: freq_hz alpha_np_per_m beta_rad_per_m z0_re z0_im vf
 */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include "coaxline.h"

static int number(const char *text, double *v)
{
    if (cxl_units_parse_number(text, v, NULL) == CXL_OK) return 1;
    fprintf(stderr, "loss_values: not a number: %s\n", text);
    return 0;
}

static void put(double v, const char *sep)
{
    char buf[64];
    if (cxl_units_format_roundtrip(v, buf, sizeof buf) != CXL_OK) buf[0] = '\0';
    printf("%s%s", buf, sep);
}

int main(int argc, char **argv)
{
    double p[6];
    if (argc < 8) {
        fprintf(stderr, "usage: loss_values DINT DOUT EPS_R TAN_D SIGMA INTERNAL_L FREQ_HZ...\n");
        return 2;
    }
    for (int i = 0; i < 6; i++)
        if (!number(argv[i + 1], &p[i])) return 2;
    cxl_loss_model *m;
    cxl_status st = cxl_loss_model_new(p[0], p[1], p[2], p[3], p[4], 1.0, &m);
    if (st != CXL_OK) {
        fprintf(stderr, "loss_values: %s\n", cxl_strerror(st));
        return 1;
    }
    unsigned flags = p[5] != 0.0 ? 0u : CXL_LOSS_EXTERNAL_L_ONLY;
    int rc = 0;
    for (int i = 7; i < argc && rc == 0; i++) {
        double f, alpha, beta, zr, zi, vf;
        if (!number(argv[i], &f)) { rc = 2; break; }
        st = cxl_loss_model_gamma(m, f, flags, &alpha, &beta);
        if (st == CXL_OK) st = cxl_loss_model_z0(m, f, flags, &zr, &zi);
        if (st == CXL_OK) st = cxl_loss_model_vf(m, f, flags, &vf);
        if (st != CXL_OK) {
            fprintf(stderr, "loss_values: %s at %s Hz\n", cxl_strerror(st), argv[i]);
            rc = 1;
            break;
        }
        put(f, " "); put(alpha, " "); put(beta, " "); put(zr, " "); put(zi, " "); put(vf, "\n");
    }
    cxl_loss_model_free(m);
    return rc;
}
