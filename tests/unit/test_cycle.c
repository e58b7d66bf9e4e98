/*
 * test_cycle.c — checks of the cycle engine (cycle.h) and its paths
 * (path.h) on chains built directly: steady-flow relations against their
 * cold-air closed forms (compressor and turbine with isentropic and
 * polytropic efficiency, simple and regenerative Brayton, polytropic heat),
 * heat-exchanger iteration, pressure losses, kinetic steps, fuel addition
 * (energy closure with combustion.h), the path API, and the error paths.
 * Closed forms are those of any engineering-thermodynamics text; where a
 * value is derived here from a definition, the check says so.
 */
#include "check.h"

#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/path.h"

#include <math.h>
#include <string.h>

static gc_cycle_result RES;

static gc_gas cold(double k)
{
    gc_gas g;
    gc_error e;
    CU_ASSERT_EQUAL(gc_gas_init_cold(&g, 1005.0, k, &e), GC_OK);
    return g;
}

static const gc_cycle_run *eval(const gc_cycle *c)
{
    gc_error e;
    int rc = gc_cycle_evaluate(c, &RES, &e);
    if (rc != GC_OK)
        fprintf(stderr, "evaluate: rc %d %s: %s\n", rc, e.field, e.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    return &RES.actual;
}

static void balances(const gc_cycle_run *run)
{
    const gc_cycle_checks *ck = &run->checks;
    const gc_cycle_summary *sm = &run->summary;
    CHECK_ABS(ck->energy_rel, 0.0, 1e-9, "energy closure");
    CHECK_ABS(ck->exergy_rel, 0.0, 1e-9, "exergy balance");
    CHECK_REL(ck->area_ts, ck->area_expected_ts, 1e-6, "T-s area balance");
    CHECK_REL(ck->area_pv, ck->area_expected_pv, 1e-6, "P-v area balance");
    CHECK_REL(ck->area_expected_ts, sm->net_work + sm->dissipated,
              sm->fuel_air_ratio > 0.0 ? 1.0 : 1e-9, "expected area = net + dissipated");
}

/* Simple Brayton, flow frame, with compressor and turbine isentropic
 * efficiencies: T2 = T1 [1 + (rp^((k-1)/k) - 1)/eta_c],
 * T4 = T3 [1 - eta_t (1 - rp^(-(k-1)/k))]; ideal: eta = 1 - rp^(-(k-1)/k). */
static void test_brayton_cold(void)
{
    const double ks[] = {1.3, 1.4, 1.67};
    const double rps[] = {4.0, 10.0, 25.0};
    for (int a = 0; a < 3; a++)
        for (int b = 0; b < 3; b++)
            for (int lossy = 0; lossy < 2; lossy++) {
                double k = ks[a], rp = rps[b], x = pow(rp, (k - 1.0) / k);
                double ec = lossy ? 0.86 : 1.0, et = lossy ? 0.9 : 1.0;
                gc_gas g = cold(k);
                gc_cycle c;
                gc_cycle_init(&c, GC_FRAME_FLOW, &g, 288.15, 101325.0);
                gc_step *s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, rp, "/pressure_ratio");
                s->efficiency = ec;
                s = gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1600.0, "/turbine_inlet_temperature");
                s->heat_sign = 1;
                s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
                s->efficiency = et;
                gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_P;
                const gc_cycle_run *run = eval(&c);
                double T2 = 288.15 * (1.0 + (x - 1.0) / ec);
                double T4 = 1600.0 * (1.0 - et * (1.0 - 1.0 / x));
                CHECK_REL(run->states[1].T_K, T2, 1e-9, "compressor exit with isentropic efficiency");
                CHECK_REL(run->states[3].T_K, T4, 1e-9, "turbine exit with isentropic efficiency");
                double eta = ((1600.0 - T4) - (T2 - 288.15)) / (1600.0 - T2);
                CHECK_REL(run->summary.thermal_efficiency, eta, 1e-9, "Brayton efficiency from the states");
                CHECK_REL(RES.ideal.summary.thermal_efficiency, 1.0 - 1.0 / x, 1e-9,
                          "cold-air Brayton 1 - rp^(-(k-1)/k)");
                CHECK_REL(run->processes[0].efficiency, ec, 1e-9, "reported isentropic efficiency");
                balances(run);
                balances(&RES.ideal);
            }
}

/* Polytropic efficiency, flow frame (cold air): T2/T1 = rp^((k-1)/(k eta_p))
 * for compression, (P2/P1)^(eta_p (k-1)/k) for expansion. Closed frame
 * (derived from the small-stage definition du = -P dv / eta_p used by the
 * engine): T2/T1 = r^((k-1)/eta_p) for a volume ratio r = v1/v2. */
