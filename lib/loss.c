/* loss.c - loss models of a coaxial line.
 *
 * Fitted: a sqrt(f) + b f (skin-effect and dielectric terms) fitted to
 * table points with GSL's weighted linear least squares.
 * Physical: R, L, G, C per metre from geometry and materials, then the
 * exact complex propagation constant and impedance (Pozar, Microwave
 * Engineering, 4th ed., sec. 2.1 and Table 2.1).
 * Mismatch: total loss of a line into a load with a given SWR.
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include <gsl/gsl_const_mksa.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_multifit.h>
#include "coaxline.h"
#include "internal.h"

#define MU0 GSL_CONST_MKSA_VACUUM_PERMEABILITY
#define EPS0 GSL_CONST_MKSA_VACUUM_PERMITTIVITY
#define DB_PER_NEPER (20.0 / M_LN10)
/* Lower end of the physical model's range: the frequency at which the
 * skin depth equals the inner radius.  The internal impedance of a solid
 * centre is exact at any frequency (Bessel form below), but the outer
 * conductor is taken as thick (a wall from b outward): once the skin depth
 * approaches the inner radius it is comparable to a braid's thickness,
 * which the catalog does not give, and the thick-wall form no longer
 * describes a real braid.  Measured: tests/bessel_compare.py checks the
 * model against scipy's Bessel functions over this whole range. */
#define MIN_RADIUS_IN_SKIN_DEPTHS 1.0
/* A copper-clad centre keeps the planar layered surface impedance, which
 * needs the skin depth small against the wire radius: the same rule as the
 * earlier thin-skin model, 3 depths (the round wire's resistance exceeds
 * the planar value by about delta/(2a), some 17 % at 3 depths, from the
 * asymptotic series a/(2 delta) + 1/4 + ... of R/R_dc, from memory). */
#define CLAD_MIN_RADIUS_IN_SKIN_DEPTHS 3.0

/* the fitted model takes the flags it always took; CXL_LOSS_THIN_SKIN
 * means something to the physical model only */
static const unsigned fit_flags = CXL_LOSS_EXTRAPOLATE | CXL_LOSS_EXTERNAL_L_ONLY;
static const unsigned known_flags = CXL_LOSS_EXTRAPOLATE | CXL_LOSS_EXTERNAL_L_ONLY |
                                    CXL_LOSS_THIN_SKIN;

/* ---- skin depth and total loss ------------------------------------------ */

cxl_status cxl_loss_skin_depth_m(double freq_hz, double conductivity_s_per_m,
                                 double relative_permeability, double *depth_m)
{
    if (!depth_m || !cxl__finite_pos(freq_hz) ||
        !cxl__finite_pos(conductivity_s_per_m) ||
        !isfinite(relative_permeability) || !(relative_permeability > 0.0))
        return CXL_EINVAL;
    double d = 1.0 / sqrt(M_PI * freq_hz * MU0 * relative_permeability *
                          conductivity_s_per_m);
    if (!(d > 0.0)) return CXL_ERANGE; /* the product overflowed */
    return cxl__put_finite(d, depth_m);
}

cxl_status cxl_loss_total_db(double matched_loss_db, double swr,
                             double *total_loss_db)
{
    if (!total_loss_db || !cxl__finite_nonneg(matched_loss_db) || !isfinite(swr))
        return CXL_EINVAL;
    if (!(swr >= 1.0)) return CXL_ERANGE;
    double g = (swr - 1.0) / (swr + 1.0), g2 = g * g;
    /* 10 log10[(A^2 - g^2) / (A (1 - g^2))] written as
     * ML + 10 log10(1 - g^2/A^2) - 10 log10(1 - g^2), which neither
     * overflows for a long line nor loses digits for a short one. */
    double inv_a2 = pow(10.0, -matched_loss_db / 5.0);
    /* an SWR so large that |G| rounds to 1 reflects everything: no finite
     * total loss (CXL_ERANGE) */
    return cxl__put_finite(matched_loss_db +
                               (10.0 / M_LN10) * (log1p(-g2 * inv_a2) - log1p(-g2)),
                           total_loss_db);
}

cxl_status cxl_loss_run_db(double loss_db_per_m, double length_m, double swr,
                           double *matched_loss_db, double *total_loss_db)
{
    if (!matched_loss_db || !total_loss_db || !cxl__finite_nonneg(loss_db_per_m) ||
        !cxl__finite_pos(length_m))
        return CXL_EINVAL;
    double ml = loss_db_per_m * length_m, total;
    if (!isfinite(ml)) return CXL_ERANGE;
    cxl_status st = cxl_loss_total_db(ml, swr, &total);
    if (st != CXL_OK) return st;
    *matched_loss_db = ml;
    *total_loss_db = total;
    return CXL_OK;
}

