/* arrayspec.c - what array and yield share about an array described by a
 * layout file: the element pattern options (--element, --wire-length,
 * --wire-vf, --elevation) and the cxl_array built from a layout, as
 * designed or as built, with one element reversed in turn; and the note
 * that array, yield and pattern print under a text table holding a ratio
 * at the model's limit. */
#include <config.h>
#include <math.h>
#include <string.h>
#include "cli.h"

int cli_array_model_parse(cli_ctx *ctx, const cli_args *a, cli_array_model *m)
{
    const char *el = cli_get(a, "element", 0);
    m->kind = CXL_ELEMENT_ISOTROPIC;
    m->wire_length_m = 0.0;
    m->wire_vf = 1.0;
    if (el && strcmp(el, "wire") == 0) m->kind = CXL_ELEMENT_WIRE;
    else if (el && strcmp(el, "vertical") == 0) m->kind = CXL_ELEMENT_VERTICAL;
    else if (el && strcmp(el, "isotropic") != 0)
        return cli_error(ctx, "element", "isotropic, wire or vertical", "unknown element '%s'", el);
    if (cli_wire_parse(ctx, a, m->kind == CXL_ELEMENT_WIRE, el ? el : "isotropic",
                       &m->wire_length_m, &m->wire_vf))
        return CLI_EXIT_USAGE;
    m->elevation_deg = m->kind == CXL_ELEMENT_WIRE ? 20.0 : 0.0;
    if (cli_count(a, "elevation") &&
        cli_number(ctx, "elevation", cli_get(a, "elevation", 0), 0.0, 89.0,
                   "degrees above the horizon, 0 to 89", &m->elevation_deg))
        return CLI_EXIT_USAGE;
    if (m->kind == CXL_ELEMENT_WIRE && m->elevation_deg == 0.0)
        return cli_error(ctx, "elevation", "an elevation above 0 for wires, such as 20",
                         "a long wire has no response along its own axis at elevation 0");
    m->model_text = m->kind == CXL_ELEMENT_VERTICAL
                        ? "short verticals over perfect ground, no mutual coupling"
                        : "free space, no ground, no mutual coupling";
    return 0;
}

cxl_status cli_layout_array(const cli_layout *lay, const cli_array_model *m, double vf,
                            double actual_vf, const cxl_loss_model *model, int built,
                            int reversed, cxl_array **out)
{
    cxl_array *a;
    cxl_status st = cxl_array_new(&a);
    if (st) return st;
    st = cxl_array_set_element(a, (cxl_element_kind)m->kind, m->wire_length_m, m->wire_vf);
    for (size_t i = 0; st == CXL_OK && i < lay->n; i++) {
        const cli_layout_elem *e = &lay->el[i];
        st = cxl_array_add(a, e->x_m, e->y_m, e->z_m, NULL);
        if (st) break;
        if (e->has_line) {
            double len = built ? e->built_line_m : e->line_m;
            double line_vf = built ? actual_vf : vf;
            if (model)
                st = cxl_array_set_line_model(a, i, len * vf / line_vf, model);
            else
                st = cxl_array_set_line(a, i, len, line_vf);
        } else {
            st = cxl_array_set_delay(a, i, e->delay_s);
        }
        if (!st) st = cxl_array_set_reversed(a, i, e->invert != ((int)i == reversed));
        double w = e->weight_db - (built ? e->imbalance_db : 0.0);
        if (!st) st = cxl_array_set_weight(a, i, w);
        if (!st && built) st = cxl_array_set_phase_offset(a, i, -e->phase_error_deg);
    }
    if (st) {
        cxl_array_free(a);
        return st;
    }
    *out = a;
    return CXL_OK;
}

int cli_line_loss_model(cli_ctx *ctx, const cli_args *a, const char *cable, cxl_loss_model **model)
{
    if (!cli_flag(a, "line-loss")) return 0;
    if (!cable || !cable[0])
        return cli_error(ctx, "line-loss", "--cable NAME with --line-loss",
                         "the lines' loss needs a catalog cable");
    size_t idx;
    if (cli_cable_index(ctx, cable, &idx)) return CLI_EXIT_USAGE;
    if (cxl_loss_model_new_cable(cli_catalog(ctx), idx, model) != CXL_OK)
        return cli_error(ctx, "line-loss", "a cable with its geometry in the catalog",
                         "cable '%s' has no geometry for a loss model", cable);
    return 0;
}

int cli_at_db_limit(double db)
{
    return fabs(db) >= CXL_DB_LIMIT;
}

void cli_db_limit_note(cli_ctx *ctx, int at_limit)
{
    if (at_limit) fprintf(ctx->out, "  (300 dB is the model's limit: a perfect null)\n");
}

int cli_plot_options_check(cli_ctx *ctx, const cli_args *a)
{
    if ((cli_count(a, "plot-freq") || cli_count(a, "plot-range")) && !cli_count(a, "plot"))
        return cli_error(ctx, cli_count(a, "plot-freq") ? "plot-freq" : "plot-range",
                         "--plot FILE.svg with it", "it only applies to --plot");
    return 0;
}
