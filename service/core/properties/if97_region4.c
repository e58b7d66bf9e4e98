/*
 * if97_region4.c — IAPWS-IF97 region 4 (the saturation line) and the
 * boundary B23 between regions 2 and 3.
 *
 * Saturation: the saturation-pressure equation (IAPWS R7-97(2012) Eq. 30)
 * and the saturation-temperature equation (Eq. 31), both from the quadratic
 * Eq. 29 with the coefficients n_1..n_10 of Table 34; valid from 273.15 K to
 * the critical temperature 647.096 K (611.212677 Pa to 22.064 MPa).
 * B23: Eqs. 5 and 6 with n_1..n_5 of Table 1 (623.15..863.15 K,
 * 16.5292 MPa..100 MPa).
 * Units: T in K, p in Pa (the equations use p / 1 MPa and T / 1 K).
 */
#include "if97_private.h"

#include <math.h>

/* R7-97(2012) Table 34: n_1..n_10 of Eqs. 29-31. */
static const double N4[10] = {
    0.11670521452767e4,  -0.72421316703206e6, -0.17073846940092e2,
    0.12020824702470e5,  -0.32325550322333e7, 0.14915108613530e2,
    -0.48232657361591e4, 0.40511340542057e6,  -0.23855557567849e0,
    0.65017534844798e3,
};

/* Eq. 30: p_s(T); theta = T + n9 / (T - n10). */
double gc__if97_psat(double T_K)
{
    double th = T_K + N4[8] / (T_K - N4[9]);
    double A = th * th + N4[0] * th + N4[1];
    double B = N4[2] * th * th + N4[3] * th + N4[4];
    double C = N4[5] * th * th + N4[6] * th + N4[7];
    double r = 2.0 * C / (-B + sqrt(B * B - 4.0 * A * C));
    double r2 = r * r;
    return 1e6 * r2 * r2;
}

/* Eq. 31: T_s(p); beta = (p / 1 MPa)^(1/4). */
double gc__if97_Tsat(double P_Pa)
{
    double be = sqrt(sqrt(P_Pa / 1e6));
    double E = be * be + N4[2] * be + N4[5];
    double F = N4[0] * be * be + N4[3] * be + N4[6];
    double G = N4[1] * be * be + N4[4] * be + N4[7];
    double D = 2.0 * G / (-F - sqrt(F * F - 4.0 * E * G));
    double q = N4[9] + D;
    return 0.5 * (q - sqrt(q * q - 4.0 * (N4[8] + N4[9] * D)));
}

int gc_if97_Psat_T(double T_K, double *P_Pa, gc_error *err)
{
    if (!isfinite(T_K))
        return gc_error_set(err, GC_ERR_INVALID, "/T", "T must be a finite number");
    if (T_K < GC_IF97_T_MIN_K || T_K > GC_IF97_TC_K)
        return gc_error_set(err, GC_ERR_RANGE, "/T",
                            "T = %.6g K is outside the IAPWS-IF97 saturation line "
                            "273.15 K to 647.096 K (critical temperature)", T_K);
    *P_Pa = gc__if97_psat(T_K);
    return GC_OK;
}

int gc_if97_Tsat_P(double P_Pa, double *T_K, gc_error *err)
{
    if (!isfinite(P_Pa))
        return gc_error_set(err, GC_ERR_INVALID, "/P", "P must be a finite number");
    if (P_Pa < GC_IF97_P_SAT_MIN_PA || P_Pa > GC_IF97_PC_PA)
        return gc_error_set(err, GC_ERR_RANGE, "/P",
                            "P = %.6g Pa is outside the IAPWS-IF97 saturation line "
                            "611.212677 Pa to 22.064 MPa (critical pressure)", P_Pa);
    *T_K = gc__if97_Tsat(P_Pa);
    return GC_OK;
}

/* R7-97(2012) Table 1: n_1..n_5 of the B23 equations 5 and 6. */
static const double B23[5] = {
    0.34805185628969e3, -0.11671859879975e1, 0.10192970039326e-2,
    0.57254459862746e3, 0.13918839778870e2,
};

/* Eq. 5: pi = n1 + n2 theta + n3 theta^2. */
double gc_if97_P_B23_T(double T_K)
{
    return 1e6 * (B23[0] + B23[1] * T_K + B23[2] * T_K * T_K);
}

/* Eq. 6: theta = n4 + ((pi - n5) / n3)^(1/2). */
double gc_if97_T_B23_P(double P_Pa)
{
    return B23[3] + sqrt((P_Pa / 1e6 - B23[4]) / B23[2]);
}
