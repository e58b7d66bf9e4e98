/*
 * steps_heat.c — the engine's heat-addition and rejection steps: constant
 * volume, constant pressure (and cooling), isothermal, and dual (constant
 * volume to a pressure limit, then constant pressure).
 */
#include "core/engine/cycle_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

int gc__cycle_step_const_volume(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double T2 = gc__cycle_temperature_target(x, i);
    int rc = GC_OK;
    if (s->end == GC_END_HEAT) {
        rc = gc_gas_T_from_u(g, in->u_J_per_kg + s->end_value, &T2, x->err);
        if (rc != GC_OK)
            return gc__cycle_with_field(x->err, rc, field);
    } else if (!(T2 > 0.0)) {
        double pr = gc__cycle_pressure_target(x, i, P1);
        if (!(pr > 0.0) || s->end == GC_END_START_PRESSURE)
            return gc_error_set(x->err, GC_ERR_INVALID, field,
                                "constant-volume heat needs an end temperature, a heat amount, "
                                "a pressure ratio or an end pressure");
        T2 = T1 * pr;
    }
    rc = gc_gas_check_T(g, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    rc = gc__cycle_check_direction(x, i, s->heat_sign, T1, T2);
    if (rc != GC_OK)
        return rc;
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_ISOCHORE);
    double P2 = R * T2 / v1;
    sg.q = (gc_gas_h_T(g, T2) - R * T2) - in->u_J_per_kg;
    sg.w = (x->c->frame == GC_FRAME_CLOSED) ? 0.0 : -v1 * (P2 - P1);
    return gc__cycle_push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

/* CONST_PRESSURE and COOLING. */
int gc__cycle_step_const_pressure(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double loss = gc__cycle_step_loss(x, s);
    double P2 = P1 * (1.0 - loss);
    double T2 = gc__cycle_temperature_target(x, i);
    int rc;
    if (s->kind == GC_PROC_COOLING && !(T2 > 0.0))
        return gc_error_set(x->err, GC_ERR_INVALID, field, "cooling needs an end temperature");
    if (s->end == GC_END_HEAT) {
        rc = gc_gas_T_from_h(g, in->h_J_per_kg + s->end_value, &T2, x->err);
        if (rc != GC_OK)
            return gc__cycle_with_field(x->err, rc, field);
    } else if (!(T2 > 0.0)) {
        double r = gc__cycle_volume_target(x, i, v1);
        if (!(r > 0.0))
            return gc_error_set(x->err, GC_ERR_INVALID, field,
                                "constant-pressure heat needs an end temperature, a heat amount "
                                "or a volume ratio");
        T2 = T1 * r * (P2 / P1);
    }
    rc = gc_gas_check_T(g, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    rc = gc__cycle_check_direction(x, i, s->kind == GC_PROC_COOLING ? -1 : s->heat_sign, T1, T2);
    if (rc != GC_OK)
        return rc;
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    sg.q = gc_gas_h_T(g, T2) - in->h_J_per_kg;
    sg.w = closed ? R * (T2 - T1) : 0.0;
    sg.diss = R * log(P1 / P2) * 0.5 * (T1 + T2); /* +0 without a loss, never -0 */
    return gc__cycle_push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

int gc__cycle_step_isothermal(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double P2;
    double r = gc__cycle_volume_target(x, i, v1);
    double pr = gc__cycle_pressure_target(x, i, P1);
    if (s->end == GC_END_HEAT)
        r = exp(s->end_value / (R * T1));
    if (r > 0.0 && isfinite(r))
        P2 = P1 / r;
    else if (pr > 0.0)
        P2 = P1 * pr;
    else
        return gc_error_set(x->err, GC_ERR_INVALID, field,
                            "isothermal heat needs a volume ratio, a pressure ratio, an end "
                            "pressure or a heat amount");
    if (!(P2 > 0.0) || !isfinite(P2))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                            "the isothermal step would end at an unusable pressure");
    if ((s->heat_sign > 0 && gc__cycle_below(P1, P2)) || (s->heat_sign < 0 && gc__cycle_below(P2, P1)))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                            "isothermal heat %s needs an %s",
                            s->heat_sign > 0 ? "addition" : "rejection",
                            s->heat_sign > 0 ? "expansion" : "compression");
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    sg.w = R * T1 * log(P1 / P2);
    sg.q = sg.w;
    return gc__cycle_push(x, i, &sg, T1, P2, in->V_m_per_s, field);
}

/* A dual step's constant-volume limit: Pcv and whether it is exact (a
 * pressure ratio) or a limit. */
static int dual_limit(ctx *x, int i, double P1, double *Pcv, int *exact)
{
    const gc_step *s = &x->c->steps[i];
    const char *afield = gc__cycle_aux_field(x, i);
    if (s->end2 == GC_END_PRESSURE_RATIO) {
        *exact = 1;
        *Pcv = P1 * s->end2_value;
    } else if (s->end2 == GC_END_PEAK_PRESSURE || s->end2 == GC_END_PRESSURE) {
        *exact = 0;
        *Pcv = s->end2_value;
    } else {
        return gc_error_set(x->err, GC_ERR_INVALID, afield,
                            "dual heat addition needs the constant-volume part's pressure ratio "
                            "or peak pressure");
    }
    if (!(*Pcv > 0.0) || !isfinite(*Pcv))
        return gc_error_set(x->err, GC_ERR_INVALID, afield, "must be a positive number");
    if (gc__cycle_below(*Pcv, P1))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, afield,
                            "the pressure limit (%.6g Pa) is below the pressure at the start of "
                            "heat addition (%.6g Pa)", *Pcv, P1);
    return GC_OK;
}

