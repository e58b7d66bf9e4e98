/*
 * cycle_state.c — the engine's states and the helpers every step uses: a
 * step's field for errors, its efficiency and pressure loss, the
 * property helpers (phi = s0 - R ln T, the T of a given s0 + c, f = u or h),
 * fill_state (a state from T, P and velocity on the run's books) and push
 * (the state and process record a step appends), and the end targets.
 */
#include "core/engine/cycle_internal.h"
#include "gascycle/strbuf.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

const char *gc__cycle_step_field(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    if (s->field[0])
        return s->field;
    if (i < 0) {
        snprintf(x->fbuf, sizeof x->fbuf, "/steps/%d", i);
        return x->fbuf;
    }
    /* "/steps/<i>", the text snprintf("/steps/%d") writes, without printf */
    char digits[12];
    int nd = (int)sizeof digits;
    unsigned u = (unsigned)i;
    do {
        digits[--nd] = (char)('0' + u % 10u);
        u /= 10u;
    } while (u > 0u);
    size_t k = sizeof "/steps/" - 1;
    memcpy(x->fbuf, "/steps/", k);
    memcpy(x->fbuf + k, digits + nd, sizeof digits - (size_t)nd);
    x->fbuf[k + sizeof digits - (size_t)nd] = '\0';
    return x->fbuf;
}

const char *gc__cycle_aux_field(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    return s->field_aux[0] ? s->field_aux : gc__cycle_step_field(x, i);
}

/* Replaces the field a gas.h solver put into err by the step's field. */
int gc__cycle_with_field(gc_error *err, int rc, const char *field)
{
    if (rc != GC_OK && err != NULL)
        gc_text_copy(err->field, sizeof err->field, field);
    return rc;
}

double gc__cycle_step_efficiency(const ctx *x, const gc_step *s)
{
    (void)x;
    return (s->efficiency == 0.0) ? 1.0 : s->efficiency;
}

double gc__cycle_step_loss(const ctx *x, const gc_step *s)
{
    (void)x;
    switch (s->kind) {
    case GC_PROC_PRESSURE_LOSS:
        if (s->end == GC_END_PRESSURE_RATIO)
            return 1.0 - s->end_value;
        return s->pressure_loss;
    case GC_PROC_CONST_PRESSURE:
    case GC_PROC_COOLING:
    case GC_PROC_HEAT_EXCHANGE:
    case GC_PROC_FUEL:
        return s->pressure_loss;
    default:
        return 0.0;
    }
}

/* ---- small property helpers -------------------------------------------- */

double gc__cycle_phi_T(const gc_gas *g, double T)
{
    return gc_gas_s0_T(g, T) - g->R_J_per_kgK * log(T);
}

/* Solves s0(T) + c ln T = target for T (monotone: d/dT = (cp + c)/T > 0 for
 * c > -cp; the callers use c = 0, -R, or R/a - R). Newton with bisection
 * safeguard inside the gas's validity range. */
int gc__cycle_solve_s0c(const gc_gas *g, double c, double target, double T_guess,
                        double *T_out, const char *field, gc_error *err)
{
    double lo = g->T_min_K, hi = g->T_max_K;
    double T = T_guess;
    if (!(T > lo && T < hi))
        T = 0.5 * (lo + hi);
    for (int it = 0; it < 100; it++) {
        double f = gc_gas_s0_T(g, T) + c * log(T) - target;
        if (f > 0.0)
            hi = T;
        else
            lo = T;
        double d = (gc_gas_cp_T(g, T) + c) / T;
        double Tn = (d > 0.0) ? T - f / d : 0.5 * (lo + hi);
        if (!(Tn > lo && Tn < hi))
            Tn = 0.5 * (lo + hi);
        if (fabs(Tn - T) <= 1e-13 * T || hi - lo <= 1e-13 * T) {
            *T_out = Tn;
            return gc_gas_check_T(g, Tn, field, err);
        }
        T = Tn;
    }
    /* no convergence: the target is probably outside the data range */
    double flo = gc_gas_s0_T(g, g->T_min_K) + c * log(g->T_min_K) - target;
    double fhi = gc_gas_s0_T(g, g->T_max_K) + c * log(g->T_max_K) - target;
    if (flo > 0.0 || fhi < 0.0)
        return gc_error_set(err, GC_ERR_RANGE, field,
                            "the end temperature falls outside the gas data range %.0f to %.0f K",
                            g->T_min_K, g->T_max_K);
    return gc_error_set(err, GC_ERR_NOCONV, field,
                        "the end temperature of a polytropic-efficiency step did not converge");
}

