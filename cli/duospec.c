/* duospec.c - the two-element receive pair (the duo) that pattern and budget
 * describe: geometry, element type, the design feed (explicit delays or a
 * crossfire/end-fire feed worked out from the stagger), and the as-built
 * errors (measured lines, the spool's real VF, a fixed phase error, an
 * amplitude imbalance, the lines' loss difference). */
#include <config.h>
#include <math.h>
#include <string.h>
#include "cli.h"

static const char *const elem_name[2] = { "a", "b" };

/* --line-X, --delay-X or --degrees-X for element k: at most one. */
static int parse_manual_delay(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s, int k,
                              double design_hz)
{
    char line_opt[16], delay_opt[16], deg_opt[16];
    snprintf(line_opt, sizeof line_opt, "line-%s", elem_name[k]);
    snprintf(delay_opt, sizeof delay_opt, "delay-%s", elem_name[k]);
    snprintf(deg_opt, sizeof deg_opt, "degrees-%s", elem_name[k]);
    int n = (cli_count_if(a, line_opt) > 0) + (cli_count(a, delay_opt) > 0) +
            (cli_count(a, deg_opt) > 0);
    if (n > 1)
        return cli_error(ctx, line_opt, "one of --line-a, --delay-a or --degrees-a per element",
                         "give the feed delay of element %c only once", k ? 'B' : 'A');
    if (cli_count_if(a, line_opt)) {
        if (!s->has_vf)
            return cli_error(ctx, "vf", "--vf 0.66 or --cable NAME with --line-a/--line-b",
                             "a line length needs the cable's velocity factor");
        if (cli_length(ctx, line_opt, cli_get(a, line_opt, 0), CLI_NONNEG, &s->line_m[k]))
            return CLI_EXIT_USAGE;
        if (cxl_line_delay_from_length(s->line_m[k], s->vf, &s->delay_s[k]) != CXL_OK)
            return cli_error(ctx, line_opt, "a shorter line", "gives no delay");
        s->has_line[k] = 1;
    } else if (cli_count(a, delay_opt)) {
        if (cli_time(ctx, delay_opt, cli_get(a, delay_opt, 0), CLI_NONNEG, &s->delay_s[k]))
            return CLI_EXIT_USAGE;
    } else if (cli_count(a, deg_opt)) {
        double deg;
        if (cli_bounded(ctx, deg_opt, cli_get(a, deg_opt, 0), CLI_BOUND_DEGREES,
                       "electrical degrees, 0 or more, such as 90", &deg))
            return CLI_EXIT_USAGE;
        if (!(design_hz > 0.0))
            return cli_error(ctx, "design-freq", "--degrees-b 90 --design-freq 1.83MHz",
                             "electrical degrees need the frequency they hold at");
        s->delay_s[k] = deg / (360.0 * design_hz);
    }
    return 0;
}

/* --feed excludes the options that give the feed element by element. */
static int feed_alone(cli_ctx *ctx, const cli_args *a)
{
    static const char *const manual[] = { "line-a", "line-b", "delay-a", "delay-b",
                                          "degrees-a", "degrees-b", "invert" };
    for (size_t i = 0; i < sizeof manual / sizeof manual[0]; i++)
        if (cli_count_if(a, manual[i]))
            return cli_error(ctx, "feed", "--feed alone, or the feed given element by element",
                             "--feed and --%s both describe the feed", manual[i]);
    return 0;
}

/* The kind of --feed; an end-fire feed also needs its design frequency. */
static int feed_kind(cli_ctx *ctx, const char *feed, double design_hz, cxl_feed *kind)
{
    if (strcmp(feed, "crossfire") == 0) {
        *kind = CXL_FEED_CROSSFIRE;
        return 0;
    }
    if (strcmp(feed, "endfire") != 0)
        return cli_error(ctx, "feed", "crossfire or endfire", "unknown feed '%s'", feed);
    if (!(design_hz > 0.0))
        return cli_error(ctx, "design-freq", "--feed endfire --design-freq 1.83MHz",
                         "an end-fire feed is cut for one frequency");
    *kind = CXL_FEED_ENDFIRE;
    return 0;
}

