/* stub.c - velocity factor from the series resonances of a cable stub.
 *
 * A line of physical length L and velocity factor VF, open at the far end,
 * shows a low impedance at its input where it is an odd number of quarter
 * waves long; shorted, where it is a whole number of half waves:
 *     k_n = (2n - 1)/4 (open)   or   k_n = n/2 (shorted)   wavelengths,
 * so at the n-th resonance f_n
 *     k_n c / f_n = L / VF + Lf / VFf + x                                (1)
 * with Lf/VFf the free-space equivalent of a known fixture (tees, adapters,
 * the analyzer's port extension) and x any fixture length not accounted
 * for.  Each reading is one equation y_i = k_i c / f_i - Lf/VFf = a L_i + x
 * in the unknowns a = 1/VF and x, solved by weighted least squares.
 *
 * On ONE physical length the right-hand side of (1) is the same for every
 * order, so the columns L_i and 1 are proportional and a cannot be told
 * from x: higher orders then only average the one electrical length more
 * finely.  x is fitted only when the readings were taken on two or more
 * lengths (the same cable measured, trimmed by a known amount, measured
 * again); otherwise x = 0 and VF carries everything unaccounted for.
 *
 * Weights: a frequency step df moves y_i by y_i df / f_i, so a reading's
 * length error shrinks with its order; the weights 1/(y_i df/f_i)^2 let the
 * sharper higher resonances count more.  Without df the weights are equal.
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_multifit.h>
#include "coaxline.h"
#include "internal.h"

#define DEFAULT_VF_MIN 0.5
#define DEFAULT_VF_MAX 1.0
#define DEFAULT_CONSISTENCY 0.02 /* relative; common practice, no source */

typedef struct reading {
    double length_m, freq_hz;
    int order; /* 0 = not given */
} reading;

struct cxl_stub {
    cxl_stub_end end;
    double fixture_free_m;            /* Lf / VFf */
    double length_tol_m, freq_res_hz;
    double vf_min, vf_max, consistency;
    cxl_stub_orders rule;
    reading *r;
    size_t n, cap;
};

struct cxl_stub_result {
    size_t n;
    double *length_m, *freq_hz, *vf, *res_hz, *res_m;
    int *order;
    double vf_fit, err_fit, err_length, err_freq;
    double x_m, x_err_m;
    double freq_res_hz, length_tol_m; /* for cxl_stub_result_vf_at */
    unsigned flags;
    /* kept across cxl_stub_fit_into calls: room for cap readings in the
     * arrays above, the fit's workspace and its integer scratch (4 cap:
     * orders, a group's orders, a trial, done marks) and index scratch */
    size_t cap;
    cxl__fitws ws;
    int *iscratch;
    size_t *zscratch;
};

/* Wavelengths of line at the order-th series resonance. */
static double k_of(cxl_stub_end end, int order)
{
    return end == CXL_STUB_OPEN ? (2.0 * order - 1.0) / 4.0 : order / 2.0;
}

/* Smallest order whose k is at least k_min (never below 1). */
static long first_order_at_least(cxl_stub_end end, double k_min)
{
    double n = end == CXL_STUB_OPEN ? ceil((4.0 * k_min + 1.0) / 2.0) : ceil(2.0 * k_min);
    if (!(n >= 1.0)) n = 1.0;
    if (n > CXL_STUB_MAX_ORDER + 1.0) n = CXL_STUB_MAX_ORDER + 1.0;
    return (long)n;
}

/* Order whose k is nearest to k (at least 1). */
static long nearest_order(cxl_stub_end end, double k)
{
    double n = end == CXL_STUB_OPEN ? floor((4.0 * k + 1.0) / 2.0 + 0.5) : floor(2.0 * k + 0.5);
    if (!(n >= 1.0)) n = 1.0;
    if (n > CXL_STUB_MAX_ORDER + 1.0) n = CXL_STUB_MAX_ORDER + 1.0;
    return (long)n;
}

static int valid_end(cxl_stub_end end)
{
    return end == CXL_STUB_OPEN || end == CXL_STUB_SHORT;
}

static int valid_fixture(double fixture_m, double fixture_vf)
{
    return cxl__finite_nonneg(fixture_m) && (fixture_m == 0.0 || cxl__valid_vf(fixture_vf));
}

cxl_status cxl_stub_wavelengths(cxl_stub_end end, int order, double *wavelengths)
{
    if (!wavelengths || !valid_end(end) || order < 1) return CXL_EINVAL;
    if (order > CXL_STUB_MAX_ORDER) return CXL_ERANGE;
    *wavelengths = k_of(end, order);
    return CXL_OK;
}

