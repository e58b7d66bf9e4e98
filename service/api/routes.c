/*
 * routes.c — the API layer's route table (api.h: gc_api_routes). The HTTP
 * layer adds the operational routes /healthz, /readyz and /metrics itself.
 * A new resource: write service/api/<resource>.c, declare its handler in
 * handlers.h, add a row here and its path to openapi/openapi.json (the
 * contract test fails for a route whose responses the document lacks).
 */
#include "api/cycle_out.h"
#include "api/handlers.h"

int gc_api_h_demo(const gc_api_request *req, gc_api_response *resp); /* demo.c: GET / */

static const gc_api_route routes[] = {
    { "/", GC_M_GET, gc_api_h_demo, "demo" },
    { "/openapi.json", GC_M_GET, gc_api_h_openapi, "openapi" },
    { "/v1/gases", GC_M_GET, gc_api_h_gases, "gases" },
    { "/v1/properties", GC_M_GET | GC_M_POST, gc_api_h_properties, "properties" },
    { "/v1/measured/stations", GC_M_GET | GC_M_POST, gc_api_h_measured_stations, "measured_stations" },
    { "/v1/measured/pressure-trace", GC_M_GET | GC_M_POST, gc_api_h_measured_trace, "measured_trace" },
    { "/v1/cycles/otto", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_otto" },
    { "/v1/cycles/diesel", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_diesel" },
    { "/v1/cycles/dual", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_dual" },
    { "/v1/cycles/atkinson", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_atkinson" },
    { "/v1/cycles/miller", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_miller" },
    { "/v1/cycles/stirling", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_stirling" },
    { "/v1/cycles/ericsson", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_ericsson" },
    { "/v1/cycles/lenoir", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_lenoir" },
    { "/v1/cycles/carnot", GC_M_GET | GC_M_POST, gc_api_h_cycle_piston, "cycles_carnot" },
    { "/v1/cycles/brayton", GC_M_GET | GC_M_POST, gc_api_h_cycle_brayton, "cycles_brayton" },
    { "/v1/cycles/custom", GC_M_GET | GC_M_POST, gc_api_h_cycle_custom, "cycles_custom" },
    { "/v1/cycles/turbojet", GC_M_GET | GC_M_POST, gc_api_h_cycle_turbojet, "cycles_turbojet" },
    { "/v1/cycles/{preset}", GC_M_GET | GC_M_POST, gc_api_h_cycle_unknown, "cycles_unknown" },
    { "/v1/sweeps", GC_M_GET | GC_M_POST, gc_api_h_sweeps, "sweeps" },
    { "/v1/targets", GC_M_GET | GC_M_POST, gc_api_h_targets, "targets" },
    { "/v1/batch", GC_M_POST, gc_api_h_batch, "batch" },
};

const gc_api_route *gc_api_routes(size_t *n_routes)
{
    if (n_routes)
        *n_routes = sizeof routes / sizeof routes[0];
    return routes;
}
