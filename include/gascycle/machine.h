/*
 * machine.h — a fixed single-shaft, generator-driven gas turbine at today's
 * conditions (off-design model), built on the cycle engine through the
 * Brayton preset (brayton.h): every operating point is a simple-cycle chain
 * evaluated by the engine; this module only finds which chain the fixed
 * machine runs.
 *
 * 1. The machine is defined by its design point (gc_machine_define), either
 *    - FROM_CYCLE: a simple-cycle, fuel-fired gc_brayton_input with its rated
 *      net power (one compressor and one turbine stage, no regenerator), or
 *    - FROM_RATING: the figures a plant has on paper (net output, heat rate
 *      LHV, exhaust flow and temperature, pressure ratio at the rating
 *      conditions, fuel) plus the compressor efficiency or discharge
 *      temperature. Air flow = exhaust flow - fuel flow (fuel flow = heat rate
 *      x output / LHV); firing temperature from the combustor balance; turbine
 *      efficiency from the exhaust temperature; the mechanical efficiency
 *      closes the energy balance (it carries every loss between the gas path
 *      and the terminals that the generator efficiency does not). Figures that
 *      cannot be met (an efficiency above 1, a negative air flow) are an error
 *      naming the rated figure and by how much.
 *
 * 2. Off-design laws (single shaft at constant speed, fixed geometry):
 *    compressor  corrected flow m sqrt(R T1)/P1 at the compressor inlet is
 *                fixed by the corrected speed N/sqrt(R T1) and the IGV
 *                position (dimensional analysis of a compressor; constant
 *                speed N): W/W_d = (Nc/Nc_d)^s x f_igv x (1 + flow change),
 *                s = compressor_speed_exponent (0 = constant corrected flow,
 *                a vertical speed line; the default). The compressor is
 *                taken as choked on its speed line: its pressure ratio is
 *                set by the turbine, not by its own map.
 *    efficiency  constant off design (design value + condition change), times
 *                (1 - a (1 - f_igv)^2) with a = igv_efficiency_coefficient
 *                (default 0: constant) on IGV closure; turbine constant.
 *    turbine     the first nozzle is choked: its flow function m sqrt(R T)/P
 *                at the nozzle inlet (combustor exit: the gas the combustor
 *                delivers, at the combustor-exit temperature and pressure) is
 *                held at its design value (an effective throat area, m2; the
 *                weak change of the critical flow function with the ratio of
 *                specific heats is neglected). This sets the pressure ratio.
 *    R in both is the gas constant of the gas at that station (humid air,
 *    combustion products), so humidity and fuel-air ratio enter the laws.
 *
 * 3. Control: base load runs at the firing-temperature limit or at the
 *    exhaust-temperature limit, whichever gives the lower firing temperature
 *    (defaults: both at their design values, so both bind at the design
 *    point). Part load first closes the IGVs (flow fraction from 1 down to
 *    igv_minimum_flow_fraction) with the firing temperature still at the
 *    lower of the two limits (the exhaust held at its limit once it binds),
 *    then lowers the firing temperature at minimum IGV. The load is a net
 *    power or a fraction of base load at the same conditions, never below
 *    minimum_load_fraction of base load.
 *
 * 4. Cooled turbine (optional, gc_machine_cooling): cooling air is bled at
 *    compressor delivery; the coolant of each cooled row (first nozzle row,
 *    first rotor row) per kg of gas through that row follows the convective
 *    blade-cooling model of Holland & Thake (1980) in the form given by
 *    Horlock, "Advanced Gas Turbine Cycles" (2003), eq. 5.8 (the form
 *    El-Masri used): psi = m_c/m_g = K (T_g - T_b)/(T_b - T_c), K the
 *    row's constant (cooling efficiency folded in), T_g the gas temperature
 *    entering the row (nozzle: combustor exit; rotor: the mixed rotor inlet),
 *    T_b the allowed blade metal temperature, T_c the coolant (compressor
 *    delivery) temperature; psi = 0 when T_g <= T_b. All coolant is mixed
 *    back before the first rotor at the turbine inlet pressure (the
 *    single-step cooling model of the same book, ch. 4): the engine's chain
 *    burns all the compressor air to the mixed rotor-inlet temperature, which
 *    is, by the energy balance of complete combustion, the same state as core
 *    products at the combustor-exit temperature mixed with the coolant. The
 *    combustor-exit (turbine inlet) and rotor-inlet (firing) temperatures are
 *    both reported. Simplification stated: the rotor row's coolant is
 *    expanded through the whole turbine (optimistic for the rotor coolant's
 *    lost work); mixing is at constant pressure, its pressure loss not
 *    modelled. gc_machine_cooling_split / gc_machine_cooling_from_tit are
 *    public so the Brayton preset can use the same model.
 *
 * 5. Inlet treatment (gc_machine_inlet), between the ambient and the
 *    compressor inlet, with the ASHRAE Handbook-Fundamentals (2017) ch. 1
 *    relations of humid.h: evaporative cooler T_out = T - eps (T - T_wb)
 *    along the constant thermodynamic wet-bulb line (eqs. 33/35 for W at
 *    T_out), fogging to saturation (eps = 1), or a chiller to a set
 *    temperature (condensing to saturation below the dew point; its duty from
 *    the moist-air enthalpy, eq. 32, with condensate at the set temperature,
 *    drawn from the output as duty / COP). The treatment's own pressure loss
 *    (added_pressure_loss) adds to the design's inlet loss:
 *    1 - (1 - L_design)(1 - L_added). The engine's cycle starts at the air
 *    leaving the treatment (its state 0, also its dead state).
 *
 * 6. Answers: a site evaluation (gc_machine_evaluate); correction curves of
 *    base-load output and heat rate against ambient temperature, pressure or
 *    humidity at the reference conditions (gc_machine_curves; reference ISO
 *    2314: 15 degC, 101.325 kPa, 60 % RH unless given); the reduction of plant
 *    readings (gc_machine_reduce): firing temperature and air flow from the
 *    heat balance (never a measured turbine inlet temperature), compressor
 *    and turbine efficiencies, output and heat rate corrected to the
 *    reference with the model's own factors, and degradation against the
 *    new-and-clean model at the same conditions.
 *
 * Units: SI throughout (K, Pa, kg/s, W, J/kg); fractions 0..1; heat rates
 * in J/J (kJ/kWh / 3600) with kJ/kWh copies; efficiency "points" are
 * fractions (0.01 = one point). Net output is at the generator terminals
 * minus the inlet chiller's power.
 *
 * Errors and warnings carry JSON pointers: "/design/<brayton key>",
 * "/rating/<key>", "/reference/<site key>", "/laws/<key>", "/cooling/<key>"
 * for the machine; "/site/<key>", "/inlet/<key>", "/load/<key>",
 * "/condition/<key>" for a site evaluation; "/curve/<key>" for curves;
 * "/readings/<key>" (and "/site", "/inlet") for readings. The keys are the
 * struct field names without their unit suffix (e.g. exhaust_temperature_K ->
 * "/rating/exhaust_temperature"). Warnings also carry a stable code
 * (GC_MACHINE_W_...).
 *
 * Memory: plain values, no heap. A gc_machine is about 10 KB, a
 * gc_machine_site_result about 50 KB (it embeds a gc_brayton_result); an
 * evaluation uses about 100 KB of stack (engine scratch runs included).
 * No global state: any number of evaluations may run in parallel.
 */
