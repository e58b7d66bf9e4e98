/*
 * combined_eval.c — the combined-cycle preset's evaluation (combined.h):
 * the topping through its own descriptor, its exhaust through its adapter,
 * the HRSG and steam cycle through the steam core (steam.h), then the plant
 * (combined_plant.c) and the ideal bound. The steam core's errors and
 * warnings name its own inputs by pointer; they are mapped to this preset's
 * field ids (the exhaust's inputs, supplied by the topping, to "/topping").
 * Units: SI.
 */
#include "core/presets/combined_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* ---- the steam core's input ------------------------------------------------------------ */

static double or_zero(double v, int has)
{
    return (has || (GC_IS_SET(v) && v > 0.0)) && GC_IS_SET(v) ? v : 0.0;
}

static void steam_levels(const gc_combined_input *in, gc_steam_input *s)
{
    s->n_levels = in->n_levels;
    for (int i = 0; i < in->n_levels && i < GC_STEAM_MAX_LEVELS; i++) {
        const gc_combined_level *l = &in->levels[i];
        s->levels[i].pressure_Pa = l->pressure;
        s->levels[i].steam_temperature_K = or_zero(l->steam_temperature,
                                                   l->has_steam_temperature);
        s->levels[i].pinch_K = l->pinch;
        s->levels[i].approach_K = l->approach;
        s->levels[i].steam_mass_flow_kg_per_s = or_zero(l->steam_mass_flow,
                                                        l->has_steam_mass_flow);
    }
}

static void steam_condenser(const gc_combined_input *in, gc_steam_input *s)
{
    if (GC_IS_SET(in->cooling_water_temperature)) {
        s->condenser_pressure_Pa = 0.0;
        s->cooling_water_temperature_K = in->cooling_water_temperature;
    } else {
        s->condenser_pressure_Pa = in->condenser_pressure;
    }
    s->cooling_water_rise_K = in->cooling_water_rise;
    s->condenser_terminal_difference_K = in->condenser_terminal_difference;
    s->deaerator = GC_IS_SET(in->deaerator_pressure);
    s->deaerator_pressure_Pa = s->deaerator ? in->deaerator_pressure : 0.0;
}

void gc__combined_steam_input(const gc_combined_input *in, const gc_combined_exhaust *x,
                              gc_steam_input *s)
{
    gc_steam_input_init(s);
    s->gas = x->gas;
    s->gas_temperature_K = x->T_K;
    s->gas_pressure_Pa = x->P_Pa;
    s->intake_mass_flow_kg_per_s = x->intake_mass_flow;
    s->exhaust_mass_ratio = x->exhaust_mass_ratio;
    s->gas_pressure_loss = x->pressure_loss;
    s->stack_temperature_min_K = or_zero(in->stack_temperature_min, 0);
    s->firing_temperature_K = or_zero(in->firing_temperature, 0);
    s->has_fuel = in->has_duct_burner_fuel || x->has_fuel;
    if (in->has_duct_burner_fuel)
        s->fuel = in->duct_burner_fuel;
    else if (x->has_fuel)
        s->fuel = x->fuel;
    s->fuel_temperature_K = in->duct_burner_fuel_temperature;
    s->burner_efficiency = in->burner_efficiency;
    steam_levels(in, s);
    s->reheat_temperature_K = or_zero(in->reheat_temperature, 0);
    s->reheat_pressure_Pa = or_zero(in->reheat_pressure, 0);
    s->turbine_efficiency = in->turbine_efficiency;
    s->pump_efficiency = in->pump_efficiency;
    steam_condenser(in, s);
    s->dryness_min = in->dryness_min;
    s->dead_state_temperature_K = x->T_dead_K;
    s->dead_state_pressure_Pa = x->P_dead_Pa;
    s->flags = 0u;
    if (in->flags & GC_COMBINED_NO_IDEAL)
        s->flags |= GC_STEAM_NO_IDEAL;
    if (in->flags & GC_COMBINED_NO_TQ)
        s->flags |= GC_STEAM_NO_TQ;
}

/* ---- the steam core's pointers as field ids ------------------------------------------- */

