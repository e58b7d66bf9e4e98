/*
 * steam_turbine.c — the water and steam side of the bottoming cycle
 * (gascycle/steam.h) outside the HRSG: condensate and feedwater (condenser,
 * condensate pump, deaerator, feed pumps), the states each level's
 * economiser, drum and superheater produce, reheat, and the expansion path
 * through the turbine sections with admission mixing, the deaerator bleed
 * and the condenser.
 *
 * Models: an expansion of isentropic efficiency eta ends at
 * h = h_in - eta (h_in - h(P_out, s_in)); a pump of efficiency eta at
 * h = h_in + (h(P_out, s_in) - h_in) / eta (both by IF97 (P, s) and (P, h));
 * mixing is adiabatic at constant pressure; the deaerator gives saturated
 * liquid from the condensate and the bleed: beta = m_bleed / m_feed =
 * (h'(P_da) - h_condensate) / (h_bleed - h_condensate); the condenser gives
 * saturated liquid at its pressure.
 * Units: SI base units.
 */
#include "core/steam_private.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

int gc__steam_expand(double P_out, const gc_if97_state *in, double eta, gc_if97_state *out,
                     const char *field, gc_error *err)
{
    gc_if97_state is;
    int rc = gc_if97_state_Ps(P_out, in->s_J_per_kgK, &is, err);
    if (rc == GC_OK)
        rc = gc_if97_state_Ph(P_out, in->h_J_per_kg - eta * (in->h_J_per_kg - is.h_J_per_kg), out,
                              err);
    if (rc != GC_OK && err)
        snprintf(err->field, sizeof err->field, "%s", field);
    return rc;
}

int gc__steam_pump(double P_out, const gc_if97_state *in, double eta, gc_if97_state *out,
                   const char *field, gc_error *err)
{
    gc_if97_state is;
    int rc = gc_if97_state_Ps(P_out, in->s_J_per_kgK, &is, err);
    if (rc == GC_OK)
        rc = gc_if97_state_Ph(P_out, in->h_J_per_kg + (is.h_J_per_kg - in->h_J_per_kg) / eta, out,
                              err);
    if (rc != GC_OK && err)
        snprintf(err->field, sizeof err->field, "%s", field);
    return rc;
}

/* Condensate, condensate pump and deaerator; each level's feed pump exit. */
int gc__steam_feed_states(sc_work *w)
{
    const gc_steam_input *in = w->in;
    int rc = gc_if97_state_Px(w->P_cond, 0.0, &w->cond, w->err);
    if (rc != GC_OK)
        return rc;
    const gc_if97_state *src = &w->cond;
    if (in->deaerator) {
        rc = gc__steam_pump(in->deaerator_pressure_Pa, &w->cond, in->pump_efficiency, &w->cpump,
                            "/pump_efficiency", w->err);
        if (rc == GC_OK)
            rc = gc_if97_state_Px(in->deaerator_pressure_Pa, 0.0, &w->da, w->err);
        if (rc != GC_OK)
            return rc;
        src = &w->da;
    }
    for (int i = 0; i < w->n; i++) {
        char f[GC_ERROR_FIELD_LEN];
        snprintf(f, sizeof f, "/levels/%d/pressure", i);
        rc = gc__steam_pump(w->lv[i].P, src, in->pump_efficiency, &w->lv[i].fw, f, w->err);
        if (rc != GC_OK)
            return rc;
    }
    return GC_OK;
}

/* Economiser exit (Ts - approach, or saturated liquid), saturated vapour and
 * superheater exit of each level. */
int gc__steam_level_states(sc_work *w)
{
    for (int i = 0; i < w->n; i++) {
        const gc_steam_level_input *li = &w->in->levels[i];
        sc_level *L = &w->lv[i];
        gc_if97_state liq;
        char f[GC_ERROR_FIELD_LEN];
        int rc = gc_if97_sat_P(L->P, &liq, &L->sat, w->err);
        if (rc != GC_OK)
            return rc;
        L->Ts = L->sat.T_K;
        if (li->approach_K > 0.0)
            rc = gc_if97_state_TP(L->Ts - li->approach_K, L->P, &L->eco, w->err);
        else
            L->eco = liq;
        L->approach = L->Ts - L->eco.T_K;
        L->superheated = li->steam_temperature_K > 0.0;
        if (rc == GC_OK && L->superheated)
            rc = gc_if97_state_TP(li->steam_temperature_K, L->P, &L->sh, w->err);
        else if (rc == GC_OK)
            L->sh = L->sat;
        if (rc != GC_OK)
            return rc;
        if (!(L->fw.T_K < L->eco.T_K)) {
            snprintf(f, sizeof f, "/levels/%d/approach", i);
            return gc_error_set(w->err, GC_ERR_INFEASIBLE, f,
                                "the %s feedwater arrives at %.2f K, not below the economiser "
                                "exit temperature %.2f K (saturation %.2f K minus approach)",
                                L->name, L->fw.T_K, L->eco.T_K, L->Ts);
        }
        if (L->superheated && !(L->sh.T_K > L->Ts)) {
            snprintf(f, sizeof f, "/levels/%d/steam_temperature", i);
            return gc_error_set(w->err, GC_ERR_INVALID, f,
                                "must be above the %s saturation temperature %.2f K", L->name,
                                L->Ts);
        }
    }
    return GC_OK;
}

