/*
 * indicator.c — the ideal Otto cycle of a measured charge and the P-V
 * picture of a measured loop (indicator.h).
 *
 * Ideal cycle: the Otto preset (piston.h) run by the cycle engine from
 * (T1, P1) over the compression ratio with the given heat added at constant
 * volume (isentropic compression and expansion along the gas model's real
 * curves, path.h); its P-v path is scaled by the trapped mass into cylinder
 * volumes, so it lies on the measured loop's axes. Area checks are left out
 * (GC_CYCLE_NO_AREAS): only the states, the paths and the summary are read.
 *
 * Picture (chart.h): the measured loop as a line, the ideal cycle dashed,
 * pressure in kPa (psia) over volume in L (in3); log P - log V when the
 * options ask for a log axis (the compression and expansion lines are then
 * nearly straight, of slope -n).
 */
#include "core/presets/indicator.h"
#include "gascycle/chart.h"
#include "gascycle/path.h"
#include "gascycle/piston.h"
#include "gascycle/units.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define IDEAL_POINTS 61          /* points per process of the ideal curve */

static int run_otto(const gc__ind_ideal *x, gc_piston_result *pr, gc_error *err)
{
    gc_piston_input *pi = malloc(sizeof *pi);
    if (!pi)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    gc_piston_input_init(pi, GC_PISTON_OTTO);
    pi->gas = x->gas;
    pi->intake_temperature = x->T1_K;
    pi->intake_pressure = x->P1_Pa;
    pi->compression_ratio = x->compression_ratio;
    pi->heat_added = x->heat_J_per_kg;
    pi->flags = GC_CYCLE_NO_AREAS;
    int rc = gc_piston_evaluate(pi, pr, err);
    free(pi);
    return rc;
}

int gc__ind_ideal_eval(gc__ind_ideal *x, gc_error *err)
{
    x->ok = 0;
    if (!(x->mass_kg > 0.0 && x->heat_J_per_kg > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "", "the ideal cycle needs a trapped mass and "
                            "a positive heat added");
    gc_piston_result *pr = malloc(sizeof *pr);
    if (!pr)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    int rc = run_otto(x, pr, err);
    if (rc == GC_OK) {
        const gc_cycle_summary *sm = &pr->cycle.actual.summary;
        x->ok = 1;
        x->efficiency = sm->thermal_efficiency;
        x->work_J = x->mass_kg * sm->net_work;
        x->mep_Pa = sm->mean_effective_pressure;
        x->P_max_Pa = sm->P_max_Pa;
        x->T_max_K = sm->T_max_K;
    }
    free(pr);
    return rc;
}

/* ---- the picture ------------------------------------------------------------------- */

typedef struct pv_data {
    double *V, *P;              /* measured, display units */
    int n;
    double *Vi, *Pi;            /* ideal, display units */
    int ni;
} pv_data;

/* The ideal cycle's P-v path, every process, as cylinder volumes. */
static int ideal_curve(const gc__ind_ideal *x, gc_unit_system sys, pv_data *d, gc_error *err)
{
    gc_piston_result *pr = malloc(sizeof *pr);
    gc_path_point *pts = malloc(IDEAL_POINTS * sizeof *pts);
    int rc = pr && pts ? run_otto(x, pr, err) : gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    const gc_cycle_run *run = rc == GC_OK ? &pr->cycle.actual : NULL;
    int np = run ? run->n_processes : 0;
    if (run) {
        d->Vi = malloc((size_t)np * IDEAL_POINTS * sizeof *d->Vi);
        d->Pi = malloc((size_t)np * IDEAL_POINTS * sizeof *d->Pi);
        if (!d->Vi || !d->Pi)
            rc = gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    }
    for (int k = 0; rc == GC_OK && k < np; k++) {
        rc = gc_cycle_path(run, k, IDEAL_POINTS, pts, err);
        for (int i = 0; rc == GC_OK && i < IDEAL_POINTS; i++) {
            d->Vi[d->ni] = gc_units_from_si(GC_Q_VOLUME, sys, x->mass_kg * pts[i].v_m3_per_kg);
            d->Pi[d->ni++] = gc_units_from_si(GC_Q_PRESSURE, sys, pts[i].P_Pa);
        }
    }
    free(pr);
    free(pts);
    return rc;
}

static int measured(const gc__ind_pv *src, gc_unit_system sys, pv_data *d, gc_error *err)
{
    d->V = malloc((size_t)src->n * sizeof *d->V);
    d->P = malloc((size_t)src->n * sizeof *d->P);
    if (!d->V || !d->P)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    for (int i = 0; i < src->n; i++) {
        d->V[i] = gc_units_from_si(GC_Q_VOLUME, sys, src->V_m3[i]);
        d->P[i] = gc_units_from_si(GC_Q_PRESSURE, sys, src->P_Pa[i]);
    }
    d->n = src->n;
    return GC_OK;
}

static void chart_of(const gc__ind_pv *src, const gc_diagram_options *opt, const pv_data *d,
                     gc_chart *c, gc_chart_series s[2])
{
    int log = opt->log_x || opt->log_y;
    gc_chart_init(c);
    c->title = src->title;
    c->x.title = "Cylinder volume";
    c->x.unit = gc_units_label(GC_Q_VOLUME, opt->units);
    c->y.title = "Cylinder pressure";
    c->y.unit = gc_units_label(GC_Q_PRESSURE, opt->units);
    c->x.scale = c->y.scale = log ? GC_CHART_LOG : GC_CHART_LINEAR;
    c->y.include_zero = !log;
    c->width_px = opt->width_px;
    c->height_px = opt->height_px;
    memset(s, 0, 2 * sizeof s[0]);
    s[0].kind = GC_CHART_LINE;
    s[0].name = src->name;
    s[0].n = d->n;
    s[0].x = d->V;
    s[0].y = d->P;
    c->n_series = 1;
    if (d->ni > 0) {
        s[1].kind = GC_CHART_LINE;
        s[1].name = "ideal Otto cycle";
        s[1].n = d->ni;
        s[1].x = d->Vi;
        s[1].y = d->Pi;
        s[1].dash = GC_CHART_DASHED;
        c->n_series = 2;
    }
    c->series = s;
    c->captions = src->caption ? &src->caption : NULL;
    c->n_captions = src->caption ? 1 : 0;
}

int gc__ind_pv_svg(const gc__ind_pv *src, const gc_diagram_options *opt, char **svg, size_t *len,
                   gc_error *err)
{
    pv_data d;
    memset(&d, 0, sizeof d);
    *svg = NULL;
    *len = 0;
    int rc = measured(src, opt->units, &d, err);
    if (rc == GC_OK && src->ideal && src->ideal->ok && (opt->overlays & GC_DIAGRAM_OVERLAY_IDEAL))
        rc = ideal_curve(src->ideal, opt->units, &d, err);
    if (rc == GC_OK) {
        gc_chart c;
        gc_chart_series s[2];
        chart_of(src, opt, &d, &c, s);
        if (d.ni == 0)   /* the caption speaks of the overlay */
            c.n_captions = 0;
        rc = gc_chart_svg(&c, svg, len, err);
    }
    free(d.V);
    free(d.P);
    free(d.Vi);
    free(d.Pi);
    return rc;
}
