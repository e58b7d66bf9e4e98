/*
 * server.c — the libmicrohttpd server: request life cycle, limits, CORS,
 * request ids, operational routes (/healthz, /readyz, /metrics), metrics and
 * the access log. The API layer's handlers are called through api.h only.
 *
 * Request life cycle (libmicrohttpd calls on_access several times per
 * request):
 *   1st call  headers complete: allocate the request context, pick the
 *             route, decide 404/405/413/415 from the headers alone. A
 *             request that carries a body it must not send is answered at
 *             once (libmicrohttpd then closes the connection without reading
 *             the body); otherwise return MHD_YES without a response. Queuing
 *             on this first call would turn every response into
 *             "Connection: close" and defeat keep-alive.
 *   body      each chunk is appended up to --max-body; beyond it the rest is
 *             counted and discarded (chunked uploads have no length up front).
 *   last      (*upload_data_size == 0) route, call the handler, queue.
 *   completed on_completed: metrics, access log line, free the context.
 * The context is per request; nothing mutable is shared between threads
 * except the atomic metrics registry and the server's draining flag.
 */
#include "http/http.h"
#include "http/log.h"
#include "http/metrics.h"
#include "http/router.h"

#include <arpa/inet.h>
#include <errno.h>
#include <microhttpd.h>
#include <netinet/in.h>
#include <stdatomic.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/random.h>
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
#define MAX_QUERY_PARAMS 512
#define DEBUG_BODY_MAX 2048        /* bytes of a request body put in the log */
#define PREFLIGHT_MAX_AGE "600"    /* s a browser may cache a preflight answer */
#define CORS_ALLOW_HEADERS "Content-Type, Accept, X-Request-Id"
/* Per-connection memory of libmicrohttpd (request line, headers, buffers).
 * It is zeroed between requests, so its size is paid on every keep-alive
 * request: 64 KiB cost about a fifth of the CPU of a /healthz request here.
 * 16 KiB still takes request targets (path and query) up to about 15 KB;
 * longer ones get libmicrohttpd's own 414 or 431. */
#define CONNECTION_POOL_BYTES (16 * 1024)

struct gc_http_server {
    struct MHD_Daemon *daemon;
    gc_http_config cfg;
    gc_router router;
    unsigned port;                 /* bound port */
    atomic_int draining;           /* 1 after gc_http_server_quiesce() */
    uint64_t id_seed;              /* random, for generated request ids */
    atomic_ullong id_counter;
};

/* Problems the HTTP layer detects itself. */
enum early_problem { EP_NONE = 0, EP_NOT_FOUND, EP_METHOD, EP_TOO_LARGE, EP_MEDIA_TYPE };

