/*
 * uncert_model.c — the preset as the model y = f(x) of the uncertainty
 * engine (gascycle/uncert.h) for /v1/uncertainty and /v1/sensitivities.
 *
 * x: the request's inputs in SI base units, written straight into a copy of
 * the decoded base request (point.h: gc_api_points_run_nums, no text parsed
 * between evaluations); y: the requested figures in the response's unit
 * system, unrounded, read by the response writer in capture mode. Each
 * worker thread of the engine gets its own evaluator (a clone sharing the
 * decoded request read-only); the engine's counter-based sampling and its
 * statistics in sample order make every number independent of the thread
 * count.
 *
 * Cost: every evaluation is charged to the request's budget (api.h) on the
 * calling thread before a run (the base evaluation, 1 + 2 n or 1 + 4 n for
 * the derivatives of n inputs, M for a Monte Carlo run); during a run the
 * evaluations watch the budget's deadline and the server's stop flag, and
 * once either trips every further evaluation fails at once, the run ends
 * and the handler lets the HTTP layer answer (a charge of 0 records why).
 * The base evaluation is a full one (its warnings are the answer's); the
 * engine's evaluations leave out what no requested figure reads
 * (GC_LEAN_*).
 */
#include "api/composites/uncert_route.h"
#include "api/handlers.h"

#include <stdatomic.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

typedef struct ushared {
    gc_api_points_num nums[GC_API_UNCERT_MAX_INPUTS];
    int nx, ny;
    int t_out[GC_API_UNCERT_MAX_OUTPUTS];
    unsigned long long deadline_ns;      /* 0: none */
    const atomic_int *cancel;            /* the server's stop flag, or NULL */
    atomic_int stop;                     /* 1: a run was stopped */
} ushared;

typedef struct uctx {
    ushared *sh;
    gc_api_points *ev;
} uctx;

static unsigned long long mono_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (unsigned long long)ts.tv_sec * 1000000000ull + (unsigned long long)ts.tv_nsec;
}

static int stopped(ushared *sh)
{
    if (atomic_load_explicit(&sh->stop, memory_order_relaxed))
        return 1;
    if ((sh->cancel && atomic_load_explicit(sh->cancel, memory_order_relaxed)) ||
        (sh->deadline_ns && mono_ns() > sh->deadline_ns)) {
        atomic_store(&sh->stop, 1);
        return 1;
    }
    return 0;
}

static int eval(void *ctxp, const double *x, int nx, double *y, int ny)
{
    uctx *c = ctxp;
    ushared *sh = c->sh;
    if (stopped(sh))
        return GC_ERR_INFEASIBLE;
    int st = gc_api_points_run_nums(c->ev, sh->nums, x, nx, 0);
    if (st < 0)
        return GC_ERR_NOMEM;
    if (st != 200)
        return GC_ERR_INVALID;
    for (int o = 0; o < ny; o++) {
        const gc_jw_target *t = &c->ev->t[sh->t_out[o]];
        if (!t->found || t->kind != GC_JW_NUMBER)
            return GC_ERR_INFEASIBLE;
        y[o] = t->num;
    }
    return GC_OK;
}

static void *clone(void *ctxp)
{
    uctx *c = ctxp, *k = malloc(sizeof *k);
    gc_api_points *ev = malloc(sizeof *ev);
    if (!k || !ev || gc_api_points_clone(ev, c->ev) != 0) {
        if (ev)
            gc_api_points_free(ev);
        free(ev);
        free(k);
        return NULL;
    }
    k->sh = c->sh;
    k->ev = ev;
    return k;
}

static void release(void *ctxp)
{
    uctx *k = ctxp;
    gc_api_points_free(k->ev);
    free(k->ev);
    free(k);
}

/* ---- a run --------------------------------------------------------------------------------- */

typedef struct urun {
    ushared sh;
    uctx ctx;
    gc_uncert_model m;
    gc_uncert_input in[GC_API_UNCERT_MAX_INPUTS];
} urun;

static urun *run_begin(gc_api_ureq *q)
{
    urun *r = calloc(1, sizeof *r);
    if (!r)
        return NULL;
    r->sh.nx = q->n_in;
    r->sh.ny = q->n_out;
    for (int i = 0; i < q->n_in; i++) {
        r->sh.nums[i] = q->in[i].num;
        r->in[i] = q->in[i].u;
    }
    for (int o = 0; o < q->n_out; o++)
        r->sh.t_out[o] = q->out[o].target;
    if (q->budget) {
        r->sh.deadline_ns = q->budget->deadline_ns;
        r->sh.cancel = q->budget->cancel;
    }
    atomic_init(&r->sh.stop, 0);
    r->ctx.sh = &r->sh;
    r->ctx.ev = &q->ev;
    r->m = (gc_uncert_model){ eval, &r->ctx, q->n_in, q->n_out, clone, release };
    q->opt.threads = q->threads;
    return r;
}

/* Threads for a run of n evaluations: one per 32 at most (a clone and a
 * thread cost about what a few evaluations do; the numbers never depend on
 * the count). */
