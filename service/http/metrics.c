/*
 * metrics.c — Prometheus metrics registry (see metrics.h).
 *
 * Families exposed:
 *   gascycled_http_requests_total{route,method,status}        counter
 *   gascycled_http_request_duration_seconds{route}             histogram
 *   gascycled_http_requests_in_flight                          gauge
 *   gascycled_evaluations_total{preset,route}                  counter: successful
 *       evaluations by preset and by the route that made them (a preset's own
 *       route, or sweeps, targets, batch for the evaluations inside them)
 *   gascycled_errors_total{class}                              counter
 *   gascycled_build_info{version,revision}                     gauge (always 1)
 *   gascycled_uptime_seconds                                   gauge
 * Request counters are a dense array indexed by (route, method, status-100):
 * calloc'd, so pages nobody touches stay shared zero pages. Histogram buckets
 * (seconds) span 50 µs to 10 s, which covers a health check on one end and a
 * large sweep on the other; bucket counts are stored per bucket and summed
 * into the cumulative form only when rendering.
 */
#include "http/metrics.h"

#include <pthread.h>
#include <stdatomic.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#define N_STATUS 500          /* status codes 100..599 */
#define N_LABELED 64          /* distinct presets / error classes kept */

static const double bucket_le[] = {   /* upper bounds, seconds */
    0.00005, 0.0001, 0.00025, 0.0005, 0.001, 0.0025, 0.005, 0.01,
    0.025, 0.05, 0.1, 0.25, 0.5, 1.0, 2.5, 5.0, 10.0
};
static const char *const bucket_text[] = {   /* the same, as printed in le="" */
    "0.00005", "0.0001", "0.00025", "0.0005", "0.001", "0.0025", "0.005", "0.01",
    "0.025", "0.05", "0.1", "0.25", "0.5", "1", "2.5", "5", "10"
};
#define N_BUCKETS (sizeof bucket_le / sizeof bucket_le[0])

typedef struct route_hist {
    atomic_ullong bucket[N_BUCKETS + 1];   /* last = +Inf only */
    atomic_ullong count;
    atomic_ullong sum_us;                   /* µs */
} route_hist;

/* An evaluation counter labelled with a preset and a route (static strings);
 * slots are claimed under a mutex (rare), read without it. */
typedef struct pair_counter {
    const char *route;                      /* set before preset is published */
    _Atomic(const char *) preset;           /* NULL = free slot */
    atomic_ullong value;
} pair_counter;

typedef struct labeled_counter {
    _Atomic(const char *) name;             /* static string; NULL = free slot */
    atomic_ullong value;
} labeled_counter;

static const char *const method_label[GC_MM_N] = { "GET", "HEAD", "POST", "OPTIONS", "OTHER" };

static const char *const *g_routes;        /* route labels */
static size_t g_n_routes;
static atomic_ullong *g_requests;           /* [route][method][status] */
static route_hist *g_hist;                  /* [route] */
static atomic_long g_in_flight;
#define N_EVAL_PAIRS 128         /* distinct (preset, route) pairs kept */
static pair_counter g_evals[N_EVAL_PAIRS];
static pthread_mutex_t g_evals_mu = PTHREAD_MUTEX_INITIALIZER;
static labeled_counter g_errors[N_LABELED];
static atomic_ullong g_presets_dropped;     /* beyond N_LABELED distinct names */
static atomic_ullong g_errors_dropped;
static const char *g_version = "unknown";
static const char *g_revision = "unknown";
static struct timespec g_start;             /* CLOCK_MONOTONIC at init */

int gc_metrics_init(const char *const *route_labels, size_t n_routes,
                    const char *version, const char *revision)
{
    g_routes = route_labels;
    g_n_routes = n_routes;
    g_requests = calloc(n_routes * GC_MM_N * N_STATUS, sizeof *g_requests);
    g_hist = calloc(n_routes, sizeof *g_hist);
    if (!g_requests || !g_hist) {
        gc_metrics_free();
        return -1;
    }
    if (version)
        g_version = version;
    if (revision)
        g_revision = revision;
    clock_gettime(CLOCK_MONOTONIC, &g_start);
    return 0;
}

void gc_metrics_free(void)
{
    free(g_requests);
    free(g_hist);
    g_requests = NULL;
    g_hist = NULL;
    g_n_routes = 0;
}

void gc_metrics_in_flight_add(int delta)
{
    atomic_fetch_add_explicit(&g_in_flight, delta, memory_order_relaxed);
}

long gc_metrics_in_flight(void)
{
    return atomic_load_explicit(&g_in_flight, memory_order_relaxed);
}

