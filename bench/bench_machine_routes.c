/*
 * bench_machine_routes.c — in-process speed of the machine presets
 * (service/core/presets/machine_*.c) as the routes evaluate them: each call
 * defines the machine from its design inputs (the design point and base load
 * at the reference conditions) and then answers, as one request does.
 * Inputs: the invented demo machine, Quillmere peaking station unit 1 (a
 * 45 MW simple cycle at 320 m on the pipeline-gas analysis of the demo
 * scenario, vanes down to 75 % flow).
 * Reports, as medians of five batches measured in the same run:
 *   - one design-point Brayton evaluation through its preset (fuel, rated
 *     output, no optimum search), the yardstick;
 *   - one site evaluation through machine_site (base load; part load),
 *     as a ratio to the yardstick (target <= 20 x);
 *   - one readings reduction (machine_readings), as a ratio;
 *   - one 50-point correction curve (machine_corrections), ms and ratio.
 * Ambient temperature, humidity and load vary on every call (xorshift) so
 * no cache answers them. Prints figures, never fails on time.
 * Run: make bench-machine-routes.
 */
#include "core/presets/machine_presets.h"
#include "gascycle/species.h"

#include "bench_util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static volatile double sink;
static uint64_t rng = 0x2545f4914f6cdd1dull;
static double base_power, base_fuel;   /* the readings' output and fuel flow */

/* Quillmere unit 1 (invented demo data, as in openapi.json's examples). */
static int quillmere(gc_brayton_input *d)
{
    static const char *names[] = { "CH4", "C2H6", "C3H8", "n-C4H10", "CO2", "N2" };
    static const double x[] = { 0.931, 0.038, 0.008, 0.002, 0.006, 0.015 };
    int ids[6];
    for (int i = 0; i < 6; i++)
        if ((ids[i] = gc_species_find(names[i])) < 0)
            return 1;
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
    d->site.has_altitude = d->site.has_temperature = d->site.has_relative_humidity = 1;
    d->site.altitude_m = 320.0;
    d->site.T_K = 291.15;
    d->site.RH = 0.65;
    d->net_power = 45e6;
    d->has_net_power = 1;
    return 0;
}

typedef struct job {
    const gc_preset *p;
    void *in, *res;
    gc_report rep;
} job;

static int job_open(job *j, const gc_preset *p)
{
    j->p = p;
    j->in = calloc(1, p->input_size);
    j->res = calloc(1, p->result_size);
    if (!j->in || !j->res)
        return 1;
    gc_preset_input_init(p, j->in);
    if (p == gc_brayton_preset())
        return quillmere(j->in);
    gc_machine_head *h = j->in;
    h->has_design = 1;
    h->spec.igv_minimum_flow_fraction = 0.75;
    return quillmere(&h->spec.design);
}

static gc_site_input *ambient_of(job *j)
{
    if (j->p == gc_brayton_preset())
        return &((gc_brayton_input *)j->in)->site;
    if (j->p == &gc_preset_machine_site)
        return &((gc_machine_site_request *)j->in)->site;
    return &((gc_machine_readings_request *)j->in)->readings.site;
}

/* kind: 0 base load, 1 part load (machine_site only); the time of one call, s */
static double timed(job *j, int kind, int reps, int *fails)
{
    double acc = 0.0, t0 = bench_now_s();
    for (int i = 0; i < reps; i++) {
        if (j->p == &gc_preset_machine_readings) {   /* the readings of one condition */
            gc_machine_readings *rd = &((gc_machine_readings_request *)j->in)->readings;
            rd->net_power_W = base_power * (0.995 + 0.01 * bench_urand(&rng));
            rd->fuel_mass_flow_kg_per_s = base_fuel * (0.995 + 0.01 * bench_urand(&rng));
        } else if (j->p != &gc_preset_machine_corrections) {
            gc_site_input *s = ambient_of(j);
            s->has_temperature = s->has_relative_humidity = 1;
            s->T_K = 273.15 + 30.0 * bench_urand(&rng);
            s->RH = 0.2 + 0.6 * bench_urand(&rng);
        } else {
            gc_machine_corrections_request *c = j->in;
            c->from.T_K = 243.15 + 10.0 * bench_urand(&rng);
            c->to.T_K = 313.15 + 10.0 * bench_urand(&rng);
        }
        if (j->p == &gc_preset_machine_site)
            ((gc_machine_site_request *)j->in)->load_fraction =
                kind == 1 ? 0.4 + 0.55 * bench_urand(&rng) : GC_UNSET;
        gc_report_init(&j->rep);
        if (gc_preset_evaluate(j->p, j->in, j->res, &j->rep) == GC_OK)
            acc += 1.0;
        else
            (*fails)++;
    }
    sink = acc;
    return (bench_now_s() - t0) / reps;
}

