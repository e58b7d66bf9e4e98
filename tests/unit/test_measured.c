/*
 * test_measured.c — CUnit checks of measured.h: the slider-crank volume
 * against its limits and a hand evaluation; a cylinder-pressure trace
 * synthesised from an ideal Otto cycle computed by the engine (cold air,
 * closed forms) reduced back to the engine's work, MEP and k; gas-turbine
 * station data synthesised from Brayton cycles evaluated by the engine with
 * known efficiencies, reduced back to those efficiencies; error paths.
 *
 * The inputs (geometries, temperatures, efficiencies) are arbitrary round
 * numbers chosen for the checks, not measurements. Each check names where
 * its expected value comes from.
 */
#include "check.h"

#include "gascycle/brayton.h"
#include "gascycle/combustion.h"
#include "gascycle/measured.h"
#include "gascycle/piston.h"

#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

static double worst_rel = 0.0;   /* worst relative error of the recovery checks */

static void note(double got, double want)
{
    double e = want != 0.0 ? fabs(got - want) / fabs(want) : fabs(got);
    if (e > worst_rel)
        worst_rel = e;
}

/* ---- slider-crank volume ---------------------------------------------------- */

static const gc_measured_geometry geo = { 0.100, 0.120, 0.200, 10.0 };

static void test_volume_limits(void)
{
    double A = 0.25 * PI * geo.bore * geo.bore;
    double Vd = A * geo.stroke;                    /* swept volume: definition */
    double Vc = Vd / (geo.compression_ratio - 1.0);/* r = (Vd + Vc) / Vc: definition */
    CHECK_REL(gc_measured_displacement(&geo), Vd, 1e-15, "pi B^2 S / 4");
    CHECK_REL(gc_measured_volume(&geo, 0.0, NULL), Vc, 1e-14, "V(TDC) = Vc");
    CHECK_REL(gc_measured_volume(&geo, PI, NULL), Vc + Vd, 1e-14, "V(BDC) = Vc + Vd");
    CHECK_REL(gc_measured_volume(&geo, -PI, NULL), Vc + Vd, 1e-14, "V(-180 deg) = Vc + Vd");
    CHECK_REL(gc_measured_volume(&geo, 4.0 * PI, NULL), Vc, 1e-12, "periodic in 360 deg");
    /* hand value at 90 deg: cos = 0, sin = 1, so V = Vc + A (l + a - sqrt(l^2 - a^2))
     * (slider-crank relation, measured.h) = Vc + A (0.26 - sqrt(0.0364)) */
    double hand = Vc + A * (0.200 + 0.060 - sqrt(0.200 * 0.200 - 0.060 * 0.060));
    CHECK_REL(gc_measured_volume(&geo, 0.5 * PI, NULL), hand, 1e-14, "hand evaluation, 90 deg");
    /* dV/dtheta at 90 deg = A a; elsewhere against a central difference */
    double dV;
    gc_measured_volume(&geo, 0.5 * PI, &dV);
    CHECK_REL(dV, A * 0.060, 1e-14, "dV/dtheta(90 deg) = A a");
    for (double th = -3.0; th < 3.1; th += 0.7) {
        double h = 1e-5, d;
        gc_measured_volume(&geo, th, &d);
        double fd = (gc_measured_volume(&geo, th + h, NULL) -
                     gc_measured_volume(&geo, th - h, NULL)) / (2.0 * h);
        CHECK_REL(d, fd, 1e-8, "central difference, error O(h^2)");
    }
    /* symmetric about TDC */
    CHECK_REL(gc_measured_volume(&geo, 0.9, NULL), gc_measured_volume(&geo, -0.9, NULL), 1e-15,
              "V(-theta) = V(theta)");
}

/* ---- synthetic ideal Otto trace ---------------------------------------------- */

typedef struct otto_ref {
    double T1, P1, k, R, P3, w_net, mep, eta, m;
} otto_ref;

static int otto_reference(otto_ref *o)
{
    gc_piston_input *in = malloc(sizeof *in);
    gc_piston_result *res = malloc(sizeof *res);
    if (!in || !res) {
        free(in);
        free(res);
        return -1;
    }
    gc_piston_input_init(in, GC_PISTON_OTTO);
    gc_gas_init_cold(&in->gas, 1005.0, 1.4, NULL);
    in->intake_temperature = 300.0;
    in->intake_pressure = 100e3;
    in->compression_ratio = geo.compression_ratio;
    in->heat_added = 1.8e6;
    int rc = gc_piston_evaluate(in, res, NULL);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    const gc_cycle_run *run = &res->cycle.actual;
    o->T1 = 300.0;
    o->P1 = 100e3;
    o->k = 1.4;
    o->R = in->gas.R_J_per_kgK;
    o->P3 = run->states[2].P_Pa;
    o->w_net = run->summary.net_work;
    o->mep = run->summary.mean_effective_pressure;
    o->eta = run->summary.thermal_efficiency;
    double Vbdc = gc_measured_displacement(&geo) + gc_measured_clearance(&geo);
    o->m = o->P1 * Vbdc / (o->R * o->T1);
    free(in);
    free(res);
    return 0;
}

