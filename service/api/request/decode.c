/*
 * decode.c — request normalisation (JSON body or dotted query parameters into
 * one jansson object) and field-spec validation into a route's C struct, in
 * SI units (decode.h). Collects every bad field at once; never stops at the
 * first error. Limits: nesting depth GC_DECODE_MAX_DEPTH, GC_API_MAX_ERRORS
 * errors reported (the rest counted).
 */
#include "api/request/decode.h"
#include "gascycle/text.h"
#include "gascycle/strbuf.h"
#include "api/request/fields.h"
#include "api/respond/localise.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* ---- small helpers ----------------------------------------------------- */

static const char *json_type_words(const json_t *v)
{
    switch (json_typeof(v)) {
    case JSON_OBJECT: return "an object";
    case JSON_ARRAY: return "an array";
    case JSON_STRING: return "a string";
    case JSON_INTEGER:
    case JSON_REAL: return "a number";
    case JSON_TRUE:
    case JSON_FALSE: return "a boolean";
    case JSON_NULL: return "null";
    }
    return "a value";
}

void gc_decode_error(gc_decoder *d, const char *pointer, const char *fmt, ...)
{
    char msg[GC_API_MESSAGE_LEN];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    gc_api_errors_add(d->errs, pointer, "%s", msg);
}

int gc_decode_edit_distance(const char *a, const char *b)
{
    return gc_text_edit_distance(a, b);
}

const char *gc_decode_suggest(const char *s, const char *const *names, size_t n_names)
{
    const char *best = NULL;
    int best_d = 99;
    for (size_t i = 0; i < n_names; i++) {
        if (!names[i])
            continue;
        int dd = gc_decode_edit_distance(s, names[i]);
        if (dd < best_d) {
            best_d = dd;
            best = names[i];
        }
    }
    if (!best)
        return NULL;
    size_t len = strlen(best);
    int limit = len <= 3 ? 1 : (len <= 6 ? 2 : 3);
    return best_d <= limit ? best : NULL;
}

/* Copies pointer + "/" + escaped key into out (size GC_API_FIELD_LEN). */
static void child_pointer(char *out, const char *pointer, const char *key)
{
    gc_text_copy(out, GC_API_FIELD_LEN, pointer);
    gc_out_pointer_append(out, GC_API_FIELD_LEN, key);
}

/* Deepest nesting of v (root object = 1); stops counting past limit. The
 * pointer of the first place beyond the limit goes into where. */
static int depth_exceeds(json_t *v, int level, char *where)
{
    if (!json_is_object(v) && !json_is_array(v))
        return 0;
    if (level > GC_DECODE_MAX_DEPTH)
        return 1;
    char saved[GC_API_FIELD_LEN];
    gc_text_copy(saved, sizeof saved, where);
    if (json_is_object(v)) {
        const char *k;
        json_t *c;
        json_object_foreach(v, k, c) {
            gc_out_pointer_append(where, GC_API_FIELD_LEN, k);
            if (depth_exceeds(c, level + 1, where))
                return 1;
            gc_text_copy(where, GC_API_FIELD_LEN, saved);
        }
    } else {
        size_t i;
        json_t *c;
        json_array_foreach(v, i, c) {
            char idx[24];
            snprintf(idx, sizeof idx, "%zu", i);
            gc_out_pointer_append(where, GC_API_FIELD_LEN, idx);
            if (depth_exceeds(c, level + 1, where))
                return 1;
            gc_text_copy(where, GC_API_FIELD_LEN, saved);
        }
    }
    return 0;
}

static int is_json_media_type(const char *ct)
{
    while (*ct == ' ')
        ct++;
    size_t n = strcspn(ct, "; ");
    if (n == 16 && strncasecmp(ct, "application/json", 16) == 0)
        return 1;
    /* application/<something>+json */
    if (n > 17 && strncasecmp(ct, "application/", 12) == 0 && strncasecmp(ct + n - 5, "+json", 5) == 0)
        return 1;
    return 0;
}

/* The diagram options of the cycle routes (scale, overlay, width, height):
 * output parameters there, never input fields. */
static int is_diagram_key(const char *k)
{
    static const char *const keys[] = { "scale", "overlay", "width", "height" };
    for (size_t i = 0; i < sizeof keys / sizeof keys[0]; i++)
        if (k && strcmp(k, keys[i]) == 0)
            return 1;
    return 0;
}

static int fail400(gc_api_response *resp, const char *cls, const gc_api_errors *errs)
{
    gc_api_problem_errors(resp, 400, cls, "Request not readable", NULL, errs);
    return -1;
}

