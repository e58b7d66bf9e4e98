/*
 * test_uncert.c — the uncertainty engine (uncert.h) against published
 * sources and closed forms; the source is named beside every check.
 *
 *   - coverage factors: quantiles of the normal and Student's t against
 *     python3-scipy (tests/reference/uncert_quantiles_scipy.csv) and the
 *     printed digits of JCGM 100:2008 (GUM) Table G.2 (from memory);
 *   - sensitivity coefficients against functions with known derivatives,
 *     central and Richardson, inside the domain, at its bounds and where
 *     the model refuses one side: 1e-6 relative required;
 *   - linear propagation against python3-uncertainties on closed-form cycle
 *     functions with and without correlations (cold-air Otto and Brayton
 *     efficiencies, an isentropic-efficiency reduction from four
 *     temperatures and two pressures; tests/reference/uncert_uncertainties.csv),
 *     1e-6 relative;
 *   - the budget's own algebra on a linear model with systematic and random
 *     parts (ASME PTC 19.1 practice) and Welch-Satterthwaite (GUM G.4.1);
 *   - GUM Annex H.1 (end-gauge calibration) and H.2 (simultaneous
 *     resistance and reactance, correlated inputs from the observations of
 *     Table H.2), typed from the published document as remembered: where a
 *     printed digit is uncertain, the check is the internal consistency;
 *   - Monte Carlo (JCGM 101:2008): a near-linear case against the linear
 *     result; y = x^2 against its chi-square distribution; the additive
 *     model of 9.2 against the closed-form distribution of a sum of
 *     rectangular variables; the mass calibration of 9.3 against its exact
 *     second moment and the printed results (from memory); tolerances are
 *     stated from the sample count; the same seed gives the same answer and
 *     1, 2 and 4 threads give identical answers; failed samples are counted;
 *   - the real Brayton preset (cold-air gas, component efficiencies)
 *     through the engine against the derivatives of its closed form;
 *   - bad inputs and options give GC_ERR_INVALID naming the field.
 */
#include "check.h"
#include "core/uncert_internal.h"
#include "gascycle/brayton.h"
#include "gascycle/uncert.h"
#include "refcsv.h"

#include <math.h>
#include <stdatomic.h>
#include <stddef.h>
#include <stdlib.h>
#include <string.h>

#define SRC_SCIPY "python3-scipy ndtri / refined t.ppf (tests/reference)"
#define SRC_UNC "python3-uncertainties (tests/reference/uncert_uncertainties.csv)"
#define SRC_G2 "JCGM 100:2008 Table G.2, printed digits (from memory)"
#define SRC_H1 "JCGM 100:2008 H.1 end-gauge calibration (from memory)"
#define SRC_H2 "JCGM 100:2008 H.2 Tables H.2, H.3 (from memory)"
#define SRC_101 "JCGM 101:2008"

static gc_uncert_linear_result LIN, LIN2;   /* ~150 KB each: static */
static gc_uncert_mc_result MC, MC2;
static gc_uncert_sens SENS;

static double worst_deriv[2], worst_unc_u, worst_unc_d, worst_q;

/* ---- helpers --------------------------------------------------------------- */

static gc_uncert_model model(gc_uncert_eval_fn f, void *ctx, int nx, int ny)
{
    gc_uncert_model m = { f, ctx, nx, ny, NULL, NULL };
    return m;
}

/* Relative error, or absolute below a floor. */
static double err_rel(double got, double want, double floor_)
{
    double s = fmax(fabs(want), floor_);
    return fabs(got - want) / s;
}

/* ---- quantiles ------------------------------------------------------------- */

static void test_quantiles_scipy(void)
{
    static double rows[400][REFCSV_MAX_COLS];
    int n = refcsv_read("tests/reference/uncert_quantiles_scipy.csv", 3, rows, 400);
    CU_ASSERT_FATAL(n > 100);
    for (int r = 0; r < n; r++) {
        double P = rows[r][0], nu = rows[r][1], want = rows[r][2];
        double got = nu == 0.0 ? gc_uncert_normal_quantile(P) : gc_uncert_t_quantile(P, nu);
        double e = err_rel(got, want, 1e-3);
        if (e > worst_q)
            worst_q = e;
        CHECK_REL(got, want, 2e-12, SRC_SCIPY);
    }
    printf("\n  quantiles: %d rows, worst relative error vs scipy %.2e\n", n, worst_q);
}

static void test_gum_table_g2(void)
{
    /* GUM Table G.2: t_p(nu) for p = 68.27, 90, 95, 95.45, 99, 99.73 %; the
     * columns 68.27, 95.45 and 99.73 % are those of k = 1, 2, 3 for the normal
     * distribution, i.e. exactly erf(k / sqrt 2) (235.80 at nu = 1 needs it) */
    const double p[6] = { erf(1.0 / M_SQRT2), 0.90, 0.95, erf(2.0 / M_SQRT2), 0.99,
                          erf(3.0 / M_SQRT2) };
    static const struct { double nu, t[6], half_ulp; } tab[] = {
        { 1, { 1.84, 6.31, 12.71, 13.97, 63.66, 235.80 }, 0.005 },
        { 10, { 1.05, 1.81, 2.23, 2.28, 3.17, 3.96 }, 0.005 },
        { 0, { 1.000, 1.645, 1.960, 2.000, 2.576, 3.000 }, 0.0005 },  /* nu = infinity */
    };
    for (size_t r = 0; r < sizeof tab / sizeof tab[0]; r++)
        for (int c = 0; c < 6; c++)
            CHECK_ABS(gc_uncert_coverage_factor(p[c], tab[r].nu), tab[r].t[c],
                      tab[r].half_ulp + 1e-9, SRC_G2);
    CHECK_ABS(gc_uncert_coverage_factor(0.99, 16), 2.92, 0.005, SRC_G2 " (nu = 16)");
    /* closed forms: nu = 1 Cauchy t = tan(pi (P - 1/2)); nu = 2 t = (2P - 1) / sqrt(2 P (1 - P)) */
    CHECK_REL(gc_uncert_t_quantile(0.9, 1), tan(M_PI * 0.4), 1e-14, "Cauchy quantile");
    CHECK_REL(gc_uncert_t_quantile(0.9, 2), 0.8 / sqrt(2 * 0.9 * 0.1), 1e-14, "t(2) quantile");
    CU_ASSERT(isnan(gc_uncert_normal_quantile(0.0)) && isnan(gc_uncert_t_quantile(1.0, 3)));
}

/* ---- building blocks ------------------------------------------------------- */

static void test_conversions(void)
{
    double u;
    /* GUM H.1: the certificate gives U = 0.075 um at k = 3, so u = 25 nm (from memory) */
    CU_ASSERT_EQUAL(gc_uncert_from_expanded(0.075e-6, 3.0, &u), GC_OK);
    CHECK_REL(u, 25e-9, 1e-14, "GUM 6.2.1 u = U / k; H.1 certificate");
    CU_ASSERT_EQUAL(gc_uncert_from_relative(0.0025, -1215.9, &u), GC_OK);
    CHECK_REL(u, 3.03975, 1e-14, "0.25 % of |x|");
    /* GUM 4.3.7: a rectangular half-width a gives u = a / sqrt 3 */
    CU_ASSERT_EQUAL(gc_uncert_from_half_width(0.05, &u), GC_OK);
    CHECK_REL(u, 0.05 / sqrt(3.0), 1e-15, "GUM 4.3.7");
    CU_ASSERT_EQUAL(gc_uncert_from_expanded(1.0, 0.0, &u), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_uncert_from_expanded(-1.0, 2.0, &u), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_uncert_from_relative(NAN, 1.0, &u), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_uncert_from_half_width(-0.1, &u), GC_ERR_INVALID);
    gc_uncert_input in;
    gc_uncert_input_init(&in, 5.0, 0.0);
    in.has_parts = 1;
    in.u_sys = 0.3;
    in.u_rand = 0.4;
    CHECK_REL(gc_uncert_input_u(&in), 0.5, 1e-15, "ASME PTC 19.1 u = sqrt(b^2 + s^2)");
}

