/*
 * stations.c — the gas-turbine station-data reduction declared as a preset
 * (measured.h, preset.h): /v1/measured/stations. The readings (total T and
 * P at the compressor inlet and outlet and the turbine inlet and outlet, an
 * optional intercooler and regenerator, flows, the fuel, a measured power)
 * are reduced by gc_measured_stations_reduce to component efficiencies,
 * works, heat input, efficiency, heat rate, exergy destroyed per component,
 * the ideal Brayton cycle between the same limits, the Carnot bound and the
 * shortfall.
 *
 * Checks between inputs (422, "Invalid request fields"): an intercooler or a
 * regenerator is given with all four readings or none; fuel and
 * fuel_heating_value exclude each other. The site gives the air's humidity
 * and the exergy dead state; its temperature and pressure default to the
 * compressor inlet's.
 */
#include "core/presets/presets.h"
#include "gascycle/measured.h"

#include <stddef.h>
#include <stdio.h>
#include <string.h>

enum {
    F_REQUEST = 0, F_CI, F_CO, F_TI, F_TO, F_IC, F_RG, F_AIR_MASS_FLOW, F_FUEL_MASS_FLOW, F_FUEL,
    F_FUEL_HEATING_VALUE, F_FUEL_TEMPERATURE, F_NET_POWER, F_GAS, F_SITE,
    F_CI_T, F_CI_P, F_CO_T, F_CO_P, F_TI_T, F_TI_P, F_TO_T, F_TO_P,
    F_IC_IN, F_IC_OUT, F_IC_IN_T, F_IC_IN_P, F_IC_OUT_T, F_IC_OUT_P,
    F_RG_AIR, F_RG_GAS, F_RG_AIR_T, F_RG_AIR_P, F_RG_GAS_T, F_RG_GAS_P,
    F_GAS_CP, F_GAS_K, F_SITE_ALTITUDE, F_SITE_TEMPERATURE, F_SITE_PRESSURE, F_SITE_RH,
    F_COUNT
};

#define IN(member) offsetof(gc_stations_request, member)
#define GIVEN(member) (offsetof(gc_stations_request, member) + 1)
static const char *const gas_models[] = { "air", "cold", NULL };

#define READ_T(id, up, m, req, desc)                                                         \
    [id] = { .name = "T", .parent = up, .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,  \
             .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX | (req), .max = 6000.0,        \
             .offset = IN(m.T_K), .given = GIVEN(m.has_T), .description = desc " total "    \
             "temperature." }
#define READ_P(id, up, m, req, desc)                                                         \
    [id] = { .name = "P", .parent = up, .type = GC_FT_NUMBER, .quantity = GC_Q_PRESSURE,     \
             .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX | (req), .max = 1.0e8,         \
             .offset = IN(m.P_Pa), .given = GIVEN(m.has_P), .description = desc " total "   \
             "pressure (absolute)." }
#define STATION(id, nm, up, fl, desc)                                                        \
    [id] = { .name = nm, .parent = up, .type = GC_FT_OBJECT, .flags = (fl),                 \
             .description = desc }
