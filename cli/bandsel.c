/* bandsel.c - the frequencies a per-band command evaluates: each --band's
 * low edge, centre and high edge (for --region, or the widest across
 * Regions), plus any --freq given directly. */
#include <config.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

const cxl_bands *cli_bands(cli_ctx *ctx)
{
    if (!ctx->bands && cxl_bands_new(&ctx->bands) != CXL_OK) {
        cli_error(ctx, "band", NULL, "cannot build the band table");
        return NULL;
    }
    return ctx->bands;
}

int cli_region(const cli_ctx *ctx, const cli_args *a, int *region)
{
    const char *text = cli_get(a, "region", 0);
    *region = 0;
    if (!text) return 0;
    double v;
    if (cli_number(ctx, "region", text, 1.0, 3.0, "ITU Region 1, 2 or 3", &v)) return CLI_EXIT_USAGE;
    if (v != (int)v)
        return cli_error(ctx, "region", "ITU Region 1, 2 or 3", "'%s' is not a whole number", text);
    *region = (int)v;
    return 0;
}

int cli_band_lookup(cli_ctx *ctx, const char *item, int region, int footnotes,
                    double *low_hz, double *high_hz, const char **name)
{
    const cxl_bands *bands = cli_bands(ctx);
    if (!bands) return CLI_EXIT_USAGE;
    cxl_status st = cxl_bands_edges(bands, item, region, footnotes, low_hz, high_hz);
    if (st == CXL_ENOTFOUND)
        return cli_error(ctx, "band", "a band such as 160m, 80m, 40m or mw (see coaxline bands)",
                         region ? "no band '%s' in Region %d" : "unknown band '%s'",
                         item, region);
    if (st != CXL_OK)
        return cli_error(ctx, "band", "a band such as 160m", "%s", cxl_strerror(st));
    if (cxl_bands_name(bands, item, name) != CXL_OK) *name = item;
    return 0;
}

/* name into a cli_freq_point's band, cut short as it always was. */
static void copy_band(char dst[16], const char *name)
{
    size_t len = strnlen(name, 15);
    memcpy(dst, name, len);
    dst[len] = '\0';
}

/* Edges and table name of one --band item, from ctx's memo when the same
 * item was looked up for the same Region and footnote rule before. */
static int band_edges(cli_ctx *ctx, const char *item, int region, int footnotes,
                      double *lo, double *hi, char name[16])
{
    size_t len = strlen(item);
    for (int i = 0; i < ctx->band_memo_n; i++) {
        const cli_band_memo *m = &ctx->band_memo[i];
        if (m->item[0] == item[0] && m->region == region && m->footnotes == footnotes &&
            strcmp(m->item, item) == 0) {
            *lo = m->low_hz;
            *hi = m->high_hz;
            memcpy(name, m->name, sizeof m->name);
            return 0;
        }
    }
    const char *canon;
    if (cli_band_lookup(ctx, item, region, footnotes, lo, hi, &canon)) return CLI_EXIT_USAGE;
    copy_band(name, canon);
    if (len < sizeof ctx->band_memo[0].item && ctx->band_memo_n < CLI_BAND_MEMO) {
        cli_band_memo *m = &ctx->band_memo[ctx->band_memo_n++];
        memcpy(m->item, item, len + 1);
        memcpy(m->name, name, sizeof m->name);
        m->region = region;
        m->footnotes = footnotes;
        m->low_hz = *lo;
        m->high_hz = *hi;
    }
    return 0;
}

/* Low edge, centre and high edge of each --band after n points. */
static int band_points(cli_ctx *ctx, const cli_args *a, int region, cli_freq_point *pts,
                       size_t max, size_t *n)
{
    static const char *const edges[3] = { "low", "centre", "high" };
    int footnotes = !cli_flag(a, "exclude-footnotes");
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    int nb = cli_items(ctx, a, "band", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nb < 0) return -1;
    for (int i = 0; i < nb; i++) {
        double lo, hi;
        char name[16];
        if (band_edges(ctx, items[i], region, footnotes, &lo, &hi, name)) return -1;
        if (*n + 3 > max)
            return cli_error(ctx, "band", "fewer bands", "too many bands"), -1;
        double f[3] = { lo, 0.5 * (lo + hi), hi };
        for (int k = 0; k < 3; k++, (*n)++) {
            memcpy(pts[*n].band, name, sizeof name);
            pts[*n].edge = edges[k];
            pts[*n].freq_hz = f[k];
        }
    }
    return 0;
}

int cli_freq_points(cli_ctx *ctx, const cli_args *a, cli_freq_point *pts, size_t max,
                    int *region_out)
{
    int region;
    if (cli_region(ctx, a, &region)) return -1;
    if (region_out) *region_out = region;
    size_t n = 0;
    if (band_points(ctx, a, region, pts, max, &n)) return -1;
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    int nf = cli_items(ctx, a, "freq", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nf < 0) return -1;
    for (int i = 0; i < nf; i++) {
        if (n == max) return cli_error(ctx, "freq", "fewer frequencies", "too many frequencies"), -1;
        if (cli_freq(ctx, "freq", items[i], &pts[n].freq_hz)) return -1;
        pts[n].band[0] = '\0';
        pts[n].edge = "freq";
        n++;
    }
    if (n == 0)
        return cli_error(ctx, "band", "--band 160m,80m or --freq 1.83MHz",
                         "at least one band or frequency is needed"), -1;
    return (int)n;
}
