/*
 * cycle.c — the cycle engine declared in gascycle/cycle.h: evaluates an
 * ordered chain of processes in the closed or the steady-flow frame with any
 * gas model of gas.h, iterates heat exchangers between stations to
 * convergence, books work, heat, entropy generation and exergy per process,
 * sums the cycle up, evaluates the ideal counterpart and runs the built-in
 * checks (the area checks live in path.c).
 *
 * Models (ideal gas, any cp(T)):
 *   isentrope          s0(T2) - s0(T1) = R ln(P2/P1)   (gas.h solvers)
 *   isentropic eff.    compression f2 = f1 + (f2s - f1)/eta, expansion
 *                      f2 = f1 - eta (f1 - f2s), f = u (closed) or h (flow)
 *   polytropic eff.    flow: dh = v dP / eta_p (compression), dh = eta_p v dP
 *                      (expansion), i.e. s0(T2) - s0(T1) = (R/a) ln(P2/P1) with
 *                      a = eta_p or 1/eta_p; closed: du = -P dv / eta_p or
 *                      du = -eta_p P dv, i.e. phi(T2) - phi(T1) = -(R/a) ln(v2/v1)
 *                      with phi = s0 - R ln T (the integral of cv dT / T)
 *   polytrope          P v^n = const: T2/T1 = (P2/P1)^((n-1)/n),
 *                      closed w = R (T2 - T1)/(1 - n), flow w = n R (T2 - T1)/(1 - n)
 *   throttle           ideal gas at constant h: constant T
 * These are the standard ideal-gas relations of engineering thermodynamics;
 * the polytropic-efficiency forms integrate the small-stage definition
 * exactly with variable cp.
 *
 * Dissipated work (the term that makes the area balance of an irreversible
 * cycle): along the drawn curve of constant polytropic efficiency the gas is
 * adiabatic, so T ds = T ds_gen = (1 - a) cp dT (flow) or (1 - a) cv dT
 * (closed), integrating to (1 - a) dh or (1 - a) du exactly; a throttle
 * dissipates R T ln(P1/P2); a heat exchange with pressure loss along the
 * curve linear in T and ln P dissipates -R ln(P2/P1) (T1 + T2)/2.
 *
 * Books with a fuel (cycle.h): states carry absolute and sensible enthalpy;
 * a fuel step books m_fuel LHV (298.15 K) as heat in and the burner loss as
 * heat out, its entropy change includes the fuel's own entropy (exergy.h),
 * and the close step rejects the exhaust's sensible enthalpy less the
 * intake's and the fuel's, so heat and exergy balances close on one
 * reference. The second law follows the exergy models of cycle.h; s_gen
 * rounding is reported as 0 (GC_CYCLE_TOL_SGEN). The ideal counterpart is
 * built by idealize() and evaluated by the same run_chain.
 */
#include "gascycle/cycle.h"
#include "gascycle/combustion.h"
#include "gascycle/exergy.h"
#include "gascycle/path.h"
#include "gascycle/species.h"

#include <ctype.h>
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

/* ---- names ------------------------------------------------------------- */

static const char *const kind_names[GC_PROC_KIND_COUNT] = {
    "isentropic", "polytropic", "compression", "expansion", "constant_volume",
    "constant_pressure", "isothermal", "dual", "pressure_loss", "heat_exchange",
    "cooling", "fuel_addition", "close"};

static const char *const end_names[GC_END_KIND_COUNT] = {
    "default", "volume_ratio", "pressure_ratio", "temperature", "pressure", "heat",
    "peak_pressure", "start_temperature", "start_volume", "start_pressure", "velocity"};

static const char *const curve_names[] = {
    "polytropic_efficiency_flow", "polytropic_efficiency_closed", "polytrope",
    "isochore", "linear_T_lnP"};

const char *gc_cycle_kind_name(int kind)
{
    return (kind >= 0 && kind < GC_PROC_KIND_COUNT) ? kind_names[kind] : "unknown";
}

const char *gc_cycle_end_name(int end)
{
    return (end >= 0 && end < GC_END_KIND_COUNT) ? end_names[end] : "unknown";
}

const char *gc_cycle_curve_name(int curve)
{
    return (curve >= 0 && curve <= GC_CURVE_LINEAR) ? curve_names[curve] : "unknown";
}

/* ---- building ---------------------------------------------------------- */

void gc_cycle_init(gc_cycle *c, gc_frame frame, const gc_gas *gas,
                   double T_start_K, double P_start_Pa)
{
    c->frame = frame;
    c->gas = *gas;
    c->T_start_K = T_start_K;
    c->P_start_Pa = P_start_Pa;
    c->V_start_m_per_s = 0.0;
    c->T_dead_K = 0.0;
    c->P_dead_Pa = 0.0;
    c->flags = 0;
    c->start_station[0] = '\0';
    c->n_steps = 0;
    c->n_alias = 0;
}

int gc_cycle_add_alias(gc_cycle *c, const char *name, int step)
{
    if (c->n_alias >= GC_CYCLE_MAX_ALIASES || step < -1 || step >= c->n_steps)
        return -1;
    gc_cycle_alias *a = &c->alias[c->n_alias++];
    snprintf(a->name, sizeof a->name, "%s", name);
    a->step = step;
    return 0;
}

gc_step *gc_cycle_add(gc_cycle *c, gc_process_kind kind, gc_end_kind end,
                      double value, const char *field)
{
    if (c->n_steps < 0 || c->n_steps >= GC_CYCLE_MAX_STEPS)
        return NULL;
    gc_step *s = &c->steps[c->n_steps++];
    memset(s, 0, sizeof *s);
    s->kind = kind;
    s->end = end;
    s->end_value = value;
    s->end2 = GC_END_DEFAULT;
    s->efficiency = 1.0;
    s->partner = -1;
    s->geometry = GC_GEOM_CONST_P;
    if (field)
        snprintf(s->field, sizeof s->field, "%s", field);
    return s;
}

int gc_cycle_link_exchanger(gc_cycle *c, int i, int j, double eps,
                            gc_geometry geometry, const char *field)
{
    if (i < 0 || j < 0 || i >= c->n_steps || j >= c->n_steps || i == j)
        return GC_ERR_INVALID;
    gc_step *a = &c->steps[i], *b = &c->steps[j];
    a->kind = b->kind = GC_PROC_HEAT_EXCHANGE;
    a->partner = j;
    b->partner = i;
    a->efficiency = b->efficiency = eps;
    a->geometry = b->geometry = geometry;
    if (field) {
        snprintf(a->field_aux, sizeof a->field_aux, "%s", field);
        snprintf(b->field_aux, sizeof b->field_aux, "%s", field);
    }
    return GC_OK;
}

/* ---- evaluation context -------------------------------------------------- */

typedef struct hx_pair {
    int first, second;          /* step indices, first < second */
    double T_guess;             /* guessed inlet T of the second side, K (0: none yet) */
    double m_guess;             /* guessed mass ratio of the second side */
    int gas_guess;              /* guessed gas index of the second side */
    double T_actual, m_actual;  /* found in the last pass */
    int gas_actual;
    double Q_first;             /* heat into the first side, J/kg intake (this pass) */
    double T_prev, f_prev;      /* previous guess and residual, for the secant */
    double T_first_in;          /* inlet T of the first side in the last pass, K */
    double m_prev;              /* mass ratio found with the previous guess */
    int have_prev;
} hx_pair;

