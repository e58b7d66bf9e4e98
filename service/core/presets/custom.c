/*
 * custom.c — the custom cycle declared once (custom.h, preset.h): its field
 * table (the chain's frame, gas, start and dead states, and the steps with
 * every member a process kind may read), the chain built from the steps,
 * and the descriptor's hooks. The engine (cycle.h) validates the chain
 * itself; its errors name the step's input, else "/steps".
 *
 * Checks between inputs (a request's error, 422 validation): exactly one end
 * condition per step; n for a polytropic step; one of pressure_ratio and
 * peak_pressure in a dual step's constant_volume_end; a fuel for
 * fuel_addition; a heat exchanger's partner naming the other side of the
 * pair, which names it back (checked once the steps themselves are right).
 *
 * Echo of a step: its kind, its name when given, its one end condition, and
 * the members its kind reads: efficiency (compression, expansion,
 * fuel_addition) and efficiency_basis (compression, expansion), a pressure
 * loss above 0, n (polytropic), constant_volume_end (dual), the fuel's label
 * and a given fuel-air ratio (fuel_addition), geometry (close,
 * heat_exchange), a heat direction other than either, nozzle when true, the
 * partner (heat_exchange) and the effectiveness (its first side).
 */
#include "core/presets/presets.h"
#include "gascycle/custom.h"

#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define IN(member) offsetof(gc_custom_input, member)
#define ST(member) offsetof(gc_custom_step, member)
#define GIVEN_ST(member) (offsetof(gc_custom_step, member) + 1)

static const char *const kinds[] = {
    "isentropic", "polytropic", "compression", "expansion", "constant_volume",
    "constant_pressure", "isothermal", "dual", "pressure_loss", "heat_exchange",
    "cooling", "fuel_addition", "close", NULL };
static const char *const frames[] = { "closed", "flow", NULL };
static const char *const bases[] = { "isentropic", "polytropic", NULL };
static const char *const heats[] = { "either", "in", "out", NULL };
static const char *const geoms[] = { "constant_pressure", "constant_volume", NULL };
static const char *const gas_models[] = { "air", "cold", NULL };

#define STEP(id, nm, ty, fl, member, given_member, desc)                                   \
    [id] = { .name = nm, .parent = GC_CF_STEPS, .type = ty, .flags = (fl),                   \
             .offset = ST(member), .given = (given_member), .description = desc }
#define STEP_NUM(id, nm, q, fl, d, lo, hi, member, given_member, desc)                      \
    [id] = { .name = nm, .parent = GC_CF_STEPS, .type = GC_FT_NUMBER, .quantity = q,         \
             .flags = (fl), .def = (d), .min = (lo), .max = (hi), .offset = ST(member),      \
             .given = (given_member), .description = desc }
#define END_NUM(id, nm, q, fl, lo, hi, k, desc)                                             \
    [id] = { .name = nm, .parent = GC_CF_STEP_END, .type = GC_FT_NUMBER, .quantity = q,      \
             .flags = GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN | (fl), .min = (lo), .max = (hi),   \
             .offset = ST(end) + (k) * sizeof(double),                                      \
             .given = ST(end_given) + (k) * sizeof(int) + 1, .description = desc }
#define END_BOOL(id, nm, k, desc)                                                           \
    [id] = { .name = nm, .parent = GC_CF_STEP_END, .type = GC_FT_BOOL,                       \
             .flags = GC_FF_OPTIONAL | GC_FF_ECHO_GIVEN,                                     \
             .offset = ST(end_on) + (k) * sizeof(int),                                      \
             .given = ST(end_given) + (k) * sizeof(int) + 1, .description = desc }
#define POS (GC_FF_MIN | GC_FF_MIN_EXCL)
#define ECHO GC_FF_ECHO_GIVEN
#define OPT GC_FF_OPTIONAL   /* absent: not given (no default; the `given` flag stays 0) */
#define PLAIN GC_FF_ECHO_PLAIN