/* The turbine sections: inlet and outlet pressure of section k; -1 past the
 * last. Section 0 starts at level 0; with reheat and one level section 1
 * starts at the reheat pressure; otherwise section k starts at level k. */
static int n_sections(const sc_work *w)
{
    return w->n + ((w->n == 1 && w->reheat) ? 1 : 0);
}

static double section_P_in(const sc_work *w, int k)
{
    return k < w->n ? w->lv[k].P : w->P_rh;
}

static double section_P_out(const sc_work *w, int k)
{
    return k + 1 < n_sections(w) ? section_P_in(w, k + 1) : w->P_cond;
}

static const char *section_name(const sc_work *w, int k)
{
    return k < w->n ? w->lv[k].name : "lp";
}

/* The section holding the deaerator bleed: P_out <= P_da < P_in; -1 none. */
static int bleed_section(const sc_work *w)
{
    if (!w->in->deaerator)
        return -1;
    double P = w->in->deaerator_pressure_Pa;
    for (int k = 0; k < n_sections(w); k++)
        if (section_P_out(w, k) <= P && P < section_P_in(w, k))
            return k;
    return -1;
}

/* beta = bleed per kg of feedwater for a bleed of enthalpy h_b. */
static int bleed_fraction(sc_work *w, double h_b, double *beta)
{
    double hc = w->cpump.h_J_per_kg, hd = w->da.h_J_per_kg;
    if (!(h_b > hd))
        return gc_error_set(w->err, GC_ERR_INFEASIBLE, "/deaerator_pressure",
                            "the turbine bleed at the deaerator pressure (h = %.1f kJ/kg) "
                            "cannot heat the feedwater to saturation (h' = %.1f kJ/kg)",
                            h_b / 1e3, hd / 1e3);
    *beta = (hd - hc) / (h_b - hc);
    return GC_OK;
}

/* Cold and hot reheat states and the reheat flow per kg of level-0 steam
 * (less the bleed when it is taken before the reheater: one level only; the
 * bleed then splits the expansion to the cold reheat in two, as on the
 * path below). */
int gc__steam_reheat_states(sc_work *w)
{
    w->rh_flow_per_m0 = 1.0;
    w->beta0 = 0.0;
    if (!w->reheat)
        return GC_OK;
    const gc_steam_input *in = w->in;
    double eta = in->turbine_efficiency;
    gc_if97_state from = w->lv[0].sh;
    int rc = GC_OK;
    if (bleed_section(w) == 0) {
        rc = gc__steam_expand(in->deaerator_pressure_Pa, &w->lv[0].sh, eta, &from,
                              "/deaerator_pressure", w->err);
        if (rc == GC_OK)
            rc = bleed_fraction(w, from.h_J_per_kg, &w->beta0);
        w->rh_flow_per_m0 = 1.0 - w->beta0;
    }
    if (rc == GC_OK && w->P_rh < from.P_Pa)
        rc = gc__steam_expand(w->P_rh, &from, eta, &w->crh, "/reheat_pressure", w->err);
    else if (rc == GC_OK)
        w->crh = from;   /* the bleed at the reheat pressure itself */
    if (rc == GC_OK)
        rc = gc_if97_state_TP(in->reheat_temperature_K, w->P_rh, &w->hrh, w->err);
    if (rc != GC_OK)
        return rc;
    if (!(w->hrh.h_J_per_kg > w->crh.h_J_per_kg))
        return gc_error_set(w->err, GC_ERR_INVALID, "/reheat_temperature",
                            "must be above the cold reheat temperature %.2f K", w->crh.T_K);
    return GC_OK;
}

/* ---- the expansion path with flows ------------------------------------ */

