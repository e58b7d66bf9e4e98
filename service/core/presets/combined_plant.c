/*
 * combined_plant.c — the combined-cycle plant's figures after the topping
 * and the steam cycle ran (combined.h): summary, levels, the states of both
 * fluids, the processes with their exergy destroyed, the T-Q data, the
 * exergy account, the Carnot and reversible-bottoming bounds, and the
 * plant's energy and exergy closure checks.
 *
 * Plant energy closure (relative to the fuel heat, GC_COMBINED_TOL):
 *   fuel heat (topping + duct burner, LHV at 298.15 K) + pump power
 *   + intake air's sensible enthalpy flow + the fuels' sensible enthalpy
 *   = topping gas-path net work + steam turbine work + condenser heat
 *   + the topping's other heat rejected + duct burner loss
 *   + the stack gas's sensible enthalpy flow,
 * sensible enthalpies on the cycle engine's formation basis (gc_cycle_h_ref,
 * cycle.h), the stack gas recomputed here (the duct burner's products by
 * combustion.h, as the steam core burns them). Each side comes from another
 * module's books (the topping's engine, the steam core), so the check fails
 * when the exhaust handed over is not the one the topping produced.
 * Plant exergy balance (a topping with an exergy model; with a duct burner
 * of a gas fuel too):
 *   fuel (or heat) exergy + duct burner fuel's + intake exergy = net work +
 *   destroyed (topping processes up to the HRSG inlet, every bottoming
 *   process) + stack (physical) + condenser heat x (1 - T0/T_b) + the stack
 *   gas's chemical exergy (unfired: the topping's exhaust's, from its books)
 *   + other heat's. A liquid duct-burner fuel has no entropy data: not
 *   checked then.
 * Units: SI.
 */
#include "core/presets/combined_internal.h"
#include "gascycle/exergy.h"
#include "gascycle/if97.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static double ratio(double a, double b)
{
    return b != 0.0 ? a / b : 0.0;
}

/* ---- summary and levels ------------------------------------------------------------------ */

static void summarise(const gc_combined_input *in, gc_combined_result *r)
{
    const gc_combined_exhaust *x = &r->exhaust;
    const gc_steam_summary *ss = &r->steam.summary;
    gc_combined_summary *s = &r->summary;
    s->gas_turbine_power_W = x->net_power_W;
    s->steam_turbine_power_W = in->generator_efficiency * ss->turbine_power_W;
    s->pump_power_W = ss->pump_power_W;
    s->steam_cycle_net_power_W = s->steam_turbine_power_W - s->pump_power_W;
    s->net_power_W = s->gas_turbine_power_W + s->steam_cycle_net_power_W;
    s->duct_burner_fuel_heat_W = ss->fuel_heat_W;
    s->fuel_heat_W = x->fuel_heat_W + ss->fuel_heat_W;
    double duct_hhv = ss->fuel_heat_W > 0.0
        ? ss->fuel_heat_W * (in->has_duct_burner_fuel ? in->duct_burner_fuel : x->fuel)
              .HHV_J_per_kg / (in->has_duct_burner_fuel ? in->duct_burner_fuel : x->fuel)
              .LHV_J_per_kg : 0.0;
    s->fuel_heat_hhv_W = x->fuel_heat_hhv_W + duct_hhv;
    s->has_efficiency = x->has_heat && s->fuel_heat_W > 0.0 && s->net_power_W > 0.0;
    s->thermal_efficiency = ratio(s->net_power_W, s->fuel_heat_W);
    s->thermal_efficiency_hhv = ratio(s->net_power_W, s->fuel_heat_hhv_W);
    s->heat_rate = ratio(s->fuel_heat_W, s->net_power_W);
    s->heat_rate_hhv = ratio(s->fuel_heat_hhv_W, s->net_power_W);
    s->gas_turbine_efficiency = ratio(x->net_power_W, x->fuel_heat_W);
    s->steam_cycle_efficiency = ss->steam_cycle_efficiency;
    s->bottoming_efficiency = ss->bottoming_efficiency;
    s->hrsg_effectiveness = ss->hrsg_effectiveness;
    s->steam_to_gas_power_ratio = ratio(s->steam_cycle_net_power_W, x->net_power_W);
    s->intake_mass_flow_kg_per_s = x->intake_mass_flow;
    s->exhaust_mass_flow_kg_per_s = x->intake_mass_flow * x->exhaust_mass_ratio;
    s->stack_mass_flow_kg_per_s = ss->gas_mass_flow_kg_per_s;
    s->exhaust_temperature_K = x->T_K;
    s->stack_temperature_K = ss->stack_temperature_K;
    s->heat_to_steam_W = ss->heat_to_steam_W;
    s->condenser_heat_W = ss->condenser_heat_W;
    s->condenser_pressure_Pa = ss->condenser_pressure_Pa;
    s->condenser_temperature_K = ss->condenser_temperature_K;
    s->has_exhaust_quality = ss->exhaust_quality >= 0.0;
    s->exhaust_quality = s->has_exhaust_quality ? ss->exhaust_quality : 0.0;
    s->basis = x->has_flow ? "the plant at the topping's flow"
                           : "per 1 kg/s of intake air (the topping gives no rated power)";
}

