/*
 * combustion.c — fuels, heating values and complete (lean or stoichiometric)
 * combustion by element balance, declared in gascycle/combustion.h.
 *
 * Energy balances use absolute enthalpies (NASA-9, formation included), so
 * the heat of reaction appears by itself. Adding fuel to a stream is linear
 * in the fuel-air ratio far for a lean mixture: per kg of entering stream the
 * product moles are n(far) = n0 + far dn, so
 *   (1 + far) h_products(T) = A(T) + far B(T),  A = sum n0 H(T), B = sum dn H(T),
 * and the far that reaches T_out is closed form:
 *   far = (A - h_in) / (h_fuel - (1 - eta_b) LHV - B).
 * A final step re-evaluates the balance with the products gc_gas itself, so
 * the result closes to rounding with the enthalpies a cycle will use.
 *
 * Units: SI (K, J/kg, J/mol, kg/kg).
 */
#include "gascycle/combustion.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* Standard atomic weights, g/mol, as used by the thermo.inp molar masses
 * (C 12.0107, H 1.00794, O 15.9994, N 14.0067: IUPAC 2001 values; from
 * memory, and they reproduce every molar mass of data/nasa9 to 2e-6). */
static const double atomic_weight_g[GC_EL_COUNT] = {
    12.0107, 1.00794, 15.9994, 14.0067, 39.948, 4.002602, 20.1797
};

#define T_REF_TOL_K 1e-6   /* "298.15 K" as given by a unit conversion */

static const struct { const char *name; int id; } named_fuels[] = {
    { "methane", GC_SP_CH4 },
    { "ethane", GC_SP_C2H6 },
    { "propane", GC_SP_C3H8 },
    { "n-butane", GC_SP_NC4H10 },
    { "hydrogen", GC_SP_H2 },
    { "carbon monoxide", GC_SP_CO },
    { "CH4", GC_SP_CH4 },
    { "C2H6", GC_SP_C2H6 },
    { "C3H8", GC_SP_C3H8 },
    { "n-C4H10", GC_SP_NC4H10 },
    { "H2", GC_SP_H2 },
    { "CO", GC_SP_CO },
};

static double o2_need(const double *atoms)
{
    return atoms[GC_EL_C] + 0.25 * atoms[GC_EL_H] - 0.5 * atoms[GC_EL_O];
}

static double h298(int id)
{
    return gc_species_h298_molar(gc_species_get(id));
}

/* LHV and HHV from the fuel's molar h298 and atoms (J/kg). */
static void heating_values(gc_fuel *f, double h_fuel_molar)
{
    const double *a = f->atoms;
    double prod = a[GC_EL_C] * h298(GC_SP_CO2) + 0.5 * a[GC_EL_H] * h298(GC_SP_H2O) +
                  0.5 * a[GC_EL_N] * h298(GC_SP_N2) - f->o2_demand * h298(GC_SP_O2);
    f->LHV_J_per_kg = (h_fuel_molar - prod) / f->M_kg_per_mol;
    f->HHV_J_per_kg = f->LHV_J_per_kg +
                      0.5 * a[GC_EL_H] * GC_DH_VAP_H2O_298_J_PER_MOL / f->M_kg_per_mol;
}

int gc_fuel_init_mixture(gc_fuel *f, int n, const int *ids, const double *x, gc_error *err)
{
    gc_fuel t;
    memset(&t, 0, sizeof t);
    int rc = gc_gas_init_mixture(&t.gas, n, ids, x, err);
    if (rc != GC_OK)
        return rc;
    double h_molar = 0.0;
    for (int j = 0; j < t.gas.n_species; j++) {
        const gc_species *sp = gc_species_get(t.gas.species[j]);
        for (int e = 0; e < GC_EL_COUNT; e++)
            t.atoms[e] += t.gas.x[j] * sp->atoms[e];
        h_molar += t.gas.x[j] * gc_species_h298_molar(sp);
    }
    t.o2_demand = o2_need(t.atoms);
    if (!(t.o2_demand > 1e-9))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel",
                            "the fuel contains nothing to burn (it needs no oxygen)");
    t.kind = GC_FUEL_GAS;
    snprintf(t.label, sizeof t.label, "fuel mixture");
    snprintf(t.gas.label, sizeof t.gas.label, "fuel");
    t.M_kg_per_mol = t.gas.M_kg_per_mol;
    t.h298_J_per_kg = h_molar / t.M_kg_per_mol;
    t.T_min_K = t.gas.T_min_K;
    t.T_max_K = t.gas.T_max_K;
    heating_values(&t, h_molar);
    *f = t;
    return GC_OK;
}

