/*
 * targets.c — GET|POST /v1/targets: "can this requirement be met at all?".
 * One free input of a cycle preset between bounds, one output (an RFC 6901
 * pointer into the cycle result) and a goal: equal to a value, at least or
 * at most a value, or the largest or smallest achievable. Solved with the
 * core's bracket scan and Brent's methods (gascycle/solve.h) on the
 * preset's evaluation in process (point.h: the base inputs decoded once, the
 * free input set by its place in the input struct, the output read through
 * the response writer without writing the document), so every default,
 * validation and warning of the route applies. The search's evaluations
 * leave out what the output cannot read (preset.h, GC_LEAN_*: the ideal
 * counterpart unless the output lies under /bounds, the area check unless
 * under /checks, the real-gas and dissociation scans unless under
 * /warnings: only the solution's warnings are answered); the result at the
 * solution is evaluated in full.
 *
 * Request: {"cycle": "brayton", "inputs": {base inputs},
 *           "free": {"input": "pressure_ratio", "lower": 2, "upper": 60,
 *                    "spacing": "linear"|"log", "scan_points": 25},
 *           "target": {"output": "/summary/thermal_efficiency",
 *                      "goal": "equal"|"at_least"|"at_most"|"maximize"|"minimize",
 *                      "value": 0.40}}
 * lower/upper are numbers in the input's default unit or strings with a
 * unit (both the same); target.value is a number in the output's unit of
 * the chosen units=si|us, or a string with a unit.
 *
 * Answer: "met", an "answer" sentence, "solution" (the free input and the
 * output there: equal: the lowest root; at_least/at_most: the lowest input
 * meeting it; maximize/minimize: the optimum; not met: where the best
 * achievable value is, and "where": interior, lower_bound, upper_bound or
 * feasibility_edge), "roots" or "ranges", "best" (the extreme that matters),
 * "search" (evaluations, points without a result, the first such problem)
 * and "result": the full cycle result at the solution.
 *
 * Units: the free input in the output system is read from the route's echo
 * (the solver works on the numbers as written, so a bound given in "bar"
 * keeps the search in bar); the output is read in the chosen system.
 */
#include "api/composites/point.h"
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"
#include "gascycle/solve.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define UNIT_LEN 48

static const char *const top_keys[] = { "cycle", "inputs", "free", "target", NULL };
static const char *const free_keys[] = { "input", "lower", "upper", "spacing", "scan_points",
                                         NULL };
static const char *const target_keys[] = { "output", "goal", "value", NULL };
static const char *const goals[] = { "equal", "at_least", "at_most", "maximize", "minimize",
                                     NULL };
static const char *const where_names[] = { "interior", "lower_bound", "upper_bound",
                                           "feasibility_edge" };

typedef struct target_ctx {
    const char *path;          /* the preset's route */
    json_t *inputs;            /* base inputs (borrowed) */
    char pointer[GC_API_FIELD_LEN];  /* free input */
    char unit[UNIT_LEN];       /* unit text of the bounds ("" = default unit) */
    char output[GC_API_FIELD_LEN];   /* output pointer */
    int as_query;
    gc_api_budget *budget;     /* the request's cost budget (api.h), charged per evaluation */
    gc_unit_system sys;
    gc_api_points ev;          /* the evaluations (point.h) */
    int t_out, t_echo;         /* targets: the output, the free input's echo */
    int n_ok;                  /* evaluations with a result */
    int have_first;            /* the first result's figures below were read */
    gc_jw_kind first_kind;     /* the output's kind in the first result (0: absent) */
    char out_label_buf[UNIT_LEN], in_label_buf[UNIT_LEN];
    const char *out_label;     /* the output's unit in the first result, or NULL */
    const char *in_label;      /* the free input's unit in the first result, or NULL */
    json_t *first_fail;        /* first failure: {x, status, error_class, detail, errors} */
    int bad_output;            /* 1: the output pointer names no number */
    int oom;
} target_ctx;

