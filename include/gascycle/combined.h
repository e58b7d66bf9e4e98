/*
 * combined.h — the combined-cycle plant as a cycle preset
 * (/v1/cycles/combined): a topping cycle (a gas turbine evaluated in process
 * through its own preset descriptor, or an exhaust given as it is) whose
 * exhaust feeds the heat-recovery steam generator and the steam bottoming
 * cycle of steam.h (water and steam by IAPWS-IF97, if97.h).
 *
 * Topping ("topping": {"cycle": name, "inputs": {...}}): the presets listed
 * by gc_combined_toppings, each with an adapter that reads what the
 * bottoming cycle needs from its result (gc_combined_exhaust):
 *   brayton   the Brayton preset's whole request, evaluated through its
 *             descriptor. The HRSG inlet is the state before its exhaust
 *             pressure loss (the turbine exit, or the regenerator's gas
 *             exit); that loss is the HRSG's gas-side pressure loss, so the
 *             stack leaves at the site pressure. Plant figures at its rated
 *             net_power (its air mass flow); without one, per 1 kg/s of
 *             intake air. Dead state of the exergy figures: its site.
 *   exhaust   an exhaust as given (temperature, pressure, mass flow, gas
 *             model, the HRSG's pressure loss) with, optionally, the gas
 *             turbine's net power and fuel heat input (then the plant's
 *             efficiency and heat rate).
 * Another preset (the machine model) joins with one adapter and one entry
 * of the list (combined_topping.c).
 *
 * Plant figures (W; per kg/s of intake when the topping gives no flow):
 *   net power       = P_gt + eta_gen,st W_steam_turbine - W_pumps (the
 *                     pumps driven from the plant's output)
 *   efficiency      = net power / (fuel heat of the topping + duct burner),
 *                     LHV and HHV (air-standard topping: its heat input on
 *                     both); heat rate = 1 / efficiency (kJ/kWh, Btu/kWh)
 *   steam-cycle efficiency, HRSG effectiveness, bottoming efficiency as
 *                     steam.h defines them.
 * Bounds of the combined plant:
 *   carnot          1 - T_min / T_max over every state of both fluids (the
 *                   lowest is the ambient or the condensate, the highest the
 *                   turbine inlet or the duct burner exit);
 *   ideal           internally reversible: the topping's ideal counterpart
 *                   (its preset's definition: efficiencies 1, losses 0, the
 *                   same pressure ratio and turbine inlet temperature) and a
 *                   reversible bottoming engine turning the whole physical
 *                   flow exergy of the ideal topping's exhaust (against the
 *                   dead state) and the duct burner fuel's exergy into work;
 *                   on the ideal topping's and the duct burner's fuel heat;
 *   reversible_bottoming  the actual topping plus that reversible bottoming
 *                   engine on its actual exhaust (and the duct burner's
 *                   fuel): no steam plant can do better behind this gas
 *                   turbine;
 *   ideal_steam_components  the actual topping and the same HRSG design
 *                   (levels, pinch, approach, steam temperatures, reheat,
 *                   firing temperature, condenser) with turbine, pump, burner
 *                   and generator efficiencies 1 and no gas-side pressure
 *                   loss (the steam core's ideal counterpart): what the
 *                   steam-side component losses cost.
 * Exergy (dead state: the topping's ambient): destroyed per component (the
 * topping's processes, W = J/kg x intake flow, its exhaust pressure loss
 * and exhaust-to-ambient step left out: the HRSG books them; each HRSG
 * section, turbine section, pump, mixing, deaerator and the condenser), the
 * losses (stack gas, condenser heat at T0, the stack gas's chemical
 * exergy, heat the topping rejects elsewhere), the fuels' exergy in (the
 * duct burner's included).
 * Checks (GC_ERR_CHECK beyond GC_COMBINED_TOL, never silent): the steam
 * core's (energy closure of the HRSG, the steam cycle and the bottoming
 * cycle; pinch and approach reached; no temperature cross); the plant's
 * energy closure: fuel heat + pump power = topping net work + steam turbine
 * work + condenser heat + the topping's other heat rejected + burner losses
 * + the stack loss, the stack loss being the stack gas's sensible enthalpy
 * flow (298.15 K formation basis of the cycle engine, cycle.h) less the
 * intake air's and the fuels' as supplied; for a topping with exergy books
 * (a duct burner burning a gas fuel or none) the plant's exergy balance as
 * well (fuel + intake exergy = net work + destroyed + losses).
 *
 * States: one list over both fluids, in plant order: the topping's states
 * up to the HRSG inlet (part "gas_turbine", the topping's station names),
 * then the HRSG's gas and the water/steam stations (part "hrsg" and
 * "steam_cycle", steam.h's names). Gas enthalpy is sensible (h(T) -
 * h(298.15 K) of the station's gas), water and steam on the IF97 basis (u =
 * s = 0 for the saturated liquid at the triple point); entropy of a gas on
 * gas.h's basis (1 bar), of water IF97's: the two bases differ, each state
 * names its fluid.
 *
 * Memory: plain values, no heap. A result is about 200 KB (the topping's
 * result inside it and the steam result): keep it off small stacks. An
 * evaluation uses about 60 KB of stack.
 */
