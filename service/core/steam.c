/*
 * steam.c — the steam bottoming cycle of gascycle/steam.h: inputs and their
 * bounds, the evaluation in order (duct burner, feedwater, level states,
 * reheat, HRSG, turbine path; steam_hrsg.c and steam_turbine.c), the
 * summary, exergy, built-in checks and coded warnings, and the ideal
 * counterpart (every efficiency 1, no gas-side pressure loss, the same
 * pinch, approach and steam conditions).
 *
 * Exergy balance (no firing): exergy of the exhaust in + pump work =
 * turbine work + exergy of the stack gas + condenser heat x (1 - T0/T_b) +
 * sum of T0 S_gen (the water loop is closed, so its flow exergies cancel).
 * Units: SI base units.
 */
#include "core/preset_util.h"
#include "core/steam_private.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#define PINCH_TOL_K 1e-6   /* designed vs achieved pinch: gas.h's T from h is exact to
                              1e-9 relative, so 1e-6 K covers 1000 K */
#define APPROACH_TOL_K 1e-9

static const char *LEVEL_NAMES[3][3] = {
    { "hp", "", "" }, { "hp", "lp", "" }, { "hp", "ip", "lp" },
};

/* ---- inputs ------------------------------------------------------------- */

void gc_steam_input_init(gc_steam_input *in)
{
    memset(in, 0, sizeof *in);
    gc_gas_init_air(&in->gas);
    in->gas_temperature_K = 873.15;
    in->gas_pressure_Pa = 104325.0;
    in->intake_mass_flow_kg_per_s = 1.0;
    in->exhaust_mass_ratio = 1.0;
    in->burner_efficiency = 1.0;
    in->n_levels = 1;
    in->levels[0].pressure_Pa = 8e6;
    in->levels[0].steam_temperature_K = 773.15;
    in->levels[0].pinch_K = 10.0;
    in->levels[0].approach_K = 5.0;
    in->turbine_efficiency = 1.0;
    in->pump_efficiency = 1.0;
    in->condenser_pressure_Pa = 5000.0;
    in->cooling_water_temperature_K = 288.15;
    in->cooling_water_rise_K = 10.0;
    in->condenser_terminal_difference_K = 5.0;
    in->dryness_min = GC_STEAM_DRYNESS_MIN;
    in->dead_state_temperature_K = GC_STEAM_DEAD_T_K;
    in->dead_state_pressure_Pa = GC_STEAM_DEAD_P_PA;
}

static void check_range(gc__errlist *L, double x, double lo, double hi, const char *field,
                        const char *unit)
{
    if (!isfinite(x) || x < lo || x > hi)
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be from %g to %g %s", lo, hi, unit);
}

/* 0 (not given) or in [lo, hi]. */
static void check_opt(gc__errlist *L, double x, double lo, double hi, const char *field,
                      const char *unit)
{
    if (x != 0.0)
        check_range(L, x, lo, hi, field, unit);
}

static void validate_gas(const gc_steam_input *in, gc__errlist *L)
{
    gc_error e;
    if (gc_gas_check_T(&in->gas, in->gas_temperature_K, "/gas_temperature", &e) != GC_OK)
        gc__errlist_add(L, e.code, e.field, "%s", e.message);
    check_range(L, in->gas_pressure_Pa, 5e4, 1e6, "/gas_pressure", "Pa");
    if (!isfinite(in->intake_mass_flow_kg_per_s) || !(in->intake_mass_flow_kg_per_s > 0.0) ||
        in->intake_mass_flow_kg_per_s > 1e4)
        gc__errlist_add(L, GC_ERR_INVALID, "/intake_mass_flow",
                        "must be greater than 0 and at most 10000 kg/s");
    check_range(L, in->exhaust_mass_ratio, 0.8, 1.5, "/exhaust_mass_ratio", "kg/kg");
    check_range(L, in->gas_pressure_loss, 0.0, 0.2, "/gas_pressure_loss", "(fraction)");
    check_opt(L, in->stack_temperature_min_K, 273.15, 500.0, "/stack_temperature_min", "K");
    if (in->firing_temperature_K == 0.0)
        return;
    if (!isfinite(in->firing_temperature_K) ||
        !(in->firing_temperature_K > in->gas_temperature_K) || in->firing_temperature_K > 1500.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/firing_temperature",
                        "must be above the gas temperature and at most 1500 K (0: unfired)");
    if (!in->has_fuel)
        gc__errlist_add(L, GC_ERR_INVALID, "/fuel", "a fuel is needed for supplementary firing");
    if (in->gas.kind != GC_GAS_MIXTURE)
        gc__errlist_add(L, GC_ERR_INVALID, "/gas",
                        "supplementary firing needs a gas mixture model, not the cold model");
    gc__check_eff(L, in->burner_efficiency, "/burner_efficiency");
    check_opt(L, in->fuel_temperature_K, 250.0, 600.0, "/fuel_temperature", "K");
}

