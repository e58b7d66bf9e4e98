/*
 * cycle.c — the cycle engine declared in gascycle/cycle.h: evaluates an
 * ordered chain of processes in the closed or the steady-flow frame with any
 * gas model of gas.h, iterates heat exchangers between stations to
 * convergence, books work, heat, entropy generation and exergy per process,
 * sums the cycle up, evaluates the ideal counterpart and runs the built-in
 * checks. This file builds chains, runs them and names the states; the
 * steps by kind, the checks before a run and the sums after it live in the
 * files cycle_internal.h lists (the area checks in path.c).
 *
 * Models (ideal gas, any cp(T)):
 *   isentrope          s0(T2) - s0(T1) = R ln(P2/P1)   (gas.h solvers)
 *   isentropic eff.    compression f2 = f1 + (f2s - f1)/eta, expansion
 *                      f2 = f1 - eta (f1 - f2s), f = u (closed) or h (flow)
 *   polytropic eff.    flow: dh = v dP / eta_p (compression), dh = eta_p v dP
 *                      (expansion), i.e. s0(T2) - s0(T1) = (R/a) ln(P2/P1) with
 *                      a = eta_p or 1/eta_p; closed: du = -P dv / eta_p or
 *                      du = -eta_p P dv, i.e. phi(T2) - phi(T1) = -(R/a) ln(v2/v1)
 *                      with phi = s0 - R ln T (the integral of cv dT / T)
 *   polytrope          P v^n = const: T2/T1 = (P2/P1)^((n-1)/n),
 *                      closed w = R (T2 - T1)/(1 - n), flow w = n R (T2 - T1)/(1 - n)
 *   throttle           ideal gas at constant h: constant T
 * These are the standard ideal-gas relations of engineering thermodynamics;
 * the polytropic-efficiency forms integrate the small-stage definition
 * exactly with variable cp.
 *
 * Dissipated work (the term that makes the area balance of an irreversible
 * cycle): along the drawn curve of constant polytropic efficiency the gas is
 * adiabatic, so T ds = T ds_gen = (1 - a) cp dT (flow) or (1 - a) cv dT
 * (closed), integrating to (1 - a) dh or (1 - a) du exactly; a throttle
 * dissipates R T ln(P1/P2); a heat exchange with pressure loss along the
 * curve linear in T and ln P dissipates -R ln(P2/P1) (T1 + T2)/2.
 *
 * Books with a fuel (cycle.h): states carry absolute and sensible enthalpy;
 * a fuel step books m_fuel LHV (298.15 K) as heat in and the burner loss as
 * heat out, its entropy change includes the fuel's own entropy (exergy.h),
 * and the close step rejects the exhaust's sensible enthalpy less the
 * intake's and the fuel's, so heat and exergy balances close on one
 * reference. The second law follows the exergy models of cycle.h; s_gen
 * rounding is reported as 0 (GC_CYCLE_TOL_SGEN). The ideal counterpart is
 * built by idealize() and evaluated by the same run_chain.
 */
#include "core/engine/cycle_internal.h"
#include "gascycle/strbuf.h"

#include <ctype.h>
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

/* ---- names ------------------------------------------------------------- */

static const char *const kind_names[GC_PROC_KIND_COUNT] = {
    "isentropic", "polytropic", "compression", "expansion", "constant_volume",
    "constant_pressure", "isothermal", "dual", "pressure_loss", "heat_exchange",
    "cooling", "fuel_addition", "close"};

static const char *const end_names[GC_END_KIND_COUNT] = {
    "default", "volume_ratio", "pressure_ratio", "temperature", "pressure", "heat",
    "peak_pressure", "start_temperature", "start_volume", "start_pressure", "velocity"};

static const char *const curve_names[] = {
    "polytropic_efficiency_flow", "polytropic_efficiency_closed", "polytrope",
    "isochore", "linear_T_lnP"};

const char *gc_cycle_kind_name(int kind)
{
    return (kind >= 0 && kind < GC_PROC_KIND_COUNT) ? kind_names[kind] : "unknown";
}

const char *gc_cycle_end_name(int end)
{
    return (end >= 0 && end < GC_END_KIND_COUNT) ? end_names[end] : "unknown";
}

