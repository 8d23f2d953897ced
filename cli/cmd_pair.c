/* cmd_pair.c - coaxline pair: two or more lines meant to be equal, checked
 * against a phase tolerance at each band edge.  The worst pair is the
 * longest line against the shortest (with --load: the largest delay into
 * the load against the smallest); exit 1 when any band fails. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef pair_opts[] = {
    { "length", "LEN", "measured length of one line (give two or more)", 1 },
    { "vf", "X", "velocity factor of the cable, 0 < X <= 1", 0 },
    { "cable", "NAME", "take the velocity factor from the catalog", 0 },
    { "vf-from", "FILE|-", "take the fitted VF from coaxline vf --format csv output", 0 },
    { "tolerance", "DEG", "largest phase difference allowed between the lines", 0 },
    CLI_BUDGET_OPTDEFS,
    CLI_DUO_GEOMETRY_OPTDEFS,
    { "band", "LIST", "bands to check, e.g. 160m,80m", 1 },
    { "region", "N", "ITU Region 1, 2 or 3 (default: widest edges across Regions)", 0 },
    { "exclude-footnotes", NULL, "band edges without footnote segments", 0 },
    { "freq", "F", "a single frequency to check", 1 },
    { "length-tol", "LEN", "how far each measured length may be off", 0 },
    { "vf-tol", "X", "how far the velocity factor may be off", 0 },
    CLI_LOAD_OPTDEFS,
    { "plot", "FILE", "write the phase error across the bands, with the tolerance, as an SVG file", 0 },
    { "label", "TEXT", "name of the set, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col pair_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "delta_m", 3 }, { "phase_error_deg", 3 }, { "tolerance_deg", 3 }, { "verdict", -1 },
    { "allowed_mismatch_m", 3 }, { "uncertainty_deg", 3 },
    /* the electrical-length difference, and with --load the spread of the
     * lines' gains into it */
    { "electrical_error_deg", 3 }, { "transfer_imbalance_db", 3 },
};
#define NCOLS (sizeof pair_cols / sizeof pair_cols[0])
#define MAX_POINTS (4 * CLI_MAX_ITEMS)

static const char *const verdict_name[3] = { "pass", "uncertain", "fail" };
static const char *const verdict_text[3] = { "pass", "pass, not certain", "fail" };

/* One invocation's set of lines, tolerance and load. */
typedef struct pair_set {
    double len[CLI_MAX_ITEMS];
    int nlen;
    double lo_m, hi_m;          /* shortest and longest line */
    double vf, length_tol_m, vf_tol;
    double tol;                 /* degrees at the point being checked; 0 when unreachable */
    int reachable;              /* 0: even a perfect pair misses the goal there */
    double tol_pt[MAX_POINTS];  /* per point: tolerance, reachable, error-free null */
    int reach_pt[MAX_POINTS];
    double free_pt[MAX_POINTS];
    int has_goal;               /* the tolerance comes from a wanted null */
    cli_goal goal;
    cli_load load;
} pair_set;

/* The phase tolerance in degrees at every point: --tolerance, or what
 * --null-depth (the pair's geometry) or --null-vs-inphase allows
 * (cli_goal_tolerance).  reach_pt[i] is 0 where even an error-free pair
 * misses the wanted null. */
