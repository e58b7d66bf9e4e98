/*
 * test_steam.c — the steam bottoming cycle and HRSG (gascycle/steam.h):
 *
 * 1. Against an independent calculation in Python with python3-iapws
 *    (IAPWS-IF97), tests/reference/steam_cycles_iapws97.csv written by
 *    tools/ref/gen_steam_iapws.py: simple Rankine cycles, a reheat cycle with
 *    a deaerator fed by a bleed, and single-pressure HRSGs with a gas of
 *    constant cp designed by pinch and approach; to 1e-6 relative (the
 *    issue's figure; seen when written: below 1e-9).
 * 2. Closed checks: energy closure of the HRSG, the steam cycle and the whole
 *    (with a duct burner too) to 1e-9, the exergy balance, entropy
 *    generation >= 0 in every process, efficiency below the Carnot bound
 *    and below the ideal counterpart.
 * 3. The pinch is never violated: over a grid of one-, two- and
 *    three-pressure designs every T-Q point has the gas hotter than the
 *    water, every designed pinch and approach is met, and a design that
 *    cannot be met is refused as infeasible (never a check failure).
 * 4. Fixed steam conditions reproduce the pinch design; the condenser from
 *    cooling water; supplementary firing; coded warnings; input errors.
 * 5. 4000 random designs (fixed seed): each evaluated with its checks
 *    passed, or refused as invalid or infeasible; nothing else.
 * Run from the repository root (the reference table is read by path).
 */
#include "check.h"
#include "refcsv_wide.h"
#include "gascycle/if97.h"
#include "gascycle/steam.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

#define REF_CSV "tests/reference/steam_cycles_iapws97.csv"
#define REF_COLS 24

static gc_steam_result res;   /* about 20 KB: kept off the test's stack */

/* A gas of constant cp (gas.h cold model, k for an ideal gas of cp). */
static void cold_gas(gc_gas *g, double cp)
{
    double R = 287.0;   /* any R: the HRSG's energy balance uses cp only */
    gc_error e;
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(g, cp, cp / (cp - R), &e), GC_OK);
}

/* The reference's cycle inputs on a one-level bottoming cycle; kinds 1 and 2
 * get a fixed steam flow of 1 kg/s behind a hot, large gas flow (the cycle
 * figures do not depend on the gas then). */
static void ref_input(const double *r, gc_steam_input *in)
{
    gc_steam_input_init(in);
    int kind = (int)r[0];
    in->levels[0].pressure_Pa = r[1];
    in->levels[0].steam_temperature_K = r[2];
    in->condenser_pressure_Pa = r[3];
    in->turbine_efficiency = r[4];
    in->pump_efficiency = r[5];
    if (kind == 3) {
        cold_gas(&in->gas, r[9]);
        in->gas_temperature_K = r[10];
        in->intake_mass_flow_kg_per_s = r[11];
        in->levels[0].pinch_K = r[12];
        in->levels[0].approach_K = r[13];
        return;
    }
    cold_gas(&in->gas, 1100.0);
    in->gas_temperature_K = 1000.0;
    in->intake_mass_flow_kg_per_s = 60.0;
    in->levels[0].steam_mass_flow_kg_per_s = 1.0;
    if (kind == 2) {
        in->reheat_pressure_Pa = r[6];
        in->reheat_temperature_K = r[7];
        in->deaerator = 1;
        in->deaerator_pressure_Pa = r[8];
    }
}

