/* cmd_cables.c - coaxline cables: the cable catalog, built-in rows and the
 * user's, as a list or one cable in full. */
#include <config.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

static const cli_optdef cables_opts[] = {
    { "cable", "NAME", "show this cable only, in full (loss points, models, sources)", 0 },
    { NULL, NULL, NULL, 0 }
};

/* Numeric columns, in the catalog's SI units scaled to the column's unit. */
static const struct {
    cxl_cable_prop prop;
    double scale;
} num_props[] = {
    { CXL_CABLE_Z0_OHM, 1.0 }, { CXL_CABLE_VF, 1.0 },
    { CXL_CABLE_INNER_DIAMETER_M, 1e3 }, { CXL_CABLE_DIELECTRIC_DIAMETER_M, 1e3 },
    { CXL_CABLE_RELATIVE_PERMITTIVITY, 1.0 }, { CXL_CABLE_LOSS_TANGENT, 1.0 },
    { CXL_CABLE_CONDUCTIVITY_S_PER_M, 1.0 }, { CXL_CABLE_CONDUCTOR_LOSS_FACTOR, 1.0 },
    { CXL_CABLE_CLAD_THICKNESS_M, 1e3 }, { CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M, 1.0 },
    { CXL_CABLE_CORE_RELATIVE_PERMEABILITY, 1.0 },
};
#define NPROPS (sizeof num_props / sizeof num_props[0])

/* Column order: the properties users look for first, source, then the
 * conductor details (extra columns only ever go at the end). */
static const cli_col cables_cols[] = {
    { "name", -1 }, { "z0_ohm", 1 }, { "vf", 4 }, { "dielectric", -1 },
    { "inner_diameter_mm", 3 }, { "dielectric_diameter_mm", 3 },
    { "relative_permittivity", 4 }, { "loss_tangent", 6 }, { "builtin", -1 },
    { "loss_points", 0 }, { "loss_min_mhz", 3 }, { "loss_max_mhz", 3 }, { "source", -1 },
    { "conductivity_s_per_m", 0 }, { "conductor_loss_factor", 3 }, { "clad_thickness_mm", 3 },
    { "core_conductivity_s_per_m", 0 }, { "core_relative_permeability", 1 },
};
#define NCOLS (sizeof cables_cols / sizeof cables_cols[0])

/* Every property of cable i; absent ones are left CLI_NONE. */
typedef struct cable_info {
    const char *name, *dielectric, *source;
    int builtin;
    size_t npoints;
    double lo_hz, hi_hz;
    cli_cell prop[NPROPS];
} cable_info;

static void get_info(const cxl_catalog *cat, size_t i, cable_info *c)
{
    memset(c, 0, sizeof *c);
    cxl_catalog_name(cat, i, &c->name);
    cxl_catalog_dielectric(cat, i, &c->dielectric);
    cxl_catalog_source(cat, i, &c->source);
    cxl_catalog_is_builtin(cat, i, &c->builtin);
    c->npoints = cxl_catalog_loss_count(cat, i);
    if (c->npoints) {
        cxl_catalog_loss_point(cat, i, 0, &c->lo_hz, &(double){ 0 }, NULL);
        cxl_catalog_loss_point(cat, i, c->npoints - 1, &c->hi_hz, &(double){ 0 }, NULL);
    }
    for (size_t k = 0; k < NPROPS; k++) {
        double v;
        c->prop[k] = cxl_catalog_value(cat, i, num_props[k].prop, &v) == CXL_OK
                         ? CLI_NUM(v * num_props[k].scale) : CLI_NONE;
    }
}

static void table_row(cli_ctx *ctx, const cable_info *c)
{
    cli_cell cells[NCOLS] = {
        CLI_TXT(c->name), c->prop[0], c->prop[1], CLI_TXT(c->dielectric[0] ? c->dielectric : NULL),
        c->prop[2], c->prop[3], c->prop[4], c->prop[5], CLI_TXT(c->builtin ? "yes" : "no"),
        CLI_NUM((double)c->npoints), c->npoints ? CLI_NUM(c->lo_hz / 1e6) : CLI_NONE,
        c->npoints ? CLI_NUM(c->hi_hz / 1e6) : CLI_NONE, CLI_TXT(c->source[0] ? c->source : NULL),
        c->prop[6], c->prop[7], c->prop[8], c->prop[9], c->prop[10],
    };
    cli_table_row(ctx, cables_cols, NCOLS, cells);
}

