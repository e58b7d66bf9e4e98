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
    parse_err(GC_Q_PRESSURE, "12 %", "only accepted for fractions");
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

int main(void)
{
    static const gc_test_case cases[] = {
        { "factors against NIST SP 811 B.8", test_nist_factors },
        { "value strings with units", test_parse_examples },
        { "round trips and labels", test_round_trips },
        { "error messages", test_errors },
        { NULL, NULL },
    };
    return gc_run_suite("units", cases);
}
