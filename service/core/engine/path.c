/*
 * path.c — process curves of an evaluated cycle (gascycle/path.h): sampling
 * for diagrams and the engine's P-v / T-s area checks, both from one curve
 * description (curve_eval), so the picture and the check cannot disagree.
 *
 * Each process is walked by t in [0, 1], T(t) linear between its end states,
 * and d ln P / dt from the curve's differential law (see path.h). The loop
 * integrals use, along any curve of an ideal gas,
 *   T ds  = cp dT - R T d ln P
 *   P dv  = R dT - R T d ln P
 *   -v dP = -R T d ln P
 * (from s = s0(T) - R ln P and P v = R T). The check integrates them with
 * composite Simpson rules of doubling panel counts, Romberg-extrapolated
 * (Simpson -> Boole -> higher orders), until two successive estimates agree to
 * 1e-10 of the heat added (at most 1024 panels), split at the gas data's
 * temperature breaks so no panel straddles a change of polynomial. The balance expected (cycle.h, gc_cycle_checks):
 * the P-v loop area equals the net work plus the work dissipated inside the
 * gas (plus the mass-weighted change of kinetic energy for -v dP in the flow
 * frame, zero around a loop without fuel); the T-s area, by T ds = dh - v dP
 * (flow) or du + P dv (closed) along each drawn curve, that plus the
 * mass-weighted change of h (or u) along the curves, which is zero around a
 * loop of one gas and not when fuel changes the gas.
 *
 * Fuel steps: the drawn curve is the products' path from the inlet's (T, P)
 * to the outlet's, and the composition change is blended in linearly in t:
 * s(t) = s_products(t) + (1 - t) ds0 and hs(t) = hs_products(t) + (1 - t) dh0,
 * with ds0, dh0 the inlet state's value less the products' at the inlet's
 * (T, P). So a T-s or h-s path leaves the inlet state itself (no jump where
 * the gas changes). The T-s integrand gains -ds0 T(t), whose integral
 * -ds0 (T1 + T2)/2 joins the expected area; v is not blended.
 *
 * Enthalpy in the points: the sensible basis of cycle.h (hs, relative to the
 * gas at 298.15 K).
 */
#include "gascycle/path.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

typedef struct curve {
    const gc_gas *g;
    int kind;           /* gc_curve */
    double a;           /* EFF_*: a; POLY_N: n */
    double R;
    double T1, dT;      /* T(t) = T1 + t dT */
    double P1, P2, v1;
    double lnP21;       /* ln(P2/P1) */
    double s01, phi1;   /* s0(T1), phi(T1) for point sampling */
    int have_s;
    double href;        /* zero of the sensible basis of g, J/kg (valid when have_href) */
    int have_href;
    double ds0, dh0;    /* fuel steps: blend offsets at t = 0 (J/(kg K), J/kg), else 0 */
} curve;

static void curve_setup(const gc_cycle_run *run, const gc_cycle_process *p, curve *cv)
{
    const gc_cycle_state *a = &run->states[p->from];
    const gc_cycle_state *b = &run->states[p->to];
    cv->g = &run->gases[p->gas];
    cv->kind = p->curve;
    cv->a = p->curve_a;
    cv->R = cv->g->R_J_per_kgK;
    cv->T1 = a->T_K;
    cv->dT = b->T_K - a->T_K;
    cv->P1 = a->P_Pa;
    cv->P2 = b->P_Pa;
    cv->v1 = a->v_m3_per_kg;
    cv->lnP21 = log(b->P_Pa / a->P_Pa);
    cv->have_s = 0;
    cv->have_href = 0;
    cv->ds0 = cv->dh0 = 0.0;
    if (a->gas != p->gas) {
        cv->href = gc_cycle_h_ref(cv->g);
        cv->have_href = 1;
        cv->ds0 = a->s_J_per_kgK - (gc_gas_s0_T(cv->g, a->T_K) -
                                    cv->R * log(a->P_Pa / GC_P_STD_PA));
        cv->dh0 = a->hs_J_per_kg - (gc_gas_h_T(cv->g, a->T_K) - cv->href);
    }
}

