/*
 * units.c — quantities, unit expressions and conversion to and from SI base
 * units (units.h).
 *
 * A unit expression is parsed into a dimension vector over (mass, length,
 * time, temperature, amount of substance, plane angle) and a factor to the
 * coherent SI unit of that dimension (angles in rad). A value converts to the
 * library's base unit for its quantity as
 *     si = (value + offset) * factor / base_factor(quantity)
 * where offset is non-zero only for a lone degC/degF as an absolute
 * temperature, and base_factor is 1 except for rotational speed, whose base
 * unit is rev/s (2 pi rad/s).
 *
 * Factors: NIST SP 811 (2008), Appendix B.8. Values there printed with seven
 * digits are derived here from their exact definitions (e.g. the
 * international foot 0.3048 m and pound 0.45359237 kg, the International
 * Table Btu 1055.05585262 J, standard gravity 9.80665 m/s2), which is how
 * B.8 itself derives them; tests/unit/test_units.c checks each against the
 * printed B.8 value.
 */
#include "gascycle/units.h"
#include "gascycle/text.h"

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* ---- exact definitions (NIST SP 811 B.8 notes) ------------------------- */
#define U_PI 3.14159265358979323846
#define U_LBM 0.45359237            /* kg, pound (avoirdupois), exact */
#define U_FT 0.3048                 /* m, foot (international), exact */
#define U_IN 0.0254                 /* m, inch, exact */
#define U_BTU 1055.05585262         /* J, British thermal unit (IT), exact */
#define U_CAL 4.1868                /* J, calorie (IT), exact */
#define U_GN 9.80665                /* m/s2, standard acceleration of gravity, exact */
#define U_LBF (U_LBM * U_GN)        /* N, pound-force = 4.448222 N (B.8) */
#define U_PSI (U_LBF / (U_IN * U_IN)) /* Pa, = 6.894757E+03 (B.8) */
#define U_HP (550.0 * U_FT * U_LBF) /* W, horsepower (550 ft lbf/s) = 7.456999E+02 (B.8) */
#define U_ATM 101325.0              /* Pa, standard atmosphere, exact */
#define U_R (1.0 / 1.8)             /* K per degree Rankine / Fahrenheit, exact */

enum { D_M, D_L, D_T, D_K, D_N, D_A, D_COUNT };
typedef struct { signed char d[D_COUNT]; } dims_t;

#define DIMS(m, l, t, k, n, a) { { m, l, t, k, n, a } }

typedef struct {
    const char *sym;
    dims_t dims;
    double factor;    /* to the coherent SI unit */
    double offset;    /* absolute-temperature offset, in the unit itself */
} unit_sym;

