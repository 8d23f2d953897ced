/* fault.c - distance to fault: reflection against distance from the
 * windowed, zero-padded inverse FFT of a one-port sweep's Gamma(f).
 *
 * A reflection g at round-trip delay tau adds g exp(-j 2 pi f tau) to
 * Gamma(f); the inverse transform over the sweep's frequency grid puts a
 * peak of height g at t = tau, and the one-way distance is VF c t / 2.
 * Band-pass: the sweep as it is (any start frequency), magnitude only.
 * Low-pass: a sweep from near DC on a harmonic grid (f_k = k df) is
 * completed down to DC and mirrored (Gamma(-f) = conj Gamma(f)), so the
 * transform is real: the impulse response, whose sign tells a step up in
 * impedance (+) from a step down (-), and its running sum, the step
 * response.  Resolution VF c / (2 span), unambiguous range VF c / (2 df):
 * common practice of frequency-domain reflectometry, no single source. */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_fft_complex.h>
#include <gsl/gsl_fft_halfcomplex.h>
#include <gsl/gsl_sf_bessel.h>
#include "coaxline.h"
#include "internal.h"

#define PAD 4              /* zero-padding factor of the transform */
#define LOWPASS_MAX_K0 10  /* "near DC": the first point at most 10 steps up */
#define UNIFORM_TOL 1e-6   /* relative spread of the steps still "uniform" */
#define PEAK_FLOOR 1e-3    /* -60 dB: weaker peaks are not listed */
#define PEAK_MARGIN_DB 6.0 /* above the window's highest sidelobe */

typedef struct peak {
    double d, refl, signed_refl;
} peak;

struct cxl_fault {
    size_t m;           /* profile points */
    double dd;          /* metres per point */
    double *refl, *signed_refl, *step;
    size_t npeaks;
    peak *peaks;
    int lowpass;
    double vf, resolution_m, range_m, step_hz;
};

void cxl_fault_free(cxl_fault *fault)
{
    if (!fault) return;
    free(fault->refl);
    free(fault->peaks);
    free(fault);
}

/* Window value at u in [0, 1] from the centre (0) to the edge (1). */
static double window_at(cxl_fault_window w, double beta, double u)
{
    if (w == CXL_FAULT_HANN) return 0.5 * (1.0 + cos(M_PI * u));
    if (w == CXL_FAULT_KAISER) {
        double a = 1.0 - u * u;
        if (a < 0.0) a = 0.0;
        /* exponentially scaled I0 keeps large beta finite */
        return gsl_sf_bessel_I0_scaled(beta * sqrt(a)) / gsl_sf_bessel_I0_scaled(beta) *
               exp(beta * (sqrt(a) - 1.0));
    }
    return 1.0;
}

/* Highest sidelobe of a window's transform, dB below the main lobe:
 * rectangular -13.26, Hann -31.47 (Harris, "On the use of windows for
 * harmonic analysis with the discrete Fourier transform", Proc. IEEE 66(1),
 * 1978, table 1, from memory); Kaiser from Kaiser's design relation
 * beta = 0.1102 (A - 8.7) above A = 50 dB and
 * 0.5842 (A - 21)^0.4 + 0.07886 (A - 21) from 21 to 50 dB, solved for A
 * (Oppenheim and Schafer, Discrete-Time Signal Processing, 3rd ed., eq.
 * 7.63, from memory; there A is the stop-band attenuation, a close bound
 * for the sidelobe level). */
static double sidelobe_db(cxl_fault_window w, double beta)
{
    if (w == CXL_FAULT_RECT) return -13.26;
    if (w == CXL_FAULT_HANN) return -31.47;
    if (beta > 0.1102 * (50.0 - 8.7)) return -(beta / 0.1102 + 8.7);
    double lo = 13.26, hi = 50.0;  /* beta 0 is the rectangular window */
    for (int i = 0; i < 60; i++) {
        double a = 0.5 * (lo + hi), x = a > 21.0 ? a - 21.0 : 0.0;
        double b = 0.5842 * pow(x, 0.4) + 0.07886 * x;
        if (b < beta) lo = a;
        else hi = a;
    }
    return -0.5 * (lo + hi);
}

static size_t pow2_at_least(size_t n)
{
    size_t m = 1;
    while (m < n) m <<= 1;
    return m;
}

static int bad_window(cxl_fault_window window, double kaiser_beta)
{
    if (window != CXL_FAULT_RECT && window != CXL_FAULT_HANN && window != CXL_FAULT_KAISER)
        return 1;
    return !isfinite(kaiser_beta) || kaiser_beta < 0.0 || kaiser_beta > CXL_FAULT_MAX_BETA;
}

