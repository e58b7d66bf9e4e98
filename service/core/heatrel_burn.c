/*
 * heatrel_burn.c — the reduction of one cycle of a pressure recording (steps
 * 5-7 of heatrel.h): loop work and IMEP, peak pressure and rise rate,
 * polytropic exponents, single-zone apparent (net) heat release with k from
 * the gas models at the mean gas temperature, gross heat release with wall
 * heat (Woschni 1967, Hohenberg 1979), burn points, ringing intensity (Eng
 * 2002) and the combustion efficiency estimate; and the published closed
 * forms themselves (Wiebe 1962 burn function, the two heat-transfer
 * correlations, the ringing intensity). Formulas, constants and sources are
 * stated in heatrel.h.
 *
 * Units: Pa, m3, K, J, s; crank angles in degrees (rates per degree).
 */
#include "core/heatrel_internal.h"

#include <math.h>
#include <string.h>

/* ---- closed forms ---------------------------------------------------------- */

double gc_heatrel_wiebe(double th, double th0, double dth, double a, double m, double *dxdth)
{
    double y = (th - th0) / dth;
    if (!(y > 0.0)) {
        if (dxdth)
            *dxdth = 0.0;
        return 0.0;
    }
    double ym = pow(y, m);
    double e = exp(-a * ym * y);
    if (dxdth)
        *dxdth = a * (m + 1.0) * ym * e / dth;
    return 1.0 - e;
}

/* Both correlations as one exp of a sum of logs (the same products of
 * powers to rounding, a few times cheaper than four pow calls). */
double gc_heatrel_woschni_h(double B, double P_Pa, double T_K, double w)
{
    return GC_HEATREL_WOSCHNI_C0 * exp(-0.2 * log(B) + 0.8 * log(P_Pa * 1e-3 * w) +
                                       GC_HEATREL_WOSCHNI_T_EXP * log(T_K));
}

double gc_heatrel_hohenberg_h(double V, double P_Pa, double T_K, double Sp)
{
    return GC_HEATREL_HOHENBERG_C1 * exp(-0.06 * log(V) + 0.8 * log(P_Pa * 1e-5 *
                                         (Sp + GC_HEATREL_HOHENBERG_C2)) - 0.4 * log(T_K));
}

double gc_heatrel_ringing(double dPdt, double P_max, double k, double R, double T_max)
{
    double a = GC_HEATREL_RINGING_BETA_S * dPdt;
    return a * a / (2.0 * k * P_max) * sqrt(k * R * T_max);
}

/* ---- gas properties of the charge as it burns --------------------------------- */

typedef struct hr_gas {
    const gc_gas *u, *b;      /* unburned, burned (b == NULL: unburned only) */
    double Tmin, Tmax;        /* range valid for both, K */
} hr_gas;

static void hr_gas_init(hr_gas *g, const gc_heatrel_input *in)
{
    g->u = &in->gas_unburned;
    g->b = in->has_burned_gas ? &in->gas_burned : NULL;
    g->Tmin = g->u->T_min_K;
    g->Tmax = g->u->T_max_K;
    if (g->b) {
        g->Tmin = fmax(g->Tmin, g->b->T_min_K);
        g->Tmax = fmin(g->Tmax, g->b->T_max_K);
    }
}

static double hr_R(const hr_gas *g, double x)
{
    return g->b ? (1.0 - x) * g->u->R_J_per_kgK + x * g->b->R_J_per_kgK : g->u->R_J_per_kgK;
}

/* cp/cv of the mixture at T (inside the range) with burned fraction x. */
static double hr_k(const hr_gas *g, double T, double x)
{
    double cp = gc_gas_cp_T(g->u, T);
    if (g->b)
        cp = (1.0 - x) * cp + x * gc_gas_cp_T(g->b, T);
    return cp / (cp - hr_R(g, x));
}

/* ---- one cycle ------------------------------------------------------------------- */

typedef struct hr_ctx {
    const gc_heatrel_input *in;
    const gc__hr_axis *ax;
    gc__hr_work *w;
    hr_gas gas;
    int a, b;                 /* closed part (axis samples) */
    double m;                 /* trapped mass, kg */
    double n_m;               /* motored exponent (Woschni) */
    int t_range;              /* 1 when a temperature was clamped */
} hr_ctx;

typedef struct hr_burn {
    int soc, eoc;             /* axis samples */
    double total;             /* J */
} hr_burn;

