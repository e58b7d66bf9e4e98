/*
 * sweeps.c — GET|POST /v1/sweeps: a parameter study of one cycle preset.
 * One swept input (a line) or two (a grid, the first varying slowest),
 * each from/to with linear or log spacing (or an explicit list of values),
 * every point a full evaluation of the preset in process (point.h: the base
 * inputs decoded once, the swept ones set by their place in the input
 * struct, the outputs read through the response writer without writing the
 * document), and a table of the swept inputs and the requested outputs
 * (RFC 6901 pointers into a cycle result) in JSON or CSV.
 *
 * Request: {"cycle": "brayton", "inputs": {base inputs},
 *           "sweep": {"input": "pressure_ratio", "from": 4, "to": 40,
 *                     "steps": 36, "spacing": "linear"|"log"}
 *                    (or a list of one or two such, or {"input", "values": [...]}),
 *           "outputs": ["/summary/thermal_efficiency", "/summary/net_work"]}
 * GET: the same with dots (inputs.turbine_inlet_temperature=1400,
 * sweep.input=pressure_ratio, sweep.0.from=... for a grid, outputs as a
 * comma-separated list).
 *
 * Values: from and to are numbers in the input's default unit or strings
 * with a unit ("5 bar" to "30 bar"; both the same unit); spacing applies to
 * the numbers as written. Points: steps + 1 per sweep, at most
 * GC_SWEEP_MAX_POINTS in all (422 beyond). Units: the table follows
 * units=si|us; a swept column shows the value the route echoed, converted
 * (or, for a point without a result, the request value converted by the
 * quantity the route's unit label names). A point that fails gives nulls in
 * its row and an entry in "errors" (its status, class and problem); the
 * request fails as a whole (422) only when no point has a result and the
 * first failure is a validation error (a bad base input), or when an
 * output pointer names no value in the first result.
 */
#include "api/composites/point.h"
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define GC_SWEEP_MAX_POINTS 2000
#define GC_SWEEP_MAX_OUTPUTS 32
#define GC_SWEEP_MAX_ERRORS 100   /* point errors listed; the rest counted */
#define UNIT_LEN 48

typedef struct sweep_dim {
    char pointer[GC_API_FIELD_LEN];   /* input pointer, "/pressure_ratio" */
    char name[GC_API_FIELD_LEN];      /* column name, "pressure_ratio" */
    char unit[UNIT_LEN];              /* unit text of from/to ("" = default unit) */
    json_t *values;                   /* explicit values (borrowed) or NULL */
    double from, to;                  /* numbers as written */
    int steps;                        /* intervals (points = steps + 1) */
    int log_spacing;
    int n;                            /* points */
    int quantity;                     /* from the route's unit label, or -1 */
} sweep_dim;

static const char *const top_keys[] = { "cycle", "inputs", "sweep", "outputs", NULL };
static const char *const dim_keys[] = { "input", "from", "to", "steps", "spacing", "values",
                                        NULL };

/* An integer given as a number or (GET) a string; values beyond +-1e9 are
 * refused (-2; a string out of long's range too), so no caller's arithmetic
 * on the value can overflow. */
static int get_int(json_t *v, long *out)
{
    if (json_is_integer(v)) {
        if (json_integer_value(v) > 1000000000 || json_integer_value(v) < -1000000000)
            return -2;
        *out = (long)json_integer_value(v);
        return 0;
    }
    if (json_is_real(v) && json_real_value(v) == floor(json_real_value(v)) &&
        fabs(json_real_value(v)) < 1e9) {
        *out = (long)json_real_value(v);
        return 0;
    }
    if (json_is_string(v)) {
        char *end = NULL;
        const char *s = json_string_value(v);
        errno = 0;
        long x = strtol(s, &end, 10);
        if (end != s && end && *end == '\0') {
            if (errno == ERANGE || x > 1000000000L || x < -1000000000L)
                return -2;
            *out = x;
            return 0;
        }
    }
    return -1;
}