static const gc_field fields[GC_CF_COUNT] = {
    [GC_CF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "A chain of processes in the cycle engine's "
                                       "vocabulary." },
    [GC_CF_NAME] = { .name = "name", .type = GC_FT_STRING, .def_name = "custom cycle",
                     .offset = IN(name), .description = "The cycle's name (the title of the "
                     "result)." },
    [GC_CF_FRAME] = { .name = "frame", .type = GC_FT_ENUM, .names = frames, .offset = IN(frame),
                      .description = "closed: a mass of gas in a cylinder (work as p dv); "
                      "flow: a steady stream (shaft work, kinetic energy, per kg of the "
                      "stream at the start)." },
    [GC_CF_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gas_models, .def_name = "air",
                    .offset = IN(gas), .given = IN(has_gas) + 1,
                    .description = "Working fluid: \"air\" (dry air, NASA 9-coefficient "
                    "polynomials) or \"cold\" (constant cp and k)." },
    [GC_CF_START] = { .name = "start", .type = GC_FT_OBJECT,
                      .description = "The start state of the chain." },
    [GC_CF_DEAD_STATE] = { .name = "dead_state", .type = GC_FT_OBJECT,
                           .description = "Exergy dead state (default: the chain's lowest "
                           "temperature and its pressure; echoed empty)." },
    [GC_CF_STEPS] = { .name = "steps", .type = GC_FT_LIST, .flags = GC_FF_REQUIRED,
                      .offset = IN(steps), .count = IN(n_steps) + 1,
                      .item_size = sizeof(gc_custom_step), .min_items = 2,
                      .max_items = GC_CYCLE_MAX_STEPS, .items = "process steps",
                      .description = "The process chain, in order; the last step usually "
                      "closes it (kind close). GET: steps.0.kind=compression&"
                      "steps.0.end.volume_ratio=0.1 ..." },
    [GC_CF_GAS_CP] = { .name = "cp", .parent = GC_CF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                       .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                       .def = 1005.0, .min = 100.0, .max = 20000.0,
                       .offset = IN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                       .description = "Cold model: constant specific heat at constant "
                       "pressure." },
    [GC_CF_GAS_K] = { .name = "k", .parent = GC_CF_GAS, .variant = 1, .type = GC_FT_NUMBER,
                      .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                      .def = 1.4, .min = 1.0, .max = 1.7,
                      .offset = IN(gas) + offsetof(gc_gas, k_cold),
                      .description = "Cold model: constant ratio of specific heats cp/cv." },
    [GC_CF_START_TEMPERATURE] = { .name = "temperature", .parent = GC_CF_START,
                                  .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,
                                  .flags = POS, .def = 288.15, .offset = IN(T_start_K),
                                  .description = "Start temperature." },
    [GC_CF_START_PRESSURE] = { .name = "pressure", .parent = GC_CF_START, .type = GC_FT_NUMBER,
                               .quantity = GC_Q_PRESSURE, .flags = POS | GC_FF_MAX,
                               .def = 101325.0, .max = 1e9, .offset = IN(P_start_Pa),
                               .description = "Start pressure." },
    [GC_CF_START_VELOCITY] = { .name = "velocity", .parent = GC_CF_START, .type = GC_FT_NUMBER,
                               .quantity = GC_Q_VELOCITY, .flags = GC_FF_MIN | GC_FF_MAX,
                               .max = 5000.0, .offset = IN(V_start_m_per_s),
                               .description = "Flow frame: the start velocity." },
    [GC_CF_DEAD_TEMPERATURE] = { .name = "temperature", .parent = GC_CF_DEAD_STATE,
                                 .type = GC_FT_NUMBER, .quantity = GC_Q_TEMPERATURE,
                                 .flags = GC_FF_MIN | GC_FF_NO_ECHO, .offset = IN(T_dead_K),
                                 .description = "Dead-state temperature (0: the default)." },
    [GC_CF_DEAD_PRESSURE] = { .name = "pressure", .parent = GC_CF_DEAD_STATE,
                              .type = GC_FT_NUMBER, .quantity = GC_Q_PRESSURE,
                              .flags = GC_FF_MIN | GC_FF_NO_ECHO, .offset = IN(P_dead_Pa),
                              .description = "Dead-state pressure (0: the default)." },
    [GC_CF_STEP_KIND] = { .name = "kind", .parent = GC_CF_STEPS, .type = GC_FT_ENUM,
                          .flags = GC_FF_REQUIRED, .names = kinds, .offset = ST(kind),
                          .description = "The process kind (cycle engine): isentropic, "
                          "polytropic, compression, expansion, constant_volume, "
                          "constant_pressure, isothermal, dual, pressure_loss, heat_exchange, "
                          "cooling, fuel_addition, close." },
    STEP(GC_CF_STEP_NAME, "name", GC_FT_STRING, ECHO, name, GIVEN_ST(has_name),
         "The step's name (its process's name in the result; default the kind)."),
    [GC_CF_STEP_END] = { .name = "end", .parent = GC_CF_STEPS, .type = GC_FT_OBJECT,
                         .description = "Exactly one end condition (none for the kinds with "
                         "their own end: close, pressure_loss, heat_exchange)." },
    STEP_NUM(GC_CF_STEP_EFFICIENCY, "efficiency", GC_Q_FRACTION, ECHO | PLAIN | POS | GC_FF_MAX,
             1.0, 0.0, 1.0, efficiency, GIVEN_ST(echo_efficiency),
             "Compression and expansion: isentropic (or polytropic) efficiency; "
             "fuel_addition: the combustion efficiency."),
    [GC_CF_STEP_EFFICIENCY_BASIS] = { .name = "efficiency_basis", .parent = GC_CF_STEPS,
                                      .type = GC_FT_ENUM, .flags = ECHO, .names = bases,
                                      .offset = ST(polytropic), .given = GIVEN_ST(echo_basis),
                                      .description = "Whether the efficiency is isentropic "
                                      "or polytropic." },
    STEP_NUM(GC_CF_STEP_PRESSURE_LOSS, "pressure_loss", GC_Q_FRACTION,
             ECHO | PLAIN | GC_FF_MIN | GC_FF_MAX | GC_FF_MAX_EXCL, 0.0, 0.0, 1.0, pressure_loss,
             GIVEN_ST(echo_pressure_loss), "Fractional pressure loss dP/P of the step."),
    STEP_NUM(GC_CF_STEP_N, "n", GC_Q_RATIO, OPT | ECHO | PLAIN | GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 100.0,
             n,
             GIVEN_ST(has_n), "Polytropic exponent (P v^n constant)."),
    STEP(GC_CF_STEP_CONSTANT_VOLUME_END, "constant_volume_end", GC_FT_OBJECT, ECHO, cv_end,
         GIVEN_ST(has_cv_end), "Dual: the end of the constant-volume part (one of "
         "pressure_ratio, peak_pressure)."),
    [GC_CF_STEP_FUEL] = { .name = "fuel", .parent = GC_CF_STEPS, .type = GC_FT_FUEL,
                          .flags = GC_FF_OPTIONAL | GC_FF_ECHO_LABEL, .offset = ST(fuel),
                          .aux = GIVEN_ST(fuel_spec), .given = GIVEN_ST(has_fuel),
                          .description = "fuel_addition: the fuel (a name, an analysis or a "
                          "formula with its heating value; echoed as its label)." },
    STEP_NUM(GC_CF_STEP_FUEL_AIR_RATIO, "fuel_air_ratio", GC_Q_RATIO,
             OPT | ECHO | PLAIN | POS | GC_FF_MAX,
             0.0, 0.0, 1.0, fuel_air_ratio, GIVEN_ST(has_fuel_air_ratio),
             "fuel_addition at a fuel-air ratio (instead of an end temperature)."),
    [GC_CF_STEP_GEOMETRY] = { .name = "geometry", .parent = GC_CF_STEPS, .type = GC_FT_ENUM,
                              .flags = ECHO, .names = geoms, .offset = ST(geometry),
                              .given = GIVEN_ST(echo_geometry),
                              .description = "close and heat_exchange: constant pressure or "
                              "constant volume." },
    [GC_CF_STEP_HEAT] = { .name = "heat", .parent = GC_CF_STEPS, .type = GC_FT_ENUM,
                          .flags = ECHO, .names = heats, .offset = ST(heat),
                          .given = GIVEN_ST(echo_heat),
                          .description = "Direction of the step's heat: in, out or either." },
    STEP(GC_CF_STEP_NOZZLE, "nozzle", GC_FT_BOOL, ECHO, nozzle, GIVEN_ST(echo_nozzle),
         "Flow frame: a nozzle or diffuser (no shaft work; the enthalpy change goes into "
         "kinetic energy)."),
    [GC_CF_STEP_PARTNER] = { .name = "partner", .parent = GC_CF_STEPS, .type = GC_FT_INTEGER,
                             .flags = OPT | ECHO | GC_FF_MIN | GC_FF_MAX, .def = -1, .min = 0,
                             .max = GC_CYCLE_MAX_STEPS - 1, .offset = ST(partner),
                             .given = GIVEN_ST(has_partner),
                             .description = "heat_exchange: the index (from 0) of the other "
                             "side of the exchanger, which names this one back." },
    STEP_NUM(GC_CF_STEP_EFFECTIVENESS, "effectiveness", GC_Q_FRACTION,
             ECHO | PLAIN | GC_FF_MIN | GC_FF_MAX, 1.0, 0.0, 1.0,
             effectiveness,
             GIVEN_ST(has_effectiveness),
             "heat_exchange, on the first side of the pair: the effectiveness."),
    STEP_NUM(GC_CF_STEP_SOURCE_TEMPERATURE, "source_temperature", GC_Q_TEMPERATURE,
             GC_FF_NO_ECHO | GC_FF_MIN, 0.0, 0.0, 0.0, source_temperature, 0,
             "Temperature of the heat source or sink (0: the cycle's peak)."),
    STEP_NUM(GC_CF_STEP_FUEL_TEMPERATURE, "fuel_temperature", GC_Q_TEMPERATURE,
             GC_FF_NO_ECHO | GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 1000.0, fuel_temperature, 0,
             "fuel_addition: the fuel's supply temperature (0: the step's start "
             "temperature)."),
    END_NUM(GC_CF_END_VOLUME_RATIO, "volume_ratio", GC_Q_RATIO, POS, 0.0, 0.0,
            GC_END_VOLUME_RATIO, "v_end / v_start."),
    END_NUM(GC_CF_END_PRESSURE_RATIO, "pressure_ratio", GC_Q_RATIO, POS, 0.0, 0.0,
            GC_END_PRESSURE_RATIO, "P_end / P_start."),
    END_NUM(GC_CF_END_TEMPERATURE, "temperature", GC_Q_TEMPERATURE, POS, 0.0, 0.0,
            GC_END_TEMPERATURE, "End temperature."),
    END_NUM(GC_CF_END_PRESSURE, "pressure", GC_Q_PRESSURE, POS, 0.0, 0.0, GC_END_PRESSURE,
            "End pressure."),
    END_NUM(GC_CF_END_HEAT, "heat", GC_Q_SPECIFIC_ENERGY, GC_FF_MIN | GC_FF_MAX, -1e8, 1e8,
            GC_END_HEAT, "Heat of the step per kg (> 0 in)."),
    END_NUM(GC_CF_END_PEAK_PRESSURE, "peak_pressure", GC_Q_PRESSURE, POS, 0.0, 0.0,
            GC_END_PEAK_PRESSURE, "A pressure limit (constant_volume)."),
    END_NUM(GC_CF_END_VELOCITY, "velocity", GC_Q_VELOCITY, GC_FF_MIN | GC_FF_MAX, 0.0, 5000.0,
            GC_END_VELOCITY, "End velocity (nozzles and diffusers)."),
    END_BOOL(GC_CF_END_START_TEMPERATURE, "start_temperature", GC_END_START_TEMPERATURE,
             "true: back to the start temperature."),
    END_BOOL(GC_CF_END_START_VOLUME, "start_volume", GC_END_START_VOLUME,
             "true: back to the start volume."),
    END_BOOL(GC_CF_END_START_PRESSURE, "start_pressure", GC_END_START_PRESSURE,
             "true: back to the start pressure (less the losses of the later steps)."),
    [GC_CF_CV_PRESSURE_RATIO] = { .name = "pressure_ratio", .parent = GC_CF_STEP_CONSTANT_VOLUME_END,
                                  .type = GC_FT_NUMBER, .quantity = GC_Q_RATIO,
                                  .flags = OPT | ECHO | PLAIN | GC_FF_MIN, .min = 1.0,
                                  .offset = ST(cv_end),
                                  .given = GIVEN_ST(cv_given),
                                  .description = "The constant-volume part's exact pressure "
                                  "ratio." },
    [GC_CF_CV_PEAK_PRESSURE] = { .name = "peak_pressure", .parent = GC_CF_STEP_CONSTANT_VOLUME_END,
                                 .type = GC_FT_NUMBER, .quantity = GC_Q_PRESSURE,
                                 .flags = OPT | ECHO | POS,
                                 .offset = ST(cv_end) + sizeof(double),
                                 .given = GIVEN_ST(cv_given) + sizeof(int),
                                 .description = "The constant-volume part's pressure limit." },
};

