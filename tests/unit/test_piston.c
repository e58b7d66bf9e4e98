/*
 * test_piston.c — checks of the piston-engine presets (piston.h) and, through
 * them, of the cycle engine (cycle.h):
 *   - cold-air-standard closed forms over a grid of ratios and k (formulas of
 *     every engineering-thermodynamics text), to 1e-9 relative;
 *   - variable-property Otto and Diesel against an independent hand
 *     calculation with the NASA-9 polynomials (McBride, Zehe & Gordon 2002),
 *     evaluated here by direct species sums from the raw coefficients, a code
 *     path separate from gas.c's pre-combined mixture;
 *   - energy closure, the P-v and T-s area balances for every preset (ideal
 *     and with efficiencies below 1), MEP against its definition and the area;
 *   - every validation path returns its code and field, never a NaN.
 */
#include "check.h"

#include "gascycle/path.h"
#include "gascycle/piston.h"
#include "gascycle/species.h"

#include <math.h>
#include <string.h>

static gc_piston_result R; /* large: static */

static void cold_input(gc_piston_input *in, gc_piston_cycle cyc, double k)
{
    gc_piston_input_init(in, cyc);
    gc_error e;
    int rc = gc_gas_init_cold(&in->gas, 1005.0, k, &e);
    CU_ASSERT_EQUAL(rc, GC_OK);
    in->intake_temperature = 300.0;
    in->intake_pressure = 1e5;
}

