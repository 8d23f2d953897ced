/* cmd_loss.c - coaxline loss: matched loss of a cable run, and total loss
 * with a mismatched load, at each band edge or given frequency. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

static const cli_optdef loss_opts[] = {
    { "cable", "NAME", "cable from the catalog (coaxline cables) or from --cables FILE", 0 },
    { "length", "LEN", "length of the run (e.g. 100m, 328ft)", 0 },
    { "band", "LIST", "band(s): low edge, centre and high edge of each (e.g. 160m,80m)", 1 },
    { "region", "N", "ITU Region 1, 2 or 3 for the band edges (default: widest of all)", 0 },
    { "exclude-footnotes", NULL, "band edges without segments that hold only in listed countries", 0 },
    { "freq", "F", "a frequency to evaluate (e.g. 1.83MHz)", 1 },
    { "swr", "X", "standing-wave ratio at the load, 1 or more (default 1: matched)", 0 },
    { "model", "fitted|physical", "loss model (default: fitted when the cable has loss points)", 0 },
    { "external-inductance-only", NULL, "physical model: leave out the conductors' internal inductance", 0 },
    { "extrapolate", NULL, "fitted model: allow frequencies outside the loss table", 0 },
    { "label", "TEXT", "name of the run, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col loss_cols[] = {
    { "label", -1 }, { "cable", -1 }, { "band", -1 }, { "freq_mhz", 6 }, { "length_m", 3 },
    { "matched_loss_db", 3 }, { "swr", 3 }, { "total_loss_db", 3 },
    { "edge", -1 }, { "model", -1 }, { "loss_db_per_100m", 4 }, { "extrapolated", -1 },
};
#define NCOLS (sizeof loss_cols / sizeof loss_cols[0])

#define MAX_POINTS (4 * CLI_MAX_ITEMS)

/* No coax loses 1000 dB per metre (a thin line at 1 THz: tens of dB per
 * metre; common practice, no source): above it a user cable's data are
 * wrong, and 1000 km of it still prints as a number of 9 digits. */
#define LOSS_MAX_DB_PER_M 1e3

/* The model chosen for one invocation. */
typedef struct loss_setup {
    int physical;           /* 0: fitted, 1: physical */
    int defaulted;          /* the user did not choose the model */
    size_t npoints;         /* the cable's loss-table points */
    unsigned flags;         /* CXL_LOSS_* */
    int model_clad;         /* physical model with a copper-clad centre */
    const cxl_loss_fit *fit;     /* both kept in the batch's cable cache */
    const cxl_loss_model *model;
} loss_setup;

/* Physical attenuations already computed in this batch: rows mostly ask
 * the same few cables at the same band edges, and the model is costly. */
#define ATT_MEMO 16
typedef struct att_memo {
    const cxl_loss_model *model;
    double freq_hz, db_per_m;
    unsigned flags;
    cxl_status st;
} att_memo;

/* The batch's state (ctx->state): the cable cache and the memo. */
typedef struct loss_state {
    cli_cable_cache *cables;
    att_memo memo[ATT_MEMO];
    int memo_n, memo_next;
} loss_state;

static int loss_end(cli_ctx *ctx)
{
    loss_state *ls = ctx->state;
    if (ls) cli_cable_cache_free(ls->cables);
    free(ls);
    ctx->state = NULL;
    return CLI_EXIT_OK;
}

/* The batch's state, made on the first row; NULL when out of memory. */
static loss_state *loss_state_of(cli_ctx *ctx)
{
    if (!ctx->state) ctx->state = calloc(1, sizeof(loss_state));
    return ctx->state;
}