/* The arguments cxl_fault_new() refuses with CXL_EINVAL. */
static int bad_args(const cxl_sweep *sweep, double reference_ohm, double vf,
                    const cxl_loss_model *model, cxl_fault_window window,
                    double kaiser_beta, double loss_db_per_m, unsigned flags,
                    cxl_fault **fault)
{
    if (!sweep || !fault || !cxl__finite_pos(reference_ohm)) return 1;
    if (bad_window(window, kaiser_beta) || !cxl__finite_nonneg(loss_db_per_m)) return 1;
    if (flags & ~(CXL_FAULT_BANDPASS | CXL_FAULT_MODEL_LOSS)) return 1;
    if (vf == 0.0 && !model) return 1;
    if (vf != 0.0 && !cxl__valid_vf(vf)) return 1;
    return (flags & CXL_FAULT_MODEL_LOSS) && !model;
}

/* The sweep's grid: uniform steps of *df from *start; CXL_ENOTFOUND
 * without phase, CXL_ERANGE for fewer than 2 points. */
static cxl_status sweep_grid(const cxl_sweep *sweep, double *start, double *stop,
                             size_t *n, double *df)
{
    int has_phase;
    cxl_sweep_info(sweep, start, stop, NULL, NULL, &has_phase);
    if (!has_phase) return CXL_ENOTFOUND;
    *n = cxl_sweep_count(sweep);
    if (*n < 2) return CXL_ERANGE;
    const double *f = cxl__sweep_freqs(sweep);
    *df = (*stop - *start) / (double)(*n - 1);
    for (size_t i = 0; i + 1 < *n; i++)
        if (fabs((f[i + 1] - f[i]) - *df) > UNIFORM_TOL * *df) return CXL_EINCONSISTENT;
    return CXL_OK;
}

/* Low-pass or band-pass, the spectral points used (nk, k0r of them below
 * the first), the padded transform size and the distance axis. */
static cxl_status plan_grid(double start, double stop, size_t n, double df, double vf,
                            unsigned flags, size_t *k0r, size_t *nk, cxl_fault *plan)
{
    double k0 = start / df;
    *k0r = (size_t)floor(k0 + 0.5);
    int lowpass = !(flags & CXL_FAULT_BANDPASS) && fabs(k0 - (double)*k0r) <= 1e-3 &&
                  *k0r <= LOWPASS_MAX_K0;
    *nk = lowpass ? *k0r + n : n;
    if (*nk > SIZE_MAX / (4 * PAD * sizeof(double))) return CXL_ENOMEM;
    size_t m = pow2_at_least(lowpass ? 2 * *nk * PAD : *nk * PAD);
    if (m < 1024) m = 1024;
    double span = lowpass ? stop : stop - start;
    double dist_per_s = vf * CXL_C_M_PER_S / 2.0;
    double resolution = dist_per_s / span, range = dist_per_s / df;
    double dd = range / (double)m;
    if (!isfinite(resolution) || !isfinite(range) || !(dd > 0.0)) return CXL_ERANGE;
    *plan = (cxl_fault){ .m = m, .dd = dd, .lowpass = lowpass, .vf = vf,
                         .resolution_m = resolution, .range_m = range, .step_hz = df };
    return CXL_OK;
}

/* VF (when 0) and loss (with CXL_FAULT_MODEL_LOSS) from the model at the
 * centre of the sweep. */
static cxl_status line_at_centre(const cxl_loss_model *model, double centre, unsigned flags,
                                 double *vf, double *loss_db_per_m)
{
    if (*vf == 0.0) {
        cxl_status st = cxl_loss_model_vf(model, centre, CXL_LOSS_EXTRAPOLATE, vf);
        if (st != CXL_OK) return st;
        if (!cxl__valid_vf(*vf)) return CXL_ERANGE;
    }
    if (flags & CXL_FAULT_MODEL_LOSS)
        return cxl_loss_model_attenuation(model, centre, CXL_LOSS_EXTRAPOLATE, loss_db_per_m);
    return CXL_OK;
}

/* Low-pass: Gamma at the nk harmonics k df (the k0r below the first point
 * continued from the first two), windowed, in GSL's half-complex layout
 * (z[k] real part, z[m - k] imaginary part): the spectrum is Hermitian, so
 * the response is real and the real inverse does half the work. */