/* ---- fitted model -------------------------------------------------------- */

struct cxl_loss_fit {
    double a_hz, b_hz;        /* dB/m per sqrt(Hz), dB/m per Hz */
    size_t n;
    double *freq_hz, *loss;   /* table, sorted by frequency */
};

struct pair { double f, y; };

static int pair_cmp(const void *x, const void *y)
{
    const struct pair *a = x, *b = y;
    return (a->f > b->f) - (a->f < b->f);
}

cxl_status cxl__fitws_reserve(cxl__fitws *ws, size_t n, size_t p, size_t doubles)
{
    if (n > ws->nmax || p > ws->pmax) {
        size_t nmax = n > ws->nmax ? n : ws->nmax, pmax = p > ws->pmax ? p : ws->pmax;
        gsl_multifit_linear_workspace *w = gsl_multifit_linear_alloc(nmax, pmax);
        if (!w) return CXL_ENOMEM;
        if (ws->work) gsl_multifit_linear_free(ws->work);
        ws->work = w;
        ws->nmax = nmax;
        ws->pmax = pmax;
    }
    if (doubles > ws->cap) {
        double *b = realloc(ws->buf, doubles * sizeof *b);
        if (!b) return CXL_ENOMEM;
        ws->buf = b;
        ws->cap = doubles;
    }
    return CXL_OK;
}

void cxl__fitws_free(cxl__fitws *ws)
{
    if (ws->work) gsl_multifit_linear_free(ws->work);
    free(ws->buf);
    memset(ws, 0, sizeof *ws);
}

cxl_status cxl__wfit2_ws(cxl__fitws *ws, const double *x, const double *w, const double *y,
                         size_t n, double c[2], double cov[4], double *chisq)
{
    double cbuf[2], covbuf[4], chi = 0.0;
    /* the views are of the caller's arrays (GSL does not write x, w, y) */
    gsl_matrix_const_view xv = gsl_matrix_const_view_array(x, n, 2);
    gsl_vector_const_view wv = gsl_vector_const_view_array(w, n);
    gsl_vector_const_view yv = gsl_vector_const_view_array(y, n);
    gsl_vector_view cv = gsl_vector_view_array(cbuf, 2);
    gsl_matrix_view covv = gsl_matrix_view_array(covbuf, 2, 2);
    int gst = gsl_multifit_wlinear(&xv.matrix, &wv.vector, &yv.vector, &cv.vector,
                                   &covv.matrix, &chi, ws->work);
    if (gst != GSL_SUCCESS || !isfinite(cbuf[0]) || !isfinite(cbuf[1])) return CXL_ENOCONV;
    c[0] = cbuf[0];
    c[1] = cbuf[1];
    if (cov) for (int i = 0; i < 4; i++) cov[i] = covbuf[i];
    if (chisq) *chisq = chi;
    return CXL_OK;
}

cxl_status cxl__wfit2(const double *x, const double *w, const double *y, size_t n,
                      double c[2], double cov[4], double *chisq)
{
    cxl__fitws ws = { 0 };
    cxl_status st = cxl__fitws_reserve(&ws, n, 2, 0);
    if (st == CXL_OK) st = cxl__wfit2_ws(&ws, x, w, y, n, c, cov, chisq);
    cxl__fitws_free(&ws);
    return st;
}

/* Weighted least squares of y = a sqrt(f) + b f with weights 1/y^2. */
static cxl_status fit_points(cxl_loss_fit *fit)
{
    size_t n = fit->n;
    double *buf = malloc(4 * n * sizeof *buf);
    if (!buf) return CXL_ENOMEM;
    double *x = buf, *w = x + 2 * n, *y = w + n, c[2];
    for (size_t i = 0; i < n; i++) {
        double f_mhz = fit->freq_hz[i] * 1e-6; /* MHz keeps the columns alike */
        x[2 * i] = sqrt(f_mhz);
        x[2 * i + 1] = f_mhz;
        y[i] = fit->loss[i];
        w[i] = 1.0 / (y[i] * y[i]);
    }
    cxl_status st = cxl__wfit2(x, w, y, n, c, NULL, NULL);
    if (st == CXL_OK) {
        fit->a_hz = c[0] * 1e-3; /* sqrt(f_MHz) = sqrt(f_Hz) / 1e3 */
        fit->b_hz = c[1] * 1e-6;
        /* extreme points (frequencies or losses near the ends of the
         * double range) can give coefficients whose value or residual at
         * a table point overflows: no such fit leaves the library */
        for (size_t i = 0; i < n && st == CXL_OK; i++) {
            double v = fit->a_hz * sqrt(fit->freq_hz[i]) + fit->b_hz * fit->freq_hz[i];
            if (!isfinite(v) || !isfinite(v - fit->loss[i]) ||
                !isfinite(fabs(v - fit->loss[i]) / fit->loss[i]))
                st = CXL_ERANGE;
        }
    }
    free(buf);
    return st;
}

