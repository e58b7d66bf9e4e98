/*
 * machine_corrections.c — the machine_corrections preset
 * (/v1/machine/corrections): correction curves and factors of a fixed gas
 * turbine (machine.h, gc_machine_curves_compute). Base-load net output and
 * heat rate of the new-and-clean machine against one ambient figure
 * (`variable`: temperature, pressure or relative_humidity, over its own
 * from/to range in `row_count` rows), the other two held at the
 * machine's reference conditions (ISO 2314: 15 degC, 101.325 kPa, 60 %
 * relative humidity unless machine.reference gives others). Each row gives
 * the ratios to the reference point and the correction factors (their
 * inverses: a reading times the factor is the figure at the reference), as
 * JSON, as one CSV table (format=csv) and as SVG plots drawn with the chart
 * module (format=svg&diagram=performance|corrections).
 *
 * Units: SI in the structs; the rows' quantities name the request's units.
 */
#include "core/presets/machine_presets.h"
#include "core/presets/presets.h"
#include "gascycle/chart.h"
#include "gascycle/diagram.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define IN(member) offsetof(gc_machine_corrections_request, member)
#define RES(member) offsetof(gc_machine_corrections_answer, member)
#define LN(member) offsetof(gc_machine_curve_line, member)
#define SHIFT(end) ((ptrdiff_t)IN(end) - (ptrdiff_t)offsetof(gc_brayton_input, site))

static const char *const variables[] = { "temperature", "pressure", "relative_humidity", NULL };

/* ---- inputs ---------------------------------------------------------------------- */

static gc_field fields[GC_MCF_COUNT] = {
    [GC_MF_REQUEST] = { .name = "", .parent = -1, .type = GC_FT_OBJECT,
                        .description = "Correction curves of a fixed gas turbine." },
    [GC_MCF_VARIABLE] = { .name = "variable", .type = GC_FT_ENUM, .names = variables,
                          .offset = IN(variable),
                          .description = "The ambient figure the curve runs over: temperature, "
                          "pressure or relative_humidity (its range in the member of that "
                          "name); the other two stay at the reference conditions." },
    [GC_MCF_POINTS] = { .name = "row_count", .type = GC_FT_INTEGER, .flags = GC_FF_MIN | GC_FF_MAX,
                        .def = 21, .min = 2, .max = GC_MACHINE_CURVE_MAX_POINTS,
                        .offset = IN(points),
                        .description = "Rows of the curve, equally spaced from from to to (points is an output parameter)." },
    [GC_MCF_TEMPERATURE] = { .name = "temperature", .type = GC_FT_OBJECT,
                             .flags = GC_FF_ECHO_GIVEN, .given = IN(show[0]) + 1,
                             .description = "Range of the ambient temperature (variable "
                             "temperature; echoed then)." },
    [GC_MCF_PRESSURE] = { .name = "pressure", .type = GC_FT_OBJECT, .flags = GC_FF_ECHO_GIVEN,
                          .given = IN(show[1]) + 1,
                          .description = "Range of the ambient pressure (variable pressure; "
                          "echoed then)." },
    [GC_MCF_HUMIDITY] = { .name = "relative_humidity", .type = GC_FT_OBJECT,
                          .flags = GC_FF_ECHO_GIVEN, .given = IN(show[2]) + 1,
                          .description = "Range of the relative humidity (variable "
                          "relative_humidity; echoed then)." },
};

#define END(id, par, path, end, nm, d, desc)                                                   \
    { .dst = id, .parent = par, .from = path, .shift = SHIFT(end), .name = nm,                \
      .clear = GC_FF_NO_ECHO, .has_def = 1, .def = d, .description = desc }

static const gc__machine_copy range_rows[] = {
    END(GC_MCF_T_FROM, GC_MCF_TEMPERATURE, "/site/temperature", from, "from", 253.15,
        "First ambient temperature of the curve (default -20 degC)."),
    END(GC_MCF_T_TO, GC_MCF_TEMPERATURE, "/site/temperature", to, "to", 318.15,
        "Last ambient temperature of the curve (default 45 degC)."),
    END(GC_MCF_P_FROM, GC_MCF_PRESSURE, "/site/pressure", from, "from", 80000.0,
        "First ambient pressure of the curve (default 80 kPa, about 1950 m)."),
    END(GC_MCF_P_TO, GC_MCF_PRESSURE, "/site/pressure", to, "to", 105000.0,
        "Last ambient pressure of the curve (default 105 kPa)."),
    END(GC_MCF_RH_FROM, GC_MCF_HUMIDITY, "/site/relative_humidity", from, "from", 0.0,
        "First relative humidity of the curve (default 0)."),
    END(GC_MCF_RH_TO, GC_MCF_HUMIDITY, "/site/relative_humidity", to, "to", 1.0,
        "Last relative humidity of the curve (default 1)."),
};