static void test_polytropic_efficiency(void)
{
    const double k = 1.4, ep = 0.88;
    gc_gas g = cold(k);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &g, 300.0, 1e5);
    gc_step *s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 12.0, NULL);
    s->efficiency = ep;
    s->polytropic_efficiency = 1;
    s = gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1500.0, NULL);
    s->heat_sign = 1;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
    s->efficiency = ep;
    s->polytropic_efficiency = 1;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    const gc_cycle_run *run = eval(&c);
    CHECK_REL(run->states[1].T_K, 300.0 * pow(12.0, (k - 1.0) / (k * ep)), 1e-9,
              "polytropic-efficiency compression T2/T1 = rp^((k-1)/(k eta_p))");
    CHECK_REL(run->states[3].T_K, 1500.0 * pow(1.0 / 12.0, ep * (k - 1.0) / k), 1e-9,
              "polytropic-efficiency expansion");
    CHECK_REL(run->processes[0].polytropic_efficiency, ep, 1e-9, "drawn curve keeps eta_p");
    /* isentropic efficiency of a polytropic compressor is lower than eta_p */
    CU_ASSERT(run->processes[0].efficiency < ep);
    CU_ASSERT(run->processes[2].efficiency > ep);
    balances(run);

    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_VOLUME_RATIO, 1.0 / 9.0, NULL);
    s->efficiency = ep;
    s->polytropic_efficiency = 1;
    s = gc_cycle_add(&c, GC_PROC_CONST_VOLUME, GC_END_TEMPERATURE, 2000.0, NULL);
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_VOLUME, 0.0, NULL);
    s->efficiency = ep;
    s->polytropic_efficiency = 1;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    run = eval(&c);
    CHECK_REL(run->states[1].T_K, 300.0 * pow(9.0, (k - 1.0) / ep), 1e-9,
              "closed polytropic-efficiency compression (derived: du = -P dv / eta_p)");
    CHECK_REL(run->states[3].T_K, 2000.0 * pow(1.0 / 9.0, (k - 1.0) * ep), 1e-9,
              "closed polytropic-efficiency expansion (derived: du = -eta_p P dv)");
    balances(run);

    /* variable-property air, pressure end in the closed frame (Newton path) */
    gc_gas air;
    gc_gas_init_air(&air);
    gc_cycle_init(&c, GC_FRAME_CLOSED, &air, 300.0, 1e5);
    s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 20.0, NULL);
    s->efficiency = 0.9;
    s->polytropic_efficiency = 1;
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1800.0, NULL);
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
    s->efficiency = 0.9;
    s->polytropic_efficiency = 1;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    run = eval(&c);
    CHECK_REL(run->states[1].P_Pa, 20e5, 1e-12, "pressure end reached");
    CHECK_REL(run->processes[0].polytropic_efficiency, 0.9, 1e-8, "curve through the end states");
    balances(run);
}

/* Polytropic heat exchange P v^n = const (cold air, closed frame):
 * q = cv (n - k)/(n - 1) (T2 - T1) and w = R (T2 - T1)/(1 - n). */
static void test_polytrope_n(void)
{
    const double k = 1.4, n = 1.25;
    gc_gas g = cold(k);
    double cv = 1005.0 / k, Rg = 1005.0 - cv;
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    gc_step *s = gc_cycle_add(&c, GC_PROC_POLYTROPIC, GC_END_VOLUME_RATIO, 0.1, NULL);
    s->n = n;
    gc_cycle_add(&c, GC_PROC_CONST_VOLUME, GC_END_TEMPERATURE, 1800.0, NULL);
    s = gc_cycle_add(&c, GC_PROC_POLYTROPIC, GC_END_START_VOLUME, 0.0, NULL);
    s->n = n;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    const gc_cycle_run *run = eval(&c);
    double T2 = 300.0 * pow(10.0, n - 1.0);
    CHECK_REL(run->states[1].T_K, T2, 1e-12, "polytrope T2 = T1 r^(n-1)");
    CHECK_REL(run->processes[0].heat, cv * (n - k) / (n - 1.0) * (T2 - 300.0), 1e-9,
              "polytropic heat q = cv (n-k)/(n-1) dT");
    CHECK_REL(run->processes[0].work, Rg * (T2 - 300.0) / (1.0 - n), 1e-9,
              "polytropic work R dT / (1 - n)");
    CU_ASSERT(RES.ideal_is_actual);
    balances(run);
}

/* Regenerative Brayton (cold air): ideal regeneration gives
 * eta = 1 - (T1/T3) rp^((k-1)/k); partial effectiveness eps from the
 * temperature-effectiveness definition Tx = T2 + eps (T4 - T2). */
