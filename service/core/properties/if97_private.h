/*
 * if97_private.h — what the IAPWS-IF97 sources (if97*.c) share and nobody
 * else needs: the coefficient-row type, integer power tables, the
 * dimensionless derivative sets of the basic equations and the per-region
 * functions. Units as in gascycle/if97.h (SI base units); the reduced
 * variables of each equation are formed inside the region files, next to
 * the table that defines them.
 *
 * Powers: every equation is a sum of n x^I y^J with integer (or, for
 * T2a(p, s), quarter-integer) exponents; the region files build tables of
 * x^k by repeated multiplication once per call instead of calling pow() per
 * term (a pow costs about as much as a whole table).
 */
#ifndef GC_IF97_PRIVATE_H
#define GC_IF97_PRIVATE_H

#include "gascycle/if97.h"

/* One row of a coefficient table: n x^I y^J, in the published order. */
typedef struct gc__if97_term {
    int I;
    int J;
    double n;
} gc__if97_term;

#define GC__IF97_NTERMS(t) ((int)(sizeof(t) / sizeof((t)[0])))
#define GC__IF97_POW_MAX 64   /* longest exponent span of any table (region 1: -41..17) */

/* pw[k - lo] = x^k for k = lo..hi (lo <= 0 <= hi, hi - lo < GC__IF97_POW_MAX);
 * x must be nonzero when lo < 0. Four interleaved chains of multiplication
 * by x^4 (the multiplications of one chain wait for each other; four chains
 * keep the multiplier busy); relative error about k/4 ulp, 1e-14 at k = 58. */
static inline void gc__if97_powers(double x, int lo, int hi, double *pw)
{
    double *p = pw - lo;     /* p[k] = x^k; lo <= 0, so p stays inside pw */
    double x2 = x * x, x4 = x2 * x2;
    p[0] = 1.0;
    if (hi >= 1) p[1] = x;
    if (hi >= 2) p[2] = x2;
    if (hi >= 3) p[3] = x2 * x;
    for (int k = 4; k <= hi; k++)
        p[k] = p[k - 4] * x4;
    if (lo < 0) {
        double r = 1.0 / x, r2 = r * r, r4 = r2 * r2;
        p[-1] = r;
        if (lo <= -2) p[-2] = r2;
        if (lo <= -3) p[-3] = r2 * r;
        if (lo <= -4) p[-4] = r4;
        for (int k = -5; k >= lo; k--)
            p[k] = p[k + 4] * r4;
    }
}

/* One row of a basic equation (regions 1, 2, 3, 5) with the factors its
 * derivatives need, formed at compile time by GC__IF97_BT(I, J, n) from the
 * published I, J, n: n, n I, n I (I - 1), n J, n J (J - 1), n I J. */
typedef struct gc__if97_bterm {
    double n, nI, nII, nJ, nJJ, nIJ, nJJJ;
    int I, J;
} gc__if97_bterm;

#define GC__IF97_BT(I, J, n)                                                         \
    { (n), (n) * (I), (n) * (I) * ((I) - 1.0), (n) * (J), (n) * (J) * ((J) - 1.0),     \
      (n) * (I) * (J), (n) * (J) * ((J) - 1.0) * ((J) - 2.0), (I), (J) }

/* The sums of a basic equation at power tables px (offset ilo), py (offset
 * jlo), t = n x^I y^J: s[0] = sum t, s[1] = sum I t, s[2] = sum I (I - 1) t,
 * s[3] = sum J t, s[4] = sum J (J - 1) t, s[5] = sum I J t, s[6] = sum
 * J (J - 1) (J - 2) t. With full = 0 only the y-derivatives (s[0], s[3],
 * s[4], s[6]: what an iteration in T at fixed p needs); the others are 0. */
static inline void gc__if97_bsums(const gc__if97_bterm *t, int nt, const double *px, int ilo,
                                  const double *py, int jlo, int full, double s[7])
{
    double s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0, s6 = 0;
    if (full) {
        for (int i = 0; i < nt; i++) {
            double q = px[t[i].I - ilo] * py[t[i].J - jlo];
            s0 += t[i].n * q;
            s1 += t[i].nI * q;
            s2 += t[i].nII * q;
            s3 += t[i].nJ * q;
            s4 += t[i].nJJ * q;
            s5 += t[i].nIJ * q;
            s6 += t[i].nJJJ * q;
        }
    } else {
        for (int i = 0; i < nt; i++) {
            double q = px[t[i].I - ilo] * py[t[i].J - jlo];
            s0 += t[i].n * q;
            s3 += t[i].nJ * q;
            s4 += t[i].nJJ * q;
            s6 += t[i].nJJJ * q;
        }
    }
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
    s[4] = s4;
    s[5] = s5;
    s[6] = s6;
}

/* sum J t alone (for h). */
static inline double gc__if97_bsum_J(const gc__if97_bterm *t, int nt, const double *px,
                                     int ilo, const double *py, int jlo)
{
    double s3 = 0;
    for (int i = 0; i < nt; i++)
        s3 += t[i].nJ * px[t[i].I - ilo] * py[t[i].J - jlo];
    return s3;
}

/* Sum of n x^I y^J over a table, with power tables px (offset ilo) and py
 * (offset jlo) built by gc__if97_powers. */
static inline double gc__if97_sum(const gc__if97_term *t, int nt, const double *px, int ilo,
                                  const double *py, int jlo)
{
    double s = 0.0;
    for (int i = 0; i < nt; i++)
        s += t[i].n * px[t[i].I - ilo] * py[t[i].J - jlo];
    return s;
}