/* ---- the chain --------------------------------------------------------------------------- */

static const int end_row[GC_END_KIND_COUNT] = {
    [GC_END_VOLUME_RATIO] = GC_CF_END_VOLUME_RATIO, [GC_END_PRESSURE_RATIO] = GC_CF_END_PRESSURE_RATIO,
    [GC_END_TEMPERATURE] = GC_CF_END_TEMPERATURE, [GC_END_PRESSURE] = GC_CF_END_PRESSURE,
    [GC_END_HEAT] = GC_CF_END_HEAT, [GC_END_PEAK_PRESSURE] = GC_CF_END_PEAK_PRESSURE,
    [GC_END_START_TEMPERATURE] = GC_CF_END_START_TEMPERATURE,
    [GC_END_START_VOLUME] = GC_CF_END_START_VOLUME,
    [GC_END_START_PRESSURE] = GC_CF_END_START_PRESSURE, [GC_END_VELOCITY] = GC_CF_END_VELOCITY,
};

static int is_start_kind(int k)
{
    return k == GC_END_START_TEMPERATURE || k == GC_END_START_VOLUME ||
           k == GC_END_START_PRESSURE;
}

/* The one end condition of step i (a start_* kind counts when true); -1 with
 * an error when two are given. */
static int step_end(const gc_custom_step *s, int i, gc_end_kind *end, gc_report *rep)
{
    int first = 0;
    *end = GC_END_DEFAULT;
    for (int k = 1; k < GC_END_KIND_COUNT; k++) {
        int given = s->end_given[k] && (!is_start_kind(k) || s->end_on[k]);
        if (!given)
            continue;
        if (first) {
            gc_report_error(rep, GC_ERR_INVALID, end_row[first], i,
                            "give one end condition in \"end\", not two");
            return -1;
        }
        first = k;
        *end = (gc_end_kind)k;
    }
    return 0;
}

