/*
 * measured.c — measured-data reduction (measured.h): gas-turbine station
 * data to component efficiencies, works, heat input, efficiency, exergy
 * and the shortfall from the engine's ideal Brayton cycle; a
 * cylinder-pressure trace to indicated work, IMEP, power, polytropic
 * exponents and the comparison with the engine's ideal Otto cycle.
 *
 * Models, formulas, units and sources are in measured.h. Everything is SI;
 * no heap (the two preset results are malloc'd scratch, freed before return).
 */
#include "gascycle/measured.h"
#include "core/preset_util.h"

#include "gascycle/brayton.h"
#include "gascycle/piston.h"
#include "gascycle/site.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

/* ---- shared helpers ------------------------------------------------------ */

static void warn(gc_measured_warning *w, int *n, const char *code, const char *field,
                 const char *fmt, ...) __attribute__((format(printf, 5, 6)));
static void warn(gc_measured_warning *w, int *n, const char *code, const char *field,
                 const char *fmt, ...)
{
    if (*n >= GC_MEASURED_MAX_WARNINGS)
        return;
    gc_measured_warning *x = &w[(*n)++];
    snprintf(x->code, sizeof x->code, "%s", code);
    snprintf(x->field, sizeof x->field, "%s", field ? field : "");
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(x->message, sizeof x->message, fmt, ap);
    va_end(ap);
}

static int finite_pos(double x)
{
    return isfinite(x) && x > 0.0;
}

/* ---- stations: validation -------------------------------------------------- */

void gc_measured_stations_input_init(gc_measured_stations_input *in)
{
    memset(in, 0, sizeof *in);
    gc_gas_init_air(&in->gas);
}

/* T and P of one station: finite, positive, inside the gas data. */
static int check_station(gc__errlist *l, const gc_gas *g, const gc_measured_station *s,
                         const char *name)
{
    char f[GC_ERROR_FIELD_LEN];
    int bad = 0;
    snprintf(f, sizeof f, "/%s/T", name);
    if (!finite_pos(s->T_K)) {
        gc__errlist_add(l, GC_ERR_INVALID, f, "must be a positive absolute temperature");
        bad = 1;
    } else if (s->T_K < g->T_min_K || s->T_K > g->T_max_K) {
        gc__errlist_add(l, GC_ERR_RANGE, f, "%.6g K is outside the gas data's range %.6g..%.6g K",
                s->T_K, g->T_min_K, g->T_max_K);
        bad = 1;
    }
    snprintf(f, sizeof f, "/%s/P", name);
    if (!finite_pos(s->P_Pa)) {
        gc__errlist_add(l, GC_ERR_INVALID, f, "must be a positive absolute pressure");
        bad = 1;
    }
    return bad;
}

/* low -> high compression stage: pressure and temperature must rise. */
static void check_compression(gc__errlist *l, const gc_measured_station *a, const gc_measured_station *b,
                              const char *bname, const char *aname)
{
    char f[GC_ERROR_FIELD_LEN];
    if (!(b->P_Pa > a->P_Pa)) {
        snprintf(f, sizeof f, "/%s/P", bname);
        gc__errlist_add(l, GC_ERR_INVALID, f, "must exceed the %s pressure (%.6g kPa): a compressor "
                "raises the pressure", aname, a->P_Pa / 1e3);
    } else if (b->P_Pa / a->P_Pa > GC_BRAYTON_RP_MAX) {
        snprintf(f, sizeof f, "/%s/P", bname);
        gc__errlist_add(l, GC_ERR_INVALID, f, "gives a pressure ratio above %g", GC_BRAYTON_RP_MAX);
    }
    if (!(b->T_K > a->T_K)) {
        snprintf(f, sizeof f, "/%s/T", bname);
        gc__errlist_add(l, GC_ERR_INVALID, f, "must exceed the %s temperature (%.6g K): the data are "
                "inconsistent, an adiabatic compressor always heats the air", aname, a->T_K);
    }
}

