/* check_sweep - one-port sweeps read in every format, refused when bad, and
 * their resonances, against sweeps scikit-rf writes at test time
 * (tests/sweep_gen.py, run with /usr/bin/python3: textbook lines of known
 * VF, loss and Z0, with the true resonances found by scipy). */
#include <config.h>
#include <check.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"
#include "testutil.h"

#define C0 299792458.0
#define NCASES 24
#define NCASES_TEXT "24" /* the same, for sweep_gen.py */

static char g_dir[256];   /* generated sweeps */

static cxl_sweep *read_file(const char *name)
{
    return load_sweep(g_dir, name);
}

/* ---- every format against scikit-rf's truth ------------------------- */

typedef struct truth_pt { double f, re, im; } truth_pt;

static size_t read_truth(truth_pt *t, size_t max)
{
    char path[512], line[256];
    snprintf(path, sizeof path, "%s/f/truth.csv", g_dir);
    FILE *fp = fopen(path, "r");
    ck_assert(fp != NULL);
    size_t n = 0;
    ck_assert(fgets(line, sizeof line, fp) != NULL);
    while (n < max && fgets(line, sizeof line, fp))
        if (sscanf(line, "%lf,%lf,%lf", &t[n].f, &t[n].re, &t[n].im) == 3) n++;
    fclose(fp);
    return n;
}

static const struct { const char *file; double ref; cxl_sweep_source src; } format_files[] = {
    { "f/s_ri_hz.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/s_ma_khz.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/s_db_mhz.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/s_ri_ghz.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/z_ri.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/y_ma.s1p", 75, CXL_SWEEP_TOUCHSTONE1 },
    { "f/default.s1p", 50, CXL_SWEEP_TOUCHSTONE1 },
    { "f/s_ref75.s1p", 75, CXL_SWEEP_TOUCHSTONE1 },
    { "f/v2_s.ts", 75, CXL_SWEEP_TOUCHSTONE2 },
    { "f/v2_z.ts", 75, CXL_SWEEP_TOUCHSTONE2 },
    { "f/rx.csv", 50, CXL_SWEEP_CSV },
    { "f/zdeg.csv", 50, CXL_SWEEP_CSV },
    { "f/sri.csv", 50, CXL_SWEEP_CSV },
    { "f/sdb.csv", 50, CXL_SWEEP_CSV },
};

START_TEST(every_format_gives_the_same_reflection)
{
    truth_pt t[200];
    size_t nt = read_truth(t, 200);
    ck_assert_uint_eq(nt, 121);   /* sweep_gen.py formats: 121 points */
    const char *file = format_files[_i].file;
    cxl_sweep *s = read_file(file);
    ck_assert_uint_eq(cxl_sweep_count(s), nt);
    double start, stop, ref;
    cxl_sweep_source src;
    int phase;
    ck_assert_int_eq(cxl_sweep_info(s, &start, &stop, &ref, &src, &phase), CXL_OK);
    ck_assert_double_eq_tol(start, 1e6, 1e-3);     /* sweep_gen.py: 1 to 61 MHz */
    ck_assert_double_eq_tol(stop, 61e6, 1e-3);
    ck_assert_double_eq_tol(ref, format_files[_i].ref, 1e-12);  /* the file's R / [Reference] */
    ck_assert_int_eq(src, format_files[_i].src);
    ck_assert_int_eq(phase, 1);
    for (size_t i = 0; i < nt; i++) {
        double f, gr, gi, zr, zi;
        ck_assert_int_eq(cxl_sweep_point(s, i, 50.0, &f, &gr, &gi, &zr, &zi), CXL_OK);
        /* scikit-rf's Gamma against 50 ohm, printed to 15-17 digits; DB
         * and MA forms lose a few digits in the conversions */
        ck_assert_msg(fabs(f - t[i].f) <= 1e-9 * t[i].f, "%s point %zu f %.17g", file, i, f);
        ck_assert_msg(fabs(gr - t[i].re) < 1e-9 && fabs(gi - t[i].im) < 1e-9,
                      "%s point %zu: %.12g%+.12gj against %.12g%+.12gj", file, i, gr, gi,
                      t[i].re, t[i].im);
        /* Z from Gamma: Z = Zref (1 + G)/(1 - G), Pozar 4th ed. sec. 2.3 */
        double complex_den = (1 - t[i].re) * (1 - t[i].re) + t[i].im * t[i].im;
        double zr_ref = 50.0 * (1 - t[i].re * t[i].re - t[i].im * t[i].im) / complex_den;
        ck_assert_double_eq_tol(zr, zr_ref, 1e-6 * (1 + fabs(zr_ref)));
        (void)zi;
    }
    cxl_sweep_free(s);
}
END_TEST