static double eval_eta(const gc_piston_input *in)
{
    gc_error e;
    int rc = gc_piston_evaluate(in, &R, &e);
    if (rc != GC_OK)
        fprintf(stderr, "evaluate %s: rc %d %s: %s\n", gc_piston_name(in->cycle), rc, e.field, e.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    return R.cycle.actual.summary.thermal_efficiency;
}

static const double K_GRID[] = {1.3, 1.35, 1.4, 1.67};
static const double R_GRID[] = {4.0, 8.0, 12.0, 18.0, 25.0};

/* Cold-air-standard Otto efficiency 1 - r^(1-k) (closed form in any
 * engineering-thermodynamics text). */
static void test_otto_closed_form(void)
{
    gc_piston_input in;
    for (size_t a = 0; a < 4; a++)
        for (size_t b = 0; b < 5; b++) {
            double k = K_GRID[a], r = R_GRID[b];
            cold_input(&in, GC_PISTON_OTTO, k);
            in.compression_ratio = r;
            in.heat_added = 1.2e6;
            CHECK_REL(eval_eta(&in), 1.0 - pow(r, 1.0 - k), 1e-9, "cold-air Otto 1 - r^(1-k)");
            in.heat_added = GC_PISTON_UNSET;
            /* twice the compression-end temperature: within the 6000 K bound of
             * peak_temperature at every k and r of the grid */
            in.peak_temperature = 2.0 * 300.0 * pow(r, k - 1.0);
            CHECK_REL(eval_eta(&in), 1.0 - pow(r, 1.0 - k), 1e-9, "cold-air Otto 1 - r^(1-k)");
        }
}

/* Cold-air Diesel: 1 - r^(1-k) (rc^k - 1) / (k (rc - 1)). */
static void test_diesel_closed_form(void)
{
    gc_piston_input in;
    const double rcs[] = {1.5, 2.0, 3.0};
    for (size_t a = 0; a < 4; a++)
        for (size_t b = 0; b < 5; b++)
            for (size_t c = 0; c < 3; c++) {
                double k = K_GRID[a], r = R_GRID[b], rc = rcs[c];
                if (rc >= r)
                    continue;
                cold_input(&in, GC_PISTON_DIESEL, k);
                in.compression_ratio = r;
                in.cutoff_ratio = rc;
                double want = 1.0 - pow(r, 1.0 - k) * (pow(rc, k) - 1.0) / (k * (rc - 1.0));
                CHECK_REL(eval_eta(&in), want, 1e-9, "cold-air Diesel closed form");
            }
}

/* Cold-air dual: 1 - r^(1-k) (rp rc^k - 1) / ((rp - 1) + k rp (rc - 1)). */
static void test_dual_closed_form(void)
{
    gc_piston_input in;
    const double rcs[] = {1.2, 2.0};
    const double rps[] = {1.3, 1.8, 2.5};
    for (size_t a = 0; a < 4; a++)
        for (size_t b = 0; b < 5; b++)
            for (size_t c = 0; c < 2; c++)
                for (size_t d = 0; d < 3; d++) {
                    double k = K_GRID[a], r = R_GRID[b], rc = rcs[c], rp = rps[d];
                    cold_input(&in, GC_PISTON_DUAL, k);
                    in.compression_ratio = r;
                    in.cutoff_ratio = rc;
                    in.pressure_ratio = rp;
                    double want = 1.0 - pow(r, 1.0 - k) * (rp * pow(rc, k) - 1.0) /
                                            ((rp - 1.0) + k * rp * (rc - 1.0));
                    CHECK_REL(eval_eta(&in), want, 1e-9, "cold-air dual closed form");
                }
}

/* Cold-air Atkinson (constant-volume heat, expansion to the intake pressure,
 * constant-pressure rejection): 1 - k (re - rc) / (re^k - rc^k). */
static void test_atkinson_closed_form(void)
{
    gc_piston_input in;
    const double fac[] = {1.3, 2.0, 3.0};
    for (size_t a = 0; a < 4; a++)
        for (size_t b = 0; b < 5; b++)
            for (size_t c = 0; c < 3; c++) {
                double k = K_GRID[a], r = R_GRID[b], re = fac[c] * r;
                cold_input(&in, GC_PISTON_ATKINSON, k);
                in.compression_ratio = r;
                in.expansion_ratio = re;
                double want = 1.0 - k * (re - r) / (pow(re, k) - pow(r, k));
                CHECK_REL(eval_eta(&in), want, 1e-9, "cold-air Atkinson closed form");
                CHECK_REL(R.expansion_ratio, re, 1e-9, "expansion ratio given");
            }
}

/* Atkinson with efficiencies (issue 10): the requested expansion ratio is the
 * one evaluated. The case of the issue on dry air (NASA-9) against an
 * independent calculation, tools/ref/calc_atkinson_nasa9.py (species sums from
 * data/nasa9/nasa9.csv and scipy brentq): efficiency 0.2543186, net work
 * 58.0616209 kJ/kg, T3 977.203513 K; ideal counterpart (same two volume
 * ratios) 0.581708443. The issue's own independent figures: 0.254 and
 * 58.1 kJ/kg (the old code gave 0.352 and 135.0 at v4/v3 = 14.77). */
static void test_atkinson_efficiency(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_ATKINSON);
    in.compression_ratio = 8.1;
    in.expansion_ratio = 12.7;
    in.intake_temperature = 296.2;
    in.intake_pressure = 99.1e3;
    in.compression_efficiency = 0.92;
    in.expansion_efficiency = 0.90;
    const char *src = "tools/ref/calc_atkinson_nasa9.py (NASA-9 air, scipy)";
    double eta = eval_eta(&in);
    CHECK_REL(eta, 0.2543186, 2e-6, src);
    CHECK_REL(R.cycle.actual.summary.net_work, 58.0616209e3, 2e-6, src);
    CHECK_REL(R.cycle.actual.summary.T_max_K, 977.203513, 1e-8, src);
    CHECK_REL(R.expansion_ratio, 12.7, 1e-9, "requested expansion_ratio");
    CHECK_ABS(eta, 0.254, 0.0005, "issue 10, independent figure");
    CHECK_ABS(R.cycle.actual.summary.net_work / 1e3, 58.1, 0.05, "issue 10, independent figure");
    CU_ASSERT_FATAL(R.cycle.has_ideal);
    CU_ASSERT_EQUAL(R.cycle.ideal_is_actual, 0);
    CHECK_REL(R.cycle.ideal.summary.thermal_efficiency, 0.581708443, 2e-6, src);
    const gc_cycle_run *id = &R.cycle.ideal;
    double v3 = id->states[2].v_m3_per_kg, v4 = id->states[3].v_m3_per_kg;
    CHECK_REL(v4 / v3, 12.7, 1e-9, "ideal keeps expansion_ratio");
    CHECK_REL(id->states[1].v_m3_per_kg, R.cycle.actual.states[1].v_m3_per_kg, 1e-12,
              "ideal keeps compression_ratio");
    CHECK_REL(id->summary.T_dead_K, R.cycle.actual.summary.T_dead_K, 0.0, "same dead state");

    /* cold air: T4 = T1 re / r; T3 (1 - e) + e T3 (T4 / (re T3))^((k-1)/k) = T4 (the
     * expansion to P1 over re with efficiency e on the same-end-pressure isentrope,
     * P3/P1 = re T3 / T4), solved here by bisection; compression with efficiency ec:
     * T2 = T1 (1 + (r^(k-1) - 1) / ec); eta = 1 - k (T4 - T1) / (T3 - T2). The ideal
     * keeps both ratios: 1 - k (re - r) / (re^k - r^k). */
    const double effs[] = {0.8, 0.9, 0.97};
    for (size_t a = 0; a < 3; a++)
        for (size_t b = 0; b < 3; b++) { /* k up to 1.4: with 1.67 heat addition would be negative */
            double k = K_GRID[b], r = 8.0, re = 16.0, e = effs[a], ec = 0.88, T1 = 300.0;
            cold_input(&in, GC_PISTON_ATKINSON, k);
            in.compression_ratio = r;
            in.expansion_ratio = re;
            in.expansion_efficiency = e;
            in.compression_efficiency = ec;
            double T4 = T1 * re / r, lo = T4, hi = 20000.0;
            for (int it = 0; it < 200; it++) {
                double T3 = 0.5 * (lo + hi);
                double T4a = T3 * (1.0 - e) + e * T3 * pow(T4 / (re * T3), (k - 1.0) / k);
                if (T4a > T4)
                    hi = T3;
                else
                    lo = T3;
            }
            double T3 = 0.5 * (lo + hi), T2 = T1 * (1.0 + (pow(r, k - 1.0) - 1.0) / ec);
            double want = 1.0 - k * (T4 - T1) / (T3 - T2);
            CHECK_REL(eval_eta(&in), want, 1e-8, "cold-air Atkinson with efficiencies");
            CHECK_REL(R.expansion_ratio, re, 1e-9, "requested expansion_ratio");
            CHECK_REL(R.cycle.ideal.summary.thermal_efficiency,
                      1.0 - k * (re - r) / (pow(re, k) - pow(r, k)), 1e-9,
                      "cold-air Atkinson closed form (ideal counterpart)");
        }
}

