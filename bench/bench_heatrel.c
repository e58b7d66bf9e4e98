/*
 * bench_heatrel.c — in-process cost of a test-cell recording's combustion
 * analysis (heatrel.h): 300 cycles x 1,440 samples (0.5 deg over 720 deg)
 * as CSV text (about 4 MB, pressures in bar with 7 significant digits),
 * parsed, then reduced (pegging, ensemble, phasing, heat release, burn
 * points, statistics) under four configurations. Each round uses a freshly
 * generated recording (new seed: burn start, duration and heat vary from
 * cycle to cycle), so no cache answers. Prints milliseconds (median of 5
 * rounds) and the share of the 0.5 s budget (which is for the whole
 * HTTP request; the route is measured later): reported, never enforced.
 *
 * The synthetic cycles: constant k = 1.35 first law with a Wiebe (1962)
 * burn (a = 6.908, m = 2) integrated by the trapezoid rule, intake and
 * exhaust at constant pressure; arbitrary round numbers, not measurements.
 */
#include "gascycle/combustion.h"
#include "gascycle/heatrel.h"

#include "bench_util.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_CYCLES 300
#define N_SAMPLES 1440
#define ROUNDS 5
#define PI 3.14159265358979323846

static const gc_measured_geometry geo = { 0.090, 0.100, 0.160, 10.0 };

/* One synthetic cycle at N_SAMPLES from -360 deg into P (Pa). */
static void cycle(double q, double th0, double dth, double *P)
{
    const double k = 1.35, h = 720.0 / N_SAMPLES, p_int = 0.95e5, p_exh = 1.1e5;
    double V0 = gc_measured_volume(&geo, -PI, NULL), C0 = p_int * pow(V0, k), F = 0.0;
    double prev_rate = 0.0;
    for (int i = 0; i < N_SAMPLES; i++) {
        double th = -360.0 + i * h;
        if (th < -180.0) {
            P[i] = p_int;
            continue;
        }
        if (th > 180.0) {
            P[i] = p_exh;
            continue;
        }
        double V = gc_measured_volume(&geo, th * PI / 180.0, NULL), dx;
        gc_heatrel_wiebe(th, th0, dth, 6.908, 2.0, &dx);
        double rate = pow(V, k - 1.0) * q * dx;
        if (th > -180.0)
            F += 0.5 * (prev_rate + rate) * h;
        prev_rate = rate;
        P[i] = (C0 + (k - 1.0) * F) / pow(V, k);
    }
}

/* The recording as CSV text (heap); *len its length. */
static char *recording(uint64_t seed, size_t *len)
{
    static double P[N_CYCLES][N_SAMPLES];
    for (int c = 0; c < N_CYCLES; c++) {
        double q = 950.0 + 100.0 * bench_urand(&seed);
        if (c % 97 == 13)
            q = 0.0;                       /* an occasional misfire */
        cycle(q, -24.0 + 6.0 * bench_urand(&seed), 50.0 + 10.0 * bench_urand(&seed), P[c]);
    }
    size_t cap = (size_t)N_SAMPLES * N_CYCLES * 12 + 8192, u = 0;
    char *t = malloc(cap);
    u += (size_t)snprintf(t + u, cap - u, "angle [deg]");
    for (int c = 0; c < N_CYCLES; c++)
        u += (size_t)snprintf(t + u, cap - u, ",p%d [bar]", c + 1);
    t[u++] = '\n';
    for (int i = 0; i < N_SAMPLES; i++) {
        u += (size_t)snprintf(t + u, cap - u, "%.1f", -360.0 + i * 720.0 / N_SAMPLES);
        for (int c = 0; c < N_CYCLES; c++)
            u += (size_t)snprintf(t + u, cap - u, ",%.7g", P[c][i] * 1e-5);
        t[u++] = '\n';
    }
    *len = u;
    return t;
}

typedef struct config {
    const char *name;
    int products, wall, peg, phasing;
} config;

