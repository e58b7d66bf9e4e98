/*
 * machine_common.c — what the three machine presets share
 * (machine_presets.h): the rows of the "machine" and "inlet" input objects
 * (the design rows copied from the Brayton preset's table, so a bound, a
 * default or a description exists once), the output rows of an operating
 * point, of the solved machine and of an inlet treatment, the translation
 * of the core model's text paths into field ids, and the definition step
 * every preset starts with.
 *
 * Bounds written here are the machine model's (machine.h states each beside
 * its struct member; machine.c checks the same for in-process callers, and
 * tests/unit/test_machine_presets.c probes that both refuse the same
 * values). Units: SI in every struct; the rows' quantities say what a
 * request's numbers are in (units.h).
 */
#include "core/presets/machine_presets.h"
#include "core/presets/presets.h"
#include "core/preset_util.h"

#include <stdio.h>
#include <string.h>

#define H(member) offsetof(gc_machine_head, member)
#define HG(member) (offsetof(gc_machine_head, member) + 1)
#define BR(member) offsetof(gc_brayton_input, member)

const char *const gc__machine_control_names[] = { "base_load", "inlet_guide_vanes",
                                                  "firing_temperature", NULL };
const char *const gc__machine_limit_names[] = { "firing_temperature", "exhaust_temperature",
                                                "none", NULL };
const char *const gc__machine_inlet_names[] = { "none", "evaporative_cooler", "fogging",
                                                "chiller", NULL };
const char *const gc__machine_definition_names[] = { "design", "rating", NULL };

/* ---- input rows ----------------------------------------------------------------- */

#define OBJ(id, nm, par, desc) [id] = { .name = nm, .parent = par, .type = GC_FT_OBJECT,        \
                                        .description = desc }
#define NUM(id, nm, par, q, fl, d, lo, hi, member, desc)                                      \
    [id] = { .name = nm, .parent = par, .type = GC_FT_NUMBER, .quantity = q, .flags = (fl),    \
             .def = (d), .min = (lo), .max = (hi), .offset = H(member), .description = desc }
#define OPT (GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX)
#define RANGE (GC_FF_MIN | GC_FF_MAX)