const char *gc_cycle_curve_name(int curve)
{
    return (curve >= 0 && curve <= GC_CURVE_LINEAR) ? curve_names[curve] : "unknown";
}

/* ---- building ---------------------------------------------------------- */

void gc_cycle_init(gc_cycle *c, gc_frame frame, const gc_gas *gas,
                   double T_start_K, double P_start_Pa)
{
    c->frame = frame;
    c->gas = *gas;
    c->T_start_K = T_start_K;
    c->P_start_Pa = P_start_Pa;
    c->V_start_m_per_s = 0.0;
    c->T_dead_K = 0.0;
    c->P_dead_Pa = 0.0;
    c->flags = 0;
    c->start_station[0] = '\0';
    c->n_steps = 0;
    c->n_alias = 0;
}

int gc_cycle_add_alias(gc_cycle *c, const char *name, int step)
{
    if (c->n_alias >= GC_CYCLE_MAX_ALIASES || step < -1 || step >= c->n_steps)
        return -1;
    gc_cycle_alias *a = &c->alias[c->n_alias++];
    gc_text_copy(a->name, sizeof a->name, name);
    a->step = step;
    return 0;
}

gc_step *gc_cycle_add(gc_cycle *c, gc_process_kind kind, gc_end_kind end,
                      double value, const char *field)
{
    if (c->n_steps < 0 || c->n_steps >= GC_CYCLE_MAX_STEPS)
        return NULL;
    gc_step *s = &c->steps[c->n_steps++];
    memset(s, 0, sizeof *s);
    s->kind = kind;
    s->end = end;
    s->end_value = value;
    s->end2 = GC_END_DEFAULT;
    s->efficiency = 1.0;
    s->partner = -1;
    s->geometry = GC_GEOM_CONST_P;
    if (field)
        gc_text_copy(s->field, sizeof s->field, field);
    return s;
}

int gc_cycle_link_exchanger(gc_cycle *c, int i, int j, double eps,
                            gc_geometry geometry, const char *field)
{
    if (i < 0 || j < 0 || i >= c->n_steps || j >= c->n_steps || i == j)
        return GC_ERR_INVALID;
    gc_step *a = &c->steps[i], *b = &c->steps[j];
    a->kind = b->kind = GC_PROC_HEAT_EXCHANGE;
    a->partner = j;
    b->partner = i;
    a->efficiency = b->efficiency = eps;
    a->geometry = b->geometry = geometry;
    if (field) {
        gc_text_copy(a->field_aux, sizeof a->field_aux, field);
        gc_text_copy(b->field_aux, sizeof b->field_aux, field);
    }
    return GC_OK;
}

/* ---- one pass and the heat-exchanger iteration ----------------------------- */

/* Evaluates steps [from, to) of the chain, appending to the run. */
static int run_steps(ctx *x, int from, int to)
{
    const gc_cycle *c = x->c;
    for (int i = from; i < to; i++) {
        int rc;
        switch (c->steps[i].kind) {
        case GC_PROC_ISENTROPIC:
        case GC_PROC_COMPRESSION:
        case GC_PROC_EXPANSION: rc = gc__cycle_step_adiabatic(x, i); break;
        case GC_PROC_POLYTROPIC: rc = gc__cycle_step_polytropic(x, i); break;
        case GC_PROC_CONST_VOLUME: rc = gc__cycle_step_const_volume(x, i); break;
        case GC_PROC_CONST_PRESSURE:
        case GC_PROC_COOLING: rc = gc__cycle_step_const_pressure(x, i); break;
        case GC_PROC_ISOTHERMAL: rc = gc__cycle_step_isothermal(x, i); break;
        case GC_PROC_DUAL: rc = gc__cycle_step_dual(x, i); break;
        case GC_PROC_PRESSURE_LOSS: rc = gc__cycle_step_pressure_loss(x, i); break;
        case GC_PROC_HEAT_EXCHANGE: rc = gc__cycle_step_heat_exchange(x, i); break;
        case GC_PROC_FUEL: rc = gc__cycle_step_fuel(x, i); break;
        case GC_PROC_CLOSE: rc = gc__cycle_step_close(x, i); break;
        default: rc = gc_error_set(x->err, GC_ERR_UNKNOWN, gc__cycle_step_field(x, i), "unknown process kind");
        }
        if (rc != GC_OK)
            return rc;
    }
    return GC_OK;
}

