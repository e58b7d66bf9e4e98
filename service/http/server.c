/*
 * server.c — the libmicrohttpd server: request life cycle, limits, CORS,
 * request ids, operational routes (/healthz, /readyz, /metrics), metrics and
 * the access log. The API layer's handlers are called through api.h only.
 *
 * Request life cycle (libmicrohttpd 0.9.75 calls us at these points):
 *   request line  on_uri (the URI log callback): the request context is made
 *             here, the raw target is parsed by query.c (our own limits and
 *             percent-decoding), and the connection enters its HEAD phase
 *             (conn.h: deadlines).
 *   headers   on_access, 1st call: the head is checked (sizes, framing, Host,
 *             Content-Length, Transfer-Encoding), then route, method, body
 *             limits and media type. A request that carries a body it must
 *             not send is answered at once (libmicrohttpd then closes the
 *             connection without reading the body); otherwise return MHD_YES
 *             without a response. Queuing on this first call would turn
 *             every response into "Connection: close" and defeat keep-alive.
 *   body      each chunk is appended up to --max-body (--max-recording-body on a
 *             route that takes a recording), with its bytes counted
 *             against --max-body-total; beyond either the rest is counted
 *             and discarded (chunked uploads have no length up front).
 *   last      (*upload_data_size == 0) route, run the handler, queue. A
 *             composite route (sweeps, targets, batch) is queued to work.c
 *             instead and the connection suspended; the worker resumes it
 *             and the next call queues the answer.
 *   completed on_completed: metrics, access log line, free the context.
 * The context is per request; nothing mutable is shared between threads
 * except the atomic metrics registry, the connection table (conn.c), the
 * composite queue (work.c) and the server's counters below.
 *
 * What libmicrohttpd 0.9.75 does not let us hook (its own fixed answers,
 * built in connection.c with no callback): a malformed request line, a header
 * line without a colon, a bad chunk size, an unsupported HTTP version (505),
 * an unparsable Content-Length (where 0.9.75 also writes its status line and
 * headers twice), and a head larger than the connection's memory. Those get
 * libmicrohttpd's short HTML answer with "Connection: close". Everything the
 * library passes on to us is answered here with a problem document.
 *
 * The query string is split and decoded by query.c, never by libmicrohttpd:
 * in 0.9.75 each query parameter takes a record from the connection's memory
 * before any callback can refuse it, and when that memory runs out the
 * library means to send 431 but overwrites its own state and sends nothing
 * (the connection hangs until --timeout). The URI log callback sees the
 * target before that parsing starts; it ends the query string there for
 * libmicrohttpd (one NUL after the '?', in the library's own buffer) and
 * keeps its own copy. This relies on the order of calls in 0.9.75's
 * parse_initial_message_line and is enabled only for the versions read
 * (HOOKED_VERSIONS below); any other version parses the query twice and
 * says so in the log at start-up.
 */
#include "http/conn.h"
#include "http/http.h"
#include "http/log.h"
#include "http/metrics.h"
#include "http/query.h"
#include "http/router.h"
#include "http/work.h"

#include <arpa/inet.h>
#include <errno.h>
#include <limits.h>
#include <microhttpd.h>
#include <netinet/in.h>
#include <pthread.h>
#include <stdatomic.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/random.h>
#include <sys/resource.h>
#include <sys/socket.h>
#include <time.h>
#include <unistd.h>

#ifndef GC_VERSION
#define GC_VERSION "0.0.0"
#endif
#ifndef GC_GIT_REV
#define GC_GIT_REV "unknown"
#endif

#define CT_JSON "application/json; charset=utf-8"
#define CT_METRICS "text/plain; version=0.0.4; charset=utf-8"
#define CT_TEXT "text/plain; charset=utf-8"
#define DEBUG_BODY_MAX 2048        /* bytes of a request body put in the log */
#define LOG_PATH_MAX 512           /* bytes of a path put in the log */
#define PREFLIGHT_MAX_AGE "600"    /* s a browser may cache a preflight answer */
#define CORS_ALLOW_HEADERS "Content-Type, Accept, X-Request-Id"

/* Request size limits: the longest request the API accepts. The longest GET
 * is a /v1/cycles/custom chain of 32 steps with every step field given (about
 * 7 KB of query); 16 KiB leaves room. Beyond these: 414 or 431 problems. */
#define MAX_TARGET_BYTES 16384     /* request target (path and query) */
#define MAX_QUERY_PARAMS 512       /* query parameters */
#define MAX_HEADER_BYTES 8192      /* header fields, names and values ("Name: value\r\n") */
#define MAX_HEADER_FIELDS 64       /* header field lines */
/* Per-connection memory of libmicrohttpd: the whole head must fit in it
 * (the request line and the header lines are parsed in place), plus a
 * 56-byte record per header field and the response's header lines. At the
 * limits above: 16 KiB + 40 B of request line, 8 KiB of fields, 64 x 56 B =
 * 3.5 KiB of records, about 1 KiB of response head: 28.6 KiB, inside 32 KiB.
 * (The query takes no records: see above.) A head larger than this memory
 * gets libmicrohttpd's own 414/431. libmicrohttpd zeroes this memory between
 * keep-alive requests, so its size is paid on every request. */
#define CONNECTION_POOL_BYTES (32 * 1024)
#define FD_RESERVE 64              /* descriptors kept for listen, epoll, pipes, logs */
#define DEFAULT_MAX_CONNECTIONS 1000
#define RESUME_WAIT_MS 5000        /* at stop: longest wait for suspended composites */

static const char *const HOOKED_VERSIONS[] = { "0.9.75", NULL };

struct gc_http_server {
    struct MHD_Daemon *daemon;
    gc_http_config cfg;
    gc_router router;
    unsigned port;                 /* bound port */
    atomic_int draining;           /* 1 after gc_http_server_quiesce() */
    atomic_int stopping;           /* 1 inside gc_http_server_stop() */
    atomic_int cancel;             /* raised at stop: budgets refuse further charges */
    uint64_t id_seed;              /* random, for generated request ids */
    atomic_ullong id_counter;
    int cut_query;                 /* 1: libmicrohttpd's query parsing is cut (see top) */
    gc_conn_table *conns;
    gc_work *work;
    pthread_mutex_t work_mu;       /* guards work against gc_http_server_stop */
    int work_closed;               /* under work_mu */
    atomic_ullong body_bytes;      /* bytes reserved for request bodies now */
    atomic_int suspended;          /* connections suspended and not yet resumed */
    atomic_long requests_cut;      /* requests ended unanswered while stopping */
    gc_log_limiter log_body_total, log_queue, log_budget;
};

/* Problems the HTTP layer detects itself. */
enum early_problem {
    EP_NONE = 0, EP_NOT_FOUND, EP_METHOD, EP_TOO_LARGE, EP_MEDIA_TYPE,
    EP_TARGET_TOO_LONG, EP_TOO_MANY_PARAMS, EP_NUL_IN_PATH, EP_NUL_IN_QUERY,
    EP_HEADERS_TOO_LARGE, EP_TOO_MANY_HEADERS, EP_NO_HOST, EP_HOST_REPEATED,
    EP_LENGTH_CONFLICT, EP_LENGTH_AND_CHUNKED, EP_TRANSFER_CODING, EP_BODY_MEMORY,
    EP_QUEUE_FULL, EP_NO_MEMORY
};

enum job_state { JOB_NONE = 0, JOB_QUEUED, JOB_DONE };

