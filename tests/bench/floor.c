/* floor.c - the least a program can do for a batch: the I/O floor that
 * `make bench` compares coaxline's batch path with.
 *
 *   floor phase|pair|cut BANDS_CSV INPUT_CSV   (output on stdout)
 *   floor io BYTES_PER_ROW INPUT_CSV
 *
 * It reads the generated benchmark files line by line with fgets, splits
 * on commas (the generator writes no quotes), converts with strtod, does
 * the same arithmetic as coaxline and prints the same CSV columns with
 * printf.  No validation, no units other than the trailing "m" the
 * generator writes, no locale handling beyond the "C" locale every C
 * program starts in: whatever coaxline spends above this is the price of
 * checking and parsing real input.  `floor io` is the plain I/O limit:
 * it reads the rows the same way and writes BYTES_PER_ROW bytes for each,
 * with no parsing or formatting at all.  Not installed, not part of make
 * check.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define C_M_PER_S 299792458.0
#define MAX_BANDS 128
#define MAX_FIELDS 16

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

/* Widest edges of a band in a region (0: all regions). */
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

static const char *const edge_names[3] = { "low", "centre", "high" };

int main(int argc, char **argv)
{
    if (argc != 4) {
        fprintf(stderr, "usage: floor phase|pair|cut BANDS_CSV INPUT_CSV\n"
                        "       floor io BYTES_PER_ROW INPUT_CSV\n");
        return 2;
    }
    const char *mode = argv[1];
    if (strcmp(mode, "io") == 0) {
        static char out[4096];
        size_t n = (size_t)atol(argv[2]);
        FILE *in = fopen(argv[3], "r");
        if (!in || n < 1 || n > sizeof out) return 2;
        memset(out, 'x', n - 1);
        out[n - 1] = '\n';
        char line[4096];
        if (!fgets(line, sizeof line, in)) return 2;
        while (fgets(line, sizeof line, in)) fwrite(out, 1, n, stdout);
        fclose(in);
        return ferror(stdout) ? 2 : 0;
    }
    load_bands(argv[2]);
    FILE *in = fopen(argv[3], "r");
    if (!in) { perror(argv[3]); return 2; }
    char line[4096], *f[MAX_FIELDS];
    int code = 0;
    if (!fgets(line, sizeof line, in)) return 2; /* header: columns in the generator's order */
    if (strcmp(mode, "phase") == 0) {
        puts("label,band,edge,freq_mhz,length_m,reference_m,delta_m,phase_error_deg");
        while (fgets(line, sizeof line, in)) {
            split(line, f); /* label,length,reference,vf,band,region */
            double len = strtod(f[1], NULL), ref = strtod(f[2], NULL), vf = strtod(f[3], NULL);
            double fr[3];
            edges(f[4], atoi(f[5]), fr);
            for (int k = 0; k < 3; k++)
                printf("%s,%s,%s,%.6f,%.3f,%.3f,%.3f,%.3f\n", f[0], f[4], edge_names[k],
                       fr[k] / 1e6, len, ref, len - ref,
                       360.0 * fr[k] * (len - ref) / (vf * C_M_PER_S));
        }
    } else if (strcmp(mode, "pair") == 0) {
        puts("label,band,edge,freq_mhz,delta_m,phase_error_deg,tolerance_deg,verdict");
        while (fgets(line, sizeof line, in)) {
            split(line, f); /* label,length,vf,tolerance,band; lengths split by ';' */
            double lo = 0.0, hi = 0.0;
            int n = 0;
            for (char *p = f[1]; *p; n++) {
                double v = strtod(p, &p);
                if (n == 0 || v < lo) lo = v;
                if (n == 0 || v > hi) hi = v;
                p += strcspn(p, ";");
                if (*p) p++;
            }
            double vf = strtod(f[2], NULL), tol = strtod(f[3], NULL), fr[3];
            edges(f[4], 0, fr);
            for (int k = 0; k < 3; k++) {
                double err = 360.0 * fr[k] * (hi - lo) / (vf * C_M_PER_S);
                if (err > tol) code = 1;
                printf("%s,%s,%s,%.6f,%.3f,%.3f,%.3f,%s\n", f[0], f[4], edge_names[k],
                       fr[k] / 1e6, hi - lo, err, tol, err <= tol ? "pass" : "fail");
            }
        }
    } else if (strcmp(mode, "cut") == 0) {
        puts("label,offset_m,delay_ns,vf,cut_length_m,cut_length_ft,freq_mhz,electrical_deg,"
             "quarter_wave_mhz,allowance_m");
        while (fgets(line, sizeof line, in)) {
            split(line, f); /* label,offset,vf */
            double off = strtod(f[1], NULL), vf = strtod(f[2], NULL);
            double delay = off / C_M_PER_S, cut = vf * C_M_PER_S * delay;
            printf("%s,%.3f,%.3f,%.4f,%.3f,%.4f,,,%.4f,0.000\n", f[0], off, delay * 1e9, vf,
                   cut, cut / 0.3048, vf * C_M_PER_S / (4.0 * cut) / 1e6);
        }
    } else {
        fprintf(stderr, "floor: unknown mode '%s'\n", mode);
        return 2;
    }
    fclose(in);
    return ferror(stdout) ? 2 : code;
}