/* One evaluation at x; its status (200: the result is in c->ev). */
static int evaluate(target_ctx *c, double x)
{
    json_t *v;
    if (gc_api_budget_charge(c->budget, 1) != 0) {   /* budget hook: the HTTP layer answers */
        c->oom = 1;
        return 503;
    }
    if (c->as_query) {
        char buf[UNIT_LEN + 40];
        if (c->unit[0])
            snprintf(buf, sizeof buf, "%.17g %s", x, c->unit);
        else
            snprintf(buf, sizeof buf, "%.17g", x);
        v = json_string(buf);
    } else {
        v = gc_api_value_make(x, c->unit);
    }
    int st = v ? gc_api_points_run(&c->ev, &v) : -1;
    json_decref(v);
    if (st < 0) {
        c->oom = 1;
        return 503;
    }
    return st;
}

static const char *keep_label(const char *label, char *buf)
{
    if (!label)
        return NULL;
    snprintf(buf, UNIT_LEN, "%s", label);
    return buf;
}

/* The first failure, as the answer's search.first_without_result. */
static void note_failure(target_ctx *c, double x, int status)
{
    gc_api_points *e = &c->ev;
    gc_api_inner in = { .status = status, .body = e->problem, .error_class = e->error_class };
    c->first_fail = json_pack("{s:f, s:i, s:s}", "input", x, "status", status,
                              "error_class", in.error_class ? in.error_class : "error");
    const char *detail = json_string_value(json_object_get(in.body, "detail"));
    json_object_set_new(c->first_fail, "detail", json_string(detail ? detail
                        : "the point could not be evaluated"));
    json_t *list = json_array();
    gc_api_inner_problem_errors(&in, "/inputs", list);
    json_object_set_new(c->first_fail, "errors", list);
}

/* gc_solve_fn: the output at free input x. */
static int solve_fn(void *vctx, double x, double *y)
{
    target_ctx *c = vctx;
    int status = evaluate(c, x);
    if (c->oom)
        return GC_ERR_NOMEM;
    if (status != 200) {
        if (!c->first_fail)
            note_failure(c, x, status);
        return GC_ERR_INFEASIBLE;
    }
    json_t *v = gc_api_points_value(&c->ev, c->t_out);
    if (!c->have_first) {
        c->have_first = 1;
        c->first_kind = !v ? GC_JW_NONE : json_is_object(v) ? GC_JW_OBJECT
                        : json_is_array(v) ? GC_JW_ARRAY : json_is_string(v) ? GC_JW_STRING
                        : json_is_null(v) ? GC_JW_NULL : json_is_boolean(v) ? GC_JW_BOOL
                                                                             : GC_JW_NUMBER;
        c->out_label = keep_label(gc_api_points_unit(&c->ev, gc_api_pointer_last(c->output)),
                                  c->out_label_buf);
        c->in_label = keep_label(gc_api_points_unit(&c->ev, gc_api_pointer_last(c->pointer)),
                                 c->in_label_buf);
    }
    if (!json_is_number(v)) {
        json_decref(v);
        c->bad_output = 1;
        return GC_ERR_INVALID;   /* aborts the solve */
    }
    *y = json_number_value(v);
    json_decref(v);
    c->n_ok++;
    return GC_OK;
}

/* x (as written) in the output system, through the echo of a result at x
 * (echo may be NULL) or the quantity named by the route's unit label. */
static double input_out(const target_ctx *c, json_t *echo, int quantity, double x)
{
    if (json_is_number(echo))
        return json_number_value(echo);
    if (quantity < 0)
        return x;
    double si;
    if (c->unit[0]) {
        if (gc_units_to_si((gc_quantity)quantity, x, c->unit, &si, NULL) != GC_OK)
            return x;
    } else {
        si = gc_units_to_si_sys((gc_quantity)quantity, c->ev.ctx.opts.input_sys, x);
    }
    double v = gc_units_from_si((gc_quantity)quantity, c->sys, si);
    return isfinite(v) ? v : x;
}

