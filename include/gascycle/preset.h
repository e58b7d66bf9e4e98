/*
 * preset.h — the preset descriptor: every cycle preset (otto ... carnot,
 * brayton, turbojet, custom) and every measured-data reduction (stations,
 * pressure trace) is declared once, as one gc_preset, and everything else
 * reads that declaration: the API layer's decoder, the "inputs" echo, the
 * JSON/CSV/select writers, the OpenAPI schemas (tools/gen_openapi.c), the
 * composite routes (sweeps, targets, batch) and in-process callers
 * (uncertainty propagation, the machine model).
 *
 * A descriptor holds
 *   - its input fields: a flat table of gc_field, one row per input (nested
 *     members point at their parent row). A row's index is its FIELD ID: the
 *     core reports errors and warnings by field id (+ list index), and only
 *     the API layer turns ids into JSON pointers. Row 0 is the request as a
 *     whole (errors about no one input name it). Each row gives the member's
 *     type, quantity (units.h), default, bounds in SI base units, where it
 *     lives in the preset's own input struct, and the description that the
 *     OpenAPI document carries (unit-free: the generator adds the unit);
 *   - its outputs: a flat table of gc_output (a tree by parent row) of the
 *     figures the preset adds to the response document, each with its
 *     quantity, place in the result struct and description. The cycle parts
 *     of a cycle preset (model, states, stations, processes, summary, bounds,
 *     checks, paths) are written once for every preset from the embedded
 *     gc_cycle_result; a preset's rows named "summary", "model" or "bounds"
 *     add to (or replace same-named members of) those parts;
 *   - init (extra defaults beyond the table), evaluate (validated input ->
 *     result + report), echo (the input as the response echoes it, defaults
 *     resolved), and accessors (the gc_cycle_result of a result, the resolved
 *     site, a title that depends on the inputs).
 *
 * Bounds and defaults exist once, here: gc_preset_input_init writes every
 * default, gc_preset_validate checks every given number against its bounds
 * with the same sentence the decoder uses (gc_field_check_value), so an
 * in-process caller that sets a member directly meets the same refusal as a
 * request.
 *
 * Conventions of the input structs: numbers in SI base units (double),
 * integers, booleans and enum indices as int, strings as char arrays of
 * GC_FIELD_STRING_LEN. An optional number without a default holds GC_UNSET
 * while it is not given. A row's `given` names an int member set to 1 when
 * the request gives the input (0: no such flag).
 *
 * Thread safety: descriptors are const static data; evaluations share
 * nothing. Units: SI base units in every struct (units.h).
 */
#ifndef GASCYCLE_PRESET_H
#define GASCYCLE_PRESET_H

#include "gascycle/cycle.h"
#include "gascycle/diagram.h"
#include "gascycle/error.h"
#include "gascycle/site.h"
#include "gascycle/units.h"
#include "gascycle/validity.h"

#include <stddef.h>

#define GC_UNSET (-1.0e300)                  /* an optional number that was not given */
#define GC_IS_SET(x) ((x) > -1.0e299)
#define GC_FIELD_STRING_LEN 64               /* bytes of a string input, NUL included */
#define GC_REPORT_MAX_WARNINGS 16
#define GC_REPORT_MAX_ERRORS 16
#define GC_WARNING_LEN 512

/* ---- input fields ---------------------------------------------------------- */