/* Four-stroke trace of the ideal Otto cycle, N samples from -360 deg (firing
 * TDC = 0): intake and exhaust at P1, isentropic compression and expansion. */
static void synth_otto(const otto_ref *o, int N, double *x, double *P)
{
    double Vbdc = gc_measured_volume(&geo, PI, NULL), Vc = gc_measured_clearance(&geo);
    for (int i = 0; i < N; i++) {
        double th = -4.0 * PI * 0.5 + 4.0 * PI * i / N;
        double V = gc_measured_volume(&geo, th, NULL);
        x[i] = th;
        if (th <= -PI || th >= PI)
            P[i] = o->P1;
        else if (th <= 0.0)
            P[i] = o->P1 * pow(Vbdc / V, o->k);
        else
            P[i] = o->P3 * pow(Vc / V, o->k);
    }
}

static void trace_input(gc_measured_trace_input *in, int N, const double *x, const double *P)
{
    memset(in, 0, sizeof *in);
    in->n = N;
    in->x = x;
    in->P = P;
    in->geometry = geo;
    in->strokes = 4;
    in->cylinders = 1;
    in->compression_window[0] = -150.0 * DEG;
    in->compression_window[1] = -30.0 * DEG;
    in->expansion_window[0] = 30.0 * DEG;
    in->expansion_window[1] = 150.0 * DEG;
    gc_gas_init_cold(&in->gas, 1005.0, 1.4, NULL);
    in->intake_temperature = 300.0;
}

static void test_trace_otto(void)
{
    otto_ref o;
    CU_ASSERT_EQUAL_FATAL(otto_reference(&o), 0);
    /* closed form of the cold-air-standard Otto efficiency, 1 - r^(1-k) */
    CHECK_REL(o.eta, 1.0 - pow(geo.compression_ratio, 1.0 - o.k), 1e-12,
              "Otto closed form 1 - r^(1-k)");
    double W_ref = o.m * o.w_net;    /* engine net work per cycle, J */
    double err_by_n[2] = { 0, 0 };
    const int Ns[2] = { 720, 7200 };  /* 1 deg and 0.1 deg steps */
    static double x[7200], P[7200];
    gc_measured_trace_result *r = malloc(sizeof *r);
    CU_ASSERT_PTR_NOT_NULL_FATAL(r);
    for (int t = 0; t < 2; t++) {
        int N = Ns[t];
        synth_otto(&o, N, x, P);
        gc_measured_trace_input in;
        trace_input(&in, N, x, P);
        in.fuel_per_cycle = o.m * 1.8e6 / 43e6;   /* heat_added x trapped mass / LHV */
        in.fuel_heating_value = 43e6;
        gc_error err;
        int rc = gc_measured_trace_reduce(&in, r, &err);
        if (rc != GC_OK)
            fprintf(stderr, "trace: %s %s\n", err.field, err.message);
        CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
        err_by_n[t] = fabs(r->work_net - W_ref) / W_ref;
        /* pumping loop of the ideal cycle is zero: intake and exhaust at P1 */
        CHECK_ABS(r->work_pumping / W_ref, 0.0, 1e-12, "ideal Otto: no pumping work");
        CHECK_REL(r->trapped_mass, o.m, 1e-12, "P1 Vbdc / (R T1), P1 read at BDC");
        /* isentropic segments: P V^k = const exactly, so the fit gives k */
        CHECK_REL(r->compression.n, o.k, 1e-10, "isentropic compression, n = k");
        CHECK_REL(r->expansion.n, o.k, 1e-10, "isentropic expansion, n = k");
        CHECK_REL(r->compression.r_squared, 1.0, 1e-12, "exact power law, R^2 = 1");
        note(r->compression.n, o.k);
        note(r->expansion.n, o.k);
        CU_ASSERT(r->has_ideal);
        CHECK_REL(r->ideal_efficiency, o.eta, 1e-12, "engine Otto at the fuel's heat");
        CHECK_REL(r->ideal_mep, o.mep, 1e-12, "engine Otto MEP");
        /* the highest sample is the first one after TDC on the expansion curve */
        double th1 = 4.0 * PI / N;
        CHECK_REL(r->P_max, o.P3 * pow(gc_measured_clearance(&geo) /
                                       gc_measured_volume(&geo, th1, NULL), o.k), 1e-12,
                  "expansion isentrope one step after TDC");
        CHECK_ABS(r->angle_P_max, th1, 1e-12, "one step after TDC");
    }
    /* trapezoid rule: error O(h^2) in the angle step, so ten times finer must be
     * about a hundred times closer; at 0.1 deg the rule is within 1e-5 */
    fprintf(stderr, "  trace work rel. error: %.3g at 1 deg, %.3g at 0.1 deg (ratio %.1f)\n",
            err_by_n[0], err_by_n[1], err_by_n[0] / err_by_n[1]);
    CU_ASSERT(err_by_n[0] / err_by_n[1] > 50.0 && err_by_n[0] / err_by_n[1] < 200.0);
    CU_ASSERT(err_by_n[1] < 1e-5);
    CHECK_REL(r->work_net, W_ref, 1e-5, "engine net work x trapped mass (trapezoid O(h^2))");
    CHECK_REL(r->imep_net, o.mep, 1e-5, "engine MEP (trapezoid O(h^2))");
    CHECK_REL(r->imep_gross, o.mep, 1e-5, "engine MEP, no pumping");
    CHECK_REL(r->efficiency_gross, o.eta, 1e-5, "indicated = ideal for the ideal trace");
    CHECK_REL(r->fraction_of_ideal, 1.0, 1e-5, "the ideal trace reaches the ideal");
    free(r);
}

