/*
 * test_air_tables.c — variable-property air against the ideal-gas air
 * tables of Keenan, Chao & Kaye (Gas Tables), as reproduced in the
 * "ideal-gas properties of air" table of engineering thermodynamics texts
 * (e.g. Cengel & Boles, Table A-17). All table values below are FROM MEMORY;
 * they were checked for internal consistency (each interpolation in the
 * worked Otto example reproduces the next recalled figure to 0.01 kJ/kg).
 *
 * Checks:
 *  1. table rows: u and h differences from 300 K, and relative-volume ratios,
 *     of the `air` model (NASA-9 polynomials) within 0.5 %;
 *  2. a worked Otto cycle with table values (r = 8, T1 = 290 K, P1 = 95 kPa,
 *     800 kJ/kg added at constant volume: T2 = 652.4 K, T3 = 1575.1 K,
 *     T4 = 795.6 K, w_net = 418.17 kJ/kg, efficiency 0.5227), the classic
 *     textbook example, recalled from memory;
 *  3. a Diesel hand calculation done here with table rows: T1 = 300 K,
 *     compression ratio vr(300)/vr(800) so T2 lands on the 800 K row, cutoff
 *     ratio 1500/800 so T3 lands on the 1500 K row, T4 by log-linear
 *     interpolation of vr between the 780 and 800 K rows.
 * Tolerance 0.5 % on efficiency and net work (issue requirement; the tables
 * use older property data, so agreement of about 0.1-0.3 % is expected).
 */
#include "check.h"
#include "gascycle/gas.h"
#include "gascycle/piston.h"

#include <math.h>
#include <stdio.h>

#define SRC "Keenan, Chao & Kaye air table (from memory)"

typedef struct air_row {
    double T_K, h_kJ, u_kJ, vr;
} air_row;

/* T, h, u, vr, from memory */
static const air_row rows[] = {
    {290.0, 290.16, 206.91, 676.1},
    {300.0, 300.19, 214.07, 621.2},
    {650.0, 659.84, 473.25, 85.34},
    {660.0, 670.47, 481.01, 81.89},
    {780.0, 800.03, 576.12, 51.64},
    {800.0, 821.95, 592.30, 48.08},
    {1000.0, 1046.04, 758.94, 25.17},
    {1500.0, 1635.97, 1205.41, 7.152},
    {1560.0, 1708.82, 1260.99, 6.301},
    {1580.0, 1733.17, 1279.65, 6.046},
};
#define N_ROWS (sizeof rows / sizeof rows[0])

static void test_table_rows(void)
{
    gc_gas air;
    gc_gas_init_air(&air);
    const air_row *ref = &rows[1]; /* 300 K */
    double h0 = gc_gas_h_T(&air, ref->T_K), u0 = gc_gas_u_T(&air, ref->T_K);
    double vr0 = gc_gas_vr_T(&air, ref->T_K);
    double worst_h = 0, worst_u = 0, worst_vr = 0;
    for (size_t i = 0; i < N_ROWS; i++) {
        const air_row *r = &rows[i];
        if (r->T_K == ref->T_K)
            continue;
        double dh = (gc_gas_h_T(&air, r->T_K) - h0) / 1000.0;
        double du = (gc_gas_u_T(&air, r->T_K) - u0) / 1000.0;
        double vratio = gc_gas_vr_T(&air, r->T_K) / vr0;
        double eh = fabs(dh / (r->h_kJ - ref->h_kJ) - 1);
        double eu = fabs(du / (r->u_kJ - ref->u_kJ) - 1);
        double ev = fabs(vratio / (r->vr / ref->vr) - 1);
        CHECK_REL(dh, r->h_kJ - ref->h_kJ, 5e-3, SRC);
        CHECK_REL(du, r->u_kJ - ref->u_kJ, 5e-3, SRC);
        CHECK_REL(vratio, r->vr / ref->vr, 5e-3, SRC);
        worst_h = fmax(worst_h, eh);
        worst_u = fmax(worst_u, eu);
        worst_vr = fmax(worst_vr, ev);
    }
    printf("\n  air tables, %zu rows: worst rel. error h-h(300) %.2e, u-u(300) %.2e, vr ratio %.2e\n",
           N_ROWS - 1, worst_h, worst_u, worst_vr);
}

