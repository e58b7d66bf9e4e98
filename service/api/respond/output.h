/*
 * output.h — private to the API layer: the tree-building response builder of
 * the routes that are not presets (properties, gases) and of the composite
 * routes' own documents (sweeps, targets, batch; a preset's answer is
 * written from its structs by respond.h instead). It owns the output
 * parameters of a request (given in the query string for GET and POST
 * alike; the preset routes parse them with request/params.h):
 *   format=json|csv|svg  json (default) names its units in a "units" object;
 *                        csv prints the document's "states" and "processes"
 *                        arrays (or a one-row table) as RFC 4180 tables with a
 *                        header row carrying the units; svg (the preset routes'
 *                        diagram) is parsed here for them.
 *   units=si|us          output unit system (units.h); si is the default.
 *   select=<pointer>     RFC 6901 JSON pointer into the response document; a
 *                        scalar comes back bare as text/plain, an object or
 *                        array as JSON.
 *   table=states|processes|summary   with format=csv: only that table.
 *   diagram, include, points  reserved for later routes (kept raw here).
 *   input_units=si|us    the unit system of plain numbers in the inputs (a
 *                        number without a unit); si is the default. Every
 *                        evaluation echoes it in "inputs".
 *   decimal=point|comma  comma: input numbers may be written with a decimal
 *                        comma ("0,55"; GET lists then separate their values
 *                        with ';'), and a select= answer and CSV are written
 *                        with decimal commas (CSV then separates with ';').
 *   on_error=problem|text|cell  text: an error answer is its first message
 *                        as text/plain (the status stays the problem's);
 *                        cell: the same after "error <status>: " with status
 *                        200, for a spreadsheet cell (respond/forms.c).
 * A request may also ask for CSV with the header Accept: text/csv (as
 * format=csv; an explicit format= wins).
 *
 * Values go into a document through gc_out_q (a value in SI with its
 * quantity: converted to the chosen system and its unit recorded in "units"
 * under the same key) and gc_out_num (a plain number). Both refuse NaN and
 * Infinity: the value becomes null, the place is remembered, and
 * gc_out_respond then answers 422 "result not finite" instead of a result.
 *
 * Ownership: gc_out_init creates the units/warnings/inputs containers;
 * gc_out_respond steals the document and releases everything; call
 * gc_out_free on paths that never reach gc_out_respond.
 */
#ifndef GC_API_OUTPUT_H
#define GC_API_OUTPUT_H

#include "api/respond/problem.h"
#include "gascycle/units.h"

#include <jansson.h>

enum gc_out_format { GC_FMT_JSON = 0, GC_FMT_CSV = 1, GC_FMT_SVG = 2 };
enum gc_out_table { GC_TABLE_ALL = 0, GC_TABLE_STATES = 1, GC_TABLE_PROCESSES = 2,
                   GC_TABLE_SUMMARY = 3 };

/* Output parameters a route accepts (gc_out_parse_params `accepted`). */
#define GC_OUT_ACCEPT_UNITS   0x01u
#define GC_OUT_ACCEPT_CSV     0x02u
#define GC_OUT_ACCEPT_SELECT  0x04u
#define GC_OUT_ACCEPT_SVG     0x08u   /* format=svg and diagram */
#define GC_OUT_ACCEPT_INCLUDE 0x10u
#define GC_OUT_ACCEPT_POINTS  0x20u
#define GC_OUT_ACCEPT_INPUT_UNITS 0x80u   /* input_units (a route with inputs) */
#define GC_OUT_ACCEPT_DECIMAL 0x100u  /* decimal (a route whose numbers the decoder reads) */
#define GC_OUT_ACCEPT_READ (GC_OUT_ACCEPT_INPUT_UNITS | GC_OUT_ACCEPT_DECIMAL)
#define GC_OUT_ACCEPT_EVAL (GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV | GC_OUT_ACCEPT_SELECT | \
                            GC_OUT_ACCEPT_SVG | GC_OUT_ACCEPT_READ)

/* Flags for gc_out_respond. */
#define GC_OUT_EVALUATION 0x01u   /* add "inputs", "warnings" and "cautions" */

#define GC_OUT_MAX_RAW 100

