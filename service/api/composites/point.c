/*
 * point.c — a preset evaluated point after point in process (point.h).
 */
#include "api/composites/point.h"
#include "api/handlers.h"
#include "api/request/fields.h"
#include "api/request/params.h"
#include "api/respond/respond.h"
#include "gascycle/gas.h"
#include "gascycle/path.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define ALIGN(n) (((n) + 15u) & ~(size_t)15u)

int gc_api_points_init(gc_api_points *e, const gc_preset *p, json_t *inputs, int from_query,
                       gc_unit_system sys, const char *const *free_pointers, int n_free)
{
    memset(e, 0, sizeof *e);
    if (p == NULL)
        return -1;
    e->p = p;
    e->inputs = inputs;
    e->from_query = from_query;
    e->sys = sys;
    gc_decode_ctx_init(&e->ctx);
    e->n_free = n_free < GC_API_POINT_MAX_FREE ? n_free : GC_API_POINT_MAX_FREE;
    for (int d = 0; d < e->n_free; d++) {
        int idx[2];
        snprintf(e->pointer[d], sizeof e->pointer[d], "%s", free_pointers[d]);
        int row = gc_api_field_find(p, e->pointer[d], idx);
        e->row[d] = gc_api_field_settable(p, row) ? row : -1;
    }
    size_t a = ALIGN(p->input_size), c = ALIGN(p->result_size);
    char *block = malloc(3 * a + c + sizeof(gc_report));
    if (!block)
        return -1;
    e->block = block;
    e->input = block;
    e->work = block + a;
    e->echo = block + 2 * a;
    e->result = block + 3 * a;
    e->rep = (gc_report *)(void *)(block + 3 * a + c);
    gc_preset_input_init(p, e->input);
    e->want_units = 1;
    return 0;
}

void gc_api_points_free(gc_api_points *e)
{
    if (e->block && !e->shared_input)
        gc_api_fields_release(e->p, e->input);
    free(e->block);
    json_decref(e->problem);
    e->block = NULL;
    e->problem = NULL;
}

int gc_api_points_target(gc_api_points *e, const char *pointer)
{
    if (e->n_targets >= GC_JW_MAX_TARGETS || gc_jw_target_parse(&e->t[e->n_targets], pointer))
        return -1;
    return e->n_targets++;
}

/* Takes a route's problem answer as the point's outcome. */
static int take_problem(gc_api_points *e, gc_api_response *resp)
{
    e->status = resp->status;
    e->error_class = resp->error_class;
    if (resp->body)
        e->problem = json_loadb(resp->body, resp->body_len, 0, NULL);
    free(resp->body);
    if (!e->error_class && e->problem) {
        const char *type = json_string_value(json_object_get(e->problem, "type"));
        size_t nb = strlen(GC_API_PROBLEM_TYPE_BASE);
        if (type && strncmp(type, GC_API_PROBLEM_TYPE_BASE, nb) == 0)
            e->error_class = type + nb;
    }
    return e->status == 503 ? -1 : e->status;
}

/* The whole request decoded again with the point's values in place. */
static void decode_all(gc_api_points *e, json_t *const *values, gc_api_errors *errs)
{
    json_t *fields = e->inputs ? json_deep_copy(e->inputs) : json_object();
    for (int d = 0; d < e->n_free && !e->set_failed; d++)
        if (gc_api_pointer_set(fields, e->pointer[d], json_incref(values[d])) != 0) {
            e->set_failed = 1;
            e->set_failed_dim = d;
        }
    gc_api_fields_release(e->p, e->input);
    gc_preset_input_init(e->p, e->input);
    e->have_base = 0;
    if (!e->set_failed && fields &&
        gc_api_fields_decode(e->p, fields, e->from_query, e->input, "", errs, &e->ctx) == 0)
        e->have_base = 1;
    json_decref(fields);
}

/* The point's values set into the decoded request, in table order (the order
 * a whole request's errors come in). */
static int set_values(gc_api_points *e, json_t *const *values, gc_api_errors *errs)
{
    for (int d = 0; d < e->n_free; d++)
        if (e->row[d] < 0)
            return -1;
    int first = e->n_free > 1 && e->row[1] < e->row[0] ? 1 : 0;
    for (int k = 0; k < e->n_free; k++) {
        int d = k == 0 ? first : 1 - first;
        gc_api_field_set(e->p, e->row[d], values[d], e->from_query, e->input, "", errs,
                         &e->ctx);
    }
    return 0;
}

