/* cmd_vf.c - coaxline vf: velocity factor from the low-impedance dips an
 * analyzer shows on a cable of known length, open or shorted at the far
 * end; one VF per reading and a weighted fit with its uncertainty. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

/* Plausible VF range for coax; the same the library defaults to, set
 * explicitly so messages and fit agree. */
#define VF_MIN 0.5
#define VF_MAX 1.0

static const cli_optdef vf_opts[] = {
    { "length", "LEN", "physical length of the cable under test (readings without @LEN)", 0 },
    { "end", "open|short", "far end of the cable: open or short (shorted)", 0 },
    { "resonance", "[N:]F[@LEN]",
      "a low-impedance dip: its frequency, optionally its order N and the length it was read on", 1 },
    { "sweep", "FILE", "readings from a one-port sweep file: its series resonances of the --reading kind", 0 },
    { "fixture", "LEN", "known line between analyzer and cable (tee, adapters)", 0 },
    { "fixture-vf", "X", "velocity factor of that fixture", 0 },
    { "length-tol", "LEN", "how far each measured length may be off (default 5mm)", 0 },
    { "freq-step", "F", "analyzer frequency resolution (default 1kHz)", 0 },
    { "at", "F", "also give the VF at this frequency, from the trend over the readings", 1 },
    { "cable", "NAME", "catalog cable whose model corrects each reading for the lossy-line offset", 0 },
    { "reading", "zero-x|min-z|min-swr", "what the analyzer's dip is (default zero-x; the others need --cable)", 0 },
    { "analyzer-z0", "OHM", "the analyzer's reference impedance for --reading min-swr (default 50)", 0 },
    { "label", "TEXT", "name of the cable, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col vf_cols[] = {
    { "label", -1 }, { "length_m", 3 }, { "end", -1 }, { "resonance", -1 },
    { "freq_mhz", 6 }, { "vf", 4 }, { "vf_err", 5 }, { "vf_err_fit", 5 },
    { "vf_err_length", 5 }, { "vf_err_freq", 5 }, { "residual_hz", 1 },
    { "residual_mm", 1 }, { "extra_fixture_m", 3 }, { "extra_fixture_err_m", 3 },
    { "flags", -1 }, { "at_freq_mhz", 6 }, { "vf_at", 5 }, { "vf_at_err", 5 }, { "reading", -1 },
};

/* Defaults of the uncertainty budget when not given, so that no VF is
 * stated without one (common practice, no source): a tape read to 5 mm,
 * an analyzer stepped or read to 1 kHz. */
#define DEFAULT_LENGTH_TOL_M 0.005
#define DEFAULT_FREQ_STEP_HZ 1e3
#define NCOLS (sizeof vf_cols / sizeof vf_cols[0])

static const char res_expected[] =
    "a frequency such as 5MHz, numbered 2:15MHz, on another length 4.1MHz@18m";

typedef struct reading {
    const char *text;   /* as typed, for messages */
    int order;          /* 0: numbered in ascending order */
    double freq_hz, length_m;
} reading;

/* "[N:]F[@LEN]" into r; lengths without @ take default_m (0: none given). */
static int parse_reading(const cli_ctx *ctx, char *item, double default_m, reading *r)
{
    r->text = item;
    r->order = 0;
    r->length_m = default_m;
    char *colon = strchr(item, ':'), *at = strchr(item, '@'), *freq = item;
    if (at) *at = '\0';
    if (colon && (!at || colon < at)) {
        *colon = '\0';
        double n;
        if (cli_number(ctx, "resonance", item, 1.0, CXL_STUB_MAX_ORDER,
                       "an order from 1 up, as in 2:15MHz", &n))
            return CLI_EXIT_USAGE;
        if (n != floor(n))
            return cli_error(ctx, "resonance", "an order from 1 up, as in 2:15MHz",
                             "order '%s' is not a whole number", item);
        r->order = (int)n;
        freq = colon + 1;
    }
    if (cli_freq(ctx, "resonance", freq, &r->freq_hz)) return CLI_EXIT_USAGE;
    if (at) {
        if (cli_length(ctx, "resonance", at + 1, CLI_POSITIVE, &r->length_m)) return CLI_EXIT_USAGE;
    } else if (default_m <= 0.0) {
        return cli_error(ctx, "length", "--length 10m, or each reading as F@LEN",
                         "the length of the cable is needed");
    }
    /* restore the text for messages */
    if (colon && (!at || colon < at)) *colon = ':';
    if (at) *at = '@';
    return 0;
}

/* A reading the stub refused on adding (cxl_stub_add_reading: orders on
 * all or none, each dip once, ascending frequency and order on one
 * length). */
static int sequence_error(const cli_ctx *ctx, const reading *r)
{
    return cli_error(ctx, "resonance",
                     "each dip once, in ascending frequency on one length, an order on every reading or on none, rising",
                     "'%s' does not follow the readings before it", r->text);
}

/* A reading no order (or not its given order) explains with a VF in
 * [VF_MIN, VF_MAX] (cxl_stub_implausible_reading): the length, end or
 * frequency is wrong. */
static int implausible_error(const cli_ctx *ctx, cxl_stub_end end, const reading *r)
{
    char b1[48];
    if (r->order)
        return cli_error(ctx, "resonance", "an order that gives a VF from 0.50 to 1, or check --length and --end",
                         "as resonance %d, '%s' gives no VF from 0.50 to 1", r->order, r->text);
    return cli_error(ctx, "resonance", "a dip of this cable, or check --length and --end",
                     "no resonance order gives '%s' on %s m %s a VF from 0.50 to 1", r->text,
                     cli_fmt(b1, sizeof b1, r->length_m, 3), end == CXL_STUB_OPEN ? "open" : "shorted");
}

/* Readings off one fundamental.  Inferred orders that still miss are
 * refused; given ones are kept with a warning and the orders that would
 * fit best. */
static int inconsistent(const cli_ctx *ctx, const cxl_stub *stub, const reading *r,
                        size_t n, int assumed)
{
    int orders[CLI_MAX_ITEMS], better = 0;
    char fit[512] = "";
    size_t k = 0;
    if (cxl_stub_infer_orders(stub, orders, n) == CXL_OK) {
        for (size_t i = 0; i < n; i++) {
            if (orders[i] != r[i].order) better = 1;
            if (k < sizeof fit)
                k += (size_t)snprintf(fit + k, sizeof fit - k, "%s%d", i ? "," : "", orders[i]);
        }
    }
    if (assumed)
        return cli_error(ctx, "resonance", "dips of one cable, or check --length and --end",
                         "no numbering makes the readings multiples of one fundamental within 2 %% "
                         "(best: orders %s)", fit[0] ? fit : "none");
    if (better && k < sizeof fit)
        cli_warn(ctx, "readings are not consistent with one fundamental as numbered; "
                      "these orders would fit best: %s", fit);
    else
        cli_warn(ctx, "readings are not consistent with one fundamental: check the readings, "
                      "their orders, --length and --end");
    return 0;
}

/* The VF at one --at frequency. */
typedef struct vf_at {
    double freq_hz, vf, err;
    unsigned how;
} vf_at;

/* What the output needs besides the per-reading results. */
typedef struct summary {
    const char *label, *end_text;
    cxl_stub_end end;
    int one_length;          /* every reading on length_m */
    double length_m, fixture_m, fixture_vf;
    int fixture_fitted;
    double vf, vf_err, err_fit, err_length, err_freq;
    double extra_m, extra_err_m; /* fitted fixture, metres of this cable */
    unsigned flags;
    const double *shown_hz;  /* what the analyzer read, per reading */
    const char *kind_name;   /* the kind of reading */
    int corrected;           /* readings corrected with a line model */
    const char *cable;
    const char *sweep;       /* the sweep file the readings came from, or NULL */
    const vf_at *at;
    int nat;
} summary;

static void write_table(cli_ctx *ctx, const summary *sm, const cxl_stub_result *res)
{
    static const struct { unsigned bit; const char *name; } names[] = {
        { CXL_STUB_FLAG_INCONSISTENT, "inconsistent" },
        { CXL_STUB_FLAG_VF_RANGE, "vf_out_of_range" },
        { CXL_STUB_FLAG_ORDERS_ASSUMED, "orders_numbered" },
        { CXL_STUB_FLAG_FIXTURE_FITTED, "fixture_fitted" },
        { CXL_STUB_FLAG_TREND, "trend" },
    };
    char order_text[16], flag_text[96] = "";
    for (size_t k = 0; k < sizeof names / sizeof names[0]; k++)
        if (sm->flags & names[k].bit) {
            if (flag_text[0]) strcat(flag_text, " ");
            strcat(flag_text, names[k].name);
        }
    for (size_t i = 0; i < cxl_stub_result_count(res); i++) {
        double len, f, vi, rhz, rm;
        int order;
        cxl_stub_result_reading(res, i, &len, &f, &order, &vi, &rhz, &rm);
        f = sm->shown_hz[i];
        snprintf(order_text, sizeof order_text, "%d", order);
        cli_cell cells[NCOLS] = {
            CLI_TXT(sm->label), CLI_NUM(len), CLI_TXT(sm->end_text), CLI_TXT(order_text),
            CLI_NUM(f / 1e6), CLI_NUM(vi), CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
            CLI_NUM(rhz), CLI_NUM(rm * 1e3), CLI_NONE, CLI_NONE, CLI_NONE,
            CLI_NONE, CLI_NONE, CLI_NONE, CLI_TXT(sm->kind_name),
        };
        cli_table_row(ctx, vf_cols, NCOLS, cells);
    }
    cli_cell fit[NCOLS] = {
        CLI_TXT(sm->label), sm->one_length ? CLI_NUM(sm->length_m) : CLI_NONE,
        CLI_TXT(sm->end_text), CLI_TXT("fit"), CLI_NONE, CLI_NUM(sm->vf), CLI_NUM(sm->vf_err),
        CLI_NUM(sm->err_fit), CLI_NUM(sm->err_length), CLI_NUM(sm->err_freq), CLI_NONE, CLI_NONE,
        sm->fixture_fitted ? CLI_NUM(sm->extra_m) : CLI_NONE,
        sm->fixture_fitted ? CLI_NUM(sm->extra_err_m) : CLI_NONE, CLI_TXT(flag_text),
        CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
    };
    cli_table_row(ctx, vf_cols, NCOLS, fit);
    for (int i = 0; i < sm->nat; i++) {
        const vf_at *t = &sm->at[i];
        const char *how = t->how & CXL_STUB_AT_TREND
                              ? (t->how & CXL_STUB_AT_EXTRAPOLATED ? "trend extrapolated" : "trend")
                              : "drift_allowance";
        cli_cell at[NCOLS] = {
            CLI_TXT(sm->label), sm->one_length ? CLI_NUM(sm->length_m) : CLI_NONE,
            CLI_TXT(sm->end_text), CLI_TXT("at"), CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
            CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE, CLI_TXT(how),
            CLI_NUM(t->freq_hz / 1e6), CLI_NUM(t->vf), CLI_NUM(t->err), CLI_NONE,
        };
        cli_table_row(ctx, vf_cols, NCOLS, at);
    }
}

/* Text, after the readings: how they were taken and the fit. */
static void write_text_fit(cli_ctx *ctx, const summary *sm)
{
    char b1[96], b2[96], b3[48];
    FILE *o = ctx->out;
    if (sm->flags & CXL_STUB_FLAG_ORDERS_ASSUMED)
        fprintf(o, "  orders            inferred: those that best fit one fundamental on each length\n");
    else if (sm->sweep)
        fprintf(o, "  orders            from the spacing of the sweep's resonances\n");
    else
        fprintf(o, "  orders            as given\n");
    if (sm->sweep)
        fprintf(o, "  sweep             %s: its series resonances of this kind are the readings\n",
                sm->sweep);
    fprintf(o, "  reading           %s%s%s%s\n", sm->kind_name,
            sm->corrected ? ", each corrected for the lossy-line offset (model of cable " : "",
            sm->corrected ? sm->cable : "", sm->corrected ? ")" : "");
    /* 5 decimals: a good fit's uncertainty is often below 0.0001 */
    fprintf(o, "  fitted VF         %s +/- %s\n", cli_fmt(b1, sizeof b1, sm->vf, 5),
            cli_fmt(b2, sizeof b2, sm->vf_err, 5));
    fprintf(o, "  uncertainty       fit %s, length %s, frequency %s (root sum of squares)\n",
            cli_fmt(b1, sizeof b1, sm->err_fit, 5), cli_fmt(b2, sizeof b2, sm->err_length, 5),
            cli_fmt(b3, sizeof b3, sm->err_freq, 5));
    for (int i = 0; i < sm->nat; i++) {
        const vf_at *t = &sm->at[i];
        fprintf(o, "  VF at %-11s %s +/- %s  %s\n", cli_fmt(b3, sizeof b3, t->freq_hz / 1e6, 3),
                cli_fmt(b1, sizeof b1, t->vf, 5), cli_fmt(b2, sizeof b2, t->err, 5),
                t->how & CXL_STUB_AT_TREND
                    ? (t->how & CXL_STUB_AT_EXTRAPOLATED ? "trend a - b/sqrt(f), extrapolated"
                                                          : "trend a - b/sqrt(f) over the readings")
                    : "nearest reading; trend unknown, widened by the drift allowance");
    }
    if (sm->fixture_fitted)
        fprintf(o, "  extra fixture     %s of this cable +/- %s mm, fitted across the lengths\n",
                cli_fmt_length(ctx, b1, sizeof b1, sm->extra_m),
                cli_fmt(b2, sizeof b2, sm->extra_err_m * 1e3, 1));
    else
        fprintf(o, "  extra fixture     not fitted: all readings are on one length, where the VF\n"
                   "                    cannot be told from an unknown fixture; trim a known\n"
                   "                    length, read again and give those readings as F@LEN\n");
}

static void write_text(cli_ctx *ctx, const summary *sm, const cxl_stub_result *res)
{
    char b1[96], b2[96], b3[48], b4[48], b5[48];
    FILE *o = ctx->out;
    const char *end = sm->end == CXL_STUB_OPEN ? "open" : "shorted";
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "vf%s%s\n", sm->label[0] ? ": " : "", sm->label);
    if (sm->one_length)
        fprintf(o, "  cable             %s, far end %s\n",
                cli_fmt_length(ctx, b1, sizeof b1, sm->length_m), end);
    else
        fprintf(o, "  cable             read on several lengths, far end %s\n", end);
    if (sm->fixture_m > 0.0)
        fprintf(o, "  known fixture     %s at VF %s\n",
                cli_fmt_length(ctx, b1, sizeof b1, sm->fixture_m),
                cli_fmt(b2, sizeof b2, sm->fixture_vf, 4));
    fprintf(o, "  %-5s %16s %11s  %-6s   %s\n", "order", "resonance", "length", "VF", "residual");
    for (size_t i = 0; i < cxl_stub_result_count(res); i++) {
        double len, f, vi, rhz, rm;
        int order;
        cxl_stub_result_reading(res, i, &len, &f, &order, &vi, &rhz, &rm);
        f = sm->shown_hz[i];
        fprintf(o, "  %-5d %12s MHz %9s m  %s   %s Hz  %s mm\n", order,
                cli_fmt(b1, sizeof b1, f / 1e6, 6), cli_fmt(b2, sizeof b2, len, 3),
                cli_fmt(b3, sizeof b3, vi, 4), cli_fmt_signed(b4, sizeof b4, rhz, 0),
                cli_fmt_signed(b5, sizeof b5, rm * 1e3, 1));
    }
    write_text_fit(ctx, sm);
}