typedef struct gc_out {
    gc_unit_system sys;        /* units= */
    gc_unit_system input_sys;  /* input_units= */
    int decimal_comma;         /* decimal=comma */
    int csv_by_accept;         /* format=csv came from the Accept header */
    int format;                /* enum gc_out_format */
    int table;                 /* enum gc_out_table */
    const char *select;        /* JSON pointer (borrowed from the request) or NULL */
    const char *diagram;       /* raw, borrowed, or NULL */
    const char *include;       /* raw, borrowed, or NULL */
    const char *points;        /* raw, borrowed, or NULL */
    const char *csv_row;       /* document member printed as a one-row CSV table
                                  when there are no states/processes, or NULL */
    json_t *units;             /* key -> unit label (owned) */
    json_t *warnings;          /* array of {code, field?, message} (owned) */
    json_t *inputs;            /* normalised inputs, defaults filled (owned) */
    json_t *written;           /* pointer -> the unit a value was written in, for
                                  messages in the user's units (owned, or NULL) */
    int nonfinite;             /* number of values refused as NaN/Infinity */
    char nonfinite_at[GC_API_FIELD_LEN]; /* key of the first one */
    /* members given as JSON text (gc_out_raw_member) */
    int n_raw;
    json_t *raw_parent[GC_OUT_MAX_RAW];  /* the objects holding them (borrowed) */
    const char *raw_key[GC_OUT_MAX_RAW]; /* their keys (static) */
    json_t *raw_hole[GC_OUT_MAX_RAW];    /* their places (borrowed) */
    char *raw[GC_OUT_MAX_RAW];           /* their texts (owned) */
    size_t raw_len[GC_OUT_MAX_RAW];
} gc_out;

/* Sets the member key (static) of object `parent` (a part of the document)
 * to the JSON text `text` (malloc'd, owned from now on): written into the
 * body as it is, parsed only when the answer needs the tree (select=).
 * Returns 0, or -1 (more than GC_OUT_MAX_RAW: text parsed and set now, or
 * freed with null set when it is not JSON). */
int gc_out_raw_member(gc_out *o, json_t *parent, const char *key, char *text, size_t len);

/* Names reserved for output parameters (NULL-terminated): never input fields. */
extern const char *const gc_out_reserved[];
int gc_out_is_reserved(const char *name);

/* Sets defaults and creates the containers; -1 when memory ran out. */
int gc_out_init(gc_out *o);
void gc_out_free(gc_out *o);

/* Reads the output parameters from req->query (and Accept: text/csv); bad or
 * unaccepted values are appended to errs (field "/format", "/units" ...).
 * Returns the number of errors added. */
int gc_out_parse_params(gc_out *o, const gc_api_request *req, unsigned accepted,
                        gc_api_errors *errs);

/* obj[key] = si_value converted to o->sys for quantity q; units[key] = label.
 * Returns 0, or -1 for a non-finite value (stored as null, remembered). */
int gc_out_q(gc_out *o, json_t *obj, const char *key, double si_value, gc_quantity q);

/* obj[key] = v (no unit). Same NaN/Infinity guard. */
int gc_out_num(gc_out *o, json_t *obj, const char *key, double v);

/* Appends {code, field, message} to warnings (field may be NULL). */
void gc_out_warn(gc_out *o, const char *code, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

/* The cautions every evaluation carries (a new array). */
json_t *gc_out_cautions(void);

/* Finishes doc (stolen) and encodes it per the output parameters into resp:
 * 200 with JSON, CSV, text/plain or SVG; or a problem: 422 not finite, 400 for
 * a select pointer with no value or an unavailable format. Always returns 0
 * (resp is filled; on memory exhaustion with a 503 problem). */
int gc_out_respond(gc_out *o, json_t *doc, unsigned flags, gc_api_response *resp);

/* A number as answer text: "%.10g", with a decimal comma when comma. */
void gc_out_number_text(char *buf, size_t n, double v, int comma);

/* Resolves an RFC 6901 pointer ("" = the whole document); NULL when absent
 * or malformed. Borrowed reference. */
json_t *gc_out_pointer(json_t *doc, const char *pointer);

/* Appends key as one RFC 6901 reference token ("/" + key with ~ -> ~0 and
 * / -> ~1) to the pointer in buf (NUL-terminated, size n); truncates. */
void gc_out_pointer_append(char *buf, size_t n, const char *key);

#endif