static int resolve_tolerance(cli_ctx *ctx, const cli_args *a, pair_set *s,
                             const cli_freq_point *pts, int np)
{
    static const char expected[] = "a phase tolerance from 0.001 to 360 degrees, such as 2";
    const char *t = cli_get(a, "tolerance", 0);
    int goal = cli_count(a, "null-depth") > 0 || cli_count(a, "null-vs-inphase") > 0;
    double tol = 0.0;
    s->has_goal = 0;
    if (t && goal)
        return cli_error(ctx, "tolerance", "--tolerance 2 or --null-depth -30, not both",
                         "give the tolerance or the null depth");
    if (!goal && cli_count(a, "imbalance"))
        return cli_error(ctx, "imbalance", "--imbalance 0.5 with --null-depth -30",
                         "goes with --null-depth only");
    if (goal) {
        if (cli_goal_parse(ctx, a, &s->goal)) {
            cli_goal_free(&s->goal);
            return CLI_EXIT_USAGE;
        }
        s->has_goal = 1;
        for (int i = 0; i < np; i++) {
            s->tol_pt[i] = 0.0;
            int code = cli_goal_tolerance(ctx, &s->goal, pts[i].freq_hz, &s->free_pt[i],
                                          &s->tol_pt[i]);
            if (code == CLI_EXIT_USAGE) return code;
            s->reach_pt[i] = code == 0;
        }
        return 0;
    }
    if (!t)
        return cli_error(ctx, "tolerance", "--tolerance 2 or --null-depth -30",
                         "the tolerance is needed");
    if (cli_number(ctx, "tolerance", t, -1e9, 360.0, expected, &tol)) return CLI_EXIT_USAGE;
    if (!(tol > 0.0))
        return cli_error(ctx, "tolerance", expected, "'%s' must be greater than zero", t);
    /* below what the output shows, a tolerance would print as 0.000 */
    if (tol < 0.001)
        return cli_error(ctx, "tolerance", expected, "'%s' is below 0.001 degrees", t);
    for (int i = 0; i < np; i++) {
        s->tol_pt[i] = tol;
        s->reach_pt[i] = 1;
    }
    return 0;
}

/* The tolerance of point i becomes the one checked against. */
static void at_point(pair_set *s, int i)
{
    s->tol = s->tol_pt[i];
    s->reachable = s->reach_pt[i];
}

/* Per point results. */
typedef struct check {
    double delta_m, err_deg, unc_deg, allowed_m, elec_deg, imbalance_db;
    int has_allowed;
    cxl_verdict verdict;
} check;

/* Is b worse than a: a harder verdict, or the same with less margin? */
static int worse_check(const check *a, const check *b)
{
    if (b->verdict != a->verdict) return b->verdict > a->verdict;
    return b->err_deg + b->unc_deg > a->err_deg + a->unc_deg;
}

/* Error, spread of gains, uncertainty and allowed mismatch of the lines
 * into the load (the library's check). */
static int load_check(cli_ctx *ctx, const pair_set *s, double f, int want_allowed, check *c)
{
    cxl_status st = cxl_pair_load_check(s->load.handle, s->len, (size_t)s->nlen,
                                        s->reachable ? s->tol : 360.0, s->vf, f, s->length_tol_m,
                                        s->vf_tol, &c->err_deg, &c->unc_deg, &c->elec_deg,
                                        &c->imbalance_db, &c->verdict);
    if (st != CXL_OK) return cli_load_error(ctx, &s->load, f, st);
    c->has_allowed = 0;
    if (want_allowed && s->reachable) {
        st = cxl_pair_load_max_mismatch(s->load.handle, s->tol, s->lo_m, s->vf, f,
                                        &c->allowed_m);
        if (st != CXL_OK && st != CXL_ENOCONV) return cli_load_error(ctx, &s->load, f, st);
        c->has_allowed = st == CXL_OK;
    }
    return 0;
}

/* The library's check of the lines at f (into the load with --load), its
 * verdict the one rule of cxl_pair_verdict. */
static int check_point(cli_ctx *ctx, const pair_set *s, double f, int want_allowed, check *c)
{
    /* the library's verdict needs a tolerance; an unreachable goal fails */
    if (cxl_pair_check(s->len, (size_t)s->nlen, s->reachable ? s->tol : 360.0, s->vf, f,
                       s->length_tol_m, s->vf_tol, &c->delta_m, &c->err_deg, &c->unc_deg,
                       &c->verdict) != CXL_OK ||
        !isfinite(c->err_deg) || !isfinite(c->unc_deg))
        return cli_error(ctx, "freq", "a smaller frequency", "gives no finite phase error");
    if (s->load.given) {
        /* into the load: error, uncertainty, allowance and verdict replaced */
        if (load_check(ctx, s, f, want_allowed, c)) return CLI_EXIT_USAGE;
    } else {
        c->elec_deg = c->err_deg;
        c->imbalance_db = 0.0;
        c->has_allowed = want_allowed && s->reachable &&
                         cxl_pair_max_mismatch(s->tol, s->vf, f, &c->allowed_m) == CXL_OK &&
                         isfinite(c->allowed_m);
    }
    /* no tolerance left (an unreachable null) fails whatever the lines */
    if (!s->reachable) c->verdict = CXL_VERDICT_FAIL;
    return 0;
}

