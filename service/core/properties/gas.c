/*
 * gas.c — the working-fluid models of gas.h: cold-air standard, dry air, humid
 * air and any ideal-gas mixture of the NASA-9 species (species.h).
 *
 * Mixtures: the species' dimensionless coefficients are combined once, at
 * initialisation, into one mass-weighted set per temperature sub-interval
 * (the union of the species' breakpoints), each scaled by R_u / M_i, so a
 * property call evaluates one polynomial: a short linear scan for the
 * interval, then Horner's rule (one log for h and s°).
 *
 * Dry air: U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF), Table 3, sea-level
 * mole fractions of the four main constituents N2 0.78084, O2 0.209476,
 * Ar 0.00934, CO2 0.000314, renormalised over those four (they sum to
 * 0.99997; the trace gases Ne, He, Kr, CH4 ... are left out). M = 28.965 g/mol.
 *
 * Cold-air standard defaults cp = 1005 J/(kg K), k = 1.4: the customary
 * textbook values for air near 300 K (common practice); gc_gas_init_cold
 * takes any value in physical bounds.
 *
 * Validity: a mixture's range is the intersection of its species' data
 * ranges, capped at 6000 K (200 K at the low end where every species' data
 * start there, 300 K where a species' data start at 300 K). Nothing is
 * extrapolated; inverse solves whose answer lies outside return GC_ERR_RANGE.
 * The only evaluation outside the range is s°(298.15 K), used as the
 * normalisation constant of pr and vr when a mixture's data start at 300 K;
 * it cancels in every ratio.
 *
 * Entropy: s° includes the ideal mixing term -R sum x_i ln x_i, so s(T, P) of
 * a mixture is the entropy of the mixture at total pressure P.
 *
 * Units: SI (K, Pa, J/kg, J/(kg K), m3/kg, kg/mol).
 */
#include "gascycle/gas.h"
#include "gascycle/species.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define GAS_T_CAP_K 6000.0     /* highest temperature served, K */
#define COLD_T_MIN_K 1.0
#define COLD_T_MAX_K 20000.0
#define SOLVE_REL_TOL 1e-12    /* Newton step below this times T: converged */
#define SOLVE_MAX_ITER 200

/* ---- construction ---------------------------------------------------- */

static void set_label(gc_gas *g, const char *label)
{
    snprintf(g->label, sizeof g->label, "%s", label);
}

int gc_gas_init_cold(gc_gas *g, double cp, double k, gc_error *err)
{
    if (!(cp >= 100.0 && cp <= 20000.0))
        return gc_error_set(err, GC_ERR_INVALID, "/cp",
                            "cp must be between 100 and 20000 J/(kg K)");
    if (!(k > 1.0 && k <= 1.7))
        return gc_error_set(err, GC_ERR_INVALID, "/k",
                            "k must be greater than 1 and at most 1.7");
    memset(g, 0, sizeof *g);
    g->kind = GC_GAS_COLD;
    set_label(g, "cold");
    g->cp_cold_J_per_kgK = cp;
    g->k_cold = k;
    g->R_J_per_kgK = cp * (k - 1.0) / k;
    g->M_kg_per_mol = GC_R_UNIVERSAL / g->R_J_per_kgK;
    g->T_min_K = COLD_T_MIN_K;
    g->T_max_K = COLD_T_MAX_K;
    return GC_OK;
}