START_TEST(swr_column_gives_magnitude_only)
{
    truth_pt t[200];
    size_t nt = read_truth(t, 200);
    cxl_sweep *s = read_file("f/swr.csv");
    int phase = 9;
    ck_assert_int_eq(cxl_sweep_info(s, NULL, NULL, NULL, NULL, &phase), CXL_OK);
    ck_assert_int_eq(phase, 0);
    double f, g, sent = 7.0;
    for (size_t i = 0; i < nt; i++) {
        ck_assert_int_eq(cxl_sweep_magnitude(s, i, 50.0, &f, &g), CXL_OK);
        ck_assert_double_eq_tol(g, hypot(t[i].re, t[i].im), 1e-9);  /* |Gamma| of the truth */
    }
    /* no phase: no Z, no other reference */
    ck_assert_int_eq(cxl_sweep_point(s, 0, 50.0, &sent, NULL, NULL, NULL, NULL), CXL_ENOTFOUND);
    ck_assert_int_eq(cxl_sweep_magnitude(s, 0, 75.0, &f, &sent), CXL_ENOTFOUND);
    ck_assert_double_eq(sent, 7.0);
    cxl_sweep_free(s);
}
END_TEST

START_TEST(reference_change_is_the_textbook_one)
{
    /* Gamma against 75 ohm from a file against 50: (Z - 75)/(Z + 75) with
     * Z from the truth (Pozar 4th ed. sec. 2.3) */
    truth_pt t[200];
    size_t nt = read_truth(t, 200);
    cxl_sweep *s = read_file("f/s_ri_hz.s1p");
    for (size_t i = 0; i < nt; i += 7) {
        double gr, gi;
        ck_assert_int_eq(cxl_sweep_point(s, i, 75.0, NULL, &gr, &gi, NULL, NULL), CXL_OK);
        double d = (1 - t[i].re) * (1 - t[i].re) + t[i].im * t[i].im;
        double zr = 50 * (1 - t[i].re * t[i].re - t[i].im * t[i].im) / d;
        double zi = 50 * 2 * t[i].im / d;
        double nr = zr - 75, ni = zi, dr = zr + 75, di = zi;
        double m = dr * dr + di * di;
        ck_assert_double_eq_tol(gr, (nr * dr + ni * di) / m, 1e-9);
        ck_assert_double_eq_tol(gi, (ni * dr - nr * di) / m, 1e-9);
    }
    cxl_sweep_free(s);
}
END_TEST

/* ---- bad files ------------------------------------------------------ */

