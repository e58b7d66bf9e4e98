/*
 * if97_inverse.c — IAPWS-IF97 states at (P, h) and (P, s) (gascycle/if97.h).
 *
 * Route: find the region from the value of h (or s) at the region
 * boundaries at this pressure (the saturated liquid and vapour of region 4,
 * IAPWS R7-97(2012) Eqs. 30-31; the 1/3 boundary at 623.15 K; the B23 line,
 * Eq. 6; 1073.15 K between regions 2 and 5), then:
 *   regions 1 and 2: start from the backward equation (R7-97 Eqs. 11, 13,
 *     22-27) and refine T by safeguarded Halley iteration on the basic
 *     equation at fixed p (dh/dT = cp, d2h/dT2 = dcp/dT from the third
 *     tau-derivative of gamma; ds/dT = cp / T) inside the region's bracket;
 *     the backward equations are within 10-25 mK (R7-97 Sec. 5.2, 6.3), so
 *     one Halley step usually meets the tolerance;
 *   region 5: the same from the region-2 end state at 1073.15 K (R7-97 gives
 *     no backward equation for region 5);
 *   region 3: start from the SR3-03 backward equations v(p, h), T(p, h)
 *     (or v(p, s), T(p, s)) and solve p(rho, T) = P, h(rho, T) = h by
 *     two-dimensional Newton iteration on the basic equation (R7-97 Eq. 28);
 *     should that not converge on the expected side of the saturation line,
 *     fall back to a bracketed one-dimensional solve in T over region-3
 *     states at (T, P);
 *   two-phase (region 4): quality x from the saturated liquid and vapour.
 * The lower and upper temperature bounds (273.15 K, 2273.15 K; 1073.15 K
 * above 50 MPa) are found as a root that would lie beyond them
 * (GC_ERR_RANGE naming the value there).
 * Accuracy: the temperature meets the basic equation to about 1e-11
 * relative (the backward equations' own tolerances do not remain).
 * Units: SI base units.
 */
#include "if97_private.h"

#include <math.h>
#include <stddef.h>

#define BY_H 0
#define BY_S 1
#define R_SPEC GC_IF97_R_J_PER_KGK
#define T_MAX_ITER 80
/* A Halley step below HALLEY_ACCEPT_K is accepted without another
 * evaluation: its error is K step^3, and K = (y''/2y')^2 - y'''/6y' was
 * below 1.2e-3 K^-2 for h and s over regions 1, 2 and 5 (400 000 random
 * states, started 30 mK off), so the error stays below 4e-8 K (1.2e-10
 * relative at 273 K). A Newton step (region 3) is accepted below
 * NEWTON_ACCEPT times T (error about (y''/2y') step^2). */
#define HALLEY_ACCEPT_K 0.03
#define NEWTON_ACCEPT 1e-9
#define R3_REL_TOL 1e-13
#define R3_MAX_ITER 40

/* What one inverse call works on. */
typedef struct inv {
    double P;             /* Pa */
    double y;             /* the given h (J/kg) or s (J/(kg K)) */
    int by;               /* BY_H or BY_S */
    int full;             /* 1: fill the whole state; 0: T and region only */
    gc_if97_state *st;
    gc_error *err;
} inv;

static const char *field_of(int by)
{
    return by == BY_H ? "/h" : "/s";
}

static const char *name_of(int by)
{
    return by == BY_H ? "h" : "s";
}

static const char *unit_of(int by)
{
    return by == BY_H ? "J/kg" : "J/(kg K)";
}

static double y_of(const gc_if97_state *st, int by)
{
    return by == BY_H ? st->h_J_per_kg : st->s_J_per_kgK;
}

/* Tolerance on h or s when comparing with a boundary value or accepting a
 * root at a bracket end: 1e-11 relative plus a floor for values near zero
 * (h near 273.15 K, s near the triple point): rounding, not physics. */
static double y_tol(double y, int by)
{
    return 1e-11 * fabs(y) + (by == BY_H ? 1e-6 : 1e-9);
}

