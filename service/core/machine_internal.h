/*
 * machine_internal.h — private declarations shared by the machine module's
 * files (machine.c, machine_cool.c, machine_inlet.c, machine_op.c,
 * machine_curves.c, machine_readings.c); not part of the public contract in
 * include/gascycle/machine.h.
 *
 * The operating-point solver works on a context (gc__mctx) that holds the
 * Brayton chain input of the machine at one site (treated inlet air,
 * condition changes applied) and a scratch chain and run of the engine. An
 * "op run" (gc__machine_op_run) is one nozzle-matched point: for a given IGV
 * flow fraction and firing temperature it finds the pressure ratio at which
 * the first nozzle's flow function equals its design value, each trial
 * being one engine chain run (gc_cycle_run_chain, no ideal counterpart, no
 * areas).
 *
 * Units: SI (K, Pa, kg/s, W, J/kg).
 */
#ifndef GC_CORE_MACHINE_INTERNAL_H
#define GC_CORE_MACHINE_INTERNAL_H

#include "gascycle/machine.h"

/* Convergence of the solves (relative unless said). */
#define GC__M_FF_TOL 1e-12      /* nozzle flow function vs design, relative (ln) */
#define GC__M_FF_ACCEPT 1e-11   /* accepted when the iteration limit is reached */
#define GC__M_TEXH_TOL 1e-9     /* exhaust temperature vs its limit, K */
#define GC__M_POWER_TOL 1e-10   /* net output vs demand, relative */
#define GC__M_MAXIT 40          /* iterations of any one solve */

/* Fuel supply temperature of a chain input: 0 means 298.15 K (brayton.h). */
static inline double gc__machine_fuel_T(double T_K)
{
    return T_K > 0.0 ? T_K : GC_T_REF_K;
}

/* Warning list append (message printf-style). */
void gc__machine_warn(gc_machine_warning *list, int *n, const char *code, const char *field,
                      const char *fmt, ...) __attribute__((format(printf, 5, 6)));

/* Prefixes err->field with prefix (when err is not NULL and rc != GC_OK);
 * returns rc. "/site/x" with prefix "/rating" -> "/rating/site/x". */
int gc__machine_prefix(gc_error *err, const char *prefix, int rc);

/* Replaces a leading "/site" of err->field with `with` (e.g. "/reference"). */
int gc__machine_resite(gc_error *err, const char *with, int rc);

/* y = f(x); GC_OK or an error that aborts the solve. */
typedef int (*gc__mroot_fn)(void *ctx, double x, double *y, gc_error *err);

/* Brent's method on a bracket [a, b] with f(a) = fa, f(b) = fb of opposite
 * signs (GC_ERR_NOCONV if it does not converge). */
int gc__machine_bracket(gc__mroot_fn f, void *ctx, double a, double fa, double b, double fb,
                        double xtol, double ytol, double *x, double *y, gc_error *err);

/* Root of f in [lo, hi] from a known point (x0, y0) and a first trial x1:
 * secant steps, Illinois false position once a sign change brackets the
 * root, steps clamped to [lo, hi]. Stops when |y| <= ytol or the bracket is
 * narrower than xtol. GC_ERR_INFEASIBLE (no sign change: *x, *y hold the
 * point nearest a root found, at a bound) or GC_ERR_NOCONV; field unset. */
int gc__machine_root(gc__mroot_fn f, void *ctx, double x0, double y0, double x1, double lo,
                     double hi, double xtol, double ytol, double *x, double *y, gc_error *err);

/* Per kg of dry air: the inlet treatment of ambient amb (resolved). Fills
 * st (flows per kg of dry air: water_added, condensate, duty and power in
 * kg/kg and J/kg until gc__machine_inlet_scale) and appends warnings. */
int gc__machine_inlet_apply(const gc_machine_inlet *in, const gc_site *amb,
                            double design_inlet_loss, gc_machine_inlet_state *st,
                            gc_machine_warning *w, int *nw, gc_error *err);
/* Turns the per-kg-dry-air figures of st into flows for m_air kg/s of humid air. */
void gc__machine_inlet_scale(gc_machine_inlet_state *st, double m_air_kg_per_s);
/* Checks an inlet's bounds ("/inlet/..."). */
int gc__machine_inlet_check(const gc_machine_inlet *in, gc_error *err);