/* cxl_loss_model_attenuation through the memo (ls may be NULL). */
static cxl_status attenuation(loss_state *ls, const cxl_loss_model *model, double freq_hz,
                              unsigned flags, double *db_per_m)
{
    for (int i = 0; ls && i < ls->memo_n; i++) {
        const att_memo *m = &ls->memo[i];
        if (m->model == model && m->freq_hz == freq_hz && m->flags == flags) {
            *db_per_m = m->db_per_m;
            return m->st;
        }
    }
    *db_per_m = NAN; /* kept in the memo even when st says it is not set */
    cxl_status st = cxl_loss_model_attenuation(model, freq_hz, flags, db_per_m);
    if (ls) {
        ls->memo[ls->memo_next] = (att_memo){ model, freq_hz, *db_per_m, flags, st };
        ls->memo_next = (ls->memo_next + 1) % ATT_MEMO;
        if (ls->memo_n < ATT_MEMO) ls->memo_n++;
    }
    return st;
}

/* Choose and build the model for cable index i; 0 or CLI_EXIT_USAGE. */
static int setup_model(cli_ctx *ctx, const cli_args *a, const cxl_catalog *cat, size_t i,
                       const char *name, loss_setup *s)
{
    const char *m = cli_get(a, "model", 0);
    s->npoints = cxl_catalog_loss_count(cat, i);
    if (!m) {
        s->defaulted = 1;
        s->physical = s->npoints < 2;
    } else if (strcmp(m, "fitted") == 0) {
        s->physical = 0;
    } else if (strcmp(m, "physical") == 0) {
        s->physical = 1;
    } else {
        return cli_error(ctx, "model", "fitted or physical", "unknown model '%s'", m);
    }
    if (cli_flag(a, "external-inductance-only")) {
        if (!s->physical)
            return cli_error(ctx, "external-inductance-only", "it with --model physical",
                             "applies to the physical model only");
        s->flags |= CXL_LOSS_EXTERNAL_L_ONLY;
    }
    if (cli_flag(a, "extrapolate")) {
        if (s->physical)
            return cli_error(ctx, "extrapolate", "it with the fitted model (--model fitted)",
                             "the physical model has no table to extrapolate");
        s->flags |= CXL_LOSS_EXTRAPOLATE;
    }
    loss_state *ls = loss_state_of(ctx);
    if (!ls) return cli_error(ctx, "cable", NULL, "%s", cxl_strerror(CXL_ENOMEM));
    if (!s->physical) {
        s->fit = cli_cable_cache_fit(&ls->cables, cat, i);
        if (!s->fit)
            return cli_error(ctx, "model",
                             "--model physical, or two or more points in a --cable-loss file",
                             "cable '%s' has %zu loss-table point%s, too few to fit", name,
                             s->npoints, s->npoints == 1 ? "" : "s");
        return 0;
    }
    cxl_status st = cli_cable_cache_model(&ls->cables, cat, i, &s->model);
    if (st == CXL_ENOTFOUND)
        return cli_error(ctx, "cable",
                         "loss points in a --cable-loss file, or inner_diameter_mm and "
                         "dielectric_diameter_mm in its --cables row",
                         "cable '%s' has %sno diameters for the physical model", name,
                         s->npoints < 2 ? "no loss table and " : "");
    if (st != CXL_OK)
        return cli_error(ctx, "cable", "a cable with a consistent geometry",
                         "cable '%s': physical model: %s", name, cxl_strerror(st));
    double fx;
    s->model_clad = cxl_loss_model_clad_crossover(s->model, &fx) != CXL_ENOTFOUND;
    return 0;
}

static void model_range(const loss_setup *s, double *lo, double *hi)
{
    if (s->physical) {
        cxl_loss_model_range(s->model, lo, hi);
    } else {
        cxl_loss_fit_range(s->fit, lo, hi);
    }
}

/* The point's frequency and, for a band point, where it sits, for an
 * error message: built only when there is one. */
static void point_text(const cli_freq_point *p, char *f, size_t fsize, char *where, size_t wsize)
{
    cli_fmt(f, fsize, p->freq_hz / 1e6, 6);
    where[0] = '\0';
    if (p->band[0])
        snprintf(where, wsize, " (%.15s %.8s%s)", p->band, p->edge,
                 strcmp(p->edge, "centre") == 0 ? "" : " edge");
}

