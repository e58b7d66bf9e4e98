/*
 * machine_op.c — the operating point of the machine (machine.h) at site
 * conditions: the off-design laws, the control, and the site evaluation.
 *
 * Unknowns and the equation that fixes each, from the inside out:
 *   pressure ratio     choked first nozzle: m_g sqrt(R_g T_ce)/P_ce = its
 *                      design value, to 1e-12 relative in ln(FF) (secant on
 *                      ln rp, then Brent; the flow function varies about as
 *                      1/rp, and the last answer scaled by f_igv sqrt(T_fire)
 *                      starts the next solve);
 *   firing temperature base load and IGV range: the firing limit, unless the
 *                      exhaust then exceeds its limit: the firing temperature
 *                      that puts the exhaust on its limit (to 1e-9 K); below
 *                      minimum IGV: the one that meets the load;
 *   IGV flow fraction  part load above minimum IGV: the fraction that meets
 *                      the load, searched from base load (to 1e-10 relative
 *                      in power); minimum IGV is reached only when the load
 *                      lies below it.
 * The first step of each search uses the slope learnt in the previous one
 * (exhaust vs firing temperature, output vs IGV fraction, flow function vs
 * pressure ratio); every search is bounded and ends in an answer or an
 * error, never a silent approximation.
 *   air flow           the compressor law: W = W_d (P1/P1_d)
 *                      (R1_d T1_d / (R1 T1))^((1+s)/2) f_igv (1 + flow change),
 *                      i.e. corrected flow m sqrt(R1 T1)/P1 = const x Nc^s with
 *                      N fixed (Nc = N / sqrt(R1 T1)).
 * Each trial is one engine chain run of the Brayton preset's simple cycle
 * (gc_brayton_build + gc_cycle_run_chain, no ideal counterpart, no areas);
 * the answer is evaluated once more in full by gc_brayton_evaluate (cycle,
 * ideal counterpart, bounds, checks) with the generator output as its net
 * power, so the engine's air flow equals the solved one (checked).
 *
 * Units: SI (K, Pa, kg/s, W).
 */
#include "core/machine_internal.h"

#include <math.h>
#include <string.h>

#define P_REF_PA 101325.0       /* corrected flow: ISO reference pressure, Pa */
#define T_REF_K 288.15          /* corrected flow: ISO reference temperature, K */
#define FAR_SPEED 0.08          /* corrected speed this far (fraction) from design: warned */
#define DTEXH_DTFIRE 0.6        /* first-step slope of exhaust vs firing temperature, - */
#define IGV_SLOPE 1.45          /* first-step (dP/P)/df on IGV closure at the exhaust limit, - */

static int check_condition(const gc_machine_condition *c, gc_error *err)
{
    if (!isfinite(c->compressor_efficiency_change) || c->compressor_efficiency_change < -0.3 ||
        c->compressor_efficiency_change > 0.05)
        return gc_error_set(err, GC_ERR_INVALID, "/condition/compressor_efficiency_change",
                            "must be from -0.3 to 0.05");
    if (!isfinite(c->compressor_flow_change) || c->compressor_flow_change < -0.3 ||
        c->compressor_flow_change > 0.1)
        return gc_error_set(err, GC_ERR_INVALID, "/condition/compressor_flow_change",
                            "must be from -0.3 to 0.1");
    if (!isfinite(c->turbine_efficiency_change) || c->turbine_efficiency_change < -0.3 ||
        c->turbine_efficiency_change > 0.05)
        return gc_error_set(err, GC_ERR_INVALID, "/condition/turbine_efficiency_change",
                            "must be from -0.3 to 0.05");
    return GC_OK;
}

static int condition_eff(double design, double change, const char *field, double *eta,
                         gc_error *err)
{
    *eta = design + change;
    if (!(*eta > 0.0) || *eta > 1.0)
        return gc_error_set(err, GC_ERR_INVALID, field,
                            "gives an efficiency of %.4f (design %.4f): it must stay above 0 "
                            "and at most 1", *eta, design);
    return GC_OK;
}

