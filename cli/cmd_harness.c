/* cmd_harness.c - coaxline harness: the cut list of an array's phasing
 * harness from its layout file (feed runs of equal electrical length to
 * the combiner, the delay lines the layout asks for), each piece with its
 * tape reading and analyzer check, packed onto the drums given.  The plan
 * is the library's (coaxline.h, harness.c). */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

static const cli_optdef harness_opts[] = {
    { "layout", "FILE", "layout CSV: label,x,y,z,delay,line,degrees,invert,weight", 0 },
    { "combiner", "X,Y", "position of the combiner, e.g. 0,0 or -2m,0m", 0 },
    { "vf", "X", "velocity factor of the cable the harness is cut from", 0 },
    { "cable", "NAME", "the cable from the catalog (its VF)", 0 },
    { "drum", "LEN", "length of cable on a drum (repeat or list for several)", 1 },
    { "slack", "LEN", "added to the longest run the ground distance needs (default 0)", 0 },
    { "allowance", "LEN", "line in each piece's connectors, its delay counted (default 0)", 0 },
    { "kerf", "LEN", "cable lost at each cut (default 0)", 0 },
    { "design-freq", "F", "frequency at which the layout's degrees column holds", 0 },
    { "freq", "F", "also show each piece's electrical length at this frequency", 0 },
    { "label", "TEXT", "name kept in every output row", 0 },
    { NULL, NULL, NULL, 0 }
};

static const cli_col harness_cols[] = {
    { "label", -1 }, { "element", -1 }, { "piece", -1 }, { "length_m", 3 },
    { "length_ft", 4 }, { "tape", -1 }, { "check_mhz", 4 }, { "electrical_deg", 3 },
    { "drum", 0 }, { "drum_used_m", 3 },
};
#define NCOLS (sizeof harness_cols / sizeof harness_cols[0])

static const char *const kind_name[] = { "feed", "delay" };

typedef struct {
    cli_layout lay;
    double vf, comb_x, comb_y, slack, allowance, kerf, freq_hz;
    const char *cable;
    size_t ndrums;
    double drum_m[CXL_HARNESS_MAX_DRUMS];
} harness_spec;

/* "X,Y": two lengths around one comma. */
static int parse_combiner(cli_ctx *ctx, const cli_args *a, harness_spec *s)
{
    const char *v = cli_get(a, "combiner", 0);
    const char *want = "two lengths X,Y such as 0,0 or -2.5m,0m";
    if (!v) return cli_error(ctx, "combiner", "--combiner 0,0", "the harness needs the combiner's position");
    const char *comma = strchr(v, ',');
    if (!comma || strchr(comma + 1, ','))
        return cli_error(ctx, "combiner", want, "'%s' is not one x and one y", v);
    char x[128];
    size_t n = (size_t)(comma - v);
    if (n >= sizeof x) return cli_error(ctx, "combiner", want, "x is too long");
    memcpy(x, v, n);
    x[n] = '\0';
    if (cli_length(ctx, "combiner", x, CLI_ANY, &s->comb_x) ||
        cli_length(ctx, "combiner", comma + 1, CLI_ANY, &s->comb_y))
        return CLI_EXIT_USAGE;
    return 0;
}

static int parse_spec(cli_ctx *ctx, const cli_args *a, harness_spec *s)
{
    memset(s, 0, sizeof *s);
    if (!cli_count(a, "layout"))
        return cli_error(ctx, "layout", "--layout array.csv", "the harness needs the array's layout file");
    if (parse_combiner(ctx, a, s) || cli_vf_or_cable(ctx, a, &s->vf, &s->cable))
        return CLI_EXIT_USAGE;
    static const char *const lens[] = { "slack", "allowance", "kerf" };
    double *dst[] = { &s->slack, &s->allowance, &s->kerf };
    for (int i = 0; i < 3; i++)
        if (cli_count(a, lens[i]) &&
            cli_length(ctx, lens[i], cli_get(a, lens[i], 0), CLI_NONNEG, dst[i]))
            return CLI_EXIT_USAGE;
    char buf[4096];
    const char *items[CLI_MAX_ITEMS];
    int nd = cli_items(ctx, a, "drum", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nd < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < nd; i++)
        if (cli_length(ctx, "drum", items[i], CLI_POSITIVE, &s->drum_m[i])) return CLI_EXIT_USAGE;
    s->ndrums = (size_t)nd;
    double design_hz = 0.0;
    if (cli_count(a, "design-freq") &&
        cli_freq(ctx, "design-freq", cli_get(a, "design-freq", 0), &design_hz))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "freq") && cli_freq(ctx, "freq", cli_get(a, "freq", 0), &s->freq_hz))
        return CLI_EXIT_USAGE;
    return cli_layout_load(ctx, "layout", cli_get(a, "layout", 0), s->vf, design_hz, &s->lay);
}