static int plot_point(cli_ctx *ctx, void *user, double freq_hz, double *err_deg,
                      double *second_deg)
{
    const pair_set *s = user;
    check c;
    if (check_point(ctx, s, freq_hz, 0, &c)) return CLI_EXIT_USAGE;
    *err_deg = c.err_deg;
    *second_deg = s->load.given ? c.elec_deg : c.err_deg + c.unc_deg;
    return 0;
}

static int plot(cli_ctx *ctx, const cli_args *a, pair_set *s, const cli_freq_point *pts, int np)
{
    char title[300], n1[160], n2[200], b1[48], b2[48], b3[48];
    const char *label = cli_label(a);
    int unc = s->length_tol_m > 0.0 || s->vf_tol > 0.0;
    snprintf(title, sizeof title, "%s%sPhase error, longest line against shortest", label,
             label[0] ? ": " : "");
    snprintf(n1, sizeof n1, "Lines %s m to %s m, VF %s.", cli_fmt(b1, sizeof b1, s->lo_m, 3),
             cli_fmt(b2, sizeof b2, s->hi_m, 3), cli_fmt(b3, sizeof b3, s->vf, 4));
    cli_errplot spec = {
        .title = title,
        .name = s->load.given ? "into the load" : "electrical length",
        .second = s->load.given ? "electrical length only (a matched load)"
                  : unc ? "error + uncertainty (worst case)" : NULL,
        .note = { n1, NULL, NULL },
        .has_tolerance = s->reachable,
        .tolerance_deg = s->tol,
    };
    if (s->load.given) {
        char l[160];
        snprintf(n2, sizeof n2, "Load %s.", cli_fmt_load(l, sizeof l, &s->load));
        spec.note[1] = n2;
    }
    char n3[160], b4[48];
    if (!s->reachable) {
        spec.note[2] = "No tolerance: even an error-free pair misses the null depth.";
    } else if (s->has_goal) {
        snprintf(n3, sizeof n3, "Tolerance from a wanted %s of %s dB (%s).",
                 s->goal.kind == CLI_GOAL_NULL ? "rear null" : "null",
                 cli_fmt(b4, sizeof b4, s->goal.goal_db, 2),
                 s->goal.kind == CLI_GOAL_NULL ? "against the forward response; the tightest point"
                                                : "against the in-phase sum, closed form");
        spec.note[2] = n3;
    }
    return cli_errplot_save(ctx, "plot", cli_get(a, "plot", 0), pts, np, plot_point, s, &spec);
}