static void gibbs_T(int region, double T_K, double P_Pa, gc__if97_gibbs *g)
{
    if (region == 1)
        gc__if97_r1_gibbs(T_K, P_Pa, 0, g);
    else if (region == 2)
        gc__if97_r2_gibbs(T_K, P_Pa, 0, g);
    else
        gc__if97_r5_gibbs(T_K, P_Pa, 0, g);
}

/* h or s at (T, P) in a Gibbs region (1, 2 or 5). */
static double y_gibbs(int region, double T_K, double P_Pa, int by)
{
    if (by == BY_H && region != 5)
        return R_SPEC * T_K * (region == 1 ? gc__if97_r1_c(T_K, P_Pa) : gc__if97_r2_c(T_K, P_Pa));
    gc__if97_gibbs g;
    gibbs_T(region, T_K, P_Pa, &g);
    return by == BY_H ? R_SPEC * T_K * g.c : R_SPEC * (g.c - g.g);
}

/* A value between the saturated liquid and vapour at every pressure up to
 * psat(623.15 K), from IF97 itself (checked in tests/unit/test_if97.c along
 * the whole line): h' <= 1670.9 kJ/kg and s' <= 3.778 kJ/(kg K) (highest at
 * 623.15 K), h'' >= 2500.9 kJ/kg (lowest at 273.16 K) and s'' >= 5.211
 * kJ/(kg K) (lowest at 623.15 K). A y below it is not vapour, one above it
 * not liquid, which saves computing one of the two saturated values. */
static const double Y_SPLIT[2] = { 2.0e6, 4.5e3 };

/* y and its first two T-derivatives at fixed P (R7-97 Tables 3, 12, 39:
 * h = R T c, cp = -R d, dcp/dT = R (2d + t3) / T; s = R (c - g),
 * ds/dT = cp / T, d2s/dT2 = R (3d + t3) / T^2). Region 3 (on a branch):
 * y and y' from the state, y'' = 0 (Newton). */
static int y_derivs(int region, int branch, double T, const inv *c, double d[3])
{
    if (region == 3) {
        double rho;
        if (gc__if97_r3_rho_PT(c->P, T, branch, &rho) != GC_OK)
            return GC_ERR_NOCONV;
        gc__if97_helm f;
        gc_if97_state st;
        gc__if97_r3_helm(rho, T, &f);
        gc__if97_helm_state(&f, rho, T, &st);
        d[0] = y_of(&st, c->by);
        d[1] = c->by == BY_H ? st.cp_J_per_kgK : st.cp_J_per_kgK / T;
        d[2] = 0.0;
        return GC_OK;
    }
    gc__if97_gibbs g;
    gibbs_T(region, T, c->P, &g);
    if (c->by == BY_H) {
        d[0] = R_SPEC * T * g.c;
        d[1] = -R_SPEC * g.d;
        d[2] = R_SPEC * (2.0 * g.d + g.t3) / T;
    } else {
        d[0] = R_SPEC * (g.c - g.g);
        d[1] = -R_SPEC * g.d / T;
        d[2] = R_SPEC * (3.0 * g.d + g.t3) / (T * T);
    }
    return GC_OK;
}

/* Region-3 state at (T, P) on a branch; P reported as given. */
static int r3_state_at(double T, double P_Pa, int branch, gc_if97_state *st)
{
    double rho;
    int rc = gc__if97_r3_rho_PT(P_Pa, T, branch, &rho);
    if (rc == GC_OK) {
        gc__if97_helm f;
        gc__if97_r3_helm(rho, T, &f);
        gc__if97_helm_state(&f, rho, T, st);
        st->P_Pa = P_Pa;
    }
    return rc;
}

/* The answer at T in a region: the whole state, or T and region only. */
static int finish(const inv *c, int region, int branch, double T)
{
    if (!c->full) {
        c->st->T_K = T;
        c->st->P_Pa = c->P;
        c->st->region = region;
        c->st->x = -1.0;
        return GC_OK;
    }
    if (region == 3)
        return r3_state_at(T, c->P, branch, c->st);
    return gc__if97_region_state(region, T, c->P, c->st, NULL);
}

/* ---- one-dimensional solve in T ---------------------------------------- */

#define SOLVE_BELOW 100   /* y is below y(lo): no root in the bracket */
#define SOLVE_ABOVE 101   /* y is above y(hi) */

