/*
 * batch.c — POST /v1/batch: up to GC_BATCH_MAX_ITEMS independent evaluation
 * requests answered in one response, each with its own status and body
 * (the route's result or its RFC 9457 problem); and the inner-call helpers
 * (gc_api_inner_*) that /v1/sweeps and /v1/targets use to evaluate a cycle
 * through the very route a client would call.
 *
 * An inner call builds a gc_api_request (POST with a JSON body, or GET
 * with dotted query parameters when the outer request was a GET, so query
 * strings read exactly as they would at the route itself), finds the
 * handler in the route table (api.h: gc_api_routes, {name} segments
 * matched), runs it and parses its JSON answer. Nothing is shared between
 * calls: handlers stay pure functions of their request.
 *
 * A batch item naming a preset of the registry is decoded and evaluated in
 * process (routes/preset.c: gc_api_preset_answer) and its body placed into
 * the answer as the route wrote it (gc_out_raw_member: never parsed, unless
 * select= needs the tree); other routes (properties, and the presets not yet
 * in the registry) go through their handler.
 *
 * Batch items: {"id"?: string, "route": "/v1/cycles/otto", "body": {...},
 * "units"?: "si"|"us"} (units defaults to the batch's units=; the items'
 * plain numbers are read in the batch's input_units=). Only POST
 * evaluation routes are allowed (/v1/cycles/..., /v1/properties); the
 * multi-evaluation routes (/v1/batch, /v1/sweeps, /v1/targets) are refused
 * per item, which bounds the total work to GC_BATCH_MAX_ITEMS
 * evaluations. An item's failure never fails the batch: the batch answers
 * 200 with per-item statuses; only an unreadable or invalid batch itself
 * is a 400/422.
 */
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"
#include "gascycle/preset.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define GC_BATCH_MAX_ITEMS 100

/* ---- route matching ------------------------------------------------------ */

/* Matches path against pattern ({name} = one segment); fills params (values
 * are copied into store). Returns 1 on a match. */
static int match_route(const char *pattern, const char *path, gc_api_param *params,
                       size_t *n_params, char store[GC_API_MAX_PATH_PARAMS][80])
{
    size_t n = 0;
    const char *p = pattern, *s = path;
    while (*p && *s) {
        if (*p == '{') {
            const char *close = strchr(p, '}');
            if (!close)
                return 0;
            size_t len = strcspn(s, "/");
            if (len == 0 || len >= 80 || n >= GC_API_MAX_PATH_PARAMS)
                return 0;
            size_t nlen = (size_t)(close - p - 1);
            static const char *const names[] = { "preset", "name", "id", "key" };
            const char *key = "param";
            for (size_t i = 0; i < sizeof names / sizeof names[0]; i++)
                if (strlen(names[i]) == nlen && strncmp(names[i], p + 1, nlen) == 0)
                    key = names[i];
            memcpy(store[n], s, len);
            store[n][len] = '\0';
            params[n].key = key;
            params[n].value = store[n];
            n++;
            p = close + 1;
            s += len;
            continue;
        }
        if (*p != *s)
            return 0;
        p++;
        s++;
    }
    if (*p || *s)
        return 0;
    *n_params = n;
    return 1;
}

static const gc_api_route *find_route(const char *path, gc_api_param *params, size_t *n_params,
                                      char store[GC_API_MAX_PATH_PARAMS][80])
{
    size_t n = 0;
    const gc_api_route *routes = gc_api_routes(&n);
    for (size_t i = 0; i < n; i++)
        if (match_route(routes[i].pattern, path, params, n_params, store))
            return &routes[i];
    return NULL;
}

size_t gc_api_cycle_presets(const char **names, size_t max)
{
    size_t n = 0, k = 0;
    const gc_api_route *routes = gc_api_routes(&n);
    const char *prefix = "/v1/cycles/";
    for (size_t i = 0; i < n && k < max; i++) {
        const char *p = routes[i].pattern;
        if (strncmp(p, prefix, strlen(prefix)) == 0 && !strchr(p, '{'))
            names[k++] = p + strlen(prefix);
    }
    return k;
}

/* ---- inner calls ------------------------------------------------------------ */

typedef struct qbuf {
    gc_api_param *p;
    char **strings;   /* owned keys and values */
    size_t n, cap, n_str, cap_str;
    int oom;
} qbuf;