#ifndef GASCYCLE_MACHINE_H
#define GASCYCLE_MACHINE_H

#include "gascycle/brayton.h"
#include "gascycle/combustion.h"
#include "gascycle/cooling.h"
#include "gascycle/error.h"
#include "gascycle/site.h"

#define GC_MACHINE_MAX_WARNINGS 12
#define GC_MACHINE_WARNING_LEN 256
#define GC_MACHINE_CODE_LEN 40
#define GC_MACHINE_CURVE_MAX_POINTS 101

/* Warning codes (stable strings; new ones may be added, none renamed). */
#define GC_MACHINE_W_SITE "site_condition"                /* from site.h (altitude, ice) */
#define GC_MACHINE_W_UNCOOLED_HOT "uncooled_hot_turbine"  /* no cooling model above ~1500 K */
#define GC_MACHINE_W_MECH_LOW "mechanical_efficiency_low" /* rated figures leave > 5 % unaccounted */
#define GC_MACHINE_W_TREATMENT_IDLE "inlet_treatment_idle" /* treatment would not cool: off */
#define GC_MACHINE_W_CHILLER_CONDENSING "chiller_condensing" /* set point below the dew point */
#define GC_MACHINE_W_ICING "inlet_icing_risk"             /* compressor inlet near freezing, humid */
#define GC_MACHINE_W_FAR_FROM_DESIGN "far_from_design"    /* corrected speed or flow far off design */
#define GC_MACHINE_W_READING_FUEL "readings_fuel_differs" /* readings' fuel is not the design's */
#define GC_MACHINE_W_AIR_FLOW_BALANCE "air_flow_balance"  /* measured air flow vs heat balance */
#define GC_MACHINE_W_LIMIT_ABOVE_DESIGN "limit_above_design" /* a limit above its design value */