/* Walks the document for the targets; the writer used (its non-finite count). */
static const gc_jw *capture(gc_api_points *e, const void *echo)
{
    gc_api_docopts o = { 0, GC_PATH_DEFAULT_POINTS, NULL, 0u, &e->ctx };
    for (int i = 0; i < e->n_targets; i++) {
        e->t[i].found = 0;
        e->t[i].kind = GC_JW_NONE;
    }
    gc_jw *w = e->want_units ? &e->w : &e->wq;
    gc_jw_init(w, NULL, e->sys);
    gc_jw_targets(w, e->t, e->n_targets, 0);
    w->quiet = !e->want_units;
    gc_api_write_document(w, e->p, echo, e->result, e->rep, &o);
    return w;
}

int gc_api_points_run(gc_api_points *e, json_t *const *values)
{
    gc_api_errors errs;
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    gc_api_errors_init(&errs);
    json_decref(e->problem);
    e->problem = NULL;
    e->error_class = NULL;
    e->set_failed = 0;
    if (!e->have_base || set_values(e, values, &errs) != 0)
        decode_all(e, values, &errs);
    if (e->set_failed) {
        e->status = 422;
        return e->status;
    }
    if (errs.n || errs.dropped) {
        gc_api_problem_errors(&resp, 422, "validation", "Invalid input", NULL, &errs);
        return take_problem(e, &resp);
    }
    const gc_preset *p = e->p;
    memcpy(e->work, e->input, p->input_size);
    if (e->lean && p->lean)
        p->lean(e->work, e->lean);
    gc_report_init(e->rep);
    e->rep->skip_validity = (e->lean & GC_LEAN_NO_WARNINGS) != 0;
    if (gc_preset_evaluate(p, e->work, e->result, e->rep) != GC_OK) {
        gc_api_problem_report(&resp, p, e->rep, NULL, &e->ctx, e->sys);
        return take_problem(e, &resp);
    }
    const void *echo = gc_api_echo_input(p, e->work, e->result, e->echo);
    if (capture(e, echo)->nonfinite) {
        gc_api_params v;
        memset(&v, 0, sizeof v);
        v.sys = e->sys;
        v.points = GC_PATH_DEFAULT_POINTS;
        gc_api_respond_preset(&resp, p, &v, echo, e->result, e->rep);
        return take_problem(e, &resp);
    }
    e->status = 200;
    e->want_units = 0;
    e->evaluated++;
    if (e->tally)
        gc_api_count_evaluations(e->tally, p->name, 1);
    return 200;
}

/* A number as the document shows it (10 significant digits, -0 as 0). */
static double as_shown(double x)
{
    char buf[40];
    snprintf(buf, sizeof buf, "%.10g", x);
    double y = strtod(buf, NULL);
    return y == 0.0 ? 0.0 : y;
}

json_t *gc_api_points_value(const gc_api_points *e, int i)
{
    if (i < 0 || i >= e->n_targets)
        return NULL;
    const gc_jw_target *t = &e->t[i];
    if (!t->found)
        return NULL;
    switch (t->kind) {
    case GC_JW_NUMBER: return json_real(as_shown(t->num));
    case GC_JW_INTEGER: return json_integer((json_int_t)t->num);
    case GC_JW_BOOL: return json_boolean(t->num != 0.0);
    case GC_JW_STRING: return json_string(t->text);
    case GC_JW_OBJECT: return json_object();
    case GC_JW_ARRAY: return json_array();
    default: return json_null();
    }
}

