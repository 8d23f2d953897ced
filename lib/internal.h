/* internal.h - helpers shared by the library's modules; not installed.
 * Internal functions are named cxl__*, so the export rule (^cxl_[a-z])
 * keeps them out of the shared library's symbol table. */
#ifndef CXL_INTERNAL_H
#define CXL_INTERNAL_H

#include <math.h>
#include <stddef.h>
#include <gsl/gsl_complex.h>
#include "coaxline.h"

static inline int cxl__finite_pos(double x) { return isfinite(x) && x > 0.0; }
static inline int cxl__finite_nonneg(double x) { return isfinite(x) && x >= 0.0; }
static inline int cxl__valid_vf(double vf) { return isfinite(vf) && vf > 0.0 && vf <= 1.0; }
/* Store a result only when it is finite: huge or tiny (but finite)
 * arguments can overflow a formula, and no NaN or infinity may leave the
 * library.  CXL_ERANGE otherwise, *out untouched. */
static inline cxl_status cxl__put_finite(double v, double *out)
{
    if (!isfinite(v)) return CXL_ERANGE;
    *out = v;
    return CXL_OK;
}

/* loss.c: a fitted loss table is used up to this fraction beyond its
 * lowest and highest point (cxl_loss_fit_usable_range). */
#define CXL__LOSS_FIT_MARGIN 0.1

/* loss.c: weighted least squares of y = c0 x[i][0] + c1 x[i][1] (x row-major,
 * n rows of 2) with weights w (GSL's wlinear); cov 2x2 row-major and chisq
 * may be NULL.  CXL_ENOMEM, CXL_ENOCONV (GSL failed or a coefficient is not
 * finite) or CXL_OK.  The one such fit of the loss table and the VF drift. */
cxl_status cxl__wfit2(const double *x, const double *w, const double *y, size_t n,
                      double c[2], double cov[4], double *chisq);

/* loss.c: a least-squares workspace kept across fits, so that a handle
 * refitted row after row allocates only when it needs more room than
 * before.  Zero-initialise; cxl__fitws_free releases it.  work is GSL's
 * gsl_multifit_linear_workspace for up to nmax rows of pmax columns (GSL
 * solves any n <= nmax, p <= pmax in it); buf holds cap doubles for the
 * caller's own arrays. */
typedef struct cxl__fitws {
    void *work;
    size_t nmax, pmax;
    double *buf;
    size_t cap;
} cxl__fitws;
cxl_status cxl__fitws_reserve(cxl__fitws *ws, size_t n, size_t p, size_t doubles);
void cxl__fitws_free(cxl__fitws *ws);
/* cxl__wfit2 in a workspace reserved for n rows of 2 columns. */
cxl_status cxl__wfit2_ws(cxl__fitws *ws, const double *x, const double *w, const double *y,
                         size_t n, double c[2], double cov[4], double *chisq);

/* drift.c: the trend VF = v_hf - d / sqrt(f), opaque to callers of the
 * API, here so that the library's own row paths can hold one in place. */
struct cxl_drift {
    double v_hf, d;          /* VF = v_hf - d / sqrt(f) */
    double cov[2][2];        /* covariance of (v_hf, -d) */
    double f_min, f_max;
    size_t n;
};
/* cxl_drift_new_stub into *drift, with the fit in ws (no allocation once
 * ws holds room for the result's readings). */
cxl_status cxl__drift_fill_stub(const cxl_stub_result *result, double freq_res_hz,
                                cxl__fitws *ws, struct cxl_drift *drift);
/* stub.c: cxl_stub_result_vf_at with its trend fitted in ws, or known
 * (non-NULL: cxl__drift_fill_stub of this result at its own step). */
cxl_status cxl__stub_result_vf_at_ws(const cxl_stub_result *result, double freq_hz,
                                     double *vf, double *vf_err, unsigned *how,
                                     cxl__fitws *ws, const struct cxl_drift *known);

/* Case-insensitive ASCII comparison of n bytes, locale-free. */
int cxl__ascii_ncaseeq(const char *a, const char *b, size_t n);

/* Built-in tables, generated from data/NAME.csv by build-aux/embed-csv.awk. */
extern const char cxl__data_bands[];
extern const size_t cxl__data_bands_size;
extern const char cxl__data_cables[];
extern const size_t cxl__data_cables_size;
extern const char cxl__data_cable_loss[];
extern const size_t cxl__data_cable_loss_size;
/* bessel.c: scaled ratios of modified Bessel functions of complex
 * argument, z I0(z)/(2 I1(z)) and z K0(z)/K1(z), for the internal impedance
 * of round conductors.  The plain functions switch from the ascending
 * series to the asymptotic expansion at |z| = CXL__BESSEL_I_ASYMPT_MIN
 * (I) and CXL__BESSEL_K_ASYMPT_MIN (K), where both forms agree with
 * scipy's ive/kve to 1e-10 or better on the 45-degree ray the conductors
 * use (measured by tests/bessel_compare.py: the K series loses digits to
 * cancellation as e^(2|z|), the I asymptotic form misses a term of
 * relative size e^(-2 Re z)).  The _series and _asympt forms are there for
 * the tests of both branches. */