/* A point outside the model's range (st == CXL_EEXTRAPOLATE). */
static int range_error(cli_ctx *ctx, const loss_setup *s, const char *name,
                       const cli_freq_point *p, double lo, double hi, double use_lo,
                       double use_hi)
{
    char f[48], where[64], range[96], usable[96];
    const char *field = p->band[0] ? "band" : "freq";
    if (s->physical && !(lo < hi))
        return cli_error(ctx, "cable", "conductor data that leave the model a frequency range "
                                       "(conductivity_s_per_m, diameters)",
                         "the physical model of '%s' holds at no frequency: 3 skin depths "
                         "lie above the first higher-order mode", name);
    point_text(p, f, sizeof f, where, sizeof where);
    cli_fmt_range_mhz(range, sizeof range, lo, hi);
    if (s->physical)
        return cli_error(ctx, field,
                         "a frequency in that range: from one skin depth in the centre "
                         "conductor's radius (three for a copper-clad centre) up to the "
                         "first higher-order mode",
                         "%s MHz%s is outside the range of the physical model of '%s', %s",
                         f, where, name, range);
    cli_fmt_range_mhz(usable, sizeof usable, use_lo, use_hi);
    return cli_error(ctx, field,
                     "a frequency the table covers, --model physical, or --extrapolate",
                     "%s MHz%s is outside the loss table of '%s', %s (usable %s)", f,
                     where, name, range, usable);
}

/* Loss per metre at one point; 0 or CLI_EXIT_USAGE naming the point. */
static int eval_point(cli_ctx *ctx, const loss_setup *s, const char *name,
                      const cli_freq_point *p, double *db_per_m, int *extrapolated)
{
    cxl_status st = s->physical
        ? attenuation(ctx->state, s->model, p->freq_hz, s->flags, db_per_m)
        : cxl_loss_fit_eval(s->fit, p->freq_hz, s->flags, db_per_m);
    double lo, hi;
    model_range(s, &lo, &hi);
    double use_lo = lo, use_hi = hi;
    if (!s->physical) cxl_loss_fit_usable_range(s->fit, &use_lo, &use_hi);
    *extrapolated = p->freq_hz < use_lo || p->freq_hz > use_hi;
    if (st == CXL_EEXTRAPOLATE) return range_error(ctx, s, name, p, lo, hi, use_lo, use_hi);
    int bad = st != CXL_OK || !isfinite(*db_per_m);
    if (!bad && !(*db_per_m > LOSS_MAX_DB_PER_M)) return 0;
    char f[48], where[64];
    point_text(p, f, sizeof f, where, sizeof where);
    if (bad)
        return cli_error(ctx, p->band[0] ? "band" : "freq", "a frequency nearer the loss table",
                         "%s MHz%s: no loss value for '%s' there (%s)", f, where, name,
                         cxl_strerror(st));
    return cli_error(ctx, "cable", "cable data giving at most 1000 dB per m (conductivity_s_per_m, "
                                   "conductor_loss_factor, loss_tangent, loss table)",
                     "'%s' would lose more than 1000 dB per m at %s MHz%s", name, f, where);
}