typedef enum gc_field_type {
    GC_FT_NUMBER = 0,    /* double, SI, of `quantity`; given as a number in the quantity's
                            default unit or as "<number> <unit>" */
    GC_FT_INTEGER,       /* int, a whole number */
    GC_FT_BOOL,          /* int 0/1 */
    GC_FT_ENUM,          /* int index into `names` */
    GC_FT_STRING,        /* char[GC_FIELD_STRING_LEN] */
    GC_FT_OBJECT,        /* groups its child rows (no storage of its own) */
    GC_FT_LIST,          /* array of objects: items of item_size bytes at offset, the
                            count (int) at count; child rows are relative to an item */
    GC_FT_NUMBER_LIST,   /* array of numbers (double[] at offset, int count at count);
                            GET: one comma list */
    GC_FT_GAS,           /* working-fluid model: a gc_gas at offset, given as a model
                            name or {"model": name, members}; child rows (cp, k) belong
                            to the variant named by their `variant` and are stored in
                            the gc_gas */
    GC_FT_FUEL,          /* a fuel (combustion.h): a name, {"analysis": {species:
                            fraction}} or {"formula", "lower_heating_value",
                            "liquid_cp"}; gc_fuel at offset, its gc_fuel_spec at aux */
    GC_FT_PAIR_LIST,     /* array of [x, y] pairs of plain numbers (doubles x[] at
                            offset, y[] at aux, count at count); GET: one comma list of
                            alternating values */
    GC_FT_PRESET,        /* another preset's whole request, given as {"cycle": name,
                            "inputs": {...}} (a combined cycle's topping cycle): `presets`
                            lists the descriptors it may name; the index of the one named
                            is the int at count - 1 (default: def), its input struct (its
                            own table's defaults, then the members given, decoded through
                            its table) the item_size bytes at offset; aux: offset + 1 of
                            its result in the preset's RESULT struct (for the echo).
                            Errors inside it carry their path as text ("/topping/inputs/
                            pressure_ratio", gc_report_nested), not a field id */
    GC_FT_SERIES,        /* array of min_items..max_items plain numbers (no unit per value: the
                            row's description says which); a double * at offset allocated by
                            the decoder (freed by the API's release), the count (int) at
                            count; min/max (flags MIN, MAX) bound every value; GET: one comma
                            list */
    GC_FT_SERIES_LIST,   /* array of min_items..max_items such series, all of one length within
                            min_values..max_values: one double * at offset, series after
                            series (series i at [i * length]), the series count at count, the
                            length (int) at aux; GET: one key per series, numbered from 0
                            ("cycles.0=...&cycles.1=..."), each a comma list. Errors name
                            "/<row>/<series>/<value>" (index[0], index[1]) */
    GC_FT_TYPE_COUNT
} gc_field_type;

/* gc_field.flags */
#define GC_FF_REQUIRED   0x0001u  /* must be given */
#define GC_FF_OPTIONAL   0x0002u  /* no default: absent means not given (a number then
                                     holds GC_UNSET, or `given` stays 0); echoed only
                                     when given */
#define GC_FF_MIN        0x0004u  /* min applies */
#define GC_FF_MAX        0x0008u  /* max applies */
#define GC_FF_MIN_EXCL   0x0010u  /* value > min */
#define GC_FF_MAX_EXCL   0x0020u  /* value < max */
#define GC_FF_NO_ECHO    0x0040u  /* never echoed */
#define GC_FF_DERIVED    0x0080u  /* echo-only: set by the preset, not an input */
#define GC_FF_ECHO_LABEL 0x0100u  /* FUEL: echoed as its label */
#define GC_FF_SITE       0x0200u  /* OBJECT: echoed as the resolved site (gc_preset.site) */
#define GC_FF_ECHO_GIVEN 0x0400u  /* echoed only while its `given` flag is set (the echo
                                     hook may set or clear it) */
#define GC_FF_ENUM_NOECHO_0 0x0800u /* ENUM/BOOL: echoed only when not the first name/false */
#define GC_FF_ECHO_PLAIN 0x1000u  /* NUMBER: echoed as a plain number (no unit recorded; it
                                     is converted all the same) */
#define GC_FF_MIN_OR_MAX 0x2000u  /* INTEGER: only min or max itself ("must be 2 or 4") */
#define GC_FF_BOTH_BOUNDS 0x4000u /* a value out of either bound is told both ("must be
                                     greater than 0 and at most 1") */

