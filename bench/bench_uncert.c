/*
 * bench_uncert.c — speed of the uncertainty engine (uncert.h) on a real
 * model: the Brayton preset in process (gc_brayton_evaluate), fuel-fired
 * (methane) with a regenerator, two intercooled compressor stages and two
 * turbine stages with reheat, as in bench_brayton.c, evaluated with
 * GC_BRAYTON_NO_OPTIMUM | GC_BRAYTON_NO_AREAS (the optimum searches and the
 * area checks do not change the outputs propagated here).
 *
 * Model: 15 inputs (pressure ratio, turbine inlet temperature, component
 * efficiencies, intercooling temperature, the pressure losses, regenerator
 * effectiveness, combustor efficiency, site temperature) with illustrative
 * standard uncertainties; 7 outputs (thermal efficiency, specific work,
 * heat rate, fuel-air ratio, exhaust temperature, air mass flow for 45 MW,
 * electric efficiency).
 *
 * Reports, as ratios measured in the same run (medians of 5 batches; the
 * base point is varied from batch to batch from a xorshift sequence):
 *   - one evaluation, us;
 *   - a linear budget (central differences: 2 x 15 + 1 evaluations), as a
 *     multiple of one evaluation (target <= 40), on 1 and on 2 threads;
 *   - the same with Richardson extrapolation (4 x 15 + 1 evaluations);
 *   - a 10,000-sample Monte Carlo run on 2 threads, s (target <= 1 s over
 *     HTTP later), and on 1 thread once for comparison;
 *   - the largest relative difference between the central and Richardson
 *     sensitivity coefficients (the model's numerical noise seen through
 *     the differences) and the Monte Carlo / linear disagreement flags.
 * Prints figures, never fails on time. Run: make bench-uncert.
 */
#include "gascycle/brayton.h"
#include "gascycle/uncert.h"

#include "bench_util.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define NX 15
#define NY 7
#define BATCHES 5

typedef struct field { const char *name; size_t off; double u; int hi1; } field;

#define IN(f) offsetof(gc_brayton_input, f)
static const field FIELDS[NX] = {
    { "/pressure_ratio", IN(pressure_ratio), 0.05, 0 },
    { "/turbine_inlet_temperature", IN(turbine_inlet_temperature), 5.0, 0 },
    { "/compressor_efficiency", IN(compressor_efficiency), 0.005, 1 },
    { "/turbine_efficiency", IN(turbine_efficiency), 0.005, 1 },
    { "/intercooling_temperature", IN(intercooling_temperature), 1.0, 0 },
    { "/intercooler_pressure_loss", IN(intercooler_pressure_loss), 0.002, 0 },
    { "/reheat_pressure_loss", IN(reheat_pressure_loss), 0.003, 0 },
    { "/regenerator_effectiveness", IN(regenerator_effectiveness), 0.01, 1 },
    { "/regenerator_air_pressure_loss", IN(regenerator_air_pressure_loss), 0.002, 0 },
    { "/regenerator_gas_pressure_loss", IN(regenerator_gas_pressure_loss), 0.003, 0 },
    { "/inlet_pressure_loss", IN(inlet_pressure_loss), 0.001, 0 },
    { "/exhaust_pressure_loss", IN(exhaust_pressure_loss), 0.001, 0 },
    { "/combustor_pressure_loss", IN(combustor_pressure_loss), 0.004, 0 },
    { "/combustor_efficiency", IN(combustor_efficiency), 0.001, 1 },
    { "/site/temperature", IN(site) + offsetof(gc_site_input, T_K), 0.5, 0 },
};

typedef struct model_ctx {
    gc_brayton_input base;
    gc_brayton_result res;       /* ~100 KB: the ctx lives on the heap */
} model_ctx;

static int eval(void *ctxp, const double *x, int nx, double *y, int ny)
{
    model_ctx *c = ctxp;
    gc_brayton_input in = c->base;
    for (int i = 0; i < nx; i++)
        memcpy((char *)&in + FIELDS[i].off, &x[i], sizeof(double));
    int st = gc_brayton_evaluate(&in, &c->res, NULL);
    if (st != GC_OK)
        return st;
    const gc_brayton_result *r = &c->res;
    const double out[NY] = { r->thermal_efficiency, r->specific_work, r->heat_rate_kJ_per_kWh,
                             r->fuel_air_ratio, r->T_exhaust, r->air_mass_flow,
                             r->electric_efficiency };
    memcpy(y, out, sizeof(double) * (size_t)(ny < NY ? ny : NY));
    return GC_OK;
}