static void validate_level(const gc_steam_input *in, int i, gc__errlist *L)
{
    const gc_steam_level_input *li = &in->levels[i];
    char f[GC_ERROR_FIELD_LEN];
    snprintf(f, sizeof f, "/levels/%d/pressure", i);
    check_range(L, li->pressure_Pa, 2e4, 19e6, f, "Pa");
    if (i > 0 && !(li->pressure_Pa < in->levels[i - 1].pressure_Pa))
        gc__errlist_add(L, GC_ERR_INVALID, f, "must be below the pressure of level %d", i - 1);
    snprintf(f, sizeof f, "/levels/%d/steam_temperature", i);
    check_opt(L, li->steam_temperature_K, 273.15, GC_IF97_T_R2_MAX_K, f, "K");
    snprintf(f, sizeof f, "/levels/%d/approach", i);
    check_range(L, li->approach_K, 0.0, 100.0, f, "K");
    snprintf(f, sizeof f, "/levels/%d/steam_mass_flow", i);
    check_range(L, li->steam_mass_flow_kg_per_s, 0.0, 1e4, f, "kg/s");
    snprintf(f, sizeof f, "/levels/%d/pinch", i);
    if (li->steam_mass_flow_kg_per_s == 0.0 &&
        (!isfinite(li->pinch_K) || !(li->pinch_K > 0.0) || li->pinch_K > 150.0))
        gc__errlist_add(L, GC_ERR_INVALID, f, "must be greater than 0 and at most 150 K");
}

static void validate_cycle(const gc_steam_input *in, gc__errlist *L)
{
    check_opt(L, in->reheat_temperature_K, 273.15, GC_IF97_T_R2_MAX_K, "/reheat_temperature",
              "K");
    if (in->reheat_temperature_K > 0.0 && in->n_levels == 1)
        check_range(L, in->reheat_pressure_Pa, 1e4, in->levels[0].pressure_Pa,
                    "/reheat_pressure", "Pa (below level 0)");
    else if (in->reheat_pressure_Pa != 0.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/reheat_pressure",
                        "is given only with one level and reheat (with more levels the "
                        "reheat pressure is level 1's pressure)");
    gc__check_eff(L, in->turbine_efficiency, "/turbine_efficiency");
    gc__check_eff(L, in->pump_efficiency, "/pump_efficiency");
    check_opt(L, in->condenser_pressure_Pa, 1e3, 1e5, "/condenser_pressure", "Pa");
    if (in->condenser_pressure_Pa == 0.0) {
        check_range(L, in->cooling_water_temperature_K, 273.15, 320.0,
                    "/cooling_water_temperature", "K");
        check_range(L, in->cooling_water_rise_K, 1.0, 25.0, "/cooling_water_rise", "K");
        check_range(L, in->condenser_terminal_difference_K, 1.0, 25.0,
                    "/condenser_terminal_difference", "K");
    }
    if (in->deaerator) {
        double lo = in->levels[in->n_levels - 1].pressure_Pa;
        if (!isfinite(in->deaerator_pressure_Pa) || !(in->deaerator_pressure_Pa > 1e3) ||
            !(in->deaerator_pressure_Pa < lo))
            gc__errlist_add(L, GC_ERR_INVALID, "/deaerator_pressure",
                            "must be above 1 kPa and below the lowest level's pressure %g Pa",
                            lo);
    }
    check_range(L, in->dryness_min, 0.5, 1.0, "/dryness_min", "(quality)");
    check_range(L, in->dead_state_temperature_K, 250.0, 320.0, "/dead_state_temperature", "K");
    check_range(L, in->dead_state_pressure_Pa, 5e4, 1.1e5, "/dead_state_pressure", "Pa");
}

