/*
 * cycles_custom.c — POST|GET /v1/cycles/custom: a user-posted chain of
 * processes in the cycle engine's vocabulary (gascycle/cycle.h), for
 * cycles no preset covers.
 *
 * Body:
 *   {"name": "my cycle", "frame": "closed" | "flow", "gas": "air" | "cold" | {...},
 *    "start": {"temperature": 288.15, "pressure": 101.325, "velocity": 0},
 *    "dead_state": {"temperature": ..., "pressure": ...},
 *    "steps": [ {"kind": "compression", "end": {"volume_ratio": 0.1}, "efficiency": 0.9},
 *               {"kind": "constant_volume", "end": {"temperature": "2400 K"}, "heat": "in"},
 *               {"kind": "expansion", "end": {"start_volume": true}},
 *               {"kind": "close", "geometry": "constant_volume"} ]}
 * Step kinds are the engine's process kinds (isentropic, polytropic,
 * compression, expansion, constant_volume, constant_pressure, isothermal,
 * dual, pressure_loss, heat_exchange, cooling, fuel_addition, close); "end"
 * holds exactly one end condition (volume_ratio, pressure_ratio, temperature,
 * pressure, heat, peak_pressure, velocity, or start_temperature /
 * start_volume / start_pressure: true); "dual" adds constant_volume_end
 * ({pressure_ratio} or {peak_pressure}); "heat_exchange" names its partner
 * step (0-based index) and, on the first side, the effectiveness. GET takes
 * the same fields with dotted keys: steps.0.kind=compression&
 * steps.0.end.volume_ratio=0.1 ...
 * The engine validates the chain; its errors name the step's JSON pointer.
 */
#include "api/cycle_out.h"
#include "api/handlers.h"
#include "api/validity_out.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define UNSET (-1.0e300)

typedef struct custom_step {
    gc_cycle_common c;         /* first: the fuel decoder writes c.fuel / c.has_fuel */
    int kind;                  /* gc_process_kind */
    char name[GC_DECODE_MAX_STRING];
    double end[GC_END_KIND_COUNT];     /* SI value per end kind, UNSET if not given */
    int end_start_T, end_start_v, end_start_P; /* booleans */
    int has_start_T, has_start_v, has_start_P;
    double cv_pressure_ratio, cv_peak_pressure; /* dual: constant-volume part end */
    double efficiency;         /* - */
    int efficiency_basis;      /* 0 isentropic, 1 polytropic */
    double n;                  /* polytropic exponent */
    double pressure_loss;      /* - */
    int heat;                  /* 0 either, 1 in, 2 out */
    double source_temperature; /* K, 0 = peak */
    int nozzle;                /* bool */
    int geometry;              /* 0 constant pressure, 1 constant volume */
    int partner;               /* index, -1 none */
    int has_partner;
    double effectiveness;      /* - */
    double fuel_air_ratio;     /* - */
    double fuel_temperature;   /* K, 0 = start temperature */
} custom_step;

typedef struct custom_req {
    gc_cycle_common c;         /* first */
    char name[GC_DECODE_MAX_STRING];
    int frame;                 /* gc_frame */
    double T_start, P_start, V_start; /* K, Pa, m/s */
    double T_dead, P_dead;     /* K, Pa; 0 = defaults */
    int n_steps;
    custom_step steps[GC_CYCLE_MAX_STEPS];
} custom_req;

static const char *const kinds[] = {
    "isentropic", "polytropic", "compression", "expansion", "constant_volume",
    "constant_pressure", "isothermal", "dual", "pressure_loss", "heat_exchange",
    "cooling", "fuel_addition", "close", NULL };
static const char *const frames[] = { "closed", "flow", NULL };
static const char *const bases[] = { "isentropic", "polytropic", NULL };
static const char *const heats[] = { "either", "in", "out", NULL };
static const char *const geoms[] = { "constant_pressure", "constant_volume", NULL };

#define END_NUM(nm, q, k, lo, desc)                                                        \
    { .name = nm, .type = GC_FIELD_NUMBER, .quantity = q,                                  \
      .offset = offsetof(custom_step, end) + (k) * sizeof(double), .def = UNSET,          \
      .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_NO_ECHO, .min = lo, .description = desc }