/* An explicit list of values (/sweep/values). */
static void decode_values(json_t *d, json_t *vals, const char *base, sweep_dim *dim,
                          gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN];
    snprintf(f, sizeof f, "%s/values", base);
    if (json_object_get(d, "from") || json_object_get(d, "to") ||
        json_object_get(d, "steps") || json_object_get(d, "spacing"))
        gc_api_errors_add(errs, f, "give either values or from/to/steps, not both");
    if (!json_is_array(vals) || json_array_size(vals) == 0) {
        gc_api_errors_add(errs, f, "must be a non-empty list of values");
        return;
    }
    if (json_array_size(vals) > GC_SWEEP_MAX_POINTS) {
        gc_api_errors_add(errs, f, "has %zu values; at most %d points are allowed",
                          json_array_size(vals), GC_SWEEP_MAX_POINTS);
        return;
    }
    size_t i;
    json_t *v;
    json_array_foreach(vals, i, v) {
        double x;
        char u[UNIT_LEN];
        if (gc_api_value_split(v, &x, u, sizeof u) != 0) {
            char fi[GC_API_FIELD_LEN + 24];
            snprintf(fi, sizeof fi, "%.100s/%zu", f, i);
            gc_api_errors_add(errs, fi, "must be a finite number or a string with a unit such "
                              "as '12 bar'");
        }
    }
    dim->values = vals;
    dim->n = (int)json_array_size(vals);
}

/* from and to, in one unit. */
static void decode_ends(json_t *d, const char *base, sweep_dim *dim, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN];
    char uf[UNIT_LEN] = "", ut[UNIT_LEN] = "";
    json_t *from = json_object_get(d, "from"), *to = json_object_get(d, "to");
    snprintf(f, sizeof f, "%s/from", base);
    if (!from)
        gc_api_errors_add(errs, f, "is required (or give values)");
    else if (gc_api_value_split(from, &dim->from, uf, sizeof uf) != 0)
        gc_api_errors_add(errs, f, "must be a finite number or a string with a unit such as "
                          "'5 bar'");
    snprintf(f, sizeof f, "%s/to", base);
    if (!to)
        gc_api_errors_add(errs, f, "is required (or give values)");
    else if (gc_api_value_split(to, &dim->to, ut, sizeof ut) != 0)
        gc_api_errors_add(errs, f, "must be a finite number or a string with a unit such as "
                          "'30 bar'");
    else if (from && strcmp(uf, ut) != 0)
        gc_api_errors_add(errs, f, "must be in the same unit as from ('%s', got '%s')",
                          uf[0] ? uf : "default unit", ut[0] ? ut : "default unit");
    snprintf(dim->unit, sizeof dim->unit, "%s", uf);
}

/* steps and spacing of a from/to sweep. */
static void decode_steps(json_t *d, const char *base, sweep_dim *dim, int before,
                         gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN];
    json_t *st = json_object_get(d, "steps");
    long steps = 10;
    int st_rc = st ? get_int(st, &steps) : 0;
    snprintf(f, sizeof f, "%s/steps", base);
    if (st_rc == -1 || (st_rc == 0 && steps < 1))
        gc_api_errors_add(errs, f, "must be a whole number of at least 1 (intervals; points "
                          "= steps + 1)");
    else if (st_rc == -2 || steps >= GC_SWEEP_MAX_POINTS)   /* no steps + 1: it may overflow */
        gc_api_errors_add(errs, f, "must be at most %d (points = steps + 1; at most %d points "
                          "are allowed)", GC_SWEEP_MAX_POINTS - 1, GC_SWEEP_MAX_POINTS);
    dim->steps = (int)(steps >= 1 && steps < GC_SWEEP_MAX_POINTS ? steps : 1);
    dim->n = dim->steps + 1;
    json_t *sp = json_object_get(d, "spacing");
    snprintf(f, sizeof f, "%s/spacing", base);
    if (sp) {
        const char *s = json_string_value(sp);
        if (s && strcmp(s, "log") == 0)
            dim->log_spacing = 1;
        else if (!s || strcmp(s, "linear") != 0)
            gc_api_errors_add(errs, f, "must be 'linear' or 'log'");
    }
    if (dim->log_spacing && errs->n == before && !(dim->from > 0.0 && dim->to > 0.0))
        gc_api_errors_add(errs, f, "log spacing needs from and to greater than 0");
}

