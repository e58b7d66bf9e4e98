/*
 * cycle_summary.c — the cycle's sums after a run: extreme states and the
 * dead state, heat to and from reservoirs, entropy generation and exergy
 * destruction per process (exergy.h models), stream exergies and the
 * closure checks of the heat, exergy and entropy books.
 */
#include "core/engine/cycle_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* ---- summary and checks ---------------------------------------------------- */

/* Extreme states of the run and the dead state (overrides, the chain's, or
 * the lowest-temperature state). */
static void extremes(ctx *x, double T_dead_over, double P_dead_over)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    const gc_cycle *c = x->c;
    const gc_cycle_state *s0 = &run->states[0];
    sm->T_max_K = sm->T_min_K = s0->T_K;
    sm->P_max_Pa = sm->P_min_Pa = s0->P_Pa;
    sm->v_max_m3_per_kg = sm->v_min_m3_per_kg = s0->v_m3_per_kg;
    int i_min = 0;
    for (int k = 1; k < run->n_states; k++) {
        const gc_cycle_state *st = &run->states[k];
        if (st->T_K > sm->T_max_K) sm->T_max_K = st->T_K;
        if (st->T_K < sm->T_min_K) { sm->T_min_K = st->T_K; i_min = k; }
        if (st->P_Pa > sm->P_max_Pa) sm->P_max_Pa = st->P_Pa;
        if (st->P_Pa < sm->P_min_Pa) sm->P_min_Pa = st->P_Pa;
        if (st->v_m3_per_kg > sm->v_max_m3_per_kg) sm->v_max_m3_per_kg = st->v_m3_per_kg;
        if (st->v_m3_per_kg < sm->v_min_m3_per_kg) sm->v_min_m3_per_kg = st->v_m3_per_kg;
    }
    sm->T_dead_K = T_dead_over > 0.0 ? T_dead_over
                                     : (c->T_dead_K > 0.0 ? c->T_dead_K : sm->T_min_K);
    sm->P_dead_Pa = P_dead_over > 0.0 ? P_dead_over
                                      : (c->P_dead_Pa > 0.0 ? c->P_dead_Pa
                                                            : run->states[i_min].P_Pa);
    sm->carnot_efficiency = 1.0 - sm->T_min_K / sm->T_max_K;
}

/* Rounding in an entropy generation that is >= 0 by physics is reported as
 * 0: within GC_CYCLE_TOL_SGEN of the step's entropy scale, and small enough
 * (T_dead s_gen within GC_CYCLE_TOL_SGEN of the heat added) that the exergy
 * balance cannot notice. */
static double clamp_sgen(const gc_cycle_run *run, const gc_cycle_process *p, double sgen,
                         double q_over_T)
{
    double m = p->mass_ratio > 0.0 ? p->mass_ratio : 1.0;
    double scale = m * (fabs(run->states[p->from].s_J_per_kgK) +
                        fabs(run->states[p->to].s_J_per_kgK)) + fabs(q_over_T);
    double a = fabs(sgen);
    return (a <= GC_CYCLE_TOL_SGEN * scale &&
            run->summary.T_dead_K * a <= GC_CYCLE_TOL_SGEN * run->summary.heat_in) ? 0.0 : sgen;
}

/* Heat q_in from a reservoir, q_out to one, at the boundary temperatures of
 * cycle.h's reservoir model: s_gen = delta_s - q_in/T_bi + q_out/T_bo. */
static void reservoir(ctx *x, gc_cycle_process *p, double q_in, double q_out, double *q_over_T)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    const gc_step *st = &x->c->steps[p->step];
    double T0 = sm->T_dead_K;
    double Ta = run->states[p->from].T_K, Tb = run->states[p->to].T_K;
    double Ts = st->T_source_K > 0.0 ? st->T_source_K : sm->T_max_K;
    double Tbi = fmax(Ts, fmax(Ta, Tb)), Tbo = fmin(T0, fmin(Ta, Tb));
    p->s_gen = p->delta_s;
    if (q_in > 0.0) {
        p->s_gen -= q_in / Tbi;
        *q_over_T += q_in / Tbi;
        sm->exergy_heat_in += q_in * (1.0 - T0 / Tbi);
    }
    if (q_out > 0.0) {
        p->s_gen += q_out / Tbo;
        *q_over_T += q_out / Tbo;
        sm->exergy_heat_out += q_out * (1.0 - T0 / Tbo);
    }
    p->T_boundary_K = q_in > 0.0 ? Tbi : Tbo;
}

/* Second law of one process (see cycle.h, exergy models): s_gen,
 * T_boundary, exergy destroyed and the heat exergies into the summary. */