cxl_status cxl_loss_fit_new(const double *freq_hz, const double *loss_db_per_m,
                            size_t n, cxl_loss_fit **fit)
{
    if (!freq_hz || !loss_db_per_m || !fit) return CXL_EINVAL;
    for (size_t i = 0; i < n; i++)
        if (!cxl__finite_pos(freq_hz[i]) || !cxl__finite_pos(loss_db_per_m[i]))
            return CXL_EINVAL;
    if (n < 2) return CXL_ERANGE;
    struct pair *p = malloc(n * sizeof *p);
    cxl_loss_fit *ft = calloc(1, sizeof *ft);
    double *f = malloc(2 * n * sizeof *f);
    if (!p || !ft || !f) {
        free(p); free(ft); free(f);
        return CXL_ENOMEM;
    }
    for (size_t i = 0; i < n; i++) p[i] = (struct pair){freq_hz[i], loss_db_per_m[i]};
    qsort(p, n, sizeof *p, pair_cmp);
    ft->n = n;
    ft->freq_hz = f;
    ft->loss = f + n;
    for (size_t i = 0; i < n; i++) {
        ft->freq_hz[i] = p[i].f;
        ft->loss[i] = p[i].y;
    }
    free(p);
    cxl_status st = ft->freq_hz[0] < ft->freq_hz[n - 1] ? fit_points(ft) : CXL_ERANGE;
    if (st != CXL_OK) {
        cxl_loss_fit_free(ft);
        return st;
    }
    *fit = ft;
    return CXL_OK;
}

cxl_status cxl_loss_fit_new_cable(const cxl_catalog *catalog, size_t index,
                                  cxl_loss_fit **fit)
{
    const char *name;
    if (!fit) return CXL_EINVAL;
    cxl_status st = cxl_catalog_name(catalog, index, &name);
    if (st != CXL_OK) return st;
    size_t n = cxl_catalog_loss_count(catalog, index);
    if (n < 2) return CXL_ENOTFOUND;
    double *f = malloc(2 * n * sizeof *f);
    if (!f) return CXL_ENOMEM;
    for (size_t k = 0; k < n && st == CXL_OK; k++)
        st = cxl_catalog_loss_point(catalog, index, k, &f[k], &f[n + k], NULL);
    if (st == CXL_OK) st = cxl_loss_fit_new(f, f + n, n, fit);
    free(f);
    return st;
}

void cxl_loss_fit_free(cxl_loss_fit *fit)
{
    if (!fit) return;
    free(fit->freq_hz);
    free(fit);
}

cxl_status cxl_loss_fit_coefficients(const cxl_loss_fit *fit,
                                     double *a_db_per_m_sqrt_hz,
                                     double *b_db_per_m_hz)
{
    if (!fit || !a_db_per_m_sqrt_hz || !b_db_per_m_hz) return CXL_EINVAL;
    *a_db_per_m_sqrt_hz = fit->a_hz;
    *b_db_per_m_hz = fit->b_hz;
    return CXL_OK;
}

cxl_status cxl_loss_fit_range(const cxl_loss_fit *fit, double *min_freq_hz,
                              double *max_freq_hz)
{
    if (!fit || !min_freq_hz || !max_freq_hz) return CXL_EINVAL;
    *min_freq_hz = fit->freq_hz[0];
    *max_freq_hz = fit->freq_hz[fit->n - 1];
    return CXL_OK;
}

size_t cxl_loss_fit_count(const cxl_loss_fit *fit)
{
    return fit ? fit->n : 0;
}

static double fit_value(const cxl_loss_fit *fit, double f)
{
    return fit->a_hz * sqrt(f) + fit->b_hz * f;
}