static int decode_dim(json_t *d, const char *base, sweep_dim *dim, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN];
    int before = errs->n;
    memset(dim, 0, sizeof *dim);
    dim->quantity = -1;
    if (!json_is_object(d)) {
        gc_api_errors_add(errs, base, "must be an object {input, from, to, steps}");
        return -1;
    }
    gc_api_unknown_keys(d, base, dim_keys, errs);
    json_t *in = json_object_get(d, "input");
    snprintf(f, sizeof f, "%s/input", base);
    if (!json_is_string(in) || gc_api_input_pointer(json_string_value(in), dim->pointer,
                                                    sizeof dim->pointer) != 0)
        gc_api_errors_add(errs, f, "is required: the name of an input of the cycle (e.g. "
                          "'pressure_ratio', 'site.altitude') or its JSON pointer");
    else
        gc_api_pointer_name(dim->pointer, dim->name, sizeof dim->name);
    json_t *vals = json_object_get(d, "values");
    if (vals) {
        decode_values(d, vals, base, dim, errs);
        return errs->n > before ? -1 : 0;
    }
    decode_ends(d, base, dim, errs);
    decode_steps(d, base, dim, before, errs);
    if (errs->n == before && dim->from == dim->to && dim->steps > 0 && !dim->values)
        gc_api_errors_add(errs, base, "from and to are equal: nothing to sweep");
    return errs->n > before ? -1 : 0;
}

/* The i-th request value of a sweep (new reference). */
static json_t *dim_value(const sweep_dim *d, int i, double *num)
{
    if (d->values) {
        json_t *v = json_array_get(d->values, (size_t)i);
        char u[UNIT_LEN];
        if (gc_api_value_split(v, num, u, sizeof u) != 0)
            *num = 0.0;
        return json_incref(v);
    }
    double x;
    if (i == 0)
        x = d->from;
    else if (i == d->n - 1)
        x = d->to;
    else if (d->log_spacing)
        x = exp(log(d->from) + (log(d->to) - log(d->from)) * i / (double)d->steps);
    else
        x = d->from + (d->to - d->from) * i / (double)d->steps;
    *num = x;
    return gc_api_value_make(x, d->unit);
}

/* A request value (a plain number in input_sys) in the output system through the
 * quantity (-1: as given). */
static json_t *converted(const sweep_dim *d, json_t *req_value, gc_unit_system sys,
                         gc_unit_system input_sys)
{
    double x;
    char u[UNIT_LEN];
    if (gc_api_value_split(req_value, &x, u, sizeof u) != 0)
        return json_null();
    if (d->quantity < 0)
        return json_real(x);
    double si;
    if (u[0]) {
        if (gc_units_to_si((gc_quantity)d->quantity, x, u, &si, NULL) != GC_OK)
            return json_null();
    } else {
        si = gc_units_to_si_sys((gc_quantity)d->quantity, input_sys, x);
    }
    double v = gc_units_from_si((gc_quantity)d->quantity, sys, si);
    return isfinite(v) ? json_real(v) : json_null();
}

/* CSV (RFC 4180, CRLF) of the columns and rows. */
static char *csv_of(json_t *columns, json_t *rows, size_t *len)
{
    size_t cap = 4096, n = 0;
    char *b = malloc(cap);
    if (!b)
        return NULL;
#define PUT(s, l)                                              \
    do {                                                       \
        size_t l_ = (l);                                       \
        if (n + l_ + 1 > cap) {                                \
            while (n + l_ + 1 > cap)                           \
                cap *= 2;                                      \
            char *nb_ = realloc(b, cap);                       \
            if (!nb_) {                                        \
                free(b);                                       \
                return NULL;                                   \
            }                                                  \
            b = nb_;                                           \
        }                                                      \
        memcpy(b + n, (s), l_);                                \
        n += l_;                                               \
    } while (0)
    size_t i, j;
    json_t *c, *row, *v;
    json_array_foreach(columns, i, c) {
        char head[GC_API_FIELD_LEN + UNIT_LEN + 8];
        const char *name = json_string_value(json_object_get(c, "name"));
        const char *unit = json_string_value(json_object_get(c, "unit"));
        if (unit && strcmp(unit, "-") != 0)
            snprintf(head, sizeof head, "%s [%s]", name, unit);
        else
            snprintf(head, sizeof head, "%s", name);
        if (i)
            PUT(",", 1);
        int quote = strpbrk(head, ",\"\r\n") != NULL;
        if (quote)
            PUT("\"", 1);
        for (const char *p = head; *p; p++) {
            if (*p == '"')
                PUT("\"", 1);
            PUT(p, 1);
        }
        if (quote)
            PUT("\"", 1);
    }
    PUT("\r\n", 2);
    json_array_foreach(rows, i, row) {
        json_array_foreach(row, j, v) {
            char num[48];
            if (j)
                PUT(",", 1);
            if (json_is_real(v)) {
                snprintf(num, sizeof num, "%.10g", json_real_value(v));
                PUT(num, strlen(num));
            } else if (json_is_integer(v)) {
                snprintf(num, sizeof num, "%" JSON_INTEGER_FORMAT, json_integer_value(v));
                PUT(num, strlen(num));
            } else if (json_is_true(v)) {
                PUT("true", 4);
            } else if (json_is_false(v)) {
                PUT("false", 5);
            } else if (json_is_string(v)) {
                const char *s = json_string_value(v);
                PUT("\"", 1);
                for (const char *p = s; *p; p++) {
                    if (*p == '"')
                        PUT("\"", 1);
                    PUT(p, 1);
                }
                PUT("\"", 1);
            }
        }
        PUT("\r\n", 2);
    }
#undef PUT
    b[n] = '\0';
    *len = n;
    return b;
}


