/* capture.c - a --jobs worker's stdout and one-line messages in memory,
 * and their replay in input order (used by jobs.c; common.c's messages go
 * through cli_report_stream). */
#include <config.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "capture.h"
#include "cli.h"

FILE *cli_report_stream(const cli_ctx *ctx)
{
    struct cli_capture *c = ctx ? ctx->capture : NULL;
    if (!c) {
        fflush(ctx && ctx->out ? ctx->out : stdout);
        if (ctx && ctx->progress) fputs("\r\033[K", stderr); /* over a progress line */
        return stderr;
    }
    if (c->nmark == c->cap) {
        size_t cap = c->cap ? 2 * c->cap : 8;
        size_t (*m)[2] = realloc(c->mark, cap * sizeof *m);
        if (!m) c->failed = 1;
        else { c->mark = m; c->cap = cap; }
    }
    if (c->nmark < c->cap) {
        c->mark[c->nmark][0] = (size_t)ftell(c->out);
        c->mark[c->nmark++][1] = (size_t)ftell(c->err);
    }
    if (!ctx->input_name) c->whole_run = 1;
    return c->err;
}

int cli_capture_open(struct cli_capture *c)
{
    memset(c, 0, sizeof *c);
    c->out = open_memstream(&c->obuf, &c->osize);
    c->err = open_memstream(&c->ebuf, &c->esize);
    c->failed = !c->out || !c->err;
    return c->failed ? -1 : 0;
}

void cli_capture_close(struct cli_capture *c)
{
    if (c->out) fclose(c->out);
    if (c->err) fclose(c->err);
    free(c->obuf);
    free(c->ebuf);
    free(c->mark);
    memset(c, 0, sizeof *c);
}

void cli_span_begin(struct cli_capture *c, cli_span *s)
{
    c->whole_run = 0;
    s->o0 = c->end_o;
    s->e0 = c->end_e;
    s->m0 = c->nmark;
}

/* Messages reach c->err only through cli_report_stream, which marks
 * each: no new mark (and no failed mark) means no new message bytes. */
void cli_span_end(struct cli_capture *c, cli_span *s)
{
    s->o1 = c->out ? (size_t)ftell(c->out) : 0;
    s->e1 = s->e0;
    if (c->nmark != s->m0 || c->failed) s->e1 = c->err ? (size_t)ftell(c->err) : 0;
    s->m1 = c->nmark;
    c->end_o = s->o1;
    c->end_e = s->e1;
}

/* Write a span as one thread would have: stdout flushed before each
 * message.  The capture's streams are flushed. */
void cli_replay(const cli_ctx *ctx, const struct cli_capture *c, const cli_span *s)
{
    size_t o = s->o0, e = s->e0;
    for (size_t m = s->m0; m <= s->m1; m++) {
        size_t mo = m < s->m1 ? c->mark[m][0] : s->o1, me = m < s->m1 ? c->mark[m][1] : s->e1;
        if (me > e) {
            fwrite(c->ebuf + e, 1, me - e, stderr);
            e = me;
        }
        if (mo > o) {
            fwrite(c->obuf + o, 1, mo - o, ctx->out);
            o = mo;
        }
        if (m < s->m1) {
            fflush(ctx->out);
            if (ctx->progress) fputs("\r\033[K", stderr);
        }
    }
}

void cli_capture_rewind(struct cli_capture *c)
{
    if (fseek(c->out, 0, SEEK_SET) || fseek(c->err, 0, SEEK_SET)) c->failed = 1;
    c->nmark = 0;
    c->whole_run = 0;
    c->end_o = c->end_e = 0;
}
