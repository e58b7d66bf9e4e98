/*
 * turbojet.h — the single-spool turbojet as a preset of the cycle engine
 * (cycle.h): flight at a Mach number and altitude (U.S. Standard Atmosphere
 * 1976 through site.h), diffuser, inlet pressure recovery, compressor,
 * combustor (a fuel, or air-standard heat to the turbine inlet temperature),
 * turbine driving the compressor, optional afterburner, and a convergent or
 * fully expanded nozzle. Outputs the propulsion figures.
 *
 * The chain (flow frame, per kg of intake air, start = free stream at the
 * flight speed):
 *   free stream (0) -> diffuser (kinetic, to rest, diffuser efficiency) ->
 *   inlet recovery loss (1 - recovery) -> compressor -> combustor ->
 *   turbine -> [afterburner] -> nozzle (kinetic, nozzle efficiency, to the
 *   exit static pressure) -> [plume: free expansion to ambient pressure, an
 *   under-expanded jet only: a throttle (cycle.h PRESSURE_LOSS ending on the
 *   ambient pressure) at any ratio, constant total enthalpy and velocity, not
 *   a bounded fractional loss] -> back to the free-stream state (closes the loop;
 *   the kinetic energy given up counts as work there).
 * Turbine work = compressor work / mechanical efficiency (the shaft balance),
 * imposed as the turbine's end temperature, which is found from the engine's
 * own compressor work and turbine-inlet state (one preliminary chain run, then
 * the final one). Stagnation states: the diffuser ends at rest, so every
 * station from there to the nozzle inlet is a stagnation state (V = 0);
 * the free stream and the nozzle exit carry V, T_total and P_total.
 *
 * Nozzle:
 *   expanded    the exit static pressure is the ambient pressure (a
 *               convergent-divergent nozzle matched to the flight condition).
 *   convergent  the exit static pressure is max(ambient, critical), where the
 *               critical pressure is the one at which the exit velocity equals
 *               the local speed of sound sqrt(k(T) R T) along the nozzle's
 *               expansion (with its efficiency: h = h0 - eta_n (h0 - h_s(P))),
 *               found by bisection in ln P to 1e-12; choked when the ambient
 *               pressure is below it. Pressure thrust (P9 - P0) A9 is then
 *               included.
 *
 * Figures (f = fuel per kg of intake air, all burners; V9 exit velocity,
 * A9/m_air = (1 + f) v9 / V9):
 *   specific thrust  F/m_air = (1 + f) V9 - V0 + (P9 - P0) A9/m_air, N s/kg
 *   TSFC             f / (F/m_air), kg/(N s)
 *   effective jet velocity V_eff = V9 + (P9 - P0) A9 / ((1 + f) m_air)
 *   thermal eff.     [(1 + f) V_eff^2/2 - V0^2/2] / (f LHV) (air-standard:
 *                    / heat in)
 *   propulsive eff.  F V0 / [(1 + f) V_eff^2/2 - V0^2/2]  (0 at rest)
 *   overall eff.     F V0 / (f LHV) = thermal x propulsive
 * (the standard definitions of propulsion texts; the effective jet velocity
 * puts the pressure thrust of an under-expanded jet into the kinetic term.)
 *
 * Units: SI (K, Pa, m/s, J/kg, N s/kg, kg/(N s)); fractions 0..1. The same
 * memory note as brayton.h: a result embeds a gc_cycle_result (~40 KB).
 */
#ifndef GASCYCLE_TURBOJET_H
#define GASCYCLE_TURBOJET_H

#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/preset.h"
#include "gascycle/site.h"

#define GC_TURBOJET_MACH_MAX 5.0      /* largest accepted flight Mach number */
#define GC_TURBOJET_RP_MAX 100.0      /* largest accepted compressor pressure ratio */
#define GC_TURBOJET_MAX_WARNINGS 8
#define GC_TURBOJET_MAX_ERRORS 16

#define GC_TURBOJET_NO_AREAS 2u       /* skip the engine's area integration */
#define GC_TURBOJET_NO_IDEAL 4u       /* skip the ideal turbojet (ideal_* fields stay 0) */

typedef enum gc_turbojet_nozzle {
    GC_NOZZLE_EXPANDED = 0,     /* exit static pressure = ambient */
    GC_NOZZLE_CONVERGENT = 1    /* exit static pressure = max(ambient, critical) */
} gc_turbojet_nozzle;

