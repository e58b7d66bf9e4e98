/*
 * bench_machine.c — in-process speed of the machine model (machine.h) on the
 * invented demo machine, Quillmere peaking station unit 1 (45 MW simple
 * cycle at 320 m on the pipeline-gas analysis of the demo scenario; IGVs
 * down to 75 % flow for the part-load figures).
 * Reports, as medians of five batches measured in the same run:
 *   - one design-point Brayton evaluation (gc_brayton_evaluate of the
 *     machine's design inputs, no optimum searches), the yardstick;
 *   - one site evaluation (gc_machine_evaluate with the engine's full cycle)
 *     at base load, at part load and with an evaporative cooler, and with the
 *     cooled-turbine model, each as a ratio to the yardstick (target <= 20 x);
 *   - one 50-point correction curve (ambient temperature), ms.
 * Inputs (ambient temperature, humidity, load) vary on every call from a
 * xorshift sequence so no cache answers them; a result goes into a volatile
 * sink. Prints figures, never fails on time. Run: make bench-machine.
 */
#include "gascycle/machine.h"
#include "gascycle/species.h"

#include "bench_util.h"

#include <stdio.h>
#include <string.h>

static volatile double sink;
static gc_brayton_result BR;
static gc_machine M, MC;
static gc_machine_site_result R;
static gc_machine_curves C;
static uint64_t rng = 0x9e3779b97f4a7c15ull;

/* Quillmere unit 1 (invented demo data, as in openapi.json's examples) */
static int quillmere(gc_brayton_input *d)
{
    static const char *names[] = { "CH4", "C2H6", "C3H8", "n-C4H10", "CO2", "N2" };
    static const double x[] = { 0.931, 0.038, 0.008, 0.002, 0.006, 0.015 };
    int ids[6];
    for (int i = 0; i < 6; i++)
        if ((ids[i] = gc_species_find(names[i])) < 0)
            return 1;
    gc_brayton_input_init(d);
    d->heat_mode = GC_BRAYTON_FUEL;
    d->has_fuel = 1;
    if (gc_fuel_init_mixture(&d->fuel, 6, ids, x, NULL) != GC_OK)
        return 1;
    d->pressure_ratio = 15.5;
    d->turbine_inlet_temperature = 1480.0;
    d->compressor_efficiency = 0.87;
    d->turbine_efficiency = 0.9;
    d->inlet_pressure_loss = 0.01;
    d->combustor_pressure_loss = 0.04;
    d->exhaust_pressure_loss = 0.015;
    d->combustor_efficiency = 0.995;
    d->mechanical_efficiency = 0.99;
    d->generator_efficiency = 0.985;
    d->site.has_altitude = 1;
    d->site.altitude_m = 320.0;
    d->site.has_temperature = 1;
    d->site.T_K = 291.15;
    d->site.has_relative_humidity = 1;
    d->site.RH = 0.65;
    d->net_power = 45e6;
    d->flags = GC_BRAYTON_NO_OPTIMUM;
    return 0;
}

static double brayton(const gc_machine *m, int reps)
{
    gc_brayton_input b = m->chain;
    double acc = 0.0, t0 = bench_now_s();
    for (int i = 0; i < reps; i++) {
        b.site.T_K = 263.15 + 50.0 * bench_urand(&rng);
        if (gc_brayton_evaluate(&b, &BR, NULL) == GC_OK)
            acc += BR.thermal_efficiency;
    }
    sink = acc;
    return 1e6 * (bench_now_s() - t0) / reps;
}

/* kind 0 base, 1 part load, 2 evaporative cooler */
static double site(const gc_machine *m, int kind, int reps, int *fails, double *runs)
{
    gc_machine_site_input in;
    gc_machine_site_input_init(&in);
    in.site.has_temperature = in.site.has_altitude = in.site.has_relative_humidity = 1;
    in.site.altitude_m = 320.0;
    if (kind == 1)
        in.load = GC_MACHINE_LOAD_FRACTION;
    if (kind == 2)
        in.inlet.kind = GC_MACHINE_INLET_EVAPORATIVE;
    double acc = 0.0, n = 0.0, t0 = bench_now_s();
    for (int i = 0; i < reps; i++) {
        in.site.T_K = 263.15 + 50.0 * bench_urand(&rng);
        in.site.RH = 0.2 + 0.6 * bench_urand(&rng);
        in.load_fraction = 0.4 + 0.55 * bench_urand(&rng);
        if (gc_machine_evaluate(m, &in, &R, NULL) == GC_OK) {
            acc += R.point.net_power_W;
            n += R.chain_runs;
        } else {
            (*fails)++;
        }
    }
    sink = acc;
    *runs = n / reps;
    return 1e6 * (bench_now_s() - t0) / reps;
}

static double curve(const gc_machine *m, int reps, int *fails)
{
    gc_machine_curve_input in;
    gc_machine_curve_input_init(&in);
    in.points = 50;
    double t0 = bench_now_s();
    for (int i = 0; i < reps; i++) {
        in.from = 243.15 + 10.0 * bench_urand(&rng);
        in.to = 313.15 + 10.0 * bench_urand(&rng);
        if (gc_machine_curves_compute(m, &in, &C, NULL) == GC_OK)
            sink = C.rows[C.n_rows - 1].output_ratio;
        else
            (*fails)++;
    }
    return 1e3 * (bench_now_s() - t0) / reps;
}

int main(void)
{
    gc_machine_spec s;
    gc_machine_spec_init(&s);
    if (quillmere(&s.design) != 0)
        return 1;
    s.igv_minimum_flow_fraction = 0.75;
    if (gc_machine_define(&s, &M, NULL) != GC_OK)
        return 1;
    s.cooling.enabled = 1; /* the same unit with a cooled first stage (combustor exit 1480 K) */
    if (gc_machine_define(&s, &MC, NULL) != GC_OK)
        return 1;
    int fails = 0;
    double runs[5] = { 0 };
    brayton(&M, 100); /* warm-up */
    site(&M, 0, 20, &fails, &runs[0]);
    double b[5], t[5][5], c[5];
    for (int k = 0; k < 5; k++) {
        b[k] = brayton(&M, 400);
        t[0][k] = site(&M, 0, 100, &fails, &runs[0]);
        t[1][k] = site(&M, 1, 100, &fails, &runs[1]);
        t[2][k] = site(&M, 2, 100, &fails, &runs[2]);
        t[3][k] = site(&MC, 0, 100, &fails, &runs[3]);
        t[4][k] = site(&MC, 1, 100, &fails, &runs[4]);
        c[k] = curve(&M, 3, &fails);
    }
    bench_sort5(b);
    bench_sort5(c);
    static const char *what[] = { "base load", "part load 40-95 %", "evaporative cooler",
                                  "cooled turbine, base load", "cooled turbine, part load" };
    printf("bench-machine: Quillmere unit 1 (invented demo machine), ambient 263-313 K, "
           "RH 20-80 %%\n");
    printf("bench-machine: design-point Brayton evaluation         %8.1f us/call median "
           "(the yardstick)\n", b[2]);
    for (int i = 0; i < 5; i++) {
        bench_sort5(t[i]);
        printf("bench-machine: site evaluation, %-26s %7.1f us/call median, %5.1f x the "
               "yardstick (target <= 20), %.1f engine chain runs\n",
               what[i], t[i][2], t[i][2] / b[2], runs[i]);
    }
    printf("bench-machine: 50-point correction curve (temperature)  %8.2f ms median, "
           "%.2f best\n", c[2], c[0]);
    if (fails)
        printf("bench-machine: %d evaluations failed\n", fails);
    return fails ? 1 : 0;
}
