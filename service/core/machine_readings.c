/*
 * machine_readings.c — reduction of plant readings against the machine
 * (machine.h): what this morning's readings are worth.
 *
 * From ambient (with the inlet treatment in service), compressor discharge
 * pressure and temperature, exhaust temperature, fuel flow and analysis and
 * net output (air flow optional):
 *   compressor inlet   the treated air (machine_inlet.c) at the ambient
 *                      pressure less the machine's inlet losses;
 *   compressor eff.    isentropic, (h2s - h1)/(h2 - h1), variable properties
 *                      of the humid air (gas.h);
 *   air flow           unless measured, from the energy balance of the whole
 *                      gas turbine with absolute enthalpies (gas.h,
 *                      combustion.h):
 *                        m_a h_a(T1) + m_f h_f(T_f) - (1 - eta_b) m_f LHV
 *                          = P_gen / (eta_m eta_g) + (m_a + m_f) h_p(far, T_exh),
 *                      P_gen = net output + chiller power, eta_m, eta_g, eta_b
 *                      the machine's (Brent's method in m_a); a measured air
 *                      flow must close the same balance within the tolerance
 *                      (fraction of the fuel's LHV input) or the readings are
 *                      refused, naming the air flow and by how much;
 *   firing temperature the combustor balance at far = m_f/m_a from the
 *                      compressor discharge: the mixed rotor inlet (never a
 *                      measured turbine inlet temperature); with cooling, the
 *                      combustor exit from the cooling split (machine_cool.c);
 *   turbine eff.       isentropic from the firing temperature and the
 *                      combustor-exit pressure (discharge less the combustor
 *                      loss) to the exhaust temperature and pressure;
 *   consistency        the heat-balance air flow against the model's here (base
 *                      load, or the same output), and the nozzle flow function
 *                      m_g sqrt(R T_ce)/P_ce it implies with the discharge
 *                      pressure against the design's: beyond
 *                      GC_MACHINE_READINGS_FLOW_TOL the readings are refused;
 *   corrections        output and heat rate times the model's own factors,
 *                      new-and-clean base load at the reference conditions (no
 *                      inlet treatment) over the same at the readings'
 *                      conditions (with the treatment in service);
 *   degradation        against the new-and-clean model at the same conditions:
 *                      at base load, or at the same net output for part-load
 *                      readings (output change then not given); efficiency
 *                      changes in points of isentropic efficiency.
 * The model uses the machine's design fuel; a reading with another fuel is
 * reduced with its own and warned.
 *
 * Units: SI (K, Pa, kg/s, W, J/kg).
 */
#include "core/machine_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static int required(double x, const char *field, gc_error *err)
{
    if (!isfinite(x) || !(x > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, field, "is required: a positive number");
    return GC_OK;
}

static int check_readings(const gc_machine_readings *rd, gc_error *err)
{
    int rc = required(rd->compressor_exit_P_Pa, "/readings/compressor_exit_pressure", err);
    if (rc == GC_OK)
        rc = required(rd->compressor_exit_T_K, "/readings/compressor_exit_temperature", err);
    if (rc == GC_OK)
        rc = required(rd->exhaust_temperature_K, "/readings/exhaust_temperature", err);
    if (rc == GC_OK)
        rc = required(rd->fuel_mass_flow_kg_per_s, "/readings/fuel_mass_flow", err);
    if (rc == GC_OK)
        rc = required(rd->net_power_W, "/readings/net_power", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(rd->air_mass_flow_kg_per_s) || rd->air_mass_flow_kg_per_s < 0.0)
        return gc_error_set(err, GC_ERR_INVALID, "/readings/air_mass_flow",
                            "must be 0 (not measured) or positive");
    if (!isfinite(rd->fuel_temperature_K) || rd->fuel_temperature_K < 0.0)
        return gc_error_set(err, GC_ERR_INVALID, "/readings/fuel_temperature",
                            "must be 0 (the design's) or a positive temperature");
    if (rd->part_load != 0 && rd->part_load != 1)
        return gc_error_set(err, GC_ERR_INVALID, "/readings/part_load", "must be 0 or 1");
    if (!isfinite(rd->balance_tolerance) || !(rd->balance_tolerance > 0.0) ||
        rd->balance_tolerance > 0.2)
        return gc_error_set(err, GC_ERR_INVALID, "/readings/balance_tolerance",
                            "must be above 0 up to 0.2");
    return GC_OK;
}

/* The heat-balance air flow against what the compressor can pass here: at
 * base load its open-vane flow; at part load (the vane position is not
 * read) anything from the minimum-vane flow to the open-vane flow. Beyond
 * GC_MACHINE_READINGS_FLOW_TOL of that the readings contradict each other. */
static int flow_in_reach(const gc_machine *m, const gc_machine_readings *rd,
                         const gc_machine_reduction *o, gc_error *err)
{
    const double tol = GC_MACHINE_READINGS_FLOW_TOL, open = o->model_base.air_mass_flow_kg_per_s;
    double lo = o->model.air_mass_flow_kg_per_s, hi = lo;
    if (rd->part_load) {
        lo = open * m->spec.igv_minimum_flow_fraction;
        hi = open;
    }
    double a = o->air_mass_flow_kg_per_s;
    if (a >= lo * (1.0 - tol) && a <= hi * (1.0 + tol))
        return GC_OK;
    double off = a < lo ? a / lo - 1.0 : a / hi - 1.0;
    if (rd->part_load)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings",
                            "the heat balance of these readings needs %.4g kg/s of air, %.1f %% "
                            "from the %.4g to %.4g kg/s the compressor passes here (inlet guide "
                            "vanes closed to open): check the fuel flow, output and exhaust "
                            "temperature", a, 100.0 * off, lo, hi);
    return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings",
                        "the heat balance of these readings needs %.4g kg/s of air, %.1f %% "
                        "from the %.4g kg/s the compressor passes here: check the fuel flow, "
                        "output and exhaust temperature", a, 100.0 * off, lo);
}

