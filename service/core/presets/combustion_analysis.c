/*
 * combustion_analysis.c — combustion analysis of a cylinder-pressure
 * recording declared as a preset (preset.h): /v1/measured/combustion. Many
 * consecutive cycles of one cylinder (JSON: "crank_angle" and "cycles", one
 * pressure series per cycle; or a text/csv body, heatrel.h's format, with
 * the other inputs in the query string) with the engine's geometry are
 * reduced by gc_heatrel_analyse (heatrel.h: pegging, phasing check, net and
 * gross heat release with k from the gas models, burn points, ringing,
 * statistics over cycles, the ensemble-average cycle); the ideal Otto cycle
 * at the same compression ratio and intake state releasing the ensemble's
 * heat (or the fuel's) is the comparison (indicator.h).
 *
 * Units: the samples are plain numbers, crank angles in degrees, pressures
 * in pressure_unit (default kPa; a text/csv body names each column's unit in
 * its header); every other input a number in its quantity's default unit or
 * a string with a unit. Checks between inputs (422, "Invalid request
 * fields"): the recording is needed (JSON or CSV, not both), every cycle as
 * long as crank_angle, angles increasing, at most GC_HEATREL_MAX_VALUES
 * values; intake pegging needs its pressure; equivalence_ratio needs a fuel
 * and the air model; fuel or fuel_heating_value, not both; trapped_mass or
 * ivc_temperature, not both. The trapped mass comes from ivc_temperature
 * (default GC_COMB_IVC_T_DEFAULT_K, warned when assumed).
 *
 * Limits: the body limit of the route is the server's --max-recording-body
 * (large_body); a JSON body holds at most GC_COMB_MAX_JSON_VALUES numbers.
 */
#include "core/presets/combustion_analysis.h"
#include "core/presets/presets.h"
#include "gascycle/units.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)
#define GC_COMB_IVC_T_DEFAULT_K 330.0   /* charge temperature at IVC when neither it nor the
                                           trapped mass is given (common practice for a
                                           naturally aspirated spark-ignition engine) */

enum {
    F_REQUEST = 0, F_ANGLE, F_CYCLES, F_PRESSURE_UNIT, F_BORE, F_STROKE, F_ROD, F_CR, F_STROKES,
    F_SPEED, F_TDC, F_PEG, F_PEG_METHOD, F_PEG_PRESSURE, F_PEG_WINDOW, F_PEG_EXPONENT, F_PHASE,
    F_PHASE_METHOD, F_PHASE_LOSS, F_PHASE_WINDOW, F_PHASE_CORRECT, F_GAS, F_GAS_CP, F_GAS_K,
    F_FUEL, F_EQUIVALENCE, F_FUEL_HV, F_FUEL_PER_CYCLE, F_IVC_T, F_TRAPPED, F_CLOSED, F_COMP_WIN,
    F_EXP_WIN, F_HT, F_HT_MODEL, F_HT_WALL_T, F_HT_MOTORED_N, F_BURN_FRACTIONS, F_COUNT
};

#define IN(member) offsetof(gc_comb_request, member)
#define GIVEN(member) (offsetof(gc_comb_request, member) + 1)

static const char *const gas_models[] = { "air", "cold", NULL };
static const char *const peg_methods[] = { "none", "intake", "two_point", "polytropic", NULL };
static const char *const phasing_methods[] = { "none", "loss_angle", "polytropic", NULL };
static const char *const wall_models[] = { "none", "woschni", "hohenberg", NULL };
static const char *const window_sentences[] = {
    "must be two crank angles [start, end] from firing TDC (GET: \"start,end\")",
    "must run from a smaller to a larger angle, within -180..180 degrees from firing TDC",
    NULL };
static const char *const peg_window_sentences[] = {
    "must be two crank angles [start, end] from firing TDC (GET: \"start,end\")",
    "must run from a smaller to a larger angle, within -360..360 degrees from firing TDC",
    NULL };

#define NUM(id, nm, par, q, fl, d, lo, hi, member, gv, desc)                                   \
    [id] = { .name = nm, .parent = par, .type = GC_FT_NUMBER, .quantity = q, .flags = fl,       \
             .def = d, .min = lo, .max = hi, .offset = IN(member), .given = gv,                 \
             .description = desc }
