/* check_api_loss.c - the walk's adapters for loss.c and transfer.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* loss.c */
ADAPTER(loss_fit_new)
{
    double f[2] = { a[0], a[1] }, l[2] = { a[2], a[3] };
    cxl_loss_fit *fit = SENT_PTR;
    cxl_status st = cxl_loss_fit_new(P(0, f), P(1, l), to_size(a[4]), P(2, &fit));
    o[0] = ptr_out(fit);
    if (st == CXL_OK) {
        /* a fit that succeeded must evaluate to a finite value in range */
        double lo, hi, v;
        ck_assert_int_eq(cxl_loss_fit_range(fit, &lo, &hi), CXL_OK);
        cxl_status e = cxl_loss_fit_eval(fit, lo, 0, &v);
        if (e == CXL_OK) o[1] = v;
        cxl_loss_fit_free(fit);
    }
    return st;
}
NEW_ADAPTER(loss_fit_new_cable, cxl_loss_fit,
            cxl_loss_fit_new_cable(P(0, g_cat), to_size(a[0]), P(1, &h)), cxl_loss_fit_free)
ADAPTER(loss_fit_coefficients)
{
    (void)a;
    return cxl_loss_fit_coefficients(P(0, g_fit), P(1, &o[0]), P(2, &o[1]));
}
/* a catalog cable's loss: RG-174 (index 0, a table from 30 MHz) */
NEW_ADAPTER(loss_cable_new, cxl_loss_cable,
            cxl_loss_cable_new(P(0, g_cat), to_size(a[0]), P(1, &h)), cxl_loss_cable_free)
