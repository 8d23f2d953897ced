/* jobs.c - --jobs N: the rows of an --input batch on N threads, written
 * in input order, the same bytes on stdout and stderr and the same exit
 * status as one thread.
 *
 * The main thread reads a block of rows (cells converted, plot names
 * chosen and checked for duplicates, in input order) into the block's own
 * memory, hands its chunks of rows to the workers and, while they run
 * them, reads the next block; then it writes the first block's rows in
 * order and reads on.  A worker runs each row on a cli_ctx of its own
 * (catalog, band table and --vf-from file loaded by that worker) whose
 * stdout and one-line messages go to memory (struct cli_capture), with
 * the points where a message began, so that the writer puts both
 * streams out as one thread would (stdout flushed before each message).
 *
 * What a row prints depends on the rows before it only through
 * ctx->header_done and whether ctx->rows_out is zero (a CSV header, a
 * JSON comma, a blank line between text rows).  A worker runs each row as
 * if rows had been written before (the state after the first row, guessed
 * from the format); the writer keeps a row's bytes when the real state
 * matches and otherwise runs the row again on the main thread, straight
 * to stdout (the first row written, usually).  A message about the whole
 * run (no batch line: a cable file that cannot be read, a --vf-from file)
 * is printed once, by the row that first needs the file; when a worker's
 * row printed one, that row and every one after it run again on the main
 * thread.  So do rows that read standard input (a FILE option of "-").
 *
 * A CLI-side pool rather than the library's cxl__pool_*: those are not
 * exported, and this pipeline (a reader and an ordered writer around the
 * workers) is the tool's concern, not the library's.
 */
#include <config.h>
#include <pthread.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "capture.h"
#include "cli.h"

/* A block holds at most BLOCK_ROWS rows and, going by the rows before,
 * about BLOCK_BYTES of captured output (a sweep row prints ~18 KB): the
 * first block is FIRST_ROWS long, later ones grow as the output allows.
 * A block is cut into NCHUNKS chunks, the workers' unit of work. */
enum { BLOCK_ROWS = 2048, FIRST_ROWS = 256, NCHUNKS = 16 };
#define BLOCK_BYTES ((size_t)8 << 20)
#define NO_CELL SIZE_MAX

typedef struct slot {
    size_t line;
    int kind;                /* CLI_ROW_SKIP (reader's message) or CLI_ROW_RUN */
    int rc;
    int main_only;           /* reads standard input */
    int ran, whole_run;      /* a worker ran it; it printed a message for the run */
    int header_done;         /* the worker's ctx after the row */
    size_t rows_out;
    size_t cell[CLI_MAX_OPTS], plot[CLI_MAX_OPTS]; /* arena offsets or NO_CELL */
    struct cli_capture *cap;
    cli_span sp;
} slot;

typedef struct block {
    slot slots[BLOCK_ROWS];
    size_t n, chunk_rows;
    char *arena;
    size_t used, size;
    struct cli_capture reader;
    struct cli_capture chunk[NCHUNKS];
    size_t pending;          /* chunks not yet run */
    size_t nchunks;          /* chunks handed to the workers */
} block;

/* The FILE options of the command (a row reads standard input when one
 * is "-"), found once rather than on every row; stdin_always when the
 * command line already gives "-" to one of them. */
typedef struct file_opts {
    int nopts, n, idx[CLI_MAX_OPTS];
    int from_args[CLI_MAX_OPTS];
} file_opts;

typedef struct pool {
    pthread_mutex_t mu;
    pthread_cond_t work, done;
    struct { block *b; size_t c; } queue[2 * NCHUNKS];
    size_t head, count;
    int quit;
    cli_ctx proto;           /* the main ctx past the header, as it was */
    cli_args args;           /* the command line's values, as they were */
    int spec_header;         /* the header state a worker assumes */
    file_opts files;
    size_t block_rows;       /* rows read into the next block */
    int serial;              /* every row from here on, on the main thread */
} pool;

/* Copy text into the block's arena; its offset, or NO_CELL. */
static size_t keep(block *bk, const char *text)
{
    if (!text) return NO_CELL;
    size_t len = strlen(text) + 1;
    if (bk->used + len > bk->size) {
        size_t size = bk->size ? bk->size : 65536;
        while (size < bk->used + len) size *= 2;
        char *a = realloc(bk->arena, size);
        if (!a) return NO_CELL;
        bk->arena = a;
        bk->size = size;
    }
    memcpy(bk->arena + bk->used, text, len);
    bk->used += len;
    return bk->used - len;
}

