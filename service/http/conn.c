/*
 * conn.c — the connection table, the connection caps and the deadline
 * watchdog of the HTTP layer (see conn.h for the model and its reasons).
 *
 * Data: a doubly linked list of open connections and a chained hash table
 * of client addresses with their open-connection counts, both under one
 * mutex (taken on accept, open, close and by the watchdog every 200 ms; a
 * phase change takes no lock, only a compare-and-swap on the phase).
 */
#include "http/conn.h"
#include "http/log.h"
#include "http/metrics.h"
#include "api/api.h"

#include <arpa/inet.h>
#include <errno.h>
#include <linux/sockios.h>
#include <netinet/in.h>
#include <pthread.h>
#include <stdatomic.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/ioctl.h>
#include <time.h>
#include <unistd.h>

#define TICK_MS 200               /* watchdog period */
#define N_BUCKETS 1024            /* client-address hash buckets */
#define ADDR_LEN 16               /* bytes of an IPv6 address */

typedef struct client {
    struct client *next;
    int family;
    unsigned char addr[ADDR_LEN];
    unsigned open;                /* connections open from this address */
} client;

struct gc_conn {
    struct gc_conn *prev, *next;
    int fd;
    client *cl;                   /* NULL when the address could not be counted */
    char text[INET6_ADDRSTRLEN];  /* client address */
    _Atomic int phase;            /* enum gc_conn_phase */
    _Atomic uint64_t t0_ns;       /* when the phase began */
    const char *cut_reason;       /* set by the watchdog before the CUT phase is visible */
};

struct gc_conn_table {
    gc_conn_limits lim;
    pthread_mutex_t mu;
    pthread_cond_t wake;
    pthread_t watchdog;
    int stop;                     /* under mu */
    gc_conn *head;
    unsigned n_open;
    client *buckets[N_BUCKETS];
    gc_log_limiter log_global, log_client, log_header, log_body, log_send, log_idle;
};

static uint64_t now_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (uint64_t)ts.tv_sec * 1000000000u + (uint64_t)ts.tv_nsec;
}

/* ---- client addresses ------------------------------------------------------ */

/* The address bytes of a socket address; 0 when it is neither IPv4 nor IPv6. */
static int addr_key(const struct sockaddr *sa, int *family, unsigned char *key, size_t *len)
{
    if (!sa)
        return 0;
    if (sa->sa_family == AF_INET) {
        const struct sockaddr_in *s4 = (const struct sockaddr_in *)(const void *)sa;
        *family = AF_INET;
        *len = 4;
        memcpy(key, &s4->sin_addr, 4);
        return 1;
    }
    if (sa->sa_family == AF_INET6) {
        const struct sockaddr_in6 *s6 = (const struct sockaddr_in6 *)(const void *)sa;
        *family = AF_INET6;
        *len = 16;
        memcpy(key, &s6->sin6_addr, 16);
        return 1;
    }
    return 0;
}

static unsigned hash_key(int family, const unsigned char *key, size_t len)
{
    uint32_t h = 2166136261u ^ (uint32_t)family;   /* FNV-1a */
    for (size_t i = 0; i < len; i++)
        h = (h ^ key[i]) * 16777619u;
    return h % N_BUCKETS;
}

/* Finds (create = 1: or adds) the entry of an address; under t->mu. */
static client *client_find(gc_conn_table *t, const struct sockaddr *sa, int create)
{
    int family;
    unsigned char key[ADDR_LEN] = { 0 };
    size_t len;
    if (!addr_key(sa, &family, key, &len))
        return NULL;
    unsigned b = hash_key(family, key, len);
    for (client *c = t->buckets[b]; c; c = c->next)
        if (c->family == family && memcmp(c->addr, key, ADDR_LEN) == 0)
            return c;
    if (!create)
        return NULL;
    client *c = calloc(1, sizeof *c);
    if (!c)
        return NULL;
    c->family = family;
    memcpy(c->addr, key, ADDR_LEN);
    c->next = t->buckets[b];
    t->buckets[b] = c;
    return c;
}

static void client_release(gc_conn_table *t, client *cl)
{
    if (!cl || --cl->open > 0)
        return;
    unsigned b = hash_key(cl->family, cl->addr, cl->family == AF_INET ? 4 : 16);
    for (client **pp = &t->buckets[b]; *pp; pp = &(*pp)->next)
        if (*pp == cl) {
            *pp = cl->next;
            free(cl);
            return;
        }
}

static void addr_text(const struct sockaddr *sa, char *out, size_t len)
{
    out[0] = '\0';
    if (sa && sa->sa_family == AF_INET)
        inet_ntop(AF_INET, &((const struct sockaddr_in *)(const void *)sa)->sin_addr, out,
                  (socklen_t)len);
    else if (sa && sa->sa_family == AF_INET6)
        inet_ntop(AF_INET6, &((const struct sockaddr_in6 *)(const void *)sa)->sin6_addr, out,
                  (socklen_t)len);
}