static char *qb_keep(qbuf *q, char *s)
{
    if (!s) {
        q->oom = 1;
        return NULL;
    }
    if (q->n_str == q->cap_str) {
        size_t cap = q->cap_str ? 2 * q->cap_str : 16;
        char **ns = realloc(q->strings, cap * sizeof *ns);
        if (!ns) {
            free(s);
            q->oom = 1;
            return NULL;
        }
        q->strings = ns;
        q->cap_str = cap;
    }
    q->strings[q->n_str++] = s;
    return s;
}

static void qb_add(qbuf *q, const char *key, const char *value)
{
    if (q->oom)
        return;
    if (q->n == q->cap) {
        size_t cap = q->cap ? 2 * q->cap : 16;
        gc_api_param *np = realloc(q->p, cap * sizeof *np);
        if (!np) {
            q->oom = 1;
            return;
        }
        q->p = np;
        q->cap = cap;
    }
    char *k = qb_keep(q, strdup(key));
    char *v = qb_keep(q, strdup(value));
    if (!k || !v)
        return;
    q->p[q->n].key = k;
    q->p[q->n].value = v;
    q->n++;
}

static void qb_free(qbuf *q)
{
    for (size_t i = 0; i < q->n_str; i++)
        free(q->strings[i]);
    free(q->strings);
    free(q->p);
}

/* Flattens an object into dotted query parameters (the inverse of the
 * decoder's query normalisation). */
static void flatten(qbuf *q, const char *prefix, json_t *v)
{
    char num[64];
    if (json_is_object(v) || json_is_array(v)) {
        const char *k;
        json_t *m;
        size_t i;
        char key[GC_API_FIELD_LEN];
        if (json_is_object(v)) {
            json_object_foreach(v, k, m) {
                snprintf(key, sizeof key, "%s%s%s", prefix, *prefix ? "." : "", k);
                flatten(q, key, m);
            }
        } else {
            json_array_foreach(v, i, m) {
                snprintf(key, sizeof key, "%s%s%zu", prefix, *prefix ? "." : "", i);
                flatten(q, key, m);
            }
        }
        return;
    }
    switch (json_typeof(v)) {
    case JSON_STRING:
        qb_add(q, prefix, json_string_value(v));
        break;
    case JSON_INTEGER:
        snprintf(num, sizeof num, "%" JSON_INTEGER_FORMAT, json_integer_value(v));
        qb_add(q, prefix, num);
        break;
    case JSON_REAL:
        snprintf(num, sizeof num, "%.17g", json_real_value(v));
        qb_add(q, prefix, num);
        break;
    case JSON_TRUE: qb_add(q, prefix, "true"); break;
    case JSON_FALSE: qb_add(q, prefix, "false"); break;
    default: qb_add(q, prefix, "null"); break;
    }
}

void gc_api_inner_free(gc_api_inner *in)
{
    json_decref(in->body);
    in->body = NULL;
}

int gc_api_inner_call(const char *path, json_t *fields, int as_query, int unit_system,
                      const char *request_id, gc_api_inner *out)
{
    memset(out, 0, sizeof *out);
    gc_api_param pp[GC_API_MAX_PATH_PARAMS];
    char store[GC_API_MAX_PATH_PARAMS][80];
    size_t npp = 0;
    const gc_api_route *rt = find_route(path, pp, &npp, store);
    if (!rt) {
        out->status = 404;
        out->error_class = "not_found";
        return 0;
    }
    unsigned method = as_query ? GC_M_GET : GC_M_POST;
    if (!(rt->methods & method)) {
        out->status = 405;
        out->error_class = "method";
        return 0;
    }
    qbuf q = { 0 };
    char *text = NULL;
    if (as_query)
        flatten(&q, "", fields);
    else if (!(text = json_dumps(fields, JSON_COMPACT)))
        q.oom = 1;
    qb_add(&q, "units", gc_units_system_name((gc_unit_system)unit_system));
    if (q.oom) {
        free(text);
        qb_free(&q);
        return -1;
    }
    gc_api_request r;
    memset(&r, 0, sizeof r);
    r.method = method;
    r.path = path;
    r.query = q.p;
    r.n_query = q.n;
    for (size_t i = 0; i < npp; i++)
        r.path_params[i] = pp[i];
    r.n_path_params = npp;
    r.body = text;
    r.body_len = text ? strlen(text) : 0;
    r.content_type = text ? "application/json" : NULL;
    r.request_id = request_id;
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    rt->handler(&r, &resp);
    free(text);
    qb_free(&q);
    out->status = resp.status;
    out->error_class = resp.error_class;
    if (resp.body && resp.content_type && strstr(resp.content_type, "json"))
        out->body = json_loadb(resp.body, resp.body_len, 0, NULL);
    free(resp.body);
    if (!out->error_class && resp.status != 200 && out->body) {
        /* the class from the problem type (valid while out->body lives) */
        const char *type = json_string_value(json_object_get(out->body, "type"));
        size_t nb = strlen(GC_API_PROBLEM_TYPE_BASE);
        if (type && strncmp(type, GC_API_PROBLEM_TYPE_BASE, nb) == 0)
            out->error_class = type + nb;
    }
    if (resp.status == 503)
        return -1;
    return 0;
}

