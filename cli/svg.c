/* svg.c - small plain-SVG plots: a polar azimuth pattern and an x-y plot.
 * Written by hand (no plotting program), with every number formatted by
 * cxl_units_format_fixed so a file is the same bytes in every locale, and
 * every text XML-escaped so a label cannot break the document. */
#include <config.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include "cli.h"

#define DEG (3.14159265358979323846 / 180.0)

static const char *const palette[] = { "#1f4e9c", "#c0392b", "#2e7d32", "#6a1b9a", "#b26a00" };
#define NPALETTE (sizeof palette / sizeof palette[0])

/* A coordinate or value, 2 decimals, '.' whatever the locale. */
static void num(FILE *fp, double v, int decimals)
{
    char buf[64];
    if (cxl_units_format_fixed(v, decimals, buf, sizeof buf) != CXL_OK)
        snprintf(buf, sizeof buf, "0");
    fputs(buf, fp);
}

static void xy(FILE *fp, double x, double y)
{
    num(fp, x, 2);
    putc(',', fp);
    num(fp, y, 2);
}

/* An attribute with a coordinate or size: ' name="v"'. */
static void attr(FILE *fp, const char *name, double v)
{
    fprintf(fp, " %s=\"", name);
    num(fp, v, 2);
    putc('"', fp);
}

/* The XML entity for one of the five characters markup reserves, or NULL. */
static const char *xml_entity(unsigned char c)
{
    switch (c) {
    case '&': return "&amp;";
    case '<': return "&lt;";
    case '>': return "&gt;";
    case '"': return "&quot;";
    case '\'': return "&#39;";
    default: return NULL;
    }
}

/* Write the multi-byte UTF-8 character at p, or U+FFFD when it is none
 * or not an XML character; return the bytes taken. */
static size_t utf8_char(FILE *fp, const unsigned char *p)
{
    size_t n = cli_utf8_len((const char *)p);
    /* XML 1.0 (section 2.2, Char) forbids U+FFFE and U+FFFF too */
    if (n == 3 && p[0] == 0xEF && p[1] == 0xBF && p[2] >= 0xBE) n = 0;
    if (!n) {
        fputs("\xEF\xBF\xBD", fp);
        return 1;
    }
    fwrite(p, 1, n, fp);
    return n;
}

/* Text content or attribute value: XML escapes; control bytes, bytes
 * that are not UTF-8 (cli_utf8_len) and U+FFFE/U+FFFF become U+FFFD,
 * which XML always accepts. */
static void text(FILE *fp, const char *s)
{
    const unsigned char *p = (const unsigned char *)(s ? s : "");
    while (*p) {
        unsigned char c = *p;
        const char *esc = xml_entity(c);
        if (c >= 0x80) {
            p += utf8_char(fp, p);
            continue;
        }
        if (esc) fputs(esc, fp);
        else if (c < 0x20 && c != '\t') fputs("\xEF\xBF\xBD", fp);
        else putc(c, fp);
        p++;
    }
}

/* halo: a white outline under the letters, so a curve crossing the label
 * does not hide it */
static void label_at(FILE *fp, double x, double y, const char *anchor, int size,
                     int halo, const char *s)
{
    fputs("<text", fp);
    attr(fp, "x", x);
    attr(fp, "y", y);
    fprintf(fp, " font-size=\"%d\" text-anchor=\"%s\"%s>", size, anchor,
            halo ? " stroke=\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\"" : "");
    text(fp, s);
    fputs("</text>\n", fp);
}

static void label(FILE *fp, double x, double y, const char *anchor, int size,
                  const char *s)
{
    label_at(fp, x, y, anchor, size, 0, s);
}

static void line(FILE *fp, double x0, double y0, double x1, double y1,
                 const char *stroke, double width, const char *dash)
{
    fputs("<line", fp);
    attr(fp, "x1", x0);
    attr(fp, "y1", y0);
    attr(fp, "x2", x1);
    attr(fp, "y2", y1);
    fprintf(fp, " stroke=\"%s\"", stroke);
    attr(fp, "stroke-width", width);
    if (dash) fprintf(fp, " stroke-dasharray=\"%s\"", dash);
    fputs("/>\n", fp);
}

