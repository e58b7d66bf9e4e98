/*
 * gen_openapi.c — generates the preset schemas of openapi/openapi.json from
 * the registry's descriptors (gascycle/preset.h) and merges them into the
 * hand-written document:
 *   - <Request> of every preset: every input field with its type, unit,
 *     default, bounds and description (the table's, in the default unit);
 *   - <Inputs>: the echo of every input;
 *   - in <Response>: the preset's own outputs (every row with its
 *     description and unit), a cycle preset's summary as the engine's
 *     members (CycleSummary, described once in the cycle writer) plus the
 *     rows the preset adds to it; a reduction's whole result.
 * The paths, the common components and the examples stay hand-written.
 *
 * Usage: gen_openapi openapi/openapi.json          rewrite the document
 *        gen_openapi --check openapi/openapi.json  exit 1 when it differs
 * The document is written with two-space indentation, members in order,
 * numbers in their shortest round-trip form.
 */
#include "api/handlers.h"
#include "api/respond/doc.h"
#include "gascycle/preset.h"
#include "gascycle/units.h"

#include <jansson.h>
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- schema names of the hand-written document ---------------------------------------------- */

typedef struct names {
    const char *preset, *request, *inputs, *response;
} names;

static const names schema_names[] = {
    { "otto", "PistonRequestOtto", "PistonInputsOtto", "PistonResponseOtto" },
    { "diesel", "PistonRequestDiesel", "PistonInputsDiesel", "PistonResponseDiesel" },
    { "dual", "PistonRequestDual", "PistonInputsDual", "PistonResponseDual" },
    { "atkinson", "PistonRequestAtkinson", "PistonInputsAtkinson", "PistonResponseAtkinson" },
    { "miller", "PistonRequestMiller", "PistonInputsMiller", "PistonResponseMiller" },
    { "stirling", "PistonRequestStirling", "PistonInputsStirling", "PistonResponseStirling" },
    { "ericsson", "PistonRequestEricsson", "PistonInputsEricsson", "PistonResponseEricsson" },
    { "lenoir", "PistonRequestLenoir", "PistonInputsLenoir", "PistonResponseLenoir" },
    { "carnot", "PistonRequestCarnot", "PistonInputsCarnot", "PistonResponseCarnot" },
    { "brayton", "BraytonRequest", "BraytonInputs", "BraytonResponse" },
    { "turbojet", "TurbojetRequest", "TurbojetInputs", "TurbojetResponse" },
    { "custom", "CustomRequest", "CustomInputs", "CustomResponse" },
    { "stations", "MeasuredStationsRequest", "MeasuredStationsInputs",
      "MeasuredStationsResponse" },
    { "pressure_trace", "MeasuredTraceRequest", "MeasuredTraceInputs", "MeasuredTraceResponse" },
};

/* "my_cycle" -> "MyCycle". */
static void camel(char *out, size_t n, const char *name)
{
    size_t k = 0;
    int up = 1;
    for (const char *c = name; *c && k + 1 < n; c++) {
        if (*c == '_' || *c == '-') {
            up = 1;
            continue;
        }
        out[k++] = up ? (char)toupper((unsigned char)*c) : *c;
        up = 0;
    }
    out[k] = '\0';
}

/* The table's schema names of a preset, or NULL. */
static const names *table_names(const gc_preset *p)
{
    for (size_t i = 0; i < sizeof schema_names / sizeof schema_names[0]; i++)
        if (strcmp(schema_names[i].preset, p->name) == 0)
            return &schema_names[i];
    return NULL;
}

/* The schema names of a preset: the table's, or for a preset the table does
 * not list, <Camel>Request, <Camel>Inputs and <Camel>Response (static
 * storage, valid until the next call). */
static const names *names_of(const gc_preset *p)
{
    const names *t = table_names(p);
    if (t)
        return t;
    static char req[96], inp[96], resp[96];
    static names derived;
    char c[64];
    camel(c, sizeof c, p->name);
    snprintf(req, sizeof req, "%sRequest", c);
    snprintf(inp, sizeof inp, "%sInputs", c);
    snprintf(resp, sizeof resp, "%sResponse", c);
    derived = (names){ p->name, req, inp, resp };
    return &derived;
}

#define REF(name) json_pack("{s:s}", "$ref", "#/components/schemas/" name)

/* ---- units ------------------------------------------------------------------------------------ */

static const char *unit_of(gc_quantity q)
{
    return gc_units_label(q, GC_UNITS_SI);
}

static double in_unit(gc_quantity q, double si)
{
    return gc_units_from_si(q, GC_UNITS_SI, si);
}

/* A number as JSON: an integer when it is one. */
static json_t *num(double v)
{
    if (v == floor(v) && fabs(v) < 1e15)
        return json_integer((json_int_t)v);
    return json_real(v);
}

/* "<description> A number is in K; ..." */
static json_t *described(const char *desc, gc_quantity q)
{
    char buf[2048];
    const char *u = unit_of(q);
    size_t n = strlen(desc);
    if (strcmp(u, "-") == 0)
        snprintf(buf, sizeof buf, "%.*s (dimensionless; a string may carry \"%%\").",
                 (int)(n && desc[n - 1] == '.' ? n - 1 : n), desc);
    else
        snprintf(buf, sizeof buf, "%s A number is in %s; a string may carry any unit of the "
                 "same quantity. Bounds apply to the value converted to %s.", desc, u, u);
    return json_string(buf);
}

/* ---- request schemas --------------------------------------------------------------------------- */

static json_t *fields_object(const gc_preset *p, int parent, int echo);

/* The row's bounds into schema s (convert: a number row's, in its default
 * unit). */
