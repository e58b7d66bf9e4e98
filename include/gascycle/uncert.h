/*
 * uncert.h — measurement uncertainty and sensitivities of any model with
 * numeric inputs and outputs: linear propagation (ISO GUM, JCGM 100:2008),
 * Monte Carlo propagation of distributions (JCGM 101:2008), the systematic
 * and random parts propagated separately (ASME PTC 19.1 practice), and the
 * matrix of sensitivity coefficients with normalised elasticities.
 *
 * The engine is generic over a model callback y = f(x) (nx inputs, ny
 * outputs), so one engine serves every preset: the caller maps its fields to
 * x and its outputs to y. Units are the caller's: x, u(x), steps and bounds
 * are in the units of each input, y and u(y) in the units of each output.
 *
 * Inputs. Each input has a best estimate x_i and a standard uncertainty,
 * either whole (u_i) or in two parts (has_parts: systematic b_i and random
 * s_i standard uncertainties, u_i^2 = b_i^2 + s_i^2, ASME PTC 19.1). The
 * conversion helpers turn an expanded uncertainty U at coverage factor k
 * (u = U / k, GUM 3.3.5 and 6.2.1), a relative one (u = rel |x|) or the
 * half-width a of a rectangular distribution (u = a / sqrt 3, GUM 4.3.7)
 * into a standard uncertainty. A distribution (normal or rectangular) is
 * used by the Monte Carlo method; the linear method needs only u_i.
 *
 * Correlation. An optional nx x nx matrix r (row-major, symmetric, unit
 * diagonal, positive semi-definite). Convention (for the service to state
 * in its output):
 * r_ij correlates the "shared" parts a_i of the inputs, where a_i = u_i for
 * an input given whole and a_i = b_i (the systematic part) for an input
 * given in parts; random parts are independent (the practice of ASME PTC
 * 19.1 analyses: correlated errors come from shared calibration, i.e.
 * systematic effects). The input
 * covariance is therefore
 *     V_ij = r_ij a_i a_j + delta_ij s_i^2,
 * which is GUM eq. (13)'s u(x_i, x_j) = r_ij u_i u_j when no parts are
 * given. A rectangular input may not be correlated with another input.
 *
 * Linear propagation (JCGM 100:2008 5.1.2 eq. (10), 5.2.2 eq. (13)):
 *     u_c^2(y) = c^T V c,   c_i = dy/dx_i at the best estimates,
 * with the budget per input: sensitivity c_i, contribution c_i u_i (signed;
 * GUM 5.1.3 uses its magnitude), share of variance (c_i u_i)^2 / u_c^2 (the
 * correlation terms' share is reported apart), sorted by share; when every
 * input with an uncertainty has its parts, the systematic and random
 * standard uncertainties of y, b_y^2 = c^T (r o a a^T) c and
 * s_y^2 = sum c_i^2 s_i^2, with u_c^2 = b_y^2 + s_y^2 (RSS). The output
 * covariance J V J^T gives the correlation between outputs.
 * Expanded uncertainty U = k u_c with k = 2 by default, a given k, or k
 * from a coverage probability p: k = z_{(1+p)/2} of the normal, or, with
 * Welch-Satterthwaite on (GUM G.4.1 eq. (G.2b)) and finite degrees of
 * freedom, k = t_{(1+p)/2}(nu) of Student's t with nu = floor(nu_eff) (GUM
 * G.4.1 note 1). Welch-Satterthwaite needs independent inputs: with a
 * correlation between inputs that contribute, nu_eff is not formed (the
 * result says so) and k comes from the normal.
 *
 * Sensitivity coefficients by finite differences (no analytic derivatives
 * of the model are needed):
 *   GC_UNCERT_CENTRAL     (f(x+h) - f(x-h)) / 2h, truncation O(h^2):
 *                         2 evaluations per input, no error estimate;
 *   GC_UNCERT_RICHARDSON  the central difference at h and h/2 extrapolated,
 *                         D = D(h/2) + (D(h/2) - D(h)) / 3, truncation
 *                         O(h^4), with the error estimate |D - D(h/2)|:
 *                         4 evaluations per input.
 * Both reuse the one evaluation at the best estimates. The step is
 * h = rel_step * max(|x_i|, u_i) (1 when both are zero) unless the input
 * gives its own; near a bound of the input's domain (lo, hi), or where the
 * model cannot be evaluated on one side, the one-sided formula of the same
 * order on the other side is used (second order: the parabola through
 * f0, f(x + h/2), f(x + h), i.e. (-3 f0 + 4 f(x + h/2) - f(x + h)) / h;
 * Richardson: forward differences at h, h/2, h/4 extrapolated twice,
 * O(h^3)). The default steps (GC_UNCERT_STEP_CENTRAL,
 * GC_UNCERT_STEP_RICHARDSON) balance truncation against rounding and the
 * model's own numerical noise; tests/unit/test_uncert.c shows 1e-6
 * relative accuracy or better on functions with known derivatives.
 *
 * Monte Carlo (JCGM 101:2008): M samples (2 .. GC_UNCERT_MC_MAX_SAMPLES),
 * inputs drawn from their distributions (normal: Box-Muller; rectangular:
 * x +- sqrt(3) u; correlated normal inputs: x + L z with L L^T = V,
 * Cholesky), the model evaluated per sample on `threads` worker threads,
 * then per output the mean and standard deviation (7.6), the shortest
 * coverage interval (7.7.3) and the probabilistically symmetric one (7.7.2)
 * at probability p. Random numbers: SplitMix64 (Steele, Lea & Flood,
 * "Fast splittable pseudorandom number generators", OOPSLA 2014), used as a
 * counter-based generator: the n-th number (n = 0, 1, ...) of a run is
 * mix(key + (n + 1) gamma) with key = mix(seed) and gamma the generator's
 * odd constant, and sample j uses the numbers j K .. j K + K - 1
 * (K = 2 nx). Every sample therefore depends only on (seed, j), and the
 * statistics are formed after all samples, in sample order: the result is
 * identical for any number of threads and any split of the work.
 * A sample whose evaluation fails (an error code or a non-finite output) is
 * counted and reported (number, first sample index and code), never hidden;
 * the statistics are over the successful samples, and more failures than
 * max_failed_fraction of M make the run an error.
 * Statistical accuracy of the run (JCGM 101 7.9.4): the successful samples
 * are also cut, in sample order, into h = GC_UNCERT_MC_BLOCKS blocks when
 * each block holds at least 100 / (1 - p) of them (the smallest M of the
 * adaptive procedure of 7.9.4, from memory); the standard deviation
 * of the average of the h block values, sqrt(sum (z_r - zbar)^2 /
 * (h (h - 1))), estimates the standard error of the mean, of u and of each
 * interval end point. For an end point the larger of that and the order-
 * statistics estimate is kept (ranks j -+ m, m = ceil(sqrt(M a (1 - a))),
 * a = j / M, span about two binomial standard deviations of the rank:
 * s_e = (y_(j+m) - y_(j-m)) / 2). The blocks matter: for a symmetric
 * distribution the shortest interval slides along its flat optimum, and
 * its end points scatter several times more than single quantiles do.
 * Validation against the linear result (JCGM 101 clause 8): with the GUM
 * interval y -+ U_p at the same p, d_low = |y - U_p - y_low| and d_high =
 * |y + U_p - y_high|; the linear result is validated when both are within
 * the numerical tolerance delta of u(y) at n_dig significant digits
 * (JCGM 101 7.9.2 and 8.2). Because a finite M has its own scatter, the
 * engine flags a disagreement (non-linearity) only beyond
 * max(delta, GC_UNCERT_MC_SE_FACTOR s_e), s_e the larger end-point standard
 * error: with 9 degrees of freedom in the block estimate, 4 s_e keeps the
 * false-alarm rate near 0.3 % per end point (Student's t). Both d's, delta
 * and the tolerance are in the result.
 *
 * Model contract. eval(ctx, x, nx, y, ny) returns GC_OK and fills y, or an
 * error code (GC_ERR_INVALID, GC_ERR_INFEASIBLE, ... as the model
 * reports). With threads > 1 each extra worker thread gets its own ctx from
 * clone(ctx) (released with release() at the end); the calling thread uses
 * ctx itself. Without clone, eval must be safe to call concurrently with the
 * same ctx. Worker threads have GC_UNCERT_THREAD_STACK bytes of stack.
 *
 * Memory and state: no global state; results are plain structs (a
 * gc_uncert_linear_result is about 140 KB: keep it on the heap); the
 * Monte Carlo run allocates M (ny + 1.1) doubles and M ints plus small
 * scratch, bounded by the limits below (about 80 MB at the largest: a
 * server should cap M lower for its requests), and frees them before
 * returning.
 *
 * Errors: GC_ERR_INVALID with `field` set to the input's name (its JSON
 * pointer for the service) or to the option's name ("samples", "threads",
 * "coverage_probability", ...); GC_ERR_NOMEM; the model's own code when it
 * cannot be evaluated at the best estimates; GC_ERR_INFEASIBLE when a
 * derivative cannot be formed (the model fails on both sides of an input)
 * or too many Monte Carlo samples fail.
 */
