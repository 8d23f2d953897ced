/* check_api_array.c - the walk's adapters for array.c, budget.c and hybrid.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* array.c */
NEW_ADAPTER(pair_new, cxl_duo, cxl_duo_new(P(0, &h)), cxl_duo_free)
NEW_ADAPTER(pair_copy, cxl_duo, cxl_duo_copy(P(0, g_pair), P(1, &h)),
            cxl_duo_free)
/* Setters work on a copy of g_pair; an accepted value must leave a pair
 * whose forward response is finite or refused. */
static cxl_duo *fresh_pair(void)
{
    cxl_duo *p = NULL;
    ck_assert_int_eq(cxl_duo_copy(g_pair, &p), CXL_OK);
    return p;
}
static void probe_pair(const cxl_duo *p, double *o)
{
    double r;
    if (cxl_duo_response(p, 1.83e6, 0.0, 15.0, &r) == CXL_OK) o[0] = r;
}
#define PAIR_SETTER(name, call)                                              \
    ADAPTER(name)                                                            \
    {                                                                        \
        cxl_duo *p = fresh_pair();                                    \
        cxl_status st = call;                                                \
        if (st == CXL_OK) probe_pair(p, o);                                  \
        cxl_duo_free(p);                                              \
        return st;                                                           \
    }
PAIR_SETTER(pair_set_geometry, cxl_duo_set_geometry(P(0, p), a[0], a[1]))
PAIR_SETTER(pair_set_delay, cxl_duo_set_delay(P(0, p), to_int(a[0]), a[1]))
PAIR_SETTER(pair_set_delay_deg,
            cxl_duo_set_delay_deg(P(0, p), to_int(a[0]), a[1], a[2]))
PAIR_SETTER(pair_set_phase_offset,
            cxl_duo_set_phase_offset(P(0, p), to_int(a[0]), a[1]))
PAIR_SETTER(pair_set_flip, cxl_duo_set_flip(P(0, p), to_int(a[0]), to_int(a[1])))
PAIR_SETTER(pair_set_imbalance, cxl_duo_set_imbalance(P(0, p), a[0]))
PAIR_SETTER(pair_set_isotropic, ((void)a, cxl_duo_set_isotropic(P(0, p))))
PAIR_SETTER(pair_set_long_wire, cxl_duo_set_long_wire(P(0, p), a[0], a[1]))

/* design feed of a pair staggered 20 m, read back */
ADAPTER(pair_set_feed)
{
    cxl_duo *p = fresh_pair();
    ck_assert_int_eq(cxl_duo_set_geometry(p, 0.0, 20.0), CXL_OK);
    cxl_status st = cxl_duo_set_feed(P(0, p), (cxl_feed)to_int(a[0]), a[1]);
    for (int k = 0; k < 2 && st == CXL_OK; k++) {
        int flip = -1;
        ck_assert_int_eq(cxl_duo_feed(p, k, &o[2 * k], &flip), CXL_OK);
        o[2 * k + 1] = flip;
    }
    cxl_duo_free(p);
    return st;
}
ADAPTER(pair_feed)
{
    int flip = (int)SENT;
    cxl_status st = cxl_duo_feed(P(0, g_pair), to_int(a[0]), P(1, &o[0]), P(2, &flip));
    o[1] = flip;
    return st;
}
ADAPTER(pair_built_phase)
{
    double design[2] = { a[0], a[1] }, built[2] = { a[2], a[3] };
    return cxl_duo_built_phase(P(0, design), P(1, built), a[4], a[5], P(2, &o[0]));
}