/* Loop work by the trapezoid rule in V, closing segment included. */
static void work(const gc_heatrel_input *in, const gc__hr_axis *ax, const double *p,
                 gc_heatrel_cycle *out)
{
    double gross = 0.0, pump = 0.0;
    for (int i = 0; i < ax->n; i++) {
        int j = (i + 1 == ax->n) ? 0 : i + 1;
        double thj = j ? ax->th[j] : ax->th[0] + ax->period_deg;
        double dW = 0.5 * (p[i] + p[j]) * (ax->V[j] - ax->V[i]);
        double mid = 0.5 * (ax->th[i] + thj);
        if (in->strokes == 4 && fabs(mid) >= 180.0)
            pump += dW;
        else
            gross += dW;
    }
    double Vd = gc_measured_displacement(&in->geometry);
    out->work_gross_J = gross;
    out->work_pumping_J = pump;
    out->work_net_J = gross + pump;
    out->imep_gross_Pa = gross / Vd;
    out->imep_net_Pa = (gross + pump) / Vd;
    out->pmep_Pa = -pump / Vd;
}

/* Highest sample, highest central-difference rise rate in the closed part. */
static void peaks(const hr_ctx *c, const double *p, gc_heatrel_cycle *out)
{
    const double *th = c->ax->th;
    int kmax = 0;
    for (int i = 1; i < c->ax->n; i++)
        if (p[i] > p[kmax])
            kmax = i;
    out->P_max_Pa = p[kmax];
    out->angle_P_max_deg = th[kmax];
    double best = -HUGE_VAL;
    int kb = c->a + 1;
    for (int i = c->a + 1; i < c->b; i++) {
        double r = (p[i + 1] - p[i - 1]) / (th[i + 1] - th[i - 1]);
        if (r > best) {
            best = r;
            kb = i;
        }
    }
    out->dP_max_Pa_per_deg = best;
    out->angle_dP_max_deg = th[kb];
}

static void fits(const hr_ctx *c, gc_heatrel_cycle *out)
{
    const gc_heatrel_input *in = c->in;
    int i0 = gc__hr_first_at_or_after(c->ax, in->compression_window_deg[0]);
    int i1 = gc__hr_last_at_or_before(c->ax, in->compression_window_deg[1]);
    out->n_compression = gc__hr_poly_fit(c->ax->lnV, c->w->p, i0, i1);
    i0 = gc__hr_first_at_or_after(c->ax, in->expansion_window_deg[0]);
    i1 = gc__hr_last_at_or_before(c->ax, in->expansion_window_deg[1]);
    out->n_expansion = gc__hr_poly_fit(c->ax->lnV, c->w->p, i0, i1);
}

/* Mean gas temperature and k at every closed-part sample for the current x. */
static void temperatures(hr_ctx *c)
{
    gc__hr_work *w = c->w;
    for (int i = c->a; i <= c->b; i++) {
        double T = w->p[i] * c->ax->V[i] / (c->m * hr_R(&c->gas, w->x[i]));
        w->T[i] = T;
        if (!(T >= c->gas.Tmin && T <= c->gas.Tmax)) {
            c->t_range = 1;
            T = T < c->gas.Tmin ? c->gas.Tmin : c->gas.Tmax;
        }
        w->k[i] = hr_k(&c->gas, T, w->x[i]);
    }
}

/* Cumulative apparent (net) heat release from IVC, J. */
static void net_curve(hr_ctx *c)
{
    gc__hr_work *w = c->w;
    const double *V = c->ax->V, *p = w->p;
    w->Qn[c->a] = 0.0;
    for (int i = c->a; i < c->b; i++) {
        double km = 0.5 * (w->k[i] + w->k[i + 1]);
        double pm = 0.5 * (p[i] + p[i + 1]), Vm = 0.5 * (V[i] + V[i + 1]);
        double dQ = km / (km - 1.0) * pm * (V[i + 1] - V[i]) + Vm * (p[i + 1] - p[i]) / (km - 1.0);
        w->Qn[i + 1] = w->Qn[i] + dQ;
    }
}

static hr_burn locate(const double *Q, int a, int b)
{
    hr_burn r = { a, a, 0.0 };
    for (int i = a + 1; i <= b; i++)
        if (Q[i] > Q[r.eoc])
            r.eoc = i;
    double qmin = Q[a];
    for (int i = a + 1; i <= r.eoc; i++)
        if (Q[i] < qmin)
            qmin = Q[i];
    double tol = GC_HEATREL_SOC_EPS * (Q[r.eoc] - qmin);
    for (int i = a; i <= r.eoc; i++)
        if (Q[i] <= qmin + tol)
            r.soc = i;
    r.total = Q[r.eoc] - Q[r.soc];
    return r;
}