static void test_against_python(void)
{
    static double r[32][REFCSV_WIDE_MAX_COLS];
    int n = refcsv_read_wide(REF_CSV, REF_COLS, r, 32);
    CU_ASSERT_FATAL(n >= 10);
    const char *src = "independent Python calculation with python3-iapws, " REF_CSV;
    double worst = 0.0;
    for (int i = 0; i < n; i++) {
        gc_steam_input in;
        gc_error e;
        ref_input(r[i], &in);
        int rc = gc_steam_evaluate(&in, &res, &e);
        if (rc != GC_OK)
            fprintf(stderr, "row %d: %s %s\n", i, e.field, e.message);
        CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
        const gc_steam_summary *s = &res.summary;
        double m = s->steam_mass_flow_kg_per_s[0];
        const double got[] = { s->steam_cycle_efficiency, s->net_power_W / m,
                               s->condenser_heat_W / m, s->bleed_mass_flow_kg_per_s / m };
        for (int k = 0; k < 4; k++) {
            double want = r[i][14 + (k < 2 ? k : k + 1)];
            if (want == 0.0)
                continue;
            CHECK_REL(got[k], want, 1e-6, src);
            worst = fmax(worst, fabs(got[k] - want) / fabs(want));
        }
        if (r[i][16] >= 0.0)
            CHECK_ABS(s->exhaust_quality, r[i][16], 1e-6, src);
        if ((int)r[i][0] == 3) {
            const double g3[] = { m, s->stack_temperature_K, s->gas_heat_W, s->net_power_W };
            for (int k = 0; k < 4; k++) {
                CHECK_REL(g3[k], r[i][19 + k], 1e-6, src);
                worst = fmax(worst, fabs(g3[k] - r[i][19 + k]) / fabs(r[i][19 + k]));
            }
            int g = gc_steam_station_index(&res, "hp_superheater_gas_exit");
            CU_ASSERT_FATAL(g >= 0);
            CHECK_REL(res.stations[g].T_K, r[i][23], 1e-6, src);
            CHECK_REL(s->pinch_K[0], r[i][12], 1e-9, "designed pinch");
        }
    }
    printf("\n  steam cycles vs python3-iapws: %d cases, worst relative difference %.2e\n", n,
           worst);
}

/* ---- closed checks --------------------------------------------------------- */

static void two_pressure(gc_steam_input *in)
{
    gc_steam_input_init(in);
    in->intake_mass_flow_kg_per_s = 100.0;
    in->gas_temperature_K = 873.15;
    in->turbine_efficiency = 0.88;
    in->pump_efficiency = 0.8;
    in->gas_pressure_loss = 0.03;
    in->n_levels = 2;
    in->levels[0] = (gc_steam_level_input){ 10e6, 820.0, 8.0, 5.0, 0.0 };
    in->levels[1] = (gc_steam_level_input){ 0.5e6, 470.0, 8.0, 5.0, 0.0 };
    in->deaerator = 1;
    in->deaerator_pressure_Pa = 2e5;
    in->condenser_pressure_Pa = 0.0;   /* from the cooling water */
}

static void three_pressure_reheat(gc_steam_input *in)
{
    two_pressure(in);
    in->gas_temperature_K = 900.0;
    in->n_levels = 3;
    in->levels[0] = (gc_steam_level_input){ 12e6, 840.0, 8.0, 5.0, 0.0 };
    in->levels[1] = (gc_steam_level_input){ 2.5e6, 530.0, 8.0, 5.0, 0.0 };
    in->levels[2] = (gc_steam_level_input){ 0.4e6, 0.0, 8.0, 5.0, 0.0 };
    in->reheat_temperature_K = 840.0;
}