/* What the rows of a batch reuse (ctx->state): the stub and its result,
 * refitted row after row, and the cables' line models. */
typedef struct vf_state {
    cxl_stub *stub;
    cxl_stub_result *res;
    cli_cable_cache *cables;
} vf_state;

static int vf_end(cli_ctx *ctx)
{
    vf_state *vs = ctx->state;
    if (vs) {
        cxl_stub_free(vs->stub);
        cxl_stub_result_free(vs->res);
        cli_cable_cache_free(vs->cables);
        free(vs);
    }
    ctx->state = NULL;
    return CLI_EXIT_OK;
}

/* The batch's state, made on the first row; NULL after an error line. */
static vf_state *vf_state_of(cli_ctx *ctx)
{
    vf_state *vs = ctx->state;
    if (vs) return vs;
    vs = calloc(1, sizeof *vs);
    if (!vs || cxl_stub_new(CXL_STUB_OPEN, &vs->stub) != CXL_OK ||
        cxl_stub_result_new(&vs->res) != CXL_OK) {
        if (vs) cxl_stub_free(vs->stub);
        free(vs);
        cli_error(ctx, "resonance", NULL, "%s", cxl_strerror(CXL_ENOMEM));
        return NULL;
    }
    ctx->state = vs;
    return vs;
}