static void test_regenerator(void)
{
    const double k = 1.4, T1 = 300.0, T3 = 1400.0;
    const double rps[] = {3.0, 5.0, 8.0};
    const double epss[] = {1.0, 0.75};
    gc_gas g = cold(k);
    for (int a = 0; a < 3; a++)
        for (int b = 0; b < 2; b++) {
            double rp = rps[a], eps = epss[b], x = pow(rp, (k - 1.0) / k);
            gc_cycle c;
            gc_cycle_init(&c, GC_FRAME_FLOW, &g, T1, 1e5);
            gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_PRESSURE_RATIO, rp, NULL);
            gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
            gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, T3, NULL)->heat_sign = 1;
            gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_START_PRESSURE, 0.0, NULL);
            gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
            gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
            CU_ASSERT_EQUAL(gc_cycle_link_exchanger(&c, 1, 4, eps, GC_GEOM_CONST_P, "/regenerator_effectiveness"), GC_OK);
            const gc_cycle_run *run = eval(&c);
            double T2 = T1 * x, T4 = T3 / x, Tx = T2 + eps * (T4 - T2), Ty = T4 - (Tx - T2);
            double eta = 1.0 - (Ty - T1) / (T3 - Tx);
            CHECK_REL(run->summary.thermal_efficiency, eta, 1e-9, "regenerative Brayton from its states");
            if (eps == 1.0)
                CHECK_REL(run->summary.thermal_efficiency, 1.0 - (T1 / T3) * x, 1e-9,
                          "ideal regenerative Brayton 1 - (T1/T3) rp^((k-1)/k)");
            CU_ASSERT(run->regen_iterations >= 2 && run->regen_iterations < 10);
            CU_ASSERT(run->processes[1].internal && run->processes[4].internal);
            CHECK_REL(run->processes[1].heat, -run->processes[4].heat, 1e-15, "exchanger heat balance");
            balances(run);
        }
}

/* Ericsson as a flow cycle (isothermal compression and expansion, ideal
 * regeneration at constant pressure) equals Carnot, variable air. */
static void test_ericsson_flow(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 300.0, 1e5);
    gc_cycle_add(&c, GC_PROC_ISOTHERMAL, GC_END_PRESSURE_RATIO, 8.0, NULL)->heat_sign = -1;
    gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1100.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_ISOTHERMAL, GC_END_START_PRESSURE, 0.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    gc_cycle_link_exchanger(&c, 1, 4, 1.0, GC_GEOM_CONST_P, NULL);
    const gc_cycle_run *run = eval(&c);
    CHECK_REL(run->summary.thermal_efficiency, 1.0 - 300.0 / 1100.0, 1e-9,
              "Ericsson with ideal regeneration = Carnot 1 - TL/TH");
    balances(run);
}

/* Pressure losses (flow): throttling an ideal gas keeps T; dissipated work
 * R T ln(P1/P2); the turbine's START_PRESSURE end accounts for losses
 * downstream; the ideal counterpart drops the losses. */
static void test_pressure_losses(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, 101325.0);
    gc_step *s = gc_cycle_add(&c, GC_PROC_PRESSURE_LOSS, GC_END_DEFAULT, 0.0, NULL);
    s->pressure_loss = 0.01;
    s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 15.0, NULL);
    s->efficiency = 0.87;
    s = gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1550.0, NULL);
    s->pressure_loss = 0.04;
    s->heat_sign = 1;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
    s->efficiency = 0.9;
    s = gc_cycle_add(&c, GC_PROC_PRESSURE_LOSS, GC_END_PRESSURE_RATIO, 0.97, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    const gc_cycle_run *run = eval(&c);
    const gc_cycle_process *p = &run->processes[0];
    CHECK_REL(run->states[1].T_K, 288.15, 1e-15, "throttle keeps T (ideal gas, constant h)");
    CHECK_REL(p->dissipated, air.R_J_per_kgK * 288.15 * log(1.0 / 0.99), 1e-12,
              "throttle dissipates R T ln(P1/P2)");
    CHECK_REL(run->states[3].P_Pa, run->states[2].P_Pa * 0.96, 1e-12, "combustor loss");
    CHECK_REL(run->states[4].P_Pa, 101325.0 / 0.97, 1e-12, "turbine exit above ambient by the exhaust loss");
    CU_ASSERT(!RES.ideal_is_actual);
    CHECK_REL(RES.ideal.states[1].P_Pa, 101325.0, 1e-15, "ideal: no inlet loss");
    CU_ASSERT(RES.ideal.summary.thermal_efficiency > run->summary.thermal_efficiency);
    balances(run);
    balances(&RES.ideal);
}

/* Kinetic steps (flow): a diffuser from the flight speed to rest and a
 * nozzle to the ambient pressure; V_exit^2/2 = h_in - h_out (+ V_in^2/2), the
 * stagnation temperature of cold air is T + V^2 / (2 cp). */