static void *clone(void *ctxp)
{
    model_ctx *c = malloc(sizeof *c);
    if (c)
        c->base = ((model_ctx *)ctxp)->base;
    return c;
}

static void release(void *ctxp)
{
    free(ctxp);
}

static int base_input(gc_brayton_input *in)
{
    gc_brayton_input_init(in);
    in->heat_mode = GC_BRAYTON_FUEL;
    in->has_fuel = 1;
    if (gc_fuel_init_named(&in->fuel, "methane", NULL) != GC_OK)
        return -1;
    in->pressure_ratio = 10.0;
    in->turbine_inlet_temperature = 1400.0;
    in->compressor_efficiency = 0.88;
    in->turbine_efficiency = 0.90;
    in->compressor_stages = 2;
    in->intercooling_temperature = 305.0;
    in->intercooler_pressure_loss = 0.02;
    in->turbine_stages = 2;
    in->reheat_pressure_loss = 0.03;
    in->regenerator_effectiveness = 0.80;
    in->regenerator_air_pressure_loss = 0.02;
    in->regenerator_gas_pressure_loss = 0.03;
    in->inlet_pressure_loss = 0.01;
    in->exhaust_pressure_loss = 0.01;
    in->combustor_pressure_loss = 0.04;
    in->combustor_efficiency = 0.99;
    in->mechanical_efficiency = 0.99;
    in->generator_efficiency = 0.985;
    in->net_power = 45e6;
    in->site.has_temperature = 1;
    in->site.T_K = 288.15;
    in->flags = GC_BRAYTON_NO_OPTIMUM | GC_BRAYTON_NO_AREAS;
    return 0;
}

static uint64_t rng_state = 0x9e3779b97f4a7c15ull;

/* The uncertainty inputs at a varied base point (also written into ctx->base). */
static void vary(model_ctx *c, gc_uncert_input *in)
{
    c->base.pressure_ratio = 9.0 + 2.0 * bench_urand(&rng_state);
    c->base.turbine_inlet_temperature = 1380.0 + 40.0 * bench_urand(&rng_state);
    c->base.site.T_K = 283.15 + 10.0 * bench_urand(&rng_state);
    for (int i = 0; i < NX; i++) {
        double x;
        memcpy(&x, (const char *)&c->base + FIELDS[i].off, sizeof x);
        gc_uncert_input_init(&in[i], x, FIELDS[i].u);
        in[i].name = FIELDS[i].name;
        in[i].has_lo = 1;            /* every input here is positive */
        in[i].lo = 0.0;
        in[i].has_hi = FIELDS[i].hi1;
        in[i].hi = 1.0;
    }
}

static double time_evals(model_ctx *c, gc_uncert_input *in, int reps, int *fails)
{
    double x[NX], y[NY], t0 = bench_now_s();
    for (int r = 0; r < reps; r++) {
        vary(c, in);
        for (int i = 0; i < NX; i++)
            x[i] = in[i].value;
        *fails += eval(c, x, NX, y, NY) != GC_OK;
    }
    return (bench_now_s() - t0) / reps;
}

static gc_uncert_linear_result LIN, LIN_R;
static gc_uncert_mc_result MC;

static double time_linear(gc_uncert_model *m, model_ctx *c, gc_uncert_input *in,
                          gc_uncert_diff method, int threads, int reps, long *evals, int *fails)
{
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.diff = method;
    o.threads = threads;
    double t0 = bench_now_s();
    for (int r = 0; r < reps; r++) {
        vary(c, in);
        *fails += gc_uncert_linear(m, in, NULL, NULL, 0, &o,
                                   method == GC_UNCERT_RICHARDSON ? &LIN_R : &LIN, NULL) != GC_OK;
    }
    *evals = (method == GC_UNCERT_RICHARDSON ? LIN_R : LIN).evaluations;
    return (bench_now_s() - t0) / reps;
}

static double time_mc(gc_uncert_model *m, model_ctx *c, gc_uncert_input *in, int threads,
                      int *fails)
{
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    o.samples = 10000;
    o.threads = threads;
    o.seed = 2024;
    vary(c, in);
    *fails += gc_uncert_linear(m, in, NULL, NULL, 0, &o, &LIN, NULL) != GC_OK;
    double t0 = bench_now_s();
    gc_error e;
    int st = gc_uncert_monte_carlo(m, in, NULL, NULL, 0, &o, &LIN, &MC, &e);
    double dt = bench_now_s() - t0;
    if (st != GC_OK) {
        printf("bench-uncert: Monte Carlo failed: %s\n", e.message);
        (*fails)++;
    }
    return dt;
}

/* Largest relative difference of central and Richardson coefficients (of
 * the terms with a share of variance above 1e-6) at one base point. */
