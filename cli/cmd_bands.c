/* cmd_bands.c - coaxline bands: the band table the per-band commands use,
 * either one ITU Region's segments or the widest edges across Regions. */
#include <config.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef bands_opts[] = {
    { "region", "N", "ITU Region 1, 2 or 3: its segments (default: widest edges across Regions)", 0 },
    { "band", "LIST", "only these bands, e.g. 160m,80m,mw", 1 },
    { "exclude-footnotes", NULL, "leave out segments that hold only in countries an RR footnote lists", 0 },
    { NULL, NULL, NULL, 0 }
};

/* The columns of data/bands.csv, so a Region's CSV output is itself a
 * band table. */
static const cli_col bands_cols[] = {
    { "band", -1 }, { "service", -1 }, { "region", -1 }, { "low_khz", 1 },
    { "high_khz", 1 }, { "footnote", -1 }, { "source", -1 },
};
#define NCOLS (sizeof bands_cols / sizeof bands_cols[0])

#define MAX_SOURCES 64

/* Distinct sources in order of first use, numbered for the text table. */
typedef struct source_list {
    const char *text[MAX_SOURCES];
    size_t n;
} source_list;

static size_t source_number(source_list *s, const char *text)
{
    for (size_t i = 0; i < s->n; i++)
        if (strcmp(s->text[i], text) == 0) return i + 1;
    if (s->n == MAX_SOURCES) return 0;
    s->text[s->n++] = text;
    return s->n;
}

/* One output line, in the chosen format.  sources[] holds one or two
 * sources (the rows that set the low and the high edge). */
static void put_row(cli_ctx *ctx, source_list *list, const char *band, cxl_service service,
                    const char *region, double low_hz, double high_hz, const char *footnote,
                    const char *const sources[2])
{
    const char *service_name = service == CXL_SERVICE_BROADCAST ? "broadcast" : "amateur";
    int two = sources[1] && strcmp(sources[0], sources[1]) != 0;
    if (ctx->format != CLI_TEXT) {
        char joined[2048];
        snprintf(joined, sizeof joined, "%s%s%s", sources[0], two ? " | " : "",
                 two ? sources[1] : "");
        cli_cell cells[NCOLS] = {
            CLI_TXT(band), CLI_TXT(service_name), CLI_TXT(region), CLI_NUM(low_hz / 1e3),
            CLI_NUM(high_hz / 1e3), CLI_TXT(footnote), CLI_TXT(joined),
        };
        cli_table_row(ctx, bands_cols, NCOLS, cells);
        return;
    }
    char lo[32], hi[32], refs[32];
    size_t r0 = source_number(list, sources[0]), r1 = two ? source_number(list, sources[1]) : 0;
    if (r1) snprintf(refs, sizeof refs, "[%zu][%zu]", r0, r1);
    else snprintf(refs, sizeof refs, "[%zu]", r0);
    fprintf(ctx->out, "  %-6s %-10s %-6s %10s %10s  %-9s %s\n", band, service_name, region,
            cli_fmt(lo, sizeof lo, low_hz / 1e3, 1), cli_fmt(hi, sizeof hi, high_hz / 1e3, 1),
            footnote, refs);
}

/* Does table row name belong to one of the wanted bands (all when none)? */
static int wanted(const char *name, const char *const *names, int n)
{
    if (n == 0) return 1;
    for (int i = 0; i < n; i++)
        if (strcmp(names[i], name) == 0) return 1;
    return 0;
}

/* What the table rows of one band add up to in the widest view. */
typedef struct widest_edges {
    double lo, hi;       /* edges with footnote segments as asked */
    double glo, ghi;     /* edges of the general allocations, when general */
    int general, footnotes;
    char notes[128];     /* footnotes whose segments reach beyond glo..ghi */
    const char *src[2];  /* the rows that set the low and the high edge */
    cxl_service service;
} widest_edges;

/* Add footnote fn to the space-separated notes once, when it fits. */
static void add_footnote(char *notes, size_t size, const char *fn)
{
    if (strstr(notes, fn) || strlen(notes) + strlen(fn) + 2 >= size) return;
    if (notes[0]) strcat(notes, " ");
    strcat(notes, fn);
}

/* Table row r, when it is one of band name's rows of this pass (0: general
 * allocations, 1: footnote segments): its service, its source if it sets
 * an edge, its footnote if it widens the band. */
static void widest_take(widest_edges *w, const cxl_bands *bands, size_t r, const char *name,
                        int pass)
{
    const char *rname, *fn, *source;
    double rl, rh;
    cxl_service sv;
    cxl_bands_get(bands, r, &rname, &sv, NULL, &rl, &rh, &fn, &source);
    if (strcmp(rname, name) != 0 || (fn[0] != '\0') != pass) return;
    if (pass && !w->footnotes) return;
    w->service = sv;
    if (!w->src[0] && rl == w->lo) w->src[0] = source;
    if (!w->src[1] && rh == w->hi) w->src[1] = source;
    if (pass && (!w->general || rl < w->glo || rh > w->ghi))
        add_footnote(w->notes, sizeof w->notes, fn);
}

