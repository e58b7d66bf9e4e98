/*
 * steam.h — the steam bottoming cycle of a combined-cycle plant: a
 * heat-recovery steam generator (HRSG) with one, two or three pressure
 * levels behind a gas turbine exhaust, and the steam cycle it feeds. Water
 * and steam by IAPWS-IF97 (if97.h), the gas by gas.h, supplementary firing
 * by combustion.h.
 *
 * HRSG (gas path, hot to cold; every section counterflow, in series):
 *   [duct burner] -> level 0 superheater (in parallel with the reheater:
 *   both take the gas from the same inlet to the same outlet temperature) ->
 *   level 0 evaporator -> economiser band 0 -> level 1 superheater ->
 *   level 1 evaporator -> economiser band 1 -> ... -> economiser band n-1
 *   -> stack.
 * Economiser band i heats, in parallel (the gas split in proportion to the
 * duties), the water of every level j <= i from the economiser exit
 * temperature of level i+1 (band n-1: from each level's feedwater) to that
 * of level i (for level i itself: to its economiser exit). So a higher
 * level's economiser is split around the lower levels' evaporators, as in a
 * cascade HRSG ("hp_economiser_1" is its coldest part). The economiser exit
 * temperatures must fall from level to level.
 * Levels are numbered by falling pressure (0 = HP; names "hp", "ip", "lp"
 * for three levels, "hp", "lp" for two, "hp" for one). Other arrangements
 * (a superheater of one level among the sections of another, a condensate
 * preheater) are not modelled. A level is designed either
 *   by pinch and approach: the gas leaves the evaporator at Tsat + pinch and
 *   the water leaves the economiser at Tsat - approach; the steam flow
 *   follows from the energy balance of the superheater (and reheater) and
 *   evaporator, or
 *   by fixed steam conditions: the steam flow is given, the pinch follows
 *   (and must not be negative).
 * The economiser water leaves subcooled by `approach`, the evaporator makes
 * saturated vapour (drum), the superheater heats it to `steam_temperature`
 * (0: saturated steam, no superheater). Steam-side pressure losses are not
 * modelled (drum pressure = superheater outlet pressure); the gas-side
 * pressure loss is spread over the sections in proportion to their duty
 * (it affects only entropy and exergy: the gas is an ideal gas).
 *
 * Steam cycle: the level-0 steam expands in the "hp" turbine section to the
 * next level's pressure (or the reheat pressure with one level); with reheat
 * the whole section-0 exhaust (cold reheat) is reheated in the HRSG to
 * `reheat_temperature`; at each lower level's pressure that level's steam is
 * mixed in (adiabatic, at constant pressure) and the next section expands on,
 * the last to the condenser. Each section has the isentropic efficiency
 * `turbine_efficiency`: h_out = h_in - eta (h_in - h(P_out, s_in)); expansion
 * into the wet region is handled by IF97 (P, s) and (P, h); an expansion end
 * wetter than `dryness_min` raises a warning (not forced).
 * Condenser: at `condenser_pressure`, or at the saturation pressure of the
 * cooling-water inlet temperature + its rise + the terminal temperature
 * difference; the condensate leaves as saturated liquid (no subcooling).
 * Feedwater: with a deaerator (an open feedwater heater at
 * `deaerator_pressure`), a condensate pump raises the condensate to it and a
 * bleed from the turbine at that pressure heats it to saturated liquid; the
 * bleed splits its section into two expansions of the same isentropic
 * efficiency. Then one feed pump per level raises the water to the level's
 * pressure. Without a deaerator the feed pumps take the condensate directly.
 * Pumps: h_out = h_in + (h(P_out, s_in) - h_in) / eta.
 *
 * Bases and signs: absolute figures in W and kg/s; `per kg of GT intake`
 * figures in J/kg = W / intake_mass_flow. Work > 0 is delivered (turbine),
 * pump work is reported as absorbed power (> 0). Heat of an HRSG section is
 * the heat taken by the water (> 0); the condenser's heat is the heat
 * rejected (> 0). Water enthalpy and entropy on the IF97 basis (u = s = 0
 * for the saturated liquid at the triple point); gas stations report the
 * sensible enthalpy h(T) - h(298.15 K) of their gas and the entropy of gas.h
 * (1 bar standard pressure); the balances use gas.h's absolute enthalpies.
 * Exergy: flow exergy e = (h - h0) - T0 (s - s0) against the dead state
 * (T0, P0) of the same fluid (water: liquid at T0, P0); exergy destroyed =
 * T0 S_gen of each component; the condenser's heat leaves at T0 (or at the
 * condensing temperature if that is lower). The exergy balance is checked
 * when there is no supplementary firing (the fuel's chemical exergy is not
 * modelled; with firing the burner's T0 S_gen is reported all the same).
 *
 * T-Q diagram: each section at GC_STEAM_TQ_PER_ZONE even fractions of its
 * heat plus the bends of its water lines; the smallest gas-water difference
 * of each stream is refined by golden-section search between the samples
 * around it (to 1e-4 of the section's heat), so the cross check sees it.
 *
 * Checks (every evaluation, GC_ERR_CHECK beyond tolerance, never silent):
 * energy closure of the HRSG (gas heat = water heat), of the steam cycle
 * (heat in + pump work = turbine work + condenser heat), of the whole
 * bottoming cycle with the duct burner, each to GC_STEAM_TOL_ENERGY relative
 * to the gas heat; the exergy balance (unfired) to the same tolerance; the
 * designed pinch and approach reached (1e-9 K); no temperature cross (gas
 * colder than water) anywhere on the sampled T-Q diagram.
 *
 * Field names: the JSON key of an input is its field name without the unit
 * suffix ("gas_temperature_K" -> "/gas_temperature", levels
 * "/levels/<i>/pressure"); errors and warnings carry those pointers.
 * Processes: each names its main stream's stations (from, to); a mixing
 * process's second inlet is the admitted level's "<level>_steam", the
 * deaerator's the "bleed"; HRSG sections also name their gas stations.
 *
 * Memory: plain values, no heap; a gc_steam_result is about 26 KB and an
 * evaluation uses about 40 KB of stack (a scratch result for the ideal
 * counterpart and the work of one run).
 */
