/* array.c - pattern of a receive array of N elements (a pair is N = 2):
 * field, response, gain, front-to-back ratio, rear null, -3 dB beamwidth,
 * directivity and receiving directivity factor.  The model is described
 * in coaxline.h.
 *
 * One implementation: the two-element pair API (cxl_duo_*,
 * cxl_duo_gain, ...) builds a two-element cxl_array on the stack and
 * calls the same evaluation code as the N-element API.
 *
 * Work is bounded by the array's electrical size S = k D (+ the wire's
 * and the ground image's share), which is refused above
 * CXL_ARRAY_MAX_KSIZE:
 *   - sphere and hemisphere means: for an element pattern that does not
 *     depend on azimuth (isotropic, vertical) the azimuth integral is done
 *     exactly, <e^{j k u.d}>_az = J0(k rho cos el) e^{j k dz sin el}, so
 *     only the elevation integral is numeric (Gauss-Legendre, doubled until
 *     two estimates agree); the wire element keeps a product rule;
 *   - peak: a coarse grid of about four points per lobe width (pi / S),
 *     then a simplex refinement of the best few local maxima;
 *   - rear null and beamwidth: a one-dimensional scan of the same
 *     resolution, refined by Brent minimisation or bisection. */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_multimin.h>
#include <gsl/gsl_sf_bessel.h>
#include "coaxline.h"
#include "internal.h"

#define DEG (M_PI / 180.0)
/* Two successive estimates of a mean must agree this closely. */
#define CXL__MEAN_RTOL 1e-10
/* Local maxima of the coarse grid refined by the simplex. */
#define PEAK_CANDIDATES 6
/* Local minima of the rear scan refined by Brent. */
#define NULL_CANDIDATES 4
/* Brent's stop on the rear null's azimuth (radians): one it can reach. */
#define NULL_EPSABS 1e-9
#define NULL_EPSREL 1e-7

typedef struct {
    double x_m, y_m, z_m;
    double delay_s;                   /* fixed part of the feed delay */
    double line_m;                    /* feed line, 0 for none */
    double line_vf;                   /* lossless line when > 0 */
    const cxl_loss_model *line_model; /* lossy line when not NULL */
    double phase_rad;
    int reversed;
    double weight_db;
} array_elem;

struct cxl_array {
    size_t n, cap;
    array_elem *el;
    int kind;
    double wire_length_m, wire_vf;
};

struct cxl_duo {
    double spacing_m;
    double stagger_m;
    double delay_s[2];
    double phase_rad[2];
    int flip[2];
    double imbalance_db;
    int element;
    double wire_length_m;
    double wire_vf;
};

/* What depends on the frequency only, worked out once per call.
 * Positions are stored multiplied by k (radians per unit direction).
 * yield.c sees it as the opaque cxl__array_eval of internal.h. */
typedef struct cxl__array_eval {
    double k;
    size_t n;
    int kind;
    double wire_x;   /* pi L / lambda */
    double inv_p;    /* 1 / wire VF */
    double size;     /* electrical size: sets grid steps and node counts */
    double scale;    /* (sum |w_i|)^2: the coherent maximum of |AF|^2 */
    double kx[CXL_ARRAY_MAX_ELEMENTS], ky[CXL_ARRAY_MAX_ELEMENTS];
    double kz[CXL_ARRAY_MAX_ELEMENTS];
    double wr[CXL_ARRAY_MAX_ELEMENTS], wi[CXL_ARRAY_MAX_ELEMENTS];
} array_eval;

/* ---- the N-element array: building it --------------------------------- */

cxl_status cxl_array_new(cxl_array **array)
{
    if (!array)
        return CXL_EINVAL;
    cxl_array *a = calloc(1, sizeof *a);
    if (!a)
        return CXL_ENOMEM;
    a->kind = CXL_ELEMENT_ISOTROPIC;
    a->wire_vf = 1.0;
    *array = a;
    return CXL_OK;
}

void cxl_array_free(cxl_array *array)
{
    if (!array)
        return;
    free(array->el);
    free(array);
}

cxl_status cxl_array_copy(const cxl_array *array, cxl_array **copy)
{
    if (!array || !copy)
        return CXL_EINVAL;
    cxl_array *a = malloc(sizeof *a);
    if (!a)
        return CXL_ENOMEM;
    *a = *array;
    a->el = NULL;
    if (array->n) {
        a->el = malloc(array->n * sizeof *a->el);
        if (!a->el) {
            free(a);
            return CXL_ENOMEM;
        }
        memcpy(a->el, array->el, array->n * sizeof *a->el);
    }
    a->cap = array->n;
    *copy = a;
    return CXL_OK;
}

static int valid_position(double x_m, double y_m, double z_m)
{
    return isfinite(x_m) && isfinite(y_m) && isfinite(z_m);
}

cxl_status cxl_array_add(cxl_array *array, double x_m, double y_m,
                         double z_m, size_t *index)
{
    if (!array || !valid_position(x_m, y_m, z_m))
        return CXL_EINVAL;
    if (array->n >= CXL_ARRAY_MAX_ELEMENTS)
        return CXL_ERANGE;
    if (array->n == array->cap) {
        size_t cap = array->cap ? 2 * array->cap : 4;
        array_elem *el = realloc(array->el, cap * sizeof *el);
        if (!el)
            return CXL_ENOMEM;
        array->el = el;
        array->cap = cap;
    }
    array_elem *e = &array->el[array->n];
    memset(e, 0, sizeof *e);
    e->x_m = x_m;
    e->y_m = y_m;
    e->z_m = z_m;
    if (index)
        *index = array->n;
    array->n++;
    return CXL_OK;
}

size_t cxl_array_count(const cxl_array *array)
{
    return array ? array->n : 0;
}

static array_elem *element_of(cxl_array *array, size_t i)
{
    return array && i < array->n ? &array->el[i] : NULL;
}

cxl_status cxl_array_set_position(cxl_array *array, size_t i, double x_m,
                                  double y_m, double z_m)
{
    array_elem *e = element_of(array, i);
    if (!e || !valid_position(x_m, y_m, z_m))
        return CXL_EINVAL;
    e->x_m = x_m;
    e->y_m = y_m;
    e->z_m = z_m;
    return CXL_OK;
}

cxl_status cxl_array_set_delay(cxl_array *array, size_t i, double delay_s)
{
    array_elem *e = element_of(array, i);
    if (!e || !cxl__finite_nonneg(delay_s))
        return CXL_EINVAL;
    e->delay_s = delay_s;
    return CXL_OK;
}

cxl_status cxl_array_set_line(cxl_array *array, size_t i, double length_m,
                              double vf)
{
    array_elem *e = element_of(array, i);
    if (!e || !cxl__finite_nonneg(length_m) || !cxl__valid_vf(vf))
        return CXL_EINVAL;
    e->line_m = length_m;
    e->line_vf = vf;
    e->line_model = NULL;
    return CXL_OK;
}

cxl_status cxl_array_set_line_model(cxl_array *array, size_t i,
                                    double length_m,
                                    const cxl_loss_model *model)
{
    array_elem *e = element_of(array, i);
    if (!e || !cxl__finite_nonneg(length_m) || !model)
        return CXL_EINVAL;
    e->line_m = length_m;
    e->line_vf = 0.0;
    e->line_model = model;
    return CXL_OK;
}

