/*
 * site.h — ambient (site) conditions at the inlet of a flow cycle: altitude,
 * temperature, pressure and relative humidity, resolved into a complete state
 * and the humid air that enters the compressor.
 *
 * Resolution, each input optional:
 *   - nothing given: the ISO standard reference conditions for gas-turbine
 *     ratings, 15 °C, 101.325 kPa, 60 % relative humidity (ISO 3977-2 and
 *     ISO 2314; the clause is not cited here: common practice in the trade);
 *   - altitude given: pressure and, unless given, temperature from the U.S.
 *     Standard Atmosphere 1976 (gascycle/atmosphere.h);
 *   - a given temperature or pressure always wins; a pressure given together
 *     with an altitude overrides the atmosphere's pressure and a warning says
 *     so (with the size of the difference);
 *   - relative humidity defaults to 60 %; water content by ASHRAE 2017 ch. 1
 *     (gascycle/humid.h), relative to ice below the triple point (warned).
 * The altitude, when given, has no other effect (gravity and the like are not
 * modelled).
 *
 * Units: altitude in m (geometric, above mean sea level), T in K, P in Pa,
 * RH as a fraction 0..1, humidity ratio in kg water per kg dry air.
 * Errors and warnings name the member at fault (gc_site_member: in
 * err->field_id and gc_site_warning.member), which a preset maps to its own
 * field ids; for callers that read text, also as a path under "/site".
 */
#ifndef GASCYCLE_SITE_H
#define GASCYCLE_SITE_H

#include "gascycle/error.h"
#include "gascycle/gas.h"

#define GC_SITE_ISO_T_K 288.15        /* 15 °C, ISO reference temperature */
#define GC_SITE_ISO_P_PA 101325.0     /* 101.325 kPa, ISO reference pressure */
#define GC_SITE_ISO_RH 0.60           /* 60 %, ISO reference relative humidity */

/* A given pressure that differs from the standard atmosphere's at the given
 * altitude by more than this fraction gets a sharper warning (a likely gauge
 * pressure, or feet taken for metres). Weather moves the pressure by a few
 * per cent: common practice. */
#define GC_SITE_P_CONFLICT_FRACTION 0.10

#define GC_SITE_MAX_WARNINGS 4
#define GC_SITE_WARNING_LEN 256

/* Inputs: each value counts only when its has_ flag is non-zero. */
typedef struct gc_site_input {
    int has_altitude;
    double altitude_m;            /* geometric altitude, m (-5000..86000) */
    int has_temperature;
    double T_K;                   /* ambient dry-bulb temperature, K */
    int has_pressure;
    double P_Pa;                  /* ambient absolute pressure, Pa */
    int has_relative_humidity;
    double RH;                    /* relative humidity, fraction 0..1 */
} gc_site_input;

/* Where a resolved value came from. */
typedef enum gc_site_source {
    GC_SITE_FROM_DEFAULT = 0,     /* ISO reference condition (or 0 m altitude) */
    GC_SITE_FROM_INPUT = 1,       /* given by the caller */
    GC_SITE_FROM_ATMOSPHERE = 2   /* U.S. Standard Atmosphere 1976 at the altitude */
} gc_site_source;

/* The member an error or warning concerns (err->field_id of gc_site_resolve). */
typedef enum gc_site_member {
    GC_SITE_M_NONE = 0,
    GC_SITE_M_ALTITUDE,
    GC_SITE_M_TEMPERATURE,
    GC_SITE_M_PRESSURE,
    GC_SITE_M_RELATIVE_HUMIDITY
} gc_site_member;

typedef struct gc_site_warning {
    gc_site_member member;                /* the member it concerns */
    char field[GC_ERROR_FIELD_LEN];       /* its path, e.g. "/site/pressure" */
    char message[GC_SITE_WARNING_LEN];    /* one sentence, no trailing newline */
} gc_site_warning;

typedef struct gc_site {
    double altitude_m;            /* m; 0 when not given */
    double T_K;                   /* ambient temperature, K */
    double P_Pa;                  /* ambient pressure, Pa */
    double RH;                    /* relative humidity, fraction */
    double W_kg_per_kg;           /* humidity ratio, kg water / kg dry air */
    double pv_Pa;                 /* partial pressure of water vapour, Pa */
    double x_H2O;                 /* mole fraction of water vapour, - */
    double T_atm_K;               /* USSA 1976 temperature at the altitude, K (0 if no altitude) */
    double P_atm_Pa;              /* USSA 1976 pressure at the altitude, Pa (0 if no altitude) */
    gc_site_source altitude_from, T_from, P_from, RH_from;
    gc_gas gas;                   /* humid air at W: the compressor inlet's working fluid */
    int n_warnings;
    gc_site_warning warnings[GC_SITE_MAX_WARNINGS];
} gc_site;

/* Clears every has_ flag (all values then default). NULL-safe. */
void gc_site_input_init(gc_site_input *in);

/* Resolves in (NULL = all defaults) into *out. Errors: altitude outside the
 * standard (GC_ERR_RANGE, "/site/altitude"); temperature outside the
 * psychrometric range 173.15..473.15 K or the gas data's range
 * (GC_ERR_RANGE, "/site/temperature"); pressure not positive
 * (GC_ERR_INVALID, "/site/pressure"); RH outside 0..1 (GC_ERR_INVALID) or
 * more water than the air can carry at T and P (GC_ERR_INFEASIBLE),
 * "/site/relative_humidity". On error *out is left in an unspecified state. */
int gc_site_resolve(const gc_site_input *in, gc_site *out, gc_error *err);

#endif
