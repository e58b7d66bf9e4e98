/*
 * test_solve.c — the one-dimensional solver (solve.h): Brent's root finder
 * and minimisation on functions with known roots and extremes, the bracket
 * scan with infeasible regions, unreachable targets reported with the best
 * value, and closed forms of the cold-air standard through the real cycle
 * engine (the Otto compression ratio for a target efficiency,
 * r = (1 - eta)^(1 / (1 - k)); the Brayton pressure ratio for a target
 * efficiency, rp = (1 - eta)^(-k / (k - 1)); the Brayton efficiency with
 * component losses, whose maximum over the pressure ratio is checked
 * against a dense evaluation of its closed form).
 */
#include "check.h"
#include "gascycle/piston.h"
#include "gascycle/solve.h"

#include <math.h>
#include <stdlib.h>

/* ---- analytic functions ---------------------------------------------------- */

typedef struct counter { int calls; } counter;

static int f_cubic(void *ctx, double x, double *y)
{
    ((counter *)ctx)->calls++;
    *y = x * x * x - 2.0 * x - 5.0;   /* root 2.0945514815423265 (Wallis' cubic, from memory) */
    return GC_OK;
}

static int f_parabola(void *ctx, double x, double *y)
{
    (void)ctx;
    *y = 3.0 - (x - 1.7) * (x - 1.7);  /* maximum 3 at x = 1.7 */
    return GC_OK;
}

/* defined only on x <= 2.5; increasing, so its maximum is at the edge */
static int f_edge(void *ctx, double x, double *y)
{
    (void)ctx;
    if (x > 2.5)
        return GC_ERR_INFEASIBLE;
    *y = x;
    return GC_OK;
}

static int f_sine(void *ctx, double x, double *y)
{
    (void)ctx;
    *y = sin(x);
    return GC_OK;
}

static int f_abort(void *ctx, double x, double *y)
{
    (void)ctx;
    (void)x;
    *y = 0.0;
    return GC_ERR_NOMEM;
}

static int f_nan(void *ctx, double x, double *y)
{
    (void)ctx;
    *y = x < 0.5 ? NAN : x;
    return GC_OK;
}

static void test_root_brent(void)
{
    counter c = { 0 };
    double x, y;
    int evals = 0;
    double ya, yb;
    f_cubic(&c, 2.0, &ya);
    f_cubic(&c, 3.0, &yb);
    c.calls = 0;
    CU_ASSERT_EQUAL(gc_solve_root(f_cubic, &c, 0.0, 2.0, 3.0, ya, yb, 1e-14, 100, &x, &y, &evals),
                    GC_OK);
    CHECK_REL(x, 2.0945514815423265, 1e-13, "real root of x^3 - 2x - 5 (from memory)");
    CU_ASSERT(evals == c.calls);
    CU_ASSERT(evals < 15);  /* superlinear: bisection alone would need about 47 */
    CU_ASSERT_EQUAL(gc_solve_root(f_cubic, &c, 0.0, 2.0, 2.05, ya, -0.5, 1e-14, 100, &x, &y,
                                  &evals), GC_ERR_INVALID);   /* no sign change */
}

static void test_minimize_brent(void)
{
    double x, y;
    int evals = 0;
    double y0;
    f_parabola(NULL, 1.0, &y0);
    CU_ASSERT_EQUAL(gc_solve_minimize(f_parabola, NULL, -1, 0.0, 4.0, 1.0, y0, 1e-9, 100, &x,
                                      &y, &evals), GC_OK);
    CHECK_REL(x, 1.7, 1e-7, "vertex of 3 - (x - 1.7)^2");
    CHECK_REL(y, 3.0, 1e-13, "vertex of 3 - (x - 1.7)^2");
    CU_ASSERT(evals < 20);  /* a parabola is fitted exactly */
}

