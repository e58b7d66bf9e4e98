/*
 * indicator.h — private to the presets: what the measured-pressure
 * reductions (trace.c, combustion.c) share about the indicator diagram: the
 * ideal Otto cycle at a recording's compression ratio and intake state
 * (evaluated by the cycle engine through the Otto preset, piston.h), and
 * the P-V picture of a measured loop with that ideal cycle overlaid, drawn
 * with the generic chart module (chart.h), linear or log P - log V.
 *
 * Units: SI inside (Pa, m3, K, J, kg); the picture converts to the chosen
 * output system (pressure kPa or psia, volume L or in3).
 */
#ifndef GC_CORE_PRESETS_INDICATOR_H
#define GC_CORE_PRESETS_INDICATOR_H

#include "gascycle/diagram.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"

#include <stddef.h>

/* The ideal Otto cycle of a trapped charge: its inputs, then its figures. */
typedef struct gc__ind_ideal {
    gc_gas gas;                 /* the charge's model (air or cold) */
    double T1_K, P1_Pa;         /* state at the start of compression (BDC) */
    double compression_ratio;   /* - */
    double heat_J_per_kg;       /* heat added at constant volume, per kg of charge */
    double mass_kg;             /* trapped mass (the picture's volumes are m v) */
    /* figures (gc__ind_ideal_eval) */
    int ok;                     /* 1: evaluated */
    double efficiency;          /* thermal efficiency, - */
    double work_J;              /* net work per cycle of the trapped mass, J */
    double mep_Pa;              /* mean effective pressure, Pa */
    double P_max_Pa, T_max_K;   /* peak of the cycle */
} gc__ind_ideal;

/* Evaluates the ideal cycle of x's inputs into its figures (x->ok = 1);
 * an error (err) when the engine cannot run it. */
int gc__ind_ideal_eval(gc__ind_ideal *x, gc_error *err);

/* One measured loop for the P-V picture. */
typedef struct gc__ind_pv {
    const char *title;          /* heading */
    const char *name;           /* legend entry of the measured loop */
    int n;                      /* samples */
    const double *V_m3, *P_Pa;  /* the loop in order */
    const gc__ind_ideal *ideal; /* overlaid when not NULL and ok (and opt asks for it) */
    const char *caption;        /* a line under the plot, or NULL */
} gc__ind_pv;

/* The P-V diagram (opt: units, size, log_x or log_y for log P - log V, the
 * ideal overlay bit) into a malloc'd SVG document. Errors as chart.h's. */
int gc__ind_pv_svg(const gc__ind_pv *d, const gc_diagram_options *opt, char **svg, size_t *len,
                   gc_error *err);

#endif
