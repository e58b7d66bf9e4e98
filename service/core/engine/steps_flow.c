/*
 * steps_flow.c — the engine's pressure loss (a throttle at constant h),
 * the two sides of a heat exchanger, fuel addition (combustion.h books) and
 * the closing step back to the start state.
 */
#include "core/engine/cycle_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

int gc__cycle_step_pressure_loss(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    double loss = gc__cycle_step_loss(x, s);
    double P2 = in->P_Pa * (1.0 - loss);
    if (s->end == GC_END_PRESSURE) {  /* the ideal chain has no such end (idealize) */
        P2 = s->end_value;
        if (P2 > in->P_Pa)
            return gc_error_set(x->err, GC_ERR_INFEASIBLE, gc__cycle_step_field(x, i),
                                "a throttle cannot raise the pressure (%.6g Pa at its inlet, "
                                "%.6g Pa asked)", in->P_Pa, P2);
    }
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    sg.diss = g->R_J_per_kgK * in->T_K * log(in->P_Pa / P2);
    return gc__cycle_push(x, i, &sg, in->T_K, P2, in->V_m_per_s, gc__cycle_step_field(x, i));
}

int gc__cycle_step_heat_exchange(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int pi = x->pair_of_step[i];
    hx_pair *hp = &x->pairs[pi];
    int cv = (s->geometry == GC_GEOM_CONST_V);
    double m = in->mass_ratio, T1 = in->T_K, R = g->R_J_per_kgK;
    double Q; /* into this side, J/kg intake */
    int rc;
    if (hp->first == i) {
        const gc_step *s1 = &x->c->steps[i];
        double eps = s1->efficiency;
        double Tb = (hp->T_guess > 0.0) ? hp->T_guess : T1;
        hp->T_first_in = T1;
        double mb = (hp->T_guess > 0.0) ? hp->m_guess : m;
        const gc_gas *gb = &run->gases[(hp->T_guess > 0.0) ? hp->gas_guess : in->gas];
        double lo = fmin(T1, Tb), hi = fmax(T1, Tb);
        double qa = m * (gc__cycle_f_T(g, cv, hi) - gc__cycle_f_T(g, cv, lo));
        double qb = mb * (gc__cycle_f_T(gb, cv, hi) - gc__cycle_f_T(gb, cv, lo));
        double qmax = fmin(qa, qb);
        Q = (Tb > T1) ? eps * qmax : -eps * qmax;
        hp->Q_first = Q;
    } else {
        hp->T_actual = T1;
        hp->m_actual = m;
        hp->gas_actual = in->gas;
        Q = -hp->Q_first;
    }
    double T2;
    double f2 = gc__cycle_f_T(g, cv, T1) + Q / m;
    double c1 = gc_gas_cp_T(g, T1) - (cv ? R : 0.0);
    rc = gc__cycle_T_from_f(g, cv, f2, T1 + Q / (m * c1), &T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    double loss = cv ? 0.0 : gc__cycle_step_loss(x, s);
    seg sg;
    double P2;
    if (cv) {
        gc__cycle_seg_init(&sg, GC_CURVE_ISOCHORE);
        P2 = R * T2 / in->v_m3_per_kg;
        sg.w = (x->c->frame == GC_FRAME_CLOSED) ? 0.0 : -in->v_m3_per_kg * (P2 - in->P_Pa);
    } else {
        gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
        P2 = in->P_Pa * (1.0 - loss);
        sg.w = (x->c->frame == GC_FRAME_CLOSED) ? R * (T2 - T1) : 0.0;
        sg.diss = R * log(in->P_Pa / P2) * 0.5 * (T1 + T2);
    }
    sg.q = Q / m;
    sg.internal = 1;
    sg.eff = s->efficiency;
    return gc__cycle_push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

/* Sensible enthalpy the fuel steps before step i brought in with their
 * fuel, J/kg intake: sum of m_fuel (h_fuel(T_fuel) - h_fuel(298.15 K)). */
static double fuel_sensible_in(ctx *x, int i)
{
    double sum = 0.0;
    const gc_cycle_run *run = x->run;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->kind != GC_PROC_FUEL || p->step >= i)
            continue;
        const gc_step *s = &x->c->steps[p->step];
        const gc_fuel *fu = (const gc_fuel *)s->fuel.fuel;
        double Tf = s->fuel.T_fuel_K > 0.0 ? s->fuel.T_fuel_K : x->c->T_start_K, hf;
        double m_f = run->states[p->to].mass_ratio - run->states[p->from].mass_ratio;
        if (fu != NULL && gc_fuel_h_T(fu, Tf, &hf, NULL) == GC_OK)
            sum += m_f * (hf - fu->h298_J_per_kg);
    }
    return sum;
}

