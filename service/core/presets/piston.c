/*
 * piston.c — what the nine piston-engine presets share (piston.h,
 * piston_family.h): input defaults, the checks that relate inputs to each
 * other (the table holds every single input's bounds), the chain-builder
 * helpers, the evaluation with the engine figures, the warnings and the
 * family's output table. Each preset's own file (otto.c ... carnot.c) holds
 * its field table, its chain builder and its descriptor.
 *
 * Engine figures (textbook definitions of indicated figures, common
 * practice):
 *   trapped mass     m = V_d,cyl / (v_max - v_min)   (the swept volume holds
 *                    the cycle's specific-volume span)
 *   work per cycle   W = m w_net;  IMEP = W / V_d,cyl (= the cycle's MEP)
 *   power            P = W n_cyl f_cycle, f_cycle = speed / (strokes / 2)
 *   ISFC             m q_in / LHV per cycle over W, i.e. 1 / (eta LHV)
 * Specific fuel consumption is written in g/kWh (si) or lbm/(hp h) (us):
 * 1 kWh = 3.6e6 J (exact); 1 lbm = 0.45359237 kg (exact) and 1 hp =
 * 745.69987158 W (NIST SP 811, B.8: horsepower, 550 ft lbf/s).
 */
#include "core/presets/piston_family.h"
#include "core/presets/presets.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define SET(x) GC_PISTON_IS_SET(x)

static const char *const names[GC_PISTON_COUNT] = {
    "otto", "diesel", "dual", "atkinson", "miller", "stirling", "ericsson", "lenoir", "carnot"};

const char *const gc__gas_models[] = { "air", "cold", NULL };

static const struct {
    const gc_preset *preset;
    gc__piston_build_fn build;
} family[GC_PISTON_COUNT] = {
    [GC_PISTON_OTTO] = { &gc_preset_otto, gc__build_otto },
    [GC_PISTON_DIESEL] = { &gc_preset_diesel, gc__build_diesel },
    [GC_PISTON_DUAL] = { &gc_preset_dual, gc__build_dual },
    [GC_PISTON_ATKINSON] = { &gc_preset_atkinson, gc__build_atkinson },
    [GC_PISTON_MILLER] = { &gc_preset_miller, gc__build_miller },
    [GC_PISTON_STIRLING] = { &gc_preset_stirling, gc__build_stirling },
    [GC_PISTON_ERICSSON] = { &gc_preset_ericsson, gc__build_ericsson },
    [GC_PISTON_LENOIR] = { &gc_preset_lenoir, gc__build_lenoir },
    [GC_PISTON_CARNOT] = { &gc_preset_carnot, gc__build_carnot },
};

const char *gc_piston_name(gc_piston_cycle cycle)
{
    return ((int)cycle >= 0 && cycle < GC_PISTON_COUNT) ? names[cycle] : "unknown";
}

int gc_piston_from_name(const char *name, gc_piston_cycle *cycle)
{
    for (int i = 0; name && i < GC_PISTON_COUNT; i++)
        if (strcmp(name, names[i]) == 0) {
            *cycle = (gc_piston_cycle)i;
            return GC_OK;
        }
    return GC_ERR_UNKNOWN;
}

const gc_preset *gc_piston_preset(gc_piston_cycle cycle)
{
    return ((int)cycle >= 0 && cycle < GC_PISTON_COUNT) ? family[cycle].preset : NULL;
}

void gc_piston_input_init(gc_piston_input *in, gc_piston_cycle cycle)
{
    memset(in, 0, sizeof *in);
    in->cycle = cycle;
    gc_gas_init_air(&in->gas);
    in->intake_temperature = 288.15;   /* ISO 2314 / ISO 3977 reference ambient (common practice) */
    in->intake_pressure = 101325.0;
    in->cylinders = 1;
    in->strokes = 4;
    double *opt[] = {&in->compression_ratio, &in->cutoff_ratio, &in->pressure_ratio,
                     &in->peak_pressure, &in->peak_temperature, &in->heat_added,
                     &in->expansion_ratio, &in->effective_compression_ratio,
                     &in->compression_efficiency, &in->expansion_efficiency,
                     &in->regenerator_effectiveness, &in->displacement,
                     &in->speed, &in->fuel_heating_value,
                     &in->dead_temperature, &in->dead_pressure};
    for (size_t i = 0; i < sizeof opt / sizeof opt[0]; i++)
        *opt[i] = GC_PISTON_UNSET;
}