typedef struct gc_field {
    const char *name;            /* member name: snake_case or a trade symbol ("T") */
    int parent;                  /* id of the enclosing OBJECT/LIST/GAS/FUEL row, 0 = top */
    gc_field_type type;
    gc_quantity quantity;        /* NUMBER, NUMBER_LIST */
    unsigned flags;              /* GC_FF_* */
    double def;                  /* default: SI number, INTEGER/BOOL value, ENUM index */
    double min, max;             /* bounds in SI (INTEGER: whole numbers) */
    const char *const *names;    /* ENUM and GAS: NULL-terminated names; NUMBER_LIST (when
                                    given): { the sentence for a wrong count, the sentence
                                    for values out of order or bounds (then checked as an
                                    increasing list within min..max after decoding) } */
    const char *def_name;        /* STRING default; GAS: model echoed when not given */
    size_t offset;               /* the member (relative to the enclosing list item, or
                                    to the input struct outside lists) */
    size_t given;                /* offset + 1 of an int set to 1 when given; 0 = none */
    size_t count;                /* LIST, NUMBER_LIST, PAIR_LIST: offset + 1 of the int count */
    size_t item_size;            /* LIST: bytes per item */
    size_t aux;                  /* FUEL: offset + 1 of its gc_fuel_spec; PAIR_LIST: offset
                                    + 1 of the y array; SERIES_LIST: offset + 1 of the int
                                    length of every series */
    int min_items, max_items;    /* LIST, NUMBER_LIST, PAIR_LIST, SERIES, SERIES_LIST */
    int min_values, max_values;  /* SERIES_LIST: values per series */
    int variant;                 /* child of a GAS row: index of the variant it belongs to */
    const char *items;           /* words for a list's items in messages ("process steps") */
    const struct gc_preset *const *presets; /* PRESET: the descriptors it may name,
                                    NULL-terminated */
    const char *description;     /* full description, unit-free (OpenAPI) */
} gc_field;

/* How a fuel was given (for the echo; the gc_fuel holds the model). */
typedef enum gc_fuel_form { GC_FUEL_NAMED = 0, GC_FUEL_ANALYSIS, GC_FUEL_FORMULA } gc_fuel_form;

typedef struct gc_fuel_spec {
    gc_fuel_form form;
    char name[GC_FIELD_STRING_LEN];     /* NAMED: as given; FORMULA: the formula */
    int n;                              /* ANALYSIS: species given */
    int species[20];                    /* ANALYSIS: gc_species ids, in the order given */
    double x[20];                       /* ANALYSIS: mole fractions as given */
    double lhv_J_per_kg;                /* FORMULA: lower heating value as given */
} gc_fuel_spec;

/* ---- outputs ----------------------------------------------------------------- */

typedef enum gc_output_type {
    GC_OT_NUMBER = 0,   /* double at offset; with quantity (converted, unit recorded) or
                           with `unit` (a fixed label, value as is) or neither (plain) */
    GC_OT_INTEGER,      /* int at offset */
    GC_OT_BOOL,         /* int at offset */
    GC_OT_STRING,       /* char[] at offset */
    GC_OT_TEXT,         /* const char * at offset (static text) */
    GC_OT_CONST,        /* the fixed text `text` */
    GC_OT_ENUM,         /* int at offset, written as names[value] */
    GC_OT_OBJECT,       /* its child rows */
    GC_OT_ARRAY,        /* its child rows, as elements (each may be conditional) */
    GC_OT_LIST,         /* items of item_size bytes at offset, count at count; child rows
                           relative to an item, written as one object per item */
    GC_OT_FUEL,         /* {label, lower_heating_value, higher_heating_value[,
                           chemical_exergy]} of the gc_fuel at offset */
    GC_OT_TYPE_COUNT
} gc_output_type;

/* gc_output.flags */
#define GC_OF_POSITIVE   0x01u  /* written only when the value is > 0 */
#define GC_OF_EXERGY     0x02u  /* FUEL: with the standard chemical exergy (exergy.h) */
#define GC_OF_CSV_ROW    0x04u  /* OBJECT: a one-row table of format=csv when the
                                   document has no states or processes */
#define GC_OF_INPUT      0x08u  /* offset and present are in the input struct, not the
                                   result (an input the output repeats, e.g. the fuel) */
#define GC_OF_CSV_TABLE  0x10u  /* LIST at the top: a table of format=csv when the document
                                   has no states or processes (several CSV_TABLE and
                                   CSV_ROW rows: one section each, in table order) */