static const gc_field_spec end_fields[] = {
    END_NUM("volume_ratio", GC_Q_RATIO, GC_END_VOLUME_RATIO, 0.0, "v_end / v_start"),
    END_NUM("pressure_ratio", GC_Q_RATIO, GC_END_PRESSURE_RATIO, 0.0, "P_end / P_start"),
    END_NUM("temperature", GC_Q_TEMPERATURE, GC_END_TEMPERATURE, 0.0, "end temperature"),
    END_NUM("pressure", GC_Q_PRESSURE, GC_END_PRESSURE, 0.0, "end pressure"),
    { .name = "heat", .type = GC_FIELD_NUMBER, .quantity = GC_Q_SPECIFIC_ENERGY,
      .offset = offsetof(custom_step, end) + GC_END_HEAT * sizeof(double), .def = UNSET,
      .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = -1e8, .max = 1e8,
      .description = "heat of the step (> 0 in)" },
    END_NUM("peak_pressure", GC_Q_PRESSURE, GC_END_PEAK_PRESSURE, 0.0, "pressure limit"),
    { .name = "velocity", .type = GC_FIELD_NUMBER, .quantity = GC_Q_VELOCITY,
      .offset = offsetof(custom_step, end) + GC_END_VELOCITY * sizeof(double), .def = UNSET,
      .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 5000.0,
      .description = "end velocity (nozzles, diffusers)" },
    GC_F_BOOL("start_temperature", custom_step, end_start_T, .flags = GC_F_NO_ECHO,
              .present = GC_PRESENT(custom_step, has_start_T), .description = "back to T_start"),
    GC_F_BOOL("start_volume", custom_step, end_start_v, .flags = GC_F_NO_ECHO,
              .present = GC_PRESENT(custom_step, has_start_v), .description = "back to v_start"),
    GC_F_BOOL("start_pressure", custom_step, end_start_P, .flags = GC_F_NO_ECHO,
              .present = GC_PRESENT(custom_step, has_start_P), .description = "back to P_start"),
    GC_F_END
};

static const gc_field_spec cv_end_fields[] = {
    GC_F_NUM("pressure_ratio", GC_Q_RATIO, custom_step, cv_pressure_ratio, .def = UNSET,
             .flags = GC_F_MIN | GC_F_NO_ECHO, .min = 1.0, .description = "exact"),
    GC_F_NUM("peak_pressure", GC_Q_PRESSURE, custom_step, cv_peak_pressure, .def = UNSET,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_NO_ECHO, .min = 0.0,
             .description = "a limit"),
    GC_F_END
};

static const gc_field_spec step_fields[] = {
    GC_F_ENUM("kind", kinds, custom_step, kind, .flags = GC_F_REQUIRED, .description = "process kind"),
    GC_F_STR("name", custom_step, name, .flags = GC_F_NO_ECHO, .description = "label"),
    GC_F_OBJ("end", end_fields, .description = "end condition"),
    GC_F_OBJ("constant_volume_end", cv_end_fields, .description = "dual: end of the "
             "constant-volume part"),
    GC_F_NUM("efficiency", GC_Q_FRACTION, custom_step, efficiency, .def = 1.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 1.0,
             .description = "compression/expansion isentropic (or polytropic) efficiency; "
             "fuel_addition: combustion efficiency"),
    GC_F_ENUM("efficiency_basis", bases, custom_step, efficiency_basis, .flags = GC_F_NO_ECHO,
              .description = "isentropic or polytropic"),
    GC_F_NUM("n", GC_Q_RATIO, custom_step, n, .def = UNSET,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 100.0,
             .description = "polytropic exponent"),
    GC_F_NUM("pressure_loss", GC_Q_FRACTION, custom_step, pressure_loss, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_MAX_EXCL | GC_F_NO_ECHO, .min = 0.0, .max = 1.0,
             .description = "fractional pressure loss"),
    GC_F_ENUM("heat", heats, custom_step, heat, .flags = GC_F_NO_ECHO,
              .description = "direction of the heat: in, out or either"),
    GC_F_NUM("source_temperature", GC_Q_TEMPERATURE, custom_step, source_temperature,
             .def = 0.0, .flags = GC_F_MIN | GC_F_NO_ECHO, .min = 0.0,
             .description = "heat source temperature (0: the cycle's peak)"),
    GC_F_BOOL("nozzle", custom_step, nozzle, .flags = GC_F_NO_ECHO,
              .description = "flow: a nozzle or diffuser (no shaft work)"),
    GC_F_ENUM("geometry", geoms, custom_step, geometry, .flags = GC_F_NO_ECHO,
              .description = "close and heat_exchange: constant pressure or volume"),
    GC_F_INT("partner", custom_step, partner, .def = -1, .present = GC_PRESENT(custom_step, has_partner),
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0, .max = GC_CYCLE_MAX_STEPS - 1,
             .description = "heat_exchange: index of the other side"),
    GC_F_NUM("effectiveness", GC_Q_FRACTION, custom_step, effectiveness, .def = UNSET,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 1.0,
             .description = "heat_exchange effectiveness"),
    GC_CYCLE_F_FUEL("fuel_addition: the fuel"),
    GC_F_NUM("fuel_air_ratio", GC_Q_RATIO, custom_step, fuel_air_ratio, .def = UNSET,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 1.0,
             .description = "fuel_addition at a fuel-air ratio (instead of an end temperature)"),
    GC_F_NUM("fuel_temperature", GC_Q_TEMPERATURE, custom_step, fuel_temperature, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 1000.0,
             .description = "fuel supply temperature (0: the step's start temperature)"),
    GC_F_END
};

