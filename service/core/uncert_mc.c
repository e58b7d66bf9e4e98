/*
 * uncert_mc.c — propagation of distributions by the Monte Carlo method
 * (JCGM 101:2008) for the uncertainty engine (uncert.h).
 *
 * Sampling (JCGM 101 6.4 and annex C): input i of sample j takes the
 * uniform numbers U_{jK + 2i} and U_{jK + 2i + 1} (K = 2 nx) of the
 * counter-based SplitMix64 stream of the seed (uncert_stats.c);
 *   normal       z_i = sqrt(-2 ln U1) cos(2 pi U2)   (Box & Muller 1958)
 *   rectangular  z_i = sqrt(3) (2 U1 - 1)            (unit variance)
 * and x = x0 + L z with L L^T = V, the Cholesky factor of the input
 * covariance (a rectangular input is uncorrelated, so its row of L is
 * u_i on the diagonal alone). Samples are evaluated by the batch runner
 * (uncert_run.c) on opt->threads threads.
 *
 * Summaries per selected output, over the successful samples in sample
 * order (so independent of the thread count): mean and standard deviation
 * (7.6), shortest (7.7.3) and probabilistically symmetric (7.7.2) coverage
 * intervals from the sorted values; standard errors from h blocks of the
 * samples (7.9.4) and, for the end points, at least the order-statistics
 * estimate (see uncert.h). Validation against a linear result as in
 * JCGM 101 clause 8 (see uncert.h).
 */
#include "uncert_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

typedef struct mc_job {
    int nx;
    uint64_t key;                /* mix64(seed) */
    const double *x0;
    const double *L;             /* nx x nx lower triangular */
    const gc_uncert_dist *dist;
} mc_job;

static void mc_point(const void *jobp, long j, double *x)
{
    const mc_job *job = jobp;
    int nx = job->nx;
    uint64_t base = (uint64_t)j * (uint64_t)(2 * nx);
    double z[GC_UNCERT_MAX_INPUTS];
    for (int i = 0; i < nx; i++) {
        double u1 = gc__uncert_uniform_key(job->key, base + 2u * (uint64_t)i);
        if (job->dist[i] == GC_UNCERT_RECTANGULAR) {
            z[i] = sqrt(3.0) * (2.0 * u1 - 1.0);
        } else {
            double u2 = gc__uncert_uniform_key(job->key, base + 2u * (uint64_t)i + 1u);
            z[i] = sqrt(-2.0 * log(u1)) * cos(2.0 * M_PI * u2);
        }
    }
    for (int i = 0; i < nx; i++) {
        double v = job->x0[i];
        for (int k = 0; k <= i; k++)
            v += job->L[i * nx + k] * z[k];
        x[i] = v;
    }
}

static int check_mc_options(const gc_uncert_model *m, const gc_uncert_options *o,
                            gc_error *err)
{
    int st = gc__uncert_check_options(o, err);
    if (st != GC_OK)
        return st;
    if (o->samples < 2 || o->samples > GC_UNCERT_MC_MAX_SAMPLES)
        return gc_error_set(err, GC_ERR_INVALID, "samples", "must be 2..%ld",
                            GC_UNCERT_MC_MAX_SAMPLES);
    if (o->samples * (long)m->ny > GC_UNCERT_MC_MAX_VALUES)
        return gc_error_set(err, GC_ERR_INVALID, "samples",
                            "at most %ld samples for a model with %d outputs",
                            GC_UNCERT_MC_MAX_VALUES / m->ny, m->ny);
    if (o->n_dig < 1 || o->n_dig > 3)
        return gc_error_set(err, GC_ERR_INVALID, "significant_digits", "must be 1, 2 or 3");
    if (!(o->max_failed_fraction >= 0.0 && o->max_failed_fraction <= 1.0))
        return gc_error_set(err, GC_ERR_INVALID, "max_failed_fraction", "must be in [0, 1]");
    return GC_OK;
}

/* Standard error of the value at 0-based rank j of the n sorted values. */
static double order_se(const double *s, long n, long j)
{
    double a = (double)(j + 1) / (double)n;
    long m = (long)ceil(sqrt((double)n * a * (1.0 - a)));
    long lo = j - m < 0 ? 0 : j - m, hi = j + m > n - 1 ? n - 1 : j + m;
    return 0.5 * (s[hi] - s[lo]);
}

