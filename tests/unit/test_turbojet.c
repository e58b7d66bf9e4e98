/*
 * test_turbojet.c — the turbojet preset (turbojet.h): the ideal turbojet's
 * closed-form specific thrust and efficiencies (cold-air model, no losses),
 * the convergent nozzle's critical pressure ratio and choking, the shaft
 * balance, fuel figures (mass balance, TSFC, efficiencies), the flight
 * condition from the U.S. Standard Atmosphere 1976, station states,
 * validation and warnings. The source of every expected value is named
 * beside its check.
 *
 * Ideal turbojet (constant cp and k, fuel mass neglected, expanded nozzle):
 * the standard ideal-cycle analysis of propulsion texts (e.g. J. D. Mattingly,
 * Elements of Propulsion: Gas Turbines and Rockets, the ideal turbojet; from
 * memory):
 *   tau_r = 1 + (k-1)/2 M0^2, tau_c = pi_c^((k-1)/k), tau_l = T_t4 / T0,
 *   tau_t = 1 - (tau_r / tau_l)(tau_c - 1),
 *   V9/a0 = sqrt( 2/(k-1) tau_l/(tau_r tau_c) (tau_r tau_c tau_t - 1) ),
 *   F/m = a0 (V9/a0 - M0), eta_th = 1 - 1/(tau_r tau_c),
 *   eta_p = 2 M0 / (V9/a0 + M0).
 */
#include "check.h"
#include "gascycle/turbojet.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define SRC_IDEAL "ideal turbojet, closed-form cycle analysis (Mattingly, from memory)"

static gc_turbojet_result R; /* large: static */
static gc_turbojet_result R2;

static const double CP = 1004.0, K = 1.4;

static void cold_input(gc_turbojet_input *in, double T0, double P0, double M0, double pic,
                       double Tt4)
{
    gc_turbojet_input_init(in);
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(&in->gas, CP, K, NULL), GC_OK);
    in->has_gas = 1;
    in->site.has_temperature = 1;
    in->site.T_K = T0;
    in->site.has_pressure = 1;
    in->site.P_Pa = P0;
    in->flight_mach_number = M0;
    in->pressure_ratio = pic;
    in->turbine_inlet_temperature = Tt4;
}

static int eval(const gc_turbojet_input *in, gc_turbojet_result *r)
{
    gc_error e;
    int rc = gc_turbojet_evaluate(in, r, &e);
    if (rc != GC_OK)
        fprintf(stderr, "\n  evaluate: %d %s: %s\n", rc, e.field, e.message);
    return rc;
}