/* Symbols, with the NIST SP 811 B.8 entry for each non-SI factor. */
static const unit_sym symbols[] = {
    /* temperature */
    { "K", DIMS(0, 0, 0, 1, 0, 0), 1.0, 0.0 },
    { "degC", DIMS(0, 0, 0, 1, 0, 0), 1.0, 273.15 },     /* B.8: T/K = t/degC + 273.15 */
    { "\xC2\xB0" "C", DIMS(0, 0, 0, 1, 0, 0), 1.0, 273.15 },
    { "C", DIMS(0, 0, 0, 1, 0, 0), 1.0, 273.15 },        /* "25 C": as people type it */
    { "degF", DIMS(0, 0, 0, 1, 0, 0), U_R, 459.67 },     /* B.8: T/K = (t/degF + 459.67)/1.8 */
    { "\xC2\xB0" "F", DIMS(0, 0, 0, 1, 0, 0), U_R, 459.67 },
    { "F", DIMS(0, 0, 0, 1, 0, 0), U_R, 459.67 },        /* "80 F" */
    { "R", DIMS(0, 0, 0, 1, 0, 0), U_R, 0.0 },           /* B.8: T/K = (T/degR)/1.8 */
    { "degR", DIMS(0, 0, 0, 1, 0, 0), U_R, 0.0 },
    { "\xC2\xB0" "R", DIMS(0, 0, 0, 1, 0, 0), U_R, 0.0 },
    /* mass */
    { "kg", DIMS(1, 0, 0, 0, 0, 0), 1.0, 0.0 },
    { "g", DIMS(1, 0, 0, 0, 0, 0), 1e-3, 0.0 },
    { "t", DIMS(1, 0, 0, 0, 0, 0), 1e3, 0.0 },           /* B.8: ton, metric 1.0E+03 kg */
    { "lbm", DIMS(1, 0, 0, 0, 0, 0), U_LBM, 0.0 },       /* B.8: pound (avoirdupois) 4.535924E-01 kg */
    { "lb", DIMS(1, 0, 0, 0, 0, 0), U_LBM, 0.0 },
    /* length */
    { "m", DIMS(0, 1, 0, 0, 0, 0), 1.0, 0.0 },
    { "km", DIMS(0, 1, 0, 0, 0, 0), 1e3, 0.0 },
    { "cm", DIMS(0, 1, 0, 0, 0, 0), 1e-2, 0.0 },
    { "mm", DIMS(0, 1, 0, 0, 0, 0), 1e-3, 0.0 },
    { "ft", DIMS(0, 1, 0, 0, 0, 0), U_FT, 0.0 },         /* B.8: foot 3.048E-01 m */
    { "in", DIMS(0, 1, 0, 0, 0, 0), U_IN, 0.0 },         /* B.8: inch 2.54E-02 m */
    { "mi", DIMS(0, 1, 0, 0, 0, 0), 5280.0 * U_FT, 0.0 },/* B.8: mile (international) 1.609344E+03 m */
    /* time */
    { "s", DIMS(0, 0, 1, 0, 0, 0), 1.0, 0.0 },
    { "min", DIMS(0, 0, 1, 0, 0, 0), 60.0, 0.0 },        /* B.8: minute 6.0E+01 s */
    { "h", DIMS(0, 0, 1, 0, 0, 0), 3600.0, 0.0 },        /* B.8: hour 3.6E+03 s */
    { "hr", DIMS(0, 0, 1, 0, 0, 0), 3600.0, 0.0 },
    { "d", DIMS(0, 0, 1, 0, 0, 0), 86400.0, 0.0 },       /* B.8: day 8.64E+04 s */
    { "day", DIMS(0, 0, 1, 0, 0, 0), 86400.0, 0.0 },
    /* energy */
    { "J", DIMS(1, 2, -2, 0, 0, 0), 1.0, 0.0 },
    { "kJ", DIMS(1, 2, -2, 0, 0, 0), 1e3, 0.0 },
    { "MJ", DIMS(1, 2, -2, 0, 0, 0), 1e6, 0.0 },
    { "GJ", DIMS(1, 2, -2, 0, 0, 0), 1e9, 0.0 },
    { "Wh", DIMS(1, 2, -2, 0, 0, 0), 3600.0, 0.0 },
    { "kWh", DIMS(1, 2, -2, 0, 0, 0), 3.6e6, 0.0 },      /* B.8: kilowatt hour 3.6E+06 J */
    { "MWh", DIMS(1, 2, -2, 0, 0, 0), 3.6e9, 0.0 },
    { "Btu", DIMS(1, 2, -2, 0, 0, 0), U_BTU, 0.0 },      /* B.8: Btu_IT 1.055056E+03 J */
    { "kBtu", DIMS(1, 2, -2, 0, 0, 0), 1e3 * U_BTU, 0.0 },
    { "MMBtu", DIMS(1, 2, -2, 0, 0, 0), 1e6 * U_BTU, 0.0 },
    { "cal", DIMS(1, 2, -2, 0, 0, 0), U_CAL, 0.0 },      /* B.8: calorie_IT 4.1868E+00 J */
    { "kcal", DIMS(1, 2, -2, 0, 0, 0), 1e3 * U_CAL, 0.0 },
    /* power */
    { "W", DIMS(1, 2, -3, 0, 0, 0), 1.0, 0.0 },
    { "kW", DIMS(1, 2, -3, 0, 0, 0), 1e3, 0.0 },
    { "MW", DIMS(1, 2, -3, 0, 0, 0), 1e6, 0.0 },
    { "GW", DIMS(1, 2, -3, 0, 0, 0), 1e9, 0.0 },
    { "hp", DIMS(1, 2, -3, 0, 0, 0), U_HP, 0.0 },        /* B.8: horsepower (550 ft lbf/s) 7.456999E+02 W */
    /* force */
    { "N", DIMS(1, 1, -2, 0, 0, 0), 1.0, 0.0 },
    { "kN", DIMS(1, 1, -2, 0, 0, 0), 1e3, 0.0 },
    { "lbf", DIMS(1, 1, -2, 0, 0, 0), U_LBF, 0.0 },      /* B.8: pound-force 4.448222E+00 N */
    /* pressure (absolute) */
    { "Pa", DIMS(1, -1, -2, 0, 0, 0), 1.0, 0.0 },
    { "hPa", DIMS(1, -1, -2, 0, 0, 0), 1e2, 0.0 },
    { "kPa", DIMS(1, -1, -2, 0, 0, 0), 1e3, 0.0 },
    { "MPa", DIMS(1, -1, -2, 0, 0, 0), 1e6, 0.0 },
    { "GPa", DIMS(1, -1, -2, 0, 0, 0), 1e9, 0.0 },
    { "bar", DIMS(1, -1, -2, 0, 0, 0), 1e5, 0.0 },       /* B.8: bar 1.0E+05 Pa */
    { "bara", DIMS(1, -1, -2, 0, 0, 0), 1e5, 0.0 },      /* bar, absolute (said so) */
    { "mbar", DIMS(1, -1, -2, 0, 0, 0), 1e2, 0.0 },      /* B.8: millibar 1.0E+02 Pa */
    { "atm", DIMS(1, -1, -2, 0, 0, 0), U_ATM, 0.0 },     /* B.8: atmosphere, standard 1.01325E+05 Pa */
    { "psi", DIMS(1, -1, -2, 0, 0, 0), U_PSI, 0.0 },     /* B.8: pound-force per square inch 6.894757E+03 Pa */
    { "psia", DIMS(1, -1, -2, 0, 0, 0), U_PSI, 0.0 },
    { "inHg", DIMS(1, -1, -2, 0, 0, 0), 3386.38, 0.0 },  /* B.8: inch of mercury, conventional 3.38638E+03 Pa */
    { "mmHg", DIMS(1, -1, -2, 0, 0, 0), 133.3224, 0.0 }, /* B.8: millimeter of mercury, conventional 1.333224E+02 Pa */
    { "torr", DIMS(1, -1, -2, 0, 0, 0), U_ATM / 760.0, 0.0 }, /* B.8: torr 1.333224E+02 Pa */
    { "inH2O", DIMS(1, -1, -2, 0, 0, 0), 249.082, 0.0 }, /* B.8: inch of water (39.2 degF) 2.49082E+02 Pa */
    /* volume */
    { "L", DIMS(0, 3, 0, 0, 0, 0), 1e-3, 0.0 },          /* B.8: liter 1.0E-03 m3 */
    { "l", DIMS(0, 3, 0, 0, 0, 0), 1e-3, 0.0 },
    { "mL", DIMS(0, 3, 0, 0, 0, 0), 1e-6, 0.0 },
    { "cc", DIMS(0, 3, 0, 0, 0, 0), 1e-6, 0.0 },
    { "gal", DIMS(0, 3, 0, 0, 0, 0), 231.0 * U_IN * U_IN * U_IN, 0.0 }, /* B.8: gallon (U.S.) 3.785412E-03 m3 */
    /* amount of substance */
    { "mol", DIMS(0, 0, 0, 0, 1, 0), 1.0, 0.0 },
    { "kmol", DIMS(0, 0, 0, 0, 1, 0), 1e3, 0.0 },
    { "lbmol", DIMS(0, 0, 0, 0, 1, 0), 1e3 * U_LBM, 0.0 },
    /* angle and rotation */
    { "rad", DIMS(0, 0, 0, 0, 0, 1), 1.0, 0.0 },
    { "deg", DIMS(0, 0, 0, 0, 0, 1), U_PI / 180.0, 0.0 },/* B.8: degree (angle) 1.745329E-02 rad */
    { "rev", DIMS(0, 0, 0, 0, 0, 1), 2.0 * U_PI, 0.0 },
    { "rpm", DIMS(0, 0, -1, 0, 0, 1), 2.0 * U_PI / 60.0, 0.0 }, /* B.8: revolution per minute 1.047198E-01 rad/s */
    { "rps", DIMS(0, 0, -1, 0, 0, 1), 2.0 * U_PI, 0.0 },
    { "Hz", DIMS(0, 0, -1, 0, 0, 1), 2.0 * U_PI, 0.0 },  /* as a rotational speed: rev/s */
    /* velocity */
    { "kn", DIMS(0, 1, -1, 0, 0, 0), 1852.0 / 3600.0, 0.0 }, /* B.8: knot 5.144444E-01 m/s */
    { "mph", DIMS(0, 1, -1, 0, 0, 0), 5280.0 * U_FT / 3600.0, 0.0 }, /* B.8: mile per hour 4.4704E-01 m/s */
};