/* ---- outputs --------------------------------------------------------------------- */

enum {
    O_REF = 0,
    O_ROWS = O_REF + 1 + GC__MACHINE_POINT_ROWS_N,
    O_ROW_FIRST = O_ROWS + 1,
    O_MACHINE = O_ROW_FIRST + 16,
    O_COUNT = O_MACHINE + GC__MACHINE_OUTPUT_ROWS_N
};

static gc_output outputs[O_COUNT];

static gc_output line_row(const char *name, int q, size_t off, const char *desc)
{
    return (gc_output){ .name = name, .parent = O_ROWS, .type = GC_OT_NUMBER,
                        .quantity = q < 0 ? GC_Q_RATIO : (gc_quantity)q, .has_quantity = q >= 0,
                        .offset = off, .description = desc };
}

static void build_rows(gc_output *o)
{
    int k = 0;
    o[k++] = line_row("temperature", GC_Q_AMBIENT_TEMPERATURE, LN(T_K), "Ambient temperature.");
    o[k++] = line_row("pressure", GC_Q_PRESSURE, LN(P_Pa), "Ambient pressure.");
    o[k++] = line_row("relative_humidity", -1, LN(RH), "Relative humidity.");
    o[k++] = line_row("net_power", GC_Q_POWER, LN(net_power_W), "Base-load net output.");
    o[k++] = line_row("heat_rate", GC_Q_HEAT_RATE, LN(heat_rate), "Heat rate (LHV).");
    o[k++] = line_row("thermal_efficiency", -1, LN(thermal_efficiency),
                      "Net output over the fuel's LHV input.");
    o[k++] = line_row("output_ratio", -1, LN(output_ratio), "Net output over the reference's.");
    o[k++] = line_row("heat_rate_ratio", -1, LN(heat_rate_ratio),
                      "Heat rate over the reference's.");
    o[k++] = line_row("output_correction", -1, LN(output_correction),
                      "Output correction factor (1 / output_ratio): an output read at this "
                      "condition times it is the output at the reference.");
    o[k++] = line_row("heat_rate_correction", -1, LN(heat_rate_correction),
                      "Heat-rate correction factor (1 / heat_rate_ratio).");
    o[k++] = line_row("air_mass_flow", GC_Q_MASS_FLOW, LN(air_mass_flow_kg_per_s),
                      "Compressor air flow.");
    o[k++] = line_row("exhaust_mass_flow", GC_Q_MASS_FLOW, LN(exhaust_mass_flow_kg_per_s),
                      "Exhaust flow.");
    o[k++] = line_row("exhaust_temperature", GC_Q_AMBIENT_TEMPERATURE, LN(exhaust_temperature_K),
                      "Exhaust temperature.");
    o[k++] = line_row("firing_temperature", GC_Q_AMBIENT_TEMPERATURE, LN(firing_temperature_K),
                      "Firing (first rotor inlet) temperature.");
    o[k++] = line_row("pressure_ratio", -1, LN(pressure_ratio), "Compressor pressure ratio.");
    o[k] = (gc_output){ .name = "active_limit", .parent = O_ROWS, .type = GC_OT_ENUM,
                        .names = gc__machine_limit_names, .offset = LN(active_limit),
                        .description = "The temperature limit that sets base load there." };
}

static void build_outputs(void)
{
    outputs[O_REF] = (gc_output){ .name = "reference", .parent = -1, .type = GC_OT_OBJECT,
                                  .description = "Base load at the reference conditions with "
                                  "the inlet treatment given: what the ratios divide by." };
    gc__machine_point_rows(outputs + O_REF + 1, O_REF, RES(curves.reference));
    outputs[O_ROWS] = (gc_output){ .name = "rows", .parent = -1, .type = GC_OT_LIST,
                                   .flags = GC_OF_CSV_TABLE, .offset = RES(lines),
                                   .count = RES(n_lines) + 1,
                                   .item_size = sizeof(gc_machine_curve_line),
                                   .max_items = GC_MACHINE_CURVE_MAX_POINTS,
                                   .description = "The curve, one row per ambient value "
                                   "(format=csv gives this table)." };
    build_rows(outputs + O_ROW_FIRST);
    gc__machine_output_rows(outputs, O_MACHINE);
}