/* A dual step's end temperature T3 (and Tx, the constant-volume end, when the
 * end comes before the limit). */
static int dual_end(ctx *x, int i, const gc_cycle_state *in, int exact, double *Tx, double *T3)
{
    const gc_step *s = &x->c->steps[i];
    const gc_gas *g = &x->run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int rc;
    if (s->end == GC_END_TEMPERATURE || s->end == GC_END_START_TEMPERATURE) {
        *T3 = gc__cycle_temperature_target(x, i);
        rc = gc_gas_check_T(g, *T3, field, x->err);
        if (rc != GC_OK)
            return rc;
        if (gc__cycle_below(*T3, *Tx)) {
            if (exact || gc__cycle_below(*T3, in->T_K))
                return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                                    "the end temperature (%.6g K) is below the temperature at "
                                    "the end of constant-volume heating (%.6g K)", *T3, *Tx);
            *Tx = *T3;
        }
        return GC_OK;
    }
    if (s->end == GC_END_HEAT) {
        double qcv = (gc_gas_h_T(g, *Tx) - g->R_J_per_kgK * *Tx) - in->u_J_per_kg;
        if (s->end_value < qcv) {
            if (exact || s->end_value < 0.0)
                return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                                    "the heat (%.6g J/kg) is less than the constant-volume part "
                                    "needs to reach its pressure (%.6g J/kg)", s->end_value, qcv);
            rc = gc_gas_T_from_u(g, in->u_J_per_kg + s->end_value, Tx, x->err);
            *T3 = *Tx;
        } else {
            rc = gc_gas_T_from_h(g, gc_gas_h_T(g, *Tx) + (s->end_value - qcv), T3, x->err);
        }
        return rc == GC_OK ? GC_OK : gc__cycle_with_field(x->err, rc, field);
    }
    if (s->end == GC_END_VOLUME_RATIO) {
        if (s->end_value < 1.0)
            return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                                "the cutoff ratio of constant-pressure heating must be at least 1");
        *T3 = *Tx * s->end_value;
        return gc_gas_check_T(g, *T3, field, x->err);
    }
    return gc_error_set(x->err, GC_ERR_INVALID, field,
                        "dual heat addition ends on a temperature, a heat amount or a cutoff "
                        "ratio");
}

int gc__cycle_step_dual(ctx *x, int i)
{
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    int exact = 0;
    double Pcv = 0.0;
    int rc = dual_limit(x, i, P1, &Pcv, &exact);
    if (rc != GC_OK)
        return rc;
    double Tx = T1 * Pcv / P1;
    rc = gc_gas_check_T(g, Tx, gc__cycle_aux_field(x, i), x->err);
    if (rc != GC_OK)
        return rc;
    double T3;
    rc = dual_end(x, i, in, exact, &Tx, &T3);
    if (rc != GC_OK)
        return rc;
    seg sg;
    gc__cycle_seg_init(&sg, GC_CURVE_ISOCHORE);
    double P2 = R * Tx / v1;
    sg.q = (gc_gas_h_T(g, Tx) - R * Tx) - in->u_J_per_kg;
    sg.w = closed ? 0.0 : -v1 * (P2 - P1);
    rc = gc__cycle_push(x, i, &sg, Tx, P2, in->V_m_per_s, field);
    if (rc != GC_OK)
        return rc;
    const gc_cycle_state *mid = &run->states[run->n_states - 1];
    gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    sg.part = 1;
    sg.q = gc_gas_h_T(g, T3) - mid->h_J_per_kg;
    sg.w = closed ? R * (T3 - Tx) : 0.0;
    return gc__cycle_push(x, i, &sg, T3, mid->P_Pa, mid->V_m_per_s, field);
}