/* The same trace given as (V, P) pairs, and shifted to 0..720 with TDC at 360. */
static void test_trace_pv_and_shift(void)
{
    otto_ref o;
    CU_ASSERT_EQUAL_FATAL(otto_reference(&o), 0);
    enum { N = 3600 };
    static double x[N], P[N], V[N], xs[N];
    synth_otto(&o, N, x, P);
    gc_measured_trace_result *a = malloc(sizeof *a), *b = malloc(sizeof *b),
                             *c = malloc(sizeof *c);
    CU_ASSERT_FATAL(a && b && c);
    gc_measured_trace_input in;
    trace_input(&in, N, x, P);
    CU_ASSERT_EQUAL_FATAL(gc_measured_trace_reduce(&in, a, NULL), GC_OK);
    for (int i = 0; i < N; i++) {
        V[i] = gc_measured_volume(&geo, x[i], NULL);
        xs[i] = x[i] + 4.0 * PI * 0.5;
    }
    gc_measured_trace_input pv = in;
    pv.pv = 1;
    pv.x = V;
    CU_ASSERT_EQUAL_FATAL(gc_measured_trace_reduce(&pv, b, NULL), GC_OK);
    CHECK_REL(b->work_net, a->work_net, 1e-12, "same samples, same loop integral");
    CHECK_REL(b->compression_ratio, geo.compression_ratio, 1e-12, "Vmax / Vmin of the samples");
    CHECK_REL(b->compression.n, o.k, 1e-10, "PV branches, isentropic: n = k");
    CHECK_REL(b->expansion.n, o.k, 1e-10, "PV branches, isentropic: n = k");
    gc_measured_trace_input sh = in;
    sh.x = xs;
    sh.tdc_angle = PI * 2.0;
    CU_ASSERT_EQUAL_FATAL(gc_measured_trace_reduce(&sh, c, NULL), GC_OK);
    CHECK_REL(c->work_net, a->work_net, 1e-12, "angle origin moved with tdc_angle");
    CHECK_REL(c->work_gross, a->work_gross, 1e-12, "angle origin moved with tdc_angle");
    CHECK_ABS(c->angle_P_max, a->angle_P_max, 1e-12, "peak angle from firing TDC");
    free(a);
    free(b);
    free(c);
}

