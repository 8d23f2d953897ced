/* sweepfit.c - the line fitted to a whole one-port sweep.
 *
 * Model (one complex Gamma per point, against the sweep's reference R):
 *   VF(f)    = vf_hf - drop / sqrt(f)       (the law of drift.c)
 *   alpha(f) = (a sqrt(f) + b f) / (20 log10 e)   Np/m (a, b as loss.c)
 *   gamma    = alpha + j 2 pi f / (VF c)
 *   u        = Gamma_L exp(-2 gamma l),  Gamma_L = (ZL - Z0)/(ZL + Z0)
 *              (1 for an open end, -1 for a short)
 *   Zin      = Z0 (1 + u)/(1 - u)
 * which is Pozar, Microwave Engineering, 4th ed., eq. 2.44 written through
 * the reflection at the load, and Gamma = (Zin - R)/(Zin + R) (sec. 2.3),
 * here as (Z0 (1 + u) - R (1 - u)) / (Z0 (1 + u) + R (1 - u)) so that an
 * open end never goes through an infinite Z.  An optional fixture between
 * the reference plane and the piece is a lossless line matched to R:
 * Gamma times exp(-2 j beta_fix l_fix).
 *
 * GSL's nonlinear least squares (gsl_multifit_nlinear, Levenberg-Marquardt
 * trust region) fits the real and imaginary parts of Gamma with the
 * Jacobian written out below.  Start values come from the sweep itself:
 * the VF trend of the series resonances (numbered from their spacing),
 * Z0 as the geometric mean of |Z| over the sweep (exact over whole periods
 * of a line with any passive termination: Jensen's formula on
 * log|1 + u| - log|1 - u|), the attenuation from the resistance at the
 * first series resonance (Z0 alpha l at a quarter or half wave).  The
 * uncertainties are the covariance (J^T J)^-1 scaled by chi^2 per degree
 * of freedom: the scatter of the points sets the noise. */
#include <config.h>
#include <complex.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_vector.h>
#include <gsl/gsl_matrix.h>
#include <gsl/gsl_multifit_nlinear.h>
#include "coaxline.h"
#include "internal.h"

#define NP_MAX 6
#define DB_PER_NP 8.685889638065035 /* 20 log10(e) */

/* parameters in their own units */
enum { P_VF, P_DROP, P_A, P_B, P_Z0, P_FIX };

struct cxl_sweepfit {
    double p[NP_MAX];           /* vf_hf, drop (sqrt Hz), a, b, Z0, fixture (m) */
    double cov[NP_MAX][NP_MAX]; /* in the same units */
    int np;
    double rms, max_res, max_res_hz, f_min, f_max;
    size_t points, iterations;
};

typedef struct model {
    const double *f;
    const double *sf;        /* sqrt(f), computed once */
    const double *gre, *gim; /* measured Gamma against ref */
    size_t n;
    double ref, length, fix_vf;
    double complex zl;       /* load */
    int end_kind;            /* 0 open, 1 short, 2 load */
    int np;
    double scale[NP_MAX];    /* physical = scale * internal */
} model;

/* Gamma of the model at f and, when d is not NULL, its derivatives with
 * respect to the np physical parameters. */
