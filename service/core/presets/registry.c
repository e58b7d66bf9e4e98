/*
 * registry.c — the one list of preset descriptors (preset.h): the API's
 * routes, the composite routes' list of presets, the 404 answer of an
 * unknown preset and the OpenAPI generator all read it. Order: the cycle
 * presets, then the measured-data reductions. A new preset is one line of
 * GC_REGISTRY (its descriptor gc_preset_<name> is declared here from it).
 */
#include "core/presets/presets.h"

#include <string.h>

#define GC_REGISTRY(X)                                                                         \
    X(otto) X(diesel) X(dual) X(atkinson) X(miller) X(stirling) X(ericsson) X(lenoir)         \
    X(carnot) X(brayton) X(custom) X(turbojet) X(combined)                                    \
    X(stations) X(trace) X(combustion)                                                         \
    X(machine_site) X(machine_corrections) X(machine_readings)

#define DECLARE(name) extern const gc_preset gc_preset_##name;
#define ADDRESS(name) &gc_preset_##name,

GC_REGISTRY(DECLARE)

static const gc_preset *const registry[] = { GC_REGISTRY(ADDRESS) };

const gc_preset *const *gc_presets(int *n)
{
    if (n)
        *n = (int)(sizeof registry / sizeof registry[0]);
    return registry;
}

const char *gc_preset_route_base(const gc_preset *p)
{
    if (p->route_base)
        return p->route_base;
    return p->kind == GC_PRESET_CYCLE ? "/v1/cycles/" : "/v1/measured/";
}

const gc_preset *gc_preset_at_path(const char *path)
{
    if (path == NULL)
        return NULL;
    for (size_t i = 0; i < sizeof registry / sizeof registry[0]; i++) {
        const gc_preset *p = registry[i];
        const char *base = gc_preset_route_base(p);
        size_t n = strlen(base);
        if (strncmp(path, base, n) == 0 &&
            strcmp(path + n, p->segment ? p->segment : p->name) == 0)
            return p;
    }
    return NULL;
}

const gc_preset *gc_preset_find(const char *name)
{
    if (name == NULL)
        return NULL;
    for (size_t i = 0; i < sizeof registry / sizeof registry[0]; i++) {
        const gc_preset *p = registry[i];
        if (strcmp(p->name, name) == 0 || (p->segment && strcmp(p->segment, name) == 0))
            return p;
    }
    return NULL;
}
