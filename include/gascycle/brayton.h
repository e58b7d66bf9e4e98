/*
 * brayton.h — the Brayton family of gas-turbine cycles as a preset of the
 * cycle engine (cycle.h): simple, regenerative, intercooled and reheat
 * cycles in any combination, heated either air-standard (heat to the
 * turbine inlet temperature) or by burning a fuel (combustion.h), at site
 * conditions (site.h), with plant figures for a rated net power.
 *
 * The preset only builds a gc_cycle chain (flow frame, per kg of intake air)
 * and evaluates it with gc_cycle_evaluate; every number of the cycle comes
 * from the engine. The chain, in order (a step is left out when it would do
 * nothing, e.g. a zero pressure loss):
 *   site air (state 0) -> inlet loss -> compressor stage 1 -> intercooler ->
 *   stage 2 ... -> regenerator (air side) -> combustor -> turbine stage 1 ->
 *   reheat -> stage 2 ... -> regenerator (gas side) -> exhaust loss ->
 *   heat rejection to the site state (closes the loop).
 *
 * Pressures: `pressure_ratio` is the compressor section's delivery pressure
 * over its inlet pressure, intercooler losses included; the stages share it
 * equally: r_stage = (rp / (1 - dP_ic)^(N-1))^(1/N). The turbine section
 * expands from the combustor exit to the pressure that, after the gas-side
 * regenerator and exhaust losses, is the site pressure; its stages share the
 * expansion equally with the reheat losses in between. The ideal
 * counterpart (cycle.h) has the same overall pressure ratio rp with the
 * losses removed: compressor stages rp^(1/N) each, turbine stages likewise,
 * and ideal regeneration (effectiveness 1).
 *
 * Heat addition:
 *   air-standard  constant-pressure heat addition to the turbine inlet
 *                 temperature (and to the reheat temperature); the working
 *                 fluid is `gas` (cold or air models) or, by default, the
 *                 site's humid air. No fuel, heat rate on the heat input.
 *   fuel          the combustor burns `fuel` (complete combustion,
 *                 combustion.h) to the turbine inlet temperature; after it
 *                 the gas is the products model and the mass flow grows by
 *                 the fuel; each reheat burns more fuel in the products.
 *                 Thermal efficiency and heat rate are on the fuel's LHV
 *                 (the fuel's chemical energy, far x LHV, is the heat in, as
 *                 the trade quotes gas-turbine efficiency), HHV figures beside.
 *                 The engine books heat in and out on the same 298.15 K
 *                 reference (cycle.h), so heat_in - heat_out = net work at
 *                 any site temperature; the second law is on the fuel's
 *                 exergy (exergy.h).
 *
 * Cooled first turbine stage (optional, `cooling`, fuel mode only): the
 * model of cooling.h (Holland & Thake 1980 rows as in Horlock 2003, eq.
 * 5.8; single-step mixing before the first rotor). turbine_inlet_temperature
 * stays the combustor exit; the coolant temperature is the compressor
 * delivery of a first chain run, the mixed rotor-inlet temperature and the
 * fuel-air ratio follow (gc_machine_cooling_from_tit), and the chain burns
 * all the compressor air to that rotor-inlet temperature (the same fuel flow,
 * turbine gas and work as core products mixed with the coolant). The
 * engine's turbine_inlet station is then the first rotor inlet; the result
 * reports both temperatures and the coolant fractions (`cooling`). Only the
 * first stage is cooled (a reheat stage and its temperature are not); the
 * optimum searches redo the split at every pressure ratio they try. Without
 * `cooling` nothing changes.
 *
 * Work figures, per kg of intake air: the engine's net work is the gas-path
 * net work w_net. Mechanical losses (bearings, gearbox, auxiliaries) take a
 * fraction of it: shaft work = eta_mech w_net; the generator another:
 * electric work = eta_gen eta_mech w_net. A rated net power is the electric
 * power at the generator terminals.
 *
 * Optimum pressure ratios: when optimum_search is 1 (default 0: the search
 * costs about 35 full evaluations) and GC_BRAYTON_NO_OPTIMUM is not set, the
 * result carries the pressure ratio that maximises the thermal efficiency and the one
 * that maximises the specific net work for the same inputs, each found by a
 * search over the full evaluation (a log-spaced scan of
 * GC_BRAYTON_RP_SEARCH_MIN..MAX, then Brent's method (parabolic steps with a
 * golden-section fallback) around the best scan point to
 * GC_BRAYTON_RP_SEARCH_TOL in ln rp). A maximum on a search
 * bound, or next to pressure ratios where the cycle cannot run (compressor
 * exit hotter than the turbine inlet, a regenerator with no temperature
 * difference), is flagged, not hidden.
 *
 * Units: SI throughout (K, Pa, J/kg, kg/s, W); fractions as 0..1. Heat rates
 * also in kJ/kWh and Btu/kWh (1 Btu = 1055.05585262 J, International Table
 * Btu; 3412.14 Btu/kWh at 100 % efficiency: common practice).
 *
 * The preset is declared once as a descriptor (preset.h,
 * service/core/presets/brayton.c): every gc_brayton_input member is named
 * as its input, with its default, bounds and description in the field
 * table (ids gc_brayton_field); errors carry the field id (and the stage
 * index for a stage efficiency) and, for callers that read text, its path
 * ("/site/altitude", "/compressor_stage_efficiency/1"); warnings carry a
 * stable code (gc_warning: "site", "cooled_blades" (not with `cooling`),
 * "regenerator_small_difference", "refrigerated_intercooler",
 * "no_net_work", "ideal_equals_actual") and the field id they concern.
 * Evaluation codes map to problems as: GC_ERR_INVALID / GC_ERR_RANGE /
 * GC_ERR_UNKNOWN / GC_ERR_RICH / GC_ERR_INFEASIBLE -> a client error on the
 * field; GC_ERR_NOCONV and GC_ERR_CHECK -> the service could not produce a
 * trustworthy result for this input (never a number).
 *
 * Memory: the input and result are plain values (no heap). A result embeds a
 * gc_cycle_result (about 60 KB) and the evaluation uses about 50 KB of stack
 * for its scratch runs: give worker threads at least 256 KB of stack.
 */
