/*
 * fuzz_routes.c — libFuzzer target: every route handler of the API layer,
 * in process, with arbitrary query strings and bodies.
 *
 * Input: "ROUTE\nQUERY\nBODY". ROUTE is a route name of routes.c
 * ("cycles_otto", "sweeps", ...; any other text picks a route by its hash,
 * so every input reaches a handler); QUERY is a raw query string, split and
 * decoded by the HTTP layer's own parser (service/http/query.c, with the
 * server's limits); BODY, when not empty, is sent as a POST with
 * Content-Type application/json, else the request is a GET. Path parameters
 * of a "{preset}" route come from the route name after '/' ("cycles_unknown/
 * ottox"). Composite routes get a budget of 24 evaluations so a run stays
 * fast. Every answer must pass fuzz_check_response.
 */
#include "fuzz_common.h"
#include "http/query.h"

#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    const char *s = (const char *)data;
    const char *nl1 = memchr(s, '\n', size);
    size_t rlen = nl1 ? (size_t)(nl1 - s) : size;
    const char *q = nl1 ? nl1 + 1 : s + size;
    size_t left = size - (size_t)(q - s);
    const char *nl2 = memchr(q, '\n', left);
    size_t qlen = nl2 ? (size_t)(nl2 - q) : left;
    const char *body = nl2 ? nl2 + 1 : NULL;
    size_t blen = body ? size - (size_t)(body - s) : 0;

    char name[64];
    size_t nlen = rlen < sizeof name - 1 ? rlen : sizeof name - 1;
    memcpy(name, s, nlen);
    name[nlen] = '\0';
    char *param = strchr(name, '/');
    if (param)
        *param++ = '\0';
    size_t n_routes = 0;
    const gc_api_route *routes = gc_api_routes(&n_routes);
    const gc_api_route *rt = NULL;
    uint32_t h = 2166136261u;
    for (size_t i = 0; i < nlen; i++)
        h = (h ^ (uint8_t)name[i]) * 16777619u;
    for (size_t i = 0; i < n_routes; i++)
        if (routes[i].name && strcmp(routes[i].name, name) == 0)
            rt = &routes[i];
    if (!rt)
        rt = &routes[h % n_routes];

    gc_http_target t;
    char *raw = malloc(qlen + 2);
    if (!raw)
        return 0;
    raw[0] = '?';
    memcpy(raw + 1, q, qlen);
    gc_http_target_parse(raw, qlen + 1, 16384, 512, &t);

    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = (blen > 0 && (rt->methods & GC_M_POST)) ? GC_M_POST : GC_M_GET;
    req.path = rt->pattern;
    if (t.problem == GC_TARGET_OK) {
        req.query = t.params;
        req.n_query = t.n_params;
    }
    if (strchr(rt->pattern, '{')) {
        req.path_params[0].key = "preset";
        req.path_params[0].value = param ? param : "ottox";
        req.n_path_params = 1;
    }
    char *b = NULL;
    if (req.method == GC_M_POST) {
        b = malloc(blen ? blen : 1);
        if (b && blen)
            memcpy(b, body, blen);
        req.body = b;
        req.body_len = blen;
        req.content_type = "application/json";
    }
    req.request_id = "fuzz";
    gc_api_budget budget;
    memset(&budget, 0, sizeof budget);
    budget.max_evaluations = 24;
    req.budget = &budget;

    gc_api_response r;
    memset(&r, 0, sizeof r);
    int rc = rt->handler(&req, &r);
    if (rc == 0 || r.body)
        fuzz_check_response(&r);
    free(r.body);
    free(b);
    gc_http_target_free(&t);
    free(raw);
    return 0;
}
