/* cmd_trim.c - coaxline trim: a piece cut long, its resonances read on an
 * analyzer; how much to cut off to reach a target, and what the analyzer
 * should show afterwards. */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

static const cli_optdef trim_opts[] = {
    { "length", "LEN", "physical length of the piece now (e.g. 30m or 98ft 5in)", 0 },
    { "end", "open|short", "far end of the piece while reading (default open)", 0 },
    { "resonance", "F", "a low-impedance frequency read on the analyzer (e.g. 1.645MHz)", 1 },
    { "order", "N", "order of each --resonance, in the same order (default: inferred)", 1 },
    { "sweep", "FILE", "readings from a one-port sweep file: its series resonances of the --reading kind", 0 },
    { "fixture", "LEN", "tee, adapters or jumper between analyzer and piece", 0 },
    { "fixture-vf", "X", "velocity factor of the fixture (default: the piece's cable)", 0 },
    { "fixture-tol", "LEN", "how well the fixture length is known (default 0)", 0 },
    { "resolution", "F", "the analyzer's frequency step (e.g. 1kHz; default 0)", 0 },
    { "degrees", "DEG", "target: electrical length at --freq", 0 },
    { "delay", "TIME", "target: a delay (at --freq when given)", 0 },
    { "freq", "F", "frequency the target holds at", 0 },
    { "match-resonance", "F", "target: what a reference piece read through the same fixture", 0 },
    { "match-end", "open|short", "far end of the reference piece (default: --end)", 0 },
    { "match-order", "N", "order of the reference reading (default 1)", 0 },
    { "cable", "NAME", "catalog cable whose model corrects the lossy-line offset of each reading", 0 },
    { "reading", "zero-x|min-z|min-swr", "what the analyzer's dip is (default zero-x; the others need --cable)", 0 },
    { "analyzer-z0", "OHM", "the analyzer's reference impedance for --reading min-swr (default 50)", 0 },
    { "allowance", "LEN", "length in connectors or adapters the target counts but the piece does not hold", 0 },
    { "allowance-vf", "X", "velocity factor of the allowance (default: the piece's VF at the target)", 0 },
    { "label", "TEXT", "name of the piece, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col trim_cols[] = {
    { "label", -1 }, { "length_m", 4 }, { "end", -1 }, { "order", 0 }, { "order_source", -1 },
    { "freq_mhz", 6 }, { "vf", 5 }, { "target_freq_mhz", 6 }, { "target_vf", 5 },
    { "cut_off_m", 4 }, { "cut_off_ft", 4 }, { "cut_off_tape", -1 }, { "remaining_m", 4 },
    { "expected_mhz", 6 }, { "resolution_mm", 1 }, { "remaining_res_mm", 1 }, { "action", -1 },
    { "reading", -1 },
};
#define NCOLS (sizeof trim_cols / sizeof trim_cols[0])

static const char end_expected[] = "open or short";

static int parse_end(cli_ctx *ctx, const char *field, const char *text, cxl_stub_end *end)
{
    if (strcmp(text, "open") == 0) *end = CXL_STUB_OPEN;
    else if (strcmp(text, "short") == 0) *end = CXL_STUB_SHORT;
    else return cli_error(ctx, field, end_expected, "unknown end '%s'", text);
    return 0;
}

static int parse_order(cli_ctx *ctx, const char *field, const char *text, int *order)
{
    static const char expected[] = "a whole number from 1 (the lowest resonance) up, such as 3";
    double v;
    if (cli_number(ctx, field, text, 1.0, CXL_STUB_MAX_ORDER, expected, &v)) return CLI_EXIT_USAGE;
    if (v != floor(v)) return cli_error(ctx, field, expected, "'%s' is not a whole number", text);
    *order = (int)v;
    return 0;
}

/* Everything one invocation reads, checked. */
typedef struct trim_in {
    double length_m, fixture_m, fixture_vf, fixture_tol_m, res_hz;
    cxl_stub_end end;
    int n, orders_given;
    const char *sweep;  /* readings from this sweep file, or NULL */
    double freq_hz[CLI_MAX_ITEMS];
    int order[CLI_MAX_ITEMS];
} trim_in;

/* --sweep FILE: the file's series resonances of the --reading kind,
 * numbered from their spacing (two or more), the point spacing as the
 * analyzer's step unless --resolution is given. */
static int sweep_readings(cli_ctx *ctx, const cli_args *a, trim_in *in)
{
    if (cli_count(a, "resonance") || cli_count(a, "order"))
        return cli_error(ctx, "sweep", "--sweep FILE or --resonance F [--order N], not both",
                         "given with --%s", cli_count(a, "resonance") ? "resonance" : "order");
    cxl_dip_kind kind;
    double ref_ohm, step;
    const char *kind_name;
    if (cli_reading_kind(ctx, a, cli_count(a, "cable") > 0, &kind, &ref_ohm, &kind_name))
        return CLI_EXIT_USAGE;
    in->sweep = cli_get(a, "sweep", 0);
    if (cli_sweep_readings(ctx, in->sweep, kind, ref_ohm, in->end, in->freq_hz, in->order,
                           CLI_MAX_ITEMS, &in->n, &step))
        return CLI_EXIT_USAGE;
    int numbered = 1;
    for (int i = 0; i < in->n; i++) numbered = numbered && in->order[i] > 0;
    if (!numbered)
        for (int i = 0; i < in->n; i++) in->order[i] = 0;
    in->orders_given = numbered;
    if (!cli_count(a, "resolution")) in->res_hz = step;
    return 0;
}

static int read_readings(cli_ctx *ctx, const cli_args *a, trim_in *in)
{
    if (cli_count(a, "sweep")) return sweep_readings(ctx, a, in);
    char buf[2048], obuf[1024];
    const char *items[CLI_MAX_ITEMS], *oitems[CLI_MAX_ITEMS];
    int n = cli_items(ctx, a, "resonance", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (n < 0) return CLI_EXIT_USAGE;
    if (n == 0)
        return cli_error(ctx, "resonance", "--resonance 1.645MHz (repeat it or give a list for more orders)",
                         "at least one reading is needed");
    int no = cli_items(ctx, a, "order", obuf, sizeof obuf, oitems, CLI_MAX_ITEMS);
    if (no < 0) return CLI_EXIT_USAGE;
    if (no != 0 && no != n)
        return cli_error(ctx, "order", "one order per --resonance, e.g. --resonance 1.6MHz,4.9MHz --order 1,2",
                         "%d orders for %d readings", no, n);
    for (int i = 0; i < n; i++) {
        if (cli_freq(ctx, "resonance", items[i], &in->freq_hz[i])) return CLI_EXIT_USAGE;
        in->order[i] = 0;
        if (no && parse_order(ctx, "order", oitems[i], &in->order[i])) return CLI_EXIT_USAGE;
        for (int j = 0; j < i; j++) {
            if (in->freq_hz[j] == in->freq_hz[i])
                return cli_error(ctx, "resonance", "each resonance once", "'%s' is given twice",
                                 items[i]);
            if (no && in->order[j] == in->order[i])
                return cli_error(ctx, "order", "each order once", "order %d is given twice",
                                 in->order[i]);
        }
    }
    in->n = n;
    in->orders_given = no != 0;
    return 0;
}

/* --fixture, --fixture-vf and --fixture-tol. */
static int read_fixture(cli_ctx *ctx, const cli_args *a, trim_in *in)
{
    const char *t;
    if ((t = cli_get(a, "fixture", 0)) &&
        cli_length(ctx, "fixture", t, CLI_NONNEG, &in->fixture_m))
        return CLI_EXIT_USAGE;
    /* a fixture's VF is not silently dropped without a fixture (its
     * tolerance alone is meaningful: where the reference plane is) */
    if (cli_count(a, "fixture-vf") && !cli_count(a, "fixture"))
        return cli_error(ctx, "fixture-vf", "--fixture 0.15m with it", "given without --fixture");
    if ((t = cli_get(a, "fixture-vf", 0)) && cli_vf(ctx, "fixture-vf", t, &in->fixture_vf))
        return CLI_EXIT_USAGE;
    if ((t = cli_get(a, "fixture-tol", 0)) &&
        cli_length(ctx, "fixture-tol", t, CLI_NONNEG, &in->fixture_tol_m))
        return CLI_EXIT_USAGE;
    return 0;
}

/* --resolution: a step of 0 is allowed (an exact analyzer). */
static int read_resolution(cli_ctx *ctx, const char *t, double *res_hz)
{
    static const char expected[] = "a frequency step such as 1kHz or 100Hz, or 0";
    size_t pos = 0;
    if (cxl_units_parse_freq(t, res_hz, &pos) != CXL_OK || !(*res_hz >= 0.0))
        return cli_error(ctx, "resolution", expected, "'%s' is not a frequency step", t);
    if (*res_hz > CLI_MAX_FREQ_HZ)
        return cli_error(ctx, "resolution", expected, "'%s' is above 1 THz", t);
    return 0;
}

static int read_piece(cli_ctx *ctx, const cli_args *a, trim_in *in)
{
    const char *t;
    memset(in, 0, sizeof *in);
    if (!(t = cli_get(a, "length", 0)))
        return cli_error(ctx, "length", "--length 30m, the piece's length now", "the piece's length is needed");
    if (cli_length(ctx, "length", t, CLI_POSITIVE, &in->length_m)) return CLI_EXIT_USAGE;
    in->end = CXL_STUB_OPEN;
    if ((t = cli_get(a, "end", 0)) && parse_end(ctx, "end", t, &in->end)) return CLI_EXIT_USAGE;
    if (read_fixture(ctx, a, in)) return CLI_EXIT_USAGE;
    if ((t = cli_get(a, "resolution", 0)) && read_resolution(ctx, t, &in->res_hz))
        return CLI_EXIT_USAGE;
    return read_readings(ctx, a, in);
}

/* --degrees DEG at --freq F. */
static int target_degrees(cli_ctx *ctx, const char *deg, const char *ft, double f,
                          cxl_trim *trim, char *what, size_t size)
{
    static const char expected[] = "electrical degrees above 0, such as 90";
    double v;
    char b1[64], b2[64];
    if (cli_number(ctx, "degrees", deg, 0.0, 1e6, expected, &v)) return CLI_EXIT_USAGE;
    if (!(v > 0.0))
        return cli_error(ctx, "degrees", expected, "'%s' must be greater than zero", deg);
    if (!ft)
        return cli_error(ctx, "freq", "--degrees 90 --freq 1.83MHz",
                         "--degrees needs the frequency it holds at");
    cxl_trim_target_degrees(trim, v, f);
    snprintf(what, size, "%s deg at %s MHz", cli_fmt(b1, sizeof b1, v, 3),
             cli_fmt(b2, sizeof b2, f / 1e6, 6));
    return 0;
}

/* --delay TIME, at --freq F when given. */
static int target_delay(cli_ctx *ctx, const char *dl, const char *ft, double f,
                        cxl_trim *trim, char *what, size_t size)
{
    double v;
    char b1[64], b2[64];
    if (cli_time(ctx, "delay", dl, CLI_POSITIVE, &v)) return CLI_EXIT_USAGE;
    cxl_trim_target_delay(trim, v, f);
    snprintf(what, size, "%s ns%s%s%s", cli_fmt(b1, sizeof b1, v * 1e9, 3),
             ft ? " at " : "", ft ? cli_fmt(b2, sizeof b2, f / 1e6, 6) : "", ft ? " MHz" : "");
    return 0;
}

/* --match-resonance F: a reference piece read through the same fixture,
 * its far end and order defaulting to this piece's end and 1. */
static int target_match(cli_ctx *ctx, const cli_args *a, const char *mr, cxl_stub_end end,
                        cxl_trim *trim, char *what, size_t size)
{
    int order = 1;
    double f;
    char b1[64];
    const char *t;
    if (cli_freq(ctx, "match-resonance", mr, &f)) return CLI_EXIT_USAGE;
    if ((t = cli_get(a, "match-end", 0)) && parse_end(ctx, "match-end", t, &end))
        return CLI_EXIT_USAGE;
    if ((t = cli_get(a, "match-order", 0)) && parse_order(ctx, "match-order", t, &order))
        return CLI_EXIT_USAGE;
    cxl_trim_target_resonance(trim, end, order, f);
    snprintf(what, size, "the reference piece: order %d at %s MHz, far end %s", order,
             cli_fmt(b1, sizeof b1, f / 1e6, 6), end == CXL_STUB_OPEN ? "open" : "short");
    return 0;
}

/* The one target of this invocation, set on the trim. */
static int set_target(cli_ctx *ctx, const cli_args *a, const trim_in *in, cxl_trim *trim,
                      char *what, size_t size)
{
    static const char kinds_expected[] =
        "--degrees 90 --freq 1.83MHz, --delay 40ns or --match-resonance 2.471MHz";
    const char *deg = cli_get(a, "degrees", 0), *dl = cli_get(a, "delay", 0);
    const char *mr = cli_get(a, "match-resonance", 0), *ft = cli_get(a, "freq", 0);
    int kinds = !!deg + !!dl + !!mr;
    if (kinds != 1)
        return cli_error(ctx, "degrees/delay/match-resonance", kinds_expected,
                         kinds ? "give only one target" : "a target is needed");
    double f = 0.0;
    static const char *const match_opts[] = { "match-end", "match-order" };
    for (int i = 0; i < 2; i++)
        if (!mr && cli_count(a, match_opts[i]))
            return cli_error(ctx, match_opts[i], "--match-resonance 2.471MHz with it",
                             "given without --match-resonance");
    if (ft && cli_freq(ctx, "freq", ft, &f)) return CLI_EXIT_USAGE;
    if (ft && mr)
        return cli_error(ctx, "freq", "--freq with --degrees or --delay",
                         "--match-resonance holds at its own frequency");
    if (deg) return target_degrees(ctx, deg, ft, f, trim, what, size);
    if (dl) return target_delay(ctx, dl, ft, f, trim, what, size);
    return target_match(ctx, a, mr, in->end, trim, what, size);
}

/* "12.3 mm" style: a fixed-decimal number and its unit. */
static const char *with_unit(char *buf, size_t size, double value, int decimals,
                             const char *unit)
{
    char num[64];
    snprintf(buf, size, "%s %s", cli_fmt(num, sizeof num, value, decimals), unit);
    return buf;
}

static const char *action_word(cxl_trim_action act)
{
    return act == CXL_TRIM_CUT ? "cut" : act == CXL_TRIM_WITHIN ? "within" : "short";
}

/* Text: the readings, one line each, and where they and their orders
 * came from. */
static void print_readings(cli_ctx *ctx, const cli_args *a, const trim_in *in,
                           const cxl_trim_result *r, unsigned flags, const char *cable)
{
    FILE *o = ctx->out;
    char b1[96], b2[96], b3[96];
    fprintf(o, "  readings            order  MHz          VF       one step resolves\n");
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double f, v, rm;
        int order;
        cxl_trim_result_reading(r, i, &f, &order, &v, NULL, &rm);
        fprintf(o, "                      %-5d  %-11s  %-7s  %s\n", order,
                cli_fmt(b1, sizeof b1, f / 1e6, 6), cli_fmt(b2, sizeof b2, v, 5),
                in->res_hz > 0.0 ? with_unit(b3, sizeof b3, rm * 1e3, 1, "mm") : "-");
    }
    if (in->sweep)
        fprintf(o, "                      from the sweep %s: its %s series resonances\n", in->sweep,
                cli_count(a, "reading") ? cli_get(a, "reading", 0) : "zero-x");
    else if (cli_count(a, "reading"))
        fprintf(o, "                      read as %s\n", cli_get(a, "reading", 0));
    fprintf(o, "                      orders %s%s\n",
            in->orders_given ? (in->sweep ? "from the spacing of the sweep's resonances" : "as given")
                             : "inferred",
            flags & CXL_TRIM_FLAG_MODEL ? "; each reading corrected for the lossy-line offset" : "");
    if (flags & CXL_TRIM_FLAG_MODEL)
        fprintf(o, "                      (model of cable %s)\n", cable);
}

/* How the VF at the target frequency was found. */
static const char *vf_source(unsigned flags)
{
    if (flags & CXL_TRIM_FLAG_DRIFT)
        return flags & CXL_TRIM_FLAG_EXTRAPOLATED
                   ? "trend a - b/sqrt(f) over the readings, extrapolated"
                   : "trend a - b/sqrt(f) over the readings";
    if (flags & CXL_TRIM_FLAG_ALLOWANCE)
        return "nearest reading; trend unknown, +- widened by the drift allowance";
    return "from the one reading";
}

/* Text: the VF the target uses, the target, and the allowance counted in
 * it (its options were checked when the trim was set up). */
static void print_target(cli_ctx *ctx, const cli_args *a, const cxl_trim_result *r,
                         unsigned flags, const char *what)
{
    FILE *o = ctx->out;
    char b1[96], b2[96];
    double vf_t, ft;
    cxl_trim_result_vf(r, NULL, &vf_t, &ft);
    if (ft > 0.0)
        fprintf(o, "  VF at %-13s %s  %s\n", with_unit(b1, sizeof b1, ft / 1e6, 3, "MHz"),
                cli_fmt(b2, sizeof b2, vf_t, 5), vf_source(flags));
    else
        fprintf(o, "  VF                  %s  fitted over the readings\n",
                cli_fmt(b2, sizeof b2, vf_t, 5));
    fprintf(o, "  target              %s\n", what);
    if (!cli_count(a, "allowance")) return;
    double am = 0.0, av = 0.0;
    cli_length(ctx, "allowance", cli_get(a, "allowance", 0), CLI_NONNEG, &am);
    if (cli_count(a, "allowance-vf")) cli_vf(ctx, "allowance-vf", cli_get(a, "allowance-vf", 0), &av);
    fprintf(o, "  allowance           %s at VF %s, counted in the target\n",
            cli_fmt_length(ctx, b1, sizeof b1, am),
            av > 0.0 ? cli_fmt(b2, sizeof b2, av, 4) : "of the piece");
}

/* Text: what to keep, what to cut, and what the analyzer reads after. */
static void print_cut(cli_ctx *ctx, const cxl_trim_result *r)
{
    FILE *o = ctx->out;
    char b1[96], b2[96];
    double cut, keep, res;
    cxl_trim_action act;
    cxl_trim_result_cut(r, &cut, &keep, &res, &act);
    fprintf(o, "  keep                %s", cli_fmt_length(ctx, b1, sizeof b1, keep));
    if (res > 0.0) fprintf(o, "  +- %s mm", cli_fmt(b2, sizeof b2, res * 1e3, 1));
    putc('\n', o);
    if (act == CXL_TRIM_SHORT) {
        fprintf(o, "  SHORT               the piece is %s shorter than the target: trimming cannot\n"
                   "                      reach it; lengthen it or cut a new piece\n",
                cli_fmt_length(ctx, b1, sizeof b1, -cut));
        return;
    }
    fprintf(o, "  cut off             %s\n", cli_fmt_length(ctx, b1, sizeof b1, cut));
    if (act == CXL_TRIM_WITHIN)
        fprintf(o, "                      within the resolution: stop, or read a higher order\n");
    fprintf(o, "  analyzer after cut  ");
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double e;
        int order;
        cxl_trim_result_reading(r, i, NULL, &order, NULL, &e, NULL);
        fprintf(o, "%s%s MHz (order %d)", i ? ", " : "", cli_fmt(b1, sizeof b1, e / 1e6, 6), order);
    }
    putc('\n', o);
}

