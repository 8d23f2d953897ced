/* array.c - pattern of a two-element receive pair in free space: response,
 * gain, front-to-back ratio, rear null, directivity and receiving
 * directivity factor.  The model is described in coaxline.h.
 *
 * The pair's output is |a0 + a1 e^{j psi}|^2 = (a0 - a1)^2 + 4 a0 a1
 * cos^2(psi/2) (sin^2 when one element is flipped), psi the phase of
 * element 1 relative to element 0.  Written this way a deep null keeps its
 * precision instead of cancelling a0^2 + a1^2 against 2 a0 a1. */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_multimin.h>
#include "coaxline.h"
#include "internal.h"

#define DEG (M_PI / 180.0)
/* Two successive estimates of a mean must agree this closely. */
#define CXL__MEAN_RTOL 1e-10

enum { ELEMENT_ISOTROPIC = 0, ELEMENT_LONG_WIRE = 1 };

struct cxl_array_pair {
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

/* What depends on the frequency only, worked out once per call. */
typedef struct {
    double k;        /* free-space wavenumber, rad/m */
    double dx, dy;   /* position of element 1 minus element 0, m */
    double a0, a1;   /* amplitudes */
    double psi0;     /* feed phase of element 1 relative to element 0, rad */
    int flipped;     /* exactly one element inverted */
    int wire;
    double wire_x;   /* pi L / lambda */
    double inv_p;    /* 1 / wire VF */
    double size;     /* electrical size: sets grid steps and node counts */
} pair_eval;

cxl_status cxl_array_pair_new(cxl_array_pair **pair)
{
    if (!pair)
        return CXL_EINVAL;
    cxl_array_pair *p = calloc(1, sizeof *p);
    if (!p)
        return CXL_ENOMEM;
    p->element = ELEMENT_ISOTROPIC;
    p->wire_vf = 1.0;
    *pair = p;
    return CXL_OK;
}

void cxl_array_pair_free(cxl_array_pair *pair)
{
    free(pair);
}

cxl_status cxl_array_pair_copy(const cxl_array_pair *pair,
                               cxl_array_pair **copy)
{
    if (!pair || !copy)
        return CXL_EINVAL;
    cxl_array_pair *p = malloc(sizeof *p);
    if (!p)
        return CXL_ENOMEM;
    *p = *pair;
    *copy = p;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_geometry(cxl_array_pair *pair,
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

cxl_status cxl_array_pair_set_delay(cxl_array_pair *pair, int element,
                                    double delay_s)
{
    if (!pair || !valid_element(element) || !cxl__finite_nonneg(delay_s))
        return CXL_EINVAL;
    pair->delay_s[element] = delay_s;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_delay_deg(cxl_array_pair *pair, int element,
                                        double phase_deg,
                                        double design_freq_hz)
{
    if (!pair || !valid_element(element) || !cxl__finite_nonneg(phase_deg) ||
        !cxl__finite_pos(design_freq_hz))
        return CXL_EINVAL;
    pair->delay_s[element] = phase_deg / (360.0 * design_freq_hz);
    return CXL_OK;
}

cxl_status cxl_array_pair_set_phase_offset(cxl_array_pair *pair,
                                           int element, double phase_deg)
{
    if (!pair || !valid_element(element) || !isfinite(phase_deg))
        return CXL_EINVAL;
    pair->phase_rad[element] = phase_deg * DEG;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_flip(cxl_array_pair *pair, int element,
                                   int flipped)
{
    if (!pair || !valid_element(element))
        return CXL_EINVAL;
    pair->flip[element] = flipped != 0;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_imbalance(cxl_array_pair *pair,
                                        double imbalance_db)
{
    if (!pair || !isfinite(imbalance_db) || fabs(imbalance_db) > 200.0)
        return CXL_EINVAL;
    pair->imbalance_db = imbalance_db;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_isotropic(cxl_array_pair *pair)
{
    if (!pair)
        return CXL_EINVAL;
    pair->element = ELEMENT_ISOTROPIC;
    return CXL_OK;
}

cxl_status cxl_array_pair_set_long_wire(cxl_array_pair *pair,
                                        double length_m, double wire_vf)
{
    if (!pair || !cxl__finite_pos(length_m) || !cxl__valid_vf(wire_vf))
        return CXL_EINVAL;
    pair->element = ELEMENT_LONG_WIRE;
    pair->wire_length_m = length_m;
    pair->wire_vf = wire_vf;
    return CXL_OK;
}

static cxl_status prepare(const cxl_array_pair *pair, double freq_hz,
                          double extra_phase_rad, pair_eval *e)
{
    if (!pair || !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    double omega = 2.0 * M_PI * freq_hz;
    e->k = omega / CXL_C_M_PER_S;
    if (!isfinite(e->k) || e->k <= 0.0)
        return CXL_ERANGE;
    e->dx = -pair->stagger_m;
    e->dy = pair->spacing_m;
    e->a0 = 1.0;
    e->a1 = pow(10.0, -pair->imbalance_db / 20.0);
    double psi = -omega * (pair->delay_s[1] - pair->delay_s[0]) +
                 (pair->phase_rad[1] - pair->phase_rad[0]) + extra_phase_rad;
    if (!isfinite(psi))
        return CXL_ERANGE;
    e->psi0 = fmod(psi, 2.0 * M_PI);   /* exact; keeps the sum small */
    e->flipped = pair->flip[0] != pair->flip[1];
    e->wire = pair->element == ELEMENT_LONG_WIRE;
    e->wire_x = e->wire ? M_PI * pair->wire_length_m * freq_hz /
                              CXL_C_M_PER_S : 0.0;
    e->inv_p = 1.0 / pair->wire_vf;
    e->size = e->k * hypot(e->dx, e->dy) + 2.0 * e->wire_x;
    if (!isfinite(e->size) || e->size > 1e4)
        return CXL_ERANGE;   /* thousands of wavelengths: not a pair model */
    return CXL_OK;
}

/* Element pattern squared; cos_t is the cosine of the angle from +x. */
static double element_power(const pair_eval *e, double cos_t)
{
    if (!e->wire)
        return 1.0;
    double sin2 = (1.0 - cos_t) * (1.0 + cos_t);
    double x = e->wire_x * (e->inv_p - cos_t);
    double sinc = fabs(x) < 1e-4 ? 1.0 - x * x / 6.0 : sin(x) / x;
    return sin2 * sinc * sinc;
}

/* Phase of element 1 relative to element 0 for a wave from (az, el). */
static double pair_psi(const pair_eval *e, double az, double el,
                       double *cos_t)
{
    double ce = cos(el);
    double ux = ce * cos(az), uy = ce * sin(az);
    *cos_t = ux;
    return e->k * (ux * e->dx + uy * e->dy) + e->psi0;
}

static double pair_power(const pair_eval *e, double az, double el)
{
    double cos_t;
    double h = 0.5 * pair_psi(e, az, el, &cos_t);
    double c = e->flipped ? sin(h) : cos(h);
    double d = e->a0 - e->a1;
    return (d * d + 4.0 * e->a0 * e->a1 * c * c) * element_power(e, cos_t);
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

/* Mean of the response over elevation lo..hi (radians) and all azimuths,
 * weighted by solid angle. */
static double product_rule(const pair_eval *e, double lo, double hi,
                           const gsl_integration_glfixed_table *t,
                           size_t n_el, size_t n_az)
{
    csum total = { 0.0, 0.0 };
    for (size_t i = 0; i < n_el; i++) {
        double el, w;
        gsl_integration_glfixed_point(lo, hi, i, &el, &w, t);
        csum ring = { 0.0, 0.0 };
        for (size_t j = 0; j < n_az; j++)
            csum_add(&ring, pair_power(e, 2.0 * M_PI * (j + 0.5) / n_az, el));
        csum_add(&total, w * cos(el) * (ring.sum + ring.c) / n_az);
    }
    return (total.sum + total.c) / (sin(hi) - sin(lo));
}

static cxl_status mean_power(const pair_eval *e, double lo, double hi,
                             double *mean)
{
    size_t n_el = 16 + (size_t)ceil(e->size);
    size_t n_az = 32 + 2 * (size_t)ceil(e->size);
    double prev = NAN;
    while (n_el <= 8192) {
        gsl_integration_glfixed_table *t =
            gsl_integration_glfixed_table_alloc(n_el);
        if (!t)
            return CXL_ENOMEM;
        double cur = product_rule(e, lo, hi, t, n_el, n_az);
        gsl_integration_glfixed_table_free(t);
        if (!isfinite(cur))
            return CXL_ENOCONV;
        if (isfinite(prev) && fabs(cur - prev) <= CXL__MEAN_RTOL * fabs(cur)) {
            if (!(cur > 0.0))
                return CXL_ERANGE;   /* the pattern is zero everywhere */
            *mean = cur;
            return CXL_OK;
        }
        prev = cur;
        n_el *= 2;
        n_az *= 2;
    }
    return CXL_ENOCONV;
}

/* A coarse grid step (radians) fine enough to see every lobe. */
static double grid_step(const pair_eval *e, double max_deg)
{
    double h = M_PI / (8.0 * (e->size + 1.0));
    return fmin(h, max_deg * DEG);
}

typedef struct {
    const pair_eval *e;
    double lo, hi;
} peak_params;

static double neg_power(const gsl_vector *v, void *params)
{
    const peak_params *pp = params;
    double el = fmin(fmax(gsl_vector_get(v, 1), pp->lo), pp->hi);
    return -pair_power(pp->e, gsl_vector_get(v, 0), el);
}

/* Largest response over elevation lo..hi: grid, then Nelder-Mead. */
static cxl_status find_peak(const pair_eval *e, double lo, double hi,
                            double *az_out, double *el_out, double *p_out)
{
    double h = grid_step(e, 1.0);
    size_t n_az = (size_t)ceil(2.0 * M_PI / h);
    size_t n_el = (size_t)ceil((hi - lo) / h) + 1;
    double best = -1.0, best_az = 0.0, best_el = lo;
    for (size_t i = 0; i < n_el; i++) {
        double el = fmin(lo + i * (hi - lo) / (n_el - 1), hi);
        for (size_t j = 0; j < n_az; j++) {
            double az = 2.0 * M_PI * j / n_az;
            double p = pair_power(e, az, el);
            if (p > best) {
                best = p;
                best_az = az;
                best_el = el;
            }
        }
    }
    if (!(best > 0.0))
        return CXL_ERANGE;

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
    gsl_vector_set(x, 0, best_az);
    gsl_vector_set(x, 1, best_el);
    gsl_vector_set_all(step, 0.5 * h);
    if (gsl_multimin_fminimizer_set(m, &fn, x, step) == GSL_SUCCESS) {
        for (int it = 0; it < 2000; it++) {
            if (gsl_multimin_fminimizer_iterate(m) != GSL_SUCCESS)
                break;
            if (gsl_multimin_test_size(gsl_multimin_fminimizer_size(m),
                                       1e-10) == GSL_SUCCESS)
                break;
        }
        double p = -gsl_multimin_fminimizer_minimum(m);
        if (p > best) {
            const gsl_vector *xm = gsl_multimin_fminimizer_x(m);
            best = p;
            best_az = gsl_vector_get(xm, 0);
            best_el = fmin(fmax(gsl_vector_get(xm, 1), lo), hi);
        }
    }
    gsl_multimin_fminimizer_free(m);
    gsl_vector_free(x);
    gsl_vector_free(step);

    best_az = fmod(best_az, 2.0 * M_PI);
    if (best_az < 0.0)
        best_az += 2.0 * M_PI;
    *az_out = best_az;
    *el_out = best_el;
    *p_out = best;
    return CXL_OK;
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

cxl_status cxl_array_field(const cxl_array_pair *pair, double freq_hz,
                           double azimuth_deg, double elevation_deg,
                           double *field_re, double *field_im)
{
    pair_eval e;
    if (!field_re || !field_im || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, 0.0, &e);
    if (st)
        return st;
    /* Phase reference: element 0 at the origin of the feed phases. */
    double az = azimuth_deg * DEG, el = elevation_deg * DEG;
    double ce = cos(el), ux = ce * cos(az), uy = ce * sin(az);
    double omega = 2.0 * M_PI * freq_hz;
    double ph[2], x[2] = { 0.5 * pair->stagger_m, -0.5 * pair->stagger_m };
    double y[2] = { -0.5 * pair->spacing_m, 0.5 * pair->spacing_m };
    double amp[2] = { e.a0, e.a1 };
    double re = 0.0, im = 0.0;
    double en = sqrt(element_power(&e, ux));
    if (e.wire) {
        /* The sign of the sinc factor is part of the field. */
        double arg = e.wire_x * (e.inv_p - ux);
        if (fabs(arg) >= 1e-4 && sin(arg) / arg < 0.0)
            en = -en;
    }
    for (int i = 0; i < 2; i++) {
        ph[i] = e.k * (ux * x[i] + uy * y[i]) -
                fmod(omega * pair->delay_s[i], 2.0 * M_PI) +
                pair->phase_rad[i];
        double q = pair->flip[i] ? -1.0 : 1.0;
        re += q * amp[i] * cos(ph[i]);
        im += q * amp[i] * sin(ph[i]);
    }
    *field_re = en * re;
    *field_im = en * im;
    return CXL_OK;
}

cxl_status cxl_array_response(const cxl_array_pair *pair, double freq_hz,
                              double azimuth_deg, double elevation_deg,
                              double *response_db)
{
    pair_eval e;
    if (!response_db || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, 0.0, &e);
    if (st)
        return st;
    *response_db = cxl__power_db(
        pair_power(&e, azimuth_deg * DEG, elevation_deg * DEG));
    return CXL_OK;
}

/* prepare, and the mean response over the whole sphere (the reference of
 * a gain in dBi). */
static cxl_status prepare_sphere(const cxl_array_pair *pair, double freq_hz,
                                 pair_eval *e, double *mean)
{
    cxl_status st = prepare(pair, freq_hz, 0.0, e);
    if (st)
        return st;
    return mean_power(e, -M_PI / 2.0, M_PI / 2.0, mean);
}

cxl_status cxl_array_pattern(const cxl_array_pair *pair, double freq_hz,
                             double elevation_deg, size_t n,
                             double *gain_dbi)
{
    pair_eval e;
    double mean;
    if (!gain_dbi || n == 0 || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare_sphere(pair, freq_hz, &e, &mean);
    if (st)
        return st;
    for (size_t i = 0; i < n; i++)
        gain_dbi[i] = cxl__power_db(
            pair_power(&e, 2.0 * M_PI * i / n, elevation_deg * DEG) / mean);
    return CXL_OK;
}

cxl_status cxl_array_gain(const cxl_array_pair *pair, double freq_hz,
                          double azimuth_deg, double elevation_deg,
                          double *gain_dbi)
{
    pair_eval e;
    double mean;
    if (!gain_dbi || !isfinite(azimuth_deg) ||
        !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare_sphere(pair, freq_hz, &e, &mean);
    if (st)
        return st;
    *gain_dbi = cxl__power_db(
        pair_power(&e, azimuth_deg * DEG, elevation_deg * DEG) / mean);
    return CXL_OK;
}

cxl_status cxl_array_forward_gain(const cxl_array_pair *pair, double freq_hz,
                                  double elevation_deg, double *gain_dbi)
{
    return cxl_array_gain(pair, freq_hz, 0.0, elevation_deg, gain_dbi);
}

cxl_status cxl__array_front_to_back(const cxl_array_pair *pair,
                                    double freq_hz, double elevation_deg,
                                    double extra_phase_rad, double *ratio_db)
{
    pair_eval e;
    if (!ratio_db || !valid_elevation(elevation_deg) ||
        !isfinite(extra_phase_rad))
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, extra_phase_rad, &e);
    if (st)
        return st;
    double el = elevation_deg * DEG;
    double front = pair_power(&e, 0.0, el), back = pair_power(&e, M_PI, el);
    if (!(front > 0.0) && !(back > 0.0))
        return CXL_ERANGE;
    *ratio_db = back > 0.0 ? cxl__power_db(front / back) : CXL_DB_LIMIT;
    return CXL_OK;
}

cxl_status cxl_array_front_to_back(const cxl_array_pair *pair,
                                   double freq_hz, double elevation_deg,
                                   double *ratio_db)
{
    return cxl__array_front_to_back(pair, freq_hz, elevation_deg, 0.0,
                                    ratio_db);
}

typedef struct {
    const pair_eval *e;
    double el;
} cut_params;

static double cut_power(double az, void *params)
{
    const cut_params *cp = params;
    return pair_power(cp->e, az, cp->el);
}

cxl_status cxl_array_rear_null(const cxl_array_pair *pair, double freq_hz,
                               double elevation_deg, double *azimuth_deg,
                               double *depth_db)
{
    pair_eval e;
    if (!azimuth_deg || !depth_db || !valid_elevation(elevation_deg))
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, 0.0, &e);
    if (st)
        return st;
    cut_params cp = { &e, elevation_deg * DEG };
    double front = cut_power(0.0, &cp);
    if (!(front > 0.0))
        return CXL_ERANGE;

    double h = grid_step(&e, 0.25);
    size_t n = (size_t)ceil(M_PI / h);
    double lo = 0.5 * M_PI, step = M_PI / n;
    size_t best_i = 0;
    double best = cut_power(lo, &cp);
    for (size_t i = 1; i <= n; i++) {
        double p = cut_power(lo + i * step, &cp);
        if (p < best) {
            best = p;
            best_i = i;
        }
    }
    double best_az = lo + best_i * step;

    /* Brent needs a strict bracket; a null on the grid edge or a flat cut
     * keeps the grid value. */
    if (best_i > 0 && best_i < n && best > 0.0) {
        double a = best_az - step, b = best_az + step;
        if (best < cut_power(a, &cp) && best < cut_power(b, &cp)) {
            gsl_function fn = { cut_power, &cp };
            gsl_min_fminimizer *m =
                gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
            if (!m)
                return CXL_ENOMEM;
            if (gsl_min_fminimizer_set(m, &fn, best_az, a, b) ==
                GSL_SUCCESS) {
                for (int it = 0; it < 200; it++) {
                    if (gsl_min_fminimizer_iterate(m) != GSL_SUCCESS)
                        break;
                    if (gsl_min_test_interval(
                            gsl_min_fminimizer_x_lower(m),
                            gsl_min_fminimizer_x_upper(m), 1e-13, 0.0) ==
                        GSL_SUCCESS)
                        break;
                }
                double p = gsl_min_fminimizer_f_minimum(m);
                if (p < best) {
                    best = p;
                    best_az = gsl_min_fminimizer_x_minimum(m);
                }
            }
            gsl_min_fminimizer_free(m);
        }
    }
    *azimuth_deg = best_az / DEG;
    *depth_db = cxl__power_db(best / front);
    return CXL_OK;
}

cxl_status cxl_array_peak(const cxl_array_pair *pair, double freq_hz,
                          double *azimuth_deg, double *elevation_deg)
{
    pair_eval e;
    double az, el, p;
    if (!azimuth_deg || !elevation_deg)
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, 0.0, &e);
    if (st)
        return st;
    st = find_peak(&e, 0.0, M_PI / 2.0, &az, &el, &p);
    if (st)
        return st;
    *azimuth_deg = az / DEG;
    *elevation_deg = el / DEG;
    return CXL_OK;
}

/* Peak over elevation lo..hi divided by the mean over the same band. */
static cxl_status peak_over_mean(const cxl_array_pair *pair, double freq_hz,
                                 double lo, double hi, double *db)
{
    pair_eval e;
    double az, el, peak, mean;
    if (!db)
        return CXL_EINVAL;
    cxl_status st = prepare(pair, freq_hz, 0.0, &e);
    if (st)
        return st;
    st = find_peak(&e, lo, hi, &az, &el, &peak);
    if (st)
        return st;
    st = mean_power(&e, lo, hi, &mean);
    if (st)
        return st;
    *db = cxl__power_db(peak / mean);
    return CXL_OK;
}

cxl_status cxl_array_directivity(const cxl_array_pair *pair, double freq_hz,
                                 double *directivity_dbi)
{
    return peak_over_mean(pair, freq_hz, -M_PI / 2.0, M_PI / 2.0,
                          directivity_dbi);
}

cxl_status cxl_array_rdf(const cxl_array_pair *pair, double freq_hz,
                         double *rdf_db)
{
    return peak_over_mean(pair, freq_hz, 0.0, M_PI / 2.0, rdf_db);
}

cxl_status cxl_array_null_depth(double phase_error_deg, double imbalance_db,
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
