/*
 * species.h — ideal-gas species data: the NASA Glenn 9-coefficient
 * polynomials (B. J. McBride, M. J. Zehe, S. Gordon, NASA/TP-2002-211556,
 * 2002; data set = CEA thermo.inp, copied into data/nasa9/ with its source
 * named there), with molar masses, enthalpies of formation at 298.15 K and
 * elemental compositions from the same records.
 *
 * Forms (T in K, coefficients dimensionless, per species and interval):
 *   cp/R  = a1 T^-2 + a2 T^-1 + a3 + a4 T + a5 T^2 + a6 T^3 + a7 T^4
 *   H/(RT) = -a1 T^-2 + a2 ln(T)/T + a3 + a4 T/2 + a5 T^2/3 + a6 T^3/4 + a7 T^4/5 + b1/T
 *   S°/R  = -a1 T^-2/2 - a2 T^-1 + a3 ln T + a4 T + a5 T^2/2 + a6 T^3/3 + a7 T^4/4 + b2
 * H is the assigned (absolute) enthalpy: H(298.15 K) = ΔfH°(298.15 K). S° is
 * at p° = 1 bar.
 *
 * Gas constant: the coefficients were fitted with R = 8.314510 J/(mol K), but
 * they are dimensionless (cp/R, H/RT, S/R), so this library multiplies them by
 * the CODATA 2018 value GC_R_UNIVERSAL = 8.314462618 J/(mol K). The two differ
 * by 6 ppm, far below the data's own uncertainty.
 *
 * Validity: each species carries its data range [T_K[0], T_K[n_intervals]];
 * the functions below do not check T (use gc_species_check_T).
 *
 * Species ids are the gc_species_id values (the order of data/nasa9/nasa9.csv).
 */
#ifndef GASCYCLE_SPECIES_H
#define GASCYCLE_SPECIES_H

#include "gascycle/error.h"

#define GC_SPECIES_MAX_INTERVALS 3
#define GC_R_NASA9_FIT 8.314510   /* J/(mol K), the R the NASA-9 fits were made with */

typedef enum gc_species_id {
    GC_SP_N2 = 0,
    GC_SP_O2,
    GC_SP_AR,
    GC_SP_CO2,
    GC_SP_H2O,
    GC_SP_CO,
    GC_SP_H2,
    GC_SP_CH4,
    GC_SP_C2H6,
    GC_SP_C3H8,
    GC_SP_NC4H10,
    GC_SP_NO,
    GC_SP_OH,
    GC_SP_O,
    GC_SP_H,
    GC_SP_N,
    GC_SP_HE,
    GC_SP_NE,
    GC_SP_COUNT
} gc_species_id;

/* Elements counted in a species' formula (for combustion balances). */
typedef enum gc_element {
    GC_EL_C = 0, GC_EL_H, GC_EL_O, GC_EL_N, GC_EL_AR, GC_EL_HE, GC_EL_NE,
    GC_EL_COUNT
} gc_element;

typedef struct gc_species {
    const char *name;            /* canonical name, case-sensitive: "CO2", "n-C4H10" */
    const char *source_name;     /* record name in thermo.inp, e.g. "C4H10,n-butane" */
    double M_kg_per_mol;         /* molar mass, kg/mol */
    double dHf298_J_per_mol;     /* enthalpy of formation at 298.15 K, J/mol */
    int atoms[GC_EL_COUNT];      /* atoms of each gc_element per molecule */
    int n_intervals;             /* temperature intervals of the fit */
    double T_K[GC_SPECIES_MAX_INTERVALS + 1]; /* interval bounds, K, ascending */
    double a[GC_SPECIES_MAX_INTERVALS][9];    /* a1..a7, b1, b2 per interval, - */
} gc_species;

/* Number of species in the built-in table (= GC_SP_COUNT). */
int gc_species_count(void);

/* Species record by id, or NULL when id is not a valid gc_species_id. */
const gc_species *gc_species_get(int id);

/* Id of a species by canonical name ("CO2", "Ar", "n-C4H10") or alias
 * ("carbon dioxide", "argon", "n-butane", "methane", "water" ...); -1 when
 * unknown. Canonical names are case-sensitive ("Co" is not "CO"); aliases are
 * lower case. */
int gc_species_find(const char *name);

/* Like gc_species_find, with an error (GC_ERR_UNKNOWN naming the known
 * species) when the name is unknown. field goes into err->field. */
int gc_species_lookup(const char *name, int *id, const char *field, gc_error *err);

/* GC_OK when the species' data cover T (finite), else GC_ERR_RANGE. */
int gc_species_check_T(const gc_species *sp, double T_K, const char *field, gc_error *err);

/* Molar properties at T (unchecked; T inside the species' range).
 * cp in J/(mol K), h absolute in J/mol, s° in J/(mol K) at 1 bar. */
double gc_species_cp_molar(const gc_species *sp, double T_K);
double gc_species_h_molar(const gc_species *sp, double T_K);
double gc_species_s0_molar(const gc_species *sp, double T_K);

/* Enthalpy at 298.15 K as this library evaluates it: ΔfH x (GC_R_UNIVERSAL /
 * GC_R_NASA9_FIT), which is what the polynomial gives at 298.15 K (6 ppm
 * below the printed ΔfH). J/mol. Used where a species' data start at 300 K
 * but its enthalpy at exactly 298.15 K is needed (fuel at 25 °C). */
double gc_species_h298_molar(const gc_species *sp);

/* Internal: the generated table (service/core/properties/species_data.c). */
extern const gc_species gc__species_table[GC_SP_COUNT];

#endif
