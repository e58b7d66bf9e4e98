/*
 * measured.c — the measured-data routes over gascycle/measured.h:
 *
 *   GET|POST /v1/measured/stations       gas-turbine station data (total T and P
 *            at the compressor inlet and outlet, turbine inlet and outlet; an
 *            optional intercooler and regenerator; air and fuel flows, the
 *            fuel, a measured power) reduced to component efficiencies, works,
 *            heat input, efficiency, heat rate, exergy destroyed per
 *            component, the engine's ideal Brayton cycle between the same
 *            limits, the Carnot bound and the shortfall.
 *   GET|POST /v1/measured/pressure-trace a cylinder-pressure trace over one
 *            cycle ("trace": [[crank angle deg, pressure], ...] with the
 *            geometry, or "pv_trace": [[volume, pressure], ...]) reduced to
 *            indicated work (gross, pumping, net), IMEP, PMEP, power, peak
 *            pressure, polytropic exponents and the comparison with the
 *            engine's ideal Otto cycle. GET takes a trace as one comma list
 *            of alternating values (angle,pressure,angle,pressure,...),
 *            which suits short traces; long traces belong in a POST body.
 *
 * Units: inputs are numbers in the quantity's default unit or strings with a
 * unit, except the trace samples: plain numbers, angles in degrees,
 * pressures in "pressure_unit" (default kPa), volumes in "volume_unit"
 * (default L). Results go through gc_out_q in the chosen unit system.
 */
#include "api/cycle_out.h"
#include "api/decode.h"
#include "api/handlers.h"
#include "api/output.h"
#include "api/validity_out.h"
#include "gascycle/measured.h"
#include "gascycle/site.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

/* ---- shared ---------------------------------------------------------------- */

static const char *problem_class(int code)
{
    switch (code) {
    case GC_ERR_RANGE: return "out_of_range";
    case GC_ERR_INFEASIBLE:
    case GC_ERR_RICH: return "infeasible";
    case GC_ERR_NOCONV: return "no_convergence";
    case GC_ERR_CHECK: return "check_failed";
    default: return "validation";
    }
}

static int fail_core(gc_api_response *resp, gc_out *out, const gc_error *err, const char *fallback)
{
    if (err->code == GC_ERR_NOMEM) {
        gc_out_free(out);
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    }
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_errors_add(&errs, err->field[0] ? err->field : fallback, "%s", err->message);
    gc_api_problem_errors(resp, 422, problem_class(err->code), "Inputs cannot be evaluated",
                          NULL, &errs);
    gc_out_free(out);
    return 0;
}

static int fail_list(gc_api_response *resp, gc_out *out, const gc_api_errors *errs)
{
    gc_api_problem_errors(resp, 422, "validation", "Invalid request fields", NULL, errs);
    gc_out_free(out);
    return 0;
}

static void put_warnings(gc_out *o, const gc_measured_warning *w, int n)
{
    for (int i = 0; i < n; i++)
        gc_out_warn(o, w[i].code, w[i].field[0] ? w[i].field : NULL, "%s", w[i].message);
}

/* ---- /v1/measured/stations ----------------------------------------------------- */

typedef struct station_in {
    double T, P;                 /* K, Pa */
    int has_T, has_P;
} station_in;

typedef struct stations_req {
    gc_cycle_common c;           /* first: shared gas/fuel/site specs */
    station_in c1, c2, t3, t4;   /* compressor inlet/outlet, turbine inlet/outlet */
    station_in ic_in, ic_out;    /* intercooler inlet/outlet */
    station_in rg_air, rg_gas;   /* regenerator air outlet, gas outlet */
    double air_mass_flow;        /* kg/s, 0 = not given */
    double fuel_mass_flow;       /* kg/s */
    double fuel_heating_value;   /* J/kg */
    double fuel_temperature;     /* K */
    double net_power;            /* W */
} stations_req;

#define ST_T(st, m, req, desc)                                                              \
    GC_F_NUM("T", GC_Q_TEMPERATURE, st, m.T, .present = GC_PRESENT(st, m.has_T),            \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX | (req), .min = 0.0, .max = 6000.0, \
             .description = desc " total temperature")
#define ST_P(st, m, req, desc)                                                              \
    GC_F_NUM("P", GC_Q_PRESSURE, st, m.P, .present = GC_PRESENT(st, m.has_P),               \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX | (req), .min = 0.0, .max = 1.0e8,  \
             .description = desc " total pressure (absolute)")
#define ST_FIELDS(name, m, req, desc)                                                       \
    static const gc_field_spec name[] = {                                                   \
        ST_T(stations_req, m, req, desc), ST_P(stations_req, m, req, desc), GC_F_END }

ST_FIELDS(c1_fields, c1, GC_F_REQUIRED, "compressor inlet");
ST_FIELDS(c2_fields, c2, GC_F_REQUIRED, "compressor outlet");
ST_FIELDS(t3_fields, t3, GC_F_REQUIRED, "turbine inlet");
ST_FIELDS(t4_fields, t4, GC_F_REQUIRED, "turbine outlet");
ST_FIELDS(ic_in_fields, ic_in, 0, "intercooler inlet (low-pressure compressor outlet)");
ST_FIELDS(ic_out_fields, ic_out, 0, "intercooler outlet (high-pressure compressor inlet)");
ST_FIELDS(rg_air_fields, rg_air, 0, "regenerator air outlet (combustor inlet)");
ST_FIELDS(rg_gas_fields, rg_gas, 0, "regenerator gas outlet (exhaust)");

static const gc_field_spec ic_fields[] = {
    GC_F_OBJ("inlet", ic_in_fields, .description = "intercooler inlet T and P"),
    GC_F_OBJ("outlet", ic_out_fields, .description = "intercooler outlet T and P"),
    GC_F_END
};
static const gc_field_spec rg_fields[] = {
    GC_F_OBJ("air_outlet", rg_air_fields, .description = "air leaving the regenerator"),
    GC_F_OBJ("gas_outlet", rg_gas_fields, .description = "gas leaving the regenerator"),
    GC_F_END
};

#define FLOW(nm, member, q, desc)                                                           \
    GC_F_NUM(nm, q, stations_req, member, .def = 0.0,                                      \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0e4,        \
             .description = desc)