static double method_agreement(gc_uncert_model *m, model_ctx *c, gc_uncert_input *in)
{
    gc_uncert_options o;
    gc_uncert_options_init(&o);
    vary(c, in);
    gc_uncert_linear(m, in, NULL, NULL, 0, &o, &LIN, NULL);
    o.diff = GC_UNCERT_RICHARDSON;
    gc_uncert_linear(m, in, NULL, NULL, 0, &o, &LIN_R, NULL);
    double worst = 0.0;
    for (int q = 0; q < LIN.n_out; q++)
        for (int t = 0; t < LIN.out[q].n_terms; t++) {
            const gc_uncert_term *a = &LIN.out[q].terms[t];
            if (a->share < 1e-6)
                continue;
            for (int s = 0; s < LIN_R.out[q].n_terms; s++) {
                const gc_uncert_term *b = &LIN_R.out[q].terms[s];
                if (b->input == a->input)
                    worst = fmax(worst, fabs(a->sensitivity - b->sensitivity) /
                                            fabs(b->sensitivity));
            }
        }
    return worst;
}

int main(void)
{
    model_ctx *c = malloc(sizeof *c);
    if (c == NULL || base_input(&c->base) != 0)
        return 1;
    gc_uncert_model m = { eval, c, NX, NY, clone, release };
    gc_uncert_input in[NX];
    int fails = 0;
    long ev_c = 0, ev_r = 0;
    time_evals(c, in, 100, &fails);                         /* warm-up */
    double te[BATCHES], tc[BATCHES], tc2[BATCHES], tr[BATCHES], tm[3];
    for (int b = 0; b < BATCHES; b++) {
        te[b] = time_evals(c, in, 200, &fails);
        tc[b] = time_linear(&m, c, in, GC_UNCERT_CENTRAL, 1, 20, &ev_c, &fails);
        tc2[b] = time_linear(&m, c, in, GC_UNCERT_CENTRAL, 2, 20, &ev_c, &fails);
        tr[b] = time_linear(&m, c, in, GC_UNCERT_RICHARDSON, 1, 10, &ev_r, &fails);
    }
    bench_sort5(te);
    bench_sort5(tc);
    bench_sort5(tc2);
    bench_sort5(tr);
    for (int k = 0; k < 3; k++)
        tm[k] = time_mc(&m, c, in, 2, &fails);
    double tm1 = time_mc(&m, c, in, 1, &fails);
    for (int i = 1; i < 3; i++)                             /* median of 3 */
        for (int j = i; j > 0 && tm[j] < tm[j - 1]; j--) {
            double t = tm[j];
            tm[j] = tm[j - 1];
            tm[j - 1] = t;
        }
    double agree = method_agreement(&m, c, in);
    printf("bench-uncert: Brayton preset, fuel-fired, regenerator, 2 + 2 stages; %d inputs, "
           "%d outputs; medians of %d batches, base point varied\n", NX, NY, BATCHES);
    printf("bench-uncert: one evaluation                          %8.1f us\n", 1e6 * te[2]);
    printf("bench-uncert: linear budget, central, 1 thread        %8.1f us = %5.1f evaluations "
           "(%ld run; target <= 40)\n", 1e6 * tc[2], tc[2] / te[2], ev_c);
    printf("bench-uncert: linear budget, central, 2 threads       %8.1f us = %5.1f evaluations\n",
           1e6 * tc2[2], tc2[2] / te[2]);
    printf("bench-uncert: linear budget, Richardson, 1 thread     %8.1f us = %5.1f evaluations "
           "(%ld run)\n", 1e6 * tr[2], tr[2] / te[2], ev_r);
    printf("bench-uncert: Monte Carlo 10,000 samples, 2 threads   %8.3f s median of 3 "
           "(%.3f .. %.3f; target <= 1 s over HTTP)\n", tm[1], tm[0], tm[2]);
    printf("bench-uncert: Monte Carlo 10,000 samples, 1 thread    %8.3f s (speed-up %.2f)\n",
           tm1, tm1 / tm[1]);
    printf("bench-uncert: central vs Richardson sensitivities: largest relative difference "
           "%.2e (terms with share > 1e-6)\n", agree);
    printf("bench-uncert: Monte Carlo vs linear, thermal efficiency: u %.6f vs %.6f, "
           "failed samples %ld, disagrees %d\n", MC.out[0].u, LIN.out[0].u_c, MC.n_failed,
           MC.out[0].disagrees);
    if (fails)
        printf("bench-uncert: %d runs failed\n", fails);
    free(c);
    return fails ? 1 : 0;
}
