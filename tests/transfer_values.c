/* transfer_values - print libcoaxline's line-into-load values for
 * tests/skrf_transfer.py.
 * Usage:
 *   transfer_values coax DINT DOUT EPS_R SIGMA LENGTH ZL_RE ZL_IM FREQ_HZ...
 *     physical model, loss tangent 0, external inductance only; one line per
 *     frequency: freq ratio_re ratio_im transfer_db delay_deg electrical_deg
 *   transfer_values lossless Z0 VF LENGTH ZL_RE ZL_IM FREQ_HZ...
 *     the same columns for a lossless line
 *   transfer_values stub DINT DOUT EPS_R SIGMA LENGTH open|short ORDER
 *     the order-th series resonance in Hz (model as for coax)
 */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "coaxline.h"

/* scikit-rf 0.15.4 uses the thin-skin R and external L only */
#define FLAGS (CXL_LOSS_EXTERNAL_L_ONLY | CXL_LOSS_THIN_SKIN | CXL_LOSS_EXTRAPOLATE)

static int numbers(char **text, int n, double *v)
{
    for (int i = 0; i < n; i++)
        if (cxl_units_parse_number(text[i], &v[i], NULL) != CXL_OK) {
            fprintf(stderr, "transfer_values: not a number: %s\n", text[i]);
            return 0;
        }
    return 1;
}

static void put(double v, const char *sep)
{
    char buf[64];
    if (cxl_units_format_roundtrip(v, buf, sizeof buf) != CXL_OK) buf[0] = '\0';
    printf("%s%s", buf, sep);
}

static int row(double f, double z0r, double z0i, double alpha, double beta, double len,
               double zlr, double zli)
{
    double rr, ri, db, delay;
    double el = beta * len * 180.0 / M_PI;
    cxl_status st = cxl_transfer_ratio(len, z0r, z0i, alpha, beta, zlr, zli, &rr, &ri);
    if (st == CXL_OK) st = cxl_transfer_delay(rr, ri, el, &db, &delay);
    if (st != CXL_OK) {
        fprintf(stderr, "transfer_values: %s\n", cxl_strerror(st));
        return 1;
    }
    put(f, " "); put(rr, " "); put(ri, " "); put(db, " "); put(delay, " "); put(el, "\n");
    return 0;
}

int main(int argc, char **argv)
{
    double p[7];
    cxl_loss_model *m = NULL;
    int rc = 0;
    if (argc >= 9 && strcmp(argv[1], "stub") == 0) {
        double order_v;
        if (!numbers(argv + 2, 5, p) || !numbers(argv + 8, 1, &order_v)) return 2;
        int order = (int)order_v;
        if (cxl_loss_model_new(p[0], p[1], p[2], 0.0, p[3], 1.0, &m) != CXL_OK) return 1;
        double f;
        cxl_stub_end end = strcmp(argv[7], "short") == 0 ? CXL_STUB_SHORT : CXL_STUB_OPEN;
        cxl_status st = cxl_transfer_stub_resonance(m, FLAGS, end, order, p[4], &f);
        if (st == CXL_OK) put(f, "\n");
        else { fprintf(stderr, "transfer_values: %s\n", cxl_strerror(st)); rc = 1; }
    } else if (argc >= 10 && strcmp(argv[1], "coax") == 0) {
        if (!numbers(argv + 2, 7, p)) return 2;
        if (cxl_loss_model_new(p[0], p[1], p[2], 0.0, p[3], 1.0, &m) != CXL_OK) return 1;
        for (int i = 9; i < argc && rc == 0; i++) {
            double f, alpha, beta, zr, zi;
            if (!numbers(argv + i, 1, &f)) return 2;
            if (cxl_loss_model_gamma(m, f, FLAGS, &alpha, &beta) != CXL_OK ||
                cxl_loss_model_z0(m, f, FLAGS, &zr, &zi) != CXL_OK) { rc = 1; break; }
            rc = row(f, zr, zi, alpha, beta, p[4], p[5], p[6]);
        }
    } else if (argc >= 8 && strcmp(argv[1], "lossless") == 0) {
        if (!numbers(argv + 2, 5, p)) return 2;
        for (int i = 7; i < argc && rc == 0; i++) {
            double f;
            if (!numbers(argv + i, 1, &f)) return 2;
            rc = row(f, p[0], 0.0, 0.0, 2.0 * M_PI * f / (p[1] * CXL_C_M_PER_S), p[2], p[3], p[4]);
        }
    } else {
        fprintf(stderr, "usage: see the comment at the top of transfer_values.c\n");
        return 2;
    }
    cxl_loss_model_free(m);
    return rc;
}