static double complex model_gamma(const model *m, const double *p, double f, double sf,
                                  double complex *d)
{
    const double w = 2.0 * M_PI * f;
    double vf = p[P_VF] - p[P_DROP] / sf;
    int clamped = 0;
    if (!(vf > 1e-3)) {
        /* a trial step beyond any line: keep the residual finite and flat */
        vf = 1e-3;
        clamped = 1;
    }
    double beta = w / (vf * CXL_C_M_PER_S);
    double alpha = (p[P_A] * sf + p[P_B] * f) / DB_PER_NP;
    /* exp(-2 gamma l) by parts (cheaper than cexp in the inner loop) */
    double mag = exp(-2.0 * alpha * m->length), ph = -2.0 * beta * m->length;
    double complex e = mag * cos(ph) + I * (mag * sin(ph));
    double z0 = p[P_Z0], R = m->ref;
    double complex gl, dgl = 0.0;
    if (m->end_kind == 0) gl = 1.0;
    else if (m->end_kind == 1) gl = -1.0;
    else {
        double complex s = m->zl + z0;
        gl = (m->zl - z0) / s;
        dgl = -2.0 * m->zl / (s * s);
    }
    double complex u = gl * e;
    double complex B = (z0 + R) + u * (z0 - R);
    double complex A = (z0 - R) + u * (z0 + R);
    /* 1/B through its conjugate: plain arithmetic, no library division */
    double bb = creal(B) * creal(B) + cimag(B) * cimag(B);
    double complex inv_b = conj(B) / bb;
    double complex g = A * inv_b;
    double complex fixture = 1.0, fix_beta = 0.0;
    double fl = m->np > P_FIX ? p[P_FIX] : 0.0;
    double fvf = m->fix_vf > 0.0 ? m->fix_vf : p[P_VF];
    if (m->np > P_FIX) {
        if (!(fvf > 1e-3)) fvf = 1e-3;
        fix_beta = w / (fvf * CXL_C_M_PER_S);
        fixture = cexp(-2.0 * I * fix_beta * fl);
    }
    double complex gm = g * fixture;
    if (!d) return gm;
    double complex inv_b2 = inv_b * inv_b;
    double complex dg_du = 4.0 * z0 * R * inv_b2;
    double complex du_dgam = -2.0 * m->length * u;
    double complex dgam_dvf = clamped ? 0.0 : -I * w / (CXL_C_M_PER_S * vf * vf);
    double complex k = fixture * dg_du * du_dgam;
    d[P_VF] = k * dgam_dvf;
    d[P_DROP] = k * dgam_dvf * (-1.0 / sf);
    d[P_A] = k * sf / DB_PER_NP;
    d[P_B] = k * f / DB_PER_NP;
    d[P_Z0] = fixture * (2.0 * R * (1.0 - u * u) * inv_b2 + dg_du * dgl * e);
    if (m->np > P_FIX) {
        d[P_FIX] = -2.0 * I * fix_beta * gm;
        if (m->fix_vf == 0.0 && p[P_VF] > 1e-3)
            d[P_VF] += gm * (-2.0 * I * fl) * (-w / (CXL_C_M_PER_S * fvf * fvf));
    }
    return gm;
}

static void physical(const model *m, const gsl_vector *x, double *p)
{
    for (int j = 0; j < m->np; j++) p[j] = gsl_vector_get(x, (size_t)j) * m->scale[j];
}

static int fit_f(const gsl_vector *x, void *data, gsl_vector *r)
{
    const model *m = data;
    double p[NP_MAX];
    physical(m, x, p);
    for (size_t i = 0; i < m->n; i++) {
        double complex g = model_gamma(m, p, m->f[i], m->sf[i], NULL);
        double re = creal(g) - m->gre[i], im = cimag(g) - m->gim[i];
        if (!isfinite(re) || !isfinite(im)) return GSL_EDOM;
        r->data[2 * i * r->stride] = re;
        r->data[(2 * i + 1) * r->stride] = im;
    }
    return GSL_SUCCESS;
}

static int fit_df(const gsl_vector *x, void *data, gsl_matrix *J)
{
    const model *m = data;
    double p[NP_MAX];
    double complex d[NP_MAX];
    physical(m, x, p);
    for (size_t i = 0; i < m->n; i++) {
        model_gamma(m, p, m->f[i], m->sf[i], d);
        for (int j = 0; j < m->np; j++) {
            double complex dj = d[j] * m->scale[j];
            if (!isfinite(creal(dj)) || !isfinite(cimag(dj))) return GSL_EDOM;
            J->data[2 * i * J->tda + (size_t)j] = creal(dj);
            J->data[(2 * i + 1) * J->tda + (size_t)j] = cimag(dj);
        }
    }
    return GSL_SUCCESS;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return x < y ? -1 : x > y;
}

/* Start values from the resonances and |Z|.  CXL_EEXTRAPOLATE when the
 * sweep shows fewer than two series resonances of one kind. */
/* The series resonances of the kind preferred (two at least when there
 * are) into fr[] and their orders ord[]; returns how many. */
