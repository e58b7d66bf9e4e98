/*
 * test_units.c — the unit module (include/gascycle/units.h): conversion
 * factors against the values printed in NIST SP 811 (2008) Appendix B.8,
 * parsing of "<number> <unit>" strings, round trips through both output
 * systems, and the error messages for bad units.
 */
#include "check.h"
#include "gascycle/units.h"

#include <string.h>

#define NIST "NIST SP 811 (2008) B.8"
/* B.8 prints 7 significant digits: half a unit in the last digit. */
#define B8_TOL 5e-7

static double parse_ok(gc_quantity q, const char *text)
{
    double v = -12345.0;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_units_parse(q, text, &v, &err);
    if (rc != GC_OK)
        fprintf(stderr, "parse '%s' failed: %s\n", text, err.message);
    CU_ASSERT_EQUAL(rc, GC_OK);
    return v;
}

static void parse_err(gc_quantity q, const char *text, const char *want_substring)
{
    double v = 0.0;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_units_parse(q, text, &v, &err);
    CU_ASSERT_EQUAL(rc, GC_ERR_INVALID);
    if (!strstr(err.message, want_substring))
        fprintf(stderr, "parse '%s': message '%s' lacks '%s'\n", text, err.message, want_substring);
    CU_ASSERT_PTR_NOT_NULL(strstr(err.message, want_substring));
}

/* Each factor against the 7-significant-digit value printed in B.8. */
static void test_nist_factors(void)
{
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 psi"), 6.894757e3, B8_TOL, NIST " pound-force per square inch");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 psia"), 6.894757e3, B8_TOL, NIST " pound-force per square inch");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 atm"), 1.01325e5, 1e-15, NIST " atmosphere, standard (exact)");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 bar"), 1.0e5, 1e-15, NIST " bar (exact)");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 inHg"), 3.38638e3, B8_TOL, NIST " inch of mercury, conventional");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 torr"), 1.333224e2, B8_TOL, NIST " torr");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 mmHg"), 1.333224e2, B8_TOL, NIST " millimeter of mercury, conventional");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1 inH2O"), 2.49082e2, B8_TOL, NIST " inch of water (39.2 degF)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENERGY, "1 Btu/lbm"), 2.326e3, 1e-12, NIST " Btu_IT per pound (exact)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "1 Btu/(lbm R)"), 4.1868e3, 1e-12,
              NIST " Btu_IT per pound degree Fahrenheit (exact)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "1 Btu/lbm-degF"), 4.1868e3, 1e-12,
              NIST " Btu_IT per pound degree Fahrenheit (exact)");
    CHECK_REL(parse_ok(GC_Q_POWER, "1 hp"), 7.456999e2, B8_TOL, NIST " horsepower (550 ft lbf/s)");
    CHECK_REL(parse_ok(GC_Q_ENERGY, "1 Btu"), 1.055056e3, 1e-6, NIST " British thermal unit_IT");
    CHECK_REL(parse_ok(GC_Q_ENERGY, "1 kWh"), 3.6e6, 1e-15, NIST " kilowatt hour (exact)");
    CHECK_REL(parse_ok(GC_Q_ENERGY, "1 cal"), 4.1868, 1e-15, NIST " calorie_IT (exact)");
    CHECK_REL(parse_ok(GC_Q_LENGTH, "1 ft"), 0.3048, 1e-15, NIST " foot (exact)");
    CHECK_REL(parse_ok(GC_Q_LENGTH, "1 in"), 0.0254, 1e-15, NIST " inch (exact)");
    CHECK_REL(parse_ok(GC_Q_LENGTH, "1 mi"), 1.609344e3, 1e-15, NIST " mile (international, exact)");
    CHECK_REL(parse_ok(GC_Q_MASS, "1 lbm"), 0.45359237, 1e-15, NIST " pound avoirdupois (exact)");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1 gal"), 3.785412e-3, B8_TOL, NIST " gallon (U.S.)");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1 ft3"), 2.831685e-2, B8_TOL, NIST " cubic foot");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1 in3"), 1.638706e-5, B8_TOL, NIST " cubic inch");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1 L"), 1.0e-3, 1e-15, NIST " liter (exact)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_VOLUME, "1 ft3/lbm"), 6.242796e-2, B8_TOL, NIST " cubic foot per pound");
    CHECK_REL(parse_ok(GC_Q_DENSITY, "1 lbm/ft3"), 1.601846e1, B8_TOL, NIST " pound per cubic foot");
    CHECK_REL(parse_ok(GC_Q_VELOCITY, "1 mph"), 4.4704e-1, 1e-15, NIST " mile per hour (exact)");
    CHECK_REL(parse_ok(GC_Q_VELOCITY, "1 kn"), 5.144444e-1, B8_TOL, NIST " knot");
    CHECK_REL(parse_ok(GC_Q_VELOCITY, "1 ft/s"), 3.048e-1, 1e-15, NIST " foot per second (exact)");
    CHECK_REL(parse_ok(GC_Q_MASS_FLOW, "1 lbm/s"), 4.535924e-1, B8_TOL, NIST " pound per second");
    CHECK_REL(parse_ok(GC_Q_MASS_FLOW, "1 lbm/h"), 1.259979e-4, 1e-6, NIST " pound per hour");
    CHECK_REL(parse_ok(GC_Q_ANGLE, "1 deg"), 1.745329e-2, 1e-6, NIST " degree (angle)");
    /* B.8: revolution per minute = 1.047198E-01 rad/s; our base is rev/s. */
    CHECK_REL(parse_ok(GC_Q_ROTATIONAL_SPEED, "60 rpm"), 1.0, 1e-15, "definition of rpm");
    CHECK_REL(parse_ok(GC_Q_ROTATIONAL_SPEED, "1 rad/s") * 60.0, 1.0 / 1.047198e-1, 1e-6,
              NIST " revolution per minute");
    /* heat rate: 1 Btu/kWh = Btu_IT / kWh, both B.8 entries */
    CHECK_REL(parse_ok(GC_Q_HEAT_RATE, "1 Btu/kWh"), 1.055056e3 / 3.6e6, 1e-6, NIST " Btu_IT and kWh");
}

