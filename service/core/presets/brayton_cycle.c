/*
 * brayton_cycle.c — the Brayton-family preset's chain builder, the plant
 * figures for a rated power, warnings, and the two optimum-pressure-ratio
 * searches (brayton.h; the descriptor with its tables is brayton.c). All
 * cycle numbers come from the cycle engine (cycle.h); this file only builds
 * chains and reads runs.
 *
 * Search method (optimum pressure ratios): the full chain (no area
 * integration, no ideal counterpart) is evaluated at GC_BRAYTON_RP_SEARCH_SCAN
 * pressure ratios spaced evenly in ln rp over the search bounds; around the
 * best scan point, Brent's method (parabolic interpolation safeguarded by
 * golden-section steps) narrows the bracket [x_{k-1}, x_{k+1}] to
 * GC_BRAYTON_RP_SEARCH_TOL in ln rp. Pressure ratios at which the chain
 * cannot be run count as minus infinity, so a maximum against such a region
 * is found at its edge and flagged. The scan is shared by both searches.
 *
 * Units: SI (K, Pa, J/kg, kg/s, W), fractions 0..1.
 */
#include "core/presets/brayton_internal.h"
#include "core/preset_util.h"
#include "gascycle/exergy.h"

#include <math.h>
#include <stddef.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#define BTU_IT_J 1055.05585262      /* J, International Table Btu (NIST SP 811 B.8), exact */
#define J_PER_KWH 3.6e6             /* J per kWh, exact */
#define J_PER_MWH 3.6e9             /* J per MWh, exact */

/* ---- chain builder ------------------------------------------------------ */

static void set_field(char *dst, const char *src)
{
    snprintf(dst, GC_CYCLE_FIELD_LEN, "%s", src);
}

/* label "<name> <i>" */
static void set_label(gc_step *s, const char *name, int i)
{
    snprintf(s->label, sizeof s->label, "%s %d", name, i);
}

#define ADD_OR_FAIL(s, expr)                                                           \
    do {                                                                               \
        (s) = (expr);                                                                  \
        if ((s) == NULL)                                                               \
            return gc_error_id(err, GC_ERR_INVALID, GC_BF_COMPRESSOR_STAGES, -1,      \
                               "too many stages for one chain of %d steps",            \
                               GC_CYCLE_MAX_STEPS);                                    \
    } while (0)

int gc__brayton_fuel_mode(const gc_brayton_input *in)
{
    return in->heat_mode == GC_BRAYTON_FUEL || in->has_fuel;
}

static const gc_gas *working_gas(const gc_brayton_input *in, const gc_site *site)
{
    return in->has_gas ? &in->gas : &site->gas;
}

/* Heat addition step (main combustor i = 0, reheat i > 0). */
static gc_step *add_heat(gc_cycle *c, const gc_brayton_input *in, double T_K, int i,
                         gc_error *err)
{
    int fuel = gc__brayton_fuel_mode(in);
    gc_step *s = gc__add_heat_step(
        c, T_K, i == 0 ? "/turbine_inlet_temperature" : "/reheat_temperature",
        i == 0 ? in->combustor_pressure_loss : in->reheat_pressure_loss,
        i == 0 ? "/combustor_pressure_loss" : "/reheat_pressure_loss",
        fuel ? &in->fuel : NULL, in->combustor_efficiency, in->fuel_temperature);
    (void)err;
    if (s == NULL)
        return NULL;
    if (i == 0)
        snprintf(s->label, sizeof s->label, "%s", fuel ? "combustor" : "heat addition");
    else
        set_label(s, "reheat", i);
    return s;
}

static int build_chain(const gc_brayton_input *in, const gc_site *site, gc_cycle *c,
                       gc_brayton_stations *st, gc_error *err);

/* Station names of the main stations (state i is the end of step i - 1; a
 * state that is two stations keeps the first name and has the other as an
 * alias, so every main station is always there: /stations/compressor_inlet
 * is the ambient state when there is no inlet loss). The stations between
 * (stages, intercoolers, reheat) are named by the engine from their labels:
 * compressor_1_exit, intercooler_1_exit, ... */
static void name_stations(gc_cycle *c, const gc_brayton_stations *S)
{
    const struct { int i; const char *n; } sn[] = {
        { S->compressor_inlet, "compressor_inlet" }, { S->compressor_exit, "compressor_exit" },
        { S->combustor_inlet, "combustor_inlet" }, { S->turbine_inlet, "turbine_inlet" },
        { S->turbine_exit, "turbine_exit" }, { S->exhaust, "exhaust" } };
    snprintf(c->start_station, sizeof c->start_station, "ambient");
    for (size_t k = 0; k < sizeof sn / sizeof sn[0]; k++) {
        int i = sn[k].i;
        if (i > 0 && i <= c->n_steps && !c->steps[i - 1].station[0])
            snprintf(c->steps[i - 1].station, sizeof c->steps[i - 1].station, "%s", sn[k].n);
        else if (i >= 0 && i <= c->n_steps)
            gc_cycle_add_alias(c, sn[k].n, i - 1);
    }
}

