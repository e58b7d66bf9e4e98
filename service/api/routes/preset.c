/*
 * preset.c — the one handler of every preset route (GET|POST
 * /v1/cycles/<name>, /v1/measured/<segment>), read from the registry
 * (gascycle/preset.h): output parameters, the request decoded through the
 * preset's field table into its own input struct, the evaluation, and the
 * answer (respond.h). Also the 404 of /v1/cycles/<unknown>, listing the
 * registry's cycle presets.
 *
 * A preset that reads a text/csv body (gc_preset.csv_body) takes its other
 * inputs from the query string (decoded as a GET's), then the CSV text:
 * errors in it are 400 when it is not a readable table, 422 otherwise. A
 * preset with a large body and a cap on JSON values has the commas of a
 * JSON body counted before it is parsed: more than max_json_values is 413
 * (limit max_json_values), so a body cannot make the parser build a tree of
 * tens of millions of numbers. A JSON body's long series (a recording's
 * crank angles and cycles) are read by series_scan.c, not as a jansson value
 * per number; the answers and problems are the same.
 *
 * Memory: one allocation per request holds the input, its echo copy, the
 * result and the report (a cycle result is tens of KB: never on the stack).
 */
#include "api/handlers.h"
#include "api/request/fields.h"
#include "api/request/params.h"
#include "api/request/series_scan.h"
#include "api/respond/respond.h"
#include "gascycle/path.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* ---- finding the preset -------------------------------------------------------------- */

static const char *last_segment(const char *path)
{
    const char *s = strrchr(path ? path : "", '/');
    return s ? s + 1 : "";
}

const gc_preset *gc_api_preset_of(const gc_api_request *req)
{
    if (!req->n_path_params)
        return gc_preset_at_path(req->path);
    const gc_preset *p = gc_preset_find(req->path_params[0].value);
    return p && strcmp(gc_preset_route_base(p), "/v1/cycles/") == 0 ? p : NULL;
}

int gc_api_h_cycle_unknown(const gc_api_request *req, gc_api_response *resp)
{
    const char *name = req->n_path_params ? req->path_params[0].value : last_segment(req->path);
    const char *known[64];
    char list[400] = "";
    size_t n = gc_api_cycle_presets(known, 64);
    /* this answer has always named the general chain (custom) last */
    for (size_t i = 0; i + 1 < n; i++)
        if (strcmp(known[i], "custom") == 0) {
            memmove(&known[i], &known[i + 1], (n - i - 1) * sizeof known[0]);
            known[n - 1] = "custom";
            break;
        }
    for (size_t i = 0; i < n; i++) {
        size_t used = strlen(list);
        snprintf(list + used, sizeof list - used, "%s%s", i ? ", " : "", known[i]);
    }
    char detail[600];
    const char *s = gc_decode_suggest(name ? name : "", known, n);
    if (s)
        snprintf(detail, sizeof detail, "No cycle preset '%.60s'; did you mean '%s'? The "
                 "presets are: %s.", name ? name : "", s, list);
    else
        snprintf(detail, sizeof detail, "No cycle preset '%.60s'. The presets are: %s.",
                 name ? name : "", list);
    return gc_api_problem(resp, 404, "not_found", "Unknown cycle preset", detail, "/preset");
}

/* ---- one evaluation -------------------------------------------------------------------- */

#define ALIGN(n) (((n) + 15u) & ~(size_t)15u)

void *gc_api_eval_alloc(const gc_preset *p, void **input, void **echo, void **result,
                        gc_report **rep)
{
    size_t a = ALIGN(p->input_size), c = ALIGN(p->result_size);
    char *block = malloc(2 * a + c + sizeof(gc_report));
    if (!block)
        return NULL;
    *input = block;
    *echo = block + a;
    *result = block + 2 * a;
    *rep = (gc_report *)(void *)(block + 2 * a + c);
    gc_report_init(*rep);
    return block;
}

