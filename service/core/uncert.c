/*
 * uncert.c — the uncertainty engine's inputs, checks and linear propagation
 * (ISO GUM, JCGM 100:2008). See include/gascycle/uncert.h for the model,
 * the conventions and the sources.
 *
 *   - conversions to a standard uncertainty: u = U / k (GUM 6.2.1),
 *     u = rel |x|, u = a / sqrt 3 for a rectangular half-width (GUM 4.3.7);
 *   - the input covariance V_ij = r_ij a_i a_j + delta_ij s_i^2 (a_i the
 *     shared part: u_i, or the systematic b_i when parts are given);
 *   - the combined standard uncertainty u_c^2 = c^T V c (GUM eq. (13)),
 *     its systematic and random parts (ASME PTC 19.1), the budget sorted by
 *     share of variance, the output correlations (J V J^T), the effective
 *     degrees of freedom (Welch-Satterthwaite, GUM eq. (G.2b)) and the
 *     coverage factor (normal, or Student's t at floor(nu_eff), GUM G.4.1).
 * Units: the caller's.
 */
#include "uncert_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PARTS_RTOL 1e-9      /* u given beside its parts must equal their RSS to this */
#define CORR_TOL 1e-12       /* symmetry and unit diagonal of the correlation matrix */

void gc_uncert_options_init(gc_uncert_options *o)
{
    memset(o, 0, sizeof *o);
    o->diff = GC_UNCERT_CENTRAL;
    o->coverage_factor = 2.0;
    o->threads = 1;
    o->samples = 10000;
    o->seed = 1;
    o->n_dig = 2;
    o->max_failed_fraction = 0.001;
}

void gc_uncert_input_init(gc_uncert_input *in, double x, double u)
{
    memset(in, 0, sizeof *in);
    in->value = x;
    in->u = u;
    in->dist = GC_UNCERT_NORMAL;
}

/* ---- conversions ------------------------------------------------------- */

int gc_uncert_from_expanded(double U, double k, double *u)
{
    if (!(isfinite(U) && U >= 0.0 && isfinite(k) && k > 0.0))
        return GC_ERR_INVALID;
    *u = U / k;
    return GC_OK;
}

int gc_uncert_from_relative(double rel, double x, double *u)
{
    if (!(isfinite(rel) && rel >= 0.0 && isfinite(x)))
        return GC_ERR_INVALID;
    *u = rel * fabs(x);
    return GC_OK;
}

int gc_uncert_from_half_width(double a, double *u)
{
    if (!(isfinite(a) && a >= 0.0))
        return GC_ERR_INVALID;
    *u = a / sqrt(3.0);
    return GC_OK;
}

double gc_uncert_input_u(const gc_uncert_input *in)
{
    return in->has_parts ? hypot(in->u_sys, in->u_rand) : in->u;
}

const char *gc__uncert_name(const gc_uncert_input *in, int i, char *buf, int len)
{
    if (in[i].name && in[i].name[0])
        return in[i].name;
    snprintf(buf, (size_t)len, "input %d", i);
    return buf;
}

/* ---- checks ------------------------------------------------------------ */

static int bad_input(const gc_uncert_input *in, int i, gc_error *err, const char *why)
{
    char nb[GC_ERROR_FIELD_LEN];
    return gc_error_set(err, GC_ERR_INVALID, in[i].name ? in[i].name : "", "%s: %s",
                        gc__uncert_name(in, i, nb, sizeof nb), why);
}

static int nonneg(double v)
{
    return isfinite(v) && v >= 0.0;
}

static int check_parts(const gc_uncert_input *in, int i, gc_error *err)
{
    const gc_uncert_input *p = &in[i];
    if (!nonneg(p->u_sys) || !nonneg(p->u_rand))
        return bad_input(in, i, err, "systematic and random standard uncertainties must be "
                                     "finite and not negative");
    double rss = hypot(p->u_sys, p->u_rand);
    if (p->u != 0.0 && !(fabs(p->u - rss) <= PARTS_RTOL * rss))
        return bad_input(in, i, err, "the standard uncertainty differs from the root sum "
                                     "square of its systematic and random parts");
    return GC_OK;
}