static void test_kinetic(void)
{
    gc_gas g = cold(1.4);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &g, 250.0, 50000.0);
    c.V_start_m_per_s = 240.0;
    gc_step *s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_VELOCITY, 0.0, NULL);
    s->kinetic = 1;
    s->efficiency = 0.95;
    s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 10.0, NULL);
    s->efficiency = 0.87;
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1400.0, NULL)->heat_sign = 1;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_TEMPERATURE, 1000.0, NULL);
    s->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_START_PRESSURE, 0.0, NULL)->kinetic = 1;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    /* the turbine drives the compressor: end temperature from the work balance */
    double T2 = 250.0 + 240.0 * 240.0 / (2.0 * 1005.0);
    double wc = 1005.0 * (T2 * (1.0 + (pow(10.0, 0.4 / 1.4) - 1.0) / 0.87) - T2);
    c.steps[3].end_value = 1400.0 - wc / 1005.0;
    const gc_cycle_run *run = eval(&c);
    CHECK_REL(run->states[1].T_K, T2, 1e-12, "diffuser: T2 = T0 + V0^2 / (2 cp)");
    CHECK_REL(run->states[0].T_total_K, T2, 1e-9, "stagnation temperature T + V^2/(2 cp)");
    CHECK_ABS(run->states[1].V_m_per_s, 0.0, 1e-12, "diffuser end velocity");
    CHECK_ABS(run->processes[1].work + run->processes[3].work, 0.0, 1e-6, "turbine work = compressor work");
    const gc_cycle_state *a = &run->states[4], *b = &run->states[5];
    CHECK_REL(0.5 * b->V_m_per_s * b->V_m_per_s, a->h_J_per_kg - b->h_J_per_kg, 1e-12,
              "nozzle: V^2/2 = h_in - h_out");
    /* the net work of the loop is the jet's kinetic energy gain */
    CHECK_REL(run->summary.net_work, 0.5 * (b->V_m_per_s * b->V_m_per_s - 240.0 * 240.0), 1e-6,
              "net work = kinetic energy gained by the jet");
    balances(run);
}

/* Fuel addition: methane-fired simple cycle. Energy closes exactly with the
 * reaction referenced to the start state; the fuel-air ratio equals
 * combustion.h's own solve; mass grows. */
static void test_fuel(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_fuel f;
    gc_error e;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&f, "methane", &e), GC_OK);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, 101325.0);
    gc_step *s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 14.0, NULL);
    s->efficiency = 0.87;
    s = gc_cycle_add(&c, GC_PROC_FUEL, GC_END_TEMPERATURE, 1500.0, "/turbine_inlet_temperature");
    s->fuel.fuel = &f;
    s->fuel.T_fuel_K = 298.15;
    s->efficiency = 0.99;
    s->pressure_loss = 0.04;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
    s->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    const gc_cycle_run *run = eval(&c);
    double far;
    CU_ASSERT_EQUAL(gc_combustion_far_for_T(&f, 298.15, &air, run->states[1].T_K, 1500.0, 0.99,
                                            &far, &e), GC_OK);
    CHECK_REL(run->summary.fuel_air_ratio, far, 1e-9, "fuel-air ratio of combustion.h");
    CHECK_REL(run->states[2].mass_ratio, 1.0 + far, 1e-12, "mass grows by the fuel");
    CU_ASSERT_EQUAL(run->n_gases, 2);
    CU_ASSERT_EQUAL(run->states[2].gas, 1);
    /* heat in = far LHV (298.15 K), with heat out on the same reference */
    double lhv;
    gc_fuel_heating_values(&f, &lhv, NULL);
    CHECK_REL(run->summary.heat_in, far * lhv, 1e-12, "fuel energy far x LHV (298.15 K)");
    CHECK_REL(run->processes[1].heat_out, 0.01 * far * lhv, 1e-9, "burner loss (1 - eta_b) m_f LHV");
    CHECK_ABS(run->summary.heat_in - run->summary.heat_out - run->summary.net_work, 0.0,
              1e-9 * run->summary.net_work, "first law on one reference");
    balances(run);
    CU_ASSERT(RES.ideal.summary.thermal_efficiency > run->summary.thermal_efficiency);
    /* in the closed frame, fuel addition is refused */
    c.frame = GC_FRAME_CLOSED;
    c.steps[0].end = GC_END_VOLUME_RATIO;
    c.steps[0].end_value = 0.1;
    c.steps[1].pressure_loss = 0.0;
    CU_ASSERT_EQUAL(gc_cycle_evaluate(&c, &RES, &e), GC_ERR_INVALID);
}

/* Dual step with a peak-pressure limit: inactive when the heat is used up
 * before the limit (then an Otto), active otherwise. */
static void test_dual_limit(void)
{
    gc_gas g = cold(1.4);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 1.0 / 10.0, NULL);
    gc_step *s = gc_cycle_add(&c, GC_PROC_DUAL, GC_END_HEAT, 3e5, "/heat_added");
    s->end2 = GC_END_PEAK_PRESSURE;
    s->end2_value = 80e5;
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_START_VOLUME, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    const gc_cycle_run *run = eval(&c);
    CHECK_REL(run->summary.thermal_efficiency, 1.0 - pow(10.0, -0.4), 1e-9,
              "inactive limit: Otto 1 - r^(1-k)");
    CHECK_ABS(run->processes[2].heat, 0.0, 1e-9, "no constant-pressure part");
    c.steps[1].end_value = 2e6;
    run = eval(&c);
    CHECK_REL(run->summary.P_max_Pa, 80e5, 1e-12, "active limit: peak pressure");
    CU_ASSERT(run->processes[2].heat > 0.0);
    balances(run);
}