void gc_api_inner_problem_errors(const gc_api_inner *in, const char *prefix, json_t *dst)
{
    json_t *errs = in->body ? json_object_get(in->body, "errors") : NULL;
    size_t i;
    json_t *e;
    json_array_foreach(errs, i, e) {
        const char *f = json_string_value(json_object_get(e, "field"));
        const char *m = json_string_value(json_object_get(e, "message"));
        char field[GC_API_FIELD_LEN * 2];
        snprintf(field, sizeof field, "%s%s", prefix ? prefix : "", f ? f : "");
        json_array_append_new(dst, json_pack("{s:s, s:s}", "field", field, "message",
                                             m ? m : ""));
    }
}

/* ---- /v1/batch --------------------------------------------------------------- */

static const char *const item_keys[] = { "id", "route", "body", "units", NULL };

static int refused_route(const char *route)
{
    return strcmp(route, "/v1/batch") == 0 || strcmp(route, "/v1/sweeps") == 0 ||
           strcmp(route, "/v1/targets") == 0;
}

/* A problem object for a batch item (the same members as a route's). */
static json_t *item_problem(int status, const char *cls, const char *detail, const char *field,
                            const char *message)
{
    char type[128];
    snprintf(type, sizeof type, "%s%s", GC_API_PROBLEM_TYPE_BASE, cls);
    json_t *p = json_pack("{s:s, s:s, s:i, s:s}", "type", type, "title",
                          gc_api_status_title(status), "status", status, "detail", detail);
    if (p && field) {
        json_t *errs = json_array();
        json_array_append_new(errs, json_pack("{s:s, s:s}", "field", field, "message", message));
        json_object_set_new(p, "errors", errs);
    }
    return p;
}

/* Unknown members of the batch or of item `base` (an object). */
static void unknown_members(json_t *obj, const char *base, const char *const *keys, size_t nk,
                            const char *hint, gc_api_errors *errs)
{
    const char *k;
    json_t *v;
    json_object_foreach(obj, k, v) {
        int known = 0;
        for (size_t j = 0; j < nk; j++)
            known |= strcmp(k, keys[j]) == 0;
        if (known)
            continue;
        char f[GC_API_FIELD_LEN];
        snprintf(f, sizeof f, "%s", base);
        gc_out_pointer_append(f, sizeof f, k);
        const char *s = gc_decode_suggest(k, keys, nk);
        if (s)
            gc_api_errors_add(errs, f, "unknown field; did you mean '%s'?", s);
        else
            gc_api_errors_add(errs, f, "unknown field; %s", hint);
    }
}

static void check_item(json_t *it, size_t i, gc_api_errors *errs)
{
    char base[40], f[GC_API_FIELD_LEN];
    snprintf(base, sizeof base, "/requests/%zu", i);
    if (!json_is_object(it)) {
        gc_api_errors_add(errs, base, "must be an object {route, body}");
        return;
    }
    unknown_members(it, base, item_keys, 4, "an item has id, route, body and units", errs);
    snprintf(f, sizeof f, "%s/route", base);
    if (!json_is_string(json_object_get(it, "route")))
        gc_api_errors_add(errs, f, "is required: a route path such as '/v1/cycles/otto'");
    json_t *body = json_object_get(it, "body");
    snprintf(f, sizeof f, "%s/body", base);
    if (body && !json_is_object(body))
        gc_api_errors_add(errs, f, "must be an object (the route's input fields)");
    json_t *id = json_object_get(it, "id");
    snprintf(f, sizeof f, "%s/id", base);
    if (id && !json_is_string(id))
        gc_api_errors_add(errs, f, "must be a string");
    json_t *un = json_object_get(it, "units");
    gc_unit_system sys;
    snprintf(f, sizeof f, "%s/units", base);
    if (un && (!json_is_string(un) ||
               gc_units_system_parse(json_string_value(un), &sys) != GC_OK))
        gc_api_errors_add(errs, f, "must be 'si' or 'us'");
}