#ifndef GASCYCLE_UNCERT_H
#define GASCYCLE_UNCERT_H

#include "gascycle/error.h"

#include <stdint.h>

#define GC_UNCERT_MAX_INPUTS 64
#define GC_UNCERT_MAX_OUTPUTS 32
#define GC_UNCERT_MAX_THREADS 64
#define GC_UNCERT_MC_MAX_SAMPLES 1000000L   /* largest M accepted */
#define GC_UNCERT_MC_MAX_VALUES 8000000L    /* largest M x (selected outputs) kept (64 MB) */
#define GC_UNCERT_THREAD_STACK (4u << 20)   /* bytes of stack per worker thread */

#define GC_UNCERT_MC_BLOCKS 10             /* blocks for the standard errors (JCGM 101 7.9.4) */
#define GC_UNCERT_MC_SE_FACTOR 4.0          /* disagreement beyond this many end-point s_e */

#define GC_UNCERT_STEP_CENTRAL 1e-4         /* default rel_step, central differences */
#define GC_UNCERT_STEP_RICHARDSON 2e-3      /* default rel_step, Richardson */

typedef enum gc_uncert_dist {
    GC_UNCERT_NORMAL = 0,        /* Gaussian with standard deviation u */
    GC_UNCERT_RECTANGULAR = 1    /* uniform on x -+ sqrt(3) u */
} gc_uncert_dist;

