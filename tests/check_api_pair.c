/* check_api_pair.c - the walk's adapters for pair.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* pair.c */
ADAPTER(pair_phase_error)
{
    return cxl_pair_phase_error(a[0], a[1], a[2], a[3], P(0, &o[0]));
}
ADAPTER(pair_phase_error_ref_deg)
{
    return cxl_pair_phase_error_ref_deg(a[0], a[1], a[2], a[3], a[4], P(0, &o[0]));
}
ADAPTER(pair_max_mismatch) { return cxl_pair_max_mismatch(a[0], a[1], a[2], P(0, &o[0])); }
ADAPTER(pair_phase_uncertainty)
{
    return cxl_pair_phase_uncertainty(a[0], a[1], a[2], a[3], a[4], a[5], P(0, &o[0]));
}
ADAPTER(pair_verdict)
{
    cxl_verdict v = (cxl_verdict)SENT;
    cxl_status st = cxl_pair_verdict(a[0], a[1], a[2], P(0, &v));
    o[0] = (double)v;
    return st;
}
ADAPTER(pair_check)
{
    double lengths[2] = { a[0], a[1] };
    cxl_verdict v = (cxl_verdict)SENT;
    cxl_status st = cxl_pair_check(P(0, lengths), to_size(a[2]), a[3], a[4], a[5], a[6], a[7],
                                   P(1, &o[0]), P(2, &o[1]), P(3, &o[2]), P(4, &v));
    o[3] = (double)v;
    return st;
}

/* lines into a load: a lossless 50 ohm line into 75+j10 ohm */
static cxl_pair_load *fresh_pair_load(void)
{
    cxl_pair_load *l = NULL;
    ck_assert_int_eq(cxl_pair_load_new_lossless(50, 75, 10, &l), CXL_OK);
    return l;
}
NEW_ADAPTER(pair_load_new_lossless, cxl_pair_load,
            cxl_pair_load_new_lossless(a[0], a[1], a[2], P(0, &h)), cxl_pair_load_free)
NEW_ADAPTER(pair_load_new_model, cxl_pair_load,
            cxl_pair_load_new_model(P(0, g_model), a[0], a[1], P(1, &h)), cxl_pair_load_free)
ADAPTER(pair_load_transfer)
{
    cxl_pair_load *l = fresh_pair_load();
    cxl_status st = cxl_pair_load_transfer(P(0, l), a[0], a[1], a[2], P(1, &o[0]), P(2, &o[1]),
                                           P(3, &o[2]));
    cxl_pair_load_free(l);
    return st;
}
ADAPTER(pair_load_transfer_model)
{
    cxl_pair_load *l = NULL;
    ck_assert_int_eq(cxl_pair_load_new_model(g_model, 75, 10, &l), CXL_OK);
    cxl_status st = cxl_pair_load_transfer(P(0, l), a[0], a[1], a[2], P(1, &o[0]), P(2, &o[1]),
                                           P(3, &o[2]));
    cxl_pair_load_free(l);
    return st;
}
ADAPTER(pair_load_check)
{
    double lengths[2] = { a[0], a[1] };
    cxl_verdict v = (cxl_verdict)SENT;
    cxl_pair_load *l = fresh_pair_load();
    cxl_status st = cxl_pair_load_check(P(0, l), P(1, lengths), to_size(a[2]), a[3], a[4], a[5],
                                        a[6], a[7], P(2, &o[0]), P(3, &o[1]), P(4, &o[2]),
                                        P(5, &o[3]), P(6, &v));
    o[4] = (double)v;
    cxl_pair_load_free(l);
    return st;
}
ADAPTER(pair_load_max_mismatch)
{
    cxl_pair_load *l = fresh_pair_load();
    cxl_status st = cxl_pair_load_max_mismatch(P(0, l), a[0], a[1], a[2], a[3], P(1, &o[0]));
    cxl_pair_load_free(l);
    return st;
}