#ifndef GASCYCLE_BRAYTON_H
#define GASCYCLE_BRAYTON_H

#include "gascycle/combustion.h"
#include "gascycle/cooling.h"
#include "gascycle/cycle.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"
#include "gascycle/preset.h"
#include "gascycle/site.h"

#define GC_BRAYTON_MAX_STAGES 6          /* compressor or turbine stages */
#define GC_BRAYTON_MAX_WARNINGS 12
#define GC_BRAYTON_MAX_ERRORS 16         /* gc_brayton_validate's list */

#define GC_BRAYTON_RP_MAX 200.0          /* largest accepted pressure ratio, - */
#define GC_BRAYTON_RP_SEARCH_MIN 1.5     /* optimum searches: lower bound, - */
#define GC_BRAYTON_RP_SEARCH_MAX 80.0    /* optimum searches: upper bound, - */
#define GC_BRAYTON_RP_SEARCH_SCAN 16     /* scan points (log-spaced) */
#define GC_BRAYTON_RP_SEARCH_TOL 1e-5    /* final bracket width in ln rp */

/* Turbine inlet temperature above which blades need cooling (uncooled
 * superalloy blades reach about 1100..1300 K metal, so gas near 1500 K is
 * about where film cooling becomes indispensable: common practice). */
#define GC_BRAYTON_TIT_COOLED_K 1500.0
/* A regenerator whose hot inlet is less than this above its cold inlet
 * recovers little heat for its pressure losses (common practice). */
#define GC_BRAYTON_REGEN_MIN_DT_K 25.0

