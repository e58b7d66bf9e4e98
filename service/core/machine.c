/*
 * machine.c — the machine's definition (machine.h): defaults, bounds, the
 * design-point solve from a Brayton description or from rated figures, and
 * the helpers the machine's files share (warnings, error prefixes, the
 * one-dimensional root finder).
 *
 * Rated figures (FROM_RATING), in order:
 *   fuel flow      m_f = HR x P_net / LHV
 *   air flow       m_a = m_exh - m_f, far = m_f / m_a
 *   compressor     T2 from the isentropic efficiency (or the efficiency from
 *                  T2) with the variable-property isentrope of gas.h
 *   firing         the combustor balance of combustion.h (far, burner
 *                  efficiency) from T2: the mixed rotor-inlet temperature
 *   turbine        eta_t = (h3 - h4)/(h3 - h4s) from the firing temperature
 *                  to the exhaust temperature at the exhaust pressure
 *   mechanical     eta_m = P_net / (eta_g m_a w_net), w_net of the engine's
 *                  chain run with the figures above: it closes the energy
 *                  balance; above 1 the figures create energy (error, with
 *                  the least heat rate that would close it), below 0.90 they
 *                  leave more than 10 % unaccounted (error; below 0.95 a
 *                  warning). Mechanical and auxiliary losses of about 1 % and
 *                  generator losses of about 1.5 % are usual (common practice).
 *
 * Root finder (gc__machine_root): secant steps until a sign change brackets
 * the root, then Brent's method (R. P. Brent, "Algorithms for Minimization
 * without Derivatives", Prentice-Hall 1973, ch. 4: inverse quadratic
 * interpolation, secant and bisection steps).
 *
 * Units: SI (K, Pa, kg/s, W, J/kg).
 */
#include "core/machine_internal.h"
#include "core/preset_util.h"

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#define POWER_MAX 1e10          /* W, as brayton.c */
#define T_LIMIT_MIN_K 300.0     /* accepted temperature limits, K */
#define T_LIMIT_MAX_K 2500.0
#define ETA_MIN 0.5             /* solved component efficiencies below this: refused */
#define ETA_M_MIN 0.90          /* solved mechanical efficiency: refused below */
#define ETA_M_WARN 0.95         /* solved mechanical efficiency: warned below */

/* ---- shared helpers ------------------------------------------------------ */

void gc__machine_warn(gc_machine_warning *list, int *n, const char *code, const char *field,
                      const char *fmt, ...)
{
    if (*n >= GC_MACHINE_MAX_WARNINGS)
        return;
    gc_machine_warning *w = &list[(*n)++];
    va_list ap;
    snprintf(w->code, sizeof w->code, "%s", code);
    snprintf(w->field, sizeof w->field, "%s", field ? field : "");
    va_start(ap, fmt);
    vsnprintf(w->message, sizeof w->message, fmt, ap);
    va_end(ap);
}

/* dst = a + b, cut to n - 1 characters (JSON pointers are short). */
static void join(char *dst, size_t n, const char *a, const char *b)
{
    size_t la = strlen(a), lb = strlen(b);
    if (la > n - 1)
        la = n - 1;
    if (lb > n - 1 - la)
        lb = n - 1 - la;
    memmove(dst + la, b, lb); /* b may be dst itself */
    memcpy(dst, a, la);
    dst[la + lb] = '\0';
}

int gc__machine_prefix(gc_error *err, const char *prefix, int rc)
{
    if (err == NULL || rc == GC_OK)
        return rc;
    char f[GC_ERROR_FIELD_LEN];
    memcpy(f, err->field, sizeof f);
    f[sizeof f - 1] = '\0';
    join(err->field, sizeof err->field, prefix, f);
    return rc;
}

int gc__machine_resite(gc_error *err, const char *with, int rc)
{
    if (err == NULL || rc == GC_OK || strncmp(err->field, "/site", 5) != 0)
        return rc;
    char f[GC_ERROR_FIELD_LEN];
    memcpy(f, err->field + 5, sizeof f - 5);
    f[sizeof f - 6] = '\0';
    join(err->field, sizeof err->field, with, f);
    return rc;
}

