/*
 * validity_out.h — private to the API layer: the real-gas and dissociation
 * warnings of gascycle/validity.h in a response's "warnings", the same
 * codes and sentences on every route. Warning codes: "real_gas" (a state
 * whose ideal-gas v or cp is 1 % or more off, with the figures),
 * "real_gas_not_estimated" (a gas that is not air-like above 1 MPa) and
 * "dissociation" (a state where CO2 would be 1 % or more dissociated). Each
 * names the worst state and how many states cross the limit.
 */
#ifndef GC_API_VALIDITY_OUT_H
#define GC_API_VALIDITY_OUT_H

#include "api/respond/output.h"
#include "gascycle/cycle.h"
#include "gascycle/validity.h"

/* One warning per rule that fired in the scan (field may be NULL). */
void gc_api_validity_warn(gc_out *o, const gc_validity_scan *s, const char *field);

/* Scans the actual run of a cycle result and, when it is evaluated apart,
 * its ideal counterpart (states labelled "ideal state <n>"), and warns. */
void gc_api_validity_warn_cycle(gc_out *o, const gc_cycle_result *r);

#endif