/* Default figures (each written once here; bounds beside the fields). */
#define GC_MACHINE_DEFAULT_MIN_LOAD 0.10      /* fraction of base load: below about 10 % a
                                                 single-shaft unit is near full-speed no load,
                                                 where constant component efficiencies mean
                                                 little (common practice) */
#define GC_MACHINE_DEFAULT_EVAP_EFF 0.85      /* rigid-media evaporative coolers reach about
                                                 0.85-0.95 (common practice) */
#define GC_MACHINE_DEFAULT_CHILLER_T_K 283.15 /* 10 degC set point (common practice) */
#define GC_MACHINE_DEFAULT_CHILLER_COP 5.0    /* electric centrifugal chillers about 4-6
                                                 (common practice) */
#define GC_MACHINE_DEFAULT_BALANCE_TOL 0.02   /* readings: heat-balance closure allowed, fraction
                                                 of fuel energy (flow metering about 1-2 %:
                                                 common practice) */
#define GC_MACHINE_READINGS_FLOW_TOL 0.15 /* readings: heat-balance air flow, or the nozzle flow
                                                 function it implies with the discharge
                                                 pressure, this far (fraction) from the model's
                                                 is a reading error, not wear (fouling and
                                                 erosion take a few per cent: common practice) */
#define GC_MACHINE_UNCOOLED_T_K GC_BRAYTON_TIT_COOLED_K

/* ---- the machine's definition ------------------------------------------- */

typedef enum gc_machine_design_kind {
    GC_MACHINE_FROM_CYCLE = 0,    /* design = a simple-cycle gc_brayton_input */
    GC_MACHINE_FROM_RATING = 1    /* design = rated figures; component figures solved */
} gc_machine_design_kind;