typedef enum gc_uncert_diff {
    GC_UNCERT_CENTRAL = 0,       /* 2 evaluations per input, O(h^2) */
    GC_UNCERT_RICHARDSON = 1     /* 4 evaluations per input, O(h^4), error estimate */
} gc_uncert_diff;

/* y = f(x): GC_OK with y[0..ny-1] filled, or an error code. */
typedef int (*gc_uncert_eval_fn)(void *ctx, const double *x, int nx, double *y, int ny);

typedef struct gc_uncert_model {
    gc_uncert_eval_fn eval;
    void *ctx;                   /* passed to eval in the calling thread */
    int nx, ny;                  /* 1..GC_UNCERT_MAX_INPUTS, 1..GC_UNCERT_MAX_OUTPUTS */
    void *(*clone)(void *ctx);   /* optional: a private ctx for one worker thread
                                    (NULL return: no memory, the thread is not used) */
    void (*release)(void *ctx_clone); /* frees a clone (may be NULL) */
} gc_uncert_model;

typedef struct gc_uncert_input {
    const char *name;            /* label for errors (the service: the input's JSON
                                    pointer); may be NULL */
    double value;                /* best estimate x_i, caller's unit */
    double u;                    /* standard uncertainty u_i >= 0 (whole); with has_parts: 0 or
                                    sqrt(u_sys^2 + u_rand^2) (anything else is refused) */
    int has_parts;               /* 1: u_sys and u_rand given (ASME PTC 19.1) */
    double u_sys;                /* systematic standard uncertainty b_i >= 0 */
    double u_rand;               /* random standard uncertainty s_i >= 0 */
    gc_uncert_dist dist;         /* Monte Carlo distribution of the whole u_i */
    double dof;                  /* degrees of freedom of u_i, >= 1; 0 = infinite */
    int has_lo, has_hi;          /* the model's domain for this input is known */
    double lo, hi;               /* inclusive bounds (lo < hi): steps never leave them */
    double step;                 /* difference step, > 0, caller's unit; 0 = automatic */
} gc_uncert_input;