/* ---- normalisation ------------------------------------------------------ */

static int normalise_body(const gc_api_request *req, int diagram, json_t **root,
                          gc_api_response *resp)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (req->content_type && !is_json_media_type(req->content_type)) {
        gc_api_problem(resp, 415, "media_type", "Unsupported media type",
                       "The body must be JSON: send Content-Type: application/json.", NULL);
        return -1;
    }
    size_t i = 0;
    while (req->body && i < req->body_len && isspace((unsigned char)req->body[i]))
        i++;
    if (!req->body || i == req->body_len) {
        gc_api_errors_add(&errs, "", "the POST body is empty; send a JSON object with the input "
                          "fields, or use GET with query parameters");
        return fail400(resp, "malformed", &errs);
    }
    json_error_t je;
    json_t *j = json_loadb(req->body, req->body_len, JSON_REJECT_DUPLICATES, &je);
    if (!j) {
        const char *hint = "";
        int pos = je.position > 0 ? je.position - 1 : 0;
        while (pos > 0 && (size_t)pos < req->body_len && isalpha((unsigned char)req->body[pos - 1]))
            pos--;
        if ((size_t)pos < req->body_len) {
            const char *p = req->body + pos;
            size_t left = req->body_len - (size_t)pos;
            if ((left >= 3 && strncasecmp(p, "nan", 3) == 0) ||
                (left >= 3 && strncasecmp(p, "inf", 3) == 0) ||
                (left >= 4 && strncasecmp(p, "-inf", 4) == 0))
                hint = " (NaN and Infinity are not JSON numbers; give a finite number)";
        }
        if (json_error_code(&je) == json_error_duplicate_key)
            gc_api_errors_add(&errs, "", "duplicate key at line %d, column %d: %s", je.line,
                              je.column, je.text);
        else
            gc_api_errors_add(&errs, "", "malformed JSON at line %d, column %d: %s%s", je.line,
                              je.column, je.text, hint);
        return fail400(resp, "malformed", &errs);
    }
    if (!json_is_object(j)) {
        gc_api_errors_add(&errs, "", "the body must be a JSON object, got %s", json_type_words(j));
        json_decref(j);
        return fail400(resp, "malformed", &errs);
    }
    char where[GC_API_FIELD_LEN] = "";
    if (depth_exceeds(j, 1, where)) {
        gc_api_errors_add(&errs, where, "nesting deeper than %d levels", GC_DECODE_MAX_DEPTH);
        json_decref(j);
        return fail400(resp, "malformed", &errs);
    }
    for (size_t q = 0; q < req->n_query; q++) {
        const char *k = req->query[q].key;
        size_t seg = strcspn(k, ".");
        char first[32];
        gc_text_copy(first, (seg < 31 ? seg : 31) + 1, k);
        if (!gc_out_is_reserved(first) && !(diagram && is_diagram_key(k)))
            gc_api_errors_add(&errs, "", "query parameter '%.60s' is not an output parameter; a POST "
                              "sends its input fields in the JSON body", k);
    }
    if (errs.n) {
        json_decref(j);
        return fail400(resp, "malformed", &errs);
    }
    *root = j;
    return 0;
}

/* Sets the value vs of the dotted query key into top (one object level per
 * part); an error when a part is empty, too long or not UTF-8, when the key
 * repeats or is both a value and an object, or nests too deep. */
static void place(json_t *top, const char *key, json_t *vs, gc_api_errors *errs)
{
    json_t *obj = top;
    char pointer[GC_API_FIELD_LEN] = "";
    const char *p = key;
    int level = 1;
    for (;;) {
        size_t n = strcspn(p, ".");
        char seg[GC_API_FIELD_LEN];
        if (n == 0 || n >= sizeof seg) {
            gc_api_errors_add(errs, "", "query key '%.60s' has an empty or overlong part", key);
            return;
        }
        memcpy(seg, p, n);
        seg[n] = '\0';
        json_t *test = json_string(seg);
        if (!test) {
            gc_api_errors_add(errs, "", "query key '%.60s' is not valid UTF-8", key);
            return;
        }
        json_decref(test);
        gc_out_pointer_append(pointer, sizeof pointer, seg);
        json_t *cur = json_object_get(obj, seg);
        if (p[n] == '\0') {
            if (cur)
                gc_api_errors_add(errs, pointer, json_is_object(cur)
                                  ? "given both as a value and with sub-keys"
                                  : "given more than once");
            else
                json_object_set(obj, seg, vs);
            return;
        }
        if (++level > GC_DECODE_MAX_DEPTH) {
            gc_api_errors_add(errs, pointer, "nesting deeper than %d levels", GC_DECODE_MAX_DEPTH);
            return;
        }
        if (!cur) {
            cur = json_object();
            json_object_set_new(obj, seg, cur);
        } else if (!json_is_object(cur)) {
            gc_api_errors_add(errs, pointer, "given both as a value and with sub-keys");
            return;
        }
        obj = cur;
        p += n + 1;
    }
}

