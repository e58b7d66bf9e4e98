/*
 * uncertainty.c — GET|POST /v1/uncertainty and GET|POST /v1/sensitivities
 * (issue 14): the measurement uncertainty of any preset's figures, and
 * their derivatives, over every registered preset (cycle presets, measured
 * reductions, and every preset added later), evaluated in process
 * (uncert_model.c over point.h) with the engine of gascycle/uncert.h.
 *
 * /v1/uncertainty: {"cycle": <preset>, "inputs": {base inputs},
 *   "uncertainties": {<input>: <uncertainty>, ...} (uncert_request.c),
 *   "correlations": [{"inputs": [a, b], "coefficient": r}],
 *   "outputs": [<pointer>, ...] (default: the numbers of /summary),
 *   "method": "linear" | "monte_carlo", "derivatives": "central" |
 *   "richardson", "relative_step", "coverage_factor" (default 2) or
 *   "coverage_probability", "samples" (default 10 000, at most 100 000),
 *   "seed" (default 1)}
 * Answer: per output its value, combined standard uncertainty (JCGM
 * 100:2008 5.1.2 eq. (10), 5.2.2 eq. (13)), coverage factor, expanded
 * uncertainty and interval, the systematic and random parts (ASME PTC 19.1
 * practice) when every input gives both, and the budget sorted by share of
 * variance (sensitivity coefficient, contribution, share); with Monte Carlo
 * (JCGM 101:2008) also the mean, standard deviation, shortest and
 * symmetric coverage intervals with their standard errors, and the
 * validation of the linear result (clause 8); the correlation of the
 * outputs; every convention under "conventions".
 *
 * /v1/sensitivities: {"cycle", "inputs", "with_respect_to": [<input>, ...]
 *   (default: every number given in inputs), "outputs", "derivatives",
 *   "relative_step"} -> the matrix of d(output)/d(input) in the response's
 *   units and the elasticities (x / y) dy/dx, formed from the values in SI
 *   base units (so kelvin, not degrees Celsius or Fahrenheit).
 *
 * Formats: JSON; format=csv (the budget or the sensitivity table, one row
 * per output and input); format=svg (diagram=budget or elasticities: a bar
 * chart of the first output, uncert_formats.c); select=<pointer> (one
 * value as text, e.g. /outputs/0/expanded_uncertainty).
 * Errors: 422 with the field of the request at fault (an input's
 * specification, an output, a correlation, samples) or the base inputs'
 * own problems under /inputs; the cost budget (api.h) is charged per
 * evaluation.
 */
#include "api/composites/uncert_route.h"
#include "api/handlers.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- answers that end a request early ------------------------------------------------------ */

static int finish_problem(gc_api_ureq *q, gc_out *o, gc_api_errors *errs, int status,
                          const char *cls, const char *title, gc_api_response *resp)
{
    gc_api_ureq_free(q);
    free(q);
    gc_out_free(o);
    gc_api_problem_errors(resp, status, cls, title, NULL, errs);
    return 0;
}

static int finish_oom(gc_api_ureq *q, gc_out *o, gc_api_response *resp)
{
    gc_api_ureq_free(q);
    free(q);
    gc_out_free(o);
    return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.", NULL);
}

/* The budget refused or a run was stopped: the HTTP layer replaces this. */
static int finish_stopped(gc_api_ureq *q, gc_out *o, gc_api_response *resp)
{
    gc_api_ureq_free(q);
    free(q);
    gc_out_free(o);
    return gc_api_problem(resp, 503, "budget_exceeded", NULL, "The request's evaluation "
                          "budget ran out.", NULL);
}

/* The base inputs cannot be evaluated: their problems under /inputs. */
static int base_failed(gc_api_ureq *q, gc_out *o, int status, gc_api_errors *errs,
                       gc_api_response *resp)
{
    gc_api_inner in = { .status = status, .body = q->ev.problem,
                        .error_class = q->ev.error_class };
    const char *cls = q->ev.error_class ? q->ev.error_class : "validation";
    json_t *list = json_array();
    gc_api_inner_problem_errors(&in, "/inputs", list);
    size_t i;
    json_t *e;
    json_array_foreach(list, i, e)
        gc_api_errors_add(errs, json_string_value(json_object_get(e, "field")), "%s",
                          json_string_value(json_object_get(e, "message")));
    json_decref(list);
    if (errs->n == 0) {
        const char *d = json_string_value(json_object_get(q->ev.problem, "detail"));
        gc_api_errors_add(errs, "/inputs", "%s", d ? d : "the base inputs cannot be evaluated");
    }
    int validation = strcmp(cls, "validation") == 0;
    return finish_problem(q, o, errs, 422, validation ? "validation" : cls,
                          validation ? "Invalid input" : "Inputs cannot be evaluated", resp);
}

