/*
 * combined_topping.c — the topping cycles a combined-cycle plant may name
 * (combined.h): each a preset descriptor and an adapter reading what the
 * HRSG and the plant's balances need from its result (gc_combined_exhaust).
 *
 *   brayton  the Brayton preset (brayton.h), evaluated through its
 *            descriptor. HRSG inlet: the state the exhaust pressure loss
 *            starts from (the state before the close step when there is no
 *            loss); the HRSG's gas-side loss is that loss (1 - P_exh/P_in
 *            from the two states, so the stack is at the site pressure). The
 *            ideal counterpart's exhaust comes from the engine's ideal run.
 *            Flows: its air mass flow at a rated net power, else 1 kg/s.
 *   machine_site  the fixed gas turbine at site conditions (machine.h), read
 *            through the Brayton adapter from the cycle of its operating
 *            point (the machine's chain at the solved air flow); the net
 *            power is the machine's (generator output less any chiller).
 *   exhaust  an exhaust as given: a preset of its own here (not served on a
 *            route), gas model air or cold, temperature, pressure, mass flow,
 *            the HRSG's gas-side pressure loss, the ambient (dead state) and,
 *            optionally, the gas turbine's net power and fuel heat (LHV,
 *            HHV) for the plant's efficiency. Its ideal counterpart is itself.
 *
 * Energy bookkeeping (the plant check): the cycle engine books a fuel's
 * heat as m_fuel LHV at 298.15 K and the gases' enthalpies sensible on the
 * formation basis of gc_cycle_h_ref (cycle.h), so the exhaust's sensible
 * enthalpy flow = intake's + fuel's sensible + fuel heat - net work - other
 * heat rejected; the adapter hands over each term. Units: SI.
 */
#include "core/presets/combined_internal.h"
#include "core/presets/presets.h"
#include "core/presets/machine_presets.h"
#include "gascycle/brayton.h"

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

/* ---- brayton ------------------------------------------------------------------------ */

/* The HRSG inlet state of a run: the state its exhaust pressure loss starts
 * from, else the close step's start; -1 when the chain does not close. */
static int brayton_inlet(const gc_cycle_run *run, int *exhaust)
{
    if (run->n_processes < 1)
        return -1;
    const gc_cycle_process *close = &run->processes[run->n_processes - 1];
    if (close->kind != GC_PROC_CLOSE)
        return -1;
    *exhaust = close->from;
    for (int k = run->n_processes - 2; k >= 0; k--)
        if (run->processes[k].to == close->from)
            return run->processes[k].kind == GC_PROC_PRESSURE_LOSS ? run->processes[k].from
                                                                     : close->from;
    return close->from;
}

/* Heat rejected other than by the close step, J/kg intake. */
static double other_heat_out(const gc_cycle_run *run)
{
    double q = 0.0;
    for (int k = 0; k + 1 < run->n_processes; k++)
        q += run->processes[k].heat_out;
    return q;
}

static void brayton_exergy(const gc_cycle_run *run, double m, gc_combined_exhaust *x)
{
    const gc_cycle_summary *s = &run->summary;
    x->T_dead_K = s->T_dead_K;
    x->P_dead_Pa = s->P_dead_Pa;
    x->T_min_K = s->T_min_K;
    x->T_max_K = s->T_max_K;
    x->exergy_model = s->exergy_model;
    x->exergy_in_W = s->exergy_in * m;
    x->exergy_intake_W = s->exergy_intake * m;
    x->exergy_heat_out_W = s->exergy_heat_out * m;
    x->exergy_chemical_W = s->exergy_model == GC_EXERGY_FUEL ? s->exergy_exhaust_chemical * m
                                                              : 0.0;
    x->energy_rel = run->checks.energy_rel;
}