static int normalise_query(const gc_api_request *req, int diagram, json_t **root,
                           gc_api_response *resp)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    json_t *top = json_object();
    if (!top) {
        gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return -1;
    }
    for (size_t q = 0; q < req->n_query; q++) {
        const char *key = req->query[q].key ? req->query[q].key : "";
        const char *val = req->query[q].value ? req->query[q].value : "";
        size_t seg0 = strcspn(key, ".");
        char first[32];
        gc_text_copy(first, (seg0 < 31 ? seg0 : 31) + 1, key);
        if (diagram && is_diagram_key(key))
            continue;
        if (gc_out_is_reserved(first)) {
            if (key[seg0] == '.')
                gc_api_errors_add(&errs, "", "'%s' is an output parameter and takes no sub-keys "
                                  "('%.60s')", first, key);
            continue;
        }
        json_t *vs = json_string(val);
        if (!vs) {
            gc_api_errors_add(&errs, "", "the value of query parameter '%.60s' is not valid UTF-8", key);
            continue;
        }
        place(top, key, vs, &errs);
        json_decref(vs);
    }
    if (errs.n) {
        json_decref(top);
        return fail400(resp, "malformed", &errs);
    }
    *root = top;
    return 0;
}

int gc_decode_normalise(const gc_api_request *req, json_t **root, gc_api_response *resp)
{
    return gc_decode_normalise_ex(req, 0, root, resp);
}

int gc_decode_normalise_ex(const gc_api_request *req, int diagram, json_t **root,
                           gc_api_response *resp)
{
    *root = NULL;
    if (req->method == GC_M_POST)
        return normalise_body(req, diagram, root, resp);
    return normalise_query(req, diagram, root, resp);
}

/* ---- values ------------------------------------------------------------- */

/* "0,55" without decimal=comma: a digit, a comma, a digit before any unit. */
static int has_decimal_comma(const char *s)
{
    const char *c = strchr(s, ',');
    return c && c > s && isdigit((unsigned char)c[-1]) && isdigit((unsigned char)c[1]) &&
           strspn(s, " +-0123456789") == (size_t)(c - s);
}

static void note_written(gc_decode_ctx *c, const char *pointer, const char *unit)
{
    if (!c || !unit[0] || c->n_written >= GC_DECODE_MAX_WRITTEN)
        return;
    gc_text_copy(c->written[c->n_written].pointer, GC_API_FIELD_LEN, pointer);
    gc_text_copy(c->written[c->n_written].unit, sizeof c->written[0].unit, unit);
    c->n_written++;
}

/* A gauge pressure or standard volume kept for completion; 1, or -1. */
static int defer(gc_decoder *d, const char *pointer, const gc_reading *r, double *target,
                 const struct gc_field *row, const gc_field_spec *spec)
{
    gc_decode_ctx *c = d->ctx;
    if (!c || !target) {
        gc_decode_error(d, pointer, "'%s' is %s here, which needs %s to read: give %s", r->unit,
                        r->kind == GC_READING_GAUGE ? "a gauge pressure" : "a standard volume flow",
                        r->kind == GC_READING_GAUGE ? "a barometric pressure" : "a gas density",
                        r->kind == GC_READING_GAUGE ? "an absolute pressure ('kPa', 'bar', 'psia')"
                                                    : "a mass flow ('kg/s', 'lbm/h')");
        return -1;
    }
    if (c->n >= GC_DECODE_MAX_DEFERRED) {
        gc_decode_error(d, pointer, "at most %d gauge pressures and standard volume flows may be "
                        "given in one request", GC_DECODE_MAX_DEFERRED);
        return -1;
    }
    gc_decode_deferred *x = &c->d[c->n++];
    memset(x, 0, sizeof *x);
    gc_text_copy(x->pointer, sizeof x->pointer, pointer);
    x->target = target;
    x->row = row;
    x->spec = spec;
    x->r = *r;
    return 1;
}

