/*
 * test_combined.c — the combined-cycle preset (gascycle/combined.h) and the
 * nested-preset field (GC_FT_PRESET, preset.h):
 *
 * 1. Against an independent calculation in Python with python3-iapws
 *    (IAPWS-IF97), tests/reference/steam_cycles_iapws97.csv written by
 *    tools/ref/gen_steam_iapws.py, THROUGH THE ROUTE (the request as JSON,
 *    decoded, evaluated and written by the API's preset answer): Rankine
 *    cycles, a reheat cycle with a deaerator fed by a bleed, and
 *    single-pressure HRSGs with a gas of constant cp designed by pinch and
 *    approach, behind an exhaust given as it is; to 1e-6 relative (the
 *    issue's figure).
 * 2. The topping through its descriptor is the Brayton route's own answer:
 *    net power, fuel heat and exhaust temperature equal those of a direct
 *    evaluation of the Brayton preset (the same code path: exact).
 * 3. Energy closure and the pinch over a grid of plants (Brayton toppings
 *    air-standard and fuel-fired, one to three levels, reheat, duct firing,
 *    cooling-water condenser): the plant's energy closure and exergy balance
 *    to 1e-9 (first and second law, the figure), every designed pinch
 *    and approach met, the gas hotter than the water everywhere sampled, no
 *    process generating negative entropy; the efficiency below the
 *    reversible-bottoming bound, the ideal bound below Carnot (second law);
 *    an infeasible design refused (never a check failure).
 * 4. Errors by field: the steam core's pointers mapped to this preset's
 *    fields, the topping's by path (through the route and in process),
 *    conflicting inputs; the diagrams.
 * 5. The tables: every output row named, every topping's structs fit.
 * Run from the repository root (the reference table is read by path).
 */
#include "check.h"
#include "refcsv_wide.h"
#include "api/api.h"
#include "api/handlers.h"
#include "gascycle/brayton.h"
#include "gascycle/combined.h"

#include <jansson.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define REF_CSV "tests/reference/steam_cycles_iapws97.csv"
#define REF_COLS 24
#define SRC_PY "independent Python calculation with python3-iapws, " REF_CSV

/* ---- helpers ------------------------------------------------------------------------ */

/* The route's answer to a JSON body (si units); the document or NULL. */
static json_t *answer(json_t *body, int *status)
{
    gc_api_response r;
    memset(&r, 0, sizeof r);
    gc_api_preset_answer(gc_combined_preset(), body, 0, 0, &r);
    *status = r.status;
    json_t *doc = r.body ? json_loadb(r.body, r.body_len, 0, NULL) : NULL;
    if (r.status != 200 && r.body)
        fprintf(stderr, "  answer %d: %.*s\n", r.status, (int)(r.body_len < 600 ? r.body_len
                                                                             : 600), r.body);
    free(r.body);
    return doc;
}

static double num_at(json_t *doc, const char *a, const char *b)
{
    json_t *v = json_object_get(json_object_get(doc, a), b);
    return json_is_number(v) ? json_number_value(v) : NAN;
}

static json_t *state_named(json_t *doc, const char *name)
{
    size_t i;
    json_t *s;
    json_array_foreach(json_object_get(doc, "states"), i, s)
        if (strcmp(json_string_value(json_object_get(s, "station")), name) == 0)
            return s;
    return NULL;
}

static json_t *with_unit(double v, const char *unit)
{
    char buf[64];
    snprintf(buf, sizeof buf, "%.17g %s", v, unit);
    return json_string(buf);
}

/* ---- 1. against python3-iapws, through the route ---------------------------------------- */

/* The reference row as a request: kind 3 the row's HRSG (gas of constant
 * cp; any R: the energy balance uses cp only), kinds 1 and 2 a fixed steam
 * flow of 1 kg/s behind a hot, large exhaust (the cycle's figures do not
 * depend on the gas then). */