/* The request and what its points gave. */
typedef struct sweep {
    sweep_dim dims[2];
    int n_dims;
    long total;
    char outs[GC_SWEEP_MAX_OUTPUTS][GC_API_FIELD_LEN];
    int n_out;
    char path[96];
    json_t *inputs;               /* borrowed from the request */
    int as_query;
    gc_api_budget *budget;            /* the request's cost budget (api.h) */
    /* the points */
    json_t *rows, *perr, *seen_warn, *req_vals;
    json_t *first_fail;           /* the first failure's problem (no point had a result yet) */
    int first_fail_status;
    char first_fail_class[32];
    int n_ok, n_fail, errors_dropped;
    /* from the first result: units of the columns */
    int have_first;
    const char *dim_label[2];
    char dim_label_buf[2][UNIT_LEN];
    const char *out_label[GC_SWEEP_MAX_OUTPUTS];
    char out_label_buf[GC_SWEEP_MAX_OUTPUTS][UNIT_LEN];
} sweep;

static void sweep_free(sweep *w)
{
    json_decref(w->rows);
    json_decref(w->perr);
    json_decref(w->seen_warn);
    json_decref(w->req_vals);
    json_decref(w->first_fail);
}

static int fail422(gc_out *o, json_t *root, sweep *w, gc_api_errors *errs,
                   gc_api_response *resp)
{
    sweep_free(w);
    json_decref(root);
    gc_out_free(o);
    gc_api_problem_errors(resp, 422, "validation", "Invalid sweep", NULL, errs);
    return 0;
}

static int oom503(gc_out *o, json_t *root, sweep *w, gc_api_response *resp)
{
    sweep_free(w);
    json_decref(root);
    gc_out_free(o);
    return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.", NULL);
}

/* /sweep: one dimension or a list of one or two. */
static void decode_sweep(json_t *sw, sweep *w, gc_api_errors *errs)
{
    if (!sw) {
        gc_api_errors_add(errs, "/sweep", "is required: {input, from, to, steps} or a list of "
                          "one or two of them");
    } else if (json_is_array(sw) || (json_is_object(sw) && json_object_get(sw, "0"))) {
        size_t count = json_is_array(sw) ? json_array_size(sw) : json_object_size(sw);
        if (count < 1 || count > 2) {
            gc_api_errors_add(errs, "/sweep", "must hold one swept input (a line) or two (a "
                              "grid), got %zu", count);
            return;
        }
        for (size_t i = 0; i < count; i++) {
            char key[8], base[24];
            snprintf(key, sizeof key, "%zu", i);
            snprintf(base, sizeof base, "/sweep/%zu", i);
            json_t *d = json_is_array(sw) ? json_array_get(sw, i) : json_object_get(sw, key);
            if (!d)
                gc_api_errors_add(errs, base, "is missing (number the swept inputs 0, 1)");
            else if (decode_dim(d, base, &w->dims[w->n_dims], errs) == 0)
                w->n_dims++;
        }
        if (w->n_dims == 2 && strcmp(w->dims[0].pointer, w->dims[1].pointer) == 0)
            gc_api_errors_add(errs, "/sweep/1/input", "sweeps the same input as /sweep/0");
    } else if (decode_dim(sw, "/sweep", &w->dims[0], errs) == 0) {
        w->n_dims = 1;
    }
    w->total = 1;
    for (int i = 0; i < w->n_dims; i++)
        w->total *= w->dims[i].n;
    if (w->n_dims && w->total > GC_SWEEP_MAX_POINTS)
        gc_api_errors_add(errs, "/sweep", "gives %ld points; at most %d are allowed (fewer "
                          "steps, or split the study)", w->total, GC_SWEEP_MAX_POINTS);
}