/* ---- quantities -------------------------------------------------------- */
typedef struct {
    const char *name;
    const char *words;
    dims_t dims;
    double base;          /* base unit in coherent SI (rev/s = 2 pi rad/s), usually 1 */
    const char *label[2]; /* si, us */
    double factor[2];     /* display unit in coherent SI */
    double offset[2];     /* display offset (degF) */
    const char *accepted; /* the units accepted, comma-separated (messages, suggestions) */
} quantity_info;

#define Q0 DIMS(0, 0, 0, 0, 0, 0)
static const quantity_info quantities[GC_Q_COUNT] = {
    [GC_Q_RATIO] = { "ratio", "a dimensionless ratio", Q0, 1.0,
                     { "-", "-" }, { 1.0, 1.0 }, { 0, 0 }, "-, %" },
    [GC_Q_FRACTION] = { "fraction", "a fraction", Q0, 1.0,
                        { "-", "-" }, { 1.0, 1.0 }, { 0, 0 }, "-, %" },
    [GC_Q_TEMPERATURE] = { "temperature", "a temperature", DIMS(0, 0, 0, 1, 0, 0), 1.0,
                           { "K", "R" }, { 1.0, U_R }, { 0, 0 },
                           "K, degC, \xC2\xB0" "C, C, degF, \xC2\xB0" "F, F, R, degR" },
    [GC_Q_AMBIENT_TEMPERATURE] = { "ambient_temperature", "a temperature",
                                   DIMS(0, 0, 0, 1, 0, 0), 1.0,
                                   { "K", "degF" }, { 1.0, U_R }, { 0, 459.67 },
                                   "K, degC, \xC2\xB0" "C, C, degF, \xC2\xB0" "F, F, R, degR" },
    [GC_Q_TEMPERATURE_DIFFERENCE] = { "temperature_difference", "a temperature difference",
                                      DIMS(0, 0, 0, 1, 0, 0), 1.0,
                                      { "K", "R" }, { 1.0, U_R }, { 0, 0 }, "K, degC, C, R, degF, F" },
    [GC_Q_PRESSURE] = { "pressure", "a pressure", DIMS(1, -1, -2, 0, 0, 0), 1.0,
                        { "kPa", "psia" }, { 1e3, U_PSI }, { 0, 0 },
                        "Pa, hPa, kPa, MPa, bar, bara, mbar, atm, psi, psia, inHg, mmHg, torr, "
                        "inH2O, psig, barg, kPag, MPag" },
    [GC_Q_SPECIFIC_ENERGY] = { "specific_energy", "a specific energy", DIMS(0, 2, -2, 0, 0, 0), 1.0,
                               { "kJ/kg", "Btu/lbm" }, { 1e3, U_BTU / U_LBM }, { 0, 0 },
                               "kJ/kg, J/kg, MJ/kg, Btu/lbm, Btu/lb, kWh/kg, kcal/kg" },
    [GC_Q_SPECIFIC_ENTROPY] = { "specific_entropy", "a specific entropy or heat capacity",
                                DIMS(0, 2, -2, -1, 0, 0), 1.0,
                                { "kJ/(kg K)", "Btu/(lbm R)" }, { 1e3, U_BTU / U_LBM / U_R },
                                { 0, 0 },
                                "kJ/(kg K), J/(kg K), kJ/kg/K, Btu/(lbm R), Btu/(lbm F), kcal/(kg K)" },
    [GC_Q_SPECIFIC_VOLUME] = { "specific_volume", "a specific volume", DIMS(-1, 3, 0, 0, 0, 0), 1.0,
                               { "m3/kg", "ft3/lbm" }, { 1.0, U_FT * U_FT * U_FT / U_LBM },
                               { 0, 0 }, "m3/kg, L/kg, ft3/lbm" },
    [GC_Q_POWER] = { "power", "a power", DIMS(1, 2, -3, 0, 0, 0), 1.0,
                     { "kW", "kW" }, { 1e3, 1e3 }, { 0, 0 },
                     "W, kW, MW, GW, hp, Btu/h, kBtu/h, MMBtu/h" },
    [GC_Q_MASS_FLOW] = { "mass_flow", "a mass flow rate", DIMS(1, 0, -1, 0, 0, 0), 1.0,
                         { "kg/s", "lbm/s" }, { 1.0, U_LBM }, { 0, 0 },
                         "kg/s, kg/h, t/h, lbm/s, lbm/h, lb/h, Sm3/h, Nm3/h, scf/h, scfh, scfm, "
                         "MMscfd" },
    [GC_Q_LENGTH] = { "length", "a length", DIMS(0, 1, 0, 0, 0, 0), 1.0,
                      { "m", "ft" }, { 1.0, U_FT }, { 0, 0 }, "m, km, cm, mm, ft, in, mi" },
    [GC_Q_VOLUME] = { "volume", "a volume", DIMS(0, 3, 0, 0, 0, 0), 1.0,
                      { "L", "in3" }, { 1e-3, U_IN * U_IN * U_IN }, { 0, 0 },
                      "L, cm3, cc, mL, m3, in3, ft3, gal" },
    [GC_Q_ROTATIONAL_SPEED] = { "rotational_speed", "a rotational speed",
                                DIMS(0, 0, -1, 0, 0, 1), 2.0 * U_PI,
                                { "rpm", "rpm" }, { 2.0 * U_PI / 60.0, 2.0 * U_PI / 60.0 },
                                { 0, 0 }, "rpm, rps, rev/s, rad/s, Hz" },
    [GC_Q_VELOCITY] = { "velocity", "a velocity", DIMS(0, 1, -1, 0, 0, 0), 1.0,
                        { "m/s", "ft/s" }, { 1.0, U_FT }, { 0, 0 }, "m/s, km/h, ft/s, mph, kn" },
    [GC_Q_HEAT_RATE] = { "heat_rate", "a heat rate", Q0, 1.0,
                         { "kJ/kWh", "Btu/kWh" }, { 1e3 / 3.6e6, U_BTU / 3.6e6 }, { 0, 0 },
                         "kJ/kWh, Btu/kWh, MJ/MWh" },
    [GC_Q_MASS] = { "mass", "a mass", DIMS(1, 0, 0, 0, 0, 0), 1.0,
                    { "kg", "lbm" }, { 1.0, U_LBM }, { 0, 0 }, "kg, g, t, lbm, lb" },
    [GC_Q_ENERGY] = { "energy", "an energy", DIMS(1, 2, -2, 0, 0, 0), 1.0,
                      { "kJ", "Btu" }, { 1e3, U_BTU }, { 0, 0 },
                      "J, kJ, MJ, kWh, Btu, kBtu, MMBtu, kcal" },
    [GC_Q_MOLAR_MASS] = { "molar_mass", "a molar mass", DIMS(1, 0, 0, 0, -1, 0), 1.0,
                          { "kg/kmol", "lbm/lbmol" }, { 1e-3, 1e-3 }, { 0, 0 },
                          "kg/kmol, g/mol, lbm/lbmol" },
    [GC_Q_DENSITY] = { "density", "a density", DIMS(1, -3, 0, 0, 0, 0), 1.0,
                       { "kg/m3", "lbm/ft3" }, { 1.0, U_LBM / (U_FT * U_FT * U_FT) }, { 0, 0 },
                       "kg/m3, g/L, lbm/ft3" },
    [GC_Q_ANGLE] = { "angle", "an angle", DIMS(0, 0, 0, 0, 0, 1), 1.0,
                     { "deg", "deg" }, { U_PI / 180.0, U_PI / 180.0 }, { 0, 0 }, "deg, rad, rev" },
    [GC_Q_PRESSURE_DIFFERENCE] = { "pressure_difference", "a pressure difference",
                                   DIMS(1, -1, -2, 0, 0, 0), 1.0, { "kPa", "psi" },
                                   { 1e3, U_PSI }, { 0, 0 },
                                   "Pa, kPa, MPa, bar, mbar, psi, inH2O" },
};