int gc_brayton_build(const gc_brayton_input *in, const gc_site *site, gc_cycle *c,
                     gc_brayton_stations *st, gc_error *err)
{
    int rc = build_chain(in, site, c, st, err);
    return rc == GC_OK ? rc : gc_preset_name_error(gc_brayton_preset(), err);
}

/* The stage pressure ratios of a chain (see brayton.h) and its ideal's. */
typedef struct plan {
    int Nc, Nt, regen;
    double r_c, r_t, r_c_ideal, r_t_ideal;
    double Lic, Lrh, Lra, Lrg;          /* intercooler, reheat, regenerator air and gas losses */
} plan;

static int make_plan(const gc_brayton_input *in, const gc_site *site, plan *k, gc_error *err)
{
    k->Nc = in->compressor_stages;
    k->Nt = in->turbine_stages;
    const double rp = in->pressure_ratio;
    k->Lic = in->intercooler_pressure_loss;
    k->Lrh = in->reheat_pressure_loss;
    k->regen = in->regenerator_effectiveness > 0.0;
    k->Lra = k->regen ? in->regenerator_air_pressure_loss : 0.0;
    k->Lrg = k->regen ? in->regenerator_gas_pressure_loss : 0.0;
    if (k->Nc < 1 || k->Nc > GC_BRAYTON_MAX_STAGES || k->Nt < 1 ||
        k->Nt > GC_BRAYTON_MAX_STAGES || !(rp > 1.0))
        return gc_error_id(err, GC_ERR_INVALID, GC_BF_PRESSURE_RATIO, -1,
                           "invalid stages or pressure ratio (validate the input first)");
    k->r_c = pow(rp / pow(1.0 - k->Lic, k->Nc - 1), 1.0 / k->Nc);
    double P_ti = site->P_Pa * (1.0 - in->inlet_pressure_loss) * rp * (1.0 - k->Lra) *
                  (1.0 - in->combustor_pressure_loss);
    double P_te = site->P_Pa / ((1.0 - k->Lrg) * (1.0 - in->exhaust_pressure_loss));
    double E = P_ti / P_te * pow(1.0 - k->Lrh, k->Nt - 1);
    if (!(E > 1.0 + 1e-9))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_BF_PRESSURE_RATIO, -1,
                           "the pressure losses take up the whole pressure ratio %g: "
                           "nothing is left for the turbine", rp);
    k->r_t = pow(E, 1.0 / k->Nt);
    /* the ideal counterpart: the same overall pressure ratio, shared equally,
     * with no allowance for losses (cycle.h, end_value_ideal) */
    k->r_c_ideal = pow(rp, 1.0 / k->Nc);
    k->r_t_ideal = pow(rp, 1.0 / k->Nt);
    return GC_OK;
}

/* Inlet loss, compressor stages with intercoolers, the regenerator's air side. */
static int add_compression(const gc_brayton_input *in, const gc_site *site, const plan *k,
                           gc_cycle *c, gc_brayton_stations *S, int *i_cold, gc_error *err)
{
    gc_step *s;
    if (in->inlet_pressure_loss > 0.0) {
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_PRESSURE_LOSS, GC_END_DEFAULT, 0.0,
                                    "/inlet_pressure_loss"));
        s->pressure_loss = in->inlet_pressure_loss;
        snprintf(s->label, sizeof s->label, "inlet loss");
        S->compressor_inlet = c->n_steps;
    }
    for (int i = 0; i < k->Nc; i++) {
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, k->r_c,
                                    "/pressure_ratio"));
        s->end_value_ideal = k->r_c_ideal;
        double e = in->compressor_stage_efficiency[i];
        s->efficiency = e > 0.0 ? e : in->compressor_efficiency;
        s->polytropic_efficiency = in->polytropic_efficiency;
        if (e > 0.0)
            snprintf(s->field_aux, sizeof s->field_aux, "/compressor_stage_efficiency/%d", i);
        else
            set_field(s->field_aux, "/compressor_efficiency");
        if (k->Nc == 1)
            snprintf(s->label, sizeof s->label, "compressor");
        else
            set_label(s, "compressor", i + 1);
        if (i < k->Nc - 1) {
            double Tic = in->intercooling_temperature > 0.0 ? in->intercooling_temperature
                                                             : site->T_K;
            ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_COOLING, GC_END_TEMPERATURE, Tic,
                                        "/intercooling_temperature"));
            s->heat_sign = -1;
            s->pressure_loss = k->Lic;
            set_field(s->field_aux, "/intercooler_pressure_loss");
            set_label(s, "intercooler", i + 1);
        }
    }
    S->compressor_exit = c->n_steps;
    S->combustor_inlet = S->compressor_exit;
    if (k->regen) {
        *i_cold = c->n_steps;
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0,
                                    "/regenerator_effectiveness"));
        s->pressure_loss = k->Lra;
        s->heat_sign = 1;
        set_field(s->field_aux, "/regenerator_air_pressure_loss");
        snprintf(s->label, sizeof s->label, "regenerator air");
        S->combustor_inlet = c->n_steps;
    }
    return GC_OK;
}

