/*
 * targets.c — GET|POST /v1/targets: "can this requirement be met at all?".
 * One free input of a cycle preset between bounds, one output (an RFC 6901
 * pointer into the cycle result) and a goal: equal to a value, at least or
 * at most a value, or the largest or smallest achievable. Solved with the
 * core's bracket scan and Brent's methods (gascycle/solve.h) on the full
 * evaluation through the preset's own route (gc_api_inner_call), so every
 * default, validation and warning of the route applies.
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
#include "api/decode.h"
#include "api/handlers.h"
#include "api/output.h"
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
    const char *request_id;
    int n_ok;                  /* evaluations with a result */
    json_t *first_ok;          /* first result (units, pointer check) */
    json_t *first_fail;        /* first failure: {x, status, error_class, detail, errors} */
    json_t *first_fail_body;   /* its problem body */
    int bad_output;            /* 1: the output pointer names no number */
    int oom;
} target_ctx;

/* One evaluation at x: the full result (new reference) or NULL. */
static json_t *evaluate(target_ctx *c, double x, int *status, gc_api_inner *keep)
{
    json_t *fields = c->inputs ? json_deep_copy(c->inputs) : json_object();
    json_t *v;
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
    if (!fields || gc_api_pointer_set(fields, c->pointer, v) != 0) {
        json_decref(fields);
        *status = 422;
        return NULL;
    }
    gc_api_inner in;
    if (gc_api_budget_charge(c->budget, 1) != 0) { json_decref(fields); c->oom = 1; *status = 503; return NULL; } /* budget hook */
    if (gc_api_inner_call(c->path, fields, c->as_query, c->sys, c->request_id, &in) != 0) {
        json_decref(fields);
        gc_api_inner_free(&in);
        c->oom = 1;
        *status = 503;
        return NULL;
    }
    json_decref(fields);
    *status = in.status;
    if (in.status == 200 && in.body) {
        json_t *b = in.body;
        in.body = NULL;
        return b;
    }
    if (keep)
        *keep = in;
    else
        gc_api_inner_free(&in);
    return NULL;
}

/* gc_solve_fn: the output at free input x. */
static int solve_fn(void *vctx, double x, double *y)
{
    target_ctx *c = vctx;
    int status = 0;
    gc_api_inner in;
    memset(&in, 0, sizeof in);
    json_t *doc = evaluate(c, x, &status, &in);
    if (c->oom)
        return GC_ERR_NOMEM;
    if (!doc) {
        if (!c->first_fail) {
            c->first_fail = json_pack("{s:f, s:i, s:s}", "input", x, "status", status,
                                      "error_class", in.error_class ? in.error_class : "error");
            const char *detail = json_string_value(json_object_get(in.body, "detail"));
            json_object_set_new(c->first_fail, "detail", json_string(detail ? detail
                                : "the point could not be evaluated"));
            json_t *list = json_array();
            gc_api_inner_problem_errors(&in, "/inputs", list);
            json_object_set_new(c->first_fail, "errors", list);
            c->first_fail_body = in.body ? json_incref(in.body) : NULL;
        }
        gc_api_inner_free(&in);
        return GC_ERR_INFEASIBLE;
    }
    json_t *v = gc_out_pointer(doc, c->output);
    if (!c->first_ok)
        c->first_ok = json_incref(doc);
    if (!json_is_number(v)) {
        c->bad_output = 1;
        json_decref(doc);
        return GC_ERR_INVALID;   /* aborts the solve */
    }
    *y = json_number_value(v);
    c->n_ok++;
    json_decref(doc);
    return GC_OK;
}

/* x (as written) in the output system, through the echo of a result at x
 * (doc may be NULL) or the quantity named by the route's unit label. */
