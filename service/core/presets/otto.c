/*
 * otto.c — the Otto cycle preset (piston.h): compression over the
 * compression ratio, constant-volume heat addition to peak_temperature (or
 * by heat_added), expansion back to the largest volume, constant-volume heat
 * rejection. Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

int gc__build_otto(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc__heat_end h;
    (void)ideal;
    int rc = gc__piston_begin(in, c, err);
    if (rc == GC_OK)
        rc = gc__piston_heat_end(in, GC__PF_BIT(GC_PF_PEAK_TEMPERATURE) |
                                 GC__PF_BIT(GC_PF_HEAT_ADDED), &h, err);
    if (rc != GC_OK)
        return rc;
    gc__piston_compression(c, in, GC_END_VOLUME_RATIO, 1.0 / in->compression_ratio,
                           GC_PF_COMPRESSION_RATIO);
    gc__piston_add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field, "heat addition")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_START_VOLUME, 0.0, h.field);
    gc__piston_close(c, GC_GEOM_CONST_V);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_OTTO);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Otto cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(100.0),
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end volume (the expansion ends "
                "back at the largest volume)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_otto = GC__PISTON_PRESET(
    "otto", "Otto cycle",
    "Compression over the compression ratio, constant-volume heat addition to "
    "peak_temperature (or by heat_added), expansion back to the largest volume, "
    "constant-volume heat rejection. Give one of peak_temperature, heat_added. The ideal "
    "counterpart (bounds.ideal) keeps the heat-addition end as given.",
    fields, init);
