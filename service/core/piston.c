/*
 * piston.c — piston-engine presets (gascycle/piston.h): validates the
 * trade-named inputs, builds each cycle's closed-frame chain for the cycle
 * engine, evaluates it and derives the engine figures:
 *   trapped mass     m = V_d,cyl / (v_max - v_min)   (the swept volume holds
 *                    the cycle's specific-volume span)
 *   work per cycle   W = m w_net;  IMEP = W / V_d,cyl (= the cycle's MEP)
 *   power            P = W n_cyl f_cycle, f_cycle = speed / (strokes / 2)
 *   ISFC             m q_in / LHV per cycle over W, i.e. 1 / (eta LHV)
 * These are the textbook definitions of indicated figures (common practice).
 */
#include "gascycle/piston.h"
#include "gascycle/solve.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static const char *const names[GC_PISTON_COUNT] = {
    "otto", "diesel", "dual", "atkinson", "miller", "stirling", "ericsson", "lenoir", "carnot"};

const char *gc_piston_name(gc_piston_cycle cycle)
{
    return ((int)cycle >= 0 && cycle < GC_PISTON_COUNT) ? names[cycle] : "unknown";
}

int gc_piston_from_name(const char *name, gc_piston_cycle *cycle)
{
    for (int i = 0; name && i < GC_PISTON_COUNT; i++)
        if (strcmp(name, names[i]) == 0) {
            *cycle = (gc_piston_cycle)i;
            return GC_OK;
        }
    return GC_ERR_UNKNOWN;
}

void gc_piston_input_init(gc_piston_input *in, gc_piston_cycle cycle)
{
    memset(in, 0, sizeof *in);
    in->cycle = cycle;
    gc_gas_init_air(&in->gas);
    in->intake_temperature = 288.15;   /* ISO 2314 / ISO 3977 reference ambient (common practice) */
    in->intake_pressure = 101325.0;
    double *opt[] = {&in->compression_ratio, &in->cutoff_ratio, &in->pressure_ratio,
                     &in->peak_pressure, &in->peak_temperature, &in->heat_added,
                     &in->expansion_ratio, &in->effective_compression_ratio,
                     &in->compression_efficiency, &in->expansion_efficiency,
                     &in->regenerator_effectiveness, &in->displacement, &in->cylinders,
                     &in->speed, &in->strokes, &in->fuel_heating_value,
                     &in->dead_temperature, &in->dead_pressure};
    for (size_t i = 0; i < sizeof opt / sizeof opt[0]; i++)
        *opt[i] = GC_PISTON_UNSET;
}

/* ---- validation helpers --------------------------------------------------- */

#define SET(x) GC_PISTON_IS_SET(x)

static int bad(gc_error *err, const char *field, const char *msg)
{
    return gc_error_set(err, GC_ERR_INVALID, field, "%s", msg);
}

/* A given value must be finite and inside [lo, hi] (open bounds with *_open). */
static int in_range(gc_error *err, double v, const char *field, double lo, int lo_open,
                    double hi, const char *what)
{
    if (!isfinite(v) || (lo_open ? !(v > lo) : !(v >= lo)) || !(v <= hi))
        return gc_error_set(err, GC_ERR_INVALID, field, "%s", what);
    return GC_OK;
}

typedef struct usage {
    unsigned allowed;   /* bit per optional input (enum below) */
} usage;

enum {
    U_CR = 1u << 0, U_CUT = 1u << 1, U_PR = 1u << 2, U_PPEAK = 1u << 3, U_TPEAK = 1u << 4,
    U_Q = 1u << 5, U_ER = 1u << 6, U_ECR = 1u << 7, U_EFFC = 1u << 8, U_EFFE = 1u << 9,
    U_REGEN = 1u << 10
};

static unsigned allowed_inputs(gc_piston_cycle cyc)
{
    switch (cyc) {
    case GC_PISTON_OTTO: return U_CR | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    case GC_PISTON_DIESEL: return U_CR | U_CUT | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    case GC_PISTON_DUAL: return U_CR | U_CUT | U_PR | U_PPEAK | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    case GC_PISTON_ATKINSON: return U_CR | U_ER | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    case GC_PISTON_MILLER: return U_CR | U_ECR | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    case GC_PISTON_STIRLING: return U_CR | U_TPEAK | U_REGEN;
    case GC_PISTON_ERICSSON: return U_PR | U_TPEAK | U_REGEN;
    case GC_PISTON_LENOIR: return U_PR | U_TPEAK | U_Q | U_EFFE;
    case GC_PISTON_CARNOT: return U_CR | U_TPEAK | U_Q | U_EFFC | U_EFFE;
    default: return 0;
    }
}

