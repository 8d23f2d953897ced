/* trim.c - cut long, measure the resonances, trim to the target.
 *
 * The piece (physical length L, far end open or shorted) is read on an
 * analyzer through a fixture.  Its readings give the electrical length of
 * the piece alone at each resonance, E_i = k_i c / f_i - fixture (stub.c),
 * and so the velocity factor there, VF_i = L / E_i.  The target is an
 * electrical length E_t (free-space metres) at a frequency F_t; the piece
 * that has it is L_t = E_t VF(F_t) long, with VF(F_t) from the drift fit
 * over several resonances (drift.c) or from the one reading.  Cut L - L_t.
 *
 * An error in the tape-measured L hardly matters: with VF = L / E the cut
 * is L (1 - E_t / E), a fixed fraction of the piece, so a tape error dL
 * leaves the remaining piece off by only dL (1 - E_t / E), the error of
 * the part cut off.
 *
 * Resolution: a frequency step df at the order-k resonance moves E by
 * k c df / f^2, i.e. the piece by VF k c df / f^2 = L_tot df / f; higher
 * orders resolve finer.  The length to keep inherits the VF's error at the
 * target: VF df / f from one reading, or the drift fit's standard error
 * with each reading weighted by its own VF df / f (so a target far from
 * the readings, extrapolated, resolves worse).  The fixture's own
 * uncertainty adds in quadrature.
 */
#include <config.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

enum target_kind { TARGET_NONE = 0, TARGET_DEGREES, TARGET_DELAY, TARGET_RESONANCE };

typedef struct trim_reading {
    double freq_hz;
    int order;
} trim_reading;

struct cxl_trim {
    cxl_stub_end end;
    double length_m;
    double fixture_m, fixture_vf, fixture_tol_m; /* fixture_vf 0: the piece's cable */
    double freq_res_hz;
    trim_reading *r;
    size_t n, cap;
    enum target_kind target_kind;
    double target_value, target_freq_hz;  /* degrees or seconds; Hz (0: none) */
    cxl_stub_end ref_end;
    int ref_order;
    const cxl_loss_model *model; /* optional: the lossy-resonance offset */
    cxl_dip_kind kind;           /* what the analyzer's dip is */
    double ref_ohm;              /* its reference for CXL_DIP_MIN_SWR */
    double allowance_m, allowance_vf; /* in the target, not in the piece */
};

struct cxl_trim_result {
    size_t n;
    double *freq_hz, *vf, *expected_hz, *resolution_m;
    int *order;
    double vf_fit, vf_target, target_freq_hz;
    double cut_m, remaining_m, resolution_m_all;
    cxl_trim_action action;
    unsigned flags;
    /* kept across cxl_trim_solve_into calls: room for cap readings, the
     * stub and its fit, the readings sorted and as shown, the trend and
     * the workspace its fit runs in */
    size_t cap;
    cxl_stub *stub;
    cxl_stub_result *fit;
    trim_reading *rd;
    struct cxl_drift drift;
    cxl__fitws ws;
};

cxl_status cxl_trim_new(cxl_stub_end end, double length_m, cxl_trim **trim)
{
    if (!trim || (end != CXL_STUB_OPEN && end != CXL_STUB_SHORT) ||
        !cxl__finite_pos(length_m))
        return CXL_EINVAL;
    cxl_trim *t = calloc(1, sizeof *t);
    if (!t) return CXL_ENOMEM;
    cxl_trim_reset(t, end, length_m); /* the defaults, in one place */
    *trim = t;
    return CXL_OK;
}

cxl_status cxl_trim_reset(cxl_trim *trim, cxl_stub_end end, double length_m)
{
    if (!trim || (end != CXL_STUB_OPEN && end != CXL_STUB_SHORT) ||
        !cxl__finite_pos(length_m))
        return CXL_EINVAL;
    trim_reading *r = trim->r;
    size_t cap = trim->cap;
    memset(trim, 0, sizeof *trim);
    trim->r = r;
    trim->cap = cap;
    trim->end = end;
    trim->length_m = length_m;
    trim->kind = CXL_DIP_ZERO_X;
    trim->ref_ohm = 50.0;
    return CXL_OK;
}

void cxl_trim_free(cxl_trim *trim)
{
    if (!trim) return;
    free(trim->r);
    free(trim);
}