/* --null-depth / --null-vs-inphase: what the tolerance is for. */
static void goal_tolerance_text(cli_ctx *ctx, const pair_set *s, int np)
{
    char b1[96], b2[96], b3[96];
    FILE *o = ctx->out;
    const cli_goal *g = &s->goal;
    const cli_duo_spec *p = &g->spec;
    double lo = INFINITY, hi = -INFINITY, free_db = -INFINITY;
    int all = 1;
    for (int i = 0; i < np; i++) {
        if (!s->reach_pt[i]) {
            all = 0;
            free_db = fmax(free_db, s->free_pt[i]);
            continue;
        }
        lo = fmin(lo, s->tol_pt[i]);
        hi = fmax(hi, s->tol_pt[i]);
    }
    if (!all && g->kind == CLI_GOAL_INPHASE) {
        fprintf(o, "none: with %s dB imbalance even an error-free pair nulls only to %s dB,"
                   " not %s dB\n", cli_fmt(b1, sizeof b1, g->imbalance_db, 2),
                cli_fmt(b2, sizeof b2, free_db, 2), cli_fmt(b3, sizeof b3, g->goal_db, 2));
        return;
    }
    if (g->kind == CLI_GOAL_INPHASE) {
        fprintf(o, "%s deg, for a null of %s dB", cli_fmt(b1, sizeof b1, lo, 3),
                cli_fmt(b2, sizeof b2, g->goal_db, 2));
        fprintf(o, " with %s dB imbalance\n", cli_fmt(b1, sizeof b1, g->imbalance_db, 2));
        fprintf(o, "                    (closed form, relative to the two signals in phase)\n");
        return;
    }
    if (!all)
        fprintf(o, "none at some points: the error-free pair nulls only to %s dB there, not %s dB\n"
                   "                    ", cli_fmt(b1, sizeof b1, free_db, 2),
                cli_fmt(b2, sizeof b2, g->goal_db, 2));
    if (lo <= hi && lo < hi)
        fprintf(o, "%s to %s deg across the points,\n                    ",
                cli_fmt(b1, sizeof b1, lo, 3), cli_fmt(b2, sizeof b2, hi, 3));
    else if (lo <= hi)
        fprintf(o, "%s deg, ", cli_fmt(b1, sizeof b1, lo, 3));
    fprintf(o, "for a rear null of %s dB with %s dB imbalance\n",
            cli_fmt(b1, sizeof b1, g->goal_db, 2), cli_fmt(b2, sizeof b2, g->imbalance_db, 2));
    fprintf(o, "                    against the forward response of the pair: stagger %s,\n",
            cli_fmt_length(ctx, b1, sizeof b1, p->stagger_m));
    fprintf(o, "                    spacing %s, feed %s, %s elements, elevation %s deg\n",
            cli_fmt_length(ctx, b2, sizeof b2, p->spacing_m), p->feed,
            p->wire ? "long-wire" : "isotropic", cli_fmt(b3, sizeof b3, p->elevation_deg, 1));
}

static void tolerance_text(cli_ctx *ctx, const pair_set *s, int np)
{
    char b1[96], b2[96];
    FILE *o = ctx->out;
    fprintf(o, "  tolerance         ");
    if (s->has_goal)
        goal_tolerance_text(ctx, s, np);
    else
        fprintf(o, "%s deg\n", cli_fmt(b1, sizeof b1, s->tol, 3));
    if (s->length_tol_m > 0.0 || s->vf_tol > 0.0)
        fprintf(o, "  measured within   each length %s m, VF %s\n", cli_fmt(b1, sizeof b1, s->length_tol_m, 3),
                cli_fmt(b2, sizeof b2, s->vf_tol, 4));
}

/* Every line into the load at each band's worst edge. */
static void load_text(cli_ctx *ctx, const pair_set *s, const cli_freq_point *pts,
                      const int *worst, const char *const *names, int ngroups)
{
    char b1[96], b2[96], b3[96], b4[96], b5[96], b6[96];
    FILE *o = ctx->out;
    fprintf(o, "  into the load at each worst edge (departure = into load - electrical)\n");
    fprintf(o, "  %-6s %-14s %10s %10s %10s %9s %10s\n", "band", "line", "electrical", "into load",
            "departure", "transfer", "MHz");
    fprintf(o, "  %-6s %-14s %10s %10s %10s %9s\n", "", "", "deg", "deg", "deg", "dB");
    for (int g = 0; g < ngroups; g++) {
        double f = pts[worst[g]].freq_hz;
        for (int i = 0; i < s->nlen; i++) {
            double db, d, e;
            if (cli_load_transfer(ctx, &s->load, s->len[i], f, &db, &d, &e)) return; /* done before */
            snprintf(b1, sizeof b1, "%s m", cli_fmt(b2, sizeof b2, s->len[i], 3));
            fprintf(o, "  %-6s %-14s %10s %10s %10s %9s", i ? "" : names[g], b1,
                    cli_fmt(b2, sizeof b2, e, 3), cli_fmt(b3, sizeof b3, d, 3),
                    cli_fmt_signed(b4, sizeof b4, d - e, 3), cli_fmt(b5, sizeof b5, db, 3));
            if (i == 0) fprintf(o, " %10s", cli_fmt(b6, sizeof b6, f / 1e6, 6));
            putc('\n', o);
        }
    }
}

