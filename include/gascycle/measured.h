/*
 * measured.h — reduction of measured data to the actual cycle's work and
 * efficiency and its shortfall from the ideal:
 *
 *   1. gas-turbine stations: measured total pressures and temperatures at
 *      the compressor inlet and outlet and the turbine inlet and outlet
 *      (optionally an intercooler between two compressor stages, a
 *      regenerator, fuel and air flows, a measured power);
 *   2. a cylinder-pressure trace of a piston engine: (crank angle, pressure)
 *      samples over one full cycle with the engine's geometry, or
 *      (volume, pressure) pairs.
 *
 * Stations (steady flow, per kg of air entering the compressor). Properties
 * come from the gas models of gas.h with their temperature-dependent cp
 * (never a constant-cp shortcut unless the gas is the cold model):
 *   isentropic efficiency   compressor (h2s - h1)/(h2 - h1), turbine
 *                           (h3 - h4)/(h3 - h4s), with T2s, T4s from the
 *                           variable-property isentrope at the measured
 *                           pressure ratio (gc_gas_T_isentropic_P);
 *   polytropic efficiency   the constant small-stage efficiency of the path
 *                           through the two measured states: compression
 *                           eta_p = R ln(P2/P1) / (s0(T2) - s0(T1)),
 *                           expansion eta_p = (s0(T3) - s0(T4)) / (R ln(P3/P4))
 *                           (from dh = v dP / eta_p and dh = eta_p v dP with
 *                           dh = cp dT and v = R T / P; the same curve the
 *                           cycle engine draws, cycle.h GC_CURVE_EFF_P);
 *   heat input              air-standard: h(T3) - h(T_combustor_inlet) on
 *                           one gas model (when no fuel analysis is given:
 *                           a warning says the turbine gas is the air);
 *                           with a named fuel but no flows: the fuel-air
 *                           ratio that heats the air from the combustor
 *                           inlet to T3 with complete combustion at
 *                           combustor efficiency 1 (combustion.h
 *                           gc_combustion_far_for_T), then as with flows
 *                           (a warning says so); with fuel and air flows: the
 *                           fuel's energy far x LHV, the turbine gas is the
 *                           complete-combustion products at that fuel-air
 *                           ratio (combustion.h), and the combustor
 *                           efficiency follows from the energy balance with
 *                           absolute enthalpies: eta_b = 1 - [h_air(T_ci) +
 *                           far h_fuel(T_fuel) - (1 + far) h_gas(T3)] /
 *                           (far LHV). With a cold gas (no species) the
 *                           balance uses sensible enthalpies above 298.15 K
 *                           instead: eta_b = [(1 + far)(h(T3) - h(298.15)) -
 *                           (h(T_ci) - h(298.15))] / (far LHV);
 *   thermal efficiency      net work / heat input (fuel: on the LHV), the
 *                           gas-path heat rate its inverse (J/J; the plant
 *                           heat rate is per unit of measured net power);
 *   ideal cycle             gc_brayton_evaluate with every efficiency 1 and
 *                           no pressure loss, the measured overall pressure
 *                           ratio P2/P1, turbine inlet temperature T3, the
 *                           same gas, the same regenerator effectiveness and
 *                           (with an intercooler) two compressor stages
 *                           intercooled to the measured intercooler outlet
 *                           temperature; burning the same fuel at combustor
 *                           efficiency 1 when the fuel's species are known
 *                           and the air is a species mixture, else
 *                           air-standard;
 *   Carnot bound            1 - T_min / T3, T_min the lowest station
 *                           temperature;
 *   exergy destroyed        T0 x entropy generated, per component (dead state
 *                           T0, P0: the site, by default the compressor
 *                           inlet): compressor and turbine stages (adiabatic),
 *                           intercooler (heat rejected at T0), regenerator
 *                           (adiabatic pair), combustor as heat addition from
 *                           a source at T3 on the air's properties (the
 *                           engine's boundary convention, cycle.h; the fuel's
 *                           chemical exergy beyond its heat is not counted);
 *                           the exhaust's flow exergy above the dead state is
 *                           reported apart as lost, not destroyed;
 *   shortfall               measured vs ideal thermal efficiency and the
 *                           work each component loses against its own ideal
 *                           at the measured states: compressor w_c - w_cs,
 *                           turbine w_ts - w_t, pressure losses (turbine
 *                           isentropic work over P3/P4 vs over the
 *                           compressor's P2/P1), combustor (heat not
 *                           reaching the gas x the ideal cycle's efficiency);
 *                           the largest of them is named.
 * Data checks (each an error on its input's JSON pointer, all collected): a
 * compressor outlet pressure above its inlet, a temperature rise across each
 * compressor stage, turbine inlet above outlet in pressure and temperature,
 * turbine inlet hotter than the combustor inlet and at no higher pressure,
 * intercooler and regenerator temperatures that a heat exchanger can reach.
 * An isentropic efficiency above 1 is a data error; between 1 and
 * 1 + GC_MEASURED_ETA_TOLERANCE it is accepted with a warning, since a
 * kelvin or two of temperature error on a few hundred kelvin of rise moves
 * the efficiency by about a per cent (common practice).
 *
 * Pressure trace (closed loop of one cylinder, one full cycle):
 *   volume        slider-crank relation V = Vc + (pi B^2 / 4)(l + a - a cos th
 *                 - sqrt(l^2 - a^2 sin^2 th)), a = stroke / 2, Vc = Vd/(r - 1),
 *                 th = 0 at top dead centre (J. B. Heywood, Internal
 *                 Combustion Engine Fundamentals, McGraw-Hill 1988, eq. 2.5
 *                 in the form with the crank radius and rod length;
 *                 from memory);
 *   work          the loop integral of P dV by the trapezoid rule over the
 *                 samples (the last sample joined to the first), error
 *                 O(h^2) in the angle step for a piecewise-smooth trace;
 *                 four-stroke: gross = compression and expansion strokes
 *                 (|th| < 180 deg from firing TDC), pumping = exhaust and
 *                 intake strokes, net = gross + pumping;
 *   IMEP          work / Vd (gross and net), PMEP = -pumping work / Vd;
 *   power         net (and gross) work x cylinders x speed / revolutions per
 *                 cycle;
 *   polytropic n  least squares of ln P on ln V over a crank-angle window
 *                 (compression and expansion), n = -slope, with R^2;
 *   ideal Otto    the piston.h Otto preset at the same compression ratio and
 *                 intake state, heated by the fuel's energy per kg of trapped
 *                 gas when the fuel per cycle and its LHV are given, else to
 *                 the trace's highest mean gas temperature P V / (m R) (the
 *                 trapped mass m = P V / (R T) at the intake state).
 * Limits: GC_MEASURED_TRACE_MIN..MAX samples, finite positive pressures,
 * strictly increasing crank angles spanning one cycle (720 deg four-stroke,
 * 360 deg two-stroke), short of it by at most the longest sample step or
 * GC_MEASURED_TRACE_GAP_DEG (the closing segment joins the last sample to the
 * first).
 *
 * Units: SI throughout (K, Pa, J/kg, J, m, m3, rad, rev/s, kg, kg/s, W);
 * fractions 0..1. Errors and warnings carry JSON pointers to the API's input
 * keys ("/compressor_outlet/T", "/trace/12/1"). Inputs and results are plain
 * values except the trace arrays, which the caller owns (borrowed).
 */