cxl_status cxl_trim_set_fixture(cxl_trim *trim, double fixture_m, double fixture_vf,
                                double fixture_tol_m)
{
    if (!trim || !cxl__finite_nonneg(fixture_m) || !cxl__finite_nonneg(fixture_tol_m) ||
        !(fixture_vf == 0.0 || cxl__valid_vf(fixture_vf)))
        return CXL_EINVAL;
    trim->fixture_m = fixture_m;
    trim->fixture_vf = fixture_vf;
    trim->fixture_tol_m = fixture_tol_m;
    return CXL_OK;
}

cxl_status cxl_trim_set_model(cxl_trim *trim, const cxl_loss_model *model)
{
    if (!trim) return CXL_EINVAL;
    trim->model = model;
    return CXL_OK;
}

cxl_status cxl_trim_set_reading(cxl_trim *trim, cxl_dip_kind kind, double ref_ohm)
{
    if (!trim || (kind != CXL_DIP_ZERO_X && kind != CXL_DIP_MIN_Z && kind != CXL_DIP_MIN_SWR) ||
        !cxl__finite_pos(ref_ohm))
        return CXL_EINVAL;
    trim->kind = kind;
    trim->ref_ohm = ref_ohm;
    return CXL_OK;
}

cxl_status cxl_trim_set_allowance(cxl_trim *trim, double allowance_m, double allowance_vf)
{
    if (!trim || !cxl__finite_nonneg(allowance_m) ||
        !(allowance_vf == 0.0 || cxl__valid_vf(allowance_vf)))
        return CXL_EINVAL;
    trim->allowance_m = allowance_m;
    trim->allowance_vf = allowance_vf;
    return CXL_OK;
}

cxl_status cxl_trim_set_resolution(cxl_trim *trim, double freq_res_hz)
{
    if (!trim || !cxl__finite_nonneg(freq_res_hz)) return CXL_EINVAL;
    trim->freq_res_hz = freq_res_hz;
    return CXL_OK;
}

cxl_status cxl_trim_add_reading(cxl_trim *trim, double freq_hz, int order)
{
    if (!trim || !cxl__finite_pos(freq_hz) || order < 0) return CXL_EINVAL;
    if (order > CXL_STUB_MAX_ORDER) return CXL_ERANGE;
    if (trim->n > 0 && (trim->r[0].order == 0) != (order == 0)) return CXL_EINVAL;
    for (size_t i = 0; i < trim->n; i++)
        if (trim->r[i].freq_hz == freq_hz || (order != 0 && trim->r[i].order == order))
            return CXL_EINVAL; /* the same resonance twice */
    if (trim->n == trim->cap) {
        size_t cap = trim->cap ? 2 * trim->cap : 8;
        trim_reading *q = realloc(trim->r, cap * sizeof *q);
        if (!q) return CXL_ENOMEM;
        trim->r = q;
        trim->cap = cap;
    }
    trim->r[trim->n++] = (trim_reading){ freq_hz, order };
    return CXL_OK;
}

size_t cxl_trim_count(const cxl_trim *trim)
{
    return trim ? trim->n : 0;
}

static cxl_status set_target(cxl_trim *trim, enum target_kind kind, double value,
                             double freq_hz, int freq_required)
{
    if (!trim || !cxl__finite_pos(value) || !cxl__finite_nonneg(freq_hz) ||
        (freq_required && freq_hz == 0.0))
        return CXL_EINVAL;
    trim->target_kind = kind;
    trim->target_value = value;
    trim->target_freq_hz = freq_hz;
    return CXL_OK;
}

cxl_status cxl_trim_target_degrees(cxl_trim *trim, double phase_deg, double freq_hz)
{
    return set_target(trim, TARGET_DEGREES, phase_deg, freq_hz, 1);
}

cxl_status cxl_trim_target_delay(cxl_trim *trim, double delay_s, double freq_hz)
{
    return set_target(trim, TARGET_DELAY, delay_s, freq_hz, 0);
}

cxl_status cxl_trim_target_resonance(cxl_trim *trim, cxl_stub_end end, int order,
                                     double freq_hz)
{
    double k;
    if (!trim || !cxl__finite_pos(freq_hz)) return CXL_EINVAL;
    cxl_status st = cxl_stub_wavelengths(end, order, &k);
    if (st != CXL_OK) return st;
    trim->target_kind = TARGET_RESONANCE;
    trim->ref_end = end;
    trim->ref_order = order;
    trim->target_freq_hz = freq_hz;
    return CXL_OK;
}

