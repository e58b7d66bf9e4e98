/*
 * turbojet.c — the turbojet preset declared once (turbojet.h, preset.h): its
 * field table (every input with default, bounds and description), its output
 * table (the propulsion figures it adds to the cycle's summary, the
 * "propulsion" object, the ideal turbojet's thrust beside the ideal bound,
 * the fuel), the checks between inputs, and the descriptor's hooks
 * (evaluate, echo, title, the figures it quotes). The chain, the passes and
 * the figures are in turbojet_cycle.c.
 *
 * Bounds, once for every caller: flight Mach number 0..5, altitude
 * -5000..86000 m (the U.S. Standard Atmosphere's range), compressor
 * pressure ratio 1..100, turbine inlet temperature 300..2500 K, afterburner
 * temperature up to 2800 K (0 = none), efficiencies and the inlet recovery in
 * (0, 1], pressure losses 0..0.5, fuel temperature 200..1000 K.
 *
 * Units of the propulsion figures (no units.h quantity; factors exact by the
 * definitions of lbm and lbf, NIST SP 811 B.8): specific thrust N s/kg (us:
 * lbf s/lbm), TSFC mg/(N s) (us: lbm/(lbf h)), exit area per air flow
 * m2 s/kg (us: ft2 s/lbm).
 */
#include "core/presets/presets.h"
#include "core/presets/turbojet_internal.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define IN(member) offsetof(gc_turbojet_input, member)
#define GIVEN(member) (offsetof(gc_turbojet_input, member) + 1)

static const char *const basis_names[] = { "isentropic", "polytropic", NULL };
static const char *const nozzle_names[] = { "expanded", "convergent", NULL };
static const char *const heat_names[] = { "air_standard", "fuel", NULL };
static const char *const gas_models[] = { "air", "cold", NULL };

#define NUM(id, nm, q, fl, d, lo, hi, member, desc)                                          \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q, .flags = (fl), .def = (d),     \
             .min = (lo), .max = (hi), .offset = IN(member), .description = desc }
#define EFF(id, nm, member, desc)                                                           \
    NUM(id, nm, GC_Q_FRACTION, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 1.0, 0.0, 1.0,       \
        member, desc)
#define LOSS(id, nm, member, desc)                                                          \
    NUM(id, nm, GC_Q_FRACTION, GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 0.5, member, desc)
#define SITE(id, nm, q, fl, lo, hi, member, has, desc)                                      \
    [id] = { .name = nm, .parent = GC_TF_SITE, .type = GC_FT_NUMBER, .quantity = q,          \
             .flags = (fl) | GC_FF_NO_ECHO, .min = (lo), .max = (hi),                       \
             .offset = IN(site) + offsetof(gc_site_input, member),                          \
             .given = IN(site) + offsetof(gc_site_input, has) + 1, .description = desc }