/* Rated figures at the rating conditions (FROM_RATING). Pointers "/rating/...". */
typedef struct gc_machine_rating {
    double net_power_W;           /* rated net electric output, W, (0, 1e10]; required */
    double heat_rate;             /* rated heat rate LHV, J/J, (1, 10]; required */
    double exhaust_mass_flow_kg_per_s; /* exhaust gas flow, kg/s, > 0; required */
    double exhaust_temperature_K; /* leaving the turbine, K; required */
    double pressure_ratio;        /* compressor delivery / compressor inlet pressure,
                                     (1, 200]; required */
    double compressor_efficiency; /* isentropic, (0.5, 1]; 0 = solve it from
                                     compressor_exit_temperature_K (one of the two required) */
    double compressor_exit_temperature_K; /* K; 0 = not given */
    double inlet_pressure_loss;   /* fraction, [0, 0.5], default 0 */
    double combustor_pressure_loss; /* fraction, [0, 0.5], default 0 */
    double exhaust_pressure_loss; /* fraction, [0, 0.5], default 0 */
    double combustor_efficiency;  /* (0, 1], default 1 */
    double generator_efficiency;  /* (0, 1], default 1 (then the solved mechanical efficiency
                                     holds the generator's losses too) */
    int has_fuel;                 /* 1 when fuel is set; required */
    gc_fuel fuel;                 /* combustion.h */
    double fuel_temperature_K;    /* K, 0 = 298.15 K */
    gc_site_input site;           /* rating conditions, no flags = ISO ("/rating/site/...") */
} gc_machine_rating;

/* The machine: design point, laws, limits, reference conditions. */
typedef struct gc_machine_spec {
    gc_machine_design_kind design_kind; /* default FROM_CYCLE */
    gc_brayton_input design;      /* FROM_CYCLE: fuel mode, net_power > 0, one compressor and one
                                     turbine stage, no regenerator; turbine_inlet_temperature is
                                     the combustor exit; its site is the design conditions */
    gc_machine_rating rating;     /* FROM_RATING */
    gc_site_input reference;      /* reference conditions for corrections; no flags = ISO 2314
                                     (288.15 K, 101325 Pa, 60 %) */
    double compressor_speed_exponent; /* s = d ln(corrected flow) / d ln(corrected speed),
                                     [0, 4], default 0 (constant corrected flow) */
    double igv_minimum_flow_fraction; /* corrected flow at closed IGVs / open, [0.5, 1],
                                     default 1 (IGVs not modulated) */
    double igv_efficiency_coefficient; /* a in eta_c x (1 - a (1 - f_igv)^2), [0, 2], default 0 */
    double firing_temperature_limit_K; /* K, 0 = the design firing temperature */
    double exhaust_temperature_limit_K; /* K, 0 = the design exhaust temperature */
    double minimum_load_fraction; /* of base load, [0, 0.9], default GC_MACHINE_DEFAULT_MIN_LOAD */
    gc_machine_cooling cooling;
} gc_machine_spec;

typedef struct gc_machine_warning {
    char code[GC_MACHINE_CODE_LEN];          /* GC_MACHINE_W_... */
    char field[GC_ERROR_FIELD_LEN];          /* JSON pointer of the input concerned, or "" */
    char message[GC_MACHINE_WARNING_LEN];    /* one sentence */
} gc_machine_warning;

/* Which load control is in force. */
typedef enum gc_machine_control {
    GC_MACHINE_BASE_LOAD = 0,     /* IGVs open, firing temperature at the lower of the limits */
    GC_MACHINE_IGV_CONTROL = 1,   /* part load: IGVs closing, temperature limit held */
    GC_MACHINE_FIRING_CONTROL = 2 /* part load: IGVs at minimum, firing temperature lowered */
} gc_machine_control;

/* Which temperature limit sets the firing temperature. */
typedef enum gc_machine_limit {
    GC_MACHINE_LIMIT_FIRING = 0,  /* firing temperature at its limit (exhaust at or below) */
    GC_MACHINE_LIMIT_EXHAUST = 1, /* exhaust temperature at its limit, firing below its own */
    GC_MACHINE_LIMIT_NONE = 2     /* neither: firing temperature lowered to meet the load */
} gc_machine_limit;