int gc__machine_ctx_init(const gc_machine *m, const gc_site_input *site,
                         const gc_machine_inlet *inlet, const gc_machine_condition *cond,
                         gc__mctx *X, gc_machine_inlet_state *ist, gc_site *amb,
                         gc_machine_warning *w, int *nw, gc_error *err)
{
    gc_site A;
    gc_machine_inlet_state S;
    X->m = m;
    X->runs = 0;
    int rc = check_condition(cond, err);
    if (rc != GC_OK)
        return rc;
    rc = gc_site_resolve(site, &A, err);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < A.n_warnings; i++)
        gc__machine_warn(w, nw, GC_MACHINE_W_SITE, A.warnings[i].field, "%s",
                         A.warnings[i].message);
    rc = gc__machine_inlet_apply(inlet, &A, m->chain.inlet_pressure_loss, &S, w, nw, err);
    if (rc != GC_OK)
        return rc;
    X->bin = m->chain;
    gc_site_input_init(&X->bin.site);
    X->bin.site.has_temperature = 1;
    X->bin.site.T_K = S.T_K;
    X->bin.site.has_pressure = 1;
    X->bin.site.P_Pa = A.P_Pa;
    X->bin.site.has_relative_humidity = 1;
    X->bin.site.RH = S.RH;
    X->bin.inlet_pressure_loss = S.inlet_pressure_loss;
    rc = condition_eff(m->chain.compressor_efficiency, cond->compressor_efficiency_change,
                       "/condition/compressor_efficiency_change", &X->eta_c_open, err);
    if (rc == GC_OK)
        rc = condition_eff(m->chain.turbine_efficiency, cond->turbine_efficiency_change,
                           "/condition/turbine_efficiency_change", &X->bin.turbine_efficiency,
                           err);
    if (rc != GC_OK)
        return rc;
    rc = gc_site_resolve(&X->bin.site, &X->site, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/inlet", rc);
    X->T1_K = X->site.T_K;
    X->P1_Pa = X->site.P_Pa * (1.0 - X->bin.inlet_pressure_loss);
    X->R1 = X->site.gas.R_J_per_kgK;
    double rho = sqrt(m->R1_design_J_per_kgK * m->T1_design_K / (X->R1 * X->T1_K));
    X->m_air_open = m->design.air_mass_flow_kg_per_s * (X->P1_Pa / m->P1_design_Pa) *
                    pow(rho, 1.0 + m->spec.compressor_speed_exponent) *
                    (1.0 + cond->compressor_flow_change);
    X->chiller_J_per_kg = S.chiller_power_W / (1.0 + S.W);
    X->rp_guess = m->chain.pressure_ratio;
    X->rp_guess_f = 1.0;
    X->rp_guess_T = m->chain.turbine_inlet_temperature;
    X->beta_guess = m->design.cooling_air_fraction;
    X->T_fire_guess = 0.0;
    X->slope_ff = -1.0;
    X->slope_texh = DTEXH_DTFIRE;
    X->tol_ff = GC__M_FF_TOL;
    X->tol_texh = GC__M_TEXH_TOL;
    X->slope_pf = IGV_SLOPE;
    if (fabs(rho - 1.0) > FAR_SPEED)
        gc__machine_warn(w, nw, GC_MACHINE_W_FAR_FROM_DESIGN, "/site/temperature",
                         "the corrected speed is %.1f %% from its design value (compressor "
                         "inlet %.1f K against %.1f K): the fixed-flow and constant-efficiency "
                         "laws are rough this far off design", 100.0 * (rho - 1.0), X->T1_K,
                         m->T1_design_K);
    if (ist != NULL)
        *ist = S;
    if (amb != NULL)
        *amb = A;
    return GC_OK;
}

static double eta_c_at(const gc__mctx *X, double f)
{
    double a = X->m->spec.igv_efficiency_coefficient;
    return X->eta_c_open * (1.0 - a * (1.0 - f) * (1.0 - f));
}

