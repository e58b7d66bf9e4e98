/*
 * test_gas.c — unit tests of the gas models (gas.h): internal consistency
 * (cp = dh/dT = T ds°/dT, round trips of every inverse solve to 1e-10,
 * mixture = weighted sum of species), closed forms of the cold model, the
 * composition of dry and humid air, and every error path (no NaN ever).
 * Species data against published tables are in test_species.c.
 */
#include "check.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#include <math.h>
#include <string.h>

static const double test_T[] = { 200.0, 250.0, 298.15, 300.0, 450.0, 700.0, 999.0,
                                  1001.0, 1300.0, 1800.0, 2500.0, 3200.0, 4500.0, 5900.0 };
#define N_TEST_T (sizeof test_T / sizeof test_T[0])

static void test_air_composition(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    CU_ASSERT_STRING_EQUAL(air.label, "air");
    CU_ASSERT_EQUAL(air.kind, GC_GAS_MIXTURE);
    CU_ASSERT_EQUAL(air.n_species, 4);
    double sx = 0.0, sy = 0.0;
    for (int i = 0; i < air.n_species; i++) {
        sx += air.x[i];
        sy += air.y[i];
    }
    CHECK_ABS(sx, 1.0, 1e-14, "definition");
    CHECK_ABS(sy, 1.0, 1e-14, "definition");
    /* U.S. Standard Atmosphere 1976 gives M0 = 28.9644 kg/kmol (sea-level mean
     * molar mass, incl. trace gases); the four-gas renormalised value is close */
    CHECK_REL(air.M_kg_per_mol, 28.9644e-3, 2e-4, "U.S. Standard Atmosphere 1976, M0");
    /* cp of air at 300 K: 1.005 kJ/(kg K) (ideal-gas air tables, from memory) */
    CHECK_REL(gc_gas_cp_T(&air, 300.0), 1005.0, 3e-3, "air tables, from memory");
    CHECK_ABS(air.T_min_K, 200.0, 0.0, "NASA-9 data range of N2, O2, Ar, CO2");
    CHECK_ABS(air.T_max_K, 6000.0, 0.0, "cap of gas.c");
    /* h of air at 298.15 K: elements in their reference state, only CO2 adds
     * its formation enthalpy: x_CO2 * dHf(CO2) / M */
    double want = air.y[3] * (-393510.0) / gc_species_get(GC_SP_CO2)->M_kg_per_mol;
    CHECK_ABS(gc_gas_h_T(&air, GC_T_REF_K), want, 0.05, "NASA-9 dHf of CO2 (thermo.inp)");
}

static void test_humid_air(void)
{
    gc_gas air, ha;
    gc_gas_init_air(&air);
    CU_ASSERT_EQUAL(gc_gas_init_humid_air(&ha, 0.01, NULL), GC_OK);
    CU_ASSERT_STRING_EQUAL(ha.label, "humid air");
    CU_ASSERT_EQUAL(ha.n_species, 5);
    /* humidity ratio recovered from mass fractions: w = y_H2O / (1 - y_H2O) */
    CHECK_REL(ha.y[4] / (1.0 - ha.y[4]), 0.01, 1e-12, "definition of humidity ratio");
    /* enthalpy per kg dry air = h_da + w h_v (mass-weighted sum) */
    const gc_species *w = gc_species_get(GC_SP_H2O);
    for (size_t i = 0; i < N_TEST_T; i++) {
        double T = test_T[i];
        double h_sum = (gc_gas_h_T(&air, T) + 0.01 * gc_species_h_molar(w, T) / w->M_kg_per_mol) / 1.01;
        CHECK_REL(gc_gas_h_T(&ha, T), h_sum, 1e-11, "mass-weighted sum");
    }
    gc_gas dry;
    CU_ASSERT_EQUAL(gc_gas_init_humid_air(&dry, 0.0, NULL), GC_OK);
    CHECK_REL(gc_gas_cp_T(&dry, 500.0), gc_gas_cp_T(&air, 500.0), 1e-14, "w = 0 is dry air");
    CHECK_REL(gc_gas_s0_T(&dry, 500.0), gc_gas_s0_T(&air, 500.0), 1e-14, "w = 0 is dry air");
}