static int brayton_fuel(const gc_brayton_input *in, const gc_cycle_run *run, double m,
                        gc_combined_exhaust *x, gc_error *err)
{
    x->has_fuel = in->has_fuel;
    x->fuel_heat_W = run->summary.heat_in * m;
    x->fuel_heat_hhv_W = x->fuel_heat_W;
    x->fuel_sensible_W = 0.0;
    if (!in->has_fuel)
        return GC_OK;
    x->fuel = in->fuel;
    x->fuel_temperature_K = in->fuel_temperature > 0.0 ? in->fuel_temperature : GC_T_REF_K;
    x->fuel_heat_hhv_W = x->fuel_heat_W * in->fuel.HHV_J_per_kg / in->fuel.LHV_J_per_kg;
    double h = 0.0;
    int rc = gc_fuel_h_T(&in->fuel, x->fuel_temperature_K, &h, err);
    x->fuel_sensible_W = run->summary.fuel_air_ratio * m * (h - in->fuel.h298_J_per_kg);
    return rc;
}

static int brayton_exhaust(const void *input, const void *result, int ideal,
                           gc_combined_exhaust *x, gc_error *err)
{
    const gc_brayton_input *in = input;
    const gc_brayton_result *r = result;
    const gc_cycle_run *run = ideal ? &r->cycle.ideal : &r->cycle.actual;
    memset(x, 0, sizeof *x);
    if (ideal && !r->cycle.has_ideal)
        return gc_error_set(err, GC_ERR_INVALID, "", "the topping has no ideal counterpart");
    int exh = -1, inlet = brayton_inlet(run, &exh);
    if (inlet < 0)
        return gc_error_set(err, GC_ERR_INVALID, "", "the topping cycle has no exhaust");
    const gc_cycle_state *si = &run->states[inlet];
    double m = r->has_power ? r->air_mass_flow : 1.0;
    x->gas = run->gases[si->gas];
    x->T_K = si->T_K;
    x->P_Pa = si->P_Pa;
    x->pressure_loss = 1.0 - run->states[exh].P_Pa / si->P_Pa;
    if (x->pressure_loss < 0.0)
        x->pressure_loss = 0.0;
    x->intake_mass_flow = m;
    x->has_flow = r->has_power;
    x->exhaust_mass_ratio = si->mass_ratio;
    x->work_W = run->summary.net_work * m;
    x->net_power_W = ideal ? x->work_W : r->specific_electric_work * m;
    x->has_heat = 1;
    x->other_heat_out_W = other_heat_out(run) * m;
    x->intake_sensible_W = run->states[0].hs_J_per_kg * m;
    brayton_exergy(run, m, x);
    return brayton_fuel(in, run, m, x, err);
}

static const gc_cycle_result *brayton_cycle(const void *result, int *n_states)
{
    const gc_brayton_result *r = result;
    int exh = -1;
    *n_states = brayton_inlet(&r->cycle.actual, &exh) + 1;
    return &r->cycle;
}

static void brayton_lean(void *input)
{
    ((gc_brayton_input *)input)->flags |= GC_BRAYTON_NO_BOUNDS | GC_BRAYTON_NO_OPTIMUM;
}

/* ---- machine_site ------------------------------------------------------------------- */

_Static_assert(sizeof(gc_machine_site_request) <= GC_COMBINED_TOPPING_INPUT_BYTES,
               "a machine topping's input must fit the combined input");
_Static_assert(sizeof(gc_machine_site_answer) <= GC_COMBINED_TOPPING_RESULT_BYTES,
               "a machine topping's result must fit the combined result");

static int machine_exhaust(const void *input, const void *result, int ideal,
                           gc_combined_exhaust *x, gc_error *err)
{
    (void)input;
    const gc_machine_site_answer *r = result;
    if (!r->at.has_cycle)
        return gc_error_set(err, GC_ERR_INVALID, "", "the machine point has no cycle");
    int rc = brayton_exhaust(&r->head.machine.chain, &r->at.cycle, ideal, x, err);
    if (rc == GC_OK && !ideal)
        x->net_power_W = r->at.point.net_power_W;
    return rc;
}

static const gc_cycle_result *machine_cycle(const void *result, int *n_states)
{
    const gc_machine_site_answer *r = result;
    return brayton_cycle(&r->at.cycle, n_states);
}

/* ---- a given exhaust ------------------------------------------------------------------- */

typedef struct exh_input {
    gc_gas gas;
    int has_gas;
    double temperature, pressure, mass_flow, pressure_loss;
    double ambient_temperature, ambient_pressure;
    double net_power;
    int has_net_power;
    double fuel_heat_input, fuel_heat_input_hhv;
    int has_fuel_heat_input, has_fuel_heat_input_hhv;
} exh_input;