static int check_inputs(const gc_piston_input *in, gc_error *err)
{
    if ((int)in->cycle < 0 || in->cycle >= GC_PISTON_COUNT)
        return gc_error_set(err, GC_ERR_UNKNOWN, "/cycle", "unknown piston-engine cycle");
    const char *cname = gc_piston_name(in->cycle);
    struct { double v; unsigned bit; const char *field; } opt[] = {
        {in->compression_ratio, U_CR, "/compression_ratio"},
        {in->cutoff_ratio, U_CUT, "/cutoff_ratio"},
        {in->pressure_ratio, U_PR, "/pressure_ratio"},
        {in->peak_pressure, U_PPEAK, "/peak_pressure"},
        {in->peak_temperature, U_TPEAK, "/peak_temperature"},
        {in->heat_added, U_Q, "/heat_added"},
        {in->expansion_ratio, U_ER, "/expansion_ratio"},
        {in->effective_compression_ratio, U_ECR, "/effective_compression_ratio"},
        {in->compression_efficiency, U_EFFC, "/compression_efficiency"},
        {in->expansion_efficiency, U_EFFE, "/expansion_efficiency"},
        {in->regenerator_effectiveness, U_REGEN, "/regenerator_effectiveness"}};
    unsigned ok = allowed_inputs(in->cycle);
    for (size_t i = 0; i < sizeof opt / sizeof opt[0]; i++)
        if (SET(opt[i].v) && !(ok & opt[i].bit))
            return gc_error_set(err, GC_ERR_INVALID, opt[i].field,
                                "does not apply to the %s cycle", cname);
    int rc = gc_gas_check_T(&in->gas, in->intake_temperature, "/intake_temperature", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(in->intake_pressure) || !(in->intake_pressure >= 100.0) ||
        !(in->intake_pressure <= 1e8))
        return bad(err, "/intake_pressure", "must be between 100 Pa and 100 MPa");
    /* Carnot and Stirling cycles need no combustion chamber: their volume
     * ratios (isentropic legs between far-apart temperatures) may be huge */
    int wide = in->cycle == GC_PISTON_CARNOT || in->cycle == GC_PISTON_STIRLING;
    if (SET(in->compression_ratio) &&
        (rc = in_range(err, in->compression_ratio, "/compression_ratio", 1.0, 1,
                       wide ? 1e6 : 100.0,
                       wide ? "must be greater than 1 and at most 1e6"
                            : "must be greater than 1 and at most 100")))
        return rc;
    if (SET(in->cutoff_ratio) &&
        (rc = in_range(err, in->cutoff_ratio, "/cutoff_ratio", 1.0, in->cycle == GC_PISTON_DIESEL,
                       100.0, in->cycle == GC_PISTON_DIESEL ? "must be greater than 1"
                                                            : "must be at least 1")))
        return rc;
    if (SET(in->pressure_ratio)) {
        int strict = in->cycle == GC_PISTON_ERICSSON || in->cycle == GC_PISTON_LENOIR;
        rc = in_range(err, in->pressure_ratio, "/pressure_ratio", 1.0, strict, 1000.0,
                      strict ? "must be greater than 1 and at most 1000"
                             : "must be at least 1 and at most 1000");
        if (rc)
            return rc;
    }
    if (SET(in->peak_pressure) &&
        (rc = in_range(err, in->peak_pressure, "/peak_pressure", in->intake_pressure, 1, 1e9,
                       "must be above the intake pressure and at most 1 GPa")))
        return rc;
    if (SET(in->peak_temperature)) {
        rc = gc_gas_check_T(&in->gas, in->peak_temperature, "/peak_temperature", err);
        if (rc != GC_OK)
            return rc;
        if (!(in->peak_temperature > in->intake_temperature))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/peak_temperature",
                                "must be above the intake temperature (%.6g K)",
                                in->intake_temperature);
    }
    if (SET(in->heat_added) &&
        (rc = in_range(err, in->heat_added, "/heat_added", 0.0, 1, 1e8,
                       "must be positive and at most 100 MJ/kg")))
        return rc;
    if (SET(in->expansion_ratio) &&
        (rc = in_range(err, in->expansion_ratio, "/expansion_ratio", 1.0, 1, 200.0,
                       "must be greater than 1 and at most 200")))
        return rc;
    if (SET(in->effective_compression_ratio) &&
        (rc = in_range(err, in->effective_compression_ratio, "/effective_compression_ratio",
                       1.0, 1, 100.0, "must be greater than 1")))
        return rc;
    if (SET(in->compression_efficiency) &&
        (rc = in_range(err, in->compression_efficiency, "/compression_efficiency", 0.05, 0, 1.0,
                       "must be between 0.05 and 1")))
        return rc;
    if (SET(in->expansion_efficiency) &&
        (rc = in_range(err, in->expansion_efficiency, "/expansion_efficiency", 0.05, 0, 1.0,
                       "must be between 0.05 and 1")))
        return rc;
    if (SET(in->regenerator_effectiveness) &&
        (rc = in_range(err, in->regenerator_effectiveness, "/regenerator_effectiveness", 0.0, 0,
                       1.0, "must be between 0 and 1")))
        return rc;
    if (SET(in->displacement) &&
        (rc = in_range(err, in->displacement, "/displacement", 0.0, 1, 100.0,
                       "must be positive (m3) and at most 100 m3")))
        return rc;
    if (SET(in->cylinders) &&
        (!(in->cylinders >= 1.0 && in->cylinders <= 64.0) || in->cylinders != floor(in->cylinders)))
        return bad(err, "/cylinders", "must be a whole number from 1 to 64");
    if (SET(in->speed) &&
        (rc = in_range(err, in->speed, "/speed", 0.0, 1, 1000.0,
                       "must be positive and at most 1000 rev/s")))
        return rc;
    if (SET(in->strokes) && in->strokes != 2.0 && in->strokes != 4.0)
        return bad(err, "/strokes", "must be 2 or 4");
    if (SET(in->fuel_heating_value) &&
        (rc = in_range(err, in->fuel_heating_value, "/fuel_heating_value", 1e6, 0, 2e8,
                       "must be between 1 and 200 MJ/kg")))
        return rc;
    if ((SET(in->cylinders) || SET(in->speed) || SET(in->strokes)) && !SET(in->displacement))
        return bad(err, "/displacement", "is needed with cylinders, speed and strokes");
    if ((SET(in->speed) != SET(in->strokes)))
        return bad(err, SET(in->speed) ? "/strokes" : "/speed",
                   "speed and strokes are given together for the indicated power");
    if (SET(in->dead_temperature)) {
        rc = gc_gas_check_T(&in->gas, in->dead_temperature, "/dead_temperature", err);
        if (rc != GC_OK)
            return rc;
    }
    if (SET(in->dead_pressure) && !(in->dead_pressure > 0.0 && in->dead_pressure <= 1e8))
        return bad(err, "/dead_pressure", "must be positive");
    return GC_OK;
}