static void test_ideal_closed_form(void)
{
    /* T0, P0 (any consistent ambient), M0, pi_c, T_t4 */
    const double cases[][5] = {
        { 216.65, 22632.0, 0.85, 20.0, 1500.0 },
        { 288.15, 101325.0, 0.0, 12.0, 1400.0 },
        { 216.65, 12112.0, 2.0, 8.0, 1700.0 },
        { 250.0, 50000.0, 0.5, 30.0, 1600.0 },
    };
    const double Rg = CP * (K - 1.0) / K;
    gc_turbojet_input in;
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        const double *c = cases[i];
        cold_input(&in, c[0], c[1], c[2], c[3], c[4]);
        CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
        double a0 = sqrt(K * Rg * c[0]), M0 = c[2];
        double tr = 1.0 + 0.5 * (K - 1.0) * M0 * M0, tc = pow(c[3], (K - 1.0) / K);
        double tl = c[4] / c[0], tt = 1.0 - tr / tl * (tc - 1.0);
        double v9a0 = sqrt(2.0 / (K - 1.0) * tl / (tr * tc) * (tr * tc * tt - 1.0));
        CHECK_REL(R.specific_thrust, a0 * (v9a0 - M0), 1e-9, SRC_IDEAL ": F/m = a0 (V9/a0 - M0)");
        CHECK_REL(R.exit_velocity, a0 * v9a0, 1e-9, SRC_IDEAL ": V9");
        CHECK_REL(R.thermal_efficiency, 1.0 - 1.0 / (tr * tc), 1e-9,
                  SRC_IDEAL ": eta_th = 1 - 1/(tau_r tau_c)");
        if (M0 > 0.0) {
            CHECK_REL(R.propulsive_efficiency, 2.0 * M0 / (v9a0 + M0), 1e-9,
                      SRC_IDEAL ": eta_p = 2 M0 / (V9/a0 + M0)");
            CHECK_REL(R.overall_efficiency, R.thermal_efficiency * R.propulsive_efficiency,
                      1e-12, "eta_o = eta_th eta_p (definition)");
        } else {
            CU_ASSERT(R.propulsive_efficiency == 0.0 && R.overall_efficiency == 0.0);
        }
        CHECK_ABS(R.flight_velocity, M0 * a0, 1e-12 * a0, "V0 = M0 a0");
        CHECK_REL(R.ideal_specific_thrust, R.specific_thrust, 1e-12, "ideal = actual here");
        CU_ASSERT(R.cycle.ideal_is_actual == 1);
        CU_ASSERT(R.cycle.actual.checks.energy_rel <= GC_CYCLE_TOL_ENERGY);
        CU_ASSERT(R.cycle.actual.checks.areas_done);
        /* total states: the free stream's T_total = T0 tau_r; the nozzle keeps it */
        const gc_cycle_state *s0 = &R.cycle.actual.states[0];
        const gc_cycle_state *s9 = &R.cycle.actual.states[R.stations.nozzle_exit];
        const gc_cycle_state *s5 = &R.cycle.actual.states[R.stations.turbine_exit];
        CHECK_REL(s0->T_total_K, c[0] * tr, 1e-9, SRC_IDEAL ": T_t0 = T0 tau_r");
        CHECK_REL(s9->T_total_K, s5->T_total_K, 1e-9, "adiabatic nozzle: T_total kept");
        CHECK_REL(s5->T_total_K, c[4] * tt, 1e-9, SRC_IDEAL ": T_t5 = T_t4 tau_t");
        CHECK_REL(R.turbine_work, R.compressor_work, 1e-9, "shaft balance");
    }
}

/* Polytropic efficiencies, constant cp and k: compression T2/T1 =
 * pi^((k-1)/(k eta_p)), expansion P_out/P_in = (T_out/T_in)^(k/((k-1) eta_p))
 * (the small-stage efficiency relations of gas-turbine texts). */
static void test_polytropic(void)
{
    const double a = (K - 1.0) / K;
    gc_turbojet_input in;
    cold_input(&in, 288.15, 101325.0, 0.0, 12.0, 1400.0);
    in.compressor_efficiency = 0.9;
    in.turbine_efficiency = 0.88;
    in.polytropic_efficiency = 1;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    const gc_cycle_state *s2 = &R.cycle.actual.states[R.stations.compressor_inlet];
    const gc_cycle_state *s3 = &R.cycle.actual.states[R.stations.compressor_exit];
    const gc_cycle_state *s4 = &R.cycle.actual.states[R.stations.turbine_inlet];
    const gc_cycle_state *s5 = &R.cycle.actual.states[R.stations.turbine_exit];
    CHECK_REL(s3->T_K / s2->T_K, pow(12.0, a / 0.9), 1e-9, "polytropic compression, cold air");
    CHECK_REL(s5->P_Pa / s4->P_Pa, pow(s5->T_K / s4->T_K, 1.0 / (a * 0.88)), 1e-9,
              "polytropic expansion, cold air");
    CHECK_REL(s4->T_K - s5->T_K, s3->T_K - s2->T_K, 1e-9, "shaft balance, cold air");
}

/* Convergent nozzle, constant cp and k: critical pressure ratio
 * P_t/P* = [1 - ((k-1)/(k+1)) / eta_n]^(-k/(k-1)) (H. I. H. Saravanamuttoo,
 * G. F. C. Rogers, H. Cohen, Gas Turbine Theory, the propelling nozzle;
 * from memory); eta_n = 1 gives ((k+1)/2)^(k/(k-1)). The exit is sonic when
 * choked (definition of the critical state). */
