/*
 * cycle_out.c — the shared request path and response encoder of the cycle
 * routes (cycle_out.h): diagram parameters, core-error problems, the
 * gc_cycle_result encoder (model, states, processes, summary, bounds,
 * checks, paths), SVG through gascycle/diagram.h, and the shared "gas",
 * "fuel" and "site" inputs.
 *
 * Specific fuel consumption: 1 kWh = 3.6e6 J (exact); 1 lbm = 0.45359237 kg
 * (exact) and 1 hp = 745.69987158 W (NIST SP 811, B.8: horsepower, 550
 * ft lbf/s), so 1 lbm/(hp h) = 0.45359237 / (745.69987158 * 3600) kg/J.
 */
#include "api/cycle_out.h"

#include "gascycle/exergy.h"
#include "gascycle/path.h"
#include "gascycle/species.h"

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define SFC_G_PER_KWH 3.6e9                                 /* (g/kWh) per (kg/J) */
#define SFC_LBM_PER_HPH (1.0 / (0.45359237 / (745.69987158 * 3600.0))) /* per kg/J */

/* ---- shared input fields --------------------------------------------- */

static const gc_field_spec cold_fields[] = {
    { .name = "cp", .type = GC_FIELD_NUMBER, .quantity = GC_Q_SPECIFIC_ENTROPY,
      .offset = offsetof(gc_cycle_common, gas_cp), .def = 1005.0,
      .flags = GC_F_MIN | GC_F_MAX, .min = 100.0, .max = 20000.0,
      .description = "constant specific heat at constant pressure" },
    { .name = "k", .type = GC_FIELD_NUMBER, .quantity = GC_Q_RATIO,
      .offset = offsetof(gc_cycle_common, gas_k), .def = 1.4,
      .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0, .max = 1.7,
      .description = "constant ratio of specific heats cp/cv" },
    GC_F_END
};

const gc_variant_spec gc_cycle_gas_variants[] = {
    { "air", NULL, "dry air, NASA 9-coefficient polynomials (variable properties)" },
    { "cold", cold_fields, "constant cp and k (cold-air standard)" },
    { NULL, NULL, NULL }
};

const gc_field_spec gc_cycle_site_fields[] = {
    { .name = "altitude", .type = GC_FIELD_NUMBER, .quantity = GC_Q_LENGTH,
      .offset = offsetof(gc_cycle_common, site_altitude),
      .present = offsetof(gc_cycle_common, has_site_altitude) + 1,
      .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = -5000.0, .max = 86000.0,
      .description = "geometric altitude above mean sea level" },
    { .name = "temperature", .type = GC_FIELD_NUMBER, .quantity = GC_Q_AMBIENT_TEMPERATURE,
      .offset = offsetof(gc_cycle_common, site_temperature),
      .present = offsetof(gc_cycle_common, has_site_temperature) + 1,
      .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 173.15, .max = 473.15,
      .description = "ambient dry-bulb temperature" },
    { .name = "pressure", .type = GC_FIELD_NUMBER, .quantity = GC_Q_PRESSURE,
      .offset = offsetof(gc_cycle_common, site_pressure),
      .present = offsetof(gc_cycle_common, has_site_pressure) + 1,
      .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 2.0e5,
      .description = "ambient absolute pressure" },
    { .name = "relative_humidity", .type = GC_FIELD_NUMBER, .quantity = GC_Q_FRACTION,
      .offset = offsetof(gc_cycle_common, site_rh),
      .present = offsetof(gc_cycle_common, has_site_rh) + 1,
      .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_ECHO, .min = 0.0, .max = 1.0,
      .description = "relative humidity" },
    GC_F_END
};

/* "C12H23", "CH3OH", "C7.1H13.6": atoms of C, H, O, N. 0 or -1. */
static int parse_formula(const char *s, double atoms[4])
{
    atoms[0] = atoms[1] = atoms[2] = atoms[3] = 0.0;
    if (!*s)
        return -1;
    while (*s) {
        int idx;
        switch (*s) {
        case 'C': idx = 0; break;
        case 'H': idx = 1; break;
        case 'O': idx = 2; break;
        case 'N': idx = 3; break;
        default: return -1;
        }
        s++;
        double n = 1.0;
        if (isdigit((unsigned char)*s) || *s == '.') {
            char *end = NULL;
            n = strtod(s, &end);
            if (end == s || !isfinite(n) || n <= 0.0 || n > 1000.0)
                return -1;
            s = end;
        }
        atoms[idx] += n;
    }
    return 0;
}

/* Decodes fuel.analysis: species -> mole fraction. */
static int fuel_analysis(gc_decoder *d, json_t *value, const char *pointer, gc_fuel *fuel,
                         json_t *echo)
{
    if (!json_is_object(value) || json_object_size(value) == 0) {
        gc_decode_error(d, pointer, "must be an object of species names and mole fractions, "
                        "e.g. {\"CH4\": 0.93, \"C2H6\": 0.04, \"N2\": 0.03}");
        return -1;
    }
    int ids[GC_GAS_MAX_SPECIES];
    double x[GC_GAS_MAX_SPECIES];
    int n = 0;
    if (gc_decode_mole_fractions(d, value, pointer, ids, x, &n, echo, 0) != 0)
        return -1;
    double sum = 0.0;
    for (int i = 0; i < n; i++)
        sum += x[i];
    if (fabs(sum - 1.0) > 1e-6) {
        gc_decode_error(d, pointer, "the mole fractions sum to %.8g, not 1", sum);
        return -1;
    }
    gc_error err;
    gc_error_clear(&err);
    if (gc_fuel_init_mixture(fuel, n, ids, x, &err) != GC_OK) {
        gc_decode_error(d, pointer, "%s", err.message);
        return -1;
    }
    return 0;
}

