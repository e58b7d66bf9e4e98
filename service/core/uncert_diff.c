/*
 * uncert_diff.c — sensitivity coefficients of a model (uncert.h) by finite
 * differences with step control, and the public sensitivity matrix with
 * normalised elasticities (x / y) dy/dx.
 *
 * Per input (column) the plan is one of:
 *   central   method CENTRAL: x -+ h; RICHARDSON: x -+ h and x -+ h/2;
 *   one-sided method CENTRAL: x + s h/2, x + s h (the quadratic through the
 *             base point and both, second order); RICHARDSON: x + s h,
 *             x + s h/2, x + s h/4 (forward differences extrapolated
 *             twice, third order); s = +1 or -1.
 * The farthest point is always h away, so a plan stays inside the input's
 * bounds when [x - h, x + h] (central) or [x, x + s h] does; where neither
 * side has room for h, h shrinks to the larger room. All points of all
 * columns, and the best estimates themselves, are evaluated in one batch
 * (uncert_run.c, threads as the options say); a column whose points fail
 * is planned again on the side that worked and evaluated in a second
 * batch; failing again, the derivative cannot be formed (GC_ERR_INFEASIBLE
 * naming the input). Differences divide by the steps as represented
 * (x + h) - x, not by h.
 *
 * Why central differences (2 evaluations per input) and not forward ones
 * (1 per input, reusing the base evaluation): on the fuel-fired Brayton
 * preset of bench/bench_uncert.c, first-order forward differences reached
 * at best 2e-5 relative error in the coefficients (relative step 1e-6;
 * rounding and the preset's solver noise grow below, truncation above),
 * short of the 1e-6 required; central differences at the default step
 * reach about 4e-7 there and Richardson's about 1e-8 (both measured
 * against Richardson at other steps). One-sided formulas are used only at
 * bounds, and there at second order (two extra evaluations).
 *
 * Sources: central differences and Richardson's extrapolation (L. F.
 * Richardson, Phil. Trans. R. Soc. A 210, 1911; any numerical-analysis
 * text, e.g. Burden & Faires, "Numerical Analysis", sections 4.1-4.2).
 */
#include "uncert_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAX_PTS_PER_COL 4

typedef struct col_plan {
    int input;                   /* model input index */
    int side;                    /* 0 central, +1 / -1 one-sided */
    double h;                    /* step magnitude */
    int n;                       /* points */
    double x[MAX_PTS_PER_COL];   /* perturbed values of the input */
    long idx[MAX_PTS_PER_COL];   /* point indices in the batch */
} col_plan;

typedef struct diff_job {
    const double *x0;
    int nx;
    const int *pt_input;         /* per point: the input perturbed (-1: none) */
    const double *pt_value;      /* per point: its value */
} diff_job;

static void diff_point(const void *jobp, long j, double *x)
{
    const diff_job *job = jobp;
    memcpy(x, job->x0, sizeof(double) * (size_t)job->nx);
    if (job->pt_input[j] >= 0)
        x[job->pt_input[j]] = job->pt_value[j];
}

static double default_rel_step(const gc_uncert_options *opt)
{
    if (opt->rel_step > 0.0)
        return opt->rel_step;
    return opt->diff == GC_UNCERT_RICHARDSON ? GC_UNCERT_STEP_RICHARDSON : GC_UNCERT_STEP_CENTRAL;
}

static double auto_step(const gc_uncert_input *in, const gc_uncert_options *opt)
{
    if (in->step > 0.0)
        return in->step;
    double scale = fmax(fabs(in->value), gc_uncert_input_u(in));
    return default_rel_step(opt) * (scale > 0.0 ? scale : 1.0);
}

static int fits(const gc_uncert_input *in, double lo, double hi)
{
    return (!in->has_lo || lo >= in->lo) && (!in->has_hi || hi <= in->hi);
}

/* Chooses side and h for an input; want = 0 (central if it fits), or the
 * one side to use. */