/* One operating point. */
typedef struct gc_machine_point {
    int control;                  /* gc_machine_control */
    int active_limit;             /* gc_machine_limit */
    double net_power_W;           /* generator output minus chiller power, W */
    double generator_power_W;     /* at the terminals, W */
    double chiller_power_W;       /* W (0 without a chiller) */
    double base_net_power_W;      /* base-load net output at the same conditions, W */
    double load_fraction;         /* net_power / base_net_power, - */
    double heat_rate;             /* LHV, on net output, J/J */
    double heat_rate_hhv;         /* HHV, J/J */
    double heat_rate_kJ_per_kWh;  /* LHV, kJ/kWh */
    double heat_rate_hhv_kJ_per_kWh; /* HHV, kJ/kWh */
    double thermal_efficiency;    /* net output / fuel LHV input, - */
    double fuel_mass_flow_kg_per_s;
    double heat_input_W;          /* fuel flow x LHV, W */
    double heat_input_hhv_W;      /* fuel flow x HHV, W */
    double fuel_air_ratio;        /* kg fuel / kg compressor air, - */
    double air_mass_flow_kg_per_s; /* humid air into the compressor, kg/s */
    double exhaust_mass_flow_kg_per_s; /* kg/s (coolant returned) */
    double cooling_air_fraction;  /* coolant / compressor air, - (0 uncooled) */
    double igv_flow_fraction;     /* f_igv, - */
    double corrected_air_flow_kg_per_s; /* m sqrt(T1 / 288.15 K) 101325 Pa / P1 (the trade's
                                     corrected flow at the compressor inlet, ISO reference) */
    double compressor_flow_function_m2; /* m sqrt(R1 T1) / P1, m2 */
    double nozzle_flow_function_m2; /* m_g sqrt(R_g T_ce) / P_ce at the first nozzle inlet, m2 */
    double compressor_inlet_T_K;  /* after the inlet treatment, K */
    double compressor_inlet_P_Pa; /* after the inlet losses, Pa */
    double pressure_ratio;        /* compressor delivery / inlet, - */
    double compressor_exit_T_K;
    double compressor_exit_P_Pa;
    double combustor_exit_T_K;    /* turbine inlet (first nozzle inlet), K */
    double firing_temperature_K;  /* first rotor inlet, mixed, K (= combustor exit uncooled) */
    double exhaust_temperature_K; /* leaving the turbine, K */
    double compressor_efficiency; /* isentropic, achieved, - */
    double turbine_efficiency;    /* isentropic, achieved (mixed inlet to exhaust), - */
} gc_machine_point;

/* The defined machine (gc_machine_define fills it; read-only afterwards). */
typedef struct gc_machine {
    gc_machine_spec spec;         /* as given */
    gc_brayton_input chain;       /* the design chain: simple cycle, turbine_inlet_temperature =
                                     the firing (mixed rotor-inlet) temperature, site = design
                                     conditions, net_power = rated net output */
    gc_machine_point design;      /* the design point (solved figures included) */
    double mechanical_efficiency; /* in force (FROM_RATING: solved), - */
    double firing_limit_K;        /* limits in force, K */
    double exhaust_limit_K;
    double T1_design_K, P1_design_Pa, R1_design_J_per_kgK; /* design compressor inlet */
    gc_machine_point reference;   /* base load at the reference conditions */
    int n_warnings;
    gc_machine_warning warnings[GC_MACHINE_MAX_WARNINGS];
} gc_machine;

/* ---- a site evaluation -------------------------------------------------- */

typedef enum gc_machine_inlet_kind {
    GC_MACHINE_INLET_NONE = 0,
    GC_MACHINE_INLET_EVAPORATIVE = 1, /* toward the wet bulb with an effectiveness */
    GC_MACHINE_INLET_FOGGING = 2,     /* to saturation (at the wet bulb) */
    GC_MACHINE_INLET_CHILLER = 3      /* to a set temperature, power drawn from the output */
} gc_machine_inlet_kind;

/* Inlet treatment. Pointers "/inlet/...". */
typedef struct gc_machine_inlet {
    gc_machine_inlet_kind kind;   /* default NONE */
    double added_pressure_loss;   /* fraction of the ambient pressure, [0, 0.1], default 0 */
    double evaporative_effectiveness; /* (0, 1], default GC_MACHINE_DEFAULT_EVAP_EFF */
    double chiller_temperature_K; /* set point, [274.15, 330], default 283.15 K */
    double chiller_cop;           /* [0.5, 20], default GC_MACHINE_DEFAULT_CHILLER_COP */
} gc_machine_inlet;

