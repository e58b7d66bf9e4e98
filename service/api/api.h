/*
 * api.h — the contract between the HTTP layer (service/http, the only code
 * that knows libmicrohttpd) and the API layer (service/api, the only code that
 * knows JSON). The HTTP layer turns a libmicrohttpd request into a
 * gc_api_request, routes it with the table from gc_api_routes(), calls the
 * handler and sends the gc_api_response. Handlers are pure functions of the
 * request: no global mutable state, safe on any number of threads.
 *
 * Ownership: everything in gc_api_request is borrowed from the HTTP layer for
 * the duration of the call. resp->body is malloc'd by the handler and freed by
 * the HTTP layer with free(). All other response strings are static.
 *
 * Cost: a request may carry a budget (gc_api_budget, owned by the HTTP
 * layer). Routes that run many evaluations per request (composite routes,
 * gc_api_route_is_composite: sweeps, targets, batch) call gc_api_budget_charge
 * once per evaluation and stop when it refuses; the HTTP layer then answers
 * with a problem naming the limit and drops whatever the handler built.
 */
#ifndef GC_API_H
#define GC_API_H

#include <stdatomic.h>
#include <stddef.h>

enum gc_api_method {
    GC_M_GET = 1u << 0,
    GC_M_POST = 1u << 1,
    GC_M_HEAD = 1u << 2,    /* the HTTP layer answers HEAD with the GET handler, body dropped */
    GC_M_OPTIONS = 1u << 3  /* answered by the HTTP layer (CORS preflight), never by a handler */
};

typedef struct gc_api_param {
    const char *key;     /* decoded (percent-decoding done by the HTTP layer) */
    const char *value;   /* decoded; "" for a key given without '=' */
} gc_api_param;

#define GC_API_MAX_PATH_PARAMS 4
#define GC_API_MAX_EVALUATED 8   /* presets counted apart in one response (batch) */

/* Why a budget refused a charge. */
enum gc_api_budget_reason {
    GC_API_BUDGET_OK = 0,
    GC_API_BUDGET_EVALUATIONS,       /* more evaluations than max_evaluations */
    GC_API_BUDGET_TIME,              /* past the deadline (wall clock, CLOCK_MONOTONIC) */
    GC_API_BUDGET_CANCELLED          /* the server is shutting down */
};

/* The cost budget of one request. Filled by the HTTP layer; charged by the
 * composite routes (one evaluation = one inner route call). */
typedef struct gc_api_budget {
    unsigned long max_evaluations;   /* evaluations allowed; 0 = no limit */
    unsigned long long deadline_ns;  /* CLOCK_MONOTONIC time in ns; 0 = none */
    unsigned long evaluations;       /* charged so far */
    int exceeded;                    /* enum gc_api_budget_reason, sticky */
    const atomic_int *cancel;        /* a flag another thread may raise (server shutdown):
                                        stop at the next charge; NULL = none */
    unsigned threads;                /* threads one request may use at once (the server's
                                        --threads; a Monte Carlo run spreads its samples
                                        over them); 0 or 1: the calling thread only */
} gc_api_budget;

/* Charges n evaluations. Returns 0 while the budget holds, -1 (and sets
 * b->exceeded) once it does not; every later call also returns -1. A NULL
 * budget never refuses. The handler then stops evaluating (the one-line hook:
 * `if (gc_api_budget_charge(req->budget, 1) != 0) break;`). */
int gc_api_budget_charge(gc_api_budget *b, unsigned long n);

typedef struct gc_api_request {
    unsigned method;                 /* one gc_api_method bit (GET for HEAD) */
    const char *path;                /* path without the query string */
    const gc_api_param *query;       /* query parameters in arrival order */
    size_t n_query;
    gc_api_param path_params[GC_API_MAX_PATH_PARAMS]; /* {name} segments of the route pattern */
    size_t n_path_params;
    const char *body;                /* POST body, not NUL-terminated; NULL for none */
    size_t body_len;                 /* bytes */
    const char *content_type;        /* Content-Type header or NULL */
    const char *accept;              /* Accept header or NULL (text/csv asks for format=csv) */
    const char *request_id;          /* the id the HTTP layer sends back in X-Request-Id */
    gc_api_budget *budget;           /* cost budget, or NULL (no limit) */
} gc_api_request;