static void test_convergent_nozzle(void)
{
    const double etas[] = { 1.0, 0.95, 0.9 };
    gc_turbojet_input in;
    for (size_t i = 0; i < sizeof etas / sizeof etas[0]; i++) {
        cold_input(&in, 216.65, 22632.0, 0.85, 20.0, 1500.0);
        in.nozzle = GC_NOZZLE_CONVERGENT;
        in.nozzle_efficiency = etas[i];
        CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
        CU_ASSERT_FATAL(R.choked);
        const gc_cycle_state *sn = &R.cycle.actual.states[R.stations.nozzle_exit - 1];
        double ratio = pow(1.0 - (K - 1.0) / (K + 1.0) / etas[i], -K / (K - 1.0));
        CHECK_REL(sn->P_total_Pa / R.critical_pressure, ratio, 1e-9,
                  "Saravanamuttoo et al., Gas Turbine Theory: critical pressure ratio");
        CHECK_REL(R.exit_pressure, R.critical_pressure, 1e-12, "choked: P9 = P*");
        CHECK_REL(R.exit_mach_number, 1.0, 1e-9, "choked exit is sonic");
        CHECK_REL(R.exit_temperature, 2.0 * sn->T_total_K / (K + 1.0), 1e-9,
                  "sonic: T* = 2 T_t / (k + 1)");
        /* thrust with the pressure term, f = 0: F = V9 - V0 + (P9 - P0) v9 / V9 */
        const gc_cycle_state *s9 = &R.cycle.actual.states[R.stations.nozzle_exit];
        CHECK_REL(R.specific_thrust,
                  R.exit_velocity - R.flight_velocity +
                      (R.exit_pressure - 22632.0) * s9->v_m3_per_kg / R.exit_velocity,
                  1e-12, "momentum balance with pressure thrust");
        CU_ASSERT(R.pressure_thrust > 0.0);
        CU_ASSERT(R.specific_thrust < R.ideal_specific_thrust);
        CU_ASSERT(R.cycle.actual.checks.energy_rel <= GC_CYCLE_TOL_ENERGY);
    }
    /* a low nozzle pressure ratio: not choked, exit at ambient, subsonic */
    cold_input(&in, 288.15, 101325.0, 0.0, 2.0, 700.0);
    in.nozzle = GC_NOZZLE_CONVERGENT;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    CU_ASSERT(!R.choked);
    CHECK_REL(R.exit_pressure, 101325.0, 1e-12, "unchoked: P9 = P0");
    CU_ASSERT(R.exit_mach_number < 1.0);
    CU_ASSERT(R.critical_pressure < 101325.0);
    CHECK_ABS(R.pressure_thrust, 0.0, 1e-9, "no pressure thrust at P9 = P0");
}

/* A choked convergent nozzle whose exit pressure is more than 10 times the
 * ambient (issue 10: refused as a "fractional pressure loss" on /nozzle). The
 * jet's free expansion to ambient is a throttle at any ratio, not a bounded
 * loss. Cold air, ideal components, no fuel mass, flight at Mach 1 in the
 * 216.65 K / 13.64 kPa stratosphere, pi_c 26.9, T_t4 1750 K: the ideal-cycle
 * relations above up to the turbine exit, then the sonic exit T9 = 2 T_t5/(k+1),
 * P9 = P_t5 (2/(k+1))^(k/(k-1)), V9 = sqrt(k R T9) (Saravanamuttoo et al.,
 * from memory) and F/m = V9 - V0 + (P9 - P0) v9 / V9. With NASA-9 gases and
 * propane (the case at 14243 m) the specific thrust is "about 794 N s/kg"
 * by the independent calculation. */