#ifndef GASCYCLE_MEASURED_H
#define GASCYCLE_MEASURED_H

#include "gascycle/brayton.h"
#include "gascycle/combustion.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/preset.h"
#include "gascycle/site.h"
#include "gascycle/validity.h"

#define GC_MEASURED_ETA_TOLERANCE 0.02   /* isentropic efficiency above 1 accepted up to 1.02 */
#define GC_MEASURED_MAX_ERRORS 16
#define GC_MEASURED_MAX_WARNINGS 12
#define GC_MEASURED_WARNING_LEN 256
#define GC_MEASURED_TRACE_MIN 36         /* samples in a trace */
#define GC_MEASURED_TRACE_MAX 20000
#define GC_MEASURED_TRACE_GAP_DEG 5.0    /* closing gap always accepted, deg (or the longest step) */
#define GC_MEASURED_LOOP_TOL 0.05        /* first vs last pressure mismatch that is warned */

typedef struct gc_measured_warning {
    char field[GC_ERROR_FIELD_LEN];        /* JSON pointer of the input concerned, or "" */
    char code[32];                         /* short snake_case code */
    char message[GC_MEASURED_WARNING_LEN]; /* one sentence */
} gc_measured_warning;

/* ---- gas-turbine stations ------------------------------------------------ */