/* /outputs: a list of pointers, a comma-separated string, or the default. */
static void decode_outputs(json_t *ov, sweep *w, gc_api_errors *errs)
{
    json_t *olist = NULL;
    if (!ov) {
        olist = json_pack("[s,s]", "/summary/thermal_efficiency", "/summary/net_work");
    } else if (json_is_string(ov)) {
        olist = json_array();
        char buf[2048];
        snprintf(buf, sizeof buf, "%s", json_string_value(ov));
        for (char *save = NULL, *t = strtok_r(buf, ",", &save); t; t = strtok_r(NULL, ",", &save))
            json_array_append_new(olist, json_string(t));
    } else if (json_is_array(ov)) {
        olist = json_incref(ov);
    } else {
        gc_api_errors_add(errs, "/outputs", "must be a list of JSON pointers into a cycle "
                          "result, such as '/summary/thermal_efficiency'");
    }
    if (!olist)
        return;
    if (json_array_size(olist) == 0 || json_array_size(olist) > GC_SWEEP_MAX_OUTPUTS)
        gc_api_errors_add(errs, "/outputs", "must hold 1 to %d pointers", GC_SWEEP_MAX_OUTPUTS);
    size_t i;
    json_t *p;
    json_array_foreach(olist, i, p) {
        char f[32];
        snprintf(f, sizeof f, "/outputs/%zu", i);
        const char *s = json_string_value(p);
        if (!s || s[0] != '/' || strlen(s) >= GC_API_FIELD_LEN || strstr(s, "//")) {
            gc_api_errors_add(errs, f, "must be a JSON pointer into a cycle result, such as "
                              "'/summary/net_work'");
            continue;
        }
        if (w->n_out < GC_SWEEP_MAX_OUTPUTS)
            snprintf(w->outs[w->n_out++], GC_API_FIELD_LEN, "%s", s);
    }
    json_decref(olist);
}

static void decode_request(json_t *root, sweep *w, gc_api_errors *errs)
{
    gc_api_unknown_keys(root, "", top_keys, errs);
    gc_api_cycle_path(json_object_get(root, "cycle"), errs, w->path, sizeof w->path);
    w->inputs = json_object_get(root, "inputs");
    if (w->inputs && !json_is_object(w->inputs))
        gc_api_errors_add(errs, "/inputs", "must be an object with the cycle's input fields");
    decode_sweep(json_object_get(root, "sweep"), w, errs);
    decode_outputs(json_object_get(root, "outputs"), w, errs);
}

static const char *keep_label(const char *label, char *buf)
{
    if (!label)
        return NULL;
    snprintf(buf, UNIT_LEN, "%s", label);
    return buf;
}

/* The first result: every output pointer must name one value; the units. */
static int first_result(sweep *w, gc_api_points *ev, const int *t_out, gc_api_errors *errs)
{
    for (int k = 0; k < w->n_out; k++) {
        json_t *v = gc_api_points_value(ev, t_out[k]);
        char f[32];
        snprintf(f, sizeof f, "/outputs/%d", k);
        if (!v)
            gc_api_errors_add(errs, f, "no value at '%s' in the %s result (e.g. "
                              "/summary/thermal_efficiency, /summary/net_work, /states/0/T)",
                              w->outs[k], gc_api_pointer_last(w->path));
        else if (json_is_object(v) || json_is_array(v))
            gc_api_errors_add(errs, f, "'%s' names an %s, not a single value", w->outs[k],
                              json_is_object(v) ? "object" : "array");
        w->out_label[k] = keep_label(gc_api_points_unit(ev, gc_api_pointer_last(w->outs[k])),
                                     w->out_label_buf[k]);
        if (!w->out_label[k] && json_is_number(v))
            w->out_label[k] = "-";
        json_decref(v);
    }
    for (int d = 0; d < w->n_dims; d++)
        w->dim_label[d] = keep_label(gc_api_points_unit(ev,
                                                        gc_api_pointer_last(w->dims[d].pointer)),
                                     w->dim_label_buf[d]);
    w->have_first = 1;
    return errs->n ? -1 : 0;
}

