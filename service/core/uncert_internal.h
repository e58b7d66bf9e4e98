/*
 * uncert_internal.h — private helpers shared by the uncertainty engine's
 * files (uncert.c, uncert_diff.c, uncert_mc.c, uncert_run.c,
 * uncert_stats.c); not part of the public contract in
 * include/gascycle/uncert.h.
 *
 *   - the batch runner: evaluates the model at n points on one or more
 *     threads; point j's inputs come from a callback that depends only on
 *     j, and its outputs and status land at index j, so the result is the
 *     same for any thread count and any order of work;
 *   - the input covariance V = r o (a a^T) + diag(s^2) (see uncert.h);
 *   - the Jacobian of the model at the best estimates (uncert_diff.c);
 *   - option and selection checks.
 *
 * Units: the caller's (see uncert.h).
 */
#ifndef GC_CORE_UNCERT_INTERNAL_H
#define GC_CORE_UNCERT_INTERNAL_H

#include "gascycle/uncert.h"

/* Fills x[0..nx-1] with the inputs of point j. */
typedef void (*gc__uncert_point_fn)(const void *job, long j, double *x);

typedef struct gc__uncert_batch {
    const gc_uncert_model *m;
    long n;                      /* points */
    gc__uncert_point_fn point;
    const void *job;             /* passed to point */
    double *y;                   /* n x m->ny outputs: point j at y + j * ny */
    int *status;                 /* n codes: GC_OK, the model's code, or GC_ERR_INFEASIBLE
                                    for a non-finite output */
    int threads;                 /* 1..GC_UNCERT_MAX_THREADS */
} gc__uncert_batch;

/* Runs the batch. Worker threads that cannot be started (or whose ctx
 * cannot be cloned) leave their share to the others: the result does not
 * change. */
void gc__uncert_run(const gc__uncert_batch *b);

/* The shared parts a_i, random parts s_i and the covariance V (nx x nx,
 * row-major) of the inputs; corr may be NULL. */
void gc__uncert_covariance(const gc_uncert_input *in, int nx, const double *corr, double *a,
                           double *s, double *V);

/* The Jacobian at the best estimates for the inputs sel[0..n_sel-1], all
 * model outputs: y0[ny], d[o * GC_UNCERT_MAX_INPUTS + c] and its error
 * estimate e[...] for column c (input sel[c]), the step and side per
 * column, and the number of evaluations. */
typedef struct gc__uncert_jac {
    double y0[GC_UNCERT_MAX_OUTPUTS];
    double d[GC_UNCERT_MAX_OUTPUTS * GC_UNCERT_MAX_INPUTS];
    double e[GC_UNCERT_MAX_OUTPUTS * GC_UNCERT_MAX_INPUTS];
    double step[GC_UNCERT_MAX_INPUTS];
    int side[GC_UNCERT_MAX_INPUTS];
    long evaluations;
} gc__uncert_jac;

int gc__uncert_jacobian(const gc_uncert_model *m, const gc_uncert_input *in, const int *sel,
                        int n_sel, const gc_uncert_options *opt, gc__uncert_jac *J,
                        gc_error *err);

/* Checks the model description and the options the methods share. */
int gc__uncert_check_model(const gc_uncert_model *m, gc_error *err);
int gc__uncert_check_options(const gc_uncert_options *opt, gc_error *err);
/* Checks a selection of n indices below limit (sel NULL: all, n ignored)
 * and writes the effective list to out; returns its length, or -1 with err
 * set (field = what). */
int gc__uncert_selection(const int *sel, int n, int limit, int *out, const char *what,
                         gc_error *err);

/* floor(nu_eff) for Student's t (GUM G.4.1 note 1: truncate to the next
 * lower integer), at least 1; a value within 1e-9 below an integer (e.g. 8
 * from rounding) counts as that integer. */
double gc__uncert_dof_floor(double nu_eff);

/* The name of input i for messages ("input <i>" when it has none). */
const char *gc__uncert_name(const gc_uncert_input *in, int i, char *buf, int len);

/* Sorts v[0..n-1] ascending (finite values). */
void gc__uncert_sort(double *v, long n);

/* SplitMix64's output function (the finaliser of Steele, Lea & Flood 2014). */
uint64_t gc__uncert_mix64(uint64_t z);
/* The n-th uniform number in (0, 1) of the stream with key = mix64(seed):
 * mix64(key + (n + 1) gamma), top 53 bits plus one half, times 2^-53. */
double gc__uncert_uniform_key(uint64_t key, uint64_t n);

#endif