/* "/steps/<i>/<member>" (a step index below 100, members of at most 37
 * characters: within GC_CYCLE_FIELD_LEN). */
static void step_field(char *out, int i, const char *member)
{
    snprintf(out, GC_CYCLE_FIELD_LEN, "/steps/%u%s%.37s", (unsigned)i % 100u, member[0] ? "/" : "",
             member);
}

/* The members of step i's kind into the engine's step st; errors into rep. */
static void step_members(const gc_custom_step *s, int i, gc_step *st, gc_report *rep)
{
    int k = s->kind;
    snprintf(st->label, sizeof st->label, "%s", s->name[0] ? s->name : kinds[k]);
    st->heat_sign = s->heat == GC_CUSTOM_HEAT_IN ? 1 : s->heat == GC_CUSTOM_HEAT_OUT ? -1 : 0;
    st->efficiency = s->efficiency;
    st->polytropic_efficiency = s->polytropic;
    st->pressure_loss = s->pressure_loss;
    st->kinetic = s->nozzle;
    st->geometry = s->geometry == 1 ? GC_GEOM_CONST_V : GC_GEOM_CONST_P;
    st->T_source_K = s->source_temperature;
    if (k == GC_PROC_COMPRESSION || k == GC_PROC_EXPANSION || k == GC_PROC_FUEL)
        step_field(st->field_aux, i, "efficiency");
    if (s->pressure_loss > 0.0 && k != GC_PROC_COMPRESSION && k != GC_PROC_EXPANSION)
        step_field(st->field_aux, i, "pressure_loss");
    if (k == GC_PROC_POLYTROPIC) {
        if (!s->has_n)
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_N, i,
                            "is required for a polytropic step");
        st->n = s->has_n ? s->n : 0.0;
    }
    if (k == GC_PROC_DUAL) {
        if (s->cv_given[0] == s->cv_given[1]) {
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_CONSTANT_VOLUME_END, i,
                            "give one of pressure_ratio, peak_pressure");
        } else {
            int peak = s->cv_given[1];
            st->end2 = peak ? GC_END_PEAK_PRESSURE : GC_END_PRESSURE_RATIO;
            st->end2_value = s->cv_end[peak];
            step_field(st->field_aux, i, peak ? "constant_volume_end/peak_pressure"
                                              : "constant_volume_end/pressure_ratio");
        }
    }
    if (k == GC_PROC_FUEL) {
        if (!s->has_fuel)
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_FUEL, i,
                            "is required for fuel_addition");
        st->fuel.fuel = s->has_fuel ? &s->fuel : NULL;
        st->fuel.fuel_air_ratio = s->has_fuel_air_ratio ? s->fuel_air_ratio : 0.0;
        st->fuel.T_fuel_K = s->fuel_temperature;
    }
}

