/*
 * example_preset.c — the worked example of DEVELOPERS.md ("Adding a cycle
 * preset"), compiled and run by test_registry.c: steady-flow air
 * compressed over a pressure ratio, heated at constant pressure to a
 * temperature, expanded back to the start pressure and closed. SI units.
 */
#include "example_preset.h"

#include <stddef.h>

enum { F_REQUEST, F_T_START, F_P_START, F_RATIO, F_T_HOT, F_EFF, F_COUNT };

#define IN(m) offsetof(ex_input, m)
#define NUM(id, nm, q, d, lo, hi, m, desc)                                                   \
    [id] = { .name = nm, .type = GC_FT_NUMBER, .quantity = q, .def = d, .min = lo, .max = hi, \
             .flags = GC_FF_MIN | GC_FF_MIN_EXCL | GC_FF_MAX, .offset = IN(m),               \
             .description = desc }

static const gc_field fields[F_COUNT] = {
    [F_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                    .description = "Inputs of the example cycle." },
    NUM(F_T_START, "start_temperature", GC_Q_TEMPERATURE, 288.15, 150.0, 1000.0, T_start,
        "Air temperature at the compressor inlet."),
    NUM(F_P_START, "start_pressure", GC_Q_PRESSURE, 101325.0, 1000.0, 1e7, P_start,
        "Air pressure at the compressor inlet."),
    NUM(F_RATIO, "pressure_ratio", GC_Q_RATIO, 8.0, 1.0, 100.0, ratio,
        "Compressor outlet over inlet pressure."),
    NUM(F_T_HOT, "hot_temperature", GC_Q_TEMPERATURE, 1300.0, 300.0, 2500.0, T_hot,
        "Temperature at the end of heating."),
    NUM(F_EFF, "efficiency", GC_Q_FRACTION, 1.0, 0.0, 1.0, eff,
        "Isentropic efficiency of compression and expansion."),
};

static const gc_output outputs[] = {
    { .name = "work_ratio", .parent = -1, .type = GC_OT_NUMBER,
      .offset = offsetof(ex_result, work_ratio),
      .description = "Net work over expansion work." },
};

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const ex_input *in = input;
    ex_result *r = result;
    gc_gas air;
    gc_gas_init_air(&air);
    gc_cycle c;
    gc_cycle_init(&c, GC_FRAME_FLOW, &air, in->T_start, in->P_start);
    gc_step *s = gc_cycle_add(&c, GC_PROC_COMPRESSION, GC_END_PRESSURE_RATIO, in->ratio,
                              "/pressure_ratio");
    s->efficiency = in->eff;
    gc_cycle_add(&c, GC_PROC_CONST_PRESSURE, GC_END_TEMPERATURE, in->T_hot,
                 "/hot_temperature")->heat_sign = 1;
    s = gc_cycle_add(&c, GC_PROC_EXPANSION, GC_END_START_PRESSURE, 0.0, "/efficiency");
    s->efficiency = in->eff;
    gc_cycle_add(&c, GC_PROC_CLOSE, GC_END_DEFAULT, 0.0, NULL);
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_cycle_evaluate(&c, &r->cycle, &err);
    if (rc != GC_OK)
        return gc_report_add(rep, &err);
    const gc_cycle_summary *sm = &r->cycle.actual.summary;
    r->work_ratio = sm->work_out > 0.0 ? sm->net_work / sm->work_out : 0.0;
    return GC_OK;
}

static const gc_cycle_result *cycle_of(const void *result)
{
    return &((const ex_result *)result)->cycle;
}

const gc_preset gc_preset_example = {
    .name = "example", .label = "cycles_example", .title = "Example cycle",
    .description = "Compression over a pressure ratio, constant-pressure heating to a "
                   "temperature, expansion to the start pressure (a worked example).",
    .kind = GC_PRESET_CYCLE,
    .fields = fields, .n_fields = F_COUNT,
    .outputs = outputs, .n_outputs = sizeof outputs / sizeof outputs[0],
    .input_size = sizeof(ex_input), .result_size = sizeof(ex_result),
    .evaluate = evaluate, .cycle = cycle_of,
};
