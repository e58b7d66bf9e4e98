/*
 * bench_cycle.c — in-process cost of one full cycle evaluation (actual cycle,
 * ideal counterpart, Carnot bound and every built-in check, areas included)
 * for a variable-property (NASA-9 air) Otto and dual cycle, with ideal
 * components and with compression/expansion efficiencies below 1. The
 * compression ratio and the peak temperature change on every call so no
 * cache can answer. Prints microseconds per evaluation (median of 5 rounds);
 * the target (20 us) is reported, never enforced.
 */
#include "gascycle/piston.h"

#include "bench_util.h"

#include <stdio.h>
#include <stdlib.h>
#include <time.h>

static int cmp(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

static gc_piston_result result;

static double run(gc_piston_cycle cyc, int lossy, unsigned flags, int n, double *sink)
{
    gc_piston_input in;
    gc_piston_input_init(&in, cyc);
    in.flags = flags;
    if (lossy) {
        in.compression_efficiency = 0.88;
        in.expansion_efficiency = 0.92;
    }
    double t0 = bench_now_s();
    for (int i = 0; i < n; i++) {
        in.compression_ratio = 8.0 + 0.001 * (i % 4000);
        if (cyc == GC_PISTON_DUAL) {
            in.compression_ratio += 8.0;
            in.pressure_ratio = 1.4 + 0.0001 * (i % 3000);
        }
        in.peak_temperature = 2000.0 + 0.05 * (i % 5000);
        gc_error e;
        if (gc_piston_evaluate(&in, &result, &e) != GC_OK) {
            fprintf(stderr, "bench: evaluation failed: %s %s\n", e.field, e.message);
            exit(1);
        }
        *sink += result.cycle.actual.summary.thermal_efficiency;
    }
    return (bench_now_s() - t0) / n * 1e6;
}

int main(void)
{
    struct { gc_piston_cycle cyc; int lossy; unsigned flags; const char *name; } cases[] = {
        {GC_PISTON_OTTO, 0, 0, "otto, air, ideal components"},
        {GC_PISTON_OTTO, 1, 0, "otto, air, efficiencies 0.88/0.92"},
        {GC_PISTON_DUAL, 0, 0, "dual, air, ideal components"},
        {GC_PISTON_DUAL, 1, 0, "dual, air, efficiencies 0.88/0.92"},
        {GC_PISTON_OTTO, 1, GC_CYCLE_NO_AREAS, "otto, air, efficiencies, no area checks"},
    };
    double sink = 0.0;
    const int n = 20000;
    printf("bench-cycle: microseconds per full evaluation (actual + ideal + checks), "
           "median of 5 x %d calls; target 20 us\n", n);
    for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
        double t[5];
        run(cases[c].cyc, cases[c].lossy, cases[c].flags, 2000, &sink); /* warm-up */
        for (int k = 0; k < 5; k++)
            t[k] = run(cases[c].cyc, cases[c].lossy, cases[c].flags, n, &sink);
        qsort(t, 5, sizeof t[0], cmp);
        printf("  %-45s %8.2f us  (min %.2f, max %.2f)\n", cases[c].name, t[2], t[0], t[4]);
    }
    printf("  (checksum %.6f)\n", sink);
    return 0;
}