/* Heat exchangers: the later side's inlet state is guessed, the chain is run,
 * and the guess is updated by a secant on its temperature until guess and
 * result agree. Only the steps from the first exchanger side to the last
 * second side depend on the guesses: the steps before them are evaluated
 * once, each pass re-evaluates that segment alone (ending with the second
 * sides, whose inlets are the results), and the steps after it are
 * evaluated once, after convergence, from the converged segment. A pass
 * count (regen_iterations) counts segment passes. */
static int iterate(ctx *x)
{
    gc_cycle_run *run = x->run;
    const int n = x->c->n_steps;
    run->n_states = 1;
    run->n_processes = 0;
    run->n_gases = 1;
    if (x->n_pairs == 0) {
        x->run->regen_iterations = 1;
        return run_steps(x, 0, n);
    }
    int seg_lo = n, seg_hi = 0;
    for (int k = 0; k < x->n_pairs; k++) {
        if (x->pairs[k].first < seg_lo)
            seg_lo = x->pairs[k].first;
        if (x->pairs[k].second > seg_hi)
            seg_hi = x->pairs[k].second;
    }
    int rc = run_steps(x, 0, seg_lo);
    if (rc != GC_OK)
        return rc;
    const int ns = run->n_states, np = run->n_processes, ng = run->n_gases;
    int passes = 0;
    for (;;) {
        run->n_states = ns;
        run->n_processes = np;
        run->n_gases = ng;
        rc = run_steps(x, seg_lo, seg_hi + 1);
        passes++;
        if (rc != GC_OK)
            return rc;
        int done = 1;
        for (int k = 0; k < x->n_pairs; k++) {
            hx_pair *p = &x->pairs[k];
            double f = p->T_actual - p->T_guess;
            /* converged: the guessed inlet agrees with the result in T and in
             * mass ratio, both to 1e-11 relative */
            if (p->T_guess > 0.0 && fabs(f) <= 1e-11 * p->T_actual &&
                fabs(p->m_actual - p->m_guess) <= 1e-11 * p->m_actual &&
                p->gas_actual == p->gas_guess)
                continue;
            done = 0;
            double Tn = p->T_actual, mn = p->m_actual;
            if (p->T_guess > 0.0 && p->have_prev && f != p->f_prev) {
                double Ts = p->T_guess - f * (p->T_guess - p->T_prev) / (f - p->f_prev);
                if (Ts > 0.0 && isfinite(Ts)) {
                    Tn = Ts;
                    /* the mass ratio the secant's guess will produce, from the
                     * same two passes (it follows the exchanger's heat) */
                    double ms = p->m_actual + (p->m_actual - p->m_prev) * (Ts - p->T_guess) /
                                                  (p->T_guess - p->T_prev);
                    if (p->T_guess != p->T_prev && ms > 0.0 && isfinite(ms))
                        mn = ms;
                }
            }
            /* the first pass runs the first side against its own inlet (no
             * heat moved): that is the point (T_first_in, T_actual) of the
             * same map, so the secant can start from it */
            double Tg = p->T_guess > 0.0 ? p->T_guess : p->T_first_in;
            if (Tg > 0.0) {
                p->T_prev = Tg;
                p->f_prev = p->T_actual - Tg;
                p->m_prev = p->m_actual;
                p->have_prev = 1;
            }
            p->T_guess = Tn;
            p->m_guess = mn;
            p->gas_guess = p->gas_actual;
        }
        if (done)
            break;
        if (passes >= 60)
            return gc_error_set(x->err, GC_ERR_NOCONV, gc__cycle_aux_field(x, x->pairs[0].first),
                                "the heat-exchanger iteration did not converge in %d passes",
                                passes);
    }
    x->run->regen_iterations = passes;
    return run_steps(x, seg_hi + 1, n);
}