/* Rank of value v in the sorted s (first index with s[i] == v). */
static long rank_of(const double *s, long n, double v)
{
    long lo = 0, hi = n - 1;
    while (lo < hi) {
        long mid = lo + (hi - lo) / 2;
        if (s[mid] < v)
            lo = mid + 1;
        else
            hi = mid;
    }
    return lo;
}

static void mean_sd(const double *v, long n, double *mean, double *u)
{
    double sum = 0.0, ss = 0.0;
    for (long j = 0; j < n; j++)
        sum += v[j];
    *mean = sum / (double)n;
    for (long j = 0; j < n; j++)
        ss += (v[j] - *mean) * (v[j] - *mean);
    *u = sqrt(ss / (double)(n - 1));
}

/* Blocks for the standard errors (JCGM 101 7.9.4): GC_UNCERT_MC_BLOCKS when
 * each block has at least 100 / (1 - p) samples, else none. */
static int mc_blocks(long n, double p)
{
    double J = ceil(100.0 / (1.0 - p));
    return (double)n >= GC_UNCERT_MC_BLOCKS * J ? GC_UNCERT_MC_BLOCKS : 0;
}

/* The standard deviation of the average of h values (JCGM 101 7.9.4):
 * sqrt(sum (z_r - zbar)^2 / (h (h - 1))). */
static double block_sd(const double *z, int h)
{
    double m = 0.0, ss = 0.0;
    for (int b = 0; b < h; b++)
        m += z[b] / h;
    for (int b = 0; b < h; b++)
        ss += (z[b] - m) * (z[b] - m);
    return sqrt(ss / ((double)h * (h - 1)));
}

/* Standard errors of the mean, u and the shortest interval's end points
 * from h blocks of the values v (sample order); w is scratch of n / h + 1. */
static void block_errors(const double *v, long n, int h, double p, double *w,
                         gc_uncert_mc_output *r)
{
    double z[4][GC_UNCERT_MC_BLOCKS];
    for (int b = 0; b < h; b++) {
        long j0 = n * b / h, j1 = n * (b + 1) / h, m = j1 - j0;
        memcpy(w, v + j0, sizeof(double) * (size_t)m);
        mean_sd(w, m, &z[0][b], &z[1][b]);
        gc__uncert_sort(w, m);
        gc_uncert_coverage_interval(w, m, p, &z[2][b], &z[3][b], NULL, NULL);
    }
    r->se_mean = block_sd(z[0], h);
    r->se_u = block_sd(z[1], h);
    r->se_low = fmax(r->se_low, block_sd(z[2], h));
    r->se_high = fmax(r->se_high, block_sd(z[3], h));
}

/* Summaries of output o from the successful samples (v: scratch of M, w:
 * scratch of M / GC_UNCERT_MC_BLOCKS + 1). */
static void summarise(const double *y, const int *status, long M, int ny, int o, double p,
                      double *v, double *w, gc_uncert_mc_output *r)
{
    long n = 0;
    for (long j = 0; j < M; j++)
        if (status[j] == GC_OK)
            v[n++] = y[j * ny + o];
    r->output = o;
    mean_sd(v, n, &r->mean, &r->u);
    r->se_mean = r->u / sqrt((double)n);
    r->se_u = r->u / sqrt(2.0 * (double)(n - 1));
    int h = mc_blocks(n, p);
    if (h)
        block_errors(v, n, h, p, w, r);   /* before v is sorted: blocks in sample order */
    gc__uncert_sort(v, n);
    gc_uncert_coverage_interval(v, n, p, &r->low, &r->high, &r->sym_low, &r->sym_high);
    r->se_low = fmax(r->se_low, order_se(v, n, rank_of(v, n, r->low)));
    r->se_high = fmax(r->se_high, order_se(v, n, rank_of(v, n, r->high)));
}