/* Dual with a peak_pressure limit (issue 10: 14 MPa silently became 12.38 MPa):
 * when the heat-addition end comes first, the result says the limit was not
 * reached and gives the pressure reached; when the limit is reached, it is
 * the constant-volume end pressure exactly. Cold air: P after the
 * constant-volume part = P2 T3 / T2 (ideal gas at constant volume). */
static void test_dual_peak_pressure(void)
{
    gc_piston_input in;
    cold_input(&in, GC_PISTON_DUAL, 1.4);
    in.compression_ratio = 18.0;
    in.peak_pressure = 14e6;
    in.peak_temperature = 1700.0;
    eval_eta(&in);
    double T2 = 300.0 * pow(18.0, 0.4), P2 = 1e5 * pow(18.0, 1.4);
    CU_ASSERT_EQUAL(R.peak_pressure_short, 1);
    CHECK_REL(R.peak_pressure_reached, P2 * 1700.0 / T2, 1e-9, "cold air, constant volume");
    CU_ASSERT(R.peak_pressure_reached < 14e6);
    in.peak_temperature = GC_PISTON_UNSET;
    in.cutoff_ratio = 1.5;
    eval_eta(&in);
    CU_ASSERT_EQUAL(R.peak_pressure_short, 0);
    CHECK_REL(R.peak_pressure_reached, 14e6, 1e-12, "the limit reached");
    gc_piston_input_init(&in, GC_PISTON_OTTO);
    in.compression_ratio = 8.0;
    in.peak_temperature = 2000.0;
    eval_eta(&in);
    CU_ASSERT_EQUAL(R.peak_pressure_short, 0);
    CU_ASSERT_EQUAL(R.peak_pressure_reached, 0.0);
}

/* Lenoir (cold air): 1 - k (rp^(1/k) - 1) / (rp - 1), rp the pressure ratio
 * of constant-volume heat addition. */
static void test_lenoir_closed_form(void)
{
    gc_piston_input in;
    const double rps[] = {2.0, 3.5, 6.0};
    for (size_t a = 0; a < 4; a++)
        for (size_t c = 0; c < 3; c++) {
            double k = K_GRID[a], rp = rps[c];
            cold_input(&in, GC_PISTON_LENOIR, k);
            in.pressure_ratio = rp;
            double want = 1.0 - k * (pow(rp, 1.0 / k) - 1.0) / (rp - 1.0);
            CHECK_REL(eval_eta(&in), want, 1e-9, "cold-air Lenoir closed form");
        }
}

/* Carnot 1 - TL/TH; Stirling and Ericsson with ideal regeneration equal it
 * (closed forms of any thermodynamics text), cold air and variable air. */