/* The engine's refusal, with the request's field: an input's specification,
 * a correlation, samples. */
static int engine_failed(gc_api_ureq *q, gc_out *o, const gc_error *err, gc_api_errors *errs,
                         gc_api_response *resp)
{
    const char *f = "";
    char buf[GC_API_FIELD_LEN];
    int i, j;
    for (int k = 0; k < q->n_in; k++)
        if (strcmp(err->field, q->in[k].pointer) == 0)
            f = q->in[k].field;
    if (sscanf(err->field, "correlation/%d/%d", &i, &j) == 2) {
        f = "/correlations";
        for (int k = 0; k < q->n_corr; k++)
            if ((q->corr[k].i == i && q->corr[k].j == j) || (q->corr[k].i == j &&
                                                             q->corr[k].j == i)) {
                snprintf(buf, sizeof buf, "/correlations/%d", k);
                f = buf;
            }
    } else if (strcmp(err->field, "correlation") == 0) {
        f = "/correlations";
    } else if (strcmp(err->field, "samples") == 0) {
        f = "/samples";
    }
    gc_api_errors_add(errs, f, "%s", err->message);
    int invalid = err->code == GC_ERR_INVALID;
    return finish_problem(q, o, errs, 422, invalid ? "validation" : "infeasible",
                          invalid ? "Invalid request" : "Uncertainty not evaluable", resp);
}

/* ---- the request ------------------------------------------------------------------------- */

static int threads_of(const gc_api_budget *b)
{
    if (!b || b->threads <= 1)
        return 1;
    return b->threads > GC_API_UNCERT_MAX_THREADS ? GC_API_UNCERT_MAX_THREADS : (int)b->threads;
}

/* diagram= of format=svg: the route's one chart (400 otherwise, like any bad output
 * parameter). 0, or 1 when resp holds the problem (q freed). */
static int check_diagram(gc_api_ureq *q, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    const char *want = q->sensitivities ? "elasticities" : "budget";
    if (o->format != GC_FMT_SVG || !o->diagram || strcmp(o->diagram, want) == 0)
        return 0;
    gc_api_errors_add(errs, "/diagram", "must be '%s' for this route (a bar chart of the first "
                      "output)", want);
    return finish_problem(q, o, errs, 400, "bad_output", "Invalid output parameters", resp), 1;
}

/* Opening shared by both routes: decode, evaluate the base, resolve. 0 to
 * go on, else resp holds the answer (q freed). */
static int prepare(gc_api_ureq *q, gc_out *o, gc_api_errors *errs, gc_api_response *resp)
{
    if (check_diagram(q, o, errs, resp) != 0)
        return 1;
    gc_api_ureq_decode(q, errs);
    if (errs->n || errs->dropped)
        return finish_problem(q, o, errs, 422, "validation", "Invalid request", resp), 1;
    if (gc_api_points_init(&q->ev, q->p, q->inputs, q->as_query, q->sys, NULL, 0) != 0)
        return finish_oom(q, o, resp), 1;
    for (int k = 0; k < q->n_out; k++)
        q->out[k].target = gc_api_points_target(&q->ev, q->out[k].pointer);
    int st = gc_api_umodel_base(q);
    if (q->stopped)
        return finish_stopped(q, o, resp), 1;
    if (st < 0)
        return finish_oom(q, o, resp), 1;
    if (st != 200)
        return base_failed(q, o, st, errs, resp), 1;
    q->base_warnings = gc_api_points_warnings(&q->ev);
    int rc = gc_api_ureq_resolve(q, errs);
    if (rc == -2)
        return finish_oom(q, o, resp), 1;
    if (rc != 0)
        return finish_problem(q, o, errs, 422, "validation", "Invalid request", resp), 1;
    return 0;
}

static gc_api_ureq *ureq_new(const gc_api_request *req, json_t *root, const gc_out *o,
                             int sensitivities)
{
    gc_api_ureq *q = calloc(1, sizeof *q);
    if (!q) {
        json_decref(root);
        return NULL;
    }
    q->sensitivities = sensitivities;
    q->root = root;
    q->as_query = req->method != GC_M_POST;
    q->sys = o->sys;
    q->budget = req->budget;
    q->threads = threads_of(req->budget);
    return q;
}

/* ---- parts of the answer ------------------------------------------------------------------- */

static json_t *pair(gc_out *o, double a, double b)
{
    json_t *h = json_object(), *arr = json_array();
    gc_out_num(o, h, "a", a);
    gc_out_num(o, h, "b", b);
    json_array_append(arr, json_object_get(h, "a"));
    json_array_append(arr, json_object_get(h, "b"));
    json_decref(h);
    return arr;
}