static const gc_field_spec stations_fields[] = {
    GC_F_OBJ("compressor_inlet", c1_fields, .flags = GC_F_REQUIRED,
             .description = "compressor inlet T and P"),
    GC_F_OBJ("compressor_outlet", c2_fields, .flags = GC_F_REQUIRED,
             .description = "compressor outlet T and P"),
    GC_F_OBJ("turbine_inlet", t3_fields, .flags = GC_F_REQUIRED,
             .description = "turbine inlet T and P"),
    GC_F_OBJ("turbine_outlet", t4_fields, .flags = GC_F_REQUIRED,
             .description = "turbine outlet T and P"),
    GC_F_OBJ("intercooler", ic_fields, .description = "intercooler between two compressor stages"),
    GC_F_OBJ("regenerator", rg_fields, .description = "regenerator between compressor and combustor"),
    FLOW("air_mass_flow", air_mass_flow, GC_Q_MASS_FLOW, "air entering the compressor"),
    FLOW("fuel_mass_flow", fuel_mass_flow, GC_Q_MASS_FLOW, "fuel burnt in the combustor"),
    GC_CYCLE_F_FUEL("the fuel (name, analysis or formula with LHV)"),
    GC_F_NUM("fuel_heating_value", GC_Q_SPECIFIC_ENERGY, stations_req, fuel_heating_value,
             .def = 0.0, .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0e6,
             .max = 1.5e8, .description = "fuel LHV when no fuel is named"),
    GC_F_NUM("fuel_temperature", GC_Q_TEMPERATURE, stations_req, fuel_temperature,
             .def = 298.15, .flags = GC_F_MIN | GC_F_MAX, .min = 200.0, .max = 1000.0,
             .description = "fuel supply temperature"),
    GC_F_NUM("net_power", GC_Q_POWER, stations_req, net_power, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 2.0e9,
             .description = "measured net power output"),
    GC_CYCLE_F_GAS("air-side gas model; default the site's humid air"),
    GC_CYCLE_F_SITE("ambient: humidity of the air and the exergy dead state (default: the "
                    "compressor inlet)"),
    GC_F_END
};

static void station_out(gc_out *o, json_t *arr, const char *name, const gc_gas *g,
                        const gc_measured_station *s)
{
    json_t *j = json_object();
    json_object_set_new(j, "station", json_string(name));
    gc_out_q(o, j, "T", s->T_K, GC_Q_TEMPERATURE);
    gc_out_q(o, j, "P", s->P_Pa, GC_Q_PRESSURE);
    gc_out_q(o, j, "h", gc_gas_h_T(g, s->T_K), GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "s", gc_gas_s_TP(g, s->T_K, s->P_Pa), GC_Q_SPECIFIC_ENTROPY);
    json_object_set_new(j, "gas", json_string(g->label));
    json_array_append_new(arr, j);
}