cxl_status cxl_loss_fit_point(const cxl_loss_fit *fit, size_t point,
                              double *freq_hz, double *table_db_per_m,
                              double *residual_db_per_m)
{
    if (!fit || !freq_hz || !table_db_per_m || !residual_db_per_m) return CXL_EINVAL;
    if (point >= fit->n) return CXL_ERANGE;
    *freq_hz = fit->freq_hz[point];
    *table_db_per_m = fit->loss[point];
    *residual_db_per_m = fit_value(fit, fit->freq_hz[point]) - fit->loss[point];
    return CXL_OK;
}

cxl_status cxl_loss_fit_max_relative_residual(const cxl_loss_fit *fit,
                                              double *relative)
{
    if (!fit || !relative) return CXL_EINVAL;
    double worst = 0.0;
    for (size_t i = 0; i < fit->n; i++) {
        double r = fabs(fit_value(fit, fit->freq_hz[i]) - fit->loss[i]) / fit->loss[i];
        if (r > worst) worst = r;
    }
    *relative = worst;
    return CXL_OK;
}

cxl_status cxl_loss_fit_usable_range(const cxl_loss_fit *fit, double *min_freq_hz,
                                     double *max_freq_hz)
{
    if (!fit || !min_freq_hz || !max_freq_hz) return CXL_EINVAL;
    *min_freq_hz = fit->freq_hz[0] / (1.0 + CXL__LOSS_FIT_MARGIN);
    *max_freq_hz = fit->freq_hz[fit->n - 1] * (1.0 + CXL__LOSS_FIT_MARGIN);
    return CXL_OK;
}

cxl_status cxl_loss_fit_eval(const cxl_loss_fit *fit, double freq_hz,
                             unsigned flags, double *loss_db_per_m)
{
    if (!fit || !loss_db_per_m || !cxl__finite_pos(freq_hz) || (flags & ~fit_flags))
        return CXL_EINVAL;
    double lo = fit->freq_hz[0] / (1.0 + CXL__LOSS_FIT_MARGIN);
    double hi = fit->freq_hz[fit->n - 1] * (1.0 + CXL__LOSS_FIT_MARGIN);
    if (!(flags & CXL_LOSS_EXTRAPOLATE) && (freq_hz < lo || freq_hz > hi))
        return CXL_EEXTRAPOLATE;
    double v = fit_value(fit, freq_hz);
    if (!(v > 0.0) || !isfinite(v)) return CXL_ERANGE; /* fit has no meaning there */
    *loss_db_per_m = v;
    return CXL_OK;
}

/* ---- physical model ------------------------------------------------------ */

struct cxl_loss_model {
    double a, b;              /* inner radius, dielectric radius (m) */
    double eps_r, tan_d, sigma, factor;
    int clad;
    double clad_t, core_sigma, core_mu_r;
};

cxl_status cxl_loss_model_new(double inner_diameter_m, double dielectric_diameter_m,
                              double relative_permittivity, double loss_tangent,
                              double conductivity_s_per_m,
                              double conductor_loss_factor, cxl_loss_model **model)
{
    if (!model || !cxl__finite_pos(inner_diameter_m) ||
        !cxl__finite_pos(dielectric_diameter_m) || !isfinite(relative_permittivity) ||
        !cxl__finite_nonneg(loss_tangent) || !cxl__finite_pos(conductivity_s_per_m) ||
        !cxl__finite_pos(conductor_loss_factor))
        return CXL_EINVAL;
    if (!(inner_diameter_m < dielectric_diameter_m) || !(relative_permittivity >= 1.0) ||
        !(loss_tangent < 1.0))
        return CXL_ERANGE;
    cxl_loss_model *m = calloc(1, sizeof *m);
    if (!m) return CXL_ENOMEM;
    m->a = inner_diameter_m / 2.0;
    m->b = dielectric_diameter_m / 2.0;
    m->eps_r = relative_permittivity;
    m->tan_d = loss_tangent;
    m->sigma = conductivity_s_per_m;
    m->factor = conductor_loss_factor;
    /* extreme but finite geometry or materials can put the range where
     * the model holds at 0 or infinity: refuse it here rather than hand
     * out a model whose every answer overflows */
    double lo, hi;
    cxl_loss_model_range(m, &lo, &hi);
    if (!cxl__finite_pos(lo) || !cxl__finite_pos(hi) || !isfinite(log(m->b / m->a))) {
        free(m);
        return CXL_ERANGE;
    }
    *model = m;
    return CXL_OK;
}