static void test_tolerance_and_intervals(void)
{
    /* JCGM 101 7.9.2: z = c 10^l, c an n_dig-digit integer, delta = 10^l / 2 */
    CHECK_REL(gc_uncert_numerical_tolerance(2.0, 2), 0.05, 1e-12, SRC_101 " 7.9.2: 20 x 10^-1");
    CHECK_REL(gc_uncert_numerical_tolerance(0.0539, 2), 0.0005, 1e-12, SRC_101 " 7.9.2");
    CHECK_REL(gc_uncert_numerical_tolerance(0.0539, 1), 0.005, 1e-12, SRC_101 " 7.9.2");
    CHECK_REL(gc_uncert_numerical_tolerance(999.6, 2), 50.0, 1e-12, "999.6 rounds to 10 x 10^2");
    CHECK_REL(gc_uncert_numerical_tolerance(1000.0, 2), 50.0, 1e-12, "1000 = 10 x 10^2");
    CU_ASSERT_EQUAL(gc_uncert_numerical_tolerance(0.0, 2), 0.0);
    /* JCGM 101 7.7 on y = 1..10 (sorted), p = 0.5: q = 5; shortest: the first
     * of equal widths, [y_1, y_6]; symmetric: r = int((M - q + 1) / 2) = 3, [y_3, y_8] */
    double s[10], lo, hi, slo, shi;
    for (int i = 0; i < 10; i++)
        s[i] = i + 1.0;
    gc_uncert_coverage_interval(s, 10, 0.5, &lo, &hi, &slo, &shi);
    CU_ASSERT(lo == 1.0 && hi == 6.0 && slo == 3.0 && shi == 8.0);
    /* a skewed sample: the shortest interval sits where values crowd */
    double t[8] = { 0.0, 0.1, 0.2, 0.3, 0.4, 2.0, 5.0, 9.0 };
    gc_uncert_coverage_interval(t, 8, 0.5, &lo, &hi, NULL, NULL);
    CU_ASSERT(lo == 0.0 && hi == 0.4);   /* q = 4: [y_1, y_5] width 0.4 */
}

static void test_cholesky(void)
{
    const double V[9] = { 4, 2, -2, 2, 10, 5, -2, 5, 9 };
    double L[9], B[9];
    CU_ASSERT_EQUAL_FATAL(gc_uncert_cholesky(V, 3, L), GC_OK);
    for (int i = 0; i < 3; i++)
        for (int j = 0; j < 3; j++) {
            B[i * 3 + j] = 0.0;
            for (int k = 0; k < 3; k++)
                B[i * 3 + j] += L[i * 3 + k] * L[j * 3 + k];
            CHECK_ABS(B[i * 3 + j], V[i * 3 + j], 1e-13, "L L^T = V");
        }
    CHECK_REL(L[0], 2.0, 1e-15, "hand factorisation");
    CHECK_REL(L[3], 1.0, 1e-15, "hand factorisation");
    CHECK_REL(L[4], 3.0, 1e-15, "hand factorisation");
    /* perfectly correlated pair (semi-definite) and a zero variance: accepted */
    const double S[9] = { 1, 1, 0, 1, 1, 0, 0, 0, 0 };
    CU_ASSERT_EQUAL(gc_uncert_cholesky(S, 3, L), GC_OK);
    CU_ASSERT(L[4] == 0.0 && L[8] == 0.0);
    /* not positive semi-definite: r12 = r23 = 0.9, r13 = -0.9 */
    const double N[9] = { 1, 0.9, -0.9, 0.9, 1, 0.9, -0.9, 0.9, 1 };
    CU_ASSERT_EQUAL(gc_uncert_cholesky(N, 3, L), GC_ERR_INVALID);
}

static void test_random_stream(void)
{
    /* SplitMix64 with state 1234567, first outputs (reference code of
     * Steele, Lea & Flood / Vigna's splitmix64.c; from memory) */
    uint64_t state = 1234567u;
    static const uint64_t want[3] = { 6457827717110365317ull, 3203168211198807973ull,
                                      9817491932198370423ull };
    for (int i = 0; i < 3; i++) {
        state += 0x9e3779b97f4a7c15ull;
        CU_ASSERT_EQUAL(gc__uncert_mix64(state), want[i]);
    }
    /* uniform numbers: in (0, 1), mean 1/2 and variance 1/12 within 5 sigma */
    double s = 0.0, s2 = 0.0;
    const int n = 100000;
    for (int i = 0; i < n; i++) {
        double u = gc_uncert_uniform(42, (uint64_t)i);
        CU_ASSERT_FATAL(u > 0.0 && u < 1.0);
        s += u;
        s2 += u * u;
    }
    double mean = s / n, var = s2 / n - mean * mean;
    CHECK_ABS(mean, 0.5, 5.0 * sqrt(1.0 / 12.0 / n), "uniform mean 1/2");
    CHECK_ABS(var, 1.0 / 12.0, 5.0 * sqrt(1.0 / 180.0 / n), "uniform variance 1/12");
    CU_ASSERT(gc_uncert_uniform(1, 7) != gc_uncert_uniform(2, 7));
    CU_ASSERT(gc_uncert_uniform(1, 7) == gc_uncert_uniform(1, 7));
}

/* ---- known derivatives ----------------------------------------------------- */

/* Refuses b > 2.3 + 1e-12 when its ctx says so (a model with an undeclared edge). */
static int f_known(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)nx;
    (void)ny;
    if (ctx && x[1] > 2.3 + 1e-12)
        return GC_ERR_INVALID;
    double a = x[0], b = x[1], c = x[2];
    y[0] = exp(a) * sin(b);
    y[1] = a * a * a / b;
    y[2] = log(a) + sqrt(b);
    y[3] = atan(a * b);
    y[4] = 1e-6 * pow(c, 1.4) + 1.0 / c;
    return GC_OK;
}

static void known_derivs(const double *x, double d[5][3])
{
    double a = x[0], b = x[1], c = x[2], w = 1.0 + a * a * b * b;
    memset(d, 0, sizeof(double) * 15);
    d[0][0] = exp(a) * sin(b);
    d[0][1] = exp(a) * cos(b);
    d[1][0] = 3.0 * a * a / b;
    d[1][1] = -a * a * a / (b * b);
    d[2][0] = 1.0 / a;
    d[2][1] = 0.5 / sqrt(b);
    d[3][0] = b / w;
    d[3][1] = a / w;
    d[4][2] = 1.4e-6 * pow(c, 0.4) - 1.0 / (c * c);
}

/* Checks SENS against the known derivatives; returns the worst relative error. */
static double check_known(const double *x, const char *what)
{
    double d[5][3], worst = 0.0;
    known_derivs(x, d);
    for (int o = 0; o < 5; o++)
        for (int i = 0; i < 3; i++) {
            double want = d[o][i], got = SENS.dydx[o][i];
            if (want == 0.0) {
                CHECK_ABS(got, 0.0, 1e-15, "an input the output does not depend on");
                continue;
            }
            double e = fabs(got - want) / fabs(want);
            worst = fmax(worst, e);
            CHECK_REL(got, want, 1e-6, what);
        }
    return worst;
}

static void run_known(gc_uncert_input *in, void *ctx, gc_uncert_diff method, const char *what,
                      const int *want_side)
{
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.diff = method;
    gc_uncert_model m = model(f_known, ctx, 3, 5);
    gc_error e;
    int st = gc_uncert_sensitivities(&m, in, NULL, 0, NULL, 0, &o, &SENS, &e);
    if (st != GC_OK)
        fprintf(stderr, "\n  %s: %s\n", what, e.message);
    CU_ASSERT_EQUAL_FATAL(st, GC_OK);
    double x[3] = { in[0].value, in[1].value, in[2].value };
    double w = check_known(x, what);
    worst_deriv[method] = fmax(worst_deriv[method], w);
    for (int i = 0; want_side && i < 3; i++)
        CU_ASSERT_EQUAL(SENS.side[i], want_side[i]);
    long per = method == GC_UNCERT_RICHARDSON ? 4 : 2;
    if (!want_side)
        CU_ASSERT_EQUAL(SENS.evaluations, 1 + 3 * per);
}

static void test_derivatives_known(void)
{
    const char *src = "closed-form derivatives (calculus), 1e-6 relative required";
    gc_uncert_input in[3];
    for (int method = 0; method < 2; method++) {
        gc_uncert_input_init(&in[0], 0.7, 0.01);
        gc_uncert_input_init(&in[1], 2.3, 0.02);
        gc_uncert_input_init(&in[2], 1.5e5, 100.0);
        run_known(in, NULL, (gc_uncert_diff)method, src, NULL);
        /* at the bounds of the inputs' domains: one-sided of the same order */
        in[0].has_lo = 1;
        in[0].lo = 0.7;
        in[1].has_hi = 1;
        in[1].hi = 2.3;
        in[2].has_lo = in[2].has_hi = 1;
        in[2].lo = 1.5e5 - 1.0;   /* too narrow for a central step of 15: shrinks */
        in[2].hi = 1.5e5 + 0.5;
        const int sides[3] = { 1, -1, -1 };
        run_known(in, NULL, (gc_uncert_diff)method, src, sides);
        /* undeclared edge: the model refuses b > 2.3; the engine retries backward */
        gc_uncert_input_init(&in[0], 0.7, 0.01);
        gc_uncert_input_init(&in[1], 2.3, 0.02);
        gc_uncert_input_init(&in[2], 1.5e5, 100.0);
        const int sides2[3] = { 0, -1, 0 };
        int flag = 1;
        run_known(in, &flag, (gc_uncert_diff)method, src, sides2);
        /* Richardson's error estimates: present and small on smooth functions;
         * central differences give none */
        for (int o = 0; o < 4; o++)
            for (int i = 0; i < 2; i++) {
                double e = SENS.error[o][i], d = fabs(SENS.dydx[o][i]);
                CU_ASSERT(method == 0 ? e == 0.0 : (e > 0.0 && e <= 1e-6 * d));
            }
        /* elasticities (x / y) dy/dx */
        CHECK_REL(SENS.elasticity[1][0], 3.0, 1e-6, "elasticity of a^3 / b in a is 3");
        CHECK_REL(SENS.elasticity[1][1], -1.0, 1e-6, "elasticity of a^3 / b in b is -1");
    }
    printf("\n  derivatives: worst relative error central %.2e, Richardson %.2e\n",
           worst_deriv[0], worst_deriv[1]);
}

