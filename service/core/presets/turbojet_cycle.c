/*
 * turbojet_cycle.c — the turbojet preset's evaluation (turbojet.h; the
 * descriptor is turbojet.c): flight condition (USSA 1976 through site.h),
 * the shaft balance, the convergent nozzle's critical pressure, the chain
 * builder and the propulsion figures. Every cycle number comes from the
 * cycle engine (cycle.h).
 *
 * Passes per evaluation:
 *   1. generator chain: diffuser, recovery, compressor, combustor, then an
 *      isentropic expansion to ambient and the closing step (always runs):
 *      gives the compressor work and the turbine inlet state;
 *   2. the turbine's end temperature from the shaft balance
 *      m4 (h4 - h5) = w_c / eta_mech, then the full chain with the nozzle
 *      expanded to ambient (gives the nozzle inlet state);
 *   3. convergent nozzle only: the critical pressure from that state; if it
 *      is above ambient the nozzle ends there (choked) and a plume step
 *      takes the jet to ambient pressure.
 * The last pass is the full evaluation (actual, ideal counterpart, checks).
 *
 * Critical pressure: along the nozzle expansion the exit static temperature
 * T fixes h(T), the velocity V^2 = V1^2 + 2 (h1 - h(T)) and the sound speed
 * a^2 = k(T) R T; the sonic T solves V^2 = a^2 (bracketed Newton on T, the
 * residual falls monotonically with T); the pressure follows from the
 * nozzle efficiency: h_s = h1 - (h1 - h(T))/eta_n, s0(T_s) - s0(T1) =
 * R ln(P_crit/P1). For constant cp and k this is the published relation
 * P1/P_crit = [1 - ((k-1)/(k+1))/eta_n]^(-k/(k-1)) (checked in the tests).
 *
 * Units: SI (K, Pa, m/s, J/kg, N s/kg, kg/(N s)).
 */
#include "core/presets/turbojet_internal.h"
#include "core/preset_util.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#define TIT_COOLED_K 1500.0   /* cooled blades above about this (common practice, brayton.h) */

/* The diffuser's end speed, m/s. The flow is brought (effectively) to rest;
 * a strictly zero end speed leaves the engine's kinetic-energy balance of the
 * step at the mercy of rounding in the inverse T(h) solve (about 1e-9 of
 * cp T, i.e. 1e-4 J/kg for the NASA-9 mixtures, 1e-11 J/kg for the cold
 * model), which the engine may read as "not enough kinetic energy". These
 * end speeds leave 0.5 v^2 well above that rounding (0.02 J/kg and 5e-9 J/kg)
 * and change the stagnation temperature by less than 2e-5 K and 5e-12 K. */
#define GC_TURBOJET_V_REST 0.2
#define GC_TURBOJET_V_REST_COLD 1e-4

/* ---- chain ------------------------------------------------------------------ */

typedef struct tj_plan {
    int generator;      /* 1: pass 1 (turbine isentropic to ambient, no nozzle) */
    double T5_K;        /* turbine end temperature (shaft balance) */
    double P9_Pa;       /* nozzle exit static pressure */
} tj_plan;

static void copy_field(char *dst, const char *src)
{
    snprintf(dst, GC_CYCLE_FIELD_LEN, "%s", src);
}

static void label(gc_step *s, const char *name)
{
    snprintf(s->label, sizeof s->label, "%s", name);
}

static gc_step *add_heat(gc_cycle *c, const gc_turbojet_input *in, double T_K, int ab)
{
    int fuel = in->heat_mode == GC_TURBOJET_FUEL;
    gc_step *s = gc__add_heat_step(
        c, T_K, ab ? "/afterburner_temperature" : "/turbine_inlet_temperature",
        ab ? in->afterburner_pressure_loss : in->combustor_pressure_loss,
        ab ? "/afterburner_pressure_loss" : "/combustor_pressure_loss",
        fuel ? &in->fuel : NULL, in->combustor_efficiency, in->fuel_temperature);
    if (s == NULL)
        return NULL;
    label(s, ab ? "afterburner" : "combustor");
    return s;
}

#define ADD(s, expr)                                                                    \
    do {                                                                                \
        (s) = (expr);                                                                   \
        if ((s) == NULL)                                                                \
            return gc_error_set(err, GC_ERR_INVALID, "", "turbojet chain too long");    \
    } while (0)

