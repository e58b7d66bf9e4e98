/*
 * test_exergy.c — the reference environment and the stream and fuel
 * exergies of exergy.h against published data: Szargut's standard chemical
 * exergies (J. Szargut, D. R. Morris, F. R. Steward, Exergy Analysis of
 * Thermal, Chemical, and Metallurgical Processes, 1988; values from memory,
 * named beside each check), the same exergies derived from the NIST-JANAF
 * Gibbs energies of formation (Chase 1998, tests/reference/janaf), the
 * mixture formula of chemical exergy, and the Gouy-Stodola balance of a
 * burner (exergy in - exergy out = T0 S_gen, any engineering-thermodynamics
 * text).
 */
#include "check.h"
#include "refcsv.h"

#include "gascycle/combustion.h"
#include "gascycle/exergy.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#include <math.h>
#include <string.h>

#define R_U GC_R_UNIVERSAL

/* Standard chemical exergies of the reference species, kJ/mol (Szargut,
 * Morris & Steward 1988; from memory). */
static const struct { int id; double ex_kJ; } ref_species[] = {
    { GC_SP_N2, 0.72 }, { GC_SP_O2, 3.97 }, { GC_SP_H2O, 9.50 },
    { GC_SP_AR, 11.69 }, { GC_SP_CO2, 19.87 },
};

static gc_gas pure(int id)
{
    gc_gas g;
    double one = 1.0;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_mixture(&g, 1, &id, &one, NULL), GC_OK);
    return g;
}

/* A pure reference species at (298.15 K, 101.325 kPa) has its standard
 * chemical exergy (Szargut's definition: ex = -R T_n ln x_env). */
static void test_reference_species(void)
{
    gc_exergy_env env;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_env_init(&env, 298.15, 101325.0, NULL), GC_OK);
    for (size_t i = 0; i < sizeof ref_species / sizeof ref_species[0]; i++) {
        gc_gas g = pure(ref_species[i].id);
        double b = 0.0;
        CU_ASSERT_EQUAL_FATAL(gc_exergy_gas(&env, &g, 298.15, 101325.0, &b, NULL), GC_OK);
        CHECK_REL(b * g.M_kg_per_mol * 1e-3, ref_species[i].ex_kJ, 1e-12,
                  "Szargut, Morris & Steward 1988 (from memory)");
        CHECK_REL(gc_exergy_reference_molar(ref_species[i].id), ref_species[i].ex_kJ * 1e3, 1e-15,
                  "the table itself");
    }
    CU_ASSERT_EQUAL(gc_exergy_reference_molar(GC_SP_CH4), 0.0);
}

/* Chemical exergy of a mixture of reference species at (T0, P0):
 *   ex = sum x_i (ex_i + R T0 ln x_i)     (per mole; Szargut 1988, from memory)
 * for the library's dry air (gas.c composition), at the standard state. */
static void test_air_chemical(void)
{
    gc_exergy_env env;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_env_init(&env, 298.15, 101325.0, NULL), GC_OK);
    gc_gas air;
    gc_gas_init_air(&air);
    double want = 0.0;
    for (int j = 0; j < air.n_species; j++) {
        double ex = 0.0;
        for (size_t i = 0; i < sizeof ref_species / sizeof ref_species[0]; i++)
            if (ref_species[i].id == air.species[j])
                ex = ref_species[i].ex_kJ * 1e3;
        want += air.x[j] * (ex + R_U * 298.15 * log(air.x[j]));
    }
    want /= air.M_kg_per_mol;
    double b = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_gas(&env, &air, 298.15, 101325.0, &b, NULL), GC_OK);
    CHECK_REL(b, want, 1e-9, "mixture chemical exergy sum x (ex + R T0 ln x)");
    CU_ASSERT(b > 0.0);
    printf("\n  dry air, standard chemical exergy %.4f kJ/kg", b * 1e-3);
}

/* JANAF column of a species at 298.15 K (col: 2 S, 6 dfG). */
static double janaf_298(const char *sp, int col)
{
    static double rows[80][REFCSV_MAX_COLS];
    char path[96];
    snprintf(path, sizeof path, "tests/reference/janaf/%s.csv", sp);
    int n = refcsv_read(path, 8, rows, 80);
    CU_ASSERT_FATAL(n > 5);
    for (int i = 0; i < n; i++)
        if (fabs(rows[i][0] - 298.15) < 1e-9)
            return rows[i][col];
    CU_FAIL("no 298.15 K row");
    return 0.0;
}

