/*
 * doc.c — a preset's response document (doc.h): the preset's own outputs
 * from its output table, the "inputs" echo from its field table, warnings
 * and cautions, and the document's frame. Every number goes through the
 * writer (jw.h), which converts it to the chosen unit system and records its
 * unit.
 *
 * Echo rules per row: a row flagged GC_FF_NO_ECHO is never echoed; an
 * optional row (GC_FF_OPTIONAL) or one flagged GC_FF_ECHO_GIVEN only while
 * given; every other row always, with its default filled in. A gas is
 * {"model", ...}: its members for the cold model, the row's def_name when it
 * was not given (e.g. "site_air"); a fuel as it was given (a name, the
 * analysis, or the formula with its heating value and liquid cp), or its
 * label (GC_FF_ECHO_LABEL); a GC_FF_SITE object the resolved site (with
 * where each value came from); a pair list {"samples": n}; a series
 * {"values": n}, a list of series {"series": n, "values": length}.
 * An output row that names parts of the document (gc_output.include) is
 * written only when the request included them (include=<name>).
 */
#include "api/respond/doc.h"
#include "api/request/fields.h"
#include "gascycle/combustion.h"
#include "gascycle/exergy.h"
#include "gascycle/site.h"
#include "gascycle/species.h"

#include <stdio.h>
#include <string.h>

#define AT(base, off) ((const char *)(base) + (off))
#define DBL(base, off) (*(const double *)(const void *)AT(base, off))
#define INT(base, off) (*(const int *)(const void *)AT(base, off))

/* ---- outputs ------------------------------------------------------------------------------ */

static int row_present(const gc_jw *w, const gc_output *o, const void *input,
                       const void *result, const char *item)
{
    const char *base = (o->flags & GC_OF_INPUT) ? input : (item ? item : result);
    if (o->include & ~w->include)
        return 0;
    if (o->present && !INT(base, o->present - 1))
        return 0;
    if ((o->flags & GC_OF_POSITIVE) && o->type == GC_OT_NUMBER && !(DBL(base, o->offset) > 0.0))
        return 0;
    return 1;
}

static void write_number(gc_jw *w, const gc_output *o, const char *key, double v)
{
    if (o->has_quantity) {
        gc_jw_q(w, key, v, o->quantity);
    } else if (o->unit_si) {
        int us = w->sys == GC_UNITS_US;
        double f = us ? o->us_factor : o->si_factor;
        gc_jw_num_unit(w, key, f != 0.0 ? v * f : v, us ? o->unit_us : o->unit_si);
    } else {
        gc_jw_num(w, key, v);
    }
}