int gc_decode_number_at(gc_decoder *d, json_t *value, const char *pointer, gc_quantity q,
                        double *si_value, const struct gc_field *row, const gc_field_spec *spec)
{
    static const gc_units_opts plain = { GC_UNITS_SI, 0 };
    const gc_units_opts *o = d->ctx ? &d->ctx->opts : &plain;
    if (json_is_number(value)) {
        double v = gc_units_to_si_sys(q, o->input_sys, json_number_value(value));
        if (!isfinite(v)) {
            gc_decode_error(d, pointer, "the number is out of range");
            return -1;
        }
        *si_value = v;
        return 0;
    }
    if (!json_is_string(value)) {
        gc_decode_error(d, pointer, "must be a number or a string with a unit (%s), got %s",
                        gc_quantity_words(q), json_type_words(value));
        return -1;
    }
    const char *s = json_string_value(value);
    if (!o->decimal_comma && has_decimal_comma(s)) {
        gc_decode_error(d, pointer, "'%.40s' has a decimal comma: write a decimal point, or add "
                        "decimal=comma to the query string to read decimal commas", s);
        return -1;
    }
    gc_error err;
    gc_error_clear(&err);
    gc_reading r;
    if (gc_units_read(q, s, o, &r, &err) != GC_OK) {
        gc_decode_error(d, pointer, "%s", err.message);
        return -1;
    }
    note_written(d->ctx, pointer, r.unit);
    if (r.kind != GC_READING_VALUE)
        return defer(d, pointer, &r, si_value, row, spec);
    *si_value = r.si;
    return 0;
}

int gc_decode_number(gc_decoder *d, json_t *value, const char *pointer, gc_quantity q,
                     double *si_value)
{
    double v = 0.0;
    int rc = gc_decode_number_at(d, value, pointer, q, &v, NULL, NULL);
    if (rc == 0)
        *si_value = v;
    return rc == 0 ? 0 : -1;
}

int gc_decode_plain_text(const char **text, double *x)
{
    const char *s = *text;
    char *end = NULL;
    while (isspace((unsigned char)*s))
        s++;
    *text = s;
    errno = 0;
    *x = strtod(s, &end);
    while (end && isspace((unsigned char)*end))
        end++;
    return !*s || !end || *end || errno == ERANGE || strpbrk(s, "xXnNiI") ? -1 : 0;
}

void gc_decode_range_error(gc_decoder *d, const char *pointer, gc_quantity q, const char *msg)
{
    char m[GC_API_MESSAGE_LEN];
    gc_unit_system sys = d->ctx ? d->ctx->opts.input_sys : GC_UNITS_SI;
    const char *written = gc_decode_ctx_unit(d->ctx, pointer);
    if (!written && sys == GC_UNITS_US)
        written = gc_units_label(q, sys);
    snprintf(m, sizeof m, "%s", msg);
    gc_api_localise(m, sizeof m, (int)q, written, sys);
    gc_decode_error(d, pointer, "%s", m);
}

/* "must be greater than 0 kPa": the bound in the default (si) unit, then in
 * the unit the value was written in. */
static void range_error(gc_decoder *d, const char *pointer, const gc_field_spec *f,
                        const char *what, double bound_si)
{
    double b = f->type == GC_FIELD_NUMBER ? gc_units_from_si(f->quantity, GC_UNITS_SI, bound_si)
                                          : bound_si;
    const char *label = f->type == GC_FIELD_NUMBER ? gc_units_label(f->quantity, GC_UNITS_SI) : "-";
    char msg[GC_API_MESSAGE_LEN];
    if (strcmp(label, "-") == 0)
        snprintf(msg, sizeof msg, "must be %s %.10g", what, b);
    else
        snprintf(msg, sizeof msg, "must be %s %.10g %s", what, b, label);
    if (f->type == GC_FIELD_NUMBER)
        gc_decode_range_error(d, pointer, f->quantity, msg);
    else
        gc_decode_error(d, pointer, "%s", msg);
}

int gc_decode_check_spec(gc_decoder *d, const char *pointer, const gc_field_spec *f, double v)
{
    if (f->flags & GC_F_MIN) {
        if ((f->flags & GC_F_MIN_EXCL) ? !(v > f->min) : !(v >= f->min)) {
            range_error(d, pointer, f, (f->flags & GC_F_MIN_EXCL) ? "greater than" : "at least", f->min);
            return -1;
        }
    }
    if (f->flags & GC_F_MAX) {
        if ((f->flags & GC_F_MAX_EXCL) ? !(v < f->max) : !(v <= f->max)) {
            range_error(d, pointer, f, (f->flags & GC_F_MAX_EXCL) ? "less than" : "at most", f->max);
            return -1;
        }
    }
    return 0;
}

