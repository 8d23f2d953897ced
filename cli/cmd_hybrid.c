/* cmd_hybrid.c - coaxline hybrid: values of a 0-degree two-way combiner
 * for a port impedance (isolation resistor, common-port impedance), the
 * transformer back to the line with the best small turns pairs, and what a
 * single active input and a mismatched port do (ideal S-matrix model). */
#include <config.h>
#include <math.h>
#include <stdio.h>
#include "cli.h"

#define MAX_PAIRS 20

static const cli_optdef hybrid_opts[] = {
    { "impedance", "OHM", "impedance of the two input ports, e.g. 75", 0 },
    { "to", "OHM", "line impedance at the common port after the transformer (default: --impedance)", 0 },
    { "ratio", "R", "transformer impedance ratio, line side over common side (default 2)", 0 },
    { "max-turns", "N", "largest number of turns on either winding (default 10, at most 256)", 0 },
    { "pairs", "N", "how many turns pairs to list, best first (default 5)", 0 },
    { "load-swr", "S", "SWR of the load on the common port, for the isolation it leaves", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col hybrid_cols[] = {
    { "label", -1 }, { "port_ohm", 2 }, { "isolation_resistor_ohm", 2 },
    { "common_port_ohm", 2 }, { "line_ohm", 2 }, { "turns_ratio", 4 }, { "rank", 0 },
    { "common_turns", 0 }, { "line_turns", 0 }, { "presented_ohm", 2 }, { "swr", 3 },
    { "return_loss_db", 2 }, { "single_input_loss_db", 3 }, { "isolation_db", 2 },
};
#define NCOLS (sizeof hybrid_cols / sizeof hybrid_cols[0])

static int whole(const cli_ctx *ctx, const char *field, const cli_args *a, double lo, double hi,
                 const char *expected, unsigned *value)
{
    double v;
    const char *text = cli_get(a, field, 0);
    if (cli_number(ctx, field, text, lo, hi, expected, &v)) return CLI_EXIT_USAGE;
    if (v != floor(v))
        return cli_error(ctx, field, expected, "'%s' is not a whole number", text);
    *value = (unsigned)v;
    return 0;
}

/* Single-input loss (dB, positive) and isolation with the common port's
 * load reflecting gamma_common and the idle input's gamma_idle. */
static void response(double gamma_common, double gamma_idle, double *loss_db, double *iso_db)
{
    double common_db;
    if (cxl_hybrid_response(gamma_common, 0.0, gamma_idle, 0.0, &common_db, iso_db) != CXL_OK) {
        *loss_db = NAN;
        *iso_db = NAN;
        return;
    }
    *loss_db = -common_db;
}

static const char z_expected[] = "an impedance in ohms, such as 75 or 50";

/* What the options ask for. */
typedef struct hybrid_spec {
    double z_ohm, line_ohm, ratio, load_swr;
    unsigned max_turns, npairs;
} hybrid_spec;

/* The combiner and its best turns pairs, best first. */
typedef struct hybrid_values {
    double iso_r_ohm, common_ohm, turns;
    unsigned p[MAX_PAIRS], q[MAX_PAIRS];
    size_t count;
    double zx_ohm[MAX_PAIRS], swr[MAX_PAIRS], rl_db[MAX_PAIRS], loss_db[MAX_PAIRS],
        iso_db[MAX_PAIRS];
} hybrid_values;

/* --impedance, and --to or --ratio for the line side. */
static int parse_impedances(cli_ctx *ctx, const cli_args *a, hybrid_spec *h)
{
    if (!cli_count(a, "impedance"))
        return cli_error(ctx, "impedance", "--impedance 75", "the port impedance is needed");
    if (cli_bounded(ctx, "impedance", cli_get(a, "impedance", 0), CLI_BOUND_IMPEDANCE, z_expected,
                    &h->z_ohm))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "to") && cli_count(a, "ratio"))
        return cli_error(ctx, "ratio", "--ratio 2 or --to 75, not both", "both --ratio and --to are given");
    h->line_ohm = h->z_ohm;
    if (cli_count(a, "to") &&
        cli_bounded(ctx, "to", cli_get(a, "to", 0), CLI_BOUND_IMPEDANCE, z_expected, &h->line_ohm))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "ratio") &&
        cli_bounded(ctx, "ratio", cli_get(a, "ratio", 0), CLI_BOUND_RATIO,
                   "an impedance ratio such as 2 (for Z/2 up to Z)", &h->ratio))
        return CLI_EXIT_USAGE;
    return 0;
}