static void test_trace_pumping(void)
{
    /* a rectangle pumping loop: exhaust at 2 P1, intake at P1, compression and
     * expansion at P1 too: gross 0, pumping = -(2 P1 - P1) Vd exactly (trapezoid
     * is exact for piecewise-constant P with samples on the stroke ends) */
    enum { N = 720 };
    static double x[N], P[N];
    for (int i = 0; i < N; i++) {
        x[i] = -2.0 * PI + 4.0 * PI * i / N;
        P[i] = (x[i] >= PI) ? 200e3 : 100e3;
    }
    P[540] = 100e3;   /* BDC after expansion: exhaust starts after it */
    gc_measured_trace_input in;
    trace_input(&in, N, x, P);
    in.compression_window[0] = -150 * DEG;
    gc_measured_trace_result *r = malloc(sizeof *r);
    CU_ASSERT_PTR_NOT_NULL_FATAL(r);
    gc_error err;
    int rc = gc_measured_trace_reduce(&in, r, &err);
    /* a constant-pressure window has nothing to fit against ln V?  It has: n = 0 */
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    double Vd = gc_measured_displacement(&geo);
    /* exhaust stroke at 200 kPa pushes Vd out (-200e3 Vd); the segment from the
     * last sample (359 deg, 200 kPa) to -360 deg (100 kPa) is a pressure step at
     * constant volume near TDC: O(h^2) */
    CHECK_REL(r->work_pumping, -100e3 * Vd, 2e-3, "rectangle loop, -(P_ex - P_in) Vd");
    CHECK_ABS(r->work_gross / (100e3 * Vd), 0.0, 1e-12, "no loop on the closed strokes");
    CHECK_REL(r->pmep, 100e3, 2e-3, "PMEP = P_ex - P_in");
    CHECK_ABS(r->compression.n, 0.0, 1e-12, "constant pressure: n = 0");
    free(r);
}

static void test_trace_errors(void)
{
    enum { N = 720 };
    static double x[N], P[N];
    for (int i = 0; i < N; i++) {
        x[i] = -2.0 * PI + 4.0 * PI * i / N;
        P[i] = 100e3 + 1e3 * cos(x[i]);
    }
    gc_measured_trace_input in;
    gc_measured_trace_result *r = malloc(sizeof *r);
    gc_error err;
    CU_ASSERT_PTR_NOT_NULL_FATAL(r);
    trace_input(&in, N, x, P);
    in.n = 20;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/trace");
    trace_input(&in, N, x, P);
    P[100] = -1.0;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/trace/100/1");
    P[100] = NAN;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/trace/100/1");
    P[100] = 100e3;
    double keep = x[200];
    x[200] = x[199];
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/trace/200/0");
    x[200] = keep;
    in.n = N / 2;   /* half a cycle */
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT(strstr(err.message, "full cycle") != NULL);
    in.n = N;
    in.geometry.rod_length = 0.05;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/connecting_rod_length");
    in.geometry = geo;
    in.compression_window[0] = -10 * DEG;
    in.compression_window[1] = -9.9 * DEG;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/compression_window");
    in.compression_window[0] = -150 * DEG;
    in.compression_window[1] = -30 * DEG;
    in.strokes = 3;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/strokes_per_cycle");
    in.strokes = 4;
    /* an open loop is warned, not refused */
    P[N - 1] = 150e3;
    CU_ASSERT_EQUAL(gc_measured_trace_reduce(&in, r, &err), GC_OK);
    int found = 0;
    for (int i = 0; i < r->n_warnings; i++)
        found |= strcmp(r->warnings[i].code, "loop_not_closed") == 0;
    CU_ASSERT(found);
    free(r);
}

/* ---- stations from engine-evaluated Brayton cycles ------------------------- */

static void brayton_base(gc_brayton_input *bi)
{
    gc_brayton_input_init(bi);
    bi->pressure_ratio = 12.0;
    bi->turbine_inlet_temperature = 1400.0;
    bi->compressor_efficiency = 0.86;
    bi->turbine_efficiency = 0.89;
    bi->combustor_pressure_loss = 0.03;
    bi->has_gas = 1;
    gc_gas_init_air(&bi->gas);
    bi->site.has_temperature = 1;
    bi->site.T_K = 288.15;
    bi->site.has_pressure = 1;
    bi->site.P_Pa = 101325.0;
    bi->site.has_relative_humidity = 1;
    bi->site.RH = 0.0;
    bi->flags = GC_BRAYTON_NO_OPTIMUM;
}

static void st(gc_measured_station *s, const gc_cycle_run *run, int i)
{
    s->T_K = run->states[i].T_total_K;
    s->P_Pa = run->states[i].P_total_Pa;
}

static void stations_from(const gc_brayton_result *br, gc_measured_stations_input *in)
{
    gc_measured_stations_input_init(in);
    const gc_cycle_run *run = &br->cycle.actual;
    st(&in->compressor_inlet, run, br->stations.compressor_inlet);
    st(&in->compressor_outlet, run, br->stations.compressor_exit);
    st(&in->turbine_inlet, run, br->stations.turbine_inlet);
    st(&in->turbine_outlet, run, br->stations.turbine_exit);
}