static int f_zero_y(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] * x[0] * pow(x[1], -0.5);
    y[1] = x[0] - 2.0;    /* zero at the best estimate */
    return GC_OK;
}

static void test_sensitivity_subsets(void)
{
    gc_uncert_input in[2];
    gc_uncert_input_init(&in[0], 2.0, 0.0);
    gc_uncert_input_init(&in[1], 9.0, 0.0);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    gc_uncert_model m = model(f_zero_y, NULL, 2, 2);
    const int ins[1] = { 1 }, outs[2] = { 1, 0 };
    CU_ASSERT_EQUAL_FATAL(gc_uncert_sensitivities(&m, in, ins, 1, outs, 2, &o, &SENS, NULL),
                          GC_OK);
    CU_ASSERT(SENS.n_in == 1 && SENS.n_out == 2 && SENS.in[0] == 1 && SENS.out[0] == 1);
    CHECK_ABS(SENS.dydx[0][0], 0.0, 1e-15, "x0 - 2 does not depend on x1");
    CU_ASSERT_EQUAL(SENS.has_elasticity[0][0], 0);          /* y = 0 */
    CHECK_REL(SENS.dydx[1][0], -0.5 * 4.0 * pow(9.0, -1.5), 1e-8, "d(x0^2 x1^-1/2)/dx1");
    CHECK_REL(SENS.elasticity[1][0], -0.5, 1e-8, "power-law elasticity -1/2");
    CU_ASSERT_EQUAL(SENS.evaluations, 3);
    const int bad[2] = { 0, 0 };
    gc_error e;
    CU_ASSERT_EQUAL(gc_uncert_sensitivities(&m, in, bad, 2, NULL, 0, &o, &SENS, &e),
                    GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "inputs");
}

/* ---- linear propagation against python3-uncertainties ---------------------- */

static int f_otto(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = 1.0 - pow(x[0], 1.0 - x[1]);
    return GC_OK;
}

static int f_brayton(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = 1.0 - pow(x[0], (1.0 - x[1]) / x[1]);
    return GC_OK;
}

static int f_reduction(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    const double k = 1.4, e = (k - 1.0) / k;
    double t1 = x[0], p1 = x[1], t2 = x[2], p2 = x[3], t3 = x[4], t4 = x[5];
    y[0] = t1 * (pow(p2 / p1, e) - 1.0) / (t2 - t1);
    y[1] = (t3 - t4) / (t3 * (1.0 - pow(p1 / p2, e)));
    y[2] = ((t3 - t4) - (t2 - t1)) / (t3 - t2);
    return GC_OK;
}

typedef struct unc_case {
    int id, model, nx, ny;
    double x[6], u[6], r[36], y[3], uy[3], d[3][6], ry[3][3];
} unc_case;

static void load_row(unc_case *c, const double *row)
{
    int kind = (int)row[2], i = (int)row[3], j = (int)row[4];
    double v = row[5];
    switch (kind) {
    case 0: c->x[i] = v; c->nx = i + 1 > c->nx ? i + 1 : c->nx; break;
    case 1: c->u[i] = v; break;
    case 2: c->r[i * 6 + j] = c->r[j * 6 + i] = v; break;
    case 3: c->y[i] = v; c->ny = i + 1 > c->ny ? i + 1 : c->ny; break;
    case 4: c->uy[i] = v; break;
    case 5: c->d[i][j] = v; break;
    case 6: c->ry[i][j] = c->ry[j][i] = v; break;
    default: CU_FAIL("unknown kind in uncert_uncertainties.csv");
    }
}

static int load_cases(unc_case *cs, int max)
{
    static double rows[300][REFCSV_MAX_COLS];
    int n = refcsv_read("tests/reference/uncert_uncertainties.csv", 6, rows, 300), nc = 0;
    CU_ASSERT_FATAL(n > 50);
    for (int r = 0; r < n; r++) {
        int id = (int)rows[r][0];
        if (nc == 0 || cs[nc - 1].id != id) {
            CU_ASSERT_FATAL(nc < max);
            memset(&cs[nc], 0, sizeof cs[nc]);
            cs[nc].id = id;
            cs[nc++].model = (int)rows[r][1];
        }
        load_row(&cs[nc - 1], rows[r]);
    }
    return nc;
}

static void check_case(const unc_case *c, gc_uncert_diff method)
{
    static const gc_uncert_eval_fn fns[4] = { NULL, f_otto, f_brayton, f_reduction };
    gc_uncert_input in[6];
    double r[36];
    int corr = 0;
    for (int i = 0; i < c->nx; i++) {
        gc_uncert_input_init(&in[i], c->x[i], c->u[i]);
        for (int j = 0; j < c->nx; j++) {
            r[i * c->nx + j] = i == j ? 1.0 : c->r[i * 6 + j];
            corr |= i != j && r[i * c->nx + j] != 0.0;
        }
    }
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.diff = method;
    gc_uncert_model m = model(fns[c->model], NULL, c->nx, c->ny);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, corr ? r : NULL, NULL, 0, &o, &LIN, NULL),
                          GC_OK);
    for (int q = 0; q < c->ny; q++) {
        const gc_uncert_budget *b = &LIN.out[q];
        CHECK_REL(b->y, c->y[q], 1e-13, SRC_UNC " nominal value");
        CHECK_REL(b->u_c, c->uy[q], 1e-6, SRC_UNC " std_dev");
        worst_unc_u = fmax(worst_unc_u, err_rel(b->u_c, c->uy[q], 0.0));
        for (int t = 0; t < b->n_terms; t++) {
            double want = c->d[q][b->terms[t].input];
            double e = err_rel(b->terms[t].sensitivity, want, want == 0.0 ? 1e-300 : 0.0);
            if (want == 0.0)
                CHECK_ABS(b->terms[t].sensitivity, 0.0, 1e-15, SRC_UNC " derivative 0");
            else
                CHECK_REL(b->terms[t].sensitivity, want, 1e-6, SRC_UNC " derivatives");
            if (want != 0.0)
                worst_unc_d = fmax(worst_unc_d, e);
        }
        for (int p = 0; p < c->ny; p++)
            if (p != q)
                CHECK_ABS(LIN.corr[q][p], c->ry[q][p], 1e-6, SRC_UNC " correlation_matrix");
    }
}

static void test_linear_uncertainties(void)
{
    unc_case cs[8];
    int nc = load_cases(cs, 8);
    CU_ASSERT_EQUAL(nc, 6);
    for (int method = 0; method < 2; method++)
        for (int k = 0; k < nc; k++)
            check_case(&cs[k], (gc_uncert_diff)method);
    printf("\n  vs python3-uncertainties: %d cases x 2 methods, worst relative error "
           "u(y) %.2e, dy/dx %.2e\n", nc, worst_unc_u, worst_unc_d);
}

/* ---- the budget's algebra -------------------------------------------------- */

static int f_lin3(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = 2.0 * x[0] - 3.0 * x[1] + x[2];
    y[1] = x[0] + x[1];
    return GC_OK;
}