void gc_metrics_request(size_t route, enum gc_metrics_method method, int status,
                        uint64_t duration_us)
{
    if (!g_requests || route >= g_n_routes || (unsigned)method >= GC_MM_N)
        return;
    if (status >= 100 && status <= 599) {
        size_t i = (route * GC_MM_N + (size_t)method) * N_STATUS + (size_t)(status - 100);
        atomic_fetch_add_explicit(&g_requests[i], 1, memory_order_relaxed);
    }
    route_hist *h = &g_hist[route];
    double s = (double)duration_us * 1e-6;
    size_t b = 0;
    while (b < N_BUCKETS && s > bucket_le[b])
        b++;
    atomic_fetch_add_explicit(&h->bucket[b], 1, memory_order_relaxed);
    atomic_fetch_add_explicit(&h->count, 1, memory_order_relaxed);
    atomic_fetch_add_explicit(&h->sum_us, duration_us, memory_order_relaxed);
}

/* Finds or claims the slot for name. Slots are claimed in order, so two
 * threads racing for the same new name end up in the same slot: the loser of
 * the compare-exchange re-reads the slot and sees the winner's name. */
static void labeled_add(labeled_counter *tab, atomic_ullong *dropped, const char *name)
{
    if (!name || !*name)
        return;
    for (size_t i = 0; i < N_LABELED; i++) {
        const char *cur = atomic_load_explicit(&tab[i].name, memory_order_acquire);
        if (cur == NULL) {
            const char *expected = NULL;
            if (atomic_compare_exchange_strong_explicit(&tab[i].name, &expected, name,
                                                        memory_order_acq_rel,
                                                        memory_order_acquire)) {
                cur = name;
            } else {
                cur = expected;
            }
        }
        if (cur == name || strcmp(cur, name) == 0) {
            atomic_fetch_add_explicit(&tab[i].value, 1, memory_order_relaxed);
            return;
        }
    }
    atomic_fetch_add_explicit(dropped, 1, memory_order_relaxed);
}

static pair_counter *pair_find(const char *preset, const char *route, size_t *free_at)
{
    *free_at = N_EVAL_PAIRS;
    for (size_t i = 0; i < N_EVAL_PAIRS; i++) {
        const char *p = atomic_load_explicit(&g_evals[i].preset, memory_order_acquire);
        if (!p) {
            *free_at = i;
            return NULL;
        }
        if (strcmp(p, preset) == 0 && strcmp(g_evals[i].route, route) == 0)
            return &g_evals[i];
    }
    return NULL;
}

void gc_metrics_evaluations(const char *preset, const char *route, unsigned long n)
{
    if (!preset || !*preset || n == 0)
        return;
    if (!route)
        route = "unknown";
    size_t at;
    pair_counter *c = pair_find(preset, route, &at);
    if (!c) {
        pthread_mutex_lock(&g_evals_mu);
        c = pair_find(preset, route, &at);
        if (!c && at < N_EVAL_PAIRS) {
            c = &g_evals[at];
            c->route = route;
            atomic_store_explicit(&c->preset, preset, memory_order_release);
        }
        pthread_mutex_unlock(&g_evals_mu);
    }
    if (c)
        atomic_fetch_add_explicit(&c->value, n, memory_order_relaxed);
    else
        atomic_fetch_add_explicit(&g_presets_dropped, n, memory_order_relaxed);
}

void gc_metrics_error(const char *error_class)
{
    labeled_add(g_errors, &g_errors_dropped, error_class);
}

/* ---- rendering ---------------------------------------------------------- */

typedef struct sbuf {
    char *p;
    size_t len, cap;
    int oom;
} sbuf;