typedef struct req_ctx {
    uint64_t t0_ns;                /* CLOCK_MONOTONIC when headers were complete */
    const gc_route *route;         /* NULL: no route for the path */
    unsigned method_bit;           /* GC_M_* or 0 for other methods */
    enum gc_metrics_method mm;
    const char *method;            /* static name or method_buf */
    char method_buf[16];
    char request_id[65];
    enum early_problem problem;
    int answered_early;            /* response queued on the first call */
    int timed_out;                 /* body took longer than --timeout */
    char *body;                    /* malloc'd request body */
    size_t body_len, body_cap;     /* bytes */
    unsigned long long received;   /* body bytes received so far */
    unsigned long long discarded;  /* bytes dropped beyond --max-body */
    int status;                    /* status sent, 0 = none yet */
    size_t bytes;                  /* response body bytes */
    const char *error_class;       /* for the log */
    gc_api_param path_params[GC_API_MAX_PATH_PARAMS];
    size_t n_path_params;
    size_t path_len;
    char *scratch;                 /* path parameter values (inside this block) */
    char path[];                   /* path copy, then scratch of the same size */
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

static void new_request_id(gc_http_server *srv, char *out, size_t len)
{
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

/* ---- libmicrohttpd callbacks ---------------------------------------------- */

/* Query strings: "%HH" and '+' as a space (HTML forms and spreadsheet web
 * queries send both). Applied by libmicrohttpd to the path and to each key
 * and value after splitting at '&' and '=', so "%26" stays inside a value. */
static size_t unescape(void *cls, struct MHD_Connection *c, char *s)
{
    (void)cls;
    (void)c;
    char *w = s;
    for (const char *r = s; *r; r++) {
        if (*r == '+') {
            *w++ = ' ';
        } else if (r[0] == '%' && r[1] && r[2]) {
            int hi, lo;
            char a = r[1], b = r[2];
            hi = (a >= '0' && a <= '9') ? a - '0' : (a >= 'a' && a <= 'f') ? a - 'a' + 10
               : (a >= 'A' && a <= 'F') ? a - 'A' + 10 : -1;
            lo = (b >= '0' && b <= '9') ? b - '0' : (b >= 'a' && b <= 'f') ? b - 'a' + 10
               : (b >= 'A' && b <= 'F') ? b - 'A' + 10 : -1;
            if (hi < 0 || lo < 0) {
                *w++ = *r;
            } else {
                *w++ = (char)(hi * 16 + lo);
                r += 2;
            }
        } else {
            *w++ = *r;
        }
    }
    *w = '\0';
    return (size_t)(w - s);
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

typedef struct query_list {
    gc_api_param *items;
    size_t n, cap;
    int overflow;   /* more than MAX_QUERY_PARAMS, or out of memory */
} query_list;

static enum MHD_Result collect_query(void *cls, enum MHD_ValueKind kind,
                                     const char *key, const char *value)
{
    query_list *q = cls;
    (void)kind;
    if (q->n >= MAX_QUERY_PARAMS) {
        q->overflow = 1;
        return MHD_NO;
    }
    if (q->n == q->cap) {
        size_t ncap = q->cap ? q->cap * 2 : 16;
        gc_api_param *np = realloc(q->items, ncap * sizeof *np);
        if (!np) {
            q->overflow = 1;
            return MHD_NO;
        }
        q->items = np;
        q->cap = ncap;
    }
    q->items[q->n].key = key ? key : "";
    q->items[q->n].value = value ? value : "";
    q->n++;
    return MHD_YES;
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
                MHD_add_response_header(resp, "Access-Control-Expose-Headers", "X-Request-Id");
            }
        }
    }
    if (atomic_load_explicit(&srv->draining, memory_order_relaxed))
        MHD_add_response_header(resp, MHD_HTTP_HEADER_CONNECTION, "close");

    x->status = r->status;
    x->bytes = r->body_len;
    x->error_class = r->error_class;
    if (r->error_class)
        gc_metrics_error(r->error_class);
    if (r->preset && r->status < 400)
        gc_metrics_evaluation(r->preset);

    enum MHD_Result ret = MHD_queue_response(c, (unsigned)r->status, resp);
    MHD_destroy_response(resp);
    if (ret != MHD_YES)
        x->status = 0;
    return ret;
}

/* Builds the problem for a condition the HTTP layer detected and sends it. */
static enum MHD_Result send_problem(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x)
{
    gc_api_response r;
    char detail[512];
    char path[160];
    const char *allow = NULL;
    int rc = -1;

