/*
 * presets.h — private to the core: every preset descriptor, for the registry
 * (registry.c declares its own from its list) and the families that dispatch
 * on them (the piston family).
 */
#ifndef GC_CORE_PRESETS_H
#define GC_CORE_PRESETS_H

#include "gascycle/preset.h"

extern const gc_preset gc_preset_otto;
extern const gc_preset gc_preset_diesel;
extern const gc_preset gc_preset_dual;
extern const gc_preset gc_preset_atkinson;
extern const gc_preset gc_preset_miller;
extern const gc_preset gc_preset_stirling;
extern const gc_preset gc_preset_ericsson;
extern const gc_preset gc_preset_lenoir;
extern const gc_preset gc_preset_carnot;
extern const gc_preset gc_preset_brayton;
extern const gc_preset gc_preset_turbojet;
extern const gc_preset gc_preset_custom;
extern const gc_preset gc_preset_stations;
extern const gc_preset gc_preset_trace;
extern const gc_preset gc_preset_combustion;

#endif
