/* yield.c - Monte-Carlo yield of as-built arrays: how many arrays built
 * within given tolerances of line length, velocity factor, amplitude and
 * phase meet a front-to-back or rear-null goal.  The model and the
 * definitions are stated in coaxline.h.
 *
 * Speed: the trials only change the element weights, so the signal of
 * every element for the two directions front-to-back needs (azimuth 0 and
 * 180) is worked out once per call; a trial then costs 4 N + 1 uniform
 * numbers, N exponentials and N sine-cosine pairs, and no allocation.
 * The rear null of a trial goes through array.c's own search
 * (cxl__array_eval_rear_null) on a per-worker copy of the prepared array.
 *
 * Reproducibility: blocks of CXL_YIELD_BLOCK trials, each with its own
 * gsl_rng_mt19937 seeded from the seed and the block index, handed to the
 * threads of a pool (pool.c) in any order; the results are integer counts
 * (passes, histogram bins) whose sum does not depend on that order. */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_rng.h>
#include "coaxline.h"
#include "internal.h"

#define DEG (M_PI / 180.0)
#define LN10_OVER_20 0.11512925464970228420   /* ln(10) / 20 */
/* Histogram bins over [-CXL_DB_LIMIT, +CXL_DB_LIMIT], centres at
 * (i - HALF_BINS) / BINS_PER_DB dB: whole hundredths, so that a quantile
 * is the nearest double to its printed value. */
#define BINS_PER_DB ((long)(1.0 / CXL_YIELD_BIN_DB + 0.5))
#define HALF_BINS ((long)(CXL_DB_LIMIT + 0.5) * BINS_PER_DB)
#define NBINS ((size_t)(2 * HALF_BINS + 1))

struct cxl_yield {
    double length_tol_m, vf_tol, imbalance_tol_db, phase_tol_deg;
    int goal_null;
    double goal_db;
    size_t trials;
    unsigned long seed;
    unsigned threads;
};

cxl_status cxl_yield_new(cxl_yield **yield)
{
    if (!yield)
        return CXL_EINVAL;
    cxl_yield *y = calloc(1, sizeof *y);
    if (!y)
        return CXL_ENOMEM;
    y->goal_db = 20.0;
    y->trials = CXL_YIELD_DEFAULT_TRIALS;
    y->seed = CXL_YIELD_DEFAULT_SEED;
    y->threads = 1;
    *yield = y;
    return CXL_OK;
}

void cxl_yield_free(cxl_yield *yield)
{
    free(yield);
}

cxl_status cxl_yield_set_tolerances(cxl_yield *yield, double length_tol_m,
                                    double vf_tol, double imbalance_tol_db,
                                    double phase_tol_deg)
{
    if (!yield || !cxl__finite_nonneg(length_tol_m) ||
        !cxl__finite_nonneg(vf_tol) || !(vf_tol < 1.0) ||
        !cxl__finite_nonneg(imbalance_tol_db) || imbalance_tol_db > 200.0 ||
        !cxl__finite_nonneg(phase_tol_deg) || phase_tol_deg > 180.0)
        return CXL_EINVAL;
    yield->length_tol_m = length_tol_m;
    yield->vf_tol = vf_tol;
    yield->imbalance_tol_db = imbalance_tol_db;
    yield->phase_tol_deg = phase_tol_deg;
    return CXL_OK;
}

cxl_status cxl_yield_set_goal_front_to_back(cxl_yield *yield, double goal_db)
{
    if (!yield || !isfinite(goal_db) || !(fabs(goal_db) < CXL_DB_LIMIT))
        return CXL_EINVAL;
    yield->goal_null = 0;
    yield->goal_db = goal_db;
    return CXL_OK;
}

cxl_status cxl_yield_set_goal_null(cxl_yield *yield, double depth_db)
{
    if (!yield || !isfinite(depth_db) || !(depth_db < 0.0) ||
        depth_db < -CXL_DB_LIMIT)
        return CXL_EINVAL;
    yield->goal_null = 1;
    yield->goal_db = depth_db;
    return CXL_OK;
}

cxl_status cxl_yield_set_run(cxl_yield *yield, size_t trials,
                             unsigned long seed, unsigned threads)
{
    if (!yield || trials < 1 || trials > CXL_YIELD_MAX_TRIALS ||
        threads > CXL_YIELD_MAX_THREADS)
        return CXL_EINVAL;
    yield->trials = trials;
    yield->seed = seed;
    yield->threads = threads;
    return CXL_OK;
}