/* T(t), d ln P/dt and cp(T) at t: the curve's differential law. */
static void curve_eval(const curve *cv, double t, double *T, double *dlnP, double *cp)
{
    double Tt = cv->T1 + t * cv->dT;
    double c = gc_gas_cp_T(cv->g, Tt);
    double d;
    switch (cv->kind) {
    case GC_CURVE_EFF_P: d = cv->a * c * cv->dT / (cv->R * Tt); break;
    case GC_CURVE_EFF_V: d = cv->dT / Tt + cv->a * (c - cv->R) * cv->dT / (cv->R * Tt); break;
    case GC_CURVE_POLY_N: d = cv->a / (cv->a - 1.0) * cv->dT / Tt; break;
    case GC_CURVE_ISOCHORE: d = cv->dT / Tt; break;
    default: d = cv->lnP21; break;
    }
    *T = Tt;
    *dlnP = d;
    *cp = c;
}

/* The point at t on the curve (explicit in T for every curve kind). */
static void curve_point(curve *cv, double t, gc_path_point *pt)
{
    const gc_gas *g = cv->g;
    double R = cv->R;
    double T = cv->T1 + t * cv->dT;
    double s0T = gc_gas_s0_T(g, T);
    double P;
    if (!cv->have_s) {
        cv->s01 = gc_gas_s0_T(g, cv->T1);
        cv->phi1 = cv->s01 - R * log(cv->T1);
        cv->have_s = 1;
    }
    switch (cv->kind) {
    case GC_CURVE_EFF_P:
        P = cv->P1 * exp(cv->a * (s0T - cv->s01) / R);
        break;
    case GC_CURVE_EFF_V: {
        double phi = s0T - R * log(T);
        double v = cv->v1 * exp(-cv->a * (phi - cv->phi1) / R);
        P = R * T / v;
        break;
    }
    case GC_CURVE_POLY_N:
        P = cv->P1 * pow(T / cv->T1, cv->a / (cv->a - 1.0));
        break;
    case GC_CURVE_ISOCHORE:
        P = R * T / cv->v1;
        break;
    default:
        P = cv->P1 * exp(t * cv->lnP21);
        break;
    }
    if (!cv->have_href) {
        cv->href = gc_cycle_h_ref(g);
        cv->have_href = 1;
    }
    pt->T_K = T;
    pt->P_Pa = P;
    pt->v_m3_per_kg = R * T / P;
    pt->h_J_per_kg = gc_gas_h_T(g, T) - cv->href + (1.0 - t) * cv->dh0;
    pt->s_J_per_kgK = s0T - R * log(P / GC_P_STD_PA) + (1.0 - t) * cv->ds0;
}

int gc_cycle_path(const gc_cycle_run *run, int process, int n_points,
                  gc_path_point *out, gc_error *err)
{
    if (run == NULL || out == NULL || process < 0 || process >= run->n_processes)
        return gc_error_set(err, GC_ERR_INVALID, "/process", "no such process");
    if (n_points < GC_PATH_MIN_POINTS || n_points > GC_PATH_MAX_POINTS)
        return gc_error_set(err, GC_ERR_INVALID, "/points",
                            "points per process must be %d to %d", GC_PATH_MIN_POINTS,
                            GC_PATH_MAX_POINTS);
    const gc_cycle_process *p = &run->processes[process];
    curve cv;
    curve_setup(run, p, &cv);
    for (int k = 0; k < n_points; k++)
        curve_point(&cv, (double)k / (double)(n_points - 1), &out[k]);
    /* the ends are the states themselves (the curve meets them to solver
     * accuracy; a fuel step's blended curve meets its inlet state in T, P, s
     * and h, not in v, which the products' R sets) */
    const gc_cycle_state *ends[2] = {&run->states[p->from], &run->states[p->to]};
    for (int e = 0; e < 2; e++) {
        gc_path_point *pt = &out[e ? n_points - 1 : 0];
        pt->T_K = ends[e]->T_K;
        pt->P_Pa = ends[e]->P_Pa;
        pt->h_J_per_kg = ends[e]->hs_J_per_kg;
        pt->s_J_per_kgK = ends[e]->s_J_per_kgK;
        if (ends[e]->gas == p->gas)
            pt->v_m3_per_kg = ends[e]->v_m3_per_kg;
    }
    return GC_OK;
}