/* ---- logging a limit that bit ------------------------------------------------ */

static void log_limit(gc_log_limiter *l, const char *limit, unsigned long long value,
                      const char *client_text, const char *what)
{
    unsigned long long held = 0;
    gc_metrics_error(limit);
    if (!gc_log_limiter_take(l, &held))
        return;
    GC_LOG(GC_LOG_WARN, "limit reached", GC_LF_STR("limit", limit), GC_LF_UINT("value", value),
           GC_LF_STR("client", client_text), GC_LF_STR("action", what),
           GC_LF_UINT("held_back", held));
}

/* ---- the accept policy and the table ------------------------------------------- */

int gc_conn_accept_ok(gc_conn_table *t, const struct sockaddr *addr, socklen_t addr_len)
{
    char text[INET6_ADDRSTRLEN];
    int ok = 1, which = 0;
    (void)addr_len;
    pthread_mutex_lock(&t->mu);
    if (t->n_open >= t->lim.max_connections) {
        ok = 0;
        which = 1;
    } else if (t->lim.max_per_client) {
        client *cl = client_find(t, addr, 0);
        if (cl && cl->open >= t->lim.max_per_client) {
            ok = 0;
            which = 2;
        }
    }
    pthread_mutex_unlock(&t->mu);
    if (!ok) {
        addr_text(addr, text, sizeof text);
        if (which == 1)
            log_limit(&t->log_global, "max_connections", t->lim.max_connections, text,
                      "connection refused");
        else
            log_limit(&t->log_client, "max_connections_per_client", t->lim.max_per_client, text,
                      "connection refused");
    }
    return ok;
}

gc_conn *gc_conn_open(gc_conn_table *t, int fd, const struct sockaddr *addr)
{
    gc_conn *c = calloc(1, sizeof *c);
    if (!c)
        return NULL;
    c->fd = fd;
    addr_text(addr, c->text, sizeof c->text);
    atomic_store(&c->t0_ns, now_ns());
    atomic_store(&c->phase, GC_PHASE_IDLE);
    pthread_mutex_lock(&t->mu);
    c->cl = client_find(t, addr, 1);
    if (c->cl)
        c->cl->open++;
    c->next = t->head;
    if (t->head)
        t->head->prev = c;
    t->head = c;
    t->n_open++;
    pthread_mutex_unlock(&t->mu);
    return c;
}

void gc_conn_close(gc_conn_table *t, gc_conn *c)
{
    if (!c)
        return;
    pthread_mutex_lock(&t->mu);
    if (c->prev)
        c->prev->next = c->next;
    else
        t->head = c->next;
    if (c->next)
        c->next->prev = c->prev;
    t->n_open--;
    client_release(t, c->cl);
    pthread_mutex_unlock(&t->mu);
    free(c);
}

int gc_conn_enter(gc_conn *c, enum gc_conn_phase to)
{
    if (!c)
        return 0;
    /* the start time first, the phase second: the watchdog reads the phase
     * first, so it never pairs a new phase with the old phase's start */
    atomic_store(&c->t0_ns, now_ns());
    int cur = atomic_load(&c->phase);
    for (;;) {
        if (cur == GC_PHASE_CUT)
            return -1;
        if (atomic_compare_exchange_weak(&c->phase, &cur, (int)to))
            return 0;
    }
}

const char *gc_conn_cut_reason(gc_conn *c)
{
    return (c && atomic_load(&c->phase) == GC_PHASE_CUT) ? c->cut_reason : NULL;
}

const char *gc_conn_client(const gc_conn *c)
{
    return c ? c->text : "";
}

unsigned gc_conn_count(gc_conn_table *t)
{
    pthread_mutex_lock(&t->mu);
    unsigned n = t->n_open;
    pthread_mutex_unlock(&t->mu);
    return n;
}

/* ---- the watchdog ------------------------------------------------------------------ */

/* Best effort: a 408 problem document, written only when nothing else waits
 * in the socket's send queue (libmicrohttpd may be sending its own answer). */
