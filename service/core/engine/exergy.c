/*
 * exergy.c — the reference environment, stream and fuel exergies of
 * gascycle/exergy.h (Szargut's standard chemical exergies, element
 * potentials from the NASA-9 data of species.h).
 *
 * Units: SI (K, Pa, J/mol, J/kg, J/(kg K)).
 */
#include "gascycle/exergy.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* Standard chemical exergies of the reference species, J/mol (Szargut,
 * Morris & Steward 1988, T_n = 298.15 K, p_n = 101.325 kPa; from memory). */
static const struct { int id; int element; double ex_J_per_mol; } reference[] = {
    { GC_SP_O2, GC_EL_O, 3970.0 },
    { GC_SP_N2, GC_EL_N, 720.0 },
    { GC_SP_CO2, GC_EL_C, 19870.0 },
    { GC_SP_H2O, GC_EL_H, 9500.0 },
    { GC_SP_AR, GC_EL_AR, 11690.0 },
    { GC_SP_HE, GC_EL_HE, 30370.0 },
    { GC_SP_NE, GC_EL_NE, 27190.0 },
};
#define N_REF ((int)(sizeof reference / sizeof reference[0]))

/* Szargut-Styrylska liquid-fuel correlation, phi = ex / LHV (see exergy.h). */
#define PHI_0 1.0401
#define PHI_HC 0.1728
#define PHI_OC 0.0432
/* Atomic weights for the mass ratios h/c, o/c (IUPAC 2001, as combustion.c;
 * from memory). */
#define AW_C 12.0107
#define AW_H 1.00794
#define AW_O 15.9994

double gc_exergy_reference_molar(int id)
{
    for (int i = 0; i < N_REF; i++)
        if (reference[i].id == id)
            return reference[i].ex_J_per_mol;
    return 0.0;
}

/* Molar h and s° of a species at T; below the data of a monatomic species
 * (He, Ne: cp = 5R/2 exactly) the constant cp extends them. */
static void species_hs(const gc_species *sp, double T, double *h, double *s)
{
    double Tlo = sp->T_K[0];
    if (T >= Tlo) {
        *h = gc_species_h_molar(sp, T);
        *s = gc_species_s0_molar(sp, T);
        return;
    }
    double cp = gc_species_cp_molar(sp, Tlo);
    *h = gc_species_h_molar(sp, Tlo) + cp * (T - Tlo);
    *s = gc_species_s0_molar(sp, Tlo) + cp * log(T / Tlo);
}

int gc_exergy_env_init(gc_exergy_env *env, double T0, double P0, gc_error *err)
{
    if (!(P0 > 0.0) || !isfinite(P0))
        return gc_error_set(err, GC_ERR_INVALID, "/dead_state/pressure",
                            "the dead-state pressure must be positive");
    double mu[N_REF];
    for (int i = 0; i < N_REF; i++) {
        const gc_species *sp = gc_species_get(reference[i].id);
        int monatomic = reference[i].id == GC_SP_HE || reference[i].id == GC_SP_NE;
        if (!(T0 <= sp->T_K[sp->n_intervals]) || !(T0 >= (monatomic ? 100.0 : sp->T_K[0])))
            return gc_error_set(err, GC_ERR_RANGE, "/dead_state/temperature",
                                "the dead-state temperature %.6g K is outside the data of "
                                "the reference environment's species (%g to %g K)", T0,
                                sp->T_K[0], sp->T_K[sp->n_intervals]);
        double h, s;
        species_hs(sp, T0, &h, &s);
        double lnx = -reference[i].ex_J_per_mol / (GC_R_UNIVERSAL * GC_EXERGY_T_STD_K);
        mu[i] = h - T0 * (s - GC_R_UNIVERSAL * (lnx + log(P0 / GC_P_STD_PA)));
    }
    memset(env, 0, sizeof *env);
    env->T0_K = T0;
    env->P0_Pa = P0;
    double *L = env->lambda_J_per_mol;
    L[GC_EL_O] = 0.5 * mu[0];
    L[GC_EL_N] = 0.5 * mu[1];
    L[GC_EL_C] = mu[2] - 2.0 * L[GC_EL_O];
    L[GC_EL_H] = 0.5 * (mu[3] - L[GC_EL_O]);
    L[GC_EL_AR] = mu[4];
    L[GC_EL_HE] = mu[5];
    L[GC_EL_NE] = mu[6];
    return GC_OK;
}