static cxl_status fill_lowpass(const cxl_sweep *sweep, double reference_ohm,
                               cxl_fault_window window, double beta, size_t k0r, size_t nk,
                               size_t m, double *z, double *wsum)
{
    /* below the first point: magnitude and unwrapped phase continued
     * linearly from the first two points down to DC, where Gamma is real
     * (the real part of that continuation) */
    double g0r, g0i, g1r, g1i;
    cxl__sweep_gamma(sweep, 0, reference_ohm, &g0r, &g0i);
    cxl__sweep_gamma(sweep, 1, reference_ohm, &g1r, &g1i);
    double a0 = hypot(g0r, g0i), a1 = hypot(g1r, g1i);
    double p0 = atan2(g0i, g0r), dp = atan2(g1i, g1r) - p0;
    dp -= 2.0 * M_PI * floor(dp / (2.0 * M_PI) + 0.5);
    for (size_t k = 0; k < nk; k++) {
        double gr, gi;
        if (k >= k0r) {
            cxl_status st = cxl__sweep_gamma(sweep, k - k0r, reference_ohm, &gr, &gi);
            if (st != CXL_OK) return st;
            if (k == 0) gi = 0.0;
        } else {
            double back = (double)k0r - (double)k;  /* steps below the first */
            double amp = a0 - (a1 - a0) * back, ph = p0 - dp * back;
            gr = amp * cos(ph);
            gi = k == 0 ? 0.0 : amp * sin(ph);
        }
        double w = window_at(window, beta, (double)k / (double)nk);
        z[k] = w * gr;
        if (k > 0) z[m - k] = w * gi;
        *wsum += k ? 2.0 * w : w;
    }
    return CXL_OK;
}

/* Band-pass: the n points, windowed, as interleaved complex numbers. */
static cxl_status fill_bandpass(const cxl_sweep *sweep, double reference_ohm,
                                cxl_fault_window window, double beta, size_t n, double *z,
                                double *wsum)
{
    for (size_t k = 0; k < n; k++) {
        double gr, gi;
        cxl_status st = cxl__sweep_gamma(sweep, k, reference_ohm, &gr, &gi);
        if (st != CXL_OK) return st;
        /* symmetric window over the points, never zero at the ends */
        double u = fabs(2.0 * (double)(k + 1) / (double)(n + 1) - 1.0);
        double w = window_at(window, beta, u);
        z[2 * k] = w * gr;
        z[2 * k + 1] = w * gi;
        *wsum += w;
    }
    return CXL_OK;
}

/* The transformed z into the profile: reflection (refl), signed (sgn) and
 * the step response (stp, low-pass only), loss compensated. */
static cxl_status to_profile(const double *z, size_t m, int lowpass, double wsum,
                             double loss_db_per_m, double dd, double *refl, double *sgn,
                             double *stp)
{
    /* the running sum of the padded impulse reaches g for a reflection g
     * once scaled by wsum / m (the kernel of one reflection sums to
     * m g W(0) / wsum, W(0) = 1) */
    double run = 0.0, loss_np = loss_db_per_m * M_LN10 / 20.0, run_scale = wsum / (double)m;
    for (size_t i = 0; i < m; i++) {
        double v = lowpass ? z[i] / wsum : hypot(z[2 * i], z[2 * i + 1]) / wsum;
        if (loss_np != 0.0) v *= exp(2.0 * loss_np * dd * (double)i);  /* round trip */
        if (!isfinite(v)) return CXL_ERANGE;
        sgn[i] = v;
        refl[i] = fabs(v);
        run += v * run_scale;
        stp[i] = lowpass ? run : 0.0;
    }
    return CXL_OK;
}

/* Peaks above the window's sidelobes of the strongest and -60 dB, each
 * refined by the parabola through it and its neighbours. */
static cxl_status find_peaks(cxl_fault *r, const double *refl, const double *sgn, size_t m,
                             double dd, cxl_fault_window window, double beta)
{
    double top = 0.0;
    for (size_t i = 0; i < m; i++) top = fmax(top, refl[i]);
    double thresh = fmax(PEAK_FLOOR, top * pow(10.0, (sidelobe_db(window, beta) +
                                                       PEAK_MARGIN_DB) / 20.0));
    size_t cap = 16;
    r->peaks = malloc(cap * sizeof *r->peaks);
    if (!r->peaks) return CXL_ENOMEM;
    for (size_t i = 0; i < m; i++) {
        double a = refl[i ? i - 1 : m - 1], b = refl[i], c = refl[i + 1 < m ? i + 1 : 0];
        if (!(b > a && b >= c && b >= thresh)) continue;
        double den = a - 2.0 * b + c, delta = den < 0.0 ? 0.5 * (a - c) / den : 0.0;
        if (r->npeaks == cap) {
            peak *p = realloc(r->peaks, 2 * cap * sizeof *p);
            if (!p) return CXL_ENOMEM;
            r->peaks = p;
            cap *= 2;
        }
        double d = ((double)i + delta) * dd;
        if (d < 0.0) d = 0.0;
        r->peaks[r->npeaks++] = (peak){ d, b - 0.25 * (a - c) * delta, sgn[i] };
    }
    return CXL_OK;
}