int gc_cycle_decode_fuel(gc_decoder *d, const gc_field_spec *f, json_t *value,
                         const char *pointer, void *target, json_t *echo_parent)
{
    gc_cycle_common *c = target;
    (void)f;
    c->has_fuel = 0;
    if (!value)
        return 0;
    gc_error err;
    gc_error_clear(&err);
    if (json_is_string(value)) {
        if (gc_fuel_init_named(&c->fuel, json_string_value(value), &err) != GC_OK) {
            gc_decode_error(d, pointer, "%s; or give {\"analysis\": {species: mole fraction}} "
                            "or {\"formula\": \"CxHyOzNw\", \"lower_heating_value\": ...}",
                            err.message);
            return -1;
        }
        c->has_fuel = 1;
        if (echo_parent)
            json_object_set_new(echo_parent, "fuel", json_string(json_string_value(value)));
        return 0;
    }
    if (!json_is_object(value)) {
        gc_decode_error(d, pointer, "must be a fuel name (\"methane\") or an object with an "
                        "\"analysis\" or a \"formula\" and \"lower_heating_value\"");
        return -1;
    }
    json_t *analysis = json_object_get(value, "analysis");
    json_t *formula = json_object_get(value, "formula");
    json_t *lhv = json_object_get(value, "lower_heating_value");
    json_t *cp = json_object_get(value, "liquid_cp");
    const char *k;
    json_t *v;
    int bad = 0;
    static const char *const names[] = { "analysis", "formula", "lower_heating_value",
                                         "liquid_cp" };
    json_object_foreach(value, k, v) {
        int known = 0;
        for (size_t i = 0; i < 4; i++)
            if (strcmp(k, names[i]) == 0)
                known = 1;
        if (!known) {
            char ptr[GC_API_FIELD_LEN];
            snprintf(ptr, sizeof ptr, "%s", pointer);
            gc_out_pointer_append(ptr, sizeof ptr, k);
            const char *s = gc_decode_suggest(k, names, 4);
            if (s)
                gc_decode_error(d, ptr, "unknown field '%.60s'; did you mean '%s'?", k, s);
            else
                gc_decode_error(d, ptr, "unknown field '%.60s'; the fields here are: analysis, "
                                "formula, lower_heating_value, liquid_cp", k);
            bad = 1;
        }
    }
    if (bad)
        return -1;
    char ptr[GC_API_FIELD_LEN];
    json_t *echo = echo_parent ? json_object() : NULL;
    if (analysis && !formula && !lhv && !cp) {
        snprintf(ptr, sizeof ptr, "%s/analysis", pointer);
        json_t *ea = echo ? json_object() : NULL;
        if (fuel_analysis(d, analysis, ptr, &c->fuel, ea) != 0) {
            json_decref(ea);
            json_decref(echo);
            return -1;
        }
        if (echo)
            json_object_set_new(echo, "analysis", ea);
    } else if (formula && !analysis) {
        snprintf(ptr, sizeof ptr, "%s/formula", pointer);
        double atoms[4];
        if (!json_is_string(formula) ||
            parse_formula(json_string_value(formula), atoms) != 0) {
            gc_decode_error(d, ptr, "must be a formula of C, H, O and N atoms such as "
                            "\"C12H23\" or \"CH3OH\"");
            bad = 1;
        }
        double LHV = 0.0, cpl = 0.0;
        snprintf(ptr, sizeof ptr, "%s/lower_heating_value", pointer);
        if (!lhv) {
            gc_decode_error(d, ptr, "is required with a formula (the liquid's enthalpy of "
                            "formation comes from it)");
            bad = 1;
        } else if (gc_decode_number(d, lhv, ptr, GC_Q_SPECIFIC_ENERGY, &LHV) != 0) {
            bad = 1;
        }
        if (cp) {
            snprintf(ptr, sizeof ptr, "%s/liquid_cp", pointer);
            if (gc_decode_number(d, cp, ptr, GC_Q_SPECIFIC_ENTROPY, &cpl) != 0)
                bad = 1;
        }
        if (bad) {
            json_decref(echo);
            return -1;
        }
        if (gc_fuel_init_liquid(&c->fuel, atoms[0], atoms[1], atoms[2], atoms[3], LHV, cpl,
                                &err) != GC_OK) {
            gc_decode_error(d, pointer, "%s", err.message);
            json_decref(echo);
            return -1;
        }
        if (echo) {
            json_object_set_new(echo, "formula", json_string(json_string_value(formula)));
            gc_out_q(d->out, echo, "lower_heating_value", LHV, GC_Q_SPECIFIC_ENERGY);
            gc_out_q(d->out, echo, "liquid_cp", c->fuel.cp_liquid_J_per_kgK,
                     GC_Q_SPECIFIC_ENTROPY);
        }
    } else {
        gc_decode_error(d, pointer, "give either \"analysis\" (a gas by mole fractions) or "
                        "\"formula\" with \"lower_heating_value\" (a liquid)");
        json_decref(echo);
        return -1;
    }
    c->has_fuel = 1;
    if (echo)
        json_object_set_new(echo_parent, "fuel", echo);
    return 0;
}

int gc_cycle_common_gas(const gc_cycle_common *c, gc_gas *g, gc_error *err)
{
    if (c->gas == GC_CYCLE_GAS_COLD) {
        int rc = gc_gas_init_cold(g, c->gas_cp, c->gas_k, err);
        if (rc != GC_OK && err)
            snprintf(err->field, sizeof err->field, "/gas");
        return rc;
    }
    gc_gas_init_air(g);
    return GC_OK;
}

void gc_cycle_common_site(const gc_cycle_common *c, gc_site_input *in)
{
    gc_site_input_init(in);
    in->has_altitude = c->has_site_altitude;
    in->altitude_m = c->site_altitude;
    in->has_temperature = c->has_site_temperature;
    in->T_K = c->site_temperature;
    in->has_pressure = c->has_site_pressure;
    in->P_Pa = c->site_pressure;
    in->has_relative_humidity = c->has_site_rh;
    in->RH = c->site_rh;
}

static const char *source_name(gc_site_source s)
{
    switch (s) {
    case GC_SITE_FROM_INPUT: return "input";
    case GC_SITE_FROM_ATMOSPHERE: return "standard_atmosphere";
    default: return "iso_reference";
    }
}

