/*
 * piston_family.h — private to the piston presets (otto.c ... carnot.c and
 * the family's piston.c): the rows every piston field table shares, the
 * family's evaluation and outputs, and the helpers the chain builders use.
 *
 * A preset file holds its field table (gc_piston_field ids; rows it does not
 * take stay empty), its chain builder and its descriptor. Units: SI.
 */
#ifndef GC_CORE_PISTON_FAMILY_H
#define GC_CORE_PISTON_FAMILY_H

#include "gascycle/piston.h"
#include "gascycle/preset.h"

#include <stddef.h>

/* Builds the chain of in (ideal: the ideal counterpart's end conditions,
 * where they differ; the caller idealises the efficiencies). */
typedef int (*gc__piston_build_fn)(const gc_piston_input *in, int ideal, gc_cycle *c,
                                   gc_error *err);

int gc__build_otto(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_diesel(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_dual(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_atkinson(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_miller(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_stirling(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_ericsson(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_lenoir(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);
int gc__build_carnot(const gc_piston_input *in, int ideal, gc_cycle *c, gc_error *err);

/* The descriptor hooks every piston preset shares. */
int gc__piston_evaluate(const void *input, void *result, gc_report *rep);
const gc_cycle_result *gc__piston_cycle(const void *result);
void gc__piston_lean(void *input, unsigned what);
#define GC__PISTON_N_OUTPUTS 15
extern const gc_output gc__piston_outputs[GC__PISTON_N_OUTPUTS];

/* ---- builder helpers (piston.c) ------------------------------------------------ */

/* The heat-addition end: exactly one of the inputs named by `which`
 * (gc_piston_field bits 1u << id). */
typedef struct gc__heat_end {
    gc_end_kind end;
    double value;
    int field;                  /* gc_piston_field */
} gc__heat_end;

#define GC__PF_BIT(id) (1u << (id))

int gc__piston_heat_end(const gc_piston_input *in, unsigned which, gc__heat_end *h,
                        gc_error *err);
double gc__eff_or_1(double e);
gc_step *gc__piston_add(gc_cycle *c, gc_process_kind kind, gc_end_kind end, double value,
                        int field, const char *label);
gc_step *gc__piston_compression(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                                double value, int field);
gc_step *gc__piston_expansion(gc_cycle *c, const gc_piston_input *in, gc_end_kind end,
                              double value, int field);
void gc__piston_close(gc_cycle *c, gc_geometry geom);
/* "/compression_ratio" for GC_PF_COMPRESSION_RATIO (the path a step names). */
const char *gc__piston_path(int field);
/* Starts the chain (frame, gas, intake state, flags, dead state) and checks
 * that the cycles that need one have a compression ratio. */
int gc__piston_begin(const gc_piston_input *in, gc_cycle *c, gc_error *err);

/* ---- rows shared by the piston tables ------------------------------------------- */

#define GC__PNUM(id, nm, q, fl, dflt, lo, hi, member, desc)                                   \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q, .flags = (fl), .def = (dflt),    \
             .min = (lo), .max = (hi), .offset = offsetof(gc_piston_input, member),            \
             .description = desc }
/* optional, no default, min exclusive */
#define GC__POPT(id, nm, q, lo, hi, member, desc)                                              \
    GC__PNUM(id, nm, q, GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, GC_UNSET,    \
             lo, hi, member, desc)

extern const char *const gc__gas_models[];   /* "air", "cold" */

#define GC__PF_REQUEST(desc)                                                                  \
    [GC_PF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT, .description = desc }

#define GC__PF_INTAKE                                                                         \
    GC__PNUM(GC_PF_INTAKE_TEMPERATURE, "intake_temperature", GC_Q_AMBIENT_TEMPERATURE,       \
             GC_FF_MIN | GC_FF_MAX, 288.15, 200.0, 1000.0, intake_temperature,                \
             "Gas temperature at the start of compression."),                                 \
    GC__PNUM(GC_PF_INTAKE_PRESSURE, "intake_pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MAX,  \
             101325.0, 100.0, 1.0e8, intake_pressure,                                         \
             "Gas pressure at the start of compression."),                                    \
    [GC_PF_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = gc__gas_models,                 \
                    .def_name = "air", .offset = offsetof(gc_piston_input, gas),              \
                    .description = "Working-fluid model: \"air\" (dry air, NASA "             \
                    "9-coefficient polynomials, properties varying with temperature) or "     \
                    "\"cold\" (the cold-air standard: constant cp and k), given as the name " \
                    "or as {\"model\": \"cold\", \"cp\": ..., \"k\": ...}." },                \
    [GC_PF_GAS_CP] = { .name = "cp", .parent = GC_PF_GAS, .variant = 1, .type = GC_FT_NUMBER, \
                       .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,     \
                       .def = 1005.0, .min = 100.0, .max = 20000.0,                           \
                       .offset = offsetof(gc_piston_input, gas) +                             \
                                 offsetof(gc_gas, cp_cold_J_per_kgK),                         \
                       .description = "Cold model: constant specific heat at constant "      \
                       "pressure." },                                                         \
    [GC_PF_GAS_K] = { .name = "k", .parent = GC_PF_GAS, .variant = 1, .type = GC_FT_NUMBER,   \
                      .quantity = GC_Q_RATIO,                                                 \
                      .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .def = 1.4,            \
                      .min = 1.0, .max = 1.7,                                                 \
                      .offset = offsetof(gc_piston_input, gas) + offsetof(gc_gas, k_cold),    \
                      .description = "Cold model: constant ratio of specific heats cp/cv." }

#define GC__PF_CR(hi)                                                                         \
    GC__POPT(GC_PF_COMPRESSION_RATIO, "compression_ratio", GC_Q_RATIO, 1.0, hi,              \
             compression_ratio, "Compression ratio v_max / v_min (geometric).")
#define GC__PF_CUTOFF                                                                         \
    GC__POPT(GC_PF_CUTOFF_RATIO, "cutoff_ratio", GC_Q_RATIO, 1.0, 100.0, cutoff_ratio,        \
             "Cutoff ratio: v after / v before the constant-pressure heat addition; must be " \
             "less than the compression ratio.")
#define GC__PF_PR(fl, desc)                                                                   \
    GC__PNUM(GC_PF_PRESSURE_RATIO, "pressure_ratio", GC_Q_RATIO,                              \
             GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MAX | (fl), GC_UNSET, 1.0, 1000.0,            \
             pressure_ratio, desc)
#define GC__PF_TPEAK                                                                          \
    GC__POPT(GC_PF_PEAK_TEMPERATURE, "peak_temperature", GC_Q_TEMPERATURE, 0.0, 6000.0,       \
             peak_temperature, "Highest gas temperature, at the end of heat addition; must "  \
             "lie above the compression-end temperature.")
#define GC__PF_Q                                                                              \
    GC__POPT(GC_PF_HEAT_ADDED, "heat_added", GC_Q_SPECIFIC_ENERGY, 0.0, 1.0e8, heat_added,   \
             "Heat added per kg of trapped gas (instead of peak_temperature).")
#define GC__PF_EFF(id, nm, member, desc)                                                      \
    GC__PNUM(id, nm, GC_Q_FRACTION, GC_FF_MIN | GC_FF_MAX, 1.0, 0.05, 1.0, member, desc)
#define GC__PF_EFFC(desc) GC__PF_EFF(GC_PF_COMPRESSION_EFFICIENCY, "compression_efficiency",   \
                                     compression_efficiency, desc)
#define GC__PF_EFFE(desc) GC__PF_EFF(GC_PF_EXPANSION_EFFICIENCY, "expansion_efficiency",       \
                                     expansion_efficiency, desc)
#define GC__EFFC_VOLUME "Isentropic efficiency of compression, isentropic work over actual "  \
    "work, the isentropic reference taken to the same end volume (the compression ratio)."
#define GC__PF_REGEN                                                                          \
    GC__PNUM(GC_PF_REGENERATOR_EFFECTIVENESS, "regenerator_effectiveness", GC_Q_FRACTION,     \
             GC_FF_MIN | GC_FF_MAX, 1.0, 0.0, 1.0, regenerator_effectiveness,                 \
             "Regenerator effectiveness (1: ideal regeneration, 0: none).")
#define GC__PF_ENGINE                                                                         \
    GC__POPT(GC_PF_DISPLACEMENT, "displacement", GC_Q_VOLUME, 0.0, 100.0, displacement,       \
             "Swept volume of the whole engine (enables the indicated figures)."),            \
    [GC_PF_CYLINDERS] = { .name = "cylinders", .type = GC_FT_INTEGER,                        \
                          .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MAX, .def = 1,          \
                          .min = 1, .max = 64, .offset = offsetof(gc_piston_input, cylinders),\
                          .given = offsetof(gc_piston_input, has_cylinders) + 1,              \
                          .description = "Number of cylinders (default 1)." },                \
    GC__POPT(GC_PF_SPEED, "speed", GC_Q_ROTATIONAL_SPEED, 0.0, 1000.0, speed,                 \
             "Crankshaft speed (with strokes_per_cycle: indicated power)."),                  \
    [GC_PF_STROKES] = { .name = "strokes_per_cycle", .type = GC_FT_INTEGER,                  \
                        .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MAX | GC_FF_MIN_OR_MAX,   \
                        .def = 4, .min = 2, .max = 4,                                         \
                        .offset = offsetof(gc_piston_input, strokes),                         \
                        .given = offsetof(gc_piston_input, has_strokes) + 1,                  \
                        .description = "Strokes per cycle, 2 or 4 (with speed: indicated "    \
                        "power)." },                                                          \
    [GC_PF_FUEL] = { .name = "fuel", .type = GC_FT_FUEL, .flags = GC_FF_OPTIONAL,             \
                     .offset = offsetof(gc_piston_input, fuel),                               \
                     .aux = offsetof(gc_piston_input, fuel_spec) + 1,                         \
                     .given = offsetof(gc_piston_input, has_fuel) + 1,                        \
                     .description = "The fuel, for the indicated specific fuel consumption " \
                     "through its lower heating value: a name (\"methane\"), "                \
                     "{\"analysis\": {species: mole fraction}} or {\"formula\": "            \
                     "\"CxHyOzNw\", \"lower_heating_value\": ...}." }

/* A piston descriptor (the preset file gives name, title, description, fields, init). */
#define GC__PISTON_PRESET(nm, ttl, desc, table, init_fn)                                      \
    {                                                                                         \
        .name = nm, .label = "cycles_" nm, .title = ttl, .description = desc,                 \
        .kind = GC_PRESET_CYCLE, .fields = table, .n_fields = GC_PF_COUNT,                    \
        .outputs = gc__piston_outputs, .n_outputs = GC__PISTON_N_OUTPUTS,                     \
        .input_size = sizeof(gc_piston_input), .result_size = sizeof(gc_piston_result),      \
        .init = init_fn, .evaluate = gc__piston_evaluate, .cycle = gc__piston_cycle,          \
        .lean = gc__piston_lean,                                                              \
    }

#endif