/* The list of requests, or NULL with errs filled. */
static json_t *check_batch(json_t *root, gc_api_errors *errs)
{
    static const char *const top_keys[] = { "requests", NULL };
    unknown_members(root, "", top_keys, 1, "a batch has only 'requests'", errs);
    json_t *items = json_object_get(root, "requests");
    if (!items)
        gc_api_errors_add(errs, "/requests", "is required: a list of {route, body} objects");
    else if (!json_is_array(items))
        gc_api_errors_add(errs, "/requests", "must be an array of {route, body} objects");
    else if (json_array_size(items) == 0)
        gc_api_errors_add(errs, "/requests", "must hold at least one request");
    else if (json_array_size(items) > GC_BATCH_MAX_ITEMS)
        gc_api_errors_add(errs, "/requests", "holds %zu requests; at most %d are allowed per "
                          "batch (split it, or use /v1/sweeps for a parameter study)",
                          json_array_size(items), GC_BATCH_MAX_ITEMS);
    if (errs->n == 0) {
        size_t i;
        json_t *it;
        json_array_foreach(items, i, it)
            check_item(it, i, errs);
    }
    return errs->n ? NULL : items;
}

/* An item through a route outside the registry (its handler, the answer
 * parsed); its status, the body in *out. -1 when memory ran out. */
static int item_by_route(const char *route, json_t *body, gc_unit_system sys,
                         const char *request_id, json_t **out)
{
    json_t *fields = body ? json_incref(body) : json_object();
    gc_api_inner in;
    int rc = gc_api_inner_call(route, fields, 0, sys, request_id, &in);
    json_decref(fields);
    if (rc != 0) {
        gc_api_inner_free(&in);
        return -1;
    }
    int status = in.status;
    if (in.body)
        *out = json_incref(in.body);
    else if (status == 404)
        *out = item_problem(404, "not_found", "No route at this path.", "/route",
                            "no such route; see /openapi.json for the routes");
    else if (status == 405)
        *out = item_problem(405, "method", "This route takes GET only; a batch sends every "
                            "item as a POST.", "/route", "must be a route that accepts POST");
    else
        *out = item_problem(status, "unavailable", "The route answered without a JSON body "
                            "(batch items are always JSON).", NULL, NULL);
    gc_api_inner_free(&in);
    return status;
}

/* One item's answer into ans; its status, -1 when memory ran out, -2 when
 * the request's budget (api.h) refused the evaluation. Its evaluations are
 * counted in tally (metrics). */
static int run_item(json_t *it, gc_out *o, const gc_api_request *req, json_t *ans,
                    gc_api_response *tally)
{
    const char *route = json_string_value(json_object_get(it, "route"));
    json_t *body = json_object_get(it, "body");
    json_t *un = json_object_get(it, "units");
    gc_unit_system sys = o->sys;
    if (un)
        gc_units_system_parse(json_string_value(un), &sys);
    json_t *out_body = NULL;
    int status;
    const gc_preset *p = gc_api_preset_at(route);
    if (refused_route(route)) {
        status = 422;
        out_body = item_problem(422, "validation", "This route cannot be called from a batch "
                                "(it runs many evaluations itself).", "/route",
                                "must be a single-evaluation route such as /v1/cycles/otto or "
                                "/v1/properties");
    } else if (strncmp(route, "/v1/", 4) != 0) {
        status = 404;
        out_body = item_problem(404, "not_found", "No evaluation route at this path.", "/route",
                                "must be an evaluation route under /v1/");
    } else if (gc_api_budget_charge(req->budget, 1) != 0) {   /* budget hook */
        return -2;
    } else if (p) {
        /* a preset: decoded and evaluated here, its body placed as written */
        gc_api_response r;
        memset(&r, 0, sizeof r);
        json_t *fields = body ? json_incref(body) : json_object();
        gc_api_preset_answer(p, fields, sys, o->input_sys, &r);
        json_decref(fields);
        if (r.status == 503 || !r.body) {
            free(r.body);
            return -1;
        }
        json_object_set_new(ans, "status", json_integer(r.status));
        gc_out_raw_member(o, ans, "body", r.body, r.body_len);
        for (int k = 0; k < r.n_evaluated; k++)
            gc_api_count_evaluations(tally, r.evaluated[k].preset, r.evaluated[k].n);
        return r.status;
    } else if ((status = item_by_route(route, body, sys, req->request_id, &out_body)) < 0) {
        return -1;
    }
    json_object_set_new(ans, "status", json_integer(status));
    json_object_set_new(ans, "body", out_body ? out_body : json_null());
    return status;
}