/* T from f = u (closed) or h; T_guess is a nearby temperature (the solve's
 * starting point, 0: none). */
int gc__cycle_T_from_f(const gc_gas *g, int closed, double f, double T_guess, double *T,
                       const char *field, gc_error *err)
{
    int rc = closed ? gc_gas_T_from_u_guess(g, f, T_guess, T, err)
                    : gc_gas_T_from_h_guess(g, f, T_guess, T, err);
    return gc__cycle_with_field(err, rc, field);
}

double gc__cycle_f_T(const gc_gas *g, int closed, double T)
{
    double h = gc_gas_h_T(g, T);
    return closed ? h - g->R_J_per_kgK * T : h;
}

/* ---- states and processes ----------------------------------------------- */

/* Enthalpy of the gas at 298.15 K on the absolute basis, J/kg: the zero of
 * the sensible basis. For a mixture the sum of its species' formation
 * enthalpies (species.h, gc_species_h298_molar: the values the heating
 * values of combustion.h use, so a burner's sensible books give exactly
 * m_fuel LHV); for the cold model cp 298.15 K. */
double gc_cycle_h_ref(const gc_gas *g)
{
    if (g->kind == GC_GAS_COLD)
        return g->cp_cold_J_per_kgK * GC_T_REF_K;
    double h = 0.0;
    for (int j = 0; j < g->n_species; j++)
        h += g->x[j] * gc_species_h298_molar(gc_species_get(g->species[j]));
    return h / g->M_kg_per_mol;
}

int gc__cycle_fill_state(ctx *x, gc_cycle_state *st, int gas, double T, double P,
                         double V, double m, int step, const char *field)
{
    const gc_gas *g = &x->run->gases[gas];
    int rc = gc_gas_check_T(g, T, field, x->err);
    if (rc != GC_OK)
        return rc;
    if (!(P > 0.0) || !isfinite(P))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                            "the step would end at a pressure that is not positive");
    double R = g->R_J_per_kgK;
    st->T_K = T;
    st->P_Pa = P;
    st->v_m3_per_kg = R * T / P;
    st->h_J_per_kg = gc_gas_h_T(g, T);
    st->u_J_per_kg = st->h_J_per_kg - R * T;
    if (!x->href_ok[gas]) {
        x->href[gas] = gc_cycle_h_ref(g);
        x->href_ok[gas] = 1;
    }
    st->hs_J_per_kg = st->h_J_per_kg - x->href[gas];
    st->us_J_per_kg = st->hs_J_per_kg - R * (T - GC_T_REF_K);
    st->s_J_per_kgK = gc_gas_s_TP(g, T, P);
    st->V_m_per_s = V;
    st->mass_ratio = m;
    st->gas = gas;
    st->step = step;
    st->T_total_K = T;
    st->P_total_Pa = P;
    if (V != 0.0) {
        double Tt;
        rc = gc_gas_T_from_h(g, st->h_J_per_kg + 0.5 * V * V, &Tt, x->err);
        if (rc != GC_OK)
            return gc__cycle_with_field(x->err, rc, field);
        st->T_total_K = Tt;
        st->P_total_Pa = P * exp((gc_gas_s0_T(g, Tt) - gc_gas_s0_T(g, T)) / R);
    }
    return GC_OK;
}

