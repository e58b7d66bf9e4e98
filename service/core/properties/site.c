/*
 * site.c — resolves site (ambient) conditions into the compressor-inlet
 * state and humid air; see gascycle/site.h for the rules, units and sources.
 */
#include "gascycle/site.h"

#include "gascycle/atmosphere.h"
#include "gascycle/humid.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

void gc_site_input_init(gc_site_input *in)
{
    if (in == NULL)
        return;
    memset(in, 0, sizeof *in);
}

static const char *const member_path[] = {
    [GC_SITE_M_NONE] = "/site", [GC_SITE_M_ALTITUDE] = "/site/altitude",
    [GC_SITE_M_TEMPERATURE] = "/site/temperature", [GC_SITE_M_PRESSURE] = "/site/pressure",
    [GC_SITE_M_RELATIVE_HUMIDITY] = "/site/relative_humidity" };

static void site_warn(gc_site *s, gc_site_member m, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));

static void site_warn(gc_site *s, gc_site_member m, const char *fmt, ...)
{
    if (s->n_warnings >= GC_SITE_MAX_WARNINGS)
        return;
    gc_site_warning *w = &s->warnings[s->n_warnings++];
    w->member = m;
    snprintf(w->field, sizeof w->field, "%s", member_path[m]);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(w->message, sizeof w->message, fmt, ap);
    va_end(ap);
}

/* Re-points a lower layer's error at the site input that caused it. */
static int site_refield(gc_error *err, int rc, gc_site_member m)
{
    if (err != NULL && rc != GC_OK) {
        snprintf(err->field, sizeof err->field, "%s", member_path[m]);
        err->field_id = (int)m;
    }
    return rc;
}

/* The pressure: given (compared with the atmosphere's at a given altitude),
 * the atmosphere's, or ISO's. */
static int site_pressure(const gc_site_input *in, gc_site *out, gc_error *err)
{
    if (!in->has_pressure) {
        out->P_Pa = in->has_altitude ? out->P_atm_Pa : GC_SITE_ISO_P_PA;
        out->P_from = in->has_altitude ? GC_SITE_FROM_ATMOSPHERE : out->P_from;
        return GC_OK;
    }
    if (!isfinite(in->P_Pa) || !(in->P_Pa > 0.0))
        return site_refield(err, gc_error_set(err, GC_ERR_INVALID, NULL, "site pressure "
                                               "must be a positive absolute pressure"),
                            GC_SITE_M_PRESSURE);
    out->P_Pa = in->P_Pa;
    out->P_from = GC_SITE_FROM_INPUT;
    if (!in->has_altitude)
        return GC_OK;
    double d = (out->P_Pa - out->P_atm_Pa) / out->P_atm_Pa;
    if (fabs(d) > GC_SITE_P_CONFLICT_FRACTION)
        site_warn(out, GC_SITE_M_PRESSURE,
                  "the given pressure (%.3f kPa) differs by %+.1f %% from the U.S. "
                  "Standard Atmosphere 1976 pressure at %.0f m (%.3f kPa) and is used; "
                  "check that it is absolute and that the altitude is in metres",
                  out->P_Pa / 1e3, 100.0 * d, out->altitude_m, out->P_atm_Pa / 1e3);
    else
        site_warn(out, GC_SITE_M_PRESSURE,
                  "the given pressure (%.3f kPa) overrides the U.S. Standard "
                  "Atmosphere 1976 pressure at %.0f m (%.3f kPa, %+.1f %%)",
                  out->P_Pa / 1e3, out->altitude_m, out->P_atm_Pa / 1e3, 100.0 * d);
    return GC_OK;
}

/* Relative humidity, water content (ASHRAE 2017 ch. 1) and the humid air. */
static int site_humidity(const gc_site_input *in, gc_site *out, gc_error *err)
{
    if (in->has_relative_humidity) {
        out->RH = in->RH;
        out->RH_from = GC_SITE_FROM_INPUT;
    } else {
        out->RH = GC_SITE_ISO_RH;
    }
    int rc = gc_humid_W_from_RH(out->T_K, out->P_Pa, out->RH, &out->W_kg_per_kg, err);
    if (rc != GC_OK)
        return site_refield(err, rc, rc == GC_ERR_RANGE ? GC_SITE_M_TEMPERATURE
                                                        : GC_SITE_M_RELATIVE_HUMIDITY);
    if (out->T_K < GC_HUMID_T_TRIPLE_K && out->RH > 0.0)
        site_warn(out, GC_SITE_M_RELATIVE_HUMIDITY,
                  "below 0.01 degC the relative humidity is taken over ice (ASHRAE 2017 "
                  "ch. 1 eq. 5), not over supercooled water as weather reports give it");
    (void)gc_humid_pv_from_W(out->W_kg_per_kg, out->P_Pa, &out->pv_Pa, NULL);
    out->x_H2O = gc_humid_x_from_W(out->W_kg_per_kg);
    /* the compressor inlet's working fluid */
    rc = gc_gas_init_humid_air(&out->gas, out->W_kg_per_kg, err);
    if (rc != GC_OK)
        return site_refield(err, rc, GC_SITE_M_RELATIVE_HUMIDITY);
    rc = gc_gas_check_T(&out->gas, out->T_K, NULL, err);
    return rc == GC_OK ? GC_OK : site_refield(err, rc, GC_SITE_M_TEMPERATURE);
}

int gc_site_resolve(const gc_site_input *in, gc_site *out, gc_error *err)
{
    gc_site_input none;
    int rc;
    if (in == NULL) {
        gc_site_input_init(&none);
        in = &none;
    }
    memset(out, 0, sizeof *out);
    /* altitude: U.S. Standard Atmosphere 1976 */
    if (in->has_altitude) {
        rc = gc_atm_1976(in->altitude_m, &out->T_atm_K, &out->P_atm_Pa, err);
        if (rc != GC_OK)
            return site_refield(err, rc, GC_SITE_M_ALTITUDE);
        out->altitude_m = in->altitude_m;
        out->altitude_from = GC_SITE_FROM_INPUT;
    }
    /* temperature */
    if (in->has_temperature) {
        out->T_K = in->T_K;
        out->T_from = GC_SITE_FROM_INPUT;
    } else if (in->has_altitude) {
        out->T_K = out->T_atm_K;
        out->T_from = GC_SITE_FROM_ATMOSPHERE;
    } else {
        out->T_K = GC_SITE_ISO_T_K;
    }
    rc = gc_humid_check_T(out->T_K, NULL, err);
    if (rc != GC_OK)
        return site_refield(err, rc, GC_SITE_M_TEMPERATURE);
    rc = site_pressure(in, out, err);
    return rc == GC_OK ? site_humidity(in, out, err) : rc;
}