/* The plan; CLI_EXIT_USAGE after cli_error(), else 0 (*full: some piece
 * fits no drum). */
static int plan(cli_ctx *ctx, const harness_spec *s, cxl_harness **out, int *full)
{
    cxl_harness *h = NULL;
    cxl_status st = cxl_harness_new(s->vf, &h);
    for (size_t i = 0; st == CXL_OK && i < s->lay.n; i++)
        st = cxl_harness_add_element(h, s->lay.el[i].x_m, s->lay.el[i].y_m, s->lay.el[i].delay_s,
                                     NULL);
    if (st == CXL_OK) st = cxl_harness_set_combiner(h, s->comb_x, s->comb_y);
    if (st == CXL_OK) st = cxl_harness_set_cuts(h, s->slack, s->allowance, s->kerf);
    for (size_t d = 0; st == CXL_OK && d < s->ndrums; d++)
        st = cxl_harness_add_drum(h, s->drum_m[d], NULL);
    if (st == CXL_OK) st = cxl_harness_plan(h);
    *full = st == CXL_ERANGE;
    if (st == CXL_OK || st == CXL_ERANGE) {
        *out = h;
        return 0;
    }
    cxl_harness_free(h);
    if (st == CXL_EINCONSISTENT)
        return cli_error(ctx, "allowance", "an allowance shorter than every piece, by 1 mm at least",
                         "the connector allowance leaves a piece under 1 mm (a delay line or "
                         "feed run is no longer than the allowance)");
    return cli_error(ctx, "layout", "a layout, combiner and lengths within 10 000 km",
                     "the harness cannot be planned: %s", cxl_strerror(st));
}

/* One piece's numbers. */
typedef struct {
    size_t element, drum;
    cxl_piece_kind kind;
    double length_m, check_hz;
} piece;

static void text_out(cli_ctx *ctx, const harness_spec *s, const cxl_harness *h, const char *label)
{
    FILE *o = ctx->out;
    char b[6][96];
    double feed_m = 0.0, feed_s = 0.0;
    cxl_harness_feed_run(h, &feed_m, &feed_s);
    if (ctx->rows_out++) putc('\n', o);
    fprintf(o, "harness%s%s: %zu elements, VF %s%s%s\n", label[0] ? ": " : "", label, s->lay.n,
            cli_fmt(b[0], sizeof b[0], s->vf, 4), s->cable[0] ? ", cable " : "", s->cable);
    fprintf(o, "  combiner     x %s m, y %s m\n", cli_fmt(b[0], sizeof b[0], s->comb_x, 3),
            cli_fmt(b[1], sizeof b[1], s->comb_y, 3));
    fprintf(o, "  feed runs    %s each (%s ns): the longest straight ground distance to the "
               "combiner plus %s m slack\n",
            cli_fmt_length(ctx, b[0], sizeof b[0], feed_m), cli_fmt(b[1], sizeof b[1], feed_s * 1e9, 3),
            cli_fmt(b[2], sizeof b[2], s->slack, 3));
    fprintf(o, "  cuts         allowance %s m per piece (its delay counted), kerf %s m per cut\n",
            cli_fmt(b[0], sizeof b[0], s->allowance, 3), cli_fmt(b[1], sizeof b[1], s->kerf, 3));
    fprintf(o, "\n  %-10s %-6s %10s %11s  %-18s %9s", "element", "piece", "length m", "length ft",
            "tape", "check MHz");
    if (s->freq_hz > 0.0) fprintf(o, " %9s", "deg");
    fprintf(o, " %5s\n", "drum");
    int out_of_drum = 0;
    for (size_t k = 0; k < cxl_harness_piece_count(h); k++) {
        piece p;
        cxl_harness_piece(h, k, &p.element, &p.kind, &p.length_m, &p.check_hz, &p.drum);
        if (cxl_units_format_imperial(p.length_m, b[2], sizeof b[2]) != CXL_OK)
            snprintf(b[2], sizeof b[2], "?");
        fprintf(o, "  %-10s %-6s %10s %11s  %-18s %9s", s->lay.el[p.element].label,
                kind_name[p.kind], cli_fmt(b[0], sizeof b[0], p.length_m, 3),
                cli_fmt(b[1], sizeof b[1], p.length_m / 0.3048, 4), b[2],
                cli_fmt(b[3], sizeof b[3], p.check_hz / 1e6, 4));
        if (s->freq_hz > 0.0)
            fprintf(o, " %9s", cli_fmt(b[4], sizeof b[4],
                                       360.0 * s->freq_hz * (p.length_m + s->allowance) /
                                           (s->vf * CXL_C_M_PER_S), 3));
        if (p.drum == CXL_HARNESS_NO_DRUM) {
            fprintf(o, " %5s\n", "-");
            out_of_drum = 1;
        } else {
            fprintf(o, " %5zu\n", p.drum + 1);
        }
    }
    fprintf(o, "  check: first low-impedance dip of the cut piece, far end open\n");
    if (s->freq_hz > 0.0)
        fprintf(o, "  deg: electrical length with the allowance at %s MHz\n",
                cli_fmt(b[0], sizeof b[0], s->freq_hz / 1e6, 6));
    if (s->ndrums == 0) return;
    fprintf(o, "\n  %-5s %10s %10s %10s\n", "drum", "length m", "used m", "left m");
    for (size_t d = 0; d < s->ndrums; d++) {
        double used = 0.0, left = 0.0;
        cxl_harness_drum(h, d, &used, &left);
        fprintf(o, "  %-5zu %10s %10s %10s\n", d + 1, cli_fmt(b[0], sizeof b[0], s->drum_m[d], 3),
                cli_fmt(b[1], sizeof b[1], used, 3), cli_fmt(b[2], sizeof b[2], left, 3));
    }
    fprintf(o, "  used: cut lengths plus one kerf per piece\n");
    if (out_of_drum) fprintf(o, "  (-: no drum can hold this piece)\n");
}

