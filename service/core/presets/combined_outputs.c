/*
 * combined_outputs.c — the combined-cycle preset's document (preset.h
 * output rows): model, summary, levels, states of both fluids, processes
 * (with the exergy each destroys), the exergy account, bounds, checks and
 * the HRSG's T-Q diagram data. Absolute figures in W (kW in si, hp in us);
 * per kg/s of intake air when the topping gives no flow (summary/basis).
 * Heat rates as the unit system gives them (kJ/kWh, Btu/kWh).
 */
#include "core/presets/combined_internal.h"

#include <stddef.h>

#define R_(m) offsetof(gc_combined_result, m)
#define P_(m) (offsetof(gc_combined_result, m) + 1)
#define Q(nm, par, q, off, pres, desc)                                                       \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = (off), .present = (pres), .description = desc }
#define N(nm, par, off, pres, desc)                                                          \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = (off), .present = (pres),   \
      .description = desc }
#define OBJ(id, nm, par, pres, desc)                                                         \
    [id] = { .name = nm, .parent = par, .type = GC_OT_OBJECT, .present = (pres),             \
             .description = desc }
#define STR(nm, par, off, desc)                                                              \
    { .name = nm, .parent = par, .type = GC_OT_STRING, .offset = (off), .description = desc }
#define CONST(nm, par, txt, desc)                                                            \
    { .name = nm, .parent = par, .type = GC_OT_CONST, .text = txt, .description = desc }
#define W GC_Q_POWER
#define T GC_Q_TEMPERATURE
#define DT GC_Q_TEMPERATURE_DIFFERENCE
#define S_(m) R_(summary.m)
#define ST(m) offsetof(gc_combined_state, m)
#define PR(m) offsetof(gc_combined_process, m)
#define LV(m) offsetof(gc_combined_level_out, m)
#define TQ(m) offsetof(gc_combined_tq, m)

static const char *const part_names[] = { "gas_turbine", "hrsg", "steam_cycle", NULL };
static const char *const fluid_names[] = { "water", "gas", NULL };

/* Row indices of the parents (the rows are counted: the compiler warns on an
 * overlap, test_combined on a gap). */
enum { MODEL = 0, SUMMARY = 8, LEVELS = 37, STATES = 45, PROCESSES = 57, EXERGY = 68,
       BOUNDS = 79, CARNOT = 80, IDEAL = 84, REVERSIBLE = 90, IDEAL_STEAM = 94, CHECKS = 98,
       TQD = 111, TQ_WATER = 114, TQ_STREAMS = 118, N_ROWS = GC__COMBINED_N_OUTPUTS };