static void send_408(gc_conn_table *t, gc_conn *c, const char *limit, unsigned seconds)
{
    int queued = 0;
    if (ioctl(c->fd, SIOCOUTQ, &queued) != 0 || queued != 0)
        return;
    char detail[160], id[65] = "0", head[512];
    snprintf(detail, sizeof detail, "The request %s did not arrive within %u s (limit %s).",
             strcmp(limit, "header_timeout") == 0 ? "headers" : "body", seconds, limit);
    gc_api_response r;
    memset(&r, 0, sizeof r);
    if (gc_api_problem_limit(&r, 408, "timeout", "Request Timeout", detail, NULL, limit,
                             seconds) != 0 || !r.body)
        return;
    if (t->lim.new_id)
        t->lim.new_id(t->lim.id_cls, id, sizeof id);
    int n = snprintf(head, sizeof head, "HTTP/1.1 408 Request Timeout\r\nConnection: close\r\n"
                     "Content-Type: %s\r\nContent-Length: %zu\r\nX-Request-Id: %s\r\n"
                     "Cache-Control: no-store\r\nX-Content-Type-Options: nosniff\r\n\r\n",
                     r.content_type, r.body_len, id);
    if (n > 0 && (size_t)n < sizeof head && send(c->fd, head, (size_t)n, MSG_DONTWAIT | MSG_NOSIGNAL) == n)
        (void)!send(c->fd, r.body, r.body_len, MSG_DONTWAIT | MSG_NOSIGNAL);
    free(r.body);
}

/* One pass over the table; under t->mu. */
static void sweep(gc_conn_table *t)
{
    uint64_t now = now_ns();
    for (gc_conn *c = t->head; c; c = c->next) {
        int phase = atomic_load(&c->phase);
        uint64_t t0 = atomic_load(&c->t0_ns);
        unsigned limit_s;
        const char *limit;
        gc_log_limiter *lg;
        switch (phase) {
        case GC_PHASE_IDLE:
            limit_s = t->lim.idle_s;
            limit = "idle_timeout";
            lg = &t->log_idle;
            break;
        case GC_PHASE_HEAD:
            limit_s = t->lim.header_s;
            limit = "header_timeout";
            lg = &t->log_header;
            break;
        case GC_PHASE_BODY:
            limit_s = t->lim.idle_s;
            limit = "body_timeout";
            lg = &t->log_body;
            break;
        case GC_PHASE_SEND:
            limit_s = t->lim.idle_s;
            limit = "send_timeout";
            lg = &t->log_send;
            break;
        default:
            continue;   /* WORK: bounded by the cost budget; CUT: done */
        }
        if (now < t0 || now - t0 < (uint64_t)limit_s * 1000000000u)
            continue;
        c->cut_reason = limit;
        int expected = phase;
        if (!atomic_compare_exchange_strong(&c->phase, &expected, GC_PHASE_CUT))
            continue;   /* the request thread moved on first */
        if (phase == GC_PHASE_HEAD || phase == GC_PHASE_BODY)
            send_408(t, c, limit, limit_s);
        shutdown(c->fd, SHUT_RDWR);
        if (phase != GC_PHASE_IDLE)
            log_limit(lg, limit, limit_s, c->text, "connection closed");
        else
            gc_metrics_error(limit);   /* libmicrohttpd's own idle timeout does the same */
    }
}

static void *watchdog_main(void *arg)
{
    gc_conn_table *t = arg;
    pthread_mutex_lock(&t->mu);
    while (!t->stop) {
        struct timespec ts;
        clock_gettime(CLOCK_MONOTONIC, &ts);
        ts.tv_nsec += TICK_MS * 1000000L;
        if (ts.tv_nsec >= 1000000000L) {
            ts.tv_sec++;
            ts.tv_nsec -= 1000000000L;
        }
        pthread_cond_timedwait(&t->wake, &t->mu, &ts);
        if (!t->stop)
            sweep(t);
    }
    pthread_mutex_unlock(&t->mu);
    return NULL;
}

int gc_conn_table_new(const gc_conn_limits *lim, gc_conn_table **out)
{
    gc_conn_table *t = calloc(1, sizeof *t);
    pthread_condattr_t ca;
    *out = NULL;
    if (!t)
        return -1;
    t->lim = *lim;
    pthread_mutex_init(&t->mu, NULL);
    pthread_condattr_init(&ca);
    pthread_condattr_setclock(&ca, CLOCK_MONOTONIC);
    pthread_cond_init(&t->wake, &ca);
    pthread_condattr_destroy(&ca);
    if (pthread_create(&t->watchdog, NULL, watchdog_main, t) != 0) {
        pthread_cond_destroy(&t->wake);
        pthread_mutex_destroy(&t->mu);
        free(t);
        return -1;
    }
    *out = t;
    return 0;
}

void gc_conn_table_free(gc_conn_table *t)
{
    if (!t)
        return;
    pthread_mutex_lock(&t->mu);
    t->stop = 1;
    pthread_cond_signal(&t->wake);
    pthread_mutex_unlock(&t->mu);
    pthread_join(t->watchdog, NULL);
    for (size_t b = 0; b < N_BUCKETS; b++)
        while (t->buckets[b]) {
            client *c = t->buckets[b];
            t->buckets[b] = c->next;
            free(c);
        }
    while (t->head) {   /* none should be left; free defensively */
        gc_conn *c = t->head;
        t->head = c->next;
        free(c);
    }
    pthread_cond_destroy(&t->wake);
    pthread_mutex_destroy(&t->mu);
    free(t);
}
