/*
 * openapi.c — GET /openapi.json: the OpenAPI 3.1 document built into the
 * binary from openapi/openapi.json (mk/api.mk generates gc_api_openapi_json).
 */
#include "api/handlers.h"
#include "api/respond/problem.h"

#include <stdlib.h>
#include <string.h>

int gc_api_h_openapi(const gc_api_request *req, gc_api_response *resp)
{
    (void)req;
    size_t n = strlen(gc_api_openapi_json);
    char *copy = malloc(n + 1);
    if (!copy)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    memcpy(copy, gc_api_openapi_json, n + 1);
    resp->status = 200;
    resp->content_type = GC_API_CT_JSON;
    resp->body = copy;
    resp->body_len = n;
    resp->cache_seconds = 0;
    return 0;
}