enum { EX_REQUEST, EX_GAS, EX_GAS_CP, EX_GAS_K, EX_TEMPERATURE, EX_PRESSURE, EX_MASS_FLOW,
       EX_PRESSURE_LOSS, EX_AMBIENT_TEMPERATURE, EX_AMBIENT_PRESSURE, EX_NET_POWER,
       EX_FUEL_HEAT, EX_FUEL_HEAT_HHV, EX_COUNT };

#define XIN(m) offsetof(exh_input, m)
#define XGIVEN(m) (offsetof(exh_input, m) + 1)
#define XNUM(id, nm, q, fl, d, lo, hi, m, desc)                                              \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q, .flags = (fl), .def = (d),     \
             .min = (lo), .max = (hi), .offset = XIN(m), .description = desc }
#define XOPT(id, nm, q, hi, m, has, desc)                                                    \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q,                                \
             .flags = GC_FF_OPTIONAL | GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .min = 0.0,   \
             .max = (hi), .offset = XIN(m), .given = XGIVEN(has), .description = desc }

static const char *const exh_gas_models[] = { "air", "cold", NULL };

static const gc_field exh_fields[EX_COUNT] = {
    [EX_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                     .description = "A gas-turbine exhaust as given." },
    [EX_GAS] = { .name = "gas", .type = GC_FT_GAS, .names = exh_gas_models, .offset = XIN(gas),
                 .given = XGIVEN(has_gas),
                 .description = "Exhaust gas model: \"air\" (dry air, NASA 9-coefficient "
                 "polynomials) or \"cold\" (constant cp and k). Supplementary firing needs "
                 "\"air\" (a species mixture)." },
    [EX_GAS_CP] = { .name = "cp", .parent = EX_GAS, .variant = 1, .type = GC_FT_NUMBER,
                    .quantity = GC_Q_SPECIFIC_ENTROPY, .flags = GC_FF_MIN | GC_FF_MAX,
                    .def = 1005.0, .min = 100.0, .max = 20000.0,
                    .offset = XIN(gas) + offsetof(gc_gas, cp_cold_J_per_kgK),
                    .description = "Cold model: constant specific heat at constant pressure." },
    [EX_GAS_K] = { .name = "k", .parent = EX_GAS, .variant = 1, .type = GC_FT_NUMBER,
                   .quantity = GC_Q_RATIO, .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX,
                   .def = 1.4, .min = 1.0, .max = 1.7, .offset = XIN(gas) + offsetof(gc_gas, k_cold),
                   .description = "Cold model: constant ratio of specific heats cp/cv." },
    XNUM(EX_TEMPERATURE, "temperature", GC_Q_TEMPERATURE, GC_FF_REQUIRED | GC_FF_MIN | GC_FF_MAX,
         0.0, 300.0, 2000.0, temperature, "Exhaust temperature at the HRSG inlet."),
    XNUM(EX_PRESSURE, "pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MAX, 104325.0, 5.0e4, 1.0e6,
         pressure, "Exhaust pressure at the HRSG inlet."),
    XNUM(EX_MASS_FLOW, "mass_flow", GC_Q_MASS_FLOW, GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, 1.0,
         0.0, 1.0e4, mass_flow, "Exhaust mass flow."),
    XNUM(EX_PRESSURE_LOSS, "pressure_loss", GC_Q_FRACTION, GC_FF_MIN | GC_FF_MAX, 0.0, 0.0, 0.2,
         pressure_loss, "The HRSG's gas-side pressure loss, a fraction of the inlet pressure."),
    XNUM(EX_AMBIENT_TEMPERATURE, "ambient_temperature", GC_Q_AMBIENT_TEMPERATURE,
         GC_FF_MIN | GC_FF_MAX, 288.15, 250.0, 320.0, ambient_temperature,
         "Ambient temperature: the dead state of the exergy figures."),
    XNUM(EX_AMBIENT_PRESSURE, "ambient_pressure", GC_Q_PRESSURE, GC_FF_MIN | GC_FF_MAX,
         101325.0, 5.0e4, 1.1e5, ambient_pressure,
         "Ambient pressure: the dead state of the exergy figures."),
    XOPT(EX_NET_POWER, "net_power", GC_Q_POWER, 2.0e9, net_power, has_net_power,
         "The gas turbine's net electric power at this exhaust (absent: 0, the plant's "
         "figures are the bottoming cycle's)."),
    XOPT(EX_FUEL_HEAT, "fuel_heat_input", GC_Q_POWER, 1.0e10, fuel_heat_input,
         has_fuel_heat_input, "The gas turbine's fuel heat input on the LHV: gives the "
         "plant's efficiency and heat rate."),
    XOPT(EX_FUEL_HEAT_HHV, "fuel_heat_input_hhv", GC_Q_POWER, 1.0e10, fuel_heat_input_hhv,
         has_fuel_heat_input_hhv, "The same on the HHV (absent: the HHV figures equal the "
         "LHV ones)."),
};