static void test_budget_parts(void)
{
    /* y = 2 x0 - 3 x1 + x2; x0, x1 in parts (b, s), x2 whole; r(x0, x1) = 0.5 on
     * the systematic parts (ASME PTC 19.1: correlated systematic errors), random
     * parts independent. By hand: c = (2, -3, 1), a = (0.3, 0.2, 0.5), s = (0.4, 0.1, 0)
     *   b_y^2 = (2 0.3)^2 + (3 0.2)^2 + 0.5^2 + 2 (2)(-3)(0.5)(0.3)(0.2) = 0.61
     *   s_y^2 = (2 0.4)^2 + (3 0.1)^2 = 0.73;   u_c^2 = 1.34                  */
    gc_uncert_input in[3];
    gc_uncert_input_init(&in[0], 1.0, 0.0);
    in[0].has_parts = 1, in[0].u_sys = 0.3, in[0].u_rand = 0.4;
    gc_uncert_input_init(&in[1], 2.0, 0.0);
    in[1].has_parts = 1, in[1].u_sys = 0.2, in[1].u_rand = 0.1;
    gc_uncert_input_init(&in[2], 3.0, 0.5);
    const double r[9] = { 1, 0.5, 0, 0.5, 1, 0, 0, 0, 1 };
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    gc_uncert_model m = model(f_lin3, NULL, 3, 2);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, NULL), GC_OK);
    const gc_uncert_budget *b = &LIN.out[0];
    CHECK_REL(b->u_c, sqrt(1.34), 1e-9, "GUM eq. (13) by hand");
    CU_ASSERT_EQUAL(b->parts_complete, 0);       /* x2 has no parts */
    CHECK_REL(b->U, 2.0 * sqrt(1.34), 1e-9, "U = k u_c, k = 2");
    double sum = b->correlation_share;
    for (int t = 0; t < b->n_terms; t++) {
        sum += b->terms[t].share;
        if (t > 0)
            CU_ASSERT(b->terms[t].share <= b->terms[t - 1].share);
    }
    CHECK_REL(sum, 1.0, 1e-12, "shares and the correlation share add to 1");
    CHECK_REL(b->correlation_share, -0.36 / 1.34, 1e-9, "2 c0 c1 r a0 a1 / u_c^2 by hand");
    /* (c u)^2: x0 (2 0.5)^2 = 1, x1 (3 sqrt(0.05))^2 = 0.45, x2 0.5^2 = 0.25 */
    CU_ASSERT(b->terms[0].input == 0 && b->terms[1].input == 1 && b->terms[2].input == 2);
    CHECK_REL(b->terms[0].contribution_rand, 0.8, 1e-9, "c0 s0");
    CHECK_REL(b->terms[1].contribution_sys, -0.6, 1e-9, "c1 b1");
    /* all inputs in parts: RSS of the systematic and random parts (PTC 19.1) */
    in[2].has_parts = 1, in[2].u_sys = 0.5, in[2].u = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, NULL), GC_OK);
    b = &LIN.out[0];
    CU_ASSERT_EQUAL(b->parts_complete, 1);
    CHECK_REL(b->u_sys, sqrt(0.61), 1e-9, "b_y by hand");
    CHECK_REL(b->u_rand, sqrt(0.73), 1e-9, "s_y by hand");
    CHECK_REL(hypot(b->u_sys, b->u_rand), b->u_c, 1e-12, "u_c = RSS of the parts");
    /* output correlation: cov(y0, y1) = c0^T V c1 by hand:
     * V = [[0.25, 0.03, 0], [0.03, 0.05, 0], [0, 0, 0.25]], c1 = (1, 1, 0):
     * cov = 2(0.25 + 0.03) - 3(0.03 + 0.05) = 0.32; u(y1)^2 = 0.25 + 0.05 + 0.06 = 0.36 */
    CHECK_REL(LIN.corr[0][1], 0.32 / (sqrt(1.34) * 0.6), 1e-9, "J V J^T by hand");
    CU_ASSERT_EQUAL(LIN.corr[0][0], 1.0);
    /* selection of one output */
    const int sel[1] = { 1 };
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, sel, 1, &o, &LIN, NULL), GC_OK);
    CU_ASSERT(LIN.n_out == 1 && LIN.out[0].output == 1);
    CHECK_REL(LIN.out[0].u_c, 0.6, 1e-9, "u(x0 + x1) by hand");
    CU_ASSERT_EQUAL(LIN.evaluations, 1 + 2 * 3);
}

static int f_sum2(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] + x[1];
    return GC_OK;
}

static void test_welch_satterthwaite(void)
{
    /* y = x0 + x1, u = 1 each with nu = 4: nu_eff = 2^2 / (1/4 + 1/4) = 8 (GUM eq. (G.2b));
     * k_95 = t_0.975(8) = 2.306 (GUM Table G.2 lists 2.31; scipy 2.306004135) */
    gc_uncert_input in[2];
    gc_uncert_input_init(&in[0], 1.0, 1.0);
    gc_uncert_input_init(&in[1], 1.0, 1.0);
    in[0].dof = in[1].dof = 4.0;
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.coverage_probability = 0.95;
    o.welch_satterthwaite = 1;
    gc_uncert_model m = model(f_sum2, NULL, 2, 1);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    CHECK_REL(LIN.out[0].nu_eff, 8.0, 1e-9, "GUM eq. (G.2b)");
    CU_ASSERT_EQUAL(LIN.out[0].k_from_t, 1);
    CHECK_REL(LIN.out[0].k, 2.306004135204172, 1e-9, "t_0.975(8), scipy (from a run)");
    /* correlated contributing inputs: not formed, normal k */
    const double r[4] = { 1, 0.3, 0.3, 1 };
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, NULL), GC_OK);
    CU_ASSERT(LIN.out[0].nu_eff_formed == 0 && LIN.out[0].k_from_t == 0);
    CHECK_REL(LIN.out[0].k, 1.959963984540054, 1e-12, "z_0.975, scipy (table)");
    CHECK_REL(LIN.out[0].u_c, sqrt(2.6), 1e-9, "1 + 1 + 2 (0.3)");
    /* given k: kept as given */
    o.coverage_probability = 0.0;
    o.coverage_factor = 3.0;
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    CU_ASSERT(LIN.out[0].k == 3.0 && LIN.out[0].coverage_probability == 0.0);
}

/* ---- GUM Annex H ----------------------------------------------------------- */

/* H.1 (eq. H.3, the first-order model):
 * l = l_s + d - l_s (delta_alpha theta + alpha_s delta_theta);
 * x = (l_s, d, alpha_s, theta, delta_alpha, delta_theta), SI units (m, 1/K, K) */
static int f_gauge(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] + x[1] - x[0] * (x[4] * x[3] + x[2] * x[5]);
    return GC_OK;
}

static void test_gum_h1(void)
{
    /* H.1 inputs: l_s = 50.000623 mm, u = 25 nm (nu 18); d = 215 nm, u = 9.7 nm
     * (nu 25.6); alpha_s = 11.5e-6 /K, u = 1.2e-6 (rectangular +-2e-6, nu inf);
     * theta = -0.1 K, u = 0.41 K (nu inf); delta_alpha = 0, u = 0.58e-6 /K (rect.
     * +-1e-6, nu 50); delta_theta = 0, u = 0.029 K (rect. +-0.05 K, nu 2). */
    gc_uncert_input in[6];
    gc_uncert_input_init(&in[0], 50.000623e-3, 25e-9);
    in[0].dof = 18;
    gc_uncert_input_init(&in[1], 215e-9, 9.7e-9);
    in[1].dof = 25.6;
    gc_uncert_input_init(&in[2], 11.5e-6, 2e-6 / sqrt(3.0));
    gc_uncert_input_init(&in[3], -0.1, 0.41);
    gc_uncert_input_init(&in[4], 0.0, 1e-6 / sqrt(3.0));
    in[4].dof = 50;
    gc_uncert_input_init(&in[5], 0.0, 0.05 / sqrt(3.0));
    in[5].dof = 2;
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.coverage_probability = 0.99;
    o.welch_satterthwaite = 1;
    gc_uncert_model m = model(f_gauge, NULL, 6, 1);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    const gc_uncert_budget *b = &LIN.out[0];
    CHECK_ABS(b->y * 1e3, 50.000838, 0.5e-6, SRC_H1 ": l = 50.000838 mm");
    CHECK_ABS(b->u_c * 1e9, 32.0, 0.5, SRC_H1 ": u_c(l) = 32 nm");
    CU_ASSERT_EQUAL(floor(b->nu_eff), 16.0);           /* H.1.6: nu_eff = 16 */
    CHECK_ABS(b->k, 2.92, 0.005, SRC_H1 ": t_99(16) = 2.92");
    /* H.1 prints U_99 = t_99(16) u_c = 2.92 x 32 nm = 93 nm from the rounded u_c;
     * the unrounded 31.7 nm gives 92.5 nm: consistent within the rounding */
    CHECK_ABS(2.92 * 32.0, 93.0, 0.5, SRC_H1 ": printed U_99 = 2.92 x 32 nm = 93 nm");
    CHECK_ABS(b->U * 1e9, 93.0, 1.0, SRC_H1 ": U_99 = 93 nm (from a rounded u_c)");
    CHECK_REL(b->U, b->k * b->u_c, 1e-15, "U = k u_c");
    /* the budget's sensitivities: c(alpha_s) = -l_s delta_theta = 0, c(theta) =
     * -l_s delta_alpha = 0 (first order), c(delta_theta) = -l_s alpha_s */
    for (int t = 0; t < b->n_terms; t++) {
        int i = b->terms[t].input;
        if (i == 2 || i == 3)
            CHECK_ABS(b->terms[t].sensitivity, 0.0, 1e-18, SRC_H1 ": zero first-order terms");
        if (i == 5)
            /* 1e-6: l = 0.05 m while this term moves it by 1e-12 m per step,
             * so the difference keeps only about seven digits of the term */
            CHECK_REL(b->terms[t].sensitivity, -50.000623e-3 * 11.5e-6, 1e-6, "-l_s alpha_s");
    }
    CU_ASSERT_EQUAL(b->terms[0].input, 0);             /* l_s dominates: 25 nm */
    CU_ASSERT_EQUAL(b->terms[1].input, 5);             /* delta_theta: 16.6 nm */
    printf("\n  GUM H.1: l = %.7f mm, u_c = %.2f nm, nu_eff = %.2f, k = %.3f, U = %.1f nm\n",
           b->y * 1e3, b->u_c * 1e9, b->nu_eff, b->k, b->U * 1e9);
}

/* H.2: R = V/I cos(phi), X = V/I sin(phi), Z = V/I */
static int f_rxz(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] / x[1] * cos(x[2]);
    y[1] = x[0] / x[1] * sin(x[2]);
    y[2] = x[0] / x[1];
    return GC_OK;
}