cxl_status cxl_stub_vf_from_resonance(cxl_stub_end end, int order,
                                      double length_m, double freq_hz,
                                      double fixture_m, double fixture_vf,
                                      double *vf)
{
    if (!vf || !valid_end(end) || order < 1 || !cxl__finite_pos(length_m) ||
        !cxl__finite_pos(freq_hz) || !valid_fixture(fixture_m, fixture_vf))
        return CXL_EINVAL;
    if (order > CXL_STUB_MAX_ORDER) return CXL_ERANGE;
    double cable_free_m = k_of(end, order) * CXL_C_M_PER_S / freq_hz;
    if (fixture_m > 0.0) cable_free_m -= fixture_m / fixture_vf;
    if (!(cable_free_m > 0.0)) return CXL_ERANGE; /* fixture alone is longer */
    double v = length_m / cable_free_m;
    if (!(v <= 1.0)) return CXL_ERANGE; /* faster than light: wrong order or length */
    *vf = v;
    return CXL_OK;
}

cxl_status cxl_stub_resonance_freq(cxl_stub_end end, int order,
                                   double length_m, double vf,
                                   double fixture_m, double fixture_vf,
                                   double *freq_hz)
{
    if (!freq_hz || !valid_end(end) || order < 1 || !cxl__finite_pos(length_m) ||
        !cxl__valid_vf(vf) || !valid_fixture(fixture_m, fixture_vf))
        return CXL_EINVAL;
    if (order > CXL_STUB_MAX_ORDER) return CXL_ERANGE;
    double free_m = length_m / vf;
    if (fixture_m > 0.0) free_m += fixture_m / fixture_vf;
    /* a subnormal length overflows the quotient: CXL_ERANGE, not inf */
    return cxl__put_finite(k_of(end, order) * CXL_C_M_PER_S / free_m, freq_hz);
}

/* ---- the measurement set -------------------------------------------- */

cxl_status cxl_stub_new(cxl_stub_end end, cxl_stub **stub)
{
    if (!stub || !valid_end(end)) return CXL_EINVAL;
    cxl_stub *s = calloc(1, sizeof *s);
    if (!s) return CXL_ENOMEM;
    cxl_stub_reset(s, end); /* the defaults, in one place */
    *stub = s;
    return CXL_OK;
}

cxl_status cxl_stub_reset(cxl_stub *stub, cxl_stub_end end)
{
    if (!stub || !valid_end(end)) return CXL_EINVAL;
    reading *r = stub->r;
    size_t cap = stub->cap;
    memset(stub, 0, sizeof *stub);
    stub->r = r;
    stub->cap = cap;
    stub->end = end;
    stub->vf_min = DEFAULT_VF_MIN;
    stub->vf_max = DEFAULT_VF_MAX;
    stub->consistency = DEFAULT_CONSISTENCY;
    stub->rule = CXL_STUB_ORDERS_CONSECUTIVE;
    return CXL_OK;
}

void cxl_stub_free(cxl_stub *stub)
{
    if (!stub) return;
    free(stub->r);
    free(stub);
}

cxl_status cxl_stub_set_fixture(cxl_stub *stub, double fixture_m, double fixture_vf)
{
    if (!stub || !valid_fixture(fixture_m, fixture_vf)) return CXL_EINVAL;
    stub->fixture_free_m = fixture_m > 0.0 ? fixture_m / fixture_vf : 0.0;
    return CXL_OK;
}

cxl_status cxl_stub_set_tolerances(cxl_stub *stub, double length_tol_m,
                                   double freq_res_hz)
{
    if (!stub || !cxl__finite_nonneg(length_tol_m) || !cxl__finite_nonneg(freq_res_hz))
        return CXL_EINVAL;
    stub->length_tol_m = length_tol_m;
    stub->freq_res_hz = freq_res_hz;
    return CXL_OK;
}

cxl_status cxl_stub_set_vf_range(cxl_stub *stub, double vf_min, double vf_max)
{
    if (!stub || !cxl__valid_vf(vf_min) || !cxl__valid_vf(vf_max) || !(vf_min < vf_max))
        return CXL_EINVAL;
    stub->vf_min = vf_min;
    stub->vf_max = vf_max;
    return CXL_OK;
}

cxl_status cxl_stub_set_consistency(cxl_stub *stub, double rel_tol)
{
    if (!stub || !cxl__finite_pos(rel_tol) || rel_tol > 0.5) return CXL_EINVAL;
    stub->consistency = rel_tol;
    return CXL_OK;
}

cxl_status cxl_stub_set_orders(cxl_stub *stub, cxl_stub_orders rule)
{
    if (!stub || (rule != CXL_STUB_ORDERS_CONSECUTIVE && rule != CXL_STUB_ORDERS_BEST_FIT))
        return CXL_EINVAL;
    stub->rule = rule;
    return CXL_OK;
}

/* Does a reading at (length_m, freq_hz, order) follow those before it:
 * orders on all or none, and on one length ascending frequency (and
 * order)? */
static int follows_readings(const cxl_stub *stub, double length_m, double freq_hz, int order)
{
    if (stub->n > 0 && (stub->r[0].order == 0) != (order == 0)) return 0;
    for (size_t i = 0; i < stub->n; i++) {
        const reading *p = &stub->r[i];
        if (p->length_m != length_m) continue;
        if (!(freq_hz > p->freq_hz)) return 0;
        if (order != 0 && order <= p->order) return 0;
    }
    return 1;
}

