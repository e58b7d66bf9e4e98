/*
 * trace.c — the cylinder-pressure trace reduction declared as a preset
 * (measured.h, preset.h): /v1/measured/pressure-trace. A trace over one
 * cycle ("trace": [[crank angle deg, pressure], ...] with the engine's
 * geometry, or "pv_trace": [[volume, pressure], ...]) is reduced by
 * gc_measured_trace_reduce to indicated work (gross, pumping, net), IMEP,
 * PMEP, power, peak pressure, polytropic exponents and the comparison with
 * the ideal Otto cycle. GET takes a trace as one comma list of alternating
 * values (angle,pressure,angle,pressure,...).
 *
 * Units: the samples are plain numbers, angles in degrees, pressures in
 * pressure_unit (default kPa), volumes in volume_unit (default L); every
 * other input a number in its quantity's default unit or a string with a
 * unit. Checks between inputs (422, "Invalid request fields"): a trace is
 * needed; 2 or 4 strokes; known units; fuel or fuel_heating_value; a
 * crank-angle trace needs stroke, rod, compression ratio and bore or
 * displacement (one of them); a P-V loop takes none of the geometry, fit
 * windows or TDC angle.
 *
 * Sensor corrections (applied to every sample before the reduction, so an
 * in-process caller such as /v1/uncertainty can perturb them like any
 * input): P = pressure_gain x P_sample + pressure_offset (defaults 1 and 0:
 * the trace as given). The crank-angle phasing is tdc_angle (firing TDC on
 * the trace's angle axis) and a volume error is one of compression_ratio
 * (the clearance volume), bore, stroke or connecting_rod_length.
 *
 * Diagram (format=svg&diagram=Pv, scale=log for log P - log V): the measured
 * loop over the cylinder volume with the ideal Otto cycle of the document's
 * "bounds" overlaid (indicator.h; overlay=none leaves it out).
 */
#include "core/presets/indicator.h"
#include "core/presets/presets.h"
#include "gascycle/measured.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

enum {
    F_REQUEST = 0, F_TRACE, F_PV_TRACE, F_PRESSURE_UNIT, F_VOLUME_UNIT, F_BORE, F_STROKE, F_ROD,
    F_COMPRESSION_RATIO, F_DISPLACEMENT, F_CYLINDERS, F_STROKES, F_SPEED, F_TDC_ANGLE,
    F_COMPRESSION_WINDOW, F_EXPANSION_WINDOW, F_INTAKE_TEMPERATURE, F_INTAKE_PRESSURE, F_GAS,
    F_FUEL, F_FUEL_HEATING_VALUE, F_FUEL_PER_CYCLE, F_GAS_CP, F_GAS_K, F_PRESSURE_GAIN,
    F_PRESSURE_OFFSET, F_COUNT
};

#define IN(member) offsetof(gc_trace_request, member)
#define GIVEN(member) (offsetof(gc_trace_request, member) + 1)
static const char *const gas_models[] = { "air", "cold", NULL };
static const char *const trace_words[] = { "crank angle", "angle", "pressure", NULL };
static const char *const pv_words[] = { "volume", "volume", "pressure", NULL };
static const char *const window_sentences[] = {
    "must be two crank angles [start, end] from firing TDC (GET: \"start,end\")",
    "must run from a smaller to a larger angle, within -180..180 degrees from firing TDC",
    NULL };

#define OPT(id, nm, q, lo, hi, member, desc)                                                 \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q,                                \
             .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .min = (lo),   \
             .max = (hi), .offset = IN(member), .given = GIVEN(has_##member),                \
             .description = desc }
#define PAIRS(id, nm, words, has, desc)                                                      \
    [id] = { .name = nm, .type = GC_FT_PAIR_LIST, .flags = GC_FF_OPTIONAL, .names = words,     \
             .offset = IN(x), .aux = GIVEN(P), .count = GIVEN(n), .given = GIVEN(has),        \
             .min_items = GC_MEASURED_TRACE_MIN, .max_items = GC_MEASURED_TRACE_MAX,          \
             .items = "trace samples carry no unit: angles in degrees, pressures in "         \
                      "pressure_unit", .description = desc }