/* The energy balance of the whole machine (see the top of the file). */
typedef struct bal_ctx {
    const gc_fuel *fuel;
    const gc_gas *air;
    double m_f, h_f, T1, T_exh, P_net, chiller_J_per_kg, eta_mg, eta_b, scale;
} bal_ctx;

static int balance(void *ctx, double m_a, double *y, gc_error *err)
{
    const bal_ctx *B = ctx;
    gc_gas prod;
    double far = B->m_f / m_a;
    int rc = gc_combustion_products(B->fuel, B->air, far, &prod, err);
    if (rc == GC_OK)
        rc = gc_gas_check_T(&prod, B->T_exh, "/readings/exhaust_temperature", err);
    if (rc != GC_OK)
        return rc;
    double P_gen = B->P_net + m_a * B->chiller_J_per_kg;
    double E = m_a * gc_gas_h_T(B->air, B->T1) + B->m_f * B->h_f -
               (1.0 - B->eta_b) * B->m_f * B->fuel->LHV_J_per_kg - P_gen / B->eta_mg -
               (m_a + B->m_f) * gc_gas_h_T(&prod, B->T_exh);
    *y = E / B->scale;
    return GC_OK;
}

static int air_from_balance(bal_ctx *B, double m_guess, double far_st, double *m_a,
                            gc_error *err)
{
    double lo = B->m_f / far_st * (1.0 + 1e-9), hi = 1e3 * m_guess;
    double x0 = fmax(m_guess, lo), y0 = 0.0, x = 0.0, y = 0.0;
    int rc = balance(B, x0, &y0, err);
    if (rc != GC_OK)
        return rc;
    rc = gc__machine_root(balance, B, x0, y0, fmax(lo, x0 * (1.0 + 0.01 * (y0 > 0 ? 1 : -1))), lo,
                          hi, 1e-12 * x0, 1e-13, &x, &y, err);
    if (rc != GC_OK)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/fuel_mass_flow",
                            "no air flow closes the heat balance: the fuel's %.4g MW does not "
                            "cover the output %.4g MW and the exhaust's heat at %.2f K (check "
                            "fuel flow, output and exhaust temperature)",
                            B->m_f * B->fuel->LHV_J_per_kg / 1e6, B->P_net / 1e6, B->T_exh);
    *m_a = x;
    return GC_OK;
}