static const gc_field own_rows[GC_MF_COUNT] = {
    OBJ(GC_MF_MACHINE, "machine", 0,
        "The gas turbine (single shaft, constant speed, generator-driven, fixed geometry): its "
        "design point as a simple-cycle Brayton description (design) or as the figures a "
        "plant has on paper (rating), the reference conditions of its corrections, its "
        "control limits and off-design laws, and optionally its cooled first stage."),
    [GC_MF_DESIGN] = { .name = "design", .parent = GC_MF_MACHINE, .type = GC_FT_OBJECT,
                       .flags = GC_FF_ECHO_GIVEN, .given = HG(has_design),
                       .description = "The design point as a simple cycle (one compressor, one "
                       "turbine, no regenerator) burning a fuel at its design conditions, with "
                       "its rated net output: the Brayton preset's inputs of those names. Give "
                       "design or rating." },
    [GC_MF_D_SITE] = { .name = "site", .parent = GC_MF_DESIGN, .type = GC_FT_OBJECT,
                       .description = "Conditions at the design point (default the ISO "
                       "reference: 15 degC, 101.325 kPa, 60 % relative humidity; an altitude "
                       "gives temperature and pressure by the U.S. Standard Atmosphere 1976). "
                       "Echoed as resolved." },
    [GC_MF_RATING] = { .name = "rating", .parent = GC_MF_MACHINE, .type = GC_FT_OBJECT,
                       .flags = GC_FF_ECHO_GIVEN, .given = HG(has_rating),
                       .description = "The design point as rated figures at the rating "
                       "conditions: net output, heat rate (LHV), exhaust flow and temperature, "
                       "pressure ratio, fuel, and the compressor efficiency or its discharge "
                       "temperature; the air flow, firing temperature, turbine efficiency and "
                       "mechanical efficiency are solved and reported (machine.design_point). "
                       "Give design or rating." },
    NUM(GC_MF_R_NET_POWER, "net_power", GC_MF_RATING, GC_Q_POWER, OPT, 0, 0, 2e9,
        spec.rating.net_power_W, "Rated net electric output (required with rating)."),
    NUM(GC_MF_R_HEAT_RATE, "heat_rate", GC_MF_RATING, GC_Q_HEAT_RATE, OPT, 0, 1.0, 10.0,
        spec.rating.heat_rate, "Rated heat rate on the fuel's LHV (required with rating)."),
    NUM(GC_MF_R_EXHAUST_MASS_FLOW, "exhaust_mass_flow", GC_MF_RATING, GC_Q_MASS_FLOW, OPT, 0,
        0.0, 1e5, spec.rating.exhaust_mass_flow_kg_per_s,
        "Rated exhaust gas flow (required with rating)."),
    NUM(GC_MF_R_EXHAUST_TEMPERATURE, "exhaust_temperature", GC_MF_RATING, GC_Q_AMBIENT_TEMPERATURE, OPT,
        0, 300.0, 2000.0, spec.rating.exhaust_temperature_K,
        "Rated exhaust temperature leaving the turbine (required with rating)."),
    NUM(GC_MF_R_PRESSURE_RATIO, "pressure_ratio", GC_MF_RATING, GC_Q_RATIO, OPT, 0, 1.0,
        GC_BRAYTON_RP_MAX, spec.rating.pressure_ratio,
        "Compressor delivery over inlet pressure at the rating (required with rating)."),
    NUM(GC_MF_R_COMPRESSOR_EFFICIENCY, "compressor_efficiency", GC_MF_RATING, GC_Q_FRACTION,
        OPT, 0, 0.5, 1.0, spec.rating.compressor_efficiency,
        "Isentropic compressor efficiency; give it or compressor_exit_temperature."),
    NUM(GC_MF_R_COMPRESSOR_EXIT_TEMPERATURE, "compressor_exit_temperature", GC_MF_RATING,
        GC_Q_AMBIENT_TEMPERATURE, OPT, 0, 200.0, 2000.0, spec.rating.compressor_exit_temperature_K,
        "Compressor discharge temperature; give it or compressor_efficiency."),
    [GC_MF_R_FUEL] = { .name = "fuel", .parent = GC_MF_RATING, .type = GC_FT_FUEL,
                       .flags = GC_FF_OPTIONAL, .offset = H(spec.rating.fuel),
                       .aux = HG(rating_fuel_spec), .given = HG(spec.rating.has_fuel),
                       .description = "Fuel of the rating (required with rating): a name, an "
                       "analysis by mole fraction or a formula with its LHV, as for the "
                       "Brayton preset." },
    [GC_MF_R_SITE] = { .name = "site", .parent = GC_MF_RATING, .type = GC_FT_OBJECT,
                       .description = "Rating conditions (default the ISO reference). Echoed "
                       "as resolved." },
    [GC_MF_REFERENCE] = { .name = "reference", .parent = GC_MF_MACHINE, .type = GC_FT_OBJECT,
                          .description = "Reference conditions of the correction factors and "
                          "of corrected figures (default ISO 2314: 15 degC, 101.325 kPa, 60 % "
                          "relative humidity). Echoed as resolved." },
    OBJ(GC_MF_CONTROL, "control", GC_MF_MACHINE,
        "Control: base load at the firing-temperature or the exhaust-temperature limit, "
        "whichever gives the lower firing temperature; part load by closing the inlet guide "
        "vanes at the temperature limit down to their minimum flow, then by lowering the "
        "firing temperature."),
    NUM(GC_MF_C_FIRING_TEMPERATURE_LIMIT, "firing_temperature_limit", GC_MF_CONTROL,
        GC_Q_AMBIENT_TEMPERATURE, OPT, 0, 300.0, 2500.0, spec.firing_temperature_limit_K,
        "Firing (first rotor inlet) temperature limit (default the design firing "
        "temperature; echoed as in force)."),
    NUM(GC_MF_C_EXHAUST_TEMPERATURE_LIMIT, "exhaust_temperature_limit", GC_MF_CONTROL,
        GC_Q_AMBIENT_TEMPERATURE, OPT, 0, 300.0, 2500.0, spec.exhaust_temperature_limit_K,
        "Exhaust temperature limit (default the design exhaust temperature; echoed as in "
        "force)."),
    NUM(GC_MF_C_IGV_MINIMUM_FLOW_FRACTION, "igv_minimum_flow_fraction", GC_MF_CONTROL,
        GC_Q_FRACTION, RANGE, 1.0, 0.5, 1.0, spec.igv_minimum_flow_fraction,
        "Corrected air flow with the inlet guide vanes closed over open (1: the vanes are not "
        "modulated)."),
    NUM(GC_MF_C_MINIMUM_LOAD_FRACTION, "minimum_load_fraction", GC_MF_CONTROL, GC_Q_FRACTION,
        RANGE, GC_MACHINE_DEFAULT_MIN_LOAD, 0.0, 0.9, spec.minimum_load_fraction,
        "Lowest load accepted, as a fraction of base load at the same conditions (below about "
        "10 % constant component efficiencies mean little: common practice)."),
    OBJ(GC_MF_OFF_DESIGN, "off_design", GC_MF_MACHINE,
        "Off-design laws: the compressor's corrected flow follows its corrected speed and the "
        "vane position, its efficiency may fall on vane closure; the first nozzle is choked "
        "(its flow function m sqrt(R T)/P stays at its design value)."),
    NUM(GC_MF_O_COMPRESSOR_SPEED_EXPONENT, "compressor_speed_exponent", GC_MF_OFF_DESIGN,
        GC_Q_RATIO, RANGE, 0.0, 0.0, 4.0, spec.compressor_speed_exponent,
        "s in W/W_design = (N_c/N_c,design)^s: corrected flow against corrected speed (0: "
        "constant corrected flow)."),
    NUM(GC_MF_O_IGV_EFFICIENCY_COEFFICIENT, "igv_efficiency_coefficient", GC_MF_OFF_DESIGN,
        GC_Q_RATIO, RANGE, 0.0, 0.0, 2.0, spec.igv_efficiency_coefficient,
        "a in eta_c (1 - a (1 - f_igv)^2): compressor efficiency lost on vane closure (0: "
        "constant)."),
    OBJ(GC_MF_INLET, "inlet", 0,
        "Inlet air treatment in service, between the ambient and the compressor (ASHRAE "
        "Handbook-Fundamentals 2017 ch. 1 psychrometrics)."),
    [GC_MF_I_TREATMENT] = { .name = "treatment", .parent = GC_MF_INLET, .type = GC_FT_ENUM,
                            .names = gc__machine_inlet_names, .offset = H(inlet.kind),
                            .description = "none; evaporative_cooler (toward the wet bulb with "
                            "an effectiveness); fogging (to saturation); chiller (to a set "
                            "temperature, its power drawn from the output)." },
    NUM(GC_MF_I_ADDED_PRESSURE_LOSS, "added_pressure_loss", GC_MF_INLET, GC_Q_FRACTION, RANGE,
        0.0, 0.0, 0.1, inlet.added_pressure_loss,
        "The treatment's own pressure loss, a fraction of the ambient pressure, on top of the "
        "design's inlet loss."),
    NUM(GC_MF_I_EVAPORATIVE_EFFECTIVENESS, "evaporative_effectiveness", GC_MF_INLET,
        GC_Q_FRACTION, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, GC_MACHINE_DEFAULT_EVAP_EFF, 0.0,
        1.0, inlet.evaporative_effectiveness,
        "Evaporative cooler: (T - T_out)/(T - T_wet_bulb) (rigid media about 0.85-0.95: "
        "common practice)."),
    NUM(GC_MF_I_CHILLER_TEMPERATURE, "chiller_temperature", GC_MF_INLET,
        GC_Q_AMBIENT_TEMPERATURE, RANGE, GC_MACHINE_DEFAULT_CHILLER_T_K, 274.15, 330.0,
        inlet.chiller_temperature_K, "Chiller: air temperature leaving the coil."),
    NUM(GC_MF_I_CHILLER_COP, "chiller_cop", GC_MF_INLET, GC_Q_RATIO, RANGE,
        GC_MACHINE_DEFAULT_CHILLER_COP, 0.5, 20.0, inlet.chiller_cop,
        "Chiller: coefficient of performance, heat removed over electric power (electric "
        "centrifugal chillers about 4-6: common practice)."),
};