/* Readings of the machine at a mild condition: what the reduction reads. */
static int readings_setup(job *r, job *s)
{
    gc_machine_site_request *in = s->in;
    in->condition.compressor_efficiency_change = -0.01;
    in->site.has_altitude = 1;
    in->site.altitude_m = 320.0;
    gc_report_init(&s->rep);
    if (gc_preset_evaluate(s->p, s->in, s->res, &s->rep) != GC_OK)
        return 1;
    const gc_machine_point *p = &((gc_machine_site_answer *)s->res)->at.point;
    gc_machine_readings *rd = &((gc_machine_readings_request *)r->in)->readings;
    rd->site = in->site;
    rd->compressor_exit_P_Pa = p->compressor_exit_P_Pa;
    rd->compressor_exit_T_K = p->compressor_exit_T_K;
    rd->exhaust_temperature_K = p->exhaust_temperature_K;
    rd->fuel_mass_flow_kg_per_s = p->fuel_mass_flow_kg_per_s;
    rd->net_power_W = base_power = p->net_power_W;
    base_fuel = p->fuel_mass_flow_kg_per_s;
    in->condition.compressor_efficiency_change = 0.0;
    return 0;
}

int main(void)
{
    job b, s, r, c;
    if (job_open(&b, gc_brayton_preset()) || job_open(&s, &gc_preset_machine_site) ||
        job_open(&r, &gc_preset_machine_readings) ||
        job_open(&c, &gc_preset_machine_corrections) || readings_setup(&r, &s))
        return 1;
    ((gc_machine_corrections_request *)c.in)->points = 50;
    ((gc_machine_site_request *)s.in)->site.has_altitude = 1;
    int fails = 0;
    double t[5][5];
    timed(&b, 0, 50, &fails); /* warm-up */
    timed(&s, 0, 10, &fails);
    for (int k = 0; k < 5; k++) {
        t[0][k] = timed(&b, 0, 200, &fails);
        t[1][k] = timed(&s, 0, 40, &fails);
        t[2][k] = timed(&s, 1, 40, &fails);
        t[3][k] = timed(&r, 0, 20, &fails);
        t[4][k] = timed(&c, 0, 2, &fails);
    }
    for (int i = 0; i < 5; i++)
        bench_sort5(t[i]);
    static const char *what[] = { "site evaluation, base load", "site evaluation, part load",
                                  "readings reduction", "50-point correction curve" };
    printf("bench-machine-routes: Quillmere unit 1 (invented demo machine) through its presets, "
           "each call defining the machine; ambient 273-303 K, RH 20-80 %%\n");
    printf("bench-machine-routes: design-point Brayton (preset)      %8.1f us/call median "
           "(the yardstick)\n", 1e6 * t[0][2]);
    for (int i = 1; i < 5; i++)
        printf("bench-machine-routes: %-32s %8.1f us/call median, %6.1f x the yardstick%s\n",
               what[i - 1], 1e6 * t[i][2], t[i][2] / t[0][2],
               i < 3 ? " (target <= 20)" : "");
    if (fails)
        printf("bench-machine-routes: %d evaluations failed\n", fails);
    return fails ? 1 : 0;
}