/* ---- field ids as paths (the engine's steps name their inputs by path) ------- */

static const char *const paths[GC_PF_COUNT] = {
    [GC_PF_INTAKE_TEMPERATURE] = "/intake_temperature",
    [GC_PF_INTAKE_PRESSURE] = "/intake_pressure",
    [GC_PF_GAS] = "/gas",
    [GC_PF_COMPRESSION_RATIO] = "/compression_ratio",
    [GC_PF_PRESSURE_RATIO] = "/pressure_ratio",
    [GC_PF_PEAK_PRESSURE] = "/peak_pressure",
    [GC_PF_CUTOFF_RATIO] = "/cutoff_ratio",
    [GC_PF_EXPANSION_RATIO] = "/expansion_ratio",
    [GC_PF_EFFECTIVE_COMPRESSION_RATIO] = "/effective_compression_ratio",
    [GC_PF_PEAK_TEMPERATURE] = "/peak_temperature",
    [GC_PF_HEAT_ADDED] = "/heat_added",
    [GC_PF_COMPRESSION_EFFICIENCY] = "/compression_efficiency",
    [GC_PF_EXPANSION_EFFICIENCY] = "/expansion_efficiency",
    [GC_PF_REGENERATOR_EFFECTIVENESS] = "/regenerator_effectiveness",
    [GC_PF_DISPLACEMENT] = "/displacement",
    [GC_PF_SPEED] = "/speed",
    [GC_PF_STROKES] = "/strokes_per_cycle",
    [GC_PF_FUEL] = "/fuel",
};

const char *gc__piston_path(int field)
{
    return field > 0 && field < GC_PF_COUNT && paths[field] ? paths[field] : "";
}

/* ---- checks between inputs ---------------------------------------------------- */

/* The optional numbers a preset may leave out of its table. */
static const struct { int field; size_t offset; } optional_numbers[] = {
    { GC_PF_COMPRESSION_RATIO, offsetof(gc_piston_input, compression_ratio) },
    { GC_PF_CUTOFF_RATIO, offsetof(gc_piston_input, cutoff_ratio) },
    { GC_PF_PRESSURE_RATIO, offsetof(gc_piston_input, pressure_ratio) },
    { GC_PF_PEAK_PRESSURE, offsetof(gc_piston_input, peak_pressure) },
    { GC_PF_PEAK_TEMPERATURE, offsetof(gc_piston_input, peak_temperature) },
    { GC_PF_HEAT_ADDED, offsetof(gc_piston_input, heat_added) },
    { GC_PF_EXPANSION_RATIO, offsetof(gc_piston_input, expansion_ratio) },
    { GC_PF_EFFECTIVE_COMPRESSION_RATIO, offsetof(gc_piston_input, effective_compression_ratio) },
    { GC_PF_COMPRESSION_EFFICIENCY, offsetof(gc_piston_input, compression_efficiency) },
    { GC_PF_EXPANSION_EFFICIENCY, offsetof(gc_piston_input, expansion_efficiency) },
    { GC_PF_REGENERATOR_EFFECTIVENESS, offsetof(gc_piston_input, regenerator_effectiveness) },
};

/* An input this preset's table does not hold, set by an in-process caller. */
static int check_applies(const gc_piston_input *in, const gc_preset *p, gc_error *err)
{
    for (size_t i = 0; i < sizeof optional_numbers / sizeof optional_numbers[0]; i++) {
        int f = optional_numbers[i].field;
        double v = *(const double *)(const void *)((const char *)in + optional_numbers[i].offset);
        if (p->fields[f].name == NULL && SET(v))
            return gc_error_id(err, GC_ERR_INVALID, f, -1, "does not apply to the %s cycle",
                               gc_piston_name(in->cycle));
    }
    return GC_OK;
}

/* The first bound of the table an in-process caller's input breaks. */
static int check_table(const gc_preset *p, const gc_piston_input *in, gc_error *err)
{
    static _Thread_local gc_report rep;
    gc_report_init(&rep);
    if (gc_preset_validate(p, in, &rep) == GC_OK)
        return GC_OK;
    if (err)
        *err = rep.errors[0];
    return rep.errors[0].code;
}