typedef struct path {
    gc_if97_state st;          /* current steam state */
    double m;                  /* current flow, kg/s */
    int station;               /* its station index (-1 when not recorded) */
} path;

static void note_quality(sc_work *w, const gc_if97_state *st, const char *where)
{
    if (st->x >= 0.0 && st->x < 1.0 && (w->x_min < 0.0 || st->x < w->x_min)) {
        w->x_min = st->x;
        snprintf(w->x_min_where, sizeof w->x_min_where, "%s", where);
    }
}

/* One expansion of the path to P_out (nothing when P_out = P). */
static int expand_to(sc_work *w, path *p, double P_out, double *work, double *ds,
                     const char *where)
{
    gc_if97_state out;
    if (!(P_out < p->st.P_Pa)) {
        *work = 0.0;
        *ds = 0.0;
        return GC_OK;
    }
    int rc = gc__steam_expand(P_out, &p->st, w->in->turbine_efficiency, &out,
                              "/turbine_efficiency", w->err);
    if (rc != GC_OK)
        return rc;
    *work = p->m * (p->st.h_J_per_kg - out.h_J_per_kg);
    *ds = p->m * (out.s_J_per_kgK - p->st.s_J_per_kgK);
    note_quality(w, &out, where);
    p->st = out;
    return GC_OK;
}

/* Level k's steam joins the path at its pressure (admission mixing). */
static int admit(sc_work *w, path *p, int k)
{
    const sc_level *L = &w->lv[k];
    double m = p->m + L->m;
    double h = (p->m * p->st.h_J_per_kg + L->m * L->sh.h_J_per_kg) / m;
    gc_if97_state mix;
    char f[GC_ERROR_FIELD_LEN], name[GC_STEAM_NAME_LEN];
    snprintf(f, sizeof f, "/levels/%d/pressure", k);
    int rc = gc_if97_state_Ph(L->P, h, &mix, w->err);
    if (rc != GC_OK) {
        if (w->err)
            snprintf(w->err->field, sizeof w->err->field, "%s", f);
        return rc;
    }
    double s_gen = m * mix.s_J_per_kgK - p->m * p->st.s_J_per_kgK - L->m * L->sh.s_J_per_kgK;
    snprintf(name, sizeof name, "%s_admission", L->name);
    int to = gc__steam_add_water(w, name, &mix, m);
    gc__steam_add_process(w, name, GC_STEAM_MIXING, p->station, to, m, 0.0, 0.0, s_gen);
    p->st = mix;
    p->m = m;
    p->station = to;
    return GC_OK;
}

/* Section k from the path's state to its outlet pressure, with the bleed if
 * it lies in this section. */
static int section(sc_work *w, path *p, int k)
{
    double work, ds, work2 = 0.0, ds2 = 0.0, P_out = section_P_out(w, k);
    char name[GC_STEAM_NAME_LEN], exit_name[GC_STEAM_NAME_LEN];
    int from = p->station, rc;
    double m_in = p->m;
    snprintf(name, sizeof name, "%s_turbine", section_name(w, k));
    if (bleed_section(w) == k) {
        rc = expand_to(w, p, w->in->deaerator_pressure_Pa, &work, &ds, "bleed");
        double beta = 0.0;
        if (rc == GC_OK)
            rc = bleed_fraction(w, p->st.h_J_per_kg, &beta);
        if (rc != GC_OK)
            return rc;
        w->m_bleed = beta * w->m_fw;
        w->bleed = p->st;
        gc__steam_add_water(w, "bleed", &p->st, w->m_bleed);
        w->r->summary.bleed_mass_flow_kg_per_s = w->m_bleed;
        p->m -= w->m_bleed;
        rc = expand_to(w, p, P_out, &work2, &ds2, name);
    } else {
        rc = expand_to(w, p, P_out, &work, &ds, name);
    }
    if (rc != GC_OK)
        return rc;
    int last = k + 1 == n_sections(w);
    if (last)
        snprintf(exit_name, sizeof exit_name, "turbine_exhaust");
    else if (k == 0 && w->reheat)
        snprintf(exit_name, sizeof exit_name, "cold_reheat");
    else
        snprintf(exit_name, sizeof exit_name, "%s_turbine_exit", section_name(w, k));
    p->station = gc__steam_add_water(w, exit_name, &p->st, p->m);
    gc__steam_add_process(w, name, GC_STEAM_TURBINE, from, p->station, m_in, work + work2, 0.0,
                          ds + ds2);
    w->W_turb += work + work2;
    return GC_OK;
}

