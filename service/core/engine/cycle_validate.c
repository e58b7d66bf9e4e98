/*
 * cycle_validate.c — the chain's checks before a run: which ends each
 * process kind takes in each frame, the values of the ends, machines and
 * exchangers, the start state.
 */
#include "core/engine/cycle_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* ---- validation ---------------------------------------------------------- */

static int end_allowed(int kind, int end, int frame)
{
    unsigned m = 1u << end;
#define B(e) (1u << (e))
    switch (kind) {
    case GC_PROC_ISENTROPIC:
    case GC_PROC_COMPRESSION:
    case GC_PROC_EXPANSION: {
        unsigned ok = B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                      B(GC_END_START_PRESSURE) | B(GC_END_TEMPERATURE) |
                      B(GC_END_START_TEMPERATURE) | B(GC_END_START_VOLUME) | B(GC_END_VELOCITY);
        if (kind != GC_PROC_ISENTROPIC && frame == GC_FRAME_FLOW)
            ok &= ~(B(GC_END_VOLUME_RATIO) | B(GC_END_START_VOLUME));
        return (m & ok) != 0;
    }
    case GC_PROC_POLYTROPIC:
        return (m & (B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                     B(GC_END_START_PRESSURE) | B(GC_END_TEMPERATURE) |
                     B(GC_END_START_TEMPERATURE) | B(GC_END_START_VOLUME))) != 0;
    case GC_PROC_CONST_VOLUME:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) | B(GC_END_PEAK_PRESSURE))) != 0;
    case GC_PROC_CONST_PRESSURE:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_VOLUME_RATIO) | B(GC_END_START_VOLUME))) != 0;
    case GC_PROC_ISOTHERMAL:
        return (m & (B(GC_END_VOLUME_RATIO) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE) |
                     B(GC_END_START_PRESSURE) | B(GC_END_START_VOLUME) | B(GC_END_HEAT))) != 0;
    case GC_PROC_DUAL:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE) | B(GC_END_HEAT) |
                     B(GC_END_VOLUME_RATIO))) != 0;
    case GC_PROC_PRESSURE_LOSS:
        return (m & (B(GC_END_DEFAULT) | B(GC_END_PRESSURE_RATIO) | B(GC_END_PRESSURE))) != 0;
    case GC_PROC_HEAT_EXCHANGE:
    case GC_PROC_CLOSE:
    case GC_PROC_FUEL:
        return end == GC_END_DEFAULT || (kind == GC_PROC_FUEL && end == GC_END_TEMPERATURE);
    case GC_PROC_COOLING:
        return (m & (B(GC_END_TEMPERATURE) | B(GC_END_START_TEMPERATURE))) != 0;
    default:
        return 0;
    }
#undef B
}

/* A step's end value against its end kind. */
static int validate_end(const gc_cycle *c, const gc_step *s, const char *f, gc_error *err)
{
    double v = s->end_value;
    switch (s->end) {
    case GC_END_VOLUME_RATIO:
    case GC_END_PRESSURE_RATIO:
    case GC_END_TEMPERATURE:
    case GC_END_PRESSURE:
    case GC_END_PEAK_PRESSURE:
        if (!(v > 0.0) || !isfinite(v))
            return gc_error_set(err, GC_ERR_INVALID, f, "must be a positive number");
        break;
    case GC_END_HEAT:
        if (!isfinite(v) || fabs(v) > 1e9)
            return gc_error_set(err, GC_ERR_INVALID, f,
                                "the heat must be a finite number of J/kg");
        break;
    case GC_END_VELOCITY:
        if (!(v >= 0.0) || v > 1e4)
            return gc_error_set(err, GC_ERR_INVALID, f, "the velocity must be 0 to 10000 m/s");
        break;
    default:
        break;
    }
    if (s->end == GC_END_TEMPERATURE) {
        int rc = gc_gas_check_T(&c->gas, v, f, err);
        if (rc != GC_OK)
            return rc;
    }
    if (!(s->end_value_ideal >= 0.0) || !isfinite(s->end_value_ideal) ||
        (s->end_value_ideal > 0.0 && s->end != GC_END_PRESSURE_RATIO &&
         s->end != GC_END_VOLUME_RATIO && s->end != GC_END_PRESSURE &&
         s->end != GC_END_TEMPERATURE))
        return gc_error_set(err, GC_ERR_INVALID, f,
                            "an ideal end value applies to a ratio, pressure or temperature "
                            "end and must be positive");
    return GC_OK;
}

/* Efficiencies and heat-exchanger links of step i. */
static int validate_machines(const gc_cycle *c, int i, const char *fa, gc_error *err)
{
    const gc_step *s = &c->steps[i];
    if (s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION || s->kind == GC_PROC_FUEL) {
        if (!(s->efficiency >= 0.0 && s->efficiency <= 1.0) || (s->efficiency > 0.0 && s->efficiency < 0.05))
            return gc_error_set(err, GC_ERR_INVALID, fa,
                                "an efficiency must be between 0.05 and 1");
    }
    if (s->kind != GC_PROC_HEAT_EXCHANGE)
        return GC_OK;
    if (!(s->efficiency >= 0.0 && s->efficiency <= 1.0))
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "a heat-exchanger effectiveness must be between 0 and 1");
    int j = s->partner;
    if (j < 0 || j >= c->n_steps || j == i || c->steps[j].kind != GC_PROC_HEAT_EXCHANGE ||
        c->steps[j].partner != i || c->steps[j].geometry != s->geometry)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "a heat exchange needs a partner step that links back with "
                            "the same geometry");
    if (s->geometry == GC_GEOM_CONST_V && c->frame == GC_FRAME_FLOW)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "constant-volume heat exchange applies to the closed frame");
    return GC_OK;
}