typedef struct gc_measured_station {
    double T_K;                 /* total temperature, K */
    double P_Pa;                /* total pressure, Pa */
} gc_measured_station;

typedef struct gc_measured_stations_input {
    gc_gas gas;                         /* air-side working fluid (air, humid air or cold) */
    gc_measured_station compressor_inlet;
    gc_measured_station compressor_outlet;
    gc_measured_station turbine_inlet;
    gc_measured_station turbine_outlet;
    int has_intercooler;                /* 1: two compressor stages with an intercooler */
    gc_measured_station intercooler_inlet;  /* LP compressor outlet */
    gc_measured_station intercooler_outlet; /* HP compressor inlet */
    int has_regenerator;                /* 1: regenerator between compressor and combustor */
    gc_measured_station regenerator_air_outlet; /* combustor inlet */
    gc_measured_station regenerator_gas_outlet; /* exhaust */
    double air_mass_flow;               /* kg/s, 0 = not given */
    double fuel_mass_flow;              /* kg/s, 0 = not given */
    int has_fuel;                       /* 1: `fuel` is valid */
    gc_fuel fuel;                       /* the fuel (species or formula with LHV) */
    int fuel_species;                   /* 1: the products can be formed (fuel of combustion.h) */
    double fuel_heating_value;          /* J/kg LHV when no `fuel` is given; 0 = none */
    double fuel_temperature;            /* K, fuel supply temperature (0: 298.15 K) */
    double net_power;                   /* W, measured net power, 0 = not given */
    double T_dead_K, P_dead_Pa;         /* exergy dead state (0: compressor inlet) */
} gc_measured_stations_input;

/* One compressor stage or the turbine. */
typedef struct gc_measured_machine {
    double pressure_ratio;              /* P_high / P_low, - (> 1) */
    double work;                        /* J/kg air, absorbed (compressor) or delivered, > 0 */
    double work_isentropic;             /* J/kg air, the isentropic work at the same ratio */
    double T_isentropic_K;              /* K, isentropic outlet temperature */
    double isentropic_efficiency;       /* - */
    double polytropic_efficiency;       /* - */
    double exergy_destroyed;            /* J/kg air, T0 x s_gen */
} gc_measured_machine;