/* Starts each heat exchanger's guess from the inlet of its second side in
 * the run `seed` of the same chain (the actual run, for the ideal one):
 * temperature, mass ratio and gas (copied, since the pass has not built it
 * yet when the first side needs it). Only a starting point: the iteration
 * converges from it as from any other. */
static void seed_pairs(ctx *x, const gc_cycle_run *seed)
{
    gc_cycle_run *run = x->run;
    for (int k = 0; k < x->n_pairs; k++) {
        hx_pair *p = &x->pairs[k];
        for (int q = 0; q < seed->n_processes; q++) {
            const gc_cycle_process *pr = &seed->processes[q];
            if (pr->step != p->second || pr->part != 0)
                continue;
            const gc_cycle_state *st = &seed->states[pr->from];
            if (st->gas < 0 || st->gas >= seed->n_gases || !(st->T_K > 0.0))
                break;
            p->T_guess = st->T_K;
            p->m_guess = st->mass_ratio;
            p->gas_guess = st->gas;
            run->gases[st->gas] = seed->gases[st->gas];
            x->href_ok[st->gas] = 0;
            break;
        }
    }
}

static int run_chain(const gc_cycle *c, double T_dead, double P_dead,
                     const gc_cycle_run *seed, gc_cycle_run *run, gc_error *err)
{
    ctx x;
    x.c = c;
    x.run = run;
    x.err = err;
    x.n_pairs = 0;
    memset(x.href_ok, 0, sizeof x.href_ok);
    int rc = gc__cycle_validate(&x);
    if (rc != GC_OK)
        return rc;
    for (int i = 0; i < c->n_steps; i++)
        x.pair_of_step[i] = -1;
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        if (s->kind == GC_PROC_HEAT_EXCHANGE && s->partner > i) {
            hx_pair *p = &x.pairs[x.n_pairs];
            memset(p, 0, sizeof *p);
            p->first = i;
            p->second = s->partner;
            x.pair_of_step[i] = x.pair_of_step[s->partner] = x.n_pairs;
            x.n_pairs++;
        }
    }
    double prod = 1.0;
    for (int i = c->n_steps - 1; i >= 0; i--) {
        x.loss_after[i] = prod;
        prod *= 1.0 - gc__cycle_step_loss(&x, &c->steps[i]);
    }
    run->frame = c->frame;
    run->gases[0] = c->gas;
    run->n_gases = 1;
    if (seed != NULL)
        seed_pairs(&x, seed);
    run->regen_iterations = 1;
    run->checks.close_rel = 0.0;
    rc = gc__cycle_fill_state(&x, &run->states[0], 0, c->T_start_K, c->P_start_Pa, c->V_start_m_per_s,
                    1.0, -1, "/intake_temperature");
    if (rc != GC_OK)
        return rc;
    rc = iterate(&x);
    if (rc != GC_OK)
        return rc;
    rc = gc__cycle_summarise(&x, T_dead, P_dead);
    if (rc != GC_OK)
        return rc;
    if (!(c->flags & GC_CYCLE_NO_AREAS))
        return gc_path_check_areas(run, err);
    return GC_OK;
}

int gc_cycle_run_chain(const gc_cycle *c, gc_cycle_run *run, gc_error *err)
{
    gc_error_clear(err);
    return run_chain(c, 0.0, 0.0, NULL, run, err);
}

/* 1 if the chain has anything an ideal counterpart changes. */
static int has_losses(const gc_cycle *c)
{
    for (int i = 0; i < c->n_steps; i++) {
        const gc_step *s = &c->steps[i];
        if ((s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION || s->kind == GC_PROC_FUEL) &&
            s->efficiency != 0.0 && s->efficiency != 1.0)
            return 1;
        if (s->kind == GC_PROC_HEAT_EXCHANGE && s->efficiency != 1.0)
            return 1;
        if (s->end_value_ideal > 0.0 && s->end_value_ideal != s->end_value)
            return 1;
        if (s->pressure_loss != 0.0)
            return 1;
        if (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE_RATIO && s->end_value != 1.0)
            return 1;
        if (s->kind == GC_PROC_PRESSURE_LOSS && s->end == GC_END_PRESSURE)
            return 1;
    }
    return 0;
}