/* The solver's context. */
typedef struct gc__mctx {
    const gc_machine *m;
    gc_brayton_input bin;       /* chain input at this site (site = treated air) */
    gc_site site;               /* the treated air, resolved (chain start) */
    double m_air_open;          /* kg/s at f_igv = 1 */
    double eta_c_open;          /* compressor efficiency with the condition change, f_igv = 1 */
    double chiller_J_per_kg;    /* chiller power per kg of humid air (J/kg) */
    double P1_Pa, T1_K, R1;     /* compressor inlet */
    double rp_guess;            /* warm start of the pressure ratio */
    double rp_guess_f, rp_guess_T; /* IGV fraction and firing temperature it belongs to */
    int base_limit;             /* gc__machine_solve_load: the base-load point's limit */
    double beta_guess;          /* warm start of the coolant fraction */
    double T_fire_guess;        /* warm start of an exhaust-limited firing temperature (0: none) */
    double slope_ff;            /* d ln(FF)/d ln(rp) learnt from the last solve (about -1) */
    double slope_texh;          /* d T_exh / d T_fire learnt likewise (about 0.6) */
    double slope_pf;            /* (dP/P_base)/df on IGV closure learnt likewise (about 1.5) */
    double tol_ff, tol_texh;    /* inner tolerances in force (GC__M_FF_TOL, GC__M_TEXH_TOL;
                                   looser while an outer solve is far from its answer) */
    int runs;                   /* chain runs made */
    gc_cycle chain;
    gc_brayton_stations st;
    gc_cycle_run run;
} gc__mctx;

/* One nozzle-matched operating point. */
typedef struct gc__mop {
    double f_igv, T_fire, rp;
    double m_air, far, w_net, P_gen, P_net, P_chiller;
    double T2, P2, P3, T_exh, eta_c, eta_t;
    gc_machine_cooled cool;     /* combustor exit, coolant (uncooled: none) */
    double FF;                  /* nozzle flow function, m2 */
} gc__mop;

/* Sets up X for the machine at a site: inlet treatment, condition changes,
 * air flow at open IGVs. ist / amb may be NULL. */
int gc__machine_ctx_init(const gc_machine *m, const gc_site_input *site,
                         const gc_machine_inlet *inlet, const gc_machine_condition *cond,
                         gc__mctx *X, gc_machine_inlet_state *ist, gc_site *amb,
                         gc_machine_warning *w, int *nw, gc_error *err);

/* One engine chain run at (f_igv, T_fire, rp) with the figures of op (FF
 * included) but no nozzle matching. */
int gc__machine_chain_point(gc__mctx *X, double f_igv, double T_fire, double rp, gc__mop *op,
                            gc_error *err);

/* The nozzle-matched point at (f_igv, T_fire). */
int gc__machine_op_run(gc__mctx *X, double f_igv, double T_fire, gc__mop *op, gc_error *err);

/* Base load at IGV fraction f_igv: the firing temperature at the lower of the
 * two limits. *limit = GC_MACHINE_LIMIT_FIRING or _EXHAUST. */
int gc__machine_at_limits(gc__mctx *X, double f_igv, gc__mop *op, int *limit, gc_error *err);

/* The point for a load (kind, value); base = base load here (filled). */
int gc__machine_solve_load(gc__mctx *X, gc_machine_load_kind kind, double value,
                           gc__mop *base, gc__mop *op, int *control, int *limit,
                           gc_error *err);

/* Fills p from op (base = the base-load point at the same conditions). */
void gc__machine_point_fill(const gc__mctx *X, const gc__mop *op, const gc__mop *base,
                            int control, int limit, gc_machine_point *p);

/* gc_machine_cooling_split started from a coolant fraction beta_guess
 * (0: none; a guess near the answer saves burner solves). */
int gc__machine_cooling_split_from(const gc_machine_cooling *c, const gc_fuel *fuel,
                                   double T_fuel_K, const gc_gas *air, double T_coolant_K,
                                   double fuel_air_ratio, double eta_b, double T_rotor_inlet_K,
                                   double beta_guess, gc_machine_cooled *out, gc_error *err);

#endif
