/*
 * solve.h — one-dimensional root finding and optimisation over one free
 * input of any evaluation: "can this requirement be met at all?".
 *
 * The caller supplies y = f(x) as a callback (for the service: a full cycle
 * evaluation read at one output). The solver never assumes f is smooth,
 * monotone or defined everywhere:
 *   1. a bracket scan of [lo, hi] (scan_points values, both bounds included,
 *      equally spaced in x or in ln x) finds sign changes, the extremes and
 *      the points where f has no value (infeasible inputs);
 *   2. roots are refined with Brent's method (inverse quadratic
 *      interpolation, secant and bisection steps; R. P. Brent, "Algorithms
 *      for Minimization without Derivatives", Prentice-Hall 1973, ch. 4);
 *   3. extremes are refined with Brent's minimisation (parabolic
 *      interpolation with golden-section fallback, same book, ch. 5) between
 *      the neighbours of the best scan point;
 *   4. an edge between a feasible and an infeasible scan point is located
 *      by bisection, so an answer limited by feasibility says so.
 * A target that no x in [lo, hi] meets is not an error: the result says
 * "not met" and gives the best achievable value and where it is reached.
 *
 * Units: x and y are in whatever units the caller uses (the solver is unit
 * free); tolerances are in the units of x.
 *
 * Thread safety: no global state; the callback's ctx is the caller's.
 */
#ifndef GASCYCLE_SOLVE_H
#define GASCYCLE_SOLVE_H

#include "gascycle/error.h"

/* y = f(x). Return GC_OK with a finite *y; GC_ERR_INFEASIBLE when f has no
 * value at x (the solver goes on around it); any other code aborts the
 * solve and is returned by gc_solve_target. A non-finite *y counts as
 * GC_ERR_INFEASIBLE. */
typedef int (*gc_solve_fn)(void *ctx, double x, double *y);

typedef enum gc_solve_goal {
    GC_SOLVE_EQUAL = 0,    /* f(x) = target */
    GC_SOLVE_AT_LEAST = 1, /* f(x) >= target */
    GC_SOLVE_AT_MOST = 2,  /* f(x) <= target */
    GC_SOLVE_MAXIMIZE = 3, /* largest f(x) (target unused) */
    GC_SOLVE_MINIMIZE = 4  /* smallest f(x) (target unused) */
} gc_solve_goal;

/* Where an extreme (or the best achievable value) lies. */
typedef enum gc_solve_where {
    GC_SOLVE_INTERIOR = 0,          /* strictly inside [lo, hi] and the feasible region */
    GC_SOLVE_AT_LOWER = 1,          /* at lo */
    GC_SOLVE_AT_UPPER = 2,          /* at hi */
    GC_SOLVE_AT_FEASIBILITY_EDGE = 3 /* at the edge of the inputs f can evaluate */
} gc_solve_where;

#define GC_SOLVE_MAX_SCAN 256       /* scan points (plus refined points) held */
#define GC_SOLVE_MAX_ROOTS 8        /* roots / range edges reported */
#define GC_SOLVE_MAX_RANGES 8       /* sub-ranges meeting an inequality */

typedef struct gc_solve_options {
    double lo, hi;          /* bounds of x, lo < hi (units of x) */
    int scan_points;        /* bracket-scan values, 3 .. GC_SOLVE_MAX_SCAN - 8 (default 25) */
    int log_spacing;        /* 1: scan equally spaced in ln x (needs lo > 0) */
    double x_tol;           /* absolute tolerance on x (default 1e-10 (hi - lo)) */
    int max_evals;          /* evaluations allowed in the whole solve (default 400) */
} gc_solve_options;

typedef struct gc_solve_extreme {
    int found;              /* 1 when computed (the goal needed it) */
    double x, y;            /* where, and the value there */
    int where;              /* gc_solve_where */
} gc_solve_extreme;

typedef struct gc_solve_result {
    int met;                /* 1 when the goal is met somewhere in [lo, hi];
                               maximize/minimize: 1 when a feasible x exists */
    double x, y;            /* the answer: equal: the lowest root; at_least/at_most:
                               the lowest x meeting it; maximize/minimize: the optimum.
                               When not met: where the best achievable value is */
    int where;              /* gc_solve_where of x when it is an extreme (else INTERIOR) */
    int n_roots;            /* equal: roots found (one per bracket, lowest first) */
    double roots[GC_SOLVE_MAX_ROOTS];     /* x of each root */
    double root_y[GC_SOLVE_MAX_ROOTS];    /* f at each root */
    int n_ranges;           /* at_least/at_most: sub-ranges of x meeting the goal */
    double ranges[GC_SOLVE_MAX_RANGES][2];/* [from, to] of each, lowest first */
    double range_y[GC_SOLVE_MAX_RANGES][2];/* f at from and at to */
    int ranges_truncated;   /* 1 when more roots or ranges existed than are held */
    gc_solve_extreme max;   /* the largest f found (refined when the goal needed it) */
    gc_solve_extreme min;   /* the smallest f found (refined when the goal needed it) */
    int n_evals;            /* evaluations made */
    int n_infeasible;       /* of which had no value */
    int n_scan;             /* scan points */
    int n_scan_feasible;    /* scan points with a value */
    int budget_exhausted;   /* 1 when max_evals stopped a refinement early */
} gc_solve_result;

/* Defaults for [lo, hi]: 25 linear scan points, x_tol = 1e-10 (hi - lo),
 * 400 evaluations. */
void gc_solve_options_init(gc_solve_options *o, double lo, double hi);

/* The whole solve (see the top of this file). target is ignored by
 * maximize/minimize. Returns GC_OK (met or not: see res->met),
 * GC_ERR_INVALID for bad options (field "/lower", "/upper", "/scan_points"
 * ...), GC_ERR_INFEASIBLE when no scan point has a value, or the code of a
 * callback that aborted. */
int gc_solve_target(gc_solve_fn f, void *ctx, const gc_solve_options *opt, gc_solve_goal goal,
                    double target, gc_solve_result *res, gc_error *err);

/* Brent's root finder on [a, b] with f(a) - target = ga and f(b) - target =
 * gb of opposite signs (or one zero). Stops when the bracket is below
 * x_tol (+ 4 eps |x|) or after max_evals evaluations. On GC_OK *x is the
 * root and *y = f(*x); *evals counts the evaluations made. A point inside
 * the bracket without a value gives GC_ERR_INFEASIBLE. */
int gc_solve_root(gc_solve_fn f, void *ctx, double target, double a, double b, double ga,
                  double gb, double x_tol, int max_evals, double *x, double *y, int *evals);

/* Brent's minimisation of sign * f on [a, b] (sign = +1 minimises, -1
 * maximises), starting from x0 in [a, b] where f(x0) = y0 is known. Points
 * without a value count as worse than any value. On GC_OK *x, *y = f(*x)
 * is the best point found; *evals counts evaluations. */
int gc_solve_minimize(gc_solve_fn f, void *ctx, int sign, double a, double b, double x0,
                      double y0, double x_tol, int max_evals, double *x, double *y, int *evals);

#endif
