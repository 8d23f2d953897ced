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
    { "fixture", "LEN", "known line between analyzer and cable (tee, adapters)", 0 },
    { "fixture-vf", "X", "velocity factor of that fixture", 0 },
    { "length-tol", "LEN", "how far each measured length may be off (uncertainty budget)", 0 },
    { "freq-step", "F", "analyzer frequency resolution (uncertainty budget)", 0 },
    { "label", "TEXT", "name of the cable, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col vf_cols[] = {
    { "label", -1 }, { "length_m", 3 }, { "end", -1 }, { "resonance", -1 },
    { "freq_mhz", 6 }, { "vf", 4 }, { "vf_err", 5 }, { "vf_err_fit", 5 },
    { "vf_err_length", 5 }, { "vf_err_freq", 5 }, { "residual_hz", 1 },
    { "residual_mm", 1 }, { "extra_fixture_m", 3 }, { "extra_fixture_err_m", 3 },
    { "flags", -1 },
};
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

/* Readings on one length must rise in frequency (and in order). */
static int check_sequence(const cli_ctx *ctx, const reading *r, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if ((r[i].order == 0) != (r[0].order == 0))
            return cli_error(ctx, "resonance", "an order on every reading or on none, e.g. 1:5MHz,3:25MHz",
                             "'%s' and '%s' differ in giving an order", r[0].text, r[i].text);
        for (size_t j = 0; j < i; j++) {
            if (r[j].length_m != r[i].length_m) continue;
            if (r[i].freq_hz == r[j].freq_hz)
                return cli_error(ctx, "resonance", "each dip once, in ascending frequency",
                                 "'%s' repeats '%s'", r[i].text, r[j].text);
            if (r[i].freq_hz < r[j].freq_hz)
                return cli_error(ctx, "resonance", "readings on one length in ascending frequency",
                                 "'%s' comes after the higher '%s'", r[i].text, r[j].text);
            if (r[i].order != 0 && r[i].order <= r[j].order)
                return cli_error(ctx, "resonance", "orders rising with frequency, e.g. 1:5MHz,3:25MHz",
                                 "'%s' has an order not above that of '%s'", r[i].text, r[j].text);
        }
    }
    return 0;
}

/* A reading no order (or not its given order) can explain with a VF in
 * [VF_MIN, VF_MAX]: the length, end or frequency is wrong. */
static int check_possible(const cli_ctx *ctx, cxl_stub_end end, const reading *r,
                          double fixture_m, double fixture_vf)
{
    char b1[48], b2[48], b3[48];
    const char *point = end == CXL_STUB_OPEN ? "quarter-wave" : "half-wave";
    double lowest_hz, vf = 0.0;
    if (cxl_stub_resonance_freq(end, 1, r->length_m, VF_MIN, fixture_m, fixture_vf,
                                &lowest_hz) == CXL_OK && r->freq_hz < lowest_hz)
        return cli_error(ctx, "resonance", "a dip at or above the first resonance, or check --length and --end",
                         "'%s' is below %s MHz, the %s point of %s m %s with VF %s or more",
                         r->text, cli_fmt(b1, sizeof b1, lowest_hz / 1e6, 6), point,
                         cli_fmt(b2, sizeof b2, r->length_m, 3),
                         end == CXL_STUB_OPEN ? "open" : "shorted", cli_fmt(b3, sizeof b3, VF_MIN, 2));
    if (r->order) {
        cxl_status st = cxl_stub_vf_from_resonance(end, r->order, r->length_m, r->freq_hz,
                                                   fixture_m, fixture_vf, &vf);
        if (st != CXL_OK || vf < VF_MIN)
            return cli_error(ctx, "resonance", "an order that gives a VF from 0.50 to 1, or check --length and --end",
                             "as resonance %d, '%s' %s", r->order, r->text,
                             st != CXL_OK ? "needs a VF above 1" : "gives a VF below 0.50");
        return 0;
    }
    for (int n = 1; n <= CXL_STUB_MAX_ORDER; n++) {
        if (cxl_stub_vf_from_resonance(end, n, r->length_m, r->freq_hz, fixture_m, fixture_vf,
                                       &vf) != CXL_OK)
            continue; /* needs a VF above 1: try the next order */
        if (vf >= VF_MIN) return 0;
        break;
    }
    return cli_error(ctx, "resonance", "a dip of this cable, or check --length and --end",
                     "no resonance order gives '%s' on %s m a VF from 0.50 to 1", r->text,
                     cli_fmt(b1, sizeof b1, r->length_m, 3));
}