static void num_or_null(gc_out *o, json_t *obj, const char *key, int ok, double v)
{
    if (ok)
        gc_out_num(o, obj, key, v);
    else
        json_object_set_new(obj, key, json_null());
}

/* The echo and units of one input: value and unit in the response's system. */
static json_t *input_head(gc_out *o, const gc_api_uinput *in)
{
    json_t *e = json_pack("{s:s}", "input", in->pointer);
    json_object_set_new(e, "unit", json_string(in->unit));
    gc_out_num(o, e, "value", in->a * in->num.value + in->b);
    char name[GC_API_FIELD_LEN];
    gc_api_pointer_name(in->pointer, name, sizeof name);
    json_object_set_new(o->units, name, json_string(in->unit));
    return e;
}

static json_t *uncertain_input(gc_out *o, const gc_api_uinput *in)
{
    json_t *e = input_head(o, in);
    double u = gc_uncert_input_u(&in->u);
    gc_out_num(o, e, "standard_uncertainty", in->a * u);
    num_or_null(o, e, "relative_standard_uncertainty", in->num.value != 0.0,
                u / fabs(in->num.value));
    json_object_set_new(e, "form", json_string(in->form));
    if (in->u.has_parts) {
        gc_out_num(o, e, "systematic", in->a * in->u.u_sys);
        gc_out_num(o, e, "random", in->a * in->u.u_rand);
    }
    if (strcmp(in->form, "expanded") == 0) {
        gc_out_num(o, e, "expanded_uncertainty", in->a * in->expanded);
        gc_out_num(o, e, "coverage_factor", in->k);
    }
    json_object_set_new(e, "distribution", json_string(in->u.dist == GC_UNCERT_RECTANGULAR
                                                       ? "rectangular" : "normal"));
    num_or_null(o, e, "degrees_of_freedom", in->u.dof > 0.0, in->u.dof);
    json_object_set(e, "given", in->given);
    return e;
}

static json_t *budget_term(gc_api_ureq *q, gc_out *o, const gc_api_uoutput *out,
                           const gc_uncert_term *t, int parts)
{
    const gc_api_uinput *in = &q->in[t->input];
    char su[2 * GC_API_UNCERT_UNIT_LEN + 4];
    json_t *e = json_pack("{s:s, s:s}", "input", in->pointer, "unit", in->unit);
    gc_out_num(o, e, "standard_uncertainty", in->a * t->u);
    gc_out_num(o, e, "sensitivity", t->sensitivity / in->a);
    gc_api_ratio_unit(out->unit, in->unit, su, sizeof su);
    json_object_set_new(e, "sensitivity_unit", json_string(su));
    if (q->opt.diff == GC_UNCERT_RICHARDSON)
        gc_out_num(o, e, "sensitivity_error", t->sensitivity_error / in->a);
    gc_out_num(o, e, "contribution", t->contribution);
    gc_out_num(o, e, "share", t->share);
    if (parts) {
        gc_out_num(o, e, "systematic_contribution", t->contribution_sys);
        gc_out_num(o, e, "random_contribution", t->contribution_rand);
    }
    return e;
}

static const char *k_basis(const gc_api_ureq *q, const gc_uncert_budget *b)
{
    if (!q->p_given)
        return "given";
    return b->k_from_t ? "student_t" : "normal";
}

static json_t *linear_output(gc_api_ureq *q, gc_out *o, int k, const gc_uncert_budget *b)
{
    const gc_api_uoutput *out = &q->out[k];
    json_t *e = json_pack("{s:s, s:s, s:s}", "output", out->pointer, "name", out->name, "unit",
                          out->unit);
    gc_out_num(o, e, "value", b->y);
    gc_out_num(o, e, "standard_uncertainty", b->u_c);
    gc_out_num(o, e, "coverage_factor", b->k);
    json_object_set_new(e, "coverage_factor_basis", json_string(k_basis(q, b)));
    num_or_null(o, e, "coverage_probability", q->p_given, b->coverage_probability);
    num_or_null(o, e, "effective_degrees_of_freedom", b->nu_eff > 0.0, b->nu_eff);
    gc_out_num(o, e, "expanded_uncertainty", b->U);
    num_or_null(o, e, "relative_expanded_uncertainty", b->y != 0.0, b->U / fabs(b->y));
    json_object_set_new(e, "interval", pair(o, b->y - b->U, b->y + b->U));
    if (b->parts_complete) {
        gc_out_num(o, e, "systematic_uncertainty", b->u_sys);
        gc_out_num(o, e, "random_uncertainty", b->u_rand);
    }
    gc_out_num(o, e, "correlation_share", b->correlation_share);
    json_t *terms = json_array();
    for (int t = 0; t < b->n_terms; t++)
        json_array_append_new(terms, budget_term(q, o, out, &b->terms[t], b->parts_complete));
    json_object_set_new(e, "budget", terms);
    json_object_set_new(o->units, out->name, json_string(out->unit));
    return e;
}