static const gc_field fields[GC_TF_COUNT] = {
    [GC_TF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "Inputs of the turbojet." },
    NUM(GC_TF_FLIGHT_MACH_NUMBER, "flight_mach_number", GC_Q_RATIO, GC_FF_MIN | GC_FF_MAX, 0.0,
        0.0, GC_TURBOJET_MACH_MAX, flight_mach_number,
        "Flight Mach number: the free stream's speed over its speed of sound."),
    [GC_TF_ALTITUDE] = { .name = "altitude", .type = GC_FT_NUMBER, .quantity = GC_Q_LENGTH,
                         .flags = GC_FF_MIN | GC_FF_MAX, .min = -5000.0, .max = 86000.0,
                         .offset = IN(altitude), .given = GIVEN(has_altitude),
                         .description = "Geometric flight altitude (the U.S. Standard "
                         "Atmosphere 1976 gives the ambient pressure and temperature); the "
                         "same as site.altitude (give one)." },
    [GC_TF_SITE] = { .name = "site", .type = GC_FT_OBJECT, .flags = GC_FF_SITE,
                     .description = "Ambient (free-stream static) conditions: overrides of the "
                     "standard atmosphere's temperature and pressure at the altitude, and the "
                     "relative humidity (default 0: dry air in flight). Echoed as resolved, "
                     "with where each value came from." },
    EFF(GC_TF_INLET_PRESSURE_RECOVERY, "inlet_pressure_recovery", inlet_pressure_recovery,
        "Total-pressure recovery of the inlet: total pressure after the inlet over that after "
        "the diffuser."),
    EFF(GC_TF_DIFFUSER_EFFICIENCY, "diffuser_efficiency", diffuser_efficiency,
        "Diffuser isentropic efficiency (h02s - h0)/(h02 - h0)."),
    NUM(GC_TF_PRESSURE_RATIO, "pressure_ratio", GC_Q_RATIO,
        GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 10.0, 1.0, GC_TURBOJET_RP_MAX, pressure_ratio,
        "Compressor delivery over inlet total pressure."),
    NUM(GC_TF_TURBINE_INLET_TEMPERATURE, "turbine_inlet_temperature", GC_Q_TEMPERATURE,
        GC_FF_MIN | GC_FF_MAX, 1400.0, 300.0, 2500.0, turbine_inlet_temperature,
        "Combustor exit temperature; above about 1500 K the blades need cooling air, which "
        "this engine does not bleed (a warning says so)."),
    EFF(GC_TF_COMPRESSOR_EFFICIENCY, "compressor_efficiency", compressor_efficiency,
        "Compressor efficiency (isentropic, or polytropic with efficiency_basis)."),
    EFF(GC_TF_TURBINE_EFFICIENCY, "turbine_efficiency", turbine_efficiency,
        "Turbine efficiency (isentropic, or polytropic with efficiency_basis)."),
    [GC_TF_EFFICIENCY_BASIS] = { .name = "efficiency_basis", .type = GC_FT_ENUM,
                                 .names = basis_names, .offset = IN(polytropic_efficiency),
                                 .description = "Whether the compressor and turbine "
                                 "efficiencies are isentropic or polytropic (small-stage)." },
    EFF(GC_TF_NOZZLE_EFFICIENCY, "nozzle_efficiency", nozzle_efficiency,
        "Nozzle isentropic efficiency (h0 - h9)/(h0 - h9s)."),
    LOSS(GC_TF_COMBUSTOR_PRESSURE_LOSS, "combustor_pressure_loss", combustor_pressure_loss,
         "Fractional pressure loss dP/P of the combustor."),
    EFF(GC_TF_COMBUSTOR_EFFICIENCY, "combustor_efficiency", combustor_efficiency,
        "Fraction of the fuel's energy released in the gas, in the combustor and the "
        "afterburner."),
    EFF(GC_TF_MECHANICAL_EFFICIENCY, "mechanical_efficiency", mechanical_efficiency,
        "Compressor work over turbine work (the shaft balance)."),
    [GC_TF_AFTERBURNER_TEMPERATURE] = {
        .name = "afterburner_temperature", .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,
        .flags = GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, .min = 0.0, .max = 2800.0,
        .offset = IN(afterburner_temperature), .given = GIVEN(has_afterburner),
        .description = "Afterburner exit temperature; absent or 0: no afterburner (its two "
                       "inputs are echoed only with one)." },
    NUM(GC_TF_AFTERBURNER_PRESSURE_LOSS, "afterburner_pressure_loss", GC_Q_FRACTION,
        GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 0.5, afterburner_pressure_loss,
        "Fractional pressure loss dP/P of the afterburner."),
    [GC_TF_AFTERBURNER_PRESSURE_LOSS].given = GIVEN(has_afterburner),
    [GC_TF_NOZZLE] = { .name = "nozzle", .type = GC_FT_ENUM, .names = nozzle_names,
                       .offset = IN(nozzle),
                       .description = "expanded: exit pressure = ambient; convergent: exit "
                       "pressure = max(ambient, critical), choked flagged, pressure thrust "
                       "included. A choked jet then expands freely to ambient outside the "
                       "engine (the process \"plume\": a throttle from the exit pressure to "
                       "the ambient pressure at any ratio, at constant total enthalpy and "
                       "velocity)." },
    [GC_TF_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "site_air",
                    .offset = IN(gas), .given = GIVEN(has_gas),
                    .description = "Working fluid (air-standard) or oxidiser: \"air\" (dry air, "
                    "NASA 9-coefficient polynomials) or \"cold\" (constant cp and k); default "
                    "the ambient air (echoed as \"site_air\"). A fuel needs a species mixture, "
                    "so not the cold model." },
    [GC_TF_GAS_CP] = { .name = "cp", .parent = GC_TF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                       .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                       .def = 1005.0, .min = 100.0, .max = 20000.0,
                       .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                       .description = "Cold model: constant specific heat at constant "
                       "pressure." },
    [GC_TF_GAS_K] = { .name = "k", .parent = GC_TF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                      .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                      .def = 1.4, .min = 1.0, .max = 1.7,
                      .offset = IN(gas) + offsetof(gc_gas, k_cold),
                      .description = "Cold model: constant ratio of specific heats cp/cv." },
    [GC_TF_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL,
                     .offset = IN(fuel), .aux = GIVEN(fuel_spec), .given = GIVEN(has_fuel),
                     .description = "Fuel burnt in the combustor and the afterburner "
                     "(complete combustion): a name (\"methane\"), {\"analysis\": {species: "
                     "mole fraction}} or {\"formula\": \"CxHyOzNw\", \"lower_heating_value\": "
                     "...}; absent: air-standard heat addition. With a fuel the efficiencies "
                     "and the TSFC are on its LHV." },
    NUM(GC_TF_FUEL_TEMPERATURE, "fuel_temperature", GC_Q_TEMPERATURE,
        GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, 298.15, 200.0, 1000.0, fuel_temperature,
        "Fuel supply temperature (echoed with a fuel)."),
    [GC_TF_FUEL_TEMPERATURE].given = GIVEN(has_fuel_temperature),
    [GC_TF_HEAT_ADDITION] = { .name = "heat_addition", .type = GC_FT_ENUM,
                              .flags = GC_FF_DERIVED, .names = heat_names,
                              .offset = IN(heat_mode),
                              .description = "How heat is added: \"fuel\" when a fuel is "
                              "given, else \"air_standard\" (echo only)." },
    SITE(GC_TF_SITE_ALTITUDE, "altitude", GC_Q_LENGTH, GC_FF_MIN | GC_FF_MAX, -5000.0, 86000.0,
         altitude_m, has_altitude, "Geometric altitude (the same as the top-level altitude)."),
    SITE(GC_TF_SITE_TEMPERATURE, "temperature", GC_Q_AMBIENT_TEMPERATURE,
         GC_FF_MIN | GC_FF_MAX, 173.15, 473.15, T_K, has_temperature,
         "Ambient static temperature (instead of the standard atmosphere's)."),
    SITE(GC_TF_SITE_PRESSURE, "pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
         0.0, 2.0e5, P_Pa, has_pressure,
         "Ambient static pressure (instead of the standard atmosphere's)."),
    SITE(GC_TF_SITE_RELATIVE_HUMIDITY, "relative_humidity", GC_Q_FRACTION,
         GC_FF_MIN | GC_FF_MAX, 0.0, 1.0, RH, has_relative_humidity,
         "Relative humidity (default 0)."),
};