/* Checks every closed figure of a result. */
static void check_closed(const gc_steam_result *r, const char *what)
{
    const gc_steam_checks *c = &r->checks;
    const gc_steam_summary *s = &r->summary;
    CU_ASSERT(c->energy_hrsg_rel <= 1e-9);
    CU_ASSERT(c->energy_cycle_rel <= 1e-9);
    CU_ASSERT(c->energy_total_rel <= 1e-9);
    CU_ASSERT(c->exergy_rel <= 1e-9);
    CU_ASSERT(c->no_cross == 1);
    double sum_w = 0.0, sum_q = 0.0, sum_x = 0.0;
    for (int k = 0; k < r->n_processes; k++) {
        const gc_steam_process *p = &r->processes[k];
        if (!(p->s_gen_W_per_K >= -1e-9 * s->gas_heat_W / 300.0))
            fprintf(stderr, "%s: %s s_gen %.6g W/K\n", what, p->name, p->s_gen_W_per_K);
        CU_ASSERT(p->s_gen_W_per_K >= -1e-9 * s->gas_heat_W / 300.0);   /* second law */
        sum_w += p->kind == GC_STEAM_TURBINE ? p->work_W : -p->work_W;
        if (p->kind <= GC_STEAM_REHEATER)
            sum_q += p->heat_W;
        sum_x += p->exergy_destroyed_W;
    }
    CHECK_REL(sum_w, s->net_power_W, 1e-12, "net power = sum of process work");
    CHECK_REL(sum_q, s->heat_to_steam_W, 1e-12, "HRSG heat = sum of its sections");
    CHECK_REL(sum_x, s->exergy_destroyed_W, 1e-12, "exergy destroyed = sum of processes");
    CU_ASSERT(s->steam_cycle_efficiency > 0.0 && s->steam_cycle_efficiency < s->carnot_efficiency);
    if (s->has_ideal)
        CU_ASSERT(s->ideal_net_power_W >= s->net_power_W);
    CU_ASSERT(s->hrsg_effectiveness > 0.0 && s->hrsg_effectiveness < 1.0);
    CHECK_REL(s->net_work_J_per_kg_intake * 100.0, s->net_power_W, 1e-12, "per kg of intake");
}

static void test_closed_checks(void)
{
    gc_steam_input in;
    gc_error e;
    gc_steam_input_init(&in);
    in.turbine_efficiency = 0.87;
    in.pump_efficiency = 0.8;
    in.intake_mass_flow_kg_per_s = 100.0;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, &e), GC_OK);
    check_closed(&res, "one pressure");
    two_pressure(&in);
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, &e), GC_OK);
    check_closed(&res, "two pressures");
    CU_ASSERT(res.summary.bleed_mass_flow_kg_per_s > 0.0);
    three_pressure_reheat(&in);
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, &e), GC_OK);
    check_closed(&res, "three pressures with reheat");
    CU_ASSERT(gc_steam_station_index(&res, "hot_reheat") >= 0);
    CU_ASSERT(gc_steam_station_index(&res, "ip_admission") >= 0);
    CU_ASSERT(gc_steam_station_index(&res, "hp_economiser_1_exit") >= 0);
    /* stable station names every dashboard can rely on */
    static const char *names[] = { "gas_inlet", "stack", "hp_steam", "hp_feedwater",
                                   "turbine_exhaust", "condensate", "deaerator_exit" };
    for (int k = 0; k < 7; k++)
        CU_ASSERT(gc_steam_station_index(&res, names[k]) >= 0);
}

/* The condenser from cooling water: Tsat = T_cw + rise + terminal difference
 * (IF97 Eq. 30 gives the pressure). */
static void test_condenser_from_cooling_water(void)
{
    gc_steam_input in;
    two_pressure(&in);
    in.cooling_water_temperature_K = 290.0;
    in.cooling_water_rise_K = 9.0;
    in.condenser_terminal_difference_K = 4.0;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, NULL), GC_OK);
    double P;
    CU_ASSERT_EQUAL(gc_if97_Psat_T(303.0, &P, NULL), GC_OK);
    CHECK_REL(res.summary.condenser_pressure_Pa, P, 1e-12, "IF97 Eq. 30 at 303 K");
    CHECK_ABS(res.summary.condenser_temperature_K, 303.0, 1e-12, "definition");
}

/* ---- the pinch is never violated -------------------------------------------- */

static void check_tq(const gc_steam_result *r, const gc_steam_input *in)
{
    CU_ASSERT(r->n_tq > 0);
    for (int q = 0; q < r->n_tq; q++)
        for (int j = 0; j < r->tq[q].n_water; j++)
            CU_ASSERT(r->tq[q].T_gas_K > r->tq[q].T_water_K[j]);
    for (int q = 1; q < r->n_tq; q++)
        CU_ASSERT(r->tq[q].Q_W >= r->tq[q - 1].Q_W - 1e-9 * r->summary.gas_heat_W);
    CHECK_REL(r->tq[r->n_tq - 1].Q_W, r->summary.gas_heat_W, 1e-12, "T-Q ends at the gas heat");
    for (int i = 0; i < in->n_levels; i++) {
        CHECK_ABS(r->summary.pinch_K[i], in->levels[i].pinch_K, 1e-6, "designed pinch");
        CHECK_ABS(r->summary.approach_K[i], in->levels[i].approach_K, 1e-9, "designed approach");
    }
    for (int k = 0; k < r->n_processes; k++)
        if (r->processes[k].kind <= GC_STEAM_REHEATER)
            CU_ASSERT(r->processes[k].dT_min_K > 0.0);
}