typedef struct ctx {
    const gc_cycle *c;
    gc_cycle_run *run;
    gc_error *err;
    int n_pairs;
    int pair_of_step[GC_CYCLE_MAX_STEPS];
    hx_pair pairs[GC_CYCLE_MAX_STEPS / 2];
    double loss_after[GC_CYCLE_MAX_STEPS]; /* product of (1 - loss) of later steps */
    double href[GC_CYCLE_MAX_GASES];       /* gc_cycle_h_ref of each gas, J/kg */
    int href_ok[GC_CYCLE_MAX_GASES];       /* 1 when href[i] is that of run->gases[i] */
    char fbuf[GC_CYCLE_FIELD_LEN];
} ctx;

static const char *step_field(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    if (s->field[0])
        return s->field;
    snprintf(x->fbuf, sizeof x->fbuf, "/steps/%d", i);
    return x->fbuf;
}

static const char *aux_field(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    return s->field_aux[0] ? s->field_aux : step_field(x, i);
}

/* Replaces the field a gas.h solver put into err by the step's field. */
static int with_field(gc_error *err, int rc, const char *field)
{
    if (rc != GC_OK && err != NULL)
        snprintf(err->field, sizeof err->field, "%s", field);
    return rc;
}

static double step_efficiency(const ctx *x, const gc_step *s)
{
    (void)x;
    return (s->efficiency == 0.0) ? 1.0 : s->efficiency;
}

static double step_loss(const ctx *x, const gc_step *s)
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

static double phi_T(const gc_gas *g, double T)
{
    return gc_gas_s0_T(g, T) - g->R_J_per_kgK * log(T);
}

/* Solves s0(T) + c ln T = target for T (monotone: d/dT = (cp + c)/T > 0 for
 * c > -cp; the callers use c = 0, -R, or R/a - R). Newton with bisection
 * safeguard inside the gas's validity range. */
static int solve_s0c(const gc_gas *g, double c, double target, double T_guess,
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
static int T_from_f(const gc_gas *g, int closed, double f, double T_guess, double *T,
                    const char *field, gc_error *err)
{
    int rc = closed ? gc_gas_T_from_u_guess(g, f, T_guess, T, err)
                    : gc_gas_T_from_h_guess(g, f, T_guess, T, err);
    return with_field(err, rc, field);
}

static double f_T(const gc_gas *g, int closed, double T)
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

static int fill_state(ctx *x, gc_cycle_state *st, int gas, double T, double P,
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
            return with_field(x->err, rc, field);
        st->T_total_K = Tt;
        st->P_total_Pa = P * exp((gc_gas_s0_T(g, Tt) - gc_gas_s0_T(g, T)) / R);
    }
    return GC_OK;
}

/* Everything one process record needs besides its end state. Specific values
 * (per kg of the gas in the step); push() multiplies by the mass ratio. */
typedef struct seg {
    int part;
    int curve;
    double a;
    double w, q, dke, diss;     /* J/kg of the gas in the step */
    double eff, eff_p;
    int internal;
    /* fuel steps: the out state's gas and mass ratio, and per-intake figures */
    int fuel;                   /* 1: w, q, dke, diss, dS, q_in, q_out are per intake */
    int gas_out;
    double m_out;
    double dS, q_in, q_out;
} seg;

static int push(ctx *x, int step, const seg *sg, double T, double P, double V,
                const char *field)
{
    gc_cycle_run *run = x->run;
    if (run->n_states >= GC_CYCLE_MAX_STATES || run->n_processes >= GC_CYCLE_MAX_PROCESSES)
        return gc_error_set(x->err, GC_ERR_INVALID, "/steps", "too many processes in the chain");
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    gc_cycle_state *out = &run->states[run->n_states];
    int gas_out = sg->fuel ? sg->gas_out : in->gas;
    double m_out = sg->fuel ? sg->m_out : in->mass_ratio;
    int rc = fill_state(x, out, gas_out, T, P, V, m_out, step, field);
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

static void seg_init(seg *sg, int curve)
{
    memset(sg, 0, sizeof *sg);
    sg->curve = curve;
    sg->a = 1.0;
    sg->eff = 1.0;
    sg->eff_p = 1.0;
}

/* Relative comparison helper for direction checks (tolerates rounding). */
static int below(double a, double b) { return a < b * (1.0 - 1e-9); }

static int check_direction(ctx *x, int i, int sign, double T1, double T2)
{
    const gc_step *s = &x->c->steps[i];
    if (sign > 0 && below(T2, T1))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, step_field(x, i),
                            "heat addition (%s) would end at %.6g K, below the temperature "
                            "at its start (%.6g K)", gc_cycle_kind_name(s->kind), T2, T1);
    if (sign < 0 && below(T1, T2))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, step_field(x, i),
                            "heat rejection (%s) would end at %.6g K, above the temperature "
                            "at its start (%.6g K)", gc_cycle_kind_name(s->kind), T2, T1);
    return GC_OK;
}

/* Pressure-ratio target of an end condition (PRESSURE_RATIO, PRESSURE,
 * PEAK_PRESSURE, START_PRESSURE); 0 if the end is not a pressure end. */
static double pressure_target(ctx *x, int i, double P1)
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

static double volume_target(ctx *x, int i, double v1)
{
    const gc_step *s = &x->c->steps[i];
    if (s->end == GC_END_VOLUME_RATIO)
        return s->end_value;
    if (s->end == GC_END_START_VOLUME)
        return x->run->states[0].v_m3_per_kg / v1;
    return 0.0;
}