/* Every species as a pure gas, and air and a 7-species mixture. */
static void check_derivatives(const gc_gas *g)
{
    for (size_t i = 0; i < N_TEST_T; i++) {
        double T = test_T[i];
        if (T - 1.0 < g->T_min_K || T + 1.0 > g->T_max_K)
            continue;
        double dT = 1e-3 * T * 1e-2;
        double dh = (gc_gas_h_T(g, T + dT) - gc_gas_h_T(g, T - dT)) / (2 * dT);
        double ds = (gc_gas_s0_T(g, T + dT) - gc_gas_s0_T(g, T - dT)) / (2 * dT);
        double du = (gc_gas_u_T(g, T + dT) - gc_gas_u_T(g, T - dT)) / (2 * dT);
        double cp = gc_gas_cp_T(g, T);
        CHECK_REL(dh, cp, 2e-7, "cp = dh/dT (central difference)");
        CHECK_REL(T * ds, cp, 2e-7, "cp = T ds/dT (central difference)");
        CHECK_REL(du, gc_gas_cv_T(g, T), 2e-7, "cv = du/dT");
        CHECK_REL(gc_gas_k_T(g, T), cp / (cp - g->R_J_per_kgK), 1e-14, "k = cp/cv");
    }
}

static void test_consistency(void)
{
    gc_gas g;
    gc_gas_init_air(&g);
    check_derivatives(&g);
    for (int id = 0; id < GC_SP_COUNT; id++) {
        double one = 1.0;
        CU_ASSERT_EQUAL_FATAL(gc_gas_init_mixture(&g, 1, &id, &one, NULL), GC_OK);
        check_derivatives(&g);
        /* pure species: gas = species data per kg */
        const gc_species *sp = gc_species_get(id);
        double T = 0.5 * (g.T_min_K + g.T_max_K);
        CHECK_REL(gc_gas_cp_T(&g, T), gc_species_cp_molar(sp, T) / sp->M_kg_per_mol, 1e-13, sp->name);
        CHECK_REL(gc_gas_s0_T(&g, T), gc_species_s0_molar(sp, T) / sp->M_kg_per_mol, 1e-13, sp->name);
    }
}

static void test_mixture_sums(void)
{
    const int ids[] = { GC_SP_N2, GC_SP_O2, GC_SP_AR, GC_SP_CO2, GC_SP_H2O, GC_SP_CO, GC_SP_H2 };
    const double x[] = { 0.70, 0.08, 0.01, 0.09, 0.10, 0.01, 0.01 };
    gc_gas g;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_mixture(&g, 7, ids, x, NULL), GC_OK);
    check_derivatives(&g);
    double M = 0.0;
    for (int j = 0; j < 7; j++)
        M += x[j] * gc_species_get(ids[j])->M_kg_per_mol;
    CHECK_REL(g.M_kg_per_mol, M, 1e-14, "mole-weighted molar mass");
    for (size_t i = 0; i < N_TEST_T; i++) {
        double T = test_T[i];
        double cp = 0.0, h = 0.0, s = 0.0;
        for (int j = 0; j < 7; j++) {
            const gc_species *sp = gc_species_get(ids[j]);
            cp += x[j] * gc_species_cp_molar(sp, T);
            h += x[j] * gc_species_h_molar(sp, T);
            s += x[j] * (gc_species_s0_molar(sp, T) - GC_R_UNIVERSAL * log(x[j]));
        }
        CHECK_REL(gc_gas_cp_T(&g, T), cp / M, 1e-12, "mole-weighted sum");
        CHECK_ABS(gc_gas_h_T(&g, T), h / M, 1e-9 * fabs(h / M) + 1e-6, "mole-weighted sum");
        CHECK_REL(gc_gas_s0_T(&g, T), s / M, 1e-12, "mole-weighted sum incl. -R x ln x");
        /* s(T, P) = s° - R ln(P/P°) and v = RT/P */
        CHECK_REL(gc_gas_s_TP(&g, T, 2e6), s / M - g.R_J_per_kgK * log(20.0), 1e-12, "ideal gas");
        CHECK_REL(gc_gas_v_TP(&g, T, 2e6), g.R_J_per_kgK * T / 2e6, 1e-15, "ideal gas");
    }
}

