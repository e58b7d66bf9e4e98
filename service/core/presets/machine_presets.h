/*
 * machine_presets.h — private to the core: the three presets of a fixed gas
 * turbine (machine.h) under the route prefix /v1/machine/, and what they
 * share.
 *
 *   machine_site         /v1/machine/site         the machine at site conditions (a cycle
 *                                                 preset: states, processes, bounds)
 *   machine_corrections  /v1/machine/corrections  correction curves and factors at the
 *                                                 reference conditions (table, SVG plots)
 *   machine_readings     /v1/machine/readings     plant readings reduced by heat balance:
 *                                                 corrected figures and degradation
 *
 * Every input struct begins with a gc_machine_head (the "machine" object and
 * the "inlet" treatment), so the rows of those two objects have the same
 * field ids and offsets in the three field tables (gc__machine_fill_rows
 * writes them); every result begins with a gc_machine_head_result, so the
 * "machine" output rows (the solved definition) are the same too.
 *
 * The machine object (JSON): {"design": {a simple-cycle Brayton description:
 * the Brayton preset's own rows, copied from its table so bounds, defaults
 * and descriptions exist once}, or "rating": {rated figures}, "reference":
 * {correction reference, ISO 2314 by default}, "control": {limits, IGV
 * range, minimum load}, "off_design": {the laws' exponents}, "cooling":
 * {the cooled first stage, cooling.h}}.
 *
 * The core model (machine.c) names inputs by text paths ("/design/...",
 * "/laws/...", "/readings/..."); gc__machine_field_of turns such a path into
 * a field id of these tables (the API layer then writes the JSON pointer).
 *
 * Tables are completed once at load time (a constructor in each preset's
 * file): the rows copied from the Brayton table cannot be constant
 * initialisers. They are read-only afterwards.
 *
 * Units: SI base units in every struct (units.h).
 */
#ifndef GC_CORE_MACHINE_PRESETS_H
#define GC_CORE_MACHINE_PRESETS_H

#include "gascycle/machine.h"
#include "gascycle/preset.h"

#include <stddef.h>

/* ---- shared input head and its field ids ------------------------------------- */

typedef struct gc_machine_head {
    gc_machine_spec spec;          /* design (a gc_brayton_input), rating, reference, laws,
                                      cooling (enabled = the object was given) */
    int has_design, has_rating;    /* which definition the request gave */
    gc_fuel_spec rating_fuel_spec; /* how the rating's fuel was given (echo) */
    gc_machine_inlet inlet;        /* "inlet": the treatment in service */
} gc_machine_head;

