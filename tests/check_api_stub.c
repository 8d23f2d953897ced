/* check_api_stub.c - the walk's adapters for stub.c, drift.c and trim.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* A result's flags getter (call reads into flags): the flags into o[0]. */
#define FLAGS_ADAPTER(name, call)                                            \
    ADAPTER(name)                                                            \
    {                                                                        \
        (void)a;                                                             \
        unsigned flags = (unsigned)SENT;                                     \
        cxl_status st = call;                                                \
        o[0] = flags;                                                        \
        return st;                                                           \
    }

/* A *_into call: a fresh result of type (type##_new) filled by call, one
 * value read back by read on success, the result freed. */
#define INTO_ADAPTER(name, type, call, read)                                 \
    ADAPTER(name)                                                            \
    {                                                                        \
        (void)a;                                                             \
        type *r = NULL;                                                      \
        ck_assert_int_eq(type##_new(&r), CXL_OK);                            \
        cxl_status st = call;                                                \
        if (st == CXL_OK) ck_assert_int_eq(read, CXL_OK);                    \
        type##_free(r);                                                      \
        return st;                                                           \
    }

/* stub.c */
ADAPTER(stub_wavelengths)
{
    return cxl_stub_wavelengths((cxl_stub_end)to_int(a[0]), to_int(a[1]), P(0, &o[0]));
}
ADAPTER(stub_vf_from_resonance)
{
    return cxl_stub_vf_from_resonance((cxl_stub_end)to_int(a[0]), to_int(a[1]), a[2], a[3],
                                      a[4], a[5], P(0, &o[0]));
}
ADAPTER(stub_resonance_freq)
{
    return cxl_stub_resonance_freq((cxl_stub_end)to_int(a[0]), to_int(a[1]), a[2], a[3],
                                   a[4], a[5], P(0, &o[0]));
}
NEW_ADAPTER(stub_new, cxl_stub, cxl_stub_new((cxl_stub_end)to_int(a[0]), P(0, &h)), cxl_stub_free)
/* Setters work on a fresh stub, so the walk never changes g_stub. */
static cxl_stub *fresh_stub(void)
{
    cxl_stub *s = NULL;
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    return s;
}
#define STUB_SETTER(name, call)                                              \
    ADAPTER(name)                                                            \
    {                                                                        \
        (void)o;                                                             \
        cxl_stub *s = fresh_stub();                                          \
        cxl_status st = call;                                                \
        cxl_stub_free(s);                                                    \
        return st;                                                           \
    }
STUB_SETTER(stub_set_fixture, cxl_stub_set_fixture(P(0, s), a[0], a[1]))
STUB_SETTER(stub_set_tolerances, cxl_stub_set_tolerances(P(0, s), a[0], a[1]))
STUB_SETTER(stub_set_vf_range, cxl_stub_set_vf_range(P(0, s), a[0], a[1]))
STUB_SETTER(stub_set_consistency, cxl_stub_set_consistency(P(0, s), a[0]))
STUB_SETTER(stub_set_orders, cxl_stub_set_orders(P(0, s), (cxl_stub_orders)to_int(a[0])))
STUB_SETTER(stub_add_reading, cxl_stub_add_reading(P(0, s), a[0], a[1], to_int(a[2])))
ADAPTER(stub_infer_orders)
{
    int orders[3] = { (int)SENT, (int)SENT, (int)SENT };
    cxl_status st = cxl_stub_infer_orders(P(0, g_stub), P(1, orders), to_size(a[0]));
    for (int k = 0; k < 3; k++) o[k] = orders[k];
    return st;
}
NEW_ADAPTER(stub_fit, cxl_stub_result, cxl_stub_fit(P(0, g_stub), P(1, &h)), cxl_stub_result_free)
ADAPTER(stub_result_vf)
{
    (void)a;
    return cxl_stub_result_vf(P(0, g_res1), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(stub_result_vf_budget)
{
    (void)a;
    return cxl_stub_result_vf_budget(P(0, g_res1), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]));
}
ADAPTER(stub_result_fixture)
{
    (void)a;
    return cxl_stub_result_fixture(P(0, g_res2), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]));
}
FLAGS_ADAPTER(stub_result_flags, cxl_stub_result_flags(P(0, g_res1), P(1, &flags)))
ADAPTER(stub_result_vf_at)
{
    unsigned how = (unsigned)SENT;
    cxl_status st = cxl_stub_result_vf_at(P(0, g_res1), a[0], P(1, &o[0]), P(2, &o[1]),
                                          P(3, &how));
    o[2] = how;
    return st;
}
ADAPTER(stub_result_reading)
{
    int order = (int)SENT;
    cxl_status st = cxl_stub_result_reading(P(0, g_res1), to_size(a[0]), P(1, &o[0]),
                                            P(2, &o[1]), P(3, &order), P(4, &o[2]),
                                            P(5, &o[3]), P(6, &o[4]));
    o[5] = order;
    return st;
}