/* Fuels' standard chemical exergies, kJ/mol:
 *  - derived from NIST-JANAF Gibbs energies of formation (Chase 1998, tables
 *    C-067, C-093, H-050, C-095, H-064) plus the reference species'
 *    exergies: ex = -dG_r + sum nu_p ex_p - nu_O2 ex_O2 for
 *    CxHyOz + (x + y/4 - z/2) O2 -> x CO2 + y/2 H2O(g). The library uses the
 *    NASA-9 data instead (methane's formation enthalpy there is -74.600
 *    kJ/mol against JANAF's -74.873), so 5e-4 relative;
 *  - Szargut, Morris & Steward 1988, table of standard chemical exergies
 *    (from memory): CH4 831.65, C2H6 1495.84, C3H8 2154.0, n-C4H10 2805.8,
 *    H2 236.09, CO 275.10, within 0.2 % (their Gibbs data differ as well). */
static void test_fuel_standard(void)
{
    double gCO2 = janaf_298("CO2", 6), gH2O = janaf_298("H2O", 6);
    double gCH4 = janaf_298("CH4", 6), gCO = janaf_298("CO", 6), gH2 = janaf_298("H2", 6);
    const double exO2 = 3.97, exCO2 = 19.87, exH2O = 9.50;
    struct { const char *name; double janaf, szargut; } fu[] = {
        { "methane", -(gCO2 + 2.0 * gH2O - gCH4) + exCO2 + 2.0 * exH2O - 2.0 * exO2, 831.65 },
        { "hydrogen", -(gH2O - gH2) + exH2O - 0.5 * exO2, 236.09 },
        { "carbon monoxide", -(gCO2 - gCO) + exCO2 - 0.5 * exO2, 275.10 },
        { "ethane", 0.0, 1495.84 },
        { "propane", 0.0, 2154.0 },
        { "n-butane", 0.0, 2805.8 },
    };
    for (size_t i = 0; i < sizeof fu / sizeof fu[0]; i++) {
        gc_fuel f;
        CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&f, fu[i].name, NULL), GC_OK);
        double ex = gc_exergy_fuel_standard(&f) * f.M_kg_per_mol * 1e-3;
        if (fu[i].janaf > 0.0)
            CHECK_REL(ex, fu[i].janaf, 5e-4, "NIST-JANAF dfG (Chase 1998) + Szargut reference");
        CHECK_REL(ex, fu[i].szargut, 2e-3, "Szargut, Morris & Steward 1988 (from memory)");
        printf("\n  %-16s ex %.2f kJ/mol (JANAF-derived %.2f, Szargut %.2f), phi = ex/LHV %.4f",
               fu[i].name, ex, fu[i].janaf, fu[i].szargut,
               gc_exergy_fuel_standard(&f) / f.LHV_J_per_kg);
    }
}

/* Liquid fuels: ex = phi LHV with phi = 1.0401 + 0.1728 h/c + 0.0432 o/c
 * (Szargut & Styrylska 1964 as given by Szargut, Morris & Steward 1988 and
 * Kotas 1985; from memory), and the entropy derived from it gives the same
 * exergy back in the standard environment (exergy.h). */
static void test_liquid(void)
{
    gc_fuel k;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_liquid(&k, 12.0, 23.0, 0.0, 0.0, 43.0e6, 0.0, NULL), GC_OK);
    double hc = 23.0 * 1.00794 / (12.0 * 12.0107);
    double want = (1.0401 + 0.1728 * hc) * 43.0e6;
    CHECK_REL(gc_exergy_fuel_standard(&k), want, 1e-12, "Szargut-Styrylska correlation");
    gc_exergy_env env;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_env_init(&env, 298.15, 101325.0, NULL), GC_OK);
    double b = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel(&env, &k, 298.15, 101325.0, &b, NULL), GC_OK);
    CHECK_REL(b, want, 1e-12, "derived liquid entropy reproduces the correlation");
    /* a liquid is incompressible: its exergy does not depend on pressure */
    double b2 = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel(&env, &k, 298.15, 2e6, &b2, NULL), GC_OK);
    CHECK_REL(b2, b, 1e-15, "liquid: no pressure exergy");
}

