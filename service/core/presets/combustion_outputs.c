/*
 * combustion_outputs.c — what the combustion-analysis document shows
 * (combustion_analysis.h): the result filled from heatrel.h's (angles to rad
 * from firing TDC, statistics of angles without COV or LNV, which mean
 * nothing for an angle measured from TDC) and the output table: engine,
 * recording, pegging, phasing, heat release, the ensemble-average cycle,
 * statistics over cycles, the ideal Otto cycle (bounds, shortfall), the
 * per-cycle table (format=csv's first table) and, with include=trace, the
 * ensemble-average trace (the second).
 *
 * Units: quantities convert with the output system (pressure kPa or psia,
 * angles in degrees, heat in kJ or Btu); rates carry their own labels:
 * pressure-rise rate kPa/deg (psi/deg), heat-release rate J/deg (Btu/deg),
 * ringing intensity MW/m2 (Btu/(h ft2)).
 */
#include "core/presets/combustion_analysis.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

/* ---- filling the result ----------------------------------------------------------------- */

static void stat_of(const gc_heatrel_stat *s, double scale, gc_comb_stat *o)
{
    o->n = s->n;
    o->mean = s->mean * scale;
    o->std = s->std * scale;
    o->min = s->min * scale;
    o->max = s->max * scale;
    o->cov = s->cov;
    o->lnv = s->lnv;
    o->lowest_cycle = s->i_min + 1;
    o->highest_cycle = s->i_max + 1;
}

static void row_of(const gc_heatrel_cycle *c, int n_extra, gc_comb_row *r)
{
    r->peg_offset = c->peg_offset_Pa;
    r->imep_net = c->imep_net_Pa;
    r->imep_gross = c->imep_gross_Pa;
    r->pmep = c->pmep_Pa;
    r->work_net = c->work_net_J;
    r->work_gross = c->work_gross_J;
    r->work_pumping = c->work_pumping_J;
    r->P_max = c->P_max_Pa;
    r->angle_P_max = c->angle_P_max_deg * DEG;
    r->dP_max_per_deg = c->dP_max_Pa_per_deg;
    r->angle_dP_max = c->angle_dP_max_deg * DEG;
    r->n_compression = c->n_compression;
    r->n_expansion = c->n_expansion;
    r->T_max = c->T_max_K;
    r->angle_T_max = c->angle_T_max_deg * DEG;
    r->trapped_mass = c->trapped_mass_kg;
    r->Q_net = c->Q_net_J;
    r->Q_gross = c->Q_gross_J;
    r->Q_wall = c->Q_wall_J;
    r->Q_total = c->Q_total_J;
    r->misfire = (c->flags & GC_HEATREL_FLAG_MISFIRE) != 0;
    r->burned = !(c->flags & GC_HEATREL_FLAG_NO_BURN) && !r->misfire;
    r->soc = c->soc_deg * DEG;
    r->eoc = c->eoc_deg * DEG;
    r->ca10 = c->point_deg[0] * DEG;
    r->ca50 = c->point_deg[1] * DEG;
    r->ca90 = c->point_deg[2] * DEG;
    r->burn_0_10 = c->burn_0_10_deg * DEG;
    r->burn_10_90 = c->burn_10_90_deg * DEG;
    for (int k = 0; k < n_extra && k < GC_HEATREL_MAX_EXTRA_POINTS; k++) {
        r->extra[k] = c->point_deg[3 + k] * DEG;
        r->has_extra[k] = r->burned;
    }
    r->has_ringing = c->has_ringing;
    r->ringing = c->ringing_W_per_m2;
    r->has_efficiency = c->has_efficiency;
    r->combustion_efficiency = c->combustion_efficiency;
    r->partial_burn = (c->flags & GC_HEATREL_FLAG_PARTIAL) != 0 && !r->misfire;
}

static void trace_of(const gc_heatrel_curves *cv, gc_comb_result *x)
{
    x->n_trace = cv->n < GC_HEATREL_MAX_SAMPLES ? cv->n : GC_HEATREL_MAX_SAMPLES;
    for (int i = 0; i < x->n_trace; i++) {
        gc_comb_sample *s = &x->trace[i];
        int j = i - cv->i_ivc;
        memset(s, 0, sizeof *s);
        s->angle = cv->angle_deg[i] * DEG;
        s->P = cv->P_Pa[i];
        s->V = cv->V_m3[i];
        s->closed = j >= 0 && j < cv->n_closed;
        if (!s->closed)
            continue;
        s->T = cv->T_K[j];
        s->dQn_per_deg = cv->dQn_J_per_deg[j];
        s->Qn = cv->Qn_J[j];
        s->dQg_per_deg = cv->dQg_J_per_deg[j];
        s->Qg = cv->Qg_J[j];
        s->mfb = cv->mfb[j];
    }
}