/* Widest edges of one band across Regions; the footnotes named are those
 * whose segments reach beyond the general allocations. */
static int widest_row(cli_ctx *ctx, source_list *list, const cxl_bands *bands,
                      const char *name, int footnotes)
{
    widest_edges w = { .footnotes = footnotes, .service = CXL_SERVICE_AMATEUR };
    if (cxl_bands_edges(bands, name, 0, footnotes, &w.lo, &w.hi) != CXL_OK) return 0;
    w.general = cxl_bands_edges(bands, name, 0, 0, &w.glo, &w.ghi) == CXL_OK;
    /* pass 0: general allocations set the edges' sources first; pass 1: footnotes */
    for (int pass = 0; pass < 2; pass++)
        for (size_t r = 0; r < cxl_bands_count(bands); r++)
            widest_take(&w, bands, r, name, pass);
    if (!w.src[0]) w.src[0] = "";
    put_row(ctx, list, name, w.service, "all", w.lo, w.hi, w.notes, w.src);
    return 1;
}

/* The --band names as the table spells them, into names[0..*n); a name
 * the table does not hand back points into buf. */
static int wanted_names(cli_ctx *ctx, const cli_args *a, int region, int footnotes,
                        char *buf, size_t size, const char **names, int *n)
{
    const char *items[CLI_MAX_ITEMS];
    *n = cli_items(ctx, a, "band", buf, size, items, CLI_MAX_ITEMS);
    if (*n < 0) return CLI_EXIT_USAGE;
    for (int i = 0; i < *n; i++) {
        double lo, hi;
        if (cli_band_lookup(ctx, items[i], region, footnotes, &lo, &hi, &names[i]))
            return CLI_EXIT_USAGE;
    }
    return CLI_EXIT_OK;
}

static void text_head(cli_ctx *ctx, int region, int footnotes)
{
    char r[48] = "widest edges across ITU Regions 1-3";
    if (region) snprintf(r, sizeof r, "ITU Region %d", region);
    fprintf(ctx->out, "bands: %s, footnote segments %s\n", r,
            footnotes ? "included" : "left out");
    fprintf(ctx->out, "  %-6s %-10s %-6s %10s %10s  %-9s %s\n", "band", "service", "region",
            "low kHz", "high kHz", "footnote", "source");
}

static void text_tail(cli_ctx *ctx, const source_list *list, size_t shown)
{
    if (shown == 0) fprintf(ctx->out, "  (no segment)\n");
    fprintf(ctx->out, "sources:\n");
    for (size_t i = 0; i < list->n; i++)
        fprintf(ctx->out, "  [%zu] %s\n", i + 1, list->text[i]);
}

/* The band filter and view: a Region's segments, or (region 0) the
 * widest edges across Regions. */
typedef struct bands_view {
    int region, footnotes, nb;
    const char *names[CLI_MAX_ITEMS];
    char buf[1024]; /* the --band text */
} bands_view;

/* The lines table row r gives in view v: 0 or 1. */
static size_t show_row(cli_ctx *ctx, source_list *list, const cxl_bands *bands, size_t r,
                       const bands_view *v)
{
    const char *name, *fn, *source;
    int reg;
    double lo, hi;
    cxl_service sv;
    cxl_bands_get(bands, r, &name, &sv, &reg, &lo, &hi, &fn, &source);
    if (!wanted(name, v->names, v->nb)) return 0;
    if (v->region) {
        if (reg != v->region || (!v->footnotes && fn[0] != '\0')) return 0;
        char rtext[4] = { (char)('0' + reg), '\0' };
        const char *src[2] = { source, NULL };
        put_row(ctx, list, name, sv, rtext, lo, hi, fn, src);
        return 1;
    }
    /* widest view: one line per band, at its first row (the row whose
     * name string cxl_bands_name hands back) */
    const char *first;
    if (cxl_bands_name(bands, name, &first) != CXL_OK || first != name) return 0;
    return (size_t)widest_row(ctx, list, bands, name, v->footnotes);
}

static int bands_run(cli_ctx *ctx, const cli_args *a)
{
    bands_view v;
    if (cli_region(ctx, a, &v.region)) return CLI_EXIT_USAGE;
    v.footnotes = !cli_flag(a, "exclude-footnotes");
    if (wanted_names(ctx, a, v.region, v.footnotes, v.buf, sizeof v.buf, v.names, &v.nb))
        return CLI_EXIT_USAGE;
    const cxl_bands *bands = cli_bands(ctx);
    if (!bands) return CLI_EXIT_USAGE;
    if (ctx->format == CLI_TEXT) text_head(ctx, v.region, v.footnotes);
    source_list list = { { NULL }, 0 };
    size_t shown = 0;
    for (size_t r = 0; r < cxl_bands_count(bands); r++)
        shown += show_row(ctx, &list, bands, r, &v);
    if (ctx->format == CLI_TEXT) text_tail(ctx, &list, shown);
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_bands = {
    .name = "bands",
    .summary = "band edges per ITU Region, as the per-band commands use them",
    .synopsis = "[--region N] [--band LIST] [--exclude-footnotes]",
    .opts = bands_opts,
    .run = bands_run,
    .batch = 0,
};