/* A grid of designs: every evaluation either succeeds with the pinch kept
 * everywhere or is refused as infeasible with a field; never a check
 * failure, never a NaN. */
static void test_pinch_never_violated(void)
{
    static const double pinch[] = { 3.0, 8.0, 15.0, 30.0 };
    static const double approach[] = { 0.0, 2.0, 8.0 };
    static const double Tgas[] = { 700.0, 800.0, 900.0 };
    int ok = 0, infeasible = 0;
    for (int nl = 1; nl <= 3; nl++)
        for (int a = 0; a < 4; a++)
            for (int b = 0; b < 3; b++)
                for (int c = 0; c < 3; c++) {
                    gc_steam_input in;
                    gc_error e;
                    three_pressure_reheat(&in);
                    in.n_levels = nl;
                    in.reheat_temperature_K = 0.0;
                    in.gas_temperature_K = Tgas[c];
                    in.levels[0].steam_temperature_K = Tgas[c] - 40.0;
                    in.levels[nl - 1].steam_temperature_K = 0.0;
                    for (int i = 0; i < nl; i++) {
                        in.levels[i].pinch_K = pinch[a];
                        in.levels[i].approach_K = approach[b];
                    }
                    int rc = gc_steam_evaluate(&in, &res, &e);
                    if (rc == GC_OK) {
                        check_tq(&res, &in);
                        check_closed(&res, "grid");
                        ok++;
                    } else {
                        if (rc != GC_ERR_INFEASIBLE)
                            fprintf(stderr, "grid: %d %s %s\n", rc, e.field, e.message);
                        CU_ASSERT_EQUAL(rc, GC_ERR_INFEASIBLE);
                        CU_ASSERT(e.field[0] == '/');
                        infeasible++;
                    }
                }
    printf("\n  pinch grid: %d designs met, %d refused as infeasible\n", ok, infeasible);
    CU_ASSERT(ok >= 40);
}

/* Fixed steam conditions: the pinch design's flows given back reproduce its
 * pinch and every figure. */
static void test_fixed_flow_reproduces_pinch(void)
{
    gc_steam_input in, fx;
    three_pressure_reheat(&in);
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, NULL), GC_OK);
    double net = res.summary.net_power_W, stack = res.summary.stack_temperature_K;
    fx = in;
    for (int i = 0; i < 3; i++)
        fx.levels[i].steam_mass_flow_kg_per_s = res.summary.steam_mass_flow_kg_per_s[i];
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&fx, &res, NULL), GC_OK);
    for (int i = 0; i < 3; i++)
        CHECK_ABS(res.summary.pinch_K[i], in.levels[i].pinch_K, 1e-6, "fixed flow = pinch design");
    CHECK_REL(res.summary.net_power_W, net, 1e-12, "fixed flow = pinch design");
    CHECK_REL(res.summary.stack_temperature_K, stack, 1e-12, "fixed flow = pinch design");
    /* 1 % more HP steam than the gas can raise at that pinch: the pinch
     * shrinks; much more: refused */
    fx.levels[0].steam_mass_flow_kg_per_s *= 1.01;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&fx, &res, NULL), GC_OK);
    CU_ASSERT(res.summary.pinch_K[0] < in.levels[0].pinch_K);
    gc_error e;
    fx.levels[0].steam_mass_flow_kg_per_s *= 3.0;
    CU_ASSERT_EQUAL(gc_steam_evaluate(&fx, &res, &e), GC_ERR_INFEASIBLE);
    CU_ASSERT(strncmp(e.field, "/levels/0/", 10) == 0);
}

