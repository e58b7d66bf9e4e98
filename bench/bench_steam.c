/*
 * bench_steam.c — speed of the steam bottoming cycle (gascycle/steam.h):
 * microseconds per evaluation of a two-pressure HRSG (pinch design, with a
 * deaerator fed by a bleed) and its steam cycle, with everything a request
 * gets (the ideal counterpart and the T-Q diagram data), and without them;
 * the exhaust temperature and the HP pressure vary from call to call
 * (xorshift, fixed seed; bench_util.h) so no cache answers. Median of 5
 * timed passes. Target (issue 16): a two-pressure combined-cycle evaluation
 * within 1 ms in process. Prints figures, never fails on time.
 * Run: make bench-steam.
 */
#include "gascycle/steam.h"

#include "bench_util.h"

#include <stdint.h>
#include <stdio.h>

#define N_IN 256      /* distinct inputs (power of two) */
#define REPS 1000     /* evaluations per timed pass */
#define PASSES 5

static volatile double sink;
static uint64_t rng_state = 0x853c49e6748fea9bull;
static double T_in[N_IN], P_in[N_IN];
static gc_steam_result res;

static void two_pressure(gc_steam_input *in)
{
    gc_steam_input_init(in);
    in->intake_mass_flow_kg_per_s = 100.0;
    in->turbine_efficiency = 0.88;
    in->pump_efficiency = 0.8;
    in->gas_pressure_loss = 0.03;
    in->n_levels = 2;
    in->levels[0] = (gc_steam_level_input){ 10e6, 800.0, 8.0, 5.0, 0.0 };
    in->levels[1] = (gc_steam_level_input){ 0.5e6, 0.0, 8.0, 5.0, 0.0 };
    in->deaerator = 1;
    in->deaerator_pressure_Pa = 2e5;
    in->condenser_pressure_Pa = 0.0;
}

/* Median of 5 passes, microseconds per evaluation; counts failures. */
static double time_us(gc_steam_input *in, int *fails)
{
    double t[PASSES];
    for (int p = 0; p < PASSES; p++) {
        double acc = 0.0, t0 = bench_now_s();
        for (int i = 0; i < REPS; i++) {
            int k = i & (N_IN - 1);
            in->gas_temperature_K = T_in[k];
            in->levels[0].pressure_Pa = P_in[k];
            *fails += gc_steam_evaluate(in, &res, NULL) != GC_OK;
            acc += res.summary.net_power_W;
        }
        t[p] = 1e6 * (bench_now_s() - t0) / REPS;
        sink = acc;
    }
    bench_sort5(t);
    return t[2];
}

int main(void)
{
    gc_steam_input in;
    for (int i = 0; i < N_IN; i++) {
        T_in[i] = 840.0 + 60.0 * bench_urand(&rng_state);
        P_in[i] = 6e6 + 6e6 * bench_urand(&rng_state);
    }
    two_pressure(&in);
    int fails = 0;
    double full = time_us(&in, &fails);
    in.flags = GC_STEAM_NO_IDEAL | GC_STEAM_NO_TQ;
    double bare = time_us(&in, &fails);
    printf("bench-steam: two-pressure HRSG + steam cycle, %d inputs, median of %d passes of %d\n",
           N_IN, PASSES, REPS);
    printf("bench-steam: full evaluation (ideal counterpart, T-Q data) %8.1f us (target 1000 us: "
           "%.2f of it)\n", full, full / 1000.0);
    printf("bench-steam: without ideal and T-Q                        %8.1f us\n", bare);
    printf("bench-steam: failed evaluations: %d (expected 0)\n", fails);
    return 0;
}