static void levels(gc_combined_result *r)
{
    const gc_steam_result *st = &r->steam;
    static const char *const names[3][3] = { { "hp", "", "" }, { "hp", "lp", "" },
                                             { "hp", "ip", "lp" } };
    r->n_levels = st->n_levels;
    for (int i = 0; i < st->n_levels && i < GC_STEAM_MAX_LEVELS; i++) {
        gc_combined_level_out *l = &r->levels[i];
        char steam[GC_STEAM_NAME_LEN];
        snprintf(l->name, sizeof l->name, "%s", names[st->n_levels - 1][i]);
        snprintf(steam, sizeof steam, "%s_steam", l->name);
        int k = gc_steam_station_index(st, steam);
        l->pressure_Pa = k >= 0 ? st->stations[k].P_Pa : 0.0;
        l->steam_temperature_K = k >= 0 ? st->stations[k].T_K : 0.0;
        gc_if97_Tsat_P(l->pressure_Pa, &l->saturation_temperature_K, NULL);
        l->steam_mass_flow_kg_per_s = st->summary.steam_mass_flow_kg_per_s[i];
        l->pinch_K = st->summary.pinch_K[i];
        l->approach_K = st->summary.approach_K[i];
    }
}

/* ---- states and processes ------------------------------------------------------------- */

double gc__combined_gas_exergy(const gc_gas *g, double T, double P, double T0, double P0)
{
    return gc_gas_h_T(g, T) - gc_gas_h_T(g, T0) - T0 * (gc_gas_s_TP(g, T, P) -
                                                        gc_gas_s_TP(g, T0, P0));
}

static void topping_states(gc_combined_result *r, const gc_cycle_result *c, int n)
{
    const gc_combined_exhaust *x = &r->exhaust;
    const gc_cycle_run *run = &c->actual;
    for (int i = 0; i < n && i < run->n_states && r->n_states < GC_COMBINED_MAX_STATES; i++) {
        const gc_cycle_state *cs = &run->states[i];
        const gc_gas *g = &run->gases[cs->gas];
        gc_combined_state *s = &r->states[r->n_states++];
        snprintf(s->name, sizeof s->name, "%s", c->station[i]);
        s->part = GC_CC_GAS_TURBINE;
        s->fluid = GC_STEAM_GAS;
        s->T_K = cs->T_K;
        s->P_Pa = cs->P_Pa;
        s->h_J_per_kg = gc_gas_h_T(g, cs->T_K) - gc_gas_h_T(g, GC_T_REF_K);
        s->s_J_per_kgK = cs->s_J_per_kgK;
        s->v_m3_per_kg = cs->v_m3_per_kg;
        s->m_kg_per_s = cs->mass_ratio * x->intake_mass_flow;
        s->exergy_J_per_kg = gc__combined_gas_exergy(g, cs->T_K, cs->P_Pa, x->T_dead_K, x->P_dead_Pa);
    }
}

static void steam_states(gc_combined_result *r)
{
    const gc_steam_result *st = &r->steam;
    for (int i = 0; i < st->n_stations && r->n_states < GC_COMBINED_MAX_STATES; i++) {
        const gc_steam_station *ss = &st->stations[i];
        gc_combined_state *s = &r->states[r->n_states++];
        snprintf(s->name, sizeof s->name, "%s", ss->name);
        s->fluid = ss->fluid;
        s->part = ss->fluid == GC_STEAM_GAS ? GC_CC_HRSG : GC_CC_STEAM_CYCLE;
        s->T_K = ss->T_K;
        s->P_Pa = ss->P_Pa;
        s->h_J_per_kg = ss->h_J_per_kg;
        s->s_J_per_kgK = ss->s_J_per_kgK;
        s->v_m3_per_kg = ss->v_m3_per_kg;
        s->has_x = ss->fluid == GC_STEAM_WATER && ss->x >= 0.0;
        s->x = s->has_x ? ss->x : 0.0;
        s->m_kg_per_s = ss->m_kg_per_s;
        s->exergy_J_per_kg = ss->exergy_J_per_kg;
    }
}

