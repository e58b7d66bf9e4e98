/*
 * cycle.h — the cycle engine: one evaluator for every gas power cycle,
 * described as a working-fluid model, a frame and an ordered chain of
 * processes (steps). Every named cycle (piston.h presets, the Brayton family,
 * the turbojet) is a builder of a gc_cycle; users may post their own chain.
 *
 * Frames
 *   GC_FRAME_CLOSED  per unit mass of trapped gas: w = integral of P dv,
 *                    q - w = du (piston engines).
 *   GC_FRAME_FLOW    steady flow: q - w = dh + d(V^2/2), per kg of intake
 *                    gas; each state carries a mass-flow ratio (kg through
 *                    that station per kg of intake) that grows with fuel.
 *
 * Bases and units (SI throughout): states hold specific properties per kg of
 * the gas at that state (T in K, P in Pa, v in m3/kg, u and h in J/kg
 * absolute as in gas.h, s in J/(kg K) with P_std = 1 bar, V in m/s), and
 * the same enthalpy and internal energy on the sensible basis every reader
 * sees (hs, us): relative to the same gas at 298.15 K, i.e. for a mixture h
 * minus its species' formation enthalpies at 298.15 K (so heat release
 * raises hs), for the cold model cp (T - 298.15 K) and cv (T - 298.15 K).
 * Processes hold extensive-per-intake figures: J (or J/K) per kg of intake
 * gas, i.e. the specific value times the step's mass-flow ratio. In the
 * closed frame the mass-flow ratio is 1, so both bases coincide.
 * Signs: work > 0 is delivered by the gas; heat > 0 enters the gas.
 *
 * Evaluation (gc_cycle_evaluate) returns
 *   actual   the chain as given,
 *   ideal    the internally reversible counterpart between the same limits,
 *            evaluated by the same engine (gc_cycle_idealize): every
 *            compression/expansion efficiency set to 1, every pressure loss
 *            to 0, combustion efficiency 1, ideal regeneration (every heat
 *            exchanger's effectiveness 1: a finite-difference regenerator
 *            destroys exergy, so it cannot belong to a reversible cycle), the
 *            same end conditions (the same heat-addition end condition, the
 *            same ratios), except where a step names its ideal end value
 *            (gc_step.end_value_ideal: a preset whose ratio was raised to
 *            cover losses gives the lossless one, so the ideal keeps the same
 *            overall pressure ratio) and for the expansion that leads, through
 *            loss steps only, to a constant-pressure close: in the ideal it
 *            ends at the start pressure, since the losses it covered are gone.
 *   carnot   1 - T_min/T_max between the actual cycle's extreme temperatures.
 * and the built-in checks of each run (energy closure, state closure, exergy
 * balance, P-v and T-s areas along the real process curves; see
 * gc_cycle_checks). A check beyond its tolerance makes the evaluation fail
 * with GC_ERR_CHECK: never a silent result.
 *
 * Process paths: each process of a run is drawn along its real curve (an
 * isentrope at constant s with variable properties, an isochore, an isobar,
 * an isotherm, a polytrope P v^n = const, an efficiency-limited compression
 * or expansion as the curve of constant polytropic efficiency through its
 * end states, a pressure loss as the ideal-gas throttle (constant T), a
 * heat exchange with pressure loss as a curve linear in T and ln P). path.h
 * samples those curves; the area checks integrate the very same curves.
 *
 * Memory: a gc_cycle and a gc_cycle_result are plain values with fixed-size
 * arrays, no heap, nothing to free. A gc_cycle_result is about 40 KB and a
 * gc_cycle about 9 KB: do not put many on a small thread stack.
 *
 * Not thread-hostile: no global state; any number of evaluations may run in
 * parallel on different structs.
 */
#ifndef GASCYCLE_CYCLE_H
#define GASCYCLE_CYCLE_H

#include "gascycle/error.h"
#include "gascycle/gas.h"