typedef struct gc_uncert_options {
    gc_uncert_diff diff;         /* derivative method (default GC_UNCERT_CENTRAL) */
    double rel_step;             /* relative step; 0 = the method's default */
    double coverage_factor;      /* k for U = k u_c when coverage_probability is 0 (default 2) */
    double coverage_probability; /* p in (0, 1): k from p (linear); 0 = use coverage_factor.
                                    Monte Carlo uses p or, when 0, GC_UNCERT_MC_DEFAULT_P */
    int welch_satterthwaite;     /* 1: k from Student's t at floor(nu_eff) when p is given */
    int threads;                 /* worker threads, 1..GC_UNCERT_MAX_THREADS (default 1) */
    long samples;                /* Monte Carlo M (default 10000) */
    uint64_t seed;               /* Monte Carlo seed (default 1) */
    int n_dig;                   /* significant digits of u(y) for JCGM 101 delta, 1..3
                                    (default 2) */
    double max_failed_fraction;  /* Monte Carlo failures tolerated, [0, 1] (default 0.001) */
} gc_uncert_options;

#define GC_UNCERT_MC_DEFAULT_P 0.95

/* ---- sensitivities --------------------------------------------------------- */

typedef struct gc_uncert_sens {
    int n_in, n_out;
    int in[GC_UNCERT_MAX_INPUTS];          /* input index of each column */
    int out[GC_UNCERT_MAX_OUTPUTS];        /* output index of each row */
    double x[GC_UNCERT_MAX_INPUTS];        /* best estimates of the columns */
    double y[GC_UNCERT_MAX_OUTPUTS];       /* f(x) of the rows */
    double step[GC_UNCERT_MAX_INPUTS];     /* step h used per column */
    int side[GC_UNCERT_MAX_INPUTS];        /* 0 central, +1 forward, -1 backward */
    double dydx[GC_UNCERT_MAX_OUTPUTS][GC_UNCERT_MAX_INPUTS];  /* units of y per unit of x */
    double error[GC_UNCERT_MAX_OUTPUTS][GC_UNCERT_MAX_INPUTS]; /* estimated |error| of dydx
                                                                 (Richardson; 0 central) */
    double elasticity[GC_UNCERT_MAX_OUTPUTS][GC_UNCERT_MAX_INPUTS]; /* (x / y) dy/dx, - */
    unsigned char has_elasticity[GC_UNCERT_MAX_OUTPUTS][GC_UNCERT_MAX_INPUTS]; /* 0 when y = 0 */
    long evaluations;                      /* model evaluations used */
} gc_uncert_sens;

/* ---- linear propagation ---------------------------------------------------- */

typedef struct gc_uncert_term {
    int input;                   /* index into the inputs */
    double sensitivity;          /* c_i = dy/dx_i */
    double sensitivity_error;    /* estimated |error| of c_i (Richardson; 0 central) */
    double u;                    /* u(x_i) */
    double contribution;         /* c_i u(x_i), units of y, signed */
    double contribution_sys;     /* c_i b_i (parts given; else c_i u_i) */
    double contribution_rand;    /* c_i s_i (0 without parts) */
    double share;                /* (c_i u_i)^2 / u_c^2 (0 when u_c = 0) */
} gc_uncert_term;