static double temperature_target(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    if (s->end == GC_END_TEMPERATURE)
        return s->end_value;
    if (s->end == GC_END_START_TEMPERATURE)
        return x->c->T_start_K;
    return 0.0;
}

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
        return with_field(a->x->err, rc, a->field);
    if (a->r > 0.0 || a->pr > 0.0) {
        if (a->eta == 1.0) {
            *T2 = *T2s;
        } else {
            double f2s = f_T(g, a->closed, *T2s);
            double f2 = a->comp ? a->f1 + (f2s - a->f1) / a->eta : a->f1 - a->eta * (a->f1 - f2s);
            double Tg = a->comp ? a->T1 + (*T2s - a->T1) / a->eta
                                : a->T1 - a->eta * (a->T1 - *T2s);
            rc = T_from_f(g, a->closed, f2, Tg, T2, a->field, a->x->err);
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
        double f2 = f_T(g, a->closed, *T2);
        double f2s = a->comp ? a->f1 + a->eta * (f2 - a->f1) : a->f1 - (a->f1 - f2) / a->eta;
        double Tg = a->comp ? a->T1 + a->eta * (*T2 - a->T1) : a->T1 - (a->T1 - *T2) / a->eta;
        rc = T_from_f(g, a->closed, f2s, Tg, T2s, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
    }
    if (a->closed) {
        double lnr = -(phi_T(g, *T2s) - phi_T(g, a->T1)) / a->R;
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
            *P2 = R * *T2 / (a->v1 * exp(-pe * (phi_T(g, *T2) - phi_T(g, T1)) / R));
        else
            *P2 = a->P1 * exp(pe * (gc_gas_s0_T(g, *T2) - gc_gas_s0_T(g, T1)) / R);
    } else if (a->closed && a->r > 0.0) {
        rc = solve_s0c(g, -R, phi_T(g, T1) - (R / pe) * log(a->r),
                       T1 * pow(a->r, -R / (pe * gc_gas_cv_T(g, T1))), T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        *P2 = R * *T2 / (a->v1 * a->r);
    } else if (a->closed) {
        double c = R / pe - R;
        double target = gc_gas_s0_T(g, T1) + c * log(T1) + (R / pe) * log(a->pr);
        rc = solve_s0c(g, c, target, T1 * pow(a->pr, 0.28), T2, a->field, a->x->err);
        if (rc != GC_OK)
            return rc;
        *P2 = a->P1 * a->pr;
    } else {
        rc = solve_s0c(g, 0.0, gc_gas_s0_T(g, T1) + (R / pe) * log(a->pr),
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
    return rc == GC_OK ? GC_OK : with_field(a->x->err, rc, a->field);
}

/* The segment of an adiabatic step from (T1) to (T2, P2) and the state pushed. */
static int adia_push(const adia *a, int i, double T2, double P2, double T2s, int kinetic)
{
    const gc_gas *g = a->g;
    const gc_step *s = a->s;
    seg sg;
    seg_init(&sg, a->closed ? GC_CURVE_EFF_V : GC_CURVE_EFF_P);
    double f1 = a->f1, f2 = f_T(g, a->closed, T2);
    if (s->kind != GC_PROC_ISENTROPIC && T2 != a->T1) {
        double v2 = a->R * T2 / P2;
        double den = a->closed ? (phi_T(g, T2) - phi_T(g, a->T1))
                               : (gc_gas_s0_T(g, T2) - gc_gas_s0_T(g, a->T1));
        double num = a->closed ? -a->R * log(v2 / a->v1) : a->R * log(P2 / a->P1);
        if (den != 0.0 && num / den > 0.0)
            sg.a = num / den;
    }
    sg.diss = sg.a == 1.0 ? 0.0 : (1.0 - sg.a) * (f2 - f1); /* +0 when reversible, never -0 */
    if (s->kind != GC_PROC_ISENTROPIC) {
        double f2s = f_T(g, a->closed, T2s);
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
    return push(a->x, i, &sg, T2, P2, V2, a->field);
}

/* The end of an adiabatic step (its target) and its direction checked. */
static int adia_target(adia *a, int i, int kinetic, const gc_cycle_state *in)
{
    const gc_step *s = a->s;
    int expn = (s->kind == GC_PROC_EXPANSION);
    a->r = volume_target(a->x, i, a->v1);
    a->pr = pressure_target(a->x, i, a->P1);
    a->Tt = temperature_target(a->x, i);
    if (s->end == GC_END_VELOCITY) {
        if (!kinetic)
            return gc_error_set(a->x->err, GC_ERR_INVALID, a->field,
                                "a velocity end applies to a kinetic step (nozzle or diffuser) "
                                "in the flow frame");
        double dh = 0.5 * (a->V1 * a->V1 - s->end_value * s->end_value);
        int rc = gc_gas_T_from_h(a->g, in->h_J_per_kg + dh, &a->Tt, a->x->err);
        if (rc != GC_OK)
            return with_field(a->x->err, rc, a->field);
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
static int step_adiabatic(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    adia a;
    a.x = x;
    a.s = s;
    a.g = &run->gases[in->gas];
    a.field = step_field(x, i);
    a.closed = (x->c->frame == GC_FRAME_CLOSED);
    int kinetic = s->kinetic && !a.closed;
    a.R = a.g->R_J_per_kgK;
    a.T1 = in->T_K;
    a.P1 = in->P_Pa;
    a.v1 = in->v_m3_per_kg;
    a.V1 = in->V_m_per_s;
    a.f1 = a.closed ? in->u_J_per_kg : in->h_J_per_kg;
    a.eta = (s->kind == GC_PROC_ISENTROPIC) ? 1.0 : step_efficiency(x, s);
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

static int step_polytropic(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, n = s->n;
    double T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double T2, P2;
    if (!(n >= 0.0) || !isfinite(n))
        return gc_error_set(x->err, GC_ERR_INVALID, aux_field(x, i),
                            "the polytropic exponent must be a finite number >= 0");
    int iso = fabs(n - 1.0) < 1e-12;
    double r = volume_target(x, i, v1);
    double pr = pressure_target(x, i, P1);
    double Tt = temperature_target(x, i);
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
        seg_init(&sg, GC_CURVE_LINEAR);
    } else {
        seg_init(&sg, GC_CURVE_POLY_N);
        sg.a = n;
    }
    double w;
    if (iso)
        w = R * T1 * log(P1 / P2);
    else
        w = (closed ? 1.0 : n) * R * (T2 - T1) / (1.0 - n);
    double df = f_T(g, closed, T2) - f_T(g, closed, T1);
    sg.w = w;
    sg.q = df + w;
    return push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

static int step_const_volume(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double T2 = temperature_target(x, i);
    int rc = GC_OK;
    if (s->end == GC_END_HEAT) {
        rc = gc_gas_T_from_u(g, in->u_J_per_kg + s->end_value, &T2, x->err);
        if (rc != GC_OK)
            return with_field(x->err, rc, field);
    } else if (!(T2 > 0.0)) {
        double pr = pressure_target(x, i, P1);
        if (!(pr > 0.0) || s->end == GC_END_START_PRESSURE)
            return gc_error_set(x->err, GC_ERR_INVALID, field,
                                "constant-volume heat needs an end temperature, a heat amount, "
                                "a pressure ratio or an end pressure");
        T2 = T1 * pr;
    }
    rc = gc_gas_check_T(g, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    rc = check_direction(x, i, s->heat_sign, T1, T2);
    if (rc != GC_OK)
        return rc;
    seg sg;
    seg_init(&sg, GC_CURVE_ISOCHORE);
    double P2 = R * T2 / v1;
    sg.q = (gc_gas_h_T(g, T2) - R * T2) - in->u_J_per_kg;
    sg.w = (x->c->frame == GC_FRAME_CLOSED) ? 0.0 : -v1 * (P2 - P1);
    return push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

/* CONST_PRESSURE and COOLING. */
static int step_const_pressure(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double loss = step_loss(x, s);
    double P2 = P1 * (1.0 - loss);
    double T2 = temperature_target(x, i);
    int rc;
    if (s->kind == GC_PROC_COOLING && !(T2 > 0.0))
        return gc_error_set(x->err, GC_ERR_INVALID, field, "cooling needs an end temperature");
    if (s->end == GC_END_HEAT) {
        rc = gc_gas_T_from_h(g, in->h_J_per_kg + s->end_value, &T2, x->err);
        if (rc != GC_OK)
            return with_field(x->err, rc, field);
    } else if (!(T2 > 0.0)) {
        double r = volume_target(x, i, v1);
        if (!(r > 0.0))
            return gc_error_set(x->err, GC_ERR_INVALID, field,
                                "constant-pressure heat needs an end temperature, a heat amount "
                                "or a volume ratio");
        T2 = T1 * r * (P2 / P1);
    }
    rc = gc_gas_check_T(g, T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    rc = check_direction(x, i, s->kind == GC_PROC_COOLING ? -1 : s->heat_sign, T1, T2);
    if (rc != GC_OK)
        return rc;
    seg sg;
    seg_init(&sg, GC_CURVE_LINEAR);
    sg.q = gc_gas_h_T(g, T2) - in->h_J_per_kg;
    sg.w = closed ? R * (T2 - T1) : 0.0;
    sg.diss = R * log(P1 / P2) * 0.5 * (T1 + T2); /* +0 without a loss, never -0 */
    return push(x, i, &sg, T2, P2, in->V_m_per_s, field);
}

static int step_isothermal(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    double P2;
    double r = volume_target(x, i, v1);
    double pr = pressure_target(x, i, P1);
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
    if ((s->heat_sign > 0 && below(P1, P2)) || (s->heat_sign < 0 && below(P2, P1)))
        return gc_error_set(x->err, GC_ERR_INFEASIBLE, field,
                            "isothermal heat %s needs an %s",
                            s->heat_sign > 0 ? "addition" : "rejection",
                            s->heat_sign > 0 ? "expansion" : "compression");
    seg sg;
    seg_init(&sg, GC_CURVE_LINEAR);
    sg.w = R * T1 * log(P1 / P2);
    sg.q = sg.w;
    return push(x, i, &sg, T1, P2, in->V_m_per_s, field);
}

/* A dual step's constant-volume limit: Pcv and whether it is exact (a
 * pressure ratio) or a limit. */
static int dual_limit(ctx *x, int i, double P1, double *Pcv, int *exact)
{
    const gc_step *s = &x->c->steps[i];
    const char *afield = aux_field(x, i);
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
    if (below(*Pcv, P1))
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
    const char *field = step_field(x, i);
    int rc;
    if (s->end == GC_END_TEMPERATURE || s->end == GC_END_START_TEMPERATURE) {
        *T3 = temperature_target(x, i);
        rc = gc_gas_check_T(g, *T3, field, x->err);
        if (rc != GC_OK)
            return rc;
        if (below(*T3, *Tx)) {
            if (exact || below(*T3, in->T_K))
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
        return rc == GC_OK ? GC_OK : with_field(x->err, rc, field);
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

static int step_dual(ctx *x, int i)
{
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
    int closed = (x->c->frame == GC_FRAME_CLOSED);
    double R = g->R_J_per_kgK, T1 = in->T_K, P1 = in->P_Pa, v1 = in->v_m3_per_kg;
    int exact = 0;
    double Pcv = 0.0;
    int rc = dual_limit(x, i, P1, &Pcv, &exact);
    if (rc != GC_OK)
        return rc;
    double Tx = T1 * Pcv / P1;
    rc = gc_gas_check_T(g, Tx, aux_field(x, i), x->err);
    if (rc != GC_OK)
        return rc;
    double T3;
    rc = dual_end(x, i, in, exact, &Tx, &T3);
    if (rc != GC_OK)
        return rc;
    seg sg;
    seg_init(&sg, GC_CURVE_ISOCHORE);
    double P2 = R * Tx / v1;
    sg.q = (gc_gas_h_T(g, Tx) - R * Tx) - in->u_J_per_kg;
    sg.w = closed ? 0.0 : -v1 * (P2 - P1);
    rc = push(x, i, &sg, Tx, P2, in->V_m_per_s, field);
    if (rc != GC_OK)
        return rc;
    const gc_cycle_state *mid = &run->states[run->n_states - 1];
    seg_init(&sg, GC_CURVE_LINEAR);
    sg.part = 1;
    sg.q = gc_gas_h_T(g, T3) - mid->h_J_per_kg;
    sg.w = closed ? R * (T3 - Tx) : 0.0;
    return push(x, i, &sg, T3, mid->P_Pa, mid->V_m_per_s, field);
}

static int step_pressure_loss(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    double loss = step_loss(x, s);
    double P2 = in->P_Pa * (1.0 - loss);
    if (s->end == GC_END_PRESSURE) {  /* the ideal chain has no such end (idealize) */
        P2 = s->end_value;
        if (P2 > in->P_Pa)
            return gc_error_set(x->err, GC_ERR_INFEASIBLE, step_field(x, i),
                                "a throttle cannot raise the pressure (%.6g Pa at its inlet, "
                                "%.6g Pa asked)", in->P_Pa, P2);
    }
    seg sg;
    seg_init(&sg, GC_CURVE_LINEAR);
    sg.diss = g->R_J_per_kgK * in->T_K * log(in->P_Pa / P2);
    return push(x, i, &sg, in->T_K, P2, in->V_m_per_s, step_field(x, i));
}

static int step_heat_exchange(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
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
        double qa = m * (f_T(g, cv, hi) - f_T(g, cv, lo));
        double qb = mb * (f_T(gb, cv, hi) - f_T(gb, cv, lo));
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
    double f2 = f_T(g, cv, T1) + Q / m;
    double c1 = gc_gas_cp_T(g, T1) - (cv ? R : 0.0);
    rc = T_from_f(g, cv, f2, T1 + Q / (m * c1), &T2, field, x->err);
    if (rc != GC_OK)
        return rc;
    double loss = cv ? 0.0 : step_loss(x, s);
    seg sg;
    double P2;
    if (cv) {
        seg_init(&sg, GC_CURVE_ISOCHORE);
        P2 = R * T2 / in->v_m3_per_kg;
        sg.w = (x->c->frame == GC_FRAME_CLOSED) ? 0.0 : -in->v_m3_per_kg * (P2 - in->P_Pa);
    } else {
        seg_init(&sg, GC_CURVE_LINEAR);
        P2 = in->P_Pa * (1.0 - loss);
        sg.w = (x->c->frame == GC_FRAME_CLOSED) ? R * (T2 - T1) : 0.0;
        sg.diss = R * log(in->P_Pa / P2) * 0.5 * (T1 + T2);
    }
    sg.q = Q / m;
    sg.internal = 1;
    sg.eff = s->efficiency;
    return push(x, i, &sg, T2, P2, in->V_m_per_s, field);
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
static int step_close(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
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
        seg_init(&sg, GC_CURVE_ISOCHORE);
        sg.w = closed ? 0.0 : -R * (T2 - T1);
    } else {
        seg_init(&sg, GC_CURVE_LINEAR);
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
    int rc = check_direction(x, i, s->heat_sign, T1, T2);
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
    return push(x, i, &sg, T2, P2, V2, field);
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
static int step_fuel(ctx *x, int i)
{
    const gc_step *s = &x->c->steps[i];
    gc_cycle_run *run = x->run;
    const gc_cycle_state *in = &run->states[run->n_states - 1];
    const gc_gas *g = &run->gases[in->gas];
    const char *field = step_field(x, i);
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
    double eta = step_efficiency(x, s);
    double T1 = in->T_K, P1 = in->P_Pa, m_in = in->mass_ratio;
    gc_burn b;
    int rc;
    if (s->end == GC_END_TEMPERATURE)
        rc = gc_combustion_burn_to_T(fu, Tf, g, T1, 1.0, s->end_value, eta, &b, x->err);
    else
        rc = gc_combustion_burn_far(fu, Tf, g, T1, 1.0, s->fuel.fuel_air_ratio, eta, &b, x->err);
    if (rc != GC_OK)
        return with_field(x->err, rc, field);
    double hf, sf;
    rc = gc_fuel_h_T(fu, Tf, &hf, x->err);
    if (rc == GC_OK)
        rc = gc_exergy_fuel_s(fu, Tf, P1, &sf, x->err);
    if (rc != GC_OK)
        return with_field(x->err, rc, field);
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
    double P2 = P1 * (1.0 - step_loss(x, s));
    double Rp = gp->R_J_per_kgK;
    double LHV;
    gc_fuel_heating_values(fu, &LHV, NULL);
    seg sg;
    seg_init(&sg, GC_CURVE_LINEAR);
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
    return push(x, i, &sg, T2, P2, V_out, field);
}

/* ---- validation ---------------------------------------------------------- */

static int end_allowed(int kind, int end, int frame)
{
    unsigned m = 1u << end;
#define B(e) (1u << (e))
    switch (kind) {
    case GC_PROC_ISENTROPIC:
    case GC_PROC_COMPRESSION:
    case GC_PROC_EXPANSION: {
        unsigned ok = B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                      B(GC_END_START_PRESSURE) | B(GC_END_TEMPERATURE) |
                      B(GC_END_START_TEMPERATURE) | B(GC_END_START_VOLUME) | B(GC_END_VELOCITY);
        if (kind != GC_PROC_ISENTROPIC && frame == GC_FRAME_FLOW)
            ok &= ~(B(GC_END_VOLUME_RATIO) | B(GC_END_START_VOLUME));
        return (m & ok) != 0;
    }
    case GC_PROC_POLYTROPIC:
        return (m & (B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                     B(GC_END_START_PRESSURE) | B(GC_END_TEMPERATURE) |
                     B(GC_END_START_TEMPERATURE) | B(GC_END_START_VOLUME))) != 0;
    case GC_PROC_CONST_VOLUME:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) | B(GC_END_PEAK_PRESSURE))) != 0;
    case GC_PROC_CONST_PRESSURE:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_VOLUME_RATIO) | B(GC_END_START_VOLUME))) != 0;
    case GC_PROC_ISOTHERMAL:
        return (m & (B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                     B(GC_END_START_PRESSURE) | B(GC_END_START_VOLUME) | B(GC_END_HEAT))) != 0;
    case GC_PROC_DUAL:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_VOLUME_RATIO))) != 0;
    case GC_PROC_PRESSURE_LOSS:
        return (m & (B(GC_END_DEFAULT) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE))) != 0;
    case GC_PROC_HEAT_EXCHANGE:
    case GC_PROC_CLOSE:
    case GC_PROC_FUEL:
        return end == GC_END_DEFAULT || (kind == GC_PROC_FUEL && end == GC_END_TEMPERATURE);
    case GC_PROC_COOLING:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE))) != 0;
    default:
        return 0;
    }
#undef B
}

/* A step's end value against its end kind. */
static int validate_end(const gc_cycle *c, const gc_step *s, const char *f, gc_error *err)
{
    double v = s->end_value;
    switch (s->end) {
    case GC_END_VOLUME_RATIO:
    case GC_END_PRESSURE_RATIO:
    case GC_END_TEMPERATURE:
    case GC_END_PRESSURE:
    case GC_END_PEAK_PRESSURE:
        if (!(v > 0.0) || !isfinite(v))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be a positive number");
        break;
    case GC_END_HEAT:
        if (!isfinite(v) || fabs(v) > 1e9)
            return gc_error_set(err, GC_ERR_INVALID, f,
                                "the heat must be a finite number of J/kg");
        break;
    case GC_END_VELOCITY:
        if (!(v >= 0.0) || v > 1e4)
            return gc_error_set(err, GC_ERR_INVALID, f, "the velocity must be 0 to 10000 m/s");
        break;
    default:
        break;
    }
    if (s->end == GC_END_TEMPERATURE) {
        int rc = gc_gas_check_T(&c->gas, v, f, err);
        if (rc != GC_OK)
            return rc;
    }
    if (!(s->end_value_ideal >= 0.0) || !isfinite(s->end_value_ideal) ||
        (s->end_value_ideal > 0.0 && s->end != GC_END_PRESSURE_RATIO &&
         s->end != GC_END_VOLUME_RATIO && s->end != GC_END_PRESSURE &&
         s->end != GC_END_TEMPERATURE))
        return gc_error_set(err, GC_ERR_INVALID, f,
                            "an ideal end value applies to a ratio, pressure or temperature "
                            "end and must be positive");
    return GC_OK;
}

/* Efficiencies and heat-exchanger links of step i. */
static int validate_machines(const gc_cycle *c, int i, const char *fa, gc_error *err)
{
    const gc_step *s = &c->steps[i];
    if (s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION || s->kind == GC_PROC_FUEL) {
        if (!(s->efficiency >= 0.0 && s->efficiency <= 1.0) || (s->efficiency > 0.0 && s->efficiency < 0.05))
            return gc_error_set(err, GC_ERR_INVALID, fa,
                                "an efficiency must be between 0.05 and 1");
    }
    if (s->kind != GC_PROC_HEAT_EXCHANGE)
        return GC_OK;
    if (!(s->efficiency >= 0.0 && s->efficiency <= 1.0))
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "a heat-exchanger effectiveness must be between 0 and 1");
    int j = s->partner;
    if (j < 0 || j >= c->n_steps || j == i || c->steps[j].kind != GC_PROC_HEAT_EXCHANGE ||
        c->steps[j].partner != i || c->steps[j].geometry != s->geometry)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "a heat exchange needs a partner step that links back with "
                            "the same geometry");
    if (s->geometry == GC_GEOM_CONST_V && c->frame == GC_FRAME_FLOW)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "constant-volume heat exchange applies to the closed frame");
    return GC_OK;
}