/* Where the inlet treatment left the air. */
typedef struct gc_machine_inlet_state {
    int active;                   /* 1 when the treatment changed the air */
    double ambient_T_K, ambient_P_Pa, ambient_RH, ambient_W; /* W: kg water / kg dry air */
    double wet_bulb_T_K;          /* thermodynamic wet bulb of the ambient (ASHRAE eq. 33/35) */
    double T_K, RH, W;            /* leaving the treatment (compressor inlet before losses) */
    double water_added_kg_per_s;  /* evaporated by a cooler or fogger, kg/s */
    double condensate_kg_per_s;   /* condensed by a chiller, kg/s */
    double chiller_duty_W;        /* heat removed from the air, W */
    double chiller_power_W;       /* duty / COP, W */
    double inlet_pressure_loss;   /* total fraction in force, - */
} gc_machine_inlet_state;

/* Degradation of this unit against new and clean. Pointers "/condition/...". */
typedef struct gc_machine_condition {
    double compressor_efficiency_change; /* added to the design compressor efficiency (its
                                     kind), [-0.3, 0.05], default 0 */
    double compressor_flow_change; /* fractional change of corrected flow, [-0.3, 0.1], 0 */
    double turbine_efficiency_change; /* added to the design turbine efficiency, [-0.3, 0.05], 0 */
} gc_machine_condition;

typedef enum gc_machine_load_kind {
    GC_MACHINE_LOAD_BASE = 0,     /* base load (default) */
    GC_MACHINE_LOAD_POWER = 1,    /* a net output, load_power_W */
    GC_MACHINE_LOAD_FRACTION = 2  /* a fraction of base load here, load_fraction */
} gc_machine_load_kind;

#define GC_MACHINE_FIGURES_ONLY 1u /* skip the engine's full evaluation (ideal counterpart,
                                      areas): figures and no cycle (has_cycle = 0) */
#define GC_MACHINE_NO_AREAS 2u     /* full evaluation without the area integration */

typedef struct gc_machine_site_input {
    gc_site_input site;           /* ambient ("/site/..."), no flags = ISO */
    gc_machine_inlet inlet;
    gc_machine_load_kind load;    /* "/load/kind" */
    double load_power_W;          /* LOAD_POWER: net output, W, > 0 ("/load/power") */
    double load_fraction;         /* LOAD_FRACTION: (0, 1] ("/load/fraction") */
    gc_machine_condition condition;
    unsigned flags;               /* GC_MACHINE_FIGURES_ONLY | GC_MACHINE_NO_AREAS */
} gc_machine_site_input;

typedef struct gc_machine_site_result {
    gc_machine_point point;
    gc_machine_inlet_state inlet;
    gc_site site;                 /* the resolved ambient */
    int has_cycle;                /* 1 unless GC_MACHINE_FIGURES_ONLY */
    gc_brayton_result cycle;      /* the engine's cycle of this point (the gas turbine alone:
                                     its net_power is the generator output; its turbine inlet
                                     is the mixed rotor inlet) */
    int chain_runs;               /* engine chain runs the solve used */
    int n_warnings;
    gc_machine_warning warnings[GC_MACHINE_MAX_WARNINGS];
} gc_machine_site_result;

/* ---- correction curves -------------------------------------------------- */

typedef enum gc_machine_curve_variable {
    GC_MACHINE_VARY_TEMPERATURE = 0, /* ambient temperature, K */
    GC_MACHINE_VARY_PRESSURE = 1,    /* ambient pressure, Pa */
    GC_MACHINE_VARY_HUMIDITY = 2     /* relative humidity, 0..1 */
} gc_machine_curve_variable;