static cxl_loss_cable *fresh_loss_cable(void)
{
    cxl_loss_cable *l = NULL;
    ck_assert_int_eq(cxl_loss_cable_new(g_cat, 0, &l), CXL_OK);
    return l;
}
ADAPTER(loss_cable_kind)
{
    (void)a;
    cxl_loss_cable *l = fresh_loss_cable();
    cxl_loss_kind k = (cxl_loss_kind)SENT;
    cxl_status st = cxl_loss_cable_kind(P(0, l), P(1, &k));
    o[0] = k;
    cxl_loss_cable_free(l);
    return st;
}
ADAPTER(loss_cable_range)
{
    (void)a;
    cxl_loss_cable *l = fresh_loss_cable();
    cxl_status st = cxl_loss_cable_range(P(0, l), P(1, &o[0]), P(2, &o[1]));
    cxl_loss_cable_free(l);
    return st;
}
ADAPTER(loss_cable_db_per_m)
{
    cxl_loss_cable *l = fresh_loss_cable();
    cxl_status st = cxl_loss_cable_db_per_m(P(0, l), a[0], to_uint(a[1]), P(1, &o[0]));
    cxl_loss_cable_free(l);
    return st;
}
ADAPTER(loss_cable_difference)
{
    cxl_loss_cable *l = fresh_loss_cable();
    cxl_status st = cxl_loss_cable_difference(P(0, l), a[0], a[1], a[2], P(1, &o[0]));
    cxl_loss_cable_free(l);
    return st;
}
ADAPTER(loss_fit_usable_range)
{
    (void)a;
    return cxl_loss_fit_usable_range(P(0, g_fit), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(loss_fit_range)
{
    (void)a;
    return cxl_loss_fit_range(P(0, g_fit), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(loss_fit_point)
{
    return cxl_loss_fit_point(P(0, g_fit), to_size(a[0]), P(1, &o[0]), P(2, &o[1]),
                              P(3, &o[2]));
}
ADAPTER(loss_fit_max_relative_residual)
{
    (void)a;
    return cxl_loss_fit_max_relative_residual(P(0, g_fit), P(1, &o[0]));
}
ADAPTER(loss_fit_eval)
{
    return cxl_loss_fit_eval(P(0, g_fit), a[0], to_uint(a[1]), P(1, &o[0]));
}
ADAPTER(loss_model_new)
{
    cxl_loss_model *m = SENT_PTR;
    cxl_status st = cxl_loss_model_new(a[0], a[1], a[2], a[3], a[4], a[5], P(0, &m));
    o[0] = ptr_out(m);
    if (st == CXL_OK) {
        /* a model that was accepted must state a finite range (it may be
         * empty: lo above hi for a freak geometry) */
        double lo = NAN, hi = NAN;
        ck_assert_int_eq(cxl_loss_model_range(m, &lo, &hi), CXL_OK);
        o[1] = lo;
        o[2] = hi;
        cxl_loss_model_free(m);
    }
    return st;
}
NEW_ADAPTER(loss_model_new_cable, cxl_loss_model,
            cxl_loss_model_new_cable(P(0, g_cat), to_size(a[0]), P(1, &h)), cxl_loss_model_free)
ADAPTER(loss_model_set_clad)
{
    cxl_loss_model *m = NULL;
    ck_assert_int_eq(cxl_loss_model_new(0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0, &m), CXL_OK);
    cxl_status st = cxl_loss_model_set_clad(P(0, m), a[0], a[1], a[2]);
    if (st == CXL_OK) {
        /* the clad centre must still evaluate to finite numbers */
        double alpha, beta;
        cxl_status e = cxl_loss_model_gamma(m, 1e6, CXL_LOSS_EXTRAPOLATE, &alpha, &beta);
        if (e == CXL_OK) { o[0] = alpha; o[1] = beta; }
    }
    cxl_loss_model_free(m);
    return st;
}
ADAPTER(loss_model_range)
{
    (void)a;
    return cxl_loss_model_range(P(0, g_model), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(loss_model_rlgc)
{
    return cxl_loss_model_rlgc(P(0, g_model), a[0], to_uint(a[1]), P(1, &o[0]), P(2, &o[1]),
                               P(3, &o[2]), P(4, &o[3]));
}
ADAPTER(loss_model_gamma)
{
    return cxl_loss_model_gamma(P(0, g_model), a[0], to_uint(a[1]), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(loss_model_attenuation)
{
    return cxl_loss_model_attenuation(P(0, g_model), a[0], to_uint(a[1]), P(1, &o[0]));
}
ADAPTER(loss_model_z0)
{
    return cxl_loss_model_z0(P(0, g_model), a[0], to_uint(a[1]), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(loss_model_vf)
{
    return cxl_loss_model_vf(P(0, g_model), a[0], to_uint(a[1]), P(1, &o[0]));
}
ADAPTER(loss_skin_depth) { return cxl_loss_skin_depth_m(a[0], a[1], a[2], P(0, &o[0])); }
ADAPTER(loss_total_db) { return cxl_loss_total_db(a[0], a[1], P(0, &o[0])); }
ADAPTER(loss_run_db) { return cxl_loss_run_db(a[0], a[1], a[2], P(0, &o[0]), P(1, &o[1])); }


/* transfer.c */
ADAPTER(transfer_ratio)
{
    return cxl_transfer_ratio(a[0], a[1], a[2], a[3], a[4], a[5], a[6], P(0, &o[0]),
                              P(1, &o[1]));
}
ADAPTER(transfer_delay)
{
    return cxl_transfer_delay(a[0], a[1], a[2], P(0, &o[0]), P(1, &o[1]));
}
ADAPTER(transfer_lossless)
{
    return cxl_transfer_lossless(a[0], a[1], a[2], a[3], a[4], a[5], P(0, &o[0]),
                                 P(1, &o[1]), P(2, &o[2]));
}
ADAPTER(transfer_model)
{
    return cxl_transfer_model(P(0, g_model), a[0], a[1], to_uint(a[2]), a[3], a[4],
                              P(1, &o[0]), P(2, &o[1]), P(3, &o[2]));
}
ADAPTER(transfer_input_impedance)
{
    return cxl_transfer_input_impedance(a[0], a[1], a[2], a[3], a[4], a[5], a[6],
                                        P(0, &o[0]), P(1, &o[1]));
}
ADAPTER(transfer_stub_resonance)
{
    return cxl_transfer_stub_resonance(P(0, g_model), to_uint(a[0]), (cxl_stub_end)to_int(a[1]),
                                       to_int(a[2]), a[3], P(1, &o[0]));
}

ADAPTER(transfer_stub_dip)
{
    return cxl_transfer_stub_dip(P(0, g_model), to_uint(a[0]), (cxl_stub_end)to_int(a[1]),
                                 to_int(a[2]), a[3], (cxl_dip_kind)to_int(a[4]), a[5],
                                 P(1, &o[0]), P(2, &o[1]));
}


/* loss.c: the clad model's crossover */
ADAPTER(loss_model_clad_crossover)
{
    (void)a;
    return cxl_loss_model_clad_crossover(P(0, g_clad), P(1, &o[0]));
}