int gc_steam_validate(const gc_steam_input *in, gc_error *errs, int max_errors, int *n_errors)
{
    gc__errlist L = { errs, max_errors, 0, GC_OK };
    validate_gas(in, &L);
    if (in->n_levels < 1 || in->n_levels > GC_STEAM_MAX_LEVELS) {
        gc__errlist_add(&L, GC_ERR_INVALID, "/levels", "must have 1 to %d pressure levels",
                        GC_STEAM_MAX_LEVELS);
        return gc__errlist_finish(&L, n_errors);
    }
    for (int i = 0; i < in->n_levels; i++)
        validate_level(in, i, &L);
    validate_cycle(in, &L);
    return gc__errlist_finish(&L, n_errors);
}

/* ---- recording ---------------------------------------------------------- */

static int add_station(sc_work *w, const char *name)
{
    gc_steam_result *r = w->r;
    if (r->n_stations >= GC_STEAM_MAX_STATIONS)
        return -1;
    gc_steam_station *s = &r->stations[r->n_stations];
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "%s", name);
    return r->n_stations++;
}

int gc__steam_add_water(sc_work *w, const char *name, const gc_if97_state *st, double m)
{
    int i = add_station(w, name);
    if (i < 0)
        return -1;
    gc_steam_station *s = &w->r->stations[i];
    double T0 = w->in->dead_state_temperature_K;
    s->fluid = GC_STEAM_WATER;
    s->T_K = st->T_K;
    s->P_Pa = st->P_Pa;
    s->h_J_per_kg = st->h_J_per_kg;
    s->s_J_per_kgK = st->s_J_per_kgK;
    s->v_m3_per_kg = st->v_m3_per_kg;
    s->x = st->x;
    s->region = st->region;
    s->m_kg_per_s = m;
    s->exergy_J_per_kg = (st->h_J_per_kg - w->h0w) - T0 * (st->s_J_per_kgK - w->s0w);
    return i;
}

int gc__steam_add_gas(sc_work *w, const gc_gas *g, const char *name, double T, double P,
                      double m)
{
    int i = add_station(w, name);
    if (i < 0)
        return -1;
    gc_steam_station *s = &w->r->stations[i];
    double T0 = w->in->dead_state_temperature_K, P0 = w->in->dead_state_pressure_Pa;
    double h = gc_gas_h_T(g, T), sv = gc_gas_s_TP(g, T, P);
    s->fluid = GC_STEAM_GAS;
    s->T_K = T;
    s->P_Pa = P;
    s->h_J_per_kg = h - gc_gas_h_T(g, GC_T_REF_K);
    s->s_J_per_kgK = sv;
    s->v_m3_per_kg = gc_gas_v_TP(g, T, P);
    s->x = -1.0;
    s->m_kg_per_s = m;
    s->exergy_J_per_kg = (h - gc_gas_h_T(g, T0)) - T0 * (sv - gc_gas_s_TP(g, T0, P0));
    return i;
}

int gc__steam_add_process(sc_work *w, const char *name, int kind, int from, int to, double m,
                          double work, double heat, double s_gen)
{
    gc_steam_result *r = w->r;
    if (r->n_processes >= GC_STEAM_MAX_PROCESSES)
        return -1;
    gc_steam_process *p = &r->processes[r->n_processes];
    memset(p, 0, sizeof *p);
    snprintf(p->name, sizeof p->name, "%s", name);
    p->kind = kind;
    p->from = from;
    p->to = to;
    p->gas_from = p->gas_to = -1;
    p->m_kg_per_s = m;
    p->work_W = work;
    p->heat_W = heat;
    p->s_gen_W_per_K = s_gen;
    p->exergy_destroyed_W = w->in->dead_state_temperature_K * s_gen;
    return r->n_processes++;
}