/* Readings into the emptied stub and its fit into res.  freq_hz[i]
 * replaces the readings' frequencies, orders (may be NULL) their orders.
 * A refused reading is reported by its index. */
static int fit_readings(const cli_ctx *ctx, cxl_stub_end end, const reading *r, int n,
                        const double *freq_hz, const int *orders, double fixture_m,
                        double fixture_vf, double length_tol_m, double step_hz,
                        cxl_stub *stub, cxl_stub_result *res)
{
    cxl_status st = cxl_stub_reset(stub, end);
    if (st == CXL_OK) st = cxl_stub_set_fixture(stub, fixture_m, fixture_vf);
    if (st == CXL_OK) st = cxl_stub_set_tolerances(stub, length_tol_m, step_hz);
    if (st == CXL_OK) st = cxl_stub_set_vf_range(stub, VF_MIN, VF_MAX);
    if (st == CXL_OK) st = cxl_stub_set_orders(stub, CXL_STUB_ORDERS_BEST_FIT);
    if (st != CXL_OK) return cli_error(ctx, "resonance", NULL, "%s", cxl_strerror(st));
    for (int i = 0; i < n; i++) {
        st = cxl_stub_add_reading(stub, r[i].length_m, freq_hz[i], orders ? orders[i] : r[i].order);
        if (st != CXL_OK) {
            return st == CXL_EINVAL ? sequence_error(ctx, &r[i])
                                    : cli_error(ctx, "resonance", res_expected, "'%s': %s",
                                                r[i].text, cxl_strerror(st));
        }
    }
    size_t bad;
    if (cxl_stub_implausible_reading(stub, &bad) == CXL_OK)
        return implausible_error(ctx, end, &r[bad]);
    st = cxl_stub_fit_into(stub, res);
    if (st != CXL_OK) {
        if (st == CXL_EINCONSISTENT)
            return cli_error(ctx, "resonance", "readings where a longer cable resonates lower",
                             "the readings contradict each other: a longer length shows a shorter "
                             "electrical length, or the fitted fixture is longer than a reading");
        return cli_error(ctx, "resonance", res_expected, "%s", cxl_strerror(st));
    }
    return 0;
}