/* Table H.2's five sets of simultaneous observations of V (V), I (mA), phi (rad)
 * (from memory; their means 4.9990 V, 19.6610 mA, 1.04446 rad are as printed). */
static const double H2_OBS[3][5] = {
    { 5.007, 4.994, 5.005, 4.990, 4.999 },
    { 19.663e-3, 19.639e-3, 19.640e-3, 19.685e-3, 19.678e-3 },
    { 1.0456, 1.0438, 1.0468, 1.0428, 1.0433 },
};

/* Means, standard uncertainties of the means (GUM 4.2.3) and their correlation
 * coefficients r = s(qbar, rbar) / (s(qbar) s(rbar)) (GUM 5.2.3, eq. (17)). */
static void h2_inputs(gc_uncert_input *in, double *r)
{
    double mean[3], dev[3][5];
    for (int i = 0; i < 3; i++) {
        mean[i] = 0.0;
        for (int k = 0; k < 5; k++)
            mean[i] += H2_OBS[i][k] / 5.0;
        for (int k = 0; k < 5; k++)
            dev[i][k] = H2_OBS[i][k] - mean[i];
    }
    double cov[3][3];
    for (int i = 0; i < 3; i++)
        for (int j = 0; j < 3; j++) {
            cov[i][j] = 0.0;
            for (int k = 0; k < 5; k++)
                cov[i][j] += dev[i][k] * dev[j][k] / (5.0 * 4.0);
        }
    for (int i = 0; i < 3; i++) {
        gc_uncert_input_init(&in[i], mean[i], sqrt(cov[i][i]));
        for (int j = 0; j < 3; j++)
            r[i * 3 + j] = i == j ? 1.0 : cov[i][j] / sqrt(cov[i][i] * cov[j][j]);
    }
}

static void test_gum_h2(void)
{
    gc_uncert_input in[3];
    double r[9];
    h2_inputs(in, r);
    CHECK_ABS(in[0].value, 4.9990, 0.5e-4, SRC_H2 ": mean V");
    CHECK_ABS(in[0].u, 0.0032, 0.5e-4, SRC_H2 ": s(V) = 0.0032 V");
    CHECK_ABS(in[1].u * 1e3, 0.0095, 0.5e-4, SRC_H2 ": s(I) = 0.0095 mA");
    CHECK_ABS(in[2].u, 0.00075, 0.5e-5, SRC_H2 ": s(phi) = 0.00075 rad");
    CHECK_ABS(r[1], -0.36, 0.005, SRC_H2 ": r(V, I) = -0.36");
    CHECK_ABS(r[2], 0.86, 0.005, SRC_H2 ": r(V, phi) = 0.86");
    CHECK_ABS(r[5], -0.65, 0.005, SRC_H2 ": r(I, phi) = -0.65");
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    gc_uncert_model m = model(f_rxz, NULL, 3, 3);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, NULL), GC_OK);
    /* Table H.3 prints R, X, Z to 0.001 ohm and u to 0.001 ohm from approach 1
     * (the scatter of the five computed values); the linear method on the
     * summarised data (approach 2, H.2.4) agrees to one unit of the last digit. */
    CHECK_ABS(LIN.out[0].y, 127.732, 0.0005, SRC_H2 ": R");
    CHECK_ABS(LIN.out[1].y, 219.847, 0.0005, SRC_H2 ": X");
    CHECK_ABS(LIN.out[2].y, 254.260, 0.0005, SRC_H2 ": Z");
    CHECK_ABS(LIN.out[0].u_c, 0.071, 0.001, SRC_H2 ": u(R)");
    CHECK_ABS(LIN.out[1].u_c, 0.295, 0.001, SRC_H2 ": u(X)");
    CHECK_ABS(LIN.out[2].u_c, 0.236, 0.001, SRC_H2 ": u(Z)");
    CHECK_ABS(LIN.corr[0][1], -0.588, 0.001, SRC_H2 ": r(R, X)");
    CHECK_ABS(LIN.corr[0][2], -0.485, 0.001, SRC_H2 ": r(R, Z)");
    CHECK_ABS(LIN.corr[1][2], 0.993, 0.001, SRC_H2 ": r(X, Z)");
    CU_ASSERT(LIN.out[0].correlation_share != 0.0);
    printf("\n  GUM H.2: u(R, X, Z) = %.4f, %.4f, %.4f ohm; r = %.4f, %.4f, %.4f\n",
           LIN.out[0].u_c, LIN.out[1].u_c, LIN.out[2].u_c, LIN.corr[0][1], LIN.corr[0][2],
           LIN.corr[1][2]);
}

/* ---- Monte Carlo ----------------------------------------------------------- */

static int f_product(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] * x[1];
    return GC_OK;
}

static int mc_run(gc_uncert_model *m, gc_uncert_input *in, const double *r, long M, int threads,
                  uint64_t seed, const gc_uncert_linear_result *lin, gc_uncert_mc_result *res)
{
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.samples = M;
    o.threads = threads;
    o.seed = seed;
    gc_error e;
    int st = gc_uncert_monte_carlo(m, in, r, NULL, 0, &o, lin, res, &e);
    if (st != GC_OK)
        fprintf(stderr, "\n  monte carlo: %s: %s\n", e.field, e.message);
    return st;
}

static void test_mc_near_linear(void)
{
    /* y = x0 x1 with 0.1 % uncertainties: nearly linear. Tolerances from the
     * sample count M: the mean within 4 u / sqrt(M), the standard deviation
     * within 4 u / sqrt(2 (M - 1)) (normal theory), the interval end points
     * within the engine's own 4 s_e; and no disagreement flagged. */
    gc_uncert_input in[2];
    gc_uncert_input_init(&in[0], 10.0, 0.01);
    gc_uncert_input_init(&in[1], 5.0, 0.005);
    gc_uncert_model m = model(f_product, NULL, 2, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    const long M = 50000;
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, NULL, M, 2, 7, &LIN, &MC), GC_OK);
    const gc_uncert_mc_output *r = &MC.out[0];
    double uc = LIN.out[0].u_c;
    CHECK_ABS(r->mean, 50.0, 4.0 * uc / sqrt((double)M), "mean = x0 x1 (+ u0 u1 r = 0)");
    CHECK_ABS(r->u, uc, 4.0 * uc / sqrt(2.0 * (M - 1)), "u = linear u_c (near-linear)");
    double z = gc_uncert_coverage_factor(0.95, 0);
    CHECK_ABS(r->low, 50.0 - z * uc, 4.0 * r->se_low, "JCGM 101 8: GUM interval");
    CHECK_ABS(r->high, 50.0 + z * uc, 4.0 * r->se_high, "JCGM 101 8: GUM interval");
    CU_ASSERT_EQUAL(r->validated_against_linear, 1);
    CU_ASSERT_EQUAL(r->disagrees, 0);
    CU_ASSERT(MC.n_failed == 0 && MC.n_ok == M && MC.first_failed == -1);
    /* correlated normal inputs (Cholesky): u_c^2 = ... + 2 c0 c1 r u0 u1 */
    const double rr[4] = { 1, 0.8, 0.8, 1 };
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, rr, NULL, 0, &o, &LIN2, NULL), GC_OK);
    CHECK_REL(LIN2.out[0].u_c, sqrt(0.05 * 0.05 * 2.0 * 1.8), 1e-8, "GUM eq. (13) by hand");
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, rr, M, 2, 7, &LIN2, &MC2), GC_OK);
    CHECK_ABS(MC2.out[0].u, LIN2.out[0].u_c, 4.0 * LIN2.out[0].u_c / sqrt(2.0 * (M - 1)),
              "correlated sampling reproduces eq. (13)");
    CU_ASSERT_EQUAL(MC2.out[0].disagrees, 0);
}

static int f_square(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] * x[0];
    return GC_OK;
}