#define FLOW(id, nm, q, max_, member, desc)                                                  \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q,                                \
             .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .max = max_,   \
             .offset = IN(member), .given = GIVEN(has_##member), .description = desc }
#define SITE(id, nm, q, fl, lo, hi, member, has, desc)                                      \
    [id] = { .name = nm, .parent = F_SITE, .type = GC_FT_NUMBER, .quantity = q,               \
             .flags = (fl) | GC_FF_NO_ECHO, .min = (lo), .max = (hi),                       \
             .offset = IN(site) + offsetof(gc_site_input, member),                          \
             .given = IN(site) + offsetof(gc_site_input, has) + 1, .description = desc }
#define REQ GC_FF_REQUIRED
#define OPT GC_FF_OPTIONAL   /* absent: not read (no default) */

static const gc_field fields[F_COUNT] = {
    [F_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                    .description = "Measured gas-turbine station data." },
    STATION(F_CI, "compressor_inlet", 0, REQ, "Compressor inlet T and P."),
    STATION(F_CO, "compressor_outlet", 0, REQ, "Compressor outlet T and P."),
    STATION(F_TI, "turbine_inlet", 0, REQ, "Turbine inlet T and P."),
    STATION(F_TO, "turbine_outlet", 0, REQ, "Turbine outlet T and P."),
    [F_IC] = { .name = "intercooler", .type = GC_FT_OBJECT, .flags = GC_FF_ECHO_GIVEN,
               .given = GIVEN(has_intercooler),
               .description = "An intercooler between two compressor stages: its inlet (the "
               "low-pressure compressor's outlet) and outlet (the high-pressure compressor's "
               "inlet), all four readings or none." },
    [F_RG] = { .name = "regenerator", .type = GC_FT_OBJECT, .flags = GC_FF_ECHO_GIVEN,
               .given = GIVEN(has_regenerator),
               .description = "A regenerator between the compressor and the combustor: the "
               "air leaving it (the combustor inlet) and the gas leaving it (the exhaust), all "
               "four readings or none." },
    FLOW(F_AIR_MASS_FLOW, "air_mass_flow", GC_Q_MASS_FLOW, 1.0e4, air_mass_flow,
         "Air entering the compressor (gives the powers)."),
    FLOW(F_FUEL_MASS_FLOW, "fuel_mass_flow", GC_Q_MASS_FLOW, 1.0e4, fuel_mass_flow,
         "Fuel burnt in the combustor (gives the fuel-air ratio; else the combustor's energy "
         "balance does)."),
    [F_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL, .offset = IN(fuel),
                 .aux = GIVEN(fuel_spec), .given = GIVEN(has_fuel),
                 .description = "The fuel: a name, {\"analysis\": {species: mole fraction}} "
                 "or {\"formula\", \"lower_heating_value\"}; absent: an air-standard "
                 "reduction (or give fuel_heating_value)." },
    [F_FUEL_HEATING_VALUE] = { .name = "fuel_heating_value", .type = GC_FT_NUMBER,
                               .quantity = GC_Q_SPECIFIC_ENERGY,
                               .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                               .min = 1.0e6, .max = 1.5e8, .offset = IN(fuel_heating_value),
                               .given = GIVEN(has_fuel_heating_value),
                               .description = "The fuel's lower heating value when no fuel is "
                               "named." },
    [F_FUEL_TEMPERATURE] = { .name = "fuel_temperature", .type = GC_FT_NUMBER,
                             .quantity = GC_Q_TEMPERATURE,
                             .flags = GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, .def = 298.15,
                             .min = 200.0, .max = 1000.0, .offset = IN(fuel_temperature),
                             .given = GIVEN(has_fuel_temperature),
                             .description = "Fuel supply temperature (echoed with a fuel)." },
    FLOW(F_NET_POWER, "net_power", GC_Q_POWER, 2.0e9, net_power,
         "Measured net power output (gives the plant efficiency and heat rate)."),
    [F_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "site_air",
                .offset = IN(gas), .given = GIVEN(has_gas),
                .description = "Air-side gas model: \"air\" (dry) or \"cold\"; default the "
                "site's humid air." },
    [F_SITE] = { .name = "site", .type = GC_FT_OBJECT, .flags = GC_FF_SITE,
                 .description = "Ambient conditions: the humidity of the air and the exergy "
                 "dead state (temperature and pressure default to the compressor inlet's). "
                 "Echoed as resolved." },
    READ_T(F_CI_T, F_CI, compressor_inlet, REQ, "Compressor inlet"),
    READ_P(F_CI_P, F_CI, compressor_inlet, REQ, "Compressor inlet"),
    READ_T(F_CO_T, F_CO, compressor_outlet, REQ, "Compressor outlet"),
    READ_P(F_CO_P, F_CO, compressor_outlet, REQ, "Compressor outlet"),
    READ_T(F_TI_T, F_TI, turbine_inlet, REQ, "Turbine inlet"),
    READ_P(F_TI_P, F_TI, turbine_inlet, REQ, "Turbine inlet"),
    READ_T(F_TO_T, F_TO, turbine_outlet, REQ, "Turbine outlet"),
    READ_P(F_TO_P, F_TO, turbine_outlet, REQ, "Turbine outlet"),
    STATION(F_IC_IN, "inlet", F_IC, 0, "Intercooler inlet T and P."),
    STATION(F_IC_OUT, "outlet", F_IC, 0, "Intercooler outlet T and P."),
    READ_T(F_IC_IN_T, F_IC_IN, intercooler_inlet, OPT,
           "Intercooler inlet (low-pressure compressor outlet)"),
    READ_P(F_IC_IN_P, F_IC_IN, intercooler_inlet, OPT,
           "Intercooler inlet (low-pressure compressor outlet)"),
    READ_T(F_IC_OUT_T, F_IC_OUT, intercooler_outlet, OPT,
           "Intercooler outlet (high-pressure compressor inlet)"),
    READ_P(F_IC_OUT_P, F_IC_OUT, intercooler_outlet, OPT,
           "Intercooler outlet (high-pressure compressor inlet)"),
    STATION(F_RG_AIR, "air_outlet", F_RG, 0, "Air leaving the regenerator."),
    STATION(F_RG_GAS, "gas_outlet", F_RG, 0, "Gas leaving the regenerator."),
    READ_T(F_RG_AIR_T, F_RG_AIR, regenerator_air_outlet, OPT,
           "Regenerator air outlet (combustor inlet)"),
    READ_P(F_RG_AIR_P, F_RG_AIR, regenerator_air_outlet, OPT,
           "Regenerator air outlet (combustor inlet)"),
    READ_T(F_RG_GAS_T, F_RG_GAS, regenerator_gas_outlet, OPT, "Regenerator gas outlet (exhaust)"),
    READ_P(F_RG_GAS_P, F_RG_GAS, regenerator_gas_outlet, OPT, "Regenerator gas outlet (exhaust)"),
    [F_GAS_CP] = { .name = "cp", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                   .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                   .def = 1005.0, .min = 100.0, .max = 20000.0,
                   .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                   .description = "Cold model: constant specific heat at constant pressure." },
    [F_GAS_K] = { .name = "k", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                  .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                  .def = 1.4, .min = 1.0, .max = 1.7, .offset = IN(gas) + offsetof(gc_gas, k_cold),
                  .description = "Cold model: constant ratio of specific heats cp/cv." },
    SITE(F_SITE_ALTITUDE, "altitude", GC_Q_LENGTH, GC_FF_MIN | GC_FF_MAX, -5000.0, 86000.0,
         altitude_m, has_altitude, "Geometric altitude above mean sea level."),
    SITE(F_SITE_TEMPERATURE, "temperature", GC_Q_AMBIENT_TEMPERATURE, GC_FF_MIN | GC_FF_MAX,
         173.15, 473.15, T_K, has_temperature,
         "Ambient temperature (default the compressor inlet's)."),
    SITE(F_SITE_PRESSURE, "pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
         0.0, 2.0e5, P_Pa, has_pressure, "Ambient pressure (default the compressor inlet's)."),
    SITE(F_SITE_RH, "relative_humidity", GC_Q_FRACTION, GC_FF_MIN | GC_FF_MAX, 0.0, 1.0, RH,
         has_relative_humidity, "Relative humidity."),
};

static const int site_field[5] = { F_SITE, F_SITE_ALTITUDE, F_SITE_TEMPERATURE, F_SITE_PRESSURE,
                                   F_SITE_RH };

/* ---- checks and the reduction's input ------------------------------------------------------- */

/* An optional exchanger: all four readings (1), none (0), or errors (-1). */
static int exchanger(const gc_stations_reading *a, const gc_stations_reading *b, int ta,
                     int tb, gc_report *rep)
{
    int n = a->has_T + a->has_P + b->has_T + b->has_P;
    if (n == 0 || n == 4)
        return n == 4;
    const gc_stations_reading *s[2] = { a, b };
    const int row[2] = { ta, tb };   /* the T rows; P follows each */
    const char *what = ta == F_IC_IN_T ? "intercooler" : "regenerator";
    for (int i = 0; i < 2; i++) {
        if (!s[i]->has_T)
            gc_report_error(rep, GC_ERR_INVALID, row[i], -1,
                            "is required with the other %s readings", what);
        if (!s[i]->has_P)
            gc_report_error(rep, GC_ERR_INVALID, row[i] + 1, -1,
                            "is required with the other %s readings", what);
    }
    return -1;
}

static void copy(gc_measured_station *dst, const gc_stations_reading *s)
{
    dst->T_K = s->T_K;
    dst->P_Pa = s->P_Pa;
}

/* The reduction's input from the request (site resolved into x->site). */
static int reduction_input(const gc_stations_request *q, int ic, int rg, gc_stations_reduction *x,
                           gc_error *err)
{
    gc_measured_stations_input *in = &x->in;
    gc_measured_stations_input_init(in);
    copy(&in->compressor_inlet, &q->compressor_inlet);
    copy(&in->compressor_outlet, &q->compressor_outlet);
    copy(&in->turbine_inlet, &q->turbine_inlet);
    copy(&in->turbine_outlet, &q->turbine_outlet);
    in->has_intercooler = ic;
    copy(&in->intercooler_inlet, &q->intercooler_inlet);
    copy(&in->intercooler_outlet, &q->intercooler_outlet);
    in->has_regenerator = rg;
    copy(&in->regenerator_air_outlet, &q->regenerator_air_outlet);
    copy(&in->regenerator_gas_outlet, &q->regenerator_gas_outlet);
    in->air_mass_flow = q->has_air_mass_flow ? q->air_mass_flow : 0.0;
    in->fuel_mass_flow = q->has_fuel_mass_flow ? q->fuel_mass_flow : 0.0;
    if (q->has_fuel) {
        in->has_fuel = 1;
        in->fuel = q->fuel;
        in->fuel_species = 1;
        in->fuel_temperature = q->fuel_temperature;
    }
    in->fuel_heating_value = q->has_fuel_heating_value ? q->fuel_heating_value : 0.0;
    in->net_power = q->has_net_power ? q->net_power : 0.0;
    gc_site_input si = q->site;
    int T_given = si.has_temperature;
    if (!si.has_temperature) {
        si.has_temperature = 1;
        si.T_K = q->compressor_inlet.T_K;
    }
    if (!si.has_pressure && !si.has_altitude) {
        si.has_pressure = 1;
        si.P_Pa = q->compressor_inlet.P_Pa;
    }
    int rc = gc_site_resolve(&si, &x->site, err);
    if (rc != GC_OK) {
        int m = (unsigned)err->field_id < 5u ? err->field_id : 0;
        return gc_error_at(err, rc, !T_given && m == GC_SITE_M_TEMPERATURE ? F_CI_T
                                                                            : site_field[m], -1);
    }
    in->gas = q->has_gas ? q->gas : x->site.gas;
    in->T_dead_K = x->site.T_K;
    in->P_dead_Pa = x->site.P_Pa;
    return GC_OK;
}

/* ---- what the document shows ----------------------------------------------------------------- */

static void state(gc_stations_reduction *x, const char *name, const gc_gas *g,
                  const gc_measured_station *s)
{
    gc_stations_state *o = &x->states[x->n_states++];
    o->station = name;
    o->T_K = s->T_K;
    o->P_Pa = s->P_Pa;
    o->h_J_per_kg = gc_gas_h_T(g, s->T_K);
    o->s_J_per_kgK = gc_gas_s_TP(g, s->T_K, s->P_Pa);
    snprintf(o->gas, sizeof o->gas, "%s", g->label);
}

static void figures(gc_stations_reduction *x)
{
    const gc_measured_stations_input *in = &x->in;
    const gc_measured_stations_result *r = &x->r;
    const gc_gas *ga = &in->gas, *gt = &r->turbine_gas;
    x->title = in->has_regenerator && in->has_intercooler
                   ? "Measured gas turbine, intercooled and regenerative"
               : in->has_regenerator ? "Measured gas turbine, regenerative"
               : in->has_intercooler ? "Measured gas turbine, intercooled"
                                     : "Measured gas turbine";
    x->n_states = 0;
    state(x, "compressor inlet", ga, &in->compressor_inlet);
    if (in->has_intercooler) {
        state(x, "intercooler inlet", ga, &in->intercooler_inlet);
        state(x, "intercooler outlet", ga, &in->intercooler_outlet);
    }
    state(x, "compressor outlet", ga, &in->compressor_outlet);
    if (in->has_regenerator)
        state(x, "regenerator air outlet", ga, &in->regenerator_air_outlet);
    state(x, "turbine inlet", gt, &in->turbine_inlet);
    state(x, "turbine outlet", gt, &in->turbine_outlet);
    if (in->has_regenerator)
        state(x, "regenerator gas outlet", gt, &in->regenerator_gas_outlet);
    int last = r->n_compressor_stages - 1;
    x->single_compressor = !in->has_intercooler;
    x->compressor_isentropic_efficiency = last ? r->compressor_work_isentropic /
                                                 r->compressor_work
                                               : r->compressor[0].isentropic_efficiency;
    x->compressor_polytropic_efficiency = r->compressor[last].polytropic_efficiency;
    x->pressure_ratio = in->compressor_outlet.P_Pa / in->compressor_inlet.P_Pa;
    x->has_plant = r->has_flow || r->has_power;
    x->has_fuel_flow = r->has_flow && in->fuel_mass_flow > 0.0;
    x->has_plant_efficiency = r->has_power && r->plant_efficiency > 0.0;
    x->intercooler_heat_out = -r->intercooler_heat;
    x->heat_input_basis = r->fuel_basis ? "fuel_lhv" : "air_standard";
    x->fuel_air_ratio_basis = r->far_from_balance ? "combustor_energy_balance" : "measured_flows";
    x->ideal_heat_input_basis = r->ideal_fuel_basis ? "fuel_lhv" : "air_standard";
}

/* ---- the descriptor's hooks ------------------------------------------------------------------- */

static void init(void *input)
{
    gc_site_input_init(&((gc_stations_request *)input)->site);
}

/* The reduction's errors: every data error at once where the validator lists
 * more than one (a request's error), else the first. */
static int reduction_failed(const gc_stations_reduction *x, const gc_error *err, gc_report *rep)
{
    gc_error list[GC_MEASURED_MAX_ERRORS];
    int n = 0;
    if (gc_measured_stations_validate(&x->in, list, GC_MEASURED_MAX_ERRORS, &n) != GC_OK &&
        n > 1) {
        for (int i = 0; i < n && i < GC_MEASURED_MAX_ERRORS; i++)
            gc_report_add(rep, &list[i]);
        rep->input = 1;
        return rep->errors[0].code;
    }
    return gc_report_add(rep, err);
}

/* A warning of the reduction (its field a path in this table) into rep. */
static void warn_path(gc_report *rep, const char *code, const char *path, const char *msg)
{
    int idx[2];
    int id = path && path[0] ? gc_preset_field_find(gc_stations_preset(), path, idx) : -1;
    gc_report_warn(rep, code, id, -1, "%s", msg);
}

static void warnings(const gc_stations_request *q, const gc_stations_reduction *x, gc_report *rep)
{
    for (int i = 0; i < x->r.n_warnings; i++)
        warn_path(rep, x->r.warnings[i].code, x->r.warnings[i].field, x->r.warnings[i].message);
    for (int i = 0; i < x->site.n_warnings; i++) {
        int m = (unsigned)x->site.warnings[i].member < 5u ? x->site.warnings[i].member : 0;
        gc_report_warn(rep, "site", site_field[m], -1, "%s", x->site.warnings[i].message);
    }
    if (q->has_gas && q->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", F_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    gc_report_validity(rep, &x->r.validity, -1);
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_stations_request *q = input;
    gc_stations_reduction *x = result;
    int ic = exchanger(&q->intercooler_inlet, &q->intercooler_outlet, F_IC_IN_T, F_IC_OUT_T, rep);
    int rg = exchanger(&q->regenerator_air_outlet, &q->regenerator_gas_outlet, F_RG_AIR_T,
                       F_RG_GAS_T, rep);
    if (q->has_fuel && q->has_fuel_heating_value)
        gc_report_error(rep, GC_ERR_INVALID, F_FUEL_HEATING_VALUE, -1, "give either fuel or "
                        "fuel_heating_value, not both (the fuel carries its own LHV)");
    if (rep->n_errors) {
        rep->input = 1;
        return rep->errors[0].code;
    }
    gc_error err;
    gc_error_clear(&err);
    int rc = reduction_input(q, ic, rg, x, &err);
    if (rc == GC_OK)
        rc = gc_measured_stations_reduce(&x->in, &x->r, &err);
    if (rc != GC_OK)
        return rc == GC_ERR_NOMEM || x->site.T_K <= 0.0 ? gc_report_add(rep, &err)
                                                        : reduction_failed(x, &err, rep);
    figures(x);
    warnings(q, x, rep);
    return GC_OK;
}

/* The echo: an exchanger with all its readings, the fuel temperature with a
 * fuel. */
static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_stations_request *q = input;
    const gc_stations_reduction *x = result;
    gc_stations_request *e = echo_input;
    e->has_intercooler = x->in.has_intercooler;
    e->has_regenerator = x->in.has_regenerator;
    e->has_fuel_temperature = q->has_fuel;
}

static const char *title_of(const void *input, const void *result)
{
    (void)input;
    return ((const gc_stations_reduction *)result)->title;
}

/* ---- outputs ------------------------------------------------------------------------------------ */

#define R_(m) offsetof(gc_stations_reduction, m)
#define P_(m) (offsetof(gc_stations_reduction, m) + 1)
#define RES(m) (offsetof(gc_stations_reduction, r) + offsetof(gc_measured_stations_result, m))
#define PRES(m) (RES(m) + 1)
#define Q(nm, par, q, off, pres, desc)                                                       \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = off, .present = (pres), .description = desc }
#define N(nm, par, off, pres, desc)                                                          \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = off, .present = (pres),     \
      .description = desc }