/* Builds the pre-combined coefficient sets; g->species, x, n_species set. */
static int combine(gc_gas *g, gc_error *err)
{
    double M = 0.0;
    for (int j = 0; j < g->n_species; j++)
        M += g->x[j] * gc__species_table[g->species[j]].M_kg_per_mol;
    g->M_kg_per_mol = M;
    g->R_J_per_kgK = GC_R_UNIVERSAL / M;
    double smix = 0.0;
    double tmin = 0.0, tmax = GAS_T_CAP_K;
    double brk[GC_SP_COUNT * GC_SPECIES_MAX_INTERVALS];
    int nbrk = 0;
    for (int j = 0; j < g->n_species; j++) {
        const gc_species *sp = &gc__species_table[g->species[j]];
        g->y[j] = g->x[j] * sp->M_kg_per_mol / M;
        if (g->x[j] <= 0.0)
            continue; /* absent species neither restrict the range nor contribute */
        smix -= g->x[j] * log(g->x[j]);
        if (sp->T_K[0] > tmin)
            tmin = sp->T_K[0];
        if (sp->T_K[sp->n_intervals] < tmax)
            tmax = sp->T_K[sp->n_intervals];
    }
    for (int j = 0; j < g->n_species; j++) {
        const gc_species *sp = &gc__species_table[g->species[j]];
        if (g->x[j] <= 0.0)
            continue;
        for (int i = 1; i < sp->n_intervals; i++)
            if (sp->T_K[i] > tmin && sp->T_K[i] < tmax)
                brk[nbrk++] = sp->T_K[i];
    }
    /* a handful of breakpoints: insertion sort */
    for (int b = 1; b < nbrk; b++) {
        double v = brk[b];
        int k = b;
        for (; k > 0 && brk[k - 1] > v; k--)
            brk[k] = brk[k - 1];
        brk[k] = v;
    }
    g->T_min_K = tmin;
    g->T_max_K = tmax;
    g->s_mix_J_per_kgK = g->R_J_per_kgK * smix;
    int n = 0;
    g->T_break_K[0] = tmin;
    for (int b = 0; b < nbrk; b++) {
        if (brk[b] <= g->T_break_K[n])
            continue; /* duplicate breakpoint */
        if (n + 1 >= GC_GAS_MAX_INTERVALS)
            return gc_error_set(err, GC_ERR_COMPOSITION, "",
                                "the mixture needs more than %d temperature intervals",
                                GC_GAS_MAX_INTERVALS);
        g->T_break_K[++n] = brk[b];
    }
    g->T_break_K[++n] = tmax;
    g->n_intervals = n;
    for (int i = 0; i < n; i++) {
        double Tm = 0.5 * (g->T_break_K[i] + g->T_break_K[i + 1]);
        double acc[9] = { 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0 };
        for (int j = 0; j < g->n_species; j++) {
            const gc_species *sp = &gc__species_table[g->species[j]];
            if (g->x[j] <= 0.0)
                continue;
            int si = 0;
            while (si < sp->n_intervals - 1 && Tm > sp->T_K[si + 1])
                si++;
            double w = g->y[j] * GC_R_UNIVERSAL / sp->M_kg_per_mol;
            const double *c = sp->a[si];
            for (int k = 0; k < 9; k++)
                acc[k] += w * c[k];
        }
        for (int k = 0; k < 9; k++)
            g->a[i][k] = acc[k];
    }
    return GC_OK;
}

int gc_gas_init_mixture(gc_gas *g, int n, const int *ids, const double *xs, gc_error *err)
{
    if (n < 1 || n > GC_GAS_MAX_SPECIES || ids == NULL || xs == NULL)
        return gc_error_set(err, GC_ERR_COMPOSITION, "",
                            "a mixture needs between 1 and %d species", GC_GAS_MAX_SPECIES);
    gc_gas t;
    memset(&t, 0, sizeof t);
    double sum = 0.0;
    for (int i = 0; i < n; i++) {
        if (ids[i] < 0 || ids[i] >= GC_SP_COUNT)
            return gc_error_set(err, GC_ERR_UNKNOWN, "", "unknown species id %d", ids[i]);
        if (!(xs[i] >= 0.0 && xs[i] <= 1.0 + 1e-6))
            return gc_error_set(err, GC_ERR_COMPOSITION, "",
                                "mole fraction of %s must be between 0 and 1",
                                gc__species_table[ids[i]].name);
        sum += xs[i];
        int j = 0;
        while (j < t.n_species && t.species[j] != ids[i])
            j++;
        if (j == t.n_species) {
            t.species[j] = ids[i];
            t.n_species++;
        }
        t.x[j] += xs[i];
    }
    if (!(fabs(sum - 1.0) <= 1e-6))
        return gc_error_set(err, GC_ERR_COMPOSITION, "",
                            "mole fractions must sum to 1 (within 1e-6), they sum to %.9g", sum);
    for (int j = 0; j < t.n_species; j++)
        t.x[j] /= sum;
    t.kind = GC_GAS_MIXTURE;
    set_label(&t, "mixture");
    int rc = combine(&t, err);
    if (rc != GC_OK)
        return rc;
    *g = t;
    return GC_OK;
}