int gc__combined_field_of(const char *pointer, int *index)
{
    static const struct { const char *ptr; int id; } alias[] = {
        { "/fuel", GC_CF_DUCT_BURNER_FUEL },
        { "/fuel_temperature", GC_CF_DUCT_BURNER_FUEL_TEMPERATURE },
    };
    int idx[2] = { -1, -1 };
    *index = -1;
    if (pointer == NULL || pointer[0] == '\0')
        return -1;
    for (size_t i = 0; i < sizeof alias / sizeof alias[0]; i++)
        if (strcmp(pointer, alias[i].ptr) == 0)
            return alias[i].id;
    int id = gc_preset_field_find(&gc_preset_combined, pointer, idx);
    if (id > 0) {
        *index = idx[0];
        return id;
    }
    return GC_CF_TOPPING;
}

/* A steam core error: its field mapped; the topping's part named so. */
static int steam_error(gc_report *rep, const gc_error *e)
{
    int index = -1, id = gc__combined_field_of(e->field, &index);
    if (id == GC_CF_TOPPING && e->field[0])
        return gc_report_error(rep, e->code, id, -1, "the topping's exhaust or ambient (%s): "
                               "%.200s", e->field + 1, e->message);
    return gc_report_error(rep, e->code, id > 0 ? id : -1, index, "%s", e->message);
}

/* The steam core's warning code as static text (a report keeps pointers). */
static const char *static_code(const char *code)
{
    static const char *const codes[] = {
        "burner_exergy_not_evaluated", "condenser_below_dead_state", "economiser_steaming_risk",
        "feedwater_below_acid_dew_point", "pinch_small", "stack_below_minimum",
        "turbine_exhaust_wet", "actual_equals_ideal", "ideal_not_evaluated", NULL };
    for (int i = 0; codes[i]; i++)
        if (strcmp(code, codes[i]) == 0)
            return codes[i];
    return "steam_cycle";
}

static void steam_warnings(const gc_steam_result *s, gc_report *rep)
{
    for (int i = 0; i < s->n_warnings; i++) {
        const gc_steam_warning *w = &s->warnings[i];
        int index = -1, id = gc__combined_field_of(w->field, &index);
        gc_report_warn(rep, static_code(w->code), id, index, "%s", w->message);
    }
}

/* ---- the evaluation --------------------------------------------------------------------- */

static int check_inputs(const gc_combined_input *in, gc_report *rep)
{
    int before = rep->n_errors;
    int given_pressure = in->has_condenser_pressure;
    if (given_pressure && GC_IS_SET(in->cooling_water_temperature))
        gc_report_error(rep, GC_ERR_INVALID, GC_CF_COOLING_WATER_TEMPERATURE, -1,
                        "give either condenser_pressure or cooling_water_temperature, not "
                        "both");
    if (rep->n_errors > before) {
        rep->input = 1;
        return rep->errors[before].code;
    }
    return GC_OK;
}

/* The topping through its descriptor (on a copy with the lean options). */
static int run_topping(const gc_combined_input *in, const gc_combined_topping *t,
                       gc_combined_result *r, gc_report *rep)
{
    static _Thread_local gc_combined_input copy;
    static _Thread_local gc_report sub;
    const void *tin = in->topping.bytes;
    if (in->flags & (GC_COMBINED_NO_IDEAL | GC_COMBINED_NO_AREAS)) {
        memcpy(copy.topping.bytes, in->topping.bytes, t->preset->input_size);
        if ((in->flags & GC_COMBINED_NO_IDEAL) && t->lean)
            t->lean(copy.topping.bytes);
        if ((in->flags & GC_COMBINED_NO_AREAS) && t->preset->lean)
            t->preset->lean(copy.topping.bytes, GC_LEAN_NO_AREAS);
        tin = copy.topping.bytes;
    }
    gc_report_init(&sub);
    sub.skip_validity = rep->skip_validity;
    int rc = t->preset->evaluate(tin, r->topping.bytes, &sub);
    gc_report_nested(rep, &gc_preset_combined, GC_CF_TOPPING, t->preset, &sub);
    if (rc != GC_OK)
        return rc;
    gc_error err;
    gc_error_clear(&err);
    rc = t->exhaust(tin, r->topping.bytes, 0, &r->exhaust, &err);
    if (rc != GC_OK)
        return gc_report_error(rep, rc, GC_CF_TOPPING, -1, "%s", err.message);
    const char *title = t->preset->title_of ? t->preset->title_of(tin, r->topping.bytes)
                                            : t->preset->title;
    snprintf(r->topping_name, sizeof r->topping_name, "%s", t->preset->name);
    snprintf(r->title, sizeof r->title, "Combined cycle: %.100s, %d-pressure HRSG%s%s", title,
             in->n_levels, GC_IS_SET(in->reheat_temperature) ? ", reheat" : "",
             GC_IS_SET(in->firing_temperature) ? ", duct firing" : "");
    return GC_OK;
}