static void bounds(json_t *s, const gc_field *f, int convert)
{
    int number = f->type == GC_FT_NUMBER || f->type == GC_FT_NUMBER_LIST;
    double lo = number && convert ? in_unit(f->quantity, f->min) : f->min;
    double hi = number && convert ? in_unit(f->quantity, f->max) : f->max;
    if (f->flags & GC_FF_MIN_OR_MAX) {   /* one of the two: an enumeration */
        json_object_set_new(s, "enum", json_pack("[o,o]", num(lo), num(hi)));
        return;
    }
    if (f->flags & GC_FF_MIN)
        json_object_set_new(s, (f->flags & GC_FF_MIN_EXCL) ? "exclusiveMinimum" : "minimum",
                            num(lo));
    if (f->flags & GC_FF_MAX)
        json_object_set_new(s, (f->flags & GC_FF_MAX_EXCL) ? "exclusiveMaximum" : "maximum",
                            num(hi));
}

static json_t *number_or_unit(const gc_field *f)
{
    json_t *n = json_pack("{s:s}", "type", "number");
    if (!(f->names && f->type == GC_FT_NUMBER_LIST))
        bounds(n, f, 1);
    return json_pack("{s:[o,o]}", "anyOf", n, REF("ValueWithUnit"));
}

/* Whether the row has a default to publish: not one that must be given, nor
 * one whose absence means "not used" (GC_FF_OPTIONAL). */
static int has_default(const gc_field *f)
{
    return !(f->flags & (GC_FF_OPTIONAL | GC_FF_REQUIRED));
}

static json_t *request_number(const gc_field *f)
{
    json_t *s = json_object();
    json_t *any = number_or_unit(f);
    json_object_set_new(s, "description", described(f->description, f->quantity));
    json_object_update(s, any);
    json_decref(any);
    if (has_default(f) && f->def > -1e299)
        json_object_set_new(s, "default", num(in_unit(f->quantity, f->def)));
    return s;
}

static json_t *enum_names(const gc_field *f)
{
    json_t *a = json_array();
    for (int i = 0; f->names && f->names[i]; i++)
        json_array_append_new(a, json_string(f->names[i]));
    return a;
}

static json_t *nested_field(const gc_field *f, int echo);

static json_t *request_field(const gc_preset *p, int row)
{
    const gc_field *f = &p->fields[row];
    json_t *s;
    switch (f->type) {
    case GC_FT_NUMBER: return request_number(f);
    case GC_FT_INTEGER:
        s = json_pack("{s:s}", "type", "integer");
        bounds(s, f, 0);
        s = json_pack("{s:s, s:[o,{s:s, s:s}]}", "description", f->description, "anyOf", s,
                      "type", "string", "pattern", "^[0-9]+$");
        if (has_default(f))
            json_object_set_new(s, "default", json_integer((json_int_t)f->def));
        return s;
    case GC_FT_BOOL:
        s = json_pack("{s:s, s:s}", "description", f->description, "type", "boolean");
        if (has_default(f))
            json_object_set_new(s, "default", json_boolean(f->def != 0.0));
        return s;
    case GC_FT_ENUM:
        s = json_pack("{s:s, s:s, s:o}", "description", f->description, "type", "string",
                      "enum", enum_names(f));
        if (has_default(f))
            json_object_set_new(s, "default", json_string(f->names[(int)f->def]));
        return s;
    case GC_FT_STRING:
        s = json_pack("{s:s, s:s}", "description", f->description, "type", "string");
        if (f->def_name)
            json_object_set_new(s, "default", json_string(f->def_name));
        return s;
    case GC_FT_OBJECT:
        if (f->flags & GC_FF_SITE)
            return json_pack("{s:s, s:o}", "description", f->description, "allOf",
                             json_pack("[o]", REF("CycleSite")));
        s = fields_object(p, row, 0);
        json_object_set_new(s, "description", json_string(f->description));
        return s;
    case GC_FT_GAS:
        return json_pack("{s:s, s:o}", "description", f->description, "allOf",
                         json_pack("[o]", REF("CycleGas")));
    case GC_FT_FUEL:
        return json_pack("{s:s, s:o}", "description", f->description, "allOf",
                         json_pack("[o]", REF("CycleFuel")));
    case GC_FT_LIST:
        s = fields_object(p, row, 0);
        return json_pack("{s:s, s:s, s:i, s:i, s:o}", "description", f->description, "type",
                         "array", "minItems", f->min_items, "maxItems", f->max_items, "items", s);
    case GC_FT_NUMBER_LIST:
        return json_pack("{s:o, s:[{s:s, s:i, s:i, s:o}, {s:s}]}", "description",
                         described(f->description, f->quantity), "oneOf", "type", "array",
                         "minItems", f->min_items, "maxItems", f->max_items, "items",
                         number_or_unit(f), "type", "string");
    case GC_FT_PAIR_LIST:
        return json_pack("{s:s, s:[{s:s, s:i, s:i, s:{s:s, s:i, s:i, s:{s:s}}}, {s:s}]}",
                         "description", f->description, "oneOf", "type", "array", "minItems",
                         f->min_items, "maxItems", f->max_items, "items", "type", "array",
                         "minItems", 2, "maxItems", 2, "items", "type", "number", "type",
                         "string");
    case GC_FT_PRESET: return nested_field(f, 0);
    case GC_FT_SERIES:
        s = json_pack("{s:s}", "type", "number");
        bounds(s, f, 0);
        return json_pack("{s:s, s:[{s:s, s:i, s:i, s:o}, {s:s}]}", "description",
                         f->description, "oneOf", "type", "array", "minItems", f->min_items,
                         "maxItems", f->max_items, "items", s, "type", "string");
    case GC_FT_SERIES_LIST:
        return json_pack("{s:s, s:s, s:i, s:i, s:{s:s, s:i, s:i, s:{s:s}}}", "description",
                         f->description, "type", "array", "minItems", f->min_items, "maxItems",
                         f->max_items, "items", "type", "array", "minItems", f->min_values,
                         "maxItems", f->max_values, "items", "type", "number");
    default:
        return json_object();
    }
}

