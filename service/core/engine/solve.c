/*
 * solve.c — bracket scan, Brent's root finder and Brent's minimisation over
 * one free input (solve.h). Pure C, no global state, no allocation: the
 * points of a solve live in a fixed array on the caller's stack frame.
 *
 * Methods: R. P. Brent, "Algorithms for Minimization without Derivatives",
 * Prentice-Hall 1973: chapter 4 (zero of a function: inverse quadratic
 * interpolation or secant step when it stays inside the bracket and shrinks
 * fast enough, bisection otherwise) and chapter 5 (minimum of a function of
 * one variable: parabolic interpolation through the three best points, a
 * golden-section step when the parabola is not trusted). Written here from
 * the published descriptions.
 *
 * Feasibility: the callback may report that f has no value at x
 * (GC_ERR_INFEASIBLE). The scan keeps such points; an edge between a point
 * with a value and one without is located by bisection (up to
 * MAX_EDGES edges), and the edge point joins the scan as an ordinary point,
 * so roots, ranges and extremes see it like any other.
 */
#include "gascycle/solve.h"

#include <float.h>
#include <math.h>
#include <string.h>

#define MAX_EDGES 4           /* feasibility edges located per solve */
#define MIN_TOL_FRACTION 1e-7 /* minimisation tolerance, fraction of hi - lo (flat near an optimum) */

typedef struct caller {
    gc_solve_fn f;
    void *ctx;
    int evals;        /* made */
    int infeasible;   /* of which without a value */
    int max_evals;    /* budget */
    int abort_code;   /* a callback code other than OK/INFEASIBLE, sticky */
    int exhausted;    /* the budget ran out */
} caller;

typedef struct point {
    double x, y;      /* y valid when ok */
    int ok;           /* f has a value at x */
    int edge;         /* located feasibility edge */
} point;

/* One evaluation through the budget. GC_ERR_NOCONV when the budget is out. */
static int call(caller *c, double x, double *y)
{
    if (c->abort_code)
        return c->abort_code;
    if (c->evals >= c->max_evals) {
        c->exhausted = 1;
        return GC_ERR_NOCONV;
    }
    c->evals++;
    double v = 0.0;
    int rc = c->f(c->ctx, x, &v);
    if (rc == GC_OK && !isfinite(v))
        rc = GC_ERR_INFEASIBLE;
    if (rc == GC_OK)
        *y = v;
    else if (rc == GC_ERR_INFEASIBLE)
        c->infeasible++;
    else
        c->abort_code = rc;
    return rc;
}

/* ---- Brent's root finder (Brent 1973, ch. 4) ----------------------------- */

/* g(x) = f(x) - target; ga, gb of opposite signs or one zero. On budget
 * exhaustion the best estimate so far is returned with GC_OK. */
