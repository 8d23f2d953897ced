/* bench_batch.c - batch throughput and start-up time of the coaxline CLI
 * on this machine, against a plain Python script and a minimal C floor.
 *
 * Run by `make bench` (never by make check):
 *   bench_batch --builddir DIR --srcdir DIR --python PY [--rows N]
 *               [--reference-fraction F] [--repeat N] [--startup-runs N]
 *               [--commands LIST] [--startup-binary PATH] [--keep]
 *
 * For each batch command (phase, pair, cut) it generates a CSV of N rows
 * (1,000,000 by default), then
 *   - checks, on the first 300 rows, that coaxline, the reference script
 *     (tests/bench/reference.py) and the floor (tests/bench/floor.c) print
 *     the same numbers (within one unit of the last printed decimal);
 *   - times `coaxline CMD --input FILE --format csv > /dev/null`, the floor
 *     and the reference script (on a fraction of the rows, extrapolated);
 *   - reports rows/s, input MB/s and peak resident memory of each child
 *     (ru_maxrss from wait4(), i.e. getrusage for that one child), and the
 *     memory at a tenth of the rows to show whether it grows.
 * A command the binary does not have yet (exit 2, "unknown command") is
 * reported as skipped.  Then the start-up time of `coaxline --version`
 * and of one `coaxline cut`, for the real binary and the libtool wrapper.
 *
 * Timings are wall-clock (CLOCK_MONOTONIC) around posix_spawn + wait4;
 * medians of --repeat runs.
 */
#define _GNU_SOURCE
#include <errno.h>
#include <fcntl.h>
#include <math.h>
#include <spawn.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <sys/time.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

extern char **environ;

#define SAMPLE_ROWS 300
#define MAX_REPEAT 50

static struct {
    const char *builddir, *srcdir, *python;
    long rows;
    double ref_fraction;
    int repeat, startup_runs, keep;
    char commands[64];
    char coaxline[4096];   /* binary timed: the real one, or the wrapper */
    char wrapper[4096];    /* libtool wrapper script (cli/coaxline) */
    int real_binary;       /* coaxline is cli/.libs/coaxline */
    char floor_bin[4096], reference[4096], bands[4096];
    char extra_binary[4096]; /* --startup-binary: another build to time */
    char tmp[4096];
} cfg;

static int check_failed;

/* ---- small helpers ---------------------------------------------------- */