/* Evaluation flags (gc_brayton_input.flags). */
#define GC_BRAYTON_NO_OPTIMUM 1u  /* skip both optimum-pressure-ratio searches */
#define GC_BRAYTON_NO_AREAS 2u    /* skip the engine's P-v/T-s area integration */
#define GC_BRAYTON_NO_BOUNDS 4u   /* skip the ideal counterparts (no bounds, no ideal figures) */

typedef enum gc_brayton_heat_mode {
    GC_BRAYTON_AIR_STANDARD = 0,  /* heat to the turbine inlet temperature, no fuel */
    GC_BRAYTON_FUEL = 1           /* burn `fuel` to the turbine inlet temperature */
} gc_brayton_heat_mode;

/* Field ids of the preset's table (preset.h); row 0 is the request. */
typedef enum gc_brayton_field {
    GC_BF_REQUEST = 0,
    GC_BF_PRESSURE_RATIO, GC_BF_TURBINE_INLET_TEMPERATURE, GC_BF_COMPRESSOR_EFFICIENCY,
    GC_BF_TURBINE_EFFICIENCY, GC_BF_EFFICIENCY_BASIS, GC_BF_COMPRESSOR_STAGE_EFFICIENCY,
    GC_BF_TURBINE_STAGE_EFFICIENCY, GC_BF_COMPRESSOR_STAGES, GC_BF_INTERCOOLING_TEMPERATURE,
    GC_BF_INTERCOOLER_PRESSURE_LOSS, GC_BF_TURBINE_STAGES, GC_BF_REHEAT_TEMPERATURE,
    GC_BF_REHEAT_PRESSURE_LOSS, GC_BF_REGENERATOR_EFFECTIVENESS,
    GC_BF_REGENERATOR_AIR_PRESSURE_LOSS, GC_BF_REGENERATOR_GAS_PRESSURE_LOSS,
    GC_BF_INLET_PRESSURE_LOSS, GC_BF_EXHAUST_PRESSURE_LOSS, GC_BF_COMBUSTOR_PRESSURE_LOSS,
    GC_BF_COMBUSTOR_EFFICIENCY, GC_BF_MECHANICAL_EFFICIENCY, GC_BF_GENERATOR_EFFICIENCY,
    GC_BF_GAS, GC_BF_GAS_CP, GC_BF_GAS_K, GC_BF_FUEL, GC_BF_FUEL_TEMPERATURE, GC_BF_SITE,
    GC_BF_SITE_ALTITUDE, GC_BF_SITE_TEMPERATURE, GC_BF_SITE_PRESSURE,
    GC_BF_SITE_RELATIVE_HUMIDITY, GC_BF_NET_POWER, GC_BF_OPTIMUM_SEARCH, GC_BF_HEAT_ADDITION,
    GC_BF_COOLING, GC_BF_COOLING_BLADE_TEMPERATURE, GC_BF_COOLING_NOZZLE_CONSTANT,
    GC_BF_COOLING_ROTOR_CONSTANT,
    GC_BF_COUNT
} gc_brayton_field;

/* Inputs, each named as its input (field ids above). gc_brayton_input_init
 * fills the defaults: the ideal cycle (efficiencies 1, losses 0, one stage
 * each, no regenerator), air-standard, ISO site, no optimum search. */