typedef struct req_ctx {
    gc_http_server *srv;
    struct MHD_Connection *mhd;
    gc_conn *conn;                 /* connection record (may be NULL) */
    uint64_t t0_ns;                /* CLOCK_MONOTONIC when the request line arrived */
    gc_http_target target;         /* path and query, parsed by query.c */
    int first_done;                /* the headers call has happened */
    const gc_route *route;         /* NULL: no route for the path */
    unsigned method_bit;           /* GC_M_* or 0 for other methods */
    enum gc_metrics_method mm;
    const char *method;            /* static name or method_buf */
    char method_buf[16];
    char request_id[65];
    enum early_problem problem;
    int must_close;                /* answer with Connection: close (framing errors) */
    int answered_early;            /* response queued on the first call */
    int timed_out;                 /* body took longer than --timeout */
    char *body;                    /* malloc'd request body */
    size_t body_len, body_cap;     /* bytes */
    unsigned long long reserved;   /* bytes counted against --max-body-total */
    unsigned long long received;   /* body bytes received so far */
    unsigned long long discarded;  /* bytes dropped beyond a limit */
    unsigned long long declared;   /* Content-Length, 0 when none */
    unsigned retry_after;          /* s, for a 503 */
    int status;                    /* status sent, 0 = none yet */
    size_t bytes;                  /* response body bytes */
    const char *error_class;       /* for the log */
    gc_api_param path_params[GC_API_MAX_PATH_PARAMS];
    size_t n_path_params;
    /* a composite job (work.c) */
    gc_work_job job;
    atomic_int job_state;          /* enum job_state */
    gc_api_request q;
    gc_api_budget budget;
    gc_api_response jr;
    int job_rc;
    char *content_type;            /* copy for the job */
    char *accept;                  /* copy for the job */
} req_ctx;

/* ---- small helpers -------------------------------------------------------- */

static uint64_t now_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (uint64_t)ts.tv_sec * 1000000000u + (uint64_t)ts.tv_nsec;
}

static uint64_t mix64(uint64_t x)   /* splitmix64 finaliser (Steele et al. 2014) */
{
    x += 0x9e3779b97f4a7c15ull;
    x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ull;
    x = (x ^ (x >> 27)) * 0x94d049bb133111ebull;
    return x ^ (x >> 31);
}

