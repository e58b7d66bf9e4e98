/*
 * bench_json.c — encoding speed of response documents: jansson's json_dumps
 * (JSON_COMPACT | JSON_REAL_PRECISION(10), what the API layer used) against
 * gc_json_dump (service/api/respond/jsonout.h), on
 *   - an array of 300 reals of engineering magnitudes: ns per number;
 *   - a document shaped like a cycle reply (inputs, 13 states of 10 values,
 *     12 processes of 14 values, a summary and units; about 300 numbers):
 *     us per document.
 * Every value is re-drawn before each encoding (json_real_set from a
 * xorshift sequence), so nothing is encoded twice. Both outputs are
 * compared once per batch. Median and best of five batches; figures only,
 * never a failure on time. Run: make bench-json.
 */
#include "api/respond/jsonout.h"

#include "bench_util.h"

#include <jansson.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static uint64_t rng = 0x9e3779b97f4a7c15ull;

#define MAX_REALS 1024
static json_t *reals[MAX_REALS];
static double scales[MAX_REALS];
static int n_reals;

/* A real of the given magnitude; redraw() gives it a new value in
 * [0.5, 1.5) x scale before each encoding. */
static json_t *real(double scale)
{
    json_t *r = json_real(scale * (0.5 + bench_urand(&rng)));
    if (n_reals < MAX_REALS) {
        scales[n_reals] = scale;
        reals[n_reals++] = r;
    }
    return r;
}

static void redraw(void)
{
    for (int i = 0; i < n_reals; i++)
        json_real_set(reals[i], scales[i] * (0.5 + bench_urand(&rng)));
}

static json_t *cycle_doc(void)
{
    static const char *const sk[] = { "T", "P", "v", "u", "h", "s", "T_total", "P_total",
                                      "mass_ratio", "V" };
    static const double ss[] = { 800, 900, 0.5, 400, 700, 7.5, 800, 900, 1.02, 50 };
    static const char *const pk[] = { "work", "heat", "heat_in", "heat_out", "delta_ke",
                                      "delta_s", "s_gen", "exergy_destroyed", "T_boundary",
                                      "dissipated", "efficiency", "polytropic_efficiency",
                                      "mass_ratio", "curve_exponent" };
    static const char *const sum[] = { "net_work", "heat_in", "heat_out", "work_in", "work_out",
                                       "thermal_efficiency", "back_work_ratio", "T_max", "T_min",
                                       "P_max", "P_min", "carnot_efficiency", "exergy_destroyed",
                                       "second_law_efficiency", "heat_rate", "fuel_air_ratio",
                                       "specific_work", "air_mass_flow", "fuel_mass_flow",
                                       "exhaust_temperature" };
    json_t *doc = json_object();
    json_object_set_new(doc, "cycle", json_string("brayton"));
    json_t *in = json_object();
    json_object_set_new(in, "pressure_ratio", real(10));
    json_object_set_new(in, "turbine_inlet_temperature", real(1400));
    json_object_set_new(in, "compressor_efficiency", real(0.88));
    json_object_set_new(in, "turbine_efficiency", real(0.9));
    json_object_set_new(in, "fuel", json_string("methane"));
    json_object_set_new(doc, "inputs", in);
    json_t *st = json_array();
    for (int i = 0; i < 13; i++) {
        json_t *o = json_object();
        json_object_set_new(o, "name", json_string("station"));
        for (int k = 0; k < 10; k++)
            json_object_set_new(o, sk[k], real(ss[k]));
        json_array_append_new(st, o);
    }
    json_object_set_new(doc, "states", st);
    json_t *pr = json_array();
    for (int i = 0; i < 12; i++) {
        json_t *o = json_object();
        json_object_set_new(o, "kind", json_string("expansion"));
        json_object_set_new(o, "from", json_integer(i));
        json_object_set_new(o, "to", json_integer(i + 1));
        for (int k = 0; k < 14; k++)
            json_object_set_new(o, pk[k], real(k < 4 ? 3e2 : 1.0));
        json_array_append_new(pr, o);
    }
    json_object_set_new(doc, "processes", pr);
    json_t *sm = json_object();
    for (int k = 0; k < 20; k++)
        json_object_set_new(sm, sum[k], real(k < 5 ? 400 : 1.0));
    json_object_set_new(doc, "summary", sm);
    json_t *u = json_object();
    json_object_set_new(u, "T", json_string("K"));
    json_object_set_new(u, "P", json_string("kPa"));
    json_object_set_new(u, "h", json_string("kJ/kg"));
    json_object_set_new(doc, "units", u);
    json_object_set_new(doc, "warnings", json_array());
    return doc;
}

/* us per encoding over reps encodings, values redrawn before each. */
static double run(json_t *doc, int ours, int reps, size_t *bytes)
{
    double t = 0.0;
    for (int i = 0; i < reps; i++) {
        redraw();
        double t0 = bench_now_s();
        char *s = ours ? gc_json_dump(doc, 10, NULL)
                       : json_dumps(doc, JSON_COMPACT | JSON_REAL_PRECISION(10));
        t += bench_now_s() - t0;
        if (!s)
            exit(1);
        *bytes += strlen(s);
        free(s);
    }
    return 1e6 * t / reps;
}

static int same(json_t *doc)
{
    char *a = json_dumps(doc, JSON_COMPACT | JSON_REAL_PRECISION(10));
    char *b = gc_json_dump(doc, 10, NULL);
    int ok = a && b && strcmp(a, b) == 0;
    free(a);
    free(b);
    return ok;
}

int main(void)
{
    json_t *arr = json_array();
    for (int i = 0; i < 300; i++)
        json_array_append_new(arr, real(i % 3 == 0 ? 1e5 : (i % 3 == 1 ? 300.0 : 0.01)));
    int n_arr = n_reals;
    json_t *doc = cycle_doc();
    int n_doc = n_reals - n_arr;
    size_t bytes = 0;
    int mismatch = 0;
    double ja[5], oa[5], jd[5], od[5];
    run(arr, 0, 200, &bytes);
    run(arr, 1, 200, &bytes);
    for (int b = 0; b < 5; b++) {
        ja[b] = run(arr, 0, 2000, &bytes);
        oa[b] = run(arr, 1, 2000, &bytes);
        jd[b] = run(doc, 0, 2000, &bytes);
        od[b] = run(doc, 1, 2000, &bytes);
        mismatch += !same(arr) + !same(doc);
    }
    bench_sort5(ja);
    bench_sort5(oa);
    bench_sort5(jd);
    bench_sort5(od);
    char *s = gc_json_dump(doc, 10, NULL);
    printf("bench-json: 300-real array, ns per number   json_dumps %7.1f (best %.1f)   "
           "gc_json_dump %6.1f (best %.1f)   x%.1f\n",
           1e3 * ja[2] / 300, 1e3 * ja[0] / 300, 1e3 * oa[2] / 300, 1e3 * oa[0] / 300,
           ja[2] / oa[2]);
    printf("bench-json: cycle-shaped document (%d reals, 24 integers, %zu bytes), us per document   "
           "json_dumps %6.1f (best %.1f)   gc_json_dump %5.1f (best %.1f)   x%.1f\n",
           n_doc, s ? strlen(s) : (size_t)0, jd[2], jd[0], od[2], od[0], jd[2] / od[2]);
    printf("bench-json: outputs identical in every batch: %s (%zu bytes encoded)\n",
           mismatch ? "NO" : "yes", bytes);
    free(s);
    json_decref(arr);
    json_decref(doc);
    return mismatch ? 1 : 0;
}