static void test_stations_isentropic(void)
{
    gc_brayton_input bi;
    gc_brayton_result *br = malloc(sizeof *br);
    gc_measured_stations_result *r = malloc(sizeof *r);
    CU_ASSERT_FATAL(br && r);
    brayton_base(&bi);
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&bi, br, NULL), GC_OK);
    gc_measured_stations_input in;
    stations_from(br, &in);
    gc_error err;
    int rc = gc_measured_stations_reduce(&in, r, &err);
    if (rc)
        fprintf(stderr, "stations: %s %s\n", err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    /* the efficiencies the engine was given */
    CHECK_REL(r->compressor[0].isentropic_efficiency, 0.86, 1e-9, "engine input");
    CHECK_REL(r->turbine.isentropic_efficiency, 0.89, 1e-9, "engine input");
    note(r->compressor[0].isentropic_efficiency, 0.86);
    note(r->turbine.isentropic_efficiency, 0.89);
    /* the engine's own figures of the same cycle */
    CHECK_REL(r->net_work, br->specific_work, 1e-9, "engine net work");
    CHECK_REL(r->compressor_work, br->compressor_work, 1e-9, "engine compressor work");
    CHECK_REL(r->turbine_work, br->turbine_work, 1e-9, "engine turbine work");
    CHECK_REL(r->heat_in, br->heat_in, 1e-9, "engine heat input");
    CHECK_REL(r->thermal_efficiency, br->thermal_efficiency, 1e-9, "engine efficiency");
    CHECK_REL(r->back_work_ratio, br->back_work_ratio, 1e-9, "engine back work ratio");
    CHECK_REL(r->combustor_pressure_loss, 0.03, 1e-9, "engine input");
    /* the polytropic efficiency of the drawn curve (the engine's process record) */
    const gc_cycle_run *run = &br->cycle.actual;
    for (int p = 0; p < run->n_processes; p++) {
        if (run->processes[p].kind == GC_PROC_COMPRESSION)
            CHECK_REL(r->compressor[0].polytropic_efficiency,
                      run->processes[p].polytropic_efficiency, 1e-9, "engine process record");
        if (run->processes[p].kind == GC_PROC_EXPANSION)
            CHECK_REL(r->turbine.polytropic_efficiency,
                      run->processes[p].polytropic_efficiency, 1e-9, "engine process record");
    }
    /* ideal: the engine's ideal counterpart of the same inputs (efficiencies 1,
     * no loss, same pressure ratio and turbine inlet temperature) */
    CHECK_REL(r->ideal_thermal_efficiency, br->ideal_efficiency, 1e-9, "engine ideal");
    CHECK_REL(r->ideal_net_work, br->ideal_specific_work, 1e-9, "engine ideal");
    CHECK_REL(r->carnot_efficiency, 1.0 - 288.15 / 1400.0, 1e-12, "Carnot 1 - Tmin/Tmax");
    /* exergy: compressor and turbine destruction is T0 s_gen > 0; shortfall >= 0 */
    CU_ASSERT(r->exergy_compressor > 0.0 && r->exergy_turbine > 0.0);
    CU_ASSERT(r->efficiency_gap > 0.0 && r->fraction_of_ideal < 1.0);
    CHECK_REL(r->deficit_compressor, br->compressor_work * (1.0 - 0.86), 1e-9,
              "w_c - w_cs = w_c (1 - eta_c)");
    CU_ASSERT(r->deficit_pressure_losses > 0.0);
    CU_ASSERT_PTR_NOT_NULL(r->largest_loss);
    /* exergy balance of the loop (dead state = compressor inlet): the heat's exergy
     * at T3 equals net work + destroyed + exhaust flow exergy, per kg air; the
     * exhaust here returns at P1, so the balance closes to rounding */
    double T0 = r->T_dead_K;
    double ex_heat = r->heat_in * (1.0 - T0 / 1400.0);
    CHECK_REL(r->net_work + r->exergy_destroyed + r->exergy_exhaust, ex_heat, 1e-9,
              "exergy balance (Gouy-Stodola)");
    free(br);
    free(r);
}

