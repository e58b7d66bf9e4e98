/*
 * output.c — the response builder (output.h): output parameters, quantity-
 * tagged values in the chosen unit system, the NaN/Infinity guard, cautions
 * and warnings, and the encoders: JSON (compact, 10 significant digits),
 * CSV (RFC 4180: CRLF line ends, fields with comma, quote or line break
 * quoted, quotes doubled), a single value selected by an RFC 6901 JSON
 * pointer (text/plain); members given as JSON text written without parsing.
 */
#include "api/respond/output.h"
#include "api/respond/jsonout.h"
#include "gascycle/strbuf.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* Filled in by the diagram module (a later issue); NULL until then. */

#define REAL_FMT "%.10g"
#define DUMP_FLAGS (JSON_COMPACT | JSON_REAL_PRECISION(10))

const char *const gc_out_reserved[] = {
    "format", "units", "select", "table", "diagram", "include", "points", "input_units",
    "decimal", "on_error", NULL
};

int gc_out_is_reserved(const char *name)
{
    for (int i = 0; gc_out_reserved[i]; i++)
        if (strcmp(name, gc_out_reserved[i]) == 0)
            return 1;
    return 0;
}

int gc_out_init(gc_out *o)
{
    memset(o, 0, sizeof *o);
    o->sys = GC_UNITS_SI;
    o->input_sys = GC_UNITS_SI;
    o->format = GC_FMT_JSON;
    o->table = GC_TABLE_ALL;
    o->units = json_object();
    o->warnings = json_array();
    o->inputs = json_object();
    if (!o->units || !o->warnings || !o->inputs) {
        gc_out_free(o);
        return -1;
    }
    return 0;
}

int gc_out_raw_member(gc_out *o, json_t *parent, const char *key, char *text, size_t len)
{
    if (o->n_raw >= GC_OUT_MAX_RAW) {
        json_t *v = json_loadb(text, len, 0, NULL);
        free(text);
        json_object_set_new(parent, key, v ? v : json_null());
        return -1;
    }
    int i = o->n_raw++;
    o->raw_parent[i] = parent;
    o->raw_key[i] = key;
    o->raw[i] = text;
    o->raw_len[i] = len;
    o->raw_hole[i] = json_object();
    json_object_set_new(parent, key, o->raw_hole[i]);
    return 0;
}

/* The raw members parsed into the document (an answer that needs the tree). */
static void raw_parse(gc_out *o)
{
    for (int i = 0; i < o->n_raw; i++) {
        json_t *v = json_loadb(o->raw[i], o->raw_len[i], 0, NULL);
        json_object_set_new(o->raw_parent[i], o->raw_key[i], v ? v : json_null());
        free(o->raw[i]);
    }
    o->n_raw = 0;
}

void gc_out_free(gc_out *o)
{
    for (int i = 0; i < o->n_raw; i++)
        free(o->raw[i]);
    o->n_raw = 0;
    json_decref(o->units);
    json_decref(o->warnings);
    json_decref(o->inputs);
    json_decref(o->written);
    o->units = o->warnings = o->inputs = o->written = NULL;
}

static int valid_pointer_syntax(const char *p)
{
    if (*p && *p != '/')
        return 0;
    for (; *p; p++)
        if (*p == '~' && p[1] != '0' && p[1] != '1')
            return 0;
    return 1;
}

/* format= of a route accepting `accepted`. */
static void param_format(gc_out *o, const char *v, unsigned accepted, const char *field,
                         gc_api_errors *errs)
{
    if (strcmp(v, "json") == 0)
        o->format = GC_FMT_JSON;
    else if (strcmp(v, "csv") == 0 && (accepted & GC_OUT_ACCEPT_CSV))
        o->format = GC_FMT_CSV;
    else if (strcmp(v, "svg") == 0 && (accepted & GC_OUT_ACCEPT_SVG))
        o->format = GC_FMT_SVG;
    else
        gc_api_errors_add(errs, field, "must be one of 'json'%s%s for this route",
                          (accepted & GC_OUT_ACCEPT_CSV) ? ", 'csv'" : "",
                          (accepted & GC_OUT_ACCEPT_SVG) ? ", 'svg'" : "");
}

