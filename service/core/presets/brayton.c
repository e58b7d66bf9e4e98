/*
 * brayton.c — the Brayton-family preset declared once (brayton.h,
 * preset.h): its field table (every input with default, bounds and
 * description), its output table (the figures it adds to the cycle's
 * summary, the plant figures for a rated power, the optimum pressure
 * ratios, the fuel), the checks between inputs, and the descriptor's hooks
 * (evaluate, echo with resolved defaults, title). The chain, the evaluation
 * and the searches are in brayton_cycle.c.
 *
 * Bounds, once for every caller: pressure ratio 1..200, turbine inlet and
 * reheat temperatures up to 2500 K (300 K at least for the inlet), the
 * efficiencies in (0, 1], the pressure losses 0..0.5, a rated net power up
 * to 2 GW (the largest single-shaft units are near 600 MW, the largest
 * plants a few GW: common practice), fuel temperature 200..1000 K, and the
 * site bounds of site.h. Units: SI in the struct; the table's quantities
 * say what a request's numbers are in (units.h).
 */
#include "core/presets/brayton_internal.h"
#include "core/presets/presets.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define IN(member) offsetof(gc_brayton_input, member)
#define GIVEN(member) (offsetof(gc_brayton_input, member) + 1)

static const char *const basis_names[] = { "isentropic", "polytropic", NULL };
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
    [id] = { .name = nm, .parent = GC_BF_SITE, .type = GC_FT_NUMBER, .quantity = q,          \
             .flags = (fl) | GC_FF_NO_ECHO, .min = (lo), .max = (hi),                       \
             .offset = IN(site) + offsetof(gc_site_input, member),                          \
             .given = IN(site) + offsetof(gc_site_input, has) + 1, .description = desc }
#define STAGES(id, nm, member, desc)                                                        \
    [id] = { .name = nm, .type = GC_FT_INTEGER, .flags = GC_FF_MIN | GC_FF_MAX, .def = 1,   \
             .min = 1, .max = GC_BRAYTON_MAX_STAGES, .offset = IN(member), .description = desc }
#define STAGE_EFF(id, nm, member, cnt, desc)                                              \
    [id] = { .name = nm, .type = GC_FT_NUMBER_LIST, .quantity = GC_Q_FRACTION,               \
             .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX |              \
                      GC_FF_BOTH_BOUNDS, .min = 0.0,                                          \
             .max = 1.0, .offset = IN(member), .count = GIVEN(cnt), .min_items = 1,         \
             .max_items = GC_BRAYTON_MAX_STAGES, .items = "efficiencies, one per stage",    \
             .description = desc }

