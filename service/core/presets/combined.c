/*
 * combined.c — the combined-cycle preset declared once (combined.h,
 * preset.h): its field table (the topping as another preset's request; the
 * HRSG levels, reheat, duct firing, stack limit; the steam cycle's
 * efficiencies, condenser and deaerator), the echo, the title and the
 * descriptor. The evaluation is in combined_eval.c and combined_plant.c,
 * the outputs in combined_outputs.c, the diagrams in combined_svg.c.
 *
 * Bounds, once for every caller, are those of the steam core (steam.h):
 * level pressures 20 kPa..19 MPa, steam and reheat temperatures up to
 * 1073.15 K (IF97 region 2), pinch (0, 150] K, approach [0, 100] K, a fixed
 * steam flow up to 10 000 kg/s, stack minimum 273.15..500 K, firing up to
 * 1500 K, condenser 1..100 kPa, cooling water 273.15..320 K with a rise and
 * a terminal difference of 1..25 K, dryness 0.5..1. A steam temperature or
 * a steam flow of 0 is the same as leaving it out. Names follow steam.h's
 * inputs (its "/fuel" is "/duct_burner_fuel" here). Units: SI.
 */
#include "core/presets/combined_internal.h"
#include "gascycle/if97.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define IN(m) offsetof(gc_combined_input, m)
#define GIVEN(m) (offsetof(gc_combined_input, m) + 1)
#define LV(m) offsetof(gc_combined_level, m)

#define NUM(id, nm, q, fl, d, lo, hi, member, desc)                                          \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q, .flags = (fl), .def = (d),     \
             .min = (lo), .max = (hi), .offset = IN(member), .description = desc }
#define OPT(id, nm, q, fl, lo, hi, member, desc)                                             \
    NUM(id, nm, q, GC_FF_OPTIONAL | (fl), 0.0, lo, hi, member, desc)
#define EFF(id, nm, member, desc)                                                           \
    NUM(id, nm, GC_Q_FRACTION, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 1.0, 0.0, 1.0,       \
        member, desc)
#define LEVEL(id, nm, q, fl, d, lo, hi, member, has, desc)                                   \
    [id] = { .name = nm, .parent = GC_CF_LEVELS, .type = GC_FT_NUMBER, .quantity = q,        \
             .flags = (fl), .def = (d), .min = (lo), .max = (hi), .offset = LV(member),      \
             .given = (has), .description = desc }
#define MINMAX (GC_FF_MIN | GC_FF_MAX)
#define POSITIVE (GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX)