static void find_file_opts(file_opts *f, const cli_command *cmd, const cli_args *args)
{
    memset(f, 0, sizeof *f);
    for (int i = 0; cmd->opts[i].name; i++, f->nopts++) {
        if (!cmd->opts[i].arg || !strstr(cmd->opts[i].arg, "FILE")) continue;
        for (size_t k = 0; k < args->nval[i]; k++)
            if (strcmp(args->val[i][k], "-") == 0) f->from_args[f->n] = 1;
        f->idx[f->n++] = i;
    }
}

/* 1 when the row reads standard input: a FILE option of "-". */
static int reads_stdin(const file_opts *f, const char *const *row)
{
    for (int k = 0; k < f->n; k++) {
        const char *cell = row[f->idx[k]];
        if (cell ? strcmp(cell, "-") == 0 : f->from_args[k]) return 1;
    }
    return 0;
}

/* Keep the row just read in slot s: cells and plot names into the arena. */
static void keep_row(block *bk, slot *s, const cli_batch *b, const file_opts *f)
{
    const char *const *row = cli_batch_row(b), *const *plot = cli_batch_plots(b);
    s->main_only = reads_stdin(f, row);
    for (int i = 0; i < f->nopts; i++) {
        s->cell[i] = keep(bk, row[i]);
        s->plot[i] = keep(bk, plot[i]);
        if ((row[i] && s->cell[i] == NO_CELL) || (plot[i] && s->plot[i] == NO_CELL))
            s->main_only = 1; /* out of memory */
    }
}

/* Read up to BLOCK_ROWS rows into bk, messages into its reader capture.
 * Returns 1 at the end of the input. */
static int fill(block *bk, cli_batch *b, const cli_ctx *main_ctx, cli_args *args,
                const file_opts *f, size_t max_rows)
{
    cli_ctx rctx = *main_ctx;
    rctx.capture = &bk->reader;
    rctx.out = bk->reader.out;
    bk->n = 0;
    bk->used = 0;
    bk->chunk_rows = (max_rows + NCHUNKS - 1) / NCHUNKS;
    while (bk->n < max_rows) {
        slot *s = &bk->slots[bk->n];
        int rc = CLI_EXIT_OK;
        cli_span_begin(&bk->reader, &s->sp);
        int kind = cli_batch_next(b, &rctx, args, &rc);
        cli_span_end(&bk->reader, &s->sp);
        if (kind == CLI_ROW_END) return 1;
        s->line = rctx.line;
        s->kind = kind;
        s->rc = rc;
        s->ran = 0;
        s->cap = &bk->reader;
        if (kind == CLI_ROW_RUN) keep_row(bk, s, b, f);
        bk->n++;
    }
    return 0;
}

/* The row's cells and plot names as pointers into the arena (the
 * entries past the command's options are left as they are: NULL). */
static void row_pointers(const block *bk, const slot *s, int nopts, const char **row,
                         const char **plot)
{
    for (int i = 0; i < nopts; i++) {
        row[i] = s->cell[i] == NO_CELL ? NULL : bk->arena + s->cell[i];
        plot[i] = s->plot[i] == NO_CELL ? NULL : bk->arena + s->plot[i];
    }
}

/* A worker runs chunk c of bk on its own ctx and args. */
static void run_chunk(const pool *p, cli_ctx *ctx, cli_args *args, block *bk, size_t c)
{
    struct cli_capture *cap = &bk->chunk[c];
    if (cap->out) cli_capture_rewind(cap);
    else if (cli_capture_open(cap)) return;
    if (cap->failed) return;
    ctx->out = cap->out;
    ctx->capture = cap;
    /* Held for the chunk: each write then takes the lock without an
     * atomic instruction. */
    flockfile(cap->out);
    const char *row[CLI_MAX_OPTS] = { 0 }, *plot[CLI_MAX_OPTS] = { 0 };
    size_t end = (c + 1) * bk->chunk_rows < bk->n ? (c + 1) * bk->chunk_rows : bk->n;
    for (size_t i = c * bk->chunk_rows; i < end; i++) {
        slot *s = &bk->slots[i];
        if (s->kind != CLI_ROW_RUN || s->main_only) continue;
        row_pointers(bk, s, p->files.nopts, row, plot);
        cli_batch_apply(ctx->cmd, args, row, plot);
        ctx->line = s->line;
        ctx->header_done = p->spec_header;
        ctx->rows_out = 1;
        cli_span_begin(cap, &s->sp);
        s->rc = ctx->cmd->run(ctx, args);
        cli_span_end(cap, &s->sp);
        s->cap = cap;
        s->whole_run = cap->whole_run;
        s->header_done = ctx->header_done;
        s->rows_out = ctx->rows_out;
        s->ran = 1;
    }
    funlockfile(cap->out);
    if (fflush(cap->out) || fflush(cap->err)) cap->failed = 1;
}