static size_t series_readings(const cxl_sweep_res *res, const model *m, double *fr, int *ord,
                              size_t nr)
{
    /* a fixture matched to R leaves |Gamma| as it is: with one, the SWR
     * minima keep the piece's own spacing */
    static const cxl_sweep_kind pref[3] = { CXL_SWEEP_Z_MIN, CXL_SWEEP_X_ZERO, CXL_SWEEP_SWR_MIN };
    static const cxl_sweep_kind pref_fix[3] = { CXL_SWEEP_SWR_MIN, CXL_SWEEP_Z_MIN,
                                                CXL_SWEEP_X_ZERO };
    size_t k = 0;
    for (int i = 0; i < 3 && k < 2; i++)
        cxl_sweep_res_readings(res, (m->np > P_FIX ? pref_fix : pref)[i], fr, ord, nr, &k);
    return k;
}

/* The resistance and frequency at the first series reactance zero (NAN
 * when there is none). */
static void first_series_zero(const cxl_sweep_res *res, size_t nr, double *r_first,
                              double *f_first)
{
    *r_first = *f_first = NAN;
    for (size_t i = 0; i < nr; i++) {
        cxl_sweep_kind kind;
        int series;
        double f, v;
        cxl_sweep_res_get(res, i, &kind, &series, NULL, &f, NULL, &v);
        if (kind == CXL_SWEEP_X_ZERO && series) {
            *r_first = v;
            *f_first = f;
            return;
        }
    }
}

/* The median gap between the k (two or more) frequencies fr[]. */
static double median_gap(const double *fr, size_t k, double *gap)
{
    for (size_t i = 0; i + 1 < k; i++) gap[i] = fr[i + 1] - fr[i];
    qsort(gap, k - 1, sizeof *gap, cmp_double);
    return (k - 1) % 2 ? gap[(k - 1) / 2] : 0.5 * (gap[(k - 1) / 2 - 1] + gap[(k - 1) / 2]);
}

/* Each numbered resonance's VF, and their trend (drift.c) into *v0 and
 * *d0 when it stays a line's.  fr[] is reordered in place. */
static void vf_trend(const model *m, cxl_stub_end end, double *fr, double *vf, const int *ord,
                     size_t k, double *v0, double *d0)
{
    size_t q = 0;
    for (size_t i = 0; i < k; i++)
        if (ord[i] > 0 &&
            cxl_stub_vf_from_resonance(end, ord[i], m->length, fr[i], 0.0, 0.0, &vf[q]) ==
                CXL_OK) fr[q++] = fr[i];
    cxl_drift *dr = NULL;
    if (q < 2 || cxl_drift_new(fr, vf, NULL, q, &dr) != CXL_OK) return;
    double vh, dd;
    cxl_drift_coefficients(dr, &vh, &dd);
    /* a trend of two noisy readings can be wild: keep it only when it
     * stays a line's */
    if (cxl__valid_vf(vh) && dd >= 0.0 && dd / sqrt(m->f[0]) < 0.2 * vh) {
        *v0 = vh;
        *d0 = dd;
    }
    cxl_drift_free(dr);
}

/* Z0: geometric mean of |Z| (R when there is none). */
static double z0_start(const model *m)
{
    double sum = 0.0;
    size_t used = 0;
    for (size_t i = 0; i < m->n; i++) {
        double complex g = m->gre[i] + I * m->gim[i];
        double complex z = m->ref * (1.0 + g) / (1.0 - g);
        double a = cabs(z);
        if (isfinite(a) && a > 0.0) {
            sum += log(a);
            used++;
        }
    }
    double z0 = used ? exp(sum / (double)used) : m->ref;
    return cxl__finite_pos(z0) ? z0 : m->ref;
}

/* loss: R = Z0 alpha l at the first series resonance of a lossy open or
 * shorted line */
static double loss_start(const model *m, double r_first, double f_first, double z0)
{
    double a0 = 0.0;
    if (m->end_kind != 2 && isfinite(r_first) && r_first > 0.0 && f_first > 0.0)
        a0 = r_first / (z0 * m->length) * DB_PER_NP / sqrt(f_first);
    return isfinite(a0) && a0 >= 0.0 ? a0 : 0.0;
}

/* Start values from the resonances and |Z|.  CXL_EEXTRAPOLATE when the
 * sweep shows fewer than two series resonances of one kind. */
