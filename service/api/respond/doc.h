/*
 * doc.h — private to the API layer: the response document of a preset,
 * written straight from its input and result structs through its
 * descriptor (gascycle/preset.h) with the streaming writer (jw.h).
 *
 * Document: {"cycle"|"reduction": name, "title", the cycle parts (cycle
 * presets, cycle.c: model, states, stations, processes, summary, bounds,
 * checks, paths), the preset's own outputs in table order, "inputs" (the
 * echo: every input with its default filled in, from the echo copy of the
 * input, then how it was read: "input_units" always; "decimal" with decimal
 * commas; "barometric_pressure" and "barometric_pressure_source" when a
 * gauge pressure was read; "standard_conditions" and
 * "fuel_density_standard" when a volume flow at standard conditions was),
 * "warnings", "cautions", "unit_system", "units"}.
 */
#ifndef GC_API_DOC_H
#define GC_API_DOC_H

#include "api/request/decode.h"
#include "api/respond/jw.h"
#include "gascycle/preset.h"

/* What the document writer needs besides the structs. */
typedef struct gc_api_docopts {
    int include_paths;          /* 1: the "paths" member (include=paths) */
    int points;                 /* points per process in paths */
    const char *warn_prefix;    /* before every warning's field pointer ("/inputs" in a
                                   composite), or NULL */
    unsigned include;           /* the preset's optional parts asked for (include=<name>:
                                   bit i for gc_preset.includes[i]) */
    const gc_decode_ctx *ctx;   /* how the inputs were read (echoed: input_units, decimal,
                                   barometric_pressure, standard_conditions), or NULL */
} gc_api_docopts;

/* The whole document of one evaluation into w. echo: the input as echoed
 * (the preset's echo hook applied), result and rep: the evaluation's. */
void gc_api_write_document(gc_jw *w, const gc_preset *p, const void *echo, const void *result,
                           const gc_report *rep, const gc_api_docopts *o);

/* The "inputs" echo object (key "inputs") of echo through p's table. */
void gc_api_write_echo(gc_jw *w, const gc_preset *p, const void *echo, const void *result);

/* The preset's output rows under parent (-1: top), as members of the open
 * object (or elements of the open array). skip_sections: leave out the
 * top rows that extend the cycle parts (model, summary, bounds). */
void gc_api_write_outputs(gc_jw *w, const gc_preset *p, int parent, const void *input,
                          const void *result, const char *item, int skip_sections);

/* One output row (and its children) as a member of the open container. */
void gc_api_write_output(gc_jw *w, const gc_preset *p, int row, const void *input,
                         const void *result, const char *item);

/* The warnings as the "warnings" array: a cycle's close_mismatch (its
 * values in the writer's units) first, then rep's (fields as JSON pointers
 * after prefix, may be NULL). */
void gc_api_write_warnings(gc_jw *w, const gc_preset *p, const void *result,
                           const gc_report *rep, const char *prefix);

/* A member the generic cycle writer writes into a part of every cycle
 * document, described once (cycle.c; the OpenAPI generator reads it). */
typedef struct gc_api_member {
    const char *name;
    int quantity;               /* gc_quantity, or -1: a plain number */
    int always;                 /* 1: in every document (else only where it applies) */
    const char *description;
} gc_api_member;

/* The engine's summary members, in the order they are written (NULL name
 * ends the list). */
extern const gc_api_member gc_api_summary_members[];

/* The cycle parts of a cycle preset (cycle.c). */
void gc_api_write_cycle(gc_jw *w, const gc_preset *p, const void *input, const void *result,
                        const gc_api_docopts *o);

/* The echo copy of input: the preset's echo hook, or input itself. Returns
 * the struct to echo (buf when the hook ran; buf must hold input_size). */
const void *gc_api_echo_input(const gc_preset *p, const void *input, const void *result,
                              void *buf);

#endif
