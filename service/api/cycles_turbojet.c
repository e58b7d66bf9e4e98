/*
 * cycles_turbojet.c — GET|POST /v1/cycles/turbojet: the single-spool
 * turbojet of gascycle/turbojet.h (flight Mach number and altitude by the
 * U.S. Standard Atmosphere 1976, diffuser and inlet recovery, compressor,
 * combustor with a fuel or air-standard heat, turbine driving the
 * compressor, optional afterburner, convergent or fully expanded nozzle).
 *
 * Inputs (defaults = the ideal engine, static at sea level, expanded
 * nozzle, air-standard, dry air): flight_mach_number (0), altitude,
 * site (temperature/pressure/relative_humidity overrides), pressure_ratio
 * (10), turbine_inlet_temperature (1400 K), inlet_pressure_recovery,
 * diffuser_efficiency, compressor_efficiency, turbine_efficiency,
 * nozzle_efficiency, combustor_efficiency, mechanical_efficiency (1),
 * efficiency_basis, combustor_pressure_loss, afterburner_temperature
 * (absent: none), afterburner_pressure_loss, nozzle (expanded |
 * convergent), gas, fuel, fuel_temperature.
 *
 * Units of the propulsion figures (no units.h quantity; factors exact by
 * definition of lbm and lbf, NIST SP 811 B.8): specific thrust N s/kg
 * (us: lbf s/lbm, 1 lbf s/lbm = 9.80665 N s/kg), TSFC mg/(N s) (us:
 * lbm/(lbf h)), exit area per air flow m2 s/kg (us: ft2 s/lbm).
 */
#include "api/cycle_out.h"
#include "api/handlers.h"
#include "api/validity_out.h"
#include "gascycle/turbojet.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define LBF_N 4.4482216152605     /* N per lbf (exact) */
#define LBM_KG 0.45359237         /* kg per lbm (exact) */
#define FT2_M2 0.09290304         /* m2 per ft2 (exact) */

typedef struct tj_req {
    gc_cycle_common c;          /* first */
    double mach;                /* - */
    double altitude;            /* m */
    int has_altitude;
    double inlet_pressure_recovery, diffuser_efficiency; /* - */
    double pressure_ratio;      /* - */
    double turbine_inlet_temperature; /* K */
    double compressor_efficiency, turbine_efficiency, nozzle_efficiency; /* - */
    int efficiency_basis;
    double combustor_pressure_loss, combustor_efficiency, mechanical_efficiency; /* - */
    double afterburner_temperature; /* K, 0 none */
    double afterburner_pressure_loss; /* - */
    int nozzle;                 /* 0 expanded, 1 convergent */
    double fuel_temperature;    /* K */
} tj_req;

static const char *const basis_names[] = { "isentropic", "polytropic", NULL };
static const char *const nozzle_names[] = { "expanded", "convergent", NULL };

#define EFF(nm, member, desc)                                                             \
    GC_F_NUM(nm, GC_Q_FRACTION, tj_req, member, .def = 1.0,                               \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0,        \
             .description = desc)
#define LOSS(nm, member, desc)                                                            \
    GC_F_NUM(nm, GC_Q_FRACTION, tj_req, member, .def = 0.0,                               \
             .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 0.5, .description = desc)