static const struct { const char *name, *text; size_t line; } bad_files[] = {
    { "empty", "", 0 },
    { "comments only", "! nothing\n!\n", 0 },
    { "non-increasing", "# MHz S RI R 50\n1 0.1 0.2\n2 0.1 0.2\n2 0.1 0.2\n", 4 },
    { "decreasing", "# MHz S RI R 50\n1 0.1 0.2\n0.5 0.1 0.2\n", 3 },
    { "two-port data", "# MHz S RI R 50\n1 0.1 0.2 0.3 0.4 0.5 0.6 0.7 0.8\n", 2 },
    { "missing column", "# MHz S RI R 50\n1 0.1 0.2\n2 0.1\n", 3 },
    { "non-number", "# MHz S RI R 50\n1 0.1 0.2\n2 0.1 abc\n", 3 },
    { "comma decimal", "# MHz S RI R 50\n1 0,1 0.2\n", 2 },
    { "nan", "# MHz S RI R 50\n1 nan 0.2\n", 2 },
    { "inf", "# MHz S RI R 50\n1 0.1 inf\n", 2 },
    { "overflow", "# MHz S RI R 50\n1 1e999 0.2\n", 2 },
    { "binary", "# MHz S RI R 50\n1 0.1 0.2\n\x01\x02\x03\n", 3 },
    { "G parameters", "# MHz G RI R 50\n1 0.1 0.2\n", 1 },
    { "bad option", "# MHz S XY R 50\n1 0.1 0.2\n", 1 },
    { "R zero", "# MHz S RI R 0\n1 0.1 0.2\n", 1 },
    { "negative frequency", "# MHz S RI R 50\n-1 0.1 0.2\n", 2 },
    { "no data", "# MHz S RI R 50\n! none\n", 2 },
    { "z of minus one", "# MHz Z RI R 50\n1 -1 0\n", 2 },
    { "v2 two ports", "[Version] 2.0\n# MHz S RI R 50\n[Number of Ports] 2\n", 3 },
    { "v2 two-port order", "[Version] 2.0\n# MHz S RI\n[Number of Ports] 1\n"
                           "[Two-Port Data Order] 12_21\n", 4 },
    { "v2 data before keyword", "[Version] 2.0\n# MHz S RI\n[Number of Ports] 1\n1 0.1 0.2\n", 4 },
    { "v2 count", "[Version] 2.0\n# MHz S RI\n[Number of Ports] 1\n[Number of Frequencies] 3\n"
                  "[Network Data]\n1 0.1 0.2\n2 0.1 0.2\n[End]\n", 8 },
    { "v2 version 3", "[Version] 3.0\n", 1 },
    { "v2 unknown keyword", "[Version] 2.0\n[Whatever] 1\n", 2 },
    { "v2 after end", "[Version] 2.0\n[Number of Ports] 1\n[Network Data]\n1 0.1 0.2\n[End]\n"
                      "2 0.1 0.2\n", 6 },
    { "v1 keyword", "# MHz S RI R 50\n[Network Data]\n", 2 },
    { "csv unknown column", "freq_hz,s11_re,s11_im,extra\n1,0.1,0.2,3\n", 1 },
    { "csv two sets", "freq_hz,s11_re,s11_im,swr\n1,0.1,0.2,3\n", 1 },
    { "csv half set", "freq_hz,r_ohm\n1,50\n", 1 },
    { "csv no frequency", "r_ohm,x_ohm\n50,0\n", 1 },
    { "csv extra field", "freq_hz,r_ohm,x_ohm\n1,50,0\n2,50,0,7\n", 3 },
    { "csv missing field", "freq_hz,r_ohm,x_ohm\n1,50,0\n2,50\n", 3 },
    { "csv swr below 1", "freq_mhz,swr\n1,1.5\n2,0.9\n", 3 },
    { "csv header only", "freq_mhz,swr\n", 1 },
    { "csv empty cell", "freq_mhz,swr\n1,\n", 2 },
    { "csv non-increasing", "freq_mhz,swr\n1,1.5\n1,1.6\n", 3 },
    { "nul byte", "# MHz S RI R 50\n1 0.1\0 0.2\n", 2 },
};

START_TEST(bad_file_is_refused_with_its_line)
{
    const char *text = bad_files[_i].text;
    size_t size = strlen(text);
    if (strcmp(bad_files[_i].name, "nul byte") == 0) size = 28;
    cxl_sweep *s = (cxl_sweep *)&size;  /* untouched on failure */
    size_t line = 12345;
    char msg[200] = "";
    cxl_status st = cxl_sweep_read_buffer(text, size, &s, &line, msg, sizeof msg);
    ck_assert_msg(st == CXL_EPARSE, "%s: status %d", bad_files[_i].name, st);
    ck_assert_msg(s == (cxl_sweep *)&size, "%s: output touched", bad_files[_i].name);
    ck_assert_msg(line == bad_files[_i].line, "%s: line %zu, expected %zu (%s)",
                  bad_files[_i].name, line, bad_files[_i].line, msg);
    ck_assert_msg(strstr(msg, "(expected") != NULL || strstr(msg, "says") ||
                  strstr(msg, "without"), "%s: '%s' gives no example", bad_files[_i].name, msg);
    ck_assert_ptr_null(strchr(msg, '\n'));
    /* the same through a stream */
    FILE *fp = fmemopen((void *)text, size ? size : 1, "rb");
    ck_assert(fp != NULL);
    if (size == 0) { fclose(fp); fp = tmpfile(); ck_assert(fp != NULL); }
    line = 12345;
    ck_assert_int_eq(cxl_sweep_read(fp, &s, &line, NULL, 0), CXL_EPARSE);
    ck_assert_uint_eq(line, bad_files[_i].line);
    fclose(fp);
}
END_TEST