/* Heat rejection back to the start state. The entering state must lie
 * within GC_CYCLE_TOL_CLOSE of the start pressure (constant-pressure close)
 * or volume (constant-volume close); a difference inside it is reported in
 * checks.close_rel. A constant-pressure close takes a pressure difference
 * along its drawn curve, linear in T and ln P, with that curve's reversible
 * work (closed: R dT - R T d ln P integrated, flow: -R T d ln P); a
 * constant-volume close is the isochore of the entering volume. In a chain with fuel the heat is booked on the sensible
 * basis (cycle.h): the exhaust's sensible enthalpy less the intake's and the
 * fuel's, so that heat_in - heat_out equals the net work on one reference. */
int gc__cycle_step_close(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, T1 = in->T_K, T2 = x->c->T_start_K;
    double P1 = in->P_Pa, P2 = x->c->P_start_Pa;
    int cv = s->geometry == GC_GEOM_CONST_V;
    double ref = cv ? R * T2 / P2 : P2, got = cv ? in->v_m3_per_kg : P1;
    double rel = fabs(got - ref) / ref;
    if (!(rel <= GC_CYCLE_TOL_CLOSE))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                            "the state before closing has %s = %.9g %s, not the start %s "
                            "%.9g %s (relative difference %.2g, more than %g): a %s close "
                            "cannot return to the start", cv ? "v" : "P", got,
                            cv ? "m3/kg" : "Pa", cv ? "volume" : "pressure", ref,
                            cv ? "m3/kg" : "Pa", rel, GC_CYCLE_TOL_CLOSE,
                            cv ? "constant-volume" : "constant-pressure");
    if (rel > run->checks.close_rel)
        run->checks.close_rel = rel;
    seg sg;
    if (cv) {
        /* the isochore of the entering volume (a difference within the
         * tolerance only moves the drawn end point) */
        gc__cycle_seg_init(&sg, GC_CURVE_ISOCHORE);
        sg.w = closed ? 0.0 : -R * (T2 - T1);
    } else {
        gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
        sg.w = (closed ? R * (T2 - T1) : 0.0) - R * 0.5 * (T1 + T2) * log(P2 / P1);
    }
    sg.q = (closed ? gc_gas_u_T(g, T2) - in->u_J_per_kg : gc_gas_h_T(g, T2) - in->h_J_per_kg) +
           sg.w;
    if (in->gas != run->states[0].gas) {
        /* fuel in the chain: the exhaust's sensible enthalpy less the intake's
         * and the fuel's (per kg of the gas in the step) */
        double m = in->mass_ratio;
        sg.q = (run->states[0].hs_J_per_kg * run->states[0].mass_ratio + fuel_sensible_in(x, i) -
                m * in->hs_J_per_kg) / m + sg.w;
    }
    int rc = gc__cycle_check_direction(x, i, s->heat_sign, T1, T2);
    if (rc != GC_OK)
        return rc;
    double V2 = x->c->V_start_m_per_s;
    if (!closed) {
        /* Kinetic energy given up by the jet counts as work. The loop's
         * reference is the intake stream (1 kg at the start velocity) plus
         * any fuel at rest relative to the engine, so the m kg leaving
         * return to a kinetic energy of V_start^2/2 per kg of intake, not
         * per kg of exhaust: with fuel the cycle's net work is the jet's
         * (m V1^2 - V0^2)/2, and the loop closes exactly. */
        double V1 = in->V_m_per_s, m = in->mass_ratio;
        sg.dke = 0.5 * V2 * V2 / m - 0.5 * V1 * V1;
        sg.w += -sg.dke;
    }
    return gc__cycle_push(x, i, &sg, T2, P2, V2, field);
}