/* input_units=, decimal=, on_error= (which 7, 8, 9). */
static void param_reading(gc_out *o, int which, const char *v, const char *field,
                          gc_api_errors *errs)
{
    if (which == 7) {
        if (gc_units_system_parse(v, &o->input_sys) != GC_OK)
            gc_api_errors_add(errs, field, "must be 'si' or 'us' (the unit system of plain "
                              "numbers in the inputs)");
    } else if (which == 8) {
        if (strcmp(v, "comma") == 0)
            o->decimal_comma = 1;
        else if (strcmp(v, "point") != 0)
            gc_api_errors_add(errs, field, "must be 'point' or 'comma'");
    } else if (strcmp(v, "problem") != 0 && strcmp(v, "text") != 0 && strcmp(v, "cell") != 0) {
        gc_api_errors_add(errs, field, "must be 'problem', 'text' or 'cell'");
    }
}

/* One output parameter (which: its index in gc_out_reserved). */
static void param_one(gc_out *o, int which, const char *v, unsigned accepted,
                      const char *field, gc_api_errors *errs)
{
    static const unsigned needs[] = { 0, GC_OUT_ACCEPT_UNITS, GC_OUT_ACCEPT_SELECT, 0,
                                      GC_OUT_ACCEPT_SVG, GC_OUT_ACCEPT_INCLUDE,
                                      GC_OUT_ACCEPT_POINTS, GC_OUT_ACCEPT_INPUT_UNITS,
                                      GC_OUT_ACCEPT_DECIMAL, 0 };
    if (which >= 1 && which <= 8 && which != 3 && !(accepted & needs[which])) {
        gc_api_errors_add(errs, field, which == 1 ? "this route has no unit-bearing output"
                                   : which == 7 ? "this route has no input values to read"
                                   : which == 8 ? "applies to the evaluation routes (cycles, "
                                                  "measured, properties); this route reads "
                                                  "decimal points"
                                                : "is not an output parameter of this route");
        return;
    }
    switch (which) {
    case 0: param_format(o, v, accepted, field, errs); break;
    case 1:
        if (gc_units_system_parse(v, &o->sys) != GC_OK)
            gc_api_errors_add(errs, field, "must be 'si' or 'us'");
        break;
    case 2:
        if (!valid_pointer_syntax(v))
            gc_api_errors_add(errs, field, "must be a JSON pointer (RFC 6901) such as "
                              "'/properties/cp', got '%.60s'", v);
        else
            o->select = v;
        break;
    case 3:
        if (strcmp(v, "states") == 0)
            o->table = GC_TABLE_STATES;
        else if (strcmp(v, "processes") == 0)
            o->table = GC_TABLE_PROCESSES;
        else if (strcmp(v, "summary") == 0)
            o->table = GC_TABLE_SUMMARY;
        else
            gc_api_errors_add(errs, field, "must be 'states', 'processes' or 'summary'");
        break;
    case 4: o->diagram = v; break;
    case 5: o->include = v; break;
    case 6: o->points = v; break;
    default: param_reading(o, which, v, field, errs); break;
    }
}

/* q of the media range `type` in an Accept header (0 when absent). */
static double accept_q(const char *accept, const char *type)
{
    size_t tl = strlen(type);
    for (const char *p = accept; p && *p;) {
        while (*p == ' ' || *p == ',')
            p++;
        size_t n = strcspn(p, ",");
        size_t mt = strcspn(p, ";,");
        while (mt > 0 && p[mt - 1] == ' ')
            mt--;
        if (mt == tl && strncasecmp(p, type, tl) == 0) {
            const char *q = strstr(p, ";q=");
            if (!q || q > p + n)
                q = strstr(p, "; q=");
            return q && q < p + n ? strtod(strchr(q, '=') + 1, NULL) : 1.0;
        }
        p += n;
    }
    return 0.0;
}

