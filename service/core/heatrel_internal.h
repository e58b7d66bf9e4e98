/*
 * heatrel_internal.h — private helpers shared by the combustion-analysis
 * files of the core (heatrel.c, heatrel_peg.c, heatrel_burn.c,
 * heatrel_stats.c); not part of the public contract in
 * include/gascycle/heatrel.h, which states the model, units and sources.
 *
 * Angles here are degrees from firing TDC in the rotated order of the
 * analysis (the axis), pressures Pa, volumes m3.
 */
#ifndef GC_CORE_HEATREL_INTERNAL_H
#define GC_CORE_HEATREL_INTERNAL_H

#include "gascycle/heatrel.h"

#define GC__HR_PI 3.14159265358979323846
#define GC__HR_DEG (GC__HR_PI / 180.0)

/* The crank-angle axis of the analysis: the recording's angles minus TDC,
 * wrapped into [-period/2, period/2) and rotated to increase. */
typedef struct gc__hr_axis {
    int n;                    /* samples */
    int rot;                  /* recording index of axis sample 0 */
    double period_deg;        /* 720 or 360 */
    double tdc_deg;           /* TDC used on the recording's axis */
    double *th;               /* n, deg aTDC, strictly increasing */
    double *V, *lnV;          /* n, m3 and ln(V / m3) */
    int i_ivc, i_evo;         /* closed part: axis samples i_ivc..i_evo */
} gc__hr_axis;

/* Scratch arrays of one cycle's reduction (each of n doubles). */
typedef struct gc__hr_work {
    double *p;                /* pegged pressure on the axis, Pa */
    double *T, *k, *x;        /* mean gas temperature K, cp/cv, mass fraction burned */
    double *Qn, *Qw, *Qb;     /* cumulative net, wall and mfb-basis heat from IVC, J */
} gc__hr_work;

/* Builds the axis (arrays allocated; free with gc__hr_axis_free). */
int gc__hr_axis_build(gc__hr_axis *ax, const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                      double tdc_deg, gc_error *err);
void gc__hr_axis_free(gc__hr_axis *ax);

/* First axis index with th >= a, last with th <= b (a <= b); -1 when none. */
int gc__hr_first_at_or_after(const gc__hr_axis *ax, double a_deg);
int gc__hr_last_at_or_before(const gc__hr_axis *ax, double b_deg);

/* Least-squares polytropic exponent of ln p on ln V over the axis samples
 * i0..i1 (n = -slope); 0 when fewer than 3 samples. */
double gc__hr_poly_fit(const double *lnV, const double *p, int i0, int i1);

/* Pegging offset (Pa, added to the signal) of one cycle's raw signal p on
 * the axis, by in->peg_method (0 for NONE). */
double gc__hr_peg_offset(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p);

/* Phasing test on the ensemble-average pressure pe (axis order): fills the
 * phasing fields of r. */
int gc__hr_phasing(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *pe,
                   gc_heatrel_result *r, gc_error *err);

/* Work integrals, peak and rise rate, exponents, heat release and burn
 * points of one cycle whose pegged pressure is w->p. */
void gc__hr_reduce_cycle(const gc_heatrel_input *in, const gc__hr_axis *ax, gc__hr_work *w,
                         int n_points, const double *fractions, gc_heatrel_cycle *out);

/* Wall heat flow gas -> wall, W, by in->wall_model (not NONE) at volume V,
 * pressure p and mean gas temperature T; dw (m/s) is added to Woschni's
 * velocity C1 Sp (his combustion term; 0 before combustion). */
double gc__hr_wall_flow(const gc_heatrel_input *in, double V, double p, double T, double dw);

/* Median of n values (x is not changed; scratch of n doubles). */
double gc__hr_median(const double *x, int n, double *scratch);

/* Appends a warning (dropped silently past GC_HEATREL_MAX_WARNINGS, the
 * last slot then says so). */
void gc__hr_warn(gc_heatrel_result *r, const char *field, const char *code, const char *fmt,
                 ...) __attribute__((format(printf, 4, 5)));

#endif