/* ---- the echo ---------------------------------------------------------------------------------- */

static json_t *echo_field(const gc_preset *p, int row)
{
    const gc_field *f = &p->fields[row];
    char buf[2048];
    switch (f->type) {
    case GC_FT_NUMBER:
        snprintf(buf, sizeof buf, "%s In the unit named under \"%s\" in units.", f->description,
                 f->name);
        if (f->flags & GC_FF_ECHO_PLAIN)
            snprintf(buf, sizeof buf, "%s", f->description);
        return json_pack("{s:s, s:s}", "description", buf, "$ref",
                         "#/components/schemas/Number");
    case GC_FT_INTEGER: return json_pack("{s:s, s:s}", "description", f->description, "type",
                                         "integer");
    case GC_FT_BOOL: return json_pack("{s:s, s:s}", "description", f->description, "type",
                                      "boolean");
    case GC_FT_ENUM:
        return json_pack("{s:s, s:s, s:o}", "description", f->description, "type", "string",
                         "enum", enum_names(f));
    case GC_FT_STRING: return json_pack("{s:s, s:s}", "description", f->description, "type",
                                        "string");
    case GC_FT_OBJECT:
        if (f->flags & GC_FF_SITE)
            return json_pack("{s:s, s:o}", "description", f->description, "allOf",
                             json_pack("[o]", REF("CycleSiteEcho")));
        return fields_object(p, row, 1);
    case GC_FT_GAS:
        return json_pack("{s:s, s:s, s:[s], s:{s:{s:s}, s:o, s:o}, s:b}", "description",
                         f->description, "type", "object", "required", "model", "properties",
                         "model", "type", "string", "cp", REF("Number"), "k", REF("Number"),
                         "additionalProperties", 0);
    case GC_FT_FUEL:
        if (f->flags & GC_FF_ECHO_LABEL)
            return json_pack("{s:s, s:s}", "description", f->description, "type", "string");
        return json_pack("{s:s, s:[{s:s}, {s:s}]}", "description", f->description, "oneOf",
                         "type", "string", "type", "object");
    case GC_FT_LIST:
        return json_pack("{s:s, s:s, s:o}", "description", f->description, "type", "array",
                         "items", fields_object(p, row, 1));
    case GC_FT_NUMBER_LIST:
        return json_pack("{s:s, s:s, s:o}", "description", f->description, "type", "array",
                         "items", REF("Number"));
    case GC_FT_PAIR_LIST:
        return json_pack("{s:s, s:s, s:{s:{s:s}}, s:[s], s:b}", "description", f->description,
                         "type", "object", "properties", "samples", "type", "integer",
                         "required", "samples", "additionalProperties", 0);
    case GC_FT_PRESET: return nested_field(f, 1);
    case GC_FT_SERIES:
        return json_pack("{s:s, s:s, s:{s:{s:s}}, s:[s], s:b}", "description",
                         "The number of values given.", "type", "object", "properties",
                         "values", "type", "integer", "required", "values",
                         "additionalProperties", 0);
    case GC_FT_SERIES_LIST:
        return json_pack("{s:s, s:s, s:{s:{s:s}, s:{s:s}}, s:[s,s], s:b}", "description",
                         "The number of series given and of values in each.", "type", "object",
                         "properties", "series", "type", "integer", "values", "type", "integer",
                         "required", "series", "values", "additionalProperties", 0);
    default:
        return json_object();
    }
}

/* Another preset's request (or its echo): {"cycle": name, "inputs": that
 * preset's <Request> (<Inputs>) schema, chosen by "cycle"}. */
static json_t *nested_field(const gc_field *f, int echo)
{
    json_t *which = json_array(), *cases = json_array();
    for (int i = 0; f->presets && f->presets[i]; i++) {
        const gc_preset *sub = f->presets[i];
        const names *nm = names_of(sub);
        char ref[160];
        snprintf(ref, sizeof ref, "#/components/schemas/%s", echo ? nm->inputs : nm->request);
        json_array_append_new(which, json_string(sub->name));
        json_array_append_new(cases, json_pack("{s:{s:{s:{s:s}}}, s:{s:{s:{s:s}}}}", "if",
                                               "properties", "cycle", "const", sub->name,
                                               "then", "properties", "inputs", "$ref", ref));
    }
    json_t *s = json_pack("{s:s, s:s, s:b, s:[s], s:{s:{s:s, s:s, s:o}, s:{s:s, s:s}}, s:o}",
                          "description", f->description, "type", "object",
                          "additionalProperties", 0, "required", "cycle", "properties", "cycle",
                          "description", "The preset whose inputs follow.", "type", "string",
                          "enum", which, "inputs", "description",
                          echo ? "Its inputs as understood, defaults filled in."
                               : "Its inputs, as its own route takes them (all optional "
                                 "members default as there).", "type", "object",
                          "allOf", cases);
    if (echo)
        json_array_append_new(json_object_get(s, "required"), json_string("inputs"));
    return s;
}

static int always_echoed(const gc_field *f)
{
    return !(f->flags & (GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN | GC_FF_NO_ECHO |
                         GC_FF_ENUM_NOECHO_0)) &&
           !(f->type == GC_FT_FUEL);
}