#define WINDOW(id, nm, member, desc)                                                         \
    [id] = { .name = nm, .type = GC_FT_NUMBER_LIST, .quantity = GC_Q_ANGLE,                   \
             .flags = GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, .min = -PI - 1e-12,           \
             .max = PI + 1e-12, .names = window_sentences, .offset = IN(member),              \
             .count = GIVEN(n_##member), .given = GIVEN(has_##member), .min_items = 2,         \
             .max_items = 2, .description = desc }

static const gc_field fields[F_COUNT] = {
    [F_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                    .description = "A cylinder-pressure trace over one cycle." },
    PAIRS(F_TRACE, "trace", trace_words, has_trace,
          "[[crank angle in degrees, pressure], ...] over one cycle, angles increasing; give "
          "this or pv_trace."),
    PAIRS(F_PV_TRACE, "pv_trace", pv_words, has_pv,
          "[[volume, pressure], ...] over one cycle in order; give this or trace."),
    [F_PRESSURE_UNIT] = { .name = "pressure_unit", .type = GC_FT_STRING, .flags = GC_FF_ECHO_GIVEN,
                          .def_name = "kPa", .offset = IN(pressure_unit),
                          .given = GIVEN(echo_pressure_unit),
                          .description = "Unit of the trace's pressures (absolute)." },
    [F_VOLUME_UNIT] = { .name = "volume_unit", .type = GC_FT_STRING, .flags = GC_FF_ECHO_GIVEN,
                        .def_name = "L", .offset = IN(volume_unit),
                        .given = GIVEN(echo_volume_unit),
                        .description = "Unit of a pv_trace's volumes." },
    OPT(F_BORE, "bore", GC_Q_LENGTH, 0.0, 10.0, bore, "Cylinder bore (or give displacement)."),
    OPT(F_STROKE, "stroke", GC_Q_LENGTH, 0.0, 10.0, stroke, "Piston stroke."),
    OPT(F_ROD, "connecting_rod_length", GC_Q_LENGTH, 0.0, 10.0, rod,
        "Connecting rod, centre to centre."),
    OPT(F_COMPRESSION_RATIO, "compression_ratio", GC_Q_RATIO, 1.0, 100.0, compression_ratio,
        "Geometric compression ratio."),
    OPT(F_DISPLACEMENT, "displacement", GC_Q_VOLUME, 0.0, 100.0, displacement,
        "Swept volume of the whole engine (instead of the bore)."),
    [F_CYLINDERS] = { .name = "cylinders", .type = GC_FT_INTEGER, .flags = GC_FF_MIN | GC_FF_MAX,
                      .def = 1, .min = 1, .max = 64, .offset = IN(cylinders),
                      .description = "Number of cylinders." },
    [F_STROKES] = { .name = "strokes_per_cycle", .type = GC_FT_INTEGER,
                    .flags = GC_FF_MIN | GC_FF_MAX, .def = 4, .min = 2, .max = 4,
                    .offset = IN(strokes), .description = "Strokes per cycle: 2 or 4." },
    OPT(F_SPEED, "speed", GC_Q_ROTATIONAL_SPEED, 0.0, 1000.0, speed,
        "Crankshaft speed (gives the indicated power)."),
    [F_TDC_ANGLE] = { .name = "tdc_angle", .type = GC_FT_NUMBER, .quantity = GC_Q_ANGLE,
                      .flags = GC_FF_ECHO_GIVEN | GC_FF_MIN | GC_FF_MAX, .min = -4.0 * PI,
                      .max = 4.0 * PI, .offset = IN(tdc_angle), .given = GIVEN(echo_tdc_angle),
                      .description = "Crank angle of firing TDC in the trace's angles." },
    WINDOW(F_COMPRESSION_WINDOW, "compression_window", compression_window,
           "Fit window of the compression exponent, from firing TDC (default -100..-30)."),
    WINDOW(F_EXPANSION_WINDOW, "expansion_window", expansion_window,
           "Fit window of the expansion exponent, from firing TDC (default 40..100)."),
    [F_INTAKE_TEMPERATURE] = { .name = "intake_temperature", .type = GC_FT_NUMBER,
                               .quantity = GC_Q_AMBIENT_TEMPERATURE,
                               .flags = GC_FF_MIN | GC_FF_MAX, .def = 288.15, .min = 200.0,
                               .max = 1000.0, .offset = IN(intake_temperature),
                               .given = GIVEN(has_intake_temperature),
                               .description = "Trapped gas temperature at the start of "
                               "compression (a warning says when it is assumed)." },
    OPT(F_INTAKE_PRESSURE, "intake_pressure", GC_Q_PRESSURE, 0.0, 1.0e8, intake_pressure,
        "Pressure at the start of compression (default: the trace at BDC)."),
    [F_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "air",
                .offset = IN(gas), .given = GIVEN(has_gas),
                .description = "Trapped gas model, for the trapped mass and the ideal Otto "
                "cycle: \"air\" or \"cold\"." },
    [F_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL, .offset = IN(fuel),
                 .aux = GIVEN(fuel_spec), .given = GIVEN(has_fuel),
                 .description = "The fuel (its LHV), for the indicated efficiency." },
    OPT(F_FUEL_HEATING_VALUE, "fuel_heating_value", GC_Q_SPECIFIC_ENERGY, 1.0e6, 1.5e8,
        fuel_heating_value, "The fuel's lower heating value when no fuel is named."),
    OPT(F_FUEL_PER_CYCLE, "fuel_per_cycle", GC_Q_MASS, 0.0, 1.0, fuel_per_cycle,
        "Fuel mass per cylinder per cycle."),
    [F_GAS_CP] = { .name = "cp", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                   .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                   .def = 1005.0, .min = 100.0, .max = 20000.0,
                   .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                   .description = "Cold model: constant specific heat at constant pressure." },
    [F_GAS_K] = { .name = "k", .parent = F_GAS, .variant = 1, .type = GC_FT_NUMBER,
                  .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                  .def = 1.4, .min = 1.0, .max = 1.7, .offset = IN(gas) + offsetof(gc_gas, k_cold),
                  .description = "Cold model: constant ratio of specific heats cp/cv." },
    [F_PRESSURE_GAIN] = { .name = "pressure_gain", .type = GC_FT_NUMBER, .quantity = GC_Q_RATIO,
                          .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .def = 1.0,
                          .min = 0.0, .max = 10.0, .offset = IN(pressure_gain),
                          .description = "Pressure-sensor gain applied to every sample before "
                          "the reduction: P = pressure_gain x P_sample + pressure_offset (1: the "
                          "trace as given). A calibration correction, and the input whose "
                          "uncertainty carries a gain error into /v1/uncertainty." },
    [F_PRESSURE_OFFSET] = { .name = "pressure_offset", .type = GC_FT_NUMBER,
                            .quantity = GC_Q_PRESSURE, .flags = GC_FF_MIN | GC_FF_MAX, .def = 0.0,
                            .min = -1.0e7, .max = 1.0e7, .offset = IN(pressure_offset),
                            .description = "Pressure added to every sample after the gain "
                            "(0: the trace as given; a pegging correction). A sample that "
                            "becomes zero or negative is refused." },
};

/* ---- checks between inputs ---------------------------------------------------------------- */

static void err(gc_report *rep, int field, const char *msg)
{
    gc_report_error(rep, GC_ERR_INVALID, field, -1, "%s", msg);
}

/* A P-V loop takes none of the crank-angle inputs. */
static void check_pv(const gc_trace_request *q, gc_report *rep)
{
    const int rows[] = { F_BORE, F_STROKE, F_ROD, F_COMPRESSION_RATIO, F_DISPLACEMENT };
    const int given[] = { q->has_bore, q->has_stroke, q->has_rod, q->has_compression_ratio,
                          q->has_displacement };
    for (size_t i = 0; i < sizeof rows / sizeof rows[0]; i++)
        if (given[i])
            err(rep, rows[i], "does not apply to a pv_trace, whose volumes are given");
    if (q->has_compression_window || q->has_expansion_window)
        err(rep, q->has_compression_window ? F_COMPRESSION_WINDOW : F_EXPANSION_WINDOW,
            "does not apply to a pv_trace: its fits use the branch samples between 20 % and "
            "70 % of the swept volume");
    if (q->tdc_angle != 0.0)
        err(rep, F_TDC_ANGLE, "does not apply to a pv_trace");
}

/* A crank-angle trace needs the geometry. */
static void check_angles(const gc_trace_request *q, gc_report *rep)
{
    if (!q->has_stroke)
        err(rep, F_STROKE, "is required with a crank-angle trace");
    if (!q->has_rod)
        err(rep, F_ROD, "is required with a crank-angle trace");
    if (!q->has_compression_ratio)
        err(rep, F_COMPRESSION_RATIO, "is required with a crank-angle trace");
    if (q->has_bore && q->has_displacement)
        err(rep, F_DISPLACEMENT, "give either bore or displacement, not both");
    else if (!q->has_bore && !q->has_displacement)
        err(rep, F_BORE, "is required with a crank-angle trace (or give displacement)");
}

/* The checks; the unit factors of the samples into fP, fV. */
static void check(const gc_trace_request *q, double *fP, double *fV, gc_report *rep)
{
    gc_error uerr;
    if (!q->x)
        err(rep, F_TRACE, "is required: give trace ([[crank angle, pressure], ...]) or "
                          "pv_trace ([[volume, pressure], ...])");
    if (q->strokes != 2 && q->strokes != 4)
        err(rep, F_STROKES, "must be 2 or 4");
    if (gc_units_to_si(GC_Q_PRESSURE, 1.0, q->pressure_unit, fP, &uerr) != GC_OK)
        err(rep, F_PRESSURE_UNIT, uerr.message);
    if (gc_units_to_si(GC_Q_VOLUME, 1.0, q->volume_unit, fV, &uerr) != GC_OK)
        err(rep, F_VOLUME_UNIT, uerr.message);
    if (q->has_fuel && q->has_fuel_heating_value)
        err(rep, F_FUEL_HEATING_VALUE, "give either fuel or fuel_heating_value, not both");
    if (q->has_pv)
        check_pv(q, rep);
    else if (q->x)
        check_angles(q, rep);
}

/* ---- the reduction ---------------------------------------------------------------------------- */

static void reduction_input(const gc_trace_request *q, gc_measured_trace_input *in)
{
    memset(in, 0, sizeof *in);
    in->pv = q->has_pv;
    in->n = q->n;
    in->geometry.stroke = q->has_stroke ? q->stroke : 0.0;
    in->geometry.rod_length = q->has_rod ? q->rod : 0.0;
    in->geometry.compression_ratio = q->has_compression_ratio ? q->compression_ratio : 0.0;
    in->geometry.bore = q->has_bore ? q->bore : 0.0;
    if (!in->pv && !q->has_bore)
        in->geometry.bore = sqrt(4.0 * (q->displacement / q->cylinders) / (PI * q->stroke));
    in->strokes = q->strokes;
    in->tdc_angle = q->tdc_angle;
    in->cylinders = q->cylinders;
    in->speed = q->has_speed ? q->speed : 0.0;
    memcpy(in->compression_window, q->compression_window, sizeof in->compression_window);
    memcpy(in->expansion_window, q->expansion_window, sizeof in->expansion_window);
    in->gas = q->gas;
    in->intake_temperature = q->intake_temperature;
    in->intake_pressure = q->has_intake_pressure ? q->intake_pressure : 0.0;
    in->fuel_per_cycle = q->has_fuel_per_cycle ? q->fuel_per_cycle : 0.0;
    in->fuel_heating_value = q->has_fuel ? q->fuel.LHV_J_per_kg
                           : q->has_fuel_heating_value ? q->fuel_heating_value : 0.0;
}

/* The samples in SI (rad or m3, Pa), reduced into x->r. */
static int reduce(const gc_trace_request *q, double fP, double fV, gc_trace_reduction *x,
                  gc_error *e)
{
    double *xs = malloc((size_t)q->n * sizeof *xs), *Ps = malloc((size_t)q->n * sizeof *Ps);
    if (!xs || !Ps) {
        free(xs);
        free(Ps);
        return gc_error_set(e, GC_ERR_NOMEM, "", "out of memory");
    }
    for (int i = 0; i < q->n; i++) {
        Ps[i] = q->pressure_gain * (q->P[i] * fP) + q->pressure_offset;
        xs[i] = q->x[i] * (q->has_pv ? fV : PI / 180.0);
    }
    reduction_input(q, &x->in);
    x->in.x = xs;
    x->in.P = Ps;
    int rc = gc_measured_trace_reduce(&x->in, &x->r, e);
    x->in.x = x->in.P = NULL;
    free(xs);
    free(Ps);
    return rc;
}

static void figures(const gc_trace_request *q, gc_trace_reduction *x)
{
    const gc_measured_trace_result *r = &x->r;
    x->pv = q->has_pv;
    x->angles = !q->has_pv;
    x->title = q->has_pv ? "Measured P-V loop" : "Measured cylinder-pressure trace";
    x->cylinders = q->cylinders;
    x->strokes = q->strokes;
    x->samples = q->n;
    x->engine_displacement = r->displacement * q->cylinders;
    x->has_ideal_and_fuel = r->has_ideal && r->has_fuel;
    x->efficiency_gap = r->ideal_efficiency - r->efficiency_gross;
    x->heat_source = r->heat_from_fuel ? "fuel" : "peak_mean_temperature";
    x->shortfall_basis = r->has_fuel ? "gross indicated efficiency over the ideal efficiency"
                                     : "gross indicated work over the ideal cycle's work";
}

/* ---- the descriptor's hooks ------------------------------------------------------------------- */

static void init(void *input)
{
    gc_trace_request *q = input;
    q->compression_window[0] = -100.0 * PI / 180.0;
    q->compression_window[1] = -30.0 * PI / 180.0;
    q->expansion_window[0] = 40.0 * PI / 180.0;
    q->expansion_window[1] = 100.0 * PI / 180.0;
    q->n_compression_window = q->n_expansion_window = 2;
}

static void warnings(const gc_trace_request *q, const gc_trace_reduction *x, gc_report *rep)
{
    for (int i = 0; i < x->r.n_warnings; i++) {
        int idx[2];
        const char *path = x->r.warnings[i].field;
        int id = path[0] ? gc_preset_field_find(gc_trace_preset(), path, idx) : -1;
        gc_report_warn(rep, x->r.warnings[i].code, id, -1, "%s", x->r.warnings[i].message);
    }
    if (!q->has_intake_temperature)
        gc_report_warn(rep, "assumed_intake_temperature", F_INTAKE_TEMPERATURE, -1,
                       "no intake_temperature given: 288.15 K assumed for the trapped mass and "
                       "the ideal cycle");
    if (q->has_gas && q->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", F_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    gc_report_validity(rep, &x->r.validity, -1);
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_trace_request *q = input;
    gc_trace_reduction *x = result;
    double fP = 0.0, fV = 0.0;
    check(q, &fP, &fV, rep);
    if (rep->n_errors) {
        rep->input = 1;
        return rep->errors[0].code;
    }
    gc_error e;
    gc_error_clear(&e);
    int rc = reduce(q, fP, fV, x, &e);
    if (rc != GC_OK) {
        if (e.field_id <= 0 && !e.field[0])
            e.field_id = q->has_pv ? F_PV_TRACE : F_TRACE;
        return gc_report_add(rep, &e);
    }
    figures(q, x);
    warnings(q, x, rep);
    return GC_OK;
}

/* The echo: the inputs of the trace's kind (a P-V loop: its volume unit;
 * a crank-angle trace: its pressure unit, TDC angle and fit windows). */
static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_trace_request *q = input;
    gc_trace_request *e = echo_input;
    (void)result;
    e->echo_pressure_unit = !q->has_pv;
    e->echo_volume_unit = q->has_pv;
    e->echo_tdc_angle = !q->has_pv;
    e->has_compression_window = e->has_expansion_window = !q->has_pv;
}

static const char *title_of(const void *input, const void *result)
{
    (void)input;
    return ((const gc_trace_reduction *)result)->title;
}

/* ---- the P-V diagram ------------------------------------------------------------------------------ */

static const char *const diagrams[] = { "Pv", NULL };

/* The samples as cylinder volumes and pressures (SI) into V, P. */
static int samples_si(const gc_trace_request *q, const gc_trace_reduction *x, double *V,
                      double *P, gc_error *err)
{
    double fP = 0.0, fV = 0.0;
    if (gc_units_to_si(GC_Q_PRESSURE, 1.0, q->pressure_unit, &fP, err) != GC_OK ||
        gc_units_to_si(GC_Q_VOLUME, 1.0, q->volume_unit, &fV, err) != GC_OK)
        return GC_ERR_INVALID;
    for (int i = 0; i < q->n; i++) {
        P[i] = q->P[i] * fP;
        V[i] = q->has_pv ? q->x[i] * fV
                         : gc_measured_volume(&x->in.geometry,
                                              q->x[i] * PI / 180.0 - q->tdc_angle, NULL);
    }
    return GC_OK;
}

static int svg(const void *input, const void *result, const char *diagram,
               const gc_diagram_options *opt, char **out, size_t *len, gc_error *err)
{
    const gc_trace_request *q = input;
    const gc_trace_reduction *x = result;
    (void)diagram;   /* the one diagram: Pv */
    double *V = malloc((size_t)q->n * sizeof *V), *P = malloc((size_t)q->n * sizeof *P);
    int rc = V && P ? samples_si(q, x, V, P, err)
                    : gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    gc__ind_ideal ideal;
    memset(&ideal, 0, sizeof ideal);
    if (rc == GC_OK && x->r.has_ideal) {
        ideal.gas = x->in.gas;
        ideal.T1_K = x->r.intake_temperature;
        ideal.P1_Pa = x->r.intake_pressure;
        ideal.compression_ratio = x->r.compression_ratio;
        ideal.heat_J_per_kg = x->r.ideal_heat_added;
        ideal.mass_kg = x->r.trapped_mass;
        gc_error ierr;
        gc_error_clear(&ierr);
        gc__ind_ideal_eval(&ideal, &ierr);   /* without it, the loop alone */
    }
    gc__ind_pv pv = { x->title, q->has_pv ? "measured loop" : "measured trace", q->n, V, P,
                      &ideal, ideal.ok ? "Dashed: the ideal Otto cycle at the same compression "
                      "ratio and intake state (bounds.ideal)." : NULL };
    if (rc == GC_OK)
        rc = gc__ind_pv_svg(&pv, opt, out, len, err);
    free(V);
    free(P);
    return rc;
}

/* ---- outputs ----------------------------------------------------------------------------------- */

#define R_(m) offsetof(gc_trace_reduction, m)
#define P_(m) (offsetof(gc_trace_reduction, m) + 1)
#define RES(m) (offsetof(gc_trace_reduction, r) + offsetof(gc_measured_trace_result, m))
#define PRES(m) (RES(m) + 1)
#define GEO(m) (offsetof(gc_trace_reduction, in) + offsetof(gc_measured_trace_input, geometry) + \
                offsetof(gc_measured_geometry, m))
