/*
 * cycles_brayton.c — GET|POST /v1/cycles/brayton: the Brayton family of
 * gascycle/brayton.h (stages, intercooling, reheat, regenerator, pressure
 * losses; air-standard heat or a burnt fuel; site conditions; plant figures
 * for a rated net power; searched optimum pressure ratios).
 *
 * Inputs (defaults = the ideal simple cycle, air-standard, ISO site):
 * pressure_ratio (10), turbine_inlet_temperature (1400 K),
 * compressor_efficiency, turbine_efficiency (1), efficiency_basis
 * (isentropic | polytropic), compressor_stage_efficiency and
 * turbine_stage_efficiency (arrays, per stage), compressor_stages,
 * turbine_stages (1), intercooling_temperature (site temperature),
 * reheat_temperature (the turbine inlet temperature), the pressure losses
 * (fractions, 0), regenerator_effectiveness (0 = none), combustor,
 * mechanical and generator efficiencies (1), gas (default: the site's humid
 * air), fuel (absent: air-standard heat), fuel_temperature (298.15 K), site,
 * net_power (absent: no plant figures), optimum_search (true).
 *
 * Thermal efficiency and heat rate with a fuel are on the fuel's LHV (the
 * trade's convention for gas turbines), HHV figures beside them; heat in and
 * out share the 298.15 K reference, so heat_in - heat_out = net_work; the
 * second-law figures are on the fuel's exergy (gascycle/exergy.h).
 */
#include "api/cycle_out.h"
#include "api/handlers.h"
#include "api/validity_out.h"
#include "gascycle/brayton.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct brayton_req {
    gc_cycle_common c;                  /* first: shared gas/fuel/site specs */
    double pressure_ratio;              /* - */
    double turbine_inlet_temperature;   /* K */
    double compressor_efficiency;       /* - */
    double turbine_efficiency;          /* - */
    int efficiency_basis;               /* 0 isentropic, 1 polytropic */
    int n_c_stage_eff, n_t_stage_eff;   /* per-stage efficiencies given */
    double c_stage_eff[GC_BRAYTON_MAX_STAGES]; /* - */
    double t_stage_eff[GC_BRAYTON_MAX_STAGES]; /* - */
    int compressor_stages;
    int turbine_stages;
    double intercooling_temperature;    /* K, 0 = site temperature */
    double intercooler_pressure_loss;   /* - */
    double reheat_temperature;          /* K, 0 = turbine inlet temperature */
    double reheat_pressure_loss;        /* - */
    double regenerator_effectiveness;   /* - */
    double regenerator_air_pressure_loss, regenerator_gas_pressure_loss; /* - */
    double inlet_pressure_loss, exhaust_pressure_loss, combustor_pressure_loss; /* - */
    double combustor_efficiency, mechanical_efficiency, generator_efficiency;   /* - */
    double fuel_temperature;            /* K */
    double net_power;                   /* W, 0 = not given */
    int optimum_search;                 /* bool */
} brayton_req;

/* [0.87, 0.88]: per-stage efficiencies into c_stage_eff / t_stage_eff. */
static int decode_stage_eff(gc_decoder *d, const gc_field_spec *f, json_t *value,
                            const char *pointer, void *target, json_t *echo_parent)
{
    brayton_req *r = target;
    int comp = strcmp(f->name, "compressor_stage_efficiency") == 0;
    double *dst = comp ? r->c_stage_eff : r->t_stage_eff;
    int *n = comp ? &r->n_c_stage_eff : &r->n_t_stage_eff;
    *n = 0;
    if (!value)
        return 0;
    json_t *owned; /* GET: a comma list "0.87,0.88" */
    json_t *arr = gc_decode_list(d, value, &owned);
    if (!json_is_array(arr) || json_array_size(arr) == 0 ||
        json_array_size(arr) > GC_BRAYTON_MAX_STAGES) {
        gc_decode_error(d, pointer, "must be an array of 1 to %d efficiencies, one per stage "
                        "(GET: a comma list)", GC_BRAYTON_MAX_STAGES);
        json_decref(owned);
        return -1;
    }
    json_t *echo = echo_parent ? json_array() : NULL;
    size_t i;
    json_t *v;
    int bad = 0;
    json_array_foreach(arr, i, v) {
        char ptr[GC_API_FIELD_LEN];
        snprintf(ptr, sizeof ptr, "%s/%zu", pointer, i);
        double x = 0.0;
        if (gc_decode_number(d, v, ptr, GC_Q_FRACTION, &x) != 0) {
            bad = 1;
            continue;
        }
        if (!(x > 0.0 && x <= 1.0)) {
            gc_decode_error(d, ptr, "must be greater than 0 and at most 1");
            bad = 1;
            continue;
        }
        dst[i] = x;
        if (echo)
            json_array_append_new(echo, json_real(x));
    }
    *n = (int)json_array_size(arr);
    json_decref(owned);
    if (bad) {
        json_decref(echo);
        return -1;
    }
    if (echo)
        json_object_set_new(echo_parent, f->name, echo);
    return 0;
}