/* U.S. Standard Atmosphere 1976, Table 3: sea-level mole fractions. */
static const int air_ids[4] = { GC_SP_N2, GC_SP_O2, GC_SP_AR, GC_SP_CO2 };
static const double air_x_1976[4] = { 0.78084, 0.209476, 0.00934, 0.000314 };

void gc_gas_init_air(gc_gas *g)
{
    double x[4], sum = 0.0;
    for (int i = 0; i < 4; i++)
        sum += air_x_1976[i];
    for (int i = 0; i < 4; i++)
        x[i] = air_x_1976[i] / sum;
    /* cannot fail: fixed valid composition */
    (void)gc_gas_init_mixture(g, 4, air_ids, x, NULL);
    set_label(g, "air");
}

int gc_gas_init_humid_air(gc_gas *g, double w, gc_error *err)
{
    if (!(w >= 0.0 && w <= 0.5))
        return gc_error_set(err, GC_ERR_INVALID, "/humidity_ratio",
                            "humidity ratio must be between 0 and 0.5 kg/kg");
    gc_gas air;
    gc_gas_init_air(&air);
    /* moles per kg of dry air */
    double n_da = 1.0 / air.M_kg_per_mol;
    double n_w = w / gc__species_table[GC_SP_H2O].M_kg_per_mol;
    int ids[5];
    double x[5];
    for (int i = 0; i < 4; i++) {
        ids[i] = air.species[i];
        x[i] = air.x[i] * n_da / (n_da + n_w);
    }
    ids[4] = GC_SP_H2O;
    x[4] = n_w / (n_da + n_w);
    int rc = gc_gas_init_mixture(g, 5, ids, x, err);
    if (rc != GC_OK)
        return rc;
    set_label(g, "humid air");
    return GC_OK;
}

/* ---- validity -------------------------------------------------------- */

int gc_gas_check_T(const gc_gas *g, double T_K, const char *field, gc_error *err)
{
    if (!(T_K >= g->T_min_K && T_K <= g->T_max_K))
        return gc_error_set(err, GC_ERR_RANGE, field,
                            "temperature must be between %g and %g K (validity range of the %s model)",
                            g->T_min_K, g->T_max_K, g->label);
    return GC_OK;
}

int gc_gas_check_P(double P_Pa, const char *field, gc_error *err)
{
    if (!(P_Pa > 0.0 && P_Pa <= 1e12))
        return gc_error_set(err, GC_ERR_INVALID, field,
                            "pressure must be positive (and finite)");
    return GC_OK;
}

/* ---- properties ------------------------------------------------------ */

static inline const double *interval(const gc_gas *g, double T)
{
    int i = 0;
    while (i < g->n_intervals - 1 && T > g->T_break_K[i + 1])
        i++;
    return g->a[i];
}

static inline double mix_cp(const double *a, double T)
{
    double ti = 1.0 / T;
    return ti * (ti * a[0] + a[1]) + a[2] + T * (a[3] + T * (a[4] + T * (a[5] + T * a[6])));
}

static inline double mix_h(const double *a, double T, double lnT)
{
    return -a[0] / T + a[1] * lnT + a[7] +
           T * (a[2] + T * (0.5 * a[3] + T * ((1.0 / 3.0) * a[4] +
                                              T * (0.25 * a[5] + T * (0.2 * a[6])))));
}

static inline double mix_s0(const double *a, double T, double lnT)
{
    double ti = 1.0 / T;
    return -ti * (0.5 * a[0] * ti + a[1]) + a[2] * lnT + a[8] +
           T * (a[3] + T * (0.5 * a[4] + T * ((1.0 / 3.0) * a[5] + T * (0.25 * a[6]))));
}

double gc_gas_cp_T(const gc_gas *g, double T)
{
    if (g->kind == GC_GAS_COLD)
        return g->cp_cold_J_per_kgK;
    return mix_cp(interval(g, T), T);
}