static void fmt_num(char *buf, size_t n, double v, const char *unit)
{
    if (unit && strcmp(unit, "-") != 0)
        snprintf(buf, n, "%.6g %s", v, unit);
    else
        snprintf(buf, n, "%.6g", v);
}

/* Everything of one request (on the heap: the evaluator holds a writer). */
typedef struct targets {
    target_ctx c;
    json_t *root;
    json_t *fr;                 /* /free (borrowed) */
    double lo, hi;
    gc_solve_options opt;
    int goal;
    json_t *tvalue;             /* /target/value (borrowed) or NULL */
    double target;              /* the goal's value in the output system */
    int probe_rc;               /* the probe at the lower bound */
    gc_solve_result res;
    int evals;
    /* the result at the solution */
    char *result;               /* its document as JSON text, or NULL */
    size_t result_len;
    json_t *result_warnings;    /* its warnings, or NULL */
    json_t *echo;               /* the free input's echo there, or NULL */
    int q_in;                   /* the free input's quantity, or -1 */
    const char *in_label;
    char in_label_buf[UNIT_LEN];
    const char *out_label;      /* the output's unit as the probe found it, or NULL */
} targets;

static void targets_free(targets *t)
{
    json_decref(t->c.first_fail);
    free(t->result);
    json_decref(t->result_warnings);
    json_decref(t->echo);
    json_decref(t->root);
    gc_api_points_free(&t->c.ev);
    free(t);
}

static int fail422(targets *t, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    targets_free(t);
    gc_out_free(o);
    gc_api_problem_errors(resp, 422, "validation", "Invalid target", NULL, errs);
    return 0;
}

static int oom503(targets *t, gc_out *o, gc_api_response *resp)
{
    targets_free(t);
    gc_out_free(o);
    return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.", NULL);
}

/* /free/lower and /free/upper; 1 when both are numbers in one unit. */
static int decode_bounds(targets *t, gc_api_errors *errs)
{
    char ul[UNIT_LEN] = "", uh[UNIT_LEN] = "";
    json_t *l = json_object_get(t->fr, "lower"), *h = json_object_get(t->fr, "upper");
    int ok_l = 0, ok_h = 0;
    if (!l)
        gc_api_errors_add(errs, "/free/lower", "is required");
    else if (gc_api_value_split(l, &t->lo, ul, sizeof ul) != 0)
        gc_api_errors_add(errs, "/free/lower", "must be a finite number or a string with a "
                          "unit such as '5 bar'");
    else
        ok_l = 1;
    if (!h)
        gc_api_errors_add(errs, "/free/upper", "is required");
    else if (gc_api_value_split(h, &t->hi, uh, sizeof uh) != 0)
        gc_api_errors_add(errs, "/free/upper", "must be a finite number or a string with a "
                          "unit such as '30 bar'");
    else
        ok_h = 1;
    if (ok_l && ok_h && strcmp(ul, uh) != 0)
        gc_api_errors_add(errs, "/free/upper", "must be in the same unit as lower ('%s', got "
                          "'%s')", ul[0] ? ul : "default unit", uh[0] ? uh : "default unit");
    else if (ok_l && ok_h && !(t->hi > t->lo))
        gc_api_errors_add(errs, "/free/upper", "must be greater than lower");
    snprintf(t->c.unit, sizeof t->c.unit, "%s", ul);
    return ok_l;
}

