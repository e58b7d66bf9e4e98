/*
 * combustion.h — fuels and complete combustion with air (or any oxidiser
 * stream that is a species mixture, e.g. humid air or the products of an
 * earlier burner).
 *
 * Model: complete combustion, no dissociation: every C atom ends as CO2,
 * every H atom as H2O (vapour), N as N2, Ar/He/Ne unchanged, the remaining
 * oxygen as O2. Lean and stoichiometric mixtures only: a mixture with too
 * little oxygen is GC_ERR_RICH (until an equilibrium model is added). The
 * balances are done on elements, so the oxidiser may itself contain CO2, H2O
 * or unburnt fuel species.
 *
 * Enthalpies are absolute (including formation, as in gas.h), so an energy
 * balance needs no heating value; LHV and HHV are reported at 298.15 K from
 * the same formation enthalpies:
 *   LHV = [h_fuel(298.15) - sum over products (water as vapour) of h(298.15)] / M_fuel
 *   HHV = LHV + (H/2) dh_vap(H2O, 298.15 K) / M_fuel, with
 *   dh_vap = ΔfH°(H2O, g) - ΔfH°(H2O, l) = -241.826 - (-285.830) = 44.004 kJ/mol
 *   (H2O(g) from the NASA-9 record; H2O(l) = -285.830 kJ/mol is the CODATA key
 *   value, Cox, Wagman & Medvedev 1989, also in NIST-JANAF table H-063; from
 *   memory).
 * Burner efficiency eta_b (0 < eta_b <= 1) is the fraction of m_fuel LHV that
 * reaches the products: h_in m_in + h_fuel m_fuel - (1 - eta_b) m_fuel LHV =
 * (m_in + m_fuel) h_products(T_out).
 *
 * Fuels:
 *   named      "methane", "ethane", "propane", "n-butane", "hydrogen",
 *              "carbon monoxide" (or the species names CH4, C2H6, C3H8,
 *              n-C4H10, H2, CO). There is no default "natural gas": give an
 *              analysis.
 *   mixture    any species of species.h by mole fraction (a natural-gas
 *              analysis with N2 and CO2, hydrogen blends).
 *   liquid     formula CxHyOzNw and LHV (J/kg); the liquid's enthalpy of
 *              formation at 298.15 K is derived from the LHV, and its sensible
 *              enthalpy from a constant liquid cp (default 2000 J/(kg K), a
 *              typical value for liquid hydrocarbon fuels: common practice).
 *              Inlet range 250..500 K.
 * Gas-fuel inlet temperatures must lie inside the fuel species' data range;
 * exactly 298.15 K is always accepted (the enthalpy there is the formation
 * enthalpy itself).
 *
 * Units: SI (K, J/kg, kg/kg, kg/mol). A gc_fuel is a plain value (no heap).
 */
#ifndef GASCYCLE_COMBUSTION_H
#define GASCYCLE_COMBUSTION_H

#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#define GC_DH_VAP_H2O_298_J_PER_MOL 44004.0 /* J/mol, -241.826 - (-285.830) kJ/mol */
#define GC_FUEL_LIQUID_CP_DEFAULT 2000.0    /* J/(kg K), assumed liquid fuel cp */
#define GC_FUEL_LIQUID_T_MIN_K 250.0
#define GC_FUEL_LIQUID_T_MAX_K 500.0

typedef enum gc_fuel_kind {
    GC_FUEL_GAS = 0,     /* species mixture (named fuel or analysis) */
    GC_FUEL_LIQUID = 1   /* CxHyOzNw with a given LHV */
} gc_fuel_kind;

typedef struct gc_fuel {
    gc_fuel_kind kind;
    char label[GC_GAS_LABEL_LEN];   /* "methane", "fuel mixture", "liquid C12H23" ... */
    double atoms[GC_EL_COUNT];      /* atoms per mole of fuel (mean over the mixture), mol/mol */
    double M_kg_per_mol;            /* molar mass, kg/mol */
    double o2_demand;               /* mol O2 per mol fuel for complete combustion, mol/mol */
    double h298_J_per_kg;           /* absolute enthalpy at 298.15 K, J/kg */
    double LHV_J_per_kg;            /* lower heating value at 298.15 K, J/kg */
    double HHV_J_per_kg;            /* higher heating value at 298.15 K, J/kg */
    double T_min_K, T_max_K;        /* accepted fuel inlet temperatures, K */
    double cp_liquid_J_per_kgK;     /* liquid fuel only: constant cp, J/(kg K) */
    gc_gas gas;                     /* gas fuel only: the fuel as a gas mixture */
} gc_fuel;