double gc_gas_cv_T(const gc_gas *g, double T)
{
    return gc_gas_cp_T(g, T) - g->R_J_per_kgK;
}

double gc_gas_k_T(const gc_gas *g, double T)
{
    double cp = gc_gas_cp_T(g, T);
    return cp / (cp - g->R_J_per_kgK);
}

double gc_gas_h_T(const gc_gas *g, double T)
{
    if (g->kind == GC_GAS_COLD)
        return g->cp_cold_J_per_kgK * T;
    return mix_h(interval(g, T), T, log(T));
}

double gc_gas_u_T(const gc_gas *g, double T)
{
    return gc_gas_h_T(g, T) - g->R_J_per_kgK * T;
}

double gc_gas_s0_T(const gc_gas *g, double T)
{
    if (g->kind == GC_GAS_COLD)
        return g->cp_cold_J_per_kgK * log(T / GC_T_REF_K);
    return mix_s0(interval(g, T), T, log(T)) + g->s_mix_J_per_kgK;
}

double gc_gas_s_TP(const gc_gas *g, double T, double P)
{
    return gc_gas_s0_T(g, T) - g->R_J_per_kgK * log(P / GC_P_STD_PA);
}

double gc_gas_v_TP(const gc_gas *g, double T, double P)
{
    return g->R_J_per_kgK * T / P;
}

double gc_gas_pr_T(const gc_gas *g, double T)
{
    if (g->kind == GC_GAS_COLD)
        return pow(T / GC_T_REF_K, g->cp_cold_J_per_kgK / g->R_J_per_kgK);
    return exp((gc_gas_s0_T(g, T) - gc_gas_s0_T(g, GC_T_REF_K)) / g->R_J_per_kgK);
}

double gc_gas_vr_T(const gc_gas *g, double T)
{
    return (T / GC_T_REF_K) / gc_gas_pr_T(g, T);
}

/* ---- inverse solves -------------------------------------------------- */

typedef enum { F_H, F_U, F_S0, F_S0_V } solve_kind;

static const char *const kind_text[] = {
    "enthalpy", "internal energy", "entropy", "entropy"
};

/* Index of the coefficient interval holding T. */
static inline int interval_index(const gc_gas *g, double T)
{
    int i = 0;
    while (i < g->n_intervals - 1 && T > g->T_break_K[i + 1])
        i++;
    return i;
}

/* d cp / dT of the polynomial set a, J/(kg K^2). */
static inline double mix_dcp(const double *a, double T)
{
    double ti = 1.0 / T;
    return ti * ti * (-2.0 * a[0] * ti - a[1]) + a[3] +
           T * (2.0 * a[4] + T * (3.0 * a[5] + T * (4.0 * a[6])));
}

/* f(T), df/dT and d2f/dT2 of the monotone function being inverted, on
 * coefficient interval ia. F_S0_V is s°(T) - R ln T (constant along an
 * isentrope at fixed v ratio). One log per call. */
static inline void eval_f2(const gc_gas *g, solve_kind kind, int ia, double T, double *f,
                           double *df, double *d2f)
{
    const double *a = g->a[ia];
    double lnT = log(T);
    double cp = mix_cp(a, T);
    double dcp = mix_dcp(a, T);
    double R = g->R_J_per_kgK;
    switch (kind) {
    case F_H:
        *f = mix_h(a, T, lnT);
        *df = cp;
        *d2f = dcp;
        break;
    case F_U:
        *f = mix_h(a, T, lnT) - R * T;
        *df = cp - R;
        *d2f = dcp;
        break;
    case F_S0:
        *f = mix_s0(a, T, lnT);
        *df = cp / T;
        *d2f = (dcp - cp / T) / T;
        break;
    default:
        *f = mix_s0(a, T, lnT) - R * lnT;
        *df = (cp - R) / T;
        *d2f = (dcp - (cp - R) / T) / T;
        break;
    }
}

static inline void eval_f(const gc_gas *g, solve_kind kind, double T, double *f, double *df)
{
    double d2;
    eval_f2(g, kind, interval_index(g, T), T, f, df, &d2);
}