static void open_svg(FILE *fp, int width, int height, const char *title)
{
    fprintf(fp, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\" "
                "viewBox=\"0 0 %d %d\" font-family=\"sans-serif\">\n<title>",
            width, height, width, height);
    text(fp, title);
    fprintf(fp, "</title>\n<rect x=\"0\" y=\"0\" width=\"%d\" height=\"%d\" fill=\"#ffffff\"/>\n",
            width, height);
    label(fp, width / 2.0, 28.0, "middle", 16, title);
}

/* Legend rows and note lines from y downwards. */
static void legend_and_notes(FILE *fp, double x, double y, const cli_svg_curve *curves,
                             size_t ncurves, const char *const note[3])
{
    for (size_t i = 0; i < ncurves; i++, y += 20.0) {
        line(fp, x, y - 4.0, x + 36.0, y - 4.0, palette[i % NPALETTE], 2.5,
             curves[i].dashed ? "7 4" : NULL);
        label(fp, x + 44.0, y, "start", 13, curves[i].name);
    }
    y += 6.0;
    for (int i = 0; i < 3; i++)
        if (note[i]) {
            label(fp, x, y, "start", 11, note[i]);
            y += 16.0;
        }
}

/* The end of a curve's <path d="...: its stroke, solid or dashed. */
static void end_curve(FILE *fp, const char *colour, int dashed)
{
    fprintf(fp, "\" fill=\"none\" stroke=\"%s\" stroke-width=\"2\"%s/>\n", colour,
            dashed ? " stroke-dasharray=\"7 4\"" : "");
}

static int close_svg(FILE *fp)
{
    fputs("</svg>\n", fp);
    return ferror(fp) ? -1 : 0;
}

static size_t count_notes(const char *const note[3])
{
    return (note[0] != NULL) + (note[1] != NULL) + (note[2] != NULL);
}

/* ---- polar plot ------------------------------------------------------- */

/* The outer ring: the highest finite value rounded up to half a ring
 * step (0 when there is none). */
static double polar_top(const cli_svg_polar *p, double step)
{
    double top = -INFINITY;
    for (size_t c = 0; c < p->ncurves; c++)
        for (size_t i = 0; i < p->curves[c].n; i++)
            if (isfinite(p->curves[c].y[i]) && p->curves[c].y[i] > top) top = p->curves[c].y[i];
    return isfinite(top) ? ceil(top / (0.5 * step) - 1e-9) * 0.5 * step : 0.0;
}

#define POLAR_CX 320.0
#define POLAR_CY 300.0
#define POLAR_RADIUS 230.0

/* Rings, labelled in dB along the lower right diagonal. */
static void polar_rings(FILE *fp, const cli_svg_polar *p, double top, double range, double step)
{
    const double cx = POLAR_CX, cy = POLAR_CY, floor_db = top - range;
    for (double v = top; v > floor_db + 1e-9; v -= step) {
        double r = POLAR_RADIUS * (v - floor_db) / range;
        fputs("<circle", fp);
        attr(fp, "cx", cx);
        attr(fp, "cy", cy);
        attr(fp, "r", r);
        fputs(" fill=\"none\" stroke=\"#b0b0b0\" stroke-width=\"1\"/>\n", fp);
        char t[64], n[48];
        snprintf(t, sizeof t, "%s %s", cli_fmt(n, sizeof n, v, step < 1.0 ? 1 : 0),
                 p->unit ? p->unit : "dB");
        label_at(fp, cx + 0.7071 * r + 3.0, cy + 0.7071 * r - 3.0, "start", 10, 1, t);
    }
}

/* Spokes and azimuth labels: 0 at the top, clockwise (a compass). */
static void polar_spokes(FILE *fp)
{
    const double cx = POLAR_CX, cy = POLAR_CY, radius = POLAR_RADIUS;
    for (int az = 0; az < 360; az += 30) {
        double s = sin(az * DEG), c = cos(az * DEG);
        line(fp, cx, cy, cx + radius * s, cy - radius * c, "#d0d0d0", 1.0, NULL);
        char t[32];
        snprintf(t, sizeof t, "%d\xC2\xB0", az);
        label(fp, cx + (radius + 16.0) * s, cy - (radius + 16.0) * c + 4.0, "middle", 12, t);
    }
}