static void check_round_trips(const gc_gas *g)
{
    for (size_t i = 0; i < N_TEST_T; i++) {
        double T = test_T[i], T2 = 0.0;
        if (T < g->T_min_K || T > g->T_max_K)
            continue;
        CU_ASSERT_EQUAL(gc_gas_T_from_h(g, gc_gas_h_T(g, T), &T2, NULL), GC_OK);
        CHECK_REL(T2, T, 1e-10, "round trip T -> h -> T");
        CU_ASSERT_EQUAL(gc_gas_T_from_u(g, gc_gas_u_T(g, T), &T2, NULL), GC_OK);
        CHECK_REL(T2, T, 1e-10, "round trip T -> u -> T");
        CU_ASSERT_EQUAL(gc_gas_T_from_s0(g, gc_gas_s0_T(g, T), &T2, NULL), GC_OK);
        CHECK_REL(T2, T, 1e-10, "round trip T -> s0 -> T");
        static const double ratios[] = { 0.05, 0.3, 1.0, 2.5, 12.0, 40.0 };
        for (size_t r = 0; r < sizeof ratios / sizeof ratios[0]; r++) {
            double Tb = 0.0, Tc = 0.0;
            int rc = gc_gas_T_isentropic_P(g, T, ratios[r], &Tb, NULL);
            if (rc == GC_ERR_RANGE)
                continue;
            CU_ASSERT_EQUAL(rc, GC_OK);
            /* entropy unchanged, and back again */
            CHECK_ABS(gc_gas_s_TP(g, Tb, 1e5 * ratios[r]), gc_gas_s_TP(g, T, 1e5), 1e-8,
                      "isentropic: s2 = s1");
            CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(g, Tb, 1.0 / ratios[r], &Tc, NULL), GC_OK);
            CHECK_REL(Tc, T, 1e-10, "isentropic round trip (pressure ratio)");
            rc = gc_gas_T_isentropic_v(g, T, ratios[r], &Tb, NULL);
            if (rc == GC_ERR_RANGE)
                continue;
            CU_ASSERT_EQUAL(rc, GC_OK);
            /* P2/P1 = (T2/T1) / (v2/v1) on the same isentrope */
            double P2 = 1e5 * (Tb / T) / ratios[r];
            CHECK_ABS(gc_gas_s_TP(g, Tb, P2), gc_gas_s_TP(g, T, 1e5), 1e-8, "isentropic: s2 = s1");
            CU_ASSERT_EQUAL(gc_gas_T_isentropic_v(g, Tb, 1.0 / ratios[r], &Tc, NULL), GC_OK);
            CHECK_REL(Tc, T, 1e-10, "isentropic round trip (volume ratio)");
            /* pr and vr ratios follow the isentrope */
            CHECK_REL(gc_gas_vr_T(g, Tb) / gc_gas_vr_T(g, T), ratios[r], 1e-9, "vr2/vr1 = v2/v1");
        }
    }
}

static void test_round_trips(void)
{
    gc_gas g;
    gc_gas_init_air(&g);
    check_round_trips(&g);
    CU_ASSERT_EQUAL(gc_gas_init_humid_air(&g, 0.03, NULL), GC_OK);
    check_round_trips(&g);
    CU_ASSERT_EQUAL(gc_gas_init_cold(&g, 1005.0, 1.4, NULL), GC_OK);
    check_round_trips(&g);
    const int ids[] = { GC_SP_N2, GC_SP_O2, GC_SP_CO2, GC_SP_H2O, GC_SP_C3H8 };
    const double x[] = { 0.6, 0.1, 0.1, 0.1, 0.1 };
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 5, ids, x, NULL), GC_OK);
    CHECK_ABS(g.T_min_K, 300.0, 0.0, "C3H8 data start at 300 K (thermo.inp 2021)");
    check_round_trips(&g);
}