int gc__machine_chain_point(gc__mctx *X, double f_igv, double T_fire, double rp, gc__mop *op,
                            gc_error *err)
{
    memset(op, 0, sizeof *op);
    X->bin.pressure_ratio = rp;
    X->bin.turbine_inlet_temperature = T_fire;
    X->bin.compressor_efficiency = eta_c_at(X, f_igv);
    int rc = gc_brayton_build(&X->bin, &X->site, &X->chain, &X->st, err);
    if (rc != GC_OK)
        return rc;
    X->chain.flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
    X->runs++;
    rc = gc_cycle_run_chain(&X->chain, &X->run, err);
    if (rc != GC_OK)
        return rc;
    const gc_cycle_run *R = &X->run;
    const gc_cycle_state *c2 = &R->states[X->st.compressor_exit];
    const gc_cycle_state *ti = &R->states[X->st.turbine_inlet];
    const gc_cycle_state *ex = &R->states[X->st.exhaust];
    op->f_igv = f_igv;
    op->T_fire = T_fire;
    op->rp = rp;
    op->m_air = X->m_air_open * f_igv;
    op->far = R->summary.fuel_air_ratio;
    op->w_net = R->summary.net_work;
    op->P_gen = op->m_air * (X->bin.generator_efficiency *
                             (X->bin.mechanical_efficiency * op->w_net));
    op->P_chiller = op->m_air * X->chiller_J_per_kg;
    op->P_net = op->P_gen - op->P_chiller;
    op->T2 = c2->T_K;
    op->P2 = c2->P_Pa;
    op->P3 = ti->P_Pa;
    op->T_exh = ex->T_K;
    for (int p = 0; p < R->n_processes; p++) {
        if (R->processes[p].kind == GC_PROC_COMPRESSION)
            op->eta_c = R->processes[p].efficiency;
        else if (R->processes[p].kind == GC_PROC_EXPANSION)
            op->eta_t = R->processes[p].efficiency;
    }
    if (X->m->spec.cooling.enabled) {
        rc = gc__machine_cooling_split_from(&X->m->spec.cooling, &X->bin.fuel,
                                            gc__machine_fuel_T(X->bin.fuel_temperature),
                                            &R->gases[c2->gas], op->T2, op->far,
                                            X->bin.combustor_efficiency, T_fire, X->beta_guess,
                                            &op->cool, err);
        if (rc != GC_OK)
            return rc;
        X->beta_guess = op->cool.coolant_fraction;
    } else {
        op->cool.combustor_exit_T_K = T_fire;
        op->cool.rotor_inlet_T_K = T_fire;
        op->cool.fuel_air_ratio = op->far;
        op->cool.core_fuel_air_ratio = op->far;
        op->cool.nozzle_gas_R_J_per_kgK = R->gases[ti->gas].R_J_per_kgK;
    }
    op->FF = op->m_air * (1.0 - op->cool.coolant_fraction + op->far) *
             sqrt(op->cool.nozzle_gas_R_J_per_kgK * op->cool.combustor_exit_T_K) / op->P3;
    return GC_OK;
}

/* ---- nozzle matching ------------------------------------------------------ */

typedef struct ff_ctx {
    gc__mctx *X;
    double f, T_fire, x_last, y_last, x_prev, y_prev;
    int n;
    gc__mop op;
} ff_ctx;

/* The slope of the last two trials (learnt for the next solve's first step),
 * kept when it is of the expected sign and size. */
static void learn(double *slope, double x0, double y0, double x1, double y1, double lo,
                  double hi)
{
    if (x1 == x0)
        return;
    double d = (y1 - y0) / (x1 - x0);
    if (d >= lo && d <= hi)
        *slope = d;
}

static int ff_fn(void *ctx, double x, double *y, gc_error *err)
{
    ff_ctx *C = ctx;
    int rc = gc__machine_chain_point(C->X, C->f, C->T_fire, exp(x), &C->op, err);
    if (rc != GC_OK)
        return rc;
    C->x_prev = C->x_last;
    C->y_prev = C->y_last;
    C->x_last = x;
    *y = log(C->op.FF / C->X->m->design.nozzle_flow_function_m2);
    C->y_last = *y;
    C->n++;
    return GC_OK;
}