/* The regenerator's readings against the compressor and turbine outlets. */
static void check_regenerator(gc__errlist *l, const gc_measured_stations_input *in)
{
    const gc_measured_station *c2 = &in->compressor_outlet, *t4 = &in->turbine_outlet;
    const gc_measured_station *ra = &in->regenerator_air_outlet;
    const gc_measured_station *rg = &in->regenerator_gas_outlet;
    if (!(ra->T_K > c2->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/air_outlet/T", "must exceed the "
                "compressor outlet temperature (%.6g K): the regenerator heats the air",
                c2->T_K);
    if (!(ra->T_K < t4->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/air_outlet/T", "must be below the "
                "turbine outlet temperature (%.6g K) that heats it", t4->T_K);
    if (!(rg->T_K < t4->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/gas_outlet/T", "must be below the "
                "turbine outlet temperature (%.6g K): the regenerator cools the gas",
                t4->T_K);
    if (!(rg->T_K > c2->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/gas_outlet/T", "must exceed the "
                "compressor outlet temperature (%.6g K) that cools it", c2->T_K);
    if (ra->P_Pa > c2->P_Pa)
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/air_outlet/P", "must not exceed the "
                "compressor outlet pressure (%.6g kPa)", c2->P_Pa / 1e3);
    if (rg->P_Pa > t4->P_Pa)
        gc__errlist_add(l, GC_ERR_INVALID, "/regenerator/gas_outlet/P", "must not exceed the "
                "turbine outlet pressure (%.6g kPa)", t4->P_Pa / 1e3);
}

/* The order of the readings through the machines (compression raises P and
 * T, the turbine lowers them, the combustor heats without raising P). */
static void check_order(gc__errlist *l, const gc_measured_stations_input *in)
{
    const gc_measured_station *c1 = &in->compressor_inlet, *c2 = &in->compressor_outlet;
    const gc_measured_station *t3 = &in->turbine_inlet, *t4 = &in->turbine_outlet;
    if (in->has_intercooler) {
        const gc_measured_station *ia = &in->intercooler_inlet, *ib = &in->intercooler_outlet;
        check_compression(l, c1, ia, "intercooler/inlet", "compressor inlet");
        check_compression(l, ib, c2, "compressor_outlet", "intercooler outlet");
        if (!(ib->T_K < ia->T_K))
            gc__errlist_add(l, GC_ERR_INVALID, "/intercooler/outlet/T", "must be below the "
                    "intercooler inlet temperature (%.6g K): an intercooler cools", ia->T_K);
        if (ib->P_Pa > ia->P_Pa)
            gc__errlist_add(l, GC_ERR_INVALID, "/intercooler/outlet/P", "must not exceed the "
                    "intercooler inlet pressure (%.6g kPa): a heat exchanger loses pressure",
                    ia->P_Pa / 1e3);
    } else {
        check_compression(l, c1, c2, "compressor_outlet", "compressor inlet");
    }
    if (!(t3->P_Pa > t4->P_Pa))
        gc__errlist_add(l, GC_ERR_INVALID, "/turbine_outlet/P", "must be below the turbine inlet "
                "pressure (%.6g kPa): a turbine expands the gas", t3->P_Pa / 1e3);
    if (!(t3->T_K > t4->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/turbine_outlet/T", "must be below the turbine inlet "
                "temperature (%.6g K): the data are inconsistent, a turbine delivering work "
                "cools the gas", t3->T_K);
    const gc_measured_station *ci = in->has_regenerator ? &in->regenerator_air_outlet : c2;
    const char *ci_name = in->has_regenerator ? "regenerator air outlet" : "compressor outlet";
    if (!(t3->T_K > ci->T_K))
        gc__errlist_add(l, GC_ERR_INVALID, "/turbine_inlet/T", "must exceed the %s temperature "
                "(%.6g K): the combustor adds heat", ci_name, ci->T_K);
    if (t3->P_Pa > ci->P_Pa)
        gc__errlist_add(l, GC_ERR_INVALID, "/turbine_inlet/P", "must not exceed the %s pressure "
                "(%.6g kPa): a combustor loses pressure, it cannot raise it", ci_name,
                ci->P_Pa / 1e3);
    if (in->has_regenerator)
        check_regenerator(l, in);
}

int gc_measured_stations_validate(const gc_measured_stations_input *in, gc_error *errs,
                                  int max_errors, int *n_errors)
{
    gc__errlist l = { errs, max_errors, 0, GC_OK };
    const gc_gas *g = &in->gas;
    int bad = check_station(&l, g, &in->compressor_inlet, "compressor_inlet");
    bad |= check_station(&l, g, &in->compressor_outlet, "compressor_outlet");
    bad |= check_station(&l, g, &in->turbine_inlet, "turbine_inlet");
    bad |= check_station(&l, g, &in->turbine_outlet, "turbine_outlet");
    if (in->has_intercooler) {
        bad |= check_station(&l, g, &in->intercooler_inlet, "intercooler/inlet");
        bad |= check_station(&l, g, &in->intercooler_outlet, "intercooler/outlet");
    }
    if (in->has_regenerator) {
        bad |= check_station(&l, g, &in->regenerator_air_outlet, "regenerator/air_outlet");
        bad |= check_station(&l, g, &in->regenerator_gas_outlet, "regenerator/gas_outlet");
    }
    if (!(in->air_mass_flow >= 0.0 && isfinite(in->air_mass_flow)))
        gc__errlist_add(&l, GC_ERR_INVALID, "/air_mass_flow", "must be a positive mass flow");
    if (!(in->fuel_mass_flow >= 0.0 && isfinite(in->fuel_mass_flow)))
        gc__errlist_add(&l, GC_ERR_INVALID, "/fuel_mass_flow", "must be a positive mass flow");
    if (in->air_mass_flow > 0.0 && in->fuel_mass_flow > 0.0 &&
        in->fuel_mass_flow > 0.2 * in->air_mass_flow)
        gc__errlist_add(&l, GC_ERR_INVALID, "/fuel_mass_flow", "gives a fuel-air ratio of %.4g, far "
                "richer than any gas-turbine combustor runs (above 0.2): check the flows",
                in->fuel_mass_flow / in->air_mass_flow);
    if (in->T_dead_K != 0.0 && !(in->T_dead_K >= g->T_min_K && in->T_dead_K <= 400.0))
        gc__errlist_add(&l, GC_ERR_RANGE, "/site/temperature", "must lie between %.6g and 400 K for "
                "the exergy dead state", g->T_min_K);
    if (bad) {
        if (n_errors)
            *n_errors = l.n;
        return l.first;
    }

    check_order(&l, in);
    return gc__errlist_finish(&l, n_errors);
}

/* ---- stations: reduction --------------------------------------------------- */

/* One adiabatic machine between a (in) and b (out), mass m per kg air.
 * Compression when comp. Returns GC_OK or an error. */
static int machine(const gc_gas *g, double m, const gc_measured_station *a,
                   const gc_measured_station *b, int comp, double T0, gc_measured_machine *mc,
                   gc_error *err)
{
    double ha = gc_gas_h_T(g, a->T_K), hb = gc_gas_h_T(g, b->T_K);
    double Ts;
    int rc = gc_gas_T_isentropic_P(g, a->T_K, b->P_Pa / a->P_Pa, &Ts, err);
    if (rc != GC_OK)
        return rc;
    double hs = gc_gas_h_T(g, Ts);
    double ds0 = gc_gas_s0_T(g, b->T_K) - gc_gas_s0_T(g, a->T_K);
    double lnr = log(b->P_Pa / a->P_Pa);
    mc->T_isentropic_K = Ts;
    if (comp) {
        mc->pressure_ratio = b->P_Pa / a->P_Pa;
        mc->work = m * (hb - ha);
        mc->work_isentropic = m * (hs - ha);
        mc->isentropic_efficiency = (hs - ha) / (hb - ha);
        mc->polytropic_efficiency = g->R_J_per_kgK * lnr / ds0;
    } else {
        mc->pressure_ratio = a->P_Pa / b->P_Pa;
        mc->work = m * (ha - hb);
        mc->work_isentropic = m * (ha - hs);
        mc->isentropic_efficiency = (ha - hb) / (ha - hs);
        mc->polytropic_efficiency = ds0 / (g->R_J_per_kgK * lnr);
    }
    mc->exergy_destroyed = T0 * m * (gc_gas_s_TP(g, b->T_K, b->P_Pa) -
                                     gc_gas_s_TP(g, a->T_K, a->P_Pa));
    return GC_OK;
}

static int check_eta(gc_measured_stations_result *r, const gc_measured_machine *mc,
                     const char *what, const char *field, gc_error *err)
{
    double eta = mc->isentropic_efficiency;
    if (!isfinite(eta))
        return gc_error_set(err, GC_ERR_INVALID, field, "gives no finite %s efficiency", what);
    if (eta > 1.0 + GC_MEASURED_ETA_TOLERANCE)
        return gc_error_set(err, GC_ERR_INVALID, field, "gives a %s isentropic efficiency of "
                            "%.4f, above 1: a data error (beyond the %.0f %% allowed for "
                            "measurement uncertainty), check the temperature and pressure "
                            "readings", what, eta, 100.0 * GC_MEASURED_ETA_TOLERANCE);
    if (eta > 1.0)
        warn(r->warnings, &r->n_warnings, "efficiency_above_one", field,
             "the %s isentropic efficiency %.4f is above 1 but within the %.0f %% "
             "measurement tolerance; the figures are reported as measured (entropy falls "
             "across it, so its exergy destroyed is negative)", what, eta,
             100.0 * GC_MEASURED_ETA_TOLERANCE);
    return GC_OK;
}

/* The real-gas and dissociation rules (validity.h) over every station, each on
 * the gas that flows through it. */
static void scan_stations(const gc_measured_stations_input *in, gc_measured_stations_result *r)
{
    const gc_gas *ga = &in->gas, *gt = &r->turbine_gas;
    gc_validity_scan *v = &r->validity;
    gc_validity_scan_init(v);
    gc_validity_scan_state(v, ga, in->compressor_inlet.T_K, in->compressor_inlet.P_Pa,
                           "the compressor inlet");
    if (in->has_intercooler) {
        gc_validity_scan_state(v, ga, in->intercooler_inlet.T_K, in->intercooler_inlet.P_Pa,
                               "the intercooler inlet");
        gc_validity_scan_state(v, ga, in->intercooler_outlet.T_K, in->intercooler_outlet.P_Pa,
                               "the intercooler outlet");
    }
    gc_validity_scan_state(v, ga, in->compressor_outlet.T_K, in->compressor_outlet.P_Pa,
                           "the compressor outlet");
    if (in->has_regenerator)
        gc_validity_scan_state(v, ga, in->regenerator_air_outlet.T_K,
                               in->regenerator_air_outlet.P_Pa, "the regenerator air outlet");
    gc_validity_scan_state(v, gt, in->turbine_inlet.T_K, in->turbine_inlet.P_Pa,
                           "the turbine inlet");
    gc_validity_scan_state(v, gt, in->turbine_outlet.T_K, in->turbine_outlet.P_Pa,
                           "the turbine outlet");
    if (in->has_regenerator)
        gc_validity_scan_state(v, gt, in->regenerator_gas_outlet.T_K,
                               in->regenerator_gas_outlet.P_Pa, "the regenerator gas outlet");
}

/* What the sections of gc_measured_stations_reduce share. */
typedef struct red {
    const gc_measured_stations_input *in;
    gc_measured_stations_result *r;
    gc_error *err;
    const gc_gas *ga, *gt;                  /* air side, turbine gas */
    const gc_measured_station *c1, *c2, *t3, *t4, *ci; /* ci: the combustor inlet */
    double LHV, far, m, T0, P0;
} red;

/* No flows but a fuel whose products can be formed: the fuel-air ratio that
 * heats the air from the combustor inlet to the turbine inlet temperature
 * with complete combustion (combustor efficiency 1), so the turbine gas is
 * the products, not the air. */
static int far_from_balance(red *x)
{
    const gc_measured_stations_input *in = x->in;
    double Tf = in->fuel_temperature > 0.0 ? in->fuel_temperature : GC_T_REF_K;
    int rc = gc_combustion_far_for_T(&in->fuel, Tf, x->ga, x->ci->T_K, x->t3->T_K, 1.0,
                                     &x->far, x->err);
    if (rc != GC_OK) {
        if (x->err)
            snprintf(x->err->field, sizeof x->err->field, "/turbine_inlet/T");
        return rc;
    }
    x->r->far_from_balance = 1;
    warn(x->r->warnings, &x->r->n_warnings, "fuel_air_ratio_from_balance", "/fuel",
         "without air and fuel flows the fuel-air ratio %.5g is solved from the combustor "
         "energy balance (complete combustion, combustor efficiency 1, fuel at %.5g K), "
         "so the turbine gas is the products of that ratio and the heat input far x LHV",
         x->far, Tf);
    return GC_OK;
}

/* The fuel-air ratio, the basis of the heat input and the turbine gas. */
static int fuel_and_turbine_gas(red *x)
{
    const gc_measured_stations_input *in = x->in;
    gc_measured_stations_result *r = x->r;
    int named = in->has_fuel && in->fuel_species && x->ga->kind == GC_GAS_MIXTURE;
    x->LHV = in->has_fuel ? in->fuel.LHV_J_per_kg : in->fuel_heating_value;
    x->far = 0.0;
    if (in->fuel_mass_flow > 0.0 && in->air_mass_flow > 0.0)
        x->far = in->fuel_mass_flow / in->air_mass_flow;
    else if (in->fuel_mass_flow > 0.0)
        warn(r->warnings, &r->n_warnings, "fuel_flow_without_air_flow", "/fuel_mass_flow",
             "the fuel flow is used only with the air mass flow (for the fuel-air ratio); "
             "without it the fuel-air ratio comes from the combustor energy balance when the "
             "fuel is named, else the heat input from the turbine inlet temperature");
    r->turbine_gas = *x->ga;
    if (x->far == 0.0 && named) {
        int rc = far_from_balance(x);
        if (rc != GC_OK)
            return rc;
    } else if (x->far == 0.0 && x->LHV > 0.0) {
        warn(r->warnings, &r->n_warnings, "turbine_gas_air", "/fuel_heating_value",
             "without air and fuel flows and without a fuel analysis the products cannot be "
             "formed: the turbine gas is taken as the air and the heat input is air-standard "
             "(name the fuel to have the fuel-air ratio solved from the energy balance)");
    }
    if (x->far > 0.0 && x->LHV > 0.0) {
        r->fuel_basis = 1;
        if (named) {
            int rc = gc_combustion_products(&in->fuel, x->ga, x->far, &r->turbine_gas, x->err);
            if (rc != GC_OK) {
                if (x->err)
                    snprintf(x->err->field, sizeof x->err->field, "/fuel_mass_flow");
                return rc;
            }
            r->products = 1;
        }
    } else if (x->far > 0.0) {
        warn(r->warnings, &r->n_warnings, "fuel_flow_without_heating_value", "/fuel",
             "a fuel flow without a fuel or fuel_heating_value gives no fuel energy; the heat "
             "input is taken from the turbine inlet temperature");
        x->far = 0.0;
    }
    r->fuel_air_ratio = x->far;
    r->mass_ratio = 1.0 + x->far;
    x->gt = &r->turbine_gas;
    x->m = r->mass_ratio;
    if (r->products && (gc_gas_check_T(x->gt, x->t3->T_K, "/turbine_inlet/T", x->err) != GC_OK ||
                        gc_gas_check_T(x->gt, x->t4->T_K, "/turbine_outlet/T", x->err) != GC_OK))
        return GC_ERR_RANGE;
    return GC_OK;
}

/* Compressor stages and turbine; the works. */
static int machines(red *x)
{
    const gc_measured_stations_input *in = x->in;
    gc_measured_stations_result *r = x->r;
    gc_error *err = x->err;
    int rc;
    if (in->has_intercooler) {
        r->n_compressor_stages = 2;
        rc = machine(x->ga, 1.0, x->c1, &in->intercooler_inlet, 1, x->T0, &r->compressor[0], err);
        if (rc == GC_OK)
            rc = check_eta(r, &r->compressor[0], "low-pressure compressor",
                           "/intercooler/inlet/T", err);
        if (rc == GC_OK)
            rc = machine(x->ga, 1.0, &in->intercooler_outlet, x->c2, 1, x->T0, &r->compressor[1],
                         err);
        if (rc == GC_OK)
            rc = check_eta(r, &r->compressor[1], "high-pressure compressor",
                           "/compressor_outlet/T", err);
    } else {
        r->n_compressor_stages = 1;
        rc = machine(x->ga, 1.0, x->c1, x->c2, 1, x->T0, &r->compressor[0], err);
        if (rc == GC_OK)
            rc = check_eta(r, &r->compressor[0], "compressor", "/compressor_outlet/T", err);
    }
    if (rc == GC_OK)
        rc = machine(x->gt, x->m, x->t3, x->t4, 0, x->T0, &r->turbine, err);
    if (rc == GC_OK)
        rc = check_eta(r, &r->turbine, "turbine", "/turbine_outlet/T", err);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < r->n_compressor_stages; i++) {
        r->compressor_work += r->compressor[i].work;
        r->compressor_work_isentropic += r->compressor[i].work_isentropic;
    }
    r->turbine_work = r->turbine.work;
    r->net_work = r->turbine_work - r->compressor_work;
    r->back_work_ratio = r->compressor_work / r->turbine_work;
    return GC_OK;
}

static void intercooler(red *x)
{
    const gc_measured_station *a = &x->in->intercooler_inlet, *b = &x->in->intercooler_outlet;
    const gc_gas *ga = x->ga;
    gc_measured_stations_result *r = x->r;
    r->intercooler_heat = gc_gas_h_T(ga, a->T_K) - gc_gas_h_T(ga, b->T_K);
    r->intercooler_pressure_loss = 1.0 - b->P_Pa / a->P_Pa;
    r->exergy_intercooler = x->T0 * (gc_gas_s_TP(ga, b->T_K, b->P_Pa) -
                                     gc_gas_s_TP(ga, a->T_K, a->P_Pa)) + r->intercooler_heat;
}

static int regenerator(red *x)
{
    const gc_measured_station *ra = &x->in->regenerator_air_outlet;
    const gc_measured_station *rg = &x->in->regenerator_gas_outlet;
    const gc_measured_station *c2 = x->c2, *t4 = x->t4;
    const gc_gas *ga = x->ga, *gt = x->gt;
    gc_measured_stations_result *r = x->r;
    double m = x->m, T0 = x->T0;
    double q_air = gc_gas_h_T(ga, ra->T_K) - gc_gas_h_T(ga, c2->T_K);
    double q_gas = m * (gc_gas_h_T(gt, t4->T_K) - gc_gas_h_T(gt, rg->T_K));
    double qmax_air = gc_gas_h_T(ga, t4->T_K) - gc_gas_h_T(ga, c2->T_K);
    double qmax_gas = m * (gc_gas_h_T(gt, t4->T_K) - gc_gas_h_T(gt, c2->T_K));
    double qmax = qmax_air < qmax_gas ? qmax_air : qmax_gas;
    r->regenerator_heat = q_air;
    r->regenerator_gas_heat = q_gas;
    r->regenerator_effectiveness = q_air / qmax;
    r->regenerator_balance = (q_gas - q_air) / q_air;
    r->regenerator_air_pressure_loss = 1.0 - ra->P_Pa / c2->P_Pa;
    r->regenerator_gas_pressure_loss = 1.0 - rg->P_Pa / t4->P_Pa;
    r->exergy_regenerator = T0 * ((gc_gas_s_TP(ga, ra->T_K, ra->P_Pa) -
                                   gc_gas_s_TP(ga, c2->T_K, c2->P_Pa)) +
                                  m * (gc_gas_s_TP(gt, rg->T_K, rg->P_Pa) -
                                       gc_gas_s_TP(gt, t4->T_K, t4->P_Pa)));
    if (r->regenerator_effectiveness > 1.0)
        return gc_error_set(x->err, GC_ERR_INVALID, "/regenerator/air_outlet/T",
                            "gives a regenerator effectiveness of %.4f, above 1: the data "
                            "are inconsistent", r->regenerator_effectiveness);
    if (fabs(r->regenerator_balance) > 0.05)
        warn(r->warnings, &r->n_warnings, "regenerator_balance", "/regenerator",
             "the gas side gives up %.1f %% %s heat than the air side takes up (more "
             "than 5 %%): check the regenerator temperatures or the flows",
             100.0 * fabs(r->regenerator_balance),
             r->regenerator_balance > 0.0 ? "more" : "less");
    r->T_exhaust_K = rg->T_K;
    r->P_exhaust_Pa = rg->P_Pa;
    return GC_OK;
}

/* The heat that reached the gas with a fuel: absolute enthalpies (formation
 * included) with the products, the air's otherwise. */
static int heat_to_gas(red *x, double h_ci)
{
    const gc_measured_stations_input *in = x->in;
    gc_measured_stations_result *r = x->r;
    if (r->products) {
        double Tf = in->fuel_temperature > 0.0 ? in->fuel_temperature : GC_T_REF_K;
        double hf;
        int rc = gc_fuel_h_T(&in->fuel, Tf, &hf, x->err);
        if (rc != GC_OK) {
            if (x->err)
                snprintf(x->err->field, sizeof x->err->field, "/fuel_temperature");
            return rc;
        }
        /* what reached the gas is the fuel energy less the burner loss (combustion.h) */
        r->heat_to_gas = x->far * x->LHV -
                         (h_ci + x->far * hf - x->m * gc_gas_h_T(x->gt, x->t3->T_K));
    } else {
        double h0a = gc_gas_h_T(x->ga, GC_T_REF_K);
        r->heat_to_gas = x->m * (gc_gas_h_T(x->ga, x->t3->T_K) - h0a) - (h_ci - h0a);
    }
    return GC_OK;
}

/* The combustor: heat in, heat to the gas, efficiency, exergy destroyed. */
static int combustor(red *x)
{
    gc_measured_stations_result *r = x->r;
    const gc_measured_station *t3 = x->t3, *ci = x->ci;
    const gc_gas *ga = x->ga;
    r->combustor_pressure_loss = 1.0 - t3->P_Pa / ci->P_Pa;
    double h_ci = gc_gas_h_T(ga, ci->T_K);
    if (r->fuel_basis) {
        r->heat_in = x->far * x->LHV;
        int rc = heat_to_gas(x, h_ci);
        if (rc != GC_OK)
            return rc;
        r->combustor_efficiency = r->heat_to_gas / r->heat_in;
        if (r->far_from_balance) {
            /* by construction (assumed), not measured */
            r->combustor_efficiency = 1.0;
            r->heat_to_gas = r->heat_in;
        } else if (r->combustor_efficiency > 1.0) {
            warn(r->warnings, &r->n_warnings, "energy_balance", "/fuel_mass_flow",
                 "the combustor energy balance does not close: the gas took up %.1f %% of "
                 "the fuel's LHV (more than all of it); check the fuel and air flows, the "
                 "fuel's heating value or the temperatures", 100.0 * r->combustor_efficiency);
        } else if (r->combustor_efficiency < 0.9) {
            warn(r->warnings, &r->n_warnings, "low_combustor_efficiency", "/fuel_mass_flow",
                 "the implied combustor efficiency %.1f %% is low for a gas-turbine combustor "
                 "(above 99 %% is usual: common practice); check the flows",
                 100.0 * r->combustor_efficiency);
        }
    } else {
        r->heat_in = gc_gas_h_T(ga, t3->T_K) - h_ci;
        r->heat_to_gas = r->heat_in;
    }
    r->thermal_efficiency = r->net_work / r->heat_in;
    if (r->thermal_efficiency > 0.0)
        r->gas_path_heat_rate = 1.0 / r->thermal_efficiency;
    else
        warn(r->warnings, &r->n_warnings, "no_net_work", "/turbine_outlet/T",
             "the turbine delivers no more work than the compressor takes: no net work, "
             "no gas-path heat rate");
    r->exergy_combustor = x->T0 * (gc_gas_s_TP(ga, t3->T_K, t3->P_Pa) -
                                   gc_gas_s_TP(ga, ci->T_K, ci->P_Pa) -
                                   (gc_gas_h_T(ga, t3->T_K) - h_ci) / t3->T_K);
    return GC_OK;
}

/* Powers with the air flow; the plant figures with the measured power. */
static void flows(red *x)
{
    const gc_measured_stations_input *in = x->in;
    gc_measured_stations_result *r = x->r;
    if (in->air_mass_flow > 0.0) {
        r->has_flow = 1;
        r->compressor_power = in->air_mass_flow * r->compressor_work;
        r->turbine_power = in->air_mass_flow * r->turbine_work;
        r->net_power_gas_path = in->air_mass_flow * r->net_work;
        r->heat_input_power = in->air_mass_flow * r->heat_in;
    }
    if (!(in->net_power > 0.0))
        return;
    r->has_power = 1;
    if (r->has_flow && r->net_power_gas_path > 0.0) {
        r->power_ratio = in->net_power / r->net_power_gas_path;
        if (r->power_ratio > 1.0)
            warn(r->warnings, &r->n_warnings, "power_above_gas_path", "/net_power",
                 "the measured power is %.1f %% of the gas-path net power (more than all "
                 "of it): check the air flow, the power or the temperatures",
                 100.0 * r->power_ratio);
    }
    if (r->fuel_basis) {
        r->plant_efficiency = in->net_power / (in->fuel_mass_flow * x->LHV);
        r->plant_heat_rate = 1.0 / r->plant_efficiency;
    }
}

/* The Brayton input of the ideal cycle between the measured limits. */
static void ideal_input(const red *x, gc_brayton_input *bi)
{
    const gc_measured_stations_input *in = x->in;
    gc_brayton_input_init(bi);
    bi->pressure_ratio = x->c2->P_Pa / x->c1->P_Pa;
    bi->turbine_inlet_temperature = x->t3->T_K;
    bi->has_gas = 1;
    bi->gas = *x->ga;
    bi->site.has_temperature = 1;
    bi->site.T_K = x->c1->T_K;
    bi->site.has_pressure = 1;
    bi->site.P_Pa = x->c1->P_Pa;
    bi->site.has_relative_humidity = 1;
    bi->site.RH = 0.0;
    if (in->has_intercooler) {
        bi->compressor_stages = 2;
        bi->intercooling_temperature = in->intercooler_outlet.T_K;
    }
    if (in->has_regenerator)
        bi->regenerator_effectiveness = x->r->regenerator_effectiveness;
    if (x->r->products) {
        bi->heat_mode = GC_BRAYTON_FUEL;
        bi->has_fuel = 1;
        bi->fuel = in->fuel;
        bi->fuel_temperature = in->fuel_temperature > 0.0 ? in->fuel_temperature : GC_T_REF_K;
    }
    bi->flags = GC_BRAYTON_NO_OPTIMUM | GC_BRAYTON_NO_AREAS;
}

/* The Carnot bound and the ideal Brayton cycle between the same limits. */
static int bounds(red *x)
{
    gc_measured_stations_result *r = x->r;
    gc_error *err = x->err;
    r->T_max_K = x->t3->T_K;
    r->T_min_K = x->c1->T_K;
    if (x->in->has_intercooler && x->in->intercooler_outlet.T_K < r->T_min_K)
        r->T_min_K = x->in->intercooler_outlet.T_K;
    r->carnot_efficiency = 1.0 - r->T_min_K / r->T_max_K;
    gc_brayton_input *bi = malloc(sizeof *bi);
    gc_brayton_result *br = malloc(sizeof *br);
    if (!bi || !br) {
        free(bi);
        free(br);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    }
    ideal_input(x, bi);
    r->ideal_fuel_basis = r->products;
    int rc = gc_brayton_evaluate(bi, br, err);
    if (rc == GC_OK) {
        r->ideal_thermal_efficiency = br->thermal_efficiency;
        r->ideal_net_work = br->specific_work;
        r->ideal_heat_in = br->heat_in;
        r->ideal_back_work_ratio = br->back_work_ratio;
    } else if (err) {
        char msg[GC_ERROR_MESSAGE_LEN];
        snprintf(msg, sizeof msg, "%s", err->message);
        gc_error_set(err, rc, err->field[0] ? "/turbine_inlet/T" : "",
                     "the ideal cycle between these limits cannot be evaluated: %.200s", msg);
    }
    free(bi);
    free(br);
    return rc;
}

/* The largest of the work deficits. */
static const char *largest_loss(const gc_measured_stations_result *r)
{
    struct { const char *name; double v; } d[] = {
        { "compressor", r->deficit_compressor }, { "turbine", r->deficit_turbine },
        { "pressure_losses", r->deficit_pressure_losses }, { "combustor", r->deficit_combustor } };
    const char *name = d[0].name;
    double best = d[0].v;
    for (size_t i = 1; i < sizeof d / sizeof d[0]; i++)
        if (d[i].v > best) {
            best = d[i].v;
            name = d[i].name;
        }
    return name;
}

/* Exergy destroyed and lost, the shortfall against the ideal, its warnings. */
static int exergy_and_shortfall(red *x)
{
    gc_measured_stations_result *r = x->r;
    const gc_gas *gt = x->gt;
    double m = x->m, T0 = x->T0;
    r->exergy_compressor = r->compressor[0].exergy_destroyed + r->compressor[1].exergy_destroyed;
    r->exergy_turbine = r->turbine.exergy_destroyed;
    r->exergy_destroyed = r->exergy_compressor + r->exergy_turbine + r->exergy_combustor +
                          r->exergy_intercooler + r->exergy_regenerator;
    r->exergy_exhaust = m * (gc_gas_h_T(gt, r->T_exhaust_K) - gc_gas_h_T(gt, T0) -
                             T0 * (gc_gas_s_TP(gt, r->T_exhaust_K, r->P_exhaust_Pa) -
                                   gc_gas_s_TP(gt, T0, x->P0)));
    r->efficiency_gap = r->ideal_thermal_efficiency - r->thermal_efficiency;
    if (r->ideal_thermal_efficiency > 0.0)
        r->fraction_of_ideal = r->thermal_efficiency / r->ideal_thermal_efficiency;
    r->deficit_compressor = r->compressor_work - r->compressor_work_isentropic;
    r->deficit_turbine = r->turbine.work_isentropic - r->turbine.work;
    double T4s_full;
    int rc = gc_gas_T_isentropic_P(gt, x->t3->T_K, x->c1->P_Pa / x->c2->P_Pa, &T4s_full, x->err);
    if (rc != GC_OK)
        return rc;
    r->deficit_pressure_losses = m * (gc_gas_h_T(gt, r->turbine.T_isentropic_K) -
                                      gc_gas_h_T(gt, T4s_full));
    if (r->fuel_basis)
        r->deficit_combustor = (r->heat_in - r->heat_to_gas) * r->ideal_thermal_efficiency;
    r->largest_loss = largest_loss(r);
    struct { const char *name, *field; double v; } ex[] = {
        { "regenerator", "/regenerator", r->exergy_regenerator },
        { "intercooler", "/intercooler", r->exergy_intercooler },
        { "combustor", "/turbine_inlet/T", r->exergy_combustor } };
    for (size_t i = 0; i < sizeof ex / sizeof ex[0]; i++)
        if (ex[i].v < -1e-9 * r->heat_in)
            warn(r->warnings, &r->n_warnings, "entropy_falls", ex[i].field,
                 "entropy falls across the %s (exergy destroyed %.4g kJ/kg, negative): the "
                 "readings break the second law, check them", ex[i].name, ex[i].v / 1e3);
    if (T0 > r->T_min_K + 1e-9)
        warn(r->warnings, &r->n_warnings, "dead_state_above_inlet", "/site/temperature",
             "the exergy dead state is warmer than the coldest station; exergy figures "
             "relative to it may be negative there");
    return GC_OK;
}

int gc_measured_stations_reduce(const gc_measured_stations_input *in,
                                gc_measured_stations_result *r, gc_error *err)
{
    memset(r, 0, sizeof *r);
    gc_error e1;
    gc_error_clear(&e1);
    if (gc_measured_stations_validate(in, &e1, 1, NULL) != GC_OK) {
        if (err)
            *err = e1;
        return e1.code;
    }
    red x = { .in = in, .r = r, .err = err, .ga = &in->gas, .c1 = &in->compressor_inlet,
              .c2 = &in->compressor_outlet, .t3 = &in->turbine_inlet,
              .t4 = &in->turbine_outlet };
    x.ci = in->has_regenerator ? &in->regenerator_air_outlet : x.c2;
    int rc = fuel_and_turbine_gas(&x);
    if (rc != GC_OK)
        return rc;
    x.T0 = in->T_dead_K > 0.0 ? in->T_dead_K : x.c1->T_K;
    x.P0 = in->P_dead_Pa > 0.0 ? in->P_dead_Pa : x.c1->P_Pa;
    r->T_dead_K = x.T0;
    r->P_dead_Pa = x.P0;
    rc = machines(&x);
    if (rc != GC_OK)
        return rc;
    if (in->has_intercooler)
        intercooler(&x);
    r->T_exhaust_K = x.t4->T_K;
    r->P_exhaust_Pa = x.t4->P_Pa;
    if (in->has_regenerator && (rc = regenerator(&x)) != GC_OK)
        return rc;
    rc = combustor(&x);
    if (rc != GC_OK)
        return rc;
    flows(&x);
    rc = bounds(&x);
    if (rc == GC_OK)
        rc = exergy_and_shortfall(&x);
    if (rc != GC_OK)
        return rc;
    scan_stations(in, r);
    return GC_OK;
}

/* ---- cylinder-pressure trace ------------------------------------------------ */

double gc_measured_displacement(const gc_measured_geometry *g)
{
    return 0.25 * PI * g->bore * g->bore * g->stroke;
}

double gc_measured_clearance(const gc_measured_geometry *g)
{
    return gc_measured_displacement(g) / (g->compression_ratio - 1.0);
}

double gc_measured_volume(const gc_measured_geometry *g, double th, double *dV)
{
    double A = 0.25 * PI * g->bore * g->bore;
    double a = 0.5 * g->stroke, l = g->rod_length;
    double s = sin(th), c = cos(th);
    double root = sqrt(l * l - a * a * s * s);
    if (dV)
        *dV = A * (a * s + a * a * s * c / root);
    return gc_measured_clearance(g) + A * (l + a - a * c - root);
}

/* theta wrapped into [-period/2, period/2). */
static double wrap(double th, double period)
{
    double x = fmod(th + 0.5 * period, period);
    if (x < 0.0)
        x += period;
    return x - 0.5 * period;
}

/* Least squares of ln P on ln V over the selected samples. */
typedef struct fit_acc {
    int n;
    double sx, sy, sxx, sxy, syy;
} fit_acc;

static void fit_add(fit_acc *f, double V, double P)
{
    double x = log(V), y = log(P);
    f->n++;
    f->sx += x;
    f->sy += y;
    f->sxx += x * x;
    f->sxy += x * y;
    f->syy += y * y;
}

static int fit_finish(const fit_acc *f, gc_measured_fit *out, const char *field, gc_error *err)
{
    out->samples = f->n;
    if (f->n < 3)
        return gc_error_set(err, GC_ERR_INVALID, field, "holds %d sample%s; the fit needs at "
                            "least 3", f->n, f->n == 1 ? "" : "s");
    double n = f->n;
    double Sxx = f->sxx - f->sx * f->sx / n;
    double Sxy = f->sxy - f->sx * f->sy / n;
    double Syy = f->syy - f->sy * f->sy / n;
    if (!(Sxx > 1e-18))
        return gc_error_set(err, GC_ERR_INVALID, field, "holds no change of volume to fit");
    out->n = -Sxy / Sxx;
    out->r_squared = Syy > 1e-300 ? (Sxy * Sxy) / (Sxx * Syy) : 1.0;
    if (out->r_squared > 1.0)
        out->r_squared = 1.0;
    return GC_OK;
}

/* P-V pairs: the sample of least volume next to the peak-pressure sample k
 * (down the volume from k, either way round the loop). */
static int pv_tdc(const double *V, int n, int k)
{
    for (int s = 0; s < n && V[(k - 1 + n) % n] < V[k]; s++)
        k = (k - 1 + n) % n;
    for (int s = 0; s < n && V[(k + 1) % n] < V[k]; s++)
        k = (k + 1) % n;
    return k;
}

static int trace_validate(const gc_measured_trace_input *in, gc_error *err)
{
    const char *tf = in->pv ? "/pv_trace" : "/trace";
    char f[GC_ERROR_FIELD_LEN];
    if (in->n < GC_MEASURED_TRACE_MIN || in->n > GC_MEASURED_TRACE_MAX || !in->x || !in->P)
        return gc_error_set(err, GC_ERR_INVALID, tf, "must hold %d to %d samples over one "
                            "cycle, got %d", GC_MEASURED_TRACE_MIN, GC_MEASURED_TRACE_MAX, in->n);
    for (int i = 0; i < in->n; i++) {
        snprintf(f, sizeof f, "%s/%d/1", tf, i);
        if (!finite_pos(in->P[i]))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be a positive absolute pressure");
        snprintf(f, sizeof f, "%s/%d/0", tf, i);
        if (!isfinite(in->x[i]))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be a finite number");
        if (in->pv && !(in->x[i] > 0.0))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be a positive volume");
        if (!in->pv && i > 0 && !(in->x[i] > in->x[i - 1]))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be greater than the crank angle "
                                "before it: the angles must increase strictly");
    }
    if (!(in->cylinders >= 1))
        return gc_error_set(err, GC_ERR_INVALID, "/cylinders", "must be at least 1");
    if (in->strokes != 2 && in->strokes != 4)
        return gc_error_set(err, GC_ERR_INVALID, "/strokes_per_cycle", "must be 2 or 4");
    if (!(in->speed >= 0.0 && isfinite(in->speed)))
        return gc_error_set(err, GC_ERR_INVALID, "/speed", "must be positive");
    if (!(in->intake_temperature >= 150.0 && in->intake_temperature <= 1000.0))
        return gc_error_set(err, GC_ERR_RANGE, "/intake_temperature",
                            "must lie between 150 and 1000 K");
    if (!(in->intake_pressure >= 0.0 && isfinite(in->intake_pressure)))
        return gc_error_set(err, GC_ERR_INVALID, "/intake_pressure", "must be positive");
    if (!(in->fuel_per_cycle >= 0.0 && isfinite(in->fuel_per_cycle)))
        return gc_error_set(err, GC_ERR_INVALID, "/fuel_per_cycle", "must be positive");
    if (in->pv)
        return GC_OK;
    const gc_measured_geometry *g = &in->geometry;
    if (!finite_pos(g->bore))
        return gc_error_set(err, GC_ERR_INVALID, "/bore", "must be a positive length");
    if (!finite_pos(g->stroke))
        return gc_error_set(err, GC_ERR_INVALID, "/stroke", "must be a positive length");
    if (!(isfinite(g->rod_length) && g->rod_length > 0.5 * g->stroke))
        return gc_error_set(err, GC_ERR_INVALID, "/connecting_rod_length", "must exceed the "
                            "crank radius (half the stroke, %.6g m)", 0.5 * g->stroke);
    if (!(isfinite(g->compression_ratio) && g->compression_ratio > 1.0 &&
          g->compression_ratio <= 100.0))
        return gc_error_set(err, GC_ERR_INVALID, "/compression_ratio",
                            "must be greater than 1 and at most 100");
    double period = in->strokes == 4 ? 4.0 * PI : 2.0 * PI;
    double span = in->x[in->n - 1] - in->x[0];
    /* the closing segment (last sample back to the first one cycle on) may be as
     * long as the longest step of the trace, or GC_MEASURED_TRACE_GAP_DEG */
    double gap = GC_MEASURED_TRACE_GAP_DEG * PI / 180.0;
    for (int i = 1; i < in->n; i++)
        if ((in->x[i] - in->x[i - 1]) * (1.0 + 1e-9) > gap)
            gap = (in->x[i] - in->x[i - 1]) * (1.0 + 1e-9);
    if (span > period * (1.0 + 1e-12) || span < period - gap) {
        snprintf(f, sizeof f, "%s/%d/0", tf, in->n - 1);
        return gc_error_set(err, GC_ERR_INVALID, f, "the trace spans %.6g degrees; it must "
                            "cover one full cycle of %.0f degrees (%d-stroke), short of it by at most "
                            "the longest sample step or %.0f degrees", span * 180.0 / PI,
                            period * 180.0 / PI, in->strokes, GC_MEASURED_TRACE_GAP_DEG);
    }
    const double *w[2] = { in->compression_window, in->expansion_window };
    const char *wf[2] = { "/compression_window", "/expansion_window" };
    for (int k = 0; k < 2; k++)
        if (!(isfinite(w[k][0]) && isfinite(w[k][1]) && w[k][0] < w[k][1] &&
              w[k][0] >= -PI && w[k][1] <= PI))
            return gc_error_set(err, GC_ERR_INVALID, wf[k], "must be two crank angles from "
                                "firing TDC, the first below the second, within -180..180 deg");
    return GC_OK;
}

/* One trace reduction: the input, the result and the volumes. */
typedef struct trc {
    const gc_measured_trace_input *in;
    gc_measured_trace_result *r;
    gc_error *err;
    int n;
    const char *tf;            /* "/trace" or "/pv_trace" */
    double period;             /* one cycle in crank angle (rad) */
    double *V;                 /* volume at each sample */
    double *th;                /* crank angle from firing TDC (rad); NULL for a P-V trace */
    int kmax;                  /* the sample of highest pressure */
    double P1, T1;             /* intake state */
} trc;

/* Volumes, their range, the peak-pressure sample, displacement and ratio. */
static int trace_volumes(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    double *V = t->V;
    for (int i = 0; i < t->n; i++) {
        if (in->pv) {
            V[i] = in->x[i];
        } else {
            t->th[i] = wrap(in->x[i] - in->tdc_angle, t->period);
            V[i] = gc_measured_volume(&in->geometry, t->th[i], NULL);
        }
    }
    r->V_min = r->V_max = V[0];
    t->kmax = 0;
    for (int i = 1; i < t->n; i++) {
        if (V[i] < r->V_min)
            r->V_min = V[i];
        if (V[i] > r->V_max)
            r->V_max = V[i];
        if (in->P[i] > in->P[t->kmax])
            t->kmax = i;
    }
    if (!in->pv) {
        r->displacement = gc_measured_displacement(&in->geometry);
        r->clearance = gc_measured_clearance(&in->geometry);
        r->compression_ratio = in->geometry.compression_ratio;
        return GC_OK;
    }
    r->displacement = r->V_max - r->V_min;
    r->clearance = r->V_min;
    if (!(r->V_max > r->V_min * (1.0 + 1e-9)))
        return gc_error_set(t->err, GC_ERR_INVALID, t->tf, "holds no change of volume");
    r->compression_ratio = r->V_max / r->V_min;
    return GC_OK;
}

/* The loop integral, trapezoid rule in V (closing segment last -> first),
 * gross and pumping loops apart for a 4-stroke crank-angle trace. */
static void trace_loop(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    double gross = 0.0, pump = 0.0;
    for (int i = 0; i < t->n; i++) {
        int j = (i + 1) % t->n;
        double dW = 0.5 * (in->P[i] + in->P[j]) * (t->V[j] - t->V[i]);
        int is_gross = 1;
        if (!in->pv && in->strokes == 4) {
            double xj = j ? in->x[j] : in->x[0] + t->period;
            double mid = wrap(0.5 * (in->x[i] + xj) - in->tdc_angle, t->period);
            is_gross = fabs(mid) < PI;
        }
        if (is_gross)
            gross += dW;
        else
            pump += dW;
    }
    r->work_gross = gross;
    r->work_pumping = pump;
    r->work_net = gross + pump;
    if (in->pv || in->strokes == 2) {
        r->work_gross = r->work_net;
        r->work_pumping = 0.0;
    }
    r->imep_net = r->work_net / r->displacement;
    r->imep_gross = r->work_gross / r->displacement;
    r->pmep = -r->work_pumping / r->displacement;
    if (in->speed > 0.0) {
        r->has_power = 1;
        double cycles = in->speed / (0.5 * in->strokes);
        r->power_net = r->work_net * in->cylinders * cycles;
        r->power_gross = r->work_gross * in->cylinders * cycles;
    }
    r->P_max = in->P[t->kmax];
    r->angle_P_max = in->pv ? 0.0 : t->th[t->kmax];
    r->V_P_max = t->V[t->kmax];
}

/* A loop that does not close; samples too far apart. */
static void trace_sampling_warnings(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    double pf = in->P[0], pl = in->P[t->n - 1];
    r->loop_mismatch = fabs(pl - pf) / (pf > pl ? pf : pl);
    if (r->loop_mismatch > GC_MEASURED_LOOP_TOL)
        warn(r->warnings, &r->n_warnings, "loop_not_closed", t->tf,
             "the first and last pressures differ by %.1f %% (more than %.0f %%): the trace "
             "may not cover one whole cycle, or the sensor drifted; the loop is closed by a "
             "straight line", 100.0 * r->loop_mismatch, 100.0 * GC_MEASURED_LOOP_TOL);
    if (in->pv)
        return;
    double step_max = 0.0;
    for (int i = 1; i < t->n; i++)
        if (in->x[i] - in->x[i - 1] > step_max)
            step_max = in->x[i] - in->x[i - 1];
    if (step_max > 2.0 * PI / 180.0)
        warn(r->warnings, &r->n_warnings, "coarse_sampling", t->tf,
             "samples are up to %.2g degrees apart; the trapezoid rule's error falls with "
             "the square of the step, and 1 degree or finer is usual (common practice)",
             step_max * 180.0 / PI);
}

/* A P-V trace's branches: from the TDC sample next to the peak, back while
 * V grows (compression) and forward while V grows (expansion), the samples
 * between 20 and 70 % of the stroke. */
static void pv_branches(trc *t, fit_acc *fc, fit_acc *fe)
{
    const double *V = t->V, *P = t->in->P;
    gc_measured_trace_result *r = t->r;
    int n = t->n;
    double lo = r->V_min + 0.2 * r->displacement, hi = r->V_min + 0.7 * r->displacement;
    int tdc = pv_tdc(V, n, t->kmax);
    for (int s = 0, i = tdc; s < n; s++) {
        int prev = (i - 1 + n) % n;
        if (V[i] >= lo && V[i] <= hi)
            fit_add(fc, V[i], P[i]);
        if (!(V[prev] >= V[i]))
            break;
        i = prev;
    }
    for (int s = 0, i = tdc; s < n; s++) {
        int next = (i + 1) % n;
        if (V[i] >= lo && V[i] <= hi)
            fit_add(fe, V[i], P[i]);
        if (!(V[next] >= V[i]))
            break;
        i = next;
    }
    r->compression.window[0] = r->expansion.window[0] = 0.2;
    r->compression.window[1] = r->expansion.window[1] = 0.7;
}

/* The polytropic fits of compression and expansion. */
static int trace_fits(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    fit_acc fc = { 0 }, fe = { 0 };
    if (in->pv) {
        pv_branches(t, &fc, &fe);
    } else {
        for (int i = 0; i < t->n; i++) {
            if (t->th[i] >= in->compression_window[0] && t->th[i] <= in->compression_window[1])
                fit_add(&fc, t->V[i], in->P[i]);
            if (t->th[i] >= in->expansion_window[0] && t->th[i] <= in->expansion_window[1])
                fit_add(&fe, t->V[i], in->P[i]);
        }
        r->compression.window[0] = in->compression_window[0];
        r->compression.window[1] = in->compression_window[1];
        r->expansion.window[0] = in->expansion_window[0];
        r->expansion.window[1] = in->expansion_window[1];
    }
    int rc = fit_finish(&fc, &r->compression, in->pv ? t->tf : "/compression_window", t->err);
    if (rc == GC_OK)
        rc = fit_finish(&fe, &r->expansion, in->pv ? t->tf : "/expansion_window", t->err);
    if (rc == GC_OK)
        r->has_fits = 1;
    return rc;
}

/* The intake pressure when not given: a P-V trace's start of compression,
 * else the sample nearest BDC before compression (theta = -180 deg). */
static double trace_intake_pressure(const trc *t)
{
    const gc_measured_trace_input *in = t->in;
    int n = t->n;
    double P1 = in->intake_pressure;
    if (P1 > 0.0)
        return P1;
    if (in->pv) {
        int k = pv_tdc(t->V, n, t->kmax);   /* back to the start of the compression branch */
        for (int s = 0; s < n && t->V[(k - 1 + n) % n] >= t->V[k]; s++)
            k = (k - 1 + n) % n;
        return in->P[k];
    }
    double best = 1e300;
    for (int i = 0; i < n; i++) {
        double d = fabs(t->th[i] + PI);
        if (in->strokes == 2 && fabs(t->th[i] - PI) < d)
            d = fabs(t->th[i] - PI);
        if (d < best) {
            best = d;
            P1 = in->P[i];
        }
    }
    return P1;
}

/* Intake state, trapped mass, highest mean gas temperature. */
static void trace_gas(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    t->P1 = trace_intake_pressure(t);
    t->T1 = in->intake_temperature;
    r->intake_temperature = t->T1;
    r->intake_pressure = t->P1;
    double Vbdc = in->pv ? r->V_max : r->clearance + r->displacement;
    double R = in->gas.R_J_per_kgK;
    r->trapped_mass = t->P1 * Vbdc / (R * t->T1);
    for (int i = 0; i < t->n; i++) {
        if (!in->pv && in->strokes == 4 && fabs(t->th[i]) >= PI)
            continue;   /* gas exchange: the trapped mass is not in the cylinder */
        double T = in->P[i] * t->V[i] / (r->trapped_mass * R);
        if (T > r->T_mean_max) {
            r->T_mean_max = T;
            r->P_at_T_mean_max = in->P[i];
        }
    }
}

static void trace_fuel(const gc_measured_trace_input *in, gc_measured_trace_result *r)
{
    if (in->fuel_per_cycle > 0.0 && in->fuel_heating_value > 0.0) {
        r->has_fuel = 1;
        r->fuel_energy = in->fuel_per_cycle * in->fuel_heating_value;
        r->efficiency_gross = r->work_gross / r->fuel_energy;
        r->efficiency_net = r->work_net / r->fuel_energy;
    } else if (in->fuel_per_cycle > 0.0) {
        warn(r->warnings, &r->n_warnings, "fuel_without_heating_value", "/fuel",
             "fuel_per_cycle needs the fuel (or fuel_heating_value) for the indicated "
             "efficiency");
    }
}

/* The ideal Otto cycle for comparison (same gas, intake state and ratio;
 * the fuel's heat, or the hottest mean gas temperature); its states join
 * the validity scan. */
static int trace_ideal(trc *t)
{
    const gc_measured_trace_input *in = t->in;
    gc_measured_trace_result *r = t->r;
    gc_piston_input *pi = malloc(sizeof *pi);
    gc_piston_result *pr = malloc(sizeof *pr);
    if (!pi || !pr) {
        free(pi);
        free(pr);
        return gc_error_set(t->err, GC_ERR_NOMEM, "", "out of memory");
    }
    gc_piston_input_init(pi, GC_PISTON_OTTO);
    pi->gas = in->gas;
    pi->intake_temperature = t->T1;
    pi->intake_pressure = t->P1;
    pi->compression_ratio = r->compression_ratio;
    pi->flags = GC_CYCLE_NO_AREAS;
    if (r->has_fuel) {
        r->heat_from_fuel = 1;
        pi->heat_added = r->fuel_energy / r->trapped_mass;
    } else {
        pi->peak_temperature = r->T_mean_max;
    }
    gc_error perr;
    gc_error_clear(&perr);
    if (gc_piston_evaluate(pi, pr, &perr) == GC_OK) {
        const gc_cycle_summary *sm = &pr->cycle.actual.summary;
        r->has_ideal = 1;
        r->ideal_heat_added = sm->heat_in;
        r->ideal_efficiency = sm->thermal_efficiency;
        r->ideal_work = r->trapped_mass * sm->net_work;
        r->ideal_mep = sm->mean_effective_pressure;
        r->ideal_peak_pressure = sm->P_max_Pa;
        r->ideal_peak_temperature = sm->T_max_K;
        gc_validity_scan_run(&r->validity, &pr->cycle.actual, "ideal Otto ");
        if (r->has_fuel)
            r->fraction_of_ideal = r->efficiency_gross / r->ideal_efficiency;
        else
            r->fraction_of_ideal = r->work_gross / r->ideal_work;
    } else {
        warn(r->warnings, &r->n_warnings, "no_ideal_cycle",
             r->has_fuel ? "/fuel_per_cycle" : t->tf,
             "no ideal Otto cycle for comparison: %.180s", perr.message);
    }
    free(pi);
    free(pr);
    return GC_OK;
}

int gc_measured_trace_reduce(const gc_measured_trace_input *in, gc_measured_trace_result *r,
                             gc_error *err)
{
    memset(r, 0, sizeof *r);
    int rc = trace_validate(in, err);
    if (rc != GC_OK)
        return rc;
    trc t = { .in = in, .r = r, .err = err, .n = in->n, .tf = in->pv ? "/pv_trace" : "/trace",
              .period = in->strokes == 4 ? 4.0 * PI : 2.0 * PI };
    t.V = calloc((size_t)t.n, sizeof *t.V);
    t.th = in->pv ? NULL : calloc((size_t)t.n, sizeof *t.th);
    if (!t.V || (!in->pv && !t.th)) {
        free(t.V);
        free(t.th);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    }
    rc = trace_volumes(&t);
    if (rc == GC_OK) {
        trace_loop(&t);
        trace_sampling_warnings(&t);
        rc = trace_fits(&t);
    }
    if (rc == GC_OK)
        trace_gas(&t);
    free(t.V);
    free(t.th);
    if (rc != GC_OK)
        return rc;
    trace_fuel(in, r);
    /* the real-gas and dissociation rules (validity.h): the trace's hottest mean gas
     * state, then the ideal Otto cycle's states */
    gc_validity_scan_init(&r->validity);
    if (r->T_mean_max > 0.0)
        gc_validity_scan_state(&r->validity, &in->gas, r->T_mean_max, r->P_at_T_mean_max,
                               "the trace's hottest mean gas state");
    return trace_ideal(&t);
}