/* The steps array (or, from a query, an object keyed "0", "1", ...). */
static int decode_steps(gc_decoder *d, const gc_field_spec *f, json_t *value,
                        const char *pointer, void *target, json_t *echo_parent)
{
    custom_req *r = target;
    (void)f;
    (void)echo_parent;
    r->n_steps = 0;
    if (!value) {
        gc_decode_error(d, pointer, "is required: an array of process steps");
        return -1;
    }
    json_t *arr = value, *owned = NULL;
    if (json_is_object(value) && d->from_query) {
        size_t n = json_object_size(value);
        owned = json_array();
        for (size_t i = 0; i < n; i++) {
            char key[24];
            snprintf(key, sizeof key, "%zu", i);
            json_t *v = json_object_get(value, key);
            if (!v) {
                gc_decode_error(d, pointer, "query keys steps.0, steps.1, ... must be numbered "
                                "from 0 without gaps (steps.%zu is missing)", i);
                json_decref(owned);
                return -1;
            }
            json_array_append(owned, v);
        }
        arr = owned;
    }
    if (!json_is_array(arr) || json_array_size(arr) < 2 ||
        json_array_size(arr) > GC_CYCLE_MAX_STEPS) {
        gc_decode_error(d, pointer, "must be an array of 2 to %d process steps",
                        GC_CYCLE_MAX_STEPS);
        json_decref(owned);
        return -1;
    }
    int bad = 0;
    size_t i;
    json_t *v;
    json_array_foreach(arr, i, v) {
        char ptr[GC_API_FIELD_LEN];
        snprintf(ptr, sizeof ptr, "%s/%zu", pointer, i);
        custom_step *s = &r->steps[i];
        memset(s, 0, sizeof *s);
        if (gc_decode_fields(d, step_fields, v, ptr, s, NULL) > 0)
            bad = 1;
    }
    r->n_steps = (int)json_array_size(arr);
    json_decref(owned);
    return bad ? -1 : 0;
}

static const gc_field_spec start_fields[] = {
    GC_F_NUM("temperature", GC_Q_TEMPERATURE, custom_req, T_start, .def = 288.15,
             .flags = GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0, .description = "start temperature"),
    GC_F_NUM("pressure", GC_Q_PRESSURE, custom_req, P_start, .def = 101325.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1e9,
             .description = "start pressure"),
    GC_F_NUM("velocity", GC_Q_VELOCITY, custom_req, V_start, .def = 0.0,
             .flags = GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 5000.0,
             .description = "flow frame: start velocity"),
    GC_F_END
};