static void decode_free(targets *t, gc_api_errors *errs)
{
    gc_solve_options_init(&t->opt, 0.0, 1.0);
    if (!json_is_object(t->fr)) {
        gc_api_errors_add(errs, "/free", "is required: {input, lower, upper}, the input the "
                          "solver may change and its bounds");
        return;
    }
    gc_api_unknown_keys(t->fr, "/free", free_keys, errs);
    json_t *in = json_object_get(t->fr, "input");
    if (!json_is_string(in) || gc_api_input_pointer(json_string_value(in), t->c.pointer,
                                                    sizeof t->c.pointer) != 0)
        gc_api_errors_add(errs, "/free/input", "is required: the name of an input of the "
                          "cycle (e.g. 'pressure_ratio') or its JSON pointer");
    int ok_l = decode_bounds(t, errs);
    gc_solve_options_init(&t->opt, t->lo, t->hi);
    json_t *sp = json_object_get(t->fr, "spacing");
    if (sp) {
        const char *s = json_string_value(sp);
        if (s && strcmp(s, "log") == 0)
            t->opt.log_spacing = 1;
        else if (!s || strcmp(s, "linear") != 0)
            gc_api_errors_add(errs, "/free/spacing", "must be 'linear' or 'log'");
    }
    if (t->opt.log_spacing && ok_l && !(t->lo > 0.0))
        gc_api_errors_add(errs, "/free/spacing", "log spacing needs a lower bound greater "
                          "than 0");
    json_t *sc = json_object_get(t->fr, "scan_points");
    if (sc) {
        long n = -1;
        if (json_is_integer(sc))
            n = (long)json_integer_value(sc);
        else if (json_is_string(sc)) {
            char *end = NULL;
            n = strtol(json_string_value(sc), &end, 10);
            if (!end || *end)
                n = -1;
        }
        if (n < 3 || n > 200)
            gc_api_errors_add(errs, "/free/scan_points", "must be a whole number from 3 to 200");
        else
            t->opt.scan_points = (int)n;
    }
}

static void decode_target(targets *t, json_t *tg, gc_api_errors *errs)
{
    t->goal = -1;
    if (!json_is_object(tg)) {
        gc_api_errors_add(errs, "/target", "is required: {output, goal, value}");
        return;
    }
    gc_api_unknown_keys(tg, "/target", target_keys, errs);
    const char *s = json_string_value(json_object_get(tg, "output"));
    if (!s || s[0] != '/' || strlen(s) >= sizeof t->c.output || strstr(s, "//"))
        gc_api_errors_add(errs, "/target/output", "is required: a JSON pointer into the cycle "
                          "result, such as '/summary/thermal_efficiency'");
    else
        snprintf(t->c.output, sizeof t->c.output, "%s", s);
    json_t *g = json_object_get(tg, "goal");
    const char *gs = g ? json_string_value(g) : "equal";
    for (int i = 0; gs && goals[i]; i++)
        if (strcmp(gs, goals[i]) == 0)
            t->goal = i;
    if (t->goal < 0) {
        const char *sug = gs ? gc_decode_suggest(gs, goals, 5) : NULL;
        if (sug)
            gc_api_errors_add(errs, "/target/goal", "unknown goal '%.40s'; did you mean '%s'?",
                              gs, sug);
        else
            gc_api_errors_add(errs, "/target/goal", "must be one of 'equal', 'at_least', "
                              "'at_most', 'maximize', 'minimize'");
    }
    t->tvalue = json_object_get(tg, "value");
    if (t->goal >= 0 && t->goal <= GC_SOLVE_AT_MOST && !t->tvalue)
        gc_api_errors_add(errs, "/target/value", "is required for the goal '%s'", gs);
    if (t->goal >= GC_SOLVE_MAXIMIZE && t->tvalue)
        gc_api_errors_add(errs, "/target/value", "does not apply to the goal '%s'", gs);
    double tv;
    char tu[UNIT_LEN];
    if (t->tvalue && gc_api_value_split(t->tvalue, &tv, tu, sizeof tu) != 0)
        gc_api_errors_add(errs, "/target/value", "must be a finite number or a string with a "
                          "unit such as '400 kJ/kg'");
}