/* Result of adding fuel to a stream. */
typedef struct gc_burn {
    gc_gas products;            /* composition of the stream leaving the burner */
    double far;                 /* fuel-air ratio, kg fuel per kg of entering stream */
    double phi;                 /* equivalence ratio far / far_stoich, - */
    double m_fuel_kg;           /* fuel added, kg (per m_in_kg of entering stream) */
    double m_out_kg;            /* m_in + m_fuel, kg */
    double T_out_K;             /* exit temperature, K */
    double h_out_J_per_kg;      /* absolute enthalpy of the products at T_out, J/kg */
    double heat_released_J;     /* eta_b m_fuel LHV, J */
} gc_burn;

/* ---- fuels ------------------------------------------------------------ */

/* A named single-species fuel (list above); GC_ERR_UNKNOWN otherwise. */
int gc_fuel_init_named(gc_fuel *f, const char *name, gc_error *err);

/* A gas fuel by mole fractions (>= 0, sum 1 within 1e-6). GC_ERR_INVALID
 * when the mixture needs no oxygen (nothing to burn). */
int gc_fuel_init_mixture(gc_fuel *f, int n, const int *species_ids,
                         const double *mole_fractions, gc_error *err);

/* A liquid fuel CxHyOzNw (atoms per molecule, non-integer allowed, c + h > 0)
 * with lower heating value LHV (1e6..1.5e8 J/kg) and liquid cp (J/(kg K),
 * 500..5000; 0 selects GC_FUEL_LIQUID_CP_DEFAULT). */
int gc_fuel_init_liquid(gc_fuel *f, double c, double h, double o, double n,
                        double LHV_J_per_kg, double cp_liquid_J_per_kgK, gc_error *err);

/* Absolute enthalpy of the fuel at its inlet temperature, J/kg (checked). */
int gc_fuel_h_T(const gc_fuel *f, double T_K, double *h_J_per_kg, gc_error *err);

/* LHV and HHV at 298.15 K, J/kg (either pointer may be NULL). */
void gc_fuel_heating_values(const gc_fuel *f, double *LHV_J_per_kg, double *HHV_J_per_kg);

/* CO2 and H2O (kg) formed by complete combustion of 1 kg of fuel (either
 * pointer may be NULL). */
void gc_fuel_emissions(const gc_fuel *f, double *co2_kg_per_kg, double *h2o_kg_per_kg);

/* ---- fuel and oxidiser -------------------------------------------------- */

/* Stoichiometric fuel-air ratio (kg fuel per kg of the oxidiser stream air,
 * a species mixture). GC_ERR_INVALID when air holds no free oxygen. */
int gc_combustion_far_stoich(const gc_fuel *f, const gc_gas *air, double *far, gc_error *err);

/* Equivalence ratio far / far_stoich. */
int gc_combustion_phi(const gc_fuel *f, const gc_gas *air, double far, double *phi,
                      gc_error *err);

/* Complete-combustion products of fuel with air at fuel-air ratio far
 * (0 <= far <= far_stoich, else GC_ERR_RICH). */
int gc_combustion_products(const gc_fuel *f, const gc_gas *air, double far,
                           gc_gas *products, gc_error *err);

/* Adds fuel at T_fuel to m_in kg of stream `in` at T_in until the products
 * reach T_out (burner exit temperature), with burner efficiency eta_b.
 * GC_ERR_RICH when T_out needs more fuel than stoichiometric, GC_ERR_INFEASIBLE
 * when T_out is not above what the stream reaches without fuel. */
int gc_combustion_burn_to_T(const gc_fuel *f, double T_fuel_K, const gc_gas *in,
                            double T_in_K, double m_in_kg, double T_out_K, double eta_b,
                            gc_burn *out, gc_error *err);

/* Adds fuel at a given fuel-air ratio far; the exit temperature follows. */
int gc_combustion_burn_far(const gc_fuel *f, double T_fuel_K, const gc_gas *in,
                           double T_in_K, double m_in_kg, double far, double eta_b,
                           gc_burn *out, gc_error *err);

/* Fuel-air ratio that reaches T_out (shorthand of gc_combustion_burn_to_T). */
int gc_combustion_far_for_T(const gc_fuel *f, double T_fuel_K, const gc_gas *air,
                            double T_air_K, double T_out_K, double eta_b, double *far,
                            gc_error *err);

/* Adiabatic flame temperature of complete combustion (no dissociation) at
 * fuel-air ratio far, fuel and air at their inlet temperatures. */
int gc_combustion_T_adiabatic(const gc_fuel *f, double T_fuel_K, const gc_gas *air,
                              double T_air_K, double far, double *T_K, gc_error *err);

#endif