__attribute__((constructor)) static void build_tables(void)
{
    gc__machine_fill_rows(fields);
    gc__machine_copy_rows(fields, range_rows, (int)(sizeof range_rows / sizeof range_rows[0]));
    build_outputs();
}

/* ---- evaluation ---------------------------------------------------------------------- */

static double pick(const gc_site_input *s, int variable)
{
    return variable == GC_MACHINE_VARY_TEMPERATURE ? s->T_K
           : variable == GC_MACHINE_VARY_PRESSURE  ? s->P_Pa
                                                   : s->RH;
}

static const int from_row[3] = { GC_MCF_T_FROM, GC_MCF_P_FROM, GC_MCF_RH_FROM };
static const int to_row[3] = { GC_MCF_T_TO, GC_MCF_P_TO, GC_MCF_RH_TO };

/* The curve's rows with all three ambient figures. */
static void fill_lines(gc_machine_corrections_answer *r)
{
    const gc_site *ref = &r->head.reference_site;
    r->n_lines = r->curves.n_rows;
    for (int i = 0; i < r->n_lines; i++) {
        const gc_machine_curve_row *c = &r->curves.rows[i];
        const gc_machine_point *p = &c->point;
        gc_machine_curve_line *l = &r->lines[i];
        l->T_K = r->variable == GC_MACHINE_VARY_TEMPERATURE ? c->x : ref->T_K;
        l->P_Pa = r->variable == GC_MACHINE_VARY_PRESSURE ? c->x : ref->P_Pa;
        l->RH = r->variable == GC_MACHINE_VARY_HUMIDITY ? c->x : ref->RH;
        l->net_power_W = p->net_power_W;
        l->heat_rate = p->heat_rate;
        l->thermal_efficiency = p->thermal_efficiency;
        l->output_ratio = c->output_ratio;
        l->heat_rate_ratio = c->heat_rate_ratio;
        l->output_correction = c->output_correction;
        l->heat_rate_correction = c->heat_rate_correction;
        l->air_mass_flow_kg_per_s = p->air_mass_flow_kg_per_s;
        l->exhaust_mass_flow_kg_per_s = p->exhaust_mass_flow_kg_per_s;
        l->exhaust_temperature_K = p->exhaust_temperature_K;
        l->firing_temperature_K = p->firing_temperature_K;
        l->pressure_ratio = p->pressure_ratio;
        l->active_limit = p->active_limit;
    }
}

static int evaluate(const void *input, void *result, gc_report *rep)
{
    const gc_machine_corrections_request *in = input;
    gc_machine_corrections_answer *r = result;
    const gc_preset *p = &gc_preset_machine_corrections;
    int v = in->variable;
    if (v < 0 || v > 2)
        return gc_report_error(rep, GC_ERR_INVALID, GC_MCF_VARIABLE, -1,
                               "must be temperature, pressure or relative_humidity");
    gc_machine_curve_input ci;
    gc_machine_curve_input_init(&ci);
    ci.variable = (gc_machine_curve_variable)v;
    ci.points = in->points;
    ci.from = pick(&in->from, v);
    ci.to = pick(&in->to, v);
    ci.inlet = in->head.inlet;
    if (ci.from == ci.to) {
        rep->input = 1;
        return gc_report_error(rep, GC_ERR_INVALID, to_row[v], -1,
                               "must differ from from: a curve needs a range");
    }
    int rc = gc__machine_define(p, &in->head, &r->head, rep);
    if (rc != GC_OK)
        return rc;
    r->variable = v;
    char f[GC_ERROR_FIELD_LEN], t[GC_ERROR_FIELD_LEN];
    gc_preset_field_path(p, from_row[v], NULL, f, sizeof f);
    gc_preset_field_path(p, to_row[v], NULL, t, sizeof t);
    const gc__machine_path_map map[] = { { "/curve/from", f }, { "/curve/to", t } };
    gc_error e;
    gc_error_clear(&e);
    rc = gc_machine_curves_compute(&r->head.machine, &ci, &r->curves, &e);
    if (rc != GC_OK) {
        rep->input = rc == GC_ERR_INVALID;
        return gc__machine_report_error(p, rep, &e, map, 2);
    }
    fill_lines(r);
    return GC_OK;
}

/* ---- diagrams ------------------------------------------------------------------------- */