/* One warning for readings off one fundamental, with the numbering that
 * would fit when the readings were numbered in order. */
static void warn_inconsistent(const cli_ctx *ctx, const cxl_stub *stub, const reading *r,
                              size_t n, int assumed)
{
    int orders[CLI_MAX_ITEMS], better = 0;
    char fit[512] = "";
    size_t k = 0;
    if (assumed && cxl_stub_infer_orders(stub, orders, n) == CXL_OK) {
        for (size_t i = 0; i < n; i++) {
            int o = 0;
            for (size_t j = 0; j <= i; j++) o += r[j].length_m == r[i].length_m;
            if (orders[i] != o) better = 1;
            if (k < sizeof fit)
                k += (size_t)snprintf(fit + k, sizeof fit - k, "%s%d:%s", i ? "," : "", orders[i],
                                      r[i].text);
        }
    }
    if (better && k < sizeof fit)
        cli_warn(ctx, "readings are not consistent with one fundamental as numbered 1, 2, ...; "
                      "these orders would fit: --resonance %s", fit);
    else
        cli_warn(ctx, "readings are not consistent with one fundamental: check the readings, "
                      "their orders, --length and --end");
}

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
} summary;

static void write_table(cli_ctx *ctx, const summary *sm, const cxl_stub_result *res)
{
    static const struct { unsigned bit; const char *name; } names[] = {
        { CXL_STUB_FLAG_INCONSISTENT, "inconsistent" },
        { CXL_STUB_FLAG_VF_RANGE, "vf_out_of_range" },
        { CXL_STUB_FLAG_ORDERS_ASSUMED, "orders_numbered" },
        { CXL_STUB_FLAG_FIXTURE_FITTED, "fixture_fitted" },
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
        snprintf(order_text, sizeof order_text, "%d", order);
        cli_cell cells[NCOLS] = {
            CLI_TXT(sm->label), CLI_NUM(len), CLI_TXT(sm->end_text), CLI_TXT(order_text),
            CLI_NUM(f / 1e6), CLI_NUM(vi), CLI_NONE, CLI_NONE, CLI_NONE, CLI_NONE,
            CLI_NUM(rhz), CLI_NUM(rm * 1e3), CLI_NONE, CLI_NONE, CLI_NONE,
        };
        cli_table_row(ctx, vf_cols, NCOLS, cells);
    }
    cli_cell fit[NCOLS] = {
        CLI_TXT(sm->label), sm->one_length ? CLI_NUM(sm->length_m) : CLI_NONE,
        CLI_TXT(sm->end_text), CLI_TXT("fit"), CLI_NONE, CLI_NUM(sm->vf), CLI_NUM(sm->vf_err),
        CLI_NUM(sm->err_fit), CLI_NUM(sm->err_length), CLI_NUM(sm->err_freq), CLI_NONE, CLI_NONE,
        sm->fixture_fitted ? CLI_NUM(sm->extra_m) : CLI_NONE,
        sm->fixture_fitted ? CLI_NUM(sm->extra_err_m) : CLI_NONE, CLI_TXT(flag_text),
    };
    cli_table_row(ctx, vf_cols, NCOLS, fit);
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
        fprintf(o, "  %-5d %12s MHz %9s m  %s   %s Hz  %s mm\n", order,
                cli_fmt(b1, sizeof b1, f / 1e6, 6), cli_fmt(b2, sizeof b2, len, 3),
                cli_fmt(b3, sizeof b3, vi, 4), cli_fmt_signed(b4, sizeof b4, rhz, 0),
                cli_fmt_signed(b5, sizeof b5, rm * 1e3, 1));
    }
    if (sm->flags & CXL_STUB_FLAG_ORDERS_ASSUMED)
        fprintf(o, "  orders            numbered 1, 2, ... in ascending frequency on each length\n");
    /* 5 decimals: a good fit's uncertainty is often below 0.0001 */
    fprintf(o, "  fitted VF         %s +/- %s\n", cli_fmt(b1, sizeof b1, sm->vf, 5),
            cli_fmt(b2, sizeof b2, sm->vf_err, 5));
    fprintf(o, "  uncertainty       fit %s, length %s, frequency %s (root sum of squares)\n",
            cli_fmt(b1, sizeof b1, sm->err_fit, 5), cli_fmt(b2, sizeof b2, sm->err_length, 5),
            cli_fmt(b3, sizeof b3, sm->err_freq, 5));
    if (sm->fixture_fitted)
        fprintf(o, "  extra fixture     %s of this cable +/- %s mm, fitted across the lengths\n",
                cli_fmt_length(ctx, b1, sizeof b1, sm->extra_m),
                cli_fmt(b2, sizeof b2, sm->extra_err_m * 1e3, 1));
    else
        fprintf(o, "  extra fixture     not fitted: all readings are on one length, where the VF\n"
                   "                    cannot be told from an unknown fixture; trim a known\n"
                   "                    length, read again and give those readings as F@LEN\n");
}