static void stats_of(const gc_heatrel_result *hr, gc_comb_result *x)
{
    stat_of(&hr->imep_net, 1.0, &x->imep_net);
    stat_of(&hr->imep_gross, 1.0, &x->imep_gross);
    stat_of(&hr->pmep, 1.0, &x->pmep);
    stat_of(&hr->P_max, 1.0, &x->P_max);
    stat_of(&hr->angle_P_max, DEG, &x->angle_P_max);
    stat_of(&hr->dP_max, 1.0, &x->dP_max);
    stat_of(&hr->n_compression, 1.0, &x->n_compression);
    stat_of(&hr->n_expansion, 1.0, &x->n_expansion);
    stat_of(&hr->Q_total, 1.0, &x->Q_total);
    stat_of(&hr->point[0], DEG, &x->ca10);
    stat_of(&hr->point[1], DEG, &x->ca50);
    stat_of(&hr->point[2], DEG, &x->ca90);
    stat_of(&hr->burn_0_10, DEG, &x->burn_0_10);
    stat_of(&hr->burn_10_90, DEG, &x->burn_10_90);
    stat_of(&hr->ringing, 1.0, &x->ringing);
    stat_of(&hr->combustion_efficiency, 1.0, &x->efficiency);
    for (int k = 0; k + 3 < hr->n_points; k++)
        stat_of(&hr->point[3 + k], DEG, &x->extra[k]);
    stat_of(&hr->peg_offset, 1.0, &x->peg_offset);
    x->has_ringing = hr->ringing.n > 0;
    x->has_efficiency = hr->combustion_efficiency.n > 0;
    x->n_burning = hr->point[1].n;
    x->n_misfire = hr->n_misfire;
    x->n_partial = hr->n_partial;
    x->median_heat_release = hr->Q_total_median_J;
    snprintf(x->flag_rule, sizeof x->flag_rule, "misfire: total heat release below %.0f %% of "
             "the median over all cycles (or none at all); partial burn: below %.0f %%",
             100.0 * GC_HEATREL_MISFIRE_FRACTION, 100.0 * GC_HEATREL_PARTIAL_FRACTION);
}

static void heading(const gc_comb_request *q, const gc_heatrel_result *hr, gc_comb_result *x)
{
    x->bore = q->bore;
    x->stroke = q->stroke;
    x->rod = q->rod;
    x->compression_ratio = q->compression_ratio;
    x->displacement = hr->displacement_m3;
    x->clearance = hr->clearance_m3;
    x->strokes = q->strokes;
    x->n_cycles = hr->n_cycles;
    x->n_samples = hr->n_samples;
    x->period = hr->period_deg * DEG;
    x->angle_step = x->period / hr->n_samples;
    x->tdc_angle = hr->tdc_angle_deg * DEG;
    x->source = q->from_csv ? "text/csv" : "json";
    x->peg_method = hr->peg_method;
    x->phasing_method = hr->phasing_method;
    x->has_phasing = hr->has_phasing;
    x->phasing_corrected = hr->phasing_corrected;
    x->phasing_shift = hr->phasing_shift_deg * DEG;
    x->has_phasing_fit = hr->has_phasing && hr->phasing_method == GC_HEATREL_PHASING_POLYTROPIC;
    x->has_motored_peak = hr->has_phasing && hr->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE;
    x->phasing_exponent = hr->phasing_exponent;
    x->phasing_rms = hr->phasing_rms;
    x->motored_peak_angle = hr->angle_P_max_motored_deg * DEG;
    x->phasing_warn = GC_HEATREL_PHASING_WARN_DEG * DEG;
    x->basis = hr->mfb_basis_gross ? "gross" : "net";
    x->wall_model = q->wall_model;
    x->has_burned_gas = q->has_equivalence_ratio;
    x->k_model = q->has_equivalence_ratio
        ? "k = cp/cv at the mean gas temperature of the charge turning into the fuel's "
          "combustion products by mass fraction burned"
        : "k = cp/cv of the charge at the mean gas temperature";
    x->trapped_mass = hr->trapped_mass_kg;
    x->n_points = hr->n_points;
    for (int k = 0; k < hr->n_points && k < GC_HEATREL_MAX_POINTS; k++) {
        x->point_fraction[k] = hr->point_fraction[k];
        x->has_point[k] = 1;
    }
}

void gc__comb_fill(const gc_comb_request *q, const gc_heatrel_result *hr, gc_comb_result *x);