cxl_status cxl_stub_add_reading(cxl_stub *stub, double length_m, double freq_hz,
                                int order)
{
    if (!stub || !cxl__finite_pos(length_m) || !cxl__finite_pos(freq_hz) || order < 0)
        return CXL_EINVAL;
    if (order > CXL_STUB_MAX_ORDER) return CXL_ERANGE;
    if (!follows_readings(stub, length_m, freq_hz, order)) return CXL_EINVAL;
    if (stub->n == stub->cap) {
        size_t cap = stub->cap ? stub->cap * 2 : 8;
        reading *q = realloc(stub->r, cap * sizeof *q);
        if (!q) return CXL_ENOMEM;
        stub->r = q;
        stub->cap = cap;
    }
    stub->r[stub->n++] = (reading){ length_m, freq_hz, order };
    return CXL_OK;
}

size_t cxl_stub_count(const cxl_stub *stub)
{
    return stub ? stub->n : 0;
}

/* Free-space electrical length of the cable alone at reading i, order n. */
static double cable_free_m(const cxl_stub *s, size_t i, long n)
{
    return k_of(s->end, (int)n) * CXL_C_M_PER_S / s->r[i].freq_hz - s->fixture_free_m;
}

/* Is there an order (the given one, or any when none is given) for which
 * reading i implies a VF in the plausible range? */
static int reading_plausible(const cxl_stub *s, size_t i, int use_given)
{
    const reading *p = &s->r[i];
    if (use_given && p->order != 0) {
        double e = cable_free_m(s, i, p->order);
        return e > 0.0 && p->length_m / e >= s->vf_min && p->length_m / e <= s->vf_max;
    }
    /* VF falls as the order rises: the first order with a cable length of
     * at least L / vf_max is the only candidate worth testing */
    double k_min = p->freq_hz * (p->length_m / s->vf_max + s->fixture_free_m) / CXL_C_M_PER_S;
    long n = first_order_at_least(s->end, k_min);
    if (n > CXL_STUB_MAX_ORDER) return 0;
    double e = cable_free_m(s, i, n);
    return e > 0.0 && p->length_m / e >= s->vf_min * (1.0 - 1e-12);
}

/* Orders that fit one fundamental best for the readings on one length
 * (indices idx[0..m-1], ascending frequency).  Each order of the lowest
 * reading that gives a plausible VF proposes an electrical length E; the
 * others take the nearest order above the previous one; the proposal whose
 * worst relative departure from its mean length is smallest wins (the
 * lowest orders on a tie). */
static cxl_status best_fit_group(const cxl_stub *s, const size_t *idx, size_t m,
                                 int *orders, int *trial)
{
    double best_score = INFINITY;
    const reading *first = &s->r[idx[0]];
    double k_min = first->freq_hz * (first->length_m / s->vf_max + s->fixture_free_m) /
                   CXL_C_M_PER_S;
    for (long n1 = first_order_at_least(s->end, k_min); n1 <= CXL_STUB_MAX_ORDER; n1++) {
        double e1 = cable_free_m(s, idx[0], n1);
        if (!(e1 > 0.0) || first->length_m / e1 < s->vf_min) break;
        double total = k_of(s->end, (int)n1) * CXL_C_M_PER_S / first->freq_hz;
        trial[0] = (int)n1;
        int ok = 1;
        for (size_t j = 1; j < m && ok; j++) {
            long n = nearest_order(s->end, total * s->r[idx[j]].freq_hz / CXL_C_M_PER_S);
            if (n <= trial[j - 1]) n = trial[j - 1] + 1;
            if (n > CXL_STUB_MAX_ORDER) ok = 0;
            else trial[j] = (int)n;
        }
        if (!ok) break;
        double mean = 0.0, worst = 0.0;
        for (size_t j = 0; j < m; j++)
            mean += k_of(s->end, trial[j]) / s->r[idx[j]].freq_hz;
        mean /= (double)m;
        for (size_t j = 0; j < m; j++) {
            double d = fabs(k_of(s->end, trial[j]) / s->r[idx[j]].freq_hz - mean) / mean;
            if (d > worst) worst = d;
        }
        if (worst < best_score - 1e-12) {
            best_score = worst;
            memcpy(orders, trial, m * sizeof *orders);
        }
    }
    return isfinite(best_score) ? CXL_OK : CXL_ERANGE;
}

/* Orders of readings without given ones, length by length: the best
 * fit to one fundamental, or 1, 2, ... in ascending frequency. */
static cxl_status infer_groups(const cxl_stub *s, cxl_stub_orders rule, int *orders,
                               int *iscratch, size_t *idx)
{
    int *grp = iscratch, *trial = grp + s->n, *done = trial + s->n;
    memset(done, 0, s->n * sizeof *done);
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < s->n && st == CXL_OK; i++) {
        if (done[i]) continue;
        size_t m = 0; /* readings on this length, already ascending */
        for (size_t j = i; j < s->n; j++)
            if (s->r[j].length_m == s->r[i].length_m) { idx[m++] = j; done[j] = 1; }
        if (rule == CXL_STUB_ORDERS_BEST_FIT) {
            st = best_fit_group(s, idx, m, grp, trial);
        } else {
            for (size_t j = 0; j < m; j++) grp[j] = (int)(j + 1);
        }
        for (size_t j = 0; j < m && st == CXL_OK; j++) orders[idx[j]] = grp[j];
    }
    return st;
}

