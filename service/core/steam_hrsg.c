/*
 * steam_hrsg.c — the gas side of the bottoming cycle (gascycle/steam.h):
 * the duct burner (combustion.h) and the HRSG's sections in series along the
 * gas path, each level designed by pinch and approach or by a fixed steam
 * flow, and the T-Q diagram data.
 *
 * Level design by pinch (per level, gas entering at h_g,in):
 *   T_p = Tsat + pinch, m = m_gas (h_g,in - h_g(T_p)) /
 *         [(h_steam - h_eco) + r (h_hot_reheat - h_cold_reheat)]
 * (r = reheat flow per kg of level-0 steam, level 0 with reheat only), then
 * the superheater (and reheater), evaporator and economiser duties from the
 * water side and each section's gas exit from h_g,out = h_g,in - Q / m_gas.
 * With a fixed flow the same duties give the gas temperatures and the pinch.
 * Feasibility: the gas must be hotter than the water at both ends of every
 * section, and on the sampled T-Q lines (GC_STEAM_TQ_PER_ZONE points per
 * section, water temperatures by IF97 (P, h), gas by gas.h T from h).
 * Gas pressure: falls linearly with the heat taken, by gas_pressure_loss of
 * the inlet pressure over the whole HRSG.
 * Units: SI base units; gas enthalpies absolute (gas.h).
 */
#include "core/steam_private.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* ---- duct burner ------------------------------------------------------- */

int gc__steam_burner(sc_work *w)
{
    const gc_steam_input *in = w->in;
    w->gas = in->gas;
    w->m_gas_in = in->intake_mass_flow_kg_per_s * in->exhaust_mass_ratio;
    w->m_gas = w->m_gas_in;
    w->T_exh = in->gas_temperature_K;
    w->T_hrsg = w->T_exh;
    w->P_gas = in->gas_pressure_Pa;
    w->h_exh_abs = gc_gas_h_T(&in->gas, w->T_exh);
    w->m_fuel = w->fuel_heat = w->burner_loss = w->h_fuel = 0.0;
    int inlet = gc__steam_add_gas(w, &in->gas, "gas_inlet", w->T_exh, w->P_gas, w->m_gas_in);
    if (!(in->firing_temperature_K > 0.0)) {
        w->h_hrsg_abs = w->h_exh_abs;
        return GC_OK;
    }
    double T_fuel = in->fuel_temperature_K > 0.0 ? in->fuel_temperature_K : GC_T_REF_K;
    gc_burn b;
    int rc = gc_combustion_burn_to_T(&in->fuel, T_fuel, &in->gas, w->T_exh, w->m_gas_in,
                                     in->firing_temperature_K, in->burner_efficiency, &b, w->err);
    if (rc == GC_OK)
        rc = gc_fuel_h_T(&in->fuel, T_fuel, &w->h_fuel, w->err);
    if (rc != GC_OK) {
        if (w->err)
            snprintf(w->err->field, sizeof w->err->field, "/firing_temperature");
        return rc;
    }
    w->gas = b.products;
    w->m_gas = b.m_out_kg;
    w->m_fuel = b.m_fuel_kg;
    w->T_hrsg = b.T_out_K;
    w->h_hrsg_abs = b.h_out_J_per_kg;
    w->fuel_heat = w->m_fuel * in->fuel.LHV_J_per_kg;
    w->burner_loss = (1.0 - in->burner_efficiency) * w->fuel_heat;
    int out = gc__steam_add_gas(w, &w->gas, "burner_exit", w->T_hrsg, w->P_gas, w->m_gas);
    double s_gen = 0.0;
    if (in->fuel.kind == GC_FUEL_GAS) {   /* liquid fuels: no entropy data (warned) */
        double T0 = in->dead_state_temperature_K;
        s_gen = w->m_gas * gc_gas_s_TP(&w->gas, w->T_hrsg, w->P_gas) -
                w->m_gas_in * gc_gas_s_TP(&in->gas, w->T_exh, w->P_gas) -
                w->m_fuel * gc_gas_s_TP(&in->fuel.gas, T_fuel, w->P_gas) + w->burner_loss / T0;
    } else {
        gc__steam_warn(w, "burner_exergy_not_evaluated", "/fuel",
                       "the duct burner's entropy generation is not evaluated for a liquid fuel "
                       "(no entropy data): its exergy destruction is reported as 0");
    }
    gc__steam_add_process(w, "duct_burner", GC_STEAM_DUCT_BURNER, inlet, out, w->m_gas_in, 0.0,
                          w->fuel_heat, s_gen);
    return GC_OK;
}