/* JCGM 101 clause 8 against the linear budget b at probability p. */
static void validate(const gc_uncert_budget *b, const gc_uncert_options *opt, double p,
                     gc_uncert_mc_output *r)
{
    int use_t = opt->welch_satterthwaite && b->nu_eff > 0.0;
    double k = gc_uncert_coverage_factor(p, use_t ? gc__uncert_dof_floor(b->nu_eff) : 0.0);
    r->validated_against_linear = 1;
    r->y_linear = b->y;
    r->U_linear = k * b->u_c;
    r->d_low = fabs(b->y - r->U_linear - r->low);
    r->d_high = fabs(b->y + r->U_linear - r->high);
    r->delta = gc_uncert_numerical_tolerance(b->u_c > 0.0 ? b->u_c : r->u, opt->n_dig);
    r->tolerance = fmax(r->delta, GC_UNCERT_MC_SE_FACTOR * fmax(r->se_low, r->se_high));
    r->linear_validated = r->d_low <= r->delta && r->d_high <= r->delta;
    r->disagrees = r->d_low > r->tolerance || r->d_high > r->tolerance;
}

static void count_failures(const int *status, long M, gc_uncert_mc_result *res)
{
    res->first_failed = -1;
    for (long j = 0; j < M; j++) {
        if (status[j] == GC_OK)
            continue;
        if (res->n_failed++ == 0) {
            res->first_failed = j;
            res->first_failed_code = status[j];
        }
    }
    res->n_ok = M - res->n_failed;
}

static int failure_error(const gc_uncert_mc_result *res, gc_error *err)
{
    return gc_error_set(err, GC_ERR_INFEASIBLE, "samples",
                        "%ld of %ld Monte Carlo samples could not be evaluated (first: sample "
                        "%ld, %s)", res->n_failed, res->samples, res->first_failed,
                        gc_strerror(res->first_failed_code));
}

static int check_linear(const gc_uncert_linear_result *lin, const int *sel, int n,
                        gc_error *err)
{
    if (lin == NULL)
        return GC_OK;
    if (lin->n_out != n)
        goto bad;
    for (int r = 0; r < n; r++)
        if (lin->out[r].output != sel[r])
            goto bad;
    return GC_OK;
bad:
    return gc_error_set(err, GC_ERR_INVALID, "outputs",
                        "the linear result given for validation has other outputs");
}

typedef struct mc_mem {
    double *V, *L, *y, *v, *w;
    int *status;
} mc_mem;

static int mc_alloc(mc_mem *w, int nx, long M, int ny)
{
    size_t n2 = (size_t)nx * (size_t)nx;
    w->V = malloc(sizeof(double) * n2);
    w->L = malloc(sizeof(double) * n2);
    w->y = malloc(sizeof(double) * (size_t)M * (size_t)ny);
    w->v = malloc(sizeof(double) * (size_t)M);
    w->w = malloc(sizeof(double) * (size_t)(M / GC_UNCERT_MC_BLOCKS + 1));
    w->status = malloc(sizeof(int) * (size_t)M);
    return w->V && w->L && w->y && w->v && w->w && w->status ? GC_OK : GC_ERR_NOMEM;
}

static void mc_free(mc_mem *w)
{
    free(w->V);
    free(w->L);
    free(w->y);
    free(w->v);
    free(w->w);
    free(w->status);
}

/* Draws and evaluates the samples into w->y, w->status. */
static int mc_sample(const gc_uncert_model *m, const gc_uncert_input *in, const double *corr,
                     const gc_uncert_options *opt, mc_mem *w, gc_error *err)
{
    double a[GC_UNCERT_MAX_INPUTS], s[GC_UNCERT_MAX_INPUTS], x0[GC_UNCERT_MAX_INPUTS];
    gc_uncert_dist dist[GC_UNCERT_MAX_INPUTS];
    gc__uncert_covariance(in, m->nx, corr, a, s, w->V);
    if (gc_uncert_cholesky(w->V, m->nx, w->L) != GC_OK)
        return gc_error_set(err, GC_ERR_INVALID, "correlation",
                            "the input covariance matrix is not positive semi-definite");
    for (int i = 0; i < m->nx; i++) {
        x0[i] = in[i].value;
        dist[i] = in[i].dist;
    }
    mc_job job = { m->nx, gc__uncert_mix64(opt->seed), x0, w->L, dist };
    gc__uncert_batch b = { m, opt->samples, mc_point, &job, w->y, w->status, opt->threads };
    gc__uncert_run(&b);
    return GC_OK;
}