/* Dimensions that are no quantity of ours, named in messages. */
static const struct { dims_t dims; const char *words; } other_dims[] = {
    { DIMS(0, 0, 1, 0, 0, 0), "a time" },
    { DIMS(1, 1, -2, 0, 0, 0), "a force" },
    { DIMS(0, 2, 0, 0, 0, 0), "an area" },
    { DIMS(0, 0, 0, 0, 1, 0), "an amount of substance" },
    { DIMS(0, 0, -1, 0, 0, 0), "a frequency" },
};

const char *gc_quantity_name(gc_quantity q)
{
    return (q >= 0 && q < GC_Q_COUNT) ? quantities[q].name : "unknown";
}

const char *gc_quantity_words(gc_quantity q)
{
    return (q >= 0 && q < GC_Q_COUNT) ? quantities[q].words : "a value";
}

int gc_units_system_parse(const char *name, gc_unit_system *sys)
{
    if (name && strcmp(name, "si") == 0) {
        *sys = GC_UNITS_SI;
        return GC_OK;
    }
    if (name && strcmp(name, "us") == 0) {
        *sys = GC_UNITS_US;
        return GC_OK;
    }
    return GC_ERR_INVALID;
}

const char *gc_units_system_name(gc_unit_system sys)
{
    return sys == GC_UNITS_US ? "us" : "si";
}