/* Heat exchangers: each pair linked once, from its lower-indexed side. */
static void link_pairs(const gc_custom_input *in, gc_cycle *c, gc_report *rep)
{
    for (int i = 0; i < in->n_steps; i++) {
        const gc_custom_step *s = &in->steps[i];
        if (s->kind != GC_PROC_HEAT_EXCHANGE) {
            if (s->has_partner)
                gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_PARTNER, i,
                                "applies only to heat_exchange steps");
            continue;
        }
        int j = s->partner;
        if (!s->has_partner || j == i || j < 0 || j >= in->n_steps ||
            in->steps[j].kind != GC_PROC_HEAT_EXCHANGE || in->steps[j].partner != i) {
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_PARTNER, i,
                            "must name the other heat_exchange step of the pair, which names "
                            "this one back");
            continue;
        }
        if (j < i)
            continue;
        char fe[GC_CYCLE_FIELD_LEN];
        step_field(fe, i, "effectiveness");
        if (gc_cycle_link_exchanger(c, i, j, s->has_effectiveness ? s->effectiveness : 1.0,
                                    s->geometry == 1 ? GC_GEOM_CONST_V : GC_GEOM_CONST_P,
                                    fe) != GC_OK)
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEP_PARTNER, i,
                            "the pair cannot be linked");
    }
}