typedef struct gc_api_response {
    int status;                      /* HTTP status code */
    const char *content_type;        /* static, with charset, e.g. "application/json; charset=utf-8" */
    char *body;                      /* malloc'd by the handler; freed by the HTTP layer */
    size_t body_len;                 /* bytes */
    const char *preset;              /* static cycle preset name for metrics, or NULL */
    /* Evaluations the request made, by preset (metrics: gascycled_evaluations_total, labelled
     * with the preset and the route that made them); a single evaluation sets preset alone. */
    int n_evaluated;
    struct { const char *preset; unsigned long n; } evaluated[GC_API_MAX_EVALUATED];
    const char *error_class;         /* static error class for metrics ("validation",
                                        "not_found", "too_large", "media_type",
                                        "infeasible", "check_failed", ...), or NULL */
    int cache_seconds;               /* > 0 only when caching was asked for; 0 = no-store */
} gc_api_response;

typedef int (*gc_api_handler)(const gc_api_request *req, gc_api_response *resp);

typedef struct gc_api_route {
    const char *pattern;             /* "/v1/cycles/{preset}"; {name} matches one segment */
    unsigned methods;                /* GC_M_GET | GC_M_POST ... */
    gc_api_handler handler;
    const char *name;                /* label for metrics and logs, e.g. "cycles_preset" */
    unsigned flags;                  /* GC_ROUTE_* */
} gc_api_route;

/* gc_api_route.flags */
#define GC_ROUTE_HEAVY 0x1u  /* one request may cost many evaluations (sweeps, targets,
                                batch, and presets that declare themselves heavy): served on
                                the composite workers, apart from the cheap routes, and
                                charged to the cost budget */
#define GC_ROUTE_LARGE_BODY 0x2u /* a request body may be as large as the server's recording
                                limit (--max-recording-body) instead of --max-body */
#define GC_ROUTE_CSV_BODY 0x4u /* a POST body may be text/csv as well as JSON */

/* Counts n successful evaluations of preset (static name) in resp->evaluated. */
void gc_api_count_evaluations(gc_api_response *resp, const char *preset, unsigned long n);

/* Calls a route's handler and applies what every API answer shares: the
 * error form of on_error=text (respond/forms.c). The HTTP layer calls the
 * handlers through it. */
int gc_api_call(gc_api_handler h, const gc_api_request *req, gc_api_response *resp);

/* The API layer's route table (static storage, n_routes filled in). The HTTP
 * layer owns the operational routes /healthz, /readyz, /metrics itself. */
const gc_api_route *gc_api_routes(size_t *n_routes);

/* Fills resp with an RFC 9457 problem-details body (application/problem+json)
 * for errors the HTTP layer detects itself (404, 405, 413, 415, 408, 503):
 * type, title, status, detail, and an errors list with one {field, message}
 * when field is not NULL. error_class is a static label for metrics.
 * Returns 0, or -1 if memory ran out (resp->body is then NULL). */
int gc_api_problem(gc_api_response *resp, int status, const char *error_class,
                   const char *title, const char *detail, const char *field);

/* 1 for a composite route (many evaluations per request: /v1/sweeps,
 * /v1/targets, /v1/batch), which charges the budget; the HTTP layer runs
 * these apart from the cheap routes. */
int gc_api_route_is_composite(const gc_api_route *route);

/* A problem for a limit of the server (request size, connections, budget):
 * like gc_api_problem, plus the member "limit": {"name": limit_name,
 * "value": limit_value} so a client can read which limit it met and its
 * value. field (a JSON pointer) may be NULL. Returns 0 or -1 (no memory). */
int gc_api_problem_limit(gc_api_response *resp, int status, const char *error_class,
                         const char *title, const char *detail, const char *field,
                         const char *limit_name, unsigned long long limit_value);

/* The OpenAPI document built into the binary (NUL-terminated, static). */
extern const char gc_api_openapi_json[];

#endif
