/*
 * atkinson.c — the Atkinson cycle preset (piston.h): compression,
 * constant-volume heat addition, expansion down to the intake pressure
 * (over-expanded), constant-pressure rejection. Closed frame, per kg of
 * trapped gas; SI units.
 *
 * With expansion_ratio (> compression_ratio) the heat-addition end
 * temperature T3 is the one from which the expansion over exactly
 * expansion_ratio ends at the intake pressure P1. From (T3, v2 = v1 / r) the
 * expansion ends at v4 = re v2, i.e. at T4 = P1 v4 / R = T1 re / r. The
 * expansion's isentropic efficiency eta_e is referred, as the engine does for
 * a pressure end, to the isentrope to the same end pressure: u4 = u3 - eta_e
 * (u3 - u(T4s)), T4s the isentropic end at P1 from (T3, P3 = R T3 / v2).
 * eta_e = 1: T3 lies on the isentrope through (T4, v4) (closed form in vr);
 * eta_e < 1: T3 solves u3 - eta_e (u3 - u(T4s(T3))) = u(T4) by Brent's method
 * (solve.h), the left side rising with T3. The ideal counterpart keeps both
 * volume ratios, so its peak temperature is the isentropic one (higher than
 * the actual's when expansion_efficiency < 1; piston.c evaluates it apart).
 */
#include "core/presets/piston_family.h"
#include "gascycle/solve.h"

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
    if (gc_gas_check_T(a->g, T3, NULL, NULL) != GC_OK ||
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
    if (gc_gas_check_T(g, T4, NULL, err) != GC_OK)
        return gc_error_at(err, GC_ERR_RANGE, GC_PF_EXPANSION_RATIO, -1);
    if (eta == 1.0) {
        int rc = gc_gas_T_isentropic_v(g, T4, 1.0 / re, T3, err);
        return rc == GC_OK ? rc : gc_error_at(err, rc, GC_PF_EXPANSION_RATIO, -1);
    }
    atk_ctx a = { g, g->R_J_per_kgK * in->intake_temperature / in->intake_pressure / r,
                  in->intake_pressure, eta };
    double target = gc_gas_u_T(g, T4), lo = T4, hi = g->T_max_K, ulo, uhi, u;
    int evals;
    if (atk_u4(&a, lo, &ulo) != GC_OK || atk_u4(&a, hi, &uhi) != GC_OK || !(uhi > target))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_EXPANSION_RATIO, -1,
                           "with an expansion efficiency of %.6g no heat-addition end "
                           "temperature up to %.6g K lets the expansion over %.6g end at the "
                           "intake pressure", eta, hi, re);
    int rc = gc_solve_root(atk_u4, &a, target, lo, hi, ulo - target, uhi - target, 1e-11 * T4,
                           200, T3, &u, &evals);
    if (rc != GC_OK)
        return gc_error_id(err, GC_ERR_NOCONV, GC_PF_EXPANSION_RATIO, -1,
                           "the heat-addition end temperature for this expansion ratio was "
                           "not found");
    return GC_OK;
}

int gc__build_atkinson(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc__heat_end h;
    int rc = gc__piston_begin(in, c, err);
    if (rc == GC_OK)
        rc = gc__piston_heat_end(in, GC__PF_BIT(GC_PF_EXPANSION_RATIO) |
                                 GC__PF_BIT(GC_PF_PEAK_TEMPERATURE) |
                                 GC__PF_BIT(GC_PF_HEAT_ADDED), &h, err);
    if (rc != GC_OK)
        return rc;
    double r = in->compression_ratio;
    if (GC_IS_SET(in->expansion_ratio)) {
        if (!(in->expansion_ratio > r))
            return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_EXPANSION_RATIO, -1,
                               "must be greater than the compression ratio (%.6g) for an "
                               "over-expanded cycle", r);
        rc = atkinson_T3(in, ideal ? 1.0 : gc__eff_or_1(in->expansion_efficiency), &h.value,
                         err);
        if (rc != GC_OK)
            return rc;
    }
    gc__piston_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, GC_PF_COMPRESSION_RATIO);
    gc__piston_add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field,
                   "heat addition")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_START_PRESSURE, 0.0, h.field);
    gc__piston_close(c, GC_GEOM_CONST_P);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_ATKINSON);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Atkinson cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(100.0),
    GC__POPT(GC_PF_EXPANSION_RATIO, "expansion_ratio", GC_Q_RATIO, 1.0, 200.0, expansion_ratio,
             "v at exhaust / v after heat addition (over-expansion, greater than the "
             "compression ratio; sets the heat-addition end): the peak temperature is the one "
             "from which the expansion, with expansion_efficiency, ends at the intake pressure "
             "over exactly this volume ratio (echoed in engine.expansion_ratio). The ideal "
             "counterpart keeps both volume ratios, so with expansion_efficiency below 1 its "
             "peak temperature is higher."),
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end pressure (the expansion ends "
                "at the intake pressure)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_atkinson = GC__PISTON_PRESET(
    "atkinson", "Atkinson cycle",
    "Compression, constant-volume heat addition, expansion down to the intake pressure "
    "(over-expanded), constant-pressure rejection. Give one of expansion_ratio, "
    "peak_temperature, heat_added. The ideal counterpart (bounds.ideal) keeps "
    "compression_ratio and expansion_ratio (its own isentropic peak temperature), or the "
    "same peak_temperature or heat_added.",
    fields, init);
