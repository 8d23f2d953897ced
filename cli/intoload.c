/* intoload.c - --load and --z0 for phase and pair: a phasing line is judged
 * by the phase of the voltage it delivers into the load (a combiner input,
 * a preamplifier, an element's feed point), which departs from its
 * electrical length whenever the load does not match the line.
 *
 * Syntax of a load: R, or R+jX / R-jX in ohms (spaces allowed around the
 * sign and after j; R >= 0; a very high impedance is written as 1e9).  The
 * j comes before the reactance, the way the trade writes it. */
#include <config.h>
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

#define LOAD_EXPECTED "a load in ohms as R or R+jX, such as 50, 21+j20, 21-j20 or 1e9"
#define Z0_EXPECTED "a line impedance in ohms from 1 to 1000, such as 50 or 75"
/* resistance and reactance beyond this are an open end in all but name */
#define LOAD_MAX_OHM 1e12

/* One number of a load, all of [start, end). */
static int load_number(const char *start, size_t len, double *v)
{
    char part[128];
    if (len == 0 || len >= sizeof part) return -1;
    memcpy(part, start, len);
    part[len] = '\0';
    if (strspn(part, " \t") == len) return -1;
    return cxl_units_parse_number(part, v, NULL) == CXL_OK ? 0 : -1;
}

/* The sign before the j of "R + jX": a pointer to it, or NULL when the
 * j stands alone or first. */
static const char *reactance_sign(const char *text, const char *j)
{
    const char *s = j;
    while (s > text && (s[-1] == ' ' || s[-1] == '\t')) s--;
    if (s == text || (s[-1] != '+' && s[-1] != '-')) return NULL;
    return s - 1;
}

/* R, R+jX or R-jX; 0 or -1 (malformed). */
static int split_load(const char *text, double *re, double *im)
{
    const char *j = strpbrk(text, "jJ");
    *im = 0.0;
    if (!j) return load_number(text, strlen(text), re);
    if (strpbrk(j + 1, "jJ")) return -1;
    const char *x = j + 1;
    while (*x == ' ' || *x == '\t') x++;
    /* the reactance is unsigned: the sign before j gives it */
    if (!(isdigit((unsigned char)*x) || *x == '.')) return -1;
    const char *s = reactance_sign(text, j);
    if (!s) return -1;
    if (load_number(text, (size_t)(s - text), re) || load_number(x, strlen(x), im)) return -1;
    if (*s == '-') *im = -*im;
    return 0;
}

static int parse_load(const cli_ctx *ctx, const char *text, cli_load *load)
{
    double re, im;
    if (split_load(text, &re, &im))
        return cli_error(ctx, "load", LOAD_EXPECTED, "'%s' is not a load impedance", text);
    if (re < 0.0)
        return cli_error(ctx, "load", LOAD_EXPECTED,
                         "'%s' has a negative resistance, which no passive load has", text);
    if (!(re <= LOAD_MAX_OHM) || !(fabs(im) <= LOAD_MAX_OHM))
        return cli_error(ctx, "load", LOAD_EXPECTED,
                         "'%s' is beyond 1e12 ohm (write an open end as 1e9)", text);
    if (re == 0.0 && im == 0.0)
        return cli_error(ctx, "load", LOAD_EXPECTED,
                         "'%s' is a short: no voltage reaches it", text);
    load->re_ohm = re;
    load->im_ohm = im;
    return 0;
}

int cli_load_impedance(const cli_ctx *ctx, const char *text, double *re_ohm, double *im_ohm)
{
    cli_load l;
    if (parse_load(ctx, text, &l)) return CLI_EXIT_USAGE;
    *re_ohm = l.re_ohm;
    *im_ohm = l.im_ohm;
    return 0;
}

static int parse_z0(const cli_ctx *ctx, const char *text, double *z0_ohm)
{
    return cli_bounded(ctx, "z0", text, CLI_BOUND_LINE_Z0, Z0_EXPECTED, z0_ohm);
}

/* A catalog cable: its physical model, or the lossless form at its z0. */
static int cable_line(cli_ctx *ctx, const char *name, const char *z0_text, cli_load *load)
{
    size_t idx;
    if (cli_cable_index(ctx, name, &idx)) return CLI_EXIT_USAGE;
    const cxl_catalog *cat = cli_catalog(ctx);
    cxl_catalog_name(cat, idx, &load->cable);
    cxl_status st = cxl_loss_model_new_cable(cat, idx, &load->model);
    if (st == CXL_OK) {
        if (z0_text)
            return cli_error(ctx, "z0", "--z0 with --vf, or no --z0 with --cable",
                             "cable '%s' has diameters: its physical model gives Z0", load->cable);
        return 0;
    }
    load->model = NULL;
    if (st != CXL_ENOTFOUND)
        return cli_error(ctx, "cable", "a cable whose geometry gives a physical model",
                         "cable '%s': physical model: %s", load->cable, cxl_strerror(st));
    double z0;
    if (cxl_catalog_value(cat, idx, CXL_CABLE_Z0_OHM, &z0) == CXL_OK && z0 >= 1.0 &&
        z0 <= 1000.0) {
        if (z0_text)
            return cli_error(ctx, "z0", "--z0 only for a cable without a z0 value",
                             "cable '%s' has its own z0", load->cable);
        load->z0_ohm = z0;
        return 0;
    }
    if (!z0_text)
        return cli_error(ctx, "z0", "--z0 50 or --z0 75",
                         "cable '%s' has neither diameters nor a z0: --load needs the "
                         "line's impedance", load->cable);
    return parse_z0(ctx, z0_text, &load->z0_ohm);
}