/* Station names of the main stations (state i is the end of step i - 1; a
 * state that is two stations keeps the first name and has the other as an
 * alias: at Mach 0 the diffuser exit is the free stream, with a full
 * recovery the compressor inlet is the diffuser exit). */
static void name_stations(gc_cycle *c, const gc_turbojet_stations *S)
{
    const struct { int i; const char *n; } sn[] = {
        { S->diffuser_exit, "diffuser_exit" }, { S->compressor_inlet, "compressor_inlet" },
        { S->compressor_exit, "compressor_exit" }, { S->turbine_inlet, "turbine_inlet" },
        { S->turbine_exit, "turbine_exit" }, { S->afterburner_exit, "afterburner_exit" },
        { S->nozzle_exit, "nozzle_exit" } };
    snprintf(c->start_station, sizeof c->start_station, "free_stream");
    for (size_t k = 0; k < sizeof sn / sizeof sn[0]; k++) {
        int i = sn[k].i;
        if (i > 0 && i <= c->n_steps && !c->steps[i - 1].station[0])
            snprintf(c->steps[i - 1].station, sizeof c->steps[i - 1].station, "%s", sn[k].n);
        else if (i >= 0 && i <= c->n_steps)
            gc_cycle_add_alias(c, sn[k].n, i - 1);
    }
}

static int build(const gc_turbojet_input *in, const gc_site *site, const gc_gas *gas,
                 double V0, const tj_plan *p, gc_cycle *c, gc_turbojet_stations *S,
                 gc_error *err)
{
    gc_step *s;
    gc_turbojet_stations st = { 0, 0, 0, -1, -1, -1, -1, -1 };
    gc_cycle_init(c, GC_FRAME_FLOW, gas, site->T_K, site->P_Pa);
    c->V_start_m_per_s = V0;
    c->T_dead_K = site->T_K;
    c->P_dead_Pa = site->P_Pa;
    if (V0 > 0.0) {
        double v_rest = gas->kind == GC_GAS_COLD ? GC_TURBOJET_V_REST_COLD : GC_TURBOJET_V_REST;
        ADD(s, gc_cycle_add(c, GC_PROC_COMPRESSION, GC_END_VELOCITY, v_rest,
                            "/flight_mach_number"));
        s->kinetic = 1;
        s->efficiency = in->diffuser_efficiency;
        copy_field(s->field_aux, "/diffuser_efficiency");
        label(s, "diffuser");
    }
    st.diffuser_exit = c->n_steps;
    if (in->inlet_pressure_recovery < 1.0) {
        ADD(s, gc_cycle_add(c, GC_PROC_PRESSURE_LOSS, GC_END_DEFAULT, 0.0,
                            "/inlet_pressure_recovery"));
        s->pressure_loss = 1.0 - in->inlet_pressure_recovery;
        label(s, "inlet recovery");
    }
    st.compressor_inlet = c->n_steps;
    ADD(s, gc_cycle_add(c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, in->pressure_ratio,
                        "/pressure_ratio"));
    s->efficiency = in->compressor_efficiency;
    s->polytropic_efficiency = in->polytropic_efficiency;
    copy_field(s->field_aux, "/compressor_efficiency");
    label(s, "compressor");
    st.compressor_exit = c->n_steps;
    ADD(s, add_heat(c, in, in->turbine_inlet_temperature, 0));
    st.turbine_inlet = c->n_steps;
    if (p->generator) {
        ADD(s, gc_cycle_add(c, GC_PROC_ISENTROPIC, GC_END_START_PRESSURE, 0.0,
                            "/turbine_inlet_temperature"));
        label(s, "expansion");
    } else {
        ADD(s, gc_cycle_add(c, GC_PROC_EXPANSION, GC_END_TEMPERATURE, p->T5_K,
                            "/turbine_inlet_temperature"));
        s->efficiency = in->turbine_efficiency;
        s->polytropic_efficiency = in->polytropic_efficiency;
        copy_field(s->field_aux, "/turbine_efficiency");
        label(s, "turbine");
        st.turbine_exit = c->n_steps;
        if (in->afterburner_temperature > 0.0) {
            ADD(s, add_heat(c, in, in->afterburner_temperature, 1));
            st.afterburner_exit = c->n_steps;
        }
        ADD(s, gc_cycle_add(c, GC_PROC_EXPANSION, GC_END_PRESSURE, p->P9_Pa, "/nozzle"));
        s->kinetic = 1;
        s->efficiency = in->nozzle_efficiency;
        copy_field(s->field_aux, "/nozzle_efficiency");
        label(s, "nozzle");
        st.nozzle_exit = c->n_steps;
        if (p->P9_Pa > site->P_Pa * (1.0 + 1e-12)) {
            /* the under-expanded jet's free expansion to ambient: a throttle to the
             * ambient pressure at any ratio (not a bounded fractional loss) */
            ADD(s, gc_cycle_add(c, GC_PROC_PRESSURE_LOSS, GC_END_PRESSURE, site->P_Pa,
                                "/nozzle"));
            label(s, "plume");
        }
    }
    ADD(s, gc_cycle_add(c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, "/pressure_ratio"));
    s->geometry = GC_GEOM_CONST_P;
    label(s, "back to free stream");
    name_stations(c, &st);
    if (S != NULL)
        *S = st;
    return GC_OK;
}

