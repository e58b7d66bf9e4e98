/*
 * combustion_svg.c — the diagrams of the combustion analysis
 * (format=svg&diagram=<name>), drawn with the generic chart module
 * (chart.h) from the result (combustion_analysis.h):
 *   Pv            the ensemble-average cycle's P-V loop with the ideal Otto
 *                 cycle overlaid (indicator.h; scale=log: log P - log V;
 *                 overlay=none: the loop alone);
 *   heat_release  heat-release rate (net; gross dashed with a wall model)
 *                 over crank angle in the closed part, mass fraction burned
 *                 on the right axis, CA10, CA50 and CA90 marked;
 *   imep          net IMEP of every cycle (scatter; misfires and partial
 *                 burns apart) with its mean and the COV in the legend.
 * Units follow the request's system: pressure kPa or psia, volume L or in3,
 * heat-release rate J/deg or Btu/deg, crank angles in degrees.
 */
#include "core/presets/combustion_analysis.h"
#include "gascycle/chart.h"
#include "gascycle/units.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#define PI 3.14159265358979323846
#define BTU_PER_J (1.0 / 1055.05585262)   /* NIST SP 811 B.8: Btu (IT) = 1.055056E+03 J */

const char *const gc__comb_diagrams[] = { "Pv", "heat_release", "imep", NULL };

static double *doubles(int n)
{
    return malloc((size_t)(n > 0 ? n : 1) * sizeof(double));
}

static void sized(gc_chart *c, const gc_diagram_options *opt)
{
    c->width_px = opt->width_px;
    c->height_px = opt->height_px;
}

/* ---- P-V ---------------------------------------------------------------------------------- */

static int pv(const gc_comb_result *x, const gc_diagram_options *opt, char **svg, size_t *len,
              gc_error *err)
{
    double *V = doubles(x->n_trace), *P = doubles(x->n_trace);
    int rc = GC_OK;
    if (!V || !P)
        rc = gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    for (int i = 0; rc == GC_OK && i < x->n_trace; i++) {
        V[i] = x->trace[i].V;
        P[i] = x->trace[i].P;
    }
    char title[96];
    snprintf(title, sizeof title, "Ensemble-average cycle of %d cycles", x->n_cycles);
    gc__ind_pv d = { title, "measured (ensemble average)", x->n_trace, V, P, &x->ideal,
                     x->ideal.ok ? "Dashed: the ideal Otto cycle at the same compression ratio "
                     "and intake state, releasing the same heat (bounds.ideal)." : NULL };
    if (rc == GC_OK)
        rc = gc__ind_pv_svg(&d, opt, svg, len, err);
    free(V);
    free(P);
    return rc;
}

/* ---- heat release ------------------------------------------------------------------------- */

typedef struct hr_data {
    double *th, *qn, *qg, *mfb;
    int n;
} hr_data;

static int hr_fill(const gc_comb_result *x, gc_unit_system sys, hr_data *d)
{
    d->th = doubles(x->n_trace);
    d->qn = doubles(x->n_trace);
    d->qg = doubles(x->n_trace);
    d->mfb = doubles(x->n_trace);
    if (!d->th || !d->qn || !d->qg || !d->mfb)
        return GC_ERR_NOMEM;
    double f = sys == GC_UNITS_US ? BTU_PER_J : 1.0;
    for (int i = 0; i < x->n_trace; i++) {
        const gc_comb_sample *s = &x->trace[i];
        if (!s->closed)
            continue;
        d->th[d->n] = s->angle * 180.0 / PI;
        d->qn[d->n] = s->dQn_per_deg * f;
        d->qg[d->n] = s->dQg_per_deg * f;
        d->mfb[d->n++] = s->mfb;
    }
    return GC_OK;
}

static void hr_series(const gc_comb_result *x, const hr_data *d, gc_chart_series s[3], int *n)
{
    memset(s, 0, 3 * sizeof s[0]);
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "heat-release rate (net)",
                              .n = d->n, .x = d->th, .y = d->qn };
    *n = 1;
    if (x->wall_model != GC_HEATREL_WALL_NONE)
        s[(*n)++] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "heat-release rate (gross)",
                                       .n = d->n, .x = d->th, .y = d->qg,
                                       .dash = GC_CHART_DASHED };
    s[(*n)++] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "mass fraction burned",
                                   .n = d->n, .x = d->th, .y = d->mfb, .y2 = 1,
                                   .dash = GC_CHART_DOTTED };
}