/* The value strings of the API conventions. */
static void test_parse_examples(void)
{
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "25 degC"), 298.15, 1e-12, NIST " degree Celsius");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "59 degF"), 288.15, 1e-12, NIST " degree Fahrenheit");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "1200 R"), 1200.0 / 1.8, 1e-12, NIST " degree Rankine");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "300 K"), 300.0, 0.0, "identity");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "300"), 300.0, 0.0, "default unit K");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, " -40 \xC2\xB0" "F "), 233.15, 1e-12, "-40 degF = -40 degC");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE_DIFFERENCE, "18 degF"), 10.0, 1e-12, "interval, B.8");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE_DIFFERENCE, "10 degC"), 10.0, 1e-12, "interval");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "12 bar"), 1.2e6, 1e-15, "bar");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "14.7 psi"), 14.7 * 6894.757293168361, 1e-12, "psi");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "1.5 MPa"), 1.5e6, 1e-15, "MPa");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "101.325"), 101325.0, 1e-15, "default unit kPa");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENERGY, "800 kJ/kg"), 8e5, 1e-15, "kJ/kg");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENERGY, "0.3 Btu/lbm"), 697.8, 1e-12, "Btu/lbm = 2326 J/kg");
    CHECK_REL(parse_ok(GC_Q_POWER, "45 MW"), 4.5e7, 1e-15, "MW");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1.6 L"), 1.6e-3, 1e-15, "L");
    CHECK_REL(parse_ok(GC_Q_VOLUME, "1600 cm3"), 1.6e-3, 1e-12, "cm3");
    CHECK_REL(parse_ok(GC_Q_ROTATIONAL_SPEED, "3000 rpm"), 50.0, 1e-15, "rpm");
    CHECK_REL(parse_ok(GC_Q_LENGTH, "320 m"), 320.0, 1e-15, "m");
    CHECK_REL(parse_ok(GC_Q_LENGTH, "1000 ft"), 304.8, 1e-15, "ft");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "0.35 kJ/kg/K"), 350.0, 1e-15, "kJ/kg/K");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "0.35 kJ/(kg K)"), 350.0, 1e-15, "kJ/(kg K)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "0.35 kJ/kg-K"), 350.0, 1e-15, "kJ/kg-K");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "350 J/(kg*K)"), 350.0, 1e-15, "J/(kg*K)");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "1.005"), 1005.0, 1e-15, "default unit kJ/(kg K)");
    CHECK_REL(parse_ok(GC_Q_MASS_FLOW, "3600 kg/h"), 1.0, 1e-15, "kg/h");
    CHECK_REL(parse_ok(GC_Q_HEAT_RATE, "9000 kJ/kWh"), 2.5, 1e-15, "kJ/kWh");
    CHECK_REL(parse_ok(GC_Q_HEAT_RATE, "9000"), 2.5, 1e-15, "default unit kJ/kWh");
    CHECK_REL(parse_ok(GC_Q_FRACTION, "85 %"), 0.85, 1e-15, "percent");
    CHECK_REL(parse_ok(GC_Q_FRACTION, "0.85"), 0.85, 1e-15, "plain fraction");
    CHECK_REL(parse_ok(GC_Q_RATIO, "1e1"), 10.0, 1e-15, "exponent form");
    CHECK_REL(parse_ok(GC_Q_MASS_FLOW, "2 s^-1 kg"), 2.0, 1e-15, "negative exponent");
    CHECK_REL(parse_ok(GC_Q_VELOCITY, "12m/s"), 12.0, 1e-15, "no space before the unit");
}