/* One closed curve; a value below the centre (or missing) sits on it. */
static void polar_curve(FILE *fp, const cli_svg_curve *cv, const char *colour,
                        double floor_db, double range)
{
    const double cx = POLAR_CX, cy = POLAR_CY;
    fputs("<path d=\"", fp);
    int started = 0;
    for (size_t i = 0; i < cv->n; i++) {
        if (!isfinite(cv->x[i])) continue;
        double v = isfinite(cv->y[i]) ? cv->y[i] : floor_db;
        double r = POLAR_RADIUS * fmin(fmax((v - floor_db) / range, 0.0), 1.0);
        double a = cv->x[i] * DEG;
        fputs(started ? " L" : "M", fp);
        xy(fp, cx + r * sin(a), cy - r * cos(a));
        started = 1;
    }
    if (started) fputs(" Z", fp);
    end_curve(fp, colour, cv->dashed);
}

int cli_svg_polar_write(FILE *fp, const cli_svg_polar *p)
{
    double range = p->range_db > 0.0 ? p->range_db : 40.0;
    double step = p->ring_step_db > 0.0 ? p->ring_step_db : 10.0;
    double top = polar_top(p, step);
    int height = (int)(POLAR_CY + POLAR_RADIUS + 60.0 + 20.0 * p->ncurves +
                       16.0 * count_notes(p->note) + 16.0);

    open_svg(fp, 640, height, p->title);
    polar_rings(fp, p, top, range, step);
    polar_spokes(fp);
    for (size_t k = 0; k < p->ncurves; k++)
        polar_curve(fp, &p->curves[k], palette[k % NPALETTE], top - range, range);
    legend_and_notes(fp, 40.0, POLAR_CY + POLAR_RADIUS + 56.0, p->curves, p->ncurves, p->note);
    return close_svg(fp);
}

/* ---- x-y plot --------------------------------------------------------- */

/* A step of 1, 2 or 5 times a power of ten giving about 5-8 ticks. */
static double nice_step(double span)
{
    double raw = span / 6.0, mag = pow(10.0, floor(log10(raw)));
    double f = raw / mag;
    return (f < 1.5 ? 1.0 : f < 3.5 ? 2.0 : f < 7.5 ? 5.0 : 10.0) * mag;
}

static void fit_axis(double lo, double hi, double *a, double *b, double *step)
{
    if (!(isfinite(lo) && isfinite(hi))) { lo = 0.0; hi = 1.0; }
    if (hi - lo < 1e-12 * fmax(1.0, fabs(hi))) { lo -= 1.0; hi += 1.0; }
    double pad = 0.02 * (hi - lo);   /* keep a curve off the frame */
    lo -= pad;
    hi += pad;
    *step = nice_step(hi - lo);
    *a = floor(lo / *step + 1e-9) * *step;
    *b = ceil(hi / *step - 1e-9) * *step;
}

static int tick_decimals(double step)
{
    int d = (int)ceil(-log10(step) - 1e-9);
    return d < 0 ? 0 : d > 6 ? 6 : d;
}

/* The x-y frame in pixels. */
#define XY_LEFT 80.0
#define XY_RIGHT 690.0
#define XY_TOP 50.0
#define XY_BOTTOM 400.0

/* An axis fitted to the data: its ends and tick step. */
typedef struct axis {
    double lo, hi, step;
} axis;

static double sx(const axis *ax, double v)
{
    return XY_LEFT + (v - ax->lo) / (ax->hi - ax->lo) * (XY_RIGHT - XY_LEFT);
}

static double sy(const axis *ax, double v)
{
    return XY_BOTTOM - (v - ax->lo) / (ax->hi - ax->lo) * (XY_BOTTOM - XY_TOP);
}

/* Widen [*lo, *hi] to the finite points of the curves: x too when xlo is
 * given, y always. */
static void curves_extent(const cli_svg_curve *curves, size_t ncurves, double *xlo,
                          double *xhi, double *ylo, double *yhi)
{
    for (size_t c = 0; c < ncurves; c++)
        for (size_t i = 0; i < curves[c].n; i++) {
            double x = curves[c].x[i], y = curves[c].y[i];
            if (!isfinite(x) || !isfinite(y)) continue;
            if (xlo) {
                *xlo = fmin(*xlo, x);
                *xhi = fmax(*xhi, x);
            }
            *ylo = fmin(*ylo, y);
            *yhi = fmax(*yhi, y);
        }
}