#define GC_CYCLE_MAX_STEPS 32          /* steps in a chain */
#define GC_CYCLE_MAX_PROCESSES 64      /* processes of a run (a dual step makes two) */
#define GC_CYCLE_MAX_STATES 65         /* processes + 1 */
#define GC_CYCLE_MAX_GASES 4           /* distinct gas models along one chain */
#define GC_CYCLE_FIELD_LEN 48          /* JSON pointer buffers in a step */
#define GC_CYCLE_LABEL_LEN 64          /* step labels, NUL included: longer names are refused
                                          by the callers, never cut */
#define GC_CYCLE_STATION_LEN 64        /* station names, NUL included */

/* Tolerances of the built-in checks (relative to the heat added). */
#define GC_CYCLE_TOL_ENERGY 1e-9       /* energy closure and exergy balance */
#define GC_CYCLE_TOL_STATE 1e-9        /* end state vs start state, T, P and v relative */
#define GC_CYCLE_TOL_AREA 1e-6         /* P-v and T-s areas vs net work + dissipated work */
#define GC_CYCLE_TOL_CLOSE 1e-5        /* a close step accepts the state entering it this close
                                          (relative) to the start pressure (constant-pressure
                                          close) or volume (constant-volume close): five
                                          significant figures, what typed data carry (common
                                          practice); the difference is taken along the close's
                                          drawn curve with its reversible work and reported in
                                          checks.close_mismatch */
#define GC_CYCLE_TOL_SGEN 1e-12        /* an entropy generation within this fraction of the
                                          step's entropy scale (m (|s_in| + |s_out|) plus
                                          |Q| / T_boundary), whose T_dead s_gen is also within
                                          it of the heat added, is rounding: it is reported as
                                          0, so no step shows a tiny negative exergy destroyed
                                          (and the exergy balance cannot notice) */

typedef enum gc_frame {
    GC_FRAME_CLOSED = 0,   /* per unit trapped mass, w = integral P dv */
    GC_FRAME_FLOW = 1      /* steady flow, per kg of intake gas */
} gc_frame;

/* Process kinds. Each says which end conditions it takes. "in" is the state
 * entering the step. */
typedef enum gc_process_kind {
    GC_PROC_ISENTROPIC = 0,  /* adiabatic reversible; ends: VOLUME_RATIO, PRESSURE_RATIO,
                                PRESSURE, START_PRESSURE, TEMPERATURE, START_TEMPERATURE,
                                START_VOLUME, VELOCITY (kinetic) */
    GC_PROC_POLYTROPIC,      /* P v^n = const, reversible, n = step.n >= 0; ends: VOLUME_RATIO,
                                PRESSURE_RATIO, PRESSURE, START_PRESSURE, TEMPERATURE (n != 1),
                                START_VOLUME */
    GC_PROC_COMPRESSION,     /* adiabatic with an isentropic (or polytropic) efficiency;
                                ends as ISENTROPIC (VOLUME_RATIO and START_VOLUME in the
                                closed frame only) */
    GC_PROC_EXPANSION,       /* likewise, expansion */
    GC_PROC_CONST_VOLUME,    /* heat at constant volume; ends: TEMPERATURE, START_TEMPERATURE,
                                HEAT, PRESSURE_RATIO, PRESSURE, PEAK_PRESSURE */
    GC_PROC_CONST_PRESSURE,  /* heat at constant pressure (flow frame: with an optional
                                fractional pressure_loss); ends: TEMPERATURE,
                                START_TEMPERATURE, HEAT, VOLUME_RATIO, START_VOLUME */
    GC_PROC_ISOTHERMAL,      /* heat at constant temperature; ends: VOLUME_RATIO,
                                PRESSURE_RATIO, PRESSURE, START_PRESSURE, START_VOLUME, HEAT */
    GC_PROC_DUAL,            /* limited-pressure heat addition: constant volume until end2
                                (PRESSURE_RATIO: exact, must be reached; PEAK_PRESSURE: a
                                limit), then constant pressure until end (TEMPERATURE, HEAT
                                = total of both parts, VOLUME_RATIO = cutoff of the
                                constant-pressure part). Gives two processes. */
    GC_PROC_PRESSURE_LOSS,   /* adiabatic, no work, fractional loss step.pressure_loss (or end
                                PRESSURE_RATIO < 1), or a throttle to an end PRESSURE at or
                                below the inlet's (any ratio, e.g. a free jet expanding to
                                ambient; START_PRESSURE ends before it do not count it); ideal
                                gas: constant h, so constant T */
    GC_PROC_HEAT_EXCHANGE,   /* one side of a two-stream heat exchanger (regenerator); the
                                other side is step.partner. Heat moved hot -> cold:
                                Q = effectiveness * min(Q_max,cold, Q_max,hot), where Q_max of
                                a side takes it from its inlet to the other side's inlet
                                temperature (enthalpy for CONST_P geometry, internal energy for
                                CONST_V). The effectiveness of the lower-indexed side is used.
                                A later station's inlet is found by iteration (secant on its
                                temperature, GC_ERR_NOCONV if it fails). */
    GC_PROC_COOLING,         /* constant-pressure cooling to end TEMPERATURE (intercooler),
                                optional pressure_loss (flow frame) */
    GC_PROC_FUEL,            /* fuel addition: composition changes, mass grows (needs
                                combustion.h; see gc_fuel_step) */
    GC_PROC_CLOSE,           /* heat rejection back to the start state along geometry
                                (CONST_P or CONST_V); flow frame: also back to the start
                                velocity (the kinetic energy given up counts as work) */
    GC_PROC_KIND_COUNT
} gc_process_kind;