#define SITE_ECHO GC_FF_ECHO_GIVEN
#define DESIGN_SHIFT ((ptrdiff_t)H(spec.design))
#define RATING_SITE_SHIFT ((ptrdiff_t)H(spec.rating.site) - (ptrdiff_t)BR(site))
#define REF_SHIFT ((ptrdiff_t)H(spec.reference) - (ptrdiff_t)BR(site))
#define COOL_SHIFT ((ptrdiff_t)H(spec.cooling) - (ptrdiff_t)BR(cooling))
#define D(id, path) { .dst = id, .parent = GC_MF_DESIGN, .from = path, .shift = DESIGN_SHIFT }
#define S(id, par, path, sh) { .dst = id, .parent = par, .from = path, .shift = sh,            \
                               .set = SITE_ECHO, .clear = GC_FF_NO_ECHO }
#define R(id, path, member) { .dst = id, .parent = GC_MF_RATING, .from = path,                \
                              .shift = (ptrdiff_t)H(spec.rating.member) - (ptrdiff_t)BR(member) }
#define C(id, path) { .dst = id, .parent = GC_MF_COOLING, .from = path, .shift = COOL_SHIFT }

static const gc__machine_copy copies[] = {
    D(GC_MF_D_PRESSURE_RATIO, "/pressure_ratio"),
    D(GC_MF_D_TURBINE_INLET_TEMPERATURE, "/turbine_inlet_temperature"),
    D(GC_MF_D_COMPRESSOR_EFFICIENCY, "/compressor_efficiency"),
    D(GC_MF_D_TURBINE_EFFICIENCY, "/turbine_efficiency"),
    D(GC_MF_D_EFFICIENCY_BASIS, "/efficiency_basis"),
    D(GC_MF_D_INLET_PRESSURE_LOSS, "/inlet_pressure_loss"),
    D(GC_MF_D_COMBUSTOR_PRESSURE_LOSS, "/combustor_pressure_loss"),
    D(GC_MF_D_EXHAUST_PRESSURE_LOSS, "/exhaust_pressure_loss"),
    D(GC_MF_D_COMBUSTOR_EFFICIENCY, "/combustor_efficiency"),
    D(GC_MF_D_MECHANICAL_EFFICIENCY, "/mechanical_efficiency"),
    D(GC_MF_D_GENERATOR_EFFICIENCY, "/generator_efficiency"),
    { .dst = GC_MF_D_FUEL, .parent = GC_MF_DESIGN, .from = "/fuel", .shift = DESIGN_SHIFT,
      .description = "Fuel burnt (required with design): a name, an analysis by mole fraction "
      "or a formula with its LHV, as for the Brayton preset." },
    D(GC_MF_D_FUEL_TEMPERATURE, "/fuel_temperature"),
    { .dst = GC_MF_D_NET_POWER, .parent = GC_MF_DESIGN, .from = "/net_power",
      .shift = DESIGN_SHIFT, .description = "Rated net electric output at the design point "
      "(required with design): it fixes the design air flow." },
    S(GC_MF_D_SITE_ALTITUDE, GC_MF_D_SITE, "/site/altitude", DESIGN_SHIFT),
    S(GC_MF_D_SITE_TEMPERATURE, GC_MF_D_SITE, "/site/temperature", DESIGN_SHIFT),
    S(GC_MF_D_SITE_PRESSURE, GC_MF_D_SITE, "/site/pressure", DESIGN_SHIFT),
    S(GC_MF_D_SITE_RELATIVE_HUMIDITY, GC_MF_D_SITE, "/site/relative_humidity", DESIGN_SHIFT),
    R(GC_MF_R_INLET_PRESSURE_LOSS, "/inlet_pressure_loss", inlet_pressure_loss),
    R(GC_MF_R_COMBUSTOR_PRESSURE_LOSS, "/combustor_pressure_loss", combustor_pressure_loss),
    R(GC_MF_R_EXHAUST_PRESSURE_LOSS, "/exhaust_pressure_loss", exhaust_pressure_loss),
    R(GC_MF_R_COMBUSTOR_EFFICIENCY, "/combustor_efficiency", combustor_efficiency),
    { .dst = GC_MF_R_GENERATOR_EFFICIENCY, .parent = GC_MF_RATING,
      .from = "/generator_efficiency",
      .shift = (ptrdiff_t)H(spec.rating.generator_efficiency) -
               (ptrdiff_t)BR(generator_efficiency),
      .description = "Generator efficiency (default 1: the solved mechanical efficiency then "
      "holds the generator's losses too)." },
    { .dst = GC_MF_R_FUEL_TEMPERATURE, .parent = GC_MF_RATING, .from = "/fuel_temperature",
      .shift = (ptrdiff_t)H(spec.rating.fuel_temperature_K) - (ptrdiff_t)BR(fuel_temperature),
      .clear = GC_FF_ECHO_GIVEN, .drop_given = 1, .description = "Fuel supply temperature." },
    S(GC_MF_R_SITE_ALTITUDE, GC_MF_R_SITE, "/site/altitude", RATING_SITE_SHIFT),
    S(GC_MF_R_SITE_TEMPERATURE, GC_MF_R_SITE, "/site/temperature", RATING_SITE_SHIFT),
    S(GC_MF_R_SITE_PRESSURE, GC_MF_R_SITE, "/site/pressure", RATING_SITE_SHIFT),
    S(GC_MF_R_SITE_RELATIVE_HUMIDITY, GC_MF_R_SITE, "/site/relative_humidity",
      RATING_SITE_SHIFT),
    S(GC_MF_REF_ALTITUDE, GC_MF_REFERENCE, "/site/altitude", REF_SHIFT),
    S(GC_MF_REF_TEMPERATURE, GC_MF_REFERENCE, "/site/temperature", REF_SHIFT),
    S(GC_MF_REF_PRESSURE, GC_MF_REFERENCE, "/site/pressure", REF_SHIFT),
    S(GC_MF_REF_RELATIVE_HUMIDITY, GC_MF_REFERENCE, "/site/relative_humidity", REF_SHIFT),
    { .dst = GC_MF_COOLING, .parent = GC_MF_MACHINE, .from = "/cooling", .shift = COOL_SHIFT,
      .description = "Cooled first turbine stage (given: cooled): coolant bled at compressor "
      "delivery for the first nozzle and rotor rows, each row's coolant per kg of gas from the "
      "convective blade-cooling model of Holland & Thake (1980) as written by Horlock (2003), "
      "eq. 5.8, psi = K (T_gas - T_blade)/(T_blade - T_coolant), all of it mixed back before "
      "the first rotor. The design's turbine_inlet_temperature is then the combustor exit; "
      "the firing temperature (first rotor inlet) is reported beside it." },
    C(GC_MF_COOLING_BLADE_TEMPERATURE, "/cooling/blade_temperature"),
    C(GC_MF_COOLING_NOZZLE_CONSTANT, "/cooling/nozzle_constant"),
    C(GC_MF_COOLING_ROTOR_CONSTANT, "/cooling/rotor_constant"),
};