/* The reheater's steam side on the path (its heat is booked by the HRSG). */
static int reheat(sc_work *w, path *p)
{
    p->st = w->hrh;
    p->station = gc__steam_add_water(w, "hot_reheat", &w->hrh, p->m);
    return GC_OK;
}

/* Condenser: the exhaust to saturated liquid; heat leaves at T0, or at the
 * condensing temperature if that is lower (the boundary convention of
 * cycle.h). */
static void condenser(sc_work *w, const path *p)
{
    double T0 = w->in->dead_state_temperature_K;
    double Tb = w->T_cond < T0 ? w->T_cond : T0;
    w->m_cond = p->m;
    w->h_exhaust = p->st.h_J_per_kg;
    w->x_exhaust = p->st.x;
    w->Q_cond = p->m * (p->st.h_J_per_kg - w->cond.h_J_per_kg);
    double s_gen = p->m * (w->cond.s_J_per_kgK - p->st.s_J_per_kgK) + w->Q_cond / Tb;
    int to = gc__steam_add_water(w, "condensate", &w->cond, p->m);
    gc__steam_add_process(w, "condenser", GC_STEAM_CONDENSER, p->station, to, p->m, 0.0,
                          w->Q_cond, s_gen);
}

/* Pumps and the deaerator, once the flows are known. */
static void feed_system(sc_work *w)
{
    const gc_steam_input *in = w->in;
    int src = gc_steam_station_index(w->r, "condensate");
    if (in->deaerator) {
        double wp = w->m_cond * (w->cpump.h_J_per_kg - w->cond.h_J_per_kg);
        double sg = w->m_cond * (w->cpump.s_J_per_kgK - w->cond.s_J_per_kgK);
        int cp = gc__steam_add_water(w, "condensate_pump_exit", &w->cpump, w->m_cond);
        gc__steam_add_process(w, "condensate_pump", GC_STEAM_PUMP, src, cp, w->m_cond, wp, 0.0,
                              sg);
        w->W_pump += wp;
        src = gc__steam_add_water(w, "deaerator_exit", &w->da, w->m_fw);
    }
    const gc_if97_state *s = in->deaerator ? &w->da : &w->cond;
    for (int i = 0; i < w->n; i++) {
        sc_level *L = &w->lv[i];
        char name[GC_STEAM_NAME_LEN];
        double wp = L->m * (L->fw.h_J_per_kg - s->h_J_per_kg);
        double sg = L->m * (L->fw.s_J_per_kgK - s->s_J_per_kgK);
        snprintf(name, sizeof name, "%s_feedwater", L->name);
        int to = gc_steam_station_index(w->r, name);   /* recorded with the HRSG */
        snprintf(name, sizeof name, "%s_feed_pump", L->name);
        gc__steam_add_process(w, name, GC_STEAM_PUMP, src, to, L->m, wp, 0.0, sg);
        w->W_pump += wp;
    }
}

/* Deaerator mixing: m_bleed s_b + m_cond s_cp -> m_fw s_da (adiabatic). */
static void deaerator(sc_work *w)
{
    double sg = w->m_fw * w->da.s_J_per_kgK - w->m_bleed * w->bleed.s_J_per_kgK -
                w->m_cond * w->cpump.s_J_per_kgK;
    int cp = gc_steam_station_index(w->r, "condensate_pump_exit");
    int da = gc_steam_station_index(w->r, "deaerator_exit");
    gc__steam_add_process(w, "deaerator", GC_STEAM_DEAERATOR, cp, da, w->m_fw, 0.0, 0.0, sg);
}

int gc__steam_turbine_path(sc_work *w)
{
    path p = { w->lv[0].sh, w->lv[0].m, gc_steam_station_index(w->r, "hp_steam") };
    int rc = GC_OK;
    w->m_fw = 0.0;
    for (int i = 0; i < w->n; i++)
        w->m_fw += w->lv[i].m;
    w->m_bleed = 0.0;
    w->x_min = -1.0;
    for (int k = 0; k < n_sections(w) && rc == GC_OK; k++) {
        if (k > 0 && k < w->n)
            rc = admit(w, &p, k);
        if (rc == GC_OK)
            rc = section(w, &p, k);
        if (rc == GC_OK && k == 0 && w->reheat)
            rc = reheat(w, &p);
    }
    if (rc != GC_OK)
        return rc;
    condenser(w, &p);
    feed_system(w);
    if (w->in->deaerator)
        deaerator(w);
    return GC_OK;
}