/* Text, first lines: the run (length, then the cable) and the model. */
static void text_head(cli_ctx *ctx, const cli_args *a, const char *name, size_t idx,
                      const loss_setup *s, double length_m)
{
    const cxl_catalog *cat = cli_catalog(ctx);
    FILE *o = ctx->out;
    char b1[256], b2[96];
    double z0, vf, lo, hi;
    const char *label = cli_label(a);
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "loss%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  %s of %s", cli_fmt_length(ctx, b1, sizeof b1, length_m),
            cli_clean(b2, sizeof b2, name));
    if (cxl_catalog_value(cat, idx, CXL_CABLE_Z0_OHM, &z0) == CXL_OK)
        fprintf(o, ", %s ohm", cli_fmt(b2, sizeof b2, z0, 0));
    if (cxl_catalog_value(cat, idx, CXL_CABLE_VF, &vf) == CXL_OK)
        fprintf(o, ", VF %s", cli_fmt(b2, sizeof b2, vf, 4));
    int builtin = 1;
    cxl_catalog_is_builtin(cat, idx, &builtin);
    fprintf(o, "%s\n", builtin ? " (nominal)" : " (user file)");
    model_range(s, &lo, &hi);
    if (s->physical) {
        fprintf(o, "  physical model: %s R%s, dielectric G, exact propagation "
                   "constant; holds %s\n",
                s->model_clad ? "layered-surface (clad centre) and thick-wall Bessel"
                              : "round-wire and thick-wall Bessel",
                s->flags & CXL_LOSS_EXTERNAL_L_ONLY ? " (external inductance only)"
                                                    : " with internal inductance",
                cli_fmt_range_mhz(b1, sizeof b1, lo, hi));
        if (s->defaulted)
            fprintf(o, "    (chosen because the cable has %s)\n",
                    s->npoints ? "only one loss-table point" : "no loss table");
    } else {
        fprintf(o, "  fitted model: %s\n", cli_fmt_fit(b1, sizeof b1, s->fit));
    }
}

/* Text: the run in one line (length, then the cable), the model, what the
 * far end does, then one line per point: where, frequency, attenuation,
 * matched-line loss and the loss with the far end's SWR (the CSV's
 * matched_loss_db, swr and total_loss_db). */
static void text_output(cli_ctx *ctx, const cli_args *a, const char *name, size_t idx,
                        const loss_setup *s, double length_m, double swr,
                        const cli_freq_point *pts, int n, const double *per_m,
                        const double *ml, const double *tl, const int *extra)
{
    FILE *o = ctx->out;
    char b1[96], b2[96], b3[96], b4[96], b5[96];
    text_head(ctx, a, name, idx, s, length_m);
    cli_fmt(b1, sizeof b1, swr, 3);
    if (swr > 1.0)
        fprintf(o, "  far end at SWR %s: the last column adds its standing-wave loss "
                   "(real-Z0 formula)\n", b1);
    else
        fprintf(o, "  far end matched (SWR %s): both columns are the matched-line loss\n", b1);
    char at_swr[300];
    snprintf(at_swr, sizeof at_swr, "dB at SWR %s", b1);
    fprintf(o, "\n  %-12s %12s %10s %16s %16s\n", "at", "MHz", "dB/100 m", "matched-line dB",
            at_swr);
    int any_extra = 0;
    for (int k = 0; k < n; k++) {
        char where[40];
        any_extra |= extra[k];
        if (pts[k].band[0]) snprintf(where, sizeof where, "%.15s %.8s", pts[k].band, pts[k].edge);
        else snprintf(where, sizeof where, "given freq");
        fprintf(o, "  %-12s %12s %10s %16s %16s%s\n", where,
                cli_fmt(b2, sizeof b2, pts[k].freq_hz / 1e6, 6),
                cli_fmt(b3, sizeof b3, per_m[k] * 100.0, 3), cli_fmt(b4, sizeof b4, ml[k], 3),
                cli_fmt(b5, sizeof b5, tl[k], 3), extra[k] ? "  *" : "");
    }
    if (any_extra)
        fprintf(o, "  * outside the loss table: extrapolated, treat as an estimate\n");
}