/* Brent's zeroin on the bracket [a, b] with f(a) fa, f(b) fb of opposite signs. */
static int brent(gc__mroot_fn f, void *ctx, double a, double fa, double b, double fb,
                 double xtol, double ytol, double *x, double *y, gc_error *err)
{
    double c = b, fc = fb, d = b - a, e = d;
    for (int it = 0; it < 2 * GC__M_MAXIT; it++) {
        if ((fb > 0.0 && fc > 0.0) || (fb < 0.0 && fc < 0.0)) {
            c = a;
            fc = fa;
            e = d = b - a;
        }
        if (fabs(fc) < fabs(fb)) {
            a = b; b = c; c = a;
            fa = fb; fb = fc; fc = fa;
        }
        double tol1 = 2.0 * DBL_EPSILON * fabs(b) + 0.5 * xtol;
        double xm = 0.5 * (c - b);
        if (fabs(xm) <= tol1 || fabs(fb) <= ytol) {
            *x = b;
            *y = fb;
            return GC_OK;
        }
        if (fabs(e) >= tol1 && fabs(fa) > fabs(fb)) {
            double s = fb / fa, p, q;
            if (a == c) {
                p = 2.0 * xm * s;
                q = 1.0 - s;
            } else {
                double r = fb / fc;
                q = fa / fc;
                p = s * (2.0 * xm * q * (q - r) - (b - a) * (r - 1.0));
                q = (q - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if (p > 0.0)
                q = -q;
            p = fabs(p);
            double min1 = 3.0 * xm * q - fabs(tol1 * q), min2 = fabs(e * q);
            if (2.0 * p < fmin(min1, min2)) {
                e = d;
                d = p / q;
            } else {
                d = xm;
                e = d;
            }
        } else {
            d = xm;
            e = d;
        }
        a = b;
        fa = fb;
        b += fabs(d) > tol1 ? d : (xm > 0.0 ? tol1 : -tol1);
        int rc = f(ctx, b, &fb, err);
        if (rc != GC_OK)
            return rc;
    }
    *x = b;
    *y = fb;
    return GC_ERR_NOCONV;
}

int gc__machine_bracket(gc__mroot_fn f, void *ctx, double a, double fa, double b, double fb,
                        double xtol, double ytol, double *x, double *y, gc_error *err)
{
    if (fabs(fa) <= ytol || fabs(fb) <= ytol) {
        *x = fabs(fa) <= fabs(fb) ? a : b;
        *y = fabs(fa) <= fabs(fb) ? fa : fb;
        return GC_OK;
    }
    return brent(f, ctx, a, fa, b, fb, xtol, ytol, x, y, err);
}

int gc__machine_root(gc__mroot_fn f, void *ctx, double x0, double y0, double x1, double lo,
                     double hi, double xtol, double ytol, double *x, double *y, gc_error *err)
{
    double xa = x0, ya = y0;
    double xb = fmin(fmax(x1, lo), hi), yb = 0.0;
    *x = x0;
    *y = y0;
    if (fabs(y0) <= ytol)
        return GC_OK;
    if (xb == xa)
        xb = (xa - lo > hi - xa) ? fmax(lo, xa - 1e-3 * (hi - lo)) : fmin(hi, xa + 1e-3 * (hi - lo));
    for (int it = 0; it < GC__M_MAXIT; it++) {
        int rc = f(ctx, xb, &yb, err);
        if (rc != GC_OK)
            return rc;
        if (fabs(yb) <= ytol) {
            *x = xb;
            *y = yb;
            return GC_OK;
        }
        if ((ya < 0.0) != (yb < 0.0))
            return brent(f, ctx, xa, ya, xb, yb, xtol, ytol, x, y, err);
        if (fabs(yb) < fabs(*y)) {
            *x = xb;
            *y = yb;
        }
        if (ya == yb)
            return GC_ERR_NOCONV;
        double xn = xb - yb * (xb - xa) / (yb - ya);
        if (!isfinite(xn))
            return GC_ERR_NOCONV;
        xn = fmin(fmax(xn, lo), hi);
        if (xn == xb) /* pinned at a bound with no sign change: no root inside */
            return GC_ERR_INFEASIBLE;
        xa = xb;
        ya = yb;
        xb = xn;
    }
    return GC_ERR_NOCONV;
}

/* ---- names ------------------------------------------------------------- */

const char *gc_machine_control_name(int control)
{
    switch (control) {
    case GC_MACHINE_BASE_LOAD: return "base_load";
    case GC_MACHINE_IGV_CONTROL: return "inlet_guide_vanes";
    case GC_MACHINE_FIRING_CONTROL: return "firing_temperature";
    default: return "unknown";
    }
}

const char *gc_machine_limit_name(int limit)
{
    switch (limit) {
    case GC_MACHINE_LIMIT_FIRING: return "firing_temperature";
    case GC_MACHINE_LIMIT_EXHAUST: return "exhaust_temperature";
    case GC_MACHINE_LIMIT_NONE: return "none";
    default: return "unknown";
    }
}

const char *gc_machine_inlet_name(int kind)
{
    switch (kind) {
    case GC_MACHINE_INLET_NONE: return "none";
    case GC_MACHINE_INLET_EVAPORATIVE: return "evaporative_cooler";
    case GC_MACHINE_INLET_FOGGING: return "fogging";
    case GC_MACHINE_INLET_CHILLER: return "chiller";
    default: return "unknown";
    }
}

/* ---- defaults --------------------------------------------------------- */

void gc_machine_inlet_init(gc_machine_inlet *in)
{
    memset(in, 0, sizeof *in);
    in->kind = GC_MACHINE_INLET_NONE;
    in->evaporative_effectiveness = GC_MACHINE_DEFAULT_EVAP_EFF;
    in->chiller_temperature_K = GC_MACHINE_DEFAULT_CHILLER_T_K;
    in->chiller_cop = GC_MACHINE_DEFAULT_CHILLER_COP;
}

void gc_machine_spec_init(gc_machine_spec *s)
{
    memset(s, 0, sizeof *s);
    s->design_kind = GC_MACHINE_FROM_CYCLE;
    gc_brayton_input_init(&s->design);
    s->rating.combustor_efficiency = 1.0;
    s->rating.generator_efficiency = 1.0;
    gc_site_input_init(&s->rating.site);
    gc_site_input_init(&s->reference);
    s->igv_minimum_flow_fraction = 1.0;
    s->minimum_load_fraction = GC_MACHINE_DEFAULT_MIN_LOAD;
    s->cooling.blade_temperature_K = GC_MACHINE_DEFAULT_BLADE_T_K;
    s->cooling.nozzle_constant = GC_MACHINE_DEFAULT_COOLING_K;
    s->cooling.rotor_constant = GC_MACHINE_DEFAULT_COOLING_K;
}

void gc_machine_site_input_init(gc_machine_site_input *in)
{
    memset(in, 0, sizeof *in);
    gc_site_input_init(&in->site);
    gc_machine_inlet_init(&in->inlet);
    in->load = GC_MACHINE_LOAD_BASE;
}

void gc_machine_curve_input_init(gc_machine_curve_input *in)
{
    memset(in, 0, sizeof *in);
    in->variable = GC_MACHINE_VARY_TEMPERATURE;
    in->from = 263.15;
    in->to = 313.15;
    in->points = 21;
    gc_machine_inlet_init(&in->inlet);
}

void gc_machine_readings_init(gc_machine_readings *rd)
{
    memset(rd, 0, sizeof *rd);
    gc_site_input_init(&rd->site);
    gc_machine_inlet_init(&rd->inlet);
    rd->balance_tolerance = GC_MACHINE_DEFAULT_BALANCE_TOL;
}

/* ---- bounds ------------------------------------------------------------- */

static void check_range(gc__errlist *L, double x, double lo, double hi, const char *field)
{
    if (!isfinite(x) || x < lo || x > hi)
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be from %g to %g", lo, hi);
}

/* 0 (not given) or inside (lo, hi] */
static void check_opt(gc__errlist *L, double x, double lo, double hi, const char *field)
{
    if (x != 0.0 && (!isfinite(x) || !(x > lo) || x > hi))
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be 0 (not given) or above %g up to %g",
                        lo, hi);
}

static void check_rating(gc__errlist *L, const gc_machine_rating *R)
{
    if (!isfinite(R->net_power_W) || !(R->net_power_W > 0.0) || R->net_power_W > POWER_MAX)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/net_power", "is required: above 0 up to %g W",
                        POWER_MAX);
    if (!isfinite(R->heat_rate) || !(R->heat_rate > 1.0) || R->heat_rate > 10.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/heat_rate",
                        "is required: above 1 up to 10 J/J (3600 to 36000 kJ/kWh)");
    if (!isfinite(R->exhaust_mass_flow_kg_per_s) || !(R->exhaust_mass_flow_kg_per_s > 0.0) ||
        R->exhaust_mass_flow_kg_per_s > 1e5)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/exhaust_mass_flow",
                        "is required: above 0 up to 1e5 kg/s");
    if (!isfinite(R->exhaust_temperature_K) || !(R->exhaust_temperature_K > 300.0) ||
        R->exhaust_temperature_K > 2000.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/exhaust_temperature",
                        "is required: above 300 K up to 2000 K");
    if (!isfinite(R->pressure_ratio) || !(R->pressure_ratio > 1.0) ||
        R->pressure_ratio > GC_BRAYTON_RP_MAX)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/pressure_ratio",
                        "is required: above 1 up to %g", GC_BRAYTON_RP_MAX);
    check_opt(L, R->compressor_efficiency, ETA_MIN, 1.0, "/rating/compressor_efficiency");
    check_opt(L, R->compressor_exit_temperature_K, 200.0, 2000.0,
              "/rating/compressor_exit_temperature");
    if (R->compressor_efficiency == 0.0 && R->compressor_exit_temperature_K == 0.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/compressor_efficiency",
                        "give the compressor efficiency or the compressor exit temperature: "
                        "the other rated figures do not fix how the work splits between "
                        "compressor and turbine");
    if (R->compressor_efficiency != 0.0 && R->compressor_exit_temperature_K != 0.0)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/compressor_exit_temperature",
                        "give either the compressor efficiency or the compressor exit "
                        "temperature, not both (one would have to be overruled)");
    gc__check_loss(L, R->inlet_pressure_loss, "/rating/inlet_pressure_loss");
    gc__check_loss(L, R->combustor_pressure_loss, "/rating/combustor_pressure_loss");
    gc__check_loss(L, R->exhaust_pressure_loss, "/rating/exhaust_pressure_loss");
    gc__check_eff(L, R->combustor_efficiency, "/rating/combustor_efficiency");
    gc__check_eff(L, R->generator_efficiency, "/rating/generator_efficiency");
    if (!R->has_fuel)
        gc__errlist_add(L, GC_ERR_INVALID, "/rating/fuel", "is required");
    check_opt(L, R->fuel_temperature_K, 0.0, 1000.0, "/rating/fuel_temperature");
}