static int check_temperatures(const gc_piston_input *in, gc_error *err)
{
    if (gc_gas_check_T(&in->gas, in->intake_temperature, NULL, err) != GC_OK)
        return gc_error_at(err, GC_ERR_RANGE, GC_PF_INTAKE_TEMPERATURE, -1);
    /* the table allows 1 (dual); an isothermal or constant-volume step of
     * ratio 1 would do nothing in the Ericsson and Lenoir cycles */
    if ((in->cycle == GC_PISTON_ERICSSON || in->cycle == GC_PISTON_LENOIR) &&
        SET(in->pressure_ratio) && !(in->pressure_ratio > 1.0))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_PRESSURE_RATIO, -1,
                           "must be greater than 1 and at most 1000");
    if (SET(in->peak_pressure) && !(in->peak_pressure > in->intake_pressure))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_PEAK_PRESSURE, -1,
                           "must be above the intake pressure and at most 1 GPa");
    if (SET(in->peak_temperature)) {
        if (gc_gas_check_T(&in->gas, in->peak_temperature, NULL, err) != GC_OK)
            return gc_error_at(err, GC_ERR_RANGE, GC_PF_PEAK_TEMPERATURE, -1);
        if (!(in->peak_temperature > in->intake_temperature))
            return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_PEAK_TEMPERATURE, -1,
                               "must be above the intake temperature (%.6g K)",
                               in->intake_temperature);
    }
    return GC_OK;
}

static int check_engine(const gc_piston_input *in, gc_error *err)
{
    if (SET(in->fuel_heating_value) && !in->has_fuel &&
        !(in->fuel_heating_value >= 1e6 && in->fuel_heating_value <= 2e8))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_FUEL, -1,
                           "fuel_heating_value must be between 1 and 200 MJ/kg");
    if ((in->has_cylinders || SET(in->speed) || in->has_strokes) && !SET(in->displacement))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_DISPLACEMENT, -1,
                           "is needed with cylinders, speed and strokes");
    if (SET(in->speed) != (in->has_strokes != 0))
        return gc_error_id(err, GC_ERR_INVALID, SET(in->speed) ? GC_PF_STROKES : GC_PF_SPEED, -1,
                           "speed and strokes are given together for the indicated power");
    if (SET(in->dead_temperature) &&
        gc_gas_check_T(&in->gas, in->dead_temperature, NULL, err) != GC_OK)
        return gc_error_at(err, GC_ERR_RANGE, GC_PF_REQUEST, -1);
    if (SET(in->dead_pressure) && !(in->dead_pressure > 0.0 && in->dead_pressure <= 1e8))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_REQUEST, -1,
                           "dead_pressure must be positive");
    return GC_OK;
}

/* table: 1 for in-process callers (the decoder has checked the bounds). */
static int check_inputs(const gc_piston_input *in, int table, gc_error *err)
{
    const gc_preset *p = gc_piston_preset(in->cycle);
    if (p == NULL)
        return gc_error_id(err, GC_ERR_UNKNOWN, GC_PF_REQUEST, -1, "unknown piston-engine cycle");
    if (in->has_strokes && in->strokes != 2 && in->strokes != 4)
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_STROKES, -1, "must be 2 or 4");
    int rc = table ? check_table(p, in, err) : GC_OK;
    if (rc == GC_OK)
        rc = check_applies(in, p, err);
    if (rc == GC_OK)
        rc = check_temperatures(in, err);
    if (rc == GC_OK)
        rc = check_engine(in, err);
    return rc;
}

/* ---- builder helpers ---------------------------------------------------------------- */

int gc__piston_heat_end(const gc_piston_input *in, unsigned which, gc__heat_end *h,
                        gc_error *err)
{
    static const struct { int field; gc_end_kind end; } c[] = {
        { GC_PF_CUTOFF_RATIO, GC_END_VOLUME_RATIO },
        { GC_PF_PEAK_TEMPERATURE, GC_END_TEMPERATURE },
        { GC_PF_HEAT_ADDED, GC_END_HEAT },
        { GC_PF_EXPANSION_RATIO, GC_END_TEMPERATURE },
        { GC_PF_PRESSURE_RATIO, GC_END_PRESSURE_RATIO } };
    const double v[] = { in->cutoff_ratio, in->peak_temperature, in->heat_added,
                         in->expansion_ratio, in->pressure_ratio };
    char list[160] = "";
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++)
        if (which & GC__PF_BIT(c[i].field)) {
            size_t len = strlen(list);
            snprintf(list + len, sizeof list - len, "%s%s", len ? ", " : "",
                     gc__piston_path(c[i].field) + 1);
        }
    int n = 0;
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
        if (!(which & GC__PF_BIT(c[i].field)) || !SET(v[i]))
            continue;
        if (n++ > 0)
            return gc_error_id(err, GC_ERR_INVALID, c[i].field, -1, "give only one of %s", list);
        h->end = c[i].end;
        h->value = v[i];
        h->field = c[i].field;
    }
    if (n == 0)
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_REQUEST, -1, "the %s cycle needs one of %s",
                           gc_piston_name(in->cycle), list);
    return GC_OK;
}