/* Steps that change the pressure only by a fractional loss (or not at all). */
static int loss_only(const gc_step *s)
{
    switch (s->kind) {
    case GC_PROC_PRESSURE_LOSS:
    case GC_PROC_CONST_PRESSURE:
    case GC_PROC_COOLING:
    case GC_PROC_FUEL:
        return 1;
    case GC_PROC_HEAT_EXCHANGE:
        return s->geometry == GC_GEOM_CONST_P;
    default:
        return 0;
    }
}

/* The ideal's final expansion: the pressure-setting step before a
 * constant-pressure close, with only loss steps between them, ends at the
 * start pressure (the pressure the actual chain closed at, now without the
 * losses it covered). Done when a loss lies between them, or always with
 * force (the retry when the ideal would not close otherwise). */
static void ideal_tail(const gc_cycle *actual, gc_cycle *ideal, int force)
{
    for (int k = ideal->n_steps - 1; k > 0; k--) {
        gc_step *cl = &ideal->steps[k];
        if (cl->kind != GC_PROC_CLOSE || cl->geometry != GC_GEOM_CONST_P)
            continue;
        int j = k - 1, lossy = 0;
        while (j >= 0 && loss_only(&actual->steps[j])) {
            const gc_step *a = &actual->steps[j];
            lossy |= a->pressure_loss > 0.0 ||
                     (a->kind == GC_PROC_PRESSURE_LOSS && a->end == GC_END_PRESSURE_RATIO &&
                      a->end_value != 1.0);
            j--;
        }
        if (j < 0 || !(lossy || force))
            continue;
        gc_step *e = &ideal->steps[j];
        int sets_p = e->kind == GC_PROC_COMPRESSION || e->kind == GC_PROC_EXPANSION ||
                     e->kind == GC_PROC_ISENTROPIC || e->kind == GC_PROC_POLYTROPIC ||
                     e->kind == GC_PROC_ISOTHERMAL;
        int end_ok = e->end == GC_END_PRESSURE || e->end == GC_END_PRESSURE_RATIO ||
                     e->end == GC_END_TEMPERATURE || e->end == GC_END_START_TEMPERATURE ||
                     (e->end == GC_END_VOLUME_RATIO && ideal->frame == GC_FRAME_FLOW);
        if (sets_p && end_ok && !(e->kind == GC_PROC_POLYTROPIC && fabs(e->n) < 1e-12)) {
            e->end = GC_END_START_PRESSURE;
            e->end_value = 0.0;
            e->end_value_ideal = 0.0;
        }
    }
}

/* keep_hx: keep the heat exchangers' effectiveness (the second bound,
 * "ideal components, this regenerator"). */
/* Copies a chain: its header and its n_steps steps only (the unused tail of
 * the step array is left as it is). */
static void copy_chain(gc_cycle *dst, const gc_cycle *src)
{
    memcpy(dst, src, offsetof(gc_cycle, steps));
    int n = src->n_steps > 0 && src->n_steps <= GC_CYCLE_MAX_STEPS ? src->n_steps : 0;
    memcpy(dst->steps, src->steps, (size_t)n * sizeof src->steps[0]);
}

static void idealize(const gc_cycle *c, gc_cycle *ideal, int force_tail, int keep_hx)
{
    if (ideal != c)
        copy_chain(ideal, c);
    for (int i = 0; i < ideal->n_steps; i++) {
        gc_step *s = &ideal->steps[i];
        if (s->kind == GC_PROC_COMPRESSION || s->kind == GC_PROC_EXPANSION ||
            s->kind == GC_PROC_FUEL || (s->kind == GC_PROC_HEAT_EXCHANGE && !keep_hx))
            s->efficiency = 1.0;
        s->pressure_loss = 0.0;
        if (s->kind == GC_PROC_PRESSURE_LOSS) {
            s->end = GC_END_DEFAULT;
            s->end_value = 0.0;
        }
        if (s->end_value_ideal > 0.0) {
            s->end_value = s->end_value_ideal;
            s->end_value_ideal = 0.0;
        }
    }
    ideal_tail(c, ideal, force_tail);
}