/* The line lengths that give the preset's delays, when the VF is known. */
static int preset_lines(cli_ctx *ctx, cli_duo_spec *s)
{
    for (int k = 0; k < 2; k++)
        if (s->has_vf && s->delay_s[k] > 0.0) {
            if (cxl_line_length_from_delay(s->delay_s[k], s->vf, &s->line_m[k]) != CXL_OK)
                return cli_error(ctx, "stagger", "smaller values", "gives no line length");
            s->has_line[k] = 1;
        }
    return 0;
}

/* The design feed from --feed: the element that must wait is the front
 * one (end-fire) or the rear one (crossfire). */
static int parse_preset(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s, double design_hz)
{
    const char *feed = cli_get(a, "feed", 0);
    if (feed_alone(ctx, a)) return CLI_EXIT_USAGE;
    if (s->stagger_m == 0.0)
        return cli_error(ctx, "stagger", "a stagger such as --stagger 20m with --feed",
                         "--feed %s needs the elements staggered along the forward axis", feed);
    cxl_feed kind = CXL_FEED_CROSSFIRE;
    if (feed_kind(ctx, feed, design_hz, &kind)) return CLI_EXIT_USAGE;
    /* the library's design feed, read back element by element */
    cxl_duo *p = NULL;
    cxl_status st = cxl_duo_new(&p);
    if (st == CXL_OK) st = cxl_duo_set_geometry(p, s->spacing_m, s->stagger_m);
    if (st == CXL_OK) st = cxl_duo_set_feed(p, kind, design_hz);
    for (int k = 0; k < 2 && st == CXL_OK; k++)
        st = cxl_duo_feed(p, k, &s->delay_s[k], &s->flip[k]);
    cxl_duo_free(p);
    if (st != CXL_OK)
        return cli_error(ctx, "stagger", "smaller values", "the feed cannot be designed: %s",
                         cxl_strerror(st));
    s->feed = kind == CXL_FEED_CROSSFIRE ? "crossfire" : "endfire";
    return preset_lines(ctx, s);
}

static int parse_element(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    const char *el = cli_get(a, "element", 0);
    if (el && strcmp(el, "wire") == 0) s->wire = 1;
    else if (el && strcmp(el, "isotropic") != 0)
        return cli_error(ctx, "element", "isotropic or wire", "unknown element '%s'", el);
    return cli_wire_parse(ctx, a, s->wire, "isotropic", &s->wire_length_m, &s->wire_vf);
}

int cli_wire_parse(cli_ctx *ctx, const cli_args *a, int wire, const char *kind,
                   double *length_m, double *vf)
{
    if (!wire) {
        if (cli_count(a, "wire-length") || cli_count(a, "wire-vf"))
            return cli_error(ctx, cli_count(a, "wire-length") ? "wire-length" : "wire-vf",
                             "--element wire with --wire-length and --wire-vf",
                             "wire values given for %s elements", kind);
        return 0;
    }
    if (!cli_count(a, "wire-length"))
        return cli_error(ctx, "wire-length", "--wire-length 150m", "a wire element needs its length");
    if (!cli_count(a, "wire-vf"))
        return cli_error(ctx, "wire-vf", "0.45-0.8 for a wire on the ground, 0.95-0.99 raised",
                         "a wire element needs its velocity factor");
    if (cli_length(ctx, "wire-length", cli_get(a, "wire-length", 0), CLI_POSITIVE, length_m) ||
        cli_vf(ctx, "wire-vf", cli_get(a, "wire-vf", 0), vf))
        return CLI_EXIT_USAGE;
    return 0;
}

/* Whether any line is there for an as-built error to act on: a design
 * line, or a measured one. */
