/*
 * decode.h — private to the API layer: the one request-decoding path every
 * route uses, and the declarative field specs that validate a request and
 * fill a C struct in SI units.
 *
 * Normalisation (gc_decode_normalise): a POST body in JSON, or the same
 * fields as GET query parameters with dots for nesting (site.altitude=300 is
 * {"site":{"altitude":"300"}}), become one jansson object. The output
 * parameters (output.h: format, units, select, ...) are never input fields.
 * Unreadable requests are 400: malformed JSON (line and column), an empty
 * POST body, duplicate keys, nesting deeper than GC_DECODE_MAX_DEPTH, a body
 * that is not an object, conflicting or repeated query keys; a Content-Type
 * other than JSON is 415.
 *
 * Validation (gc_decode_fields): walks a field-spec table. Every bad field is
 * collected (422), with field = the JSON pointer ("/site/altitude") and a
 * reason ("must be greater than 1", "unit 'bar' is a pressure, expected a
 * temperature"). Unknown fields are errors naming the closest known one.
 * Query values are strings: "300", "25 degC", "true" read the same as the
 * JSON 300, "25 degC", true; so GET and POST give identical structs.
 * null counts as a wrong type (leave a field out to get its default).
 *
 * A route declares its fields once, e.g.
 *
 *   typedef struct { double T_K, P_Pa; int gas; } my_req;
 *   static const gc_field_spec my_fields[] = {
 *       GC_F_NUM("T", GC_Q_TEMPERATURE, my_req, T_K, .flags = GC_F_REQUIRED | GC_F_MIN
 *                | GC_F_MIN_EXCL, .min = 0.0, .description = "Temperature"),
 *       GC_F_NUM("P", GC_Q_PRESSURE, my_req, P_Pa, .def = 101325.0,
 *                .flags = GC_F_MIN | GC_F_MIN_EXCL, .description = "Pressure"),
 *       GC_F_END
 *   };
 *
 * (see properties.c for a complete one) and decodes with gc_decode_request,
 * which also builds the "inputs" echo (defaults filled in, in the output unit
 * system) in the gc_out.
 */
#ifndef GC_API_DECODE_H
#define GC_API_DECODE_H

#include "api/respond/output.h"
#include "api/respond/problem.h"
#include "gascycle/units.h"

#include <jansson.h>
#include <stddef.h>

#define GC_DECODE_MAX_DEPTH 16      /* nesting levels of objects/arrays, root = 1 */
#define GC_DECODE_MAX_STRING 64     /* bytes of a GC_FIELD_STRING target, with NUL */

typedef enum gc_spec_type {
    GC_FIELD_NUMBER = 0,  /* number in the quantity's default unit, or "<number> <unit>" -> double, SI */
    GC_FIELD_INTEGER,     /* whole number -> int (min/max apply) */
    GC_FIELD_BOOL,        /* true/false -> int 0/1 */
    GC_FIELD_ENUM,        /* one of enum_values -> int index */
    GC_FIELD_STRING,      /* free text -> char[GC_DECODE_MAX_STRING] */
    GC_FIELD_OBJECT,      /* nested object: children */
    GC_FIELD_VARIANT,     /* "name" or {"model": "name", members of that variant} -> int index */
    GC_FIELD_CUSTOM       /* decoded by the custom callback */
} gc_spec_type;

/* flags */
#define GC_F_REQUIRED  0x01u   /* must be given (no default) */
#define GC_F_MIN       0x02u   /* min applies */
#define GC_F_MAX       0x04u   /* max applies */
#define GC_F_MIN_EXCL  0x08u   /* min is exclusive (value > min) */
#define GC_F_MAX_EXCL  0x10u   /* max is exclusive (value < max) */
#define GC_F_NO_ECHO   0x20u   /* left out of the "inputs" echo */
#define GC_F_NO_DEFAULT 0x40u  /* number: optional with no default, echoed only when given */

typedef struct gc_field_spec gc_field_spec;
typedef struct gc_decoder gc_decoder;

/* Custom decoder: value is the given JSON (a string for query input), or NULL
 * when the field is absent (then apply the default). Report problems with
 * gc_decode_error; add the echo to echo_parent under f->name (may be NULL).
 * Returns 0 or -1. */
typedef int (*gc_field_custom_fn)(gc_decoder *d, const gc_field_spec *f, json_t *value,
                                  const char *pointer, void *target, json_t *echo_parent);

typedef struct gc_variant_spec {
    const char *name;               /* discriminator value, e.g. "cold" */
    const gc_field_spec *fields;    /* its members besides "model", GC_F_END-terminated, or NULL */
    const char *description;
} gc_variant_spec;