/* The members of row `parent` as an object schema (echo: the echo's). */
static json_t *fields_object(const gc_preset *p, int parent, int echo)
{
    json_t *props = json_object(), *req = json_array();
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->name == NULL || f->parent != parent)
            continue;
        if (echo ? (f->flags & GC_FF_NO_ECHO) != 0 : (f->flags & GC_FF_DERIVED) != 0)
            continue;
        json_object_set_new(props, f->name, echo ? echo_field(p, r) : request_field(p, r));
        if (echo ? always_echoed(f) : (f->flags & GC_FF_REQUIRED) != 0)
            json_array_append_new(req, json_string(f->name));
    }
    json_t *s = json_pack("{s:s, s:b}", "type", "object", "additionalProperties", 0);
    if (json_array_size(req))
        json_object_set_new(s, "required", req);
    else
        json_decref(req);
    json_object_set_new(s, "properties", props);
    return s;
}

/* The members every echo adds after the preset's inputs: how they were read
 * (respond/doc.c: echo_reading), described once in components/schemas.
 * input_units is required of a response's own echo (response()), not of a
 * nested preset's echo (a combined cycle's topping), read as the outer. */
static void reading_echo(json_t *echo)
{
    static const char *const members[] = { "input_units", "decimal", "barometric_pressure",
                                           "barometric_pressure_source", "standard_conditions",
                                           "fuel_density_standard", NULL };
    json_t *props = json_object_get(echo, "properties");
    for (int i = 0; members[i]; i++) {
        char ref[160];
        snprintf(ref, sizeof ref, "#/components/schemas/InputReading/properties/%s", members[i]);
        json_object_set_new(props, members[i], json_pack("{s:s}", "$ref", ref));
    }
}

/* ---- outputs ---------------------------------------------------------------------------------- */

static json_t *output_schema(const gc_preset *p, int row);

static json_t *output_children(const gc_preset *p, int row)
{
    json_t *props = json_object(), *req = json_array();
    for (int r = 0; r < p->n_outputs; r++) {
        const gc_output *o = &p->outputs[r];
        if (o->parent != row)
            continue;
        json_object_set_new(props, o->name, output_schema(p, r));
        if (!o->present && !(o->flags & GC_OF_POSITIVE) && !o->include)
            json_array_append_new(req, json_string(o->name));
    }
    json_t *s = json_pack("{s:s, s:b}", "type", "object", "additionalProperties", 0);
    if (json_array_size(req))
        json_object_set_new(s, "required", req);
    else
        json_decref(req);
    json_object_set_new(s, "properties", props);
    return s;
}

static json_t *number_output(const gc_output *o)
{
    char buf[2048];
    if (o->has_quantity)
        snprintf(buf, sizeof buf, "%s In the unit named under \"%s\" in units (%s in si).",
                 o->description, o->name, unit_of(o->quantity));
    else if (o->unit_si)
        snprintf(buf, sizeof buf, "%s In %s (si) or %s (us).", o->description, o->unit_si,
                 o->unit_us);
    else
        snprintf(buf, sizeof buf, "%s", o->description);
    return json_pack("{s:s, s:s}", "description", buf, "$ref", "#/components/schemas/Number");
}

static json_t *output_schema(const gc_preset *p, int row)
{
    const gc_output *o = &p->outputs[row];
    json_t *s, *any;
    switch (o->type) {
    case GC_OT_NUMBER: return number_output(o);
    case GC_OT_INTEGER: return json_pack("{s:s, s:s}", "description", o->description, "type",
                                         "integer");
    case GC_OT_BOOL: return json_pack("{s:s, s:s}", "description", o->description, "type",
                                      "boolean");
    case GC_OT_STRING:
    case GC_OT_TEXT: return json_pack("{s:s, s:s}", "description", o->description, "type",
                                      "string");
    case GC_OT_CONST: return json_pack("{s:s, s:s}", "description", o->description, "const",
                                       o->text);
    case GC_OT_ENUM:
        any = json_array();
        for (int i = 0; o->names && o->names[i]; i++)
            json_array_append_new(any, json_string(o->names[i]));
        return json_pack("{s:s, s:s, s:o}", "description", o->description, "type", "string",
                         "enum", any);
    case GC_OT_OBJECT:
        s = output_children(p, row);
        json_object_set_new(s, "description", json_string(o->description));
        return s;
    case GC_OT_ARRAY:
        any = json_array();
        for (int r = 0; r < p->n_outputs; r++)
            if (p->outputs[r].parent == row)
                json_array_append_new(any, output_schema(p, r));
        return json_pack("{s:s, s:s, s:{s:o}}", "description", o->description, "type", "array",
                         "items", "anyOf", any);
    case GC_OT_LIST:
        return json_pack("{s:s, s:s, s:o}", "description", o->description, "type", "array",
                         "items", output_children(p, row));
    case GC_OT_FUEL:
        s = json_pack("{s:s, s:s, s:b, s:[s,s,s], s:{s:{s:s}, s:o, s:o}}", "description",
                      o->description, "type", "object", "additionalProperties", 0, "required",
                      "label", "lower_heating_value", "higher_heating_value", "properties",
                      "label", "type", "string", "lower_heating_value", REF("Number"),
                      "higher_heating_value", REF("Number"));
        if (o->flags & GC_OF_EXERGY)
            json_object_set_new(json_object_get(s, "properties"), "chemical_exergy",
                                REF("Number"));
        return s;
    default:
        return json_object();
    }
}

static int section(const gc_output *o)
{
    return o->parent < 0 && (strcmp(o->name, "model") == 0 || strcmp(o->name, "summary") == 0 ||
                             strcmp(o->name, "bounds") == 0);
}