typedef struct gc_uncert_budget {
    int output;                  /* index into the model's outputs */
    double y;                    /* f(x) at the best estimates */
    double u_c;                  /* combined standard uncertainty */
    double k;                    /* coverage factor used */
    double U;                    /* expanded uncertainty k u_c */
    double coverage_probability; /* p the k stands for (0 when k was given) */
    int k_from_t;                /* 1: k from Student's t at floor(nu_eff) */
    double nu_eff;               /* Welch-Satterthwaite; 0 = infinite or not formed */
    int nu_eff_formed;           /* 0: correlated contributing inputs (normal k) */
    int parts_complete;          /* 1: u_sys, u_rand below are valid */
    double u_sys;                /* systematic standard uncertainty of y */
    double u_rand;               /* random standard uncertainty of y */
    double correlation_share;    /* 1 - sum of shares: the correlation terms' share of u_c^2 */
    int n_terms;                 /* inputs with u_i > 0 */
    gc_uncert_term terms[GC_UNCERT_MAX_INPUTS]; /* sorted by share, then input index */
} gc_uncert_budget;

typedef struct gc_uncert_linear_result {
    int n_out;
    gc_uncert_budget out[GC_UNCERT_MAX_OUTPUTS];     /* in the order of the selection */
    double corr[GC_UNCERT_MAX_OUTPUTS][GC_UNCERT_MAX_OUTPUTS]; /* r(y_j, y_l) (0 if a u_c is 0) */
    int has_correlation;         /* 1: the inputs had a correlation matrix */
    long evaluations;            /* model evaluations used */
} gc_uncert_linear_result;

/* ---- Monte Carlo ----------------------------------------------------------- */

typedef struct gc_uncert_mc_output {
    int output;                  /* index into the model's outputs */
    double mean;                 /* JCGM 101 7.6 */
    double u;                    /* standard deviation (1 / (M - 1)) */
    double low, high;            /* shortest coverage interval, 7.7.3 */
    double sym_low, sym_high;    /* probabilistically symmetric interval, 7.7.2 */
    double se_mean, se_u;        /* standard errors of mean and u (blocks; else u / sqrt M,
                                    u / sqrt(2 (M - 1))) */
    double se_low, se_high;      /* standard errors of low and high (blocks, order statistics) */
    /* validation against the linear result (JCGM 101 clause 8), when given */
    int validated_against_linear;/* 1 when the fields below are set */
    double y_linear, U_linear;   /* y and U_p = k_p u_c of the linear method at p */
    double d_low, d_high;        /* |y - U_p - low|, |y + U_p - high| */
    double delta;                /* numerical tolerance of u_c at n_dig digits (7.9.2) */
    double tolerance;            /* max(delta, GC_UNCERT_MC_SE_FACTOR max(se_low, se_high)) */
    int linear_validated;        /* clause 8.2: d_low <= delta and d_high <= delta */
    int disagrees;               /* d_low or d_high > tolerance: non-linearity beyond noise */
} gc_uncert_mc_output;

typedef struct gc_uncert_mc_result {
    long samples;                /* M asked for */
    long n_ok;                   /* samples evaluated */
    long n_failed;               /* samples whose evaluation failed */
    long first_failed;           /* lowest failed sample index (-1 none) */
    int first_failed_code;       /* its code (a gc_status) */
    double coverage_probability; /* p of the intervals */
    uint64_t seed;
    int threads;
    int blocks;                  /* h of the standard errors (0: too few samples per block) */
    int n_out;
    gc_uncert_mc_output out[GC_UNCERT_MAX_OUTPUTS]; /* in the order of the selection */
} gc_uncert_mc_result;

/* ---- functions ------------------------------------------------------------- */

/* Defaults: central differences, default step, k = 2, p = 0 (k given),
 * no Welch-Satterthwaite, 1 thread, M = 10000, seed 1, n_dig 2,
 * max_failed_fraction 0.001. */
void gc_uncert_options_init(gc_uncert_options *o);

/* An input at value x with a whole standard uncertainty u, normal, infinite
 * degrees of freedom, no bounds, automatic step, name NULL. */
void gc_uncert_input_init(gc_uncert_input *in, double x, double u);

/* Standard uncertainty from an expanded uncertainty U at coverage factor
 * k > 0 (GUM 6.2.1): u = U / k. Returns GC_ERR_INVALID for k <= 0, U < 0
 * or non-finite values. */
int gc_uncert_from_expanded(double U, double k, double *u);
/* From a relative uncertainty rel >= 0 (a fraction: 0.25 % is 0.0025) of
 * the value x: u = rel |x|. */
