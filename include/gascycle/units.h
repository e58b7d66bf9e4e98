/*
 * units.h — physical quantities, unit parsing and unit conversion (core: no
 * JSON, no HTTP).
 *
 * Inside the library every value is in SI base units (K, Pa, J/kg, J/(kg K),
 * m3/kg, W, kg/s, m, m3, kg, J, kg/mol, m/s, kg/m3; rotational speed in rev/s,
 * angles in rad; heat rate as J/J, i.e. dimensionless). At the boundary a
 * value arrives either as a plain number in the quantity's *default unit*
 * (the unit of the "si" output system: kPa, kJ/kg, kJ/(kg K), kW ...) or as a
 * string "<number> <unit>" ("25 degC", "12 bar", "14.7 psi", "0.35 kJ/kg/K").
 *
 * Unit expressions: symbols joined by '*', '.', '·', '-' or spaces, with
 * exponents written as digits or '^' ("m3", "ft^3", "s^-1"); everything after
 * the first '/' is in the denominator, so "kJ/kg K", "kJ/kg-K", "kJ/kg/K" and
 * "kJ/(kg K)" all mean kJ/(kg K). Temperature units with an offset (degC,
 * degF) apply it only when they stand alone as an absolute temperature; inside
 * a compound or for a temperature difference they are interval units.
 * Gauge pressures (psig, barg) are refused: the models need absolute pressure.
 *
 * Conversion factors: NIST Special Publication 811 (2008 edition, "Guide for
 * the Use of the International System of Units", A. Thompson and B. N.
 * Taylor), Appendix B.8 (factors in alphabetical order) and B.9 (by kind of
 * quantity); each factor in units.c names its B.8 entry.
 */
#ifndef GASCYCLE_UNITS_H
#define GASCYCLE_UNITS_H

#include "gascycle/error.h"

typedef enum gc_quantity {
    GC_Q_RATIO = 0,               /* dimensionless ratio (pressure ratio, k), "-" */
    GC_Q_FRACTION,                /* fraction 0..1, also accepts "%", "-" */
    GC_Q_TEMPERATURE,             /* absolute temperature, K (us: R) */
    GC_Q_AMBIENT_TEMPERATURE,     /* absolute temperature shown in degF in us (site, intake) */
    GC_Q_TEMPERATURE_DIFFERENCE,  /* K (us: R) */
    GC_Q_PRESSURE,                /* absolute, Pa; si kPa, us psia */
    GC_Q_SPECIFIC_ENERGY,         /* J/kg; si kJ/kg, us Btu/lbm */
    GC_Q_SPECIFIC_ENTROPY,        /* J/(kg K), also specific heat and R; si kJ/(kg K), us Btu/(lbm R) */
    GC_Q_SPECIFIC_VOLUME,         /* m3/kg; us ft3/lbm */
    GC_Q_POWER,                   /* W; si kW, us hp */
    GC_Q_MASS_FLOW,               /* kg/s; us lbm/s */
    GC_Q_LENGTH,                  /* m (also altitude); us ft */
    GC_Q_VOLUME,                  /* m3; si L, us in3 */
    GC_Q_ROTATIONAL_SPEED,        /* rev/s; si and us rpm */
    GC_Q_VELOCITY,                /* m/s; us ft/s */
    GC_Q_HEAT_RATE,               /* J/J; si kJ/kWh, us Btu/kWh */
    GC_Q_MASS,                    /* kg; us lbm */
    GC_Q_ENERGY,                  /* J; si kJ, us Btu */
    GC_Q_MOLAR_MASS,              /* kg/mol; si kg/kmol, us lbm/lbmol */
    GC_Q_DENSITY,                 /* kg/m3; us lbm/ft3 */
    GC_Q_ANGLE,                   /* rad; si and us deg */
    GC_Q_COUNT
} gc_quantity;

typedef enum gc_unit_system {
    GC_UNITS_SI = 0,   /* K, kPa, kJ/kg, kJ/(kg K), m3/kg, kW, kJ/kWh, kg/s */
    GC_UNITS_US = 1    /* R (degF for ambient), psia, Btu/lbm, Btu/(lbm R), ft3/lbm, hp, Btu/kWh, lbm/s */
} gc_unit_system;

/* snake_case name of a quantity ("specific_energy"); never NULL. */
const char *gc_quantity_name(gc_quantity q);

/* Words for messages ("a pressure", "a temperature"); never NULL. */
const char *gc_quantity_words(gc_quantity q);

/* "si" or "us" -> system; GC_ERR_INVALID otherwise. */
int gc_units_system_parse(const char *name, gc_unit_system *sys);
const char *gc_units_system_name(gc_unit_system sys);

/* Parses "<number>" (default unit) or "<number> <unit>" strictly: no
 * trailing text, no NaN/Infinity/hex, a unit of the quantity's dimension.
 * On success *si_value holds the value in SI base units. Errors are
 * GC_ERR_INVALID with a message such as "unit 'bar' is a pressure, expected a
 * temperature"; err->field is left empty (the caller knows the field). */
int gc_units_parse(gc_quantity q, const char *text, double *si_value, gc_error *err);

/* A plain number in the quantity's default unit (the si system's unit) to SI
 * base units. */
double gc_units_default_to_si(gc_quantity q, double value);

/* value given in unit (a unit expression as above) -> SI base units. */
int gc_units_to_si(gc_quantity q, double value, const char *unit, double *si_value,
                   gc_error *err);

/* SI base value -> the given unit expression (inverse of gc_units_to_si). */
int gc_units_from_si_unit(gc_quantity q, double si_value, const char *unit, double *value,
                          gc_error *err);

/* SI base value -> the output system's unit for q, and that unit's label. */
double gc_units_from_si(gc_quantity q, gc_unit_system sys, double si_value);
const char *gc_units_label(gc_quantity q, gc_unit_system sys);

#endif
