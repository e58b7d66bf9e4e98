/*
 * bench_brayton.c — in-process speed of the Brayton preset (brayton.h) on
 * the benchmark cycle: variable-property gas (humid site air, then
 * methane combustion products), fuel-fired, with a regenerator, two
 * intercooled compressor stages and two turbine stages with reheat.
 * Reports microseconds per gc_brayton_evaluate call
 *   - default evaluation (actual + ideal counterpart + area checks), without
 *     the optimum-pressure-ratio searches (GC_BRAYTON_NO_OPTIMUM): target 50 us;
 *   - the same without the area integration (GC_BRAYTON_NO_AREAS);
 *   - the full default result including both optimum searches.
 * Inputs (pressure ratio, turbine inlet temperature, site temperature,
 * effectiveness) are varied on every call from a xorshift sequence so no
 * cache answers them; a result field goes into a volatile sink. Prints
 * figures, never fails on time. Run: make bench-brayton.
 */
#include "gascycle/brayton.h"

#include "bench_util.h"

#include <stdint.h>
#include <stdio.h>
#include <time.h>

static volatile double sink;
static gc_brayton_result res;

static uint64_t rng_state = 0x2545f4914f6cdd1dull;

static void vary(gc_brayton_input *in)
{
    in->pressure_ratio = 6.0 + 4.0 * bench_urand(&rng_state);
    in->turbine_inlet_temperature = 1350.0 + 150.0 * bench_urand(&rng_state);
    in->reheat_temperature = in->turbine_inlet_temperature - 50.0 * bench_urand(&rng_state);
    in->regenerator_effectiveness = 0.75 + 0.15 * bench_urand(&rng_state);
    in->site.T_K = 273.15 + 35.0 * bench_urand(&rng_state);
}

static double run(gc_brayton_input *in, unsigned flags, int reps, int *fails)
{
    in->flags = flags;
    double acc = 0.0, t0 = bench_now_s();
    for (int i = 0; i < reps; i++) {
        vary(in);
        if (gc_brayton_evaluate(in, &res, NULL) == GC_OK)
            acc += res.thermal_efficiency;
        else
            (*fails)++;
    }
    double dt = bench_now_s() - t0;
    sink = acc;
    return 1e6 * dt / reps;
}

int main(void)
{
    gc_brayton_input in;
    gc_brayton_input_init(&in);
    in.heat_mode = GC_BRAYTON_FUEL;
    in.has_fuel = 1;
    if (gc_fuel_init_named(&in.fuel, "methane", NULL) != GC_OK)
        return 1;
    in.compressor_efficiency = 0.88;
    in.turbine_efficiency = 0.90;
    in.compressor_stages = 2;
    in.intercooling_temperature = 305.0;
    in.intercooler_pressure_loss = 0.02;
    in.turbine_stages = 2;
    in.reheat_pressure_loss = 0.03;
    in.regenerator_air_pressure_loss = 0.02;
    in.regenerator_gas_pressure_loss = 0.03;
    in.inlet_pressure_loss = 0.01;
    in.exhaust_pressure_loss = 0.01;
    in.combustor_pressure_loss = 0.04;
    in.combustor_efficiency = 0.995;
    in.mechanical_efficiency = 0.99;
    in.generator_efficiency = 0.985;
    in.net_power = 45e6;
    in.site.has_temperature = 1;

    int fails = 0;
    run(&in, GC_BRAYTON_NO_OPTIMUM, 200, &fails); /* warm-up */
    fails = 0;
    /* five batches each: the median and the best batch (the machine is shared) */
    double d[5], a[5], f[5];
    for (int b = 0; b < 5; b++) {
        d[b] = run(&in, GC_BRAYTON_NO_OPTIMUM, 1000, &fails);
        a[b] = run(&in, GC_BRAYTON_NO_OPTIMUM | GC_BRAYTON_NO_AREAS, 1000, &fails);
        f[b] = run(&in, 0, 40, &fails);
    }
    bench_sort5(d);
    bench_sort5(a);
    bench_sort5(f);
    int evals = res.max_efficiency.evaluations + res.max_specific_work.evaluations -
                GC_BRAYTON_RP_SEARCH_SCAN;
    printf("bench-brayton: fuel-fired, regenerator, 2 intercooled + 2 reheat stages, varied inputs\n");
    printf("bench-brayton: evaluation (actual + ideal + area checks) %8.1f us/call median, "
           "%.1f best (target 50)\n", d[2], d[0]);
    printf("bench-brayton: same with GC_BRAYTON_NO_AREAS              %8.1f us/call median, "
           "%.1f best\n", a[2], a[0]);
    printf("bench-brayton: default result with both optimum searches  %8.1f us/call median, "
           "%.1f best (%d extra chain runs)\n", f[2], f[0], evals);
    if (fails)
        printf("bench-brayton: %d evaluations failed\n", fails);
    return fails ? 1 : 0;
}
