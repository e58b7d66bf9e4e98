/*
 * limits.c — the API layer's side of the server's limits (api.h): the cost
 * budget that composite routes charge once per evaluation, which routes are
 * composite, and the problem document for a limit ("limit": {name, value}
 * beside the RFC 9457 members).
 *
 * Budget: an evaluation count (max_evaluations) and a wall-clock deadline
 * (CLOCK_MONOTONIC, ns), both set by the HTTP layer from its configuration;
 * a cancel flag another thread may raise (server shutdown). The checks are
 * made at each charge, i.e. between evaluations: a single evaluation is
 * never interrupted, so the deadline can be overrun by at most one
 * evaluation (milliseconds for the heaviest preset).
 */
#include "api/api.h"
#include "api/handlers.h"
#include "api/respond/problem.h"

#include <jansson.h>
#include <limits.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static unsigned long long mono_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (unsigned long long)ts.tv_sec * 1000000000ull + (unsigned long long)ts.tv_nsec;
}

int gc_api_budget_charge(gc_api_budget *b, unsigned long n)
{
    if (!b)
        return 0;
    if (b->exceeded != GC_API_BUDGET_OK)
        return -1;
    if (b->cancel && atomic_load_explicit(b->cancel, memory_order_relaxed)) {
        b->exceeded = GC_API_BUDGET_CANCELLED;
        return -1;
    }
    if (b->max_evaluations && (n > b->max_evaluations ||
                               b->evaluations > b->max_evaluations - n)) {
        b->exceeded = GC_API_BUDGET_EVALUATIONS;
        return -1;
    }
    if (b->deadline_ns && mono_ns() > b->deadline_ns) {
        b->exceeded = GC_API_BUDGET_TIME;
        return -1;
    }
    b->evaluations += n;
    return 0;
}

int gc_api_route_is_composite(const gc_api_route *route)
{
    return route && (route->flags & GC_ROUTE_HEAVY);
}

int gc_api_problem_limit(gc_api_response *resp, int status, const char *error_class,
                         const char *title, const char *detail, const char *field,
                         const char *limit_name, unsigned long long limit_value)
{
    char type[160];
    const char *cls = error_class ? error_class : "error";
    snprintf(type, sizeof type, "%s%s", GC_API_PROBLEM_TYPE_BASE, cls);
    resp->status = status;
    resp->content_type = GC_API_CT_PROBLEM;
    resp->error_class = cls;
    resp->cache_seconds = 0;
    resp->body = NULL;
    resp->body_len = 0;
    json_t *doc = json_pack("{s:s, s:s, s:i}", "type", type, "title",
                            title ? title : gc_api_status_title(status), "status", status);
    if (!doc)
        return -1;
    if (detail)
        json_object_set_new(doc, "detail", json_string(detail));
    if (field) {
        json_t *e = json_pack("{s:s, s:s}", "field", field, "message",
                              detail ? detail : (title ? title : ""));
        json_t *arr = json_array();
        json_array_append_new(arr, e);
        json_object_set_new(doc, "errors", arr);
    }
    if (limit_name)
        json_object_set_new(doc, "limit", json_pack("{s:s, s:I}", "name", limit_name, "value",
                                                    (json_int_t)(limit_value > LLONG_MAX ? LLONG_MAX
                                                                              : limit_value)));
    char *s = json_dumps(doc, JSON_COMPACT);
    json_decref(doc);
    if (!s)
        return -1;
    resp->body = s;
    resp->body_len = strlen(s);
    return 0;
}