static const char *const basis_names[] = { "isentropic", "polytropic", NULL };

#define EFF(nm, member, desc)                                                             \
    GC_F_NUM(nm, GC_Q_FRACTION, brayton_req, member, .def = 1.0,                          \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0,        \
             .description = desc)
#define LOSS(nm, member, desc)                                                            \
    GC_F_NUM(nm, GC_Q_FRACTION, brayton_req, member, .def = 0.0,                          \
             .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 0.5, .description = desc)

static const gc_field_spec brayton_fields[] = {
    GC_F_NUM("pressure_ratio", GC_Q_RATIO, brayton_req, pressure_ratio, .def = 10.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0, .max = GC_BRAYTON_RP_MAX,
             .description = "compressor delivery over inlet pressure"),
    GC_F_NUM("turbine_inlet_temperature", GC_Q_TEMPERATURE, brayton_req,
             turbine_inlet_temperature, .def = 1400.0, .flags = GC_F_MIN | GC_F_MAX,
             .min = 300.0, .max = 2500.0, .description = "combustor exit temperature"),
    EFF("compressor_efficiency", compressor_efficiency, "each compressor stage"),
    EFF("turbine_efficiency", turbine_efficiency, "each turbine stage"),
    GC_F_ENUM("efficiency_basis", basis_names, brayton_req, efficiency_basis, .def = 0,
              .description = "isentropic or polytropic (small-stage) efficiencies"),
    GC_F_CUSTOM("compressor_stage_efficiency", decode_stage_eff, brayton_req, n_c_stage_eff,
                .description = "per compressor stage"),
    GC_F_CUSTOM("turbine_stage_efficiency", decode_stage_eff, brayton_req, n_t_stage_eff,
                .description = "per turbine stage"),
    GC_F_INT("compressor_stages", brayton_req, compressor_stages, .def = 1,
             .flags = GC_F_MIN | GC_F_MAX, .min = 1, .max = GC_BRAYTON_MAX_STAGES,
             .description = "compressor stages with intercooling between them"),
    GC_F_NUM("intercooling_temperature", GC_Q_TEMPERATURE, brayton_req,
             intercooling_temperature, .def = 0.0, .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX,
             .min = 0.0, .max = 2500.0, .description = "air temperature after each intercooler"),
    LOSS("intercooler_pressure_loss", intercooler_pressure_loss, "each intercooler dP/P"),
    GC_F_INT("turbine_stages", brayton_req, turbine_stages, .def = 1,
             .flags = GC_F_MIN | GC_F_MAX, .min = 1, .max = GC_BRAYTON_MAX_STAGES,
             .description = "turbine stages with reheat between them"),
    GC_F_NUM("reheat_temperature", GC_Q_TEMPERATURE, brayton_req, reheat_temperature,
             .def = 0.0, .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 2500.0,
             .description = "gas temperature after each reheat"),
    LOSS("reheat_pressure_loss", reheat_pressure_loss, "each reheat combustor dP/P"),
    GC_F_NUM("regenerator_effectiveness", GC_Q_FRACTION, brayton_req, regenerator_effectiveness,
             .def = 0.0, .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 1.0,
             .description = "0: no regenerator"),
    LOSS("regenerator_air_pressure_loss", regenerator_air_pressure_loss, "air side dP/P"),
    LOSS("regenerator_gas_pressure_loss", regenerator_gas_pressure_loss, "gas side dP/P"),
    LOSS("inlet_pressure_loss", inlet_pressure_loss, "intake filter and duct dP/P"),
    LOSS("exhaust_pressure_loss", exhaust_pressure_loss, "stack and ducts dP/P"),
    LOSS("combustor_pressure_loss", combustor_pressure_loss, "main combustor dP/P"),
    EFF("combustor_efficiency", combustor_efficiency, "fraction of far x LHV released"),
    EFF("mechanical_efficiency", mechanical_efficiency, "shaft work over gas-path work"),
    EFF("generator_efficiency", generator_efficiency, "electric over shaft work"),
    GC_CYCLE_F_GAS("working fluid (air-standard) or oxidiser; default the site's humid air"),
    GC_CYCLE_F_FUEL("fuel burnt in the combustor; absent: air-standard heat addition"),
    GC_F_NUM("fuel_temperature", GC_Q_TEMPERATURE, brayton_req, fuel_temperature,
             .def = 298.15, .flags = GC_F_MIN | GC_F_MAX, .min = 200.0, .max = 1000.0,
             .description = "fuel supply temperature"),
    GC_CYCLE_F_SITE("ambient conditions (default ISO 15 degC, 101.325 kPa, 60 %)"),
    GC_F_NUM("net_power", GC_Q_POWER, brayton_req, net_power, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 2.0e9,
             .description = "rated net electric power (plant figures)"),
    GC_F_BOOL("optimum_search", brayton_req, optimum_search, .def = 1,
              .description = "search the optimum pressure ratios"),
    GC_F_END
};