int gc_machine_validate(const gc_machine_spec *s, gc_error *errs, int max_errors,
                        int *n_errors)
{
    gc__errlist L = { errs, max_errors, 0, GC_OK };
    if (s->design_kind != GC_MACHINE_FROM_CYCLE && s->design_kind != GC_MACHINE_FROM_RATING)
        gc__errlist_add(&L, GC_ERR_INVALID, "/design_kind", "must be a cycle or a rating");
    if (s->design_kind == GC_MACHINE_FROM_RATING)
        check_rating(&L, &s->rating);
    check_range(&L, s->compressor_speed_exponent, 0.0, 4.0, "/laws/compressor_speed_exponent");
    check_range(&L, s->igv_minimum_flow_fraction, 0.5, 1.0, "/laws/igv_minimum_flow_fraction");
    check_range(&L, s->igv_efficiency_coefficient, 0.0, 2.0, "/laws/igv_efficiency_coefficient");
    check_opt(&L, s->firing_temperature_limit_K, T_LIMIT_MIN_K, T_LIMIT_MAX_K,
              "/laws/firing_temperature_limit");
    check_opt(&L, s->exhaust_temperature_limit_K, T_LIMIT_MIN_K, T_LIMIT_MAX_K,
              "/laws/exhaust_temperature_limit");
    check_range(&L, s->minimum_load_fraction, 0.0, 0.9, "/laws/minimum_load_fraction");
    if (s->cooling.enabled != 0 && s->cooling.enabled != 1)
        gc__errlist_add(&L, GC_ERR_INVALID, "/cooling/enabled", "must be 0 or 1");
    if (s->cooling.enabled) {
        check_range(&L, s->cooling.blade_temperature_K, GC_MACHINE_COOLING_MIN_BLADE_T_K,
                    GC_MACHINE_COOLING_MAX_BLADE_T_K, "/cooling/blade_temperature");
        check_range(&L, s->cooling.nozzle_constant, 0.0, GC_MACHINE_COOLING_MAX_K,
                    "/cooling/nozzle_constant");
        check_range(&L, s->cooling.rotor_constant, 0.0, GC_MACHINE_COOLING_MAX_K,
                    "/cooling/rotor_constant");
    }
    return gc__errlist_finish(&L, n_errors);
}

