/*
 * cycles_piston.c — GET|POST /v1/cycles/{preset} for the piston-engine
 * presets of gascycle/piston.h: otto, diesel, dual, atkinson, miller,
 * stirling, ericsson, lenoir, carnot. Each preset has its own field table
 * (only the inputs that apply to it; anything else is an unknown field with
 * the closest name suggested); an unknown preset is a 404 problem listing
 * the known ones (all cycle routes).
 *
 * Inputs (SI inside; defaults = the ideal cycle): intake_temperature
 * (288.15 K), intake_pressure (101.325 kPa), gas (air | cold), the
 * preset's ratios and heat-addition end (peak_temperature or heat_added
 * ...), compression_efficiency and expansion_efficiency (1),
 * regenerator_effectiveness (1, stirling and ericsson); for the indicated
 * figures displacement (whole engine), cylinders, speed, strokes_per_cycle,
 * and fuel (for ISFC through the fuel's LHV).
 *
 * Output: cycle_out.h's document plus "engine" (compression-end
 * temperature, expansion ratio) and "indicated" (trapped mass, work per
 * cycle, IMEP, indicated power, ISFC, fuel flow) when displacement is given.
 */
#include "api/cycle_out.h"
#include "api/handlers.h"
#include "api/validity_out.h"
#include "gascycle/piston.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define UNSET GC_PISTON_UNSET

typedef struct piston_req {
    gc_cycle_common c;                  /* first: shared gas/fuel specs */
    double intake_temperature;          /* K */
    double intake_pressure;             /* Pa */
    double compression_ratio;           /* - */
    double cutoff_ratio;                /* - */
    double pressure_ratio;              /* - */
    double peak_pressure;               /* Pa */
    double peak_temperature;            /* K */
    double heat_added;                  /* J/kg */
    double expansion_ratio;             /* - */
    double effective_compression_ratio; /* - */
    double compression_efficiency;      /* - */
    double expansion_efficiency;        /* - */
    double regenerator_effectiveness;   /* - */
    double displacement;                /* m3, whole engine */
    double speed;                       /* rev/s */
    int cylinders;                      /* - */
    int has_cylinders;
    int strokes;                        /* strokes per cycle, 2 or 4 */
    int has_strokes;
} piston_req;

/* ---- field tables ------------------------------------------------------ */

#define F_INTAKE                                                                          \
    GC_F_NUM("intake_temperature", GC_Q_AMBIENT_TEMPERATURE, piston_req, intake_temperature, \
             .def = 288.15, .flags = GC_F_MIN | GC_F_MAX, .min = 200.0, .max = 1000.0,    \
             .description = "gas temperature at the start of compression"),              \
    GC_F_NUM("intake_pressure", GC_Q_PRESSURE, piston_req, intake_pressure, .def = 101325.0, \
             .flags = GC_F_MIN | GC_F_MAX, .min = 100.0, .max = 1.0e8,                    \
             .description = "gas pressure at the start of compression"),                 \
    GC_CYCLE_F_GAS("working-fluid model")
#define F_NUM_OPT(nm, q, member, lo, hi, desc)                                           \
    GC_F_NUM(nm, q, piston_req, member, .def = UNSET,                                    \
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = lo, .max = hi,         \
             .description = desc)
#define F_CR(hi) F_NUM_OPT("compression_ratio", GC_Q_RATIO, compression_ratio, 1.0, hi,    \
                           "v_max / v_min (geometric)")
#define F_CUT F_NUM_OPT("cutoff_ratio", GC_Q_RATIO, cutoff_ratio, 1.0, 100.0,              \
                        "v after / v before the constant-pressure heat addition")
#define F_PR(desc) GC_F_NUM("pressure_ratio", GC_Q_RATIO, piston_req, pressure_ratio,     \
                            .def = UNSET, .flags = GC_F_MIN | GC_F_MAX, .min = 1.0,        \
                            .max = 1000.0, .description = desc)
#define F_PPEAK F_NUM_OPT("peak_pressure", GC_Q_PRESSURE, peak_pressure, 0.0, 1.0e9,       \
                          "pressure limit of the constant-volume heat addition")
#define F_TPEAK F_NUM_OPT("peak_temperature", GC_Q_TEMPERATURE, peak_temperature, 0.0,     \
                          6000.0, "highest gas temperature (end of heat addition)")
#define F_Q F_NUM_OPT("heat_added", GC_Q_SPECIFIC_ENERGY, heat_added, 0.0, 1.0e8,          \
                      "heat added per kg of trapped gas")