static int dims_eq(dims_t a, dims_t b)
{
    return memcmp(a.d, b.d, sizeof a.d) == 0;
}

static int dims_zero(dims_t a)
{
    static const dims_t z = Q0;
    return dims_eq(a, z);
}

static const char *dims_words(dims_t d)
{
    for (int q = 0; q < GC_Q_COUNT; q++)
        if (dims_eq(d, quantities[q].dims))
            return dims_zero(d) ? "dimensionless" : quantities[q].words;
    for (size_t i = 0; i < sizeof other_dims / sizeof other_dims[0]; i++)
        if (dims_eq(d, other_dims[i].dims))
            return other_dims[i].words;
    return NULL;
}

/* ---- unit expression parser ------------------------------------------ */
typedef struct {
    dims_t dims;
    double factor;
    int n_terms;
    const unit_sym *single;   /* the only term when it has exponent 1, else NULL */
} unit_expr;

static int is_sym_char(const char *p)
{
    return isalpha((unsigned char)*p) || ((unsigned char)p[0] == 0xC2 && (unsigned char)p[1] == 0xB0);
}

/* Parses a unit expression (trimmed, non-empty); GC_ERR_INVALID with message. */
/* A symbol at *pp ("inH2O" is the one symbol with digits inside) into sym;
 * 0, or -1 when there is none. */