static int vf_run(cli_ctx *ctx, const cli_args *a)
{
    const char *end_text = cli_get(a, "end", 0);
    cxl_stub_end end;
    if (!end_text)
        return cli_error(ctx, "end", "open or short", "the far end of the cable is needed");
    if (strcmp(end_text, "open") == 0) end = CXL_STUB_OPEN;
    else if (strcmp(end_text, "short") == 0) end = CXL_STUB_SHORT;
    else return cli_error(ctx, "end", "open or short", "unknown end '%s'", end_text);

    double length_m = 0.0, fixture_m = 0.0, fixture_vf = 1.0, length_tol_m = 0.0, step_hz = 0.0;
    if (cli_count(a, "length") &&
        cli_length(ctx, "length", cli_get(a, "length", 0), CLI_POSITIVE, &length_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "fixture")) {
        if (cli_length(ctx, "fixture", cli_get(a, "fixture", 0), CLI_NONNEG, &fixture_m))
            return CLI_EXIT_USAGE;
        if (!cli_count(a, "fixture-vf"))
            return cli_error(ctx, "fixture-vf", "--fixture 0.15m --fixture-vf 0.66",
                             "the fixture's velocity factor is needed");
        if (cli_vf(ctx, "fixture-vf", cli_get(a, "fixture-vf", 0), &fixture_vf)) return CLI_EXIT_USAGE;
    } else if (cli_count(a, "fixture-vf")) {
        return cli_error(ctx, "fixture-vf", "--fixture 0.15m --fixture-vf 0.66",
                         "given without --fixture");
    }
    if (cli_count(a, "length-tol") &&
        cli_length(ctx, "length-tol", cli_get(a, "length-tol", 0), CLI_NONNEG, &length_tol_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "freq-step")) {
        if (cli_freq(ctx, "freq-step", cli_get(a, "freq-step", 0), &step_hz)) return CLI_EXIT_USAGE;
    }

    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    reading r[CLI_MAX_ITEMS];
    int n = cli_items(ctx, a, "resonance", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (n < 0) return CLI_EXIT_USAGE;
    if (n == 0)
        return cli_error(ctx, "resonance", res_expected, "at least one reading is needed");
    for (int i = 0; i < n; i++)
        if (parse_reading(ctx, (char *)items[i], length_m, &r[i])) return CLI_EXIT_USAGE;
    if (check_sequence(ctx, r, (size_t)n)) return CLI_EXIT_USAGE;
    for (int i = 0; i < n; i++)
        if (check_possible(ctx, end, &r[i], fixture_m, fixture_vf)) return CLI_EXIT_USAGE;

    cxl_stub *stub = NULL;
    cxl_stub_result *res = NULL;
    cxl_status st = cxl_stub_new(end, &stub);
    if (st == CXL_OK) st = cxl_stub_set_fixture(stub, fixture_m, fixture_vf);
    if (st == CXL_OK) st = cxl_stub_set_tolerances(stub, length_tol_m, step_hz);
    if (st == CXL_OK) st = cxl_stub_set_vf_range(stub, VF_MIN, VF_MAX);
    for (int i = 0; i < n && st == CXL_OK; i++)
        st = cxl_stub_add_reading(stub, r[i].length_m, r[i].freq_hz, r[i].order);
    if (st == CXL_OK) st = cxl_stub_fit(stub, &res);
    if (st != CXL_OK) {
        cxl_stub_free(stub);
        if (st == CXL_EINCONSISTENT)
            return cli_error(ctx, "resonance", "readings where a longer cable resonates lower",
                             "the readings contradict each other: a longer length shows a shorter "
                             "electrical length, or the fitted fixture is longer than a reading");
        if (st == CXL_ERANGE)
            return cli_error(ctx, "resonance", res_expected,
                             "a reading gives a VF outside 0.50 to 1 for every order");
        return cli_error(ctx, "resonance", res_expected, "%s", cxl_strerror(st));
    }

    summary sm = { .label = cli_label(a), .end_text = end_text, .end = end, .one_length = 1,
                   .length_m = r[0].length_m, .fixture_m = fixture_m, .fixture_vf = fixture_vf };
    double x_free;
    cxl_stub_result_vf(res, &sm.vf, &sm.vf_err);
    cxl_stub_result_vf_budget(res, &sm.err_fit, &sm.err_length, &sm.err_freq);
    cxl_stub_result_flags(res, &sm.flags);
    sm.fixture_fitted = cxl_stub_result_fixture(res, &x_free, &sm.extra_err_m, &sm.extra_m) == CXL_OK;
    sm.extra_err_m *= sm.vf; /* free-space metres to metres of this cable */
    for (int i = 1; i < n; i++)
        if (r[i].length_m != r[0].length_m) sm.one_length = 0;
    int finite = isfinite(sm.vf) && isfinite(sm.vf_err) && isfinite(sm.extra_m) &&
                 isfinite(sm.extra_err_m);
    for (size_t i = 0; i < cxl_stub_result_count(res); i++) {
        double vi, rhz, rm;
        cxl_stub_result_reading(res, i, NULL, NULL, NULL, &vi, &rhz, &rm);
        finite = finite && isfinite(vi) && isfinite(rhz) && isfinite(rm);
    }
    int rc = CLI_EXIT_OK;
    if (!finite) {
        rc = cli_error(ctx, "resonance", res_expected, "the readings give no finite result");
    } else {
        if (sm.flags & CXL_STUB_FLAG_INCONSISTENT)
            warn_inconsistent(ctx, stub, r, (size_t)n, (sm.flags & CXL_STUB_FLAG_ORDERS_ASSUMED) != 0);
        if (sm.flags & CXL_STUB_FLAG_VF_RANGE)
            cli_warn(ctx, "a velocity factor outside 0.50 to 1: check the readings, --length and --end");
        if (ctx->format == CLI_TEXT) write_text(ctx, &sm, res);
        else write_table(ctx, &sm, res);
    }
    cxl_stub_result_free(res);
    cxl_stub_free(stub);
    return rc;
}

const cli_command cli_cmd_vf = {
    .name = "vf",
    .summary = "velocity factor from stub resonances on a known length",
    .synopsis = "--length LEN --end open|short --resonance [N:]F[@LEN] ... [OPTIONS]",
    .opts = vf_opts,
    .run = vf_run,
    .batch = 1,
};
