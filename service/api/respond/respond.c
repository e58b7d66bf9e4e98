/*
 * respond.c — one evaluation's answer (respond.h): the document in JSON, a
 * select= value, CSV tables gathered while the document is walked (the
 * writer's sink, nothing is parsed back), the SVG diagram; and the problem
 * of a failed evaluation.
 *
 * CSV (RFC 4180): CRLF line ends; a field holding the separator, a quote or
 * a line break quoted, quotes doubled; numbers as "%.10g"; a header row
 * "name [unit]" with the document's unit of each column (none for "-");
 * columns in the order of first appearance over the rows. Sections, in this
 * order and each present when the document has it, separated by one empty
 * line: states (a row per state), processes (a row per process), summary
 * (the scalar members of "summary": one header row, one value row); a
 * reduction without states has its one-row table in their place. table=
 * selects one section. With decimal=comma the separator is ';' and numbers
 * are written with a decimal comma (as a spreadsheet in such a locale reads
 * CSV); select= answers too.
 */
#include "api/respond/respond.h"
#include "api/request/fields.h"
#include "api/respond/localise.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

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
                    const char *field, const char *msg)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_errors_add(&errs, field, "%s", msg);
    gc_api_problem_errors(resp, status, cls, title, NULL, &errs);
    return 0;
}

static int not_finite(gc_api_response *resp, const gc_jw *w)
{
    char msg[GC_API_MESSAGE_LEN];
    fprintf(stderr, "gascycled: refused a non-finite result value at '%s' (%d value%s)\n",
            w->nonfinite_at, w->nonfinite, w->nonfinite == 1 ? "" : "s");
    snprintf(msg, sizeof msg, "the computation gave a value that is not a finite number (at "
             "'%s'); no result is returned for these inputs", w->nonfinite_at);
    return problem1(resp, 422, "not_finite", "Result not finite", "", msg);
}

static void doc_opts(gc_api_docopts *o, const gc_api_params *v)
{
    o->include_paths = v->include_paths;
    o->points = v->points;
    o->warn_prefix = NULL;
    o->include = v->include;
    o->ctx = v->ctx;
}

/* ---- json and select ------------------------------------------------------------------- */

static int respond_json(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                        const void *echo, const void *result, const gc_report *rep)
{
    gc_strbuf b = { .first_cap = 16384 };
    gc_jw w;
    gc_api_docopts o;
    doc_opts(&o, v);
    gc_jw_init(&w, &b, v->sys);
    gc_api_write_document(&w, p, echo, result, rep, &o);
    if (w.nonfinite) {
        free(b.s);
        return not_finite(resp, &w);
    }
    if (b.failed || !b.s) {
        free(b.s);
        return oom(resp);
    }
    return set_body(resp, 200, GC_API_CT_JSON, b.s, b.len);
}

static void scalar_text(gc_strbuf *b, const gc_jw_target *t, int comma)
{
    char num[40];
    switch (t->kind) {
    case GC_JW_STRING: gc_strbuf_puts(b, t->text); break;
    case GC_JW_INTEGER: snprintf(num, sizeof num, "%lld", (long long)t->num);
        gc_strbuf_puts(b, num);
        break;
    case GC_JW_NUMBER: gc_out_number_text(num, sizeof num, t->num, comma);
        gc_strbuf_puts(b, num);
        break;
    case GC_JW_BOOL: gc_strbuf_puts(b, t->num != 0.0 ? "true" : "false"); break;
    default: gc_strbuf_puts(b, "null"); break;
    }
}

static int respond_select(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                          const void *echo, const void *result, const gc_report *rep)
{
    gc_jw_target t;
    gc_strbuf b = { .first_cap = 1024 };
    gc_jw w;
    gc_api_docopts o;
    doc_opts(&o, v);
    gc_jw_init(&w, &b, v->sys);
    int ok = gc_jw_target_parse(&t, v->select) == 0;
    if (ok)
        gc_jw_targets(&w, &t, 1, 1);
    gc_api_write_document(&w, p, echo, result, rep, &o);
    if (w.nonfinite) {
        free(b.s);
        return not_finite(resp, &w);
    }
    if (!ok || !t.found) {
        char msg[GC_API_MESSAGE_LEN];
        free(b.s);
        snprintf(msg, sizeof msg, "no value at '%.150s' in the response", v->select);
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/select", msg);
    }
    if (t.kind == GC_JW_OBJECT || t.kind == GC_JW_ARRAY)
        return b.failed || !b.s ? (free(b.s), oom(resp)) : set_body(resp, 200, GC_API_CT_JSON,
                                                                     b.s, b.len);
    free(b.s);
    gc_strbuf s = { .first_cap = 64 };
    scalar_text(&s, &t, v->decimal_comma);
    if (s.failed || !s.s) {
        free(s.s);
        return oom(resp);
    }
    return set_body(resp, 200, GC_API_CT_TEXT, s.s, s.len);
}

