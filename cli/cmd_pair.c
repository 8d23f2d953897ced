/* cmd_pair.c - coaxline pair: two or more lines meant to be equal, checked
 * against a phase tolerance at each band edge.  The worst pair is the
 * longest line against the shortest; exit 1 when any band fails. */
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
    { "band", "LIST", "bands to check, e.g. 160m,80m", 1 },
    { "region", "N", "ITU Region 1, 2 or 3 (default: widest edges across Regions)", 0 },
    { "exclude-footnotes", NULL, "band edges without footnote segments", 0 },
    { "freq", "F", "a single frequency to check", 1 },
    { "length-tol", "LEN", "how far each measured length may be off", 0 },
    { "vf-tol", "X", "how far the velocity factor may be off", 0 },
    { "label", "TEXT", "name of the set, kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col pair_cols[] = {
    { "label", -1 }, { "band", -1 }, { "edge", -1 }, { "freq_mhz", 6 },
    { "delta_m", 3 }, { "phase_error_deg", 3 }, { "tolerance_deg", 3 }, { "verdict", -1 },
    { "allowed_mismatch_m", 3 }, { "uncertainty_deg", 3 },
};
#define NCOLS (sizeof pair_cols / sizeof pair_cols[0])
#define MAX_POINTS (4 * CLI_MAX_ITEMS)

static const char *const verdict_name[3] = { "pass", "uncertain", "fail" };
static const char *const verdict_text[3] = { "pass", "pass, not certain", "fail" };

/* The phase tolerance in degrees.  Every way of stating it ends here, so
 * another (say, from a wanted null depth) is one more branch. */
static int resolve_tolerance(const cli_ctx *ctx, const cli_args *a, double *tolerance_deg)
{
    static const char expected[] = "a phase tolerance in degrees above 0, such as 2";
    const char *t = cli_get(a, "tolerance", 0);
    if (!t) return cli_error(ctx, "tolerance", expected, "the tolerance is needed");
    if (cli_number(ctx, "tolerance", t, -1e9, 360.0, expected, tolerance_deg)) return CLI_EXIT_USAGE;
    if (!(*tolerance_deg > 0.0))
        return cli_error(ctx, "tolerance", expected, "'%s' must be greater than zero", t);
    return 0;
}

/* Per point results. */
typedef struct check {
    double delta_m, err_deg, unc_deg, allowed_m;
    cxl_verdict verdict;
} check;

/* Is b worse than a: a harder verdict, or the same with less margin? */
static int worse_check(const check *a, const check *b)
{
    if (b->verdict != a->verdict) return b->verdict > a->verdict;
    return b->err_deg + b->unc_deg > a->err_deg + a->unc_deg;
}

static void text_output(cli_ctx *ctx, const cli_args *a, const double *len, int nlen,
                        double vf, const char *from, double tol, double length_tol_m,
                        double vf_tol, const cli_freq_point *pts, const check *c, int np)
{
    char b1[96], b2[96], b3[96], b4[96];
    FILE *o = ctx->out;
    const char *label = cli_label(a);
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "pair%s%s\n", label[0] ? ": " : "", label);
    fprintf(o, "  lines            ");
    for (int i = 0; i < nlen; i++)
        fprintf(o, "%s %s m", i ? "," : "", cli_fmt(b1, sizeof b1, len[i], 3));
    fprintf(o, "\n  longest-shortest  %s\n", cli_fmt_length(ctx, b1, sizeof b1, c[0].delta_m));
    fprintf(o, "  velocity factor   %s%s%s\n", cli_fmt(b1, sizeof b1, vf, 4), from[0] ? "  " : "", from);
    fprintf(o, "  tolerance         %s deg", cli_fmt(b1, sizeof b1, tol, 3));
    if (length_tol_m > 0.0 || vf_tol > 0.0)
        fprintf(o, " (each length within %s m, VF within %s)", cli_fmt(b1, sizeof b1, length_tol_m, 3),
                cli_fmt(b2, sizeof b2, vf_tol, 4));
    fprintf(o, "\n  %-6s %16s  %9s  %11s  %-27s  %s\n", "band", "worst at", "error deg",
            "uncert. deg", "allowed mismatch", "verdict");
    int worst = -1;
    for (int i = 0; i < np;) {
        /* a band's edges form one group; each --freq point its own */
        int k = i + 1;
        while (k < np && pts[i].band[0] && strcmp(pts[k].band, pts[i].band) == 0) k++;
        int w = i;
        double allowed = c[i].allowed_m;
        for (int j = i + 1; j < k; j++) {
            if (worse_check(&c[w], &c[j])) w = j;
            if (c[j].allowed_m < allowed) allowed = c[j].allowed_m;
        }
        if (worst < 0 || worse_check(&c[worst], &c[w])) worst = w;
        char name[32];
        snprintf(name, sizeof name, "%s", pts[i].band[0] ? pts[i].band : "freq");
        fprintf(o, "  %-6s %12s MHz  %9s  %11s  %-27s  %s\n", name,
                cli_fmt(b1, sizeof b1, pts[w].freq_hz / 1e6, 6),
                cli_fmt(b2, sizeof b2, c[w].err_deg, 3), cli_fmt(b3, sizeof b3, c[w].unc_deg, 3),
                cli_fmt_length(ctx, b4, sizeof b4, allowed), verdict_text[c[w].verdict]);
        i = k;
    }
    const check *wc = &c[worst];
    if (pts[worst].band[0])
        snprintf(b4, sizeof b4, "%s", pts[worst].band);
    else
        snprintf(b4, sizeof b4, "%s MHz", cli_fmt(b3, sizeof b3, pts[worst].freq_hz / 1e6, 6));
    fprintf(o, "  worst             %s: %s deg at %s MHz against %s deg: %s\n", b4,
            cli_fmt(b1, sizeof b1, wc->err_deg, 3), cli_fmt(b2, sizeof b2, pts[worst].freq_hz / 1e6, 6),
            cli_fmt(b3, sizeof b3, tol, 3),
            verdict_text[wc->verdict]);
    if (wc->verdict == CXL_VERDICT_PASS_UNCERTAIN)
        fprintf(o, "                    (error plus uncertainty %s deg exceeds the tolerance)\n",
                cli_fmt(b1, sizeof b1, wc->err_deg + wc->unc_deg, 3));
}

