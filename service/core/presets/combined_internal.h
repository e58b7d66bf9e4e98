/*
 * combined_internal.h — private to the combined-cycle preset's files
 * (combined.c: tables and descriptor; combined_eval.c: the evaluation;
 * combined_plant.c: plant figures, states, exergy, bounds and checks;
 * combined_topping.c: the topping adapters; combined_svg.c: its diagrams).
 * Prefix gc__combined_. Units: SI.
 */
#ifndef GC_CORE_COMBINED_INTERNAL_H
#define GC_CORE_COMBINED_INTERNAL_H

#include "gascycle/combined.h"

extern const gc_preset gc_preset_combined;
extern const gc_preset gc__combined_exhaust_preset;

/* The topping entry of in (its index checked), or NULL. */
const gc_combined_topping *gc__combined_topping_of(const gc_combined_input *in);

/* The steam core's input from ours and the topping's exhaust. */
void gc__combined_steam_input(const gc_combined_input *in, const gc_combined_exhaust *x,
                              gc_steam_input *s);

/* Physical flow exergy of gas g at (T, P) against (T0, P0), J/kg. */
double gc__combined_gas_exergy(const gc_gas *g, double T, double P, double T0, double P0);

/* The field id (and list index) of a steam.h input pointer ("/levels/1/pinch",
 * "/fuel"), GC_CF_TOPPING for the inputs the topping supplies. */
int gc__combined_field_of(const char *pointer, int *index);

/* After the topping and the steam cycle ran: plant figures, states,
 * processes, T-Q data, exergy, bounds and checks (GC_ERR_CHECK beyond
 * tolerance, into rep). */
int gc__combined_plant(const gc_combined_input *in, gc_combined_result *r, gc_report *rep);

/* The ideal bounds (combined.h). */
void gc__combined_ideal(const gc_combined_input *in, gc_combined_result *r, gc_report *rep);

/* The descriptor's diagrams hook (combined_svg.c) and its names. */
extern const char *const gc__combined_diagrams[];
struct gc_diagram_options;
int gc__combined_svg(const void *input, const void *result, const char *diagram,
                     const struct gc_diagram_options *opt, char **svg, size_t *len,
                     gc_error *err);

/* The output table (combined_outputs.c). */
#define GC__COMBINED_N_OUTPUTS 122
extern const gc_output gc__combined_outputs[GC__COMBINED_N_OUTPUTS];

/* The descriptor's evaluate hook (combined_eval.c). */
int gc__combined_evaluate(const void *input, void *result, gc_report *rep);

#endif