/* A number cell as text, "-" when absent. */
static const char *cell_text(char *buf, size_t size, cli_cell c, int decimals)
{
    if (!c.present) return "-";
    return cli_fmt(buf, size, c.value, decimals);
}

static void text_list(cli_ctx *ctx, const cxl_catalog *cat, size_t count)
{
    FILE *o = ctx->out;
    size_t width = 5, nbuiltin = 0;
    cable_info c;
    for (size_t i = 0; i < count; i++) {
        get_info(cat, i, &c);
        size_t w = strlen(c.name);
        if (w > width) width = w < 32 ? w : 32;
        nbuiltin += (size_t)c.builtin;
    }
    fprintf(o, "cables: %zu built in, %zu from user files\n", nbuiltin, count - nbuiltin);
    fprintf(o, "  %-*s  %6s  %6s  %-10s  %-22s  %s\n", (int)width, "name", "Z0 ohm", "VF",
            "dielectric", "loss table", "origin");
    for (size_t i = 0; i < count; i++) {
        char name[64], z0[32], vf[32], diel[64], range[96];
        get_info(cat, i, &c);
        if (c.npoints)
            cli_fmt_range_mhz(range, sizeof range, c.lo_hz, c.hi_hz);
        else
            snprintf(range, sizeof range, "-");
        fprintf(o, "  %-*s  %6s  %6s  %-10s  %-22s  %s\n", (int)width,
                cli_clean(name, sizeof name, c.name), cell_text(z0, sizeof z0, c.prop[0], 1),
                cell_text(vf, sizeof vf, c.prop[1], 4),
                c.dielectric[0] ? cli_clean(diel, sizeof diel, c.dielectric) : "-", range,
                c.builtin ? "built-in" : "user");
    }
    fprintf(o, "Nominal values: measure your spool's velocity factor.  "
               "coaxline cables --cable NAME shows sources and loss points.\n");
}

/* The cable's own values: impedance, velocity factor, dielectric,
 * diameters, conductors and source. */
static void detail_properties(FILE *o, const cable_info *c)
{
    char b1[512], b2[64], b3[64], b4[64];
    fprintf(o, "cable %s (%s)\n", cli_clean(b1, sizeof b1, c->name),
            c->builtin ? "built-in" : "user file");
    fprintf(o, "  impedance        %s ohm%s\n", cell_text(b2, sizeof b2, c->prop[0], 1),
            c->builtin ? " (nominal)" : "");
    fprintf(o, "  velocity factor  %s%s\n", cell_text(b2, sizeof b2, c->prop[1], 4),
            c->builtin ? " (nominal; a spool differs, measure it)" : " (from the user file)");
    fprintf(o, "  dielectric       %s, relative permittivity %s, loss tangent %s\n",
            c->dielectric[0] ? cli_clean(b1, sizeof b1, c->dielectric) : "-",
            cell_text(b2, sizeof b2, c->prop[4], 4), cell_text(b3, sizeof b3, c->prop[5], 6));
    fprintf(o, "  diameters        centre %s mm, dielectric %s mm\n",
            cell_text(b2, sizeof b2, c->prop[2], 3), cell_text(b3, sizeof b3, c->prop[3], 3));
    cli_cell ms = c->prop[6], core_ms = c->prop[9];
    ms.value /= 1e6;
    core_ms.value /= 1e6;
    fprintf(o, "  conductors       %s MS/m, loss factor %s", cell_text(b2, sizeof b2, ms, 2),
            cell_text(b3, sizeof b3, c->prop[7], 3));
    if (c->prop[8].present)
        fprintf(o, "; centre clad %s mm over a core of %s MS/m, relative permeability %s",
                cell_text(b2, sizeof b2, c->prop[8], 3), cell_text(b3, sizeof b3, core_ms, 2),
                cell_text(b4, sizeof b4, c->prop[10], 1));
    fprintf(o, "\n  source           %s\n",
            c->source[0] ? cli_clean(b1, sizeof b1, c->source) : "-");
}

