/* bench_batch.c - batch throughput and start-up time of the coaxline CLI
 * on this machine, against C floors and a plain numpy script.
 *
 * Run by `make bench` (and, short, by `make bench-quick`):
 *   bench_batch --builddir DIR --srcdir DIR --python PY [--quick] [--rows N]
 *               [--reference-fraction F] [--repeat N] [--startup-runs N]
 *               [--commands LIST] [--startup-binary PATH] [--keep]
 *
 * For each batch command (phase, pair, cut, budget, hybrid) it generates a CSV of N rows
 * (1,000,000 by default), then
 *   - checks, on the first 2,000 rows, that coaxline, the floor and the
 *     printf floor (tests/bench/floor.c) and the numpy reference
 *     (tests/bench/reference.py) write the same bytes;
 *   - times `coaxline CMD --input FILE --format csv > /dev/null`, the two
 *     floors, a plain read-rows-write-bytes loop and the reference (on a
 *     fraction of the rows, extrapolated), each once per round, --repeat
 *     rounds, so that every ratio comes from runs taken side by side;
 *   - reports CPU time (user + system, from wait4) and wall time, best and
 *     median of the rounds, rows/s, input MB/s, peak resident memory of
 *     each child (ru_maxrss), and coaxline's memory at a tenth of the rows
 *     to show whether it grows; then the ratios, best to best and median
 *     to median.
 * A command the binary does not have yet (exit 2, "unknown command") is
 * reported as skipped.  Then the start-up time of `coaxline --version`
 * and of one `coaxline cut`, for the real binary and the libtool wrapper.
 *
 * --quick: 2,000 rows, 3 rounds, the reference on every row, 5 start-up
 * runs: a few seconds, for CI.  The exit status is 1 when outputs differ,
 * 2 when a program fails; never anything about speed.
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

#define SAMPLE_ROWS 2000
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

/* The same with fork and exec, output to /dev/null, for the timed batch
 * runs.  Linux counts in a child's ru_maxrss the peak resident size of
 * the memory it had before its exec: with posix_spawn (vfork) that is
 * this process's own peak, so every small child would show it.  A forked
 * child starts from this process's current anonymous pages (a few hundred
 * KiB: the big buffers are freed), which keeps the figure the child's. */
static run_result run_forked(char *const argv[])
{
    run_result r = { 0, 0.0, 0.0, 0 };
    fflush(stdout);
    double t0 = now_s();
    pid_t pid = fork();
    if (pid < 0) die("fork: %s", strerror(errno));
    if (pid == 0) {
        int in = open("/dev/null", O_RDONLY), out = open("/dev/null", O_WRONLY);
        if (in < 0 || out < 0 || dup2(in, 0) < 0 || dup2(out, 1) < 0 || dup2(out, 2) < 0)
            _exit(127);
        execve(argv[0], argv, environ);
        _exit(127);
    }
    int st;
    struct rusage ru;
    while (wait4(pid, &st, 0, &ru) < 0)
        if (errno != EINTR) die("wait4: %s", strerror(errno));
    r.wall_s = now_s() - t0;
    r.status = WIFEXITED(st) ? WEXITSTATUS(st) : 128 + WTERMSIG(st);
    r.cpu_s = (double)ru.ru_utime.tv_sec + 1e-6 * (double)ru.ru_utime.tv_usec +
              (double)ru.ru_stime.tv_sec + 1e-6 * (double)ru.ru_stime.tv_usec;
    r.maxrss_kib = ru.ru_maxrss;
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
    char *buf = malloc(1 << 20); /* freed, so not in this process's RSS at a fork */
    if (buf) setvbuf(fp, buf, _IOFBF, 1 << 20);
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
    } else if (strcmp(cmd, "budget") == 0) {
        /* the closed-form goal: -15 to -30 dB with at most 0.3 dB of
         * imbalance (its own null floor is below -35 dB), so every point
         * is within reach; an empty imbalance cell is 0 dB */
        fputs("label,null-vs-inphase,imbalance,vf,band\n", fp);
        for (long i = 0; i < rows; i++) {
            int goal = 15 + pick(16), imb = pick(31);
            char ib[16] = "";
            if (imb) snprintf(ib, sizeof ib, "0.%02d", imb);
            fprintf(fp, "n%ld,-%d,%s,%s,%s\n", i + 1, goal, ib, bench_vf[pick(NV)],
                    bench_bands[pick(NB)]);
        }
    } else if (strcmp(cmd, "hybrid") == 0) {
        /* port and line impedances of common practice, 3 to 5 pairs out of
         * up to 16 turns; empty cells take the defaults */
        static const char *const zs[] = { "50", "75", "100", "25", "37.5" };
        static const char *const tos[] = { "", "50", "75", "", "100" };
        fputs("label,impedance,to,max-turns,pairs\n", fp);
        for (long i = 0; i < rows; i++) {
            int mt = pick(10), np = pick(4);
            char mts[16] = "", nps[16] = "";
            if (mt) snprintf(mts, sizeof mts, "%d", 6 + mt);
            if (np) snprintf(nps, sizeof nps, "%d", 2 + np);
            fprintf(fp, "h%ld,%s,%s,%s,%s\n", i + 1, zs[pick(5)], tos[pick(5)], mts, nps);
        }
    } else {
        fputs("label,offset,vf\n", fp);
        for (long i = 0; i < rows; i++) {
            int cm = 100 + pick(3900);
            fprintf(fp, "c%ld,%d.%02dm,%s\n", i + 1, cm / 100, cm % 100, bench_vf[pick(NV)]);
        }
    }
    if (fclose(fp) != 0) die("write error on %s", p);
    free(buf);
}