/* The heat-addition end: exactly one of the listed inputs. */
typedef struct heat_end {
    gc_end_kind end;
    double value;
    const char *field;
} heat_end;

static int one_heat_end(const gc_piston_input *in, unsigned which, heat_end *h, gc_error *err)
{
    struct { double v; unsigned bit; gc_end_kind end; const char *field; } c[] = {
        {in->cutoff_ratio, U_CUT, GC_END_VOLUME_RATIO, "/cutoff_ratio"},
        {in->peak_temperature, U_TPEAK, GC_END_TEMPERATURE, "/peak_temperature"},
        {in->heat_added, U_Q, GC_END_HEAT, "/heat_added"},
        {in->expansion_ratio, U_ER, GC_END_TEMPERATURE, "/expansion_ratio"},
        {in->pressure_ratio, U_PR, GC_END_PRESSURE_RATIO, "/pressure_ratio"}};
    int n = 0;
    char list[160] = "";
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
        if (!(which & c[i].bit))
            continue;
        size_t len = strlen(list);
        snprintf(list + len, sizeof list - len, "%s%s", len ? ", " : "", c[i].field + 1);
        if (SET(c[i].v)) {
            if (n++ == 0) {
                h->end = c[i].end;
                h->value = c[i].v;
                h->field = c[i].field;
            } else {
                return gc_error_set(err, GC_ERR_INVALID, c[i].field,
                                    "give only one of %s", list);
            }
        }
    }
    if (n == 0) {
        /* list the whole set in the message */
        list[0] = '\0';
        for (size_t i = 0; i < sizeof c / sizeof c[0]; i++)
            if (which & c[i].bit) {
                size_t len = strlen(list);
                snprintf(list + len, sizeof list - len, "%s%s", len ? ", " : "", c[i].field + 1);
            }
        return gc_error_set(err, GC_ERR_INVALID, "", "the %s cycle needs one of %s",
                            gc_piston_name(in->cycle), list);
    }
    return GC_OK;
}