const int gc__turbojet_site_field[5] = { GC_TF_SITE, GC_TF_SITE_ALTITUDE, GC_TF_SITE_TEMPERATURE,
                                         GC_TF_SITE_PRESSURE, GC_TF_SITE_RELATIVE_HUMIDITY };

/* ---- checks between inputs -------------------------------------------------------------- */

int gc__turbojet_check(const gc_turbojet_input *in, int table, gc_report *rep)
{
    int before = rep->n_errors;
    if (table)
        gc_preset_validate(&gc_preset_turbojet, in, rep);
    if (in->has_altitude && in->site.has_altitude)
        gc_report_error(rep, GC_ERR_INVALID, GC_TF_ALTITUDE, -1,
                        "is given twice (also as /site/altitude): give it once");
    if (in->heat_mode != GC_TURBOJET_AIR_STANDARD && in->heat_mode != GC_TURBOJET_FUEL)
        gc_report_error(rep, GC_ERR_INVALID, GC_TF_HEAT_ADDITION, -1,
                        "must be air-standard or a fuel");
    if (in->heat_mode == GC_TURBOJET_FUEL || in->has_fuel) {
        if (!in->has_fuel)
            gc_report_error(rep, GC_ERR_INVALID, GC_TF_FUEL, -1,
                            "is required when heat comes from a fuel");
        if (in->has_gas && in->gas.kind != GC_GAS_MIXTURE)
            gc_report_error(rep, GC_ERR_INVALID, GC_TF_GAS, -1,
                            "must be a species mixture (air) when a fuel is burnt");
    }
    return rep->n_errors > before ? rep->errors[before].code : GC_OK;
}