void gc__comb_fill(const gc_comb_request *q, const gc_heatrel_result *hr, gc_comb_result *x)
{
    memset(x, 0, offsetof(gc_comb_result, rows));
    heading(q, hr, x);
    stats_of(hr, x);
    int n_extra = hr->n_points - 3;
    row_of(&hr->ensemble, n_extra, &x->ensemble);
    for (int c = 0; c < hr->n_cycles; c++) {
        gc_comb_row *r = &x->rows[c];
        memset(r, 0, sizeof *r);
        row_of(&hr->cycles[c], n_extra, r);
        r->cycle = c + 1;
        memcpy(r->label, q->label[c], sizeof r->label);
        r->label[sizeof r->label - 1] = '\0';
        r->has_label = q->from_csv && r->label[0] != '\0';
    }
    trace_of(&hr->curves, x);
}

/* ---- the output table ------------------------------------------------------------------- */

#define R_(m) offsetof(gc_comb_result, m)
#define P_(m) (offsetof(gc_comb_result, m) + 1)
#define ROW(m) offsetof(gc_comb_row, m)
#define SMP(m) offsetof(gc_comb_sample, m)
#define Q(nm, par, q, off, pres, desc)                                                       \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = off, .present = (pres), .description = desc }
#define N(nm, par, off, pres, desc)                                                          \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = off, .present = (pres),     \
      .description = desc }
#define U(nm, par, off, pres, si, us, fsi, fus, desc)                                        \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .unit_si = si, .unit_us = us,         \
      .si_factor = fsi, .us_factor = fus, .offset = off, .present = (pres),                  \
      .description = desc }
#define I(nm, par, off, desc)                                                                \
    { .name = nm, .parent = par, .type = GC_OT_INTEGER, .offset = off, .description = desc }
#define B(nm, par, off, desc)                                                                \
    { .name = nm, .parent = par, .type = GC_OT_BOOL, .offset = off, .description = desc }
#define T(nm, par, off, desc)                                                                \
    { .name = nm, .parent = par, .type = GC_OT_TEXT, .offset = off, .description = desc }
#define OBJ(nm, par, pres, desc)                                                             \
    { .name = nm, .parent = par, .type = GC_OT_OBJECT, .present = (pres), .description = desc }

#define PSI_PER_PA (1.0 / 6894.757293168)   /* NIST SP 811 B.8: psi = 6.894757E+03 Pa */
#define BTU_PER_J (1.0 / 1055.05585262)     /* NIST SP 811 B.8: Btu (IT) = 1.055056E+03 J */
#define BTU_H_FT2_PER_W_M2 (1.0 / 3.154591) /* NIST SP 811 B.8: Btu (IT)/(h ft2) = 3.154591 W/m2 */

/* The figures of one cycle (b: the row's offset in the result, 0 in a list
 * item; the ensemble's at R_(ensemble)). */