#ifndef GASCYCLE_COMBINED_H
#define GASCYCLE_COMBINED_H

#include "gascycle/cycle.h"
#include "gascycle/preset.h"
#include "gascycle/steam.h"

#include <stddef.h>

#define GC_COMBINED_TOPPING_INPUT_BYTES 8192     /* room for a topping's input struct */
#define GC_COMBINED_TOPPING_RESULT_BYTES 98304   /* room for a topping's result struct */
#define GC_COMBINED_MAX_STATES (GC_CYCLE_MAX_STATES + GC_STEAM_MAX_STATIONS)
#define GC_COMBINED_MAX_PROCESSES (GC_CYCLE_MAX_PROCESSES + GC_STEAM_MAX_PROCESSES)
#define GC_COMBINED_NAME_LEN 64
#define GC_COMBINED_TOL 1e-9                     /* plant energy and exergy closure, relative
                                                    to the fuel heat */

/* gc_combined_input.flags */
#define GC_COMBINED_NO_IDEAL 1u   /* no ideal bounds (the topping's ideal counterpart, the
                                     steam core's) */
#define GC_COMBINED_NO_TQ 2u      /* no T-Q diagram data (the cross check then uses the
                                     section ends only) */
#define GC_COMBINED_NO_AREAS 4u   /* the topping's own GC_LEAN_NO_AREAS (its area check) */

/* Field ids of the preset's table. */
typedef enum gc_combined_field {
    GC_CF_REQUEST = 0, GC_CF_TOPPING, GC_CF_LEVELS, GC_CF_LEVEL_PRESSURE,
    GC_CF_LEVEL_STEAM_TEMPERATURE, GC_CF_LEVEL_PINCH, GC_CF_LEVEL_APPROACH,
    GC_CF_LEVEL_STEAM_MASS_FLOW, GC_CF_REHEAT_TEMPERATURE, GC_CF_REHEAT_PRESSURE,
    GC_CF_STACK_TEMPERATURE_MIN, GC_CF_FIRING_TEMPERATURE, GC_CF_DUCT_BURNER_FUEL,
    GC_CF_DUCT_BURNER_FUEL_TEMPERATURE, GC_CF_BURNER_EFFICIENCY, GC_CF_TURBINE_EFFICIENCY,
    GC_CF_PUMP_EFFICIENCY, GC_CF_GENERATOR_EFFICIENCY, GC_CF_CONDENSER_PRESSURE,
    GC_CF_COOLING_WATER_TEMPERATURE, GC_CF_COOLING_WATER_RISE,
    GC_CF_CONDENSER_TERMINAL_DIFFERENCE, GC_CF_DEAERATOR_PRESSURE, GC_CF_DRYNESS_MIN,
    GC_CF_COUNT
} gc_combined_field;