/* ---- the run ------------------------------------------------------------ */

typedef struct {
    gsl_rng *rng;
    cxl__array_eval *eval;   /* for the null: weights replaced per trial */
    uint32_t *hist_fb, *hist_null;
    size_t pass;
    cxl_status st;
} yield_worker;

typedef struct {
    const cxl_yield *y;
    size_t n;
    const cxl__array_feed *feed;
    /* element signals for a unit weight, front (azimuth 0) and back */
    const double *fr, *fi, *br, *bi;
    double omega, el_rad, phase_tol_rad;
    int want_null;
    uint32_t base_seed;
    yield_worker *w;
} yield_run;

/* A fixed 64-bit mix (the finaliser of the splitmix64 generator): nearby
 * seeds give unrelated block seeds. */
static uint32_t mix_seed(unsigned long seed)
{
    uint64_t z = (uint64_t)seed + UINT64_C(0x9E3779B97F4A7C15);
    z = (z ^ (z >> 30)) * UINT64_C(0xBF58476D1CE4E5B9);
    z = (z ^ (z >> 27)) * UINT64_C(0x94D049BB133111EB);
    z ^= z >> 31;
    return (uint32_t)z;
}

static size_t bin_of(double db)
{
    double x = floor(db * (double)BINS_PER_DB + 0.5) + (double)HALF_BINS;
    if (!(x > 0.0))
        return 0;
    if (x >= (double)(NBINS - 1))
        return NBINS - 1;
    return (size_t)x;
}

/* A uniform number in [-tol, tol). */
static double draw(gsl_rng *r, double tol)
{
    return tol * (2.0 * gsl_rng_uniform(r) - 1.0);
}

/* One element's weight in one trial: its three errors drawn in order
 * (length, amplitude, phase) after the trial's VF error dv. */
static void trial_weight(const yield_run *c, size_t i, double dv, gsl_rng *rng,
                         double *wr, double *wi)
{
    const cxl_yield *y = c->y;
    double d_len = draw(rng, y->length_tol_m);
    double d_db = draw(rng, y->imbalance_tol_db);
    double d_ph = draw(rng, c->phase_tol_rad);
    const cxl__array_feed *fd = &c->feed[i];
    double amp = fd->amp, ph = fd->phase_rad;
    if (fd->line_m > 0.0) {
        /* the same arithmetic as array.c for a zero error */
        double len = fd->line_m + d_len;
        double line_ph;
        if (fd->beta_rad_per_m > 0.0) {
            amp *= exp(-fd->alpha_np_per_m * len);
            line_ph = dv == 0.0 ? fd->beta_rad_per_m * len
                                : c->omega * len /
                                      ((fd->line_vf + dv) * CXL_C_M_PER_S);
        } else {
            line_ph = c->omega * len / ((fd->line_vf + dv) * CXL_C_M_PER_S);
        }
        ph -= fmod(line_ph, 2.0 * M_PI);
    }
    ph += d_ph;
    amp *= exp(d_db * LN10_OVER_20);
    *wr = amp * cos(ph);
    *wi = amp * sin(ph);
}

/* One trial's front-to-back (dB); the weights also go to w->eval when
 * the null is wanted. */
static double trial_fb(const yield_run *c, yield_worker *w)
{
    double dv = draw(w->rng, c->y->vf_tol);
    double f_re = 0.0, f_im = 0.0, b_re = 0.0, b_im = 0.0;
    for (size_t i = 0; i < c->n; i++) {
        double wr, wi;
        trial_weight(c, i, dv, w->rng, &wr, &wi);
        f_re += wr * c->fr[i] - wi * c->fi[i];
        f_im += wr * c->fi[i] + wi * c->fr[i];
        b_re += wr * c->br[i] - wi * c->bi[i];
        b_im += wr * c->bi[i] + wi * c->br[i];
        if (c->want_null)
            cxl__array_eval_set_weight(w->eval, i, wr, wi);
    }
    double front = f_re * f_re + f_im * f_im;
    double back = b_re * b_re + b_im * b_im;
    return back > 0.0 ? cxl__power_db(front / back)
                      : front > 0.0 ? CXL_DB_LIMIT : -CXL_DB_LIMIT;
}

