/* floor.c - the least a program can do for a batch: the floors that
 * `make bench` times coaxline's batch path against.
 *
 *   floor phase|pair|cut|budget|hybrid BANDS_CSV INPUT_CSV   the same-bytes floor
 *   floor printf-phase|...|printf-hybrid BANDS_CSV INPUT_CSV
 *   floor io BYTES_PER_ROW INPUT_CSV
 *
 * All read the generated benchmark files (tests/bench/bench_batch.c) line
 * by line with fgets, split on commas (the generator writes no quotes),
 * convert with strtod, do the same arithmetic as coaxline in the same
 * order, and write exactly the bytes `coaxline CMD --input FILE --format
 * csv` writes: bench_batch checks that with a byte comparison.  No
 * validation, no units other than the trailing "m" the generator writes,
 * no locale handling beyond the "C" locale every C program starts in:
 * whatever coaxline spends above this is the price of checking and
 * parsing real input.
 *
 * - "budget" (the closed-form --null-vs-inphase goal) and "hybrid": the
 *   arithmetic is the library's own calls (cxl_duo_null_depth,
 *   cxl_budget_phase_for_null, cxl_budget_length_for_phase; the cxl_hybrid_
 *   functions), made in the same order as coaxline makes them, so the
 *   floor's time holds exactly the same numerics and the difference is the
 *   command-line path: options, checks, band selection, output.
 * - "phase", "pair", "cut", "budget", "hybrid": the floor.  Numbers are formatted by
 *   put_fixed() below (an integer conversion, printf only where a value
 *   lies within 1e-6 of a rounding tie) into one output buffer written
 *   with fwrite; the band edges of each band name and Region are looked
 *   up once.
 * - "printf-*": the same rows printed field by field with printf("%.*f")
 *   and a scan of the band table per row, the way a first version of such
 *   a loop is written; glibc's printf is slow, so this is a second,
 *   named reference, not the floor.
 * - "io": the plain I/O limit: reads the rows the same way and writes
 *   BYTES_PER_ROW bytes for each, with no parsing or formatting at all.
 *
 * Not installed; compiled by make check, run by make bench.
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"

#define C_M_PER_S 299792458.0
#define MAX_BANDS 128
#define MAX_FIELDS 16
#define MAX_CACHED 64

struct band { char name[16]; int region; double lo_hz, hi_hz; };
static struct band bands[MAX_BANDS];
static int nbands;

/* Split line in place on commas; strips the line break. */
static int split(char *line, char **f)
{
    int n = 0;
    line[strcspn(line, "\r\n")] = '\0';
    f[n++] = line;
    for (char *p = line; *p && n < MAX_FIELDS; p++)
        if (*p == ',') { *p = '\0'; f[n++] = p + 1; }
    return n;
}

static void load_bands(const char *path)
{
    FILE *fp = fopen(path, "r");
    char line[1024], *f[MAX_FIELDS];
    if (!fp) { perror(path); exit(2); }
    if (!fgets(line, sizeof line, fp)) exit(2); /* header: band,service,region,low_khz,... */
    while (nbands < MAX_BANDS && fgets(line, sizeof line, fp)) {
        if (split(line, f) < 5) continue;
        struct band *b = &bands[nbands++];
        snprintf(b->name, sizeof b->name, "%s", f[0]);
        b->region = atoi(f[2]);
        b->lo_hz = strtod(f[3], NULL) * 1e3;
        b->hi_hz = strtod(f[4], NULL) * 1e3;
    }
    fclose(fp);
}

/* Widest edges of a band in a region (0: all regions): low, centre, high,
 * the centre computed as coaxline's band selection does. */
static void edges(const char *name, int region, double f[3])
{
    double lo = 0.0, hi = 0.0;
    int found = 0;
    for (int i = 0; i < nbands; i++) {
        if (strcmp(bands[i].name, name) != 0 || (region && bands[i].region != region)) continue;
        if (!found || bands[i].lo_hz < lo) lo = bands[i].lo_hz;
        if (!found || bands[i].hi_hz > hi) hi = bands[i].hi_hz;
        found = 1;
    }
    f[0] = lo; f[1] = 0.5 * (lo + hi); f[2] = hi;
}