/* Orders for every reading under a rule, after checking that each reading
 * is plausible for some allowed order.  *assumed is set when the orders
 * were not given. */
static cxl_status assign_orders(const cxl_stub *s, cxl_stub_orders rule, int use_given,
                                int *orders, int *assumed, int *iscratch, size_t *idx)
{
    if (s->n == 0) return CXL_EINVAL;
    for (size_t i = 0; i < s->n; i++)
        if (!reading_plausible(s, i, use_given)) return CXL_ERANGE;
    *assumed = !(use_given && s->r[0].order != 0);
    if (*assumed) return infer_groups(s, rule, orders, iscratch, idx);
    for (size_t i = 0; i < s->n; i++) orders[i] = s->r[i].order;
    return CXL_OK;
}

cxl_status cxl_stub_implausible_reading(const cxl_stub *stub, size_t *index)
{
    if (!stub || !index || stub->n == 0) return CXL_EINVAL;
    for (size_t i = 0; i < stub->n; i++)
        if (!reading_plausible(stub, i, 1)) {
            *index = i;
            return CXL_OK;
        }
    return CXL_ENOTFOUND;
}

cxl_status cxl_stub_infer_orders(const cxl_stub *stub, int *orders, size_t count)
{
    if (!stub || !orders || count != stub->n || count == 0) return CXL_EINVAL;
    int *tmp = malloc(4 * count * sizeof *tmp), assumed;
    size_t *idx = malloc(count * sizeof *idx);
    cxl_status st = tmp && idx ? CXL_OK : CXL_ENOMEM;
    if (st == CXL_OK)
        st = assign_orders(stub, CXL_STUB_ORDERS_BEST_FIT, 0, tmp + 3 * count, &assumed, tmp, idx);
    if (st == CXL_OK) memcpy(orders, tmp + 3 * count, count * sizeof *orders);
    free(tmp);
    free(idx);
    return st;
}

/* ---- the fit ------------------------------------------------------- */

/* The fit's GSL objects: views of the result's workspace buffer. */
typedef struct fit_ws {
    size_t n, p;
    gsl_matrix_view Xv, covv;
    gsl_vector_view yv, wv, cv;
    gsl_matrix *X, *cov;
    gsl_vector *y, *w, *c;
    gsl_multifit_linear_workspace *work;
} fit_ws;

/* Doubles of a fit of n readings in cxl__fitws.buf: lengths, electrical
 * lengths, their shifted copies (fit_budget), X (up to 2 columns), y, w,
 * the covariance and the coefficients. */
#define FIT_DOUBLES(n) (8 * (n) + 6)

/* Views of n rows and p columns at buf + 4 n (the first 4 n doubles are
 * fit_data's); n >= p >= 1 is checked by the caller. */
static void ws_bind(fit_ws *f, cxl__fitws *ws, size_t n, size_t p)
{
    double *b = ws->buf + 4 * n;
    f->n = n;
    f->p = p;
    f->Xv = gsl_matrix_view_array(b, n, p);
    f->yv = gsl_vector_view_array(b + 2 * n, n);
    f->wv = gsl_vector_view_array(b + 3 * n, n);
    f->covv = gsl_matrix_view_array(b + 4 * n, p, p);
    f->cv = gsl_vector_view_array(b + 4 * n + 4, p);
    f->X = &f->Xv.matrix;
    f->y = &f->yv.vector;
    f->w = &f->wv.vector;
    f->cov = &f->covv.matrix;
    f->c = &f->cv.vector;
    f->work = ws->work;
}

/* One parameter (y = a L): the weighted least squares in closed form,
 * a = sum(w L y) / sum(w L^2); a small fraction of the cost of the GSL
 * solver, which the batch rows call several times each. */
static int solve_one(fit_ws *f, const double *len, const double *y,
                     double *a, double *x, double *chisq)
{
    double sxx = 0.0, sxy = 0.0;
    for (size_t i = 0; i < f->n; i++) {
        double w = gsl_vector_get(f->w, i);
        sxx += w * len[i] * len[i];
        sxy += w * len[i] * y[i];
    }
    if (!(sxx > 0.0)) return 0;
    *a = sxy / sxx;
    *x = 0.0;
    if (chisq) {
        double chi = 0.0;
        for (size_t i = 0; i < f->n; i++) {
            double d = y[i] - *a * len[i];
            chi += gsl_vector_get(f->w, i) * d * d;
        }
        *chisq = chi;
    }
    gsl_matrix_set(f->cov, 0, 0, 1.0 / sxx);
    gsl_vector_set(f->c, 0, *a);
    return isfinite(*a);
}

/* Solve y = a L (+ x) for lengths len[] and electrical lengths y[]
 * (weights already in f->w).  Returns 0 when GSL reports a failure. */
