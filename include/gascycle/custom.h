/*
 * custom.h — the custom cycle: a chain of processes written by the caller in
 * the cycle engine's vocabulary (cycle.h), for cycles no preset covers, as a
 * preset of its own (preset.h: gc_custom_preset()).
 *
 * Inputs: a name (the result's title), the frame (closed or flow), the
 * working gas, the start state (T, P and, in the flow frame, the velocity),
 * an optional exergy dead state, and 2 to GC_CYCLE_MAX_STEPS steps. A step
 * has the engine's process kind, an optional name (its label), exactly one
 * end condition (one of the end kinds, or none for the kinds with their own
 * end), and the members its kind reads: efficiency and its basis
 * (compression, expansion; fuel_addition: the combustion efficiency), n
 * (polytropic), the constant-volume end of a dual step, a pressure loss, the
 * heat direction and source temperature, nozzle (flow: no shaft work), the
 * geometry (close, heat_exchange), the partner step and effectiveness of a
 * heat exchanger (its first side), and the fuel with an optional fuel-air
 * ratio and supply temperature (fuel_addition).
 *
 * Units: SI in the structs (K, Pa, m/s, J/kg); fractions 0..1.
 */
#ifndef GASCYCLE_CUSTOM_H
#define GASCYCLE_CUSTOM_H

#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/preset.h"

/* Field ids of the preset's table; row 0 is the request. The step rows are
 * members of each item of "steps" (list index = the step). */
typedef enum gc_custom_field {
    GC_CF_REQUEST = 0,
    GC_CF_NAME, GC_CF_FRAME, GC_CF_GAS, GC_CF_START, GC_CF_DEAD_STATE, GC_CF_STEPS,
    GC_CF_GAS_CP, GC_CF_GAS_K,
    GC_CF_START_TEMPERATURE, GC_CF_START_PRESSURE, GC_CF_START_VELOCITY,
    GC_CF_DEAD_TEMPERATURE, GC_CF_DEAD_PRESSURE,
    GC_CF_STEP_KIND, GC_CF_STEP_NAME, GC_CF_STEP_END, GC_CF_STEP_CONSTANT_VOLUME_END,
    GC_CF_STEP_EFFICIENCY, GC_CF_STEP_EFFICIENCY_BASIS, GC_CF_STEP_N, GC_CF_STEP_PRESSURE_LOSS,
    GC_CF_STEP_HEAT, GC_CF_STEP_SOURCE_TEMPERATURE, GC_CF_STEP_NOZZLE, GC_CF_STEP_GEOMETRY,
    GC_CF_STEP_PARTNER, GC_CF_STEP_EFFECTIVENESS, GC_CF_STEP_FUEL, GC_CF_STEP_FUEL_AIR_RATIO,
    GC_CF_STEP_FUEL_TEMPERATURE,
    GC_CF_END_VOLUME_RATIO, GC_CF_END_PRESSURE_RATIO, GC_CF_END_TEMPERATURE,
    GC_CF_END_PRESSURE, GC_CF_END_HEAT, GC_CF_END_PEAK_PRESSURE, GC_CF_END_VELOCITY,
    GC_CF_END_START_TEMPERATURE, GC_CF_END_START_VOLUME, GC_CF_END_START_PRESSURE,
    GC_CF_CV_PRESSURE_RATIO, GC_CF_CV_PEAK_PRESSURE,
    GC_CF_COUNT
} gc_custom_field;

/* Heat direction of a step. */
typedef enum gc_custom_heat {
    GC_CUSTOM_HEAT_EITHER = 0, GC_CUSTOM_HEAT_IN = 1, GC_CUSTOM_HEAT_OUT = 2
} gc_custom_heat;

typedef struct gc_custom_step {
    int kind;                           /* gc_process_kind */
    char name[GC_FIELD_STRING_LEN];     /* label, "" = the kind's name */
    int has_name;
    double end[GC_END_KIND_COUNT];      /* the end condition's value by end kind (SI) */
    int end_on[GC_END_KIND_COUNT];      /* start_* kinds: the boolean as given */
    int end_given[GC_END_KIND_COUNT];   /* 1: that end condition was given */
    double cv_end[2];                   /* dual: [0] pressure ratio, [1] peak pressure, Pa */
    int cv_given[2];
    int has_cv_end;                     /* constant_volume_end given (echo: a dual step) */
    double efficiency;                  /* (0, 1], default 1 */
    int polytropic;                     /* efficiency basis: 1 polytropic */
    double pressure_loss;               /* [0, 1) */
    double n;                           /* polytropic exponent, 0..100 */
    int has_n;
    int has_fuel;
    gc_fuel fuel;
    gc_fuel_spec fuel_spec;
    double fuel_air_ratio;              /* (0, 1] */
    int has_fuel_air_ratio;
    int geometry;                       /* gc_geometry */
    int heat;                           /* gc_custom_heat */
    int nozzle;                         /* flow frame: a nozzle or diffuser */
    int partner;                        /* heat_exchange: the other side's index */
    int has_partner;
    double effectiveness;               /* heat_exchange: [0, 1], default 1 */
    int has_effectiveness;
    double source_temperature;          /* K, 0 = the cycle's peak */
    double fuel_temperature;            /* K, 0 = the step's start temperature */
    /* echo flags (the echo hook sets them from the kind) */
    int echo_efficiency, echo_basis, echo_pressure_loss, echo_geometry, echo_heat, echo_nozzle;
} gc_custom_step;

typedef struct gc_custom_input {
    char name[GC_FIELD_STRING_LEN];     /* the result's title, default "custom cycle" */
    int frame;                          /* gc_frame */
    int has_gas;
    gc_gas gas;                         /* air, or the cold model */
    double T_start_K, P_start_Pa, V_start_m_per_s;
    double T_dead_K, P_dead_Pa;         /* 0: the engine's defaults */
    int n_steps;
    gc_custom_step steps[GC_CYCLE_MAX_STEPS];
} gc_custom_input;

typedef struct gc_custom_result {
    gc_cycle_result cycle;
} gc_custom_result;

/* The preset's descriptor (preset.h). */
const gc_preset *gc_custom_preset(void);

#endif