static void test_carnot_stirling_ericsson(void)
{
    gc_piston_input in;
    const double TH[] = {600.0, 1000.0, 1800.0};
    for (int model = 0; model < 2; model++)
        for (size_t a = 0; a < 4; a++)
            for (size_t b = 0; b < 3; b++) {
                double k = K_GRID[a], want = 1.0 - 300.0 / TH[b];
                gc_piston_cycle cycles[] = {GC_PISTON_CARNOT, GC_PISTON_STIRLING, GC_PISTON_ERICSSON};
                for (int c = 0; c < 3; c++) {
                    cold_input(&in, cycles[c], k);
                    if (model == 1)
                        gc_gas_init_air(&in.gas);
                    in.peak_temperature = TH[b];
                    if (cycles[c] == GC_PISTON_CARNOT)
                        in.heat_added = 2e5;
                    else if (cycles[c] == GC_PISTON_STIRLING)
                        in.compression_ratio = 6.0;
                    else
                        in.pressure_ratio = 6.0;
                    CHECK_REL(eval_eta(&in), want, 1e-9, "Carnot 1 - TL/TH");
                    CHECK_REL(R.cycle.carnot_efficiency, want, 1e-12, "Carnot bound 1 - TL/TH");
                    /* second-law efficiency of a reversible cycle between two reservoirs */
                    CHECK_REL(R.cycle.actual.summary.second_law_efficiency, 1.0, 1e-9,
                              "reversible cycle: second-law efficiency 1");
                }
                /* Carnot by compression ratio: r = y * rs */
                cold_input(&in, GC_PISTON_CARNOT, k);
                if (model == 1)
                    gc_gas_init_air(&in.gas);
                in.peak_temperature = TH[b];
                in.compression_ratio = 2.0 * gc_gas_vr_T(&in.gas, 300.0) / gc_gas_vr_T(&in.gas, TH[b]);
                CHECK_REL(eval_eta(&in), want, 1e-9, "Carnot 1 - TL/TH");
                const gc_cycle_summary *sm = &R.cycle.actual.summary;
                CHECK_REL(sm->v_max_m3_per_kg / sm->v_min_m3_per_kg, in.compression_ratio, 1e-9,
                          "Carnot compression ratio as given");
            }
}

/* Stirling with partial regeneration (cold air): heat in = R TH ln r +
 * (1 - eps) cv (TH - TL), net work = R (TH - TL) ln r (closed-form
 * bookkeeping of the ideal Stirling cycle). */
static void test_stirling_partial_regen(void)
{
    gc_piston_input in;
    const double eps[] = {0.0, 0.5, 0.9};
    for (size_t i = 0; i < 3; i++) {
        cold_input(&in, GC_PISTON_STIRLING, 1.4);
        in.peak_temperature = 900.0;
        in.compression_ratio = 5.0;
        in.regenerator_effectiveness = eps[i];
        double Rg = in.gas.R_J_per_kgK, cv = in.gas.cp_cold_J_per_kgK - Rg;
        double w = Rg * 600.0 * log(5.0);
        double q = Rg * 900.0 * log(5.0) + (1.0 - eps[i]) * cv * 600.0;
        CHECK_REL(eval_eta(&in), w / q, 1e-9, "Stirling with regenerator effectiveness");
    }
}

/* ---- variable-property hand calculation (NASA-9, direct species sums) ---- */

typedef struct mix {
    int n;
    const gc_species *sp[GC_GAS_MAX_SPECIES];
    double x[GC_GAS_MAX_SPECIES];
    double M, R;
} mix;

static const double *coef(const gc_species *sp, double T)
{
    int i = 0;
    while (i < sp->n_intervals - 1 && T > sp->T_K[i + 1])
        i++;
    return sp->a[i];
}

/* h/(R T) and s0/R of one species, NASA/TP-2002-211556 eq. (2)-(4) forms */
static double sp_h(const gc_species *sp, double T)
{
    const double *a = coef(sp, T);
    return GC_R_UNIVERSAL * T *
           (-a[0] / (T * T) + a[1] * log(T) / T + a[2] + a[3] * T / 2 + a[4] * T * T / 3 +
            a[5] * T * T * T / 4 + a[6] * T * T * T * T / 5 + a[7] / T);
}

static double sp_s0(const gc_species *sp, double T)
{
    const double *a = coef(sp, T);
    return GC_R_UNIVERSAL *
           (-a[0] / (2 * T * T) - a[1] / T + a[2] * log(T) + a[3] * T + a[4] * T * T / 2 +
            a[5] * T * T * T / 3 + a[6] * T * T * T * T / 4 + a[8]);
}

static void mix_init(mix *m, const gc_gas *air)
{
    m->n = air->n_species;
    m->M = 0.0;
    for (int i = 0; i < m->n; i++) {
        m->sp[i] = gc_species_get(air->species[i]);
        m->x[i] = air->x[i];
        m->M += m->x[i] * m->sp[i]->M_kg_per_mol;
    }
    m->R = GC_R_UNIVERSAL / m->M;
}