typedef struct gc_brayton_input {
    double pressure_ratio;              /* compressor section P_out/P_in, -, 1 < rp <= 200 */
    double turbine_inlet_temperature;   /* K, combustor exit (first turbine stage inlet) */
    double compressor_efficiency;       /* each stage, isentropic (or polytropic), (0, 1] */
    double turbine_efficiency;          /* each stage, isentropic (or polytropic), (0, 1] */
    int polytropic_efficiency;          /* 1: both efficiencies above (and per stage) are
                                           polytropic (small-stage) efficiencies */
    double compressor_stage_efficiency[GC_BRAYTON_MAX_STAGES]; /* per stage, (0, 1];
                                           0 = compressor_efficiency */
    double turbine_stage_efficiency[GC_BRAYTON_MAX_STAGES];    /* per stage; 0 = default */
    int n_compressor_stage_efficiency;  /* entries given (0: those above that are > 0) */
    int n_turbine_stage_efficiency;
    int compressor_stages;              /* 1..GC_BRAYTON_MAX_STAGES */
    double intercooling_temperature;    /* K, air temperature after each intercooler;
                                           0 = the site temperature */
    int has_intercooling_temperature;   /* 1: given */
    double intercooler_pressure_loss;   /* fraction dP/P of each intercooler, [0, 0.5] */
    int turbine_stages;                 /* 1..GC_BRAYTON_MAX_STAGES */
    double reheat_temperature;          /* K, gas temperature after each reheat;
                                           0 = turbine_inlet_temperature */
    int has_reheat_temperature;         /* 1: given */
    double reheat_pressure_loss;        /* fraction dP/P of each reheat combustor, [0, 0.5] */
    double regenerator_effectiveness;   /* [0, 1]; 0 = no regenerator */
    double regenerator_air_pressure_loss; /* fraction, air (cold) side, [0, 0.5] */
    double regenerator_gas_pressure_loss; /* fraction, gas (hot) side, [0, 0.5] */
    double inlet_pressure_loss;         /* fraction, intake filter and duct, [0, 0.5] */
    double exhaust_pressure_loss;       /* fraction of the exhaust pressure, stack and
                                           ducts (or a recovery boiler), [0, 0.5] */
    double combustor_pressure_loss;     /* fraction, main combustor, [0, 0.5] */
    double combustor_efficiency;        /* (0, 1]: fraction of far x LHV released (fuel mode),
                                           also applied to reheat combustors */
    double mechanical_efficiency;       /* (0, 1], shaft work / gas-path net work */
    double generator_efficiency;        /* (0, 1], electric / shaft work */
    gc_brayton_heat_mode heat_mode;
    int has_gas;                        /* 1: `gas` is the working fluid (air-standard) or
                                           the oxidiser (fuel mode, must be a mixture) */
    gc_gas gas;                         /* see has_gas; 0: the site's humid air */
    int has_fuel;                       /* fuel mode: 1 when `fuel` is set */
    gc_fuel fuel;                       /* fuel mode: the fuel (combustion.h); has_fuel alone
                                           selects fuel mode */
    gc_fuel_spec fuel_spec;             /* how the fuel was given (the echo) */
    double fuel_temperature;            /* K, fuel supply temperature; 0 = 298.15 K */
    int has_fuel_temperature;           /* 1: given */
    gc_site_input site;                 /* ambient conditions; no flags set = ISO */
    double net_power;                   /* W, rated net electric power; 0 = not given */
    int has_net_power;                  /* 1: given */
    int optimum_search;                 /* 1: search the optimum pressure ratios */
    gc_machine_cooling cooling;         /* cooled first turbine stage (cooling.h): enabled
                                           (set when the request gives `cooling`) bleeds
                                           coolant at compressor delivery for the first
                                           nozzle and rotor rows; turbine_inlet_temperature
                                           stays the combustor exit; fuel mode only */
    unsigned flags;                     /* GC_BRAYTON_NO_OPTIMUM | _NO_AREAS | _NO_BOUNDS */
} gc_brayton_input;

/* A searched optimum pressure ratio. */
typedef struct gc_brayton_optimum {
    int found;                  /* 1 when some pressure ratio in the bounds could be run */
    double pressure_ratio;      /* -, the maximiser */
    double thermal_efficiency;  /* -, at that pressure ratio */
    double specific_work;       /* J/kg intake air, net gas-path work at it */
    int at_lower_bound;         /* 1: the maximum is the lower search bound (or beyond) */
    int at_upper_bound;         /* 1: the maximum is the upper search bound (or beyond) */
    int at_feasibility_limit;   /* 1: the maximum lies against pressure ratios where the cycle
                                   cannot be run (e.g. compressor exit above the turbine inlet) */
    double lower_bound, upper_bound; /* -, the bounds searched */
    int evaluations;            /* full chain evaluations used (scan shared by both searches) */
} gc_brayton_optimum;