static gc_combined_process *add_process(gc_combined_result *r, const char *name, int part,
                                        const char *kind, const char *from, const char *to)
{
    if (r->n_processes >= GC_COMBINED_MAX_PROCESSES)
        return NULL;
    gc_combined_process *p = &r->processes[r->n_processes++];
    memset(p, 0, sizeof *p);
    snprintf(p->name, sizeof p->name, "%s", name);
    p->part = part;
    snprintf(p->kind, sizeof p->kind, "%s", kind);
    snprintf(p->from, sizeof p->from, "%s", from);
    snprintf(p->to, sizeof p->to, "%s", to);
    return p;
}

/* The topping's processes up to the HRSG inlet (state index < n). */
static void topping_processes(gc_combined_result *r, const gc_cycle_result *c, int n)
{
    const gc_cycle_run *run = &c->actual;
    double m = r->exhaust.intake_mass_flow;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *cp = &run->processes[k];
        if (cp->to >= n || cp->from >= n)
            continue;
        const char *label = c->label[cp->step][0] ? c->label[cp->step]
                                                  : gc_cycle_kind_name(cp->kind);
        gc_combined_process *p = add_process(r, label, GC_CC_GAS_TURBINE,
                                             gc_cycle_kind_name(cp->kind), c->station[cp->from],
                                             c->station[cp->to]);
        if (p == NULL)
            return;
        p->m_kg_per_s = cp->mass_ratio * m;
        p->has_power = cp->work != 0.0;
        p->power_W = fabs(cp->work) * m;
        p->has_duty = cp->heat != 0.0;
        p->duty_W = cp->heat * m;
        p->exergy_destroyed_W = cp->exergy_destroyed * m;
    }
}

static int is_section(int kind)
{
    return kind == GC_STEAM_ECONOMISER || kind == GC_STEAM_EVAPORATOR ||
           kind == GC_STEAM_SUPERHEATER || kind == GC_STEAM_REHEATER;
}

static void steam_processes(gc_combined_result *r)
{
    const gc_steam_result *st = &r->steam;
    for (int k = 0; k < st->n_processes; k++) {
        const gc_steam_process *sp = &st->processes[k];
        int part = is_section(sp->kind) || sp->kind == GC_STEAM_DUCT_BURNER ? GC_CC_HRSG
                                                                           : GC_CC_STEAM_CYCLE;
        gc_combined_process *p = add_process(
            r, sp->name, part, gc_steam_process_kind_name(sp->kind),
            sp->from >= 0 ? st->stations[sp->from].name : "",
            sp->to >= 0 ? st->stations[sp->to].name : "");
        if (p == NULL)
            return;
        p->m_kg_per_s = sp->m_kg_per_s;
        p->has_power = sp->kind == GC_STEAM_TURBINE || sp->kind == GC_STEAM_PUMP;
        p->power_W = sp->work_W;
        p->has_duty = sp->heat_W != 0.0;
        p->duty_W = sp->heat_W;
        p->exergy_destroyed_W = sp->exergy_destroyed_W;
        p->has_dT = is_section(sp->kind);
        p->dT_min_K = sp->dT_min_K;
    }
}

static void tq(gc_combined_result *r)
{
    const gc_steam_result *st = &r->steam;
    r->n_tq = st->n_tq;
    for (int i = 0; i < st->n_tq; i++) {
        const gc_steam_tq_point *p = &st->tq[i];
        gc_combined_tq *q = &r->tq[i];
        memset(q, 0, sizeof *q);
        q->Q_W = p->Q_W;
        q->T_gas_K = p->T_gas_K;
        for (int j = 0; j < p->n_water && j < GC_STEAM_MAX_LEVELS; j++) {
            q->has[j] = 1;
            q->T_water_K[j] = p->T_water_K[j];
            int k = p->process[j];
            snprintf(q->stream[j], sizeof q->stream[j], "%s",
                     k >= 0 && k < st->n_processes ? st->processes[k].name : "");
        }
    }
}

/* ---- exergy, bounds, checks --------------------------------------------------------------- */