static json_t *ref_request(const double *r)
{
    int kind = (int)r[0];
    double cp = kind == 3 ? r[9] : 1100.0;
    json_t *gas = json_pack("{s:s, s:o, s:f}", "model", "cold", "cp", with_unit(cp, "J/(kg K)"),
                            "k", cp / (cp - 287.0));
    json_t *ex = json_pack("{s:o, s:o, s:o}", "gas", gas, "temperature",
                           with_unit(kind == 3 ? r[10] : 1000.0, "K"), "mass_flow",
                           with_unit(kind == 3 ? r[11] : 60.0, "kg/s"));
    json_t *lvl = json_pack("{s:o}", "pressure", with_unit(r[1], "Pa"));
    if (r[2] > 0.0)
        json_object_set_new(lvl, "steam_temperature", with_unit(r[2], "K"));
    if (kind == 3) {
        json_object_set_new(lvl, "pinch", with_unit(r[12], "K"));
        json_object_set_new(lvl, "approach", with_unit(r[13], "K"));
    } else {
        json_object_set_new(lvl, "steam_mass_flow", with_unit(1.0, "kg/s"));
    }
    json_t *body = json_pack("{s:{s:s, s:o}, s:[o], s:o, s:f, s:f}", "topping", "cycle",
                             "exhaust", "inputs", ex, "levels", lvl, "condenser_pressure",
                             with_unit(r[3], "Pa"), "turbine_efficiency", r[4],
                             "pump_efficiency", r[5]);
    if (kind == 2) {
        json_object_set_new(body, "reheat_pressure", with_unit(r[6], "Pa"));
        json_object_set_new(body, "reheat_temperature", with_unit(r[7], "K"));
        json_object_set_new(body, "deaerator_pressure", with_unit(r[8], "Pa"));
    }
    return body;
}

static double worst_rel;

static void near(double got, double want, const char *what)
{
    CHECK_REL(got, want, 1e-6, what);
    if (want != 0.0)
        worst_rel = fmax(worst_rel, fabs(got - want) / fabs(want));
}

static void check_ref_row(const double *r, json_t *doc)
{
    json_t *lv = json_array_get(json_object_get(doc, "levels"), 0);
    double m = json_number_value(json_object_get(lv, "steam_mass_flow"));
    double kW = 1000.0, kJ = 1000.0;
    near(num_at(doc, "summary", "steam_cycle_efficiency"), r[14], SRC_PY " efficiency");
    near(num_at(doc, "summary", "steam_cycle_net_power") * kW / m, r[15], SRC_PY " w_net");
    near(num_at(doc, "summary", "condenser_heat") * kW / m, r[17], SRC_PY " q_cond");
    if (r[16] >= 0.0)
        CHECK_ABS(num_at(doc, "summary", "exhaust_quality"), r[16], 1e-6, SRC_PY " x_exit");
    if ((int)r[0] == 2) {
        json_t *bleed = state_named(doc, "bleed");
        CU_ASSERT_PTR_NOT_NULL_FATAL(bleed);
        near(json_number_value(json_object_get(bleed, "mass_flow")) / m, r[18], SRC_PY " beta");
    }
    if ((int)r[0] != 3)
        return;
    near(m, r[19], SRC_PY " m_steam");
    near(num_at(doc, "summary", "stack_temperature"), r[20], SRC_PY " T_stack");
    near(num_at(doc, "summary", "heat_to_steam") * kW, r[21], SRC_PY " Q_gas");
    near(num_at(doc, "summary", "net_power") * kW, r[22], SRC_PY " net power");
    json_t *g = state_named(doc, "hp_superheater_gas_exit");
    CU_ASSERT_PTR_NOT_NULL_FATAL(g);
    near(json_number_value(json_object_get(g, "T")), r[23], SRC_PY " T_gas_sh");
    (void)kJ;
}

static void test_against_python_through_route(void)
{
    static double r[32][REFCSV_WIDE_MAX_COLS];
    int n = refcsv_read_wide(REF_CSV, REF_COLS, r, 32);
    CU_ASSERT_FATAL(n >= 10);
    worst_rel = 0.0;
    for (int i = 0; i < n; i++) {
        int status = 0;
        json_t *body = ref_request(r[i]);
        json_t *doc = answer(body, &status);
        json_decref(body);
        CU_ASSERT_EQUAL_FATAL(status, 200);
        CU_ASSERT_PTR_NOT_NULL_FATAL(doc);
        check_ref_row(r[i], doc);
        json_decref(doc);
    }
    printf("\n  combined route vs python3-iapws: %d cases, worst relative difference %.2e\n",
           n, worst_rel);
}

/* ---- 2. the topping is the Brayton route's answer ----------------------------------------- */

static void quillmere_like_brayton(gc_brayton_input *b)
{
    gc_brayton_input_init(b);
    b->pressure_ratio = 15.5;
    b->turbine_inlet_temperature = 1480.0;
    b->compressor_efficiency = 0.87;
    b->turbine_efficiency = 0.9;
    b->exhaust_pressure_loss = 0.03;
    b->generator_efficiency = 0.985;
    b->net_power = 45e6;
    b->has_net_power = 1;
    gc_error e;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&b->fuel, "methane", &e), GC_OK);
    b->has_fuel = 1;
}

