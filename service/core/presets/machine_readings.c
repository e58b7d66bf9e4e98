/*
 * machine_readings.c — the machine_readings preset (/v1/machine/readings):
 * plant readings of a fixed gas turbine reduced against its model
 * (machine.h, gc_machine_reduce). From the ambient, the compressor
 * discharge pressure and temperature, the exhaust temperature, the fuel
 * flow (and analysis) and the net output (air flow optional): the air flow
 * and the firing temperature from the heat balance of the whole machine
 * (never a measured turbine inlet temperature), the compressor and turbine
 * efficiencies, output and heat rate corrected to the reference conditions
 * with the model's own correction factors, and the degradation against the
 * new-and-clean model at the same conditions (output and heat rate in per
 * cent, efficiencies in points). Inconsistent readings are refused naming
 * the reading and by how much.
 *
 * Sections: heat_balance, corrected and degradation are one-row tables
 * (format=csv gives the three); model and model_base are the new-and-clean
 * machine here (at the same output for part-load readings, and at base
 * load).
 *
 * Units: SI in the structs; "%" rows are the fraction x 100, "points" rows
 * an efficiency difference x 100.
 */
#include "core/presets/machine_presets.h"
#include "core/presets/presets.h"

#include <stdio.h>
#include <string.h>

#define IN(member) offsetof(gc_machine_readings_request, member)
#define RD(member) (offsetof(gc_machine_readings_request, readings) +                          \
                    offsetof(gc_machine_readings, member))
#define RES(member) offsetof(gc_machine_readings_answer, member)
#define SITE_SHIFT ((ptrdiff_t)RD(site) - (ptrdiff_t)offsetof(gc_brayton_input, site))
#define REQ (GC_FF_REQUIRED | GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX)
#define OPT (GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX)

/* ---- inputs ---------------------------------------------------------------------- */

#define READING(id, nm, q, fl, lo, hi, member, desc)                                          \
    [id] = { .name = nm, .parent = GC_MRF_READINGS, .type = GC_FT_NUMBER, .quantity = q,       \
             .flags = (fl), .min = (lo), .max = (hi), .offset = RD(member), .description = desc }

static gc_field fields[GC_MRF_COUNT] = {
    [GC_MF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "Plant readings of a fixed gas turbine." },
    [GC_MRF_READINGS] = { .name = "readings", .type = GC_FT_OBJECT,
                          .description = "What the plant measured, at steady conditions." },
    READING(GC_MRF_COMPRESSOR_EXIT_PRESSURE, "compressor_exit_pressure", GC_Q_PRESSURE, REQ,
            0.0, 2e8, compressor_exit_P_Pa, "Compressor discharge pressure, absolute."),
    READING(GC_MRF_COMPRESSOR_EXIT_TEMPERATURE, "compressor_exit_temperature",
            GC_Q_AMBIENT_TEMPERATURE, REQ, 200.0, 2500.0, compressor_exit_T_K,
            "Compressor discharge temperature."),
    READING(GC_MRF_EXHAUST_TEMPERATURE, "exhaust_temperature", GC_Q_AMBIENT_TEMPERATURE, REQ, 200.0,
            2500.0, exhaust_temperature_K, "Exhaust temperature leaving the turbine."),
    READING(GC_MRF_FUEL_MASS_FLOW, "fuel_mass_flow", GC_Q_MASS_FLOW, REQ, 0.0, 1e4,
            fuel_mass_flow_kg_per_s, "Fuel flow."),
    [GC_MRF_FUEL] = { .name = "fuel", .parent = GC_MRF_READINGS, .type = GC_FT_FUEL,
                      .flags = GC_FF_OPTIONAL, .offset = RD(fuel), .aux = IN(fuel_spec) + 1,
                      .given = RD(has_fuel) + 1,
                      .description = "Fuel analysis of the day (default the machine's design "
                      "fuel; another fuel is reduced with its own heating values and warned)." },
    READING(GC_MRF_FUEL_TEMPERATURE, "fuel_temperature", GC_Q_AMBIENT_TEMPERATURE, OPT, 200.0, 1000.0,
            fuel_temperature_K, "Fuel supply temperature (default the design's)."),
    READING(GC_MRF_NET_POWER, "net_power", GC_Q_POWER, REQ, 0.0, 2e9, net_power_W,
            "Net output: generator terminals less an inlet chiller's power."),
    READING(GC_MRF_AIR_MASS_FLOW, "air_mass_flow", GC_Q_MASS_FLOW, OPT, 0.0, 1e5,
            air_mass_flow_kg_per_s, "Measured compressor air flow (optional: the heat balance "
            "gives it; when given, the balance must close within balance_tolerance)."),
    [GC_MRF_PART_LOAD] = { .name = "part_load", .parent = GC_MRF_READINGS, .type = GC_FT_BOOL,
                           .offset = RD(part_load),
                           .description = "The unit was at part load: compared with the model "
                           "at the same output (no output degradation then); default false: at "
                           "base load, compared with the model's base load." },
    READING(GC_MRF_BALANCE_TOLERANCE, "balance_tolerance", GC_Q_FRACTION,
            GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 0.0, 0.2, balance_tolerance,
            "Heat-balance closure allowed with a measured air flow, as a fraction of the fuel "
            "energy (flow metering is good to about 1-2 %: common practice)."),
    [GC_MRF_BALANCE_TOLERANCE].def = GC_MACHINE_DEFAULT_BALANCE_TOL,
};

