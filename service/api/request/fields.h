/*
 * fields.h — private to the API layer: decoding a request into a preset's
 * own input struct through its field table (gascycle/preset.h), and the
 * JSON pointer of a field id.
 *
 * The request is first normalised into one jansson object (decode.h:
 * gc_decode_normalise: a POST body, or the dotted query parameters of a
 * GET). Every member is checked against its row: type, unit, bounds (the
 * table's, with the core's own sentence, gc_field_check_value), enum names,
 * list lengths; unknown members name the closest known one. Every bad
 * member is collected (422), each with its JSON pointer. The input struct
 * must hold its defaults (gc_preset_input_init) before decoding; decoding
 * sets the given members and their `given` flags.
 */
#ifndef GC_API_FIELDS_H
#define GC_API_FIELDS_H

#include "api/request/decode.h"
#include "api/respond/problem.h"
#include "gascycle/preset.h"

#include <jansson.h>

/* Decodes root into input through p's table; errors go to errs with
 * pointers under base ("" for a request, "/inputs" for a composite's
 * inputs). ctx: the reading options (input_units, decimal commas) and the
 * place for gauge pressures and standard volumes, completed here once the
 * whole request is decoded (context.c); NULL: the defaults, those refused.
 * Returns the number of errors added. */
int gc_api_fields_decode(const gc_preset *p, json_t *root, int from_query, void *input,
                         const char *base, gc_api_errors *errs, gc_decode_ctx *ctx);

/* Completes the readings d->ctx holds (gauge pressures, standard volumes)
 * for preset p's input (p NULL: a route without a preset: the standard
 * atmosphere, no fuel). Returns the number of errors added. */
int gc_decode_ctx_complete(gc_decoder *d, const gc_preset *p, void *input);

/* 1 when row is a number or integer reached through objects only (no list,
 * gas or fuel on its way): one the composites may set by itself. */
int gc_api_field_settable(const gc_preset *p, int row);

/* Decodes v as the value of row alone into input (as gc_api_fields_decode
 * would decode it within a whole request: same sentences, bounds and given
 * flag). Returns the number of errors added. */
int gc_api_field_set(const gc_preset *p, int row, json_t *v, int from_query, void *input,
                     const char *base, gc_api_errors *errs, gc_decode_ctx *ctx);

/* Frees what decoding allocated in input (the arrays of pair lists and series
 * at the top of the table; a csv_body hook's too). */
void gc_api_fields_release(const gc_preset *p, void *input);

/* The JSON pointer of field id f (list indices idx, may be NULL) of p, after
 * prefix (may be NULL), into buf (size n). */
void gc_api_field_pointer(const gc_preset *p, int f, const int idx[2], const char *prefix,
                          char *buf, size_t n);

/* The field id a JSON pointer names in p's table ("/site/altitude",
 * "/steps/2/end/temperature"), with its list indices in idx; -1 when none. */
int gc_api_field_find(const gc_preset *p, const char *pointer, int idx[2]);

#endif
