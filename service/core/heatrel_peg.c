/*
 * heatrel_peg.c — absolute referencing (pegging) of a relative
 * cylinder-pressure signal and the crank-angle phasing (TDC) check (steps 2
 * and 4 of heatrel.h), and the least-squares polytropic fit they share.
 *
 * Pegging: intake-manifold pressure near BDC (common practice); the
 * two-point fixed-exponent method (Randolph 1990, SAE 900170; Brunt & Pond
 * 1997, SAE 970036; from memory) and its least-squares form over a window.
 * Phasing: the thermodynamic loss angle of a motored trace (common
 * practice), and a compression-line test with the angle offset as a free
 * parameter: ln p = C - c K(theta - d), K the integral of k(T) d ln V with k
 * of the unburned gas at the mean gas temperature (for a constant k this is
 * the straight line of p V^n = const in log p - log V, n = c k), minimised
 * over d by Brent's method (solve.h).
 *
 * Units: Pa, m3; angles in degrees from firing TDC.
 */
#include "core/heatrel_internal.h"
#include "gascycle/solve.h"

#include <math.h>
#include <stdlib.h>

/* ---- the polytropic fit ------------------------------------------------------ */

/* Least squares of y on x over k points; returns the slope, *rss the residual
 * sum of squares (may be NULL). Centred sums. */
static double line_fit(const double *x, const double *y, int k, double *rss)
{
    double mx = 0.0, my = 0.0;
    for (int i = 0; i < k; i++) {
        mx += x[i];
        my += y[i];
    }
    mx /= k;
    my /= k;
    double sxx = 0.0, sxy = 0.0;
    for (int i = 0; i < k; i++) {
        double dx = x[i] - mx;
        sxx += dx * dx;
        sxy += dx * (y[i] - my);
    }
    double slope = sxx > 0.0 ? sxy / sxx : 0.0;
    if (rss) {
        /* the residuals themselves (no cancellation near an exact fit) */
        double s = 0.0;
        for (int i = 0; i < k; i++) {
            double e = (y[i] - my) - slope * (x[i] - mx);
            s += e * e;
        }
        *rss = s;
    }
    return slope;
}

double gc__hr_poly_fit(const double *lnV, const double *p, int i0, int i1)
{
    if (i0 < 0 || i1 < 0 || i1 - i0 < 2)
        return 0.0;
    double mx = 0.0, my = 0.0;
    int k = i1 - i0 + 1;
    for (int i = i0; i <= i1; i++) {
        mx += lnV[i];
        my += log(p[i]);
    }
    mx /= k;
    my /= k;
    double sxx = 0.0, sxy = 0.0;
    for (int i = i0; i <= i1; i++) {
        double dx = lnV[i] - mx;
        sxx += dx * dx;
        sxy += dx * (log(p[i]) - my);
    }
    return sxx > 0.0 ? -sxy / sxx : 0.0;
}

/* ---- pegging ---------------------------------------------------------------------- */

static double peg_intake(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p)
{
    int i0 = gc__hr_first_at_or_after(ax, in->peg_window_deg[0]);
    int i1 = gc__hr_last_at_or_before(ax, in->peg_window_deg[1]);
    double s = 0.0;
    for (int i = i0; i <= i1; i++)
        s += p[i];
    return in->peg_intake_pressure_Pa - s / (i1 - i0 + 1);
}

static double peg_two_point(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p)
{
    int i1 = gc__hr_first_at_or_after(ax, in->compression_window_deg[0]);
    int i2 = gc__hr_last_at_or_before(ax, in->compression_window_deg[1]);
    double n = in->peg_exponent;
    double a1 = pow(ax->V[i1], n), a2 = pow(ax->V[i2], n);
    return (p[i2] * a2 - p[i1] * a1) / (a1 - a2);
}

/* (p + d) V^n = C for every sample of the window: p V^n = C - d V^n, a line in
 * V^n of slope -d. Volumes scaled by the window's first for conditioning. */
static double peg_polytropic(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p)
{
    int i0 = gc__hr_first_at_or_after(ax, in->compression_window_deg[0]);
    int i1 = gc__hr_last_at_or_before(ax, in->compression_window_deg[1]);
    int k = i1 - i0 + 1;
    double *buf = malloc(2 * (size_t)k * sizeof *buf);
    if (buf == NULL)
        return peg_two_point(in, ax, p);
    double *x = buf, *y = buf + k, V0 = ax->V[i0];
    for (int i = 0; i < k; i++) {
        x[i] = pow(ax->V[i0 + i] / V0, in->peg_exponent);
        y[i] = p[i0 + i] * x[i];
    }
    double d = -line_fit(x, y, k, NULL);
    free(buf);
    return d;
}

double gc__hr_peg_offset(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p)
{
    switch (in->peg_method) {
    case GC_HEATREL_PEG_INTAKE:
        return peg_intake(in, ax, p);
    case GC_HEATREL_PEG_TWO_POINT:
        return peg_two_point(in, ax, p);
    case GC_HEATREL_PEG_POLYTROPIC:
        return peg_polytropic(in, ax, p);
    default:
        return 0.0;
    }
}

/* ---- phasing ------------------------------------------------------------------------ */

/* Vertex of the parabola through three points (x1 the middle one). */
static double vertex(double x0, double y0, double x1, double y1, double x2, double y2)
{
    double a = (x1 - x0) * (y1 - y2), b = (x1 - x2) * (y1 - y0);
    double den = a - b;
    if (den == 0.0)
        return x1;
    return x1 - 0.5 * ((x1 - x0) * a - (x1 - x2) * b) / den;
}