static void set_present(const gc_field_spec *f, void *target)
{
    if (f->present)
        *(int *)(void *)((char *)target + f->present - 1) = 1;
}

size_t gc_decode_name_list(char *buf, size_t room, const char *const *names, size_t n,
                           int quote)
{
    size_t used = 0;
    buf[0] = '\0';
    for (size_t i = 0; i < n; i++) {
        size_t need = strlen(names[i]) + (i ? 2 : 0) + (quote ? 2 : 0);
        /* room for this name and, unless it is the last, the tail " and 99 more" */
        size_t tail = i + 1 < n ? 13 : 0;
        if (used + need + tail + 1 > room) {
            snprintf(buf + used, room - used, "%s and %zu more", i ? "," : "", n - i);
            return n - i;
        }
        used += (size_t)snprintf(buf + used, room - used, "%s%s%s%s", i ? ", " : "",
                                 quote ? "'" : "", names[i], quote ? "'" : "");
    }
    return 0;
}

static void enum_error(gc_decoder *d, const char *pointer, const char *given,
                       const char *const *names, size_t n)
{
    char list[180];
    gc_decode_name_list(list, sizeof list, names, n, 1);
    const char *s = given ? gc_decode_suggest(given, names, n) : NULL;
    if (s)
        gc_decode_error(d, pointer, "must be one of %s; did you mean '%s'?", list, s);
    else
        gc_decode_error(d, pointer, "must be one of %s", list);
}

static size_t count_names(const char *const *v)
{
    size_t n = 0;
    while (v && v[n])
        n++;
    return n;
}

static int decode_fields_ex(gc_decoder *d, const gc_field_spec *fields, json_t *obj,
                            const char *pointer, void *target, json_t *echo,
                            const char *extra_allowed);

/* The decoders of decode_one, one per field type: v the given value (NULL:
 * the default), t the member, echo_on whether the echo takes it. */
static int one_number(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                      char *t, json_t *echo, int echo_on)
{
    double x = f->def;
    int rc = v ? gc_decode_number_at(d, v, ptr, f->quantity, (double *)(void *)t, NULL, f) : 0;
    if (rc < 0 || (v && rc == 0 && gc_decode_check_spec(d, ptr, f, *(double *)(void *)t) != 0))
        return -1;
    if (rc == 1) {   /* completed once the request is decoded (context.c), echo then */
        d->ctx->d[d->ctx->n - 1].echo = echo_on ? echo : NULL;
        d->ctx->d[d->ctx->n - 1].echo_key = f->name;
        return 0;
    }
    if (v)
        x = *(double *)(void *)t;
    *(double *)(void *)t = x;
    /* an optional field without a default is echoed only when given */
    if (echo_on && (v || !(f->flags & GC_F_NO_DEFAULT)))
        gc_out_q(d->out, echo, f->name, x, f->quantity);
    return 0;
}

static int one_integer(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                       char *t, json_t *echo, int echo_on)
{
    double x = f->def;
    if (v) {
        if (json_is_number(v)) {
            x = json_number_value(v);
        } else if (json_is_string(v) && d->from_query) {
            const char *s = json_string_value(v);
            char *end = NULL;
            long long n = strtoll(s, &end, 10);
            if (!*s || *end || isspace((unsigned char)*s)) {
                gc_decode_error(d, ptr, "must be a whole number, got '%.40s'", s);
                return -1;
            }
            x = (double)n;
        } else {
            gc_decode_error(d, ptr, "must be a whole number, got %s", json_type_words(v));
            return -1;
        }
        /* The bounds first: a query value beyond long long's range reads
         * as LLONG_MAX or LLONG_MIN (strtoll), far outside any bound,
         * and x is a double, so no integer arithmetic overflows here. */
        if (x != floor(x)) {
            gc_decode_error(d, ptr, "must be a whole number");
            return -1;
        }
        if (gc_decode_check_spec(d, ptr, f, x) != 0)
            return -1;
        if (fabs(x) > 2147483647.0) {
            gc_decode_error(d, ptr, "must be a whole number between -2147483647 and "
                            "2147483647");
            return -1;
        }
    }
    *(int *)(void *)t = (int)x;
    if (echo_on)
        json_object_set_new(echo, f->name, json_integer((json_int_t)x));
    return 0;
}

static int one_bool(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                    char *t, json_t *echo, int echo_on)
{
    int b = f->def != 0.0;
    if (v) {
        if (json_is_boolean(v)) {
            b = json_is_true(v);
        } else if (json_is_string(v) && d->from_query &&
                   (strcmp(json_string_value(v), "true") == 0 ||
                    strcmp(json_string_value(v), "false") == 0)) {
            b = strcmp(json_string_value(v), "true") == 0;
        } else {
            gc_decode_error(d, ptr, "must be true or false, got %s", json_type_words(v));
            return -1;
        }
    }
    *(int *)(void *)t = b;
    if (echo_on)
        json_object_set_new(echo, f->name, json_boolean(b));
    return 0;
}