#define E GC_Q_SPECIFIC_ENERGY
#define MACHINE(par, label, m)                                                               \
    { .name = "process", .parent = par, .type = GC_OT_CONST, .text = label,                  \
      .description = "The component." },                                                    \
    N("pressure_ratio", par, RES(m.pressure_ratio), 0, "Its pressure ratio."),               \
    Q("work", par, E, RES(m.work), 0, "Work per kg of air (absorbed or delivered)."),        \
    Q("isentropic_work", par, E, RES(m.work_isentropic), 0,                                  \
      "The isentropic work at the same pressure ratio."),                                    \
    Q("T_isentropic", par, GC_Q_TEMPERATURE, RES(m.T_isentropic_K), 0,                      \
      "The isentropic outlet temperature."),                                                 \
    N("isentropic_efficiency", par, RES(m.isentropic_efficiency), 0, "Isentropic "           \
      "efficiency."),                                                                        \
    N("polytropic_efficiency", par, RES(m.polytropic_efficiency), 0, "Polytropic "           \
      "efficiency."),                                                                        \
    Q("exergy_destroyed", par, E, RES(m.exergy_destroyed), 0, "Exergy destroyed, T0 s_gen.")

enum {
    MODEL = 0, STATES = 7, PROCS = 14, LPC = 15, IC = 24, HPC = 29, C1 = 38, RG = 47,
    COMB = 56, TURB = 62, SUMMARY = 71, PLANT = 88, BOUNDS = 99, IDEAL = 100, CARNOT = 106,
    EXERGY = 110, DEST = 113, SHORT = 121, DEFICIT = 126, N_OUTPUTS = 132
};