/* The output named something other than a number in the first result. */
static void bad_output_error(targets *t, gc_api_errors *errs)
{
    static const char *const words[] = { [GC_JW_OBJECT] = "an object", [GC_JW_ARRAY] = "an array",
                                         [GC_JW_STRING] = "a string", [GC_JW_NULL] = "null",
                                         [GC_JW_BOOL] = "a boolean", [GC_JW_NUMBER] = "a number" };
    if (t->c.first_kind == GC_JW_NONE)
        gc_api_errors_add(errs, "/target/output", "no value at '%s' in the %s result (e.g. "
                          "/summary/thermal_efficiency, /summary/net_work)", t->c.output,
                          json_string_value(json_object_get(t->root, "cycle")));
    else
        gc_api_errors_add(errs, "/target/output", "'%s' names %s, not a number", t->c.output,
                          words[t->c.first_kind]);
}

/* target.value with a unit: converted to the output's unit system. */
static void target_value(targets *t, gc_out *o, gc_api_errors *errs)
{
    char tu[UNIT_LEN];
    if (!t->tvalue)
        return;
    gc_api_value_split(t->tvalue, &t->target, tu, sizeof tu);
    if (!tu[0])
        return;
    int q = gc_api_label_quantity(t->out_label, o->sys);
    double si;
    gc_error uerr;
    if (!t->c.have_first)
        gc_api_errors_add(errs, "/target/value", "give the target as a plain number in the "
                          "output's unit: with no result at the lower bound its quantity is "
                          "not known");
    else if (q < 0)
        gc_api_errors_add(errs, "/target/value", "the output has no unit ('%s'); give a plain "
                          "number", t->out_label ? t->out_label : "-");
    else if (gc_units_to_si((gc_quantity)q, t->target, tu, &si, &uerr) != GC_OK)
        gc_api_errors_add(errs, "/target/value", "%s", uerr.message);
    else
        t->target = gc_units_from_si((gc_quantity)q, o->sys, si);
}

/* No point of the range has a result: the inputs are at fault. */
static int infeasible(targets *t, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    const char *cls = json_string_value(json_object_get(t->c.first_fail, "error_class"));
    json_t *list = json_object_get(t->c.first_fail, "errors");
    size_t i;
    json_t *e;
    json_array_foreach(list, i, e)
        gc_api_errors_add(errs, json_string_value(json_object_get(e, "field")), "%s",
                          json_string_value(json_object_get(e, "message")));
    if (errs->n == 0) {
        char in_name[GC_API_FIELD_LEN];
        gc_api_pointer_name(t->c.pointer, in_name, sizeof in_name);
        gc_api_errors_add(errs, "/free", "no value of %s between the bounds can be evaluated",
                          in_name);
    }
    int validation = !cls || strcmp(cls, "validation") == 0;
    targets_free(t);
    gc_out_free(o);
    gc_api_problem_errors(resp, 422, validation ? "validation" : "infeasible",
                          validation ? "Invalid target" : "Target not evaluable",
                          validation ? NULL
                                     : "No value of the free input between the bounds gives a "
                                       "cycle that can be evaluated.", errs);
    return 0;
}

/* The full evaluation at the solution: its document, echo and units. */
static void solution_result(targets *t)
{
    target_ctx *c = &t->c;
    c->ev.lean = 0;
    c->ev.want_units = 1;
    int st = evaluate(c, t->res.x);
    t->evals++;
    const char *label = c->in_label;
    if (st == 200) {
        t->result = gc_api_points_document_text(&c->ev, &t->result_len);
        t->result_warnings = gc_api_points_warnings(&c->ev);
        t->echo = gc_api_points_value(&c->ev, c->t_echo);
        label = keep_label(gc_api_points_unit(&c->ev, gc_api_pointer_last(c->pointer)),
                           t->in_label_buf);
    }
    t->q_in = gc_api_label_quantity(label, c->sys);
    t->in_label = label ? label : c->unit[0] ? c->unit : NULL;
}