/* Closing geometry, pressure losses, kinetic steps and source temperatures. */
static int validate_rest(const gc_cycle *c, const gc_step *s, const char *f, const char *fa,
                         gc_error *err)
{
    if (s->kind == GC_PROC_CLOSE && s->geometry != GC_GEOM_CONST_P && s->geometry != GC_GEOM_CONST_V)
        return gc_error_set(err, GC_ERR_INVALID, f, "unknown closing geometry");
    /* a throttle to an end PRESSURE (e.g. a free jet to ambient) has no
     * fractional bound: its end is checked against the inlet when run */
    double loss = (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE_RATIO)
                      ? 1.0 - s->end_value
                      : (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE)
                            ? 0.0 : s->pressure_loss;
    if (!(loss >= 0.0 && loss < 0.9))
        return gc_error_set(err, GC_ERR_INVALID, s->kind == GC_PROC_PRESSURE_LOSS ? f : fa,
                            "a fractional pressure loss must be between 0 and 0.9");
    if (loss > 0.0 && c->frame == GC_FRAME_CLOSED && s->kind != GC_PROC_PRESSURE_LOSS)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "pressure losses of heat exchangers apply to the flow frame");
    if (s->kinetic && (c->frame != GC_FRAME_FLOW ||
                       (s->kind != GC_PROC_ISENTROPIC && s->kind != GC_PROC_COMPRESSION &&
                        s->kind != GC_PROC_EXPANSION)))
        return gc_error_set(err, GC_ERR_INVALID, f,
                            "kinetic (nozzle or diffuser) steps are adiabatic steps of the "
                            "flow frame");
    if (!(s->T_source_K >= 0.0) || !isfinite(s->T_source_K))
        return gc_error_set(err, GC_ERR_INVALID, fa, "a source temperature must be >= 0 K");
    return GC_OK;
}