static int check_bounds(const gc_uncert_input *in, int i, gc_error *err)
{
    const gc_uncert_input *p = &in[i];
    if ((p->has_lo && !isfinite(p->lo)) || (p->has_hi && !isfinite(p->hi)) ||
        (p->has_lo && p->has_hi && !(p->lo < p->hi)))
        return bad_input(in, i, err, "its bounds must be finite with lower < upper");
    if ((p->has_lo && p->value < p->lo) || (p->has_hi && p->value > p->hi))
        return bad_input(in, i, err, "the best estimate lies outside the input's bounds");
    return GC_OK;
}

static int check_input(const gc_uncert_input *in, int i, gc_error *err)
{
    const gc_uncert_input *p = &in[i];
    if (!isfinite(p->value))
        return bad_input(in, i, err, "the best estimate must be a finite number");
    if (!nonneg(p->u))
        return bad_input(in, i, err, "the standard uncertainty must be finite and not negative");
    if (p->has_parts && check_parts(in, i, err) != GC_OK)
        return GC_ERR_INVALID;
    if (p->dist != GC_UNCERT_NORMAL && p->dist != GC_UNCERT_RECTANGULAR)
        return bad_input(in, i, err, "the distribution must be normal or rectangular");
    if (!(p->dof == 0.0 || (isfinite(p->dof) && p->dof >= 1.0)))
        return bad_input(in, i, err, "degrees of freedom must be at least 1 (0 = infinite)");
    if (!nonneg(p->step))
        return bad_input(in, i, err, "the difference step must be finite and positive "
                                     "(0 = automatic)");
    return check_bounds(in, i, err);
}

static int bad_corr(int i, int j, gc_error *err, const char *why)
{
    char field[GC_ERROR_FIELD_LEN];
    snprintf(field, sizeof field, "correlation/%d/%d", i, j);
    return gc_error_set(err, GC_ERR_INVALID, field, "correlation coefficient r(%d, %d): %s", i,
                        j, why);
}

static int check_corr(const gc_uncert_input *in, int nx, const double *r, gc_error *err)
{
    for (int i = 0; i < nx; i++)
        for (int j = 0; j < nx; j++) {
            double v = r[i * nx + j];
            if (!isfinite(v) || fabs(v) > 1.0)
                return bad_corr(i, j, err, "must be a number in [-1, 1]");
            if (i == j && fabs(v - 1.0) > CORR_TOL)
                return bad_corr(i, j, err, "the diagonal must be 1");
            if (fabs(v - r[j * nx + i]) > CORR_TOL)
                return bad_corr(i, j, err, "the matrix must be symmetric");
            if (i != j && v != 0.0 &&
                (in[i].dist == GC_UNCERT_RECTANGULAR || in[j].dist == GC_UNCERT_RECTANGULAR))
                return bad_corr(i, j, err, "a rectangular input cannot be correlated");
        }
    double *L = malloc(sizeof(double) * (size_t)nx * (size_t)nx);
    if (L == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "correlation", "out of memory");
    int st = gc_uncert_cholesky(r, nx, L);
    free(L);
    if (st != GC_OK)
        return gc_error_set(err, GC_ERR_INVALID, "correlation",
                            "the correlation matrix is not positive semi-definite");
    return GC_OK;
}

int gc_uncert_validate(const gc_uncert_input *in, int nx, const double *corr, gc_error *err)
{
    if (in == NULL || nx < 1 || nx > GC_UNCERT_MAX_INPUTS)
        return gc_error_set(err, GC_ERR_INVALID, "inputs", "between 1 and %d inputs are needed",
                            GC_UNCERT_MAX_INPUTS);
    for (int i = 0; i < nx; i++)
        if (check_input(in, i, err) != GC_OK)
            return GC_ERR_INVALID;
    return corr ? check_corr(in, nx, corr, err) : GC_OK;
}