/* A cycle preset's summary: the engine's members and the preset's rows. */
static json_t *cycle_summary(const gc_preset *p, json_t *engine)
{
    int top = -1;
    for (int r = 0; r < p->n_outputs && top < 0; r++)
        if (p->outputs[r].parent < 0 && strcmp(p->outputs[r].name, "summary") == 0)
            top = r;
    if (top < 0)
        return REF("CycleSummary");
    char desc[1024];
    snprintf(desc, sizeof desc, "The cycle's figures (as CycleSummary) and the preset's own: %s",
             p->outputs[top].description);
    json_t *s = json_pack("{s:s, s:b, s:O, s:s}", "type", "object", "additionalProperties", 0,
                          "required", json_object_get(engine, "required"), "description", desc);
    json_t *props = json_object();
    const char *name;
    json_t *v;
    json_object_foreach(json_object_get(engine, "properties"), name, v) {
        char ref[160];
        snprintf(ref, sizeof ref, "#/components/schemas/CycleSummary/properties/%s", name);
        json_object_set_new(props, name, json_pack("{s:s}", "$ref", ref));
    }
    for (int r = 0; r < p->n_outputs; r++)
        if (p->outputs[r].parent == top)
            json_object_set_new(props, p->outputs[r].name, output_schema(p, r));
    json_object_set_new(s, "properties", props);
    return s;
}

/* CycleSummary: the engine's members (gc_api_summary_members). */
static json_t *engine_summary(json_t *old)
{
    json_t *props = json_object(), *req = json_array();
    for (const gc_api_member *m = gc_api_summary_members; m->name; m++) {
        char buf[1024];
        if (m->quantity >= 0)
            snprintf(buf, sizeof buf, "%s In the unit named under \"%s\" in units (%s in si).",
                     m->description, m->name, unit_of((gc_quantity)m->quantity));
        else
            snprintf(buf, sizeof buf, "%s", m->description);
        json_object_set_new(props, m->name, json_pack("{s:s, s:s}", "description", buf, "$ref",
                                                      "#/components/schemas/Number"));
        if (m->always)
            json_array_append_new(req, json_string(m->name));
    }
    json_t *s = json_pack("{s:s, s:b, s:o, s:O, s:o}", "type", "object",
                          "additionalProperties", 0, "required", req, "description",
                          json_object_get(old, "description"), "properties", props);
    return s;
}

/* ---- merging ------------------------------------------------------------------------------------ */

/* A cycle preset whose document carries the engine's parts (the others, e.g.
 * a combined cycle of two fluids, write all their parts from their rows). */
static int engine_parts(const gc_preset *p)
{
    return p->kind == GC_PRESET_CYCLE && p->cycle != NULL;
}

static void response(const gc_preset *p, json_t *resp, json_t *engine)
{
    json_t *props = json_object_get(resp, "properties");
    for (int r = 0; r < p->n_outputs; r++) {
        const gc_output *o = &p->outputs[r];
        if (o->parent >= 0 || (engine_parts(p) && section(o)))
            continue;
        json_object_set_new(props, o->name, output_schema(p, r));
    }
    if (engine_parts(p))
        json_object_set_new(props, "summary", cycle_summary(p, engine));
    json_object_set_new(resp, "description", json_string(p->description));
    char ref[160];
    snprintf(ref, sizeof ref, "#/components/schemas/%s", names_of(p)->inputs);
    json_object_set_new(props, "inputs", json_pack("{s:s, s:[{s:s}, {s:[s]}]}", "description",
                                                   "The inputs as understood, and how they were "
                                                   "read.", "allOf", "$ref", ref, "required",
                                                   "input_units"));
}

/* ---- a preset the document does not know yet ------------------------------------------------ */

static void route_of(const gc_preset *p, char *path, size_t n)
{
    snprintf(path, n, "%s%s", gc_preset_route_base(p), p->segment ? p->segment : p->name);
}

/* One query parameter (dotted name for a nested row). */
static json_t *query_param(const char *name, json_t *description, json_t *schema)
{
    return json_pack("{s:s, s:s, s:b, s:o, s:o}", "name", name, "in", "query", "required", 0,
                     "description", description, "schema", schema);
}

static void table_params(const gc_preset *p, int parent, const char *prefix, json_t *sib,
                         json_t *out);

/* A nested preset's GET parameters: "<name>.cycle" and every member of the
 * presets it may name under "<name>.inputs." (a name once, the first
 * preset's description). */
static void nested_params(const gc_field *f, const char *name, json_t *sib, json_t *out)
{
    char sub_prefix[200];
    snprintf(sub_prefix, sizeof sub_prefix, "%s.cycle", name);
    json_t *sch = nested_field(f, 0);
    json_array_append_new(out, query_param(sub_prefix, json_string("The preset whose inputs "
                                           "follow (as <name>.inputs.<member>)."),
                                           json_incref(json_object_get(json_object_get(
                                               sch, "properties"), "cycle"))));
    json_decref(sch);
    snprintf(sub_prefix, sizeof sub_prefix, "%s.inputs.", name);
    for (int i = 0; f->presets && f->presets[i]; i++) {
        json_t *more = json_array();
        table_params(f->presets[i], 0, sub_prefix, sib, more);
        size_t k, j;
        json_t *q, *have;
        json_array_foreach(more, k, q) {
            const char *qn = json_string_value(json_object_get(q, "name"));
            int dup = 0;
            json_array_foreach(out, j, have) {
                const char *hn = json_string_value(json_object_get(have, "name"));
                dup |= qn && hn && strcmp(qn, hn) == 0;
            }
            if (!dup)
                json_array_append(out, q);
        }
        json_decref(more);
    }
}

/* The GET parameters of rows under `parent` (prefix: the dotted path so far).
 * A gas or a fuel takes the sibling's parameters of that name; lists go as
 * one comma list. */