static int parse_spec(cli_ctx *ctx, const cli_args *a, hybrid_spec *h)
{
    *h = (hybrid_spec){ .ratio = 2.0, .load_swr = 1.0, .max_turns = 10, .npairs = 5 };
    if (parse_impedances(ctx, a, h)) return CLI_EXIT_USAGE;
    if (cli_count(a, "max-turns") &&
        whole(ctx, "max-turns", a, 1.0, 256.0, "a whole number of turns, 1 to 256", &h->max_turns))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "pairs") &&
        whole(ctx, "pairs", a, 1.0, MAX_PAIRS, "a whole number, 1 to 20", &h->npairs))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "load-swr") &&
        cli_bounded(ctx, "load-swr", cli_get(a, "load-swr", 0), CLI_BOUND_SWR,
                   "an SWR of 1 or more, such as 1.5", &h->load_swr))
        return CLI_EXIT_USAGE;
    return 0;
}

/* The combiner's values, and each turns pair's match and response; with
 * --ratio the line side follows from the common port. */
static int compute(cli_ctx *ctx, int has_ratio, hybrid_spec *h, hybrid_values *v)
{
    cxl_status st = cxl_hybrid_inphase(h->z_ohm, &v->iso_r_ohm, &v->common_ohm);
    if (st == CXL_OK && has_ratio) h->line_ohm = h->ratio * v->common_ohm;
    if (st == CXL_OK) st = cxl_hybrid_turns_ratio(v->common_ohm, h->line_ohm, &v->turns);
    v->count = 0;
    if (st == CXL_OK)
        st = cxl_hybrid_turns_search(v->common_ohm, h->line_ohm, h->max_turns, h->npairs, v->p,
                                     v->q, &v->count);
    for (size_t i = 0; st == CXL_OK && i < v->count; i++) {
        st = cxl_hybrid_match(v->common_ohm, h->line_ohm, v->p[i], v->q[i], &v->zx_ohm[i],
                              &v->swr[i], &v->rl_db[i]);
        if (st != CXL_OK) break;
        double zx = v->zx_ohm[i], line = h->line_ohm;
        /* the combiner's common port sees the line through the transformer:
         * the same mismatch, opposite sign */
        response(-(zx - line) / (zx + line), 0.0, &v->loss_db[i], &v->iso_db[i]);
    }
    if (st != CXL_OK)
        return cli_error(ctx, "impedance", z_expected, "no combiner for these values: %s",
                         cxl_strerror(st));
    return 0;
}

static void table_output(cli_ctx *ctx, const char *label, const hybrid_spec *h,
                         const hybrid_values *v)
{
    for (size_t i = 0; i < v->count; i++) {
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_NUM(h->z_ohm), CLI_NUM(v->iso_r_ohm), CLI_NUM(v->common_ohm),
            CLI_NUM(h->line_ohm), CLI_NUM(v->turns), CLI_NUM((double)(i + 1)), CLI_NUM(v->p[i]),
            CLI_NUM(v->q[i]), CLI_NUM(v->zx_ohm[i]), CLI_NUM(v->swr[i]), CLI_NUM(v->rl_db[i]),
            CLI_NUM(v->loss_db[i]), CLI_NUM(v->iso_db[i]),
        };
        cli_table_row(ctx, hybrid_cols, NCOLS, cells);
    }
}

