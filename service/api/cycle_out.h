/*
 * cycle_out.h — private to the API layer: what every cycle route
 * (/v1/cycles/{preset}, /v1/cycles/brayton, /v1/cycles/turbojet,
 * /v1/cycles/custom) shares.
 *
 *  - The request path of a cycle route (gc_cycle_call_*): output parameters
 *    of output.h plus the diagram options that only cycle routes take
 *    (scale=linear|log, overlay=ideal,carnot|none, width, height; they are
 *    taken out of the query before the request is decoded, so they are
 *    never input fields), field-spec decoding, the mapping of a core
 *    gc_error to an RFC 9457 problem (GC_ERR_CHECK -> 422 "check_failed",
 *    GC_ERR_INFEASIBLE -> 422 "infeasible", GC_ERR_RANGE -> 422
 *    "out_of_range", GC_ERR_NOCONV -> 422 "no_convergence", GC_ERR_RICH ->
 *    422 "infeasible", GC_ERR_NOMEM -> 503; everything else 422
 *    "validation"), and the answer in JSON, CSV, a select= value or SVG
 *    (format=svg&diagram=Ts|Pv|hs, drawn by gascycle/diagram.h from the
 *    evaluated result itself, not from the JSON document).
 *  - The encoder of a gc_cycle_result (gc_cycle_out_encode): "model",
 *    "states", "processes", "summary", "bounds" {ideal, carnot}, "checks"
 *    and, with include=paths, "paths" (per process the very points
 *    gc_cycle_path gives the SVG renderer, points= per process).
 *  - Shared input fields: the working-fluid variant "gas" (air | cold with
 *    cp, k), the "fuel" decoder (a name, {"analysis": {...}} by mole
 *    fraction, or {"formula": "CxHyOzNw", "lower_heating_value": ...}) and
 *    the "site" object; every route's request struct starts with a
 *    gc_cycle_common member so these specs fit every route.
 *
 * State numbering in responses: states are numbered from 1 in cycle order;
 * the engine's closing state (equal to state 1 within the state-closure
 * check) is not repeated, the last process ends at state 1.
 *
 * Units: everything from the core is SI; gc_out_q converts to the chosen
 * system. Specific fuel consumption (no units.h quantity) is written in
 * g/kWh (si) or lbm/(hp h) (us) here, with NIST SP 811 factors.
 */
#ifndef GC_API_CYCLE_OUT_H
#define GC_API_CYCLE_OUT_H

#include "api/decode.h"
#include "api/output.h"
#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/diagram.h"
#include "gascycle/site.h"

#include <jansson.h>

/* ---- the cycle route handlers (routes.c) ------------------------------ */


/* ---- shared request members ------------------------------------------ */

enum gc_cycle_gas_model { GC_CYCLE_GAS_AIR = 0, GC_CYCLE_GAS_COLD = 1 };

typedef struct gc_cycle_common {
    int gas;                     /* gc_cycle_gas_model (variant index) */
    int has_gas;                 /* 1 when "gas" was given */
    double gas_cp;               /* cold: cp, J/(kg K) */
    double gas_k;                /* cold: k, - */
    int has_fuel;                /* 1 when "fuel" was given */
    gc_fuel fuel;                /* the decoded fuel (valid when has_fuel) */
    int has_site_altitude, has_site_temperature, has_site_pressure, has_site_rh;
    double site_altitude;        /* m */
    double site_temperature;     /* K */
    double site_pressure;        /* Pa */
    double site_rh;              /* fraction */
} gc_cycle_common;

/* The variant list for "gas" (air, cold{cp,k}), GC_F_VARIANT-ready; cp and
 * k land in gc_cycle_common (offsets relative to the route struct's start,
 * so the route struct must begin with its gc_cycle_common member). */
extern const gc_variant_spec gc_cycle_gas_variants[];
/* The "site" object's members (altitude, temperature, pressure,
 * relative_humidity), not echoed by the decoder: gc_cycle_echo_site
 * writes the resolved conditions instead. */
extern const gc_field_spec gc_cycle_site_fields[];
/* Custom decoder of "fuel" into gc_cycle_common.fuel / has_fuel. */
int gc_cycle_decode_fuel(gc_decoder *d, const gc_field_spec *f, json_t *value,
                         const char *pointer, void *target, json_t *echo_parent);

#define GC_CYCLE_F_GAS(desc)                                                        \
    { .name = "gas", .type = GC_FIELD_VARIANT, .variants = gc_cycle_gas_variants,   \
      .offset = offsetof(gc_cycle_common, gas),                                     \
      .present = offsetof(gc_cycle_common, has_gas) + 1, .def_string = "air",        \
      .description = desc }
#define GC_CYCLE_F_FUEL(desc)                                                       \
    { .name = "fuel", .type = GC_FIELD_CUSTOM, .custom = gc_cycle_decode_fuel,      \
      .offset = offsetof(gc_cycle_common, fuel), .description = desc }
#define GC_CYCLE_F_SITE(desc)                                                       \
    { .name = "site", .type = GC_FIELD_OBJECT, .children = gc_cycle_site_fields,    \
      .description = desc }

/* Initialises the working gas from the decoded common members (air or
 * cold); GC_OK or an error on "/gas". */
