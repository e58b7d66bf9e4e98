/*
 * registry.c — the one list of preset descriptors (preset.h): the API's
 * routes, its 404 list of presets, the composite routes and the OpenAPI
 * generator all read it. Order: the cycle presets in the order of the 404
 * list, then the measured-data reductions. A new preset is one line here
 * (and its extern in presets.h).
 */
#include "core/presets/presets.h"

#include <string.h>

static const gc_preset *const registry[] = {
    &gc_preset_otto,
    &gc_preset_diesel,
    &gc_preset_dual,
    &gc_preset_atkinson,
    &gc_preset_miller,
    &gc_preset_stirling,
    &gc_preset_ericsson,
    &gc_preset_lenoir,
    &gc_preset_carnot,
    &gc_preset_brayton,
    &gc_preset_custom,
    &gc_preset_turbojet,
    &gc_preset_stations,
    &gc_preset_trace,
};

const gc_preset *const *gc_presets(int *n)
{
    if (n)
        *n = (int)(sizeof registry / sizeof registry[0]);
    return registry;
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
