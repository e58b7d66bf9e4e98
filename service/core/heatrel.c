/*
 * heatrel.c — combustion analysis of a cylinder-pressure recording: the
 * stated defaults, validation of the input against the recording, the
 * crank-angle axis, and the analysis in the order heatrel.h states (axis,
 * pegging, ensemble average, phasing check, per-cycle reduction, flags and
 * statistics, coded warnings); owner of the result's heap arrays.
 *
 * The model, its sources and its units are stated in heatrel.h; the
 * per-cycle numerics are in heatrel_burn.c, pegging and phasing in
 * heatrel_peg.c, the statistics in heatrel_stats.c.
 */
#include "core/heatrel_internal.h"
#include "core/preset_util.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- defaults -------------------------------------------------------------------- */

void gc_heatrel_input_init(gc_heatrel_input *in)
{
    memset(in, 0, sizeof *in);
    in->strokes = 4;
    in->peg_window_deg[0] = -185.0;
    in->peg_window_deg[1] = -175.0;
    in->peg_exponent = GC_HEATREL_PEG_EXPONENT_DEFAULT;
    in->loss_angle_deg = GC_HEATREL_LOSS_ANGLE_DEFAULT_DEG;
    in->phasing_window_deg[0] = -60.0;
    in->phasing_window_deg[1] = -25.0;
    gc_gas_init_air(&in->gas_unburned);
    in->ivc_deg = GC_HEATREL_IVC_DEFAULT_DEG;
    in->evo_deg = GC_HEATREL_EVO_DEFAULT_DEG;
    in->compression_window_deg[0] = -100.0;
    in->compression_window_deg[1] = -65.0;
    in->expansion_window_deg[0] = 60.0;
    in->expansion_window_deg[1] = 100.0;
    in->wall_model = GC_HEATREL_WALL_NONE;
    in->T_wall_K = GC_HEATREL_WALL_T_DEFAULT_K;
}

/* ---- the axis ---------------------------------------------------------------------- */

static double wrap(double th, double period)
{
    return th - period * floor((th + 0.5 * period) / period);
}