/* The bands of the text table: a band's edges form one group, each
 * --freq point its own; worst[g] is the group's worst point. */
typedef struct band_groups {
    int n;
    int worst[MAX_POINTS];
    char name[MAX_POINTS][32];
    const char *names[MAX_POINTS];
} band_groups;

/* One past the last point of the group that starts at point i. */
static int group_end(const cli_freq_point *pts, int i, int np)
{
    int k = i + 1;
    while (k < np && pts[i].band[0] && strcmp(pts[k].band, pts[i].band) == 0) k++;
    return k;
}

/* The worst point of points [i, k), and the smallest allowed mismatch
 * among them (*has_allowed 0 when one of them has none). */
static int group_worst(const check *c, int i, int k, int *has_allowed, double *allowed_m)
{
    int w = i;
    *has_allowed = c[i].has_allowed;
    *allowed_m = c[i].allowed_m;
    for (int j = i + 1; j < k; j++) {
        if (worse_check(&c[w], &c[j])) w = j;
        if (!c[j].has_allowed) *has_allowed = 0;
        else if (c[j].allowed_m < *allowed_m) *allowed_m = c[j].allowed_m;
    }
    return w;
}

/* One row per band (or --freq point) at its worst point; the worst point
 * of all. */
static int band_rows(cli_ctx *ctx, const cli_freq_point *pts, const check *c, int np,
                     band_groups *g)
{
    char b1[96], b2[96], b3[96], b4[96];
    int worst = -1;
    g->n = 0;
    for (int i = 0; i < np;) {
        int k = group_end(pts, i, np), has_allowed;
        double allowed;
        int w = group_worst(c, i, k, &has_allowed, &allowed);
        if (worst < 0 || worse_check(&c[worst], &c[w])) worst = w;
        snprintf(g->name[g->n], sizeof g->name[0], "%s", pts[i].band[0] ? pts[i].band : "freq");
        g->names[g->n] = g->name[g->n];
        g->worst[g->n] = w;
        fprintf(ctx->out, "  %-6s %12s MHz  %9s  %11s  %-27s  %s\n", g->name[g->n],
                cli_fmt(b1, sizeof b1, pts[w].freq_hz / 1e6, 6),
                cli_fmt(b2, sizeof b2, c[w].err_deg, 3), cli_fmt(b3, sizeof b3, c[w].unc_deg, 3),
                has_allowed ? cli_fmt_length(ctx, b4, sizeof b4, allowed) : "-",
                verdict_text[c[w].verdict]);
        g->n++;
        i = k;
    }
    return worst;
}

/* The set: its lines, VF, load and tolerance. */
static void set_text(cli_ctx *ctx, const cli_args *a, const pair_set *s, const char *from,
                     const check *c, int np)
{
    char b1[200];
    FILE *o = ctx->out;
    const char *label = cli_label(a);
    fprintf(o, "pair%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  lines            ");
    for (int i = 0; i < s->nlen; i++)
        fprintf(o, "%s %s m", i ? "," : "", cli_fmt(b1, sizeof b1, s->len[i], 3));
    fprintf(o, "\n  longest-shortest  %s\n", cli_fmt_length(ctx, b1, sizeof b1, c[0].delta_m));
    fprintf(o, "  velocity factor   %s%s%s\n", cli_fmt(b1, sizeof b1, s->vf, 4), from[0] ? "  " : "", from);
    if (s->load.given)
        fprintf(o, "  load              %s\n"
                   "                    error = largest delay into it - smallest\n",
                cli_fmt_load(b1, sizeof b1, &s->load));
    tolerance_text(ctx, s, np);
}

