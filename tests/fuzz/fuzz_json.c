/*
 * fuzz_json.c — libFuzzer target: the API layer's JSON body decoder
 * (decode.h, gc_decode_normalise for a POST) and its JSON writer
 * (jsonout.h), on an arbitrary body.
 *
 * Checks: a body is either decoded to a JSON object no deeper than the
 * nesting limit, or refused with a 4xx problem; whatever was decoded is
 * written back by gc_json_dump into text that jansson reads again to an
 * equal value (so no NaN, no Infinity, no lost member).
 */
#include "fuzz_common.h"
#include "api/request/decode.h"
#include "api/respond/jsonout.h"

#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_POST;
    req.path = "/fuzz";
    req.body = (const char *)data;
    req.body_len = size;
    req.content_type = "application/json";
    json_t *root = NULL;
    gc_api_response r;
    memset(&r, 0, sizeof r);
    if (gc_decode_normalise(&req, &root, &r) == 0) {
        if (!json_is_object(root))
            abort();
        size_t len = 0;
        char *text = gc_json_dump(root, 17, &len);
        if (!text)
            abort();
        json_error_t e;
        json_t *again = json_loadb(text, len, 0, &e);
        if (!again || !json_equal(root, again)) {
            fprintf(stderr, "fuzz: gc_json_dump wrote text jansson reads otherwise: %.300s\n", text);
            abort();
        }
        json_decref(again);
        free(text);
        json_decref(root);
    } else {
        if (r.status < 400 || r.status > 499)
            fuzz_fail("the body decoder refused without a 4xx", &r);
        fuzz_check_response(&r);
    }
    free(r.body);
    return 0;
}