static const gc__machine_copy site_rows[] = {
    { .dst = GC_MRF_SITE, .parent = 0, .from = "/site", .shift = SITE_SHIFT,
      .description = "Ambient conditions at the time of the readings (default the ISO "
      "reference; an altitude gives temperature and pressure by the U.S. Standard Atmosphere "
      "1976). Echoed as resolved." },
    { .dst = GC_MRF_SITE_ALTITUDE, .parent = GC_MRF_SITE, .from = "/site/altitude",
      .shift = SITE_SHIFT },
    { .dst = GC_MRF_SITE_TEMPERATURE, .parent = GC_MRF_SITE, .from = "/site/temperature",
      .shift = SITE_SHIFT },
    { .dst = GC_MRF_SITE_PRESSURE, .parent = GC_MRF_SITE, .from = "/site/pressure",
      .shift = SITE_SHIFT },
    { .dst = GC_MRF_SITE_RELATIVE_HUMIDITY, .parent = GC_MRF_SITE,
      .from = "/site/relative_humidity", .shift = SITE_SHIFT },
};

/* ---- outputs --------------------------------------------------------------------- */

enum {
    O_BAL = 0, O_BAL_N = 19,
    O_COR = O_BAL + 1 + O_BAL_N, O_COR_N = 4,
    O_DEG = O_COR + 1 + O_COR_N, O_DEG_N = 5,
    O_MODEL = O_DEG + 1 + O_DEG_N,
    O_BASE = O_MODEL + 1 + GC__MACHINE_POINT_ROWS_N,
    O_INLET = O_BASE + 1 + GC__MACHINE_POINT_ROWS_N,
    O_MACHINE = O_INLET + GC__MACHINE_INLET_ROWS_N,
    O_COUNT = O_MACHINE + GC__MACHINE_OUTPUT_ROWS_N
};

static gc_output outputs[O_COUNT];

#define RED(m) (RES(red) + offsetof(gc_machine_reduction, m))

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

/* A fraction shown x 100 under a fixed label ("%" or "points"). */
static gc_output pct_row(const char *name, int parent, const char *unit, size_t off,
                         const char *desc)
{
    return (gc_output){ .name = name, .parent = parent, .type = GC_OT_NUMBER, .unit_si = unit,
                        .unit_us = unit, .si_factor = 100.0, .us_factor = 100.0, .offset = off,
                        .description = desc };
}

static int balance_flows(gc_output *o, int P)
{
    int k = 0;
    o[k++] = q_row("compressor_inlet_temperature", P, GC_Q_AMBIENT_TEMPERATURE,
                   RED(compressor_inlet_T_K), "After the inlet treatment.");
    o[k++] = q_row("compressor_inlet_pressure", P, GC_Q_PRESSURE, RED(compressor_inlet_P_Pa),
                   "After the inlet losses.");
    o[k++] = n_row("pressure_ratio", P, RED(pressure_ratio),
                   "Compressor discharge over inlet pressure.");
    o[k++] = n_row("compressor_efficiency", P, RED(compressor_efficiency),
                   "Isentropic, from the discharge temperature.");
    o[k++] = q_row("air_mass_flow", P, GC_Q_MASS_FLOW, RED(air_mass_flow_kg_per_s),
                   "Air flow used: measured, or from the heat balance.");
    o[k++] = q_row("air_mass_flow_heat_balance", P, GC_Q_MASS_FLOW,
                   RED(air_mass_flow_balance_kg_per_s),
                   "The air flow the heat balance of the whole machine needs.");
    o[k++] = (gc_output){ .name = "air_flow_measured", .parent = P, .type = GC_OT_BOOL,
                          .offset = RED(air_flow_measured),
                          .description = "Whether the measured air flow was used." };
    o[k++] = pct_row("balance_residual", P, "%", RED(balance_residual),
                     "With a measured air flow: the energy balance's residual over the fuel "
                     "energy.");
    o[k++] = n_row("fuel_air_ratio", P, RED(fuel_air_ratio), "Fuel over compressor air.");
    o[k++] = q_row("turbine_inlet_temperature", P, GC_Q_AMBIENT_TEMPERATURE, RED(combustor_exit_T_K),
                   "Combustor exit from the combustor balance.");
    return k;
}