void gc_cycle_echo_site(gc_out *o, const gc_site *site)
{
    json_t *s = json_object();
    gc_out_q(o, s, "altitude", site->altitude_m, GC_Q_LENGTH);
    gc_out_q(o, s, "temperature", site->T_K, GC_Q_AMBIENT_TEMPERATURE);
    gc_out_q(o, s, "pressure", site->P_Pa, GC_Q_PRESSURE);
    gc_out_num(o, s, "relative_humidity", site->RH);
    gc_out_num(o, s, "humidity_ratio", site->W_kg_per_kg);
    json_t *src = json_object();
    json_object_set_new(src, "temperature", json_string(source_name(site->T_from)));
    json_object_set_new(src, "pressure", json_string(source_name(site->P_from)));
    json_object_set_new(src, "relative_humidity", json_string(source_name(site->RH_from)));
    json_object_set_new(s, "sources", src);
    json_object_set_new(o->inputs, "site", s);
}

void gc_cycle_echo_site_air(gc_out *o)
{
    json_t *g = json_object();
    json_object_set_new(g, "model", json_string("site_air"));
    json_object_set_new(o->inputs, "gas", g);
}

void gc_cycle_echo_heat(gc_out *o, const gc_cycle_common *c, const gc_site *site)
{
    if (!c->has_fuel)
        json_object_del(o->inputs, "fuel_temperature");
    json_object_set_new(o->inputs, "heat_addition",
                        json_string(c->has_fuel ? "fuel" : "air_standard"));
    gc_cycle_echo_site(o, site);
}

/* ---- request path ---------------------------------------------------- */

static const char *query_get(const gc_api_request *req, const char *key)
{
    for (size_t i = 0; i < req->n_query; i++)
        if (req->query[i].key && strcmp(req->query[i].key, key) == 0)
            return req->query[i].value ? req->query[i].value : "";
    return NULL;
}

static int parse_int(const char *s, int *out)
{
    char *end = NULL;
    if (!s || !*s || isspace((unsigned char)*s))
        return -1;
    long v = strtol(s, &end, 10);
    if (*end || v < -1000000 || v > 1000000)
        return -1;
    *out = (int)v;
    return 0;
}

/* Diagram keys only cycle routes take; removed from the query before decoding. */
static const char *const diagram_keys[] = { "scale", "overlay", "width", "height", NULL };

static int is_diagram_key(const char *k)
{
    for (int i = 0; diagram_keys[i]; i++)
        if (k && strcmp(k, diagram_keys[i]) == 0)
            return 1;
    return 0;
}

static int parse_view(gc_cycle_call *call, const gc_api_request *req, gc_api_errors *errs)
{
    const char *fmt = query_get(req, "format");
    int svg = fmt && strcmp(fmt, "svg") == 0;
    int json = !fmt || strcmp(fmt, "json") == 0;
    gc_diagram_options_default(&call->diagram);
    call->points = GC_PATH_DEFAULT_POINTS;
    int seen[4] = { 0 };
    for (size_t i = 0; i < req->n_query; i++) {
        const char *k = req->query[i].key;
        const char *v = req->query[i].value ? req->query[i].value : "";
        if (!is_diagram_key(k))
            continue;
        char field[24];
        snprintf(field, sizeof field, "/%s", k);
        int which = 0;
        while (strcmp(diagram_keys[which], k) != 0)
            which++;
        if (seen[which]++) {
            gc_api_errors_add(errs, field, "given more than once");
            continue;
        }
        if (!svg) {
            gc_api_errors_add(errs, field, "applies only with format=svg");
            continue;
        }
        int n = 0;
        switch (which) {
        case 0: /* scale */
            if (strcmp(v, "log") == 0)
                call->diagram.log_x = call->diagram.log_y = 1;
            else if (strcmp(v, "linear") != 0)
                gc_api_errors_add(errs, field, "must be 'linear' or 'log' (log applies to the "
                                  "P-v diagram, both axes)");
            break;
        case 1: { /* overlay */
            unsigned ov = 0;
            if (strcmp(v, "none") != 0) {
                const char *p = v;
                while (1) {
                    size_t len = strcspn(p, ",");
                    if (len == 5 && strncmp(p, "ideal", 5) == 0)
                        ov |= GC_DIAGRAM_OVERLAY_IDEAL;
                    else if (len == 6 && strncmp(p, "carnot", 6) == 0)
                        ov |= GC_DIAGRAM_OVERLAY_CARNOT;
                    else {
                        gc_api_errors_add(errs, field, "must be 'none' or a comma list of "
                                          "'ideal' and 'carnot'");
                        break;
                    }
                    if (!p[len])
                        break;
                    p += len + 1;
                }
            }
            call->diagram.overlays = ov;
            break;
        }
        case 2: /* width */
        case 3: /* height */
            if (parse_int(v, &n) != 0 || n < GC_DIAGRAM_MIN_SIZE || n > GC_DIAGRAM_MAX_SIZE)
                gc_api_errors_add(errs, field, "must be a whole number of px from %d to %d",
                                  GC_DIAGRAM_MIN_SIZE, GC_DIAGRAM_MAX_SIZE);
            else if (which == 2)
                call->diagram.width_px = n;
            else
                call->diagram.height_px = n;
            break;
        default:
            break;
        }
    }
    const char *inc = query_get(req, "include");
    if (inc) {
        if (strcmp(inc, "paths") != 0)
            gc_api_errors_add(errs, "/include", "must be 'paths'");
        else if (!json)
            gc_api_errors_add(errs, "/include", "applies only with format=json");
        else
            call->include_paths = 1;
    }
    const char *pts = query_get(req, "points");
    if (pts) {
        int n = 0;
        if (parse_int(pts, &n) != 0 || n < GC_PATH_MIN_POINTS || n > GC_PATH_MAX_POINTS)
            gc_api_errors_add(errs, "/points", "must be a whole number from %d to %d",
                              GC_PATH_MIN_POINTS, GC_PATH_MAX_POINTS);
        else if (!svg && !call->include_paths)
            gc_api_errors_add(errs, "/points", "applies only with format=svg or include=paths");
        else
            call->points = n;
    }
    const char *dia = query_get(req, "diagram");
    if (svg && dia && gc_diagram_kind_parse(dia, &call->diagram.kind) != GC_OK)
        gc_api_errors_add(errs, "/diagram", "must be one of 'Ts', 'Pv', 'hs'");
    if (svg && (call->diagram.log_x || call->diagram.log_y) &&
        call->diagram.kind != GC_DIAGRAM_PV)
        gc_api_errors_add(errs, "/scale", "scale=log applies only to diagram=Pv");
    call->diagram.points = call->points;
    return errs->n + errs->dropped;
}

