/*
 * machine_site.c — the machine_site preset (/v1/machine/site): a fixed gas
 * turbine (machine.h) at today's conditions. Inputs: the machine (shared
 * rows, machine_presets.h), the ambient `site`, the `inlet` treatment, the
 * `load` (a net output or a fraction of base load; absent: base load) and
 * the `condition` of the unit (efficiency and flow changes against new and
 * clean). Answer: every figure of the operating point (`performance`:
 * output, heat rates on LHV and HHV, fuel, air and exhaust flows, exhaust
 * and firing temperatures, pressure ratio, the control and the limit in
 * force), the inlet treatment's exit state, the machine as defined, and the
 * cycle itself (states, processes, summary, bounds, checks) as the engine
 * evaluated it, so a T-s, P-v or h-s diagram, CSV tables and select work as
 * on every cycle route.
 *
 * Model, laws and validity: machine.h (single shaft at constant speed,
 * choked first nozzle, control by the temperature limits and the inlet guide
 * vanes). The cycle is per kg of intake air; its turbine inlet is the mixed
 * rotor inlet (the firing temperature) when the turbine is cooled.
 *
 * Units: SI in the structs; the rows' quantities name the request's units.
 */
#include "core/presets/machine_presets.h"
#include "core/presets/presets.h"

#include <stdio.h>
#include <string.h>

#define IN(member) offsetof(gc_machine_site_request, member)
#define RES(member) offsetof(gc_machine_site_answer, member)
#define SITE_SHIFT ((ptrdiff_t)IN(site) - (ptrdiff_t)offsetof(gc_brayton_input, site))

/* ---- inputs ---------------------------------------------------------------------- */

static const char *const load_kinds[] = { "base", "power", "fraction", NULL }; /* load_kind */

static gc_field fields[GC_MSF_COUNT] = {
    [GC_MF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "A fixed gas turbine at site conditions." },
    [GC_MSF_LOAD] = { .name = "load", .type = GC_FT_OBJECT,
                      .description = "The load: a net output (power) or a fraction of base "
                      "load at the same conditions (fraction); absent: base load. Never below "
                      "the machine's minimum load." },
    [GC_MSF_LOAD_POWER] = { .name = "power", .parent = GC_MSF_LOAD, .type = GC_FT_NUMBER,
                            .quantity = GC_Q_POWER,
                            .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                            .min = 0.0, .max = 2e9, .offset = IN(load_power_W),
                            .description = "Net output asked for (terminals less a chiller's "
                            "power)." },
    [GC_MSF_LOAD_FRACTION] = { .name = "fraction", .parent = GC_MSF_LOAD, .type = GC_FT_NUMBER,
                               .quantity = GC_Q_FRACTION,
                               .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                               .min = 0.0, .max = 1.0, .offset = IN(load_fraction),
                               .description = "Net output as a fraction of base load at the "
                               "same conditions." },
    [GC_MSF_LOAD_KIND] = { .name = "kind", .parent = GC_MSF_LOAD, .type = GC_FT_ENUM,
                           .flags = GC_FF_DERIVED, .names = load_kinds, .offset = IN(load_kind),
                           .description = "base, power or fraction: which load was asked for "
                           "(echo only)." },
    [GC_MSF_CONDITION] = { .name = "condition", .type = GC_FT_OBJECT,
                           .description = "The unit's condition against new and clean "
                           "(fouling, erosion): default new and clean." },
    [GC_MSF_COND_COMPRESSOR_EFFICIENCY] = {
        .name = "compressor_efficiency_change", .parent = GC_MSF_CONDITION,
        .type = GC_FT_NUMBER, .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MAX,
        .min = -0.3, .max = 0.05, .offset = IN(condition.compressor_efficiency_change),
        .description = "Added to the design compressor efficiency (-0.02: two points lower)." },
    [GC_MSF_COND_COMPRESSOR_FLOW] = {
        .name = "compressor_flow_change", .parent = GC_MSF_CONDITION, .type = GC_FT_NUMBER,
        .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MAX, .min = -0.3, .max = 0.1,
        .offset = IN(condition.compressor_flow_change),
        .description = "Fractional change of the compressor's corrected flow (-0.03: 3 % "
                       "less)." },
    [GC_MSF_COND_TURBINE_EFFICIENCY] = {
        .name = "turbine_efficiency_change", .parent = GC_MSF_CONDITION, .type = GC_FT_NUMBER,
        .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MAX, .min = -0.3, .max = 0.05,
        .offset = IN(condition.turbine_efficiency_change),
        .description = "Added to the design turbine efficiency." },
};