void gc__steam_warn(sc_work *w, const char *code, const char *field, const char *fmt, ...)
{
    gc_steam_result *r = w->r;
    if (r->n_warnings >= GC_STEAM_MAX_WARNINGS)
        return;
    gc_steam_warning *x = &r->warnings[r->n_warnings++];
    snprintf(x->code, sizeof x->code, "%s", code);
    snprintf(x->field, sizeof x->field, "%s", field);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(x->message, sizeof x->message, fmt, ap);
    va_end(ap);
}

int gc_steam_station_index(const gc_steam_result *r, const char *name)
{
    for (int i = 0; i < r->n_stations; i++)
        if (strcmp(r->stations[i].name, name) == 0)
            return i;
    return -1;
}

const char *gc_steam_process_kind_name(int kind)
{
    static const char *names[] = { "economiser", "evaporator", "superheater", "reheater",
                                   "duct_burner", "turbine", "pump", "condenser",
                                   "deaerator", "mixing" };
    return (kind >= 0 && kind <= GC_STEAM_MIXING) ? names[kind] : "unknown";
}

/* ---- evaluation ---------------------------------------------------------- */

/* Condenser pressure and temperature, levels, reheat pressure, dead state. */
static int resolve(sc_work *w)
{
    const gc_steam_input *in = w->in;
    int rc;
    w->n = in->n_levels;
    for (int i = 0; i < w->n; i++) {
        snprintf(w->lv[i].name, sizeof w->lv[i].name, "%s", LEVEL_NAMES[w->n - 1][i]);
        w->lv[i].P = in->levels[i].pressure_Pa;
    }
    if (in->condenser_pressure_Pa > 0.0) {
        w->P_cond = in->condenser_pressure_Pa;
        rc = gc_if97_Tsat_P(w->P_cond, &w->T_cond, w->err);
    } else {
        w->T_cond = in->cooling_water_temperature_K + in->cooling_water_rise_K +
                    in->condenser_terminal_difference_K;
        rc = gc_if97_Psat_T(w->T_cond, &w->P_cond, w->err);
        if (rc == GC_OK && (w->P_cond < 1e3 || w->P_cond > 1e5))
            rc = gc_error_set(w->err, GC_ERR_INVALID, "/cooling_water_temperature",
                              "gives a condenser pressure of %.0f Pa, outside 1 to 100 kPa",
                              w->P_cond);
    }
    if (rc != GC_OK)
        return rc;
    if (!(w->P_cond < w->lv[w->n - 1].P) ||
        (in->deaerator && !(in->deaerator_pressure_Pa > w->P_cond)))
        return gc_error_set(w->err, GC_ERR_INVALID,
                            in->condenser_pressure_Pa > 0.0 ? "/condenser_pressure"
                                                            : "/cooling_water_temperature",
                            "the condenser pressure %.0f Pa must be below the deaerator and "
                            "every level's pressure", w->P_cond);
    w->reheat = in->reheat_temperature_K > 0.0;
    w->P_rh = w->n > 1 ? w->lv[1].P : in->reheat_pressure_Pa;
    if (w->reheat && !(w->P_rh > w->P_cond))
        return gc_error_set(w->err, GC_ERR_INVALID, "/reheat_pressure",
                            "must be above the condenser pressure %.0f Pa", w->P_cond);
    gc_if97_state d;
    rc = gc_if97_state_TP(in->dead_state_temperature_K, in->dead_state_pressure_Pa, &d, w->err);
    w->h0w = d.h_J_per_kg;
    w->s0w = d.s_J_per_kgK;
    return rc;
}

static double T_max_steam(const sc_work *w)
{
    double T = w->lv[0].sh.T_K;
    for (int i = 1; i < w->n; i++)
        T = fmax(T, w->lv[i].sh.T_K);
    return w->reheat ? fmax(T, w->hrh.T_K) : T;
}