/* Dense pseudo-random scan of T over the whole range, including the
 * breakpoint at 1000 K itself, for air and a hot products-like mixture. */
static void test_solver_scan(void)
{
    gc_gas gs[2];
    gc_gas_init_air(&gs[0]);
    const int ids[] = { GC_SP_N2, GC_SP_O2, GC_SP_AR, GC_SP_CO2, GC_SP_H2O };
    const double x[] = { 0.72, 0.05, 0.01, 0.09, 0.13 };
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_mixture(&gs[1], 5, ids, x, NULL), GC_OK);
    unsigned long long st = 88172645463325252ull;
    double worst = 0.0;
    int bad = 0;
    for (int k = 0; k < 2; k++) {
        const gc_gas *g = &gs[k];
        for (int i = 0; i < 4000; i++) {
            st ^= st << 13;
            st ^= st >> 7;
            st ^= st << 17;
            double u = (double)(st >> 11) / 9007199254740992.0;
            double T = i == 0 ? 1000.0 : (i == 1 ? g->T_min_K : (i == 2 ? g->T_max_K
                       : g->T_min_K + u * (g->T_max_K - g->T_min_K)));
            double T2 = 0.0;
            if (gc_gas_T_from_h(g, gc_gas_h_T(g, T), &T2, NULL) != GC_OK)
                bad++;
            worst = fmax(worst, fabs(T2 / T - 1.0));
            if (gc_gas_T_from_s0(g, gc_gas_s0_T(g, T), &T2, NULL) != GC_OK)
                bad++;
            worst = fmax(worst, fabs(T2 / T - 1.0));
        }
    }
    CU_ASSERT_EQUAL(bad, 0);
    CHECK_ABS(worst, 0.0, 1e-10, "round trip over the whole range");
}

static void test_pr_isentrope(void)
{
    gc_gas g;
    gc_gas_init_air(&g);
    double T2 = 0.0;
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 300.0, 10.0, &T2, NULL), GC_OK);
    CHECK_REL(gc_gas_pr_T(&g, T2) / gc_gas_pr_T(&g, 300.0), 10.0, 1e-10, "pr2/pr1 = P2/P1");
    CHECK_REL(gc_gas_pr_T(&g, GC_T_REF_K), 1.0, 1e-14, "pr(T_ref) = 1");
    CHECK_REL(gc_gas_vr_T(&g, GC_T_REF_K), 1.0, 1e-14, "vr(T_ref) = 1");
    /* Air at 300 K, pressure ratio 10: ideal-gas air tables (Keenan-Kaye
     * style, from memory) give pr(300 K) = 1.3860 and pr = 13.50 at 570 K,
     * 14.38 at 580 K, so T2 = 574.1 K by linear interpolation. The tables'
     * rounding and interpolation justify 0.5 K. */
    CHECK_ABS(T2, 574.1, 0.5, "ideal-gas air tables, from memory");
}