static int solve(fit_ws *f, const double *len, const double *y,
                 double *a, double *x, double *chisq)
{
    if (f->p == 1) return solve_one(f, len, y, a, x, chisq);
    for (size_t i = 0; i < f->n; i++) {
        gsl_matrix_set(f->X, i, 0, len[i]);
        if (f->p == 2) gsl_matrix_set(f->X, i, 1, 1.0);
        gsl_vector_set(f->y, i, y[i]);
    }
    double chi = 0.0;
    if (gsl_multifit_wlinear(f->X, f->w, f->y, f->c, f->cov, &chi, f->work) != GSL_SUCCESS)
        return 0;
    *a = gsl_vector_get(f->c, 0);
    *x = f->p == 2 ? gsl_vector_get(f->c, 1) : 0.0;
    if (chisq) *chisq = chi;
    return isfinite(*a) && isfinite(*x);
}

/* Room for n readings in r (arrays, workspace, scratch); grows only. */
static cxl_status result_reserve(cxl_stub_result *r, size_t n)
{
    cxl_status st = cxl__fitws_reserve(&r->ws, n, 2, FIT_DOUBLES(n));
    if (st != CXL_OK || n <= r->cap) return st;
    double *d = realloc(r->length_m, 5 * n * sizeof *d);
    if (d) r->length_m = d;
    int *o = realloc(r->order, n * sizeof *o);
    if (o) r->order = o;
    int *is = realloc(r->iscratch, 4 * n * sizeof *is);
    if (is) r->iscratch = is;
    size_t *zs = realloc(r->zscratch, n * sizeof *zs);
    if (zs) r->zscratch = zs;
    if (!d || !o || !is || !zs) return CXL_ENOMEM;
    r->cap = n;
    r->freq_hz = d + n;
    r->vf = d + 2 * n;
    r->res_hz = d + 3 * n;
    r->res_m = d + 4 * n;
    return CXL_OK;
}

cxl_status cxl_stub_result_new(cxl_stub_result **result)
{
    if (!result) return CXL_EINVAL;
    cxl_stub_result *r = calloc(1, sizeof *r);
    if (!r) return CXL_ENOMEM;
    *result = r;
    return CXL_OK;
}

void cxl_stub_result_free(cxl_stub_result *result)
{
    if (!result) return;
    cxl__fitws_free(&result->ws);
    free(result->length_m);
    free(result->order);
    free(result->iscratch);
    free(result->zscratch);
    free(result);
}

/* Shift of (VF, x) when the electrical lengths y[] and lengths len[] are
 * replaced by the perturbed copies; accumulates squares into *dvf2, *dx2. */
static int accumulate_shift(fit_ws *f, const double *len, const double *y,
                            double vf0, double x0, double *dvf2, double *dx2)
{
    double a, x;
    if (!solve(f, len, y, &a, &x, NULL) || !(a > 0.0)) return 0;
    *dvf2 += (1.0 / a - vf0) * (1.0 / a - vf0);
    *dx2 += (x - x0) * (x - x0);
    return 1;
}

/* Everything a fit works on: orders, lengths, electrical lengths. */
typedef struct fit_data {
    const cxl_stub *s;
    cxl_stub_result *r; /* its workspace and scratch */
    int *orders;
    double *len, *y; /* y: cable's free-space length, fixture removed */
    int assumed;
} fit_data;

/* Electrical length of the cable alone at reading i if read at freq_hz. */
static double cable_y(const fit_data *d, size_t i, double freq_hz)
{
    return k_of(d->s->end, d->orders[i]) * CXL_C_M_PER_S / freq_hz - d->s->fixture_free_m;
}

/* Fill lengths, electrical lengths and weights; one fit parameter (a) on
 * one cable length, two (a, x) on several. */
static cxl_status fit_prepare(fit_data *d, fit_ws *f)
{
    const cxl_stub *s = d->s;
    cxl_status st = assign_orders(s, s->rule, 1, d->orders, &d->assumed,
                                  d->r->iscratch + s->n, d->r->zscratch);
    if (st != CXL_OK) return st;
    size_t groups = 0;
    for (size_t i = 0; i < s->n; i++) {
        size_t j = 0;
        while (j < i && s->r[j].length_m != s->r[i].length_m) j++;
        if (j == i) groups++;
    }
    ws_bind(f, &d->r->ws, s->n, groups >= 2 ? 2 : 1);
    const double df = s->freq_res_hz;
    for (size_t i = 0; i < s->n; i++) {
        double total = k_of(s->end, d->orders[i]) * CXL_C_M_PER_S / s->r[i].freq_hz;
        double sigma = total * df / s->r[i].freq_hz;
        double w = df > 0.0 ? 1.0 / (sigma * sigma) : 1.0;
        d->len[i] = s->r[i].length_m;
        d->y[i] = cable_y(d, i, s->r[i].freq_hz);
        gsl_vector_set(f->w, i, w);
        /* extreme inputs must not reach GSL as inf or NaN */
        if (!isfinite(d->y[i]) || !cxl__finite_pos(w)) return CXL_ERANGE;
    }
    return CXL_OK;
}

