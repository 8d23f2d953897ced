/* pool.c - a small pool of POSIX worker threads for the library's own
 * parallel loops (the Monte-Carlo of yield.c; meant to serve batch jobs
 * too).  No global state: each pool is an object its user owns.
 *
 * One run hands tasks 0..ntasks-1 out in increasing order, one at a time
 * under a mutex, to whichever worker is free; the calling thread works as
 * worker 0.  Results must not depend on which worker ran a task, so a
 * caller keeps per-worker scratch space only and reduces the results in
 * task order (or with an order-free sum of integers) afterwards. */
#include <config.h>
#include <pthread.h>
#include <stdlib.h>
#include <unistd.h>
#include "coaxline.h"
#include "internal.h"

/* More threads than this are never started (a mistyped count must not
 * exhaust the process). */
#define POOL_MAX_THREADS 256

typedef struct {
    cxl__pool *pool;
    unsigned id;
} pool_worker;

struct cxl__pool {
    pthread_mutex_t mu;
    pthread_cond_t work, done;
    unsigned started;          /* threads running besides the caller */
    pthread_t *tid;
    pool_worker *arg;
    unsigned long generation;  /* one per run */
    int quit;
    size_t ntasks, next;
    unsigned busy;             /* started threads still in this run */
    cxl__pool_fn fn;
    void *ctx;
};

unsigned cxl__pool_cores(void)
{
    long n = sysconf(_SC_NPROCESSORS_ONLN);
    if (n < 1)
        return 1;
    return n > POOL_MAX_THREADS ? POOL_MAX_THREADS : (unsigned)n;
}

/* Take tasks until none is left; called with the mutex held, returns
 * with it held. */
static void drain(cxl__pool *p, unsigned id)
{
    while (p->next < p->ntasks) {
        size_t task = p->next++;
        pthread_mutex_unlock(&p->mu);
        p->fn(p->ctx, id, task);
        pthread_mutex_lock(&p->mu);
    }
}

static void *worker_main(void *arg)
{
    pool_worker *w = arg;
    cxl__pool *p = w->pool;
    unsigned long seen = 0;
    pthread_mutex_lock(&p->mu);
    for (;;) {
        while (!p->quit && p->generation == seen)
            pthread_cond_wait(&p->work, &p->mu);
        if (p->quit)
            break;
        seen = p->generation;
        drain(p, w->id);
        if (--p->busy == 0)
            pthread_cond_signal(&p->done);
    }
    pthread_mutex_unlock(&p->mu);
    return NULL;
}

cxl_status cxl__pool_new(unsigned nthreads, cxl__pool **pool)
{
    if (!pool || nthreads == 0)
        return CXL_EINVAL;
    if (nthreads > POOL_MAX_THREADS)
        nthreads = POOL_MAX_THREADS;
    cxl__pool *p = calloc(1, sizeof *p);
    if (!p)
        return CXL_ENOMEM;
    if (nthreads > 1) {
        p->tid = malloc((nthreads - 1) * sizeof *p->tid);
        p->arg = malloc((nthreads - 1) * sizeof *p->arg);
        if (!p->tid || !p->arg) {
            free(p->tid);
            free(p->arg);
            free(p);
            return CXL_ENOMEM;
        }
    }
    if (pthread_mutex_init(&p->mu, NULL) != 0) {
        free(p->tid);
        free(p->arg);
        free(p);
        return CXL_ENOMEM;
    }
    if (pthread_cond_init(&p->work, NULL) != 0) {
        pthread_mutex_destroy(&p->mu);
        free(p->tid);
        free(p->arg);
        free(p);
        return CXL_ENOMEM;
    }
    if (pthread_cond_init(&p->done, NULL) != 0) {
        pthread_cond_destroy(&p->work);
        pthread_mutex_destroy(&p->mu);
        free(p->tid);
        free(p->arg);
        free(p);
        return CXL_ENOMEM;
    }
    for (unsigned i = 0; i + 1 < nthreads; i++) {
        p->arg[i] = (pool_worker){ p, i + 1 };
        if (pthread_create(&p->tid[i], NULL, worker_main, &p->arg[i]) != 0)
            break;   /* fewer workers: the same work, only slower */
        p->started++;
    }
    *pool = p;
    return CXL_OK;
}

unsigned cxl__pool_size(const cxl__pool *pool)
{
    return pool ? pool->started + 1 : 1;
}

void cxl__pool_run(cxl__pool *p, size_t ntasks, cxl__pool_fn fn, void *ctx)
{
    pthread_mutex_lock(&p->mu);
    p->fn = fn;
    p->ctx = ctx;
    p->ntasks = ntasks;
    p->next = 0;
    p->busy = p->started;
    p->generation++;
    pthread_cond_broadcast(&p->work);
    drain(p, 0);
    while (p->busy > 0)
        pthread_cond_wait(&p->done, &p->mu);
    p->fn = NULL;
    p->ctx = NULL;
    pthread_mutex_unlock(&p->mu);
}

void cxl__pool_free(cxl__pool *p)
{
    if (!p)
        return;
    pthread_mutex_lock(&p->mu);
    p->quit = 1;
    pthread_cond_broadcast(&p->work);
    pthread_mutex_unlock(&p->mu);
    for (unsigned i = 0; i < p->started; i++)
        pthread_join(p->tid[i], NULL);
    pthread_cond_destroy(&p->done);
    pthread_cond_destroy(&p->work);
    pthread_mutex_destroy(&p->mu);
    free(p->tid);
    free(p->arg);
    free(p);
}