/* An incoming id is echoed when it is 1..64 characters of [A-Za-z0-9._:-]. */
static int sane_request_id(const char *s)
{
    size_t n = 0;
    if (!s)
        return 0;
    for (; s[n]; n++) {
        char c = s[n];
        if (n >= 64)
            return 0;
        if (!((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
              c == '.' || c == '_' || c == ':' || c == '-'))
            return 0;
    }
    return n > 0;
}

static void new_request_id(void *cls, char *out, size_t len)
{
    gc_http_server *srv = cls;
    uint64_t n = atomic_fetch_add_explicit(&srv->id_counter, 1, memory_order_relaxed);
    snprintf(out, len, "%016llx", (unsigned long long)mix64(srv->id_seed ^ (n * 0xd1b54a32d192ed03ull)));
}

static void classify_method(req_ctx *x, const char *m)
{
    static const struct { const char *name; unsigned bit; enum gc_metrics_method mm; } known[] = {
        { "GET", GC_M_GET, GC_MM_GET }, { "HEAD", GC_M_HEAD, GC_MM_HEAD },
        { "POST", GC_M_POST, GC_MM_POST }, { "OPTIONS", GC_M_OPTIONS, GC_MM_OPTIONS },
    };
    for (size_t i = 0; i < sizeof known / sizeof known[0]; i++)
        if (strcmp(m, known[i].name) == 0) {
            x->method = known[i].name;
            x->method_bit = known[i].bit;
            x->mm = known[i].mm;
            return;
        }
    snprintf(x->method_buf, sizeof x->method_buf, "%s", m);
    x->method = x->method_buf;
    x->method_bit = 0;
    x->mm = GC_MM_OTHER;
}

/* Media type of a Content-Type value is JSON: application/json or any
 * "+json" structured syntax suffix (RFC 6839), parameters ignored. */
static int is_json_media_type(const char *ct)
{
    size_t n = strcspn(ct, ";");
    while (n > 0 && (ct[n - 1] == ' ' || ct[n - 1] == '\t'))
        n--;
    while (n > 0 && (*ct == ' ' || *ct == '\t')) {
        ct++;
        n--;
    }
    if (n == 16 && strncasecmp(ct, "application/json", 16) == 0)
        return 1;
    return n > 5 && strncasecmp(ct, "application/", 12) == 0 &&
           strncasecmp(ct + n - 5, "+json", 5) == 0;
}

/* Copies s for a problem detail: printable ASCII only, at most max bytes. */
static void printable(char *out, size_t out_len, const char *s, size_t max)
{
    size_t j = 0;
    for (size_t i = 0; s[i] && j + 4 < out_len; i++) {
        if (i >= max) {
            memcpy(out + j, "...", 3);
            j += 3;
            break;
        }
        unsigned char c = (unsigned char)s[i];
        out[j++] = (c >= 0x20 && c < 0x7f) ? (char)c : '?';
    }
    out[j] = '\0';
}

static const char *origin_allowed(const gc_http_server *srv, const char *origin)
{
    if (!origin || !*origin)
        return NULL;
    if (srv->cfg.cors_any)
        return "*";
    for (size_t i = 0; i < srv->cfg.n_origins; i++)
        if (strcasecmp(origin, srv->cfg.origins[i]) == 0)
            return origin;
    return NULL;
}

static void log_limit(gc_log_limiter *l, const char *limit, unsigned long long value,
                      const req_ctx *x)
{
    unsigned long long held = 0;
    if (!gc_log_limiter_take(l, &held))
        return;
    GC_LOG(GC_LOG_WARN, "limit reached", GC_LF_STR("limit", limit), GC_LF_UINT("value", value),
           GC_LF_STR("client", gc_conn_client(x->conn)), GC_LF_STR("request_id", x->request_id),
           GC_LF_STR("route", x->route ? x->route->name : "unmatched"),
           GC_LF_UINT("held_back", held));
}

/* ---- request body memory (--max-body-total) --------------------------------- */

static int reserve_body(gc_http_server *srv, req_ctx *x, unsigned long long n)
{
    unsigned long long cur = atomic_load(&srv->body_bytes);
    do {
        if (n > srv->cfg.max_body_total || cur > srv->cfg.max_body_total - n)
            return -1;
    } while (!atomic_compare_exchange_weak(&srv->body_bytes, &cur, cur + n));
    x->reserved += n;
    return 0;
}

static void release_body(gc_http_server *srv, req_ctx *x)
{
    if (x->reserved)
        atomic_fetch_sub(&srv->body_bytes, x->reserved);
    x->reserved = 0;
}

/* The body limit of the request's route: --max-recording-body for a route
 * that takes a recording (GC_ROUTE_LARGE_BODY), else --max-body. */
static size_t body_limit(const gc_http_server *srv, const req_ctx *x)
{
    if (x->route && (x->route->flags & GC_ROUTE_LARGE_BODY))
        return srv->cfg.max_recording_body;
    return srv->cfg.max_body;
}

/* Media type of a Content-Type value is text/csv (parameters ignored). */
static int is_csv_media_type(const char *ct)
{
    while (*ct == ' ' || *ct == '\t')
        ct++;
    size_t n = strcspn(ct, "; \t");
    return n == 8 && strncasecmp(ct, "text/csv", 8) == 0;
}

/* ---- libmicrohttpd callbacks ---------------------------------------------- */

/* The path and the query are decoded by query.c from the raw target; what
 * libmicrohttpd hands on_access as its url is not used. */
static size_t unescape_none(void *cls, struct MHD_Connection *c, char *s)
{
    (void)cls;
    (void)c;
    return strlen(s);
}

static void mhd_logger(void *cls, const char *fmt, va_list ap)
{
    char buf[512];
    (void)cls;
    vsnprintf(buf, sizeof buf, fmt, ap);
    size_t n = strlen(buf);
    while (n > 0 && (buf[n - 1] == '\n' || buf[n - 1] == '\r'))
        buf[--n] = '\0';
    GC_LOG(GC_LOG_DEBUG, "libmicrohttpd", GC_LF_STR("detail", buf));
}

static enum MHD_Result accept_policy(void *cls, const struct sockaddr *addr, socklen_t len)
{
    gc_http_server *srv = cls;
    return gc_conn_accept_ok(srv->conns, addr, len) ? MHD_YES : MHD_NO;
}

static void on_connection(void *cls, struct MHD_Connection *c, void **socket_context,
                          enum MHD_ConnectionNotificationCode code)
{
    gc_http_server *srv = cls;
    if (code == MHD_CONNECTION_NOTIFY_STARTED) {
        const union MHD_ConnectionInfo *fd = MHD_get_connection_info(c, MHD_CONNECTION_INFO_CONNECTION_FD);
        const union MHD_ConnectionInfo *ad = MHD_get_connection_info(c, MHD_CONNECTION_INFO_CLIENT_ADDRESS);
        *socket_context = fd ? gc_conn_open(srv->conns, fd->connect_fd, ad ? ad->client_addr : NULL)
                             : NULL;
    } else {
        gc_conn_close(srv->conns, *socket_context);
        *socket_context = NULL;
    }
}

/* The request line has arrived (libmicrohttpd has not split the query yet). */
static void *on_uri(void *cls, const char *uri, struct MHD_Connection *c)
{
    gc_http_server *srv = cls;
    req_ctx *x = calloc(1, sizeof *x);
    const union MHD_ConnectionInfo *sc = MHD_get_connection_info(c, MHD_CONNECTION_INFO_SOCKET_CONTEXT);
    gc_conn *conn = sc ? sc->socket_context : NULL;
    size_t len = strlen(uri);
    if (x) {
        x->srv = srv;
        x->mhd = c;
        x->conn = conn;
        x->t0_ns = now_ns();
        gc_http_target_parse(uri, len, MAX_TARGET_BYTES, MAX_QUERY_PARAMS, &x->target);
    }
    if (srv->cut_query) {
        /* Our copy is made: end the query for libmicrohttpd, which parses
         * from the byte after the '?' to the next NUL (see the top of this
         * file). */
        char *q = memchr(uri, '?', len);
        if (q && q[1] != '\0')
            q[1] = '\0';
    }
    if (gc_conn_enter(conn, GC_PHASE_HEAD) != 0 && x)
        x->timed_out = 1;   /* cut while idle (draining); on_access refuses */
    return x;
}

/* Adds the headers every response carries, then queues it. */
static enum MHD_Result send_response(gc_http_server *srv, struct MHD_Connection *c,
                                     req_ctx *x, gc_api_response *r, const char *allow,
                                     int preflight)
{
    struct MHD_Response *resp;
    char cache[48];

    if (r->body && r->body_len > 0) {
        resp = MHD_create_response_from_buffer(r->body_len, r->body, MHD_RESPMEM_MUST_FREE);
        if (!resp) {
            free(r->body);
            r->body = NULL;
            return MHD_NO;
        }
    } else {
        free(r->body);
        r->body = NULL;
        r->body_len = 0;
        resp = MHD_create_response_from_buffer(0, NULL, MHD_RESPMEM_PERSISTENT);
        if (!resp)
            return MHD_NO;
    }
    r->body = NULL;   /* owned by libmicrohttpd now */

    if (r->status != MHD_HTTP_NO_CONTENT)
        MHD_add_response_header(resp, MHD_HTTP_HEADER_CONTENT_TYPE,
                                r->content_type ? r->content_type : CT_TEXT);
    MHD_add_response_header(resp, "X-Request-Id", x->request_id);
    if (r->cache_seconds > 0 && r->status < 400) {
        snprintf(cache, sizeof cache, "max-age=%d", r->cache_seconds);
        MHD_add_response_header(resp, MHD_HTTP_HEADER_CACHE_CONTROL, cache);
    } else {
        MHD_add_response_header(resp, MHD_HTTP_HEADER_CACHE_CONTROL, "no-store");
    }
    MHD_add_response_header(resp, "X-Content-Type-Options", "nosniff");
    if (allow)
        MHD_add_response_header(resp, MHD_HTTP_HEADER_ALLOW, allow);
    if (r->status == 503 && x->retry_after > 0) {
        char ra[16];
        snprintf(ra, sizeof ra, "%u", x->retry_after);
        MHD_add_response_header(resp, MHD_HTTP_HEADER_RETRY_AFTER, ra);
    }

    if (srv->cfg.cors_any || srv->cfg.n_origins > 0) {
        const char *origin = MHD_lookup_connection_value(c, MHD_HEADER_KIND, "Origin");
        const char *ok = origin_allowed(srv, origin);
        if (!srv->cfg.cors_any)
            MHD_add_response_header(resp, MHD_HTTP_HEADER_VARY, "Origin");
        if (ok) {
            MHD_add_response_header(resp, "Access-Control-Allow-Origin", ok);
            if (preflight) {
                MHD_add_response_header(resp, "Access-Control-Allow-Methods", allow ? allow : "");
                MHD_add_response_header(resp, "Access-Control-Allow-Headers", CORS_ALLOW_HEADERS);
                MHD_add_response_header(resp, "Access-Control-Max-Age", PREFLIGHT_MAX_AGE);
            } else {
                MHD_add_response_header(resp, "Access-Control-Expose-Headers",
                                        "X-Request-Id, Retry-After");
            }
        }
    }
    if (x->must_close || atomic_load_explicit(&srv->draining, memory_order_relaxed))
        MHD_add_response_header(resp, MHD_HTTP_HEADER_CONNECTION, "close");

    x->status = r->status;
    x->bytes = r->body_len;
    x->error_class = r->error_class;
    if (r->error_class)
        gc_metrics_error(r->error_class);
    if (r->status < 400 && x->route)
        for (int i = 0; i < r->n_evaluated; i++)
            gc_metrics_evaluations(r->evaluated[i].preset, x->route->name, r->evaluated[i].n);

    if (gc_conn_enter(x->conn, GC_PHASE_SEND) != 0) {
        MHD_destroy_response(resp);
        x->status = 0;
        return MHD_NO;
    }
    enum MHD_Result ret = MHD_queue_response(c, (unsigned)r->status, resp);
    MHD_destroy_response(resp);
    if (ret != MHD_YES)
        x->status = 0;
    return ret;
}

/* The problem document for the request's header fields and framing. */
static int header_problem(enum early_problem problem, gc_api_response *r)
{
    char detail[512];
    switch (problem) {
    case EP_HEADERS_TOO_LARGE:
        snprintf(detail, sizeof detail, "The header fields take more than %d bytes.",
                 MAX_HEADER_BYTES);
        return gc_api_problem_limit(r, 431, "header_too_large", "Request Header Fields Too Large",
                                    detail, NULL, "max_header_bytes", MAX_HEADER_BYTES);
    case EP_TOO_MANY_HEADERS:
        snprintf(detail, sizeof detail, "The request has more than %d header fields.",
                 MAX_HEADER_FIELDS);
        return gc_api_problem_limit(r, 431, "header_too_large", "Request Header Fields Too Large",
                                    detail, NULL, "max_header_fields", MAX_HEADER_FIELDS);
    case EP_NO_HOST:
        return gc_api_problem(r, 400, "malformed", "Bad Request", "An HTTP/1.1 request must "
                              "carry a Host header field (RFC 9112, section 3.2).", NULL);
    case EP_HOST_REPEATED:
        return gc_api_problem(r, 400, "malformed", "Bad Request", "The request carries more than "
                              "one Host header field (RFC 9112, section 3.2).", NULL);
    case EP_LENGTH_CONFLICT:
        return gc_api_problem(r, 400, "malformed", "Bad Request", "The request carries "
                              "Content-Length header fields with different values, so its "
                              "length cannot be known (RFC 9112, section 6.3).", NULL);
    case EP_LENGTH_AND_CHUNKED:
        return gc_api_problem(r, 400, "malformed", "Bad Request", "The request carries both "
                              "Content-Length and Transfer-Encoding; send one of them (RFC 9112, "
                              "section 6.3).", NULL);
    case EP_TRANSFER_CODING:
        return gc_api_problem(r, 400, "malformed", "Bad Request", "The only transfer coding "
                              "accepted for a request body is \"chunked\" (RFC 9112, section "
                              "6.1).", NULL);
    default:
        break;
    }
    return -1;
}

/* The problem document for a body too large for the route, or of a media
 * type it does not take. */
static int body_problem(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                        gc_api_response *r)
{
    char detail[512];
    if (x->problem == EP_TOO_LARGE) {
        int rec = x->route && (x->route->flags & GC_ROUTE_LARGE_BODY);
        snprintf(detail, sizeof detail,
                 "The request body is larger than the limit of %zu bytes (server flag %s).",
                 body_limit(srv, x), rec ? "--max-recording-body" : "--max-body");
        return gc_api_problem_limit(r, 413, "too_large", "Content Too Large", detail, NULL,
                                    rec ? "max_recording_body" : "max_body", body_limit(srv, x));
    }
    const char *ct = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
    char got[96];
    int csv = x->route && (x->route->flags & GC_ROUTE_CSV_BODY);
    if (ct)
        printable(got, sizeof got, ct, 80);
    snprintf(detail, sizeof detail,
             "A POST body must be JSON sent with Content-Type: application/json%s (this request %s%s%s). "
             "Form fields and spreadsheet web queries can use GET with the same fields as query parameters.",
             csv ? ", or a recording sent with Content-Type: text/csv" : "",
             ct ? "sent \"" : "had no Content-Type", ct ? got : "", ct ? "\"" : "");
    return gc_api_problem(r, 415, "media_type", "Unsupported Media Type", detail, NULL);
}

/* The problem document for a condition the HTTP layer detected; fills r. */
static int build_problem(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                         gc_api_response *r, const char **allow)
{
    char detail[512], path[160], field[128];
    printable(path, sizeof path, x->target.path, 120);
    switch (x->problem) {
    case EP_NOT_FOUND:
        snprintf(detail, sizeof detail,
                 "No resource at %s; /openapi.json lists the routes of this service.", path);
        return gc_api_problem(r, 404, "not_found", "Not Found", detail, NULL);
    case EP_METHOD:
        *allow = x->route->allow;
        snprintf(detail, sizeof detail, "%s is not allowed on %s; allowed methods: %s.",
                 x->method_bit ? x->method : "This method", path, *allow);
        return gc_api_problem(r, 405, "method_not_allowed", "Method Not Allowed", detail, NULL);
    case EP_TOO_LARGE:
    case EP_MEDIA_TYPE:
        return body_problem(srv, c, x, r);
    case EP_TARGET_TOO_LONG:
        snprintf(detail, sizeof detail, "The request target (path and query) is %zu bytes; at most "
                 "%d are accepted. Send long inputs as a POST with a JSON body.",
                 x->target.raw_len, MAX_TARGET_BYTES);
        return gc_api_problem_limit(r, 414, "uri_too_long", "URI Too Long", detail, NULL,
                                    "max_target_bytes", MAX_TARGET_BYTES);
    case EP_TOO_MANY_PARAMS:
        snprintf(detail, sizeof detail, "The query string has %zu parameters; at most %d are "
                 "accepted. Send long inputs as a POST with a JSON body.", x->target.counted,
                 MAX_QUERY_PARAMS);
        return gc_api_problem_limit(r, 414, "uri_too_long", "URI Too Long", detail, NULL,
                                    "max_query_parameters", MAX_QUERY_PARAMS);
    case EP_NUL_IN_PATH:
        snprintf(detail, sizeof detail, "No resource at %s: the path holds an encoded NUL "
                 "(%%00), which no resource name contains (it is not read as the end of the "
                 "path).", path);
        return gc_api_problem(r, 404, "not_found", "Not Found", detail, NULL);
    case EP_NUL_IN_QUERY: {
        char key[GC_TARGET_KEY_SHOWN + 8];
        printable(key, sizeof key, x->target.bad_key, GC_TARGET_KEY_SHOWN - 1);
        gc_http_key_pointer(x->target.bad_key, field, sizeof field);
        snprintf(detail, sizeof detail, "Query parameter '%s' holds an encoded NUL (%%00); a value "
                 "is never read up to a NUL and the rest dropped. Remove the %%00.", key);
        return gc_api_problem(r, 400, "malformed", "Bad Request", detail, field);
    }
    case EP_HEADERS_TOO_LARGE: case EP_TOO_MANY_HEADERS: case EP_NO_HOST:
    case EP_HOST_REPEATED: case EP_LENGTH_CONFLICT: case EP_LENGTH_AND_CHUNKED:
    case EP_TRANSFER_CODING:
        return header_problem(x->problem, r);
    case EP_BODY_MEMORY:
        x->retry_after = 1;
        snprintf(detail, sizeof detail, "The server holds its limit of %zu bytes of request "
                 "bodies already (--max-body-total); try again shortly.", srv->cfg.max_body_total);
        return gc_api_problem_limit(r, 503, "overloaded", "Service Unavailable", detail, NULL,
                                    "max_body_total", srv->cfg.max_body_total);
    case EP_QUEUE_FULL:
        snprintf(detail, sizeof detail, "%u composite requests (sweeps, targets, batch) wait "
                 "already (--composite-queue); try again in %u s. Single evaluations and the "
                 "health routes are answered meanwhile.", srv->cfg.composite_queue, x->retry_after);
        return gc_api_problem_limit(r, 503, "overloaded", "Service Unavailable", detail, NULL,
                                    "composite_queue", srv->cfg.composite_queue);
    case EP_NO_MEMORY:
        x->retry_after = 1;
        return gc_api_problem(r, 503, "overloaded", "Service Unavailable", "The server is short "
                              "of memory; try again shortly.", NULL);
    case EP_NONE:
        break;
    }
    return -1;
}

static enum MHD_Result send_problem(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x)
{
    gc_api_response r;
    const char *allow = NULL;
    memset(&r, 0, sizeof r);
    if (build_problem(srv, c, x, &r, &allow) != 0 || !r.body) {
        free(r.body);
        return MHD_NO;
    }
    return send_response(srv, c, x, &r, allow, 0);
}

static int op_healthz(gc_api_response *r)
{
    static const char body[] = "{\"status\":\"ok\"}";
    r->status = 200;
    r->content_type = CT_JSON;
    r->body = malloc(sizeof body - 1);
    if (!r->body)
        return -1;
    memcpy(r->body, body, sizeof body - 1);
    r->body_len = sizeof body - 1;
    return 0;
}

static int op_readyz(const gc_http_server *srv, gc_api_response *r)
{
    static const char ready[] = "{\"status\":\"ready\"}";
    static const char drain[] = "{\"status\":\"draining\"}";
    int draining = atomic_load_explicit(&srv->draining, memory_order_relaxed);
    const char *b = draining ? drain : ready;
    size_t n = draining ? sizeof drain - 1 : sizeof ready - 1;
    r->status = draining ? 503 : 200;
    r->content_type = CT_JSON;
    r->body = malloc(n);
    if (!r->body)
        return -1;
    memcpy(r->body, b, n);
    r->body_len = n;
    return 0;
}

static int op_metrics(gc_api_response *r)
{
    size_t len = 0;
    r->status = 200;
    r->content_type = CT_METRICS;
    r->body = gc_metrics_render(&len);
    if (!r->body)
        return -1;
    r->body_len = len;
    return 0;
}

/* ---- API handlers, inline or as composite jobs ------------------------------ */

static void budget_init(gc_http_server *srv, gc_api_budget *b)
{
    memset(b, 0, sizeof *b);
    b->max_evaluations = srv->cfg.max_evaluations;
    b->deadline_ns = srv->cfg.max_request_ms ? now_ns() + srv->cfg.max_request_ms * 1000000ull : 0;
    b->cancel = &srv->cancel;
    b->threads = srv->cfg.threads;
}

/* Replaces a handler's answer when the budget refused a charge. Returns 0,
 * or -1 when memory ran out. */
static int budget_answer(gc_http_server *srv, req_ctx *x, const gc_api_budget *b,
                         gc_api_response *r)
{
    char detail[320];
    if (b->exceeded == GC_API_BUDGET_OK)
        return 0;
    free(r->body);
    memset(r, 0, sizeof *r);
    switch (b->exceeded) {
    case GC_API_BUDGET_EVALUATIONS:
        snprintf(detail, sizeof detail, "The request needs more than %lu evaluations, the limit "
                 "per request (--max-evaluations). Ask for fewer points or items, or split it.",
                 srv->cfg.max_evaluations);
        log_limit(&srv->log_budget, "max_evaluations", srv->cfg.max_evaluations, x);
        return gc_api_problem_limit(r, 422, "budget_exceeded", "Unprocessable Content", detail,
                                    NULL, "max_evaluations", srv->cfg.max_evaluations);
    case GC_API_BUDGET_TIME:
        x->retry_after = 1;
        snprintf(detail, sizeof detail, "The request did not finish within %lu ms, the limit per "
                 "request (--max-request-ms), after %lu evaluations. Ask for fewer points or "
                 "items, or retry when the server is less busy.", srv->cfg.max_request_ms,
                 b->evaluations);
        log_limit(&srv->log_budget, "max_request_ms", srv->cfg.max_request_ms, x);
        return gc_api_problem_limit(r, 503, "budget_exceeded", "Service Unavailable", detail,
                                    NULL, "max_request_ms", srv->cfg.max_request_ms);
    default:
        x->retry_after = 1;
        x->must_close = 1;
        return gc_api_problem(r, 503, "overloaded", "Service Unavailable", "The server is "
                              "shutting down; send the request again (another replica will "
                              "answer).", NULL);
    }
}

/* Sends what an API handler produced (rc, r). */
static enum MHD_Result finish_api(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                                  int rc, gc_api_response *r, const gc_api_budget *b)
{
    if (r->status < 100 || r->status > 599) {
        GC_LOG(GC_LOG_ERROR, "handler returned an invalid status",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name),
               GC_LF_INT("status", r->status));
        free(r->body);
        return MHD_NO;
    }
    rc = (rc != 0 && !r->body) ? -1 : 0;
    if (rc == 0 && budget_answer(srv, x, b, r) != 0)
        rc = -1;
    if (rc != 0 || !r->body) {
        GC_LOG(GC_LOG_ERROR, "out of memory building a response",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name));
        free(r->body);
        return MHD_NO;   /* closes the connection: never a 5xx */
    }
    if (r->status >= 500 && r->status != 503)
        GC_LOG(GC_LOG_ERROR, "handler answered with a server error",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name),
               GC_LF_INT("status", r->status));
    return send_response(srv, c, x, r, NULL, 0);
}