/* The document (or only its warnings) as JSON text (malloc'd), or NULL. */
static char *written_text(gc_api_points *e, int warnings_only, size_t *len)
{
    gc_strbuf b = { .first_cap = warnings_only ? 256 : 16384 };
    gc_jw w;
    gc_api_docopts o = { 0, GC_PATH_DEFAULT_POINTS, NULL, 0u, &e->ctx };
    const void *echo = gc_api_echo_input(e->p, e->work, e->result, e->echo);
    gc_jw_init(&w, &b, e->sys);
    if (warnings_only) {
        gc_jw_object(&w, NULL);
        gc_api_write_warnings(&w, e->p, e->result, e->rep, NULL);
        gc_jw_end(&w);
    } else {
        gc_api_write_document(&w, e->p, echo, e->result, e->rep, &o);
    }
    if (b.failed || !b.s) {
        free(b.s);
        return NULL;
    }
    *len = b.len;
    return b.s;
}

/* The document (or only its warnings) written and read back. */
static json_t *written(gc_api_points *e, int warnings_only)
{
    size_t len = 0;
    char *text = written_text(e, warnings_only, &len);
    json_t *doc = text ? json_loadb(text, len, 0, NULL) : NULL;
    free(text);
    return doc;
}

char *gc_api_points_document_text(gc_api_points *e, size_t *len)
{
    return e->status == 200 ? written_text(e, 0, len) : NULL;
}

json_t *gc_api_points_warnings(gc_api_points *e)
{
    if (e->status != 200)
        return NULL;
    const gc_cycle_result *c = e->p->cycle ? e->p->cycle(e->result) : NULL;
    if (e->rep->n_warnings == 0 && !(c && c->actual.checks.close_rel > GC_CYCLE_TOL_STATE))
        return NULL;
    json_t *doc = written(e, 1);
    json_t *ws = json_incref(json_object_get(doc, "warnings"));
    json_decref(doc);
    return ws;
}

json_t *gc_api_points_document(gc_api_points *e)
{
    return e->status == 200 ? written(e, 0) : NULL;
}

const char *gc_api_points_unit(const gc_api_points *e, const char *key)
{
    return gc_jw_unit_of(&e->w, key);
}

/* ---- numeric inputs set directly ---------------------------------------------------------- */

unsigned gc_api_points_lean_for(const char *output)
{
    static const char *const full[] = { "/bounds", "/checks", "/paths", "/warnings" };
    for (size_t i = 0; i < sizeof full / sizeof full[0]; i++) {
        size_t n = strlen(full[i]);
        if (strncmp(output, full[i], n) == 0 && (output[n] == '/' || output[n] == '\0'))
            return 0;
    }
    return GC_LEAN_NO_AREAS | GC_LEAN_NO_BOUNDS | GC_LEAN_NO_WARNINGS;
}

/* The way down to row: objects, at most one list, a gas model (*gas_row).
 * 0, or -1 with a sentence in why. */
static int num_path(const gc_preset *p, int row, int *gas_row, char *why, size_t wn)
{
    int lists = 0;
    *gas_row = -1;
    for (int r = p->fields[row].parent; r > 0; r = p->fields[r].parent) {
        gc_field_type t = p->fields[r].type;
        if (t == GC_FT_LIST)
            lists++;
        else if (t == GC_FT_GAS)
            *gas_row = r;
        else if (t != GC_FT_OBJECT) {
            snprintf(why, wn, "is part of '%s', whose members cannot be changed one by one",
                     p->fields[r].name);
            return -1;
        }
    }
    if (lists > 1) {
        snprintf(why, wn, "lies in a list within a list, which cannot be changed one by one");
        return -1;
    }
    return 0;
}

/* A list item that exists, and a gas model that is the cold one; p's input
 * struct starts at base (the request's, or a nested preset's part of it). */
static int num_place(const gc_preset *p, const char *base, int row, int gas_row,
                     gc_api_points_num *n, char *why, size_t wn)
{
    int list = gc_preset_list_of(p, row);
    if (list >= 0) {
        const gc_field *l = &p->fields[list];
        int count = *(const int *)(const void *)(base + l->count - 1);
        if (n->idx[0] < 0 || n->idx[0] >= count) {
            snprintf(why, wn, "names item %d of '%s', which has %d item%s in these inputs",
                     n->idx[0], l->name, count, count == 1 ? "" : "s");
            return -1;
        }
    }
    if (gas_row >= 0) {
        const gc_field *g = &p->fields[gas_row];
        const gc_gas *gas = (const gc_gas *)(const void *)(base + g->offset);
        if (gas->kind != GC_GAS_COLD) {
            snprintf(why, wn, "applies to the cold gas model only: give %s as {\"model\": "
                     "\"cold\", ...}", g->name);
            return -1;
        }
        n->gas = g->offset + 1;
    }
    return 0;
}