static unsigned accepted_params(const gc_preset *p)
{
    unsigned inc = p->includes ? GC_OUT_ACCEPT_INCLUDE : 0u;
    /* a cycle of no engine chain (the combined cycle) draws only its own
     * diagrams: no paths, no points per process */
    if (p->kind == GC_PRESET_CYCLE && p->cycle)
        return GC_OUT_ACCEPT_EVAL | GC_OUT_ACCEPT_INCLUDE | GC_OUT_ACCEPT_POINTS |
               GC_PARAMS_ACCEPT_DIAGRAM;
    if (p->svg)  /* a reduction or a cycle of no chain with diagrams of its own */
        return GC_OUT_ACCEPT_EVAL | GC_PARAMS_ACCEPT_DIAGRAM | inc;
    return GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV | GC_OUT_ACCEPT_SELECT | GC_OUT_ACCEPT_READ |
           inc;
}

/* The media type of ct is text/csv (parameters such as charset ignored). */
static int is_csv(const char *ct)
{
    if (!ct)
        return 0;
    while (*ct == ' ' || *ct == '\t')
        ct++;
    size_t n = strcspn(ct, "; \t");
    return n == 8 && strncasecmp(ct, "text/csv", 8) == 0;
}

/* The text/csv body's errors: 400 (not a readable table) or 422. */
static void csv_problem(gc_api_response *resp, const gc_preset *p, const gc_report *rep,
                        const gc_decode_ctx *ctx, gc_unit_system sys)
{
    if (rep->n_errors && rep->errors[0].code == GC_ERR_NOMEM) {
        gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return;
    }
    if (rep->input) {
        gc_api_problem_report(resp, p, rep, NULL, ctx, sys);
        return;
    }
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_report_errors(p, rep, NULL, ctx, sys, &errs);
    gc_api_problem_errors(resp, 400, "malformed", "Request not readable", "The text/csv body "
                          "is not a table of a crank-angle column and pressure columns with "
                          "their units in the header.", &errs);
}

/* Decodes the normalised request into input; 0, or -1 with resp holding the
 * problem. */
static int decode(const gc_preset *p, json_t *root, int from_query, void *input,
                  gc_decode_ctx *ctx, gc_api_response *resp)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_fields_decode(p, root, from_query, input, "", &errs, ctx);
    if (errs.n || errs.dropped) {
        gc_api_problem_errors(resp, 422, "validation", "Invalid input", NULL, &errs);
        return -1;
    }
    return 0;
}

/* The answer to the inputs in root (a normalised request) and, when csv is
 * not NULL, the csv_len bytes of a text/csv body. */
static int answer(const gc_preset *p, json_t *root, int from_query, gc_api_params *v,
                  const char *csv, size_t csv_len, gc_api_scan *scan, gc_api_response *resp)
{
    void *input, *echo, *result;
    gc_report *rep;
    void *block = gc_api_eval_alloc(p, &input, &echo, &result, &rep);
    gc_decode_ctx *ctx = malloc(sizeof *ctx);
    if (!block || !ctx) {
        free(block);
        free(ctx);
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    }
    gc_decode_ctx_init(ctx);
    ctx->opts.input_sys = v->input_sys;
    ctx->opts.decimal_comma = v->decimal_comma;
    ctx->scan = scan;
    v->ctx = ctx;
    gc_preset_input_init(p, input);
    int ok = decode(p, root, from_query, input, ctx, resp) == 0;
    if (ok && csv && p->csv_body(input, csv, csv_len, rep) != GC_OK) {
        csv_problem(resp, p, rep, ctx, v->sys);
        ok = 0;
    }
    if (ok) {
        if (gc_preset_evaluate(p, input, result, rep) != GC_OK) {
            gc_api_problem_report(resp, p, rep, NULL, ctx, v->sys);
        } else {
            gc_api_respond_preset(resp, p, v, gc_api_echo_input(p, input, result, echo), result,
                                  rep);
            if (resp->status == 200)
                gc_api_count_evaluations(resp, p->name, 1);
        }
    }
    v->ctx = NULL;
    gc_api_fields_release(p, input);
    free(block);
    free(ctx);
    return 0;
}

