/*
 * params.c — the output parameters of params.h. The general ones go through
 * output.c's parser (on a gc_out used only for its scalar members: nothing
 * is allocated); the diagram options of the cycle routes are parsed here
 * first, as the cycle routes always did (their errors answer alone).
 */
#include "api/request/params.h"
#include "gascycle/path.h"

#include <ctype.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const char *const diagram_keys[] = { "scale", "overlay", "width", "height", NULL };

static const char *query_get(const gc_api_request *req, const char *key)
{
    for (size_t i = 0; i < req->n_query; i++)
        if (req->query[i].key && strcmp(req->query[i].key, key) == 0)
            return req->query[i].value ? req->query[i].value : "";
    return NULL;
}

static int diagram_key(const char *k)
{
    for (int i = 0; diagram_keys[i]; i++)
        if (k && strcmp(k, diagram_keys[i]) == 0)
            return i;
    return -1;
}

int gc_api_params_is_output(const char *key, unsigned accepted)
{
    size_t seg = strcspn(key, ".");
    char first[32];
    snprintf(first, sizeof first, "%.*s", (int)(seg < 31 ? seg : 31), key);
    return gc_out_is_reserved(first) ||
           ((accepted & GC_PARAMS_ACCEPT_DIAGRAM) && diagram_key(key) >= 0);
}

static int parse_int(const char *s, int *out)
{
    char *end = NULL;
    if (!s || !*s || isspace((unsigned char)*s))
        return -1;
    long v = strtol(s, &end, 10);
    if (*end || v < -1000000 || v > 1000000)
        return -1;
    *out = (int)v;
    return 0;
}

static void overlay(gc_api_params *v, const char *s, const char *field, gc_api_errors *errs)
{
    unsigned ov = 0;
    if (strcmp(s, "none") != 0) {
        const char *p = s;
        for (;;) {
            size_t len = strcspn(p, ",");
            if (len == 5 && strncmp(p, "ideal", 5) == 0) {
                ov |= GC_DIAGRAM_OVERLAY_IDEAL;
            } else if (len == 6 && strncmp(p, "carnot", 6) == 0) {
                ov |= GC_DIAGRAM_OVERLAY_CARNOT;
            } else {
                gc_api_errors_add(errs, field, "must be 'none' or a comma list of 'ideal' and "
                                  "'carnot'");
                break;
            }
            if (!p[len])
                break;
            p += len + 1;
        }
    }
    v->diagram.overlays = ov;
}

static void one_diagram_key(gc_api_params *v, int which, const char *s, const char *field,
                            gc_api_errors *errs)
{
    int n = 0;
    switch (which) {
    case 0: /* scale */
        if (strcmp(s, "log") == 0)
            v->diagram.log_x = v->diagram.log_y = 1;
        else if (strcmp(s, "linear") != 0)
            gc_api_errors_add(errs, field, "must be 'linear' or 'log' (log applies to the P-v "
                              "diagram, both axes)");
        break;
    case 1: /* overlay */
        overlay(v, s, field, errs);
        break;
    default: /* width, height */
        if (parse_int(s, &n) != 0 || n < GC_DIAGRAM_MIN_SIZE || n > GC_DIAGRAM_MAX_SIZE)
            gc_api_errors_add(errs, field, "must be a whole number of px from %d to %d",
                              GC_DIAGRAM_MIN_SIZE, GC_DIAGRAM_MAX_SIZE);
        else if (which == 2)
            v->diagram.width_px = n;
        else
            v->diagram.height_px = n;
        break;
    }
}

/* include=<name>[,<name>...]: a preset's own optional parts (JSON or CSV). */
static void include_parts(gc_api_params *v, const char *inc, const char *const *names,
                          int svg, gc_api_errors *errs)
{
    char list[160] = "";
    for (int i = 0; names[i]; i++) {
        size_t used = strlen(list);
        snprintf(list + used, sizeof list - used, "%s'%s'", i ? ", " : "", names[i]);
    }
    if (svg) {
        gc_api_errors_add(errs, "/include", "applies only with format=json or csv");
        return;
    }
    for (const char *p = inc;;) {
        size_t len = strcspn(p, ",");
        int k = -1;
        for (int i = 0; names[i] && i < 32; i++)
            if (strlen(names[i]) == len && strncmp(p, names[i], len) == 0)
                k = i;
        if (k < 0) {
            gc_api_errors_add(errs, "/include", "must be a comma list of %s", list);
            return;
        }
        v->include |= 1u << k;
        if (!p[len])
            return;
        p += len + 1;
    }
}