static const gc_field_spec tj_fields[] = {
    GC_F_NUM("flight_mach_number", GC_Q_RATIO, tj_req, mach, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = GC_TURBOJET_MACH_MAX,
             .description = "flight Mach number"),
    GC_F_NUM("altitude", GC_Q_LENGTH, tj_req, altitude, .def = 0.0,
             .present = GC_PRESENT(tj_req, has_altitude),
             .flags = GC_F_MIN | GC_F_MAX, .min = -5000.0, .max = 86000.0,
             .description = "geometric flight altitude"),
    GC_CYCLE_F_SITE("ambient overrides (temperature, pressure, relative_humidity)"),
    EFF("inlet_pressure_recovery", inlet_pressure_recovery, "total-pressure recovery"),
    EFF("diffuser_efficiency", diffuser_efficiency, "diffuser isentropic efficiency"),
    GC_F_NUM("pressure_ratio", GC_Q_RATIO, tj_req, pressure_ratio, .def = 10.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0, .max = GC_TURBOJET_RP_MAX,
             .description = "compressor pressure ratio"),
    GC_F_NUM("turbine_inlet_temperature", GC_Q_TEMPERATURE, tj_req, turbine_inlet_temperature,
             .def = 1400.0, .flags = GC_F_MIN | GC_F_MAX, .min = 300.0, .max = 2500.0,
             .description = "combustor exit temperature"),
    EFF("compressor_efficiency", compressor_efficiency, "compressor"),
    EFF("turbine_efficiency", turbine_efficiency, "turbine"),
    GC_F_ENUM("efficiency_basis", basis_names, tj_req, efficiency_basis, .def = 0,
              .description = "isentropic or polytropic"),
    EFF("nozzle_efficiency", nozzle_efficiency, "nozzle isentropic efficiency"),
    LOSS("combustor_pressure_loss", combustor_pressure_loss, "combustor dP/P"),
    EFF("combustor_efficiency", combustor_efficiency, "combustor and afterburner"),
    EFF("mechanical_efficiency", mechanical_efficiency, "compressor over turbine work"),
    GC_F_NUM("afterburner_temperature", GC_Q_TEMPERATURE, tj_req, afterburner_temperature,
             .def = 0.0, .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 2800.0,
             .description = "afterburner exit temperature (absent: none)"),
    LOSS("afterburner_pressure_loss", afterburner_pressure_loss, "afterburner dP/P"),
    GC_F_ENUM("nozzle", nozzle_names, tj_req, nozzle, .def = 0,
              .description = "expanded or convergent"),
    GC_CYCLE_F_GAS("working fluid (air-standard) or oxidiser; default dry air"),
    GC_CYCLE_F_FUEL("fuel; absent: air-standard heat addition"),
    GC_F_NUM("fuel_temperature", GC_Q_TEMPERATURE, tj_req, fuel_temperature, .def = 298.15,
             .flags = GC_F_MIN | GC_F_MAX, .min = 200.0, .max = 1000.0,
             .description = "fuel supply temperature"),
    GC_F_END
};

static void put_unit(gc_out *o, const char *key, const char *si, const char *us)
{
    if (!json_object_get(o->units, key))
        json_object_set_new(o->units, key, json_string(o->sys == GC_UNITS_US ? us : si));
}

static void specific_thrust(gc_out *o, json_t *obj, const char *key, double N_s_per_kg)
{
    put_unit(o, key, "N s/kg", "lbf s/lbm");
    gc_out_num(o, obj, key, o->sys == GC_UNITS_US ? N_s_per_kg * LBM_KG / LBF_N : N_s_per_kg);
}

static void tsfc(gc_out *o, json_t *obj, const char *key, double kg_per_Ns)
{
    put_unit(o, key, "mg/(N s)", "lbm/(lbf h)");
    gc_out_num(o, obj, key, o->sys == GC_UNITS_US ? kg_per_Ns * LBF_N * 3600.0 / LBM_KG
                                                  : kg_per_Ns * 1e6);
}