cxl_status cxl_array_set_reversed(cxl_array *array, size_t i, int reversed)
{
    array_elem *e = element_of(array, i);
    if (!e)
        return CXL_EINVAL;
    e->reversed = reversed != 0;
    return CXL_OK;
}

cxl_status cxl_array_set_weight(cxl_array *array, size_t i,
                                double weight_db)
{
    array_elem *e = element_of(array, i);
    if (!e || !isfinite(weight_db) || fabs(weight_db) > 200.0)
        return CXL_EINVAL;
    e->weight_db = weight_db;
    return CXL_OK;
}

cxl_status cxl_array_set_phase_offset(cxl_array *array, size_t i,
                                      double phase_deg)
{
    array_elem *e = element_of(array, i);
    if (!e || !isfinite(phase_deg))
        return CXL_EINVAL;
    e->phase_rad = fmod(phase_deg, 360.0) * DEG;
    return CXL_OK;
}

cxl_status cxl_array_set_element(cxl_array *array, cxl_element_kind kind,
                                 double wire_length_m, double wire_vf)
{
    if (!array)
        return CXL_EINVAL;
    switch (kind) {
    case CXL_ELEMENT_ISOTROPIC:
    case CXL_ELEMENT_VERTICAL:
        array->kind = (int)kind;
        return CXL_OK;
    case CXL_ELEMENT_WIRE:
        if (!cxl__finite_pos(wire_length_m) || !cxl__valid_vf(wire_vf))
            return CXL_EINVAL;
        array->kind = (int)kind;
        array->wire_length_m = wire_length_m;
        array->wire_vf = wire_vf;
        return CXL_OK;
    }
    return CXL_EINVAL;
}

/* Electrical size per unit k: the bounding box's diagonal (at least the
 * largest distance between two elements), the ground image's height and
 * the wire's length in free-space wavelengths (a multiple of lambda / pi). */
static void extent(const cxl_array *a, double *span_m, double *extra_m)
{
    double lo[3] = { INFINITY, INFINITY, INFINITY };
    double hi[3] = { -INFINITY, -INFINITY, -INFINITY };
    double zmax = 0.0;
    for (size_t i = 0; i < a->n; i++) {
        const double p[3] = { a->el[i].x_m, a->el[i].y_m, a->el[i].z_m };
        for (int c = 0; c < 3; c++) {
            lo[c] = fmin(lo[c], p[c]);
            hi[c] = fmax(hi[c], p[c]);
        }
        zmax = fmax(zmax, fabs(p[2]));
    }
    *span_m = a->n ? sqrt((hi[0] - lo[0]) * (hi[0] - lo[0]) +
                          (hi[1] - lo[1]) * (hi[1] - lo[1]) +
                          (hi[2] - lo[2]) * (hi[2] - lo[2]))
                   : 0.0;
    *extra_m = 0.0;
    if (a->kind == CXL_ELEMENT_VERTICAL)
        *extra_m += 2.0 * zmax;
    if (a->kind == CXL_ELEMENT_WIRE)
        *extra_m += a->wire_length_m;   /* 2 pi L / lambda = k L */
}

cxl_status cxl_array_max_freq(const cxl_array *array, double *freq_hz)
{
    if (!array || !freq_hz)
        return CXL_EINVAL;
    double span, extra;
    extent(array, &span, &extra);
    if (!(span + extra > 0.0))
        return CXL_ERANGE;   /* no extent: no limit from the geometry */
    return cxl__put_finite(CXL_ARRAY_MAX_KSIZE * CXL_C_M_PER_S /
                               (2.0 * M_PI * (span + extra)),
                           freq_hz);
}

/* ---- evaluation -------------------------------------------------------- */

/* Element el's feed at freq_hz split into its parts (internal.h,
 * cxl__array_feed); the weight is worked out from them by prepare() and,
 * with a trial's errors, by yield.c. */
static cxl_status feed_of(const array_elem *el, double freq_hz, double omega,
                          cxl__array_feed *fd)
{
    fd->amp = pow(10.0, el->weight_db / 20.0);
    if (el->reversed)
        fd->amp = -fd->amp;
    fd->phase_rad = el->phase_rad - fmod(omega * el->delay_s, 2.0 * M_PI);
    fd->line_m = 0.0;
    fd->line_vf = 0.0;
    fd->beta_rad_per_m = 0.0;
    fd->alpha_np_per_m = 0.0;
    if (el->line_m > 0.0 && el->line_vf > 0.0) {
        fd->line_m = el->line_m;
        fd->line_vf = el->line_vf;
    } else if (el->line_m > 0.0 && el->line_model) {
        double alpha, beta;
        cxl_status st = cxl_loss_model_gamma(el->line_model, freq_hz, 0,
                                             &alpha, &beta);
        if (st)
            return st;
        fd->line_m = el->line_m;
        fd->line_vf = omega / (beta * CXL_C_M_PER_S);
        fd->beta_rad_per_m = beta;
        fd->alpha_np_per_m = alpha;
    }
    return CXL_OK;
}

/* Element i's weight at the array's output (its feed and line) and its
 * position times k; adds |weight| to *sum_w. */
static cxl_status prepare_element(const array_elem *el, double freq_hz,
                                  double omega, array_eval *e, size_t i,
                                  double *sum_w)
{
    cxl__array_feed fd;
    cxl_status st = feed_of(el, freq_hz, omega, &fd);
    if (st)
        return st;
    double amp = fd.amp, ph = fd.phase_rad;
    if (el->line_m > 0.0 && el->line_vf > 0.0) {
        ph -= fmod(omega * fd.line_m / (fd.line_vf * CXL_C_M_PER_S),
                   2.0 * M_PI);
    } else if (el->line_m > 0.0 && el->line_model) {
        amp *= exp(-fd.alpha_np_per_m * fd.line_m);
        ph -= fmod(fd.beta_rad_per_m * fd.line_m, 2.0 * M_PI);
    }
    if (!isfinite(ph) || !isfinite(amp))
        return CXL_ERANGE;
    e->wr[i] = amp * cos(ph);
    e->wi[i] = amp * sin(ph);
    e->kx[i] = e->k * el->x_m;
    e->ky[i] = e->k * el->y_m;
    e->kz[i] = e->k * el->z_m;
    *sum_w += fabs(amp);
    return CXL_OK;
}

static cxl_status prepare(const cxl_array *a, double freq_hz,
                          array_eval *e)
{
    if (!a || !cxl__finite_pos(freq_hz) || a->n == 0)
        return CXL_EINVAL;
    double omega = 2.0 * M_PI * freq_hz;
    e->k = omega / CXL_C_M_PER_S;
    if (!isfinite(omega) || !(e->k > 0.0))
        return CXL_ERANGE;
    double span, extra;
    extent(a, &span, &extra);
    e->size = e->k * (span + extra);
    if (!isfinite(e->size) || e->size > CXL_ARRAY_MAX_KSIZE)
        return CXL_ERANGE;   /* too many wavelengths: see the header */
    e->n = a->n;
    e->kind = a->kind;
    e->wire_x = a->kind == CXL_ELEMENT_WIRE
                    ? M_PI * a->wire_length_m * freq_hz / CXL_C_M_PER_S
                    : 0.0;
    e->inv_p = 1.0 / a->wire_vf;
    double sum_w = 0.0;
    for (size_t i = 0; i < a->n; i++) {
        cxl_status st = prepare_element(&a->el[i], freq_hz, omega, e, i, &sum_w);
        if (st)
            return st;
    }
    e->scale = sum_w * sum_w;
    if (!(e->scale > 0.0) || !isfinite(e->scale))
        return CXL_ERANGE;
    return CXL_OK;
}

