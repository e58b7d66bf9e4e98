/*
 * router.c — path pattern matching for the HTTP layer (see router.h).
 */
#include "http/router.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void build_allow(gc_route *rt)
{
    char *p = rt->allow;
    size_t room = sizeof rt->allow;
    int n = 0;
    static const struct { unsigned bit; const char *name; } order[] = {
        { GC_M_GET, "GET" }, { GC_M_HEAD, "HEAD" }, { GC_M_POST, "POST" }, { GC_M_OPTIONS, "OPTIONS" }
    };
    rt->allow[0] = '\0';
    for (size_t i = 0; i < sizeof order / sizeof order[0]; i++) {
        if (!(rt->methods & order[i].bit))
            continue;
        int w = snprintf(p, room, "%s%s", n ? ", " : "", order[i].name);
        if (w < 0 || (size_t)w >= room)
            return;
        p += w;
        room -= (size_t)w;
        n++;
    }
}

/* Splits pattern into segments. Returns 0 or -1 (message in err). */
static int compile(gc_route *rt, char *err, size_t err_len)
{
    const char *pat = rt->pattern;
    size_t n = 0, n_params = 0;

    if (!pat || pat[0] != '/') {
        snprintf(err, err_len, "route pattern \"%s\" must start with '/'", pat ? pat : "(null)");
        return -1;
    }
    for (const char *q = pat; *q; q++)
        if (*q == '/')
            n++;
    rt->segs = calloc(n, sizeof *rt->segs);
    if (!rt->segs) {
        snprintf(err, err_len, "out of memory");
        return -1;
    }
    const char *s = pat + 1;
    for (size_t i = 0; i < n; i++) {
        const char *e = strchr(s, '/');
        size_t len = e ? (size_t)(e - s) : strlen(s);
        gc_router_seg *sg = &rt->segs[i];
        if (len >= 2 && s[0] == '{' && s[len - 1] == '}') {
            char *name = malloc(len - 1);
            if (!name) {
                snprintf(err, err_len, "out of memory");
                return -1;
            }
            memcpy(name, s + 1, len - 2);
            name[len - 2] = '\0';
            if (len == 2 || memchr(name, '{', len - 2) || memchr(name, '}', len - 2)) {
                free(name);
                snprintf(err, err_len, "route pattern \"%s\" has a malformed parameter", pat);
                return -1;
            }
            sg->text = name;
            sg->len = len - 2;
            sg->is_param = 1;
            if (++n_params > GC_API_MAX_PATH_PARAMS) {
                snprintf(err, err_len, "route pattern \"%s\" has more than %d parameters",
                         pat, GC_API_MAX_PATH_PARAMS);
                rt->n_segs = i + 1;
                return -1;
            }
        } else {
            if (memchr(s, '{', len) || memchr(s, '}', len)) {
                snprintf(err, err_len, "route pattern \"%s\" has a stray brace", pat);
                rt->n_segs = i;
                return -1;
            }
            sg->text = s;
            sg->len = len;
            sg->is_param = 0;
            rt->n_literal++;
        }
        rt->n_segs = i + 1;
        s = e ? e + 1 : s + len;
    }
    return 0;
}

int gc_router_init(gc_router *r, const gc_router_op_spec *ops, size_t n_ops,
                   const gc_api_route *api, size_t n_api, char *err, size_t err_len)
{
    memset(r, 0, sizeof *r);
    size_t n = n_ops + n_api;
    r->routes = calloc(n ? n : 1, sizeof *r->routes);
    r->labels = calloc(n + 1, sizeof *r->labels);
    if (!r->routes || !r->labels) {
        snprintf(err, err_len, "out of memory");
        gc_router_free(r);
        return -1;
    }
    for (size_t i = 0; i < n; i++) {
        gc_route *rt = &r->routes[i];
        if (i < n_ops) {
            rt->pattern = ops[i].pattern;
            rt->name = ops[i].name;
            rt->methods = ops[i].methods;
            rt->op = ops[i].op;
        } else {
            const gc_api_route *a = &api[i - n_ops];
            rt->pattern = a->pattern;
            rt->name = a->name ? a->name : a->pattern;
            rt->methods = a->methods;
            rt->handler = a->handler;
            rt->op = GC_OP_API;
            rt->composite = gc_api_route_is_composite(a);
            rt->flags = a->flags;
            if (!a->handler) {
                snprintf(err, err_len, "route \"%s\" has no handler", a->pattern ? a->pattern : "?");
                r->n_routes = i + 1;
                gc_router_free(r);
                return -1;
            }
        }
        rt->index = i;
        rt->methods &= (unsigned)(GC_M_GET | GC_M_POST | GC_M_HEAD);
        if (rt->methods & GC_M_GET)
            rt->methods |= GC_M_HEAD;
        rt->methods |= GC_M_OPTIONS;
        r->n_routes = i + 1;
        if (compile(rt, err, err_len) != 0) {
            gc_router_free(r);
            return -1;
        }
        build_allow(rt);
        r->labels[i] = rt->name;
    }
    r->labels[n] = "unmatched";
    r->n_labels = n + 1;
    return 0;
}