static void test_target_equal_and_unreachable(void)
{
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    gc_solve_options_init(&o, 0.0, 4.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 2.0, &r, &err), GC_OK);
    CU_ASSERT(r.met);
    CU_ASSERT_EQUAL(r.n_roots, 2);
    CHECK_REL(r.roots[0], 0.7, 1e-9, "3 - (x - 1.7)^2 = 2 at x = 1.7 - 1");
    CHECK_REL(r.roots[1], 2.7, 1e-9, "3 - (x - 1.7)^2 = 2 at x = 1.7 + 1");
    CHECK_REL(r.x, 0.7, 1e-9, "lowest root");
    CHECK_REL(r.y, 2.0, 1e-9, "value at the root");

    /* 3.5 is above the maximum: not met, best value 3 at 1.7 (interior) */
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 3.5, &r, &err), GC_OK);
    CU_ASSERT_FALSE(r.met);
    CU_ASSERT_EQUAL(r.n_roots, 0);
    CHECK_REL(r.x, 1.7, 1e-6, "vertex");
    CHECK_REL(r.y, 3.0, 1e-12, "vertex value");
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_INTERIOR);
    CU_ASSERT(r.max.found);

    /* 2.9999999 is just below the peak, between scan points: the refined
     * maximum reveals the two close roots */
    gc_solve_options_init(&o, 0.0, 4.0);
    o.scan_points = 4;   /* scan at 0, 4/3, 8/3, 4: no value above 2.87 */
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 2.99, &r, &err), GC_OK);
    CU_ASSERT(r.met);
    CU_ASSERT_EQUAL(r.n_roots, 2);
    CHECK_REL(r.roots[0], 1.7 - 0.1, 1e-9, "3 - (x - 1.7)^2 = 2.99");
    CHECK_REL(r.roots[1], 1.7 + 0.1, 1e-9, "3 - (x - 1.7)^2 = 2.99");

    /* below every value: best is the minimum, at the upper bound */
    gc_solve_options_init(&o, 0.0, 4.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, -10.0, &r, &err),
                    GC_OK);
    CU_ASSERT_FALSE(r.met);
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_AT_UPPER);
    CHECK_REL(r.x, 4.0, 0.0, "upper bound");
    CHECK_REL(r.y, 3.0 - 2.3 * 2.3, 1e-12, "value at the upper bound");
}

static void test_target_inequalities(void)
{
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    gc_solve_options_init(&o, 0.0, 4.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_AT_LEAST, 2.0, &r, &err),
                    GC_OK);
    CU_ASSERT(r.met);
    CU_ASSERT_EQUAL(r.n_ranges, 1);
    CHECK_REL(r.ranges[0][0], 0.7, 1e-9, "range start");
    CHECK_REL(r.ranges[0][1], 2.7, 1e-9, "range end");
    CHECK_REL(r.x, 0.7, 1e-9, "lowest x meeting it");
    CHECK_REL(r.max.x, 1.7, 1e-6, "best value reached at the vertex");

    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_AT_MOST, 2.0, &r, &err),
                    GC_OK);
    CU_ASSERT(r.met);
    CU_ASSERT_EQUAL(r.n_ranges, 2);
    CHECK_REL(r.ranges[0][0], 0.0, 0.0, "from the lower bound");
    CHECK_REL(r.ranges[0][1], 0.7, 1e-9, "to the first crossing");
    CHECK_REL(r.ranges[1][0], 2.7, 1e-9, "from the second crossing");
    CHECK_REL(r.ranges[1][1], 4.0, 0.0, "to the upper bound");

    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_AT_LEAST, 3.2, &r, &err),
                    GC_OK);
    CU_ASSERT_FALSE(r.met);
    CHECK_REL(r.y, 3.0, 1e-12, "best achievable");

    /* many roots: sin on [0.1, 30] has 9 zeros; 8 are held, truncation said */
    gc_solve_options_init(&o, 0.1, 30.0);
    o.scan_points = 120;
    CU_ASSERT_EQUAL(gc_solve_target(f_sine, NULL, &o, GC_SOLVE_EQUAL, 0.0, &r, &err), GC_OK);
    CU_ASSERT_EQUAL(r.n_roots, GC_SOLVE_MAX_ROOTS);
    CU_ASSERT(r.ranges_truncated);
    for (int i = 0; i < r.n_roots; i++)
        CHECK_REL(r.roots[i], (i + 1) * M_PI, 1e-9, "zeros of sin at k pi");
}