/* The same, looked up once per band name and region. */
static const double *edges_cached(const char *name, int region)
{
    static struct { char name[16]; int region; double f[3]; } cache[MAX_CACHED];
    static int ncached;
    for (int i = 0; i < ncached; i++)
        if (cache[i].region == region && strcmp(cache[i].name, name) == 0) return cache[i].f;
    int i = ncached < MAX_CACHED ? ncached++ : MAX_CACHED - 1;
    snprintf(cache[i].name, sizeof cache[i].name, "%s", name);
    cache[i].region = region;
    edges(name, region, cache[i].f);
    return cache[i].f;
}

static const char *const edge_names[3] = { "low", "centre", "high" };
static const char *const region_text[4] = { "all", "1", "2", "3" };

/* ---- output buffer and the fixed-point formatter ---------------------- */

static char obuf[1 << 16];
static size_t olen;

static void flush_out(void)
{
    if (olen && fwrite(obuf, 1, olen, stdout) != olen) exit(2);
    olen = 0;
}

/* Room for one output line (a line is well under 1 KiB). */
static char *out_line(void)
{
    if (olen > sizeof obuf - 1024) flush_out();
    return obuf + olen;
}

static char *put_str(char *p, const char *s)
{
    while (*s) *p++ = *s++;
    return p;
}

static const double pow10_tab[10] = { 1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9 };

/* v with d decimals (0 <= d <= 9), the bytes of printf("%.*f", d, v).
 * v * 10^d is rounded once by the multiplication, by at most half a unit
 * in its last place, 2^-21 below 2^32: where its fraction lies further
 * than 1e-6 from one half, rounding it to the nearest integer gives the
 * digits of the exact decimal value, as printf does.  Nearer a tie (about
 * two values in a million), and for large values, printf decides. */
static char *put_fixed(char *p, double v, int d)
{
    double a = fabs(v), scaled = a * pow10_tab[d];
    if (!(scaled < 4294967296.0)) return p + sprintf(p, "%.*f", d, v);
    uint64_t i = (uint64_t)scaled;
    double frac = scaled - (double)i;
    if (fabs(frac - 0.5) < 1e-6) return p + sprintf(p, "%.*f", d, v);
    if (frac > 0.5) i++;
    if (signbit(v)) *p++ = '-';
    char tmp[24];
    int n = 0;
    do { tmp[n++] = (char)('0' + i % 10); i /= 10; } while (i > 0 || n <= d);
    while (n > d) *p++ = tmp[--n];
    if (d > 0) {
        *p++ = '.';
        while (n > 0) *p++ = tmp[--n];
    }
    return p;
}

/* ---- the rows ----------------------------------------------------------- */

static double phase_deg(double delta_m, double vf, double f)
{
    return 360.0 * f * delta_m / (vf * C_M_PER_S);
}

static const char phase_header[] =
    "label,band,edge,freq_mhz,length_m,reference_m,delta_m,phase_error_deg,vf,region,"
    "transfer_deg,electrical_deg,transfer_db,reference_transfer_deg,reference_electrical_deg,"
    "reference_transfer_db\n";
static const char pair_header[] =
    "label,band,edge,freq_mhz,delta_m,phase_error_deg,tolerance_deg,verdict,allowed_mismatch_m,"
    "uncertainty_deg,electrical_error_deg,transfer_imbalance_db\n";
static const char cut_header[] =
    "label,offset_m,delay_ns,vf,cut_length_m,cut_length_ft,freq_mhz,electrical_deg,"
    "quarter_wave_mhz,allowance_m\n";

/* label,length,reference,vf,band,region */
static void phase_row(char **f, int use_printf)
{
    double len = strtod(f[1], NULL), ref = strtod(f[2], NULL), vf = strtod(f[3], NULL);
    int region = atoi(f[5]);
    double fr_buf[3];
    const double *fr = fr_buf;
    if (use_printf) edges(f[4], region, fr_buf);
    else fr = edges_cached(f[4], region);
    for (int k = 0; k < 3; k++) {
        double err = phase_deg(len - ref, vf, fr[k]);
        double elec = 360.0 * fr[k] * len / (vf * C_M_PER_S);
        double ref_elec = 360.0 * fr[k] * ref / (vf * C_M_PER_S);
        if (use_printf) {
            printf("%s,%s,%s,%.6f,%.3f,%.3f,%.3f,%.3f,%.4f,%s,,%.3f,,,%.3f,\n", f[0], f[4],
                   edge_names[k], fr[k] / 1e6, len, ref, len - ref, err, vf, region_text[region],
                   elec, ref_elec);
            continue;
        }
        char *p = out_line(), *s = p;
        p = put_str(p, f[0]); *p++ = ',';
        p = put_str(p, f[4]); *p++ = ',';
        p = put_str(p, edge_names[k]); *p++ = ',';
        p = put_fixed(p, fr[k] / 1e6, 6); *p++ = ',';
        p = put_fixed(p, len, 3); *p++ = ',';
        p = put_fixed(p, ref, 3); *p++ = ',';
        p = put_fixed(p, len - ref, 3); *p++ = ',';
        p = put_fixed(p, err, 3); *p++ = ',';
        p = put_fixed(p, vf, 4); *p++ = ',';
        p = put_str(p, region_text[region]);
        p = put_str(p, ",,");
        p = put_fixed(p, elec, 3);
        p = put_str(p, ",,,");
        p = put_fixed(p, ref_elec, 3);
        p = put_str(p, ",\n");
        olen += (size_t)(p - s);
    }
}