static int has_lines(const cli_args *a, const cli_duo_spec *s)
{
    return s->has_line[0] || s->has_line[1] || cli_count_if(a, "measured-a") ||
           cli_count_if(a, "measured-b");
}

/* --actual-vf: the spool's real VF against the one the lines were cut for. */
int cli_actual_vf(cli_ctx *ctx, const cli_args *a, int has_design_vf, double design_vf,
                  double *actual_vf, int *given)
{
    *actual_vf = design_vf;
    *given = 0;
    if (!cli_count_if(a, "actual-vf")) return 0;
    if (!has_design_vf)
        return cli_error(ctx, "actual-vf", "--actual-vf 0.81 with the design --vf or --cable",
                         "the spool's VF needs the VF the lines were cut for");
    if (cli_vf(ctx, "actual-vf", cli_get(a, "actual-vf", 0), actual_vf)) return CLI_EXIT_USAGE;
    *given = 1;
    return 0;
}

static int parse_actual_vf(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    int given;
    if (cli_actual_vf(ctx, a, s->has_vf, s->vf, &s->actual_vf, &given)) return CLI_EXIT_USAGE;
    if (given) s->has_errors = 1;
    return 0;
}

/* --measured-X for element k, and the delay of the line as built. */
static int parse_measured(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s, int k)
{
    char opt[16];
    snprintf(opt, sizeof opt, "measured-%s", elem_name[k]);
    s->built_line_m[k] = s->line_m[k];
    s->built_delay_s[k] = s->delay_s[k];
    if (cli_count_if(a, opt)) {
        if (!s->has_vf)
            return cli_error(ctx, "vf", "--vf 0.66 or --cable NAME with --measured-a/--measured-b",
                             "a measured length needs the cable's velocity factor");
        if (cli_length(ctx, opt, cli_get(a, opt, 0), CLI_NONNEG, &s->built_line_m[k]))
            return CLI_EXIT_USAGE;
        s->has_errors = 1;
    } else if (!s->has_line[k]) {
        return 0;   /* a delay given as time or degrees: no line to re-measure */
    }
    if (cxl_line_delay_from_length(s->built_line_m[k], s->actual_vf,
                                   &s->built_delay_s[k]) != CXL_OK)
        return cli_error(ctx, opt, "a shorter line", "gives no delay");
    return 0;
}

/* --phase-error and --imbalance: errors given as plain numbers. */
static int parse_fixed_errors(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    if (cli_count_if(a, "phase-error")) {
        if (cli_bounded(ctx, "phase-error", cli_get(a, "phase-error", 0), CLI_BOUND_PHASE_DEG,
                       "degrees B lags A beyond the design, such as 5 or -3", &s->phase_error_deg))
            return CLI_EXIT_USAGE;
        s->has_errors = 1;
    }
    if (cli_count_if(a, "imbalance")) {
        if (cli_bounded(ctx, "imbalance", cli_get(a, "imbalance", 0), CLI_BOUND_LEVEL_DB,
                       "dB by which B is weaker than A, such as 0.5", &s->imbalance_db))
            return CLI_EXIT_USAGE;
        s->has_errors = 1;
    }
    return 0;
}

/* --line-loss: the loss difference of the two lines, from the catalog. */
static int parse_line_loss(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    size_t idx;
    if (!cli_flag_if(a, "line-loss")) return 0;
    if (!s->cable[0])
        return cli_error(ctx, "line-loss", "--line-loss with --cable NAME (a catalog cable)",
                         "the loss of the lines needs a cable from the catalog");
    if (cli_cable_index(ctx, s->cable, &idx)) return CLI_EXIT_USAGE;
    const cxl_catalog *cat = cli_catalog(ctx);
    /* the table where the cable has one, else its physical model */
    if (cxl_loss_cable_new(cat, idx, &s->loss) != CXL_OK)
        return cli_error(ctx, "line-loss", "a cable with diameters or attenuation points",
                         "cable '%s' has no loss data", s->cable);
    if (!has_lines(a, s))
        return cli_error(ctx, "line-loss", "--line-a/--line-b, --measured-a/-b or --feed with --cable",
                         "no line lengths to take the loss of");
    s->line_loss = 1;
    s->has_errors = 1;
    return 0;
}

