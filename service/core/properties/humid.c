/*
 * humid.c — psychrometric formulas of ASHRAE Handbook—Fundamentals (2017),
 * ch. 1 (see gascycle/humid.h for model, units and range). Coefficients of
 * eqs. 5 and 6 (Hyland & Wexler 1983) in published order, SI form
 * (ln p_ws with p_ws in Pa and T in K).
 */
#include "gascycle/humid.h"

#include <math.h>
#include <stddef.h>

/* ASHRAE 2017 ch. 1 eq. 5, over ice, -100..0 °C:
 * ln p_ws = C1/T + C2 + C3 T + C4 T^2 + C5 T^3 + C6 T^4 + C7 ln T */
static const double hw_ice[7] = {
    -5.6745359e+03, 6.3925247e+00, -9.6778430e-03, 6.2215701e-07,
    2.0747825e-09, -9.4840240e-13, 4.1635019e+00
};

/* ASHRAE 2017 ch. 1 eq. 6, over liquid water, 0..200 °C:
 * ln p_ws = C8/T + C9 + C10 T + C11 T^2 + C12 T^3 + C13 ln T */
static const double hw_water[6] = {
    -5.8002206e+03, 1.3914993e+00, -4.8640239e-02, 4.1764768e-05,
    -1.4452093e-08, 6.5459673e+00
};

/* ln p_ws(T) and its derivative d ln p_ws / dT (1/K); T unchecked. */
static double hw_ln_pws(double T, double *dlnp_dT)
{
    if (T <= GC_HUMID_T_TRIPLE_K) {
        const double *c = hw_ice;
        if (dlnp_dT)
            *dlnp_dT = -c[0] / (T * T) + c[2] + T * (2.0 * c[3] + T * (3.0 * c[4] + T * 4.0 * c[5]))
                       + c[6] / T;
        return c[0] / T + c[1] + T * (c[2] + T * (c[3] + T * (c[4] + T * c[5]))) + c[6] * log(T);
    }
    const double *c = hw_water;
    if (dlnp_dT)
        *dlnp_dT = -c[0] / (T * T) + c[2] + T * (2.0 * c[3] + T * 3.0 * c[4]) + c[5] / T;
    return c[0] / T + c[1] + T * (c[2] + T * (c[3] + T * c[4])) + c[5] * log(T);
}