cxl_status cxl_loss_model_set_clad(cxl_loss_model *model, double clad_thickness_m,
                                   double core_conductivity_s_per_m,
                                   double core_relative_permeability)
{
    if (!model || !cxl__finite_nonneg(clad_thickness_m) ||
        !cxl__finite_pos(core_conductivity_s_per_m) ||
        !isfinite(core_relative_permeability))
        return CXL_EINVAL;
    if (!(clad_thickness_m < model->a) || !(core_relative_permeability >= 1.0))
        return CXL_ERANGE;
    model->clad = 1;
    model->clad_t = clad_thickness_m;
    model->core_sigma = core_conductivity_s_per_m;
    model->core_mu_r = core_relative_permeability;
    return CXL_OK;
}

cxl_status cxl_loss_model_new_cable(const cxl_catalog *catalog, size_t index,
                                    cxl_loss_model **model)
{
    double d_in, d_diel, eps_r, vf, tan_d = 0.0, sigma, factor;
    if (!model) return CXL_EINVAL;
    cxl_status st = cxl_catalog_value(catalog, index, CXL_CABLE_VF, &vf);
    if (st != CXL_OK) return st;
    st = cxl_catalog_value(catalog, index, CXL_CABLE_INNER_DIAMETER_M, &d_in);
    if (st == CXL_OK) st = cxl_catalog_value(catalog, index, CXL_CABLE_DIELECTRIC_DIAMETER_M, &d_diel);
    if (st != CXL_OK) return st;
    if (cxl_catalog_value(catalog, index, CXL_CABLE_RELATIVE_PERMITTIVITY, &eps_r) != CXL_OK)
        eps_r = 1.0 / (vf * vf);
    if (cxl_catalog_value(catalog, index, CXL_CABLE_LOSS_TANGENT, &tan_d) != CXL_OK)
        tan_d = 0.0;
    st = cxl_catalog_value(catalog, index, CXL_CABLE_CONDUCTIVITY_S_PER_M, &sigma);
    if (st == CXL_OK) st = cxl_catalog_value(catalog, index, CXL_CABLE_CONDUCTOR_LOSS_FACTOR, &factor);
    if (st != CXL_OK) return st;
    cxl_loss_model *m;
    st = cxl_loss_model_new(d_in, d_diel, eps_r, tan_d, sigma, factor, &m);
    if (st != CXL_OK) return st;
    double t, core_sigma, core_mu_r;
    if (cxl_catalog_value(catalog, index, CXL_CABLE_CLAD_THICKNESS_M, &t) == CXL_OK &&
        cxl_catalog_value(catalog, index, CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M, &core_sigma) == CXL_OK &&
        cxl_catalog_value(catalog, index, CXL_CABLE_CORE_RELATIVE_PERMEABILITY, &core_mu_r) == CXL_OK) {
        st = cxl_loss_model_set_clad(m, t, core_sigma, core_mu_r);
        if (st != CXL_OK) {
            cxl_loss_model_free(m);
            return st;
        }
    }
    *model = m;
    return CXL_OK;
}

cxl_status cxl_loss_model_clad_crossover(const cxl_loss_model *model,
                                         double *freq_hz)
{
    if (!model || !freq_hz) return CXL_EINVAL;
    if (!model->clad) return CXL_ENOTFOUND;
    if (!(model->clad_t > 0.0)) return CXL_ERANGE; /* no cladding: never */
    /* skin depth of the cladding metal equal to its thickness */
    double f = 1.0 / (M_PI * MU0 * model->sigma * model->clad_t * model->clad_t);
    if (!isfinite(f)) return CXL_ERANGE;
    *freq_hz = f;
    return CXL_OK;
}

void cxl_loss_model_free(cxl_loss_model *model)
{
    free(model);
}

cxl_status cxl_loss_model_range(const cxl_loss_model *model, double *min_freq_hz,
                                double *max_freq_hz)
{
    if (!model || !min_freq_hz || !max_freq_hz) return CXL_EINVAL;
    double delta_max = model->a / (model->clad ? CLAD_MIN_RADIUS_IN_SKIN_DEPTHS
                                               : MIN_RADIUS_IN_SKIN_DEPTHS);
    /* delta = 1/sqrt(pi f mu0 mu_r sigma)  =>  f = 1/(pi mu0 mu_r sigma delta^2);
     * under a cladding the metal with the deeper skin depth sets the limit */
    double mu_sigma = model->sigma;
    if (model->clad && model->core_mu_r * model->core_sigma < mu_sigma)
        mu_sigma = model->core_mu_r * model->core_sigma;
    *min_freq_hz = 1.0 / (M_PI * MU0 * mu_sigma * delta_max * delta_max);
    /* TE11 cut-off, lambda_c ~ pi (a + b) in the dielectric */
    *max_freq_hz = CXL_C_M_PER_S / (M_PI * (model->a + model->b) * sqrt(model->eps_r));
    return CXL_OK;
}

