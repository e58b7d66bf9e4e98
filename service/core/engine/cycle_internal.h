/*
 * cycle_internal.h — what the engine's files share (not installed; the
 * public interface is gascycle/cycle.h): the evaluation context of one run,
 * the process record a step builds, and the helpers and steps each file
 * defines. Prefix gc__cycle_ (internal to the engine).
 *
 *   cycle.c           building a chain, one pass and the heat-exchanger
 *                     iteration, the run, the ideal counterpart, names
 *   cycle_state.c     states (fill_state, push) and the small helpers
 *   steps_work.c      adiabatic steps: isentropic, compression, expansion,
 *                     polytropic
 *   steps_heat.c      heat at constant volume, constant pressure (and
 *                     cooling), isothermal, dual
 *   steps_flow.c      pressure loss, heat exchange, fuel addition, close
 *   cycle_validate.c  the chain's checks before a run
 *   cycle_summary.c   the summary, the second law and the closure checks
 */
#ifndef GC_CYCLE_INTERNAL_H
#define GC_CYCLE_INTERNAL_H

#include "gascycle/cycle.h"
#include "gascycle/combustion.h"
#include "gascycle/exergy.h"
#include "gascycle/path.h"
#include "gascycle/species.h"

/* ---- evaluation context ------------------------------------------------ */

typedef struct hx_pair {
    int first, second;          /* step indices, first < second */
    double T_guess;             /* guessed inlet T of the second side, K (0: none yet) */
    double m_guess;             /* guessed mass ratio of the second side */
    int gas_guess;              /* guessed gas index of the second side */
    double T_actual, m_actual;  /* found in the last pass */
    int gas_actual;
    double Q_first;             /* heat into the first side, J/kg intake (this pass) */
    double T_prev, f_prev;      /* previous guess and residual, for the secant */
    double T_first_in;          /* inlet T of the first side in the last pass, K */
    double m_prev;              /* mass ratio found with the previous guess */
    int have_prev;
} hx_pair;

typedef struct ctx {
    const gc_cycle *c;
    gc_cycle_run *run;
    gc_error *err;
    int n_pairs;
    int pair_of_step[GC_CYCLE_MAX_STEPS];
    hx_pair pairs[GC_CYCLE_MAX_STEPS / 2];
    double loss_after[GC_CYCLE_MAX_STEPS]; /* product of (1 - loss) of later steps */
    double href[GC_CYCLE_MAX_GASES];       /* gc_cycle_h_ref of each gas, J/kg */
    int href_ok[GC_CYCLE_MAX_GASES];       /* 1 when href[i] is that of run->gases[i] */
    char fbuf[GC_CYCLE_FIELD_LEN];
} ctx;

/* Everything one process record needs besides its end state. Specific values
 * (per kg of the gas in the step); gc__cycle_push() multiplies by the mass ratio. */
typedef struct seg {
    int part;
    int curve;
    double a;
    double w, q, dke, diss;     /* J/kg of the gas in the step */
    double eff, eff_p;
    int internal;
    /* fuel steps: the out state's gas and mass ratio, and per-intake figures */
    int fuel;                   /* 1: w, q, dke, diss, dS, q_in, q_out are per intake */
    int gas_out;
    double m_out;
    double dS, q_in, q_out;
} seg;

/* a < b with a relative margin (1e-9) */
static inline int gc__cycle_below(double a, double b) { return a < b * (1.0 - 1e-9); }

/* cycle_state.c: the context helpers, property helpers and states */
const char *gc__cycle_aux_field(ctx *x, int i);
const char *gc__cycle_step_field(ctx *x, int i);
double gc__cycle_f_T(const gc_gas *g, int closed, double T);
double gc__cycle_phi_T(const gc_gas *g, double T);
double gc__cycle_pressure_target(ctx *x, int i, double P1);
double gc__cycle_step_efficiency(const ctx *x, const gc_step *s);
double gc__cycle_step_loss(const ctx *x, const gc_step *s);
double gc__cycle_temperature_target(ctx *x, int i);
double gc__cycle_volume_target(ctx *x, int i, double v1);
int gc__cycle_T_from_f(const gc_gas *g, int closed, double f, double T_guess, double *T,
                       const char *field, gc_error *err);
int gc__cycle_check_direction(ctx *x, int i, int sign, double T1, double T2);
int gc__cycle_fill_state(ctx *x, gc_cycle_state *st, int gas, double T, double P,
                         double V, double m, int step, const char *field);
int gc__cycle_push(ctx *x, int step, const seg *sg, double T, double P, double V,
                   const char *field);
int gc__cycle_solve_s0c(const gc_gas *g, double c, double target, double T_guess,
                        double *T_out, const char *field, gc_error *err);
int gc__cycle_with_field(gc_error *err, int rc, const char *field);
void gc__cycle_seg_init(seg *sg, int curve);

/* steps_work.c: isentropic, compression, expansion and polytropic steps */
int gc__cycle_step_adiabatic(ctx *x, int i);
int gc__cycle_step_polytropic(ctx *x, int i);

/* steps_heat.c: constant-volume, constant-pressure, isothermal and dual steps */
int gc__cycle_step_const_pressure(ctx *x, int i);
int gc__cycle_step_const_volume(ctx *x, int i);
int gc__cycle_step_dual(ctx *x, int i);
int gc__cycle_step_isothermal(ctx *x, int i);

/* steps_flow.c: pressure loss, heat exchange, fuel addition and close */
int gc__cycle_step_close(ctx *x, int i);
int gc__cycle_step_fuel(ctx *x, int i);
int gc__cycle_step_heat_exchange(ctx *x, int i);
int gc__cycle_step_pressure_loss(ctx *x, int i);

/* cycle_validate.c */
int gc__cycle_validate(ctx *x);

/* cycle_summary.c */
int gc__cycle_summarise(ctx *x, double T_dead_over, double P_dead_over);

#endif
