/* capture.h - stdout and messages of batch rows kept in memory (capture.c),
 * for --jobs (jobs.c). */
#ifndef COAXLINE_CAPTURE_H
#define COAXLINE_CAPTURE_H

#include <stddef.h>
#include <stdio.h>
#include "cli.h"

/* A row's or the reader's stdout and messages in memory. */
struct cli_capture {
    FILE *out, *err;
    char *obuf, *ebuf;
    size_t osize, esize;
    size_t (*mark)[2];       /* stdout and message offsets where a message began */
    size_t nmark, cap;
    size_t end_o, end_e;     /* stdout and message offsets where the last span ended */
    int whole_run;           /* a message without a batch line since reset */
    int failed;              /* out of memory: its rows run again */
};

/* Where one row's bytes lie in a capture. */
typedef struct cli_span {
    size_t o0, e0, m0, o1, e1, m1;
} cli_span;

/* Two memory streams, no marks: 0, or -1 (failed set) when out of memory. */
int cli_capture_open(struct cli_capture *c);
void cli_capture_close(struct cli_capture *c);
/* Empty again for the next block, the memory kept. */
void cli_capture_rewind(struct cli_capture *c);
/* The capture's position before and after one row (whole_run reset).
 * Every byte written to a capture lies in a span: a span begins where
 * the last one ended, so ftell (a lock and a seek) runs once a row. */
void cli_span_begin(struct cli_capture *c, cli_span *s);
void cli_span_end(struct cli_capture *c, cli_span *s);
/* The span to ctx->out and stderr as one thread writes them: stdout
 * flushed before each message.  The capture's streams flushed first. */
void cli_replay(const cli_ctx *ctx, const struct cli_capture *c, const cli_span *s);

#endif