START_TEST(long_line_is_refused)
{
    /* line 2 of exactly CXL_SWEEP_MAX_LINE bytes is read; one byte more is
     * refused, naming line 2 */
    for (int extra = 0; extra <= 1; extra++) {
        size_t len = CXL_SWEEP_MAX_LINE + (size_t)extra;
        char *text = malloc(len + 64);
        ck_assert(text != NULL);
        strcpy(text, "# MHz S RI R 50\n1 0.1 0.2 !");
        size_t head = strlen("# MHz S RI R 50\n");
        size_t k = strlen(text);
        memset(text + k, 'x', len - (k - head));
        strcpy(text + head + len, "\n");
        cxl_sweep *s = NULL;
        size_t line = 0;
        char msg[200] = "";
        cxl_status st = cxl_sweep_read_buffer(text, strlen(text), &s, &line, msg, sizeof msg);
        if (extra) {
            ck_assert_int_eq(st, CXL_EPARSE);
            ck_assert_uint_eq(line, 2);
            ck_assert_ptr_nonnull(strstr(msg, "longer than 4096"));
        } else {
            ck_assert_msg(st == CXL_OK, "%s", msg);
            ck_assert_uint_eq(cxl_sweep_count(s), 1);
            cxl_sweep_free(s);
        }
        free(text);
    }
}
END_TEST

START_TEST(large_sweep_reads)
{
    /* 100,001 points, CRLF line ends and a byte-order mark */
    size_t n = 100001, cap = n * 40 + 64, used = 0;
    char *text = malloc(cap);
    ck_assert(text != NULL);
    used += (size_t)snprintf(text, cap, "\xef\xbb\xbf# Hz S RI R 50\r\n");
    for (size_t i = 0; i < n; i++)
        used += (size_t)snprintf(text + used, cap - used, "%zu 0.5 -0.25\r\n", 1000 + i * 10);
    cxl_sweep *s = NULL;
    ck_assert_int_eq(cxl_sweep_read_buffer(text, used, &s, NULL, NULL, 0), CXL_OK);
    ck_assert_uint_eq(cxl_sweep_count(s), n);
    double f, gr, gi;
    ck_assert_int_eq(cxl_sweep_point(s, n - 1, 50.0, &f, &gr, &gi, NULL, NULL), CXL_OK);
    ck_assert_double_eq(f, 1000.0 + 10.0 * (double)(n - 1));
    ck_assert_double_eq(gr, 0.5);
    ck_assert_double_eq(gi, -0.25);
    ck_assert_int_eq(cxl_sweep_point(s, n, 50.0, &f, &gr, &gi, NULL, NULL), CXL_ERANGE);
    cxl_sweep_free(s);
    free(text);
}
END_TEST

/* ---- resonances against the truth ----------------------------------- */

typedef struct tres { char kind; int series; double f; } tres;

static size_t case_truth(int k, tres *t, size_t max)
{
    char path[512], line[256];
    snprintf(path, sizeof path, "%s/r/truth.csv", g_dir);
    FILE *fp = fopen(path, "r");
    ck_assert(fp != NULL);
    size_t n = 0;
    while (n < max && fgets(line, sizeof line, fp)) {
        int c, series;
        char kind[8];
        double f;
        if (sscanf(line, "%d,%7[a-z],%d,%lf", &c, kind, &series, &f) == 4 && c == k) {
            t[n].kind = kind[0];
            t[n].series = series;
            t[n].f = f;
            n++;
        }
    }
    fclose(fp);
    return n;
}

typedef struct case_info {
    char end[8];
    double length, vf_hf, drop, a, b, z0, noise;
    int npts;
} case_info;

static case_info read_case(int k)
{
    char path[512];
    case_info c;
    snprintf(path, sizeof path, "%s/r/case%d.txt", g_dir, k);
    FILE *fp = fopen(path, "r");
    ck_assert(fp != NULL);
    ck_assert_int_eq(fscanf(fp, "%7s %lf %lf %lf %lf %lf %lf %d %lf", c.end, &c.length, &c.vf_hf,
                            &c.drop, &c.a, &c.b, &c.z0, &c.npts, &c.noise), 9);
    fclose(fp);
    return c;
}

static char kind_letter(cxl_sweep_kind k)
{
    return k == CXL_SWEEP_X_ZERO ? 'x' : k == CXL_SWEEP_Z_MIN ? 'z' : 's';
}