double gc__eff_or_1(double e)
{
    return SET(e) ? e : 1.0;
}

gc_step *gc__piston_add(gc_cycle *c, gc_process_kind kind, gc_end_kind end, double value,
                        int field, const char *label)
{
    gc_step *s = gc_cycle_add(c, kind, end, value, gc__piston_path(field));
    /* preset chains have at most 6 steps, far below GC_CYCLE_MAX_STEPS: never NULL */
    if (s == NULL)
        s = &c->steps[GC_CYCLE_MAX_STEPS - 1];
    snprintf(s->label, sizeof s->label, "%s", label);
    return s;
}

gc_step *gc__piston_compression(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                                double value, int field)
{
    gc_step *s = gc__piston_add(c, GC_PROC_COMPRESSION, end, value, field, "compression");
    s->efficiency = gc__eff_or_1(in->compression_efficiency);
    snprintf(s->field_aux, sizeof s->field_aux, "/compression_efficiency");
    return s;
}

gc_step *gc__piston_expansion(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                              double value, int field)
{
    gc_step *s = gc__piston_add(c, GC_PROC_EXPANSION, end, value, field, "expansion");
    s->efficiency = gc__eff_or_1(in->expansion_efficiency);
    snprintf(s->field_aux, sizeof s->field_aux, "/expansion_efficiency");
    return s;
}

void gc__piston_close(gc_cycle *c, gc_geometry geom)
{
    gc_step *s = gc__piston_add(c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, GC_PF_REQUEST,
                                "heat rejection");
    s->geometry = geom;
    s->heat_sign = -1;
}

int gc__piston_begin(const gc_piston_input *in, gc_cycle *c, gc_error *err)
{
    gc_cycle_init(c, GC_FRAME_CLOSED, &in->gas, in->intake_temperature, in->intake_pressure);
    c->flags = in->flags;
    /* the engines start at the end of the intake stroke; the gas cycles at the
     * start of their compression */
    int engine = in->cycle != GC_PISTON_STIRLING && in->cycle != GC_PISTON_ERICSSON &&
                 in->cycle != GC_PISTON_CARNOT;
    snprintf(c->start_station, sizeof c->start_station, "%s",
             engine ? "intake" : "compression_start");
    if (SET(in->dead_temperature))
        c->T_dead_K = in->dead_temperature;
    if (SET(in->dead_pressure))
        c->P_dead_Pa = in->dead_pressure;
    int need_r = in->cycle != GC_PISTON_ERICSSON && in->cycle != GC_PISTON_LENOIR &&
                 in->cycle != GC_PISTON_CARNOT;
    if (need_r && !SET(in->compression_ratio))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_COMPRESSION_RATIO, -1,
                           "the %s cycle needs a compression_ratio", gc_piston_name(in->cycle));
    return GC_OK;
}

/* ---- evaluation ------------------------------------------------------------------------ */

static int build(const gc_piston_input *in, int ideal, int table, gc_cycle *c, gc_error *err)
{
    gc_error_clear(err);
    int rc = check_inputs(in, table, err);
    if (rc != GC_OK)
        return rc;
    return family[in->cycle].build(in, ideal, c, err);
}

/* The path text of err for callers that read it (a row the preset's table
 * leaves out still has its name here). */
static int name_error(const gc_piston_input *in, gc_error *err)
{
    if (err == NULL || err->field_id <= 0)
        return err ? err->code : GC_OK;
    const gc_preset *p = gc_piston_preset(in->cycle);
    if (p && err->field_id < p->n_fields && p->fields[err->field_id].name)
        return gc_preset_name_error(p, err);
    snprintf(err->field, sizeof err->field, "%s", gc__piston_path(err->field_id));
    return err->code;
}

