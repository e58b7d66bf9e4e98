/*
 * preset_util.c — private helpers shared by the core's preset modules (see
 * preset_util.h): the validators' error list, the efficiency and
 * pressure-loss checks, the heat-addition step.
 */
#include "core/preset_util.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>

void gc__errlist_add(gc__errlist *L, int code, const char *field, const char *fmt, ...)
{
    if (L->n == 0)
        L->first = code;
    if (L->n < L->max && L->errs != NULL) {
        gc_error *e = &L->errs[L->n];
        va_list ap;
        gc_error_clear(e);
        e->code = code;
        snprintf(e->field, sizeof e->field, "%s", field);
        va_start(ap, fmt);
        vsnprintf(e->message, sizeof e->message, fmt, ap);
        va_end(ap);
    }
    L->n++;
}

int gc__errlist_finish(const gc__errlist *L, int *n_errors)
{
    if (n_errors != NULL)
        *n_errors = L->n;
    return L->n == 0 ? GC_OK : L->first;
}

void gc__check_eff(gc__errlist *L, double x, const char *field)
{
    if (!isfinite(x) || !(x > 0.0) || x > 1.0)
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be greater than 0 and at most 1");
}

void gc__check_loss(gc__errlist *L, double x, const char *field)
{
    if (!isfinite(x) || x < 0.0 || x > GC__LOSS_MAX)
        gc__errlist_add(L, GC_ERR_INVALID, field, "must be a fraction from 0 to %g",
                        GC__LOSS_MAX);
}

gc_step *gc__add_heat_step(gc_cycle *c, double T_K, const char *field, double loss,
                           const char *loss_field, const gc_fuel *fuel, double eta,
                           double T_fuel_K)
{
    gc_step *s = gc_cycle_add(c, fuel ? GC_PROC_FUEL : GC_PROC_CONST_PRESSURE,
                              GC_END_TEMPERATURE, T_K, field);
    if (s == NULL)
        return NULL;
    s->heat_sign = 1;
    s->pressure_loss = loss;
    snprintf(s->field_aux, GC_CYCLE_FIELD_LEN, "%s", loss_field);
    if (fuel) {
        s->efficiency = eta;
        s->fuel.fuel = fuel;
        s->fuel.T_fuel_K = T_fuel_K > 0.0 ? T_fuel_K : GC_T_REF_K;
    }
    return s;
}