static const gc_field fields[GC_BF_COUNT] = {
    [GC_BF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "Inputs of the Brayton-family cycle." },
    NUM(GC_BF_PRESSURE_RATIO, "pressure_ratio", GC_Q_RATIO,
        GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 10.0, 1.0, GC_BRAYTON_RP_MAX, pressure_ratio,
        "Compressor delivery over inlet pressure (intercooler losses included)."),
    NUM(GC_BF_TURBINE_INLET_TEMPERATURE, "turbine_inlet_temperature", GC_Q_AMBIENT_TEMPERATURE,
        GC_FF_MIN | GC_FF_MAX, 1400.0, 300.0, 2500.0, turbine_inlet_temperature,
        "Combustor exit temperature (the first turbine stage's inlet); above about 1500 K "
        "the blades need cooling air: give cooling to bleed it (otherwise a warning says "
        "the figures are optimistic)."),
    EFF(GC_BF_COMPRESSOR_EFFICIENCY, "compressor_efficiency", compressor_efficiency,
        "Efficiency of each compressor stage (isentropic, or polytropic with "
        "efficiency_basis)."),
    EFF(GC_BF_TURBINE_EFFICIENCY, "turbine_efficiency", turbine_efficiency,
        "Efficiency of each turbine stage (isentropic, or polytropic with efficiency_basis)."),
    [GC_BF_EFFICIENCY_BASIS] = { .name = "efficiency_basis", .type = GC_FT_ENUM,
                                 .names = basis_names, .offset = IN(polytropic_efficiency),
                                 .description = "Whether the component efficiencies are "
                                 "isentropic or polytropic (small-stage)." },
    STAGE_EFF(GC_BF_COMPRESSOR_STAGE_EFFICIENCY, "compressor_stage_efficiency",
              compressor_stage_efficiency, n_compressor_stage_efficiency,
              "Efficiency of each compressor stage in order, instead of "
              "compressor_efficiency for the stages listed."),
    STAGE_EFF(GC_BF_TURBINE_STAGE_EFFICIENCY, "turbine_stage_efficiency",
              turbine_stage_efficiency, n_turbine_stage_efficiency,
              "Efficiency of each turbine stage in order, instead of turbine_efficiency for "
              "the stages listed."),
    STAGES(GC_BF_COMPRESSOR_STAGES, "compressor_stages", compressor_stages,
           "Compressor stages, with an intercooler between two stages; the stages share the "
           "pressure ratio equally."),
    [GC_BF_INTERCOOLING_TEMPERATURE] = {
        .name = "intercooling_temperature", .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,
        .flags = GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
        .min = 0.0,
        .max = 2500.0, .offset = IN(intercooling_temperature),
        .given = GIVEN(has_intercooling_temperature),
        .description = "Air temperature after each intercooler (default: the site "
                       "temperature; echoed with more than one compressor stage)." },
    LOSS(GC_BF_INTERCOOLER_PRESSURE_LOSS, "intercooler_pressure_loss",
         intercooler_pressure_loss, "Fractional pressure loss dP/P of each intercooler."),
    STAGES(GC_BF_TURBINE_STAGES, "turbine_stages", turbine_stages,
           "Turbine stages, with a reheat combustor between two stages; at most 3 when a "
           "fuel is burnt."),
    [GC_BF_REHEAT_TEMPERATURE] = {
        .name = "reheat_temperature", .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,
        .flags = GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
        .min = 0.0,
        .max = 2500.0, .offset = IN(reheat_temperature), .given = GIVEN(has_reheat_temperature),
        .description = "Gas temperature after each reheat (default: the turbine inlet "
                       "temperature; echoed with more than one turbine stage)." },
    LOSS(GC_BF_REHEAT_PRESSURE_LOSS, "reheat_pressure_loss", reheat_pressure_loss,
         "Fractional pressure loss dP/P of each reheat combustor."),
    NUM(GC_BF_REGENERATOR_EFFECTIVENESS, "regenerator_effectiveness", GC_Q_FRACTION,
        GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 1.0, regenerator_effectiveness,
        "Regenerator effectiveness: heat moved over the most the smaller side could take; 0 "
        "is no regenerator. Its ideal counterpart has effectiveness 1."),
    LOSS(GC_BF_REGENERATOR_AIR_PRESSURE_LOSS, "regenerator_air_pressure_loss",
         regenerator_air_pressure_loss, "Fractional pressure loss of the regenerator's air "
         "side."),
    LOSS(GC_BF_REGENERATOR_GAS_PRESSURE_LOSS, "regenerator_gas_pressure_loss",
         regenerator_gas_pressure_loss, "Fractional pressure loss of the regenerator's gas "
         "side."),
    LOSS(GC_BF_INLET_PRESSURE_LOSS, "inlet_pressure_loss", inlet_pressure_loss,
         "Fractional pressure loss of the intake filter and duct."),
    LOSS(GC_BF_EXHAUST_PRESSURE_LOSS, "exhaust_pressure_loss", exhaust_pressure_loss,
         "Fractional pressure loss of the stack and ducts (or a recovery boiler) on the "
         "exhaust pressure."),
    LOSS(GC_BF_COMBUSTOR_PRESSURE_LOSS, "combustor_pressure_loss", combustor_pressure_loss,
         "Fractional pressure loss of the main combustor."),
    EFF(GC_BF_COMBUSTOR_EFFICIENCY, "combustor_efficiency", combustor_efficiency,
        "Fraction of the fuel's energy (fuel-air ratio x LHV) released in the gas; also for "
        "the reheat combustors."),
    EFF(GC_BF_MECHANICAL_EFFICIENCY, "mechanical_efficiency", mechanical_efficiency,
        "Shaft work over gas-path net work (bearings, gearbox, auxiliaries)."),
    EFF(GC_BF_GENERATOR_EFFICIENCY, "generator_efficiency", generator_efficiency,
        "Electric work over shaft work."),
    [GC_BF_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "site_air",
                    .offset = IN(gas), .given = GIVEN(has_gas),
                    .description = "Working fluid (air-standard) or oxidiser: \"air\" (dry air, "
                    "NASA 9-coefficient polynomials) or \"cold\" (constant cp and k); default "
                    "the site's humid air (echoed as \"site_air\"). A fuel needs a species "
                    "mixture, so not the cold model." },
    [GC_BF_GAS_CP] = { .name = "cp", .parent = GC_BF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                       .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                       .def = 1005.0, .min = 100.0, .max = 20000.0,
                       .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                       .description = "Cold model: constant specific heat at constant "
                       "pressure." },
    [GC_BF_GAS_K] = { .name = "k", .parent = GC_BF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                      .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                      .def = 1.4, .min = 1.0, .max = 1.7,
                      .offset = IN(gas) + offsetof(gc_gas, k_cold),
                      .description = "Cold model: constant ratio of specific heats cp/cv." },
    [GC_BF_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL,
                     .offset = IN(fuel), .aux = GIVEN(fuel_spec), .given = GIVEN(has_fuel),
                     .description = "Fuel burnt in the combustor (complete combustion): a name "
                     "(\"methane\"), {\"analysis\": {species: mole fraction}} or {\"formula\": "
                     "\"CxHyOzNw\", \"lower_heating_value\": ...}; absent: air-standard heat "
                     "addition. With a fuel, efficiency and heat rate are on its LHV." },
    NUM(GC_BF_FUEL_TEMPERATURE, "fuel_temperature", GC_Q_TEMPERATURE,
        GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, 298.15, 200.0, 1000.0, fuel_temperature,
        "Fuel supply temperature (echoed with a fuel)."),
    [GC_BF_FUEL_TEMPERATURE].given = GIVEN(has_fuel_temperature),
    [GC_BF_SITE] = { .name = "site", .type = GC_FT_OBJECT, .flags = GC_FF_SITE,
                     .description = "Ambient conditions at the compressor inlet (default the "
                     "ISO reference: 15 degC, 101.325 kPa, 60 % relative humidity; an altitude "
                     "gives temperature and pressure by the U.S. Standard Atmosphere 1976). "
                     "Echoed as resolved, with where each value came from." },
    SITE(GC_BF_SITE_ALTITUDE, "altitude", GC_Q_LENGTH, GC_FF_MIN | GC_FF_MAX, -5000.0, 86000.0,
         altitude_m, has_altitude, "Geometric altitude above mean sea level."),
    SITE(GC_BF_SITE_TEMPERATURE, "temperature", GC_Q_AMBIENT_TEMPERATURE,
         GC_FF_MIN | GC_FF_MAX, 173.15, 473.15, T_K, has_temperature,
         "Ambient dry-bulb temperature."),
    SITE(GC_BF_SITE_PRESSURE, "pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
         0.0, 2.0e5, P_Pa, has_pressure, "Ambient absolute pressure."),
    SITE(GC_BF_SITE_RELATIVE_HUMIDITY, "relative_humidity", GC_Q_FRACTION,
         GC_FF_MIN | GC_FF_MAX, 0.0, 1.0, RH, has_relative_humidity, "Relative humidity."),
    [GC_BF_NET_POWER] = { .name = "net_power", .type = GC_FT_NUMBER, .quantity = GC_Q_POWER,
                          .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                          .min = 0.0, .max = 2.0e9, .offset = IN(net_power),
                          .given = GIVEN(has_net_power),
                          .description = "Rated net electric power at the generator "
                          "terminals: gives the plant figures (flows, heat rate, CO2)." },
    [GC_BF_OPTIMUM_SEARCH] = { .name = "optimum_search", .type = GC_FT_BOOL, .def = 0,
                               .offset = IN(optimum_search),
                               .description = "Search the pressure ratios of maximum "
                               "efficiency and of maximum specific work for the same inputs "
                               "(about 35 more evaluations; default false: only when asked)." },
    [GC_BF_HEAT_ADDITION] = { .name = "heat_addition", .type = GC_FT_ENUM,
                              .flags = GC_FF_DERIVED, .names = heat_names, .offset = IN(heat_mode),
                              .description = "How heat is added: \"fuel\" when a fuel is "
                              "given, else \"air_standard\" (echo only)." },
    [GC_BF_COOLING] = { .name = "cooling", .type = GC_FT_OBJECT, .flags = GC_FF_ECHO_GIVEN,
                        .given = GIVEN(cooling.enabled),
                        .description = "Cooled first turbine stage (given: cooled; needs a "
                        "fuel): coolant bled at compressor delivery for the first nozzle and "
                        "rotor rows, each row's coolant per kg of gas from the convective "
                        "blade-cooling model of Holland & Thake (1980) as written by Horlock "
                        "(2003), eq. 5.8, psi = K (T_gas - T_blade)/(T_blade - T_coolant), all "
                        "of it mixed back before the first rotor. turbine_inlet_temperature "
                        "stays the combustor exit; the mixed rotor-inlet (firing) temperature "
                        "and the coolant fractions are reported under cooling." },
    [GC_BF_COOLING_BLADE_TEMPERATURE] = {
        .name = "blade_temperature", .parent = GC_BF_COOLING, .type = GC_FT_NUMBER,
        .quantity = GC_Q_TEMPERATURE, .flags = GC_FF_MIN | GC_FF_MAX,
        .def = GC_MACHINE_DEFAULT_BLADE_T_K, .min = GC_MACHINE_COOLING_MIN_BLADE_T_K,
        .max = GC_MACHINE_COOLING_MAX_BLADE_T_K, .offset = IN(cooling.blade_temperature_K),
        .description = "Allowed blade metal temperature of the cooled rows (the default, "
                       "850 degC, is an illustrative figure from memory: give the machine's "
                       "own)." },
    NUM(GC_BF_COOLING_NOZZLE_CONSTANT, "nozzle_constant", GC_Q_RATIO, GC_FF_MIN | GC_FF_MAX,
        GC_MACHINE_DEFAULT_COOLING_K, 0.0, GC_MACHINE_COOLING_MAX_K, cooling.nozzle_constant,
        "Holland & Thake constant K of the first nozzle row (cooling efficiency folded in; "
        "the default 0.05 is illustrative, from memory)."),
    NUM(GC_BF_COOLING_ROTOR_CONSTANT, "rotor_constant", GC_Q_RATIO, GC_FF_MIN | GC_FF_MAX,
        GC_MACHINE_DEFAULT_COOLING_K, 0.0, GC_MACHINE_COOLING_MAX_K, cooling.rotor_constant,
        "Holland & Thake constant K of the first rotor row; 0 leaves the rotor uncooled."),
    [GC_BF_COOLING_NOZZLE_CONSTANT].parent = GC_BF_COOLING,
    [GC_BF_COOLING_ROTOR_CONSTANT].parent = GC_BF_COOLING,
};