int gc_fuel_init_named(gc_fuel *f, const char *name, gc_error *err)
{
    for (size_t i = 0; name && i < sizeof named_fuels / sizeof named_fuels[0]; i++) {
        if (strcmp(name, named_fuels[i].name) != 0)
            continue;
        double one = 1.0;
        int rc = gc_fuel_init_mixture(f, 1, &named_fuels[i].id, &one, err);
        if (rc == GC_OK)
            snprintf(f->label, sizeof f->label, "%s", name);
        return rc;
    }
    if (name && (strstr(name, "natural") != NULL))
        return gc_error_set(err, GC_ERR_UNKNOWN, "/fuel",
                            "there is no default natural gas: give its analysis as mole fractions");
    return gc_error_set(err, GC_ERR_UNKNOWN, "/fuel",
                        "unknown fuel \"%.40s\"; named fuels: methane, ethane, propane, n-butane, "
                        "hydrogen, carbon monoxide", name ? name : "");
}

int gc_fuel_init_liquid(gc_fuel *f, double c, double h, double o, double n, double LHV,
                        double cp_liquid, gc_error *err)
{
    if (!(c >= 0.0 && h >= 0.0 && o >= 0.0 && n >= 0.0 && c <= 100.0 && h <= 200.0 &&
          o <= 100.0 && n <= 100.0 && c + h > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel/formula",
                            "atom counts must be between 0 and 100 (H up to 200) with C + H > 0");
    if (!(LHV >= 1e6 && LHV <= 1.5e8))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel/lhv",
                            "the lower heating value must be between 1 and 150 MJ/kg");
    if (cp_liquid == 0.0)
        cp_liquid = GC_FUEL_LIQUID_CP_DEFAULT;
    if (!(cp_liquid >= 500.0 && cp_liquid <= 5000.0))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel/cp",
                            "the liquid fuel cp must be between 500 and 5000 J/(kg K)");
    gc_fuel t;
    memset(&t, 0, sizeof t);
    t.kind = GC_FUEL_LIQUID;
    t.atoms[GC_EL_C] = c;
    t.atoms[GC_EL_H] = h;
    t.atoms[GC_EL_O] = o;
    t.atoms[GC_EL_N] = n;
    t.o2_demand = o2_need(t.atoms);
    if (!(t.o2_demand > 1e-9))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel/formula",
                            "the fuel contains nothing to burn (it needs no oxygen)");
    double M = 0.0;
    for (int e = 0; e < GC_EL_COUNT; e++)
        M += t.atoms[e] * atomic_weight_g[e];
    t.M_kg_per_mol = M * 1e-3;
    /* formation enthalpy of the liquid from its LHV: h_fuel = LHV M + sum(products) - O2 */
    double prod = c * h298(GC_SP_CO2) + 0.5 * h * h298(GC_SP_H2O) + 0.5 * n * h298(GC_SP_N2) -
                  t.o2_demand * h298(GC_SP_O2);
    double h_molar = LHV * t.M_kg_per_mol + prod;
    t.h298_J_per_kg = h_molar / t.M_kg_per_mol;
    t.cp_liquid_J_per_kgK = cp_liquid;
    t.T_min_K = GC_FUEL_LIQUID_T_MIN_K;
    t.T_max_K = GC_FUEL_LIQUID_T_MAX_K;
    char label[128];
    snprintf(label, sizeof label, "liquid C%gH%gO%gN%g", c, h, o, n);
    memcpy(t.label, label, sizeof t.label - 1);
    t.label[sizeof t.label - 1] = '\0';
    heating_values(&t, h_molar);
    *f = t;
    return GC_OK;
}

int gc_fuel_h_T(const gc_fuel *f, double T, double *h, gc_error *err)
{
    if (fabs(T - GC_T_REF_K) <= T_REF_TOL_K) {
        *h = f->h298_J_per_kg;
        return GC_OK;
    }
    if (!(T >= f->T_min_K && T <= f->T_max_K))
        return gc_error_set(err, GC_ERR_RANGE, "/fuel_temperature",
                            "fuel temperature must be between %g and %g K (or 298.15 K) for %s",
                            f->T_min_K, f->T_max_K, f->label);
    if (f->kind == GC_FUEL_LIQUID)
        *h = f->h298_J_per_kg + f->cp_liquid_J_per_kgK * (T - GC_T_REF_K);
    else
        *h = gc_gas_h_T(&f->gas, T);
    return GC_OK;
}