typedef enum gc_end_kind {
    GC_END_DEFAULT = 0,         /* the kind's own end (CLOSE: start state; PRESSURE_LOSS: its
                                   fraction; HEAT_EXCHANGE: its effectiveness) */
    GC_END_VOLUME_RATIO,        /* v_end / v_in, - (compression < 1) */
    GC_END_PRESSURE_RATIO,      /* P_end / P_in, - */
    GC_END_TEMPERATURE,         /* T_end, K */
    GC_END_PRESSURE,            /* P_end, Pa */
    GC_END_HEAT,                /* heat of the step, J per kg of the gas in the step, signed */
    GC_END_PEAK_PRESSURE,       /* P_end, Pa, as a pressure limit (CONST_VOLUME, DUAL end2) */
    GC_END_START_TEMPERATURE,   /* T_end = T of the start state */
    GC_END_START_VOLUME,        /* v_end = v of the start state */
    GC_END_START_PRESSURE,      /* P_end = P of the start state divided by the product of
                                   (1 - pressure_loss) of all later steps, so the losses
                                   downstream lead back to the start pressure */
    GC_END_VELOCITY,            /* V_end, m/s (kinetic steps, flow frame) */
    GC_END_KIND_COUNT
} gc_end_kind;

typedef enum gc_geometry {
    GC_GEOM_CONST_P = 0,        /* constant pressure */
    GC_GEOM_CONST_V = 1         /* constant volume */
} gc_geometry;

/* Fuel addition parameters (GC_PROC_FUEL, flow frame): complete combustion
 * by combustion.h, to an end TEMPERATURE or (end DEFAULT) at a fuel-air
 * ratio, with step.efficiency as burner efficiency and step.pressure_loss.
 * Mass grows by the fuel; the gas after the step is the products model. The
 * fuel is supplied at its temperature and at the pressure of the stream it
 * enters. Books, all on the sensible basis of 298.15 K (see cycle.c,
 * step_fuel and step_close): heat_in = m_fuel LHV (298.15 K), heat_out = the
 * burner loss, heat = the rise of the stream's sensible enthalpy less the
 * fuel's own; the close step of a chain with fuel rejects the exhaust's
 * sensible enthalpy less what the intake air and the fuel brought in, so
 * heat_in - heat_out = net work exactly, on one reference. */
typedef struct gc_fuel_step {
    const void *fuel;           /* a const gc_fuel * of combustion.h (borrowed: it must
                                   outlive the evaluation) */
    double fuel_air_ratio;      /* kg fuel per kg of gas entering, when end is DEFAULT */
    double T_fuel_K;            /* fuel supply temperature, K (0: the start temperature) */
} gc_fuel_step;

