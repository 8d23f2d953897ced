/* hybrid.c - 0-degree (in-phase) two-way combiner: resistor and common-port
 * values, the transformer that steps the common port back to the line
 * impedance (best small-integer turns), and what a single active input and
 * a mismatched idle port do in the ideal S-matrix model. */
#include <config.h>
#include <math.h>
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include <gsl/gsl_math.h>
#include "coaxline.h"
#include "internal.h"

cxl_status cxl_hybrid_inphase(double z_port_ohm, double *isolation_ohm,
                              double *common_ohm)
{
    if (!isolation_ohm || !common_ohm || !cxl__finite_pos(z_port_ohm))
        return CXL_EINVAL;
    if (!isfinite(2.0 * z_port_ohm) || !(0.5 * z_port_ohm > 0.0))
        return CXL_ERANGE; /* 2 Z overflows or Z / 2 underflows */
    *isolation_ohm = 2.0 * z_port_ohm;
    *common_ohm = 0.5 * z_port_ohm;
    return CXL_OK;
}

cxl_status cxl_hybrid_turns_ratio(double z_from_ohm, double z_to_ohm,
                                  double *turns_ratio)
{
    if (!turns_ratio || !cxl__finite_pos(z_from_ohm) ||
        !cxl__finite_pos(z_to_ohm))
        return CXL_EINVAL;
    double r = sqrt(z_to_ohm / z_from_ohm);
    if (!isfinite(r) || !(r > 0.0))
        return CXL_ERANGE;
    *turns_ratio = r;
    return CXL_OK;
}

/* |Gamma| of z_ohm against z_ref_ohm (both > 0). */
static double reflection(double z_ohm, double z_ref_ohm)
{
    return fabs((z_ohm - z_ref_ohm) / (z_ohm + z_ref_ohm));
}

static double presented(double z_common_ohm, unsigned p, unsigned q)
{
    double r = (double)q / (double)p;
    return z_common_ohm * r * r;
}

cxl_status cxl_hybrid_match(double z_common_ohm, double z_line_ohm,
                            unsigned p_turns, unsigned q_turns,
                            double *z_presented_ohm, double *swr,
                            double *return_loss_db)
{
    if (!z_presented_ohm || !swr || !return_loss_db ||
        !cxl__finite_pos(z_common_ohm) || !cxl__finite_pos(z_line_ohm) ||
        p_turns == 0 || q_turns == 0)
        return CXL_EINVAL;
    double zx = presented(z_common_ohm, p_turns, q_turns);
    if (!isfinite(zx) || !(zx > 0.0))
        return CXL_ERANGE;
    double g = reflection(zx, z_line_ohm);
    if (!(g < 1.0))
        return CXL_ERANGE;   /* so far off that SWR overflows */
    *z_presented_ohm = zx;
    *swr = (1.0 + g) / (1.0 - g);
    *return_loss_db = -cxl__power_db(g * g);
    return CXL_OK;
}

static unsigned gcd(unsigned a, unsigned b)
{
    while (b) {
        unsigned t = a % b;
        a = b;
        b = t;
    }
    return a;
}

/* Does p:q rank before the pair with reflection g_other and turns po:qo? */
static int ranks_before(double g, unsigned p, unsigned q, double g_other,
                        unsigned po, unsigned qo)
{
    if (fabs(g - g_other) > 1e-12)
        return g < g_other;
    if (p + q != po + qo)
        return p + q < po + qo;
    return p < po;
}

/* The best pairs found so far, sorted, in the caller's arrays. */
typedef struct turns_list {
    double z_common, z_line;
    unsigned *p, *q;
    size_t n, capacity;
} turns_list;

/* Places the pair p:q (reflection g) in the sorted list, keeping at most
 * its capacity. */
static void turns_insert(turns_list *t, unsigned p, unsigned q, double g)
{
    size_t pos = t->n;
    while (pos > 0) {
        unsigned po = t->p[pos - 1], qo = t->q[pos - 1];
        double go = reflection(presented(t->z_common, po, qo), t->z_line);
        if (!ranks_before(g, p, q, go, po, qo))
            break;
        pos--;
    }
    if (pos >= t->capacity)
        return;
    size_t last = t->n < t->capacity ? t->n : t->capacity - 1;
    for (size_t i = last; i > pos; i--) {
        t->p[i] = t->p[i - 1];
        t->q[i] = t->q[i - 1];
    }
    t->p[pos] = p;
    t->q[pos] = q;
    if (t->n < t->capacity)
        t->n++;
}

cxl_status cxl_hybrid_turns_search(double z_common_ohm, double z_line_ohm,
                                   unsigned max_turns, size_t capacity,
                                   unsigned *p_turns, unsigned *q_turns,
                                   size_t *count)
{
    if (!p_turns || !q_turns || !count || capacity == 0 ||
        !cxl__finite_pos(z_common_ohm) || !cxl__finite_pos(z_line_ohm) ||
        max_turns == 0)
        return CXL_EINVAL;
    if (max_turns > 256)
        return CXL_ERANGE;
    /* Keep the best `capacity` pairs sorted in the caller's arrays. */
    turns_list t = { z_common_ohm, z_line_ohm, p_turns, q_turns, 0, capacity };
    for (unsigned p = 1; p <= max_turns; p++) {
        for (unsigned q = 1; q <= max_turns; q++) {
            if (gcd(p, q) != 1)
                continue;   /* same ratio as a pair with fewer turns */
            double g = reflection(presented(z_common_ohm, p, q), z_line_ohm);
            if (isfinite(g))
                turns_insert(&t, p, q, g);
        }
    }
    *count = t.n;
    return CXL_OK;
}

static int valid_gamma(double re, double im)
{
    return isfinite(re) && isfinite(im) && hypot(re, im) <= 1.0 + 1e-12;
}

cxl_status cxl_hybrid_response(double gamma_common_re,
                               double gamma_common_im,
                               double gamma_idle_re, double gamma_idle_im,
                               double *common_db, double *isolation_db)
{
    if (!common_db || !isolation_db ||
        !valid_gamma(gamma_common_re, gamma_common_im) ||
        !valid_gamma(gamma_idle_re, gamma_idle_im))
        return CXL_EINVAL;
    const double s = M_SQRT1_2;
    gsl_complex gc = gsl_complex_rect(gamma_common_re, gamma_common_im);
    gsl_complex gi = gsl_complex_rect(gamma_idle_re, gamma_idle_im);
    /* a2 = 1; a1 = Gc b1; a3 = Gi b3; b1 = s (a2 + a3); b3 = s a1. */
    gsl_complex loop = gsl_complex_mul_real(gsl_complex_mul(gc, gi), s * s);
    gsl_complex den = gsl_complex_sub(gsl_complex_rect(1.0, 0.0), loop);
    /* |loop| <= 1/2 for passive loads, so den never vanishes. */
    gsl_complex b1 = gsl_complex_div(gsl_complex_rect(s, 0.0), den);
    gsl_complex b3 = gsl_complex_mul_real(gsl_complex_mul(gc, b1), s);
    double gc2 = gsl_complex_abs2(gc);
    *common_db = cxl__power_db(gsl_complex_abs2(b1) * fmax(1.0 - gc2, 0.0));
    *isolation_db = -cxl__power_db(gsl_complex_abs2(b3));
    return CXL_OK;
}