static void test_target_feasibility(void)
{
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    gc_solve_options_init(&o, 0.0, 4.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_edge, NULL, &o, GC_SOLVE_MAXIMIZE, 0.0, &r, &err), GC_OK);
    CU_ASSERT(r.met);
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_AT_FEASIBILITY_EDGE);
    CHECK_REL(r.x, 2.5, 1e-8, "edge of the defined region");
    CU_ASSERT(r.n_infeasible > 0);

    /* a target beyond the edge: not met, best at the edge */
    CU_ASSERT_EQUAL(gc_solve_target(f_edge, NULL, &o, GC_SOLVE_EQUAL, 3.0, &r, &err), GC_OK);
    CU_ASSERT_FALSE(r.met);
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_AT_FEASIBILITY_EDGE);
    CHECK_REL(r.y, 2.5, 1e-8, "largest value before the edge");

    /* NaN counts as no value */
    gc_solve_options_init(&o, 0.0, 1.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_nan, NULL, &o, GC_SOLVE_MINIMIZE, 0.0, &r, &err), GC_OK);
    CHECK_REL(r.x, 0.5, 1e-8, "first x with a value");

    /* nowhere defined */
    gc_solve_options_init(&o, 3.0, 4.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_edge, NULL, &o, GC_SOLVE_EQUAL, 3.0, &r, &err),
                    GC_ERR_INFEASIBLE);

    /* an aborting callback stops the solve with its code */
    gc_solve_options_init(&o, 0.0, 1.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_abort, NULL, &o, GC_SOLVE_EQUAL, 0.0, &r, &err),
                    GC_ERR_NOMEM);
}

static void test_options(void)
{
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    gc_solve_options_init(&o, 2.0, 1.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 0.0, &r, &err),
                    GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/upper");
    gc_solve_options_init(&o, -1.0, 1.0);
    o.log_spacing = 1;
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 0.0, &r, &err),
                    GC_ERR_INVALID);
    gc_solve_options_init(&o, 0.0, 1.0);
    o.scan_points = 2;
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 0.0, &r, &err),
                    GC_ERR_INVALID);
    gc_solve_options_init(&o, 0.0, 1.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, NAN, &r, &err),
                    GC_ERR_INVALID);
    /* budget: the answer is still given, the flag says it was cut short */
    gc_solve_options_init(&o, 0.0, 4.0);
    o.max_evals = 26;
    CU_ASSERT_EQUAL(gc_solve_target(f_parabola, NULL, &o, GC_SOLVE_EQUAL, 2.0, &r, &err), GC_OK);
    CU_ASSERT(r.budget_exhausted);
    CU_ASSERT(r.n_evals <= 26);
}

/* ---- closed forms through the cycle engine --------------------------------- */

typedef struct otto_ctx {
    gc_piston_result *res;
    double k;
} otto_ctx;

/* cold-air Otto efficiency at compression ratio x (peak 2000 K) */
static int f_otto(void *ctx, double x, double *y)
{
    otto_ctx *c = ctx;
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_OTTO);
    if (gc_gas_init_cold(&in.gas, 1005.0, c->k, NULL) != GC_OK)
        return GC_ERR_INVALID;
    in.compression_ratio = x;
    in.peak_temperature = 2000.0;
    int rc = gc_piston_evaluate(&in, c->res, NULL);
    if (rc != GC_OK)
        return GC_ERR_INFEASIBLE;
    *y = c->res->cycle.actual.summary.thermal_efficiency;
    return GC_OK;
}

static void test_otto_closed_form(void)
{
    otto_ctx c = { .res = malloc(sizeof(gc_piston_result)), .k = 1.4 };
    CU_ASSERT_FATAL(c.res != NULL);
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    const double etas[] = { 0.45, 0.5, 0.6 };
    for (int i = 0; i < 3; i++) {
        gc_solve_options_init(&o, 2.0, 40.0);
        CU_ASSERT_EQUAL(gc_solve_target(f_otto, &c, &o, GC_SOLVE_EQUAL, etas[i], &r, &err),
                        GC_OK);
        CU_ASSERT(r.met);
        CU_ASSERT_EQUAL(r.n_roots, 1);
        CHECK_REL(r.x, pow(1.0 - etas[i], 1.0 / (1.0 - 1.4)), 1e-9,
                  "cold-air Otto: eta = 1 - r^(1 - k) solved for r");
        CU_ASSERT(r.n_evals < 60);
    }
    /* 0.8 needs r = 55.9 > 40: not met, best at the upper bound */
    gc_solve_options_init(&o, 2.0, 40.0);
    CU_ASSERT_EQUAL(gc_solve_target(f_otto, &c, &o, GC_SOLVE_EQUAL, 0.8, &r, &err), GC_OK);
    CU_ASSERT_FALSE(r.met);
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_AT_UPPER);
    CHECK_REL(r.y, 1.0 - pow(40.0, 1.0 - 1.4), 1e-9, "cold-air Otto efficiency at r = 40");
    free(c.res);
}

