/*
 * bench_if97.c — speed of IAPWS-IF97 (gascycle/if97.h): ns per call of
 * (P, T) -> h (gc_if97_h_TP, and the full state gc_if97_state_TP) and of
 * (P, h) -> T (gc_if97_T_Ph), per region and over a mix of the whole range.
 * Inputs come from precomputed pseudo-random arrays (xorshift, fixed seed;
 * bench_util.h) so no cache or branch predictor answers them; results go into
 * a volatile sink. Each figure is the median of 5 timed passes.
 * Region-3 density at (P, T), before and after IAPWS SR5-05 (issue 16): the
 * route started from v(p, T) (gc__if97_r3_rho_PT) and the bracket-search
 * route it replaced (gc__if97_r3_rho_PT_search, kept as its fallback), timed
 * in alternating passes of the same run on the same inputs, each also as a
 * multiple of a region-1 h(P, T) call; plus SR5-05 v(p, T) alone.
 * Targets (issue 16): (P, T) -> h 200 ns, (P, h) -> T 1 us. For a figure
 * that carries across machines, the same run also times the air model's
 * h(T) (gas.h, one NASA-9 polynomial) and prints each IF97 figure as a
 * multiple of it. Prints figures, never fails on time. Run: make bench-if97.
 */
#include "core/properties/if97_private.h"
#include "gascycle/gas.h"
#include "gascycle/if97.h"

#include "bench_util.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>

#define N_IN 4096            /* distinct inputs per set (power of two) */
#define REPS (1 << 18)       /* calls per timed pass */
#define PASSES 5

static volatile double sink;
static uint64_t rng_state = 0x2545f4914f6cdd1dull;

typedef struct input_set {
    const char *name;
    double T[N_IN], P[N_IN], h[N_IN];
} input_set;

/* Draws (T, P) in a box until gc_if97_region_TP says `region` (0: any). */
static void fill(input_set *s, const char *name, int region, double T_lo, double T_hi,
                 double lnP_lo, double lnP_hi)
{
    s->name = name;
    for (int i = 0; i < N_IN;) {
        double T = T_lo + (T_hi - T_lo) * bench_urand(&rng_state);
        double P = exp(lnP_lo + (lnP_hi - lnP_lo) * bench_urand(&rng_state));
        if (gc_if97_check_TP(T, P, NULL) != GC_OK)
            continue;
        if (region != 0 && gc_if97_region_TP(T, P) != region)
            continue;
        gc_if97_state st;
        if (gc_if97_state_TP(T, P, &st, NULL) != GC_OK)
            continue;
        s->T[i] = T;
        s->P[i] = P;
        s->h[i] = st.h_J_per_kg;
        i++;
    }
}

typedef double (*bench_fn)(const input_set *s, int k);

static double f_h_TP(const input_set *s, int k)
{
    return gc_if97_h_TP(s->T[k], s->P[k]);
}

static double f_state_TP(const input_set *s, int k)
{
    gc_if97_state st;
    gc_if97_state_TP(s->T[k], s->P[k], &st, NULL);
    return st.h_J_per_kg;
}

static double f_T_Ph(const input_set *s, int k)
{
    double T = 0.0;
    gc_if97_T_Ph(s->P[k], s->h[k], &T, NULL);
    return T;
}

/* Region-3 branch of (T, P) as gc_if97_state_TP takes it (if97.c). */
static int r3_branch(double T, double P)
{
    if (T >= GC_IF97_TC_K)
        return GC__IF97_BRANCH_ONE;
    return P >= gc__if97_psat(T) ? GC__IF97_BRANCH_LIQ : GC__IF97_BRANCH_VAP;
}

static double f_r3_started(const input_set *s, int k)
{
    double rho = 0.0;
    gc__if97_r3_rho_PT(s->P[k], s->T[k], r3_branch(s->T[k], s->P[k]), &rho);
    return rho;
}

static double f_r3_search(const input_set *s, int k)
{
    double rho = 0.0;
    gc__if97_r3_rho_PT_search(s->P[k], s->T[k], r3_branch(s->T[k], s->P[k]), &rho);
    return rho;
}

static double f_r3_branch(const input_set *s, int k)
{
    return r3_branch(s->T[k], s->P[k]);
}

static double f_sr5_v(const input_set *s, int k)
{
    return gc__if97_r3_v_PT(s->P[k], s->T[k], r3_branch(s->T[k], s->P[k]));
}