/* ---- sections ---------------------------------------------------------- */

static const char *field_level(char *buf, size_t n, int i, const char *key)
{
    snprintf(buf, n, "/levels/%d/%s", i, key);
    return buf;
}

/* Gas temperature at absolute enthalpy h. */
static int gas_T(sc_work *w, double h, double *T)
{
    int rc = gc_gas_T_from_h(&w->gas, h, T, w->err);
    if (rc != GC_OK && w->err)
        snprintf(w->err->field, sizeof w->err->field, "/gas_temperature");
    return rc;
}

/* Appends a section fed by the gas at (hg_in, Tg_in). */
static int add_zone(sc_work *w, int level, double hg_in, double Tg_in, sc_zone **out)
{
    if (w->nz >= GC_STEAM_MAX_ZONES)
        return gc_error_set(w->err, GC_ERR_INVALID, "/levels", "too many HRSG sections");
    sc_zone *z = &w->z[w->nz++];
    memset(z, 0, sizeof *z);
    for (int j = 0; j < SC_STREAMS; j++)
        z->proc[j] = -1;
    z->dT_min = INFINITY;
    z->level = level;
    z->hg_in = hg_in;
    z->Tg_in = Tg_in;
    *out = z;
    return GC_OK;
}

static void zone_stream(sc_zone *z, int kind, const char *name, const char *st_in,
                        const char *st_out, double m, const gc_if97_state *a,
                        const gc_if97_state *b)
{
    int j = z->n_streams++;
    z->kind[j] = kind;
    z->lvl[j] = z->level;
    snprintf(z->name[j], sizeof z->name[j], "%s", name);
    snprintf(z->st_in[j], sizeof z->st_in[j], "%s", st_in);
    snprintf(z->st_out[j], sizeof z->st_out[j], "%s", st_out);
    z->m[j] = m;
    z->w_in[j] = *a;
    z->w_out[j] = *b;
    z->Q[j] = m * (b->h_J_per_kg - a->h_J_per_kg);
    z->Q_total += z->Q[j];
}

/* Closes a section: its gas exit from its duty; the gas is hotter than every
 * stream at both ends (counterflow: the gas inlet faces the water outlet). */
static int zone_close(sc_work *w, sc_zone *z, double *hg, double *Tg, const char *field)
{
    char f[GC_ERROR_FIELD_LEN];
    z->hg_out = z->hg_in - z->Q_total / w->m_gas;
    if (gc_gas_T_from_h(&w->gas, z->hg_out, &z->Tg_out, NULL) != GC_OK)
        return gc_error_set(w->err, GC_ERR_INFEASIBLE,
                            field ? field : field_level(f, sizeof f, z->level, "steam_mass_flow"),
                            "the %s would cool the gas below the range of its data: far more "
                            "heat than the gas carries", z->name[0]);
    for (int j = 0; j < z->n_streams; j++) {
        double hot = z->Tg_in - z->w_out[j].T_K, cold = z->Tg_out - z->w_in[j].T_K;
        z->dT_min = fmin(z->dT_min, fmin(hot, cold));
        if (field && (!(hot > 0.0) || !(cold > 0.0)))
            return gc_error_set(w->err, GC_ERR_INFEASIBLE, field,
                                "temperature cross in the %s: gas %.2f -> %.2f K, water "
                                "%.2f -> %.2f K", z->name[j], z->Tg_in, z->Tg_out,
                                z->w_in[j].T_K, z->w_out[j].T_K);
    }
    *hg = z->hg_out;
    *Tg = z->Tg_out;
    return GC_OK;
}