ADAPTER(array_field)
{
    return cxl_duo_field(P(0, g_pair), a[0], a[1], a[2], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(array_response)
{
    return cxl_duo_response(P(0, g_pair), a[0], a[1], a[2], P(1, &o[0]));
}
ADAPTER(array_gain) { return cxl_duo_gain(P(0, g_pair), a[0], a[1], a[2], P(1, &o[0])); }
ADAPTER(array_forward_gain)
{
    return cxl_duo_forward_gain(P(0, g_pair), a[0], a[1], P(1, &o[0]));
}
ADAPTER(array_pattern)
{
    /* the output array holds 4; n is only ever 4 or a bad value */
    return cxl_duo_pattern(P(0, g_pair), a[0], a[1], to_size(a[2]), P(1, &o[0]));
}
ADAPTER(array_front_to_back)
{
    return cxl_duo_front_to_back(P(0, g_pair), a[0], a[1], P(1, &o[0]));
}
ADAPTER(array_rear_null)
{
    return cxl_duo_rear_null(P(0, g_pair), a[0], a[1], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(array_peak) { return cxl_duo_peak(P(0, g_pair), a[0], P(1, &o[0]), P(2, &o[1])); }
ADAPTER(array_directivity) { return cxl_duo_directivity(P(0, g_pair), a[0], P(1, &o[0])); }
ADAPTER(array_rdf) { return cxl_duo_rdf(P(0, g_pair), a[0], P(1, &o[0])); }
ADAPTER(array_null_depth) { return cxl_duo_null_depth(a[0], a[1], P(0, &o[0])); }


/* array.c: the N-element array */
NEW_ADAPTER(array_new, cxl_array, cxl_array_new(P(0, &h)), cxl_array_free)
NEW_ADAPTER(array_copy, cxl_array, cxl_array_copy(P(0, g_array), P(1, &h)), cxl_array_free)
/* Setters work on a copy of g_array; an accepted value must leave an
 * array whose response is finite or refused. */
static cxl_array *fresh_array(void)
{
    cxl_array *p = NULL;
    ck_assert_int_eq(cxl_array_copy(g_array, &p), CXL_OK);
    return p;
}
static void probe_array(const cxl_array *p, double *o)
{
    double r;
    if (cxl_array_eval_response(p, 1.83e6, 0.0, 15.0, &r) == CXL_OK) o[0] = r;
}
#define ARRAY_SETTER(name, call)                                             \
    ADAPTER(name)                                                            \
    {                                                                        \
        cxl_array *p = fresh_array();                                        \
        cxl_status st = call;                                                \
        if (st == CXL_OK) probe_array(p, o);                                 \
        cxl_array_free(p);                                                   \
        return st;                                                           \
    }
ARRAY_SETTER(array_add, ((void)0, cxl_array_add(P(0, p), a[0], a[1], a[2], &(size_t){ 0 })))
ARRAY_SETTER(array_set_position, cxl_array_set_position(P(0, p), to_size(a[0]), a[1], a[2], a[3]))
ARRAY_SETTER(array_set_delay, cxl_array_set_delay(P(0, p), to_size(a[0]), a[1]))
ARRAY_SETTER(array_set_line, cxl_array_set_line(P(0, p), to_size(a[0]), a[1], a[2]))
ARRAY_SETTER(array_set_line_model,
             cxl_array_set_line_model(P(0, p), to_size(a[0]), a[1], P(1, g_model)))
ARRAY_SETTER(array_set_reversed, cxl_array_set_reversed(P(0, p), to_size(a[0]), to_int(a[1])))
ARRAY_SETTER(array_set_weight, cxl_array_set_weight(P(0, p), to_size(a[0]), a[1]))
ARRAY_SETTER(array_set_phase_offset, cxl_array_set_phase_offset(P(0, p), to_size(a[0]), a[1]))
ARRAY_SETTER(array_set_element,
             cxl_array_set_element(P(0, p), (cxl_element_kind)to_int(a[0]), a[1], a[2]))
ADAPTER(array_max_freq)
{
    (void)a;
    return cxl_array_max_freq(P(0, g_array), P(1, &o[0]));
}
ADAPTER(array_eval_field)
{
    return cxl_array_eval_field(P(0, g_array), a[0], a[1], a[2], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(array_eval_response)
{
    return cxl_array_eval_response(P(0, g_array), a[0], a[1], a[2], P(1, &o[0]));
}
ADAPTER(array_eval_gain)
{
    return cxl_array_eval_gain(P(0, g_array), a[0], a[1], a[2], P(1, &o[0]));
}
ADAPTER(array_eval_pattern)
{
    /* the output array holds 4; n is only ever 4 or a bad value */
    return cxl_array_eval_pattern(P(0, g_array), a[0], a[1], to_size(a[2]), P(1, &o[0]));
}
ADAPTER(array_eval_front_to_back)
{
    return cxl_array_eval_front_to_back(P(0, g_array), a[0], a[1], P(1, &o[0]));
}
ADAPTER(array_eval_rear_null)
{
    return cxl_array_eval_rear_null(P(0, g_array), a[0], a[1], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(array_eval_beamwidth)
{
    return cxl_array_eval_beamwidth(P(0, g_array), a[0], a[1], P(1, &o[0]));
}
ADAPTER(array_eval_peak)
{
    return cxl_array_eval_peak(P(0, g_array), a[0], P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(array_eval_directivity)
{
    return cxl_array_eval_directivity(P(0, g_array), a[0], P(1, &o[0]));
}
ADAPTER(array_eval_rdf)
{
    return cxl_array_eval_rdf(P(0, g_array), a[0], a[1], P(1, &o[0]), P(2, &o[1]));
}


/* budget.c */
ADAPTER(budget_phase_for_null)
{
    return cxl_budget_phase_for_null(a[0], a[1], P(0, &o[0]));
}
ADAPTER(budget_phase_for_front_to_back)
{
    return cxl_budget_phase_for_front_to_back(P(0, g_pair), a[0], a[1], a[2], P(1, &o[0]));
}
ADAPTER(budget_phase_for_rear_null)
{
    return cxl_budget_phase_for_rear_null(P(0, g_pair), a[0], a[1], a[2], P(1, &o[0]));
}
ADAPTER(budget_length_for_phase)
{
    return cxl_budget_length_for_phase(a[0], a[1], a[2], P(0, &o[0]));
}


/* hybrid.c */
ADAPTER(hybrid_inphase) { return cxl_hybrid_inphase(a[0], P(0, &o[0]), P(1, &o[1])); }
ADAPTER(hybrid_turns_ratio) { return cxl_hybrid_turns_ratio(a[0], a[1], P(0, &o[0])); }
ADAPTER(hybrid_match)
{
    return cxl_hybrid_match(a[0], a[1], to_uint(a[2]), to_uint(a[3]), P(0, &o[0]),
                            P(1, &o[1]), P(2, &o[2]));
}
ADAPTER(hybrid_turns_search)
{
    /* the arrays hold 4; capacity is only ever 4 or a bad value */
    unsigned p[4], q[4];
    size_t n = (size_t)SENT;
    for (int k = 0; k < 4; k++) p[k] = q[k] = (unsigned)SENT;
    cxl_status st = cxl_hybrid_turns_search(a[0], a[1], to_uint(a[2]), to_size(a[3]),
                                            P(0, p), P(1, q), P(2, &n));
    for (int k = 0; k < 4; k++) { o[k] = p[k]; o[4 + k] = q[k]; }
    o[8] = (double)n;
    return st;
}
ADAPTER(hybrid_response)
{
    return cxl_hybrid_response(a[0], a[1], a[2], a[3], P(0, &o[0]), P(1, &o[1]));
}
