/*
 * turbojet_internal.h — private to the turbojet preset's files: the
 * descriptor (turbojet.c) and the chain, passes and figures
 * (turbojet_cycle.c).
 */
#ifndef GC_CORE_TURBOJET_INTERNAL_H
#define GC_CORE_TURBOJET_INTERNAL_H

#include "gascycle/preset.h"
#include "gascycle/turbojet.h"

/* gc_site_member -> field id (the site's altitude: GC_TF_ALTITUDE when the
 * request gave `altitude`, see gc__turbojet_evaluate) */
extern const int gc__turbojet_site_field[5];

/* The checks between inputs (table: also every single input's bounds, for
 * in-process callers), errors into rep; GC_OK or the first code. */
int gc__turbojet_check(const gc_turbojet_input *in, int table, gc_report *rep);

/* Resolves the flight condition, runs the passes and fills r (inputs
 * checked); errors by field id. */
int gc__turbojet_evaluate(const gc_turbojet_input *in, gc_turbojet_result *r, gc_error *err);

#endif