static void print_text(cli_ctx *ctx, const cli_args *a, const trim_in *in,
                       const cxl_trim_result *r, const char *what, const char *cable)
{
    FILE *o = ctx->out;
    char b1[96], b2[96];
    unsigned flags;
    const char *label = cli_label(a);
    cxl_trim_result_flags(r, &flags);
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "trim%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  piece               %s, far end %s\n",
            cli_fmt_length(ctx, b1, sizeof b1, in->length_m),
            in->end == CXL_STUB_OPEN ? "open" : "shorted");
    if (in->fixture_m > 0.0)
        fprintf(o, "  fixture             %s, %s\n", cli_fmt_length(ctx, b1, sizeof b1, in->fixture_m),
                in->fixture_vf > 0.0 ? cli_fmt(b2, sizeof b2, in->fixture_vf, 4) : "same cable");
    print_readings(ctx, a, in, r, flags, cable);
    print_target(ctx, a, r, flags, what);
    print_cut(ctx, r);
}

static void print_rows(cli_ctx *ctx, const cli_args *a, const trim_in *in,
                       const cxl_trim_result *r)
{
    double cut, keep, res, vf_t, ft;
    cxl_trim_action act;
    char tape[64];
    cxl_trim_result_cut(r, &cut, &keep, &res, &act);
    cxl_trim_result_vf(r, NULL, &vf_t, &ft);
    if (cxl_units_format_imperial(cut, tape, sizeof tape) != CXL_OK) tape[0] = '\0';
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double f, v, e, rm;
        int order;
        cxl_trim_result_reading(r, i, &f, &order, &v, &e, &rm);
        cli_cell cells[NCOLS] = {
            CLI_TXT(cli_label(a)), CLI_NUM(in->length_m),
            CLI_TXT(in->end == CXL_STUB_OPEN ? "open" : "short"), CLI_NUM(order),
            CLI_TXT(in->orders_given ? (in->sweep ? "sweep" : "given") : "inferred"),
            CLI_NUM(f / 1e6), CLI_NUM(v),
            ft > 0.0 ? CLI_NUM(ft / 1e6) : CLI_NONE, CLI_NUM(vf_t), CLI_NUM(cut),
            CLI_NUM(cut / 0.3048), CLI_TXT(tape), CLI_NUM(keep), CLI_NUM(e / 1e6),
            CLI_NUM(rm * 1e3), CLI_NUM(res * 1e3), CLI_TXT(action_word(act)),
            CLI_TXT(cli_count(a, "reading") ? cli_get(a, "reading", 0) : "zero-x"),
        };
        cli_table_row(ctx, trim_cols, NCOLS, cells);
    }
}