int gc__machine_op_run(gc__mctx *X, double f_igv, double T_fire, gc__mop *op, gc_error *err)
{
    ff_ctx C;
    memset(&C, 0, sizeof C);
    C.X = X;
    C.f = f_igv;
    C.T_fire = T_fire;
    /* P_ce ~ m sqrt(T_ce) at a fixed flow function: scale the last answer */
    double x0 = log(X->rp_guess * f_igv / X->rp_guess_f * sqrt(T_fire / X->rp_guess_T));
    double y0 = 0.0, x = x0, y = 0.0;
    int rc = ff_fn(&C, x0, &y0, err);
    if (rc != GC_OK)
        return rc;
    y = y0;
    if (fabs(y0) > X->tol_ff) {
        rc = gc__machine_root(ff_fn, &C, x0, y0, x0 - y0 / X->slope_ff, log(1.01),
                              log(GC_BRAYTON_RP_MAX), 1e-15, X->tol_ff, &x, &y, err);
        if (C.n >= 2)
            learn(&X->slope_ff, C.x_prev, C.y_prev, C.x_last, C.y_last, -3.0, -0.3);
        if (rc == GC_ERR_NOCONV && fabs(y) <= fmax(GC__M_FF_ACCEPT, X->tol_ff))
            rc = GC_OK;
        if (rc != GC_OK)
            return gc_error_set(err, rc == GC_ERR_INFEASIBLE ? GC_ERR_INFEASIBLE : GC_ERR_NOCONV,
                                "/site", "no pressure ratio passes the design nozzle flow "
                                "(firing temperature %.1f K, IGV flow fraction %.4f)", T_fire,
                                f_igv);
        if (C.x_last != x) {
            rc = ff_fn(&C, x, &y, err);
            if (rc != GC_OK)
                return rc;
        }
    }
    *op = C.op;
    X->rp_guess = op->rp;
    X->rp_guess_f = f_igv;
    X->rp_guess_T = T_fire;
    return GC_OK;
}

/* ---- temperature limits --------------------------------------------------- */

typedef struct tf_ctx {
    gc__mctx *X;
    double f, target, x_last, y_last, x_prev, y_prev;
    int n;
    int power;                  /* 0: exhaust temperature - target; 1: net power - target */
    gc__mop op;
} tf_ctx;

static int tf_fn(void *ctx, double T, double *y, gc_error *err)
{
    tf_ctx *C = ctx;
    int rc = gc__machine_op_run(C->X, C->f, T, &C->op, err);
    if (rc != GC_OK)
        return rc;
    C->x_prev = C->x_last;
    C->y_prev = C->y_last;
    C->x_last = T;
    *y = (C->power ? C->op.P_net : C->op.T_exh) - C->target;
    C->y_last = *y;
    C->n++;
    return GC_OK;
}

/* Exhaust-limited firing temperature from the known point (T0, y0) with a
 * first trial T1, inside [lo, hi]. */
static int exhaust_root(tf_ctx *C, double T0, double y0, double T1, double lo, double hi,
                        gc__mop *op, gc_error *err)
{
    const gc_machine *m = C->X->m;
    double T = T0, y = 0.0;
    int rc = gc__machine_root(tf_fn, C, T0, y0, T1, lo, hi, 1e-12, C->X->tol_texh, &T, &y, err);
    if (rc != GC_OK)
        return gc_error_set(err, rc, "/laws/exhaust_temperature_limit",
                            "the exhaust-temperature limit %.2f K cannot be held here (the "
                            "exhaust is %.2f K at firing temperature %.2f K)", m->exhaust_limit_K,
                            C->op.T_exh, C->op.T_fire);
    if (C->n >= 2)
        learn(&C->X->slope_texh, C->x_prev, C->y_prev, C->x_last, C->y_last, 0.2, 1.5);
    if (C->x_last != T && (rc = tf_fn(C, T, &y, err)) != GC_OK)
        return rc;
    *op = C->op;
    C->X->T_fire_guess = T;
    return GC_OK;
}

int gc__machine_at_limits(gc__mctx *X, double f_igv, gc__mop *op, int *limit, gc_error *err)
{
    const gc_machine *m = X->m;
    const double T_lim = m->firing_limit_K;
    tf_ctx C;
    memset(&C, 0, sizeof C);
    C.X = X;
    C.f = f_igv;
    C.target = m->exhaust_limit_K;
    double y0 = 0.0, Tg = X->T_fire_guess, T = 0.0, y = 0.0;
    int rc;
    *limit = GC_MACHINE_LIMIT_EXHAUST;
    if (Tg > 0.0 && Tg < T_lim) {
        /* warm start from an exhaust-limited neighbour: the root lies below the
         * firing limit, or the search ends pinned at the limit (firing-limited) */
        rc = tf_fn(&C, Tg, &y0, err);
        if (rc != GC_OK)
            return rc;
        rc = gc__machine_root(tf_fn, &C, Tg, y0, Tg - y0 / X->slope_texh, C.op.T2 + 1.0, T_lim,
                              1e-12, X->tol_texh, &T, &y, err);
        if (C.n >= 2)
            learn(&X->slope_texh, C.x_prev, C.y_prev, C.x_last, C.y_last, 0.2, 1.5);
        if (rc == GC_ERR_INFEASIBLE && C.x_last == T_lim && C.op.T_exh <= C.target) {
            *op = C.op;
            *limit = GC_MACHINE_LIMIT_FIRING;
            return GC_OK;
        }
        if (rc == GC_OK) {
            if (C.x_last != T && (rc = tf_fn(&C, T, &y, err)) != GC_OK)
                return rc;
            *op = C.op;
            X->T_fire_guess = T;
            return GC_OK;
        }
    }
    rc = tf_fn(&C, T_lim, &y0, err);
    if (rc != GC_OK)
        return rc;
    if (y0 <= X->tol_texh) {
        *op = C.op;
        *limit = GC_MACHINE_LIMIT_FIRING;
        return GC_OK;
    }
    return exhaust_root(&C, T_lim, y0, T_lim - y0 / X->slope_texh, C.op.T2 + 1.0, T_lim, op, err);
}