int gc_cycle_idealize(const gc_cycle *c, gc_cycle *ideal)
{
    int changed = has_losses(c);
    if (ideal == c) {
        gc_cycle copy;
        copy_chain(&copy, c);
        idealize(&copy, ideal, 0, 0);
    } else {
        idealize(c, ideal, 0, 0);
    }
    return changed;
}

static void copy_run(gc_cycle_run *dst, const gc_cycle_run *src)
{
    dst->frame = src->frame;
    dst->n_states = src->n_states;
    dst->n_processes = src->n_processes;
    dst->n_gases = src->n_gases;
    dst->regen_iterations = src->regen_iterations;
    memcpy(dst->states, src->states, (size_t)src->n_states * sizeof src->states[0]);
    memcpy(dst->processes, src->processes, (size_t)src->n_processes * sizeof src->processes[0]);
    memcpy(dst->gases, src->gases, (size_t)src->n_gases * sizeof src->gases[0]);
    dst->summary = src->summary;
    dst->checks = src->checks;
}

/* "ideal counterpart: " before the message of an error of the ideal run. */
static void prefix_ideal(gc_error *err)
{
    if (!err)
        return;
    static const char pre[] = "ideal counterpart: ";
    size_t n = strlen(err->message), np = sizeof pre - 1;
    if (n + np >= sizeof err->message)
        n = sizeof err->message - np - 1;
    memmove(err->message + np, err->message, n);
    memcpy(err->message, pre, np);
    err->message[np + n] = '\0';
}

/* 1 if a heat exchanger of c has an effectiveness below 1. */
static int imperfect_hx(const gc_cycle *c)
{
    for (int i = 0; i < c->n_steps; i++)
        if (c->steps[i].kind == GC_PROC_HEAT_EXCHANGE && c->steps[i].efficiency < 1.0)
            return 1;
    return 0;
}

/* Runs the ideal counterpart of c (keep_hx: the second bound) into
 * r->ideal; when it does not close, once more with the final expansion sent
 * back to the start pressure whatever lies between (ideal_tail). */
static int ideal_run(const gc_cycle *c, int keep_hx, unsigned flags, gc_cycle_result *r,
                     gc_error *err)
{
    int rc = GC_OK;
    for (int force = 0; force < 2; force++) {
        gc_cycle ideal; /* a scratch copy, about 11 KB */
        idealize(c, &ideal, force, keep_hx);
        ideal.flags = flags;
        rc = run_chain(&ideal, r->actual.summary.T_dead_K, r->actual.summary.P_dead_Pa,
                       &r->actual, &r->ideal, err);
        if (rc == GC_OK)
            break;
    }
    if (rc != GC_OK)
        prefix_ideal(err);
    else
        gc_error_clear(err);
    return rc;
}

/* text in snake_case (letters and digits kept, lower case; anything else one
 * '_'), then suffix, into out (size n). */
static void snake(char *out, size_t n, const char *text, const char *suffix)
{
    size_t k = 0;
    int gap = 0;
    for (const char *p = text; *p && k + 1 < n; p++) {
        unsigned char ch = (unsigned char)*p;
        if (isalnum(ch)) {
            if (gap && k > 0 && k + 2 < n)
                out[k++] = '_';
            out[k++] = (char)tolower(ch);
            gap = 0;
        } else {
            gap = 1;
        }
    }
    out[k] = '\0';
    gc_text_copy(out + k, n - k, suffix);
}

/* The station name of a process's end state: the step's, else derived. */
static void end_name(const gc_cycle *c, const gc_cycle_process *p, char *out, size_t n)
{
    const gc_step *s = &c->steps[p->step];
    int mid = p->kind == GC_PROC_DUAL && p->part == 0;
    const char *given = mid ? s->station_mid : s->station;
    if (given[0]) {
        gc_text_copy(out, n, given);
        return;
    }
    const char *label = s->label[0] ? s->label : gc_cycle_kind_name(s->kind);
    snake(out, n, label, mid ? "_mid" : c->frame == GC_FRAME_FLOW ? "_exit" : "_end");
}