/* The combustor, turbine stages with reheat. */
static int add_expansion(const gc_brayton_input *in, const plan *k, gc_cycle *c,
                         gc_brayton_stations *S, gc_error *err)
{
    gc_step *s;
    if (add_heat(c, in, in->turbine_inlet_temperature, 0, err) == NULL)
        return gc_error_id(err, GC_ERR_INVALID, GC_BF_TURBINE_STAGES, -1, "chain too long");
    S->turbine_inlet = c->n_steps;
    double T_rh = in->reheat_temperature > 0.0 ? in->reheat_temperature
                                               : in->turbine_inlet_temperature;
    for (int j = 0; j < k->Nt; j++) {
        int last = j == k->Nt - 1;
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_EXPANSION,
                                    last ? GC_END_START_PRESSURE : GC_END_PRESSURE_RATIO,
                                    last ? 0.0 : 1.0 / k->r_t, "/pressure_ratio"));
        if (!last)
            s->end_value_ideal = 1.0 / k->r_t_ideal;
        double e = in->turbine_stage_efficiency[j];
        s->efficiency = e > 0.0 ? e : in->turbine_efficiency;
        s->polytropic_efficiency = in->polytropic_efficiency;
        if (e > 0.0)
            snprintf(s->field_aux, sizeof s->field_aux, "/turbine_stage_efficiency/%d", j);
        else
            set_field(s->field_aux, "/turbine_efficiency");
        if (k->Nt == 1)
            snprintf(s->label, sizeof s->label, "turbine");
        else
            set_label(s, "turbine", j + 1);
        if (!last && add_heat(c, in, T_rh, j + 1, err) == NULL)
            return gc_error_id(err, GC_ERR_INVALID, GC_BF_TURBINE_STAGES, -1, "chain too long");
    }
    S->turbine_exit = c->n_steps;
    return GC_OK;
}

/* The regenerator's gas side (linked to its air side), the exhaust loss, the
 * heat rejection. */
static int add_exhaust(const gc_brayton_input *in, const plan *k, int i_cold, gc_cycle *c,
                       gc_brayton_stations *S, gc_error *err)
{
    gc_step *s;
    if (k->regen) {
        int i_hot = c->n_steps;
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0,
                                    "/regenerator_effectiveness"));
        s->pressure_loss = k->Lrg;
        s->heat_sign = -1;
        set_field(s->field_aux, "/regenerator_gas_pressure_loss");
        snprintf(s->label, sizeof s->label, "regenerator gas");
        int rc = gc_cycle_link_exchanger(c, i_cold, i_hot, in->regenerator_effectiveness,
                                         GC_GEOM_CONST_P, "/regenerator_effectiveness");
        if (rc != GC_OK)
            return gc_error_id(err, rc, GC_BF_REGENERATOR_EFFECTIVENESS, -1,
                               "the regenerator could not be linked");
    }
    if (in->exhaust_pressure_loss > 0.0) {
        ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_PRESSURE_LOSS, GC_END_DEFAULT, 0.0,
                                    "/exhaust_pressure_loss"));
        s->pressure_loss = in->exhaust_pressure_loss;
        snprintf(s->label, sizeof s->label, "exhaust loss");
    }
    S->exhaust = c->n_steps;
    ADD_OR_FAIL(s, gc_cycle_add(c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, "/pressure_ratio"));
    s->geometry = GC_GEOM_CONST_P;
    s->heat_sign = -1;
    snprintf(s->label, sizeof s->label, "heat rejection");
    return GC_OK;
}

static int build_chain(const gc_brayton_input *in, const gc_site *site, gc_cycle *c,
                       gc_brayton_stations *st, gc_error *err)
{
    gc_brayton_stations S = { 0, -1, -1, -1, -1, -1 };
    plan k;
    memset(&k, 0, sizeof k);
    int i_cold = -1;
    int rc = make_plan(in, site, &k, err);
    if (rc != GC_OK)
        return rc;
    gc_cycle_init(c, GC_FRAME_FLOW, working_gas(in, site), site->T_K, site->P_Pa);
    c->T_dead_K = site->T_K;
    c->P_dead_Pa = site->P_Pa;
    rc = add_compression(in, site, &k, c, &S, &i_cold, err);
    if (rc == GC_OK)
        rc = add_expansion(in, &k, c, &S, err);
    if (rc == GC_OK)
        rc = add_exhaust(in, &k, i_cold, c, &S, err);
    if (rc != GC_OK)
        return rc;
    name_stations(c, &S);
    if (st != NULL)
        *st = S;
    return GC_OK;
}

