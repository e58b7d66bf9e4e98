/*
 * localise.h — private to the API layer: the figures of a message in the
 * units the user wrote (issue 17: "must be at most 2000 MW", not "2e+09 W").
 *
 * A figure is "<number> <unit>" where the unit is an SI base unit as the
 * core writes its sentences (K, Pa, W, J, J/kg, J/(kg K), kg/s, m3/kg) or a
 * label of either output system (kPa, kW, psia, R, ...). Figures of the
 * dimension of the value's quantity are written in the unit the user wrote
 * for that value (a gauge unit shown as its absolute counterpart: barg as
 * bar); the other SI base figures in the unit system of the answer
 * (W as kW, Pa as kPa or psia). Numbers with 6 significant digits.
 */
#ifndef GC_API_LOCALISE_H
#define GC_API_LOCALISE_H

#include "gascycle/units.h"

#include <stddef.h>

/* Rewrites the figures of msg (NUL-terminated, buffer size n) in place. q:
 * the value's quantity, or -1 (none); written: the unit the user wrote for
 * it (NULL or "": none); sys: the answer's unit system. */
void gc_api_localise(char *msg, size_t n, int q, const char *written, gc_unit_system sys);

#endif