static gc_combined_input cin;
static gc_combined_result cres;
static gc_brayton_result bres;

static void test_topping_is_brayton(void)
{
    gc_combined_input_init(&cin);
    gc_brayton_input *b = gc_combined_set_topping(&cin, "brayton");
    CU_ASSERT_PTR_NOT_NULL_FATAL(b);
    quillmere_like_brayton(b);
    gc_report rep;
    gc_report_init(&rep);
    CU_ASSERT_EQUAL_FATAL(gc_preset_evaluate(gc_combined_preset(), &cin, &cres, &rep), GC_OK);
    gc_brayton_input direct;
    quillmere_like_brayton(&direct);
    gc_report_init(&rep);
    CU_ASSERT_EQUAL_FATAL(gc_preset_evaluate(gc_brayton_preset(), &direct, &bres, &rep), GC_OK);
    const char *src = "the Brayton preset evaluated directly (same code path)";
    CHECK_REL(cres.summary.gas_turbine_power_W, 45e6, 1e-12, "rated net power as given");
    CHECK_REL(cres.exhaust.fuel_heat_W, bres.heat_input_power, 1e-12, src);
    CHECK_REL(cres.summary.intake_mass_flow_kg_per_s, bres.air_mass_flow, 1e-12, src);
    CHECK_REL(cres.summary.exhaust_temperature_K, bres.T_turbine_exit, 1e-12, src);
    CHECK_REL(cres.summary.exhaust_mass_flow_kg_per_s, bres.exhaust_mass_flow, 1e-12, src);
    CHECK_REL(cres.summary.gas_turbine_efficiency, bres.electric_efficiency, 1e-12, src);
    /* the stack leaves at the site pressure: the exhaust loss is the HRSG's */
    CHECK_REL(cres.exhaust.pressure_loss, 0.03, 1e-12, "the topping's exhaust_pressure_loss");
    int k = gc_steam_station_index(&cres.steam, "stack");
    CU_ASSERT_FATAL(k >= 0);
    CHECK_REL(cres.steam.stations[k].P_Pa, bres.site.P_Pa, 1e-12, "site pressure");
}

/* ---- 3. energy closure and the pinch over a grid -------------------------------------------- */

static int grid_case(int i, gc_combined_input *in)
{
    gc_combined_input_init(in);
    gc_brayton_input *b = gc_combined_set_topping(in, "brayton");
    b->pressure_ratio = (double[]){ 8.0, 14.0, 22.0 }[i % 3];
    b->turbine_inlet_temperature = (double[]){ 1350.0, 1500.0 }[(i / 3) % 2];
    b->compressor_efficiency = 0.86;
    b->turbine_efficiency = 0.89;
    b->exhaust_pressure_loss = 0.025;
    if ((i / 6) % 2) {
        gc_fuel_init_named(&b->fuel, "methane", NULL);
        b->has_fuel = 1;
        b->net_power = 80e6;
        b->has_net_power = 1;
    }
    int n = 1 + (i / 12) % 3;
    in->n_levels = n;
    const double P[3][3] = { { 9e6 }, { 11e6, 0.6e6 }, { 13e6, 2.5e6, 0.4e6 } };
    for (int j = 0; j < n; j++) {
        in->levels[j] = in->levels[0];
        in->levels[j].pressure = P[n - 1][j];
        in->levels[j].steam_temperature = j == 0 ? 700.0 : 0.0;
        in->levels[j].has_steam_temperature = j == 0;
        in->levels[j].pinch = 6.0 + 2.0 * j;
        in->levels[j].approach = 4.0;
    }
    in->turbine_efficiency = 0.87;
    in->pump_efficiency = 0.8;
    in->generator_efficiency = 0.985;
    if ((i / 36) % 2) {
        in->reheat_temperature = 700.0;
        if (n == 1)
            in->reheat_pressure = 2e6;
    }
    if (i % 5 == 0 && b->has_fuel && b->pressure_ratio >= 14.0)
        in->firing_temperature = 950.0;
    if (i % 4 == 1) {
        in->cooling_water_temperature = 290.0;
        in->deaerator_pressure = 1.5e5;
    }
    return n;
}