static int pair_run(cli_ctx *ctx, const cli_args *a)
{
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    double len[CLI_MAX_ITEMS];
    int nlen = cli_items(ctx, a, "length", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nlen < 0) return CLI_EXIT_USAGE;
    if (nlen < 2)
        return cli_error(ctx, "length", "--length 20.00m --length 20.30m, or 20.00m;20.30m in a batch cell",
                         "at least two lengths are needed, %d given", nlen);
    for (int i = 0; i < nlen; i++)
        if (cli_length(ctx, "length", items[i], CLI_POSITIVE, &len[i])) return CLI_EXIT_USAGE;

    double vf, tol, length_tol_m = 0.0, vf_tol = 0.0;
    char from[256];
    int rc = cli_vf_source(ctx, a, &vf, ctx->format == CLI_TEXT ? from : NULL, sizeof from);
    if (rc || resolve_tolerance(ctx, a, &tol)) return CLI_EXIT_USAGE;
    if (cli_count(a, "length-tol") &&
        cli_length(ctx, "length-tol", cli_get(a, "length-tol", 0), CLI_NONNEG, &length_tol_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "vf-tol")) {
        const char *t = cli_get(a, "vf-tol", 0);
        if (cli_number(ctx, "vf-tol", t, 0.0, 1.0, "a VF tolerance below the VF, such as 0.01", &vf_tol))
            return CLI_EXIT_USAGE;
        if (!(vf_tol < vf))
            return cli_error(ctx, "vf-tol", "a VF tolerance below the VF, such as 0.01",
                             "'%s' is not below the VF", t);
    }

    cli_freq_point pts[MAX_POINTS];
    check c[MAX_POINTS];
    int np = cli_freq_points(ctx, a, pts, MAX_POINTS);
    if (np < 0) return CLI_EXIT_USAGE;
    int failed = 0;
    for (int i = 0; i < np; i++) {
        if (cxl_pair_check(len, (size_t)nlen, vf, pts[i].freq_hz, tol, length_tol_m, vf_tol,
                           &c[i].delta_m, &c[i].err_deg, &c[i].unc_deg, &c[i].verdict) != CXL_OK ||
            cxl_pair_max_mismatch(tol, vf, pts[i].freq_hz, &c[i].allowed_m) != CXL_OK ||
            !isfinite(c[i].err_deg) || !isfinite(c[i].unc_deg))
            return cli_error(ctx, "freq", "a smaller frequency", "gives no finite phase error");
        if (c[i].verdict == CXL_VERDICT_FAIL) failed = 1;
    }

    if (ctx->format == CLI_TEXT) {
        text_output(ctx, a, len, nlen, vf, from, tol, length_tol_m, vf_tol, pts, c, np);
    } else {
        const char *label = cli_label(a);
        for (int i = 0; i < np; i++) {
            cli_cell cells[NCOLS] = {
                CLI_TXT(label), CLI_TXT(pts[i].band), CLI_TXT(pts[i].edge),
                CLI_NUM(pts[i].freq_hz / 1e6), CLI_NUM(c[i].delta_m), CLI_NUM(c[i].err_deg),
                CLI_NUM(tol), CLI_TXT(verdict_name[c[i].verdict]), CLI_NUM(c[i].allowed_m),
                CLI_NUM(c[i].unc_deg),
            };
            cli_table_row(ctx, pair_cols, NCOLS, cells);
        }
    }
    return failed ? CLI_EXIT_TOLERANCE : CLI_EXIT_OK;
}

const cli_command cli_cmd_pair = {
    .name = "pair",
    .summary = "lines meant to be equal against a phase tolerance, per band edge",
    .synopsis = "--length LEN --length LEN ... (--vf X | --cable NAME | --vf-from FILE|-) "
                "--tolerance DEG (--band LIST | --freq F) [OPTIONS]",
    .opts = pair_opts,
    .end = cli_vf_source_end,
    .run = pair_run,
    .batch = 1,
};