/* The engine's chain of the input; errors (a request's own) into rep. */
static void build(const gc_custom_input *in, gc_cycle *c, gc_report *rep)
{
    gc_cycle_init(c, in->frame == 1 ? GC_FRAME_FLOW : GC_FRAME_CLOSED, &in->gas, in->T_start_K,
                  in->P_start_Pa);
    c->V_start_m_per_s = in->frame == 1 ? in->V_start_m_per_s : 0.0;
    c->T_dead_K = in->T_dead_K;
    c->P_dead_Pa = in->P_dead_Pa;
    for (int i = 0; i < in->n_steps; i++) {
        const gc_custom_step *s = &in->steps[i];
        gc_end_kind end;
        if (step_end(s, i, &end, rep) != 0)
            continue;
        char field[GC_CYCLE_FIELD_LEN];
        char member[48];
        snprintf(member, sizeof member, "end/%s", gc_cycle_end_name(end));
        step_field(field, i, end == GC_END_DEFAULT ? "" : member);
        double value = end == GC_END_DEFAULT || is_start_kind(end) ? 0.0 : s->end[end];
        gc_step *st = gc_cycle_add(c, (gc_process_kind)s->kind, end, value, field);
        if (st == NULL) {
            gc_report_error(rep, GC_ERR_INVALID, GC_CF_STEPS, -1, "at most %d steps",
                            GC_CYCLE_MAX_STEPS);
            return;
        }
        step_members(s, i, st, rep);
    }
    if (rep->n_errors == 0)
        link_pairs(in, c, rep);
}

