/*
 * exergy.h — exergy of gas streams and fuels relative to a reference
 * environment, for the second law of fuel-fired cycles (cycle.h).
 *
 * Reference environment: the standard chemical exergies of the reference
 * species of J. Szargut, D. R. Morris, F. R. Steward, "Exergy Analysis of
 * Thermal, Chemical, and Metallurgical Processes", Hemisphere, 1988 (table of
 * standard chemical exergies, T_n = 298.15 K, p_n = 101.325 kPa): N2 0.72,
 * O2 3.97, H2O(g) 9.50, Ar 11.69, CO2 19.87, He 30.37, Ne 27.19 kJ/mol (from
 * memory). Each defines its species' mole fraction in the reference
 * atmosphere, x_i = exp(-ex_i / (R T_n)) (gaseous reference species:
 * ex_i = -R T_n ln x_i). At a dead state (T0, P0) the environment keeps
 * those mole fractions at total pressure P0, so a reference species' chemical
 * potential there is
 *   mu_i = h_i(T0) - T0 [s°_i(T0) - R ln(x_i P0 / 1 bar)]      (NASA-9 h, s°)
 * and each element gets one potential from its reference species
 * (O from O2, N from N2, C from CO2, H from H2O, Ar, He, Ne from themselves):
 *   lambda_O = mu_O2 / 2, lambda_N = mu_N2 / 2, lambda_C = mu_CO2 - 2 lambda_O,
 *   lambda_H = (mu_H2O - lambda_O) / 2, lambda_Ar = mu_Ar, ...
 * The total flow exergy (physical + chemical, kinetic energy excluded) of
 * 1 kg of a species mixture at (T, P) is then
 *   b = h(T) - T0 s(T, P) - sum_e n_e lambda_e
 * (n_e: moles of element e per kg; h absolute with formation enthalpy, s with
 * mixing, as gas.h). Its chemical part is b at (T0, P0), its physical part
 * b(T, P) - b(T0, P0). Because every stream uses the same property data and
 * the same potentials, the exergy balance of any process closes exactly with
 * T0 S_gen (Gouy-Stodola), including reactions. At T0 = 298.15 K and
 * P0 = 101.325 kPa a species' chemical exergy is its standard chemical
 * exergy in Szargut's environment; elsewhere it is the chemical exergy in that
 * environment at the site's temperature and pressure. Water in a stream is
 * taken as vapour throughout (no condensation at T0).
 *
 * Fuels: a gas fuel is a species mixture (as above). A liquid fuel CxHyOzNw
 * (combustion.h) has no tabulated entropy here: its standard chemical exergy
 * comes from the correlation of Szargut and Styrylska (1964) for liquid
 * technical fuels, ex = phi LHV with
 *   phi = 1.0401 + 0.1728 h/c + 0.0432 o/c      (mass ratios; from memory,
 *         as given by Szargut, Morris & Steward 1988 and Kotas 1985),
 * and its entropy at 298.15 K is the one that gives that exergy in the
 * standard environment: s_298 = (h_298 - sum n_e lambda_e,std - ex) / T_n;
 * s(T) = s_298 + cp_liquid ln(T / 298.15 K), independent of pressure.
 *
 * Validity: T0 inside the data of the reference species (200 K to 6000 K;
 * He and Ne, whose data start at 300 K, are monatomic with cp = 5R/2 and are
 * extended below 300 K with that constant cp). Units: SI (K, Pa, J/kg,
 * J/mol, J/(kg K)).
 */
#ifndef GASCYCLE_EXERGY_H
#define GASCYCLE_EXERGY_H

#include "gascycle/combustion.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#define GC_EXERGY_T_STD_K 298.15       /* T_n of the standard chemical exergies, K */
#define GC_EXERGY_P_STD_PA 101325.0    /* p_n of the standard chemical exergies, Pa */

typedef struct gc_exergy_env {
    double T0_K;                          /* dead-state temperature, K */
    double P0_Pa;                         /* dead-state pressure, Pa */
    double lambda_J_per_mol[GC_EL_COUNT]; /* chemical potential of each element, J/mol */
} gc_exergy_env;

/* Szargut's reference environment at (T0, P0). GC_ERR_RANGE when T0 lies
 * outside the reference species' data, GC_ERR_INVALID for P0 <= 0. */
int gc_exergy_env_init(gc_exergy_env *env, double T0_K, double P0_Pa, gc_error *err);

/* Standard chemical exergy of a reference species (N2, O2, H2O, Ar, CO2, He,
 * Ne), J/mol; 0 for any other species id. */
double gc_exergy_reference_molar(int species_id);

/* Total flow exergy b (J/kg, physical + chemical) of a species mixture at
 * (T, P). GC_ERR_INVALID for a gas without a composition (cold model),
 * GC_ERR_RANGE for T outside the gas data. */
int gc_exergy_gas(const gc_exergy_env *env, const gc_gas *g, double T_K, double P_Pa,
                  double *b_J_per_kg, gc_error *err);

/* Entropy of a fuel as supplied at (T, P), J/(kg K) (gas: the mixture at P,
 * with mixing; liquid: see above). The fuel temperature must be accepted by
 * gc_fuel_h_T. */
int gc_exergy_fuel_s(const gc_fuel *f, double T_K, double P_Pa, double *s_J_per_kgK,
                     gc_error *err);

/* Total exergy of 1 kg of fuel as supplied at (T, P), J/kg. */
int gc_exergy_fuel(const gc_exergy_env *env, const gc_fuel *f, double T_K, double P_Pa,
                   double *b_J_per_kg, gc_error *err);

/* Standard chemical exergy of the fuel (298.15 K, 101.325 kPa, Szargut's
 * environment), J/kg. */
double gc_exergy_fuel_standard(const gc_fuel *f);

#endif
