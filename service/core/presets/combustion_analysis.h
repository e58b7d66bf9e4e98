/*
 * combustion_analysis.h — private to the presets: the request and result
 * structs of the combustion-analysis reduction (/v1/measured/combustion,
 * combustion_analysis.c), shared by its output table
 * (combustion_outputs.c) and its diagrams (combustion_svg.c).
 *
 * Units: SI base units in every member (Pa, m, m3, K, J, kg, rev/s); crank
 * angles in rad from firing TDC (after TDC positive) in the result, as the
 * output rows convert them (GC_Q_ANGLE); the request keeps the recording as
 * given (angles in deg, pressures in pressure_unit; a text/csv body's in
 * deg and Pa). Rates per degree say so (_per_deg).
 */
#ifndef GC_CORE_PRESETS_COMBUSTION_ANALYSIS_H
#define GC_CORE_PRESETS_COMBUSTION_ANALYSIS_H

#include "core/presets/indicator.h"
#include "gascycle/combustion.h"
#include "gascycle/heatrel.h"
#include "gascycle/preset.h"

#define GC_COMB_MAX_JSON_VALUES (GC_HEATREL_MAX_VALUES + GC_HEATREL_MAX_SAMPLES + 4096)

typedef struct gc_comb_request {
    /* the recording */
    double *angle;                      /* n_angle crank angles, deg (allocated) */
    int n_angle, has_angle;
    double *P;                          /* n_cycles x n_per_cycle, pressure_unit (CSV: Pa) */
    int n_cycles, n_per_cycle, has_cycles;
    int from_csv;                       /* 1: a text/csv body gave the recording */
    char label[GC_HEATREL_MAX_CYCLES][GC_HEATREL_LABEL_LEN]; /* CSV column names */
    char pressure_unit[GC_FIELD_STRING_LEN];
    int has_pressure_unit, echo_pressure_unit;
    /* the engine */
    double bore, stroke, rod, compression_ratio;   /* m, m, m, - */
    int has_bore, has_stroke, has_rod, has_compression_ratio;
    int strokes;
    double speed;                       /* rev/s */
    int has_speed;
    double tdc_angle;                   /* rad, firing TDC on the recording's axis */
    /* pegging */
    int peg_method;                     /* gc_heatrel_peg_method */
    double peg_intake_pressure;         /* Pa */
    int has_peg_intake_pressure;
    double peg_window[2];               /* rad */
    int n_peg_window;
    double peg_exponent;
    /* phasing */
    int phasing_method;                 /* gc_heatrel_phasing_method */
    double loss_angle;                  /* rad */
    double phasing_window[2];           /* rad */
    int n_phasing_window;
    int phasing_correct;
    /* gas, trapped mass, fuel */
    gc_gas gas;
    int has_gas;
    int has_fuel;
    gc_fuel fuel;
    gc_fuel_spec fuel_spec;
    double equivalence_ratio;           /* - */
    int has_equivalence_ratio;
    double fuel_heating_value;          /* J/kg */
    int has_fuel_heating_value;
    double fuel_per_cycle;              /* kg */
    int has_fuel_per_cycle;
    double ivc_temperature;             /* K */
    int has_ivc_temperature;
    double trapped_mass;                /* kg */
    int has_trapped_mass;
    /* windows (rad from firing TDC) */
    double closed_part[2], compression_window[2], expansion_window[2];
    int n_closed_part, n_compression_window, n_expansion_window;
    /* wall heat transfer */
    int wall_model;                     /* gc_heatrel_wall_model */
    double wall_temperature;            /* K */
    double motored_exponent;            /* - */
    int has_motored_exponent;
    /* burn points beyond 10, 50, 90 % */
    double burn_fractions[GC_HEATREL_MAX_EXTRA_POINTS];
    int n_burn_fractions;
} gc_comb_request;