void gc_fuel_heating_values(const gc_fuel *f, double *lhv, double *hhv)
{
    if (lhv)
        *lhv = f->LHV_J_per_kg;
    if (hhv)
        *hhv = f->HHV_J_per_kg;
}

void gc_fuel_emissions(const gc_fuel *f, double *co2, double *h2o)
{
    if (co2)
        *co2 = f->atoms[GC_EL_C] * gc_species_get(GC_SP_CO2)->M_kg_per_mol / f->M_kg_per_mol;
    if (h2o)
        *h2o = 0.5 * f->atoms[GC_EL_H] * gc_species_get(GC_SP_H2O)->M_kg_per_mol / f->M_kg_per_mol;
}

/* ---- element balances ---------------------------------------------------- */

/* Atoms (mol) per kg of a species mixture. */
static void stream_atoms(const gc_gas *g, double *E)
{
    for (int e = 0; e < GC_EL_COUNT; e++)
        E[e] = 0.0;
    for (int j = 0; j < g->n_species; j++) {
        const gc_species *sp = gc_species_get(g->species[j]);
        double n = g->y[j] / sp->M_kg_per_mol;
        for (int e = 0; e < GC_EL_COUNT; e++)
            E[e] += n * sp->atoms[e];
    }
}

enum { P_N2, P_O2, P_AR, P_CO2, P_H2O, P_HE, P_NE, P_COUNT };
static const int prod_ids[P_COUNT] = { GC_SP_N2, GC_SP_O2, GC_SP_AR, GC_SP_CO2, GC_SP_H2O,
                                       GC_SP_HE, GC_SP_NE };

/* Complete-combustion product moles of a set of atoms (linear map). */
static void products_of(const double *E, double *n)
{
    n[P_CO2] = E[GC_EL_C];
    n[P_H2O] = 0.5 * E[GC_EL_H];
    n[P_N2] = 0.5 * E[GC_EL_N];
    n[P_AR] = E[GC_EL_AR];
    n[P_HE] = E[GC_EL_HE];
    n[P_NE] = E[GC_EL_NE];
    n[P_O2] = 0.5 * (E[GC_EL_O] - 2.0 * E[GC_EL_C] - 0.5 * E[GC_EL_H]);
}

static int check_oxidiser(const gc_gas *air, gc_error *err)
{
    if (air->kind != GC_GAS_MIXTURE)
        return gc_error_set(err, GC_ERR_INVALID, "/gas",
                            "combustion needs a species mixture (air, humid air, products), "
                            "not the cold model");
    return GC_OK;
}

int gc_combustion_far_stoich(const gc_fuel *f, const gc_gas *air, double *far, gc_error *err)
{
    int rc = check_oxidiser(air, err);
    if (rc != GC_OK)
        return rc;
    double E[GC_EL_COUNT], n[P_COUNT];
    stream_atoms(air, E);
    products_of(E, n);
    if (!(n[P_O2] > 1e-12))
        return gc_error_set(err, GC_ERR_INVALID, "/gas",
                            "the oxidiser stream holds no free oxygen");
    *far = n[P_O2] / (f->o2_demand / f->M_kg_per_mol);
    return GC_OK;
}

int gc_combustion_phi(const gc_fuel *f, const gc_gas *air, double far, double *phi, gc_error *err)
{
    double fs = 0.0;
    int rc = gc_combustion_far_stoich(f, air, &fs, err);
    if (rc != GC_OK)
        return rc;
    if (!(far >= 0.0 && far < 1e6))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel_air_ratio",
                            "the fuel-air ratio must be non-negative and finite");
    *phi = far / fs;
    return GC_OK;
}

/* Product moles per kg of entering stream at far = 0 (n0) and per kg of fuel
 * (dn); also far_stoich. */
static int balance(const gc_fuel *f, const gc_gas *air, double *n0, double *dn, double *far_st,
                   gc_error *err)
{
    int rc = gc_combustion_far_stoich(f, air, far_st, err);
    if (rc != GC_OK)
        return rc;
    double E[GC_EL_COUNT], Ef[GC_EL_COUNT];
    stream_atoms(air, E);
    for (int e = 0; e < GC_EL_COUNT; e++)
        Ef[e] = f->atoms[e] / f->M_kg_per_mol;
    products_of(E, n0);
    products_of(Ef, dn);
    return GC_OK;
}