    memset(&r, 0, sizeof r);
    printable(path, sizeof path, x->path, 120);
    switch (x->problem) {
    case EP_NOT_FOUND:
        snprintf(detail, sizeof detail,
                 "No resource at %s; /openapi.json lists the routes of this service.", path);
        rc = gc_api_problem(&r, 404, "not_found", "Not Found", detail, NULL);
        break;
    case EP_METHOD:
        allow = x->route->allow;
        snprintf(detail, sizeof detail, "%s is not allowed on %s; allowed methods: %s.",
                 x->method_bit ? x->method : "This method", path, allow);
        rc = gc_api_problem(&r, 405, "method_not_allowed", "Method Not Allowed", detail, NULL);
        break;
    case EP_TOO_LARGE:
        snprintf(detail, sizeof detail,
                 "The request body is larger than the limit of %zu bytes (server flag --max-body).",
                 srv->cfg.max_body);
        rc = gc_api_problem(&r, 413, "too_large", "Content Too Large", detail, NULL);
        break;
    case EP_MEDIA_TYPE: {
        const char *ct = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
        char got[96];
        if (ct)
            printable(got, sizeof got, ct, 80);
        snprintf(detail, sizeof detail,
                 "A POST body must be JSON sent with Content-Type: application/json (this request %s%s%s). "
                 "Form fields and spreadsheet web queries can use GET with the same fields as query parameters.",
                 ct ? "sent \"" : "had no Content-Type", ct ? got : "", ct ? "\"" : "");
        rc = gc_api_problem(&r, 415, "media_type", "Unsupported Media Type", detail,
                            NULL);
        break;
    }
    case EP_NONE:
        break;
    }
    if (rc != 0 || !r.body) {
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

/* The last call: everything is received. */
static enum MHD_Result respond(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x)
{
    gc_api_response r;
    int rc;

    if (x->problem == EP_NONE && x->discarded > 0)
        x->problem = EP_TOO_LARGE;
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
    default: {
        gc_api_request q;
        query_list ql = { NULL, 0, 0, 0 };
        MHD_get_connection_values(c, MHD_GET_ARGUMENT_KIND, collect_query, &ql);
        if (ql.overflow) {
            free(ql.items);
            char detail[128];
            snprintf(detail, sizeof detail, "The query string has more than %d parameters.",
                     MAX_QUERY_PARAMS);
            if (gc_api_problem(&r, 400, "malformed", "Bad Request", detail, NULL) != 0 || !r.body) {
                free(r.body);
                return MHD_NO;
            }
            return send_response(srv, c, x, &r, NULL, 0);
        }
        memset(&q, 0, sizeof q);
        q.method = (x->method_bit == GC_M_HEAD) ? GC_M_GET : x->method_bit;
        q.path = x->path;
        q.query = ql.items;
        q.n_query = ql.n;
        memcpy(q.path_params, x->path_params, sizeof q.path_params);
        q.n_path_params = x->n_path_params;
        if (x->method_bit == GC_M_POST && x->body_len > 0) {
            q.body = x->body;
            q.body_len = x->body_len;
        }
        q.content_type = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
        q.request_id = x->request_id;
        rc = x->route->handler(&q, &r);
        free(ql.items);
        if (r.status < 100 || r.status > 599) {
            GC_LOG(GC_LOG_ERROR, "handler returned an invalid status",
                   GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name),
                   GC_LF_INT("status", r.status));
            free(r.body);
            return MHD_NO;
        }
        if (rc != 0 && !r.body)
            rc = -1;
        else
            rc = 0;
        break;
    }
    }
    if (rc != 0) {
        GC_LOG(GC_LOG_ERROR, "out of memory building a response",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name));
        free(r.body);
        return MHD_NO;   /* closes the connection: never a 5xx */
    }
    if (r.status >= 500 && !(x->route->op == GC_OP_READYZ))
        GC_LOG(GC_LOG_ERROR, "handler answered with a server error",
               GC_LF_STR("request_id", x->request_id), GC_LF_STR("route", x->route->name),
               GC_LF_INT("status", r.status));
    return send_response(srv, c, x, &r, NULL, 0);
}