typedef struct gc_step {
    gc_process_kind kind;
    gc_end_kind end;            /* end condition */
    double end_value;           /* its value in the unit of gc_end_kind (unused for START_*) */
    double end_value_ideal;     /* the value in the ideal counterpart (0: end_value), e.g. a
                                   stage pressure ratio without the allowance for losses */
    gc_end_kind end2;           /* DUAL: end of the constant-volume part (PRESSURE_RATIO or
                                   PEAK_PRESSURE) */
    double end2_value;
    int heat_sign;              /* heat steps: +1 addition, -1 rejection, 0 either; a wrong
                                   direction is GC_ERR_INFEASIBLE on `field` */
    double n;                   /* POLYTROPIC exponent, - (0 isobar, 1 isotherm) */
    double efficiency;          /* COMPRESSION/EXPANSION: isentropic (or polytropic) efficiency
                                   in (0, 1]; HEAT_EXCHANGE: effectiveness in [0, 1]; FUEL:
                                   combustion efficiency in (0, 1]. 0 is read as 1 except for
                                   HEAT_EXCHANGE. */
    int polytropic_efficiency;  /* 1: `efficiency` is a polytropic (small-stage) efficiency */
    double pressure_loss;       /* fractional pressure loss dP/P_in in [0, 1): PRESSURE_LOSS,
                                   and in the flow frame CONST_PRESSURE, COOLING,
                                   HEAT_EXCHANGE (CONST_P), FUEL */
    int partner;                /* HEAT_EXCHANGE: index of the other side's step */
    gc_geometry geometry;       /* HEAT_EXCHANGE and CLOSE */
    int kinetic;                /* flow frame ISENTROPIC/COMPRESSION/EXPANSION: 1 = nozzle or
                                   diffuser: no shaft work, dh = -d(V^2/2) */
    double T_source_K;          /* heat addition: temperature of the source, K, for entropy
                                   generation and exergy (0: the run's peak temperature) */
    gc_fuel_step fuel;          /* FUEL */
    char field[GC_CYCLE_FIELD_LEN];     /* JSON pointer of the input behind end/end_value,
                                           used in errors ("" -> "/steps/<i>") */
    char field_aux[GC_CYCLE_FIELD_LEN]; /* JSON pointer behind efficiency, end2 or
                                           pressure_loss ("" -> field) */
    char label[GC_CYCLE_LABEL_LEN];     /* short name for results, e.g. "compression" */
    char station[GC_CYCLE_STATION_LEN]; /* stable name of the state the step ends at
                                           ("turbine_inlet"), or "" */
    char station_mid[GC_CYCLE_STATION_LEN]; /* DUAL: the state between its two parts */
} gc_step;

/* A further name of the state at the end of step `step` (-1: the start
 * state): a station that coincides with another in this chain (a Brayton
 * cycle without an inlet loss has its compressor inlet at the ambient state). */
#define GC_CYCLE_MAX_ALIASES 8
typedef struct gc_cycle_alias {
    char name[GC_CYCLE_STATION_LEN];
    int step;                   /* the chain's step, or -1; in a result: the state's index */
} gc_cycle_alias;

/* Evaluation flags (gc_cycle.flags). */
#define GC_CYCLE_NO_AREAS 1u    /* skip the P-v/T-s area integration (summary-only callers);
                                   energy, state and exergy checks still run */
#define GC_CYCLE_NO_BOUNDS 2u   /* skip the ideal counterpart (bounds.ideal = actual's copy is
                                   NOT made; result.has_ideal = 0) */

typedef struct gc_cycle {
    gc_frame frame;
    gc_gas gas;                 /* working fluid at the start state */
    double T_start_K;           /* start state temperature, K */
    double P_start_Pa;          /* start state pressure, Pa */
    double V_start_m_per_s;     /* flow frame: start velocity (flight speed), m/s; else 0 */
    double T_dead_K;            /* dead state for exergy, K (0: the run's lowest-T state) */
    double P_dead_Pa;           /* dead-state pressure, Pa (0: that state's pressure) */
    unsigned flags;             /* GC_CYCLE_NO_AREAS | GC_CYCLE_NO_BOUNDS */
    char start_station[GC_CYCLE_STATION_LEN]; /* stable name of the start state, or ""
                                   ("start") */
    int n_steps;
    gc_step steps[GC_CYCLE_MAX_STEPS];
    int n_alias;
    gc_cycle_alias alias[GC_CYCLE_MAX_ALIASES]; /* further names of states (gc_cycle_alias) */
} gc_cycle;

