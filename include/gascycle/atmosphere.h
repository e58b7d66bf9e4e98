/*
 * atmosphere.h — the U.S. Standard Atmosphere 1976 (NOAA, NASA and USAF,
 * U.S. Government Printing Office, Washington D.C., 1976; NOAA-S/T 76-1562)
 * from -5 km to 86 km geometric altitude: temperature, pressure and density.
 *
 * Model: the seven layers of Table 4 of the standard (geopotential base
 * altitudes, molecular-scale base temperatures and linear lapse rates),
 * hydrostatic equilibrium of a perfect gas with the standard's own constants
 * (R* = 8.31432 J/(mol K), M0 = 28.9644 kg/kmol, g0 = 9.80665 m/s2,
 * r0 = 6356766 m; the standard's defining constants). The temperature returned is the
 * molecular-scale temperature T_M: it equals the kinetic temperature below
 * 80 km; between 80 and 86 km the kinetic temperature is T_M M/M0 with the
 * M/M0 ratio of the standard's Table 8 (a difference below 0.05 %), not
 * applied here. Density is exact over the whole range (eq. 42 uses T_M).
 *
 * Units: altitude in m (geometric, above mean sea level), T in K, P in Pa,
 * density in kg/m3.
 */
#ifndef GASCYCLE_ATMOSPHERE_H
#define GASCYCLE_ATMOSPHERE_H

#include "gascycle/error.h"

#define GC_ATM_Z_MIN_M (-5000.0)   /* lowest geometric altitude of the standard, m */
#define GC_ATM_Z_MAX_M 86000.0     /* top of the lower (homosphere) part, m */

/* Temperature (molecular-scale, K) and pressure (Pa) at geometric altitude
 * z_m. Either out-pointer may be NULL. GC_ERR_RANGE (field "/altitude")
 * outside GC_ATM_Z_MIN_M..GC_ATM_Z_MAX_M or when z_m is not finite. */
int gc_atm_1976(double z_m, double *T_K, double *P_Pa, gc_error *err);

/* As gc_atm_1976, plus density rho (kg/m3, eq. 42). Any out-pointer may be
 * NULL. */
int gc_atm_1976_rho(double z_m, double *T_K, double *P_Pa, double *rho_kg_per_m3,
                    gc_error *err);

/* Geopotential altitude H (m') of a geometric altitude z (m), eq. 18:
 * H = r0 z / (r0 + z). Unchecked; defined for z > -r0. */
double gc_atm_geopotential_m(double z_m);

#endif