#ifndef GASCYCLE_STEAM_H
#define GASCYCLE_STEAM_H

#include "gascycle/combustion.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"

#define GC_STEAM_MAX_LEVELS 3
#define GC_STEAM_MAX_STATIONS 48
#define GC_STEAM_MAX_PROCESSES 40
#define GC_STEAM_MAX_ZONES 10          /* HRSG gas-path sections */
#define GC_STEAM_TQ_PER_ZONE 9         /* evenly spaced T-Q points per section, ends included;
                                          the points where a water line bends (saturated
                                          liquid or vapour reached) are added */
#define GC_STEAM_MAX_TQ (GC_STEAM_MAX_ZONES * (GC_STEAM_TQ_PER_ZONE + 2 * GC_STEAM_MAX_LEVELS))
#define GC_STEAM_MAX_WARNINGS 16
#define GC_STEAM_MAX_ERRORS 24
#define GC_STEAM_NAME_LEN 32
#define GC_STEAM_CODE_LEN 32
#define GC_STEAM_WARNING_LEN 256
#define GC_STEAM_TOL_ENERGY 1e-9       /* energy and exergy closure, relative to the gas heat */

/* Defaults of gc_steam_input_init (and facts of the trade behind them). */
#define GC_STEAM_DRYNESS_MIN 0.88      /* exhaust quality below which LP blades erode
                                          (about 10-12 % moisture: common practice) */
#define GC_STEAM_PINCH_SMALL_K 5.0     /* pinches below this need very large evaporators
                                          (common practice: 5-15 K) */
#define GC_STEAM_DEAD_T_K 288.15       /* dead state: ISO 15 degC */
#define GC_STEAM_DEAD_P_PA 101325.0    /* dead state: 101.325 kPa */

/* One pressure level of the HRSG. */
typedef struct gc_steam_level_input {
    double pressure_Pa;              /* drum and superheater outlet pressure, Pa,
                                        2e4..19e6, strictly falling from level 0 */
    double steam_temperature_K;      /* superheater outlet temperature, K, above the
                                        saturation temperature and at most 1073.15 K;
                                        0 = saturated steam (no superheater) */
    double pinch_K;                  /* evaporator gas exit minus saturation temperature,
                                        K, (0, 150]; used when steam_mass_flow_kg_per_s = 0 */
    double approach_K;               /* saturation minus economiser water exit
                                        temperature, K, [0, 100] */
    double steam_mass_flow_kg_per_s; /* fixed steam conditions: the steam flow, kg/s,
                                        [0, 1e4]; 0 = design by pinch and approach */
} gc_steam_level_input;