/* si -> us -> si with the labels the response names. */
static void test_round_trips(void)
{
    for (int q = 0; q < GC_Q_COUNT; q++) {
        for (int sys = 0; sys < 2; sys++) {
            double si = 345.678;
            double shown = gc_units_from_si((gc_quantity)q, (gc_unit_system)sys, si);
            const char *label = gc_units_label((gc_quantity)q, (gc_unit_system)sys);
            double back = 0.0;
            gc_error err;
            gc_error_clear(&err);
            int rc = gc_units_to_si((gc_quantity)q, shown, strcmp(label, "-") ? label : "", &back, &err);
            if (rc != GC_OK)
                fprintf(stderr, "%s %s: %s\n", gc_quantity_name((gc_quantity)q), label, err.message);
            CU_ASSERT_EQUAL(rc, GC_OK);
            CHECK_REL(back, si, 1e-13, "round trip through the system's own label");
        }
    }
    CHECK_ABS(gc_units_from_si(GC_Q_AMBIENT_TEMPERATURE, GC_UNITS_US, 288.15), 59.0, 1e-12,
              "288.15 K = 59 degF");
    CHECK_ABS(gc_units_from_si(GC_Q_TEMPERATURE, GC_UNITS_US, 288.15), 518.67, 1e-12,
              "288.15 K = 518.67 R");
    CHECK_REL(gc_units_from_si(GC_Q_PRESSURE, GC_UNITS_US, 101325.0), 14.69595, 1e-6,
              "1 atm = 14.69595 psi (from the B.8 factors)");
    double v = 0.0;
    CU_ASSERT_EQUAL(gc_units_from_si_unit(GC_Q_TEMPERATURE, 373.15, "degC", &v, NULL), GC_OK);
    CHECK_ABS(v, 100.0, 1e-12, "373.15 K = 100 degC");
    CU_ASSERT_STRING_EQUAL(gc_units_label(GC_Q_SPECIFIC_ENTROPY, GC_UNITS_US), "Btu/(lbm R)");
    CU_ASSERT_STRING_EQUAL(gc_units_label(GC_Q_HEAT_RATE, GC_UNITS_SI), "kJ/kWh");
    gc_unit_system s;
    CU_ASSERT_EQUAL(gc_units_system_parse("us", &s), GC_OK);
    CU_ASSERT_EQUAL(s, GC_UNITS_US);
    CU_ASSERT_EQUAL(gc_units_system_parse("imperial", &s), GC_ERR_INVALID);
}

static void test_errors(void)
{
    parse_err(GC_Q_TEMPERATURE, "12 bar", "unit 'bar' is a pressure, expected a temperature");
    parse_err(GC_Q_PRESSURE, "300 K", "unit 'K' is a temperature, expected a pressure");
    parse_err(GC_Q_SPECIFIC_ENERGY, "5 kJ", "unit 'kJ' is an energy, expected a specific energy");
    parse_err(GC_Q_PRESSURE, "12 bar x", "unknown unit 'x'");
    parse_err(GC_Q_PRESSURE, "12 bars", "unknown unit 'bars'");
    parse_err(GC_Q_PRESSURE, "12 psig", "gauge pressure");
    parse_err(GC_Q_PRESSURE, "12 %", "for dimensionless values");
    parse_err(GC_Q_RATIO, "12 kJ/kWh", "expected a dimensionless ratio");
    parse_err(GC_Q_TEMPERATURE, "nan", "NaN and Infinity");
    parse_err(GC_Q_TEMPERATURE, "-inf", "NaN and Infinity");
    parse_err(GC_Q_TEMPERATURE, "Infinity K", "NaN and Infinity");
    parse_err(GC_Q_TEMPERATURE, "1e999", "out of range");
    parse_err(GC_Q_TEMPERATURE, "", "is empty");
    parse_err(GC_Q_TEMPERATURE, "0x1A", "unknown unit");
    parse_err(GC_Q_TEMPERATURE, "hot", "is not a number");
    parse_err(GC_Q_TEMPERATURE, "1,000 K", "cannot read the unit");
    parse_err(GC_Q_SPECIFIC_ENTROPY, "1 kJ/(kg K", "cannot read the unit");
    parse_err(GC_Q_SPECIFIC_ENTROPY, "1 kJ//kg", "cannot read the unit");
    parse_err(GC_Q_LENGTH, "1 m^0", "cannot read the unit");
    parse_err(GC_Q_POWER, "1e308 GW", "too large");
}

