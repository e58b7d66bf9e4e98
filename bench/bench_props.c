/*
 * bench_props.c — speed of the property core for the `air` model: ns per
 * call of h(T), s°(T), T from h, and the isentropic end state for a pressure
 * ratio; plus, for scale, the burner solve and building the air model.
 * Inputs come from precomputed pseudo-random arrays (xorshift, fixed seed) so
 * no cache or branch predictor answers them; results go into a volatile sink.
 * Targets (issue 3): 50 ns, 50 ns, 1 us, 1 us. Prints figures, never fails on
 * time. Run: make bench-props.
 */
#include "gascycle/combustion.h"
#include "gascycle/gas.h"

#include "bench_util.h"

#include <stdint.h>
#include <stdio.h>
#include <time.h>

#define N_IN 4096          /* distinct inputs (power of two) */
#define REPS_FAST (1 << 23)
#define REPS_SOLVE (1 << 20)
#define REPS_BURN (1 << 16)

static volatile double sink;

static uint64_t rng_state = 0x9e3779b97f4a7c15ull;

static double T_in[N_IN], h_in[N_IN], r_in[N_IN];

int main(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    for (int i = 0; i < N_IN; i++) {
        T_in[i] = 220.0 + 2300.0 * bench_urand(&rng_state);
        h_in[i] = gc_gas_h_T(&air, 220.0 + 2300.0 * bench_urand(&rng_state));
        r_in[i] = 1.2 + 38.8 * bench_urand(&rng_state);
    }
    double acc = 0.0, t0, dt;

    t0 = bench_now_s();
    for (int i = 0; i < REPS_FAST; i++)
        acc += gc_gas_h_T(&air, T_in[i & (N_IN - 1)]);
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: air h(T)               %8.1f ns/call (target 50)\n", 1e9 * dt / REPS_FAST);

    acc = 0.0;
    t0 = bench_now_s();
    for (int i = 0; i < REPS_FAST; i++)
        acc += gc_gas_s0_T(&air, T_in[i & (N_IN - 1)]);
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: air s0(T)              %8.1f ns/call (target 50)\n", 1e9 * dt / REPS_FAST);

    acc = 0.0;
    t0 = bench_now_s();
    for (int i = 0; i < REPS_FAST; i++)
        acc += gc_gas_cp_T(&air, T_in[i & (N_IN - 1)]);
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: air cp(T)              %8.1f ns/call\n", 1e9 * dt / REPS_FAST);

    acc = 0.0;
    int fails = 0;
    t0 = bench_now_s();
    for (int i = 0; i < REPS_SOLVE; i++) {
        double T = 0.0;
        fails += gc_gas_T_from_h(&air, h_in[i & (N_IN - 1)], &T, NULL) != GC_OK;
        acc += T;
    }
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: air T from h           %8.1f ns/call (target 1000)\n", 1e9 * dt / REPS_SOLVE);

    acc = 0.0;
    t0 = bench_now_s();
    for (int i = 0; i < REPS_SOLVE; i++) {
        double T = 0.0;
        int k = i & (N_IN - 1);
        fails += gc_gas_T_isentropic_P(&air, 220.0 + 0.5 * (T_in[k] - 220.0), r_in[k], &T, NULL) != GC_OK;
        acc += T;
    }
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: air isentropic T2(P2/P1) %6.1f ns/call (target 1000)\n", 1e9 * dt / REPS_SOLVE);

    gc_fuel ch4;
    gc_fuel_init_named(&ch4, "methane", NULL);
    acc = 0.0;
    t0 = bench_now_s();
    for (int i = 0; i < REPS_BURN; i++) {
        gc_burn b;
        int k = i & (N_IN - 1);
        fails += gc_combustion_burn_to_T(&ch4, 300.0, &air, 300.0 + 0.2 * T_in[k], 1.0,
                                         1100.0 + 0.3 * T_in[k], 1.0, &b, NULL) != GC_OK;
        acc += b.far;
    }
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: methane burner to T_exit %6.1f ns/call\n", 1e9 * dt / REPS_BURN);

    t0 = bench_now_s();
    for (int i = 0; i < REPS_BURN; i++) {
        gc_gas g;
        gc_gas_init_air(&g);
        acc += g.M_kg_per_mol;
    }
    dt = bench_now_s() - t0;
    sink = acc;
    printf("bench-props: build the air model    %8.1f ns/call\n", 1e9 * dt / REPS_BURN);
    if (fails) {
        printf("bench-props: %d solves failed\n", fails);
        return 1;
    }
    return 0;
}