/* ---- comparing outputs: the same bytes -------------------------------- */

/* Length of the line starting at s (without its newline). */
static int line_len(const char *s, size_t left)
{
    const char *nl = memchr(s, '\n', left);
    size_t n = nl ? (size_t)(nl - s) : left;
    return n > 200 ? 200 : (int)n;
}

/* Prints one line; returns 0 when the two files hold the same bytes. */
static int same_bytes(const char *what, const char *pa, const char *pb)
{
    size_t na, nb, i = 0, start = 0;
    long line = 1;
    char *a = slurp(pa, &na), *b = slurp(pb, &nb);
    if (!a || !b) die("cannot read %s or %s", pa, pb);
    for (; i < na && i < nb && a[i] == b[i]; i++)
        if (a[i] == '\n') { line++; start = i + 1; }
    int differ = !(na == nb && i == na);
    if (differ)
        printf("    %-40s DIFFER at line %ld (%zu and %zu bytes):\n      < %.*s\n      > %.*s\n",
               what, line, na, nb, line_len(a + start, na - start), a + start,
               line_len(b + start, nb - start), b + start);
    else
        printf("    %-40s the same bytes (%zu bytes, %ld lines)\n", what, na, line - 1);
    free(a);
    free(b);
    return differ;
}

/* ---- one batch command ------------------------------------------------ */

static void mib(char *buf, size_t size, long kib)
{
    snprintf(buf, size, "%.1f MiB", (double)kib / 1024.0);
}

/* One program timed in rounds with the others. */
typedef struct timed {
    const char *label;
    char *argv[8];
    int expect;
    int n;
    double wall[MAX_REPEAT], cpu[MAX_REPEAT];
    double wall_best, wall_med, cpu_best, cpu_med;
    long rss_kib;
} timed;

static void summarise(timed *t)
{
    t->wall_med = median(t->wall, t->n); /* sorts */
    t->cpu_med = median(t->cpu, t->n);
    t->wall_best = t->wall[0];
    t->cpu_best = t->cpu[0];
}

/* The variants run in turn, round after round, so a change in the
 * machine's load falls on all of them alike. */
static void time_rounds(timed *t, int nt, int rounds)
{
    for (int r = 0; r < rounds; r++)
        for (int k = 0; k < nt; k++) {
            run_result one = run_forked(t[k].argv);
            if (one.status != t[k].expect)
                die("%s exited with %d (expected %d)", t[k].argv[0], one.status, t[k].expect);
            t[k].wall[t[k].n] = one.wall_s;
            t[k].cpu[t[k].n] = one.cpu_s;
            t[k].n++;
            if (one.maxrss_kib > t[k].rss_kib) t[k].rss_kib = one.maxrss_kib;
        }
}

static void print_timed(const timed *t, long bytes)
{
    char mem[32];
    mib(mem, sizeof mem, t->rss_kib);
    printf("  %-42s %7.3f %7.3f  %7.3f %7.3f %10.0f %7.1f %11s\n", t->label, t->cpu_best,
           t->cpu_med, t->wall_best, t->wall_med, cfg.rows / t->wall_best,
           bytes / 1e6 / t->wall_best, mem);
}

