/*
 * bench_if97.c — speed of IAPWS-IF97 (gascycle/if97.h): ns per call of
 * (P, T) -> h (gc_if97_h_TP, and the full state gc_if97_state_TP) and of
 * (P, h) -> T (gc_if97_T_Ph), per region and over a mix of the whole range.
 * Inputs come from precomputed pseudo-random arrays (xorshift, fixed seed;
 * bench_util.h) so no cache or branch predictor answers them; results go into
 * a volatile sink. Each figure is the median of 5 timed passes.
 * Targets (issue 16): (P, T) -> h 200 ns, (P, h) -> T 1 us. For a figure
 * that carries across machines, the same run also times the air model's
 * h(T) (gas.h, one NASA-9 polynomial) and prints each IF97 figure as a
 * multiple of it. Prints figures, never fails on time. Run: make bench-if97.
 */
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
    gc_gas_init_air(&air);
    double t_air = time_ns(&sets[4], f_air_h);
    double t_h = time_ns(&sets[4], f_h_TP), t_T = time_ns(&sets[4], f_T_Ph);
    printf("bench-if97: same run, air h(T) (gas.h) %.1f ns: whole-range h(P,T) = %.1f x, "
           "T(P,h) = %.1f x that\n", t_air, t_h / t_air, t_T / t_air);
    printf("bench-if97: targets (issue 16): h(P,T) <= 200 ns, T(P,h) <= 1000 ns; whole range "
           "%.2f and %.2f of target\n", t_h / 200.0, t_T / 1000.0);
    return 0;
}
