/*
 * species.c — species lookup by name and single-species NASA-9 properties
 * (species.h). The data table itself is generated into species_data.c from
 * data/nasa9/ (NASA/TP-2002-211556). Molar units: J/mol, J/(mol K); the
 * dimensionless fits are scaled with the CODATA 2018 R (see species.h).
 */
#include "gascycle/species.h"
#include "gascycle/gas.h"

#include <math.h>
#include <stddef.h>
#include <string.h>

/* Lower-case aliases accepted besides the canonical names. */
static const struct { const char *alias; int id; } aliases[] = {
    { "nitrogen", GC_SP_N2 },
    { "oxygen", GC_SP_O2 },
    { "argon", GC_SP_AR },
    { "carbon dioxide", GC_SP_CO2 },
    { "water", GC_SP_H2O },
    { "water vapour", GC_SP_H2O },
    { "water vapor", GC_SP_H2O },
    { "carbon monoxide", GC_SP_CO },
    { "hydrogen", GC_SP_H2 },
    { "methane", GC_SP_CH4 },
    { "ethane", GC_SP_C2H6 },
    { "propane", GC_SP_C3H8 },
    { "n-butane", GC_SP_NC4H10 },
    { "butane", GC_SP_NC4H10 },
    { "C4H10", GC_SP_NC4H10 },
    { "nitric oxide", GC_SP_NO },
    { "hydroxyl", GC_SP_OH },
    { "helium", GC_SP_HE },
    { "neon", GC_SP_NE },
};

int gc_species_count(void)
{
    return GC_SP_COUNT;
}

const gc_species *gc_species_get(int id)
{
    if (id < 0 || id >= GC_SP_COUNT)
        return NULL;
    return &gc__species_table[id];
}

int gc_species_find(const char *name)
{
    if (name == NULL)
        return -1;
    for (int i = 0; i < GC_SP_COUNT; i++)
        if (strcmp(name, gc__species_table[i].name) == 0)
            return i;
    for (size_t i = 0; i < sizeof aliases / sizeof aliases[0]; i++)
        if (strcmp(name, aliases[i].alias) == 0)
            return aliases[i].id;
    return -1;
}

int gc_species_lookup(const char *name, int *id, const char *field, gc_error *err)
{
    int i = gc_species_find(name);
    if (i < 0)
        return gc_error_set(err, GC_ERR_UNKNOWN, field,
                            "unknown species \"%.40s\"; known: N2, O2, Ar, CO2, H2O, CO, H2, "
                            "CH4, C2H6, C3H8, n-C4H10, NO, OH, O, H, N, He, Ne",
                            name ? name : "");
    if (id)
        *id = i;
    return GC_OK;
}

int gc_species_check_T(const gc_species *sp, double T_K, const char *field, gc_error *err)
{
    double lo = sp->T_K[0], hi = sp->T_K[sp->n_intervals];
    if (!(T_K >= lo && T_K <= hi)) /* also false for NaN */
        return gc_error_set(err, GC_ERR_RANGE, field,
                            "temperature must be between %g and %g K for %s (data range)",
                            lo, hi, sp->name);
    return GC_OK;
}

static const double *coeffs(const gc_species *sp, double T)
{
    int i = 0;
    while (i < sp->n_intervals - 1 && T > sp->T_K[i + 1])
        i++;
    return sp->a[i];
}

double gc_species_cp_molar(const gc_species *sp, double T)
{
    const double *a = coeffs(sp, T);
    double ti = 1.0 / T;
    double cp_R = ti * (ti * a[0] + a[1]) + a[2] + T * (a[3] + T * (a[4] + T * (a[5] + T * a[6])));
    return GC_R_UNIVERSAL * cp_R;
}

double gc_species_h_molar(const gc_species *sp, double T)
{
    const double *a = coeffs(sp, T);
    /* H/R = -a1/T + a2 ln T + a3 T + a4 T^2/2 + a5 T^3/3 + a6 T^4/4 + a7 T^5/5 + b1 */
    double h_R = -a[0] / T + a[1] * log(T) + a[7] +
                 T * (a[2] + T * (a[3] / 2.0 + T * (a[4] / 3.0 + T * (a[5] / 4.0 + T * a[6] / 5.0))));
    return GC_R_UNIVERSAL * h_R;
}

double gc_species_s0_molar(const gc_species *sp, double T)
{
    const double *a = coeffs(sp, T);
    double ti = 1.0 / T;
    double s_R = -0.5 * a[0] * ti * ti - a[1] * ti + a[2] * log(T) + a[8] +
                 T * (a[3] + T * (a[4] / 2.0 + T * (a[5] / 3.0 + T * a[6] / 4.0)));
    return GC_R_UNIVERSAL * s_R;
}

double gc_species_h298_molar(const gc_species *sp)
{
    return sp->dHf298_J_per_mol * (GC_R_UNIVERSAL / GC_R_NASA9_FIT);
}