/* The windowed, zero-padded transform of the sweep into r's profile. */
static cxl_status transform(const cxl_sweep *sweep, double reference_ohm,
                            cxl_fault_window window, double beta, double loss_db_per_m,
                            size_t n, size_t k0r, size_t nk, cxl_fault *r)
{
    size_t m = r->m;
    double *z = calloc(r->lowpass ? m : 2 * m, sizeof *z);
    double *h = malloc(3 * m * sizeof *h);
    cxl_status st = z && h ? CXL_OK : CXL_ENOMEM;
    double wsum = 0.0;
    if (st == CXL_OK)
        st = r->lowpass ? fill_lowpass(sweep, reference_ohm, window, beta, k0r, nk, m, z, &wsum)
                        : fill_bandpass(sweep, reference_ohm, window, beta, n, z, &wsum);
    if (st == CXL_OK && !(wsum > 0.0)) st = CXL_ERANGE;
    if (st == CXL_OK && (r->lowpass ? gsl_fft_halfcomplex_radix2_backward(z, 1, m)
                                    : gsl_fft_complex_radix2_backward(z, 1, m)) != GSL_SUCCESS)
        st = CXL_ENOCONV;
    if (st == CXL_OK)
        st = to_profile(z, m, r->lowpass, wsum, loss_db_per_m, r->dd, h, h + m, h + 2 * m);
    free(z);
    if (st != CXL_OK) {
        free(h);
        return st;
    }
    r->refl = h;
    r->signed_refl = h + m;
    r->step = h + 2 * m;
    return find_peaks(r, r->refl, r->signed_refl, m, r->dd, window, beta);
}

cxl_status cxl_fault_new(const cxl_sweep *sweep, double reference_ohm, double vf,
                         const cxl_loss_model *model, cxl_fault_window window,
                         double kaiser_beta, double loss_db_per_m, unsigned flags,
                         cxl_fault **fault)
{
    if (bad_args(sweep, reference_ohm, vf, model, window, kaiser_beta, loss_db_per_m, flags,
                 fault))
        return CXL_EINVAL;
    double start, stop, df;
    size_t n;
    cxl_status st = sweep_grid(sweep, &start, &stop, &n, &df);
    if (st == CXL_OK)
        st = line_at_centre(model, 0.5 * (start + stop), flags, &vf, &loss_db_per_m);
    cxl_fault plan;
    size_t k0r, nk;
    if (st == CXL_OK) st = plan_grid(start, stop, n, df, vf, flags, &k0r, &nk, &plan);
    if (st != CXL_OK) return st;
    cxl_fault *r = malloc(sizeof *r);
    if (!r) return CXL_ENOMEM;
    *r = plan;
    st = transform(sweep, reference_ohm, window, kaiser_beta, loss_db_per_m, n, k0r, nk, r);
    if (st != CXL_OK) {
        cxl_fault_free(r);
        return st;
    }
    *fault = r;
    return CXL_OK;
}

cxl_status cxl_fault_info(const cxl_fault *fault, int *lowpass, double *vf,
                          double *resolution_m, double *range_m, double *step_hz)
{
    if (!fault) return CXL_EINVAL;
    if (lowpass) *lowpass = fault->lowpass;
    if (vf) *vf = fault->vf;
    if (resolution_m) *resolution_m = fault->resolution_m;
    if (range_m) *range_m = fault->range_m;
    if (step_hz) *step_hz = fault->step_hz;
    return CXL_OK;
}

size_t cxl_fault_count(const cxl_fault *fault)
{
    return fault ? fault->m : 0;
}

cxl_status cxl_fault_point(const cxl_fault *fault, size_t index, double *distance_m,
                           double *reflection, double *signed_reflection, double *step)
{
    if (!fault) return CXL_EINVAL;
    if (index >= fault->m) return CXL_ERANGE;
    if (distance_m) *distance_m = fault->dd * (double)index;
    if (reflection) *reflection = fault->refl[index];
    if (signed_reflection) *signed_reflection = fault->signed_refl[index];
    if (step) *step = fault->step[index];
    return CXL_OK;
}

size_t cxl_fault_peak_count(const cxl_fault *fault)
{
    return fault ? fault->npeaks : 0;
}

cxl_status cxl_fault_peak(const cxl_fault *fault, size_t index, double *distance_m,
                          double *reflection, double *return_loss_db, int *change)
{
    if (!fault) return CXL_EINVAL;
    if (index >= fault->npeaks) return CXL_ERANGE;
    const peak *p = &fault->peaks[index];
    double rl = -20.0 * log10(p->refl);
    if (!isfinite(rl)) return CXL_ERANGE;
    if (distance_m) *distance_m = p->d;
    if (reflection) *reflection = p->refl;
    if (return_loss_db) *return_loss_db = rl;
    if (change) *change = fault->lowpass ? (p->signed_refl > 0.0 ? 1 : -1) : 0;
    return CXL_OK;
}