/* ---- nozzle ----------------------------------------------------------------- */

/* Critical (sonic-exit) static pressure of a nozzle fed by state `in` of gas
 * g with efficiency eta (see the top of this file). */
static int critical_pressure(const gc_gas *g, const gc_cycle_state *in, double eta,
                             double *P_crit, gc_error *err)
{
    const double R = g->R_J_per_kgK, T1 = in->T_K, h1 = in->h_J_per_kg;
    const double V1sq = in->V_m_per_s * in->V_m_per_s;
    double lo = fmax(g->T_min_K, 0.3 * T1), hi = T1;
    /* residual r(T) = V^2 - a^2, decreasing in T */
#define RES(T) (V1sq + 2.0 * (h1 - gc_gas_h_T(g, (T))) - gc_gas_k_T(g, (T)) * R * (T))
    if (!(RES(hi) < 0.0) || !(RES(lo) > 0.0))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_TF_NOZZLE, -1,
                           "the nozzle inlet state has no sonic point in the gas data range");
    double T = 0.5 * (lo + hi);
    for (int it = 0; it < 200; it++) {
        double r = RES(T);
        if (r > 0.0)
            lo = T;
        else
            hi = T;
        double d = -2.0 * gc_gas_cp_T(g, T) - gc_gas_k_T(g, T) * R; /* dk/dT neglected */
        double Tn = T - r / d;
        if (!(Tn > lo && Tn < hi))
            Tn = 0.5 * (lo + hi);
        if (fabs(Tn - T) <= 1e-13 * T || hi - lo <= 1e-13 * T) {
            T = Tn;
            break;
        }
        T = Tn;
    }
#undef RES
    double hs = h1 - (h1 - gc_gas_h_T(g, T)) / eta, Ts;
    int rc = gc_gas_T_from_h(g, hs, &Ts, err);
    if (rc != GC_OK)
        return rc;
    *P_crit = in->P_Pa * exp((gc_gas_s0_T(g, Ts) - gc_gas_s0_T(g, T1)) / R);
    return GC_OK;
}

/* ---- the passes ------------------------------------------------------------- */

typedef struct tj_out {
    gc_turbojet_stations st;
    double P_crit;
    int choked;
} tj_out;

static int refield(gc_error *err, int rc, int field, const char *msg)
{
    if (rc != GC_OK && err != NULL) {
        gc_error_at(err, rc, field, -1);
        if (msg != NULL)
            snprintf(err->message, sizeof err->message, "%s", msg);
    }
    return rc;
}

/* Runs the passes. full: the last pass is gc_cycle_evaluate into *res, else
 * gc_cycle_run_chain into *last. scratch: a run for the preliminary passes. */