static gc_piston_result result; /* large: keep off the stack */

static void test_otto_worked_example(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_OTTO);
    in.intake_temperature = 290.0;
    in.intake_pressure = 95e3;
    in.compression_ratio = 8.0;
    in.heat_added = 800e3;
    gc_error err;
    int rc = gc_piston_evaluate(&in, &result, &err);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    const gc_cycle_run *a = &result.cycle.actual;
    /* states: 0 intake, 1 after compression, 2 after heat, 3 after expansion */
    CHECK_REL(a->states[1].T_K, 652.4, 5e-3, SRC " worked Otto example, T2");
    CHECK_REL(a->states[2].T_K, 1575.1, 5e-3, SRC " worked Otto example, T3");
    CHECK_REL(a->states[3].T_K, 795.6, 5e-3, SRC " worked Otto example, T4");
    CHECK_REL(a->summary.net_work / 1000.0, 418.17, 5e-3, SRC " worked Otto example, w_net");
    CHECK_REL(a->summary.thermal_efficiency, 418.17 / 800.0, 5e-3,
              SRC " worked Otto example, efficiency");
    printf("  Otto r=8, 800 kJ/kg: efficiency %.4f (table 0.5227), w_net %.2f kJ/kg (table 418.17)\n",
           a->summary.thermal_efficiency, a->summary.net_work / 1000.0);
}

static void test_diesel_hand_calculation(void)
{
    /* hand calculation with the table rows (from memory) */
    const air_row *r300 = &rows[1], *r780 = &rows[4], *r800 = &rows[5], *r1500 = &rows[7];
    double r = r300->vr / r800->vr;        /* T2 = 800 K */
    double rc = r1500->T_K / r800->T_K;    /* T3 = 1500 K at constant P */
    double vr4 = r1500->vr * r / rc;       /* isentropic expansion back to v1 */
    double f = (log(r780->vr) - log(vr4)) / (log(r780->vr) - log(r800->vr));
    double u4 = r780->u_kJ + f * (r800->u_kJ - r780->u_kJ);
    double q_in = r1500->h_kJ - r800->h_kJ;
    double q_out = u4 - r300->u_kJ;
    double w_net = q_in - q_out, eta = w_net / q_in;

    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_DIESEL);
    in.intake_temperature = 300.0;
    in.intake_pressure = 100e3;
    in.compression_ratio = r;
    in.cutoff_ratio = rc;
    gc_error err;
    int rc_ = gc_piston_evaluate(&in, &result, &err);
    CU_ASSERT_EQUAL_FATAL(rc_, GC_OK);
    const gc_cycle_run *a = &result.cycle.actual;
    CHECK_REL(a->states[1].T_K, 800.0, 5e-3, SRC " Diesel hand calculation, T2");
    CHECK_REL(a->summary.thermal_efficiency, eta, 5e-3, SRC " Diesel hand calculation, efficiency");
    CHECK_REL(a->summary.net_work / 1000.0, w_net, 5e-3, SRC " Diesel hand calculation, w_net");
    printf("  Diesel r=%.3f rc=%.4f: efficiency %.4f (tables %.4f), w_net %.2f kJ/kg (tables %.2f)\n",
           r, rc, a->summary.thermal_efficiency, eta, a->summary.net_work / 1000.0, w_net);
}

int main(void)
{
    static const gc_test_case cases[] = {
        {"air table rows", test_table_rows},
        {"worked Otto example", test_otto_worked_example},
        {"Diesel hand calculation", test_diesel_hand_calculation},
        {NULL, NULL},
    };
    return gc_run_suite("air tables", cases);
}