/* A failed point: its row of nulls is the caller's; the error entry here. */
static void point_failed(sweep *w, gc_api_points *ev, long pt)
{
    gc_api_inner in = { .status = ev->status, .body = ev->problem,
                        .error_class = ev->error_class };
    if (!w->first_fail && w->n_ok == 0) {
        w->first_fail = ev->problem ? json_incref(ev->problem) : json_object();
        w->first_fail_status = ev->status;
        snprintf(w->first_fail_class, sizeof w->first_fail_class, "%s",
                 ev->error_class ? ev->error_class : "");
    }
    w->n_fail++;
    if (json_array_size(w->perr) >= GC_SWEEP_MAX_ERRORS) {
        w->errors_dropped++;
        return;
    }
    json_t *e = json_pack("{s:I, s:i, s:s}", "point", (json_int_t)pt, "status", ev->status,
                          "error_class", ev->error_class ? ev->error_class : "error");
    const char *detail = json_string_value(json_object_get(ev->problem, "detail"));
    json_object_set_new(e, "detail", json_string(detail ? detail
                                                        : "the point could not be evaluated"));
    json_t *list = json_array();
    gc_api_inner_problem_errors(&in, "/inputs", list);
    json_object_set_new(e, "errors", list);
    json_array_append_new(w->perr, e);
}

/* The values of point pt as a client would give them (strings in a GET). */
static void point_values(sweep *w, long pt, json_t **vals)
{
    int n1 = w->n_dims > 1 ? w->dims[1].n : 1;
    int idx[2] = { (int)(pt / n1), (int)(pt % n1) };
    json_t *rv = json_array();
    for (int d = 0; d < w->n_dims; d++) {
        double num;
        json_t *v = dim_value(&w->dims[d], idx[d], &num);
        json_array_append(rv, v);
        if (w->as_query && !json_is_string(v)) {
            char buf[48];
            snprintf(buf, sizeof buf, "%.17g", num);
            json_decref(v);
            v = json_string(buf);
        }
        vals[d] = v;
    }
    json_array_append_new(w->req_vals, rv);
}

/* The row of a point with a result. */
static json_t *point_row(sweep *w, gc_api_points *ev, const int *t_out, const int *t_echo)
{
    json_t *row = json_array();
    for (int d = 0; d < w->n_dims; d++) {
        json_t *echo = gc_api_points_value(ev, t_echo[d]);
        json_array_append_new(row, json_is_number(echo) ? echo : json_null());
        if (!json_is_number(echo))
            json_decref(echo);
    }
    for (int k = 0; k < w->n_out; k++) {
        json_t *v = gc_api_points_value(ev, t_out[k]);
        if (!v || json_is_object(v) || json_is_array(v)) {
            json_decref(v);
            v = json_null();
        }
        json_array_append_new(row, v);
    }
    return row;
}

static void merge_warnings(gc_out *o, json_t *ws, json_t *seen)
{
    json_t *holder = json_pack("{s:o}", "warnings", ws);
    gc_api_inner_warnings(o, holder, seen);
    json_decref(holder);
}

/* Every point; -1 when memory ran out, else 0 (errs may have gained errors). */
static int run_points(sweep *w, gc_api_points *ev, gc_out *o, gc_api_errors *errs)
{
    int t_out[GC_SWEEP_MAX_OUTPUTS], t_echo[2];
    for (int k = 0; k < w->n_out; k++)
        t_out[k] = gc_api_points_target(ev, w->outs[k]);
    for (int d = 0; d < w->n_dims; d++) {
        char ptr[GC_API_FIELD_LEN + 8];
        snprintf(ptr, sizeof ptr, "/inputs%.120s", w->dims[d].pointer);
        t_echo[d] = gc_api_points_target(ev, ptr);
    }
    for (long pt = 0; pt < w->total; pt++) {
        if (gc_api_budget_charge(w->budget, 1) != 0)   /* budget hook: the HTTP layer answers */
            break;
        json_t *vals[2] = { NULL, NULL };
        point_values(w, pt, vals);
        int st = gc_api_points_run(ev, vals);
        for (int d = 0; d < w->n_dims; d++)
            json_decref(vals[d]);
        if (ev->set_failed) {
            int bad = ev->set_failed_dim;
            char f[GC_API_FIELD_LEN];
            snprintf(f, sizeof f, "/sweep%s/input", w->n_dims > 1 ? (bad ? "/1" : "/0") : "");
            gc_api_errors_add(errs, f, "'%s' cannot be set in these inputs (a part of the path "
                              "is not an object)", w->dims[bad].pointer);
            return 0;
        }
        if (st < 0)
            return -1;
        if (st == 200) {
            if (!w->have_first && first_result(w, ev, t_out, errs) != 0)
                return 0;
            json_array_append_new(w->rows, point_row(w, ev, t_out, t_echo));
            json_t *ws = gc_api_points_warnings(ev);
            if (ws)
                merge_warnings(o, ws, w->seen_warn);
            w->n_ok++;
            continue;
        }
        json_t *row = json_array();
        for (int i = 0; i < w->n_dims + w->n_out; i++)
            json_array_append_new(row, json_null());
        json_array_append_new(w->rows, row);
        point_failed(w, ev, pt);
    }
    return 0;
}