static const char *const diagrams[] = { "performance", "corrections", NULL };

typedef struct plot {
    double x[GC_MACHINE_CURVE_MAX_POINTS], y1[GC_MACHINE_CURVE_MAX_POINTS],
        y2[GC_MACHINE_CURVE_MAX_POINTS];
    char ref_label[96], caption[200], title[120];
    const char *captions[1];
    gc_chart_series s[2];
    gc_chart_refline ref[2];
} plot;

/* The variable in display units (relative humidity in per cent). */
static double shown(int v, gc_unit_system sys, double x)
{
    if (v == GC_MACHINE_VARY_HUMIDITY)
        return 100.0 * x;
    return gc_units_from_si(v == GC_MACHINE_VARY_TEMPERATURE ? GC_Q_AMBIENT_TEMPERATURE
                                                             : GC_Q_PRESSURE, sys, x);
}

static const char *shown_unit(int v, gc_unit_system sys)
{
    if (v == GC_MACHINE_VARY_HUMIDITY)
        return "%";
    return gc_units_label(v == GC_MACHINE_VARY_TEMPERATURE ? GC_Q_AMBIENT_TEMPERATURE
                                                           : GC_Q_PRESSURE, sys);
}

static void series(gc_chart_series *s, const char *name, int n, const double *x,
                   const double *y, int y2, gc_chart_dash dash)
{
    memset(s, 0, sizeof *s);
    s->kind = GC_CHART_LINE;
    s->name = name;
    s->n = n;
    s->x = x;
    s->y = y;
    s->y2 = y2;
    s->dash = dash;
    s->show_marks = 1;
}

static void reference_caption(const gc_machine_corrections_answer *r, gc_unit_system sys,
                              plot *P)
{
    const gc_site *ref = &r->head.reference_site;
    char t[32], pr[32], w[32], hr[32];
    gc_chart_format_sig(gc_units_from_si(GC_Q_AMBIENT_TEMPERATURE, sys, ref->T_K), 5, 0, t,
                        sizeof t);
    gc_chart_format_sig(gc_units_from_si(GC_Q_PRESSURE, sys, ref->P_Pa), 6, 0, pr, sizeof pr);
    gc_chart_format_sig(gc_units_from_si(GC_Q_POWER, sys, r->curves.reference.net_power_W), 5,
                        GC_CHART_FMT_GROUP, w, sizeof w);
    gc_chart_format_sig(gc_units_from_si(GC_Q_HEAT_RATE, sys, r->curves.reference.heat_rate), 5,
                        GC_CHART_FMT_GROUP, hr, sizeof hr);
    snprintf(P->caption, sizeof P->caption, "Reference %s %s, %s %s, RH %.0f %%: %s %s, %s %s "
             "(base load, new and clean)", t, gc_units_label(GC_Q_AMBIENT_TEMPERATURE, sys), pr,
             gc_units_label(GC_Q_PRESSURE, sys), 100.0 * ref->RH, w,
             gc_units_label(GC_Q_POWER, sys), hr, gc_units_label(GC_Q_HEAT_RATE, sys));
    P->captions[0] = P->caption;
}

static void chart_frame(const gc_machine_corrections_answer *r, const gc_diagram_options *opt,
                        plot *P, gc_chart *c)
{
    static const char *const words[] = { "Ambient temperature", "Ambient pressure",
                                         "Relative humidity" };
    int v = r->variable;
    gc_unit_system sys = opt->units;
    gc_chart_init(c);
    c->x.title = words[v];
    c->x.unit = shown_unit(v, sys);
    c->width_px = opt->width_px;
    c->height_px = opt->height_px;
    for (int i = 0; i < r->n_lines; i++)
        P->x[i] = shown(v, sys, pick(&(gc_site_input){ .T_K = r->lines[i].T_K,
                                                      .P_Pa = r->lines[i].P_Pa,
                                                      .RH = r->lines[i].RH }, v));
    double xr = shown(v, sys, v == GC_MACHINE_VARY_TEMPERATURE ? r->head.reference_site.T_K
                              : v == GC_MACHINE_VARY_PRESSURE ? r->head.reference_site.P_Pa
                                                              : r->head.reference_site.RH);
    memset(P->ref, 0, sizeof P->ref);
    P->ref[0].vertical = 1;
    P->ref[0].value = xr;
    P->ref[0].dash = GC_CHART_DASHED;
    P->ref[0].label = "reference";
    c->refs = P->ref;
    c->n_refs = 1;
    reference_caption(r, sys, P);
    c->captions = P->captions;
    c->n_captions = 1;
}