static size_t shifted(size_t off, ptrdiff_t shift)
{
    return (size_t)((ptrdiff_t)off + shift);
}

void gc__machine_copy_rows(gc_field *fields, const gc__machine_copy *c, int n)
{
    const gc_preset *b = gc_brayton_preset();
    for (int i = 0; i < n; i++) {
        int idx[2];
        int src = gc_preset_field_find(b, c[i].from, idx);
        if (src <= 0)
            continue;   /* a name the Brayton table lost: test_machine_presets fails */
        gc_field f = b->fields[src];
        f.parent = c[i].parent;
        if (f.type != GC_FT_OBJECT)   /* an object has no storage of its own */
            f.offset = shifted(f.offset, c[i].shift);
        f.given = f.given && !c[i].drop_given ? shifted(f.given, c[i].shift) : 0;
        f.count = f.count ? shifted(f.count, c[i].shift) : 0;
        f.aux = f.aux ? shifted(f.aux, c[i].shift) : 0;
        if (c[i].name)
            f.name = c[i].name;
        f.flags = (f.flags | c[i].set) & ~c[i].clear;
        if (c[i].has_def)
            f.def = c[i].def;
        if (c[i].description)
            f.description = c[i].description;
        fields[c[i].dst] = f;
    }
}

void gc__machine_fill_rows(gc_field *fields)
{
    for (int r = 1; r < GC_MF_COUNT; r++)
        fields[r] = own_rows[r];
    gc__machine_copy_rows(fields, copies, (int)(sizeof copies / sizeof copies[0]));
}

void gc__machine_head_init(gc_machine_head *h)
{
    gc_machine_spec_init(&h->spec);
    gc_machine_inlet_init(&h->inlet);
}

/* ---- output rows ------------------------------------------------------------------ */

#define PT(m) (off + offsetof(gc_machine_point, m))
#define FT2_PER_M2 (1.0 / 0.09290304) /* 1 ft2 = 0.09290304 m2 exactly (NIST SP 811 B.8) */

