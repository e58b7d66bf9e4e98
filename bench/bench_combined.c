/*
 * bench_combined.c — speed of the combined-cycle preset (gascycle/combined.h)
 * through its descriptor in process (gc_preset_evaluate, as the route and
 * the composites call it): microseconds per evaluation of a two-pressure
 * plant (HP with superheater, LP saturated, deaerator fed by a bleed, pinch
 * design) behind a fuel-fired Brayton topping at a rated power, with
 * everything a request gets (the topping's ideal counterpart and area check,
 * the steam core's ideal counterpart, the T-Q data, the plant's checks), and
 * lean (as a target's inner evaluation: no bounds, no areas, no T-Q data).
 * The turbine inlet temperature and the HP pressure vary from call to call
 * (xorshift, fixed seed; bench_util.h) so no cache answers. The same run
 * times the Brayton preset alone on the same toppings: the ratio says what
 * the bottoming cycle adds. Median of 5 timed passes. Target (issue 16): a
 * two-pressure combined-cycle evaluation within 1 ms in process. Prints
 * figures, never fails on time. Run: make bench-combined.
 */
#include "gascycle/brayton.h"
#include "gascycle/combined.h"

#include "bench_util.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

#define N_IN 64       /* distinct inputs (power of two) */
#define REPS 200      /* evaluations per timed pass */
#define PASSES 5

static volatile double sink;
static uint64_t rng_state = 0x2545f4914f6cdd1dull;
static double tit[N_IN], p_hp[N_IN];

static void topping(gc_brayton_input *b)
{
    b->pressure_ratio = 16.0;
    b->compressor_efficiency = 0.87;
    b->turbine_efficiency = 0.9;
    b->exhaust_pressure_loss = 0.03;
    b->generator_efficiency = 0.985;
    b->net_power = 100e6;
    b->has_net_power = 1;
    gc_fuel_init_named(&b->fuel, "methane", NULL);
    b->has_fuel = 1;
}

static void two_pressure(gc_combined_input *in)
{
    gc_combined_input_init(in);
    topping(gc_combined_set_topping(in, "brayton"));
    in->n_levels = 2;
    in->levels[1] = in->levels[0];
    in->levels[0].steam_temperature = 780.0;
    in->levels[0].pinch = 8.0;
    in->levels[1].pressure = 5e5;
    in->levels[1].steam_temperature = 0.0;
    in->levels[1].has_steam_temperature = 0;
    in->levels[1].pinch = 8.0;
    in->turbine_efficiency = 0.88;
    in->pump_efficiency = 0.8;
    in->deaerator_pressure = 2e5;
}

/* Median of 5 passes, microseconds per evaluation; counts failures. */
static double time_combined(gc_combined_input *in, gc_combined_result *r, int *fails)
{
    const gc_preset *p = gc_combined_preset();
    gc_brayton_input *b = (gc_brayton_input *)(void *)in->topping.bytes;
    gc_report rep;
    double t[PASSES];
    for (int k = 0; k < PASSES; k++) {
        double acc = 0.0, t0 = bench_now_s();
        for (int i = 0; i < REPS; i++) {
            int j = i & (N_IN - 1);
            b->turbine_inlet_temperature = tit[j];
            in->levels[0].pressure = p_hp[j];
            gc_report_init(&rep);
            *fails += gc_preset_evaluate(p, in, r, &rep) != GC_OK;
            acc += r->summary.net_power_W;
        }
        t[k] = 1e6 * (bench_now_s() - t0) / REPS;
        sink = acc;
    }
    bench_sort5(t);
    return t[2];
}

static double time_brayton(gc_brayton_input *b, gc_brayton_result *r, int *fails)
{
    const gc_preset *p = gc_brayton_preset();
    gc_report rep;
    double t[PASSES];
    for (int k = 0; k < PASSES; k++) {
        double acc = 0.0, t0 = bench_now_s();
        for (int i = 0; i < REPS; i++) {
            b->turbine_inlet_temperature = tit[i & (N_IN - 1)];
            gc_report_init(&rep);
            *fails += gc_preset_evaluate(p, b, r, &rep) != GC_OK;
            acc += r->specific_work;
        }
        t[k] = 1e6 * (bench_now_s() - t0) / REPS;
        sink = acc;
    }
    bench_sort5(t);
    return t[2];
}

int main(void)
{
    gc_combined_input *in = malloc(sizeof *in);
    gc_combined_result *r = malloc(sizeof *r);
    gc_brayton_input *b = malloc(sizeof *b);
    gc_brayton_result *br = malloc(sizeof *br);
    if (!in || !r || !b || !br)
        return 1;
    for (int i = 0; i < N_IN; i++) {
        tit[i] = 1450.0 + 100.0 * bench_urand(&rng_state);
        p_hp[i] = 6e6 + 6e6 * bench_urand(&rng_state);
    }
    int fails = 0;
    two_pressure(in);
    double full = time_combined(in, r, &fails);
    in->flags = GC_COMBINED_NO_IDEAL | GC_COMBINED_NO_TQ | GC_COMBINED_NO_AREAS;
    double lean = time_combined(in, r, &fails);
    gc_brayton_input_init(b);
    topping(b);
    double gt = time_brayton(b, br, &fails);
    printf("bench-combined: two-pressure combined cycle through its preset, %d inputs, median "
           "of %d passes of %d\n", N_IN, PASSES, REPS);
    printf("bench-combined: full evaluation (ideal bounds, T-Q data, checks) %8.1f us (target "
           "1000 us: %.2f of it)\n", full, full / 1000.0);
    printf("bench-combined: lean (no bounds, areas or T-Q data)            %8.1f us\n", lean);
    printf("bench-combined: the Brayton topping alone, same run              %8.1f us (full "
           "combined = %.2f x the topping)\n", gt, full / gt);
    printf("bench-combined: failed evaluations: %d (expected 0)\n", fails);
    free(in);
    free(r);
    free(b);
    free(br);
    return 0;
}