/* Supplementary firing: the duct burner reaches the firing temperature with
 * combustion.h, raises more steam, and the whole balance (exhaust + fuel in;
 * stack, work, condenser heat, burner loss out) closes. */
static void test_supplementary_firing(void)
{
    gc_steam_input in;
    gc_error e;
    two_pressure(&in);
    in.levels[1].steam_temperature_K = 0.0;
    double net0;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, &e), GC_OK);
    net0 = res.summary.net_power_W;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "methane", &e), GC_OK);
    in.has_fuel = 1;
    in.firing_temperature_K = 1000.0;
    /* more HP steam takes the heat the LP superheater had: LP steam saturated */
    in.levels[1].steam_temperature_K = 0.0;
    in.burner_efficiency = 0.995;
    int rc = gc_steam_evaluate(&in, &res, &e);
    if (rc != GC_OK)
        fprintf(stderr, "firing: %s %s\n", e.field, e.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    const gc_steam_summary *s = &res.summary;
    CU_ASSERT(s->net_power_W > net0);
    CU_ASSERT(s->fuel_mass_flow_kg_per_s > 0.0);
    CHECK_REL(s->fuel_heat_W, s->fuel_mass_flow_kg_per_s * in.fuel.LHV_J_per_kg, 1e-12,
              "fuel heat = m_fuel LHV");
    int b = gc_steam_station_index(&res, "burner_exit");
    CU_ASSERT_FATAL(b >= 0);
    CHECK_ABS(res.stations[b].T_K, 1000.0, 1e-6, "firing temperature reached");
    CU_ASSERT(res.checks.energy_total_rel <= 1e-9);
    CU_ASSERT(res.checks.exergy_checked == 0);
    CHECK_REL(s->gas_mass_flow_kg_per_s, 100.0 + s->fuel_mass_flow_kg_per_s, 1e-12,
              "mass: exhaust + fuel");
    /* firing needs a fuel and a mixture gas */
    in.has_fuel = 0;
    CU_ASSERT_EQUAL(gc_steam_evaluate(&in, &res, &e), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(e.field, "/fuel");
}

static int has_warning(const gc_steam_result *r, const char *code)
{
    for (int i = 0; i < r->n_warnings; i++)
        if (strcmp(r->warnings[i].code, code) == 0)
            return 1;
    return 0;
}

static void test_warnings(void)
{
    gc_steam_input in;
    gc_steam_input_init(&in);   /* ideal: every efficiency 1 */
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, NULL), GC_OK);
    CU_ASSERT(has_warning(&res, "actual_equals_ideal"));
    CU_ASSERT(has_warning(&res, "turbine_exhaust_wet"));   /* 8 MPa, 500 degC, 5 kPa: x 0.79 */
    in.stack_temperature_min_K = 450.0;
    in.levels[0].pinch_K = 3.0;
    in.levels[0].approach_K = 0.0;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, NULL), GC_OK);
    CU_ASSERT(has_warning(&res, "stack_below_minimum"));
    CU_ASSERT(has_warning(&res, "pinch_small"));
    CU_ASSERT(has_warning(&res, "economiser_steaming_risk"));
    CU_ASSERT(has_warning(&res, "feedwater_below_acid_dew_point"));
    CU_ASSERT(res.checks.stack_ok == 0);
    for (int i = 0; i < res.n_warnings; i++)
        CU_ASSERT(strlen(res.warnings[i].message) > 20);
    in.dryness_min = 0.7;
    in.stack_temperature_min_K = 0.0;
    in.turbine_efficiency = 0.85;
    CU_ASSERT_EQUAL_FATAL(gc_steam_evaluate(&in, &res, NULL), GC_OK);
    CU_ASSERT(!has_warning(&res, "turbine_exhaust_wet"));
    CU_ASSERT(!has_warning(&res, "actual_equals_ideal"));
    CU_ASSERT(res.summary.has_ideal && res.summary.ideal_net_power_W > res.summary.net_power_W);
}