/* Decides from the headers alone what the HTTP layer must answer itself. */
static void check_headers(gc_http_server *srv, struct MHD_Connection *c, req_ctx *x,
                          int *has_body)
{
    const char *cl = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_LENGTH);
    const char *te = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_TRANSFER_ENCODING);
    unsigned long long declared = 0;
    int chunked = (te != NULL && strcasestr(te, "chunked") != NULL);

    if (cl) {
        char *end;
        errno = 0;
        declared = strtoull(cl, &end, 10);
        if (errno || end == cl)
            declared = ~0ull;
    }
    *has_body = chunked || declared > 0;

    if (!x->route) {
        x->problem = (x->method_bit == GC_M_OPTIONS && strcmp(x->path, "*") == 0) ? EP_NONE
                                                                                 : EP_NOT_FOUND;
        return;
    }
    if (!(x->method_bit & x->route->methods)) {
        x->problem = EP_METHOD;
        return;
    }
    if (!chunked && declared > srv->cfg.max_body) {
        x->problem = EP_TOO_LARGE;
        return;
    }
    if (x->method_bit == GC_M_POST && *has_body) {
        const char *ct = MHD_lookup_connection_value(c, MHD_HEADER_KIND, MHD_HTTP_HEADER_CONTENT_TYPE);
        if (!ct || !is_json_media_type(ct)) {
            x->problem = EP_MEDIA_TYPE;
            return;
        }
    }
    if (!chunked && declared > 0) {   /* other methods' bodies are kept for --debug-bodies only */
        x->body = malloc((size_t)declared);
        if (x->body)
            x->body_cap = (size_t)declared;
    }
}

static req_ctx *ctx_new(gc_http_server *srv, struct MHD_Connection *c, const char *url,
                        const char *method)
{
    size_t n = strlen(url);
    req_ctx *x = calloc(1, sizeof *x + 2 * (n + 1));
    if (!x)
        return NULL;
    x->t0_ns = now_ns();
    x->path_len = n;
    memcpy(x->path, url, n + 1);
    x->scratch = x->path + n + 1;
    classify_method(x, method);
    const char *rid = MHD_lookup_connection_value(c, MHD_HEADER_KIND, "X-Request-Id");
    if (sane_request_id(rid))
        snprintf(x->request_id, sizeof x->request_id, "%s", rid);
    else
        new_request_id(srv, x->request_id, sizeof x->request_id);
    x->route = gc_router_match(&srv->router, x->path, x->scratch, n + 1,
                               x->path_params, &x->n_path_params);
    return x;
}