static const gc_field fields[GC_CF_COUNT] = {
    [GC_CF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "Inputs of the combined-cycle plant." },
    [GC_CF_TOPPING] = {
        .name = "topping", .type = GC_FT_PRESET, .flags = GC_FF_REQUIRED,
        .presets = gc_combined_topping_presets, .offset = IN(topping),
        .count = GIVEN(topping_kind), .item_size = GC_COMBINED_TOPPING_INPUT_BYTES,
        .aux = offsetof(gc_combined_result, topping) + 1,
        .description = "The topping cycle: {\"cycle\": \"brayton\", \"inputs\": {...}} with "
        "the whole request of /v1/cycles/brayton (its exhaust feeds the HRSG; its exhaust "
        "pressure loss is the HRSG's gas-side loss; its rated net_power sets the flows, else "
        "the figures are per 1 kg/s of intake air), {\"cycle\": \"machine_site\", \"inputs\": "
        "{...}} with the whole request of /v1/machine/site (a fixed gas turbine at today's "
        "conditions and load), or {\"cycle\": \"exhaust\", \"inputs\": "
        "{\"temperature\", \"mass_flow\", ...}} for an exhaust as given." },
    [GC_CF_LEVELS] = {
        .name = "levels", .type = GC_FT_LIST, .offset = IN(levels), .count = GIVEN(n_levels),
        .item_size = sizeof(gc_combined_level), .min_items = 1,
        .max_items = GC_STEAM_MAX_LEVELS, .items = "pressure levels",
        .description = "The HRSG's pressure levels, highest pressure first (\"hp\"; \"hp\", "
        "\"lp\"; \"hp\", \"ip\", \"lp\"), each with economiser, drum evaporator and "
        "superheater; default one level of 8 MPa, 500 degC, pinch 10 K, approach 5 K." },
    LEVEL(GC_CF_LEVEL_PRESSURE, "pressure", GC_Q_PRESSURE, GC_FF_REQUIRED | MINMAX, 8.0e6, 2.0e4,
          19.0e6, pressure, 0, "Drum and superheater outlet pressure (steam-side losses not "
          "modelled); falling from level to level."),
    LEVEL(GC_CF_LEVEL_STEAM_TEMPERATURE, "steam_temperature", GC_Q_TEMPERATURE,
          GC_FF_OPTIONAL | MINMAX, 0.0, 273.15, GC_IF97_T_R2_MAX_K, steam_temperature,
          LV(has_steam_temperature) + 1, "Superheater outlet temperature (absent: saturated "
          "steam, no superheater)."),
    LEVEL(GC_CF_LEVEL_PINCH, "pinch", GC_Q_TEMPERATURE_DIFFERENCE, POSITIVE, 10.0, 0.0, 150.0,
          pinch, 0, "Pinch point: evaporator gas exit minus saturation temperature (the "
          "design, unless steam_mass_flow is given)."),
    LEVEL(GC_CF_LEVEL_APPROACH, "approach", GC_Q_TEMPERATURE_DIFFERENCE, MINMAX, 5.0, 0.0,
          100.0, approach, 0, "Approach: saturation minus economiser water exit "
          "temperature."),
    LEVEL(GC_CF_LEVEL_STEAM_MASS_FLOW, "steam_mass_flow", GC_Q_MASS_FLOW,
          GC_FF_OPTIONAL | MINMAX, 0.0, 0.0, 1.0e4, steam_mass_flow,
          LV(has_steam_mass_flow) + 1, "Fixed steam conditions: the level's steam flow (the "
          "pinch follows and must stay positive); absent: designed by the pinch."),
    OPT(GC_CF_REHEAT_TEMPERATURE, "reheat_temperature", GC_Q_TEMPERATURE, MINMAX, 273.15,
        GC_IF97_T_R2_MAX_K, reheat_temperature, "Hot reheat temperature: the whole HP "
        "turbine exhaust is reheated in the HRSG beside the HP superheater (absent: no "
        "reheat)."),
    OPT(GC_CF_REHEAT_PRESSURE, "reheat_pressure", GC_Q_PRESSURE, POSITIVE, 0.0, 19.0e6,
        reheat_pressure, "Reheat pressure with one level (with more, the next level's "
        "pressure)."),
    OPT(GC_CF_STACK_TEMPERATURE_MIN, "stack_temperature_min", GC_Q_TEMPERATURE, MINMAX, 273.15,
        500.0, stack_temperature_min, "Lowest acceptable stack temperature (the acid dew "
        "point of the fuel's flue gas): a stack or feedwater below it is warned about."),
    OPT(GC_CF_FIRING_TEMPERATURE, "firing_temperature", GC_Q_TEMPERATURE, MINMAX, 273.15,
        1500.0, firing_temperature, "Supplementary firing: gas temperature after the duct "
        "burner (absent: unfired)."),
    [GC_CF_DUCT_BURNER_FUEL] = {
        .name = "duct_burner_fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL,
        .offset = IN(duct_burner_fuel), .aux = GIVEN(duct_burner_fuel_spec),
        .given = GIVEN(has_duct_burner_fuel),
        .description = "Fuel of the duct burner (a name, an analysis or a formula, as the "
        "topping's fuel); absent: the topping's fuel." },
    NUM(GC_CF_DUCT_BURNER_FUEL_TEMPERATURE, "duct_burner_fuel_temperature", GC_Q_TEMPERATURE,
        MINMAX, 298.15, 250.0, 600.0, duct_burner_fuel_temperature,
        "Duct burner fuel supply temperature."),
    EFF(GC_CF_BURNER_EFFICIENCY, "burner_efficiency", burner_efficiency,
        "Fraction of the duct burner fuel's LHV released in the gas."),
    EFF(GC_CF_TURBINE_EFFICIENCY, "turbine_efficiency", turbine_efficiency,
        "Isentropic efficiency of every steam turbine section."),
    EFF(GC_CF_PUMP_EFFICIENCY, "pump_efficiency", pump_efficiency,
        "Isentropic efficiency of every pump."),
    EFF(GC_CF_GENERATOR_EFFICIENCY, "generator_efficiency", generator_efficiency,
        "Steam turbine generator: electric over shaft power (the pumps take the plant's "
        "electric power)."),
    NUM(GC_CF_CONDENSER_PRESSURE, "condenser_pressure", GC_Q_PRESSURE,
        MINMAX | GC_FF_ECHO_GIVEN, 5000.0, 1.0e3, 1.0e5, condenser_pressure,
        "Condensing pressure (echoed when used: without cooling_water_temperature)."),
    [GC_CF_CONDENSER_PRESSURE].given = GIVEN(has_condenser_pressure),
    OPT(GC_CF_COOLING_WATER_TEMPERATURE, "cooling_water_temperature", GC_Q_TEMPERATURE, MINMAX,
        273.15, 320.0, cooling_water_temperature, "Cooling water inlet temperature: the "
        "condensing temperature is it plus the rise and the terminal difference (instead of "
        "condenser_pressure)."),
    NUM(GC_CF_COOLING_WATER_RISE, "cooling_water_rise", GC_Q_TEMPERATURE_DIFFERENCE, MINMAX,
        10.0, 1.0, 25.0, cooling_water_rise, "Cooling water temperature rise."),
    NUM(GC_CF_CONDENSER_TERMINAL_DIFFERENCE, "condenser_terminal_difference",
        GC_Q_TEMPERATURE_DIFFERENCE, MINMAX, 5.0, 1.0, 25.0, condenser_terminal_difference,
        "Condensing temperature minus the cooling water outlet temperature."),
    OPT(GC_CF_DEAERATOR_PRESSURE, "deaerator_pressure", GC_Q_PRESSURE, POSITIVE, 0.0, 19.0e6,
        deaerator_pressure, "A deaerator (open feedwater heater) at this pressure, heated to "
        "saturated liquid by a turbine bleed (absent: no deaerator)."),
    NUM(GC_CF_DRYNESS_MIN, "dryness_min", GC_Q_FRACTION, MINMAX, GC_STEAM_DRYNESS_MIN, 0.5, 1.0,
        dryness_min, "An expansion ending wetter than this quality is warned about (common "
        "practice: about 0.88)."),
};