static double input_out(const target_ctx *c, json_t *doc, int quantity, double x)
{
    json_t *echo = doc ? gc_out_pointer(json_object_get(doc, "inputs"), c->pointer) : NULL;
    if (json_is_number(echo))
        return json_number_value(echo);
    if (quantity < 0)
        return x;
    double si;
    if (c->unit[0]) {
        if (gc_units_to_si((gc_quantity)quantity, x, c->unit, &si, NULL) != GC_OK)
            return x;
    } else {
        si = gc_units_default_to_si((gc_quantity)quantity, x);
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

static int fail422(json_t *root, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    json_decref(root);
    gc_out_free(o);
    gc_api_problem_errors(resp, 422, "validation", "Invalid target", NULL, errs);
    return 0;
}

static void ctx_free(target_ctx *c)
{
    json_decref(c->first_ok);
    json_decref(c->first_fail);
    json_decref(c->first_fail_body);
}

int gc_api_h_targets(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    json_t *root = NULL;
    int begin_rc;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_SELECT, &o, &errs,
                               &root, resp, &begin_rc) != 0)
        return begin_rc;
    target_ctx c;
    memset(&c, 0, sizeof c);
    c.as_query = req->method != GC_M_POST;
    c.sys = o.sys;
    c.request_id = req->request_id;
    c.budget = req->budget;

    /* ---- the request ---- */
    gc_api_unknown_keys(root, "", top_keys, &errs);
    char path[96] = "";
    gc_api_cycle_path(json_object_get(root, "cycle"), &errs, path, sizeof path);
    c.path = path;
    c.inputs = json_object_get(root, "inputs");
    if (c.inputs && !json_is_object(c.inputs))
        gc_api_errors_add(&errs, "/inputs", "must be an object with the cycle's input fields");
    json_t *fr = json_object_get(root, "free");
    double lo = 0.0, hi = 0.0;
    gc_solve_options opt;
    gc_solve_options_init(&opt, 0.0, 1.0);
    if (!json_is_object(fr)) {
        gc_api_errors_add(&errs, "/free", "is required: {input, lower, upper}, the input the "
                          "solver may change and its bounds");
    } else {
        gc_api_unknown_keys(fr, "/free", free_keys, &errs);
        json_t *in = json_object_get(fr, "input");
        if (!json_is_string(in) || gc_api_input_pointer(json_string_value(in), c.pointer,
                                                        sizeof c.pointer) != 0)
            gc_api_errors_add(&errs, "/free/input", "is required: the name of an input of the "
                              "cycle (e.g. 'pressure_ratio') or its JSON pointer");
        char ul[UNIT_LEN] = "", uh[UNIT_LEN] = "";
        json_t *l = json_object_get(fr, "lower"), *h = json_object_get(fr, "upper");
        int ok_l = 0, ok_h = 0;
        if (!l)
            gc_api_errors_add(&errs, "/free/lower", "is required");
        else if (gc_api_value_split(l, &lo, ul, sizeof ul) != 0)
            gc_api_errors_add(&errs, "/free/lower", "must be a finite number or a string with a "
                              "unit such as '5 bar'");
        else
            ok_l = 1;
        if (!h)
            gc_api_errors_add(&errs, "/free/upper", "is required");
        else if (gc_api_value_split(h, &hi, uh, sizeof uh) != 0)
            gc_api_errors_add(&errs, "/free/upper", "must be a finite number or a string with a "
                              "unit such as '30 bar'");
        else
            ok_h = 1;
        if (ok_l && ok_h && strcmp(ul, uh) != 0)
            gc_api_errors_add(&errs, "/free/upper", "must be in the same unit as lower ('%s', "
                              "got '%s')", ul[0] ? ul : "default unit",
                              uh[0] ? uh : "default unit");
        else if (ok_l && ok_h && !(hi > lo))
            gc_api_errors_add(&errs, "/free/upper", "must be greater than lower");
        snprintf(c.unit, sizeof c.unit, "%s", ul);
        gc_solve_options_init(&opt, lo, hi);
        json_t *sp = json_object_get(fr, "spacing");
        if (sp) {
            const char *s = json_string_value(sp);
            if (s && strcmp(s, "log") == 0)
                opt.log_spacing = 1;
            else if (!s || strcmp(s, "linear") != 0)
                gc_api_errors_add(&errs, "/free/spacing", "must be 'linear' or 'log'");
        }
        if (opt.log_spacing && ok_l && !(lo > 0.0))
            gc_api_errors_add(&errs, "/free/spacing", "log spacing needs a lower bound greater "
                              "than 0");
        json_t *sc = json_object_get(fr, "scan_points");
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
                gc_api_errors_add(&errs, "/free/scan_points", "must be a whole number from 3 "
                                  "to 200");
            else
                opt.scan_points = (int)n;
        }
    }
    json_t *tg = json_object_get(root, "target");
    int goal = -1;
    json_t *tvalue = NULL;
    if (!json_is_object(tg)) {
        gc_api_errors_add(&errs, "/target", "is required: {output, goal, value}");
    } else {
        gc_api_unknown_keys(tg, "/target", target_keys, &errs);
        json_t *out = json_object_get(tg, "output");
        const char *s = json_string_value(out);
        if (!s || s[0] != '/' || strlen(s) >= sizeof c.output || strstr(s, "//"))
            gc_api_errors_add(&errs, "/target/output", "is required: a JSON pointer into the "
                              "cycle result, such as '/summary/thermal_efficiency'");
        else
            snprintf(c.output, sizeof c.output, "%s", s);
        json_t *g = json_object_get(tg, "goal");
        const char *gs = g ? json_string_value(g) : "equal";
        for (int i = 0; gs && goals[i]; i++)
            if (strcmp(gs, goals[i]) == 0)
                goal = i;
        if (goal < 0) {
            const char *sug = gs ? gc_decode_suggest(gs, goals, 5) : NULL;
            if (sug)
                gc_api_errors_add(&errs, "/target/goal", "unknown goal '%.40s'; did you mean "
                                  "'%s'?", gs, sug);
            else
                gc_api_errors_add(&errs, "/target/goal", "must be one of 'equal', 'at_least', "
                                  "'at_most', 'maximize', 'minimize'");
        }
        tvalue = json_object_get(tg, "value");
        if (goal >= 0 && goal <= GC_SOLVE_AT_MOST && !tvalue)
            gc_api_errors_add(&errs, "/target/value", "is required for the goal '%s'", gs);
        if (goal >= GC_SOLVE_MAXIMIZE && tvalue)
            gc_api_errors_add(&errs, "/target/value", "does not apply to the goal '%s'", gs);
        double tv;
        char tu[UNIT_LEN];
        if (tvalue && gc_api_value_split(tvalue, &tv, tu, sizeof tu) != 0)
            gc_api_errors_add(&errs, "/target/value", "must be a finite number or a string with "
                              "a unit such as '400 kJ/kg'");
    }
    if (errs.n)
        return fail422(root, &o, &errs, resp);

    /* ---- a probe at the lower bound: the output's unit and pointer ---- */
    double target = 0.0;
    char out_name[GC_API_FIELD_LEN], in_name[GC_API_FIELD_LEN];
    snprintf(out_name, sizeof out_name, "%s", gc_api_pointer_last(c.output));
    gc_api_pointer_name(c.pointer, in_name, sizeof in_name);
    double probe_y = 0.0;
    int prc = solve_fn(&c, lo, &probe_y);
    if (prc == GC_ERR_NOMEM) {
        ctx_free(&c);
        json_decref(root);
        gc_out_free(&o);
        return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.",
                              NULL);
    }
    if (c.bad_output) {
        json_t *v = gc_out_pointer(c.first_ok, c.output);
        if (!v)
            gc_api_errors_add(&errs, "/target/output", "no value at '%s' in the %s result "
                              "(e.g. /summary/thermal_efficiency, /summary/net_work)", c.output,
                              json_string_value(json_object_get(root, "cycle")));
        else
            gc_api_errors_add(&errs, "/target/output", "'%s' names %s, not a number", c.output,
                              json_is_object(v) ? "an object" : json_is_array(v) ? "an array"
                              : json_is_string(v) ? "a string" : json_is_null(v) ? "null"
                                                                                 : "a boolean");
        ctx_free(&c);
        return fail422(root, &o, &errs, resp);
    }
    json_t *ounits = json_object_get(c.first_ok, "units");
    const char *out_label = json_string_value(json_object_get(ounits, gc_api_pointer_last(c.output)));
    if (!out_label && c.first_ok)
        out_label = "-";
    if (tvalue) {
        char tu[UNIT_LEN];
        gc_api_value_split(tvalue, &target, tu, sizeof tu);
        if (tu[0]) {
            int q = gc_api_label_quantity(out_label, o.sys);
            double si;
            gc_error uerr;
            if (!c.first_ok)
                gc_api_errors_add(&errs, "/target/value", "give the target as a plain number in "
                                  "the output's unit: with no result at the lower bound its "
                                  "quantity is not known");
            else if (q < 0)
                gc_api_errors_add(&errs, "/target/value", "the output has no unit ('%s'); give a "
                                  "plain number", out_label ? out_label : "-");
            else if (gc_units_to_si((gc_quantity)q, target, tu, &si, &uerr) != GC_OK)
                gc_api_errors_add(&errs, "/target/value", "%s", uerr.message);
            else
                target = gc_units_from_si((gc_quantity)q, o.sys, si);
        }
    }
    if (errs.n) {
        ctx_free(&c);
        return fail422(root, &o, &errs, resp);
    }

    /* ---- the solve ---- */
    gc_solve_result res;
    gc_error serr;
    gc_error_clear(&serr);
    int src = gc_solve_target(solve_fn, &c, &opt, (gc_solve_goal)goal, target, &res, &serr);
    int evals = res.n_evals + 1;   /* with the probe */
    if (c.oom) {
        ctx_free(&c);
        json_decref(root);
        gc_out_free(&o);
        return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.",
                              NULL);
    }
    if (c.bad_output) {
        gc_api_errors_add(&errs, "/target/output", "'%s' is not a number in every result of "
                          "this range", c.output);
        ctx_free(&c);
        return fail422(root, &o, &errs, resp);
    }
    if (src == GC_ERR_INFEASIBLE) {
        /* no point of the range has a result: the inputs are at fault */
        const char *cls = json_string_value(json_object_get(c.first_fail, "error_class"));
        json_t *list = json_object_get(c.first_fail, "errors");
        size_t i;
        json_t *e;
        json_array_foreach(list, i, e)
            gc_api_errors_add(&errs, json_string_value(json_object_get(e, "field")), "%s",
                              json_string_value(json_object_get(e, "message")));
        if (errs.n == 0)
            gc_api_errors_add(&errs, "/free", "no value of %s between the bounds can be "
                              "evaluated", in_name);
        int validation = !cls || strcmp(cls, "validation") == 0;
        ctx_free(&c);
        json_decref(root);
        gc_out_free(&o);
        gc_api_problem_errors(resp, 422, validation ? "validation" : "infeasible",
                              validation ? "Invalid target" : "Target not evaluable",
                              validation ? NULL
                                         : "No value of the free input between the bounds gives "
                                           "a cycle that can be evaluated.", &errs);
        return 0;
    }
    if (src != GC_OK) {
        gc_api_errors_add(&errs, serr.field[0] ? serr.field : "/free", "%s", serr.message);
        ctx_free(&c);
        return fail422(root, &o, &errs, resp);
    }

    /* ---- the result at the solution ---- */
    int st = 0;
    json_t *result = evaluate(&c, res.x, &st, NULL);
    evals++;
    int q_in = gc_api_label_quantity(
        json_string_value(json_object_get(json_object_get(result ? result : c.first_ok, "units"),
                                          gc_api_pointer_last(c.pointer))), o.sys);
    const char *in_label = json_string_value(json_object_get(
        json_object_get(result ? result : c.first_ok, "units"), gc_api_pointer_last(c.pointer)));
    if (!in_label && c.unit[0])
        in_label = c.unit;

    json_t *doc = json_object();
    json_object_set(doc, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(doc, "met", json_boolean(res.met));
    json_t *sol = json_object();
    gc_out_num(&o, sol, "input", input_out(&c, result, q_in, res.x));
    gc_out_num(&o, sol, "output", res.y);
    json_object_set_new(sol, "where", json_string(where_names[res.where]));
    json_object_set_new(doc, "solution", sol);

    /* the sentence */
    char xs[96], ys[96], ts[96], lo_s[96], hi_s[96], answer[2048];
    fmt_num(xs, sizeof xs, input_out(&c, result, q_in, res.x), in_label);
    fmt_num(ys, sizeof ys, res.y, out_label);
    fmt_num(ts, sizeof ts, target, out_label);
    fmt_num(lo_s, sizeof lo_s, input_out(&c, NULL, q_in, lo), in_label);
    fmt_num(hi_s, sizeof hi_s, input_out(&c, NULL, q_in, hi), in_label);
    static const char *const where_words[] = { "", " (the lower bound)", " (the upper bound)",
                                               " (the edge of the inputs this cycle can "
                                               "evaluate)" };
    const char *op = goal == GC_SOLVE_EQUAL ? "=" : goal == GC_SOLVE_AT_LEAST ? ">=" : "<=";
    if (goal >= GC_SOLVE_MAXIMIZE) {
        snprintf(answer, sizeof answer, "The %s %s of this configuration for %s from %s to %s "
                 "is %s, at %s = %s%s.", goal == GC_SOLVE_MAXIMIZE ? "highest" : "lowest",
                 out_name, in_name, lo_s, hi_s, ys, in_name, xs, where_words[res.where]);
    } else if (res.met) {
        if (goal == GC_SOLVE_EQUAL)
            snprintf(answer, sizeof answer, "%s %s %s is met at %s = %s%s.", out_name, op, ts,
                     in_name, xs,
                     res.n_roots > 1 ? " (the lowest of several solutions: see roots)" : "");
        else
            snprintf(answer, sizeof answer, "%s %s %s is met from %s = %s (the lowest value "
                     "meeting it; see ranges).", out_name, op, ts, in_name, xs);
    } else {
        int above = goal == GC_SOLVE_AT_LEAST || (goal == GC_SOLVE_EQUAL && res.y < target);
        snprintf(answer, sizeof answer, "%s %s %s cannot be met for %s from %s to %s: the %s "
                 "%s of this configuration is %s, at %s = %s%s.", out_name, op, ts, in_name,
                 lo_s, hi_s, above ? "highest" : "lowest", out_name, ys, in_name, xs,
                 where_words[res.where]);
    }
    json_object_set_new(doc, "answer", json_string(answer));

    if (goal == GC_SOLVE_EQUAL) {
        json_t *roots = json_array();
        for (int i = 0; i < res.n_roots; i++) {
            json_t *r = json_object();
            gc_out_num(&o, r, "input", input_out(&c, NULL, q_in, res.roots[i]));
            gc_out_num(&o, r, "output", res.root_y[i]);
            json_array_append_new(roots, r);
        }
        json_object_set_new(doc, "roots", roots);
    } else if (goal <= GC_SOLVE_AT_MOST) {
        json_t *ranges = json_array();
        for (int i = 0; i < res.n_ranges; i++) {
            json_t *r = json_object();
            gc_out_num(&o, r, "from", input_out(&c, NULL, q_in, res.ranges[i][0]));
            gc_out_num(&o, r, "to", input_out(&c, NULL, q_in, res.ranges[i][1]));
            json_array_append_new(ranges, r);
        }
        json_object_set_new(doc, "ranges", ranges);
    }
    json_t *ext = json_object();
    const gc_solve_extreme *exs[2] = { &res.max, &res.min };
    const char *exn[2] = { "max", "min" };
    for (int i = 0; i < 2; i++) {
        if (!exs[i]->found)
            continue;
        json_t *e = json_object();
        gc_out_num(&o, e, "input", input_out(&c, NULL, q_in, exs[i]->x));
        gc_out_num(&o, e, "output", exs[i]->y);
        json_object_set_new(e, "where", json_string(where_names[exs[i]->where]));
        json_object_set_new(ext, exn[i], e);
    }
    json_object_set_new(doc, "extremes", ext);

    json_t *search = json_pack("{s:i, s:i, s:i, s:i, s:b, s:b}", "evaluations", evals,
                               "without_result", res.n_infeasible + (prc != GC_OK),
                               "scan_points", res.n_scan, "scan_points_with_result",
                               res.n_scan_feasible, "budget_exhausted", res.budget_exhausted,
                               "truncated", res.ranges_truncated);
    if (c.first_fail) {
        json_t *ff = json_deep_copy(c.first_fail);
        json_t *xv = json_object_get(ff, "input");
        if (json_is_number(xv))
            json_object_set_new(ff, "input", json_real(input_out(&c, NULL, q_in,
                                                                  json_number_value(xv))));
        json_object_set_new(search, "first_without_result", ff);
    }
    json_object_set_new(doc, "search", search);
    if (result) {
        json_t *seen = json_object();
        gc_api_inner_warnings(&o, result, seen);
        json_decref(seen);
        json_object_set_new(doc, "result", result);
    }

    /* units, echo, warnings */
    if (in_label)
        json_object_set_new(o.units, "input", json_string(in_label));
    if (out_label)
        json_object_set_new(o.units, "output", json_string(out_label));
    json_object_set(o.inputs, "cycle", json_object_get(root, "cycle"));
    json_object_set_new(o.inputs, "inputs", c.inputs ? json_incref(c.inputs) : json_object());
    json_t *fe = json_pack("{s:s, s:O, s:O, s:s, s:i}", "input", c.pointer,
                           "lower", json_object_get(fr, "lower"),
                           "upper", json_object_get(fr, "upper"),
                           "spacing", opt.log_spacing ? "log" : "linear",
                           "scan_points", opt.scan_points);
    json_object_set_new(o.inputs, "free", fe);
    json_t *te = json_pack("{s:s, s:s}", "output", c.output, "goal", goals[goal]);
    if (goal <= GC_SOLVE_AT_MOST)
        gc_out_num(&o, te, "value", target);
    json_object_set_new(o.inputs, "target", te);
    if (!res.met)
        gc_out_warn(&o, "target_not_met", "/target", "%s", answer);
    if (res.where == GC_SOLVE_AT_LOWER || res.where == GC_SOLVE_AT_UPPER)
        gc_out_warn(&o, "at_bound", "/free", "the answer lies at a bound of the free input; "
                    "the best value may lie beyond it");
    if (res.budget_exhausted)
        gc_out_warn(&o, "budget_exhausted", "/free", "the evaluation budget ran out before "
                    "the refinement converged; the answer is the best found");
    if (res.ranges_truncated)
        gc_out_warn(&o, "many_solutions", "/target", "more solutions exist than are listed");
    ctx_free(&c);
    json_decref(root);
    return gc_out_respond(&o, doc, GC_OUT_EVALUATION, resp);
}
