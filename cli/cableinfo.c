/* cableinfo.c - small pieces shared by the cables and loss commands:
 * describing a cable's loss table and models in text. */
#include <config.h>
#include <stdio.h>
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