/* Every resonance found lies within its stated uncertainty of a true one
 * of its kind (the uncertainty is a promise, checked on NCASES random
 * lines, coarse and fine, a third with noise); every true one away from
 * the ends is found in the noise-free sweeps. */
START_TEST(resonances_within_their_uncertainty)
{
    int k = _i;
    case_info c = read_case(k);
    tres t[400];
    size_t nt = case_truth(k, t, 400);
    char name[64];
    snprintf(name, sizeof name, "r/case%d.s1p", k);
    cxl_sweep *s = read_file(name);
    double start, stop;
    ck_assert_int_eq(cxl_sweep_info(s, &start, &stop, NULL, NULL, NULL), CXL_OK);
    double step = (stop - start) / (c.npts - 1);
    cxl_sweep_res *r = NULL;
    cxl_stub_end end = c.end[0] == 'o' ? CXL_STUB_OPEN : CXL_STUB_SHORT;
    ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, end, 0.0, 0.0, &r), CXL_OK);
    size_t nr = cxl_sweep_res_count(r);
    int matched[400] = { 0 };
    for (size_t i = 0; i < nr; i++) {
        cxl_sweep_kind kind;
        int series, order;
        double f, err, value;
        ck_assert_int_eq(cxl_sweep_res_get(r, i, &kind, &series, &order, &f, &err, &value),
                         CXL_OK);
        ck_assert_double_eq_tol(err, step / 2, step * 1e-6);
        double best = INFINITY;
        size_t bj = 0;
        for (size_t j = 0; j < nt; j++) {
            if (t[j].kind != kind_letter(kind) || t[j].series != series) continue;
            if (fabs(t[j].f - f) < best) { best = fabs(t[j].f - f); bj = j; }
        }
        if (c.noise > 0 && best > err) continue;  /* noise may add a crossing */
        ck_assert_msg(best <= err, "case %d: %c series %d at %.1f Hz: nearest truth %.1f Hz "
                      "away, uncertainty %.1f Hz", k, kind_letter(kind), series, f, best, err);
        matched[bj] = 1;
        /* order from the spacing: n-th series resonance at (2n-1)/4 (open)
         * or n/2 (short) wavelengths, DESIGN.md */
        if (series && kind == CXL_SWEEP_X_ZERO) {
            double vf = c.vf_hf - c.drop / sqrt(f);
            double q = 4 * c.length * f / (vf * C0);
            int want = end == CXL_STUB_OPEN ? (int)lround((q + 1) / 2) : (int)lround(q / 2);
            ck_assert_msg(order == want, "case %d: order %d, want %d", k, order, want);
        }
    }
    if (c.noise == 0)
        for (size_t j = 0; j < nt; j++) {
            if (t[j].f < start + 2 * step || t[j].f > stop - 2 * step) continue;
            if (t[j].kind == 'x' || t[j].series == 0) {
                ck_assert_msg(matched[j] || t[j].kind != 'x', "case %d: crossing at %.1f Hz "
                              "not found", k, t[j].f);
            }
        }
    cxl_sweep_res_free(r);
    cxl_sweep_free(s);
}
END_TEST

/* VF from each series reactance zero of a line of known VF: within 0.1 %
 * of VF(f) there (the reactance of Z0 coth(gamma l) with a real Z0 is zero
 * exactly where beta l = (2n - 1) pi / 2, so VF = 4 L f / ((2n - 1) c);
 * Pozar 4th ed. sec. 2.3, from memory). */
START_TEST(vf_within_a_tenth_of_a_percent)
{
    int checked = 0;
    for (int k = 0; k < NCASES; k++) {
        case_info c = read_case(k);
        if (c.noise > 0) continue;
        char name[64];
        snprintf(name, sizeof name, "r/case%d.s1p", k);
        cxl_sweep *s = read_file(name);
        cxl_stub_end end = c.end[0] == 'o' ? CXL_STUB_OPEN : CXL_STUB_SHORT;
        cxl_sweep_res *r = NULL;
        ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, end, c.length, c.vf_hf, &r), CXL_OK);
        double f[64];
        int order[64];
        size_t n = 0;
        ck_assert_int_eq(cxl_sweep_res_readings(r, CXL_SWEEP_X_ZERO, f, order, 64, &n), CXL_OK);
        for (size_t i = 0; i < n; i++) {
            double vf;
            ck_assert_int_ge(order[i], 1);
            ck_assert_int_eq(cxl_stub_vf_from_resonance(end, order[i], c.length, f[i], 0, 0, &vf),
                             CXL_OK);
            double truth = c.vf_hf - c.drop / sqrt(f[i]);
            ck_assert_msg(fabs(vf / truth - 1) < 1e-3, "case %d order %d: VF %.6f, truth %.6f",
                          k, order[i], vf, truth);
            checked++;
        }
        cxl_sweep_res_free(r);
        cxl_sweep_free(s);
    }
    ck_assert_int_gt(checked, 20);
}
END_TEST