static void test_choked_high_pressure_ratio(void)
{
    gc_turbojet_input in;
    const double T0 = 216.65, P0 = 13640.0, M0 = 1.0, pic = 26.9, Tt4 = 1750.0;
    cold_input(&in, T0, P0, M0, pic, Tt4);
    in.nozzle = GC_NOZZLE_CONVERGENT;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    double Rg = CP * (K - 1.0) / K, e = K / (K - 1.0);
    double V0 = M0 * sqrt(K * Rg * T0), tr = 1.0 + 0.5 * (K - 1.0) * M0 * M0;
    double Tt2 = T0 * tr, Pt2 = P0 * pow(tr, e);
    double Tt3 = Tt2 * pow(pic, 1.0 / e), Pt4 = Pt2 * pic;
    double Tt5 = Tt4 - (Tt3 - Tt2), Pt5 = Pt4 * pow(Tt5 / Tt4, e);
    double T9 = 2.0 * Tt5 / (K + 1.0), P9 = Pt5 * pow(2.0 / (K + 1.0), e);
    double V9 = sqrt(K * Rg * T9), F = V9 - V0 + (P9 - P0) * (Rg * T9 / P9) / V9;
    CU_ASSERT_FATAL(R.choked);
    CU_ASSERT(P9 / P0 > 10.0);
    CHECK_REL(R.exit_pressure, P9, 1e-8, "cold air, sonic exit of the ideal engine");
    CHECK_REL(R.specific_thrust, F, 1e-8, "cold air, momentum balance with pressure thrust");
    CU_ASSERT(R.cycle.actual.checks.energy_rel <= GC_CYCLE_TOL_ENERGY);

    gc_turbojet_input_init(&in);
    in.flight_mach_number = 1.0;
    in.has_altitude = 1;
    in.altitude = 14243.0;
    in.pressure_ratio = 26.9;
    in.turbine_inlet_temperature = 1527.1;
    in.heat_mode = GC_TURBOJET_FUEL;
    in.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "propane", NULL), GC_OK);
    in.nozzle = GC_NOZZLE_CONVERGENT;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    CU_ASSERT(R.choked);
    CU_ASSERT(R.exit_pressure / R.site.P_Pa > 10.0);
    CHECK_ABS(R.specific_thrust, 794.0, 1.0, "issue 10: about 794 N s/kg (independent figure)");
}

/* Losses and the shaft balance with a real fuel (static engine at sea level). */
static void test_fuel_static(void)
{
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    in.heat_mode = GC_TURBOJET_FUEL;
    in.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "methane", NULL), GC_OK);
    in.pressure_ratio = 16.0;
    in.turbine_inlet_temperature = 1450.0;
    in.compressor_efficiency = 0.86;
    in.turbine_efficiency = 0.89;
    in.nozzle_efficiency = 0.97;
    in.combustor_pressure_loss = 0.05;
    in.combustor_efficiency = 0.99;
    in.mechanical_efficiency = 0.98;
    in.inlet_pressure_recovery = 0.98;
    in.nozzle = GC_NOZZLE_CONVERGENT;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    CHECK_REL(R.turbine_work, R.compressor_work / 0.98, 1e-9,
              "shaft balance w_t = w_c / eta_mech (turbojet.h)");
    const gc_cycle_state *s9 = &R.cycle.actual.states[R.stations.nozzle_exit];
    CHECK_REL(s9->mass_ratio, 1.0 + R.fuel_air_ratio, 1e-12, "mass balance air + fuel");
    CHECK_REL(R.tsfc, R.fuel_air_ratio / R.specific_thrust, 1e-12, "TSFC = f / (F/m)");
    CHECK_REL(R.tsfc_mg_per_Ns, 1e6 * R.tsfc, 1e-12, "1 kg = 1e6 mg");
    CHECK_REL(R.heat_in, R.fuel_air_ratio * in.fuel.LHV_J_per_kg, 1e-12, "f LHV");
    CU_ASSERT(R.choked);
    CU_ASSERT(R.cycle.actual.checks.energy_rel <= GC_CYCLE_TOL_ENERGY);
    CU_ASSERT(R.specific_thrust < R.ideal_specific_thrust);
    CU_ASSERT(R.thermal_efficiency < R.ideal_thermal_efficiency);
    /* recovery: the compressor inlet total pressure is 0.98 of the ambient (static) */
    CHECK_REL(R.cycle.actual.states[R.stations.compressor_inlet].P_total_Pa, 0.98 * 101325.0,
              1e-9, "inlet pressure recovery (definition)");
    printf("\n  static, methane, pi_c 16, TIT 1450 K: F/m %.2f N s/kg, f %.5f, TSFC %.2f mg/(N s), "
           "eta_th %.4f, choked %d, P9 %.0f Pa",
           R.specific_thrust, R.fuel_air_ratio, R.tsfc_mg_per_Ns, R.thermal_efficiency, R.choked,
           R.exit_pressure);
}