/* Pointers "/curve/...". The other two ambient figures stay at the reference. */
typedef struct gc_machine_curve_input {
    gc_machine_curve_variable variable; /* default TEMPERATURE */
    double from, to;              /* in the variable's unit; from != to */
    int points;                   /* 2..GC_MACHINE_CURVE_MAX_POINTS, default 21 */
    gc_machine_inlet inlet;       /* treatment in service along the curve, default none */
} gc_machine_curve_input;

typedef struct gc_machine_curve_row {
    double x;                     /* K, Pa or fraction */
    gc_machine_point point;       /* base load there */
    double output_ratio;          /* net output / net output at the reference, - */
    double heat_rate_ratio;       /* heat rate / heat rate at the reference, - */
    double output_correction;     /* 1 / output_ratio: multiplies a reading to the reference */
    double heat_rate_correction;  /* 1 / heat_rate_ratio */
} gc_machine_curve_row;

typedef struct gc_machine_curves {
    gc_machine_curve_variable variable;
    gc_machine_point reference;   /* base load at the reference conditions (treatment as given) */
    int n_rows;
    gc_machine_curve_row rows[GC_MACHINE_CURVE_MAX_POINTS];
    int chain_runs;
} gc_machine_curves;

/* ---- readings ------------------------------------------------------------ */

/* Plant readings. Pointers "/readings/..." ("/site", "/inlet" for those). */
typedef struct gc_machine_readings {
    gc_site_input site;           /* ambient at the time */
    gc_machine_inlet inlet;       /* treatment in service */
    double compressor_exit_P_Pa;  /* absolute, Pa; required */
    double compressor_exit_T_K;   /* K; required */
    double exhaust_temperature_K; /* K; required */
    double fuel_mass_flow_kg_per_s; /* kg/s; required */
    int has_fuel;                 /* 1: fuel below; 0: the design's fuel */
    gc_fuel fuel;
    double fuel_temperature_K;    /* K, 0 = the design's */
    double net_power_W;           /* net output (terminals minus chiller), W; required */
    double air_mass_flow_kg_per_s; /* kg/s, 0 = not measured (from the heat balance) */
    int part_load;                /* 0 (default): the unit was at base load, compared with the
                                     model's base load; 1: compared at the same net output */
    double balance_tolerance;     /* (0, 0.2], default GC_MACHINE_DEFAULT_BALANCE_TOL */
} gc_machine_readings;

typedef struct gc_machine_reduction {
    gc_machine_inlet_state inlet;
    double compressor_inlet_T_K, compressor_inlet_P_Pa;
    double pressure_ratio;        /* - */
    double compressor_efficiency; /* isentropic, - */
    double air_mass_flow_kg_per_s; /* used: measured, or from the heat balance */
    double air_mass_flow_balance_kg_per_s; /* what the heat balance needs */
    int air_flow_measured;        /* 1 when the reading was used */
    double balance_residual;      /* measured air flow: energy balance residual / fuel LHV
                                     input, - (0 when the balance gave the air flow) */
    double fuel_air_ratio;        /* - */
    double firing_temperature_K;  /* mixed rotor inlet from the combustor balance, K */
    double combustor_exit_T_K;    /* K (= firing temperature uncooled) */
    double cooling_air_fraction;  /* - */
    double turbine_efficiency;    /* isentropic, mixed inlet to exhaust, - */
    double nozzle_flow_function_m2; /* m_g sqrt(R T_ce)/P_ce from the heat balance, the
                                     discharge pressure and the combustor loss, m2 */
    double nozzle_flow_change;    /* nozzle_flow_function / design - 1, - (erosion or a
                                     pressure reading off) */
    double heat_input_W;          /* fuel LHV input, W */
    double heat_rate, heat_rate_hhv; /* J/J on net output */
    double heat_rate_kJ_per_kWh;
    double thermal_efficiency;    /* - */
    double output_correction;     /* model base load: reference / these conditions, - */
    double heat_rate_correction;  /* likewise, - */
    double corrected_net_power_W; /* reading x output_correction */
    double corrected_heat_rate;   /* reading x heat_rate_correction, J/J */
    double corrected_heat_rate_kJ_per_kWh;
    gc_machine_point model;       /* new and clean here (base load, or at the same output) */
    gc_machine_point model_base;  /* new and clean, base load here */
    int has_output_change;        /* 0 for part-load readings */
    double output_change;         /* reading / model - 1, - (x100 = %) */
    double heat_rate_change;      /* reading / model - 1, - */
    double compressor_efficiency_change; /* reading - model, - (x100 = points) */
    double turbine_efficiency_change;    /* reading - model, - */
    double air_flow_change;       /* air flow / model - 1, - */
    int n_warnings;
    gc_machine_warning warnings[GC_MACHINE_MAX_WARNINGS];
} gc_machine_reduction;