/* label,length,vf,tolerance,band; the lengths separated by ';'.  Returns
 * 1 when a band edge fails the tolerance. */
static int pair_row(char **f, int use_printf)
{
    double lo = 0.0, hi = 0.0;
    int n = 0, failed = 0;
    for (char *p = f[1]; *p; n++) {
        double v = strtod(p, &p);
        if (n == 0 || v < lo) lo = v;
        if (n == 0 || v > hi) hi = v;
        p += strcspn(p, ";");
        if (*p) p++;
    }
    double vf = strtod(f[2], NULL), tol = strtod(f[3], NULL), fr_buf[3];
    const double *fr = fr_buf;
    if (use_printf) edges(f[4], 0, fr_buf);
    else fr = edges_cached(f[4], 0);
    double delta = hi - lo;
    for (int k = 0; k < 3; k++) {
        double err = phase_deg(delta, vf, fr[k]);
        double unc = phase_deg(fabs(delta) + 2 * 0.0, vf - 0.0, fr[k]) - fabs(err);
        double allowed = tol * vf * C_M_PER_S / (360.0 * fr[k]);
        const char *verdict = err > tol ? "fail" : err + unc > tol ? "uncertain" : "pass";
        if (err > tol) failed = 1;
        if (use_printf) {
            printf("%s,%s,%s,%.6f,%.3f,%.3f,%.3f,%s,%.3f,%.3f,%.3f,\n", f[0], f[4],
                   edge_names[k], fr[k] / 1e6, delta, err, tol, verdict, allowed, unc, err);
            continue;
        }
        char *p = out_line(), *s = p;
        p = put_str(p, f[0]); *p++ = ',';
        p = put_str(p, f[4]); *p++ = ',';
        p = put_str(p, edge_names[k]); *p++ = ',';
        p = put_fixed(p, fr[k] / 1e6, 6); *p++ = ',';
        p = put_fixed(p, delta, 3); *p++ = ',';
        p = put_fixed(p, err, 3); *p++ = ',';
        p = put_fixed(p, tol, 3); *p++ = ',';
        p = put_str(p, verdict); *p++ = ',';
        p = put_fixed(p, allowed, 3); *p++ = ',';
        p = put_fixed(p, unc, 3); *p++ = ',';
        p = put_fixed(p, err, 3);
        p = put_str(p, ",\n");
        olen += (size_t)(p - s);
    }
    return failed;
}

/* label,offset,vf */
static void cut_row(char **f, int use_printf)
{
    double off = strtod(f[1], NULL), vf = strtod(f[2], NULL);
    double delay = off / C_M_PER_S, cut = delay * vf * C_M_PER_S;
    double qw = vf * C_M_PER_S / (4.0 * cut);
    if (use_printf) {
        printf("%s,%.3f,%.3f,%.4f,%.3f,%.4f,,,%.4f,%.3f\n", f[0], off, delay * 1e9, vf, cut,
               cut / 0.3048, qw / 1e6, 0.0);
        return;
    }
    char *p = out_line(), *s = p;
    p = put_str(p, f[0]); *p++ = ',';
    p = put_fixed(p, off, 3); *p++ = ',';
    p = put_fixed(p, delay * 1e9, 3); *p++ = ',';
    p = put_fixed(p, vf, 4); *p++ = ',';
    p = put_fixed(p, cut, 3); *p++ = ',';
    p = put_fixed(p, cut / 0.3048, 4);
    p = put_str(p, ",,,");
    p = put_fixed(p, qw / 1e6, 4);
    p = put_str(p, ",0.000\n");
    olen += (size_t)(p - s);
}