static int read_symbol(const char **pp, char sym[16])
{
    const char *p = *pp;
    size_t n = 0;
    if (strncmp(p, "inH2O", 5) == 0 && !is_sym_char(p + 5)) {
        memcpy(sym, "inH2O", 6);
        *pp = p + 5;
        return 0;
    }
    while (is_sym_char(p) && n + 2 < 16) {
        if ((unsigned char)*p == 0xC2)
            sym[n++] = *p++;
        sym[n++] = *p++;
    }
    sym[n] = '\0';
    *pp = p;
    return n == 0 || is_sym_char(p) ? -1 : 0;
}

/* The exponent after a symbol at *pp ("^-2", "3", a superscript; 1 when
 * none); 0 when it is malformed. */
static int read_exponent(const char **pp)
{
    const char *p = *pp;
    int e = 1;
    if (*p == '^') {
        p++;
        int neg = *p == '-';
        if (neg)
            p++;
        if (!isdigit((unsigned char)*p))
            return 0;
        e = *p++ - '0';
        if (isdigit((unsigned char)*p))
            return 0;
        if (neg)
            e = -e;
    } else if (isdigit((unsigned char)*p)) {
        e = *p++ - '0';
        if (isdigit((unsigned char)*p))
            return 0;
    } else if ((unsigned char)p[0] == 0xC2 &&
               ((unsigned char)p[1] == 0xB2 || (unsigned char)p[1] == 0xB3)) {
        e = (unsigned char)p[1] == 0xB2 ? 2 : 3;
        p += 2;
    }
    *pp = p;
    return e;
}

/* "psig", "barg", "kPag": a pressure symbol with a trailing 'g' (gauge). */
static int is_gauge_symbol(const char *sym)
{
    static const char *const stems[] = { "psi", "bar", "mbar", "kPa", "MPa", "Pa" };
    size_t n = strlen(sym);
    if (n < 2 || sym[n - 1] != 'g')
        return 0;
    for (size_t i = 0; i < sizeof stems / sizeof stems[0]; i++)
        if (strlen(stems[i]) == n - 1 && strncmp(sym, stems[i], n - 1) == 0)
            return 1;
    return 0;
}

/* One symbol with its exponent at *pp into out (sign: -1 after a '/');
 * GC_OK, GC_ERR_INVALID with the message (an unknown unit), or -1 (syntax). */
static int read_term(const char **pp, const char *unit, int sign, unit_expr *out,
                     const unit_sym **last, int *last_exp, gc_error *err)
{
    char sym[16];
    if (read_symbol(pp, sym) != 0)
        return -1;
    const unit_sym *us = NULL;
    for (size_t i = 0; i < sizeof symbols / sizeof symbols[0] && !us; i++)
        if (strcmp(symbols[i].sym, sym) == 0)
            us = &symbols[i];
    if (!us) {
        if (is_gauge_symbol(sym))
            return gc_error_set(err, GC_ERR_INVALID, NULL,
                                "'%s' is a gauge pressure, which needs a barometric pressure to "
                                "read: here give an absolute pressure ('psia', 'bar', 'kPa')",
                                sym);
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unknown unit '%s' in '%s'", sym, unit);
    }
    int e = read_exponent(pp);
    if (e == 0)
        return -1;
    e *= sign;
    for (int k = 0; k < D_COUNT; k++)
        out->dims.d[k] = (signed char)(out->dims.d[k] + us->dims.d[k] * e);
    out->factor *= pow(us->factor, e);
    out->n_terms++;
    *last = us;
    *last_exp = e;
    return GC_OK;
}

/* A separator, '/', parenthesis or the "1" of "1/s" at *pp; 1 when one was
 * read, 0 when a term follows, -1 on a syntax error. */