int gc_uncert_mc_draw(const gc_uncert_input *in, int nx, const double *corr, uint64_t seed,
                      long j, double *x, gc_error *err)
{
    gc_error_clear(err);
    if (nx < 1 || nx > GC_UNCERT_MAX_INPUTS || j < 0)
        return gc_error_set(err, GC_ERR_INVALID, "samples", "no such sample");
    int st = gc_uncert_validate(in, nx, corr, err);
    if (st != GC_OK)
        return st;
    double a[GC_UNCERT_MAX_INPUTS], s[GC_UNCERT_MAX_INPUTS], x0[GC_UNCERT_MAX_INPUTS];
    gc_uncert_dist dist[GC_UNCERT_MAX_INPUTS];
    size_t n2 = (size_t)nx * (size_t)nx;
    double *V = malloc(sizeof(double) * n2), *L = malloc(sizeof(double) * n2);
    if (!V || !L)
        st = gc_error_set(err, GC_ERR_NOMEM, "samples", "out of memory");
    if (st == GC_OK) {
        gc__uncert_covariance(in, nx, corr, a, s, V);
        if (gc_uncert_cholesky(V, nx, L) != GC_OK)
            st = gc_error_set(err, GC_ERR_INVALID, "correlation",
                              "the input covariance matrix is not positive semi-definite");
    }
    if (st == GC_OK) {
        for (int i = 0; i < nx; i++) {
            x0[i] = in[i].value;
            dist[i] = in[i].dist;
        }
        mc_job job = { nx, gc__uncert_mix64(seed), x0, L, dist };
        mc_point(&job, j, x);
    }
    free(V);
    free(L);
    return st;
}

int gc_uncert_monte_carlo(const gc_uncert_model *m, const gc_uncert_input *in,
                          const double *corr, const int *out_sel, int n_out,
                          const gc_uncert_options *opt, const gc_uncert_linear_result *lin,
                          gc_uncert_mc_result *res, gc_error *err)
{
    gc_error_clear(err);
    memset(res, 0, sizeof *res);
    int sel[GC_UNCERT_MAX_OUTPUTS];
    int st = gc__uncert_check_model(m, err);
    if (st == GC_OK)
        st = check_mc_options(m, opt, err);
    if (st == GC_OK)
        st = gc_uncert_validate(in, m->nx, corr, err);
    if (st != GC_OK)
        return st;
    int n = gc__uncert_selection(out_sel, n_out, m->ny, sel, "outputs", err);
    if (n < 0 || check_linear(lin, sel, n, err) != GC_OK)
        return GC_ERR_INVALID;
    double p = opt->coverage_probability > 0.0 ? opt->coverage_probability : GC_UNCERT_MC_DEFAULT_P;
    res->samples = opt->samples;
    res->coverage_probability = p;
    res->seed = opt->seed;
    res->threads = opt->threads;
    mc_mem w;
    st = mc_alloc(&w, m->nx, opt->samples, m->ny);
    if (st != GC_OK)
        st = gc_error_set(err, st, "samples", "out of memory for %ld samples", opt->samples);
    if (st == GC_OK)
        st = mc_sample(m, in, corr, opt, &w, err);
    if (st == GC_OK) {
        count_failures(w.status, opt->samples, res);
        if (res->n_ok >= 2) {
            res->n_out = n;
            res->blocks = mc_blocks(res->n_ok, p);
            for (int r = 0; r < n; r++) {
                summarise(w.y, w.status, opt->samples, m->ny, sel[r], p, w.v, w.w, &res->out[r]);
                if (lin)
                    validate(&lin->out[r], opt, p, &res->out[r]);
            }
        }
        double allowed = opt->max_failed_fraction * (double)opt->samples;
        if (res->n_ok < 2 || (double)res->n_failed > allowed)
            st = failure_error(res, err);
    }
    mc_free(&w);
    return st;
}