/* Inputs (SI). gc_steam_input_init fills the defaults listed per field. */
typedef struct gc_steam_input {
    /* gas turbine exhaust */
    gc_gas gas;                        /* exhaust gas model (gas.h); a mixture (not the cold
                                          model) when firing; default dry air */
    double gas_temperature_K;          /* exhaust at the HRSG inlet (before any duct
                                          burner), K, within the gas data; default 873.15 */
    double gas_pressure_Pa;            /* exhaust pressure at the HRSG inlet, Pa,
                                          5e4..1e6; default 104325 */
    double intake_mass_flow_kg_per_s;  /* gas turbine intake flow, kg/s, (0, 1e4];
                                          default 1 (figures per kg of intake) */
    double exhaust_mass_ratio;         /* kg of exhaust per kg of intake, [0.8, 1.5];
                                          default 1 */
    double gas_pressure_loss;          /* HRSG gas-side pressure loss, fraction of the inlet
                                          pressure, [0, 0.2]; default 0 */
    double stack_temperature_min_K;    /* lowest acceptable stack temperature (acid dew
                                          point), K, 0 or [273.15, 500]; 0 = none */
    /* supplementary firing (duct burner before the HRSG) */
    double firing_temperature_K;       /* gas temperature after the duct burner, K, above
                                          gas_temperature_K and at most 1500; 0 = unfired */
    int has_fuel;                      /* 1: `fuel` is set (needed when firing) */
    gc_fuel fuel;                      /* duct-burner fuel (combustion.h) */
    double fuel_temperature_K;         /* fuel supply temperature, K; 0 = 298.15 K */
    double burner_efficiency;          /* fraction of m_fuel LHV released, (0, 1];
                                          default 1 */
    /* water and steam */
    int n_levels;                      /* pressure levels, 1..3; default 1 */
    gc_steam_level_input levels[GC_STEAM_MAX_LEVELS]; /* default level 0: 8 MPa,
                                          773.15 K, pinch 10 K, approach 5 K */
    double reheat_temperature_K;       /* hot reheat temperature, K, at most 1073.15;
                                          0 = no reheat */
    double reheat_pressure_Pa;         /* one level with reheat: the reheat pressure, Pa,
                                          between the condenser and level 0; with more
                                          levels 0 (reheat at level 1's pressure) */
    double turbine_efficiency;         /* isentropic, every section, (0, 1]; default 1 */
    double pump_efficiency;            /* isentropic, every pump, (0, 1]; default 1 */
    double condenser_pressure_Pa;      /* Pa, [1e3, 1e5]; 0 = from the cooling water;
                                          default 5000 */
    double cooling_water_temperature_K;/* cooling-water inlet, K, [273.15, 320]; used when
                                          condenser_pressure_Pa = 0 */
    double cooling_water_rise_K;       /* cooling-water temperature rise, K, [1, 25] */
    double condenser_terminal_difference_K; /* condensing minus cooling-water outlet
                                          temperature, K, [1, 25] */
    int deaerator;                     /* 1: deaerator heated by a turbine bleed; default 0 */
    double deaerator_pressure_Pa;      /* Pa, above the condenser and below the lowest
                                          level's pressure */
    double dryness_min;                /* warn below this expansion-end quality, [0.5, 1];
                                          default GC_STEAM_DRYNESS_MIN */
    double dead_state_temperature_K;   /* exergy dead state T0, K, [250, 320];
                                          default 288.15 */
    double dead_state_pressure_Pa;     /* exergy dead state P0, Pa, [5e4, 1.1e5];
                                          default 101325 */
    unsigned flags;                    /* GC_STEAM_NO_IDEAL | GC_STEAM_NO_TQ */
} gc_steam_input;

#define GC_STEAM_NO_IDEAL 1u   /* skip the ideal counterpart (efficiencies 1, no losses) */
#define GC_STEAM_NO_TQ 2u      /* skip the T-Q diagram data (the cross check then uses the
                                  section ends only) */

typedef enum gc_steam_fluid {
    GC_STEAM_WATER = 0,
    GC_STEAM_GAS = 1
} gc_steam_fluid;