/* The loss table of cable i, each point with its fitted value (when fit)
 * and the number of its source; then the sources, numbered. */
static void detail_loss_points(FILE *o, const cxl_catalog *cat, size_t i, size_t npoints,
                               const cxl_loss_fit *fit)
{
    char b1[512], b2[64], b3[64], b4[64];
    fprintf(o, "  loss table       %zu point%s%s\n", npoints, npoints == 1 ? "" : "s",
            npoints ? " (dB/100 m; fitted value and residual; [n] = source below)" : "");
    const char *srcs[64];
    size_t nsrc = 0;
    for (size_t p = 0; p < npoints; p++) {
        double f, l, rf, rt, rr;
        const char *src = "";
        cxl_catalog_loss_point(cat, i, p, &f, &l, &src);
        size_t s = 0;
        while (s < nsrc && strcmp(srcs[s], src) != 0) s++;
        if (s == nsrc && nsrc < 64) srcs[nsrc++] = src;
        fprintf(o, "    %12s MHz %10s", cli_fmt(b2, sizeof b2, f / 1e6, 3),
                cli_fmt(b3, sizeof b3, l * 100.0, 4));
        if (fit && cxl_loss_fit_point(fit, p, &rf, &rt, &rr) == CXL_OK)
            fprintf(o, "  fitted %s (%s%s %%)", cli_fmt(b4, sizeof b4, (rt + rr) * 100.0, 4),
                    rr >= 0 ? "+" : "", cli_fmt(b1, sizeof b1, 100.0 * rr / rt, 1));
        fprintf(o, "  [%zu]\n", s + 1);
    }
    for (size_t s = 0; s < nsrc; s++)
        fprintf(o, "    [%zu] %s\n", s + 1, srcs[s][0] ? cli_clean(b1, sizeof b1, srcs[s]) : "-");
}

static void text_detail(cli_ctx *ctx, const cxl_catalog *cat, size_t i)
{
    FILE *o = ctx->out;
    cable_info c;
    char b1[512];
    get_info(cat, i, &c);
    detail_properties(o, &c);
    cxl_loss_fit *fit = cli_cable_fit(cat, i);
    detail_loss_points(o, cat, i, c.npoints, fit);
    if (fit) fprintf(o, "  fitted model     %s\n", cli_fmt_fit(b1, sizeof b1, fit));
    cxl_loss_fit_free(fit);
    cxl_loss_model *m = NULL;
    double lo, hi;
    if (cxl_loss_model_new_cable(cat, i, &m) == CXL_OK && cxl_loss_model_range(m, &lo, &hi) == CXL_OK)
        fprintf(o, "  physical model   holds %s\n", cli_fmt_range_mhz(b1, sizeof b1, lo, hi));
    else
        fprintf(o, "  physical model   - (no diameters)\n");
    cxl_loss_model_free(m);
}

static int cables_run(cli_ctx *ctx, const cli_args *a)
{
    const cxl_catalog *cat = cli_catalog(ctx);
    if (!cat) return CLI_EXIT_USAGE;
    size_t count = 0, first = 0;
    const char *want = cli_get(a, "cable", 0);
    count = cxl_catalog_count(cat);
    if (want) {
        if (cli_cable_index(ctx, want, &first)) return CLI_EXIT_USAGE;
        count = first + 1;
    }
    if (ctx->format == CLI_TEXT) {
        if (want)
            text_detail(ctx, cat, first);
        else
            text_list(ctx, cat, count);
        return CLI_EXIT_OK;
    }
    cli_table_header(ctx, cables_cols, NCOLS);
    for (size_t i = first; i < count; i++) {
        cable_info c;
        get_info(cat, i, &c);
        table_row(ctx, &c);
    }
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_cables = {
    .name = "cables",
    .summary = "list the cable catalog (built-in and user cables)",
    .synopsis = "[--cable NAME] [--cables FILE] [--cable-loss FILE]",
    .opts = cables_opts,
    .run = cables_run,
    .batch = 0,
};