void gc_router_free(gc_router *r)
{
    if (r->routes) {
        for (size_t i = 0; i < r->n_routes; i++) {
            gc_route *rt = &r->routes[i];
            if (!rt->segs)
                continue;
            for (size_t k = 0; k < rt->n_segs; k++)
                if (rt->segs[k].is_param)
                    free((void *)(uintptr_t)rt->segs[k].text);
            free(rt->segs);
        }
    }
    free(r->routes);
    free(r->labels);
    memset(r, 0, sizeof *r);
}

size_t gc_router_unmatched_index(const gc_router *r)
{
    return r->n_labels ? r->n_labels - 1 : 0;
}

/* 1 when path matches rt (path starts with '/'). */
static int matches(const gc_route *rt, const char *path)
{
    const char *s = path + 1;
    for (size_t i = 0; i < rt->n_segs; i++) {
        const char *e = strchr(s, '/');
        size_t len = e ? (size_t)(e - s) : strlen(s);
        const gc_router_seg *sg = &rt->segs[i];
        if (sg->is_param) {
            if (len == 0)
                return 0;
        } else if (len != sg->len || memcmp(s, sg->text, len) != 0) {
            return 0;
        }
        if (i + 1 < rt->n_segs) {
            if (!e)
                return 0;        /* path has fewer segments */
            s = e + 1;
        } else if (e) {
            return 0;            /* path has more segments */
        }
    }
    return 1;
}

static const gc_route *best_match(const gc_router *r, const char *path)
{
    const gc_route *best = NULL;
    for (size_t i = 0; i < r->n_routes; i++) {
        const gc_route *rt = &r->routes[i];
        if ((!best || rt->n_literal > best->n_literal) && matches(rt, path))
            best = rt;
    }
    return best;
}

/* The route of path without its one trailing slash ("/v1/cycles/otto/" is
 * "/v1/cycles/otto"; the API layer trims the path it hands on the same way),
 * its parameters copied as for the path itself. */
static const gc_route *match_trimmed(const gc_router *r, const char *path, char *scratch,
                                     size_t scratch_len, gc_api_param *params, size_t *n_params)
{
    size_t len = strlen(path);
    if (len < 2 || path[len - 1] != '/' || path[len - 2] == '/')
        return NULL;
    char *t = strndup(path, len - 1);
    if (!t)
        return NULL;
    const gc_route *rt = best_match(r, t) ? gc_router_match(r, t, scratch, scratch_len, params,
                                                            n_params) : NULL;
    free(t);
    return rt;
}

const gc_route *gc_router_match(const gc_router *r, const char *path,
                                char *scratch, size_t scratch_len,
                                gc_api_param *params, size_t *n_params)
{
    *n_params = 0;
    if (!path || path[0] != '/')
        return NULL;
    const gc_route *best = best_match(r, path);
    if (!best)
        return match_trimmed(r, path, scratch, scratch_len, params, n_params);

    /* Copy the parameter values out of the path. */
    const char *s = path + 1;
    size_t used = 0;
    for (size_t i = 0; i < best->n_segs; i++) {
        const char *e = strchr(s, '/');
        size_t len = e ? (size_t)(e - s) : strlen(s);
        const gc_router_seg *sg = &best->segs[i];
        if (sg->is_param) {
            if (used + len + 1 > scratch_len || *n_params >= GC_API_MAX_PATH_PARAMS)
                return NULL;     /* cannot happen with scratch >= strlen(path) + 1 */
            memcpy(scratch + used, s, len);
            scratch[used + len] = '\0';
            params[*n_params].key = sg->text;
            params[*n_params].value = scratch + used;
            (*n_params)++;
            used += len + 1;
        }
        s = e ? e + 1 : s + len;
    }
    return best;
}