static void test_cold(void)
{
    gc_gas g;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(&g, 1005.0, 1.4, NULL), GC_OK);
    CHECK_REL(g.R_J_per_kgK, 1005.0 * 0.4 / 1.4, 1e-15, "R = cp (k-1)/k");
    CHECK_REL(gc_gas_cv_T(&g, 700.0), 1005.0 / 1.4, 1e-15, "cv = cp/k");
    CHECK_REL(gc_gas_k_T(&g, 1500.0), 1.4, 1e-14, "constant k");
    CHECK_REL(gc_gas_h_T(&g, 500.0), 1005.0 * 500.0, 1e-15, "h = cp T");
    double T2 = 0.0;
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 300.0, 10.0, &T2, NULL), GC_OK);
    CHECK_REL(T2, 300.0 * pow(10.0, 0.4 / 1.4), 1e-14, "T2/T1 = r^((k-1)/k), closed form");
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_v(&g, 300.0, 1.0 / 9.0, &T2, NULL), GC_OK);
    CHECK_REL(T2, 300.0 * pow(9.0, 0.4), 1e-14, "T2/T1 = (v1/v2)^(k-1), closed form");
    CU_ASSERT_EQUAL(gc_gas_T_polytropic_P(&g, 300.0, 8.0, 1.3, &T2, NULL), GC_OK);
    CHECK_REL(T2, 300.0 * pow(8.0, 0.3 / 1.3), 1e-14, "polytropic, closed form");
    CU_ASSERT_EQUAL(gc_gas_mix_T(&g, 1.0, 300.0, 3.0, 500.0, &T2, NULL), GC_OK);
    CHECK_REL(T2, 450.0, 1e-14, "mixing at constant cp: mass-weighted T");
}