/* Field ids of the shared rows (the same in every machine preset's table). */
typedef enum gc_machine_field {
    GC_MF_REQUEST = 0,
    GC_MF_MACHINE,
    GC_MF_DESIGN,
    GC_MF_D_PRESSURE_RATIO, GC_MF_D_TURBINE_INLET_TEMPERATURE, GC_MF_D_COMPRESSOR_EFFICIENCY,
    GC_MF_D_TURBINE_EFFICIENCY, GC_MF_D_EFFICIENCY_BASIS, GC_MF_D_INLET_PRESSURE_LOSS,
    GC_MF_D_COMBUSTOR_PRESSURE_LOSS, GC_MF_D_EXHAUST_PRESSURE_LOSS,
    GC_MF_D_COMBUSTOR_EFFICIENCY, GC_MF_D_MECHANICAL_EFFICIENCY, GC_MF_D_GENERATOR_EFFICIENCY,
    GC_MF_D_FUEL, GC_MF_D_FUEL_TEMPERATURE, GC_MF_D_NET_POWER,
    GC_MF_D_SITE, GC_MF_D_SITE_ALTITUDE, GC_MF_D_SITE_TEMPERATURE, GC_MF_D_SITE_PRESSURE,
    GC_MF_D_SITE_RELATIVE_HUMIDITY,
    GC_MF_RATING,
    GC_MF_R_NET_POWER, GC_MF_R_HEAT_RATE, GC_MF_R_EXHAUST_MASS_FLOW,
    GC_MF_R_EXHAUST_TEMPERATURE, GC_MF_R_PRESSURE_RATIO, GC_MF_R_COMPRESSOR_EFFICIENCY,
    GC_MF_R_COMPRESSOR_EXIT_TEMPERATURE, GC_MF_R_INLET_PRESSURE_LOSS,
    GC_MF_R_COMBUSTOR_PRESSURE_LOSS, GC_MF_R_EXHAUST_PRESSURE_LOSS,
    GC_MF_R_COMBUSTOR_EFFICIENCY, GC_MF_R_GENERATOR_EFFICIENCY, GC_MF_R_FUEL,
    GC_MF_R_FUEL_TEMPERATURE,
    GC_MF_R_SITE, GC_MF_R_SITE_ALTITUDE, GC_MF_R_SITE_TEMPERATURE, GC_MF_R_SITE_PRESSURE,
    GC_MF_R_SITE_RELATIVE_HUMIDITY,
    GC_MF_REFERENCE, GC_MF_REF_ALTITUDE, GC_MF_REF_TEMPERATURE, GC_MF_REF_PRESSURE,
    GC_MF_REF_RELATIVE_HUMIDITY,
    GC_MF_CONTROL, GC_MF_C_FIRING_TEMPERATURE_LIMIT, GC_MF_C_EXHAUST_TEMPERATURE_LIMIT,
    GC_MF_C_IGV_MINIMUM_FLOW_FRACTION, GC_MF_C_MINIMUM_LOAD_FRACTION,
    GC_MF_OFF_DESIGN, GC_MF_O_COMPRESSOR_SPEED_EXPONENT, GC_MF_O_IGV_EFFICIENCY_COEFFICIENT,
    GC_MF_COOLING, GC_MF_COOLING_BLADE_TEMPERATURE, GC_MF_COOLING_NOZZLE_CONSTANT,
    GC_MF_COOLING_ROTOR_CONSTANT,
    GC_MF_INLET, GC_MF_I_TREATMENT, GC_MF_I_ADDED_PRESSURE_LOSS,
    GC_MF_I_EVAPORATIVE_EFFECTIVENESS, GC_MF_I_CHILLER_TEMPERATURE, GC_MF_I_CHILLER_COP,
    GC_MF_COUNT                    /* a preset's own rows start here */
} gc_machine_field;

/* ---- shared result head and its output rows ------------------------------------ */

typedef struct gc_machine_head_result {
    gc_machine machine;            /* the defined machine */
    int from_rating;               /* 0: defined by a Brayton description, 1: by rated figures */
    int cooled;                    /* 1 with the cooling model */
    gc_site design_site;           /* the design (or rating) conditions, resolved */
    gc_site reference_site;        /* the reference conditions, resolved */
} gc_machine_head_result;

/* Rows of one gc_machine_point (written by GC__MACHINE_POINT_ROWS). */
#define GC__MACHINE_POINT_ROWS_N 31
/* Rows of the "machine" output object (GC__MACHINE_OUTPUT_ROWS). */
#define GC__MACHINE_OUTPUT_ROWS_N (16 + 2 * GC__MACHINE_POINT_ROWS_N)
/* Rows of an "inlet_treatment" object (GC__MACHINE_INLET_ROWS). */
#define GC__MACHINE_INLET_ROWS_N 13

extern const char *const gc__machine_control_names[];   /* gc_machine_control */
extern const char *const gc__machine_limit_names[];     /* gc_machine_limit */
extern const char *const gc__machine_inlet_names[];     /* gc_machine_inlet_kind */
extern const char *const gc__machine_definition_names[]; /* "design", "rating" */

/* Writes the output rows of one operating point at rows[0 .. N) with parent
 * `parent`, reading the gc_machine_point at offset `off` of the result (or
 * of a list item). */