/* Tolerances: shift each measured cable length and each frequency by its
 * tolerance, refit, and add the shifts in quadrature (independent errors,
 * first order).  Fills err_length, err_freq and adds to x_err_m. */
static cxl_status fit_budget(const fit_data *d, fit_ws *f, cxl_stub_result *r)
{
    const cxl_stub *s = d->s;
    const size_t n = s->n;
    double lvf2 = 0.0, lx2 = 0.0, fvf2 = 0.0, fx2 = 0.0;
    double *len2 = d->y + n, *y2 = len2 + n;
    cxl_status st = CXL_OK;
    if (s->length_tol_m > 0.0) {
        for (size_t i = 0; i < n && st == CXL_OK; i++) {
            size_t j = 0;
            while (j < i && d->len[j] != d->len[i]) j++;
            if (j < i) continue; /* this cable length is done */
            for (size_t k = 0; k < n; k++)
                len2[k] = d->len[k] == d->len[i] ? d->len[k] + s->length_tol_m : d->len[k];
            if (!accumulate_shift(f, len2, d->y, r->vf_fit, r->x_m, &lvf2, &lx2))
                st = CXL_ENOCONV;
        }
    }
    if (s->freq_res_hz > 0.0) {
        for (size_t i = 0; i < n && st == CXL_OK; i++) {
            memcpy(y2, d->y, n * sizeof *y2);
            y2[i] = cable_y(d, i, s->r[i].freq_hz + s->freq_res_hz);
            if (!accumulate_shift(f, d->len, y2, r->vf_fit, r->x_m, &fvf2, &fx2))
                st = CXL_ENOCONV;
        }
    }
    r->err_length = sqrt(lvf2);
    r->err_freq = sqrt(fvf2);
    r->x_err_m = sqrt(r->x_err_m * r->x_err_m + lx2 + fx2);
    return st;
}

/* Per-reading VF and residuals, and the warning flags. */
static cxl_status fit_readings(const fit_data *d, double a, cxl_stub_result *r)
{
    const cxl_stub *s = d->s;
    const double x = r->x_m, vf = r->vf_fit;
    if (vf < s->vf_min || vf > s->vf_max) r->flags |= CXL_STUB_FLAG_VF_RANGE;
    for (size_t i = 0; i < s->n; i++) {
        double model = a * d->len[i] + x;              /* cable, free-space m */
        if (!(d->y[i] - x > 0.0) || !(model + s->fixture_free_m > 0.0))
            return CXL_EINCONSISTENT; /* fitted fixture longer than a reading */
        r->length_m[i] = d->len[i];
        r->freq_hz[i] = s->r[i].freq_hz;
        r->order[i] = d->orders[i];
        r->vf[i] = d->len[i] / (d->y[i] - x);
        r->res_hz[i] = s->r[i].freq_hz - k_of(s->end, d->orders[i]) * CXL_C_M_PER_S /
                                             (model + s->fixture_free_m);
        r->res_m[i] = (d->y[i] - model) * vf;        /* as cable length */
        if (r->vf[i] < s->vf_min || r->vf[i] > s->vf_max)
            r->flags |= CXL_STUB_FLAG_VF_RANGE;
        if (fabs(r->res_hz[i]) > s->consistency * s->r[i].freq_hz + s->freq_res_hz)
            r->flags |= CXL_STUB_FLAG_INCONSISTENT;
    }
    return CXL_OK;
}

/* Do the per-reading VFs rise or fall with frequency?  Weighted straight
 * line VF_i = p + q / sqrt(f_i) (weights 1 / (VF_i df / f_i)^2 with a
 * frequency step, equal without and then scaled by the scatter); a slope
 * more than three standard errors from 0 is a trend.  Closed-form normal
 * equations of the two-parameter fit. */
static int trend_significant(const cxl_stub_result *r)
{
    const double df = r->freq_res_hz;
    double sw = 0.0, sx = 0.0, sy = 0.0, sxx = 0.0, sxy = 0.0;
    size_t n = r->n;
    for (size_t i = 0; i < n; i++) {
        double x = 1.0 / sqrt(r->freq_hz[i] * 1e-6), e = r->vf[i] * df / r->freq_hz[i];
        double w = df > 0.0 ? 1.0 / (e * e) : 1.0;
        if (!isfinite(w) || !isfinite(x)) return 0;
        sw += w; sx += w * x; sy += w * r->vf[i]; sxx += w * x * x; sxy += w * x * r->vf[i];
    }
    double det = sw * sxx - sx * sx;
    if (n < 2 || !(det > 1e-12 * sw * sxx) || (df == 0.0 && n < 3)) return 0;
    double q = (sw * sxy - sx * sy) / det, p = (sy - q * sx) / sw, var = sw / det;
    if (df == 0.0) {
        double chi = 0.0;
        for (size_t i = 0; i < n; i++) {
            double d = r->vf[i] - p - q / sqrt(r->freq_hz[i] * 1e-6);
            chi += d * d;
        }
        var *= chi / (double)(n - 2);
    }
    return isfinite(q) && isfinite(var) && q * q > 9.0 * var;
}