/* The three integrands per unit t: T ds, P dv, -v dP. */
static void integrands(const curve *cv, double t, double f[3])
{
    double T, d, cp;
    curve_eval(cv, t, &T, &d, &cp);
    double RTd = cv->R * T * d;
    f[0] = cp * cv->dT - RTd - cv->ds0 * T;
    f[1] = cv->R * cv->dT - RTd;
    f[2] = -RTd;
}

/* Composite Simpson over [ta, tb] for the three integrands, with Romberg
 * (Richardson) extrapolation of the successive halvings: row k holds the
 * trapezoid rule with 2^k panels (column 0), Simpson's rule (column 1),
 * Boole's rule (column 2) and higher orders. Stops when two successive
 * diagonal values agree to tol (at least 4 panels), at most 2^10 panels. */
#define ROMBERG_MAX 11
static void simpson_adaptive(const curve *cv, double ta, double tb, double tol,
                             double out[3], int *evals)
{
    double R[ROMBERG_MAX][ROMBERG_MAX][3];
    double fa[3], fb[3];
    integrands(cv, ta, fa);
    integrands(cv, tb, fb);
    *evals += 2;
    double H = tb - ta;
    for (int j = 0; j < 3; j++)
        R[0][0][j] = 0.5 * H * (fa[j] + fb[j]);
    int n = 1;
    for (int k = 1; k < ROMBERG_MAX; k++) {
        double h = H / (2 * n);
        double add[3] = {0.0, 0.0, 0.0};
        for (int i = 0; i < n; i++) {
            double f[3];
            integrands(cv, ta + (2 * i + 1) * h, f);
            add[0] += f[0];
            add[1] += f[1];
            add[2] += f[2];
        }
        *evals += n;
        n *= 2;
        for (int j = 0; j < 3; j++)
            R[k][0][j] = 0.5 * R[k - 1][0][j] + h * add[j];
        double p4 = 1.0;
        for (int c = 1; c <= k; c++) {
            p4 *= 4.0;
            for (int j = 0; j < 3; j++)
                R[k][c][j] = R[k][c - 1][j] + (R[k][c - 1][j] - R[k - 1][c - 1][j]) / (p4 - 1.0);
        }
        double diff = 0.0;
        for (int j = 0; j < 3; j++)
            diff = fmax(diff, fabs(R[k][k][j] - R[k - 1][k - 1][j]));
        if ((k >= 2 && diff <= tol) || k == ROMBERG_MAX - 1) {
            out[0] = R[k][k][0];
            out[1] = R[k][k][1];
            out[2] = R[k][k][2];
            return;
        }
    }
}

/* Integrates one process over t in [0,1], split at the gas's temperature
 * breaks. res[3] per kg of the gas on the process. */
static void integrate_process(const gc_cycle_run *run, const gc_cycle_process *p, double tol,
                              double res[3], int *evals, double *ds0)
{
    curve cv;
    curve_setup(run, p, &cv);
    *ds0 = cv.ds0;
    double cuts[GC_GAS_MAX_INTERVALS + 2];
    int nc = 0;
    cuts[nc++] = 0.0;
    const gc_gas *g = cv.g;
    if (cv.dT != 0.0 && g->kind == GC_GAS_MIXTURE) {
        double tb[GC_GAS_MAX_INTERVALS + 1];
        int nb = 0;
        for (int k = 1; k < g->n_intervals && k < GC_GAS_MAX_INTERVALS; k++) {
            double t = (g->T_break_K[k] - cv.T1) / cv.dT;
            if (t > 1e-9 && t < 1.0 - 1e-9)
                tb[nb++] = t;
        }
        /* breaks are ascending in T: in t ascending if dT > 0, else reversed */
        for (int k = 0; k < nb; k++)
            cuts[nc++] = cv.dT > 0.0 ? tb[k] : tb[nb - 1 - k];
    }
    cuts[nc++] = 1.0;
    res[0] = res[1] = res[2] = 0.0;
    for (int k = 0; k + 1 < nc; k++) {
        double r[3];
        simpson_adaptive(&cv, cuts[k], cuts[k + 1], tol, r, evals);
        res[0] += r[0];
        res[1] += r[1];
        res[2] += r[2];
    }
}