static double mix_u(const mix *m, double T)
{
    double h = 0.0;
    for (int i = 0; i < m->n; i++)
        h += m->x[i] * sp_h(m->sp[i], T);
    return h / m->M - m->R * T;
}

static double mix_h(const mix *m, double T) { return mix_u(m, T) + m->R * T; }

static double mix_s0(const mix *m, double T)
{
    double s = 0.0;
    for (int i = 0; i < m->n; i++)
        s += m->x[i] * sp_s0(m->sp[i], T);
    return s / m->M;
}

/* phi(T) = s0(T) - R ln T: along an isentrope phi(T2) - phi(T1) = -R ln(v2/v1) */
static double mix_phi(const mix *m, double T) { return mix_s0(m, T) - m->R * log(T); }

typedef double (*mix_fn)(const mix *, double);

static double bisect(const mix *m, mix_fn f, double target)
{
    double lo = 200.0, hi = 5000.0;
    for (int i = 0; i < 200; i++) {
        double mid = 0.5 * (lo + hi);
        if (f(m, mid) < target)
            lo = mid;
        else
            hi = mid;
    }
    return 0.5 * (lo + hi);
}

/* Otto, air, r = 8, T1 = 300 K, 95 kPa, 750 kJ/kg added: T2 from the
 * isentrope (phi), T3 from u, T4 from the isentrope, w = q_in - (u4 - u1). */
static void test_otto_variable_hand(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_OTTO);
    in.intake_temperature = 300.0;
    in.intake_pressure = 95e3;
    in.compression_ratio = 8.0;
    in.heat_added = 750e3;
    double eta = eval_eta(&in);
    mix m;
    mix_init(&m, &in.gas);
    double T1 = 300.0, r = 8.0;
    double T2 = bisect(&m, mix_phi, mix_phi(&m, T1) + m.R * log(r));
    double T3 = bisect(&m, mix_u, mix_u(&m, T2) + 750e3);
    double T4 = bisect(&m, mix_phi, mix_phi(&m, T3) - m.R * log(r));
    double w = 750e3 - (mix_u(&m, T4) - mix_u(&m, T1));
    const char *src = "hand calculation, NASA-9 species sums (McBride, Zehe & Gordon 2002)";
    CHECK_REL(R.cycle.actual.states[1].T_K, T2, 1e-8, src);
    CHECK_REL(R.cycle.actual.states[2].T_K, T3, 1e-8, src);
    CHECK_REL(R.cycle.actual.states[3].T_K, T4, 1e-8, src);
    CHECK_REL(R.cycle.actual.summary.net_work, w, 1e-7, src);
    CHECK_REL(eta, w / 750e3, 1e-7, src);
    /* the brief's 0.5 % band, trivially met at this agreement */
    CHECK_REL(eta, w / 750e3, 5e-3, src);
}

/* Diesel, air, r = 18, cutoff 2, T1 = 300 K: T2 isentrope, T3 = 2 T2 at
 * constant pressure, q_in = h3 - h2, expansion over r / rc = 9. */
static void test_diesel_variable_hand(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_DIESEL);
    in.intake_temperature = 300.0;
    in.intake_pressure = 95e3;
    in.compression_ratio = 18.0;
    in.cutoff_ratio = 2.0;
    double eta = eval_eta(&in);
    mix m;
    mix_init(&m, &in.gas);
    double T1 = 300.0;
    double T2 = bisect(&m, mix_phi, mix_phi(&m, T1) + m.R * log(18.0));
    double T3 = 2.0 * T2;
    double qin = mix_h(&m, T3) - mix_h(&m, T2);
    double T4 = bisect(&m, mix_phi, mix_phi(&m, T3) - m.R * log(9.0));
    double w = qin - (mix_u(&m, T4) - mix_u(&m, T1));
    const char *src = "hand calculation, NASA-9 species sums (McBride, Zehe & Gordon 2002)";
    CHECK_REL(R.cycle.actual.states[1].T_K, T2, 1e-8, src);
    CHECK_REL(R.cycle.actual.states[3].T_K, T4, 1e-8, src);
    CHECK_REL(R.cycle.actual.summary.heat_in, qin, 1e-7, src);
    CHECK_REL(R.cycle.actual.summary.net_work, w, 1e-7, src);
    CHECK_REL(eta, w / qin, 1e-7, src);
}

/* ---- every preset: closure and area balances ------------------------------ */