/* Paths: ends equal the states, the curve keeps its invariant (s on an
 * isentrope, v on an isochore, P on an isobar, T on an isotherm). */
static void test_paths(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &air, 300.0, 1e5);
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 1.0 / 16.0, NULL);
    gc_step *s = gc_cycle_add(&c, GC_PROC_DUAL, GC_END_TEMPERATURE, 2400.0, NULL);
    s->end2 = GC_END_PRESSURE_RATIO;
    s->end2_value = 1.5;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_VOLUME_RATIO, 4.0, NULL);
    s->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_ISOTHERMAL, GC_END_START_VOLUME, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    const gc_cycle_run *run = eval(&c);
    CU_ASSERT_EQUAL(run->n_processes, 6);
    gc_path_point pts[GC_PATH_MAX_POINTS];
    gc_error e;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        CU_ASSERT_EQUAL(gc_cycle_path(run, k, 41, pts, &e), GC_OK);
        const gc_cycle_state *a = &run->states[p->from], *b = &run->states[p->to];
        CHECK_REL(pts[0].T_K, a->T_K, 1e-15, "path starts at its state");
        CHECK_REL(pts[40].P_Pa, b->P_Pa, 1e-15, "path ends at its state");
        for (int j = 1; j < 40; j++) {
            CU_ASSERT(isfinite(pts[j].s_J_per_kgK) && pts[j].P_Pa > 0.0);
            if (p->kind == GC_PROC_ISENTROPIC)
                CHECK_REL(pts[j].s_J_per_kgK, a->s_J_per_kgK, 1e-9, "isentrope: s constant");
            if (p->curve == GC_CURVE_ISOCHORE)
                CHECK_REL(pts[j].v_m3_per_kg, a->v_m3_per_kg, 1e-12, "isochore: v constant");
            if (p->kind == GC_PROC_DUAL && p->part == 1)
                CHECK_REL(pts[j].P_Pa, a->P_Pa, 1e-12, "isobar: P constant");
            if (p->kind == GC_PROC_ISOTHERMAL)
                CHECK_REL(pts[j].T_K, a->T_K, 1e-15, "isotherm: T constant");
        }
    }
    /* expansion with efficiency: entropy rises along the drawn curve */
    CU_ASSERT_EQUAL(gc_cycle_path(run, 3, 25, pts, &e), GC_OK);
    for (int j = 1; j < 25; j++)
        CU_ASSERT(pts[j].s_J_per_kgK > pts[j - 1].s_J_per_kgK);
    CU_ASSERT_EQUAL(gc_cycle_path(run, 99, 25, pts, &e), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_cycle_path(run, 0, 1, pts, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/points");
    CU_ASSERT_EQUAL(gc_cycle_path(run, 0, GC_PATH_MAX_POINTS + 1, pts, &e), GC_ERR_INVALID);
    double pv, ts;
    CU_ASSERT_EQUAL(gc_cycle_path_areas(run, 24, &pv, &ts, &e), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_cycle_path_areas(run, 25, &pv, &ts, &e), GC_OK);
    double want = run->summary.net_work + run->summary.dissipated;
    CHECK_REL(pv, want, 1e-3, "P-v area over 25 drawn points per process");
    CHECK_REL(ts, want, 1e-3, "T-s area over 25 drawn points per process");
    balances(run);

    /* GC_CYCLE_NO_AREAS skips the integration, keeps the other checks */
    c.flags = GC_CYCLE_NO_AREAS;
    run = eval(&c);
    CU_ASSERT_EQUAL(run->checks.areas_done, 0);
    CHECK_ABS(run->checks.energy_rel, 0.0, 1e-9, "energy closure still checked");
}

static void expect(const gc_cycle *c, int code, const char *field)
{
    gc_error e;
    gc_error_clear(&e);
    int rc = gc_cycle_evaluate(c, &RES, &e);
    if (rc != code || (field && strcmp(e.field, field) != 0))
        fprintf(stderr, "expected %d '%s', got %d '%s': %s\n", code, field ? field : "", rc,
                e.field, e.message);
    CU_ASSERT_EQUAL(rc, code);
    if (field)
        CU_ASSERT_STRING_EQUAL(e.field, field);
    CU_ASSERT(strlen(e.message) > 10);
}

static void test_errors(void)
{
    gc_gas g = cold(1.4);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    expect(&c, GC_ERR_INVALID, "/steps"); /* empty chain */
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 0.1, "/compression_ratio");
    gc_cycle_add(&c, GC_PROC_CONST_VOLUME, GC_END_TEMPERATURE, 500.0, "/peak_temperature")->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_START_VOLUME, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    expect(&c, GC_ERR_INFEASIBLE, "/peak_temperature"); /* below compression end */
    c.steps[1].end_value = 1800.0;
    c.steps[3].geometry = GC_GEOM_CONST_P;
    expect(&c, GC_ERR_INFEASIBLE, "/steps/3"); /* not at the start pressure */
    c.steps[3].geometry = GC_GEOM_CONST_V;
    c.n_steps = 3;
    expect(&c, GC_ERR_CHECK, ""); /* chain does not close */
    c.n_steps = 4;
    c.steps[0].end_value = -1.0;
    expect(&c, GC_ERR_INVALID, "/compression_ratio");
    c.steps[0].end_value = NAN;
    expect(&c, GC_ERR_INVALID, "/compression_ratio");
    c.steps[0].end_value = 0.1;
    c.steps[0].end = GC_END_HEAT;
    expect(&c, GC_ERR_INVALID, "/compression_ratio"); /* isentropic cannot end on heat */
    c.steps[0].end = GC_END_VOLUME_RATIO;
    c.steps[0].kind = GC_PROC_EXPANSION;
    expect(&c, GC_ERR_INFEASIBLE, "/compression_ratio"); /* expansion that compresses */
    c.steps[0].kind = GC_PROC_COMPRESSION;
    c.steps[0].efficiency = 1.5;
    strcpy(c.steps[0].field_aux, "/compression_efficiency");
    expect(&c, GC_ERR_INVALID, "/compression_efficiency");
    c.steps[0].efficiency = 0.9;
    c.steps[1].end_value = 30000.0;
    expect(&c, GC_ERR_RANGE, "/peak_temperature");
    c.steps[1].end_value = 1800.0;
    c.steps[1].pressure_loss = 0.1;
    expect(&c, GC_ERR_INVALID, NULL); /* losses on heat steps are for the flow frame */
    c.steps[1].pressure_loss = 0.0;
    c.steps[2].kind = GC_PROC_HEAT_EXCHANGE;
    c.steps[2].partner = 7;
    expect(&c, GC_ERR_INVALID, "/steps/2");
    c.steps[2].kind = (gc_process_kind)77;
    expect(&c, GC_ERR_UNKNOWN, "/steps/2");
    c.steps[2].kind = GC_PROC_ISENTROPIC;
    c.frame = (gc_frame)5;
    expect(&c, GC_ERR_INVALID, "/frame");
    c.frame = GC_FRAME_CLOSED;
    c.T_start_K = -4.0;
    expect(&c, GC_ERR_RANGE, "/intake_temperature");
    c.T_start_K = 300.0;
    c.P_start_Pa = 0.0;
    expect(&c, GC_ERR_INVALID, "/intake_pressure");
    c.P_start_Pa = 1e5;
    /* a chain that takes in no heat */
    gc_cycle d;
    gc_cycle_init(&d, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    gc_cycle_add(&d, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 0.5, NULL);
    gc_cycle_add(&d, GC_PROC_ISENTROPIC, GC_END_START_VOLUME, 0.0, NULL);
    expect(&d, GC_ERR_INFEASIBLE, ""); /* takes in no heat */
    /* names */
    CU_ASSERT_STRING_EQUAL(gc_cycle_kind_name(GC_PROC_DUAL), "dual");
    CU_ASSERT_STRING_EQUAL(gc_cycle_end_name(GC_END_START_PRESSURE), "start_pressure");
    CU_ASSERT_STRING_EQUAL(gc_cycle_kind_name(-3), "unknown");
    /* a full chain */
    gc_cycle_init(&d, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    for (int i = 0; i < GC_CYCLE_MAX_STEPS; i++)
        CU_ASSERT_PTR_NOT_NULL(gc_cycle_add(&d, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 1.0, NULL));
    CU_ASSERT_PTR_NULL(gc_cycle_add(&d, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 1.0, NULL));
}


/* Stirling with a regenerator of effectiveness 0.77 (closed frame, cold
 * air): the ideal counterpart regenerates ideally, so its efficiency is
 * Carnot's 1 - T_L/T_H (the published result for the Stirling cycle with
 * ideal regeneration); the second bound (ideal components, this
 * regenerator) is the cycle itself, and the cycle is not "its own ideal". */
static void test_stirling_ideal(void)
{
    gc_gas g = cold(1.4);
    const double TL = 288.15, TH = 931.0, r = 3.0;
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, TL, 1e5);
    gc_cycle_add(&c, GC_PROC_ISOTHERMAL, GC_END_VOLUME_RATIO, 1.0 / r, NULL)->heat_sign = -1;
    gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CONST_VOLUME, GC_END_TEMPERATURE, TH, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_ISOTHERMAL, GC_END_START_VOLUME, 0.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    CU_ASSERT_EQUAL_FATAL(gc_cycle_link_exchanger(&c, 1, 4, 0.77, GC_GEOM_CONST_V, NULL), GC_OK);
    const gc_cycle_run *run = eval(&c);
    CU_ASSERT(!RES.ideal_is_actual);
    CHECK_REL(RES.ideal.summary.thermal_efficiency, 1.0 - TL / TH, 1e-9,
              "Stirling with ideal regeneration = Carnot 1 - TL/TH");
    CU_ASSERT_FATAL(RES.has_ideal_components);
    CHECK_REL(RES.ideal_components.thermal_efficiency, run->summary.thermal_efficiency, 1e-12,
              "ideal components with this regenerator: the cycle itself");
    CU_ASSERT(run->summary.thermal_efficiency < RES.ideal.summary.thermal_efficiency);
    balances(run);
    balances(&RES.ideal);
    /* the regenerator destroys exergy in the actual cycle, none in the ideal */
    CU_ASSERT(run->processes[4].exergy_destroyed > 0.0);
    CU_ASSERT_EQUAL(RES.ideal.processes[4].exergy_destroyed, 0.0);
}

/* The fuel step's drawn T-s and h-s path leaves its inlet state itself (the
 * composition change blended in, path.h), so the path does not jump where
 * the gas changes; enthalpy in the path is sensible (cycle.h). */
static void test_fuel_path(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_fuel f;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&f, "methane", NULL), GC_OK);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, 101325.0);
    gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 14.0, NULL)->efficiency = 0.87;
    gc_step *s = gc_cycle_add(&c, GC_PROC_FUEL, GC_END_TEMPERATURE, 1500.0, NULL);
    s->fuel.fuel = &f;
    s->pressure_loss = 0.04;
    gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL)->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    const gc_cycle_run *run = eval(&c);
    gc_path_point pts[25];
    gc_error e;
    CU_ASSERT_EQUAL_FATAL(gc_cycle_path(run, 1, 25, pts, &e), GC_OK);
    const gc_cycle_state *a = &run->states[1], *b = &run->states[2];
    CHECK_REL(pts[0].s_J_per_kgK, a->s_J_per_kgK, 1e-12, "path leaves the inlet state (s)");
    CHECK_REL(pts[0].h_J_per_kg, a->hs_J_per_kg, 1e-12, "path leaves the inlet state (hs)");
    CHECK_REL(pts[24].s_J_per_kgK, b->s_J_per_kgK, 1e-12, "path reaches the outlet (s)");
    /* the sampled curve itself (second point) is continuous with the first:
     * the step in s from point 0 to 1 is small against the step's range */
    double range = fabs(b->s_J_per_kgK - a->s_J_per_kgK);
    CU_ASSERT(fabs(pts[1].s_J_per_kgK - pts[0].s_J_per_kgK) < 0.1 * range);
    /* Simpson over the drawn points agrees with the adaptive check */
    double pv, ts;
    CU_ASSERT_EQUAL(gc_cycle_path_areas(run, 101, &pv, &ts, &e), GC_OK);
    CHECK_REL(ts, run->checks.area_expected_ts, 1e-6, "drawn T-s area = expected");
    balances(run);
}