int gc_piston_build(const gc_piston_input *in, gc_cycle *c, gc_error *err)
{
    int rc = build(in, 0, 1, c, err);
    return rc == GC_OK ? rc : name_error(in, err);
}

/* 1 when the ideal counterpart needs its own chain: an Atkinson cycle with
 * expansion_ratio and an expansion efficiency below 1, whose actual
 * heat-addition end temperature depends on that efficiency (atkinson.c). The
 * ideal keeps both volume ratios: its peak temperature is the isentropic one. */
static int own_ideal(const gc_piston_input *in)
{
    return in->cycle == GC_PISTON_ATKINSON && SET(in->expansion_ratio) &&
           gc__eff_or_1(in->expansion_efficiency) < 1.0 && !(in->flags & GC_CYCLE_NO_BOUNDS);
}

/* The ideal counterpart of own_ideal() chains into r->cycle.ideal, with the
 * actual run's dead state (as gc_cycle_evaluate does for its ideal). */
static int evaluate_own_ideal(const gc_piston_input *in, gc_cycle_result *r, gc_error *err)
{
    gc_cycle ci;
    int rc = build(in, 1, 0, &ci, err);
    if (rc != GC_OK)
        return rc;
    gc_cycle_idealize(&ci, &ci);
    ci.flags = in->flags | GC_CYCLE_NO_BOUNDS;
    ci.T_dead_K = r->actual.summary.T_dead_K;
    ci.P_dead_Pa = r->actual.summary.P_dead_Pa;
    rc = gc_cycle_run_chain(&ci, &r->ideal, err);
    if (rc != GC_OK)
        return rc;
    r->has_ideal = 1;
    r->ideal_is_actual = 0;
    return GC_OK;
}

static void clear_figures(gc_piston_result *r)
{
    r->has_engine = r->has_power = r->has_fuel = 0;
    r->has_indicated = r->has_fuel_per_cycle = r->has_fuel_flow = 0;
    r->compression_end_temperature = 0.0;
    r->expansion_ratio = 0.0;
    r->peak_pressure_reached = 0.0;
    r->peak_pressure_short = 0;
}

static void run_figures(const gc_piston_input *in, gc_piston_result *r)
{
    const gc_cycle_run *run = &r->cycle.actual;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->kind == GC_PROC_COMPRESSION && r->compression_end_temperature == 0.0)
            r->compression_end_temperature = run->states[p->to].T_K;
        if (p->kind == GC_PROC_EXPANSION)
            r->expansion_ratio = run->states[p->to].v_m3_per_kg / run->states[p->from].v_m3_per_kg;
        if (p->kind == GC_PROC_DUAL && p->part == 0)
            r->peak_pressure_reached = run->states[p->to].P_Pa;
    }
    /* dual with a peak_pressure limit: the heat-addition end may come first (then the
     * constant-pressure part is empty and the limit is not reached) */
    r->peak_pressure_short = in->cycle == GC_PISTON_DUAL && SET(in->peak_pressure) &&
                             r->peak_pressure_reached < in->peak_pressure * (1.0 - 1e-9);
}

/* Trapped mass, work per cycle, IMEP, power and fuel figures. */
static int engine_figures(const gc_piston_input *in, gc_piston_result *r, gc_error *err)
{
    const gc_cycle_summary *sm = &r->cycle.actual.summary;
    double lhv = in->has_fuel ? in->fuel.LHV_J_per_kg : in->fuel_heating_value;
    int fuel = in->has_fuel || SET(in->fuel_heating_value);
    double ncyl = in->has_cylinders ? in->cylinders : 1.0;
    if (fuel && !(sm->net_work > 0.0))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_FUEL, -1,
                           "the cycle delivers no net work: no specific fuel consumption");
    if (SET(in->displacement)) {
        double span = sm->v_max_m3_per_kg - sm->v_min_m3_per_kg;
        if (!(span > 0.0))
            return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_DISPLACEMENT, -1,
                               "the cycle sweeps no volume");
        r->has_engine = 1;
        r->cylinder_displacement = in->displacement / ncyl;
        r->trapped_mass = r->cylinder_displacement / span;
        r->work_per_cycle = r->trapped_mass * sm->net_work;
        r->imep = r->work_per_cycle / r->cylinder_displacement;
        if (SET(in->speed)) {
            r->has_power = 1;
            r->cycles_per_second = in->speed / (in->strokes / 2.0);
            r->indicated_power = r->work_per_cycle * ncyl * r->cycles_per_second;
        }
    }
    if (fuel) {
        r->has_fuel = 1;
        if (r->has_engine) {
            r->fuel_per_cycle = r->trapped_mass * sm->heat_in / lhv;
            r->isfc = r->fuel_per_cycle / r->work_per_cycle;
        } else {
            r->fuel_per_cycle = 0.0;
            r->isfc = sm->heat_in / (lhv * sm->net_work);
        }
        r->fuel_mass_flow = r->has_power ? r->fuel_per_cycle * ncyl * r->cycles_per_second : 0.0;
    }
    r->has_indicated = r->has_engine || r->has_fuel;
    r->has_fuel_per_cycle = r->has_engine && r->has_fuel;
    r->has_fuel_flow = r->has_power && r->has_fuel;
    return GC_OK;
}