static json_t *mc_output(gc_out *o, const gc_uncert_mc_output *m)
{
    json_t *e = json_object(), *se = json_object(), *v = json_object();
    gc_out_num(o, e, "mean", m->mean);
    gc_out_num(o, e, "standard_uncertainty", m->u);
    json_object_set_new(e, "coverage_interval", pair(o, m->low, m->high));
    json_object_set_new(e, "symmetric_interval", pair(o, m->sym_low, m->sym_high));
    gc_out_num(o, se, "mean", m->se_mean);
    gc_out_num(o, se, "standard_uncertainty", m->se_u);
    gc_out_num(o, se, "low", m->se_low);
    gc_out_num(o, se, "high", m->se_high);
    json_object_set_new(e, "standard_errors", se);
    json_object_set_new(v, "linear_interval", pair(o, m->y_linear - m->U_linear,
                                                   m->y_linear + m->U_linear));
    gc_out_num(o, v, "d_low", m->d_low);
    gc_out_num(o, v, "d_high", m->d_high);
    gc_out_num(o, v, "numerical_tolerance", m->delta);
    gc_out_num(o, v, "tolerance", m->tolerance);
    json_object_set_new(v, "linear_validated", json_boolean(m->linear_validated));
    json_object_set_new(v, "disagrees", json_boolean(m->disagrees));
    json_object_set_new(e, "validation", v);
    return e;
}

/* ---- conventions ----------------------------------------------------------------------------- */

static json_t *derivative_conventions(const gc_api_ureq *q)
{
    int rich = q->opt.diff == GC_UNCERT_RICHARDSON;
    double h = q->opt.rel_step > 0.0 ? q->opt.rel_step
             : rich ? GC_UNCERT_STEP_RICHARDSON : GC_UNCERT_STEP_CENTRAL;
    json_t *d = json_pack("{s:s, s:f, s:i}", "method", rich ? "richardson" : "central",
                          "relative_step", h, "order", rich ? 4 : 2);
    json_object_set_new(d, "step", json_string(
        "h = relative_step x max(|x|, u(x)) with x and u(x) in SI base units (relative_step "
        "times one unit of the response's unit of the input when both are 0); central differences (f(x+h) - f(x-h)) / 2h, or with "
        "richardson the central differences at h and h/2 extrapolated (error estimate given); "
        "where a step would leave the input's bounds or the preset cannot be evaluated on "
        "one side, the one-sided formula of the same order on the other side"));
    return d;
}

static json_t *mc_conventions(const gc_api_ureq *q, const gc_uncert_mc_result *mc)
{
    json_t *m = json_object();
    json_object_set_new(m, "samples", json_integer(mc->samples));
    json_object_set_new(m, "evaluated", json_integer(mc->n_ok));
    json_object_set_new(m, "failed", json_integer(mc->n_failed));
    json_object_set_new(m, "seed", json_integer((json_int_t)q->opt.seed));
    json_object_set_new(m, "threads", json_integer(q->opt.threads));
    json_object_set_new(m, "coverage_probability", json_real(mc->coverage_probability));
    json_object_set_new(m, "blocks", json_integer(mc->blocks));
    json_object_set_new(m, "generator", json_string(
        "SplitMix64 (Steele, Lea and Flood 2014) as a counter-based stream of the seed: "
        "sample j of n inputs uses numbers 2nj .. 2nj + 2n - 1, so every sample and every "
        "figure is the same for any number of threads"));
    json_object_set_new(m, "sampling", json_string(
        "normal: Box-Muller; rectangular: x +- sqrt(3) u(x); correlated normal inputs: "
        "x + L z with L L^T = V (Cholesky); JCGM 101:2008 6.4"));
    json_object_set_new(m, "intervals", json_string(
        "shortest coverage interval (JCGM 101 7.7.3) and probabilistically symmetric one "
        "(7.7.2) at coverage_probability; standard errors from 10 blocks of the samples in "
        "sample order (7.9.4) when each holds at least 100 / (1 - p), else from u / sqrt(M) "
        "and the order statistics"));
    json_object_set_new(m, "validation", json_string(
        "JCGM 101 clause 8: the linear interval y -+ k_p u_c at the same p is validated when "
        "both end-point differences are within the numerical tolerance of u_c at 2 significant "
        "digits (7.9.2); disagrees is flagged beyond the larger of that and 4 standard errors "
        "of the end points"));
    return m;
}

