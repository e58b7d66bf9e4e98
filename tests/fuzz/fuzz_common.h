/*
 * fuzz_common.h — shared by the libFuzzer targets of tests/fuzz: the checks
 * every answer of a route handler must pass (issue 12: no crash, no 5xx
 * other than a 503 for a limit, no NaN or Infinity in a body, a JSON
 * content type carries JSON that parses, a problem document has type,
 * title, the status, a detail and a field and message in every error),
 * failing with abort() so that libFuzzer records the input as a crash.
 */
#ifndef GC_FUZZ_COMMON_H
#define GC_FUZZ_COMMON_H

#include "api/api.h"

#include <jansson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void fuzz_fail(const char *what, const gc_api_response *r)
{
    fprintf(stderr, "fuzz: %s (status %d, %.*s)\n", what, r->status,
            (int)(r->body_len > 400 ? 400 : r->body_len), r->body ? r->body : "");
    abort();
}

/* Checks one response; frees nothing. */
static void fuzz_check_response(const gc_api_response *r)
{
    if (r->status < 100 || r->status > 599)
        fuzz_fail("status out of range", r);
    if (r->status >= 500 && r->status != 503)
        fuzz_fail("a 5xx answer", r);
    if (!r->body || r->body_len == 0)
        return;
    const char *ct = r->content_type ? r->content_type : "";
    if (strstr(ct, "json")) {
        json_error_t e;
        json_t *j = json_loadb(r->body, r->body_len, JSON_DECODE_ANY, &e);
        if (!j)
            fuzz_fail("a JSON body that does not parse (NaN or Infinity?)", r);
        if (strstr(ct, "problem+json")) {
            if (!json_is_string(json_object_get(j, "type")) ||
                !json_is_string(json_object_get(j, "title")) ||
                json_integer_value(json_object_get(j, "status")) != r->status ||
                !json_is_string(json_object_get(j, "detail")))
                fuzz_fail("a problem document without type, title, status or detail", r);
            size_t i;
            json_t *it;
            json_array_foreach(json_object_get(j, "errors"), i, it)
                if (!json_is_string(json_object_get(it, "field")) ||
                    !json_is_string(json_object_get(it, "message")))
                    fuzz_fail("a problem error without field or message", r);
        }
        json_decref(j);
    } else if (strncmp(ct, "text/", 5) == 0) {
        /* CSV and select answers: no "nan" or "inf" written for a number */
        for (size_t i = 0; i + 3 <= r->body_len; i++) {
            const char *p = r->body + i;
            int start = i == 0 || !((p[-1] >= 'a' && p[-1] <= 'z') || (p[-1] >= 'A' && p[-1] <= 'Z'));
            if (start && (strncasecmp(p, "nan", 3) == 0 || strncasecmp(p, "inf", 3) == 0)) {
                size_t k = i + 3;
                int word_end = k >= r->body_len || !((r->body[k] >= 'a' && r->body[k] <= 'z') ||
                                                     (r->body[k] >= 'A' && r->body[k] <= 'Z'));
                if (word_end || strncasecmp(p, "infinity", 8) == 0)
                    fuzz_fail("nan or inf in a text body", r);
            }
        }
    }
}

#endif
