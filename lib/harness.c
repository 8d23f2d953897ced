/* harness.c - the phasing harness of an array as pieces of one cable, and
 * those pieces packed onto the drums at hand.
 *
 * Every element gets a feed run from the combiner.  Each run must reach
 * along the ground (the straight line in x, y from the element to the
 * combiner) plus the slack; all runs are cut to the same electrical
 * length, that of the longest one needed, so that the combiner sees every
 * element with the same feed delay.  An element whose layout asks for an
 * extra delay gets it as a second piece of its own (a delay line), since
 * that is what builders cut and check on the analyzer.
 *
 * The connector allowance has the meaning of cxl_line_cut_length(): line
 * (at the cable's VF) already in the connectors of each piece, whose delay
 * counts; a piece that must delay by t is cut to t VF c - allowance.  So
 * per element, sum over its pieces of (cut + allowance) / (VF c) is the
 * common feed delay plus the element's extra delay.
 *
 * Packing: each piece takes its cut length plus one kerf from a drum.
 * First-fit decreasing and best-fit decreasing are both run; the one that
 * leaves fewer pieces without a drum, then uses fewer drums, is kept
 * (first-fit on a tie).  A piece fits where it leaves no less than
 * -FIT_TOL_M on the drum (rounding of sums of lengths). */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

#define FIT_TOL_M 1e-9

typedef struct {
    double x_m, y_m, delay_s;
} harness_elem;

typedef struct {
    size_t element;
    cxl_piece_kind kind;
    double length_m;     /* cut length */
    double check_hz;     /* quarter-wave frequency of the cut piece */
    size_t drum;
} harness_piece;

struct cxl_harness {
    double vf;
    double comb_x_m, comb_y_m;
    double slack_m, allowance_m, kerf_m;
    size_t n;
    harness_elem el[CXL_HARNESS_MAX_ELEMENTS];
    size_t ndrums;
    double drum_m[CXL_HARNESS_MAX_DRUMS];
    /* the plan (planned != 0) */
    int planned;
    double feed_m, feed_delay_s;
    size_t npieces;
    harness_piece piece[2 * CXL_HARNESS_MAX_ELEMENTS];
    double used_m[CXL_HARNESS_MAX_DRUMS];
};

static int bounded(double v)
{
    return fabs(v) <= CXL_HARNESS_MAX_M;
}

cxl_status cxl_harness_new(double vf, cxl_harness **harness)
{
    if (!harness || !cxl__valid_vf(vf))
        return CXL_EINVAL;
    cxl_harness *h = calloc(1, sizeof *h);
    if (!h)
        return CXL_ENOMEM;
    h->vf = vf;
    *harness = h;
    return CXL_OK;
}

void cxl_harness_free(cxl_harness *harness)
{
    free(harness);
}

cxl_status cxl_harness_add_element(cxl_harness *harness, double x_m, double y_m,
                                   double delay_s, size_t *index)
{
    if (!harness || !isfinite(x_m) || !isfinite(y_m) || !cxl__finite_nonneg(delay_s))
        return CXL_EINVAL;
    if (!bounded(x_m) || !bounded(y_m) || delay_s > CXL_HARNESS_MAX_DELAY_S ||
        harness->n >= CXL_HARNESS_MAX_ELEMENTS)
        return CXL_ERANGE;
    harness->el[harness->n] = (harness_elem){ x_m, y_m, delay_s };
    if (index)
        *index = harness->n;
    harness->n++;
    harness->planned = 0;
    return CXL_OK;
}

cxl_status cxl_harness_set_combiner(cxl_harness *harness, double x_m, double y_m)
{
    if (!harness || !isfinite(x_m) || !isfinite(y_m))
        return CXL_EINVAL;
    if (!bounded(x_m) || !bounded(y_m))
        return CXL_ERANGE;
    harness->comb_x_m = x_m;
    harness->comb_y_m = y_m;
    harness->planned = 0;
    return CXL_OK;
}