/* State indices into cycle.actual.states of the main stations (-1: absent). */
typedef struct gc_brayton_stations {
    int compressor_inlet;       /* after the inlet loss (= 0 without one) */
    int compressor_exit;        /* last compressor stage exit */
    int combustor_inlet;        /* after the regenerator's air side */
    int turbine_inlet;          /* main combustor exit */
    int turbine_exit;           /* last turbine stage exit */
    int exhaust;                /* leaving the plant (after regenerator and exhaust loss) */
} gc_brayton_stations;

typedef struct gc_brayton_result {
    gc_cycle_result cycle;      /* the engine's result: actual, ideal, Carnot, checks */
    gc_site site;               /* resolved site conditions (inlet state and air) */
    gc_brayton_stations stations;
    char title[96];             /* "Brayton cycle, regenerative, intercooled, ..." */
    int has_fuel;               /* 1 in fuel mode */
    int has_regenerator;        /* 1 with a regenerator */
    int has_intercooler;        /* 1 with more than one compressor stage */

    /* cycle figures, per kg of intake air */
    double specific_work;       /* J/kg, net gas-path work w_net */
    double specific_shaft_work; /* J/kg, eta_mech w_net */
    double specific_electric_work; /* J/kg, eta_gen eta_mech w_net */
    double compressor_work;     /* J/kg, absorbed by all compressor stages, >= 0 */
    double turbine_work;        /* J/kg, delivered by all turbine stages, >= 0 */
    double back_work_ratio;     /* -, compressor_work / turbine_work */
    double heat_in;             /* J/kg, heat added: air-standard the engine's heat in; fuel
                                   mode far x LHV (the fuel's chemical energy) */
    double regenerator_heat;    /* J/kg, heat moved by the regenerator (0 without one) */
    double intercooler_heat;    /* J/kg, heat removed by the intercoolers, >= 0 */
    double thermal_efficiency;  /* -, specific_work / heat_in (fuel: LHV basis) */
    double thermal_efficiency_hhv; /* -, fuel mode: specific_work / (far HHV); else = above */
    double electric_efficiency; /* -, specific_electric_work / heat_in */
    double ideal_efficiency;    /* -, the same figure for the engine's ideal counterpart */
    double ideal_specific_work; /* J/kg, net work of the ideal counterpart */
    int has_ideal_components;   /* 1 with a regenerator of effectiveness below 1 */
    double ideal_components_efficiency; /* -, second bound: ideal components, this
                                   regenerator (cycle.h), same basis as thermal_efficiency */
    double ideal_components_specific_work; /* J/kg, its net work */
    double carnot_efficiency;   /* -, 1 - T_min/T_max of the actual cycle */
    double fuel_air_ratio;      /* kg fuel / kg intake air, all combustors (0 air-standard) */
    double fuel_air_ratio_main; /* kg fuel / kg air, main combustor */
    double equivalence_ratio;   /* -, main combustor (0 air-standard) */
    double T_compressor_exit;   /* K */
    double T_turbine_exit;      /* K */
    double T_exhaust;           /* K, leaving the plant */
    double P_compressor_exit;   /* Pa */

    /* plant figures for the rated net power (valid when has_power) */
    int has_power;
    double net_power;           /* W, electric, as given */
    double shaft_power;         /* W, net_power / eta_gen */
    double air_mass_flow;       /* kg/s of intake (humid) air */
    double fuel_mass_flow;      /* kg/s (0 air-standard) */
    double exhaust_mass_flow;   /* kg/s, air + fuel */
    double heat_input_power;    /* W, fuel energy input on LHV (air-standard: heat input) */
    double heat_input_power_hhv;/* W, on HHV (air-standard: = heat_input_power) */
    double heat_rate;           /* J/J (-), heat input / electric output, LHV basis */
    double heat_rate_hhv;       /* J/J (-), HHV basis */
    double heat_rate_kJ_per_kWh;     /* kJ/kWh, LHV */
    double heat_rate_hhv_kJ_per_kWh; /* kJ/kWh, HHV */
    double heat_rate_Btu_per_kWh;    /* Btu/kWh, LHV */
    double heat_rate_hhv_Btu_per_kWh;/* Btu/kWh, HHV */
    double co2_mass_flow;       /* kg/s of CO2 formed from the fuel (0 air-standard) */
    double co2_kg_per_MWh;      /* kg CO2 per MWh of electric output */
    double exhaust_temperature; /* K, = T_exhaust */
    double exhaust_heat_power;  /* W, exhaust enthalpy flow above the site temperature
                                   (m_exh (h(T_exh) - h(T_site)), same gas), what a recovery
                                   boiler could at most take */

    /* cooled first stage (valid when has_cooling): the chain burns all the compressor
     * air to the mixed rotor-inlet temperature, so the engine's turbine_inlet station
     * is the first rotor inlet; turbine_inlet_temperature is the combustor exit */
    int has_cooling;
    gc_machine_cooled cooled;   /* the split at the design (given) pressure ratio */

    /* optimum pressure ratios (valid when has_optimum) */
    int has_optimum;
    gc_brayton_optimum max_efficiency;    /* maximises thermal_efficiency */
    gc_brayton_optimum max_specific_work; /* maximises specific_work */

    int n_warnings;
    gc_warning warnings[GC_BRAYTON_MAX_WARNINGS]; /* site warnings included (code "site") */
} gc_brayton_result;