/* Derivatives of a dimensionless Gibbs free energy gamma(pi, tau) (regions 1,
 * 2 and 5), each multiplied by its powers of pi and tau:
 * g = gamma, a = pi g_pi, b = pi^2 g_pipi, c = tau g_tau, d = tau^2 g_tautau,
 * e = pi tau g_pitau, t3 = tau^3 g_tautautau (for the Halley iteration). */
typedef struct gc__if97_gibbs {
    double g, a, b, c, d, e, t3;
} gc__if97_gibbs;

/* Derivatives of a dimensionless Helmholtz free energy phi(delta, tau)
 * (region 3), likewise scaled: f = phi, A = delta f_delta, B = delta^2
 * f_deltadelta, C = tau f_tau, D = tau^2 f_tautau, E = delta tau f_deltatau. */
typedef struct gc__if97_helm {
    double f, A, B, C, D, E;
} gc__if97_helm;

/* ---- basic equations (unchecked arguments) ----
 * full = 1: every derivative; full = 0: g, c, d and t3 only (a, b, e = 0). */
void gc__if97_r1_gibbs(double T_K, double P_Pa, int full, gc__if97_gibbs *g);
void gc__if97_r2_gibbs(double T_K, double P_Pa, int full, gc__if97_gibbs *g);
void gc__if97_r5_gibbs(double T_K, double P_Pa, int full, gc__if97_gibbs *g);
void gc__if97_r3_helm(double rho, double T_K, gc__if97_helm *f);

/* tau g_tau alone (h = R T c), for the fast enthalpy. */
double gc__if97_r1_c(double T_K, double P_Pa);
double gc__if97_r2_c(double T_K, double P_Pa);
double gc__if97_r5_c(double T_K, double P_Pa);

/* A state from a Gibbs or Helmholtz derivative set (x = -1, region set). */
void gc__if97_gibbs_state(const gc__if97_gibbs *g, double T_K, double P_Pa, int region,
                          gc_if97_state *st);
void gc__if97_helm_state(const gc__if97_helm *f, double rho, double T_K, gc_if97_state *st);

/* ---- region 4 and boundaries (unchecked) ---- */
double gc__if97_psat(double T_K);
double gc__if97_Tsat(double P_Pa);
double gc__if97_h2bc(double P_Pa);         /* Eq. 21, J/kg */
double gc__if97_h3ab(double P_Pa);         /* SR3-03 Eq. 1, J/kg */

/* ---- backward equations (unchecked; starting values only) ---- */
double gc__if97_r1_T_Ph(double P_Pa, double h);
double gc__if97_r1_T_Ps(double P_Pa, double s);
double gc__if97_r2_T_Ph(double P_Pa, double h);
double gc__if97_r2_T_Ps(double P_Pa, double s);
double gc__if97_r3_T_Ph(double P_Pa, double h);
double gc__if97_r3_v_Ph(double P_Pa, double h);
double gc__if97_r3_T_Ps(double P_Pa, double s);
double gc__if97_r3_v_Ps(double P_Pa, double s);

/* ---- region-3 density at (P, T) ---- */
#define GC__IF97_BRANCH_VAP (-1)   /* the smallest root: vapour side */
#define GC__IF97_BRANCH_ONE 0      /* p(rho) monotonic (T >= Tc): the only root */
#define GC__IF97_BRANCH_LIQ 1      /* the largest root: liquid side */
int gc__if97_r3_rho_PT(double P_Pa, double T_K, int branch, double *rho);
/* The same root found without the v(p, T) start (bracket searches from the
 * region-1 density and the ideal-gas density): the fallback, and the
 * reference the tests compare the started route with. */
int gc__if97_r3_rho_PT_search(double P_Pa, double T_K, int branch, double *rho);

/* ---- SR5-05(2016) region-3 v(p, T) (if97_region3_vpt.c; unchecked) ----
 * The subregion letter 'a'..'z' of (p, T) on a branch (the branch decides
 * the side of the saturation line at p <= 22.064 MPa below Tc; else unused),
 * v of a given subregion's equation, and v(p, T) = both together (m3/kg;
 * NaN outside the subregion's reach). Boundary temperatures T_3xy(p) by name
 * ("ab", "cd", "ef", "gh", "ij", "jk", "mn", "op", "qu", "rx", "uv", "wx"). */
char gc__if97_r3_subregion(double P_Pa, double T_K, int branch);
double gc__if97_sr5_v(char sub, double P_Pa, double T_K);
double gc__if97_r3_v_PT(double P_Pa, double T_K, int branch);
double gc__if97_sr5_boundary_T(const char *xy, double P_Pa);

/* ---- shared by if97.c and if97_inverse.c ---- */
/* State of a known region (1, 2, 3 or 5) at (T, P), unchecked arguments. */
int gc__if97_region_state(int region, double T_K, double P_Pa, gc_if97_state *st,
                          gc_error *err);
/* Saturated liquid (x = 0) and vapour (x = 1) at a point (Ts, Ps) of the
 * saturation line; either pointer may be NULL. */
int gc__if97_sat_states(double Ts, double Ps, gc_if97_state *liq, gc_if97_state *vap,
                        gc_error *err);
/* Two-phase mixture of quality x (x <= 0: liq, x >= 1: vap). */
void gc__if97_mix(const gc_if97_state *liq, const gc_if97_state *vap, double x,
                  gc_if97_state *st);

#endif