/* Every number the output shows must be finite. */
static int result_finite(const cxl_trim_result *r)
{
    double v[5];
    cxl_trim_result_cut(r, &v[0], &v[1], &v[2], NULL);
    cxl_trim_result_vf(r, &v[3], &v[4], NULL);
    int ok = isfinite(v[0]) && isfinite(v[1]) && isfinite(v[2]) && isfinite(v[3]) && isfinite(v[4]);
    for (size_t i = 0; i < cxl_trim_result_count(r) && ok; i++) {
        double f, vf, e, rm;
        cxl_trim_result_reading(r, i, &f, NULL, &vf, &e, &rm);
        ok = isfinite(f) && isfinite(vf) && isfinite(e) && isfinite(rm);
    }
    return ok;
}

/* A finite result can still hold lengths no tape or column shows (a
 * target of 1e-300 degrees keeps no piece at all, a 1 Hz target a piece
 * the size of a planet): the piece to keep is from 1 mm to the longest
 * length the command takes, and so are the cut and the resolutions
 * (common practice, no source). */
static int result_printable(cli_ctx *ctx, const cli_args *a, const cxl_trim_result *r)
{
    double cut, keep, res;
    char b1[48];
    cxl_trim_result_cut(r, &cut, &keep, &res, NULL);
    if (!(keep >= CLI_LINE_MIN_M && keep <= CLI_MAX_LENGTH_M && fabs(cut) <= CLI_MAX_LENGTH_M)) {
        const char *field = cli_count(a, "degrees") ? "degrees"
                          : cli_count(a, "delay") ? "delay" : "match-resonance";
        return cli_error(ctx, field, "a target that keeps from 1 mm to 10000 km of the piece",
                         "the target keeps %s m", keep < CLI_LINE_MIN_M ? "less than 0.001"
                         : cli_fmt(b1, sizeof b1, keep, 0));
    }
    int bad = !(res <= CLI_MAX_LENGTH_M);
    for (size_t i = 0; i < cxl_trim_result_count(r); i++) {
        double rm;
        cxl_trim_result_reading(r, i, NULL, NULL, NULL, NULL, &rm);
        bad = bad || !(rm <= CLI_MAX_LENGTH_M);
    }
    if (bad)
        return cli_error(ctx, cli_count(a, "fixture-tol") ? "fixture-tol" : "resolution",
                         "a resolution and fixture tolerance that resolve under 10000 km",
                         "the measurement resolves no better than 10000 km");
    return 0;
}