/* The superheater section of level i (with the reheater for level 0). */
static int superheat_zone(sc_work *w, int i, double *hg, double *Tg)
{
    sc_level *L = &w->lv[i];
    int rh = (i == 0 && w->reheat);
    char name[GC_STEAM_NAME_LEN], a[GC_STEAM_NAME_LEN], b[GC_STEAM_NAME_LEN];
    char f[GC_ERROR_FIELD_LEN];
    if (!L->superheated && !rh)
        return GC_OK;
    sc_zone *z;
    int rc = add_zone(w, i, *hg, *Tg, &z);
    if (rc != GC_OK)
        return rc;
    if (L->superheated) {
        snprintf(name, sizeof name, "%s_superheater", L->name);
        snprintf(a, sizeof a, "%s_saturated_vapour", L->name);
        snprintf(b, sizeof b, "%s_steam", L->name);
        zone_stream(z, GC_STEAM_SUPERHEATER, name, a, b, L->m, &L->sat, &L->sh);
    }
    if (rh)
        zone_stream(z, GC_STEAM_REHEATER, "reheater", "cold_reheat", "hot_reheat",
                    L->m * w->rh_flow_per_m0, &w->crh, &w->hrh);
    if (L->superheated)
        field_level(f, sizeof f, i, "steam_temperature");
    else
        snprintf(f, sizeof f, "/reheat_temperature");
    rc = zone_close(w, z, hg, Tg, f);
    if (rc != GC_OK && rh && w->err && !(z->Tg_in > w->hrh.T_K))
        snprintf(w->err->field, sizeof w->err->field, "/reheat_temperature");
    return rc;
}

/* Level i's steam flow: by pinch, or given. */
static int level_flow(sc_work *w, int i, double hg, double Tg)
{
    const gc_steam_level_input *li = &w->in->levels[i];
    sc_level *L = &w->lv[i];
    char f[GC_ERROR_FIELD_LEN];
    if (li->steam_mass_flow_kg_per_s > 0.0) {
        L->m = li->steam_mass_flow_kg_per_s;
        return GC_OK;
    }
    double Tp = L->Ts + li->pinch_K;
    if (!(Tg > Tp))
        return gc_error_set(w->err, GC_ERR_INFEASIBLE, field_level(f, sizeof f, i, "pinch"),
                            "the gas reaches the %s level at %.2f K, not above its saturation "
                            "temperature plus pinch, %.2f K", L->name, Tg, Tp);
    double q = L->sh.h_J_per_kg - L->eco.h_J_per_kg;
    if (i == 0 && w->reheat)
        q += w->rh_flow_per_m0 * (w->hrh.h_J_per_kg - w->crh.h_J_per_kg);
    L->m = w->m_gas * (hg - gc_gas_h_T(&w->gas, Tp)) / q;
    return GC_OK;
}

/* Level i's evaporator; its pinch follows from the gas exit. */
static int evaporator(sc_work *w, int i, double *hg, double *Tg)
{
    sc_level *L = &w->lv[i];
    char name[GC_STEAM_NAME_LEN], a[GC_STEAM_NAME_LEN], b[GC_STEAM_NAME_LEN];
    char f[GC_ERROR_FIELD_LEN];
    int fixed = w->in->levels[i].steam_mass_flow_kg_per_s > 0.0;
    sc_zone *z;
    int rc = add_zone(w, i, *hg, *Tg, &z);
    if (rc != GC_OK)
        return rc;
    snprintf(name, sizeof name, "%s_evaporator", L->name);
    snprintf(a, sizeof a, "%s_economiser_exit", L->name);
    snprintf(b, sizeof b, "%s_saturated_vapour", L->name);
    zone_stream(z, GC_STEAM_EVAPORATOR, name, a, b, L->m, &L->eco, &L->sat);
    rc = zone_close(w, z, hg, Tg, NULL);
    if (rc != GC_OK)
        return rc;
    L->pinch = z->Tg_out - L->Ts;
    if (!(L->pinch > 0.0))
        return gc_error_set(w->err, GC_ERR_INFEASIBLE,
                            field_level(f, sizeof f, i, fixed ? "steam_mass_flow" : "pinch"),
                            "the %s evaporator would need the gas below its saturation "
                            "temperature (pinch %.2f K): less steam, or hotter gas",
                            L->name, L->pinch);
    return GC_OK;
}