static void summarise(sc_work *w)
{
    const gc_steam_input *in = w->in;
    gc_steam_summary *s = &w->r->summary;
    double T0 = in->dead_state_temperature_K, P0 = in->dead_state_pressure_Pa;
    s->turbine_power_W = w->W_turb;
    s->pump_power_W = w->W_pump;
    s->net_power_W = w->W_turb - w->W_pump;
    s->heat_to_steam_W = w->Q_water;
    s->gas_heat_W = w->Q_gas;
    s->condenser_heat_W = w->Q_cond;
    s->fuel_heat_W = w->fuel_heat;
    s->fuel_mass_flow_kg_per_s = w->m_fuel;
    s->gas_mass_flow_kg_per_s = w->m_gas;
    s->steam_cycle_efficiency = s->net_power_W / w->Q_water;
    s->hrsg_effectiveness = w->Q_gas / (w->m_gas * (w->h_hrsg_abs - gc_gas_h_T(&w->gas, T0)));
    s->bottoming_efficiency =
        s->net_power_W / (w->m_gas_in * (w->h_exh_abs - gc_gas_h_T(&in->gas, T0)) + w->fuel_heat);
    s->carnot_efficiency = 1.0 - w->T_cond / T_max_steam(w);
    s->exergy_gas_in_W = w->m_gas_in * ((w->h_exh_abs - gc_gas_h_T(&in->gas, T0)) -
                                        T0 * (gc_gas_s_TP(&in->gas, w->T_exh, w->P_gas) -
                                              gc_gas_s_TP(&in->gas, T0, P0)));
    s->exergy_stack_W = w->m_gas * ((w->h_stack_abs - gc_gas_h_T(&w->gas, T0)) -
                                    T0 * (gc_gas_s_TP(&w->gas, w->T_stack, w->P_stack) -
                                          gc_gas_s_TP(&w->gas, T0, P0)));
    s->exergy_destroyed_W = 0.0;
    for (int k = 0; k < w->r->n_processes; k++)
        s->exergy_destroyed_W += w->r->processes[k].exergy_destroyed_W;
    s->exergy_efficiency = w->m_fuel > 0.0 ? 0.0 : s->net_power_W / s->exergy_gas_in_W;
    s->stack_temperature_K = w->T_stack;
    s->condenser_pressure_Pa = w->P_cond;
    s->condenser_temperature_K = w->T_cond;
    for (int i = 0; i < w->n; i++) {
        s->steam_mass_flow_kg_per_s[i] = w->lv[i].m;
        s->pinch_K[i] = w->lv[i].pinch;
        s->approach_K[i] = w->lv[i].approach;
    }
    s->bleed_mass_flow_kg_per_s = w->m_bleed;
    s->condenser_mass_flow_kg_per_s = w->m_cond;
    s->min_dT_K = INFINITY;
    for (int k = 0; k < w->nz; k++)
        s->min_dT_K = fmin(s->min_dT_K, w->z[k].dT_min);
    s->exhaust_quality = w->x_exhaust;
    s->min_expansion_quality = w->x_min;
    double m_in = in->intake_mass_flow_kg_per_s;
    s->net_work_J_per_kg_intake = s->net_power_W / m_in;
    s->heat_to_steam_J_per_kg_intake = w->Q_water / m_in;
    s->condenser_heat_J_per_kg_intake = w->Q_cond / m_in;
}