/* drift.c: a drift that was made must give finite coefficients and a
 * finite VF (or a refusal) at the low end of its range */
static void probe_drift(const cxl_drift *d, double *o)
{
    double v, e, lo, hi;
    ck_assert_int_eq(cxl_drift_coefficients(d, &o[1], &o[2]), CXL_OK);
    ck_assert_int_eq(cxl_drift_range(d, &lo, &hi), CXL_OK);
    ck_assert(isfinite(lo) && isfinite(hi) && lo <= hi);
    if (cxl_drift_vf(d, lo, &v, &e) == CXL_OK) { o[3] = v; o[4] = e; }
}
ADAPTER(drift_new)
{
    /* the arrays hold 2; n is only ever 2 or a bad value */
    double f[2] = { a[0], a[1] }, v[2] = { a[2], a[3] }, e[2] = { a[4], a[5] };
    cxl_drift *d = SENT_PTR;
    cxl_status st = cxl_drift_new(P(0, f), P(1, v), P(2, e), to_size(a[6]), P(3, &d));
    o[0] = ptr_out(d);
    if (st == CXL_OK) {
        probe_drift(d, o);
        cxl_drift_free(d);
    }
    return st;
}
ADAPTER(drift_new_stub)
{
    cxl_drift *d = SENT_PTR;
    cxl_status st = cxl_drift_new_stub(P(0, g_res1), a[0], P(1, &d));
    o[0] = ptr_out(d);
    if (st == CXL_OK) {
        probe_drift(d, o);
        cxl_drift_free(d);
    }
    return st;
}
ADAPTER(drift_coefficients)
{
    (void)a;
    return cxl_drift_coefficients(P(0, g_drift), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(drift_range)
{
    (void)a;
    return cxl_drift_range(P(0, g_drift), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(drift_vf) { return cxl_drift_vf(P(0, g_drift), a[0], P(1, &o[0]), P(2, &o[1])); }
ADAPTER(drift_allowance) { return cxl_drift_allowance(a[0], a[1], P(0, &o[0]), P(1, &o[1])); }


/* trim.c: a 30 m piece, open end, read at its first three resonances at
 * VF 0.66 with a 1 kHz step, trimmed to 90 degrees at 1.83 MHz */
double trim_reading_hz(int order)
{
    return (2 * order - 1) / 4.0 * 0.66 * CXL_C_M_PER_S / TRIM_LEN;
}
cxl_trim *fresh_trim(int readings, int target)
{
    cxl_trim *t = NULL;
    ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, TRIM_LEN, &t), CXL_OK);
    ck_assert_int_eq(cxl_trim_set_resolution(t, 1e3), CXL_OK);
    for (int n = 1; n <= readings; n++)
        ck_assert_int_eq(cxl_trim_add_reading(t, trim_reading_hz(n), n), CXL_OK);
    if (target) ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    return t;
}
/* A trim whose setter accepted a value must solve to finite numbers or be
 * refused by the solver. */
static void probe_trim(const cxl_trim *t, double *o)
{
    cxl_trim_result *r = NULL;
    if (cxl_trim_solve(t, &r) != CXL_OK) return;
    double f, v, e, res;
    int order;
    cxl_trim_action act;
    ck_assert_int_eq(cxl_trim_result_cut(r, &o[0], &o[1], &o[2], &act), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_vf(r, &o[3], &o[4], &o[5]), CXL_OK);
    ck_assert(act == CXL_TRIM_CUT || act == CXL_TRIM_WITHIN || act == CXL_TRIM_SHORT);
    o[6] = o[7] = o[8] = o[9] = 0.0;
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        ck_assert_int_eq(cxl_trim_result_reading(r, i, &f, &order, &v, &e, &res), CXL_OK);
        o[6] += f;
        o[7] += v;
        o[8] += e;
        o[9] += res;
    }
    cxl_trim_result_free(r);
}
ADAPTER(trim_new)
{
    cxl_trim *t = SENT_PTR;
    cxl_status st = cxl_trim_new((cxl_stub_end)to_int(a[0]), a[1], P(0, &t));
    o[10] = ptr_out(t);
    if (st == CXL_OK) {
        for (int n = 1; n <= 3; n++)
            ck_assert_int_eq(cxl_trim_add_reading(t, trim_reading_hz(n), n), CXL_OK);
        ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
        probe_trim(t, o);
        cxl_trim_free(t);
    }
    return st;
}
#define TRIM_SETTER(name, readings, target, call)                            \
    ADAPTER(name)                                                            \
    {                                                                        \
        cxl_trim *t = fresh_trim(readings, target);                          \
        cxl_status st = call;                                                \
        if (st == CXL_OK) probe_trim(t, o);                                  \
        cxl_trim_free(t);                                                    \
        return st;                                                           \
    }
TRIM_SETTER(trim_set_fixture, 3, 1, cxl_trim_set_fixture(P(0, t), a[0], a[1], a[2]))
TRIM_SETTER(trim_set_model, 3, 1, ((void)a, cxl_trim_set_model(P(0, t), P(1, g_model))))
TRIM_SETTER(trim_set_resolution, 3, 1, cxl_trim_set_resolution(P(0, t), a[0]))
TRIM_SETTER(trim_set_reading, 3, 1,
            cxl_trim_set_reading(P(0, t), (cxl_dip_kind)to_int(a[0]), a[1]))
TRIM_SETTER(trim_set_allowance, 3, 1, cxl_trim_set_allowance(P(0, t), a[0], a[1]))
TRIM_SETTER(trim_set_allowance_1, 1, 1, cxl_trim_set_allowance(P(0, t), a[0], a[1]))
/* the same on a piece read once: no drift fit, the one reading's VF */
TRIM_SETTER(trim_set_fixture_1, 1, 1, cxl_trim_set_fixture(P(0, t), a[0], a[1], a[2]))
TRIM_SETTER(trim_set_resolution_1, 1, 1, cxl_trim_set_resolution(P(0, t), a[0]))
TRIM_SETTER(trim_target_delay_1, 1, 0, cxl_trim_target_delay(P(0, t), a[0], a[1]))
TRIM_SETTER(trim_add_reading, 3, 1, cxl_trim_add_reading(P(0, t), a[0], to_int(a[1])))
TRIM_SETTER(trim_target_degrees, 3, 0, cxl_trim_target_degrees(P(0, t), a[0], a[1]))
TRIM_SETTER(trim_target_delay, 3, 0, cxl_trim_target_delay(P(0, t), a[0], a[1]))
TRIM_SETTER(trim_target_resonance, 3, 0,
            cxl_trim_target_resonance(P(0, t), (cxl_stub_end)to_int(a[0]), to_int(a[1]), a[2]))
ADAPTER(trim_solve)
{
    (void)a;
    cxl_trim_result *r = SENT_PTR;
    cxl_status st = cxl_trim_solve(P(0, g_trim), P(1, &r));
    o[10] = ptr_out(r);
    if (st == CXL_OK) cxl_trim_result_free(r);
    return st;
}
ADAPTER(trim_result_cut)
{
    (void)a;
    cxl_trim_action act = (cxl_trim_action)SENT;
    cxl_status st = cxl_trim_result_cut(P(0, g_trim_res), P(1, &o[0]), P(2, &o[1]),
                                        P(3, &o[2]), P(4, &act));
    o[3] = (double)act;
    return st;
}
ADAPTER(trim_result_vf)
{
    (void)a;
    return cxl_trim_result_vf(P(0, g_trim_res), P(1, &o[0]), P(2, &o[1]), P(3, &o[2]));
}
FLAGS_ADAPTER(trim_result_flags, cxl_trim_result_flags(P(0, g_trim_res), P(1, &flags)))
ADAPTER(trim_result_reading)
{
    int order = (int)SENT;
    cxl_status st = cxl_trim_result_reading(P(0, g_trim_res), to_size(a[0]), P(1, &o[0]),
                                            P(2, &order), P(3, &o[1]), P(4, &o[2]),
                                            P(5, &o[3]));
    o[4] = order;
    return st;
}

/* handles reused row after row: reset, an empty result, a refit into it */
STUB_SETTER(stub_reset, cxl_stub_reset(P(0, s), (cxl_stub_end)to_int(a[0])))
NEW_ADAPTER(stub_result_new, cxl_stub_result, cxl_stub_result_new(P(0, &h)), cxl_stub_result_free)
INTO_ADAPTER(stub_fit_into, cxl_stub_result, cxl_stub_fit_into(P(0, g_stub), P(1, r)),
             cxl_stub_result_vf(r, &o[0], NULL))
TRIM_SETTER(trim_reset, 3, 1, cxl_trim_reset(P(0, t), (cxl_stub_end)to_int(a[0]), a[1]))
NEW_ADAPTER(trim_result_new, cxl_trim_result, cxl_trim_result_new(P(0, &h)), cxl_trim_result_free)
INTO_ADAPTER(trim_solve_into, cxl_trim_result, cxl_trim_solve_into(P(0, g_trim), P(1, r)),
             cxl_trim_result_cut(r, &o[0], NULL, NULL, NULL))