typedef struct gc_output {
    const char *name;           /* member name ("" for elements of an ARRAY) */
    int parent;                 /* index of the enclosing OBJECT/ARRAY/LIST row, -1 top */
    gc_output_type type;
    gc_quantity quantity;       /* NUMBER with a unit system conversion */
    int has_quantity;           /* 1 when quantity applies */
    const char *unit_si;        /* NUMBER: a label that units.h does not know (si) ... */
    const char *unit_us;        /* ... and us, with */
    double us_factor;           /* the factor from SI base to the us label's unit */
    double si_factor;           /* the factor from SI base to the si label's unit (0 = 1) */
    unsigned flags;             /* GC_OF_* */
    size_t offset;              /* member of the result (or of the list item) */
    size_t present;             /* offset + 1 of an int: written only when non-zero; 0 always */
    size_t count;               /* LIST: offset + 1 of the int count */
    size_t item_size;           /* LIST */
    int max_items;              /* LIST */
    const char *const *names;   /* ENUM */
    const char *text;           /* CONST */
    unsigned include;           /* bits of the preset's `includes` this row needs (1u << i for
                                   includes[i]): written only when the request names them
                                   (include=<name>); 0: always */
    const char *description;    /* full description (OpenAPI) */
} gc_output;

/* ---- warnings and the report --------------------------------------------------- */

typedef struct gc_warning {
    const char *code;               /* stable snake_case code (static) */
    int field;                      /* field id it concerns; -1: the request as a whole */
    int index[2];                   /* list indices of that field (-1: none) */
    char message[GC_WARNING_LEN];   /* one sentence */
} gc_warning;

/* What an evaluation reports besides its result: every warning, and on
 * failure the errors (the first also as the return code). */
typedef struct gc_report {
    int input;                      /* 1: the errors are the request's own, found by checks
                                       between its inputs (the API answers "Invalid input");
                                       0: the inputs cannot be evaluated */
    int n_warnings;
    int dropped_warnings;
    gc_warning warnings[GC_REPORT_MAX_WARNINGS];
    int n_errors;
    gc_error errors[GC_REPORT_MAX_ERRORS];
    int skip_validity;              /* 1: gc_report_validity_cycle scans nothing (a lean
                                       evaluation whose warnings nobody reads); set after
                                       gc_report_init, which clears it */
} gc_report;

void gc_report_init(gc_report *r);
/* Appends a warning (field -1 = none; index -1 = not in a list). */
void gc_report_warn(gc_report *r, const char *code, int field, int index, const char *fmt, ...)
    __attribute__((format(printf, 5, 6)));
/* Appends an error and returns its code. */
int gc_report_error(gc_report *r, int code, int field, int index, const char *fmt, ...)
    __attribute__((format(printf, 5, 6)));
/* Appends a copy of err (its field id and indices as they are); returns err->code. */
int gc_report_add(gc_report *r, const gc_error *err);

/* One warning per validity rule that fired in the scan (real_gas,
 * real_gas_not_estimated, dissociation), on field (-1: none). */
void gc_report_validity(gc_report *rep, const gc_validity_scan *s, int field);
/* The same for the actual run of a cycle result and, when it is evaluated
 * apart, its ideal counterpart ("ideal state <n>"). */
void gc_report_validity_cycle(gc_report *rep, const gc_cycle_result *r);

/* Copies the errors and warnings of sub_rep, the report of preset `sub`
 * evaluated as the GC_FT_PRESET row `row` of p, into rep: an error with its
 * path as text in gc_error.field ("/topping/inputs" + its path in sub) and
 * field id 0; a warning (code kept) on `row`, its message opened by that
 * path. rep->input is set when sub_rep's is. */
void gc_report_nested(gc_report *rep, const struct gc_preset *p, int row,
                      const struct gc_preset *sub, const gc_report *sub_rep);

/* The descriptor a GC_FT_PRESET row names in input (its index checked), or
 * NULL. */
const struct gc_preset *gc_preset_nested(const struct gc_preset *p, int row,
                                        const void *input);

/* Sets err's code, field id and list index, keeps its message (an error of
 * a lower module, e.g. gas.h, attributed to an input); err may be NULL.
 * Returns code. */
int gc_error_at(gc_error *err, int code, int field, int index);