static void build_api_request(struct MHD_Connection *c, req_ctx *x, gc_api_request *q)
{
    memset(q, 0, sizeof *q);
    q->method = (x->method_bit == GC_M_HEAD) ? GC_M_GET : x->method_bit;
    q->path = x->target.path;
    q->query = x->target.params;
    q->n_query = x->target.n_params;
    memcpy(q->path_params, x->path_params, sizeof q->path_params);
    q->n_path_params = x->n_path_params;
    if (x->method_bit == GC_M_POST && x->body_len > 0) {
        q->body = x->body;
        q->body_len = x->body_len;
    }
    q->content_type = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
    q->accept = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_ACCEPT);
    q->request_id = x->request_id;
}

/* On a composite worker: runs the handler, then resumes the connection
 * (after which x may be freed by another thread at any moment: a client
 * that went away meanwhile gets no further call of on_access). */
static void run_job(gc_work_job *job)
{
    req_ctx *x = (req_ctx *)(void *)((char *)job - offsetof(req_ctx, job));
    struct MHD_Connection *c = x->mhd;
    gc_http_server *srv = x->srv;
    memset(&x->jr, 0, sizeof x->jr);
    x->job_rc = gc_api_call(x->route->handler, &x->q, &x->jr);
    atomic_store(&x->job_state, JOB_DONE);
    MHD_resume_connection(c);
    atomic_fetch_sub(&srv->suspended, 1);   /* libmicrohttpd may stop from now on */
}