static int evaluate(const gc_piston_input *in, gc_piston_result *r, int table, gc_error *err)
{
    gc_cycle c;
    clear_figures(r);
    int rc = build(in, 0, table, &c, err);
    if (rc != GC_OK)
        return rc;
    int own = own_ideal(in);
    if (own)
        c.flags |= GC_CYCLE_NO_BOUNDS;
    rc = gc_cycle_evaluate(&c, &r->cycle, err);
    if (rc == GC_OK && own)
        rc = evaluate_own_ideal(in, &r->cycle, err);
    if (rc == GC_ERR_INFEASIBLE && in->cycle == GC_PISTON_MILLER && err &&
        strcmp(err->field, "/compression_ratio") == 0)
        snprintf(err->message, sizeof err->message,
                 "the expansion over compression_ratio ends below the intake pressure, so "
                 "the gas cannot blow down to it; lower compression_ratio or raise "
                 "effective_compression_ratio or the heat added");
    if (rc != GC_OK)
        return rc;
    run_figures(in, r);
    return engine_figures(in, r, err);
}

int gc_piston_evaluate(const gc_piston_input *in, gc_piston_result *r, gc_error *err)
{
    int rc = evaluate(in, r, 1, err);
    return rc == GC_OK ? rc : name_error(in, err);
}

/* ---- the descriptor hooks -------------------------------------------------------------- */

static void warnings(const gc_piston_input *in, const gc_piston_result *r, gc_report *rep)
{
    if (in->has_fuel && !r->has_engine)
        gc_report_warn(rep, "no_displacement", GC_PF_DISPLACEMENT, -1,
                       "without displacement only the ISFC is given (it needs no engine "
                       "size); add displacement for trapped mass, work per cycle and IMEP");
    if (r->cycle.ideal_is_actual)
        gc_report_warn(rep, "ideal_equals_actual", -1, -1,
                       "with the default (ideal) efficiencies, no losses and ideal "
                       "regeneration the actual cycle equals its ideal counterpart; give "
                       "component efficiencies, losses or an effectiveness below 1 for an "
                       "actual cycle");
    if (in->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", GC_PF_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    if (r->peak_pressure_short)
        gc_report_warn(rep, "peak_pressure_not_reached", GC_PF_PEAK_PRESSURE, -1,
                       "peak_pressure %.6g MPa is not reached: the heat addition ends first, "
                       "at %.6g MPa, so there is no constant-pressure part (an Otto cycle at "
                       "this heat input)", in->peak_pressure / 1e6,
                       r->peak_pressure_reached / 1e6);
    gc_report_validity_cycle(rep, &r->cycle);
}

int gc__piston_evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_piston_input *in = input;
    gc_piston_result *r = result;
    gc_error err;
    gc_error_clear(&err);
    int rc = evaluate(in, r, 0, &err);
    if (rc != GC_OK)
        return gc_report_add(rep, &err);
    warnings(in, r, rep);
    return GC_OK;
}

const gc_cycle_result *gc__piston_cycle(const void *result)
{
    return &((const gc_piston_result *)result)->cycle;
}

void gc__piston_lean(void *input, unsigned what)
{
    gc_piston_input *in = input;
    if (what & GC_LEAN_NO_AREAS)
        in->flags |= GC_CYCLE_NO_AREAS;
    if (what & GC_LEAN_NO_BOUNDS)
        in->flags |= GC_CYCLE_NO_BOUNDS;
}

/* ---- outputs ------------------------------------------------------------------------------ */

#define SFC_G_PER_KWH 3.6e9                                 /* (g/kWh) per (kg/J) */
#define SFC_LBM_PER_HPH (1.0 / (0.45359237 / (745.69987158 * 3600.0))) /* per kg/J */