/* T with y(T) = c->y at fixed P in region `region` (1, 2, 5, or 3 on
 * `branch`), T in [lo, hi] where y rises with T: Halley (Newton in region 3)
 * from T; a step out of the bracket goes to the bracket end it crossed once,
 * later ones bisect. A y outside [y(lo), y(hi)] ends at that end with
 * SOLVE_BELOW or SOLVE_ABOVE; GC_ERR_NOCONV if nothing converges (not seen
 * on the tested grid). On success *T_out is the root. */
static int solve_T(const inv *c, int region, int branch, double T, double lo, double hi,
                   double *T_out)
{
    const double lo0 = lo, hi0 = hi, tol = y_tol(c->y, c->by);
    const double accept = region == 3 ? NEWTON_ACCEPT * T : HALLEY_ACCEPT_K;
    int lo_tried = 0, hi_tried = 0;
    if (!(T >= lo && T <= hi))
        T = (T < lo) ? lo : (T > hi) ? hi : 0.5 * (lo + hi);   /* NaN: midpoint */
    for (int it = 0; it < T_MAX_ITER; it++) {
        double d[3];
        if (y_derivs(region, branch, T, c, d) != GC_OK)
            return GC_ERR_NOCONV;
        lo_tried |= (T == lo0);
        hi_tried |= (T == hi0);
        double F = d[0] - c->y;
        if (F > 0.0)
            hi = T;
        else
            lo = T;
        double den = 2.0 * d[1] * d[1] - F * d[2];
        double step = (d[1] > 0.0) ? (den > 0.0 ? 2.0 * F * d[1] / den : F / d[1]) : NAN;
        double Tn = T - step;
        if (Tn >= lo && Tn <= hi && fabs(step) <= accept) {
            *T_out = Tn;
            return GC_OK;
        }
        if (!(Tn >= lo))
            Tn = (lo == lo0 && !lo_tried) ? lo0 : 0.5 * (lo + hi);
        else if (Tn > hi)
            Tn = (hi == hi0 && !hi_tried) ? hi0 : 0.5 * (lo + hi);
        if (fabs(Tn - T) <= 1e-13 * T) {   /* pinned at a bracket end */
            if (F > tol && T <= lo0)
                return SOLVE_BELOW;
            if (F < -tol && T >= hi0)
                return SOLVE_ABOVE;
            *T_out = T;
            return GC_OK;
        }
        T = Tn;
    }
    return GC_ERR_NOCONV;
}

static int noconv(const inv *c)
{
    return gc_error_set(c->err, GC_ERR_NOCONV, field_of(c->by),
                        "the IAPWS-IF97 temperature at P = %.9g Pa, %s = %.9g %s did not "
                        "converge", c->P, name_of(c->by), c->y, unit_of(c->by));
}

/* ---- region 3: two-dimensional Newton in (rho, T) ---------------------- */

/* One Newton step on F1 = p(rho, T) - P, F2 = y(rho, T) - y (R7-97 Table 31
 * relations differentiated: dp/drho = R T (2A + B), dp/dT = rho R (A - E),
 * dh/drho = R T (A + B + E) / rho, dh/dT = R (A - D - E),
 * ds/drho = R (E - A) / rho, ds/dT = -R D / T). Returns 0 when singular. */
static int r3_newton_step(double rho, double T, const inv *c, double *drho, double *dT)
{
    gc__if97_helm f;
    gc__if97_r3_helm(rho, T, &f);
    double RT = R_SPEC * T;
    double F1 = rho * RT * f.A - c->P;
    double J11 = RT * (2.0 * f.A + f.B), J12 = rho * R_SPEC * (f.A - f.E);
    double F2, J21, J22;
    if (c->by == BY_H) {
        F2 = RT * (f.C + f.A) - c->y;
        J21 = RT * (f.A + f.B + f.E) / rho;
        J22 = R_SPEC * (f.A - f.D - f.E);
    } else {
        F2 = R_SPEC * (f.C - f.f) - c->y;
        J21 = R_SPEC * (f.E - f.A) / rho;
        J22 = -R_SPEC * f.D / T;
    }
    double det = J11 * J22 - J12 * J21;
    if (!(J11 > 0.0) || det == 0.0 || !isfinite(det))
        return 0;
    *drho = (F1 * J22 - F2 * J12) / det;
    *dT = (J11 * F2 - J21 * F1) / det;
    return 1;
}