#define F_ER F_NUM_OPT("expansion_ratio", GC_Q_RATIO, expansion_ratio, 1.0, 200.0,         \
                       "v at exhaust / v after heat addition (over-expansion)")
#define F_ECR F_NUM_OPT("effective_compression_ratio", GC_Q_RATIO,                         \
                        effective_compression_ratio, 1.0, 100.0,                            \
                        "compression ratio from intake valve closing")
#define F_EFF(nm, member, desc)                                                            \
    GC_F_NUM(nm, GC_Q_FRACTION, piston_req, member, .def = 1.0,                           \
             .flags = GC_F_MIN | GC_F_MAX, .min = 0.05, .max = 1.0, .description = desc)
#define F_EFFS                                                                             \
    F_EFF("compression_efficiency", compression_efficiency, "isentropic efficiency of "    \
          "compression"),                                                                  \
    F_EFF("expansion_efficiency", expansion_efficiency, "isentropic efficiency of expansion")
#define F_REGEN                                                                            \
    GC_F_NUM("regenerator_effectiveness", GC_Q_FRACTION, piston_req,                      \
             regenerator_effectiveness, .def = 1.0, .flags = GC_F_MIN | GC_F_MAX,         \
             .min = 0.0, .max = 1.0, .description = "regenerator effectiveness (0: none)")
#define F_ENGINE                                                                           \
    F_NUM_OPT("displacement", GC_Q_VOLUME, displacement, 0.0, 100.0,                      \
              "swept volume of the whole engine"),                                        \
    GC_F_INT("cylinders", piston_req, cylinders,                                          \
             .present = GC_PRESENT(piston_req, has_cylinders),                            \
             .flags = GC_F_MIN | GC_F_MAX, .min = 1.0, .max = 64.0,                       \
             .description = "number of cylinders (default 1)"),                           \
    F_NUM_OPT("speed", GC_Q_ROTATIONAL_SPEED, speed, 0.0, 1000.0, "crankshaft speed"),   \
    GC_F_INT("strokes_per_cycle", piston_req, strokes,                                    \
             .present = GC_PRESENT(piston_req, has_strokes),                              \
             .flags = GC_F_MIN | GC_F_MAX, .min = 2.0, .max = 4.0,                        \
             .description = "strokes per cycle, 2 or 4"),                                 \
    GC_CYCLE_F_FUEL("fuel, for the indicated specific fuel consumption")

static const gc_field_spec otto_fields[] = {
    F_INTAKE, F_CR(100.0), F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};
static const gc_field_spec diesel_fields[] = {
    F_INTAKE, F_CR(100.0), F_CUT, F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};
static const gc_field_spec dual_fields[] = {
    F_INTAKE, F_CR(100.0), F_PR("P after / P before the constant-volume heat addition"),
    F_PPEAK, F_CUT, F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};
static const gc_field_spec atkinson_fields[] = {
    F_INTAKE, F_CR(100.0), F_ER, F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};
static const gc_field_spec miller_fields[] = {
    F_INTAKE, F_CR(100.0), F_ECR, F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};
static const gc_field_spec stirling_fields[] = {
    F_INTAKE, F_CR(1.0e6), F_TPEAK, F_REGEN, F_ENGINE, GC_F_END
};
static const gc_field_spec ericsson_fields[] = {
    F_INTAKE, F_PR("P_max / P_min of the isothermal compression"), F_TPEAK, F_REGEN,
    F_ENGINE, GC_F_END
};
static const gc_field_spec lenoir_fields[] = {
    F_INTAKE, F_PR("P after / P before the constant-volume heat addition"), F_TPEAK, F_Q,
    F_EFF("expansion_efficiency", expansion_efficiency, "isentropic efficiency of expansion"),
    F_ENGINE, GC_F_END
};
static const gc_field_spec carnot_fields[] = {
    F_INTAKE, F_CR(1.0e6), F_TPEAK, F_Q, F_EFFS, F_ENGINE, GC_F_END
};

static const struct {
    const char *title;
    const gc_field_spec *fields;
} presets[GC_PISTON_COUNT] = {
    [GC_PISTON_OTTO] = { "Otto cycle", otto_fields },
    [GC_PISTON_DIESEL] = { "Diesel cycle", diesel_fields },
    [GC_PISTON_DUAL] = { "Dual (limited-pressure) cycle", dual_fields },
    [GC_PISTON_ATKINSON] = { "Atkinson cycle", atkinson_fields },
    [GC_PISTON_MILLER] = { "Miller cycle", miller_fields },
    [GC_PISTON_STIRLING] = { "Stirling cycle", stirling_fields },
    [GC_PISTON_ERICSSON] = { "Ericsson cycle", ericsson_fields },
    [GC_PISTON_LENOIR] = { "Lenoir cycle", lenoir_fields },
    [GC_PISTON_CARNOT] = { "Carnot cycle", carnot_fields },
};