/* The site members (gc_site_member) as field ids. */
const int gc__brayton_site_field[5] = { GC_BF_SITE, GC_BF_SITE_ALTITUDE, GC_BF_SITE_TEMPERATURE,
                                        GC_BF_SITE_PRESSURE, GC_BF_SITE_RELATIVE_HUMIDITY };

/* ---- checks between inputs ------------------------------------------------------------ */

static int count_given(const double *e, int n)
{
    if (n > 0)
        return n;
    for (int i = GC_BRAYTON_MAX_STAGES; i > 0; i--)
        if (e[i - 1] != 0.0)
            return i;
    return 0;
}

/* More stage efficiencies than stages: the request's own error. */
static void check_stage_counts(const gc_brayton_input *in, gc_report *rep)
{
    int nc = count_given(in->compressor_stage_efficiency, in->n_compressor_stage_efficiency);
    int nt = count_given(in->turbine_stage_efficiency, in->n_turbine_stage_efficiency);
    if (nc > in->compressor_stages)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_COMPRESSOR_STAGE_EFFICIENCY, -1,
                        "gives %d efficiencies for %d compressor stage%s", nc,
                        in->compressor_stages, in->compressor_stages == 1 ? "" : "s");
    if (nt > in->turbine_stages)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_TURBINE_STAGE_EFFICIENCY, -1,
                        "gives %d efficiencies for %d turbine stage%s", nt, in->turbine_stages,
                        in->turbine_stages == 1 ? "" : "s");
}