static void put_text(json_t *c, const char *key, const char *text)
{
    json_object_set_new(c, key, json_string(text));
}

static void uncertainty_texts(const gc_api_ureq *q, json_t *c)
{
    put_text(c, "standard", q->method == GC_API_U_MONTE_CARLO
             ? "JCGM 100:2008 (GUM) law of propagation of uncertainty (5.1.2 eq. (10), 5.2.2 "
               "eq. (13)) and JCGM 101:2008 propagation of distributions (Monte Carlo)"
             : "JCGM 100:2008 (GUM) law of propagation of uncertainty, 5.1.2 eq. (10) and "
               "5.2.2 eq. (13)");
    put_text(c, "uncertainties", "standard uncertainties (one standard deviation) unless named "
             "expanded; expanded U = k u_c; the interval is value -+ U");
    put_text(c, "coverage_factor_rule", q->p_given
             ? "k = z_{(1+p)/2} of the normal distribution, or Student's t_{(1+p)/2} at "
               "floor(nu_eff) (Welch-Satterthwaite, GUM G.4.1) where inputs give degrees of "
               "freedom and no correlation joins contributing inputs"
             : "k as given (default 2, GUM 6.3.3)");
    put_text(c, "relative_values", "an uncertainty ending in % is relative to the input's "
             "value in SI base units (kelvin for a temperature), for every input");
    put_text(c, "temperature_uncertainties", "an uncertainty of a temperature is a temperature "
             "difference (K; R or degF intervals in units=us)");
    put_text(c, "correlation_model", "r correlates the shared parts a of two inputs: the whole "
             "standard uncertainty, or the systematic part of an input given in parts (random "
             "parts independent, ASME PTC 19.1 practice): u(xi, xj) = r a_i a_j (GUM 5.2.2)");
    put_text(c, "systematic_and_random", "systematic and random standard uncertainties "
             "propagate separately and combine by root-sum-square: u_c^2 = b^2 + s^2 (ASME "
             "PTC 19.1 practice); given for an output only when every input gives both");
    put_text(c, "sensitivity", "c = d(output)/d(input) in the output's unit per input unit of "
             "the response; contribution = c u(x) (signed); share = (c u(x))^2 / u_c^2; the "
             "correlation terms' share is correlation_share; budget rows sorted by share");
}

static json_t *conventions(const gc_api_ureq *q, const gc_uncert_mc_result *mc)
{
    json_t *c = json_object();
    if (q->sensitivities) {
        put_text(c, "standard", "sensitivity coefficients of JCGM 100:2008 5.1.3 by finite "
                 "differences");
        put_text(c, "sensitivity", "d(output)/d(input) in the output's unit per input unit "
                 "of the response");
        put_text(c, "elasticity", "(x / y) dy/dx with x and y in SI base units (kelvin for "
                 "temperatures): the relative change of the output per relative change of "
                 "the input; null where x or y is 0");
    } else {
        uncertainty_texts(q, c);
        if (q->p_given)
            json_object_set_new(c, "coverage_probability", json_real(q->opt.coverage_probability));
        else
            json_object_set_new(c, "coverage_factor", json_real(q->opt.coverage_factor));
    }
    json_object_set_new(c, "derivatives", derivative_conventions(q));
    if (mc)
        json_object_set_new(c, "monte_carlo", mc_conventions(q, mc));
    return c;
}

/* ---- warnings and the echo ----------------------------------------------------------------- */

/* The field of output k in the request, or NULL when outputs were defaulted. */
static const char *output_field(const gc_api_ureq *q, int k, char *buf, size_t n)
{
    if (!q->outs_given)
        return NULL;
    snprintf(buf, n, "/outputs/%d", k);
    return buf;
}

/* An input whose uncertainty moves no output at all. */
static void no_effect(gc_api_ureq *q, gc_out *o, const gc_uncert_linear_result *lin)
{
    for (int i = 0; i < q->n_in; i++) {
        if (gc_uncert_input_u(&q->in[i].u) <= 0.0)
            continue;
        int moved = 0;
        for (int k = 0; k < lin->n_out; k++)
            for (int t = 0; t < lin->out[k].n_terms; t++)
                moved |= lin->out[k].terms[t].input == i &&
                         lin->out[k].terms[t].sensitivity != 0.0;
        if (!moved)
            gc_out_warn(o, "no_effect", q->in[i].field, "no output changes with %s at the steps "
                        "used (every sensitivity is 0): the %s preset may not read it with "
                        "these inputs", q->in[i].pointer, q->p->name);
    }
}