/* In flight with a fuel. */
static void test_fuel_flight(void)
{
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    in.heat_mode = GC_TURBOJET_FUEL;
    in.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "methane", NULL), GC_OK);
    in.has_altitude = 1;
    in.altitude = 11000.0;
    in.flight_mach_number = 0.85;
    in.pressure_ratio = 20.0;
    in.turbine_inlet_temperature = 1500.0;
    in.compressor_efficiency = 0.87;
    in.turbine_efficiency = 0.9;
    in.diffuser_efficiency = 0.95;
    in.afterburner_temperature = 2000.0;
    in.nozzle = GC_NOZZLE_CONVERGENT;
    gc_error e;
    int rc = gc_turbojet_evaluate(&in, &R, &e);
    if (rc != GC_OK)
        fprintf(stderr, "fuel in flight: %s\n", e.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CHECK_REL(R.site.P_Pa, 22699.960739233353, 1e-6, "USSA 1976 at 11 km, python3-fluids 1.0.22");
    CHECK_REL(R.site.T_K, 216.77351270445553, 1e-6, "USSA 1976 at 11 km, python3-fluids 1.0.22");
    CHECK_REL(R.overall_efficiency, R.thermal_efficiency * R.propulsive_efficiency, 1e-12,
              "eta_o = eta_th eta_p (definition)");
    CU_ASSERT(R.cycle.actual.checks.energy_rel <= GC_CYCLE_TOL_ENERGY);
    CU_ASSERT(R.cycle.actual.states[0].V_m_per_s > 200.0); /* really in flight */
}

/* Flight condition: USSA 1976 at altitude (python3-fluids table,
 * tests/reference/atmosphere_ussa1976_fluids.csv), dry air by default, and
 * V0 = M0 sqrt(k R T0) with the air model's k(T0). */