static cxl_status start_values(const cxl_sweep *sweep, const model *m, cxl_stub_end end,
                               double *p)
{
    cxl_sweep_res *res = NULL;
    cxl_status st = cxl_sweep_resonances(sweep, m->ref, end, 0.0, 0.0, &res);
    if (st != CXL_OK) return st;
    size_t nr = cxl_sweep_res_count(res);
    double *buf = malloc((3 * nr + 1) * sizeof *buf);
    int *ord = malloc((nr + 1) * sizeof *ord);
    if (!buf || !ord) {
        free(buf);
        free(ord);
        cxl_sweep_res_free(res);
        return CXL_ENOMEM;
    }
    double *fr = buf, *vf = buf + nr, *gap = buf + 2 * nr;
    size_t k = series_readings(res, m, fr, ord, nr);
    double r_first, f_first;
    first_series_zero(res, nr, &r_first, &f_first);
    cxl_sweep_res_free(res);
    double v0 = 0.0, d0 = 0.0;
    if (k >= 2) {
        /* consecutive series resonances are half a wavelength apart */
        v0 = 2.0 * m->length * median_gap(fr, k, gap) / CXL_C_M_PER_S;
        if (m->end_kind != 2 && m->np <= P_FIX) vf_trend(m, end, fr, vf, ord, k, &v0, &d0);
    }
    free(buf);
    free(ord);
    if (k < 2) return CXL_EEXTRAPOLATE;
    if (!cxl__valid_vf(v0)) v0 = 0.66;
    double z0 = z0_start(m);
    p[P_VF] = v0;
    p[P_DROP] = d0;
    p[P_A] = loss_start(m, r_first, f_first, z0);
    p[P_B] = 0.0;
    p[P_Z0] = z0;
    if (m->np > P_FIX) p[P_FIX] = 0.0;
    return CXL_OK;
}

/* Sum of squared residuals at p. */
static double cost(const model *m, const double *p)
{
    double c = 0.0;
    for (size_t i = 0; i < m->n; i++) {
        double complex g = model_gamma(m, p, m->f[i], m->sf[i], NULL);
        double re = creal(g) - m->gre[i], im = cimag(g) - m->gim[i];
        c += re * re + im * im;
    }
    return isfinite(c) ? c : INFINITY;
}

/* The fixture's start: its phase is periodic in its length, so the least
 * squares has a minimum every half wavelength at the top frequency; scan
 * lengths from 0 to the piece's in steps of 1/16 of that wavelength (at
 * most 4096 of them) and start from the best. */
static void fixture_scan(const model *m, double *p)
{
    double fvf = m->fix_vf > 0.0 ? m->fix_vf : p[P_VF];
    double step = fvf * CXL_C_M_PER_S / m->f[m->n - 1] / 16.0;
    size_t steps = (size_t)fmin(4096.0, ceil(m->length / step));
    double best = INFINITY, best_l = 0.0, q[NP_MAX];
    memcpy(q, p, sizeof q);
    for (size_t i = 0; i <= steps; i++) {
        q[P_FIX] = (double)i * step;
        double c = cost(m, q);
        if (c < best) {
            best = c;
            best_l = q[P_FIX];
        }
    }
    p[P_FIX] = best_l;
}

/* A load: finite, R not below 0, and given only with its flag. */
static int load_ok(double re, double im, unsigned flags)
{
    if (!isfinite(re) || !isfinite(im) || re < 0.0) return 0;
    return (re == 0.0 && im == 0.0) || (flags & CXL_SWEEPFIT_LOAD);
}

static cxl_status fit_args(const cxl_sweep *sweep, cxl_sweepfit **fit, double length_m,
                           cxl_stub_end end, double fixture_vf, unsigned flags)
{
    if (!sweep || !fit || !cxl__finite_pos(length_m)) return CXL_EINVAL;
    if (flags & ~(CXL_SWEEPFIT_LOAD | CXL_SWEEPFIT_FIXTURE)) return CXL_EINVAL;
    if (end != CXL_STUB_OPEN && end != CXL_STUB_SHORT) return CXL_EINVAL;
    if (!isfinite(fixture_vf) || fixture_vf < 0.0 || fixture_vf > 1.0) return CXL_EINVAL;
    /* a fixture VF without a fixture, or a load without the flag: a
     * mistake, not something to ignore */
    if (fixture_vf > 0.0 && !(flags & CXL_SWEEPFIT_FIXTURE)) return CXL_EINVAL;
    return CXL_OK;
}