void gc__machine_point_rows(gc_output *rows, int parent, size_t off);
/* The "machine" object at rows[first ..), its rows' parents from `first`. */
void gc__machine_output_rows(gc_output *rows, int first);
/* An "inlet_treatment" object at rows[first ..) reading the
 * gc_machine_inlet_state at offset off of the result; the treatment's name
 * from the input head. */
void gc__machine_inlet_rows(gc_output *rows, int first, size_t off);

/* ---- tables ------------------------------------------------------------------- */

/* Writes the shared rows 1 .. GC_MF_COUNT - 1 into a preset's table. */
void gc__machine_fill_rows(gc_field *fields);

/* One row copied from the Brayton table ("/site/temperature"): its type,
 * quantity, flags, default, bounds and description, then the overrides. */
typedef struct gc__machine_copy {
    int dst, parent;               /* the row written and its parent row */
    const char *from;              /* the Brayton row's pointer */
    ptrdiff_t shift;               /* added to the row's offsets (offset, given, count, aux) */
    const char *name;              /* NULL: the Brayton row's */
    unsigned set, clear;           /* flags set and cleared */
    int has_def;                   /* 1: def below replaces the default */
    double def;
    const char *description;       /* NULL: the Brayton row's */
    int drop_given;                /* 1: the copy has no `given` flag */
} gc__machine_copy;

void gc__machine_copy_rows(gc_field *fields, const gc__machine_copy *c, int n);

/* ---- evaluation helpers --------------------------------------------------------- */

/* A core path ("/design/x", "/laws/x", ...) -> a field id of p's table
 * (the nearest enclosing row when the path names no row; 0 when nothing).
 * `extra` maps preset-specific prefixes first ({from, to} pairs, n of them). */
typedef struct gc__machine_path_map {
    const char *from, *to;
} gc__machine_path_map;

int gc__machine_field_of(const gc_preset *p, const char *path, const gc__machine_path_map *extra,
                         int n_extra);

/* A core error into the report, its field id from its text path. */
int gc__machine_report_error(const gc_preset *p, gc_report *rep, const gc_error *err,
                             const gc__machine_path_map *extra, int n_extra);

/* Core warnings into the report (code as a static string, field id from
 * the path). */
void gc__machine_report_warnings(const gc_preset *p, gc_report *rep,
                                 const gc_machine_warning *w, int n,
                                 const gc__machine_path_map *extra, int n_extra);

/* The spec as the core reads it: the definition chosen by the object given
 * (design or rating), the tables' "not given" (GC_UNSET) as the core's 0. */
void gc__machine_core_spec(const gc_machine_head *h, gc_machine_spec *s);

/* Defines the machine of head into r (validating first: every bad input
 * reported, rep->input set); also resolves the design and reference
 * conditions. GC_OK or the first error's code. */
int gc__machine_define(const gc_preset *p, const gc_machine_head *head,
                       gc_machine_head_result *r, gc_report *rep);

/* The echo of the head: the resolved design and reference conditions, the
 * limits in force. */
void gc__machine_echo(const gc_machine_head_result *r, gc_machine_head *e);

/* Defaults the field table cannot express (the core's init functions). */
void gc__machine_head_init(gc_machine_head *h);

/* An optional number of the tables that holds GC_UNSET -> the core's 0
 * ("not given"). */
static inline double gc__machine_or0(double x)
{
    return GC_IS_SET(x) ? x : 0.0;
}

/* ---- the three presets ------------------------------------------------------------ */

extern const gc_preset gc_preset_machine_site;
extern const gc_preset gc_preset_machine_corrections;
extern const gc_preset gc_preset_machine_readings;

/* machine_site */
typedef enum gc_machine_site_field {
    GC_MSF_SITE = GC_MF_COUNT, GC_MSF_SITE_ALTITUDE, GC_MSF_SITE_TEMPERATURE,
    GC_MSF_SITE_PRESSURE, GC_MSF_SITE_RELATIVE_HUMIDITY,
    GC_MSF_LOAD, GC_MSF_LOAD_POWER, GC_MSF_LOAD_FRACTION, GC_MSF_LOAD_KIND,
    GC_MSF_CONDITION, GC_MSF_COND_COMPRESSOR_EFFICIENCY, GC_MSF_COND_COMPRESSOR_FLOW,
    GC_MSF_COND_TURBINE_EFFICIENCY,
    GC_MSF_COUNT
} gc_machine_site_field;

