/* loss_values - print the physical loss model's values for a geometry, for
 * tests/skrf_compare.py.
 * Usage: loss_values DINT_M DOUT_M EPS_R TAN_D SIGMA_S_PER_M MODE FREQ_HZ...
 *        loss_values DINT_M DOUT_M EPS_R TAN_D SIGMA_S_PER_M MODE range
 * MODE: bit 0 set = with internal inductance (else external only), bit 1
 * set = thin-skin conductor impedance (CXL_LOSS_THIN_SKIN) instead of the
 * Bessel forms; so 0, 1, 2 or 3.  Frequencies outside the model's range
 * are evaluated too (CXL_LOSS_EXTRAPOLATE).
 * One line per frequency: freq_hz alpha_np_per_m beta_rad_per_m z0_re z0_im
 * vf r_ohm_per_m l_h_per_m; with "range", one line: min_freq_hz max_freq_hz.
 */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
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
        fprintf(stderr, "usage: loss_values DINT DOUT EPS_R TAN_D SIGMA MODE FREQ_HZ...|range\n");
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
    int mode = (int)p[5];
    unsigned flags = CXL_LOSS_EXTRAPOLATE | ((mode & 1) ? 0u : CXL_LOSS_EXTERNAL_L_ONLY) |
                     ((mode & 2) ? CXL_LOSS_THIN_SKIN : 0u);
    int rc = 0;
    if (strcmp(argv[7], "range") == 0) {
        double lo, hi;
        cxl_loss_model_range(m, &lo, &hi);
        put(lo, " ");
        put(hi, "\n");
        cxl_loss_model_free(m);
        return 0;
    }
    for (int i = 7; i < argc && rc == 0; i++) {
        double f, alpha, beta, zr, zi, vf, r, l, g, c;
        if (!number(argv[i], &f)) { rc = 2; break; }
        st = cxl_loss_model_gamma(m, f, flags, &alpha, &beta);
        if (st == CXL_OK) st = cxl_loss_model_z0(m, f, flags, &zr, &zi);
        if (st == CXL_OK) st = cxl_loss_model_vf(m, f, flags, &vf);
        if (st == CXL_OK) st = cxl_loss_model_rlgc(m, f, flags, &r, &l, &g, &c);
        if (st != CXL_OK) {
            fprintf(stderr, "loss_values: %s at %s Hz\n", cxl_strerror(st), argv[i]);
            rc = 1;
            break;
        }
        put(f, " "); put(alpha, " "); put(beta, " "); put(zr, " "); put(zi, " "); put(vf, " ");
        put(r, " "); put(l, "\n");
    }
    cxl_loss_model_free(m);
    return rc;
}