static int solve(const gc_turbojet_input *in, const gc_site *site, const gc_gas *gas,
                 double V0, unsigned cycle_flags, int full, gc_cycle_result *res,
                 gc_cycle_run *last, gc_cycle_run *scratch, tj_out *o, gc_error *err)
{
    gc_cycle c;
    tj_plan p = { 1, 0.0, site->P_Pa };
    gc_turbojet_stations st;
    int rc = build(in, site, gas, V0, &p, &c, &st, err);
    if (rc != GC_OK)
        return rc;
    c.flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
    rc = gc_cycle_run_chain(&c, scratch, err);
    if (rc != GC_OK)
        return rc;
    /* shaft balance */
    double w_c = 0.0;
    for (int k = 0; k < scratch->n_processes; k++)
        if (scratch->processes[k].kind == GC_PROC_COMPRESSION)
            w_c -= scratch->processes[k].work;
    const gc_cycle_state *s4 = &scratch->states[st.turbine_inlet];
    double h5 = s4->h_J_per_kg - w_c / (in->mechanical_efficiency * s4->mass_ratio);
    rc = gc_gas_T_from_h(&scratch->gases[s4->gas], h5, &p.T5_K, err);
    if (rc != GC_OK)
        return refield(err, GC_ERR_INFEASIBLE, GC_TF_TURBINE_INLET_TEMPERATURE,
                       "the turbine cannot deliver the compressor's work at this turbine "
                       "inlet temperature: raise it or lower the pressure ratio");
    p.generator = 0;
    rc = build(in, site, gas, V0, &p, &c, &st, err);
    if (rc != GC_OK)
        return rc;
    o->P_crit = 0.0;
    o->choked = 0;
    int need_pass3 = in->nozzle == GC_NOZZLE_CONVERGENT;
    c.flags = cycle_flags;
    if (need_pass3 || !full) {
        gc_cycle_run *run = need_pass3 ? scratch : last;
        gc_cycle ccopy = c;
        ccopy.flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
        if (!need_pass3)
            ccopy.flags = cycle_flags | GC_CYCLE_NO_BOUNDS;
        rc = gc_cycle_run_chain(&ccopy, run, err);
    } else {
        rc = gc_cycle_evaluate(&c, res, err);
    }
    if (rc != GC_OK) {
        if (err != NULL && strcmp(err->field, "/nozzle") == 0)
            return refield(err, GC_ERR_INFEASIBLE, GC_TF_PRESSURE_RATIO,
                           "the turbine leaves the gas below the ambient pressure: nothing "
                           "is left for the nozzle (raise the turbine inlet temperature or "
                           "the component efficiencies)");
        return rc;
    }
    if (need_pass3) {
        const gc_cycle_state *sn = &scratch->states[st.nozzle_exit - 1];
        rc = critical_pressure(&scratch->gases[sn->gas], sn, in->nozzle_efficiency, &o->P_crit,
                               err);
        if (rc != GC_OK)
            return rc;
        if (o->P_crit > site->P_Pa) {
            o->choked = 1;
            p.P9_Pa = o->P_crit;
            rc = build(in, site, gas, V0, &p, &c, &st, err);
            if (rc != GC_OK)
                return rc;
        }
        c.flags = cycle_flags;
        if (full) {
            rc = gc_cycle_evaluate(&c, res, err);
        } else {
            c.flags = cycle_flags | GC_CYCLE_NO_BOUNDS;
            rc = gc_cycle_run_chain(&c, last, err);
        }
        if (rc != GC_OK)
            return rc;
    }
    o->st = st;
    return GC_OK;
}

/* ---- figures ---------------------------------------------------------------- */

typedef struct tj_figs {
    double F, f, q_in, eta_th, eta_p, eta_o, V9, Veff, A9, Fp, w_c, w_t;
} tj_figs;

static void figures(const gc_turbojet_input *in, const gc_site *site, double V0,
                    const gc_cycle_run *run, const gc_turbojet_stations *st, tj_figs *F)
{
    memset(F, 0, sizeof *F);
    const gc_cycle_state *s9 = &run->states[st->nozzle_exit];
    double m9 = s9->mass_ratio, P0 = site->P_Pa;
    F->f = in->heat_mode == GC_TURBOJET_FUEL ? run->summary.fuel_air_ratio : 0.0;
    F->V9 = s9->V_m_per_s;
    F->A9 = F->V9 > 0.0 ? m9 * s9->v_m3_per_kg / F->V9 : 0.0;
    F->Fp = (s9->P_Pa - P0) * F->A9;
    F->F = m9 * F->V9 - V0 + F->Fp;
    F->Veff = F->V9 + (F->V9 > 0.0 ? (s9->P_Pa - P0) * s9->v_m3_per_kg / F->V9 : 0.0);
    F->q_in = in->heat_mode == GC_TURBOJET_FUEL ? F->f * in->fuel.LHV_J_per_kg
                                                : run->summary.heat_in;
    double dke = 0.5 * m9 * F->Veff * F->Veff - 0.5 * V0 * V0;
    F->eta_th = F->q_in > 0.0 ? dke / F->q_in : 0.0;
    F->eta_p = (dke > 0.0 && V0 > 0.0) ? F->F * V0 / dke : 0.0;
    F->eta_o = F->q_in > 0.0 ? F->F * V0 / F->q_in : 0.0;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *pr = &run->processes[k];
        if (pr->kind == GC_PROC_COMPRESSION)
            F->w_c -= pr->work;
        else if (pr->kind == GC_PROC_EXPANSION)
            F->w_t += pr->work;
    }
}

