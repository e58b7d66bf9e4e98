/*
 * params.h — private to the API layer: the output parameters of a request
 * (always in the query string, for GET and POST alike), parsed without
 * building anything:
 *   format=json|csv|svg   units=si|us   select=<RFC 6901 pointer>
 *   input_units=si|us   decimal=point|comma   on_error=problem|text|cell (output.h)
 *   table=states|processes (csv)   include=paths   points=N (paths, svg)
 *   include=<part>[,<part>] (a preset's own optional parts, gc_preset.includes)
 *   diagram=Ts|Pv|hs, scale=linear|log, overlay=ideal,carnot|none,
 *   width=, height= (svg; cycle routes only)
 * Bad or unaccepted values are errors on "/<name>" (400), with the same
 * sentences as output.h's parser, which the other routes still use.
 */
#ifndef GC_API_PARAMS_H
#define GC_API_PARAMS_H

#include "api/request/decode.h"
#include "api/respond/output.h"
#include "api/respond/problem.h"
#include "gascycle/diagram.h"

/* Accepted by cycle routes besides GC_OUT_ACCEPT_*: the diagram options. */
#define GC_PARAMS_ACCEPT_DIAGRAM 0x40u

typedef struct gc_api_params {
    gc_unit_system sys;          /* units= */
    gc_unit_system input_sys;    /* input_units= */
    int decimal_comma;           /* decimal=comma (select text and CSV written with it) */
    const gc_decode_ctx *ctx;    /* how the inputs were read (the echo states it), or NULL */
    int format;                  /* enum gc_out_format */
    int table;                   /* enum gc_out_table */
    const char *select;          /* borrowed from the request, or NULL */
    int include_paths;           /* include=paths */
    unsigned include;            /* include=<part>,...: bit i for the preset's includes[i] */
    int points;                  /* points per process (paths and SVG) */
    gc_diagram_options diagram;  /* format=svg */
    const char *diagram_name;    /* diagram= as given (borrowed), or NULL: a cycle kind
                                    (diagram.kind) or one of a preset's own diagrams */
} gc_api_params;

/* Parses the output parameters of req; parts: the preset's optional parts
 * (gc_preset.includes; NULL: include=paths of a cycle route). Returns the
 * number of errors added. */
int gc_api_params_parse(gc_api_params *v, const gc_api_request *req, unsigned accepted,
                        const char *const *parts, gc_api_errors *errs);

/* 1 for a query key that is an output parameter of a route accepting
 * `accepted` (never an input field). */
int gc_api_params_is_output(const char *key, unsigned accepted);

#endif
