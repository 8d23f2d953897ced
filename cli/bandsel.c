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

int cli_freq_points(cli_ctx *ctx, const cli_args *a, cli_freq_point *pts, size_t max,
                    int *region_out)
{
    int region;
    if (cli_region(ctx, a, &region)) return -1;
    if (region_out) *region_out = region;
    int footnotes = !cli_flag(a, "exclude-footnotes");
    char buf[1024];
    const char *items[CLI_MAX_ITEMS];
    size_t n = 0;
    int nb = cli_items(ctx, a, "band", buf, sizeof buf, items, CLI_MAX_ITEMS);
    if (nb < 0) return -1;
    for (int i = 0; i < nb; i++) {
        double lo, hi;
        const char *canon;
        if (cli_band_lookup(ctx, items[i], region, footnotes, &lo, &hi, &canon)) return -1;
        if (n + 3 > max)
            return cli_error(ctx, "band", "fewer bands", "too many bands"), -1;
        const char *edges[3] = { "low", "centre", "high" };
        double f[3] = { lo, 0.5 * (lo + hi), hi };
        for (int k = 0; k < 3; k++, n++) {
            snprintf(pts[n].band, sizeof pts[n].band, "%s", canon);
            pts[n].edge = edges[k];
            pts[n].freq_hz = f[k];
        }
    }
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