int gc__uncert_check_model(const gc_uncert_model *m, gc_error *err)
{
    if (m == NULL || m->eval == NULL)
        return gc_error_set(err, GC_ERR_INVALID, "model", "no model to evaluate");
    if (m->nx < 1 || m->nx > GC_UNCERT_MAX_INPUTS || m->ny < 1 || m->ny > GC_UNCERT_MAX_OUTPUTS)
        return gc_error_set(err, GC_ERR_INVALID, "model",
                            "the model must have 1..%d inputs and 1..%d outputs",
                            GC_UNCERT_MAX_INPUTS, GC_UNCERT_MAX_OUTPUTS);
    return GC_OK;
}

int gc__uncert_check_options(const gc_uncert_options *o, gc_error *err)
{
    if (o->diff != GC_UNCERT_CENTRAL && o->diff != GC_UNCERT_RICHARDSON)
        return gc_error_set(err, GC_ERR_INVALID, "derivatives", "must be central or richardson");
    if (!(o->rel_step == 0.0 || (o->rel_step >= 1e-10 && o->rel_step <= 0.1)))
        return gc_error_set(err, GC_ERR_INVALID, "relative_step", "must be in [1e-10, 0.1]");
    if (!(o->coverage_probability == 0.0 ||
          (o->coverage_probability > 0.0 && o->coverage_probability < 1.0)))
        return gc_error_set(err, GC_ERR_INVALID, "coverage_probability", "must be in (0, 1)");
    if (o->coverage_probability == 0.0 &&
        !(isfinite(o->coverage_factor) && o->coverage_factor > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "coverage_factor", "must be positive");
    if (o->threads < 1 || o->threads > GC_UNCERT_MAX_THREADS)
        return gc_error_set(err, GC_ERR_INVALID, "threads", "must be 1..%d",
                            GC_UNCERT_MAX_THREADS);
    return GC_OK;
}

int gc__uncert_selection(const int *sel, int n, int limit, int *out, const char *what,
                         gc_error *err)
{
    if (sel == NULL) {
        for (int i = 0; i < limit; i++)
            out[i] = i;
        return limit;
    }
    if (n < 1 || n > limit) {
        gc_error_set(err, GC_ERR_INVALID, what, "select 1..%d of them", limit);
        return -1;
    }
    unsigned char seen[GC_UNCERT_MAX_INPUTS + GC_UNCERT_MAX_OUTPUTS] = { 0 };
    for (int k = 0; k < n; k++) {
        if (sel[k] < 0 || sel[k] >= limit || seen[sel[k]]) {
            gc_error_set(err, GC_ERR_INVALID, what, "index %d is out of range or repeated",
                         sel[k]);
            return -1;
        }
        seen[sel[k]] = 1;
        out[k] = sel[k];
    }
    return n;
}

/* ---- covariance -------------------------------------------------------- */

void gc__uncert_covariance(const gc_uncert_input *in, int nx, const double *corr, double *a,
                           double *s, double *V)
{
    for (int i = 0; i < nx; i++) {
        a[i] = in[i].has_parts ? in[i].u_sys : in[i].u;
        s[i] = in[i].has_parts ? in[i].u_rand : 0.0;
    }
    for (int i = 0; i < nx; i++)
        for (int j = 0; j < nx; j++) {
            double r = corr ? corr[i * nx + j] : (i == j);
            V[i * nx + j] = r * a[i] * a[j] + (i == j ? s[i] * s[i] : 0.0);
        }
}

/* ---- linear propagation ------------------------------------------------ */

double gc__uncert_dof_floor(double nu_eff)
{
    return fmax(1.0, floor(nu_eff * (1.0 + 1e-9)));
}

/* What a budget needs beside the Jacobian. */
typedef struct lin_ctx {
    const gc_uncert_input *in;
    const double *corr;
    const gc_uncert_options *opt;
    int nx;
    int n_act;
    int act[GC_UNCERT_MAX_INPUTS];           /* active inputs (u > 0) = Jacobian columns */
    double a[GC_UNCERT_MAX_INPUTS], s[GC_UNCERT_MAX_INPUTS];
    double *V;                               /* nx x nx */
} lin_ctx;

static double r_of(const lin_ctx *L, int i, int j)
{
    return L->corr ? L->corr[i * L->nx + j] : (double)(i == j);
}

/* c^T M c over the active inputs, M = V (which 0), r o a a^T (1). */
static double quad(const lin_ctx *L, const double *c, int which)
{
    double sum = 0.0, mag = 0.0;
    for (int p = 0; p < L->n_act; p++)
        for (int q = 0; q < L->n_act; q++) {
            int i = L->act[p], j = L->act[q];
            double m = which == 0 ? L->V[i * L->nx + j] : r_of(L, i, j) * L->a[i] * L->a[j];
            double t = c[p] * c[q] * m;
            sum += t;
            mag += fabs(t);
        }
    /* a positive semi-definite form: a negative sum is rounding */
    return sum > 0.0 ? sum : (sum >= -1e-12 * mag ? 0.0 : sum);
}

static int cmp_terms(const void *pa, const void *pb)
{
    const gc_uncert_term *a = pa, *b = pb;
    double va = a->contribution * a->contribution, vb = b->contribution * b->contribution;
    if (va != vb)
        return va > vb ? -1 : 1;
    return (a->input > b->input) - (a->input < b->input);
}

/* Correlated contributing inputs: Welch-Satterthwaite does not apply. */
static int correlated_terms(const lin_ctx *L, const double *c)
{
    if (L->corr == NULL)
        return 0;
    for (int p = 0; p < L->n_act; p++)
        for (int q = p + 1; q < L->n_act; q++)
            if (r_of(L, L->act[p], L->act[q]) != 0.0 && c[p] != 0.0 && c[q] != 0.0)
                return 1;
    return 0;
}

static void coverage(const lin_ctx *L, const double *c, gc_uncert_budget *b)
{
    b->nu_eff_formed = !correlated_terms(L, c);
    double den = 0.0;
    for (int p = 0; b->nu_eff_formed && p < L->n_act; p++) {
        const gc_uncert_input *in = &L->in[L->act[p]];
        double ci = c[p] * gc_uncert_input_u(in);
        if (in->dof > 0.0)
            den += ci * ci * ci * ci / in->dof;
    }
    double uc2 = b->u_c * b->u_c;
    b->nu_eff = (b->nu_eff_formed && den > 0.0 && b->u_c > 0.0) ? uc2 * uc2 / den : 0.0;
    double p = L->opt->coverage_probability;
    if (p > 0.0) {
        b->k_from_t = L->opt->welch_satterthwaite && b->nu_eff > 0.0;
        double nu = b->k_from_t ? gc__uncert_dof_floor(b->nu_eff) : 0.0;
        b->k = gc_uncert_coverage_factor(p, nu);
        b->coverage_probability = p;
    } else {
        b->k = L->opt->coverage_factor;
    }
    b->U = b->k * b->u_c;
}

static void budget(const lin_ctx *L, const gc__uncert_jac *J, int o, gc_uncert_budget *b)
{
    double c[GC_UNCERT_MAX_INPUTS];
    for (int p = 0; p < L->n_act; p++)
        c[p] = J->d[o * GC_UNCERT_MAX_INPUTS + p];
    b->output = o;
    b->y = J->y0[o];
    double uc2 = quad(L, c, 0);
    b->u_c = sqrt(fmax(uc2, 0.0));
    b->parts_complete = 1;
    double shares = 0.0, rand2 = 0.0;
    for (int p = 0; p < L->n_act; p++) {
        int i = L->act[p];
        gc_uncert_term *t = &b->terms[p];
        t->input = i;
        t->sensitivity = c[p];
        t->sensitivity_error = J->e[o * GC_UNCERT_MAX_INPUTS + p];
        t->u = gc_uncert_input_u(&L->in[i]);
        t->contribution = c[p] * t->u;
        t->contribution_sys = c[p] * L->a[i];
        t->contribution_rand = c[p] * L->s[i];
        t->share = uc2 > 0.0 ? t->contribution * t->contribution / uc2 : 0.0;
        shares += t->share;
        rand2 += t->contribution_rand * t->contribution_rand;
        b->parts_complete &= L->in[i].has_parts;
    }
    b->n_terms = L->n_act;
    qsort(b->terms, (size_t)b->n_terms, sizeof b->terms[0], cmp_terms);
    b->correlation_share = uc2 > 0.0 ? 1.0 - shares : 0.0;
    if (b->parts_complete && L->n_act > 0) {
        b->u_sys = sqrt(fmax(quad(L, c, 1), 0.0));
        b->u_rand = sqrt(rand2);
    } else {
        b->parts_complete = 0;
    }
    coverage(L, c, b);
}

static void output_correlation(const lin_ctx *L, const gc__uncert_jac *J,
                               gc_uncert_linear_result *res)
{
    for (int r = 0; r < res->n_out; r++)
        for (int q = 0; q < res->n_out; q++) {
            int o1 = res->out[r].output, o2 = res->out[q].output;
            double cov = 0.0;
            for (int p = 0; p < L->n_act; p++)
                for (int t = 0; t < L->n_act; t++)
                    cov += J->d[o1 * GC_UNCERT_MAX_INPUTS + p] *
                           J->d[o2 * GC_UNCERT_MAX_INPUTS + t] *
                           L->V[L->act[p] * L->nx + L->act[t]];
            double den = res->out[r].u_c * res->out[q].u_c, v = 0.0;
            if (den > 0.0)
                v = r == q ? 1.0 : fmax(-1.0, fmin(1.0, cov / den));
            res->corr[r][q] = v;
        }
}

static int lin_setup(const gc_uncert_model *m, const gc_uncert_input *in, const double *corr,
                     const gc_uncert_options *opt, lin_ctx *L, gc_error *err)
{
    int st = gc__uncert_check_model(m, err);
    if (st == GC_OK)
        st = gc__uncert_check_options(opt, err);
    if (st == GC_OK)
        st = gc_uncert_validate(in, m->nx, corr, err);
    if (st != GC_OK)
        return st;
    L->in = in;
    L->corr = corr;
    L->opt = opt;
    L->nx = m->nx;
    L->n_act = 0;
    for (int i = 0; i < m->nx; i++)
        if (gc_uncert_input_u(&in[i]) > 0.0)
            L->act[L->n_act++] = i;
    L->V = malloc(sizeof(double) * (size_t)m->nx * (size_t)m->nx);
    if (L->V == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the covariance matrix");
    gc__uncert_covariance(in, m->nx, corr, L->a, L->s, L->V);
    return GC_OK;
}

int gc_uncert_linear(const gc_uncert_model *m, const gc_uncert_input *in, const double *corr,
                     const int *out_sel, int n_out, const gc_uncert_options *opt,
                     gc_uncert_linear_result *res, gc_error *err)
{
    gc_error_clear(err);
    memset(res, 0, sizeof *res);
    lin_ctx L = { 0 };
    int st = lin_setup(m, in, corr, opt, &L, err);
    int sel[GC_UNCERT_MAX_OUTPUTS];
    if (st == GC_OK) {
        res->n_out = gc__uncert_selection(out_sel, n_out, m->ny, sel, "outputs", err);
        if (res->n_out < 0) {
            res->n_out = 0;
            st = GC_ERR_INVALID;
        }
    }
    gc__uncert_jac *J = st == GC_OK ? malloc(sizeof *J) : NULL;
    if (st == GC_OK && J == NULL)
        st = gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the sensitivity coefficients");
    if (st == GC_OK)
        st = gc__uncert_jacobian(m, in, L.act, L.n_act, opt, J, err);
    if (st == GC_OK) {
        for (int r = 0; r < res->n_out; r++)
            budget(&L, J, sel[r], &res->out[r]);
        output_correlation(&L, J, res);
        res->has_correlation = corr != NULL;
        res->evaluations = J->evaluations;
    }
    free(J);
    free(L.V);
    return st;
}
