/*
 * bench_uncert_routes.c — /v1/uncertainty in process, through the route's
 * own code path (the handler: decoding, the base evaluation, the engine's
 * evaluations through point.c, the document), against one in-process
 * evaluation E of the same preset and inputs (gc_preset_evaluate of the
 * decoded request: validation, the cycle, its ideal counterpart, the area
 * check and the warnings: what the preset's route runs). Figures only.
 *
 * The case (bench/uncert/brayton15.json, shared with bench/uncert/run.sh):
 * the fuel-fired (methane) Brayton preset with two intercooled compressor
 * stages, two turbine stages with reheat and a regenerator, 15 uncertain
 * inputs, 7 outputs; the turbine inlet temperature varied from run to run
 * (1380..1420 K from a xorshift sequence) so no two requests are alike.
 *
 * Reports, as ratios measured in the same run (medians of five):
 *   - E, us;
 *   - a linear budget (central differences: 1 + 2 x 15 engine evaluations
 *     plus the full base evaluation) as a multiple of E, on 1 and on 2
 *     threads (target <= 40 E);
 *   - the same with Richardson extrapolation (1 + 4 x 15);
 *   - a 10,000-sample Monte Carlo run in process on 2 threads, s, and as a
 *     multiple of E (the HTTP figure is bench/uncert/run.sh's).
 * Run: make bench-uncert-routes (in make bench).
 */
#include "api/api.h"
#include "api/handlers.h"
#include "api/request/fields.h"
#include "gascycle/preset.h"

#include "bench_util.h"

#include <jansson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static uint64_t rng = 0x2545f4914f6cdd1dull;
static char *templ;

static char *read_file(const char *path)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return NULL;
    fseek(f, 0, SEEK_END);
    long n = ftell(f);
    fseek(f, 0, SEEK_SET);
    char *s = malloc((size_t)n + 1);
    if (s && fread(s, 1, (size_t)n, f) != (size_t)n) {
        free(s);
        s = NULL;
    }
    if (s)
        s[n] = '\0';
    fclose(f);
    return s;
}

/* The request with the TIT and the Monte Carlo members filled in. */
static char *request(double tit, const char *mc)
{
    size_t n = strlen(templ) + strlen(mc) + 64;
    char *out = malloc(n), tbuf[32];
    snprintf(tbuf, sizeof tbuf, "%.4f", tit);
    const char *a = strstr(templ, "@TIT@"), *b = strstr(templ, "@MC@");
    if (!out || !a || !b || b < a) {
        free(out);
        return NULL;
    }
    snprintf(out, n, "%.*s%s%.*s%s%s", (int)(a - templ), templ, tbuf, (int)(b - a - 5), a + 5,
             mc, b + 4);
    return out;
}

static int post(const char *body, unsigned threads)
{
    gc_api_request q;
    gc_api_response r;
    gc_api_budget b;
    memset(&q, 0, sizeof q);
    memset(&r, 0, sizeof r);
    memset(&b, 0, sizeof b);
    b.threads = threads;
    q.method = GC_M_POST;
    q.path = "/v1/uncertainty";
    q.body = body;
    q.body_len = strlen(body);
    q.content_type = "application/json";
    q.budget = &b;
    gc_api_h_uncertainty(&q, &r);
    if (r.status != 200)
        fprintf(stderr, "bench-uncert-routes: status %d: %.300s\n", r.status,
                r.body ? r.body : "");
    free(r.body);
    return r.status;
}

/* E: one full evaluation of the decoded inputs, s (median of five runs of 100). */
static double one_evaluation(void)
{
    const gc_preset *p = gc_preset_find("brayton");
    void *in = malloc(p->input_size), *res = malloc(p->result_size);
    gc_report rep;
    gc_api_errors errs;
    double t[5];
    int fails = 0;
    for (int k = 0; k < 5; k++) {
        double t0 = bench_now_s(), tsum = 0.0;
        for (int i = 0; i < 100; i++) {
            char *body = request(1380.0 + 40.0 * bench_urand(&rng), "");
            json_t *root = json_loads(body, 0, NULL);
            gc_preset_input_init(p, in);
            gc_api_errors_init(&errs);
            fails += gc_api_fields_decode(p, json_object_get(root, "inputs"), 0, in, "", &errs);
            double t1 = bench_now_s();
            gc_report_init(&rep);
            fails += gc_preset_evaluate(p, in, res, &rep) != GC_OK;
            tsum += bench_now_s() - t1;
            gc_api_fields_release(p, in);
            json_decref(root);
            free(body);
        }
        (void)t0;
        t[k] = tsum / 100;
    }
    free(in);
    free(res);
    if (fails)
        printf("bench-uncert-routes: %d evaluations failed\n", fails);
    bench_sort5(t);
    return t[2];
}

/* A request's time, s (median of five, TIT varied). */
static double timed(const char *mc, unsigned threads, int *bad)
{
    double t[5];
    for (int k = 0; k < 5; k++) {
        char *body = request(1380.0 + 40.0 * bench_urand(&rng), mc);
        double t0 = bench_now_s();
        *bad |= !body || post(body, threads) != 200;
        t[k] = bench_now_s() - t0;
        free(body);
    }
    bench_sort5(t);
    return t[2];
}

int main(void)
{
    templ = read_file("bench/uncert/brayton15.json");
    if (!templ) {
        fprintf(stderr, "bench-uncert-routes: run from the repository root\n");
        return 1;
    }
    int bad = 0;
    double e = one_evaluation();
    timed("", 1, &bad);   /* warm-up */
    double l1 = timed("", 1, &bad), l2 = timed("", 2, &bad);
    double r1 = timed(", \"derivatives\": \"richardson\"", 1, &bad);
    double m2 = timed(", \"method\": \"monte_carlo\", \"samples\": 10000", 2, &bad);
    printf("bench-uncert-routes: fuel-fired Brayton, regenerator, 2 + 2 stages; 15 uncertain "
           "inputs, 7 outputs; through the /v1/uncertainty handler in process; medians of 5, "
           "TIT varied\n");
    printf("one evaluation E (gc_preset_evaluate, full)        %9.1f us\n", e * 1e6);
    printf("linear budget, central, 1 thread                   %9.1f us = %6.1f E   (target "
           "<= 40 E)\n", l1 * 1e6, l1 / e);
    printf("linear budget, central, 2 threads                  %9.1f us = %6.1f E\n", l2 * 1e6,
           l2 / e);
    printf("linear budget, richardson, 1 thread                %9.1f us = %6.1f E\n", r1 * 1e6,
           r1 / e);
    printf("Monte Carlo, 10,000 samples, 2 threads             %9.3f s  = %6.0f E   (target "
           "<= 1 s over HTTP: bench/uncert/run.sh)\n", m2, m2 / e);
    free(templ);
    return bad ? 1 : 0;
}