static double eff_or_1(double e) { return SET(e) ? e : 1.0; }

static gc_step *add(gc_cycle *c, gc_process_kind kind, gc_end_kind end, double value,
                    const char *field, const char *label)
{
    gc_step *s = gc_cycle_add(c, kind, end, value, field);
    /* preset chains have at most 6 steps, far below GC_CYCLE_MAX_STEPS: never NULL */
    if (s == NULL)
        s = &c->steps[GC_CYCLE_MAX_STEPS - 1];
    snprintf(s->label, sizeof s->label, "%s", label);
    return s;
}

static gc_step *add_compression(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                                double value, const char *field)
{
    gc_step *s = add(c, GC_PROC_COMPRESSION, end, value, field, "compression");
    s->efficiency = eff_or_1(in->compression_efficiency);
    snprintf(s->field_aux, sizeof s->field_aux, "/compression_efficiency");
    return s;
}

static gc_step *add_expansion(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                              double value, const char *field)
{
    gc_step *s = add(c, GC_PROC_EXPANSION, end, value, field, "expansion");
    s->efficiency = eff_or_1(in->expansion_efficiency);
    snprintf(s->field_aux, sizeof s->field_aux, "/expansion_efficiency");
    return s;
}

static void add_close(gc_cycle *c, gc_geometry geom)
{
    gc_step *s = add(c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, "", "heat rejection");
    s->geometry = geom;
    s->heat_sign = -1;
}

/* ---- Atkinson with a given expansion ratio ------------------------------------
 * The requested volume ratio of the expansion is the one evaluated. From
 * (T3, v2 = v1 / r) the expansion ends at the intake pressure P1 (end
 * START_PRESSURE) at v4 = re v2, i.e. at T4 = P1 v4 / R = T1 re / r; T3 is the
 * heat-addition end temperature that makes it so. The expansion's isentropic
 * efficiency eta_e is referred, as the engine does for a pressure end, to the
 * isentrope to the same end pressure: u4 = u3 - eta_e (u3 - u(T4s)), T4s the
 * isentropic end at P1 from (T3, P3 = R T3 / v2). eta_e = 1: T3 lies on the
 * isentrope through (T4, v4) (closed form in vr); eta_e < 1: T3 solves
 * u3 - eta_e (u3 - u(T4s(T3))) = u(T4) by Brent's method (solve.h), the
 * left side rising with T3. */
typedef struct atk_ctx {
    const gc_gas *g;
    double v2_m3_per_kg;   /* volume at the end of compression */
    double P1_Pa;          /* intake pressure, the expansion's end */
    double eta;            /* isentropic efficiency of the expansion */
} atk_ctx;

static int atk_u4(void *ctx, double T3, double *u4)
{
    const atk_ctx *a = ctx;
    double P3 = a->g->R_J_per_kgK * T3 / a->v2_m3_per_kg, T4s;
    if (gc_gas_check_T(a->g, T3, "", NULL) != GC_OK ||
        gc_gas_T_isentropic_P(a->g, T3, a->P1_Pa / P3, &T4s, NULL) != GC_OK)
        return GC_ERR_INFEASIBLE;
    double u3 = gc_gas_u_T(a->g, T3);
    *u4 = u3 - a->eta * (u3 - gc_gas_u_T(a->g, T4s));
    return GC_OK;
}

