/*
 * test_localise.c — the API layer's message helpers of issue 17: figures of
 * a message in the unit the user wrote (respond/localise.c) and lists of
 * names that never end inside a name (request/decode.c). Conversion factors:
 * NIST SP 811 (2008) B.8 (psi 6.894757E+03 Pa, degF), exact SI prefixes.
 */
#include "check.h"
#include "api/request/decode.h"
#include "api/respond/localise.h"

#include <string.h>

static void expect(const char *in, int q, const char *written, gc_unit_system sys,
                   const char *want)
{
    char msg[256];
    snprintf(msg, sizeof msg, "%s", in);
    gc_api_localise(msg, sizeof msg, q, written, sys);
    if (strcmp(msg, want) != 0)
        fprintf(stderr, "localise '%s' (%s): got '%s', want '%s'\n", in,
                written ? written : "-", msg, want);
    CU_ASSERT_STRING_EQUAL(msg, want);
}

static void test_written_unit(void)
{
    /* the field's quantity: figures of its dimension in the unit written */
    expect("must be at most 2000000 kW", GC_Q_POWER, "MW", GC_UNITS_SI, "must be at most 2000 MW");
    expect("no air flow gives 2e+07 W", GC_Q_POWER, "MW", GC_UNITS_SI, "no air flow gives 20 MW");
    expect("must be at least 300 K", GC_Q_TEMPERATURE, "degC", GC_UNITS_SI,
           "must be at least 26.85 degC");
    expect("must be at most 2500 K", GC_Q_AMBIENT_TEMPERATURE, "degF", GC_UNITS_US,
           "must be at most 4040.33 degF");
    /* a gauge unit: bounds as its absolute counterpart (no barometric offset in a bound) */
    expect("must be greater than 0 kPa", GC_Q_PRESSURE, "barg", GC_UNITS_SI,
           "must be greater than 0 bar");
    expect("must be at most 100000 kPa", GC_Q_PRESSURE, "psig", GC_UNITS_SI,
           "must be at most 14503.8 psi");
}

static void test_system_units(void)
{
    /* no unit written: SI base figures of the core's sentences in the answer's system */
    expect("the pressure limit (150000 Pa) is below", -1, NULL, GC_UNITS_SI,
           "the pressure limit (150 kPa) is below");
    expect("the pressure limit (150000 Pa) is below", -1, NULL, GC_UNITS_US,
           "the pressure limit (21.7557 psia) is below");
    expect("ends at 1500 K, below", -1, NULL, GC_UNITS_SI, "ends at 1500 K, below");
    expect("ends at 1500 K, below", -1, NULL, GC_UNITS_US, "ends at 2700 R, below");
    expect("the heat (8e+05 J/kg) is less", -1, NULL, GC_UNITS_SI, "the heat (800 kJ/kg) is less");
    /* figures of other quantities than the written one's stay in the system */
    expect("needs 5e+06 W at 1500 K", GC_Q_PRESSURE, "bar", GC_UNITS_SI, "needs 5000 kW at 1500 K");
    /* words and numbers that are no figures are left alone */
    expect("CO2 at 12 % and process 3 of 4", GC_Q_POWER, "MW", GC_UNITS_SI,
           "CO2 at 12 % and process 3 of 4");
    expect("must be 1 or 2", GC_Q_RATIO, NULL, GC_UNITS_US, "must be 1 or 2");
}

static void test_name_lists(void)
{
    static const char *const names[] = { "pressure_ratio", "turbine_inlet_temperature",
                                         "compressor_efficiency", "turbine_efficiency",
                                         "regenerator_effectiveness", "site", "fuel" };
    char buf[80];
    size_t more = gc_decode_name_list(buf, sizeof buf, names, 7, 0);
    CU_ASSERT(more > 0);
    CU_ASSERT(strlen(buf) < sizeof buf);
    /* every listed name is whole: the text before " and N more" splits into names */
    char *tail = strstr(buf, " and ");
    CU_ASSERT_PTR_NOT_NULL(tail);
    if (tail) {
        char list[80];
        snprintf(list, sizeof list, "%.*s", (int)(tail - buf), buf);
        size_t n = 0;
        for (char *t = strtok(list, ", "); t; t = strtok(NULL, ", ")) {
            CU_ASSERT_STRING_EQUAL(t, names[n]);
            n++;
        }
        CU_ASSERT_EQUAL(n + more, 7);
    }
    char all[200];
    CU_ASSERT_EQUAL(gc_decode_name_list(all, sizeof all, names, 7, 1), 0);
    CU_ASSERT_STRING_EQUAL(all, "'pressure_ratio', 'turbine_inlet_temperature', "
                                "'compressor_efficiency', 'turbine_efficiency', "
                                "'regenerator_effectiveness', 'site', 'fuel'");
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "figures in the unit written", test_written_unit },
        { "figures in the answer's system", test_system_units },
        { "name lists end on whole names", test_name_lists },
        { NULL, NULL },
    };
    return gc_run_suite("localise", cases);
}