static void mc_warnings(gc_api_ureq *q, gc_out *o, const gc_uncert_mc_result *mc)
{
    char f[32], why[GC_API_MESSAGE_LEN];
    for (int k = 0; k < mc->n_out; k++) {
        const gc_uncert_mc_output *m = &mc->out[k];
        if (m->disagrees)
            gc_out_warn(o, "nonlinear", output_field(q, k, f, sizeof f), "the Monte Carlo "
                        "coverage interval of %s differs from the linear one beyond its "
                        "statistical tolerance (end points off by %.3g and %.3g, tolerance "
                        "%.3g %s): the figure is not linear enough over these uncertainties "
                        "for the first-order GUM result; use the Monte Carlo interval",
                        q->out[k].name, m->d_low, m->d_high, m->tolerance, q->out[k].unit);
    }
    if (mc->n_failed == 0)
        return;
    gc_api_umodel_sample_problem(q, mc->first_failed, why, sizeof why);
    gc_out_warn(o, "samples_failed", q->samples_given ? "/samples" : NULL, "%ld of %ld samples "
                "could not be evaluated and are left out of the statistics (the first, sample "
                "%ld: %s)", mc->n_failed, mc->samples, mc->first_failed,
                why[0] ? why : "no result");
}

/* Too many samples failed: a 422 naming the input whose bound they crossed
 * when that is what the first one shows. */
static int samples_failed(gc_api_ureq *q, gc_out *o, const gc_uncert_mc_result *mc,
                          gc_api_errors *errs, gc_api_response *resp)
{
    char why[GC_API_MESSAGE_LEN];
    const char *f = "/samples";
    gc_api_umodel_sample_problem(q, mc->first_failed, why, sizeof why);
    for (int i = 0; i < q->n_in; i++) {
        size_t n = strlen("/inputs") + strlen(q->in[i].pointer);
        if (strncmp(why, "/inputs", 7) == 0 && strncmp(why + 7, q->in[i].pointer, n - 7) == 0 &&
            why[n] == ' ')
            f = q->in[i].field;
    }
    gc_api_errors_add(errs, f, "%ld of %ld Monte Carlo samples cannot be evaluated (at most "
                      "0.1 %% may fail); the first, sample %ld: %s. Narrow the distribution, "
                      "or make it rectangular within the input's bounds", mc->n_failed,
                      mc->samples, mc->first_failed, why[0] ? why : "no result");
    return finish_problem(q, o, errs, 422, "infeasible", "Uncertainty not evaluable", resp);
}

/* The request as understood: every default filled in. */
static void echo_request(gc_api_ureq *q, gc_out *o)
{
    json_t *e = o->inputs;
    json_object_set_new(e, "cycle", json_string(q->p->name));
    json_object_set_new(e, "inputs", q->inputs ? json_incref(q->inputs) : json_object());
    json_t *outs = json_array();
    for (int k = 0; k < q->n_out; k++)
        json_array_append_new(outs, json_string(q->out[k].pointer));
    json_object_set_new(e, "outputs", outs);
    json_object_set_new(e, "derivatives", json_string(q->opt.diff == GC_UNCERT_RICHARDSON
                                                      ? "richardson" : "central"));
    if (q->step_given)
        json_object_set_new(e, "relative_step", json_real(q->opt.rel_step));
    if (q->sensitivities) {
        json_t *w = json_array();
        for (int i = 0; i < q->n_in; i++)
            json_array_append_new(w, json_string(q->in[i].pointer));
        json_object_set_new(e, "with_respect_to", w);
        return;
    }
    json_object_set(e, "uncertainties", q->specs);
    if (q->corr_given)
        json_object_set(e, "correlations", q->corr_given);
    json_object_set_new(e, "method", json_string(q->method ? "monte_carlo" : "linear"));
    if (q->p_given)
        json_object_set_new(e, "coverage_probability", json_real(q->opt.coverage_probability));
    else
        json_object_set_new(e, "coverage_factor", json_real(q->opt.coverage_factor));
    if (q->method == GC_API_U_MONTE_CARLO) {
        json_object_set_new(e, "samples", json_integer(q->opt.samples));
        json_object_set_new(e, "seed", json_integer((json_int_t)q->opt.seed));
    }
}

static void base_warnings(gc_api_ureq *q, gc_out *o)
{
    if (!q->base_warnings)
        return;
    json_t *seen = json_object();
    json_t *holder = json_pack("{s:O}", "warnings", q->base_warnings);
    gc_api_inner_warnings(o, holder, seen);
    json_decref(holder);
    json_decref(seen);
}