/* No point has a result and the first failed validation: a bad request. */
static void all_failed(sweep *w, gc_api_errors *errs)
{
    const char *cls = w->first_fail_class;
    if (errs->n || w->n_ok || !w->first_fail ||
        !(w->first_fail_status != 422 || strcmp(cls, "validation") == 0))
        return;
    gc_api_inner in = { .status = w->first_fail_status, .body = w->first_fail };
    json_t *list = json_array();
    gc_api_inner_problem_errors(&in, "/inputs", list);
    size_t i;
    json_t *e;
    json_array_foreach(list, i, e)
        gc_api_errors_add(errs, json_string_value(json_object_get(e, "field")), "%s",
                          json_string_value(json_object_get(e, "message")));
    const char *detail = json_string_value(json_object_get(w->first_fail, "detail"));
    if (errs->n == 0)
        gc_api_errors_add(errs, "/inputs", "%s",
                          detail ? detail : "no point of the sweep could be evaluated");
    json_decref(list);
}

/* The columns (and units); the swept values of failed points converted. */
static json_t *columns_of(sweep *w, gc_out *o)
{
    json_t *columns = json_array();
    for (int d = 0; d < w->n_dims; d++) {
        sweep_dim *dm = &w->dims[d];
        const char *label = w->dim_label[d];
        dm->quantity = gc_api_label_quantity(label, o->sys);
        char pointer[GC_API_FIELD_LEN + 8];
        snprintf(pointer, sizeof pointer, "/inputs%.120s", dm->pointer);
        const char *unit = label ? label : (dm->unit[0] ? dm->unit : NULL);
        json_t *c = json_pack("{s:s, s:s, s:s}", "name", dm->name, "pointer", pointer,
                              "role", "input");
        json_object_set_new(c, "unit", unit ? json_string(unit) : json_null());
        json_array_append_new(columns, c);
        if (unit)
            json_object_set_new(o->units, dm->name, json_string(unit));
    }
    for (int k = 0; k < w->n_out; k++) {
        char name[GC_API_FIELD_LEN];
        gc_api_pointer_name(w->outs[k], name, sizeof name);
        const char *label = w->out_label[k];
        json_t *c = json_pack("{s:s, s:s, s:s}", "name", name, "pointer", w->outs[k], "role",
                              "output");
        json_object_set_new(c, "unit", label ? json_string(label) : json_null());
        json_array_append_new(columns, c);
        if (label)
            json_object_set_new(o->units, name, json_string(label));
    }
    size_t r;
    json_t *row;
    json_array_foreach(w->rows, r, row) {
        for (int d = 0; d < w->n_dims; d++)
            if (json_is_null(json_array_get(row, (size_t)d)))
                json_array_set_new(row, (size_t)d,
                                   converted(&w->dims[d],
                                             json_array_get(json_array_get(w->req_vals, r),
                                                            (size_t)d), o->sys,
                                             o->input_sys));
    }
    return columns;
}

