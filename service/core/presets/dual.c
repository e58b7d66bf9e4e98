/*
 * dual.c — the dual (limited-pressure) cycle preset (piston.h): compression,
 * constant-volume heat addition to pressure_ratio (exact) or up to
 * peak_pressure (a limit), then constant-pressure heat addition
 * (cutoff_ratio, peak_temperature or heat_added as the total), expansion,
 * constant-volume rejection. Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

#include <stdio.h>

int gc__build_dual(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc__heat_end h;
    (void)ideal;
    int rc = gc__piston_begin(in, c, err);
    if (rc == GC_OK)
        rc = gc__piston_heat_end(in, GC__PF_BIT(GC_PF_CUTOFF_RATIO) |
                                 GC__PF_BIT(GC_PF_PEAK_TEMPERATURE) |
                                 GC__PF_BIT(GC_PF_HEAT_ADDED), &h, err);
    if (rc != GC_OK)
        return rc;
    double r = in->compression_ratio;
    int pr = GC_IS_SET(in->pressure_ratio);
    if (pr == GC_IS_SET(in->peak_pressure))
        return gc_error_id(err, GC_ERR_INVALID, pr ? GC_PF_PEAK_PRESSURE : GC_PF_PRESSURE_RATIO,
                           -1, "the dual cycle needs one of pressure_ratio, peak_pressure");
    if (GC_IS_SET(in->cutoff_ratio) && !(in->cutoff_ratio < r))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_CUTOFF_RATIO, -1,
                           "must be less than the compression ratio (%.6g)", r);
    gc__piston_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, GC_PF_COMPRESSION_RATIO);
    gc_step *s = gc__piston_add(c, GC_PROC_DUAL, h.end, h.value, h.field, "heat addition");
    s->heat_sign = 1;
    s->end2 = pr ? GC_END_PRESSURE_RATIO : GC_END_PEAK_PRESSURE;
    s->end2_value = pr ? in->pressure_ratio : in->peak_pressure;
    snprintf(s->field_aux, sizeof s->field_aux, "%s",
             gc__piston_path(pr ? GC_PF_PRESSURE_RATIO : GC_PF_PEAK_PRESSURE));
    gc__piston_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
    gc__piston_close(c, GC_GEOM_CONST_V);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_DUAL);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the dual (limited-pressure) cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(100.0),
    GC__PF_PR(0, "Pressure ratio of the constant-volume part of heat addition (or "
              "peak_pressure)."),
    GC__POPT(GC_PF_PEAK_PRESSURE, "peak_pressure", GC_Q_PRESSURE, 0.0, 1.0e9, peak_pressure,
             "Pressure limit of the constant-volume heat addition (instead of "
             "pressure_ratio): heating goes on at constant volume up to this pressure, then at "
             "constant pressure. When the heat-addition end (peak_temperature or heat_added) "
             "comes first, the limit is not reached and the warning peak_pressure_not_reached "
             "names both pressures."),
    GC__PF_CUTOFF,
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end volume (the expansion ends "
                "back at the largest volume)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_dual = GC__PISTON_PRESET(
    "dual", "Dual (limited-pressure) cycle",
    "Compression, constant-volume heat addition to pressure_ratio (or up to peak_pressure), "
    "then constant-pressure heat addition (cutoff_ratio, peak_temperature or heat_added as "
    "the total), expansion, constant-volume rejection. The ideal counterpart (bounds.ideal) "
    "keeps pressure_ratio or peak_pressure and the heat-addition end as given.",
    fields, init);