/* ---- csv --------------------------------------------------------------------------------- */

#define CSV_MAX_COLS 96

/* A table gathered from one walk: its columns in order of first appearance,
 * its cells in the order written (a row's cells together, rows in order). */
typedef struct csv_cell {
    int row, col;
    size_t off, len;            /* the cell's text in `text` */
} csv_cell;

typedef struct csv_tab {
    int rel;                    /* 2: rows are array elements; 1: one object */
    int comma;                  /* decimal commas (and ';' between fields) */
    int n_cols;
    const char *col[CSV_MAX_COLS];
    int n_rows;
    size_t n_cells, cap_cells;
    csv_cell *cell;             /* heap, grows */
    gc_strbuf text;
    int overflow;               /* a column beyond CSV_MAX_COLS or no memory: refused */
} csv_tab;

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

static int csv_col(csv_tab *t, const char *key)
{
    for (int i = 0; i < t->n_cols; i++)
        if (strcmp(t->col[i], key) == 0)
            return i;
    if (t->n_cols >= CSV_MAX_COLS)
        return -1;
    t->col[t->n_cols] = key;
    return t->n_cols++;
}

static csv_cell *csv_new_cell(csv_tab *t)
{
    if (t->n_cells == t->cap_cells) {
        size_t cap = t->cap_cells ? 2 * t->cap_cells : 256;
        csv_cell *c = realloc(t->cell, cap * sizeof *c);
        if (!c)
            return NULL;
        t->cell = c;
        t->cap_cells = cap;
    }
    return &t->cell[t->n_cells++];
}

static void csv_sink(void *ctx, int rel, int row, const char *key, gc_jw_kind kind, double num,
                     const char *text)
{
    csv_tab *t = ctx;
    if (rel != t->rel || key == NULL || t->overflow)
        return;
    int c = csv_col(t, key);
    csv_cell *cell = c >= 0 ? csv_new_cell(t) : NULL;
    if (!cell) {
        t->overflow = 1;
        return;
    }
    size_t off = t->text.len;
    char buf[40];
    if (kind == GC_JW_STRING)
        gc_strbuf_puts(&t->text, text);
    else if (kind == GC_JW_NUMBER)
        gc_strbuf_puts(&t->text, (gc_out_number_text(buf, sizeof buf, num, t->comma), buf));
    else if (kind == GC_JW_INTEGER)
        gc_strbuf_puts(&t->text, (snprintf(buf, sizeof buf, "%.0f", num), buf));
    else if (kind == GC_JW_BOOL)
        gc_strbuf_puts(&t->text, num != 0.0 ? "true" : "false");
    cell->row = row;
    cell->col = c;
    cell->off = off;
    cell->len = t->text.len - off;
    if (row + 1 > t->n_rows)
        t->n_rows = row + 1;
}

static void csv_write(gc_strbuf *b, const csv_tab *t, const gc_jw *w)
{
    char sep = t->comma ? ';' : ',';
    for (int c = 0; c < t->n_cols; c++) {
        const char *unit = gc_jw_unit_of(w, t->col[c]);
        char head[160];
        if (c)
            gc_strbuf_put(b, &sep, 1);
        if (unit && strcmp(unit, "-") != 0)
            snprintf(head, sizeof head, "%s [%s]", t->col[c], unit);
        else
            snprintf(head, sizeof head, "%s", t->col[c]);
        csv_field(b, head, strlen(head), sep);
    }
    gc_strbuf_put(b, "\r\n", 2);
    /* the cells come row after row: each row's cells are found among its own */
    size_t k = 0;
    for (int r = 0; r < t->n_rows; r++) {
        size_t first = k;
        while (k < t->n_cells && t->cell[k].row == r)
            k++;
        for (int c = 0; c < t->n_cols; c++) {
            if (c)
                gc_strbuf_put(b, &sep, 1);
            for (size_t j = first; j < k; j++)
                if (t->cell[j].col == c && t->text.s)
                    csv_field(b, t->text.s + t->cell[j].off, t->cell[j].len, sep);
        }
        gc_strbuf_put(b, "\r\n", 2);
    }
}