static void test_stations_polytropic_regen_intercooled(void)
{
    gc_brayton_input bi;
    gc_brayton_result *br = malloc(sizeof *br);
    gc_measured_stations_result *r = malloc(sizeof *r);
    CU_ASSERT_FATAL(br && r);
    /* polytropic efficiencies */
    brayton_base(&bi);
    bi.polytropic_efficiency = 1;
    bi.compressor_efficiency = 0.88;
    bi.turbine_efficiency = 0.90;
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&bi, br, NULL), GC_OK);
    gc_measured_stations_input in;
    stations_from(br, &in);
    CU_ASSERT_EQUAL_FATAL(gc_measured_stations_reduce(&in, r, NULL), GC_OK);
    CHECK_REL(r->compressor[0].polytropic_efficiency, 0.88, 1e-9, "engine input");
    CHECK_REL(r->turbine.polytropic_efficiency, 0.90, 1e-9, "engine input");
    note(r->compressor[0].polytropic_efficiency, 0.88);
    note(r->turbine.polytropic_efficiency, 0.90);

    /* regenerator and two intercooled compressor stages */
    brayton_base(&bi);
    bi.combustor_pressure_loss = 0.0;
    bi.pressure_ratio = 8.0;
    bi.compressor_stages = 2;
    bi.intercooling_temperature = 300.0;
    bi.compressor_stage_efficiency[0] = 0.84;
    bi.compressor_stage_efficiency[1] = 0.87;
    bi.regenerator_effectiveness = 0.8;
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&bi, br, NULL), GC_OK);
    stations_from(br, &in);
    const gc_cycle_run *run = &br->cycle.actual;
    int ic = -1;
    for (int p = 0; p < run->n_processes; p++)
        if (run->processes[p].kind == GC_PROC_COOLING)
            ic = run->processes[p].from;
    CU_ASSERT_FATAL(ic > 0);
    in.has_intercooler = 1;
    st(&in.intercooler_inlet, run, ic);
    st(&in.intercooler_outlet, run, ic + 1);
    in.has_regenerator = 1;
    st(&in.regenerator_air_outlet, run, br->stations.combustor_inlet);
    st(&in.regenerator_gas_outlet, run, br->stations.exhaust);
    gc_error err;
    int rc = gc_measured_stations_reduce(&in, r, &err);
    if (rc)
        fprintf(stderr, "stations: %s %s\n", err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CHECK_REL(r->compressor[0].isentropic_efficiency, 0.84, 1e-9, "engine input, stage 1");
    CHECK_REL(r->compressor[1].isentropic_efficiency, 0.87, 1e-9, "engine input, stage 2");
    CHECK_REL(r->regenerator_effectiveness, 0.8, 1e-9, "engine input (cycle.h's definition)");
    CHECK_ABS(r->regenerator_balance, 0.0, 1e-9, "engine energy balance of the exchanger");
    CHECK_REL(r->intercooler_heat, br->intercooler_heat, 1e-9, "engine intercooler heat");
    CHECK_REL(r->thermal_efficiency, br->thermal_efficiency, 1e-9, "engine efficiency");
    CHECK_REL(r->ideal_thermal_efficiency, br->ideal_components_efficiency, 1e-9,
              "engine bound with ideal components and this regenerator");
    note(r->compressor[0].isentropic_efficiency, 0.84);
    note(r->regenerator_effectiveness, 0.8);
    free(br);
    free(r);
}

static void test_stations_fuel(void)
{
    gc_brayton_input bi;
    gc_brayton_result *br = malloc(sizeof *br);
    gc_measured_stations_result *r = malloc(sizeof *r);
    CU_ASSERT_FATAL(br && r);
    brayton_base(&bi);
    bi.heat_mode = GC_BRAYTON_FUEL;
    bi.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&bi.fuel, "methane", NULL), GC_OK);
    bi.combustor_efficiency = 0.98;
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&bi, br, NULL), GC_OK);
    gc_measured_stations_input in;
    stations_from(br, &in);
    in.has_fuel = 1;
    in.fuel = bi.fuel;
    in.fuel_species = 1;
    in.air_mass_flow = 100.0;
    in.fuel_mass_flow = 100.0 * br->fuel_air_ratio_main;
    gc_error err;
    int rc = gc_measured_stations_reduce(&in, r, &err);
    if (rc)
        fprintf(stderr, "stations: %s %s\n", err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CU_ASSERT(r->products);
    CHECK_REL(r->combustor_efficiency, 0.98, 1e-9, "engine input");
    CHECK_REL(r->turbine.isentropic_efficiency, 0.89, 1e-9, "engine input (products gas)");
    CHECK_REL(r->compressor[0].isentropic_efficiency, 0.86, 1e-9, "engine input");
    CHECK_REL(r->thermal_efficiency, br->thermal_efficiency, 1e-9, "engine LHV efficiency");
    CHECK_REL(r->heat_in, br->heat_in, 1e-9, "far x LHV");
    CHECK_REL(r->deficit_combustor, 0.02 * r->heat_in * r->ideal_thermal_efficiency, 1e-9,
              "(1 - eta_b) far LHV x ideal efficiency");
    CU_ASSERT(r->ideal_fuel_basis);
    note(r->combustor_efficiency, 0.98);
    note(r->turbine.isentropic_efficiency, 0.89);
    free(br);
    free(r);
}