static void second_law(ctx *x, gc_cycle_process *p, const gc_exergy_env *env, int fuel_run)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    const gc_step *st = &x->c->steps[p->step];
    double T0 = sm->T_dead_K;
    double Tlo = fmin(run->states[p->from].T_K, run->states[p->to].T_K);
    double Tbo = fmin(T0, Tlo), q_over_T = 0.0;
    p->T_boundary_K = 0.0;
    p->exergy_fuel = 0.0;
    p->exergy_lost = 0.0;
    if (p->internal) {
        int pi = x->pair_of_step[p->step];
        p->s_gen = 0.0;
        if (pi >= 0 && x->pairs[pi].second == p->step) {
            /* pair total on the second side: sum of both sides' delta_s */
            double ds = p->delta_s;
            for (int q = 0; q < run->n_processes; q++)
                if (run->processes[q].step == x->pairs[pi].first)
                    ds += run->processes[q].delta_s;
            p->s_gen = ds;
        }
    } else if (p->kind == GC_PROC_FUEL) {
        /* the fuel is no reservoir: its exergy enters with it; the burner
         * loss leaves at the dead state (or the gas's lowest T if lower) */
        p->s_gen = p->delta_s;
        if (p->heat_out > 0.0) {
            q_over_T = p->heat_out / Tbo;
            p->s_gen += q_over_T;
            sm->exergy_heat_out += p->heat_out * (1.0 - T0 / Tbo);
            p->T_boundary_K = Tbo;
        }
        const gc_fuel *fu = (const gc_fuel *)st->fuel.fuel;
        double Tf = st->fuel.T_fuel_K > 0.0 ? st->fuel.T_fuel_K : x->c->T_start_K, b = 0.0;
        double m_f = run->states[p->to].mass_ratio - run->states[p->from].mass_ratio;
        if (fu != NULL && gc_exergy_fuel(env, fu, Tf, run->states[p->from].P_Pa, &b, NULL) == GC_OK)
            p->exergy_fuel = m_f * b;
        sm->exergy_fuel += p->exergy_fuel;
    } else if (fuel_run && p->kind == GC_PROC_CLOSE) {
        /* the heat that crosses the boundary is the stream's own energy
         * change (the booked heat also carries the shift to the 298.15 K
         * reference, which no reservoir sees) */
        const gc_cycle_state *a = &run->states[p->from], *b = &run->states[p->to];
        double q = p->mass_ratio * (b->h_J_per_kg - a->h_J_per_kg) + p->delta_ke + p->work;
        reservoir(x, p, q > 0.0 ? q : 0.0, q < 0.0 ? -q : 0.0, &q_over_T);
    } else if (p->heat_in > 0.0 || p->heat_out > 0.0) {
        reservoir(x, p, p->heat_in, p->heat_out, &q_over_T);
    } else {
        p->s_gen = p->delta_s;
    }
    p->s_gen = clamp_sgen(run, p, p->s_gen, q_over_T);
    double D = T0 * p->s_gen;
    if (fuel_run && p->kind == GC_PROC_CLOSE) {
        p->exergy_destroyed = 0.0;
        p->exergy_lost = D;
        sm->exergy_exhaust += D;
    } else {
        p->exergy_destroyed = D;
        sm->exergy_destroyed += D;
    }
}

/* Fuel model: the intake's and the end state's stream exergies. */
static int stream_exergies(ctx *x, const gc_exergy_env *env)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    const gc_cycle_state *a = &run->states[0], *e = &run->states[run->n_states - 1];
    const gc_gas *ga = &run->gases[a->gas], *ge = &run->gases[e->gas];
    double ba, be, bc;
    int rc = gc_exergy_gas(env, ga, a->T_K, a->P_Pa, &ba, x->err);
    if (rc == GC_OK)
        rc = gc_exergy_gas(env, ge, e->T_K, e->P_Pa, &be, x->err);
    if (rc == GC_OK)
        rc = gc_exergy_gas(env, ge, env->T0_K, env->P0_Pa, &bc, x->err);
    if (rc != GC_OK)
        return gc__cycle_with_field(x->err, rc, "/dead_state");
    sm->exergy_intake = a->mass_ratio * ba;
    sm->exergy_exhaust += e->mass_ratio * be;
    sm->exergy_exhaust_chemical = e->mass_ratio * bc;
    return GC_OK;
}

/* The built-in checks of a summarised run: state closure, energy closure
 * (residual = sum of heat - sum of work), exergy balance. */
