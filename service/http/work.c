/*
 * work.c — the composite-route worker pool of the HTTP layer (see work.h):
 * a FIFO of jobs under one mutex and condition variable, n worker threads,
 * and a running mean of job durations for Retry-After.
 */
#include "http/work.h"

#include <pthread.h>
#include <stdlib.h>
#include <time.h>

#define MEAN_WEIGHT 0.2   /* weight of the newest job in the running mean */

struct gc_work {
    pthread_mutex_t mu;
    pthread_cond_t more;          /* a job was queued, or stop */
    pthread_cond_t idle;          /* a job finished */
    gc_work_job *head, *tail;
    unsigned waiting, running, queue_max, n_threads;
    int stop;
    double mean_s;                /* running mean of job durations */
    pthread_t *threads;
};

static double now_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec * 1e-9;
}

static void *worker_main(void *arg)
{
    gc_work *w = arg;
    pthread_mutex_lock(&w->mu);
    for (;;) {
        while (!w->head && !w->stop)
            pthread_cond_wait(&w->more, &w->mu);
        if (!w->head)
            break;   /* stop, and nothing left to run */
        gc_work_job *job = w->head;
        w->head = job->next;
        if (!w->head)
            w->tail = NULL;
        w->waiting--;
        w->running++;
        pthread_mutex_unlock(&w->mu);
        double t0 = now_s();
        job->run(job);   /* the job may be freed from here on */
        double dt = now_s() - t0;
        pthread_mutex_lock(&w->mu);
        w->running--;
        w->mean_s = w->mean_s > 0 ? (1 - MEAN_WEIGHT) * w->mean_s + MEAN_WEIGHT * dt : dt;
        pthread_cond_broadcast(&w->idle);
    }
    pthread_mutex_unlock(&w->mu);
    return NULL;
}

int gc_work_new(unsigned n_threads, unsigned queue_max, gc_work **out)
{
    gc_work *w = calloc(1, sizeof *w);
    *out = NULL;
    if (!w)
        return -1;
    w->threads = calloc(n_threads ? n_threads : 1, sizeof *w->threads);
    if (!w->threads) {
        free(w);
        return -1;
    }
    w->queue_max = queue_max;
    pthread_mutex_init(&w->mu, NULL);
    pthread_cond_init(&w->more, NULL);
    pthread_cond_init(&w->idle, NULL);
    for (unsigned i = 0; i < (n_threads ? n_threads : 1); i++) {
        if (pthread_create(&w->threads[i], NULL, worker_main, w) != 0) {
            gc_work_free(w);
            return -1;
        }
        w->n_threads++;
    }
    *out = w;
    return 0;
}

int gc_work_submit(gc_work *w, gc_work_job *job, unsigned *retry_after_s)
{
    pthread_mutex_lock(&w->mu);
    if (w->stop || w->waiting + w->running >= w->n_threads + w->queue_max) {
        double ahead = (double)(w->waiting + w->running) / (double)(w->n_threads ? w->n_threads : 1);
        double s = w->mean_s * ahead;
        pthread_mutex_unlock(&w->mu);
        *retry_after_s = s < 1 ? 1 : s > 60 ? 60 : (unsigned)(s + 0.999);
        return -1;
    }
    job->next = NULL;
    if (w->tail)
        w->tail->next = job;
    else
        w->head = job;
    w->tail = job;
    w->waiting++;
    pthread_cond_signal(&w->more);
    pthread_mutex_unlock(&w->mu);
    return 0;
}

void gc_work_load(gc_work *w, unsigned *running, unsigned *waiting)
{
    pthread_mutex_lock(&w->mu);
    *running = w->running;
    *waiting = w->waiting;
    pthread_mutex_unlock(&w->mu);
}

void gc_work_free(gc_work *w)
{
    if (!w)
        return;
    pthread_mutex_lock(&w->mu);
    w->stop = 1;
    pthread_cond_broadcast(&w->more);
    pthread_mutex_unlock(&w->mu);
    for (unsigned i = 0; i < w->n_threads; i++)
        pthread_join(w->threads[i], NULL);
    pthread_cond_destroy(&w->more);
    pthread_cond_destroy(&w->idle);
    pthread_mutex_destroy(&w->mu);
    free(w->threads);
    free(w);
}