static int atkinson_T3(const gc_piston_input *in, double eta, double *T3, gc_error *err)
{
    const gc_gas *g = &in->gas;
    double r = in->compression_ratio, re = in->expansion_ratio;
    double T4 = in->intake_temperature * re / r;
    int rc = gc_gas_check_T(g, T4, "/expansion_ratio", err);
    if (rc != GC_OK)
        return rc;
    if (eta == 1.0) {
        rc = gc_gas_T_isentropic_v(g, T4, 1.0 / re, T3, err);
        if (rc != GC_OK && err)
            snprintf(err->field, sizeof err->field, "/expansion_ratio");
        return rc;
    }
    atk_ctx a = { g, g->R_J_per_kgK * in->intake_temperature / in->intake_pressure / r,
                  in->intake_pressure, eta };
    double target = gc_gas_u_T(g, T4), lo = T4, hi = g->T_max_K, ulo, uhi, u;
    int evals;
    if (atk_u4(&a, lo, &ulo) != GC_OK || atk_u4(&a, hi, &uhi) != GC_OK || !(uhi > target))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/expansion_ratio",
                            "with an expansion efficiency of %.6g no heat-addition end "
                            "temperature up to %.6g K lets the expansion over %.6g end at the "
                            "intake pressure", eta, hi, re);
    rc = gc_solve_root(atk_u4, &a, target, lo, hi, ulo - target, uhi - target, 1e-11 * T4,
                       200, T3, &u, &evals);
    if (rc != GC_OK)
        return gc_error_set(err, GC_ERR_NOCONV, "/expansion_ratio",
                            "the heat-addition end temperature for this expansion ratio was "
                            "not found");
    return GC_OK;
}

/* ideal: 1 builds the chain of the ideal counterpart's end conditions (so far
 * only the Atkinson heat-addition end with expansion_ratio differs: see
 * atkinson_T3); the caller idealises the efficiencies. */
