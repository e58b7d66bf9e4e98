/*
 * path.h — process paths of an evaluated cycle: the points (T, s, P, v, h)
 * along each process's real curve (see gc_curve in cycle.h), for diagrams
 * (T-s, P-v, h-s) and for the engine's own area checks, which integrate the
 * very same curves.
 *
 * Parametrisation: every curve is walked by a parameter t in [0, 1] with the
 * temperature linear in t, T(t) = T_from + t (T_to - T_from); ln P(t) follows
 * the curve:
 *   EFF_P     ln P = ln P_from + a (s0(T) - s0(T_from)) / R
 *   EFF_V     ln v = ln v_from - a (phi(T) - phi(T_from)) / R,  phi = s0 - R ln T
 *   POLY_N    ln P = ln P_from + n/(n-1) ln(T / T_from)
 *   ISOCHORE  P = R T / v_from
 *   LINEAR    ln P linear in t from ln P_from to ln P_to (isotherms: T constant)
 * and v = R T / P, h = h(T) on the sensible basis of cycle.h (relative to the
 * gas at 298.15 K), s = s0(T) - R ln(P / P_std). Points are evenly spaced in
 * t, first and last point equal to the process's end states. A fuel step's
 * curve is the products' path with the composition change blended in
 * linearly (path.c): its s and h leave the inlet state itself.
 *
 * Areas: along a curve, T ds = cp dT - R T d ln P, P dv = R dT - R T d ln P,
 * -v dP = -R T d ln P, all in t with analytic derivatives of the curve; the
 * checks integrate them with composite Simpson rules of doubling panel counts,
 * Romberg-extrapolated until converged, split at the
 * gas data's temperature breaks.
 *
 * Units: T in K, s in J/(kg K), P in Pa, v in m3/kg, h in J/kg (per kg of the
 * gas on that process; multiply by the process's mass_ratio for per-intake
 * areas in the flow frame).
 */
#ifndef GASCYCLE_PATH_H
#define GASCYCLE_PATH_H

#include "gascycle/cycle.h"
#include "gascycle/error.h"

#define GC_PATH_DEFAULT_POINTS 25   /* points per process (odd: Simpson over the drawn points) */
#define GC_PATH_MIN_POINTS 2
#define GC_PATH_MAX_POINTS 401

typedef struct gc_path_point {
    double T_K;                 /* K */
    double s_J_per_kgK;         /* J/(kg K) */
    double P_Pa;                /* Pa */
    double v_m3_per_kg;         /* m3/kg */
    double h_J_per_kg;          /* J/kg, sensible basis (cycle.h: hs) */
} gc_path_point;

/* Samples n_points (GC_PATH_MIN_POINTS..GC_PATH_MAX_POINTS) evenly in t along
 * process `process` of run into out[0..n_points-1]. GC_ERR_INVALID for a bad
 * index or count (field "/points"). */
int gc_cycle_path(const gc_cycle_run *run, int process, int n_points,
                  gc_path_point *out, gc_error *err);

/* The loop areas integrated over exactly the points gc_cycle_path draws
 * (n_points per process, odd, >= 3: composite Simpson in t with the curve's
 * analytic derivatives at those points). pv: closed frame loop integral of
 * P dv, flow frame of -v dP; ts: of T ds; both mass-weighted, J/kg intake. */
int gc_cycle_path_areas(const gc_cycle_run *run, int n_points, double *pv,
                        double *ts, gc_error *err);

/* The engine's area check (used by gc_cycle_run_chain): integrates every
 * process adaptively (relative accuracy well below GC_CYCLE_TOL_AREA), fills
 * run->checks.area_* and returns GC_ERR_CHECK if a balance is off by more
 * than GC_CYCLE_TOL_AREA. */
int gc_path_check_areas(gc_cycle_run *run, gc_error *err);

#endif