static gc_reading read_ok(gc_quantity q, const char *text, const gc_units_opts *o)
{
    gc_reading r;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_units_read(q, text, o, &r, &err);
    if (rc != GC_OK)
        fprintf(stderr, "read '%s' failed: %s\n", text, err.message);
    CU_ASSERT_EQUAL(rc, GC_OK);
    return r;
}

static void read_err(gc_quantity q, const char *text, const gc_units_opts *o, const char *want)
{
    gc_reading r;
    gc_error err;
    gc_error_clear(&err);
    CU_ASSERT_EQUAL(gc_units_read(q, text, o, &r, &err), GC_ERR_INVALID);
    if (!strstr(err.message, want))
        fprintf(stderr, "read '%s': message '%s' lacks '%s'\n", text, err.message, want);
    CU_ASSERT_PTR_NOT_NULL(strstr(err.message, want));
}

/* Spellings people type (issue 17): "25 C", "80 F", "25 °C", "deg C", percent everywhere. */
static void test_spellings(void)
{
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "25 C"), 298.15, 1e-12, NIST " degree Celsius");
    CHECK_ABS(parse_ok(GC_Q_AMBIENT_TEMPERATURE, "80 F"), (80.0 + 459.67) / 1.8, 1e-12,
              NIST " degree Fahrenheit");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "25 \xC2\xB0" "C"), 298.15, 1e-12, "degree sign");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "25 deg C"), 298.15, 1e-12, "deg C");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE, "25 Celsius"), 298.15, 1e-12, "Celsius");
    CHECK_ABS(parse_ok(GC_Q_TEMPERATURE_DIFFERENCE, "18 F"), 10.0, 1e-12, "F as an interval");
    CHECK_REL(parse_ok(GC_Q_SPECIFIC_ENTROPY, "0.24 Btu/lbm F"), 0.24 * 4186.8, 1e-12,
              NIST " Btu_IT per pound degree Fahrenheit (exact)");
    CHECK_REL(parse_ok(GC_Q_RATIO, "1550 %"), 15.5, 1e-15, "percent on a ratio");
    CHECK_REL(parse_ok(GC_Q_FRACTION, "42 percent"), 0.42, 1e-15, "percent spelled out");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "12 bara"), 1.2e6, 1e-15, "bar, absolute");
    CHECK_REL(parse_ok(GC_Q_PRESSURE, "12 bar(a)"), 1.2e6, 1e-15, "bar(a)");
    CHECK_REL(parse_ok(GC_Q_MASS_FLOW, "86.4 t/d"), 1.0, 1e-12, NIST " day 8.64E+04 s");
    parse_err(GC_Q_HEAT_RATE, "42 %", "for dimensionless values");
}

/* Every unit a quantity lists as accepted parses for it (the lists are what
 * the messages offer). */
static void test_accepted_lists(void)
{
    for (int q = 0; q < GC_Q_COUNT; q++) {
        const char *p = gc_units_accepted((gc_quantity)q);
        CU_ASSERT(strlen(p) > 0);
        while (*p) {
            size_t n = strcspn(p, ",");
            char text[64];
            snprintf(text, sizeof text, "2 %.*s", (int)n, p);
            gc_reading r;
            gc_error err;
            gc_error_clear(&err);
            int rc = gc_units_read((gc_quantity)q, text, NULL, &r, &err);
            if (rc != GC_OK)
                fprintf(stderr, "%s: accepted '%s' fails: %s\n", gc_quantity_name((gc_quantity)q),
                        text, err.message);
            CU_ASSERT_EQUAL(rc, GC_OK);
            p += n;
            while (*p == ',' || *p == ' ')
                p++;
        }
    }
}