static void include_and_points(gc_api_params *v, const gc_api_request *req, int svg, int json,
                               const char *const *parts, gc_api_errors *errs)
{
    const char *inc = query_get(req, "include");
    if (inc && parts) {
        include_parts(v, inc, parts, svg, errs);
    } else if (inc) {
        if (strcmp(inc, "paths") != 0)
            gc_api_errors_add(errs, "/include", "must be 'paths'");
        else if (!json)
            gc_api_errors_add(errs, "/include", "applies only with format=json");
        else
            v->include_paths = 1;
    }
    const char *pts = query_get(req, "points");
    if (pts) {
        int n = 0;
        if (parse_int(pts, &n) != 0 || n < GC_PATH_MIN_POINTS || n > GC_PATH_MAX_POINTS)
            gc_api_errors_add(errs, "/points", "must be a whole number from %d to %d",
                              GC_PATH_MIN_POINTS, GC_PATH_MAX_POINTS);
        else if (!svg && !v->include_paths)
            gc_api_errors_add(errs, "/points", "applies only with format=svg or include=paths");
        else
            v->points = n;
    }
}

/* The diagram options, include and points of a cycle route. */
static int parse_view(gc_api_params *v, const gc_api_request *req, const char *const *parts,
                      gc_api_errors *errs)
{
    const char *fmt = query_get(req, "format");
    int svg = fmt && strcmp(fmt, "svg") == 0;
    int json = !fmt || strcmp(fmt, "json") == 0;
    int seen[4] = { 0 };
    for (size_t i = 0; i < req->n_query; i++) {
        int which = diagram_key(req->query[i].key);
        if (which < 0)
            continue;
        char field[24];
        snprintf(field, sizeof field, "/%s", req->query[i].key);
        if (seen[which]++)
            gc_api_errors_add(errs, field, "given more than once");
        else if (!svg)
            gc_api_errors_add(errs, field, "applies only with format=svg");
        else
            one_diagram_key(v, which, req->query[i].value ? req->query[i].value : "", field,
                            errs);
    }
    include_and_points(v, req, svg, json, parts, errs);
    /* diagram= names a cycle diagram or one of the preset's own (checked by
     * the responder, which knows the preset's list) */
    const char *dia = query_get(req, "diagram");
    v->diagram_name = svg ? dia : NULL;
    int cycle_kind = !dia || gc_diagram_kind_parse(dia, &v->diagram.kind) == GC_OK;
    if (svg && cycle_kind && (v->diagram.log_x || v->diagram.log_y) &&
        v->diagram.kind != GC_DIAGRAM_PV)
        gc_api_errors_add(errs, "/scale", "scale=log applies only to diagram=Pv");
    v->diagram.points = v->points;
    return errs->n + errs->dropped;
}

int gc_api_params_parse(gc_api_params *v, const gc_api_request *req, unsigned accepted,
                        const char *const *parts, gc_api_errors *errs)
{
    memset(v, 0, sizeof *v);
    v->sys = GC_UNITS_SI;
    v->points = GC_PATH_DEFAULT_POINTS;
    gc_diagram_options_default(&v->diagram);
    v->diagram.points = v->points;
    if ((accepted & GC_PARAMS_ACCEPT_DIAGRAM) && parse_view(v, req, parts, errs) > 0)
        return errs->n + errs->dropped;
    const char *inc = query_get(req, "include");
    if (!(accepted & GC_PARAMS_ACCEPT_DIAGRAM) && parts && inc) {
        include_parts(v, inc, parts, 0, errs);
        if (errs->n + errs->dropped)
            return errs->n + errs->dropped;
    }
    gc_out o;
    memset(&o, 0, sizeof o);
    o.sys = GC_UNITS_SI;
    o.format = GC_FMT_JSON;
    o.table = GC_TABLE_ALL;
    int n = gc_out_parse_params(&o, req, accepted & ~GC_PARAMS_ACCEPT_DIAGRAM, errs);
    v->sys = o.sys;
    v->input_sys = o.input_sys;
    v->decimal_comma = o.decimal_comma;
    v->format = o.format;
    v->table = o.table;
    v->select = o.select;
    v->diagram.units = o.sys;
    return n;
}