/* Economiser piece names of level j in band i: parts are numbered from the
 * cold end when level j has more than one (bands j..n-1). */
static void piece_names(const sc_work *w, int j, int i, char *proc, char *out, size_t n)
{
    const char *lv = w->lv[j].name;
    int parts = w->n - j, k = w->n - i;   /* band n-1 is part 1 */
    if (parts == 1)
        snprintf(proc, n, "%s_economiser", lv);
    else
        snprintf(proc, n, "%s_economiser_%d", lv, k);
    if (i == j)
        snprintf(out, n, "%s_economiser_exit", lv);
    else
        snprintf(out, n, "%s_economiser_%d_exit", lv, k);
}

/* Economiser band i: every level j <= i from the economiser exit temperature
 * of level i + 1 (or its feedwater) to that of level i (or its own exit). */
static int economiser_band(sc_work *w, int i, double *hg, double *Tg)
{
    char f[GC_ERROR_FIELD_LEN];
    sc_zone *z;
    int rc = add_zone(w, i, *hg, *Tg, &z);
    for (int j = 0; j <= i && rc == GC_OK; j++) {
        sc_level *L = &w->lv[j];
        gc_if97_state lo, hi;
        char proc[GC_STEAM_NAME_LEN], in[GC_STEAM_NAME_LEN], out[GC_STEAM_NAME_LEN];
        if (i == w->n - 1)
            lo = L->fw;
        else
            rc = gc_if97_state_TP(w->lv[i + 1].eco.T_K, L->P, &lo, w->err);
        if (rc == GC_OK && i != j)
            rc = gc_if97_state_TP(w->lv[i].eco.T_K, L->P, &hi, w->err);
        else
            hi = L->eco;
        if (rc != GC_OK)
            break;
        piece_names(w, j, i, proc, out, sizeof proc);
        if (i == w->n - 1)
            snprintf(in, sizeof in, "%s_feedwater", L->name);
        else
            piece_names(w, j, i + 1, f, in, sizeof in);   /* the colder part's exit */
        zone_stream(z, GC_STEAM_ECONOMISER, proc, in, out, L->m, &lo, &hi);
        z->lvl[z->n_streams - 1] = j;
    }
    if (rc != GC_OK)
        return rc;
    int fixed = w->in->levels[i].steam_mass_flow_kg_per_s > 0.0;
    return zone_close(w, z, hg, Tg,
                      field_level(f, sizeof f, i, fixed ? "steam_mass_flow" : "approach"));
}

/* Economiser exit temperatures fall from level to level, and every feedwater
 * is colder than the last one (band n-1 starts at the feedwater). */
static int check_bands(sc_work *w)
{
    char f[GC_ERROR_FIELD_LEN];
    for (int i = 1; i < w->n; i++)
        if (!(w->lv[i].eco.T_K < w->lv[i - 1].eco.T_K))
            return gc_error_set(w->err, GC_ERR_INFEASIBLE,
                                field_level(f, sizeof f, i, "approach"),
                                "the %s economiser exit %.2f K must be colder than the %s one "
                                "%.2f K", w->lv[i].name, w->lv[i].eco.T_K, w->lv[i - 1].name,
                                w->lv[i - 1].eco.T_K);
    double T_last = w->lv[w->n - 1].eco.T_K;
    for (int j = 0; j < w->n; j++)
        if (!(w->lv[j].fw.T_K < T_last))
            return gc_error_set(w->err, GC_ERR_INFEASIBLE,
                                w->in->deaerator ? "/deaerator_pressure"
                                                 : field_level(f, sizeof f, w->n - 1, "approach"),
                                "the %s feedwater at %.2f K is not colder than the %s economiser "
                                "exit %.2f K", w->lv[j].name, w->lv[j].fw.T_K,
                                w->lv[w->n - 1].name, T_last);
    return GC_OK;
}