/* The axes take in the curves, the spans (x) and the lines (y). */
static void xy_axes(const cli_svg_xy *p, axis *xa, axis *ya)
{
    double xlo = INFINITY, xhi = -INFINITY, ylo = INFINITY, yhi = -INFINITY;
    curves_extent(p->curves, p->ncurves, &xlo, &xhi, &ylo, &yhi);
    for (size_t i = 0; i < p->nspans; i++) {
        xlo = fmin(xlo, p->spans[i].x0);
        xhi = fmax(xhi, p->spans[i].x1);
    }
    for (size_t i = 0; i < p->nhlines; i++) {
        ylo = fmin(ylo, p->hlines[i].y);
        yhi = fmax(yhi, p->hlines[i].y);
    }
    fit_axis(xlo, xhi, &xa->lo, &xa->hi, &xa->step);
    fit_axis(ylo, yhi, &ya->lo, &ya->hi, &ya->step);
}

/* Shaded spans, named above the frame. */
static void xy_spans(FILE *fp, const cli_svg_xy *p, const axis *xa)
{
    for (size_t i = 0; i < p->nspans; i++) {
        double a = sx(xa, fmax(p->spans[i].x0, xa->lo)), b = sx(xa, fmin(p->spans[i].x1, xa->hi));
        fputs("<rect", fp);
        attr(fp, "x", a);
        fprintf(fp, " y=\"%d\"", (int)XY_TOP);
        attr(fp, "width", fmax(b - a, 1.0));
        fprintf(fp, " height=\"%d\" fill=\"#e6e6e6\"/>\n", (int)(XY_BOTTOM - XY_TOP));
        label(fp, 0.5 * (a + b), XY_TOP - 5.0, "middle", 11, p->spans[i].name);
    }
}

/* Grid lines with their tick labels, then the frame. */
static void xy_grid(FILE *fp, const axis *xa, const axis *ya)
{
    int xd = tick_decimals(xa->step), yd = tick_decimals(ya->step);
    char t[64];
    for (double v = xa->lo; v <= xa->hi + 0.5 * xa->step; v += xa->step) {
        line(fp, sx(xa, v), XY_TOP, sx(xa, v), XY_BOTTOM, "#d8d8d8", 1.0, NULL);
        label(fp, sx(xa, v), XY_BOTTOM + 18.0, "middle", 11, cli_fmt(t, sizeof t, v, xd));
    }
    for (double v = ya->lo; v <= ya->hi + 0.5 * ya->step; v += ya->step) {
        line(fp, XY_LEFT, sy(ya, v), XY_RIGHT, sy(ya, v), "#d8d8d8", 1.0, NULL);
        label(fp, XY_LEFT - 6.0, sy(ya, v) + 4.0, "end", 11, cli_fmt(t, sizeof t, v, yd));
    }
    fprintf(fp, "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"none\" "
                "stroke=\"#404040\" stroke-width=\"1\"/>\n",
            (int)XY_LEFT, (int)XY_TOP, (int)(XY_RIGHT - XY_LEFT), (int)(XY_BOTTOM - XY_TOP));
}

/* One curve against the y axis ya, broken where a value is missing; the
 * dots when it has markers. */
static void xy_curve(FILE *fp, const cli_svg_curve *cv, const axis *xa, const axis *ya,
                     const char *colour, int dashed)
{
    int pen = 0;
    fputs("<path d=\"", fp);
    for (size_t i = 0; i < cv->n; i++) {
        if (!isfinite(cv->x[i]) || !isfinite(cv->y[i])) { pen = 0; continue; }
        fputs(pen ? " L" : (i ? " M" : "M"), fp);
        xy(fp, sx(xa, cv->x[i]), sy(ya, cv->y[i]));
        pen = 1;
    }
    end_curve(fp, colour, dashed);
    for (size_t i = 0; cv->markers && i < cv->n; i++) {
        if (!isfinite(cv->x[i]) || !isfinite(cv->y[i])) continue;
        fputs("<circle", fp);
        attr(fp, "cx", sx(xa, cv->x[i]));
        attr(fp, "cy", sy(ya, cv->y[i]));
        fprintf(fp, " r=\"3\" fill=\"%s\"/>\n", colour);
    }
}

