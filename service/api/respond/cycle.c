/*
 * cycle.c — the cycle parts of a cycle preset's document (doc.h), written
 * once for every preset from the engine's gc_cycle_result: "model",
 * "states", "processes", "summary", "bounds" {ideal, ideal_components,
 * carnot}, "checks" and, with include=paths, "paths" (per process the very
 * points gc_cycle_path gives the SVG renderer).
 *
 * A preset extends a part through its output rows named "model", "summary"
 * or "bounds" (and "bounds"/"ideal"): a row with the name of a member the
 * engine writes takes that member's place (e.g. the Brayton preset's
 * back_work_ratio), the others follow the engine's members. Its view hook
 * replaces the heat in and the efficiencies (the turbojet quotes them on its
 * propulsion figures) and names the basis.
 *
 * State numbering: states are numbered from 1 in cycle order; the engine's
 * closing state (equal to state 1 within the state-closure check) is not
 * repeated, the last process ends at state 1.
 */
#include "api/respond/doc.h"
#include "gascycle/strbuf.h"
#include "gascycle/path.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define SPLICE_MAX 40

/* A preset's rows that extend one part of the document. */
typedef struct splice {
    const gc_preset *p;
    const void *input, *result;
    int n;
    int row[SPLICE_MAX];
    unsigned hash[SPLICE_MAX];  /* of the rows' names (a member is compared only on a match) */
    unsigned char used[SPLICE_MAX];
} splice;

static unsigned name_hash(const char *s)
{
    unsigned h = 2166136261u;
    while (*s)
        h = (h ^ (unsigned char)*s++) * 16777619u;
    return h;
}

typedef struct cw {
    gc_jw *w;
    const gc_preset *p;
    const void *input, *result;
    const gc_cycle_result *r;
    gc_cycle_view v;
    const gc_api_docopts *o;
} cw;

/* The rows under top row `section` (and its child `sub` when not NULL). */
static void splice_init(splice *s, const cw *c, const char *section, const char *sub)
{
    s->p = c->p;
    s->input = c->input;
    s->result = c->result;
    s->n = 0;
    int top = -1;
    for (int r = 0; r < c->p->n_outputs && top < 0; r++)
        if (c->p->outputs[r].parent == -1 && strcmp(c->p->outputs[r].name, section) == 0)
            top = r;
    if (top >= 0 && sub) {
        int t = top;
        top = -1;
        for (int r = 0; r < c->p->n_outputs && top < 0; r++)
            if (c->p->outputs[r].parent == t && strcmp(c->p->outputs[r].name, sub) == 0)
                top = r;
    }
    for (int r = 0; top >= 0 && r < c->p->n_outputs && s->n < SPLICE_MAX; r++)
        if (c->p->outputs[r].parent == top && (!sub || c->p->outputs[r].type != GC_OT_OBJECT ||
                                               strcmp(c->p->outputs[r].name, "ideal") != 0)) {
            s->row[s->n] = r;
            s->hash[s->n] = name_hash(c->p->outputs[r].name);
            s->used[s->n++] = 0;
        }
}

/* 1 when the preset replaces member key (and writes its own value). */
/* A preset's row written into a part; its units are recorded later, in the
 * order of the preset's own outputs (doc.c). */
static void write_spliced(gc_jw *w, splice *s, int i)
{
    int keep = w->no_units;
    s->used[i] = 1;
    w->no_units = 1;
    gc_api_write_output(w, s->p, s->row[i], s->input, s->result, NULL);
    w->no_units = keep;
}

static int spliced(gc_jw *w, splice *s, const char *key)
{
    unsigned h = s && s->n ? name_hash(key) : 0;
    for (int i = 0; s && i < s->n; i++)
        if (!s->used[i] && s->hash[i] == h && strcmp(s->p->outputs[s->row[i]].name, key) == 0) {
            write_spliced(w, s, i);
            return 1;
        }
    return 0;
}

static void splice_rest(gc_jw *w, splice *s)
{
    for (int i = 0; i < s->n; i++)
        if (!s->used[i])
            write_spliced(w, s, i);
}

static void sq(gc_jw *w, splice *s, const char *key, double si, gc_quantity q)
{
    if (!spliced(w, s, key))
        gc_jw_q(w, key, si, q);
}