/* A worker's ctx: the main one's settings, nothing loaded yet. */
static void worker_ctx(const pool *p, cli_ctx *ctx)
{
    *ctx = p->proto;
    ctx->catalog = NULL;
    ctx->catalog_failed = 0;
    ctx->bands = NULL;
    ctx->state = NULL;
    ctx->progress = 0;
}

/* What a worker's ctx loaded, released (its state through the command's
 * end, whose output is dropped). */
static void worker_release(cli_ctx *ctx)
{
    if (ctx->state && ctx->cmd->end) {
        struct cli_capture drop;
        if (cli_capture_open(&drop) == 0) {
            ctx->out = drop.out;
            ctx->capture = &drop;
            ctx->cmd->end(ctx);
        }
        cli_capture_close(&drop);
    }
    cxl_catalog_free(ctx->catalog);
    cxl_bands_free(ctx->bands);
}

static void *worker(void *arg)
{
    pool *p = arg;
    cli_ctx ctx;
    worker_ctx(p, &ctx);
    cli_args *args = malloc(sizeof *args);
    if (args) *args = p->args;
    pthread_mutex_lock(&p->mu);
    for (;;) {
        while (p->count == 0 && !p->quit) pthread_cond_wait(&p->work, &p->mu);
        if (p->count == 0) break;
        block *bk = p->queue[p->head].b;
        size_t c = p->queue[p->head].c;
        p->head = (p->head + 1) % (2 * NCHUNKS);
        p->count--;
        pthread_mutex_unlock(&p->mu);
        if (args) run_chunk(p, &ctx, args, bk, c);
        else bk->chunk[c].failed = 1;
        pthread_mutex_lock(&p->mu);
        bk->pending--;
        pthread_cond_broadcast(&p->done);
    }
    pthread_mutex_unlock(&p->mu);
    worker_release(&ctx);
    free(args);
    return NULL;
}

/* Queue the chunks of bk for the workers (none once p->serial is set). */
static void submit(pool *p, block *bk)
{
    size_t n = p->serial ? 0 : (bk->n + bk->chunk_rows - 1) / bk->chunk_rows;
    pthread_mutex_lock(&p->mu);
    bk->pending = n;
    bk->nchunks = n;
    for (size_t c = 0; c < n; c++) {
        p->queue[(p->head + p->count) % (2 * NCHUNKS)].b = bk;
        p->queue[(p->head + p->count) % (2 * NCHUNKS)].c = c;
        p->count++;
    }
    pthread_cond_broadcast(&p->work);
    pthread_mutex_unlock(&p->mu);
}

static void wait_block(pool *p, block *bk)
{
    pthread_mutex_lock(&p->mu);
    while (bk->pending > 0) pthread_cond_wait(&p->done, &p->mu);
    pthread_mutex_unlock(&p->mu);
}

/* Slot s of bk to the real streams: the worker's bytes when they hold,
 * else the row run again here.  Returns its exit status. */
static int write_slot(pool *p, cli_ctx *ctx, cli_args *args, const block *bk, const slot *s)
{
    if (s->kind == CLI_ROW_SKIP) {
        cli_replay(ctx, s->cap, &s->sp);
        return s->rc;
    }
    if (s->ran && s->whole_run) p->serial = 1;
    if (s->ran && !p->serial && !s->cap->failed && ctx->header_done == p->spec_header &&
        ctx->rows_out > 0) {
        cli_replay(ctx, s->cap, &s->sp);
        ctx->header_done = s->header_done;
        ctx->rows_out += s->rows_out - 1;
        return s->rc;
    }
    const char *row[CLI_MAX_OPTS] = { 0 }, *plot[CLI_MAX_OPTS] = { 0 };
    row_pointers(bk, s, p->files.nopts, row, plot);
    cli_batch_apply(ctx->cmd, args, row, plot);
    ctx->line = s->line;
    return ctx->cmd->run(ctx, args);
}