/* Fills err (may be NULL) with code, field id, list index (-1: none) and a
 * printf-style message; returns code. */
int gc_error_id(gc_error *err, int code, int field, int index, const char *fmt, ...)
    __attribute__((format(printf, 5, 6)));

/* ---- the descriptor ---------------------------------------------------------- */

typedef enum gc_preset_kind {
    GC_PRESET_CYCLE = 0,        /* a cycle of the engine: /v1/cycles/<name> */
    GC_PRESET_REDUCTION = 1     /* a measured-data reduction: /v1/measured/<segment> */
} gc_preset_kind;

/* What gc_preset.lean may leave out of an evaluation whose caller reads only
 * some figures (targets' inner evaluations). */
#define GC_LEAN_NO_AREAS 1u     /* the P-v/T-s area integration */
#define GC_LEAN_NO_BOUNDS 2u    /* the ideal counterpart */
#define GC_LEAN_NO_WARNINGS 4u  /* the real-gas and dissociation scans (warnings only; the
                                   caller sets gc_report.skip_validity) */

/* Overrides of the generic cycle writer (NAN: the engine's figure). */
typedef struct gc_cycle_view {
    const char *basis;              /* "per kg of intake air" (NULL: by frame) */
    double heat_in;                 /* J/kg */
    double thermal_efficiency;      /* - */
    double ideal_thermal_efficiency;/* - */
} gc_cycle_view;

typedef struct gc_preset gc_preset;
struct gc_preset {
    const char *name;           /* "otto", "stations": "cycle"/"reduction" in responses */
    const char *segment;        /* URL segment ("pressure-trace"); NULL = name */
    int heavy;                  /* 1: one request may cost many evaluations or much CPU (e.g.
                                   hundreds of recorded cycles, a Monte Carlo): the HTTP layer
                                   serves it apart from the cheap routes */
    const char *route_base;     /* route prefix with both slashes ("/v1/machine/"); NULL:
                                   "/v1/cycles/" for a cycle preset, "/v1/measured/" for a
                                   reduction (gc_preset_route_base) */
    const char *label;          /* route label for metrics ("cycles_otto") */
    const char *title;          /* "Otto cycle" */
    const char *description;    /* one paragraph for the OpenAPI document */
    gc_preset_kind kind;
    const gc_field *fields;     /* row 0: the request as a whole */
    int n_fields;
    const gc_output *outputs;
    int n_outputs;
    size_t input_size, result_size;
    /* extra defaults after the table's (may be NULL) */
    void (*init)(void *input);
    /* validated input -> result; GC_OK or an error (also in rep->errors) */
    int (*evaluate)(const void *input, void *result, gc_report *rep);
    /* the input as the response echoes it (defaults resolved), may be NULL */
    void (*echo)(const void *input, const void *result, void *echo_input);
    /* the engine's result inside a result (cycle presets), may be NULL */
    const gc_cycle_result *(*cycle)(const void *result);
    /* overrides of the cycle writer's figures, may be NULL */
    void (*view)(const void *input, const void *result, gc_cycle_view *v);
    /* a title that depends on the inputs (NULL: `title`) */
    const char *(*title_of)(const void *input, const void *result);
    /* leaves out what `what` (GC_LEAN_*) names from evaluations of input */
    void (*lean)(void *input, unsigned what);
    size_t site;                /* offset + 1 of the resolved gc_site in the result (the
                                   echo of a GC_FF_SITE row); 0 = none */
    /* Diagrams of the preset's own (format=svg&diagram=<name>), besides the
     * T-s, P-v and h-s diagrams of a cycle preset: a NULL-terminated list of
     * names (NULL: none) and the hook that draws one of them into a malloc'd,
     * NUL-terminated SVG document (*svg, *len; the caller frees it). opt
     * carries the common options (units, size, log axes, points); the hook
     * may ignore what does not apply. Errors: GC_ERR_INVALID with
     * err->field "/diagram", "/scale", "/width", "/height" for an option, or
     * a field id/message for a result that cannot be drawn; GC_ERR_NOMEM. */
    const char *const *diagrams;
    int (*svg)(const void *input, const void *result, const char *diagram,
               const struct gc_diagram_options *opt, char **svg, size_t *len, gc_error *err);
    /* Optional parts of the document (include=<name>[,<name>]: a NULL-terminated list of
     * names, e.g. "trace"; NULL: none); output rows name the parts they need (include). */
    const char *const *includes;
    /* Request bodies larger than the server's default: 1 lets the HTTP layer take a
     * body up to its recording limit (--max-recording-body) instead of --max-body;
     * max_json_values then caps the numbers a JSON body may hold (counted before it is
     * parsed: a JSON tree costs tens of bytes per number), 0: no cap. */
    int large_body;
    long max_json_values;
    /* A body in text/csv (POST only; NULL: JSON bodies only): the other inputs come
     * from the query string (decoded as a GET's first), then csv_body parses the len
     * bytes of text into input. Errors and warnings by field id into rep (the API
     * answers 400 with rep->input = 0 when the text cannot be read as a table, 422
     * otherwise). Anything it allocates lives in rows the API's release frees
     * (SERIES, SERIES_LIST). */
    int (*csv_body)(void *input, const char *text, size_t len, gc_report *rep);
};