int gc__hr_first_at_or_after(const gc__hr_axis *ax, double a)
{
    int lo = 0, hi = ax->n;              /* first index with th >= a in [lo, hi] */
    while (lo < hi) {
        int mid = lo + (hi - lo) / 2;
        if (ax->th[mid] >= a)
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo < ax->n ? lo : -1;
}

int gc__hr_last_at_or_before(const gc__hr_axis *ax, double b)
{
    int lo = 0, hi = ax->n;              /* first index with th > b */
    while (lo < hi) {
        int mid = lo + (hi - lo) / 2;
        if (ax->th[mid] > b)
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo - 1;
}

void gc__hr_axis_free(gc__hr_axis *ax)
{
    free(ax->th);
    free(ax->V);
    free(ax->lnV);
    memset(ax, 0, sizeof *ax);
}

int gc__hr_axis_build(gc__hr_axis *ax, const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                      double tdc_deg, gc_error *err)
{
    memset(ax, 0, sizeof *ax);
    int n = tr->n_samples;
    ax->n = n;
    ax->period_deg = in->strokes == 4 ? 720.0 : 360.0;
    ax->tdc_deg = tdc_deg;
    ax->th = malloc((size_t)n * sizeof *ax->th);
    ax->V = malloc((size_t)n * sizeof *ax->V);
    ax->lnV = malloc((size_t)n * sizeof *ax->lnV);
    if (!ax->th || !ax->V || !ax->lnV) {
        gc__hr_axis_free(ax);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the crank-angle axis");
    }
    int rot = 0;
    double wmin = HUGE_VAL;
    for (int j = 0; j < n; j++) {
        double w = wrap(tr->angle_deg[j] - tdc_deg, ax->period_deg);
        if (w < wmin) {
            wmin = w;
            rot = j;
        }
    }
    ax->rot = rot;
    for (int i = 0; i < n; i++) {
        int j = (rot + i) % n;
        ax->th[i] = wrap(tr->angle_deg[j] - tdc_deg, ax->period_deg);
        if (i > 0 && !(ax->th[i] > ax->th[i - 1])) {
            gc__hr_axis_free(ax);
            return gc_error_set(err, GC_ERR_INVALID, "/trace", "the crank angles do not fit in "
                                "one cycle of %.0f degrees around TDC at %.6g deg",
                                in->strokes == 4 ? 720.0 : 360.0, tdc_deg);
        }
        ax->V[i] = gc_measured_volume(&in->geometry, ax->th[i] * GC__HR_DEG, NULL);
        ax->lnV[i] = log(ax->V[i]);
    }
    ax->i_ivc = gc__hr_first_at_or_after(ax, in->ivc_deg);
    ax->i_evo = gc__hr_last_at_or_before(ax, in->evo_deg);
    return GC_OK;
}

/* ---- validation ----------------------------------------------------------------------- */

static int finite_pos(double x)
{
    return isfinite(x) && x > 0.0;
}

static void check_geometry(gc__errlist *L, const gc_measured_geometry *g)
{
    if (!finite_pos(g->bore))
        gc__errlist_add(L, GC_ERR_INVALID, "/bore", "must be a positive length");
    if (!finite_pos(g->stroke))
        gc__errlist_add(L, GC_ERR_INVALID, "/stroke", "must be a positive length");
    if (!(isfinite(g->rod_length) && g->rod_length > 0.5 * g->stroke))
        gc__errlist_add(L, GC_ERR_INVALID, "/connecting_rod_length", "must exceed the crank "
                        "radius (half the stroke)");
    if (!(isfinite(g->compression_ratio) && g->compression_ratio > 1.0 &&
          g->compression_ratio <= 100.0))
        gc__errlist_add(L, GC_ERR_INVALID, "/compression_ratio",
                        "must be greater than 1 and at most 100");
}

/* The samples of the recording: counts, finite values, increasing angles and a
 * span of one cycle (short of it by at most the longest step or
 * GC_HEATREL_GAP_DEG, and strictly less than a full period). */
static void check_traces(gc__errlist *L, const gc_heatrel_traces *tr, int strokes)
{
    if (!tr || !tr->angle_deg || !tr->P_Pa || tr->n_cycles < 1 ||
        tr->n_cycles > GC_HEATREL_MAX_CYCLES || tr->n_samples < GC_HEATREL_MIN_SAMPLES ||
        tr->n_samples > GC_HEATREL_MAX_SAMPLES ||
        (long)tr->n_cycles * tr->n_samples > GC_HEATREL_MAX_VALUES) {
        gc__errlist_add(L, GC_ERR_INVALID, "/trace", "must hold 1 to %d cycles of %d to %d "
                        "samples (at most %d values)", GC_HEATREL_MAX_CYCLES,
                        GC_HEATREL_MIN_SAMPLES, GC_HEATREL_MAX_SAMPLES, GC_HEATREL_MAX_VALUES);
        return;
    }
    int n = tr->n_samples;
    double gap = GC_HEATREL_GAP_DEG;
    for (int i = 0; i < n; i++) {
        if (!isfinite(tr->angle_deg[i]) || (i > 0 && !(tr->angle_deg[i] > tr->angle_deg[i - 1]))) {
            gc__errlist_add(L, GC_ERR_INVALID, "/trace", "crank angle %d (%.10g) must be finite "
                            "and above the one before it", i + 1, tr->angle_deg[i]);
            return;
        }
        if (i > 0 && tr->angle_deg[i] - tr->angle_deg[i - 1] > gap)
            gap = tr->angle_deg[i] - tr->angle_deg[i - 1];
    }
    for (size_t j = 0; j < (size_t)n * (size_t)tr->n_cycles; j++)
        if (!isfinite(tr->P_Pa[j])) {
            gc__errlist_add(L, GC_ERR_INVALID, "/trace", "cycle %zu, sample %zu: the pressure "
                            "must be a finite number", j / (size_t)n + 1, j % (size_t)n + 1);
            return;
        }
    double period = strokes == 2 ? 360.0 : 720.0;
    double span = tr->angle_deg[n - 1] - tr->angle_deg[0];
    if (!(span < period) || span < period - gap)
        gc__errlist_add(L, GC_ERR_INVALID, "/trace", "the crank angles span %.6g degrees; one "
                        "cycle of %.0f degrees (%d-stroke) is needed, the last sample before "
                        "the first one of the next cycle and short of it by at most the longest "
                        "step or %.0f degrees", span, period, strokes, GC_HEATREL_GAP_DEG);
}

/* A window [w0, w1] of deg aTDC inside [lo, hi] holding at least min_samples
 * samples of the recording (counted on an evenly spaced estimate). */
static void check_window(gc__errlist *L, const double w[2], double lo, double hi,
                         double step, int min_samples, const char *field)
{
    if (!(isfinite(w[0]) && isfinite(w[1]) && w[0] < w[1] && w[0] >= lo && w[1] <= hi)) {
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be two crank angles (deg from firing "
                        "TDC), the first below the second, within %g..%g", lo, hi);
        return;
    }
    if ((w[1] - w[0]) / step + 1.0 < min_samples)
        gc__errlist_add(L, GC_ERR_INVALID, field, "spans %g deg: too few samples (at least %d "
                        "at the recording's step of %.4g deg)", w[1] - w[0], min_samples, step);
}

static void check_pegging(gc__errlist *L, const gc_heatrel_input *in, double half, double step)
{
    if (in->peg_method == GC_HEATREL_PEG_NONE)
        return;
    if (in->peg_method == GC_HEATREL_PEG_INTAKE) {
        if (!finite_pos(in->peg_intake_pressure_Pa))
            gc__errlist_add(L, GC_ERR_INVALID, "/pegging/intake_pressure",
                            "must be a positive absolute pressure");
        check_window(L, in->peg_window_deg, -half, half, step, 1, "/pegging/window");
        return;
    }
    if (in->peg_method != GC_HEATREL_PEG_TWO_POINT && in->peg_method != GC_HEATREL_PEG_POLYTROPIC) {
        gc__errlist_add(L, GC_ERR_INVALID, "/pegging/method", "must be none, intake, two_point "
                        "or polytropic");
        return;
    }
    if (!(isfinite(in->peg_exponent) && in->peg_exponent > 1.0 && in->peg_exponent <= 1.7))
        gc__errlist_add(L, GC_ERR_INVALID, "/pegging/exponent", "must be greater than 1 and at "
                        "most 1.7");
}

static void check_phasing(gc__errlist *L, const gc_heatrel_input *in, double step)
{
    if (in->phasing_method == GC_HEATREL_PHASING_NONE)
        return;
    if (in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE) {
        if (!(isfinite(in->loss_angle_deg) && in->loss_angle_deg >= 0.0 &&
              in->loss_angle_deg <= 3.0))
            gc__errlist_add(L, GC_ERR_INVALID, "/phasing/loss_angle", "must be from 0 to 3 deg");
        if (step > 2.0)
            gc__errlist_add(L, GC_ERR_INVALID, "/phasing/method", "the loss-angle test needs "
                            "a crank-angle step of 2 deg or less, the recording has %.4g", step);
        return;
    }
    if (in->phasing_method != GC_HEATREL_PHASING_POLYTROPIC) {
        gc__errlist_add(L, GC_ERR_INVALID, "/phasing/method", "must be none, loss_angle or "
                        "polytropic");
        return;
    }
    check_window(L, in->phasing_window_deg, -180.0 + GC_HEATREL_PHASING_MAX_DEG,
                 -GC_HEATREL_PHASING_MAX_DEG, step, 5, "/phasing/window");
}

/* The gases, the trapped mass and the closed part. */
static void check_gas(gc__errlist *L, const gc_heatrel_input *in, double step)
{
    const gc_gas *u = &in->gas_unburned;
    if (!(u->R_J_per_kgK > 0.0 && u->T_max_K > u->T_min_K))
        gc__errlist_add(L, GC_ERR_INVALID, "/gas", "must be an initialised gas model");
    if (in->has_burned_gas && !(in->gas_burned.R_J_per_kgK > 0.0 &&
                                in->gas_burned.T_max_K > in->gas_burned.T_min_K))
        gc__errlist_add(L, GC_ERR_INVALID, "/burned_gas", "must be an initialised gas model");
    if (!(isfinite(in->trapped_mass_kg) && in->trapped_mass_kg >= 0.0))
        gc__errlist_add(L, GC_ERR_INVALID, "/trapped_mass", "must be a positive mass, or 0 to "
                        "derive it from the temperature at IVC");
    else if (in->trapped_mass_kg == 0.0 &&
             !(isfinite(in->T_ivc_K) && in->T_ivc_K >= 150.0 && in->T_ivc_K <= 1000.0))
        gc__errlist_add(L, GC_ERR_RANGE, "/ivc_temperature", "must lie between 150 and 1000 K "
                        "(the trapped mass is p V / (R T) at IVC)");
    double w[2] = { in->ivc_deg, in->evo_deg };
    check_window(L, w, -180.0, 180.0, step, 20, "/closed_part");
    check_window(L, in->compression_window_deg, fmax(-180.0, in->ivc_deg), 0.0, step, 3,
                 "/compression_window");
    check_window(L, in->expansion_window_deg, 0.0, fmin(180.0, in->evo_deg), step, 3,
                 "/expansion_window");
}

static void check_wall_fuel(gc__errlist *L, const gc_heatrel_input *in)
{
    if (!(isfinite(in->speed_rev_s) && in->speed_rev_s >= 0.0 && in->speed_rev_s <= 1000.0))
        gc__errlist_add(L, GC_ERR_INVALID, "/speed", "must be from 0 (not given) to 1000 rev/s");
    if (in->wall_model != GC_HEATREL_WALL_NONE) {
        if (in->wall_model != GC_HEATREL_WALL_WOSCHNI && in->wall_model != GC_HEATREL_WALL_HOHENBERG)
            gc__errlist_add(L, GC_ERR_INVALID, "/heat_transfer/model", "must be none, woschni or "
                            "hohenberg");
        else if (!(in->speed_rev_s > 0.0))
            gc__errlist_add(L, GC_ERR_INVALID, "/speed", "is needed by the wall heat-transfer "
                            "model (the mean piston speed)");
        if (!(isfinite(in->T_wall_K) && in->T_wall_K >= 250.0 && in->T_wall_K <= 1000.0))
            gc__errlist_add(L, GC_ERR_RANGE, "/heat_transfer/wall_temperature", "must lie "
                            "between 250 and 1000 K");
        if (!(in->motored_exponent == 0.0 ||
              (in->motored_exponent > 1.0 && in->motored_exponent < 1.7)))
            gc__errlist_add(L, GC_ERR_INVALID, "/heat_transfer/motored_exponent", "must be 0 "
                            "(fitted) or between 1 and 1.7");
    }
    if (in->n_extra_points < 0 || in->n_extra_points > GC_HEATREL_MAX_EXTRA_POINTS)
        gc__errlist_add(L, GC_ERR_INVALID, "/burn_fractions", "at most %d fractions beyond "
                        "10, 50 and 90 %%", GC_HEATREL_MAX_EXTRA_POINTS);
    else
        for (int k = 0; k < in->n_extra_points; k++)
            if (!(in->extra_points[k] > 0.0 && in->extra_points[k] < 1.0)) {
                char f[GC_ERROR_FIELD_LEN];
                snprintf(f, sizeof f, "/burn_fractions/%d", k);
                gc__errlist_add(L, GC_ERR_INVALID, f, "must be a fraction between 0 and 1");
            }
    int has_m = in->fuel_per_cycle_kg != 0.0, has_lhv = in->fuel_heating_value_J_per_kg != 0.0;
    if (!(isfinite(in->fuel_per_cycle_kg) && in->fuel_per_cycle_kg >= 0.0) || (has_lhv && !has_m))
        gc__errlist_add(L, GC_ERR_INVALID, "/fuel_per_cycle", "must be a positive mass (and is "
                        "needed with the heating value)");
    if (!(isfinite(in->fuel_heating_value_J_per_kg) && in->fuel_heating_value_J_per_kg >= 0.0 &&
          in->fuel_heating_value_J_per_kg <= 1.5e8) || (has_m && !has_lhv))
        gc__errlist_add(L, GC_ERR_INVALID, "/fuel_heating_value", "must be a heating value up "
                        "to 150 MJ/kg (and is needed with the fuel per cycle)");
}

int gc_heatrel_validate(const gc_heatrel_input *in, const gc_heatrel_traces *tr, gc_error *errs,
                        int max_errors, int *n_errors)
{
    gc__errlist L = { errs, max_errors, 0, GC_OK };
    check_geometry(&L, &in->geometry);
    if (in->strokes != 2 && in->strokes != 4)
        gc__errlist_add(&L, GC_ERR_INVALID, "/strokes_per_cycle", "must be 2 or 4");
    if (!isfinite(in->tdc_angle_deg) || fabs(in->tdc_angle_deg) > 7200.0)
        gc__errlist_add(&L, GC_ERR_INVALID, "/tdc_angle", "must be a finite angle within "
                        "+-7200 deg");
    int nerr_before = L.n;
    check_traces(&L, tr, in->strokes == 2 ? 2 : 4);
    double step = 720.0;
    if (L.n == nerr_before)
        step = (tr->angle_deg[tr->n_samples - 1] - tr->angle_deg[0]) / (tr->n_samples - 1);
    double half = in->strokes == 2 ? 180.0 : 360.0;
    check_pegging(&L, in, half, step);
    check_phasing(&L, in, step);
    check_gas(&L, in, step);
    check_wall_fuel(&L, in);
    return gc__errlist_finish(&L, n_errors);
}

/* ---- the analysis ------------------------------------------------------------------------ */

/* Everything one analysis allocates besides the result. */
typedef struct hr_run {
    gc__hr_axis ax;
    gc__hr_work w;
    double *ens;              /* n, ensemble-average pressure */
    double *scratch;          /* max(n, n_cycles) */
    double *block;            /* the work arrays' single allocation */
} hr_run;

static void run_free(hr_run *run)
{
    gc__hr_axis_free(&run->ax);
    free(run->block);
    memset(run, 0, sizeof *run);
}

static int run_alloc(hr_run *run, int n, int n_cycles)
{
    size_t m = (size_t)(n > n_cycles ? n : n_cycles);
    run->block = calloc(9 * (size_t)n + m, sizeof(double));
    if (run->block == NULL)
        return GC_ERR_NOMEM;
    double *b = run->block;
    double **arr[] = { &run->w.p, &run->w.T, &run->w.k, &run->w.x, &run->w.Qn, &run->w.Qw,
                       &run->w.Qb, &run->ens };
    for (size_t i = 0; i < sizeof arr / sizeof arr[0]; i++, b += n)
        *arr[i] = b;
    b += n;                   /* one spare array of n */
    run->scratch = b;
    return GC_OK;
}

/* Raw signal of cycle c on the axis plus offset into p. */
static void cycle_on_axis(const gc_heatrel_traces *tr, const gc__hr_axis *ax, int c,
                          double offset, double *p)
{
    const double *P = tr->P_Pa + (size_t)c * (size_t)tr->n_samples;
    int n = ax->n, first = n - ax->rot;
    for (int i = 0; i < first; i++)
        p[i] = P[ax->rot + i] + offset;
    for (int i = first; i < n; i++)
        p[i] = P[i - first] + offset;
}

/* Samples of the axis in [a, b] deg. */
static int count_in(const gc__hr_axis *ax, double a, double b)
{
    int i0 = gc__hr_first_at_or_after(ax, a), i1 = gc__hr_last_at_or_before(ax, b);
    return (i0 < 0 || i1 < i0) ? 0 : i1 - i0 + 1;
}

/* The windows hold enough samples of the actual axis (validation estimated
 * them from the mean step; an uneven recording may hold fewer). */
static int check_axis(const gc_heatrel_input *in, const gc__hr_axis *ax, gc_error *err)
{
    struct { double a, b; int min; const char *field; int on; } w[] = {
        { in->ivc_deg, in->evo_deg, 20, "/closed_part", 1 },
        { in->compression_window_deg[0], in->compression_window_deg[1], 3,
          "/compression_window", 1 },
        { in->expansion_window_deg[0], in->expansion_window_deg[1], 3, "/expansion_window", 1 },
        { in->peg_window_deg[0], in->peg_window_deg[1], 1, "/pegging/window",
          in->peg_method == GC_HEATREL_PEG_INTAKE },
        { in->phasing_window_deg[0], in->phasing_window_deg[1], 5, "/phasing/window",
          in->phasing_method == GC_HEATREL_PHASING_POLYTROPIC },
        { -30.0, 30.0, 3, "/phasing/method", in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE },
    };
    for (size_t k = 0; k < sizeof w / sizeof w[0]; k++) {
        int n = count_in(ax, w[k].a, w[k].b);
        if (w[k].on && n < w[k].min)
            return gc_error_set(err, GC_ERR_INVALID, w[k].field, "%.6g..%.6g deg aTDC holds %d "
                                "sample(s) of the recording; at least %d are needed", w[k].a,
                                w[k].b, n, w[k].min);
    }
    return GC_OK;
}

/* Axis, pegging offsets (into r->cycles) and the ensemble average, with the
 * check that every pegged pressure is positive. */
static int axis_peg_ensemble(const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                             double tdc, hr_run *run, gc_heatrel_result *r, gc_error *err)
{
    gc__hr_axis_free(&run->ax);
    int rc = gc__hr_axis_build(&run->ax, in, tr, tdc, err);
    if (rc == GC_OK)
        rc = check_axis(in, &run->ax, err);
    if (rc != GC_OK)
        return rc;
    int n = run->ax.n;
    memset(run->ens, 0, (size_t)n * sizeof *run->ens);
    for (int c = 0; c < tr->n_cycles; c++) {
        cycle_on_axis(tr, &run->ax, c, 0.0, run->w.p);
        double off = gc__hr_peg_offset(in, &run->ax, run->w.p);
        r->cycles[c].peg_offset_Pa = off;
        for (int i = 0; i < n; i++) {
            double p = run->w.p[i] + off;
            if (!(p > 0.0) || !isfinite(p)) {
                const char *lb = tr->label ? tr->label[c] : "";
                return gc_error_set(err, GC_ERR_INVALID, "/trace", "cycle %d%s%s%s at %.6g deg "
                                    "aTDC: the %spressure is %.6g Pa, not positive", c + 1,
                                    lb[0] ? " ('" : "", lb, lb[0] ? "')" : "", run->ax.th[i],
                                    in->peg_method ? "pegged " : "", p);
            }
            run->ens[i] += p;
        }
    }
    for (int i = 0; i < n; i++)
        run->ens[i] /= tr->n_cycles;
    return GC_OK;
}

static void warn_phasing(const gc_heatrel_input *in, gc_heatrel_result *r)
{
    double s = r->phasing_shift_deg;
    if (fabs(s) <= GC_HEATREL_PHASING_WARN_DEG)
        return;
    const char *hint = (in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE && fabs(s) > 3.0)
                       ? " (the loss-angle test needs a motored recording)" : "";
    gc__hr_warn(r, "/tdc_angle", "phasing_error", "the %s test puts true TDC %+.2f deg from the "
                "stated one (%.6g deg on the recording's axis), beyond %.2f deg; IMEP and heat "
                "release depend on it%s", in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE ?
                "loss-angle" : "polytropic", s, in->tdc_angle_deg, GC_HEATREL_PHASING_WARN_DEG,
                hint);
}

/* Phasing check and, when asked, the corrected axis. */
static int phasing(const gc_heatrel_input *in, const gc_heatrel_traces *tr, hr_run *run,
                   gc_heatrel_result *r, gc_error *err)
{
    if (in->phasing_method == GC_HEATREL_PHASING_NONE)
        return GC_OK;
    int rc = gc__hr_phasing(in, &run->ax, run->ens, r, err);
    if (rc != GC_OK)
        return rc;
    warn_phasing(in, r);
    if (!in->phasing_correct)
        return GC_OK;
    double tdc = in->tdc_angle_deg + r->phasing_shift_deg;
    gc__hr_warn(r, "/tdc_angle", "phasing_corrected", "TDC moved from %.6g to %.6g deg on the "
                "recording's axis by the %+.4f deg the phasing test found", in->tdc_angle_deg,
                tdc, r->phasing_shift_deg);
    r->phasing_corrected = 1;
    r->tdc_angle_deg = tdc;
    return axis_peg_ensemble(in, tr, tdc, run, r, err);
}

/* Central-difference rate of a cumulative curve over the closed part. */
static void rate(const double *th, const double *Q, int a, int b, double *out)
{
    for (int i = a; i <= b; i++) {
        int i0 = i > a ? i - 1 : i, i1 = i < b ? i + 1 : i;
        out[i - a] = (Q[i1] - Q[i0]) / (th[i1] - th[i0]);
    }
}

static int keep_curves(const hr_run *run, gc_heatrel_result *r)
{
    gc_heatrel_curves *cv = &r->curves;
    const gc__hr_axis *ax = &run->ax;
    const gc__hr_work *w = &run->w;
    int n = ax->n, a = ax->i_ivc, b = ax->i_evo, nc = b - a + 1;
    double **whole[] = { &cv->angle_deg, &cv->P_Pa, &cv->V_m3 };
    double **closed[] = { &cv->T_K, &cv->dQn_J_per_deg, &cv->Qn_J, &cv->dQg_J_per_deg,
                          &cv->Qg_J, &cv->mfb };
    for (int k = 0; k < 3; k++)
        if ((*whole[k] = malloc((size_t)n * sizeof(double))) == NULL)
            return GC_ERR_NOMEM;
    for (int k = 0; k < 6; k++)
        if ((*closed[k] = malloc((size_t)nc * sizeof(double))) == NULL)
            return GC_ERR_NOMEM;
    cv->n = n;
    cv->i_ivc = a;
    cv->n_closed = nc;
    memcpy(cv->angle_deg, ax->th, (size_t)n * sizeof(double));
    memcpy(cv->P_Pa, w->p, (size_t)n * sizeof(double));
    memcpy(cv->V_m3, ax->V, (size_t)n * sizeof(double));
    memcpy(cv->T_K, w->T + a, (size_t)nc * sizeof(double));
    memcpy(cv->Qn_J, w->Qn + a, (size_t)nc * sizeof(double));
    memcpy(cv->Qg_J, w->Qb + a, (size_t)nc * sizeof(double));
    memcpy(cv->mfb, w->x + a, (size_t)nc * sizeof(double));
    rate(ax->th, w->Qn, a, b, cv->dQn_J_per_deg);
    rate(ax->th, w->Qb, a, b, cv->dQg_J_per_deg);
    return GC_OK;
}

/* ---- flags, statistics, warnings ---------------------------------------------------------- */

enum { SEL_ALL, SEL_BURNED, SEL_RINGING, SEL_EFFICIENCY };

static int selected(const gc_heatrel_cycle *c, int sel)
{
    int burned = !(c->flags & (GC_HEATREL_FLAG_MISFIRE | GC_HEATREL_FLAG_NO_BURN));
    switch (sel) {
    case SEL_BURNED:
        return burned;
    case SEL_RINGING:
        return burned && c->has_ringing;
    case SEL_EFFICIENCY:
        return c->has_efficiency;
    default:
        return 1;
    }
}

/* Statistics of the double at byte offset off of the selected cycles; the
 * indices of min and max are cycle indices. */
static void stat_of(const gc_heatrel_result *r, size_t off, int sel, double *x, int *idx,
                    gc_heatrel_stat *s)
{
    int k = 0;
    for (int c = 0; c < r->n_cycles; c++)
        if (selected(&r->cycles[c], sel)) {
            memcpy(&x[k], (const char *)&r->cycles[c] + off, sizeof(double));
            idx[k++] = c;
        }
    gc_heatrel_stats(x, k, s);
    if (k > 0) {
        s->i_min = idx[s->i_min];
        s->i_max = idx[s->i_max];
    }
}

#define OFF(field) offsetof(gc_heatrel_cycle, field)

static void statistics(gc_heatrel_result *r, double *x, int *idx)
{
    stat_of(r, OFF(peg_offset_Pa), SEL_ALL, x, idx, &r->peg_offset);
    stat_of(r, OFF(imep_gross_Pa), SEL_ALL, x, idx, &r->imep_gross);
    stat_of(r, OFF(imep_net_Pa), SEL_ALL, x, idx, &r->imep_net);
    stat_of(r, OFF(pmep_Pa), SEL_ALL, x, idx, &r->pmep);
    stat_of(r, OFF(P_max_Pa), SEL_ALL, x, idx, &r->P_max);
    stat_of(r, OFF(angle_P_max_deg), SEL_ALL, x, idx, &r->angle_P_max);
    stat_of(r, OFF(dP_max_Pa_per_deg), SEL_ALL, x, idx, &r->dP_max);
    stat_of(r, OFF(n_compression), SEL_ALL, x, idx, &r->n_compression);
    stat_of(r, OFF(n_expansion), SEL_ALL, x, idx, &r->n_expansion);
    stat_of(r, OFF(T_max_K), SEL_ALL, x, idx, &r->T_max);
    stat_of(r, OFF(Q_total_J), SEL_ALL, x, idx, &r->Q_total);
    for (int k = 0; k < r->n_points; k++)
        stat_of(r, OFF(point_deg) + (size_t)k * sizeof(double), SEL_BURNED, x, idx,
                &r->point[k]);
    stat_of(r, OFF(burn_0_10_deg), SEL_BURNED, x, idx, &r->burn_0_10);
    stat_of(r, OFF(burn_10_90_deg), SEL_BURNED, x, idx, &r->burn_10_90);
    stat_of(r, OFF(ringing_W_per_m2), SEL_RINGING, x, idx, &r->ringing);
    stat_of(r, OFF(combustion_efficiency), SEL_EFFICIENCY, x, idx, &r->combustion_efficiency);
}

/* Misfire and partial-burn flags against the median total heat release. */
static void flags(gc_heatrel_result *r, double *x, double *scratch)
{
    for (int c = 0; c < r->n_cycles; c++)
        x[c] = r->cycles[c].Q_total_J;
    r->Q_total_median_J = gc__hr_median(x, r->n_cycles, scratch);
    double med = r->Q_total_median_J;
    if (!(med > 0.0))
        return;
    for (int c = 0; c < r->n_cycles; c++) {
        gc_heatrel_cycle *cy = &r->cycles[c];
        if ((cy->flags & GC_HEATREL_FLAG_NO_BURN) || cy->Q_total_J < GC_HEATREL_MISFIRE_FRACTION * med) {
            cy->flags |= GC_HEATREL_FLAG_MISFIRE;
            r->n_misfire++;
        } else if (cy->Q_total_J < GC_HEATREL_PARTIAL_FRACTION * med) {
            cy->flags |= GC_HEATREL_FLAG_PARTIAL;
            r->n_partial++;
        }
    }
}

/* "3, 17, 200" (1-based) of the cycles with a flag, the first few. */
static void cycle_list(const gc_heatrel_result *r, unsigned flag, char *buf, size_t len)
{
    size_t used = 0;
    int shown = 0, total = 0;
    buf[0] = '\0';
    for (int c = 0; c < r->n_cycles; c++) {
        if (!(r->cycles[c].flags & flag))
            continue;
        total++;
        if (shown < 12 && used < len) {
            int w = snprintf(buf + used, len - used, "%s%d", shown ? ", " : "", c + 1);
            used += w > 0 ? (size_t)w : 0;
            shown++;
        }
    }
    if (total > shown && used < len)
        snprintf(buf + used, len - used, ", ...");
}

static void warn_cycles(gc_heatrel_result *r)
{
    char list[96];
    int n_t = 0, n_eoc = 0, n_mn = 0;
    for (int c = 0; c < r->n_cycles; c++) {
        n_t += (r->cycles[c].flags & GC_HEATREL_FLAG_T_RANGE) != 0;
        n_mn += (r->cycles[c].flags & GC_HEATREL_FLAG_MOTORED_N) != 0;
        n_eoc += !(r->cycles[c].flags & GC_HEATREL_FLAG_NO_BURN) &&
                 r->cycles[c].eoc_deg >= r->curves.angle_deg[r->curves.i_ivc + r->curves.n_closed - 1];
    }
    if (!(r->Q_total_median_J > 0.0))
        gc__hr_warn(r, "/trace", "no_combustion", "the median cycle releases no heat (%.4g J): "
                    "no misfire or partial-burn flags", r->Q_total_median_J);
    if (r->n_misfire) {
        cycle_list(r, GC_HEATREL_FLAG_MISFIRE, list, sizeof list);
        gc__hr_warn(r, "/trace", "misfire", "%d of %d cycles released less than %.0f %% of the "
                    "median heat release (%.4g J): cycles %s", r->n_misfire, r->n_cycles,
                    100.0 * GC_HEATREL_MISFIRE_FRACTION, r->Q_total_median_J, list);
    }
    if (r->n_partial) {
        cycle_list(r, GC_HEATREL_FLAG_PARTIAL, list, sizeof list);
        gc__hr_warn(r, "/trace", "partial_burn", "%d of %d cycles released %.0f to %.0f %% of "
                    "the median heat release: cycles %s", r->n_partial, r->n_cycles,
                    100.0 * GC_HEATREL_MISFIRE_FRACTION, 100.0 * GC_HEATREL_PARTIAL_FRACTION, list);
    }
    if (n_t)
        gc__hr_warn(r, "/ivc_temperature", "temperature_range", "in %d cycle(s) the mean gas "
                    "temperature left the gas data's range; k was taken at the range's end "
                    "there (check pegging and the temperature at IVC)", n_t);
    if (n_mn) {
        cycle_list(r, GC_HEATREL_FLAG_MOTORED_N, list, sizeof list);
        gc__hr_warn(r, "/heat_transfer/motored_exponent", "motored_exponent_default", "in %d "
                    "cycle(s) the fitted compression exponent fell outside 1..1.7; Woschni's "
                    "motored pressure used %.2f instead: cycles %s", n_mn,
                    GC_HEATREL_PEG_EXPONENT_DEFAULT, list);
    }
    if (n_eoc)
        gc__hr_warn(r, "/closed_part", "burn_beyond_closed_part", "in %d cycle(s) the heat "
                    "release still rises at the end of the closed part (%.6g deg): the burn "
                    "points may be early", n_eoc, r->curves.angle_deg[r->curves.i_ivc +
                                                                     r->curves.n_closed - 1]);
}

static void warn_results(const gc_heatrel_input *in, gc_heatrel_result *r)
{
    if (in->phasing_method == GC_HEATREL_PHASING_LOSS_ANGLE)
        gc__hr_warn(r, "/phasing/method", "motored_recording", "the loss-angle test treats the "
                    "recording as motored: its burn points describe heat loss, not combustion");
    if (in->speed_rev_s == 0.0)
        gc__hr_warn(r, "/speed", "no_ringing", "ringing intensity needs the engine speed");
    if (r->combustion_efficiency.n > 0 && r->combustion_efficiency.max > 1.0)
        gc__hr_warn(r, "/fuel_per_cycle", "combustion_efficiency_above_one", "the heat release "
                    "exceeds the fuel's energy in %s (highest %.4f): check the fuel mass, the "
                    "heating value, pegging and the trapped gas",
                    r->combustion_efficiency.mean > 1.0 ? "the mean" : "some cycles",
                    r->combustion_efficiency.max);
}

/* ---- entry points ----------------------------------------------------------------------------- */

static void result_init(const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                        gc_heatrel_result *r)
{
    static const double base[3] = { 0.1, 0.5, 0.9 };
    r->n_cycles = tr->n_cycles;
    r->n_samples = tr->n_samples;
    r->period_deg = in->strokes == 4 ? 720.0 : 360.0;
    r->tdc_angle_deg = in->tdc_angle_deg;
    r->displacement_m3 = gc_measured_displacement(&in->geometry);
    r->clearance_m3 = gc_measured_clearance(&in->geometry);
    r->mfb_basis_gross = in->wall_model != GC_HEATREL_WALL_NONE;
    r->n_points = 3 + in->n_extra_points;
    for (int k = 0; k < r->n_points; k++)
        r->point_fraction[k] = k < 3 ? base[k] : in->extra_points[k - 3];
    r->peg_method = in->peg_method;
    r->phasing_method = in->phasing_method;
}

static int analyse(const gc_heatrel_input *in, const gc_heatrel_traces *tr, hr_run *run,
                   gc_heatrel_result *r, gc_error *err)
{
    int rc = axis_peg_ensemble(in, tr, in->tdc_angle_deg, run, r, err);
    if (rc == GC_OK)
        rc = phasing(in, tr, run, r, err);
    if (rc != GC_OK)
        return rc;
    for (int c = 0; c < tr->n_cycles; c++) {
        cycle_on_axis(tr, &run->ax, c, r->cycles[c].peg_offset_Pa, run->w.p);
        gc__hr_reduce_cycle(in, &run->ax, &run->w, r->n_points, r->point_fraction, &r->cycles[c]);
    }
    memcpy(run->w.p, run->ens, (size_t)run->ax.n * sizeof(double));
    double off = 0.0;
    for (int c = 0; c < tr->n_cycles; c++)
        off += r->cycles[c].peg_offset_Pa;
    r->ensemble.peg_offset_Pa = off / tr->n_cycles;  /* the ensemble of pegged cycles */
    gc__hr_reduce_cycle(in, &run->ax, &run->w, r->n_points, r->point_fraction, &r->ensemble);
    r->trapped_mass_kg = r->ensemble.trapped_mass_kg;
    if (keep_curves(run, r) != GC_OK)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the ensemble curves");
    int *idx = malloc((size_t)tr->n_cycles * sizeof *idx);
    if (idx == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the statistics");
    double *xs = malloc((size_t)tr->n_cycles * sizeof *xs);
    if (xs == NULL) {
        free(idx);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the statistics");
    }
    flags(r, xs, run->scratch);
    statistics(r, xs, idx);
    free(xs);
    free(idx);
    warn_cycles(r);
    warn_results(in, r);
    return GC_OK;
}

int gc_heatrel_analyse(const gc_heatrel_input *in, const gc_heatrel_traces *tr,
                       gc_heatrel_result *r, gc_error *err)
{
    memset(r, 0, sizeof *r);
    gc_error first;
    int nerr = 0;
    if (gc_heatrel_validate(in, tr, &first, 1, &nerr) != GC_OK) {
        if (err)
            *err = first;
        return first.code;
    }
    result_init(in, tr, r);
    r->cycles = calloc((size_t)tr->n_cycles, sizeof *r->cycles);
    hr_run run;
    memset(&run, 0, sizeof run);
    if (r->cycles == NULL || run_alloc(&run, tr->n_samples, tr->n_cycles) != GC_OK) {
        run_free(&run);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the analysis");
    }
    int rc = analyse(in, tr, &run, r, err);
    run_free(&run);
    return rc;
}

void gc_heatrel_result_free(gc_heatrel_result *r)
{
    if (r == NULL)
        return;
    gc_heatrel_curves *cv = &r->curves;
    double *arrs[] = { cv->angle_deg, cv->P_Pa, cv->V_m3, cv->T_K, cv->dQn_J_per_deg, cv->Qn_J,
                       cv->dQg_J_per_deg, cv->Qg_J, cv->mfb };
    for (size_t k = 0; k < sizeof arrs / sizeof arrs[0]; k++)
        free(arrs[k]);
    free(r->cycles);
    memset(cv, 0, sizeof *cv);
    r->cycles = NULL;
}