static int range_error(const gc_gas *g, gc_error *err)
{
    return gc_error_set(err, GC_ERR_RANGE, "",
                        "the end state lies outside the validity range %g..%g K of the %s model",
                        g->T_min_K, g->T_max_K, g->label);
}

/* Safeguarded Halley iteration from T0 (any value: outside the range or not
 * finite, the start is 1000 K clamped into the range). The bracket
 * [lo, hi] starts as the validity range and shrinks with every evaluation;
 * a step leaving it is replaced by bisection. The ends of the range are
 * evaluated only when a step tries to leave it: a target beyond f(T_min) or
 * f(T_max) by more than the solve tolerance is GC_ERR_RANGE (within it, the
 * answer is that end). Stops when a step is below
 * SOLVE_REL_TOL T, or when a step is so small (below 1e-5 T, and below 1e-5
 * of the local scale |f'/f''|, inside one coefficient interval) that the
 * cubic convergence leaves an error below 1e-10 of that step, i.e. below
 * 1e-15 T. Target is the value of f without the mixing entropy. */
static int solve_T(const gc_gas *g, solve_kind kind, double target, double T0, double *T_out,
                   gc_error *err)
{
    if (!isfinite(target))
        return gc_error_set(err, GC_ERR_INVALID, "", "the %s to invert is not a finite number",
                            kind_text[kind]);
    const double Tmin = g->T_min_K, Tmax = g->T_max_K;
    double lo = Tmin, hi = Tmax;
    int lo_checked = 0, hi_checked = 0; /* range end evaluated (or bracketed inside) */
    double T = T0;
    if (!(T >= Tmin && T <= Tmax))
        T = 1000.0 < Tmin ? Tmin : (1000.0 > Tmax ? Tmax : 1000.0);
    for (int it = 0; it < SOLVE_MAX_ITER; it++) {
        int ia = interval_index(g, T);
        double f, df, d2f;
        eval_f2(g, kind, ia, T, &f, &df, &d2f);
        double r = f - target;
        if (r == 0.0) {
            *T_out = T;
            return GC_OK;
        }
        if (r > 0.0) {
            hi = T;
            hi_checked = 1;
        } else {
            lo = T;
            lo_checked = 1;
        }
        /* Halley step; Newton where the correction term would not help */
        double dT = -r / df;
        double den = 1.0 + 0.5 * dT * d2f / df;
        if (den > 0.5 && den < 2.0)
            dT /= den;
        double Tn = T + dT;
        if (!(Tn > lo && Tn < hi)) {
            /* leaving the bracket: at a range end, check the target lies inside */
            if (!(Tn > lo) && !lo_checked) {
                double fl, dl;
                eval_f(g, kind, Tmin, &fl, &dl);
                if (target < fl) {
                    /* within the solve tolerance of the end: the end itself */
                    if (fl - target <= SOLVE_REL_TOL * Tmin * dl) {
                        *T_out = Tmin;
                        return GC_OK;
                    }
                    return range_error(g, err);
                }
                lo_checked = 1;
            }
            if (!(Tn < hi) && !hi_checked) {
                double fh, dh;
                eval_f(g, kind, Tmax, &fh, &dh);
                if (target > fh) {
                    if (target - fh <= SOLVE_REL_TOL * Tmax * dh) {
                        *T_out = Tmax;
                        return GC_OK;
                    }
                    return range_error(g, err);
                }
                hi_checked = 1;
            }
            if (fabs(dT) <= SOLVE_REL_TOL * T) {
                *T_out = Tn < Tmin ? Tmin : (Tn > Tmax ? Tmax : Tn);
                return GC_OK;
            }
            Tn = 0.5 * (lo + hi);
        } else {
            double adT = fabs(dT);
            if (adT <= SOLVE_REL_TOL * T ||
                (adT <= 1e-5 * T && adT * fabs(d2f) <= 1e-5 * fabs(df) &&
                 Tn >= g->T_break_K[ia] && Tn <= g->T_break_K[ia + 1])) {
                *T_out = Tn;
                return GC_OK;
            }
        }
        if (hi - lo <= SOLVE_REL_TOL * T) {
            *T_out = Tn;
            return GC_OK;
        }
        T = Tn;
    }
    return gc_error_set(err, GC_ERR_NOCONV, "",
                        "the temperature solve for a given %s did not converge", kind_text[kind]);
}