/* The chain's frame, start and dead states. */
static int validate_start(const gc_cycle *c, gc_error *err)
{
    if (c->frame != GC_FRAME_CLOSED && c->frame != GC_FRAME_FLOW)
        return gc_error_set(err, GC_ERR_INVALID, "/frame", "must be closed or flow");
    if (c->n_steps < 1 || c->n_steps > GC_CYCLE_MAX_STEPS)
        return gc_error_set(err, GC_ERR_INVALID, "/steps",
                            "a cycle needs 1 to %d steps", GC_CYCLE_MAX_STEPS);
    int rc = gc_gas_check_T(&c->gas, c->T_start_K, "/intake_temperature", err);
    if (rc != GC_OK)
        return rc;
    rc = gc_gas_check_P(c->P_start_Pa, "/intake_pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(c->V_start_m_per_s) || fabs(c->V_start_m_per_s) > 1e4 ||
        (c->frame == GC_FRAME_CLOSED && c->V_start_m_per_s != 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/velocity",
                            "the start velocity must be finite (and 0 in the closed frame)");
    if (!(c->T_dead_K >= 0.0) || !isfinite(c->T_dead_K) || !(c->P_dead_Pa >= 0.0) ||
        !isfinite(c->P_dead_Pa))
        return gc_error_set(err, GC_ERR_INVALID, "/site",
                            "the dead-state temperature and pressure must be >= 0");
    return GC_OK;
}

static int validate(ctx *x)
{
    const gc_cycle *c = x->c;
    gc_error *err = x->err;
    int rc = validate_start(c, err);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        const char *f = step_field(x, i);
        if ((int)s->kind < 0 || s->kind >= GC_PROC_KIND_COUNT)
            return gc_error_set(err, GC_ERR_UNKNOWN, f, "unknown process kind");
        if ((int)s->end < 0 || s->end >= GC_END_KIND_COUNT || !end_allowed(s->kind, s->end, c->frame))
            return gc_error_set(err, GC_ERR_INVALID, f, "%s cannot end on %s%s",
                                gc_cycle_kind_name(s->kind), gc_cycle_end_name(s->end),
                                c->frame == GC_FRAME_FLOW ? " in the flow frame" : "");
        const char *fa = aux_field(x, i);
        rc = validate_end(c, s, f, err);
        if (rc == GC_OK)
            rc = validate_machines(c, i, fa, err);
        if (rc == GC_OK)
            rc = validate_rest(c, s, f, fa, err);
        if (rc != GC_OK)
            return rc;
    }
    return GC_OK;
}