static void sn(gc_jw *w, splice *s, const char *key, double v)
{
    if (!spliced(w, s, key))
        gc_jw_num(w, key, v);
}

/* ---- model --------------------------------------------------------------------------------- */

static const char *const EXERGY_FUEL =
    "fuel: exergy supplied is the fuel's (chemical and physical as supplied at the pressure of "
    "the stream it enters) in the reference environment of Szargut, Morris & Steward (1988) at "
    "the dead state's T and P; combustor destruction is T_dead S_gen of the reaction with "
    "mixing; the exhaust carries its physical and chemical exergy away (water as vapour)";
static const char *const EXERGY_RESERVOIR =
    "heat reservoir: heat enters from a reservoir at T_boundary (the step's source temperature, "
    "default the cycle's peak) and leaves at the dead state; exergy supplied = heat_in (1 - "
    "T_dead / T_boundary)";

static void model_gas(gc_jw *w, const gc_gas *g)
{
    if (g->kind == GC_GAS_COLD) {
        gc_jw_str(w, "property_data", "constant cp and k (cold-air standard)");
        gc_jw_q(w, "cp", g->cp_cold_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        gc_jw_num(w, "k", g->k_cold);
        gc_jw_str(w, "reference_state", "h = cp (T - 298.15 K) and u = cv (T - 298.15 K) "
                  "(sensible, from 298.15 K); s = cp ln(T / 298.15 K) - R ln(P / 1 bar)");
        return;
    }
    gc_jw_str(w, "property_data", "ideal-gas mixture, NASA 9-coefficient polynomials "
              "(McBride, Zehe & Gordon 2002)");
    gc_jw_str(w, "reference_state", "h and u sensible: relative to the same gas at 298.15 K "
              "(the species' formation enthalpies taken off), so heat release raises h; "
              "h_absolute (cycles with a fuel) includes them; s absolute (NASA-9), referred to "
              "1 bar");
}

static void write_model(cw *c)
{
    gc_jw *w = c->w;
    const gc_cycle_run *run = &c->r->actual;
    const gc_gas *g = &run->gases[0];
    splice s;
    splice_init(&s, c, "model", NULL);
    gc_jw_object(w, "model");
    gc_jw_str(w, "frame", run->frame == GC_FRAME_CLOSED ? "closed" : "flow");
    gc_jw_str(w, "basis", c->v.basis ? c->v.basis : run->frame == GC_FRAME_CLOSED
                                                        ? "per kg of trapped gas"
                                                        : "per kg of intake gas");
    gc_jw_str(w, "gas", g->label);
    model_gas(w, g);
    gc_jw_str(w, "enthalpy_basis", "sensible, from 298.15 K, in states, CSV, paths and the h-s "
              "diagram");
    gc_jw_str(w, "exergy_model", run->summary.exergy_model == GC_EXERGY_FUEL ? EXERGY_FUEL
                                                                              : EXERGY_RESERVOIR);
    gc_jw_q(w, "R", g->R_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
    gc_jw_array(w, "gases");
    for (int i = 0; i < run->n_gases; i++)
        gc_jw_str(w, NULL, run->gases[i].label);
    gc_jw_end(w);
    gc_jw_object(w, "dead_state");
    gc_jw_q(w, "T", run->summary.T_dead_K, GC_Q_TEMPERATURE);
    gc_jw_q(w, "P", run->summary.P_dead_Pa, GC_Q_PRESSURE);
    gc_jw_end(w);
    gc_jw_str(w, "sign_convention", "work > 0 is delivered by the gas; heat > 0 enters the gas");
    splice_rest(w, &s);
    gc_jw_end(w);
}

/* ---- states and processes ------------------------------------------------------------------ */

static int closes(const gc_cycle_run *run)
{
    if (run->n_states < 2)
        return 0;
    const gc_cycle_state *a = &run->states[0], *b = &run->states[run->n_states - 1];
    double tol = 1e-6;
    return fabs(a->T_K - b->T_K) <= tol * a->T_K && fabs(a->P_Pa - b->P_Pa) <= tol * a->P_Pa &&
           fabs(a->V_m_per_s - b->V_m_per_s) <= tol * (1.0 + fabs(a->V_m_per_s));
}

static int state_number(const gc_cycle_run *run, int i)
{
    if (i == run->n_states - 1 && closes(run))
        return 1;
    return i + 1;
}

static void state_members(gc_jw *w, const gc_cycle_run *run, int i)
{
    const gc_cycle_state *s = &run->states[i];
    gc_jw_q(w, "T", s->T_K, GC_Q_TEMPERATURE);
    gc_jw_q(w, "P", s->P_Pa, GC_Q_PRESSURE);
    gc_jw_q(w, "v", s->v_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
    gc_jw_q(w, "u", s->us_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "h", s->hs_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "s", s->s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
    if (run->n_gases > 1)
        gc_jw_q(w, "h_absolute", s->h_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    if (run->frame == GC_FRAME_FLOW) {
        gc_jw_q(w, "V", s->V_m_per_s, GC_Q_VELOCITY);
        gc_jw_q(w, "T_total", s->T_total_K, GC_Q_TEMPERATURE);
        gc_jw_q(w, "P_total", s->P_total_Pa, GC_Q_PRESSURE);
        gc_jw_num(w, "mass_ratio", s->mass_ratio);
    }
    if (run->n_gases > 1 && s->gas >= 0 && s->gas < run->n_gases)
        gc_jw_str(w, "gas", run->gases[s->gas].label);
}

static void write_states(cw *c)
{
    const gc_cycle_run *run = &c->r->actual;
    int n = run->n_states - (closes(run) ? 1 : 0);
    gc_jw_array(c->w, "states");
    for (int i = 0; i < n; i++) {
        gc_jw_object(c->w, NULL);
        gc_jw_int(c->w, "state", i + 1);
        if (c->r->station[i][0])
            gc_jw_str(c->w, "station", c->r->station[i]);
        state_members(c->w, run, i);
        gc_jw_end(c->w);
    }
    gc_jw_end(c->w);
}

/* One state under a station name: its number and its members. */
static void station_entry(cw *c, const char *name, int i)
{
    gc_jw_object(c->w, name);
    gc_jw_int(c->w, "state", i + 1);
    state_members(c->w, &c->r->actual, i);
    gc_jw_end(c->w);
}

/* "stations": every listed state under its station name, then under each of
 * its aliases, in state order (select=/stations/turbine_inlet/T names the
 * turbine inlet whatever steps come before it). */
static void write_stations(cw *c)
{
    const gc_cycle_run *run = &c->r->actual;
    int n = run->n_states - (closes(run) ? 1 : 0);
    gc_jw_object(c->w, "stations");
    for (int i = 0; i < n; i++) {
        if (c->r->station[i][0])
            station_entry(c, c->r->station[i], i);
        for (int a = 0; a < c->r->n_alias; a++)
            if (c->r->alias[a].step == i)
                station_entry(c, c->r->alias[a].name, i);
    }
    gc_jw_end(c->w);
}

static void process_name(const gc_cycle_result *r, const gc_cycle_process *p, char *buf,
                         size_t n)
{
    const char *label = NULL;
    if (p->step >= 0 && p->step < r->n_steps && r->label[p->step][0])
        label = r->label[p->step];
    if (!label)
        label = gc_cycle_kind_name(p->kind);
    if (p->kind == GC_PROC_DUAL)
        snprintf(buf, n, "%s (%s)", label, p->part ? "constant pressure" : "constant volume");
    else
        gc_text_copy(buf, n, label);
}

static const char *process_kind(const gc_cycle_process *p)
{
    if (p->kind == GC_PROC_DUAL)
        return p->part ? "constant_pressure" : "constant_volume";
    return gc_cycle_kind_name(p->kind);
}

static void process_members(gc_jw *w, const gc_cycle_run *run, const gc_cycle_process *p)
{
    gc_jw_q(w, "work", p->work, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "heat", p->heat, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "delta_s", p->delta_s, GC_Q_SPECIFIC_ENTROPY);
    gc_jw_q(w, "s_gen", p->s_gen, GC_Q_SPECIFIC_ENTROPY);
    gc_jw_q(w, "exergy_destroyed", p->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
    if (p->kind == GC_PROC_FUEL)
        gc_jw_q(w, "fuel_exergy", p->exergy_fuel, GC_Q_SPECIFIC_ENERGY);
    if (run->summary.exergy_model == GC_EXERGY_FUEL && p->kind == GC_PROC_CLOSE)
        gc_jw_q(w, "exhaust_exergy_lost", p->exergy_lost, GC_Q_SPECIFIC_ENERGY);
    gc_jw_q(w, "dissipated_work", p->dissipated, GC_Q_SPECIFIC_ENERGY);
    if (p->T_boundary_K > 0.0)
        gc_jw_q(w, "T_boundary", p->T_boundary_K, GC_Q_TEMPERATURE);
    if (p->kind == GC_PROC_COMPRESSION || p->kind == GC_PROC_EXPANSION) {
        gc_jw_num(w, "efficiency", p->efficiency);
        gc_jw_num(w, "polytropic_efficiency", p->polytropic_efficiency);
    } else if (p->kind == GC_PROC_HEAT_EXCHANGE) {
        gc_jw_num(w, "efficiency", p->efficiency);
    }
    if (p->internal)
        gc_jw_bool(w, "internal", 1);
    if (run->frame == GC_FRAME_FLOW) {
        gc_jw_num(w, "mass_ratio", p->mass_ratio);
        gc_jw_q(w, "delta_ke", p->delta_ke, GC_Q_SPECIFIC_ENERGY);
    }
    gc_jw_str(w, "curve", gc_cycle_curve_name(p->curve));
}

static void write_processes(cw *c)
{
    const gc_cycle_run *run = &c->r->actual;
    gc_jw_array(c->w, "processes");
    for (int i = 0; i < run->n_processes; i++) {
        const gc_cycle_process *p = &run->processes[i];
        char name[GC_CYCLE_LABEL_LEN + 32];
        process_name(c->r, p, name, sizeof name);
        gc_jw_object(c->w, NULL);
        gc_jw_int(c->w, "process", i + 1);
        gc_jw_str(c->w, "name", name);
        gc_jw_str(c->w, "kind", process_kind(p));
        gc_jw_int(c->w, "from", state_number(run, p->from));
        gc_jw_int(c->w, "to", state_number(run, p->to));
        process_members(c->w, run, p);
        gc_jw_end(c->w);
    }
    gc_jw_end(c->w);
}

/* ---- summary, bounds, checks --------------------------------------------------------------- */

#define E_ GC_Q_SPECIFIC_ENERGY
const gc_api_member gc_api_summary_members[] = {
    { "net_work", E_, 1, "Net work delivered per kg (work_out - work_in)." },
    { "heat_in", E_, 1, "Heat added per kg (with a fuel: the fuel's m_fuel LHV at 298.15 K; a "
      "preset may quote its own basis, see model.basis)." },
    { "heat_out", E_, 1, "Heat rejected per kg (with a fuel on the same 298.15 K reference, so "
      "heat_in - heat_out = net_work)." },
    { "work_in", E_, 1, "Work absorbed per kg (compression)." },
    { "work_out", E_, 1, "Work delivered per kg (expansion)." },
    { "thermal_efficiency", -1, 1, "Net work over heat in (with a fuel: on its LHV)." },
    { "back_work_ratio", -1, 1, "Work absorbed over work delivered." },
    { "mean_effective_pressure", GC_Q_PRESSURE_DIFFERENCE, 0,
      "Closed cycles: net work over the swept specific volume (v_max - v_min)." },
    { "T_max", GC_Q_TEMPERATURE, 1, "Highest state temperature." },
    { "T_min", GC_Q_TEMPERATURE, 1, "Lowest state temperature." },
    { "P_max", GC_Q_PRESSURE, 1, "Highest state pressure." },
    { "P_min", GC_Q_PRESSURE, 1, "Lowest state pressure." },
    { "v_max", GC_Q_SPECIFIC_VOLUME, 0, "Closed cycles: largest specific volume." },
    { "v_min", GC_Q_SPECIFIC_VOLUME, 0, "Closed cycles: smallest specific volume." },
    { "second_law_efficiency", -1, 1, "Net work over the exergy supplied (exergy_in)." },
    { "exergy_in", E_, 1, "Exergy supplied: exergy_heat_in plus fuel_exergy." },
    { "exergy_heat_in", E_, 1, "Exergy of the heat added from reservoirs: heat (1 - T_dead / "
      "T_boundary)." },
    { "fuel_exergy", E_, 0, "Cycles with fuel: the fuel's exergy as supplied (chemical and "
      "physical)." },
    { "intake_exergy", E_, 0, "Cycles with fuel: exergy of the intake stream (chemical, and "
      "physical when it is not at the dead state)." },
    { "exhaust_exergy", E_, 0, "Cycles with fuel: exergy the exhaust carries to the environment "
      "(physical and chemical)." },
    { "exhaust_exergy_chemical", E_, 0, "Cycles with fuel: the chemical part of exhaust_exergy." },
    { "exergy_heat_out", E_, 1, "Exergy of the heat rejected, at the dead state: 0 when it leaves "
      "at the dead-state temperature." },
    { "exergy_destroyed", E_, 1, "Exergy destroyed in all processes, T_dead x entropy generated." },
    { "dissipated_work", E_, 1, "Work lost to friction in the processes with an efficiency below "
      "1 (actual less isentropic work)." },
    { "fuel_air_ratio", -1, 0, "Cycles with fuel: fuel per kg of intake, all fuel additions." },
    { NULL, 0, 0, NULL },
};
#undef E_

static double eta_of(const cw *c)
{
    return isfinite(c->v.thermal_efficiency) ? c->v.thermal_efficiency
                                             : c->r->actual.summary.thermal_efficiency;
}

static void summary_exergy(gc_jw *w, splice *s, const gc_cycle_summary *m)
{
    sn(w, s, "second_law_efficiency", m->second_law_efficiency);
    sq(w, s, "exergy_in", m->exergy_in, GC_Q_SPECIFIC_ENERGY);
    sq(w, s, "exergy_heat_in", m->exergy_heat_in, GC_Q_SPECIFIC_ENERGY);
    if (m->exergy_model == GC_EXERGY_FUEL) {
        sq(w, s, "fuel_exergy", m->exergy_fuel, GC_Q_SPECIFIC_ENERGY);
        sq(w, s, "intake_exergy", m->exergy_intake, GC_Q_SPECIFIC_ENERGY);
        sq(w, s, "exhaust_exergy", m->exergy_exhaust, GC_Q_SPECIFIC_ENERGY);
        sq(w, s, "exhaust_exergy_chemical", m->exergy_exhaust_chemical, GC_Q_SPECIFIC_ENERGY);
    }
    sq(w, s, "exergy_heat_out", m->exergy_heat_out, GC_Q_SPECIFIC_ENERGY);
    sq(w, s, "exergy_destroyed", m->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
    sq(w, s, "dissipated_work", m->dissipated, GC_Q_SPECIFIC_ENERGY);
    if (m->fuel_air_ratio > 0.0)
        sn(w, s, "fuel_air_ratio", m->fuel_air_ratio);
}

static void write_summary(cw *c)
{
    gc_jw *w = c->w;
    const gc_cycle_run *run = &c->r->actual;
    const gc_cycle_summary *m = &run->summary;
    int closed = run->frame == GC_FRAME_CLOSED;
    splice s;
    splice_init(&s, c, "summary", NULL);
    gc_jw_object(w, "summary");
    sq(w, &s, "net_work", m->net_work, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "heat_in", isfinite(c->v.heat_in) ? c->v.heat_in : m->heat_in, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "heat_out", m->heat_out, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "work_in", m->work_in, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "work_out", m->work_out, GC_Q_SPECIFIC_ENERGY);
    sn(w, &s, "thermal_efficiency", eta_of(c));
    sn(w, &s, "back_work_ratio", m->back_work_ratio);
    if (closed)
        sq(w, &s, "mean_effective_pressure", m->mean_effective_pressure, GC_Q_PRESSURE_DIFFERENCE);
    sq(w, &s, "T_max", m->T_max_K, GC_Q_TEMPERATURE);
    sq(w, &s, "T_min", m->T_min_K, GC_Q_TEMPERATURE);
    sq(w, &s, "P_max", m->P_max_Pa, GC_Q_PRESSURE);
    sq(w, &s, "P_min", m->P_min_Pa, GC_Q_PRESSURE);
    if (closed) {
        sq(w, &s, "v_max", m->v_max_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
        sq(w, &s, "v_min", m->v_min_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
    }
    summary_exergy(w, &s, m);
    splice_rest(w, &s);
    gc_jw_end(w);
}

static void write_ideal(cw *c, double eta)
{
    gc_jw *w = c->w;
    const gc_cycle_summary *m = &c->r->ideal.summary;
    double ei = isfinite(c->v.ideal_thermal_efficiency) ? c->v.ideal_thermal_efficiency
                                                         : m->thermal_efficiency;
    splice s;
    splice_init(&s, c, "bounds", "ideal");
    gc_jw_object(w, "ideal");
    sn(w, &s, "thermal_efficiency", ei);
    sq(w, &s, "net_work", m->net_work, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "heat_in", m->heat_in, GC_Q_SPECIFIC_ENERGY);
    sq(w, &s, "heat_out", m->heat_out, GC_Q_SPECIFIC_ENERGY);
    sn(w, &s, "back_work_ratio", m->back_work_ratio);
    if (c->r->ideal.frame == GC_FRAME_CLOSED)
        sq(w, &s, "mean_effective_pressure", m->mean_effective_pressure, GC_Q_PRESSURE_DIFFERENCE);
    sq(w, &s, "T_max", m->T_max_K, GC_Q_TEMPERATURE);
    gc_jw_bool(w, "equals_actual", c->r->ideal_is_actual);
    if (ei > 0.0)
        sn(w, &s, "actual_fraction", eta / ei);
    splice_rest(w, &s);
    gc_jw_end(w);
}

static void write_bounds(cw *c)
{
    gc_jw *w = c->w;
    const gc_cycle_result *r = c->r;
    double eta = eta_of(c);
    gc_jw_object(w, "bounds");
    if (r->has_ideal)
        write_ideal(c, eta);
    if (r->has_ideal_components) {
        const gc_cycle_summary *m = &r->ideal_components;
        gc_jw_object(w, "ideal_components");
        gc_jw_num(w, "thermal_efficiency", m->thermal_efficiency);
        gc_jw_q(w, "net_work", m->net_work, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "heat_in", m->heat_in, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "heat_out", m->heat_out, GC_Q_SPECIFIC_ENERGY);
        if (m->thermal_efficiency > 0.0)
            gc_jw_num(w, "actual_fraction", eta / m->thermal_efficiency);
        gc_jw_end(w);
    }
    gc_jw_object(w, "carnot");
    gc_jw_num(w, "efficiency", r->carnot_efficiency);
    gc_jw_q(w, "T_max", r->actual.summary.T_max_K, GC_Q_TEMPERATURE);
    gc_jw_q(w, "T_min", r->actual.summary.T_min_K, GC_Q_TEMPERATURE);
    if (r->carnot_efficiency > 0.0)
        gc_jw_num(w, "actual_fraction", eta / r->carnot_efficiency);
    gc_jw_end(w);
    gc_jw_end(w);
}

static void write_checks(cw *c)
{
    gc_jw *w = c->w;
    const gc_cycle_checks *k = &c->r->actual.checks;
    gc_jw_object(w, "checks");
    gc_jw_bool(w, "passed", 1);
    gc_jw_num(w, "energy_closure", k->energy_rel);
    gc_jw_q(w, "energy_residual", k->energy_residual, GC_Q_SPECIFIC_ENERGY);
    gc_jw_num(w, "state_closure", k->state_rel);
    gc_jw_num(w, "exergy_balance", k->exergy_rel);
    gc_jw_num(w, "close_mismatch", k->close_rel);
    gc_jw_bool(w, "areas_checked", k->areas_done);
    if (k->areas_done) {
        gc_jw_q(w, "area_pv", k->area_pv, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "area_ts", k->area_ts, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "area_pv_expected", k->area_expected_pv, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "area_ts_expected", k->area_expected_ts, GC_Q_SPECIFIC_ENERGY);
        gc_jw_num(w, "area_pv_error", k->area_pv_rel);
        gc_jw_num(w, "area_ts_error", k->area_ts_rel);
    }
    gc_jw_q(w, "dissipated_work", c->r->actual.summary.dissipated, GC_Q_SPECIFIC_ENERGY);
    gc_jw_object(w, "tolerances");
    gc_jw_num(w, "energy", k->tol_energy);
    gc_jw_num(w, "state", k->tol_state);
    gc_jw_num(w, "area", k->tol_area);
    gc_jw_num(w, "close", k->tol_close);
    gc_jw_end(w);
    gc_jw_end(w);
}

/* ---- paths ------------------------------------------------------------------------------------ */

static void path_array(gc_jw *w, const char *key, const gc_path_point *pts, int n,
                       size_t member, gc_quantity q)
{
    gc_jw_array(w, key);
    for (int k = 0; k < n; k++)
        gc_jw_q(w, NULL, *(const double *)(const void *)((const char *)&pts[k] + member), q);
    gc_jw_end(w);
}

static void paths_run(cw *c, const char *key, const gc_cycle_run *run, gc_path_point *pts)
{
    gc_jw *w = c->w;
    int n = c->o->points;
    gc_jw_array(w, key);
    for (int i = 0; i < run->n_processes; i++) {
        gc_error err;
        if (gc_cycle_path(run, i, n, pts, &err) != GC_OK) {
            gc_jw_num(w, NULL, NAN);   /* refused as not finite (never expected) */
            continue;
        }
        char name[GC_CYCLE_LABEL_LEN + 32];
        process_name(c->r, &run->processes[i], name, sizeof name);
        gc_jw_object(w, NULL);
        gc_jw_int(w, "process", i + 1);
        gc_jw_str(w, "name", name);
        path_array(w, "T", pts, n, offsetof(gc_path_point, T_K), GC_Q_TEMPERATURE);
        path_array(w, "s", pts, n, offsetof(gc_path_point, s_J_per_kgK), GC_Q_SPECIFIC_ENTROPY);
        path_array(w, "P", pts, n, offsetof(gc_path_point, P_Pa), GC_Q_PRESSURE);
        path_array(w, "v", pts, n, offsetof(gc_path_point, v_m3_per_kg), GC_Q_SPECIFIC_VOLUME);
        path_array(w, "h", pts, n, offsetof(gc_path_point, h_J_per_kg), GC_Q_SPECIFIC_ENERGY);
        gc_jw_end(w);
    }
    gc_jw_end(w);
}

static void write_paths(cw *c)
{
    gc_jw *w = c->w;
    int n = c->o->points;
    gc_path_point *pts = malloc((size_t)n * sizeof *pts);
    if (!pts) {
        if (w->b)
            w->b->failed = 1;
        return;
    }
    gc_jw_object(w, "paths");
    gc_jw_int(w, "points_per_process", n);
    paths_run(c, "actual", &c->r->actual, pts);
    if (c->r->has_ideal && !c->r->ideal_is_actual)
        paths_run(c, "ideal", &c->r->ideal, pts);
    double pv = 0.0, ts = 0.0;
    gc_error err;
    if (n >= 3 && n % 2 == 1 && gc_cycle_path_areas(&c->r->actual, n, &pv, &ts, &err) == GC_OK) {
        gc_jw_object(w, "areas");
        gc_jw_q(w, "area_pv", pv, GC_Q_SPECIFIC_ENERGY);
        gc_jw_q(w, "area_ts", ts, GC_Q_SPECIFIC_ENERGY);
        gc_jw_end(w);
    }
    gc_jw_end(w);
    free(pts);
}

/* ---- the parts ---------------------------------------------------------------------------------- */

void gc_api_write_cycle(gc_jw *w, const gc_preset *p, const void *input, const void *result,
                        const gc_api_docopts *o)
{
    cw c = { w, p, input, result, p->cycle(result), { NULL, NAN, NAN, NAN }, o };
    if (p->view)
        p->view(input, result, &c.v);
    write_model(&c);
    write_states(&c);
    write_stations(&c);
    write_processes(&c);
    write_summary(&c);
    write_bounds(&c);
    write_checks(&c);
    if (o && o->include_paths)
        write_paths(&c);
}