static int read_punct(const char **pp, const unit_expr *out, int *sign, int *depth,
                      int *expect_term, int *saw_slash)
{
    const char *p = *pp;
    unsigned char c = (unsigned char)*p;
    if (c == ' ' || c == '*' || c == '-' || c == '.') {
        if (*expect_term && c != ' ')
            return -1;
        if (c != ' ')
            *expect_term = 1;
        *pp = p + 1;
        return 1;
    }
    if (c == 0xC2 && (unsigned char)p[1] == 0xB7) { /* middle dot */
        *expect_term = 1;
        *pp = p + 2;
        return 1;
    }
    if (c == '/') {
        if (*expect_term)
            return -1;
        *sign = -1;
        *saw_slash = *expect_term = 1;
        *pp = p + 1;
        return 1;
    }
    if (c == '(' || c == ')') {
        *depth += c == '(' ? 1 : -1;
        if (*depth > 1 || *depth < 0 || (c == ')' && *expect_term))
            return -1;
        *pp = p + 1;
        return 1;
    }
    if (c == '1' && out->n_terms == 0 && !*saw_slash) { /* "1/s" */
        p++;
        while (*p == ' ')
            p++;
        if (*p != '/')
            return -1;
        *expect_term = 0;
        *pp = p;
        return 1;
    }
    return 0;
}

static int parse_expr(const char *unit, unit_expr *out, gc_error *err)
{
    const char *p = unit;
    int sign = 1, depth = 0, expect_term = 1, saw_slash = 0;
    memset(out, 0, sizeof *out);
    out->factor = 1.0;
    const unit_sym *last = NULL;
    int last_exp = 0;
    while (*p) {
        int k = read_punct(&p, out, &sign, &depth, &expect_term, &saw_slash);
        if (k < 0)
            goto bad_syntax;
        if (k > 0)
            continue;
        int rc = read_term(&p, unit, sign, out, &last, &last_exp, err);
        if (rc < 0)
            goto bad_syntax;
        if (rc != GC_OK)
            return rc;
        expect_term = 0;
    }
    if (depth != 0 || expect_term || out->n_terms == 0)
        goto bad_syntax;
    out->single = (out->n_terms == 1 && last_exp == 1) ? last : NULL;
    return GC_OK;
bad_syntax:
    return gc_error_set(err, GC_ERR_INVALID, NULL, "cannot read the unit '%s'", unit);
}

const char *gc_units_accepted(gc_quantity q)
{
    return (q >= 0 && q < GC_Q_COUNT) ? quantities[q].accepted : "";
}

const char *gc_units_suggest(gc_quantity q, const char *unit)
{
    static _Thread_local char best[32];
    const char *p = gc_units_accepted(q);
    int best_d = 99;
    while (unit && *p) {
        size_t n = strcspn(p, ",");
        char cand[32];
        snprintf(cand, sizeof cand, "%.*s", (int)(n < 31 ? n : 31), p);
        int d = gc_text_edit_distance(unit, cand);
        if (d < best_d) {
            best_d = d;
            snprintf(best, sizeof best, "%s", cand);
        }
        p += n;
        while (*p == ',' || *p == ' ')
            p++;
    }
    size_t len = unit ? strlen(unit) : 0;
    int limit = len <= 2 ? 0 : (len <= 4 ? 1 : 2);
    /* a case-only difference (distance 0 here) is always worth saying */
    return best_d <= limit && strcmp(best, unit) != 0 ? best : NULL;
}

/* "unknown unit 'kpa'; did you mean 'kPa'? Units of a pressure: Pa, hPa, ...": the
 * parser's sentence (inner) for a compound, then the closest accepted unit and the list. */
static int unknown_unit(gc_quantity q, const char *unit, const char *inner, gc_error *err)
{
    const quantity_info *qi = &quantities[q];
    const char *s = gc_units_suggest(q, unit);
    char first[GC_ERROR_MESSAGE_LEN];
    if (strncmp(inner, "unknown unit", 12) == 0 && strcspn(unit, " */-.()^") == strlen(unit))
        snprintf(first, sizeof first, "unknown unit '%s'", unit);
    else
        snprintf(first, sizeof first, "%s", inner);
    if (s)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "%s; did you mean '%s'? Units of %s: %s",
                            first, s, qi->words, qi->accepted);
    return gc_error_set(err, GC_ERR_INVALID, NULL, "%s; units of %s: %s", first, qi->words,
                        qi->accepted);
}