/* ---- cooled first stage (cooling.h) -------------------------------------- */

/* For a cooled first stage: *out = *in with turbine_inlet_temperature the
 * mixed rotor-inlet temperature that the given combustor exit gives (the
 * coolant at the compressor delivery of one chain run of `in`, which does
 * not depend on the turbine inlet), and the split in *cool. A reheat left
 * to its default keeps the combustor-exit temperature. c and run are
 * scratch. */
static int cooled_input(const gc_brayton_input *in, const gc_site *site, gc_cycle *c,
                        gc_cycle_run *run, gc_brayton_input *out, gc_machine_cooled *cool,
                        gc_error *err)
{
    gc_brayton_stations S;
    int rc = build_chain(in, site, c, &S, err);
    if (rc != GC_OK)
        return rc;
    c->flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
    rc = gc_cycle_run_chain(c, run, err);
    if (rc != GC_OK)
        return rc;
    const gc_cycle_state *c2 = &run->states[S.compressor_exit];
    double T_fuel = in->fuel_temperature > 0.0 ? in->fuel_temperature : GC_T_REF_K;
    rc = gc_machine_cooling_from_tit(&in->cooling, &in->fuel, T_fuel, &run->gases[c2->gas],
                                     c2->T_K, in->combustor_efficiency,
                                     in->turbine_inlet_temperature, cool, err);
    if (rc != GC_OK)
        return gc_error_at(err, rc, strcmp(err ? err->field : "", "/cooling/blade_temperature")
                                    == 0 ? GC_BF_COOLING_BLADE_TEMPERATURE : GC_BF_COOLING, -1);
    *out = *in;
    out->turbine_inlet_temperature = cool->rotor_inlet_T_K;
    if (!(in->reheat_temperature > 0.0))
        out->reheat_temperature = in->turbine_inlet_temperature;
    return GC_OK;
}

/* ---- figures from one run ------------------------------------------------ */

typedef struct run_figs {
    double w_net, w_c, w_t, q_in, eta, eta_hhv, far, q_regen, q_ic;
} run_figs;

static void figures(const gc_brayton_input *in, const gc_cycle_run *run, run_figs *F)
{
    memset(F, 0, sizeof *F);
    for (int p = 0; p < run->n_processes; p++) {
        const gc_cycle_process *pr = &run->processes[p];
        if (pr->kind == GC_PROC_COMPRESSION)
            F->w_c -= pr->work;
        else if (pr->kind == GC_PROC_EXPANSION)
            F->w_t += pr->work;
        else if (pr->kind == GC_PROC_COOLING)
            F->q_ic -= pr->heat;
        else if (pr->kind == GC_PROC_HEAT_EXCHANGE && pr->heat > 0.0)
            F->q_regen += pr->heat;
    }
    F->w_net = run->summary.net_work;
    if (gc__brayton_fuel_mode(in)) {
        F->far = run->summary.fuel_air_ratio;
        F->q_in = F->far * in->fuel.LHV_J_per_kg;
        double q_hhv = F->far * in->fuel.HHV_J_per_kg;
        F->eta = F->q_in > 0.0 ? F->w_net / F->q_in : 0.0;
        F->eta_hhv = q_hhv > 0.0 ? F->w_net / q_hhv : 0.0;
    } else {
        F->q_in = run->summary.heat_in;
        F->eta = F->q_in > 0.0 ? F->w_net / F->q_in : 0.0;
        F->eta_hhv = F->eta;
    }
}

/* Turbine exit vs compressor exit for the regenerator (states of run). */
static int regen_check(const gc_brayton_input *in, const gc_cycle_run *run,
                       const gc_brayton_stations *S, gc_error *err)
{
    if (!(in->regenerator_effectiveness > 0.0))
        return GC_OK;
    double Th = run->states[S->turbine_exit].T_K, Tc = run->states[S->compressor_exit].T_K;
    if (!(Th > Tc))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_BF_REGENERATOR_EFFECTIVENESS, -1,
                            "the turbine exit (%.1f K) is not hotter than the compressor "
                            "exit (%.1f K), so a regenerator has no temperature difference "
                            "to work with; lower the pressure ratio or remove the regenerator",
                            Th, Tc);
    return GC_OK;
}

/* ---- optimum searches ---------------------------------------------------- */

typedef struct search_ctx {
    gc_brayton_input in;        /* copy with the trial pressure ratio */
    gc_brayton_input cooled;    /* with a cooled first stage: the chain's input at that ratio */
    const gc_site *site;
    gc_cycle chain;
    gc_cycle_run run;
    int evaluations;
} search_ctx;

