/* check_api_sweep.c - the walk's adapters for sweep.c and fault.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* sweep.c: the stub of g_sweep_text */
ADAPTER(sweep_read)
{
    (void)a;
    FILE *fp = text_stream(g_sweep_text);
    cxl_sweep *h = SENT_PTR;
    size_t line = 0;
    char msg[100];
    cxl_status st = cxl_sweep_read(P(0, fp), P(1, &h), P(2, &line), P(3, msg), sizeof msg);
    o[0] = ptr_out(h);
    if (st == CXL_OK) cxl_sweep_free(h);
    fclose(fp);
    return st;
}
ADAPTER(sweep_read_buffer)
{
    cxl_sweep *h = SENT_PTR;
    size_t line = 0, size = to_size(a[0]);
    char msg[100];
    if (size > strlen(g_sweep_text)) size = strlen(g_sweep_text);
    cxl_status st = cxl_sweep_read_buffer(P(0, g_sweep_text), size, P(1, &h), P(2, &line),
                                          P(3, msg), sizeof msg);
    o[0] = ptr_out(h);
    if (st == CXL_OK) cxl_sweep_free(h);
    return st;
}
ADAPTER(sweep_info)
{
    (void)a;
    cxl_sweep_source src = (cxl_sweep_source)SENT;
    int phase = (int)SENT;
    cxl_status st = cxl_sweep_info(P(0, g_sweep), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]),
                                   P(4, &src), P(5, &phase));
    o[3] = (double)src;
    o[4] = (double)phase;
    return st;
}
ADAPTER(sweep_point)
{
    return cxl_sweep_point(P(0, g_sweep), to_size(a[0]), a[1], P(1, &o[0]), P(2, &o[1]),
                           P(3, &o[2]), P(4, &o[3]), P(5, &o[4]));
}
ADAPTER(sweep_magnitude)
{
    return cxl_sweep_magnitude(P(0, g_sweep), to_size(a[0]), a[1], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(sweep_resonances)
{
    cxl_sweep_res *h = SENT_PTR;
    cxl_status st = cxl_sweep_resonances(P(0, g_sweep), a[0], (cxl_stub_end)to_int(a[1]), a[2],
                                         a[3], P(1, &h));
    o[0] = ptr_out(h);
    if (st == CXL_OK) {
        o[1] = (double)cxl_sweep_res_count(h);
        for (size_t i = 0; i < cxl_sweep_res_count(h); i++) {
            double f, e, v;
            ck_assert_int_eq(cxl_sweep_res_get(h, i, NULL, NULL, NULL, &f, &e, &v), CXL_OK);
            ck_assert(isfinite(f) && isfinite(e) && isfinite(v));
        }
        cxl_sweep_res_free(h);
    }
    return st;
}
ADAPTER(sweep_res_get)
{
    cxl_sweep_kind kind = (cxl_sweep_kind)SENT;
    int series = (int)SENT, order = (int)SENT;
    cxl_status st = cxl_sweep_res_get(P(0, g_sres), to_size(a[0]), P(1, &kind), P(2, &series),
                                      P(3, &order), P(4, &o[3]), P(5, &o[4]), P(6, &o[5]));
    o[0] = (double)kind;
    o[1] = (double)series;
    o[2] = (double)order;
    return st;
}
ADAPTER(sweep_res_readings)
{
    double f[8];
    int order[8];
    size_t count = (size_t)SENT;
    cxl_status st = cxl_sweep_res_readings(P(0, g_sres), (cxl_sweep_kind)to_int(a[0]), P(1, f),
                                           P(2, order), 8, P(3, &count));
    o[0] = (double)count;
    return st;
}


/* fault.c: the profile of the stub sweep */
ADAPTER(fault_new)
{
    cxl_fault *h = SENT_PTR;
    cxl_status st = cxl_fault_new(P(0, g_sweep), a[0], a[1], P(1, g_model),
                                  (cxl_fault_window)to_int(a[2]), a[3], a[4], to_uint(a[5]),
                                  P(2, &h));
    o[0] = ptr_out(h);
    if (st == CXL_OK) {
        for (size_t i = 0; i < cxl_fault_count(h); i += 97) {
            double d, r, sr, stp;
            ck_assert_int_eq(cxl_fault_point(h, i, &d, &r, &sr, &stp), CXL_OK);
            ck_assert(isfinite(d) && isfinite(r) && isfinite(sr) && isfinite(stp));
        }
        cxl_fault_free(h);
    }
    return st;
}
ADAPTER(fault_info)
{
    (void)a;
    int lowpass = (int)SENT;
    cxl_status st = cxl_fault_info(P(0, g_fault), P(1, &lowpass), P(2, &o[1]), P(3, &o[2]),
                                   P(4, &o[3]), P(5, &o[4]));
    o[0] = (double)lowpass;
    return st;
}
ADAPTER(fault_point)
{
    return cxl_fault_point(P(0, g_fault), to_size(a[0]), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]),
                           P(4, &o[3]));
}
ADAPTER(fault_peak)
{
    int change = (int)SENT;
    cxl_status st = cxl_fault_peak(P(0, g_fault), to_size(a[0]), P(1, &o[0]), P(2, &o[1]),
                                   P(3, &o[2]), P(4, &change));
    o[3] = (double)change;
    return st;
}

/* sweepfit.c: the stub sweep fitted */
ADAPTER(sweepfit_new)
{
    cxl_sweepfit *h = SENT_PTR;
    cxl_status st = cxl_sweepfit_new(P(0, g_sweep), a[0], (cxl_stub_end)to_int(a[1]), a[2], a[3],
                                     a[4], to_uint(a[5]), P(1, &h));
    o[0] = ptr_out(h);
    if (st == CXL_OK) {
        double v, e;
        ck_assert_int_eq(cxl_sweepfit_line(h, &v, &e, NULL, NULL, NULL, NULL), CXL_OK);
        ck_assert(isfinite(v) && isfinite(e));
        cxl_sweepfit_free(h);
    }
    return st;
}
ADAPTER(sweepfit_line)
{
    (void)a;
    return cxl_sweepfit_line(P(0, g_sfit), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]), P(4, &o[3]),
                             P(5, &o[4]), P(6, &o[5]));
}
ADAPTER(sweepfit_loss_coefficients)
{
    (void)a;
    return cxl_sweepfit_loss_coefficients(P(0, g_sfit), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]),
                                          P(4, &o[3]));
}
ADAPTER(sweepfit_fixture)
{
    (void)a;
    return cxl_sweepfit_fixture(P(0, g_sfit), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(sweepfit_vf) { return cxl_sweepfit_vf(P(0, g_sfit), a[0], P(1, &o[0]), P(2, &o[1])); }
ADAPTER(sweepfit_loss) { return cxl_sweepfit_loss(P(0, g_sfit), a[0], P(1, &o[0]), P(2, &o[1])); }
ADAPTER(sweepfit_quality)
{
    (void)a;
    return cxl_sweepfit_quality(P(0, g_sfit), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]), P(4, &o[3]),
                                P(5, &o[4]));
}