int gc_turbojet_validate(const gc_turbojet_input *in, gc_error *errs, int max_errors,
                         int *n_errors)
{
    static _Thread_local gc_report rep;
    gc_report_init(&rep);
    int rc = gc__turbojet_check(in, 1, &rep);
    for (int i = 0; i < rep.n_errors && i < max_errors && errs; i++) {
        errs[i] = rep.errors[i];
        gc_preset_name_error(&gc_preset_turbojet, &errs[i]);
    }
    if (n_errors)
        *n_errors = rep.n_errors;
    return rc;
}

int gc_turbojet_evaluate(const gc_turbojet_input *in, gc_turbojet_result *r, gc_error *err)
{
    gc_error first;
    int n_err = 0;
    int rc = gc_turbojet_validate(in, &first, 1, &n_err);
    if (rc != GC_OK) {
        if (err != NULL)
            *err = first;
        return rc;
    }
    rc = gc__turbojet_evaluate(in, r, err);
    return rc == GC_OK ? rc : gc_preset_name_error(&gc_preset_turbojet, err);
}

void gc_turbojet_input_init(gc_turbojet_input *in)
{
    gc_preset_input_init(&gc_preset_turbojet, in);
}

const gc_preset *gc_turbojet_preset(void)
{
    return &gc_preset_turbojet;
}

/* ---- the descriptor's hooks --------------------------------------------------------------- */

static void init(void *input)
{
    gc_site_input_init(&((gc_turbojet_input *)input)->site);
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    gc_turbojet_input x = *(const gc_turbojet_input *)input;
    if (x.has_fuel)
        x.heat_mode = GC_TURBOJET_FUEL;
    gc_report one;
    gc_report_init(&one);
    int rc = gc__turbojet_check(&x, 0, &one);
    if (rc != GC_OK)
        return gc_report_add(rep, &one.errors[0]);
    gc_error err;
    gc_error_clear(&err);
    const gc_turbojet_result *r = result;
    rc = gc__turbojet_evaluate(&x, result, &err);
    if (rc != GC_OK)
        return gc_report_add(rep, &err);
    for (int i = 0; i < r->n_warnings; i++)
        gc_report_warn(rep, r->warnings[i].code, r->warnings[i].field, r->warnings[i].index[0],
                       "%s", r->warnings[i].message);
    if (r->cycle.ideal_is_actual)
        gc_report_warn(rep, "ideal_equals_actual", -1, -1,
                       "with the default (ideal) efficiencies, no losses and ideal "
                       "regeneration the actual cycle equals its ideal counterpart; give "
                       "component efficiencies, losses or an effectiveness below 1 for an "
                       "actual cycle");
    gc_report_validity_cycle(rep, &r->cycle);
    if (x.has_gas && x.gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", GC_TF_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    return GC_OK;
}

/* The echo: the afterburner's inputs with one, the fuel temperature with a
 * fuel, the heat addition. */
static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_turbojet_input *in = input;
    gc_turbojet_input *e = echo_input;
    (void)result;
    e->has_afterburner = in->afterburner_temperature > 0.0;
    e->has_fuel_temperature = in->has_fuel;
    e->heat_mode = in->has_fuel ? GC_TURBOJET_FUEL : GC_TURBOJET_AIR_STANDARD;
}

static const char *title_of(const void *input, const void *result)
{
    (void)result;
    return ((const gc_turbojet_input *)input)->afterburner_temperature > 0.0
               ? "Turbojet with afterburner" : "Turbojet";
}

/* The cycle's figures quoted on the propulsion basis: heat in (f LHV, or the
 * heat added), the thermal efficiency of the jet's kinetic energy. */
static void view(const void *input, const void *result, gc_cycle_view *v)
{
    const gc_turbojet_result *r = result;
    (void)input;
    v->basis = "per kg of intake air";
    v->heat_in = r->heat_in;
    v->thermal_efficiency = r->thermal_efficiency;
    if (r->ideal_thermal_efficiency > 0.0)
        v->ideal_thermal_efficiency = r->ideal_thermal_efficiency;
}

static const gc_cycle_result *cycle_of(const void *result)
{
    return &((const gc_turbojet_result *)result)->cycle;
}

static void lean(void *input, unsigned what)
{
    gc_turbojet_input *in = input;
    if (what & GC_LEAN_NO_AREAS)
        in->flags |= GC_TURBOJET_NO_AREAS;
    if (what & GC_LEAN_NO_BOUNDS)
        in->flags |= GC_TURBOJET_NO_IDEAL;
}

/* ---- outputs ------------------------------------------------------------------------------ */