/* A named fuel without flows (issue 10: the turbine gas was silently the air,
 * turbine efficiency 0.867 for 0.890, cycle efficiency 0.326 for 0.346): the
 * fuel-air ratio comes from the combustor energy balance and the turbine gas
 * is the products. (1) Round trip: station data from the engine's Brayton
 * burning methane at combustor efficiency 1 reduce back to the engine's inputs
 * and efficiency. (2) Against an independent calculation,
 * tools/ref/calc_stations_fuel_nasa9.py (NASA-9 species sums, scipy brentq),
 * for invented readings: far 0.02013431305, turbine 0.9281835975, thermal
 * efficiency 0.4128096972 (as air it would be 0.9038966889 and 0.3930049073). */
static void test_far_from_energy_balance(void)
{
    gc_brayton_input bi;
    gc_brayton_result *br = malloc(sizeof *br);
    gc_measured_stations_result *r = malloc(sizeof *r);
    CU_ASSERT_FATAL(br && r);
    brayton_base(&bi);
    bi.heat_mode = GC_BRAYTON_FUEL;
    bi.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&bi.fuel, "methane", NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&bi, br, NULL), GC_OK);
    gc_measured_stations_input in;
    stations_from(br, &in);
    in.has_fuel = 1;
    in.fuel = bi.fuel;
    in.fuel_species = 1;
    gc_error err;
    int rc = gc_measured_stations_reduce(&in, r, &err);
    if (rc)
        fprintf(stderr, "stations: %s %s\n", err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CU_ASSERT(r->products && r->fuel_basis && r->far_from_balance);
    CHECK_REL(r->fuel_air_ratio, br->fuel_air_ratio_main, 1e-9, "engine's burner balance");
    CHECK_REL(r->turbine.isentropic_efficiency, 0.89, 1e-9, "engine input (products gas)");
    CHECK_REL(r->compressor[0].isentropic_efficiency, 0.86, 1e-9, "engine input");
    CHECK_REL(r->thermal_efficiency, br->thermal_efficiency, 1e-9, "engine LHV efficiency");
    CU_ASSERT_EQUAL(r->combustor_efficiency, 1.0);
    int said = 0;
    for (int i = 0; i < r->n_warnings; i++)
        said |= strcmp(r->warnings[i].code, "fuel_air_ratio_from_balance") == 0;
    CU_ASSERT(said);
    note(r->turbine.isentropic_efficiency, 0.89);

    gc_measured_stations_input_init(&in);
    in.compressor_inlet = (gc_measured_station){ 288.15, 101325.0 };
    in.compressor_outlet = (gc_measured_station){ 650.0, 1520e3 };
    in.turbine_inlet = (gc_measured_station){ 1450.0, 1460e3 };
    in.turbine_outlet = (gc_measured_station){ 820.0, 104e3 };
    in.has_fuel = 1;
    in.fuel_species = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "methane", NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_measured_stations_reduce(&in, r, &err), GC_OK);
    const char *src = "tools/ref/calc_stations_fuel_nasa9.py (NASA-9, scipy)";
    CHECK_REL(r->fuel_air_ratio, 0.02013431305, 1e-8, src);
    CHECK_REL(r->turbine.isentropic_efficiency, 0.9281835975, 1e-8, src);
    CHECK_REL(r->compressor[0].isentropic_efficiency, 0.9061701908, 1e-8, src);
    CHECK_REL(r->net_work, 415.8070614e3, 1e-8, src);
    CHECK_REL(r->thermal_efficiency, 0.4128096972, 1e-8, src);
    CHECK_REL(r->gas_path_heat_rate, 1.0 / 0.4128096972, 1e-8, "1 / thermal efficiency");

    /* a heating value without an analysis: no products can be formed; said so */
    in.has_fuel = 0;
    in.fuel_species = 0;
    in.fuel_heating_value = 50e6;
    CU_ASSERT_EQUAL_FATAL(gc_measured_stations_reduce(&in, r, &err), GC_OK);
    CU_ASSERT(!r->products && !r->fuel_basis);
    CHECK_REL(r->turbine.isentropic_efficiency, 0.9038966889, 1e-8, src);
    said = 0;
    for (int i = 0; i < r->n_warnings; i++)
        said |= strcmp(r->warnings[i].code, "turbine_gas_air") == 0;
    CU_ASSERT(said);
    free(br);
    free(r);
}

