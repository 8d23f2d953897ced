/* check_api_yield.c - the walk's adapters for yield.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* yield.c: setters on a fresh plan, the run on g_yield and g_array */
NEW_ADAPTER(yield_new, cxl_yield, cxl_yield_new(P(0, &h)), cxl_yield_free)
#define YIELD_SETTER(name, call)                                             \
    ADAPTER(name)                                                            \
    {                                                                        \
        cxl_yield *p = NULL;                                                 \
        ck_assert_int_eq(cxl_yield_new(&p), CXL_OK);                         \
        cxl_status st = call;                                                \
        if (st == CXL_OK) o[0] = 0.0;                                        \
        cxl_yield_free(p);                                                   \
        return st;                                                           \
    }
YIELD_SETTER(yield_set_tolerances, cxl_yield_set_tolerances(P(0, p), a[0], a[1], a[2], a[3]))
YIELD_SETTER(yield_set_goal_front_to_back, cxl_yield_set_goal_front_to_back(P(0, p), a[0]))
YIELD_SETTER(yield_set_goal_null, cxl_yield_set_goal_null(P(0, p), a[0]))
YIELD_SETTER(yield_set_run, cxl_yield_set_run(P(0, p), to_size(a[0]),
                                              a[1] >= 4294967295.0 ? 4294967295UL : (unsigned long)a[1],
                                              to_uint(a[2])))
ADAPTER(yield_eval)
{
    return cxl_yield_eval(P(0, g_yield), P(1, g_array), a[0], a[1], P(2, &o[0]), P(3, &o[1]),
                          P(4, &o[2]), P(5, &o[3]), P(6, &o[4]), P(7, &o[5]));
}