static int heat_release(const gc_comb_result *x, const gc_diagram_options *opt, char **svg,
                        size_t *len, gc_error *err)
{
    hr_data d;
    memset(&d, 0, sizeof d);
    int rc = hr_fill(x, opt->units, &d);
    if (rc != GC_OK) {
        rc = gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    } else {
        gc_chart c;
        gc_chart_series s[3];
        gc_chart_refline ref[3];
        char lab[3][48], title[96];
        const double at[3] = { x->ensemble.ca10, x->ensemble.ca50, x->ensemble.ca90 };
        const char *name[3] = { "CA10", "CA50", "CA90" };
        gc_chart_init(&c);
        snprintf(title, sizeof title, "Heat release of the ensemble-average cycle (%s basis)",
                 x->basis);
        c.title = title;
        c.x = (gc_chart_axis){ .title = "Crank angle from firing TDC", .unit = "deg" };
        c.y = (gc_chart_axis){ .title = "Heat-release rate",
                               .unit = opt->units == GC_UNITS_US ? "Btu/deg" : "J/deg",
                               .include_zero = 1 };
        c.y2 = (gc_chart_axis){ .title = "Mass fraction burned", .fixed_min = 1, .min = 0.0,
                                .fixed_max = 1, .max = 1.0 };
        c.has_y2 = 1;
        hr_series(x, &d, s, &c.n_series);
        c.series = s;
        for (int k = 0; k < 3 && x->ensemble.burned; k++) {
            snprintf(lab[k], sizeof lab[k], "%s %.1f deg", name[k], at[k] * 180.0 / PI);
            ref[c.n_refs++] = (gc_chart_refline){ .vertical = 1, .value = at[k] * 180.0 / PI,
                                                  .label = lab[k], .dash = GC_CHART_DOTTED };
        }
        c.refs = ref;
        sized(&c, opt);
        rc = gc_chart_svg(&c, svg, len, err);
    }
    free(d.th);
    free(d.qn);
    free(d.qg);
    free(d.mfb);
    return rc;
}

/* ---- IMEP per cycle ----------------------------------------------------------------------- */

static int imep(const gc_comb_result *x, const gc_diagram_options *opt, char **svg, size_t *len,
                gc_error *err)
{
    int n = x->n_cycles;
    double *cx = doubles(n), *cy = doubles(n), *fx = doubles(n), *fy = doubles(n);
    int rc = cx && cy && fx && fy ? GC_OK : gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    int nc = 0, nf = 0;
    for (int i = 0; rc == GC_OK && i < n; i++) {
        const gc_comb_row *r = &x->rows[i];
        double v = gc_units_from_si(GC_Q_PRESSURE_DIFFERENCE, opt->units, r->imep_net);
        int flagged = r->misfire || r->partial_burn;
        (flagged ? fx : cx)[flagged ? nf : nc] = r->cycle;
        (flagged ? fy : cy)[flagged ? nf++ : nc++] = v;
    }
    if (rc == GC_OK) {
        gc_chart c;
        gc_chart_series s[2];
        gc_chart_refline ref;
        char mean[96], legend[64];
        const char *unit = gc_units_label(GC_Q_PRESSURE_DIFFERENCE, opt->units);
        double m = gc_units_from_si(GC_Q_PRESSURE_DIFFERENCE, opt->units, x->imep_net.mean);
        gc_chart_init(&c);
        c.title = "Net IMEP of every cycle";
        c.x = (gc_chart_axis){ .title = "Cycle", .unit = "" };
        c.y = (gc_chart_axis){ .title = "Net IMEP", .unit = unit };
        snprintf(legend, sizeof legend, "cycles (COV %.2f %%)", 100.0 * x->imep_net.cov);
        memset(s, 0, sizeof s);
        s[0] = (gc_chart_series){ .kind = GC_CHART_MARKERS, .name = legend, .n = nc, .x = cx,
                                  .y = cy };
        s[1] = (gc_chart_series){ .kind = GC_CHART_MARKERS, .name = "misfire or partial burn",
                                  .n = nf, .x = fx, .y = fy, .mark = GC_CHART_MARK_TRIANGLE,
                                  .color = 4 };
        c.series = nc > 0 ? s : s + 1;
        c.n_series = (nc > 0) + (nf > 0);
        snprintf(mean, sizeof mean, "mean %.4g %s", m, unit);
        ref = (gc_chart_refline){ .value = m, .label = mean, .dash = GC_CHART_DASHED };
        c.refs = &ref;
        c.n_refs = 1;
        sized(&c, opt);
        rc = gc_chart_svg(&c, svg, len, err);
    }
    free(cx);
    free(cy);
    free(fx);
    free(fy);
    return rc;
}

int gc__comb_svg(const void *input, const void *result, const char *diagram,
                 const gc_diagram_options *opt, char **svg, size_t *len, gc_error *err)
{
    const gc_comb_result *x = result;
    (void)input;
    *svg = NULL;
    *len = 0;
    if (!diagram || strcasecmp(diagram, "Pv") == 0)
        return pv(x, opt, svg, len, err);
    if (opt->log_x || opt->log_y)
        return gc_error_set(err, GC_ERR_INVALID, "/scale", "scale=log applies only to "
                            "diagram=Pv");
    if (strcasecmp(diagram, "heat_release") == 0)
        return heat_release(x, opt, svg, len, err);
    return imep(x, opt, svg, len, err);
}