/* The answer sentence. */
static void answer_text(targets *t, char *answer, size_t n)
{
    const target_ctx *c = &t->c;
    const gc_solve_result *res = &t->res;
    char xs[96], ys[96], ts[96], lo_s[96], hi_s[96];
    char out_name[GC_API_FIELD_LEN], in_name[GC_API_FIELD_LEN];
    snprintf(out_name, sizeof out_name, "%s", gc_api_pointer_last(c->output));
    gc_api_pointer_name(c->pointer, in_name, sizeof in_name);
    fmt_num(xs, sizeof xs, input_out(c, t->echo, t->q_in, res->x), t->in_label);
    fmt_num(ys, sizeof ys, res->y, t->out_label);
    fmt_num(ts, sizeof ts, t->target, t->out_label);
    fmt_num(lo_s, sizeof lo_s, input_out(c, NULL, t->q_in, t->lo), t->in_label);
    fmt_num(hi_s, sizeof hi_s, input_out(c, NULL, t->q_in, t->hi), t->in_label);
    static const char *const where_words[] = { "", " (the lower bound)", " (the upper bound)",
                                               " (the edge of the inputs this cycle can "
                                               "evaluate)" };
    int goal = t->goal;
    const char *op = goal == GC_SOLVE_EQUAL ? "=" : goal == GC_SOLVE_AT_LEAST ? ">=" : "<=";
    if (goal >= GC_SOLVE_MAXIMIZE) {
        snprintf(answer, n, "The %s %s of this configuration for %s from %s to %s is %s, at "
                 "%s = %s%s.", goal == GC_SOLVE_MAXIMIZE ? "highest" : "lowest", out_name,
                 in_name, lo_s, hi_s, ys, in_name, xs, where_words[res->where]);
    } else if (res->met) {
        if (goal == GC_SOLVE_EQUAL)
            snprintf(answer, n, "%s %s %s is met at %s = %s%s.", out_name, op, ts, in_name, xs,
                     res->n_roots > 1 ? " (the lowest of several solutions: see roots)" : "");
        else
            snprintf(answer, n, "%s %s %s is met from %s = %s (the lowest value meeting it; "
                     "see ranges).", out_name, op, ts, in_name, xs);
    } else {
        int above = goal == GC_SOLVE_AT_LEAST || (goal == GC_SOLVE_EQUAL && res->y < t->target);
        snprintf(answer, n, "%s %s %s cannot be met for %s from %s to %s: the %s %s of this "
                 "configuration is %s, at %s = %s%s.", out_name, op, ts, in_name, lo_s, hi_s,
                 above ? "highest" : "lowest", out_name, ys, in_name, xs,
                 where_words[res->where]);
    }
}

/* roots (equal) or ranges (at_least, at_most), and the extremes. */
static void solutions(targets *t, gc_out *o, json_t *doc)
{
    const gc_solve_result *res = &t->res;
    const target_ctx *c = &t->c;
    if (t->goal == GC_SOLVE_EQUAL) {
        json_t *roots = json_array();
        for (int i = 0; i < res->n_roots; i++) {
            json_t *r = json_object();
            gc_out_num(o, r, "input", input_out(c, NULL, t->q_in, res->roots[i]));
            gc_out_num(o, r, "output", res->root_y[i]);
            json_array_append_new(roots, r);
        }
        json_object_set_new(doc, "roots", roots);
    } else if (t->goal <= GC_SOLVE_AT_MOST) {
        json_t *ranges = json_array();
        for (int i = 0; i < res->n_ranges; i++) {
            json_t *r = json_object();
            gc_out_num(o, r, "from", input_out(c, NULL, t->q_in, res->ranges[i][0]));
            gc_out_num(o, r, "to", input_out(c, NULL, t->q_in, res->ranges[i][1]));
            json_array_append_new(ranges, r);
        }
        json_object_set_new(doc, "ranges", ranges);
    }
    json_t *ext = json_object();
    const gc_solve_extreme *exs[2] = { &res->max, &res->min };
    const char *exn[2] = { "max", "min" };
    for (int i = 0; i < 2; i++) {
        if (!exs[i]->found)
            continue;
        json_t *e = json_object();
        gc_out_num(o, e, "input", input_out(c, NULL, t->q_in, exs[i]->x));
        gc_out_num(o, e, "output", exs[i]->y);
        json_object_set_new(e, "where", json_string(where_names[exs[i]->where]));
        json_object_set_new(ext, exn[i], e);
    }
    json_object_set_new(doc, "extremes", ext);
}