static gc_output q_row(const char *name, int parent, gc_quantity q, size_t off,
                       const char *desc)
{
    return (gc_output){ .name = name, .parent = parent, .type = GC_OT_NUMBER, .quantity = q,
                        .has_quantity = 1, .offset = off, .description = desc };
}

static gc_output n_row(const char *name, int parent, size_t off, const char *desc)
{
    return (gc_output){ .name = name, .parent = parent, .type = GC_OT_NUMBER, .offset = off,
                        .description = desc };
}

static gc_output e_row(const char *name, int parent, const char *const *names, size_t off,
                       const char *desc)
{
    return (gc_output){ .name = name, .parent = parent, .type = GC_OT_ENUM, .names = names,
                        .offset = off, .description = desc };
}

static gc_output area_row(const char *name, int parent, size_t off, const char *desc)
{
    return (gc_output){ .name = name, .parent = parent, .type = GC_OT_NUMBER, .unit_si = "m2",
                        .unit_us = "ft2", .us_factor = FT2_PER_M2, .offset = off,
                        .description = desc };
}

/* The power and fuel figures of a point (14 rows). */
static int point_power_rows(gc_output *o, int parent, size_t off)
{
    int k = 0;
    o[k++] = e_row("control", parent, gc__machine_control_names, PT(control),
                   "Load control in force: base_load, inlet_guide_vanes (part load, vanes "
                   "closing at the temperature limit) or firing_temperature (vanes at minimum, "
                   "firing temperature lowered).");
    o[k++] = e_row("active_limit", parent, gc__machine_limit_names, PT(active_limit),
                   "The limit that sets the firing temperature: firing_temperature, "
                   "exhaust_temperature or none (firing temperature below both limits).");
    o[k++] = q_row("net_power", parent, GC_Q_POWER, PT(net_power_W),
                   "Net output: generator terminals less the inlet chiller's power.");
    o[k++] = q_row("generator_power", parent, GC_Q_POWER, PT(generator_power_W),
                   "Output at the generator terminals.");
    o[k] = q_row("chiller_power", parent, GC_Q_POWER, PT(chiller_power_W),
                 "Electric power of the inlet chiller (with a chiller).");
    o[k++].flags = GC_OF_POSITIVE;
    o[k++] = q_row("base_net_power", parent, GC_Q_POWER, PT(base_net_power_W),
                   "Base-load net output at the same conditions.");
    o[k++] = n_row("load_fraction", parent, PT(load_fraction), "Net output over base load here.");
    o[k++] = q_row("heat_rate", parent, GC_Q_HEAT_RATE, PT(heat_rate),
                   "Heat rate on the fuel's LHV, on net output.");
    o[k++] = q_row("heat_rate_hhv", parent, GC_Q_HEAT_RATE, PT(heat_rate_hhv),
                   "Heat rate on the fuel's HHV, on net output.");
    o[k++] = n_row("thermal_efficiency", parent, PT(thermal_efficiency),
                   "Net output over the fuel's LHV input.");
    o[k++] = q_row("fuel_mass_flow", parent, GC_Q_MASS_FLOW, PT(fuel_mass_flow_kg_per_s),
                   "Fuel flow.");
    o[k++] = q_row("heat_input", parent, GC_Q_POWER, PT(heat_input_W),
                   "Fuel flow times LHV.");
    o[k++] = q_row("heat_input_hhv", parent, GC_Q_POWER, PT(heat_input_hhv_W),
                   "Fuel flow times HHV.");
    o[k++] = n_row("fuel_air_ratio", parent, PT(fuel_air_ratio),
                   "Fuel over compressor air.");
    return k;
}

/* The gas-path figures of a point (16 rows). */
static int point_gas_rows(gc_output *o, int parent, size_t off)
{
    int k = 0;
    o[k++] = q_row("air_mass_flow", parent, GC_Q_MASS_FLOW, PT(air_mass_flow_kg_per_s),
                   "Humid air into the compressor.");
    o[k++] = q_row("exhaust_mass_flow", parent, GC_Q_MASS_FLOW,
                   PT(exhaust_mass_flow_kg_per_s), "Exhaust gas flow (coolant returned).");
    o[k] = n_row("cooling_air_fraction", parent, PT(cooling_air_fraction),
                 "Turbine coolant over compressor air (with the cooling model).");
    o[k++].flags = GC_OF_POSITIVE;
    o[k++] = n_row("igv_flow_fraction", parent, PT(igv_flow_fraction),
                   "Corrected air flow over that with the inlet guide vanes open.");
    o[k++] = q_row("corrected_air_flow", parent, GC_Q_MASS_FLOW,
                   PT(corrected_air_flow_kg_per_s),
                   "m sqrt(T1/288.15 K) (101.325 kPa/P1) at the compressor inlet.");
    o[k++] = area_row("compressor_flow_function", parent, PT(compressor_flow_function_m2),
                      "m sqrt(R1 T1)/P1 at the compressor inlet.");
    o[k++] = area_row("nozzle_flow_function", parent, PT(nozzle_flow_function_m2),
                      "m sqrt(R T)/P at the first nozzle (combustor exit): the choked "
                      "nozzle holds it at its design value.");
    o[k++] = q_row("compressor_inlet_temperature", parent, GC_Q_AMBIENT_TEMPERATURE,
                   PT(compressor_inlet_T_K), "After the inlet treatment.");
    o[k++] = q_row("compressor_inlet_pressure", parent, GC_Q_PRESSURE, PT(compressor_inlet_P_Pa),
                   "After the inlet losses.");
    o[k++] = n_row("pressure_ratio", parent, PT(pressure_ratio),
                   "Compressor delivery over inlet pressure.");
    o[k++] = q_row("compressor_exit_temperature", parent, GC_Q_AMBIENT_TEMPERATURE,
                   PT(compressor_exit_T_K), "Compressor discharge temperature.");
    o[k++] = q_row("compressor_exit_pressure", parent, GC_Q_PRESSURE, PT(compressor_exit_P_Pa),
                   "Compressor discharge pressure.");
    o[k++] = q_row("turbine_inlet_temperature", parent, GC_Q_AMBIENT_TEMPERATURE,
                   PT(combustor_exit_T_K), "Combustor exit, the first nozzle's inlet.");
    o[k++] = q_row("firing_temperature", parent, GC_Q_AMBIENT_TEMPERATURE, PT(firing_temperature_K),
                   "First rotor inlet after the coolant mixes in (the combustor exit when "
                   "uncooled).");
    o[k++] = q_row("exhaust_temperature", parent, GC_Q_AMBIENT_TEMPERATURE, PT(exhaust_temperature_K),
                   "Leaving the turbine.");
    o[k++] = n_row("compressor_efficiency", parent, PT(compressor_efficiency),
                   "Isentropic compressor efficiency achieved.");
    return k;
}