static void check_fuel(const gc_brayton_input *in, gc_report *rep)
{
    if (in->heat_mode != GC_BRAYTON_AIR_STANDARD && in->heat_mode != GC_BRAYTON_FUEL)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_HEAT_ADDITION, -1,
                        "must be air-standard or a fuel");
    if (in->cooling.enabled != 0 && in->cooling.enabled != 1)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_COOLING, -1, "enabled must be 0 or 1");
    if (in->cooling.enabled && !gc__brayton_fuel_mode(in))
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_COOLING, -1,
                        "needs a fuel: the coolant split follows the combustion, which "
                        "air-standard heat addition does not have");
    if (!gc__brayton_fuel_mode(in))
        return;
    if (!in->has_fuel)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_FUEL, -1,
                        "is required when heat comes from a fuel");
    if (in->turbine_stages > GC_CYCLE_MAX_GASES - 1 && in->turbine_stages <= GC_BRAYTON_MAX_STAGES)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_TURBINE_STAGES, -1,
                        "at most %d turbine stages when a fuel is burnt (the engine follows at "
                        "most %d fuel additions, main combustor and reheats)",
                        GC_CYCLE_MAX_GASES - 1, GC_CYCLE_MAX_GASES - 1);
    if (in->has_gas && in->gas.kind != GC_GAS_MIXTURE)
        gc_report_error(rep, GC_ERR_INVALID, GC_BF_GAS, -1,
                        "must be a species mixture (air) when a fuel is burnt: a cold-air "
                        "model has no composition to burn in");
}