int gc_api_h_batch(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    json_t *root = NULL;
    int begin_rc;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_SELECT |
                               GC_OUT_ACCEPT_INPUT_UNITS, &o, &errs,
                               &root, resp, &begin_rc) != 0)
        return begin_rc;
    json_t *items = check_batch(root, &errs);
    if (!items) {
        json_decref(root);
        gc_out_free(&o);
        gc_api_problem_errors(resp, 422, "validation", "Invalid batch", NULL, &errs);
        return 0;
    }
    json_t *doc = json_object();
    json_t *answers = json_array();
    size_t n_ok = 0, i;
    json_t *it;
    json_array_foreach(items, i, it) {
        json_t *ans = json_object();
        json_t *id = json_object_get(it, "id");
        if (id)
            json_object_set(ans, "id", id);
        json_object_set_new(ans, "route", json_string(json_string_value(json_object_get(it,
                                                                                  "route"))));
        int status = run_item(it, &o, req, ans, resp);
        if (status == -2) {   /* the budget refused: the HTTP layer answers */
            json_decref(ans);
            break;
        }
        json_array_append_new(answers, ans);
        if (status < 0) {
            json_decref(answers);
            json_decref(doc);
            json_decref(root);
            gc_out_free(&o);
            return gc_api_problem(resp, 503, "overloaded", NULL,
                                  "The server ran out of memory.", NULL);
        }
        n_ok += status == 200;
    }
    json_object_set_new(doc, "count", json_integer((json_int_t)json_array_size(items)));
    json_object_set_new(doc, "succeeded", json_integer((json_int_t)n_ok));
    json_object_set_new(doc, "failed", json_integer((json_int_t)(json_array_size(items) - n_ok)));
    json_object_set_new(doc, "responses", answers);
    json_object_set_new(o.inputs, "requests", json_integer((json_int_t)json_array_size(items)));
    if (n_ok < json_array_size(items))
        gc_out_warn(&o, "batch_items_failed", "/requests", "%zu of %zu requests failed; each "
                    "failed item carries its own problem", json_array_size(items) - n_ok,
                    json_array_size(items));
    json_decref(root);
    return gc_out_respond(&o, doc, GC_OUT_EVALUATION, resp);
}

/* ---- helpers shared by sweeps.c and targets.c ------------------------------ */

/* The presets a study may name: the cycle routes, then the presets with a
 * route of their own (the machine's: /v1/machine/<segment>). */
size_t gc_api_study_presets(const char **names, size_t max)
{
    size_t k = gc_api_cycle_presets(names, max);
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    for (int i = 0; i < n && k < max; i++)
        if (all[i]->route_base)
            names[k++] = all[i]->name;
    return k;
}

int gc_api_cycle_path(json_t *cycle, gc_api_errors *errs, char *path, size_t n)
{
    const char *names[48];
    size_t k = gc_api_study_presets(names, 48);
    char list[600] = "";
    for (size_t i = 0; i < k; i++) {
        size_t used = strlen(list);
        snprintf(list + used, sizeof list - used, "%s%s", i ? ", " : "", names[i]);
    }
    if (!cycle) {
        gc_api_errors_add(errs, "/cycle", "is required: one of %s", list);
        return -1;
    }
    if (!json_is_string(cycle)) {
        gc_api_errors_add(errs, "/cycle", "must be a preset name: one of %s", list);
        return -1;
    }
    const char *c = json_string_value(cycle);
    for (size_t i = 0; i < k; i++)
        if (strcmp(c, names[i]) == 0) {
            const gc_preset *p = gc_preset_find(c);
            if (p && p->route_base)
                snprintf(path, n, "%s%s", p->route_base, p->segment ? p->segment : p->name);
            else
                snprintf(path, n, "/v1/cycles/%s", c);
            return 0;
        }
    const char *s = gc_decode_suggest(c, names, k);
    if (s)
        gc_api_errors_add(errs, "/cycle", "unknown cycle preset '%.40s'; did you mean '%s'?", c,
                          s);
    else
        gc_api_errors_add(errs, "/cycle", "unknown cycle preset '%.40s'; the presets are: %s", c,
                          list);
    return -1;
}