/* The fit's scalars from the solution a (= 1/VF), x and chisq. */
static void fit_scalars(const cxl_stub *stub, const fit_data *d, const fit_ws *f,
                        double a, double x, double chisq, cxl_stub_result *r)
{
    const size_t dof = stub->n - f->p;
    r->vf_fit = 1.0 / a;
    r->x_m = x;
    if (dof > 0) {
        /* Without a frequency step the scatter alone sets the error
         * (covariance times chisq / dof).  With one, the readings' own
         * errors are in err_freq, and err_fit holds only the spread beyond
         * them: the Birge ratio B^2 = chisq / dof above 1 scales the total
         * to B times the own error, so err_fit is sqrt(B^2 - 1) of it (0
         * for readings as consistent as their step). */
        double s2 = chisq / (double)dof;
        if (stub->freq_res_hz > 0.0) s2 = s2 > 1.0 ? s2 - 1.0 : 0.0;
        r->err_fit = sqrt(gsl_matrix_get(f->cov, 0, 0) * s2) / (a * a);
        if (f->p == 2) r->x_err_m = sqrt(gsl_matrix_get(f->cov, 1, 1) * s2);
    }
    r->freq_res_hz = stub->freq_res_hz;
    r->length_tol_m = stub->length_tol_m;
    if (d->assumed) r->flags |= CXL_STUB_FLAG_ORDERS_ASSUMED;
    if (f->p == 2) r->flags |= CXL_STUB_FLAG_FIXTURE_FITTED;
}

cxl_status cxl_stub_fit_into(const cxl_stub *stub, cxl_stub_result *result)
{
    if (!stub || !result || stub->n == 0) return CXL_EINVAL;
    const size_t n = stub->n;
    cxl_stub_result *r = result;
    cxl_status st = result_reserve(r, n);
    r->n = 0; /* empty until the fit succeeds */
    if (st != CXL_OK) return st;
    r->vf_fit = r->err_fit = r->err_length = r->err_freq = r->x_m = r->x_err_m = 0.0;
    r->flags = 0;
    fit_data d = { stub, r, r->iscratch, r->ws.buf, r->ws.buf + n, 0 };
    fit_ws f;
    st = fit_prepare(&d, &f);
    double a = 0.0, x = 0.0, chisq = 0.0;
    if (st == CXL_OK && !solve(&f, d.len, d.y, &a, &x, &chisq)) st = CXL_ENOCONV;
    if (st == CXL_OK && !(a > 0.0)) st = CXL_EINCONSISTENT; /* longer line, shorter wave */
    if (st == CXL_OK) {
        fit_scalars(stub, &d, &f, a, x, chisq, r);
        st = fit_budget(&d, &f, r);
    }
    r->n = n; /* the per-reading arrays as fit_readings fills them */
    if (st == CXL_OK) st = fit_readings(&d, a, r);
    if (st == CXL_OK && trend_significant(r)) r->flags |= CXL_STUB_FLAG_TREND;
    if (st != CXL_OK) r->n = 0;
    return st;
}

cxl_status cxl_stub_fit(const cxl_stub *stub, cxl_stub_result **result)
{
    if (!stub || !result || stub->n == 0) return CXL_EINVAL;
    cxl_stub_result *r = NULL;
    cxl_status st = cxl_stub_result_new(&r);
    if (st == CXL_OK) st = cxl_stub_fit_into(stub, r);
    if (st != CXL_OK) {
        cxl_stub_result_free(r);
        return st;
    }
    *result = r;
    return CXL_OK;
}

/* ---- results ------------------------------------------------------- */

cxl_status cxl_stub_result_vf(const cxl_stub_result *result, double *vf,
                              double *vf_err)
{
    if (!result || !vf || result->n == 0) return CXL_EINVAL;
    *vf = result->vf_fit;
    if (vf_err)
        *vf_err = sqrt(result->err_fit * result->err_fit +
                       result->err_length * result->err_length +
                       result->err_freq * result->err_freq);
    return CXL_OK;
}

cxl_status cxl_stub_result_vf_budget(const cxl_stub_result *result,
                                     double *err_fit, double *err_length,
                                     double *err_freq)
{
    if (!result || result->n == 0) return CXL_EINVAL;
    if (err_fit) *err_fit = result->err_fit;
    if (err_length) *err_length = result->err_length;
    if (err_freq) *err_freq = result->err_freq;
    return CXL_OK;
}

cxl_status cxl_stub_result_fixture(const cxl_stub_result *result,
                                   double *extra_free_m, double *extra_err_m,
                                   double *extra_cable_m)
{
    if (!result || !extra_free_m || result->n == 0) return CXL_EINVAL;
    if (!(result->flags & CXL_STUB_FLAG_FIXTURE_FITTED)) return CXL_ENOTFOUND;
    *extra_free_m = result->x_m;
    if (extra_err_m) *extra_err_m = result->x_err_m;
    if (extra_cable_m) *extra_cable_m = result->x_m * result->vf_fit;
    return CXL_OK;
}