/* A unit of another dimension than q's. */
static int wrong_kind(gc_quantity q, const char *unit, dims_t d, gc_error *err)
{
    const quantity_info *qi = &quantities[q];
    const char *w = dims_words(d);
    if (q == GC_Q_RATIO || q == GC_Q_FRACTION)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "unit '%s' is not accepted: expected %s, given as a plain number, "
                            "'-' or '%%'", unit, qi->words);
    if (w)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unit '%s' is %s, expected %s (%s)", unit,
                            w, qi->words, qi->accepted);
    return gc_error_set(err, GC_ERR_INVALID, NULL,
                        "unit '%s' is no known quantity, expected %s (%s)", unit, qi->words,
                        qi->accepted);
}

/* Factor (value in unit -> SI base of q) and offset; checks the dimension. */
static int unit_for_quantity(gc_quantity q, const char *unit, double *factor, double *offset,
                             gc_error *err)
{
    const quantity_info *qi = &quantities[q];
    *offset = 0.0;
    int dimensionless = q == GC_Q_FRACTION || q == GC_Q_RATIO;
    if (strcmp(unit, "%") == 0 || strcmp(unit, "-") == 0) {
        if (!dimensionless)
            return gc_error_set(err, GC_ERR_INVALID, NULL,
                                "unit '%s' is for dimensionless values; expected %s (%s)", unit,
                                qi->words, qi->accepted);
        *factor = unit[0] == '%' ? 0.01 : 1.0;
        return GC_OK;
    }
    unit_expr ex;
    gc_error inner;
    gc_error_clear(&inner);
    int rc = parse_expr(unit, &ex, &inner);
    if (rc != GC_OK) {
        if (strstr(inner.message, "gauge pressure"))
            return gc_error_set(err, rc, NULL, "%s", inner.message);
        return unknown_unit(q, unit, inner.message, err);
    }
    if (!dims_eq(ex.dims, qi->dims) || (dimensionless && ex.n_terms > 0))
        return wrong_kind(q, unit, ex.dims, err);
    *factor = ex.factor / qi->base;
    if ((q == GC_Q_TEMPERATURE || q == GC_Q_AMBIENT_TEMPERATURE) && ex.single)
        *offset = ex.single->offset;
    return GC_OK;
}

static void trim(const char **b, const char **e)
{
    while (*b < *e && isspace((unsigned char)**b))
        (*b)++;
    while (*e > *b && isspace((unsigned char)(*e)[-1]))
        (*e)--;
}

int gc_units_to_si(gc_quantity q, double value, const char *unit, double *si_value,
                   gc_error *err)
{
    if (q < 0 || q >= GC_Q_COUNT)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unknown quantity");
    if (!isfinite(value))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "NaN and Infinity are not accepted");
    char buf[64];
    const char *b = unit ? unit : "", *e = b + strlen(b);
    trim(&b, &e);
    if (b == e) {
        *si_value = gc_units_default_to_si(q, value);
    } else {
        if ((size_t)(e - b) >= sizeof buf)
            return gc_error_set(err, GC_ERR_INVALID, NULL, "the unit is too long");
        memcpy(buf, b, (size_t)(e - b));
        buf[e - b] = '\0';
        double f, off;
        int rc = unit_for_quantity(q, buf, &f, &off, err);
        if (rc != GC_OK)
            return rc;
        *si_value = (value + off) * f;
    }
    if (!isfinite(*si_value))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the value is too large");
    return GC_OK;
}

int gc_units_from_si_unit(gc_quantity q, double si_value, const char *unit, double *value,
                          gc_error *err)
{
    if (q < 0 || q >= GC_Q_COUNT)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unknown quantity");
    double f, off;
    int rc = unit_for_quantity(q, unit, &f, &off, err);
    if (rc != GC_OK)
        return rc;
    *value = si_value / f - off;
    return GC_OK;
}

double gc_units_default_to_si(gc_quantity q, double value)
{
    const quantity_info *qi = &quantities[q];
    return (value + qi->offset[GC_UNITS_SI]) * qi->factor[GC_UNITS_SI] / qi->base;
}

double gc_units_from_si(gc_quantity q, gc_unit_system sys, double si_value)
{
    const quantity_info *qi = &quantities[q];
    int s = sys == GC_UNITS_US ? 1 : 0;
    return si_value * qi->base / qi->factor[s] - qi->offset[s];
}

const char *gc_units_label(gc_quantity q, gc_unit_system sys)
{
    if (q < 0 || q >= GC_Q_COUNT)
        return "-";
    return quantities[q].label[sys == GC_UNITS_US ? 1 : 0];
}

double gc_units_to_si_sys(gc_quantity q, gc_unit_system sys, double value)
{
    const quantity_info *qi = &quantities[q];
    int k = sys == GC_UNITS_US ? 1 : 0;
    return (value + qi->offset[k]) * qi->factor[k] / qi->base;
}