/* The sweep's points above DC into m, their Gamma and sqrt(f) in *g (one
 * array the caller frees). */
static cxl_status load_points(const cxl_sweep *sweep, model *m, double **g)
{
    double ref;
    int has_phase;
    cxl_sweep_info(sweep, NULL, NULL, &ref, NULL, &has_phase);
    if (!has_phase) return CXL_ENOTFOUND;
    size_t n_all = cxl_sweep_count(sweep);
    const double *freq = cxl__sweep_freqs(sweep);
    size_t first = 0;
    while (first < n_all && !(freq[first] > 0.0)) first++; /* no DC point */
    size_t n = n_all - first;
    if (n < (size_t)m->np + 2) return CXL_EEXTRAPOLATE;
    if (n > ((size_t)-1) / (8 * sizeof(double) * NP_MAX)) return CXL_ENOMEM;
    double *a = malloc(3 * n * sizeof *a);
    if (!a) return CXL_ENOMEM;
    for (size_t i = 0; i < n; i++) {
        if (cxl__sweep_gamma(sweep, first + i, ref, &a[i], &a[n + i]) != CXL_OK) {
            free(a);
            return CXL_ERANGE;
        }
    }
    for (size_t i = 0; i < n; i++) a[2 * n + i] = sqrt(freq[first + i]);
    m->f = freq + first, m->sf = a + 2 * n, m->gre = a, m->gim = a + n, m->n = n, m->ref = ref;
    *g = a;
    return CXL_OK;
}

/* internal parameters of order one: the drop and the loss terms as
 * their size at the band's centre, Z0 in units of R, the fixture in
 * units of the piece */
static void set_scales(model *m)
{
    double fc = sqrt(m->f[0] * m->f[m->n - 1]);
    m->scale[P_VF] = 1.0;
    m->scale[P_DROP] = sqrt(fc);
    m->scale[P_A] = 1.0 / sqrt(fc);
    m->scale[P_B] = 1.0 / fc;
    m->scale[P_Z0] = m->ref;
    m->scale[P_FIX] = m->length;
}

/* The least squares from p0 in workspace w; CXL_OK at a minimum. */
static cxl_status solve(model *m, const double *p0, gsl_multifit_nlinear_workspace *w)
{
    size_t np = (size_t)m->np;
    double x0[NP_MAX];
    for (size_t j = 0; j < np; j++) x0[j] = p0[j] / m->scale[j];
    gsl_vector_view xv = gsl_vector_view_array(x0, np);
    gsl_multifit_nlinear_fdf fdf = {
        .f = fit_f, .df = fit_df, .fvv = NULL, .n = 2 * m->n, .p = np, .params = m,
    };
    int info = 0;
    if (gsl_multifit_nlinear_init(&xv.vector, &fdf, w) != GSL_SUCCESS) return CXL_ENOCONV;
    int gst = gsl_multifit_nlinear_driver(200, 1e-8, 1e-12, 0.0, NULL, NULL, &info, w);
    /* no progress possible any more is a minimum too, to the precision
     * of the numbers */
    return gst == GSL_SUCCESS || gst == GSL_ENOPROG ? CXL_OK : CXL_ENOCONV;
}

/* The sum of squared residuals r, and the largest with its frequency. */
static double residuals(const model *m, const gsl_vector *r, double *worst, double *worst_f)
{
    double chisq = 0.0;
    *worst = -1.0;
    *worst_f = 0.0;
    for (size_t i = 0; i < m->n; i++) {
        double a = hypot(gsl_vector_get(r, 2 * i), gsl_vector_get(r, 2 * i + 1));
        chisq += a * a;
        if (a > *worst) {
            *worst = a;
            *worst_f = m->f[i];
        }
    }
    return chisq;
}

/* The covariance in physical units, scaled by chi^2 per degree of freedom s2. */
static cxl_status covariance(const model *m, const gsl_matrix *cov, double s2, cxl_sweepfit *out)
{
    for (int i = 0; i < m->np; i++)
        for (int j = 0; j < m->np; j++) {
            double c = gsl_matrix_get(cov, (size_t)i, (size_t)j) * s2 * m->scale[i] *
                       m->scale[j];
            if (!isfinite(c)) return CXL_ENOCONV;
            out->cov[i][j] = c;
        }
    return CXL_OK;
}