/* One pressure level of the HRSG (level 0 the highest pressure). */
typedef struct gc_combined_level {
    double pressure;              /* Pa, drum and superheater outlet */
    double steam_temperature;     /* K, superheater outlet; 0 (not given): saturated steam */
    int has_steam_temperature;
    double pinch;                 /* K, evaporator gas exit minus saturation temperature */
    double approach;              /* K, saturation minus economiser water exit */
    double steam_mass_flow;       /* kg/s, fixed steam conditions; 0 (not given): designed
                                     by the pinch */
    int has_steam_mass_flow;
} gc_combined_level;

typedef struct gc_combined_input {
    int topping_kind;                       /* index into gc_combined_toppings */
    union {
        unsigned char bytes[GC_COMBINED_TOPPING_INPUT_BYTES];
        max_align_t align;
    } topping;                              /* the topping preset's input struct */
    int n_levels;                           /* 1..GC_STEAM_MAX_LEVELS */
    gc_combined_level levels[GC_STEAM_MAX_LEVELS];
    double reheat_temperature;              /* K; GC_UNSET: no reheat */
    double reheat_pressure;                 /* Pa, one level only; GC_UNSET: none given */
    double stack_temperature_min;           /* K, acid dew point limit; GC_UNSET: none */
    double firing_temperature;              /* K, after the duct burner; GC_UNSET: unfired */
    int has_duct_burner_fuel;               /* 1: duct_burner_fuel given */
    gc_fuel duct_burner_fuel;               /* default: the topping's fuel */
    gc_fuel_spec duct_burner_fuel_spec;     /* as given (the echo) */
    double duct_burner_fuel_temperature;    /* K */
    double burner_efficiency;               /* -, (0, 1] */
    double turbine_efficiency;              /* -, isentropic, every steam turbine section */
    double pump_efficiency;                 /* -, isentropic, every pump */
    double generator_efficiency;            /* -, steam turbine generator */
    double condenser_pressure;              /* Pa */
    int has_condenser_pressure;             /* echo: 1 when the condenser pressure is used */
    double cooling_water_temperature;       /* K; GC_UNSET: the condenser pressure is used */
    double cooling_water_rise;              /* K */
    double condenser_terminal_difference;   /* K */
    double deaerator_pressure;              /* Pa; GC_UNSET: no deaerator */
    double dryness_min;                     /* -, warn below this expansion-end quality */
    unsigned flags;                         /* GC_COMBINED_NO_IDEAL | GC_COMBINED_NO_TQ */
} gc_combined_input;

/* What the bottoming cycle takes from a topping's result (an adapter's
 * answer). All in SI; flows in kg/s. */
typedef struct gc_combined_exhaust {
    gc_gas gas;                   /* exhaust gas model at the HRSG inlet */
    double T_K, P_Pa;             /* HRSG inlet (before its gas-side pressure loss) */
    double pressure_loss;         /* HRSG gas-side loss, fraction of P_Pa */
    double intake_mass_flow;      /* kg/s of intake (1 when the topping gives none) */
    int has_flow;                 /* 1: the flow is the plant's (else per 1 kg/s) */
    double exhaust_mass_ratio;    /* kg exhaust / kg intake */
    double net_power_W;           /* topping's net electric power at that flow */
    double work_W;                /* its gas-path net work (the energy balance's) */
    int has_heat;                 /* 1: the fuel heat below is known */
    double fuel_heat_W;           /* LHV (air-standard: heat input), W */
    double fuel_heat_hhv_W;       /* HHV (air-standard: = fuel_heat_W), W */
    double other_heat_out_W;      /* heat rejected other than with the exhaust, W */
    double fuel_sensible_W;       /* fuel enthalpy flow above 298.15 K as supplied, W */
    double intake_sensible_W;     /* intake air's sensible enthalpy flow (298.15 K), W */
    int has_fuel;                 /* 1: a fuel is burnt (the duct burner's default) */
    gc_fuel fuel;
    double fuel_temperature_K;
    double T_dead_K, P_dead_Pa;   /* exergy dead state (the ambient) */
    double T_min_K, T_max_K;      /* extreme temperatures of the topping */
    int exergy_model;             /* gc_exergy_model of the topping (-1: none) */
    double exergy_in_W;           /* fuel (or heat) exergy supplied */
    double exergy_intake_W;       /* intake stream's exergy */
    double exergy_heat_out_W;     /* exergy of other heat rejected */
    double exergy_chemical_W;     /* the exhaust's chemical exergy (fuel model) */
    double energy_rel;            /* the topping's own energy closure, - */
} gc_combined_exhaust;