typedef enum gc_turbojet_heat_mode {
    GC_TURBOJET_AIR_STANDARD = 0, /* heat to the turbine inlet temperature, no fuel mass */
    GC_TURBOJET_FUEL = 1          /* burn `fuel` */
} gc_turbojet_heat_mode;

/* Field ids of the preset's table (preset.h); row 0 is the request. */
typedef enum gc_turbojet_field {
    GC_TF_REQUEST = 0,
    GC_TF_FLIGHT_MACH_NUMBER, GC_TF_ALTITUDE, GC_TF_SITE, GC_TF_INLET_PRESSURE_RECOVERY,
    GC_TF_DIFFUSER_EFFICIENCY, GC_TF_PRESSURE_RATIO, GC_TF_TURBINE_INLET_TEMPERATURE,
    GC_TF_COMPRESSOR_EFFICIENCY, GC_TF_TURBINE_EFFICIENCY, GC_TF_EFFICIENCY_BASIS,
    GC_TF_NOZZLE_EFFICIENCY, GC_TF_COMBUSTOR_PRESSURE_LOSS, GC_TF_COMBUSTOR_EFFICIENCY,
    GC_TF_MECHANICAL_EFFICIENCY, GC_TF_AFTERBURNER_TEMPERATURE, GC_TF_AFTERBURNER_PRESSURE_LOSS,
    GC_TF_NOZZLE, GC_TF_GAS, GC_TF_FUEL, GC_TF_FUEL_TEMPERATURE, GC_TF_HEAT_ADDITION,
    GC_TF_SITE_ALTITUDE, GC_TF_SITE_TEMPERATURE, GC_TF_SITE_PRESSURE,
    GC_TF_SITE_RELATIVE_HUMIDITY, GC_TF_GAS_CP, GC_TF_GAS_K,
    GC_TF_COUNT
} gc_turbojet_field;

/* Inputs (the preset's table: gc_turbojet_preset()). Defaults from
 * gc_turbojet_input_init: the ideal engine (efficiencies and recovery 1, no
 * losses), static (Mach 0) at sea level, expanded nozzle, air-standard, dry
 * air. */
typedef struct gc_turbojet_input {
    double flight_mach_number;          /* -, 0..GC_TURBOJET_MACH_MAX */
    int has_altitude;
    double altitude;                    /* m, geometric; USSA 1976 P and T (site.h) */
    gc_site_input site;                 /* temperature/pressure override, humidity; an
                                           altitude here is the same as `altitude` (give
                                           one). Relative humidity defaults to 0 (dry). */
    double inlet_pressure_recovery;     /* (0, 1], P_total after the inlet / after an
                                           isentropic-efficiency diffuser */
    double diffuser_efficiency;         /* (0, 1], isentropic, (h02s - h0)/(h02 - h0) */
    double pressure_ratio;              /* compressor P_out/P_in, -, (1, 100] */
    double turbine_inlet_temperature;   /* K */
    double compressor_efficiency;       /* (0, 1], isentropic or polytropic */
    double turbine_efficiency;          /* (0, 1], isentropic or polytropic */
    int polytropic_efficiency;          /* 1: the two above are polytropic */
    double nozzle_efficiency;           /* (0, 1], isentropic, (h0 - h9)/(h0 - h9s) */
    double combustor_pressure_loss;     /* fraction, [0, 0.5] */
    double combustor_efficiency;        /* (0, 1], also the afterburner's */
    double mechanical_efficiency;       /* (0, 1], compressor work / turbine work */
    double afterburner_temperature;     /* K, 0 = no afterburner */
    double afterburner_pressure_loss;   /* fraction, [0, 0.5] */
    gc_turbojet_nozzle nozzle;
    gc_turbojet_heat_mode heat_mode;
    int has_gas;                        /* 1: `gas` is the working fluid (air-standard) or
                                           the oxidiser (fuel mode, a mixture) */
    gc_gas gas;                         /* 0: the site's air */
    int has_fuel;                       /* 1: a fuel is given (also selects fuel mode) */
    gc_fuel fuel;                       /* fuel mode */
    gc_fuel_spec fuel_spec;             /* the fuel as given (its echo) */
    double fuel_temperature;            /* K, 200..1000, default 298.15 K */
    int has_fuel_temperature;           /* echo: 1 with a fuel */
    int has_afterburner;                /* echo: 1 with an afterburner (its two inputs) */
    unsigned flags;                     /* GC_TURBOJET_NO_AREAS | GC_TURBOJET_NO_IDEAL */
} gc_turbojet_input;