static double now_s(void)
{
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

static void die(const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    fputs("bench_batch: ", stderr);
    vfprintf(stderr, fmt, ap);
    fputc('\n', stderr);
    va_end(ap);
    exit(2);
}

static void path(char *buf, size_t size, const char *a, const char *b)
{
    if ((size_t)snprintf(buf, size, "%s/%s", a, b) >= size) die("path too long: %s/%s", a, b);
}

static int exists(const char *p, int exec)
{
    return access(p, exec ? X_OK : R_OK) == 0;
}

static long file_size(const char *p)
{
    struct stat st;
    return stat(p, &st) == 0 ? (long)st.st_size : -1;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

static double median(double *v, int n)
{
    qsort(v, (size_t)n, sizeof *v, cmp_double);
    return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

static double percentile(double *v, int n, double p) /* v sorted */
{
    int i = (int)floor(p * (n - 1) + 0.5);
    return v[i < 0 ? 0 : i >= n ? n - 1 : i];
}

/* Whole file into a NUL-terminated buffer (owned). */
static char *slurp(const char *p, size_t *len)
{
    FILE *fp = fopen(p, "rb");
    if (!fp) return NULL;
    size_t cap = 65536, n = 0;
    char *buf = malloc(cap);
    for (size_t got; buf && (got = fread(buf + n, 1, cap - n - 1, fp)) > 0;) {
        n += got;
        if (n + 1 == cap) {
            char *q = realloc(buf, cap *= 2);
            if (!q) { free(buf); buf = NULL; }
            buf = q;
        }
    }
    fclose(fp);
    if (!buf) die("out of memory reading %s", p);
    buf[n] = '\0';
    if (len) *len = n;
    return buf;
}

/* ---- running children ------------------------------------------------- */

typedef struct run_result {
    int status;        /* exit status, or 128 + signal */
    double wall_s;
    double cpu_s;      /* user + system */
    long maxrss_kib;
} run_result;

/* Spawn argv with stdout to out_path (NULL: /dev/null), stderr to err_path
 * (NULL: /dev/null), stdin from /dev/null; wait for it. */
static run_result run(char *const argv[], const char *out_path, const char *err_path)
{
    posix_spawn_file_actions_t fa;
    posix_spawn_file_actions_init(&fa);
    posix_spawn_file_actions_addopen(&fa, 0, "/dev/null", O_RDONLY, 0);
    posix_spawn_file_actions_addopen(&fa, 1, out_path ? out_path : "/dev/null",
                                     O_WRONLY | O_CREAT | O_TRUNC, 0644);
    posix_spawn_file_actions_addopen(&fa, 2, err_path ? err_path : "/dev/null",
                                     O_WRONLY | O_CREAT | O_TRUNC, 0644);
    run_result r = { 0, 0.0, 0.0, 0 };
    pid_t pid;
    double t0 = now_s();
    int e = posix_spawn(&pid, argv[0], &fa, NULL, argv, environ);
    posix_spawn_file_actions_destroy(&fa);
    if (e != 0) die("cannot run %s: %s", argv[0], strerror(e));
    int st;
    struct rusage ru;
    while (wait4(pid, &st, 0, &ru) < 0)
        if (errno != EINTR) die("wait4: %s", strerror(errno));
    r.wall_s = now_s() - t0;
    r.status = WIFEXITED(st) ? WEXITSTATUS(st) : 128 + WTERMSIG(st);
    r.cpu_s = (double)ru.ru_utime.tv_sec + 1e-6 * (double)ru.ru_utime.tv_usec +
              (double)ru.ru_stime.tv_sec + 1e-6 * (double)ru.ru_stime.tv_usec;
    r.maxrss_kib = ru.ru_maxrss; /* Linux: KiB */
    return r;
}

/* Median of n runs; *worst_rss gets the largest peak memory seen. */
static run_result run_median(char *const argv[], int n, int expect_status)
{
    double wall[MAX_REPEAT], cpu[MAX_REPEAT];
    run_result r = { 0, 0.0, 0.0, 0 };
    long rss = 0;
    for (int i = 0; i < n; i++) {
        run_result one = run(argv, NULL, NULL);
        if (one.status != expect_status)
            die("%s exited with %d (expected %d)", argv[0], one.status, expect_status);
        wall[i] = one.wall_s;
        cpu[i] = one.cpu_s;
        if (one.maxrss_kib > rss) rss = one.maxrss_kib;
    }
    r.status = expect_status;
    r.wall_s = median(wall, n);
    r.cpu_s = median(cpu, n);
    r.maxrss_kib = rss;
    return r;
}

/* ---- generated input -------------------------------------------------- */

/* xorshift64*: a fixed sequence, so every run times the same file. */
static uint64_t rng_state;
static double uniform(void)
{
    rng_state ^= rng_state >> 12;
    rng_state ^= rng_state << 25;
    rng_state ^= rng_state >> 27;
    return (double)((rng_state * 2685821657736338717ULL) >> 11) / 9007199254740992.0;
}
static int pick(int n) { return (int)(uniform() * n); }

/* Bands present in every Region of data/bands.csv, so every row is valid. */
static const char *const bench_bands[] = { "2200m", "630m", "160m", "80m", "60m",
                                           "40m", "30m", "20m", "mw" };
static const char *const bench_vf[] = { "0.66", "0.78", "0.80", "0.82", "0.85", "0.69" };
#define NB (int)(sizeof bench_bands / sizeof bench_bands[0])
#define NV (int)(sizeof bench_vf / sizeof bench_vf[0])

/* Writes rows data rows for a command; the first k rows are the same for
 * every rows >= k. */
static void generate(const char *cmd, long rows, const char *p)
{
    FILE *fp = fopen(p, "w");
    if (!fp) die("cannot write %s: %s", p, strerror(errno));
    static char buf[1 << 20];
    setvbuf(fp, buf, _IOFBF, sizeof buf);
    rng_state = 0x9E3779B97F4A7C15ULL;
    if (strcmp(cmd, "phase") == 0) {
        fputs("label,length,reference,vf,band,region\n", fp);
        for (long i = 0; i < rows; i++) {
            int ref_cm = 500 + pick(5500), delta_cm = pick(61) - 30;
            int region = pick(4); /* 0: empty cell, widest edges */
            char reg[4] = "";
            if (region) snprintf(reg, sizeof reg, "%d", region);
            fprintf(fp, "p%ld,%d.%02dm,%d.%02dm,%s,%s,%s\n", i + 1, (ref_cm + delta_cm) / 100,
                    (ref_cm + delta_cm) % 100, ref_cm / 100, ref_cm % 100, bench_vf[pick(NV)],
                    bench_bands[pick(NB)], reg);
        }
    } else if (strcmp(cmd, "pair") == 0) {
        /* 2 to 4 lengths within 5 cm of each other; tolerance 5 degrees is
         * generous (5 cm at 20 MHz, VF 0.66 is about 1.8 deg), so every
         * row passes. */
        fputs("label,length,vf,tolerance,band\n", fp);
        for (long i = 0; i < rows; i++) {
            int base_cm = 500 + pick(5500), n = 2 + pick(3);
            fprintf(fp, "e%ld,", i + 1);
            for (int k = 0; k < n; k++) {
                int cm = base_cm + pick(6);
                fprintf(fp, "%s%d.%02dm", k ? ";" : "", cm / 100, cm % 100);
            }
            fprintf(fp, ",%s,5,%s\n", bench_vf[pick(NV)], bench_bands[pick(NB)]);
        }
    } else {
        fputs("label,offset,vf\n", fp);
        for (long i = 0; i < rows; i++) {
            int cm = 100 + pick(3900);
            fprintf(fp, "c%ld,%d.%02dm,%s\n", i + 1, cm / 100, cm % 100, bench_vf[pick(NV)]);
        }
    }
    if (fclose(fp) != 0) die("write error on %s", p);
}

/* ---- comparing outputs ------------------------------------------------ */

#define MAX_COLS 32

typedef struct table {
    char *text;
    char *hdr[MAX_COLS];
    int ncols;
    char **cell;   /* row-major, nrows * ncols */
    long nrows;
} table;

static int split_line(char *s, char **f, int max)
{
    int n = 0;
    f[n++] = s;
    for (; *s && n < max; s++)
        if (*s == ',') { *s = '\0'; f[n++] = s + 1; }
    return n;
}

/* The outputs compared hold no quoted fields (generated labels, band and
 * edge names, numbers). */
static int load_table(const char *p, table *t)
{
    memset(t, 0, sizeof *t);
    t->text = slurp(p, NULL);
    if (!t->text) return -1;
    long lines = 0;
    for (char *s = t->text; *s; s++) lines += *s == '\n';
    char *line = strtok(t->text, "\n");
    if (!line) return -1;
    t->ncols = split_line(line, t->hdr, MAX_COLS);
    t->cell = calloc((size_t)(lines + 1) * (size_t)t->ncols, sizeof *t->cell);
    if (!t->cell) die("out of memory");
    while ((line = strtok(NULL, "\n")) != NULL) {
        char *f[MAX_COLS];
        line[strcspn(line, "\r")] = '\0';
        int n = split_line(line, f, MAX_COLS);
        for (int i = 0; i < t->ncols; i++) t->cell[t->nrows * t->ncols + i] = i < n ? f[i] : "";
        t->nrows++;
    }
    return 0;
}

static void free_table(table *t)
{
    free(t->text);
    free(t->cell);
}

static int decimals(const char *s)
{
    const char *dot = strchr(s, '.');
    return dot ? (int)strspn(dot + 1, "0123456789") : 0;
}

static int number(const char *s, double *v)
{
    char *end;
    if (!*s) return 0;
    *v = strtod(s, &end);
    return *end == '\0';
}

/* Compare every column the two outputs share: text exactly, numbers
 * within one unit of the coarser last printed decimal (two programs that
 * compute the same value in a different order may round a value that
 * lies on a half differently).  Prints one line; returns 0 when they
 * agree. */
static int compare(const char *what, const char *pa, const char *pb)
{
    table a, b;
    if (load_table(pa, &a) || load_table(pb, &b)) {
        printf("    %-28s CHECK FAILED: an output is empty\n", what);
        return 1;
    }
    int bad = 0;
    long same = 0, last_digit = 0, cells = 0;
    char unmatched[256] = "", first_bad[512] = "";
    if (a.nrows != b.nrows) {
        snprintf(first_bad, sizeof first_bad, "%ld rows against %ld", a.nrows, b.nrows);
        bad = 1;
    }
    for (int i = 0; i < a.ncols && !bad; i++) {
        int j = 0;
        while (j < b.ncols && strcmp(a.hdr[i], b.hdr[j]) != 0) j++;
        if (j == b.ncols) {
            size_t u = strlen(unmatched);
            snprintf(unmatched + u, sizeof unmatched - u, "%s%s", u ? "," : "", a.hdr[i]);
            continue;
        }
        for (long r = 0; r < a.nrows && !bad; r++) {
            const char *x = a.cell[r * a.ncols + i], *y = b.cell[r * b.ncols + j];
            double vx, vy;
            cells++;
            if (strcmp(x, y) == 0) { same++; continue; }
            if (number(x, &vx) && number(y, &vy)) {
                int d = decimals(x) < decimals(y) ? decimals(x) : decimals(y);
                if (fabs(vx - vy) <= pow(10.0, -d) * (1.0 + 1e-9)) { last_digit++; continue; }
            }
            snprintf(first_bad, sizeof first_bad, "row %ld column %s: '%s' against '%s'",
                     r + 1, a.hdr[i], x, y);
            bad = 1;
        }
    }
    if (bad)
        printf("    %-28s CHECK FAILED: %s\n", what, first_bad);
    else
        printf("    %-28s agree: %ld rows, %ld cells, %ld identical, %ld one unit apart in the "
               "last decimal%s%s%s\n", what, a.nrows, cells, same, last_digit,
               unmatched[0] ? " (not in both: " : "", unmatched, unmatched[0] ? ")" : "");
    free_table(&a);
    free_table(&b);
    return bad;
}

/* ---- one batch command ------------------------------------------------ */

static void mib(char *buf, size_t size, long kib)
{
    snprintf(buf, size, "%.1f MiB", (double)kib / 1024.0);
}

/* One timing line; ratio = this time over coaxline's (cx_s, 0: none). */
static void print_timing(const char *label, const run_result *r, long bytes, double cx_s)
{
    char mem[32], ratio[32] = "-";
    mib(mem, sizeof mem, r->maxrss_kib);
    if (cx_s > 0.0) snprintf(ratio, sizeof ratio, "%.2f", r->wall_s / cx_s);
    printf("  %-36s %8.3f %8.3f %10.0f %8.1f %12s %10s\n", label, r->wall_s, r->cpu_s,
           cfg.rows / r->wall_s, bytes / 1e6 / r->wall_s, mem, ratio);
}

static void bench_command(const char *cmd)
{
    char full[4096], sample[4096], part[4096], empty[4096], tenth[4096];
    char out_cx[4096], out_ref[4096], out_floor[4096], err[4096], name[64];
    snprintf(name, sizeof name, "%s.csv", cmd);
    path(full, sizeof full, cfg.tmp, name);
    snprintf(name, sizeof name, "%s-sample.csv", cmd);
    path(sample, sizeof sample, cfg.tmp, name);
    snprintf(name, sizeof name, "%s-part.csv", cmd);
    path(part, sizeof part, cfg.tmp, name);
    snprintf(name, sizeof name, "%s-empty.csv", cmd);
    path(empty, sizeof empty, cfg.tmp, name);
    snprintf(name, sizeof name, "%s-tenth.csv", cmd);
    path(tenth, sizeof tenth, cfg.tmp, name);
    path(out_cx, sizeof out_cx, cfg.tmp, "out-coaxline.csv");
    path(out_ref, sizeof out_ref, cfg.tmp, "out-reference.csv");
    path(out_floor, sizeof out_floor, cfg.tmp, "out-floor.csv");
    path(err, sizeof err, cfg.tmp, "stderr.txt");

    long part_rows = (long)ceil(cfg.rows * cfg.ref_fraction);
    if (part_rows < 1) part_rows = 1;
    if (part_rows > cfg.rows) part_rows = cfg.rows;
    double t0 = now_s();
    generate(cmd, cfg.rows, full);
    long sample_rows = SAMPLE_ROWS < cfg.rows ? SAMPLE_ROWS : cfg.rows;
    generate(cmd, sample_rows, sample);
    generate(cmd, part_rows, part);
    generate(cmd, 0, empty);
    generate(cmd, cfg.rows / 10 > 0 ? cfg.rows / 10 : 1, tenth);
    long bytes = file_size(full);
    int expect = 0; /* every generated row is valid and passes */
    printf("\n%s: %ld rows, %.1f MB of input (generated in %.1f s)\n", cmd, cfg.rows,
           (double)bytes / 1e6, now_s() - t0);

    /* availability, and the sample run for the checks */
    char *cx_sample[] = { cfg.coaxline, (char *)cmd, "--input", sample, "--format", "csv", NULL };
    run_result r = run(cx_sample, out_cx, err);
    char *errtext = slurp(err, NULL);
    int available = !(r.status == 2 && errtext && strstr(errtext, "unknown command"));
    if (available && r.status != expect) {
        printf("    coaxline %s on the sample: exit %d: %s", cmd, r.status,
               errtext ? errtext : "\n");
        check_failed = 1;
    }
    free(errtext);

    char *ref_sample[] = { (char *)cfg.python, cfg.reference, (char *)cmd, cfg.bands, sample, NULL };
    char *floor_sample[] = { cfg.floor_bin, (char *)cmd, cfg.bands, sample, NULL };
    run_result rr = { expect, 0.0, 0.0, 0 };
    if (cfg.python) rr = run(ref_sample, out_ref, err);
    run_result rf = run(floor_sample, out_floor, NULL);
    if (rr.status != expect || rf.status != expect) {
        printf("    reference exit %d, floor exit %d on the sample (expected %d)\n",
               rr.status, rf.status, expect);
        check_failed = 1;
    }
    printf("  check on the first %ld rows:\n", sample_rows);
    if (!available)
        printf("    coaxline %s: skipped: command not available\n", cmd);
    if (available && cfg.python)
        check_failed |= compare("coaxline vs reference:", out_cx, out_ref);
    if (available)
        check_failed |= compare("coaxline vs floor:", out_cx, out_floor);
    if (!available && cfg.python)
        check_failed |= compare("reference vs floor:", out_ref, out_floor);
    long out_bytes_per_row = 0;
    if (available) {
        long sb = file_size(out_cx);
        out_bytes_per_row = sb > 0 ? (sb + sample_rows / 2) / sample_rows : 0;
    }

    /* timings */
    printf("  %-36s %8s %8s %10s %8s %12s %10s\n", "", "wall s", "cpu s", "rows/s", "MB/s",
           "peak memory", "time/cx");
    run_result m = { 0, 0.0, 0.0, 0 };
    if (available) {
        char *cx_full[] = { cfg.coaxline, (char *)cmd, "--input", full, "--format", "csv", NULL };
        char *cx_tenth[] = { cfg.coaxline, (char *)cmd, "--input", tenth, "--format", "csv", NULL };
        m = run_median(cx_full, cfg.repeat, expect);
        run_result m10 = run(cx_tenth, NULL, NULL);
        print_timing("coaxline", &m, bytes, m.wall_s);
        char a[32];
        mib(a, sizeof a, m10.maxrss_kib);
        printf("  %-36s %8s %8s %10s %8s %12s   (output about %ld bytes per input row)\n",
               "  (peak memory at a tenth of rows)", "", "", "", "", a, out_bytes_per_row);
    } else {
        printf("  %-36s skipped: command not available\n", "coaxline");
    }

    char *floor_full[] = { cfg.floor_bin, (char *)cmd, cfg.bands, full, NULL };
    run_result mf = run_median(floor_full, cfg.repeat, expect);
    print_timing("floor (C: fgets, strtod, printf)", &mf, bytes, m.wall_s);
    if (out_bytes_per_row > 0) {
        char nbytes[32];
        snprintf(nbytes, sizeof nbytes, "%ld", out_bytes_per_row);
        char *io_full[] = { cfg.floor_bin, "io", nbytes, full, NULL };
        run_result mi = run_median(io_full, cfg.repeat, 0);
        print_timing("I/O only (read rows, write bytes)", &mi, bytes, m.wall_s);
    }

    run_result rp = { 0, 0.0, 0.0, 0 };
    if (cfg.python) {
        char *ref_part[] = { (char *)cfg.python, cfg.reference, (char *)cmd, cfg.bands, part, NULL };
        char *ref_empty[] = { (char *)cfg.python, cfg.reference, (char *)cmd, cfg.bands, empty,
                              NULL };
        run_result re = run_median(ref_empty, 3, expect);
        rp = run(ref_part, NULL, NULL);
        if (rp.status != expect) die("reference exited with %d", rp.status);
        double measured_s = rp.wall_s;
        if (part_rows < cfg.rows) {
            /* start-up once, the per-row part scaled to all rows */
            double scale = (double)cfg.rows / (double)part_rows;
            rp.wall_s = re.wall_s + fmax(rp.wall_s - re.wall_s, 0.0) * scale;
            rp.cpu_s = re.cpu_s + fmax(rp.cpu_s - re.cpu_s, 0.0) * scale;
        }
        print_timing(part_rows < cfg.rows ? "reference (Python), extrapolated*"
                                          : "reference (Python)", &rp, bytes, m.wall_s);
        if (part_rows < cfg.rows)
            printf("    * timed on the first %ld rows (%.3f s wall; peak memory is at that "
                   "size), its start-up\n      (%.3f s, a header-only file) counted once and "
                   "the rest scaled by %.1f\n", part_rows, measured_s, re.wall_s,
                   (double)cfg.rows / (double)part_rows);
    } else {
        printf("  %-36s skipped: no Python 3 with numpy\n", "reference (Python)");
    }
    if (available) {
        printf("  => coaxline %s takes %.2fx the floor's time", cmd, m.wall_s / mf.wall_s);
        if (rp.wall_s > 0.0)
            printf(" and is %.1fx faster than the reference script", rp.wall_s / m.wall_s);
        printf("\n     (by cpu time: %.2fx", m.cpu_s / mf.cpu_s);
        if (rp.cpu_s > 0.0) printf(" and %.1fx", rp.cpu_s / m.cpu_s);
        printf(")\n");
    }

    if (!cfg.keep) {
        const char *files[] = { full, sample, part, empty, tenth, out_cx, out_ref, out_floor, err };
        for (size_t i = 0; i < sizeof files / sizeof files[0]; i++) unlink(files[i]);
    }
}

/* ---- start-up --------------------------------------------------------- */

/* The variants run in turn, round after round, so a change in the
 * machine's load falls on all of them alike. */
#define MAX_VARIANTS 8
typedef struct variant {
    char label[128];
    char *argv[8];
} variant;

static void bench_startup(void)
{
    variant v[MAX_VARIANTS];
    int nv = 0;
    memset(v, 0, sizeof v);
    snprintf(v[nv].label, sizeof v[nv].label, "/bin/true (the process floor)");
    v[nv].argv[0] = "/bin/true";
    nv++;
    struct { const char *bin, *kind; } bins[3] = {
        { cfg.real_binary ? cfg.coaxline : NULL, "real binary" },
        { cfg.wrapper, "libtool wrapper" },
        { cfg.extra_binary[0] ? cfg.extra_binary : NULL, cfg.extra_binary },
    };
    for (int k = 0; k < 3; k++) {
        if (!bins[k].bin) continue;
        snprintf(v[nv].label, sizeof v[nv].label, "--version, %s", bins[k].kind);
        v[nv].argv[0] = (char *)bins[k].bin;
        v[nv].argv[1] = "--version";
        nv++;
        snprintf(v[nv].label, sizeof v[nv].label, "cut --offset 10m --vf 0.8, %s", bins[k].kind);
        char *cut[] = { (char *)bins[k].bin, "cut", "--offset", "10m", "--vf", "0.8", NULL };
        memcpy(v[nv].argv, cut, sizeof cut);
        nv++;
    }
    int n = cfg.startup_runs;
    double *t = malloc((size_t)n * (size_t)nv * sizeof *t);
    if (!t) die("out of memory");
    for (int k = 0; k < nv; k++) run(v[k].argv, NULL, NULL); /* warm the page cache */
    for (int i = 0; i < n; i++)
        for (int k = 0; k < nv; k++) {
            run_result r = run(v[k].argv, NULL, NULL);
            if (r.status != 0) die("%s exited with %d", v[k].argv[0], r.status);
            t[k * n + i] = r.wall_s * 1e3;
        }
    printf("\nstart-up: %d runs of each, taken in turn; posix_spawn + wait4, ms\n", n);
    printf("  %-58s %8s %8s %8s\n", "", "median", "p10", "p90");
    for (int k = 0; k < nv; k++) {
        double *tk = t + k * n;
        double med = median(tk, n); /* sorts tk */
        printf("  %-58s %8.3f %8.3f %8.3f\n", v[k].label, med, percentile(tk, n, 0.1),
               percentile(tk, n, 0.9));
    }
    free(t);
}

/* Other work on the machine shows in wall times (not much in cpu times). */
static void print_load(const char *when)
{
    char buf[128] = "?";
    FILE *fp = fopen("/proc/loadavg", "r");
    if (fp) {
        if (!fgets(buf, sizeof buf, fp)) snprintf(buf, sizeof buf, "?");
        fclose(fp);
    }
    buf[strcspn(buf, "\n")] = '\0';
    printf("load average %s: %s (%ld processors online)\n", when, buf,
           sysconf(_SC_NPROCESSORS_ONLN));
}

/* ---- main ------------------------------------------------------------- */

static void usage(void)
{
    fprintf(stderr, "usage: bench_batch --builddir DIR --srcdir DIR --python PY [--rows N]\n"
                    "       [--reference-fraction F] [--repeat N] [--startup-runs N]\n"
                    "       [--commands phase,pair,cut] [--startup-binary PATH] [--keep]\n");
    exit(2);
}

int main(int argc, char **argv)
{
    double t_start = now_s();
    cfg.rows = 1000000;
    cfg.ref_fraction = 0.25;
    cfg.repeat = 3;
    cfg.startup_runs = 200;
    snprintf(cfg.commands, sizeof cfg.commands, "phase,pair,cut");
    for (int i = 1; i < argc; i++) {
        const char *o = argv[i], *v = i + 1 < argc ? argv[i + 1] : NULL;
        if (strcmp(o, "--keep") == 0) { cfg.keep = 1; continue; }
        if (!v) usage();
        i++;
        if (strcmp(o, "--builddir") == 0) cfg.builddir = v;
        else if (strcmp(o, "--srcdir") == 0) cfg.srcdir = v;
        else if (strcmp(o, "--python") == 0) cfg.python = v;
        else if (strcmp(o, "--rows") == 0) cfg.rows = atol(v);
        else if (strcmp(o, "--reference-fraction") == 0) cfg.ref_fraction = atof(v);
        else if (strcmp(o, "--repeat") == 0) cfg.repeat = atoi(v);
        else if (strcmp(o, "--startup-runs") == 0) cfg.startup_runs = atoi(v);
        else if (strcmp(o, "--startup-binary") == 0)
            snprintf(cfg.extra_binary, sizeof cfg.extra_binary, "%s", v);
        else if (strcmp(o, "--commands") == 0) snprintf(cfg.commands, sizeof cfg.commands, "%s", v);
        else usage();
    }
    if (!cfg.builddir || !cfg.srcdir || !cfg.python || cfg.rows < 1 || cfg.repeat < 1 ||
        cfg.repeat > MAX_REPEAT || cfg.startup_runs < 1 || !(cfg.ref_fraction > 0.0) ||
        cfg.ref_fraction > 1.0)
        usage();

    /* The real binary needs the uninstalled library on LD_LIBRARY_PATH,
     * which is what the libtool wrapper would set before exec'ing it. */
    char libs[4096], real[4096];
    path(cfg.wrapper, sizeof cfg.wrapper, cfg.builddir, "cli/coaxline");
    path(real, sizeof real, cfg.builddir, "cli/.libs/coaxline");
    path(libs, sizeof libs, cfg.builddir, "lib/.libs");
    if (exists(real, 1)) {
        const char *old = getenv("LD_LIBRARY_PATH");
        char ld[8192];
        snprintf(ld, sizeof ld, "%s%s%s", libs, old && *old ? ":" : "", old ? old : "");
        setenv("LD_LIBRARY_PATH", ld, 1);
        snprintf(cfg.coaxline, sizeof cfg.coaxline, "%s", real);
        cfg.real_binary = 1;
    } else if (exists(cfg.wrapper, 1)) {
        snprintf(cfg.coaxline, sizeof cfg.coaxline, "%s", cfg.wrapper);
    } else {
        die("no coaxline binary under %s/cli", cfg.builddir);
    }
    path(cfg.floor_bin, sizeof cfg.floor_bin, cfg.builddir, "tests/bench/floor");
    path(cfg.reference, sizeof cfg.reference, cfg.srcdir, "tests/bench/reference.py");
    path(cfg.bands, sizeof cfg.bands, cfg.srcdir, "data/bands.csv");
    if (!exists(cfg.floor_bin, 1)) die("%s is not built", cfg.floor_bin);
    /* the reference needs numpy, which Debian installs for /usr/bin/python3 */
    char *probe[] = { (char *)cfg.python, "-c", "import numpy", NULL };
    if (!cfg.python[0] || !exists(cfg.python, 1) || run(probe, NULL, NULL).status != 0) {
        printf("reference: skipped: no Python 3 with numpy at '%s'\n", cfg.python);
        cfg.python = NULL;
    }

    const char *tmpdir = getenv("TMPDIR");
    snprintf(cfg.tmp, sizeof cfg.tmp, "%s/coaxline-bench-XXXXXX", tmpdir && *tmpdir ? tmpdir : "/tmp");
    if (!mkdtemp(cfg.tmp)) die("mkdtemp: %s", strerror(errno));

    print_load("at start");
    printf("batch: coaxline = %s (%s)\n", cfg.coaxline,
           cfg.real_binary ? "the real binary, LD_LIBRARY_PATH set to the build's lib/.libs"
                           : "the libtool wrapper: no cli/.libs/coaxline");
    printf("       reference = %s %s; floor = %s\n", cfg.python, cfg.reference, cfg.floor_bin);
    printf("       output to /dev/null; wall time median of %d runs; peak memory = ru_maxrss "
           "of the child (wait4)\n", cfg.repeat);

    char list[64];
    snprintf(list, sizeof list, "%s", cfg.commands);
    for (char *save = NULL, *c = strtok_r(list, ",", &save); c; c = strtok_r(NULL, ",", &save)) {
        if (strcmp(c, "phase") && strcmp(c, "pair") && strcmp(c, "cut")) die("unknown command %s", c);
        bench_command(c);
    }
    bench_startup();
    if (!cfg.keep) rmdir(cfg.tmp);
    else printf("\nfiles kept in %s\n", cfg.tmp);
    print_load("at end");
    printf("\nbench_batch: %.0f s in all%s\n", now_s() - t_start,
           check_failed ? "; AN OUTPUT CHECK FAILED (see above)" : "");
    return check_failed ? 1 : 0;
}