/* ---- building a chain ------------------------------------------------- */

/* Starts a chain: frame, gas (copied), start state. Clears the steps. */
void gc_cycle_init(gc_cycle *c, gc_frame frame, const gc_gas *gas,
                   double T_start_K, double P_start_Pa);

/* Appends a step of `kind` ending on (end, value), with field as its JSON
 * pointer (may be NULL) and efficiency 1, no loss, heat_sign 0. Returns a
 * pointer to the new step for further settings, or NULL when the chain is
 * full (GC_CYCLE_MAX_STEPS). */
/* Adds a further name for the state at the end of step `step` (-1: start).
 * Returns 0, or -1 when the alias table is full. */
int gc_cycle_add_alias(gc_cycle *c, const char *name, int step);

gc_step *gc_cycle_add(gc_cycle *c, gc_process_kind kind, gc_end_kind end,
                      double value, const char *field);

/* Links steps i and j as the two sides of one heat exchanger of
 * effectiveness eps and geometry. GC_ERR_INVALID on bad indices. */
int gc_cycle_link_exchanger(gc_cycle *c, int i, int j, double eps,
                            gc_geometry geometry, const char *field);

/* ---- results ------------------------------------------------------------ */

/* Curve a process is drawn (and integrated) along; see path.h. */
typedef enum gc_curve {
    GC_CURVE_EFF_P = 0,    /* constant polytropic efficiency, flow form:
                              d ln P = a cp dT / (R T) (a = 1: isentrope) */
    GC_CURVE_EFF_V = 1,    /* constant polytropic efficiency, closed form:
                              d ln v = -a cv dT / (R T) (a = 1: isentrope) */
    GC_CURVE_POLY_N = 2,   /* P v^n = const, n != 1 (T varies) */
    GC_CURVE_ISOCHORE = 3, /* v = const */
    GC_CURVE_LINEAR = 4    /* T and ln P linear in the path parameter: isobar, isotherm,
                              throttle, heat exchange with pressure loss */
} gc_curve;

typedef struct gc_cycle_state {
    double T_K;                 /* static temperature, K */
    double P_Pa;                /* static pressure, Pa */
    double v_m3_per_kg;         /* specific volume, m3/kg */
    double u_J_per_kg;          /* specific internal energy (absolute), J/kg */
    double h_J_per_kg;          /* specific enthalpy (absolute), J/kg */
    double s_J_per_kgK;         /* specific entropy, J/(kg K) */
    double V_m_per_s;           /* velocity, m/s (flow frame; 0 in the closed frame) */
    double T_total_K;           /* stagnation temperature, K (= T_K when V = 0) */
    double P_total_Pa;          /* isentropic stagnation pressure, Pa (= P_Pa when V = 0) */
    double mass_ratio;          /* kg of gas at this station per kg of intake, - */
    double hs_J_per_kg;         /* sensible enthalpy, relative to the same gas at 298.15 K, J/kg */
    double us_J_per_kg;         /* sensible internal energy, u(T) - u(298.15 K), J/kg */
    int gas;                    /* index into gc_cycle_run.gases */
    int step;                   /* index of the step that produced it; -1 for the start */
} gc_cycle_state;

