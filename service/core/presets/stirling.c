/*
 * stirling.c — the Stirling and Ericsson cycle presets (piston.h):
 * isothermal compression at the intake temperature (over the compression
 * ratio; Ericsson: over pressure_ratio), regenerator (cold side) and heating
 * to peak_temperature at constant volume (Ericsson: constant pressure),
 * isothermal expansion back to the start volume (pressure), regenerator (hot
 * side), cooling back to the start. With ideal regeneration (effectiveness 1,
 * the default) the efficiency equals Carnot's; 0 is no regenerator. Closed
 * frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

static int build(const gc_piston_input *in, gc_cycle *c, gc_error *err)
{
    int st = in->cycle == GC_PISTON_STIRLING;
    int rc = gc__piston_begin(in, c, err);
    if (rc != GC_OK)
        return rc;
    if (!GC_IS_SET(in->peak_temperature))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_PEAK_TEMPERATURE, -1,
                           "the %s cycle needs a peak_temperature", gc_piston_name(in->cycle));
    if (!st && !GC_IS_SET(in->pressure_ratio))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_PRESSURE_RATIO, -1,
                           "the ericsson cycle needs a pressure_ratio");
    double eps = GC_IS_SET(in->regenerator_effectiveness) ? in->regenerator_effectiveness : 1.0;
    gc_geometry geom = st ? GC_GEOM_CONST_V : GC_GEOM_CONST_P;
    int ratio = st ? GC_PF_COMPRESSION_RATIO : GC_PF_PRESSURE_RATIO;
    gc__piston_add(c, GC_PROC_ISOTHERMAL, st ? GC_END_VOLUME_RATIO : GC_END_PRESSURE_RATIO,
                   st ? 1.0 / in->compression_ratio : in->pressure_ratio, ratio,
                   "isothermal compression")->heat_sign = -1;
    gc__piston_add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0,
                   GC_PF_REGENERATOR_EFFECTIVENESS, "regenerator (cold side)");
    gc__piston_add(c, st ? GC_PROC_CONST_VOLUME : GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE,
                   in->peak_temperature, GC_PF_PEAK_TEMPERATURE, "heat addition")->heat_sign = 1;
    gc__piston_add(c, GC_PROC_ISOTHERMAL, st ? GC_END_START_VOLUME : GC_END_START_PRESSURE, 0.0,
                   ratio, "isothermal expansion")->heat_sign = 1;
    gc__piston_add(c, GC_PROC_HEAT_EXCHANGE, GC_END_DEFAULT, 0.0,
                   GC_PF_REGENERATOR_EFFECTIVENESS, "regenerator (hot side)");
    gc__piston_close(c, geom);
    rc = gc_cycle_link_exchanger(c, 1, 4, eps, geom,
                                 gc__piston_path(GC_PF_REGENERATOR_EFFECTIVENESS));
    if (rc != GC_OK)
        return gc_error_id(err, rc, GC_PF_REGENERATOR_EFFECTIVENESS, -1,
                           "regenerator link failed");
    return GC_OK;
}

int gc__build_stirling(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    (void)ideal;
    return build(in, c, err);
}

int gc__build_ericsson(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    (void)ideal;
    return build(in, c, err);
}

static void init_stirling(void *in)
{
    gc_piston_input_init(in, GC_PISTON_STIRLING);
}

static void init_ericsson(void *in)
{
    gc_piston_input_init(in, GC_PISTON_ERICSSON);
}

static const gc_field stirling_fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Stirling cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(1.0e6),
    GC__PF_TPEAK,
    GC__PF_REGEN,
    GC__PF_ENGINE,
};

static const gc_field ericsson_fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Ericsson cycle."),
    GC__PF_INTAKE,
    GC__PF_PR(0, "Pressure ratio of the isothermal compression (P_max / P_min)."),
    GC__PF_TPEAK,
    GC__PF_REGEN,
    GC__PF_ENGINE,
};

const gc_preset gc_preset_stirling = GC__PISTON_PRESET(
    "stirling", "Stirling cycle",
    "Isothermal compression at the intake temperature, regenerator and constant-volume "
    "heating to peak_temperature, isothermal expansion, regenerator and constant-volume "
    "cooling. With ideal regeneration its efficiency equals Carnot's.",
    stirling_fields, init_stirling);

const gc_preset gc_preset_ericsson = GC__PISTON_PRESET(
    "ericsson", "Ericsson cycle",
    "As the Stirling cycle with constant-pressure regeneration and heating: isothermal "
    "compression over pressure_ratio, regenerator and heating to peak_temperature at "
    "constant pressure, isothermal expansion, regenerator and constant-pressure cooling.",
    ericsson_fields, init_ericsson);