static int build(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc_error_clear(err);
    int rc = check_inputs(in, err);
    if (rc != GC_OK)
        return rc;
    gc_cycle_init(c, GC_FRAME_CLOSED, &in->gas, in->intake_temperature, in->intake_pressure);
    c->flags = in->flags;
    if (SET(in->dead_temperature))
        c->T_dead_K = in->dead_temperature;
    if (SET(in->dead_pressure))
        c->P_dead_Pa = in->dead_pressure;
    double r = in->compression_ratio;
    int need_r = in->cycle != GC_PISTON_ERICSSON && in->cycle != GC_PISTON_LENOIR &&
                 in->cycle != GC_PISTON_CARNOT;
    if (need_r && !SET(r))
        return gc_error_set(err, GC_ERR_INVALID, "/compression_ratio",
                            "the %s cycle needs a compression_ratio", gc_piston_name(in->cycle));
    heat_end h;
    gc_step *s;
    switch (in->cycle) {
    case GC_PISTON_OTTO:
        if ((rc = one_heat_end(in, U_TPEAK | U_Q, &h, err)))
            return rc;
        add_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, "/compression_ratio");
        s = add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
        add_close(c, GC_GEOM_CONST_V);
        break;
    case GC_PISTON_DIESEL:
        if ((rc = one_heat_end(in, U_CUT | U_TPEAK | U_Q, &h, err)))
            return rc;
        if (SET(in->cutoff_ratio) && !(in->cutoff_ratio < r))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/cutoff_ratio",
                                "must be less than the compression ratio (%.6g): heat addition "
                                "would end beyond the largest cylinder volume", r);
        add_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, "/compression_ratio");
        s = add(c, GC_PROC_CONST_PRESSURE, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
        add_close(c, GC_GEOM_CONST_V);
        break;
    case GC_PISTON_DUAL: {
        if ((rc = one_heat_end(in, U_CUT | U_TPEAK | U_Q, &h, err)))
            return rc;
        if (SET(in->pressure_ratio) == SET(in->peak_pressure))
            return gc_error_set(err, GC_ERR_INVALID,
                                SET(in->pressure_ratio) ? "/peak_pressure" : "/pressure_ratio",
                                "the dual cycle needs one of pressure_ratio, peak_pressure");
        if (SET(in->cutoff_ratio) && !(in->cutoff_ratio < r))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/cutoff_ratio",
                                "must be less than the compression ratio (%.6g)", r);
        add_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, "/compression_ratio");
        s = add(c, GC_PROC_DUAL, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        if (SET(in->pressure_ratio)) {
            s->end2 = GC_END_PRESSURE_RATIO;
            s->end2_value = in->pressure_ratio;
            snprintf(s->field_aux, sizeof s->field_aux, "/pressure_ratio");
        } else {
            s->end2 = GC_END_PEAK_PRESSURE;
            s->end2_value = in->peak_pressure;
            snprintf(s->field_aux, sizeof s->field_aux, "/peak_pressure");
        }
        add_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
        add_close(c, GC_GEOM_CONST_V);
        break;
    }
    case GC_PISTON_ATKINSON: {
        if ((rc = one_heat_end(in, U_ER | U_TPEAK | U_Q, &h, err)))
            return rc;
        if (SET(in->expansion_ratio)) {
            double re = in->expansion_ratio;
            if (!(re > r))
                return gc_error_set(err, GC_ERR_INFEASIBLE, "/expansion_ratio",
                                    "must be greater than the compression ratio (%.6g) for an "
                                    "over-expanded cycle", r);
            rc = atkinson_T3(in, ideal ? 1.0 : eff_or_1(in->expansion_efficiency), &h.value,
                             err);
            if (rc != GC_OK)
                return rc;
        }
        add_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, "/compression_ratio");
        s = add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_START_PRESSURE, 0.0, h.field);
        add_close(c, GC_GEOM_CONST_P);
        break;
    }
    case GC_PISTON_MILLER: {
        if ((rc = one_heat_end(in, U_TPEAK | U_Q, &h, err)))
            return rc;
        if (!SET(in->effective_compression_ratio))
            return bad(err, "/effective_compression_ratio",
                       "the miller cycle needs an effective_compression_ratio");
        double re = in->effective_compression_ratio;
        if (!(re < r))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/effective_compression_ratio",
                                "must be less than the geometric compression ratio (%.6g)", r);
        add_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / re, "/effective_compression_ratio");
        s = add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_VOLUME_RATIO, r, "/compression_ratio");
        s = add(c, GC_PROC_CONST_VOLUME, GC_END_PRESSURE, in->intake_pressure,
                "/compression_ratio", "blow-down");
        s->heat_sign = -1;
        add_close(c, GC_GEOM_CONST_P);
        break;
    }
    case GC_PISTON_LENOIR:
        if ((rc = one_heat_end(in, U_TPEAK | U_Q | U_PR, &h, err)))
            return rc;
        s = add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field, "heat addition");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_START_PRESSURE, 0.0, h.field);
        add_close(c, GC_GEOM_CONST_P);
        break;
    case GC_PISTON_STIRLING:
    case GC_PISTON_ERICSSON: {
        int st = in->cycle == GC_PISTON_STIRLING;
        if (!SET(in->peak_temperature))
            return gc_error_set(err, GC_ERR_INVALID, "/peak_temperature",
                                "the %s cycle needs a peak_temperature", gc_piston_name(in->cycle));
        if (!st && !SET(in->pressure_ratio))
            return bad(err, "/pressure_ratio", "the ericsson cycle needs a pressure_ratio");
        double eps = SET(in->regenerator_effectiveness) ? in->regenerator_effectiveness : 1.0;
        gc_geometry geom = st ? GC_GEOM_CONST_V : GC_GEOM_CONST_P;
        s = st ? add(c, GC_PROC_ISOTHERMAL, GC_END_VOLUME_RATIO, 1.0 / r, "/compression_ratio",
                     "isothermal compression")
               : add(c, GC_PROC_ISOTHERMAL, GC_END_PRESSURE_RATIO, in->pressure_ratio,
                     "/pressure_ratio", "isothermal compression");
        s->heat_sign = -1;
        add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, "/regenerator_effectiveness",
            "regenerator (cold side)");
        s = add(c, st ? GC_PROC_CONST_VOLUME : GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE,
                in->peak_temperature, "/peak_temperature", "heat addition");
        s->heat_sign = 1;
        s = add(c, GC_PROC_ISOTHERMAL, st ? GC_END_START_VOLUME : GC_END_START_PRESSURE, 0.0,
                st ? "/compression_ratio" : "/pressure_ratio", "isothermal expansion");
        s->heat_sign = 1;
        add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0, "/regenerator_effectiveness",
            "regenerator (hot side)");
        add_close(c, geom);
        rc = gc_cycle_link_exchanger(c, 1, 4, eps, geom, "/regenerator_effectiveness");
        if (rc != GC_OK)
            return gc_error_set(err, rc, "/regenerator_effectiveness", "regenerator link failed");
        break;
    }
    case GC_PISTON_CARNOT: {
        if (!SET(in->peak_temperature))
            return bad(err, "/peak_temperature", "the carnot cycle needs a peak_temperature");
        if (SET(in->compression_ratio) == SET(in->heat_added))
            return gc_error_set(err, GC_ERR_INVALID,
                                SET(in->heat_added) ? "/heat_added" : "/compression_ratio",
                                "the carnot cycle needs one of compression_ratio, heat_added");
        double TL = in->intake_temperature, TH = in->peak_temperature, y;
        const char *yfield;
        if (SET(in->compression_ratio)) {
            /* isentropic volume ratio between TL and TH: v(TL)/v(TH) = vr(TL)/vr(TH) */
            double rs = gc_gas_vr_T(&in->gas, TL) / gc_gas_vr_T(&in->gas, TH);
            if (!(r > rs * (1.0 + 1e-12)))
                return gc_error_set(err, GC_ERR_INFEASIBLE, "/compression_ratio",
                                    "must exceed %.6g, the isentropic volume ratio between the "
                                    "intake and peak temperatures", rs);
            y = r / rs;
            yfield = "/compression_ratio";
        } else {
            y = exp(in->heat_added / (in->gas.R_J_per_kgK * TH));
            yfield = "/heat_added";
        }
        add_compression(c, in, GC_END_TEMPERATURE, TH, "/peak_temperature");
        s = add(c, GC_PROC_ISOTHERMAL, GC_END_VOLUME_RATIO, y, yfield, "isothermal expansion");
        s->heat_sign = 1;
        add_expansion(c, in, GC_END_START_TEMPERATURE, 0.0, "/intake_temperature");
        s = add(c, GC_PROC_ISOTHERMAL, GC_END_START_VOLUME, 0.0, yfield, "isothermal compression");
        s->heat_sign = -1;
        break;
    }
    default:
        return gc_error_set(err, GC_ERR_UNKNOWN, "/cycle", "unknown piston-engine cycle");
    }
    return GC_OK;
}