/* The worst point of all against its tolerance. */
static void worst_text(cli_ctx *ctx, pair_set *s, const cli_freq_point *pts, const check *c,
                       int worst)
{
    char b1[96], b2[96], b3[96], b4[96];
    FILE *o = ctx->out;
    const check *wc = &c[worst];
    at_point(s, worst);
    if (pts[worst].band[0])
        snprintf(b4, sizeof b4, "%s", pts[worst].band);
    else
        snprintf(b4, sizeof b4, "%s MHz", cli_fmt(b3, sizeof b3, pts[worst].freq_hz / 1e6, 6));
    fprintf(o, "  worst             %s: %s deg at %s MHz ", b4, cli_fmt(b1, sizeof b1, wc->err_deg, 3),
            cli_fmt(b2, sizeof b2, pts[worst].freq_hz / 1e6, 6));
    if (s->reachable)
        fprintf(o, "against %s deg: %s\n", cli_fmt(b3, sizeof b3, s->tol, 3), verdict_text[wc->verdict]);
    else
        fprintf(o, "with no tolerance left: %s\n", verdict_text[wc->verdict]);
    if (wc->verdict == CXL_VERDICT_PASS_UNCERTAIN)
        fprintf(o, "                    (error plus uncertainty %s deg exceeds the tolerance)\n",
                cli_fmt(b1, sizeof b1, wc->err_deg + wc->unc_deg, 3));
}

static void text_output(cli_ctx *ctx, const cli_args *a, pair_set *s, const char *from,
                        const cli_freq_point *pts, const check *c, int np)
{
    band_groups g;
    if (ctx->rows_out++) putc('\n', ctx->out);
    set_text(ctx, a, s, from, c, np);
    fprintf(ctx->out, "  %-6s %16s  %9s  %11s  %-27s  %s\n", "band", "worst at", "error deg",
            "uncert. deg", "allowed mismatch", "verdict");
    int worst = band_rows(ctx, pts, c, np, &g);
    if (s->load.given) load_text(ctx, s, pts, g.worst, g.names, g.n);
    worst_text(ctx, s, pts, c, worst);
}

static void table_output(cli_ctx *ctx, const cli_args *a, const pair_set *s,
                         const cli_freq_point *pts, const check *c, int np)
{
    const char *label = cli_label(a);
    for (int i = 0; i < np; i++) {
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
            CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(c[i].delta_m), CLI_NUM(c[i].err_deg),
            s->reach_pt[i] ? CLI_NUM(s->tol_pt[i]) : CLI_NONE, CLI_TXT(verdict_name[c[i].verdict]),
            c[i].has_allowed ? CLI_NUM(c[i].allowed_m) : CLI_NONE, CLI_NUM(c[i].unc_deg),
            CLI_NUM(c[i].elec_deg), s->load.given ? CLI_NUM(c[i].imbalance_db) : CLI_NONE,
        };
        cli_table_row(ctx, pair_cols, NCOLS, cells);
    }
}