static double time_ns(const input_set *s, bench_fn f)
{
    double t[PASSES];
    for (int p = 0; p < PASSES; p++) {
        double acc = 0.0, t0 = bench_now_s();
        for (int i = 0; i < REPS; i++)
            acc += f(s, i & (N_IN - 1));
        t[p] = 1e9 * (bench_now_s() - t0) / REPS;
        sink = acc;
    }
    bench_sort5(t);
    return t[2];
}

/* Two functions timed in alternating passes (a, b, a, b, ...) so a change
 * of machine load between them affects both alike; medians of 5. */
static void time_pair(const input_set *s, bench_fn fa, bench_fn fb, double *ta, double *tb)
{
    double a[PASSES], b[PASSES];
    for (int p = 0; p < PASSES; p++) {
        for (int w = 0; w < 2; w++) {
            bench_fn f = w ? fb : fa;
            double acc = 0.0, t0 = bench_now_s();
            for (int i = 0; i < REPS; i++)
                acc += f(s, i & (N_IN - 1));
            (w ? b : a)[p] = 1e9 * (bench_now_s() - t0) / REPS;
            sink = acc;
        }
    }
    bench_sort5(a);
    bench_sort5(b);
    *ta = a[2];
    *tb = b[2];
}

static input_set sets[5];
static gc_gas air;

static double f_air_h(const input_set *s, int k)
{
    return gc_gas_h_T(&air, s->T[k] < 2200.0 ? s->T[k] : 2200.0);
}

int main(void)
{
    const double lo = log(1e3), hi = log(100e6);
    fill(&sets[0], "region 1 (liquid)", 1, 273.15, 623.15, log(1e5), hi);
    fill(&sets[1], "region 2 (vapour)", 2, 273.15, 1073.15, lo, hi);
    fill(&sets[2], "region 3 (near critical)", 3, 623.15, 863.15, log(16.5e6), hi);
    fill(&sets[3], "region 5 (high temperature)", 5, 1073.15, 2273.15, lo, log(50e6));
    fill(&sets[4], "whole range, mixed", 0, 273.15, 2273.15, lo, hi);
    printf("bench-if97: ns per call, median of %d passes of %d calls, %d inputs per set\n",
           PASSES, REPS, N_IN);
    printf("bench-if97: %-28s %12s %14s %12s\n", "inputs", "h(P,T)", "state(P,T)", "T(P,h)");
    for (int i = 0; i < 5; i++)
        printf("bench-if97: %-28s %12.1f %14.1f %12.1f\n", sets[i].name,
               time_ns(&sets[i], f_h_TP), time_ns(&sets[i], f_state_TP),
               time_ns(&sets[i], f_T_Ph));
    double t1 = time_ns(&sets[0], f_h_TP), t_br = time_ns(&sets[2], f_r3_branch);
    double t_new, t_old;
    time_pair(&sets[2], f_r3_started, f_r3_search, &t_new, &t_old);
    double t_v = time_ns(&sets[2], f_sr5_v);
    printf("bench-if97: region-3 density at (P, T), same run (branch choice %.1f ns included):\n"
           "bench-if97:   bracket search (before SR5-05) %8.1f ns = %5.2f x region-1 h(P,T) "
           "(%.1f ns)\n"
           "bench-if97:   started from SR5-05 v(p,T)     %8.1f ns = %5.2f x; %.2f x faster\n"
           "bench-if97:   SR5-05 v(p,T) alone            %8.1f ns = %5.2f x\n",
           t_br, t_old, t_old / t1, t1, t_new, t_new / t1, t_old / t_new, t_v, t_v / t1);
    gc_gas_init_air(&air);
    double t_air = time_ns(&sets[4], f_air_h);
    double t_h = time_ns(&sets[4], f_h_TP), t_T = time_ns(&sets[4], f_T_Ph);
    printf("bench-if97: same run, air h(T) (gas.h) %.1f ns: whole-range h(P,T) = %.1f x, "
           "T(P,h) = %.1f x that\n", t_air, t_h / t_air, t_T / t_air);
    printf("bench-if97: targets (issue 16): h(P,T) <= 200 ns, T(P,h) <= 1000 ns; whole range "
           "%.2f and %.2f of target\n", t_h / 200.0, t_T / 1000.0);
    return 0;
}