/* Walks the document gathering the table at pointer; 1 when it was there. */
static int csv_gather(csv_tab *t, const char *pointer, int rel, const gc_preset *p,
                      const gc_api_params *v, const void *echo, const void *result,
                      const gc_report *rep, gc_jw *w)
{
    gc_jw_target tg;
    gc_api_docopts o;
    doc_opts(&o, v);
    memset(t, 0, sizeof *t);
    t->rel = rel;
    t->comma = v->decimal_comma;
    gc_jw_init(w, NULL, v->sys);
    gc_jw_target_parse(&tg, pointer);
    gc_jw_targets(w, &tg, 1, 0);
    w->sink = csv_sink;
    w->sink_ctx = t;
    gc_api_write_document(w, p, echo, result, rep, &o);
    return tg.found && (rel == 1 ? tg.kind == GC_JW_OBJECT : tg.kind == GC_JW_ARRAY);
}

/* The tables of a document without states or processes: its top output
 * rows flagged GC_OF_CSV_ROW (one row, rel 1) or GC_OF_CSV_TABLE (a list,
 * rel 2), from row `from` on; the row index, or -1 when no more. */
static int csv_section(const gc_preset *p, int from, int *rel)
{
    for (int r = from; r < p->n_outputs; r++) {
        const gc_output *o = &p->outputs[r];
        if (o->parent != -1)
            continue;
        if (o->flags & (GC_OF_CSV_ROW | GC_OF_CSV_TABLE)) {
            *rel = (o->flags & GC_OF_CSV_TABLE) ? 2 : 1;
            return r;
        }
    }
    return -1;
}

/* Gathers the table at pointer and appends it to b (a blank line before all
 * but the first: *any counts them). -1 on a non-finite value or a table
 * that cannot be gathered, else 0. */
static int csv_one(gc_strbuf *b, csv_tab *t, gc_jw *w, const char *pointer, int rel,
                   const gc_preset *p, const gc_api_params *v, const void *echo,
                   const void *result, const gc_report *rep, int *any)
{
    int found = csv_gather(t, pointer, rel, p, v, echo, result, rep, w);
    int rc = w->nonfinite || t->overflow ? -1 : 0;
    if (rc == 0 && found) {
        if ((*any)++)
            gc_strbuf_put(b, "\r\n", 2);
        csv_write(b, t, w);
    }
    free(t->text.s);
    free(t->cell);
    return rc;
}

static int csv_answer(gc_api_response *resp, const gc_api_params *v, const csv_tab *t,
                      const gc_jw *w, gc_strbuf *b, int any)
{
    if (w->nonfinite)
        return not_finite(resp, w);
    if (t->overflow)
        return oom(resp);
    static const char *const missing[] = { "", "this response has no states table",
                                           "this response has no processes table",
                                           "this response has no summary" };
    if (!any && v->table != GC_TABLE_ALL)
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/table",
                        missing[v->table]);
    if (!any)
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/format",
                        "this response has no table to give as CSV");
    if (b->failed || !b->s)
        return oom(resp);
    set_body(resp, 200, GC_API_CT_CSV, b->s, b->len);
    b->s = NULL;
    return 0;
}