static void test_mc_chi_square(void)
{
    /* y = x^2, x ~ N(0, s^2): y / s^2 is chi-square with 1 degree of freedom
     * (closed form): mean s^2, standard deviation sqrt(2) s^2; its density
     * falls monotonically, so the shortest 95 % interval is [0, s^2 q] with
     * q = z_0.975^2 = 3.8415 (P(Z^2 <= q) = P(|Z| <= z_0.975)). The linear
     * method sees dy/dx = 0 there: u_c = 0, and the disagreement is flagged.
     * Tolerances: the standard error of the mean sqrt(2) s^2 / sqrt(M), of the
     * standard deviation sqrt((mu4 - sigma^4) / (4 sigma^2 M)) = sqrt(7 / M) s^2
     * (chi-square(1): mu4 = 60, sigma^2 = 2), of the quantile sqrt(p (1 - p) / M) / f(q);
     * 4 of each. */
    const double s = 2.0, s2 = s * s;
    const long M = 100000;
    gc_uncert_input in;
    gc_uncert_input_init(&in, 0.0, s);
    gc_uncert_model m = model(f_square, NULL, 1, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, &in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    CU_ASSERT_EQUAL(LIN.out[0].u_c, 0.0);
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, &in, NULL, M, 2, 11, &LIN, &MC), GC_OK);
    const gc_uncert_mc_output *r = &MC.out[0];
    CHECK_ABS(r->mean, s2, 4.0 * sqrt(2.0) * s2 / sqrt((double)M), "chi-square(1) mean");
    CHECK_ABS(r->u, sqrt(2.0) * s2, 4.0 * sqrt(7.0 / M) * s2, "chi-square(1) std");
    double zq = gc_uncert_normal_quantile(0.975), q = zq * zq;
    double fq = exp(-q / 2.0) / sqrt(2.0 * M_PI * q) / s2;   /* density of y at s^2 q */
    CHECK_ABS(r->high, s2 * q, 4.0 * sqrt(0.95 * 0.05 / M) / fq, "chi-square(1) 95 % point");
    CU_ASSERT(r->low >= 0.0 && r->low < 1e-3 * s2);
    CU_ASSERT_EQUAL(r->disagrees, 1);
    CU_ASSERT_EQUAL(r->linear_validated, 0);
    printf("\n  chi-square: mean %.4f (%.1f), u %.4f (%.4f), [%.2e, %.4f] (%.4f)\n", r->mean,
           s2, r->u, sqrt(2.0) * s2, r->low, r->high, s2 * q);
}

/* CDF of a sum of independent rectangular variables on [-a_i, a_i]:
 * F(y) = sum over subsets S of (-1)^|S| (y + A - 2 sum_S a_i)_+^n / (n! prod 2 a_i),
 * A = sum a_i (inclusion-exclusion; the Irwin-Hall form for equal widths). */
static double rect_sum_cdf(const double *a, int n, double y)
{
    double A = 0.0, prod = 1.0, fact = 1.0, sum = 0.0;
    for (int i = 0; i < n; i++) {
        A += a[i];
        prod *= 2.0 * a[i];
        fact *= i + 1;
    }
    for (unsigned S = 0; S < (1u << n); S++) {
        double shift = 0.0;
        int bits = 0;
        for (int i = 0; i < n; i++)
            if (S & (1u << i)) {
                shift += 2.0 * a[i];
                bits++;
            }
        double t = y + A - shift;
        if (t > 0.0)
            sum += (bits % 2 ? -1.0 : 1.0) * pow(t, n);
    }
    return sum / (fact * prod);
}

static double rect_sum_quantile(const double *a, int n, double P)
{
    double lo = -100.0, hi = 100.0;
    for (int it = 0; it < 200; it++) {
        double mid = 0.5 * (lo + hi);
        if (rect_sum_cdf(a, n, mid) < P)
            lo = mid;
        else
            hi = mid;
    }
    return 0.5 * (lo + hi);
}

static int f_add4(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] + x[1] + x[2] + x[3];
    return GC_OK;
}

static void additive_case(double u4, gc_uncert_dist dist, double want_half, const char *src)
{
    gc_uncert_input in[4];
    double a[4];
    for (int i = 0; i < 4; i++) {
        gc_uncert_input_init(&in[i], 0.0, i == 3 ? u4 : 1.0);
        in[i].dist = dist;
        a[i] = sqrt(3.0) * in[i].u;
    }
    gc_uncert_model m = model(f_add4, NULL, 4, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    const long M = 200000;
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, NULL, M, 2, 2008, &LIN, &MC), GC_OK);
    const gc_uncert_mc_output *r = &MC.out[0];
    double uy = sqrt(3.0 + u4 * u4);
    CHECK_ABS(r->mean, 0.0, 4.0 * uy / sqrt((double)M), SRC_101 " 9.2: E(Y) = 0");
    CHECK_ABS(r->u, uy, 4.0 * r->se_u, SRC_101 " 9.2: u(y) = sqrt(sum u_i^2)");
    CU_ASSERT_EQUAL(MC.blocks, GC_UNCERT_MC_BLOCKS);
    double half = dist == GC_UNCERT_NORMAL ? gc_uncert_coverage_factor(0.95, 0) * uy
                                           : rect_sum_quantile(a, 4, 0.975);
    CHECK_ABS(r->high, half, 4.0 * r->se_high, "closed-form 97.5 % point of the sum");
    CHECK_ABS(r->low, -half, 4.0 * r->se_low, "closed-form 2.5 % point of the sum");
    if (want_half > 0.0) {   /* the printed interval, rounded to 0.01 */
        CHECK_ABS(half, want_half, 0.005, src);
        CHECK_ABS(r->high, want_half, 0.005 + 4.0 * r->se_high, src);
    }
    printf("\n  JCGM 101 9.2 (u4 = %g, %s): u %.4f (%.4f), [%.4f, %.4f] s_e %.4f, %.4f; "
           "exact +-%.4f, GUM +-%.4f, delta %.3g, tolerance %.3g, disagrees %d\n", u4,
           dist == GC_UNCERT_NORMAL ? "normal" : "rectangular", r->u, uy, r->low, r->high,
           r->se_low, r->se_high, half, r->U_linear, r->delta, r->tolerance, r->disagrees);
}

static void test_mc_additive(void)
{
    additive_case(1.0, GC_UNCERT_NORMAL, 3.92, SRC_101 " 9.2.2 (from memory): [-3.92, 3.92]");
    CU_ASSERT_EQUAL(MC.out[0].disagrees, 0);
    additive_case(1.0, GC_UNCERT_RECTANGULAR, 3.88,
                  SRC_101 " 9.2.3 (from memory): [-3.88, 3.88]");
    /* 9.2.4's configuration (from memory): X4 with u = 10 dominates, the sum is
     * far from normal; the GUM interval +-1.96 u(y) = +-19.9 is much wider than
     * the distribution's, so the disagreement is flagged. */
    additive_case(10.0, GC_UNCERT_RECTANGULAR, 0.0, NULL);
    CU_ASSERT_EQUAL(MC.out[0].disagrees, 1);
    CHECK_ABS(MC.out[0].U_linear, 19.9, 0.05, SRC_101 " 9.2.4 GUF interval (from memory)");
}

/* JCGM 101 9.3 mass calibration (from memory): delta_m = (m_Rc + dm_Rc) (1 +
 * (rho_a - rho_a0) (1/rho_W - 1/rho_R)) - m_nom, masses in mg, densities kg/m3,
 * rho_a0 = 1.2 kg/m3, m_nom = 100 000 mg. */
static int f_mass(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = (x[0] + x[1]) * (1.0 + (x[2] - 1.2) * (1.0 / x[3] - 1.0 / x[4])) - 100000.0;
    return GC_OK;
}

/* The exact variance of delta_m: A = m + dm normal, D = rho_a - rho_a0 rectangular
 * (E D = 0), E = 1/rho_W - 1/rho_R with rho rectangular on [c - h, c + h]:
 * E(1/rho) = ln((c + h) / (c - h)) / (2h), E(1/rho^2) = 1 / ((c - h)(c + h));
 * Var = s_A^2 + (mu_A^2 + s_A^2) E(D^2) E(E^2). */
static double mass_exact_u(void)
{
    double muA = 100001.234, sA2 = 0.05 * 0.05 + 0.02 * 0.02, ED2 = 0.1 * 0.1 / 3.0;
    double e1w = log(9000.0 / 7000.0) / 2000.0, e2w = 1.0 / (7000.0 * 9000.0);
    double e1r = log(8050.0 / 7950.0) / 100.0, e2r = 1.0 / (7950.0 * 8050.0);
    double EE2 = e2w - 2.0 * e1w * e1r + e2r;
    return sqrt(sA2 + (muA * muA + sA2) * ED2 * EE2);
}