/* Accept: text/csv (preferred over JSON) as format=csv, when no format= was given. */
static void accept_csv(gc_out *o, const gc_api_request *req, unsigned accepted, int format_given)
{
    if (format_given || !req->accept || !(accepted & GC_OUT_ACCEPT_CSV))
        return;
    double csv = accept_q(req->accept, "text/csv");
    if (csv > 0.0 && csv > accept_q(req->accept, "application/json")) {
        o->format = GC_FMT_CSV;
        o->csv_by_accept = 1;
    }
}

int gc_out_parse_params(gc_out *o, const gc_api_request *req, unsigned accepted,
                        gc_api_errors *errs)
{
    int before = errs->n + errs->dropped;
    int seen[12] = { 0 };
    for (size_t i = 0; i < req->n_query; i++) {
        const char *k = req->query[i].key ? req->query[i].key : "";
        const char *v = req->query[i].value ? req->query[i].value : "";
        int which = -1;
        for (int r = 0; gc_out_reserved[r]; r++)
            if (strcmp(k, gc_out_reserved[r]) == 0)
                which = r;
        if (which < 0)
            continue;
        char field[40];
        snprintf(field, sizeof field, "/%s", k);
        if (seen[which]++)
            gc_api_errors_add(errs, field, "given more than once");
        else
            param_one(o, which, v, accepted, field, errs);
    }
    accept_csv(o, req, accepted, seen[0]);
    if (o->select && o->format != GC_FMT_JSON && !o->csv_by_accept)
        gc_api_errors_add(errs, "/select", "cannot be combined with format=%s",
                          o->format == GC_FMT_CSV ? "csv" : "svg");
    if (o->select && o->csv_by_accept)
        o->format = GC_FMT_JSON;   /* a select= answer is a value, whatever is accepted */
    if (seen[3] && o->format != GC_FMT_CSV)
        gc_api_errors_add(errs, "/table", "applies only with format=csv");
    if (seen[4] && o->format != GC_FMT_SVG && (accepted & GC_OUT_ACCEPT_SVG))
        gc_api_errors_add(errs, "/diagram", "applies only with format=svg");
    return (errs->n + errs->dropped) - before;
}

static void note_nonfinite(gc_out *o, const char *key)
{
    if (o->nonfinite++ == 0)
        snprintf(o->nonfinite_at, sizeof o->nonfinite_at, "%s", key);
}

int gc_out_q(gc_out *o, json_t *obj, const char *key, double si_value, gc_quantity q)
{
    double v = gc_units_from_si(q, o->sys, si_value);
    if (!json_object_get(o->units, key))
        json_object_set_new(o->units, key, json_string(gc_units_label(q, o->sys)));
    if (!isfinite(v)) {
        note_nonfinite(o, key);
        json_object_set_new(obj, key, json_null());
        return -1;
    }
    json_object_set_new(obj, key, json_real(v + 0.0)); /* -0 + 0 = +0: no "-0" in any format */
    return 0;
}

int gc_out_num(gc_out *o, json_t *obj, const char *key, double v)
{
    if (!isfinite(v)) {
        note_nonfinite(o, key);
        json_object_set_new(obj, key, json_null());
        return -1;
    }
    json_object_set_new(obj, key, json_real(v + 0.0)); /* -0 + 0 = +0: no "-0" in any format */
    return 0;
}

void gc_out_warn(gc_out *o, const char *code, const char *field, const char *fmt, ...)
{
    char msg[GC_API_MESSAGE_LEN];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    json_t *w = json_object();
    json_object_set_new(w, "code", json_string(code));
    if (field)
        json_object_set_new(w, "field", json_string(field));
    json_object_set_new(w, "message", json_string(msg));
    json_array_append_new(o->warnings, w);
}

