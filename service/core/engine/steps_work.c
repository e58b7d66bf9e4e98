/*
 * steps_work.c — the adiabatic steps of the cycle engine: isentropic,
 * compression and expansion (an isentropic or polytropic efficiency, to a
 * volume ratio, pressure ratio, pressure or temperature) and the polytrope
 * P v^n = const. Models in cycle.c's header.
 */
#include "core/engine/cycle_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* ---- process kinds -------------------------------------------------------- */

/* An adiabatic step's inputs, shared by the parts of step_adiabatic. */
typedef struct adia {
    ctx *x;
    const gc_step *s;
    const gc_gas *g;
    const char *field;
    int closed, comp;
    double R, T1, P1, v1, V1, f1, eta;
    double r, pr, Tt;           /* the end: volume ratio, pressure ratio or temperature */
} adia;

/* Isentropic (or isentropic-efficiency) end: T2, P2 and the isentropic T2s. */
static int adia_isentropic(const adia *a, double *T2, double *P2, double *T2s)
{
    const gc_gas *g = a->g;
    int rc = GC_OK;
    if (a->r > 0.0)
        rc = gc_gas_T_isentropic_v(g, a->T1, a->r, T2s, a->x->err);
    else if (a->pr > 0.0)
        rc = gc_gas_T_isentropic_P(g, a->T1, a->pr, T2s, a->x->err);
    if (rc != GC_OK)
        return gc__cycle_with_field(a->x->err, rc, a->field);
    if (a->r > 0.0 || a->pr > 0.0) {
        if (a->eta == 1.0) {
            *T2 = *T2s;
        } else {
            double f2s = gc__cycle_f_T(g, a->closed, *T2s);
            double f2 = a->comp ? a->f1 + (f2s - a->f1) / a->eta : a->f1 - a->eta * (a->f1 - f2s);
            double Tg = a->comp ? a->T1 + (*T2s - a->T1) / a->eta
                                : a->T1 - a->eta * (a->T1 - *T2s);
            rc = gc__cycle_T_from_f(g, a->closed, f2, Tg, T2, a->field, a->x->err);
            if (rc != GC_OK)
                return rc;
        }
        *P2 = a->r > 0.0 ? a->R * *T2 / (a->v1 * a->r) : a->P1 * a->pr;
        return GC_OK;
    }
    /* end temperature: find the isentropic reference, then the pressure */
    *T2 = a->Tt;
    rc = gc_gas_check_T(g, *T2, a->field, a->x->err);
    if (rc != GC_OK)
        return rc;
    if (a->eta == 1.0) {
        *T2s = *T2;
    } else {
        double f2 = gc__cycle_f_T(g, a->closed, *T2);
        double f2s = a->comp ? a->f1 + a->eta * (f2 - a->f1) : a->f1 - (a->f1 - f2) / a->eta;
        double Tg = a->comp ? a->T1 + a->eta * (*T2 - a->T1) : a->T1 - (a->T1 - *T2) / a->eta;
        rc = gc__cycle_T_from_f(g, a->closed, f2s, Tg, T2s, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
    }
    if (a->closed) {
        double lnr = -(gc__cycle_phi_T(g, *T2s) - gc__cycle_phi_T(g, a->T1)) / a->R;
        *P2 = a->R * *T2 / (a->v1 * exp(lnr));
    } else {
        *P2 = a->P1 * exp((gc_gas_s0_T(g, *T2s) - gc_gas_s0_T(g, a->T1)) / a->R);
    }
    return GC_OK;
}

/* Constant polytropic efficiency: pe = eta_p (compression), 1/eta_p (expansion). */
static int adia_polytropic(const adia *a, double *T2, double *P2, double *T2s)
{
    const gc_gas *g = a->g;
    const double R = a->R, T1 = a->T1, pe = a->comp ? a->eta : 1.0 / a->eta;
    int rc;
    if (a->Tt > 0.0) {
        *T2 = a->Tt;
        rc = gc_gas_check_T(g, *T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        if (a->closed)
            *P2 = R * *T2 / (a->v1 * exp(-pe * (gc__cycle_phi_T(g, *T2) - gc__cycle_phi_T(g, T1)) / R));
        else
            *P2 = a->P1 * exp(pe * (gc_gas_s0_T(g, *T2) - gc_gas_s0_T(g, T1)) / R);
    } else if (a->closed && a->r > 0.0) {
        rc = gc__cycle_solve_s0c(g, -R, gc__cycle_phi_T(g, T1) - (R / pe) * log(a->r),
                       T1 * pow(a->r, -R / (pe * gc_gas_cv_T(g, T1))), T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        *P2 = R * *T2 / (a->v1 * a->r);
    } else if (a->closed) {
        double c = R / pe - R;
        double target = gc_gas_s0_T(g, T1) + c * log(T1) + (R / pe) * log(a->pr);
        rc = gc__cycle_solve_s0c(g, c, target, T1 * pow(a->pr, 0.28), T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        *P2 = a->P1 * a->pr;
    } else {
        rc = gc__cycle_solve_s0c(g, 0.0, gc_gas_s0_T(g, T1) + (R / pe) * log(a->pr),
                       T1 * pow(a->pr, 0.28), T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        *P2 = a->P1 * a->pr;
    }
    /* equivalent isentropic reference at the same end (for the reported efficiency) */
    if (a->closed)
        rc = gc_gas_T_isentropic_v(g, T1, (R * *T2 / *P2) / a->v1, T2s, a->x->err);
    else
        rc = gc_gas_T_isentropic_P(g, T1, *P2 / a->P1, T2s, a->x->err);
    return rc == GC_OK ? GC_OK : gc__cycle_with_field(a->x->err, rc, a->field);
}

/* The segment of an adiabatic step from (T1) to (T2, P2) and the state pushed. */
static int adia_push(const adia *a, int i, double T2, double P2, double T2s, int kinetic)
{
    const gc_gas *g = a->g;
    const gc_step *s = a->s;
    seg sg;
    gc__cycle_seg_init(&sg, a->closed ? GC_CURVE_EFF_V : GC_CURVE_EFF_P);
    double f1 = a->f1, f2 = gc__cycle_f_T(g, a->closed, T2);
    if (s->kind != GC_PROC_ISENTROPIC && T2 != a->T1) {
        double v2 = a->R * T2 / P2;
        double den = a->closed ? (gc__cycle_phi_T(g, T2) - gc__cycle_phi_T(g, a->T1))
                               : (gc_gas_s0_T(g, T2) - gc_gas_s0_T(g, a->T1));
        double num = a->closed ? -a->R * log(v2 / a->v1) : a->R * log(P2 / a->P1);
        if (den != 0.0 && num / den > 0.0)
            sg.a = num / den;
    }
    sg.diss = sg.a == 1.0 ? 0.0 : (1.0 - sg.a) * (f2 - f1); /* +0 when reversible, never -0 */
    if (s->kind != GC_PROC_ISENTROPIC) {
        double f2s = gc__cycle_f_T(g, a->closed, T2s);
        if (f2 != f1)
            sg.eff = a->comp ? (f2s - f1) / (f2 - f1) : (f1 - f2) / (f1 - f2s);
        sg.eff_p = a->comp ? sg.a : 1.0 / sg.a;
    }
    double V1 = a->V1, V2 = V1;
    if (kinetic) {
        double ke2 = 0.5 * V1 * V1 + (f1 - f2);
        /* a diffuser that ends at rest may land a rounding error below 0 */
        if (ke2 < 0.0 && ke2 > -1e-9 * (fabs(f1) + 0.5 * V1 * V1))
            ke2 = 0.0;
        if (ke2 < 0.0)
            return gc_error_set(a->x->err, GC_ERR_INFEASIBLE, a->field,
                                "the kinetic energy of the stream is not enough for this "
                                "compression");
        V2 = (s->end == GC_END_VELOCITY) ? s->end_value : sqrt(2.0 * ke2);
        sg.dke = f1 - f2;
        sg.w = 0.0;
    } else {
        sg.w = f1 - f2;
    }
    sg.q = 0.0;
    return gc__cycle_push(a->x, i, &sg, T2, P2, V2, a->field);
}

/* The end of an adiabatic step (its target) and its direction checked. */
static int adia_target(adia *a, int i, int kinetic, const gc_cycle_state *in)
{
    const gc_step *s = a->s;
    int expn = (s->kind == GC_PROC_EXPANSION);
    a->r = gc__cycle_volume_target(a->x, i, a->v1);
    a->pr = gc__cycle_pressure_target(a->x, i, a->P1);
    a->Tt = gc__cycle_temperature_target(a->x, i);
    if (s->end == GC_END_VELOCITY) {
        if (!kinetic)
            return gc_error_set(a->x->err, GC_ERR_INVALID, a->field,
                                "a velocity end applies to a kinetic step (nozzle or diffuser) "
                                "in the flow frame");
        double dh = 0.5 * (a->V1 * a->V1 - s->end_value * s->end_value);
        int rc = gc_gas_T_from_h(a->g, in->h_J_per_kg + dh, &a->Tt, a->x->err);
        if (rc != GC_OK)
            return gc__cycle_with_field(a->x->err, rc, a->field);
    }
    if (a->r > 0.0 && !a->closed && s->kind != GC_PROC_ISENTROPIC)
        return gc_error_set(a->x->err, GC_ERR_INVALID, a->field,
                            "a volume-ratio end applies to compression or expansion in the "
                            "closed frame; use a pressure ratio in the flow frame");
    if (!(a->r > 0.0) && !(a->pr > 0.0) && !(a->Tt > 0.0))
        return gc_error_set(a->x->err, GC_ERR_INVALID, a->field,
                            "%s needs a volume ratio, a pressure ratio, an end pressure or an "
                            "end temperature", gc_cycle_kind_name(s->kind));
    /* direction */
    int up = (a->r > 0.0) ? (a->r < 1.0) : (a->pr > 0.0) ? (a->pr > 1.0) : (a->Tt > a->T1);
    int flat = (a->r > 0.0) ? (a->r == 1.0) : (a->pr > 0.0) ? (a->pr == 1.0) : (a->Tt == a->T1);
    if (!flat && ((a->comp && !up) || (expn && up)))
        return gc_error_set(a->x->err, GC_ERR_INFEASIBLE, a->field,
                            "%s would %s the gas: check the ratio or end value",
                            a->comp ? "compression" : "expansion",
                            a->comp ? "expand" : "compress");
    if (!a->comp && !expn)
        a->comp = up; /* isentropic: efficiency 1, the direction only matters for a */
    return GC_OK;
}

/* ISENTROPIC, COMPRESSION, EXPANSION (optionally kinetic). */
int gc__cycle_step_adiabatic(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    adia a;
    a.x = x;
    a.s = s;
    a.g = &run->gases[in->gas];
    a.field = gc__cycle_step_field(x, i);
    a.closed = (x->c->frame == GC_FRAME_CLOSED);
    int kinetic = s->kinetic && !a.closed;
    a.R = a.g->R_J_per_kgK;
    a.T1 = in->T_K;
    a.P1 = in->P_Pa;
    a.v1 = in->v_m3_per_kg;
    a.V1 = in->V_m_per_s;
    a.f1 = a.closed ? in->u_J_per_kg : in->h_J_per_kg;
    a.eta = (s->kind == GC_PROC_ISENTROPIC) ? 1.0 : gc__cycle_step_efficiency(x, s);
    int polyeff = (s->kind != GC_PROC_ISENTROPIC) && s->polytropic_efficiency && a.eta < 1.0;
    a.comp = (s->kind == GC_PROC_COMPRESSION);
    int rc = adia_target(&a, i, kinetic, in);
    if (rc != GC_OK)
        return rc;
    double T2 = 0.0, P2 = 0.0, T2s = 0.0;
    rc = polyeff ? adia_polytropic(&a, &T2, &P2, &T2s) : adia_isentropic(&a, &T2, &P2, &T2s);
    if (rc != GC_OK)
        return rc;
    rc = gc_gas_check_T(a.g, T2, a.field, x->err);
    if (rc != GC_OK)
        return rc;
    return adia_push(&a, i, T2, P2, T2s, kinetic);
}

int gc__cycle_step_polytropic(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = gc__cycle_step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, n = s->n;
    double T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double T2, P2;
    if (!(n >= 0.0) || !isfinite(n))
        return gc_error_set(x->err, GC_ERR_INVALID, gc__cycle_aux_field(x, i),
                            "the polytropic exponent must be a finite number >= 0");
    int iso = fabs(n - 1.0) < 1e-12;
    double r = gc__cycle_volume_target(x, i, v1);
    double pr = gc__cycle_pressure_target(x, i, P1);
    double Tt = gc__cycle_temperature_target(x, i);
    if (r > 0.0) {
        T2 = iso ? T1 : T1 * pow(r, 1.0 - n);
        P2 = P1 * pow(r, -n);
    } else if (pr > 0.0) {
        if (n == 0.0) {
            if (pr != 1.0)
                return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                                    "a polytrope with n = 0 is an isobar: its pressure cannot change");
            T2 = T1;
        } else {
            T2 = iso ? T1 : T1 * pow(pr, (n - 1.0) / n);
        }
        P2 = P1 * pr;
    } else if (Tt > 0.0) {
        if (iso)
            return gc_error_set(x->err, GC_ERR_INVALID, field,
                                "an isothermal polytrope (n = 1) cannot end on a temperature");
        T2 = Tt;
        P2 = P1 * pow(T2 / T1, n / (n - 1.0));
    } else {
        return gc_error_set(x->err, GC_ERR_INVALID, field,
                            "a polytropic step needs a volume ratio, a pressure ratio, an end "
                            "pressure or an end temperature");
    }
    int rc = gc_gas_check_T(g, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    seg sg;
    if (iso || n == 0.0) {
        gc__cycle_seg_init(&sg, GC_CURVE_LINEAR);
    } else {
        gc__cycle_seg_init(&sg, GC_CURVE_POLY_N);
        sg.a = n;
    }
    double w;
    if (iso)
        w = R * T1 * log(P1 / P2);
    else
        w = (closed ? 1.0 : n) * R * (T2 - T1) / (1.0 - n);
    double df = gc__cycle_f_T(g, closed, T2) - gc__cycle_f_T(g, closed, T1);
    sg.w = w;
    sg.q = df + w;
    return gc__cycle_push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