/* --cable: move each reading back by the offset of its kind of dip on the
 * modelled line (orders from the first fit), into corr_hz. */
static int correct(const cli_ctx *ctx, const cxl_loss_model *model, cxl_stub_end end,
                   const reading *r, int n, const cxl_stub_result *res, cxl_dip_kind kind,
                   double ref_ohm, const char *kind_name, double *corr_hz, int *orders)
{
    for (int i = 0; i < n; i++) {
        double dip, wave;
        cxl_stub_result_reading(res, (size_t)i, NULL, NULL, &orders[i], NULL, NULL, NULL);
        cxl_status st = cxl_transfer_stub_dip(model, CXL_LOSS_EXTRAPOLATE, end, orders[i],
                                              r[i].length_m, kind, ref_ohm, &dip, &wave);
        if (st == CXL_ENOCONV && kind != CXL_DIP_ZERO_X)
            return cli_error(ctx, "reading", "zero-x or min-z for a line whose impedance is at or below the analyzer's",
                             "the line model shows no %s dip near '%s'", kind_name, r[i].text);
        if (st != CXL_OK)
            return cli_error(ctx, "cable", "a cable the model can follow at these readings",
                             "at '%s': %s", r[i].text, cxl_strerror(st));
        corr_hz[i] = r[i].freq_hz * wave / dip;
    }
    return 0;
}