/* A warning of the preset's own (code "model"). */
static void warn(gc_turbojet_result *r, int field, const char *msg)
{
    if (r->n_warnings >= GC_TURBOJET_MAX_WARNINGS)
        return;
    gc_warning *w = &r->warnings[r->n_warnings++];
    w->code = "model";
    w->field = field;
    w->index[0] = w->index[1] = -1;
    snprintf(w->message, sizeof w->message, "%s", msg);
}

static int is_ideal(const gc_turbojet_input *in)
{
    return in->inlet_pressure_recovery == 1.0 && in->diffuser_efficiency == 1.0 &&
           in->compressor_efficiency == 1.0 && in->turbine_efficiency == 1.0 &&
           in->nozzle_efficiency == 1.0 && in->combustor_efficiency == 1.0 &&
           in->mechanical_efficiency == 1.0 && in->combustor_pressure_loss == 0.0 &&
           (in->afterburner_temperature == 0.0 || in->afterburner_pressure_loss == 0.0) &&
           in->nozzle == GC_NOZZLE_EXPANDED;
}

/* The flight condition: the site resolved (dry air unless told; `altitude`
 * as the site's), its errors by field id. */
static int flight(const gc_turbojet_input *in, gc_turbojet_result *r, gc_error *err)
{
    gc_site_input si = in->site;
    if (in->has_altitude) {
        si.has_altitude = 1;
        si.altitude_m = in->altitude;
    }
    if (!si.has_relative_humidity) {
        si.has_relative_humidity = 1; /* flight: dry air unless told */
        si.RH = 0.0;
    }
    int rc = gc_site_resolve(&si, &r->site, err);
    if (rc != GC_OK) {
        int m = err && (unsigned)err->field_id < 5u ? err->field_id : 0;
        int field = in->has_altitude && m == GC_SITE_M_ALTITUDE ? GC_TF_ALTITUDE
                                                              : gc__turbojet_site_field[m];
        return gc_error_at(err, rc, field, -1);
    }
    return GC_OK;
}

/* The ideal turbojet at the same flight condition (turbojet.h), into
 * r->cycle.ideal and the ideal figures; left out when it cannot run. */
static void ideal_engine(const gc_turbojet_input *in, const gc_gas *gas, double V0,
                         unsigned cflags, gc_cycle_run *scratch, gc_turbojet_result *r)
{
    gc_turbojet_input id = *in;
    id.inlet_pressure_recovery = 1.0;
    id.diffuser_efficiency = id.compressor_efficiency = id.turbine_efficiency = 1.0;
    id.nozzle_efficiency = id.combustor_efficiency = id.mechanical_efficiency = 1.0;
    id.combustor_pressure_loss = id.afterburner_pressure_loss = 0.0;
    id.nozzle = GC_NOZZLE_EXPANDED;
    tj_out oi;
    if (solve(&id, &r->site, gas, V0, cflags, 0, NULL, &r->cycle.ideal, scratch, &oi,
              NULL) == GC_OK) {
        tj_figs Fi;
        figures(&id, &r->site, V0, &r->cycle.ideal, &oi.st, &Fi);
        r->ideal_specific_thrust = Fi.F;
        r->ideal_thermal_efficiency = Fi.eta_th;
        r->has_ideal_figures = Fi.F > 0.0;
        r->cycle.has_ideal = 1;
        r->cycle.ideal_is_actual = is_ideal(in);
    }
}