static void test_mc_mass(void)
{
    gc_uncert_input in[5];
    gc_uncert_input_init(&in[0], 100000.000, 0.050);
    gc_uncert_input_init(&in[1], 1.234, 0.020);
    gc_uncert_input_init(&in[2], 1.20, 0.10 / sqrt(3.0));
    gc_uncert_input_init(&in[3], 8000.0, 1000.0 / sqrt(3.0));
    gc_uncert_input_init(&in[4], 8000.0, 50.0 / sqrt(3.0));
    for (int i = 2; i < 5; i++)
        in[i].dist = GC_UNCERT_RECTANGULAR;
    gc_uncert_model m = model(f_mass, NULL, 5, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.coverage_probability = 0.95;
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, NULL), GC_OK);
    const gc_uncert_budget *b = &LIN.out[0];
    CHECK_ABS(b->y, 1.2340, 0.00005, SRC_101 " 9.3 GUF (from memory): 1.2340 mg");
    CHECK_ABS(b->u_c, 0.0539, 0.00005, SRC_101 " 9.3 GUF (from memory): 0.0539 mg");
    CHECK_ABS(b->y - b->U, 1.1285, 0.0001, SRC_101 " 9.3 GUF interval (from memory)");
    CHECK_ABS(b->y + b->U, 1.3395, 0.0001, SRC_101 " 9.3 GUF interval (from memory)");
    const long M = 200000;
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, NULL, M, 2, 101, &LIN, &MC), GC_OK);
    const gc_uncert_mc_output *r = &MC.out[0];
    /* the printed MCM figures come from M = 10^6 trials: their own scatter is
     * about sqrt(M / 10^6) of ours, and the rounding half a unit of 0.0001 */
    double ue = mass_exact_u(), theirs = sqrt(1.0 + (double)M / 1e6);
    CHECK_ABS(ue, 0.0754, 0.00005 + 4.0 * ue / sqrt(2e6), SRC_101 " 9.3 MCM u (from memory)");
    CHECK_ABS(r->mean, 1.2340, 4.0 * r->se_mean, "exact mean 1.234 mg");
    CHECK_ABS(r->u, ue, 4.0 * r->se_u, "exact u of delta_m");
    CHECK_ABS(r->low, 1.0834, 0.00005 + 4.0 * theirs * r->se_low,
              SRC_101 " 9.3 MCM (from memory)");
    CHECK_ABS(r->high, 1.3825, 0.00005 + 4.0 * theirs * r->se_high,
              SRC_101 " 9.3 MCM (from memory)");
    CU_ASSERT_EQUAL(r->disagrees, 1);
    CU_ASSERT_EQUAL(r->linear_validated, 0);
    printf("\n  JCGM 101 9.3: MC %.4f mg, u %.4f (exact %.5f), [%.4f, %.4f] s_e %.4f, %.4f; "
           "symmetric [%.4f, %.4f]; d_low %.4f, d_high %.4f, tolerance %.4f\n", r->mean, r->u,
           ue, r->low, r->high, r->se_low, r->se_high, r->sym_low, r->sym_high, r->d_low,
           r->d_high, r->tolerance);
}

/* ---- reproducibility and threads ------------------------------------------- */

typedef struct clone_count { atomic_int clones, releases; } clone_count;
static clone_count CLONES;

static void *h2_clone(void *ctx)
{
    (void)ctx;
    atomic_fetch_add(&CLONES.clones, 1);
    return malloc(16);
}

static void h2_release(void *ctx)
{
    atomic_fetch_add(&CLONES.releases, 1);
    free(ctx);
}

static int same_mc(const gc_uncert_mc_result *a, const gc_uncert_mc_result *b)
{
    if (a->n_out != b->n_out || a->n_ok != b->n_ok)
        return 0;
    for (int q = 0; q < a->n_out; q++) {
        const gc_uncert_mc_output *x = &a->out[q], *y = &b->out[q];
        if (x->mean != y->mean || x->u != y->u || x->low != y->low || x->high != y->high ||
            x->sym_low != y->sym_low || x->sym_high != y->sym_high)
            return 0;
    }
    return 1;
}

static void test_mc_threads_and_seed(void)
{
    /* H.2's model with its correlated inputs plus a rectangular companion: the
     * answer is identical (bit for bit) for 1, 2 and 4 threads and a repeated
     * seed, and differs for another seed. */
    gc_uncert_input in[3];
    double r[9];
    h2_inputs(in, r);
    in[2].dist = GC_UNCERT_NORMAL;
    gc_uncert_model m = { f_rxz, NULL, 3, 3, h2_clone, h2_release };
    const long M = 20000;
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, r, M, 1, 99, NULL, &MC), GC_OK);
    const int threads[3] = { 2, 4, 1 };
    for (int t = 0; t < 3; t++) {
        atomic_store(&CLONES.clones, 0);
        atomic_store(&CLONES.releases, 0);
        CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, r, M, threads[t], 99, NULL, &MC2), GC_OK);
        CU_ASSERT(same_mc(&MC, &MC2));
        CU_ASSERT_EQUAL(atomic_load(&CLONES.clones), threads[t] - 1);
        CU_ASSERT_EQUAL(atomic_load(&CLONES.releases), threads[t] - 1);
    }
    CU_ASSERT_EQUAL_FATAL(mc_run(&m, in, r, M, 2, 100, NULL, &MC2), GC_OK);
    CU_ASSERT(!same_mc(&MC, &MC2));
    /* the statistics agree with the linear result (near-linear here) */
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, NULL), GC_OK);
    for (int q = 0; q < 3; q++)
        CHECK_ABS(MC.out[q].u, LIN.out[q].u_c, 4.0 * LIN.out[q].u_c / sqrt(2.0 * (M - 1)),
                  SRC_H2 " linear u vs MC u");
    /* the linear method on several threads: identical numbers */
    o.threads = 3;
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN2, NULL), GC_OK);
    for (int q = 0; q < 3; q++)
        CU_ASSERT(LIN.out[q].u_c == LIN2.out[q].u_c);
}

/* Fails (as a model refusing an input) above x = 1.02 u: about 2.3 % of normal samples. */
static int f_fails(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    if (x[0] > 1.02)
        return GC_ERR_INFEASIBLE;
    y[0] = x[0];
    return GC_OK;
}

/* The same edge, reported as a non-finite output instead of an error code. */
static int f_nan(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    y[0] = x[0] > 1.02 ? NAN : x[0];
    return GC_OK;
}

static void test_mc_failures(void)
{
    gc_uncert_input in;
    gc_uncert_input_init(&in, 1.0, 0.01);
    gc_uncert_model m = model(f_fails, NULL, 1, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.samples = 20000;
    o.threads = 2;
    gc_error e;
    CU_ASSERT_EQUAL(gc_uncert_monte_carlo(&m, &in, NULL, NULL, 0, &o, NULL, &MC, &e),
                    GC_ERR_INFEASIBLE);
    CU_ASSERT_STRING_EQUAL(e.field, "samples");
    /* P(Z > 2) = 0.02275 (normal table): counted within 5 binomial sigma */
    double want = 0.02275 * o.samples, sd = sqrt(want * (1 - 0.02275));
    CHECK_ABS((double)MC.n_failed, want, 5.0 * sd, "P(Z > 2), normal distribution");
    CU_ASSERT(MC.first_failed >= 0 && MC.first_failed_code == GC_ERR_INFEASIBLE);
    CU_ASSERT_EQUAL(MC.n_ok + MC.n_failed, o.samples);
    o.max_failed_fraction = 0.05;
    CU_ASSERT_EQUAL(gc_uncert_monte_carlo(&m, &in, NULL, NULL, 0, &o, NULL, &MC2, &e), GC_OK);
    CU_ASSERT(MC2.n_failed == MC.n_failed && MC2.out[0].high <= 1.02);
    /* a non-finite output counts as a failed sample, the same ones */
    gc_uncert_model mn = model(f_nan, NULL, 1, 1);
    CU_ASSERT_EQUAL(gc_uncert_monte_carlo(&mn, &in, NULL, NULL, 0, &o, NULL, &MC2, &e), GC_OK);
    CU_ASSERT(MC2.n_failed == MC.n_failed && MC2.first_failed == MC.first_failed);
    CU_ASSERT_EQUAL(MC2.first_failed_code, GC_ERR_INFEASIBLE);
    CU_ASSERT(isfinite(MC2.out[0].mean) && isfinite(MC2.out[0].u));
    /* gc_uncert_mc_draw gives the inputs the run drew: the first failed sample is the
     * first one above the edge, every earlier one is below it */
    double x;
    CU_ASSERT_EQUAL_FATAL(gc_uncert_mc_draw(&in, 1, NULL, o.seed, MC.first_failed, &x, &e),
                          GC_OK);
    CU_ASSERT(x > 1.02);
    int below = 1;
    for (long j = 0; j < MC.first_failed; j++) {
        CU_ASSERT_EQUAL_FATAL(gc_uncert_mc_draw(&in, 1, NULL, o.seed, j, &x, &e), GC_OK);
        below &= x <= 1.02;
    }
    CU_ASSERT(below);
    CU_ASSERT_EQUAL(gc_uncert_mc_draw(&in, 1, NULL, o.seed, -1, &x, &e), GC_ERR_INVALID);
}

/* ---- the real Brayton preset ----------------------------------------------- */

typedef struct brayton_ctx {
    gc_brayton_input base;
    gc_brayton_result res;
} brayton_ctx;

static const size_t BR_IN[5] = {
    offsetof(gc_brayton_input, pressure_ratio),
    offsetof(gc_brayton_input, turbine_inlet_temperature),
    offsetof(gc_brayton_input, compressor_efficiency),
    offsetof(gc_brayton_input, turbine_efficiency),
    offsetof(gc_brayton_input, site) + offsetof(gc_site_input, T_K),
};

static int f_brayton_preset(void *ctx, const double *x, int nx, double *y, int ny)
{
    brayton_ctx *c = ctx;
    gc_brayton_input in = c->base;
    for (int i = 0; i < nx; i++)
        memcpy((char *)&in + BR_IN[i], &x[i], sizeof(double));
    int st = gc_brayton_evaluate(&in, &c->res, NULL);
    if (st != GC_OK)
        return st;
    y[0] = c->res.thermal_efficiency;
    if (ny > 1)
        y[1] = c->res.specific_work;
    return GC_OK;
}

static void test_brayton_preset(void)
{
    /* cold-air standard (cp = 1005 J/(kg K), k = 1.4) with component
     * efficiencies: with x = rp^((k-1)/k),
     *   w = cp (T3 eta_t (1 - 1/x) - T1 (x - 1) / eta_c),
     *   q = cp (T3 - T1 - T1 (x - 1) / eta_c),  eta = w / q
     * (closed form of engineering thermodynamics texts); the derivatives are
     * those of these expressions, here by a fine Richardson table of the closed
     * form itself (exact to 1e-10), and the engine's must agree to 1e-6. */
    static brayton_ctx c;
    gc_brayton_input_init(&c.base);
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(&c.base.gas, 1005.0, 1.4, NULL), GC_OK);
    c.base.has_gas = 1;
    c.base.site.has_temperature = c.base.site.has_pressure = 1;
    c.base.site.P_Pa = 100000.0;
    c.base.flags = GC_BRAYTON_NO_OPTIMUM | GC_BRAYTON_NO_AREAS;
    gc_uncert_input in[5];
    const double x0[5] = { 12.0, 1400.0, 0.86, 0.89, 300.0 };
    const double u0[5] = { 0.1, 5.0, 0.01, 0.01, 1.0 };
    for (int i = 0; i < 5; i++)
        gc_uncert_input_init(&in[i], x0[i], u0[i]);
    in[2].has_hi = in[3].has_hi = 1;
    in[2].hi = in[3].hi = 1.0;
    gc_uncert_model m = model(f_brayton_preset, &c, 5, 2);
    double d[2][5];
    for (int i = 0; i < 5; i++) {          /* closed-form derivatives, Richardson on the formula */
        double h = 1e-3 * x0[i], xp[5], f[4][2];
        const double off[4] = { h, -h, h / 2, -h / 2 };
        for (int k = 0; k < 4; k++) {
            memcpy(xp, x0, sizeof xp);
            xp[i] += off[k];
            double xx = pow(xp[0], 0.4 / 1.4), T1 = xp[4], T3 = xp[1];
            double w = 1005.0 * (T3 * xp[3] * (1 - 1 / xx) - T1 * (xx - 1) / xp[2]);
            double q = 1005.0 * (T3 - T1 - T1 * (xx - 1) / xp[2]);
            f[k][0] = w / q;
            f[k][1] = w;
        }
        for (int o = 0; o < 2; o++) {
            double d1 = (f[0][o] - f[1][o]) / (2 * h), d2 = (f[2][o] - f[3][o]) / h;
            d[o][i] = d2 + (d2 - d1) / 3.0;
        }
    }
    for (int method = 0; method < 2; method++) {
        gc_uncert_options o;
        gc_uncert_options_init(&o);
        o.diff = (gc_uncert_diff)method;
        CU_ASSERT_EQUAL_FATAL(gc_uncert_sensitivities(&m, in, NULL, 0, NULL, 0, &o, &SENS, NULL),
                              GC_OK);
        double worst = 0.0;
        for (int q = 0; q < 2; q++)
            for (int i = 0; i < 5; i++) {
                CHECK_REL(SENS.dydx[q][i], d[q][i], 1e-6, "cold-air Brayton closed form");
                worst = fmax(worst, err_rel(SENS.dydx[q][i], d[q][i], 0.0));
            }
        CU_ASSERT_EQUAL(SENS.side[2], 0);   /* 0.86 + h stays below 1 */
        printf("\n  Brayton preset (cold air): worst relative error of dy/dx, %s %.2e\n",
               method ? "Richardson" : "central", worst);
    }
}