/* ---- registry ------------------------------------------------------------------- */

/* Every preset in registry order (registry.c): the cycle presets as the
 * composite routes list them, then the reductions. */
const gc_preset *const *gc_presets(int *n);
/* The preset of that name (or URL segment), or NULL. */
const gc_preset *gc_preset_find(const char *name);
/* The route prefix of a preset ("/v1/cycles/", "/v1/measured/" or its own
 * route_base). */
const char *gc_preset_route_base(const gc_preset *p);
/* The preset served at that exact path (prefix + segment or name), or NULL. */
const gc_preset *gc_preset_at_path(const char *path);

/* ---- using a descriptor ------------------------------------------------------ */

/* Zeroes input, runs p->init (defaults the table does not hold, e.g. the
 * GC_UNSET of members a preset leaves out), then writes every default of the
 * table. */
void gc_preset_input_init(const gc_preset *p, void *input);

/* Zeroes one item of list row `list` and writes its members' defaults. */
void gc_preset_item_init(const gc_preset *p, int list, void *item);

/* The row of `name` among the children of row `parent` (0 = top), or -1. */
int gc_preset_child(const gc_preset *p, int parent, const char *name);

/* Path of a field id as "/a/b" with list indices ("/steps/2/end/pressure"),
 * into buf (size n); "" for row 0. Returns buf. */
char *gc_preset_field_path(const gc_preset *p, int field, const int index[2], char *buf,
                           size_t n);

/* The field id an RFC 6901 pointer names ("/site/altitude",
 * "/steps/2/end/temperature"), with its list indices in idx (-1: none); -1
 * when it names no input of p (a derived row, an unknown member, a list
 * without its index). The inverse of gc_preset_field_path. */
int gc_preset_field_find(const gc_preset *p, const char *pointer, int idx[2]);

/* The list row enclosing field (or the field itself when it is a list),
 * -1 when none. */
int gc_preset_list_of(const gc_preset *p, int field);

/* Checks one number or integer against f's bounds: GC_OK, or GC_ERR_INVALID
 * with the decoder's sentence ("must be greater than 1", "must be at most
 * 2500 K"; bounds in the quantity's default unit) in err->message. */
int gc_field_check_value(const gc_field *f, double v, gc_error *err);

/* Checks every given number, integer, list length and list element of input
 * against the table; every failure goes to rep (by field id and index).
 * Returns GC_OK or the first error's code. */
int gc_preset_validate(const gc_preset *p, const void *input, gc_report *rep);

/* gc_preset_validate, then p->evaluate. Errors fill rep (the first is the
 * return code). */
int gc_preset_evaluate(const gc_preset *p, const void *input, void *result, gc_report *rep);

/* Pointers to a field's storage in input (index for list members). */
void *gc_preset_member(const gc_preset *p, int field, const int index[2], void *input);

/* Fills err->field (the legacy path text) from its field id through p, for
 * callers that read paths (the machine model). Returns err->code. */
int gc_preset_name_error(const gc_preset *p, gc_error *err);

#endif