/* cold-air Brayton with component efficiencies (closed form for the check):
 * tau = rp^((k-1)/k), T2 = T1 (1 + (tau - 1)/eta_c), w_c = cp (T2 - T1),
 * w_t = cp T3 eta_t (1 - 1/tau), eta = (w_t - w_c) / (cp (T3 - T2)). */
static double brayton_eta(double rp, double k, double T1, double T3, double ec, double et)
{
    double tau = pow(rp, (k - 1.0) / k);
    double T2 = T1 * (1.0 + (tau - 1.0) / ec);
    return (T3 * et * (1.0 - 1.0 / tau) - (T2 - T1)) / (T3 - T2);
}

typedef struct brayton_ctx { double ec, et; } brayton_ctx;

static int f_brayton(void *ctx, double x, double *y)
{
    const brayton_ctx *c = ctx;
    double tau = pow(x, 0.4 / 1.4);
    if (288.15 * (1.0 + (tau - 1.0) / c->ec) >= 1400.0)
        return GC_ERR_INFEASIBLE;   /* compressor exit above the turbine inlet */
    *y = brayton_eta(x, 1.4, 288.15, 1400.0, c->ec, c->et);
    return GC_OK;
}

static void test_brayton_closed_form(void)
{
    gc_solve_options o;
    gc_solve_result r;
    gc_error err;
    brayton_ctx ideal = { 1.0, 1.0 };
    gc_solve_options_init(&o, 1.5, 60.0);
    o.log_spacing = 1;
    CU_ASSERT_EQUAL(gc_solve_target(f_brayton, &ideal, &o, GC_SOLVE_EQUAL, 0.5, &r, &err), GC_OK);
    CU_ASSERT(r.met);
    CHECK_REL(r.x, pow(1.0 - 0.5, -1.4 / 0.4), 1e-9,
              "cold-air Brayton: eta = 1 - rp^(-(k-1)/k) solved for rp");

    /* with losses the efficiency peaks: 0.40 is out of reach */
    brayton_ctx lossy = { 0.85, 0.88 };
    CU_ASSERT_EQUAL(gc_solve_target(f_brayton, &lossy, &o, GC_SOLVE_EQUAL, 0.40, &r, &err),
                    GC_OK);
    CU_ASSERT_FALSE(r.met);
    CU_ASSERT_EQUAL(r.where, GC_SOLVE_INTERIOR);
    double best = -1.0, best_rp = 0.0;
    for (int i = 0; i <= 200000; i++) {
        double rp = 1.5 * pow(60.0 / 1.5, i / 200000.0);
        double e = brayton_eta(rp, 1.4, 288.15, 1400.0, 0.85, 0.88);
        if (e > best) {
            best = e;
            best_rp = rp;
        }
    }
    CHECK_REL(r.y, best, 1e-9, "maximum of the closed form by dense evaluation");
    CHECK_REL(r.x, best_rp, 1e-3, "pressure ratio of that maximum (flat peak)");
}

static const gc_test_case cases[] = {
    { "root_brent", test_root_brent },
    { "minimize_brent", test_minimize_brent },
    { "target_equal_and_unreachable", test_target_equal_and_unreachable },
    { "target_inequalities", test_target_inequalities },
    { "target_feasibility", test_target_feasibility },
    { "options", test_options },
    { "otto_closed_form", test_otto_closed_form },
    { "brayton_closed_form", test_brayton_closed_form },
    { NULL, NULL }
};

int main(void)
{
    return gc_run_suite("solve", cases);
}