/* Element field for a wave from (az, el); signed for the wire. */
static double element_field(const array_eval *e, double ux, double el)
{
    switch (e->kind) {
    case CXL_ELEMENT_WIRE: {
        double sin_t = sqrt(fmax(0.0, (1.0 - ux) * (1.0 + ux)));
        double x = e->wire_x * (e->inv_p - ux);
        double sinc = fabs(x) < 1e-4 ? 1.0 - x * x / 6.0 : sin(x) / x;
        return sin_t * sinc;
    }
    case CXL_ELEMENT_VERTICAL:
        return el < 0.0 ? 0.0 : cos(el);
    default:
        return 1.0;
    }
}

/* The array factor (sum of the weighted element signals, without the
 * element pattern) for a wave from direction u. */
static void array_factor(const array_eval *e, double ux, double uy,
                         double uz, double *re, double *im)
{
    double sr = 0.0, si = 0.0;
    if (e->kind == CXL_ELEMENT_VERTICAL) {
        for (size_t i = 0; i < e->n; i++) {
            double ph = e->kx[i] * ux + e->ky[i] * uy;
            double g = 2.0 * cos(e->kz[i] * uz);   /* element + image */
            double c = cos(ph), s = sin(ph);
            sr += g * (e->wr[i] * c - e->wi[i] * s);
            si += g * (e->wr[i] * s + e->wi[i] * c);
        }
    } else {
        for (size_t i = 0; i < e->n; i++) {
            double ph = e->kx[i] * ux + e->ky[i] * uy + e->kz[i] * uz;
            double c = cos(ph), s = sin(ph);
            sr += e->wr[i] * c - e->wi[i] * s;
            si += e->wr[i] * s + e->wi[i] * c;
        }
    }
    *re = sr;
    *im = si;
}

/* Complex output for a wave from direction (ux, uy, uz) at elevation el
 * (uz = sin el). */
static void field_dir(const array_eval *e, double ux, double uy, double uz,
                      double el, double *re, double *im)
{
    double f = element_field(e, ux, el);
    if (f == 0.0) {
        *re = *im = 0.0;
        return;
    }
    double r, i;
    array_factor(e, ux, uy, uz, &r, &i);
    *re = f * r;
    *im = f * i;
}

/* Complex output for a wave from (az, el), radians; azimuth clockwise
 * from +x towards +y. */
static void field_at(const array_eval *e, double az, double el, double *re,
                     double *im)
{
    double ce = cos(el);
    double ux = ce * cos(az), uy = ce * sin(az), uz = sin(el);
    double f = element_field(e, ux, el);
    if (f == 0.0) {
        *re = *im = 0.0;
        return;
    }
    double r, i;
    array_factor(e, ux, uy, uz, &r, &i);
    *re = f * r;
    *im = f * i;
}

static double power_at(const array_eval *e, double az, double el)
{
    double re, im;
    field_at(e, az, el, &re, &im);
    return re * re + im * im;
}

static int valid_elevation(double elevation_deg)
{
    return isfinite(elevation_deg) && fabs(elevation_deg) <= 90.0;
}

/* Neumaier's compensated sum: millions of terms keep ~1e-15 relative. */
typedef struct {
    double sum, c;
} csum;

static void csum_add(csum *s, double x)
{
    double t = s->sum + x;
    if (fabs(s->sum) >= fabs(x))
        s->c += (s->sum - t) + x;
    else
        s->c += (x - t) + s->sum;
    s->sum = t;
}

/* ---- means over a band of elevations ----------------------------------- */

/* The pairs of elements of an azimuth-independent element pattern. */
typedef struct {
    size_t npairs;
    double *rho;     /* k times the horizontal distance */
    double *dz;      /* k times the height difference (free space) */
    double *cr, *ci; /* w_i conj(w_j) */
    size_t *i, *j;
} pair_table;

static void pair_table_free(pair_table *t)
{
    free(t->rho);
    free(t->dz);
    free(t->cr);
    free(t->ci);
    free(t->i);
    free(t->j);
}

static cxl_status pair_table_make(const array_eval *e, pair_table *t)
{
    size_t m = e->n * (e->n - 1) / 2;
    size_t alloc = m ? m : 1;
    t->npairs = m;
    t->rho = malloc(alloc * sizeof *t->rho);
    t->dz = malloc(alloc * sizeof *t->dz);
    t->cr = malloc(alloc * sizeof *t->cr);
    t->ci = malloc(alloc * sizeof *t->ci);
    t->i = malloc(alloc * sizeof *t->i);
    t->j = malloc(alloc * sizeof *t->j);
    if (!t->rho || !t->dz || !t->cr || !t->ci || !t->i || !t->j) {
        pair_table_free(t);
        return CXL_ENOMEM;
    }
    size_t p = 0;
    for (size_t i = 0; i < e->n; i++)
        for (size_t j = i + 1; j < e->n; j++, p++) {
            t->rho[p] = hypot(e->kx[i] - e->kx[j], e->ky[i] - e->ky[j]);
            t->dz[p] = e->kz[i] - e->kz[j];
            t->cr[p] = e->wr[i] * e->wr[j] + e->wi[i] * e->wi[j];
            t->ci[p] = e->wi[i] * e->wr[j] - e->wr[i] * e->wi[j];
            t->i[p] = i;
            t->j[p] = j;
        }
    return CXL_OK;
}

/* Average of |F|^2 over all azimuths at elevation el (radians), exact:
 * the mean of e^{j k u.d} over azimuth is J0(k rho cos el) times the
 * vertical part. */
static double ring_mean(const array_eval *e, const pair_table *t, double el)
{
    double ce = cos(el), se = sin(el);
    csum s = { 0.0, 0.0 };
    if (e->kind == CXL_ELEMENT_VERTICAL) {
        if (el < 0.0)
            return 0.0;
        for (size_t i = 0; i < e->n; i++) {
            double g = 2.0 * cos(e->kz[i] * se);
            csum_add(&s, (e->wr[i] * e->wr[i] + e->wi[i] * e->wi[i]) * g * g);
        }
        for (size_t p = 0; p < t->npairs; p++) {
            double g = 4.0 * cos(e->kz[t->i[p]] * se) * cos(e->kz[t->j[p]] * se);
            csum_add(&s, 2.0 * t->cr[p] * g *
                             gsl_sf_bessel_J0(t->rho[p] * ce));
        }
        return ce * ce * (s.sum + s.c);
    }
    for (size_t i = 0; i < e->n; i++)
        csum_add(&s, e->wr[i] * e->wr[i] + e->wi[i] * e->wi[i]);
    for (size_t p = 0; p < t->npairs; p++) {
        double ph = t->dz[p] * se;
        double re = t->cr[p] * cos(ph) - t->ci[p] * sin(ph);
        csum_add(&s, 2.0 * re * gsl_sf_bessel_J0(t->rho[p] * ce));
    }
    return s.sum + s.c;
}

/* Mean over elevation lo..hi (radians) and all azimuths, weighted by solid
 * angle, with n Gauss-Legendre nodes in elevation. */
