/*
 * sweeps.c — GET|POST /v1/sweeps: a parameter study of one cycle preset.
 * One swept input (a line) or two (a grid, the first varying slowest),
 * each from/to with linear or log spacing (or an explicit list of values),
 * every point a full evaluation through the preset's own route
 * (gc_api_inner_call), and a table of the swept inputs and the requested
 * outputs (RFC 6901 pointers into a cycle result) in JSON or CSV.
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
#include "api/decode.h"
#include "api/handlers.h"
#include "api/output.h"

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
 * refused (a string out of long's range too), so no caller's arithmetic on
 * the value can overflow. */
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
        snprintf(f, sizeof f, "%s/values", base);
        if (json_object_get(d, "from") || json_object_get(d, "to") ||
            json_object_get(d, "steps") || json_object_get(d, "spacing"))
            gc_api_errors_add(errs, f, "give either values or from/to/steps, not both");
        if (!json_is_array(vals) || json_array_size(vals) == 0) {
            gc_api_errors_add(errs, f, "must be a non-empty list of values");
        } else if (json_array_size(vals) > GC_SWEEP_MAX_POINTS) {
            gc_api_errors_add(errs, f, "has %zu values; at most %d points are allowed",
                              json_array_size(vals), GC_SWEEP_MAX_POINTS);
        } else {
            size_t i;
            json_t *v;
            json_array_foreach(vals, i, v) {
                double x;
                char u[UNIT_LEN];
                if (gc_api_value_split(v, &x, u, sizeof u) != 0) {
                    char fi[GC_API_FIELD_LEN + 24];
                    snprintf(fi, sizeof fi, "%.100s/%zu", f, i);
                    gc_api_errors_add(errs, fi, "must be a finite number or a string with a "
                                      "unit such as '12 bar'");
                }
            }
            dim->values = vals;
            dim->n = (int)json_array_size(vals);
        }
        return errs->n > before ? -1 : 0;
    }
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

/* A request value in the output system through the quantity (-1: as given). */
static json_t *converted(const sweep_dim *d, json_t *req_value, gc_unit_system sys)
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
        si = gc_units_default_to_si((gc_quantity)d->quantity, x);
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

static int fail422(gc_out *o, json_t *root, gc_api_errors *errs, const char *title,
                   gc_api_response *resp)
{
    json_decref(root);
    gc_out_free(o);
    gc_api_problem_errors(resp, 422, "validation", title, NULL, errs);
    return 0;
}