static int r3_newton(const inv *c, double rho, double T, double T_lo, double T_hi)
{
    for (int it = 0; it < R3_MAX_ITER; it++) {
        double drho, dT;
        if (!r3_newton_step(rho, T, c, &drho, &dT))
            return GC_ERR_NOCONV;
        double lim = 0.5 * rho;   /* damp steps that would halve or double rho */
        if (fabs(drho) > lim) {
            double k = lim / fabs(drho);
            drho *= k;
            dT *= k;
        }
        rho -= drho;
        T -= dT;
        if (!(T > 0.5 * T_lo && T < 2.0 * T_hi))
            return GC_ERR_NOCONV;
        if (fabs(drho) <= R3_REL_TOL * rho && fabs(dT) <= R3_REL_TOL * T) {
            if (!(T >= T_lo && T <= T_hi))
                return GC_ERR_NOCONV;    /* a root on the wrong side */
            gc__if97_helm f;
            gc_if97_state st;
            gc__if97_r3_helm(rho, T, &f);
            gc__if97_helm_state(&f, rho, T, &st);
            if (!(fabs(st.P_Pa - c->P) <= 1e-9 * c->P) || !(2.0 * f.A + f.B > 0.0))
                return GC_ERR_NOCONV;    /* not a root, or a mechanically unstable one */
            st.P_Pa = c->P;
            if (c->full)
                *c->st = st;
            else
                finish(c, 3, 0, T);
            return GC_OK;
        }
    }
    return GC_ERR_NOCONV;
}

/* ---- regions ------------------------------------------------------------ */

/* IF97 lets neighbouring regions disagree slightly at their common boundary
 * (R7-97(2012) Sec. 5-7, consistency requirements; seen here: about 4e-6
 * relative in h between regions 2 and 5 at 1073.15 K, a few mK in T along
 * 623.15 K and B23). A value of h or s that falls in such a gap has no root
 * inside the nominal range of either region; the region beyond the boundary
 * is then solved up to GAP_K past its nominal limit, so the requested h or s
 * is met exactly by the equation of that region slightly extrapolated. */
#define GAP_K 1.0

static int below_range(const inv *c)
{
    int reg = c->P >= GC_IF97_P_SAT_MIN_PA ? 1 : 2;
    double y_min = y_gibbs(reg, GC_IF97_T_MIN_K, c->P, c->by);
    return gc_error_set(c->err, GC_ERR_RANGE, field_of(c->by),
                        "%s = %.9g %s at P = %.9g Pa is below %.9g %s, its value at 273.15 K "
                        "(the IAPWS-IF97 lower temperature bound)", name_of(c->by), c->y,
                        unit_of(c->by), c->P, y_min, unit_of(c->by));
}

static int above_range(const inv *c, int region, double T_max)
{
    double y_max = y_gibbs(region, T_max, c->P, c->by);
    return gc_error_set(c->err, GC_ERR_RANGE, field_of(c->by),
                        "%s = %.9g %s at P = %.9g Pa is above %.9g %s, its value at %.6g K "
                        "(the IAPWS-IF97 upper temperature bound at this pressure)",
                        name_of(c->by), c->y, unit_of(c->by), c->P, y_max, unit_of(c->by),
                        T_max);
}

/* Region-3 single phase with T in [T_lo, T_hi] on a branch. */
static int r3_solve(const inv *c, double T_lo, double T_hi, int branch)
{
    double v0 = c->by == BY_H ? gc__if97_r3_v_Ph(c->P, c->y) : gc__if97_r3_v_Ps(c->P, c->y);
    double T0 = c->by == BY_H ? gc__if97_r3_T_Ph(c->P, c->y) : gc__if97_r3_T_Ps(c->P, c->y);
    if (v0 > 0.0 && isfinite(v0) && isfinite(T0) &&
        r3_newton(c, 1.0 / v0, T0, T_lo, T_hi) == GC_OK)
        return GC_OK;
    double T;
    if (solve_T(c, 3, branch, T0, T_lo, T_hi, &T) != GC_OK)
        return noconv(c);
    return finish(c, 3, branch, T);
}