#define FIGURES(par, b)                                                                      \
    Q("imep_net", par, GC_Q_PRESSURE_DIFFERENCE, (b) + ROW(imep_net), 0,                     \
      "Net indicated mean effective pressure (whole cycle)."),                               \
    Q("imep_gross", par, GC_Q_PRESSURE_DIFFERENCE, (b) + ROW(imep_gross), 0,                 \
      "Gross IMEP (compression and expansion strokes)."),                                    \
    Q("pmep", par, GC_Q_PRESSURE_DIFFERENCE, (b) + ROW(pmep), 0,                             \
      "Pumping mean effective pressure (exhaust and intake strokes; 0 two-stroke)."),        \
    Q("peak_pressure", par, GC_Q_PRESSURE, (b) + ROW(P_max), 0, "Highest pressure sample."), \
    Q("peak_pressure_angle", par, GC_Q_ANGLE, (b) + ROW(angle_P_max), 0,                     \
      "Its crank angle from firing TDC."),                                                   \
    U("max_pressure_rise_rate", par, (b) + ROW(dP_max_per_deg), 0, "kPa/deg", "psi/deg",     \
      1e-3, PSI_PER_PA, "Highest dp/dtheta in the closed part (central differences)."),      \
    Q("max_pressure_rise_rate_angle", par, GC_Q_ANGLE, (b) + ROW(angle_dP_max), 0,            \
      "Its crank angle."),                                                                   \
    Q("max_mean_temperature", par, GC_Q_TEMPERATURE, (b) + ROW(T_max), 0,                     \
      "Highest mean gas temperature p V / (m R) in the closed part."),                       \
    Q("heat_release_net", par, GC_Q_ENERGY, (b) + ROW(Q_net), 0,                              \
      "Apparent (net) heat release from IVC to EVO."),                                       \
    Q("heat_release_gross", par, GC_Q_ENERGY, (b) + ROW(Q_gross), 0,                          \
      "Gross heat release from IVC to EVO (net plus wall heat; equals net without a wall "   \
      "model)."),                                                                            \
    Q("wall_heat", par, GC_Q_ENERGY, (b) + ROW(Q_wall), 0,                                    \
      "Heat to the walls from IVC to EVO by the wall model."),                               \
    Q("total_heat_release", par, GC_Q_ENERGY, (b) + ROW(Q_total), 0,                          \
      "Heat released from the start to the end of combustion (the burn points' basis)."),    \
    Q("start_of_combustion", par, GC_Q_ANGLE, (b) + ROW(soc), (b) + ROW(burned) + 1,          \
      "Start of combustion: the lowest cumulative heat release before its highest."),        \
    Q("ca10", par, GC_Q_ANGLE, (b) + ROW(ca10), (b) + ROW(burned) + 1,                        \
      "Crank angle of 10 % mass fraction burned."),                                          \
    Q("ca50", par, GC_Q_ANGLE, (b) + ROW(ca50), (b) + ROW(burned) + 1,                        \
      "Crank angle of 50 % mass fraction burned (combustion phasing)."),                     \
    Q("ca90", par, GC_Q_ANGLE, (b) + ROW(ca90), (b) + ROW(burned) + 1,                        \
      "Crank angle of 90 % mass fraction burned."),                                          \
    Q("end_of_combustion", par, GC_Q_ANGLE, (b) + ROW(eoc), (b) + ROW(burned) + 1,            \
      "End of combustion: the highest cumulative heat release."),                            \
    Q("burn_0_10", par, GC_Q_ANGLE, (b) + ROW(burn_0_10), (b) + ROW(burned) + 1,              \
      "Burn duration from the start of combustion to CA10 (flame development)."),            \
    Q("burn_10_90", par, GC_Q_ANGLE, (b) + ROW(burn_10_90), (b) + ROW(burned) + 1,            \
      "Burn duration from CA10 to CA90."),                                                   \
    EXTRA(par, b, 0, "mfb_extra_1"), EXTRA(par, b, 1, "mfb_extra_2"),                        \
    EXTRA(par, b, 2, "mfb_extra_3"), EXTRA(par, b, 3, "mfb_extra_4"),                        \
    EXTRA(par, b, 4, "mfb_extra_5"), EXTRA(par, b, 5, "mfb_extra_6"),                        \
    EXTRA(par, b, 6, "mfb_extra_7"), EXTRA(par, b, 7, "mfb_extra_8"),                        \
    N("n_compression", par, (b) + ROW(n_compression), 0,                                     \
      "Polytropic exponent fitted over compression_window."),                                \
    N("n_expansion", par, (b) + ROW(n_expansion), 0,                                         \
      "Polytropic exponent fitted over expansion_window."),                                  \
    U("ringing_intensity", par, (b) + ROW(ringing), (b) + ROW(has_ringing) + 1, "MW/m2",      \
      "Btu/(h ft2)", 1e-6, BTU_H_FT2_PER_W_M2,                                               \
      "Ringing intensity (Eng 2002, SAE 2002-01-2859): (beta (dp/dt)max)^2 / (2 k pmax) "     \
      "sqrt(k R Tmax), beta 0.05 ms (needs the speed)."),                                    \
    N("combustion_efficiency", par, (b) + ROW(combustion_efficiency),                        \
      (b) + ROW(has_efficiency) + 1, "Total heat release over fuel_per_cycle x LHV (an "      \
      "estimate: the single-zone model ignores crevices, blow-by and dissociation).")

