/*
 * uncert_formats.c — format=csv and format=svg of /v1/uncertainty and
 * /v1/sensitivities (uncert_route.h), both read from the JSON document the
 * route built, so every format shows the same numbers.
 *
 * CSV (RFC 4180, CRLF, a header row, numbers at 10 significant digits as in
 * the JSON): the uncertainty budget, one row per output and input of its
 * budget (an output whose budget is empty: one row without an input),
 * columns output, output_unit, value, standard_uncertainty,
 * coverage_factor, expanded_uncertainty, input, input_unit,
 * input_standard_uncertainty, sensitivity, sensitivity_unit, contribution,
 * share; or the sensitivity table, one row per output and input: output,
 * output_unit, output_value, input, input_unit, input_value, sensitivity,
 * sensitivity_unit, elasticity.
 *
 * SVG (chart.h, a horizontal bar chart of the first output): diagram=budget
 * (the default of /v1/uncertainty) shows each input's share of the
 * variance in %, largest first, with u_c, k and U in the caption;
 * diagram=elasticities (the default of /v1/sensitivities) shows each
 * input's elasticity.
 */
#include "api/composites/uncert_route.h"
#include "api/handlers.h"
#include "gascycle/chart.h"
#include "gascycle/strbuf.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- CSV ------------------------------------------------------------------------------------ */

static void field(gc_strbuf *b, const char *s)
{
    if (!strpbrk(s, ",\"\r\n")) {
        gc_strbuf_puts(b, s);
        return;
    }
    gc_strbuf_ch(b, '"');
    for (const char *p = s; *p; p++) {
        if (*p == '"')
            gc_strbuf_ch(b, '"');
        gc_strbuf_ch(b, *p);
    }
    gc_strbuf_ch(b, '"');
}

/* One cell from a JSON value (numbers at 10 digits, null empty). */
static void cell(gc_strbuf *b, json_t *v, int first)
{
    if (!first)
        gc_strbuf_ch(b, ',');
    if (json_is_string(v))
        field(b, json_string_value(v));
    else if (json_is_integer(v))
        gc_strbuf_printf(b, "%" JSON_INTEGER_FORMAT, json_integer_value(v));
    else if (json_is_real(v))
        gc_strbuf_printf(b, "%.10g", json_real_value(v));
}

static void header(gc_strbuf *b, const char *const *cols)
{
    for (int c = 0; cols[c]; c++) {
        if (c)
            gc_strbuf_ch(b, ',');
        gc_strbuf_puts(b, cols[c]);
    }
    gc_strbuf_put(b, "\r\n", 2);
}

static void budget_rows(gc_strbuf *b, json_t *out)
{
    static const char *const head[] = { "output", "unit", "value", "standard_uncertainty",
                                        "coverage_factor", "expanded_uncertainty", NULL };
    static const char *const term[] = { "input", "unit", "standard_uncertainty", "sensitivity",
                                        "sensitivity_unit", "contribution", "share", NULL };
    json_t *terms = json_object_get(out, "budget");
    size_t n = json_array_size(terms);
    for (size_t t = 0; t < (n ? n : 1); t++) {
        for (int c = 0; head[c]; c++)
            cell(b, json_object_get(out, head[c]), c == 0);
        json_t *row = json_array_get(terms, t);
        for (int c = 0; term[c]; c++)
            cell(b, row ? json_object_get(row, term[c]) : NULL, 0);
        gc_strbuf_put(b, "\r\n", 2);
    }
}

static void sensitivity_rows(gc_strbuf *b, json_t *doc)
{
    json_t *outs = json_object_get(doc, "outputs"), *wrt = json_object_get(doc, "with_respect_to");
    json_t *d = json_object_get(doc, "sensitivities"), *du = json_object_get(doc,
                                                                            "sensitivity_units");
    json_t *el = json_object_get(doc, "elasticities");
    for (size_t k = 0; k < json_array_size(outs); k++)
        for (size_t i = 0; i < json_array_size(wrt); i++) {
            json_t *o = json_array_get(outs, k), *w = json_array_get(wrt, i);
            cell(b, json_object_get(o, "output"), 1);
            cell(b, json_object_get(o, "unit"), 0);
            cell(b, json_object_get(o, "value"), 0);
            cell(b, json_object_get(w, "input"), 0);
            cell(b, json_object_get(w, "unit"), 0);
            cell(b, json_object_get(w, "value"), 0);
            cell(b, json_array_get(json_array_get(d, k), i), 0);
            cell(b, json_array_get(json_array_get(du, k), i), 0);
            cell(b, json_array_get(json_array_get(el, k), i), 0);
            gc_strbuf_put(b, "\r\n", 2);
        }
}

int gc_api_uncert_csv(const gc_api_ureq *q, json_t *doc, gc_api_response *resp)
{
    static const char *const ucols[] = { "output", "output_unit", "value",
                                         "standard_uncertainty", "coverage_factor",
                                         "expanded_uncertainty", "input", "input_unit",
                                         "input_standard_uncertainty", "sensitivity",
                                         "sensitivity_unit", "contribution", "share", NULL };
    static const char *const scols[] = { "output", "output_unit", "output_value", "input",
                                         "input_unit", "input_value", "sensitivity",
                                         "sensitivity_unit", "elasticity", NULL };
    gc_strbuf b = { .first_cap = 4096 };
    header(&b, q->sensitivities ? scols : ucols);
    if (q->sensitivities) {
        sensitivity_rows(&b, doc);
    } else {
        json_t *outs = json_object_get(doc, "outputs");
        for (size_t k = 0; k < json_array_size(outs); k++)
            budget_rows(&b, json_array_get(outs, k));
    }
    if (b.failed || !b.s) {
        free(b.s);
        return gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.",
                              NULL);
    }
    resp->status = 200;
    resp->content_type = GC_API_CT_CSV;
    resp->body = b.s;
    resp->body_len = b.len;
    return 0;
}

