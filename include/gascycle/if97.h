/*
 * if97.h — water and steam properties by the IAPWS Industrial Formulation 1997
 * (IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation
 * 1997 for the Thermodynamic Properties of Water and Steam"), in C, with the
 * region-3 backward equations of IAPWS SR3-03(2014) (T, v from (p, h) and
 * (p, s)) and SR5-05(2016) (v from (p, T)) as starting values.
 *
 * Regions (R7-97 Fig. 1):
 *   1  liquid:            273.15 K <= T <= 623.15 K, psat(T) <= p <= 100 MPa
 *   2  vapour:            273.15 K <= T <= 623.15 K, 0 < p <= psat(T);
 *                         623.15 K < T <= 863.15 K, 0 < p <= p_B23(T);
 *                         863.15 K < T <= 1073.15 K, 0 < p <= 100 MPa
 *   3  near critical:     623.15 K < T <= T_B23(p), p_B23(T) <= p <= 100 MPa
 *   4  saturation line:   273.15 K <= T <= 647.096 K (a two-phase mixture is
 *                         reported with region 4 and its quality x)
 *   5  high temperature:  1073.15 K < T <= 2273.15 K, 0 < p <= 50 MPa
 * Outside this range every call returns GC_ERR_RANGE with a message naming
 * the bound; nothing is extrapolated.
 *
 * Property routes: (T, P), (P, h), (P, s), (P, x), (T, x) and the saturated
 * liquid and vapour at P or T. (P, h) and (P, s) start from the backward
 * equations (regions 1, 2a/2b/2c; region 3 from SR3-03) and are refined by
 * iteration on the basic equations (Halley in T for regions 1, 2 and 5,
 * Newton in (rho, T) for region 3), so a state is consistent with the basic
 * equations to about 1e-11 relative, not to the backward equations' own
 * tolerances (10-25 mK). Region 3 at (T, P) solves p(rho, T) = P on the basic
 * equation by Newton iteration started from the SR5-05 v(p, T) of the
 * subregion (3a..3z) on the state's side of the saturation line (a bracket
 * search answers should that start not lead to a root of the expected
 * branch), so the density is that of the basic equation, not of SR5-05 (whose
 * own deviations are up to about 1e-5 relative, 2e-2 next to the critical
 * point); on the saturation
 * line above 623.15 K the liquid and vapour densities are the roots of
 * p(rho, Tsat) = P on the liquid and vapour branches of the region-3
 * equation, Tsat from the region-4 equation.
 *
 * Units: SI base units: T in K, P in Pa, v in m3/kg, rho in kg/m3, u and h in
 * J/kg, s, cp and cv in J/(kg K), w in m/s. Reference state of IF97: u = 0
 * and s = 0 for the saturated liquid at the triple point (273.16 K,
 * 611.657 Pa).
 *
 * Near the critical point: the saturated liquid and vapour above 623.15 K
 * are the roots of the region-3 equation at the region-4 pressure; within
 * about 10 Pa of the critical pressure the two IF97 equations no longer
 * agree closely enough for both roots to exist (seen: up to 9.3 Pa below
 * pc, T within 3.5e-5 K of Tc). Saturated states and mixtures are therefore
 * served up to GC_IF97_P_SAT_STATES_MAX_PA = pc - 50 Pa (Tsat = 647.0958 K);
 * above it GC_ERR_RANGE, also for a (P, h) or (P, s) that would need them.
 * Single-phase states at (T, P) are served up to the critical point.
 *
 * Two-phase states (0 < x < 1): v, rho, u, h, s are the mass-weighted mixture
 * values; cp, cv and w are not defined for a two-phase mixture by IF97 and
 * are set to 0 (test x, never use them as numbers there).
 *
 * Errors: GC_ERR_RANGE (outside IF97's range; field "/T", "/P", "/h", "/s"
 * or "/x"), GC_ERR_INVALID (a non-finite input, P <= 0, x outside [0, 1]),
 * GC_ERR_NOCONV (an iteration failed: reported, never silent). A gc_error
 * may be NULL. No call allocates; every call is thread-safe.
 */
#ifndef GASCYCLE_IF97_H
#define GASCYCLE_IF97_H

#include "gascycle/error.h"

/* Constants of IAPWS R7-97(2012), Eqs. 1-3 and Sec. 3. */
#define GC_IF97_R_J_PER_KGK 461.526      /* specific gas constant of water, J/(kg K) */
#define GC_IF97_TC_K 647.096             /* critical temperature, K */
#define GC_IF97_PC_PA 22.064e6           /* critical pressure, Pa */
#define GC_IF97_RHOC_KG_PER_M3 322.0     /* critical density, kg/m3 */
#define GC_IF97_T_MIN_K 273.15           /* lowest temperature of the range, K */
#define GC_IF97_T_MAX_K 2273.15          /* highest temperature (region 5), K */
#define GC_IF97_T_R2_MAX_K 1073.15       /* boundary between regions 2 and 5, K */
#define GC_IF97_T_R13_K 623.15           /* boundary between regions 1 and 3, K */
#define GC_IF97_P_MAX_PA 100.0e6         /* highest pressure up to 1073.15 K, Pa */
#define GC_IF97_P_R5_MAX_PA 50.0e6       /* highest pressure in region 5, Pa */
#define GC_IF97_P_SAT_MIN_PA 611.212677  /* psat(273.15 K) from Eq. 30, Pa */
#define GC_IF97_P_SAT_STATES_MAX_PA (22.064e6 - 50.0) /* highest P of a saturated state, Pa */