static int compressor(const gc_machine_readings *rd, const gc__mctx *X, gc_machine_reduction *o,
                      gc_error *err)
{
    const gc_gas *air = &X->site.gas;
    o->compressor_inlet_T_K = X->T1_K;
    o->compressor_inlet_P_Pa = X->P1_Pa;
    if (!(rd->compressor_exit_P_Pa > X->P1_Pa))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/compressor_exit_pressure",
                            "%.1f Pa is not above the compressor inlet pressure %.1f Pa",
                            rd->compressor_exit_P_Pa, X->P1_Pa);
    o->pressure_ratio = rd->compressor_exit_P_Pa / X->P1_Pa;
    double T2s = 0.0, T2 = rd->compressor_exit_T_K;
    int rc = gc_gas_T_isentropic_P(air, X->T1_K, o->pressure_ratio, &T2s, err);
    if (rc == GC_OK)
        rc = gc_gas_check_T(air, T2, "/readings/compressor_exit_temperature", err);
    if (rc != GC_OK)
        return rc;
    if (!(T2 > T2s))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/compressor_exit_temperature",
                            "%.2f K is %.2f K below the isentropic compression temperature %.2f K "
                            "(pressure ratio %.4f from %.2f K): that needs a compressor "
                            "efficiency above 1", T2, T2s - T2, T2s, o->pressure_ratio, X->T1_K);
    double h1 = gc_gas_h_T(air, X->T1_K);
    o->compressor_efficiency = (gc_gas_h_T(air, T2s) - h1) / (gc_gas_h_T(air, T2) - h1);
    return GC_OK;
}

/* Air flow: measured (checked against the balance) or from the balance. */
static int air_flow(const gc_machine *m, const gc_machine_readings *rd, const gc__mctx *X,
                    const gc_fuel *fuel, double T_f, gc_machine_reduction *o, gc_error *err)
{
    bal_ctx B;
    double far_st = 0.0;
    B.fuel = fuel;
    B.air = &X->site.gas;
    B.m_f = rd->fuel_mass_flow_kg_per_s;
    B.T1 = X->T1_K;
    B.T_exh = rd->exhaust_temperature_K;
    B.P_net = rd->net_power_W;
    B.chiller_J_per_kg = X->chiller_J_per_kg;
    B.eta_mg = m->mechanical_efficiency * m->chain.generator_efficiency;
    B.eta_b = m->chain.combustor_efficiency;
    B.scale = B.m_f * fuel->LHV_J_per_kg;
    int rc = gc_fuel_h_T(fuel, T_f, &B.h_f, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/readings", rc);
    rc = gc_combustion_far_stoich(fuel, B.air, &far_st, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/readings", rc);
    rc = air_from_balance(&B, X->m_air_open, far_st, &o->air_mass_flow_balance_kg_per_s, err);
    if (rc != GC_OK)
        return rc;
    o->air_mass_flow_kg_per_s = o->air_mass_flow_balance_kg_per_s;
    if (rd->air_mass_flow_kg_per_s > 0.0) {
        double m_a = rd->air_mass_flow_kg_per_s, y = 0.0;
        if (!(B.m_f / m_a < far_st))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/air_mass_flow",
                                "%.4g kg/s of air burns the fuel flow richer than "
                                "stoichiometric", m_a);
        rc = balance(&B, m_a, &y, err);
        if (rc != GC_OK)
            return rc;
        o->air_flow_measured = 1;
        o->air_mass_flow_kg_per_s = m_a;
        o->balance_residual = y;
        double off = m_a / o->air_mass_flow_balance_kg_per_s - 1.0;
        if (fabs(y) > rd->balance_tolerance)
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/air_mass_flow",
                                "%.4g kg/s is %.2f %% off the %.4g kg/s the heat balance needs: "
                                "the balance misses by %.2f %% of the fuel input (tolerance "
                                "%.2f %%)", m_a, 100.0 * off, o->air_mass_flow_balance_kg_per_s,
                                100.0 * y, 100.0 * rd->balance_tolerance);
        if (fabs(y) > 0.5 * rd->balance_tolerance)
            gc__machine_warn(o->warnings, &o->n_warnings, GC_MACHINE_W_AIR_FLOW_BALANCE,
                             "/readings/air_mass_flow",
                             "the measured air flow is %.2f %% off the heat balance's %.4g kg/s "
                             "(residual %.2f %% of the fuel input): within the tolerance, used",
                             100.0 * off, o->air_mass_flow_balance_kg_per_s, 100.0 * y);
    }
    o->fuel_air_ratio = B.m_f / o->air_mass_flow_kg_per_s;
    return GC_OK;
}