static void check_plant(const gc_combined_result *r, const char *what)
{
    const gc_combined_checks *c = &r->checks;
    CU_ASSERT(c->energy_hrsg_rel <= 1e-9);
    CU_ASSERT(c->energy_steam_cycle_rel <= 1e-9);
    CU_ASSERT(c->energy_bottoming_rel <= 1e-9);
    CU_ASSERT(c->energy_plant_checked);
    CHECK_ABS(c->energy_plant_rel, 0.0, 1e-9, "first law: plant energy closure");
    if (r->exergy.balance_checked)
        CHECK_ABS(r->exergy.balance_rel, 0.0, 1e-9, "second law: plant exergy balance");
    CHECK_ABS(c->pinch_error_K, 0.0, 1e-6, "designed pinch");
    CHECK_ABS(c->approach_error_K, 0.0, 1e-9, "designed approach");
    CU_ASSERT(c->no_temperature_cross && c->min_temperature_difference_K > 0.0);
    for (int k = 0; k < r->n_processes; k++)
        CU_ASSERT(r->processes[k].exergy_destroyed_W >= -1e-9 * r->summary.fuel_heat_W);
    const gc_combined_bounds *b = &r->bounds;
    CU_ASSERT(r->summary.thermal_efficiency < b->reversible_efficiency);
    CU_ASSERT(b->reversible_efficiency < b->carnot_efficiency);
    if (b->has_ideal)
        CU_ASSERT(b->ideal_efficiency < b->carnot_efficiency);
    if (b->has_ideal_steam)
        CU_ASSERT(r->summary.net_power_W <= b->ideal_steam_net_power_W * (1.0 + 1e-12));
    (void)what;
}

static void test_energy_and_pinch_grid(void)
{
    int ok = 0, refused = 0, fired = 0, checked_exergy = 0;
    for (int i = 0; i < 72; i++) {
        grid_case(i, &cin);
        gc_report rep;
        gc_report_init(&rep);
        int rc = gc_preset_evaluate(gc_combined_preset(), &cin, &cres, &rep);
        if (rc == GC_ERR_INFEASIBLE || rc == GC_ERR_INVALID) {
            refused++;
            continue;
        }
        CU_ASSERT_EQUAL(rc, GC_OK);
        if (rc != GC_OK) {
            fprintf(stderr, "grid %d: %d %s\n", i, rc, rep.n_errors ? rep.errors[0].message : "");
            continue;
        }
        ok++;
        fired += cres.summary.duct_burner_fuel_heat_W > 0.0;
        checked_exergy += cres.exergy.balance_checked;
        check_plant(&cres, "grid");
    }
    printf("\n  grid: %d plants evaluated (%d fired, %d exergy balances), %d refused\n", ok,
           fired, checked_exergy, refused);
    CU_ASSERT(ok >= 40);
    CU_ASSERT(fired >= 3);
    CU_ASSERT(checked_exergy >= 20);
}

/* ---- 4. errors by field, diagrams ------------------------------------------------------------ */

static const char *first_error_field(json_t *body, int *status)
{
    static char field[128];
    json_t *doc = answer(body, status);
    json_decref(body);
    json_t *e = json_array_get(json_object_get(doc, "errors"), 0);
    snprintf(field, sizeof field, "%s", e ? json_string_value(json_object_get(e, "field")) : "");
    json_decref(doc);
    return field;
}

static json_t *brayton_body(void)
{
    return json_pack("{s:{s:s, s:{s:f, s:s}}}", "topping", "cycle", "brayton", "inputs",
                     "pressure_ratio", 14.0, "fuel", "methane");
}

static void test_errors_by_field(void)
{
    int status = 0;
    json_t *b = brayton_body();
    json_object_set_new(json_object_get(json_object_get(b, "topping"), "inputs"),
                        "pressure_ratio", json_real(0.5));
    CU_ASSERT_STRING_EQUAL(first_error_field(b, &status), "/topping/inputs/pressure_ratio");
    CU_ASSERT_EQUAL(status, 422);
    b = brayton_body();
    json_object_set_new(b, "levels", json_pack("[{s:s}, {s:s}]", "pressure", "10 bar",
                                                "pressure", "20 bar"));
    CU_ASSERT_STRING_EQUAL(first_error_field(b, &status), "/levels/1/pressure");
    b = brayton_body();
    json_object_set_new(b, "condenser_pressure", json_string("6 kPa"));
    json_object_set_new(b, "cooling_water_temperature", json_string("20 degC"));
    CU_ASSERT_STRING_EQUAL(first_error_field(b, &status), "/cooling_water_temperature");
    b = json_pack("{s:{s:s, s:{s:s, s:i}}, s:[{s:s, s:i}]}", "topping", "cycle", "exhaust",
                  "inputs", "temperature", "600 K", "mass_flow", 100, "levels", "pressure",
                  "80 bar", "pinch", 50);
    CU_ASSERT_STRING_EQUAL(first_error_field(b, &status), "/levels/0/pinch");
    CU_ASSERT_EQUAL(status, 422);
    b = json_pack("{s:{s:s}}", "topping", "cycle", "rankine");
    CU_ASSERT_STRING_EQUAL(first_error_field(b, &status), "/topping/cycle");
}