static void choose_side(const gc_uncert_input *in, double h, int want, col_plan *p)
{
    double x = in->value;
    p->h = h;
    if (want == 0 && fits(in, x - h, x + h))
        p->side = 0;
    else if (want >= 0 && fits(in, x, x + h))
        p->side = 1;
    else if (want <= 0 && fits(in, x - h, x))
        p->side = -1;
    else {
        double up = in->has_hi ? in->hi - x : h, dn = in->has_lo ? x - in->lo : h;
        p->side = (want > 0 || (want == 0 && up >= dn)) ? 1 : -1;
        p->h = fmin(h, p->side > 0 ? up : dn);
    }
}

static void plan_points(const gc_uncert_input *in, gc_uncert_diff method, col_plan *p)
{
    static const double central_c[] = { 1.0, -1.0 }, central_r[] = { 1.0, -1.0, 0.5, -0.5 };
    static const double side_c[] = { 0.5, 1.0 }, side_r[] = { 1.0, 0.5, 0.25 };
    const double *f;
    if (p->side == 0) {
        f = method == GC_UNCERT_RICHARDSON ? central_r : central_c;
        p->n = method == GC_UNCERT_RICHARDSON ? 4 : 2;
    } else {
        f = method == GC_UNCERT_RICHARDSON ? side_r : side_c;
        p->n = method == GC_UNCERT_RICHARDSON ? 3 : 2;
    }
    double s = p->side == 0 ? 1.0 : (double)p->side;
    for (int k = 0; k < p->n; k++)
        p->x[k] = in->value + s * f[k] * p->h;
}

/* Derivative and error estimate of one output from a column's values f[k]
 * (at p->x[k]), the base value f0 at x0. */
static void combine(const col_plan *p, gc_uncert_diff method, double x0, double f0,
                    const double *f, double *d, double *e)
{
    *e = 0.0;
    if (p->side == 0) {
        double d1 = (f[0] - f[1]) / (p->x[0] - p->x[1]);
        if (method != GC_UNCERT_RICHARDSON) {
            *d = d1;
            return;
        }
        double d2 = (f[2] - f[3]) / (p->x[2] - p->x[3]);
        *d = d2 + (d2 - d1) / 3.0;
        *e = fabs(*d - d2);
        return;
    }
    if (method != GC_UNCERT_RICHARDSON) {   /* the parabola through (x0, f0), (x1, f1), (x2, f2) */
        double a = p->x[0] - x0, b = p->x[1] - x0;   /* in differences: exact 0 for a constant */
        *d = ((f[0] - f0) * b * b - (f[1] - f0) * a * a) / (a * b * (b - a));
        return;
    }
    double F1 = (f[0] - f0) / (p->x[0] - x0), F2 = (f[1] - f0) / (p->x[1] - x0);
    double F3 = (f[2] - f0) / (p->x[2] - x0);
    double G1 = 2.0 * F2 - F1, G2 = 2.0 * F3 - F2;
    *d = (4.0 * G2 - G1) / 3.0;
    *e = fabs(*d - G2);
}

typedef struct diff_buf {
    long cap;
    int *pt_input;
    double *pt_value;
    double *y;
    int *status;
} diff_buf;

static int buf_alloc(diff_buf *B, long cap, int ny)
{
    B->cap = cap;
    B->pt_input = malloc(sizeof(int) * (size_t)cap);
    B->pt_value = malloc(sizeof(double) * (size_t)cap);
    B->y = malloc(sizeof(double) * (size_t)cap * (size_t)ny);
    B->status = malloc(sizeof(int) * (size_t)cap);
    return B->pt_input && B->pt_value && B->y && B->status ? GC_OK : GC_ERR_NOMEM;
}

static void buf_free(diff_buf *B)
{
    free(B->pt_input);
    free(B->pt_value);
    free(B->y);
    free(B->status);
}

/* Evaluates the base point (when with_base) and the points of the plans
 * flagged in redo (NULL: all). Returns the number of points. */