static void phasing_loss_angle(const gc_heatrel_input *in, const gc__hr_axis *ax,
                               const double *pe, gc_heatrel_result *r)
{
    int i0 = gc__hr_first_at_or_after(ax, -30.0), i1 = gc__hr_last_at_or_before(ax, 30.0);
    int k = i0;
    for (int i = i0 + 1; i <= i1; i++)
        if (pe[i] > pe[k])
            k = i;
    double th = ax->th[k];
    if (k > 0 && k + 1 < ax->n)
        th = vertex(ax->th[k - 1], pe[k - 1], ax->th[k], pe[k], ax->th[k + 1], pe[k + 1]);
    r->angle_P_max_motored_deg = th;
    r->phasing_shift_deg = th + in->loss_angle_deg;
    r->has_phasing = 1;
}

typedef struct phase_ctx {
    const gc_heatrel_input *in;
    const gc__hr_axis *ax;
    const double *pe;         /* ensemble-average pressure on the axis */
    double m;                 /* trapped mass, kg */
    int i0, k;
    double *x, *y;            /* k each: K(theta - d), ln p */
    double slope;
} phase_ctx;

/* Residual sum of squares of ln p = C - c K along V(theta - d), where
 * dK = k dln V + (k - 1) q dt / (p V) (the first law with k of the unburned
 * gas at T = p V / (m R) and, with a wall model, its heat flow q before
 * combustion; trapezoid rule). */
static int phase_rss(void *vctx, double d, double *rss)
{
    phase_ctx *c = vctx;
    const gc_heatrel_input *in = c->in;
    const gc_gas *g = &in->gas_unburned;
    int wall = in->wall_model != GC_HEATREL_WALL_NONE;
    double lnV0 = 0.0, k0 = 0.0, l0 = 0.0, dt = 0.0;
    for (int i = 0; i < c->k; i++) {
        int j = c->i0 + i;
        double V = gc_measured_volume(&in->geometry, (c->ax->th[j] - d) * GC__HR_DEG, NULL);
        double p = c->pe[j], T = p * V / (c->m * g->R_J_per_kgK);
        double k = gc_gas_k_T(g, fmin(fmax(T, g->T_min_K), g->T_max_K)), lnV = log(V);
        /* heat-loss term per second: (k - 1) q / (p V) */
        double l = wall ? (k - 1.0) * gc__hr_wall_flow(in, V, p, T, 0.0) / (p * V) : 0.0;
        if (i > 0 && wall)   /* (no speed without a wall model: 0 x inf would be NaN) */
            dt = (c->ax->th[j] - c->ax->th[j - 1]) * GC__HR_DEG / (2.0 * GC__HR_PI *
                                                                 in->speed_rev_s);
        c->x[i] = i == 0 ? 0.0 : c->x[i - 1] + 0.5 * (k0 + k) * (lnV - lnV0) +
                                 0.5 * (l0 + l) * dt;
        lnV0 = lnV;
        k0 = k;
        l0 = l;
    }
    c->slope = line_fit(c->x, c->y, c->k, rss);
    return GC_OK;
}

static int phasing_polytropic(const gc_heatrel_input *in, const gc__hr_axis *ax,
                              const double *pe, gc_heatrel_result *r, gc_error *err)
{
    phase_ctx c = { in, ax, pe, 0.0, 0, 0, NULL, NULL, 0.0 };
    c.m = in->trapped_mass_kg > 0.0 ? in->trapped_mass_kg
          : pe[ax->i_ivc] * ax->V[ax->i_ivc] / (in->gas_unburned.R_J_per_kgK * in->T_ivc_K);
    c.i0 = gc__hr_first_at_or_after(ax, in->phasing_window_deg[0]);
    c.k = gc__hr_last_at_or_before(ax, in->phasing_window_deg[1]) - c.i0 + 1;
    double *buf = malloc(2 * (size_t)c.k * sizeof *buf);
    if (buf == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the phasing test");
    c.x = buf;
    c.y = buf + c.k;
    for (int i = 0; i < c.k; i++)
        c.y[i] = log(pe[c.i0 + i]);
    /* coarse scan in 0.1 deg, then Brent between the best point's neighbours */
    const double step = 0.1, lim = GC_HEATREL_PHASING_MAX_DEG;
    double best_d = 0.0, best = HUGE_VAL, rss;
    for (double d = -lim; d <= lim + 1e-9; d += step) {
        phase_rss(&c, d, &rss);
        if (rss < best) {
            best = rss;
            best_d = d;
        }
    }
    double lo = fmax(best_d - step, -lim), hi = fmin(best_d + step, lim), x, y;
    int evals;
    if (gc_solve_minimize(phase_rss, &c, 1, lo, hi, best_d, best, 1e-6, 100, &x, &y, &evals)
        == GC_OK) {
        best_d = x;
        best = y;
    }
    phase_rss(&c, best_d, &rss);
    /* the effective exponent: c times the mean k over the window */
    double lnV_span = log(gc_measured_volume(&in->geometry, (ax->th[c.i0 + c.k - 1] - best_d) *
                                             GC__HR_DEG, NULL)) -
                      log(gc_measured_volume(&in->geometry, (ax->th[c.i0] - best_d) * GC__HR_DEG,
                                             NULL));
    r->phasing_shift_deg = best_d;
    r->phasing_exponent = -c.slope * c.x[c.k - 1] / lnV_span;
    r->phasing_rms = sqrt(rss / c.k);
    r->has_phasing = 1;
    free(buf);
    return GC_OK;
}

int gc__hr_phasing(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *pe,
                   gc_heatrel_result *r, gc_error *err)
{
    r->phasing_method = in->phasing_method;
    if (in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE) {
        phasing_loss_angle(in, ax, pe, r);
        return GC_OK;
    }
    if (in->phasing_method == GC_HEATREL_PHASING_POLYTROPIC)
        return phasing_polytropic(in, ax, pe, r, err);
    return GC_OK;
}