/* One state of water or steam. Every field is set by every successful call. */
typedef struct gc_if97_state {
    double T_K;              /* temperature, K */
    double P_Pa;             /* pressure, Pa */
    double v_m3_per_kg;      /* specific volume, m3/kg */
    double rho_kg_per_m3;    /* density 1/v, kg/m3 */
    double u_J_per_kg;       /* specific internal energy, J/kg */
    double h_J_per_kg;       /* specific enthalpy, J/kg */
    double s_J_per_kgK;      /* specific entropy, J/(kg K) */
    double cp_J_per_kgK;     /* isobaric heat capacity, J/(kg K); 0 when 0 < x < 1 */
    double cv_J_per_kgK;     /* isochoric heat capacity, J/(kg K); 0 when 0 < x < 1 */
    double w_m_per_s;        /* speed of sound, m/s; 0 when 0 < x < 1 */
    double x;                /* vapour mass fraction (quality) 0..1 on or inside the
                                saturation dome, -1 for a single-phase state */
    int region;              /* IF97 region 1, 2, 3 or 5 of a single phase; 4 for a
                                two-phase mixture (0 < x < 1) */
} gc_if97_state;

/* ---- validity -------------------------------------------------------- */

/* GC_OK when (T, P) lies in IF97's range (see above), else GC_ERR_RANGE or
 * GC_ERR_INVALID naming the bound (field "/T" or "/P"). */
int gc_if97_check_TP(double T_K, double P_Pa, gc_error *err);

/* The IF97 region (1, 2, 3 or 5) of a checked (T, P); on the saturation line
 * region 1 (or 3 above 623.15 K) is returned, as IF97 assigns it. */
int gc_if97_region_TP(double T_K, double P_Pa);

/* ---- states ---------------------------------------------------------- */

/* Single-phase state at (T, P). */
int gc_if97_state_TP(double T_K, double P_Pa, gc_if97_state *st, gc_error *err);

/* State at (P, h): single phase or a two-phase mixture (region 4). */
int gc_if97_state_Ph(double P_Pa, double h_J_per_kg, gc_if97_state *st, gc_error *err);

/* State at (P, s): single phase or a two-phase mixture (region 4). */
int gc_if97_state_Ps(double P_Pa, double s_J_per_kgK, gc_if97_state *st, gc_error *err);

/* Saturated mixture of quality x (0..1) at P, 611.212677 Pa <= P <=
 * GC_IF97_P_SAT_STATES_MAX_PA. x = 0 and x = 1 give the saturated liquid and
 * vapour (with cp, cv, w of that phase). */
int gc_if97_state_Px(double P_Pa, double x, gc_if97_state *st, gc_error *err);

/* Saturated mixture of quality x at T, 273.15 K <= T <= Tsat(pc - 50 Pa). */
int gc_if97_state_Tx(double T_K, double x, gc_if97_state *st, gc_error *err);

/* Saturated liquid and vapour at P (either pointer may be NULL). */
int gc_if97_sat_P(double P_Pa, gc_if97_state *liq, gc_if97_state *vap, gc_error *err);

/* Saturated liquid and vapour at T (either pointer may be NULL). */
int gc_if97_sat_T(double T_K, gc_if97_state *liq, gc_if97_state *vap, gc_error *err);

/* ---- saturation line (region 4) and boundaries ------------------------ */

/* Saturation pressure at T, Eq. 30; 273.15 K <= T <= 647.096 K. */
int gc_if97_Psat_T(double T_K, double *P_Pa, gc_error *err);

/* Saturation temperature at P, Eq. 31; 611.212677 Pa <= P <= 22.064 MPa. */
int gc_if97_Tsat_P(double P_Pa, double *T_K, gc_error *err);

/* Boundary between regions 2 and 3 (B23), Eqs. 5 and 6: pressure at T
 * (623.15..863.15 K) and temperature at P (16.529..100 MPa). Unchecked. */
double gc_if97_P_B23_T(double T_K);
double gc_if97_T_B23_P(double P_Pa);

/* ---- fast single properties (unchecked: (T, P) must pass gc_if97_check_TP) */

/* Specific enthalpy at (T, P), J/kg: the one derivative h needs, no state. */
double gc_if97_h_TP(double T_K, double P_Pa);

/* Temperature at (P, h), K: as gc_if97_state_Ph without the other
 * properties; checked, errors as there. In the two-phase region Tsat(P). */
int gc_if97_T_Ph(double P_Pa, double h_J_per_kg, double *T_K, gc_error *err);

#endif