static void clear(gc_combined_result *r)
{
    size_t a = offsetof(gc_combined_result, topping_name);
    size_t b = offsetof(gc_combined_result, steam);
    memset((char *)r + a, 0, b - a);
    size_t c = offsetof(gc_combined_result, summary);
    memset((char *)r + c, 0, sizeof *r - c);
}

int gc__combined_evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_combined_input *in = input;
    gc_combined_result *r = result;
    clear(r);
    int rc = check_inputs(in, rep);
    const gc_combined_topping *t = gc__combined_topping_of(in);
    if (rc != GC_OK)
        return rc;
    if (t == NULL)
        return gc_report_error(rep, GC_ERR_INVALID, GC_CF_TOPPING, -1,
                               "names no topping cycle this plant can take");
    rc = run_topping(in, t, r, rep);
    if (rc != GC_OK)
        return rc;
    gc_steam_input s;
    gc__combined_steam_input(in, &r->exhaust, &s);
    gc_error err;
    gc_error_clear(&err);
    rc = gc_steam_evaluate(&s, &r->steam, &err);
    if (rc != GC_OK)
        return steam_error(rep, &err);
    steam_warnings(&r->steam, rep);
    rc = gc__combined_plant(in, r, rep);
    if (rc == GC_OK && !(in->flags & GC_COMBINED_NO_IDEAL))
        gc__combined_ideal(in, r, rep);
    return rc;
}

/* ---- the ideal bounds --------------------------------------------------------------------- */

static void ideal_warning(gc_report *rep, const char *why)
{
    gc_report_warn(rep, "ideal_not_evaluated", -1, -1, "the ideal bound could not be "
                   "evaluated: %.400s", why);
}

/* The actual topping and the steam core's ideal counterpart. */
static void ideal_steam(gc_combined_result *r)
{
    const gc_steam_summary *ss = &r->steam.summary;
    gc_combined_bounds *b = &r->bounds;
    if (!ss->has_ideal || !r->summary.has_efficiency)
        return;
    b->has_ideal_steam = 1;
    b->ideal_steam_cycle_net_power_W = ss->ideal_net_power_W;
    b->ideal_steam_net_power_W = r->exhaust.net_power_W + ss->ideal_net_power_W;
    b->ideal_steam_efficiency = b->ideal_steam_net_power_W / r->summary.fuel_heat_W;
}

void gc__combined_ideal(const gc_combined_input *in, gc_combined_result *r, gc_report *rep)
{
    const gc_combined_topping *t = gc__combined_topping_of(in);
    gc_combined_exhaust x;
    gc_error err;
    gc_error_clear(&err);
    ideal_steam(r);
    if (t == NULL || t->exhaust(in->topping.bytes, r->topping.bytes, 1, &x, &err) != GC_OK) {
        ideal_warning(rep, err.message);
        return;
    }
    gc_combined_bounds *b = &r->bounds;
    double m = x.intake_mass_flow * x.exhaust_mass_ratio;
    b->ideal_gas_turbine_power_W = x.net_power_W;
    b->ideal_bottoming_power_W = m * gc__combined_gas_exergy(&x.gas, x.T_K, x.P_Pa, x.T_dead_K,
                                                             x.P_dead_Pa) +
                                 r->exergy.duct_fuel_W;
    b->ideal_net_power_W = b->ideal_gas_turbine_power_W + b->ideal_bottoming_power_W;
    double heat = x.fuel_heat_W + r->summary.duct_burner_fuel_heat_W;
    b->ideal_efficiency = heat > 0.0 ? b->ideal_net_power_W / heat : 0.0;
    b->has_ideal = x.has_heat && heat > 0.0 && isfinite(b->ideal_efficiency);
}