static int parse_as_built(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    if (parse_actual_vf(ctx, a, s)) return CLI_EXIT_USAGE;
    for (int k = 0; k < 2; k++)
        if (parse_measured(ctx, a, s, k)) return CLI_EXIT_USAGE;
    if (cli_count_if(a, "actual-vf") && !has_lines(a, s))
        return cli_error(ctx, "actual-vf", "--line-a/--line-b, --measured-a/-b or --feed with --vf",
                         "no line lengths for the spool's VF to act on");
    if (parse_fixed_errors(ctx, a, s)) return CLI_EXIT_USAGE;
    return parse_line_loss(ctx, a, s);
}

/* Where the elements stand, what they are, and the elevation they are
 * seen from: wires default to 20 degrees, having nothing along their axis. */
static int parse_geometry(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    if (cli_count(a, "spacing") &&
        cli_length(ctx, "spacing", cli_get(a, "spacing", 0), CLI_NONNEG, &s->spacing_m))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "stagger") &&
        cli_length(ctx, "stagger", cli_get(a, "stagger", 0), CLI_ANY, &s->stagger_m))
        return CLI_EXIT_USAGE;
    if (parse_element(ctx, a, s)) return CLI_EXIT_USAGE;
    s->elevation_default = !cli_count(a, "elevation");
    s->elevation_deg = s->wire ? 20.0 : 0.0;
    if (!s->elevation_default &&
        cli_number(ctx, "elevation", cli_get(a, "elevation", 0), 0.0, 89.0,
                   "degrees above the horizon, 0 to 89", &s->elevation_deg))
        return CLI_EXIT_USAGE;
    if (s->wire && s->elevation_deg == 0.0)
        return cli_error(ctx, "elevation", "an elevation above 0 for wires, such as 20",
                         "a long wire has no response along its own axis at elevation 0");
    return 0;
}

/* The feed given element by element: delays, and --invert. */
static int parse_manual_feed(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s, double design_hz)
{
    for (int k = 0; k < 2; k++)
        if (parse_manual_delay(ctx, a, s, k, design_hz)) return CLI_EXIT_USAGE;
    const char *inv = cli_get(a, "invert", 0);
    if (!inv) return 0;
    if (strcmp(inv, "a") != 0 && strcmp(inv, "b") != 0 && strcmp(inv, "A") != 0 &&
        strcmp(inv, "B") != 0)
        return cli_error(ctx, "invert", "a or b", "unknown element '%s'", inv);
    s->flip[inv[0] == 'a' || inv[0] == 'A' ? 0 : 1] = 1;
    return 0;
}

int cli_duo_spec_parse(cli_ctx *ctx, const cli_args *a, cli_duo_spec *s)
{
    memset(s, 0, sizeof *s);
    s->feed = "manual";
    s->cable = "";
    if (parse_geometry(ctx, a, s)) return CLI_EXIT_USAGE;
    double design_hz = 0.0;
    if (cli_count(a, "design-freq") &&
        cli_freq(ctx, "design-freq", cli_get(a, "design-freq", 0), &design_hz))
        return CLI_EXIT_USAGE;
    if (cli_count(a, "vf") || cli_count(a, "cable") || cli_count(a, "vf-from")) {
        /* --vf-from: the VF at --design-freq when the file holds it */
        if (cli_vf_source_at(ctx, a, design_hz, &s->vf, NULL, 0)) return CLI_EXIT_USAGE;
        s->cable = cli_count(a, "cable") ? cli_get(a, "cable", 0) : "";
        s->has_vf = 1;
    }
    int bad = cli_count(a, "feed") ? parse_preset(ctx, a, s, design_hz)
                                   : parse_manual_feed(ctx, a, s, design_hz);
    if (bad) return CLI_EXIT_USAGE;
    if (parse_as_built(ctx, a, s)) {
        cli_duo_spec_free(s);
        return CLI_EXIT_USAGE;
    }
    return 0;
}