static void machine_out(gc_out *o, json_t *arr, const char *name, const gc_measured_machine *m)
{
    json_t *j = json_object();
    json_object_set_new(j, "process", json_string(name));
    gc_out_num(o, j, "pressure_ratio", m->pressure_ratio);
    gc_out_q(o, j, "work", m->work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "isentropic_work", m->work_isentropic, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "T_isentropic", m->T_isentropic_K, GC_Q_TEMPERATURE);
    gc_out_num(o, j, "isentropic_efficiency", m->isentropic_efficiency);
    gc_out_num(o, j, "polytropic_efficiency", m->polytropic_efficiency);
    gc_out_q(o, j, "exergy_destroyed", m->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
    json_array_append_new(arr, j);
}

static void copy_station(gc_measured_station *dst, const station_in *s)
{
    dst->T_K = s->T;
    dst->P_Pa = s->P;
}

/* An optional exchanger: all four values or none. */
static int exchanger_given(gc_api_errors *errs, const station_in *a, const station_in *b,
                           const char *name, const char *an, const char *bn)
{
    int n = a->has_T + a->has_P + b->has_T + b->has_P;
    if (n == 0)
        return 0;
    if (n == 4)
        return 1;
    const station_in *s[2] = { a, b };
    const char *sn[2] = { an, bn };
    for (int i = 0; i < 2; i++) {
        char ptr[GC_API_FIELD_LEN];
        if (!s[i]->has_T) {
            snprintf(ptr, sizeof ptr, "/%s/%s/T", name, sn[i]);
            gc_api_errors_add(errs, ptr, "is required with the other %s readings", name);
        }
        if (!s[i]->has_P) {
            snprintf(ptr, sizeof ptr, "/%s/%s/P", name, sn[i]);
            gc_api_errors_add(errs, ptr, "is required with the other %s readings", name);
        }
    }
    return -1;
}

int gc_api_h_measured_stations(const gc_api_request *req, gc_api_response *resp)
{
    gc_out out;
    if (gc_out_init(&out) != 0)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    gc_out *o = &out;
    stations_req r;
    memset(&r, 0, sizeof r);
    if (gc_decode_request(req, stations_fields, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                          GC_OUT_ACCEPT_SELECT, &r, o, resp) != 0) {
        gc_out_free(o);
        return 0;
    }
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    int ic = exchanger_given(&errs, &r.ic_in, &r.ic_out, "intercooler", "inlet", "outlet");
    int rg = exchanger_given(&errs, &r.rg_air, &r.rg_gas, "regenerator", "air_outlet",
                             "gas_outlet");
    if (r.c.has_fuel && r.fuel_heating_value > 0.0)
        gc_api_errors_add(&errs, "/fuel_heating_value", "give either fuel or "
                          "fuel_heating_value, not both (the fuel carries its own LHV)");
    if (errs.n)
        return fail_list(resp, o, &errs);
    if (ic == 0)
        json_object_del(o->inputs, "intercooler");
    if (rg == 0)
        json_object_del(o->inputs, "regenerator");
    const char *zero_opt[] = { "air_mass_flow", "fuel_mass_flow", "fuel_heating_value",
                               "net_power" };
    const double zero_val[] = { r.air_mass_flow, r.fuel_mass_flow, r.fuel_heating_value,
                                r.net_power };
    for (size_t i = 0; i < 4; i++)
        if (!(zero_val[i] > 0.0))
            json_object_del(o->inputs, zero_opt[i]);
    if (!r.c.has_fuel)
        json_object_del(o->inputs, "fuel_temperature");

    gc_measured_stations_input *in = malloc(sizeof *in);
    gc_measured_stations_result *res = malloc(sizeof *res);
    gc_error err;
    gc_error_clear(&err);
    if (!in || !res) {
        free(in);
        free(res);
        err.code = GC_ERR_NOMEM;
        return fail_core(resp, o, &err, "");
    }
    gc_measured_stations_input_init(in);
    copy_station(&in->compressor_inlet, &r.c1);
    copy_station(&in->compressor_outlet, &r.c2);
    copy_station(&in->turbine_inlet, &r.t3);
    copy_station(&in->turbine_outlet, &r.t4);
    if (ic > 0) {
        in->has_intercooler = 1;
        copy_station(&in->intercooler_inlet, &r.ic_in);
        copy_station(&in->intercooler_outlet, &r.ic_out);
    }
    if (rg > 0) {
        in->has_regenerator = 1;
        copy_station(&in->regenerator_air_outlet, &r.rg_air);
        copy_station(&in->regenerator_gas_outlet, &r.rg_gas);
    }
    in->air_mass_flow = r.air_mass_flow;
    in->fuel_mass_flow = r.fuel_mass_flow;
    if (r.c.has_fuel) {
        in->has_fuel = 1;
        in->fuel = r.c.fuel;
        in->fuel_species = 1;
        in->fuel_temperature = r.fuel_temperature;
    }
    in->fuel_heating_value = r.fuel_heating_value;
    in->net_power = r.net_power;

    /* site: humidity of the default gas and the dead state; its temperature and
     * pressure default to the compressor inlet's */
    gc_site_input si;
    gc_cycle_common_site(&r.c, &si);
    int site_T_given = si.has_temperature;
    if (!si.has_temperature) {
        si.has_temperature = 1;
        si.T_K = r.c1.T;
    }
    if (!si.has_pressure && !si.has_altitude) {
        si.has_pressure = 1;
        si.P_Pa = r.c1.P;
    }
    gc_site site;
    int rc = gc_site_resolve(&si, &site, &err);
    if (rc != GC_OK) {
        if (!site_T_given && strcmp(err.field, "/site/temperature") == 0)
            snprintf(err.field, sizeof err.field, "/compressor_inlet/T");
        free(in);
        free(res);
        return fail_core(resp, o, &err, "/site");
    }
    if (r.c.has_gas) {
        rc = gc_cycle_common_gas(&r.c, &in->gas, &err);
        if (rc != GC_OK) {
            free(in);
            free(res);
            return fail_core(resp, o, &err, "/gas");
        }
    } else {
        in->gas = site.gas;
        gc_cycle_echo_site_air(o);
    }
    in->T_dead_K = site.T_K;
    in->P_dead_Pa = site.P_Pa;
    gc_cycle_echo_site(o, &site);

    rc = gc_measured_stations_reduce(in, res, &err);
    if (rc != GC_OK) {
        /* all data errors at once where the validator can list them */
        gc_error list[GC_MEASURED_MAX_ERRORS];
        int n = 0;
        if (gc_measured_stations_validate(in, list, GC_MEASURED_MAX_ERRORS, &n) != GC_OK &&
            n > 1) {
            for (int i = 0; i < n && i < GC_MEASURED_MAX_ERRORS; i++)
                gc_api_errors_add(&errs, list[i].field, "%s", list[i].message);
            free(in);
            free(res);
            return fail_list(resp, o, &errs);
        }
        free(in);
        free(res);
        return fail_core(resp, o, &err, "");
    }

    json_t *doc = json_object();
    json_object_set_new(doc, "reduction", json_string("stations"));
    json_object_set_new(doc, "title", json_string(
        in->has_regenerator && in->has_intercooler ? "Measured gas turbine, intercooled and "
        "regenerative" : in->has_regenerator ? "Measured gas turbine, regenerative" :
        in->has_intercooler ? "Measured gas turbine, intercooled" : "Measured gas turbine"));
    json_t *model = json_object();
    json_object_set_new(model, "gas", json_string(in->gas.label));
    json_object_set_new(model, "turbine_gas", json_string(res->turbine_gas.label));
    json_object_set_new(model, "basis", json_string("per kg of air entering the compressor"));
    json_object_set_new(model, "heat_input_basis", json_string(
        res->fuel_basis ? "fuel_lhv" : "air_standard"));
    if (res->fuel_basis)
        json_object_set_new(model, "fuel_air_ratio_basis", json_string(
            res->far_from_balance ? "combustor_energy_balance" : "measured_flows"));
    if (r.c.has_fuel)
        json_object_set_new(model, "fuel", gc_cycle_out_fuel(o, &in->fuel));
    json_object_set_new(doc, "model", model);

    const gc_gas *ga = &in->gas, *gt = &res->turbine_gas;
    json_t *states = json_array();
    station_out(o, states, "compressor inlet", ga, &in->compressor_inlet);
    if (in->has_intercooler) {
        station_out(o, states, "intercooler inlet", ga, &in->intercooler_inlet);
        station_out(o, states, "intercooler outlet", ga, &in->intercooler_outlet);
    }
    station_out(o, states, "compressor outlet", ga, &in->compressor_outlet);
    if (in->has_regenerator)
        station_out(o, states, "regenerator air outlet", ga, &in->regenerator_air_outlet);
    station_out(o, states, "turbine inlet", gt, &in->turbine_inlet);
    station_out(o, states, "turbine outlet", gt, &in->turbine_outlet);
    if (in->has_regenerator)
        station_out(o, states, "regenerator gas outlet", gt, &in->regenerator_gas_outlet);
    json_object_set_new(doc, "states", states);

    json_t *procs = json_array();
    if (in->has_intercooler) {
        machine_out(o, procs, "low_pressure_compressor", &res->compressor[0]);
        json_t *j = json_object();
        json_object_set_new(j, "process", json_string("intercooler"));
        gc_out_q(o, j, "heat", -res->intercooler_heat, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, j, "pressure_loss", res->intercooler_pressure_loss);
        gc_out_q(o, j, "exergy_destroyed", res->exergy_intercooler, GC_Q_SPECIFIC_ENERGY);
        json_array_append_new(procs, j);
        machine_out(o, procs, "high_pressure_compressor", &res->compressor[1]);
    } else {
        machine_out(o, procs, "compressor", &res->compressor[0]);
    }
    if (in->has_regenerator) {
        json_t *j = json_object();
        json_object_set_new(j, "process", json_string("regenerator"));
        gc_out_q(o, j, "heat", res->regenerator_heat, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "gas_side_heat", res->regenerator_gas_heat, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, j, "effectiveness", res->regenerator_effectiveness);
        gc_out_num(o, j, "energy_balance", res->regenerator_balance);
        gc_out_num(o, j, "pressure_loss", res->regenerator_air_pressure_loss);
        gc_out_num(o, j, "gas_side_pressure_loss", res->regenerator_gas_pressure_loss);
        gc_out_q(o, j, "exergy_destroyed", res->exergy_regenerator, GC_Q_SPECIFIC_ENERGY);
        json_array_append_new(procs, j);
    }
    {
        json_t *j = json_object();
        json_object_set_new(j, "process", json_string("combustor"));
        gc_out_q(o, j, "heat", res->heat_to_gas, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, j, "pressure_loss", res->combustor_pressure_loss);
        if (res->fuel_basis)
            gc_out_num(o, j, "combustor_efficiency", res->combustor_efficiency);
        gc_out_q(o, j, "exergy_destroyed", res->exergy_combustor, GC_Q_SPECIFIC_ENERGY);
        json_array_append_new(procs, j);
    }
    machine_out(o, procs, "turbine", &res->turbine);
    json_object_set_new(doc, "processes", procs);

    json_t *sm = json_object();
    gc_out_q(o, sm, "compressor_work", res->compressor_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "turbine_work", res->turbine_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "net_work", res->net_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, sm, "back_work_ratio", res->back_work_ratio);
    gc_out_q(o, sm, "heat_in", res->heat_in, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, sm, "thermal_efficiency", res->thermal_efficiency);
    if (res->gas_path_heat_rate > 0.0)
        gc_out_q(o, sm, "gas_path_heat_rate", res->gas_path_heat_rate, GC_Q_HEAT_RATE);
    int last = res->n_compressor_stages - 1;
    gc_out_num(o, sm, "compressor_isentropic_efficiency",
               last ? res->compressor_work_isentropic / res->compressor_work
                    : res->compressor[0].isentropic_efficiency);
    gc_out_num(o, sm, "turbine_isentropic_efficiency", res->turbine.isentropic_efficiency);
    gc_out_num(o, sm, "compressor_polytropic_efficiency", res->compressor[last].polytropic_efficiency);
    gc_out_num(o, sm, "turbine_polytropic_efficiency", res->turbine.polytropic_efficiency);
    gc_out_num(o, sm, "pressure_ratio", in->compressor_outlet.P_Pa / in->compressor_inlet.P_Pa);
    if (res->fuel_basis) {
        gc_out_num(o, sm, "fuel_air_ratio", res->fuel_air_ratio);
        gc_out_num(o, sm, "combustor_efficiency", res->combustor_efficiency);
    }
    if (in->has_regenerator)
        gc_out_num(o, sm, "regenerator_effectiveness", res->regenerator_effectiveness);
    gc_out_q(o, sm, "T_exhaust", res->T_exhaust_K, GC_Q_TEMPERATURE);
    json_object_set_new(doc, "summary", sm);

    if (res->has_flow || res->has_power) {
        json_t *p = json_object();
        if (res->has_flow) {
            gc_out_q(o, p, "air_mass_flow", in->air_mass_flow, GC_Q_MASS_FLOW);
            if (in->fuel_mass_flow > 0.0)
                gc_out_q(o, p, "fuel_mass_flow", in->fuel_mass_flow, GC_Q_MASS_FLOW);
            gc_out_q(o, p, "compressor_power", res->compressor_power, GC_Q_POWER);
            gc_out_q(o, p, "turbine_power", res->turbine_power, GC_Q_POWER);
            gc_out_q(o, p, "gas_path_power", res->net_power_gas_path, GC_Q_POWER);
            gc_out_q(o, p, "heat_input_power", res->heat_input_power, GC_Q_POWER);
        }
        if (res->has_power) {
            gc_out_q(o, p, "net_power", in->net_power, GC_Q_POWER);
            if (res->power_ratio > 0.0)
                gc_out_num(o, p, "power_ratio", res->power_ratio);
            if (res->plant_efficiency > 0.0) {
                gc_out_num(o, p, "plant_efficiency", res->plant_efficiency);
                gc_out_q(o, p, "plant_heat_rate", res->plant_heat_rate, GC_Q_HEAT_RATE);
            }
        }
        json_object_set_new(doc, "plant", p);
    }

    json_t *bounds = json_object();
    json_t *ideal = json_object();
    gc_out_num(o, ideal, "thermal_efficiency", res->ideal_thermal_efficiency);
    gc_out_q(o, ideal, "net_work", res->ideal_net_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, ideal, "heat_in", res->ideal_heat_in, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, ideal, "back_work_ratio", res->ideal_back_work_ratio);
    json_object_set_new(ideal, "heat_input_basis",
                        json_string(res->ideal_fuel_basis ? "fuel_lhv" : "air_standard"));
    json_object_set_new(bounds, "ideal", ideal);
    json_t *carnot = json_object();
    gc_out_num(o, carnot, "efficiency", res->carnot_efficiency);
    gc_out_q(o, carnot, "T_min", res->T_min_K, GC_Q_TEMPERATURE);
    gc_out_q(o, carnot, "T_max", res->T_max_K, GC_Q_TEMPERATURE);
    json_object_set_new(bounds, "carnot", carnot);
    json_object_set_new(doc, "bounds", bounds);

    json_t *ex = json_object();
    gc_out_q(o, ex, "dead_temperature", res->T_dead_K, GC_Q_TEMPERATURE);
    gc_out_q(o, ex, "dead_pressure", res->P_dead_Pa, GC_Q_PRESSURE);
    json_t *dest = json_object();
    gc_out_q(o, dest, "compressor", res->exergy_compressor, GC_Q_SPECIFIC_ENERGY);
    if (in->has_intercooler)
        gc_out_q(o, dest, "intercooler", res->exergy_intercooler, GC_Q_SPECIFIC_ENERGY);
    if (in->has_regenerator)
        gc_out_q(o, dest, "regenerator", res->exergy_regenerator, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, dest, "combustor", res->exergy_combustor, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, dest, "turbine", res->exergy_turbine, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, dest, "total", res->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
    json_object_set_new(ex, "destroyed", dest);
    gc_out_q(o, ex, "exhaust_loss", res->exergy_exhaust, GC_Q_SPECIFIC_ENERGY);
    json_object_set_new(doc, "exergy", ex);

    json_t *sf = json_object();
    gc_out_num(o, sf, "thermal_efficiency", res->thermal_efficiency);
    gc_out_num(o, sf, "ideal_thermal_efficiency", res->ideal_thermal_efficiency);
    gc_out_num(o, sf, "efficiency_gap", res->efficiency_gap);
    gc_out_num(o, sf, "fraction_of_ideal", res->fraction_of_ideal);
    json_t *def = json_object();
    gc_out_q(o, def, "compressor", res->deficit_compressor, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, def, "turbine", res->deficit_turbine, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, def, "pressure_losses", res->deficit_pressure_losses, GC_Q_SPECIFIC_ENERGY);
    if (res->fuel_basis)
        gc_out_q(o, def, "combustor", res->deficit_combustor, GC_Q_SPECIFIC_ENERGY);
    json_object_set_new(sf, "work_deficit", def);
    json_object_set_new(sf, "largest_loss", json_string(res->largest_loss));
    json_object_set_new(doc, "shortfall", sf);

    put_warnings(o, res->warnings, res->n_warnings);
    for (int i = 0; i < site.n_warnings; i++)
        gc_out_warn(o, "site", site.warnings[i].field, "%s", site.warnings[i].message);
    if (r.c.has_gas && r.c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    gc_api_validity_warn(o, &res->validity, NULL);
    free(in);
    free(res);
    return gc_out_respond(o, doc, GC_OUT_EVALUATION, resp);
}

/* ---- /v1/measured/pressure-trace --------------------------------------------- */

typedef struct trace_req {
    gc_cycle_common c;           /* first: shared gas/fuel specs */
    int n;                       /* samples */
    double *x;                   /* malloc'd: angles (deg as given) or volumes (as given) */
    double *P;                   /* malloc'd: pressures as given */
    int pv;                      /* 1: pv_trace given */
    int has_trace, has_pv;
    char pressure_unit[GC_DECODE_MAX_STRING];
    char volume_unit[GC_DECODE_MAX_STRING];
    double bore, stroke, rod, cr; /* m, m, m, - */
    double displacement;         /* m3, whole engine */
    int cylinders, strokes;
    double speed;                /* rev/s */
    double tdc_angle;            /* rad */
    double cw[2], ew[2];         /* rad */
    int has_cw, has_ew;
    double intake_temperature;   /* K */
    int has_intake_temperature;
    double intake_pressure;      /* Pa, 0 = from the trace */
    double fuel_per_cycle;       /* kg */
    double fuel_heating_value;   /* J/kg */
} trace_req;

/* A plain number (JSON number, or a query string holding only a number). */
static int plain_number(gc_decoder *d, json_t *v, const char *ptr, double *x)
{
    if (json_is_number(v)) {
        *x = json_number_value(v);
    } else if (json_is_string(v) && d->from_query) {
        const char *s = json_string_value(v);
        char *end = NULL;
        errno = 0;
        while (isspace((unsigned char)*s))
            s++;
        *x = strtod(s, &end);
        while (end && isspace((unsigned char)*end))
            end++;
        if (!*s || !end || *end || errno == ERANGE ||
            strpbrk(s, "xXnNiI")) {   /* no hex, NaN or Infinity */
            gc_decode_error(d, ptr, "must be a plain number, got '%.40s'", s);
            return -1;
        }
    } else {
        gc_decode_error(d, ptr, "must be a plain number (trace samples carry no unit: "
                        "angles in degrees, pressures in pressure_unit)");
        return -1;
    }
    if (!isfinite(*x)) {
        gc_decode_error(d, ptr, "must be a finite number");
        return -1;
    }
    return 0;
}

static int decode_trace(gc_decoder *d, const gc_field_spec *f, json_t *value,
                        const char *pointer, void *target, json_t *echo_parent)
{
    trace_req *r = target;
    int pv = strcmp(f->name, "pv_trace") == 0;
    if (!value)
        return 0;
    if (pv)
        r->has_pv = 1;
    else
        r->has_trace = 1;
    if (r->x) {
        gc_decode_error(d, pointer, "give either trace (crank angle, pressure) or pv_trace "
                        "(volume, pressure), not both");
        return -1;
    }
    json_t *owned;
    json_t *arr = gc_decode_list(d, value, &owned);
    if (!json_is_array(arr)) {
        gc_decode_error(d, pointer, "must be an array of [%s, pressure] pairs (GET: one comma "
                        "list of alternating values)", pv ? "volume" : "crank angle");
        return -1;
    }
    size_t n = json_array_size(arr);
    int flat = owned != NULL;
    size_t samples = flat ? n / 2 : n;
    if (flat && n % 2) {
        gc_decode_error(d, pointer, "holds %zu values; the comma list alternates %s and "
                        "pressure, so it needs an even count", n, pv ? "volume" : "angle");
        json_decref(owned);
        return -1;
    }
    if (samples < GC_MEASURED_TRACE_MIN || samples > GC_MEASURED_TRACE_MAX) {
        gc_decode_error(d, pointer, "must hold %d to %d samples over one cycle, got %zu",
                        GC_MEASURED_TRACE_MIN, GC_MEASURED_TRACE_MAX, samples);
        json_decref(owned);
        return -1;
    }
    r->x = malloc(samples * sizeof *r->x);
    r->P = malloc(samples * sizeof *r->P);
    if (!r->x || !r->P) {
        gc_decode_error(d, pointer, "is too large for the memory available");
        json_decref(owned);
        return -1;
    }
    int bad = 0;
    for (size_t i = 0; i < samples && bad < 5; i++) {
        char ptr[GC_API_FIELD_LEN];
        json_t *a, *b;
        if (flat) {
            a = json_array_get(arr, 2 * i);
            b = json_array_get(arr, 2 * i + 1);
        } else {
            json_t *pair = json_array_get(arr, i);
            if (!json_is_array(pair) || json_array_size(pair) != 2) {
                snprintf(ptr, sizeof ptr, "%s/%zu", pointer, i);
                gc_decode_error(d, ptr, "must be a pair [%s, pressure]",
                                pv ? "volume" : "crank angle");
                bad++;
                continue;
            }
            a = json_array_get(pair, 0);
            b = json_array_get(pair, 1);
        }
        snprintf(ptr, sizeof ptr, "%s/%zu/0", pointer, i);
        if (plain_number(d, a, ptr, &r->x[i]) != 0)
            bad++;
        snprintf(ptr, sizeof ptr, "%s/%zu/1", pointer, i);
        if (plain_number(d, b, ptr, &r->P[i]) != 0)
            bad++;
    }
    json_decref(owned);
    if (bad)
        return -1;
    r->n = (int)samples;
    r->pv = pv;
    if (echo_parent) {
        json_t *e = json_object();
        json_object_set_new(e, "samples", json_integer(r->n));
        json_object_set_new(echo_parent, f->name, e);
    }
    return 0;
}

static int decode_window(gc_decoder *d, const gc_field_spec *f, json_t *value,
                         const char *pointer, void *target, json_t *echo_parent)
{
    trace_req *r = target;
    int comp = strcmp(f->name, "compression_window") == 0;
    double *w = comp ? r->cw : r->ew;
    if (!value) {
        w[0] = (comp ? -100.0 : 40.0) * PI / 180.0;
        w[1] = (comp ? -30.0 : 100.0) * PI / 180.0;
    } else {
        json_t *owned;
        json_t *arr = gc_decode_list(d, value, &owned);
        if (!json_is_array(arr) || json_array_size(arr) != 2) {
            gc_decode_error(d, pointer, "must be two crank angles [start, end] from firing "
                            "TDC (GET: \"start,end\")");
            json_decref(owned);
            return -1;
        }
        int bad = 0;
        for (size_t i = 0; i < 2; i++) {
            char ptr[GC_API_FIELD_LEN];
            snprintf(ptr, sizeof ptr, "%s/%zu", pointer, i);
            double x = 0.0;
            if (gc_decode_number(d, json_array_get(arr, i), ptr, GC_Q_ANGLE, &x) != 0)
                bad = 1;
            w[i] = x;
        }
        json_decref(owned);
        if (bad)
            return -1;
        if (!(w[0] < w[1]) || w[0] < -PI - 1e-12 || w[1] > PI + 1e-12) {
            gc_decode_error(d, pointer, "must run from a smaller to a larger angle, within "
                            "-180..180 degrees from firing TDC");
            return -1;
        }
        if (comp)
            r->has_cw = 1;
        else
            r->has_ew = 1;
    }
    if (echo_parent) {
        json_t *e = json_array();
        json_array_append_new(e, json_real(w[0] * 180.0 / PI));
        json_array_append_new(e, json_real(w[1] * 180.0 / PI));
        json_object_set_new(echo_parent, f->name, e);
    }
    return 0;
}

#define LEN(nm, member, desc)                                                               \
    GC_F_NUM(nm, GC_Q_LENGTH, trace_req, member, .def = 0.0,                               \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 10.0,         \
             .description = desc)

static const gc_field_spec trace_fields[] = {
    GC_F_CUSTOM("trace", decode_trace, trace_req, n,
                .description = "[[crank angle deg, pressure], ...] over one cycle"),
    GC_F_CUSTOM("pv_trace", decode_trace, trace_req, n,
                .description = "[[volume, pressure], ...] over one cycle"),
    GC_F_STR("pressure_unit", trace_req, pressure_unit, .def_string = "kPa",
             .description = "unit of the trace pressures (absolute)"),
    GC_F_STR("volume_unit", trace_req, volume_unit, .def_string = "L",
             .description = "unit of the pv_trace volumes"),
    LEN("bore", bore, "cylinder bore"),
    LEN("stroke", stroke, "piston stroke"),
    LEN("connecting_rod_length", rod, "connecting rod, centre to centre"),
    GC_F_NUM("compression_ratio", GC_Q_RATIO, trace_req, cr, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0, .max = 100.0,
             .description = "geometric compression ratio"),
    GC_F_NUM("displacement", GC_Q_VOLUME, trace_req, displacement, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 100.0,
             .description = "swept volume of the whole engine (instead of bore)"),
    GC_F_INT("cylinders", trace_req, cylinders, .def = 1, .flags = GC_F_MIN | GC_F_MAX,
             .min = 1, .max = 64, .description = "number of cylinders"),
    GC_F_INT("strokes_per_cycle", trace_req, strokes, .def = 4, .flags = GC_F_MIN | GC_F_MAX,
             .min = 2, .max = 4, .description = "2 or 4"),
    GC_F_NUM("speed", GC_Q_ROTATIONAL_SPEED, trace_req, speed, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1000.0,
             .description = "crankshaft speed, for the indicated power"),
    GC_F_NUM("tdc_angle", GC_Q_ANGLE, trace_req, tdc_angle, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MAX, .min = -4.0 * PI, .max = 4.0 * PI,
             .description = "crank angle of firing TDC in the trace's angles"),
    GC_F_CUSTOM("compression_window", decode_window, trace_req, cw,
                .description = "fit window of the compression exponent, deg from firing TDC"),
    GC_F_CUSTOM("expansion_window", decode_window, trace_req, ew,
                .description = "fit window of the expansion exponent, deg from firing TDC"),
    GC_F_NUM("intake_temperature", GC_Q_AMBIENT_TEMPERATURE, trace_req, intake_temperature,
             .def = 288.15, .present = GC_PRESENT(trace_req, has_intake_temperature),
             .flags = GC_F_MIN | GC_F_MAX, .min = 200.0, .max = 1000.0,
             .description = "trapped gas temperature at the start of compression"),
    GC_F_NUM("intake_pressure", GC_Q_PRESSURE, trace_req, intake_pressure, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0e8,
             .description = "pressure at the start of compression (default: the trace at BDC)"),
    GC_CYCLE_F_GAS("trapped gas model for the trapped mass and the ideal Otto cycle"),
    GC_CYCLE_F_FUEL("the fuel (its LHV), for the indicated efficiency"),
    GC_F_NUM("fuel_heating_value", GC_Q_SPECIFIC_ENERGY, trace_req, fuel_heating_value,
             .def = 0.0, .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0e6,
             .max = 1.5e8, .description = "fuel LHV when no fuel is named"),
    GC_F_NUM("fuel_per_cycle", GC_Q_MASS, trace_req, fuel_per_cycle, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0,
             .description = "fuel mass per cylinder per cycle"),
    GC_F_END
};

static int trace_done(trace_req *r, int rc)
{
    free(r->x);
    free(r->P);
    r->x = r->P = NULL;
    return rc;
}

int gc_api_h_measured_trace(const gc_api_request *req, gc_api_response *resp)
{
    gc_out out;
    if (gc_out_init(&out) != 0)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    gc_out *o = &out;
    trace_req r;
    memset(&r, 0, sizeof r);
    if (gc_decode_request(req, trace_fields, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                          GC_OUT_ACCEPT_SELECT, &r, o, resp) != 0) {
        gc_out_free(o);
        return trace_done(&r, 0);
    }
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (!r.x)
        gc_api_errors_add(&errs, "/trace", "is required: give trace ([[crank angle, "
                          "pressure], ...]) or pv_trace ([[volume, pressure], ...])");
    if (r.strokes != 2 && r.strokes != 4)
        gc_api_errors_add(&errs, "/strokes_per_cycle", "must be 2 or 4");
    double fP = 0.0, fV = 0.0;
    gc_error uerr;
    if (gc_units_to_si(GC_Q_PRESSURE, 1.0, r.pressure_unit, &fP, &uerr) != GC_OK)
        gc_api_errors_add(&errs, "/pressure_unit", "%s", uerr.message);
    if (gc_units_to_si(GC_Q_VOLUME, 1.0, r.volume_unit, &fV, &uerr) != GC_OK)
        gc_api_errors_add(&errs, "/volume_unit", "%s", uerr.message);
    if (r.c.has_fuel && r.fuel_heating_value > 0.0)
        gc_api_errors_add(&errs, "/fuel_heating_value", "give either fuel or "
                          "fuel_heating_value, not both");
    if (r.pv) {
        const char *angle_only[] = { "bore", "stroke", "connecting_rod_length",
                                     "compression_ratio", "displacement" };
        const double vals[] = { r.bore, r.stroke, r.rod, r.cr, r.displacement };
        for (size_t i = 0; i < 5; i++)
            if (vals[i] > 0.0) {
                char ptr[GC_API_FIELD_LEN];
                snprintf(ptr, sizeof ptr, "/%s", angle_only[i]);
                gc_api_errors_add(&errs, ptr, "does not apply to a pv_trace, whose volumes "
                                  "are given");
            }
        if (r.has_cw || r.has_ew)
            gc_api_errors_add(&errs, r.has_cw ? "/compression_window" : "/expansion_window",
                              "does not apply to a pv_trace: its fits use the branch samples "
                              "between 20 %% and 70 %% of the swept volume");
        if (r.tdc_angle != 0.0)
            gc_api_errors_add(&errs, "/tdc_angle", "does not apply to a pv_trace");
    } else if (r.x) {
        if (!(r.stroke > 0.0))
            gc_api_errors_add(&errs, "/stroke", "is required with a crank-angle trace");
        if (!(r.rod > 0.0))
            gc_api_errors_add(&errs, "/connecting_rod_length", "is required with a "
                              "crank-angle trace");
        if (!(r.cr > 0.0))
            gc_api_errors_add(&errs, "/compression_ratio", "is required with a crank-angle "
                              "trace");
        if (r.bore > 0.0 && r.displacement > 0.0)
            gc_api_errors_add(&errs, "/displacement", "give either bore or displacement, "
                              "not both");
        else if (!(r.bore > 0.0) && !(r.displacement > 0.0))
            gc_api_errors_add(&errs, "/bore", "is required with a crank-angle trace (or give "
                              "displacement)");
    }
    if (errs.n) {
        trace_done(&r, 0);
        return fail_list(resp, o, &errs);
    }
    /* echo: drop what was not given */
    const char *opt[] = { "bore", "stroke", "connecting_rod_length", "compression_ratio",
                          "displacement", "speed", "intake_pressure", "fuel_heating_value",
                          "fuel_per_cycle" };
    const double optv[] = { r.bore, r.stroke, r.rod, r.cr, r.displacement, r.speed,
                            r.intake_pressure, r.fuel_heating_value, r.fuel_per_cycle };
    for (size_t i = 0; i < sizeof opt / sizeof opt[0]; i++)
        if (!(optv[i] > 0.0))
            json_object_del(o->inputs, opt[i]);
    if (r.pv) {
        json_object_del(o->inputs, "tdc_angle");
        json_object_del(o->inputs, "compression_window");
        json_object_del(o->inputs, "expansion_window");
        json_object_del(o->inputs, "pressure_unit");
    } else {
        json_object_del(o->inputs, "volume_unit");
    }

    for (int i = 0; i < r.n; i++) {
        r.P[i] *= fP;
        r.x[i] *= r.pv ? fV : PI / 180.0;
    }
    gc_measured_trace_input in;
    memset(&in, 0, sizeof in);
    in.pv = r.pv;
    in.n = r.n;
    in.x = r.x;
    in.P = r.P;
    in.geometry.stroke = r.stroke;
    in.geometry.rod_length = r.rod;
    in.geometry.compression_ratio = r.cr;
    in.geometry.bore = r.bore;
    if (!r.pv && !(r.bore > 0.0))
        in.geometry.bore = sqrt(4.0 * (r.displacement / r.cylinders) / (PI * r.stroke));
    in.strokes = r.strokes;
    in.tdc_angle = r.tdc_angle;
    in.cylinders = r.cylinders;
    in.speed = r.speed;
    in.compression_window[0] = r.cw[0];
    in.compression_window[1] = r.cw[1];
    in.expansion_window[0] = r.ew[0];
    in.expansion_window[1] = r.ew[1];
    gc_error err;
    gc_error_clear(&err);
    if (gc_cycle_common_gas(&r.c, &in.gas, &err) != GC_OK) {
        trace_done(&r, 0);
        return fail_core(resp, o, &err, "/gas");
    }
    in.intake_temperature = r.intake_temperature;
    in.intake_pressure = r.intake_pressure;
    in.fuel_per_cycle = r.fuel_per_cycle;
    in.fuel_heating_value = r.c.has_fuel ? r.c.fuel.LHV_J_per_kg : r.fuel_heating_value;

    gc_measured_trace_result *res = malloc(sizeof *res);
    if (!res) {
        trace_done(&r, 0);
        err.code = GC_ERR_NOMEM;
        return fail_core(resp, o, &err, "");
    }
    int rc = gc_measured_trace_reduce(&in, res, &err);
    trace_done(&r, 0);
    if (rc != GC_OK) {
        free(res);
        return fail_core(resp, o, &err, r.pv ? "/pv_trace" : "/trace");
    }

    json_t *doc = json_object();
    json_object_set_new(doc, "reduction", json_string("pressure_trace"));
    json_object_set_new(doc, "title", json_string(r.pv ? "Measured P-V loop"
                                                       : "Measured cylinder-pressure trace"));
    json_t *eng = json_object();
    if (!r.pv) {
        gc_out_q(o, eng, "bore", in.geometry.bore, GC_Q_LENGTH);
        gc_out_q(o, eng, "stroke", in.geometry.stroke, GC_Q_LENGTH);
        gc_out_q(o, eng, "connecting_rod_length", in.geometry.rod_length, GC_Q_LENGTH);
    }
    gc_out_num(o, eng, "compression_ratio", res->compression_ratio);
    gc_out_q(o, eng, "cylinder_displacement", res->displacement, GC_Q_VOLUME);
    gc_out_q(o, eng, "clearance_volume", res->clearance, GC_Q_VOLUME);
    gc_out_q(o, eng, "engine_displacement", res->displacement * r.cylinders, GC_Q_VOLUME);
    json_object_set_new(eng, "cylinders", json_integer(r.cylinders));
    json_object_set_new(eng, "strokes_per_cycle", json_integer(r.strokes));
    json_object_set_new(doc, "engine", eng);

    json_t *tr = json_object();
    json_object_set_new(tr, "samples", json_integer(in.n));
    gc_out_q(o, tr, "V_min", res->V_min, GC_Q_VOLUME);
    gc_out_q(o, tr, "V_max", res->V_max, GC_Q_VOLUME);
    gc_out_num(o, tr, "loop_mismatch", res->loop_mismatch);
    json_object_set_new(tr, "integration", json_string(
        "trapezoid rule on P dV over the samples, last sample joined to the first"));
    json_object_set_new(doc, "trace", tr);

    json_t *ind = json_object();
    gc_out_q(o, ind, "work_net", res->work_net, GC_Q_ENERGY);
    gc_out_q(o, ind, "work_gross", res->work_gross, GC_Q_ENERGY);
    gc_out_q(o, ind, "work_pumping", res->work_pumping, GC_Q_ENERGY);
    gc_out_q(o, ind, "imep_net", res->imep_net, GC_Q_PRESSURE);
    gc_out_q(o, ind, "imep_gross", res->imep_gross, GC_Q_PRESSURE);
    gc_out_q(o, ind, "pmep", res->pmep, GC_Q_PRESSURE);
    if (res->has_power) {
        gc_out_q(o, ind, "power_net", res->power_net, GC_Q_POWER);
        gc_out_q(o, ind, "power_gross", res->power_gross, GC_Q_POWER);
    }
    gc_out_q(o, ind, "peak_pressure", res->P_max, GC_Q_PRESSURE);
    if (!r.pv)
        gc_out_q(o, ind, "peak_pressure_angle", res->angle_P_max, GC_Q_ANGLE);
    gc_out_q(o, ind, "peak_pressure_volume", res->V_P_max, GC_Q_VOLUME);
    if (res->has_fuel) {
        gc_out_q(o, ind, "fuel_energy", res->fuel_energy, GC_Q_ENERGY);
        gc_out_num(o, ind, "efficiency_gross", res->efficiency_gross);
        gc_out_num(o, ind, "efficiency_net", res->efficiency_net);
    }
    json_object_set_new(doc, "indicated", ind);

    json_t *poly = json_object();
    const gc_measured_fit *fits[2] = { &res->compression, &res->expansion };
    const char *fit_names[2] = { "compression", "expansion" };
    for (int k = 0; k < 2; k++) {
        json_t *j = json_object();
        gc_out_num(o, j, "n", fits[k]->n);
        gc_out_num(o, j, "r_squared", fits[k]->r_squared);
        json_object_set_new(j, "samples", json_integer(fits[k]->samples));
        if (r.pv) {
            gc_out_num(o, j, "volume_fraction_start", fits[k]->window[0]);
            gc_out_num(o, j, "volume_fraction_end", fits[k]->window[1]);
        } else {
            gc_out_q(o, j, "window_start", fits[k]->window[0], GC_Q_ANGLE);
            gc_out_q(o, j, "window_end", fits[k]->window[1], GC_Q_ANGLE);
        }
        json_object_set_new(poly, fit_names[k], j);
    }
    json_object_set_new(doc, "polytropic", poly);

    json_t *sm = json_object();
    gc_out_q(o, sm, "imep_net", res->imep_net, GC_Q_PRESSURE);
    gc_out_q(o, sm, "imep_gross", res->imep_gross, GC_Q_PRESSURE);
    gc_out_q(o, sm, "work_net", res->work_net, GC_Q_ENERGY);
    if (res->has_power)
        gc_out_q(o, sm, "power_net", res->power_net, GC_Q_POWER);
    gc_out_q(o, sm, "peak_pressure", res->P_max, GC_Q_PRESSURE);
    gc_out_num(o, sm, "compression_n", res->compression.n);
    gc_out_num(o, sm, "expansion_n", res->expansion.n);
    if (res->has_fuel)
        gc_out_num(o, sm, "indicated_efficiency", res->efficiency_gross);
    if (res->has_ideal) {
        gc_out_num(o, sm, "ideal_efficiency", res->ideal_efficiency);
        gc_out_num(o, sm, "fraction_of_ideal", res->fraction_of_ideal);
    }
    json_object_set_new(doc, "summary", sm);

    if (res->has_ideal) {
        json_t *b = json_object();
        json_t *id = json_object();
        json_object_set_new(id, "cycle", json_string("otto"));
        json_object_set_new(id, "heat_source", json_string(
            res->heat_from_fuel ? "fuel" : "peak_mean_temperature"));
        gc_out_q(o, id, "intake_temperature", res->intake_temperature,
                 GC_Q_AMBIENT_TEMPERATURE);
        gc_out_q(o, id, "intake_pressure", res->intake_pressure, GC_Q_PRESSURE);
        gc_out_q(o, id, "trapped_mass", res->trapped_mass, GC_Q_MASS);
        gc_out_q(o, id, "peak_mean_temperature", res->T_mean_max, GC_Q_TEMPERATURE);
        gc_out_q(o, id, "heat_added", res->ideal_heat_added, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, id, "thermal_efficiency", res->ideal_efficiency);
        gc_out_q(o, id, "work", res->ideal_work, GC_Q_ENERGY);
        gc_out_q(o, id, "mean_effective_pressure", res->ideal_mep, GC_Q_PRESSURE);
        gc_out_q(o, id, "peak_pressure", res->ideal_peak_pressure, GC_Q_PRESSURE);
        gc_out_q(o, id, "peak_temperature", res->ideal_peak_temperature, GC_Q_TEMPERATURE);
        json_object_set_new(b, "ideal", id);
        json_object_set_new(doc, "bounds", b);
        json_t *sf = json_object();
        if (res->has_fuel) {
            gc_out_num(o, sf, "indicated_efficiency", res->efficiency_gross);
            gc_out_num(o, sf, "efficiency_gap", res->ideal_efficiency - res->efficiency_gross);
        }
        gc_out_num(o, sf, "ideal_efficiency", res->ideal_efficiency);
        gc_out_num(o, sf, "fraction_of_ideal", res->fraction_of_ideal);
        json_object_set_new(sf, "basis", json_string(
            res->has_fuel ? "gross indicated efficiency over the ideal efficiency"
                          : "gross indicated work over the ideal cycle's work"));
        json_object_set_new(doc, "shortfall", sf);
    }
    put_warnings(o, res->warnings, res->n_warnings);
    if (!r.has_intake_temperature)
        gc_out_warn(o, "assumed_intake_temperature", "/intake_temperature",
                    "no intake_temperature given: 288.15 K assumed for the trapped mass and "
                    "the ideal cycle");
    if (r.c.has_gas && r.c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    gc_api_validity_warn(o, &res->validity, NULL);
    free(res);
    o->csv_row = "summary";
    return gc_out_respond(o, doc, GC_OUT_EVALUATION, resp);
}
