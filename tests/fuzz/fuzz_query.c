/*
 * fuzz_query.c — libFuzzer target: the HTTP layer's request-target parser
 * (service/http/query.c) and the API layer's query decoder (decode.h:
 * dotted keys into one JSON object), on an arbitrary request target.
 *
 * Checks: the parser keeps its limits (no more than 512 parameters, a
 * problem for a target over 16384 bytes), a refused target gives no
 * parameters to decode, no decoded key or value holds a NUL (a "%00" is
 * refused, never decoded), the JSON pointer of every key starts with '/',
 * and the decoder answers either a JSON object or a 4xx problem.
 */
#include "fuzz_common.h"
#include "api/request/decode.h"
#include "http/query.h"

#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gc_http_target t;
    gc_http_target_parse((const char *)data, size, 16384, 512, &t);
    if (t.problem == GC_TARGET_OK && size > 16384)
        abort();
    if (t.n_params > 512)
        abort();
    if (t.problem == GC_TARGET_TOO_MANY_PARAMS && t.counted <= 512)
        abort();
    if (t.problem != GC_TARGET_OK) {
        gc_http_target_free(&t);
        return 0;
    }
    for (size_t i = 0; i < t.n_params; i++) {
        char ptr[128];
        if (memmem(t.params[i].key, strlen(t.params[i].key) + 1, "\0", 1) !=
            t.params[i].key + strlen(t.params[i].key))
            abort();
        gc_http_key_pointer(t.params[i].key, ptr, sizeof ptr);
        if (ptr[0] != '/')
            abort();
    }
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_GET;
    req.path = t.path;
    req.query = t.params;
    req.n_query = t.n_params;
    json_t *root = NULL;
    gc_api_response r;
    memset(&r, 0, sizeof r);
    if (gc_decode_normalise(&req, &root, &r) == 0) {
        if (!json_is_object(root))
            abort();
        json_decref(root);
    } else {
        if (r.status < 400 || r.status > 499)
            fuzz_fail("the query decoder refused without a 4xx", &r);
        fuzz_check_response(&r);
    }
    free(r.body);
    gc_http_target_free(&t);
    return 0;
}