/* ---- SVG ------------------------------------------------------------------------------------ */

#define BARS GC_CHART_MAX_BARS

typedef struct bars {
    int n;
    double v[BARS];
    char name[BARS][GC_API_FIELD_LEN];
    char text[BARS][32];
    const char *names[BARS], *texts[BARS];
    char title[200], caption[240];
    const char *captions[1];
} bars;

static void bar(bars *c, const char *pointer, double v, int percent)
{
    if (c->n >= BARS || !isfinite(v) || !pointer)
        return;
    gc_api_pointer_name(pointer, c->name[c->n], sizeof c->name[c->n]);
    snprintf(c->text[c->n], sizeof c->text[c->n], percent ? "%.3g %%" : "%.3g", v);
    c->v[c->n] = v;
    c->names[c->n] = c->name[c->n];
    c->texts[c->n] = c->text[c->n];
    c->n++;
}

static void budget_bars(bars *c, json_t *out)
{
    json_t *terms = json_object_get(out, "budget");
    const char *name = json_string_value(json_object_get(out, "name"));
    const char *unit = json_string_value(json_object_get(out, "unit"));
    for (size_t t = 0; t < json_array_size(terms); t++) {
        json_t *e = json_array_get(terms, t);
        bar(c, json_string_value(json_object_get(e, "input")),
            100.0 * json_number_value(json_object_get(e, "share")), 1);
    }
    snprintf(c->title, sizeof c->title, "Uncertainty budget of %s", name ? name : "");
    int has_unit = unit && strcmp(unit, "-") != 0;
    snprintf(c->caption, sizeof c->caption, "%s %.6g%s%s, u_c %.3g, k %.3g, U %.3g%s%s; bars: "
             "each input's share of the variance (JCGM 100:2008)", name ? name : "",
             json_number_value(json_object_get(out, "value")), has_unit ? " " : "",
             has_unit ? unit : "", json_number_value(json_object_get(out, "standard_uncertainty")),
             json_number_value(json_object_get(out, "coverage_factor")),
             json_number_value(json_object_get(out, "expanded_uncertainty")),
             has_unit ? " " : "", has_unit ? unit : "");
}

static void elasticity_bars(bars *c, json_t *doc)
{
    json_t *wrt = json_object_get(doc, "with_respect_to");
    json_t *row = json_array_get(json_object_get(doc, "elasticities"), 0);
    json_t *out = json_array_get(json_object_get(doc, "outputs"), 0);
    const char *name = json_string_value(json_object_get(out, "name"));
    for (size_t i = 0; i < json_array_size(wrt); i++) {
        json_t *e = json_array_get(row, i);
        if (json_is_number(e))
            bar(c, json_string_value(json_object_get(json_array_get(wrt, i), "input")),
                json_number_value(e), 0);
    }
    snprintf(c->title, sizeof c->title, "Elasticities of %s", name ? name : "");
    snprintf(c->caption, sizeof c->caption, "(x / y) dy/dx in SI base units: the %% change of "
             "%s per %% change of each input", name ? name : "the output");
}

static int svg_problem(gc_api_response *resp, const char *msg)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_errors_add(&errs, "/format", "%s", msg);
    return gc_api_problem_errors(resp, 422, "not_drawable", "Chart not drawable", NULL, &errs);
}

int gc_api_uncert_svg(const gc_api_ureq *q, const gc_out *o, json_t *doc, gc_api_response *resp)
{
    (void)o;
    bars *c = calloc(1, sizeof *c);
    if (!c)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    if (q->sensitivities)
        elasticity_bars(c, doc);
    else
        budget_bars(c, json_array_get(json_object_get(doc, "outputs"), 0));
    if (c->n == 0) {
        free(c);
        return svg_problem(resp, "the first output has no bar to draw (no input moves it)");
    }
    gc_chart ch;
    gc_chart_init(&ch);
    gc_chart_series s = { .kind = GC_CHART_HBARS, .n = c->n, .x = c->v, .text = c->names,
                          .value_text = c->texts };
    ch.title = c->title;
    ch.x.title = q->sensitivities ? "Elasticity" : "Share of the variance";
    ch.x.unit = q->sensitivities ? "-" : "%";
    ch.x.include_zero = 1;
    ch.series = &s;
    ch.n_series = 1;
    c->captions[0] = c->caption;
    ch.captions = c->captions;
    ch.n_captions = 1;
    char *svg = NULL;
    size_t len = 0;
    gc_error err;
    int st = gc_chart_svg(&ch, &svg, &len, &err);
    free(c);
    if (st != GC_OK)
        return st == GC_ERR_NOMEM ? gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.",
                                                   NULL) : svg_problem(resp, err.message);
    resp->status = 200;
    resp->content_type = GC_API_CT_SVG;
    resp->body = svg;
    resp->body_len = len;
    return 0;
}