/* Region 1 between 273.15 K and T_hi (saturation, or 623.15 K). */
static int liquid(const inv *c, double T_hi)
{
    double T0 = c->by == BY_H ? gc__if97_r1_T_Ph(c->P, c->y) : gc__if97_r1_T_Ps(c->P, c->y);
    double T;
    int rc = solve_T(c, 1, 0, T0, GC_IF97_T_MIN_K, T_hi, &T);
    if (rc == SOLVE_BELOW)
        return below_range(c);
    return rc == GC_OK ? finish(c, 1, 0, T) : noconv(c);
}

/* Region 5 above the region-2 limit 1073.15 K (P <= 50 MPa), started from
 * a linear step off the region-5 value at 1073.15 K. */
static int region5(const inv *c)
{
    double d[3], T;
    if (y_derivs(5, 0, GC_IF97_T_R2_MAX_K, c, d) != GC_OK)
        return noconv(c);
    double T0 = GC_IF97_T_R2_MAX_K + (c->y - d[0]) / d[1];
    int rc = solve_T(c, 5, 0, T0, GC_IF97_T_R2_MAX_K - GAP_K, GC_IF97_T_MAX_K, &T);
    if (rc == SOLVE_ABOVE)
        return above_range(c, 5, GC_IF97_T_MAX_K);
    return rc == GC_OK ? finish(c, 5, 0, T) : noconv(c);
}

/* Regions 2 and 5 above T_lo (a point of the saturation line, the B23 line
 * or 273.15 K). Region 2 is tried first; a y above its 1073.15 K value goes
 * on to region 5. */
static int vapour(const inv *c, double T_lo)
{
    double T0 = c->by == BY_H ? gc__if97_r2_T_Ph(c->P, c->y) : gc__if97_r2_T_Ps(c->P, c->y);
    double T;
    if (!(T0 < 1050.0) && c->P <= GC_IF97_P_R5_MAX_PA) {   /* perhaps region 5: look */
        double y25 = y_gibbs(2, GC_IF97_T_R2_MAX_K, c->P, c->by);
        if (c->y > y25 + y_tol(y25, c->by))
            return region5(c);
    }
    int rc = solve_T(c, 2, 0, T0, T_lo, GC_IF97_T_R2_MAX_K, &T);
    if (rc == SOLVE_BELOW)   /* only at 273.15 K: above it T_lo is a region edge */
        return below_range(c);
    if (rc == SOLVE_ABOVE) {
        if (c->P > GC_IF97_P_R5_MAX_PA)
            return above_range(c, 2, GC_IF97_T_R2_MAX_K);
        return region5(c);
    }
    return rc == GC_OK ? finish(c, 2, 0, T) : noconv(c);
}

/* The two-phase mixture between saturated l and v (x from the lever rule). */
static int mixture(const inv *c, const gc_if97_state *l, const gc_if97_state *v)
{
    double yL = y_of(l, c->by), yV = y_of(v, c->by);
    gc__if97_mix(l, v, (c->y - yL) / (yV - yL), c->st);
    return GC_OK;
}

/* Below 623.15 K saturation (P <= psat(623.15 K)): regions 1, 4, 2, 5. */
static int low_pressure(const inv *c)
{
    if (c->P < GC_IF97_P_SAT_MIN_PA)     /* no liquid: vapour from 273.15 K */
        return vapour(c, GC_IF97_T_MIN_K);
    double Ts = gc__if97_Tsat(c->P);
    if (c->y > Y_SPLIT[c->by]) {
        double yV = y_gibbs(2, Ts, c->P, c->by);
        if (c->y >= yV - y_tol(yV, c->by))
            return vapour(c, Ts);
    } else {
        double yL = y_gibbs(1, Ts, c->P, c->by);
        if (c->y <= yL + y_tol(yL, c->by))
            return liquid(c, Ts);
    }
    gc_if97_state l, v;
    int rc = gc__if97_sat_states(Ts, c->P, &l, &v, c->err);
    return rc == GC_OK ? mixture(c, &l, &v) : rc;
}