/* The solved fit in workspace w into out, cov its work matrix. */
static cxl_status fit_results(const model *m, gsl_multifit_nlinear_workspace *w, gsl_matrix *cov,
                              cxl_sweepfit *out)
{
    size_t n = m->n;
    cxl_status st = CXL_OK;
    if (gsl_multifit_nlinear_covar(gsl_multifit_nlinear_jac(w), 0.0, cov) != GSL_SUCCESS)
        st = CXL_ENOCONV;
    double worst, worst_f;
    double chisq = residuals(m, gsl_multifit_nlinear_residual(w), &worst, &worst_f);
    double s2 = chisq / (double)(2 * n - (size_t)m->np);
    physical(m, gsl_multifit_nlinear_position(w), out->p);
    if (st == CXL_OK) st = covariance(m, cov, s2, out);
    for (int j = 0; j < m->np; j++)
        if (!isfinite(out->p[j])) st = CXL_ENOCONV;
    /* a fit that ends outside any line did not find this one */
    if (!cxl__valid_vf(out->p[P_VF]) || !cxl__finite_pos(out->p[P_Z0])) st = CXL_ENOCONV;
    out->np = m->np;
    out->rms = sqrt(chisq / (double)n);
    out->max_res = worst;
    out->max_res_hz = worst_f;
    out->f_min = m->f[0];
    out->f_max = m->f[n - 1];
    out->points = n;
    out->iterations = gsl_multifit_nlinear_niter(w);
    return st;
}

/* Allocates the solver of m's size and runs it from p0 into out. */
static cxl_status fit_model(model *m, double *p0, cxl_sweepfit *out)
{
    size_t np = (size_t)m->np;
    gsl_multifit_nlinear_parameters par = gsl_multifit_nlinear_default_parameters();
    par.trs = gsl_multifit_nlinear_trs_lm;
    par.solver = gsl_multifit_nlinear_solver_mcholesky;
    gsl_multifit_nlinear_workspace *w =
        gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &par, 2 * m->n, np);
    gsl_matrix *cov = gsl_matrix_alloc(np, np);
    cxl_status st = CXL_ENOMEM;
    if (w && cov) {
        if (m->np > P_FIX) fixture_scan(m, p0);
        st = solve(m, p0, w);
        if (st == CXL_OK) st = fit_results(m, w, cov, out);
    }
    if (w) gsl_multifit_nlinear_free(w);
    if (cov) gsl_matrix_free(cov);
    return st;
}

cxl_status cxl_sweepfit_new(const cxl_sweep *sweep, double length_m, cxl_stub_end end,
                            double load_re_ohm, double load_im_ohm, double fixture_vf,
                            unsigned flags, cxl_sweepfit **fit)
{
    cxl_status st = fit_args(sweep, fit, length_m, end, fixture_vf, flags);
    if (st != CXL_OK) return st;
    if (!load_ok(load_re_ohm, load_im_ohm, flags)) return CXL_EINVAL;
    model m = {
        .length = length_m, .fix_vf = fixture_vf, .zl = load_re_ohm + I * load_im_ohm,
        .end_kind = (flags & CXL_SWEEPFIT_LOAD) ? 2 : end == CXL_STUB_SHORT ? 1 : 0,
        .np = (flags & CXL_SWEEPFIT_FIXTURE) ? 6 : 5,
    };
    double *g = NULL;
    if ((st = load_points(sweep, &m, &g)) != CXL_OK) return st;
    set_scales(&m);
    double p0[NP_MAX];
    cxl_sweepfit *out = NULL;
    st = start_values(sweep, &m, end, p0);
    if (st == CXL_OK) {
        out = calloc(1, sizeof *out);
        st = out ? fit_model(&m, p0, out) : CXL_ENOMEM;
    }
    free(g);
    if (st != CXL_OK) {
        free(out);
        return st;
    }
    *fit = out;
    return CXL_OK;
}

void cxl_sweepfit_free(cxl_sweepfit *fit)
{
    free(fit);
}

static double sd(double var)
{
    return var > 0.0 ? sqrt(var) : 0.0;
}