static int append_body(gc_http_server *srv, req_ctx *x, const char *data, size_t n)
{
    x->received += n;
    if (x->discarded > 0 || x->received > srv->cfg.max_body) {
        x->discarded += n;
        free(x->body);
        x->body = NULL;
        x->body_len = x->body_cap = 0;
        /* A client streaming far beyond the limit is cut off. */
        return x->discarded > 4ull * srv->cfg.max_body + (1u << 20) ? -1 : 0;
    }
    if (x->body_len + n > x->body_cap) {
        size_t ncap = x->body_cap ? x->body_cap : 4096;
        while (ncap < x->body_len + n)
            ncap *= 2;
        if (ncap > srv->cfg.max_body)
            ncap = srv->cfg.max_body;
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

static enum MHD_Result on_access(void *cls, struct MHD_Connection *c, const char *url,
                                 const char *method, const char *version,
                                 const char *upload_data, size_t *upload_data_size,
                                 void **con_cls)
{
    gc_http_server *srv = cls;
    req_ctx *x = *con_cls;
    (void)version;

    if (!x) {
        int has_body = 0;
        x = ctx_new(srv, c, url, method);
        if (!x)
            return MHD_NO;
        *con_cls = x;
        gc_metrics_in_flight_add(1);
        check_headers(srv, c, x, &has_body);
        if (x->problem != EP_NONE && has_body) {
            /* Answer now; libmicrohttpd skips the body and closes. */
            x->answered_early = 1;
            return send_problem(srv, c, x);
        }
        return MHD_YES;
    }
    if (*upload_data_size > 0) {
        size_t n = *upload_data_size;
        *upload_data_size = 0;
        if (x->answered_early)
            return MHD_YES;
        /* libmicrohttpd's timeout counts idle time only; a body trickled a
         * byte at a time would never hit it. The whole body must arrive
         * within --timeout of the headers, or the connection is dropped. */
        if (now_ns() - x->t0_ns > (uint64_t)srv->cfg.timeout_s * 1000000000u) {
            x->timed_out = 1;
            return MHD_NO;
        }
        return append_body(srv, x, upload_data, n) == 0 ? MHD_YES : MHD_NO;
    }
    if (x->answered_early || x->status != 0)
        return MHD_YES;
    return respond(srv, c, x);
}

static void on_completed(void *cls, struct MHD_Connection *c, void **con_cls,
                         enum MHD_RequestTerminationCode toe)
{
    gc_http_server *srv = cls;
    req_ctx *x = *con_cls;
    (void)c;
    if (!x)
        return;
    *con_cls = NULL;
    uint64_t dur_us = (now_ns() - x->t0_ns) / 1000u;
    size_t route = x->route ? x->route->index : gc_router_unmatched_index(&srv->router);
    int ok = (toe == MHD_REQUEST_TERMINATED_COMPLETED_OK && x->status != 0);

    int timeout = x->timed_out || toe == MHD_REQUEST_TERMINATED_TIMEOUT_REACHED;
    if (ok)
        gc_metrics_request(route, x->mm, x->status, dur_us);
    else
        gc_metrics_error(timeout ? "client_timeout" : "aborted");
    gc_metrics_in_flight_add(-1);

    enum gc_log_level lvl = ok ? (x->status >= 500 ? GC_LOG_ERROR : GC_LOG_INFO) : GC_LOG_WARN;
    if (gc_log_enabled(lvl)) {
        const char *outcome = ok ? "completed"
                            : timeout ? "timeout"
                            : toe == MHD_REQUEST_TERMINATED_CLIENT_ABORT ? "client_abort"
                            : toe == MHD_REQUEST_TERMINATED_DAEMON_SHUTDOWN ? "shutdown"
                            : "error";
        gc_log_field f[10] = {
            GC_LF_STR("request_id", x->request_id),
            GC_LF_STR("method", x->method),
            GC_LF_STRN("path", x->path, x->path_len > 512 ? 512 : x->path_len),
            GC_LF_INT("status", x->status),
            GC_LF_UINT("bytes", x->bytes),
            GC_LF_UINT("duration_us", dur_us),
            GC_LF_STR("route", x->route ? x->route->name : "unmatched"),
        };
        size_t nf = 7;
        if (!ok)
            f[nf++] = (gc_log_field)GC_LF_STR("outcome", outcome);
        if (x->error_class)
            f[nf++] = (gc_log_field)GC_LF_STR("error_class", x->error_class);
        if (srv->cfg.debug_bodies && x->body_len > 0)
            f[nf++] = (gc_log_field)GC_LF_STRN("body", x->body,
                                               x->body_len > DEBUG_BODY_MAX ? DEBUG_BODY_MAX : x->body_len);
        gc_log_event(lvl, "request", f, nf);
    }
    free(x->body);
    free(x);
}

/* ---- life cycle ------------------------------------------------------------ */

static const gc_router_op_spec op_routes[] = {
    { "/healthz", "healthz", GC_M_GET, GC_OP_HEALTHZ },
    { "/readyz", "readyz", GC_M_GET, GC_OP_READYZ },
    { "/metrics", "metrics", GC_M_GET, GC_OP_METRICS },
};

int gc_http_server_start(const gc_http_config *cfg, gc_http_server **out,
                         char *err, size_t err_len)
{
    gc_http_server *srv = calloc(1, sizeof *srv);
    struct sockaddr_storage ss;
    unsigned flags = MHD_USE_INTERNAL_POLLING_THREAD | MHD_USE_EPOLL | MHD_USE_ITC | MHD_USE_ERROR_LOG;
    size_t n_api = 0;

    *out = NULL;
    if (!srv) {
        snprintf(err, err_len, "out of memory");
        return -1;
    }
    srv->cfg = *cfg;
    gc_log_init(cfg->log_json ? GC_LOG_JSON : GC_LOG_TEXT, (enum gc_log_level)cfg->log_level);

    const gc_api_route *api = gc_api_routes(&n_api);
    if (gc_router_init(&srv->router, op_routes, sizeof op_routes / sizeof op_routes[0],
                       api, n_api, err, err_len) != 0) {
        free(srv);
        return -1;
    }
    if (gc_metrics_init(srv->router.labels, srv->router.n_labels, GC_VERSION, GC_GIT_REV) != 0) {
        snprintf(err, err_len, "out of memory");
        gc_router_free(&srv->router);
        free(srv);
        return -1;
    }
    if (getrandom(&srv->id_seed, sizeof srv->id_seed, GRND_NONBLOCK) != (ssize_t)sizeof srv->id_seed)
        srv->id_seed = mix64((uint64_t)time(NULL) ^ ((uint64_t)getpid() << 32));

    memset(&ss, 0, sizeof ss);
    struct sockaddr_in *s4 = (struct sockaddr_in *)&ss;
    struct sockaddr_in6 *s6 = (struct sockaddr_in6 *)&ss;
    if (inet_pton(AF_INET, cfg->listen, &s4->sin_addr) == 1) {
        s4->sin_family = AF_INET;
        s4->sin_port = htons((uint16_t)cfg->port);
    } else if (inet_pton(AF_INET6, cfg->listen, &s6->sin6_addr) == 1) {
        s6->sin6_family = AF_INET6;
        s6->sin6_port = htons((uint16_t)cfg->port);
        flags |= MHD_USE_IPv6;
    } else {
        snprintf(err, err_len, "cannot parse listen address %s", cfg->listen);
        gc_metrics_free();
        gc_router_free(&srv->router);
        free(srv);
        return -1;
    }

    errno = 0;
    srv->daemon = MHD_start_daemon(
        flags, (uint16_t)cfg->port, NULL, NULL, on_access, srv,
        MHD_OPTION_SOCK_ADDR, (struct sockaddr *)&ss,
        MHD_OPTION_THREAD_POOL_SIZE, (unsigned int)(cfg->threads > 1 ? cfg->threads : 0),
        MHD_OPTION_CONNECTION_TIMEOUT, (unsigned int)cfg->timeout_s,
        MHD_OPTION_NOTIFY_COMPLETED, on_completed, srv,
        MHD_OPTION_CONNECTION_MEMORY_LIMIT, (size_t)CONNECTION_POOL_BYTES,
        MHD_OPTION_LISTEN_BACKLOG_SIZE, (unsigned int)511,
        MHD_OPTION_UNESCAPE_CALLBACK, unescape, NULL,
        MHD_OPTION_EXTERNAL_LOGGER, mhd_logger, NULL,
        MHD_OPTION_END);
    if (!srv->daemon) {
        int e = errno;
        snprintf(err, err_len, "cannot listen on %s port %u%s%s", cfg->listen, cfg->port,
                 e ? ": " : "", e ? strerror(e) : "");
        gc_metrics_free();
        gc_router_free(&srv->router);
        free(srv);
        return -1;
    }
    const union MHD_DaemonInfo *di = MHD_get_daemon_info(srv->daemon, MHD_DAEMON_INFO_BIND_PORT);
    srv->port = di ? di->port : cfg->port;
    *out = srv;
    return 0;
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

void gc_http_server_stop(gc_http_server *srv)
{
    if (!srv)
        return;
    MHD_stop_daemon(srv->daemon);
    gc_metrics_free();
    gc_router_free(&srv->router);
    free(srv);
}