static void balance_rows(gc_output *o)
{
    const int P = O_BAL;
    o[0] = (gc_output){ .name = "heat_balance", .parent = -1, .type = GC_OT_OBJECT,
                        .flags = GC_OF_CSV_ROW,
                        .description = "The readings reduced by heat balance (never a measured "
                        "turbine inlet temperature)." };
    int k = 1 + balance_flows(o + 1, P);
    o[k++] = q_row("firing_temperature", P, GC_Q_AMBIENT_TEMPERATURE, RED(firing_temperature_K),
                   "First rotor inlet (mixed) from the combustor balance.");
    o[k++] = n_row("cooling_air_fraction", P, RED(cooling_air_fraction),
                   "Turbine coolant over compressor air (0 uncooled).");
    o[k++] = n_row("turbine_efficiency", P, RED(turbine_efficiency),
                   "Isentropic, firing temperature to the exhaust reading.");
    o[k] = n_row("nozzle_flow_function", P, RED(nozzle_flow_function_m2),
                 "m sqrt(R T)/P at the first nozzle from the heat balance and the discharge "
                 "pressure.");
    o[k].unit_si = "m2";
    o[k].unit_us = "ft2";
    o[k++].us_factor = 1.0 / 0.09290304; /* 1 ft2 = 0.09290304 m2 (NIST SP 811 B.8) */
    o[k++] = pct_row("nozzle_flow_change", P, "%", RED(nozzle_flow_change),
                     "Nozzle flow function against the design's (erosion, or a pressure "
                     "reading off).");
    o[k++] = q_row("heat_input", P, GC_Q_POWER, RED(heat_input_W), "Fuel flow times LHV.");
    o[k++] = q_row("heat_rate", P, GC_Q_HEAT_RATE, RED(heat_rate), "LHV, on net output.");
    o[k++] = q_row("heat_rate_hhv", P, GC_Q_HEAT_RATE, RED(heat_rate_hhv), "HHV, on net output.");
    o[k++] = n_row("thermal_efficiency", P, RED(thermal_efficiency),
                   "Net output over the fuel's LHV input.");
}

static void corrected_rows(gc_output *o)
{
    const int P = O_COR, D = O_DEG;
    o[O_COR] = (gc_output){ .name = "corrected", .parent = -1, .type = GC_OT_OBJECT,
                            .flags = GC_OF_CSV_ROW,
                            .description = "Output and heat rate corrected to the reference "
                            "conditions with the model's own factors (its base load at the "
                            "reference over its base load at these conditions)." };
    o[P + 1] = n_row("output_correction", P, RED(output_correction),
                     "Reading times this is the output at the reference.");
    o[P + 2] = n_row("heat_rate_correction", P, RED(heat_rate_correction),
                     "Reading times this is the heat rate at the reference.");
    o[P + 3] = q_row("net_power", P, GC_Q_POWER, RED(corrected_net_power_W),
                     "Net output corrected to the reference.");
    o[P + 4] = q_row("heat_rate", P, GC_Q_HEAT_RATE, RED(corrected_heat_rate),
                     "Heat rate (LHV) corrected to the reference.");
    o[D] = (gc_output){ .name = "degradation", .parent = -1, .type = GC_OT_OBJECT,
                        .flags = GC_OF_CSV_ROW,
                        .description = "Against the new-and-clean model at the same "
                        "conditions (negative output change: less output)." };
    o[D + 1] = pct_row("output_change", D, "%", RED(output_change),
                       "Output reading over the model's base load, less 1 (base-load "
                       "readings only).");
    o[D + 1].present = RED(has_output_change) + 1;
    o[D + 2] = pct_row("heat_rate_change", D, "%", RED(heat_rate_change),
                       "Heat rate over the model's, less 1.");
    o[D + 3] = pct_row("compressor_efficiency_change", D, "points",
                       RED(compressor_efficiency_change), "Reading less the model's.");
    o[D + 4] = pct_row("turbine_efficiency_change", D, "points", RED(turbine_efficiency_change),
                       "Reading less the model's.");
    o[D + 5] = pct_row("air_flow_change", D, "%", RED(air_flow_change),
                       "Air flow over the model's, less 1 (fouling takes a few per cent: "
                       "common practice).");
}