typedef struct gc_measured_stations_result {
    gc_gas turbine_gas;                 /* the gas through the turbine (products or the air) */
    int products;                       /* 1 when turbine_gas is combustion products */
    double fuel_air_ratio;              /* kg fuel / kg air: from the flows, or from the
                                           combustor energy balance (far_from_balance), else 0 */
    int far_from_balance;               /* 1: no flows, a named fuel: fuel_air_ratio solved
                                           from the combustor energy balance (complete
                                           combustion, combustor efficiency 1) */
    double mass_ratio;                  /* turbine flow per kg air, 1 + far */
    int n_compressor_stages;            /* 1 or 2 */
    gc_measured_machine compressor[2];  /* stage 1 (LP), stage 2 (HP) */
    gc_measured_machine turbine;
    double compressor_work;             /* J/kg air, all stages */
    double compressor_work_isentropic;  /* J/kg air, sum of the stages' isentropic works */
    double turbine_work;                /* J/kg air, (1 + far) (h3 - h4) */
    double net_work;                    /* J/kg air */
    double back_work_ratio;             /* - */
    double heat_in;                     /* J/kg air: air-standard h3 - h_ci, fuel far x LHV */
    double heat_to_gas;                 /* J/kg air, heat that reached the gas in the combustor */
    int fuel_basis;                     /* 1: heat_in is the fuel's energy (LHV) */
    double combustor_efficiency;        /* -, fuel_basis only */
    double combustor_pressure_loss;     /* -, 1 - P3 / P_ci */
    double intercooler_heat;            /* J/kg air, removed, >= 0 */
    double intercooler_pressure_loss;   /* - */
    double regenerator_heat;            /* J/kg air, gained by the air */
    double regenerator_gas_heat;        /* J/kg air, given up by the gas */
    double regenerator_effectiveness;   /* -, Q / min(Q_max,air, Q_max,gas) (cycle.h's form) */
    double regenerator_balance;         /* -, (gas heat - air heat) / air heat */
    double regenerator_air_pressure_loss, regenerator_gas_pressure_loss; /* - */
    double thermal_efficiency;          /* - */
    double gas_path_heat_rate;          /* J/J, heat input per unit of gas-path net work,
                                           1 / thermal efficiency (not the plant heat rate,
                                           which is per unit of measured net power) */
    double T_exhaust_K, P_exhaust_Pa;   /* K, Pa: leaving the turbine or the regenerator */
    /* flows (has_flow: air_mass_flow given) */
    int has_flow;
    double compressor_power, turbine_power, net_power_gas_path; /* W */
    double heat_input_power;            /* W */
    int has_power;                      /* net_power given */
    double power_ratio;                 /* -, measured net power / gas-path net power (has_flow) */
    double plant_efficiency;            /* -, net power / fuel energy flow (fuel flow, LHV) */
    double plant_heat_rate;             /* J/J, fuel energy (LHV) per unit of measured net
                                           power: what the Brayton preset calls heat_rate */
    /* ideal cycle and bounds */
    double ideal_thermal_efficiency;    /* - */
    double ideal_net_work;              /* J/kg air */
    double ideal_heat_in;               /* J/kg air */
    double ideal_back_work_ratio;       /* - */
    int ideal_fuel_basis;               /* 1: the ideal burns the fuel (LHV basis) */
    double carnot_efficiency;           /* -, 1 - T_min / T3 */
    double T_min_K, T_max_K;            /* K */
    /* exergy, J/kg air */
    double T_dead_K, P_dead_Pa;         /* dead state used */
    double exergy_compressor, exergy_turbine, exergy_combustor;
    double exergy_intercooler, exergy_regenerator;
    double exergy_destroyed;            /* sum of the above */
    double exergy_exhaust;              /* flow exergy leaving with the exhaust (lost) */
    /* shortfall */
    double efficiency_gap;              /* -, ideal - measured */
    double fraction_of_ideal;           /* -, measured / ideal */
    double deficit_compressor, deficit_turbine, deficit_pressure_losses, deficit_combustor;
                                        /* J/kg air, work lost against each ideal (>= 0 normally) */
    const char *largest_loss;           /* "compressor", "turbine", "pressure_losses", "combustor" */
    gc_validity_scan validity;          /* real-gas and dissociation rules over the stations */
    int n_warnings;
    gc_measured_warning warnings[GC_MEASURED_MAX_WARNINGS];
} gc_measured_stations_result;

/* Zeroes *in and sets air as the gas. */
void gc_measured_stations_input_init(gc_measured_stations_input *in);

/* Checks the data (positivity, validity ranges, consistency between
 * stations) and collects up to max_errors errors into errs; returns GC_OK
 * or the first code, *n_errors the count (may be NULL). */
int gc_measured_stations_validate(const gc_measured_stations_input *in, gc_error *errs,
                                  int max_errors, int *n_errors);

/* Validates (the first error into err), reduces and evaluates the ideal
 * cycle. Efficiencies beyond 1 + GC_MEASURED_ETA_TOLERANCE are GC_ERR_INVALID
 * on the outlet temperature of the machine. r is about 2 KB. */
int gc_measured_stations_reduce(const gc_measured_stations_input *in,
                                gc_measured_stations_result *r, gc_error *err);

/* ---- cylinder-pressure trace ------------------------------------------- */

typedef struct gc_measured_geometry {
    double bore;                        /* m */
    double stroke;                      /* m */
    double rod_length;                  /* m, connecting rod, centre to centre (> stroke/2) */
    double compression_ratio;           /* -, (Vd + Vc) / Vc */
} gc_measured_geometry;

/* Slider-crank volume at crank angle theta (rad, 0 = TDC), m3; dV/dtheta in
 * m3/rad through dV (may be NULL). The geometry must be valid. */
double gc_measured_volume(const gc_measured_geometry *g, double theta_rad, double *dV);

/* Swept and clearance volumes of one cylinder, m3. */
double gc_measured_displacement(const gc_measured_geometry *g);
double gc_measured_clearance(const gc_measured_geometry *g);