#define OPT(id, nm, par, q, lo, hi, member, desc)                                              \
    NUM(id, nm, par, q, GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 0.0, lo, hi,   \
        member, GIVEN(has_##member), desc)
#define REQ(id, nm, q, lo, hi, member, desc)                                                   \
    NUM(id, nm, 0, q, GC_FF_REQUIRED | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 0.0, lo, hi,     \
        member, GIVEN(has_##member), desc)
#define WINDOW(id, nm, par, member, half, says, desc)                                          \
    [id] = { .name = nm, .parent = par, .type = GC_FT_NUMBER_LIST, .quantity = GC_Q_ANGLE,      \
             .flags = GC_FF_MIN | GC_FF_MAX, .min = -(half) * DEG - 1e-12,                      \
             .max = (half) * DEG + 1e-12, .names = says, .offset = IN(member),                  \
             .count = GIVEN(n_##member), .min_items = 2, .max_items = 2, .description = desc }
#define ENUM(id, nm, par, list, member, desc)                                                  \
    [id] = { .name = nm, .parent = par, .type = GC_FT_ENUM, .names = list, .offset = IN(member), \
             .description = desc }
#define OBJ(id, nm, desc) [id] = { .name = nm, .type = GC_FT_OBJECT, .description = desc }

static const gc_field fields[F_COUNT] = {
    [F_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                    .description = "A cylinder-pressure recording of many cycles." },
    [F_ANGLE] = { .name = "crank_angle", .type = GC_FT_SERIES,
                  .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MAX, .min = -7200.0, .max = 7200.0,
                  .offset = IN(angle), .count = GIVEN(n_angle), .given = GIVEN(has_angle),
                  .min_items = GC_HEATREL_MIN_SAMPLES, .max_items = GC_HEATREL_MAX_SAMPLES,
                  .items = "crank angles in degrees, plain numbers",
                  .description = "The recording's crank angles in degrees (plain numbers), "
                  "strictly increasing over one cycle (720 degrees four-stroke, 360 two-stroke, "
                  "short of it by at most one step); firing TDC at tdc_angle. Required unless "
                  "the recording is sent as a text/csv body." },
    [F_CYCLES] = { .name = "cycles", .type = GC_FT_SERIES_LIST, .flags = GC_FF_OPTIONAL,
                   .offset = IN(P), .count = GIVEN(n_cycles), .aux = GIVEN(n_per_cycle),
                   .given = GIVEN(has_cycles), .min_items = 1,
                   .max_items = GC_HEATREL_MAX_CYCLES, .min_values = GC_HEATREL_MIN_SAMPLES,
                   .max_values = GC_HEATREL_MAX_SAMPLES,
                   .items = "pressures in pressure_unit, plain numbers",
                   .description = "One pressure series per recorded cycle, each at the crank "
                   "angles of crank_angle, in pressure_unit (plain numbers; absolute, or "
                   "relative when pegging says how to reference them)." },
    [F_PRESSURE_UNIT] = { .name = "pressure_unit", .type = GC_FT_STRING,
                          .flags = GC_FF_ECHO_GIVEN, .def_name = "kPa",
                          .offset = IN(pressure_unit), .given = GIVEN(has_pressure_unit),
                          .description = "Unit of the pressures of cycles (a JSON recording; a "
                          "text/csv body names its units in the header)." },
    REQ(F_BORE, "bore", GC_Q_LENGTH, 0.0, 10.0, bore, "Cylinder bore."),
    REQ(F_STROKE, "stroke", GC_Q_LENGTH, 0.0, 10.0, stroke, "Piston stroke."),
    REQ(F_ROD, "connecting_rod_length", GC_Q_LENGTH, 0.0, 10.0, rod,
        "Connecting rod, centre to centre (more than half the stroke)."),
    REQ(F_CR, "compression_ratio", GC_Q_RATIO, 1.0, 100.0, compression_ratio,
        "Geometric compression ratio."),
    [F_STROKES] = { .name = "strokes_per_cycle", .type = GC_FT_INTEGER,
                    .flags = GC_FF_MIN | GC_FF_MAX | GC_FF_MIN_OR_MAX, .def = 4, .min = 2,
                    .max = 4, .offset = IN(strokes), .description = "Strokes per cycle: 2 or 4." },
    OPT(F_SPEED, "speed", 0, GC_Q_ROTATIONAL_SPEED, 0.0, 1000.0, speed,
        "Crankshaft speed: needed by the wall heat-transfer models and the ringing intensity."),
    NUM(F_TDC, "tdc_angle", 0, GC_Q_ANGLE, GC_FF_MIN | GC_FF_MAX, 0.0, -7200.0 * DEG,
        7200.0 * DEG, tdc_angle, 0, "Crank angle of firing TDC on the recording's axis."),
    OBJ(F_PEG, "pegging", "Referencing a relative (piezoelectric) signal to absolute pressure: "
        "one offset per cycle, added to every sample."),
    ENUM(F_PEG_METHOD, "method", F_PEG, peg_methods, peg_method,
         "none: the signal is absolute; intake: the mean over window equals intake_pressure "
         "(the manifold pressure near BDC; common practice); two_point: the compression "
         "between the ends of compression_window is polytropic with exponent (Randolph 1990, "
         "SAE 900170); polytropic: the same exponent fitted by least squares over every "
         "sample of compression_window."),
    OPT(F_PEG_PRESSURE, "intake_pressure", F_PEG, GC_Q_PRESSURE, 0.0, 1.0e8, peg_intake_pressure,
        "Intake-manifold pressure (absolute) for method intake."),
    WINDOW(F_PEG_WINDOW, "window", F_PEG, peg_window, 360.0, peg_window_sentences,
           "Averaging window of method intake, from firing TDC (default -185..-175)."),
    NUM(F_PEG_EXPONENT, "exponent", F_PEG, GC_Q_RATIO,
        GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX | GC_FF_BOTH_BOUNDS,
        GC_HEATREL_PEG_EXPONENT_DEFAULT, 1.0, 1.7, peg_exponent, 0,
        "Fixed polytropic exponent of methods two_point and polytropic."),
    OBJ(F_PHASE, "phasing", "The check of the crank-angle phasing (where TDC lies on the "
        "recording), on the ensemble-average cycle."),
    ENUM(F_PHASE_METHOD, "method", F_PHASE, phasing_methods, phasing_method,
         "none; loss_angle (a motored recording: its peak lies before TDC by the thermodynamic "
         "loss angle); polytropic (motored or fired: the compression line in log p - log V "
         "is straightest with the right TDC, k from the gas model)."),
    NUM(F_PHASE_LOSS, "loss_angle", F_PHASE, GC_Q_ANGLE, GC_FF_MIN | GC_FF_MAX,
        GC_HEATREL_LOSS_ANGLE_DEFAULT_DEG * DEG, 0.0, 3.0 * DEG + 1e-12, loss_angle, 0,
        "Expected thermodynamic loss angle of method loss_angle (0.5 to 1 degree is typical; "
        "common practice)."),
    WINDOW(F_PHASE_WINDOW, "window", F_PHASE, phasing_window, 180.0, window_sentences,
           "Fit window of method polytropic, before combustion (default -60..-25)."),
    [F_PHASE_CORRECT] = { .name = "correct", .parent = F_PHASE, .type = GC_FT_BOOL,
                          .offset = IN(phasing_correct), .description = "true: move TDC by "
                          "the shift found and reduce again (a warning names both angles)." },
    [F_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "air",
                .offset = IN(gas), .given = GIVEN(has_gas),
                .description = "The fresh charge's model, for k at the mean gas temperature: "
                "\"air\" (NASA 9-coefficient data) or \"cold\" (constant cp and k)." },
    [F_GAS_CP] = { .name = "cp", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                   .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                   .def = 1005.0, .min = 100.0, .max = 20000.0,
                   .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                   .description = "Cold model: constant specific heat at constant pressure." },
    [F_GAS_K] = { .name = "k", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                  .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                  .def = 1.4, .min = 1.0, .max = 1.7,
                  .offset = IN(gas) + offsetof(gc_gas, k_cold),
                  .description = "Cold model: constant ratio of specific heats cp/cv." },
    [F_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL, .offset = IN(fuel),
                 .aux = GIVEN(fuel_spec), .given = GIVEN(has_fuel),
                 .description = "The fuel: its lower heating value for the combustion "
                 "efficiency and, with equivalence_ratio, the burned gas's model." },
    OPT(F_EQUIVALENCE, "equivalence_ratio", 0, GC_Q_RATIO, 0.0, 1.0, equivalence_ratio,
        "Fuel-air equivalence ratio (lean or stoichiometric): the charge turns into the fuel's "
        "complete-combustion products as it burns (k of the mixture by mass fraction burned)."),
    OPT(F_FUEL_HV, "fuel_heating_value", 0, GC_Q_SPECIFIC_ENERGY, 1.0e6, 1.5e8,
        fuel_heating_value, "The fuel's lower heating value when no fuel is named."),
    OPT(F_FUEL_PER_CYCLE, "fuel_per_cycle", 0, GC_Q_MASS, 0.0, 1.0, fuel_per_cycle,
        "Fuel mass per cycle of this cylinder (gives the combustion efficiency)."),
    NUM(F_IVC_T, "ivc_temperature", 0, GC_Q_TEMPERATURE, GC_FF_MIN | GC_FF_MAX,
        GC_COMB_IVC_T_DEFAULT_K, 150.0, 1000.0, ivc_temperature, GIVEN(has_ivc_temperature),
        "Mean charge temperature at IVC: the trapped mass is p V / (R T) there (a warning "
        "says when the default is assumed)."),
    OPT(F_TRAPPED, "trapped_mass", 0, GC_Q_MASS, 0.0, 1.0, trapped_mass,
        "Trapped mass per cycle (instead of ivc_temperature)."),
    WINDOW(F_CLOSED, "closed_part", 0, closed_part, 180.0, window_sentences,
           "[IVC, EVO]: the closed part of the cycle, where heat release is computed, from "
           "firing TDC (default -120..120); no valve event may lie inside."),
    WINDOW(F_COMP_WIN, "compression_window", 0, compression_window, 180.0, window_sentences,
           "Fit window of the compression exponent, from firing TDC (default -100..-65)."),
    WINDOW(F_EXP_WIN, "expansion_window", 0, expansion_window, 180.0, window_sentences,
           "Fit window of the expansion exponent, from firing TDC (default 60..100)."),
    OBJ(F_HT, "heat_transfer", "Wall heat transfer for the gross heat release (needs speed)."),
    ENUM(F_HT_MODEL, "model", F_HT, wall_models, wall_model,
         "none (gross = net); woschni (Woschni 1967: C1 2.28, C2 3.24e-3 m/(s K) from the "
         "start of combustion); hohenberg (Hohenberg 1979: C1 130, C2 1.4 m/s)."),
    NUM(F_HT_WALL_T, "wall_temperature", F_HT, GC_Q_TEMPERATURE, GC_FF_MIN | GC_FF_MAX,
        GC_HEATREL_WALL_T_DEFAULT_K, 250.0, 1000.0, wall_temperature, 0,
        "Mean wall temperature (common practice)."),
    NUM(F_HT_MOTORED_N, "motored_exponent", F_HT, GC_Q_RATIO,
        GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX | GC_FF_MAX_EXCL, 0.0, 1.0, 1.7,
        motored_exponent, GIVEN(has_motored_exponent),
        "Exponent of Woschni's motored pressure (default: each cycle's fitted compression "
        "exponent)."),
    [F_BURN_FRACTIONS] = { .name = "burn_fractions", .type = GC_FT_NUMBER_LIST,
                           .quantity = GC_Q_FRACTION,
                           .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX |
                                    GC_FF_MAX_EXCL | GC_FF_BOTH_BOUNDS,
                           .min = 0.0, .max = 1.0, .offset = IN(burn_fractions),
                           .count = GIVEN(n_burn_fractions), .min_items = 1,
                           .max_items = GC_HEATREL_MAX_EXTRA_POINTS, .items = "fractions",
                           .description = "Mass fractions burned whose angles are wanted "
                           "besides 10, 50 and 90 % (e.g. [0.05, 0.95])." },
};

/* ---- checks between inputs --------------------------------------------------------------- */

static void err(gc_report *rep, int field, int index, const char *msg)
{
    gc_report_error(rep, GC_ERR_INVALID, field, index, "%s", msg);
}

/* The recording: given once, cycles as long as the angles, angles increasing. */
static void check_recording(const gc_comb_request *q, gc_report *rep)
{
    if (!q->has_angle && !q->has_cycles) {
        err(rep, F_CYCLES, -1, "is required: give crank_angle and cycles, or POST the recording "
            "as a text/csv body (crank angle, then one pressure column per cycle)");
        return;
    }
    if (!q->has_angle || !q->has_cycles) {
        err(rep, q->has_angle ? F_CYCLES : F_ANGLE, -1, "is required with the other one of "
            "crank_angle and cycles");
        return;
    }
    if (q->n_per_cycle != q->n_angle) {
        gc_report_error(rep, GC_ERR_INVALID, F_CYCLES, 0, "every cycle holds %d pressures, "
                        "crank_angle %d angles: they must match", q->n_per_cycle, q->n_angle);
        return;
    }
    if ((long)q->n_cycles * q->n_angle > GC_HEATREL_MAX_VALUES)
        gc_report_error(rep, GC_ERR_INVALID, F_CYCLES, -1, "holds %ld pressures; a recording "
                        "holds at most %d", (long)q->n_cycles * q->n_angle, GC_HEATREL_MAX_VALUES);
    for (int i = 1; i < q->n_angle; i++)
        if (!(q->angle[i] > q->angle[i - 1])) {
            gc_report_error(rep, GC_ERR_INVALID, F_ANGLE, i, "(%.10g) must be above the angle "
                            "before it (%.10g): the angles must increase", q->angle[i],
                            q->angle[i - 1]);
            return;
        }
}

static void check_fuel_gas(const gc_comb_request *q, gc_report *rep)
{
    if (q->has_fuel && q->has_fuel_heating_value)
        err(rep, F_FUEL_HV, -1, "give either fuel or fuel_heating_value, not both");
    if (q->has_fuel_per_cycle && !q->has_fuel && !q->has_fuel_heating_value)
        err(rep, F_FUEL_PER_CYCLE, -1, "needs the fuel (or fuel_heating_value) for the "
            "combustion efficiency");
    if ((q->has_fuel || q->has_fuel_heating_value) && !q->has_fuel_per_cycle)
        err(rep, F_FUEL_PER_CYCLE, -1, "is required with a fuel or fuel_heating_value (the "
            "combustion efficiency is the heat released over fuel_per_cycle x LHV)");
    if (q->has_equivalence_ratio && !q->has_fuel)
        err(rep, F_EQUIVALENCE, -1, "needs the fuel (its combustion products are the burned "
            "gas)");
    else if (q->has_equivalence_ratio && q->gas.kind == GC_GAS_COLD)
        err(rep, F_EQUIVALENCE, -1, "needs the air model as the gas (the products are air "
            "burned with the fuel)");
    if (q->has_trapped_mass && q->has_ivc_temperature)
        err(rep, F_TRAPPED, -1, "give either trapped_mass or ivc_temperature, not both");
    if (q->peg_method == GC_HEATREL_PEG_INTAKE && !q->has_peg_intake_pressure)
        err(rep, F_PEG_PRESSURE, -1, "is required with pegging method intake");
    if (q->has_peg_intake_pressure && q->peg_method != GC_HEATREL_PEG_INTAKE)
        err(rep, F_PEG_PRESSURE, -1, "applies only to pegging method intake");
}

/* The checks; the recording's pressure unit factor into *fP. */
static void check(const gc_comb_request *q, double *fP, gc_report *rep)
{
    gc_error uerr;
    gc_error_clear(&uerr);
    *fP = 1.0;
    check_recording(q, rep);
    if (q->from_csv && q->has_pressure_unit)
        err(rep, F_PRESSURE_UNIT, -1, "does not apply to a text/csv body: its header names the "
            "unit of every column");
    else if (!q->from_csv && gc_units_to_si(GC_Q_PRESSURE, 1.0, q->pressure_unit, fP, &uerr) != GC_OK)
        err(rep, F_PRESSURE_UNIT, -1, uerr.message);
    check_fuel_gas(q, rep);
}

/* ---- the analysis ----------------------------------------------------------------------- */

/* The recording in deg and Pa. */
static int traces_of(const gc_comb_request *q, double fP, gc_heatrel_traces *t, gc_report *rep)
{
    gc_error e;
    gc_error_clear(&e);
    if (gc_heatrel_traces_alloc(t, q->n_cycles, q->n_angle, &e) != GC_OK) {
        e.field_id = F_CYCLES;
        return gc_report_add(rep, &e);
    }
    memcpy(t->angle_deg, q->angle, (size_t)q->n_angle * sizeof *q->angle);
    size_t n = (size_t)q->n_cycles * (size_t)q->n_angle;
    for (size_t j = 0; j < n; j++)
        t->P_Pa[j] = q->P[j] * fP;
    for (int c = 0; c < q->n_cycles && q->from_csv; c++)
        memcpy(t->label[c], q->label[c], GC_HEATREL_LABEL_LEN);
    return GC_OK;
}

static void window_deg(double out[2], const double in[2])
{
    out[0] = in[0] / DEG;
    out[1] = in[1] / DEG;
}

/* The burned gas: the fuel's complete-combustion products at the ratio. */
static int burned_gas(const gc_comb_request *q, gc_heatrel_input *in, gc_report *rep)
{
    if (!q->has_equivalence_ratio)
        return GC_OK;
    gc_error e;
    gc_error_clear(&e);
    double fs = 0.0;
    int rc = gc_combustion_far_stoich(&q->fuel, &q->gas, &fs, &e);
    if (rc == GC_OK)
        rc = gc_combustion_products(&q->fuel, &q->gas, q->equivalence_ratio * fs,
                                    &in->gas_burned, &e);
    if (rc != GC_OK) {
        e.field_id = F_EQUIVALENCE;
        return gc_report_add(rep, &e);
    }
    in->has_burned_gas = 1;
    return GC_OK;
}

static int input_of(const gc_comb_request *q, gc_heatrel_input *in, gc_report *rep)
{
    gc_heatrel_input_init(in);
    in->geometry = (gc_measured_geometry){ q->bore, q->stroke, q->rod, q->compression_ratio };
    in->strokes = q->strokes;
    in->tdc_angle_deg = q->tdc_angle / DEG;
    in->speed_rev_s = q->has_speed ? q->speed : 0.0;
    in->peg_method = q->peg_method;
    in->peg_intake_pressure_Pa = q->has_peg_intake_pressure ? q->peg_intake_pressure : 0.0;
    window_deg(in->peg_window_deg, q->peg_window);
    in->peg_exponent = q->peg_exponent;
    in->phasing_method = q->phasing_method;
    in->loss_angle_deg = q->loss_angle / DEG;
    window_deg(in->phasing_window_deg, q->phasing_window);
    in->phasing_correct = q->phasing_correct;
    in->gas_unburned = q->gas;
    in->T_ivc_K = q->has_trapped_mass ? 0.0 : q->ivc_temperature;
    in->trapped_mass_kg = q->has_trapped_mass ? q->trapped_mass : 0.0;
    in->ivc_deg = q->closed_part[0] / DEG;
    in->evo_deg = q->closed_part[1] / DEG;
    window_deg(in->compression_window_deg, q->compression_window);
    window_deg(in->expansion_window_deg, q->expansion_window);
    in->wall_model = q->wall_model;
    in->T_wall_K = q->wall_temperature;
    in->motored_exponent = q->has_motored_exponent ? q->motored_exponent : 0.0;
    in->n_extra_points = q->n_burn_fractions;
    memcpy(in->extra_points, q->burn_fractions, sizeof in->extra_points);
    in->fuel_per_cycle_kg = q->has_fuel_per_cycle ? q->fuel_per_cycle : 0.0;
    in->fuel_heating_value_J_per_kg = q->has_fuel ? q->fuel.LHV_J_per_kg
                                    : q->has_fuel_heating_value ? q->fuel_heating_value : 0.0;
    return burned_gas(q, in, rep);
}

/* The field id of a path of heatrel.h's messages ("/trace": the cycles). */
static int field_of(const char *path, int idx[2])
{
    idx[0] = idx[1] = -1;
    if (!path || !path[0])
        return -1;
    if (strcmp(path, "/trace") == 0)
        return F_CYCLES;
    if (strcmp(path, "/burned_gas") == 0)
        return F_EQUIVALENCE;
    return gc_preset_field_find(gc__comb_preset(), path, idx);
}

static int analyse(const gc_comb_request *q, double fP, gc_heatrel_result *hr, gc_report *rep)
{
    gc_heatrel_traces t;
    gc_heatrel_input *in = malloc(sizeof *in);
    if (!in)
        return gc_report_error(rep, GC_ERR_NOMEM, -1, -1, "out of memory");
    int rc = input_of(q, in, rep);
    if (rc == GC_OK)
        rc = traces_of(q, fP, &t, rep);
    if (rc != GC_OK) {
        free(in);
        return rc;
    }
    gc_error e;
    gc_error_clear(&e);
    rc = gc_heatrel_analyse(in, &t, hr, &e);
    gc_heatrel_traces_free(&t);
    free(in);
    if (rc != GC_OK) {
        int idx[2];
        int id = field_of(e.field, idx);
        e.field_id = id > 0 ? id : F_CYCLES;
        memcpy(e.index, idx, sizeof e.index);
        return gc_report_add(rep, &e);
    }
    return GC_OK;
}

/* ---- the result ------------------------------------------------------------------------- */

void gc__comb_fill(const gc_comb_request *q, const gc_heatrel_result *hr, gc_comb_result *x);

/* A static copy of a code of heatrel.h's warnings (the report keeps the
 * pointer; the result's text is freed before the answer is written). */
static const char *static_code(const char *code)
{
    static const char *const known[] = {
        "phasing_error", "phasing_corrected", "no_combustion", "misfire", "partial_burn",
        "temperature_range", "motored_exponent_default", "burn_beyond_closed_part",
        "motored_recording", "no_ringing", "combustion_efficiency_above_one", NULL };
    for (int i = 0; known[i]; i++)
        if (strcmp(code, known[i]) == 0)
            return known[i];
    return "heat_release_note";
}

static void warnings(const gc_comb_request *q, const gc_heatrel_result *hr, gc_report *rep)
{
    for (int i = 0; i < hr->n_warnings; i++) {
        int idx[2];
        int id = field_of(hr->warnings[i].field, idx);
        gc_report_warn(rep, static_code(hr->warnings[i].code), id > 0 ? id : -1, idx[0], "%s",
                       hr->warnings[i].message);
    }
    if (!q->has_ivc_temperature && !q->has_trapped_mass)
        gc_report_warn(rep, "assumed_ivc_temperature", F_IVC_T, -1, "neither ivc_temperature "
                       "nor trapped_mass given: %.6g K assumed at IVC for the trapped mass (it "
                       "sets the mean gas temperature, hence k)", GC_COMB_IVC_T_DEFAULT_K);
    if (q->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", F_GAS, -1, "the cold model holds k constant at every "
                       "temperature, where the heat release needs k at the mean gas "
                       "temperature");
}

/* The ideal Otto cycle of the ensemble's charge, releasing its heat (or the
 * fuel's energy when fuel_per_cycle is given). */
static void ideal(const gc_comb_request *q, gc_comb_result *x, gc_report *rep)
{
    gc__ind_ideal *d = &x->ideal;
    const gc_comb_sample *bdc = NULL;
    for (int i = 0; i < x->n_trace && !bdc; i++)
        if (x->trace[i].angle >= -PI - 1e-9)
            bdc = &x->trace[i];
    memset(d, 0, sizeof *d);
    d->gas = q->gas;
    d->compression_ratio = q->compression_ratio;
    d->mass_kg = x->trapped_mass;
    d->P1_Pa = bdc ? bdc->P : 0.0;
    d->T1_K = bdc ? d->P1_Pa * bdc->V / (d->mass_kg * q->gas.R_J_per_kgK) : 0.0;
    int fuel = q->has_fuel_per_cycle && x->ensemble.has_efficiency;
    double heat = fuel ? x->ensemble.Q_total / x->ensemble.combustion_efficiency
                       : x->ensemble.Q_total;
    d->heat_J_per_kg = d->mass_kg > 0.0 ? heat / d->mass_kg : 0.0;
    x->ideal_heat_source = fuel ? "fuel" : "heat_release";
    gc_error e;
    gc_error_clear(&e);
    if (bdc && gc__ind_ideal_eval(d, &e) == GC_OK && d->work_J != 0.0) {
        x->fraction_of_ideal = x->ensemble.work_gross / d->work_J;
        return;
    }
    d->ok = 0;
    gc_report_warn(rep, "no_ideal_cycle", -1, -1, "no ideal Otto cycle for comparison: %.200s",
                   e.message[0] ? e.message : "the ensemble-average cycle releases no heat");
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_comb_request *q = input;
    gc_comb_result *x = result;
    double fP = 1.0;
    check(q, &fP, rep);
    if (rep->n_errors) {
        rep->input = 1;
        return rep->errors[0].code;
    }
    gc_heatrel_result hr;
    int rc = analyse(q, fP, &hr, rep);
    if (rc == GC_OK) {
        gc__comb_fill(q, &hr, x);
        warnings(q, &hr, rep);
        ideal(q, x, rep);
    }
    gc_heatrel_result_free(&hr);
    return rc;
}

/* ---- the descriptor's other hooks ------------------------------------------------------- */

/* The windows' defaults: heatrel.h's (gc_heatrel_input_init), in rad. */
static void init(void *input)
{
    gc_comb_request *q = input;
    gc_heatrel_input d;
    gc_heatrel_input_init(&d);
    const double *from[4] = { d.peg_window_deg, d.phasing_window_deg, d.compression_window_deg,
                              d.expansion_window_deg };
    double *to[4] = { q->peg_window, q->phasing_window, q->compression_window,
                      q->expansion_window };
    for (int k = 0; k < 4; k++) {
        to[k][0] = from[k][0] * DEG;
        to[k][1] = from[k][1] * DEG;
    }
    q->closed_part[0] = d.ivc_deg * DEG;
    q->closed_part[1] = d.evo_deg * DEG;
    q->n_peg_window = q->n_phasing_window = q->n_compression_window = 2;
    q->n_expansion_window = q->n_closed_part = 2;
}

static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_comb_request *q = input;
    gc_comb_request *e = echo_input;
    (void)result;
    e->has_pressure_unit = !q->from_csv;
}

/* Length of the valid UTF-8 sequence at s (first byte >= 0x80, n bytes
 * left): no overlong forms, no surrogates, nothing above U+10FFFF; 0 when
 * invalid or cut short. */
static size_t utf8_len(const unsigned char *s, size_t n)
{
    size_t k = s[0] >= 0xF0 ? 4 : s[0] >= 0xE0 ? 3 : s[0] >= 0xC2 ? 2 : 0;
    if (k == 0 || s[0] > 0xF4 || k > n)
        return 0;
    for (size_t i = 1; i < k; i++)
        if ((s[i] & 0xC0) != 0x80)
            return 0;
    if ((s[0] == 0xE0 && s[1] < 0xA0) || (s[0] == 0xED && s[1] > 0x9F) ||
        (s[0] == 0xF0 && s[1] < 0x90) || (s[0] == 0xF4 && s[1] > 0x8F))
        return 0;
    return k;
}

/* A column name as the answer shows it: valid UTF-8 (a column name is cut
 * at GC_HEATREL_LABEL_LEN bytes, maybe inside a character), every invalid
 * byte and control character replaced by '?'. */
static void clean_label(char *s)
{
    size_t n = strlen(s);
    for (size_t i = 0; i < n;) {
        unsigned char c = (unsigned char)s[i];
        size_t k = c >= 0x80 ? utf8_len((const unsigned char *)s + i, n - i) : 1;
        if (k == 0 || c < 0x20 || c == 0x7F) {
            s[i++] = '?';
            continue;
        }
        i += k;
    }
}

/* A text/csv body (heatrel.h's format): the recording in deg and Pa. */
static int csv_body(void *input, const char *text, size_t len, gc_report *rep)
{
    gc_comb_request *q = input;
    gc_heatrel_traces t;
    gc_heatrel_csv_error ce;
    if (q->has_angle || q->has_cycles) {
        rep->input = 1;
        return gc_report_error(rep, GC_ERR_INVALID, q->has_angle ? F_ANGLE : F_CYCLES, -1,
                               "does not apply with a text/csv body, which holds the recording");
    }
    int rc = gc_heatrel_csv_parse(text, len, &t, &ce);
    if (rc != GC_OK) {
        int id = ce.column == 1 ? F_ANGLE : F_CYCLES;
        int index = ce.column >= 2 ? ce.column - 2 : -1;
        rep->input = ce.code == GC_HEATREL_CSV_NOT_INCREASING || ce.code == GC_HEATREL_CSV_TOO_SHORT ||
                     ce.code == GC_HEATREL_CSV_TOO_LONG || ce.code == GC_HEATREL_CSV_TOO_LARGE;
        if (ce.code == GC_HEATREL_CSV_NOMEM)
            return gc_report_error(rep, GC_ERR_NOMEM, -1, -1, "out of memory");
        return gc_report_error(rep, GC_ERR_INVALID, ce.column > 0 ? id : -1, index,
                               "CSV body: %s", ce.message);
    }
    q->angle = t.angle_deg;
    q->P = t.P_Pa;
    q->n_angle = q->n_per_cycle = t.n_samples;
    q->n_cycles = t.n_cycles;
    q->has_angle = q->has_cycles = q->from_csv = 1;
    for (int c = 0; c < t.n_cycles; c++) {
        memcpy(q->label[c], t.label[c], GC_HEATREL_LABEL_LEN);
        q->label[c][GC_HEATREL_LABEL_LEN - 1] = '\0';
        clean_label(q->label[c]);
    }
    free(t.label);
    return GC_OK;
}

static const char *const includes[] = { "trace", NULL };

const gc_preset gc_preset_combustion = {
    .name = "combustion",
    .label = "measured_combustion",
    .title = "Combustion analysis of a cylinder-pressure recording",
    .description = "Many consecutive cycles of one cylinder's pressure (JSON, or a text/csv "
                   "body: crank angle, then one pressure column per cycle, units in the "
                   "header) reduced to pegging offsets, a phasing check, apparent (net) and "
                   "gross heat release with k from the gas models at the mean gas "
                   "temperature, burn points (CA10, CA50, CA90 and any requested), burn "
                   "durations, peak pressure, pressure-rise rate, ringing intensity, "
                   "combustion efficiency, a per-cycle table and statistics over cycles (COV "
                   "of IMEP, LNV, misfire and partial-burn flags), with the ensemble-average "
                   "cycle beside the ideal Otto cycle.",
    .kind = GC_PRESET_REDUCTION,
    .heavy = 1,
    .fields = fields,
    .n_fields = F_COUNT,
    .outputs = gc__comb_outputs,
    .n_outputs = GC_COMB_N_OUTPUTS,
    .input_size = sizeof(gc_comb_request),
    .result_size = sizeof(gc_comb_result),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .diagrams = gc__comb_diagrams,
    .svg = gc__comb_svg,
    .includes = includes,
    .large_body = 1,
    .max_json_values = GC_COMB_MAX_JSON_VALUES,
    .csv_body = csv_body,
};

const gc_preset *gc__comb_preset(void)
{
    return &gc_preset_combustion;
}