/* A topping preset and its adapter: the exhaust of the actual (ideal = 0)
 * or the ideal counterpart's run (1: GC_ERR_INVALID when it has none). */
typedef struct gc_combined_topping {
    const gc_preset *preset;
    int (*exhaust)(const void *input, const void *result, int ideal, gc_combined_exhaust *x,
                   gc_error *err);
    /* the topping's states up to the HRSG inlet, for the state list (may be
     * NULL: the HRSG inlet only) */
    const gc_cycle_result *(*cycle)(const void *result, int *n_states);
    /* leaves the ideal counterpart out (may be NULL) */
    void (*lean)(void *input);
} gc_combined_topping;

/* The toppings, NULL-preset terminated; their descriptors NULL-terminated. */
extern const gc_combined_topping gc_combined_toppings[];
extern const gc_preset *const gc_combined_topping_presets[];

typedef enum gc_combined_part { GC_CC_GAS_TURBINE = 0, GC_CC_HRSG, GC_CC_STEAM_CYCLE } gc_combined_part;

typedef struct gc_combined_state {
    char name[GC_COMBINED_NAME_LEN]; /* stable station name */
    int part;                      /* gc_combined_part */
    int fluid;                     /* gc_steam_fluid: 0 water, 1 gas */
    double T_K, P_Pa;
    double h_J_per_kg;             /* gas: sensible h(T) - h(298.15 K); water: IF97 */
    double s_J_per_kgK;            /* gas: gas.h (1 bar); water: IF97 */
    double v_m3_per_kg;
    double x;                      /* quality on or inside the dome */
    int has_x;                     /* 1: water at 0 <= x <= 1 */
    double m_kg_per_s;             /* mass flow */
    double exergy_J_per_kg;        /* flow exergy against the dead state */
} gc_combined_state;

typedef struct gc_combined_process {
    char name[GC_COMBINED_NAME_LEN];
    int part;                      /* gc_combined_part */
    char kind[24];                 /* "compression", "economiser", "turbine", ... */
    char from[GC_COMBINED_NAME_LEN], to[GC_COMBINED_NAME_LEN]; /* station names */
    double m_kg_per_s;             /* main stream */
    double power_W;                /* turbine: delivered; pump or compressor: absorbed */
    int has_power;
    double duty_W;                 /* heat into the stream (HRSG section, combustor) or
                                      rejected (condenser) */
    int has_duty;
    double exergy_destroyed_W;     /* T0 S_gen */
    double dT_min_K;               /* HRSG section: smallest gas-water difference */
    int has_dT;
} gc_combined_process;

typedef struct gc_combined_level_out {
    char name[8];                  /* "hp", "ip", "lp" */
    double pressure_Pa, saturation_temperature_K, steam_temperature_K;
    double steam_mass_flow_kg_per_s, pinch_K, approach_K;
} gc_combined_level_out;

/* One T-Q point (steam.h's, with the streams named). */
typedef struct gc_combined_tq {
    double Q_W, T_gas_K;
    double T_water_K[GC_STEAM_MAX_LEVELS];
    int has[GC_STEAM_MAX_LEVELS];
    char stream[GC_STEAM_MAX_LEVELS][GC_STEAM_NAME_LEN];
} gc_combined_tq;

typedef struct gc_combined_summary {
    double net_power_W, gas_turbine_power_W, steam_turbine_power_W, pump_power_W;
    double steam_cycle_net_power_W;
    int has_efficiency;            /* 1: the fuel heat is known */
    double fuel_heat_W, fuel_heat_hhv_W, duct_burner_fuel_heat_W;
    double thermal_efficiency, thermal_efficiency_hhv;
    double heat_rate, heat_rate_hhv;            /* J/J */
    double gas_turbine_efficiency;
    double steam_cycle_efficiency, bottoming_efficiency, hrsg_effectiveness;
    double steam_to_gas_power_ratio;
    double intake_mass_flow_kg_per_s, exhaust_mass_flow_kg_per_s, stack_mass_flow_kg_per_s;
    double exhaust_temperature_K, stack_temperature_K;
    double heat_to_steam_W, condenser_heat_W, condenser_pressure_Pa, condenser_temperature_K;
    int has_exhaust_quality;
    double exhaust_quality;
    const char *basis;             /* static text */
} gc_combined_summary;

