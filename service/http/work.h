/*
 * work.h — private to the HTTP layer: the composite-route workers. Requests
 * that run many evaluations (/v1/sweeps, /v1/targets, /v1/batch: seconds of
 * CPU each) are taken off libmicrohttpd's threads: the connection is
 * suspended, the job runs on one of --composite-workers threads, and the
 * connection is resumed with the answer. libmicrohttpd's threads are thus
 * never blocked by a long request, so /healthz, /readyz, /metrics and the
 * single evaluations stay answerable on every connection while composites
 * run. At most --composite-queue jobs wait beyond those running; beyond
 * that a composite request is answered 503 with Retry-After at once.
 *
 * Retry-After: the mean duration of the last jobs times the jobs ahead, per
 * worker, rounded up, from 1 to 60 s.
 */
#ifndef GC_HTTP_WORK_H
#define GC_HTTP_WORK_H

typedef struct gc_work_job {
    void (*run)(struct gc_work_job *job);   /* on a worker thread */
    struct gc_work_job *next;               /* queue link (owned by the queue) */
} gc_work_job;

typedef struct gc_work gc_work;

/* Starts n_threads workers (>= 1) with room for queue_max waiting jobs.
 * Returns 0, or -1 (no memory or no thread). */
int gc_work_new(unsigned n_threads, unsigned queue_max, gc_work **out);

/* Queues job. Returns 0, or -1 when every worker is busy and queue_max
 * jobs wait already (then *retry_after_s is the suggested wait). */
int gc_work_submit(gc_work *w, gc_work_job *job, unsigned *retry_after_s);

/* Jobs running and waiting now. */
void gc_work_load(gc_work *w, unsigned *running, unsigned *waiting);

/* Waits for every queued and running job to finish, then stops and joins
 * the workers and frees w. Jobs should see the cancel flag their budgets
 * point to first, so this returns within one evaluation. */
void gc_work_free(gc_work *w);

#endif