static int cold_result(const gc_gas *g, double T, double *T_out, gc_error *err)
{
    if (!(T >= g->T_min_K && T <= g->T_max_K))
        return gc_error_set(err, GC_ERR_RANGE, "",
                            "the end state lies outside the validity range %g..%g K of the %s model",
                            g->T_min_K, g->T_max_K, g->label);
    *T_out = T;
    return GC_OK;
}

int gc_gas_T_from_h_guess(const gc_gas *g, double h, double T_guess, double *T_K,
                          gc_error *err)
{
    if (g->kind == GC_GAS_COLD) {
        if (!isfinite(h))
            return gc_error_set(err, GC_ERR_INVALID, "", "the enthalpy is not a finite number");
        return cold_result(g, h / g->cp_cold_J_per_kgK, T_K, err);
    }
    return solve_T(g, F_H, h, T_guess, T_K, err);
}

int gc_gas_T_from_h(const gc_gas *g, double h, double *T_K, gc_error *err)
{
    return gc_gas_T_from_h_guess(g, h, 0.0, T_K, err);
}

int gc_gas_T_from_u_guess(const gc_gas *g, double u, double T_guess, double *T_K,
                          gc_error *err)
{
    if (g->kind == GC_GAS_COLD) {
        if (!isfinite(u))
            return gc_error_set(err, GC_ERR_INVALID, "", "the internal energy is not a finite number");
        return cold_result(g, u / (g->cp_cold_J_per_kgK - g->R_J_per_kgK), T_K, err);
    }
    return solve_T(g, F_U, u, T_guess, T_K, err);
}

int gc_gas_T_from_u(const gc_gas *g, double u, double *T_K, gc_error *err)
{
    return gc_gas_T_from_u_guess(g, u, 0.0, T_K, err);
}

int gc_gas_T_from_s0(const gc_gas *g, double s0, double *T_K, gc_error *err)
{
    if (g->kind == GC_GAS_COLD) {
        if (!isfinite(s0))
            return gc_error_set(err, GC_ERR_INVALID, "", "the entropy is not a finite number");
        return cold_result(g, GC_T_REF_K * exp(s0 / g->cp_cold_J_per_kgK), T_K, err);
    }
    return solve_T(g, F_S0, s0 - g->s_mix_J_per_kgK, 0.0, T_K, err);
}

static int check_ratio(double r, const char *what, gc_error *err)
{
    if (!(r > 0.0 && r < 1e300))
        return gc_error_set(err, GC_ERR_INVALID, "", "the %s ratio must be positive and finite", what);
    return GC_OK;
}

/* Starting point of an isentropic solve: T2 = T1 exp(e / c) with e = R ln(rp)
 * (or -R ln(rv)) and c the mean of the heat capacity (cp, or cv = cp - R) at
 * T1 and at the cold-air estimate with c(T1); off the range, the solver's
 * default start takes over. */
static double isentropic_start(const gc_gas *g, double T1, double e, double cR)
{
    double c1 = mix_cp(g->a[interval_index(g, T1)], T1) - cR;
    double T2 = T1 * exp(e / c1);
    if (!(T2 >= g->T_min_K && T2 <= g->T_max_K))
        return T2;
    double c2 = mix_cp(g->a[interval_index(g, T2)], T2) - cR;
    return T1 * exp(2.0 * e / (c1 + c2));
}

int gc_gas_T_isentropic_P(const gc_gas *g, double T1, double rp, double *T2, gc_error *err)
{
    int rc = gc_gas_check_T(g, T1, "", err);
    if (rc == GC_OK)
        rc = check_ratio(rp, "pressure", err);
    if (rc != GC_OK)
        return rc;
    if (g->kind == GC_GAS_COLD)
        return cold_result(g, T1 * pow(rp, g->R_J_per_kgK / g->cp_cold_J_per_kgK), T2, err);
    const double *a = interval(g, T1);
    double e = g->R_J_per_kgK * log(rp);
    double target = mix_s0(a, T1, log(T1)) + e;
    return solve_T(g, F_S0, target, isentropic_start(g, T1, e, 0.0), T2, err);
}

