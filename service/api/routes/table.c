/*
 * table.c — the API layer's route table (api.h: gc_api_routes), built once
 * from the registry of presets (gascycle/preset.h): a route per preset
 * (/v1/cycles/<name>, /v1/measured/<segment>, all served by gc_api_h_preset),
 * the 404 of /v1/cycles/{preset}, and the fixed routes. The HTTP layer adds
 * the operational routes /healthz, /readyz and /metrics itself.
 * A new resource: write its handler, declare it in handlers.h, add a row to
 * `head` or `tail` and its path to openapi/openapi.json. A new preset needs
 * no row here (its registry line is enough).
 */
#include "api/handlers.h"
#include "gascycle/preset.h"

#include <pthread.h>
#include <stdio.h>
#include <string.h>

int gc_api_h_demo(const gc_api_request *req, gc_api_response *resp); /* demo.c: GET / */

static const gc_api_route head[] = {
    { "/", GC_M_GET, gc_api_h_demo, "demo", 0 },
    { "/openapi.json", GC_M_GET, gc_api_h_openapi, "openapi", 0 },
    { "/v1/gases", GC_M_GET, gc_api_h_gases, "gases", 0 },
    { "/v1/properties", GC_M_GET | GC_M_POST, gc_api_h_properties, "properties", 0 },
    { "/v1/properties/water", GC_M_GET | GC_M_POST, gc_api_h_water, "properties_water", 0 },
};

static const gc_api_route tail[] = {
    { "/v1/cycles/{preset}", GC_M_GET | GC_M_POST, gc_api_h_cycle_unknown, "cycles_unknown", 0 },
    { "/v1/sweeps", GC_M_GET | GC_M_POST, gc_api_h_sweeps, "sweeps", GC_ROUTE_HEAVY },
    { "/v1/targets", GC_M_GET | GC_M_POST, gc_api_h_targets, "targets", GC_ROUTE_HEAVY },
    { "/v1/batch", GC_M_POST, gc_api_h_batch, "batch", GC_ROUTE_HEAVY },
    { "/v1/uncertainty", GC_M_GET | GC_M_POST, gc_api_h_uncertainty, "uncertainty",
      GC_ROUTE_HEAVY },
    { "/v1/sensitivities", GC_M_GET | GC_M_POST, gc_api_h_sensitivities, "sensitivities",
      GC_ROUTE_HEAVY },
};

#define N(a) (sizeof a / sizeof a[0])
#define MAX_ROUTES 64

static gc_api_route table[MAX_ROUTES];
static char paths[MAX_ROUTES][64];
static size_t n_table;
static pthread_once_t once = PTHREAD_ONCE_INIT;

static void add(const gc_api_route *r)
{
    if (n_table < MAX_ROUTES)
        table[n_table++] = *r;
}

/* The presets of one kind, in registry order. */
static void add_presets(gc_preset_kind kind)
{
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    for (int i = 0; i < n && n_table < MAX_ROUTES; i++) {
        const gc_preset *p = all[i];
        if (p->kind != kind)
            continue;
        snprintf(paths[n_table], sizeof paths[n_table], "%s%s", gc_preset_route_base(p),
                 p->segment ? p->segment : p->name);
        unsigned flags = (p->heavy ? GC_ROUTE_HEAVY : 0u) |
                         (p->large_body ? GC_ROUTE_LARGE_BODY : 0u) |
                         (p->csv_body ? GC_ROUTE_CSV_BODY : 0u);
        gc_api_route r = { paths[n_table], GC_M_GET | GC_M_POST, gc_api_h_preset, p->label,
                           flags };
        add(&r);
    }
}

static void build(void)
{
    for (size_t i = 0; i < N(head); i++)
        add(&head[i]);
    add_presets(GC_PRESET_REDUCTION);
    add_presets(GC_PRESET_CYCLE);
    for (size_t i = 0; i < N(tail); i++)
        add(&tail[i]);
}

const gc_api_route *gc_api_routes(size_t *n_routes)
{
    pthread_once(&once, build);
    if (n_routes)
        *n_routes = n_table;
    return table;
}