int gc_cycle_validate(const gc_cycle *c, gc_error *err)
{
    ctx x;
    x.c = c;
    x.err = err;
    return validate(&x);
}

/* ---- one pass and the heat-exchanger iteration ----------------------------- */

/* Evaluates steps [from, to) of the chain, appending to the run. */
static int run_steps(ctx *x, int from, int to)
{
    const gc_cycle *c = x->c;
    for (int i = from; i < to; i++) {
        int rc;
        switch (c->steps[i].kind) {
        case GC_PROC_ISENTROPIC:
        case GC_PROC_COMPRESSION:
        case GC_PROC_EXPANSION: rc = step_adiabatic(x, i); break;
        case GC_PROC_POLYTROPIC: rc = step_polytropic(x, i); break;
        case GC_PROC_CONST_VOLUME: rc = step_const_volume(x, i); break;
        case GC_PROC_CONST_PRESSURE:
        case GC_PROC_COOLING: rc = step_const_pressure(x, i); break;
        case GC_PROC_ISOTHERMAL: rc = step_isothermal(x, i); break;
        case GC_PROC_DUAL: rc = step_dual(x, i); break;
        case GC_PROC_PRESSURE_LOSS: rc = step_pressure_loss(x, i); break;
        case GC_PROC_HEAT_EXCHANGE: rc = step_heat_exchange(x, i); break;
        case GC_PROC_FUEL: rc = step_fuel(x, i); break;
        case GC_PROC_CLOSE: rc = step_close(x, i); break;
        default: rc = gc_error_set(x->err, GC_ERR_UNKNOWN, step_field(x, i), "unknown process kind");
        }
        if (rc != GC_OK)
            return rc;
    }
    return GC_OK;
}

/* Heat exchangers: the later side's inlet state is guessed, the chain is run,
 * and the guess is updated by a secant on its temperature until guess and
 * result agree. Only the steps from the first exchanger side to the last
 * second side depend on the guesses: the steps before them are evaluated
 * once, each pass re-evaluates that segment alone (ending with the second
 * sides, whose inlets are the results), and the steps after it are
 * evaluated once, after convergence, from the converged segment. A pass
 * count (regen_iterations) counts segment passes. */
static int iterate(ctx *x)
{
    gc_cycle_run *run = x->run;
    const int n = x->c->n_steps;
    run->n_states = 1;
    run->n_processes = 0;
    run->n_gases = 1;
    if (x->n_pairs == 0) {
        x->run->regen_iterations = 1;
        return run_steps(x, 0, n);
    }
    int seg_lo = n, seg_hi = 0;
    for (int k = 0; k < x->n_pairs; k++) {
        if (x->pairs[k].first < seg_lo)
            seg_lo = x->pairs[k].first;
        if (x->pairs[k].second > seg_hi)
            seg_hi = x->pairs[k].second;
    }
    int rc = run_steps(x, 0, seg_lo);
    if (rc != GC_OK)
        return rc;
    const int ns = run->n_states, np = run->n_processes, ng = run->n_gases;
    int passes = 0;
    for (;;) {
        run->n_states = ns;
        run->n_processes = np;
        run->n_gases = ng;
        rc = run_steps(x, seg_lo, seg_hi + 1);
        passes++;
        if (rc != GC_OK)
            return rc;
        int done = 1;
        for (int k = 0; k < x->n_pairs; k++) {
            hx_pair *p = &x->pairs[k];
            double f = p->T_actual - p->T_guess;
            /* converged: the guessed inlet agrees with the result in T and in
             * mass ratio, both to 1e-11 relative */
            if (p->T_guess > 0.0 && fabs(f) <= 1e-11 * p->T_actual &&
                fabs(p->m_actual - p->m_guess) <= 1e-11 * p->m_actual &&
                p->gas_actual == p->gas_guess)
                continue;
            done = 0;
            double Tn = p->T_actual, mn = p->m_actual;
            if (p->T_guess > 0.0 && p->have_prev && f != p->f_prev) {
                double Ts = p->T_guess - f * (p->T_guess - p->T_prev) / (f - p->f_prev);
                if (Ts > 0.0 && isfinite(Ts)) {
                    Tn = Ts;
                    /* the mass ratio the secant's guess will produce, from the
                     * same two passes (it follows the exchanger's heat) */
                    double ms = p->m_actual + (p->m_actual - p->m_prev) * (Ts - p->T_guess) /
                                                  (p->T_guess - p->T_prev);
                    if (p->T_guess != p->T_prev && ms > 0.0 && isfinite(ms))
                        mn = ms;
                }
            }
            /* the first pass runs the first side against its own inlet (no
             * heat moved): that is the point (T_first_in, T_actual) of the
             * same map, so the secant can start from it */
            double Tg = p->T_guess > 0.0 ? p->T_guess : p->T_first_in;
            if (Tg > 0.0) {
                p->T_prev = Tg;
                p->f_prev = p->T_actual - Tg;
                p->m_prev = p->m_actual;
                p->have_prev = 1;
            }
            p->T_guess = Tn;
            p->m_guess = mn;
            p->gas_guess = p->gas_actual;
        }
        if (done)
            break;
        if (passes >= 60)
            return gc_error_set(x->err, GC_ERR_NOCONV, aux_field(x, x->pairs[0].first),
                                "the heat-exchanger iteration did not converge in %d passes",
                                passes);
    }
    x->run->regen_iterations = passes;
    return run_steps(x, seg_hi + 1, n);
}

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
        return with_field(x->err, rc, "/dead_state");
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

static int summarise(ctx *x, double T_dead_over, double P_dead_over)
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

/* Starts each heat exchanger's guess from the inlet of its second side in
 * the run `seed` of the same chain (the actual run, for the ideal one):
 * temperature, mass ratio and gas (copied, since the pass has not built it
 * yet when the first side needs it). Only a starting point: the iteration
 * converges from it as from any other. */
static void seed_pairs(ctx *x, const gc_cycle_run *seed)
{
    gc_cycle_run *run = x->run;
    for (int k = 0; k < x->n_pairs; k++) {
        hx_pair *p = &x->pairs[k];
        for (int q = 0; q < seed->n_processes; q++) {
            const gc_cycle_process *pr = &seed->processes[q];
            if (pr->step != p->second || pr->part != 0)
                continue;
            const gc_cycle_state *st = &seed->states[pr->from];
            if (st->gas < 0 || st->gas >= seed->n_gases || !(st->T_K > 0.0))
                break;
            p->T_guess = st->T_K;
            p->m_guess = st->mass_ratio;
            p->gas_guess = st->gas;
            run->gases[st->gas] = seed->gases[st->gas];
            x->href_ok[st->gas] = 0;
            break;
        }
    }
}