/* One cycle's figures (a row of the per-cycle table; the ensemble's too). */
typedef struct gc_comb_row {
    int cycle;                          /* 1-based column of the recording */
    char label[GC_HEATREL_LABEL_LEN];
    int has_label;
    double peg_offset;                  /* Pa */
    double imep_net, imep_gross, pmep;  /* Pa */
    double work_net, work_gross, work_pumping; /* J */
    double P_max, angle_P_max;          /* Pa, rad */
    double dP_max_per_deg, angle_dP_max;/* Pa/deg, rad */
    double n_compression, n_expansion;  /* - */
    double T_max, angle_T_max;          /* K, rad */
    double trapped_mass;                /* kg */
    double Q_net, Q_gross, Q_wall, Q_total; /* J */
    int burned;                         /* 1: burn points (not a misfire without heat) */
    double soc, eoc, ca10, ca50, ca90;  /* rad */
    double burn_0_10, burn_10_90;       /* rad */
    double extra[GC_HEATREL_MAX_EXTRA_POINTS]; /* rad, at the requested fractions */
    int has_extra[GC_HEATREL_MAX_EXTRA_POINTS];
    int has_ringing;
    double ringing;                     /* W/m2 */
    int has_efficiency;
    double combustion_efficiency;       /* - */
    int misfire, partial_burn;
} gc_comb_row;

/* One sample of the ensemble-average trace. */
typedef struct gc_comb_sample {
    double angle;                       /* rad from firing TDC */
    double P, V;                        /* Pa, m3 */
    int closed;                         /* 1: inside the closed part (heat release) */
    double T;                           /* K, mean gas temperature */
    double dQn_per_deg, Qn;             /* J/deg, J (0 at IVC) */
    double dQg_per_deg, Qg;             /* J/deg, J */
    double mfb;                         /* - */
} gc_comb_sample;

/* Statistics of one figure over cycles (heatrel.h's, angles in rad). */
typedef struct gc_comb_stat {
    int n;
    double mean, std, cov, min, max, lnv;
    int lowest_cycle, highest_cycle;    /* 1-based, 0 when n = 0 */
} gc_comb_stat;

typedef struct gc_comb_result {
    /* engine and recording */
    double bore, stroke, rod, compression_ratio;
    double displacement, clearance;     /* m3 */
    int strokes, n_cycles, n_samples;
    double angle_step;                  /* rad, mean over the recording */
    double period;                      /* rad, 720 or 360 deg */
    double tdc_angle;                   /* rad, firing TDC used on the recording's axis */
    const char *source;                 /* "json" or "text/csv" */
    /* pegging and phasing */
    int peg_method;
    gc_comb_stat peg_offset;            /* Pa */
    int phasing_method, has_phasing, phasing_corrected, has_phasing_fit, has_motored_peak;
    double phasing_shift;               /* rad, true TDC minus the stated */
    double phasing_exponent, phasing_rms;
    double motored_peak_angle;          /* rad */
    double phasing_warn;                /* rad, GC_HEATREL_PHASING_WARN_DEG */
    /* heat release */
    const char *basis;                  /* "net" or "gross" (burn points) */
    int wall_model;
    const char *k_model;                /* how k is taken */
    int has_burned_gas;
    double trapped_mass;                /* kg, ensemble */
    int n_points;
    double point_fraction[GC_HEATREL_MAX_POINTS];
    int has_point[GC_HEATREL_MAX_POINTS];
    /* statistics */
    int n_burning, n_misfire, n_partial;
    double median_heat_release;         /* J */
    char flag_rule[160];                /* the misfire and partial-burn rule in words */
    gc_comb_stat imep_net, imep_gross, pmep, P_max, angle_P_max, dP_max, n_compression,
        n_expansion, Q_total, ca10, ca50, ca90, burn_0_10, burn_10_90, ringing, efficiency;
    gc_comb_stat extra[GC_HEATREL_MAX_EXTRA_POINTS];
    int has_ringing, has_efficiency;
    /* the ensemble-average cycle and the ideal Otto cycle */
    gc_comb_row ensemble;
    gc__ind_ideal ideal;
    const char *ideal_heat_source;      /* "fuel" or "heat_release" */
    double fraction_of_ideal;           /* ensemble gross work / ideal work */
    /* tables */
    gc_comb_row rows[GC_HEATREL_MAX_CYCLES];
    int n_trace;
    gc_comb_sample trace[GC_HEATREL_MAX_SAMPLES];
} gc_comb_result;

#define GC_COMB_N_OUTPUTS 234         /* rows of the output table (checked where it is) */
extern const gc_output gc__comb_outputs[GC_COMB_N_OUTPUTS];
extern const char *const gc__comb_diagrams[];

/* The diagrams (combustion_svg.c): "Pv", "heat_release", "imep". */
int gc__comb_svg(const void *input, const void *result, const char *diagram,
                 const gc_diagram_options *opt, char **svg, size_t *len, gc_error *err);

/* The descriptor (combustion_analysis.c). */
const gc_preset *gc__comb_preset(void);

#endif