typedef struct gc_measured_trace_input {
    int pv;                             /* 0: x = crank angle (rad); 1: x = volume (m3) */
    int n;                              /* samples */
    const double *x;                    /* n angles (rad, strictly increasing) or volumes (m3) */
    const double *P;                    /* n pressures, Pa */
    gc_measured_geometry geometry;      /* angle traces (pv = 0) */
    int strokes;                        /* 2 or 4 (pv = 0) */
    double tdc_angle;                   /* rad, angle of firing TDC in the trace's angles */
    int cylinders;                      /* >= 1 */
    double speed;                       /* rev/s, 0 = not given */
    double compression_window[2];       /* rad from firing TDC, fit window (pv = 0; pv = 1
                                           uses the branch samples between 20 % and 70 % of
                                           the swept volume above V_min) */
    double expansion_window[2];         /* rad from firing TDC */
    gc_gas gas;                         /* trapped gas for the ideal Otto (air or cold) */
    double intake_temperature;          /* K, state at the start of compression */
    double intake_pressure;             /* Pa, 0: the trace's pressure at BDC before compression */
    double fuel_per_cycle;              /* kg per cylinder per cycle, 0 = not given */
    double fuel_heating_value;          /* J/kg LHV, 0 = not given */
} gc_measured_trace_input;

typedef struct gc_measured_fit {
    int samples;                        /* points in the window */
    double n;                           /* polytropic exponent, - */
    double r_squared;                   /* coefficient of determination of the fit, - */
    double window[2];                   /* rad from firing TDC (pv: volume fractions) */
} gc_measured_fit;

typedef struct gc_measured_trace_result {
    double displacement;                /* m3, one cylinder */
    double clearance;                   /* m3 */
    double V_min, V_max;                /* m3, over the samples */
    double compression_ratio;           /* -, the geometry's (pv: V_max / V_min of the samples) */
    double work_net;                    /* J per cylinder per cycle, loop integral */
    double work_gross;                  /* J, compression + expansion strokes (4-stroke) */
    double work_pumping;                /* J, exhaust + intake strokes (4-stroke), usually < 0 */
    double imep_net, imep_gross, pmep;  /* Pa */
    int has_power;
    double power_net, power_gross;      /* W, all cylinders */
    double P_max;                       /* Pa, highest sample */
    double angle_P_max;                 /* rad from firing TDC (pv: 0) */
    double V_P_max;                     /* m3 at the highest sample */
    double loop_mismatch;               /* -, |P_last - P_first| / max of the two */
    int has_fits;
    gc_measured_fit compression, expansion;
    /* ideal Otto at the same compression ratio and intake state (has_ideal: 0 when
       the trace never gets hotter than the ideal compression end, e.g. a motored
       trace without fuel data; a warning says so) */
    int has_ideal;
    double intake_temperature, intake_pressure; /* K, Pa used */
    double trapped_mass;                /* kg */
    double T_mean_max;                  /* K, highest P V / (m R) over the closed part */
    double P_at_T_mean_max;             /* Pa, the sample pressure there */
    int heat_from_fuel;                 /* 1: the ideal is heated by the fuel's energy */
    double ideal_heat_added;            /* J/kg trapped gas */
    double ideal_efficiency;            /* - */
    double ideal_work;                  /* J per cycle (trapped mass x net work) */
    double ideal_mep;                   /* Pa */
    double ideal_peak_pressure, ideal_peak_temperature; /* Pa, K */
    int has_fuel;
    double fuel_energy;                 /* J per cycle */
    double efficiency_gross, efficiency_net; /* -, indicated */
    double fraction_of_ideal;           /* -, gross indicated / ideal efficiency (fuel), else
                                           gross work / ideal work */
    gc_validity_scan validity;          /* real-gas and dissociation rules: the trace's hottest
                                           mean gas state and the ideal Otto's states */
    int n_warnings;
    gc_measured_warning warnings[GC_MEASURED_MAX_WARNINGS];
} gc_measured_trace_result;

/* Validates the geometry and the samples (the first error into err, field
 * "/trace/<i>/<j>" for a sample) and reduces the trace. */
int gc_measured_trace_reduce(const gc_measured_trace_input *in, gc_measured_trace_result *r,
                             gc_error *err);


/* ---- the two reductions as presets (preset.h) --------------------------------
 * /v1/measured/stations and /v1/measured/pressure-trace: the field tables
 * hold the readings as a request gives them (with the defaults and bounds),
 * evaluate resolves the site (its temperature and pressure default to the
 * compressor inlet's), checks the relations between readings and runs the
 * reductions above; the results carry what the documents show. */