static int closure_checks(ctx *x, double residual)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    gc_cycle_checks *ck = &run->checks;
    const gc_cycle_state *s0 = &run->states[0];
    const gc_cycle_state *se = &run->states[run->n_states - 1];
    ck->energy_residual = residual;
    ck->energy_rel = fabs(ck->energy_residual) / sm->heat_in;
    double eT = fabs(se->T_K - s0->T_K) / s0->T_K;
    double eP = fabs(se->P_Pa - s0->P_Pa) / s0->P_Pa;
    /* after fuel addition the end gas differs from the start gas: compare T, P */
    double ev = (se->gas == s0->gas)
                    ? fabs(se->v_m3_per_kg - s0->v_m3_per_kg) / s0->v_m3_per_kg : 0.0;
    sm->fuel_air_ratio = se->mass_ratio - 1.0;
    ck->state_rel = fmax(eT, fmax(eP, ev));
    ck->exergy_rel = fabs(sm->exergy_in + sm->exergy_intake - sm->exergy_heat_out -
                          sm->net_work - sm->exergy_destroyed - sm->exergy_exhaust) /
                     sm->heat_in;
    ck->areas_applicable = 1;
    if (!(ck->state_rel <= ck->tol_state))
        return gc_error_set(x->err, GC_ERR_CHECK, "",
                            "state closure failed: the chain ends %.3g (relative) away from its "
                            "start state; add a closing step", ck->state_rel);
    if (!(ck->energy_rel <= ck->tol_energy))
        return gc_error_set(x->err, GC_ERR_CHECK, "",
                            "energy closure failed: heat minus work is %.3g of the heat added",
                            ck->energy_rel);
    if (!(ck->exergy_rel <= ck->tol_energy))
        return gc_error_set(x->err, GC_ERR_CHECK, "",
                            "exergy balance failed by %.3g of the heat added", ck->exergy_rel);
    return GC_OK;
}

int gc__cycle_summarise(ctx *x, double T_dead_over, double P_dead_over)
{
    gc_cycle_run *run = x->run;
    gc_cycle_summary *sm = &run->summary;
    gc_cycle_checks *ck = &run->checks;
    const gc_cycle *c = x->c;
    double close_rel = ck->close_rel;
    memset(sm, 0, sizeof *sm);
    memset(ck, 0, sizeof *ck);
    ck->close_rel = close_rel;
    ck->tol_energy = GC_CYCLE_TOL_ENERGY;
    ck->tol_state = GC_CYCLE_TOL_STATE;
    ck->tol_area = GC_CYCLE_TOL_AREA;
    ck->tol_close = GC_CYCLE_TOL_CLOSE;
    extremes(x, T_dead_over, P_dead_over);
    int fuel_run = 0;
    for (int k = 0; k < run->n_processes; k++)
        fuel_run |= run->processes[k].kind == GC_PROC_FUEL;
    gc_exergy_env env;
    memset(&env, 0, sizeof env);
    if (fuel_run) {
        int rc = gc_exergy_env_init(&env, sm->T_dead_K, sm->P_dead_Pa, x->err);
        if (rc != GC_OK)
            return rc;
        sm->exergy_model = GC_EXERGY_FUEL;
    }

    double sum_q = 0.0, sum_w = 0.0;
    for (int k = 0; k < run->n_processes; k++) {
        gc_cycle_process *p = &run->processes[k];
        sum_q += p->heat;
        sum_w += p->work;
        sm->net_work += p->work;
        sm->heat_in += p->heat_in;
        sm->heat_out += p->heat_out;
        sm->dissipated += p->dissipated;
        if (p->work > 0.0) sm->work_out += p->work;
        else sm->work_in -= p->work;
    }
    for (int k = 0; k < run->n_processes; k++)
        second_law(x, &run->processes[k], &env, fuel_run); /* after heat_in: clamp_sgen */
    if (fuel_run) {
        int rc = stream_exergies(x, &env);
        if (rc != GC_OK)
            return rc;
    }
    if (!(sm->heat_in > 0.0))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, "", "the cycle takes in no heat");
    sm->exergy_in = sm->exergy_heat_in + sm->exergy_fuel;
    sm->thermal_efficiency = sm->net_work / sm->heat_in;
    sm->back_work_ratio = sm->work_out > 0.0 ? sm->work_in / sm->work_out : 0.0;
    double dv = sm->v_max_m3_per_kg - sm->v_min_m3_per_kg;
    sm->mean_effective_pressure = (c->frame == GC_FRAME_CLOSED && dv > 0.0) ? sm->net_work / dv : 0.0;
    sm->second_law_efficiency = sm->exergy_in > 0.0 ? sm->net_work / sm->exergy_in : 0.0;

    return closure_checks(x, sum_q - sum_w);
}