static int check(sc_work *w)
{
    const gc_steam_input *in = w->in;
    gc_steam_checks *c = &w->r->checks;
    const gc_steam_summary *s = &w->r->summary;
    double T0 = in->dead_state_temperature_K, Qg = w->Q_gas;
    double Tb = w->T_cond < T0 ? w->T_cond : T0;
    c->tol_energy = GC_STEAM_TOL_ENERGY;
    c->energy_hrsg_rel = fabs(w->Q_gas - w->Q_water) / Qg;
    c->energy_cycle_rel = fabs(w->Q_water + w->W_pump - w->W_turb - w->Q_cond) / Qg;
    double e_in = w->m_gas_in * w->h_exh_abs + w->m_fuel * w->h_fuel + w->W_pump;
    double e_out = w->m_gas * w->h_stack_abs + w->W_turb + w->Q_cond + w->burner_loss;
    c->energy_total_rel = fabs(e_in - e_out) / Qg;
    c->exergy_checked = w->m_fuel > 0.0 ? 0 : 1;
    c->exergy_rel = c->exergy_checked
                        ? fabs(s->exergy_gas_in_W + w->W_pump - w->W_turb - s->exergy_stack_W -
                               w->Q_cond * (1.0 - T0 / Tb) - s->exergy_destroyed_W) / Qg
                        : 0.0;
    c->pinch_error_K = c->approach_error_K = 0.0;
    for (int i = 0; i < w->n; i++) {
        const gc_steam_level_input *li = &in->levels[i];
        if (li->steam_mass_flow_kg_per_s == 0.0)
            c->pinch_error_K = fmax(c->pinch_error_K, fabs(w->lv[i].pinch - li->pinch_K));
        c->approach_error_K = fmax(c->approach_error_K, fabs(w->lv[i].approach - li->approach_K));
    }
    c->no_cross = s->min_dT_K > 0.0;
    c->stack_ok = !(in->stack_temperature_min_K > 0.0) ||
                  w->T_stack >= in->stack_temperature_min_K;
    double worst = fmax(fmax(c->energy_hrsg_rel, c->energy_cycle_rel),
                        fmax(c->energy_total_rel, c->exergy_rel));
    if (!(worst <= c->tol_energy) || !(c->pinch_error_K <= PINCH_TOL_K) ||
        !(c->approach_error_K <= APPROACH_TOL_K) || !c->no_cross)
        return gc_error_set(w->err, GC_ERR_CHECK, "",
                            "a built-in check of the steam cycle failed: energy/exergy %.3g "
                            "(tolerance %.0e), pinch error %.3g K, approach error %.3g K, "
                            "smallest temperature difference %.3g K", worst, c->tol_energy,
                            c->pinch_error_K, c->approach_error_K, s->min_dT_K);
    return GC_OK;
}

static void warn_levels(sc_work *w)
{
    const gc_steam_input *in = w->in;
    char f[GC_ERROR_FIELD_LEN];
    for (int i = 0; i < w->n; i++) {
        const sc_level *L = &w->lv[i];
        int fixed = in->levels[i].steam_mass_flow_kg_per_s > 0.0;
        snprintf(f, sizeof f, "/levels/%d/%s", i, fixed ? "steam_mass_flow" : "pinch");
        if (L->pinch < GC_STEAM_PINCH_SMALL_K)
            gc__steam_warn(w, "pinch_small", f,
                           "the %s pinch of %.2f K is below %.0f K: a very large evaporator "
                           "(common practice: 5 to 15 K)", L->name, L->pinch,
                           GC_STEAM_PINCH_SMALL_K);
        snprintf(f, sizeof f, "/levels/%d/approach", i);
        if (L->approach < 1.0)
            gc__steam_warn(w, "economiser_steaming_risk", f,
                           "the %s approach of %.2f K leaves the economiser water at saturation: "
                           "it may steam at part load (common practice: 3 to 10 K)", L->name,
                           L->approach);
        if (in->stack_temperature_min_K > 0.0 && L->fw.T_K < in->stack_temperature_min_K)
            gc__steam_warn(w, "feedwater_below_acid_dew_point", "/stack_temperature_min",
                           "the %s feedwater enters the economiser at %.2f K, below the minimum "
                           "stack temperature %.2f K: acid may condense on its tubes", L->name,
                           L->fw.T_K, in->stack_temperature_min_K);
    }
}

static void warn(sc_work *w)
{
    const gc_steam_input *in = w->in;
    if (w->x_min >= 0.0 && w->x_min < in->dryness_min)
        gc__steam_warn(w, "turbine_exhaust_wet", "/dryness_min",
                       "the expansion reaches a quality of %.4f (%s), below the minimum dryness "
                       "%.4f", w->x_min, w->x_min_where, in->dryness_min);
    if (in->stack_temperature_min_K > 0.0 && w->T_stack < in->stack_temperature_min_K)
        gc__steam_warn(w, "stack_below_minimum", "/stack_temperature_min",
                       "the stack temperature %.2f K is below the minimum %.2f K", w->T_stack,
                       in->stack_temperature_min_K);
    if (w->T_cond < in->dead_state_temperature_K)
        gc__steam_warn(w, "condenser_below_dead_state",
                       in->condenser_pressure_Pa > 0.0 ? "/condenser_pressure"
                                                       : "/cooling_water_temperature",
                       "the condensing temperature %.2f K is below the dead-state temperature "
                       "%.2f K", w->T_cond, in->dead_state_temperature_K);
    warn_levels(w);
}