void gc_cycle_call_free(gc_cycle_call *call)
{
    free(call->query);
    call->query = NULL;
    gc_out_free(&call->out);
}

int gc_cycle_call_begin(gc_cycle_call *call, const gc_api_request *req, const char *preset,
                        const gc_field_spec *fields, void *target, gc_api_response *resp)
{
    memset(call, 0, sizeof *call);
    call->preset = preset;
    resp->preset = NULL;
    if (gc_out_init(&call->out) != 0) {
        gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        return -1;
    }
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    if (parse_view(call, req, &errs) > 0) {
        gc_api_problem_errors(resp, 400, "bad_output", "Invalid output parameters", NULL, &errs);
        gc_cycle_call_free(call);
        return -1;
    }
    call->req = *req;
    call->query = malloc((req->n_query ? req->n_query : 1) * sizeof *call->query);
    if (!call->query) {
        gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        gc_cycle_call_free(call);
        return -1;
    }
    size_t n = 0;
    for (size_t i = 0; i < req->n_query; i++)
        if (!is_diagram_key(req->query[i].key))
            call->query[n++] = req->query[i];
    call->req.query = call->query;
    call->req.n_query = n;
    if (gc_decode_request(&call->req, fields, GC_OUT_ACCEPT_EVAL | GC_OUT_ACCEPT_INCLUDE |
                          GC_OUT_ACCEPT_POINTS, target, &call->out, resp) != 0) {
        gc_cycle_call_free(call);
        return -1;
    }
    return 0;
}

void gc_cycle_drop_unset(gc_cycle_call *call, const gc_field_spec *fields, const void *target,
                         double unset)
{
    for (const gc_field_spec *f = fields; f->name; f++) {
        if (f->type != GC_FIELD_NUMBER || f->def != unset)
            continue;
        double v = *(const double *)(const void *)((const char *)target + f->offset);
        if (v == unset) {
            json_object_del(call->out.inputs, f->name);
            json_object_del(call->out.units, f->name);
        }
    }
}

int gc_cycle_call_fail_errors(gc_cycle_call *call, const gc_api_errors *errs,
                              gc_api_response *resp)
{
    gc_api_problem_errors(resp, 422, "validation", "Invalid input", NULL, errs);
    gc_cycle_call_free(call);
    return 0;
}

int gc_cycle_call_fail(gc_cycle_call *call, const gc_error *err, const char *fallback_field,
                       gc_api_response *resp)
{
    const char *cls = "validation", *title = "Inputs cannot be evaluated";
    const char *detail = NULL;
    int status = 422;
    switch (err->code) {
    case GC_ERR_CHECK:
        cls = "check_failed";
        title = "Built-in check failed";
        detail = "A built-in consistency check of the result (energy closure, state closure, "
                 "exergy balance or the P-v/T-s area balance) failed beyond its tolerance, so "
                 "no result is returned for these inputs.";
        break;
    case GC_ERR_INFEASIBLE:
    case GC_ERR_RICH:
        cls = "infeasible";
        title = "Cycle cannot be run";
        break;
    case GC_ERR_RANGE:
        cls = "out_of_range";
        title = "Outside the validity range";
        break;
    case GC_ERR_NOCONV:
        cls = "no_convergence";
        title = "Iteration did not converge";
        break;
    case GC_ERR_NOMEM:
        status = 503;
        cls = "overloaded";
        title = NULL;
        break;
    default:
        break;
    }
    if (status == 503) {
        gc_api_problem(resp, 503, cls, NULL, "The server ran out of memory.", NULL);
    } else {
        gc_api_errors errs;
        gc_api_errors_init(&errs);
        const char *field = err->field[0] ? err->field : (fallback_field ? fallback_field : "");
        gc_api_errors_add(&errs, field, "%s", err->message[0] ? err->message
                                                              : gc_strerror(err->code));
        gc_api_problem_errors(resp, status, cls, title, detail, &errs);
    }
    gc_cycle_call_free(call);
    return 0;
}

static int set_body(gc_api_response *resp, const char *ct, char *body, size_t len)
{
    resp->status = 200;
    resp->content_type = ct;
    resp->body = body;
    resp->body_len = len;
    return 0;
}

int gc_cycle_call_finish(gc_cycle_call *call, json_t *doc, const gc_cycle_result *result,
                         gc_api_response *resp)
{
    if (call->out.format == GC_FMT_SVG) {
        json_decref(doc);
        if (call->out.nonfinite) {
            gc_api_errors errs;
            gc_api_errors_init(&errs);
            gc_api_errors_add(&errs, "", "the computation gave a value that is not a finite "
                              "number (at '%s'); no result is returned for these inputs",
                              call->out.nonfinite_at);
            gc_api_problem_errors(resp, 422, "not_finite", "Result not finite", NULL, &errs);
            gc_cycle_call_free(call);
            return 0;
        }
        call->diagram.units = call->out.sys;
        char *svg = NULL;
        size_t len = 0;
        gc_error err;
        gc_error_clear(&err);
        int rc = gc_diagram_svg(result, &call->diagram, &svg, &len, &err);
        if (rc == GC_ERR_NOMEM) {
            gc_api_problem(resp, 503, "overloaded", NULL, "The server ran out of memory.", NULL);
        } else if (rc != GC_OK || !svg) {
            free(svg);
            gc_api_errors errs;
            gc_api_errors_init(&errs);
            gc_api_errors_add(&errs, err.field[0] ? err.field : "/diagram", "%s", err.message);
            /* an option error is the request's; a drawing refused for the values is 422 */
            int opt = strcmp(err.field, "/diagram") == 0 || strcmp(err.field, "/points") == 0 ||
                      strcmp(err.field, "/width") == 0 || strcmp(err.field, "/height") == 0;
            gc_api_problem_errors(resp, opt ? 400 : 422, opt ? "bad_output" : "not_drawable",
                                  opt ? "Invalid output parameters" : "Diagram cannot be drawn",
                                  NULL, &errs);
        } else {
            set_body(resp, GC_API_CT_SVG, svg, len);
            resp->preset = call->preset;
        }
        gc_cycle_call_free(call);
        return 0;
    }
    free(call->query);
    call->query = NULL;
    gc_out_respond(&call->out, doc, GC_OUT_EVALUATION, resp);
    if (resp->status == 200)
        resp->preset = call->preset;
    return 0;
}

