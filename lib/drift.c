/* drift.c - velocity factor against frequency from several resonances.
 *
 * Why VF(f) = vf_hf - d / sqrt(f): in the skin-effect regime a conductor's
 * surface impedance is (1 + j) Rs with Rs proportional to sqrt(f), so the
 * internal inductance R / omega adds to the external L a part that falls
 * as 1/sqrt(f).  For a low-loss line beta ~ omega sqrt(L C), hence
 *     1/VF = c sqrt(L C) = (1/vf_hf) sqrt(1 + L_int / L_ext)
 *          ~ (1/vf_hf) (1 + L_int / (2 L_ext)),
 * and VF ~ vf_hf (1 - L_int / (2 L_ext)): linear in x = 1/sqrt(f).  The
 * next terms, (R / omega L)^2 / 8 in beta and the dielectric's own
 * dispersion, are of order 1/f and neglected.  A clad centre below its
 * crossover frequency (current in the steel) does not follow this law; the
 * fit then only interpolates.
 *
 * The fit is GSL's weighted linear least squares in x = 1/sqrt(f).
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_multifit.h>
#include "coaxline.h"
#include "internal.h"

struct cxl_drift {
    double v_hf, d;          /* VF = v_hf - d / sqrt(f) */
    double cov[2][2];        /* covariance of (v_hf, -d) */
    double f_min, f_max;
    size_t n;
};

/* x = 1/sqrt(f) in 1/sqrt(MHz), which keeps the columns of similar size. */
static double x_of(double freq_hz)
{
    return 1.0 / sqrt(freq_hz * 1e-6);
}

cxl_status cxl_drift_new(const double *freq_hz, const double *vf,
                         const double *vf_err, size_t n, cxl_drift **drift)
{
    if (!freq_hz || !vf || !drift || n == 0) return CXL_EINVAL;
    for (size_t i = 0; i < n; i++)
        if (!cxl__finite_pos(freq_hz[i]) || !cxl__valid_vf(vf[i]) ||
            (vf_err && !cxl__finite_pos(vf_err[i])))
            return CXL_EINVAL;
    double f_min = freq_hz[0], f_max = freq_hz[0];
    for (size_t i = 1; i < n; i++) {
        if (freq_hz[i] < f_min) f_min = freq_hz[i];
        if (freq_hz[i] > f_max) f_max = freq_hz[i];
    }
    /* two distinct frequencies at least, and far enough apart that the
     * columns 1 and x are not numerically the same */
    if (!(f_max > f_min * (1.0 + 1e-9))) return CXL_ERANGE;
    cxl_drift *d = calloc(1, sizeof *d);
    double *buf = malloc((4 * n + 6) * sizeof *buf);
    gsl_multifit_linear_workspace *work = gsl_multifit_linear_alloc(n, 2);
    if (!d || !buf || !work) {
        free(d); free(buf);
        if (work) gsl_multifit_linear_free(work);
        return CXL_ENOMEM;
    }
    double *X = buf, *w = X + 2 * n, *y = w + n, *c = y + n, *cov = c + 2;
    for (size_t i = 0; i < n; i++) {
        X[2 * i] = 1.0;
        X[2 * i + 1] = x_of(freq_hz[i]);
        y[i] = vf[i];
        w[i] = vf_err ? 1.0 / (vf_err[i] * vf_err[i]) : 1.0;
    }
    gsl_matrix_view Xv = gsl_matrix_view_array(X, n, 2);
    gsl_vector_view wv = gsl_vector_view_array(w, n), yv = gsl_vector_view_array(y, n);
    gsl_vector_view cv = gsl_vector_view_array(c, 2);
    gsl_matrix_view covv = gsl_matrix_view_array(cov, 2, 2);
    double chisq = 0.0;
    int gst = gsl_multifit_wlinear(&Xv.matrix, &wv.vector, &yv.vector, &cv.vector,
                                   &covv.matrix, &chisq, work);
    gsl_multifit_linear_free(work);
    cxl_status st = CXL_ENOCONV;
    if (gst == GSL_SUCCESS && isfinite(c[0]) && isfinite(c[1])) {
        /* without stated errors the scatter sets the scale (none with two
         * points: the line goes through both); with them, a scatter larger
         * than they explain scales them up (chi^2 per degree of freedom
         * above 1: the law misses some of the readings' spread) */
        double scale = 1.0, per_dof = n > 2 ? chisq / (double)(n - 2) : 0.0;
        if (!vf_err) scale = per_dof;
        else if (per_dof > 1.0) scale = per_dof;
        d->v_hf = c[0];
        d->d = -c[1] * 1e3; /* per 1/sqrt(MHz) -> per 1/sqrt(Hz) */
        for (int r = 0; r < 2; r++)
            for (int k = 0; k < 2; k++) d->cov[r][k] = cov[2 * r + k] * scale;
        d->f_min = f_min;
        d->f_max = f_max;
        d->n = n;
        st = CXL_OK;
    }
    free(buf);
    if (st != CXL_OK) {
        free(d);
        return st;
    }
    *drift = d;
    return CXL_OK;
}