static void table_params(const gc_preset *p, int parent, const char *prefix, json_t *sib,
                         json_t *out)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->name == NULL || f->parent != parent || (f->flags & GC_FF_DERIVED) ||
            f->variant)
            continue;
        char name[160];
        snprintf(name, sizeof name, "%s%s", prefix, f->name);
        if (f->type == GC_FT_OBJECT) {
            char sub[170];
            snprintf(sub, sizeof sub, "%s.", name);
            table_params(p, r, sub, sib, out);
        } else if (f->type == GC_FT_GAS || f->type == GC_FT_FUEL) {
            size_t i, n = strlen(name);
            json_t *q;
            json_array_foreach(sib, i, q) {
                const char *qn = json_string_value(json_object_get(q, "name"));
                if (qn && strncmp(qn, name, n) == 0 && (qn[n] == '\0' || qn[n] == '.'))
                    json_array_append(out, q);
            }
        } else if (f->type == GC_FT_PRESET) {
            nested_params(f, name, sib, out);
        } else if (f->type == GC_FT_NUMBER) {
            json_array_append_new(out, query_param(name, described(f->description, f->quantity),
                                                   REF("ValueWithUnit")));
        } else if (f->type == GC_FT_LIST || f->type == GC_FT_NUMBER_LIST ||
                   f->type == GC_FT_PAIR_LIST || f->type == GC_FT_SERIES ||
                   f->type == GC_FT_SERIES_LIST) {
            json_array_append_new(out, query_param(name, json_string(f->description),
                                                   json_pack("{s:s}", "type", "string")));
        } else {
            json_t *sch = request_field(p, r);
            json_t *d = json_incref(json_object_get(sch, "description"));
            json_object_del(sch, "description");
            json_array_append_new(out, query_param(name, d ? d : json_string(""), sch));
        }
    }
}

/* Points every "$ref" to `from` inside v at `to`; drops "examples". */
static void retarget(json_t *v, const char *from, const char *to)
{
    if (json_is_array(v)) {
        size_t i;
        json_t *e;
        json_array_foreach(v, i, e)
            retarget(e, from, to);
        return;
    }
    if (!json_is_object(v))
        return;
    json_object_del(v, "examples");
    const char *ref = json_string_value(json_object_get(v, "$ref"));
    if (ref && strcmp(ref, from) == 0)
        json_object_set_new(v, "$ref", json_string(to));
    const char *k;
    json_t *e;
    json_object_foreach(v, k, e)
        retarget(e, from, to);
}

/* The path item of p, from the sibling's: its operation ids, summaries,
 * descriptions and schemas; the GET parameters from p's table. */
static json_t *new_path(const gc_preset *p, const names *nm, json_t *sib_item,
                        const names *sib)
{
    json_t *item = json_deep_copy(sib_item);
    char from[160], to[160], camel_name[64];
    camel(camel_name, sizeof camel_name, p->name);
    snprintf(from, sizeof from, "#/components/schemas/%s", sib->request);
    snprintf(to, sizeof to, "#/components/schemas/%s", nm->request);
    retarget(item, from, to);
    snprintf(from, sizeof from, "#/components/schemas/%s", sib->response);
    snprintf(to, sizeof to, "#/components/schemas/%s", nm->response);
    retarget(item, from, to);
    const char *kind = p->kind == GC_PRESET_CYCLE ? "Cycle" : "Measured";
    const char *ops[2] = { "get", "post" };
    for (int k = 0; k < 2; k++) {
        json_t *op = json_object_get(item, ops[k]);
        if (!op)
            continue;
        char buf[2048];
        snprintf(buf, sizeof buf, "%s%s%s", ops[k], kind, camel_name);
        json_object_set_new(op, "operationId", json_string(buf));
        snprintf(buf, sizeof buf, "%s (%s)", p->title, k ? "JSON body" : "query parameters");
        json_object_set_new(op, "summary", json_string(buf));
        snprintf(buf, sizeof buf, "%s: %s", p->title, p->description);
        json_object_set_new(op, "description", json_string(buf));
        json_t *old = json_object_get(op, "parameters");
        json_t *params = json_array();
        size_t i;
        json_t *q;
        json_array_foreach(old, i, q)
            if (json_object_get(q, "$ref"))
                json_array_append(params, q);
        if (k == 0)
            table_params(p, 0, "", old, params);
        json_object_set_new(op, "parameters", params);
    }
    return item;
}

/* The response schema of p: the sibling's common members (the cycle parts,
 * the echo, warnings and units); response() adds p's own rows. */
static json_t *new_response(const gc_preset *p, const names *nm, json_t *sib_resp)
{
    static const char *const keep[] = { "cycle", "reduction", "title", "model", "states",
                                         "stations", "processes", "summary", "bounds",
                                         "checks", "paths", "inputs", "warnings", "cautions",
                                         "unit_system", "units", NULL };
    static const char *const common[] = { "cycle", "reduction", "title", "inputs", "warnings",
                                           "cautions", "unit_system", "units", NULL };
    const char *const *k = p->kind == GC_PRESET_CYCLE && !p->cycle ? common : keep;
    json_t *resp = json_deep_copy(sib_resp);
    json_t *props = json_object_get(resp, "properties"), *kept = json_object();
    for (int i = 0; k[i]; i++)
        if (json_object_get(props, k[i]))
            json_object_set(kept, k[i], json_object_get(props, k[i]));
    char ref[160];
    snprintf(ref, sizeof ref, "#/components/schemas/%s", nm->inputs);
    json_object_set_new(kept, "inputs", json_pack("{s:s}", "$ref", ref));
    json_object_set_new(kept, p->kind == GC_PRESET_CYCLE ? "cycle" : "reduction",
                        json_pack("{s:s}", "const", p->name));
    json_object_set_new(resp, "properties", kept);
    json_t *req = json_object_get(resp, "required"), *req2 = json_array();
    size_t i;
    json_t *e;
    json_array_foreach(req, i, e)
        if (json_object_get(kept, json_string_value(e)))
            json_array_append(req2, e);
    json_object_set_new(resp, "required", req2);
    json_object_set_new(resp, "description", json_string(p->description));
    return resp;
}