#define Q(nm, par, q, off, pres, desc)                                                       \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .quantity = q, .has_quantity = 1,     \
      .offset = off, .present = (pres), .description = desc }
#define N(nm, par, off, pres, desc)                                                          \
    { .name = nm, .parent = par, .type = GC_OT_NUMBER, .offset = off, .present = (pres),     \
      .description = desc }
#define I(nm, par, off, desc)                                                                \
    { .name = nm, .parent = par, .type = GC_OT_INTEGER, .offset = off, .description = desc }
#define FIT(par, m)                                                                          \
    N("n", par, RES(m.n), 0, "Polytropic exponent of the fit."),                             \
    N("r_squared", par, RES(m.r_squared), 0, "Coefficient of determination of the fit."),     \
    I("samples", par, RES(m.samples), "Samples in the window."),                             \
    Q("window_start", par, GC_Q_ANGLE, RES(m.window[0]), P_(angles),                         \
      "Start of the window, from firing TDC."),                                              \
    Q("window_end", par, GC_Q_ANGLE, RES(m.window[1]), P_(angles),                           \
      "End of the window, from firing TDC."),                                                \
    N("volume_fraction_start", par, RES(m.window[0]), P_(pv),                                \
      "Start of the window, as a fraction of the swept volume (P-V loops)."),                \
    N("volume_fraction_end", par, RES(m.window[1]), P_(pv),                                  \
      "End of the window, as a fraction of the swept volume (P-V loops).")