/* ---- solving ------------------------------------------------------------ */

static int cmp_reading(const void *a, const void *b)
{
    const trim_reading *x = a, *y = b;
    return (x->freq_hz > y->freq_hz) - (x->freq_hz < y->freq_hz);
}

/* Room for n readings in r; grows only. */
static cxl_status result_reserve(cxl_trim_result *r, size_t n)
{
    if (!r->stub && cxl_stub_new(CXL_STUB_OPEN, &r->stub) != CXL_OK) return CXL_ENOMEM;
    if (!r->fit && cxl_stub_result_new(&r->fit) != CXL_OK) return CXL_ENOMEM;
    if (n <= r->cap) return CXL_OK;
    double *d = realloc(r->freq_hz, 4 * n * sizeof *d);
    if (d) r->freq_hz = d;
    int *o = realloc(r->order, n * sizeof *o);
    if (o) r->order = o;
    trim_reading *rd = realloc(r->rd, 2 * n * sizeof *rd);
    if (rd) r->rd = rd;
    if (!d || !o || !rd) return CXL_ENOMEM;
    r->cap = n;
    r->vf = d + n;
    r->expected_hz = d + 2 * n;
    r->resolution_m = d + 3 * n;
    return CXL_OK;
}

cxl_status cxl_trim_result_new(cxl_trim_result **result)
{
    if (!result) return CXL_EINVAL;
    cxl_trim_result *r = calloc(1, sizeof *r);
    if (!r) return CXL_ENOMEM;
    *result = r;
    return CXL_OK;
}

void cxl_trim_result_free(cxl_trim_result *result)
{
    if (!result) return;
    free(result->freq_hz);
    free(result->order);
    free(result->rd);
    cxl_stub_free(result->stub);
    cxl_stub_result_free(result->fit);
    cxl__fitws_free(&result->ws);
    free(result);
}

/* Free-space length of the fixture at a VF of the piece's cable. */
static double fixture_free(const cxl_trim *t, double piece_vf)
{
    if (t->fixture_m == 0.0) return 0.0;
    return t->fixture_m / (t->fixture_vf > 0.0 ? t->fixture_vf : piece_vf);
}

/* VF of the piece at f: the drift trend where there is one, else vf0. */
static double vf_at(const cxl_drift *drift, double f, double vf0)
{
    double v;
    if (drift && cxl_drift_vf(drift, f, &v, NULL) == CXL_OK) return v;
    return vf0;
}

/* Readings sorted by frequency into a stub fit; the fixture is removed
 * there, or (same cable as the piece) counted as part of the line. */
static cxl_status fit_readings(const cxl_trim *t, const trim_reading *rd, cxl_stub *s,
                               cxl_stub_result *res)
{
    cxl_status st = cxl_stub_reset(s, t->end);
    if (st != CXL_OK) return st;
    double line_m = t->length_m;
    if (t->fixture_vf > 0.0) st = cxl_stub_set_fixture(s, t->fixture_m, t->fixture_vf);
    else line_m += t->fixture_m;
    if (st == CXL_OK) st = cxl_stub_set_tolerances(s, 0.0, t->freq_res_hz);
    if (st == CXL_OK && rd[0].order == 0) st = cxl_stub_set_orders(s, CXL_STUB_ORDERS_BEST_FIT);
    for (size_t i = 0; i < t->n && st == CXL_OK; i++)
        st = cxl_stub_add_reading(s, line_m, rd[i].freq_hz, rd[i].order);
    if (st == CXL_OK) st = cxl_stub_fit_into(s, res);
    return st;
}

static double target_whole_m(const cxl_trim *t, const cxl_drift *drift, double vf0);

/* Target electrical length of the piece alone, free-space metres: the
 * target less what the allowance (connectors counted in it) already
 * gives, at its own VF or the piece's VF at the target, vf_t. */
static double target_free_m(const cxl_trim *t, const cxl_drift *drift, double vf0,
                            double vf_t)
{
    double allow = t->allowance_m > 0.0
                       ? t->allowance_m / (t->allowance_vf > 0.0 ? t->allowance_vf : vf_t)
                       : 0.0;
    return target_whole_m(t, drift, vf0) - allow;
}