/* Queues a composite request; 0 when queued (the connection is suspended). */
static int submit_job(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x)
{
    build_api_request(c, x, &x->q);
    if (x->q.content_type) {
        x->content_type = strdup(x->q.content_type);
        if (!x->content_type) {
            x->problem = EP_NO_MEMORY;
            return -1;
        }
        x->q.content_type = x->content_type;
    }
    if (x->q.accept) {
        x->accept = strdup(x->q.accept);
        if (!x->accept) {
            x->problem = EP_NO_MEMORY;
            return -1;
        }
        x->q.accept = x->accept;
    }
    x->job.run = run_job;
    /* the time budget counts from here: a job that waited too long for a
     * worker stops at its first evaluation (503), so no answer takes much
     * longer than --max-request-ms */
    budget_init(srv, &x->budget);
    x->q.budget = &x->budget;
    atomic_store(&x->job_state, JOB_QUEUED);
    pthread_mutex_lock(&srv->work_mu);
    int rc = -1;
    if (!srv->work_closed) {
        MHD_suspend_connection(c);
        atomic_fetch_add(&srv->suspended, 1);
        rc = gc_work_submit(srv->work, &x->job, &x->retry_after);
        if (rc != 0) {
            MHD_resume_connection(c);
            atomic_fetch_sub(&srv->suspended, 1);
        }
    } else {
        x->retry_after = 1;
    }
    pthread_mutex_unlock(&srv->work_mu);
    if (rc != 0) {
        atomic_store(&x->job_state, JOB_NONE);
        x->problem = EP_QUEUE_FULL;
        log_limit(&srv->log_queue, "composite_queue", srv->cfg.composite_queue, x);
    }
    return rc;
}

/* The last call: everything is received. */
static enum MHD_Result respond(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x)
{
    gc_api_response r;
    int rc;

    if (x->problem == EP_NONE && x->discarded > 0)
        x->problem = x->received > body_limit(srv, x) ? EP_TOO_LARGE : EP_BODY_MEMORY;
    if (x->problem == EP_BODY_MEMORY)
        log_limit(&srv->log_body_total, "max_body_total", srv->cfg.max_body_total, x);
    if (x->problem != EP_NONE)
        return send_problem(srv, c, x);

    memset(&r, 0, sizeof r);
    if (x->method_bit == GC_M_OPTIONS) {
        r.status = 204;
        return send_response(srv, c, x, &r, x->route ? x->route->allow : "GET, HEAD, POST, OPTIONS", 1);
    }

    switch (x->route->op) {
    case GC_OP_HEALTHZ:
        rc = op_healthz(&r);
        break;
    case GC_OP_READYZ:
        rc = op_readyz(srv, &r);
        break;
    case GC_OP_METRICS:
        rc = op_metrics(&r);
        break;
    case GC_OP_API:
    default:
        if (x->route->composite) {
            if (submit_job(srv, c, x) == 0)
                return MHD_YES;   /* suspended; the worker resumes us */
            return send_problem(srv, c, x);
        } else {
            gc_api_request q;
            gc_api_budget b;
            build_api_request(c, x, &q);
            budget_init(srv, &b);
            q.budget = &b;
            rc = gc_api_call(x->route->handler, &q, &r);
            return finish_api(srv, c, x, rc, &r, &b);
        }
    }
    if (rc != 0) {
        GC_LOG(GC_LOG_ERROR, "out of memory building a response",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name));
        free(r.body);
        return MHD_NO;   /* closes the connection: never a 5xx */
    }
    return send_response(srv, c, x, &r, NULL, 0);
}

/* ---- the head: sizes and framing (RFC 9110, RFC 9112) ------------------------ */

typedef struct head_scan {
    size_t fields, bytes;
    int hosts, lengths, length_conflict, transfer;
    const char *length, *te;
    size_t length_len;
} head_scan;