json_t *gc_out_cautions(void)
{
    static const char *const text[] = {
        "These figures are idealised estimates meant for design studies and performance "
        "monitoring.",
        "They do not replace acceptance testing to the applicable test codes, the equipment "
        "maker's limits, local codes, or the judgement of a licensed engineer.",
        "Do not use them to drive protection or control systems.",
    };
    json_t *a = json_array();
    for (size_t i = 0; i < sizeof text / sizeof text[0]; i++)
        json_array_append_new(a, json_string(text[i]));
    return a;
}

/* ---- JSON pointer -------------------------------------------------------- */

void gc_out_pointer_append(char *buf, size_t n, const char *key)
{
    size_t used = strlen(buf);
    if (used + 1 >= n)
        return;
    buf[used++] = '/';
    for (const char *k = key; *k && used + 1 < n; k++) {
        if (*k == '~' || *k == '/') {
            if (used + 2 >= n)
                break;
            buf[used++] = '~';
            buf[used++] = *k == '~' ? '0' : '1';
        } else {
            buf[used++] = *k;
        }
    }
    buf[used] = '\0';
}

json_t *gc_out_pointer(json_t *doc, const char *pointer)
{
    if (!pointer || !valid_pointer_syntax(pointer))
        return NULL;
    json_t *cur = doc;
    const char *p = pointer;
    char tok[256];
    while (*p == '/' && cur) {
        p++;
        size_t n = 0;
        while (*p && *p != '/') {
            char c = *p++;
            if (c == '~')
                c = (*p++ == '0') ? '~' : '/';
            if (n + 1 >= sizeof tok)
                return NULL;
            tok[n++] = c;
        }
        tok[n] = '\0';
        if (json_is_object(cur)) {
            cur = json_object_get(cur, tok);
        } else if (json_is_array(cur)) {
            if (n == 0 || (tok[0] == '0' && n > 1) || strspn(tok, "0123456789") != n || n > 9)
                return NULL;
            cur = json_array_get(cur, (size_t)strtoul(tok, NULL, 10));
        } else {
            return NULL;
        }
    }
    return cur;
}

void gc_out_number_text(char *buf, size_t n, double v, int comma)
{
    snprintf(buf, n, REAL_FMT, v);
    char *dot = comma ? strchr(buf, '.') : NULL;
    if (dot)
        *dot = ',';
}

/* Text of a scalar: numbers with 10 significant digits, strings raw. */
static void scalar_text(gc_strbuf *b, const json_t *v, int comma)
{
    char num[40];
    switch (json_typeof(v)) {
    case JSON_STRING:
        gc_strbuf_put(b, json_string_value(v), json_string_length(v));
        break;
    case JSON_INTEGER:
        snprintf(num, sizeof num, "%" JSON_INTEGER_FORMAT, json_integer_value(v));
        gc_strbuf_puts(b, num);
        break;
    case JSON_REAL:
        gc_out_number_text(num, sizeof num, json_real_value(v), comma);
        gc_strbuf_puts(b, num);
        break;
    case JSON_TRUE: gc_strbuf_puts(b, "true"); break;
    case JSON_FALSE: gc_strbuf_puts(b, "false"); break;
    case JSON_NULL: gc_strbuf_puts(b, "null"); break;
    default: break;
    }
}

static int is_scalar(const json_t *v)
{
    return v && !json_is_object(v) && !json_is_array(v);
}

/* One RFC 4180 field (sep: the field separator). */
static void csv_field(gc_strbuf *b, const char *s, size_t n, char sep)
{
    int quote = 0;
    for (size_t i = 0; i < n; i++)
        if (s[i] == sep || s[i] == '"' || s[i] == '\r' || s[i] == '\n')
            quote = 1;
    if (!quote) {
        gc_strbuf_put(b, s, n);
        return;
    }
    gc_strbuf_put(b, "\"", 1);
    for (size_t i = 0; i < n; i++) {
        if (s[i] == '"')
            gc_strbuf_put(b, "\"", 1);
        gc_strbuf_put(b, s + i, 1);
    }
    gc_strbuf_put(b, "\"", 1);
}