/* Evaluates at exp(x); returns 1 and the figures when the cycle can be run. */
static int trial(search_ctx *X, double x, double *eta, double *w)
{
    gc_brayton_stations S;
    const gc_brayton_input *use = &X->in;
    X->in.pressure_ratio = exp(x);
    X->evaluations++;
    if (X->in.cooling.enabled) {   /* the split changes with the compressor delivery */
        gc_machine_cooled cool;
        if (cooled_input(&X->in, X->site, &X->chain, &X->run, &X->cooled, &cool, NULL) != GC_OK)
            return 0;
        use = &X->cooled;
    }
    if (build_chain(use, X->site, &X->chain, &S, NULL) != GC_OK)
        return 0;
    X->chain.flags = GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS;
    if (gc_cycle_run_chain(&X->chain, &X->run, NULL) != GC_OK)
        return 0;
    if (regen_check(use, &X->run, &S, NULL) != GC_OK)
        return 0;
    run_figs F;
    figures(use, &X->run, &F);
    if (!isfinite(F.eta) || !isfinite(F.w_net) || !(F.q_in > 0.0))
        return 0;
    *eta = F.eta;
    *w = F.w_net;
    return 1;
}

static double objective(int which, double eta, double w)
{
    return which == 0 ? eta : w;
}

/* Brent's method (R. P. Brent, Algorithms for Minimization without
 * Derivatives, 1973, ch. 5: parabolic interpolation safeguarded by
 * golden-section steps) maximising objective `which` (0 efficiency, 1 work)
 * in the bracket [x_{k-1}, x_{k+1}] around scan point k. Infeasible trials
 * count as minus infinity; a parabola through them is never accepted, so
 * the method then takes golden-section steps. */
#define MAX_BAD 128
typedef struct best_pt {
    double x, f, eta, w;        /* best trial so far (ln rp, objective, figures) */
    int n_bad;
    double bad[MAX_BAD];        /* infeasible trials (ln rp) */
} best_pt;

static double probe(search_ctx *X, int which, double x, best_pt *B)
{
    double e, w;
    if (!trial(X, x, &e, &w)) {
        if (B->n_bad < MAX_BAD)
            B->bad[B->n_bad++] = x;
        return INFINITY;                          /* minimising -objective */
    }
    double f = objective(which, e, w);
    if (f > B->f) {
        B->f = f; B->x = x; B->eta = e; B->w = w;
    }
    return -f;
}

static void refine(search_ctx *X, int which, const double *xs, const int *ok,
                   const double *etas, const double *ws, int k, gc_brayton_optimum *o)
{
    const int N = GC_BRAYTON_RP_SEARCH_SCAN;
    const double cg = 0.5 * (3.0 - sqrt(5.0)); /* 0.381966... */
    const double tol = 0.5 * GC_BRAYTON_RP_SEARCH_TOL;
    double a = xs[k > 0 ? k - 1 : 0], b = xs[k < N - 1 ? k + 1 : N - 1];
    best_pt B;
    int start_evals = X->evaluations;
    B.x = xs[k];
    B.f = objective(which, etas[k], ws[k]);
    B.eta = etas[k];
    B.w = ws[k];
    B.n_bad = 0;
    if (k > 0 && !ok[k - 1])
        B.bad[B.n_bad++] = xs[k - 1];
    if (k < N - 1 && !ok[k + 1])
        B.bad[B.n_bad++] = xs[k + 1];

    /* Brent's variables: x best, w second best, v previous w */
    double x = xs[k], w = x, v = x, fx = -B.f, fw = fx, fv = fx, d = 0.0, e = 0.0;
    for (int it = 0; it < 100; it++) {
        double m = 0.5 * (a + b);
        if (fabs(x - m) <= 2.0 * tol - 0.5 * (b - a))
            break;
        int golden = 1;
        if (fabs(e) > tol) {
            double r = (x - w) * (fx - fv), q = (x - v) * (fx - fw);
            double p = (x - v) * q - (x - w) * r;
            q = 2.0 * (q - r);
            if (q > 0.0)
                p = -p;
            else
                q = -q;
            double etemp = e;
            if (isfinite(p) && isfinite(q) && fabs(p) < fabs(0.5 * q * etemp) &&
                p > q * (a - x) && p < q * (b - x)) {
                e = d;
                d = p / q;
                double u = x + d;
                if (u - a < 2.0 * tol || b - u < 2.0 * tol)
                    d = (m >= x) ? tol : -tol;
                golden = 0;
            }
        }
        if (golden) {
            e = (x >= m) ? a - x : b - x;
            d = cg * e;
        }
        double u = (fabs(d) >= tol) ? x + d : x + ((d >= 0.0) ? tol : -tol);
        double fu = probe(X, which, u, &B);
        if (fu <= fx) {
            if (u >= x) a = x; else b = x;
            v = w; fv = fw; w = x; fw = fx; x = u; fx = fu;
        } else {
            if (u < x) a = u; else b = u;
            if (fu <= fw || w == x) {
                v = w; fv = fw; w = u; fw = fu;
            } else if (fu <= fv || v == x || v == w) {
                v = u; fv = fu;
            }
        }
    }
    o->found = 1;
    o->pressure_ratio = exp(B.x);
    o->thermal_efficiency = B.eta;
    o->specific_work = B.w;
    o->at_lower_bound = B.x - xs[0] < 2.0 * GC_BRAYTON_RP_SEARCH_TOL;
    o->at_upper_bound = xs[N - 1] - B.x < 2.0 * GC_BRAYTON_RP_SEARCH_TOL;
    o->at_feasibility_limit = 0;
    for (int i = 0; i < B.n_bad; i++)
        if (fabs(B.bad[i] - B.x) < 4.0 * GC_BRAYTON_RP_SEARCH_TOL)
            o->at_feasibility_limit = 1;
    o->evaluations += X->evaluations - start_evals;
}