/* The options of one invocation, apart from the readings and --at. */
typedef struct vf_setup {
    const char *end_text, *cable, *kind_name;
    cxl_stub_end end;
    double length_m, fixture_m, fixture_vf, length_tol_m, step_hz, ref_ohm;
    cxl_dip_kind kind;
} vf_setup;

static int read_end(cli_ctx *ctx, const cli_args *a, vf_setup *v)
{
    v->end_text = cli_get(a, "end", 0);
    if (!v->end_text)
        return cli_error(ctx, "end", "open or short", "the far end of the cable is needed");
    if (strcmp(v->end_text, "open") == 0) v->end = CXL_STUB_OPEN;
    else if (strcmp(v->end_text, "short") == 0) v->end = CXL_STUB_SHORT;
    else return cli_error(ctx, "end", "open or short", "unknown end '%s'", v->end_text);
    return 0;
}

static int read_fixture(cli_ctx *ctx, const cli_args *a, vf_setup *v)
{
    const char *fixture = cli_get(a, "fixture", 0), *fvf = cli_get(a, "fixture-vf", 0);
    if (!fixture) {
        if (fvf)
            return cli_error(ctx, "fixture-vf", "--fixture 0.15m --fixture-vf 0.66",
                             "given without --fixture");
        return 0;
    }
    if (cli_length(ctx, "fixture", fixture, CLI_NONNEG, &v->fixture_m)) return CLI_EXIT_USAGE;
    if (!fvf)
        return cli_error(ctx, "fixture-vf", "--fixture 0.15m --fixture-vf 0.66",
                         "the fixture's velocity factor is needed");
    return cli_vf(ctx, "fixture-vf", fvf, &v->fixture_vf) ? CLI_EXIT_USAGE : 0;
}