int gc_piston_build(const gc_piston_input *in, gc_cycle *c, gc_error *err)
{
    return build(in, 0, c, err);
}

/* 1 when the ideal counterpart needs its own chain: an Atkinson cycle with
 * expansion_ratio and an expansion efficiency below 1, whose actual
 * heat-addition end temperature depends on that efficiency (atkinson_T3). The
 * ideal keeps both volume ratios: its peak temperature is the isentropic one. */
static int own_ideal(const gc_piston_input *in)
{
    return in->cycle == GC_PISTON_ATKINSON && SET(in->expansion_ratio) &&
           eff_or_1(in->expansion_efficiency) < 1.0 && !(in->flags & GC_CYCLE_NO_BOUNDS);
}

/* The ideal counterpart of own_ideal() chains into r->cycle.ideal, with the
 * actual run's dead state (as gc_cycle_evaluate does for its ideal). */
static int evaluate_own_ideal(const gc_piston_input *in, gc_cycle_result *r, gc_error *err)
{
    gc_cycle ci;
    int rc = build(in, 1, &ci, err);
    if (rc != GC_OK)
        return rc;
    gc_cycle_idealize(&ci, &ci);
    ci.flags = in->flags | GC_CYCLE_NO_BOUNDS;
    ci.T_dead_K = r->actual.summary.T_dead_K;
    ci.P_dead_Pa = r->actual.summary.P_dead_Pa;
    rc = gc_cycle_run_chain(&ci, &r->ideal, err);
    if (rc != GC_OK)
        return rc;
    r->has_ideal = 1;
    r->ideal_is_actual = 0;
    return GC_OK;
}