START_TEST(orders_from_guess_and_spacing_agree)
{
    for (int k = 0; k < NCASES; k++) {
        case_info c = read_case(k);
        if (c.noise > 0) continue;
        char name[64];
        snprintf(name, sizeof name, "r/case%d.s1p", k);
        cxl_sweep *s = read_file(name);
        cxl_stub_end end = c.end[0] == 'o' ? CXL_STUB_OPEN : CXL_STUB_SHORT;
        cxl_sweep_res *a = NULL, *b = NULL;
        ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, end, c.length, c.vf_hf, &a), CXL_OK);
        ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, end, 0, 0, &b), CXL_OK);
        ck_assert_uint_eq(cxl_sweep_res_count(a), cxl_sweep_res_count(b));
        for (size_t i = 0; i < cxl_sweep_res_count(a); i++) {
            int oa, ob;
            ck_assert_int_eq(cxl_sweep_res_get(a, i, NULL, NULL, &oa, NULL, NULL, NULL), CXL_OK);
            ck_assert_int_eq(cxl_sweep_res_get(b, i, NULL, NULL, &ob, NULL, NULL, NULL), CXL_OK);
            ck_assert_int_eq(oa, ob);
        }
        cxl_sweep_res_free(a);
        cxl_sweep_res_free(b);
        cxl_sweep_free(s);
    }
}
END_TEST

/* The SWR column of a sweep (its |Gamma| written as SWR) gives the SWR
 * minima the full sweep gives, and nothing else. */
START_TEST(swr_only_sweep_gives_swr_minima)
{
    /* two reflections, 0.3 and 0.5 with a 100 ns round trip between
     * them: |Gamma| ripples between 0.2 and 0.8 every 10 MHz (common
     * practice, no source) */
    size_t n = 401, cap = 80 * n + 64, used = 0;
    char *text = malloc(cap);
    ck_assert(text != NULL);
    used += (size_t)snprintf(text, cap, "# MHz S RI R 50\n");
    for (size_t i = 0; i < n; i++) {
        double f = 1e6 + 1e5 * (double)i, ph = -2 * M_PI * f * 100e-9;
        used += (size_t)snprintf(text + used, cap - used, "%.17g %.17g %.17g\n", f / 1e6,
                                 0.3 + 0.5 * cos(ph), 0.5 * sin(ph));
    }
    cxl_sweep *full = NULL;
    ck_assert_int_eq(cxl_sweep_read_buffer(text, used, &full, NULL, NULL, 0), CXL_OK);
    used = 0;
    used += (size_t)snprintf(text, cap, "freq_hz,swr\n");
    for (size_t i = 0; i < n; i++) {
        double f, g;
        ck_assert_int_eq(cxl_sweep_magnitude(full, i, 50.0, &f, &g), CXL_OK);
        used += (size_t)snprintf(text + used, cap - used, "%.17g,%.17g\n", f, (1 + g) / (1 - g));
    }
    cxl_sweep *s = NULL;
    ck_assert_int_eq(cxl_sweep_read_buffer(text, used, &s, NULL, NULL, 0), CXL_OK);
    cxl_sweep_res *r = NULL, *rf = NULL;
    ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, CXL_STUB_OPEN, 0, 0, &r), CXL_OK);
    ck_assert_int_eq(cxl_sweep_resonances(full, 50.0, CXL_STUB_OPEN, 0, 0, &rf), CXL_OK);
    size_t k = 0;
    for (size_t i = 0; i < cxl_sweep_res_count(rf); i++) {
        cxl_sweep_kind kind;
        double f, g;
        ck_assert_int_eq(cxl_sweep_res_get(rf, i, &kind, NULL, NULL, &f, NULL, NULL), CXL_OK);
        if (kind != CXL_SWEEP_SWR_MIN) continue;
        ck_assert_int_eq(cxl_sweep_res_get(r, k++, &kind, NULL, NULL, &g, NULL, NULL), CXL_OK);
        ck_assert_int_eq(kind, CXL_SWEEP_SWR_MIN);
        ck_assert_double_eq_tol(g, f, 1e-6 * f);
        /* |Gamma| is least where the two are opposite: 5, 15, 25 ... MHz */
        ck_assert_double_eq_tol(fmod(f, 10e6), 5e6, 1e3);
    }
    ck_assert_uint_eq(k, 4);
    ck_assert_uint_eq(cxl_sweep_res_count(r), k);
    cxl_sweep_res_free(r);
    cxl_sweep_res_free(rf);
    cxl_sweep_free(s);
    cxl_sweep_free(full);
    free(text);
}
END_TEST

