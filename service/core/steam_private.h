/*
 * steam_private.h — what the steam bottoming-cycle sources share (steam.c:
 * inputs, validation, evaluation and results; steam_hrsg.c: the gas path and
 * the level design; steam_turbine.c: feedwater, expansion, deaerator,
 * condenser). Not part of the public contract (gascycle/steam.h).
 * Units: SI base units (K, Pa, J/kg, J/(kg K), kg/s, W).
 */
#ifndef GC_CORE_STEAM_PRIVATE_H
#define GC_CORE_STEAM_PRIVATE_H

#include "gascycle/if97.h"
#include "gascycle/steam.h"

/* A resolved pressure level. */
typedef struct sc_level {
    char name[4];              /* "hp", "ip", "lp" */
    double P, Ts;              /* Pa, K (saturation) */
    gc_if97_state fw;          /* feed pump exit */
    gc_if97_state eco;         /* economiser exit (Ts - approach) */
    gc_if97_state sat;         /* saturated vapour leaving the drum */
    gc_if97_state sh;          /* superheater exit (= sat without a superheater) */
    int superheated;           /* 1: a superheater */
    double m;                  /* steam flow, kg/s */
    double pinch, approach;    /* achieved, K */
} sc_level;

/* One HRSG gas-path section with one to three parallel water streams (the
 * level-0 superheater and the reheater; the economiser band's levels). */
#define SC_STREAMS GC_STEAM_MAX_LEVELS
typedef struct sc_zone {
    int level;                 /* the level whose sections these are */
    int n_streams;
    int kind[SC_STREAMS];      /* gc_steam_process_kind of each stream */
    int lvl[SC_STREAMS];       /* level of each stream */
    char name[SC_STREAMS][GC_STEAM_NAME_LEN];   /* process names */
    char st_in[SC_STREAMS][GC_STEAM_NAME_LEN];  /* water station names, inlet */
    char st_out[SC_STREAMS][GC_STEAM_NAME_LEN]; /* and outlet */
    double m[SC_STREAMS];      /* water flows, kg/s */
    gc_if97_state w_in[SC_STREAMS], w_out[SC_STREAMS];
    double Q[SC_STREAMS];      /* heat into each stream, W */
    double Q_total;            /* W */
    double hg_in, hg_out;      /* gas absolute enthalpy, J/kg */
    double Tg_in, Tg_out;      /* K */
    double Pg_in, Pg_out;      /* Pa */
    double dT_min;             /* smallest gas-water difference (sampled, or the ends), K */
    int proc[SC_STREAMS];      /* process index of each stream (-1 before recording) */
} sc_zone;

/* The work of one evaluation. */
typedef struct sc_work {
    const gc_steam_input *in;
    int full;                  /* 1: with the T-Q diagram (0: the ideal counterpart) */
    gc_error *err;
    /* gas */
    gc_gas gas;                /* gas through the HRSG (products when fired) */
    double m_gas_in, m_gas;    /* exhaust entering, gas through the HRSG, kg/s */
    double T_exh, T_hrsg;      /* exhaust, HRSG inlet (after the burner), K */
    double P_gas;              /* Pa */
    double m_fuel, h_fuel;     /* kg/s, J/kg absolute */
    double fuel_heat, burner_loss; /* W */
    double h_exh_abs, h_hrsg_abs, h_stack_abs; /* gas absolute enthalpies, J/kg */
    double T_stack, P_stack;
    /* water */
    int n;                     /* levels */
    sc_level lv[GC_STEAM_MAX_LEVELS];
    double P_cond, T_cond;
    gc_if97_state cond;        /* saturated liquid leaving the condenser */
    gc_if97_state cpump;       /* condensate pump exit (deaerator only) */
    gc_if97_state da;          /* deaerator exit (saturated liquid) */
    gc_if97_state bleed;       /* the deaerator's heating steam */
    int reheat;
    double P_rh;
    gc_if97_state crh, hrh;    /* cold and hot reheat */
    double rh_flow_per_m0;     /* reheat flow per kg of level-0 steam */
    double beta0;              /* bleed per kg feedwater when the bleed is in section 0 */
    /* HRSG */
    int nz;
    sc_zone z[GC_STEAM_MAX_ZONES];
    /* totals */
    double W_turb, W_pump, Q_cond, Q_water, Q_gas;
    double m_fw, m_bleed, m_cond;
    double h_exhaust;          /* turbine exhaust enthalpy, J/kg */
    double x_exhaust, x_min;   /* exhaust quality; lowest expansion-end quality */
    char x_min_where[GC_STEAM_NAME_LEN];
    double h0w, s0w;           /* water dead state (liquid at T0, P0), J/kg, J/(kg K) */
    gc_steam_result *r;
} sc_work;

/* steam_turbine.c */
int gc__steam_feed_states(sc_work *w);
int gc__steam_level_states(sc_work *w);
int gc__steam_reheat_states(sc_work *w);
int gc__steam_turbine_path(sc_work *w);
int gc__steam_expand(double P_out, const gc_if97_state *in, double eta, gc_if97_state *out,
                     const char *field, gc_error *err);
int gc__steam_pump(double P_out, const gc_if97_state *in, double eta, gc_if97_state *out,
                   const char *field, gc_error *err);

/* steam_hrsg.c */
int gc__steam_burner(sc_work *w);
int gc__steam_hrsg(sc_work *w);          /* solve; the levels' water stations */
int gc__steam_hrsg_record(sc_work *w);   /* gas stations and section processes */
int gc__steam_hrsg_sample(sc_work *w);   /* T-Q data and the cross check */

/* steam.c: recording stations (returns the index, -1 when full) and processes */
int gc__steam_add_water(sc_work *w, const char *name, const gc_if97_state *st, double m);
int gc__steam_add_gas(sc_work *w, const gc_gas *g, const char *name, double T, double P,
                      double m);
int gc__steam_add_process(sc_work *w, const char *name, int kind, int from, int to, double m,
                          double work, double heat, double s_gen);
void gc__steam_warn(sc_work *w, const char *code, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

#endif