static long run_plans(const gc_uncert_model *m, const double *x0, col_plan *P, int n,
                      const int *redo, int with_base, int threads, diff_buf *B)
{
    long np = 0;
    if (with_base) {
        B->pt_input[np] = -1;
        B->pt_value[np++] = 0.0;
    }
    for (int c = 0; c < n; c++) {
        if (redo && !redo[c])
            continue;
        for (int k = 0; k < P[c].n; k++) {
            P[c].idx[k] = np;
            B->pt_input[np] = P[c].input;
            B->pt_value[np++] = P[c].x[k];
        }
    }
    diff_job job = { x0, m->nx, B->pt_input, B->pt_value };
    gc__uncert_batch b = { m, np, diff_point, &job, B->y, B->status, threads };
    gc__uncert_run(&b);
    return np;
}

static int plan_ok(const col_plan *p, const diff_buf *B)
{
    for (int k = 0; k < p->n; k++)
        if (B->status[p->idx[k]] != GC_OK)
            return 0;
    return 1;
}

/* The side to retry a failed plan on (0: none left). */
static int retry_side(const col_plan *p, const diff_buf *B)
{
    if (p->side != 0)
        return -p->side;
    return B->status[p->idx[0]] == GC_OK ? 1 : -1;   /* point 0 is x + h */
}

static void store_column(const gc_uncert_model *m, const col_plan *p, int c,
                         gc_uncert_diff method, double x0, const diff_buf *B, gc__uncert_jac *J)
{
    for (int o = 0; o < m->ny; o++) {
        double f[MAX_PTS_PER_COL];
        for (int k = 0; k < p->n; k++)
            f[k] = B->y[p->idx[k] * m->ny + o];
        combine(p, method, x0, J->y0[o], f, &J->d[o * GC_UNCERT_MAX_INPUTS + c],
                &J->e[o * GC_UNCERT_MAX_INPUTS + c]);
    }
    J->step[c] = p->h;
    J->side[c] = p->side;
}

static int fail_column(const gc_uncert_input *in, const col_plan *p, int code, gc_error *err)
{
    char nb[GC_ERROR_FIELD_LEN];
    const char *name = gc__uncert_name(in, p->input, nb, sizeof nb);
    return gc_error_set(err, GC_ERR_INFEASIBLE, in[p->input].name ? in[p->input].name : "",
                        "the model cannot be evaluated on either side of %s = %.6g "
                        "(step %.3g) to form its sensitivity coefficient (%s)",
                        name, in[p->input].value, p->h, gc_strerror(code));
}

/* Second pass: plans whose points failed, again on the other side. */
static int redo_failed(const gc_uncert_model *m, const gc_uncert_input *in, const double *x0,
                       col_plan *P, int n, const gc_uncert_options *opt, diff_buf *B,
                       gc__uncert_jac *J, gc_error *err)
{
    int redo[GC_UNCERT_MAX_INPUTS] = { 0 }, any = 0, code[GC_UNCERT_MAX_INPUTS] = { 0 };
    for (int c = 0; c < n; c++) {
        if (plan_ok(&P[c], B)) {
            store_column(m, &P[c], c, opt->diff, x0[P[c].input], B, J);
            continue;
        }
        for (int k = 0; k < P[c].n; k++)
            if (B->status[P[c].idx[k]] != GC_OK)
                code[c] = B->status[P[c].idx[k]];
        int side = retry_side(&P[c], B);
        const gc_uncert_input *ic = &in[P[c].input];
        col_plan q = P[c];
        choose_side(ic, P[c].h, side, &q);
        if (q.side != side || !(q.h > 0.0))
            return fail_column(in, &P[c], code[c], err);
        plan_points(ic, opt->diff, &q);
        P[c] = q;
        redo[c] = any = 1;
    }
    if (!any)
        return GC_OK;
    J->evaluations += run_plans(m, x0, P, n, redo, 0, opt->threads, B);
    for (int c = 0; c < n; c++) {
        if (!redo[c])
            continue;
        if (!plan_ok(&P[c], B))
            return fail_column(in, &P[c], code[c], err);
        store_column(m, &P[c], c, opt->diff, x0[P[c].input], B, J);
    }
    return GC_OK;
}