typedef struct gc_combined_exergy {
    int has_fuel;                  /* 1: the topping keeps exergy books (not a given exhaust) */
    double fuel_W;                 /* fuel (or heat) exergy supplied, the duct burner's fuel
                                      included */
    double duct_fuel_W;            /* the duct burner fuel's exergy as supplied (0 unfired) */
    double intake_W;               /* intake stream's exergy */
    double net_power_W;            /* net shaft work of the plant (generators excluded) */
    double destroyed_W;            /* sum over the components */
    double stack_W;                /* physical exergy of the stack gas */
    double condenser_W;            /* Q_cond (1 - T0 / T_b), T_b = min(T_cond, T0): negative
                                      when condensing below the dead state (warned) */
    double exhaust_chemical_W;     /* chemical exergy of the stack gas (the topping's exhaust
                                      unfired) */
    double heat_rejected_W;        /* exergy of other heat the topping rejects */
    double efficiency;             /* net_power (electric) / fuel exergy */
    int balance_checked;
    double balance_rel;
} gc_combined_exergy;

typedef struct gc_combined_bounds {
    double carnot_efficiency, T_max_K, T_min_K;
    int has_ideal;
    double ideal_efficiency, ideal_net_power_W, ideal_gas_turbine_power_W;
    double ideal_bottoming_power_W;     /* the ideal exhaust's physical flow exergy */
    int has_reversible;
    double reversible_efficiency, reversible_net_power_W, exhaust_exergy_W;
    int has_ideal_steam;
    double ideal_steam_efficiency, ideal_steam_net_power_W, ideal_steam_cycle_net_power_W;
} gc_combined_bounds;

typedef struct gc_combined_checks {
    double energy_hrsg_rel, energy_steam_cycle_rel, energy_bottoming_rel, energy_plant_rel;
    double energy_topping_rel;
    int energy_plant_checked;     /* 1: the topping keeps energy books (not a given exhaust) */
    int exergy_bottoming_checked;
    double exergy_bottoming_rel;
    double pinch_error_K, approach_error_K, min_temperature_difference_K;
    int no_temperature_cross, stack_above_minimum;
    double tolerance;
} gc_combined_checks;

typedef struct gc_combined_result {
    union {
        unsigned char bytes[GC_COMBINED_TOPPING_RESULT_BYTES];
        max_align_t align;
    } topping;                     /* the topping preset's result struct */
    char topping_name[32];
    char gas_label[64];
    gc_combined_exhaust exhaust;
    gc_steam_result steam;         /* the HRSG and steam cycle */
    gc_combined_summary summary;
    int n_levels;
    gc_combined_level_out levels[GC_STEAM_MAX_LEVELS];
    int n_states;
    gc_combined_state states[GC_COMBINED_MAX_STATES];
    int n_processes;
    gc_combined_process processes[GC_COMBINED_MAX_PROCESSES];
    int n_tq;
    gc_combined_tq tq[GC_STEAM_MAX_TQ];
    gc_combined_exergy exergy;
    gc_combined_bounds bounds;
    gc_combined_checks checks;
    char title[160];
} gc_combined_result;

/* The preset's descriptor (preset.h). */
const gc_preset *gc_combined_preset(void);

/* Defaults (the table's, one level of 8 MPa, 500 degC, pinch 10 K,
 * approach 5 K) and a Brayton topping of its own defaults. */
void gc_combined_input_init(gc_combined_input *in);

/* The topping's input struct inside in, after naming it by preset name
 * ("brayton", "exhaust"): its defaults written. NULL for an unknown name. */
void *gc_combined_set_topping(gc_combined_input *in, const char *name);

#endif