double gc__hr_wall_flow(const gc_heatrel_input *in, double V, double p, double T, double dw)
{
    const gc_measured_geometry *g = &in->geometry;
    double Ap = 0.25 * GC__HR_PI * g->bore * g->bore;
    double area = 2.0 * Ap + 4.0 * V / g->bore;
    double Sp = 2.0 * g->stroke * in->speed_rev_s;
    double h = in->wall_model == GC_HEATREL_WALL_WOSCHNI
               ? gc_heatrel_woschni_h(g->bore, p, T, GC_HEATREL_WOSCHNI_C1 * Sp + dw)
               : gc_heatrel_hohenberg_h(V, p, T, Sp);
    return h * area * (T - in->T_wall_K);
}

/* Wall heat flow gas -> wall at sample i, W (Woschni's combustion term from
 * the start of combustion soc on). */
static double wall_flow(const hr_ctx *c, int i, int soc)
{
    double V = c->ax->V[i], p = c->w->p[i], dw = 0.0;
    if (c->in->wall_model == GC_HEATREL_WALL_WOSCHNI && i >= soc) {
        int r = c->a;
        double Vr = c->ax->V[r], pr = c->w->p[r], Tr = c->w->T[r];
        double pmot = pr * exp(c->n_m * (c->ax->lnV[r] - c->ax->lnV[i]));
        double Vd = gc_measured_displacement(&c->in->geometry);
        if (p > pmot)
            dw = GC_HEATREL_WOSCHNI_C2 * Vd * Tr / (pr * Vr) * (p - pmot);
    }
    return gc__hr_wall_flow(c->in, V, p, c->w->T[i], dw);
}

/* Cumulative wall heat from IVC, J (trapezoid rule in time). */
static void wall_curve(hr_ctx *c, int soc_net)
{
    gc__hr_work *w = c->w;
    double omega = 2.0 * GC__HR_PI * c->in->speed_rev_s;
    double q0 = wall_flow(c, c->a, soc_net);
    w->Qw[c->a] = 0.0;
    for (int i = c->a; i < c->b; i++) {
        double q1 = wall_flow(c, i + 1, soc_net);
        double dt = (c->ax->th[i + 1] - c->ax->th[i]) * GC__HR_DEG / omega;
        w->Qw[i + 1] = w->Qw[i] + 0.5 * (q0 + q1) * dt;
        q0 = q1;
    }
}

static void update_x(hr_ctx *c, const hr_burn *bb)
{
    gc__hr_work *w = c->w;
    for (int i = c->a; i <= c->b; i++) {
        double x = 0.0;
        if (bb->total > 0.0 && i >= bb->soc)
            x = i >= bb->eoc ? 1.0 : (w->Qb[i] - w->Qb[bb->soc]) / bb->total;
        w->x[i] = x < 0.0 ? 0.0 : (x > 1.0 ? 1.0 : x);
    }
}

/* The heat-release passes (k follows x_b when a burned gas is given). */
static hr_burn heat_release(hr_ctx *c, int *passes)
{
    gc__hr_work *w = c->w;
    int wall = c->in->wall_model != GC_HEATREL_WALL_NONE;
    hr_burn bb = { c->a, c->a, 0.0 };
    double prev = 0.0;
    for (int i = c->a; i <= c->b; i++)
        w->x[i] = 0.0;
    for (*passes = 1; *passes <= GC_HEATREL_MAX_PASSES; (*passes)++) {
        temperatures(c);
        net_curve(c);
        hr_burn bn = locate(w->Qn, c->a, c->b);
        for (int i = c->a; i <= c->b; i++)
            w->Qw[i] = 0.0;
        if (wall)
            wall_curve(c, bn.soc);
        for (int i = c->a; i <= c->b; i++)
            w->Qb[i] = w->Qn[i] + w->Qw[i];
        bb = locate(w->Qb, c->a, c->b);
        update_x(c, &bb);
        if (!c->gas.b || (*passes > 1 && fabs(bb.total - prev) <= 1e-6 * fabs(bb.total)))
            break;
        prev = bb.total;
    }
    if (*passes > GC_HEATREL_MAX_PASSES)
        *passes = GC_HEATREL_MAX_PASSES;
    return bb;
}

