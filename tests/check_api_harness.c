/* check_api_harness.c - the walk's adapters for harness.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

NEW_ADAPTER(harness_new, cxl_harness, cxl_harness_new(a[0], P(0, &h)), cxl_harness_free)
/* Setters work on a new harness like g_harness; an accepted value must
 * leave a harness whose plan is finite or refused. */
static cxl_harness *fresh_harness(void)
{
    cxl_harness *p = NULL;
    ck_assert_int_eq(cxl_harness_new(0.66, &p), CXL_OK);
    ck_assert_int_eq(cxl_harness_add_element(p, 10.0, 0.0, 50e-9, NULL), CXL_OK);
    ck_assert_int_eq(cxl_harness_add_element(p, -10.0, 0.0, 0.0, NULL), CXL_OK);
    ck_assert_int_eq(cxl_harness_set_cuts(p, 1.0, 0.05, 0.003), CXL_OK);
    ck_assert_int_eq(cxl_harness_add_drum(p, 100.0, NULL), CXL_OK);
    return p;
}
static void probe_harness(cxl_harness *p, double *o)
{
    size_t el, drum;
    cxl_piece_kind kind;
    double len, f;
    cxl_status st = cxl_harness_plan(p);
    if ((st == CXL_OK || st == CXL_ERANGE) &&
        cxl_harness_piece(p, 0, &el, &kind, &len, &f, &drum) == CXL_OK)
        o[0] = len + f;
}
#define HARNESS_SETTER(name, call)                                           \
    ADAPTER(name)                                                            \
    {                                                                        \
        cxl_harness *p = fresh_harness();                                    \
        cxl_status st = call;                                                \
        if (st == CXL_OK) probe_harness(p, o);                               \
        cxl_harness_free(p);                                                 \
        return st;                                                           \
    }
HARNESS_SETTER(harness_add_element,
               cxl_harness_add_element(P(0, p), a[0], a[1], a[2], P(1, &(size_t){ 0 })))
HARNESS_SETTER(harness_set_combiner, cxl_harness_set_combiner(P(0, p), a[0], a[1]))
HARNESS_SETTER(harness_set_cuts, cxl_harness_set_cuts(P(0, p), a[0], a[1], a[2]))
HARNESS_SETTER(harness_add_drum, cxl_harness_add_drum(P(0, p), a[0], P(1, &(size_t){ 0 })))
HARNESS_SETTER(harness_plan, ((void)a, cxl_harness_plan(P(0, p))))
ADAPTER(harness_piece)
{
    size_t el = 0, drum = 0;
    cxl_piece_kind kind = CXL_PIECE_FEED;
    double len = SENT, f = SENT;
    cxl_status st = cxl_harness_piece(P(0, g_harness), to_size(a[0]), P(1, &el), P(2, &kind),
                                      P(3, &len), P(4, &f), P(5, &drum));
    if (st == CXL_OK) {
        o[0] = (double)el;
        o[1] = (double)kind;
        o[2] = len;
        o[3] = f;
        o[4] = (double)drum;
    }
    return st;
}
ADAPTER(harness_feed_run)
{
    (void)a;
    return cxl_harness_feed_run(P(0, g_harness), P(1, &o[0]), P(2, &o[1]));
}
ADAPTER(harness_drum)
{
    return cxl_harness_drum(P(0, g_harness), to_size(a[0]), P(1, &o[0]), P(2, &o[1]));
}

