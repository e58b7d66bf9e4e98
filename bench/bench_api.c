/*
 * bench_api.c — the API layer in process (issue 11's targets), figures only:
 *   - heap allocations per GET /v1/cycles/otto handler call (a counting
 *     allocator interposed over malloc, calloc, realloc and free: every
 *     allocation of the handler, the decoder's jansson trees and the body);
 *     target <= 40;
 *   - one in-process evaluation E of the Brayton preset (gc_preset_evaluate,
 *     what a route runs: validation, the cycle, its ideal counterpart, the
 *     area check and the warnings; compressor and turbine efficiencies 0.87
 *     and 0.9, pressure ratio varied), the reference of the ratios:
 *   - a /v1/targets solve (thermal efficiency = 0.30 over pressure ratio 2..30),
 *     as a multiple of E; target <= 30;
 *   - a /v1/sweeps point (a 100-point line over the pressure ratio), as a
 *     multiple of E; target <= 3;
 *   - a 2,000-point 2-D sweep (pressure ratio x turbine inlet temperature),
 *     in ms; target <= 100 ms on the reference machine.
 * Each figure is the median of five runs, in the same process, with inputs
 * varied (no cache answers them). Run: make bench-api.
 */
#include "api/api.h"
#include "gascycle/brayton.h"
#include "gascycle/preset.h"

#include "bench_util.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- a counting allocator over glibc's ------------------------------------------------- */

extern void *__libc_malloc(size_t n);
extern void *__libc_calloc(size_t n, size_t m);
extern void *__libc_realloc(void *p, size_t n);
extern void __libc_free(void *p);

static long n_allocs;

void *malloc(size_t n)
{
    n_allocs++;
    return __libc_malloc(n);
}

void *calloc(size_t n, size_t m)
{
    n_allocs++;
    return __libc_calloc(n, m);
}

void *realloc(void *p, size_t n)
{
    if (p == NULL)
        n_allocs++;
    return __libc_realloc(p, n);
}

void free(void *p)
{
    __libc_free(p);
}

/* ---- requests ------------------------------------------------------------------------------ */

static uint64_t rng = 0x9e3779b97f4a7c15ull;

static const gc_api_route *route(const char *pattern)
{
    size_t n = 0;
    const gc_api_route *r = gc_api_routes(&n);
    for (size_t i = 0; i < n; i++)
        if (strcmp(r[i].pattern, pattern) == 0)
            return &r[i];
    fprintf(stderr, "bench-api: no route %s\n", pattern);
    exit(1);
}

/* One handler call; its status. */
static int call(const gc_api_route *rt, const gc_api_request *q)
{
    gc_api_response r;
    memset(&r, 0, sizeof r);
    rt->handler(q, &r);
    free(r.body);
    return r.status;
}

static int post(const char *path, const char *body)
{
    gc_api_request q;
    memset(&q, 0, sizeof q);
    q.method = GC_M_POST;
    q.path = path;
    q.body = body;
    q.body_len = strlen(body);
    q.content_type = "application/json";
    return call(route(path), &q);
}

/* GET /v1/cycles/otto with the compression ratio and peak temperature varied. */
static int otto_get(void)
{
    char cr[32], tp[32];
    snprintf(cr, sizeof cr, "%.6f", 8.0 + 4.0 * bench_urand(&rng));
    snprintf(tp, sizeof tp, "%.4f", 1800.0 + 600.0 * bench_urand(&rng));
    gc_api_param query[2] = { { "compression_ratio", cr }, { "peak_temperature", tp } };
    gc_api_request q;
    memset(&q, 0, sizeof q);
    q.method = GC_M_GET;
    q.path = "/v1/cycles/otto";
    q.query = query;
    q.n_query = 2;
    return call(route("/v1/cycles/otto"), &q);
}

static double median5(double *v)
{
    bench_sort5(v);
    return v[2];
}

/* ---- figures -------------------------------------------------------------------------------- */