static void test_mix(void)
{
    gc_gas air, ha, steam, out;
    gc_gas_init_air(&air);
    int h2o = GC_SP_H2O;
    double one = 1.0;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_mixture(&steam, 1, &h2o, &one, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_humid_air(&ha, 0.02, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_gas_mix(&air, 1.0, &steam, 0.02, &out, NULL), GC_OK);
    CHECK_REL(gc_gas_cp_T(&out, 800.0), gc_gas_cp_T(&ha, 800.0), 1e-12, "air + vapour = humid air");
    CHECK_REL(gc_gas_s0_T(&out, 800.0), gc_gas_s0_T(&ha, 800.0), 1e-12, "air + vapour = humid air");
    /* aliasing allowed */
    CU_ASSERT_EQUAL(gc_gas_mix(&air, 1.0, &air, 1.0, &air, NULL), GC_OK);
    CU_ASSERT_STRING_EQUAL(air.label, "air");
    double T = 0.0;
    CU_ASSERT_EQUAL(gc_gas_mix_T(&ha, 1.0, 300.0, 1.0, 1500.0, &T, NULL), GC_OK);
    CHECK_REL(gc_gas_h_T(&ha, T), 0.5 * (gc_gas_h_T(&ha, 300.0) + gc_gas_h_T(&ha, 1500.0)), 1e-12,
              "energy balance of mixing");
}

static void test_errors(void)
{
    gc_gas g, cold;
    gc_error e;
    gc_gas_init_air(&g);
    double T = -1.0;
    CU_ASSERT_EQUAL(gc_gas_check_T(&g, 150.0, "/T", &e), GC_ERR_RANGE);
    CU_ASSERT_STRING_EQUAL(e.field, "/T");
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "200"));
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "6000"));
    CU_ASSERT_EQUAL(gc_gas_check_T(&g, 6000.5, "/T", &e), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_check_T(&g, NAN, "/T", &e), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_check_T(&g, INFINITY, "/T", NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_check_T(&g, 200.0, "/T", NULL), GC_OK);
    CU_ASSERT_EQUAL(gc_gas_check_P(0.0, "/P", &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/P");
    CU_ASSERT_EQUAL(gc_gas_check_P(-5.0, "/P", NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_check_P(NAN, "/P", NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_check_P(INFINITY, "/P", NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_check_P(101325.0, "/P", NULL), GC_OK);
    /* inverse solves out of range: the message names the range, T untouched */
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&g, 1e9, &T, &e), GC_ERR_RANGE);
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "200..6000 K"));
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&g, -1e9, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&g, NAN, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_from_u(&g, INFINITY, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_from_s0(&g, -1e5, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 300.0, 1e6, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 300.0, 0.0, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 300.0, NAN, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&g, 100.0, 2.0, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_v(&g, 300.0, -1.0, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_v(&g, 300.0, 1e-6, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_polytropic_P(&g, 300.0, 2.0, 0.0, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_polytropic_P(&g, 300.0, 2.0, NAN, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_T_polytropic_P(&g, 300.0, 1e-9, 1.3, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_mix_T(&g, -1.0, 300.0, 1.0, 400.0, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_mix_T(&g, 0.0, 300.0, 0.0, 400.0, &T, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_mix_T(&g, 1.0, 300.0, 1.0, 7000.0, &T, NULL), GC_ERR_RANGE);
    CHECK_ABS(T, -1.0, 0.0, "out-parameter untouched on error");
    /* construction errors */
    CU_ASSERT_EQUAL(gc_gas_init_cold(&cold, 1005.0, 1.0, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/k");
    CU_ASSERT_EQUAL(gc_gas_init_cold(&cold, 50.0, 1.4, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_init_cold(&cold, NAN, 1.4, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_init_cold(&cold, 1005.0, 1.8, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_init_cold(&cold, 1005.0, 1.4, NULL), GC_OK);
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&cold, 1005.0 * 30000.0, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&cold, 300.0, 1e30, &T, NULL), GC_ERR_RANGE);
    CU_ASSERT_EQUAL(gc_gas_mix(&cold, 1.0, &g, 1.0, &cold, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_init_humid_air(&g, -0.1, NULL), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_gas_init_humid_air(&g, NAN, NULL), GC_ERR_INVALID);
    const int ids[] = { GC_SP_N2, GC_SP_O2 };
    const double bad_sum[] = { 0.7, 0.2 };
    const double neg[] = { 1.2, -0.2 };
    const double nan_x[] = { NAN, 0.5 };
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 2, ids, bad_sum, &e), GC_ERR_COMPOSITION);
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "sum"));
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 2, ids, neg, NULL), GC_ERR_COMPOSITION);
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 2, ids, nan_x, NULL), GC_ERR_COMPOSITION);
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 0, ids, bad_sum, NULL), GC_ERR_COMPOSITION);
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, GC_GAS_MAX_SPECIES + 1, ids, bad_sum, NULL),
                    GC_ERR_COMPOSITION);
    const int bad_ids[] = { GC_SP_N2, 99 };
    const double ok_x[] = { 0.5, 0.5 };
    CU_ASSERT_EQUAL(gc_gas_init_mixture(&g, 2, bad_ids, ok_x, NULL), GC_ERR_UNKNOWN);
    /* g untouched by failed inits: still humid-air-free dry air */
    CU_ASSERT_STRING_EQUAL(g.label, "air");
}

/* Scans every property over and beyond the range for NaN-free results. */
static void test_no_nan(void)
{
    gc_gas g;
    gc_gas_init_air(&g);
    for (double T = g.T_min_K; T <= g.T_max_K; T += 7.3) {
        CU_ASSERT(isfinite(gc_gas_h_T(&g, T)) && isfinite(gc_gas_s0_T(&g, T)) &&
                  isfinite(gc_gas_cp_T(&g, T)) && isfinite(gc_gas_pr_T(&g, T)));
        CU_ASSERT(gc_gas_cp_T(&g, T) > g.R_J_per_kgK);
    }
    for (double h = -1e8; h <= 1e8; h += 1.7e6) {
        double T = 0.0;
        int rc = gc_gas_T_from_h(&g, h, &T, NULL);
        CU_ASSERT(rc == GC_OK || rc == GC_ERR_RANGE);
        if (rc == GC_OK)
            CU_ASSERT(T >= g.T_min_K && T <= g.T_max_K);
    }
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "air composition", test_air_composition },
        { "humid air", test_humid_air },
        { "cp = dh/dT = T ds/dT", test_consistency },
        { "mixture = weighted sums", test_mixture_sums },
        { "inverse solves round-trip", test_round_trips },
        { "solver scan over the range", test_solver_scan },
        { "relative pressure on an isentrope", test_pr_isentrope },
        { "cold-air standard closed forms", test_cold },
        { "mixing", test_mix },
        { "error paths", test_errors },
        { "no NaN", test_no_nan },
        { NULL, NULL },
    };
    return gc_run_suite("gas", cases);
}