static int exh_evaluate(const void *input, void *result, gc_report *rep)
{
    const exh_input *in = input;
    gc_combined_exhaust *x = result;
    memset(x, 0, sizeof *x);
    if (in->has_fuel_heat_input_hhv && !in->has_fuel_heat_input)
        return gc_report_error(rep, GC_ERR_INVALID, EX_FUEL_HEAT_HHV, -1,
                               "is given only with fuel_heat_input");
    x->gas = in->gas;
    x->T_K = in->temperature;
    x->P_Pa = in->pressure;
    x->pressure_loss = in->pressure_loss;
    x->intake_mass_flow = in->mass_flow;
    x->has_flow = 1;
    x->exhaust_mass_ratio = 1.0;
    x->net_power_W = in->has_net_power ? in->net_power : 0.0;
    x->work_W = x->net_power_W;
    x->has_heat = in->has_fuel_heat_input;
    x->fuel_heat_W = x->has_heat ? in->fuel_heat_input : 0.0;
    x->fuel_heat_hhv_W = in->has_fuel_heat_input_hhv ? in->fuel_heat_input_hhv : x->fuel_heat_W;
    x->T_dead_K = in->ambient_temperature;
    x->P_dead_Pa = in->ambient_pressure;
    x->T_min_K = fmin(in->ambient_temperature, in->temperature);
    x->T_max_K = in->temperature;
    x->exergy_model = -1;
    return gc_gas_check_T(&in->gas, in->temperature, "", NULL) == GC_OK
               ? GC_OK
               : gc_report_error(rep, GC_ERR_RANGE, EX_TEMPERATURE, -1,
                                 "is outside the gas model's data range");
}

static int exh_adapter(const void *input, const void *result, int ideal,
                       gc_combined_exhaust *x, gc_error *err)
{
    (void)input;
    (void)ideal;
    (void)err;
    *x = *(const gc_combined_exhaust *)result;
    return GC_OK;
}

const gc_preset gc__combined_exhaust_preset = {
    .name = "exhaust",
    .label = "cycles_combined_exhaust",
    .title = "Gas-turbine exhaust",
    .description = "A gas-turbine exhaust as given (temperature, pressure, mass flow, gas "
                   "model, the HRSG's gas-side pressure loss, the ambient), with the gas "
                   "turbine's net power and fuel heat input when known.",
    .kind = GC_PRESET_CYCLE,
    .fields = exh_fields,
    .n_fields = EX_COUNT,
    .input_size = sizeof(exh_input),
    .result_size = sizeof(gc_combined_exhaust),
    .evaluate = exh_evaluate,
};

/* ---- the list ----------------------------------------------------------------------- */

const gc_combined_topping gc_combined_toppings[] = {
    { &gc_preset_brayton, brayton_exhaust, brayton_cycle, brayton_lean },
    { &gc_preset_machine_site, machine_exhaust, machine_cycle, NULL },
    { &gc__combined_exhaust_preset, exh_adapter, NULL, NULL },
    { NULL, NULL, NULL, NULL },
};

const gc_preset *const gc_combined_topping_presets[] = {
    &gc_preset_brayton, &gc_preset_machine_site, &gc__combined_exhaust_preset, NULL,
};
