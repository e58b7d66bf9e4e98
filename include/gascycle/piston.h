/*
 * piston.h — the piston-engine cycles as presets of the cycle engine
 * (cycle.h): each is a thin builder of a closed-frame chain, evaluated by
 * gc_cycle_evaluate, plus the engine figures (trapped mass, work per cycle,
 * indicated power, IMEP, ISFC) when the engine's geometry is given.
 *
 * Chains (state 1 = intake state; "comp." and "exp." carry the optional
 * isentropic efficiencies; r = compression_ratio):
 *   otto      comp. v/r, constant-volume heat (peak_temperature | heat_added),
 *             exp. back to v1, constant-volume rejection
 *   diesel    comp. v/r, constant-pressure heat (cutoff_ratio | peak_temperature
 *             | heat_added), exp. to v1, constant-volume rejection
 *   dual      comp. v/r, constant-volume heat to pressure_ratio (exact) or up to
 *             peak_pressure (a limit), then constant-pressure heat
 *             (cutoff_ratio | peak_temperature | heat_added = total), exp. to
 *             v1, constant-volume rejection. When the heat-addition end comes
 *             before peak_pressure is reached, the result says so
 *             (peak_pressure_short, peak_pressure_reached)
 *   atkinson  comp. v/r, constant-volume heat, exp. to the intake pressure
 *             (over-expanded), constant-pressure rejection. With
 *             expansion_ratio (> r) the heat-addition end temperature is the
 *             one from which the expansion (with its efficiency) over exactly
 *             expansion_ratio ends at the intake pressure; the efficiency is
 *             referred to the isentrope to the same end pressure (piston.c,
 *             atkinson_T3). The ideal counterpart keeps both volume ratios, so
 *             its peak temperature is the isentropic one (higher than the
 *             actual's when expansion_efficiency < 1)
 *   miller    comp. over effective_compression_ratio (intake valve closing
 *             early or late), constant-volume heat, exp. over the geometric
 *             compression_ratio, constant-volume blow-down to the intake
 *             pressure, constant-pressure rejection
 *   stirling  isothermal compression at intake_temperature over r,
 *             regenerator (cold side, constant volume), constant-volume heat to
 *             peak_temperature, isothermal expansion back to v1, regenerator
 *             (hot side), constant-volume rejection
 *   ericsson  as stirling with isobars: isothermal compression over
 *             pressure_ratio, regenerator and heat at constant pressure
 *   lenoir    constant-volume heat from the intake state (peak_temperature |
 *             heat_added | pressure_ratio), exp. to the intake pressure,
 *             constant-pressure rejection
 *   carnot    comp. to peak_temperature, isothermal expansion, exp. back to
 *             intake_temperature, isothermal compression back to v1; the
 *             isothermal volume ratio comes from compression_ratio (the ideal
 *             cycle's v_max/v_min) or from heat_added
 * Regenerator effectiveness (stirling, ericsson) defaults to 1 (ideal
 * regeneration); 0 is no regenerator.
 *
 * Each preset is declared once as a descriptor (preset.h), one file each
 * in service/core/presets/ (otto.c ... carnot.c): its field table (the
 * inputs that apply to it, with their defaults, bounds and descriptions),
 * the shared output table of the family (engine and indicated figures) and
 * its chain builder. Every piston preset uses the same field ids
 * (gc_piston_field), so the family code names an input the same way for
 * all nine; a row a preset does not take is empty in its table.
 *
 * Inputs are members of gc_piston_input named as the inputs; an optional
 * number is "not given" while it holds GC_PISTON_UNSET (gc_piston_input_init
 * sets every optional input so). A given input that does not apply to the
 * chosen cycle is an error. Errors carry the input's field id (err->field_id,
 * gc_piston_field) and, for callers that read text, its path in err->field
 * ("/cutoff_ratio").
 *
 * Units: SI (K, Pa, J/kg, m3, rev/s, W, kg/J).
 */
#ifndef GASCYCLE_PISTON_H
#define GASCYCLE_PISTON_H

#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/preset.h"

#define GC_PISTON_UNSET GC_UNSET                   /* an input that was not given */
#define GC_PISTON_IS_SET(x) GC_IS_SET(x)

/* Field ids of every piston preset's table (preset.h): row 0 is the
 * request; a preset leaves the rows it does not take empty. */
typedef enum gc_piston_field {
    GC_PF_REQUEST = 0,
    GC_PF_INTAKE_TEMPERATURE,
    GC_PF_INTAKE_PRESSURE,
    GC_PF_GAS,
    GC_PF_GAS_CP,
    GC_PF_GAS_K,
    GC_PF_COMPRESSION_RATIO,
    GC_PF_PRESSURE_RATIO,
    GC_PF_PEAK_PRESSURE,
    GC_PF_CUTOFF_RATIO,
    GC_PF_EXPANSION_RATIO,
    GC_PF_EFFECTIVE_COMPRESSION_RATIO,
    GC_PF_PEAK_TEMPERATURE,
    GC_PF_HEAT_ADDED,
    GC_PF_COMPRESSION_EFFICIENCY,
    GC_PF_EXPANSION_EFFICIENCY,
    GC_PF_REGENERATOR_EFFECTIVENESS,
    GC_PF_DISPLACEMENT,
    GC_PF_CYLINDERS,
    GC_PF_SPEED,
    GC_PF_STROKES,
    GC_PF_FUEL,
    GC_PF_COUNT
} gc_piston_field;