/* State indices into cycle.actual.states (-1: absent). */
typedef struct gc_turbojet_stations {
    int free_stream;            /* 0 */
    int diffuser_exit;          /* at rest after the diffuser */
    int compressor_inlet;       /* after the recovery loss */
    int compressor_exit;
    int turbine_inlet;
    int turbine_exit;
    int afterburner_exit;       /* -1 without afterburner */
    int nozzle_exit;
} gc_turbojet_stations;

/* cycle.actual is the engine's run of the chain (states with V, T_total,
 * P_total); cycle.ideal is the ideal turbojet at the same flight condition,
 * compressor pressure ratio and temperatures (every efficiency and the
 * recovery 1, no losses, shaft re-balanced, nozzle expanded to ambient),
 * run by the same engine — not gc_cycle_idealize's copy, whose turbine would
 * no longer balance the compressor and whose choked nozzle could not close. */
typedef struct gc_turbojet_result {
    gc_cycle_result cycle;      /* actual and ideal runs (see above), Carnot bound */
    gc_site site;               /* the ambient (free-stream static) conditions */
    gc_turbojet_stations stations;
    int has_fuel;
    double flight_velocity;     /* m/s, V0 = M0 sqrt(k R T0) */
    double speed_of_sound;      /* m/s, at the free stream */
    double specific_thrust;     /* N s/kg (N per kg/s of intake air) */
    double tsfc;                /* kg/(N s) */
    double tsfc_mg_per_Ns;      /* mg/(N s) */
    double fuel_air_ratio;      /* kg fuel / kg intake air, all burners */
    double fuel_air_ratio_main; /* kg fuel / kg air, main combustor */
    double heat_in;             /* J/kg intake air: f LHV, or the heat added (air-standard) */
    double thermal_efficiency;  /* - */
    double propulsive_efficiency; /* - (0 at Mach 0) */
    double overall_efficiency;  /* - */
    double compressor_work;     /* J/kg intake air */
    double turbine_work;        /* J/kg intake air, = compressor_work / eta_mech */
    double exit_velocity;       /* m/s, V9 */
    double effective_exit_velocity; /* m/s, with the pressure thrust */
    double exit_mach_number;    /* -, V9 / a9 */
    double exit_pressure;       /* Pa, static P9 */
    double exit_temperature;    /* K, static T9 */
    double critical_pressure;   /* Pa, convergent nozzle: P at the sonic exit (0 expanded) */
    int choked;                 /* 1: convergent nozzle with P9 = critical > ambient */
    int convergent;             /* 1: a convergent nozzle (critical_pressure applies) */
    double exit_area_per_air_flow; /* m2 per kg/s of intake air, A9 / m_air */
    double pressure_thrust;     /* N s/kg, (P9 - P0) A9 / m_air */
    double ideal_specific_thrust;     /* N s/kg, the ideal turbojet (efficiencies and
                                         recovery 1, no losses, expanded nozzle) */
    double ideal_thermal_efficiency;  /* - */
    int has_ideal_figures;      /* 1 when the ideal turbojet ran (ideal_* above) */
    int n_warnings;             /* the preset's own warnings (code "model"; field ids) */
    gc_warning warnings[GC_TURBOJET_MAX_WARNINGS];
} gc_turbojet_result;

/* The preset's descriptor (preset.h): the field table, outputs, hooks. */
const gc_preset *gc_turbojet_preset(void);

void gc_turbojet_input_init(gc_turbojet_input *in);

/* Bounds of every input (the table's) and the checks between them; collects
 * up to max_errors, with field paths (see gc_brayton_validate). */
int gc_turbojet_validate(const gc_turbojet_input *in, gc_error *errs, int max_errors,
                         int *n_errors);

/* Validates, resolves the flight condition, balances the shaft, sizes the
 * nozzle, evaluates (gc_cycle_evaluate) and fills *r. Cycle-dependent errors
 * (GC_ERR_INFEASIBLE): turbine inlet temperature not above the compressor
 * exit ("/turbine_inlet_temperature"); a turbine that cannot drive the
 * compressor or leaves no pressure for the nozzle ("/turbine_inlet_temperature"
 * or "/pressure_ratio"); afterburner temperature not above the turbine exit
 * ("/afterburner_temperature"). */
int gc_turbojet_evaluate(const gc_turbojet_input *in, gc_turbojet_result *r, gc_error *err);

#endif
