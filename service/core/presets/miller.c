/*
 * miller.c — the Miller cycle preset (piston.h): compression over the
 * effective compression ratio (intake valve closing early or late),
 * constant-volume heat addition, expansion over the geometric compression
 * ratio, constant-volume blow-down to the intake pressure, constant-pressure
 * rejection. Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

int gc__build_miller(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc__heat_end h;
    (void)ideal;
    int rc = gc__piston_begin(in, c, err);
    if (rc == GC_OK)
        rc = gc__piston_heat_end(in, GC__PF_BIT(GC_PF_PEAK_TEMPERATURE) |
                                 GC__PF_BIT(GC_PF_HEAT_ADDED), &h, err);
    if (rc != GC_OK)
        return rc;
    if (!GC_IS_SET(in->effective_compression_ratio))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_EFFECTIVE_COMPRESSION_RATIO, -1,
                           "the miller cycle needs an effective_compression_ratio");
    double r = in->compression_ratio, re = in->effective_compression_ratio;
    if (!(re < r))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_EFFECTIVE_COMPRESSION_RATIO, -1,
                           "must be less than the geometric compression ratio (%.6g)", r);
    gc__piston_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / re,
                           GC_PF_EFFECTIVE_COMPRESSION_RATIO);
    gc__piston_add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field,
                   "heat addition")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_VOLUME_RATIO, r, GC_PF_COMPRESSION_RATIO);
    gc__piston_add(c, GC_PROC_CONST_VOLUME, GC_END_PRESSURE, in->intake_pressure,
                   GC_PF_COMPRESSION_RATIO, "blow-down")->heat_sign = -1;
    gc__piston_close(c, GC_GEOM_CONST_P);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_MILLER);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Miller cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(100.0),
    GC__POPT(GC_PF_EFFECTIVE_COMPRESSION_RATIO, "effective_compression_ratio", GC_Q_RATIO, 1.0,
             100.0, effective_compression_ratio,
             "Effective compression ratio from intake valve closing (less than the geometric "
             "compression_ratio)."),
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end volume (the expansion ends at "
                "the geometric compression ratio)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_miller = GC__PISTON_PRESET(
    "miller", "Miller cycle",
    "Compression over the effective compression ratio (early or late intake valve closing), "
    "constant-volume heat addition, expansion over the geometric compression ratio, "
    "constant-volume blow-down to the intake pressure, constant-pressure rejection. The "
    "ideal counterpart (bounds.ideal) keeps both compression ratios and the heat-addition "
    "end as given.",
    fields, init);