/* Surface impedance (ohm per square) of a good conductor: (1 + j)/(sigma delta). */
static gsl_complex surface_impedance(double omega, double sigma, double mu_r)
{
    double rs = sqrt(omega * MU0 * mu_r / (2.0 * sigma));
    return gsl_complex_rect(rs, rs);
}

/* Surface impedance of a layer (thickness t, conductivity sigma1) over a
 * half-space of another metal.  The plane wave going into the metal sees
 * the layer as a line section of wave impedance eta1 and propagation
 * constant g1 terminated by the second metal's wave impedance eta2, so the
 * input-impedance formula of a terminated line applies:
 *   Zs = eta1 (eta2 + eta1 tanh(g1 t)) / (eta1 + eta2 tanh(g1 t)),
 *   eta_i = (1 + j)/(sigma_i delta_i), g1 = (1 + j)/delta1
 * (Ramo, Whinnery and Van Duzer, Fields and Waves in Communication
 * Electronics, 3rd ed., plane waves normally incident on layered media and
 * the transmission-line analogy, from memory; the planar form holds while
 * t and the skin depths are small against the wire radius).  t = 0 gives
 * eta2; t >> delta1 gives eta1. */
static gsl_complex clad_surface_impedance(const cxl_loss_model *m, double omega)
{
    gsl_complex eta1 = surface_impedance(omega, m->sigma, 1.0);
    gsl_complex eta2 = surface_impedance(omega, m->core_sigma, m->core_mu_r);
    double delta1 = sqrt(2.0 / (omega * MU0 * m->sigma));
    gsl_complex th = gsl_complex_tanh(gsl_complex_rect(m->clad_t / delta1, m->clad_t / delta1));
    gsl_complex num = gsl_complex_add(eta2, gsl_complex_mul(eta1, th));
    gsl_complex den = gsl_complex_add(eta1, gsl_complex_mul(eta2, th));
    return gsl_complex_mul(eta1, gsl_complex_div(num, den));
}

/* Internal impedance per metre of both conductors, ohm/m.
 *
 * Solid round centre of radius a (Ramo, Whinnery and Van Duzer, Fields and
 * Waves in Communication Electronics, 3rd ed., ch. 5, internal impedance of
 * a round wire, from memory):
 *   Z_a = (eta_s / (2 pi a)) I0(tau a) / I1(tau a),
 *   tau = (1 + j)/delta, eta_s = (1 + j)/(sigma delta) = tau/sigma,
 * written as R_dc x [tau a I0 / (2 I1)] with R_dc = 1/(sigma pi a^2), so it
 * tends to R_dc + j omega mu0/(8 pi) at low frequency and to the thin-skin
 * (1 + j) Rs/(2 pi a) at high frequency.
 * Thick outer conductor from radius b outward (same source):
 *   Z_b = (eta_s / (2 pi b)) K0(tau b) / K1(tau b)
 *       = [tau b K0 / K1] / (2 pi sigma b^2).
 * A copper-clad centre keeps the planar layered surface impedance over the
 * circumference, Zs/(2 pi a).  CXL_LOSS_THIN_SKIN gives the thin-skin form
 * (1 + j) Rs/(2 pi) (1/a + 1/b) for comparison (Pozar, Microwave
 * Engineering, 4th ed., Table 2.1). */
static gsl_complex internal_impedance(const cxl_loss_model *m, double omega,
                                      unsigned flags)
{
    double delta = sqrt(2.0 / (omega * MU0 * m->sigma));
    gsl_complex z_in, z_out;
    if (flags & CXL_LOSS_THIN_SKIN) {
        gsl_complex zs = surface_impedance(omega, m->sigma, 1.0);
        z_in = gsl_complex_div_real(zs, 2.0 * M_PI * m->a);
        z_out = gsl_complex_div_real(zs, 2.0 * M_PI * m->b);
    } else {
        z_in = gsl_complex_mul_real(
            cxl__bessel_i_ratio(gsl_complex_rect(m->a / delta, m->a / delta)),
            1.0 / (m->sigma * M_PI * m->a * m->a));
        z_out = gsl_complex_mul_real(
            cxl__bessel_k_ratio(gsl_complex_rect(m->b / delta, m->b / delta)),
            1.0 / (m->sigma * 2.0 * M_PI * m->b * m->b));
    }
    if (m->clad)
        z_in = gsl_complex_div_real(clad_surface_impedance(m, omega), 2.0 * M_PI * m->a);
    return gsl_complex_add(z_in, z_out);
}