#define LBF_N 4.4482216152605     /* N per lbf (exact) */
#define LBM_KG 0.45359237         /* kg per lbm (exact) */
#define FT2_M2 0.09290304         /* m2 per ft2 (exact) */

#define R_(m) offsetof(gc_turbojet_result, m)
#define P_(m) (offsetof(gc_turbojet_result, m) + 1)
#define Q(nm, par, q, m, desc)                                                               \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = R_(m), .description = desc }
#define N(nm, par, m, pres, desc)                                                            \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = R_(m), .present = (pres),   \
      .description = desc }
#define THRUST(nm, par, m, pres, desc)                                                       \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .unit_si = "N s/kg",                  \
      .unit_us = "lbf s/lbm", .us_factor = LBM_KG / LBF_N, .offset = R_(m),                  \
      .present = (pres), .description = desc }
#define TSFC(par)                                                                            \
    { .name = "tsfc", .parent = par, .type = GC_OT_NUMBER, .unit_si = "mg/(N s)",            \
      .unit_us = "lbm/(lbf h)", .si_factor = 1e6, .us_factor = LBF_N * 3600.0 / LBM_KG,      \
      .offset = R_(tsfc), .present = P_(has_fuel),                                           \
      .description = "Thrust-specific fuel consumption: fuel flow over thrust (with a "      \
                     "fuel)." }

enum { SUMMARY = 0, BOUNDS = 12, IDEAL = 13, PROPULSION = 15, MODEL = 36, N_OUTPUTS = 38 };