/* The echo of the sweep request. */
static void echo_request(sweep *w, gc_out *o, json_t *root)
{
    json_object_set(o->inputs, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(o->inputs, "inputs", w->inputs ? json_incref(w->inputs) : json_object());
    json_t *secho = json_array();
    for (int d = 0; d < w->n_dims; d++) {
        const sweep_dim *dm = &w->dims[d];
        json_t *e = json_pack("{s:s}", "input", dm->pointer);
        if (dm->values) {
            json_object_set(e, "values", dm->values);
        } else {
            json_object_set_new(e, "from", gc_api_value_make(dm->from, dm->unit));
            json_object_set_new(e, "to", gc_api_value_make(dm->to, dm->unit));
            json_object_set_new(e, "steps", json_integer(dm->steps));
            json_object_set_new(e, "spacing", json_string(dm->log_spacing ? "log" : "linear"));
        }
        json_object_set_new(e, "points", json_integer(dm->n));
        json_array_append_new(secho, e);
    }
    json_object_set_new(o->inputs, "sweep", secho);
    json_t *oecho = json_array();
    for (int k = 0; k < w->n_out; k++)
        json_array_append_new(oecho, json_string(w->outs[k]));
    json_object_set_new(o->inputs, "outputs", oecho);
    if (w->n_fail)
        gc_out_warn(o, "points_failed", "/sweep", "%d of %ld points have no result; their "
                    "rows hold nulls and \"errors\" says why", w->n_fail, w->total);
}

static int respond_csv(json_t *columns, json_t *rows, gc_api_response *resp)
{
    size_t len = 0;
    char *csv = csv_of(columns, rows, &len);
    if (!csv)
        return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.",
                              NULL);
    resp->status = 200;
    resp->content_type = GC_API_CT_CSV;
    resp->body = csv;
    resp->body_len = len;
    resp->cache_seconds = 0;
    return 0;
}

static int respond(sweep *w, gc_out *o, json_t *root, gc_api_response *resp)
{
    json_t *columns = columns_of(w, o);
    echo_request(w, o, root);
    json_t *doc = json_object();
    json_object_set(doc, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(doc, "shape", json_pack("[i,i]", w->dims[0].n,
                                                w->n_dims > 1 ? w->dims[1].n : 1));
    json_object_set_new(doc, "points", json_integer(w->total));
    json_object_set_new(doc, "succeeded", json_integer(w->n_ok));
    json_object_set_new(doc, "failed", json_integer(w->n_fail));
    json_object_set_new(doc, "columns", columns);
    json_object_set(doc, "rows", w->rows);
    json_object_set(doc, "errors", w->perr);
    if (w->errors_dropped)
        json_object_set_new(doc, "errors_not_shown", json_integer(w->errors_dropped));
    json_decref(root);
    if (o->format == GC_FMT_CSV) {
        int rc = respond_csv(columns, w->rows, resp);
        json_decref(doc);
        sweep_free(w);
        gc_out_free(o);
        return rc;
    }
    sweep_free(w);
    return gc_out_respond(o, doc, GC_OUT_EVALUATION, resp);
}

int gc_api_h_sweeps(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    json_t *root = NULL;
    int begin_rc;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                               GC_OUT_ACCEPT_SELECT | GC_OUT_ACCEPT_INPUT_UNITS, &o, &errs,
                               &root, resp, &begin_rc) != 0)
        return begin_rc;
    static sweep zero;
    sweep *w = malloc(sizeof *w);
    if (!w) {
        json_decref(root);
        gc_out_free(&o);
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    }
    *w = zero;
    w->as_query = req->method != GC_M_POST;
    w->budget = req->budget;
    decode_request(root, w, &errs);
    if (errs.n) {
        int rc = fail422(&o, root, w, &errs, resp);
        free(w);
        return rc;
    }
    w->rows = json_array();
    w->perr = json_array();
    w->seen_warn = json_object();
    w->req_vals = json_array();
    const char *fp[2] = { w->dims[0].pointer, w->n_dims > 1 ? w->dims[1].pointer : "" };
    gc_api_points ev;
    int rc = gc_api_points_init(&ev, gc_api_cycle_preset(w->path), w->inputs,
                                w->as_query, o.sys, fp, w->n_dims);
    ev.tally = resp;
    ev.ctx.opts.input_sys = o.input_sys;
    if (rc == 0)
        rc = run_points(w, &ev, &o, &errs);
    gc_api_points_free(&ev);
    if (rc != 0)
        rc = oom503(&o, root, w, resp);
    else if ((all_failed(w, &errs), errs.n))
        rc = fail422(&o, root, w, &errs, resp);
    else
        rc = respond(w, &o, root, resp);
    free(w);
    return rc;
}