static enum MHD_Result scan_header(void *cls, enum MHD_ValueKind kind, const char *key,
                                   size_t key_size, const char *value, size_t value_size)
{
    head_scan *h = cls;
    (void)kind;
    h->fields++;
    h->bytes += key_size + value_size + 4;   /* "Name: value\r\n" */
    if (key_size == 4 && strncasecmp(key, "Host", 4) == 0) {
        h->hosts++;
    } else if (key_size == 14 && strncasecmp(key, "Content-Length", 14) == 0) {
        if (h->lengths && (value_size != h->length_len || memcmp(value, h->length, value_size) != 0))
            h->length_conflict = 1;
        if (!h->lengths) {
            h->length = value;
            h->length_len = value_size;
        }
        h->lengths++;
    } else if (key_size == 17 && strncasecmp(key, "Transfer-Encoding", 17) == 0) {
        h->transfer++;
        h->te = value;
    }
    return MHD_YES;
}

/* Checks the head; returns the problem (EP_NONE when fine). */
static enum early_problem check_head(struct MHD_Connection *c, req_ctx *x, const char *version,
                                     int *chunked)
{
    head_scan h;
    memset(&h, 0, sizeof h);
    switch (x->target.problem) {
    case GC_TARGET_TOO_LONG: return EP_TARGET_TOO_LONG;
    case GC_TARGET_TOO_MANY_PARAMS: return EP_TOO_MANY_PARAMS;
    case GC_TARGET_NUL_IN_PATH: return EP_NUL_IN_PATH;
    case GC_TARGET_NUL_IN_QUERY: return EP_NUL_IN_QUERY;
    case GC_TARGET_NO_MEMORY: return EP_NO_MEMORY;
    case GC_TARGET_OK: break;
    }
    MHD_get_connection_values_n(c, MHD_HEADER_KIND, scan_header, &h);
    if (h.bytes > MAX_HEADER_BYTES)
        return EP_HEADERS_TOO_LARGE;
    if (h.fields > MAX_HEADER_FIELDS)
        return EP_TOO_MANY_HEADERS;
    if (h.hosts > 1)
        return EP_HOST_REPEATED;
    if (h.hosts == 0 && version && strcmp(version, "HTTP/1.0") != 0)
        return EP_NO_HOST;
    if (h.transfer && h.lengths)
        return EP_LENGTH_AND_CHUNKED;
    if (h.transfer && (h.transfer > 1 || strcasecmp(h.te, "chunked") != 0))
        return EP_TRANSFER_CODING;
    if (h.length_conflict)
        return EP_LENGTH_CONFLICT;
    *chunked = h.transfer > 0;
    if (h.lengths) {
        /* libmicrohttpd has parsed and accepted it: digits only */
        char buf[24];
        size_t n = h.length_len < sizeof buf - 1 ? h.length_len : sizeof buf - 1;
        memcpy(buf, h.length, n);
        buf[n] = '\0';
        x->declared = strtoull(buf, NULL, 10);
    }
    return EP_NONE;
}

/* Decides from the headers alone what the HTTP layer must answer itself. */
static void check_headers(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                          const char *version, int *has_body)
{
    int chunked = 0;
    x->problem = check_head(c, x, version, &chunked);
    *has_body = chunked || x->declared > 0;
    if (x->problem != EP_NONE) {
        /* framing errors: the rest of the stream cannot be trusted */
        x->must_close = x->problem == EP_HEADERS_TOO_LARGE || x->problem == EP_TOO_MANY_HEADERS ||
                        x->problem == EP_NO_HOST || x->problem == EP_HOST_REPEATED ||
                        x->problem == EP_LENGTH_CONFLICT || x->problem == EP_LENGTH_AND_CHUNKED ||
                        x->problem == EP_TRANSFER_CODING || x->problem == EP_NO_MEMORY;
        return;
    }
    if (!x->route) {
        x->problem = (x->method_bit == GC_M_OPTIONS && strcmp(x->target.path, "*") == 0) ? EP_NONE
                                                                                        : EP_NOT_FOUND;
        return;
    }
    if (!(x->method_bit & x->route->methods)) {
        x->problem = EP_METHOD;
        return;
    }
    if (!chunked && x->declared > body_limit(srv, x)) {
        x->problem = EP_TOO_LARGE;
        return;
    }
    if (x->method_bit == GC_M_POST && *has_body) {
        const char *ct = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
        int csv_ok = (x->route->flags & GC_ROUTE_CSV_BODY) && ct && is_csv_media_type(ct);
        if (!csv_ok && (!ct || !is_json_media_type(ct))) {
            x->problem = EP_MEDIA_TYPE;
            return;
        }
    }
    if (!chunked && x->declared > 0) {   /* other methods' bodies are kept for --debug-bodies only */
        if (reserve_body(srv, x, x->declared) != 0) {
            x->problem = EP_BODY_MEMORY;
            return;
        }
        x->body = malloc((size_t)x->declared);
        if (x->body)
            x->body_cap = (size_t)x->declared;
    }
}

static int append_body(gc_http_server *srv, req_ctx *x, const char *data, size_t n)
{
    size_t limit = body_limit(srv, x);
    x->received += n;
    if (x->discarded > 0 || x->received > limit) {
        x->discarded += n;
        free(x->body);
        x->body = NULL;
        x->body_len = x->body_cap = 0;
        release_body(srv, x);
        /* A client streaming far beyond the limit is cut off. */
        return x->discarded > 4ull * limit + (1u << 20) ? -1 : 0;
    }
    if (x->body_len + n > x->body_cap) {
        size_t ncap = x->body_cap ? x->body_cap : 4096;
        while (ncap < x->body_len + n)
            ncap *= 2;
        if (ncap > limit)
            ncap = limit;
        if (ncap > x->reserved && reserve_body(srv, x, ncap - x->reserved) != 0) {
            x->discarded += n;   /* over --max-body-total: answered 503 at the end */
            free(x->body);
            x->body = NULL;
            x->body_len = x->body_cap = 0;
            release_body(srv, x);
            return 0;
        }
        char *nb = realloc(x->body, ncap);
        if (!nb)
            return -1;
        x->body = nb;
        x->body_cap = ncap;
    }
    memcpy(x->body + x->body_len, data, n);
    x->body_len += n;
    return 0;
}

static enum MHD_Result first_call(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                                  const char *method, const char *version)
{
    int has_body = 0;
    if (x->timed_out || gc_conn_enter(x->conn, GC_PHASE_BODY) != 0)
        return MHD_NO;
    x->first_done = 1;
    gc_metrics_in_flight_add(1);
    classify_method(x, method);
    const char *rid = MHD_lookup_connection_value(c, MHD_HEADER_KIND, "X-Request-Id");
    if (sane_request_id(rid))
        snprintf(x->request_id, sizeof x->request_id, "%s", rid);
    else
        new_request_id(srv, x->request_id, sizeof x->request_id);
    if (x->target.problem == GC_TARGET_OK)
        x->route = gc_router_match(&srv->router, x->target.path, x->target.scratch,
                                   x->target.path_len + 1, x->path_params, &x->n_path_params);
    check_headers(srv, c, x, version, &has_body);
    if (x->problem != EP_NONE && (has_body || x->must_close)) {
        /* Answer now; libmicrohttpd skips the body and closes. */
        x->answered_early = 1;
        x->must_close = 1;
        if (x->problem == EP_BODY_MEMORY)
            log_limit(&srv->log_body_total, "max_body_total", srv->cfg.max_body_total, x);
        return send_problem(srv, c, x);
    }
    return MHD_YES;
}