static int one_enum(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                    char *t, json_t *echo, int echo_on)
{
    size_t n = count_names(f->enum_values);
    int idx = (int)f->def;
    if (v) {
        if (!json_is_string(v)) {
            enum_error(d, ptr, NULL, f->enum_values, n);
            return -1;
        }
        idx = -1;
        for (size_t i = 0; i < n; i++)
            if (strcmp(json_string_value(v), f->enum_values[i]) == 0)
                idx = (int)i;
        if (idx < 0) {
            enum_error(d, ptr, json_string_value(v), f->enum_values, n);
            return -1;
        }
    }
    *(int *)(void *)t = idx;
    if (echo_on && idx >= 0 && (size_t)idx < n)
        json_object_set_new(echo, f->name, json_string(f->enum_values[idx]));
    return 0;
}

static int one_string(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                      char *t, json_t *echo, int echo_on)
{
    const char *s = f->def_string ? f->def_string : "";
    if (v) {
        if (!json_is_string(v)) {
            gc_decode_error(d, ptr, "must be a string, got %s", json_type_words(v));
            return -1;
        }
        s = json_string_value(v);
        if (strlen(s) >= GC_DECODE_MAX_STRING) {
            gc_decode_error(d, ptr, "is longer than %d characters", GC_DECODE_MAX_STRING - 1);
            return -1;
        }
    }
    gc_text_copy(t, GC_DECODE_MAX_STRING, s);
    if (echo_on)
        json_object_set_new(echo, f->name, json_string(s));
    return 0;
}

static int one_object(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                      void *target, json_t *echo, int echo_on)
{
    if (v && !json_is_object(v)) {
        gc_decode_error(d, ptr, "must be an object, got %s", json_type_words(v));
        return -1;
    }
    json_t *sub_echo = echo_on ? json_object() : NULL;
    json_t *empty = v ? NULL : json_object();
    int bad = decode_fields_ex(d, f->children, v ? v : empty, ptr, target, sub_echo, NULL);
    json_decref(empty);
    if (sub_echo)
        json_object_set_new(echo, f->name, sub_echo);
    return bad ? -1 : 0;
}

/* The variant a value names: a model name, or an object with "model" (its
 * other members into *members); its index, or -1 with an error. */
static int variant_of(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                      const char *const *names, size_t n, json_t **members)
{
    const char *want = f->def_string;
    char mptr[GC_API_FIELD_LEN];
    gc_text_copy(mptr, sizeof mptr, ptr);
    *members = NULL;
    if (v && json_is_string(v)) {
        want = json_string_value(v);
    } else if (v && json_is_object(v)) {
        json_t *m = json_object_get(v, "model");
        child_pointer(mptr, ptr, "model");
        if (!m) {
            gc_decode_error(d, mptr, "is required when %s is an object", f->name);
            return -1;
        }
        if (!json_is_string(m)) {
            enum_error(d, mptr, NULL, names, n);
            return -1;
        }
        want = json_string_value(m);
        *members = v;
    } else if (v) {
        gc_decode_error(d, ptr, "must be a model name or an object with \"model\", got %s",
                        json_type_words(v));
        return -1;
    }
    for (size_t i = 0; i < n; i++)
        if (want && strcmp(want, names[i]) == 0)
            return (int)i;
    enum_error(d, mptr, want, names, n);
    return -1;
}

static int one_variant(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                       void *target, char *t, json_t *echo, int echo_on)
{
    const gc_variant_spec *vars = f->variants;
    size_t n = 0;
    const char *names[16];
    while (vars[n].name && n < 16) {
        names[n] = vars[n].name;
        n++;
    }
    json_t *members;
    int idx = variant_of(d, f, v, ptr, names, n, &members);
    if (idx < 0)
        return -1;
    *(int *)(void *)t = idx;
    json_t *sub_echo = echo_on ? json_object() : NULL;
    if (sub_echo)
        json_object_set_new(sub_echo, "model", json_string(names[idx]));
    int bad = 0;
    if (vars[idx].fields) {
        json_t *empty = members ? NULL : json_object();
        bad = decode_fields_ex(d, vars[idx].fields, members ? members : empty, ptr, target,
                               sub_echo, "model");
        json_decref(empty);
    } else if (members) {
        static const gc_field_spec none[] = { GC_F_END };
        bad = decode_fields_ex(d, none, members, ptr, target, NULL, "model");
    }
    if (sub_echo)
        json_object_set_new(echo, f->name, sub_echo);
    return bad ? -1 : 0;
}