/* A station: a named state of the water/steam or of the gas. */
typedef struct gc_steam_station {
    char name[GC_STEAM_NAME_LEN];  /* stable name, e.g. "hp_steam", "cold_reheat", "stack" */
    int fluid;                     /* gc_steam_fluid */
    double T_K;                    /* K */
    double P_Pa;                   /* Pa */
    double h_J_per_kg;             /* water: IF97 basis; gas: h(T) - h(298.15 K), J/kg */
    double s_J_per_kgK;            /* water: IF97 basis; gas: gas.h entropy at P, J/(kg K) */
    double v_m3_per_kg;            /* m3/kg */
    double x;                      /* water: quality 0..1 in or on the dome, -1 single
                                      phase; gas: -1 */
    int region;                    /* water: IF97 region (4: two-phase); gas: 0 */
    double m_kg_per_s;             /* mass flow through the station, kg/s */
    double exergy_J_per_kg;        /* flow exergy against the dead state, J/kg */
} gc_steam_station;

typedef enum gc_steam_process_kind {
    GC_STEAM_ECONOMISER = 0,
    GC_STEAM_EVAPORATOR,
    GC_STEAM_SUPERHEATER,
    GC_STEAM_REHEATER,
    GC_STEAM_DUCT_BURNER,
    GC_STEAM_TURBINE,
    GC_STEAM_PUMP,
    GC_STEAM_CONDENSER,
    GC_STEAM_DEAERATOR,
    GC_STEAM_MIXING
} gc_steam_process_kind;

typedef struct gc_steam_process {
    char name[GC_STEAM_NAME_LEN];  /* stable name, e.g. "hp_economiser", "lp_turbine" */
    int kind;                      /* gc_steam_process_kind */
    int from, to;                  /* station indices of the main stream (water side of an
                                      HRSG section; the gas of the duct burner) */
    int gas_from, gas_to;          /* HRSG sections: gas stations, else -1 */
    double m_kg_per_s;             /* main stream flow, kg/s */
    double work_W;                 /* turbine: delivered (> 0); pump: absorbed (> 0); else 0 */
    double heat_W;                 /* HRSG section: heat into the water; condenser: heat
                                      rejected; duct burner: fuel heat released; else 0 */
    double s_gen_W_per_K;          /* entropy generated, W/K (>= 0) */
    double exergy_destroyed_W;     /* T0 s_gen, W */
    double dT_hot_K, dT_cold_K;    /* HRSG section: gas minus water temperature at its gas
                                      inlet and gas outlet ends; else 0 */
    double dT_min_K;               /* HRSG section: smallest along the T-Q line (sampled,
                                      the bends included, the smallest refined by
                                      golden-section search) */
} gc_steam_process;

/* One point of the T-Q diagram: heat Q counted from the stack end; each
 * section is sampled from its cold end (f = 0) to its hot end (f = 1), every
 * parallel water stream at the same fraction f of its own heat. */
typedef struct gc_steam_tq_point {
    double Q_W;                    /* heat taken from the gas between the stack and here, W */
    double T_gas_K;                /* K */
    int n_water;                   /* parallel water streams in this section, 1..3 */
    double T_water_K[GC_STEAM_MAX_LEVELS]; /* their temperatures, K (level order; the
                                      reheat steam second in the first section) */
    int process[GC_STEAM_MAX_LEVELS];      /* process index of each stream */
} gc_steam_tq_point;

typedef struct gc_steam_warning {
    char code[GC_STEAM_CODE_LEN];  /* stable code, e.g. "turbine_exhaust_wet" */
    char field[GC_ERROR_FIELD_LEN];/* JSON pointer of the input concerned ("" = whole) */
    char message[GC_STEAM_WARNING_LEN]; /* one sentence naming the values */
} gc_steam_warning;