#define CXL__BESSEL_I_ASYMPT_MIN 20.0
#define CXL__BESSEL_K_ASYMPT_MIN 10.0
gsl_complex cxl__bessel_i_ratio(gsl_complex z);
gsl_complex cxl__bessel_k_ratio(gsl_complex z);
gsl_complex cxl__bessel_i_ratio_series(gsl_complex z);
gsl_complex cxl__bessel_k_ratio_series(gsl_complex z);
gsl_complex cxl__bessel_i_ratio_asympt(gsl_complex z);
gsl_complex cxl__bessel_k_ratio_asympt(gsl_complex z);
/* array.c: a power ratio in dB, clamped to +-CXL_DB_LIMIT. */
double cxl__power_db(double ratio);
/* array.c: front-to-back ratio with extra_phase_rad added to element 1. */
cxl_status cxl__array_front_to_back(const cxl_duo *pair,
                                    double freq_hz, double elevation_deg,
                                    double extra_phase_rad, double *ratio_db);

/* array.c, for the Monte-Carlo of yield.c.  Element i's feed at one
 * frequency, split so that a trial can change its parts: the signed
 * amplitude 10^(weight/20) (negative when reversed; the line's loss not
 * included), the phase without the line (fixed offset minus the fixed
 * delay's, radians), and the line (line_m 0 when none): its VF (for a
 * modelled line omega / (beta c) at this frequency), beta and alpha of a
 * modelled line (0 for a lossless one).  The element's weight is then
 * amp exp(-alpha L) exp(j (phase - omega L / (vf c))), with beta L in
 * place of omega L / (vf c) for a modelled line, as cxl_array_eval_* use it. */
typedef struct {
    double amp, phase_rad;
    double line_m, line_vf, beta_rad_per_m, alpha_np_per_m;
} cxl__array_feed;
cxl_status cxl__array_feeds(const cxl_array *array, double freq_hz,
                            cxl__array_feed *feeds);
/* The array prepared at one frequency (free with free()); the signal of
 * element i for a unit weight and a wave from (az, el) in radians (element
 * pattern, ground image and path phase: the output is sum w_i s_i), the
 * weights replaced, and the rear null as cxl_array_eval_rear_null finds it
 * (CXL_ERANGE when there is no forward response). */
typedef struct cxl__array_eval cxl__array_eval;
cxl_status cxl__array_eval_new(const cxl_array *array, double freq_hz,
                               cxl__array_eval **eval);
void cxl__array_eval_steer(const cxl__array_eval *e, double az_rad,
                           double el_rad, double *re, double *im);
void cxl__array_eval_set_weight(cxl__array_eval *e, size_t i, double re,
                                double im);
cxl_status cxl__array_eval_rear_null(const cxl__array_eval *e, double el_rad,
                                     double *depth_db);

/* pool.c: a small pool of worker threads.  The calling thread is worker 0
 * and nthreads - 1 threads are started (fewer when the system refuses
 * one: the work is the same, only slower).  cxl__pool_run hands tasks
 * 0..ntasks-1 out in increasing order to whichever worker is free and
 * returns when all are done; a task's result must therefore not depend on
 * which worker ran it (keep per-worker scratch space only). */
typedef struct cxl__pool cxl__pool;
typedef void (*cxl__pool_fn)(void *ctx, unsigned worker, size_t task);
cxl_status cxl__pool_new(unsigned nthreads, cxl__pool **pool);
/* Workers actually running (>= 1), the caller included. */
unsigned cxl__pool_size(const cxl__pool *pool);
void cxl__pool_run(cxl__pool *pool, size_t ntasks, cxl__pool_fn fn, void *ctx);
void cxl__pool_free(cxl__pool *pool);
/* Processors online (sysconf), at least 1. */
unsigned cxl__pool_cores(void);

/* transfer.c: for the order-th series resonance of length_m of a modelled
 * stub, the frequency at which the line is exactly (2n-1)/4 or n/2
 * wavelengths long (wave_hz) and the one at which its input reactance is
 * zero, or where the dip of another kind lies (dip_hz, what an analyzer
 * reads). */
cxl_status cxl__transfer_stub_points(const cxl_loss_model *model, unsigned flags,
                                     cxl_stub_end end, int order, double length_m,
                                     cxl_dip_kind kind, double ref_ohm,
                                     double *wave_hz, double *dip_hz);

/* sweep.c: Gamma of point i against ref_ohm (> 0) of a sweep with phase,
 * and the frequency array. */
cxl_status cxl__sweep_gamma(const cxl_sweep *sweep, size_t i, double ref_ohm,
                            double *re, double *im);
const double *cxl__sweep_freqs(const cxl_sweep *sweep);

#endif