/* Target electrical length with the allowance, free-space metres. */
static double target_whole_m(const cxl_trim *t, const cxl_drift *drift, double vf0)
{
    double k = 0.0;
    switch (t->target_kind) {
    case TARGET_DEGREES:
        return t->target_value / 360.0 * CXL_C_M_PER_S / t->target_freq_hz;
    case TARGET_DELAY:
        return t->target_value * CXL_C_M_PER_S;
    case TARGET_RESONANCE:
        /* a reference piece read through the same fixture */
        cxl_stub_wavelengths(t->ref_end, t->ref_order, &k);
        return k * CXL_C_M_PER_S / t->target_freq_hz -
               fixture_free(t, vf_at(drift, t->target_freq_hz, vf0));
    default:
        return NAN;
    }
}

/* Length of line the model sees: the piece, and a fixture of its cable. */
static double model_line_m(const cxl_trim *t, double piece_m)
{
    return piece_m + (t->fixture_vf > 0.0 ? 0.0 : t->fixture_m);
}

/* The dip (of the kind set) over the exact k-wavelength frequency of the
 * modelled line at an order: what a lossy line's resonance reads off by. */
static cxl_status model_offset(const cxl_trim *t, int order, double piece_m, double *ratio)
{
    double wave, react;
    cxl_status st = cxl__transfer_stub_points(t->model, CXL_LOSS_EXTRAPOLATE, t->end, order,
                                              model_line_m(t, piece_m), t->kind, t->ref_ohm,
                                              &wave, &react);
    if (st == CXL_OK) *ratio = react / wave;
    return st;
}

/* Where the remaining piece of remaining_m will read at order n. */
static cxl_status expected_freq(const cxl_trim *t, const cxl_drift *drift, int order,
                                double remaining_m, double f0, double vf0, double *freq_hz)
{
    double f = f0, k, ratio = 1.0;
    cxl_stub_wavelengths(t->end, order, &k);
    for (int i = 0; i < 8; i++) { /* VF(f) changes slowly: a few fixed-point steps */
        double vf = vf_at(drift, f, vf0);
        f = k * CXL_C_M_PER_S / (remaining_m / vf + fixture_free(t, vf));
    }
    if (t->model) {
        cxl_status st = model_offset(t, order, remaining_m, &ratio);
        if (st != CXL_OK) return st;
    }
    f *= ratio;
    if (!(f > 0.0) || !isfinite(f)) return CXL_ERANGE;
    *freq_hz = f;
    return CXL_OK;
}

/* With a model: read each resonance as the frequency at which the line is
 * exactly k wavelengths (orders from the first fit), and fit again. */
static cxl_status correct_readings(const cxl_trim *t, trim_reading *rd, cxl_stub *stub,
                                   cxl_stub_result *fit)
{
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < t->n && st == CXL_OK; i++) {
        double ratio;
        st = cxl_stub_result_reading(fit, i, NULL, NULL, &rd[i].order, NULL, NULL, NULL);
        if (st == CXL_OK) st = model_offset(t, rd[i].order, t->length_m, &ratio);
        if (st == CXL_OK) rd[i].freq_hz /= ratio;
    }
    return st == CXL_OK ? fit_readings(t, rd, stub, fit) : st;
}

/* After the fit: the trend over two or more readings (*drift), and the
 * readings' orders, VFs and frequencies as shown. */
static cxl_status trend_step(const cxl_trim *trim, cxl_trim_result *r,
                             const trim_reading *shown, const cxl_drift **drift)
{
    cxl_status st = CXL_OK;
    if (trim->n >= 2) {
        st = cxl__drift_fill_stub(r->fit, trim->freq_res_hz, &r->ws, &r->drift);
        *drift = &r->drift;
    }
    for (size_t i = 0; i < trim->n && st == CXL_OK; i++)
        st = cxl_stub_result_reading(r->fit, i, NULL, &r->freq_hz[i], &r->order[i], &r->vf[i],
                                     NULL, NULL);
    /* report what the analyzer showed (sorted), not a corrected value */
    for (size_t i = 0; i < trim->n && st == CXL_OK; i++) r->freq_hz[i] = shown[i].freq_hz;
    return st;
}

/* Readings sorted by frequency into r->rd (and as shown, r->rd + n), the
 * fit (corrected with the model when there is one), its flags, per-reading
 * values and the trend over two or more readings (*drift, else NULL). */