typedef struct gc_steam_summary {
    double net_power_W;            /* turbine minus pump power, W */
    double turbine_power_W;        /* W */
    double pump_power_W;           /* absorbed by all pumps, W */
    double heat_to_steam_W;        /* heat taken by water and steam in the HRSG, W */
    double gas_heat_W;             /* m_gas (h_in - h_stack), after the duct burner, W */
    double condenser_heat_W;       /* W */
    double fuel_heat_W;            /* duct burner: m_fuel LHV, W (0 unfired) */
    double fuel_mass_flow_kg_per_s;/* duct burner fuel, kg/s */
    double gas_mass_flow_kg_per_s; /* gas through the HRSG (after the burner), kg/s */
    double steam_cycle_efficiency; /* net_power / heat_to_steam, - */
    double hrsg_effectiveness;     /* gas_heat / (m_gas (h_in - h(T0))), - */
    double bottoming_efficiency;   /* net_power / (m_gas,in (h_exh - h(T0)) + fuel heat), - */
    double carnot_efficiency;      /* 1 - T_condensing / T_max of the steam, - */
    double exergy_gas_in_W;        /* flow exergy of the exhaust entering, W */
    double exergy_stack_W;         /* flow exergy leaving with the stack gas, W */
    double exergy_destroyed_W;     /* sum over the processes, W */
    double exergy_efficiency;      /* net_power / exergy_gas_in (unfired), - */
    int has_ideal;                 /* 1: the ideal counterpart below was evaluated */
    double ideal_net_power_W;      /* the same plant with efficiencies 1 and no losses, W */
    double ideal_steam_cycle_efficiency; /* - */
    double stack_temperature_K;    /* K */
    double condenser_pressure_Pa;  /* Pa */
    double condenser_temperature_K;/* K, saturation */
    double steam_mass_flow_kg_per_s[GC_STEAM_MAX_LEVELS]; /* per level, kg/s */
    double bleed_mass_flow_kg_per_s;  /* deaerator heating steam, kg/s */
    double condenser_mass_flow_kg_per_s; /* kg/s */
    double pinch_K[GC_STEAM_MAX_LEVELS];    /* achieved, K */
    double approach_K[GC_STEAM_MAX_LEVELS]; /* achieved, K */
    double min_dT_K;               /* smallest gas-water temperature difference, K */
    double exhaust_quality;        /* quality at the condenser inlet (-1 superheated) */
    double min_expansion_quality;  /* lowest quality of any expansion end (-1 none wet) */
    /* per kg of gas turbine intake, J/kg */
    double net_work_J_per_kg_intake;
    double heat_to_steam_J_per_kg_intake;
    double condenser_heat_J_per_kg_intake;
} gc_steam_summary;

typedef struct gc_steam_checks {
    double energy_hrsg_rel;        /* |gas heat - water heat| / gas heat, - */
    double energy_cycle_rel;       /* |heat in + pump work - turbine work - condenser heat|
                                      / gas heat, - */
    double energy_total_rel;       /* whole bottoming cycle with the duct burner, - */
    int exergy_checked;            /* 1 unfired (the balance below is evaluated) */
    double exergy_rel;             /* |exergy in - out - destroyed| / gas heat, - */
    double pinch_error_K;          /* largest |achieved - designed pinch| (pinch design), K */
    double approach_error_K;       /* largest |achieved - designed approach|, K */
    int no_cross;                  /* 1: gas hotter than water everywhere sampled */
    int stack_ok;                  /* 1: stack temperature at or above the minimum */
    double tol_energy;             /* tolerance applied, - */
} gc_steam_checks;

typedef struct gc_steam_result {
    int n_levels;
    int n_stations, n_processes, n_tq;
    gc_steam_station stations[GC_STEAM_MAX_STATIONS];
    gc_steam_process processes[GC_STEAM_MAX_PROCESSES];
    gc_steam_tq_point tq[GC_STEAM_MAX_TQ];
    gc_steam_summary summary;
    gc_steam_checks checks;
    int n_warnings;
    gc_steam_warning warnings[GC_STEAM_MAX_WARNINGS];
} gc_steam_result;

/* Defaults listed in gc_steam_input. */
void gc_steam_input_init(gc_steam_input *in);

/* Checks every input against its bounds (no evaluation) and collects up to
 * max_errors errors into errs (may be NULL with 0). GC_OK or the first
 * error's code; *n_errors (may be NULL) gets the count. */
int gc_steam_validate(const gc_steam_input *in, gc_error *errs, int max_errors,
                      int *n_errors);

/* Validates and evaluates the HRSG and steam cycle (and, unless
 * GC_STEAM_NO_IDEAL, its ideal counterpart). Errors: GC_ERR_INVALID /
 * GC_ERR_RANGE (an input), GC_ERR_INFEASIBLE (a design the gas cannot
 * deliver: no heat above a level's pinch, a temperature cross, a superheater
 * outlet above the gas, a bleed that cannot heat the deaerator ...), field
 * naming the input; GC_ERR_NOCONV, GC_ERR_CHECK (a built-in check beyond
 * tolerance). */
int gc_steam_evaluate(const gc_steam_input *in, gc_steam_result *r, gc_error *err);

/* Index of the station named `name`, or -1. */
int gc_steam_station_index(const gc_steam_result *r, const char *name);

/* Names of the process kinds ("economiser", "turbine", ...). */
const char *gc_steam_process_kind_name(int kind);

#endif