static void write_fuel(gc_jw *w, const char *key, const gc_fuel *fuel, int exergy)
{
    gc_jw_object(w, key);
    gc_jw_str(w, "label", fuel->label);
    gc_jw_q(w, "lower_heating_value", fuel->LHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "higher_heating_value", fuel->HHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    if (exergy)
        gc_jw_q(w, "chemical_exergy", gc_exergy_fuel_standard(fuel), GC_Q_SPECIFIC_ENERGY);
    gc_jw_end(w);
}

static void write_children(gc_jw *w, const gc_preset *p, int parent, const void *input,
                           const void *result, const char *item)
{
    for (int r = 0; r < p->n_outputs; r++)
        if (p->outputs[r].parent == parent)
            gc_api_write_output(w, p, r, input, result, item);
}

static void write_list(gc_jw *w, const gc_preset *p, int row, const void *input,
                       const void *result, const char *key)
{
    const gc_output *o = &p->outputs[row];
    const char *base = (o->flags & GC_OF_INPUT) ? input : result;
    int n = INT(base, o->count - 1);
    gc_jw_array(w, key);
    for (int i = 0; i < n && i < o->max_items; i++) {
        gc_jw_object(w, NULL);
        write_children(w, p, row, input, result, AT(base, o->offset + (size_t)i * o->item_size));
        gc_jw_end(w);
    }
    gc_jw_end(w);
}

void gc_api_write_output(gc_jw *w, const gc_preset *p, int row, const void *input,
                         const void *result, const char *item)
{
    const gc_output *o = &p->outputs[row];
    if (!row_present(w, o, input, result, item))
        return;
    const char *base = (o->flags & GC_OF_INPUT) ? input : (item ? item : result);
    const char *key = o->name && o->name[0] ? o->name : NULL;
    switch (o->type) {
    case GC_OT_NUMBER: write_number(w, o, key, DBL(base, o->offset)); break;
    case GC_OT_INTEGER: gc_jw_int(w, key, INT(base, o->offset)); break;
    case GC_OT_BOOL: gc_jw_bool(w, key, INT(base, o->offset)); break;
    case GC_OT_STRING: gc_jw_str(w, key, AT(base, o->offset)); break;
    case GC_OT_TEXT: gc_jw_str(w, key, *(const char *const *)(const void *)AT(base, o->offset));
        break;
    case GC_OT_CONST: gc_jw_str(w, key, o->text); break;
    case GC_OT_ENUM: gc_jw_str(w, key, o->names[INT(base, o->offset)]); break;
    case GC_OT_OBJECT:
    case GC_OT_ARRAY:
        if (o->type == GC_OT_OBJECT)
            gc_jw_object(w, key);
        else
            gc_jw_array(w, key);
        write_children(w, p, row, input, result, item);
        gc_jw_end(w);
        break;
    case GC_OT_LIST: write_list(w, p, row, input, result, key); break;
    case GC_OT_FUEL:
        write_fuel(w, key, (const gc_fuel *)(const void *)AT(base, o->offset),
                   (o->flags & GC_OF_EXERGY) != 0);
        break;
    default: break;
    }
}

static int is_section(const gc_output *o)
{
    return o->parent < 0 && o->name && (strcmp(o->name, "model") == 0 ||
                                        strcmp(o->name, "summary") == 0 ||
                                        strcmp(o->name, "bounds") == 0);
}

void gc_api_write_outputs(gc_jw *w, const gc_preset *p, int parent, const void *input,
                          const void *result, const char *item, int skip_sections)
{
    for (int r = 0; r < p->n_outputs; r++) {
        const gc_output *o = &p->outputs[r];
        if (o->parent != parent || (skip_sections && is_section(o)))
            continue;
        gc_api_write_output(w, p, r, input, result, item);
    }
}

/* ---- echo ------------------------------------------------------------------------------------ */

static int echoed(const gc_field *f, const char *base)
{
    if (f->name == NULL || (f->flags & GC_FF_NO_ECHO))
        return 0;
    if (f->given && (f->flags & (GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN | GC_FF_DERIVED)))
        return INT(base, f->given - 1) != 0;
    if (f->type == GC_FT_NUMBER && (f->flags & GC_FF_OPTIONAL))
        return GC_IS_SET(DBL(base, f->offset));
    if (f->type == GC_FT_FUEL && f->given)
        return INT(base, f->given - 1) != 0;
    if (f->type == GC_FT_NUMBER_LIST && (f->flags & GC_FF_OPTIONAL))
        return INT(base, f->count - 1) > 0;
    return 1;
}

/* A number left out of the echo still names its unit when the request may
 * give it (an input with a `given` flag, outside lists): units list every
 * such input. */
static void unit_only(gc_jw *w, const gc_preset *p, const gc_field *f)
{
    if (f->type == GC_FT_NUMBER && f->given && (f->flags & (GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN)) &&
        !(f->flags & GC_FF_NO_ECHO) && gc_preset_list_of(p, f->parent) < 0)
        gc_jw_unit(w, f->name, gc_units_label(f->quantity, w->sys));
}

static const char *source_name(gc_site_source s)
{
    switch (s) {
    case GC_SITE_FROM_INPUT: return "input";
    case GC_SITE_FROM_ATMOSPHERE: return "standard_atmosphere";
    default: return "iso_reference";
    }
}

static void echo_site(gc_jw *w, const char *key, const gc_site *site)
{
    gc_jw_object(w, key);
    gc_jw_q(w, "altitude", site->altitude_m, GC_Q_LENGTH);
    gc_jw_q(w, "temperature", site->T_K, GC_Q_AMBIENT_TEMPERATURE);
    gc_jw_q(w, "pressure", site->P_Pa, GC_Q_PRESSURE);
    gc_jw_num(w, "relative_humidity", site->RH);
    gc_jw_num(w, "humidity_ratio", site->W_kg_per_kg);
    gc_jw_object(w, "sources");
    gc_jw_str(w, "temperature", source_name(site->T_from));
    gc_jw_str(w, "pressure", source_name(site->P_from));
    gc_jw_str(w, "relative_humidity", source_name(site->RH_from));
    gc_jw_end(w);
    gc_jw_end(w);
}

/* The cold model's members through their rows (their quantities). */
static void echo_cold(gc_jw *w, const gc_preset *p, int row, const gc_gas *g)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->parent != row || f->name == NULL)
            continue;
        double v = strcmp(f->name, "cp") == 0 ? g->cp_cold_J_per_kgK : g->k_cold;
        gc_jw_q(w, f->name, v, f->quantity);
    }
}