/* A refused unit names the closest accepted one and the list. */
static void test_suggestions(void)
{
    parse_err(GC_Q_PRESSURE, "100 kpa", "did you mean 'kPa'?");
    parse_err(GC_Q_PRESSURE, "100 kpa", "Units of a pressure: Pa, hPa, kPa");
    parse_err(GC_Q_TEMPERATURE, "25 degc", "did you mean 'degC'?");
    parse_err(GC_Q_SPECIFIC_ENERGY, "800 kj/kg", "did you mean 'kJ/kg'?");
    parse_err(GC_Q_POWER, "45 Mw", "did you mean 'MW'?");
    parse_err(GC_Q_TEMPERATURE, "12 bar", "(K, degC, ");
    parse_err(GC_Q_LENGTH, "3 furlongs", "units of a length: m, km");
    CU_ASSERT_PTR_NULL(gc_units_suggest(GC_Q_PRESSURE, "kPa"));
    CU_ASSERT_PTR_NULL(gc_units_suggest(GC_Q_PRESSURE, "xyzzy"));
}

/* Gauge pressures and standard volume flows come back for the caller to complete. */
static void test_readings(void)
{
    gc_reading r = read_ok(GC_Q_PRESSURE, "5 barg", NULL);
    CU_ASSERT_EQUAL(r.kind, GC_READING_GAUGE);
    CHECK_REL(r.si, 5e5, 1e-15, NIST " bar (exact)");
    r = read_ok(GC_Q_PRESSURE, "75 psig", NULL);
    CU_ASSERT_EQUAL(r.kind, GC_READING_GAUGE);
    CHECK_REL(r.si, 75 * 6.894757e3, B8_TOL, NIST " pound-force per square inch");
    r = read_ok(GC_Q_PRESSURE, "2 bar(g)", NULL);
    CU_ASSERT_EQUAL(r.kind, GC_READING_GAUGE);
    CU_ASSERT_STRING_EQUAL(r.unit, "bar(g)");
    r = read_ok(GC_Q_PRESSURE, "300 kPag", NULL);
    CHECK_REL(r.si, 3e5, 1e-15, "kPa, gauge");
    r = read_ok(GC_Q_MASS_FLOW, "3600 Sm3/h", NULL);
    CU_ASSERT_EQUAL(r.kind, GC_READING_STD_VOLUME);
    CU_ASSERT_EQUAL(r.cond, GC_STD_ISO_13443);
    CHECK_REL(r.si, 1.0, 1e-15, "Sm3/h -> m3/s");
    r = read_ok(GC_Q_MASS_FLOW, "60 scfm", NULL);
    CU_ASSERT_EQUAL(r.cond, GC_STD_US_60F);
    CHECK_REL(r.si, 2.831685e-2, B8_TOL, NIST " cubic foot per minute (as 60 scfm in m3/s)");
    r = read_ok(GC_Q_MASS_FLOW, "24 MMSCFD", NULL);
    CHECK_REL(r.si, 24e6 * 2.831685e-2 / 86400.0, B8_TOL, "MMscfd: a million cubic feet a day");
    r = read_ok(GC_Q_MASS_FLOW, "1 Nm3/s", NULL);
    CU_ASSERT_EQUAL(r.cond, GC_STD_NORMAL);
    read_err(GC_Q_TEMPERATURE, "5 barg", NULL, "is a gauge pressure, expected a temperature");
    read_err(GC_Q_PRESSURE_DIFFERENCE, "5 barg", NULL, "is a gauge pressure");
    read_err(GC_Q_POWER, "10 Sm3/h", NULL, "volume flow at standard conditions");
    parse_err(GC_Q_PRESSURE, "5 barg", "needs a barometric pressure");
    parse_err(GC_Q_MASS_FLOW, "5 scfh", "needs the gas's density");
    /* The gauge value lands above the barometric pressure the caller adds. */
    r = read_ok(GC_Q_PRESSURE, "0 psig", NULL);
    CHECK_ABS(r.si, 0.0, 0.0, "zero gauge");
}

/* Ideal-gas densities at the named conditions, against the ideal-gas law
 * worked by hand: methane M = 16.04246 g/mol (IUPAC atomic weights, from
 * memory), dry air M = 28.9647 g/mol (from memory), R = 8.314462618 J/(mol K). */