static const gc__machine_copy site_rows[] = {
    { .dst = GC_MSF_SITE, .parent = 0, .from = "/site", .shift = SITE_SHIFT,
      .description = "Ambient conditions before the inlet treatment (default the ISO "
      "reference: 15 degC, 101.325 kPa, 60 % relative humidity; an altitude gives temperature "
      "and pressure by the U.S. Standard Atmosphere 1976). Echoed as resolved, with where "
      "each value came from." },
    { .dst = GC_MSF_SITE_ALTITUDE, .parent = GC_MSF_SITE, .from = "/site/altitude",
      .shift = SITE_SHIFT },
    { .dst = GC_MSF_SITE_TEMPERATURE, .parent = GC_MSF_SITE, .from = "/site/temperature",
      .shift = SITE_SHIFT },
    { .dst = GC_MSF_SITE_PRESSURE, .parent = GC_MSF_SITE, .from = "/site/pressure",
      .shift = SITE_SHIFT },
    { .dst = GC_MSF_SITE_RELATIVE_HUMIDITY, .parent = GC_MSF_SITE,
      .from = "/site/relative_humidity", .shift = SITE_SHIFT },
};

/* ---- outputs --------------------------------------------------------------------- */

enum {
    O_PERF = 0,
    O_INLET = O_PERF + 1 + GC__MACHINE_POINT_ROWS_N,
    O_MACHINE = O_INLET + GC__MACHINE_INLET_ROWS_N,
    O_MODEL = O_MACHINE + GC__MACHINE_OUTPUT_ROWS_N,
    O_COUNT = O_MODEL + 2
};

static gc_output outputs[O_COUNT];

static void build_outputs(void)
{
    outputs[O_PERF] = (gc_output){ .name = "performance", .parent = -1, .type = GC_OT_OBJECT,
                                   .description = "The operating point at these conditions "
                                   "and load." };
    gc__machine_point_rows(outputs + O_PERF + 1, O_PERF, RES(at.point));
    gc__machine_inlet_rows(outputs, O_INLET, RES(at.inlet));
    gc__machine_output_rows(outputs, O_MACHINE);
    outputs[O_MODEL] = (gc_output){ .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                                    .description = "Model facts (added to the cycle's model)." };
    outputs[O_MODEL + 1] = (gc_output){
        .name = "fuel", .parent = O_MODEL, .type = GC_OT_FUEL, .flags = GC_OF_EXERGY,
        .offset = RES(head.machine.chain.fuel),
        .description = "The fuel: its label, heating values at 298.15 K and standard chemical "
                       "exergy (Szargut's reference environment)." };
}

__attribute__((constructor)) static void build_tables(void)
{
    gc__machine_fill_rows(fields);
    gc__machine_copy_rows(fields, site_rows, (int)(sizeof site_rows / sizeof site_rows[0]));
    build_outputs();
}

/* ---- evaluation ---------------------------------------------------------------------- */

static const gc__machine_path_map site_map[] = { { "/load/kind", "/load" } };
#define SITE_MAP site_map, (int)(sizeof site_map / sizeof site_map[0])

static int load_of(const gc_machine_site_request *in, gc_machine_site_input *si,
                   gc_report *rep)
{
    int p = GC_IS_SET(in->load_power_W), f = GC_IS_SET(in->load_fraction);
    if (p && f) {
        rep->input = 1;
        return gc_report_error(rep, GC_ERR_INVALID, GC_MSF_LOAD, -1,
                               "give power or fraction, not both");
    }
    si->load = p ? GC_MACHINE_LOAD_POWER : f ? GC_MACHINE_LOAD_FRACTION : GC_MACHINE_LOAD_BASE;
    si->load_power_W = p ? in->load_power_W : 0.0;
    si->load_fraction = f ? in->load_fraction : 0.0;
    return GC_OK;
}

/* The engine's own warnings of the point's cycle: the site's and the
 * uncooled-blade caution are the machine's to give (and given once). */
static void cycle_warnings(const gc_machine_site_answer *r, gc_report *rep)
{
    const gc_brayton_result *b = &r->at.cycle;
    for (int i = 0; i < b->n_warnings; i++) {
        const gc_warning *w = &b->warnings[i];
        if (strcmp(w->code, "site") == 0 || strcmp(w->code, "cooled_blades") == 0)
            continue;
        int f = -1;
        if (w->field > 0) {
            char path[GC_ERROR_FIELD_LEN], core[GC_ERROR_FIELD_LEN + 8];
            gc_preset_field_path(gc_brayton_preset(), w->field, NULL, path, sizeof path);
            snprintf(core, sizeof core, "/design%s", path);
            f = gc__machine_field_of(&gc_preset_machine_site, core, SITE_MAP);
        }
        gc_report_warn(rep, w->code, f, -1, "%s", w->message);
    }
    gc_report_validity_cycle(rep, &b->cycle);
}