/* Closing geometry, pressure losses, kinetic steps and source temperatures. */
static int validate_rest(const gc_cycle *c, const gc_step *s, const char *f, const char *fa,
                         gc_error *err)
{
    if (s->kind == GC_PROC_CLOSE && s->geometry != GC_GEOM_CONST_P && s->geometry != GC_GEOM_CONST_V)
        return gc_error_set(err, GC_ERR_INVALID, f, "unknown closing geometry");
    /* a throttle to an end PRESSURE (e.g. a free jet to ambient) has no
     * fractional bound: its end is checked against the inlet when run */
    double loss = (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE_RATIO)
                      ? 1.0 - s->end_value
                      : (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE)
                            ? 0.0 : s->pressure_loss;
    if (!(loss >= 0.0 && loss < 0.9))
        return gc_error_set(err, GC_ERR_INVALID, s->kind == GC_PROC_PRESSURE_LOSS ? f : fa,
                            "a fractional pressure loss must be between 0 and 0.9");
    if (loss > 0.0 && c->frame == GC_FRAME_CLOSED && s->kind != GC_PROC_PRESSURE_LOSS)
        return gc_error_set(err, GC_ERR_INVALID, fa,
                            "pressure losses of heat exchangers apply to the flow frame");
    if (s->kinetic && (c->frame != GC_FRAME_FLOW ||
                       (s->kind != GC_PROC_ISENTROPIC && s->kind != GC_PROC_COMPRESSION &&
                        s->kind != GC_PROC_EXPANSION)))
        return gc_error_set(err, GC_ERR_INVALID, f,
                            "kinetic (nozzle or diffuser) steps are adiabatic steps of the "
                            "flow frame");
    if (!(s->T_source_K >= 0.0) || !isfinite(s->T_source_K))
        return gc_error_set(err, GC_ERR_INVALID, fa, "a source temperature must be >= 0 K");
    return GC_OK;
}

/* The chain's frame, start and dead states. */
static int validate_start(const gc_cycle *c, gc_error *err)
{
    if (c->frame != GC_FRAME_CLOSED && c->frame != GC_FRAME_FLOW)
        return gc_error_set(err, GC_ERR_INVALID, "/frame", "must be closed or flow");
    if (c->n_steps < 1 || c->n_steps > GC_CYCLE_MAX_STEPS)
        return gc_error_set(err, GC_ERR_INVALID, "/steps",
                            "a cycle needs 1 to %d steps", GC_CYCLE_MAX_STEPS);
    int rc = gc_gas_check_T(&c->gas, c->T_start_K, "/intake_temperature", err);
    if (rc != GC_OK)
        return rc;
    rc = gc_gas_check_P(c->P_start_Pa, "/intake_pressure", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(c->V_start_m_per_s) || fabs(c->V_start_m_per_s) > 1e4 ||
        (c->frame == GC_FRAME_CLOSED && c->V_start_m_per_s != 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/velocity",
                            "the start velocity must be finite (and 0 in the closed frame)");
    if (!(c->T_dead_K >= 0.0) || !isfinite(c->T_dead_K) || !(c->P_dead_Pa >= 0.0) ||
        !isfinite(c->P_dead_Pa))
        return gc_error_set(err, GC_ERR_INVALID, "/site",
                            "the dead-state temperature and pressure must be >= 0");
    return GC_OK;
}

int gc__cycle_validate(ctx *x)
{
    const gc_cycle *c = x->c;
    gc_error *err = x->err;
    int rc = validate_start(c, err);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        const char *f = gc__cycle_step_field(x, i);
        if ((int)s->kind < 0 || s->kind >= GC_PROC_KIND_COUNT)
            return gc_error_set(err, GC_ERR_UNKNOWN, f, "unknown process kind");
        if ((int)s->end < 0 || s->end >= GC_END_KIND_COUNT || !end_allowed(s->kind, s->end, c->frame))
            return gc_error_set(err, GC_ERR_INVALID, f, "%s cannot end on %s%s",
                                gc_cycle_kind_name(s->kind), gc_cycle_end_name(s->end),
                                c->frame == GC_FRAME_FLOW ? " in the flow frame" : "");
        const char *fa = gc__cycle_aux_field(x, i);
        rc = validate_end(c, s, f, err);
        if (rc == GC_OK)
            rc = validate_machines(c, i, fa, err);
        if (rc == GC_OK)
            rc = validate_rest(c, s, f, fa, err);
        if (rc != GC_OK)
            return rc;
    }
    return GC_OK;
}

int gc_cycle_validate(const gc_cycle *c, gc_error *err)
{
    ctx x;
    x.c = c;
    x.err = err;
    return gc__cycle_validate(&x);
}