static void preset_inputs(gc_piston_input *in, int idx, int model, int lossy)
{
    gc_piston_cycle cyc = (gc_piston_cycle)idx;
    gc_piston_input_init(in, cyc);
    if (model == 0) {
        gc_error e;
        gc_gas_init_cold(&in->gas, 1005.0, 1.4, &e);
    }
    in->intake_temperature = 300.0;
    in->intake_pressure = 1e5;
    switch (cyc) {
    case GC_PISTON_OTTO: in->compression_ratio = 10.5; in->peak_temperature = 2200.0; break;
    case GC_PISTON_DIESEL: in->compression_ratio = 18.0; in->cutoff_ratio = 2.2; break;
    case GC_PISTON_DUAL:
        in->compression_ratio = 16.0; in->pressure_ratio = 1.5; in->heat_added = 1.5e6; break;
    case GC_PISTON_ATKINSON: in->compression_ratio = 10.0; in->peak_temperature = 2000.0; break;
    case GC_PISTON_MILLER:
        in->compression_ratio = 12.0; in->effective_compression_ratio = 9.0;
        in->peak_temperature = 2000.0; break;
    case GC_PISTON_STIRLING:
        in->compression_ratio = 4.0; in->peak_temperature = 900.0;
        in->regenerator_effectiveness = 0.8; break;
    case GC_PISTON_ERICSSON:
        in->pressure_ratio = 5.0; in->peak_temperature = 900.0;
        in->regenerator_effectiveness = 0.8; break;
    case GC_PISTON_LENOIR: in->peak_temperature = 1600.0; break;
    case GC_PISTON_CARNOT: in->peak_temperature = 1000.0; in->heat_added = 3e5; break;
    default: break;
    }
    if (lossy) {
        unsigned ok = cyc != GC_PISTON_STIRLING && cyc != GC_PISTON_ERICSSON;
        if (ok && cyc != GC_PISTON_LENOIR)
            in->compression_efficiency = 0.85;
        if (ok)
            in->expansion_efficiency = 0.9;
    }
}

static void check_run_balances(const gc_cycle_run *run, const char *what)
{
    const gc_cycle_summary *sm = &run->summary;
    const gc_cycle_checks *ck = &run->checks;
    CU_ASSERT(ck->areas_done == 1);
    CHECK_ABS(ck->energy_rel, 0.0, 1e-9, "energy closure sum(q) - sum(w), relative to heat in");
    CHECK_ABS(ck->state_rel, 0.0, 1e-9, "state closure");
    /* both areas equal net work + dissipated work (0.1 %: the brief's bound) */
    CHECK_REL(ck->area_pv, sm->net_work + sm->dissipated, 1e-3, what);
    CHECK_REL(ck->area_ts, sm->net_work + sm->dissipated, 1e-3, what);
    /* and far tighter in practice */
    CHECK_REL(ck->area_pv, sm->net_work + sm->dissipated, 1e-6, what);
    CHECK_REL(ck->area_ts, sm->net_work + sm->dissipated, 1e-6, what);
    /* the same balance over the drawn points (25 per process, Simpson) */
    double pv, ts;
    CU_ASSERT_EQUAL(gc_cycle_path_areas(run, GC_PATH_DEFAULT_POINTS, &pv, &ts, NULL), GC_OK);
    CHECK_REL(pv, sm->net_work + sm->dissipated, 1e-3, "areas over the drawn points");
    CHECK_REL(ts, sm->net_work + sm->dissipated, 1e-3, "areas over the drawn points");
    /* MEP from its definition against the P-v area */
    double dv = sm->v_max_m3_per_kg - sm->v_min_m3_per_kg;
    CHECK_REL(sm->mean_effective_pressure, sm->net_work / dv, 1e-12, "MEP = w_net / (v_max - v_min)");
    CHECK_REL(sm->mean_effective_pressure * dv, ck->area_pv - sm->dissipated, 1e-6,
              "MEP x swept volume = P-v area - dissipated");
    CU_ASSERT(isfinite(sm->second_law_efficiency) && sm->second_law_efficiency > 0.0 &&
              sm->second_law_efficiency <= 1.0 + 1e-12);
    CU_ASSERT(sm->thermal_efficiency <= sm->carnot_efficiency + 1e-12);
}

static void test_presets_balances(void)
{
    for (int model = 0; model < 2; model++)
        for (int lossy = 0; lossy < 2; lossy++)
            for (int idx = 0; idx < GC_PISTON_COUNT; idx++) {
                gc_piston_input in;
                preset_inputs(&in, idx, model, lossy);
                gc_error e;
                int rc = gc_piston_evaluate(&in, &R, &e);
                if (rc != GC_OK)
                    fprintf(stderr, "%s model %d lossy %d: rc %d %s %s\n", gc_piston_name(in.cycle),
                            model, lossy, rc, e.field, e.message);
                CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
                check_run_balances(&R.cycle.actual, "area = net work + dissipated (actual)");
                CU_ASSERT_FATAL(R.cycle.has_ideal);
                check_run_balances(&R.cycle.ideal, "area = net work (ideal)");
                CHECK_ABS(R.cycle.ideal.summary.dissipated, 0.0,
                          1e-12 * R.cycle.ideal.summary.heat_in, "ideal: nothing dissipated");
                if (lossy && idx != GC_PISTON_STIRLING && idx != GC_PISTON_ERICSSON) {
                    CU_ASSERT(R.cycle.actual.summary.dissipated > 0.0);
                    CU_ASSERT(R.cycle.actual.summary.thermal_efficiency <
                              R.cycle.ideal.summary.thermal_efficiency);
                }
            }
}