/* ---- design from a Brayton description ------------------------------------ */

static int check_cycle_design(const gc_brayton_input *d, gc_error *err)
{
    if (d->heat_mode != GC_BRAYTON_FUEL || !d->has_fuel)
        return gc_error_set(err, GC_ERR_INVALID, "/design/fuel",
                            "a machine burns a fuel: give one (heat rates need it)");
    if (!(d->net_power > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/design/net_power",
                            "the rated net output is required: it fixes the design air flow");
    if (d->compressor_stages != 1)
        return gc_error_set(err, GC_ERR_INVALID, "/design/compressor_stages",
                            "the machine model is a simple cycle: one compressor stage");
    if (d->turbine_stages != 1)
        return gc_error_set(err, GC_ERR_INVALID, "/design/turbine_stages",
                            "the machine model is a simple cycle: one turbine stage");
    if (d->regenerator_effectiveness != 0.0)
        return gc_error_set(err, GC_ERR_INVALID, "/design/regenerator_effectiveness",
                            "the machine model is a simple cycle: no regenerator");
    if (d->has_gas)
        return gc_error_set(err, GC_ERR_INVALID, "/design/gas",
                            "a machine breathes the site's humid air: leave the gas out");
    if (d->cooling.enabled)
        return gc_error_set(err, GC_ERR_INVALID, "/design/cooling",
                            "give the machine's cooled turbine as its own cooling model "
                            "(the design's would be applied twice)");
    int n = 0;
    gc_error first;
    int rc = gc_brayton_validate(d, &first, 1, &n);
    if (rc != GC_OK) {
        if (err != NULL)
            *err = first;
        return gc__machine_prefix(err, "/design", rc);
    }
    return GC_OK;
}

/* One chain run of bin at its own site (resolved S): T2, the air gas. */
static int design_chain(gc__mctx *X, gc_error *err)
{
    int rc = gc_brayton_build(&X->bin, &X->site, &X->chain, &X->st, err);
    if (rc != GC_OK)
        return rc;
    X->chain.flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
    X->runs++;
    return gc_cycle_run_chain(&X->chain, &X->run, err);
}

/* FROM_CYCLE with cooling: the chain burns to the mixed rotor inlet that the
 * given combustor exit gives. */
static int cooled_chain_temperature(const gc_machine_spec *s, gc__mctx *X, gc_error *err)
{
    int rc = design_chain(X, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/design", rc);
    const gc_cycle_state *c2 = &X->run.states[X->st.compressor_exit];
    gc_machine_cooled cool;
    rc = gc_machine_cooling_from_tit(&s->cooling, &X->bin.fuel,
                                     gc__machine_fuel_T(X->bin.fuel_temperature),
                                     &X->run.gases[c2->gas], c2->T_K,
                                     X->bin.combustor_efficiency,
                                     X->bin.turbine_inlet_temperature, &cool, err);
    if (rc != GC_OK)
        return rc;
    X->bin.turbine_inlet_temperature = cool.rotor_inlet_T_K;
    return GC_OK;
}

/* ---- design from rated figures ------------------------------------------ */

typedef struct rating_ctx {
    const gc_machine_rating *R;
    gc__mctx *X;
    double m_air, far, T2, eta_c, T3, eta_t, eta_m;
} rating_ctx;

/* The compressor exit temperature and efficiency, from one of the two. */
static int rating_compressor(rating_ctx *C, gc_error *err)
{
    const gc_machine_rating *R = C->R;
    const gc_gas *air = &C->X->site.gas;
    const double T1 = C->X->site.T_K, rp = R->pressure_ratio;
    double T2s = 0.0;
    int rc = gc_gas_T_isentropic_P(air, T1, rp, &T2s, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    double h1 = gc_gas_h_T(air, T1), h2s = gc_gas_h_T(air, T2s);
    if (R->compressor_efficiency > 0.0) {
        C->eta_c = R->compressor_efficiency;
        rc = gc_gas_T_from_h(air, h1 + (h2s - h1) / C->eta_c, &C->T2, err);
        if (rc != GC_OK)
            return gc__machine_prefix(err, "/rating", rc);
    } else {
        C->T2 = R->compressor_exit_temperature_K;
        if (!(C->T2 > T2s))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/compressor_exit_temperature",
                                "%.2f K is %.2f K below the isentropic compression temperature "
                                "%.2f K at pressure ratio %g: it needs a compressor efficiency "
                                "above 1", C->T2, T2s - C->T2, T2s, rp);
        C->eta_c = (h2s - h1) / (gc_gas_h_T(air, C->T2) - h1);
        if (C->eta_c < ETA_MIN)
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/compressor_exit_temperature",
                                "%.2f K implies a compressor efficiency of %.3f, below %.2f",
                                C->T2, C->eta_c, ETA_MIN);
    }
    return GC_OK;
}

/* Component figures for a heat rate HR (J/J); eta_m from the chain run. */
static int rating_figures(rating_ctx *C, double HR, gc_error *err)
{
    const gc_machine_rating *R = C->R;
    gc__mctx *X = C->X;
    const gc_gas *air = &X->site.gas;
    const double rp = R->pressure_ratio;
    double m_f = HR * R->net_power_W / R->fuel.LHV_J_per_kg;
    C->m_air = R->exhaust_mass_flow_kg_per_s - m_f;
    if (!(C->m_air > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/exhaust_mass_flow",
                            "the exhaust flow %.4g kg/s is not more than the fuel flow %.4g kg/s "
                            "that the heat rate and output imply", R->exhaust_mass_flow_kg_per_s,
                            m_f);
    C->far = m_f / C->m_air;
    double far_st = 0.0;
    int rc = gc_combustion_far_stoich(&R->fuel, air, &far_st, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    if (!(C->far < far_st))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/heat_rate",
                            "the fuel flow %.4g kg/s would burn %.4g kg/s of air richer than "
                            "stoichiometric (fuel-air ratio %.4f above %.4f): the heat rate is "
                            "too high or the exhaust flow too low", m_f, C->m_air, C->far, far_st);
    rc = rating_compressor(C, err);
    if (rc != GC_OK)
        return rc;
    gc_burn b;
    rc = gc_combustion_burn_far(&R->fuel, gc__machine_fuel_T(R->fuel_temperature_K), air, C->T2, 1.0,
                                C->far, R->combustor_efficiency, &b, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    C->T3 = b.T_out_K;
    double P3 = X->site.P_Pa * (1.0 - R->inlet_pressure_loss) * rp *
                (1.0 - R->combustor_pressure_loss);
    double P4 = X->site.P_Pa / (1.0 - R->exhaust_pressure_loss);
    double T4 = R->exhaust_temperature_K, T4s = 0.0;
    if (!(T4 < C->T3))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/exhaust_temperature",
                            "%.2f K is not below the firing temperature %.2f K that the heat "
                            "rate, exhaust flow and compressor give", T4, C->T3);
    if (!(P3 > P4))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/pressure_ratio",
                            "the pressure losses take up the whole pressure ratio %g", rp);
    rc = gc_gas_T_isentropic_P(&b.products, C->T3, P4 / P3, &T4s, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    if (!(T4 > T4s))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/exhaust_temperature",
                            "%.2f K is %.2f K below the isentropic expansion end %.2f K from "
                            "the firing temperature %.2f K: it needs a turbine efficiency "
                            "above 1", T4, T4s - T4, T4s, C->T3);
    double h3 = gc_gas_h_T(&b.products, C->T3);
    C->eta_t = (h3 - gc_gas_h_T(&b.products, T4)) / (h3 - gc_gas_h_T(&b.products, T4s));
    if (C->eta_t < ETA_MIN)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/exhaust_temperature",
                            "%.2f K implies a turbine efficiency of %.3f, below %.2f", T4,
                            C->eta_t, ETA_MIN);
    X->bin.turbine_inlet_temperature = C->T3;
    X->bin.compressor_efficiency = C->eta_c;
    X->bin.turbine_efficiency = C->eta_t;
    X->bin.mechanical_efficiency = 1.0;
    rc = design_chain(X, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    double w = X->run.summary.net_work;
    if (!(w > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/exhaust_temperature",
                            "with these figures the gas path delivers no net work");
    C->eta_m = R->net_power_W / (R->generator_efficiency * C->m_air * w);
    return GC_OK;
}

static int rating_fn(void *ctx, double HR, double *y, gc_error *err)
{
    rating_ctx *C = ctx;
    int rc = rating_figures(C, HR, err);
    *y = rc == GC_OK ? C->eta_m - 1.0 : 0.0;
    return rc;
}

/* The heat rate at which eta_m = 1 (for the message), 0 when not found. */
static double least_heat_rate(rating_ctx *C, double HR, double eta_m)
{
    gc_error e;
    double x = 0.0, y = 0.0;
    double x1 = HR / eta_m;
    int rc = gc__machine_root(rating_fn, C, HR, eta_m - 1.0, x1, HR, 10.0, 1e-9, 1e-9, &x, &y,
                              &e);
    return rc == GC_OK ? x : 0.0;
}

static int from_rating(const gc_machine_spec *s, gc__mctx *X, gc_machine *m, gc_error *err)
{
    const gc_machine_rating *R = &s->rating;
    gc_brayton_input *b = &X->bin;
    gc_brayton_input_init(b);
    b->heat_mode = GC_BRAYTON_FUEL;
    b->has_fuel = 1;
    b->fuel = R->fuel;
    b->fuel_temperature = R->fuel_temperature_K;
    b->pressure_ratio = R->pressure_ratio;
    b->inlet_pressure_loss = R->inlet_pressure_loss;
    b->combustor_pressure_loss = R->combustor_pressure_loss;
    b->exhaust_pressure_loss = R->exhaust_pressure_loss;
    b->combustor_efficiency = R->combustor_efficiency;
    b->generator_efficiency = R->generator_efficiency;
    b->site = R->site;
    b->net_power = R->net_power_W;
    b->flags = GC_BRAYTON_NO_OPTIMUM;
    int rc = gc_site_resolve(&b->site, &X->site, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/rating", rc);
    rating_ctx C = { R, X, 0, 0, 0, 0, 0, 0, 0 };
    rc = rating_figures(&C, R->heat_rate, err);
    if (rc != GC_OK)
        return rc;
    if (C.eta_m > 1.0) {
        double HRmin = least_heat_rate(&C, R->heat_rate, C.eta_m);
        if (HRmin > 0.0)
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/heat_rate",
                                "%.1f kJ/kWh is %.2f %% below the least heat rate, %.1f kJ/kWh, "
                                "that gives this output with this exhaust flow and temperature "
                                "(the figures would create energy)", R->heat_rate * 3600.0,
                                100.0 * (1.0 - R->heat_rate / HRmin), HRmin * 3600.0);
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/heat_rate",
                            "the rated output is %.2f %% more than the gas path delivers with "
                            "this heat rate, exhaust flow and temperature (the figures would "
                            "create energy)", 100.0 * (C.eta_m - 1.0));
    }
    double lost_W = R->net_power_W * (1.0 / C.eta_m - 1.0);
    if (C.eta_m < ETA_M_MIN)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/rating/heat_rate",
                            "the figures leave %.2f MW (%.1f %% of the gas path's work) "
                            "unaccounted between the gas path and the terminals: the heat rate "
                            "is too high, or the exhaust flow or temperature too low, for this "
                            "output", lost_W / 1e6, 100.0 * (1.0 - C.eta_m));
    if (C.eta_m < ETA_M_WARN)
        gc__machine_warn(m->warnings, &m->n_warnings, GC_MACHINE_W_MECH_LOW, "/rating/heat_rate",
                         "the rated figures leave %.2f MW (%.1f %%) between the gas path and "
                         "the terminals (solved mechanical efficiency %.4f): more than the "
                         "usual mechanical and auxiliary losses", lost_W / 1e6,
                         100.0 * (1.0 - C.eta_m), C.eta_m);
    b->mechanical_efficiency = C.eta_m;
    return GC_OK;
}