static void sb_printf(sbuf *b, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void sb_printf(sbuf *b, const char *fmt, ...)
{
    va_list ap;
    if (b->oom)
        return;
    for (;;) {
        size_t room = b->cap - b->len;
        va_start(ap, fmt);
        int n = vsnprintf(b->p + b->len, room, fmt, ap);
        va_end(ap);
        if (n < 0) {
            b->oom = 1;
            return;
        }
        if ((size_t)n < room) {
            b->len += (size_t)n;
            return;
        }
        size_t ncap = b->cap * 2 + (size_t)n + 1;
        char *np = realloc(b->p, ncap);
        if (!np) {
            b->oom = 1;
            return;
        }
        b->p = np;
        b->cap = ncap;
    }
}

/* Label values per the exposition format: escape backslash, quote, newline. */
static void sb_label(sbuf *b, const char *s)
{
    char tmp[256];
    size_t j = 0;
    for (size_t i = 0; s[i] && j + 3 < sizeof tmp; i++) {
        if (s[i] == '\\' || s[i] == '"') {
            tmp[j++] = '\\';
            tmp[j++] = s[i];
        } else if (s[i] == '\n') {
            tmp[j++] = '\\';
            tmp[j++] = 'n';
        } else {
            tmp[j++] = s[i];
        }
    }
    tmp[j] = '\0';
    sb_printf(b, "%s", tmp);
}

static void render_labeled(sbuf *b, const char *family, const char *label,
                           const char *help, const labeled_counter *tab)
{
    sb_printf(b, "# HELP %s %s\n# TYPE %s counter\n", family, help, family);
    for (size_t i = 0; i < N_LABELED; i++) {
        const char *name = atomic_load_explicit(&tab[i].name, memory_order_acquire);
        if (!name)
            break;
        sb_printf(b, "%s{%s=\"", family, label);
        sb_label(b, name);
        sb_printf(b, "\"} %llu\n",
                  (unsigned long long)atomic_load_explicit(&tab[i].value, memory_order_relaxed));
    }
}

static void render_evaluations(sbuf *b)
{
    sb_printf(b, "# HELP gascycled_evaluations_total Successful evaluations, by preset and by the "
                 "route that made them (sweeps, targets and batch count the evaluations inside "
                 "them).\n# TYPE gascycled_evaluations_total counter\n");
    for (size_t i = 0; i < N_EVAL_PAIRS; i++) {
        const char *p = atomic_load_explicit(&g_evals[i].preset, memory_order_acquire);
        if (!p)
            break;
        sb_printf(b, "gascycled_evaluations_total{preset=\"");
        sb_label(b, p);
        sb_printf(b, "\",route=\"");
        sb_label(b, g_evals[i].route);
        sb_printf(b, "\"} %llu\n",
                  (unsigned long long)atomic_load_explicit(&g_evals[i].value, memory_order_relaxed));
    }
}

char *gc_metrics_render(size_t *len)
{
    sbuf b = { malloc(8192), 0, 8192, 0 };
    struct timespec now;

    if (!b.p)
        return NULL;

    sb_printf(&b, "# HELP gascycled_http_requests_total HTTP requests answered, by route label, method and status.\n"
                  "# TYPE gascycled_http_requests_total counter\n");
    for (size_t r = 0; r < g_n_routes; r++)
        for (size_t m = 0; m < GC_MM_N; m++)
            for (size_t s = 0; s < N_STATUS; s++) {
                unsigned long long v = atomic_load_explicit(
                    &g_requests[(r * GC_MM_N + m) * N_STATUS + s], memory_order_relaxed);
                if (v)
                    sb_printf(&b, "gascycled_http_requests_total{route=\"%s\",method=\"%s\",status=\"%zu\"} %llu\n",
                              g_routes[r], method_label[m], s + 100, v);
            }

    sb_printf(&b, "# HELP gascycled_http_request_duration_seconds Time from request headers received to response sent, by route label.\n"
                  "# TYPE gascycled_http_request_duration_seconds histogram\n");
    for (size_t r = 0; r < g_n_routes; r++) {
        const route_hist *h = &g_hist[r];
        unsigned long long cum = 0;
        for (size_t k = 0; k < N_BUCKETS; k++) {
            cum += atomic_load_explicit(&h->bucket[k], memory_order_relaxed);
            sb_printf(&b, "gascycled_http_request_duration_seconds_bucket{route=\"%s\",le=\"%s\"} %llu\n",
                      g_routes[r], bucket_text[k], cum);
        }
        cum += atomic_load_explicit(&h->bucket[N_BUCKETS], memory_order_relaxed);
        /* count is read after the buckets; a request finishing in between
         * only makes +Inf lag count by one for this scrape. Use the bucket sum
         * for both so the histogram is self-consistent. */
        sb_printf(&b, "gascycled_http_request_duration_seconds_bucket{route=\"%s\",le=\"+Inf\"} %llu\n",
                  g_routes[r], cum);
        sb_printf(&b, "gascycled_http_request_duration_seconds_sum{route=\"%s\"} %.6f\n",
                  g_routes[r],
                  (double)atomic_load_explicit(&h->sum_us, memory_order_relaxed) * 1e-6);
        sb_printf(&b, "gascycled_http_request_duration_seconds_count{route=\"%s\"} %llu\n",
                  g_routes[r], cum);
    }

    sb_printf(&b, "# HELP gascycled_http_requests_in_flight Requests received and not yet fully answered.\n"
                  "# TYPE gascycled_http_requests_in_flight gauge\n"
                  "gascycled_http_requests_in_flight %ld\n", gc_metrics_in_flight());

    render_evaluations(&b);
    render_labeled(&b, "gascycled_errors_total", "class",
                   "Error responses and aborted requests, by error class.", g_errors);

    sb_printf(&b, "# HELP gascycled_build_info Version and source revision of this build (value is always 1).\n"
                  "# TYPE gascycled_build_info gauge\n"
                  "gascycled_build_info{version=\"");
    sb_label(&b, g_version);
    sb_printf(&b, "\",revision=\"");
    sb_label(&b, g_revision);
    sb_printf(&b, "\"} 1\n");

    clock_gettime(CLOCK_MONOTONIC, &now);
    sb_printf(&b, "# HELP gascycled_uptime_seconds Seconds since the server started.\n"
                  "# TYPE gascycled_uptime_seconds gauge\n"
                  "gascycled_uptime_seconds %.3f\n",
              (double)(now.tv_sec - g_start.tv_sec) + (double)(now.tv_nsec - g_start.tv_nsec) * 1e-9);

    if (b.oom) {
        free(b.p);
        return NULL;
    }
    *len = b.len;
    return b.p;
}