static int run_chain(const gc_cycle *c, double T_dead, double P_dead,
                     const gc_cycle_run *seed, gc_cycle_run *run, gc_error *err)
{
    ctx x;
    x.c = c;
    x.run = run;
    x.err = err;
    x.n_pairs = 0;
    memset(x.href_ok, 0, sizeof x.href_ok);
    int rc = validate(&x);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < c->n_steps; i++)
        x.pair_of_step[i] = -1;
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        if (s->kind == GC_PROC_HEAT_EXCHANGE && s->partner > i) {
            hx_pair *p = &x.pairs[x.n_pairs];
            memset(p, 0, sizeof *p);
            p->first = i;
            p->second = s->partner;
            x.pair_of_step[i] = x.pair_of_step[s->partner] = x.n_pairs;
            x.n_pairs++;
        }
    }
    double prod = 1.0;
    for (int i = c->n_steps - 1; i >= 0; i--) {
        x.loss_after[i] = prod;
        prod *= 1.0 - step_loss(&x, &c->steps[i]);
    }
    run->frame = c->frame;
    run->gases[0] = c->gas;
    run->n_gases = 1;
    if (seed != NULL)
        seed_pairs(&x, seed);
    run->regen_iterations = 1;
    run->checks.close_rel = 0.0;
    rc = fill_state(&x, &run->states[0], 0, c->T_start_K, c->P_start_Pa, c->V_start_m_per_s,
                    1.0, -1, "/intake_temperature");
    if (rc != GC_OK)
        return rc;
    rc = iterate(&x);
    if (rc != GC_OK)
        return rc;
    rc = summarise(&x, T_dead, P_dead);
    if (rc != GC_OK)
        return rc;
    if (!(c->flags & GC_CYCLE_NO_AREAS))
        return gc_path_check_areas(run, err);
    return GC_OK;
}

int gc_cycle_run_chain(const gc_cycle *c, gc_cycle_run *run, gc_error *err)
{
    gc_error_clear(err);
    return run_chain(c, 0.0, 0.0, NULL, run, err);
}

/* 1 if the chain has anything an ideal counterpart changes. */
static int has_losses(const gc_cycle *c)
{
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        if ((s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION || s->kind == GC_PROC_FUEL) &&
            s->efficiency != 0.0 && s->efficiency != 1.0)
            return 1;
        if (s->kind == GC_PROC_HEAT_EXCHANGE && s->efficiency != 1.0)
            return 1;
        if (s->end_value_ideal > 0.0 && s->end_value_ideal != s->end_value)
            return 1;
        if (s->pressure_loss != 0.0)
            return 1;
        if (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE_RATIO && s->end_value != 1.0)
            return 1;
        if (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE)
            return 1;
    }
    return 0;
}

/* Steps that change the pressure only by a fractional loss (or not at all). */
static int loss_only(const gc_step *s)
{
    switch (s->kind) {
    case GC_PROC_PRESSURE_LOSS:
    case GC_PROC_CONST_PRESSURE:
    case GC_PROC_COOLING:
    case GC_PROC_FUEL:
        return 1;
    case GC_PROC_HEAT_EXCHANGE:
        return s->geometry == GC_GEOM_CONST_P;
    default:
        return 0;
    }
}

/* The ideal's final expansion: the pressure-setting step before a
 * constant-pressure close, with only loss steps between them, ends at the
 * start pressure (the pressure the actual chain closed at, now without the
 * losses it covered). Done when a loss lies between them, or always with
 * force (the retry when the ideal would not close otherwise). */
static void ideal_tail(const gc_cycle *actual, gc_cycle *ideal, int force)
{
    for (int k = ideal->n_steps - 1; k > 0; k--) {
        gc_step *cl = &ideal->steps[k];
        if (cl->kind != GC_PROC_CLOSE || cl->geometry != GC_GEOM_CONST_P)
            continue;
        int j = k - 1, lossy = 0;
        while (j >= 0 && loss_only(&actual->steps[j])) {
            const gc_step *a = &actual->steps[j];
            lossy |= a->pressure_loss > 0.0 ||
                     (a->kind == GC_PROC_PRESSURE_LOSS && a->end == GC_END_PRESSURE_RATIO &&
                      a->end_value != 1.0);
            j--;
        }
        if (j < 0 || !(lossy || force))
            continue;
        gc_step *e = &ideal->steps[j];
        int sets_p = e->kind == GC_PROC_COMPRESSION || e->kind == GC_PROC_EXPANSION ||
                     e->kind == GC_PROC_ISENTROPIC || e->kind == GC_PROC_POLYTROPIC ||
                     e->kind == GC_PROC_ISOTHERMAL;
        int end_ok = e->end == GC_END_PRESSURE || e->end == GC_END_PRESSURE_RATIO ||
                     e->end == GC_END_TEMPERATURE || e->end == GC_END_START_TEMPERATURE ||
                     (e->end == GC_END_VOLUME_RATIO && ideal->frame == GC_FRAME_FLOW);
        if (sets_p && end_ok && !(e->kind == GC_PROC_POLYTROPIC && fabs(e->n) < 1e-12)) {
            e->end = GC_END_START_PRESSURE;
            e->end_value = 0.0;
            e->end_value_ideal = 0.0;
        }
    }
}

/* keep_hx: keep the heat exchangers' effectiveness (the second bound,
 * "ideal components, this regenerator"). */
/* Copies a chain: its header and its n_steps steps only (the unused tail of
 * the step array is left as it is). */
static void copy_chain(gc_cycle *dst, const gc_cycle *src)
{
    memcpy(dst, src, offsetof(gc_cycle, steps));
    int n = src->n_steps > 0 && src->n_steps <= GC_CYCLE_MAX_STEPS ? src->n_steps : 0;
    memcpy(dst->steps, src->steps, (size_t)n * sizeof src->steps[0]);
}

static void idealize(const gc_cycle *c, gc_cycle *ideal, int force_tail, int keep_hx)
{
    if (ideal != c)
        copy_chain(ideal, c);
    for (int i = 0; i < ideal->n_steps; i++) {
        gc_step *s = &ideal->steps[i];
        if (s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION ||
            s->kind == GC_PROC_FUEL || (s->kind == GC_PROC_HEAT_EXCHANGE && !keep_hx))
            s->efficiency = 1.0;
        s->pressure_loss = 0.0;
        if (s->kind == GC_PROC_PRESSURE_LOSS) {
            s->end = GC_END_DEFAULT;
            s->end_value = 0.0;
        }
        if (s->end_value_ideal > 0.0) {
            s->end_value = s->end_value_ideal;
            s->end_value_ideal = 0.0;
        }
    }
    ideal_tail(c, ideal, force_tail);
}

int gc_cycle_idealize(const gc_cycle *c, gc_cycle *ideal)
{
    int changed = has_losses(c);
    if (ideal == c) {
        gc_cycle copy;
        copy_chain(&copy, c);
        idealize(&copy, ideal, 0, 0);
    } else {
        idealize(c, ideal, 0, 0);
    }
    return changed;
}