static const gc_output outputs[N_OUTPUTS] = {
    [MODEL] = { .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                .description = "The models and bases of the reduction." },
    { .name = "gas", .parent = MODEL, .type = GC_OT_STRING,
      .offset = R_(in) + offsetof(gc_measured_stations_input, gas) + offsetof(gc_gas, label),
      .description = "The air-side gas model." },
    { .name = "turbine_gas", .parent = MODEL, .type = GC_OT_STRING,
      .offset = RES(turbine_gas) + offsetof(gc_gas, label),
      .description = "The gas through the turbine (combustion products, or the air)." },
    { .name = "basis", .parent = MODEL, .type = GC_OT_CONST,
      .text = "per kg of air entering the compressor", .description = "The basis of the "
      "specific figures." },
    { .name = "heat_input_basis", .parent = MODEL, .type = GC_OT_TEXT, .offset = R_(heat_input_basis),
      .description = "fuel_lhv: the heat input is the fuel's energy on its LHV; air_standard: "
      "the heat the gas took up." },
    { .name = "fuel_air_ratio_basis", .parent = MODEL, .type = GC_OT_TEXT,
      .offset = R_(fuel_air_ratio_basis), .present = PRES(fuel_basis),
      .description = "measured_flows, or combustor_energy_balance (no flows: solved from the "
      "combustor's energy balance)." },
    { .name = "fuel", .parent = MODEL, .type = GC_OT_FUEL, .flags = GC_OF_INPUT,
      .offset = offsetof(gc_stations_request, fuel),
      .present = offsetof(gc_stations_request, has_fuel) + 1,
      .description = "The fuel: its label and heating values at 298.15 K." },
    [STATES] = { .name = "states", .parent = -1, .type = GC_OT_LIST, .offset = R_(states),
                 .count = P_(n_states), .item_size = sizeof(gc_stations_state), .max_items = 8,
                 .description = "The stations in flow order, with h and s of the gas model "
                 "(absolute, as in /v1/properties)." },
    { .name = "station", .parent = STATES, .type = GC_OT_TEXT,
      .offset = offsetof(gc_stations_state, station), .description = "The station." },
    Q("T", STATES, GC_Q_TEMPERATURE, offsetof(gc_stations_state, T_K), 0, "Total temperature."),
    Q("P", STATES, GC_Q_PRESSURE, offsetof(gc_stations_state, P_Pa), 0, "Total pressure."),
    Q("h", STATES, E, offsetof(gc_stations_state, h_J_per_kg), 0, "Specific enthalpy."),
    Q("s", STATES, GC_Q_SPECIFIC_ENTROPY, offsetof(gc_stations_state, s_J_per_kgK), 0,
      "Specific entropy."),
    { .name = "gas", .parent = STATES, .type = GC_OT_STRING,
      .offset = offsetof(gc_stations_state, gas), .description = "The gas model there." },
    [PROCS] = { .name = "processes", .parent = -1, .type = GC_OT_ARRAY,
                .description = "The components in flow order." },
    [LPC] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT,
              .present = R_(in) + offsetof(gc_measured_stations_input, has_intercooler) + 1,
              .description = "The low-pressure compressor (with an intercooler)." },
    MACHINE(LPC, "low_pressure_compressor", compressor[0]),
    [IC] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT,
             .present = R_(in) + offsetof(gc_measured_stations_input, has_intercooler) + 1,
             .description = "The intercooler." },
    { .name = "process", .parent = IC, .type = GC_OT_CONST, .text = "intercooler",
      .description = "The component." },
    Q("heat", IC, E, R_(intercooler_heat_out), 0, "Heat of the air (negative: removed)."),
    N("pressure_loss", IC, RES(intercooler_pressure_loss), 0, "Fractional pressure loss."),
    Q("exergy_destroyed", IC, E, RES(exergy_intercooler), 0, "Exergy destroyed."),
    [HPC] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT,
              .present = R_(in) + offsetof(gc_measured_stations_input, has_intercooler) + 1,
              .description = "The high-pressure compressor." },
    MACHINE(HPC, "high_pressure_compressor", compressor[1]),
    [C1] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT, .present = P_(single_compressor),
             .description = "The compressor (no intercooler)." },
    MACHINE(C1, "compressor", compressor[0]),
    [RG] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT,
             .present = R_(in) + offsetof(gc_measured_stations_input, has_regenerator) + 1,
             .description = "The regenerator." },
    { .name = "process", .parent = RG, .type = GC_OT_CONST, .text = "regenerator",
      .description = "The component." },
    Q("heat", RG, E, RES(regenerator_heat), 0, "Heat gained by the air."),
    Q("gas_side_heat", RG, E, RES(regenerator_gas_heat), 0, "Heat given up by the gas."),
    N("effectiveness", RG, RES(regenerator_effectiveness), 0, "Effectiveness."),
    N("energy_balance", RG, RES(regenerator_balance), 0,
      "(gas-side heat - air-side heat) / air-side heat."),
    N("pressure_loss", RG, RES(regenerator_air_pressure_loss), 0, "Air-side pressure loss."),
    N("gas_side_pressure_loss", RG, RES(regenerator_gas_pressure_loss), 0,
      "Gas-side pressure loss."),
    Q("exergy_destroyed", RG, E, RES(exergy_regenerator), 0, "Exergy destroyed."),
    [COMB] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT, .description = "The combustor." },
    { .name = "process", .parent = COMB, .type = GC_OT_CONST, .text = "combustor",
      .description = "The component." },
    Q("heat", COMB, E, RES(heat_to_gas), 0, "Heat that reached the gas."),
    N("pressure_loss", COMB, RES(combustor_pressure_loss), 0, "Fractional pressure loss."),
    N("combustor_efficiency", COMB, RES(combustor_efficiency), PRES(fuel_basis),
      "Heat to the gas over the fuel's energy (with a fuel)."),
    Q("exergy_destroyed", COMB, E, RES(exergy_combustor), 0, "Exergy destroyed."),
    [TURB] = { .name = "", .parent = PROCS, .type = GC_OT_OBJECT, .description = "The turbine." },
    MACHINE(TURB, "turbine", turbine),
    [SUMMARY] = { .name = "summary", .parent = -1, .type = GC_OT_OBJECT,
                  .description = "The engine's figures per kg of air." },
    Q("compressor_work", SUMMARY, E, RES(compressor_work), 0, "Compressor work, all stages."),
    Q("turbine_work", SUMMARY, E, RES(turbine_work), 0, "Turbine work."),
    Q("net_work", SUMMARY, E, RES(net_work), 0, "Net gas-path work."),
    N("back_work_ratio", SUMMARY, RES(back_work_ratio), 0, "Compressor over turbine work."),
    Q("heat_in", SUMMARY, E, RES(heat_in), 0, "Heat input (fuel: its energy on the LHV)."),
    N("thermal_efficiency", SUMMARY, RES(thermal_efficiency), 0, "Net work over heat input."),
    { .name = "gas_path_heat_rate", .parent = SUMMARY, .type = GC_OT_NUMBER,
      .quantity = GC_Q_HEAT_RATE, .has_quantity = 1, .flags = GC_OF_POSITIVE,
      .offset = RES(gas_path_heat_rate),
      .description = "Heat input per unit of gas-path net work (1 / thermal efficiency)." },
    N("compressor_isentropic_efficiency", SUMMARY, R_(compressor_isentropic_efficiency), 0,
      "Isentropic efficiency of the compression (all stages: isentropic over actual work)."),
    N("turbine_isentropic_efficiency", SUMMARY, RES(turbine.isentropic_efficiency), 0,
      "Isentropic efficiency of the turbine."),
    N("compressor_polytropic_efficiency", SUMMARY, R_(compressor_polytropic_efficiency), 0,
      "Polytropic efficiency of the (last) compressor stage."),
    N("turbine_polytropic_efficiency", SUMMARY, RES(turbine.polytropic_efficiency), 0,
      "Polytropic efficiency of the turbine."),
    N("pressure_ratio", SUMMARY, R_(pressure_ratio), 0, "Compressor outlet over inlet pressure."),
    N("fuel_air_ratio", SUMMARY, RES(fuel_air_ratio), PRES(fuel_basis), "Fuel per kg of air."),
    N("combustor_efficiency", SUMMARY, RES(combustor_efficiency), PRES(fuel_basis),
      "Heat to the gas over the fuel's energy."),
    N("regenerator_effectiveness", SUMMARY, RES(regenerator_effectiveness),
      R_(in) + offsetof(gc_measured_stations_input, has_regenerator) + 1,
      "The regenerator's effectiveness."),
    Q("T_exhaust", SUMMARY, GC_Q_TEMPERATURE, RES(T_exhaust_K), 0,
      "Exhaust temperature (leaving the turbine, or the regenerator)."),
    [PLANT] = { .name = "plant", .parent = -1, .type = GC_OT_OBJECT, .present = P_(has_plant),
                .description = "Powers, with air_mass_flow or net_power." },
    Q("air_mass_flow", PLANT, GC_Q_MASS_FLOW, R_(in) + offsetof(gc_measured_stations_input,
                                                              air_mass_flow), PRES(has_flow),
      "Air flow."),
    Q("fuel_mass_flow", PLANT, GC_Q_MASS_FLOW, R_(in) + offsetof(gc_measured_stations_input,
                                                               fuel_mass_flow), P_(has_fuel_flow),
      "Fuel flow."),
    Q("compressor_power", PLANT, GC_Q_POWER, RES(compressor_power), PRES(has_flow),
      "Compressor power."),
    Q("turbine_power", PLANT, GC_Q_POWER, RES(turbine_power), PRES(has_flow), "Turbine power."),
    Q("gas_path_power", PLANT, GC_Q_POWER, RES(net_power_gas_path), PRES(has_flow),
      "Net gas-path power."),
    Q("heat_input_power", PLANT, GC_Q_POWER, RES(heat_input_power), PRES(has_flow),
      "Heat input power."),
    Q("net_power", PLANT, GC_Q_POWER, R_(in) + offsetof(gc_measured_stations_input, net_power),
      PRES(has_power), "The measured net power."),
    { .name = "power_ratio", .parent = PLANT, .type = GC_OT_NUMBER, .flags = GC_OF_POSITIVE,
      .offset = RES(power_ratio), .present = PRES(has_power),
      .description = "Measured net power over the gas-path net power." },
    N("plant_efficiency", PLANT, RES(plant_efficiency), P_(has_plant_efficiency),
      "Net power over the fuel's energy flow (LHV)."),
    Q("plant_heat_rate", PLANT, GC_Q_HEAT_RATE, RES(plant_heat_rate), P_(has_plant_efficiency),
      "Fuel energy per unit of measured net power."),
    [BOUNDS] = { .name = "bounds", .parent = -1, .type = GC_OT_OBJECT,
                 .description = "The ideal Brayton cycle between the same limits, and the "
                 "Carnot bound." },
    [IDEAL] = { .name = "ideal", .parent = BOUNDS, .type = GC_OT_OBJECT,
                .description = "The ideal Brayton cycle (efficiencies 1, no losses) at the "
                "measured pressure ratio and temperatures." },
    N("thermal_efficiency", IDEAL, RES(ideal_thermal_efficiency), 0, "Its thermal efficiency."),
    Q("net_work", IDEAL, E, RES(ideal_net_work), 0, "Its net work."),
    Q("heat_in", IDEAL, E, RES(ideal_heat_in), 0, "Its heat input."),
    N("back_work_ratio", IDEAL, RES(ideal_back_work_ratio), 0, "Its back work ratio."),
    { .name = "heat_input_basis", .parent = IDEAL, .type = GC_OT_TEXT,
      .offset = R_(ideal_heat_input_basis), .description = "fuel_lhv or air_standard." },
    [CARNOT] = { .name = "carnot", .parent = BOUNDS, .type = GC_OT_OBJECT,
                 .description = "The Carnot bound between the extreme temperatures." },
    N("efficiency", CARNOT, RES(carnot_efficiency), 0, "1 - T_min / T_max."),
    Q("T_min", CARNOT, GC_Q_TEMPERATURE, RES(T_min_K), 0, "The lowest temperature."),
    Q("T_max", CARNOT, GC_Q_TEMPERATURE, RES(T_max_K), 0, "The highest temperature."),
    [EXERGY] = { .name = "exergy", .parent = -1, .type = GC_OT_OBJECT,
                 .description = "Exergy destroyed per component and lost with the exhaust." },
    Q("dead_temperature", EXERGY, GC_Q_TEMPERATURE, RES(T_dead_K), 0, "Dead-state temperature."),
    Q("dead_pressure", EXERGY, GC_Q_PRESSURE, RES(P_dead_Pa), 0, "Dead-state pressure."),
    [DEST] = { .name = "destroyed", .parent = EXERGY, .type = GC_OT_OBJECT,
               .description = "Exergy destroyed per kg of air." },
    Q("compressor", DEST, E, RES(exergy_compressor), 0, "In the compressor."),
    Q("intercooler", DEST, E, RES(exergy_intercooler),
      R_(in) + offsetof(gc_measured_stations_input, has_intercooler) + 1, "In the intercooler."),
    Q("regenerator", DEST, E, RES(exergy_regenerator),
      R_(in) + offsetof(gc_measured_stations_input, has_regenerator) + 1, "In the regenerator."),
    Q("combustor", DEST, E, RES(exergy_combustor), 0, "In the combustor."),
    Q("turbine", DEST, E, RES(exergy_turbine), 0, "In the turbine."),
    Q("total", DEST, E, RES(exergy_destroyed), 0, "In all."),
    Q("exhaust_loss", EXERGY, E, RES(exergy_exhaust), 0, "Flow exergy leaving with the exhaust."),
    [SHORT] = { .name = "shortfall", .parent = -1, .type = GC_OT_OBJECT,
                .description = "The shortfall against the ideal cycle." },
    N("thermal_efficiency", SHORT, RES(thermal_efficiency), 0, "Measured thermal efficiency."),
    N("ideal_thermal_efficiency", SHORT, RES(ideal_thermal_efficiency), 0,
      "The ideal cycle's efficiency."),
    N("efficiency_gap", SHORT, RES(efficiency_gap), 0, "Ideal less measured efficiency."),
    N("fraction_of_ideal", SHORT, RES(fraction_of_ideal), 0, "Measured over ideal efficiency."),
    [DEFICIT] = { .name = "work_deficit", .parent = SHORT, .type = GC_OT_OBJECT,
                  .description = "Work lost against each ideal component, per kg of air." },
    Q("compressor", DEFICIT, E, RES(deficit_compressor), 0, "By the compressor."),
    Q("turbine", DEFICIT, E, RES(deficit_turbine), 0, "By the turbine."),
    Q("pressure_losses", DEFICIT, E, RES(deficit_pressure_losses), 0, "By the pressure losses."),
    Q("combustor", DEFICIT, E, RES(deficit_combustor), PRES(fuel_basis), "By the combustor."),
    { .name = "largest_loss", .parent = SHORT, .type = GC_OT_TEXT, .offset = RES(largest_loss),
      .description = "compressor, turbine, pressure_losses or combustor." },
};

const gc_preset gc_preset_stations = {
    .name = "stations",
    .segment = "stations",
    .label = "measured_stations",
    .title = "Measured gas turbine",
    .description = "Gas-turbine station data (total T and P at the compressor inlet and "
                   "outlet and the turbine inlet and outlet; an optional intercooler and "
                   "regenerator; air and fuel flows, the fuel, a measured power) reduced to "
                   "component efficiencies, works, heat input, efficiency, heat rate, exergy "
                   "destroyed per component, the ideal Brayton cycle between the same "
                   "limits, the Carnot bound and the shortfall.",
    .kind = GC_PRESET_REDUCTION,
    .fields = fields,
    .n_fields = F_COUNT,
    .outputs = outputs,
    .n_outputs = N_OUTPUTS,
    .input_size = sizeof(gc_stations_request),
    .result_size = sizeof(gc_stations_reduction),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .title_of = title_of,
    .site = offsetof(gc_stations_reduction, site) + 1,
};

const gc_preset *gc_stations_preset(void)
{
    return &gc_preset_stations;
}