static void search_optima(const gc_brayton_input *in, const gc_site *site,
                          gc_brayton_result *r)
{
    enum { N = GC_BRAYTON_RP_SEARCH_SCAN };
    search_ctx X;
    double xs[N], etas[N], ws[N];
    int ok[N];
    const double lo = log(GC_BRAYTON_RP_SEARCH_MIN), hi = log(GC_BRAYTON_RP_SEARCH_MAX);

    X.in = *in;
    X.site = site;
    X.evaluations = 0;
    gc_brayton_optimum *opt[2] = { &r->max_efficiency, &r->max_specific_work };
    for (int j = 0; j < 2; j++) {
        memset(opt[j], 0, sizeof *opt[j]);
        opt[j]->lower_bound = GC_BRAYTON_RP_SEARCH_MIN;
        opt[j]->upper_bound = GC_BRAYTON_RP_SEARCH_MAX;
    }
    for (int i = 0; i < N; i++) {
        xs[i] = lo + (hi - lo) * i / (N - 1);
        ok[i] = trial(&X, xs[i], &etas[i], &ws[i]);
    }
    int scan_evals = X.evaluations;
    for (int j = 0; j < 2; j++) {
        int k = -1;
        for (int i = 0; i < N; i++)
            if (ok[i] && (k < 0 || objective(j, etas[i], ws[i]) > objective(j, etas[k], ws[k])))
                k = i;
        opt[j]->evaluations = scan_evals;
        if (k >= 0)
            refine(&X, j, xs, ok, etas, ws, k, opt[j]);
    }
    r->has_optimum = 1;
}

/* ---- warnings ----------------------------------------------------------- */