typedef enum gc_piston_cycle {
    GC_PISTON_OTTO = 0,
    GC_PISTON_DIESEL,
    GC_PISTON_DUAL,
    GC_PISTON_ATKINSON,
    GC_PISTON_MILLER,
    GC_PISTON_STIRLING,
    GC_PISTON_ERICSSON,
    GC_PISTON_LENOIR,
    GC_PISTON_CARNOT,
    GC_PISTON_COUNT
} gc_piston_cycle;

typedef struct gc_piston_input {
    gc_piston_cycle cycle;
    gc_gas gas;                         /* working fluid (init: air) */
    double intake_temperature;          /* K (init: 288.15) */
    double intake_pressure;             /* Pa (init: 101325) */
    double compression_ratio;           /* v_max / v_min (miller: geometric), - */
    double cutoff_ratio;                /* v after / before constant-pressure heat, - */
    double pressure_ratio;              /* dual, lenoir: P after / before constant-volume
                                           heat; ericsson: P_max / P_min, - */
    double peak_pressure;               /* dual: pressure limit of constant-volume heat, Pa */
    double peak_temperature;            /* K */
    double heat_added;                  /* J/kg of trapped gas */
    double expansion_ratio;             /* atkinson: v at exhaust / v after heat addition, - */
    double effective_compression_ratio; /* miller, - */
    double compression_efficiency;      /* isentropic, (0, 1] (unset: 1) */
    double expansion_efficiency;        /* isentropic, (0, 1] (unset: 1) */
    double regenerator_effectiveness;   /* stirling, ericsson: [0, 1] (unset: 1) */
    double displacement;                /* swept volume of the whole engine, m3 */
    int cylinders;                      /* number of cylinders (1 unless has_cylinders) */
    int has_cylinders;                  /* 1: cylinders given */
    double speed;                       /* crankshaft speed, rev/s */
    int strokes;                        /* strokes per cycle, 2 or 4 (when has_strokes) */
    int has_strokes;                    /* 1: strokes given */
    int has_fuel;                       /* 1: `fuel` given (its LHV gives the ISFC) */
    gc_fuel fuel;                       /* the fuel (combustion.h) */
    gc_fuel_spec fuel_spec;             /* how the fuel was given (for the echo) */
    double fuel_heating_value;          /* J/kg of fuel, for ISFC, when no `fuel` is given */
    double dead_temperature;            /* exergy dead state, K (unset: lowest state) */
    double dead_pressure;               /* Pa (unset: that state's pressure) */
    unsigned flags;                     /* gc_cycle flags (GC_CYCLE_NO_AREAS ...) */
} gc_piston_input;

typedef struct gc_piston_result {
    gc_cycle_result cycle;              /* actual, ideal, Carnot bound */
    double compression_end_temperature; /* K, state after compression (0 without) */
    double expansion_ratio;             /* v after / before the expansion of the actual
                                           cycle, - (0 for cycles without one) */
    double peak_pressure_reached;       /* dual: pressure at the end of the constant-volume
                                           part of the actual cycle, Pa (0 otherwise) */
    int peak_pressure_short;            /* 1: dual with peak_pressure, and the heat-addition
                                           end came before that limit was reached (the
                                           constant-pressure part is empty) */
    int has_engine;                     /* 1 when displacement was given */
    double cylinder_displacement;       /* m3 per cylinder */
    double trapped_mass;                /* kg per cylinder per cycle: displacement per
                                           cylinder / (v_max - v_min) */
    double work_per_cycle;              /* J per cylinder per cycle (indicated) */
    double imep;                        /* indicated mean effective pressure, Pa
                                           (work per cycle / cylinder displacement) */
    int has_power;                      /* 1 when speed and strokes were given too */
    double cycles_per_second;           /* per cylinder, 1/s */
    double indicated_power;             /* W, all cylinders */
    int has_fuel;                       /* 1 when a fuel (or fuel_heating_value) was given */
    double fuel_per_cycle;              /* kg per cylinder per cycle (heat_in / LHV) */
    double isfc;                        /* indicated specific fuel consumption, kg/J */
    double fuel_mass_flow;              /* kg/s, all cylinders (when has_power) */
    int has_indicated;                  /* has_engine or has_fuel: the "indicated" figures */
    int has_fuel_per_cycle;             /* has_engine and has_fuel */
    int has_fuel_flow;                  /* has_power and has_fuel */
} gc_piston_result;

/* Sets the defaults above and every optional input to GC_PISTON_UNSET. */
void gc_piston_input_init(gc_piston_input *in, gc_piston_cycle cycle);

/* The descriptor of a piston preset (preset.h), or NULL. */
const gc_preset *gc_piston_preset(gc_piston_cycle cycle);

/* Preset names: "otto", "diesel", "dual", "atkinson", "miller", "stirling",
 * "ericsson", "lenoir", "carnot". */
const char *gc_piston_name(gc_piston_cycle cycle);
int gc_piston_from_name(const char *name, gc_piston_cycle *cycle);

/* Validates the inputs and builds the chain (no evaluation). */
int gc_piston_build(const gc_piston_input *in, gc_cycle *c, gc_error *err);

/* Builds, evaluates (actual, ideal, Carnot, checks) and adds the engine
 * figures. */
int gc_piston_evaluate(const gc_piston_input *in, gc_piston_result *r, gc_error *err);

#endif