static void echo_gas(gc_jw *w, const gc_preset *p, int row, const char *base)
{
    const gc_field *f = &p->fields[row];
    const gc_gas *g = (const gc_gas *)(const void *)AT(base, f->offset);
    int given = f->given ? INT(base, f->given - 1) : 1;
    gc_jw_object(w, f->name);
    if (!given && f->def_name) {
        gc_jw_str(w, "model", f->def_name);
    } else if (g->kind == GC_GAS_COLD) {
        gc_jw_str(w, "model", "cold");
        echo_cold(w, p, row, g);
    } else {
        gc_jw_str(w, "model", "air");
    }
    gc_jw_end(w);
}

static void echo_fuel(gc_jw *w, const gc_field *f, const char *base)
{
    const gc_fuel *fuel = (const gc_fuel *)(const void *)AT(base, f->offset);
    const gc_fuel_spec *s = f->aux ? (const gc_fuel_spec *)(const void *)AT(base, f->aux - 1)
                                   : NULL;
    if ((f->flags & GC_FF_ECHO_LABEL) || s == NULL) {
        gc_jw_str(w, f->name, fuel->label);
    } else if (s->form == GC_FUEL_NAMED) {
        gc_jw_str(w, f->name, s->name);
    } else if (s->form == GC_FUEL_ANALYSIS) {
        gc_jw_object(w, f->name);
        gc_jw_object(w, "analysis");
        for (int i = 0; i < s->n; i++)
            gc_jw_num(w, gc_species_get(s->species[i])->name, s->x[i]);
        gc_jw_end(w);
        gc_jw_end(w);
    } else {
        gc_jw_object(w, f->name);
        gc_jw_str(w, "formula", s->name);
        gc_jw_q(w, "lower_heating_value", s->lhv_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "liquid_cp", fuel->cp_liquid_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        gc_jw_end(w);
    }
}

/* How an echo pass treats a resolved site (its units are recorded after the
 * other inputs', as the site is resolved last). */
enum { ECHO_ALL = 0, ECHO_NO_SITE_UNITS, ECHO_SITE_ONLY };

static void echo_members(gc_jw *w, const gc_preset *p, int parent, const char *base,
                         const void *result, int mode);

static void echo_numbers(gc_jw *w, const gc_field *f, const char *base)
{
    int n = INT(base, f->count - 1);
    const double *x = (const double *)(const void *)AT(base, f->offset);
    gc_jw_array(w, f->name);
    for (int i = 0; i < n && i < f->max_items; i++)
        gc_jw_q(w, NULL, x[i], f->quantity);
    gc_jw_end(w);
}

static void echo_list(gc_jw *w, const gc_preset *p, int row, const char *base,
                      const void *result, int mode)
{
    const gc_field *f = &p->fields[row];
    int n = INT(base, f->count - 1);
    gc_jw_array(w, f->name);
    for (int i = 0; i < n && i < f->max_items; i++) {
        gc_jw_object(w, NULL);
        echo_members(w, p, row, AT(base, f->offset + (size_t)i * f->item_size), result, mode);
        gc_jw_end(w);
    }
    gc_jw_end(w);
}

static void echo_object(gc_jw *w, const gc_preset *p, int row, const char *base,
                        const void *result, int mode)
{
    const gc_field *f = &p->fields[row];
    if (!(f->flags & GC_FF_SITE) || !p->site) {
        gc_jw_object(w, f->name);
        echo_members(w, p, row, base, result, mode);
        gc_jw_end(w);
        return;
    }
    int keep = w->no_units;
    w->no_units = keep || mode == ECHO_NO_SITE_UNITS;
    echo_site(w, f->name, (const gc_site *)(const void *)AT(result, p->site - 1));
    w->no_units = keep;
}

/* Another preset's request: {"cycle": name, "inputs": its echo}, its sites
 * resolved from its result inside ours. */
static void echo_nested(gc_jw *w, const gc_preset *p, int row, const char *base,
                        const void *result, int mode)
{
    const gc_field *f = &p->fields[row];
    const gc_preset *sub = gc_preset_nested(p, row, base);
    if (sub == NULL || result == NULL || f->aux == 0)
        return;
    gc_jw_object(w, f->name);
    if (mode != ECHO_SITE_ONLY)
        gc_jw_str(w, "cycle", sub->name);
    gc_jw_object(w, "inputs");
    echo_members(w, sub, 0, AT(base, f->offset), AT(result, f->aux - 1), mode);
    gc_jw_end(w);
    gc_jw_end(w);
}

static void echo_row(gc_jw *w, const gc_preset *p, int row, const char *base, const void *result,
                     int mode)
{
    const gc_field *f = &p->fields[row];
    if (mode == ECHO_SITE_ONLY) {
        if (f->type == GC_FT_OBJECT)
            echo_object(w, p, row, base, result, mode);
        else if (f->type == GC_FT_PRESET)
            echo_nested(w, p, row, base, result, mode);
        return;
    }
    switch (f->type) {
    case GC_FT_NUMBER:
        if (f->flags & GC_FF_ECHO_PLAIN)
            gc_jw_num(w, f->name, gc_units_from_si(f->quantity, w->sys, DBL(base, f->offset)));
        else
            gc_jw_q(w, f->name, DBL(base, f->offset), f->quantity);
        break;
    case GC_FT_INTEGER: gc_jw_int(w, f->name, INT(base, f->offset)); break;
    case GC_FT_BOOL: gc_jw_bool(w, f->name, INT(base, f->offset)); break;
    case GC_FT_ENUM: gc_jw_str(w, f->name, f->names[INT(base, f->offset)]); break;
    case GC_FT_STRING: gc_jw_str(w, f->name, AT(base, f->offset)); break;
    case GC_FT_OBJECT: echo_object(w, p, row, base, result, mode); break;
    case GC_FT_GAS: echo_gas(w, p, row, base); break;
    case GC_FT_FUEL: echo_fuel(w, f, base); break;
    case GC_FT_LIST: echo_list(w, p, row, base, result, mode); break;
    case GC_FT_NUMBER_LIST: echo_numbers(w, f, base); break;
    case GC_FT_PAIR_LIST:
        gc_jw_object(w, f->name);
        gc_jw_int(w, "samples", INT(base, f->count - 1));
        gc_jw_end(w);
        break;
    case GC_FT_PRESET: echo_nested(w, p, row, base, result, mode); break;
    case GC_FT_SERIES:
        gc_jw_object(w, f->name);
        gc_jw_int(w, "values", INT(base, f->count - 1));
        gc_jw_end(w);
        break;
    case GC_FT_SERIES_LIST:
        gc_jw_object(w, f->name);
        gc_jw_int(w, "series", INT(base, f->count - 1));
        gc_jw_int(w, "values", INT(base, f->aux - 1));
        gc_jw_end(w);
        break;
    default: break;
    }
}

static void echo_members(gc_jw *w, const gc_preset *p, int parent, const char *base,
                         const void *result, int mode)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->parent != parent)
            continue;
        if (echoed(f, base))
            echo_row(w, p, r, base, result, mode);
        else if (f->name && mode != ECHO_SITE_ONLY)
            unit_only(w, p, f);
    }
}

