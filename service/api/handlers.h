/*
 * handlers.h — private to the API layer: the route handlers (one file per
 * resource) that routes/table.c puts into the route table. Each is a pure function
 * of the request (api.h): no global mutable state.
 */
#ifndef GC_API_HANDLERS_H
#define GC_API_HANDLERS_H

#include "api/api.h"

int gc_api_h_openapi(const gc_api_request *req, gc_api_response *resp);    /* openapi.c */
int gc_api_h_gases(const gc_api_request *req, gc_api_response *resp);      /* gases.c */
int gc_api_h_properties(const gc_api_request *req, gc_api_response *resp); /* properties.c */
int gc_api_h_water(const gc_api_request *req, gc_api_response *resp);      /* water.c */
int gc_api_h_sweeps(const gc_api_request *req, gc_api_response *resp);     /* sweeps.c */
int gc_api_h_targets(const gc_api_request *req, gc_api_response *resp);    /* targets.c */
int gc_api_h_batch(const gc_api_request *req, gc_api_response *resp);      /* batch.c */
/* uncertainty.c: issue 14's routes over every preset */
int gc_api_h_uncertainty(const gc_api_request *req, gc_api_response *resp);
int gc_api_h_sensitivities(const gc_api_request *req, gc_api_response *resp);

/* ---- preset routes (routes/preset.c) ----
 * Every preset of the registry (gascycle/preset.h) is served by one
 * handler; /v1/cycles/<unknown> is a 404 listing the cycle presets. */
struct gc_preset;
struct gc_report;
int gc_api_h_preset(const gc_api_request *req, gc_api_response *resp);
int gc_api_h_cycle_unknown(const gc_api_request *req, gc_api_response *resp);
/* The preset a preset route's request names, or NULL. */
const struct gc_preset *gc_api_preset_of(const gc_api_request *req);
/* One block for input, echo copy, result and report of p (free() it), the
 * report initialised; NULL when memory ran out. */
void *gc_api_eval_alloc(const struct gc_preset *p, void **input, void **echo, void **result,
                        struct gc_report **rep);

struct json_t;
struct gc_out;
struct gc_api_errors;

/* ---- inner evaluations (batch.c; used by batch.c, sweeps.c, targets.c) ----
 * An inner call runs an API route's handler on a request built here: fields
 * as a POST JSON body (as_query 0) or as GET dotted query parameters
 * (as_query 1), plus units=si|us. body is the parsed JSON answer (a result
 * or a problem; new reference, or NULL); gc_api_inner_free releases it. */
typedef struct gc_api_inner {
    int status;                 /* HTTP status of the inner answer */
    const char *error_class;    /* metrics class (static, or inside body), or NULL */
    struct json_t *body;        /* parsed JSON body, or NULL */
} gc_api_inner;
/* 0, or -1 when memory ran out (then answer 503). An unknown path is a 404
 * and a method the route lacks a 405, both without a body. */
int gc_api_inner_call(const char *path, struct json_t *fields, int as_query, int unit_system,
                      const char *request_id, gc_api_inner *out);
void gc_api_inner_free(gc_api_inner *in);
/* Appends the inner problem's errors to dst with prefix before each field. */
void gc_api_inner_problem_errors(const gc_api_inner *in, const char *prefix, struct json_t *dst);
/* The cycle presets of the route table ("otto" ... "custom"), at most max. */
size_t gc_api_cycle_presets(const char **names, size_t max);
/* The presets a study (/v1/sweeps, /v1/targets) may name as "cycle": the
 * cycle routes, then the presets with a route of their own (/v1/machine/...);
 * their count (at most max). */
size_t gc_api_study_presets(const char **names, size_t max);
/* "cycle" of a sweep or target: a preset name -> "/v1/cycles/<name>" in
 * path (size n), or the route of a preset with a route of its own
 * ("machine_site" -> "/v1/machine/site"); an unknown or missing name adds an
 * error on "/cycle" (with the closest preset) and returns -1. */
int gc_api_cycle_path(struct json_t *cycle, struct gc_api_errors *errs, char *path, size_t n);
/* The registry's cycle preset of route path "/v1/cycles/<name>" (or the
 * preset of a route of its own, "/v1/machine/site"), or NULL (a route served
 * by its own handler). */
const struct gc_preset *gc_api_cycle_preset(const char *path);
/* The registry's preset of route path "/v1/cycles/<name>" or
 * "/v1/measured/<segment>", or NULL. */
const struct gc_preset *gc_api_preset_at(const char *path);
/* The route's answer to a POST of `fields` (a JSON object) with units=sys
 * and its plain numbers read in input_sys (input_units=), evaluated in
 * process (a batch item). Returns 0. */
int gc_api_preset_answer(const struct gc_preset *p, struct json_t *fields, int sys, int input_sys,
                         gc_api_response *resp);
/* A swept or free input value: a number, or a string "<number> <unit>"
 * (also a bare number as text) -> number and unit text ("" when bare).
 * Returns 0, or -1 when it is neither. */
int gc_api_value_split(struct json_t *v, double *num, char *unit, size_t unit_len);
/* The inverse: a JSON number (an integer when whole) or "<number> <unit>". */
struct json_t *gc_api_value_make(double num, const char *unit);
/* The quantity whose label in unit system sys is label (first in enum
 * order: "K" is a temperature), or -1. */
int gc_api_label_quantity(const char *label, int unit_system);
/* Sets value (stolen) at an RFC 6901 pointer of root, creating objects on
 * the way. Returns 0, or -1 when a step is not an object. */
int gc_api_pointer_set(struct json_t *root, const char *pointer, struct json_t *value);
/* "pressure_ratio" or "site.altitude" or "/site/altitude" -> "/site/altitude"
 * in out (size n). Returns 0, or -1 for an empty or malformed name. */
int gc_api_input_pointer(const char *name, char *out, size_t n);
/* The opening of the composite routes (batch, sweeps, targets): *o
 * initialised, errs initialised, the output parameters read (accepted:
 * GC_OUT_ACCEPT_*), the request body or query normalised into *root (new
 * reference). Returns 0; or 1 when resp already holds the answer (503, 400,
 * or the normaliser's problem; o freed), the handler then returns *rc. */
int gc_api_composite_begin(const gc_api_request *req, unsigned accepted, struct gc_out *o,
                           struct gc_api_errors *errs, struct json_t **root,
                           gc_api_response *resp, int *rc);
/* Adds an "unknown field" error (with the closest of keys, NULL-terminated,
 * when one is close) for every member of obj not in keys; fields are base
 * plus the member's name. */
void gc_api_unknown_keys(struct json_t *obj, const char *base, const char *const *keys,
                         struct gc_api_errors *errs);
/* The last token of a JSON pointer ("/states/0/T" -> "T"). */
const char *gc_api_pointer_last(const char *pointer);
/* A pointer as a dotted name ("/site/altitude" -> "site.altitude") in name (size n). */
void gc_api_pointer_name(const char *pointer, char *name, size_t n);
/* Copies an inner result's warnings into o (fields prefixed with
 * "/inputs"), each code and field once (seen: an object for the dedup). */
void gc_api_inner_warnings(struct gc_out *o, struct json_t *inner_body, struct json_t *seen);

#endif