static int check_far(double far, double far_st, gc_error *err)
{
    if (!(far >= 0.0 && far < 1e6))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel_air_ratio",
                            "the fuel-air ratio must be non-negative and finite");
    if (far > far_st * (1.0 + 1e-9))
        return gc_error_set(err, GC_ERR_RICH, "/fuel_air_ratio",
                            "fuel-air ratio %.6g is richer than stoichiometric (%.6g); the "
                            "complete-combustion model covers lean and stoichiometric mixtures only",
                            far, far_st);
    return GC_OK;
}

static int build_products(const double *n0, const double *dn, double far, gc_gas *out,
                          gc_error *err)
{
    int ids[P_COUNT], m = 0;
    double x[P_COUNT], total = 0.0, n[P_COUNT];
    for (int p = 0; p < P_COUNT; p++) {
        n[p] = n0[p] + far * dn[p];
        if (p == P_O2 && n[p] < 0.0)
            n[p] = 0.0; /* stoichiometric within rounding (checked by check_far) */
        if (n[p] > 0.0)
            total += n[p];
    }
    for (int p = 0; p < P_COUNT; p++)
        if (n[p] > 0.0) {
            ids[m] = prod_ids[p];
            x[m] = n[p] / total;
            m++;
        }
    int rc = gc_gas_init_mixture(out, m, ids, x, err);
    if (rc != GC_OK)
        return rc;
    snprintf(out->label, sizeof out->label, "products");
    return GC_OK;
}

int gc_combustion_products(const gc_fuel *f, const gc_gas *air, double far, gc_gas *products,
                           gc_error *err)
{
    double n0[P_COUNT], dn[P_COUNT], fs;
    int rc = balance(f, air, n0, dn, &fs, err);
    if (rc == GC_OK)
        rc = check_far(far, fs, err);
    if (rc != GC_OK)
        return rc;
    return build_products(n0, dn, far, products, err);
}

static int check_burn_inputs(const gc_gas *in, double T_in, double m_in, double eta_b,
                             gc_error *err)
{
    int rc = check_oxidiser(in, err);
    if (rc != GC_OK)
        return rc;
    if (!(m_in > 0.0 && m_in < 1e12))
        return gc_error_set(err, GC_ERR_INVALID, "/mass",
                            "the entering mass must be positive and finite");
    if (!(eta_b > 0.0 && eta_b <= 1.0))
        return gc_error_set(err, GC_ERR_INVALID, "/combustor_efficiency",
                            "the combustor efficiency must be greater than 0 and at most 1");
    return gc_gas_check_T(in, T_in, "/inlet_temperature", err);
}

static void fill_burn(gc_burn *out, double far, double far_st, double m_in, double T_out,
                      double h_out, double eta_b, const gc_fuel *f)
{
    out->far = far;
    out->phi = far / far_st;
    out->m_fuel_kg = far * m_in;
    out->m_out_kg = m_in + out->m_fuel_kg;
    out->T_out_K = T_out;
    out->h_out_J_per_kg = h_out;
    out->heat_released_J = eta_b * out->m_fuel_kg * f->LHV_J_per_kg;
}

int gc_combustion_burn_far(const gc_fuel *f, double T_fuel, const gc_gas *in, double T_in,
                           double m_in, double far, double eta_b, gc_burn *out, gc_error *err)
{
    int rc = check_burn_inputs(in, T_in, m_in, eta_b, err);
    double n0[P_COUNT], dn[P_COUNT], fs = 0.0, hf = 0.0;
    if (rc == GC_OK)
        rc = balance(f, in, n0, dn, &fs, err);
    if (rc == GC_OK)
        rc = check_far(far, fs, err);
    if (rc == GC_OK)
        rc = gc_fuel_h_T(f, T_fuel, &hf, err);
    gc_gas prod;
    if (rc == GC_OK)
        rc = build_products(n0, dn, far, &prod, err);
    if (rc != GC_OK)
        return rc;
    double h_in = gc_gas_h_T(in, T_in);
    double h_out = (h_in + far * (hf - (1.0 - eta_b) * f->LHV_J_per_kg)) / (1.0 + far);
    double T_out = 0.0;
    rc = gc_gas_T_from_h(&prod, h_out, &T_out, err);
    if (rc != GC_OK) {
        if (rc == GC_ERR_RANGE)
            gc_error_set(err, rc, "/fuel_air_ratio",
                         "the burner exit temperature lies outside the validity range "
                         "%g..%g K of the products data", prod.T_min_K, prod.T_max_K);
        return rc;
    }
    out->products = prod;
    fill_burn(out, far, fs, m_in, T_out, h_out, eta_b, f);
    return GC_OK;
}