int gc_cycle_common_gas(const gc_cycle_common *c, gc_gas *g, gc_error *err);
/* Copies the decoded site members into a site.h input. */
void gc_cycle_common_site(const gc_cycle_common *c, gc_site_input *in);
/* inputs.site = the resolved site conditions (and where each came from). */
void gc_cycle_echo_site(gc_out *o, const gc_site *site);
/* inputs.gas = {"model": "site_air"}: the default gas, the site's humid air. */
void gc_cycle_echo_site_air(gc_out *o);
/* The heat-addition echo of the gas-turbine presets: drops fuel_temperature
 * without a fuel, sets heat_addition ("fuel" | "air_standard") and the
 * resolved site (gc_cycle_echo_site). */
void gc_cycle_echo_heat(gc_out *o, const gc_cycle_common *c, const gc_site *site);

/* ---- request path ---------------------------------------------------- */

typedef struct gc_cycle_call {
    gc_out out;                  /* output builder (output.h) */
    gc_api_request req;          /* the request without the diagram-only keys */
    gc_api_param *query;         /* malloc'd filtered query (req.query) */
    gc_diagram_options diagram;  /* format=svg options */
    int include_paths;           /* include=paths */
    int points;                  /* points per process (paths and SVG) */
    const char *preset;          /* static name for metrics */
} gc_cycle_call;

/* Parses the output and diagram parameters, decodes the fields into
 * target and echoes them. Returns 0 when the route may go on; else resp
 * holds the problem (400/415/422/503), everything is released, and the
 * handler returns 0 at once. */
int gc_cycle_call_begin(gc_cycle_call *call, const gc_api_request *req, const char *preset,
                        const gc_field_spec *fields, void *target, gc_api_response *resp);

/* Answers a core error (see the header comment), releases the call.
 * fallback_field is used when err->field is empty (NULL: ""). Returns 0. */
int gc_cycle_call_fail(gc_cycle_call *call, const gc_error *err, const char *fallback_field,
                       gc_api_response *resp);

/* Answers a list of field errors as 422 "validation", releases the call. */
int gc_cycle_call_fail_errors(gc_cycle_call *call, const gc_api_errors *errs,
                              gc_api_response *resp);

/* Finishes: SVG of result (format=svg) or doc in JSON/CSV/select
 * (doc is stolen in every case). Releases the call. Returns 0. */
int gc_cycle_call_finish(gc_cycle_call *call, json_t *doc, const gc_cycle_result *result,
                         gc_api_response *resp);

/* Releases the call without answering (resp already filled). */
void gc_cycle_call_free(gc_cycle_call *call);

/* Removes from call->out.inputs the numeric inputs still holding `unset`
 * (optional inputs with no default that were not given). */
void gc_cycle_drop_unset(gc_cycle_call *call, const gc_field_spec *fields, const void *target,
                         double unset);

/* ---- encoder ------------------------------------------------------- */

typedef struct gc_cycle_out_opts {
    const gc_cycle *chain;       /* the evaluated chain, for process names (may be NULL:
                                    the process kinds name them) */
    const char *const *state_names; /* engine state index -> station name, or NULL */
    int n_state_names;
    /* Route figures that replace the engine's (NAN: keep the engine's). The
     * Brayton and turbojet presets quote efficiency on the fuel's LHV. */
    double heat_in;              /* J/kg */
    double thermal_efficiency;   /* - */
    double ideal_thermal_efficiency; /* - */
    const char *basis;           /* "per kg of trapped gas" ... (NULL: by frame) */
} gc_cycle_out_opts;

void gc_cycle_out_opts_init(gc_cycle_out_opts *opts);

/* Adds model, states, processes, summary, bounds, checks (and paths when
 * call->include_paths) of r to doc. Returns the summary object (borrowed),
 * so the route can add its own figures, or NULL when memory ran out. */
json_t *gc_cycle_out_encode(gc_cycle_call *call, json_t *doc, const gc_cycle_result *r,
                            const gc_cycle_out_opts *opts);

/* Response state number (1-based) of engine state index i of run. */
int gc_cycle_out_state_number(const gc_cycle_run *run, int i);

/* obj[key] = specific fuel consumption (kg/J) in g/kWh or lbm/(hp h). */
void gc_cycle_out_sfc(gc_out *o, json_t *obj, const char *key, double kg_per_J);

/* Adds the "ideal_equals_actual" warning when the result's ideal is the
 * actual cycle (defaults are the ideal). */
void gc_cycle_out_warn_ideal(gc_out *o, const gc_cycle_result *r);

/* A new {"label", "lower_heating_value", "higher_heating_value"} object
 * describing the fuel (model.fuel of the cycle responses). */
json_t *gc_cycle_out_fuel(gc_out *o, const gc_fuel *fuel);

/* fuel_obj.chemical_exergy = the fuel's standard chemical exergy (exergy.h,
 * Szargut's reference environment), for routes whose second law is on it. */
void gc_cycle_out_fuel_exergy(gc_out *o, json_t *fuel_obj, const gc_fuel *fuel);

/* Adds the "cold_model" warning on "/gas" (the caller decides when). */
void gc_cycle_out_warn_cold(gc_out *o);

#endif