/* A text/csv body: the other inputs from the query string, as a GET's. */
static int answer_csv(const gc_preset *p, const gc_api_request *req, gc_api_params *v,
                      gc_api_response *resp)
{
    gc_api_request q = *req;
    q.method = GC_M_GET;
    q.body = NULL;
    q.body_len = 0;
    json_t *root = NULL;
    if (gc_decode_normalise_ex(&q, p->kind == GC_PRESET_CYCLE || p->svg, &root, resp) != 0)
        return 0;
    answer(p, root, 1, v, req->body ? req->body : "", req->body ? req->body_len : 0, NULL,
           resp);
    json_decref(root);
    return 0;
}

/* 1 when a JSON body holds more values than p allows (commas counted: every
 * value but the last of an array or object is followed by one). */
static int too_many_values(const gc_preset *p, const gc_api_request *req, gc_api_response *resp)
{
    if (!p->large_body || p->max_json_values <= 0 || !req->body)
        return 0;
    long commas = 0;
    for (const char *c = req->body, *e = req->body + req->body_len;
         (c = memchr(c, ',', (size_t)(e - c))) != NULL; c++)
        commas++;
    if (commas < p->max_json_values)
        return 0;
    char detail[256];
    snprintf(detail, sizeof detail, "The JSON body holds about %ld values; at most %ld are "
             "accepted on this route (a recording of that size fits a text/csv body).",
             commas + 1, p->max_json_values);
    gc_api_problem_limit(resp, 413, "too_large", "Content Too Large", detail, NULL,
                         "max_json_values", (unsigned long long)p->max_json_values);
    return 1;
}

int gc_api_h_preset(const gc_api_request *req, gc_api_response *resp)
{
    const gc_preset *p = gc_api_preset_of(req);
    if (p == NULL)
        return gc_api_h_cycle_unknown(req, resp);
    resp->preset = NULL;
    /* a heavy preset's request is one evaluation of the budget: a request that
     * waited past --max-request-ms for a worker, or meets a server that is
     * stopping, is not started (the HTTP layer answers the limit) */
    if (p->heavy && gc_api_budget_charge(req->budget, 1) != 0)
        return gc_api_problem(resp, 503, "budget_exceeded", NULL, "The request's budget is "
                              "spent.", NULL);
    gc_api_params v;
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (gc_api_params_parse(&v, req, accepted_params(p), p->includes, &errs) > 0)
        return gc_api_problem_errors(resp, 400, "bad_output", "Invalid output parameters",
                                     NULL, &errs), 0;
    if (req->method == GC_M_POST && p->csv_body && is_csv(req->content_type))
        return answer_csv(p, req, &v, resp);
    if (req->method == GC_M_POST && too_many_values(p, req, resp))
        return 0;
    json_t *root = NULL;
    gc_api_scan scan;
    if (gc_api_scan_normalise(p, req, p->kind == GC_PRESET_CYCLE || p->svg, &scan, &root,
                              resp) != 0)
        return 0;
    answer(p, root, req->method != GC_M_POST, &v, NULL, 0, &scan, resp);
    json_decref(root);
    gc_api_scan_free(&scan);
    return 0;
}

const gc_preset *gc_api_preset_at(const char *path)
{
    return gc_preset_at_path(path);
}

int gc_api_preset_answer(const gc_preset *p, json_t *fields, int sys, int input_sys,
                         gc_api_response *resp)
{
    gc_api_params v;
    memset(&v, 0, sizeof v);
    v.sys = (gc_unit_system)sys;
    v.input_sys = (gc_unit_system)input_sys;
    v.format = GC_FMT_JSON;
    v.table = GC_TABLE_ALL;
    v.points = GC_PATH_DEFAULT_POINTS;
    return answer(p, fields, 0, &v, NULL, 0, NULL, resp);
}