static double elevation_rule(const array_eval *e, const pair_table *pt,
                             double lo, double hi,
                             const gsl_integration_glfixed_table *t,
                             size_t n_el, size_t n_az)
{
    csum total = { 0.0, 0.0 };
    for (size_t i = 0; i < n_el; i++) {
        double el, w;
        gsl_integration_glfixed_point(lo, hi, i, &el, &w, t);
        double ring;
        if (pt) {
            ring = ring_mean(e, pt, el);
        } else {
            csum r = { 0.0, 0.0 };
            for (size_t j = 0; j < n_az; j++)
                csum_add(&r, power_at(e, 2.0 * M_PI * (j + 0.5) / n_az, el));
            ring = (r.sum + r.c) / n_az;
        }
        csum_add(&total, w * cos(el) * ring);
    }
    return total.sum + total.c;
}

/* First node counts of mean_power: the integrand's oscillation grows
 * with the size (exact rings: elevation nodes only). */
static void mean_nodes(const array_eval *e, int exact_rings, size_t *n_el,
                       size_t *n_az)
{
    *n_el = 32;
    *n_az = 32 + 2 * (size_t)ceil(e->size);
    while ((double)*n_el < 16.0 + e->size)
        *n_el *= 2;
    if (!exact_rings)
        *n_el = 16 + (size_t)ceil(e->size);
}

/* Mean of the response over elevation lo..hi and all azimuths. */
static cxl_status mean_power(const array_eval *e, double lo, double hi,
                             double *mean)
{
    double width = sin(hi) - sin(lo);
    double ilo = lo;
    if (e->kind == CXL_ELEMENT_VERTICAL && ilo < 0.0)
        ilo = 0.0;   /* no field below perfect ground */
    pair_table pt = { 0 }, *ptp = NULL;
    if (e->kind != CXL_ELEMENT_WIRE) {
        cxl_status st = pair_table_make(e, &pt);
        if (st)
            return st;
        ptp = &pt;
    }
    size_t n_el, n_az;
    mean_nodes(e, ptp != NULL, &n_el, &n_az);
    double prev = NAN;
    cxl_status st = CXL_ENOCONV;
    while (n_el <= 16384) {
        gsl_integration_glfixed_table *t =
            gsl_integration_glfixed_table_alloc(n_el);
        if (!t) {
            st = CXL_ENOMEM;
            break;
        }
        double cur = hi > ilo ? elevation_rule(e, ptp, ilo, hi, t, n_el, n_az)
                                   / width
                              : 0.0;
        gsl_integration_glfixed_table_free(t);
        if (!isfinite(cur))
            break;
        double tol = CXL__MEAN_RTOL * fmax(fabs(cur), 1e-12 * e->scale);
        if (isfinite(prev) && fabs(cur - prev) <= tol) {
            /* the pattern is zero everywhere (to rounding) */
            st = cur > 1e-13 * e->scale ? CXL_OK : CXL_ERANGE;
            if (st == CXL_OK)
                *mean = cur;
            break;
        }
        prev = cur;
        n_el *= 2;
        n_az *= 2;
    }
    if (ptp)
        pair_table_free(ptp);
    return st;
}

/* ---- peak, null, beamwidth -------------------------------------------- */

/* A coarse step (radians) of about four points per lobe. */
static double coarse_step(const array_eval *e, double per_lobe,
                          double max_deg)
{
    double h = M_PI / (per_lobe * (e->size + 1.0));
    return fmin(h, max_deg * DEG);
}

typedef struct {
    const array_eval *e;
    double lo, hi;
} peak_params;

/* An elevation folded back into lo..hi by reflection at the edges: a
 * maximum on an edge then stays a smooth maximum for the simplex (the
 * pattern of elements in one horizontal plane is even about el = 0). */
static double fold_elevation(double el, double lo, double hi)
{
    for (int i = 0; i < 4 && (el < lo || el > hi); i++)
        el = el < lo ? 2.0 * lo - el : 2.0 * hi - el;
    return fmin(fmax(el, lo), hi);
}

static double neg_power(const gsl_vector *v, void *params)
{
    const peak_params *pp = params;
    double el = fold_elevation(gsl_vector_get(v, 1), pp->lo, pp->hi);
    return -power_at(pp->e, gsl_vector_get(v, 0), el);
}

/* Nelder-Mead from (az, el); improves *best when it finds more. */
static cxl_status refine_peak(const array_eval *e, double lo, double hi,
                              double az, double el, double h, double *best,
                              double *best_az, double *best_el)
{
    peak_params pp = { e, lo, hi };
    gsl_multimin_function fn = { neg_power, 2, &pp };
    gsl_vector *x = gsl_vector_alloc(2), *step = gsl_vector_alloc(2);
    gsl_multimin_fminimizer *m =
        gsl_multimin_fminimizer_alloc(gsl_multimin_fminimizer_nmsimplex2, 2);
    if (!x || !step || !m) {
        gsl_vector_free(x);
        gsl_vector_free(step);
        gsl_multimin_fminimizer_free(m);
        return CXL_ENOMEM;
    }
    gsl_vector_set(x, 0, az);
    gsl_vector_set(x, 1, el);
    gsl_vector_set_all(step, 0.5 * h);
    if (gsl_multimin_fminimizer_set(m, &fn, x, step) == GSL_SUCCESS) {
        for (int it = 0; it < 500; it++) {
            if (gsl_multimin_fminimizer_iterate(m) != GSL_SUCCESS)
                break;
            if (gsl_multimin_test_size(gsl_multimin_fminimizer_size(m),
                                       1e-6) == GSL_SUCCESS)
                break;
        }
        double p = -gsl_multimin_fminimizer_minimum(m);
        if (p > *best) {
            const gsl_vector *xm = gsl_multimin_fminimizer_x(m);
            *best = p;
            *best_az = gsl_vector_get(xm, 0);
            *best_el = fold_elevation(gsl_vector_get(xm, 1), lo, hi);
        }
    }
    gsl_multimin_fminimizer_free(m);
    gsl_vector_free(x);
    gsl_vector_free(step);
    return CXL_OK;
}

/* Keeps the indices of the max best values of v seen so far in cand[],
 * best first (sign +1: largest, -1: smallest); *nc counts them. */
static void keep_best(size_t *cand, size_t *nc, size_t max, const double *v,
                      size_t idx, double sign)
{
    double x = sign * v[idx];
    size_t pos = *nc < max ? (*nc)++ : max;
    if (pos == max) {
        if (!(x > sign * v[cand[max - 1]]))
            return;
        pos = max - 1;
    }
    while (pos > 0 && sign * v[cand[pos - 1]] < x) {
        cand[pos] = cand[pos - 1];
        pos--;
    }
    cand[pos] = idx;
}

/* The coarse grid of find_peak: n_el elevations lo..hi by n_az azimuths. */
typedef struct {
    double lo, hi;
    size_t n_az, n_el;
    double *g;   /* n_el rows of n_az powers */
} peak_grid;

static double grid_el(const peak_grid *pg, size_t i)
{
    return fmin(pg->lo + i * (pg->hi - pg->lo) / (pg->n_el - 1), pg->hi);
}

static cxl_status grid_fill(const array_eval *e, peak_grid *pg)
{
    size_t n_az = pg->n_az;
    pg->g = malloc((n_az * pg->n_el + 2 * n_az) * sizeof *pg->g);
    if (!pg->g)
        return CXL_ENOMEM;
    double *caz = pg->g + n_az * pg->n_el, *saz = caz + n_az;
    for (size_t j = 0; j < n_az; j++) {
        caz[j] = cos(2.0 * M_PI * j / n_az);
        saz[j] = sin(2.0 * M_PI * j / n_az);
    }
    for (size_t i = 0; i < pg->n_el; i++) {
        double el = grid_el(pg, i);
        double ce = cos(el), se = sin(el);
        for (size_t j = 0; j < n_az; j++) {
            double re, im;
            field_dir(e, ce * caz[j], ce * saz[j], se, el, &re, &im);
            pg->g[i * n_az + j] = re * re + im * im;
        }
    }
    return CXL_OK;
}