/* ---- bad inputs ------------------------------------------------------------ */

static int f_never(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)x, (void)nx, (void)y, (void)ny;
    return GC_ERR_RANGE;
}

static int f_narrow(void *ctx, const double *x, int nx, double *y, int ny)
{
    (void)ctx, (void)nx, (void)ny;
    if (x[0] != 1.0)
        return GC_ERR_INVALID;   /* defined at one point only */
    y[0] = x[0];
    return GC_OK;
}

static void expect_invalid(gc_uncert_input *in, int nx, const double *r, const char *field)
{
    gc_uncert_model m = model(f_sum2, NULL, nx, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    gc_error e;
    CU_ASSERT_EQUAL(gc_uncert_linear(&m, in, r, NULL, 0, &o, &LIN, &e), GC_ERR_INVALID);
    if (strcmp(e.field, field) != 0)
        fprintf(stderr, "\n  field %s, expected %s (%s)\n", e.field, field, e.message);
    CU_ASSERT_STRING_EQUAL(e.field, field);
}

static void test_bad_inputs(void)
{
    gc_uncert_input in[2];
    gc_uncert_input_init(&in[0], 1.0, -0.1);
    gc_uncert_input_init(&in[1], 1.0, 0.1);
    in[0].name = "/pressure_ratio";
    in[1].name = "/turbine_inlet_temperature";
    expect_invalid(in, 2, NULL, "/pressure_ratio");
    in[0].u = 0.1;
    in[1].value = NAN;
    expect_invalid(in, 2, NULL, "/turbine_inlet_temperature");
    in[1].value = 1.0;
    in[1].has_parts = 1, in[1].u_sys = 0.3, in[1].u_rand = 0.4, in[1].u = 0.6;   /* not 0.5 */
    expect_invalid(in, 2, NULL, "/turbine_inlet_temperature");
    in[1].u = 0.5;
    in[1].has_lo = 1, in[1].lo = 2.0;            /* value below its bound */
    expect_invalid(in, 2, NULL, "/turbine_inlet_temperature");
    in[1].has_lo = 0;
    in[1].dof = 0.5;
    expect_invalid(in, 2, NULL, "/turbine_inlet_temperature");
    in[1].dof = 0.0;
    const double asym[4] = { 1, 0.2, 0.3, 1 }, big[4] = { 1, 1.5, 1.5, 1 };
    expect_invalid(in, 2, asym, "correlation/0/1");
    expect_invalid(in, 2, big, "correlation/0/1");
    const double ok[4] = { 1, 0.2, 0.2, 1 };
    in[1].dist = GC_UNCERT_RECTANGULAR;
    expect_invalid(in, 2, ok, "correlation/0/1");
    in[1].dist = GC_UNCERT_NORMAL;
    gc_uncert_model m = model(f_sum2, NULL, 2, 1);
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    gc_error e;
    o.threads = 0;
    CU_ASSERT_EQUAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "threads");
    gc_uncert_options_init(&o);
    o.samples = GC_UNCERT_MC_MAX_SAMPLES + 1;
    CU_ASSERT_EQUAL(gc_uncert_monte_carlo(&m, in, NULL, NULL, 0, &o, NULL, &MC, &e),
                    GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "samples");
    gc_uncert_options_init(&o);
    o.coverage_probability = 1.0;
    CU_ASSERT_EQUAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "coverage_probability");
    /* the model fails at the best estimates: its own code */
    gc_uncert_options_init(&o);
    gc_uncert_model bad = model(f_never, NULL, 2, 1);
    CU_ASSERT_EQUAL(gc_uncert_linear(&bad, in, NULL, NULL, 0, &o, &LIN, &e), GC_ERR_RANGE);
    /* no derivative on either side: GC_ERR_INFEASIBLE naming the input */
    gc_uncert_model nar = model(f_narrow, NULL, 1, 1);
    CU_ASSERT_EQUAL(gc_uncert_linear(&nar, in, NULL, NULL, 0, &o, &LIN, &e), GC_ERR_INFEASIBLE);
    CU_ASSERT_STRING_EQUAL(e.field, "/pressure_ratio");
    /* a linear result with other outputs cannot validate a Monte Carlo run */
    CU_ASSERT_EQUAL_FATAL(gc_uncert_linear(&m, in, NULL, NULL, 0, &o, &LIN, &e), GC_OK);
    LIN.out[0].output = 5;
    CU_ASSERT_EQUAL(gc_uncert_monte_carlo(&m, in, NULL, NULL, 0, &o, &LIN, &MC, &e),
                    GC_ERR_INVALID);
}

static const gc_test_case cases[] = {
    { "quantiles_scipy", test_quantiles_scipy },
    { "gum_table_g2", test_gum_table_g2 },
    { "conversions", test_conversions },
    { "tolerance_and_intervals", test_tolerance_and_intervals },
    { "cholesky", test_cholesky },
    { "random_stream", test_random_stream },
    { "derivatives_known", test_derivatives_known },
    { "sensitivity_subsets", test_sensitivity_subsets },
    { "linear_uncertainties", test_linear_uncertainties },
    { "budget_parts", test_budget_parts },
    { "welch_satterthwaite", test_welch_satterthwaite },
    { "gum_h1", test_gum_h1 },
    { "gum_h2", test_gum_h2 },
    { "mc_near_linear", test_mc_near_linear },
    { "mc_chi_square", test_mc_chi_square },
    { "mc_additive", test_mc_additive },
    { "mc_mass", test_mc_mass },
    { "mc_threads_and_seed", test_mc_threads_and_seed },
    { "mc_failures", test_mc_failures },
    { "brayton_preset", test_brayton_preset },
    { "bad_inputs", test_bad_inputs },
    { NULL, NULL }
};

int main(void)
{
    return gc_run_suite("uncert", cases);
}
