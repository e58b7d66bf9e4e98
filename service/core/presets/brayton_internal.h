/*
 * brayton_internal.h — private to the Brayton preset's files: the
 * descriptor (brayton.c), its output table (brayton_outputs.c) and the
 * chain, evaluation and searches (brayton_cycle.c).
 */
#ifndef GC_CORE_BRAYTON_INTERNAL_H
#define GC_CORE_BRAYTON_INTERNAL_H

#include "gascycle/brayton.h"
#include "gascycle/preset.h"

#define GC__BRAYTON_N_OUTPUTS 68
extern const gc_output gc__brayton_outputs[GC__BRAYTON_N_OUTPUTS];

/* gc_site_member -> field id */
extern const int gc__brayton_site_field[5];

/* 1 when heat comes from a fuel (heat_mode, or a fuel given). */
int gc__brayton_fuel_mode(const gc_brayton_input *in);

/* The checks between inputs (table: also every single input's bounds, for
 * in-process callers), errors into rep; GC_OK or the first code. */
int gc__brayton_check(const gc_brayton_input *in, int table, gc_report *rep);

/* Resolves the site, builds, evaluates and fills r (inputs checked). */
int gc__brayton_evaluate(const gc_brayton_input *in, gc_brayton_result *r, gc_error *err);

/* The result's warnings, the cold-model note and the validity notes into rep. */
void gc__brayton_report(const gc_brayton_input *in, const gc_brayton_result *r, gc_report *rep);

#endif