static int decode_one(gc_decoder *d, const gc_field_spec *f, json_t *v, const char *ptr,
                      void *target, json_t *echo)
{
    char *t = (char *)target + f->offset;
    int echo_on = echo && !(f->flags & GC_F_NO_ECHO);
    if (!v && (f->flags & GC_F_REQUIRED) && f->type != GC_FIELD_OBJECT) {
        gc_decode_error(d, ptr, "is required");
        return -1;
    }
    if (v)
        set_present(f, target);
    switch (f->type) {
    case GC_FIELD_NUMBER: return one_number(d, f, v, ptr, t, echo, echo_on);
    case GC_FIELD_INTEGER: return one_integer(d, f, v, ptr, t, echo, echo_on);
    case GC_FIELD_BOOL: return one_bool(d, f, v, ptr, t, echo, echo_on);
    case GC_FIELD_ENUM: return one_enum(d, f, v, ptr, t, echo, echo_on);
    case GC_FIELD_STRING: return one_string(d, f, v, ptr, t, echo, echo_on);
    case GC_FIELD_OBJECT: return one_object(d, f, v, ptr, target, echo, echo_on);
    case GC_FIELD_VARIANT: return one_variant(d, f, v, ptr, target, t, echo, echo_on);
    case GC_FIELD_CUSTOM:
        return f->custom ? f->custom(d, f, v, ptr, target, echo_on ? echo : NULL) : 0;
    }
    return 0;
}

static int decode_fields_ex(gc_decoder *d, const gc_field_spec *fields, json_t *obj,
                            const char *pointer, void *target, json_t *echo,
                            const char *extra_allowed)
{
    int before = d->errs->n + d->errs->dropped;
    if (!json_is_object(obj)) {
        gc_decode_error(d, pointer, "must be an object, got %s", json_type_words(obj));
        return 1;
    }
    const char *names[64];
    size_t n_names = 0;
    for (const gc_field_spec *f = fields; f->name && n_names < 63; f++)
        names[n_names++] = f->name;
    if (extra_allowed)
        names[n_names++] = extra_allowed;

    const char *key;
    json_t *val;
    json_object_foreach(obj, key, val) {
        int known = 0;
        for (size_t i = 0; i < n_names; i++)
            if (strcmp(key, names[i]) == 0)
                known = 1;
        if (known)
            continue;
        char ptr[GC_API_FIELD_LEN];
        child_pointer(ptr, pointer, key);
        if (pointer[0] == '\0' && gc_out_is_reserved(key)) {
            gc_decode_error(d, ptr, "'%s' is an output parameter, not an input field: give it in "
                            "the query string (?%s=...)", key, key);
            continue;
        }
        const char *s = gc_decode_suggest(key, names, n_names);
        if (s) {
            gc_decode_error(d, ptr, "unknown field '%.60s'; did you mean '%s'?", key, s);
        } else {
            char list[GC_API_MESSAGE_LEN];
            gc_decode_name_list(list, sizeof list - 48 - strnlen(key, 60), names, n_names, 0);
            gc_decode_error(d, ptr, "unknown field '%.60s'; the fields here are: %s", key,
                            n_names ? list : "(none)");
        }
    }
    for (const gc_field_spec *f = fields; f->name; f++) {
        char ptr[GC_API_FIELD_LEN];
        child_pointer(ptr, pointer, f->name);
        decode_one(d, f, json_object_get(obj, f->name), ptr, target, echo);
    }
    return (d->errs->n + d->errs->dropped) - before;
}

json_t *gc_decode_list(gc_decoder *d, json_t *value, json_t **owned)
{
    *owned = NULL;
    if (json_is_string(value) && d->from_query) {
        json_t *a = json_array();
        const char *s = json_string_value(value);
        /* with decimal commas a list separates its values with ';' */
        const char *sep = d->ctx && d->ctx->opts.decimal_comma ? ";" : ",";
        while (*s) {
            size_t len = strcspn(s, sep);
            json_array_append_new(a, json_stringn(s, len));
            s += len;
            if (*s == *sep)
                s++;
        }
        *owned = a;
        return a;
    }
    return value;
}