/* ---- encoder -------------------------------------------------------- */

void gc_cycle_out_opts_init(gc_cycle_out_opts *opts)
{
    memset(opts, 0, sizeof *opts);
    opts->heat_in = NAN;
    opts->thermal_efficiency = NAN;
    opts->ideal_thermal_efficiency = NAN;
}

static int closes(const gc_cycle_run *run)
{
    if (run->n_states < 2)
        return 0;
    const gc_cycle_state *a = &run->states[0], *b = &run->states[run->n_states - 1];
    double tol = 1e-6;
    return fabs(a->T_K - b->T_K) <= tol * a->T_K && fabs(a->P_Pa - b->P_Pa) <= tol * a->P_Pa &&
           fabs(a->V_m_per_s - b->V_m_per_s) <= tol * (1.0 + fabs(a->V_m_per_s));
}

int gc_cycle_out_state_number(const gc_cycle_run *run, int i)
{
    if (i == run->n_states - 1 && closes(run))
        return 1;
    return i + 1;
}

void gc_cycle_out_sfc(gc_out *o, json_t *obj, const char *key, double kg_per_J)
{
    double v = o->sys == GC_UNITS_US ? kg_per_J * SFC_LBM_PER_HPH : kg_per_J * SFC_G_PER_KWH;
    if (!json_object_get(o->units, key))
        json_object_set_new(o->units, key,
                            json_string(o->sys == GC_UNITS_US ? "lbm/(hp h)" : "g/kWh"));
    gc_out_num(o, obj, key, v);
}

void gc_cycle_out_warn_ideal(gc_out *o, const gc_cycle_result *r)
{
    if (r->ideal_is_actual)
        gc_out_warn(o, "ideal_equals_actual", NULL,
                    "with the default (ideal) efficiencies, no losses and ideal regeneration "
                    "the actual cycle equals its ideal counterpart; give component "
                    "efficiencies, losses or an effectiveness below 1 for an actual cycle");
}

