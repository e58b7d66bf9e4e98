/*
 * carnot.c — the Carnot cycle preset (piston.h): compression to
 * peak_temperature, isothermal expansion, expansion back to the intake
 * temperature, isothermal compression back to the start volume. The
 * isothermal volume ratio comes from compression_ratio (the ideal cycle's
 * v_max / v_min: r over the isentropic volume ratio between the two
 * temperatures, vr(T_L) / vr(T_H)) or from heat_added (exp(q / (R T_H))).
 * Closed frame, per kg of trapped gas; SI units.
 */
#include "core/presets/piston_family.h"

#include <math.h>

int gc__build_carnot(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err)
{
    (void)ideal;
    int rc = gc__piston_begin(in, c, err);
    if (rc != GC_OK)
        return rc;
    if (!GC_IS_SET(in->peak_temperature))
        return gc_error_id(err, GC_ERR_INVALID, GC_PF_PEAK_TEMPERATURE, -1,
                           "the carnot cycle needs a peak_temperature");
    int cr = GC_IS_SET(in->compression_ratio);
    if (cr == GC_IS_SET(in->heat_added))
        return gc_error_id(err, GC_ERR_INVALID, cr ? GC_PF_HEAT_ADDED : GC_PF_COMPRESSION_RATIO,
                           -1, "the carnot cycle needs one of compression_ratio, heat_added");
    double TL = in->intake_temperature, TH = in->peak_temperature, y;
    int yfield = cr ? GC_PF_COMPRESSION_RATIO : GC_PF_HEAT_ADDED;
    if (cr) {
        /* isentropic volume ratio between TL and TH: v(TL)/v(TH) = vr(TL)/vr(TH) */
        double rs = gc_gas_vr_T(&in->gas, TL) / gc_gas_vr_T(&in->gas, TH);
        if (!(in->compression_ratio > rs * (1.0 + 1e-12)))
            return gc_error_id(err, GC_ERR_INFEASIBLE, GC_PF_COMPRESSION_RATIO, -1,
                               "must exceed %.6g, the isentropic volume ratio between the "
                               "intake and peak temperatures", rs);
        y = in->compression_ratio / rs;
    } else {
        y = exp(in->heat_added / (in->gas.R_J_per_kgK * TH));
    }
    gc__piston_compression(c, in, GC_END_TEMPERATURE, TH, GC_PF_PEAK_TEMPERATURE);
    gc__piston_add(c, GC_PROC_ISOTHERMAL, GC_END_VOLUME_RATIO, y, yfield,
                   "isothermal expansion")->heat_sign = 1;
    gc__piston_expansion(c, in, GC_END_START_TEMPERATURE, 0.0, GC_PF_INTAKE_TEMPERATURE);
    gc__piston_add(c, GC_PROC_ISOTHERMAL, GC_END_START_VOLUME, 0.0, yfield,
                   "isothermal compression")->heat_sign = -1;
    return GC_OK;
}

static void init(void *in)
{
    gc_piston_input_init(in, GC_PISTON_CARNOT);
}

static const gc_field fields[GC_PF_COUNT] = {
    GC__PF_REQUEST("Inputs of the Carnot cycle."),
    GC__PF_INTAKE,
    GC__PF_CR(1.0e6),
    GC__PF_TPEAK,
    GC__PF_Q,
    GC__PF_EFFC(GC__EFFC_VOLUME),
    GC__PF_EFFE("Isentropic efficiency of expansion, actual work over the isentropic work, "
                "the isentropic reference taken to the same end volume (the expansion ends at "
                "intake_temperature, at the volume its isentropic reference reaches)."),
    GC__PF_ENGINE,
};

const gc_preset gc_preset_carnot = GC__PISTON_PRESET(
    "carnot", "Carnot cycle",
    "Compression to peak_temperature, isothermal expansion, expansion back to the intake "
    "temperature, isothermal compression. The isothermal volume ratio comes from "
    "compression_ratio (the ideal cycle's v_max/v_min) or from heat_added. The ideal "
    "counterpart (bounds.ideal) keeps the same temperatures and volume ratio.",
    fields, init);