/* Everything but the readings and --at into v. */
static int read_setup(cli_ctx *ctx, const cli_args *a, vf_setup *v)
{
    *v = (vf_setup){ .fixture_vf = 1.0, .length_tol_m = DEFAULT_LENGTH_TOL_M,
                     .step_hz = DEFAULT_FREQ_STEP_HZ };
    if (read_end(ctx, a, v)) return CLI_EXIT_USAGE;
    const char *t = cli_get(a, "length", 0);
    if (t && cli_length(ctx, "length", t, CLI_POSITIVE, &v->length_m)) return CLI_EXIT_USAGE;
    if (read_fixture(ctx, a, v)) return CLI_EXIT_USAGE;
    t = cli_get(a, "length-tol", 0);
    if (t && cli_length(ctx, "length-tol", t, CLI_NONNEG, &v->length_tol_m)) return CLI_EXIT_USAGE;
    t = cli_get(a, "freq-step", 0);
    if (t && cli_freq(ctx, "freq-step", t, &v->step_hz)) return CLI_EXIT_USAGE;
    v->cable = cli_get(a, "cable", 0);
    return cli_reading_kind(ctx, a, v->cable != NULL, &v->kind, &v->ref_ohm, &v->kind_name)
               ? CLI_EXIT_USAGE : 0;
}

/* The readings of one invocation, as typed or from a sweep file. */
typedef struct vf_readings {
    char buf[1024];
    reading r[CLI_MAX_ITEMS];
    double shown[CLI_MAX_ITEMS], corr[CLI_MAX_ITEMS];
    int orders[CLI_MAX_ITEMS];
    char sweep_text[CLI_MAX_ITEMS][48];
    const char *sweep;
    int n;
} vf_readings;

/* --sweep: the file's resonances, numbered from their spacing when it
 * shows two or more (else by the fit, as typed readings). */
static int sweep_readings(cli_ctx *ctx, const cli_args *a, vf_setup *v, vf_readings *rd)
{
    if (cli_count(a, "resonance"))
        return cli_error(ctx, "sweep", "--sweep FILE or --resonance F, not both",
                         "given with --resonance");
    if (v->length_m <= 0.0)
        return cli_error(ctx, "length", "--length 10m --sweep stub.s1p",
                         "the length of the cable is needed");
    double spacing;
    if (cli_sweep_readings(ctx, rd->sweep, v->kind, v->ref_ohm, v->end, rd->shown, rd->orders,
                           CLI_MAX_ITEMS, &rd->n, &spacing))
        return CLI_EXIT_USAGE;
    int numbered = 1;
    for (int i = 0; i < rd->n; i++) numbered = numbered && rd->orders[i] > 0;
    for (int i = 0; i < rd->n; i++) {
        char b1[40];
        snprintf(rd->sweep_text[i], sizeof rd->sweep_text[i], "%sMHz",
                 cli_fmt(b1, sizeof b1, rd->shown[i] / 1e6, 6));
        rd->r[i] = (reading){ rd->sweep_text[i], numbered ? rd->orders[i] : 0, rd->shown[i],
                              v->length_m };
    }
    /* the file's point spacing is the analyzer's step */
    if (!cli_count(a, "freq-step")) v->step_hz = spacing;
    return 0;
}