int gc_uncert_from_relative(double rel, double x, double *u);
/* From the half-width a >= 0 of a rectangular distribution (GUM 4.3.7):
 * u = a / sqrt 3. */
int gc_uncert_from_half_width(double a, double *u);

/* The whole standard uncertainty of an input: u, or sqrt(b^2 + s^2). */
double gc_uncert_input_u(const gc_uncert_input *in);

/* Checks the inputs and the correlation matrix (may be NULL) as described
 * above; field = the input's name or "correlation/i/j". */
int gc_uncert_validate(const gc_uncert_input *in, int nx, const double *corr, gc_error *err);

/* Sensitivity coefficients d y_o / d x_i for the inputs in_sel[0..n_in-1]
 * and the outputs out_sel[0..n_out-1] (either NULL: all, in order), with
 * elasticities. Uncertainties are not needed (u only widens an automatic
 * step's scale). */
int gc_uncert_sensitivities(const gc_uncert_model *m, const gc_uncert_input *in,
                            const int *in_sel, int n_in, const int *out_sel, int n_out,
                            const gc_uncert_options *opt, gc_uncert_sens *res, gc_error *err);

/* Linear propagation (GUM) for the outputs out_sel (NULL: all). */
int gc_uncert_linear(const gc_uncert_model *m, const gc_uncert_input *in, const double *corr,
                     const int *out_sel, int n_out, const gc_uncert_options *opt,
                     gc_uncert_linear_result *res, gc_error *err);

/* Monte Carlo propagation (JCGM 101) for the outputs out_sel (NULL: all).
 * lin (may be NULL) is a linear result for the same outputs, in the same
 * order, to validate against (clause 8). */
int gc_uncert_monte_carlo(const gc_uncert_model *m, const gc_uncert_input *in,
                          const double *corr, const int *out_sel, int n_out,
                          const gc_uncert_options *opt, const gc_uncert_linear_result *lin,
                          gc_uncert_mc_result *res, gc_error *err);

/* The inputs x[0..nx-1] of Monte Carlo sample j (0-based) of a run with this
 * seed, exactly as gc_uncert_monte_carlo draws them (for a caller that
 * reports what a failed sample was: res->first_failed). GC_ERR_INVALID for
 * bad inputs or j < 0, GC_ERR_NOMEM. */
int gc_uncert_mc_draw(const gc_uncert_input *in, int nx, const double *corr, uint64_t seed,
                      long j, double *x, gc_error *err);

/* ---- numerical building blocks (exposed for tests and other callers) ----- */

/* Quantile of the standard normal distribution, 0 < P < 1. */
double gc_uncert_normal_quantile(double P);
/* Quantile of Student's t distribution with nu > 0 degrees of freedom. */
double gc_uncert_t_quantile(double P, double nu);
/* Coverage factor for a two-sided coverage probability p in (0, 1):
 * z_{(1+p)/2} (nu = 0) or t_{(1+p)/2}(nu). */
double gc_uncert_coverage_factor(double p, double nu);
/* JCGM 101 7.9.2: the numerical tolerance of z at n_dig significant digits
 * (z = c 10^l with c an n_dig-digit integer: delta = 10^l / 2); 0 for z = 0. */
double gc_uncert_numerical_tolerance(double z, int n_dig);
/* JCGM 101 7.7: coverage intervals of probability p from the M values
 * sorted ascending: shortest (7.7.3) into *lo, *hi and probabilistically
 * symmetric (7.7.2) into *slo, *shi (either pair may be NULL). M >= 2. */
void gc_uncert_coverage_interval(const double *sorted, long M, double p, double *lo, double *hi,
                                 double *slo, double *shi);
/* Cholesky factor L (lower, row-major n x n) of a symmetric positive
 * semi-definite V: zero pivots (within a relative 1e-10) give zero columns.
 * GC_ERR_INVALID when V is not positive semi-definite. */
int gc_uncert_cholesky(const double *V, int n, double *L);
/* The n-th uniform number in (0, 1) of the counter-based stream of a seed. */
double gc_uncert_uniform(uint64_t seed, uint64_t n);

#endif