/* The preset's own warnings: the site's, a cooled turbine, no thrust. */
static void add_warnings(const gc_turbojet_input *in, double thrust, gc_turbojet_result *r)
{
    for (int i = 0; i < r->site.n_warnings; i++) {
        int m = (unsigned)r->site.warnings[i].member < 5u ? r->site.warnings[i].member : 0;
        warn(r, in->has_altitude && m == GC_SITE_M_ALTITUDE ? GC_TF_ALTITUDE
                                                          : gc__turbojet_site_field[m],
             r->site.warnings[i].message);
    }
    if (in->turbine_inlet_temperature > TIT_COOLED_K)
        warn(r, GC_TF_TURBINE_INLET_TEMPERATURE,
             "a turbine inlet temperature above about 1500 K needs cooled turbine blades "
             "(common practice); no cooling air is bled here, so the figures are optimistic");
    if (!(thrust > 0.0))
        warn(r, GC_TF_PRESSURE_RATIO, "the engine gives no positive thrust at this flight "
                                      "condition");
}

int gc__turbojet_evaluate(const gc_turbojet_input *in, gc_turbojet_result *r, gc_error *err)
{
    int rc;
    memset(r, 0, sizeof *r);
    rc = flight(in, r, err);
    if (rc != GC_OK)
        return rc;
    const gc_gas *gas = in->has_gas ? &in->gas : &r->site.gas;
    rc = gc_gas_check_T(gas, r->site.T_K, "/site/temperature", err);
    if (rc != GC_OK)
        return gc_error_at(err, rc, GC_TF_SITE_TEMPERATURE, -1);
    double a0 = sqrt(gc_gas_k_T(gas, r->site.T_K) * gas->R_J_per_kgK * r->site.T_K);
    double V0 = in->flight_mach_number * a0;
    r->speed_of_sound = a0;
    r->flight_velocity = V0;

    gc_cycle_run scratch;
    tj_out o;
    unsigned cflags = (in->flags & GC_TURBOJET_NO_AREAS) ? GC_CYCLE_NO_AREAS : 0u;
    rc = solve(in, &r->site, gas, V0, cflags | GC_CYCLE_NO_BOUNDS, 1, &r->cycle, NULL,
               &scratch, &o, err);
    if (rc != GC_OK)
        return rc;
    r->stations = o.st;
    r->has_fuel = in->heat_mode == GC_TURBOJET_FUEL;
    const gc_cycle_run *run = &r->cycle.actual;
    tj_figs F;
    figures(in, &r->site, V0, run, &o.st, &F);
    r->specific_thrust = F.F;
    r->fuel_air_ratio = F.f;
    if (r->has_fuel) {
        const gc_cycle_state *a = &run->states[o.st.compressor_exit];
        const gc_cycle_state *b = &run->states[o.st.turbine_inlet];
        r->fuel_air_ratio_main = (b->mass_ratio - a->mass_ratio) / a->mass_ratio;
        if (F.F > 0.0) {
            r->tsfc = F.f / F.F;
            r->tsfc_mg_per_Ns = 1e6 * r->tsfc;
        }
    }
    r->heat_in = F.q_in;
    r->thermal_efficiency = F.eta_th;
    r->propulsive_efficiency = F.eta_p;
    r->overall_efficiency = F.eta_o;
    r->compressor_work = F.w_c;
    r->turbine_work = F.w_t;
    const gc_cycle_state *s9 = &run->states[o.st.nozzle_exit];
    const gc_gas *g9 = &run->gases[s9->gas];
    r->exit_velocity = F.V9;
    r->effective_exit_velocity = F.Veff;
    r->exit_pressure = s9->P_Pa;
    r->exit_temperature = s9->T_K;
    r->exit_mach_number = F.V9 / sqrt(gc_gas_k_T(g9, s9->T_K) * g9->R_J_per_kgK * s9->T_K);
    r->critical_pressure = o.P_crit;
    r->choked = o.choked;
    r->convergent = in->nozzle == GC_NOZZLE_CONVERGENT;
    r->exit_area_per_air_flow = F.A9;
    r->pressure_thrust = F.Fp;

    if (!(in->flags & GC_TURBOJET_NO_IDEAL))
        ideal_engine(in, gas, V0, cflags, &scratch, r);
    add_warnings(in, F.F, r);
    return GC_OK;
}