static void input(const config *cf, gc_heatrel_input *in, const gc_gas *products)
{
    gc_heatrel_input_init(in);
    in->geometry = geo;
    in->T_ivc_K = 330.0;
    in->speed_rev_s = 2000.0 / 60.0;
    in->peg_method = cf->peg;
    in->phasing_method = cf->phasing;
    in->wall_model = cf->wall;
    if (cf->products) {
        in->has_burned_gas = 1;
        in->gas_burned = *products;
    }
    in->fuel_per_cycle_kg = 2.2e-5;
    in->fuel_heating_value_J_per_kg = 50.0e6;
}

static double median(double *t)
{
    bench_sort5(t);
    return t[2];
}

int main(void)
{
    gc_gas air, products;
    gc_gas_init_air(&air);
    gc_fuel ch4;
    gc_fuel_init_named(&ch4, "methane", NULL);
    double fs;
    gc_combustion_far_stoich(&ch4, &air, &fs, NULL);
    gc_combustion_products(&ch4, &air, 0.9 * fs, &products, NULL);
    const config cfs[] = {
        { "air, net only", 0, GC_HEATREL_WALL_NONE, GC_HEATREL_PEG_NONE, GC_HEATREL_PHASING_NONE },
        { "air -> products (k passes)", 1, GC_HEATREL_WALL_NONE, GC_HEATREL_PEG_NONE,
          GC_HEATREL_PHASING_NONE },
        { "+ Woschni gross, polytropic peg", 1, GC_HEATREL_WALL_WOSCHNI,
          GC_HEATREL_PEG_POLYTROPIC, GC_HEATREL_PHASING_NONE },
        { "+ polytropic phasing test", 1, GC_HEATREL_WALL_WOSCHNI, GC_HEATREL_PEG_POLYTROPIC,
          GC_HEATREL_PHASING_POLYTROPIC },
    };
    const int ncf = (int)(sizeof cfs / sizeof cfs[0]);
    double t_parse[ROUNDS], t_an[4][ROUNDS], sink = 0.0;
    size_t bytes = 0;
    for (int round = 0; round < ROUNDS; round++) {
        size_t len;
        char *text = recording(0x9E3779B97F4A7C15ull + (uint64_t)round * 7919u, &len);
        bytes = len;
        gc_heatrel_traces tr;
        gc_heatrel_csv_error ce;
        double t0 = bench_now_s();
        if (gc_heatrel_csv_parse(text, len, &tr, &ce) != GC_OK) {
            fprintf(stderr, "bench-heatrel: parse failed: %s\n", ce.message);
            return 1;
        }
        t_parse[round] = bench_now_s() - t0;
        free(text);
        for (int k = 0; k < ncf; k++) {
            gc_heatrel_input in;
            input(&cfs[k], &in, &products);
            gc_heatrel_result r;
            gc_error e;
            t0 = bench_now_s();
            if (gc_heatrel_analyse(&in, &tr, &r, &e) != GC_OK) {
                fprintf(stderr, "bench-heatrel: analysis failed: %s %s\n", e.field, e.message);
                return 1;
            }
            t_an[k][round] = bench_now_s() - t0;
            sink += r.imep_net.cov + r.point[1].mean;
            gc_heatrel_result_free(&r);
        }
        gc_heatrel_traces_free(&tr);
    }
    double parse_ms = 1e3 * median(t_parse);
    printf("bench-heatrel: %d cycles x %d samples (%.1f MB of CSV), median of %d rounds, "
           "each round a new recording\n", N_CYCLES, N_SAMPLES, bytes / 1048576.0, ROUNDS);
    printf("  %-34s %8.1f ms  (%.0f MB/s)\n", "CSV parse", parse_ms,
           bytes / 1048576.0 / (parse_ms * 1e-3));
    for (int k = 0; k < ncf; k++) {
        double ms = 1e3 * median(t_an[k]);
        printf("  %-34s %8.1f ms  parse + reduce %6.1f ms = %3.0f %% of the 0.5 s budget\n",
               cfs[k].name, ms, ms + parse_ms, 100.0 * (ms + parse_ms) / 500.0);
    }
    printf("  (checksum %.6f)\n", sink);
    return 0;
}