/* ---- load ----------------------------------------------------------------- */

typedef struct igv_ctx {
    gc__mctx *X;
    double demand, x_last;
    int limit;
    gc__mop op;
} igv_ctx;

static int igv_fn(void *ctx, double f, double *y, gc_error *err)
{
    igv_ctx *C = ctx;
    int rc = gc__machine_at_limits(C->X, f, &C->op, &C->limit, err);
    if (rc != GC_OK)
        return rc;
    C->x_last = f;
    *y = C->op.P_net - C->demand;
    return GC_OK;
}

/* IGV search from base load (f = 1) with the slope dP/df learnt so far: the
 * answer, or GC_ERR_INFEASIBLE with *op at minimum IGV when even there the
 * output is above the demand. */
static int igv_range(gc__mctx *X, double demand, const gc__mop *base, gc__mop *op, int *limit,
                     gc_error *err)
{
    const double f_min = X->m->spec.igv_minimum_flow_fraction;
    igv_ctx C;
    memset(&C, 0, sizeof C);
    C.X = X;
    C.demand = demand;
    double y0 = base->P_net - demand, f = 1.0, y = 0.0;
    double f1 = fmax(f_min, 1.0 - y0 / (X->slope_pf * base->P_net));
    int rc = gc__machine_root(igv_fn, &C, 1.0, y0, f1, f_min, 1.0, 1e-14,
                              GC__M_POWER_TOL * demand, &f, &y, err);
    if (rc == GC_ERR_INFEASIBLE && C.x_last == f_min && C.op.P_net > demand) {
        *op = C.op;
        *limit = C.limit;
        return GC_ERR_INFEASIBLE;
    }
    if (rc != GC_OK)
        return gc_error_set(err, rc, "/load", "the IGV position for %.4g W was not found",
                            demand);
    if (C.x_last != f && (rc = igv_fn(&C, f, &y, err)) != GC_OK)
        return rc;
    if (f < 1.0)
        X->slope_pf = (base->P_net - C.op.P_net) / ((1.0 - f) * base->P_net);
    *op = C.op;
    *limit = C.limit;
    return GC_OK;
}

static int firing_range(gc__mctx *X, double demand, const gc__mop *start, gc__mop *op,
                        const char *field, gc_error *err)
{
    tf_ctx C;
    memset(&C, 0, sizeof C);
    C.X = X;
    C.f = start->f_igv;
    C.target = demand;
    C.power = 1;
    double T = start->T_fire, y0 = start->P_net - demand, y = 0.0;
    /* first step: output about linear in firing temperature, zero near 0.55 of it */
    double slope = start->P_gen / (0.45 * start->T_fire);
    int rc = gc__machine_root(tf_fn, &C, T, y0, T - y0 / slope, start->T2 + 1.0, T, 1e-12,
                              GC__M_POWER_TOL * demand, &T, &y, err);
    if (rc != GC_OK)
        return gc_error_set(err, rc == GC_ERR_INFEASIBLE ? GC_ERR_INFEASIBLE : rc, field,
                            "%.4g W cannot be reached by lowering the firing temperature at "
                            "minimum IGV (the machine would need a firing temperature near its "
                            "compressor exit, %.1f K)", demand, start->T2);
    if (C.x_last != T && (rc = tf_fn(&C, T, &y, err)) != GC_OK)
        return rc;
    *op = C.op;
    return GC_OK;
}