static void test_stations_errors(void)
{
    gc_measured_stations_input in;
    gc_measured_stations_result *r = malloc(sizeof *r);
    CU_ASSERT_PTR_NOT_NULL_FATAL(r);
    gc_measured_stations_input_init(&in);
    in.compressor_inlet = (gc_measured_station){ 288.15, 101325.0 };
    in.compressor_outlet = (gc_measured_station){ 620.0, 1.2e6 };
    in.turbine_inlet = (gc_measured_station){ 1400.0, 1.16e6 };
    in.turbine_outlet = (gc_measured_station){ 800.0, 104e3 };
    gc_error err;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_OK);
    /* pressure falling across the compressor */
    in.compressor_outlet.P_Pa = 90e3;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/compressor_outlet/P");
    in.compressor_outlet.P_Pa = 1.2e6;
    /* temperature falling across the compressor */
    in.compressor_outlet.T_K = 280.0;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/compressor_outlet/T");
    CU_ASSERT(strstr(err.message, "inconsistent") != NULL);
    /* all errors at once */
    in.turbine_outlet.P_Pa = 2e6;
    gc_error list[GC_MEASURED_MAX_ERRORS];
    int nerr = 0;
    CU_ASSERT_EQUAL(gc_measured_stations_validate(&in, list, GC_MEASURED_MAX_ERRORS, &nerr),
                    GC_ERR_INVALID);
    CU_ASSERT_EQUAL(nerr, 2);
    CU_ASSERT_STRING_EQUAL(list[0].field, "/compressor_outlet/T");
    CU_ASSERT_STRING_EQUAL(list[1].field, "/turbine_outlet/P");
    in.turbine_outlet.P_Pa = 104e3;
    /* an efficiency above 1: T2 below the isentropic outlet temperature */
    double T2s;
    CU_ASSERT_EQUAL(gc_gas_T_isentropic_P(&in.gas, 288.15, 1.2e6 / 101325.0, &T2s, NULL), GC_OK);
    double h1 = gc_gas_h_T(&in.gas, 288.15), h2s = gc_gas_h_T(&in.gas, T2s);
    double T2;   /* outlet for eta = 1.05 and 1.01 */
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&in.gas, h1 + (h2s - h1) / 1.05, &T2, NULL), GC_OK);
    in.compressor_outlet.T_K = T2;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/compressor_outlet/T");
    CU_ASSERT(strstr(err.message, "above 1") != NULL);
    CU_ASSERT_EQUAL(gc_gas_T_from_h(&in.gas, h1 + (h2s - h1) / 1.01, &T2, NULL), GC_OK);
    in.compressor_outlet.T_K = T2;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_OK);
    CHECK_REL(r->compressor[0].isentropic_efficiency, 1.01, 1e-9, "constructed outlet");
    CU_ASSERT(r->n_warnings >= 1 && strcmp(r->warnings[0].code, "efficiency_above_one") == 0);
    /* combustor raising the pressure */
    in.compressor_outlet.T_K = 620.0;
    in.turbine_inlet.P_Pa = 1.3e6;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(err.field, "/turbine_inlet/P");
    in.turbine_inlet.P_Pa = 1.16e6;
    /* temperature outside the gas data */
    in.turbine_inlet.T_K = 9000.0;
    CU_ASSERT_EQUAL(gc_measured_stations_reduce(&in, r, &err), GC_ERR_RANGE);
    CU_ASSERT_STRING_EQUAL(err.field, "/turbine_inlet/T");
    free(r);
}

static void test_report(void)
{
    fprintf(stderr, "  worst relative error of the recovery checks: %.3g\n", worst_rel);
    CU_ASSERT(worst_rel < 1e-9);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "slider-crank volume: limits, hand value, derivative", test_volume_limits },
        { "ideal Otto trace: work, MEP, n = k, O(h^2)", test_trace_otto },
        { "trace as P-V pairs and with a shifted angle origin", test_trace_pv_and_shift },
        { "pumping loop", test_trace_pumping },
        { "trace errors", test_trace_errors },
        { "stations: isentropic efficiencies from the engine's Brayton", test_stations_isentropic },
        { "stations: polytropic, regenerator, intercooler", test_stations_polytropic_regen_intercooled },
        { "stations: fuel-fired, combustor efficiency", test_stations_fuel },
        { "stations: named fuel without flows (energy balance)", test_far_from_energy_balance },
        { "stations: data errors", test_stations_errors },
        { "worst error", test_report },
        { NULL, NULL }
    };
    return gc_run_suite("measured", cases);
}
