/*
 * preset_util.h — private helpers shared by the core's preset modules
 * (brayton.c, turbojet.c, measured.c); not part of the public contract in
 * include/gascycle/. An error list for validators that report every bad
 * input at once, the common efficiency and pressure-loss checks, and the
 * heat-addition step of the flow-frame presets.
 *
 * Units: SI (K); efficiencies and pressure losses are fractions.
 */
#ifndef GC_CORE_PRESET_UTIL_H
#define GC_CORE_PRESET_UTIL_H

#include "gascycle/combustion.h"
#include "gascycle/cycle.h"
#include "gascycle/error.h"

#define GC__LOSS_MAX 0.5   /* largest accepted fractional pressure loss */

/* Error list of the validators: errs has room for max records (errs may be
 * NULL: only counted); n counts every error, first is the first one's code. */
typedef struct gc__errlist {
    gc_error *errs;
    int max, n, first;
} gc__errlist;

/* Appends one error (code, JSON pointer field, printf-style message). */
void gc__errlist_add(gc__errlist *L, int code, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
/* *n_errors = L->n (n_errors may be NULL); GC_OK, or the first error's code. */
int gc__errlist_finish(const gc__errlist *L, int *n_errors);

/* An efficiency: greater than 0 and at most 1. */
void gc__check_eff(gc__errlist *L, double x, const char *field);
/* A fractional pressure loss: from 0 to GC__LOSS_MAX. */
void gc__check_loss(gc__errlist *L, double x, const char *field);

/* Appends a heat-addition step to T_K (a constant-pressure heater, or with
 * fuel != NULL a burner with efficiency eta and fuel supplied at T_fuel_K,
 * 0 = GC_T_REF_K) with the fractional pressure loss of its field loss_field;
 * field names the end temperature's input. The step's label is left to the
 * caller. NULL when the chain is full. */
gc_step *gc__add_heat_step(gc_cycle *c, double T_K, const char *field, double loss,
                           const char *loss_field, const gc_fuel *fuel, double eta,
                           double T_fuel_K);

#endif