int gc_piston_evaluate(const gc_piston_input *in, gc_piston_result *r, gc_error *err)
{
    gc_cycle c;
    int rc = gc_piston_build(in, &c, err);
    r->has_engine = r->has_power = r->has_fuel = 0;
    r->compression_end_temperature = 0.0;
    r->expansion_ratio = 0.0;
    r->peak_pressure_reached = 0.0;
    r->peak_pressure_short = 0;
    if (rc != GC_OK)
        return rc;
    int own = own_ideal(in);
    if (own)
        c.flags |= GC_CYCLE_NO_BOUNDS;
    rc = gc_cycle_evaluate(&c, &r->cycle, err);
    if (rc == GC_OK && own)
        rc = evaluate_own_ideal(in, &r->cycle, err);
    if (rc == GC_ERR_INFEASIBLE && in->cycle == GC_PISTON_MILLER && err &&
        strcmp(err->field, "/compression_ratio") == 0)
        snprintf(err->message, sizeof err->message,
                 "the expansion over compression_ratio ends below the intake pressure, so "
                 "the gas cannot blow down to it; lower compression_ratio or raise "
                 "effective_compression_ratio or the heat added");
    if (rc != GC_OK)
        return rc;
    const gc_cycle_run *run = &r->cycle.actual;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->kind == GC_PROC_COMPRESSION && r->compression_end_temperature == 0.0)
            r->compression_end_temperature = run->states[p->to].T_K;
        if (p->kind == GC_PROC_EXPANSION)
            r->expansion_ratio = run->states[p->to].v_m3_per_kg / run->states[p->from].v_m3_per_kg;
        if (p->kind == GC_PROC_DUAL && p->part == 0)
            r->peak_pressure_reached = run->states[p->to].P_Pa;
    }
    /* dual with a peak_pressure limit: the heat-addition end may come first (then the
     * constant-pressure part is empty and the limit is not reached) */
    r->peak_pressure_short = in->cycle == GC_PISTON_DUAL && SET(in->peak_pressure) &&
                             r->peak_pressure_reached < in->peak_pressure * (1.0 - 1e-9);
    const gc_cycle_summary *sm = &run->summary;
    if (SET(in->displacement)) {
        double ncyl = SET(in->cylinders) ? in->cylinders : 1.0;
        double span = sm->v_max_m3_per_kg - sm->v_min_m3_per_kg;
        if (!(span > 0.0))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/displacement",
                                "the cycle sweeps no volume");
        r->has_engine = 1;
        r->cylinder_displacement = in->displacement / ncyl;
        r->trapped_mass = r->cylinder_displacement / span;
        r->work_per_cycle = r->trapped_mass * sm->net_work;
        r->imep = r->work_per_cycle / r->cylinder_displacement;
        if (SET(in->speed)) {
            r->has_power = 1;
            r->cycles_per_second = in->speed / (in->strokes / 2.0);
            r->indicated_power = r->work_per_cycle * ncyl * r->cycles_per_second;
        }
        if (SET(in->fuel_heating_value)) {
            if (!(sm->net_work > 0.0))
                return gc_error_set(err, GC_ERR_INFEASIBLE, "/fuel_heating_value",
                                    "the cycle delivers no net work: no specific fuel consumption");
            r->has_fuel = 1;
            r->fuel_per_cycle = r->trapped_mass * sm->heat_in / in->fuel_heating_value;
            r->isfc = r->fuel_per_cycle / r->work_per_cycle;
            r->fuel_mass_flow = r->has_power ? r->fuel_per_cycle * ncyl * r->cycles_per_second : 0.0;
        }
    } else if (SET(in->fuel_heating_value)) {
        if (!(sm->net_work > 0.0))
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/fuel_heating_value",
                                "the cycle delivers no net work: no specific fuel consumption");
        r->has_fuel = 1;
        r->fuel_per_cycle = 0.0;
        r->isfc = sm->heat_in / (in->fuel_heating_value * sm->net_work);
        r->fuel_mass_flow = 0.0;
    }
    return GC_OK;
}