static void table_out(cli_ctx *ctx, const harness_spec *s, const cxl_harness *h, const char *label)
{
    char tape[64];
    for (size_t k = 0; k < cxl_harness_piece_count(h); k++) {
        piece p;
        cxl_harness_piece(h, k, &p.element, &p.kind, &p.length_m, &p.check_hz, &p.drum);
        if (cxl_units_format_imperial(p.length_m, tape, sizeof tape) != CXL_OK) tape[0] = '\0';
        double deg = 360.0 * s->freq_hz * (p.length_m + s->allowance) / (s->vf * CXL_C_M_PER_S);
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(s->lay.el[p.element].label), CLI_TXT(kind_name[p.kind]),
            CLI_NUM(p.length_m), CLI_NUM(p.length_m / 0.3048), CLI_TXT(tape),
            CLI_NUM(p.check_hz / 1e6), s->freq_hz > 0.0 ? CLI_NUM(deg) : CLI_NONE,
            p.drum == CXL_HARNESS_NO_DRUM ? CLI_NONE : CLI_NUM((double)(p.drum + 1)), CLI_NONE,
        };
        cli_table_row(ctx, harness_cols, NCOLS, cells);
    }
    /* what is left on each drum is a piece of its own */
    for (size_t d = 0; d < s->ndrums; d++) {
        double used = 0.0, left = 0.0;
        cxl_harness_drum(h, d, &used, &left);
        if (cxl_units_format_imperial(left, tape, sizeof tape) != CXL_OK) tape[0] = '\0';
        cli_cell cells[NCOLS] = {
            CLI_TXT(label), CLI_TXT(""), CLI_TXT("left"), CLI_NUM(left), CLI_NUM(left / 0.3048),
            CLI_TXT(tape), CLI_NONE, CLI_NONE, CLI_NUM((double)(d + 1)), CLI_NUM(used),
        };
        cli_table_row(ctx, harness_cols, NCOLS, cells);
    }
}

static int harness_run(cli_ctx *ctx, const cli_args *a)
{
    harness_spec s;
    cxl_harness *h = NULL;
    int full = 0;
    if (parse_spec(ctx, a, &s) || plan(ctx, &s, &h, &full)) {
        cli_layout_free(&s.lay);
        return CLI_EXIT_USAGE;
    }
    const char *label = cli_label(a);
    if (ctx->format == CLI_TEXT) text_out(ctx, &s, h, label);
    else table_out(ctx, &s, h, label);
    int code = CLI_EXIT_OK;
    if (full) {
        /* the list is printed whole, the pieces no drum holds without a
         * drum; the run fails */
        size_t out = 0;
        double need = 0.0;
        char b[32];
        for (size_t k = 0; k < cxl_harness_piece_count(h); k++) {
            piece p;
            cxl_harness_piece(h, k, &p.element, &p.kind, &p.length_m, &p.check_hz, &p.drum);
            if (p.drum == CXL_HARNESS_NO_DRUM) out++, need += p.length_m + s.kerf;
        }
        cli_error(ctx, "drum", "drums long enough for every piece, e.g. another --drum",
                  "the drums cannot hold the harness: %zu of %zu pieces (%s m with kerf) fit on none",
                  out, cxl_harness_piece_count(h), cli_fmt(b, sizeof b, need, 3));
        code = CLI_EXIT_TOLERANCE;
    }
    cxl_harness_free(h);
    cli_layout_free(&s.lay);
    return code;
}

const cli_command cli_cmd_harness = {
    .name = "harness",
    .summary = "phasing-harness cut list from a layout file, packed onto drums",
    .synopsis = "--layout FILE.csv --combiner X,Y (--vf X | --cable NAME) [--drum LEN ...] [OPTIONS]",
    .opts = harness_opts,
    .run = harness_run,
    .batch = 0,
};