static int respond_csv(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                       const void *echo, const void *result, const gc_report *rep)
{
    static const char *const tables[3] = { "/states", "/processes", "/summary" };
    static const int rels[3] = { 2, 2, 1 };
    csv_tab *t = malloc(sizeof *t);
    gc_jw *w = malloc(sizeof *w);
    gc_strbuf b = { .first_cap = 4096 };
    int rc = 0, any = 0;
    if (!t || !w) {
        free(t);
        free(w);
        return oom(resp);
    }
    memset(t, 0, sizeof *t);
    gc_jw_init(w, NULL, v->sys);
    /* a document without states or processes gives its own tables and rows
     * (in table order) instead of them and of the summary */
    int rel = 1, own_first = csv_section(p, 0, &rel);
    for (int k = 0; k < 3 && !rc; k++) {
        if (v->table != GC_TABLE_ALL && v->table != k + 1)
            continue;
        if (k == 2 && !any && v->table == GC_TABLE_ALL && own_first >= 0)
            continue;
        rc = csv_one(&b, t, w, tables[k], rels[k], p, v, echo, result, rep, &any);
    }
    int own = !rc && !any && v->table == GC_TABLE_ALL;
    char ptr[80];
    for (int r = own ? own_first : -1; !rc && r >= 0; r = csv_section(p, r + 1, &rel)) {
        snprintf(ptr, sizeof ptr, "/%s", p->outputs[r].name);
        rc = csv_one(&b, t, w, ptr, rel, p, v, echo, result, rep, &any);
    }
    csv_answer(resp, v, t, w, &b, any);
    free(b.s);
    free(t);
    free(w);
    return 0;
}

/* ---- svg ---------------------------------------------------------------------------------- */

/* 1 when name is one of the preset's own diagrams. */
static int own_diagram(const gc_preset *p, const char *name)
{
    if (!p->svg || !p->diagrams)
        return 0;
    if (!name)
        return !p->cycle;   /* a reduction's first diagram is its default */
    for (int i = 0; p->diagrams[i]; i++)
        if (strcasecmp(name, p->diagrams[i]) == 0)
            return 1;
    return 0;
}

/* "must be one of 'Ts', 'Pv', 'hs', 'x'" for the preset (static per thread). */
static const char *diagram_choices(const gc_preset *p)
{
    static _Thread_local char buf[256];
    size_t n = 0;
    n += (size_t)snprintf(buf, sizeof buf, "must be one of");
    const char *cyc[] = { "Ts", "Pv", "hs", NULL };
    int k = 0;
    for (int i = 0; p->cycle && cyc[i]; i++, k++)
        if (n < sizeof buf)
            n += (size_t)snprintf(buf + n, sizeof buf - n, "%s '%s'", k ? "," : "", cyc[i]);
    for (int i = 0; p->diagrams && p->diagrams[i]; i++, k++)
        if (n < sizeof buf)
            n += (size_t)snprintf(buf + n, sizeof buf - n, "%s '%s'", k ? "," : "",
                                  p->diagrams[i]);
    return buf;
}

static int respond_svg(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                       const void *echo, const void *result, const gc_report *rep)
{
    gc_jw w;
    gc_api_docopts o;
    doc_opts(&o, v);
    gc_jw_init(&w, NULL, v->sys);
    gc_api_write_document(&w, p, echo, result, rep, &o);
    if (w.nonfinite)
        return not_finite(resp, &w);
    gc_diagram_options d = v->diagram;
    d.units = v->sys;
    char *svg = NULL;
    size_t len = 0;
    gc_error err;
    gc_error_clear(&err);
    int own = own_diagram(p, v->diagram_name);
    int rc;
    if (own)
        rc = p->svg(echo, result, v->diagram_name, &d, &svg, &len, &err);
    else if (p->cycle && (!v->diagram_name || gc_diagram_kind_parse(v->diagram_name, &d.kind) == GC_OK))
        rc = gc_diagram_svg(p->cycle(result), &d, &svg, &len, &err);
    else
        return problem1(resp, 400, "bad_output", "Invalid output parameters", "/diagram",
                        diagram_choices(p));
    if (rc == GC_ERR_NOMEM)
        return oom(resp);
    if (rc == GC_OK && svg)
        return set_body(resp, 200, GC_API_CT_SVG, svg, len);
    free(svg);
    /* an option error is the request's; a drawing refused for the values is 422 */
    int opt = strcmp(err.field, "/diagram") == 0 || strcmp(err.field, "/points") == 0 ||
              strcmp(err.field, "/width") == 0 || strcmp(err.field, "/height") == 0 ||
              strcmp(err.field, "/scale") == 0;
    return problem1(resp, opt ? 400 : 422, opt ? "bad_output" : "not_drawable",
                    opt ? "Invalid output parameters" : "Diagram cannot be drawn",
                    err.field[0] ? err.field : "/diagram", err.message);
}