struct gc_field_spec {
    const char *name;               /* member name (snake_case or a trade symbol: "T") */
    gc_spec_type type;
    gc_quantity quantity;           /* GC_FIELD_NUMBER */
    unsigned flags;                 /* GC_F_* */
    double def;                     /* default, SI base units (NUMBER, INTEGER, BOOL, ENUM index) */
    double min, max;                /* bounds, SI base units */
    const char *const *enum_values; /* GC_FIELD_ENUM: NULL-terminated */
    const char *def_string;         /* default of GC_FIELD_STRING / GC_FIELD_VARIANT name */
    const gc_field_spec *children;  /* GC_FIELD_OBJECT members */
    const gc_variant_spec *variants;/* GC_FIELD_VARIANT: NULL-name terminated */
    gc_field_custom_fn custom;      /* GC_FIELD_CUSTOM */
    size_t offset;                  /* target member (offsetof in the route's struct) */
    size_t present;                 /* offsetof(int member) + 1 set to 1 when given; 0 = none */
    const char *description;        /* one line (the OpenAPI document carries the full text) */
};

#define GC_F_END { .name = NULL }
/* Row helpers: the remaining designated initialisers (at least .description)
 * follow the member. */
#define GC_F_NUM(nm, q, st, member, ...) \
    { .name = nm, .type = GC_FIELD_NUMBER, .quantity = q, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_INT(nm, st, member, ...) \
    { .name = nm, .type = GC_FIELD_INTEGER, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_BOOL(nm, st, member, ...) \
    { .name = nm, .type = GC_FIELD_BOOL, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_ENUM(nm, vals, st, member, ...) \
    { .name = nm, .type = GC_FIELD_ENUM, .enum_values = vals, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_STR(nm, st, member, ...) \
    { .name = nm, .type = GC_FIELD_STRING, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_OBJ(nm, kids, ...) \
    { .name = nm, .type = GC_FIELD_OBJECT, .children = kids, __VA_ARGS__ }
#define GC_F_VARIANT(nm, vars, st, member, ...) \
    { .name = nm, .type = GC_FIELD_VARIANT, .variants = vars, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_F_CUSTOM(nm, fn, st, member, ...) \
    { .name = nm, .type = GC_FIELD_CUSTOM, .custom = fn, .offset = offsetof(st, member), __VA_ARGS__ }
#define GC_PRESENT(st, member) (offsetof(st, member) + 1)

/* ---- readings in context (issue 17) ------------------------------------------------------
 *
 * How the request's numbers are read (query parameters input_units= and
 * decimal=, output.h), and the values that need more than their own text:
 * a gauge pressure ("5 barg") needs the barometric pressure, a standard
 * volume flow ("12000 Sm3/h") the fuel's density. Decoding leaves those in
 * the context with their targets; the route completes them once the whole
 * request is decoded (the site and the fuel may come later in the request):
 * request/context.c. The context also keeps the unit each value was written
 * in, so messages about it speak that unit (respond/localise.c), and what it
 * used, for the echo ("input_units", "barometric_pressure", ...). */

#define GC_DECODE_MAX_DEFERRED 16
#define GC_DECODE_MAX_WRITTEN 32

struct gc_field;
struct gc_api_scan;

typedef struct gc_decode_deferred {
    char pointer[GC_API_FIELD_LEN];     /* the value's JSON pointer */
    double *target;                      /* where its SI value goes */
    const struct gc_field *row;          /* its preset row (bounds), or NULL */
    const gc_field_spec *spec;           /* its field spec (bounds), or NULL */
    json_t *echo;                        /* the echo object to complete (spec path), or NULL */
    const char *echo_key;                /* its key there */
    gc_reading r;                        /* as read */
} gc_decode_deferred;

typedef struct gc_decode_ctx {
    gc_units_opts opts;                  /* input_units=, decimal= */
    int n;                               /* deferred readings */
    gc_decode_deferred d[GC_DECODE_MAX_DEFERRED];
    int n_written;                       /* values given with a unit */
    struct { char pointer[GC_API_FIELD_LEN]; char unit[32]; } written[GC_DECODE_MAX_WRITTEN];
    /* what completing the deferred readings used (the echo states it) */
    int baro_used;
    double baro_Pa;                      /* barometric pressure, Pa */
    const char *baro_source;             /* "site_pressure", "site_altitude", "site_default",
                                            "ambient_pressure", "intake_pressure",
                                            "standard_atmosphere" */
    int std_used;
    gc_std_conditions std_cond;          /* the first standard volume's conditions */
    double std_density;                  /* the fuel's density there, kg/m3 */
    struct gc_api_scan *scan;            /* series members of the body read by the scanner
                                            (series_scan.h), or NULL */
} gc_decode_ctx;

/* A context with the default reading (si, decimal point). */
void gc_decode_ctx_init(gc_decode_ctx *c);

/* The unit the value at pointer was written in, or NULL (a plain number). */
const char *gc_decode_ctx_unit(const gc_decode_ctx *c, const char *pointer);

struct gc_decoder {
    gc_api_errors *errs;     /* where field errors go */
    gc_out *out;             /* for the echo's unit conversion, or NULL */
    int from_query;          /* 1 when the values came from a query string */
    gc_decode_ctx *ctx;      /* reading options and deferred readings, or NULL (defaults:
                                gauge pressures and standard volumes refused) */
};

/* Normalises the request into *root (new reference). On failure fills resp
 * with a 400/415 problem and returns -1. */
int gc_decode_normalise(const gc_api_request *req, json_t **root, gc_api_response *resp);
/* The same; diagram: 1 on a cycle route, whose diagram options (scale,
 * overlay, width, height) are output parameters, left out of *root. */
int gc_decode_normalise_ex(const gc_api_request *req, int diagram, json_t **root,
                           gc_api_response *resp);

/* Validates root against fields and fills target; echo (may be NULL)
 * receives the normalised inputs. Returns the number of errors added. */
int gc_decode_fields(gc_decoder *d, const gc_field_spec *fields, json_t *root,
                     const char *pointer, void *target, json_t *echo);

/* The whole path: output parameters (accepted: GC_OUT_ACCEPT_*), normalise,
 * validate, echo into out->inputs. Returns 0 when target is filled; else
 * resp holds the problem (400, 415 or 422) and -1 is returned (the caller then
 * calls gc_out_free and returns). out must be gc_out_init'ed. */
int gc_decode_request(const gc_api_request *req, const gc_field_spec *fields,
                      unsigned accepted, void *target, gc_out *out, gc_api_response *resp);

/* A query string's plain decimal number (no unit, no hex, inf or nan,
 * spaces around allowed) into *x (skipped leading spaces: *text points past
 * them, for the message). 0, or -1 when it is not one. */
int gc_decode_plain_text(const char **text, double *x);

/* Helpers for custom decoders. */
void gc_decode_error(gc_decoder *d, const char *pointer, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
/* A quantity value (number or string with unit) -> SI; 0, or -1 with an error added.
 * Gauge pressures and standard volumes are refused here (no context). */
int gc_decode_number(gc_decoder *d, json_t *value, const char *pointer, gc_quantity q,
                     double *si_value);
/* The same for a value whose target is known: a gauge pressure or a standard
 * volume is left in d->ctx (when there is one) to be completed, *si_value
 * untouched, and 1 returned; row or spec gives its bounds. 0 when *si_value
 * holds the value; -1 with an error added. */
int gc_decode_number_at(gc_decoder *d, json_t *value, const char *pointer, gc_quantity q,
                        double *si_value, const struct gc_field *row, const gc_field_spec *spec);
/* A range error on pointer, its bounds in the unit the value was written in
 * (core sentence msg, numbers in the si default unit). */
void gc_decode_range_error(gc_decoder *d, const char *pointer, gc_quantity q, const char *msg);
/* The bounds of spec for v (SI); 0, or -1 with the error added. */
int gc_decode_check_spec(gc_decoder *d, const char *pointer, const gc_field_spec *spec, double v);
/* The members of a non-empty object {"N2": 0.78, "O2": "21 %", ...} (the
 * caller checks that it is one): species names (species.h) -> mole fractions
 * in [0, 1], into ids[] and x[] (room for GC_GAS_MAX_SPECIES), their count
 * into *n; echoed into echo (may be NULL) under the species' own names.
 * Every bad member gets its error (unknown species, bad fraction, a species
 * named twice, too many species); the sum is not checked. dup_check_first:
 * nonzero checks a member against the ones before it before the count limit,
 * zero the other way round (each caller keeps its own error order). Returns
 * 0, or -1 when any member was bad. */
int gc_decode_mole_fractions(gc_decoder *d, json_t *value, const char *pointer, int *ids,
                             double *x, int *n, json_t *echo, int dup_check_first);

/* An array input that GET may give as one comma list: for a query string
 * "a,b,c" a new array of the strings "a", "b", "c" (also in *owned, for the
 * caller to json_decref); otherwise value itself (borrowed, *owned = NULL). */
json_t *gc_decode_list(gc_decoder *d, json_t *value, json_t **owned);

/* Closest of the NULL-terminated names to s (edit distance small enough to
 * be a likely typo), or NULL. */
const char *gc_decode_suggest(const char *s, const char *const *names, size_t n_names);

/* names[0..n) joined by ", " (quoted with '' when quote) into buf of size
 * room, never cut inside a name: what does not fit ends the list as
 * " and N more". Returns N (0 when all fit). */
size_t gc_decode_name_list(char *buf, size_t room, const char *const *names, size_t n,
                           int quote);

/* Levenshtein distance of two strings (ASCII, case-insensitive), capped at 99. */
int gc_decode_edit_distance(const char *a, const char *b);

#endif