/* How the inputs were read (decode.h, readings in context). */
static void echo_reading(gc_jw *w, const gc_decode_ctx *c)
{
    gc_jw_str(w, "input_units", gc_units_system_name(c ? c->opts.input_sys : GC_UNITS_SI));
    if (!c)
        return;
    if (c->opts.decimal_comma)
        gc_jw_str(w, "decimal", "comma");
    if (c->baro_used) {
        gc_jw_q(w, "barometric_pressure", c->baro_Pa, GC_Q_PRESSURE);
        gc_jw_str(w, "barometric_pressure_source", c->baro_source);
    }
    if (c->std_used) {
        const char *name = "";
        gc_units_std_conditions(c->std_cond, NULL, NULL, &name);
        gc_jw_str(w, "standard_conditions", name);
        gc_jw_q(w, "fuel_density_standard", c->std_density, GC_Q_DENSITY);
    }
}

static void write_echo(gc_jw *w, const gc_preset *p, const void *echo, const void *result,
                       int mode, const gc_decode_ctx *ctx)
{
    gc_jw_object(w, "inputs");
    echo_members(w, p, 0, echo, result, mode);
    if (mode != ECHO_SITE_ONLY)
        echo_reading(w, ctx);
    gc_jw_end(w);
}

void gc_api_write_echo(gc_jw *w, const gc_preset *p, const void *echo, const void *result)
{
    write_echo(w, p, echo, result, ECHO_ALL, NULL);
}