/* Engine figures: trapped mass, work per cycle, IMEP (= MEP), power, ISFC. */
static void test_engine_figures(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_OTTO);
    in.compression_ratio = 10.5;
    in.peak_temperature = 2300.0;
    in.displacement = 1.6e-3;
    in.cylinders = 4;
    in.has_cylinders = 1;
    in.speed = 3000.0 / 60.0;
    in.strokes = 4;
    in.has_strokes = 1;
    in.fuel_heating_value = 43e6;
    eval_eta(&in);
    const gc_cycle_summary *sm = &R.cycle.actual.summary;
    const gc_cycle_state *s1 = &R.cycle.actual.states[0];
    CU_ASSERT(R.has_engine && R.has_power && R.has_fuel);
    /* trapped mass: the cylinder's largest volume V_d r/(r-1) holds the intake state */
    double Vmax = 0.4e-3 * 10.5 / 9.5;
    CHECK_REL(R.trapped_mass, Vmax / s1->v_m3_per_kg, 1e-12, "m = P1 V1 / (R T1) (definition)");
    CHECK_REL(R.imep, sm->mean_effective_pressure, 1e-12, "IMEP = W / V_d (definition)");
    CHECK_REL(R.imep * 0.4e-3, R.work_per_cycle, 1e-12, "W = IMEP V_d");
    CHECK_REL(R.indicated_power, R.work_per_cycle * 4 * 25.0, 1e-12,
              "P = W n_cyl N / 2 (four-stroke, definition)");
    CHECK_REL(R.isfc, 1.0 / (sm->thermal_efficiency * 43e6), 1e-12, "ISFC = 1 / (eta LHV)");
}

/* Every validation returns its code and the input's field; nothing NaN. */
static void expect_error(gc_piston_input *in, int code, const char *field)
{
    gc_error e;
    gc_error_clear(&e);
    int rc = gc_piston_evaluate(in, &R, &e);
    if (rc != code || strcmp(e.field, field) != 0)
        fprintf(stderr, "%s: expected %d %s, got %d %s (%s)\n", gc_piston_name(in->cycle), code,
                field, rc, e.field, e.message);
    CU_ASSERT_EQUAL(rc, code);
    CU_ASSERT_STRING_EQUAL(e.field, field);
    CU_ASSERT(strlen(e.message) > 10);
}

