/*
 * uncert_run.c — the uncertainty engine's batch runner: evaluates a model
 * (uncert.h) at n points on one or more POSIX threads.
 *
 * Determinism: point j's inputs come from a callback of j alone and its
 * outputs and status are written at index j, so neither the number of
 * threads nor the order in which they take work changes any number. The
 * threads take chunks of points from a shared atomic counter (so a thread
 * slowed by other work on a shared machine does not hold the others up).
 * The calling thread works too, with the model's own ctx; each extra
 * thread gets a ctx from the model's clone callback (or shares ctx when
 * there is none: the model then promises a thread-safe eval). A thread
 * that cannot be created or cloned simply does not join: the others do its
 * share.
 *
 * Stack: GC_UNCERT_THREAD_STACK bytes per worker (the presets keep their
 * scratch results on the stack: brayton.h asks for at least 256 KB).
 */
#include "uncert_internal.h"

#include <math.h>
#include <pthread.h>
#include <stdatomic.h>

typedef struct worker {
    const gc__uncert_batch *b;
    void *ctx;
    atomic_long *next;
    long chunk;
    int cloned;                  /* 1: ctx came from clone() */
    int started;                 /* 1: the thread runs */
    pthread_t tid;
} worker;

static int eval_point(const gc__uncert_batch *b, void *ctx, long j, double *x)
{
    const gc_uncert_model *m = b->m;
    double *y = b->y + j * (long)m->ny;
    b->point(b->job, j, x);
    int st = m->eval(ctx, x, m->nx, y, m->ny);
    if (st != GC_OK)
        return st;
    for (int o = 0; o < m->ny; o++)
        if (!isfinite(y[o]))
            return GC_ERR_INFEASIBLE;
    return GC_OK;
}

static void work(worker *w)
{
    const gc__uncert_batch *b = w->b;
    double x[GC_UNCERT_MAX_INPUTS];
    for (;;) {
        long j0 = atomic_fetch_add(w->next, w->chunk);
        if (j0 >= b->n)
            return;
        long j1 = j0 + w->chunk < b->n ? j0 + w->chunk : b->n;
        for (long j = j0; j < j1; j++)
            b->status[j] = eval_point(b, w->ctx, j, x);
    }
}

static void *thread_main(void *arg)
{
    work((worker *)arg);
    return NULL;
}

/* Chunks small enough to balance the threads, large enough to keep the
 * counter cold: about 16 per thread, 1..256 points. */
static long chunk_size(long n, int threads)
{
    long c = n / (16L * threads);
    return c < 1 ? 1 : (c > 256 ? 256 : c);
}

static void start_worker(worker *w, const gc_uncert_model *m)
{
    w->ctx = m->ctx;
    if (m->clone) {
        w->ctx = m->clone(m->ctx);
        if (w->ctx == NULL)
            return;
        w->cloned = 1;
    }
    pthread_attr_t attr;
    if (pthread_attr_init(&attr) != 0)
        return;
    pthread_attr_setstacksize(&attr, GC_UNCERT_THREAD_STACK);
    w->started = pthread_create(&w->tid, &attr, thread_main, w) == 0;
    pthread_attr_destroy(&attr);
}

void gc__uncert_run(const gc__uncert_batch *b)
{
    const gc_uncert_model *m = b->m;
    int nt = b->threads < 1 ? 1 : b->threads;
    if (nt > GC_UNCERT_MAX_THREADS)
        nt = GC_UNCERT_MAX_THREADS;
    if ((long)nt > b->n)
        nt = b->n < 1 ? 1 : (int)b->n;
    atomic_long next;
    atomic_init(&next, 0);
    worker w[GC_UNCERT_MAX_THREADS] = { { 0 } };
    long chunk = chunk_size(b->n, nt);
    for (int t = 0; t < nt; t++) {
        w[t].b = b;
        w[t].next = &next;
        w[t].chunk = chunk;
    }
    for (int t = 1; t < nt; t++)
        start_worker(&w[t], m);
    w[0].ctx = m->ctx;
    work(&w[0]);
    for (int t = 1; t < nt; t++) {
        if (w[t].started)
            pthread_join(w[t].tid, NULL);
        if (w[t].cloned && m->release)
            m->release(w[t].ctx);
    }
}
