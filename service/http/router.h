/*
 * router.h — private to the HTTP layer: maps a request path to a route.
 *
 * The table is the HTTP layer's operational routes followed by the API
 * layer's gc_api_routes(). Patterns are absolute paths whose segments are
 * literals or "{name}" (one non-empty segment, exposed as a path parameter).
 * When several patterns match a path, the one with the most literal segments
 * wins ("/v1/cycles/custom" beats "/v1/cycles/{preset}"); ties go to the
 * earlier entry. Matching is by path only: the caller then checks the method,
 * which gives 405 (with the route's Allow list) rather than 404 for a known
 * path. A path with one trailing slash that matches nothing matches as the
 * path without it ("/v1/cycles/otto/", "/healthz/"), never a 404. Immutable after gc_router_init(), so safe to share between threads.
 */
#ifndef GC_HTTP_ROUTER_H
#define GC_HTTP_ROUTER_H

#include "api/api.h"

#include <stddef.h>

/* Routes the HTTP layer answers itself. */
enum gc_router_op { GC_OP_API = 0, GC_OP_HEALTHZ, GC_OP_READYZ, GC_OP_METRICS };

typedef struct gc_router_seg {
    const char *text;      /* literal text, or the parameter name (NUL-terminated copy) */
    size_t len;            /* bytes of text */
    int is_param;          /* 1 for "{name}" */
} gc_router_seg;

typedef struct gc_route {
    const char *pattern;   /* as given (static) */
    const char *name;      /* metrics and log label (static) */
    unsigned methods;      /* GC_M_* bits, HEAD added when GET is there, OPTIONS always */
    gc_api_handler handler;/* API handler, NULL for operational routes */
    enum gc_router_op op;
    int composite;         /* 1: many evaluations per request (gc_api_route_is_composite) */
    unsigned flags;        /* the API route's GC_ROUTE_* (0 for operational routes) */
    size_t index;          /* position in the table = metrics route index */
    gc_router_seg *segs;   /* owned */
    size_t n_segs;
    size_t n_literal;      /* literal segments, for specificity */
    char allow[48];        /* Allow header value, e.g. "GET, HEAD, POST, OPTIONS" */
} gc_route;

typedef struct gc_router {
    gc_route *routes;      /* owned */
    size_t n_routes;
    const char **labels;   /* n_routes + 1 labels; the last is "unmatched" */
    size_t n_labels;
} gc_router;

typedef struct gc_router_op_spec {
    const char *pattern;
    const char *name;
    unsigned methods;
    enum gc_router_op op;
} gc_router_op_spec;

/* Builds the table. Returns 0, or -1 with a message in err for a malformed
 * pattern (not starting with '/', unbalanced braces, too many parameters)
 * or when memory ran out. */
int gc_router_init(gc_router *r, const gc_router_op_spec *ops, size_t n_ops,
                   const gc_api_route *api, size_t n_api, char *err, size_t err_len);
void gc_router_free(gc_router *r);

/* Finds the route for path, or NULL. Path parameter values are copied,
 * NUL-terminated, into scratch (at least strlen(path) + 1 bytes) and listed in
 * params (GC_API_MAX_PATH_PARAMS entries) with *n_params set. */
const gc_route *gc_router_match(const gc_router *r, const char *path,
                                char *scratch, size_t scratch_len,
                                gc_api_param *params, size_t *n_params);

/* Metrics index of "no route matched". */
size_t gc_router_unmatched_index(const gc_router *r);

#endif