int gc_api_h_sweeps(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    json_t *root = NULL;
    int begin_rc;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                               GC_OUT_ACCEPT_SELECT, &o, &errs, &root, resp, &begin_rc) != 0)
        return begin_rc;
    const int as_query = req->method != GC_M_POST;

    /* ---- the request ---- */
    gc_api_unknown_keys(root, "", top_keys, &errs);
    char path[96] = "";
    gc_api_cycle_path(json_object_get(root, "cycle"), &errs, path, sizeof path);
    json_t *inputs = json_object_get(root, "inputs");
    if (inputs && !json_is_object(inputs))
        gc_api_errors_add(&errs, "/inputs", "must be an object with the cycle's input fields");
    sweep_dim dims[2];
    int n_dims = 0;
    json_t *sw = json_object_get(root, "sweep");
    if (!sw) {
        gc_api_errors_add(&errs, "/sweep", "is required: {input, from, to, steps} or a list of "
                          "one or two of them");
    } else if (json_is_array(sw) || (json_is_object(sw) && json_object_get(sw, "0"))) {
        size_t count = json_is_array(sw) ? json_array_size(sw) : json_object_size(sw);
        if (count < 1 || count > 2) {
            gc_api_errors_add(&errs, "/sweep", "must hold one swept input (a line) or two (a "
                              "grid), got %zu", count);
        } else {
            for (size_t i = 0; i < count; i++) {
                char key[8], base[24];
                snprintf(key, sizeof key, "%zu", i);
                snprintf(base, sizeof base, "/sweep/%zu", i);
                json_t *d = json_is_array(sw) ? json_array_get(sw, i) : json_object_get(sw, key);
                if (!d)
                    gc_api_errors_add(&errs, base, "is missing (number the swept inputs 0, 1)");
                else if (decode_dim(d, base, &dims[n_dims], &errs) == 0)
                    n_dims++;
            }
            if (n_dims == 2 && strcmp(dims[0].pointer, dims[1].pointer) == 0)
                gc_api_errors_add(&errs, "/sweep/1/input", "sweeps the same input as "
                                  "/sweep/0");
        }
    } else if (decode_dim(sw, "/sweep", &dims[0], &errs) == 0) {
        n_dims = 1;
    }
    long total = 1;
    for (int i = 0; i < n_dims; i++)
        total *= dims[i].n;
    if (n_dims && total > GC_SWEEP_MAX_POINTS)
        gc_api_errors_add(&errs, "/sweep", "gives %ld points; at most %d are allowed (fewer "
                          "steps, or split the study)", total, GC_SWEEP_MAX_POINTS);
    /* outputs */
    char outs[GC_SWEEP_MAX_OUTPUTS][GC_API_FIELD_LEN];
    int n_out = 0;
    json_t *ov = json_object_get(root, "outputs");
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
        gc_api_errors_add(&errs, "/outputs", "must be a list of JSON pointers into a cycle "
                          "result, such as '/summary/thermal_efficiency'");
    }
    if (olist) {
        if (json_array_size(olist) == 0 || json_array_size(olist) > GC_SWEEP_MAX_OUTPUTS)
            gc_api_errors_add(&errs, "/outputs", "must hold 1 to %d pointers",
                              GC_SWEEP_MAX_OUTPUTS);
        size_t i;
        json_t *p;
        json_array_foreach(olist, i, p) {
            char f[32];
            snprintf(f, sizeof f, "/outputs/%zu", i);
            const char *s = json_string_value(p);
            if (!s || s[0] != '/' || strlen(s) >= GC_API_FIELD_LEN || strstr(s, "//")) {
                gc_api_errors_add(&errs, f, "must be a JSON pointer into a cycle result, such "
                                  "as '/summary/net_work'");
                continue;
            }
            if (n_out < GC_SWEEP_MAX_OUTPUTS)
                snprintf(outs[n_out++], GC_API_FIELD_LEN, "%s", s);
        }
    }
    if (errs.n) {
        json_decref(olist);
        return fail422(&o, root, &errs, "Invalid sweep", resp);
    }

    /* ---- the points ---- */
    json_t *rows = json_array();
    json_t *perr = json_array();
    json_t *seen_warn = json_object();
    json_t *first_fail = NULL;   /* first failure's inner body + status */
    int first_fail_status = 0;
    const char *first_fail_class = NULL;
    int n_ok = 0, n_fail = 0, errors_dropped = 0;
    json_t *first_ok = NULL;     /* units of the first result */
    json_t *req_vals = json_array();   /* per point: [value dim0, value dim1] as requested */
    int n1 = n_dims > 1 ? dims[1].n : 1;
    for (long pt = 0; pt < total; pt++) {
        int idx[2] = { (int)(pt / n1), (int)(pt % n1) };
        json_t *fields = inputs ? json_deep_copy(inputs) : json_object();
        json_t *rv = json_array();
        int set_bad = -1;
        for (int d = 0; d < n_dims; d++) {
            double num;
            json_t *v = dim_value(&dims[d], idx[d], &num);
            json_array_append(rv, v);
            if (as_query && !json_is_string(v)) {
                json_t *s = json_string("");
                char buf[48];
                snprintf(buf, sizeof buf, "%.17g", num);
                json_string_set(s, buf);
                json_decref(v);
                v = s;
            }
            if (gc_api_pointer_set(fields, dims[d].pointer, v) != 0)
                set_bad = d;
        }
        json_array_append_new(req_vals, rv);
        if (set_bad >= 0) {
            char f[GC_API_FIELD_LEN];
            snprintf(f, sizeof f, "/sweep%s/input", n_dims > 1 ? (set_bad ? "/1" : "/0") : "");
            gc_api_errors_add(&errs, f, "'%s' cannot be set in these inputs (a part of the "
                              "path is not an object)", dims[set_bad].pointer);
            json_decref(fields);
            break;
        }
        gc_api_inner in;
        if (gc_api_budget_charge(req->budget, 1) != 0) { json_decref(fields); break; } /* budget hook */
        int rc = gc_api_inner_call(path, fields, as_query, o.sys, req->request_id, &in);
        json_decref(fields);
        if (rc != 0) {
            gc_api_inner_free(&in);
            json_decref(rows);
            json_decref(perr);
            json_decref(seen_warn);
            json_decref(first_fail);
            json_decref(first_ok);
            json_decref(req_vals);
            json_decref(olist);
            json_decref(root);
            gc_out_free(&o);
            return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.",
                                  NULL);
        }
        json_t *row = json_array();
        for (int d = 0; d < n_dims; d++)
            json_array_append_new(row, json_null());   /* filled after the loop */
        if (in.status == 200 && in.body) {
            if (!first_ok) {
                first_ok = json_incref(in.body);
                /* every output pointer must name a value in a result */
                for (int k = 0; k < n_out; k++) {
                    json_t *v = gc_out_pointer(in.body, outs[k]);
                    char f[32];
                    snprintf(f, sizeof f, "/outputs/%d", k);
                    if (!v)
                        gc_api_errors_add(&errs, f, "no value at '%s' in the %s result (e.g. "
                                          "/summary/thermal_efficiency, /summary/net_work, "
                                          "/states/0/T)", outs[k], gc_api_pointer_last(path));
                    else if (json_is_object(v) || json_is_array(v))
                        gc_api_errors_add(&errs, f, "'%s' names an %s, not a single value",
                                          outs[k], json_is_object(v) ? "object" : "array");
                }
                if (errs.n) {
                    json_decref(row);
                    gc_api_inner_free(&in);
                    break;
                }
            }
            for (int d = 0; d < n_dims; d++) {
                json_t *echo = gc_out_pointer(json_object_get(in.body, "inputs"),
                                              dims[d].pointer);
                if (json_is_number(echo))
                    json_array_set(row, (size_t)d, echo);
            }
            for (int k = 0; k < n_out; k++) {
                json_t *v = gc_out_pointer(in.body, outs[k]);
                json_array_append_new(row, (v && !json_is_object(v) && !json_is_array(v))
                                               ? json_incref(v) : json_null());
            }
            gc_api_inner_warnings(&o, in.body, seen_warn);
            n_ok++;
        } else {
            for (int k = 0; k < n_out; k++)
                json_array_append_new(row, json_null());
            if (!first_fail && n_ok == 0) {
                first_fail = in.body ? json_incref(in.body) : NULL;
                first_fail_status = in.status;
                first_fail_class = in.error_class;
            }
            n_fail++;
            if (json_array_size(perr) < GC_SWEEP_MAX_ERRORS) {
                json_t *e = json_pack("{s:I, s:i, s:s}", "point", (json_int_t)pt, "status",
                                      in.status, "error_class",
                                      in.error_class ? in.error_class : "error");
                const char *detail = json_string_value(json_object_get(in.body, "detail"));
                json_object_set_new(e, "detail", json_string(detail ? detail
                                    : "the point could not be evaluated"));
                json_t *list = json_array();
                gc_api_inner_problem_errors(&in, "/inputs", list);
                json_object_set_new(e, "errors", list);
                json_array_append_new(perr, e);
            } else {
                errors_dropped++;
            }
        }
        json_array_append_new(rows, row);
        gc_api_inner_free(&in);
    }
    if (errs.n == 0 && n_ok == 0 && first_fail &&
        (first_fail_status != 422 || (first_fail_class &&
                                      strcmp(first_fail_class, "validation") == 0))) {
        /* no point has a result and the first failed validation: a bad request */
        gc_api_inner in = { .status = first_fail_status, .body = first_fail };
        json_t *list = json_array();
        gc_api_inner_problem_errors(&in, "/inputs", list);
        size_t i;
        json_t *e;
        json_array_foreach(list, i, e)
            gc_api_errors_add(&errs, json_string_value(json_object_get(e, "field")), "%s",
                              json_string_value(json_object_get(e, "message")));
        if (errs.n == 0)
            gc_api_errors_add(&errs, "/inputs", "%s",
                              json_string_value(json_object_get(first_fail, "detail"))
                                  ? json_string_value(json_object_get(first_fail, "detail"))
                                  : "no point of the sweep could be evaluated");
        json_decref(list);
    }
    if (errs.n) {
        json_decref(rows);
        json_decref(perr);
        json_decref(seen_warn);
        json_decref(first_fail);
        json_decref(first_ok);
        json_decref(req_vals);
        json_decref(olist);
        return fail422(&o, root, &errs, "Invalid sweep", resp);
    }

    /* ---- columns, units, swept values of failed points ---- */
    json_t *ounits = json_object_get(first_ok, "units");
    json_t *columns = json_array();
    for (int d = 0; d < n_dims; d++) {
        const char *label =
            json_string_value(json_object_get(ounits, gc_api_pointer_last(dims[d].pointer)));
        dims[d].quantity = gc_api_label_quantity(label, o.sys);
        char pointer[GC_API_FIELD_LEN + 8];
        snprintf(pointer, sizeof pointer, "/inputs%.120s", dims[d].pointer);
        const char *unit = label ? label : (dims[d].unit[0] ? dims[d].unit : NULL);
        json_t *c = json_pack("{s:s, s:s, s:s}", "name", dims[d].name, "pointer", pointer,
                              "role", "input");
        json_object_set_new(c, "unit", unit ? json_string(unit) : json_null());
        json_array_append_new(columns, c);
        if (unit)
            json_object_set_new(o.units, dims[d].name, json_string(unit));
    }
    for (int k = 0; k < n_out; k++) {
        char name[GC_API_FIELD_LEN];
        gc_api_pointer_name(outs[k], name, sizeof name);
        json_t *v = first_ok ? gc_out_pointer(first_ok, outs[k]) : NULL;
        const char *label =
            json_string_value(json_object_get(ounits, gc_api_pointer_last(outs[k])));
        if (!label && json_is_number(v))
            label = "-";
        json_t *c = json_pack("{s:s, s:s, s:s}", "name", name, "pointer", outs[k], "role",
                              "output");
        json_object_set_new(c, "unit", label ? json_string(label) : json_null());
        json_array_append_new(columns, c);
        if (label)
            json_object_set_new(o.units, name, json_string(label));
    }
    size_t r;
    json_t *row;
    json_array_foreach(rows, r, row) {
        for (int d = 0; d < n_dims; d++)
            if (json_is_null(json_array_get(row, (size_t)d)))
                json_array_set_new(row, (size_t)d,
                                   converted(&dims[d],
                                             json_array_get(json_array_get(req_vals, r),
                                                            (size_t)d), o.sys));
    }

    /* ---- the echo and the document ---- */
    json_object_set(o.inputs, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(o.inputs, "inputs", inputs ? json_incref(inputs) : json_object());
    json_t *secho = json_array();
    for (int d = 0; d < n_dims; d++) {
        json_t *e = json_pack("{s:s}", "input", dims[d].pointer);
        if (dims[d].values) {
            json_object_set(e, "values", dims[d].values);
        } else {
            json_object_set_new(e, "from", gc_api_value_make(dims[d].from, dims[d].unit));
            json_object_set_new(e, "to", gc_api_value_make(dims[d].to, dims[d].unit));
            json_object_set_new(e, "steps", json_integer(dims[d].steps));
            json_object_set_new(e, "spacing", json_string(dims[d].log_spacing ? "log"
                                                                              : "linear"));
        }
        json_object_set_new(e, "points", json_integer(dims[d].n));
        json_array_append_new(secho, e);
    }
    json_object_set_new(o.inputs, "sweep", secho);
    json_t *oecho = json_array();
    for (int k = 0; k < n_out; k++)
        json_array_append_new(oecho, json_string(outs[k]));
    json_object_set_new(o.inputs, "outputs", oecho);
    if (n_fail)
        gc_out_warn(&o, "points_failed", "/sweep", "%d of %ld points have no result; their "
                    "rows hold nulls and \"errors\" says why", n_fail, total);

    json_t *doc = json_object();
    json_object_set(doc, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(doc, "shape", json_pack("[i,i]", dims[0].n, n_dims > 1 ? dims[1].n : 1));
    json_object_set_new(doc, "points", json_integer(total));
    json_object_set_new(doc, "succeeded", json_integer(n_ok));
    json_object_set_new(doc, "failed", json_integer(n_fail));
    json_object_set_new(doc, "columns", columns);
    json_object_set_new(doc, "rows", rows);
    json_object_set_new(doc, "errors", perr);
    if (errors_dropped)
        json_object_set_new(doc, "errors_not_shown", json_integer(errors_dropped));
    json_decref(seen_warn);
    json_decref(first_fail);
    json_decref(first_ok);
    json_decref(req_vals);
    json_decref(olist);
    json_decref(root);

    if (o.format == GC_FMT_CSV) {
        size_t len = 0;
        char *csv = csv_of(columns, rows, &len);
        json_decref(doc);
        gc_out_free(&o);
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
    return gc_out_respond(&o, doc, GC_OUT_EVALUATION, resp);
}