int gc_path_check_areas(gc_cycle_run *run, gc_error *err)
{
    gc_cycle_checks *ck = &run->checks;
    const gc_cycle_summary *sm = &run->summary;
    int closed = (run->frame == GC_FRAME_CLOSED);
    double scale = sm->heat_in > 0.0 ? sm->heat_in : 1.0;
    double ts = 0.0, pv = 0.0, dke = 0.0, shift = 0.0;
    int evals = 0;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        /* T ds = dh - v dP (flow), du + P dv (closed) along the drawn curve,
         * plus the blend term of a fuel step */
        const gc_gas *g = &run->gases[p->gas];
        double Ta = run->states[p->from].T_K, Tb = run->states[p->to].T_K;
        double df = gc_gas_h_T(g, Tb) - gc_gas_h_T(g, Ta);
        if (closed)
            df -= g->R_J_per_kgK * (Tb - Ta);
        double r[3], ds0;
        double tol = 1e-10 * scale / (p->mass_ratio > 0.0 ? p->mass_ratio : 1.0);
        integrate_process(run, p, tol, r, &evals, &ds0);
        shift += p->mass_ratio * (df - ds0 * 0.5 * (Ta + Tb));
        ts += p->mass_ratio * r[0];
        pv += p->mass_ratio * (closed ? r[1] : r[2]);
        dke += p->delta_ke;
    }
    ck->areas_done = 1;
    ck->areas_applicable = 1;
    ck->area_evaluations = evals;
    ck->area_ts = ts;
    ck->area_pv = pv;
    ck->area_expected_pv = sm->net_work + sm->dissipated + (closed ? 0.0 : dke);
    ck->area_expected_ts = ck->area_expected_pv + shift;
    /* relative to the expected area, floored at 1 % of the heat added so a
     * cycle with almost no net work is not judged on rounding */
    double den_ts = fmax(fabs(ck->area_expected_ts), 1e-2 * scale);
    double den_pv = fmax(fabs(ck->area_expected_pv), 1e-2 * scale);
    ck->area_ts_rel = fabs(ts - ck->area_expected_ts) / den_ts;
    ck->area_pv_rel = fabs(pv - ck->area_expected_pv) / den_pv;
    if (!(ck->area_ts_rel <= ck->tol_area))
        return gc_error_set(err, GC_ERR_CHECK, "",
                            "T-s area check failed: the loop integral of T ds is %.9g J/kg but "
                            "net work plus dissipated work (and the change of enthalpy along "
                            "the drawn curves) is %.9g J/kg", ts,
                            ck->area_expected_ts);
    if (!(ck->area_pv_rel <= ck->tol_area))
        return gc_error_set(err, GC_ERR_CHECK, "",
                            "P-v area check failed: the loop integral is %.9g J/kg but net work "
                            "plus dissipated work is %.9g J/kg", pv, ck->area_expected_pv);
    return GC_OK;
}

int gc_cycle_path_areas(const gc_cycle_run *run, int n_points, double *pv_out,
                        double *ts_out, gc_error *err)
{
    if (run == NULL || n_points < 3 || n_points > GC_PATH_MAX_POINTS || n_points % 2 == 0)
        return gc_error_set(err, GC_ERR_INVALID, "/points",
                            "Simpson areas need an odd number of points per process, 3 to %d",
                            GC_PATH_MAX_POINTS);
    int closed = (run->frame == GC_FRAME_CLOSED);
    double ts = 0.0, pv = 0.0;
    int n = n_points - 1;
    double h = 1.0 / n;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        curve cv;
        curve_setup(run, p, &cv);
        double sum[3] = {0.0, 0.0, 0.0};
        for (int j = 0; j <= n; j++) {
            double f[3];
            integrands(&cv, j * h, f);
            double w = (j == 0 || j == n) ? 1.0 : (j % 2 ? 4.0 : 2.0);
            sum[0] += w * f[0];
            sum[1] += w * f[1];
            sum[2] += w * f[2];
        }
        ts += p->mass_ratio * h / 3.0 * sum[0];
        pv += p->mass_ratio * h / 3.0 * (closed ? sum[1] : sum[2]);
    }
    if (pv_out)
        *pv_out = pv;
    if (ts_out)
        *ts_out = ts;
    return GC_OK;
}
