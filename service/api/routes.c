/*
 * routes.c — the API layer's route table (api.h: gc_api_routes). The HTTP
 * layer adds the operational routes /healthz, /readyz and /metrics itself.
 * A new resource: write service/api/<resource>.c, declare its handler in
 * handlers.h, add a row here and its path to openapi/openapi.json (the
 * contract test fails for a route whose responses the document lacks).
 */
#include "api/handlers.h"

int gc_api_h_demo(const gc_api_request *req, gc_api_response *resp); /* demo.c: GET / */

static const gc_api_route routes[] = {
    { "/", GC_M_GET, gc_api_h_demo, "demo" },
    { "/openapi.json", GC_M_GET, gc_api_h_openapi, "openapi" },
    { "/v1/gases", GC_M_GET, gc_api_h_gases, "gases" },
    { "/v1/properties", GC_M_GET | GC_M_POST, gc_api_h_properties, "properties" },
};

const gc_api_route *gc_api_routes(size_t *n_routes)
{
    if (n_routes)
        *n_routes = sizeof routes / sizeof routes[0];
    return routes;
}
