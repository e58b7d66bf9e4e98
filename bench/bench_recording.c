/*
 * bench_recording.c — reading a JSON cylinder-pressure recording of the
 * issue's size (300 cycles x 1,440 samples, about 3.6 MB) into the
 * combustion route's input, in process, two ways in the same run:
 *   jansson  the whole body parsed by jansson (a json_t per number), then
 *            the series decoder walking those values (what the route did);
 *   scanner  the series read by series_scan.c, jansson parsing the rest,
 *            the decoder taking the scanned values (what the route does).
 * Both ways end with the same decoded input (checked: the series compared
 * bit for bit every batch). Four invented recordings (a smooth pressure
 * curve plus xorshift noise, numbers written as a recorder writes them,
 * %.5f) are read in turn, so no two consecutive reads see the same body.
 * Median and best of five batches of 8 reads, ms per body, and the ratio;
 * figures only, never a failure on time. Run: make bench-recording.
 */
#include "api/api.h"
#include "api/request/decode.h"
#include "api/request/fields.h"
#include "api/request/series_scan.h"
#include "gascycle/preset.h"

#include "bench_util.h"

#include <jansson.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_BODIES 4
#define CYCLES 300
#define SAMPLES 1440

typedef struct {
    char *s;
    size_t n;
} body;

static body make_body(uint64_t *rng)
{
    size_t cap = 16u << 20, n = 0;
    char *s = malloc(cap);
    n += (size_t)snprintf(s + n, cap - n, "{\"bore\": \"79 mm\", \"stroke\": \"81.5 mm\", "
                          "\"connecting_rod_length\": \"129 mm\", \"compression_ratio\": 10.5, "
                          "\"pressure_unit\": \"bar\", \"crank_angle\": [");
    for (int i = 0; i < SAMPLES; i++)
        n += (size_t)snprintf(s + n, cap - n, "%s%g", i ? "," : "", -360.0 + 0.5 * i);
    n += (size_t)snprintf(s + n, cap - n, "], \"cycles\": [");
    for (int k = 0; k < CYCLES; k++) {
        n += (size_t)snprintf(s + n, cap - n, "%s[", k ? "," : "");
        for (int i = 0; i < SAMPLES; i++) {
            double th = (-360.0 + 0.5 * i) / 57.29577951308232;
            double p = 1.0 + 40.0 * exp(-8.0 * th * th) + 0.05 * bench_urand(rng);
            n += (size_t)snprintf(s + n, cap - n, "%s%.5f", i ? "," : "", p);
        }
        n += (size_t)snprintf(s + n, cap - n, "]");
    }
    n += (size_t)snprintf(s + n, cap - n, "]}");
    body b = { s, n };
    return b;
}

/* One read of b into input (NULL: released at once); 0 when decoded. */
static int read_body(const gc_preset *p, body b, int scan_it, char *input)
{
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_POST;
    req.body = b.s;
    req.body_len = b.n;
    req.content_type = "application/json";
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    json_t *root = NULL;
    gc_api_scan scan;
    memset(&scan, 0, sizeof scan);
    int diagram = p->kind == GC_PRESET_CYCLE || p->svg;
    int rc = scan_it ? gc_api_scan_normalise(p, &req, diagram, &scan, &root, &resp)
                     : gc_decode_normalise_ex(&req, diagram, &root, &resp);
    free(resp.body);
    if (rc == 0) {
        gc_decode_ctx ctx;
        gc_decode_ctx_init(&ctx);
        ctx.scan = &scan;
        gc_api_errors errs;
        gc_api_errors_init(&errs);
        gc_preset_input_init(p, input);
        rc = gc_api_fields_decode(p, root, 0, input, "", &errs, &ctx);
    }
    json_decref(root);
    gc_api_scan_free(&scan);
    return rc;
}

/* The series of two decoded inputs, bit for bit. */
static int same_series(const gc_preset *p, const char *a, const char *b)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->type != GC_FT_SERIES && f->type != GC_FT_SERIES_LIST)
            continue;
        const double *xa = *(double *const *)(const void *)(a + f->offset);
        const double *xb = *(double *const *)(const void *)(b + f->offset);
        size_t n = (size_t)*(const int *)(const void *)(a + f->count - 1);
        if (f->type == GC_FT_SERIES_LIST)
            n *= (size_t)*(const int *)(const void *)(a + f->aux - 1);
        if (!xa || !xb || memcmp(xa, xb, n * sizeof *xa) != 0)
            return 0;
    }
    return 1;
}

/* Five batches of 8 reads each way; medians and bests in ms per body. */
static int run(const gc_preset *p, const body *bodies, double med[2], double best[2])
{
    double t[2][5];
    char *in[2] = { calloc(1, p->input_size), calloc(1, p->input_size) };
    int ok = 1;
    for (int batch = 0; batch < 5; batch++)
        for (int way = 0; way < 2; way++) {
            double t0 = bench_now_s();
            for (int i = 0; i < 8; i++) {
                if (i || batch || way)
                    gc_api_fields_release(p, in[way]);
                ok &= read_body(p, bodies[(i + batch) % N_BODIES], way, in[way]) == 0;
            }
            t[way][batch] = (bench_now_s() - t0) / 8 * 1e3;
            if (way == 1)
                ok &= same_series(p, in[0], in[1]);
        }
    for (int way = 0; way < 2; way++) {
        gc_api_fields_release(p, in[way]);
        free(in[way]);
        bench_sort5(t[way]);
        med[way] = t[way][2];
        best[way] = t[way][0];
    }
    return ok;
}

int main(void)
{
    const gc_preset *p = gc_preset_find("combustion");
    if (!p)
        return 1;
    uint64_t rng = 0x2545f4914f6cdd1dull;
    body bodies[N_BODIES];
    for (int i = 0; i < N_BODIES; i++)
        bodies[i] = make_body(&rng);
    double med[2], best[2];
    int ok = run(p, bodies, med, best);
    printf("bench-recording: JSON recording of %d cycles x %d samples (%zu KiB), read into the "
           "combustion route's input\n", CYCLES, SAMPLES, bodies[0].n / 1024);
    printf("  jansson (a json_t per number)   median %7.1f ms   best %7.1f ms\n", med[0], best[0]);
    printf("  scanner (series_scan.c)         median %7.1f ms   best %7.1f ms\n", med[1], best[1]);
    printf("  ratio jansson / scanner (median) %.1f; decoded series %s\n", med[0] / med[1],
           ok ? "identical" : "DIFFER");
    for (int i = 0; i < N_BODIES; i++)
        free(bodies[i].s);
    return ok ? 0 : 1;
}
