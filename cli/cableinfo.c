/* cableinfo.c - small pieces shared by the cables and loss commands:
 * describing a cable's loss table and models in text. */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

const char *cli_clean(char *buf, size_t size, const char *text)
{
    return cli_escape(buf, size, text);
}

const char *cli_fmt_range_mhz(char *buf, size_t size, double lo_hz, double hi_hz)
{
    char lo[48], hi[48];
    snprintf(buf, size, "%s-%s MHz", cli_fmt(lo, sizeof lo, lo_hz / 1e6, 3),
             cli_fmt(hi, sizeof hi, hi_hz / 1e6, 3));
    return buf;
}

cxl_loss_fit *cli_cable_fit(const cxl_catalog *cat, size_t index)
{
    cxl_loss_fit *fit = NULL;
    if (cxl_loss_fit_new_cable(cat, index, &fit) != CXL_OK) return NULL;
    return fit;
}

struct cli_cable_cache {
    size_t n;                 /* catalog rows */
    cxl_loss_fit **fit;
    cxl_loss_model **model;
    cxl_status *model_st;     /* CXL_EINVAL: not built yet */
    unsigned char *fit_tried;
};

void cli_cable_cache_free(cli_cable_cache *c)
{
    if (!c) return;
    for (size_t i = 0; i < c->n; i++) {
        cxl_loss_fit_free(c->fit[i]);
        cxl_loss_model_free(c->model[i]);
    }
    free(c->fit);
    free(c->model);
    free(c->model_st);
    free(c->fit_tried);
    free(c);
}

/* The cache for cat's rows, made on first use; NULL when out of memory
 * or index is not a row. */
static cli_cable_cache *cache_for(cli_cable_cache **cache, const cxl_catalog *cat,
                                  size_t index)
{
    cli_cable_cache *c = *cache;
    if (!c) {
        size_t n = cxl_catalog_count(cat);
        c = calloc(1, sizeof *c);
        if (!c) return NULL;
        c->n = n;
        c->fit = calloc(n ? n : 1, sizeof *c->fit);
        c->model = calloc(n ? n : 1, sizeof *c->model);
        c->model_st = malloc((n ? n : 1) * sizeof *c->model_st);
        c->fit_tried = calloc(n ? n : 1, 1);
        if (!c->fit || !c->model || !c->model_st || !c->fit_tried) {
            c->n = 0;
            cli_cable_cache_free(c);
            return NULL;
        }
        for (size_t i = 0; i < n; i++) c->model_st[i] = CXL_EINVAL;
        *cache = c;
    }
    return index < c->n ? c : NULL;
}

const cxl_loss_fit *cli_cable_cache_fit(cli_cable_cache **cache, const cxl_catalog *cat,
                                        size_t index)
{
    cli_cable_cache *c = cache_for(cache, cat, index);
    if (!c) return NULL;
    if (!c->fit_tried[index]) {
        c->fit[index] = cli_cable_fit(cat, index);
        c->fit_tried[index] = 1;
    }
    return c->fit[index];
}

cxl_status cli_cable_cache_model(cli_cable_cache **cache, const cxl_catalog *cat,
                                 size_t index, const cxl_loss_model **model)
{
    cli_cable_cache *c = cache_for(cache, cat, index);
    if (!c) return CXL_ENOMEM;
    if (c->model_st[index] == CXL_EINVAL)
        c->model_st[index] = cxl_loss_model_new_cable(cat, index, &c->model[index]);
    if (c->model_st[index] == CXL_OK) *model = c->model[index];
    return c->model_st[index];
}

const char *cli_fmt_fit(char *buf, size_t size, const cxl_loss_fit *fit)
{
    double lo, hi, rel;
    char range[96], usable[96], res[32];
    if (cxl_loss_fit_range(fit, &lo, &hi) != CXL_OK ||
        cxl_loss_fit_max_relative_residual(fit, &rel) != CXL_OK) {
        snprintf(buf, size, "?");
        return buf;
    }
    size_t n = cxl_loss_fit_count(fit);
    cli_fmt_range_mhz(range, sizeof range, lo, hi);
    double use_lo = lo, use_hi = hi;
    cxl_loss_fit_usable_range(fit, &use_lo, &use_hi);
    cli_fmt_range_mhz(usable, sizeof usable, use_lo, use_hi);
    snprintf(buf, size, "a*sqrt(f) + b*f fitted to %zu table points %s "
             "(usable %s), largest residual %s %%", n, range, usable,
             cli_fmt(res, sizeof res, 100.0 * rel, 1));
    return buf;
}