/* Whether grid point (i, j) is a local maximum (azimuth wraps); a pole is
 * one direction, so only its azimuth 0 counts. */
static int grid_is_max(const peak_grid *pg, size_t i, size_t j)
{
    size_t n_az = pg->n_az;
    double v = pg->g[i * n_az + j];
    if (!(v > 0.0) || (j > 0 && fabs(pg->lo + i * (pg->hi - pg->lo) / (pg->n_el - 1)) >=
                                    0.5 * M_PI - 1e-12))
        return 0;
    for (int di = -1; di <= 1; di++) {
        if ((di < 0 && i == 0) || (di > 0 && i + 1 == pg->n_el))
            continue;
        for (int dj = -1; dj <= 1; dj++) {
            if (!di && !dj)
                continue;
            size_t jj = (j + n_az + (size_t)(dj + 1) - 1) % n_az;
            if (pg->g[(i + di) * n_az + jj] > v)
                return 0;
        }
    }
    return 1;
}

/* The best PEAK_CANDIDATES local maxima of the grid, best first. */
static size_t grid_maxima(const peak_grid *pg, size_t *cand)
{
    size_t nc = 0;
    for (size_t i = 0; i < pg->n_el; i++)
        for (size_t j = 0; j < pg->n_az; j++)
            if (grid_is_max(pg, i, j))
                keep_best(cand, &nc, PEAK_CANDIDATES, pg->g, i * pg->n_az + j, 1.0);
    return nc;
}

/* Largest response over elevation lo..hi: coarse grid, then the simplex
 * from the best few local maxima of the grid. */
static cxl_status find_peak(const array_eval *e, double lo, double hi,
                            double *az_out, double *el_out, double *p_out)
{
    double h = coarse_step(e, 2.0, 10.0);
    peak_grid pg = { lo, hi, (size_t)ceil(2.0 * M_PI / h),
                     (size_t)ceil((hi - lo) / h) + 1, NULL };
    cxl_status st = grid_fill(e, &pg);
    if (st)
        return st;
    size_t cand[PEAK_CANDIDATES], n_az = pg.n_az;
    size_t nc = grid_maxima(&pg, cand);
    const double *g = pg.g;
    double best = -1.0, best_az = 0.0, best_el = lo;
    if (nc > 0) {
        best = g[cand[0]];
        best_az = 2.0 * M_PI * (cand[0] % n_az) / n_az;
        best_el = grid_el(&pg, cand[0] / n_az);
    }
    /* a lobe sampled at least every quarter of its width shows at least
     * half its peak on the grid, so weaker grid maxima cannot win */
    for (size_t c = 0; c < nc && st == CXL_OK && g[cand[c]] >= 0.5 * g[cand[0]];
         c++) {
        double az = 2.0 * M_PI * (cand[c] % n_az) / n_az;
        double el = grid_el(&pg, cand[c] / n_az);
        st = refine_peak(e, lo, hi, az, el, h, &best, &best_az, &best_el);
    }
    free(pg.g);
    if (st)
        return st;
    if (!(best > 0.0))
        return CXL_ERANGE;
    best_az = fmod(best_az, 2.0 * M_PI);
    if (best_az < 0.0)
        best_az += 2.0 * M_PI;
    *az_out = best_az;
    *el_out = best_el;
    *p_out = best;
    return CXL_OK;
}

typedef struct {
    const array_eval *e;
    double el;
} cut_params;

static double cut_power(double az, void *params)
{
    const cut_params *cp = params;
    return power_at(cp->e, az, cp->el);
}

/* Brent minimisation of the cut inside (a, b) around x.  GSL's Brent does
 * not shrink its interval below about sqrt(DBL_EPSILON) |x| (5e-8 rad near
 * pi), so the stop asks for NULL_EPSABS + NULL_EPSREL |x|, which it
 * reaches; the best point it evaluated, usually much nearer the null, is
 * what counts. */
static cxl_status refine_null(cut_params *cp, double x, double a, double b,
                              double *best, double *best_az)
{
    gsl_function fn = { cut_power, cp };
    gsl_min_fminimizer *m = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!m)
        return CXL_ENOMEM;
    if (gsl_min_fminimizer_set(m, &fn, x, a, b) == GSL_SUCCESS) {
        for (int it = 0; it < 200; it++) {
            if (gsl_min_fminimizer_iterate(m) != GSL_SUCCESS)
                break;
            if (gsl_min_test_interval(gsl_min_fminimizer_x_lower(m),
                                      gsl_min_fminimizer_x_upper(m),
                                      NULL_EPSABS, NULL_EPSREL) == GSL_SUCCESS)
                break;
        }
        double p = gsl_min_fminimizer_f_minimum(m);
        if (p < *best) {
            *best = p;
            *best_az = gsl_min_fminimizer_x_minimum(m);
        }
    }
    gsl_min_fminimizer_free(m);
    return CXL_OK;
}

/* Deepest response over azimuth 90..270 at elevation el (radians). */
static cxl_status rear_null(const array_eval *e, double el, double *az_out,
                            double *depth_db)
{
    cut_params cp = { e, el };
    double front = cut_power(0.0, &cp);
    if (!(front > 0.0))
        return CXL_ERANGE;
    double h = coarse_step(e, 8.0, 1.0);
    size_t n = (size_t)ceil(M_PI / h);
    double lo = 0.5 * M_PI, step = M_PI / n;
    double *v = malloc((n + 1) * sizeof *v);
    if (!v)
        return CXL_ENOMEM;
    size_t best_i = 0;
    for (size_t i = 0; i <= n; i++) {
        v[i] = cut_power(lo + i * step, &cp);
        if (v[i] < v[best_i])
            best_i = i;
    }
    double best = v[best_i], best_az = lo + best_i * step;
    /* Brent on the deepest interior local minima (strict brackets); a
     * null on the scan's edge or a flat cut keeps the scan value. */
    size_t cand[NULL_CANDIDATES], nc = 0;
    for (size_t i = 1; i < n; i++)
        if (v[i] < v[i - 1] && v[i] < v[i + 1] && v[i] > 0.0)
            keep_best(cand, &nc, NULL_CANDIDATES, v, i, -1.0);
    cxl_status st = CXL_OK;
    for (size_t c = 0; c < nc && st == CXL_OK; c++) {
        double x = lo + cand[c] * step;
        st = refine_null(&cp, x, x - step, x + step, &best, &best_az);
    }
    free(v);
    if (st)
        return st;
    *az_out = best_az;
    *depth_db = cxl__power_db(best / front);
    return CXL_OK;
}

/* Azimuth (radians, 0..pi) on one side (sign +1 clockwise, -1 counter-
 * clockwise) where the response first falls to half the forward response;
 * pi + 1 when it never does. */