static int solve_error(cli_ctx *ctx, const cli_args *a, cxl_status st)
{
    if (st == CXL_ENOCONV && cli_count(a, "reading"))
        return cli_error(ctx, "reading", "zero-x or min-z for a line whose impedance is at or below the analyzer's",
                         "the line model shows no %s dip near these resonances",
                         cli_get(a, "reading", 0));
    if (st == CXL_ERANGE && cli_count(a, "allowance"))
        return cli_error(ctx, "allowance", "an allowance shorter than the target it is part of",
                         "the allowance alone gives the target or more, or the readings do not fit this piece");
    if (st == CXL_EINCONSISTENT)
        return cli_error(ctx, "order", "orders that rise with frequency, e.g. --order 1,2,3",
                         "a higher reading has a lower or equal order");
    if (st == CXL_ERANGE)
        return cli_error(ctx, "resonance",
                         "readings of this piece with a velocity factor between 0.5 and 1 (check --length, --end, --order, --fixture)",
                         "the readings and the target do not fit this piece");
    return cli_error(ctx, "resonance", "readings the model can follow", "%s", cxl_strerror(st));
}

/* What the rows of a batch reuse (ctx->state): the trim and its result,
 * reset and solved again row after row, and the cables' line models. */
typedef struct trim_state {
    cxl_trim *trim;
    cxl_trim_result *res;
    cli_cable_cache *cables;
} trim_state;