/* Closing to a typed start pressure: 14.696 psi = 101325.353 Pa (NIST SP
 * 811: 1 psi = 6894.757 Pa) at the start, 101.325 kPa typed as the
 * turbine's end: 3.5e-6 apart, within GC_CYCLE_TOL_CLOSE; reported, and the
 * ideal evaluates too. A pressure loss after the turbine (its end typed to
 * cover the loss) leaves the ideal's expansion at the start pressure. */
static void test_typed_close(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    const double P0 = 14.696 * 6894.757293168;
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, P0);
    gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 12.0, NULL)->efficiency = 0.86;
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1400.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_PRESSURE, 101325.0, NULL)->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    const gc_cycle_run *run = eval(&c);
    CHECK_REL(run->checks.close_rel, (P0 - 101325.0) / P0, 1e-9, "relative mismatch reported");
    CU_ASSERT(RES.has_ideal);
    balances(run);
    /* beyond the tolerance: refused, naming the close step */
    c.steps[2].end_value = 101000.0;
    gc_error e;
    CU_ASSERT_EQUAL(gc_cycle_evaluate(&c, &RES, &e), GC_ERR_INFEASIBLE);
    CU_ASSERT_STRING_EQUAL(e.field, "/steps/3");
    /* a loss after the turbine */
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, 101325.0);
    gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 12.0, NULL)->efficiency = 0.86;
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1400.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_PRESSURE, 103393.0, NULL)->efficiency = 0.9;
    gc_cycle_add(&c, GC_PROC_PRESSURE_LOSS, GC_END_DEFAULT, 0.0, NULL)->pressure_loss = 0.02;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    run = eval(&c);
    CU_ASSERT(run->checks.close_rel > 0.0 && run->checks.close_rel < 2e-6);
    CU_ASSERT_FATAL(RES.has_ideal);
    CHECK_REL(RES.ideal.states[3].P_Pa, 101325.0, 1e-12, "ideal expansion back to the start");
    /* the ideal is the lossless simple cycle: the same as the chain without
     * the loss and with the turbine to the start pressure */
    static gc_cycle_result ref;
    gc_cycle d;
    gc_cycle_init(&d, GC_FRAME_FLOW, &air, 288.15, 101325.0);
    gc_cycle_add(&d, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 12.0, NULL);
    gc_cycle_add(&d, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, 1400.0, NULL)->heat_sign = 1;
    gc_cycle_add(&d, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
    gc_cycle_add(&d, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    CU_ASSERT_EQUAL_FATAL(gc_cycle_evaluate(&d, &ref, &e), GC_OK);
    CHECK_REL(RES.ideal.summary.thermal_efficiency, ref.actual.summary.thermal_efficiency, 1e-12,
              "ideal = the lossless cycle");
}

/* No tiny negative exergy destroyed and no -0 (issue 10): an isentropic
 * step's s_gen is exactly 0, every process's s_gen and exergy destroyed are
 * >= 0, and a lossless step's dissipated work is +0, in cold, air and
 * fuelled chains (the second law: s_gen >= 0). */
static void check_signs(const gc_cycle_run *run)
{
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        CU_ASSERT(p->s_gen >= 0.0 && !signbit(p->s_gen));
        CU_ASSERT(p->exergy_destroyed >= 0.0 && !signbit(p->exergy_destroyed));
        CU_ASSERT(!signbit(p->dissipated) || p->dissipated < 0.0);
        if (p->kind == GC_PROC_ISENTROPIC ||
            ((p->kind == GC_PROC_COMPRESSION || p->kind == GC_PROC_EXPANSION) &&
             p->efficiency == 1.0))
            CU_ASSERT_EQUAL(p->s_gen, 0.0);
    }
}