enum { ENGINE = 0, TRACE = 10, IND = 16, POLY = 31, COMP = 32, EXP = 40, SUMMARY = 48,
       BOUNDS = 59, IDEAL = 60, SHORT = 73, N_OUTPUTS = 79 };

static const gc_output outputs[N_OUTPUTS] = {
    [ENGINE] = { .name = "engine", .parent = -1, .type = GC_OT_OBJECT,
                 .description = "The engine's geometry as used." },
    Q("bore", ENGINE, GC_Q_LENGTH, GEO(bore), P_(angles), "Cylinder bore."),
    Q("stroke", ENGINE, GC_Q_LENGTH, GEO(stroke), P_(angles), "Piston stroke."),
    Q("connecting_rod_length", ENGINE, GC_Q_LENGTH, GEO(rod_length), P_(angles),
      "Connecting rod length."),
    N("compression_ratio", ENGINE, RES(compression_ratio), 0,
      "Compression ratio (a P-V loop: its largest over its smallest volume)."),
    Q("cylinder_displacement", ENGINE, GC_Q_VOLUME, RES(displacement), 0,
      "Swept volume of one cylinder."),
    Q("clearance_volume", ENGINE, GC_Q_VOLUME, RES(clearance), 0, "Clearance volume."),
    Q("engine_displacement", ENGINE, GC_Q_VOLUME, R_(engine_displacement), 0,
      "Swept volume of all cylinders."),
    I("cylinders", ENGINE, R_(cylinders), "Cylinders."),
    I("strokes_per_cycle", ENGINE, R_(strokes), "Strokes per cycle."),
    [TRACE] = { .name = "trace", .parent = -1, .type = GC_OT_OBJECT,
                .description = "The trace as integrated." },
    I("samples", TRACE, R_(samples), "Samples."),
    Q("V_min", TRACE, GC_Q_VOLUME, RES(V_min), 0, "Smallest volume."),
    Q("V_max", TRACE, GC_Q_VOLUME, RES(V_max), 0, "Largest volume."),
    N("loop_mismatch", TRACE, RES(loop_mismatch), 0,
      "|P_last - P_first| / the larger of the two."),
    { .name = "integration", .parent = TRACE, .type = GC_OT_CONST,
      .text = "trapezoid rule on P dV over the samples, last sample joined to the first",
      .description = "How the loop is integrated." },
    [IND] = { .name = "indicated", .parent = -1, .type = GC_OT_OBJECT,
              .description = "Indicated figures per cylinder and cycle (powers: all "
              "cylinders)." },
    Q("work_net", IND, GC_Q_ENERGY, RES(work_net), 0, "Net indicated work (the loop)."),
    Q("work_gross", IND, GC_Q_ENERGY, RES(work_gross), 0,
      "Gross work (compression and expansion strokes)."),
    Q("work_pumping", IND, GC_Q_ENERGY, RES(work_pumping), 0,
      "Pumping work (exhaust and intake strokes)."),
    Q("imep_net", IND, GC_Q_PRESSURE_DIFFERENCE, RES(imep_net), 0, "Net indicated mean effective pressure."),
    Q("imep_gross", IND, GC_Q_PRESSURE_DIFFERENCE, RES(imep_gross), 0, "Gross IMEP."),
    Q("pmep", IND, GC_Q_PRESSURE_DIFFERENCE, RES(pmep), 0, "Pumping mean effective pressure."),
    Q("power_net", IND, GC_Q_POWER, RES(power_net), PRES(has_power), "Net indicated power."),
    Q("power_gross", IND, GC_Q_POWER, RES(power_gross), PRES(has_power),
      "Gross indicated power."),
    Q("peak_pressure", IND, GC_Q_PRESSURE, RES(P_max), 0, "Highest sample pressure."),
    Q("peak_pressure_angle", IND, GC_Q_ANGLE, RES(angle_P_max), P_(angles),
      "Its crank angle from firing TDC."),
    Q("peak_pressure_volume", IND, GC_Q_VOLUME, RES(V_P_max), 0, "Its volume."),
    Q("fuel_energy", IND, GC_Q_ENERGY, RES(fuel_energy), PRES(has_fuel),
      "Fuel energy per cylinder and cycle (LHV)."),
    N("efficiency_gross", IND, RES(efficiency_gross), PRES(has_fuel),
      "Gross indicated efficiency."),
    N("efficiency_net", IND, RES(efficiency_net), PRES(has_fuel), "Net indicated efficiency."),
    [POLY] = { .name = "polytropic", .parent = -1, .type = GC_OT_OBJECT,
               .description = "Polytropic exponents fitted to the compression and expansion." },
    [COMP] = { .name = "compression", .parent = POLY, .type = GC_OT_OBJECT,
               .description = "The compression fit." },
    FIT(COMP, compression),
    [EXP] = { .name = "expansion", .parent = POLY, .type = GC_OT_OBJECT,
              .description = "The expansion fit." },
    FIT(EXP, expansion),
    [SUMMARY] = { .name = "summary", .parent = -1, .type = GC_OT_OBJECT, .flags = GC_OF_CSV_ROW,
                  .description = "The main figures (the one-row table of format=csv)." },
    Q("imep_net", SUMMARY, GC_Q_PRESSURE_DIFFERENCE, RES(imep_net), 0, "Net IMEP."),
    Q("imep_gross", SUMMARY, GC_Q_PRESSURE_DIFFERENCE, RES(imep_gross), 0, "Gross IMEP."),
    Q("work_net", SUMMARY, GC_Q_ENERGY, RES(work_net), 0, "Net indicated work."),
    Q("power_net", SUMMARY, GC_Q_POWER, RES(power_net), PRES(has_power), "Net indicated power."),
    Q("peak_pressure", SUMMARY, GC_Q_PRESSURE, RES(P_max), 0, "Peak pressure."),
    N("compression_n", SUMMARY, RES(compression.n), 0, "Compression exponent."),
    N("expansion_n", SUMMARY, RES(expansion.n), 0, "Expansion exponent."),
    N("indicated_efficiency", SUMMARY, RES(efficiency_gross), PRES(has_fuel),
      "Gross indicated efficiency."),
    N("ideal_efficiency", SUMMARY, RES(ideal_efficiency), PRES(has_ideal),
      "The ideal Otto cycle's efficiency."),
    N("fraction_of_ideal", SUMMARY, RES(fraction_of_ideal), PRES(has_ideal),
      "Gross indicated over ideal efficiency (without fuel data: over the ideal work)."),
    [BOUNDS] = { .name = "bounds", .parent = -1, .type = GC_OT_OBJECT, .present = PRES(has_ideal),
                 .description = "The ideal Otto cycle at the same compression ratio and "
                 "intake state." },
    [IDEAL] = { .name = "ideal", .parent = BOUNDS, .type = GC_OT_OBJECT,
                .description = "The ideal Otto cycle." },
    { .name = "cycle", .parent = IDEAL, .type = GC_OT_CONST, .text = "otto",
      .description = "The ideal cycle." },
    { .name = "heat_source", .parent = IDEAL, .type = GC_OT_TEXT, .offset = R_(heat_source),
      .description = "fuel (its energy) or peak_mean_temperature (heated to the trace's "
      "highest mean gas temperature)." },
    Q("intake_temperature", IDEAL, GC_Q_AMBIENT_TEMPERATURE, RES(intake_temperature), 0,
      "Intake temperature used."),
    Q("intake_pressure", IDEAL, GC_Q_PRESSURE, RES(intake_pressure), 0, "Intake pressure used."),
    Q("trapped_mass", IDEAL, GC_Q_MASS, RES(trapped_mass), 0, "Trapped mass."),
    Q("peak_mean_temperature", IDEAL, GC_Q_TEMPERATURE, RES(T_mean_max), 0,
      "The trace's highest mean gas temperature."),
    Q("heat_added", IDEAL, GC_Q_SPECIFIC_ENERGY, RES(ideal_heat_added), 0, "Heat added."),
    N("thermal_efficiency", IDEAL, RES(ideal_efficiency), 0, "Thermal efficiency."),
    Q("work", IDEAL, GC_Q_ENERGY, RES(ideal_work), 0, "Work per cycle."),
    Q("mean_effective_pressure", IDEAL, GC_Q_PRESSURE_DIFFERENCE, RES(ideal_mep), 0,
      "Mean effective pressure."),
    Q("peak_pressure", IDEAL, GC_Q_PRESSURE, RES(ideal_peak_pressure), 0, "Peak pressure."),
    Q("peak_temperature", IDEAL, GC_Q_TEMPERATURE, RES(ideal_peak_temperature), 0,
      "Peak temperature."),
    [SHORT] = { .name = "shortfall", .parent = -1, .type = GC_OT_OBJECT, .present = PRES(has_ideal),
                .description = "The shortfall against the ideal Otto cycle." },
    N("indicated_efficiency", SHORT, RES(efficiency_gross), P_(has_ideal_and_fuel),
      "Gross indicated efficiency."),
    N("efficiency_gap", SHORT, R_(efficiency_gap), P_(has_ideal_and_fuel),
      "Ideal less gross indicated efficiency."),
    N("ideal_efficiency", SHORT, RES(ideal_efficiency), 0, "The ideal efficiency."),
    N("fraction_of_ideal", SHORT, RES(fraction_of_ideal), 0, "Fraction of the ideal."),
    { .name = "basis", .parent = SHORT, .type = GC_OT_TEXT, .offset = R_(shortfall_basis),
      .description = "What the fraction compares." },
};

const gc_preset gc_preset_trace = {
    .name = "pressure_trace",
    .segment = "pressure-trace",
    .label = "measured_trace",
    .title = "Measured cylinder-pressure trace",
    .description = "A cylinder-pressure trace over one cycle (crank angle and pressure with "
                   "the engine's geometry, or volume and pressure) reduced to gross, pumping "
                   "and net indicated work, IMEP, PMEP, indicated power, peak pressure and "
                   "fitted polytropic exponents, next to the ideal Otto cycle at the same "
                   "compression ratio and intake state.",
    .kind = GC_PRESET_REDUCTION,
    .fields = fields,
    .n_fields = F_COUNT,
    .outputs = outputs,
    .n_outputs = N_OUTPUTS,
    .input_size = sizeof(gc_trace_request),
    .result_size = sizeof(gc_trace_reduction),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .title_of = title_of,
    .diagrams = diagrams,
    .svg = svg,
};

const gc_preset *gc_trace_preset(void)
{
    return &gc_preset_trace;
}