void gc__machine_point_rows(gc_output *rows, int parent, size_t off)
{
    int k = point_power_rows(rows, parent, off);
    k += point_gas_rows(rows + k, parent, off);
    rows[k] = n_row("turbine_efficiency", parent, PT(turbine_efficiency),
                    "Isentropic turbine efficiency achieved (mixed rotor inlet to exhaust).");
}

#define HR(m) offsetof(gc_machine_head_result, m)

void gc__machine_output_rows(gc_output *rows, int first)
{
    int k = 0, self = first;
    gc_output *o = rows + first;
    o[k++] = (gc_output){ .name = "machine", .parent = -1, .type = GC_OT_OBJECT,
                          .description = "The machine as defined: its design point (figures "
                          "solved from a rating included), the limits in force, and base load "
                          "at the reference conditions." };
    o[k++] = e_row("definition", self, gc__machine_definition_names, HR(from_rating),
                   "How the design point was given: design (a Brayton description) or rating.");
    o[k++] = (gc_output){ .name = "cooled", .parent = self, .type = GC_OT_BOOL,
                          .offset = HR(cooled), .description = "With the cooling model." };
    o[k++] = n_row("mechanical_efficiency", self, HR(machine.mechanical_efficiency),
                   "Mechanical efficiency in force (solved from a rating: it closes the "
                   "energy balance).");
    o[k++] = q_row("firing_temperature_limit", self, GC_Q_AMBIENT_TEMPERATURE,
                   HR(machine.firing_limit_K), "Firing-temperature limit in force.");
    o[k++] = q_row("exhaust_temperature_limit", self, GC_Q_AMBIENT_TEMPERATURE,
                   HR(machine.exhaust_limit_K), "Exhaust-temperature limit in force.");
    struct { const char *name, *desc; size_t site, point; const char *pname, *pdesc; } part[2] = {
        { "design_conditions", "The design (or rating) conditions, resolved.", HR(design_site),
          HR(machine.design), "design_point", "The design point, base load." },
        { "reference_conditions", "The reference conditions, resolved.", HR(reference_site),
          HR(machine.reference), "reference", "Base load at the reference conditions (no "
          "inlet treatment, new and clean)." } };
    for (int j = 0; j < 2; j++) {
        int obj = first + k;
        o[k++] = (gc_output){ .name = part[j].name, .parent = self, .type = GC_OT_OBJECT,
                              .description = part[j].desc };
        o[k++] = q_row("temperature", obj, GC_Q_AMBIENT_TEMPERATURE,
                       part[j].site + offsetof(gc_site, T_K), "Ambient temperature.");
        o[k++] = q_row("pressure", obj, GC_Q_PRESSURE, part[j].site + offsetof(gc_site, P_Pa),
                       "Ambient pressure.");
        o[k++] = n_row("relative_humidity", obj, part[j].site + offsetof(gc_site, RH),
                       "Relative humidity.");
        int pt = first + k;
        o[k++] = (gc_output){ .name = part[j].pname, .parent = self, .type = GC_OT_OBJECT,
                              .description = part[j].pdesc };
        gc__machine_point_rows(o + k, pt, part[j].point);
        k += GC__MACHINE_POINT_ROWS_N;
    }
}

#define IS(m) (off + offsetof(gc_machine_inlet_state, m))