#define R_(member) offsetof(gc_piston_result, member)
#define NUMQ(nm, par, q, member, pres, desc)                                                 \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = R_(member), .present = (pres), .description = desc }

enum { O_ENGINE = 0, O_INDICATED = 3, O_MODEL = 13 };

const gc_output gc__piston_outputs[GC__PISTON_N_OUTPUTS] = {
    [O_ENGINE] = { .name = "engine", .parent = -1, .type = GC_OT_OBJECT,
                   .description = "Figures of the piston engine's cycle." },
    { .name = "compression_end_temperature", .parent = O_ENGINE, .type = GC_OT_NUMBER,
      .quantity = GC_Q_TEMPERATURE, .has_quantity = 1, .flags = GC_OF_POSITIVE,
      .offset = R_(compression_end_temperature),
      .description = "Gas temperature at the end of compression (cycles with a compression "
                     "step)." },
    { .name = "expansion_ratio", .parent = O_ENGINE, .type = GC_OT_NUMBER,
      .flags = GC_OF_POSITIVE, .offset = R_(expansion_ratio),
      .description = "Volume ratio of the actual cycle's expansion, v after / v before "
                     "(cycles with an expansion step)." },
    [O_INDICATED] = { .name = "indicated", .parent = -1, .type = GC_OT_OBJECT,
                      .present = R_(has_indicated) + 1,
                      .description = "Indicated figures of the engine (with displacement) and "
                                     "its fuel use (with a fuel)." },
    NUMQ("cylinder_displacement", O_INDICATED, GC_Q_VOLUME, cylinder_displacement,
         R_(has_engine) + 1, "Swept volume of one cylinder."),
    NUMQ("trapped_mass", O_INDICATED, GC_Q_MASS, trapped_mass, R_(has_engine) + 1,
         "Gas trapped in one cylinder per cycle: the cylinder displacement over the cycle's "
         "specific-volume span."),
    NUMQ("work_per_cycle", O_INDICATED, GC_Q_ENERGY, work_per_cycle, R_(has_engine) + 1,
         "Indicated work of one cylinder per cycle (trapped mass times net work)."),
    NUMQ("imep", O_INDICATED, GC_Q_PRESSURE_DIFFERENCE, imep, R_(has_engine) + 1,
         "Indicated mean effective pressure: work per cycle over the cylinder displacement."),
    { .name = "cycles_per_second", .parent = O_INDICATED, .type = GC_OT_NUMBER,
      .unit_si = "1/s", .unit_us = "1/s", .offset = R_(cycles_per_second),
      .present = R_(has_power) + 1,
      .description = "Cycles of one cylinder per second: speed over strokes per cycle / 2." },
    NUMQ("indicated_power", O_INDICATED, GC_Q_POWER, indicated_power, R_(has_power) + 1,
         "Indicated power of all cylinders."),
    { .name = "isfc", .parent = O_INDICATED, .type = GC_OT_NUMBER, .unit_si = "g/kWh",
      .unit_us = "lbm/(hp h)", .si_factor = SFC_G_PER_KWH, .us_factor = SFC_LBM_PER_HPH,
      .offset = R_(isfc), .present = R_(has_fuel) + 1,
      .description = "Indicated specific fuel consumption: fuel mass per unit of indicated "
                     "work, 1 / (thermal efficiency x LHV)." },
    NUMQ("fuel_per_cycle", O_INDICATED, GC_Q_MASS, fuel_per_cycle, R_(has_fuel_per_cycle) + 1,
         "Fuel burnt in one cylinder per cycle (heat in per cycle over the LHV)."),
    NUMQ("fuel_mass_flow", O_INDICATED, GC_Q_MASS_FLOW, fuel_mass_flow, R_(has_fuel_flow) + 1,
         "Fuel mass flow of all cylinders."),
    [O_MODEL] = { .name = "model", .parent = -1, .type = GC_OT_OBJECT,
                  .description = "Model facts (added to the cycle's model)." },
    { .name = "fuel", .parent = O_MODEL, .type = GC_OT_FUEL, .flags = GC_OF_INPUT,
      .offset = offsetof(gc_piston_input, fuel), .present = offsetof(gc_piston_input, has_fuel) + 1,
      .description = "The fuel given: its label and heating values at 298.15 K." },
};