/* The stack gas (the duct burner's products, as the steam core burns them). */
static int stack_gas(const gc_combined_input *in, const gc_combined_result *r, gc_gas *g,
                     gc_fuel *fuel)
{
    const gc_combined_exhaust *x = &r->exhaust;
    *g = x->gas;
    if (r->steam.summary.fuel_mass_flow_kg_per_s == 0.0)
        return GC_OK;
    *fuel = in->has_duct_burner_fuel ? in->duct_burner_fuel : x->fuel;
    gc_burn b;
    int rc = gc_combustion_burn_to_T(fuel, in->duct_burner_fuel_temperature, &x->gas, x->T_K,
                                     x->intake_mass_flow * x->exhaust_mass_ratio,
                                     in->firing_temperature, in->burner_efficiency, &b, NULL);
    *g = b.products;
    return rc;
}

/* With a duct burner: its fuel's exergy as supplied and the stack gas's
 * chemical exergy (Szargut's environment at the dead state, exergy.h); 0 on
 * success. Unfired: nothing to add (the topping's books hold the exhaust's). */
static int fired_exergy(const gc_combined_input *in, const gc_combined_result *r,
                        double *fuel_W, double *chemical_W)
{
    const gc_combined_exhaust *x = &r->exhaust;
    const gc_steam_summary *ss = &r->steam.summary;
    gc_gas g;
    gc_fuel fuel;
    gc_exergy_env env;
    double b = 0.0, c = 0.0;
    *fuel_W = *chemical_W = 0.0;
    if (ss->fuel_mass_flow_kg_per_s == 0.0)
        return 0;
    if (stack_gas(in, r, &g, &fuel) != GC_OK ||
        gc_exergy_env_init(&env, x->T_dead_K, x->P_dead_Pa, NULL) != GC_OK ||
        gc_exergy_fuel(&env, &fuel, in->duct_burner_fuel_temperature, x->P_Pa, &b, NULL) !=
            GC_OK ||
        gc_exergy_gas(&env, &g, x->T_dead_K, x->P_dead_Pa, &c, NULL) != GC_OK)
        return -1;
    *fuel_W = ss->fuel_mass_flow_kg_per_s * b;
    *chemical_W = ss->gas_mass_flow_kg_per_s * c;
    return fuel.kind == GC_FUEL_GAS ? 0 : -1;   /* a liquid: no burner entropy (warned) */
}

static void exergy(const gc_combined_input *in, gc_combined_result *r)
{
    const gc_combined_exhaust *x = &r->exhaust;
    const gc_steam_summary *ss = &r->steam.summary;
    gc_combined_exergy *e = &r->exergy;
    double T0 = x->T_dead_K, Tb = fmin(ss->condenser_temperature_K, T0);
    double duct_W = 0.0, chem_W = 0.0;
    int fired_ok = fired_exergy(in, r, &duct_W, &chem_W) == 0;
    e->has_fuel = x->exergy_model >= 0 && x->exergy_in_W > 0.0;
    e->fuel_W = x->exergy_in_W + duct_W;
    e->duct_fuel_W = duct_W;
    e->intake_W = x->exergy_intake_W;
    e->net_power_W = x->work_W + ss->turbine_power_W - ss->pump_power_W;
    e->destroyed_W = 0.0;
    for (int k = 0; k < r->n_processes; k++)
        e->destroyed_W += r->processes[k].exergy_destroyed_W;
    e->stack_W = ss->exergy_stack_W;
    e->condenser_W = ss->condenser_heat_W * (1.0 - T0 / Tb);
    e->exhaust_chemical_W = ss->fuel_mass_flow_kg_per_s > 0.0 ? chem_W : x->exergy_chemical_W;
    e->heat_rejected_W = x->exergy_heat_out_W;
    e->efficiency = ratio(r->summary.net_power_W, e->fuel_W);
    e->balance_checked = e->has_fuel && fired_ok;
    double res = e->fuel_W + e->intake_W - e->net_power_W - e->destroyed_W - e->stack_W -
                 e->condenser_W - e->exhaust_chemical_W - e->heat_rejected_W;
    e->balance_rel = e->balance_checked ? fabs(res) / r->summary.fuel_heat_W : 0.0;
}