/* A preset the document lacks: its path and response schema start from the
 * first earlier preset of the same kind. 0, or -1 when there is none. */
static int new_preset(json_t *doc, const gc_preset *p, const names *nm,
                      const gc_preset *const *all, int at)
{
    json_t *sc = json_object_get(json_object_get(doc, "components"), "schemas");
    json_t *paths = json_object_get(doc, "paths");
    for (int j = 0; j < at; j++) {
        if (all[j]->kind != p->kind)
            continue;
        const names *sib = table_names(all[j]);
        char sib_path[128], path[128];
        if (!sib)
            continue;
        route_of(all[j], sib_path, sizeof sib_path);
        route_of(p, path, sizeof path);
        json_t *sib_item = json_object_get(paths, sib_path);
        json_t *sib_resp = json_object_get(sc, sib->response);
        if (!sib_item || !sib_resp)
            continue;
        if (!json_object_get(sc, nm->response))
            json_object_set_new(sc, nm->response, new_response(p, nm, sib_resp));
        if (!json_object_get(paths, path))
            json_object_set_new(paths, path, new_path(p, nm, sib_item, sib));
        return 0;
    }
    return -1;
}

/* The request and echo schemas of the presets a preset's GC_FT_PRESET rows
 * may name that the registry does not serve on a route of their own. */
static void nested_schemas(json_t *sc, const gc_preset *p)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        for (int i = 0; f->type == GC_FT_PRESET && f->presets && f->presets[i]; i++) {
            const gc_preset *sub = f->presets[i];
            if (gc_preset_find(sub->name) == sub)
                continue;
            const names *nm = names_of(sub);
            char req[96], inp[96];
            snprintf(req, sizeof req, "%s", nm->request);
            snprintf(inp, sizeof inp, "%s", nm->inputs);
            json_t *s = fields_object(sub, 0, 0);
            json_object_set_new(s, "description", json_string(sub->description));
            json_object_set_new(sc, req, s);
            s = fields_object(sub, 0, 1);
            json_object_set_new(s, "description", json_string("The inputs as understood, "
                                "defaults filled in, in the output unit system."));
            json_object_set_new(sc, inp, s);
        }
    }
}

/* The schema of a $ref to a preset's response. */
static json_t *response_ref(const gc_preset *p)
{
    char ref[160];
    snprintf(ref, sizeof ref, "#/components/schemas/%s", names_of(p)->response);
    return json_pack("{s:s}", "$ref", ref);
}

/* The lists that name presets, from the registry: the study presets
 * (StudyCycle, a target's result), the answers a batch item may get
 * (a problem, the POST routes that are not presets, every preset) and the
 * presets /v1/uncertainty and /v1/sensitivities may name (every one). */
static void preset_lists(json_t *sc)
{
    const char *study_names[64];
    size_t k = gc_api_study_presets(study_names, 64);
    json_t *study = json_array(), *results = json_array();
    for (size_t i = 0; i < k; i++) {
        json_array_append_new(study, json_string(study_names[i]));
        json_array_append_new(results, response_ref(gc_preset_find(study_names[i])));
    }
    json_object_set_new(json_object_get(sc, "StudyCycle"), "enum", study);
    json_t *result = json_object_get(json_object_get(json_object_get(sc, "TargetResponse"),
                                                     "properties"), "result");
    json_object_set_new(result, "anyOf", results);
    json_t *body = json_object_get(json_object_get(json_object_get(sc, "BatchAnswer"),
                                                   "properties"), "body");
    json_t *any = json_array();
    static const char *const own[] = { "Problem", "PropertiesResponse", "WaterResponse",
                                       "UncertaintyResponse", "SensitivityResponse", NULL };
    for (int i = 0; own[i]; i++) {
        char ref[160];
        snprintf(ref, sizeof ref, "#/components/schemas/%s", own[i]);
        json_array_append_new(any, json_pack("{s:s}", "$ref", ref));
    }
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    json_t *every = json_array();
    for (int i = 0; i < n; i++) {
        json_array_append_new(any, response_ref(all[i]));
        json_array_append_new(every, json_string(all[i]->name));
    }
    json_object_set_new(body, "anyOf", any);
    json_object_set_new(json_object_get(sc, "UncertaintyPreset"), "enum", every);
}

static int generate(json_t *doc)
{
    json_t *sc = json_object_get(json_object_get(doc, "components"), "schemas");
    json_t *paths = json_object_get(doc, "paths");
    json_t *engine = engine_summary(json_object_get(sc, "CycleSummary"));
    json_object_set(sc, "CycleSummary", engine);
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    for (int i = 0; i < n; i++) {
        const gc_preset *p = all[i];
        /* a copy: names_of's storage is reused for a nested preset's names */
        char req_name[96], inp_name[96], resp_name[96];
        const names *d = names_of(p);
        snprintf(req_name, sizeof req_name, "%s", d->request);
        snprintf(inp_name, sizeof inp_name, "%s", d->inputs);
        snprintf(resp_name, sizeof resp_name, "%s", d->response);
        const names own = { p->name, req_name, inp_name, resp_name }, *nm = &own;
        char path[128];
        route_of(p, path, sizeof path);
        if (!json_object_get(sc, nm->response) || !json_object_get(paths, path)) {
            /* a new preset: its path and response schema from a sibling's */
            if (new_preset(doc, p, nm, all, i) != 0) {
                fprintf(stderr, "gen_openapi: no preset of the kind of %s to start its path "
                        "and schemas from\n", p->name);
                return -1;
            }
        }
        json_t *req = fields_object(p, 0, 0);
        json_object_set_new(req, "description", json_string(p->description));
        json_object_set_new(sc, nm->request, req);
        json_t *echo = fields_object(p, 0, 1);
        json_object_set_new(echo, "description", json_string("The inputs as understood, "
                            "defaults filled in, in the output unit system, and how they were "
                            "read (input_units, and what a gauge pressure or a standard "
                            "volume flow was read with)."));
        reading_echo(echo);
        json_object_set_new(sc, nm->inputs, echo);
        response(p, json_object_get(sc, nm->response), engine);
        nested_schemas(sc, p);
    }
    json_decref(engine);
    preset_lists(sc);
    return 0;
}