struct rlgc { double r, l, g, c, omega; };

static cxl_status model_rlgc(const cxl_loss_model *m, double freq_hz, unsigned flags,
                             struct rlgc *out)
{
    if (!m || !cxl__finite_pos(freq_hz) || (flags & ~known_flags)) return CXL_EINVAL;
    if (!(flags & CXL_LOSS_EXTRAPOLATE)) {
        double lo, hi;
        cxl_loss_model_range(m, &lo, &hi);
        if (freq_hz < lo || freq_hz > hi) return CXL_EEXTRAPOLATE;
    }
    double omega = 2.0 * M_PI * freq_hz, ln_ba = log(m->b / m->a);
    if (!isfinite(omega)) return CXL_ERANGE;
    gsl_complex z_int = gsl_complex_mul_real(internal_impedance(m, omega, flags), m->factor);
    out->omega = omega;
    out->r = GSL_REAL(z_int);
    out->l = MU0 / (2.0 * M_PI) * ln_ba;
    if (!(flags & CXL_LOSS_EXTERNAL_L_ONLY)) out->l += GSL_IMAG(z_int) / omega;
    out->c = 2.0 * M_PI * EPS0 * m->eps_r / ln_ba;
    out->g = omega * out->c * m->tan_d;
    /* far outside the model's range (allowed with CXL_LOSS_EXTRAPOLATE)
     * or with extreme materials the terms can overflow */
    if (!isfinite(out->r) || !isfinite(out->l) || !isfinite(out->c) || !isfinite(out->g) ||
        !isfinite(omega * out->l) || !isfinite(omega * out->c))
        return CXL_ERANGE;
    return CXL_OK;
}

cxl_status cxl_loss_model_rlgc(const cxl_loss_model *model, double freq_hz,
                               unsigned flags, double *r_ohm_per_m, double *l_h_per_m,
                               double *g_s_per_m, double *c_f_per_m)
{
    struct rlgc p;
    if (!r_ohm_per_m || !l_h_per_m || !g_s_per_m || !c_f_per_m) return CXL_EINVAL;
    cxl_status st = model_rlgc(model, freq_hz, flags, &p);
    if (st != CXL_OK) return st;
    *r_ohm_per_m = p.r;
    *l_h_per_m = p.l;
    *g_s_per_m = p.g;
    *c_f_per_m = p.c;
    return CXL_OK;
}

/* Series impedance and shunt admittance per metre. */
static cxl_status model_zy(const cxl_loss_model *m, double freq_hz, unsigned flags,
                           gsl_complex *z, gsl_complex *y)
{
    struct rlgc p;
    cxl_status st = model_rlgc(m, freq_hz, flags, &p);
    if (st != CXL_OK) return st;
    *z = gsl_complex_rect(p.r, p.omega * p.l);
    *y = gsl_complex_rect(p.g, p.omega * p.c);
    return CXL_OK;
}

cxl_status cxl_loss_model_gamma(const cxl_loss_model *model, double freq_hz,
                                unsigned flags, double *alpha_np_per_m,
                                double *beta_rad_per_m)
{
    gsl_complex z, y;
    if (!alpha_np_per_m || !beta_rad_per_m) return CXL_EINVAL;
    cxl_status st = model_zy(model, freq_hz, flags, &z, &y);
    if (st != CXL_OK) return st;
    gsl_complex g = gsl_complex_sqrt(gsl_complex_mul(z, y)); /* principal root: alpha, beta >= 0 */
    if (!isfinite(GSL_REAL(g)) || !isfinite(GSL_IMAG(g)) || !(GSL_IMAG(g) > 0.0))
        return CXL_ERANGE;
    *alpha_np_per_m = GSL_REAL(g);
    *beta_rad_per_m = GSL_IMAG(g);
    return CXL_OK;
}

cxl_status cxl_loss_model_attenuation(const cxl_loss_model *model, double freq_hz,
                                      unsigned flags, double *loss_db_per_m)
{
    double alpha, beta;
    if (!loss_db_per_m) return CXL_EINVAL;
    cxl_status st = cxl_loss_model_gamma(model, freq_hz, flags, &alpha, &beta);
    if (st != CXL_OK) return st;
    return cxl__put_finite(DB_PER_NEPER * alpha, loss_db_per_m);
}