static int demand_of(const gc_machine *m, gc_machine_load_kind kind, double value,
                     const gc__mop *base, double *demand, const char **field, gc_error *err)
{
    if (kind == GC_MACHINE_LOAD_POWER) {
        *field = "/load/power";
        if (!isfinite(value) || !(value > 0.0))
            return gc_error_set(err, GC_ERR_INVALID, *field, "must be above 0 W");
        *demand = value;
    } else {
        *field = "/load/fraction";
        if (!isfinite(value) || !(value > 0.0) || value > 1.0)
            return gc_error_set(err, GC_ERR_INVALID, *field, "must be above 0 up to 1");
        *demand = value * base->P_net;
    }
    if (*demand > base->P_net * (1.0 + 1e-12))
        return gc_error_set(err, GC_ERR_INFEASIBLE, *field,
                            "%.4f MW is above the base load here, %.4f MW (by %.3f %%)",
                            *demand / 1e6, base->P_net / 1e6,
                            100.0 * (*demand / base->P_net - 1.0));
    double min = m->spec.minimum_load_fraction * base->P_net;
    if (*demand < min)
        return gc_error_set(err, GC_ERR_INFEASIBLE, *field,
                            "%.4f MW is below the minimum load here, %.4f MW (%.0f %% of the "
                            "base load %.4f MW)", *demand / 1e6, min / 1e6,
                            100.0 * m->spec.minimum_load_fraction, base->P_net / 1e6);
    return GC_OK;
}