/* Gas pressures along the sections (linear in the heat taken). */
static void zone_pressures(sc_work *w)
{
    double Q_all = 0.0, Q = 0.0, dP = w->in->gas_pressure_loss * w->P_gas;
    for (int k = 0; k < w->nz; k++)
        Q_all += w->z[k].Q_total;
    for (int k = 0; k < w->nz; k++) {
        w->z[k].Pg_in = w->P_gas - dP * (Q_all > 0.0 ? Q / Q_all : 0.0);
        Q += w->z[k].Q_total;
        w->z[k].Pg_out = w->P_gas - dP * (Q_all > 0.0 ? Q / Q_all : 0.0);
    }
    w->P_stack = w->P_gas - dP;
}

/* Water stations of the HRSG: per level its feedwater, the exits of its
 * economiser parts (cold to hot), drum vapour and steam. */
static void record_water(sc_work *w)
{
    char name[GC_STEAM_NAME_LEN];
    for (int j = 0; j < w->n; j++) {
        const sc_level *L = &w->lv[j];
        snprintf(name, sizeof name, "%s_feedwater", L->name);
        gc__steam_add_water(w, name, &L->fw, L->m);
        for (int k = w->nz - 1; k >= 0; k--) {   /* the economiser parts, cold first */
            const sc_zone *z = &w->z[k];
            for (int s = 0; s < z->n_streams; s++)
                if (z->kind[s] == GC_STEAM_ECONOMISER && z->lvl[s] == j &&
                    strcmp(z->st_out[s], "") != 0 && z->level != j)
                    gc__steam_add_water(w, z->st_out[s], &z->w_out[s], L->m);
        }
        snprintf(name, sizeof name, "%s_economiser_exit", L->name);
        gc__steam_add_water(w, name, &L->eco, L->m);
        snprintf(name, sizeof name, "%s_saturated_vapour", L->name);
        gc__steam_add_water(w, name, &L->sat, L->m);
        snprintf(name, sizeof name, "%s_steam", L->name);
        gc__steam_add_water(w, name, &L->sh, L->m);
    }
}

/* Gas stations and the section processes (after the turbine path, so the
 * reheater can name its stations). */
int gc__steam_hrsg_record(sc_work *w)
{
    char name[GC_STEAM_NAME_LEN];
    int g_prev = gc_steam_station_index(w->r, w->m_fuel > 0.0 ? "burner_exit" : "gas_inlet");
    for (int k = 0; k < w->nz; k++) {
        sc_zone *z = &w->z[k];
        if (k + 1 == w->nz)
            snprintf(name, sizeof name, "stack");
        else if (z->kind[0] == GC_STEAM_ECONOMISER)
            snprintf(name, sizeof name, "%s_economiser_band_gas_exit", w->lv[z->level].name);
        else
            snprintf(name, sizeof name, "%s_gas_exit", z->name[0]);
        int g = gc__steam_add_gas(w, &w->gas, name, z->Tg_out, z->Pg_out, w->m_gas);
        double dsg = gc_gas_s_TP(&w->gas, z->Tg_out, z->Pg_out) -
                     gc_gas_s_TP(&w->gas, z->Tg_in, z->Pg_in);
        for (int j = 0; j < z->n_streams; j++) {
            double frac = z->Q_total > 0.0 ? z->Q[j] / z->Q_total : 0.0;
            double s_gen = w->m_gas * frac * dsg +
                           z->m[j] * (z->w_out[j].s_J_per_kgK - z->w_in[j].s_J_per_kgK);
            int p = gc__steam_add_process(w, z->name[j], z->kind[j],
                                          gc_steam_station_index(w->r, z->st_in[j]),
                                          gc_steam_station_index(w->r, z->st_out[j]), z->m[j],
                                          0.0, z->Q[j], s_gen);
            z->proc[j] = p;
            if (p >= 0) {
                gc_steam_process *pr = &w->r->processes[p];
                pr->gas_from = g_prev;
                pr->gas_to = g;
                pr->dT_hot_K = z->Tg_in - z->w_out[j].T_K;
                pr->dT_cold_K = z->Tg_out - z->w_in[j].T_K;
                pr->dT_min_K = fmin(pr->dT_hot_K, pr->dT_cold_K);
            }
        }
        g_prev = g;
    }
    return GC_OK;
}