/* A gas fuel's physical exergy at T0 is the ideal-gas pressure term
 * R T0 ln(P / P0) (any engineering-thermodynamics text). */
static void test_fuel_pressure(void)
{
    gc_fuel m;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&m, "methane", NULL), GC_OK);
    gc_exergy_env env;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_env_init(&env, 298.15, 101325.0, NULL), GC_OK);
    double b0 = 0.0, b1 = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel(&env, &m, 298.15, 101325.0, &b0, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel(&env, &m, 298.15, 15.0 * 101325.0, &b1, NULL), GC_OK);
    CHECK_REL(b1 - b0, R_U / m.M_kg_per_mol * 298.15 * log(15.0), 1e-9,
              "ideal-gas pressure exergy R T0 ln(P/P0)");
    CHECK_REL(b0, gc_exergy_fuel_standard(&m), 1e-12, "standard state");
}

/* Gouy-Stodola across an adiabatic burner: B_air + B_fuel - B_products =
 * T0 S_gen with S_gen = m_out s_p - m_in s_air - m_f s_f, at a site
 * environment other than the standard one (T0 = 313.15 K, P0 = 99 kPa). */
static void test_burner_gouy_stodola(void)
{
    gc_fuel m;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&m, "methane", NULL), GC_OK);
    gc_gas air;
    gc_gas_init_air(&air);
    gc_burn b;
    const double T1 = 720.0, P1 = 1.5e6, Tf = 298.15;
    CU_ASSERT_EQUAL_FATAL(gc_combustion_burn_to_T(&m, Tf, &air, T1, 1.0, 1500.0, 1.0, &b, NULL),
                          GC_OK);
    gc_exergy_env env;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_env_init(&env, 313.15, 99000.0, NULL), GC_OK);
    double ba = 0, bp = 0, bf = 0, sf = 0;
    CU_ASSERT_EQUAL_FATAL(gc_exergy_gas(&env, &air, T1, P1, &ba, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_exergy_gas(&env, &b.products, b.T_out_K, P1, &bp, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel(&env, &m, Tf, P1, &bf, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_exergy_fuel_s(&m, Tf, P1, &sf, NULL), GC_OK);
    double mf = b.far, mo = 1.0 + b.far;
    double sgen = mo * gc_gas_s_TP(&b.products, b.T_out_K, P1) - gc_gas_s_TP(&air, T1, P1) -
                  mf * sf;
    double lhs = ba + mf * bf - mo * bp;
    CHECK_REL(lhs, 313.15 * sgen, 1e-9, "Gouy-Stodola: exergy destroyed = T0 S_gen");
    printf("\n  burner 720 K -> 1500 K, far %.5f: destroyed %.2f kJ/kg air, %.1f %% of the "
           "fuel exergy", b.far, lhs * 1e-3, 100.0 * lhs / (mf * bf));
}

static void test_errors(void)
{
    gc_exergy_env env;
    gc_error e;
    CU_ASSERT_EQUAL(gc_exergy_env_init(&env, 298.15, 0.0, &e), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_exergy_env_init(&env, 150.0, 1e5, &e), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_exergy_env_init(&env, 288.15, 1e5, &e), GC_OK);
    gc_gas cold;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(&cold, 1005.0, 1.4, NULL), GC_OK);
    double b;
    CU_ASSERT_EQUAL(gc_exergy_gas(&env, &cold, 300.0, 1e5, &b, &e), GC_ERR_INVALID);
    gc_fuel m;
    gc_fuel_init_named(&m, "methane", NULL);
    CU_ASSERT_EQUAL(gc_exergy_fuel(&env, &m, 9000.0, 1e5, &b, &e), GC_ERR_RANGE);
}

int main(void)
{
    static const gc_test_case cases[] = {
        {"reference species (Szargut 1988)", test_reference_species},
        {"mixture chemical exergy of dry air", test_air_chemical},
        {"fuels vs JANAF dfG and Szargut's table", test_fuel_standard},
        {"liquid fuel correlation", test_liquid},
        {"fuel pressure exergy", test_fuel_pressure},
        {"burner Gouy-Stodola", test_burner_gouy_stodola},
        {"errors", test_errors},
        {NULL, NULL}};
    return gc_run_suite("exergy", cases);
}