static void bounds(gc_combined_result *r)
{
    gc_combined_bounds *b = &r->bounds;
    b->T_max_K = r->exhaust.T_max_K;
    b->T_min_K = r->exhaust.T_min_K;
    for (int i = 0; i < r->n_states; i++) {
        b->T_max_K = fmax(b->T_max_K, r->states[i].T_K);
        b->T_min_K = fmin(b->T_min_K, r->states[i].T_K);
    }
    b->carnot_efficiency = 1.0 - b->T_min_K / b->T_max_K;
    b->exhaust_exergy_W = r->steam.summary.exergy_gas_in_W;
    b->has_reversible = r->summary.has_efficiency;
    b->reversible_net_power_W = r->exhaust.net_power_W + b->exhaust_exergy_W +
                                r->exergy.duct_fuel_W;
    b->reversible_efficiency = ratio(b->reversible_net_power_W, r->summary.fuel_heat_W);
}

static double plant_energy(const gc_combined_input *in, const gc_combined_result *r)
{
    const gc_combined_exhaust *x = &r->exhaust;
    const gc_steam_summary *ss = &r->steam.summary;
    gc_gas g;
    gc_fuel fuel;
    if (stack_gas(in, r, &g, &fuel) != GC_OK)
        return INFINITY;
    double duct_sensible = 0.0, h = 0.0;
    if (ss->fuel_mass_flow_kg_per_s > 0.0 &&
        gc_fuel_h_T(&fuel, in->duct_burner_fuel_temperature, &h, NULL) == GC_OK)
        duct_sensible = ss->fuel_mass_flow_kg_per_s * (h - fuel.h298_J_per_kg);
    double stack = ss->gas_mass_flow_kg_per_s *
                   (gc_gas_h_T(&g, ss->stack_temperature_K) - gc_cycle_h_ref(&g));
    double in_ = x->fuel_heat_W + ss->fuel_heat_W + ss->pump_power_W + x->intake_sensible_W +
                 x->fuel_sensible_W + duct_sensible;
    double out = x->work_W + ss->turbine_power_W + ss->condenser_heat_W + x->other_heat_out_W +
                 (1.0 - in->burner_efficiency) * ss->fuel_heat_W + stack;
    return fabs(in_ - out) / (x->fuel_heat_W + ss->fuel_heat_W);
}

static int checks(const gc_combined_input *in, gc_combined_result *r, gc_report *rep)
{
    const gc_steam_checks *sc = &r->steam.checks;
    gc_combined_checks *c = &r->checks;
    c->tolerance = GC_COMBINED_TOL;
    c->energy_hrsg_rel = sc->energy_hrsg_rel;
    c->energy_steam_cycle_rel = sc->energy_cycle_rel;
    c->energy_bottoming_rel = sc->energy_total_rel;
    c->exergy_bottoming_checked = sc->exergy_checked;
    c->exergy_bottoming_rel = sc->exergy_rel;
    c->pinch_error_K = sc->pinch_error_K;
    c->approach_error_K = sc->approach_error_K;
    c->min_temperature_difference_K = r->steam.summary.min_dT_K;
    c->no_temperature_cross = sc->no_cross;
    c->stack_above_minimum = sc->stack_ok;
    c->energy_topping_rel = r->exhaust.energy_rel;
    c->energy_plant_checked = r->exhaust.exergy_model >= 0 && r->summary.fuel_heat_W > 0.0;
    c->energy_plant_rel = c->energy_plant_checked ? plant_energy(in, r) : 0.0;
    if (!(c->energy_plant_rel <= GC_COMBINED_TOL) ||
        !(r->exergy.balance_rel <= GC_COMBINED_TOL))
        return gc_report_error(rep, GC_ERR_CHECK, -1, -1, "a built-in check of the plant "
                               "failed: energy closure %.3g, exergy balance %.3g (tolerance "
                               "%.0e)", c->energy_plant_rel, r->exergy.balance_rel,
                               GC_COMBINED_TOL);
    return GC_OK;
}

int gc__combined_plant(const gc_combined_input *in, gc_combined_result *r, gc_report *rep)
{
    const gc_combined_topping *t = gc__combined_topping_of(in);
    snprintf(r->gas_label, sizeof r->gas_label, "%s", r->exhaust.gas.label);
    summarise(in, r);
    levels(r);
    int n = 0;
    const gc_cycle_result *c = t && t->cycle ? t->cycle(r->topping.bytes, &n) : NULL;
    if (c) {
        topping_states(r, c, n);
        topping_processes(r, c, n);
    }
    steam_states(r);
    steam_processes(r);
    tq(r);
    exergy(in, r);
    bounds(r);
    if (!r->summary.has_efficiency && r->exhaust.has_heat)
        gc_report_warn(rep, "no_net_power", -1, -1, "the plant delivers no net power (%.6g "
                       "W): no efficiency or heat rate is given", r->summary.net_power_W);
    return checks(in, r, rep);
}