static json_t *encode_model(gc_cycle_call *call, const gc_cycle_run *run, const char *basis)
{
    gc_out *o = &call->out;
    json_t *m = json_object();
    const gc_gas *g = &run->gases[0];
    json_object_set_new(m, "frame", json_string(run->frame == GC_FRAME_CLOSED ? "closed" : "flow"));
    json_object_set_new(m, "basis", json_string(basis ? basis
                                                : run->frame == GC_FRAME_CLOSED
                                                      ? "per kg of trapped gas"
                                                      : "per kg of intake gas"));
    json_object_set_new(m, "gas", json_string(g->label));
    if (g->kind == GC_GAS_COLD) {
        json_object_set_new(m, "property_data", json_string("constant cp and k (cold-air "
                                                            "standard)"));
        gc_out_q(o, m, "cp", g->cp_cold_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        gc_out_num(o, m, "k", g->k_cold);
        json_object_set_new(m, "reference_state",
                            json_string("h = cp (T - 298.15 K) and u = cv (T - 298.15 K) "
                                        "(sensible, from 298.15 K); s = cp ln(T / 298.15 K) - "
                                        "R ln(P / 1 bar)"));
    } else {
        json_object_set_new(m, "property_data",
                            json_string("ideal-gas mixture, NASA 9-coefficient polynomials "
                                        "(McBride, Zehe & Gordon 2002)"));
        json_object_set_new(m, "reference_state",
                            json_string("h and u sensible: relative to the same gas at 298.15 K "
                                        "(the species' formation enthalpies taken off), so heat "
                                        "release raises h; h_absolute (cycles with a fuel) "
                                        "includes them; s absolute (NASA-9), referred to 1 bar"));
    }
    json_object_set_new(m, "enthalpy_basis",
                        json_string("sensible, from 298.15 K, in states, CSV, paths and the h-s "
                                    "diagram"));
    json_object_set_new(m, "exergy_model",
                        json_string(run->summary.exergy_model == GC_EXERGY_FUEL
                                        ? "fuel: exergy supplied is the fuel's (chemical and "
                                          "physical as supplied at the pressure of the stream it "
                                          "enters) in the reference environment of Szargut, "
                                          "Morris & Steward (1988) at the dead state's T and P; "
                                          "combustor destruction is T_dead S_gen of the reaction "
                                          "with mixing; the exhaust carries its physical and "
                                          "chemical exergy away (water as vapour)"
                                        : "heat reservoir: heat enters from a reservoir at "
                                          "T_boundary (the step's source temperature, default the "
                                          "cycle's peak) and leaves at the dead state; exergy "
                                          "supplied = heat_in (1 - T_dead / T_boundary)"));
    gc_out_q(o, m, "R", g->R_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
    json_t *gases = json_array();
    for (int i = 0; i < run->n_gases; i++)
        json_array_append_new(gases, json_string(run->gases[i].label));
    json_object_set_new(m, "gases", gases);
    json_t *dead = json_object();
    gc_out_q(o, dead, "T", run->summary.T_dead_K, GC_Q_TEMPERATURE);
    gc_out_q(o, dead, "P", run->summary.P_dead_Pa, GC_Q_PRESSURE);
    json_object_set_new(m, "dead_state", dead);
    json_object_set_new(m, "sign_convention",
                        json_string("work > 0 is delivered by the gas; heat > 0 enters the gas"));
    return m;
}

static json_t *encode_states(gc_cycle_call *call, const gc_cycle_run *run,
                             const gc_cycle_out_opts *opts)
{
    gc_out *o = &call->out;
    json_t *a = json_array();
    int n = run->n_states - (closes(run) ? 1 : 0);
    int flow = run->frame == GC_FRAME_FLOW;
    for (int i = 0; i < n; i++) {
        const gc_cycle_state *s = &run->states[i];
        json_t *j = json_object();
        json_object_set_new(j, "state", json_integer(i + 1));
        if (opts && opts->state_names && i < opts->n_state_names && opts->state_names[i])
            json_object_set_new(j, "station", json_string(opts->state_names[i]));
        gc_out_q(o, j, "T", s->T_K, GC_Q_TEMPERATURE);
        gc_out_q(o, j, "P", s->P_Pa, GC_Q_PRESSURE);
        gc_out_q(o, j, "v", s->v_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
        gc_out_q(o, j, "u", s->us_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "h", s->hs_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "s", s->s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        if (run->n_gases > 1)
            gc_out_q(o, j, "h_absolute", s->h_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        if (flow) {
            gc_out_q(o, j, "V", s->V_m_per_s, GC_Q_VELOCITY);
            gc_out_q(o, j, "T_total", s->T_total_K, GC_Q_TEMPERATURE);
            gc_out_q(o, j, "P_total", s->P_total_Pa, GC_Q_PRESSURE);
            gc_out_num(o, j, "mass_ratio", s->mass_ratio);
        }
        if (run->n_gases > 1 && s->gas >= 0 && s->gas < run->n_gases)
            json_object_set_new(j, "gas", json_string(run->gases[s->gas].label));
        json_array_append_new(a, j);
    }
    return a;
}

static void process_name(const gc_cycle *chain, const gc_cycle_process *p, char *buf,
                         size_t n)
{
    const char *label = NULL;
    if (chain && p->step >= 0 && p->step < chain->n_steps && chain->steps[p->step].label[0])
        label = chain->steps[p->step].label;
    if (!label)
        label = gc_cycle_kind_name(p->kind);
    if (p->kind == GC_PROC_DUAL)
        snprintf(buf, n, "%s (%s)", label, p->part ? "constant pressure" : "constant volume");
    else
        snprintf(buf, n, "%s", label);
}

static const char *process_kind(const gc_cycle_process *p)
{
    if (p->kind == GC_PROC_DUAL)
        return p->part ? "constant_pressure" : "constant_volume";
    return gc_cycle_kind_name(p->kind);
}

static json_t *encode_processes(gc_cycle_call *call, const gc_cycle_run *run,
                                const gc_cycle *chain)
{
    gc_out *o = &call->out;
    json_t *a = json_array();
    int flow = run->frame == GC_FRAME_FLOW;
    for (int i = 0; i < run->n_processes; i++) {
        const gc_cycle_process *p = &run->processes[i];
        json_t *j = json_object();
        char name[GC_CYCLE_LABEL_LEN + 32];
        process_name(chain, p, name, sizeof name);
        json_object_set_new(j, "process", json_integer(i + 1));
        json_object_set_new(j, "name", json_string(name));
        json_object_set_new(j, "kind", json_string(process_kind(p)));
        json_object_set_new(j, "from", json_integer(gc_cycle_out_state_number(run, p->from)));
        json_object_set_new(j, "to", json_integer(gc_cycle_out_state_number(run, p->to)));
        gc_out_q(o, j, "work", p->work, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "heat", p->heat, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "delta_s", p->delta_s, GC_Q_SPECIFIC_ENTROPY);
        gc_out_q(o, j, "s_gen", p->s_gen, GC_Q_SPECIFIC_ENTROPY);
        gc_out_q(o, j, "exergy_destroyed", p->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
        if (p->kind == GC_PROC_FUEL)
            gc_out_q(o, j, "fuel_exergy", p->exergy_fuel, GC_Q_SPECIFIC_ENERGY);
        if (run->summary.exergy_model == GC_EXERGY_FUEL && p->kind == GC_PROC_CLOSE)
            gc_out_q(o, j, "exhaust_exergy_lost", p->exergy_lost, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "dissipated_work", p->dissipated, GC_Q_SPECIFIC_ENERGY);
        if (p->T_boundary_K > 0.0)
            gc_out_q(o, j, "T_boundary", p->T_boundary_K, GC_Q_TEMPERATURE);
        if (p->kind == GC_PROC_COMPRESSION || p->kind == GC_PROC_EXPANSION) {
            gc_out_num(o, j, "efficiency", p->efficiency);
            gc_out_num(o, j, "polytropic_efficiency", p->polytropic_efficiency);
        } else if (p->kind == GC_PROC_HEAT_EXCHANGE) {
            gc_out_num(o, j, "efficiency", p->efficiency);
        }
        if (p->internal)
            json_object_set_new(j, "internal", json_true());
        if (flow) {
            gc_out_num(o, j, "mass_ratio", p->mass_ratio);
            gc_out_q(o, j, "delta_ke", p->delta_ke, GC_Q_SPECIFIC_ENERGY);
        }
        json_object_set_new(j, "curve", json_string(gc_cycle_curve_name(p->curve)));
        json_array_append_new(a, j);
    }
    return a;
}

static json_t *encode_summary(gc_cycle_call *call, const gc_cycle_run *run,
                              const gc_cycle_out_opts *opts)
{
    gc_out *o = &call->out;
    const gc_cycle_summary *s = &run->summary;
    json_t *j = json_object();
    double q_in = opts && isfinite(opts->heat_in) ? opts->heat_in : s->heat_in;
    double eta = opts && isfinite(opts->thermal_efficiency) ? opts->thermal_efficiency
                                                            : s->thermal_efficiency;
    gc_out_q(o, j, "net_work", s->net_work, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "heat_in", q_in, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "heat_out", s->heat_out, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "work_in", s->work_in, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "work_out", s->work_out, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, j, "thermal_efficiency", eta);
    gc_out_num(o, j, "back_work_ratio", s->back_work_ratio);
    if (run->frame == GC_FRAME_CLOSED)
        gc_out_q(o, j, "mean_effective_pressure", s->mean_effective_pressure, GC_Q_PRESSURE);
    gc_out_q(o, j, "T_max", s->T_max_K, GC_Q_TEMPERATURE);
    gc_out_q(o, j, "T_min", s->T_min_K, GC_Q_TEMPERATURE);
    gc_out_q(o, j, "P_max", s->P_max_Pa, GC_Q_PRESSURE);
    gc_out_q(o, j, "P_min", s->P_min_Pa, GC_Q_PRESSURE);
    if (run->frame == GC_FRAME_CLOSED) {
        gc_out_q(o, j, "v_max", s->v_max_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
        gc_out_q(o, j, "v_min", s->v_min_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
    }
    gc_out_num(o, j, "second_law_efficiency", s->second_law_efficiency);
    gc_out_q(o, j, "exergy_in", s->exergy_in, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "exergy_heat_in", s->exergy_heat_in, GC_Q_SPECIFIC_ENERGY);
    if (s->exergy_model == GC_EXERGY_FUEL) {
        gc_out_q(o, j, "fuel_exergy", s->exergy_fuel, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "intake_exergy", s->exergy_intake, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "exhaust_exergy", s->exergy_exhaust, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "exhaust_exergy_chemical", s->exergy_exhaust_chemical,
                 GC_Q_SPECIFIC_ENERGY);
    }
    gc_out_q(o, j, "exergy_heat_out", s->exergy_heat_out, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "exergy_destroyed", s->exergy_destroyed, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, j, "dissipated_work", s->dissipated, GC_Q_SPECIFIC_ENERGY);
    if (s->fuel_air_ratio > 0.0)
        gc_out_num(o, j, "fuel_air_ratio", s->fuel_air_ratio);
    return j;
}

static json_t *encode_bounds(gc_cycle_call *call, const gc_cycle_result *r,
                             const gc_cycle_out_opts *opts, double eta)
{
    gc_out *o = &call->out;
    json_t *b = json_object();
    if (r->has_ideal) {
        const gc_cycle_summary *s = &r->ideal.summary;
        json_t *i = json_object();
        double ei = opts && isfinite(opts->ideal_thermal_efficiency)
                        ? opts->ideal_thermal_efficiency
                        : s->thermal_efficiency;
        gc_out_num(o, i, "thermal_efficiency", ei);
        gc_out_q(o, i, "net_work", s->net_work, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, i, "heat_in", s->heat_in, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, i, "heat_out", s->heat_out, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, i, "back_work_ratio", s->back_work_ratio);
        if (r->ideal.frame == GC_FRAME_CLOSED)
            gc_out_q(o, i, "mean_effective_pressure", s->mean_effective_pressure,
                     GC_Q_PRESSURE);
        gc_out_q(o, i, "T_max", s->T_max_K, GC_Q_TEMPERATURE);
        json_object_set_new(i, "equals_actual", json_boolean(r->ideal_is_actual));
        if (ei > 0.0)
            gc_out_num(o, i, "actual_fraction", eta / ei);
        json_object_set_new(b, "ideal", i);
    }
    if (r->has_ideal_components) {
        const gc_cycle_summary *s = &r->ideal_components;
        json_t *i = json_object();
        gc_out_num(o, i, "thermal_efficiency", s->thermal_efficiency);
        gc_out_q(o, i, "net_work", s->net_work, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, i, "heat_in", s->heat_in, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, i, "heat_out", s->heat_out, GC_Q_SPECIFIC_ENERGY);
        if (s->thermal_efficiency > 0.0)
            gc_out_num(o, i, "actual_fraction", eta / s->thermal_efficiency);
        json_object_set_new(b, "ideal_components", i);
    }
    json_t *c = json_object();
    gc_out_num(o, c, "efficiency", r->carnot_efficiency);
    gc_out_q(o, c, "T_max", r->actual.summary.T_max_K, GC_Q_TEMPERATURE);
    gc_out_q(o, c, "T_min", r->actual.summary.T_min_K, GC_Q_TEMPERATURE);
    if (r->carnot_efficiency > 0.0)
        gc_out_num(o, c, "actual_fraction", eta / r->carnot_efficiency);
    json_object_set_new(b, "carnot", c);
    return b;
}

static json_t *encode_checks(gc_cycle_call *call, const gc_cycle_run *run)
{
    gc_out *o = &call->out;
    const gc_cycle_checks *k = &run->checks;
    json_t *j = json_object();
    json_object_set_new(j, "passed", json_true());
    gc_out_num(o, j, "energy_closure", k->energy_rel);
    gc_out_q(o, j, "energy_residual", k->energy_residual, GC_Q_SPECIFIC_ENERGY);
    gc_out_num(o, j, "state_closure", k->state_rel);
    gc_out_num(o, j, "exergy_balance", k->exergy_rel);
    gc_out_num(o, j, "close_mismatch", k->close_rel);
    json_object_set_new(j, "areas_checked", json_boolean(k->areas_done));
    if (k->areas_done) {
        gc_out_q(o, j, "area_pv", k->area_pv, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "area_ts", k->area_ts, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "area_pv_expected", k->area_expected_pv, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(o, j, "area_ts_expected", k->area_expected_ts, GC_Q_SPECIFIC_ENERGY);
        gc_out_num(o, j, "area_pv_error", k->area_pv_rel);
        gc_out_num(o, j, "area_ts_error", k->area_ts_rel);
    }
    gc_out_q(o, j, "dissipated_work", run->summary.dissipated, GC_Q_SPECIFIC_ENERGY);
    json_t *t = json_object();
    gc_out_num(o, t, "energy", k->tol_energy);
    gc_out_num(o, t, "state", k->tol_state);
    gc_out_num(o, t, "area", k->tol_area);
    gc_out_num(o, t, "close", k->tol_close);
    json_object_set_new(j, "tolerances", t);
    return j;
}

/* Appends v (SI) converted for q to arr; non-finite values mark the output. */
static void push_q(gc_out *o, json_t *arr, double si, gc_quantity q)
{
    double v = gc_units_from_si(q, o->sys, si);
    if (!isfinite(v)) {
        json_t *scratch = json_object();
        gc_out_num(o, scratch, "paths", v);
        json_decref(scratch);
        json_array_append_new(arr, json_null());
        return;
    }
    json_array_append_new(arr, json_real(v));
}

static json_t *encode_paths_run(gc_cycle_call *call, const gc_cycle_run *run,
                                const gc_cycle *chain, gc_path_point *pts)
{
    gc_out *o = &call->out;
    json_t *a = json_array();
    for (int i = 0; i < run->n_processes; i++) {
        gc_error err;
        if (gc_cycle_path(run, i, call->points, pts, &err) != GC_OK) {
            json_t *scratch = json_object();
            gc_out_num(o, scratch, "paths", NAN);
            json_decref(scratch);
            continue;
        }
        const gc_cycle_process *p = &run->processes[i];
        json_t *j = json_object();
        char name[GC_CYCLE_LABEL_LEN + 32];
        process_name(chain, p, name, sizeof name);
        json_object_set_new(j, "process", json_integer(i + 1));
        json_object_set_new(j, "name", json_string(name));
        json_t *T = json_array(), *s = json_array(), *P = json_array(), *v = json_array(),
               *h = json_array();
        for (int k = 0; k < call->points; k++) {
            push_q(o, T, pts[k].T_K, GC_Q_TEMPERATURE);
            push_q(o, s, pts[k].s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
            push_q(o, P, pts[k].P_Pa, GC_Q_PRESSURE);
            push_q(o, v, pts[k].v_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
            push_q(o, h, pts[k].h_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        }
        json_object_set_new(j, "T", T);
        json_object_set_new(j, "s", s);
        json_object_set_new(j, "P", P);
        json_object_set_new(j, "v", v);
        json_object_set_new(j, "h", h);
        json_array_append_new(a, j);
    }
    return a;
}

static json_t *encode_paths(gc_cycle_call *call, const gc_cycle_result *r,
                            const gc_cycle *chain)
{
    gc_out *o = &call->out;
    gc_path_point *pts = malloc((size_t)call->points * sizeof *pts);
    if (!pts)
        return NULL;
    json_t *j = json_object();
    json_object_set_new(j, "points_per_process", json_integer(call->points));
    json_object_set_new(j, "actual", encode_paths_run(call, &r->actual, chain, pts));
    if (r->has_ideal && !r->ideal_is_actual)
        json_object_set_new(j, "ideal", encode_paths_run(call, &r->ideal, chain, pts));
    if (call->points >= 3 && call->points % 2 == 1) {
        double pv = 0.0, ts = 0.0;
        gc_error err;
        if (gc_cycle_path_areas(&r->actual, call->points, &pv, &ts, &err) == GC_OK) {
            json_t *ar = json_object();
            gc_out_q(o, ar, "area_pv", pv, GC_Q_SPECIFIC_ENERGY);
            gc_out_q(o, ar, "area_ts", ts, GC_Q_SPECIFIC_ENERGY);
            json_object_set_new(j, "areas", ar);
        }
    }
    free(pts);
    return j;
}

/* A close step that met the start state only within GC_CYCLE_TOL_CLOSE: say
 * so, with both values (a value is never changed silently). */
static void warn_close(gc_out *o, const gc_cycle_run *run)
{
    if (!(run->checks.close_rel > GC_CYCLE_TOL_STATE))
        return;
    for (int k = 0; k < run->n_processes; k++) {
        const gc_cycle_process *p = &run->processes[k];
        if (p->kind != GC_PROC_CLOSE)
            continue;
        const gc_cycle_state *a = &run->states[p->from], *s0 = &run->states[0];
        int cv = p->curve == GC_CURVE_ISOCHORE;
        double got = cv ? a->v_m3_per_kg : a->P_Pa, want = cv ? s0->v_m3_per_kg : s0->P_Pa;
        gc_quantity q = cv ? GC_Q_SPECIFIC_VOLUME : GC_Q_PRESSURE;
        gc_out_warn(o, "close_mismatch", NULL,
                    "the state before the close (process %d) is at %s = %.9g %s, the start "
                    "state at %.9g %s (relative difference %.2g, within the tolerance %g for "
                    "typed values): the close takes the gas back to the start state", k + 1,
                    cv ? "v" : "P", gc_units_from_si(q, o->sys, got), gc_units_label(q, o->sys),
                    gc_units_from_si(q, o->sys, want), gc_units_label(q, o->sys),
                    run->checks.close_rel, GC_CYCLE_TOL_CLOSE);
        return;
    }
}

json_t *gc_cycle_out_encode(gc_cycle_call *call, json_t *doc, const gc_cycle_result *r,
                            const gc_cycle_out_opts *opts)
{
    const gc_cycle *chain = opts ? opts->chain : NULL;
    const gc_cycle_run *run = &r->actual;
    double eta = opts && isfinite(opts->thermal_efficiency) ? opts->thermal_efficiency
                                                            : run->summary.thermal_efficiency;
    json_object_set_new(doc, "model", encode_model(call, run, opts ? opts->basis : NULL));
    json_object_set_new(doc, "states", encode_states(call, run, opts));
    json_object_set_new(doc, "processes", encode_processes(call, run, chain));
    json_t *summary = encode_summary(call, run, opts);
    json_object_set_new(doc, "summary", summary);
    warn_close(&call->out, run);
    json_object_set_new(doc, "bounds", encode_bounds(call, r, opts, eta));
    json_object_set_new(doc, "checks", encode_checks(call, run));
    if (call->include_paths) {
        json_t *p = encode_paths(call, r, chain);
        if (!p)
            return NULL;
        json_object_set_new(doc, "paths", p);
    }
    return summary;
}

json_t *gc_cycle_out_fuel(gc_out *o, const gc_fuel *fuel)
{
    json_t *fu = json_object();
    json_object_set_new(fu, "label", json_string(fuel->label));
    gc_out_q(o, fu, "lower_heating_value", fuel->LHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(o, fu, "higher_heating_value", fuel->HHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    return fu;
}

void gc_cycle_out_fuel_exergy(gc_out *o, json_t *fuel_obj, const gc_fuel *fuel)
{
    gc_out_q(o, fuel_obj, "chemical_exergy", gc_exergy_fuel_standard(fuel), GC_Q_SPECIFIC_ENERGY);
}

void gc_cycle_out_warn_cold(gc_out *o)
{
    gc_out_warn(o, "cold_model", "/gas",
                "the cold model holds cp and k constant at every temperature");
}
