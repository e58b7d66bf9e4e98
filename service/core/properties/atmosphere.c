/*
 * atmosphere.c — U.S. Standard Atmosphere 1976 below 86 km (see
 * gascycle/atmosphere.h for the model, units and range).
 *
 * References are to the published standard (NOAA, NASA, USAF, "U.S. Standard
 * Atmosphere, 1976", NOAA-S/T 76-1562): the defining constants, Table 4
 * (layer data), eq. 18 (geopotential altitude), eq. 23 (molecular-scale
 * temperature), eqs. 33a/33b (pressure), eq. 42 (density). The base
 * pressures of the layers are not typed in: they are computed once from the
 * sea-level pressure by the same equations 33a/33b, which is how the standard
 * defines them. The layer values, constants and equation numbers are written
 * here as recalled (from memory); the values are checked in tests/unit/test_atmosphere.c against python3-fluids.
 */
#include "gascycle/atmosphere.h"

#include <math.h>
#include <stddef.h>

/* Defining constants of the standard. */
#define ATM_G0 9.80665           /* g0', m2/(s2 m') */
#define ATM_RSTAR 8.31432e3      /* R*, J/(kmol K): the standard's own value, not CODATA */
#define ATM_M0 28.9644           /* sea-level mean molar mass, kg/kmol */
#define ATM_R0 6356766.0         /* effective Earth radius for eq. 18, m */
#define ATM_P0 101325.0          /* sea-level pressure, Pa */
#define ATM_T0 288.15            /* sea-level temperature, K */

#define ATM_N_LAYERS 7

/* Table 4: geopotential base altitude H_b (m') and molecular-scale
 * temperature gradient L_M,b (K/m'), b = 0..6. */
static const double atm_H_b[ATM_N_LAYERS + 1] = {
    0.0, 11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0,
    84852.0  /* H at Z = 86 km, upper end of layer 6 */
};
static const double atm_L_b[ATM_N_LAYERS] = {
    -0.0065, 0.0, 0.0010, 0.0028, 0.0, -0.0028, -0.0020
};

/* g0' M0 / R*, K/m': the exponent scale of eqs. 33a/33b. */
static double atm_gmr(void)
{
    return ATM_G0 * ATM_M0 / ATM_RSTAR;
}

/* Temperature (eq. 23) and pressure (eq. 33a for L != 0, eq. 33b for L = 0)
 * at a height dH above the base of a layer with base values Tb, Pb. */
static void atm_in_layer(double Tb, double Pb, double L, double dH, double *T, double *P)
{
    double t = Tb + L * dH;
    *T = t;
    if (L == 0.0)
        *P = Pb * exp(-atm_gmr() * dH / Tb);
    else
        *P = Pb * pow(Tb / t, atm_gmr() / L);
}

double gc_atm_geopotential_m(double z_m)
{
    return ATM_R0 * z_m / (ATM_R0 + z_m);   /* eq. 18 */
}

int gc_atm_1976_rho(double z_m, double *T_K, double *P_Pa, double *rho_kg_per_m3,
                    gc_error *err)
{
    if (!isfinite(z_m) || z_m < GC_ATM_Z_MIN_M || z_m > GC_ATM_Z_MAX_M)
        return gc_error_set(err, GC_ERR_RANGE, "/altitude",
                            "altitude must be between %.0f and %.0f m (U.S. Standard "
                            "Atmosphere 1976)", GC_ATM_Z_MIN_M, GC_ATM_Z_MAX_M);
    double H = gc_atm_geopotential_m(z_m);
    /* Walk up the layers, carrying the base temperature and pressure; the
     * chain costs at most seven evaluations and keeps the base values
     * consistent with eqs. 33a/33b to the last bit. */
    double Tb = ATM_T0, Pb = ATM_P0, T = ATM_T0, P = ATM_P0;
    for (int b = 0; b < ATM_N_LAYERS; b++) {
        int last = (b == ATM_N_LAYERS - 1);
        if (H <= atm_H_b[b + 1] || last) {
            atm_in_layer(Tb, Pb, atm_L_b[b], H - atm_H_b[b], &T, &P);
            break;
        }
        atm_in_layer(Tb, Pb, atm_L_b[b], atm_H_b[b + 1] - atm_H_b[b], &Tb, &Pb);
    }
    if (T_K)
        *T_K = T;
    if (P_Pa)
        *P_Pa = P;
    if (rho_kg_per_m3)
        *rho_kg_per_m3 = P * ATM_M0 / (ATM_RSTAR * T);   /* eq. 42 */
    return GC_OK;
}

int gc_atm_1976(double z_m, double *T_K, double *P_Pa, gc_error *err)
{
    return gc_atm_1976_rho(z_m, T_K, P_Pa, NULL, err);
}
