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
#include "coaxline.h"
#include "internal.h"

/* Relative change of the drop coefficient the law a - b/sqrt(f) misses
 * when it is carried beyond the readings (see cxl_drift_vf). */
#define LAW_SLACK 0.25

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

/* Every reading finite, in range, and with a positive error when given. */
static int readings_ok(const double *freq_hz, const double *vf, const double *vf_err, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (!cxl__finite_pos(freq_hz[i]) || !cxl__valid_vf(vf[i]) ||
            (vf_err && !cxl__finite_pos(vf_err[i])))
            return 0;
    return 1;
}

/* The fitted line c, its covariance and chi^2 into d. */
static void store_fit(cxl_drift *d, const double *c, const double *cov, double chisq, size_t n,
                      int have_err)
{
    /* without stated errors the scatter sets the scale (none with two
     * points: the line goes through both); with them, a scatter larger
     * than they explain scales them up (chi^2 per degree of freedom
     * above 1: the law misses some of the readings' spread) */
    double scale = 1.0, per_dof = n > 2 ? chisq / (double)(n - 2) : 0.0;
    if (!have_err) scale = per_dof;
    else if (per_dof > 1.0) scale = per_dof;
    d->v_hf = c[0];
    d->d = -c[1] * 1e3; /* per 1/sqrt(MHz) -> per 1/sqrt(Hz) */
    for (int r = 0; r < 2; r++)
        for (int k = 0; k < 2; k++) d->cov[r][k] = cov[2 * r + k] * scale;
    d->n = n;
}

cxl_status cxl_drift_new(const double *freq_hz, const double *vf,
                         const double *vf_err, size_t n, cxl_drift **drift)
{
    if (!freq_hz || !vf || !drift || n == 0) return CXL_EINVAL;
    if (!readings_ok(freq_hz, vf, vf_err, n)) return CXL_EINVAL;
    double f_min = freq_hz[0], f_max = freq_hz[0];
    for (size_t i = 1; i < n; i++) {
        if (freq_hz[i] < f_min) f_min = freq_hz[i];
        if (freq_hz[i] > f_max) f_max = freq_hz[i];
    }
    /* two distinct frequencies at least, and far enough apart that the
     * columns 1 and x are not numerically the same */
    if (!(f_max > f_min * (1.0 + 1e-9))) return CXL_ERANGE;
    cxl_drift *d = calloc(1, sizeof *d);
    double *buf = calloc(4 * n, sizeof *buf); /* calloc: also checks 4 n for overflow */
    if (!d || !buf) {
        free(d); free(buf);
        return CXL_ENOMEM;
    }
    double *X = buf, *w = X + 2 * n, *y = w + n, c[2], cov[4];
    for (size_t i = 0; i < n; i++) {
        X[2 * i] = 1.0;
        X[2 * i + 1] = x_of(freq_hz[i]);
        y[i] = vf[i];
        w[i] = vf_err ? 1.0 / (vf_err[i] * vf_err[i]) : 1.0;
    }
    double chisq = 0.0;
    cxl_status st = cxl__wfit2(X, w, y, n, c, cov, &chisq);
    free(buf);
    if (st != CXL_OK) {
        free(d);
        return st;
    }
    store_fit(d, c, cov, chisq, n, vf_err != NULL);
    d->f_min = f_min;
    d->f_max = f_max;
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
    /* outside the readings the law's neglected terms grow: the model's
     * local drop coefficient changes by up to LAW_SLACK of itself between
     * 1 and 30 MHz (copper built-in cables), so the extrapolated VF may
     * miss by that fraction of the trend's change beyond the readings */
    double x_lo = x_of(drift->f_max), x_hi = x_of(drift->f_min);
    double beyond = x < x_lo ? x_lo - x : x > x_hi ? x - x_hi : 0.0;
    double law = LAW_SLACK * fabs(drift->d) * 1e-3 * beyond;
    *vf = v;
    if (vf_err) *vf_err = hypot(var > 0.0 ? sqrt(var) : 0.0, law);
    return CXL_OK;
}

/* The drift one reading cannot show.  Over the built-in cables the
 * physical model (cxl_loss_model_vf) gives VF(f) / VF_hf = 1 - c / sqrt(f)
 * with c from about 6 (thick foam lines) to 77 sqrt(Hz) (RG-174, RG-316)
 * between 0.3 and 100 MHz, and up to about 100 for a copper-clad centre
 * below 1 MHz; CXL_DRIFT_MAX_DROP_SQRT_HZ (120) covers them with room for
 * a spool the model does not know (tests/check_drift.c checks every
 * built-in cable's model against it).  Not knowing c, take it as anywhere
 * in [0, c_max]: the VF at to_hz is the VF at from_hz times a ratio that
 * runs monotonically from 1 (c = 0) to r(c_max); the centre of that range
 * is the estimate and half its width the allowance, exact, not first
 * order. */
cxl_status cxl_drift_allowance(double from_hz, double to_hz, double *factor,
                               double *rel_halfwidth)
{
    if (!factor || !rel_halfwidth || !cxl__finite_pos(from_hz) || !cxl__finite_pos(to_hz))
        return CXL_EINVAL;
    /* below 4 c_max^2 (58 kHz) the drop would pass half the VF: the law
     * has long stopped holding there */
    const double c = CXL_DRIFT_MAX_DROP_SQRT_HZ, f_min = 4.0 * c * c;
    if (from_hz < f_min || to_hz < f_min) return CXL_ERANGE;
    double r = (1.0 - c / sqrt(to_hz)) / (1.0 - c / sqrt(from_hz));
    *factor = 0.5 * (1.0 + r);
    *rel_halfwidth = 0.5 * fabs(1.0 - r);
    return CXL_OK;
}