/* ---- inputs --------------------------------------------------------------------------- */

const gc_combined_topping *gc__combined_topping_of(const gc_combined_input *in)
{
    const gc_preset *p = gc_preset_nested(&gc_preset_combined, GC_CF_TOPPING, in);
    for (int i = 0; p && gc_combined_toppings[i].preset; i++)
        if (gc_combined_toppings[i].preset == p)
            return &gc_combined_toppings[i];
    return NULL;
}

/* One default level (the table holds the members' defaults; the list's
 * default is one level). */
static void init(void *input)
{
    gc_combined_input *in = input;
    in->n_levels = 1;
    gc_preset_item_init(&gc_preset_combined, GC_CF_LEVELS, &in->levels[0]);
    in->levels[0].pressure = 8.0e6;
    in->levels[0].steam_temperature = 773.15;
    in->levels[0].has_steam_temperature = 1;
}

void gc_combined_input_init(gc_combined_input *in)
{
    gc_preset_input_init(&gc_preset_combined, in);
}

void *gc_combined_set_topping(gc_combined_input *in, const char *name)
{
    for (int i = 0; gc_combined_topping_presets[i]; i++)
        if (strcmp(gc_combined_topping_presets[i]->name, name) == 0) {
            in->topping_kind = i;
            gc_preset_input_init(gc_combined_topping_presets[i], in->topping.bytes);
            return in->topping.bytes;
        }
    return NULL;
}

const gc_preset *gc_combined_preset(void)
{
    return &gc_preset_combined;
}

/* ---- hooks ------------------------------------------------------------------------------ */

/* The condenser pressure is echoed when it is the one used. */
static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_combined_input *in = input;
    gc_combined_input *e = echo_input;
    (void)result;
    e->has_condenser_pressure = !GC_IS_SET(in->cooling_water_temperature);
}

static const char *title_of(const void *input, const void *result)
{
    (void)input;
    return ((const gc_combined_result *)result)->title;
}

static void lean(void *input, unsigned what)
{
    gc_combined_input *in = input;
    if (what & GC_LEAN_NO_BOUNDS)
        in->flags |= GC_COMBINED_NO_IDEAL;
    if (what & GC_LEAN_NO_AREAS)
        in->flags |= GC_COMBINED_NO_AREAS;
}

const gc_preset gc_preset_combined = {
    .name = "combined",
    .label = "cycles_combined",
    .title = "Combined-cycle plant",
    .description = "A gas-turbine topping cycle (the Brayton preset's whole request, or an "
                   "exhaust as given) with a heat-recovery steam generator of one to three "
                   "pressure levels (economiser, drum evaporator and superheater each; "
                   "reheat; supplementary firing; stack minimum) designed by pinch and "
                   "approach or by fixed steam flows, and its steam cycle (turbine sections, "
                   "condenser at a pressure or from the cooling water, deaerator fed by a "
                   "bleed, pumps), water and steam by IAPWS-IF97. Plant output, efficiency "
                   "and heat rate (LHV, HHV), exergy per component, the Carnot and ideal "
                   "bounds and the built-in energy and pinch checks. Defaults: one level of "
                   "8 MPa, 500 degC, pinch 10 K, approach 5 K, condenser 5 kPa, efficiencies "
                   "1.",
    .kind = GC_PRESET_CYCLE,
    .heavy = 0,
    .fields = fields,
    .n_fields = GC_CF_COUNT,
    .outputs = gc__combined_outputs,
    .n_outputs = GC__COMBINED_N_OUTPUTS,
    .input_size = sizeof(gc_combined_input),
    .result_size = sizeof(gc_combined_result),
    .init = init,
    .evaluate = gc__combined_evaluate,
    .echo = echo,
    .title_of = title_of,
    .lean = lean,
    .diagrams = gc__combined_diagrams,
    .svg = gc__combined_svg,
};