cxl_status cxl_stub_result_flags(const cxl_stub_result *result, unsigned *flags)
{
    if (!result || !flags || result->n == 0) return CXL_EINVAL;
    *flags = result->flags;
    return CXL_OK;
}

/* The largest relative length tolerance: it moves every VF by the same
 * relative amount. */
static double rel_length_tol(const cxl_stub_result *result)
{
    double rel_len = 0.0;
    for (size_t i = 0; i < result->n; i++) {
        double rl = result->length_tol_m / result->length_m[i];
        if (rl > rel_len) rel_len = rl;
    }
    return rel_len;
}

/* The nearest reading in 1/sqrt(f), moved by the drift allowance: *v, *e
 * (e infinite when it does not apply); cxl_drift_allowance's status. */
static cxl_status at_by_allowance(const cxl_stub_result *result, double freq_hz,
                                  double rel_len, double *v, double *e)
{
    size_t near = 0;
    double best = INFINITY, factor, half;
    for (size_t i = 0; i < result->n; i++) {
        double dx = fabs(1.0 / sqrt(result->freq_hz[i]) - 1.0 / sqrt(freq_hz));
        if (dx < best) { best = dx; near = i; }
    }
    *v = 0.0;
    *e = INFINITY;
    cxl_status st = cxl_drift_allowance(result->freq_hz[near], freq_hz, &factor, &half);
    if (st == CXL_OK) {
        double v0 = result->vf[near], df = result->freq_res_hz;
        *v = v0 * factor;
        *e = hypot(hypot(v0 * half, v0 * df / result->freq_hz[near]), *v * rel_len);
    }
    return st;
}

/* The trend over two or more readings (without a frequency step two
 * readings are taken as exact, as the fit takes them): *v, *e (e infinite
 * when there is none) and how it was found. */
static void at_by_trend(const cxl_stub_result *result, double freq_hz, double rel_len,
                        cxl__fitws *ws, const struct cxl_drift *known, double *v_t,
                        double *e_t, unsigned *t_how)
{
    *v_t = 0.0;
    *e_t = INFINITY;
    *t_how = 0;
    if (result->n < 2) return;
    struct cxl_drift drift;
    const struct cxl_drift *d = known ? known : &drift;
    double lo, hi, v, e;
    if ((known || cxl__drift_fill_stub(result, result->freq_res_hz, ws, &drift) == CXL_OK) &&
        cxl_drift_vf(d, freq_hz, &v, &e) == CXL_OK && cxl_drift_range(d, &lo, &hi) == CXL_OK) {
        *v_t = v;
        *e_t = hypot(e, v * rel_len);
        *t_how = CXL_STUB_AT_TREND | (freq_hz < lo || freq_hz > hi ? CXL_STUB_AT_EXTRAPOLATED : 0u);
    }
}

cxl_status cxl__stub_result_vf_at_ws(const cxl_stub_result *result, double freq_hz,
                                     double *vf, double *vf_err, unsigned *how,
                                     cxl__fitws *ws, const struct cxl_drift *known)
{
    if (!result || !vf || !vf_err || !cxl__finite_pos(freq_hz) || result->n == 0)
        return CXL_EINVAL;
    double rel_len = rel_length_tol(result), v_a, e_a, v_t, e_t, v, e;
    cxl_status st_a = at_by_allowance(result, freq_hz, rel_len, &v_a, &e_a);
    unsigned t_how, h;
    at_by_trend(result, freq_hz, rel_len, ws, known, &v_t, &e_t, &t_how);
    if (e_t <= e_a) { v = v_t; e = e_t; h = t_how; }
    else if (st_a == CXL_OK) { v = v_a; e = e_a; h = CXL_STUB_AT_ALLOWANCE; }
    else return st_a == CXL_ERANGE ? CXL_ERANGE : CXL_EINVAL;
    if (!cxl__valid_vf(v) || !isfinite(e)) return CXL_ERANGE;
    *vf = v;
    *vf_err = e;
    if (how) *how = h;
    return CXL_OK;
}

cxl_status cxl_stub_result_vf_at(const cxl_stub_result *result, double freq_hz,
                                 double *vf, double *vf_err, unsigned *how)
{
    cxl__fitws ws = { 0 };
    cxl_status st = cxl__stub_result_vf_at_ws(result, freq_hz, vf, vf_err, how, &ws, NULL);
    cxl__fitws_free(&ws);
    return st;
}

size_t cxl_stub_result_count(const cxl_stub_result *result)
{
    return result ? result->n : 0;
}

cxl_status cxl_stub_result_reading(const cxl_stub_result *result, size_t index,
                                   double *length_m, double *freq_hz, int *order,
                                   double *vf, double *residual_hz,
                                   double *residual_m)
{
    if (!result || index >= result->n) return CXL_EINVAL;
    if (length_m) *length_m = result->length_m[index];
    if (freq_hz) *freq_hz = result->freq_hz[index];
    if (order) *order = result->order[index];
    if (vf) *vf = result->vf[index];
    if (residual_hz) *residual_hz = result->res_hz[index];
    if (residual_m) *residual_m = result->res_m[index];
    return CXL_OK;
}