cxl_status cxl_harness_set_cuts(cxl_harness *harness, double slack_m, double allowance_m,
                                double kerf_m)
{
    if (!harness || !cxl__finite_nonneg(slack_m) || !cxl__finite_nonneg(allowance_m) ||
        !cxl__finite_nonneg(kerf_m))
        return CXL_EINVAL;
    if (!bounded(slack_m) || !bounded(allowance_m) || !bounded(kerf_m))
        return CXL_ERANGE;
    harness->slack_m = slack_m;
    harness->allowance_m = allowance_m;
    harness->kerf_m = kerf_m;
    harness->planned = 0;
    return CXL_OK;
}

cxl_status cxl_harness_add_drum(cxl_harness *harness, double length_m, size_t *index)
{
    if (!harness || !cxl__finite_pos(length_m))
        return CXL_EINVAL;
    if (!bounded(length_m) || harness->ndrums >= CXL_HARNESS_MAX_DRUMS)
        return CXL_ERANGE;
    harness->drum_m[harness->ndrums] = length_m;
    if (index)
        *index = harness->ndrums;
    harness->ndrums++;
    harness->planned = 0;
    return CXL_OK;
}

/* ---- packing ---------------------------------------------------------- */

/* Longest first; equal lengths in their list order (a stable result on
 * every machine). */
static int by_length_desc(const harness_piece *pc, size_t a, size_t b)
{
    if (pc[a].length_m > pc[b].length_m) return -1;
    if (pc[a].length_m < pc[b].length_m) return 1;
    return a < b ? -1 : a > b;
}

static void sort_order(const harness_piece *pc, size_t n, size_t *order)
{
    for (size_t i = 0; i < n; i++) order[i] = i;
    /* insertion sort: at most 512 pieces, and no qsort context needed */
    for (size_t i = 1; i < n; i++) {
        size_t v = order[i], j = i;
        while (j > 0 && by_length_desc(pc, v, order[j - 1]) < 0) {
            order[j] = order[j - 1];
            j--;
        }
        order[j] = v;
    }
}

/* Pack in the given order; best != 0: the drum left with the least,
 * otherwise the first that holds it.  drum_of[i] gets each piece's drum
 * (SIZE_MAX: none).  Returns the pieces without a drum; *used the drums
 * holding at least one piece. */
static size_t pack(const cxl_harness *h, const size_t *order, int best, size_t *drum_of,
                   double *used_m, size_t *drums_used)
{
    size_t unplaced = 0;
    for (size_t d = 0; d < h->ndrums; d++) used_m[d] = 0.0;
    for (size_t k = 0; k < h->npieces; k++) {
        size_t i = order[k];
        double need = h->piece[i].length_m + h->kerf_m;
        size_t pick = SIZE_MAX;
        double pick_left = 0.0;
        for (size_t d = 0; d < h->ndrums; d++) {
            double left = h->drum_m[d] - used_m[d] - need;
            if (left < -FIT_TOL_M) continue;
            if (pick == SIZE_MAX || (best && left < pick_left)) {
                pick = d;
                pick_left = left;
            }
            if (!best) break;
        }
        drum_of[i] = pick;
        if (pick == SIZE_MAX) unplaced++;
        else used_m[pick] += need;
    }
    size_t nu = 0;
    for (size_t d = 0; d < h->ndrums; d++) nu += used_m[d] > 0.0;
    *drums_used = nu;
    return unplaced;
}

/* One piece of length total less the allowance, for element i. */
static cxl_status cut_piece(const cxl_harness *h, size_t i, int delay, double total,
                            harness_piece *pc)
{
    double cut = total - h->allowance_m;
    /* a piece shorter than 1 mm cannot be cut: the allowance (or the tiny
     * delay) and the piece cannot both hold */
    if (!(cut >= CXL_HARNESS_MIN_PIECE_M))
        return CXL_EINCONSISTENT;
    double f;
    cxl_status st = cxl_line_quarter_wave_freq(cut, h->vf, &f);
    if (st)
        return st == CXL_ERANGE ? CXL_EINCONSISTENT : st;
    *pc = (harness_piece){ i, delay ? CXL_PIECE_DELAY : CXL_PIECE_FEED, cut, f, SIZE_MAX };
    return CXL_OK;
}

/* Each element's feed run of feed_m and its delay piece (when it has a
 * delay) into pc[]; *np their count. */