static void csv_value(gc_strbuf *b, const json_t *v, int comma)
{
    if (!v || json_is_null(v))
        return;
    gc_strbuf t = { 0 };
    scalar_text(&t, v, comma);
    if (t.failed)
        b->failed = 1;
    csv_field(b, t.s ? t.s : "", t.len, comma ? ';' : ',');
    free(t.s);
}

/* Rows: an array of objects (or one object). Columns = scalar members in
 * order of first appearance; header "name [unit]". */
static void csv_table(gc_strbuf *b, const gc_out *o, json_t *rows_in)
{
    json_t *rows = json_is_array(rows_in) ? json_incref(rows_in) : json_pack("[O]", rows_in);
    json_t *cols = json_array();
    json_t *seen = json_object();
    char sep = o->decimal_comma ? ';' : ',';
    size_t i;
    json_t *row;
    json_array_foreach(rows, i, row) {
        const char *k;
        json_t *v;
        if (!json_is_object(row))
            continue;
        json_object_foreach(row, k, v) {
            if (is_scalar(v) && !json_object_get(seen, k)) {
                json_object_set_new(seen, k, json_true());
                json_array_append_new(cols, json_string(k));
            }
        }
    }
    size_t c;
    json_t *col;
    json_array_foreach(cols, c, col) {
        if (c)
            gc_strbuf_put(b, &sep, 1);
        const char *name = json_string_value(col);
        const char *unit = json_string_value(json_object_get(o->units, name));
        char head[160];
        if (unit && strcmp(unit, "-") != 0)
            snprintf(head, sizeof head, "%s [%s]", name, unit);
        else
            snprintf(head, sizeof head, "%s", name);
        csv_field(b, head, strlen(head), sep);
    }
    gc_strbuf_put(b, "\r\n", 2);
    json_array_foreach(rows, i, row) {
        if (!json_is_object(row))
            continue;
        json_array_foreach(cols, c, col) {
            if (c)
                gc_strbuf_put(b, &sep, 1);
            json_t *v = json_object_get(row, json_string_value(col));
            if (is_scalar(v))
                csv_value(b, v, o->decimal_comma);
        }
        gc_strbuf_put(b, "\r\n", 2);
    }
    json_decref(cols);
    json_decref(seen);
    json_decref(rows);
}

static int set_body(gc_api_response *resp, int status, const char *ct, char *body, size_t len)
{
    resp->status = status;
    resp->content_type = ct;
    resp->body = body;
    resp->body_len = len;
    resp->cache_seconds = 0;
    return 0;
}

static int oom(gc_api_response *resp)
{
    gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.", NULL);
    return 0;
}

static int problem1(gc_api_response *resp, int status, const char *cls, const char *title,
                    const char *field, const char *fmt, ...) __attribute__((format(printf, 6, 7)));
static int problem1(gc_api_response *resp, int status, const char *cls, const char *title,
                    const char *field, const char *fmt, ...)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    char msg[GC_API_MESSAGE_LEN];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    gc_api_errors_add(&errs, field, "%s", msg);
    gc_api_problem_errors(resp, status, cls, title, NULL, &errs);
    return 0;
}

/* select=: a scalar as text, an object or array as JSON. */
static int respond_select(const gc_out *o, json_t *doc, gc_api_response *resp)
{
    json_t *v = gc_out_pointer(doc, o->select);
    if (!v)
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/select",
                        "no value at '%.150s' in the response", o->select);
    if (is_scalar(v)) {
        gc_strbuf b = { 0 };
        scalar_text(&b, v, o->decimal_comma);
        if (b.failed || !b.s) {
            free(b.s);
            b.s = strdup("");
            if (!b.s)
                return oom(resp);
        }
        return set_body(resp, 200, GC_API_CT_TEXT, b.s, b.len);
    }
    size_t n = 0;
    char *s = gc_json_dump(v, 10, &n); /* = json_dumps(v, DUMP_FLAGS), faster */
    return s ? set_body(resp, 200, GC_API_CT_JSON, s, n) : oom(resp);
}

