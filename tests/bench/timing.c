/* timing.c - the timed-loop harness shared by bench_lib and bench_cli. */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include "timing.h"

static volatile double sink;

static double now_s(void)
{
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

bench_timing bench_time(bench_body fn, void *ctx, double target_s, int repeats)
{
    long n = 1;
    double t;
    if (repeats < 1) repeats = 1;
    if (repeats > 64) repeats = 64;
    /* calibrate: double n until one loop lasts a tenth of the target */
    for (;;) {
        double t0 = now_s();
        sink += fn(ctx, n);
        t = now_s() - t0;
        if (t >= target_s / 10.0 || n >= (1L << 40)) break;
        n *= 2;
    }
    n = (long)((double)n * target_s / (t > 0.0 ? t : 1e-9)) + 1;
    double ns[64];
    for (int r = 0; r < repeats; r++) {
        double t0 = now_s();
        sink += fn(ctx, n);
        ns[r] = (now_s() - t0) * 1e9 / (double)n;
    }
    qsort(ns, (size_t)repeats, sizeof ns[0], cmp_double);
    bench_timing bt;
    bt.median_ns = repeats % 2 ? ns[repeats / 2] : 0.5 * (ns[repeats / 2 - 1] + ns[repeats / 2]);
    bt.min_ns = ns[0];
    bt.calls = n;
    return bt;
}

const char *bench_fmt_ns(char *buf, unsigned long size, double ns)
{
    if (ns >= 1e4) snprintf(buf, size, "%.1f us", ns / 1e3);
    else snprintf(buf, size, "%.1f ns", ns);
    return buf;
}