/* JSON, CSV or SVG of doc (stolen); q and o released. */
static int respond(gc_api_ureq *q, gc_out *o, json_t *doc, gc_api_response *resp)
{
    int rc;
    echo_request(q, o);
    base_warnings(q, o);
    if (o->format == GC_FMT_CSV && !o->nonfinite)
        rc = gc_api_uncert_csv(q, doc, resp);
    else if (o->format == GC_FMT_SVG && !o->nonfinite)
        rc = gc_api_uncert_svg(q, o, doc, resp);
    else {
        gc_api_ureq_free(q);
        free(q);
        return gc_out_respond(o, doc, GC_OUT_EVALUATION, resp);
    }
    json_decref(doc);
    gc_api_ureq_free(q);
    free(q);
    gc_out_free(o);
    return rc;
}

/* ---- /v1/uncertainty ------------------------------------------------------------------------ */

static json_t *uncertainty_doc(gc_api_ureq *q, gc_out *o, const gc_uncert_linear_result *lin,
                               const gc_uncert_mc_result *mc)
{
    json_t *doc = json_pack("{s:s, s:s}", "cycle", q->p->name, "method",
                            mc ? "monte_carlo" : "linear");
    json_t *outs = json_array(), *ins = json_array();
    for (int k = 0; k < lin->n_out; k++) {
        json_t *e = linear_output(q, o, k, &lin->out[k]);
        if (mc && k < mc->n_out)
            json_object_set_new(e, "monte_carlo", mc_output(o, &mc->out[k]));
        json_array_append_new(outs, e);
    }
    json_object_set_new(doc, "outputs", outs);
    for (int i = 0; i < q->n_in; i++)
        json_array_append_new(ins, uncertain_input(o, &q->in[i]));
    json_object_set_new(doc, "uncertain_inputs", ins);
    if (lin->n_out > 1) {
        json_t *m = json_array();
        for (int r = 0; r < lin->n_out; r++) {
            json_t *row = json_array();
            for (int c = 0; c < lin->n_out; c++)
                json_array_append_new(row, json_real(isfinite(lin->corr[r][c]) ? lin->corr[r][c]
                                                                               : 0.0));
            json_array_append_new(m, row);
        }
        json_object_set_new(doc, "output_correlations", m);
    }
    json_object_set_new(doc, "conventions", conventions(q, mc));
    json_object_set_new(doc, "evaluations", json_integer(q->evaluations));
    no_effect(q, o, lin);
    if (mc)
        mc_warnings(q, o, mc);
    return doc;
}

static int run_uncertainty(gc_api_ureq *q, gc_out *o, gc_api_errors *errs,
                           gc_api_response *resp)
{
    gc_uncert_linear_result *lin = malloc(sizeof *lin);
    gc_uncert_mc_result *mc = NULL;
    gc_error err;
    gc_error_clear(&err);
    int st = lin ? gc_api_umodel_linear(q, lin, &err) : GC_ERR_NOMEM;
    if (st == GC_OK && !q->stopped && q->method == GC_API_U_MONTE_CARLO) {
        mc = malloc(sizeof *mc);
        st = mc ? gc_api_umodel_monte_carlo(q, lin, mc, &err) : GC_ERR_NOMEM;
    }
    int rc;
    if (q->stopped)
        rc = finish_stopped(q, o, resp);
    else if (st == GC_ERR_NOMEM)
        rc = finish_oom(q, o, resp);
    else if (st != GC_OK && mc && mc->n_failed > 0 && strcmp(err.field, "samples") == 0)
        rc = samples_failed(q, o, mc, errs, resp);
    else if (st != GC_OK)
        rc = engine_failed(q, o, &err, errs, resp);
    else
        rc = respond(q, o, uncertainty_doc(q, o, lin, mc), resp);
    free(lin);
    free(mc);
    return rc;
}

/* The common start of both routes: output parameters, the body, the
 * request read and prepared. NULL when the answer is already in resp (*rc:
 * the handler's return value). */
static gc_api_ureq *open_request(const gc_api_request *req, gc_api_response *resp, int sens,
                                 gc_out *o, gc_api_errors *errs, int *rc)
{
    json_t *root = NULL;
    if (gc_api_composite_begin(req, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                               GC_OUT_ACCEPT_SELECT | GC_OUT_ACCEPT_SVG, o, errs, &root, resp,
                               rc) != 0)
        return NULL;
    gc_api_ureq *q = ureq_new(req, root, o, sens);
    if (!q) {
        gc_out_free(o);
        *rc = gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return NULL;
    }
    *rc = 0;
    return prepare(q, o, errs, resp) != 0 ? NULL : q;
}