typedef struct gc_cycle_process {
    int step;                   /* index of the input step */
    int part;                   /* 0; 1 for the constant-pressure part of a DUAL step */
    int kind;                   /* gc_process_kind of the step */
    int from, to;               /* state indices */
    int gas;                    /* gas index of the process */
    double mass_ratio;          /* kg through this process per kg of intake, - */
    double work;                /* J/kg intake, > 0 delivered by the gas */
    double heat;                /* J/kg intake, > 0 into the gas (internal exchange included) */
    double heat_in;             /* J/kg intake, max(heat, 0) unless internal (fuel: m_fuel LHV
                                   at 298.15 K) */
    double heat_out;            /* J/kg intake, max(-heat, 0) unless internal (fuel: the
                                   burner loss) */
    int internal;               /* 1: heat exchanged between two stations of the cycle
                                   (regenerator): not in heat_in / heat_out */
    double delta_ke;            /* J/kg intake, change of kinetic energy */
    double delta_s;             /* J/(K kg intake), mass_ratio * (s_to - s_from) */
    double s_gen;               /* J/(K kg intake), entropy generated (see gc_cycle_summary
                                   for the boundary convention) */
    double exergy_destroyed;    /* J/kg intake, T_dead * s_gen (0 for the close step of a chain
                                   with fuel: see exergy_lost) */
    double exergy_fuel;         /* J/kg intake, fuel steps: exergy of the fuel as supplied
                                   (exergy.h, chemical + physical), else 0 */
    double exergy_lost;         /* J/kg intake, the close step of a chain with fuel: T_dead *
                                   s_gen, the exhaust's physical exergy that the environment
                                   destroys outside the cycle, else 0 */
    double T_boundary_K;        /* temperature at which the heat crosses the boundary, K
                                   (0 for adiabatic and internal steps) */
    double dissipated;          /* J/kg intake, work dissipated inside the gas along the drawn
                                   path: integral of T ds_gen,internal (friction, throttling) */
    double efficiency;          /* isentropic efficiency achieved (compression/expansion),
                                   effectiveness (heat exchange), else 1 */
    double polytropic_efficiency; /* compression/expansion: the constant polytropic efficiency
                                   of the drawn curve, else 1 */
    int curve;                  /* gc_curve */
    double curve_a;             /* EFF_P/EFF_V: a; POLY_N: n */
} gc_cycle_process;

/* Exergy models (gc_cycle_summary.exergy_model).
 * Heat reservoir (chains without fuel, the air-standard cycles): heat
 * entering crosses the boundary at the source temperature (step.T_source_K,
 * default the run's peak temperature), or at the step's highest gas
 * temperature if that is higher; heat leaving crosses it at the dead-state
 * temperature, or at the step's lowest gas temperature if that is lower. So
 * s_gen = delta_s - heat/T_boundary >= 0 for each external step, and the
 * exergy supplied is that of the heat, heat_in (1 - T_dead/T_boundary).
 * Fuel (chains with fuel addition): the exergy supplied is the fuel's
 * (exergy.h: Szargut's reference environment at the dead state, chemical and
 * physical as supplied); a fuel step's delta_s includes the fuel's own
 * entropy (S_out - S_in - m_fuel s_fuel), so T_dead s_gen is the combustor's
 * destruction by reaction, mixing and heat transfer inside the flame; its
 * burner loss leaves at the dead-state temperature. Other heat steps keep the
 * reservoir convention. The close step stands for the exhaust leaving to the
 * environment: its T_dead s_gen is booked as exergy_lost, not destroyed, and
 * the summary reports the exhaust's exergy (physical + chemical).
 * Both: the two sides of a heat exchanger form one adiabatic pair: the pair's
 * s_gen (sum of both sides' delta_s) is booked on the higher-indexed side,
 * 0 on the other. */
typedef enum gc_exergy_model {
    GC_EXERGY_RESERVOIR = 0,    /* heat from reservoirs at T_boundary */
    GC_EXERGY_FUEL = 1          /* fuel chemical exergy, Szargut's reference environment */
} gc_exergy_model;

