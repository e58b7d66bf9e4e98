/*
 * lenoir.c — the Lenoir cycle preset (piston.h): constant-volume heat
 * addition from the intake state (no compression; peak_temperature,
 * heat_added or pressure_ratio), expansion to the intake pressure,
 * constant-pressure rejection. Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

int gc__build_lenoir(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    gc__heat_end h;
    (void)ideal;
    int rc = gc__piston_begin(in, c, err);
    if (rc == GC_OK)
        rc = gc__piston_heat_end(in, GC__PF_BIT(GC_PF_PEAK_TEMPERATURE) |
                                 GC__PF_BIT(GC_PF_HEAT_ADDED) |
                                 GC__PF_BIT(GC_PF_PRESSURE_RATIO), &h, err);
    if (rc != GC_OK)
        return rc;
    gc__piston_add(c, GC_PROC_CONST_VOLUME, h.end, h.value, h.field,
                   "heat addition")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_START_PRESSURE, 0.0, h.field);
    gc__piston_close(c, GC_GEOM_CONST_P);
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_LENOIR);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Lenoir cycle."),
    GC__PF_INTAKE,
    GC__PF_PR(0, "Pressure ratio of the constant-volume heat addition."),
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end pressure (the expansion ends "
                "at the intake pressure)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_lenoir = GC__PISTON_PRESET(
    "lenoir", "Lenoir cycle",
    "Constant-volume heat addition from the intake state (no compression), expansion to the "
    "intake pressure, constant-pressure rejection. Give one of peak_temperature, heat_added, "
    "pressure_ratio. The ideal counterpart (bounds.ideal) keeps the heat-addition end as "
    "given.",
    fields, init);