static int read_readings(cli_ctx *ctx, const cli_args *a, vf_setup *v, vf_readings *rd)
{
    rd->sweep = cli_get(a, "sweep", 0);
    if (rd->sweep) return sweep_readings(ctx, a, v, rd);
    const char *items[CLI_MAX_ITEMS];
    rd->n = cli_items(ctx, a, "resonance", rd->buf, sizeof rd->buf, items, CLI_MAX_ITEMS);
    if (rd->n < 0) return CLI_EXIT_USAGE;
    if (rd->n == 0)
        return cli_error(ctx, "resonance", res_expected, "at least one reading is needed");
    for (int i = 0; i < rd->n; i++) {
        if (parse_reading(ctx, (char *)items[i], v->length_m, &rd->r[i])) return CLI_EXIT_USAGE;
        rd->shown[i] = rd->r[i].freq_hz;
    }
    return 0;
}

/* The fit of the readings into vs->res; with --cable, a second fit of
 * the corrected readings.  *first_flags: the first fit's flags. */
static int fit_all(cli_ctx *ctx, const vf_setup *v, vf_readings *rd, vf_state *vs,
                   unsigned *first_flags)
{
    const cxl_loss_model *model = NULL;
    if (v->cable) {
        size_t idx;
        if (cli_cable_index(ctx, v->cable, &idx)) return CLI_EXIT_USAGE;
        if (cli_cable_cache_model(&vs->cables, cli_catalog(ctx), idx, &model) != CXL_OK)
            return cli_error(ctx, "cable", "a cable with inner and dielectric diameters (coaxline cables)",
                             "cable '%s' has no geometry to model", v->cable);
    }
    int rc = fit_readings(ctx, v->end, rd->r, rd->n, rd->shown, NULL, v->fixture_m,
                          v->fixture_vf, v->length_tol_m, v->step_hz, vs->stub, vs->res);
    *first_flags = 0;
    if (!rc && model) {
        /* orders from the readings as read; then fit the corrected ones */
        cxl_stub_result_flags(vs->res, first_flags);
        rc = correct(ctx, model, v->end, rd->r, rd->n, vs->res, v->kind, v->ref_ohm,
                     v->kind_name, rd->corr, rd->orders);
        if (!rc)
            rc = fit_readings(ctx, v->end, rd->r, rd->n, rd->corr, rd->orders, v->fixture_m,
                              v->fixture_vf, v->length_tol_m, v->step_hz, vs->stub, vs->res);
    }
    return rc;
}

/* The fit's figures into sm; 1 when all of them are finite. */
static int summarize(const cxl_stub_result *res, unsigned first_flags, const vf_readings *rd,
                     summary *sm)
{
    double x_free;
    cxl_stub_result_vf(res, &sm->vf, &sm->vf_err);
    cxl_stub_result_vf_budget(res, &sm->err_fit, &sm->err_length, &sm->err_freq);
    cxl_stub_result_flags(res, &sm->flags);
    /* orders the corrected fit was given came from the first one */
    sm->flags |= first_flags & CXL_STUB_FLAG_ORDERS_ASSUMED;
    sm->fixture_fitted =
        cxl_stub_result_fixture(res, &x_free, &sm->extra_err_m, &sm->extra_m) == CXL_OK;
    sm->extra_err_m *= sm->vf; /* free-space metres to metres of this cable */
    for (int i = 1; i < rd->n; i++)
        if (rd->r[i].length_m != rd->r[0].length_m) sm->one_length = 0;
    int finite = isfinite(sm->vf) && isfinite(sm->vf_err) && isfinite(sm->extra_m) &&
                 isfinite(sm->extra_err_m);
    for (size_t i = 0; i < cxl_stub_result_count(res); i++) {
        double vi, rhz, rm;
        cxl_stub_result_reading(res, i, NULL, NULL, NULL, &vi, &rhz, &rm);
        finite = finite && isfinite(vi) && isfinite(rhz) && isfinite(rm);
    }
    return finite;
}