const gc_preset *gc_api_cycle_preset(const char *path)
{
    static const char prefix[] = "/v1/cycles/";
    if (!path)
        return NULL;
    if (strncmp(path, prefix, sizeof prefix - 1) != 0) {
        const gc_preset *own = gc_preset_at_path(path);   /* a route of its own */
        return own && own->route_base ? own : NULL;
    }
    const gc_preset *p = gc_preset_find(path + sizeof prefix - 1);
    return p && p->kind == GC_PRESET_CYCLE ? p : NULL;
}

int gc_api_value_split(json_t *v, double *num, char *unit, size_t unit_len)
{
    unit[0] = '\0';
    if (json_is_number(v)) {
        *num = json_number_value(v);
        return isfinite(*num) ? 0 : -1;
    }
    if (!json_is_string(v))
        return -1;
    const char *s = json_string_value(v);
    while (*s == ' ')
        s++;
    /* strict number: digits, sign, point, exponent (no hex, no nan/inf) */
    const char *e = s;
    if (*e == '+' || *e == '-')
        e++;
    int digits = 0;
    while ((*e >= '0' && *e <= '9') || *e == '.') {
        digits += *e != '.';
        e++;
    }
    if (!digits)
        return -1;
    if ((*e == 'e' || *e == 'E') && ((e[1] >= '0' && e[1] <= '9') ||
        ((e[1] == '+' || e[1] == '-') && e[2] >= '0' && e[2] <= '9'))) {
        e += 2;
        while (*e >= '0' && *e <= '9')
            e++;
    }
    char buf[64];
    size_t len = (size_t)(e - s);
    if (len >= sizeof buf)
        return -1;
    memcpy(buf, s, len);
    buf[len] = '\0';
    char *end = NULL;
    double x = strtod(buf, &end);
    if (!end || *end || !isfinite(x))
        return -1;
    while (*e == ' ')
        e++;
    size_t ul = strlen(e);
    while (ul > 0 && e[ul - 1] == ' ')
        ul--;
    if (ul >= unit_len)
        return -1;
    memcpy(unit, e, ul);
    unit[ul] = '\0';
    *num = x;
    return 0;
}

json_t *gc_api_value_make(double num, const char *unit)
{
    if (unit && *unit) {
        char buf[160];
        snprintf(buf, sizeof buf, "%.17g %s", num, unit);
        return json_string(buf);
    }
    if (num == floor(num) && fabs(num) < 9.0e15)
        return json_integer((json_int_t)num);
    return json_real(num);
}

int gc_api_label_quantity(const char *label, int unit_system)
{
    if (!label)
        return -1;
    for (int q = 0; q < GC_Q_COUNT; q++)
        if (strcmp(gc_units_label((gc_quantity)q, (gc_unit_system)unit_system), label) == 0)
            return q;
    return -1;
}

/* Next reference token of pointer p (after its '/') into tok; returns the
 * rest (at the next '/' or the end), or NULL when malformed. */
static const char *next_token(const char *p, char *tok, size_t n)
{
    size_t k = 0;
    p++;
    while (*p && *p != '/') {
        char c = *p;
        if (c == '~') {
            if (p[1] == '0')
                c = '~';
            else if (p[1] == '1')
                c = '/';
            else
                return NULL;
            p++;
        }
        if (k + 1 >= n)
            return NULL;
        tok[k++] = c;
        p++;
    }
    tok[k] = '\0';
    return p;
}