void gc__machine_inlet_rows(gc_output *rows, int first, size_t off)
{
    gc_output *o = rows + first;
    int k = 0;
    o[k++] = (gc_output){ .name = "inlet_treatment", .parent = -1, .type = GC_OT_OBJECT,
                          .description = "Where the inlet treatment left the air (ASHRAE "
                          "Handbook-Fundamentals 2017 ch. 1 psychrometrics)." };
    o[k++] = (gc_output){ .name = "treatment", .parent = first, .type = GC_OT_ENUM,
                          .flags = GC_OF_INPUT, .names = gc__machine_inlet_names,
                          .offset = offsetof(gc_machine_head, inlet.kind),
                          .description = "The treatment in service." };
    o[k++] = (gc_output){ .name = "active", .parent = first, .type = GC_OT_BOOL,
                          .offset = IS(active), .description = "Whether it changed the air." };
    o[k++] = q_row("ambient_wet_bulb_temperature", first, GC_Q_AMBIENT_TEMPERATURE,
                   IS(wet_bulb_T_K), "Thermodynamic wet bulb of the ambient air.");
    o[k++] = n_row("ambient_humidity_ratio", first, IS(ambient_W),
                   "kg water per kg dry air in the ambient.");
    o[k++] = q_row("temperature", first, GC_Q_AMBIENT_TEMPERATURE, IS(T_K),
                   "Air leaving the treatment.");
    o[k++] = n_row("relative_humidity", first, IS(RH), "Leaving the treatment.");
    o[k++] = n_row("humidity_ratio", first, IS(W), "Leaving the treatment.");
    o[k++] = q_row("water_added", first, GC_Q_MASS_FLOW, IS(water_added_kg_per_s),
                   "Water evaporated by a cooler or fogger.");
    o[k++] = q_row("condensate", first, GC_Q_MASS_FLOW, IS(condensate_kg_per_s),
                   "Water condensed by a chiller.");
    o[k++] = q_row("chiller_duty", first, GC_Q_POWER, IS(chiller_duty_W),
                   "Heat a chiller removes from the air.");
    o[k++] = q_row("chiller_power", first, GC_Q_POWER, IS(chiller_power_W),
                   "A chiller's electric power (duty over its COP).");
    o[k++] = n_row("pressure_loss", first, IS(inlet_pressure_loss),
                   "Inlet pressure loss in force (design and treatment).");
}

/* ---- the core's paths as field ids -------------------------------------------------- */

/* Prefixes of the core model's paths (machine.h) and where the tables have
 * them; "/laws" is split between two objects (the first that names the
 * member wins). */
static const gc__machine_path_map common_map[] = {
    { "/design_kind", "/machine" },
    { "/design", "/machine/design" },
    { "/rating", "/machine/rating" },
    { "/reference", "/machine/reference" },
    { "/laws", "/machine/control" },
    { "/laws", "/machine/off_design" },
    { "/cooling/enabled", "/machine/cooling" },
    { "/cooling", "/machine/cooling" },
    { "/inlet/kind", "/inlet/treatment" },
    { "/curve/variable", "/variable" },
    { "/curve/points", "/row_count" },
};

/* rest when path is prefix or prefix + "/...", else NULL */
static const char *after(const char *path, const char *prefix)
{
    size_t n = strlen(prefix);
    if (strncmp(path, prefix, n) != 0 || (path[n] != '\0' && path[n] != '/'))
        return NULL;
    return path + n;
}

/* The row of pointer, or of its nearest enclosing input (*exact = 0). */
static int nearest_row(const gc_preset *p, const char *pointer, int *exact)
{
    char buf[GC_ERROR_FIELD_LEN + 64];
    int idx[2];
    snprintf(buf, sizeof buf, "%s", pointer);
    *exact = 1;
    for (;;) {
        int r = buf[0] ? gc_preset_field_find(p, buf, idx) : 0;
        if (r >= 0)
            return r;
        *exact = 0;
        char *slash = strrchr(buf, '/');
        if (slash == NULL)
            return 0;
        *slash = '\0';
    }
}

/* Tries the entries of map matching path: the first exact row, else the
 * first entry's nearest; -1 when no entry matches. */
static int try_map(const gc_preset *p, const char *path, const gc__machine_path_map *map,
                   int n)
{
    int fallback = -1;
    for (int i = 0; i < n; i++) {
        const char *rest = after(path, map[i].from);
        if (rest == NULL)
            continue;
        char to[GC_ERROR_FIELD_LEN + 64];
        snprintf(to, sizeof to, "%s%s", map[i].to, rest);
        int exact = 0, r = nearest_row(p, to, &exact);
        if (exact)
            return r;
        if (fallback < 0)
            fallback = r;
    }
    return fallback;
}

int gc__machine_field_of(const gc_preset *p, const char *path, const gc__machine_path_map *extra,
                         int n_extra)
{
    if (path == NULL || path[0] != '/')
        return 0;
    int r = extra ? try_map(p, path, extra, n_extra) : -1;
    if (r < 0)
        r = try_map(p, path, common_map, (int)(sizeof common_map / sizeof common_map[0]));
    if (r < 0) {
        int exact;
        r = nearest_row(p, path, &exact);
    }
    return r;
}

int gc__machine_report_error(const gc_preset *p, gc_report *rep, const gc_error *err,
                             const gc__machine_path_map *extra, int n_extra)
{
    gc_error e = *err;
    e.field_id = gc__machine_field_of(p, err->field, extra, n_extra);
    e.index[0] = e.index[1] = -1;
    e.field[0] = '\0';
    if (e.code == GC_OK)
        e.code = GC_ERR_INVALID;
    return gc_report_add(rep, &e);
}

/* The stable code as a static string (gc_warning keeps a pointer). */
static const char *static_code(const char *code)
{
    static const char *const known[] = {
        GC_MACHINE_W_SITE, GC_MACHINE_W_UNCOOLED_HOT, GC_MACHINE_W_MECH_LOW,
        GC_MACHINE_W_TREATMENT_IDLE, GC_MACHINE_W_CHILLER_CONDENSING, GC_MACHINE_W_ICING,
        GC_MACHINE_W_FAR_FROM_DESIGN, GC_MACHINE_W_READING_FUEL, GC_MACHINE_W_AIR_FLOW_BALANCE,
        GC_MACHINE_W_LIMIT_ABOVE_DESIGN };
    for (size_t i = 0; i < sizeof known / sizeof known[0]; i++)
        if (strcmp(code, known[i]) == 0)
            return known[i];
    return "machine";
}