/* ---- the handler ----------------------------------------------------------- */

static const char *last_segment(const char *path)
{
    const char *s = strrchr(path ? path : "", '/');
    return s ? s + 1 : "";
}

/* The 404 for /v1/cycles/<unknown>. */
int gc_api_h_cycle_unknown(const gc_api_request *req, gc_api_response *resp)
{
    const char *name = req->n_path_params ? req->path_params[0].value : last_segment(req->path);
    const char *known[GC_PISTON_COUNT + 3];
    char list[320] = "";
    size_t n = 0;
    for (int i = 0; i < GC_PISTON_COUNT; i++)
        known[n++] = gc_piston_name((gc_piston_cycle)i);
    known[n++] = "brayton";
    known[n++] = "turbojet";
    known[n++] = "custom";
    for (size_t i = 0; i < n; i++) {
        size_t used = strlen(list);
        snprintf(list + used, sizeof list - used, "%s%s", i ? ", " : "", known[i]);
    }
    char detail[512];
    const char *s = gc_decode_suggest(name ? name : "", known, n);
    if (s)
        snprintf(detail, sizeof detail, "No cycle preset '%.60s'; did you mean '%s'? The "
                 "presets are: %s.", name ? name : "", s, list);
    else
        snprintf(detail, sizeof detail, "No cycle preset '%.60s'. The presets are: %s.",
                 name ? name : "", list);
    return gc_api_problem(resp, 404, "not_found", "Unknown cycle preset", detail, "/preset");
}

static void set_opt(double *dst, double v)
{
    *dst = v;   /* UNSET stays UNSET */
}