/* One station's readings (total T and P). */
typedef struct gc_stations_reading {
    double T_K, P_Pa;
    int has_T, has_P;
} gc_stations_reading;

typedef struct gc_stations_request {
    gc_stations_reading compressor_inlet, compressor_outlet, turbine_inlet, turbine_outlet;
    gc_stations_reading intercooler_inlet, intercooler_outlet;
    gc_stations_reading regenerator_air_outlet, regenerator_gas_outlet;
    int has_intercooler, has_regenerator;   /* the objects were given (echo: all four) */
    double air_mass_flow, fuel_mass_flow;   /* kg/s, GC_UNSET: not given */
    int has_air_mass_flow, has_fuel_mass_flow;
    int has_fuel;
    gc_fuel fuel;
    gc_fuel_spec fuel_spec;
    double fuel_heating_value;              /* J/kg */
    int has_fuel_heating_value;
    double fuel_temperature;                /* K, 200..1000, default 298.15 */
    int has_fuel_temperature;               /* echo: 1 with a fuel */
    double net_power;                       /* W */
    int has_net_power;
    int has_gas;
    gc_gas gas;
    gc_site_input site;
} gc_stations_request;

/* A station as the document lists it. */
typedef struct gc_stations_state {
    const char *station;
    double T_K, P_Pa, h_J_per_kg, s_J_per_kgK;
    char gas[GC_GAS_LABEL_LEN];
} gc_stations_state;

typedef struct gc_stations_reduction {
    gc_measured_stations_input in;          /* the reduction's input as resolved */
    gc_measured_stations_result r;
    gc_site site;
    const char *title;
    int n_states;
    gc_stations_state states[8];
    int single_compressor;                  /* 1: no intercooler */
    int has_plant, has_fuel_flow, has_plant_efficiency;
    double compressor_isentropic_efficiency, compressor_polytropic_efficiency;
    double pressure_ratio;
    double intercooler_heat_out;            /* J/kg, the intercooler's heat (negative) */
    const char *heat_input_basis, *fuel_air_ratio_basis, *ideal_heat_input_basis;
} gc_stations_reduction;

/* The stations preset's descriptor. */
const gc_preset *gc_stations_preset(void);


typedef struct gc_trace_request {
    int n;                                  /* samples (trace or pv_trace) */
    double *x, *P;                          /* as given (degrees or volume_unit, pressure_unit);
                                               allocated by the decoder, shared by both rows */
    int has_trace, has_pv;
    char pressure_unit[GC_FIELD_STRING_LEN], volume_unit[GC_FIELD_STRING_LEN];
    int echo_pressure_unit, echo_volume_unit, echo_tdc_angle;
    double bore, stroke, rod, compression_ratio, displacement; /* m, m, m, -, m3 */
    int has_bore, has_stroke, has_rod, has_compression_ratio, has_displacement;
    int cylinders, strokes;
    double speed;                           /* rev/s */
    int has_speed;
    double tdc_angle;                       /* rad */
    double compression_window[2], expansion_window[2]; /* rad from firing TDC */
    int n_compression_window, n_expansion_window;
    int has_compression_window, has_expansion_window;
    double intake_temperature;              /* K */
    int has_intake_temperature;
    double intake_pressure;                 /* Pa */
    int has_intake_pressure;
    int has_gas;
    gc_gas gas;
    int has_fuel;
    gc_fuel fuel;
    gc_fuel_spec fuel_spec;
    double fuel_heating_value, fuel_per_cycle; /* J/kg, kg */
    int has_fuel_heating_value, has_fuel_per_cycle;
    double pressure_gain;                   /* -, applied to every sample (default 1) */
    double pressure_offset;                 /* Pa, added after the gain (default 0) */
} gc_trace_request;

typedef struct gc_trace_reduction {
    gc_measured_trace_input in;             /* as reduced (its sample pointers are not kept) */
    gc_measured_trace_result r;
    const char *title;
    int pv, angles;                         /* a P-V loop, or a crank-angle trace */
    int cylinders, strokes, samples;
    double engine_displacement;             /* m3, all cylinders */
    int has_ideal_and_fuel;
    double efficiency_gap;                  /* ideal - gross indicated efficiency */
    const char *heat_source, *shortfall_basis;
} gc_trace_reduction;

/* The pressure-trace preset's descriptor. */
const gc_preset *gc_trace_preset(void);

#endif
