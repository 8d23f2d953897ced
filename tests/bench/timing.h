/* timing.h - the timed-loop harness shared by bench_lib and bench_cli. */
#ifndef COAXLINE_BENCH_TIMING_H
#define COAXLINE_BENCH_TIMING_H

/* A timed body: n calls of the thing measured on ctx; returns the sum of
 * the results, which the harness adds into a volatile sink so the work
 * cannot be optimised away. */
typedef double (*bench_body)(void *ctx, long n);

typedef struct bench_timing {
    double median_ns, min_ns; /* per call */
    long calls;               /* calls per timed loop */
} bench_timing;

/* Loop length chosen so that one loop lasts about target_s, then
 * `repeats` (1..64) timed loops (CLOCK_MONOTONIC). */
bench_timing bench_time(bench_body fn, void *ctx, double target_s, int repeats);

/* "12.3 ns", or "45.6 us" from 10 us up. */
const char *bench_fmt_ns(char *buf, unsigned long size, double ns);

#endif