static int trim_end(cli_ctx *ctx)
{
    trim_state *ts = ctx->state;
    if (ts) {
        cxl_trim_free(ts->trim);
        cxl_trim_result_free(ts->res);
        cli_cable_cache_free(ts->cables);
        free(ts);
    }
    ctx->state = NULL;
    return CLI_EXIT_OK;
}

/* The batch's state, made on the first row; NULL after an error line. */
static trim_state *trim_state_of(cli_ctx *ctx)
{
    trim_state *ts = ctx->state;
    if (ts) return ts;
    ts = calloc(1, sizeof *ts);
    if (!ts || cxl_trim_new(CXL_STUB_OPEN, 1.0, &ts->trim) != CXL_OK ||
        cxl_trim_result_new(&ts->res) != CXL_OK) {
        if (ts) cxl_trim_free(ts->trim);
        free(ts);
        cli_error(ctx, "length", NULL, "out of memory");
        return NULL;
    }
    ctx->state = ts;
    return ts;
}

/* The piece, its readings, the kind of reading, the allowance, the target
 * and the cable's model into the emptied trim. */
static int trim_setup(cli_ctx *ctx, const cli_args *a, const trim_in *in, trim_state *ts,
                      char *what, size_t what_size)
{
    cxl_trim *trim = ts->trim;
    const char *cable = cli_get(a, "cable", 0);
    cxl_trim_reset(trim, in->end, in->length_m);
    cxl_trim_set_fixture(trim, in->fixture_m, in->fixture_vf, in->fixture_tol_m);
    cxl_trim_set_resolution(trim, in->res_hz);
    cxl_dip_kind kind;
    double ref_ohm, allow_m = 0.0, allow_vf = 0.0;
    const char *kind_name;
    if (cli_reading_kind(ctx, a, cable != NULL, &kind, &ref_ohm, &kind_name)) return CLI_EXIT_USAGE;
    cxl_trim_set_reading(trim, kind, ref_ohm);
    if (cli_count(a, "allowance-vf") && !cli_count(a, "allowance"))
        return cli_error(ctx, "allowance-vf", "--allowance 0.12m with it", "given without --allowance");
    if (cli_count(a, "allowance") &&
        cli_length(ctx, "allowance", cli_get(a, "allowance", 0), CLI_NONNEG, &allow_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "allowance-vf") &&
        cli_vf(ctx, "allowance-vf", cli_get(a, "allowance-vf", 0), &allow_vf))
        return CLI_EXIT_USAGE;
    cxl_trim_set_allowance(trim, allow_m, allow_vf);
    for (int i = 0; i < in->n; i++) cxl_trim_add_reading(trim, in->freq_hz[i], in->order[i]);
    if (set_target(ctx, a, in, trim, what, what_size)) return CLI_EXIT_USAGE;
    if (!cable) return 0;
    size_t idx;
    const cxl_loss_model *model = NULL;
    if (cli_cable_index(ctx, cable, &idx)) return CLI_EXIT_USAGE;
    if (cli_cable_cache_model(&ts->cables, cli_catalog(ctx), idx, &model) != CXL_OK)
        return cli_error(ctx, "cable", "a cable with inner and dielectric diameters (coaxline cables)",
                         "cable '%s' has no geometry to model", cable);
    cxl_trim_set_model(trim, model);
    return 0;
}