int gc_api_respond_preset(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                          const void *echo, const void *result, const gc_report *rep)
{
    if (v->format == GC_FMT_SVG && (p->cycle || p->svg))
        return respond_svg(resp, p, v, echo, result, rep);
    if (v->select)
        return respond_select(resp, p, v, echo, result, rep);
    if (v->format == GC_FMT_CSV)
        return respond_csv(resp, p, v, echo, result, rep);
    return respond_json(resp, p, v, echo, result, rep);
}

/* ---- problems -------------------------------------------------------------------------------- */

const char *gc_api_error_class(int code)
{
    switch (code) {
    case GC_ERR_CHECK: return "check_failed";
    case GC_ERR_INFEASIBLE:
    case GC_ERR_RICH: return "infeasible";
    case GC_ERR_RANGE: return "out_of_range";
    case GC_ERR_NOCONV: return "no_convergence";
    case GC_ERR_NOMEM: return "overloaded";
    default: return "validation";
    }
}

static const char *cycle_title(int code)
{
    switch (code) {
    case GC_ERR_CHECK: return "Built-in check failed";
    case GC_ERR_INFEASIBLE:
    case GC_ERR_RICH: return "Cycle cannot be run";
    case GC_ERR_RANGE: return "Outside the validity range";
    case GC_ERR_NOCONV: return "Iteration did not converge";
    default: return "Inputs cannot be evaluated";
    }
}

/* The message of e with its figures in the units the request wrote for its
 * field (or the input system's), the others in the answer's system. */
static void localised(const gc_preset *p, const gc_error *e, const char *field,
                      const gc_decode_ctx *ctx, gc_unit_system sys, char *msg, size_t n)
{
    snprintf(msg, n, "%s", e->message[0] ? e->message : gc_strerror(e->code));
    int q = -1;
    if (e->field_id > 0 && e->field_id < p->n_fields &&
        (p->fields[e->field_id].type == GC_FT_NUMBER ||
         p->fields[e->field_id].type == GC_FT_NUMBER_LIST))
        q = (int)p->fields[e->field_id].quantity;
    const char *written = gc_decode_ctx_unit(ctx, field);
    if (!written && q >= 0 && ctx && ctx->opts.input_sys == GC_UNITS_US)
        written = gc_units_label((gc_quantity)q, GC_UNITS_US);
    gc_api_localise(msg, n, q, written, sys);
}

void gc_api_report_errors(const gc_preset *p, const gc_report *rep, const char *prefix,
                          const gc_decode_ctx *ctx, gc_unit_system sys, gc_api_errors *errs)
{
    for (int i = 0; i < rep->n_errors; i++) {
        const gc_error *e = &rep->errors[i];
        char field[GC_API_FIELD_LEN + 16], msg[GC_API_MESSAGE_LEN];
        if (e->field_id > 0)
            gc_api_field_pointer(p, e->field_id, e->index, prefix, field, sizeof field);
        else
            snprintf(field, sizeof field, "%s%s", prefix ? prefix : "", e->field);
        localised(p, e, field, ctx, sys, msg, sizeof msg);
        gc_api_errors_add(errs, field, "%s", msg);
    }
}

int gc_api_problem_report(gc_api_response *resp, const gc_preset *p, const gc_report *rep,
                          const char *prefix, const gc_decode_ctx *ctx, gc_unit_system sys)
{
    int code = rep->n_errors ? rep->errors[0].code : GC_ERR_INVALID;
    if (code == GC_ERR_NOMEM)
        return oom(resp);
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_report_errors(p, rep, prefix, ctx, sys, &errs);
    int cycle = p->kind == GC_PRESET_CYCLE;
    if (rep->input)
        return gc_api_problem_errors(resp, 422, "validation",
                                     cycle ? "Invalid input" : "Invalid request fields", NULL,
                                     &errs), 0;
    const char *detail = code == GC_ERR_CHECK && cycle
        ? "A built-in consistency check of the result (energy closure, state closure, exergy "
          "balance or the P-v/T-s area balance) failed beyond its tolerance, so no result is "
          "returned for these inputs."
        : NULL;
    gc_api_problem_errors(resp, 422, gc_api_error_class(code),
                          cycle ? cycle_title(code) : "Inputs cannot be evaluated", detail, &errs);
    return 0;
}