/* The load and the line as the library's handle. */
static int load_handle(cli_ctx *ctx, cli_load *load)
{
    cxl_status st = load->model
        ? cxl_pair_load_new_model(load->model, load->re_ohm, load->im_ohm, &load->handle)
        : cxl_pair_load_new_lossless(load->z0_ohm, load->re_ohm, load->im_ohm, &load->handle);
    if (st != CXL_OK)
        return cli_error(ctx, "load", LOAD_EXPECTED, "%s", cxl_strerror(st));
    return 0;
}

int cli_load_parse(cli_ctx *ctx, const cli_args *a, double vf, cli_load *load)
{
    const char *text = cli_get(a, "load", 0), *z0 = cli_get(a, "z0", 0);
    const char *cable = cli_get(a, "cable", 0);
    memset(load, 0, sizeof *load);
    load->cable = "";
    load->vf = vf;
    if (!text) {
        if (z0) return cli_error(ctx, "z0", "--z0 50 --load 21+j20", "goes with --load only");
        return 0;
    }
    if (parse_load(ctx, text, load)) return CLI_EXIT_USAGE;
    load->given = 1;
    if (cable) {
        if (cable_line(ctx, cable, z0, load)) return CLI_EXIT_USAGE;
        return load_handle(ctx, load);
    }
    /* 50 and 75 ohm lines are both used for phasing: no default */
    if (!z0)
        return cli_error(ctx, "z0", "--z0 50 or --z0 75",
                         "--load on a line given by its velocity factor needs the line's impedance");
    if (parse_z0(ctx, z0, &load->z0_ohm)) return CLI_EXIT_USAGE;
    return load_handle(ctx, load);
}

void cli_load_free(cli_load *load)
{
    cxl_pair_load_free(load->handle);
    load->handle = NULL;
    cxl_loss_model_free(load->model);
    load->model = NULL;
}

int cli_load_error(const cli_ctx *ctx, const cli_load *load, double freq_hz, cxl_status st)
{
    char f[64], b1[32], b2[32];
    cli_fmt(f, sizeof f, freq_hz / 1e6, 6);
    if (st == CXL_EEXTRAPOLATE) {
        double lo = 0.0, hi = 0.0;
        cxl_loss_model_range(load->model, &lo, &hi);
        return cli_error(ctx, "cable", "bands inside the model's range, or --vf X --z0 OHM for "
                                       "a lossless line",
                         "%s MHz is outside the range of the physical model of '%s', %s-%s MHz", f,
                         load->cable, cli_fmt(b1, sizeof b1, lo / 1e6, 3),
                         cli_fmt(b2, sizeof b2, hi / 1e6, 3));
    }
    if (st == CXL_ERANGE)
        return cli_error(ctx, "load", "a load that leaves a voltage to measure",
                         "at %s MHz no voltage reaches the load (the line turns it into a "
                         "short at its input, or loses everything on the way)", f);
    return cli_error(ctx, "load", LOAD_EXPECTED, "at %s MHz: %s", f, cxl_strerror(st));
}

int cli_load_transfer(const cli_ctx *ctx, const cli_load *load, double length_m,
                      double freq_hz, double *transfer_db, double *delay_deg,
                      double *electrical_deg)
{
    cxl_status st = cxl_pair_load_transfer(load->handle, length_m, load->vf, freq_hz,
                                           transfer_db, delay_deg, electrical_deg);
    return st == CXL_OK ? 0 : cli_load_error(ctx, load, freq_hz, st);
}

/* Ohms with up to three decimals and no trailing zeros: "21", "1000000000". */
static const char *fmt_ohm(char *buf, size_t size, double ohm)
{
    cli_fmt(buf, size, ohm, 3);
    if (strchr(buf, '.')) {
        size_t n = strlen(buf);
        while (n > 0 && buf[n - 1] == '0') buf[--n] = '\0';
        if (n > 0 && buf[n - 1] == '.') buf[--n] = '\0';
    }
    return buf;
}

const char *cli_fmt_load(char *buf, size_t size, const cli_load *load)
{
    char zl[96], r[48], x[48], z[48];
    fmt_ohm(r, sizeof r, load->re_ohm);
    if (load->im_ohm != 0.0)
        snprintf(zl, sizeof zl, "%s%sj%s", r, load->im_ohm < 0.0 ? "-" : "+",
                 fmt_ohm(x, sizeof x, fabs(load->im_ohm)));
    else
        snprintf(zl, sizeof zl, "%s", r);
    if (load->model)
        snprintf(buf, size, "%s ohm, cable %s: physical model (complex Z0, loss)", zl, load->cable);
    else
        snprintf(buf, size, "%s ohm, lossless line, Z0 %s ohm", zl, fmt_ohm(z, sizeof z, load->z0_ohm));
    return buf;
}