/* ---- the descriptor's hooks --------------------------------------------------------------- */

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_custom_input *in = input;
    gc_custom_result *r = result;
    gc_cycle c;
    build(in, &c, rep);
    if (rep->n_errors) {
        rep->input = 1;
        return rep->errors[0].code;
    }
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_cycle_evaluate(&c, &r->cycle, &err);
    if (rc != GC_OK) {
        if (err.field_id <= 0 && !err.field[0])
            err.field_id = GC_CF_STEPS;
        return gc_report_add(rep, &err);
    }
    if (r->cycle.ideal_is_actual)
        gc_report_warn(rep, "ideal_equals_actual", -1, -1,
                       "with the default (ideal) efficiencies, no losses and ideal "
                       "regeneration the actual cycle equals its ideal counterpart; give "
                       "component efficiencies, losses or an effectiveness below 1 for an "
                       "actual cycle");
    if (in->gas.kind == GC_GAS_COLD)
        gc_report_warn(rep, "cold_model", GC_CF_GAS, -1,
                       "the cold model holds cp and k constant at every temperature");
    gc_report_validity_cycle(rep, &r->cycle);
    return GC_OK;
}

/* The echo of a step: the members its kind reads (see the top of the file). */
static void echo_step(gc_custom_step *e, int i)
{
    int k = e->kind;
    for (int m = 1; m < GC_END_KIND_COUNT; m++)
        if (is_start_kind(m) && !e->end_on[m])
            e->end_given[m] = 0;
    e->echo_efficiency = k == GC_PROC_COMPRESSION || k == GC_PROC_EXPANSION || k == GC_PROC_FUEL;
    e->echo_basis = k == GC_PROC_COMPRESSION || k == GC_PROC_EXPANSION;
    e->echo_pressure_loss = e->pressure_loss > 0.0;
    e->has_n = k == GC_PROC_POLYTROPIC;
    e->has_cv_end = k == GC_PROC_DUAL;
    e->has_fuel = e->has_fuel && k == GC_PROC_FUEL;
    e->has_fuel_air_ratio = e->has_fuel_air_ratio && k == GC_PROC_FUEL;
    e->echo_geometry = k == GC_PROC_HEAT_EXCHANGE || k == GC_PROC_CLOSE;
    e->echo_heat = e->heat != GC_CUSTOM_HEAT_EITHER;
    e->echo_nozzle = e->nozzle != 0;
    e->has_partner = k == GC_PROC_HEAT_EXCHANGE;
    e->has_effectiveness = k == GC_PROC_HEAT_EXCHANGE && e->partner > i;
    if (e->has_effectiveness && !GC_IS_SET(e->effectiveness))
        e->effectiveness = 1.0;
}

static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_custom_input *in = input;
    gc_custom_input *e = echo_input;
    (void)result;
    for (int i = 0; i < in->n_steps && i < GC_CYCLE_MAX_STEPS; i++) {
        if (!in->steps[i].has_effectiveness)
            e->steps[i].effectiveness = 1.0;
        echo_step(&e->steps[i], i);
    }
}

static const char *title_of(const void *input, const void *result)
{
    (void)result;
    return ((const gc_custom_input *)input)->name;
}

static const gc_cycle_result *cycle_of(const void *result)
{
    return &((const gc_custom_result *)result)->cycle;
}

const gc_preset gc_preset_custom = {
    .name = "custom",
    .label = "cycles_custom",
    .title = "Custom cycle",
    .description = "A chain of processes written by the caller in the cycle engine's "
                   "vocabulary (process kinds, end conditions, efficiencies, losses, heat "
                   "exchangers, fuel additions), evaluated, checked and bounded like every "
                   "preset, for cycles no preset covers.",
    .kind = GC_PRESET_CYCLE,
    .fields = fields,
    .n_fields = GC_CF_COUNT,
    .input_size = sizeof(gc_custom_input),
    .result_size = sizeof(gc_custom_result),
    .evaluate = evaluate,
    .echo = echo,
    .cycle = cycle_of,
    .title_of = title_of,
};

const gc_preset *gc_custom_preset(void)
{
    return &gc_preset_custom;
}
