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
 * Temperature spellings: "K", "degC", "°C", "C", "deg C", "degF", "°F", "F",
 * "deg F", "R", "degR".
 *
 * Readings that need context (gc_units_read): a gauge pressure ("5 barg",
 * "75 psig", "300 kPag", "2 bar(g)") is a pressure above the barometric
 * pressure, which the caller supplies (a route's site, or the standard
 * atmosphere); a volume flow at named standard conditions ("12000 Sm3/h",
 * "450 scfm", "10 MMscfd") becomes a mass flow only with the density of the
 * gas at those conditions (the caller's fuel). gc_units_parse, which has no
 * context, refuses both with a sentence saying why. Percent ("42 %") is
 * accepted by every dimensionless quantity except the heat rate.
 *
 * A unit that is not accepted gets a message naming the closest accepted
 * unit of the quantity (case and small typos: "kpa" -> "kPa") and the list
 * of accepted units for that quantity (gc_units_accepted).
 *
 * Plain numbers: in the quantity's unit of the *input* system (gc_units_opts:
 * si by default, so a plain 2000 for a temperature is 2000 K; under us it is
 * the us unit of the quantity, 2000 R or, for the temperatures the trade
 * reads in degF, 2000 degF). Decimal commas ("0,55") are read when the caller
 * asks (gc_units_opts.decimal_comma); a number with both '.' and ',' or a
 * dotted group that reads as a thousands separator ("1.500") is refused
 * there, never guessed.
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
    GC_Q_AMBIENT_TEMPERATURE,     /* absolute temperature the trade reads in degF under us:
                                     ambient (site, intake), firing (turbine inlet), exhaust,
                                     compressor discharge (a machine's readings) */
    GC_Q_TEMPERATURE_DIFFERENCE,  /* K (us: R) */
    GC_Q_PRESSURE,                /* absolute, Pa; si kPa, us psia */
    GC_Q_SPECIFIC_ENERGY,         /* J/kg; si kJ/kg, us Btu/lbm */
    GC_Q_SPECIFIC_ENTROPY,        /* J/(kg K), also specific heat and R; si kJ/(kg K), us Btu/(lbm R) */
    GC_Q_SPECIFIC_VOLUME,         /* m3/kg; us ft3/lbm */
    GC_Q_POWER,                   /* W; si and us kW (US plants report kW and MW, not hp) */
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
    GC_Q_PRESSURE_DIFFERENCE,     /* Pa, no absolute reference (a mean effective pressure, a
                                     pressure drop); si kPa, us psi (not psia) */
    GC_Q_COUNT
} gc_quantity;

typedef enum gc_unit_system {
    GC_UNITS_SI = 0,   /* K, kPa, kJ/kg, kJ/(kg K), m3/kg, kW, kJ/kWh, kg/s */
    GC_UNITS_US = 1    /* R (degF for ambient, firing and exhaust temperatures), psia (psi for
                          mean effective pressures), Btu/lbm, Btu/(lbm R), ft3/lbm, kW, Btu/kWh,
                          lbm/s */
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

/* A plain number in the unit of system sys for q (gc_units_label) -> SI. */
double gc_units_to_si_sys(gc_quantity q, gc_unit_system sys, double value);

/* ---- readings in context -------------------------------------------------- */

/* Named standard conditions of a gas volume. */
typedef enum gc_std_conditions {
    GC_STD_NONE = 0,
    GC_STD_ISO_13443,   /* "Sm3": 15 degC and 101.325 kPa (ISO 13443 standard reference) */
    GC_STD_NORMAL,      /* "Nm3": 0 degC and 101.325 kPa (normal conditions, DIN 1343) */
    GC_STD_US_60F       /* "scf": 60 degF and 14.696 psia (US gas-industry practice) */
} gc_std_conditions;

/* The temperature (K) and pressure (Pa) of c and a sentence naming them
 * ("15 degC and 101.325 kPa (ISO 13443)"); GC_ERR_INVALID for GC_STD_NONE. */
int gc_units_std_conditions(gc_std_conditions c, double *T_K, double *P_Pa, const char **name);

/* Ideal-gas density (kg/m3) of a gas of molar mass M (kg/mol) at c. */
double gc_units_std_density(gc_std_conditions c, double M_kg_per_mol);

typedef enum gc_reading_kind {
    GC_READING_VALUE = 0,  /* si is the value in SI base units */
    GC_READING_GAUGE,      /* a gauge pressure: si is the reading above the barometric
                              pressure, Pa (the absolute value is si + the barometric) */
    GC_READING_STD_VOLUME  /* a standard volume flow: si in m3/s at the conditions cond */
} gc_reading_kind;

typedef struct gc_units_opts {
    gc_unit_system input_sys;   /* the system of plain numbers (si: the default unit) */
    int decimal_comma;          /* 1: "0,55" is 0.55 */
} gc_units_opts;

typedef struct gc_reading {
    gc_reading_kind kind;
    double si;                  /* see kind */
    gc_std_conditions cond;     /* GC_READING_STD_VOLUME */
    double number;              /* the number as written */
    char unit[32];              /* the unit as written (trimmed), "" for a plain number */
} gc_reading;

/* Reads "<number>" or "<number> <unit>" for q (opts NULL: si, decimal
 * point). Gauge pressures only for GC_Q_PRESSURE, standard volume flows only
 * for GC_Q_MASS_FLOW: the caller completes them. Errors as gc_units_parse. */
int gc_units_read(gc_quantity q, const char *text, const gc_units_opts *opts, gc_reading *r,
                  gc_error *err);

/* The units accepted for q, comma-separated ("K, degC, °C, C, degF, ..."). */
const char *gc_units_accepted(gc_quantity q);

/* The accepted unit of q closest to unit (case, small typos), or NULL. */
const char *gc_units_suggest(gc_quantity q, const char *unit);

#endif