static double half_power_edge(const array_eval *e, double el, double front,
                              double sign, double h)
{
    size_t n = (size_t)ceil(M_PI / h);
    double step = M_PI / n, prev = 0.0;
    for (size_t i = 1; i <= n; i++) {
        double az = i * step;
        if (power_at(e, sign * az, el) <= 0.5 * front) {
            double a = prev, b = az;
            for (int it = 0; it < 60; it++) {
                double m = 0.5 * (a + b);
                if (power_at(e, sign * m, el) <= 0.5 * front)
                    b = m;
                else
                    a = m;
            }
            return 0.5 * (a + b);
        }
        prev = az;
    }
    return M_PI + 1.0;
}

double cxl__power_db(double ratio)
{
    double floor_ratio = pow(10.0, -CXL_DB_LIMIT / 10.0);
    if (!(ratio > floor_ratio))
        return -CXL_DB_LIMIT;
    if (ratio > 1.0 / floor_ratio)
        return CXL_DB_LIMIT;
    return 10.0 * log10(ratio);
}

/* ---- the N-element array: results -------------------------------------- */

cxl_status cxl_array_eval_field(const cxl_array *array, double freq_hz,
                                double azimuth_deg, double elevation_deg,
                                double *field_re, double *field_im)
{
    array_eval e;
    if (!field_re || !field_im || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (st)
        return st;
    field_at(&e, fmod(azimuth_deg, 360.0) * DEG, elevation_deg * DEG,
             field_re, field_im);
    return CXL_OK;
}

cxl_status cxl_array_eval_response(const cxl_array *array, double freq_hz,
                                   double azimuth_deg, double elevation_deg,
                                   double *response_db)
{
    array_eval e;
    if (!response_db || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (st)
        return st;
    *response_db = cxl__power_db(power_at(
        &e, fmod(azimuth_deg, 360.0) * DEG, elevation_deg * DEG));
    return CXL_OK;
}

/* prepare, and the mean response over the whole sphere (the reference of
 * a gain in dBi). */
static cxl_status prepare_sphere(const cxl_array *array, double freq_hz,
                                 array_eval *e, double *mean)
{
    cxl_status st = prepare(array, freq_hz, e);
    if (st)
        return st;
    return mean_power(e, -M_PI / 2.0, M_PI / 2.0, mean);
}

cxl_status cxl_array_eval_pattern(const cxl_array *array, double freq_hz,
                                  double elevation_deg, size_t n,
                                  double *gain_dbi)
{
    array_eval e;
    double mean;
    if (!gain_dbi || n == 0 || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare_sphere(array, freq_hz, &e, &mean);
    if (st)
        return st;
    for (size_t i = 0; i < n; i++)
        gain_dbi[i] = cxl__power_db(
            power_at(&e, 2.0 * M_PI * i / n, elevation_deg * DEG) / mean);
    return CXL_OK;
}

cxl_status cxl_array_eval_gain(const cxl_array *array, double freq_hz,
                               double azimuth_deg, double elevation_deg,
                               double *gain_dbi)
{
    array_eval e;
    double mean;
    if (!gain_dbi || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare_sphere(array, freq_hz, &e, &mean);
    if (st)
        return st;
    *gain_dbi = cxl__power_db(
        power_at(&e, fmod(azimuth_deg, 360.0) * DEG, elevation_deg * DEG) /
        mean);
    return CXL_OK;
}

cxl_status cxl_array_eval_front_to_back(const cxl_array *array,
                                        double freq_hz, double elevation_deg,
                                        double *ratio_db)
{
    array_eval e;
    if (!ratio_db || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (st)
        return st;
    double el = elevation_deg * DEG;
    double front = power_at(&e, 0.0, el), back = power_at(&e, M_PI, el);
    if (!(front > 0.0) && !(back > 0.0))
        return CXL_ERANGE;
    *ratio_db = back > 0.0 ? cxl__power_db(front / back) : CXL_DB_LIMIT;
    return CXL_OK;
}

cxl_status cxl_array_eval_rear_null(const cxl_array *array, double freq_hz,
                                    double elevation_deg, double *azimuth_deg,
                                    double *depth_db)
{
    array_eval e;
    double az, depth;
    if (!azimuth_deg || !depth_db || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (!st)
        st = rear_null(&e, elevation_deg * DEG, &az, &depth);
    if (st)
        return st;
    *azimuth_deg = az / DEG;
    *depth_db = depth;
    return CXL_OK;
}

cxl_status cxl_array_eval_beamwidth(const cxl_array *array, double freq_hz,
                                    double elevation_deg, double *width_deg)
{
    array_eval e;
    if (!width_deg || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (st)
        return st;
    double el = elevation_deg * DEG;
    double front = power_at(&e, 0.0, el);
    if (!(front > 0.0))
        return CXL_ERANGE;
    double h = coarse_step(&e, 8.0, 1.0);
    double cw = half_power_edge(&e, el, front, 1.0, h);
    double ccw = half_power_edge(&e, el, front, -1.0, h);
    *width_deg = cw > M_PI || ccw > M_PI ? 360.0 : (cw + ccw) / DEG;
    return CXL_OK;
}

cxl_status cxl_array_eval_peak(const cxl_array *array, double freq_hz,
                               double *azimuth_deg, double *elevation_deg)
{
    array_eval e;
    double az, el, p;
    if (!azimuth_deg || !elevation_deg)
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (!st)
        st = find_peak(&e, 0.0, M_PI / 2.0, &az, &el, &p);
    if (st)
        return st;
    *azimuth_deg = az / DEG;
    *elevation_deg = el / DEG;
    return CXL_OK;
}

cxl_status cxl_array_eval_directivity(const cxl_array *array, double freq_hz,
                                      double *directivity_dbi)
{
    array_eval e;
    double az, el, peak, mean;
    if (!directivity_dbi)
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (!st)
        st = find_peak(&e, -M_PI / 2.0, M_PI / 2.0, &az, &el, &peak);
    if (!st)
        st = mean_power(&e, -M_PI / 2.0, M_PI / 2.0, &mean);
    if (st)
        return st;
    *directivity_dbi = cxl__power_db(peak / mean);
    return CXL_OK;
}

cxl_status cxl_array_eval_rdf(const cxl_array *array, double freq_hz,
                              double elevation_deg, double *rdf_forward_db,
                              double *rdf_peak_db)
{
    array_eval e;
    double az, el, peak, mean;
    if (!rdf_forward_db || !rdf_peak_db || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(array, freq_hz, &e);
    if (!st)
        st = mean_power(&e, 0.0, M_PI / 2.0, &mean);
    if (!st)
        st = find_peak(&e, 0.0, M_PI / 2.0, &az, &el, &peak);
    if (st)
        return st;
    double forward = power_at(&e, 0.0, elevation_deg * DEG);
    *rdf_forward_db = cxl__power_db(forward / mean);
    *rdf_peak_db = cxl__power_db(peak / mean);
    return CXL_OK;
}

/* ---- the two-element pair: a thin layer over the N-element code -------- */

cxl_status cxl_duo_new(cxl_duo **pair)
{
    if (!pair)
        return CXL_EINVAL;
    cxl_duo *p = calloc(1, sizeof *p);
    if (!p)
        return CXL_ENOMEM;
    p->element = CXL_ELEMENT_ISOTROPIC;
    p->wire_vf = 1.0;
    *pair = p;
    return CXL_OK;
}

void cxl_duo_free(cxl_duo *pair)
{
    free(pair);
}

cxl_status cxl_duo_copy(const cxl_duo *pair,
                        cxl_duo **copy)
{
    if (!pair || !copy)
        return CXL_EINVAL;
    cxl_duo *p = malloc(sizeof *p);
    if (!p)
        return CXL_ENOMEM;
    *p = *pair;
    *copy = p;
    return CXL_OK;
}

cxl_status cxl_duo_set_geometry(cxl_duo *pair,
                                double spacing_m, double stagger_m)
{
    if (!pair || !cxl__finite_nonneg(spacing_m) || !isfinite(stagger_m))
        return CXL_EINVAL;
    pair->spacing_m = spacing_m;
    pair->stagger_m = stagger_m;
    return CXL_OK;
}

static int valid_element(int element)
{
    return element == 0 || element == 1;
}

cxl_status cxl_duo_set_delay(cxl_duo *pair, int element,
                             double delay_s)
{
    if (!pair || !valid_element(element) || !cxl__finite_nonneg(delay_s))
        return CXL_EINVAL;
    pair->delay_s[element] = delay_s;
    return CXL_OK;
}

cxl_status cxl_duo_set_delay_deg(cxl_duo *pair, int element,
                                 double phase_deg,
                                 double design_freq_hz)
{
    if (!pair || !valid_element(element) || !cxl__finite_nonneg(phase_deg) ||
        !cxl__finite_pos(design_freq_hz))
        return CXL_EINVAL;
    pair->delay_s[element] = phase_deg / (360.0 * design_freq_hz);
    return CXL_OK;
}

cxl_status cxl_duo_set_phase_offset(cxl_duo *pair,
                                    int element, double phase_deg)
{
    if (!pair || !valid_element(element) || !isfinite(phase_deg))
        return CXL_EINVAL;
    pair->phase_rad[element] = phase_deg * DEG;
    return CXL_OK;
}

cxl_status cxl_duo_set_flip(cxl_duo *pair, int element,
                            int flipped)
{
    if (!pair || !valid_element(element))
        return CXL_EINVAL;
    pair->flip[element] = flipped != 0;
    return CXL_OK;
}

cxl_status cxl_duo_set_imbalance(cxl_duo *pair,
                                 double imbalance_db)
{
    if (!pair || !isfinite(imbalance_db) || fabs(imbalance_db) > 200.0)
        return CXL_EINVAL;
    pair->imbalance_db = imbalance_db;
    return CXL_OK;
}

cxl_status cxl_duo_set_isotropic(cxl_duo *pair)
{
    if (!pair)
        return CXL_EINVAL;
    pair->element = CXL_ELEMENT_ISOTROPIC;
    return CXL_OK;
}

cxl_status cxl_duo_set_long_wire(cxl_duo *pair,
                                 double length_m, double wire_vf)
{
    if (!pair || !cxl__finite_pos(length_m) || !cxl__valid_vf(wire_vf))
        return CXL_EINVAL;
    pair->element = CXL_ELEMENT_WIRE;
    pair->wire_length_m = length_m;
    pair->wire_vf = wire_vf;
    return CXL_OK;
}

/* The pair as a two-element array in buf (no allocation): element 0 at
 * (+stagger/2, -spacing/2), element 1 at (-stagger/2, +spacing/2);
 * extra_phase_rad is added to element 1. */
static const cxl_array *pair_as_array(const cxl_duo *p,
                                      double extra_phase_rad, cxl_array *a,
                                      array_elem buf[2])
{
    if (!p)
        return NULL;
    memset(buf, 0, 2 * sizeof *buf);
    for (int i = 0; i < 2; i++) {
        double s = i ? -0.5 : 0.5;
        buf[i].x_m = s * p->stagger_m;
        buf[i].y_m = -s * p->spacing_m;
        buf[i].delay_s = p->delay_s[i];
        buf[i].phase_rad = p->phase_rad[i];
        buf[i].reversed = p->flip[i];
    }
    buf[1].weight_db = -p->imbalance_db;
    buf[1].phase_rad += extra_phase_rad;
    a->n = a->cap = 2;
    a->el = buf;
    a->kind = p->element;
    a->wire_length_m = p->wire_length_m;
    a->wire_vf = p->wire_vf;
    return a;
}

#define AS_ARRAY(pair) pair_as_array((pair), 0.0, &tmp_, buf_)
#define PAIR_LOCALS cxl_array tmp_; array_elem buf_[2]

cxl_status cxl_duo_field(const cxl_duo *pair, double freq_hz,
                         double azimuth_deg, double elevation_deg,
                         double *field_re, double *field_im)
{
    PAIR_LOCALS;
    return cxl_array_eval_field(AS_ARRAY(pair), freq_hz, azimuth_deg,
                                elevation_deg, field_re, field_im);
}

cxl_status cxl_duo_response(const cxl_duo *pair, double freq_hz,
                            double azimuth_deg, double elevation_deg,
                            double *response_db)
{
    PAIR_LOCALS;
    return cxl_array_eval_response(AS_ARRAY(pair), freq_hz, azimuth_deg,
                                   elevation_deg, response_db);
}

cxl_status cxl_duo_pattern(const cxl_duo *pair, double freq_hz,
                           double elevation_deg, size_t n,
                           double *gain_dbi)
{
    PAIR_LOCALS;
    return cxl_array_eval_pattern(AS_ARRAY(pair), freq_hz, elevation_deg, n,
                                  gain_dbi);
}

cxl_status cxl_duo_gain(const cxl_duo *pair, double freq_hz,
                        double azimuth_deg, double elevation_deg,
                        double *gain_dbi)
{
    PAIR_LOCALS;
    return cxl_array_eval_gain(AS_ARRAY(pair), freq_hz, azimuth_deg,
                               elevation_deg, gain_dbi);
}

cxl_status cxl_duo_forward_gain(const cxl_duo *pair, double freq_hz,
                                double elevation_deg, double *gain_dbi)
{
    return cxl_duo_gain(pair, freq_hz, 0.0, elevation_deg, gain_dbi);
}

cxl_status cxl__array_front_to_back(const cxl_duo *pair,
                                    double freq_hz, double elevation_deg,
                                    double extra_phase_rad, double *ratio_db)
{
    PAIR_LOCALS;
    if (!isfinite(extra_phase_rad))
        return CXL_EINVAL;
    return cxl_array_eval_front_to_back(
        pair_as_array(pair, fmod(extra_phase_rad, 2.0 * M_PI), &tmp_, buf_),
        freq_hz, elevation_deg, ratio_db);
}

cxl_status cxl_duo_front_to_back(const cxl_duo *pair,
                                 double freq_hz, double elevation_deg,
                                 double *ratio_db)
{
    return cxl__array_front_to_back(pair, freq_hz, elevation_deg, 0.0,
                                    ratio_db);
}

cxl_status cxl_duo_rear_null(const cxl_duo *pair, double freq_hz,
                             double elevation_deg, double *azimuth_deg,
                             double *depth_db)
{
    PAIR_LOCALS;
    return cxl_array_eval_rear_null(AS_ARRAY(pair), freq_hz, elevation_deg,
                                    azimuth_deg, depth_db);
}

cxl_status cxl_duo_peak(const cxl_duo *pair, double freq_hz,
                        double *azimuth_deg, double *elevation_deg)
{
    PAIR_LOCALS;
    return cxl_array_eval_peak(AS_ARRAY(pair), freq_hz, azimuth_deg,
                               elevation_deg);
}

cxl_status cxl_duo_directivity(const cxl_duo *pair, double freq_hz,
                               double *directivity_dbi)
{
    PAIR_LOCALS;
    return cxl_array_eval_directivity(AS_ARRAY(pair), freq_hz,
                                      directivity_dbi);
}

cxl_status cxl_duo_rdf(const cxl_duo *pair, double freq_hz,
                       double *rdf_db)
{
    PAIR_LOCALS;
    double fwd;
    if (!rdf_db)
        return CXL_EINVAL;
    return cxl_array_eval_rdf(AS_ARRAY(pair), freq_hz, 0.0, &fwd, rdf_db);
}

cxl_status cxl_duo_null_depth(double phase_error_deg, double imbalance_db,
                              double *depth_db)
{
    if (!depth_db || !isfinite(phase_error_deg) || !isfinite(imbalance_db) ||
        fabs(imbalance_db) > 200.0)
        return CXL_EINVAL;
    double a = pow(10.0, -imbalance_db / 20.0);
    double s = sin(0.5 * phase_error_deg * DEG);
    /* 1 - 2a cos d + a^2 = (1 - a)^2 + 4 a sin^2(d/2), without cancellation */
    double num = (1.0 - a) * (1.0 - a) + 4.0 * a * s * s;
    *depth_db = cxl__power_db(num / ((1.0 + a) * (1.0 + a)));
    return CXL_OK;
}

/* ---- hooks for the Monte-Carlo of yield.c (internal.h) ------------------ */

cxl_status cxl__array_feeds(const cxl_array *array, double freq_hz,
                            cxl__array_feed *feeds)
{
    if (!array || !feeds || !cxl__finite_pos(freq_hz) || array->n == 0)
        return CXL_EINVAL;
    double omega = 2.0 * M_PI * freq_hz;
    if (!isfinite(omega))
        return CXL_ERANGE;
    for (size_t i = 0; i < array->n; i++) {
        cxl__array_feed *fd = &feeds[i];
        cxl_status st = feed_of(&array->el[i], freq_hz, omega, fd);
        if (st)
            return st;
        if (!isfinite(fd->phase_rad) || !isfinite(fd->line_vf) ||
            !isfinite(fd->alpha_np_per_m) ||
            (fd->line_m > 0.0 && !(fd->line_vf > 0.0)))
            return CXL_ERANGE;
    }
    return CXL_OK;
}

cxl_status cxl__array_eval_new(const cxl_array *array, double freq_hz,
                               cxl__array_eval **eval)
{
    if (!eval)
        return CXL_EINVAL;
    array_eval *e = malloc(sizeof *e);
    if (!e)
        return CXL_ENOMEM;
    cxl_status st = prepare(array, freq_hz, e);
    if (st) {
        free(e);
        return st;
    }
    *eval = e;
    return CXL_OK;
}

void cxl__array_eval_steer(const cxl__array_eval *e, double az_rad,
                           double el_rad, double *re, double *im)
{
    double ce = cos(el_rad);
    double ux = ce * cos(az_rad), uy = ce * sin(az_rad), uz = sin(el_rad);
    double f = element_field(e, ux, el_rad);
    for (size_t i = 0; i < e->n; i++) {
        double ph, g = f;
        if (e->kind == CXL_ELEMENT_VERTICAL) {
            ph = e->kx[i] * ux + e->ky[i] * uy;
            g *= 2.0 * cos(e->kz[i] * uz);   /* element + image */
        } else {
            ph = e->kx[i] * ux + e->ky[i] * uy + e->kz[i] * uz;
        }
        re[i] = g * cos(ph);
        im[i] = g * sin(ph);
    }
}

void cxl__array_eval_set_weight(cxl__array_eval *e, size_t i, double re,
                                double im)
{
    e->wr[i] = re;
    e->wi[i] = im;
}

cxl_status cxl__array_eval_rear_null(const cxl__array_eval *e, double el_rad,
                                     double *depth_db)
{
    double az;
    return rear_null(e, el_rad, &az, depth_db);
}

/* ---- design feed and as-built errors of the pair ----------------------
 *
 * Crossfire: a wave from the rear reaches the rear element first, by the
 * stagger's free-space delay; the rear element waits that long and is
 * inverted, so the rear wave cancels at every frequency (broadband).
 * End-fire: the front element waits 180 degrees minus the stagger's
 * electrical length at the design frequency, so a rear wave arrives 180
 * degrees apart there only (Balanis, Antenna Theory, 3rd ed., sec. 6.3:
 * the progressive phase beta = -kd of the ordinary end-fire array, plus the
 * half turn). */
cxl_status cxl_duo_set_feed(cxl_duo *pair, cxl_feed feed,
                            double design_freq_hz)
{
    if (!pair || (feed != CXL_FEED_CROSSFIRE && feed != CXL_FEED_ENDFIRE) ||
        !cxl__finite_nonneg(design_freq_hz) || pair->stagger_m == 0.0)
        return CXL_EINVAL;
    if (feed == CXL_FEED_ENDFIRE && !(design_freq_hz > 0.0)) return CXL_EINVAL;
    int front = pair->stagger_m > 0.0 ? 0 : 1, rear = 1 - front;
    double lag_s, deg;
    cxl_status st = cxl_line_delay_from_offset(fabs(pair->stagger_m), &lag_s);
    if (st != CXL_OK) return st;
    if (feed == CXL_FEED_CROSSFIRE) {
        pair->delay_s[front] = 0.0;
        pair->delay_s[rear] = lag_s;
        pair->flip[front] = 0;
        pair->flip[rear] = 1;
        return CXL_OK;
    }
    st = cxl_line_degrees_from_delay(lag_s, design_freq_hz, &deg);
    if (st != CXL_OK) return st;
    deg = fmod(180.0 - deg, 360.0);
    if (deg < 0.0) deg += 360.0;
    if (!isfinite(deg / (360.0 * design_freq_hz))) return CXL_ERANGE;
    st = cxl_duo_set_delay_deg(pair, front, deg, design_freq_hz);
    if (st != CXL_OK) return st;
    pair->delay_s[rear] = 0.0;
    pair->flip[0] = pair->flip[1] = 0;
    return CXL_OK;
}

cxl_status cxl_duo_feed(const cxl_duo *pair, int element,
                        double *delay_s, int *flipped)
{
    if (!pair || !valid_element(element) || !delay_s || !flipped) return CXL_EINVAL;
    *delay_s = pair->delay_s[element];
    *flipped = pair->flip[element];
    return CXL_OK;
}

cxl_status cxl_duo_built_phase(const double *design_delay_s,
                               const double *built_delay_s,
                               double extra_phase_deg, double freq_hz,
                               double *phase_error_deg)
{
    if (!design_delay_s || !built_delay_s || !phase_error_deg || !cxl__finite_pos(freq_hz) ||
        !isfinite(extra_phase_deg))
        return CXL_EINVAL;
    for (int k = 0; k < 2; k++)
        if (!cxl__finite_nonneg(design_delay_s[k]) || !cxl__finite_nonneg(built_delay_s[k]))
            return CXL_EINVAL;
    /* extra lag of B over A against the design */
    double extra_s = (built_delay_s[1] - built_delay_s[0]) -
                     (design_delay_s[1] - design_delay_s[0]);
    double deg;
    cxl_status st = cxl_line_degrees_from_delay(extra_s, freq_hz, &deg);
    if (st != CXL_OK) return st;
    return cxl__put_finite(remainder(deg + extra_phase_deg, 360.0), phase_error_deg);
}