/* The nested presets' own echo hooks, on their parts of the copy. */
static int echo_nested_hooks(const gc_preset *p, const void *input, const void *result,
                             void *buf)
{
    int any = 0;
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        const gc_preset *sub = f->type == GC_FT_PRESET ? gc_preset_nested(p, r, input) : NULL;
        if (sub == NULL || sub->echo == NULL || f->aux == 0)
            continue;
        any = 1;
        if (buf)
            sub->echo(AT(input, f->offset), AT(result, f->aux - 1), (char *)buf + f->offset);
    }
    return any;
}

const void *gc_api_echo_input(const gc_preset *p, const void *input, const void *result,
                              void *buf)
{
    if (p->echo == NULL && !echo_nested_hooks(p, input, result, NULL))
        return input;
    memcpy(buf, input, p->input_size);
    if (p->echo)
        p->echo(input, result, buf);
    echo_nested_hooks(p, input, result, buf);
    return buf;
}

/* ---- warnings, cautions, the frame ------------------------------------------------------------ */

/* A close step that met the start state only within GC_CYCLE_TOL_CLOSE: say
 * so, with both values in the chosen units (a value is never changed
 * silently). */
static void close_warning(gc_jw *w, const gc_cycle_run *run)
{
    if (!(run->checks.close_rel > GC_CYCLE_TOL_STATE))
        return;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->kind != GC_PROC_CLOSE)
            continue;
        const gc_cycle_state *a = &run->states[p->from], *s0 = &run->states[0];
        int cv = p->curve == GC_CURVE_ISOCHORE;
        double got = cv ? a->v_m3_per_kg : a->P_Pa, want = cv ? s0->v_m3_per_kg : s0->P_Pa;
        gc_quantity q = cv ? GC_Q_SPECIFIC_VOLUME : GC_Q_PRESSURE;
        char msg[GC_WARNING_LEN];
        snprintf(msg, sizeof msg,
                 "the state before the close (process %d) is at %s = %.9g %s, the start "
                 "state at %.9g %s (relative difference %.2g, within the tolerance %g for "
                 "typed values): the close takes the gas back to the start state", k + 1,
                 cv ? "v" : "P", gc_units_from_si(q, w->sys, got), gc_units_label(q, w->sys),
                 gc_units_from_si(q, w->sys, want), gc_units_label(q, w->sys),
                 run->checks.close_rel, GC_CYCLE_TOL_CLOSE);
        gc_jw_object(w, NULL);
        gc_jw_str(w, "code", "close_mismatch");
        gc_jw_str(w, "message", msg);
        gc_jw_end(w);
        return;
    }
}