static void test_flight_condition(void)
{
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    in.has_altitude = 1;
    in.altitude = 11000.0;
    in.flight_mach_number = 0.8;
    in.compressor_efficiency = 0.87;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    CHECK_REL(R.site.P_Pa, 22699.960739233353, 1e-6, "USSA 1976 at 11 km, python3-fluids 1.0.22");
    CHECK_REL(R.site.T_K, 216.77351270445553, 1e-6, "USSA 1976 at 11 km, python3-fluids 1.0.22");
    CU_ASSERT(R.site.W_kg_per_kg == 0.0);
    const gc_gas *g = &R.cycle.actual.gases[0];
    CHECK_REL(R.speed_of_sound, sqrt(gc_gas_k_T(g, R.site.T_K) * g->R_J_per_kgK * R.site.T_K),
              1e-12, "a = sqrt(k R T)");
    CHECK_REL(R.flight_velocity, 0.8 * R.speed_of_sound, 1e-12, "V0 = M0 a0");
    /* the diffuser brings the air (effectively) to rest at the free-stream total state */
    const gc_cycle_state *s1 = &R.cycle.actual.states[R.stations.diffuser_exit];
    CHECK_REL(s1->T_total_K, R.cycle.actual.states[0].T_total_K, 1e-9, "adiabatic diffuser");
    CU_ASSERT(s1->V_m_per_s < 1.0);
    /* altitude given twice */
    in.site.has_altitude = 1;
    in.site.altitude_m = 11000.0;
    gc_error e;
    CU_ASSERT_EQUAL(gc_turbojet_evaluate(&in, &R, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/altitude");
}

static void expect_error(const gc_turbojet_input *in, int code, const char *field)
{
    gc_error e;
    int rc = gc_turbojet_evaluate(in, &R2, &e);
    if (rc != code || strcmp(e.field, field) != 0)
        fprintf(stderr, "\n  expected %d at %s, got %d at %s: %s\n", code, field, rc, e.field,
                e.message);
    CU_ASSERT_EQUAL(rc, code);
    CU_ASSERT_STRING_EQUAL(e.field, field);
}

static void test_validation(void)
{
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    in.flight_mach_number = -1.0;
    expect_error(&in, GC_ERR_INVALID, "/flight_mach_number");
    in.flight_mach_number = NAN;
    expect_error(&in, GC_ERR_INVALID, "/flight_mach_number");
    gc_turbojet_input_init(&in);
    in.inlet_pressure_recovery = 0.0;
    expect_error(&in, GC_ERR_INVALID, "/inlet_pressure_recovery");
    gc_turbojet_input_init(&in);
    in.nozzle = (gc_turbojet_nozzle)7;
    expect_error(&in, GC_ERR_INVALID, "/nozzle");
    gc_turbojet_input_init(&in);
    in.heat_mode = GC_TURBOJET_FUEL;
    expect_error(&in, GC_ERR_INVALID, "/fuel");
    gc_turbojet_input_init(&in);
    in.pressure_ratio = 1e9;
    expect_error(&in, GC_ERR_INVALID, "/pressure_ratio");
    gc_turbojet_input_init(&in);
    in.has_altitude = 1;
    in.altitude = 1e7;
    expect_error(&in, GC_ERR_INVALID, "/altitude");   /* the table's bound, 86 km */
    /* turbine inlet below the compressor exit */
    gc_turbojet_input_init(&in);
    in.pressure_ratio = 40.0;
    in.turbine_inlet_temperature = 700.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/turbine_inlet_temperature");
    /* a poor turbine that cannot leave pressure for the nozzle */
    gc_turbojet_input_init(&in);
    in.pressure_ratio = 30.0;
    in.turbine_inlet_temperature = 1000.0;
    in.compressor_efficiency = 0.6;
    in.turbine_efficiency = 0.6;
    gc_error e;
    int rc = gc_turbojet_evaluate(&in, &R2, &e);
    CU_ASSERT(rc == GC_ERR_INFEASIBLE);
    CU_ASSERT(strcmp(e.field, "/pressure_ratio") == 0 ||
              strcmp(e.field, "/turbine_inlet_temperature") == 0);
    /* afterburner below the turbine exit */
    gc_turbojet_input_init(&in);
    in.afterburner_temperature = 500.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/afterburner_temperature");
    /* the list form */
    gc_error errs[GC_TURBOJET_MAX_ERRORS];
    int n = 0;
    gc_turbojet_input_init(&in);
    in.nozzle_efficiency = 2.0;
    in.mechanical_efficiency = 0.0;
    CU_ASSERT_EQUAL(gc_turbojet_validate(&in, errs, GC_TURBOJET_MAX_ERRORS, &n), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(n, 2);
}

static void test_warnings(void)
{
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    in.turbine_inlet_temperature = 1700.0;
    in.compressor_efficiency = 0.9;
    CU_ASSERT_EQUAL_FATAL(eval(&in, &R), GC_OK);
    int tit = 0, ideal = 0;
    for (int i = 0; i < R.n_warnings; i++) {
        tit |= R.warnings[i].field == GC_TF_TURBINE_INLET_TEMPERATURE;
        ideal |= R.warnings[i].field < 0;
    }
    CU_ASSERT(tit && !ideal);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "ideal turbojet closed form", test_ideal_closed_form },
        { "polytropic efficiencies", test_polytropic },
        { "convergent nozzle: critical pressure, choking", test_convergent_nozzle },
        { "choked nozzle above 10 times ambient", test_choked_high_pressure_ratio },
        { "fuel, static: shaft balance, mass balance, TSFC", test_fuel_static },
        { "fuel, in flight", test_fuel_flight },
        { "flight condition (USSA 1976)", test_flight_condition },
        { "validation", test_validation },
        { "warnings", test_warnings },
        { NULL, NULL },
    };
    return gc_run_suite("turbojet", cases);
}