int gc_api_h_uncertainty(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    int rc = 0;
    gc_api_ureq *q = open_request(req, resp, 0, &o, &errs, &rc);
    if (!q)
        return rc;
    return run_uncertainty(q, &o, &errs, resp);
}

/* ---- /v1/sensitivities ---------------------------------------------------------------------- */

static json_t *wrt_entry(gc_api_ureq *q, gc_out *o, int i, const gc_uncert_sens *s)
{
    static const char *const sides[] = { "backward", "central", "forward" };
    json_t *e = input_head(o, &q->in[i]);
    gc_out_num(o, e, "step", q->in[i].a * s->step[i]);
    json_object_set_new(e, "difference", json_string(sides[s->side[i] + 1]));
    return e;
}

/* Row k of the matrices: derivatives, their units, elasticities, errors. */
static void sens_row(gc_api_ureq *q, gc_out *o, int k, const gc_uncert_sens *s, json_t *rows[4])
{
    const gc_api_uoutput *out = &q->out[k];
    double ay, by;
    gc_api_unit_map(out->quantity, q->sys, &ay, &by);
    double y_si = (s->y[k] - by) / ay;
    json_t *r[4] = { json_array(), json_array(), json_array(), json_array() };
    for (int i = 0; i < s->n_in; i++) {
        const gc_api_uinput *in = &q->in[i];
        char su[2 * GC_API_UNCERT_UNIT_LEN + 4];
        double d = s->dydx[k][i];
        json_t *h = json_object();
        gc_out_num(o, h, "d", d / in->a);
        gc_out_num(o, h, "e", s->error[k][i] / in->a);
        if (in->num.value != 0.0 && y_si != 0.0)
            gc_out_num(o, h, "el", in->num.value / y_si * d / ay);
        json_array_append(r[0], json_object_get(h, "d"));
        gc_api_ratio_unit(out->unit, in->unit, su, sizeof su);
        json_array_append_new(r[1], json_string(su));
        json_array_append(r[2], json_object_get(h, "el") ? json_object_get(h, "el")
                                                          : json_null());
        json_array_append(r[3], json_object_get(h, "e"));
        json_decref(h);
    }
    for (int m = 0; m < 4; m++)
        json_array_append_new(rows[m], r[m]);
}

static json_t *sensitivities_doc(gc_api_ureq *q, gc_out *o, const gc_uncert_sens *s)
{
    static const char *const keys[] = { "sensitivities", "sensitivity_units", "elasticities",
                                        "sensitivity_errors" };
    json_t *doc = json_pack("{s:s}", "cycle", q->p->name);
    json_t *wrt = json_array(), *outs = json_array();
    json_t *rows[4] = { json_array(), json_array(), json_array(), json_array() };
    for (int i = 0; i < s->n_in; i++)
        json_array_append_new(wrt, wrt_entry(q, o, i, s));
    for (int k = 0; k < s->n_out; k++) {
        json_t *e = json_pack("{s:s, s:s, s:s}", "output", q->out[k].pointer, "name",
                              q->out[k].name, "unit", q->out[k].unit);
        gc_out_num(o, e, "value", s->y[k]);
        json_array_append_new(outs, e);
        json_object_set_new(o->units, q->out[k].name, json_string(q->out[k].unit));
        sens_row(q, o, k, s, rows);
    }
    json_object_set_new(doc, "with_respect_to", wrt);
    json_object_set_new(doc, "outputs", outs);
    for (int m = 0; m < 4; m++) {
        if (m == 3 && q->opt.diff != GC_UNCERT_RICHARDSON)
            json_decref(rows[m]);
        else
            json_object_set_new(doc, keys[m], rows[m]);
    }
    json_object_set_new(doc, "conventions", conventions(q, NULL));
    json_object_set_new(doc, "evaluations", json_integer(q->evaluations));
    return doc;
}

int gc_api_h_sensitivities(const gc_api_request *req, gc_api_response *resp)
{
    gc_out o;
    gc_api_errors errs;
    int rc = 0;
    gc_api_ureq *q = open_request(req, resp, 1, &o, &errs, &rc);
    if (!q)
        return rc;
    gc_uncert_sens *s = malloc(sizeof *s);
    gc_error err;
    gc_error_clear(&err);
    int st = s ? gc_api_umodel_sensitivities(q, s, &err) : GC_ERR_NOMEM;
    if (q->stopped)
        rc = finish_stopped(q, &o, resp);
    else if (st == GC_ERR_NOMEM)
        rc = finish_oom(q, &o, resp);
    else if (st != GC_OK)
        rc = engine_failed(q, &o, &err, &errs, resp);
    else
        rc = respond(q, &o, sensitivities_doc(q, &o, s), resp);
    free(s);
    return rc;
}