static enum MHD_Result on_access(void *cls, struct MHD_Connection *c, const char *url,
                                 const char *method, const char *version,
                                 const char *upload_data, size_t *upload_data_size,
                                 void **con_cls)
{
    gc_http_server *srv = cls;
    req_ctx *x = *con_cls;
    (void)url;   /* the path comes from our own parse of the raw target */

    if (!x)
        return MHD_NO;   /* no memory for a context when the request line came */
    if (!x->first_done)
        return first_call(srv, c, x, method, version);
    if (*upload_data_size > 0) {
        size_t n = *upload_data_size;
        *upload_data_size = 0;
        if (x->answered_early)
            return MHD_YES;
        /* The watchdog (conn.c) closes a connection whose body takes longer
         * than --timeout; this check covers a connection without a record. */
        if (!x->conn && now_ns() - x->t0_ns > (uint64_t)srv->cfg.timeout_s * 1000000000u) {
            x->timed_out = 1;
            return MHD_NO;
        }
        return append_body(srv, x, upload_data, n) == 0 ? MHD_YES : MHD_NO;
    }
    if (atomic_load(&x->job_state) == JOB_DONE) {   /* resumed by a composite worker */
        atomic_store(&x->job_state, JOB_NONE);
        if (gc_conn_enter(x->conn, GC_PHASE_WORK) != 0) {
            free(x->jr.body);
            return MHD_NO;
        }
        return finish_api(srv, c, x, x->job_rc, &x->jr, &x->budget);
    }
    if (x->answered_early || x->status != 0)
        return MHD_YES;
    if (gc_conn_enter(x->conn, GC_PHASE_WORK) != 0)
        return MHD_NO;
    return respond(srv, c, x);
}

static void on_completed(void *cls, struct MHD_Connection *c, void **con_cls,
                         enum MHD_RequestTerminationCode toe)
{
    gc_http_server *srv = cls;
    req_ctx *x = *con_cls;
    if (!x)
        return;
    *con_cls = NULL;
    uint64_t dur_us = (now_ns() - x->t0_ns) / 1000u;
    size_t route = x->route ? x->route->index : gc_router_unmatched_index(&srv->router);
    int ok = (toe == MHD_REQUEST_TERMINATED_COMPLETED_OK && x->status != 0);
    const char *cut = gc_conn_cut_reason(x->conn);
    int lib_status = 0;   /* an answer libmicrohttpd made itself (no first call) */
    if (!x->first_done) {
        const union MHD_ConnectionInfo *hs = MHD_get_connection_info(c, MHD_CONNECTION_INFO_HTTP_STATUS);
        lib_status = hs ? (int)hs->http_status : 0;
    }
    int timeout = x->timed_out || cut || toe == MHD_REQUEST_TERMINATED_TIMEOUT_REACHED;
    if (!ok && atomic_load(&srv->stopping))
        atomic_fetch_add(&srv->requests_cut, 1);
    if (ok)
        gc_metrics_request(route, x->mm, x->status, dur_us);
    else if (lib_status)
        gc_metrics_error("rejected_by_library");
    else
        gc_metrics_error(timeout ? "client_timeout" : "aborted");
    if (x->first_done)
        gc_metrics_in_flight_add(-1);

    enum gc_log_level lvl = ok ? (x->status >= 500 && x->status != 503 ? GC_LOG_ERROR : GC_LOG_INFO)
                               : GC_LOG_WARN;
    if (gc_log_enabled(lvl)) {
        const char *outcome = ok ? "completed"
                            : lib_status ? "rejected_by_libmicrohttpd"
                            : cut ? cut
                            : timeout ? "timeout"
                            : toe == MHD_REQUEST_TERMINATED_CLIENT_ABORT ? "client_abort"
                            : toe == MHD_REQUEST_TERMINATED_DAEMON_SHUTDOWN ? "shutdown"
                            : "error";
        size_t plen = x->target.path_len > LOG_PATH_MAX ? LOG_PATH_MAX : x->target.path_len;
        gc_log_field f[12] = {
            GC_LF_STR("request_id", x->first_done ? x->request_id : "-"),
            GC_LF_STR("method", x->method ? x->method : "-"),
            GC_LF_STRN("path", x->target.path ? x->target.path : "", plen),
            GC_LF_INT("status", x->status ? x->status : lib_status),
            GC_LF_UINT("bytes", x->bytes),
            GC_LF_UINT("duration_us", dur_us),
            GC_LF_STR("route", x->route ? x->route->name : "unmatched"),
        };
        size_t nf = 7;
        if (!ok)
            f[nf++] = (gc_log_field)GC_LF_STR("outcome", outcome);
        if (!ok || x->status >= 400)
            f[nf++] = (gc_log_field)GC_LF_STR("client", gc_conn_client(x->conn));
        if (x->error_class)
            f[nf++] = (gc_log_field)GC_LF_STR("error_class", x->error_class);
        if (srv->cfg.debug_bodies && x->body_len > 0)
            f[nf++] = (gc_log_field)GC_LF_STRN("body", x->body,
                                               x->body_len > DEBUG_BODY_MAX ? DEBUG_BODY_MAX : x->body_len);
        gc_log_event(lvl, "request", f, nf);
    }
    gc_conn_enter(x->conn, GC_PHASE_IDLE);
    release_body(srv, x);
    gc_http_target_free(&x->target);
    free(x->content_type);
    free(x->accept);
    free(x->body);
    free(x);
}

/* ---- life cycle ------------------------------------------------------------ */

static const gc_router_op_spec op_routes[] = {
    { "/healthz", "healthz", GC_M_GET, GC_OP_HEALTHZ },
    { "/readyz", "readyz", GC_M_GET, GC_OP_READYZ },
    { "/metrics", "metrics", GC_M_GET, GC_OP_METRICS },
};

/* Open files allowed to this process (soft limit), or 0 when unknown. */
static unsigned long fd_limit(void)
{
    struct rlimit rl;
    if (getrlimit(RLIMIT_NOFILE, &rl) != 0 || rl.rlim_cur == RLIM_INFINITY)
        return 0;
    return (unsigned long)rl.rlim_cur;
}

/* Settles --max-connections against the descriptor limit. */
static int settle_connection_cap(gc_http_config *cfg, char *err, size_t err_len)
{
    unsigned long fds = fd_limit();
    unsigned long room = fds > FD_RESERVE + 2u * cfg->threads ? fds - FD_RESERVE - 2u * cfg->threads : 0;
    if (!cfg->max_connections_set) {
        cfg->max_connections = DEFAULT_MAX_CONNECTIONS;
        if (fds && room < cfg->max_connections)
            cfg->max_connections = room ? (unsigned)room : 1;
        return 0;
    }
    if (fds && cfg->max_connections > room) {
        snprintf(err, err_len, "--max-connections %u does not fit the open-file limit of %lu "
                 "(at most %lu with %d kept for the server itself); lower it or raise "
                 "the limit (ulimit -n)", cfg->max_connections, fds, room, (int)(fds - room));
        return -1;
    }
    return 0;
}

static int version_hooked(const char *v)
{
    for (size_t i = 0; v && HOOKED_VERSIONS[i]; i++)
        if (strcmp(v, HOOKED_VERSIONS[i]) == 0)
            return 1;
    return 0;
}

static void server_free(gc_http_server *srv)
{
    if (srv->work)
        gc_work_free(srv->work);
    if (srv->conns)
        gc_conn_table_free(srv->conns);
    gc_metrics_free();
    gc_router_free(&srv->router);
    pthread_mutex_destroy(&srv->work_mu);
    free(srv);
}

/* The listen address and port in ss (MHD_USE_IPv6 added to flags for an
 * IPv6 address); -1 when cfg->listen is no IPv4 or IPv6 address. */
static int listen_address(const gc_http_config *cfg, struct sockaddr_storage *ss,
                          unsigned *flags)
{
    memset(ss, 0, sizeof *ss);
    struct sockaddr_in *s4 = (struct sockaddr_in *)ss;
    struct sockaddr_in6 *s6 = (struct sockaddr_in6 *)ss;
    if (inet_pton(AF_INET, cfg->listen, &s4->sin_addr) == 1) {
        s4->sin_family = AF_INET;
        s4->sin_port = htons((uint16_t)cfg->port);
        return 0;
    }
    if (inet_pton(AF_INET6, cfg->listen, &s6->sin6_addr) == 1) {
        s6->sin6_family = AF_INET6;
        s6->sin6_port = htons((uint16_t)cfg->port);
        *flags |= MHD_USE_IPv6;
        return 0;
    }
    return -1;
}

/* Starts libmicrohttpd on ss (srv->daemon NULL and errno set when it
 * cannot). */