typedef struct gc_cycle_summary {
    double net_work;            /* J/kg intake, sum of process work */
    double heat_in;             /* J/kg intake */
    double heat_out;            /* J/kg intake, >= 0 */
    double work_in;             /* J/kg intake, compression work, >= 0 */
    double work_out;            /* J/kg intake, expansion work, >= 0 */
    double thermal_efficiency;  /* net_work / heat_in, - */
    double back_work_ratio;     /* work_in / work_out, - (0 when work_out = 0) */
    double mean_effective_pressure; /* Pa, closed frame: net_work / (v_max - v_min); 0 in flow */
    double T_max_K, T_min_K;    /* K, over the states */
    double P_max_Pa, P_min_Pa;  /* Pa, over the states */
    double v_max_m3_per_kg, v_min_m3_per_kg; /* m3/kg, over the states */
    double carnot_efficiency;   /* 1 - T_min/T_max, - */
    double T_dead_K, P_dead_Pa; /* dead state used, K, Pa */
    int exergy_model;           /* gc_exergy_model */
    double exergy_heat_in;      /* J/kg intake, sum of reservoir heat_in (1 - T_dead/T_boundary)
                                   (fuel steps excluded) */
    double exergy_heat_out;     /* J/kg intake, sum of heat_out (1 - T_dead/T_boundary) */
    double exergy_fuel;         /* J/kg intake, sum of the fuel steps' exergy_fuel */
    double exergy_in;           /* J/kg intake, exergy supplied: exergy_heat_in + exergy_fuel */
    double exergy_intake;       /* J/kg intake, fuel model: exergy of the start state's stream
                                   (chemical, and physical when it is not the dead state) */
    double exergy_exhaust;      /* J/kg intake, fuel model: exergy carried away by the exhaust:
                                   the close steps' exergy_lost plus the end state's exergy */
    double exergy_exhaust_chemical; /* J/kg intake, fuel model: its chemical part (the end
                                   gas at the dead state) */
    double exergy_destroyed;    /* J/kg intake, sum over processes (exergy_lost excluded) */
    double second_law_efficiency; /* net_work / exergy_in, - (reservoir model: the "exergy of
                                   heat in" form, equal to thermal / Carnot efficiency when
                                   all heat comes from one source at T_max and T_dead = T_min;
                                   fuel model: on the fuel's exergy) */
    double dissipated;          /* J/kg intake, sum of process dissipated work */
    double fuel_air_ratio;      /* kg fuel per kg intake, total (0 without fuel steps) */
} gc_cycle_summary;

/* Built-in checks. Relative errors are taken against heat_in (energy,
 * exergy) or against the expected area (areas), never NaN. */
typedef struct gc_cycle_checks {
    double energy_residual;     /* J/kg intake, sum(heat) - sum(work) - (mass-weighted change of
                                   h + ke over the loop; 0 for a closed loop) */
    double energy_rel;          /* |energy_residual| / heat_in, - */
    double state_rel;           /* max relative mismatch of T, P, v between end and start, - */
    double exergy_rel;          /* |exergy_in + exergy_intake - exergy_heat_out - net_work -
                                   exergy_destroyed - exergy_exhaust| / heat_in, - */
    double close_rel;           /* relative mismatch of the state entering a close step and
                                   the start state (pressure or volume, by geometry), - */
    int areas_done;             /* 1 when the areas were integrated */
    int areas_applicable;       /* 1 (reserved for curves the checks cannot integrate) */
    double area_pv;             /* J/kg intake, closed: loop integral of P dv; flow: of -v dP,
                                   each process weighted by its mass ratio */
    double area_ts;             /* J/kg intake, loop integral of T ds, mass-weighted */
    double area_expected_pv;    /* J/kg intake, net work + dissipated (+ sum of m dke, flow) */
    double area_expected_ts;    /* J/kg intake, area_expected_pv plus the mass-weighted change
                                   of h (flow) or u (closed) along the drawn curves (0 around
                                   a loop of one gas; with fuel the gas changes), less, for a
                                   fuel step, its drawn entropy offset times the mean T */
    double area_pv_rel;         /* |area_pv - expected| / max(|expected|, 0.01 heat_in), - */
    double area_ts_rel;         /* likewise for T-s, - */
    int area_evaluations;       /* integrand evaluations the adaptive Simpson rule used */
    double tol_energy, tol_state, tol_area, tol_close; /* tolerances applied, - */
} gc_cycle_checks;

typedef struct gc_cycle_run {
    gc_frame frame;
    int n_states;
    int n_processes;
    int n_gases;
    int regen_iterations;       /* chain passes used to converge heat exchangers (1: none) */
    gc_cycle_state states[GC_CYCLE_MAX_STATES];        /* states[0] is the start */
    gc_cycle_process processes[GC_CYCLE_MAX_PROCESSES];
    gc_gas gases[GC_CYCLE_MAX_GASES];                  /* gases[0] is the cycle's gas */
    gc_cycle_summary summary;
    gc_cycle_checks checks;
} gc_cycle_run;