/* 1 when name is a station of states 0..upto-1 of r. */
static int named_before(const gc_cycle_result *r, const char *name, int upto)
{
    for (int i = 0; i < upto; i++)
        if (strcmp(r->station[i], name) == 0)
            return 1;
    return 0;
}

/* Repeated station names get "_2", "_3" ... (the first keeps its name). */
static void unique_names(gc_cycle_result *r, int n_states)
{
    for (int i = 1; i < n_states; i++) {
        if (!named_before(r, r->station[i], i))
            continue;
        char base[GC_CYCLE_STATION_LEN];
        memcpy(base, r->station[i], sizeof base);
        for (unsigned k = 2; k < 100; k++) {
            snprintf(r->station[i], sizeof r->station[i], "%.56s_%u", base, k);
            if (!named_before(r, r->station[i], i))
                break;
        }
    }
}

/* The aliases of the chain, by the index of their states. */
static void name_aliases(const gc_cycle *c, gc_cycle_result *r)
{
    const gc_cycle_run *run = &r->actual;
    r->n_alias = 0;
    for (int a = 0; a < c->n_alias; a++) {
        int state = c->alias[a].step < 0 ? 0 : -1;
        for (int k = 0; k < run->n_processes && state < 0; k++) {
            const gc_cycle_process *p = &run->processes[k];
            if (p->step == c->alias[a].step && !(p->kind == GC_PROC_DUAL && p->part == 0))
                state = p->to;
        }
        if (state < 0 || state >= run->n_states ||
            named_before(r, c->alias[a].name, run->n_states))
            continue;
        gc_cycle_alias *out = &r->alias[r->n_alias++];
        memcpy(out->name, c->alias[a].name, sizeof out->name);
        out->step = state;
    }
}

/* Step labels, state station names and aliases of the chain into the result. */
static void name_result(const gc_cycle *c, gc_cycle_result *r)
{
    const gc_cycle_run *run = &r->actual;
    r->n_steps = c->n_steps;
    for (int i = 0; i < c->n_steps; i++)
        memcpy(r->label[i], c->steps[i].label, sizeof r->label[i]);
    for (int i = 0; i < run->n_states && i < GC_CYCLE_MAX_STATES; i++)
        r->station[i][0] = '\0';
    gc_text_copy(r->station[0], sizeof r->station[0],
             c->start_station[0] ? c->start_station : "start");
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->to <= 0 || p->to >= GC_CYCLE_MAX_STATES || p->step < 0 || p->step >= c->n_steps)
            continue;
        end_name(c, p, r->station[p->to], sizeof r->station[p->to]);
    }
    unique_names(r, run->n_states);
    name_aliases(c, r);
}

static int evaluate_runs(const gc_cycle *c, gc_cycle_result *r, gc_error *err)
{
    gc_error_clear(err);
    r->has_ideal = 0;
    r->has_ideal_components = 0;
    r->ideal_is_actual = 0;
    r->carnot_efficiency = 0.0;
    int rc = run_chain(c, 0.0, 0.0, NULL, &r->actual, err);
    if (rc != GC_OK)
        return rc;
    r->carnot_efficiency = r->actual.summary.carnot_efficiency;
    if (c->flags & GC_CYCLE_NO_BOUNDS)
        return GC_OK;
    if (!has_losses(c)) {
        copy_run(&r->ideal, &r->actual);
        r->ideal_is_actual = 1;
        r->has_ideal = 1;
        return GC_OK;
    }
    /* the second bound first, into r->ideal as scratch (summary kept); it is
     * optional: where it cannot be run the result simply lacks it */
    if (imperfect_hx(c) && ideal_run(c, 1, GC_CYCLE_NO_AREAS, r, NULL) == GC_OK) {
        r->ideal_components = r->ideal.summary;
        r->has_ideal_components = 1;
    }
    rc = ideal_run(c, 0, c->flags, r, err);
    if (rc != GC_OK)
        return rc;
    r->has_ideal = 1;
    return GC_OK;
}

int gc_cycle_evaluate(const gc_cycle *c, gc_cycle_result *r, gc_error *err)
{
    int rc = evaluate_runs(c, r, err);
    if (rc == GC_OK)
        name_result(c, r);
    return rc;
}