/* The combiner's values and the turns pairs, best first. */
static void values_text(cli_ctx *ctx, const char *label, const hybrid_spec *h,
                        const hybrid_values *v)
{
    FILE *o = ctx->out;
    char b1[64], b2[64], b3[64], b4[64], b5[64];
    fprintf(o, "hybrid%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  ports               %s ohm each\n", cli_fmt(b1, sizeof b1, h->z_ohm, 2));
    fprintf(o, "  isolation resistor  %s ohm (2 Z, across the two inputs)\n",
            cli_fmt(b1, sizeof b1, v->iso_r_ohm, 2));
    fprintf(o, "  common port         %s ohm (Z/2, before the transformer)\n",
            cli_fmt(b1, sizeof b1, v->common_ohm, 2));
    fprintf(o, "  transformer         %s ohm to %s ohm: impedance ratio %s, turns ratio %s\n",
            cli_fmt(b1, sizeof b1, v->common_ohm, 2), cli_fmt(b2, sizeof b2, h->line_ohm, 2),
            cli_fmt(b3, sizeof b3, h->line_ohm / v->common_ohm, 4),
            cli_fmt(b4, sizeof b4, v->turns, 4));
    char head[48];
    snprintf(head, sizeof head, "turns (common:line, up to %u)", h->max_turns);
    fprintf(o, "\n  %-31s %11s %7s %11s %10s %11s\n", head, "presents", "SWR", "return loss",
            "one input", "isolation");
    for (size_t i = 0; i < v->count; i++) {
        char t[32];
        snprintf(t, sizeof t, "%u:%u", v->p[i], v->q[i]);
        fprintf(o, "  %-31s %7s ohm %7s %8s dB %7s dB %8s dB\n", t,
                cli_fmt(b1, sizeof b1, v->zx_ohm[i], 2), cli_fmt(b2, sizeof b2, v->swr[i], 3),
                cli_fmt(b3, sizeof b3, v->rl_db[i], 2), cli_fmt(b4, sizeof b4, v->loss_db[i], 3),
                v->iso_db[i] >= CXL_DB_LIMIT ? ">300" : cli_fmt(b5, sizeof b5, v->iso_db[i], 2));
    }
    fprintf(o, "  (one input: loss from one active input to the line; isolation: between the\n"
               "   inputs with that transformer's mismatch; ideal lossless parts)\n");
}

/* What a bad port costs; |Gamma| from the SWR, the phase does not matter
 * while the idle input is matched.  The --load-swr row only when given. */
static void bad_port_text(cli_ctx *ctx, int has_load_swr, double load_swr)
{
    FILE *o = ctx->out;
    char b1[64], b2[64], b3[64], b4[64];
    double g_load = (load_swr - 1.0) / (load_swr + 1.0);
    struct { const char *what; double gc, gi; } cases[] = {
        { "all ports matched", 0.0, 0.0 },
        { "common port open", 1.0, 0.0 },
        { "common port shorted", -1.0, 0.0 },
        { "idle input open, common matched", 0.0, 1.0 },
        { "common and idle input both open", 1.0, 1.0 },
        { "common port load at --load-swr", g_load, 0.0 },
    };
    size_t ncases = sizeof cases / sizeof cases[0] - !has_load_swr;
    fprintf(o, "\n  with a bad port (ideal combiner)      one input to line  isolation between inputs\n");
    for (size_t i = 0; i < ncases; i++) {
        double l, s;
        response(cases[i].gc, cases[i].gi, &l, &s);
        char what[64];
        if (i == 5)
            snprintf(what, sizeof what, "common port load SWR %s", cli_fmt(b3, sizeof b3, load_swr, 2));
        else
            snprintf(what, sizeof what, "%s", cases[i].what);
        if (l >= CXL_DB_LIMIT) snprintf(b1, sizeof b1, "nothing");
        else snprintf(b1, sizeof b1, "%s dB", cli_fmt(b4, sizeof b4, -l, 2));
        if (s >= CXL_DB_LIMIT) snprintf(b2, sizeof b2, "infinite (ideal)");
        else snprintf(b2, sizeof b2, "%s dB", cli_fmt(b4, sizeof b4, s, 2));
        fprintf(o, "  %-35s %11s        %s\n", what, b1, b2);
    }
}

static int hybrid_run(cli_ctx *ctx, const cli_args *a)
{
    hybrid_spec h;
    hybrid_values v;
    if (parse_spec(ctx, a, &h) || compute(ctx, cli_count(a, "ratio") > 0, &h, &v))
        return CLI_EXIT_USAGE;
    const char *label = cli_label(a);
    if (ctx->format != CLI_TEXT) {
        table_output(ctx, label, &h, &v);
        return CLI_EXIT_OK;
    }
    if (ctx->rows_out++) putc('\n', ctx->out);
    values_text(ctx, label, &h, &v);
    bad_port_text(ctx, cli_count(a, "load-swr") > 0, h.load_swr);
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_hybrid = {
    .name = "hybrid",
    .summary = "0-degree combiner: isolation resistor, common port, transformer turns",
    .synopsis = "--impedance Z [--ratio R | --to Z2] [--max-turns N] [OPTIONS]",
    .opts = hybrid_opts,
    .run = hybrid_run,
    .batch = 1,
};