static const char budget_header[] =
    "label,band,edge,freq_mhz,goal,goal_db,elevation_deg,imbalance_db,error_free_db,"
    "phase_tolerance_deg,vf,length_tolerance_m,length_tolerance_in\n";
static const char hybrid_header[] =
    "label,port_ohm,isolation_resistor_ohm,common_port_ohm,line_ohm,turns_ratio,rank,"
    "common_turns,line_turns,presented_ohm,swr,return_loss_db,single_input_loss_db,"
    "isolation_db\n";

/* One budget point's figures, the library's calls in coaxline's order;
 * *len_m NAN when the goal is out of reach.  Returns 1 then. */
static int budget_point(double goal, double imb, double vf, double f, double *free_db,
                        double *tol, double *len_m)
{
    *len_m = NAN;
    if (cxl_duo_null_depth(0.0, imb, free_db) != CXL_OK) exit(2);
    if (cxl_budget_phase_for_null(goal, imb, tol) != CXL_OK) return 1;
    if (cxl_budget_length_for_phase(*tol, vf, f, len_m) != CXL_OK) *len_m = NAN;
    return 0;
}

/* label,null-vs-inphase,imbalance,vf,band (widest edges).  Returns 1 when
 * a point misses the goal. */
static int budget_row(char **f, int use_printf)
{
    double goal = strtod(f[1], NULL), imb = strtod(f[2], NULL), vf = strtod(f[3], NULL);
    double fr_buf[3];
    const double *fr = fr_buf;
    int missed = 0;
    if (use_printf) edges(f[4], 0, fr_buf);
    else fr = edges_cached(f[4], 0);
    for (int k = 0; k < 3; k++) {
        double free_db, tol = 0.0, len;
        int out = budget_point(goal, imb, vf, fr[k], &free_db, &tol, &len);
        missed |= out;
        if (use_printf) {
            printf("%s,%s,%s,%.6f,null-vs-inphase,%.2f,,%.2f,%.2f,", f[0], f[4], edge_names[k],
                   fr[k] / 1e6, goal, imb, free_db);
            if (!out) printf("%.3f", tol);
            printf(",%.4f,", vf);
            if (isfinite(len)) printf("%.4f,%.3f\n", len, len / 0.0254);
            else printf(",\n");
            continue;
        }
        char *p = out_line(), *s = p;
        p = put_str(p, f[0]); *p++ = ',';
        p = put_str(p, f[4]); *p++ = ',';
        p = put_str(p, edge_names[k]); *p++ = ',';
        p = put_fixed(p, fr[k] / 1e6, 6);
        p = put_str(p, ",null-vs-inphase,");
        p = put_fixed(p, goal, 2);
        p = put_str(p, ",,");
        p = put_fixed(p, imb, 2); *p++ = ',';
        p = put_fixed(p, free_db, 2); *p++ = ',';
        if (!out) p = put_fixed(p, tol, 3);
        *p++ = ',';
        p = put_fixed(p, vf, 4); *p++ = ',';
        if (isfinite(len)) {
            p = put_fixed(p, len, 4); *p++ = ',';
            p = put_fixed(p, len / 0.0254, 3);
        } else {
            *p++ = ',';
        }
        *p++ = '\n';
        olen += (size_t)(p - s);
    }
    return missed;
}

#define HYBRID_MAX_PAIRS 20