/* The rows of the next block: as many as fit BLOCK_BYTES of output at
 * this block's bytes a row, at most twice this block's limit. */
static void next_block_rows(pool *p, const block *bk)
{
    size_t bytes = bk->reader.end_o + bk->reader.end_e, rows = BLOCK_ROWS;
    for (size_t c = 0; c < bk->nchunks; c++) bytes += bk->chunk[c].end_o + bk->chunk[c].end_e;
    if (bk->n > 0 && bytes / bk->n > 0) rows = BLOCK_BYTES / (bytes / bk->n);
    if (rows > 2 * p->block_rows) rows = 2 * p->block_rows;
    if (rows > BLOCK_ROWS) rows = BLOCK_ROWS;
    p->block_rows = rows < NCHUNKS ? NCHUNKS : rows;
}

static int write_block(pool *p, cli_ctx *ctx, cli_args *args, block *bk)
{
    int code = CLI_EXIT_OK;
    fflush(bk->reader.out);
    fflush(bk->reader.err);
    flockfile(ctx->out); /* this thread alone writes it: no atomic a write */
    for (size_t i = 0; i < bk->n; i++)
        code = cli_batch_worse(code, write_slot(p, ctx, args, bk, &bk->slots[i]));
    funlockfile(ctx->out);
    next_block_rows(p, bk);
    cli_capture_rewind(&bk->reader);
    return code;
}

/* Read, run and write block by block, the next block read while the
 * workers run the one before. */
static int pipeline(pool *p, cli_batch *b, cli_ctx *ctx, cli_args *args, block *bk)
{
    if (cli_capture_open(&bk[0].reader) || cli_capture_open(&bk[1].reader))
        return cli_batch_run_rows(b, ctx, args);
    int code = CLI_EXIT_OK, cur = 0, ended = fill(&bk[0], b, ctx, args, &p->files, p->block_rows), rest = 0;
    submit(p, &bk[0]);
    for (;;) {
        int nxt = 1 - cur;
        bk[nxt].n = 0;
        if (!ended && !bk[nxt].reader.failed) {
            ended = fill(&bk[nxt], b, ctx, args, &p->files, p->block_rows);
            submit(p, &bk[nxt]);
        } else if (!ended) {
            rest = 1; /* out of memory: the rest in turn, here */
        }
        wait_block(p, &bk[cur]);
        code = cli_batch_worse(code, write_block(p, ctx, args, &bk[cur]));
        if (bk[nxt].n == 0) break;
        cur = nxt;
    }
    if (rest) code = cli_batch_worse(code, cli_batch_run_rows(b, ctx, args));
    return code;
}

int cli_jobs_run(cli_batch *b, cli_ctx *ctx, cli_args *args)
{
    block *bk = calloc(2, sizeof *bk);
    pool *p = calloc(1, sizeof *p);
    pthread_t tid[CLI_MAX_JOBS];
    int nthreads = 0;
    if (!bk || !p) {
        free(bk);
        free(p);
        return cli_batch_run_rows(b, ctx, args);
    }
    pthread_mutex_init(&p->mu, NULL);
    pthread_cond_init(&p->work, NULL);
    pthread_cond_init(&p->done, NULL);
    p->proto = *ctx;
    p->args = *args;
    p->spec_header = ctx->format != CLI_TEXT;
    find_file_opts(&p->files, ctx->cmd, args);
    p->block_rows = FIRST_ROWS;
    for (int i = 0; i < ctx->jobs && i < CLI_MAX_JOBS; i++)
        if (pthread_create(&tid[nthreads], NULL, worker, p) == 0) nthreads++;
    int code = nthreads ? pipeline(p, b, ctx, args, bk) : cli_batch_run_rows(b, ctx, args);
    pthread_mutex_lock(&p->mu);
    p->quit = 1;
    pthread_cond_broadcast(&p->work);
    pthread_mutex_unlock(&p->mu);
    for (int i = 0; i < nthreads; i++) pthread_join(tid[i], NULL);
    for (int i = 0; i < 2; i++) {
        free(bk[i].arena);
        cli_capture_close(&bk[i].reader);
        for (size_t c = 0; c < NCHUNKS; c++) cli_capture_close(&bk[i].chunk[c]);
    }
    pthread_cond_destroy(&p->work);
    pthread_cond_destroy(&p->done);
    pthread_mutex_destroy(&p->mu);
    free(bk);
    free(p);
    return code;
}