static void set_title(gc_machine_site_answer *r)
{
    const gc_machine_point *p = &r->at.point;
    const char *limit = p->active_limit == GC_MACHINE_LIMIT_FIRING    ? "firing-temperature"
                        : p->active_limit == GC_MACHINE_LIMIT_EXHAUST ? "exhaust-temperature"
                                                                      : "no temperature";
    if (p->control == GC_MACHINE_BASE_LOAD)
        snprintf(r->title, sizeof r->title, "Gas turbine at site conditions, base load (%s "
                 "limit)", limit);
    else
        snprintf(r->title, sizeof r->title, "Gas turbine at site conditions, %.1f %% load (%s)",
                 100.0 * p->load_fraction, p->control == GC_MACHINE_IGV_CONTROL
                     ? "inlet guide vanes closing" : "firing temperature lowered");
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_machine_site_request *in = input;
    gc_machine_site_answer *r = result;
    const gc_preset *p = &gc_preset_machine_site;
    gc_machine_site_input si;
    gc_machine_site_input_init(&si);
    int rc = load_of(in, &si, rep);
    if (rc == GC_OK)
        rc = gc__machine_define(p, &in->head, &r->head, rep);
    if (rc != GC_OK)
        return rc;
    si.site = in->site;
    si.inlet = in->head.inlet;
    si.condition = in->condition;
    si.flags = in->flags & GC_MACHINE_NO_AREAS;
    gc_error e;
    gc_error_clear(&e);
    rc = gc_machine_evaluate(&r->head.machine, &si, &r->at, &e);
    if (rc != GC_OK) {
        rep->input = rc == GC_ERR_INVALID;
        return gc__machine_report_error(p, rep, &e, SITE_MAP);
    }
    gc__machine_report_warnings(p, rep, r->at.warnings, r->at.n_warnings, SITE_MAP);
    cycle_warnings(r, rep);
    set_title(r);
    return GC_OK;
}

/* ---- hooks ------------------------------------------------------------------------- */

static void init(void *input)
{
    gc_machine_site_request *in = input;
    gc__machine_head_init(&in->head);
    gc_site_input_init(&in->site);
}

static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_machine_site_request *in = input;
    gc_machine_site_request *e = echo_input;
    gc__machine_echo(&((const gc_machine_site_answer *)result)->head, &e->head);
    e->load_kind = GC_IS_SET(in->load_power_W)    ? GC_MACHINE_LOAD_POWER
                   : GC_IS_SET(in->load_fraction) ? GC_MACHINE_LOAD_FRACTION
                                                  : GC_MACHINE_LOAD_BASE;
}

static const gc_cycle_result *cycle_of(const void *result)
{
    return &((const gc_machine_site_answer *)result)->at.cycle.cycle;
}

static void view(const void *input, const void *result, gc_cycle_view *v)
{
    (void)input;
    (void)result;
    v->basis = "per kg of intake air";
}

static const char *title_of(const void *input, const void *result)
{
    (void)input;
    return ((const gc_machine_site_answer *)result)->title;
}

static void lean(void *input, unsigned what)
{
    if (what & GC_LEAN_NO_AREAS)
        ((gc_machine_site_request *)input)->flags |= GC_MACHINE_NO_AREAS;
}

const gc_preset gc_preset_machine_site = {
    .name = "machine_site",
    .segment = "site",
    .route_base = "/v1/machine/",
    .label = "machine_site",
    .title = "Gas turbine at site conditions",
    .description = "A fixed single-shaft gas turbine at today's conditions: output, heat rate "
                   "(LHV and HHV), fuel, air and exhaust flows, exhaust and firing "
                   "temperatures, pressure ratio and the control limit in force, at base load "
                   "or part load, with an inlet treatment (evaporative cooler, fogging, "
                   "chiller) and a degraded condition, and the cycle of that operating point "
                   "(states, processes, bounds) as the engine evaluates it. The machine is "
                   "defined by its design point (a Brayton description or rated figures); "
                   "off design the compressor follows its corrected flow and the choked first "
                   "nozzle sets the pressure ratio.",
    .kind = GC_PRESET_CYCLE,
    .fields = fields,
    .n_fields = GC_MSF_COUNT,
    .outputs = outputs,
    .n_outputs = O_COUNT,
    .input_size = sizeof(gc_machine_site_request),
    .result_size = sizeof(gc_machine_site_answer),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .cycle = cycle_of,
    .view = view,
    .title_of = title_of,
    .lean = lean,
    .site = RES(at.site) + 1,
};