/* An in-process caller's stage list: its entries up to the last one given,
 * a 0 among them (the stage's default) checked as that default. */
static void stage_list(double *e, int *n, double def)
{
    *n = count_given(e, *n);
    for (int i = 0; i < *n; i++)
        if (e[i] == 0.0)
            e[i] = def;
}

int gc__brayton_check(const gc_brayton_input *in, int table, gc_report *rep)
{
    int before = rep->n_errors;
    if (table) {
        gc_brayton_input copy = *in;
        stage_list(copy.compressor_stage_efficiency, &copy.n_compressor_stage_efficiency,
                   in->compressor_efficiency);
        stage_list(copy.turbine_stage_efficiency, &copy.n_turbine_stage_efficiency,
                   in->turbine_efficiency);
        gc_preset_validate(&gc_preset_brayton, &copy, rep);
    }
    check_fuel(in, rep);
    return rep->n_errors > before ? rep->errors[before].code : GC_OK;
}

int gc_brayton_validate(const gc_brayton_input *in, gc_error *errs, int max_errors,
                        int *n_errors)
{
    static _Thread_local gc_report rep;
    gc_report_init(&rep);
    int rc = gc__brayton_check(in, 1, &rep);
    check_stage_counts(in, &rep);
    if (rep.n_errors && rc == GC_OK)
        rc = rep.errors[0].code;
    for (int i = 0; i < rep.n_errors && i < max_errors && errs; i++) {
        errs[i] = rep.errors[i];
        gc_preset_name_error(&gc_preset_brayton, &errs[i]);
    }
    if (n_errors)
        *n_errors = rep.n_errors;
    return rc;
}