static const gc_field_spec dead_fields[] = {
    GC_F_NUM("temperature", GC_Q_TEMPERATURE, custom_req, T_dead, .def = 0.0,
             .flags = GC_F_MIN | GC_F_NO_ECHO, .min = 0.0, .description = "dead-state T"),
    GC_F_NUM("pressure", GC_Q_PRESSURE, custom_req, P_dead, .def = 0.0,
             .flags = GC_F_MIN | GC_F_NO_ECHO, .min = 0.0, .description = "dead-state P"),
    GC_F_END
};

static const gc_field_spec custom_fields[] = {
    GC_F_STR("name", custom_req, name, .def_string = "custom cycle", .description = "a label"),
    GC_F_ENUM("frame", frames, custom_req, frame, .def = 0, .description = "closed or flow"),
    GC_CYCLE_F_GAS("working-fluid model"),
    GC_F_OBJ("start", start_fields, .description = "start state"),
    GC_F_OBJ("dead_state", dead_fields, .description = "exergy dead state"),
    GC_F_CUSTOM("steps", decode_steps, custom_req, n_steps, .flags = GC_F_REQUIRED,
                .description = "the process chain"),
    GC_F_END
};

/* The one end condition of a step; 0, or -1 with an error added. */
static int step_end(const custom_step *s, int i, gc_end_kind *end, double *value, char *field,
                    size_t n, gc_api_errors *errs)
{
    int count = 0;
    *end = GC_END_DEFAULT;
    *value = 0.0;
    snprintf(field, n, "/steps/%d", i);
    for (int k = 1; k < GC_END_KIND_COUNT; k++) {
        int given = 0;
        if (k == GC_END_START_TEMPERATURE)
            given = s->has_start_T && s->end_start_T;
        else if (k == GC_END_START_VOLUME)
            given = s->has_start_v && s->end_start_v;
        else if (k == GC_END_START_PRESSURE)
            given = s->has_start_P && s->end_start_P;
        else
            given = s->end[k] != UNSET;
        if (!given)
            continue;
        if (count++) {
            gc_api_errors_add(errs, field, "give one end condition in \"end\", not two");
            return -1;
        }
        *end = (gc_end_kind)k;
        *value = s->end[k] != UNSET ? s->end[k] : 0.0;
        snprintf(field, n, "/steps/%d/end/%s", i, gc_cycle_end_name(k));
    }
    return 0;
}

