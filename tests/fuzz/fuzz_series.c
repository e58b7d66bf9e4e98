/*
 * fuzz_series.c — libFuzzer target: the JSON body's series scanner
 * (service/api/request/series_scan.c) against jansson, differentially.
 *
 * Input: a POST body for /v1/measured/combustion (the preset with a SERIES
 * and a SERIES_LIST row). It is decoded twice into the preset's input:
 * through jansson alone (gc_decode_normalise_ex, then the field decoder) and
 * through the scanner (gc_api_scan_normalise, the decoder taking the scanned
 * values). Both ways must give the same normaliser outcome (status and
 * problem body byte for byte), the same field errors (pointer and sentence,
 * in order) and the same decoded series bit for bit; any difference aborts.
 * The body is copied to a buffer of its exact size (no NUL), as the HTTP
 * layer passes it, so an overread shows under ASan.
 */
#include "api/api.h"
#include "api/request/decode.h"
#include "api/request/fields.h"
#include "api/request/series_scan.h"
#include "gascycle/preset.h"

#include <jansson.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

typedef struct {
    int rc, status;
    char *problem;
    size_t problem_len;
    gc_api_errors errs;
    char *input;
} outcome;

static void decode_way(const gc_preset *p, const char *body, size_t len, int scan_it,
                       outcome *o)
{
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_POST;
    req.body = body;
    req.body_len = len;
    req.content_type = "application/json";
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    memset(o, 0, sizeof *o);
    json_t *root = NULL;
    gc_api_scan scan;
    memset(&scan, 0, sizeof scan);
    int diagram = p->kind == GC_PRESET_CYCLE || p->svg;
    o->rc = scan_it ? gc_api_scan_normalise(p, &req, diagram, &scan, &root, &resp)
                    : gc_decode_normalise_ex(&req, diagram, &root, &resp);
    o->status = resp.status;
    o->problem = resp.body;
    o->problem_len = resp.body_len;
    gc_api_errors_init(&o->errs);
    if (o->rc == 0) {
        gc_decode_ctx ctx;
        gc_decode_ctx_init(&ctx);
        ctx.scan = &scan;
        o->input = calloc(1, p->input_size);
        if (!o->input)
            abort();
        gc_preset_input_init(p, o->input);
        gc_api_fields_decode(p, root, 0, o->input, "", &o->errs, &ctx);
    }
    json_decref(root);
    gc_api_scan_free(&scan);
}

static int same_series(const gc_preset *p, const char *a, const char *b)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->type != GC_FT_SERIES && f->type != GC_FT_SERIES_LIST)
            continue;
        const double *xa = *(double *const *)(const void *)(a + f->offset);
        const double *xb = *(double *const *)(const void *)(b + f->offset);
        int na = *(const int *)(const void *)(a + f->count - 1);
        int nb = *(const int *)(const void *)(b + f->count - 1);
        int la = 1, lb = 1;
        if (f->type == GC_FT_SERIES_LIST) {
            la = *(const int *)(const void *)(a + f->aux - 1);
            lb = *(const int *)(const void *)(b + f->aux - 1);
        }
        if (na != nb || la != lb || (!xa) != (!xb))
            return 0;
        if (xa && memcmp(xa, xb, (size_t)na * (size_t)la * sizeof *xa) != 0)
            return 0;
    }
    return 1;
}

static int same_errors(const gc_api_errors *a, const gc_api_errors *b)
{
    if (a->n != b->n || a->dropped != b->dropped)
        return 0;
    for (int i = 0; i < a->n; i++)
        if (strcmp(a->e[i].field, b->e[i].field) || strcmp(a->e[i].message, b->e[i].message))
            return 0;
    return 1;
}

static void release(const gc_preset *p, outcome *o)
{
    if (o->input) {
        gc_api_fields_release(p, o->input);
        free(o->input);
    }
    free(o->problem);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    static const gc_preset *p;
    if (!p)
        p = gc_preset_find("combustion");
    if (!p)
        abort();
    char *body = malloc(size ? size : 1);
    if (!body)
        return 0;
    memcpy(body, data, size);
    outcome a, b;
    decode_way(p, body, size, 0, &a);
    decode_way(p, body, size, 1, &b);
    int same = a.rc == b.rc && a.status == b.status && a.problem_len == b.problem_len &&
               (!a.problem_len || memcmp(a.problem, b.problem, a.problem_len) == 0) &&
               same_errors(&a.errs, &b.errs) && (a.rc != 0 || same_series(p, a.input, b.input));
    release(p, &a);
    release(p, &b);
    free(body);
    if (!same)
        abort();
    return 0;
}