/* The number at pointer in preset p whose input struct starts at base; its
 * offset (and gas offset) from base. 0, or -1 with a sentence in why. */
static int num_in(const gc_preset *p, char *base, const char *pointer,
                  gc_api_points_num *n, char *why, size_t wn)
{
    int gas_row;
    int row = gc_preset_field_find(p, pointer, n->idx);
    if (row <= 0) {
        snprintf(why, wn, "is not an input of %s", p->name);
        return -1;
    }
    const gc_field *f = &p->fields[row];
    if (f->type != GC_FT_NUMBER) {
        snprintf(why, wn, "is not a number (a whole number, a name, a list or an object has no "
                 "continuous value to perturb)");
        return -1;
    }
    if (num_path(p, row, &gas_row, why, wn) != 0 ||
        num_place(p, base, row, gas_row, n, why, wn) != 0)
        return -1;
    const char *member = gc_preset_member(p, row, n->idx, base);
    n->row = row;
    n->offset = (size_t)(member - base);
    memcpy(&n->value, member, sizeof n->value);
    int given = 1;
    if (f->given && !(f->flags & GC_FF_ECHO_GIVEN))   /* ECHO_GIVEN: the flag is the echo's */
        given = *(const int *)(const void *)(member - f->offset + f->given - 1) != 0;
    if (!GC_IS_SET(n->value) || !given || !isfinite(n->value)) {
        snprintf(why, wn, "is not given in the inputs: without it the %s route assumes or "
                 "derives its value, so give the value the uncertainty applies to", p->name);
        return -1;
    }
    n->quantity = f->quantity;
    n->has_lo = (f->flags & GC_FF_MIN) != 0;
    n->lo = (f->flags & GC_FF_MIN_EXCL) ? nextafter(f->min, INFINITY) : f->min;
    n->has_hi = (f->flags & GC_FF_MAX) != 0;
    n->hi = (f->flags & GC_FF_MAX_EXCL) ? nextafter(f->max, -INFINITY) : f->max;
    return 0;
}

/* "/<row>/inputs/..." of a nested preset (a combined cycle's topping): the
 * row, and the rest of the pointer in *rest; -1 when pointer is not one. */
static int nested_row(const gc_preset *p, const char *pointer, const char **rest)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        size_t k = f->name ? strlen(f->name) : 0;
        if (f->type != GC_FT_PRESET || f->parent != 0 || pointer[0] != '/' ||
            strncmp(pointer + 1, f->name, k) != 0 || strncmp(pointer + 1 + k, "/inputs/", 8))
            continue;
        *rest = pointer + 1 + k + 7;
        return r;
    }
    return -1;
}

int gc_api_points_num_find(const gc_api_points *e, const char *pointer, gc_api_points_num *n,
                           char *why, size_t wn)
{
    memset(n, 0, sizeof *n);
    const char *rest = NULL;
    int outer = gc_preset_field_find(e->p, pointer, n->idx) > 0 ? -1
                                                                 : nested_row(e->p, pointer, &rest);
    const gc_preset *sub = outer > 0 ? gc_preset_nested(e->p, outer, e->input) : NULL;
    if (!sub)
        return num_in(e->p, (char *)e->input, pointer, n, why, wn);
    size_t at = e->p->fields[outer].offset;
    if (num_in(sub, (char *)e->input + at, rest, n, why, wn) != 0)
        return -1;
    n->row = outer;   /* errors of the nested input are the nested request's */
    n->offset += at;
    if (n->gas)
        n->gas += at;
    return 0;
}

/* A point the preset refused (with its problem when wanted). */
static int nums_failed(gc_api_points *e, int want_problem, int nonfinite)
{
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    if (!want_problem) {
        e->status = 422;
        e->error_class = nonfinite ? "not_finite" : "validation";
        return e->status;
    }
    if (nonfinite) {
        gc_api_params v;
        memset(&v, 0, sizeof v);
        v.sys = e->sys;
        v.points = GC_PATH_DEFAULT_POINTS;
        const void *echo = gc_api_echo_input(e->p, e->work, e->result, e->echo);
        gc_api_respond_preset(&resp, e->p, &v, echo, e->result, e->rep);
    } else {
        gc_api_problem_report(&resp, e->p, e->rep, NULL, &e->ctx, e->sys);
    }
    return take_problem(e, &resp);
}