/* ---- writing ---------------------------------------------------------------------------------- */

typedef struct out {
    char *s;
    size_t n, cap;
} out;

static void put(out *o, const char *s, size_t n)
{
    if (o->n + n + 1 > o->cap) {
        while (o->n + n + 1 > o->cap)
            o->cap = o->cap ? 2 * o->cap : 65536;
        o->s = realloc(o->s, o->cap);
        if (!o->s) {
            fprintf(stderr, "gen_openapi: out of memory\n");
            exit(2);
        }
    }
    memcpy(o->s + o->n, s, n);
    o->n += n;
    o->s[o->n] = '\0';
}

static void puts_(out *o, const char *s)
{
    put(o, s, strlen(s));
}

static void string(out *o, const char *s)
{
    puts_(o, "\"");
    for (; *s; s++) {
        unsigned char c = (unsigned char)*s;
        char esc[8];
        if (c == '"' || c == '\\') {
            esc[0] = '\\';
            esc[1] = (char)c;
            put(o, esc, 2);
        } else if (c == '\n') {
            puts_(o, "\\n");
        } else if (c == '\t') {
            puts_(o, "\\t");
        } else if (c < 0x20) {
            snprintf(esc, sizeof esc, "\\u%04x", c);
            puts_(o, esc);
        } else {
            put(o, (const char *)&c, 1);
        }
    }
    puts_(o, "\"");
}

/* The shortest "%.*g" that reads back the same double; ".0" after a whole number. */
static void real(out *o, double v)
{
    char buf[40];
    for (int prec = 1; prec <= 17; prec++) {
        snprintf(buf, sizeof buf, "%.*g", prec, v);
        if (strtod(buf, NULL) == v)
            break;
    }
    puts_(o, buf);
    if (!strpbrk(buf, ".eEn"))
        puts_(o, ".0");
}

static void indent(out *o, int depth)
{
    puts_(o, "\n");
    for (int i = 0; i < depth; i++)
        puts_(o, "  ");
}

static void value(out *o, json_t *v, int depth)
{
    char buf[40];
    size_t i, n;
    switch (json_typeof(v)) {
    case JSON_OBJECT: {
        if (json_object_size(v) == 0) {
            puts_(o, "{}");
            return;
        }
        puts_(o, "{");
        const char *k;
        json_t *m;
        int first = 1;
        json_object_foreach(v, k, m) {
            if (!first)
                puts_(o, ",");
            first = 0;
            indent(o, depth + 1);
            string(o, k);
            puts_(o, ": ");
            value(o, m, depth + 1);
        }
        indent(o, depth);
        puts_(o, "}");
        return;
    }
    case JSON_ARRAY:
        n = json_array_size(v);
        if (n == 0) {
            puts_(o, "[]");
            return;
        }
        puts_(o, "[");
        for (i = 0; i < n; i++) {
            if (i)
                puts_(o, ",");
            indent(o, depth + 1);
            value(o, json_array_get(v, i), depth + 1);
        }
        indent(o, depth);
        puts_(o, "]");
        return;
    case JSON_STRING: string(o, json_string_value(v)); return;
    case JSON_INTEGER:
        snprintf(buf, sizeof buf, "%" JSON_INTEGER_FORMAT, json_integer_value(v));
        puts_(o, buf);
        return;
    case JSON_REAL: real(o, json_real_value(v)); return;
    case JSON_TRUE: puts_(o, "true"); return;
    case JSON_FALSE: puts_(o, "false"); return;
    default: puts_(o, "null"); return;
    }
}

static char *read_file(const char *path, size_t *len)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return NULL;
    out o = { 0 };
    char buf[65536];
    size_t n;
    while ((n = fread(buf, 1, sizeof buf, f)) > 0)
        put(&o, buf, n);
    fclose(f);
    *len = o.n;
    return o.s ? o.s : calloc(1, 1);
}

int main(int argc, char **argv)
{
    int check = argc == 3 && strcmp(argv[1], "--check") == 0;
    const char *path = argv[argc - 1];
    if (argc != 2 && !check) {
        fprintf(stderr, "usage: gen_openapi [--check] openapi/openapi.json\n");
        return 2;
    }
    size_t len = 0;
    char *text = read_file(path, &len);
    json_error_t jerr;
    json_t *doc = text ? json_loadb(text, len, 0, &jerr) : NULL;
    if (!doc) {
        fprintf(stderr, "gen_openapi: cannot read %s\n", path);
        return 2;
    }
    if (generate(doc) != 0)
        return 2;
    out o = { 0 };
    value(&o, doc, 0);
    puts_(&o, "\n");
    if (check) {
        if (o.n != len || memcmp(o.s, text, len) != 0) {
            fprintf(stderr, "openapi-check: %s differs from the schemas the presets' tables "
                    "give; run make openapi and commit the result\n", path);
            return 1;
        }
        printf("openapi-check: %s matches the presets' tables\n", path);
        return 0;
    }
    FILE *f = fopen(path, "wb");
    if (!f || fwrite(o.s, 1, o.n, f) != o.n || fclose(f) != 0) {
        fprintf(stderr, "gen_openapi: cannot write %s\n", path);
        return 2;
    }
    return 0;
}