static cxl_status fit_step(const cxl_trim *trim, cxl_trim_result *r, double *vf_fit,
                           const cxl_drift **drift)
{
    const size_t n = trim->n;
    trim_reading *rd = r->rd, *shown = rd + n;
    cxl_status st = CXL_OK;
    memcpy(rd, trim->r, n * sizeof *rd);
    qsort(rd, n, sizeof *rd, cmp_reading);
    memcpy(shown, rd, n * sizeof *rd);
    /* given orders must rise with frequency */
    for (size_t i = 1; i < n && st == CXL_OK; i++)
        if (rd[0].order != 0 && rd[i].order <= rd[i - 1].order) st = CXL_EINCONSISTENT;
    if (st == CXL_OK) st = fit_readings(trim, rd, r->stub, r->fit);
    if (st == CXL_OK) st = cxl_stub_result_flags(r->fit, &r->flags);
    if (st == CXL_OK && trim->model) {
        unsigned more = 0;
        st = correct_readings(trim, rd, r->stub, r->fit);
        if (st == CXL_OK) st = cxl_stub_result_flags(r->fit, &more);
        r->flags |= more | CXL_TRIM_FLAG_MODEL;
    }
    if (st == CXL_OK) st = cxl_stub_result_vf(r->fit, vf_fit, NULL);
    *drift = NULL;
    return st == CXL_OK ? trend_step(trim, r, shown, drift) : st;
}

/* VF at the target frequency and its uncertainty: the trend over the
 * readings or the nearest reading with the drift allowance, whichever is
 * the tighter (cxl_stub_result_vf_at); without a target frequency the
 * fitted VF and how far a step of the resolution moves it. */
static cxl_status target_vf(const cxl_trim *trim, cxl_trim_result *r, double vf_fit,
                            double *vf_t, double *vf_err)
{
    double ft = trim->target_freq_hz;
    cxl_status st = CXL_OK;
    *vf_t = vf_fit;
    *vf_err = 0.0;
    if (ft > 0.0) {
        unsigned how = 0;
        /* the trend fit_step fitted (two or more readings) is the one
         * cxl_stub_result_vf_at would fit again */
        st = cxl__stub_result_vf_at_ws(r->fit, ft, vf_t, vf_err, &how, &r->ws,
                                       trim->n >= 2 ? &r->drift : NULL);
        if (st != CXL_OK) return st;
        if (how & CXL_STUB_AT_TREND) r->flags |= CXL_TRIM_FLAG_DRIFT;
        if (how & CXL_STUB_AT_EXTRAPOLATED) r->flags |= CXL_TRIM_FLAG_EXTRAPOLATED;
        if (how & CXL_STUB_AT_ALLOWANCE) r->flags |= CXL_TRIM_FLAG_ALLOWANCE;
        return CXL_OK;
    }
    if (trim->n == 1) *vf_err = *vf_t * trim->freq_res_hz / r->freq_hz[0];
    else st = cxl_stub_result_vf_budget(r->fit, NULL, NULL, vf_err);
    if (trim->freq_res_hz == 0.0) *vf_err = 0.0; /* the scatter is not a resolution */
    return st;
}

/* Resolution per order and of the length to keep, expected frequencies
 * and the action. */
static cxl_status resolution_step(const cxl_trim *trim, cxl_trim_result *r,
                                  const cxl_drift *drift, double vf_t, double vf_err)
{
    cxl_status st = CXL_OK;
    for (size_t i = 0; i < trim->n && st == CXL_OK; i++) {
        double k;
        cxl_stub_wavelengths(trim->end, r->order[i], &k);
        /* dE = k c df / f^2 free-space metres, times VF as cable */
        r->resolution_m[i] = r->vf[i] * k * CXL_C_M_PER_S * trim->freq_res_hz /
                             r->freq_hz[i] / r->freq_hz[i];
        if (!isfinite(r->resolution_m[i])) return CXL_ERANGE;
        st = expected_freq(trim, drift, r->order[i], r->remaining_m, r->freq_hz[i], r->vf[i],
                           &r->expected_hz[i]);
    }
    if (st != CXL_OK) return st;
    double fix_tol = trim->fixture_tol_m *
                     (trim->fixture_vf > 0.0 ? vf_t / trim->fixture_vf : 1.0);
    double res_vf = r->remaining_m * vf_err / vf_t;
    /* hypot: a huge fixture tolerance must not square to infinity */
    r->resolution_m_all = hypot(res_vf, fix_tol);
    if (!isfinite(r->resolution_m_all)) return CXL_ERANGE;
    if (r->cut_m > r->resolution_m_all) r->action = CXL_TRIM_CUT;
    else if (r->cut_m < -r->resolution_m_all) r->action = CXL_TRIM_SHORT;
    else r->action = CXL_TRIM_WITHIN;
    return CXL_OK;
}