static json_t *search_of(targets *t)
{
    const gc_solve_result *res = &t->res;
    json_t *search = json_pack("{s:i, s:i, s:i, s:i, s:b, s:b}", "evaluations", t->evals,
                               "without_result", res->n_infeasible + (t->probe_rc != GC_OK),
                               "scan_points", res->n_scan, "scan_points_with_result",
                               res->n_scan_feasible, "budget_exhausted", res->budget_exhausted,
                               "truncated", res->ranges_truncated);
    if (t->c.first_fail) {
        json_t *ff = json_deep_copy(t->c.first_fail);
        json_t *xv = json_object_get(ff, "input");
        if (json_is_number(xv))
            json_object_set_new(ff, "input", json_real(input_out(&t->c, NULL, t->q_in,
                                                                  json_number_value(xv))));
        json_object_set_new(search, "first_without_result", ff);
    }
    return search;
}

/* Units, the echo of the request, warnings. */
static void echo_and_warnings(targets *t, gc_out *o, const char *answer)
{
    const gc_solve_result *res = &t->res;
    if (t->in_label)
        json_object_set_new(o->units, "input", json_string(t->in_label));
    if (t->out_label)
        json_object_set_new(o->units, "output", json_string(t->out_label));
    json_object_set(o->inputs, "cycle", json_object_get(t->root, "cycle"));
    json_object_set_new(o->inputs, "inputs", t->c.inputs ? json_incref(t->c.inputs)
                                                         : json_object());
    json_t *fe = json_pack("{s:s, s:O, s:O, s:s, s:i}", "input", t->c.pointer,
                           "lower", json_object_get(t->fr, "lower"),
                           "upper", json_object_get(t->fr, "upper"),
                           "spacing", t->opt.log_spacing ? "log" : "linear",
                           "scan_points", t->opt.scan_points);
    json_object_set_new(o->inputs, "free", fe);
    json_t *te = json_pack("{s:s, s:s}", "output", t->c.output, "goal", goals[t->goal]);
    if (t->goal <= GC_SOLVE_AT_MOST)
        gc_out_num(o, te, "value", t->target);
    json_object_set_new(o->inputs, "target", te);
    if (!res->met)
        gc_out_warn(o, "target_not_met", "/target", "%s", answer);
    if (res->where == GC_SOLVE_AT_LOWER || res->where == GC_SOLVE_AT_UPPER)
        gc_out_warn(o, "at_bound", "/free", "the answer lies at a bound of the free input; "
                    "the best value may lie beyond it");
    if (res->budget_exhausted)
        gc_out_warn(o, "budget_exhausted", "/free", "the evaluation budget ran out before the "
                    "refinement converged; the answer is the best found");
    if (res->ranges_truncated)
        gc_out_warn(o, "many_solutions", "/target", "more solutions exist than are listed");
}

static int respond(targets *t, gc_out *o, gc_api_response *resp)
{
    json_t *doc = json_object();
    json_object_set(doc, "cycle", json_object_get(t->root, "cycle"));
    json_object_set_new(doc, "met", json_boolean(t->res.met));
    json_t *sol = json_object();
    gc_out_num(o, sol, "input", input_out(&t->c, t->echo, t->q_in, t->res.x));
    gc_out_num(o, sol, "output", t->res.y);
    json_object_set_new(sol, "where", json_string(where_names[t->res.where]));
    json_object_set_new(doc, "solution", sol);
    char answer[2048];
    answer_text(t, answer, sizeof answer);
    json_object_set_new(doc, "answer", json_string(answer));
    solutions(t, o, doc);
    json_object_set_new(doc, "search", search_of(t));
    if (t->result) {
        json_t *seen = json_object();
        json_t *holder = t->result_warnings ? json_pack("{s:O}", "warnings", t->result_warnings)
                                            : json_pack("{s:[]}", "warnings");
        gc_api_inner_warnings(o, holder, seen);
        json_decref(holder);
        json_decref(seen);
        (void)gc_out_raw_member(o, doc, "result", t->result, t->result_len);
        t->result = NULL;
    }
    echo_and_warnings(t, o, answer);
    targets_free(t);
    return gc_out_respond(o, doc, GC_OUT_EVALUATION, resp);
}