void gc__machine_report_warnings(const gc_preset *p, gc_report *rep,
                                 const gc_machine_warning *w, int n,
                                 const gc__machine_path_map *extra, int n_extra)
{
    for (int i = 0; i < n; i++) {
        int f = w[i].field[0] ? gc__machine_field_of(p, w[i].field, extra, n_extra) : -1;
        gc_report_warn(rep, static_code(w[i].code), f, -1, "%s", w[i].message);
    }
}

/* ---- definition -------------------------------------------------------------------- */

void gc__machine_core_spec(const gc_machine_head *h, gc_machine_spec *s)
{
    *s = h->spec;
    s->design_kind = h->has_rating ? GC_MACHINE_FROM_RATING : GC_MACHINE_FROM_CYCLE;
    if (s->design.has_fuel)
        s->design.heat_mode = GC_BRAYTON_FUEL;
    if (!GC_IS_SET(s->design.net_power))
        s->design.net_power = 0.0;
    gc_machine_rating *R = &s->rating;
    R->net_power_W = gc__machine_or0(R->net_power_W);
    R->heat_rate = gc__machine_or0(R->heat_rate);
    R->exhaust_mass_flow_kg_per_s = gc__machine_or0(R->exhaust_mass_flow_kg_per_s);
    R->exhaust_temperature_K = gc__machine_or0(R->exhaust_temperature_K);
    R->pressure_ratio = gc__machine_or0(R->pressure_ratio);
    R->compressor_efficiency = gc__machine_or0(R->compressor_efficiency);
    R->compressor_exit_temperature_K = gc__machine_or0(R->compressor_exit_temperature_K);
    s->firing_temperature_limit_K = gc__machine_or0(s->firing_temperature_limit_K);
    s->exhaust_temperature_limit_K = gc__machine_or0(s->exhaust_temperature_limit_K);
}

static int define_errors(const gc_preset *p, const gc_machine_spec *s, gc_report *rep)
{
    gc_error errs[GC_REPORT_MAX_ERRORS];
    int n = 0;
    int rc = gc_machine_validate(s, errs, GC_REPORT_MAX_ERRORS, &n);
    for (int i = 0; i < n && i < GC_REPORT_MAX_ERRORS; i++)
        gc__machine_report_error(p, rep, &errs[i], NULL, 0);
    if (rc != GC_OK)
        rep->input = 1;
    return rc;
}

int gc__machine_define(const gc_preset *p, const gc_machine_head *h, gc_machine_head_result *r,
                       gc_report *rep)
{
    if (h->has_design == h->has_rating) {
        rep->input = 1;
        return gc_report_error(rep, GC_ERR_INVALID, GC_MF_MACHINE, -1, "%s",
                               h->has_design ? "give the design point once: design (a Brayton "
                               "description) or rating (rated figures), not both"
                                             : "give the design point: design (a Brayton "
                               "description) or rating (rated figures)");
    }
    static _Thread_local gc_machine_spec s;   /* a few KB: off small stacks */
    gc__machine_core_spec(h, &s);
    int rc = define_errors(p, &s, rep);
    if (rc != GC_OK)
        return rc;
    gc_error e;
    gc_error_clear(&e);
    rc = gc_machine_define(&s, &r->machine, &e);
    if (rc != GC_OK) {
        rep->input = rc == GC_ERR_INVALID;
        return gc__machine_report_error(p, rep, &e, NULL, 0);
    }
    r->from_rating = h->has_rating;
    r->cooled = s.cooling.enabled;
    const gc_site_input *ds = h->has_rating ? &s.rating.site : &s.design.site;
    if (gc_site_resolve(ds, &r->design_site, &e) != GC_OK ||
        gc_site_resolve(&s.reference, &r->reference_site, &e) != GC_OK)
        return gc__machine_report_error(p, rep, &e, NULL, 0);
    /* the definition's site warnings are about the design (or rating) conditions */
    const gc__machine_path_map at_design[] = {
        { "/site", h->has_rating ? "/machine/rating/site" : "/machine/design/site" } };
    gc__machine_report_warnings(p, rep, r->machine.warnings, r->machine.n_warnings, at_design,
                                1);
    return GC_OK;
}

/* A site input echoed as resolved (altitude only when given). */
static void echo_site(const gc_site *s, gc_site_input *e)
{
    e->has_temperature = e->has_pressure = e->has_relative_humidity = 1;
    e->T_K = s->T_K;
    e->P_Pa = s->P_Pa;
    e->RH = s->RH;
}

void gc__machine_echo(const gc_machine_head_result *r, gc_machine_head *e)
{
    echo_site(&r->design_site, r->from_rating ? &e->spec.rating.site : &e->spec.design.site);
    echo_site(&r->reference_site, &e->spec.reference);
    e->spec.firing_temperature_limit_K = r->machine.firing_limit_K;
    e->spec.exhaust_temperature_limit_K = r->machine.exhaust_limit_K;
    e->spec.design.has_fuel_temperature = e->spec.design.has_fuel;
}