static void allocations(void)
{
    int bad = 0;
    for (int i = 0; i < 20; i++)
        bad |= otto_get() != 200;
    const int n = 200;
    long before = n_allocs;
    for (int i = 0; i < n; i++)
        bad |= otto_get() != 200;
    double per = (double)(n_allocs - before) / n;
    printf("GET /v1/cycles/otto handler: %.1f heap allocations per request   (target <= 40)%s\n",
           per, bad ? "   NOT 200" : "");
}

/* One in-process Brayton evaluation, s (median of five runs of reps). */
static double brayton_eval(void)
{
    const gc_preset *p = gc_preset_find("brayton");
    gc_brayton_input in;
    gc_brayton_result *r = malloc(sizeof *r);
    gc_report rep;
    double t[5];
    int fails = 0;
    for (int k = 0; k < 5; k++) {
        const int reps = 400;
        double t0 = bench_now_s();
        for (int i = 0; i < reps; i++) {
            gc_preset_input_init(p, &in);
            in.compressor_efficiency = 0.87;
            in.turbine_efficiency = 0.9;
            in.pressure_ratio = 4.0 + 26.0 * bench_urand(&rng);
            gc_report_init(&rep);
            fails += gc_preset_evaluate(p, &in, r, &rep) != GC_OK;
        }
        t[k] = (bench_now_s() - t0) / reps;
    }
    free(r);
    if (fails)
        printf("bench-api: %d Brayton evaluations failed\n", fails);
    return median5(t);
}

/* A composite request's time, s (median of five): the Brayton base inputs
 * (turbine inlet temperature varied) and the members `rest`. */
static double composite(const char *path, const char *rest, int *bad)
{
    double t[5];
    char body[1024];
    for (int k = 0; k < 5; k++) {
        snprintf(body, sizeof body, "{\"cycle\":\"brayton\",\"inputs\":{"
                 "\"compressor_efficiency\":0.87,\"turbine_efficiency\":0.9,"
                 "\"turbine_inlet_temperature\":%.4f},%s}",
                 1500.0 + 100.0 * bench_urand(&rng), rest);
        double t0 = bench_now_s();
        *bad |= post(path, body) != 200;
        t[k] = bench_now_s() - t0;
    }
    return median5(t);
}

int main(void)
{
    printf("bench-api: in process, one thread; medians of five runs\n");
    allocations();
    double e = brayton_eval();
    printf("one Brayton evaluation E (gc_preset_evaluate, efficiencies 0.87/0.9): %.1f us\n",
           e * 1e6);
    int bad = 0;
    double tt = composite("/v1/targets", "\"free\":{\"input\":\"pressure_ratio\","
                          "\"lower\":2,\"upper\":30},\"target\":{\"output\":"
                          "\"/summary/thermal_efficiency\",\"goal\":\"equal\",\"value\":0.3}",
                          &bad);
    printf("/v1/targets solve:        %8.3f ms = %6.1f x E   (target <= 30)\n", tt * 1e3,
           tt / e);
    double ts = composite("/v1/sweeps", "\"sweep\":{\"input\":\"pressure_ratio\","
                          "\"from\":4,\"to\":30,\"steps\":99}", &bad);
    printf("/v1/sweeps point (100):   %8.1f us = %6.2f x E   (target <= 3)\n", ts / 100 * 1e6,
           ts / 100 / e);
    double t2 = composite("/v1/sweeps", "\"sweep\":[{\"input\":\"pressure_ratio\","
                          "\"from\":4,\"to\":30,\"steps\":49},{\"input\":"
                          "\"compressor_efficiency\",\"from\":0.8,\"to\":0.9,\"steps\":39}]",
                          &bad);
    printf("2,000-point 2-D sweep:    %8.1f ms              (target <= 100 ms)\n", t2 * 1e3);
    if (bad)
        printf("bench-api: a composite request did not answer 200\n");
    return 0;
}