/* An axis title turned along the frame's side at x_px. */
static void side_title(FILE *fp, int x_px, int degrees, const char *s)
{
    fprintf(fp, "<text x=\"0\" y=\"0\" font-size=\"13\" text-anchor=\"middle\" "
                "transform=\"translate(%d,", x_px);
    num(fp, 0.5 * (XY_TOP + XY_BOTTOM), 2);
    fprintf(fp, ") rotate(%d)\">", degrees);
    text(fp, s);
    fputs("</text>\n", fp);
}

/* The second y axis on the right: its own ticks and its curves, dashed,
 * coloured after the first axis's. */
static void xy_right_axis(FILE *fp, const cli_svg_xy *p, const axis *xa)
{
    double vlo = INFINITY, vhi = -INFINITY;
    axis va;
    curves_extent(p->curves2, p->ncurves2, NULL, NULL, &vlo, &vhi);
    fit_axis(vlo, vhi, &va.lo, &va.hi, &va.step);
    int vd = tick_decimals(va.step);
    char t[64];
    for (double v = va.lo; v <= va.hi + 0.5 * va.step; v += va.step)
        label(fp, XY_RIGHT + 6.0, sy(&va, v) + 4.0, "start", 11, cli_fmt(t, sizeof t, v, vd));
    for (size_t k = 0; k < p->ncurves2; k++) {
        /* the marker dots are for the first axis's curves only */
        cli_svg_curve cv = p->curves2[k];
        cv.markers = 0;
        xy_curve(fp, &cv, xa, &va, palette[(p->ncurves + k) % NPALETTE], 1);
    }
    side_title(fp, 712, 90, p->y2_label ? p->y2_label : "");
}

int cli_svg_xy_write(FILE *fp, const cli_svg_xy *p)
{
    axis xa, ya;
    xy_axes(p, &xa, &ya);
    int height = (int)(XY_BOTTOM + 70.0 + 20.0 * p->ncurves + 16.0 * count_notes(p->note) + 16.0);

    open_svg(fp, 720, height, p->title);
    xy_spans(fp, p, &xa);
    xy_grid(fp, &xa, &ya);
    for (size_t i = 0; i < p->nhlines; i++) {
        double y = sy(&ya, p->hlines[i].y);
        line(fp, XY_LEFT, y, XY_RIGHT, y, "#7a7a7a", 1.5, "4 3");
        label(fp, XY_RIGHT - 4.0, y - 4.0, "end", 11, p->hlines[i].name);
    }
    for (size_t k = 0; k < p->ncurves; k++)
        xy_curve(fp, &p->curves[k], &xa, &ya, palette[k % NPALETTE], p->curves[k].dashed);
    if (p->ncurves2) xy_right_axis(fp, p, &xa);
    label(fp, 0.5 * (XY_LEFT + XY_RIGHT), XY_BOTTOM + 40.0, "middle", 13, p->x_label);
    side_title(fp, 22, -90, p->y_label);
    legend_and_notes(fp, XY_LEFT, XY_BOTTOM + 70.0, p->curves, p->ncurves, p->note);
    return close_svg(fp);
}

int cli_svg_save(const cli_ctx *ctx, const char *field, const char *path,
                 const cli_svg_polar *polar, const cli_svg_xy *plot_xy)
{
    static const char expected[] = "a writable file path such as pattern.svg";
    if (!path || !path[0])
        return cli_error(ctx, field, expected, "file name is empty");
    FILE *fp = fopen(path, "wb");
    if (!fp)
        return cli_error(ctx, field, expected, "cannot write '%s': %s", path, strerror(errno));
    int bad = polar ? cli_svg_polar_write(fp, polar) : cli_svg_xy_write(fp, plot_xy);
    int err = errno;
    if (fclose(fp) != 0 && !bad) {
        bad = -1;
        err = errno;
    }
    if (bad)
        return cli_error(ctx, field, expected, "writing '%s' failed: %s", path, strerror(err));
    return 0;
}