/* The solved piece in the output, its warnings, and the exit code. */
static int trim_report(cli_ctx *ctx, const cli_args *a, const trim_in *in,
                       const cxl_trim_result *r, const char *what)
{
    double cut, res;
    cxl_trim_action act;
    unsigned flags;
    cxl_trim_result_cut(r, &cut, NULL, &res, &act);
    cxl_trim_result_flags(r, &flags);
    if (ctx->format == CLI_TEXT) print_text(ctx, a, in, r, what, cli_get(a, "cable", 0));
    else print_rows(ctx, a, in, r);
    if (flags & CXL_STUB_FLAG_INCONSISTENT)
        cli_warn(ctx, "the readings are not multiples of one fundamental within 2 %%: "
                      "check the orders, the far end and the fixture");
    if (act == CXL_TRIM_WITHIN) {
        char b1[32], b2[32];
        cli_warn(ctx, "the cut (%s mm) is below what this measurement resolves (%s mm): "
                      "stop, or read a higher order or with a finer step",
                 cli_fmt(b1, sizeof b1, cut * 1e3, 1), cli_fmt(b2, sizeof b2, res * 1e3, 1));
    }
    return act == CXL_TRIM_SHORT ? CLI_EXIT_TOLERANCE : CLI_EXIT_OK;
}

static int trim_run(cli_ctx *ctx, const cli_args *a)
{
    trim_in in;
    if (read_piece(ctx, a, &in)) return CLI_EXIT_USAGE;
    trim_state *ts = trim_state_of(ctx);
    char what[160];
    if (!ts || trim_setup(ctx, a, &in, ts, what, sizeof what)) return CLI_EXIT_USAGE;
    cxl_status st = cxl_trim_solve_into(ts->trim, ts->res);
    if (st != CXL_OK) return solve_error(ctx, a, st);
    if (!result_finite(ts->res))
        return cli_error(ctx, "resonance", "readings of an ordinary piece of cable", "no finite result");
    if (result_printable(ctx, a, ts->res)) return CLI_EXIT_USAGE;
    return trim_report(ctx, a, &in, ts->res, what);
}

const cli_command cli_cmd_trim = {
    .name = "trim",
    .summary = "how much to cut off a piece cut long, from its analyzer resonances",
    .synopsis = "--length LEN (--resonance F[,F...] | --sweep FILE) (--degrees DEG --freq F | --delay TIME | "
                "--match-resonance F) [OPTIONS]",
    .opts = trim_opts,
    .run = trim_run,
    .end = trim_end,
    .batch = 1,
};