/* ---- functions ----------------------------------------------------------- */

/* Defaults (see each field): FROM_CYCLE with gc_brayton_input_init's design
 * (to be completed by the caller: fuel, net_power ...), rating zeros with
 * efficiencies 1, ISO reference, no IGV modulation, cooling off with its
 * default constants. */
void gc_machine_spec_init(gc_machine_spec *s);
void gc_machine_site_input_init(gc_machine_site_input *in);
void gc_machine_inlet_init(gc_machine_inlet *in);
void gc_machine_curve_input_init(gc_machine_curve_input *in);
void gc_machine_readings_init(gc_machine_readings *rd);

/* Checks the spec's bounds; collects up to max_errors (errs may be NULL). */
int gc_machine_validate(const gc_machine_spec *s, gc_error *errs, int max_errors,
                        int *n_errors);

/* Solves the design point and fills *m (also its base load at the reference
 * conditions). GC_ERR_INVALID / GC_ERR_INFEASIBLE name the input; a rating
 * that cannot be met names the rated figure and by how much. */
int gc_machine_define(const gc_machine_spec *s, gc_machine *m, gc_error *err);

/* The machine at site conditions. Errors: bad inputs (named), a load below
 * the minimum or above base load (GC_ERR_INFEASIBLE, "/load/..." with both
 * figures), engine errors with their code. */
int gc_machine_evaluate(const gc_machine *m, const gc_machine_site_input *in,
                        gc_machine_site_result *r, gc_error *err);

/* Base-load output and heat rate against one ambient figure (rows from `from`
 * to `to`, equally spaced), with the ratios to the reference point. */
int gc_machine_curves_compute(const gc_machine *m, const gc_machine_curve_input *in,
                              gc_machine_curves *out, gc_error *err);

/* Reduces readings against the machine (see the top of this file).
 * Inconsistent readings are GC_ERR_INFEASIBLE naming the reading and by how
 * much; so is a heat-balance air flow or nozzle flow function more than
 * GC_MACHINE_READINGS_FLOW_TOL from the model's. */
int gc_machine_reduce(const gc_machine *m, const gc_machine_readings *rd,
                      gc_machine_reduction *out, gc_error *err);

/* ASHRAE (2017) ch. 1 helpers used by the inlet treatment: thermodynamic wet
 * bulb of moist air at (T, W, P), eqs. 33 and 35 (liquid water above
 * 273.16 K, ice below), solved to 1e-9 K; and the humidity ratio at T of air
 * with wet bulb T_wb (the same equations solved for W). */
int gc_machine_wet_bulb(double T_K, double W, double P_Pa, double *T_wb_K, gc_error *err);
int gc_machine_W_from_wet_bulb(double T_K, double T_wb_K, double P_Pa, double *W,
                               gc_error *err);

/* Names for results: "base_load", "inlet_guide_vanes", "firing_temperature";
 * "firing_temperature", "exhaust_temperature", "none"; inlet kinds. */
const char *gc_machine_control_name(int control);
const char *gc_machine_limit_name(int limit);
const char *gc_machine_inlet_name(int kind);

#endif