typedef struct gc_machine_site_request {
    gc_machine_head head;
    gc_site_input site;            /* ambient */
    double load_power_W;           /* GC_UNSET: not given */
    double load_fraction;          /* GC_UNSET: not given */
    int load_kind;                 /* gc_machine_load_kind, echo only (from the above) */
    gc_machine_condition condition;
    unsigned flags;                /* GC_MACHINE_NO_AREAS (lean) */
} gc_machine_site_request;

typedef struct gc_machine_site_answer {
    gc_machine_head_result head;
    gc_machine_site_result at;     /* the point, inlet state, ambient, cycle */
    char title[120];
} gc_machine_site_answer;

/* machine_corrections */
typedef enum gc_machine_corrections_field {
    GC_MCF_VARIABLE = GC_MF_COUNT, GC_MCF_POINTS,
    GC_MCF_TEMPERATURE, GC_MCF_T_FROM, GC_MCF_T_TO,
    GC_MCF_PRESSURE, GC_MCF_P_FROM, GC_MCF_P_TO,
    GC_MCF_HUMIDITY, GC_MCF_RH_FROM, GC_MCF_RH_TO,
    GC_MCF_COUNT
} gc_machine_corrections_field;

typedef struct gc_machine_corrections_request {
    gc_machine_head head;
    int variable;                  /* gc_machine_curve_variable */
    int points;
    gc_site_input from, to;        /* the range of the variable (T_K, P_Pa or RH) */
    int show[3];                   /* echo: 1 for the variable's range object */
} gc_machine_corrections_request;

typedef struct gc_machine_curve_line {
    double T_K, P_Pa, RH;          /* the ambient of the row */
    double net_power_W, heat_rate, thermal_efficiency;
    double output_ratio, heat_rate_ratio, output_correction, heat_rate_correction;
    double air_mass_flow_kg_per_s, exhaust_mass_flow_kg_per_s, exhaust_temperature_K;
    double firing_temperature_K, pressure_ratio;
    int active_limit;
} gc_machine_curve_line;

typedef struct gc_machine_corrections_answer {
    gc_machine_head_result head;
    gc_machine_curves curves;
    int n_lines;
    gc_machine_curve_line lines[GC_MACHINE_CURVE_MAX_POINTS];
    int variable;
} gc_machine_corrections_answer;

/* machine_readings */
typedef enum gc_machine_readings_field {
    GC_MRF_SITE = GC_MF_COUNT, GC_MRF_SITE_ALTITUDE, GC_MRF_SITE_TEMPERATURE,
    GC_MRF_SITE_PRESSURE, GC_MRF_SITE_RELATIVE_HUMIDITY,
    GC_MRF_READINGS, GC_MRF_COMPRESSOR_EXIT_PRESSURE, GC_MRF_COMPRESSOR_EXIT_TEMPERATURE,
    GC_MRF_EXHAUST_TEMPERATURE, GC_MRF_FUEL_MASS_FLOW, GC_MRF_FUEL, GC_MRF_FUEL_TEMPERATURE,
    GC_MRF_NET_POWER, GC_MRF_AIR_MASS_FLOW, GC_MRF_PART_LOAD, GC_MRF_BALANCE_TOLERANCE,
    GC_MRF_COUNT
} gc_machine_readings_field;

typedef struct gc_machine_readings_request {
    gc_machine_head head;
    gc_machine_readings readings;  /* site, readings (inlet from the head) */
    gc_fuel_spec fuel_spec;        /* how the readings' fuel was given (echo) */
} gc_machine_readings_request;

typedef struct gc_machine_readings_answer {
    gc_machine_head_result head;
    gc_machine_reduction red;
    gc_site site;                  /* the ambient, resolved */
} gc_machine_readings_answer;

#endif