int gc__uncert_jacobian(const gc_uncert_model *m, const gc_uncert_input *in, const int *sel,
                        int n_sel, const gc_uncert_options *opt, gc__uncert_jac *J,
                        gc_error *err)
{
    double x0[GC_UNCERT_MAX_INPUTS];
    col_plan P[GC_UNCERT_MAX_INPUTS];
    for (int i = 0; i < m->nx; i++)
        x0[i] = in[i].value;
    memset(J, 0, sizeof *J);
    for (int c = 0; c < n_sel; c++) {
        P[c].input = sel[c];
        choose_side(&in[sel[c]], auto_step(&in[sel[c]], opt), 0, &P[c]);
        plan_points(&in[sel[c]], opt->diff, &P[c]);
    }
    diff_buf B;
    int st = buf_alloc(&B, 1 + (long)MAX_PTS_PER_COL * n_sel, m->ny);
    if (st != GC_OK) {
        buf_free(&B);
        return gc_error_set(err, st, "", "out of memory for the sensitivity coefficients");
    }
    J->evaluations = run_plans(m, x0, P, n_sel, NULL, 1, opt->threads, &B);
    if (B.status[0] != GC_OK) {
        st = gc_error_set(err, B.status[0], "",
                          "the model cannot be evaluated at the best estimates of its inputs (%s)",
                          gc_strerror(B.status[0]));
    } else {
        memcpy(J->y0, B.y, sizeof(double) * (size_t)m->ny);
        st = redo_failed(m, in, x0, P, n_sel, opt, &B, J, err);
    }
    buf_free(&B);
    return st;
}

/* ---- public sensitivities ---------------------------------------------- */

static void fill_sens(const gc__uncert_jac *J, const gc_uncert_input *in, gc_uncert_sens *res)
{
    for (int c = 0; c < res->n_in; c++) {
        res->x[c] = in[res->in[c]].value;
        res->step[c] = J->step[c];
        res->side[c] = J->side[c];
    }
    for (int r = 0; r < res->n_out; r++) {
        int o = res->out[r];
        res->y[r] = J->y0[o];
        for (int c = 0; c < res->n_in; c++) {
            double d = J->d[o * GC_UNCERT_MAX_INPUTS + c];
            res->dydx[r][c] = d;
            res->error[r][c] = J->e[o * GC_UNCERT_MAX_INPUTS + c];
            res->has_elasticity[r][c] = res->y[r] != 0.0;
            res->elasticity[r][c] = res->y[r] != 0.0 ? res->x[c] / res->y[r] * d : 0.0;
        }
    }
    res->evaluations = J->evaluations;
}

int gc_uncert_sensitivities(const gc_uncert_model *m, const gc_uncert_input *in,
                            const int *in_sel, int n_in, const int *out_sel, int n_out,
                            const gc_uncert_options *opt, gc_uncert_sens *res, gc_error *err)
{
    gc_error_clear(err);
    memset(res, 0, sizeof *res);
    int st = gc__uncert_check_model(m, err);
    if (st == GC_OK)
        st = gc__uncert_check_options(opt, err);
    if (st == GC_OK)
        st = gc_uncert_validate(in, m->nx, NULL, err);
    if (st != GC_OK)
        return st;
    res->n_in = gc__uncert_selection(in_sel, n_in, m->nx, res->in, "inputs", err);
    if (res->n_in < 0)
        return GC_ERR_INVALID;
    res->n_out = gc__uncert_selection(out_sel, n_out, m->ny, res->out, "outputs", err);
    if (res->n_out < 0)
        return GC_ERR_INVALID;
    gc__uncert_jac *J = malloc(sizeof *J);
    if (J == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "",
                            "out of memory for the sensitivity coefficients");
    st = gc__uncert_jacobian(m, in, res->in, res->n_in, opt, J, err);
    if (st == GC_OK)
        fill_sens(J, in, res);
    free(J);
    return st;
}