/* Firing temperature, combustor exit, turbine efficiency. */
static int hot_section(const gc_machine *m, const gc_machine_readings *rd, const gc__mctx *X,
                       const gc_fuel *fuel, double T_f, gc_machine_reduction *o, gc_error *err)
{
    const gc_gas *air = &X->site.gas;
    const double T2 = rd->compressor_exit_T_K, T4 = rd->exhaust_temperature_K;
    gc_burn b;
    int rc = gc_combustion_burn_far(fuel, T_f, air, T2, 1.0, o->fuel_air_ratio,
                                    m->chain.combustor_efficiency, &b, err);
    if (rc != GC_OK)
        return gc_error_set(err, rc, "/readings/fuel_mass_flow",
                            "the combustor balance failed at fuel-air ratio %.5f: %s",
                            o->fuel_air_ratio, err ? err->message : "");
    o->firing_temperature_K = b.T_out_K;
    gc_machine_cooled c;
    rc = gc_machine_cooling_split(&m->spec.cooling, fuel, T_f, air, T2, o->fuel_air_ratio,
                                  m->chain.combustor_efficiency, b.T_out_K, &c, err);
    if (rc != GC_OK)
        return rc;
    o->combustor_exit_T_K = m->spec.cooling.enabled ? c.combustor_exit_T_K : b.T_out_K;
    o->cooling_air_fraction = c.coolant_fraction;
    double P_ce = rd->compressor_exit_P_Pa * (1.0 - m->chain.combustor_pressure_loss);
    double R_g = m->spec.cooling.enabled ? c.nozzle_gas_R_J_per_kgK : b.products.R_J_per_kgK;
    o->nozzle_flow_function_m2 = o->air_mass_flow_kg_per_s *
                                 (1.0 - c.coolant_fraction + o->fuel_air_ratio) *
                                 sqrt(R_g * o->combustor_exit_T_K) / P_ce;
    o->nozzle_flow_change = o->nozzle_flow_function_m2 / m->design.nozzle_flow_function_m2 - 1.0;
    if (!(T4 < o->firing_temperature_K))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/exhaust_temperature",
                            "%.2f K is not below the firing temperature %.2f K that the heat "
                            "balance gives", T4, o->firing_temperature_K);
    double P3 = rd->compressor_exit_P_Pa * (1.0 - m->chain.combustor_pressure_loss);
    double P4 = o->inlet.ambient_P_Pa / (1.0 - m->chain.exhaust_pressure_loss);
    double T4s = 0.0;
    if (!(P3 > P4))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/compressor_exit_pressure",
                            "%.1f Pa leaves no expansion after the combustor and exhaust "
                            "losses", rd->compressor_exit_P_Pa);
    rc = gc_gas_T_isentropic_P(&b.products, o->firing_temperature_K, P4 / P3, &T4s, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/readings", rc);
    if (!(T4 > T4s))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/exhaust_temperature",
                            "%.2f K is %.2f K below the isentropic expansion end %.2f K from the "
                            "heat-balance firing temperature %.2f K: that needs a turbine "
                            "efficiency above 1", T4, T4s - T4, T4s, o->firing_temperature_K);
    double h3 = gc_gas_h_T(&b.products, o->firing_temperature_K);
    o->turbine_efficiency = (h3 - gc_gas_h_T(&b.products, T4)) /
                            (h3 - gc_gas_h_T(&b.products, T4s));
    return GC_OK;
}