int gc__cycle_push(ctx *x, int step, const seg *sg, double T, double P, double V,
                   const char *field)
{
    gc_cycle_run *run = x->run;
    if (run->n_states >= GC_CYCLE_MAX_STATES || run->n_processes >= GC_CYCLE_MAX_PROCESSES)
        return gc_error_set(x->err, GC_ERR_INVALID, "/steps", "too many processes in the chain");
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    gc_cycle_state *out = &run->states[run->n_states];
    int gas_out = sg->fuel ? sg->gas_out : in->gas;
    double m_out = sg->fuel ? sg->m_out : in->mass_ratio;
    int rc = gc__cycle_fill_state(x, out, gas_out, T, P, V, m_out, step, field);
    if (rc != GC_OK)
        return rc;
    /* per-intake figures: specific value times the mass through the step */
    double m = sg->fuel ? 1.0 : in->mass_ratio;
    gc_cycle_process *p = &run->processes[run->n_processes];
    p->step = step;
    p->part = sg->part;
    p->kind = x->c->steps[step].kind;
    p->from = run->n_states - 1;
    p->to = run->n_states;
    p->gas = gas_out;
    p->mass_ratio = m_out;
    p->work = m * sg->w;
    p->heat = m * sg->q;
    p->internal = sg->internal;
    p->heat_in = (!sg->internal && sg->q > 0.0) ? m * sg->q : 0.0;
    p->heat_out = (!sg->internal && sg->q < 0.0) ? -m * sg->q : 0.0;
    p->delta_ke = m * sg->dke;
    p->delta_s = sg->fuel ? sg->dS : m * (out->s_J_per_kgK - in->s_J_per_kgK);
    if (sg->fuel) {
        p->heat_in = sg->q_in;
        p->heat_out = sg->q_out;
    }
    p->dissipated = m * sg->diss;
    p->efficiency = sg->eff;
    p->polytropic_efficiency = sg->eff_p;
    p->curve = sg->curve;
    p->curve_a = sg->a;
    p->s_gen = 0.0;
    p->exergy_destroyed = 0.0;
    p->T_boundary_K = 0.0;
    run->n_states++;
    run->n_processes++;
    return GC_OK;
}

void gc__cycle_seg_init(seg *sg, int curve)
{
    memset(sg, 0, sizeof *sg);
    sg->curve = curve;
    sg->a = 1.0;
    sg->eff = 1.0;
    sg->eff_p = 1.0;
}

/* Relative comparison helper for direction checks (tolerates rounding). */
int gc__cycle_check_direction(ctx *x, int i, int sign, double T1, double T2)
{
    const gc_step *s = &x->c->steps[i];
    if (sign > 0 && gc__cycle_below(T2, T1))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, gc__cycle_step_field(x, i),
                            "heat addition (%s) would end at %.6g K, below the temperature "
                            "at its start (%.6g K)", gc_cycle_kind_name(s->kind), T2, T1);
    if (sign < 0 && gc__cycle_below(T1, T2))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, gc__cycle_step_field(x, i),
                            "heat rejection (%s) would end at %.6g K, above the temperature "
                            "at its start (%.6g K)", gc_cycle_kind_name(s->kind), T2, T1);
    return GC_OK;
}

/* Pressure-ratio target of an end condition (PRESSURE_RATIO, PRESSURE,
 * PEAK_PRESSURE, START_PRESSURE); 0 if the end is not a pressure end. */
double gc__cycle_pressure_target(ctx *x, int i, double P1)
{
    const gc_step *s = &x->c->steps[i];
    switch (s->end) {
    case GC_END_PRESSURE_RATIO: return s->end_value;
    case GC_END_PRESSURE:
    case GC_END_PEAK_PRESSURE: return s->end_value / P1;
    case GC_END_START_PRESSURE: return x->c->P_start_Pa / x->loss_after[i] / P1;
    default: return 0.0;
    }
}

double gc__cycle_volume_target(ctx *x, int i, double v1)
{
    const gc_step *s = &x->c->steps[i];
    if (s->end == GC_END_VOLUME_RATIO)
        return s->end_value;
    if (s->end == GC_END_START_VOLUME)
        return x->run->states[0].v_m3_per_kg / v1;
    return 0.0;
}

double gc__cycle_temperature_target(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    if (s->end == GC_END_TEMPERATURE)
        return s->end_value;
    if (s->end == GC_END_START_TEMPERATURE)
        return x->c->T_start_K;
    return 0.0;
}