int gc__steam_hrsg(sc_work *w)
{
    double hg = w->h_hrsg_abs, Tg = w->T_hrsg;
    int rc = check_bands(w);
    w->nz = 0;
    for (int i = 0; i < w->n && rc == GC_OK; i++) {
        rc = level_flow(w, i, hg, Tg);
        if (rc == GC_OK)
            rc = superheat_zone(w, i, &hg, &Tg);
        if (rc == GC_OK)
            rc = evaporator(w, i, &hg, &Tg);
        if (rc == GC_OK)
            rc = economiser_band(w, i, &hg, &Tg);
    }
    if (rc != GC_OK)
        return rc;
    w->h_stack_abs = hg;
    w->T_stack = Tg;
    w->Q_gas = w->m_gas * (w->h_hrsg_abs - w->h_stack_abs);
    w->Q_water = 0.0;
    for (int k = 0; k < w->nz; k++)
        for (int j = 0; j < w->z[k].n_streams; j++)
            w->Q_water += w->z[k].Q[j];
    zone_pressures(w);
    record_water(w);
    return GC_OK;
}

/* ---- T-Q diagram ------------------------------------------------------- */

/* Water temperature at fraction f of a stream's heat. */
static int water_T(const sc_zone *z, int j, double f, double *T, gc_error *err)
{
    if (f <= 0.0) {
        *T = z->w_in[j].T_K;
        return GC_OK;
    }
    if (f >= 1.0) {
        *T = z->w_out[j].T_K;
        return GC_OK;
    }
    double h = z->w_in[j].h_J_per_kg + f * (z->w_out[j].h_J_per_kg - z->w_in[j].h_J_per_kg);
    return gc_if97_T_Ph(z->w_in[j].P_Pa, h, T, err);
}

/* Gas temperature at fraction f of a section's heat (from its cold end). */
static int gas_T_at(sc_work *w, const sc_zone *z, double f, double *T)
{
    if (f <= 0.0) {
        *T = z->Tg_out;
        return GC_OK;
    }
    if (f >= 1.0) {
        *T = z->Tg_in;
        return GC_OK;
    }
    return gas_T(w, z->hg_out + f * (z->hg_in - z->hg_out), T);
}

/* Gas minus water temperature of stream j at fraction f. */
static int dT_at(sc_work *w, const sc_zone *z, int j, double f, double *dT)
{
    double Tg, Tw;
    int rc = gas_T_at(w, z, f, &Tg);
    if (rc == GC_OK)
        rc = water_T(z, j, f, &Tw, w->err);
    *dT = Tg - Tw;
    return rc;
}

/* The sample fractions of a section: even ones and the bends (saturated
 * liquid or vapour enthalpy strictly inside a stream's range), sorted. */
static int fractions(const sc_zone *z, double *f)
{
    int n = 0;
    for (int q = 0; q < GC_STEAM_TQ_PER_ZONE; q++)
        f[n++] = (double)q / (GC_STEAM_TQ_PER_ZONE - 1);
    for (int j = 0; j < z->n_streams; j++) {
        gc_if97_state l, v;
        double a = z->w_in[j].h_J_per_kg, b = z->w_out[j].h_J_per_kg;
        if (z->w_in[j].P_Pa > GC_IF97_P_SAT_STATES_MAX_PA ||
            gc_if97_sat_P(z->w_in[j].P_Pa, &l, &v, NULL) != GC_OK)
            continue;
        const double hb[2] = { l.h_J_per_kg, v.h_J_per_kg };
        for (int k = 0; k < 2; k++)
            if (hb[k] > a && hb[k] < b)
                f[n++] = (hb[k] - a) / (b - a);
    }
    for (int i = 1; i < n; i++)   /* insertion sort: a few points */
        for (int k = i; k > 0 && f[k] < f[k - 1]; k--) {
            double t = f[k];
            f[k] = f[k - 1];
            f[k - 1] = t;
        }
    return n;
}