static void test_std_density(void)
{
    double T, P;
    const char *name;
    CU_ASSERT_EQUAL(gc_units_std_conditions(GC_STD_ISO_13443, &T, &P, &name), GC_OK);
    CHECK_ABS(T, 288.15, 0.0, "ISO 13443: 15 degC");
    CHECK_ABS(P, 101325.0, 0.0, "ISO 13443: 101.325 kPa");
    CU_ASSERT_PTR_NOT_NULL(strstr(name, "ISO 13443"));
    CU_ASSERT_EQUAL(gc_units_std_conditions(GC_STD_US_60F, &T, &P, &name), GC_OK);
    CHECK_ABS(T, 288.7055555555556, 1e-9, "60 degF");
    CHECK_REL(P, 101325.0, 5e-6, "14.696 psia is one standard atmosphere to 5 digits");
    double rho = gc_units_std_density(GC_STD_ISO_13443, 0.01604246);
    CHECK_REL(rho, 101325.0 * 0.01604246 / (8.314462618 * 288.15), 1e-12, "P M / (R T)");
    /* ISO 6976 gives methane's real-gas density at 15 degC, 101.325 kPa as 0.6798 kg/m3
     * (from memory); the ideal gas is about 0.2 % lighter. */
    CHECK_REL(rho, 0.6798, 3e-3, "methane at ISO 13443 conditions, real gas within 0.3 %");
    CHECK_REL(gc_units_std_density(GC_STD_NORMAL, 0.0289647), 1.2929, 1e-3,
              "dry air at 0 degC, 1 atm: 1.2929 kg/m3 real gas (from memory)");
    CU_ASSERT_EQUAL(gc_units_std_conditions(GC_STD_NONE, &T, &P, &name), GC_ERR_INVALID);
}

/* Plain numbers in the input system; decimal commas when asked. */
static void test_input_system_and_commas(void)
{
    gc_units_opts us = { GC_UNITS_US, 0 }, comma = { GC_UNITS_SI, 1 };
    CHECK_ABS(read_ok(GC_Q_TEMPERATURE, "2000", &us).si, 2000.0 / 1.8, 1e-9, "plain us: R");
    CHECK_ABS(read_ok(GC_Q_AMBIENT_TEMPERATURE, "59", &us).si, 288.15, 1e-9, "plain us: degF");
    CHECK_REL(read_ok(GC_Q_PRESSURE, "14.7", &us).si, 14.7 * 6894.757293168361, 1e-12,
              "plain us: psia");
    CHECK_REL(read_ok(GC_Q_POWER, "45000", &us).si, 4.5e7, 1e-15, "plain us power: kW");
    CHECK_REL(read_ok(GC_Q_PRESSURE, "1500 kPa", &us).si, 1.5e6, 1e-15, "a unit wins");
    CHECK_REL(read_ok(GC_Q_FRACTION, "0,55", &comma).si, 0.55, 1e-15, "decimal comma");
    CHECK_REL(read_ok(GC_Q_PRESSURE, "1,5 bar", &comma).si, 1.5e5, 1e-15, "comma and unit");
    CHECK_REL(read_ok(GC_Q_RATIO, "10.5", &comma).si, 10.5, 1e-15, "a plain point still reads");
    CHECK_REL(read_ok(GC_Q_RATIO, "0.925", &comma).si, 0.925, 1e-15, "0.xxx is no group");
    CHECK_REL(read_ok(GC_Q_RATIO, "-2,5e3", &comma).si, -2500.0, 1e-15, "comma and exponent");
    read_err(GC_Q_RATIO, "1.500", &comma, "could be a decimal or a thousands group");
    read_err(GC_Q_RATIO, "1.234,5", &comma, "more than one separator");
    read_err(GC_Q_RATIO, "1,234.5", &comma, "more than one separator");
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "factors against NIST SP 811 B.8", test_nist_factors },
        { "value strings with units", test_parse_examples },
        { "round trips and labels", test_round_trips },
        { "error messages", test_errors },
        { "spellings and percent", test_spellings },
        { "accepted lists parse", test_accepted_lists },
        { "suggestions", test_suggestions },
        { "gauge and standard volume readings", test_readings },
        { "standard densities", test_std_density },
        { "input system and decimal commas", test_input_system_and_commas },
        { NULL, NULL },
    };
    return gc_run_suite("units", cases);
}