void gc_brayton_input_init(gc_brayton_input *in)
{
    gc_preset_input_init(&gc_preset_brayton, in);
}

const gc_preset *gc_brayton_preset(void)
{
    return &gc_preset_brayton;
}

/* ---- the descriptor's hooks --------------------------------------------------------------- */

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_brayton_input *in = input;
    check_stage_counts(in, rep);
    if (rep->n_errors) {
        rep->input = 1;
        return rep->errors[0].code;
    }
    gc_brayton_input x = *in;
    if (x.has_fuel)
        x.heat_mode = GC_BRAYTON_FUEL;
    gc_report one;
    gc_report_init(&one);
    int rc = gc__brayton_check(&x, 0, &one);
    if (rc != GC_OK)
        return gc_report_add(rep, &one.errors[0]);
    gc_error err;
    gc_error_clear(&err);
    rc = gc__brayton_evaluate(&x, result, &err);
    if (rc != GC_OK)
        return gc_report_add(rep, &err);
    gc__brayton_report(&x, result, rep);
    return GC_OK;
}

/* The echo: resolved intercooling and reheat temperatures (with more than one
 * stage), the fuel temperature with a fuel, the heat addition. */
static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_brayton_input *in = input;
    const gc_brayton_result *r = result;
    gc_brayton_input *e = echo_input;
    e->has_intercooling_temperature = in->compressor_stages > 1;
    if (!(in->intercooling_temperature > 0.0))
        e->intercooling_temperature = r->site.T_K;
    e->has_reheat_temperature = in->turbine_stages > 1;
    if (!(in->reheat_temperature > 0.0))
        e->reheat_temperature = in->turbine_inlet_temperature;
    e->has_fuel_temperature = in->has_fuel;
    e->heat_mode = in->has_fuel ? GC_BRAYTON_FUEL : GC_BRAYTON_AIR_STANDARD;
}

static const char *title_of(const void *input, const void *result)
{
    (void)input;
    return ((const gc_brayton_result *)result)->title;
}

static void view(const void *input, const void *result, gc_cycle_view *v)
{
    (void)input;
    (void)result;
    /* no figure replaced: the engine's heat in is far x LHV with a fuel (on the
     * 298.15 K reference, cycle.h), so JSON, CSV and the SVG caption quote one
     * heat input and one efficiency */
    v->basis = "per kg of intake air";
}

static const gc_cycle_result *cycle_of(const void *result)
{
    return &((const gc_brayton_result *)result)->cycle;
}

static void lean(void *input, unsigned what)
{
    gc_brayton_input *in = input;
    if (what & GC_LEAN_NO_AREAS)
        in->flags |= GC_BRAYTON_NO_AREAS;
    if (what & GC_LEAN_NO_BOUNDS)
        in->flags |= GC_BRAYTON_NO_BOUNDS;
}

const gc_preset gc_preset_brayton = {
    .name = "brayton",
    .label = "cycles_brayton",
    .title = "Brayton cycle",
    .description = "Compression in stages with intercooling, a regenerator, a combustor "
                   "burning a fuel (or air-standard heat to the turbine inlet temperature), "
                   "expansion in stages with reheat, inlet, combustor, regenerator and exhaust "
                   "pressure losses, mechanical and generator efficiencies, at site conditions. "
                   "Defaults are the ideal simple cycle: efficiencies 1, no losses, one stage "
                   "each, no regenerator, air-standard, ISO site, no optimum search.",
    .kind = GC_PRESET_CYCLE,
    .fields = fields,
    .n_fields = GC_BF_COUNT,
    .outputs = gc__brayton_outputs,
    .n_outputs = GC__BRAYTON_N_OUTPUTS,
    .input_size = sizeof(gc_brayton_input),
    .result_size = sizeof(gc_brayton_result),
    .evaluate = evaluate,
    .echo = echo,
    .cycle = cycle_of,
    .view = view,
    .title_of = title_of,
    .lean = lean,
    .site = offsetof(gc_brayton_result, site) + 1,
};