static int run(const gc_steam_input *in, int full, gc_steam_result *r, gc_error *err)
{
    static const sc_work zero;
    sc_work w = zero;
    w.in = in;
    w.full = full;
    w.err = err;
    w.r = r;
    memset(r, 0, sizeof *r);
    r->n_levels = in->n_levels;
    int rc = resolve(&w);
    if (rc == GC_OK)
        rc = gc__steam_burner(&w);
    if (rc == GC_OK)
        rc = gc__steam_feed_states(&w);
    if (rc == GC_OK)
        rc = gc__steam_level_states(&w);
    if (rc == GC_OK)
        rc = gc__steam_reheat_states(&w);
    if (rc == GC_OK)
        rc = gc__steam_hrsg(&w);
    if (rc == GC_OK)
        rc = gc__steam_turbine_path(&w);
    if (rc == GC_OK)
        rc = gc__steam_hrsg_record(&w);
    if (rc == GC_OK && full)
        rc = gc__steam_hrsg_sample(&w);
    if (rc != GC_OK)
        return rc;
    summarise(&w);
    warn(&w);
    return check(&w);
}

/* The ideal counterpart: efficiencies 1, no gas-side loss; 1 when anything
 * changed. */
static int idealise(const gc_steam_input *in, gc_steam_input *id)
{
    *id = *in;
    id->turbine_efficiency = id->pump_efficiency = 1.0;
    id->gas_pressure_loss = 0.0;
    if (id->firing_temperature_K > 0.0)
        id->burner_efficiency = 1.0;
    id->flags = GC_STEAM_NO_IDEAL | GC_STEAM_NO_TQ;
    return in->turbine_efficiency != 1.0 || in->pump_efficiency != 1.0 ||
           in->gas_pressure_loss != 0.0 ||
           (in->firing_temperature_K > 0.0 && in->burner_efficiency != 1.0);
}

static void ideal(const gc_steam_input *in, gc_steam_result *r)
{
    gc_steam_input id;
    int changed = idealise(in, &id);
    gc_steam_summary *s = &r->summary;
    if (!changed) {
        s->has_ideal = 1;
        s->ideal_net_power_W = s->net_power_W;
        s->ideal_steam_cycle_efficiency = s->steam_cycle_efficiency;
        if (r->n_warnings < GC_STEAM_MAX_WARNINGS) {
            gc_steam_warning *x = &r->warnings[r->n_warnings++];
            snprintf(x->code, sizeof x->code, "actual_equals_ideal");
            x->field[0] = '\0';
            snprintf(x->message, sizeof x->message,
                     "every efficiency is 1 and there is no gas-side pressure loss: the "
                     "actual cycle is its own ideal counterpart");
        }
        return;
    }
    gc_steam_result scratch;   /* about 20 KB of stack */
    gc_error e;
    if (run(&id, 0, &scratch, &e) == GC_OK) {
        s->has_ideal = 1;
        s->ideal_net_power_W = scratch.summary.net_power_W;
        s->ideal_steam_cycle_efficiency = scratch.summary.steam_cycle_efficiency;
    } else if (r->n_warnings < GC_STEAM_MAX_WARNINGS) {
        gc_steam_warning *x = &r->warnings[r->n_warnings++];
        snprintf(x->code, sizeof x->code, "ideal_not_evaluated");
        snprintf(x->field, sizeof x->field, "%s", e.field);
        snprintf(x->message, sizeof x->message, "the ideal counterpart could not be evaluated: %.200s",
                 e.message);
    }
}

int gc_steam_evaluate(const gc_steam_input *in, gc_steam_result *r, gc_error *err)
{
    gc_error errs[1];
    int n = 0, rc = gc_steam_validate(in, errs, 1, &n);
    if (rc != GC_OK) {
        if (err)
            *err = errs[0];
        return rc;
    }
    rc = run(in, !(in->flags & GC_STEAM_NO_TQ), r, err);
    if (rc == GC_OK && !(in->flags & GC_STEAM_NO_IDEAL))
        ideal(in, r);
    return rc;
}