static void test_validation(void)
{
    gc_piston_input in;
    gc_piston_input_init(&in, GC_PISTON_DIESEL);
    in.compression_ratio = 16.0;
    in.cutoff_ratio = 18.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/cutoff_ratio");
    in.cutoff_ratio = 2.0;
    in.peak_temperature = 1800.0;
    expect_error(&in, GC_ERR_INVALID, "/peak_temperature"); /* two heat ends */
    in.cutoff_ratio = GC_PISTON_UNSET;
    in.peak_temperature = 700.0; /* below the compression end temperature */
    expect_error(&in, GC_ERR_INFEASIBLE, "/peak_temperature");
    in.peak_temperature = 3000.0;
    in.cylinders = 4;
    in.has_cylinders = 1;
    expect_error(&in, GC_ERR_INVALID, "/displacement");

    gc_piston_input_init(&in, GC_PISTON_OTTO);
    expect_error(&in, GC_ERR_INVALID, "/compression_ratio");
    in.compression_ratio = 0.5;
    expect_error(&in, GC_ERR_INVALID, "/compression_ratio");
    in.compression_ratio = NAN;
    expect_error(&in, GC_ERR_INVALID, "/compression_ratio");
    in.compression_ratio = 9.0;
    expect_error(&in, GC_ERR_INVALID, ""); /* no heat end */
    in.cutoff_ratio = 2.0;
    expect_error(&in, GC_ERR_INVALID, "/cutoff_ratio"); /* does not apply */
    in.cutoff_ratio = GC_PISTON_UNSET;
    in.heat_added = -5.0;
    expect_error(&in, GC_ERR_INVALID, "/heat_added");
    in.heat_added = 1e6;
    in.compression_efficiency = 1.2;
    expect_error(&in, GC_ERR_INVALID, "/compression_efficiency");
    in.compression_efficiency = GC_PISTON_UNSET;
    in.intake_temperature = 10.0;   /* below the table's 200 K, as a request would be */
    expect_error(&in, GC_ERR_INVALID, "/intake_temperature");
    in.intake_temperature = 300.0;
    in.intake_pressure = -1.0;
    expect_error(&in, GC_ERR_INVALID, "/intake_pressure");
    in.intake_pressure = 1e5;
    in.heat_added = 9e7; /* beyond the gas data's temperature range */
    expect_error(&in, GC_ERR_RANGE, "/heat_added");
    in.heat_added = 1e6;
    in.displacement = 1e-3;
    in.speed = 50.0;
    expect_error(&in, GC_ERR_INVALID, "/strokes_per_cycle");
    in.strokes = 3;
    in.has_strokes = 1;
    expect_error(&in, GC_ERR_INVALID, "/strokes_per_cycle");

    gc_piston_input_init(&in, GC_PISTON_DUAL);
    in.compression_ratio = 16.0;
    in.heat_added = 1e6;
    expect_error(&in, GC_ERR_INVALID, "/pressure_ratio");
    in.pressure_ratio = 3.0;
    in.heat_added = 1e5; /* less than the constant-volume part needs */
    expect_error(&in, GC_ERR_INFEASIBLE, "/heat_added");
    in.heat_added = GC_PISTON_UNSET;
    in.peak_temperature = 1000.0; /* below the end of constant-volume heating */
    expect_error(&in, GC_ERR_INFEASIBLE, "/peak_temperature");

    gc_piston_input_init(&in, GC_PISTON_ATKINSON);
    in.compression_ratio = 10.0;
    in.expansion_ratio = 8.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/expansion_ratio");

    gc_piston_input_init(&in, GC_PISTON_MILLER);
    in.compression_ratio = 10.0;
    in.effective_compression_ratio = 12.0;
    in.peak_temperature = 2000.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/effective_compression_ratio");
    in.effective_compression_ratio = 3.0; /* expansion would end below intake pressure */
    in.compression_ratio = 40.0;
    in.peak_temperature = 1200.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/compression_ratio");

    gc_piston_input_init(&in, GC_PISTON_CARNOT);
    in.peak_temperature = 1200.0;
    in.compression_ratio = 2.0; /* below the isentropic ratio between the temperatures */
    expect_error(&in, GC_ERR_INFEASIBLE, "/compression_ratio");

    gc_piston_input_init(&in, GC_PISTON_STIRLING);
    in.compression_ratio = 4.0;
    in.peak_temperature = 900.0;
    in.compression_efficiency = 0.9;
    expect_error(&in, GC_ERR_INVALID, "/compression_efficiency");
    in.compression_efficiency = GC_PISTON_UNSET;
    in.regenerator_effectiveness = 1.5;
    expect_error(&in, GC_ERR_INVALID, "/regenerator_effectiveness");
    in.regenerator_effectiveness = 0.9;
    in.peak_temperature = 250.0;
    expect_error(&in, GC_ERR_INFEASIBLE, "/peak_temperature");

    gc_piston_cycle cyc;
    CU_ASSERT_EQUAL(gc_piston_from_name("miller", &cyc), GC_OK);
    CU_ASSERT_EQUAL(cyc, GC_PISTON_MILLER);
    CU_ASSERT_EQUAL(gc_piston_from_name("wankel", &cyc), GC_ERR_UNKNOWN);
}

int main(void)
{
    static const gc_test_case cases[] = {
        {"Otto closed form 1 - r^(1-k)", test_otto_closed_form},
        {"Diesel closed form", test_diesel_closed_form},
        {"dual closed form", test_dual_closed_form},
        {"Atkinson closed form", test_atkinson_closed_form},
        {"Atkinson with efficiencies keeps expansion_ratio", test_atkinson_efficiency},
        {"dual peak_pressure not reached is reported", test_dual_peak_pressure},
        {"Lenoir closed form", test_lenoir_closed_form},
        {"Carnot, Stirling, Ericsson = 1 - TL/TH", test_carnot_stirling_ericsson},
        {"Stirling with partial regeneration", test_stirling_partial_regen},
        {"variable-property Otto vs hand calculation", test_otto_variable_hand},
        {"variable-property Diesel vs hand calculation", test_diesel_variable_hand},
        {"every preset: closure and area balances", test_presets_balances},
        {"engine figures", test_engine_figures},
        {"validation errors", test_validation},
        {NULL, NULL}};
    return gc_run_suite("piston", cases);
}