/* The new-and-clean model here, and the comparisons. */
static int compare(const gc_machine *m, const gc_machine_readings *rd, gc_machine_reduction *o,
                   gc_error *err)
{
    static const gc_machine_condition clean = { 0.0, 0.0, 0.0 };
    gc__mctx X;
    gc__mop op, base;
    int control = 0, limit = 0, nw = 0;
    gc_machine_warning w[GC_MACHINE_MAX_WARNINGS];
    int rc = gc__machine_ctx_init(m, &rd->site, &rd->inlet, &clean, &X, NULL, NULL, w, &nw, err);
    if (rc != GC_OK)
        return rc;
    rc = gc__machine_solve_load(&X, rd->part_load ? GC_MACHINE_LOAD_POWER : GC_MACHINE_LOAD_BASE,
                                rd->net_power_W, &base, &op, &control, &limit, err);
    if (rc != GC_OK) {
        if (err != NULL && strncmp(err->field, "/load", 5) == 0)
            snprintf(err->field, sizeof err->field, "/readings/net_power");
        return rc;
    }
    gc__machine_point_fill(&X, &op, &base, control, limit, &o->model);
    gc__machine_point_fill(&X, &base, &base, GC_MACHINE_BASE_LOAD, X.base_limit,
                           &o->model_base);
    if (!(m->reference.net_power_W > 0.0) || !(m->reference.heat_rate > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/reference",
                            "the machine delivers no net output at the reference conditions "
                            "(%.4g W): there is nothing to correct to",
                            m->reference.net_power_W);
    o->output_correction = m->reference.net_power_W / o->model_base.net_power_W;
    o->heat_rate_correction = m->reference.heat_rate / o->model_base.heat_rate;
    o->corrected_net_power_W = rd->net_power_W * o->output_correction;
    o->corrected_heat_rate = o->heat_rate * o->heat_rate_correction;
    o->corrected_heat_rate_kJ_per_kWh = 3600.0 * o->corrected_heat_rate;
    o->has_output_change = !rd->part_load;
    o->output_change = rd->part_load ? 0.0 : rd->net_power_W / o->model.net_power_W - 1.0;
    o->heat_rate_change = o->heat_rate / o->model.heat_rate - 1.0;
    o->compressor_efficiency_change = o->compressor_efficiency - o->model.compressor_efficiency;
    o->turbine_efficiency_change = o->turbine_efficiency - o->model.turbine_efficiency;
    o->air_flow_change = o->air_mass_flow_kg_per_s / o->model.air_mass_flow_kg_per_s - 1.0;
    rc = flow_in_reach(m, rd, o, err);
    if (rc != GC_OK)
        return rc;
    if (fabs(o->nozzle_flow_change) > GC_MACHINE_READINGS_FLOW_TOL)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/readings/compressor_exit_pressure",
                            "%.1f Pa puts the first nozzle's flow function %.1f %% from its "
                            "design value for the heat-balance gas flow and firing temperature",
                            rd->compressor_exit_P_Pa, 100.0 * o->nozzle_flow_change);
    return GC_OK;
}

int gc_machine_reduce(const gc_machine *m, const gc_machine_readings *rd,
                      gc_machine_reduction *out, gc_error *err)
{
    static const gc_machine_condition clean = { 0.0, 0.0, 0.0 };
    gc__mctx X;
    gc_site amb;
    memset(out, 0, sizeof *out);
    int rc = check_readings(rd, err);
    if (rc != GC_OK)
        return rc;
    const gc_fuel *fuel = rd->has_fuel ? &rd->fuel : &m->chain.fuel;
    double T_f = rd->fuel_temperature_K > 0.0 ? rd->fuel_temperature_K
                                              : gc__machine_fuel_T(m->chain.fuel_temperature);
    if (rd->has_fuel && fabs(rd->fuel.LHV_J_per_kg / m->chain.fuel.LHV_J_per_kg - 1.0) > 1e-9)
        gc__machine_warn(out->warnings, &out->n_warnings, GC_MACHINE_W_READING_FUEL,
                         "/readings/fuel",
                         "the readings' fuel (LHV %.4g MJ/kg) is not the design fuel (%.4g "
                         "MJ/kg): the model it is compared with burns the design fuel",
                         rd->fuel.LHV_J_per_kg / 1e6, m->chain.fuel.LHV_J_per_kg / 1e6);
    rc = gc__machine_ctx_init(m, &rd->site, &rd->inlet, &clean, &X, &out->inlet, &amb,
                              out->warnings, &out->n_warnings, err);
    if (rc == GC_OK)
        rc = compressor(rd, &X, out, err);
    if (rc == GC_OK)
        rc = air_flow(m, rd, &X, fuel, T_f, out, err);
    if (rc == GC_OK)
        rc = hot_section(m, rd, &X, fuel, T_f, out, err);
    if (rc != GC_OK)
        return rc;
    gc__machine_inlet_scale(&out->inlet, out->air_mass_flow_kg_per_s);
    out->heat_input_W = rd->fuel_mass_flow_kg_per_s * fuel->LHV_J_per_kg;
    out->heat_rate = out->heat_input_W / rd->net_power_W;
    out->heat_rate_hhv = rd->fuel_mass_flow_kg_per_s * fuel->HHV_J_per_kg / rd->net_power_W;
    out->heat_rate_kJ_per_kWh = 3600.0 * out->heat_rate;
    out->thermal_efficiency = 1.0 / out->heat_rate;
    return compare(m, rd, out, err);
}