int gc_api_h_cycle_custom(const gc_api_request *req, gc_api_response *resp)
{
    custom_req *r = calloc(1, sizeof *r);
    if (!r)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    gc_cycle_call call;
    if (gc_cycle_call_begin(&call, req, "custom", custom_fields, r, resp) != 0) {
        free(r);
        return 0;
    }
    gc_out *o = &call.out;
    gc_error err;
    gc_error_clear(&err);
    gc_gas gas;
    if (gc_cycle_common_gas(&r->c, &gas, &err) != GC_OK) {
        free(r);
        return gc_cycle_call_fail(&call, &err, "/gas", resp);
    }
    gc_cycle *chain = malloc(sizeof *chain);
    gc_cycle_result *res = malloc(sizeof *res);
    if (!chain || !res) {
        free(chain);
        free(res);
        free(r);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    gc_cycle_init(chain, r->frame == 1 ? GC_FRAME_FLOW : GC_FRAME_CLOSED, &gas, r->T_start,
                  r->P_start);
    chain->V_start_m_per_s = r->frame == 1 ? r->V_start : 0.0;
    chain->T_dead_K = r->T_dead;
    chain->P_dead_Pa = r->P_dead;
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    json_t *echo_steps = json_array();
    for (int i = 0; i < r->n_steps; i++) {
        custom_step *s = &r->steps[i];
        gc_end_kind end;
        double value;
        char field[GC_CYCLE_FIELD_LEN];
        if (step_end(s, i, &end, &value, field, sizeof field, &errs) != 0)
            continue;
        gc_step *st = gc_cycle_add(chain, (gc_process_kind)s->kind, end, value, field);
        if (!st) {
            gc_api_errors_add(&errs, "/steps", "at most %d steps", GC_CYCLE_MAX_STEPS);
            break;
        }
        json_t *e = json_object();
        json_object_set_new(e, "kind", json_string(kinds[s->kind]));
        if (s->name[0]) {
            json_object_set_new(e, "name", json_string(s->name));
            snprintf(st->label, sizeof st->label, "%s", s->name);
        } else {
            snprintf(st->label, sizeof st->label, "%s", kinds[s->kind]);
        }
        json_t *ee = json_object();
        if (end != GC_END_DEFAULT) {
            static const gc_quantity q[GC_END_KIND_COUNT] = {
                [GC_END_VOLUME_RATIO] = GC_Q_RATIO, [GC_END_PRESSURE_RATIO] = GC_Q_RATIO,
                [GC_END_TEMPERATURE] = GC_Q_TEMPERATURE, [GC_END_PRESSURE] = GC_Q_PRESSURE,
                [GC_END_HEAT] = GC_Q_SPECIFIC_ENERGY, [GC_END_PEAK_PRESSURE] = GC_Q_PRESSURE,
                [GC_END_VELOCITY] = GC_Q_VELOCITY };
            if (end == GC_END_START_TEMPERATURE || end == GC_END_START_VOLUME ||
                end == GC_END_START_PRESSURE)
                json_object_set_new(ee, gc_cycle_end_name(end), json_true());
            else
                gc_out_q(o, ee, gc_cycle_end_name(end), value, q[end]);
        }
        json_object_set_new(e, "end", ee);
        st->heat_sign = s->heat == 1 ? 1 : s->heat == 2 ? -1 : 0;
        st->efficiency = s->efficiency;
        st->polytropic_efficiency = s->efficiency_basis == 1;
        st->pressure_loss = s->pressure_loss;
        st->kinetic = s->nozzle;
        st->geometry = s->geometry == 1 ? GC_GEOM_CONST_V : GC_GEOM_CONST_P;
        st->T_source_K = s->source_temperature;
        if (s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION ||
            s->kind == GC_PROC_FUEL) {
            snprintf(st->field_aux, sizeof st->field_aux, "/steps/%d/efficiency", i);
            gc_out_num(o, e, "efficiency", s->efficiency);
            if (s->kind != GC_PROC_FUEL)
                json_object_set_new(e, "efficiency_basis", json_string(bases[s->efficiency_basis]));
        }
        if (s->pressure_loss > 0.0) {
            if (s->kind != GC_PROC_COMPRESSION && s->kind != GC_PROC_EXPANSION)
                snprintf(st->field_aux, sizeof st->field_aux, "/steps/%d/pressure_loss", i);
            gc_out_num(o, e, "pressure_loss", s->pressure_loss);
        }
        if (s->kind == GC_PROC_POLYTROPIC) {
            if (s->n == UNSET) {
                char fn[GC_API_FIELD_LEN];
                snprintf(fn, sizeof fn, "/steps/%d/n", i);
                gc_api_errors_add(&errs, fn, "is required for a polytropic step");
            }
            st->n = s->n == UNSET ? 0.0 : s->n;
            gc_out_num(o, e, "n", st->n);
        }
        if (s->kind == GC_PROC_DUAL) {
            char f2[GC_API_FIELD_LEN];
            snprintf(f2, sizeof f2, "/steps/%d/constant_volume_end", i);
            if ((s->cv_pressure_ratio != UNSET) == (s->cv_peak_pressure != UNSET)) {
                gc_api_errors_add(&errs, f2, "give one of pressure_ratio, peak_pressure");
            } else {
                json_t *cv = json_object();
                if (s->cv_pressure_ratio != UNSET) {
                    st->end2 = GC_END_PRESSURE_RATIO;
                    st->end2_value = s->cv_pressure_ratio;
                    snprintf(st->field_aux, sizeof st->field_aux,
                             "/steps/%d/constant_volume_end/pressure_ratio", i % 100);
                    gc_out_num(o, cv, "pressure_ratio", s->cv_pressure_ratio);
                } else {
                    st->end2 = GC_END_PEAK_PRESSURE;
                    st->end2_value = s->cv_peak_pressure;
                    snprintf(st->field_aux, sizeof st->field_aux,
                             "/steps/%d/constant_volume_end/peak_pressure", i % 100);
                    gc_out_q(o, cv, "peak_pressure", s->cv_peak_pressure, GC_Q_PRESSURE);
                }
                json_object_set_new(e, "constant_volume_end", cv);
            }
        }
        if (s->kind == GC_PROC_FUEL) {
            if (!s->c.has_fuel) {
                char ff[GC_API_FIELD_LEN];
                snprintf(ff, sizeof ff, "/steps/%d/fuel", i);
                gc_api_errors_add(&errs, ff, "is required for fuel_addition");
            }
            st->fuel.fuel = s->c.has_fuel ? &s->c.fuel : NULL;
            st->fuel.fuel_air_ratio = s->fuel_air_ratio != UNSET ? s->fuel_air_ratio : 0.0;
            st->fuel.T_fuel_K = s->fuel_temperature;
            if (s->c.has_fuel)
                json_object_set_new(e, "fuel", json_string(s->c.fuel.label));
            if (s->fuel_air_ratio != UNSET)
                gc_out_num(o, e, "fuel_air_ratio", s->fuel_air_ratio);
        }
        if (s->kind == GC_PROC_HEAT_EXCHANGE || s->kind == GC_PROC_CLOSE)
            json_object_set_new(e, "geometry", json_string(geoms[s->geometry]));
        if (s->heat)
            json_object_set_new(e, "heat", json_string(heats[s->heat]));
        if (s->nozzle)
            json_object_set_new(e, "nozzle", json_true());
        json_array_append_new(echo_steps, e);
    }
    /* heat exchangers: link each pair once, from its lower-indexed side */
    for (int i = 0; i < r->n_steps && !errs.n; i++) {
        custom_step *s = &r->steps[i];
        char f[GC_API_FIELD_LEN];
        snprintf(f, sizeof f, "/steps/%d/partner", i);
        if (s->kind != GC_PROC_HEAT_EXCHANGE) {
            if (s->has_partner)
                gc_api_errors_add(&errs, f, "applies only to heat_exchange steps");
            continue;
        }
        int j = s->partner;
        if (!s->has_partner || j == i || j >= r->n_steps ||
            r->steps[j].kind != GC_PROC_HEAT_EXCHANGE || r->steps[j].partner != i) {
            gc_api_errors_add(&errs, f, "must name the other heat_exchange step of the pair, "
                              "which names this one back");
            continue;
        }
        json_t *e = json_array_get(echo_steps, (size_t)i);
        json_object_set_new(e, "partner", json_integer(j));
        if (j < i)
            continue;
        double eps = s->effectiveness != UNSET ? s->effectiveness : 1.0;
        gc_out_num(o, e, "effectiveness", eps);
        char fe[GC_CYCLE_FIELD_LEN];
        snprintf(fe, sizeof fe, "/steps/%d/effectiveness", i);
        if (gc_cycle_link_exchanger(chain, i, j, eps, s->geometry == 1 ? GC_GEOM_CONST_V
                                                                       : GC_GEOM_CONST_P,
                                    fe) != GC_OK)
            gc_api_errors_add(&errs, f, "the pair cannot be linked");
    }
    json_object_set_new(o->inputs, "steps", echo_steps);
    if (errs.n) {
        free(chain);
        free(res);
        free(r);
        return gc_cycle_call_fail_errors(&call, &errs, resp);
    }
    int rc = gc_cycle_evaluate(chain, res, &err);
    if (rc != GC_OK) {
        free(chain);
        free(res);
        free(r);
        return gc_cycle_call_fail(&call, &err, "/steps", resp);
    }
    json_t *doc = json_object();
    json_object_set_new(doc, "cycle", json_string("custom"));
    json_object_set_new(doc, "title", json_string(r->name));
    gc_cycle_out_opts opts;
    gc_cycle_out_opts_init(&opts);
    opts.chain = chain;
    if (!gc_cycle_out_encode(&call, doc, res, &opts)) {
        json_decref(doc);
        free(chain);
        free(res);
        free(r);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    gc_cycle_out_warn_ideal(o, res);
    if (r->c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    gc_api_validity_warn_cycle(o, res);
    int out_rc = gc_cycle_call_finish(&call, doc, res, resp);
    free(chain);
    free(res);
    free(r);
    return out_rc;
}