static int root_impl(caller *c, double target, double a, double b, double ga, double gb,
                     double x_tol, double *xr, double *yr)
{
    if (ga == 0.0) {
        *xr = a;
        *yr = ga + target;
        return GC_OK;
    }
    if (gb == 0.0) {
        *xr = b;
        *yr = gb + target;
        return GC_OK;
    }
    if ((ga > 0.0) == (gb > 0.0))
        return GC_ERR_INVALID;
    /* b is the best estimate, a the previous one, cc the counterpoint:
     * the root always lies between b and cc. */
    double cc = a, gc = ga;
    double d = b - a, e = d;
    for (;;) {
        if ((gb > 0.0) == (gc > 0.0)) {
            cc = a;
            gc = ga;
            d = e = b - a;
        }
        if (fabs(gc) < fabs(gb)) {
            a = b;
            b = cc;
            cc = a;
            ga = gb;
            gb = gc;
            gc = ga;
        }
        double tol1 = 4.0 * DBL_EPSILON * fabs(b) + 0.5 * x_tol;
        double xm = 0.5 * (cc - b);
        if (fabs(xm) <= tol1 || gb == 0.0)
            break;
        if (fabs(e) >= tol1 && fabs(ga) > fabs(gb)) {
            /* interpolation: secant when only two distinct points, else
             * inverse quadratic through a, b, cc */
            double s = gb / ga, p, q;
            if (a == cc) {
                p = 2.0 * xm * s;
                q = 1.0 - s;
            } else {
                double qq = ga / gc, r = gb / gc;
                p = s * (2.0 * xm * qq * (qq - r) - (b - a) * (r - 1.0));
                q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if (p > 0.0)
                q = -q;
            else
                p = -p;
            double lim1 = 3.0 * xm * q - fabs(tol1 * q);
            double lim2 = fabs(e * q);
            if (2.0 * p < (lim1 < lim2 ? lim1 : lim2)) {
                e = d;          /* accept the interpolation */
                d = p / q;
            } else {
                d = xm;         /* bisection */
                e = d;
            }
        } else {
            d = xm;
            e = d;
        }
        a = b;
        ga = gb;
        b += fabs(d) > tol1 ? d : (xm > 0.0 ? tol1 : -tol1);
        double y = 0.0;
        int rc = call(c, b, &y);
        if (rc == GC_ERR_NOCONV) {
            b = a;      /* keep the last evaluated estimate */
            gb = ga;
            break;
        }
        if (rc != GC_OK)
            return rc;
        gb = y - target;
    }
    *xr = b;
    *yr = gb + target;
    return GC_OK;
}

/* ---- Brent's minimisation (Brent 1973, ch. 5) ---------------------------- */

/* Minimises sign * f on [a, b] from x0 (f(x0) = y0 known, x0 in [a, b]).
 * Points without a value are worse than any value. */
static int min_impl(caller *c, int sign, double a, double b, double x0, double y0,
                    double x_tol, double *xr, double *yr)
{
    const double golden = 0.5 * (3.0 - sqrt(5.0));   /* (3 - sqrt 5) / 2 */
    const double rel = sqrt(DBL_EPSILON);
    double x = x0, w = x0, v = x0;
    double fx = sign * y0, fw = fx, fv = fx;
    double d = 0.0, e = 0.0;
    while (b - a > 0.0) {
        double m = 0.5 * (a + b);
        double tol1 = rel * fabs(x) + x_tol / 3.0;
        double t2 = 2.0 * tol1;
        if (fabs(x - m) <= t2 - 0.5 * (b - a))
            break;
        int parabolic = 0;
        if (fabs(e) > tol1 && isfinite(fw) && isfinite(fv)) {
            double r = (x - w) * (fx - fv);
            double q = (x - v) * (fx - fw);
            double p = (x - v) * q - (x - w) * r;
            q = 2.0 * (q - r);
            if (q > 0.0)
                p = -p;
            else
                q = -q;
            double etemp = e;
            if (fabs(p) < fabs(0.5 * q * etemp) && p > q * (a - x) && p < q * (b - x)) {
                e = d;
                d = p / q;
                double u = x + d;
                if (u - a < t2 || b - u < t2)
                    d = x < m ? tol1 : -tol1;
                parabolic = 1;
            }
        }
        if (!parabolic) {
            e = (x < m ? b : a) - x;
            d = golden * e;
        }
        double u = x + (fabs(d) >= tol1 ? d : (d > 0.0 ? tol1 : -tol1));
        if (u < a)
            u = a;
        if (u > b)
            u = b;
        double y = 0.0, fu;
        int rc = call(c, u, &y);
        if (rc == GC_ERR_NOCONV)
            break;
        if (rc == GC_OK)
            fu = sign * y;
        else if (rc == GC_ERR_INFEASIBLE)
            fu = HUGE_VAL;
        else
            return rc;
        if (fu <= fx) {
            if (u < x)
                b = x;
            else
                a = x;
            v = w;
            fv = fw;
            w = x;
            fw = fx;
            x = u;
            fx = fu;
        } else {
            if (u < x)
                a = u;
            else
                b = u;
            if (fu <= fw || w == x) {
                v = w;
                fv = fw;
                w = u;
                fw = fu;
            } else if (fu <= fv || v == x || v == w) {
                v = u;
                fv = fu;
            }
        }
    }
    *xr = x;
    *yr = sign * fx;
    return GC_OK;
}

/* ---- public single steps ----------------------------------------------- */

int gc_solve_root(gc_solve_fn f, void *ctx, double target, double a, double b, double ga,
                  double gb, double x_tol, int max_evals, double *x, double *y, int *evals)
{
    caller c = { .f = f, .ctx = ctx, .max_evals = max_evals };
    if (!f || !x || !y || !(x_tol > 0.0) || !isfinite(a) || !isfinite(b) || !isfinite(ga) ||
        !isfinite(gb))
        return GC_ERR_INVALID;
    int rc = root_impl(&c, target, a, b, ga, gb, x_tol, x, y);
    if (evals)
        *evals = c.evals;
    return rc;
}

int gc_solve_minimize(gc_solve_fn f, void *ctx, int sign, double a, double b, double x0,
                      double y0, double x_tol, int max_evals, double *x, double *y, int *evals)
{
    caller c = { .f = f, .ctx = ctx, .max_evals = max_evals };
    if (!f || !x || !y || (sign != 1 && sign != -1) || !(x_tol > 0.0) || !isfinite(a) ||
        !isfinite(b) || !(a <= x0 && x0 <= b) || !isfinite(y0))
        return GC_ERR_INVALID;
    int rc = min_impl(&c, sign, a, b, x0, y0, x_tol, x, y);
    if (evals)
        *evals = c.evals;
    return rc;
}

/* ---- the whole solve ----------------------------------------------------- */

void gc_solve_options_init(gc_solve_options *o, double lo, double hi)
{
    memset(o, 0, sizeof *o);
    o->lo = lo;
    o->hi = hi;
    o->scan_points = 25;
    o->log_spacing = 0;
    o->x_tol = 1e-10 * fabs(hi - lo);
    o->max_evals = 400;
}

typedef struct solve_state {
    caller c;
    point p[GC_SOLVE_MAX_SCAN];
    int n;
    double lo, hi, x_tol;
} solve_state;

/* Inserts a point in x order (an x already held is not repeated). */
static void insert_point(solve_state *s, double x, double y, int ok, int edge)
{
    if (s->n >= GC_SOLVE_MAX_SCAN)
        return;
    int i = 0;
    while (i < s->n && s->p[i].x < x)
        i++;
    if (i < s->n && s->p[i].x == x)
        return;
    memmove(&s->p[i + 1], &s->p[i], (size_t)(s->n - i) * sizeof s->p[0]);
    s->p[i] = (point){ .x = x, .y = y, .ok = ok, .edge = edge };
    s->n++;
}

/* Bisects between a point with a value and one without down to x_tol;
 * the last point with a value is the edge. */
static int locate_edge(solve_state *s, double x_ok, double y_ok, double x_bad, double *xe,
                       double *ye)
{
    while (fabs(x_bad - x_ok) > s->x_tol) {
        double m = 0.5 * (x_ok + x_bad), y = 0.0;
        if (m == x_ok || m == x_bad)
            break;
        int rc = call(&s->c, m, &y);
        if (rc == GC_OK) {
            x_ok = m;
            y_ok = y;
        } else if (rc == GC_ERR_INFEASIBLE) {
            x_bad = m;
        } else if (rc == GC_ERR_NOCONV) {
            break;
        } else {
            return rc;
        }
    }
    *xe = x_ok;
    *ye = y_ok;
    return GC_OK;
}

static int where_of(const solve_state *s, const point *pt)
{
    if (pt->x == s->lo)
        return GC_SOLVE_AT_LOWER;
    if (pt->x == s->hi)
        return GC_SOLVE_AT_UPPER;
    if (pt->edge)
        return GC_SOLVE_AT_FEASIBILITY_EDGE;
    return GC_SOLVE_INTERIOR;
}

/* Index of the best held point for sign (+1 smallest, -1 largest), or -1. */
static int best_index(const solve_state *s, int sign)
{
    int best = -1;
    for (int i = 0; i < s->n; i++)
        if (s->p[i].ok && (best < 0 || sign * s->p[i].y < sign * s->p[best].y))
            best = i;
    return best;
}

/* Refines the extreme (sign +1 min, -1 max) between the neighbours of the
 * best held point and inserts the refined point. */
static int refine_extreme(solve_state *s, int sign)
{
    int i = best_index(s, sign);
    if (i < 0)
        return GC_OK;
    double a = (i > 0 && s->p[i - 1].ok) ? s->p[i - 1].x : s->p[i].x;
    double b = (i + 1 < s->n && s->p[i + 1].ok) ? s->p[i + 1].x : s->p[i].x;
    if (!(b > a))
        return GC_OK;
    double tol = s->x_tol;
    double floor_tol = MIN_TOL_FRACTION * (s->hi - s->lo);
    if (tol < floor_tol)
        tol = floor_tol;
    double x = s->p[i].x, y = s->p[i].y;
    int rc = min_impl(&s->c, sign, a, b, s->p[i].x, s->p[i].y, tol, &x, &y);
    if (rc != GC_OK)
        return rc;
    if (sign * y < sign * s->p[i].y)
        insert_point(s, x, y, 1, 0);
    return GC_OK;
}

static void fill_extreme(const solve_state *s, int sign, gc_solve_extreme *ex)
{
    int i = best_index(s, sign);
    memset(ex, 0, sizeof *ex);
    if (i < 0)
        return;
    ex->found = 1;
    ex->x = s->p[i].x;
    ex->y = s->p[i].y;
    ex->where = where_of(s, &s->p[i]);
}

static int check_options(const gc_solve_options *o, gc_error *err)
{
    if (!isfinite(o->lo) || !isfinite(o->hi))
        return gc_error_set(err, GC_ERR_INVALID, "/lower", "the bounds must be finite");
    if (!(o->lo < o->hi))
        return gc_error_set(err, GC_ERR_INVALID, "/upper",
                            "the upper bound must be greater than the lower bound");
    if (o->scan_points < 3 || o->scan_points > GC_SOLVE_MAX_SCAN - 8)
        return gc_error_set(err, GC_ERR_INVALID, "/scan_points", "must be between 3 and %d",
                            GC_SOLVE_MAX_SCAN - 8);
    if (o->log_spacing && !(o->lo > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/spacing",
                            "log spacing needs a lower bound greater than 0");
    if (!(o->x_tol > 0.0) || !isfinite(o->x_tol))
        return gc_error_set(err, GC_ERR_INVALID, "/x_tolerance", "must be greater than 0");
    if (o->max_evals < o->scan_points)
        return gc_error_set(err, GC_ERR_INVALID, "/max_evaluations",
                            "must allow at least the scan points");
    return GC_OK;
}

static int scan(solve_state *s, const gc_solve_options *o)
{
    int n = o->scan_points;
    double l0 = o->log_spacing ? log(o->lo) : 0.0, l1 = o->log_spacing ? log(o->hi) : 0.0;
    for (int i = 0; i < n; i++) {
        double t = (double)i / (double)(n - 1), x;
        if (i == 0)
            x = o->lo;
        else if (i == n - 1)
            x = o->hi;
        else if (o->log_spacing)
            x = exp(l0 + (l1 - l0) * t);
        else
            x = o->lo + (o->hi - o->lo) * t;
        double y = 0.0;
        int rc = call(&s->c, x, &y);
        if (rc != GC_OK && rc != GC_ERR_INFEASIBLE)
            return rc;
        insert_point(s, x, rc == GC_OK ? y : 0.0, rc == GC_OK, 0);
    }
    /* feasibility edges between neighbours with and without a value */
    int edges = 0;
    for (int i = 0; i + 1 < s->n && edges < MAX_EDGES; i++) {
        point a = s->p[i], b = s->p[i + 1];
        if (a.ok == b.ok || a.edge || b.edge)
            continue;
        double xe, ye;
        int rc = a.ok ? locate_edge(s, a.x, a.y, b.x, &xe, &ye)
                      : locate_edge(s, b.x, b.y, a.x, &xe, &ye);
        if (rc != GC_OK)
            return rc;
        edges++;
        point *ok = a.ok ? &s->p[i] : &s->p[i + 1];
        if (xe == ok->x)
            ok->edge = 1;
        else
            insert_point(s, xe, ye, 1, 1);
        i++;    /* skip past the inserted edge */
    }
    return GC_OK;
}

/* equal: roots between neighbours with values of opposite sign. */
static int find_roots(solve_state *s, double target, gc_solve_result *res)
{
    for (int i = 0; i < s->n; i++) {
        const point *a = &s->p[i];
        if (!a->ok)
            continue;
        double ga = a->y - target;
        if (ga == 0.0) {
            if (res->n_roots < GC_SOLVE_MAX_ROOTS) {
                res->roots[res->n_roots] = a->x;
                res->root_y[res->n_roots++] = a->y;
            } else
                res->ranges_truncated = 1;
            continue;
        }
        if (i + 1 >= s->n || !s->p[i + 1].ok)
            continue;
        const point *b = &s->p[i + 1];
        double gb = b->y - target;
        if (gb == 0.0 || (ga > 0.0) == (gb > 0.0))
            continue;
        if (res->n_roots >= GC_SOLVE_MAX_ROOTS) {
            res->ranges_truncated = 1;
            continue;
        }
        double x, y;
        int rc = root_impl(&s->c, target, a->x, b->x, ga, gb, s->x_tol, &x, &y);
        if (rc == GC_ERR_INFEASIBLE)
            continue;
        if (rc != GC_OK)
            return rc;
        res->roots[res->n_roots] = x;
        res->root_y[res->n_roots++] = y;
    }
    return GC_OK;
}

/* at_least (sign +1) / at_most (sign -1): sub-ranges meeting the goal. */
static int find_ranges(solve_state *s, double target, int sign, gc_solve_result *res)
{
    int in = 0;
    double from = 0.0, from_y = 0.0;
    for (int i = 0; i < s->n; i++) {
        const point *pt = &s->p[i];
        int met = pt->ok && sign * (pt->y - target) >= 0.0;
        if (met && !in) {
            from = pt->x;
            from_y = pt->y;
            if (i > 0 && s->p[i - 1].ok) {   /* crossing from an unmet neighbour */
                const point *q = &s->p[i - 1];
                double x, y;
                int rc = root_impl(&s->c, target, q->x, pt->x, q->y - target, pt->y - target,
                                   s->x_tol, &x, &y);
                if (rc != GC_OK && rc != GC_ERR_INFEASIBLE)
                    return rc;
                if (rc == GC_OK) {
                    from = x;
                    from_y = y;
                }
            }
            in = 1;
        } else if (!met && in) {
            double to = s->p[i - 1].x, to_y = s->p[i - 1].y;
            if (pt->ok) {
                const point *q = &s->p[i - 1];
                double x, y;
                int rc = root_impl(&s->c, target, q->x, pt->x, q->y - target, pt->y - target,
                                   s->x_tol, &x, &y);
                if (rc != GC_OK && rc != GC_ERR_INFEASIBLE)
                    return rc;
                if (rc == GC_OK) {
                    to = x;
                    to_y = y;
                }
            }
            if (res->n_ranges < GC_SOLVE_MAX_RANGES) {
                res->ranges[res->n_ranges][0] = from;
                res->ranges[res->n_ranges][1] = to;
                res->range_y[res->n_ranges][0] = from_y;
                res->range_y[res->n_ranges][1] = to_y;
                res->n_ranges++;
            } else {
                res->ranges_truncated = 1;
            }
            in = 0;
        }
    }
    if (in) {
        if (res->n_ranges < GC_SOLVE_MAX_RANGES) {
            res->ranges[res->n_ranges][0] = from;
            res->ranges[res->n_ranges][1] = s->p[s->n - 1].x;
            res->range_y[res->n_ranges][0] = from_y;
            res->range_y[res->n_ranges][1] = s->p[s->n - 1].y;
            res->n_ranges++;
        } else {
            res->ranges_truncated = 1;
        }
    }
    return GC_OK;
}

/* Which extremes a goal needs refined: the maximum, the minimum (equal: the
 * one the target lies beyond, when the scan never reaches it). */
static void extremes_needed(const solve_state *s, gc_solve_goal goal, double target,
                            int *need_max, int *need_min)
{
    *need_max = goal == GC_SOLVE_MAXIMIZE || goal == GC_SOLVE_AT_LEAST;
    *need_min = goal == GC_SOLVE_MINIMIZE || goal == GC_SOLVE_AT_MOST;
    if (goal != GC_SOLVE_EQUAL)
        return;
    int above = 0, below = 0;
    for (int i = 0; i < s->n; i++) {
        if (!s->p[i].ok)
            continue;
        if (s->p[i].y >= target)
            above = 1;
        if (s->p[i].y <= target)
            below = 1;
    }
    *need_max = !above;   /* target above every value: can the peak reach it? */
    *need_min = !below;
}

/* The answer: met or not, the input and output, where it lies. */
static void answer(const solve_state *s, gc_solve_goal goal, double target,
                   gc_solve_result *res)
{
    const gc_solve_extreme *best = NULL;
    switch (goal) {
    case GC_SOLVE_EQUAL:
        if (res->n_roots > 0) {
            res->met = 1;
            res->x = res->roots[0];
            res->y = res->root_y[0];
        } else {
            best = (res->max.found && res->max.y < target) ? &res->max : &res->min;
        }
        break;
    case GC_SOLVE_AT_LEAST:
    case GC_SOLVE_AT_MOST:
        if (res->n_ranges > 0) {
            res->met = 1;
            res->x = res->ranges[0][0];
            res->y = res->range_y[0][0];
        } else {
            best = goal == GC_SOLVE_AT_LEAST ? &res->max : &res->min;
        }
        break;
    case GC_SOLVE_MAXIMIZE:
        res->met = 1;
        best = &res->max;
        break;
    case GC_SOLVE_MINIMIZE:
        res->met = 1;
        best = &res->min;
        break;
    }
    if (best) {
        res->x = best->x;
        res->y = best->y;
        res->where = best->where;
    } else {
        res->where = res->x == s->lo ? GC_SOLVE_AT_LOWER
                   : res->x == s->hi ? GC_SOLVE_AT_UPPER : GC_SOLVE_INTERIOR;
    }
}

/* After the scan: the extremes, the roots or ranges, the answer. */
static int solve_scanned(solve_state *s, gc_solve_goal goal, double target,
                         gc_solve_result *res)
{
    int need_max, need_min, rc = GC_OK;
    extremes_needed(s, goal, target, &need_max, &need_min);
    if (need_max && (rc = refine_extreme(s, -1)) != GC_OK)
        return rc;
    if (need_min && (rc = refine_extreme(s, 1)) != GC_OK)
        return rc;
    if (goal == GC_SOLVE_EQUAL)
        rc = find_roots(s, target, res);
    else if (goal == GC_SOLVE_AT_LEAST)
        rc = find_ranges(s, target, 1, res);
    else if (goal == GC_SOLVE_AT_MOST)
        rc = find_ranges(s, target, -1, res);
    if (rc != GC_OK)
        return rc;
    fill_extreme(s, -1, &res->max);
    fill_extreme(s, 1, &res->min);
    answer(s, goal, target, res);
    return GC_OK;
}

int gc_solve_target(gc_solve_fn f, void *ctx, const gc_solve_options *opt, gc_solve_goal goal,
                    double target, gc_solve_result *res, gc_error *err)
{
    if (!f || !opt || !res)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "missing argument");
    memset(res, 0, sizeof *res);
    int rc = check_options(opt, err);
    if (rc != GC_OK)
        return rc;
    if (goal < GC_SOLVE_EQUAL || goal > GC_SOLVE_MINIMIZE)
        return gc_error_set(err, GC_ERR_INVALID, "/goal", "unknown goal");
    if ((goal == GC_SOLVE_EQUAL || goal == GC_SOLVE_AT_LEAST || goal == GC_SOLVE_AT_MOST) &&
        !isfinite(target))
        return gc_error_set(err, GC_ERR_INVALID, "/value", "the target must be finite");

    /* about 20 KB: on the stack of the caller's thread, like a cycle result's parts */
    solve_state s;
    memset(&s.c, 0, sizeof s.c);
    s.c.f = f;
    s.c.ctx = ctx;
    s.c.max_evals = opt->max_evals;
    s.n = 0;
    s.lo = opt->lo;
    s.hi = opt->hi;
    s.x_tol = opt->x_tol;

    rc = scan(&s, opt);
    for (int i = 0; i < s.n; i++)
        if (s.p[i].ok && !s.p[i].edge)
            res->n_scan_feasible++;
    res->n_scan = opt->scan_points;
    if (rc == GC_OK && best_index(&s, 1) < 0) {
        res->n_evals = s.c.evals;
        res->n_infeasible = s.c.infeasible;
        return gc_error_set(err, GC_ERR_INFEASIBLE, NULL,
                            "no input value of the range can be evaluated");
    }
    if (rc == GC_OK)
        rc = solve_scanned(&s, goal, target, res);
    res->n_evals = s.c.evals;
    res->n_infeasible = s.c.infeasible;
    if (rc == GC_OK) {
        res->budget_exhausted = s.c.exhausted;
        return GC_OK;
    }
    if (rc == GC_ERR_NOCONV && s.c.exhausted)
        return gc_error_set(err, GC_ERR_NOCONV, "/max_evaluations",
                            "the evaluation budget ran out during the scan");
    return gc_error_set(err, rc, NULL, "an evaluation failed: %s", gc_strerror(rc));
}