/* ---- define -------------------------------------------------------------- */

static int design_point(gc__mctx *X, gc_machine *m, gc_error *err)
{
    const gc_brayton_input *b = &X->bin;
    int rc = design_chain(X, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/design", rc);
    double w = X->run.summary.net_work;
    if (!(w > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/design/pressure_ratio",
                            "the design cycle delivers no net work");
    m->mechanical_efficiency = b->mechanical_efficiency;
    X->m_air_open = b->net_power / (b->generator_efficiency * b->mechanical_efficiency * w);
    X->eta_c_open = b->compressor_efficiency;
    X->chiller_J_per_kg = 0.0;
    X->rp_guess = b->pressure_ratio;
    X->slope_ff = -1.0;
    X->tol_ff = GC__M_FF_TOL;
    X->tol_texh = GC__M_TEXH_TOL;
    X->rp_guess_f = 1.0;
    X->rp_guess_T = b->turbine_inlet_temperature;
    X->T1_K = X->site.T_K;
    X->P1_Pa = X->site.P_Pa * (1.0 - b->inlet_pressure_loss);
    X->R1 = X->site.gas.R_J_per_kgK;
    m->T1_design_K = X->T1_K;
    m->P1_design_Pa = X->P1_Pa;
    m->R1_design_J_per_kgK = X->R1;
    gc__mop op;
    rc = gc__machine_chain_point(X, 1.0, b->turbine_inlet_temperature, b->pressure_ratio, &op,
                                 err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/design", rc);
    gc__machine_point_fill(X, &op, &op, GC_MACHINE_BASE_LOAD, GC_MACHINE_LIMIT_FIRING,
                           &m->design);
    return GC_OK;
}

static void limits(const gc_machine_spec *s, gc_machine *m)
{
    m->firing_limit_K = s->firing_temperature_limit_K > 0.0 ? s->firing_temperature_limit_K
                                                            : m->design.firing_temperature_K;
    m->exhaust_limit_K = s->exhaust_temperature_limit_K > 0.0 ? s->exhaust_temperature_limit_K
                                                              : m->design.exhaust_temperature_K;
    if (m->firing_limit_K > m->design.firing_temperature_K + 1e-9)
        gc__machine_warn(m->warnings, &m->n_warnings, GC_MACHINE_W_LIMIT_ABOVE_DESIGN,
                         "/laws/firing_temperature_limit",
                         "the firing-temperature limit %.1f K is above the design firing "
                         "temperature %.1f K: the machine may run hotter than designed",
                         m->firing_limit_K, m->design.firing_temperature_K);
    if (m->exhaust_limit_K > m->design.exhaust_temperature_K + 1e-9)
        gc__machine_warn(m->warnings, &m->n_warnings, GC_MACHINE_W_LIMIT_ABOVE_DESIGN,
                         "/laws/exhaust_temperature_limit",
                         "the exhaust-temperature limit %.1f K is above the design exhaust "
                         "temperature %.1f K", m->exhaust_limit_K,
                         m->design.exhaust_temperature_K);
    if (!s->cooling.enabled && m->design.firing_temperature_K > GC_MACHINE_UNCOOLED_T_K)
        gc__machine_warn(m->warnings, &m->n_warnings, GC_MACHINE_W_UNCOOLED_HOT, "/cooling/enabled",
                         "a firing temperature of %.0f K is above about %.0f K, where blades "
                         "need cooling air (common practice); without the cooling model the "
                         "combustor exit equals the firing temperature",
                         m->design.firing_temperature_K, GC_MACHINE_UNCOOLED_T_K);
}

static int reference_point(gc_machine *m, gc__mctx *X, gc_error *err)
{
    gc_machine_inlet none;
    gc_machine_condition clean;
    gc_machine_inlet_init(&none);
    memset(&clean, 0, sizeof clean);
    int nw = 0;
    gc_machine_warning w[GC_MACHINE_MAX_WARNINGS];
    int rc = gc__machine_ctx_init(m, &m->spec.reference, &none, &clean, X, NULL, NULL, w, &nw,
                                  err);
    if (rc != GC_OK)
        return gc__machine_resite(err, "/reference", rc);
    gc__mop op;
    int limit = 0;
    rc = gc__machine_at_limits(X, 1.0, &op, &limit, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/reference", rc);
    gc__machine_point_fill(X, &op, &op, GC_MACHINE_BASE_LOAD, limit, &m->reference);
    return GC_OK;
}

int gc_machine_define(const gc_machine_spec *s, gc_machine *m, gc_error *err)
{
    gc_error first;
    int n = 0;
    memset(m, 0, sizeof *m);
    int rc = gc_machine_validate(s, &first, 1, &n);
    if (rc != GC_OK) {
        if (err != NULL)
            *err = first;
        return rc;
    }
    m->spec = *s;
    gc__mctx X;
    memset(&X, 0, sizeof X);
    X.m = m;
    if (s->design_kind == GC_MACHINE_FROM_CYCLE) {
        rc = check_cycle_design(&s->design, err);
        if (rc != GC_OK)
            return rc;
        X.bin = s->design;
        X.bin.flags = GC_BRAYTON_NO_OPTIMUM;
        rc = gc_site_resolve(&X.bin.site, &X.site, err);
        if (rc != GC_OK)
            return gc__machine_prefix(err, "/design", rc);
        if (s->cooling.enabled) {
            rc = cooled_chain_temperature(s, &X, err);
            if (rc != GC_OK)
                return rc;
        }
    } else {
        rc = from_rating(s, &X, m, err);
        if (rc != GC_OK)
            return rc;
    }
    m->chain = X.bin;
    for (int i = 0; i < X.site.n_warnings; i++)
        gc__machine_warn(m->warnings, &m->n_warnings, GC_MACHINE_W_SITE,
                         X.site.warnings[i].field, "%s", X.site.warnings[i].message);
    rc = design_point(&X, m, err);
    if (rc != GC_OK)
        return rc;
    limits(s, m);
    return reference_point(m, &X, err);
}