typedef struct gc_cycle_result {
    gc_cycle_run actual;        /* the cycle as given */
    gc_cycle_run ideal;         /* internally reversible counterpart (valid when has_ideal) */
    int has_ideal;              /* 1 unless GC_CYCLE_NO_BOUNDS */
    int ideal_is_actual;        /* 1 when the chain had nothing to idealise (copy) */
    int has_ideal_components;   /* 1 when a heat exchanger's effectiveness is below 1: then the
                                   second bound below differs from the ideal */
    gc_cycle_summary ideal_components; /* second bound, "ideal components, this regenerator":
                                   efficiencies 1, losses 0, the chain's own heat-exchanger
                                   effectiveness (summary only; valid when
                                   has_ideal_components) */
    double carnot_efficiency;   /* 1 - T_min/T_max of the actual cycle, - */
    int n_steps;                /* steps of the chain evaluated */
    char label[GC_CYCLE_MAX_STEPS][GC_CYCLE_LABEL_LEN];   /* their labels (names of the
                                   processes of both runs; "" = the kind's name) */
    char station[GC_CYCLE_MAX_STATES][GC_CYCLE_STATION_LEN]; /* stable name of each state of
                                   the actual run, unique within it: gc_step.station (the
                                   start state's gc_cycle.start_station, else "start"), else
                                   derived from the step's label in snake_case, "_end"
                                   (closed frame) or "_exit" (flow) appended ("compression_end",
                                   "intercooler_1_exit"), "_mid" for a DUAL step's middle
                                   state; a repeated name gets "_2", "_3" ... */
    int n_alias;                /* further names (gc_cycle.alias), state = the state's index;
                                   none repeats a station name */
    gc_cycle_alias alias[GC_CYCLE_MAX_ALIASES];
} gc_cycle_result;

/* ---- evaluation ------------------------------------------------------- */

/* Evaluates the actual cycle, its ideal counterpart and the Carnot bound,
 * with all checks. Returns GC_OK or an error with err->field naming the
 * step's input (JSON pointer): GC_ERR_INVALID (bad parameter),
 * GC_ERR_INFEASIBLE (end condition unreachable or in the wrong direction),
 * GC_ERR_RANGE (a temperature outside the gas data), GC_ERR_NOCONV
 * (heat-exchanger iteration), GC_ERR_CHECK (a check beyond tolerance),
 * GC_ERR_RICH (fuel addition beyond stoichiometric). */
int gc_cycle_evaluate(const gc_cycle *c, gc_cycle_result *r, gc_error *err);

/* Evaluates the chain once (no ideal counterpart): states, processes,
 * summary and checks of one run. */
int gc_cycle_run_chain(const gc_cycle *c, gc_cycle_run *run, gc_error *err);

/* Builds the ideal counterpart of c into *ideal (efficiencies 1, losses 0,
 * effectiveness 1, ideal end values, the final expansion back to the start
 * pressure; see the top of this file). Returns 1 if anything changed, 0 if
 * the chain is already ideal. */
int gc_cycle_idealize(const gc_cycle *c, gc_cycle *ideal);

/* Validates the chain's structure and parameters without evaluating. */
int gc_cycle_validate(const gc_cycle *c, gc_error *err);

/* The zero of the sensible basis of gas g: its absolute enthalpy at 298.15 K
 * taken as its species' formation enthalpies (gc_species_h298_molar, the
 * values combustion.h's heating values use) for a mixture, cp 298.15 K for
 * the cold model, J/kg. hs = h - gc_cycle_h_ref(g). */
double gc_cycle_h_ref(const gc_gas *g);

/* Names for results and errors ("isentropic", "constant_volume", ...). */
const char *gc_cycle_kind_name(int kind);
const char *gc_cycle_end_name(int end);
const char *gc_cycle_curve_name(int curve);

#endif