int gc_combustion_burn_to_T(const gc_fuel *f, double T_fuel, const gc_gas *in, double T_in,
                            double m_in, double T_out, double eta_b, gc_burn *out, gc_error *err)
{
    int rc = check_burn_inputs(in, T_in, m_in, eta_b, err);
    double n0[P_COUNT], dn[P_COUNT], fs = 0.0, hf = 0.0;
    if (rc == GC_OK)
        rc = balance(f, in, n0, dn, &fs, err);
    if (rc == GC_OK)
        rc = gc_fuel_h_T(f, T_fuel, &hf, err);
    if (rc != GC_OK)
        return rc;
    /* T_out must lie in the data range of every product species present */
    double tmin = 0.0, tmax = 6000.0;
    for (int p = 0; p < P_COUNT; p++) {
        if (n0[p] == 0.0 && dn[p] == 0.0)
            continue;
        const gc_species *sp = gc_species_get(prod_ids[p]);
        tmin = fmax(tmin, sp->T_K[0]);
        tmax = fmin(tmax, sp->T_K[sp->n_intervals]);
    }
    if (!(T_out >= tmin && T_out <= tmax))
        return gc_error_set(err, GC_ERR_RANGE, "/exit_temperature",
                            "the burner exit temperature must be between %g and %g K "
                            "(validity range of the products data)", tmin, tmax);
    double A = 0.0, B = 0.0;
    for (int p = 0; p < P_COUNT; p++) {
        if (n0[p] == 0.0 && dn[p] == 0.0)
            continue;
        double H = gc_species_h_molar(gc_species_get(prod_ids[p]), T_out);
        A += n0[p] * H;
        B += dn[p] * H;
    }
    double h_in = gc_gas_h_T(in, T_in);
    double hfx = hf - (1.0 - eta_b) * f->LHV_J_per_kg;
    double denom = hfx - B;
    if (!(A - h_in > 0.0) || !(denom > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/exit_temperature",
                            "the burner exit temperature %g K cannot be reached by adding fuel "
                            "(it must be above what the entering stream reaches without fuel)",
                            T_out);
    double far = (A - h_in) / denom;
    if (far > fs * (1.0 + 1e-9))
        return gc_error_set(err, GC_ERR_RICH, "/exit_temperature",
                            "reaching %g K needs a fuel-air ratio of %.6g, richer than "
                            "stoichiometric (%.6g); the complete-combustion model covers lean "
                            "and stoichiometric mixtures only", T_out, far, fs);
    gc_gas prod;
    rc = build_products(n0, dn, far, &prod, err);
    if (rc != GC_OK)
        return rc;
    /* close the balance with the products gas itself (removes the rounding of
     * the molar route; one or two steps) */
    for (int it = 0; it < 3; it++) {
        double r = h_in + far * hfx - (1.0 + far) * gc_gas_h_T(&prod, T_out);
        if (fabs(r) <= 1e-12 * (fabs(h_in) + far * fabs(hfx) + 1.0))
            break;
        far += r / denom;
        if (far > fs)
            far = fs;
        rc = build_products(n0, dn, far, &prod, err);
        if (rc != GC_OK)
            return rc;
    }
    out->products = prod;
    fill_burn(out, far, fs, m_in, T_out, gc_gas_h_T(&prod, T_out), eta_b, f);
    return GC_OK;
}

int gc_combustion_far_for_T(const gc_fuel *f, double T_fuel, const gc_gas *air, double T_air,
                            double T_out, double eta_b, double *far, gc_error *err)
{
    gc_burn b;
    int rc = gc_combustion_burn_to_T(f, T_fuel, air, T_air, 1.0, T_out, eta_b, &b, err);
    if (rc == GC_OK)
        *far = b.far;
    return rc;
}

int gc_combustion_T_adiabatic(const gc_fuel *f, double T_fuel, const gc_gas *air, double T_air,
                              double far, double *T, gc_error *err)
{
    gc_burn b;
    int rc = gc_combustion_burn_far(f, T_fuel, air, T_air, 1.0, far, 1.0, &b, err);
    if (rc == GC_OK)
        *T = b.T_out_K;
    return rc;
}