/* |Z| = sqrt(R^2 + X^2) is never below the resistance (common practice,
 * no source): at each |Z| minimum of the lossy random lines, the value is
 * at least the R of the reactance zero of the same order, less 10 % for
 * the change of R between the two frequencies, and not far above it. */
START_TEST(impedance_minimum_not_below_resistance)
{
    for (int k = 0; k < NCASES; k++) {
        char name[64];
        snprintf(name, sizeof name, "r/case%d.s1p", k);
        cxl_sweep *s = read_file(name);
        cxl_sweep_res *r = NULL;
        ck_assert_int_eq(cxl_sweep_resonances(s, 50.0, k % 2 ? CXL_STUB_SHORT : CXL_STUB_OPEN, 0,
                                              0, &r), CXL_OK);
        size_t n = cxl_sweep_res_count(r);
        for (size_t i = 0; i < n; i++) {
            cxl_sweep_kind kind;
            int series, order;
            double zmin;
            cxl_sweep_res_get(r, i, &kind, &series, &order, NULL, NULL, &zmin);
            if (kind != CXL_SWEEP_Z_MIN || order <= 0) continue;
            for (size_t j = 0; j < n; j++) {
                cxl_sweep_kind kj;
                int sj, oj;
                double rx;
                cxl_sweep_res_get(r, j, &kj, &sj, &oj, NULL, NULL, &rx);
                if (kj != CXL_SWEEP_X_ZERO || !sj || oj != order || rx < 0.05) continue;
                ck_assert_msg(zmin >= 0.9 * rx && zmin <= 3.0 * rx + 0.5,
                              "case %d order %d: |Z| min %.4g against R %.4g", k, order, zmin, rx);
            }
        }
        cxl_sweep_res_free(r);
        cxl_sweep_free(s);
    }
}
END_TEST

static Suite *suite(void)
{
    Suite *s = suite_create("sweep");
    TCase *tc = tcase_create("read");
    tcase_set_timeout(tc, 60);
    tcase_add_loop_test(tc, every_format_gives_the_same_reflection, 0,
                        (int)(sizeof format_files / sizeof format_files[0]));
    tcase_add_test(tc, swr_column_gives_magnitude_only);
    tcase_add_test(tc, reference_change_is_the_textbook_one);
    tcase_add_loop_test(tc, bad_file_is_refused_with_its_line, 0,
                        (int)(sizeof bad_files / sizeof bad_files[0]));
    tcase_add_test(tc, long_line_is_refused);
    tcase_add_test(tc, large_sweep_reads);
    suite_add_tcase(s, tc);
    tc = tcase_create("resonances");
    tcase_set_timeout(tc, 60);
    tcase_add_loop_test(tc, resonances_within_their_uncertainty, 0, NCASES);
    tcase_add_test(tc, vf_within_a_tenth_of_a_percent);
    tcase_add_test(tc, orders_from_guess_and_spacing_agree);
    tcase_add_test(tc, swr_only_sweep_gives_swr_minima);
    tcase_add_test(tc, impedance_minimum_not_below_resistance);
    suite_add_tcase(s, tc);
    return s;
}

int main(void)
{
    gsl_set_error_handler(NULL);
    static const char *const gen[] = { "formats '%s/f'", "resonances '%s/r' 13 " NCASES_TEXT };
    return run_suite_with_sweeps(suite(), g_dir, sizeof g_dir, "check_sweep", gen,
                                 sizeof gen / sizeof gen[0]);
}