cxl_status cxl_trim_solve_into(const cxl_trim *trim, cxl_trim_result *result)
{
    if (!trim || !result || trim->n == 0 || trim->target_kind == TARGET_NONE) return CXL_EINVAL;
    cxl_trim_result *r = result;
    cxl_status st = result_reserve(r, trim->n);
    r->n = 0; /* empty until solved */
    if (st != CXL_OK) return st;
    r->flags = 0;
    double vf_fit = 0.0, vf_t = 0.0, vf_err = 0.0;
    const cxl_drift *drift = NULL;
    st = fit_step(trim, r, &vf_fit, &drift);
    if (st == CXL_OK) st = target_vf(trim, r, vf_fit, &vf_t, &vf_err);
    if (st != CXL_OK) return st;
    double e_t = target_free_m(trim, drift, vf_fit, vf_t);
    if (!(e_t > 0.0) || !isfinite(e_t)) return CXL_ERANGE;
    r->vf_fit = vf_fit;
    r->vf_target = vf_t;
    r->target_freq_hz = trim->target_freq_hz;
    r->remaining_m = e_t * vf_t;
    r->cut_m = trim->length_m - r->remaining_m;
    st = resolution_step(trim, r, drift, vf_t, vf_err);
    if (st == CXL_OK) r->n = trim->n;
    return st;
}

cxl_status cxl_trim_solve(const cxl_trim *trim, cxl_trim_result **result)
{
    if (!trim || !result || trim->n == 0 || trim->target_kind == TARGET_NONE) return CXL_EINVAL;
    cxl_trim_result *r = NULL;
    cxl_status st = cxl_trim_result_new(&r);
    if (st == CXL_OK) st = cxl_trim_solve_into(trim, r);
    if (st != CXL_OK) {
        cxl_trim_result_free(r);
        return st;
    }
    *result = r;
    return CXL_OK;
}

/* ---- results ------------------------------------------------------------ */

cxl_status cxl_trim_result_cut(const cxl_trim_result *result, double *cut_off_m,
                               double *remaining_m, double *resolution_m,
                               cxl_trim_action *action)
{
    if (!result || result->n == 0) return CXL_EINVAL;
    if (cut_off_m) *cut_off_m = result->cut_m;
    if (remaining_m) *remaining_m = result->remaining_m;
    if (resolution_m) *resolution_m = result->resolution_m_all;
    if (action) *action = result->action;
    return CXL_OK;
}

cxl_status cxl_trim_result_vf(const cxl_trim_result *result, double *vf_fit,
                              double *vf_target, double *target_freq_hz)
{
    if (!result || result->n == 0) return CXL_EINVAL;
    if (vf_fit) *vf_fit = result->vf_fit;
    if (vf_target) *vf_target = result->vf_target;
    if (target_freq_hz) *target_freq_hz = result->target_freq_hz;
    return CXL_OK;
}

cxl_status cxl_trim_result_flags(const cxl_trim_result *result, unsigned *flags)
{
    if (!result || !flags || result->n == 0) return CXL_EINVAL;
    *flags = result->flags;
    return CXL_OK;
}

size_t cxl_trim_result_count(const cxl_trim_result *result)
{
    return result ? result->n : 0;
}

cxl_status cxl_trim_result_reading(const cxl_trim_result *result, size_t index,
                                   double *freq_hz, int *order, double *vf,
                                   double *expected_hz, double *resolution_m)
{
    if (!result || index >= result->n) return CXL_EINVAL;
    if (freq_hz) *freq_hz = result->freq_hz[index];
    if (order) *order = result->order[index];
    if (vf) *vf = result->vf[index];
    if (expected_hz) *expected_hz = result->expected_hz[index];
    if (resolution_m) *resolution_m = result->resolution_m[index];
    return CXL_OK;
}