/* Writes the values into the work copy; the cold gas models rebuilt. */
static int nums_set(gc_api_points *e, const gc_api_points_num *nums, const double *x, int n)
{
    for (int k = 0; k < n; k++)
        memcpy((char *)e->work + nums[k].offset, &x[k], sizeof x[k]);
    for (int k = 0; k < n; k++) {
        if (!nums[k].gas)
            continue;
        gc_gas *g = (gc_gas *)(void *)((char *)e->work + nums[k].gas - 1);
        gc_error ge;
        gc_error_clear(&ge);
        if (gc_gas_init_cold(g, g->cp_cold_J_per_kgK, g->k_cold, &ge) != GC_OK) {
            gc_report_error(e->rep, GC_ERR_INVALID, nums[k].row, nums[k].idx[0], "%s",
                            ge.message);
            return -1;
        }
    }
    return 0;
}

int gc_api_points_run_nums(gc_api_points *e, const gc_api_points_num *nums, const double *x,
                           int n, int want_problem)
{
    const gc_preset *p = e->p;
    json_decref(e->problem);
    e->problem = NULL;
    e->error_class = NULL;
    memcpy(e->work, e->input, p->input_size);
    gc_report_init(e->rep);
    if (nums_set(e, nums, x, n) != 0) {
        e->rep->input = 1;
        return nums_failed(e, want_problem, 0);
    }
    if (e->lean && p->lean)
        p->lean(e->work, e->lean);
    e->rep->skip_validity = (e->lean & GC_LEAN_NO_WARNINGS) != 0;
    if (gc_preset_evaluate(p, e->work, e->result, e->rep) != GC_OK)
        return nums_failed(e, want_problem, 0);
    const void *echo = gc_api_echo_input(p, e->work, e->result, e->echo);
    if (capture(e, echo)->nonfinite)
        return nums_failed(e, want_problem, 1);
    e->status = 200;
    e->want_units = 0;
    return 200;
}

int gc_api_points_clone(gc_api_points *dst, const gc_api_points *src)
{
    if (gc_api_points_init(dst, src->p, src->inputs, src->from_query, src->sys, NULL, 0) != 0)
        return -1;
    memcpy(dst->input, src->input, src->p->input_size);
    dst->shared_input = 1;
    dst->have_base = src->have_base;
    dst->lean = src->lean;
    dst->n_targets = src->n_targets;
    memcpy(dst->t, src->t, sizeof dst->t);
    dst->want_units = 0;
    return 0;
}

typedef struct keys_sink {
    char (*keys)[GC_JW_TOKEN_LEN];
    int n, max;
} keys_sink;

static void keys_of(void *ctx, int rel, int row, const char *key, gc_jw_kind kind, double num,
                    const char *text)
{
    keys_sink *k = ctx;
    (void)row;
    (void)num;
    (void)text;
    if (rel == 1 && key && kind == GC_JW_NUMBER && k->n < k->max)
        snprintf(k->keys[k->n++], GC_JW_TOKEN_LEN, "%s", key);
}

int gc_api_points_numbers_under(gc_api_points *e, const char *pointer,
                                char (*keys)[GC_JW_TOKEN_LEN], int max)
{
    gc_jw_target t;
    if (e->status != 200 || gc_jw_target_parse(&t, pointer) != 0)
        return 0;
    keys_sink k = { keys, 0, max };
    gc_jw w;
    gc_api_docopts o = { 0, GC_PATH_DEFAULT_POINTS, NULL, 0u, &e->ctx };
    gc_jw_init(&w, NULL, e->sys);
    gc_jw_targets(&w, &t, 1, 0);
    w.sink = keys_of;
    w.sink_ctx = &k;
    w.quiet = 1;
    const void *echo = gc_api_echo_input(e->p, e->work, e->result, e->echo);
    gc_api_write_document(&w, e->p, echo, e->result, e->rep, &o);
    return k.n;
}