static const char *warning_code(const char *field, const char *message)
{
    if (strncmp(field, "/site", 5) == 0)
        return "site";
    if (strcmp(field, "/turbine_inlet_temperature") == 0 || strcmp(field, "/reheat_temperature") == 0)
        return "cooled_blades";
    if (strcmp(field, "/regenerator_effectiveness") == 0)
        return "regenerator_small_difference";
    if (strcmp(field, "/intercooling_temperature") == 0)
        return "refrigerated_intercooler";
    if (strcmp(field, "/pressure_ratio") == 0)
        return "no_net_work";
    if (strstr(message, "ideal counterpart"))
        return "ideal_equals_actual";
    return "model";
}

static void encode_optimum(gc_out *o, json_t *parent, const char *key, const gc_brayton_optimum *op)
{
    json_t *j = json_object();
    json_object_set_new(j, "found", json_boolean(op->found));
    if (op->found) {
        gc_out_num(o, j, "pressure_ratio", op->pressure_ratio);
        gc_out_num(o, j, "thermal_efficiency", op->thermal_efficiency);
        gc_out_q(o, j, "specific_work", op->specific_work, GC_Q_SPECIFIC_ENERGY);
    }
    json_object_set_new(j, "at_lower_bound", json_boolean(op->at_lower_bound));
    json_object_set_new(j, "at_upper_bound", json_boolean(op->at_upper_bound));
    json_object_set_new(j, "at_feasibility_limit", json_boolean(op->at_feasibility_limit));
    json_object_set_new(j, "evaluations", json_integer(op->evaluations));
    json_object_set_new(parent, key, j);
}