/* The VF at each --at frequency into at[]. */
static int vf_at_all(cli_ctx *ctx, const cxl_stub_result *res, vf_at *at, int nat)
{
    for (int i = 0; i < nat; i++) {
        char b1[48];
        cxl_status st = cxl_stub_result_vf_at(res, at[i].freq_hz, &at[i].vf, &at[i].err, &at[i].how);
        if (st != CXL_OK)
            return cli_error(ctx, "at", "a frequency near the readings, 100 kHz or more",
                             "no VF at %s MHz from these readings (%s)",
                             cli_fmt(b1, sizeof b1, at[i].freq_hz / 1e6, 6), cxl_strerror(st));
    }
    return 0;
}

/* Refusals and warnings on the fit, then the output. */
static int vf_report(cli_ctx *ctx, const summary *sm, const vf_readings *rd, const vf_state *vs,
                     int finite)
{
    if (!finite)
        return cli_error(ctx, "resonance", res_expected, "the readings give no finite result");
    if ((sm->flags & CXL_STUB_FLAG_INCONSISTENT) &&
        inconsistent(ctx, vs->stub, rd->r, (size_t)rd->n,
                     (sm->flags & CXL_STUB_FLAG_ORDERS_ASSUMED) != 0))
        return CLI_EXIT_USAGE;
    if (sm->flags & CXL_STUB_FLAG_VF_RANGE)
        cli_warn(ctx, "a velocity factor outside 0.50 to 1: check the readings, --length and --end");
    if ((sm->flags & CXL_STUB_FLAG_TREND) && sm->nat == 0)
        cli_warn(ctx, "the readings' VF changes with frequency beyond their uncertainty, so the "
                      "fitted VF is an average over them: ask for the VF where the line works, "
                      "e.g. --at 1.83MHz");
    if (ctx->format == CLI_TEXT) write_text(ctx, sm, vs->res);
    else write_table(ctx, sm, vs->res);
    return 0;
}

static int vf_run(cli_ctx *ctx, const cli_args *a)
{
    vf_setup v;
    if (read_setup(ctx, a, &v)) return CLI_EXIT_USAGE;
    char abuf[1024];
    const char *aitems[CLI_MAX_ITEMS];
    vf_at at[CLI_MAX_ITEMS];
    int nat = cli_items(ctx, a, "at", abuf, sizeof abuf, aitems, CLI_MAX_ITEMS);
    if (nat < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < nat; i++)
        if (cli_freq(ctx, "at", aitems[i], &at[i].freq_hz)) return CLI_EXIT_USAGE;
    vf_readings rd;
    if (read_readings(ctx, a, &v, &rd)) return CLI_EXIT_USAGE;
    vf_state *vs = vf_state_of(ctx);
    unsigned first_flags;
    if (!vs || fit_all(ctx, &v, &rd, vs, &first_flags)) return CLI_EXIT_USAGE;
    summary sm = { .label = cli_label(a), .end_text = v.end_text, .end = v.end, .one_length = 1,
                   .length_m = rd.r[0].length_m, .fixture_m = v.fixture_m,
                   .fixture_vf = v.fixture_vf, .shown_hz = rd.shown, .kind_name = v.kind_name,
                   .corrected = v.cable != NULL, .cable = v.cable ? v.cable : "",
                   .sweep = rd.sweep, .at = at, .nat = nat };
    int finite = summarize(vs->res, first_flags, &rd, &sm);
    if (vf_at_all(ctx, vs->res, at, nat) || vf_report(ctx, &sm, &rd, vs, finite))
        return CLI_EXIT_USAGE;
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_vf = {
    .name = "vf",
    .summary = "velocity factor from stub resonances on a known length",
    .synopsis = "--length LEN --end open|short (--resonance [N:]F[@LEN] ... | --sweep FILE) "
                "[OPTIONS]",
    .opts = vf_opts,
    .run = vf_run,
    .end = vf_end,
    .batch = 1,
};