static int draw(const gc_machine_corrections_answer *r, int which,
                const gc_diagram_options *opt, char **svg, size_t *len, gc_error *err)
{
    static const char *const words[] = { "ambient temperature", "ambient pressure",
                                         "relative humidity" };
    plot *P = calloc(1, sizeof *P);
    if (P == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory");
    gc_chart c;
    gc_unit_system sys = opt->units;
    chart_frame(r, opt, P, &c);
    int n = r->n_lines;
    for (int i = 0; i < n; i++) {
        const gc_machine_curve_line *l = &r->lines[i];
        P->y1[i] = which ? l->output_correction : gc_units_from_si(GC_Q_POWER, sys, l->net_power_W);
        P->y2[i] = which ? l->heat_rate_correction
                         : gc_units_from_si(GC_Q_HEAT_RATE, sys, l->heat_rate);
    }
    snprintf(P->title, sizeof P->title, "%s against %s", which ? "Correction factors"
             : "Base-load net output and heat rate", words[r->variable]);
    c.title = P->title;
    series(&P->s[0], which ? "output correction" : "net output", n, P->x, P->y1, 0,
           GC_CHART_SOLID);
    series(&P->s[1], which ? "heat-rate correction" : "heat rate", n, P->x, P->y2, !which,
           GC_CHART_DASHED);
    c.series = P->s;
    c.n_series = 2;
    c.y.title = which ? "Correction factor" : "Net output";
    c.y.unit = which ? NULL : gc_units_label(GC_Q_POWER, sys);
    if (!which) {
        c.has_y2 = 1;
        c.y2.title = "Heat rate (LHV)";
        c.y2.unit = gc_units_label(GC_Q_HEAT_RATE, sys);
    } else {
        P->ref[1] = (gc_chart_refline){ .value = 1.0, .dash = GC_CHART_DOTTED, .label = "1" };
        c.n_refs = 2;
    }
    int rc = gc_chart_svg(&c, svg, len, err);
    free(P);
    return rc;
}

static int svg(const void *input, const void *result, const char *diagram,
               const struct gc_diagram_options *opt, char **out, size_t *len, gc_error *err)
{
    (void)input;
    int which = 0;
    if (diagram && strcmp(diagram, "corrections") == 0)
        which = 1;
    else if (diagram && strcmp(diagram, "performance") != 0)
        return gc_error_set(err, GC_ERR_INVALID, "/diagram",
                            "must be one of 'performance', 'corrections'");
    return draw(result, which, opt, out, len, err);
}

/* ---- hooks ------------------------------------------------------------------------- */

static void init(void *input)
{
    gc_machine_corrections_request *in = input;
    gc__machine_head_init(&in->head);
    gc_site_input_init(&in->from);
    gc_site_input_init(&in->to);
}

static void echo(const void *input, const void *result, void *echo_input)
{
    const gc_machine_corrections_request *in = input;
    gc_machine_corrections_request *e = echo_input;
    gc__machine_echo(&((const gc_machine_corrections_answer *)result)->head, &e->head);
    for (int i = 0; i < 3; i++)
        e->show[i] = in->variable == i;
}

const gc_preset gc_preset_machine_corrections = {
    .name = "machine_corrections",
    .segment = "corrections",
    .route_base = "/v1/machine/",
    .label = "machine_corrections",
    .title = "Gas turbine correction curves",
    .description = "Correction curves and factors of a fixed single-shaft gas turbine: "
                   "base-load net output and heat rate of the new-and-clean machine against "
                   "ambient temperature, pressure or relative humidity, the other two at the "
                   "machine's reference conditions (ISO 2314 by default), with the ratios to "
                   "the reference point and the correction factors that take a reading to the "
                   "reference; a table (JSON, CSV) and SVG plots (diagram=performance or "
                   "corrections).",
    .kind = GC_PRESET_REDUCTION,
    .heavy = 1,   /* one request is up to 102 operating points */
    .fields = fields,
    .n_fields = GC_MCF_COUNT,
    .outputs = outputs,
    .n_outputs = O_COUNT,
    .input_size = sizeof(gc_machine_corrections_request),
    .result_size = sizeof(gc_machine_corrections_answer),
    .init = init,
    .evaluate = evaluate,
    .echo = echo,
    .diagrams = diagrams,
    .svg = svg,
};