/* format=csv: the states and processes tables, or the one-row table. */
static int respond_csv(gc_out *o, json_t *doc, gc_api_response *resp)
{
    json_t *states = json_object_get(doc, "states");
    json_t *procs = json_object_get(doc, "processes");
    json_t *row = o->csv_row ? json_object_get(doc, o->csv_row) : NULL;
    gc_strbuf b = { 0 };
    json_t *summary = json_object_get(doc, "summary");
    if (o->table == GC_TABLE_SUMMARY) {
        if (!json_is_object(summary))
            return problem1(resp, 400, "bad_output", "Invalid output parameters", "/table",
                            "this response has no summary");
        csv_table(&b, o, summary);
    } else if (o->table == GC_TABLE_STATES || o->table == GC_TABLE_PROCESSES) {
        json_t *t = o->table == GC_TABLE_STATES ? states : procs;
        if (!json_is_array(t))
            return problem1(resp, 400, "bad_output", "Invalid output parameters", "/table",
                            "this response has no %s table",
                            o->table == GC_TABLE_STATES ? "states" : "processes");
        csv_table(&b, o, t);
    } else if (json_is_array(states) || json_is_array(procs)) {
        if (json_is_array(states))
            csv_table(&b, o, states);
        if (json_is_array(states) && json_is_array(procs))
            gc_strbuf_put(&b, "\r\n", 2);
        if (json_is_array(procs))
            csv_table(&b, o, procs);
    } else if (json_is_object(row)) {
        csv_table(&b, o, row);
    } else {
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/format",
                        "this response has no table to give as CSV");
    }
    if (b.failed || !b.s) {
        free(b.s);
        return oom(resp);
    }
    return set_body(resp, 200, GC_API_CT_CSV, b.s, b.len);
}

int gc_out_respond(gc_out *o, json_t *doc, unsigned flags, gc_api_response *resp)
{
    int rc;
    if (!doc) {
        gc_out_free(o);
        return oom(resp);
    }
    if (o->nonfinite) {
        fprintf(stderr, "gascycled: refused a non-finite result value at '%s' (%d value%s)\n",
                o->nonfinite_at, o->nonfinite, o->nonfinite == 1 ? "" : "s");
        rc = problem1(resp, 422, "not_finite", "Result not finite", "",
                      "the computation gave a value that is not a finite number (at '%s'); "
                      "no result is returned for these inputs", o->nonfinite_at);
        json_decref(doc);
        gc_out_free(o);
        return rc;
    }
    if (flags & GC_OUT_EVALUATION) {
        /* every evaluation says how its inputs were read (issue 17) */
        if (!json_object_get(o->inputs, "input_units"))
            json_object_set_new(o->inputs, "input_units",
                                json_string(gc_units_system_name(o->input_sys)));
        json_object_set(doc, "inputs", o->inputs);
        json_object_set(doc, "warnings", o->warnings);
        json_object_set_new(doc, "cautions", gc_out_cautions());
    }
    json_object_set_new(doc, "unit_system", json_string(gc_units_system_name(o->sys)));
    json_object_set(doc, "units", o->units);
    if (o->n_raw && (o->select || o->format != GC_FMT_JSON))
        raw_parse(o);
    if (o->select) {
        rc = respond_select(o, doc, resp);
    } else if (o->format == GC_FMT_CSV) {
        rc = respond_csv(o, doc, resp);
    } else {
        size_t n = 0;
        char *s = gc_json_dump_with(doc, 10, &n, (const json_t *const *)o->raw_hole,
                                    (const char *const *)o->raw, o->raw_len, o->n_raw);
        rc = s ? set_body(resp, 200, GC_API_CT_JSON, s, n) : oom(resp);
    }
    json_decref(doc);
    gc_out_free(o);
    return rc;
}