/* Golden-section search for the smallest dT of stream j on [a, b]. */
static int refine(sc_work *w, const sc_zone *z, int j, double a, double b, double *dT_min)
{
    const double g = 0.6180339887498949;
    double c = b - g * (b - a), d = a + g * (b - a), fc = INFINITY, fd = INFINITY;
    int rc = dT_at(w, z, j, c, &fc);
    if (rc == GC_OK)
        rc = dT_at(w, z, j, d, &fd);
    while (rc == GC_OK && b - a > 1e-4) {
        if (fc < fd) {
            b = d;
            d = c;
            fd = fc;
            c = b - g * (b - a);
            rc = dT_at(w, z, j, c, &fc);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + g * (b - a);
            rc = dT_at(w, z, j, d, &fd);
        }
    }
    *dT_min = fmin(*dT_min, fmin(fc, fd));
    return rc;
}

/* One section sampled from its cold end to its hot end. */
static int sample_zone(sc_work *w, sc_zone *z, double Q_base)
{
    double f[GC_STEAM_TQ_PER_ZONE + 2 * SC_STREAMS], dT[SC_STREAMS][GC_STEAM_TQ_PER_ZONE + 2 * SC_STREAMS];
    int n = fractions(z, f), rc = GC_OK;
    for (int q = 0; q < n && rc == GC_OK; q++) {
        gc_steam_tq_point *p = &w->r->tq[w->r->n_tq++];
        memset(p, 0, sizeof *p);
        p->Q_W = Q_base + f[q] * z->Q_total;
        rc = gas_T_at(w, z, f[q], &p->T_gas_K);
        p->n_water = z->n_streams;
        for (int j = 0; j < z->n_streams && rc == GC_OK; j++) {
            rc = water_T(z, j, f[q], &p->T_water_K[j], w->err);
            p->process[j] = z->proc[j];
            dT[j][q] = p->T_gas_K - p->T_water_K[j];
        }
    }
    z->dT_min = INFINITY;
    for (int j = 0; j < z->n_streams && rc == GC_OK; j++) {
        int k = 0;
        for (int q = 1; q < n; q++)
            if (dT[j][q] < dT[j][k])
                k = q;
        double m = dT[j][k];
        if (k > 0 && k < n - 1)
            rc = refine(w, z, j, f[k - 1], f[k + 1], &m);
        z->dT_min = fmin(z->dT_min, m);
        if (z->proc[j] >= 0)
            w->r->processes[z->proc[j]].dT_min_K = m;
    }
    if (rc != GC_OK)
        return rc;
    if (!(z->dT_min > 0.0)) {
        char fl[GC_ERROR_FIELD_LEN];
        return gc_error_set(w->err, GC_ERR_INFEASIBLE,
                            field_level(fl, sizeof fl, z->level, "pinch"),
                            "temperature cross inside the %s: the gas falls %.2f K below the "
                            "water", z->name[0], -z->dT_min);
    }
    return GC_OK;
}

/* Every section, from the stack up; Q counts from the stack. A sampled
 * difference <= 0 is a temperature cross: GC_ERR_INFEASIBLE. */
int gc__steam_hrsg_sample(sc_work *w)
{
    double Q_base = 0.0;
    w->r->n_tq = 0;
    for (int k = w->nz - 1; k >= 0; k--) {
        int rc = sample_zone(w, &w->z[k], Q_base);
        if (rc != GC_OK)
            return rc;
        Q_base += w->z[k].Q_total;
    }
    return GC_OK;
}