int gc_api_pointer_set(json_t *root, const char *pointer, json_t *value)
{
    json_t *obj = root;
    const char *p = pointer;
    char tok[GC_API_FIELD_LEN];
    if (!value)
        return -1;
    if (!p || *p != '/' || !json_is_object(root)) {
        json_decref(value);
        return -1;
    }
    for (;;) {
        p = next_token(p, tok, sizeof tok);
        if (!p || !tok[0]) {
            json_decref(value);
            return -1;
        }
        if (*p == '\0')
            return json_object_set_new(obj, tok, value) == 0 ? 0 : -1;
        json_t *next = json_object_get(obj, tok);
        if (!next) {
            next = json_object();
            if (json_object_set_new(obj, tok, next) != 0) {
                json_decref(value);
                return -1;
            }
        } else if (json_is_string(next) && !strchr(p + 1, '/')) {
            /* "gas": "cold" with a member set (/gas/k): the variant as an object */
            json_t *o2 = json_pack("{s:O}", "model", next);
            if (!o2 || json_object_set_new(obj, tok, o2) != 0) {
                json_decref(value);
                return -1;
            }
            next = o2;
        } else if (!json_is_object(next)) {
            json_decref(value);
            return -1;
        }
        obj = next;
    }
}

int gc_api_input_pointer(const char *name, char *out, size_t n)
{
    if (!name || !*name || n < 2)
        return -1;
    if (name[0] == '/') {
        if (strlen(name) >= n || strlen(name) < 2)
            return -1;
        strcpy(out, name);
    } else {
        size_t len = strlen(name);
        if (len + 2 > n)
            return -1;
        out[0] = '/';
        for (size_t i = 0; i <= len; i++)
            out[i + 1] = name[i] == '.' ? '/' : name[i];
    }
    /* no empty tokens, valid escapes */
    for (const char *p = out; *p; p++) {
        if (*p == '/' && (p[1] == '/' || p[1] == '\0'))
            return -1;
        if (*p == '~' && p[1] != '0' && p[1] != '1')
            return -1;
    }
    return 0;
}

void gc_api_inner_warnings(gc_out *o, json_t *inner_body, json_t *seen)
{
    json_t *ws = json_object_get(inner_body, "warnings");
    size_t i;
    json_t *w;
    json_array_foreach(ws, i, w) {
        const char *code = json_string_value(json_object_get(w, "code"));
        const char *field = json_string_value(json_object_get(w, "field"));
        const char *msg = json_string_value(json_object_get(w, "message"));
        if (!code || !msg)
            continue;
        char key[GC_API_FIELD_LEN + 64];
        snprintf(key, sizeof key, "%s %s", code, field ? field : "");
        if (json_object_get(seen, key) || json_object_size(seen) >= 24)
            continue;
        json_object_set_new(seen, key, json_true());
        char f[GC_API_FIELD_LEN + 8];
        if (field)
            snprintf(f, sizeof f, "/inputs%s", field);
        gc_out_warn(o, code, field ? f : NULL, "%s", msg);
    }
}

int gc_api_composite_begin(const gc_api_request *req, unsigned accepted, gc_out *o,
                           gc_api_errors *errs, json_t **root, gc_api_response *resp, int *rc)
{
    *rc = 0;
    *root = NULL;
    if (gc_out_init(o) != 0) {
        *rc = gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return 1;
    }
    gc_api_errors_init(errs);
    if (gc_out_parse_params(o, req, accepted, errs) > 0) {
        gc_out_free(o);
        gc_api_problem_errors(resp, 400, "bad_output", "Invalid output parameters", NULL, errs);
        return 1;
    }
    if (gc_decode_normalise(req, root, resp) != 0) {
        gc_out_free(o);
        return 1;
    }
    return 0;
}

void gc_api_unknown_keys(json_t *obj, const char *base, const char *const *keys,
                         gc_api_errors *errs)
{
    const char *k;
    json_t *v;
    size_t nk = 0;
    while (keys[nk])
        nk++;
    json_object_foreach(obj, k, v) {
        int known = 0;
        for (size_t i = 0; i < nk; i++)
            known |= strcmp(k, keys[i]) == 0;
        if (known)
            continue;
        char f[GC_API_FIELD_LEN];
        snprintf(f, sizeof f, "%s", base);
        gc_out_pointer_append(f, sizeof f, k);
        const char *s = gc_decode_suggest(k, keys, nk);
        if (s)
            gc_api_errors_add(errs, f, "unknown field; did you mean '%s'?", s);
        else
            gc_api_errors_add(errs, f, "unknown field");
    }
}

const char *gc_api_pointer_last(const char *pointer)
{
    const char *s = strrchr(pointer, '/');
    return s ? s + 1 : pointer;
}

void gc_api_pointer_name(const char *pointer, char *name, size_t n)
{
    snprintf(name, n, "%s", pointer + (pointer[0] == '/'));
    for (char *p = name; *p; p++)
        if (*p == '/')
            *p = '.';
}