static void threads_for(gc_api_ureq *q, long n)
{
    long t = n / 32 + 1;
    q->opt.threads = t < q->threads ? (int)t : q->threads;
}

/* After a run: a stop is recorded in the budget (the HTTP layer answers). */
static int run_end(gc_api_ureq *q, urun *r, int st)
{
    if (atomic_load(&r->sh.stop)) {
        q->stopped = 1;
        gc_api_budget_charge(q->budget, 0);
    }
    free(r);
    return st;
}

/* Charges n evaluations; 0, or -1 (q->stopped: the HTTP layer answers). */
static int charge(gc_api_ureq *q, long n)
{
    if (gc_api_budget_charge(q->budget, (unsigned long)n) == 0)
        return 0;
    q->stopped = 1;
    return -1;
}

static long derivative_cost(const gc_api_ureq *q)
{
    return 1 + (q->opt.diff == GC_UNCERT_RICHARDSON ? 4L : 2L) * q->n_in;
}

int gc_api_umodel_base(gc_api_ureq *q)
{
    if (charge(q, 1) != 0)
        return 503;
    q->ev.lean = 0;
    q->ev.want_units = 1;
    int st = gc_api_points_run(&q->ev, NULL);
    q->evaluations++;
    return st;
}

/* The lean flags every output allows. */
static void set_lean(gc_api_ureq *q)
{
    unsigned lean = GC_LEAN_NO_AREAS | GC_LEAN_NO_BOUNDS | GC_LEAN_NO_WARNINGS;
    for (int o = 0; o < q->n_out; o++)
        lean &= gc_api_points_lean_for(q->out[o].pointer);
    q->ev.lean = lean;
}

int gc_api_umodel_linear(gc_api_ureq *q, gc_uncert_linear_result *lin, gc_error *err)
{
    if (charge(q, derivative_cost(q)) != 0)
        return GC_ERR_INFEASIBLE;
    set_lean(q);
    urun *r = run_begin(q);
    if (!r)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    threads_for(q, derivative_cost(q));
    int st = gc_uncert_linear(&r->m, r->in, q->R, NULL, 0, &q->opt, lin, err);
    q->evaluations += lin->evaluations;
    return run_end(q, r, st);
}

int gc_api_umodel_monte_carlo(gc_api_ureq *q, const gc_uncert_linear_result *lin,
                              gc_uncert_mc_result *mc, gc_error *err)
{
    if (charge(q, q->opt.samples) != 0)
        return GC_ERR_INFEASIBLE;
    set_lean(q);
    urun *r = run_begin(q);
    if (!r)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    threads_for(q, q->opt.samples);
    int st = gc_uncert_monte_carlo(&r->m, r->in, q->R, NULL, 0, &q->opt, lin, mc, err);
    q->evaluations += mc->samples;
    return run_end(q, r, st);
}

int gc_api_umodel_sensitivities(gc_api_ureq *q, gc_uncert_sens *s, gc_error *err)
{
    if (charge(q, derivative_cost(q)) != 0)
        return GC_ERR_INFEASIBLE;
    set_lean(q);
    urun *r = run_begin(q);
    if (!r)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    threads_for(q, derivative_cost(q));
    int st = gc_uncert_sensitivities(&r->m, r->in, NULL, 0, NULL, 0, &q->opt, s, err);
    q->evaluations += s->evaluations;
    return run_end(q, r, st);
}

void gc_api_umodel_sample_problem(gc_api_ureq *q, long j, char *out, size_t n)
{
    gc_uncert_input in[GC_API_UNCERT_MAX_INPUTS];
    gc_api_points_num nums[GC_API_UNCERT_MAX_INPUTS];
    double x[GC_API_UNCERT_MAX_INPUTS];
    gc_error e;
    out[0] = '\0';
    for (int i = 0; i < q->n_in; i++) {
        in[i] = q->in[i].u;
        nums[i] = q->in[i].num;
    }
    if (gc_uncert_mc_draw(in, q->n_in, q->R, q->opt.seed, j, x, &e) != GC_OK)
        return;
    q->evaluations++;
    int st = gc_api_points_run_nums(&q->ev, nums, x, q->n_in, 1);
    if (st == 200 || st < 0)
        return;
    gc_api_inner inner = { .status = st, .error_class = q->ev.error_class, .body = q->ev.problem };
    json_t *list = json_array();
    gc_api_inner_problem_errors(&inner, "/inputs", list);
    json_t *e0 = json_array_get(list, 0);
    const char *field = json_string_value(json_object_get(e0, "field"));
    const char *msg = json_string_value(json_object_get(e0, "message"));
    const char *detail = json_string_value(json_object_get(q->ev.problem, "detail"));
    if (msg)
        snprintf(out, n, "%s%s%s", field && field[0] ? field : "", field && field[0] ? " " : "",
                 msg);
    else if (detail)
        snprintf(out, n, "%s", detail);
    json_decref(list);
}