static void start_daemon(gc_http_server *srv, const gc_http_config *cfg,
                         struct sockaddr_storage *ss, unsigned flags)
{
    /* libmicrohttpd's own cap sits above ours (accept_policy refuses and
     * logs first): it splits its cap evenly over its threads. */
    unsigned mhd_cap = srv->cfg.max_connections + 2u * srv->cfg.threads + 2u;
    errno = 0;
    srv->daemon = MHD_start_daemon(
        flags, (uint16_t)cfg->port, accept_policy, srv, on_access, srv,
        MHD_OPTION_SOCK_ADDR, (struct sockaddr *)ss,
        MHD_OPTION_THREAD_POOL_SIZE, (unsigned int)(cfg->threads > 1 ? cfg->threads : 0),
        MHD_OPTION_CONNECTION_TIMEOUT, (unsigned int)cfg->timeout_s,
        MHD_OPTION_CONNECTION_LIMIT, mhd_cap,
        MHD_OPTION_NOTIFY_COMPLETED, on_completed, srv,
        MHD_OPTION_NOTIFY_CONNECTION, on_connection, srv,
        MHD_OPTION_URI_LOG_CALLBACK, on_uri, srv,
        MHD_OPTION_CONNECTION_MEMORY_LIMIT, (size_t)CONNECTION_POOL_BYTES,
        MHD_OPTION_LISTEN_BACKLOG_SIZE, (unsigned int)511,
        MHD_OPTION_UNESCAPE_CALLBACK, unescape_none, NULL,
        MHD_OPTION_EXTERNAL_LOGGER, mhd_logger, NULL,
        MHD_OPTION_END);
}

int gc_http_server_start(const gc_http_config *cfg, gc_http_server **out,
                         char *err, size_t err_len)
{
    gc_http_server *srv = calloc(1, sizeof *srv);
    struct sockaddr_storage ss;
    unsigned flags = MHD_USE_INTERNAL_POLLING_THREAD | MHD_USE_EPOLL | MHD_USE_ITC |
                     MHD_USE_ERROR_LOG | MHD_ALLOW_SUSPEND_RESUME;
    size_t n_api = 0;

    *out = NULL;
    if (!srv) {
        snprintf(err, err_len, "out of memory");
        return -1;
    }
    pthread_mutex_init(&srv->work_mu, NULL);
    srv->cfg = *cfg;
    gc_log_init(cfg->log_json ? GC_LOG_JSON : GC_LOG_TEXT, (enum gc_log_level)cfg->log_level);
    if (settle_connection_cap(&srv->cfg, err, err_len) != 0) {
        pthread_mutex_destroy(&srv->work_mu);
        free(srv);
        return -1;
    }

    const gc_api_route *api = gc_api_routes(&n_api);
    if (gc_router_init(&srv->router, op_routes, sizeof op_routes / sizeof op_routes[0],
                       api, n_api, err, err_len) != 0) {
        pthread_mutex_destroy(&srv->work_mu);
        free(srv);
        return -1;
    }
    if (gc_metrics_init(srv->router.labels, srv->router.n_labels, GC_VERSION, GC_GIT_REV) != 0) {
        snprintf(err, err_len, "out of memory");
        gc_router_free(&srv->router);
        pthread_mutex_destroy(&srv->work_mu);
        free(srv);
        return -1;
    }
    if (getrandom(&srv->id_seed, sizeof srv->id_seed, GRND_NONBLOCK) != (ssize_t)sizeof srv->id_seed)
        srv->id_seed = mix64((uint64_t)time(NULL) ^ ((uint64_t)getpid() << 32));
    gc_conn_limits lim = {
        .max_connections = srv->cfg.max_connections, .max_per_client = srv->cfg.max_per_client,
        .idle_s = srv->cfg.timeout_s, .header_s = srv->cfg.header_timeout_s,
        .new_id = new_request_id, .id_cls = srv,
    };
    if (gc_conn_table_new(&lim, &srv->conns) != 0 ||
        gc_work_new(srv->cfg.composite_workers, srv->cfg.composite_queue, &srv->work) != 0) {
        snprintf(err, err_len, "cannot start the server's threads");
        server_free(srv);
        return -1;
    }
    srv->cut_query = version_hooked(MHD_get_version());
    if (!srv->cut_query)
        GC_LOG(GC_LOG_WARN, "query strings are also parsed by libmicrohttpd",
               GC_LF_STR("libmicrohttpd", MHD_get_version()),
               GC_LF_STR("detail", "this version was not checked; a query with very many "
                         "parameters may get no answer until --timeout"));

    if (listen_address(cfg, &ss, &flags) != 0) {
        snprintf(err, err_len, "cannot parse listen address %s", cfg->listen);
        server_free(srv);
        return -1;
    }

    start_daemon(srv, cfg, &ss, flags);
    if (!srv->daemon) {
        int e = errno;
        snprintf(err, err_len, "cannot listen on %s port %u%s%s", cfg->listen, cfg->port,
                 e ? ": " : "", e ? strerror(e) : "");
        server_free(srv);
        return -1;
    }
    const union MHD_DaemonInfo *di = MHD_get_daemon_info(srv->daemon, MHD_DAEMON_INFO_BIND_PORT);
    srv->port = di ? di->port : cfg->port;
    *out = srv;
    return 0;
}

const gc_http_config *gc_http_server_config(const gc_http_server *srv)
{
    return &srv->cfg;
}

unsigned gc_http_server_port(const gc_http_server *srv)
{
    return srv->port;
}

void gc_http_server_quiesce(gc_http_server *srv)
{
    atomic_store(&srv->draining, 1);
    MHD_socket fd = MHD_quiesce_daemon(srv->daemon);
    if (fd != MHD_INVALID_SOCKET)
        close(fd);
}

long gc_http_server_in_flight(const gc_http_server *srv)
{
    (void)srv;
    return gc_metrics_in_flight();
}

unsigned gc_http_server_connections(gc_http_server *srv)
{
    const union MHD_DaemonInfo *di =
        MHD_get_daemon_info(srv->daemon, MHD_DAEMON_INFO_CURRENT_CONNECTIONS);
    return di ? di->num_connections : 0;
}

void gc_http_server_status(gc_http_server *srv, gc_http_status *st)
{
    memset(st, 0, sizeof *st);
    st->in_flight = gc_metrics_in_flight();
    st->connections = gc_conn_count(srv->conns);
    st->body_bytes = atomic_load(&srv->body_bytes);
    pthread_mutex_lock(&srv->work_mu);
    if (!srv->work_closed)
        gc_work_load(srv->work, &st->composite_running, &st->composite_waiting);
    pthread_mutex_unlock(&srv->work_mu);
}

long gc_http_server_stop(gc_http_server *srv)
{
    if (!srv)
        return 0;
    atomic_store(&srv->stopping, 1);
    atomic_store(&srv->cancel, 1);   /* running composites stop at their next evaluation */
    pthread_mutex_lock(&srv->work_mu);
    srv->work_closed = 1;
    pthread_mutex_unlock(&srv->work_mu);
    gc_work_free(srv->work);         /* every job has run and resumed its connection */
    srv->work = NULL;
    /* libmicrohttpd must not find a connection suspended and not resumed
     * when it stops (0.9.75 aborts the process then); resumed ones it
     * closes itself */
    for (int waited = 0; atomic_load(&srv->suspended) > 0 && waited < RESUME_WAIT_MS; waited += 10) {
        struct timespec ts = { 0, 10000000L };
        nanosleep(&ts, NULL);
    }
    long left = atomic_load(&srv->suspended);
    if (left > 0) {
        /* never seen; stopping libmicrohttpd now would abort the process */
        GC_LOG(GC_LOG_ERROR, "connections still suspended at stop; exiting without closing them",
               GC_LF_INT("suspended", left));
        return atomic_load(&srv->requests_cut) + left;
    }
    MHD_stop_daemon(srv->daemon);
    long cut = atomic_load(&srv->requests_cut);
    server_free(srv);
    return cut;
}