void cli_duo_spec_free(cli_duo_spec *s)
{
    cxl_loss_cable_free(s->loss);
    s->loss = NULL;
}

/* The as-built errors at freq_hz: B's extra lag against the design, in
 * degrees, and its imbalance, the lines' loss difference included. */
static int built_errors(cli_ctx *ctx, const cli_duo_spec *s, double freq_hz, double *phase_deg,
                        double *imbalance_db)
{
    if (cxl_duo_built_phase(s->delay_s, s->built_delay_s, s->phase_error_deg, freq_hz,
                            phase_deg) != CXL_OK)
        return cli_error(ctx, "phase-error", "smaller values",
                         "the as-built phase error cannot be worked out");
    *imbalance_db = s->imbalance_db;
    if (!s->line_loss) return 0;
    double loss_db, lo, hi;
    char f[32], range[96], expected[160];
    if (cxl_loss_cable_difference(s->loss, s->built_line_m[0], s->built_line_m[1], freq_hz,
                                  &loss_db) != CXL_OK) {
        cxl_loss_cable_range(s->loss, &lo, &hi);
        snprintf(expected, sizeof expected, "a frequency within %s, or --imbalance DB instead",
                 cli_fmt_range_mhz(range, sizeof range, lo, hi));
        return cli_error(ctx, "line-loss", expected,
                         "%s MHz is outside the loss data of cable '%s'",
                         cli_fmt(f, sizeof f, freq_hz / 1e6, 6), s->cable);
    }
    *imbalance_db += loss_db;
    return 0;
}

/* The library's pair with these delays and errors. */
static cxl_status model_duo(const cli_duo_spec *s, const double *delay, double phase_offset_deg,
                            double imbalance_db, cxl_duo **pair)
{
    cxl_duo *p = NULL;
    cxl_status st = cxl_duo_new(&p);
    if (st == CXL_OK) st = cxl_duo_set_geometry(p, s->spacing_m, s->stagger_m);
    for (int k = 0; k < 2 && st == CXL_OK; k++) {
        st = cxl_duo_set_delay(p, k, delay[k]);
        if (st == CXL_OK) st = cxl_duo_set_flip(p, k, s->flip[k]);
    }
    if (st == CXL_OK) st = cxl_duo_set_phase_offset(p, 1, phase_offset_deg);
    if (st == CXL_OK) st = cxl_duo_set_imbalance(p, imbalance_db);
    if (st == CXL_OK && s->wire) st = cxl_duo_set_long_wire(p, s->wire_length_m, s->wire_vf);
    if (st != CXL_OK) {
        cxl_duo_free(p);
        return st;
    }
    *pair = p;
    return CXL_OK;
}

int cli_duo_spec_build(cli_ctx *ctx, const cli_duo_spec *s, int as_built, double freq_hz,
                        cxl_duo **pair, double *phase_error_deg, double *imbalance_db)
{
    const double *delay = as_built ? s->built_delay_s : s->delay_s;
    double phase = 0.0, imbalance = 0.0;
    if (as_built && built_errors(ctx, s, freq_hz, &phase, &imbalance)) return CLI_EXIT_USAGE;
    cxl_status st = model_duo(s, delay, -s->phase_error_deg * as_built, imbalance, pair);
    if (st != CXL_OK)
        return cli_error(ctx, as_built ? "imbalance" : "spacing", "smaller values",
                         "the pair cannot be modelled: %s", cxl_strerror(st));
    if (phase_error_deg) *phase_error_deg = phase;
    if (imbalance_db) *imbalance_db = imbalance;
    return 0;
}
