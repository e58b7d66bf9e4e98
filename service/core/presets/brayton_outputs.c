/*
 * brayton_outputs.c — the figures the Brayton preset adds to its document
 * (preset.h output rows): to the cycle's summary (per kg of intake air), the
 * plant figures for a rated net power, the searched optimum pressure ratios
 * and the fuel. Heat rates are also given in the trade's fixed units (kJ/kWh
 * and Btu/kWh whatever the unit system; 1 Btu = 1055.05585262 J, the
 * International Table Btu).
 */
#include "core/presets/brayton_internal.h"

#include <stddef.h>

#define R_(m) offsetof(gc_brayton_result, m)
#define P_(m) (offsetof(gc_brayton_result, m) + 1)
#define Q(nm, par, q, m, pres, desc)                                                         \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = R_(m), .present = (pres), .description = desc }
#define N(nm, par, m, pres, desc)                                                            \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = R_(m), .present = (pres),   \
      .description = desc }
#define FIXED(nm, par, unit, m, pres, desc)                                                  \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .unit_si = unit, .unit_us = unit,     \
      .offset = R_(m), .present = (pres), .description = desc }
#define OPT(par, m)                                                                           \
    { .name = "found", .parent = par, .type = GC_OT_BOOL, .offset = R_(m.found),             \
      .description = "Whether some pressure ratio within the bounds could be run." },        \
    N("pressure_ratio", par, m.pressure_ratio, P_(m.found), "The maximising pressure ratio."), \
    N("thermal_efficiency", par, m.thermal_efficiency, P_(m.found),                           \
      "Thermal efficiency at that pressure ratio."),                                          \
    Q("specific_work", par, GC_Q_SPECIFIC_ENERGY, m.specific_work, P_(m.found),              \
      "Net gas-path work per kg of intake air at that pressure ratio."),                       \
    { .name = "at_lower_bound", .parent = par, .type = GC_OT_BOOL, .offset = R_(m.at_lower_bound), \
      .description = "The maximum is the search's lower bound (it may lie below)." },        \
    { .name = "at_upper_bound", .parent = par, .type = GC_OT_BOOL, .offset = R_(m.at_upper_bound), \
      .description = "The maximum is the search's upper bound (it may lie above)." },        \
    { .name = "at_feasibility_limit", .parent = par, .type = GC_OT_BOOL,                      \
      .offset = R_(m.at_feasibility_limit),                                                  \
      .description = "The maximum lies against pressure ratios where the cycle cannot run "  \
                     "(e.g. a compressor exit hotter than the turbine inlet)." },            \
    { .name = "evaluations", .parent = par, .type = GC_OT_INTEGER, .offset = R_(m.evaluations), \
      .description = "Full chain evaluations the search used (the scan is shared)." }

enum { SUMMARY = 0, PLANT = 20, OPTIMUM = 38, MAX_EFF = 39, MAX_WORK = 48, MODEL = 59,
       COOLING = 61 };