int gc_api_h_cycle_turbojet(const gc_api_request *req, gc_api_response *resp)
{
    tj_req r;
    memset(&r, 0, sizeof r);
    gc_cycle_call call;
    if (gc_cycle_call_begin(&call, req, "turbojet", tj_fields, &r, resp) != 0)
        return 0;
    gc_out *o = &call.out;
    gc_turbojet_input in;
    gc_turbojet_input_init(&in);
    gc_error err;
    gc_error_clear(&err);
    in.flight_mach_number = r.mach;
    in.has_altitude = r.has_altitude;
    in.altitude = r.altitude;
    gc_cycle_common_site(&r.c, &in.site);
    in.inlet_pressure_recovery = r.inlet_pressure_recovery;
    in.diffuser_efficiency = r.diffuser_efficiency;
    in.pressure_ratio = r.pressure_ratio;
    in.turbine_inlet_temperature = r.turbine_inlet_temperature;
    in.compressor_efficiency = r.compressor_efficiency;
    in.turbine_efficiency = r.turbine_efficiency;
    in.polytropic_efficiency = r.efficiency_basis == 1;
    in.nozzle_efficiency = r.nozzle_efficiency;
    in.combustor_pressure_loss = r.combustor_pressure_loss;
    in.combustor_efficiency = r.combustor_efficiency;
    in.mechanical_efficiency = r.mechanical_efficiency;
    in.afterburner_temperature = r.afterburner_temperature;
    in.afterburner_pressure_loss = r.afterburner_pressure_loss;
    in.nozzle = r.nozzle == 1 ? GC_NOZZLE_CONVERGENT : GC_NOZZLE_EXPANDED;
    if (r.c.has_gas) {
        in.has_gas = 1;
        if (gc_cycle_common_gas(&r.c, &in.gas, &err) != GC_OK)
            return gc_cycle_call_fail(&call, &err, "/gas", resp);
    }
    if (r.c.has_fuel) {
        in.heat_mode = GC_TURBOJET_FUEL;
        in.has_fuel = 1;
        in.fuel = r.c.fuel;
    }
    in.fuel_temperature = r.fuel_temperature;

    gc_turbojet_result *res = malloc(sizeof *res);
    gc_cycle *names = calloc(1, sizeof *names);
    if (!res || !names) {
        free(res);
        free(names);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    int rc = gc_turbojet_evaluate(&in, res, &err);
    if (rc != GC_OK) {
        free(res);
        free(names);
        return gc_cycle_call_fail(&call, &err, "", resp);
    }
    const gc_cycle_run *run = &res->cycle.actual;
    const gc_turbojet_stations *st = &res->stations;

    /* process names from the stations they end at (turbojet.h's chain order) */
    names->n_steps = GC_CYCLE_MAX_STEPS;
    for (int i = 0; i < run->n_processes; i++) {
        const gc_cycle_process *p = &run->processes[i];
        const char *n = gc_cycle_kind_name(p->kind);
        if (p->to == st->diffuser_exit && p->from == st->free_stream)
            n = "diffuser";
        else if (p->to == st->compressor_inlet && p->kind == GC_PROC_PRESSURE_LOSS)
            n = "inlet recovery";
        else if (p->to == st->compressor_exit)
            n = "compressor";
        else if (p->to == st->turbine_inlet)
            n = "combustor";
        else if (p->to == st->turbine_exit)
            n = "turbine";
        else if (st->afterburner_exit >= 0 && p->to == st->afterburner_exit)
            n = "afterburner";
        else if (p->to == st->nozzle_exit)
            n = "nozzle";
        else if (p->kind == GC_PROC_CLOSE)
            n = "back to free stream";
        else if (p->kind == GC_PROC_PRESSURE_LOSS)
            n = "plume";
        if (p->step >= 0 && p->step < GC_CYCLE_MAX_STEPS)
            snprintf(names->steps[p->step].label, sizeof names->steps[p->step].label, "%s", n);
    }
    const char *snames[GC_CYCLE_MAX_STATES] = { 0 };
    struct { int i; const char *n; } sn[] = {
        { st->free_stream, "free stream" }, { st->diffuser_exit, "diffuser exit" },
        { st->compressor_inlet, "compressor inlet" }, { st->compressor_exit, "compressor exit" },
        { st->turbine_inlet, "turbine inlet" }, { st->turbine_exit, "turbine exit" },
        { st->afterburner_exit, "afterburner exit" }, { st->nozzle_exit, "nozzle exit" } };
    for (size_t k = 0; k < sizeof sn / sizeof sn[0]; k++)
        if (sn[k].i >= 0 && sn[k].i < run->n_states && !snames[sn[k].i])
            snames[sn[k].i] = sn[k].n;

    if (!r.c.has_gas)
        gc_cycle_echo_site_air(o);
    if (!(r.afterburner_temperature > 0.0)) {
        json_object_del(o->inputs, "afterburner_temperature");
        json_object_del(o->inputs, "afterburner_pressure_loss");
    }
    gc_cycle_echo_heat(o, &r.c, &res->site);

    json_t *doc = json_object();
    json_object_set_new(doc, "cycle", json_string("turbojet"));
    json_object_set_new(doc, "title", json_string(r.afterburner_temperature > 0.0
                                                      ? "Turbojet with afterburner"
                                                      : "Turbojet"));
    gc_cycle_out_opts opts;
    gc_cycle_out_opts_init(&opts);
    opts.chain = names;
    opts.state_names = snames;
    opts.n_state_names = run->n_states;
    opts.heat_in = res->heat_in;
    opts.thermal_efficiency = res->thermal_efficiency;
    if (res->ideal_thermal_efficiency > 0.0)
        opts.ideal_thermal_efficiency = res->ideal_thermal_efficiency;
    opts.basis = "per kg of intake air";
    json_t *sm = gc_cycle_out_encode(&call, doc, &res->cycle, &opts);
    if (!sm) {
        json_decref(doc);
        free(res);
        free(names);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    specific_thrust(o, sm, "specific_thrust", res->specific_thrust);
    if (res->has_fuel) {
        tsfc(o, sm, "tsfc", res->tsfc);
        gc_out_num(o, sm, "fuel_air_ratio", res->fuel_air_ratio);
    }
    gc_out_num(o, sm, "propulsive_efficiency", res->propulsive_efficiency);
    gc_out_num(o, sm, "overall_efficiency", res->overall_efficiency);
    gc_out_q(o, sm, "flight_velocity", res->flight_velocity, GC_Q_VELOCITY);
    gc_out_q(o, sm, "exit_velocity", res->exit_velocity, GC_Q_VELOCITY);
    gc_out_q(o, sm, "effective_exit_velocity", res->effective_exit_velocity, GC_Q_VELOCITY);
    gc_out_num(o, sm, "exit_mach_number", res->exit_mach_number);
    gc_out_q(o, sm, "compressor_work", res->compressor_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, sm, "turbine_work", res->turbine_work, GC_Q_SPECIFIC_ENERGY);

    json_t *pr = json_object();
    specific_thrust(o, pr, "specific_thrust", res->specific_thrust);
    if (res->has_fuel) {
        tsfc(o, pr, "tsfc", res->tsfc);
        gc_out_num(o, pr, "fuel_air_ratio", res->fuel_air_ratio);
        gc_out_num(o, pr, "fuel_air_ratio_main", res->fuel_air_ratio_main);
    }
    gc_out_num(o, pr, "thermal_efficiency", res->thermal_efficiency);
    gc_out_num(o, pr, "propulsive_efficiency", res->propulsive_efficiency);
    gc_out_num(o, pr, "overall_efficiency", res->overall_efficiency);
    gc_out_q(o, pr, "flight_velocity", res->flight_velocity, GC_Q_VELOCITY);
    gc_out_q(o, pr, "speed_of_sound", res->speed_of_sound, GC_Q_VELOCITY);
    gc_out_q(o, pr, "exit_velocity", res->exit_velocity, GC_Q_VELOCITY);
    gc_out_q(o, pr, "effective_exit_velocity", res->effective_exit_velocity, GC_Q_VELOCITY);
    gc_out_num(o, pr, "exit_mach_number", res->exit_mach_number);
    gc_out_q(o, pr, "exit_pressure", res->exit_pressure, GC_Q_PRESSURE);
    gc_out_q(o, pr, "exit_temperature", res->exit_temperature, GC_Q_TEMPERATURE);
    if (in.nozzle == GC_NOZZLE_CONVERGENT)
        gc_out_q(o, pr, "critical_pressure", res->critical_pressure, GC_Q_PRESSURE);
    json_object_set_new(pr, "choked", json_boolean(res->choked));
    put_unit(o, "exit_area_per_air_flow", "m2 s/kg", "ft2 s/lbm");
    gc_out_num(o, pr, "exit_area_per_air_flow",
               o->sys == GC_UNITS_US ? res->exit_area_per_air_flow * LBM_KG / FT2_M2
                                     : res->exit_area_per_air_flow);
    specific_thrust(o, pr, "pressure_thrust", res->pressure_thrust);
    if (res->ideal_specific_thrust > 0.0) {
        specific_thrust(o, pr, "ideal_specific_thrust", res->ideal_specific_thrust);
        gc_out_num(o, pr, "ideal_thermal_efficiency", res->ideal_thermal_efficiency);
        json_t *ideal = json_object_get(json_object_get(doc, "bounds"), "ideal");
        if (ideal)
            specific_thrust(o, ideal, "specific_thrust", res->ideal_specific_thrust);
    }
    json_object_set_new(doc, "propulsion", pr);
    if (r.c.has_fuel)
        json_object_set_new(json_object_get(doc, "model"), "fuel", gc_cycle_out_fuel(o, &in.fuel));
    for (int i = 0; i < res->n_warnings; i++)
        if (!strstr(res->warnings[i].message, "ideal counterpart"))
            gc_out_warn(o, "model", res->warnings[i].field[0] ? res->warnings[i].field : NULL, "%s",
                        res->warnings[i].message);
    gc_cycle_out_warn_ideal(o, &res->cycle);
    gc_api_validity_warn_cycle(o, &res->cycle);
    if (r.c.has_gas && r.c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    int out_rc = gc_cycle_call_finish(&call, doc, &res->cycle, resp);
    free(res);
    free(names);
    return out_rc;
}