int gc_api_h_cycle_brayton(const gc_api_request *req, gc_api_response *resp)
{
    brayton_req r;
    memset(&r, 0, sizeof r);
    gc_cycle_call call;
    if (gc_cycle_call_begin(&call, req, "brayton", brayton_fields, &r, resp) != 0)
        return 0;
    gc_out *o = &call.out;

    gc_brayton_input in;
    gc_brayton_input_init(&in);
    gc_error err;
    gc_error_clear(&err);
    in.pressure_ratio = r.pressure_ratio;
    in.turbine_inlet_temperature = r.turbine_inlet_temperature;
    in.compressor_efficiency = r.compressor_efficiency;
    in.turbine_efficiency = r.turbine_efficiency;
    in.polytropic_efficiency = r.efficiency_basis == 1;
    in.compressor_stages = r.compressor_stages;
    in.turbine_stages = r.turbine_stages;
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (r.n_c_stage_eff > r.compressor_stages)
        gc_api_errors_add(&errs, "/compressor_stage_efficiency",
                          "gives %d efficiencies for %d compressor stage%s", r.n_c_stage_eff,
                          r.compressor_stages, r.compressor_stages == 1 ? "" : "s");
    if (r.n_t_stage_eff > r.turbine_stages)
        gc_api_errors_add(&errs, "/turbine_stage_efficiency",
                          "gives %d efficiencies for %d turbine stage%s", r.n_t_stage_eff,
                          r.turbine_stages, r.turbine_stages == 1 ? "" : "s");
    if (errs.n)
        return gc_cycle_call_fail_errors(&call, &errs, resp);
    for (int i = 0; i < r.n_c_stage_eff; i++)
        in.compressor_stage_efficiency[i] = r.c_stage_eff[i];
    for (int i = 0; i < r.n_t_stage_eff; i++)
        in.turbine_stage_efficiency[i] = r.t_stage_eff[i];
    in.intercooling_temperature = r.intercooling_temperature;
    in.intercooler_pressure_loss = r.intercooler_pressure_loss;
    in.reheat_temperature = r.reheat_temperature;
    in.reheat_pressure_loss = r.reheat_pressure_loss;
    in.regenerator_effectiveness = r.regenerator_effectiveness;
    in.regenerator_air_pressure_loss = r.regenerator_air_pressure_loss;
    in.regenerator_gas_pressure_loss = r.regenerator_gas_pressure_loss;
    in.inlet_pressure_loss = r.inlet_pressure_loss;
    in.exhaust_pressure_loss = r.exhaust_pressure_loss;
    in.combustor_pressure_loss = r.combustor_pressure_loss;
    in.combustor_efficiency = r.combustor_efficiency;
    in.mechanical_efficiency = r.mechanical_efficiency;
    in.generator_efficiency = r.generator_efficiency;
    if (r.c.has_gas) {
        in.has_gas = 1;
        if (gc_cycle_common_gas(&r.c, &in.gas, &err) != GC_OK)
            return gc_cycle_call_fail(&call, &err, "/gas", resp);
    }
    if (r.c.has_fuel) {
        in.heat_mode = GC_BRAYTON_FUEL;
        in.has_fuel = 1;
        in.fuel = r.c.fuel;
    }
    in.fuel_temperature = r.fuel_temperature;
    gc_cycle_common_site(&r.c, &in.site);
    in.net_power = r.net_power;
    if (!r.optimum_search)
        in.flags |= GC_BRAYTON_NO_OPTIMUM;

    gc_brayton_result *res = malloc(sizeof *res);
    gc_cycle *chain = malloc(sizeof *chain);
    if (!res || !chain) {
        free(res);
        free(chain);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    int rc = gc_brayton_evaluate(&in, res, &err);
    if (rc != GC_OK) {
        free(res);
        free(chain);
        return gc_cycle_call_fail(&call, &err, "", resp);
    }
    if (gc_brayton_build(&in, &res->site, chain, NULL, NULL) != GC_OK)
        chain->n_steps = 0;

    /* echo: resolved defaults */
    if (!r.c.has_gas)
        gc_cycle_echo_site_air(o);
    if (in.compressor_stages > 1)
        gc_out_q(o, o->inputs, "intercooling_temperature",
                 r.intercooling_temperature > 0.0 ? r.intercooling_temperature : res->site.T_K,
                 GC_Q_TEMPERATURE);
    else
        json_object_del(o->inputs, "intercooling_temperature");
    if (in.turbine_stages > 1)
        gc_out_q(o, o->inputs, "reheat_temperature",
                 r.reheat_temperature > 0.0 ? r.reheat_temperature : r.turbine_inlet_temperature,
                 GC_Q_TEMPERATURE);
    else
        json_object_del(o->inputs, "reheat_temperature");
    if (!(r.net_power > 0.0))
        json_object_del(o->inputs, "net_power");
    gc_cycle_echo_heat(o, &r.c, &res->site);

    const gc_cycle_run *run = &res->cycle.actual;
    const char *names[GC_CYCLE_MAX_STATES] = { 0 };
    const gc_brayton_stations *st = &res->stations;
    names[0] = "ambient";
    struct { int i; const char *n; } sn[] = {
        { st->compressor_inlet, "compressor inlet" }, { st->compressor_exit, "compressor exit" },
        { st->combustor_inlet, "combustor inlet" }, { st->turbine_inlet, "turbine inlet" },
        { st->turbine_exit, "turbine exit" }, { st->exhaust, "exhaust" } };
    for (size_t k = 0; k < sizeof sn / sizeof sn[0]; k++)
        if (sn[k].i > 0 && sn[k].i < run->n_states && !names[sn[k].i])
            names[sn[k].i] = sn[k].n;

    json_t *doc = json_object();
    json_object_set_new(doc, "cycle", json_string("brayton"));
    char title[96];
    snprintf(title, sizeof title, "Brayton cycle%s%s%s%s",
             in.regenerator_effectiveness > 0.0 ? ", regenerative" : "",
             in.compressor_stages > 1 ? ", intercooled" : "",
             in.turbine_stages > 1 ? ", reheat" : "",
             r.c.has_fuel ? ", fuel-fired" : ", air-standard");
    json_object_set_new(doc, "title", json_string(title));
    gc_cycle_out_opts opts;
    gc_cycle_out_opts_init(&opts);
    opts.chain = chain->n_steps ? chain : NULL;
    opts.state_names = names;
    opts.n_state_names = run->n_states;
    /* no figure replaced: the engine's heat in is far x LHV with a fuel (on
     * the 298.15 K reference, cycle.h), so JSON, CSV and the SVG caption
     * quote one heat input and one efficiency */
    opts.basis = "per kg of intake air";
    json_t *sm = gc_cycle_out_encode(&call, doc, &res->cycle, &opts);
    if (!sm) {
        json_decref(doc);
        free(res);
        free(chain);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    gc_out_q(o, sm, "specific_work", res->specific_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "specific_shaft_work", res->specific_shaft_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "specific_electric_work", res->specific_electric_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "compressor_work", res->compressor_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "turbine_work", res->turbine_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, sm, "back_work_ratio", res->back_work_ratio);
    if (res->has_fuel)
        gc_out_num(o, sm, "thermal_efficiency_hhv", res->thermal_efficiency_hhv);
    gc_out_num(o, sm, "electric_efficiency", res->electric_efficiency);
    if (in.regenerator_effectiveness > 0.0)
        gc_out_q(o, sm, "regenerator_heat", res->regenerator_heat, GC_Q_SPECIFIC_ENERGY);
    if (in.compressor_stages > 1)
        gc_out_q(o, sm, "intercooler_heat", res->intercooler_heat, GC_Q_SPECIFIC_ENERGY);
    if (res->has_fuel) {
        gc_out_num(o, sm, "fuel_air_ratio", res->fuel_air_ratio);
        gc_out_num(o, sm, "fuel_air_ratio_main", res->fuel_air_ratio_main);
        gc_out_num(o, sm, "equivalence_ratio", res->equivalence_ratio);
    }
    gc_out_q(o, sm, "T_compressor_exit", res->T_compressor_exit, GC_Q_TEMPERATURE);
    gc_out_q(o, sm, "P_compressor_exit", res->P_compressor_exit, GC_Q_PRESSURE);
    gc_out_q(o, sm, "T_turbine_exit", res->T_turbine_exit, GC_Q_TEMPERATURE);
    gc_out_q(o, sm, "T_exhaust", res->T_exhaust, GC_Q_TEMPERATURE);
    if (res->has_power) {
        gc_out_q(o, sm, "heat_rate", res->heat_rate, GC_Q_HEAT_RATE);
        gc_out_q(o, sm, "heat_rate_hhv", res->heat_rate_hhv, GC_Q_HEAT_RATE);
        json_t *p = json_object();
        gc_out_q(o, p, "net_power", res->net_power, GC_Q_POWER);
        gc_out_q(o, p, "shaft_power", res->shaft_power, GC_Q_POWER);
        gc_out_q(o, p, "air_mass_flow", res->air_mass_flow, GC_Q_MASS_FLOW);
        if (res->has_fuel)
            gc_out_q(o, p, "fuel_mass_flow", res->fuel_mass_flow, GC_Q_MASS_FLOW);
        gc_out_q(o, p, "exhaust_mass_flow", res->exhaust_mass_flow, GC_Q_MASS_FLOW);
        gc_out_q(o, p, "heat_input_power", res->heat_input_power, GC_Q_POWER);
        gc_out_q(o, p, "heat_input_power_hhv", res->heat_input_power_hhv, GC_Q_POWER);
        gc_out_q(o, p, "heat_rate", res->heat_rate, GC_Q_HEAT_RATE);
        gc_out_q(o, p, "heat_rate_hhv", res->heat_rate_hhv, GC_Q_HEAT_RATE);
        gc_out_num(o, p, "heat_rate_kJ_per_kWh", res->heat_rate_kJ_per_kWh);
        gc_out_num(o, p, "heat_rate_hhv_kJ_per_kWh", res->heat_rate_hhv_kJ_per_kWh);
        gc_out_num(o, p, "heat_rate_Btu_per_kWh", res->heat_rate_Btu_per_kWh);
        gc_out_num(o, p, "heat_rate_hhv_Btu_per_kWh", res->heat_rate_hhv_Btu_per_kWh);
        json_object_set_new(o->units, "heat_rate_kJ_per_kWh", json_string("kJ/kWh"));
        json_object_set_new(o->units, "heat_rate_hhv_kJ_per_kWh", json_string("kJ/kWh"));
        json_object_set_new(o->units, "heat_rate_Btu_per_kWh", json_string("Btu/kWh"));
        json_object_set_new(o->units, "heat_rate_hhv_Btu_per_kWh", json_string("Btu/kWh"));
        if (res->has_fuel) {
            gc_out_q(o, p, "co2_mass_flow", res->co2_mass_flow, GC_Q_MASS_FLOW);
            gc_out_num(o, p, "co2_kg_per_MWh", res->co2_kg_per_MWh);
            json_object_set_new(o->units, "co2_kg_per_MWh", json_string("kg/MWh"));
        }
        gc_out_q(o, p, "exhaust_temperature", res->exhaust_temperature, GC_Q_TEMPERATURE);
        gc_out_q(o, p, "exhaust_heat_power", res->exhaust_heat_power, GC_Q_POWER);
        json_object_set_new(doc, "plant", p);
    }
    if (res->has_optimum) {
        json_t *op = json_object();
        encode_optimum(o, op, "max_efficiency", &res->max_efficiency);
        encode_optimum(o, op, "max_specific_work", &res->max_specific_work);
        gc_out_num(o, op, "search_lower_bound", res->max_efficiency.lower_bound);
        gc_out_num(o, op, "search_upper_bound", res->max_efficiency.upper_bound);
        json_object_set_new(doc, "optimum", op);
    }
    if (r.c.has_fuel) {
        json_t *fu = gc_cycle_out_fuel(o, &in.fuel);
        gc_cycle_out_fuel_exergy(o, fu, &in.fuel);
        json_object_set_new(json_object_get(doc, "model"), "fuel", fu);
    }
    for (int i = 0; i < res->n_warnings; i++)
        gc_out_warn(o, warning_code(res->warnings[i].field, res->warnings[i].message),
                    res->warnings[i].field[0] ? res->warnings[i].field : NULL, "%s",
                    res->warnings[i].message);
    if (r.c.has_gas && r.c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    gc_api_validity_warn_cycle(o, &res->cycle);
    int out_rc = gc_cycle_call_finish(&call, doc, &res->cycle, resp);
    free(res);
    free(chain);
    return out_rc;
}