/* Region 3 below pc: liquid side, two-phase or vapour side of the dome. */
static int near_critical(const inv *c, double T_lo, double T_hi)
{
    double Ts = gc__if97_Tsat(c->P);
    gc_if97_state l, v;
    if (c->P > GC_IF97_P_SAT_STATES_MAX_PA) {
        /* no saturated states this close to pc (if97.h); the dome at
         * pc - 50 Pa encloses the narrower dome here (h' and s' rise, h''
         * and s'' fall towards the critical point), so a y outside it is a
         * single phase on the known side, and one inside it is refused */
        double Pm = GC_IF97_P_SAT_STATES_MAX_PA;
        int rc = gc__if97_sat_states(gc__if97_Tsat(Pm), Pm, &l, &v, c->err);
        if (rc != GC_OK)
            return rc;
        if (c->y <= y_of(&l, c->by))
            return r3_solve(c, T_lo, Ts, GC__IF97_BRANCH_LIQ);
        if (c->y >= y_of(&v, c->by))
            return r3_solve(c, Ts, T_hi, GC__IF97_BRANCH_VAP);
        return gc__if97_sat_states(Ts, c->P, &l, &v, c->err);   /* the refusal */
    }
    int rc = gc__if97_sat_states(Ts, c->P, &l, &v, c->err);
    if (rc != GC_OK)
        return rc;
    if (c->y <= y_of(&l, c->by))
        return r3_solve(c, T_lo, Ts, GC__IF97_BRANCH_LIQ);
    if (c->y >= y_of(&v, c->by))
        return r3_solve(c, Ts, T_hi, GC__IF97_BRANCH_VAP);
    return mixture(c, &l, &v);
}

/* Above psat(623.15 K): regions 1, 3 (with 4 below pc), 2, 5. */
static int high_pressure(const inv *c)
{
    double y13 = y_gibbs(1, GC_IF97_T_R13_K, c->P, c->by);
    if (c->y <= y13 + y_tol(y13, c->by))
        return liquid(c, GC_IF97_T_R13_K);
    double TB = gc_if97_T_B23_P(c->P), y23 = y_gibbs(2, TB, c->P, c->by);
    if (c->y >= y23 - y_tol(y23, c->by))
        return vapour(c, TB - GAP_K);
    double T_lo = GC_IF97_T_R13_K - GAP_K, T_hi = TB + GAP_K;
    if (c->P >= GC_IF97_PC_PA)
        return r3_solve(c, T_lo, T_hi, GC__IF97_BRANCH_ONE);
    return near_critical(c, T_lo, T_hi);
}

static int inverse(double P_Pa, double y, int by, int full, gc_if97_state *st, gc_error *err)
{
    inv c = { P_Pa, y, by, full, st, err };
    if (!isfinite(P_Pa))
        return gc_error_set(err, GC_ERR_INVALID, "/P", "P must be a finite number");
    if (!(P_Pa > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/P", "P must be greater than 0 Pa");
    if (P_Pa > GC_IF97_P_MAX_PA)
        return gc_error_set(err, GC_ERR_RANGE, "/P",
                            "P = %.6g Pa is above the IAPWS-IF97 upper bound 100 MPa", P_Pa);
    if (!isfinite(y))
        return gc_error_set(err, GC_ERR_INVALID, field_of(by), "%s must be a finite number",
                            name_of(by));
    if (P_Pa <= gc__if97_psat(GC_IF97_T_R13_K))
        return low_pressure(&c);
    return high_pressure(&c);
}

int gc_if97_state_Ph(double P_Pa, double h_J_per_kg, gc_if97_state *st, gc_error *err)
{
    return inverse(P_Pa, h_J_per_kg, BY_H, 1, st, err);
}

int gc_if97_state_Ps(double P_Pa, double s_J_per_kgK, gc_if97_state *st, gc_error *err)
{
    return inverse(P_Pa, s_J_per_kgK, BY_S, 1, st, err);
}

int gc_if97_T_Ph(double P_Pa, double h_J_per_kg, double *T_K, gc_error *err)
{
    gc_if97_state st;
    int rc = inverse(P_Pa, h_J_per_kg, BY_H, 0, &st, err);
    if (rc == GC_OK)
        *T_K = st.T_K;
    return rc;
}