/* --length, given two or more times (or as a list in a batch cell). */
static int parse_lines(cli_ctx *ctx, const cli_args *a, pair_set *s)
{
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    s->nlen = cli_items(ctx, a, "length", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (s->nlen < 0) return CLI_EXIT_USAGE;
    if (s->nlen < 2)
        return cli_error(ctx, "length", "--length 20.00m --length 20.30m, or 20.00m;20.30m in a batch cell",
                         "at least two lengths are needed, %d given", s->nlen);
    for (int i = 0; i < s->nlen; i++) {
        if (cli_line_length(ctx, "length", items[i], &s->len[i])) return CLI_EXIT_USAGE;
        s->lo_m = i ? fmin(s->lo_m, s->len[i]) : s->len[i];
        s->hi_m = i ? fmax(s->hi_m, s->len[i]) : s->len[i];
    }
    return 0;
}

/* --length-tol and --vf-tol: how far the measurements may be off. */
static int parse_measuring(cli_ctx *ctx, const cli_args *a, pair_set *s)
{
    if (cli_count(a, "length-tol")) {
        const char *t = cli_get(a, "length-tol", 0);
        if (cli_length(ctx, "length-tol", t, CLI_NONNEG, &s->length_tol_m)) return CLI_EXIT_USAGE;
        if (s->length_tol_m > CLI_LINE_MAX_M)
            return cli_error(ctx, "length-tol", "a length tolerance up to 1000 km, such as 5mm",
                             "'%s' is above 1000 km", t);
    }
    if (cli_count(a, "vf-tol")) {
        const char *t = cli_get(a, "vf-tol", 0);
        static const char expected[] = "a VF tolerance that leaves the VF at least 0.01, such as 0.01";
        if (cli_number(ctx, "vf-tol", t, 0.0, 1.0, expected, &s->vf_tol)) return CLI_EXIT_USAGE;
        if (!(s->vf - s->vf_tol >= CLI_LINE_MIN_VF))
            return cli_error(ctx, "vf-tol", expected, "'%s' leaves the VF below 0.01", t);
    }
    return 0;
}

/* Tolerance, load, the check of every point and the plot; *failed when a
 * point fails. */
static int check_points(cli_ctx *ctx, const cli_args *a, pair_set *s, const cli_freq_point *pts,
                        check *c, int np, int *failed)
{
    int code = resolve_tolerance(ctx, a, s, pts, np);
    if (!code) code = cli_load_parse(ctx, a, s->vf, &s->load);
    for (int i = 0; !code && i < np; i++) {
        at_point(s, i);
        code = check_point(ctx, s, pts[i].freq_hz, 1, &c[i]);
        if (!code && c[i].verdict == CXL_VERDICT_FAIL) *failed = 1;
    }
    if (!code && cli_count(a, "plot")) {
        /* one line on the plot: the tightest tolerance of the points */
        at_point(s, 0);
        for (int i = 1; i < np; i++)
            if (!s->reach_pt[i] || s->tol_pt[i] < s->tol) at_point(s, i);
        code = plot(ctx, a, s, pts, np);
    }
    return code;
}

static void pair_set_free(pair_set *s)
{
    cli_load_free(&s->load);
    if (s->has_goal) cli_goal_free(&s->goal);
}

static int pair_run(cli_ctx *ctx, const cli_args *a)
{
    pair_set s;
    /* the load (and has_goal) zeroed first: every way out frees them, also
     * a row refused before --load is read */
    memset(&s, 0, sizeof s);
    if (parse_lines(ctx, a, &s)) return CLI_EXIT_USAGE;
    char from[256];
    int rc = cli_vf_source(ctx, a, &s.vf, ctx->format == CLI_TEXT ? from : NULL, sizeof from);
    if (rc || cli_line_vf_check(ctx, a, s.vf) || parse_measuring(ctx, a, &s))
        return CLI_EXIT_USAGE;

    cli_freq_point pts[MAX_POINTS];
    check c[MAX_POINTS];
    if (cli_line_freq_items(ctx, a)) return CLI_EXIT_USAGE;
    int np = cli_freq_points(ctx, a, pts, MAX_POINTS, NULL), failed = 0;
    if (np < 0) return CLI_EXIT_USAGE;
    int code = check_points(ctx, a, &s, pts, c, np, &failed);
    if (!code) {
        if (ctx->format == CLI_TEXT)
            text_output(ctx, a, &s, from, pts, c, np);
        else
            table_output(ctx, a, &s, pts, c, np);
    }
    pair_set_free(&s);
    if (code) return code;
    return failed ? CLI_EXIT_TOLERANCE : CLI_EXIT_OK;
}

const cli_command cli_cmd_pair = {
    .name = "pair",
    .summary = "lines meant to be equal against a phase tolerance, per band edge",
    .synopsis = "--length LEN --length LEN ... (--vf X | --cable NAME | --vf-from FILE|-) "
                "(--tolerance DEG | --null-depth DB PAIR GEOMETRY | --null-vs-inphase DB) [--imbalance DB] "
                "(--band LIST | --freq F) "
                "[--load R+jX [--z0 OHM]] [--plot FILE.svg] [OPTIONS]",
    .opts = pair_opts,
    .end = cli_vf_source_end,
    .run = pair_run,
    .batch = 1,
};