const gc_output gc__brayton_outputs[GC__BRAYTON_N_OUTPUTS] = {
    [SUMMARY] = { .name = "summary", .parent = -1, .type = GC_OT_OBJECT,
                  .description = "Figures the preset adds to the cycle's summary, per kg of "
                                 "intake air." },
    Q("specific_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, specific_work, 0,
      "Net gas-path work w_net per kg of intake air."),
    Q("specific_shaft_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, specific_shaft_work, 0,
      "Shaft work: mechanical efficiency x net gas-path work."),
    Q("specific_electric_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, specific_electric_work, 0,
      "Electric work: generator efficiency x shaft work."),
    Q("compressor_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, compressor_work, 0,
      "Work absorbed by all compressor stages."),
    Q("turbine_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, turbine_work, 0,
      "Work delivered by all turbine stages."),
    N("back_work_ratio", SUMMARY, back_work_ratio, 0,
      "Compressor work over turbine work."),
    N("thermal_efficiency_hhv", SUMMARY, thermal_efficiency_hhv, P_(has_fuel),
      "Thermal efficiency on the fuel's higher heating value (with a fuel)."),
    N("electric_efficiency", SUMMARY, electric_efficiency, 0,
      "Electric work over the heat input (with a fuel: on the LHV)."),
    Q("regenerator_heat", SUMMARY, GC_Q_SPECIFIC_ENERGY, regenerator_heat, P_(has_regenerator),
      "Heat the regenerator moves from the exhaust to the compressed air."),
    Q("intercooler_heat", SUMMARY, GC_Q_SPECIFIC_ENERGY, intercooler_heat, P_(has_intercooler),
      "Heat the intercoolers remove."),
    N("fuel_air_ratio", SUMMARY, fuel_air_ratio, P_(has_fuel),
      "Fuel per kg of intake air, all combustors."),
    N("fuel_air_ratio_main", SUMMARY, fuel_air_ratio_main, P_(has_fuel),
      "Fuel per kg of air entering the main combustor."),
    N("equivalence_ratio", SUMMARY, equivalence_ratio, P_(has_fuel),
      "Fuel-air ratio of the main combustor over the stoichiometric one."),
    Q("T_compressor_exit", SUMMARY, GC_Q_TEMPERATURE, T_compressor_exit, 0,
      "Temperature at the last compressor stage's exit."),
    Q("P_compressor_exit", SUMMARY, GC_Q_PRESSURE, P_compressor_exit, 0,
      "Pressure at the last compressor stage's exit."),
    Q("T_turbine_exit", SUMMARY, GC_Q_TEMPERATURE, T_turbine_exit, 0,
      "Temperature at the last turbine stage's exit."),
    Q("T_exhaust", SUMMARY, GC_Q_TEMPERATURE, T_exhaust, 0,
      "Temperature of the exhaust leaving the plant (after the regenerator and the exhaust "
      "loss)."),
    Q("heat_rate", SUMMARY, GC_Q_HEAT_RATE, heat_rate, P_(has_power),
      "Heat input per unit of electric output, on the LHV (with net_power)."),
    Q("heat_rate_hhv", SUMMARY, GC_Q_HEAT_RATE, heat_rate_hhv, P_(has_power),
      "Heat input per unit of electric output, on the HHV (with net_power)."),
    [PLANT] = { .name = "plant", .parent = -1, .type = GC_OT_OBJECT, .present = P_(has_power),
                .description = "Plant figures for the rated net_power." },
    Q("net_power", PLANT, GC_Q_POWER, net_power, 0, "Electric power at the generator terminals."),
    Q("shaft_power", PLANT, GC_Q_POWER, shaft_power, 0, "Shaft power: net power over the "
      "generator efficiency."),
    Q("air_mass_flow", PLANT, GC_Q_MASS_FLOW, air_mass_flow, 0, "Intake (humid) air flow."),
    Q("fuel_mass_flow", PLANT, GC_Q_MASS_FLOW, fuel_mass_flow, P_(has_fuel), "Fuel flow."),
    Q("exhaust_mass_flow", PLANT, GC_Q_MASS_FLOW, exhaust_mass_flow, 0,
      "Exhaust flow: air and fuel."),
    Q("heat_input_power", PLANT, GC_Q_POWER, heat_input_power, 0,
      "Fuel energy input on the LHV (air-standard: the heat input)."),
    Q("heat_input_power_hhv", PLANT, GC_Q_POWER, heat_input_power_hhv, 0,
      "Fuel energy input on the HHV."),
    Q("heat_rate", PLANT, GC_Q_HEAT_RATE, heat_rate, 0, "Heat rate on the LHV."),
    Q("heat_rate_hhv", PLANT, GC_Q_HEAT_RATE, heat_rate_hhv, 0, "Heat rate on the HHV."),
    FIXED("heat_rate_kJ_per_kWh", PLANT, "kJ/kWh", heat_rate_kJ_per_kWh, 0,
          "Heat rate on the LHV in kJ/kWh whatever the unit system."),
    FIXED("heat_rate_hhv_kJ_per_kWh", PLANT, "kJ/kWh", heat_rate_hhv_kJ_per_kWh, 0,
          "Heat rate on the HHV in kJ/kWh."),
    FIXED("heat_rate_Btu_per_kWh", PLANT, "Btu/kWh", heat_rate_Btu_per_kWh, 0,
          "Heat rate on the LHV in Btu/kWh whatever the unit system."),
    FIXED("heat_rate_hhv_Btu_per_kWh", PLANT, "Btu/kWh", heat_rate_hhv_Btu_per_kWh, 0,
          "Heat rate on the HHV in Btu/kWh."),
    Q("co2_mass_flow", PLANT, GC_Q_MASS_FLOW, co2_mass_flow, P_(has_fuel),
      "CO2 formed from the fuel (complete combustion)."),
    FIXED("co2_kg_per_MWh", PLANT, "kg/MWh", co2_kg_per_MWh, P_(has_fuel),
          "CO2 per MWh of electric output."),
    Q("exhaust_temperature", PLANT, GC_Q_AMBIENT_TEMPERATURE, exhaust_temperature, 0,
      "Temperature of the exhaust leaving the plant."),
    Q("exhaust_heat_power", PLANT, GC_Q_POWER, exhaust_heat_power, 0,
      "Exhaust enthalpy flow above the site temperature: what a recovery boiler could take "
      "at most."),
    [OPTIMUM] = { .name = "optimum", .parent = -1, .type = GC_OT_OBJECT,
                  .present = P_(has_optimum),
                  .description = "The pressure ratios of maximum efficiency and of maximum "
                                 "specific work for the same inputs (optimum_search=true): a "
                                 "log-spaced scan, then Brent's method." },
    [MAX_EFF] = { .name = "max_efficiency", .parent = OPTIMUM, .type = GC_OT_OBJECT,
                  .description = "The pressure ratio of maximum thermal efficiency." },
    OPT(MAX_EFF, max_efficiency),
    [MAX_WORK] = { .name = "max_specific_work", .parent = OPTIMUM, .type = GC_OT_OBJECT,
                   .description = "The pressure ratio of maximum specific work." },
    OPT(MAX_WORK, max_specific_work),
    N("search_lower_bound", OPTIMUM, max_efficiency.lower_bound, 0,
      "Lowest pressure ratio searched."),
    N("search_upper_bound", OPTIMUM, max_efficiency.upper_bound, 0,
      "Highest pressure ratio searched."),
    [MODEL] = { .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                .description = "Model facts (added to the cycle's model)." },
    { .name = "fuel", .parent = MODEL, .type = GC_OT_FUEL, .flags = GC_OF_INPUT | GC_OF_EXERGY,
      .offset = offsetof(gc_brayton_input, fuel),
      .present = offsetof(gc_brayton_input, has_fuel) + 1,
      .description = "The fuel: its label, heating values at 298.15 K and standard chemical "
                     "exergy (Szargut's reference environment)." },
    [COOLING] = { .name = "cooling", .parent = -1, .type = GC_OT_OBJECT,
                  .present = P_(has_cooling),
                  .description = "The cooled first stage (with cooling): the split of the "
                                 "compressor air at the given pressure ratio (cooling.h). The "
                                 "cycle's turbine_inlet station is the first rotor inlet." },
    Q("turbine_inlet_temperature", COOLING, GC_Q_TEMPERATURE, cooled.combustor_exit_T_K, 0,
      "Combustor exit, the first nozzle row's inlet (as given)."),
    Q("rotor_inlet_temperature", COOLING, GC_Q_TEMPERATURE, cooled.rotor_inlet_T_K, 0,
      "First rotor inlet after the coolant has mixed in (the firing temperature)."),
    N("cooling_air_fraction", COOLING, cooled.coolant_fraction, 0,
      "Coolant over compressor air."),
    N("nozzle_coolant_ratio", COOLING, cooled.nozzle_psi, 0,
      "Coolant of the first nozzle row over the gas through it (psi)."),
    N("rotor_coolant_ratio", COOLING, cooled.rotor_psi, 0,
      "Coolant of the first rotor row over the gas through it (psi)."),
    N("core_fuel_air_ratio", COOLING, cooled.core_fuel_air_ratio, 0,
      "Fuel over the air that reaches the combustor (compressor air less coolant)."),
};