static void copy_run(gc_cycle_run *dst, const gc_cycle_run *src)
{
    dst->frame = src->frame;
    dst->n_states = src->n_states;
    dst->n_processes = src->n_processes;
    dst->n_gases = src->n_gases;
    dst->regen_iterations = src->regen_iterations;
    memcpy(dst->states, src->states, (size_t)src->n_states * sizeof src->states[0]);
    memcpy(dst->processes, src->processes, (size_t)src->n_processes * sizeof src->processes[0]);
    memcpy(dst->gases, src->gases, (size_t)src->n_gases * sizeof src->gases[0]);
    dst->summary = src->summary;
    dst->checks = src->checks;
}

/* "ideal counterpart: " before the message of an error of the ideal run. */
static void prefix_ideal(gc_error *err)
{
    if (!err)
        return;
    static const char pre[] = "ideal counterpart: ";
    size_t n = strlen(err->message), np = sizeof pre - 1;
    if (n + np >= sizeof err->message)
        n = sizeof err->message - np - 1;
    memmove(err->message + np, err->message, n);
    memcpy(err->message, pre, np);
    err->message[np + n] = '\0';
}

/* 1 if a heat exchanger of c has an effectiveness below 1. */
static int imperfect_hx(const gc_cycle *c)
{
    for (int i = 0; i < c->n_steps; i++)
        if (c->steps[i].kind == GC_PROC_HEAT_EXCHANGE && c->steps[i].efficiency < 1.0)
            return 1;
    return 0;
}

/* Runs the ideal counterpart of c (keep_hx: the second bound) into
 * r->ideal; when it does not close, once more with the final expansion sent
 * back to the start pressure whatever lies between (ideal_tail). */
static int ideal_run(const gc_cycle *c, int keep_hx, unsigned flags, gc_cycle_result *r,
                     gc_error *err)
{
    int rc = GC_OK;
    for (int force = 0; force < 2; force++) {
        gc_cycle ideal; /* a scratch copy, about 11 KB */
        idealize(c, &ideal, force, keep_hx);
        ideal.flags = flags;
        rc = run_chain(&ideal, r->actual.summary.T_dead_K, r->actual.summary.P_dead_Pa,
                       &r->actual, &r->ideal, err);
        if (rc == GC_OK)
            break;
    }
    if (rc != GC_OK)
        prefix_ideal(err);
    else
        gc_error_clear(err);
    return rc;
}

/* text in snake_case (letters and digits kept, lower case; anything else one
 * '_'), then suffix, into out (size n). */
static void snake(char *out, size_t n, const char *text, const char *suffix)
{
    size_t k = 0;
    int gap = 0;
    for (const char *p = text; *p && k + 1 < n; p++) {
        unsigned char ch = (unsigned char)*p;
        if (isalnum(ch)) {
            if (gap && k > 0 && k + 2 < n)
                out[k++] = '_';
            out[k++] = (char)tolower(ch);
            gap = 0;
        } else {
            gap = 1;
        }
    }
    out[k] = '\0';
    snprintf(out + k, n - k, "%s", suffix);
}

/* The station name of a process's end state: the step's, else derived. */
static void end_name(const gc_cycle *c, const gc_cycle_process *p, char *out, size_t n)
{
    const gc_step *s = &c->steps[p->step];
    int mid = p->kind == GC_PROC_DUAL && p->part == 0;
    const char *given = mid ? s->station_mid : s->station;
    if (given[0]) {
        snprintf(out, n, "%s", given);
        return;
    }
    const char *label = s->label[0] ? s->label : gc_cycle_kind_name(s->kind);
    snake(out, n, label, mid ? "_mid" : c->frame == GC_FRAME_FLOW ? "_exit" : "_end");
}

/* 1 when name is a station of states 0..upto-1 of r. */
static int named_before(const gc_cycle_result *r, const char *name, int upto)
{
    for (int i = 0; i < upto; i++)
        if (strcmp(r->station[i], name) == 0)
            return 1;
    return 0;
}

/* Repeated station names get "_2", "_3" ... (the first keeps its name). */
static void unique_names(gc_cycle_result *r, int n_states)
{
    for (int i = 1; i < n_states; i++) {
        if (!named_before(r, r->station[i], i))
            continue;
        char base[GC_CYCLE_STATION_LEN];
        memcpy(base, r->station[i], sizeof base);
        for (int k = 2; k < 100; k++) {
            snprintf(r->station[i], sizeof r->station[i], "%.56s_%d", base, k);
            if (!named_before(r, r->station[i], i))
                break;
        }
    }
}

/* The aliases of the chain, by the index of their states. */
static void name_aliases(const gc_cycle *c, gc_cycle_result *r)
{
    const gc_cycle_run *run = &r->actual;
    r->n_alias = 0;
    for (int a = 0; a < c->n_alias; a++) {
        int state = c->alias[a].step < 0 ? 0 : -1;
        for (int k = 0; k < run->n_processes && state < 0; k++) {
            const gc_cycle_process *p = &run->processes[k];
            if (p->step == c->alias[a].step && !(p->kind == GC_PROC_DUAL && p->part == 0))
                state = p->to;
        }
        if (state < 0 || state >= run->n_states ||
            named_before(r, c->alias[a].name, run->n_states))
            continue;
        gc_cycle_alias *out = &r->alias[r->n_alias++];
        memcpy(out->name, c->alias[a].name, sizeof out->name);
        out->step = state;
    }
}

/* Step labels, state station names and aliases of the chain into the result. */
static void name_result(const gc_cycle *c, gc_cycle_result *r)
{
    const gc_cycle_run *run = &r->actual;
    r->n_steps = c->n_steps;
    for (int i = 0; i < c->n_steps; i++)
        memcpy(r->label[i], c->steps[i].label, sizeof r->label[i]);
    for (int i = 0; i < run->n_states && i < GC_CYCLE_MAX_STATES; i++)
        r->station[i][0] = '\0';
    snprintf(r->station[0], sizeof r->station[0], "%s",
             c->start_station[0] ? c->start_station : "start");
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->to <= 0 || p->to >= GC_CYCLE_MAX_STATES || p->step < 0 || p->step >= c->n_steps)
            continue;
        end_name(c, p, r->station[p->to], sizeof r->station[p->to]);
    }
    unique_names(r, run->n_states);
    name_aliases(c, r);
}

static int evaluate_runs(const gc_cycle *c, gc_cycle_result *r, gc_error *err)
{
    gc_error_clear(err);
    r->has_ideal = 0;
    r->has_ideal_components = 0;
    r->ideal_is_actual = 0;
    r->carnot_efficiency = 0.0;
    int rc = run_chain(c, 0.0, 0.0, NULL, &r->actual, err);
    if (rc != GC_OK)
        return rc;
    r->carnot_efficiency = r->actual.summary.carnot_efficiency;
    if (c->flags & GC_CYCLE_NO_BOUNDS)
        return GC_OK;
    if (!has_losses(c)) {
        copy_run(&r->ideal, &r->actual);
        r->ideal_is_actual = 1;
        r->has_ideal = 1;
        return GC_OK;
    }
    /* the second bound first, into r->ideal as scratch (summary kept); it is
     * optional: where it cannot be run the result simply lacks it */
    if (imperfect_hx(c) && ideal_run(c, 1, GC_CYCLE_NO_AREAS, r, NULL) == GC_OK) {
        r->ideal_components = r->ideal.summary;
        r->has_ideal_components = 1;
    }
    rc = ideal_run(c, 0, c->flags, r, err);
    if (rc != GC_OK)
        return rc;
    r->has_ideal = 1;
    return GC_OK;
}

int gc_cycle_evaluate(const gc_cycle *c, gc_cycle_result *r, gc_error *err)
{
    int rc = evaluate_runs(c, r, err);
    if (rc == GC_OK)
        name_result(c, r);
    return rc;
}