static void run_block(void *ctx, unsigned worker, size_t block)
{
    const yield_run *c = ctx;
    yield_worker *w = &c->w[worker];
    if (w->st)
        return;
    const cxl_yield *y = c->y;
    size_t t0 = block * CXL_YIELD_BLOCK;
    size_t t1 = t0 + CXL_YIELD_BLOCK < y->trials ? t0 + CXL_YIELD_BLOCK : y->trials;
    gsl_rng_set(w->rng, (unsigned long)(uint32_t)(c->base_seed + (uint32_t)block));
    size_t pass = 0;   /* counted here: workers' structs share cache lines */
    for (size_t t = t0; t < t1; t++) {
        double fb = trial_fb(c, w);
        w->hist_fb[bin_of(fb)]++;
        if (!y->goal_null)
            pass += fb >= y->goal_db;
        if (c->want_null) {
            double depth;
            cxl_status st = cxl__array_eval_rear_null(w->eval, c->el_rad, &depth);
            if (st == CXL_ERANGE)
                depth = CXL_DB_LIMIT;   /* no forward response */
            else if (st) {
                w->st = st;
                return;
            }
            w->hist_null[bin_of(depth)]++;
            if (y->goal_null)
                pass += depth <= y->goal_db;
        }
    }
    w->pass += pass;
}

/* The value of the k-th worst trial: from the bottom of the histogram
 * (worst_low) or from the top. */
static double quantile(const uint64_t *hist, size_t k, int worst_low)
{
    uint64_t seen = 0;
    for (size_t j = 0; j < NBINS; j++) {
        size_t b = worst_low ? j : NBINS - 1 - j;
        seen += hist[b];
        if (seen >= k)
            return (double)((long)b - HALF_BINS) / (double)BINS_PER_DB;
    }
    return worst_low ? CXL_DB_LIMIT : -CXL_DB_LIMIT;
}

static void free_workers(yield_worker *w, size_t n)
{
    if (!w)
        return;
    for (size_t i = 0; i < n; i++) {
        gsl_rng_free(w[i].rng);
        free(w[i].eval);
        free(w[i].hist_fb);
        free(w[i].hist_null);
    }
    free(w);
}

/* Check the nominal array and the tolerances against its lines; fill the
 * feeds and the two directions' signals. */
static cxl_status setup(const cxl_yield *y, const cxl_array *array,
                        double freq_hz, double elevation_deg, int want_null,
                        cxl__array_feed *feed, double *sig)
{
    size_t n = cxl_array_count(array);
    double fb, az, depth;
    cxl_status st = cxl_array_eval_front_to_back(array, freq_hz, elevation_deg, &fb);
    if (!st && want_null)
        st = cxl_array_eval_rear_null(array, freq_hz, elevation_deg, &az, &depth);
    if (!st)
        st = cxl__array_feeds(array, freq_hz, feed);
    if (st)
        return st;
    for (size_t i = 0; i < n; i++) {
        if (!(feed[i].line_m > 0.0))
            continue;
        if (feed[i].line_m - y->length_tol_m < 0.0 ||
            !(feed[i].line_vf - y->vf_tol > 0.0) || feed[i].line_vf + y->vf_tol > 1.0)
            return CXL_ERANGE;
    }
    cxl__array_eval *e;
    st = cxl__array_eval_new(array, freq_hz, &e);
    if (st)
        return st;
    cxl__array_eval_steer(e, 0.0, elevation_deg * DEG, sig, sig + n);
    cxl__array_eval_steer(e, M_PI, elevation_deg * DEG, sig + 2 * n, sig + 3 * n);
    free(e);
    return CXL_OK;
}

/* nw workers, each with its generator, histograms and (for the null) its
 * own evaluation of the array. */
static cxl_status workers_new(const cxl_array *array, double freq_hz,
                              int want_null, size_t nw, yield_worker **out)
{
    yield_worker *w = calloc(nw, sizeof *w);
    if (!w)
        return CXL_ENOMEM;
    cxl_status st = CXL_OK;
    for (size_t i = 0; !st && i < nw; i++) {
        w[i].rng = gsl_rng_alloc(gsl_rng_mt19937);
        w[i].hist_fb = calloc(NBINS, sizeof *w[i].hist_fb);
        if (want_null) {
            w[i].hist_null = calloc(NBINS, sizeof *w[i].hist_null);
            if (w[i].hist_null)
                st = cxl__array_eval_new(array, freq_hz, &w[i].eval);
        }
        if (!w[i].rng || !w[i].hist_fb || (want_null && !w[i].hist_null))
            st = CXL_ENOMEM;
    }
    *out = w;
    return st;
}