int gc__machine_solve_load(gc__mctx *X, gc_machine_load_kind kind, double value,
                           gc__mop *base, gc__mop *op, int *control, int *limit,
                           gc_error *err)
{
    const gc_machine *m = X->m;
    int lb = 0;
    if (kind != GC_MACHINE_LOAD_BASE && kind != GC_MACHINE_LOAD_POWER &&
        kind != GC_MACHINE_LOAD_FRACTION)
        return gc_error_set(err, GC_ERR_INVALID, "/load/kind",
                            "must be base, power or fraction");
    int rc = gc__machine_at_limits(X, 1.0, base, &lb, err);
    if (rc != GC_OK)
        return rc;
    if (!(base->P_net > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/site",
                            "the machine delivers no net output at these conditions (%.4g W)",
                            base->P_net);
    X->base_limit = lb;
    *op = *base;
    *control = GC_MACHINE_BASE_LOAD;
    *limit = lb;
    if (kind == GC_MACHINE_LOAD_BASE)
        return GC_OK;
    double demand = 0.0;
    const char *field = "/load";
    rc = demand_of(m, kind, value, base, &demand, &field, err);
    if (rc != GC_OK || demand >= base->P_net * (1.0 - 1e-12))
        return rc;
    gc__mop pm = *base;
    if (m->spec.igv_minimum_flow_fraction < 1.0) {
        *control = GC_MACHINE_IGV_CONTROL;
        rc = igv_range(X, demand, base, op, limit, err);
        if (rc != GC_ERR_INFEASIBLE)
            return rc;
        pm = *op; /* minimum IGV, still above the demand */
    }
    *control = GC_MACHINE_FIRING_CONTROL;
    *limit = GC_MACHINE_LIMIT_NONE;
    return firing_range(X, demand, &pm, op, field, err);
}

/* ---- results -------------------------------------------------------------- */

void gc__machine_point_fill(const gc__mctx *X, const gc__mop *op, const gc__mop *base,
                            int control, int limit, gc_machine_point *p)
{
    const gc_fuel *fuel = &X->bin.fuel;
    memset(p, 0, sizeof *p);
    p->control = control;
    p->active_limit = limit;
    p->net_power_W = op->P_net;
    p->generator_power_W = op->P_gen;
    p->chiller_power_W = op->P_chiller;
    p->base_net_power_W = base->P_net;
    p->load_fraction = base->P_net > 0.0 ? op->P_net / base->P_net : 0.0;
    p->fuel_air_ratio = op->far;
    p->fuel_mass_flow_kg_per_s = op->m_air * op->far;
    p->heat_input_W = p->fuel_mass_flow_kg_per_s * fuel->LHV_J_per_kg;
    p->heat_input_hhv_W = p->fuel_mass_flow_kg_per_s * fuel->HHV_J_per_kg;
    if (op->P_net > 0.0 && p->heat_input_W > 0.0) {
        p->heat_rate = p->heat_input_W / op->P_net;
        p->heat_rate_hhv = p->heat_input_hhv_W / op->P_net;
        p->heat_rate_kJ_per_kWh = 3600.0 * p->heat_rate;
        p->heat_rate_hhv_kJ_per_kWh = 3600.0 * p->heat_rate_hhv;
        p->thermal_efficiency = op->P_net / p->heat_input_W;
    }
    p->air_mass_flow_kg_per_s = op->m_air;
    p->exhaust_mass_flow_kg_per_s = op->m_air * (1.0 + op->far);
    p->cooling_air_fraction = op->cool.coolant_fraction;
    p->igv_flow_fraction = op->f_igv;
    p->corrected_air_flow_kg_per_s = op->m_air * sqrt(X->T1_K / T_REF_K) * P_REF_PA / X->P1_Pa;
    p->compressor_flow_function_m2 = op->m_air * sqrt(X->R1 * X->T1_K) / X->P1_Pa;
    p->nozzle_flow_function_m2 = op->FF;
    p->compressor_inlet_T_K = X->T1_K;
    p->compressor_inlet_P_Pa = X->P1_Pa;
    p->pressure_ratio = op->rp;
    p->compressor_exit_T_K = op->T2;
    p->compressor_exit_P_Pa = op->P2;
    p->combustor_exit_T_K = op->cool.combustor_exit_T_K;
    p->firing_temperature_K = op->T_fire;
    p->exhaust_temperature_K = op->T_exh;
    p->compressor_efficiency = op->eta_c;
    p->turbine_efficiency = op->eta_t;
}

static int full_cycle(gc__mctx *X, const gc__mop *op, unsigned flags,
                      gc_brayton_result *cycle, gc_error *err)
{
    gc_brayton_input b = X->bin;
    b.pressure_ratio = op->rp;
    b.turbine_inlet_temperature = op->T_fire;
    b.compressor_efficiency = eta_c_at(X, op->f_igv);
    b.net_power = op->P_gen;
    b.flags = GC_BRAYTON_NO_OPTIMUM | ((flags & GC_MACHINE_NO_AREAS) ? GC_BRAYTON_NO_AREAS : 0u);
    int rc = gc_brayton_evaluate(&b, cycle, err);
    if (rc != GC_OK)
        return gc__machine_prefix(err, "/design", rc);
    if (!(fabs(cycle->air_mass_flow - op->m_air) <= 1e-9 * op->m_air))
        return gc_error_set(err, GC_ERR_CHECK, "",
                            "the engine's air flow %.12g kg/s differs from the solved %.12g kg/s",
                            cycle->air_mass_flow, op->m_air);
    if (X->m->spec.cooling.enabled) {
        /* the preset's "no cooling air is bled" caution does not hold here: the
         * cooled rows are modelled (its turbine inlet is the mixed rotor inlet) */
        int k = 0;
        for (int i = 0; i < cycle->n_warnings; i++)
            if (strcmp(cycle->warnings[i].code, "cooled_blades") != 0)
                cycle->warnings[k++] = cycle->warnings[i];
        cycle->n_warnings = k;
    }
    return GC_OK;
}

int gc_machine_evaluate(const gc_machine *m, const gc_machine_site_input *in,
                        gc_machine_site_result *r, gc_error *err)
{
    gc__mctx X;
    gc__mop op, base;
    int control = 0, limit = 0;
    memset(r, 0, sizeof *r);
    int rc = gc__machine_ctx_init(m, &in->site, &in->inlet, &in->condition, &X, &r->inlet,
                                  &r->site, r->warnings, &r->n_warnings, err);
    if (rc != GC_OK)
        return rc;
    double value = in->load == GC_MACHINE_LOAD_POWER ? in->load_power_W : in->load_fraction;
    rc = gc__machine_solve_load(&X, in->load, value, &base, &op, &control, &limit, err);
    if (rc != GC_OK)
        return rc;
    gc__machine_point_fill(&X, &op, &base, control, limit, &r->point);
    gc__machine_inlet_scale(&r->inlet, op.m_air);
    r->chain_runs = X.runs;
    if (!(in->flags & GC_MACHINE_FIGURES_ONLY)) {
        rc = full_cycle(&X, &op, in->flags, &r->cycle, err);
        if (rc != GC_OK)
            return rc;
        r->has_cycle = 1;
    }
    return GC_OK;
}