#define EXTRA(par, b, k, nm)                                                                 \
    Q(nm, par, GC_Q_ANGLE, (b) + ROW(extra) + (k) * sizeof(double),                          \
      (b) + ROW(has_extra) + (k) * sizeof(int) + 1,                                          \
      "Crank angle of the mass fraction burned burn_fractions[" #k "] (heat_release."        \
      "burn_fractions[" #k " + 3])")
#define N_FIGURES 31

/* Statistics: mean, std, min, max (and cov, lnv where they mean something). */
#define ST_Q(nm, par, q, m, what, pres)                                                      \
    Q(nm "_mean", par, q, R_(m.mean), pres, "Mean of " what "."),                            \
    Q(nm "_std", par, q, R_(m.std), pres, "Sample standard deviation (n - 1) of " what "."), \
    Q(nm "_min", par, q, R_(m.min), pres, "Lowest " what "."),                               \
    Q(nm "_max", par, q, R_(m.max), pres, "Highest " what ".")
#define ST_U(nm, par, si, us, fsi, fus, m, what, pres)                                       \
    U(nm "_mean", par, R_(m.mean), pres, si, us, fsi, fus, "Mean of " what "."),             \
    U(nm "_std", par, R_(m.std), pres, si, us, fsi, fus,                                     \
      "Sample standard deviation (n - 1) of " what "."),                                     \
    U(nm "_min", par, R_(m.min), pres, si, us, fsi, fus, "Lowest " what "."),                \
    U(nm "_max", par, R_(m.max), pres, si, us, fsi, fus, "Highest " what ".")
#define ST_COV(nm, par, m, what)                                                             \
    N(nm "_cov", par, R_(m.cov), 0, "Coefficient of variation of " what ": std / |mean|.")
#define ST_LNV(nm, par, m, what)                                                             \
    N(nm "_lnv", par, R_(m.lnv), 0, "Lowest normalised value of " what ": lowest / mean."),  \
    I(nm "_lowest_cycle", par, R_(m.lowest_cycle), "The cycle (1-based) of the lowest " what "."), \
    I(nm "_highest_cycle", par, R_(m.highest_cycle), "The cycle of the highest " what ".")

enum {
    ENGINE = 0, RECORDING = 8, PEGGING = 14, PHASING = 20, HEAT = 28, FRACTIONS = 34,
    ENSEMBLE = 46, STATS = ENSEMBLE + 1 + N_FIGURES, BOUNDS = STATS + 91, IDEAL = BOUNDS + 1,
    SHORT = IDEAL + 12, CYCLES = SHORT + 3, TRACE = CYCLES + 8 + N_FIGURES, N_OUTPUTS = TRACE + 10
};

#define FRACTION(k)                                                                          \
    N("", FRACTIONS, R_(point_fraction) + (k) * sizeof(double),                              \
      R_(has_point) + (k) * sizeof(int) + 1, "A mass fraction burned.")
#define ST_EXTRA(k, nm)                                                                      \
    Q(nm "_mean", STATS, GC_Q_ANGLE, R_(extra[k].mean), P_(has_point[3 + k]),                 \
      "Mean angle of burn_fractions[" #k "] (cycles that burned)."),                         \
    Q(nm "_std", STATS, GC_Q_ANGLE, R_(extra[k].std), P_(has_point[3 + k]),                   \
      "Its sample standard deviation.")

const gc_output gc__comb_outputs[N_OUTPUTS] = {
    [ENGINE] = OBJ("engine", -1, 0, "The engine's geometry as used."),
    Q("bore", ENGINE, GC_Q_LENGTH, R_(bore), 0, "Cylinder bore."),
    Q("stroke", ENGINE, GC_Q_LENGTH, R_(stroke), 0, "Piston stroke."),
    Q("connecting_rod_length", ENGINE, GC_Q_LENGTH, R_(rod), 0, "Connecting rod length."),
    N("compression_ratio", ENGINE, R_(compression_ratio), 0, "Compression ratio."),
    Q("cylinder_displacement", ENGINE, GC_Q_VOLUME, R_(displacement), 0, "Swept volume."),
    Q("clearance_volume", ENGINE, GC_Q_VOLUME, R_(clearance), 0, "Clearance volume."),
    I("strokes_per_cycle", ENGINE, R_(strokes), "Strokes per cycle."),
    [RECORDING] = OBJ("recording", -1, 0, "The recording as reduced."),
    T("source", RECORDING, R_(source), "json (crank_angle and cycles) or text/csv (a CSV body)."),
    I("cycles", RECORDING, R_(n_cycles), "Cycles (pressure series)."),
    I("samples", RECORDING, R_(n_samples), "Samples per cycle."),
    Q("angle_step", RECORDING, GC_Q_ANGLE, R_(angle_step), 0,
      "Mean crank-angle step (one cycle over the samples)."),
    Q("tdc_angle", RECORDING, GC_Q_ANGLE, R_(tdc_angle), 0,
      "Firing TDC used on the recording's axis (moved by the phasing shift when corrected)."),
    [PEGGING] = OBJ("pegging", -1, 0, "Absolute referencing: the offsets added, over cycles."),
    { .name = "method", .parent = PEGGING, .type = GC_OT_ENUM, .offset = R_(peg_method),
      .names = (const char *const[]){ "none", "intake", "two_point", "polytropic", NULL },
      .description = "The pegging method used." },
    Q("offset_mean", PEGGING, GC_Q_PRESSURE_DIFFERENCE, R_(peg_offset.mean), 0, "Mean offset."),
    Q("offset_std", PEGGING, GC_Q_PRESSURE_DIFFERENCE, R_(peg_offset.std), 0,
      "Sample standard deviation of the offsets."),
    Q("offset_min", PEGGING, GC_Q_PRESSURE_DIFFERENCE, R_(peg_offset.min), 0, "Lowest offset."),
    Q("offset_max", PEGGING, GC_Q_PRESSURE_DIFFERENCE, R_(peg_offset.max), 0, "Highest offset."),
    [PHASING] = OBJ("phasing", -1, 0, "The crank-angle phasing check of the ensemble-average "
                    "cycle."),
    { .name = "method", .parent = PHASING, .type = GC_OT_ENUM, .offset = R_(phasing_method),
      .names = (const char *const[]){ "none", "loss_angle", "polytropic", NULL },
      .description = "The test used." },
    Q("shift", PHASING, GC_Q_ANGLE, R_(phasing_shift), P_(has_phasing),
      "Where true TDC lies on the recording's axis, after the stated tdc_angle (a warning "
      "phasing_error above warning_above)."),
    B("corrected", PHASING, R_(phasing_corrected), "true: tdc_angle was moved by the shift."),
    N("effective_exponent", PHASING, R_(phasing_exponent), P_(has_phasing_fit),
      "polytropic: the compression line's effective exponent (c x mean k)."),
    N("rms_residual", PHASING, R_(phasing_rms), P_(has_phasing_fit),
      "polytropic: rms residual of ln p along the fitted line."),
    Q("motored_peak_angle", PHASING, GC_Q_ANGLE, R_(motored_peak_angle), P_(has_motored_peak),
      "loss_angle: the motored peak's angle (parabola through the highest sample)."),
    Q("warning_above", PHASING, GC_Q_ANGLE, R_(phasing_warn), 0,
      "The shift above which the warning phasing_error is given."),
    [HEAT] = OBJ("heat_release", -1, 0, "How the heat release is computed."),
    T("basis", HEAT, R_(basis), "net or gross: the curve the burn points come from (gross "
      "with a wall model)."),
    { .name = "wall_model", .parent = HEAT, .type = GC_OT_ENUM, .offset = R_(wall_model),
      .names = (const char *const[]){ "none", "woschni", "hohenberg", NULL },
      .description = "The wall heat-transfer model." },
    T("k_model", HEAT, R_(k_model), "How the ratio of specific heats is taken."),
    Q("trapped_mass", HEAT, GC_Q_MASS, R_(trapped_mass), 0,
      "Trapped mass of the ensemble-average cycle."),
    { .name = "first_law", .parent = HEAT, .type = GC_OT_CONST,
      .text = "dQ = k/(k-1) p dV + 1/(k-1) V dp per sample interval, single zone",
      .description = "The apparent heat-release rate's form." },
    [FRACTIONS] = { .name = "burn_fractions", .parent = HEAT, .type = GC_OT_ARRAY,
                    .description = "The mass fractions burned whose angles are given: 0.1, "
                    "0.5, 0.9, then burn_fractions in order." },
    FRACTION(0), FRACTION(1), FRACTION(2), FRACTION(3), FRACTION(4), FRACTION(5),
    FRACTION(6), FRACTION(7), FRACTION(8), FRACTION(9), FRACTION(10),
    [ENSEMBLE] = OBJ("ensemble", -1, 0, "The ensemble-average cycle (the mean over all cycles "
                     "of the pegged pressure at each sample) reduced as one cycle."),
    FIGURES(ENSEMBLE, R_(ensemble)),
    [STATS] = OBJ("statistics", -1, 0, "Statistics over cycles: IMEP, PMEP, peak pressure, "
                  "pressure-rise rate, exponents, total heat release and combustion efficiency "
                  "over every cycle, misfires included (common practice: COV of IMEP shows "
                  "them); burn points, burn durations and ringing over the cycles that burned "
                  "(not flagged misfire)."),
    I("cycles", STATS, R_(n_cycles), "Cycles counted."),
    I("burning_cycles", STATS, R_(n_burning), "Cycles with burn points."),
    I("misfires", STATS, R_(n_misfire), "Cycles flagged misfire."),
    I("partial_burns", STATS, R_(n_partial), "Cycles flagged partial burn (misfires apart)."),
    Q("median_heat_release", STATS, GC_Q_ENERGY, R_(median_heat_release), 0,
      "Median total heat release over all cycles: the flags' reference."),
    { .name = "flag_rule", .parent = STATS, .type = GC_OT_STRING, .offset = R_(flag_rule),
      .description = "The stated rule of the misfire and partial-burn flags." },
    ST_Q("imep_net", STATS, GC_Q_PRESSURE_DIFFERENCE, imep_net, "the net IMEP", 0),
    ST_COV("imep_net", STATS, imep_net, "the net IMEP"),
    ST_LNV("imep_net", STATS, imep_net, "the net IMEP"),
    ST_Q("imep_gross", STATS, GC_Q_PRESSURE_DIFFERENCE, imep_gross, "the gross IMEP", 0),
    ST_COV("imep_gross", STATS, imep_gross, "the gross IMEP"),
    ST_LNV("imep_gross", STATS, imep_gross, "the gross IMEP"),
    ST_Q("pmep", STATS, GC_Q_PRESSURE_DIFFERENCE, pmep, "the PMEP", 0),
    ST_Q("peak_pressure", STATS, GC_Q_PRESSURE, P_max, "the peak pressure", 0),
    ST_COV("peak_pressure", STATS, P_max, "the peak pressure"),
    ST_Q("peak_pressure_angle", STATS, GC_Q_ANGLE, angle_P_max, "the peak pressure's angle", 0),
    ST_U("max_pressure_rise_rate", STATS, "kPa/deg", "psi/deg", 1e-3, PSI_PER_PA, dP_max,
         "the highest pressure-rise rate", 0),
    ST_Q("total_heat_release", STATS, GC_Q_ENERGY, Q_total, "the total heat release", 0),
    ST_COV("total_heat_release", STATS, Q_total, "the total heat release"),
    ST_Q("ca10", STATS, GC_Q_ANGLE, ca10, "CA10", 0),
    ST_Q("ca50", STATS, GC_Q_ANGLE, ca50, "CA50", 0),
    ST_Q("ca90", STATS, GC_Q_ANGLE, ca90, "CA90", 0),
    ST_Q("burn_0_10", STATS, GC_Q_ANGLE, burn_0_10, "the 0-10 % burn duration", 0),
    ST_Q("burn_10_90", STATS, GC_Q_ANGLE, burn_10_90, "the 10-90 % burn duration", 0),
    ST_U("ringing_intensity", STATS, "MW/m2", "Btu/(h ft2)", 1e-6, BTU_H_FT2_PER_W_M2, ringing,
         "the ringing intensity", P_(has_ringing)),
    N("combustion_efficiency_mean", STATS, R_(efficiency.mean), P_(has_efficiency),
      "Mean combustion efficiency (every cycle, misfires included)."),
    N("combustion_efficiency_std", STATS, R_(efficiency.std), P_(has_efficiency),
      "Its sample standard deviation."),
    N("n_compression_mean", STATS, R_(n_compression.mean), 0, "Mean compression exponent."),
    N("n_compression_std", STATS, R_(n_compression.std), 0, "Its standard deviation."),
    N("n_expansion_mean", STATS, R_(n_expansion.mean), 0, "Mean expansion exponent."),
    N("n_expansion_std", STATS, R_(n_expansion.std), 0, "Its standard deviation."),
    ST_EXTRA(0, "mfb_extra_1"), ST_EXTRA(1, "mfb_extra_2"), ST_EXTRA(2, "mfb_extra_3"),
    ST_EXTRA(3, "mfb_extra_4"), ST_EXTRA(4, "mfb_extra_5"), ST_EXTRA(5, "mfb_extra_6"),
    ST_EXTRA(6, "mfb_extra_7"), ST_EXTRA(7, "mfb_extra_8"),
    [BOUNDS] = OBJ("bounds", -1, P_(ideal.ok), "The ideal Otto cycle at the same compression "
                   "ratio and intake state, releasing the same heat."),
    [IDEAL] = OBJ("ideal", BOUNDS, 0, "The ideal Otto cycle (isentropic compression and "
                  "expansion of the charge's gas model, heat at constant volume)."),
    { .name = "cycle", .parent = IDEAL, .type = GC_OT_CONST, .text = "otto",
      .description = "The ideal cycle." },
    T("heat_source", IDEAL, R_(ideal_heat_source), "heat_release (the ensemble's total heat "
      "release) or fuel (fuel_per_cycle x LHV)."),
    Q("intake_temperature", IDEAL, GC_Q_TEMPERATURE, R_(ideal.T1_K), 0,
      "Charge temperature at BDC (p V / (m R))."),
    Q("intake_pressure", IDEAL, GC_Q_PRESSURE, R_(ideal.P1_Pa), 0,
      "The ensemble's pressure at BDC before compression."),
    Q("trapped_mass", IDEAL, GC_Q_MASS, R_(ideal.mass_kg), 0, "Trapped mass."),
    Q("heat_added", IDEAL, GC_Q_SPECIFIC_ENERGY, R_(ideal.heat_J_per_kg), 0,
      "Heat added per kg of charge."),
    N("thermal_efficiency", IDEAL, R_(ideal.efficiency), 0, "Thermal efficiency."),
    Q("work", IDEAL, GC_Q_ENERGY, R_(ideal.work_J), 0, "Net work per cycle."),
    Q("mean_effective_pressure", IDEAL, GC_Q_PRESSURE_DIFFERENCE, R_(ideal.mep_Pa), 0,
      "Mean effective pressure."),
    Q("peak_pressure", IDEAL, GC_Q_PRESSURE, R_(ideal.P_max_Pa), 0, "Peak pressure."),
    Q("peak_temperature", IDEAL, GC_Q_TEMPERATURE, R_(ideal.T_max_K), 0, "Peak temperature."),
    [SHORT] = OBJ("shortfall", -1, P_(ideal.ok), "The ensemble-average cycle against the ideal."),
    N("fraction_of_ideal", SHORT, R_(fraction_of_ideal), 0,
      "Gross indicated work of the ensemble over the ideal cycle's work."),
    { .name = "basis", .parent = SHORT, .type = GC_OT_CONST,
      .text = "gross indicated work over the ideal Otto cycle's work",
      .description = "What the fraction compares." },
    [CYCLES] = { .name = "cycles", .parent = -1, .type = GC_OT_LIST, .flags = GC_OF_CSV_TABLE,
                 .offset = R_(rows), .count = P_(n_cycles), .item_size = sizeof(gc_comb_row),
                 .max_items = GC_HEATREL_MAX_CYCLES,
                 .description = "One row per cycle, in recording order (format=csv: the first "
                 "table)." },
    I("cycle", CYCLES, ROW(cycle), "The cycle's column in the recording, from 1."),
    { .name = "label", .parent = CYCLES, .type = GC_OT_STRING, .offset = ROW(label),
      .present = ROW(has_label) + 1, .description = "Its column name in a text/csv body." },
    B("misfire", CYCLES, ROW(misfire), "Flagged misfire (statistics.flag_rule)."),
    B("partial_burn", CYCLES, ROW(partial_burn), "Flagged partial burn (statistics.flag_rule)."),
    Q("peg_offset", CYCLES, GC_Q_PRESSURE_DIFFERENCE, ROW(peg_offset), 0, "Offset added by pegging."),
    Q("trapped_mass", CYCLES, GC_Q_MASS, ROW(trapped_mass), 0, "Trapped mass."),
    Q("max_mean_temperature_angle", CYCLES, GC_Q_ANGLE, ROW(angle_T_max), 0,
      "Crank angle of the highest mean gas temperature."),
    FIGURES(CYCLES, 0),
    [TRACE] = { .name = "trace", .parent = -1, .type = GC_OT_LIST, .flags = GC_OF_CSV_TABLE,
                .offset = R_(trace), .count = P_(n_trace), .item_size = sizeof(gc_comb_sample),
                .max_items = GC_HEATREL_MAX_SAMPLES, .include = 1u,
                .description = "include=trace: the ensemble-average trace, one row per sample "
                "from the start of the intake stroke (format=csv: the second table); heat "
                "release in the closed part only." },
    Q("angle", TRACE, GC_Q_ANGLE, SMP(angle), 0, "Crank angle from firing TDC."),
    Q("pressure", TRACE, GC_Q_PRESSURE, SMP(P), 0, "Ensemble-average pegged pressure."),
    Q("volume", TRACE, GC_Q_VOLUME, SMP(V), 0, "Cylinder volume."),
    Q("temperature", TRACE, GC_Q_TEMPERATURE, SMP(T), SMP(closed) + 1,
      "Mean gas temperature p V / (m R)."),
    U("heat_release_rate_net", TRACE, SMP(dQn_per_deg), SMP(closed) + 1, "J/deg", "Btu/deg",
      1.0, BTU_PER_J, "Apparent (net) heat-release rate."),
    Q("heat_release_net", TRACE, GC_Q_ENERGY, SMP(Qn), SMP(closed) + 1,
      "Cumulative net heat release from IVC."),
    U("heat_release_rate_gross", TRACE, SMP(dQg_per_deg), SMP(closed) + 1, "J/deg", "Btu/deg",
      1.0, BTU_PER_J, "Gross heat-release rate."),
    Q("heat_release_gross", TRACE, GC_Q_ENERGY, SMP(Qg), SMP(closed) + 1,
      "Cumulative gross heat release from IVC."),
    N("mass_fraction_burned", TRACE, SMP(mfb), SMP(closed) + 1,
      "Mass fraction burned (heat_release.basis)."),
};

_Static_assert(N_OUTPUTS == GC_COMB_N_OUTPUTS, "GC_COMB_N_OUTPUTS must count the table's rows");