cxl_status cxl_sweepfit_line(const cxl_sweepfit *fit, double *vf_hf, double *vf_hf_err,
                             double *drop_sqrt_hz, double *drop_err, double *z0_ohm,
                             double *z0_err)
{
    if (!fit) return CXL_EINVAL;
    if (vf_hf) *vf_hf = fit->p[P_VF];
    if (vf_hf_err) *vf_hf_err = sd(fit->cov[P_VF][P_VF]);
    if (drop_sqrt_hz) *drop_sqrt_hz = fit->p[P_DROP];
    if (drop_err) *drop_err = sd(fit->cov[P_DROP][P_DROP]);
    if (z0_ohm) *z0_ohm = fit->p[P_Z0];
    if (z0_err) *z0_err = sd(fit->cov[P_Z0][P_Z0]);
    return CXL_OK;
}

cxl_status cxl_sweepfit_loss_coefficients(const cxl_sweepfit *fit, double *a_db_per_m_sqrt_hz,
                                          double *a_err, double *b_db_per_m_hz, double *b_err)
{
    if (!fit) return CXL_EINVAL;
    if (a_db_per_m_sqrt_hz) *a_db_per_m_sqrt_hz = fit->p[P_A];
    if (a_err) *a_err = sd(fit->cov[P_A][P_A]);
    if (b_db_per_m_hz) *b_db_per_m_hz = fit->p[P_B];
    if (b_err) *b_err = sd(fit->cov[P_B][P_B]);
    return CXL_OK;
}

cxl_status cxl_sweepfit_fixture(const cxl_sweepfit *fit, double *length_m, double *length_err)
{
    if (!fit) return CXL_EINVAL;
    int has = fit->np > P_FIX;
    if (length_m) *length_m = has ? fit->p[P_FIX] : 0.0;
    if (length_err) *length_err = has ? sd(fit->cov[P_FIX][P_FIX]) : 0.0;
    return CXL_OK;
}

cxl_status cxl_sweepfit_vf(const cxl_sweepfit *fit, double freq_hz, double *vf, double *vf_err)
{
    if (!fit || !vf || !cxl__finite_pos(freq_hz)) return CXL_EINVAL;
    double x = 1.0 / sqrt(freq_hz);
    double v = fit->p[P_VF] - fit->p[P_DROP] * x;
    if (!cxl__valid_vf(v)) return CXL_ERANGE;
    double var = fit->cov[P_VF][P_VF] - 2.0 * x * fit->cov[P_VF][P_DROP] +
                 x * x * fit->cov[P_DROP][P_DROP];
    double e = sd(var);
    if (!isfinite(e)) return CXL_ERANGE;
    *vf = v;
    if (vf_err) *vf_err = e;
    return CXL_OK;
}

cxl_status cxl_sweepfit_loss(const cxl_sweepfit *fit, double freq_hz, double *loss_db_per_m,
                             double *loss_err)
{
    if (!fit || !loss_db_per_m || !cxl__finite_pos(freq_hz)) return CXL_EINVAL;
    double s = sqrt(freq_hz);
    double v = fit->p[P_A] * s + fit->p[P_B] * freq_hz;
    double var = fit->cov[P_A][P_A] * freq_hz + 2.0 * s * freq_hz * fit->cov[P_A][P_B] +
                 freq_hz * freq_hz * fit->cov[P_B][P_B];
    double e = sd(var);
    if (!isfinite(v) || !isfinite(e)) return CXL_ERANGE;
    *loss_db_per_m = v;
    if (loss_err) *loss_err = e;
    return CXL_OK;
}

cxl_status cxl_sweepfit_quality(const cxl_sweepfit *fit, double *rms_residual,
                                double *max_residual, double *max_residual_hz,
                                double *min_freq_hz, double *max_freq_hz)
{
    if (!fit) return CXL_EINVAL;
    if (rms_residual) *rms_residual = fit->rms;
    if (max_residual) *max_residual = fit->max_res;
    if (max_residual_hz) *max_residual_hz = fit->max_res_hz;
    if (min_freq_hz) *min_freq_hz = fit->f_min;
    if (max_freq_hz) *max_freq_hz = fit->f_max;
    return CXL_OK;
}