/* In process (no decoder): the topping's table bounds through the nested
 * field, its error named by path (gc_report_nested, preset.h). */
static void test_nested_validation_in_process(void)
{
    gc_combined_input_init(&cin);
    gc_brayton_input *b = gc_combined_set_topping(&cin, "brayton");
    CU_ASSERT_PTR_NOT_NULL_FATAL(b);
    b->pressure_ratio = 0.5;
    gc_report rep;
    gc_report_init(&rep);
    CU_ASSERT_EQUAL(gc_preset_evaluate(gc_combined_preset(), &cin, &cres, &rep), GC_ERR_INVALID);
    CU_ASSERT_EQUAL_FATAL(rep.n_errors, 1);
    CU_ASSERT_EQUAL(rep.errors[0].field_id, 0);
    CU_ASSERT_STRING_EQUAL(rep.errors[0].field, "/topping/inputs/pressure_ratio");
    CU_ASSERT_PTR_NULL(gc_combined_set_topping(&cin, "rankine"));
    gc_combined_set_topping(&cin, "exhaust");   /* its temperature is required: 0 refused */
    gc_report_init(&rep);
    CU_ASSERT_EQUAL(gc_preset_evaluate(gc_combined_preset(), &cin, &cres, &rep), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(rep.errors[0].field, "/topping/inputs/temperature");
}

static void test_diagrams(void)
{
    grid_case(22, &cin);
    gc_report rep;
    gc_report_init(&rep);
    CU_ASSERT_EQUAL_FATAL(gc_preset_evaluate(gc_combined_preset(), &cin, &cres, &rep), GC_OK);
    const gc_preset *p = gc_combined_preset();
    const char *names[] = { NULL, "TQ", "Ts", "combined_Ts" };
    for (int i = 0; i < 4; i++) {
        char *svg = NULL;
        size_t len = 0;
        gc_error e;
        gc_error_clear(&e);
        CU_ASSERT_EQUAL(p->svg(&cin, &cres, names[i], NULL, &svg, &len, &e), GC_OK);
        CU_ASSERT(svg && len > 1000 && strstr(svg, "<svg") && strstr(svg, "gc-series-2"));
        free(svg);
    }
    char *svg = NULL;
    size_t len = 0;
    gc_error e;
    CU_ASSERT_EQUAL(p->svg(&cin, &cres, "Pv", NULL, &svg, &len, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/diagram");
    CU_ASSERT_PTR_NULL(svg);
}

/* ---- 5. tables ---------------------------------------------------------------------------------- */

static void test_tables(void)
{
    const gc_preset *p = gc_combined_preset();
    for (int r = 0; r < p->n_outputs; r++) {
        CU_ASSERT_PTR_NOT_NULL(p->outputs[r].name);
        CU_ASSERT(p->outputs[r].parent < r);
    }
    for (int i = 0; gc_combined_toppings[i].preset; i++) {
        const gc_preset *t = gc_combined_toppings[i].preset;
        CU_ASSERT(gc_combined_topping_presets[i] == t);
        CU_ASSERT(t->input_size <= GC_COMBINED_TOPPING_INPUT_BYTES);
        CU_ASSERT(t->result_size <= GC_COMBINED_TOPPING_RESULT_BYTES);
    }
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "tables", test_tables },
        { "against python3-iapws through the route", test_against_python_through_route },
        { "the topping is the Brayton preset's answer", test_topping_is_brayton },
        { "energy closure and pinch over a grid", test_energy_and_pinch_grid },
        { "errors by field", test_errors_by_field },
        { "nested validation in process", test_nested_validation_in_process },
        { "diagrams", test_diagrams },
        { NULL, NULL },
    };
    return gc_run_suite("combined", cases);
}