/* Fuel addition (flow frame). The burner balance is combustion.h's
 * (h_in m_in + h_f m_f - (1 - eta_b) m_f LHV = m_out h_out, absolute
 * enthalpies). The books are on the sensible basis of 298.15 K (cycle.h):
 *   heat     = m_out hs_p(T2) - m_in hs_g(T1) - m_f hs_f(T_f) + dke
 *            = m_f LHV - (1 - eta_b) m_f LHV   (to rounding, by the balance),
 *   heat_in  = heat + burner loss = m_f LHV (298.15 K),
 *   heat_out = burner loss (1 - eta_b) m_f LHV, leaving at the dead state,
 * and the close step of the chain takes back what the fuel's and the intake's
 * sensible enthalpy added (step_close), so energy closes around the loop.
 * Its entropy change includes the fuel, supplied at T_f and at the pressure
 * of the stream it enters (exergy.h, gc_exergy_fuel_s):
 *   dS = m_out s_p(T2, P2) - m_in s_g(T1, P1) - m_f s_f(T_f, P1),
 * so T_dead s_gen is the combustor's exergy destruction. The drawn curve is
 * the products' path from (T1, P1) to (T2, P2), linear in T and ln P (path.h
 * blends the composition change into it); the fuel enters with no velocity
 * of its own (momentum is conserved, V_out = m_in V_in / m_out). */
int gc__cycle_step_fuel(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    const gc_fuel *fu = (const gc_fuel *)s->fuel.fuel;
    if (x->c->frame != GC_FRAME_FLOW)
        return gc_error_set(x->err, GC_ERR_INVALID, field,
                            "fuel addition applies to the flow frame; use air-standard heat "
                            "addition in the closed frame");
    if (fu == NULL)
        return gc_error_set(x->err, GC_ERR_INVALID, field, "fuel addition needs a fuel");
    if (run->n_gases >= GC_CYCLE_MAX_GASES)
        return gc_error_set(x->err, GC_ERR_INVALID, field,
                            "at most %d fuel additions in one chain", GC_CYCLE_MAX_GASES - 1);
    if (g->kind != GC_GAS_MIXTURE)
        return gc_error_set(x->err, GC_ERR_INVALID, "/gas",
                            "fuel addition needs a gas with a composition (air), not the cold "
                            "model");
    double Tf = s->fuel.T_fuel_K > 0.0 ? s->fuel.T_fuel_K : x->c->T_start_K;
    double eta = gc__cycle_step_efficiency(x, s);
    double T1 = in->T_K, P1 = in->P_Pa, m_in = in->mass_ratio;
    gc_burn b;
    int rc;
    if (s->end == GC_END_TEMPERATURE)
        rc = gc_combustion_burn_to_T(fu, Tf, g, T1, 1.0, s->end_value, eta, &b, x->err);
    else
        rc = gc_combustion_burn_far(fu, Tf, g, T1, 1.0, s->fuel.fuel_air_ratio, eta, &b, x->err);
    if (rc != GC_OK)
        return gc__cycle_with_field(x->err, rc, field);
    double hf, sf;
    rc = gc_fuel_h_T(fu, Tf, &hf, x->err);
    if (rc == GC_OK)
        rc = gc_exergy_fuel_s(fu, Tf, P1, &sf, x->err);
    if (rc != GC_OK)
        return gc__cycle_with_field(x->err, rc, field);
    int gi = run->n_gases++;
    run->gases[gi] = b.products;
    const gc_gas *gp = &run->gases[gi];
    x->href[gi] = gc_cycle_h_ref(gp);
    x->href_ok[gi] = 1;
    double T2 = b.T_out_K;
    rc = gc_gas_check_T(gp, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    double m_f = m_in * b.far, m_out = m_in + m_f;
    double P2 = P1 * (1.0 - gc__cycle_step_loss(x, s));
    double Rp = gp->R_J_per_kgK;
    double LHV;
    gc_fuel_heating_values(fu, &LHV, NULL);
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    sg.fuel = 1;
    sg.gas_out = gi;
    sg.m_out = m_out;
    double V_in = in->V_m_per_s, V_out = V_in * m_in / m_out;
    double dke = 0.5 * (m_out * V_out * V_out - m_in * V_in * V_in);
    double hs2 = gc_gas_h_T(gp, T2) - x->href[gi];
    sg.q = m_out * hs2 - m_in * in->hs_J_per_kg - m_f * (hf - fu->h298_J_per_kg) + dke;
    sg.dke = dke;
    sg.q_out = (1.0 - eta) * m_f * LHV;
    sg.q_in = sg.q + sg.q_out;
    sg.dS = m_out * gc_gas_s_TP(gp, T2, P2) - m_in * in->s_J_per_kgK - m_f * sf;
    sg.diss = m_out * Rp * log(P1 / P2) * 0.5 * (T1 + T2);
    sg.eff = eta;
    return gc__cycle_push(x, i, &sg, T2, P2, V_out, field);
}