int gc_api_h_cycle_piston(const gc_api_request *req, gc_api_response *resp)
{
    gc_piston_cycle cyc;
    if (gc_piston_from_name(last_segment(req->path), &cyc) != GC_OK)
        return gc_api_h_cycle_unknown(req, resp);
    const char *name = gc_piston_name(cyc);
    const gc_field_spec *fields = presets[cyc].fields;

    piston_req r;
    memset(&r, 0, sizeof r);
    gc_cycle_call call;
    if (gc_cycle_call_begin(&call, req, name, fields, &r, resp) != 0)
        return 0;
    gc_cycle_drop_unset(&call, fields, &r, UNSET);
    if (!r.has_cylinders)
        json_object_del(call.out.inputs, "cylinders");
    if (!r.has_strokes)
        json_object_del(call.out.inputs, "strokes_per_cycle");
    if (r.has_strokes && r.strokes != 2 && r.strokes != 4) {
        gc_api_errors errs;
        gc_api_errors_init(&errs);
        gc_api_errors_add(&errs, "/strokes_per_cycle", "must be 2 or 4");
        return gc_cycle_call_fail_errors(&call, &errs, resp);
    }

    gc_piston_input in;
    gc_piston_input_init(&in, cyc);
    gc_error err;
    gc_error_clear(&err);
    if (gc_cycle_common_gas(&r.c, &in.gas, &err) != GC_OK)
        return gc_cycle_call_fail(&call, &err, "/gas", resp);
    in.intake_temperature = r.intake_temperature;
    in.intake_pressure = r.intake_pressure;
    /* fields a preset does not list stay UNSET (memset 0 is not UNSET: copy only listed) */
    for (const gc_field_spec *f = fields; f->name; f++) {
        if (f->type != GC_FIELD_NUMBER || f->def == 288.15 || f->def == 101325.0)
            continue;
        double v = *(const double *)(const void *)((const char *)&r + f->offset);
        if (f->def == 1.0 && v == 1.0 && strcmp(f->name, "regenerator_effectiveness") != 0)
            continue;   /* an efficiency at its ideal default: leave it unset */
#define COPY(member) \
        if (f->offset == offsetof(piston_req, member)) set_opt(&in.member, v)
        COPY(compression_ratio);
        COPY(cutoff_ratio);
        COPY(pressure_ratio);
        COPY(peak_pressure);
        COPY(peak_temperature);
        COPY(heat_added);
        COPY(expansion_ratio);
        COPY(effective_compression_ratio);
        COPY(compression_efficiency);
        COPY(expansion_efficiency);
        COPY(regenerator_effectiveness);
        COPY(displacement);
        COPY(speed);
#undef COPY
    }
    if (r.has_cylinders) {
        in.cylinders = r.cylinders;
        in.has_cylinders = 1;
    }
    if (r.has_strokes) {
        in.strokes = r.strokes;
        in.has_strokes = 1;
    }
    if (r.c.has_fuel)
        in.fuel_heating_value = r.c.fuel.LHV_J_per_kg;

    gc_piston_result *res = malloc(sizeof *res);
    gc_cycle *chain = malloc(sizeof *chain);
    if (!res || !chain) {
        free(res);
        free(chain);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    int rc = gc_piston_evaluate(&in, res, &err);
    if (rc == GC_OK && gc_piston_build(&in, chain, NULL) != GC_OK)
        memset(chain, 0, sizeof *chain);
    if (rc != GC_OK) {
        free(res);
        free(chain);
        return gc_cycle_call_fail(&call, &err, "", resp);
    }

    gc_out *o = &call.out;
    json_t *doc = json_object();
    json_object_set_new(doc, "cycle", json_string(name));
    json_object_set_new(doc, "title", json_string(presets[cyc].title));
    gc_cycle_out_opts opts;
    gc_cycle_out_opts_init(&opts);
    opts.chain = chain->n_steps ? chain : NULL;
    json_t *summary = gc_cycle_out_encode(&call, doc, &res->cycle, &opts);
    if (!summary) {
        json_decref(doc);
        free(res);
        free(chain);
        err.code = GC_ERR_NOMEM;
        return gc_cycle_call_fail(&call, &err, NULL, resp);
    }
    json_t *eng = json_object();
    if (res->compression_end_temperature > 0.0)
        gc_out_q(o, eng, "compression_end_temperature", res->compression_end_temperature,
                 GC_Q_TEMPERATURE);
    if (res->expansion_ratio > 0.0)
        gc_out_num(o, eng, "expansion_ratio", res->expansion_ratio);
    json_object_set_new(doc, "engine", eng);
    if (res->has_engine || res->has_fuel) {
        json_t *ind = json_object();
        if (res->has_engine) {
            gc_out_q(o, ind, "cylinder_displacement", res->cylinder_displacement, GC_Q_VOLUME);
            gc_out_q(o, ind, "trapped_mass", res->trapped_mass, GC_Q_MASS);
            gc_out_q(o, ind, "work_per_cycle", res->work_per_cycle, GC_Q_ENERGY);
            gc_out_q(o, ind, "imep", res->imep, GC_Q_PRESSURE);
        }
        if (res->has_power) {
            gc_out_num(o, ind, "cycles_per_second", res->cycles_per_second);
            json_object_set_new(o->units, "cycles_per_second", json_string("1/s"));
            gc_out_q(o, ind, "indicated_power", res->indicated_power, GC_Q_POWER);
        }
        if (res->has_fuel) {
            gc_cycle_out_sfc(o, ind, "isfc", res->isfc);
            if (res->has_engine)
                gc_out_q(o, ind, "fuel_per_cycle", res->fuel_per_cycle, GC_Q_MASS);
            if (res->has_power)
                gc_out_q(o, ind, "fuel_mass_flow", res->fuel_mass_flow, GC_Q_MASS_FLOW);
        }
        json_object_set_new(doc, "indicated", ind);
    }
    if (r.c.has_fuel) {
        json_object_set_new(json_object_get(doc, "model"), "fuel",
                            gc_cycle_out_fuel(o, &r.c.fuel));
        if (!res->has_engine)
            gc_out_warn(o, "no_displacement", "/displacement",
                        "without displacement only the ISFC is given (it needs no engine "
                        "size); add displacement for trapped mass, work per cycle and IMEP");
    }
    if ((r.has_cylinders || r.has_strokes || GC_PISTON_IS_SET(r.speed)) &&
        !GC_PISTON_IS_SET(r.displacement))
        gc_out_warn(o, "no_displacement", "/displacement",
                    "cylinders, speed and strokes_per_cycle are used only with displacement");
    gc_cycle_out_warn_ideal(o, &res->cycle);
    if (r.c.gas == GC_CYCLE_GAS_COLD)
        gc_cycle_out_warn_cold(o);
    if (res->peak_pressure_short)
        gc_out_warn(o, "peak_pressure_not_reached", "/peak_pressure",
                    "peak_pressure %.6g MPa is not reached: the heat addition ends first, at "
                    "%.6g MPa, so there is no constant-pressure part (an Otto cycle at this "
                    "heat input)", in.peak_pressure / 1e6, res->peak_pressure_reached / 1e6);
    gc_api_validity_warn_cycle(o, &res->cycle);
    int out_rc = gc_cycle_call_finish(&call, doc, &res->cycle, resp);
    free(res);
    free(chain);
    return out_rc;
}