/* --swr into *swr (left at 1 when not given). */
static int read_swr(cli_ctx *ctx, const cli_args *a, double *swr)
{
    static const char expected[] = "a standing-wave ratio of 1 or more, such as 1.5";
    const char *t = cli_get(a, "swr", 0);
    if (!t) return 0;
    if (cli_number(ctx, "swr", t, -1e300, 1e300, expected, swr)) return CLI_EXIT_USAGE;
    if (*swr < 1.0)
        return cli_error(ctx, "swr", expected, "'%s' is below 1, which no load can give", t);
    if (*swr > 1e6)
        return cli_error(ctx, "swr", expected, "'%s' is beyond any measurable SWR", t);
    return 0;
}

/* CSV or table rows, one per point. */
static void table_output(cli_ctx *ctx, const cli_args *a, const char *name, const loss_setup *s,
                         double length_m, double swr, const cli_freq_point *pts, int n,
                         const double *per_m, const double *ml, const double *tl,
                         const int *extra)
{
    const char *model = s->physical ? "physical" : "fitted";
    const char *label = cli_label(a);
    for (int k = 0; k < n; k++) {
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(name), CLI_TXT(pts[k].band),
            CLI_NUM(pts[k].freq_hz / 1e6), CLI_NUM(length_m), CLI_NUM(ml[k]), CLI_NUM(swr),
            CLI_NUM(tl[k]), CLI_TXT(pts[k].edge), CLI_TXT(model), CLI_NUM(per_m[k] * 100.0),
            CLI_TXT(extra[k] ? "yes" : "no"),
        };
        cli_table_row(ctx, loss_cols, NCOLS, cells);
    }
}

static int loss_run(cli_ctx *ctx, const cli_args *a)
{
    const char *cable = cli_get(a, "cable", 0);
    if (!cable)
        return cli_error(ctx, "cable", "--cable NAME, such as --cable RG-6-foam (see coaxline cables)",
                         "a cable is needed");
    size_t idx;
    if (cli_cable_index(ctx, cable, &idx)) return CLI_EXIT_USAGE;
    const cxl_catalog *cat = cli_catalog(ctx);
    const char *name = cable;
    cxl_catalog_name(cat, idx, &name);

    const char *len_text = cli_get(a, "length", 0);
    double length_m, swr = 1.0;
    if (!len_text)
        return cli_error(ctx, "length", "--length 100m", "the length of the run is needed");
    /* a run is a line: 1 mm to 1000 km, as phase and pair take */
    if (cli_line_length(ctx, "length", len_text, &length_m)) return CLI_EXIT_USAGE;
    if (read_swr(ctx, a, &swr)) return CLI_EXIT_USAGE;

    cli_freq_point pts[MAX_POINTS];
    int n = cli_freq_points(ctx, a, pts, MAX_POINTS, NULL);
    if (n < 0) return CLI_EXIT_USAGE;

    loss_setup s = { 0 };
    double per_m[MAX_POINTS], ml[MAX_POINTS], tl[MAX_POINTS];
    int extra[MAX_POINTS];
    int code = setup_model(ctx, a, cat, idx, name, &s);
    for (int k = 0; code == 0 && k < n; k++) {
        code = eval_point(ctx, &s, name, &pts[k], &per_m[k], &extra[k]);
        if (code == 0 &&
            (cxl_loss_run_db(per_m[k], length_m, swr, &ml[k], &tl[k]) != CXL_OK ||
             !isfinite(ml[k]) || !isfinite(tl[k])))
            code = cli_error(ctx, "length", "a shorter run", "the loss of this run is too large to compute");
    }
    if (code) return code;

    if (ctx->format == CLI_TEXT)
        text_output(ctx, a, name, idx, &s, length_m, swr, pts, n, per_m, ml, tl, extra);
    else
        table_output(ctx, a, name, &s, length_m, swr, pts, n, per_m, ml, tl, extra);
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_loss = {
    .name = "loss",
    .summary = "matched and total loss of a cable run at band edges or frequencies",
    .synopsis = "--cable NAME --length LEN (--band LIST | --freq F) [--swr X] [OPTIONS]",
    .opts = loss_opts,
    .run = loss_run,
    .end = loss_end,
    .batch = 1,
};