/* label,impedance,to,max-turns,pairs (empty: --impedance, 10, 5) */
static void hybrid_row(char **f, int use_printf)
{
    double z = strtod(f[1], NULL), line_z = f[2][0] ? strtod(f[2], NULL) : z;
    unsigned max_turns = f[3][0] ? (unsigned)atoi(f[3]) : 10, np = f[4][0] ? (unsigned)atoi(f[4]) : 5;
    double iso_r, common_z, turns;
    unsigned p_t[HYBRID_MAX_PAIRS], q_t[HYBRID_MAX_PAIRS];
    size_t count = 0;
    if (cxl_hybrid_inphase(z, &iso_r, &common_z) != CXL_OK ||
        cxl_hybrid_turns_ratio(common_z, line_z, &turns) != CXL_OK ||
        cxl_hybrid_turns_search(common_z, line_z, max_turns, np, p_t, q_t, &count) != CXL_OK)
        exit(2);
    for (size_t i = 0; i < count; i++) {
        double zx, swr, rl, common_db, iso;
        if (cxl_hybrid_match(common_z, line_z, p_t[i], q_t[i], &zx, &swr, &rl) != CXL_OK ||
            cxl_hybrid_response(-(zx - line_z) / (zx + line_z), 0.0, 0.0, 0.0, &common_db,
                                &iso) != CXL_OK)
            exit(2);
        double loss = -common_db;
        if (use_printf) {
            printf("%s,%.2f,%.2f,%.2f,%.2f,%.4f,%zu,%u,%u,%.2f,%.3f,%.2f,%.3f,%.2f\n", f[0], z,
                   iso_r, common_z, line_z, turns, i + 1, p_t[i], q_t[i], zx, swr, rl, loss, iso);
            continue;
        }
        char *p = out_line(), *s = p;
        p = put_str(p, f[0]); *p++ = ',';
        p = put_fixed(p, z, 2); *p++ = ',';
        p = put_fixed(p, iso_r, 2); *p++ = ',';
        p = put_fixed(p, common_z, 2); *p++ = ',';
        p = put_fixed(p, line_z, 2); *p++ = ',';
        p = put_fixed(p, turns, 4); *p++ = ',';
        p = put_fixed(p, (double)(i + 1), 0); *p++ = ',';
        p = put_fixed(p, p_t[i], 0); *p++ = ',';
        p = put_fixed(p, q_t[i], 0); *p++ = ',';
        p = put_fixed(p, zx, 2); *p++ = ',';
        p = put_fixed(p, swr, 3); *p++ = ',';
        p = put_fixed(p, rl, 2); *p++ = ',';
        p = put_fixed(p, loss, 3); *p++ = ',';
        p = put_fixed(p, iso, 2);
        *p++ = '\n';
        olen += (size_t)(p - s);
    }
}

static int io_only(const char *bytes, const char *input)
{
    static char out[4096];
    size_t n = (size_t)atol(bytes);
    FILE *in = fopen(input, "r");
    if (!in || n < 1 || n > sizeof out) return 2;
    memset(out, 'x', n - 1);
    out[n - 1] = '\n';
    char line[4096];
    if (!fgets(line, sizeof line, in)) return 2;
    while (fgets(line, sizeof line, in)) fwrite(out, 1, n, stdout);
    fclose(in);
    return ferror(stdout) ? 2 : 0;
}

int main(int argc, char **argv)
{
    if (argc != 4) {
        fprintf(stderr, "usage: floor [printf-]phase|pair|cut|budget|hybrid BANDS_CSV INPUT_CSV\n"
                        "       floor io BYTES_PER_ROW INPUT_CSV\n");
        return 2;
    }
    const char *mode = argv[1];
    if (strcmp(mode, "io") == 0) return io_only(argv[2], argv[3]);
    int use_printf = strncmp(mode, "printf-", 7) == 0;
    if (use_printf) mode += 7;
    int cmd = strcmp(mode, "phase") == 0 ? 0 : strcmp(mode, "pair") == 0 ? 1
            : strcmp(mode, "cut") == 0 ? 2 : strcmp(mode, "budget") == 0 ? 3
            : strcmp(mode, "hybrid") == 0 ? 4 : -1;
    if (cmd < 0) {
        fprintf(stderr, "floor: unknown mode '%s'\n", argv[1]);
        return 2;
    }
    load_bands(argv[2]);
    FILE *in = fopen(argv[3], "r");
    if (!in) { perror(argv[3]); return 2; }
    char line[4096], *f[MAX_FIELDS];
    int code = 0;
    if (!fgets(line, sizeof line, in)) return 2; /* header: columns in the generator's order */
    static const char *const headers[5] = { phase_header, pair_header, cut_header,
                                            budget_header, hybrid_header };
    fputs(headers[cmd], stdout);
    while (fgets(line, sizeof line, in)) {
        split(line, f);
        if (cmd == 0) phase_row(f, use_printf);
        else if (cmd == 1) code |= pair_row(f, use_printf);
        else if (cmd == 2) cut_row(f, use_printf);
        else if (cmd == 3) code |= budget_row(f, use_printf);
        else hybrid_row(f, use_printf);
    }
    flush_out();
    fclose(in);
    return ferror(stdout) ? 2 : code;
}
