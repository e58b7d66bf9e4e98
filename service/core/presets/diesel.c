/*
 * diesel.c — the Diesel cycle preset (piston.h): compression,
 * constant-pressure heat addition (cutoff_ratio, peak_temperature or
 * heat_added), expansion to the largest volume, constant-volume rejection.
 * Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

int gc__build_diesel(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
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
    if (GC_IS_SET(in->cutoff_ratio) && !(in->cutoff_ratio < r))
        return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_CUTOFF_RATIO, -1,
                           "must be less than the compression ratio (%.6g): heat addition "
                           "would end beyond the largest cylinder volume", r);
    gc__piston_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / r, GC_PF_COMPRESSION_RATIO);
    gc__piston_add(c, GC_PROC_CONST_PRESSURE, h.end, h.value, h.field,
                   "heat addition")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
    gc__piston_close(c, GC_GEOM_CONST_V);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_DIESEL);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Diesel cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(100.0),
    GC__PF_CUTOFF,
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end volume (the expansion ends "
                "back at the largest volume)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_diesel = GC__PISTON_PRESET(
    "diesel", "Diesel cycle",
    "Compression, constant-pressure heat addition (cutoff_ratio, peak_temperature or "
    "heat_added: one of them), expansion to the largest volume, constant-volume rejection. "
    "The ideal counterpart (bounds.ideal) keeps the heat-addition end as given: with "
    "cutoff_ratio the same cutoff ratio (so its heat input differs from the actual's when "
    "compression_efficiency is below 1), with peak_temperature the same peak temperature, "
    "with heat_added the same heat.",
    fields, init);
