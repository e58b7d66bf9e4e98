/*
 * machine_curves.c — correction curves of machine.h: base-load net output
 * and heat rate of the new-and-clean machine against one ambient figure
 * (temperature, pressure or relative humidity), the other two held at the
 * machine's reference conditions (ISO 2314: 15 degC, 101.325 kPa, 60 % RH,
 * unless the machine gives its own), each row as a ratio to the reference
 * point and as the correction factor (its inverse) that takes a figure at
 * that condition to the reference. The rows are equally spaced from `from`
 * to `to`; each is a full site solve (machine_op.c) without the engine's
 * ideal counterpart.
 *
 * Units: SI (K, Pa, W); humidity as a fraction 0..1.
 */
#include "core/machine_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static const char *var_name(gc_machine_curve_variable v)
{
    return v == GC_MACHINE_VARY_TEMPERATURE ? "temperature"
           : v == GC_MACHINE_VARY_PRESSURE  ? "pressure"
                                            : "relative humidity";
}

static int check_curve(const gc_machine_curve_input *in, gc_error *err)
{
    if (in->variable < GC_MACHINE_VARY_TEMPERATURE || in->variable > GC_MACHINE_VARY_HUMIDITY)
        return gc_error_set(err, GC_ERR_INVALID, "/curve/variable",
                            "must be temperature, pressure or relative_humidity");
    if (in->points < 2 || in->points > GC_MACHINE_CURVE_MAX_POINTS)
        return gc_error_set(err, GC_ERR_INVALID, "/curve/points", "must be from 2 to %d",
                            GC_MACHINE_CURVE_MAX_POINTS);
    if (!isfinite(in->from))
        return gc_error_set(err, GC_ERR_INVALID, "/curve/from", "must be a number");
    if (!isfinite(in->to) || in->to == in->from)
        return gc_error_set(err, GC_ERR_INVALID, "/curve/to", "must be a number other than from");
    return gc__machine_inlet_check(&in->inlet, err);
}

/* base load of m at site s with inlet treatment in */
static int base_at(const gc_machine *m, const gc_site_input *s, const gc_machine_inlet *inlet,
                   gc__mctx *X, gc_machine_point *p, int *runs, gc_error *err)
{
    gc_machine_condition clean;
    gc_machine_warning w[GC_MACHINE_MAX_WARNINGS];
    int nw = 0, limit = 0;
    gc__mop op;
    memset(&clean, 0, sizeof clean);
    int rc = gc__machine_ctx_init(m, s, inlet, &clean, X, NULL, NULL, w, &nw, err);
    if (rc == GC_OK)
        rc = gc__machine_at_limits(X, 1.0, &op, &limit, err);
    *runs += X->runs;
    if (rc != GC_OK)
        return rc;
    gc__machine_point_fill(X, &op, &op, GC_MACHINE_BASE_LOAD, limit, p);
    return GC_OK;
}

int gc_machine_curves_compute(const gc_machine *m, const gc_machine_curve_input *in,
                              gc_machine_curves *out, gc_error *err)
{
    gc__mctx X;
    gc_site ref;
    memset(out, 0, sizeof *out);
    int rc = check_curve(in, err);
    if (rc != GC_OK)
        return rc;
    out->variable = in->variable;
    rc = gc_site_resolve(&m->spec.reference, &ref, err);
    if (rc == GC_OK)
        rc = base_at(m, &m->spec.reference, &in->inlet, &X, &out->reference, &out->chain_runs,
                     err);
    if (rc != GC_OK)
        return gc__machine_resite(err, "/reference", rc);
    if (!(out->reference.net_power_W > 0.0) || !(out->reference.heat_rate > 0.0))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/reference",
                            "the machine delivers no net output at the reference conditions "
                            "(%.4g W): there is nothing to correct to", out->reference.net_power_W);
    for (int i = 0; i < in->points; i++) {
        double x = in->from + (in->to - in->from) * i / (in->points - 1);
        gc_site_input s;
        gc_site_input_init(&s);
        s.has_temperature = s.has_pressure = s.has_relative_humidity = 1;
        s.T_K = in->variable == GC_MACHINE_VARY_TEMPERATURE ? x : ref.T_K;
        s.P_Pa = in->variable == GC_MACHINE_VARY_PRESSURE ? x : ref.P_Pa;
        s.RH = in->variable == GC_MACHINE_VARY_HUMIDITY ? x : ref.RH;
        gc_machine_curve_row *row = &out->rows[i];
        row->x = x;
        rc = base_at(m, &s, &in->inlet, &X, &row->point, &out->chain_runs, err);
        if (rc != GC_OK) {
            if (err != NULL) {
                char msg[GC_ERROR_MESSAGE_LEN];
                snprintf(msg, sizeof msg, "%s", err->message);
                gc_error_set(err, rc, i == 0 ? "/curve/from" : "/curve/to",
                             "at %s %g: %s", var_name(in->variable), x, msg);
            }
            return rc;
        }
        if (!(row->point.net_power_W > 0.0) || !(row->point.heat_rate > 0.0))
            return gc_error_set(err, GC_ERR_INFEASIBLE, i == 0 ? "/curve/from" : "/curve/to",
                                "at %s %g the machine delivers no net output (%.4g W): no "
                                "correction factor there", var_name(in->variable), x,
                                row->point.net_power_W);
        row->output_ratio = row->point.net_power_W / out->reference.net_power_W;
        row->heat_rate_ratio = row->point.heat_rate / out->reference.heat_rate;
        row->output_correction = 1.0 / row->output_ratio;
        row->heat_rate_correction = 1.0 / row->heat_rate_ratio;
        out->n_rows = i + 1;
    }
    return GC_OK;
}