const gc_output gc__combined_outputs[N_ROWS] = {
    OBJ(MODEL, "model", -1, 0, "The models and bases of the figures."),
    STR("topping", MODEL, R_(topping_name), "The topping cycle: the preset it was evaluated "
        "with (\"brayton\"), or \"exhaust\" (given as it is)."),
    CONST("water", MODEL, "IAPWS-IF97 (IAPWS R7-97(2012))", "Water and steam properties."),
    STR("gas", MODEL, R_(gas_label), "The exhaust gas model at the HRSG inlet."),
    CONST("enthalpy_basis", MODEL, "gas: sensible, h(T) - h(298.15 K) of the station's gas; "
          "water: IF97 (u = 0 for the saturated liquid at the triple point)",
          "The enthalpy basis of each fluid's states."),
    CONST("entropy_basis", MODEL, "gas: ideal gas at 1 bar standard pressure (NASA-9); water: "
          "IF97 (s = 0 for the saturated liquid at the triple point); the bases differ",
          "The entropy basis of each fluid's states."),
    Q("dead_state_temperature", MODEL, GC_Q_AMBIENT_TEMPERATURE, R_(exhaust.T_dead_K), 0,
      "Dead state of the exergy figures: the topping's ambient temperature."),
    Q("dead_state_pressure", MODEL, GC_Q_PRESSURE, R_(exhaust.P_dead_Pa), 0,
      "Dead state of the exergy figures: the topping's ambient pressure."),

    OBJ(SUMMARY, "summary", -1, 0, "The plant's figures."),
    { .name = "basis", .parent = SUMMARY, .type = GC_OT_TEXT, .offset = S_(basis),
      .description = "What the absolute figures stand for: the plant at the topping's rated "
                     "flow, or per 1 kg/s of intake air." },
    Q("net_power", SUMMARY, W, S_(net_power_W), 0, "Net electric power of the plant: the "
      "gas turbine's plus the steam turbine generator's, less the pumps'."),
    Q("gas_turbine_power", SUMMARY, W, S_(gas_turbine_power_W), 0,
      "The topping's net electric power."),
    Q("steam_turbine_power", SUMMARY, W, S_(steam_turbine_power_W), 0,
      "Steam turbine generator output: generator efficiency x turbine work."),
    Q("pump_power", SUMMARY, W, S_(pump_power_W), 0, "Power absorbed by every pump."),
    Q("steam_cycle_net_power", SUMMARY, W, S_(steam_cycle_net_power_W), 0,
      "Steam turbine generator output less the pumps'."),
    Q("fuel_heat_input", SUMMARY, W, S_(fuel_heat_W), P_(summary.has_efficiency),
      "Fuel heat of the topping and the duct burner on the LHV (an air-standard topping: its "
      "heat input)."),
    Q("fuel_heat_input_hhv", SUMMARY, W, S_(fuel_heat_hhv_W), P_(summary.has_efficiency),
      "The same on the HHV."),
    Q("duct_burner_fuel_heat", SUMMARY, W, S_(duct_burner_fuel_heat_W), 0,
      "Fuel heat of the duct burner on the LHV (0 unfired)."),
    N("thermal_efficiency", SUMMARY, S_(thermal_efficiency), P_(summary.has_efficiency),
      "Net power over the fuel heat input (LHV)."),
    N("thermal_efficiency_hhv", SUMMARY, S_(thermal_efficiency_hhv), P_(summary.has_efficiency),
      "Net power over the fuel heat input (HHV)."),
    Q("heat_rate", SUMMARY, GC_Q_HEAT_RATE, S_(heat_rate), P_(summary.has_efficiency),
      "Fuel heat (LHV) per unit of net electric energy."),
    Q("heat_rate_hhv", SUMMARY, GC_Q_HEAT_RATE, S_(heat_rate_hhv), P_(summary.has_efficiency),
      "Fuel heat (HHV) per unit of net electric energy."),
    N("gas_turbine_efficiency", SUMMARY, S_(gas_turbine_efficiency),
      P_(summary.has_efficiency), "The topping's net power over its own fuel heat (LHV)."),
    N("steam_cycle_efficiency", SUMMARY, S_(steam_cycle_efficiency), 0,
      "Steam turbine work less pump work over the heat taken by water and steam."),
    N("bottoming_efficiency", SUMMARY, S_(bottoming_efficiency), 0,
      "Steam turbine work less pump work over the exhaust's heat above the dead state plus "
      "the duct burner's fuel heat."),
    N("hrsg_effectiveness", SUMMARY, S_(hrsg_effectiveness), 0,
      "Heat taken from the gas over its heat above the dead-state temperature."),
    N("steam_to_gas_power_ratio", SUMMARY, S_(steam_to_gas_power_ratio), 0,
      "Steam cycle net power over the topping's net power (0 when the topping gives none)."),
    Q("intake_mass_flow", SUMMARY, GC_Q_MASS_FLOW, S_(intake_mass_flow_kg_per_s), 0,
      "The topping's intake air flow (or the given exhaust flow)."),
    Q("exhaust_mass_flow", SUMMARY, GC_Q_MASS_FLOW, S_(exhaust_mass_flow_kg_per_s), 0,
      "Exhaust gas flow into the HRSG."),
    Q("stack_mass_flow", SUMMARY, GC_Q_MASS_FLOW, S_(stack_mass_flow_kg_per_s), 0,
      "Gas flow leaving the stack (with the duct burner's fuel)."),
    Q("exhaust_temperature", SUMMARY, T, S_(exhaust_temperature_K), 0,
      "Gas temperature at the HRSG inlet."),
    Q("stack_temperature", SUMMARY, T, S_(stack_temperature_K), 0,
      "Gas temperature leaving the stack."),
    Q("heat_to_steam", SUMMARY, W, S_(heat_to_steam_W), 0,
      "Heat taken by water and steam in the HRSG."),
    Q("condenser_heat", SUMMARY, W, S_(condenser_heat_W), 0, "Heat rejected in the condenser."),
    Q("condenser_pressure", SUMMARY, GC_Q_PRESSURE, S_(condenser_pressure_Pa), 0,
      "Condensing pressure."),
    Q("condenser_temperature", SUMMARY, T, S_(condenser_temperature_K), 0,
      "Condensing (saturation) temperature."),
    N("exhaust_quality", SUMMARY, S_(exhaust_quality), P_(summary.has_exhaust_quality),
      "Steam quality entering the condenser (when wet)."),

    [LEVELS] = { .name = "levels", .parent = -1, .type = GC_OT_LIST, .offset = R_(levels),
                 .count = P_(n_levels), .item_size = sizeof(gc_combined_level_out),
                 .max_items = GC_STEAM_MAX_LEVELS,
                 .description = "The HRSG's pressure levels, highest pressure first." },
    STR("name", LEVELS, LV(name), "\"hp\", \"ip\" or \"lp\"."),
    Q("pressure", LEVELS, GC_Q_PRESSURE, LV(pressure_Pa), 0, "Drum pressure."),
    Q("saturation_temperature", LEVELS, T, LV(saturation_temperature_K), 0,
      "Saturation temperature at the drum pressure."),
    Q("steam_temperature", LEVELS, T, LV(steam_temperature_K), 0,
      "Steam temperature leaving the level (its superheater, or saturated)."),
    Q("steam_mass_flow", LEVELS, GC_Q_MASS_FLOW, LV(steam_mass_flow_kg_per_s), 0,
      "Steam raised by the level."),
    Q("pinch", LEVELS, DT, LV(pinch_K), 0, "Achieved pinch: evaporator gas exit minus "
      "saturation temperature."),
    Q("approach", LEVELS, DT, LV(approach_K), 0, "Achieved approach: saturation minus "
      "economiser water exit temperature."),

    [STATES] = { .name = "states", .parent = -1, .type = GC_OT_LIST, .offset = R_(states),
                 .count = P_(n_states), .item_size = sizeof(gc_combined_state),
                 .max_items = GC_COMBINED_MAX_STATES,
                 .description = "States of both fluids in plant order: the topping up to the "
                                "HRSG inlet, the HRSG's gas, then water and steam." },
    STR("station", STATES, ST(name), "Stable station name."),
    { .name = "part", .parent = STATES, .type = GC_OT_ENUM, .offset = ST(part),
      .names = part_names, .description = "Part of the plant." },
    { .name = "fluid", .parent = STATES, .type = GC_OT_ENUM, .offset = ST(fluid),
      .names = fluid_names, .description = "\"gas\" or \"water\" (the enthalpy and entropy "
      "bases differ: model)." },
    Q("T", STATES, T, ST(T_K), 0, "Temperature."),
    Q("P", STATES, GC_Q_PRESSURE, ST(P_Pa), 0, "Pressure."),
    Q("h", STATES, GC_Q_SPECIFIC_ENERGY, ST(h_J_per_kg), 0, "Specific enthalpy (model)."),
    Q("s", STATES, GC_Q_SPECIFIC_ENTROPY, ST(s_J_per_kgK), 0, "Specific entropy (model)."),
    Q("v", STATES, GC_Q_SPECIFIC_VOLUME, ST(v_m3_per_kg), 0, "Specific volume."),
    N("x", STATES, ST(x), ST(has_x) + 1, "Quality (vapour mass fraction), water on or inside "
      "the saturation dome."),
    Q("mass_flow", STATES, GC_Q_MASS_FLOW, ST(m_kg_per_s), 0, "Mass flow through the station."),
    Q("exergy", STATES, GC_Q_SPECIFIC_ENERGY, ST(exergy_J_per_kg), 0,
      "Specific flow exergy against the dead state (physical, same fluid)."),

    [PROCESSES] = { .name = "processes", .parent = -1, .type = GC_OT_LIST,
                    .offset = R_(processes), .count = P_(n_processes),
                    .item_size = sizeof(gc_combined_process),
                    .max_items = GC_COMBINED_MAX_PROCESSES,
                    .description = "Components in plant order with their power, duty and the "
                                   "exergy they destroy." },
    STR("name", PROCESSES, PR(name), "Stable component name."),
    { .name = "part", .parent = PROCESSES, .type = GC_OT_ENUM, .offset = PR(part),
      .names = part_names, .description = "Part of the plant." },
    STR("kind", PROCESSES, PR(kind), "Kind of process (\"compression\", \"economiser\", "
        "\"turbine\", ...)."),
    STR("from", PROCESSES, PR(from), "Station the main stream enters from."),
    STR("to", PROCESSES, PR(to), "Station the main stream leaves to."),
    Q("mass_flow", PROCESSES, GC_Q_MASS_FLOW, PR(m_kg_per_s), 0, "Main stream flow."),
    Q("power", PROCESSES, W, PR(power_W), PR(has_power) + 1, "Turbine: delivered; compressor "
      "or pump: absorbed."),
    Q("duty", PROCESSES, W, PR(duty_W), PR(has_duty) + 1, "Heat into the stream (HRSG "
      "sections, combustor), or rejected (condenser, heat rejection)."),
    Q("exergy_destroyed", PROCESSES, W, PR(exergy_destroyed_W), 0, "T0 x entropy generated."),
    Q("dT_min", PROCESSES, DT, PR(dT_min_K), PR(has_dT) + 1, "HRSG section: smallest gas "
      "minus water temperature along it."),

    OBJ(EXERGY, "exergy", -1, 0, "The plant's exergy account (dead state: model)."),
    Q("fuel_exergy", EXERGY, W, R_(exergy.fuel_W), P_(exergy.has_fuel), "Exergy supplied: "
      "the topping's and the duct burner's fuel (chemical and physical as supplied), or the "
      "topping's heat exergy when air-standard (absent for an exhaust as given)."),
    Q("intake_exergy", EXERGY, W, R_(exergy.intake_W), 0, "Exergy of the intake stream."),
    Q("net_power", EXERGY, W, R_(exergy.net_power_W), 0,
      "Net work of the plant's turbomachines (before the generators)."),
    Q("destroyed", EXERGY, W, R_(exergy.destroyed_W), 0, "Sum over the processes."),
    Q("stack_loss", EXERGY, W, R_(exergy.stack_W), 0, "Physical exergy of the stack gas."),
    Q("condenser_loss", EXERGY, W, R_(exergy.condenser_W), 0,
      "Exergy of the condenser's heat, Q (1 - T0 / T_b) with T_b the lower of the "
      "condensing and the dead-state temperature (0 at or above T0; negative when it "
      "condenses below the dead state, which a warning names)."),
    Q("exhaust_chemical_loss", EXERGY, W, R_(exergy.exhaust_chemical_W), 0,
      "Chemical exergy of the stack gas (a fuel-fired topping or duct burner)."),
    Q("heat_rejected_loss", EXERGY, W, R_(exergy.heat_rejected_W), 0,
      "Exergy of heat the topping rejects elsewhere (intercoolers)."),
    N("efficiency", EXERGY, R_(exergy.efficiency), P_(exergy.has_fuel),
      "Net electric power over the exergy supplied."),
    N("balance", EXERGY, R_(exergy.balance_rel), P_(exergy.balance_checked),
      "|supplied + intake - net work - destroyed - losses| over the fuel heat (a topping "
      "with exergy books; a duct burner burning a gas fuel or none)."),

    OBJ(BOUNDS, "bounds", -1, 0, "What the plant could at most reach (combined.h)."),
    OBJ(CARNOT, "carnot", BOUNDS, 0, "Carnot efficiency between the plant's extreme "
        "temperatures (every state of both fluids)."),
    N("thermal_efficiency", CARNOT, R_(bounds.carnot_efficiency), 0, "1 - T_min / T_max."),
    Q("T_max", CARNOT, T, R_(bounds.T_max_K), 0, "Highest temperature of the plant."),
    Q("T_min", CARNOT, T, R_(bounds.T_min_K), 0, "Lowest temperature of the plant."),
    OBJ(IDEAL, "ideal", BOUNDS, P_(bounds.has_ideal), "Internally reversible: the "
        "topping's ideal counterpart and a reversible bottoming engine on its exhaust (and "
        "the duct burner's fuel)."),
    N("thermal_efficiency", IDEAL, R_(bounds.ideal_efficiency), 0,
      "Its net power over the ideal topping's and the duct burner's fuel heat (LHV)."),
    Q("net_power", IDEAL, W, R_(bounds.ideal_net_power_W), 0, "Its net power."),
    Q("gas_turbine_power", IDEAL, W, R_(bounds.ideal_gas_turbine_power_W), 0,
      "The ideal topping's net work."),
    Q("bottoming_power", IDEAL, W, R_(bounds.ideal_bottoming_power_W), 0,
      "Physical flow exergy of the ideal topping's exhaust and the duct burner fuel's "
      "exergy (the reversible bottoming engine's work)."),
    CONST("definition", IDEAL, "topping: its preset's ideal counterpart (efficiencies 1, "
          "losses 0, the same pressure ratio and turbine inlet temperature); bottoming: a "
          "reversible engine turning its exhaust's whole physical flow exergy (dead state: "
          "the ambient) and the duct burner fuel's exergy into work",
          "How the ideal is defined."),
    OBJ(REVERSIBLE, "reversible_bottoming", BOUNDS, P_(bounds.has_reversible),
        "The actual topping plus a reversible engine turning its exhaust's whole flow "
        "exergy (and the duct burner fuel's) into work: no bottoming cycle can do better."),
    N("thermal_efficiency", REVERSIBLE, R_(bounds.reversible_efficiency), 0,
      "Its net power over the fuel heat (LHV)."),
    Q("net_power", REVERSIBLE, W, R_(bounds.reversible_net_power_W), 0, "Its net power."),
    Q("exhaust_exergy", REVERSIBLE, W, R_(bounds.exhaust_exergy_W), 0,
      "Physical flow exergy of the exhaust at the HRSG inlet."),
    OBJ(IDEAL_STEAM, "ideal_steam_components", BOUNDS, P_(bounds.has_ideal_steam),
        "The actual topping and the same HRSG design with every steam-side efficiency 1 "
        "and no gas-side pressure loss."),
    N("thermal_efficiency", IDEAL_STEAM, R_(bounds.ideal_steam_efficiency), 0,
      "Its net power over the fuel heat (LHV)."),
    Q("net_power", IDEAL_STEAM, W, R_(bounds.ideal_steam_net_power_W), 0, "Its net power."),
    Q("steam_cycle_net_power", IDEAL_STEAM, W, R_(bounds.ideal_steam_cycle_net_power_W), 0,
      "Its steam cycle's net power."),

    OBJ(CHECKS, "checks", -1, 0, "Built-in checks (relative ones over the gas heat or the "
        "fuel heat)."),
    N("energy_hrsg", CHECKS, R_(checks.energy_hrsg_rel), 0, "|gas heat - water heat| over "
      "the gas heat."),
    N("energy_steam_cycle", CHECKS, R_(checks.energy_steam_cycle_rel), 0,
      "|heat in + pump work - turbine work - condenser heat| over the gas heat."),
    N("energy_bottoming", CHECKS, R_(checks.energy_bottoming_rel), 0, "The bottoming cycle "
      "with its duct burner on absolute enthalpies, over the gas heat."),
    N("energy_plant", CHECKS, R_(checks.energy_plant_rel), P_(checks.energy_plant_checked),
      "The whole plant: fuel heat + pump work + the intake's and fuels' sensible enthalpy = "
      "topping net work + steam turbine work + condenser heat + other heat rejected + "
      "burner losses + the stack gas's sensible enthalpy, over the fuel heat."),
    N("energy_topping", CHECKS, R_(checks.energy_topping_rel), 0,
      "The topping's own energy closure."),
    N("exergy_bottoming", CHECKS, R_(checks.exergy_bottoming_rel),
      P_(checks.exergy_bottoming_checked), "The bottoming cycle's exergy balance (unfired)."),
    Q("pinch_error", CHECKS, DT, R_(checks.pinch_error_K), 0,
      "Largest |achieved - designed pinch| (pinch design)."),
    Q("approach_error", CHECKS, DT, R_(checks.approach_error_K), 0,
      "Largest |achieved - designed approach|."),
    Q("min_temperature_difference", CHECKS, DT, R_(checks.min_temperature_difference_K), 0,
      "Smallest gas minus water temperature on the sampled T-Q diagram."),
    { .name = "no_temperature_cross", .parent = CHECKS, .type = GC_OT_BOOL,
      .offset = R_(checks.no_temperature_cross),
      .description = "The gas is hotter than the water everywhere sampled." },
    { .name = "stack_above_minimum", .parent = CHECKS, .type = GC_OT_BOOL,
      .offset = R_(checks.stack_above_minimum),
      .description = "The stack temperature is at or above stack_temperature_min." },
    N("tolerance", CHECKS, R_(checks.tolerance), 0, "Tolerance of the relative checks."),

    [TQD] = { .name = "tq_diagram", .parent = -1, .type = GC_OT_LIST, .offset = R_(tq),
              .count = P_(n_tq), .item_size = sizeof(gc_combined_tq), .max_items = GC_STEAM_MAX_TQ,
              .description = "The HRSG's T-Q diagram: heat taken from the gas counted from the "
                             "stack, gas and water temperatures; each section sampled cold end "
                             "first, the bends of the water lines added." },
    Q("Q", TQD, W, TQ(Q_W), 0, "Heat taken from the gas between the stack and here."),
    Q("T_gas", TQD, T, TQ(T_gas_K), 0, "Gas temperature."),
    [TQ_WATER] = { .name = "T_water", .parent = TQD, .type = GC_OT_ARRAY,
                   .description = "Temperatures of the water streams heated in this section "
                                  "(named in streams)." },
    Q("", TQ_WATER, T, TQ(T_water_K[0]), TQ(has[0]) + 1, "Water temperature."),
    Q("", TQ_WATER, T, TQ(T_water_K[1]), TQ(has[1]) + 1, "Water temperature."),
    Q("", TQ_WATER, T, TQ(T_water_K[2]), TQ(has[2]) + 1, "Water temperature."),
    [TQ_STREAMS] = { .name = "streams", .parent = TQD, .type = GC_OT_ARRAY,
                     .description = "The processes (HRSG sections) of those streams." },
    { .name = "", .parent = TQ_STREAMS, .type = GC_OT_STRING, .offset = TQ(stream[0]),
      .present = TQ(has[0]) + 1, .description = "Section name." },
    { .name = "", .parent = TQ_STREAMS, .type = GC_OT_STRING, .offset = TQ(stream[1]),
      .present = TQ(has[1]) + 1, .description = "Section name." },
    { .name = "", .parent = TQ_STREAMS, .type = GC_OT_STRING, .offset = TQ(stream[2]),
      .present = TQ(has[2]) + 1, .description = "Section name." },
};