static void expect(gc_steam_input *in, int code, const char *field)
{
    gc_error e;
    int rc = gc_steam_evaluate(in, &res, &e);
    CU_ASSERT_EQUAL(rc, code);
    if (rc == code)
        CU_ASSERT_STRING_EQUAL(e.field, field);
    if (rc != code || strcmp(e.field, field) != 0)
        fprintf(stderr, "expected %d %s, got %d %s: %s\n", code, field, rc, e.field, e.message);
}

static void test_input_errors(void)
{
    gc_steam_input in;
    gc_steam_input_init(&in);
    in.levels[0].pressure_Pa = 25e6;
    expect(&in, GC_ERR_INVALID, "/levels/0/pressure");
    gc_steam_input_init(&in);
    in.n_levels = 2;
    in.levels[1] = in.levels[0];
    expect(&in, GC_ERR_INVALID, "/levels/1/pressure");
    gc_steam_input_init(&in);
    in.levels[0].pinch_K = 0.0;
    expect(&in, GC_ERR_INVALID, "/levels/0/pinch");
    gc_steam_input_init(&in);
    in.turbine_efficiency = 1.2;
    expect(&in, GC_ERR_INVALID, "/turbine_efficiency");
    gc_steam_input_init(&in);
    in.gas_temperature_K = NAN;
    expect(&in, GC_ERR_RANGE, "/gas_temperature");
    gc_steam_input_init(&in);
    in.levels[0].steam_temperature_K = 500.0;   /* below Tsat(8 MPa) = 568 K */
    expect(&in, GC_ERR_INVALID, "/levels/0/steam_temperature");
    gc_steam_input_init(&in);
    in.levels[0].steam_temperature_K = 900.0;   /* above the gas */
    expect(&in, GC_ERR_INFEASIBLE, "/levels/0/steam_temperature");
    gc_steam_input_init(&in);
    in.gas_temperature_K = 560.0;               /* below Tsat + pinch */
    in.levels[0].steam_temperature_K = 0.0;
    expect(&in, GC_ERR_INFEASIBLE, "/levels/0/pinch");
    gc_steam_input_init(&in);
    in.reheat_temperature_K = 773.15;           /* one level: reheat pressure needed */
    expect(&in, GC_ERR_INVALID, "/reheat_pressure");
    gc_steam_input_init(&in);
    in.deaerator = 1;
    in.deaerator_pressure_Pa = 9e6;             /* above the level */
    expect(&in, GC_ERR_INVALID, "/deaerator_pressure");
    gc_steam_input_init(&in);
    in.n_levels = 4;
    expect(&in, GC_ERR_INVALID, "/levels");
    gc_steam_input_init(&in);
    in.condenser_pressure_Pa = 0.0;
    in.cooling_water_temperature_K = 400.0;
    expect(&in, GC_ERR_INVALID, "/cooling_water_temperature");
    /* validate lists every bad input at once */
    gc_steam_input_init(&in);
    in.turbine_efficiency = 0.0;
    in.pump_efficiency = -1.0;
    in.gas_pressure_loss = 0.5;
    gc_error errs[GC_STEAM_MAX_ERRORS];
    int n = 0;
    CU_ASSERT_EQUAL(gc_steam_validate(&in, errs, GC_STEAM_MAX_ERRORS, &n), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(n, 3);
}

/* ---- random designs ------------------------------------------------------ */

static uint64_t rng = 0x9e3779b97f4a7c15ull;

static double urand(void)   /* xorshift64 (Marsaglia 2003), fixed seed */
{
    rng ^= rng << 13;
    rng ^= rng >> 7;
    rng ^= rng << 17;
    return (double)(rng >> 11) * (1.0 / 9007199254740992.0);
}

static void random_design(gc_steam_input *in)
{
    gc_steam_input_init(in);
    in->intake_mass_flow_kg_per_s = 1.0 + 500.0 * urand();
    in->gas_temperature_K = 600.0 + 500.0 * urand();
    in->gas_pressure_loss = 0.05 * urand();
    in->n_levels = 1 + (int)(3.0 * urand());
    double P = 19e6 * urand() + 1e5;
    for (int i = 0; i < in->n_levels; i++) {
        gc_steam_level_input *L = &in->levels[i];
        L->pressure_Pa = P;
        P = fmax(P * (0.05 + 0.5 * urand()), 2.1e4);
        L->steam_temperature_K = urand() < 0.3 ? 0.0 : 400.0 + 500.0 * urand();
        L->pinch_K = 1.0 + 30.0 * urand();
        L->approach_K = urand() < 0.2 ? 0.0 : 20.0 * urand();
        if (urand() < 0.15)
            L->steam_mass_flow_kg_per_s = 50.0 * urand();
    }
    if (urand() < 0.4) {
        in->reheat_temperature_K = 600.0 + 300.0 * urand();
        if (in->n_levels == 1)
            in->reheat_pressure_Pa = in->levels[0].pressure_Pa * (0.05 + 0.5 * urand());
    }
    in->turbine_efficiency = 0.6 + 0.4 * urand();
    in->pump_efficiency = 0.5 + 0.5 * urand();
    in->condenser_pressure_Pa = urand() < 0.5 ? 2e3 + 2e4 * urand() : 0.0;
    in->cooling_water_temperature_K = 275.0 + 30.0 * urand();
    if (urand() < 0.5) {
        in->deaerator = 1;
        in->deaerator_pressure_Pa = 1.2e4 + 4e5 * urand();
    }
    if (urand() < 0.3)
        in->stack_temperature_min_K = 350.0 + 50.0 * urand();
    if (urand() < 0.2) {
        gc_fuel_init_named(&in->fuel, "methane", NULL);
        in->has_fuel = 1;
        in->firing_temperature_K = in->gas_temperature_K + 300.0 * urand();
        in->burner_efficiency = 0.9 + 0.1 * urand();
    }
}

/* Random designs (many infeasible on purpose): every one is evaluated with
 * its checks passed, or refused as invalid or infeasible with a field and a
 * message; never a failed check, a failed iteration, a range error from
 * inside the model, or a non-finite number. */
static void test_random_designs(void)
{
    int n_ok = 0, n_bad = 0;
    for (int it = 0; it < 4000; it++) {
        gc_steam_input in;
        gc_error e;
        random_design(&in);
        int rc = gc_steam_evaluate(&in, &res, &e);
        if (rc != GC_OK) {
            if (rc != GC_ERR_INVALID && rc != GC_ERR_INFEASIBLE)
                fprintf(stderr, "random design %d: %d %s %s\n", it, rc, e.field, e.message);
            CU_ASSERT(rc == GC_ERR_INVALID || rc == GC_ERR_INFEASIBLE);
            CU_ASSERT(e.field[0] == '/' && strlen(e.message) > 10);
            n_bad++;
            continue;
        }
        n_ok++;
        const gc_steam_summary *s = &res.summary;
        CU_ASSERT(isfinite(s->net_power_W) && isfinite(s->exergy_destroyed_W) &&
                  isfinite(s->stack_temperature_K) && isfinite(s->min_dT_K));
        for (int k = 0; k < res.n_stations; k++)
            CU_ASSERT(isfinite(res.stations[k].h_J_per_kg) &&
                      isfinite(res.stations[k].exergy_J_per_kg));
        CU_ASSERT(s->min_dT_K > 0.0);
    }
    printf("\n  random designs: %d evaluated, %d refused (invalid or infeasible)\n", n_ok, n_bad);
    CU_ASSERT(n_ok > 500);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "Rankine cycles and HRSG against python3-iapws", test_against_python },
        { "closed checks", test_closed_checks },
        { "condenser from cooling water", test_condenser_from_cooling_water },
        { "pinch never violated", test_pinch_never_violated },
        { "fixed steam conditions", test_fixed_flow_reproduces_pinch },
        { "supplementary firing", test_supplementary_firing },
        { "warnings", test_warnings },
        { "input errors", test_input_errors },
        { "random designs", test_random_designs },
        { NULL, NULL }
    };
    return gc_run_suite("steam", cases);
}