cxl_status cxl_drift_new_stub(const cxl_stub_result *result, double freq_res_hz,
                              cxl_drift **drift)
{
    size_t n = cxl_stub_result_count(result);
    if (!result || !drift || n == 0 || !cxl__finite_nonneg(freq_res_hz)) return CXL_EINVAL;
    double *buf = malloc(3 * n * sizeof *buf);
    if (!buf) return CXL_ENOMEM;
    double *f = buf, *v = f + n, *e = v + n;
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < n && st == CXL_OK; i++) {
        st = cxl_stub_result_reading(result, i, NULL, &f[i], NULL, &v[i], NULL, NULL);
        /* a frequency step df moves a reading's VF by VF df / f */
        e[i] = v[i] * freq_res_hz / f[i];
        /* a resolution so fine or so coarse that the error under- or
         * overflows is out of range, not an invalid argument */
        if (st == CXL_OK && freq_res_hz > 0.0 && !cxl__finite_pos(e[i])) st = CXL_ERANGE;
    }
    if (st == CXL_OK) st = cxl_drift_new(f, v, freq_res_hz > 0.0 ? e : NULL, n, drift);
    free(buf);
    return st;
}

void cxl_drift_free(cxl_drift *drift)
{
    free(drift);
}

cxl_status cxl_drift_coefficients(const cxl_drift *drift, double *vf_hf,
                                  double *drop_sqrt_hz)
{
    if (!drift || !vf_hf || !drop_sqrt_hz) return CXL_EINVAL;
    *vf_hf = drift->v_hf;
    *drop_sqrt_hz = drift->d;
    return CXL_OK;
}

cxl_status cxl_drift_range(const cxl_drift *drift, double *min_freq_hz,
                           double *max_freq_hz)
{
    if (!drift || !min_freq_hz || !max_freq_hz) return CXL_EINVAL;
    *min_freq_hz = drift->f_min;
    *max_freq_hz = drift->f_max;
    return CXL_OK;
}

cxl_status cxl_drift_vf(const cxl_drift *drift, double freq_hz, double *vf,
                        double *vf_err)
{
    if (!drift || !vf || !cxl__finite_pos(freq_hz)) return CXL_EINVAL;
    double x = x_of(freq_hz);
    double v = drift->v_hf - drift->d * 1e-3 * x; /* x in 1/sqrt(MHz) */
    if (!cxl__valid_vf(v)) return CXL_ERANGE; /* the trend leaves (0, 1] there */
    double var = drift->cov[0][0] + 2.0 * x * drift->cov[0][1] + x * x * drift->cov[1][1];
    *vf = v;
    if (vf_err) *vf_err = var > 0.0 ? sqrt(var) : 0.0;
    return CXL_OK;
}