void gc_api_write_warnings(gc_jw *w, const gc_preset *p, const void *result,
                           const gc_report *rep, const char *prefix)
{
    gc_jw_array(w, "warnings");
    if (p->cycle && result)
        close_warning(w, &p->cycle(result)->actual);
    for (int i = 0; rep && i < rep->n_warnings; i++) {
        const gc_warning *wr = &rep->warnings[i];
        gc_jw_object(w, NULL);
        gc_jw_str(w, "code", wr->code);
        if (wr->field >= 0) {
            char ptr[GC_API_FIELD_LEN + 16];
            gc_api_field_pointer(p, wr->field, wr->index, prefix, ptr, sizeof ptr);
            gc_jw_str(w, "field", ptr);
        }
        gc_jw_str(w, "message", wr->message);
        gc_jw_end(w);
    }
    gc_jw_end(w);
}

static void write_cautions(gc_jw *w)
{
    static const char *const text[] = {
        "These figures are idealised estimates meant for design studies and performance "
        "monitoring.",
        "They do not replace acceptance testing to the applicable test codes, the equipment "
        "maker's limits, local codes, or the judgement of a licensed engineer.",
        "Do not use them to drive protection or control systems.",
    };
    gc_jw_array(w, "cautions");
    for (size_t i = 0; i < sizeof text / sizeof text[0]; i++)
        gc_jw_str(w, NULL, text[i]);
    gc_jw_end(w);
}

/* Runs one writer pass that only records units (nothing is written, no
 * target followed): the echo's first (the decoder registered them before
 * the result existed), the preset's outputs after the cycle parts (in the
 * order of its table, the parts' own units first). */
static void units_pass(gc_jw *w, const gc_preset *p, const void *echo, const void *result,
                       int outputs, const gc_decode_ctx *ctx)
{
    if (w->quiet)
        return;
    gc_strbuf *b = w->b;
    gc_jw_target *t = w->t;
    gc_jw_sink sink = w->sink;
    int nt = w->nt, sel = w->select, nf = w->nonfinite;
    w->b = NULL;
    w->t = NULL;
    w->nt = 0;
    w->select = 0;
    w->sink = NULL;
    gc_jw_object(w, NULL);
    if (outputs) {
        gc_api_write_outputs(w, p, -1, echo, result, NULL, 0);
    } else {
        write_echo(w, p, echo, result, ECHO_NO_SITE_UNITS, ctx);
        write_echo(w, p, echo, result, ECHO_SITE_ONLY, ctx);
    }
    gc_jw_end(w);
    w->b = b;
    w->t = t;
    w->nt = nt;
    w->select = sel;
    w->sink = sink;
    w->nonfinite = nf;
}

void gc_api_write_document(gc_jw *w, const gc_preset *p, const void *echo, const void *result,
                           const gc_report *rep, const gc_api_docopts *o)
{
    const gc_decode_ctx *ctx = o ? o->ctx : NULL;
    w->include = o ? o->include : 0u;
    units_pass(w, p, echo, result, 0, ctx);
    gc_jw_object(w, NULL);
    if (p->kind == GC_PRESET_CYCLE) {
        gc_jw_str(w, "cycle", p->name);
        gc_jw_str(w, "title", p->title_of ? p->title_of(echo, result) : p->title);
        if (p->cycle) {
            gc_api_write_cycle(w, p, echo, result, o);
            units_pass(w, p, echo, result, 1, ctx);
        }
        /* a cycle of no engine chain (p->cycle NULL) writes its own parts */
        gc_api_write_outputs(w, p, -1, echo, result, NULL, p->cycle != NULL);
    } else {
        gc_jw_str(w, "reduction", p->name);
        gc_jw_str(w, "title", p->title_of ? p->title_of(echo, result) : p->title);
        gc_api_write_outputs(w, p, -1, echo, result, NULL, 0);
    }
    write_echo(w, p, echo, result, ECHO_ALL, ctx);
    gc_api_write_warnings(w, p, result, rep, o ? o->warn_prefix : NULL);
    write_cautions(w);
    gc_jw_str(w, "unit_system", gc_units_system_name(w->sys));
    gc_jw_units(w, "units");
    gc_jw_end(w);
}