/* Defaults: rp 10, TIT 1400 K, efficiencies 1, one stage each, no losses, no
 * regenerator, air-standard, no gas (site air), no fuel, ISO site, no power,
 * no optimum search, flags 0 (the table's defaults). Callers then set what
 * they are given. */
void gc_brayton_input_init(gc_brayton_input *in);

/* The preset's descriptor (preset.h). */
const gc_preset *gc_brayton_preset(void);

/* Checks every input against its bounds (the table's) and against each
 * other, and collects up to max_errors errors (field id, path and sentence)
 * into errs (may be NULL with max 0).
 * Returns GC_OK or the first error's code; *n_errors (may be NULL) gets the
 * count. Only checks that need no evaluation; the evaluation adds those that
 * need the cycle's temperatures. */
int gc_brayton_validate(const gc_brayton_input *in, gc_error *errs, int max_errors,
                        int *n_errors);

/* Builds the chain for `in` at the site `site` (resolved) into *c and the
 * station indices (may be NULL). GC_ERR_INVALID or GC_ERR_INFEASIBLE (e.g.
 * the pressure losses exceed the pressure ratio), field set. */
int gc_brayton_build(const gc_brayton_input *in, const gc_site *site, gc_cycle *c,
                     gc_brayton_stations *st, gc_error *err);

/* Validates, resolves the site, builds, evaluates (gc_cycle_evaluate) and
 * fills *r. Errors from the engine keep their code and JSON pointer.
 * Cycle-dependent errors: turbine inlet temperature not above the
 * compressor (or regenerator) exit (GC_ERR_INFEASIBLE,
 * "/turbine_inlet_temperature"); intercooling temperature not below a stage
 * exit ("/intercooling_temperature"); a regenerator whose gas inlet is not
 * hotter than its air inlet ("/regenerator_effectiveness"). */
int gc_brayton_evaluate(const gc_brayton_input *in, gc_brayton_result *r, gc_error *err);

#endif