static cxl_status cut_pieces(const cxl_harness *h, double feed_m, harness_piece *pc, size_t *np)
{
    double vc = h->vf * CXL_C_M_PER_S;
    *np = 0;
    for (size_t i = 0; i < h->n; i++) {
        cxl_status st = cut_piece(h, i, 0, feed_m, &pc[*np]);
        if (st != CXL_OK) return st;
        ++*np;
        if (h->el[i].delay_s == 0.0) continue;
        if ((st = cut_piece(h, i, 1, h->el[i].delay_s * vc, &pc[*np])) != CXL_OK) return st;
        ++*np;
    }
    return CXL_OK;
}

/* Packs the pieces on the drums by first and best fit and keeps the
 * better; CXL_ERANGE when a piece finds no drum. */
static cxl_status pack_drums(cxl_harness *h)
{
    size_t np = h->npieces;
    size_t order[2 * CXL_HARNESS_MAX_ELEMENTS] = { 0 }, ffd[2 * CXL_HARNESS_MAX_ELEMENTS],
        bfd[2 * CXL_HARNESS_MAX_ELEMENTS];
    double used_f[CXL_HARNESS_MAX_DRUMS], used_b[CXL_HARNESS_MAX_DRUMS];
    size_t nf, nb;
    sort_order(h->piece, np, order);
    size_t uf = pack(h, order, 0, ffd, used_f, &nf);
    size_t ub = pack(h, order, 1, bfd, used_b, &nb);
    int take_best = ub < uf || (ub == uf && nb < nf);
    for (size_t i = 0; i < np; i++) h->piece[i].drum = take_best ? bfd[i] : ffd[i];
    memcpy(h->used_m, take_best ? used_b : used_f, h->ndrums * sizeof used_f[0]);
    h->planned = 1;
    /* no drums given: a cut list without packing */
    return (take_best ? ub : uf) && h->ndrums ? CXL_ERANGE : CXL_OK;
}

cxl_status cxl_harness_plan(cxl_harness *harness)
{
    if (!harness || harness->n == 0)
        return CXL_EINVAL;
    cxl_harness *h = harness;
    double vc = h->vf * CXL_C_M_PER_S;
    /* the longest run needed sets every feed run */
    double reach = 0.0;
    for (size_t i = 0; i < h->n; i++)
        reach = fmax(reach, hypot(h->el[i].x_m - h->comb_x_m, h->el[i].y_m - h->comb_y_m));
    double feed_m = reach + h->slack_m;
    harness_piece pc[2 * CXL_HARNESS_MAX_ELEMENTS];
    size_t np = 0;
    cxl_status st = cut_pieces(h, feed_m, pc, &np);
    if (st != CXL_OK) return st;
    memcpy(h->piece, pc, np * sizeof pc[0]);
    h->npieces = np;
    h->feed_m = feed_m;
    h->feed_delay_s = feed_m / vc;
    return pack_drums(h);
}

size_t cxl_harness_piece_count(const cxl_harness *harness)
{
    return harness && harness->planned ? harness->npieces : 0;
}

cxl_status cxl_harness_piece(const cxl_harness *harness, size_t i, size_t *element,
                             cxl_piece_kind *kind, double *length_m, double *check_hz,
                             size_t *drum)
{
    if (!harness || !harness->planned || i >= harness->npieces || !element || !kind ||
        !length_m || !check_hz || !drum)
        return CXL_EINVAL;
    const harness_piece *p = &harness->piece[i];
    *element = p->element;
    *kind = p->kind;
    *length_m = p->length_m;
    *check_hz = p->check_hz;
    *drum = p->drum;
    return CXL_OK;
}

cxl_status cxl_harness_feed_run(const cxl_harness *harness, double *length_m,
                                double *delay_s)
{
    if (!harness || !harness->planned || !length_m || !delay_s)
        return CXL_EINVAL;
    *length_m = harness->feed_m;
    *delay_s = harness->feed_delay_s;
    return CXL_OK;
}

cxl_status cxl_harness_drum(const cxl_harness *harness, size_t d, double *used_m,
                            double *left_m)
{
    if (!harness || !harness->planned || d >= harness->ndrums || !used_m || !left_m)
        return CXL_EINVAL;
    *used_m = harness->used_m[d];
    /* a piece may fit to within FIT_TOL_M: never a negative rest */
    *left_m = fmax(0.0, harness->drum_m[d] - harness->used_m[d]);
    return CXL_OK;
}