static void warn(gc_brayton_result *r, const char *code, int field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

static void warn(gc_brayton_result *r, const char *code, int field, const char *fmt, ...)
{
    if (r->n_warnings >= GC_BRAYTON_MAX_WARNINGS)
        return;
    gc_warning *w = &r->warnings[r->n_warnings++];
    va_list ap;
    w->code = code;
    w->field = field;
    w->index[0] = w->index[1] = -1;
    va_start(ap, fmt);
    vsnprintf(w->message, sizeof w->message, fmt, ap);
    va_end(ap);
}

static void add_warnings(const gc_brayton_input *in, gc_brayton_result *r)
{
    for (int i = 0; i < r->site.n_warnings; i++)
        warn(r, "site", gc__brayton_site_field[r->site.warnings[i].member], "%s",
             r->site.warnings[i].message);
    /* a cooled first stage needs no caution; a reheat stage is never cooled */
    double tmax = fmax(in->cooling.enabled ? 0.0 : in->turbine_inlet_temperature,
                       in->turbine_stages > 1 ? in->reheat_temperature : 0.0);
    if (tmax > GC_BRAYTON_TIT_COOLED_K)
        warn(r, "cooled_blades", tmax == in->turbine_inlet_temperature
                                     ? GC_BF_TURBINE_INLET_TEMPERATURE
                                     : GC_BF_REHEAT_TEMPERATURE,
             "a turbine inlet temperature of %.0f K is above about %.0f K, where turbine "
             "blades need cooling air (common practice); the cycle here does not bleed "
             "any, so its figures are optimistic", tmax, GC_BRAYTON_TIT_COOLED_K);
    if (in->regenerator_effectiveness > 0.0) {
        double dT = r->T_turbine_exit - r->T_compressor_exit;
        if (dT < GC_BRAYTON_REGEN_MIN_DT_K)
            warn(r, "regenerator_small_difference", GC_BF_REGENERATOR_EFFECTIVENESS,
                 "the turbine exit is only %.1f K hotter than the compressor exit at this "
                 "pressure ratio: the regenerator recovers little heat for its pressure "
                 "losses (common practice: regeneration pays at low pressure ratios)", dT);
    }
    if (in->compressor_stages > 1 && in->intercooling_temperature > 0.0 &&
        in->intercooling_temperature < r->site.T_K - 1e-9)
        warn(r, "refrigerated_intercooler", GC_BF_INTERCOOLING_TEMPERATURE,
             "the intercooling temperature is below the ambient temperature: it needs a "
             "refrigerated intercooler");
    if (!(r->specific_work > 0.0))
        warn(r, "no_net_work", GC_BF_PRESSURE_RATIO,
             "the cycle delivers no net work: the compressor takes more than the turbine "
             "gives");
    if (r->cycle.ideal_is_actual)
        warn(r, "ideal_equals_actual", -1, "with the default (ideal) component efficiencies "
             "and no pressure losses the actual cycle equals its ideal counterpart");
}

void gc__brayton_report(const gc_brayton_input *in, const gc_brayton_result *r, gc_report *rep)
{
    for (int i = 0; i < r->n_warnings; i++) {
        const gc_warning *w = &r->warnings[i];
        gc_report_warn(rep, w->code, w->field, w->index[0], "%s", w->message);
    }
    if (in->has_gas && in->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", GC_BF_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    gc_report_validity_cycle(rep, &r->cycle);
}

static void title(const gc_brayton_input *in, gc_brayton_result *r)
{
    snprintf(r->title, sizeof r->title, "Brayton cycle%s%s%s%s%s",
             in->regenerator_effectiveness > 0.0 ? ", regenerative" : "",
             in->compressor_stages > 1 ? ", intercooled" : "",
             in->turbine_stages > 1 ? ", reheat" : "",
             in->cooling.enabled ? ", cooled first stage" : "",
             in->has_fuel ? ", fuel-fired" : ", air-standard");
}

/* ---- evaluation ------------------------------------------------------------ */

int gc_brayton_evaluate(const gc_brayton_input *in, gc_brayton_result *r, gc_error *err)
{
    gc_error first;
    int n_err = 0;
    int rc = gc_brayton_validate(in, &first, 1, &n_err);
    if (rc != GC_OK) {
        if (err != NULL)
            *err = first;
        return rc;
    }
    rc = gc__brayton_evaluate(in, r, err);
    return rc == GC_OK ? rc : gc_preset_name_error(gc_brayton_preset(), err);
}

/* The plant figures for a rated net power (q_in: heat in per kg of air). */
static int plant_figures(const gc_brayton_input *in, double q_in, gc_brayton_result *r,
                         gc_error *err)
{
    const gc_cycle_run *run = &r->cycle.actual;
    const gc_brayton_stations *S = &r->stations;
    if (!(r->specific_electric_work > 0.0))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_BF_NET_POWER, -1,
                           "the cycle delivers no net work, so no air flow gives %g W",
                           in->net_power);
    r->has_power = 1;
    r->net_power = in->net_power;
    r->shaft_power = in->net_power / in->generator_efficiency;
    r->air_mass_flow = in->net_power / r->specific_electric_work;
    r->fuel_mass_flow = r->air_mass_flow * r->fuel_air_ratio;
    r->exhaust_mass_flow = r->air_mass_flow * run->states[S->exhaust].mass_ratio;
    r->heat_input_power = r->air_mass_flow * q_in;
    r->heat_input_power_hhv = r->has_fuel ? r->fuel_mass_flow * in->fuel.HHV_J_per_kg
                                          : r->heat_input_power;
    r->heat_rate = r->heat_input_power / in->net_power;
    r->heat_rate_hhv = r->heat_input_power_hhv / in->net_power;
    r->heat_rate_kJ_per_kWh = r->heat_rate * J_PER_KWH / 1e3;
    r->heat_rate_hhv_kJ_per_kWh = r->heat_rate_hhv * J_PER_KWH / 1e3;
    r->heat_rate_Btu_per_kWh = r->heat_rate * J_PER_KWH / BTU_IT_J;
    r->heat_rate_hhv_Btu_per_kWh = r->heat_rate_hhv * J_PER_KWH / BTU_IT_J;
    if (r->has_fuel) {
        double co2 = 0.0;
        gc_fuel_emissions(&in->fuel, &co2, NULL);
        r->co2_mass_flow = r->fuel_mass_flow * co2;
        r->co2_kg_per_MWh = r->co2_mass_flow / in->net_power * J_PER_MWH;
    }
    const gc_cycle_state *x = &run->states[S->exhaust];
    const gc_gas *gx = &run->gases[x->gas];
    if (gc_gas_check_T(gx, r->site.T_K, NULL, NULL) == GC_OK)
        r->exhaust_heat_power = r->exhaust_mass_flow *
                                (x->h_J_per_kg - gc_gas_h_T(gx, r->site.T_K));
    return GC_OK;
}

/* The figures of the actual run (and of the ideal ones) into r; the run's
 * own into *F. */
static void cycle_figures(const gc_brayton_input *in, gc_brayton_result *r, run_figs *F)
{
    const gc_cycle_run *run = &r->cycle.actual;
    const gc_brayton_stations *S = &r->stations;
    run_figs Fi;
    figures(in, run, F);
    r->has_fuel = gc__brayton_fuel_mode(in);
    r->has_regenerator = in->regenerator_effectiveness > 0.0;
    r->has_intercooler = in->compressor_stages > 1;
    title(in, r);
    r->specific_work = F->w_net;
    r->specific_shaft_work = in->mechanical_efficiency * F->w_net;
    r->specific_electric_work = in->generator_efficiency * r->specific_shaft_work;
    r->compressor_work = F->w_c;
    r->turbine_work = F->w_t;
    r->back_work_ratio = F->w_t > 0.0 ? F->w_c / F->w_t : 0.0;
    r->heat_in = F->q_in;
    r->regenerator_heat = F->q_regen;
    r->intercooler_heat = F->q_ic;
    r->thermal_efficiency = F->eta;
    r->thermal_efficiency_hhv = F->eta_hhv;
    r->electric_efficiency = F->q_in > 0.0 ? r->specific_electric_work / F->q_in : 0.0;
    if (r->cycle.has_ideal) {
        figures(in, &r->cycle.ideal, &Fi);
        r->ideal_efficiency = Fi.eta;
        r->ideal_specific_work = Fi.w_net;
    }
    if (r->cycle.has_ideal_components) {
        /* the engine's heat in is the far x LHV of figures() in fuel mode */
        r->has_ideal_components = 1;
        r->ideal_components_efficiency = r->cycle.ideal_components.thermal_efficiency;
        r->ideal_components_specific_work = r->cycle.ideal_components.net_work;
    }
    r->carnot_efficiency = r->cycle.carnot_efficiency;
    r->T_compressor_exit = run->states[S->compressor_exit].T_K;
    r->P_compressor_exit = run->states[S->compressor_exit].P_Pa;
    r->T_turbine_exit = run->states[S->turbine_exit].T_K;
    r->T_exhaust = run->states[S->exhaust].T_K;
    r->exhaust_temperature = r->T_exhaust;
    if (r->has_fuel) {
        r->fuel_air_ratio = F->far;
        const gc_cycle_state *a = &run->states[S->combustor_inlet];
        const gc_cycle_state *b = &run->states[S->turbine_inlet];
        r->fuel_air_ratio_main = (b->mass_ratio - a->mass_ratio) / a->mass_ratio;
        double phi = 0.0;
        if (gc_combustion_phi(&in->fuel, &run->gases[a->gas], r->fuel_air_ratio_main, &phi,
                              NULL) == GC_OK)
            r->equivalence_ratio = phi;
    }

}

int gc__brayton_evaluate(const gc_brayton_input *in, gc_brayton_result *r, gc_error *err)
{
    gc_cycle chain;
    int rc;
    /* clear everything but the engine's result (about 40 KB, which
     * gc_cycle_evaluate fills itself: only entries below its counts are
     * meaningful) */
    _Static_assert(offsetof(gc_brayton_result, cycle) == 0, "the engine result comes first");
    memset((char *)r + sizeof r->cycle, 0, sizeof *r - sizeof r->cycle);
    r->cycle.has_ideal = 0;
    r->cycle.ideal_is_actual = 0;
    r->cycle.carnot_efficiency = 0.0;
    r->cycle.actual.n_states = r->cycle.actual.n_processes = r->cycle.actual.n_gases = 0;
    r->cycle.ideal.n_states = r->cycle.ideal.n_processes = r->cycle.ideal.n_gases = 0;
    rc = gc_site_resolve(&in->site, &r->site, err);
    if (rc != GC_OK)
        return gc_error_at(err, rc, gc__brayton_site_field[err && (unsigned)err->field_id < 5u
                                                           ? err->field_id : 0], -1);
    gc_brayton_input cooled;
    const gc_brayton_input *use = in;   /* the chain's input */
    if (in->cooling.enabled) {
        rc = cooled_input(in, &r->site, &chain, &r->cycle.actual, &cooled, &r->cooled, err);
        if (rc != GC_OK)
            return rc;
        r->has_cooling = 1;
        use = &cooled;
    }
    rc = build_chain(use, &r->site, &chain, &r->stations, err);
    if (rc != GC_OK)
        return rc;
    if (in->flags & GC_BRAYTON_NO_AREAS)
        chain.flags |= GC_CYCLE_NO_AREAS;
    if (in->flags & GC_BRAYTON_NO_BOUNDS)
        chain.flags |= GC_CYCLE_NO_BOUNDS;
    rc = gc_cycle_evaluate(&chain, &r->cycle, err);
    if (rc != GC_OK)
        return rc;
    const gc_cycle_run *run = &r->cycle.actual;
    const gc_brayton_stations *S = &r->stations;
    rc = regen_check(use, run, S, err);
    if (rc != GC_OK)
        return rc;

    run_figs F;
    cycle_figures(use, r, &F);
    if (in->net_power > 0.0) {
        rc = plant_figures(use, F.q_in, r, err);
        if (rc != GC_OK)
            return rc;
    }

    if (in->optimum_search && !(in->flags & GC_BRAYTON_NO_OPTIMUM))
        search_optima(in, &r->site, r);
    add_warnings(in, r);
    return GC_OK;
}