int gc_gas_T_isentropic_v(const gc_gas *g, double T1, double rv, double *T2, gc_error *err)
{
    int rc = gc_gas_check_T(g, T1, "", err);
    if (rc == GC_OK)
        rc = check_ratio(rv, "volume", err);
    if (rc != GC_OK)
        return rc;
    if (g->kind == GC_GAS_COLD)
        return cold_result(g, T1 * pow(rv, -(g->k_cold - 1.0)), T2, err);
    double f1, d;
    eval_f(g, F_S0_V, T1, &f1, &d);
    double e = -g->R_J_per_kgK * log(rv);
    return solve_T(g, F_S0_V, f1 + e, isentropic_start(g, T1, e, g->R_J_per_kgK), T2, err);
}

int gc_gas_T_polytropic_P(const gc_gas *g, double T1, double rp, double n, double *T2,
                          gc_error *err)
{
    int rc = gc_gas_check_T(g, T1, "", err);
    if (rc == GC_OK)
        rc = check_ratio(rp, "pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!(n > 0.0 && n < 1e6))
        return gc_error_set(err, GC_ERR_INVALID, "/n",
                            "the polytropic exponent must be positive and finite");
    return cold_result(g, T1 * pow(rp, (n - 1.0) / n), T2, err);
}

int gc_gas_mix_T(const gc_gas *g, double m_a, double Ta, double m_b, double Tb, double *T_K,
                 gc_error *err)
{
    if (!(m_a >= 0.0 && m_b >= 0.0 && m_a + m_b > 0.0 && m_a + m_b < 1e300))
        return gc_error_set(err, GC_ERR_INVALID, "",
                            "stream masses must be non-negative, finite and not both zero");
    int rc = gc_gas_check_T(g, Ta, "", err);
    if (rc == GC_OK)
        rc = gc_gas_check_T(g, Tb, "", err);
    if (rc != GC_OK)
        return rc;
    double h = (m_a * gc_gas_h_T(g, Ta) + m_b * gc_gas_h_T(g, Tb)) / (m_a + m_b);
    return gc_gas_T_from_h(g, h, T_K, err);
}

int gc_gas_mix(const gc_gas *a, double m_a, const gc_gas *b, double m_b, gc_gas *out,
               gc_error *err)
{
    if (a->kind != GC_GAS_MIXTURE || b->kind != GC_GAS_MIXTURE)
        return gc_error_set(err, GC_ERR_INVALID, "/gas",
                            "only species mixtures can be mixed by composition (not the cold model)");
    if (!(m_a >= 0.0 && m_b >= 0.0 && m_a + m_b > 0.0 && m_a + m_b < 1e300))
        return gc_error_set(err, GC_ERR_INVALID, "",
                            "stream masses must be non-negative, finite and not both zero");
    double moles[GC_SP_COUNT] = { 0 };
    int present[GC_SP_COUNT] = { 0 };
    const gc_gas *src[2] = { a, b };
    const double m[2] = { m_a, m_b };
    for (int s = 0; s < 2; s++)
        for (int j = 0; j < src[s]->n_species; j++) {
            int id = src[s]->species[j];
            moles[id] += m[s] * src[s]->y[j] / gc__species_table[id].M_kg_per_mol;
            present[id] = 1;
        }
    int ids[GC_SP_COUNT], n = 0;
    double x[GC_SP_COUNT], total = 0.0;
    for (int id = 0; id < GC_SP_COUNT; id++)
        if (present[id]) {
            ids[n] = id;
            x[n] = moles[id];
            total += moles[id];
            n++;
        }
    for (int i = 0; i < n; i++)
        x[i] /= total;
    char label[GC_GAS_LABEL_LEN];
    snprintf(label, sizeof label, "%s", strcmp(a->label, b->label) == 0 ? a->label : "mixture");
    int rc = gc_gas_init_mixture(out, n, ids, x, err); /* out may alias a or b */
    if (rc != GC_OK)
        return rc;
    set_label(out, label);
    return GC_OK;
}