static int check_P(double P_Pa, const char *field, gc_error *err)
{
    if (!isfinite(P_Pa) || !(P_Pa > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, field, "pressure must be a positive number of Pa");
    return GC_OK;
}

int gc_humid_check_T(double T_K, const char *field, gc_error *err)
{
    if (!isfinite(T_K) || T_K < GC_HUMID_T_MIN_K || T_K > GC_HUMID_T_MAX_K)
        return gc_error_set(err, GC_ERR_RANGE, field,
                            "temperature must be between %.2f and %.2f K (-100 to 200 degC) for the "
                            "ASHRAE saturation-pressure formulas", GC_HUMID_T_MIN_K, GC_HUMID_T_MAX_K);
    return GC_OK;
}

int gc_humid_pws_T(double T_K, double *pws_Pa, gc_error *err)
{
    int rc = gc_humid_check_T(T_K, "/temperature", err);
    if (rc != GC_OK)
        return rc;
    *pws_Pa = exp(hw_ln_pws(T_K, NULL));
    return GC_OK;
}

int gc_humid_W_from_pv(double pv_Pa, double P_Pa, double *W, gc_error *err)
{
    int rc = check_P(P_Pa, "/pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(pv_Pa) || pv_Pa < 0.0)
        return gc_error_set(err, GC_ERR_INVALID, "/vapour_pressure",
                            "partial pressure of water vapour must be zero or positive");
    if (pv_Pa >= P_Pa)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/vapour_pressure",
                            "partial pressure of water vapour (%.6g Pa) must be below the total "
                            "pressure (%.6g Pa)", pv_Pa, P_Pa);
    *W = GC_HUMID_EPS * pv_Pa / (P_Pa - pv_Pa);   /* eq. 20 */
    return GC_OK;
}

int gc_humid_pv_from_W(double W, double P_Pa, double *pv_Pa, gc_error *err)
{
    int rc = check_P(P_Pa, "/pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(W) || W < 0.0)
        return gc_error_set(err, GC_ERR_INVALID, "/humidity_ratio",
                            "humidity ratio must be a number of kg/kg, zero or positive");
    *pv_Pa = P_Pa * W / (GC_HUMID_EPS + W);       /* eq. 20 solved for p_w */
    return GC_OK;
}

int gc_humid_W_from_RH(double T_K, double P_Pa, double RH, double *W, gc_error *err)
{
    double pws;
    int rc = check_P(P_Pa, "/pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(RH) || RH < 0.0 || RH > 1.0)
        return gc_error_set(err, GC_ERR_INVALID, "/relative_humidity",
                            "relative humidity must be between 0 and 1");
    rc = gc_humid_pws_T(T_K, &pws, err);
    if (rc != GC_OK)
        return rc;
    double pv = RH * pws;                         /* eqs. 12, 22 */
    if (pv >= P_Pa)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/relative_humidity",
                            "at %.2f K the water vapour pressure for this relative humidity "
                            "(%.6g Pa) reaches the total pressure (%.6g Pa)", T_K, pv, P_Pa);
    *W = GC_HUMID_EPS * pv / (P_Pa - pv);         /* eq. 20 */
    return GC_OK;
}

int gc_humid_RH_from_W(double T_K, double P_Pa, double W, double *RH, gc_error *err)
{
    double pws, pv;
    int rc = gc_humid_pv_from_W(W, P_Pa, &pv, err);
    if (rc != GC_OK)
        return rc;
    rc = gc_humid_pws_T(T_K, &pws, err);
    if (rc != GC_OK)
        return rc;
    double phi = pv / pws;
    /* a relative rounding allowance, so that W_from_RH(RH = 1) round-trips */
    if (phi > 1.0 + 1e-12)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/humidity_ratio",
                            "humidity ratio %.6g kg/kg exceeds saturation at %.2f K and %.6g Pa "
                            "(relative humidity would be %.4g)", W, T_K, P_Pa, phi);
    *RH = phi > 1.0 ? 1.0 : phi;
    return GC_OK;
}

double gc_humid_x_from_W(double W)
{
    return W / (GC_HUMID_EPS + W);
}

int gc_humid_T_dew_from_pv(double pv_Pa, double *T_dew_K, gc_error *err)
{
    if (!isfinite(pv_Pa) || !(pv_Pa > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/vapour_pressure",
                            "partial pressure of water vapour must be positive for a dew point");
    double lo = GC_HUMID_T_MIN_K, hi = GC_HUMID_T_MAX_K;
    double target = log(pv_Pa);
    double f_lo = hw_ln_pws(lo, NULL) - target, f_hi = hw_ln_pws(hi, NULL) - target;
    if (f_lo > 0.0 || f_hi < 0.0)
        return gc_error_set(err, GC_ERR_RANGE, "/vapour_pressure",
                            "vapour pressure %.6g Pa has no dew point between -100 and 200 degC",
                            pv_Pa);
    if (f_lo == 0.0) {
        *T_dew_K = lo;
        return GC_OK;
    }
    if (f_hi == 0.0) {
        *T_dew_K = hi;
        return GC_OK;
    }
    /* ln p_ws is smooth and increasing; Newton from the middle of the
     * bracket, falling back to bisection whenever a step leaves it. */
    double T = 0.5 * (lo + hi);
    for (int it = 0; it < 200; it++) {
        double d;
        double f = hw_ln_pws(T, &d) - target;
        if (f == 0.0) {
            *T_dew_K = T;
            return GC_OK;
        }
        if (f < 0.0)
            lo = T;
        else
            hi = T;
        double Tn = (d > 0.0) ? T - f / d : 0.5 * (lo + hi);
        if (!(Tn > lo && Tn < hi))
            Tn = 0.5 * (lo + hi);
        if (fabs(Tn - T) <= 1e-9 || hi - lo <= 1e-9) {
            *T_dew_K = Tn;
            return GC_OK;
        }
        T = Tn;
    }
    return gc_error_set(err, GC_ERR_NOCONV, "/vapour_pressure",
                        "dew-point solve did not converge for %.6g Pa", pv_Pa);
}