static void run_all(yield_run *run, size_t nw, size_t nblocks)
{
    cxl__pool *pool = NULL;
    if (nw > 1 && cxl__pool_new((unsigned)nw, &pool) == CXL_OK) {
        cxl__pool_run(pool, nblocks, run_block, run);
        cxl__pool_free(pool);
    } else {
        for (size_t b = 0; b < nblocks; b++)
            run_block(run, 0, b);
    }
}

typedef struct {
    double *frac, *se, *fb_median, *fb_p5, *null_median, *null_p5;
} yield_out;

/* reduce: integer sums, the same in any order */
static cxl_status reduce(const cxl_yield *yield, const yield_worker *w,
                         size_t nw, int want_null, const yield_out *o)
{
    size_t pass = 0;
    for (size_t i = 0; i < nw; i++) {
        if (w[i].st)
            return w[i].st;
        pass += w[i].pass;
    }
    uint64_t *hist = calloc(2 * NBINS, sizeof *hist);
    if (!hist)
        return CXL_ENOMEM;
    for (size_t i = 0; i < nw; i++)
        for (size_t b = 0; b < NBINS; b++) {
            hist[b] += w[i].hist_fb[b];
            if (want_null)
                hist[NBINS + b] += w[i].hist_null[b];
        }
    size_t trials = yield->trials;
    size_t k_median = (trials + 1) / 2, k_p5 = (trials + 19) / 20;
    double p = (double)pass / (double)trials;
    *o->frac = p;
    *o->se = sqrt(p * (1.0 - p) / (double)trials);
    *o->fb_median = quantile(hist, k_median, 1);
    *o->fb_p5 = quantile(hist, k_p5, 1);
    if (o->null_median)
        *o->null_median = quantile(hist + NBINS, k_median, 0);
    if (o->null_p5)
        *o->null_p5 = quantile(hist + NBINS, k_p5, 0);
    free(hist);
    return CXL_OK;
}

static int valid_args(const cxl_yield *yield, const cxl_array *array,
                      double freq_hz, double elevation_deg, const yield_out *o)
{
    return yield && array && o->frac && o->se && o->fb_median && o->fb_p5 &&
           cxl__finite_pos(freq_hz) && isfinite(elevation_deg) &&
           fabs(elevation_deg) <= 90.0 && cxl_array_count(array) != 0;
}

cxl_status cxl_yield_eval(const cxl_yield *yield, const cxl_array *array,
                          double freq_hz, double elevation_deg,
                          double *yield_frac, double *yield_se,
                          double *front_to_back_median_db,
                          double *front_to_back_p5_db,
                          double *null_median_db, double *null_p5_db)
{
    yield_out out = { yield_frac, yield_se, front_to_back_median_db,
                      front_to_back_p5_db, null_median_db, null_p5_db };
    if (!valid_args(yield, array, freq_hz, elevation_deg, &out))
        return CXL_EINVAL;
    size_t n = cxl_array_count(array);
    int want_null = yield->goal_null || null_median_db || null_p5_db;
    cxl__array_feed *feed = malloc(n * sizeof *feed);
    double *sig = malloc(4 * n * sizeof *sig);
    if (!feed || !sig) {
        free(feed);
        free(sig);
        return CXL_ENOMEM;
    }
    cxl_status st = setup(yield, array, freq_hz, elevation_deg, want_null, feed, sig);
    size_t nblocks = (yield->trials + CXL_YIELD_BLOCK - 1) / CXL_YIELD_BLOCK;
    size_t nw = yield->threads ? yield->threads : cxl__pool_cores();
    if (nw > nblocks)
        nw = nblocks;
    yield_worker *w = NULL;
    if (!st)
        st = workers_new(array, freq_hz, want_null, nw, &w);
    yield_run run = { yield, n, feed, sig, sig + n, sig + 2 * n, sig + 3 * n,
                      2.0 * M_PI * freq_hz, elevation_deg * DEG,
                      yield->phase_tol_deg * DEG, want_null,
                      mix_seed(yield->seed), w };
    if (!st)
        run_all(&run, nw, nblocks);
    if (!st)
        st = reduce(yield, w, nw, want_null, &out);
    free_workers(w, w ? nw : 0);
    free(feed);
    free(sig);
    return st;
}