static void test_signs(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    gc_fuel f;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&f, "methane", NULL), GC_OK);
    for (int fuel = 0; fuel < 2; fuel++) {
        gc_cycle c;
        gc_cycle_init(&c, GC_FRAME_FLOW, &air, 288.15, 101325.0);
        gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, 14.0, NULL);
        gc_step *s = gc_cycle_add(&c, fuel ? GC_PROC_FUEL : GC_PROC_CONST_PRESSURE,
                                  GC_END_TEMPERATURE, 1500.0, NULL);
        s->fuel.fuel = &f;
        s->heat_sign = 1;
        gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, NULL);
        gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
        check_signs(eval(&c));
        CU_ASSERT_EQUAL(RES.actual.processes[1].dissipated, 0.0);
        CU_ASSERT(!signbit(RES.actual.processes[1].dissipated));
    }
    gc_gas g = cold(1.4);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_CLOSED, &g, 300.0, 1e5);
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_VOLUME_RATIO, 0.1, NULL);
    gc_cycle_add(&c, GC_PROC_CONST_VOLUME, GC_END_TEMPERATURE, 2200.0, NULL)->heat_sign = 1;
    gc_cycle_add(&c, GC_PROC_ISENTROPIC, GC_END_START_VOLUME, 0.0, NULL);
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL)->geometry = GC_GEOM_CONST_V;
    const gc_cycle_run *run = eval(&c);
    check_signs(run);
    /* the cold model's sensible basis: h = cp (T - 298.15 K), u = cv (T - 298.15 K) */
    for (int i = 0; i < run->n_states; i++) {
        const gc_cycle_state *st = &run->states[i];
        CHECK_ABS(st->hs_J_per_kg, 1005.0 * (st->T_K - 298.15), 1e-9 * 1005.0 * st->T_K,
                  "cold: hs = cp (T - 298.15 K) (definition)");
        CHECK_ABS(st->us_J_per_kg, 1005.0 / 1.4 * (st->T_K - 298.15), 1e-9 * 1005.0 * st->T_K,
                  "cold: us = cv (T - 298.15 K) (definition)");
    }
}

int main(void)
{
    static const gc_test_case cases[] = {
        {"Brayton with component efficiencies (cold air)", test_brayton_cold},
        {"polytropic efficiency", test_polytropic_efficiency},
        {"polytrope P v^n", test_polytrope_n},
        {"regenerator iteration", test_regenerator},
        {"Ericsson flow cycle = Carnot", test_ericsson_flow},
        {"pressure losses", test_pressure_losses},
        {"kinetic steps", test_kinetic},
        {"fuel addition", test_fuel},
        {"dual with peak-pressure limit", test_dual_limit},
        {"paths", test_paths},
        {"Stirling: ideal regeneration = Carnot", test_stirling_ideal},
        {"fuel step path leaves its inlet state", test_fuel_path},
        {"close to a typed start pressure; ideal with a loss after the turbine", test_typed_close},
        {"no negative s_gen, no -0; cold sensible basis", test_signs},
        {"errors", test_errors},
        {NULL, NULL}};
    return gc_run_suite("cycle", cases);
}