static void build_outputs(void)
{
    balance_rows(outputs);
    corrected_rows(outputs);
    outputs[O_MODEL] = (gc_output){ .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                                    .description = "The new-and-clean machine here: at base "
                                    "load, or at the same output for part-load readings." };
    gc__machine_point_rows(outputs + O_MODEL + 1, O_MODEL, RED(model));
    outputs[O_BASE] = (gc_output){ .name = "model_base", .parent = -1, .type = GC_OT_OBJECT,
                                   .description = "The new-and-clean machine here at base "
                                   "load." };
    gc__machine_point_rows(outputs + O_BASE + 1, O_BASE, RED(model_base));
    gc__machine_inlet_rows(outputs, O_INLET, RED(inlet));
    gc__machine_output_rows(outputs, O_MACHINE);
}

__attribute__((constructor)) static void build_tables(void)
{
    gc__machine_fill_rows(fields);
    gc__machine_copy_rows(fields, site_rows, (int)(sizeof site_rows / sizeof site_rows[0]));
    build_outputs();
}

/* ---- evaluation ---------------------------------------------------------------------- */

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_machine_readings_request *in = input;
    gc_machine_readings_answer *r = result;
    const gc_preset *p = &gc_preset_machine_readings;
    int rc = gc__machine_define(p, &in->head, &r->head, rep);
    if (rc != GC_OK)
        return rc;
    gc_machine_readings rd = in->readings;
    rd.inlet = in->head.inlet;
    rd.fuel_temperature_K = gc__machine_or0(rd.fuel_temperature_K);
    rd.air_mass_flow_kg_per_s = gc__machine_or0(rd.air_mass_flow_kg_per_s);
    gc_error e;
    gc_error_clear(&e);
    rc = gc_site_resolve(&rd.site, &r->site, &e);
    if (rc == GC_OK)
        rc = gc_machine_reduce(&r->head.machine, &rd, &r->red, &e);
    if (rc != GC_OK) {
        rep->input = rc == GC_ERR_INVALID;
        return gc__machine_report_error(p, rep, &e, NULL, 0);
    }
    gc__machine_report_warnings(p, rep, r->red.warnings, r->red.n_warnings, NULL, 0);
    return GC_OK;
}

/* ---- hooks ------------------------------------------------------------------------- */

static void init(void *input)
{
    gc_machine_readings_request *in = input;
    gc__machine_head_init(&in->head);
    gc_machine_readings_init(&in->readings);
}

static void echo(const void *input, const void *result, void *echo_input)
{
    (void)input;
    gc__machine_echo(&((const gc_machine_readings_answer *)result)->head,
                     &((gc_machine_readings_request *)echo_input)->head);
}

const gc_preset gc_preset_machine_readings = {
    .name = "machine_readings",
    .segment = "readings",
    .route_base = "/v1/machine/",
    .label = "machine_readings",
    .title = "Gas turbine readings reduced",
    .description = "Plant readings of a fixed single-shaft gas turbine (ambient, compressor "
                   "discharge pressure and temperature, exhaust temperature, fuel flow and "
                   "analysis, net output; air flow optional) reduced against its model: the "
                   "air flow and firing temperature from the heat balance (never a measured "
                   "turbine inlet temperature), compressor and turbine efficiencies, output "
                   "and heat rate corrected to the reference conditions with the model's own "
                   "correction factors, and the degradation against the new-and-clean machine "
                   "at the same conditions (output and heat rate in per cent, efficiencies in "
                   "points). Readings that contradict each other are refused, naming which and "
                   "by how much.",
    .kind = GC_PRESET_REDUCTION,
    .fields = fields,
    .n_fields = GC_MRF_COUNT,
    .outputs = outputs,
    .n_outputs = O_COUNT,
    .input_size = sizeof(gc_machine_readings_request),
    .result_size = sizeof(gc_machine_readings_answer),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .site = RES(site) + 1,
};