/* "a / b: cpu Xx best, Yx median; wall ..." */
static void print_ratio(const char *what, const timed *a, const timed *b)
{
    printf("     %-40s cpu %6.2fx best %6.2fx median   wall %6.2fx best %6.2fx median\n", what,
           a->cpu_best / b->cpu_best, a->cpu_med / b->cpu_med, a->wall_best / b->wall_best,
           a->wall_med / b->wall_med);
}

static void bench_command(const char *cmd)
{
    char full[4096], sample[4096], part[4096], empty[4096], tenth[4096], name[64];
    char out_cx[4096], out_ref[4096], out_floor[4096], out_printf[4096], err[4096];
    char printf_mode[32];
    snprintf(printf_mode, sizeof printf_mode, "printf-%s", cmd);
    const char *kind[5] = { "", "-sample", "-part", "-empty", "-tenth" };
    /* hybrid's turns search has no numpy form worth writing: no reference */
    const char *python = strcmp(cmd, "hybrid") == 0 ? NULL : cfg.python;
    char *files[5] = { full, sample, part, empty, tenth };
    for (int k = 0; k < 5; k++) {
        snprintf(name, sizeof name, "%s%s.csv", cmd, kind[k]);
        path(files[k], 4096, cfg.tmp, name);
    }
    path(out_cx, sizeof out_cx, cfg.tmp, "out-coaxline.csv");
    path(out_ref, sizeof out_ref, cfg.tmp, "out-reference.csv");
    path(out_floor, sizeof out_floor, cfg.tmp, "out-floor.csv");
    path(out_printf, sizeof out_printf, cfg.tmp, "out-printf.csv");
    path(err, sizeof err, cfg.tmp, "stderr.txt");

    long part_rows = (long)ceil(cfg.rows * cfg.ref_fraction);
    if (part_rows < 1) part_rows = 1;
    if (part_rows > cfg.rows) part_rows = cfg.rows;
    long sample_rows = SAMPLE_ROWS < cfg.rows ? SAMPLE_ROWS : cfg.rows;
    double t0 = now_s();
    generate(cmd, cfg.rows, full);
    generate(cmd, sample_rows, sample);
    generate(cmd, part_rows, part);
    generate(cmd, 0, empty);
    generate(cmd, cfg.rows / 10 > 0 ? cfg.rows / 10 : 1, tenth);
    long bytes = file_size(full);
    int expect = 0; /* every generated row is valid and passes */
    printf("\n%s: %ld rows, %.1f MB of input (generated in %.1f s)\n", cmd, cfg.rows,
           (double)bytes / 1e6, now_s() - t0);

    /* availability, and the sample runs for the checks */
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
    char *ref_sample[] = { (char *)python, cfg.reference, (char *)cmd, cfg.bands, sample, NULL };
    char *floor_sample[] = { cfg.floor_bin, (char *)cmd, cfg.bands, sample, NULL };
    char *printf_sample[] = { cfg.floor_bin, printf_mode, cfg.bands, sample, NULL };
    run_result rr = { expect, 0.0, 0.0, 0 };
    if (python) rr = run(ref_sample, out_ref, err);
    run_result rf = run(floor_sample, out_floor, NULL), rp = run(printf_sample, out_printf, NULL);
    if (rr.status != expect || rf.status != expect || rp.status != expect) {
        printf("    reference exit %d, floor exit %d, printf floor exit %d on the sample "
               "(expected %d)\n", rr.status, rf.status, rp.status, expect);
        check_failed = 1;
    }
    printf("  check on the first %ld rows, byte for byte:\n", sample_rows);
    if (!python && cfg.python) printf("    numpy reference: none for %s\n", cmd);
    const char *base = available ? out_cx : out_floor;
    if (!available)
        printf("    coaxline %s: skipped: command not available\n", cmd);
    else
        check_failed |= same_bytes("coaxline vs floor:", out_cx, out_floor);
    check_failed |= same_bytes(available ? "coaxline vs printf floor:" : "floor vs printf floor:",
                               base, out_printf);
    if (python)
        check_failed |= same_bytes(available ? "coaxline vs numpy reference:"
                                             : "floor vs numpy reference:", base, out_ref);
    long sb = file_size(base), out_bytes_per_row = sb > 0 ? (sb + sample_rows / 2) / sample_rows : 1;

    /* timings: every variant once per round, cfg.repeat rounds */
    char nbytes[32];
    snprintf(nbytes, sizeof nbytes, "%ld", out_bytes_per_row);
    timed t[6];
    int nt = 0, cx = -1, fl, pf, io, py = -1, pye = -1;
    memset(t, 0, sizeof t);
    if (available) {
        cx = nt++;
        t[cx] = (timed){ .label = "coaxline",
                         .argv = { cfg.coaxline, (char *)cmd, "--input", full, "--format", "csv" } };
    }
    fl = nt++;
    t[fl] = (timed){ .label = "floor (strtod, own formatting, same bytes)",
                     .argv = { cfg.floor_bin, (char *)cmd, cfg.bands, full } };
    pf = nt++;
    t[pf] = (timed){ .label = "printf floor (strtod, printf, same bytes)",
                     .argv = { cfg.floor_bin, printf_mode, cfg.bands, full } };
    io = nt++;
    t[io] = (timed){ .label = "I/O only (read rows, write bytes)",
                     .argv = { cfg.floor_bin, "io", nbytes, full } };
    if (python) {
        py = nt++;
        t[py] = (timed){ .label = part_rows < cfg.rows ? "numpy reference, extrapolated*"
                                                       : "numpy reference (same bytes)",
                         .argv = { (char *)python, cfg.reference, (char *)cmd, cfg.bands, part } };
        if (part_rows < cfg.rows) {
            pye = nt++;
            t[pye] = (timed){ .label = "numpy reference start-up (header only)",
                              .argv = { (char *)python, cfg.reference, (char *)cmd, cfg.bands,
                                        empty } };
        }
    }
    time_rounds(t, nt, cfg.repeat);
    if (pye >= 0) {
        /* start-up once, the per-row part scaled to all rows */
        double scale = (double)cfg.rows / (double)part_rows;
        double w0 = median(t[pye].wall, t[pye].n), c0 = median(t[pye].cpu, t[pye].n);
        for (int i = 0; i < t[py].n; i++) {
            t[py].wall[i] = w0 + fmax(t[py].wall[i] - w0, 0.0) * scale;
            t[py].cpu[i] = c0 + fmax(t[py].cpu[i] - c0, 0.0) * scale;
        }
    }
    for (int k = 0; k < nt; k++) summarise(&t[k]);

    printf("  %-42s %-15s  %-15s\n", "", "cpu s", "wall s");
    printf("  %-42s %7s %7s  %7s %7s %10s %7s %11s\n", "", "best", "median", "best", "median",
           "rows/s", "MB/s", "peak memory");
    for (int k = 0; k < nt; k++)
        if (k != pye) print_timed(&t[k], bytes);
    if (cx >= 0) {
        run_result m10;
        char *cx_tenth[] = { cfg.coaxline, (char *)cmd, "--input", tenth, "--format", "csv", NULL };
        char a[32];
        m10 = run_forked(cx_tenth);
        mib(a, sizeof a, m10.maxrss_kib);
        printf("  %-42s %7s %7s  %7s %7s %10s %7s %11s   (output %ld bytes per input row)\n",
               "  (coaxline's peak memory at a tenth of rows)", "", "", "", "", "", "", a,
               out_bytes_per_row);
    }
    if (pye >= 0)
        printf("    * timed on the first %ld rows (peak memory is at that size), its start-up\n"
               "      (median %.3f s wall, a header-only file) counted once and the rest scaled "
               "by %.1f\n", part_rows, t[pye].wall_med, (double)cfg.rows / (double)part_rows);
    printf("  ratios, from this run (%d rounds):\n", cfg.repeat);
    if (cx >= 0) {
        char what[64];
        snprintf(what, sizeof what, "coaxline %s / floor", cmd);
        print_ratio(what, &t[cx], &t[fl]);
        snprintf(what, sizeof what, "coaxline %s / printf floor", cmd);
        print_ratio(what, &t[cx], &t[pf]);
        if (py >= 0) {
            snprintf(what, sizeof what, "numpy reference / coaxline %s", cmd);
            print_ratio(what, &t[py], &t[cx]);
        }
    }
    print_ratio("printf floor / floor", &t[pf], &t[fl]);

    if (!cfg.keep) {
        const char *rm[] = { full, sample, part, empty, tenth, out_cx, out_ref, out_floor,
                             out_printf, err };
        for (size_t i = 0; i < sizeof rm / sizeof rm[0]; i++) unlink(rm[i]);
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
/* ---- per-row cost of vf, trim and loss ---------------------------------
 * The row paths that fit readings or a cable's loss table: a batch of
 * min(--rows, 100,000) rows of each (tests/rows_gen.sh: vf with 3
 * readings, trim with 2, loss at the 3 points of one band), CPU time per
 * row with the run on 10 rows (start-up, catalog) taken off, best of the
 * rounds; and heap allocations per row with the preload counter
 * tests/alloc_count.la when it is built. */

/* rows_gen.sh's output for cmd and rows into p. */
static void generate_rows(const char *cmd, long rows, const char *p)
{
    char gen[4096], n[32];
    path(gen, sizeof gen, cfg.srcdir, "tests/rows_gen.sh");
    snprintf(n, sizeof n, "%ld", rows);
    char *argv[] = { "/bin/sh", gen, (char *)cmd, n, NULL };
    if (run(argv, p, NULL).status != 0) die("%s failed", gen);
}

/* Allocations of one coaxline run under the preload counter, or -1. */
static long count_allocs(const char *module, const char *cmd, const char *in)
{
    char cnt[4096];
    path(cnt, sizeof cnt, cfg.tmp, "allocs.txt");
    unlink(cnt);
    setenv("ALLOC_COUNT_FILE", cnt, 1);
    setenv("LD_PRELOAD", module, 1);
    char *argv[] = { cfg.coaxline, (char *)cmd, "--input", (char *)in, NULL };
    run(argv, NULL, NULL);
    unsetenv("LD_PRELOAD");
    unsetenv("ALLOC_COUNT_FILE");
    size_t len;
    char *text = exists(cnt, 0) ? slurp(cnt, &len) : NULL;
    long n = text ? atol(text) : -1;
    free(text);
    unlink(cnt);
    return n;
}

static void bench_row_paths(void)
{
    static const char *const cmds[] = { "vf", "trim", "loss" };
    long rows = cfg.rows < 100000 ? cfg.rows : 100000;
    if (rows < 20) rows = 20;
    char module[4096];
    path(module, sizeof module, cfg.builddir, "tests/.libs/alloc_count.so");
    int counting = exists(module, 0);
    printf("\nrow paths: %ld rows of each, CPU per row after start-up (the run on 10 rows "
           "taken off), best of %d rounds\n", rows, cfg.repeat);
    printf("  %-6s %12s %12s %14s\n", "", "us/row", "rows/s", "allocs/row");
    for (size_t c = 0; c < sizeof cmds / sizeof cmds[0]; c++) {
        char big[4096], small[4096];
        path(big, sizeof big, cfg.tmp, "rows-big.csv");
        path(small, sizeof small, cfg.tmp, "rows-small.csv");
        generate_rows(cmds[c], rows, big);
        generate_rows(cmds[c], 10, small);
        char *ab[] = { cfg.coaxline, (char *)cmds[c], "--input", big, NULL };
        char *as[] = { cfg.coaxline, (char *)cmds[c], "--input", small, NULL };
        double best_big = INFINITY, best_small = INFINITY;
        for (int r = 0; r < cfg.repeat; r++) {
            run_result rb = run_forked(ab), rs = run_forked(as);
            if (rb.status != 0 || rs.status != 0) die("coaxline %s --input failed", cmds[c]);
            if (rb.cpu_s < best_big) best_big = rb.cpu_s;
            if (rs.cpu_s < best_small) best_small = rs.cpu_s;
        }
        double per_row = (best_big - best_small) / (double)(rows - 10);
        char allocs[32] = "not counted";
        if (counting) {
            long a_big = count_allocs(module, cmds[c], big), a_small = count_allocs(module, cmds[c], small);
            if (a_big >= 0 && a_small >= 0)
                snprintf(allocs, sizeof allocs, "%.2f", (double)(a_big - a_small) / (double)(rows - 10));
        }
        printf("  %-6s %12.2f %12.0f %14s\n", cmds[c], per_row * 1e6,
               per_row > 0.0 ? 1.0 / per_row : 0.0, allocs);
        unlink(big);
        unlink(small);
    }
}

/* ---- --jobs 2 -------------------------------------------------------- */

/* phase on cfg.rows generated rows with --jobs 1 and --jobs 2, in
 * rounds side by side; the two outputs compared first on the sample. */
static void bench_jobs(void)
{
    char full[4096], sample[4096], out1[4096], out2[4096];
    path(full, sizeof full, cfg.tmp, "phase-jobs.csv");
    path(sample, sizeof sample, cfg.tmp, "phase-jobs-sample.csv");
    path(out1, sizeof out1, cfg.tmp, "out-jobs1.csv");
    path(out2, sizeof out2, cfg.tmp, "out-jobs2.csv");
    generate("phase", cfg.rows, full);
    generate("phase", SAMPLE_ROWS < cfg.rows ? SAMPLE_ROWS : cfg.rows, sample);
    printf("\nphase --jobs 2: %ld rows, %.1f MB of input\n", cfg.rows, (double)file_size(full) / 1e6);
    char *one[] = { cfg.coaxline, "phase", "--input", sample, "--format", "csv", "--jobs", "1", NULL };
    char *two[] = { cfg.coaxline, "phase", "--input", sample, "--format", "csv", "--jobs", "2", NULL };
    run_result r1 = run(one, out1, NULL), r2 = run(two, out2, NULL);
    if (r1.status == 2 && r2.status == 2) {
        printf("    skipped: this coaxline has no --jobs\n");
    } else {
        check_failed |= r1.status != 0 || r2.status != 0;
        check_failed |= same_bytes("--jobs 2 vs --jobs 1:", out2, out1);
        timed t[2];
        memset(t, 0, sizeof t);
        t[0] = (timed){ .label = "coaxline --jobs 1",
                        .argv = { cfg.coaxline, "phase", "--input", full, "--format=csv",
                                  "--jobs=1" } };
        t[1] = (timed){ .label = "coaxline --jobs 2",
                        .argv = { cfg.coaxline, "phase", "--input", full, "--format=csv",
                                  "--jobs=2" } };
        time_rounds(t, 2, cfg.repeat);
        for (int k = 0; k < 2; k++) {
            summarise(&t[k]);
            print_timed(&t[k], file_size(full));
        }
        print_ratio("--jobs 1 / --jobs 2", &t[0], &t[1]);
    }
    if (!cfg.keep) {
        unlink(full);
        unlink(sample);
        unlink(out1);
        unlink(out2);
    }
}

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
    fprintf(stderr, "usage: bench_batch --builddir DIR --srcdir DIR --python PY [--quick] [--rows N]\n"
                    "       [--reference-fraction F] [--repeat N] [--startup-runs N]\n"
                    "       [--commands phase,pair,cut,budget,hybrid] [--startup-binary PATH] [--keep]\n");
    exit(2);
}

int main(int argc, char **argv)
{
    double t_start = now_s();
    cfg.rows = 1000000;
    cfg.ref_fraction = 0.25;
    cfg.repeat = 3;
    cfg.startup_runs = 200;
    snprintf(cfg.commands, sizeof cfg.commands, "phase,pair,cut,budget,hybrid");
    for (int i = 1; i < argc; i++) {
        const char *o = argv[i], *v = i + 1 < argc ? argv[i + 1] : NULL;
        if (strcmp(o, "--keep") == 0) { cfg.keep = 1; continue; }
        if (strcmp(o, "--quick") == 0) {
            cfg.rows = 2000;
            cfg.repeat = 3;
            cfg.ref_fraction = 1.0;
            cfg.startup_runs = 5;
            continue;
        }
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
    printf("       output to /dev/null; %d rounds, each program once per round; cpu = user + "
           "system and peak memory = ru_maxrss of the child (wait4)\n", cfg.repeat);

    char list[64];
    snprintf(list, sizeof list, "%s", cfg.commands);
    for (char *save = NULL, *c = strtok_r(list, ",", &save); c; c = strtok_r(NULL, ",", &save)) {
        if (strcmp(c, "phase") && strcmp(c, "pair") && strcmp(c, "cut") && strcmp(c, "budget") &&
            strcmp(c, "hybrid"))
            die("unknown command %s", c);
        bench_command(c);
    }
    bench_row_paths();
    bench_jobs();
    bench_startup();
    if (!cfg.keep) rmdir(cfg.tmp);
    else printf("\nfiles kept in %s\n", cfg.tmp);
    print_load("at end");
    printf("\nbench_batch: %.0f s in all%s\n", now_s() - t_start,
           check_failed ? "; AN OUTPUT CHECK FAILED (see above)" : "");
    return check_failed ? 1 : 0;
}