/* One error for every earlier member naming species id; 1 when there was one. */
static int report_repeated_species(gc_decoder *d, const char *ptr, const int *ids, int n, int id)
{
    int found = 0;
    for (int i = 0; i < n; i++)
        if (ids[i] == id) {
            gc_decode_error(d, ptr, "names a species given already");
            found = 1;
        }
    return found;
}

int gc_decode_mole_fractions(gc_decoder *d, json_t *value, const char *pointer, int *ids,
                             double *x, int *n, json_t *echo, int dup_check_first)
{
    const char *name;
    json_t *v;
    int bad = 0;
    *n = 0;
    json_object_foreach(value, name, v) {
        char ptr[GC_API_FIELD_LEN];
        gc_text_copy(ptr, sizeof ptr, pointer);
        gc_out_pointer_append(ptr, sizeof ptr, name);
        gc_error err;
        gc_error_clear(&err);
        int id = -1;
        if (gc_species_lookup(name, &id, ptr, &err) != GC_OK) {
            gc_decode_error(d, ptr, "%s", err.message);
            bad = 1;
            continue;
        }
        double xi = 0.0;
        if (gc_decode_number(d, v, ptr, GC_Q_FRACTION, &xi) != 0) {
            bad = 1;
            continue;
        }
        if (!(xi >= 0.0 && xi <= 1.0)) {
            gc_decode_error(d, ptr, "must be a mole fraction between 0 and 1");
            bad = 1;
            continue;
        }
        if (dup_check_first)
            bad |= report_repeated_species(d, ptr, ids, *n, id);
        if (*n >= GC_GAS_MAX_SPECIES) {
            gc_decode_error(d, ptr, "at most %d species may be given", GC_GAS_MAX_SPECIES);
            return -1;
        }
        if (!dup_check_first)
            bad |= report_repeated_species(d, ptr, ids, *n, id);
        ids[*n] = id;
        x[(*n)++] = xi;
        if (echo)
            gc_out_num(d->out, echo, gc_species_get(id)->name, xi);
    }
    return bad ? -1 : 0;
}

int gc_decode_fields(gc_decoder *d, const gc_field_spec *fields, json_t *root,
                     const char *pointer, void *target, json_t *echo)
{
    return decode_fields_ex(d, fields, root, pointer ? pointer : "", target, echo, NULL);
}

/* How the inputs were read, into the echo (as doc.c writes it for presets). */
static void echo_reading(gc_out *o, const gc_decode_ctx *c)
{
    json_object_set_new(o->inputs, "input_units",
                        json_string(gc_units_system_name(c->opts.input_sys)));
    if (c->opts.decimal_comma)
        json_object_set_new(o->inputs, "decimal", json_string("comma"));
    if (c->baro_used) {
        gc_out_q(o, o->inputs, "barometric_pressure", c->baro_Pa, GC_Q_PRESSURE);
        json_object_set_new(o->inputs, "barometric_pressure_source",
                            json_string(c->baro_source));
    }
}

/* The units the values were written in, kept in out for the route's own
 * messages after decoding (gc_out.written). */
static void keep_written(gc_out *out, const gc_decode_ctx *c)
{
    if (c->n_written == 0 || (!out->written && !(out->written = json_object())))
        return;
    for (int i = 0; i < c->n_written; i++)
        json_object_set_new(out->written, c->written[i].pointer,
                            json_string(c->written[i].unit));
}

int gc_decode_request(const gc_api_request *req, const gc_field_spec *fields,
                      unsigned accepted, void *target, gc_out *out, gc_api_response *resp)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (gc_out_parse_params(out, req, accepted, &errs) > 0) {
        gc_api_problem_errors(resp, 400, "bad_output", "Invalid output parameters", NULL, &errs);
        return -1;
    }
    json_t *root = NULL;
    if (gc_decode_normalise(req, &root, resp) != 0)
        return -1;
    gc_decode_ctx *ctx = malloc(sizeof *ctx);
    if (!ctx) {
        json_decref(root);
        gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return -1;
    }
    gc_decode_ctx_init(ctx);
    ctx->opts.input_sys = out->input_sys;
    ctx->opts.decimal_comma = out->decimal_comma;
    gc_decoder d = { .errs = &errs, .out = out, .from_query = req->method != GC_M_POST,
                     .ctx = ctx };
    gc_decode_fields(&d, fields, root, "", target, out->inputs);
    gc_decode_ctx_complete(&d, NULL, target);
    echo_reading(out, ctx);
    keep_written(out, ctx);
    free(ctx);
    json_decref(root);
    if (errs.n || errs.dropped) {
        gc_api_problem_errors(resp, 422, "validation", "Invalid input", NULL, &errs);
        return -1;
    }
    return 0;
}