/* sum_e n_e lambda_e for 1 kg of a species mixture, J/kg. */
static double gas_elements(const gc_exergy_env *env, const gc_gas *g)
{
    double sum = 0.0;
    for (int j = 0; j < g->n_species; j++) {
        const gc_species *sp = gc_species_get(g->species[j]);
        double per_mol = 0.0;
        for (int e = 0; e < GC_EL_COUNT; e++)
            per_mol += sp->atoms[e] * env->lambda_J_per_mol[e];
        sum += g->x[j] * per_mol;
    }
    return sum / g->M_kg_per_mol;
}

/* The same for 1 kg of fuel. */
static double fuel_elements(const gc_exergy_env *env, const gc_fuel *f)
{
    double per_mol = 0.0;
    for (int e = 0; e < GC_EL_COUNT; e++)
        per_mol += f->atoms[e] * env->lambda_J_per_mol[e];
    return per_mol / f->M_kg_per_mol;
}

int gc_exergy_gas(const gc_exergy_env *env, const gc_gas *g, double T, double P, double *b,
                  gc_error *err)
{
    if (g->kind != GC_GAS_MIXTURE || g->n_species < 1)
        return gc_error_set(err, GC_ERR_INVALID, "/gas",
                            "chemical exergy needs a gas with a composition (not the cold model)");
    int rc = gc_gas_check_T(g, T, NULL, err);
    if (rc != GC_OK)
        return rc;
    *b = gc_gas_h_T(g, T) - env->T0_K * gc_gas_s_TP(g, T, P) - gas_elements(env, g);
    return GC_OK;
}

/* The standard environment (298.15 K, 101.325 kPa); it always exists. */
static void std_env(gc_exergy_env *env)
{
    gc_exergy_env_init(env, GC_EXERGY_T_STD_K, GC_EXERGY_P_STD_PA, NULL);
}

/* Standard chemical exergy of a liquid fuel by the Szargut-Styrylska
 * correlation, J/kg. */
static double liquid_standard(const gc_fuel *f)
{
    double c = f->atoms[GC_EL_C] * AW_C, h = f->atoms[GC_EL_H] * AW_H;
    double o = f->atoms[GC_EL_O] * AW_O;
    double phi = c > 0.0 ? PHI_0 + PHI_HC * h / c + PHI_OC * o / c : PHI_0;
    return phi * f->LHV_J_per_kg;
}

int gc_exergy_fuel_s(const gc_fuel *f, double T, double P, double *s, gc_error *err)
{
    double h;
    int rc = gc_fuel_h_T(f, T, &h, err); /* checks the temperature */
    if (rc != GC_OK)
        return rc;
    if (f->kind == GC_FUEL_GAS) {
        *s = gc_gas_s_TP(&f->gas, T, P);
        return GC_OK;
    }
    gc_exergy_env e;
    std_env(&e);
    double s298 = (f->h298_J_per_kg - fuel_elements(&e, f) - liquid_standard(f)) /
                  GC_EXERGY_T_STD_K;
    *s = s298 + f->cp_liquid_J_per_kgK * log(T / GC_T_REF_K);
    return GC_OK;
}

int gc_exergy_fuel(const gc_exergy_env *env, const gc_fuel *f, double T, double P, double *b,
                   gc_error *err)
{
    double h, s;
    int rc = gc_fuel_h_T(f, T, &h, err);
    if (rc == GC_OK)
        rc = gc_exergy_fuel_s(f, T, P, &s, err);
    if (rc != GC_OK)
        return rc;
    *b = h - env->T0_K * s - fuel_elements(env, f);
    return GC_OK;
}

double gc_exergy_fuel_standard(const gc_fuel *f)
{
    if (f->kind == GC_FUEL_LIQUID)
        return liquid_standard(f);
    gc_exergy_env e;
    std_env(&e);
    double b = 0.0;
    if (gc_exergy_fuel(&e, f, GC_T_REF_K, GC_EXERGY_P_STD_PA, &b, NULL) != GC_OK)
        return 0.0;
    return b;
}