cxl_status cxl_loss_model_z0(const cxl_loss_model *model, double freq_hz,
                             unsigned flags, double *z0_re_ohm, double *z0_im_ohm)
{
    gsl_complex z, y;
    if (!z0_re_ohm || !z0_im_ohm) return CXL_EINVAL;
    cxl_status st = model_zy(model, freq_hz, flags, &z, &y);
    if (st != CXL_OK) return st;
    gsl_complex z0 = gsl_complex_sqrt(gsl_complex_div(z, y));
    if (!isfinite(GSL_REAL(z0)) || !isfinite(GSL_IMAG(z0)))
        return CXL_ERANGE;
    *z0_re_ohm = GSL_REAL(z0);
    *z0_im_ohm = GSL_IMAG(z0);
    return CXL_OK;
}

cxl_status cxl_loss_model_vf(const cxl_loss_model *model, double freq_hz,
                             unsigned flags, double *vf)
{
    double alpha, beta;
    if (!vf) return CXL_EINVAL;
    cxl_status st = cxl_loss_model_gamma(model, freq_hz, flags, &alpha, &beta);
    if (st != CXL_OK) return st;
    return cxl__put_finite(2.0 * M_PI * freq_hz / (beta * CXL_C_M_PER_S), vf);
}

/* ---- a catalog cable's loss: the fitted table or the physical model ---- */

struct cxl_loss_cable {
    cxl_loss_fit *fit;     /* one of the two */
    cxl_loss_model *model;
};

cxl_status cxl_loss_cable_new(const cxl_catalog *catalog, size_t index, cxl_loss_cable **loss)
{
    if (!catalog || !loss) return CXL_EINVAL;
    cxl_loss_cable *l = calloc(1, sizeof *l);
    if (!l) return CXL_ENOMEM;
    /* the table where the cable has one: it is what was measured */
    cxl_status st = cxl_loss_fit_new_cable(catalog, index, &l->fit);
    if (st == CXL_ENOMEM) {
        free(l);
        return st;
    }
    if (st != CXL_OK) {
        l->fit = NULL;
        st = cxl_loss_model_new_cable(catalog, index, &l->model);
        if (st != CXL_OK) {
            free(l);
            return st;
        }
    }
    *loss = l;
    return CXL_OK;
}

void cxl_loss_cable_free(cxl_loss_cable *loss)
{
    if (!loss) return;
    cxl_loss_fit_free(loss->fit);
    cxl_loss_model_free(loss->model);
    free(loss);
}

cxl_status cxl_loss_cable_kind(const cxl_loss_cable *loss, cxl_loss_kind *kind)
{
    if (!loss || !kind) return CXL_EINVAL;
    *kind = loss->fit ? CXL_LOSS_KIND_FIT : CXL_LOSS_KIND_PHYSICAL;
    return CXL_OK;
}

cxl_status cxl_loss_cable_range(const cxl_loss_cable *loss, double *min_freq_hz,
                                double *max_freq_hz)
{
    if (!loss || !min_freq_hz || !max_freq_hz) return CXL_EINVAL;
    if (loss->fit) return cxl_loss_fit_usable_range(loss->fit, min_freq_hz, max_freq_hz);
    return cxl_loss_model_range(loss->model, min_freq_hz, max_freq_hz);
}

cxl_status cxl_loss_cable_db_per_m(const cxl_loss_cable *loss, double freq_hz, unsigned flags,
                                   double *loss_db_per_m)
{
    if (!loss || (flags & ~CXL_LOSS_EXTRAPOLATE)) return CXL_EINVAL;
    if (loss->fit) return cxl_loss_fit_eval(loss->fit, freq_hz, flags, loss_db_per_m);
    return cxl_loss_model_attenuation(loss->model, freq_hz, flags, loss_db_per_m);
}

cxl_status cxl_loss_cable_difference(const cxl_loss_cable *loss, double length_a_m,
                                     double length_b_m, double freq_hz, double *loss_db)
{
    double db_per_m;
    if (!loss_db || !cxl__finite_nonneg(length_a_m) || !cxl__finite_nonneg(length_b_m))
        return CXL_EINVAL;
    cxl_status st = cxl_loss_cable_db_per_m(loss, freq_hz, 0, &db_per_m);
    if (st != CXL_OK) return st;
    return cxl__put_finite(db_per_m * (length_b_m - length_a_m), loss_db);
}