static const gc_output outputs[N_OUTPUTS] = {
    [SUMMARY] = { .name = "summary", .parent = -1, .type = GC_OT_OBJECT,
                  .description = "Propulsion figures the preset adds to the cycle's summary, "
                                 "per kg of intake air." },
    THRUST("specific_thrust", SUMMARY, specific_thrust, 0,
           "Thrust per unit intake air flow: (1 + f) V9 - V0 + (P9 - P0) A9/m_air."),
    TSFC(SUMMARY),
    N("fuel_air_ratio", SUMMARY, fuel_air_ratio, P_(has_fuel),
      "Fuel per kg of intake air, combustor and afterburner."),
    N("propulsive_efficiency", SUMMARY, propulsive_efficiency, 0,
      "Thrust power over the jet's kinetic-energy gain (0 at rest)."),
    N("overall_efficiency", SUMMARY, overall_efficiency, 0,
      "Thrust power over the heat input: thermal x propulsive efficiency."),
    Q("flight_velocity", SUMMARY, GC_Q_VELOCITY, flight_velocity,
      "Flight speed V0 = M0 a0."),
    Q("exit_velocity", SUMMARY, GC_Q_VELOCITY, exit_velocity, "Nozzle exit velocity V9."),
    Q("effective_exit_velocity", SUMMARY, GC_Q_VELOCITY, effective_exit_velocity,
      "Exit velocity with the pressure thrust of an under-expanded jet put into it."),
    N("exit_mach_number", SUMMARY, exit_mach_number, 0, "Nozzle exit Mach number V9/a9."),
    Q("compressor_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, compressor_work,
      "Compressor work per kg of intake air."),
    Q("turbine_work", SUMMARY, GC_Q_SPECIFIC_ENERGY, turbine_work,
      "Turbine work per kg of intake air (compressor work over the mechanical efficiency)."),
    [BOUNDS] = { .name = "bounds", .parent = -1, .type = GC_OT_OBJECT,
                 .description = "Figures added to the cycle's bounds." },
    [IDEAL] = { .name = "ideal", .parent = BOUNDS, .type = GC_OT_OBJECT,
                .present = P_(has_ideal_figures),
                .description = "The ideal turbojet (efficiencies and recovery 1, no losses, "
                               "expanded nozzle) at the same flight condition." },
    THRUST("specific_thrust", IDEAL, ideal_specific_thrust, P_(has_ideal_figures),
           "The ideal turbojet's specific thrust."),
    [PROPULSION] = { .name = "propulsion", .parent = -1, .type = GC_OT_OBJECT,
                     .description = "The engine's propulsion figures per kg of intake air." },
    THRUST("specific_thrust", PROPULSION, specific_thrust, 0,
           "Thrust per unit intake air flow."),
    TSFC(PROPULSION),
    N("fuel_air_ratio", PROPULSION, fuel_air_ratio, P_(has_fuel),
      "Fuel per kg of intake air, combustor and afterburner."),
    N("fuel_air_ratio_main", PROPULSION, fuel_air_ratio_main, P_(has_fuel),
      "Fuel per kg of air, main combustor."),
    N("thermal_efficiency", PROPULSION, thermal_efficiency, 0,
      "The jet's kinetic-energy gain over the heat input (f LHV with a fuel)."),
    N("propulsive_efficiency", PROPULSION, propulsive_efficiency, 0,
      "Thrust power over the jet's kinetic-energy gain (0 at rest)."),
    N("overall_efficiency", PROPULSION, overall_efficiency, 0,
      "Thrust power over the heat input."),
    Q("flight_velocity", PROPULSION, GC_Q_VELOCITY, flight_velocity, "Flight speed V0."),
    Q("speed_of_sound", PROPULSION, GC_Q_VELOCITY, speed_of_sound,
      "Speed of sound of the free stream."),
    Q("exit_velocity", PROPULSION, GC_Q_VELOCITY, exit_velocity, "Nozzle exit velocity V9."),
    Q("effective_exit_velocity", PROPULSION, GC_Q_VELOCITY, effective_exit_velocity,
      "Exit velocity with the pressure thrust put into it."),
    N("exit_mach_number", PROPULSION, exit_mach_number, 0, "Nozzle exit Mach number."),
    Q("exit_pressure", PROPULSION, GC_Q_PRESSURE, exit_pressure, "Nozzle exit static pressure."),
    Q("exit_temperature", PROPULSION, GC_Q_TEMPERATURE, exit_temperature,
      "Nozzle exit static temperature."),
    { .name = "critical_pressure", .parent = PROPULSION, .type = GC_OT_NUMBER,
      .quantity = GC_Q_PRESSURE, .has_quantity = 1, .offset = R_(critical_pressure),
      .present = P_(convergent),
      .description = "Convergent nozzle: the exit static pressure at which the jet is sonic." },
    { .name = "choked", .parent = PROPULSION, .type = GC_OT_BOOL, .offset = R_(choked),
      .description = "Convergent nozzle with its exit at the critical pressure above ambient." },
    { .name = "exit_area_per_air_flow", .parent = PROPULSION, .type = GC_OT_NUMBER,
      .unit_si = "m2 s/kg", .unit_us = "ft2 s/lbm", .us_factor = LBM_KG / FT2_M2,
      .offset = R_(exit_area_per_air_flow),
      .description = "Nozzle exit area per unit intake air flow, A9/m_air." },
    THRUST("pressure_thrust", PROPULSION, pressure_thrust, 0,
           "Pressure thrust (P9 - P0) A9/m_air of an under-expanded jet."),
    THRUST("ideal_specific_thrust", PROPULSION, ideal_specific_thrust, P_(has_ideal_figures),
           "The ideal turbojet's specific thrust."),
    N("ideal_thermal_efficiency", PROPULSION, ideal_thermal_efficiency, P_(has_ideal_figures),
      "The ideal turbojet's thermal efficiency."),
    [MODEL] = { .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                .description = "Model facts (added to the cycle's model)." },
    { .name = "fuel", .parent = MODEL, .type = GC_OT_FUEL, .flags = GC_OF_INPUT,
      .offset = offsetof(gc_turbojet_input, fuel),
      .present = offsetof(gc_turbojet_input, has_fuel) + 1,
      .description = "The fuel: its label and heating values at 298.15 K." },
};

const gc_preset gc_preset_turbojet = {
    .name = "turbojet",
    .label = "cycles_turbojet",
    .title = "Turbojet",
    .description = "A single-spool turbojet in flight at a Mach number and altitude (U.S. "
                   "Standard Atmosphere 1976): diffuser and inlet recovery, compressor, "
                   "combustor burning a fuel (or air-standard heat), turbine driving the "
                   "compressor, optional afterburner, and a fully expanded or convergent "
                   "nozzle; the propulsion figures per kg of intake air. Defaults are the "
                   "ideal engine static at sea level, expanded nozzle, air-standard, dry air.",
    .kind = GC_PRESET_CYCLE,
    .fields = fields,
    .n_fields = GC_TF_COUNT,
    .outputs = outputs,
    .n_outputs = N_OUTPUTS,
    .input_size = sizeof(gc_turbojet_input),
    .result_size = sizeof(gc_turbojet_result),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .cycle = cycle_of,
    .view = view,
    .title_of = title_of,
    .lean = lean,
    .site = offsetof(gc_turbojet_result, site) + 1,
};