/* Angle where the basis curve first reaches Q(SOC) + f total. */
static double burn_angle(const hr_ctx *c, const hr_burn *bb, double f)
{
    const double *Q = c->w->Qb, *th = c->ax->th;
    double target = Q[bb->soc] + f * bb->total;
    for (int i = bb->soc + 1; i <= bb->eoc; i++)
        if (Q[i] >= target) {
            double d = Q[i] - Q[i - 1];
            double s = d > 0.0 ? (target - Q[i - 1]) / d : 1.0;
            return th[i - 1] + s * (th[i] - th[i - 1]);
        }
    return th[bb->eoc];
}

static void burn_points(const hr_ctx *c, const hr_burn *bb, int n_points, const double *frac,
                        gc_heatrel_cycle *out)
{
    out->n_points = n_points;
    out->Q_total_J = bb->total > 0.0 ? bb->total : 0.0;
    if (!(bb->total > 0.0) || bb->eoc <= bb->soc) {
        out->flags |= GC_HEATREL_FLAG_NO_BURN;
        return;
    }
    out->soc_deg = c->ax->th[bb->soc];
    out->eoc_deg = c->ax->th[bb->eoc];
    for (int k = 0; k < n_points; k++)
        out->point_deg[k] = burn_angle(c, bb, frac[k]);
    out->ca50_deg = out->point_deg[1];
    out->burn_0_10_deg = out->point_deg[0] - out->soc_deg;
    out->burn_10_90_deg = out->point_deg[2] - out->point_deg[0];
}

/* Highest mean gas temperature; ringing and efficiency. */
static void burn_extras(const hr_ctx *c, const hr_burn *bb, gc_heatrel_cycle *out)
{
    const gc__hr_work *w = c->w;
    const gc_heatrel_input *in = c->in;
    int kt = c->a;
    for (int i = c->a + 1; i <= c->b; i++)
        if (w->T[i] > w->T[kt])
            kt = i;
    out->T_max_K = w->T[kt];
    out->angle_T_max_deg = c->ax->th[kt];
    if (in->speed_rev_s > 0.0 && out->dP_max_Pa_per_deg > 0.0) {
        double T = fmin(fmax(w->T[kt], c->gas.Tmin), c->gas.Tmax);
        double dPdt = out->dP_max_Pa_per_deg * 360.0 * in->speed_rev_s;
        out->has_ringing = 1;
        out->ringing_W_per_m2 = gc_heatrel_ringing(dPdt, out->P_max_Pa, w->k[kt],
                                                   hr_R(&c->gas, w->x[kt]), T);
    }
    if (in->fuel_per_cycle_kg > 0.0 && in->fuel_heating_value_J_per_kg > 0.0) {
        out->has_efficiency = 1;
        out->combustion_efficiency = (bb->total > 0.0 ? bb->total : 0.0) /
                                     (in->fuel_per_cycle_kg * in->fuel_heating_value_J_per_kg);
    }
}

static double trapped_mass(const hr_ctx *c)
{
    if (c->in->trapped_mass_kg > 0.0)
        return c->in->trapped_mass_kg;
    return c->w->p[c->a] * c->ax->V[c->a] / (c->gas.u->R_J_per_kgK * c->in->T_ivc_K);
}

void gc__hr_reduce_cycle(const gc_heatrel_input *in, const gc__hr_axis *ax, gc__hr_work *w,
                         int n_points, const double *fractions, gc_heatrel_cycle *out)
{
    double offset = out->peg_offset_Pa;
    memset(out, 0, sizeof *out);
    out->peg_offset_Pa = offset;
    hr_ctx c = { in, ax, w, { NULL, NULL, 0.0, 0.0 }, ax->i_ivc, ax->i_evo, 0.0, 0.0, 0 };
    hr_gas_init(&c.gas, in);
    work(in, ax, w->p, out);
    peaks(&c, w->p, out);
    fits(&c, out);
    c.m = trapped_mass(&c);
    out->trapped_mass_kg = c.m;
    c.n_m = in->motored_exponent > 0.0 ? in->motored_exponent : out->n_compression;
    if (!(c.n_m > 1.0 && c.n_m < 1.7)) {
        c.n_m = GC_HEATREL_PEG_EXPONENT_DEFAULT;
        if (in->wall_model == GC_HEATREL_WALL_WOSCHNI)
            out->flags |= GC_HEATREL_FLAG_MOTORED_N;
    }
    hr_burn bb = heat_release(&c, &out->passes);
    out->Q_net_J = w->Qn[c.b];
    out->Q_wall_J = w->Qw[c.b];
    out->Q_gross_J = w->Qn[c.b] + w->Qw[c.b];
    burn_points(&c, &bb, n_points, fractions, out);
    burn_extras(&c, &bb, out);
    if (c.t_range)
        out->flags |= GC_HEATREL_FLAG_T_RANGE;
}