/* The probe at the lower bound (the output's unit and kind), the target
 * value, the solve. 0 to answer, else resp is filled. */
static int solve(targets *t, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    target_ctx *c = &t->c;
    double probe_y = 0.0;
    t->probe_rc = solve_fn(c, t->lo, &probe_y);
    if (t->probe_rc == GC_ERR_NOMEM)
        return oom503(t, o, resp), 1;
    if (c->bad_output) {
        bad_output_error(t, errs);
        return fail422(t, o, errs, resp), 1;
    }
    t->out_label = c->have_first ? (c->out_label ? c->out_label : "-") : NULL;
    target_value(t, o, errs);
    if (errs->n)
        return fail422(t, o, errs, resp), 1;
    gc_error serr;
    gc_error_clear(&serr);
    int src = gc_solve_target(solve_fn, c, &t->opt, (gc_solve_goal)t->goal, t->target, &t->res,
                              &serr);
    t->evals = t->res.n_evals + 1;   /* with the probe */
    if (c->oom)
        return oom503(t, o, resp), 1;
    if (c->bad_output) {
        gc_api_errors_add(errs, "/target/output", "'%s' is not a number in every result of "
                          "this range", c->output);
        return fail422(t, o, errs, resp), 1;
    }
    if (src == GC_ERR_INFEASIBLE)
        return infeasible(t, o, errs, resp), 1;
    if (src != GC_OK) {
        gc_api_errors_add(errs, serr.field[0] ? serr.field : "/free", "%s", serr.message);
        return fail422(t, o, errs, resp), 1;
    }
    return 0;
}

int gc_api_h_targets(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    json_t *root = NULL;
    int begin_rc;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_SELECT |
                               GC_OUT_ACCEPT_INPUT_UNITS, &o, &errs,
                               &root, resp, &begin_rc) != 0)
        return begin_rc;
    targets *t = calloc(1, sizeof *t);
    if (!t) {
        json_decref(root);
        gc_out_free(&o);
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    }
    target_ctx *c = &t->c;
    t->root = root;
    c->as_query = req->method != GC_M_POST;
    c->budget = req->budget;
    c->sys = o.sys;
    char path[96] = "";
    gc_api_unknown_keys(root, "", top_keys, &errs);
    gc_api_cycle_path(json_object_get(root, "cycle"), &errs, path, sizeof path);
    c->path = path;
    c->inputs = json_object_get(root, "inputs");
    if (c->inputs && !json_is_object(c->inputs))
        gc_api_errors_add(&errs, "/inputs", "must be an object with the cycle's input fields");
    t->fr = json_object_get(root, "free");
    decode_free(t, &errs);
    decode_target(t, json_object_get(root, "target"), &errs);
    if (errs.n)
        return fail422(t, &o, &errs, resp);
    const char *fp[1] = { c->pointer };
    if (gc_api_points_init(&c->ev, gc_api_cycle_preset(path), c->inputs, c->as_query,
                           o.sys, fp, 1) != 0)
        return oom503(t, &o, resp);
    c->ev.tally = resp;
    c->ev.ctx.opts.input_sys = o.input_sys;
    c->t_out = gc_api_points_target(&c->ev, c->output);
    char echo_ptr[GC_API_FIELD_LEN + 8];
    snprintf(echo_ptr, sizeof echo_ptr, "/inputs%.120s", c->pointer);
    c->t_echo = gc_api_points_target(&c->ev, echo_ptr);
    c->ev.lean = gc_api_points_lean_for(c->output);
    if (solve(t, &o, &errs, resp) != 0)
        return 0;
    solution_result(t);
    return respond(t, &o, resp);
}
