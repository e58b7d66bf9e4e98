/*
 * humid.h — psychrometrics of moist air: saturation pressure of water vapour,
 * humidity ratio, relative humidity, dew (frost) point.
 *
 * Model: ASHRAE Handbook—Fundamentals (2017), ch. 1 (SI): the Hyland & Wexler
 * saturation pressure over ice (eq. 5, -100..0 °C) and over liquid water
 * (eq. 6, 0..200 °C); humidity ratio W = 0.621945 p_w / (P - p_w) (eq. 20;
 * 0.621945 is the ratio of the molar masses of water and dry air); relative
 * humidity RH = p_w / p_ws(T) (eqs. 12 and 22). Moist air is treated as an
 * ideal-gas mixture and the enhancement factor is neglected, as in those
 * equations. The ice/water switch is at the triple point, 273.16 K, where the
 * two equations agree (ASHRAE quotes 0 °C; the two choices differ by less
 * than 0.01 % between 0 and 0.01 °C).
 *
 * Units: T in K, pressures in Pa, W in kg water per kg dry air, RH as a
 * fraction 0..1. Validity: 173.15 K <= T <= 473.15 K (-100..200 °C); outside,
 * GC_ERR_RANGE.
 */
#ifndef GASCYCLE_HUMID_H
#define GASCYCLE_HUMID_H

#include "gascycle/error.h"

#define GC_HUMID_T_MIN_K 173.15        /* -100 °C, lower end of ASHRAE eq. 5 */
#define GC_HUMID_T_MAX_K 473.15        /* 200 °C, upper end of ASHRAE eq. 6 */
#define GC_HUMID_T_TRIPLE_K 273.16     /* triple point of water: ice below, liquid above */
#define GC_HUMID_EPS 0.621945          /* M_water / M_dry_air, ASHRAE ch. 1 eq. 20 */

/* GC_OK when T is finite and inside GC_HUMID_T_MIN_K..GC_HUMID_T_MAX_K, else
 * GC_ERR_RANGE with field copied into err->field. */
int gc_humid_check_T(double T_K, const char *field, gc_error *err);

/* Saturation pressure of water vapour p_ws (Pa) at T (over ice below the
 * triple point, over liquid water above). Field "/temperature". */
int gc_humid_pws_T(double T_K, double *pws_Pa, gc_error *err);

/* Humidity ratio from the partial pressure of water vapour (eq. 20).
 * Needs 0 <= pv < P, P > 0. */
int gc_humid_W_from_pv(double pv_Pa, double P_Pa, double *W, gc_error *err);

/* Partial pressure of water vapour from the humidity ratio (eq. 20 solved for
 * p_w). Needs a finite W >= 0 (kg/kg), P > 0. */
int gc_humid_pv_from_W(double W, double P_Pa, double *pv_Pa, gc_error *err);

/* Humidity ratio of moist air at T, P and relative humidity RH (0..1).
 * GC_ERR_INFEASIBLE when RH p_ws(T) >= P (the vapour alone would exceed the
 * total pressure: water boils at this T and P). */
int gc_humid_W_from_RH(double T_K, double P_Pa, double RH, double *W, gc_error *err);

/* Relative humidity (0..1) of moist air at T, P and humidity ratio W.
 * GC_ERR_INFEASIBLE when the result exceeds 1 (supersaturated: more water
 * than the air holds as vapour at T and P). */
int gc_humid_RH_from_W(double T_K, double P_Pa, double W, double *RH, gc_error *err);

/* Dew-point temperature (frost point below the triple point), K: the T with
 * p_ws(T) = pv. Needs p_ws(173.15 K) <= pv <= p_ws(473.15 K), else
 * GC_ERR_RANGE. Solved by Newton on ln p_ws, safeguarded by bisection, to
 * 1e-9 K; GC_ERR_NOCONV is reported, never silent. */
int gc_humid_T_dew_from_pv(double pv_Pa, double *T_dew_K, gc_error *err);

/* Mole fraction of water vapour in moist air of humidity ratio W (>= 0):
 * x_w = W / (GC_HUMID_EPS + W) = p_w / P. Unchecked. */
double gc_humid_x_from_W(double W);

#endif
