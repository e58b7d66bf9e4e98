/*
 * uncert_request.c — the requests of /v1/uncertainty and /v1/sensitivities
 * (uncert_route.h): the preset, the options, the input specifications, the
 * correlations and the outputs, read and checked once; what needs the
 * decoded inputs (an input's place and value, the outputs of the document)
 * after the base evaluation.
 *
 * An uncertainty is a standard uncertainty unless it says otherwise:
 *   5                 a number in the input's default unit (K, kPa, ...)
 *   "0.5 K"           a number with a unit of the input's quantity (a
 *                     temperature's uncertainty is a temperature
 *                     difference: "0.9 degF" is 0.5 K)
 *   "0.25 %"          relative: a fraction of the input's value in SI base
 *                     units (kelvin for a temperature); for every input,
 *                     fractions included (an absolute 0.5 point of an
 *                     efficiency is 0.005)
 *   {"standard": a} | {"expanded": a, "coverage_factor": k} (u = U / k,
 *   GUM 6.2.1) | {"half_width": a} (rectangular, u = a / sqrt 3, GUM
 *   4.3.7) | {"systematic": a, "random": a} (standard uncertainties of the
 *   two parts, ASME PTC 19.1; either may be left out), each amount in the
 *   forms above, with "distribution": "normal" | "rectangular" (Monte
 *   Carlo) and "degrees_of_freedom" (Welch-Satterthwaite, GUM G.4).
 * Inputs are named by JSON pointer ("/site/temperature"), dotted name
 * ("site.temperature") or nesting ({"site": {"temperature": "0.5 K"}}), so
 * a GET query (uncertainties.site.temperature=0.5%20K) reads the same.
 */
#include "api/composites/uncert_route.h"
#include "api/handlers.h"
#include "api/request/decode.h"

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const char *const u_keys[] = { "cycle", "inputs", "uncertainties", "correlations",
                                      "outputs", "method", "derivatives", "relative_step",
                                      "coverage_factor", "coverage_probability", "samples",
                                      "seed", NULL };
static const char *const s_keys[] = { "cycle", "inputs", "with_respect_to", "outputs",
                                      "derivatives", "relative_step", NULL };
static const char *const spec_keys[] = { "standard", "expanded", "coverage_factor",
                                         "half_width", "systematic", "random", "distribution",
                                         "degrees_of_freedom", NULL };
static const char *const methods[] = { "linear", "monte_carlo", NULL };
static const char *const diffs[] = { "central", "richardson", NULL };
static const char *const dists[] = { "normal", "rectangular", NULL };

/* ---- plain values (a number, or its text in a GET) ------------------------------------- */

static int get_number(json_t *v, double *x)
{
    if (json_is_number(v)) {
        *x = json_number_value(v);
        return isfinite(*x) ? 0 : -1;
    }
    if (!json_is_string(v))
        return -1;
    const char *s = json_string_value(v);
    char *end = NULL;
    errno = 0;
    *x = strtod(s, &end);
    return end != s && *end == '\0' && errno == 0 && isfinite(*x) ? 0 : -1;
}

static int get_int(json_t *v, long long lo, long long hi, long long *out)
{
    double x;
    if (json_is_integer(v))
        *out = (long long)json_integer_value(v);
    else if (get_number(v, &x) == 0 && x == floor(x) && fabs(x) < 9.2e18)
        *out = (long long)x;
    else
        return -1;
    return *out >= lo && *out <= hi ? 0 : -1;
}

/* One of names (NULL-terminated), or -1 with an error naming them. */
static int get_name(json_t *v, const char *const *names, const char *field, int def,
                    gc_api_errors *errs)
{
    if (!v)
        return def;
    const char *s = json_string_value(v);
    size_t n = 0;
    while (names[n])
        n++;
    for (size_t i = 0; s && i < n; i++)
        if (strcmp(s, names[i]) == 0)
            return (int)i;
    const char *sug = s ? gc_decode_suggest(s, names, n) : NULL;
    char list[160] = "";
    for (size_t i = 0; i < n; i++)
        snprintf(list + strlen(list), sizeof list - strlen(list), "%s'%s'", i ? ", " : "",
                 names[i]);
    if (sug)
        gc_api_errors_add(errs, field, "unknown value '%.40s'; did you mean '%s'?", s, sug);
    else
        gc_api_errors_add(errs, field, "must be one of %s", list);
    return -1;
}

/* A list given as an array, a comma-separated string (GET) or an object
 * keyed "0", "1", ... (GET with indices): a new array, or NULL. */
static json_t *as_list(json_t *v)
{
    if (json_is_array(v))
        return json_incref(v);
    json_t *a = json_array();
    if (json_is_string(v)) {
        char buf[4096];
        snprintf(buf, sizeof buf, "%s", json_string_value(v));
        for (char *save = NULL, *t = strtok_r(buf, ",", &save); t; t = strtok_r(NULL, ",", &save))
            json_array_append_new(a, json_string(t));
        return a;
    }
    for (size_t i = 0; json_is_object(v) && i < json_object_size(v); i++) {
        char key[24];
        snprintf(key, sizeof key, "%zu", i);
        json_t *e = json_object_get(v, key);
        if (!e)
            break;
        json_array_append(a, e);
    }
    if (json_is_object(v) && json_array_size(a) == json_object_size(v) && json_array_size(a))
        return a;
    json_decref(a);
    return NULL;
}

/* ---- the preset and the options ------------------------------------------------------------ */

static void decode_preset(gc_api_ureq *q, gc_api_errors *errs)
{
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    const char *names[64];
    char list[600] = "";
    int k = 0;
    for (int i = 0; i < n && k < 64; i++) {
        names[k++] = all[i]->name;
        snprintf(list + strlen(list), sizeof list - strlen(list), "%s%s", i ? ", " : "",
                 all[i]->name);
    }
    json_t *c = json_object_get(q->root, "cycle");
    const char *s = json_string_value(c);
    q->p = s ? gc_preset_find(s) : NULL;
    if (q->p)
        return;
    const char *sug = s ? gc_decode_suggest(s, names, (size_t)k) : NULL;
    if (!c)
        gc_api_errors_add(errs, "/cycle", "is required: the preset whose figures are wanted "
                          "(%s)", list);
    else if (sug)
        gc_api_errors_add(errs, "/cycle", "unknown preset '%.40s'; did you mean '%s'?", s, sug);
    else
        gc_api_errors_add(errs, "/cycle", "must name a preset: %s", list);
}

static void decode_step(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *v = json_object_get(q->root, "relative_step");
    double h;
    q->opt.diff = (gc_uncert_diff)(get_name(json_object_get(q->root, "derivatives"), diffs,
                                            "/derivatives", 0, errs) == 1);
    if (!v)
        return;
    if (get_number(v, &h) != 0 || h < GC_API_UNCERT_STEP_MIN || h > GC_API_UNCERT_STEP_MAX)
        gc_api_errors_add(errs, "/relative_step", "must be a number from %g to %g (the step "
                          "as a fraction of max(|x|, u(x)))", GC_API_UNCERT_STEP_MIN,
                          GC_API_UNCERT_STEP_MAX);
    else {
        q->opt.rel_step = h;
        q->step_given = 1;
    }
}

static void decode_coverage(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *k = json_object_get(q->root, "coverage_factor");
    json_t *p = json_object_get(q->root, "coverage_probability");
    double x;
    if (k && p)
        gc_api_errors_add(errs, "/coverage_probability", "give either coverage_factor or "
                          "coverage_probability, not both");
    if (k && (get_number(k, &x) != 0 || x <= 0.0 || x > 10.0))
        gc_api_errors_add(errs, "/coverage_factor", "must be a number greater than 0 and at "
                          "most 10");
    else if (k) {
        q->opt.coverage_factor = x;
        q->k_given = 1;
    }
    if (p && (get_number(p, &x) != 0 || x <= 0.0 || x >= 1.0 || x > 0.9999))
        gc_api_errors_add(errs, "/coverage_probability", "must be a number greater than 0 and "
                          "at most 0.9999 (e.g. 0.95)");
    else if (p) {
        q->opt.coverage_probability = x;
        q->opt.welch_satterthwaite = 1;
        q->p_given = 1;
    }
}

static void decode_mc(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *m = json_object_get(q->root, "samples"), *s = json_object_get(q->root, "seed");
    long long v;
    q->opt.samples = GC_API_UNCERT_DEFAULT_SAMPLES;
    q->opt.seed = GC_API_UNCERT_DEFAULT_SEED;
    if ((m || s) && q->method != GC_API_U_MONTE_CARLO)
        gc_api_errors_add(errs, m ? "/samples" : "/seed", "applies only with \"method\": "
                          "\"monte_carlo\"");
    if (m && get_int(m, 2, GC_API_UNCERT_MAX_SAMPLES, &v) != 0)
        gc_api_errors_add(errs, "/samples", "must be a whole number from 2 to %ld (the limit "
                          "of samples per request)", GC_API_UNCERT_MAX_SAMPLES);
    else if (m)
        q->opt.samples = (long)v;
    if (s && get_int(s, 0, GC_API_UNCERT_MAX_SEED, &v) != 0)
        gc_api_errors_add(errs, "/seed", "must be a whole number from 0 to %lld",
                          GC_API_UNCERT_MAX_SEED);
    else if (s)
        q->opt.seed = (uint64_t)v;
    q->samples_given = m != NULL;
    q->seed_given = s != NULL;
}

/* ---- input specifications ------------------------------------------------------------------ */

static int is_spec(json_t *v)
{
    const char *k;
    json_t *m;
    json_object_foreach(v, k, m)
        for (int i = 0; spec_keys[i]; i++)
            if (strcmp(k, spec_keys[i]) == 0)
                return 1;
    return 0;
}

static void add_input(gc_api_ureq *q, const char *pointer, const char *field, json_t *spec,
                      gc_api_errors *errs)
{
    for (int i = 0; i < q->n_in; i++)
        if (strcmp(q->in[i].pointer, pointer) == 0) {
            gc_api_errors_add(errs, field, "names %s, already named at %s", pointer,
                              q->in[i].field);
            return;
        }
    if (q->n_in >= GC_API_UNCERT_MAX_INPUTS) {
        gc_api_errors_add(errs, field, "more than %d inputs: at most %d are allowed",
                          GC_API_UNCERT_MAX_INPUTS, GC_API_UNCERT_MAX_INPUTS);
        return;
    }
    gc_api_uinput *in = &q->in[q->n_in++];
    snprintf(in->pointer, sizeof in->pointer, "%s", pointer);
    snprintf(in->field, sizeof in->field, "%s", field);
    in->given = spec;
}

/* The members of /uncertainties (or of a nesting level under it). */
static void walk_specs(gc_api_ureq *q, json_t *obj, const char *prefix, const char *base,
                       int depth, gc_api_errors *errs)
{
    const char *key;
    json_t *v;
    json_object_foreach(obj, key, v) {
        char field[GC_API_FIELD_LEN], ptr[GC_API_FIELD_LEN];
        snprintf(field, sizeof field, "%s", base);
        gc_out_pointer_append(field, sizeof field, key);
        int bad = depth > 0 && (key[0] == '/' || strchr(key, '.'));
        if (depth == 0 && (key[0] == '/' || strchr(key, '.')))
            bad = gc_api_input_pointer(key, ptr, sizeof ptr) != 0;
        else
            snprintf(ptr, sizeof ptr, "%s/%s", prefix, key);
        if (bad || !key[0]) {
            gc_api_errors_add(errs, field, "must name an input: a name, a dotted name "
                              "(site.temperature) or a JSON pointer (/site/temperature)");
        } else if (json_is_object(v) && !is_spec(v) && depth < 4 && key[0] != '/' &&
                   !strchr(key, '.')) {
            walk_specs(q, v, ptr, field, depth + 1, errs);
        } else {
            add_input(q, ptr, field, v, errs);
        }
    }
}

static void decode_wrt(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *list = q->specs ? as_list(q->specs) : NULL;
    if (q->specs && (!list || json_array_size(list) == 0))
        gc_api_errors_add(errs, "/with_respect_to", "must be a list of input names or "
                          "pointers, e.g. [\"pressure_ratio\", \"/site/temperature\"]");
    size_t i;
    json_t *v;
    json_array_foreach(list, i, v) {
        char field[40], ptr[GC_API_FIELD_LEN];
        snprintf(field, sizeof field, "/with_respect_to/%zu", i);
        if (!json_is_string(v) ||
            gc_api_input_pointer(json_string_value(v), ptr, sizeof ptr) != 0)
            gc_api_errors_add(errs, field, "must name an input (a name, a dotted name or a "
                              "JSON pointer)");
        else
            add_input(q, ptr, field, NULL, errs);
    }
    json_decref(list);
}

/* ---- correlations ---------------------------------------------------------------------------- */

static int input_index(const gc_api_ureq *q, const char *name)
{
    char ptr[GC_API_FIELD_LEN];
    if (!name || gc_api_input_pointer(name, ptr, sizeof ptr) != 0)
        return -2;
    for (int i = 0; i < q->n_in; i++)
        if (strcmp(q->in[i].pointer, ptr) == 0)
            return i;
    return -1;
}

static void decode_pair(gc_api_ureq *q, json_t *c, const char *f, gc_api_errors *errs)
{
    static const char *const keys[] = { "inputs", "coefficient", NULL };
    char g[GC_API_FIELD_LEN + 16];
    gc_api_unknown_keys(c, f, keys, errs);
    json_t *names = as_list(json_object_get(c, "inputs"));
    int idx[2] = { -2, -2 };
    double r = 0.0;
    snprintf(g, sizeof g, "%s/inputs", f);
    if (!names || json_array_size(names) != 2)
        gc_api_errors_add(errs, g, "must name two inputs of uncertainties");
    for (size_t k = 0; names && k < 2 && json_array_size(names) == 2; k++) {
        idx[k] = input_index(q, json_string_value(json_array_get(names, k)));
        if (idx[k] < 0)
            gc_api_errors_add(errs, g, "'%.60s' has no uncertainty: correlations relate inputs "
                              "named in uncertainties", json_string_value(json_array_get(names,
                                                                                         k))
                              ? json_string_value(json_array_get(names, k)) : "?");
    }
    json_decref(names);
    snprintf(g, sizeof g, "%s/coefficient", f);
    if (get_number(json_object_get(c, "coefficient"), &r) != 0 || r < -1.0 || r > 1.0)
        gc_api_errors_add(errs, g, "must be a number from -1 to 1");
    if (idx[0] < 0 || idx[1] < 0 || r < -1.0 || r > 1.0)
        return;
    if (idx[0] == idx[1]) {
        gc_api_errors_add(errs, f, "relates an input with itself");
        return;
    }
    for (int k = 0; k < q->n_corr; k++)
        if ((q->corr[k].i == idx[0] && q->corr[k].j == idx[1]) ||
            (q->corr[k].i == idx[1] && q->corr[k].j == idx[0])) {
            gc_api_errors_add(errs, f, "relates the same two inputs as /correlations/%d", k);
            return;
        }
    q->corr[q->n_corr++] = (gc_api_ucorr){ idx[0], idx[1], r };
}

static void decode_correlations(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *list = q->corr_given ? as_list(q->corr_given) : NULL;
    if (!q->corr_given)
        return;
    if (!list || json_array_size(list) > (size_t)(GC_API_UNCERT_MAX_INPUTS * 2)) {
        gc_api_errors_add(errs, "/correlations", "must be a list of at most %d objects "
                          "{\"inputs\": [a, b], \"coefficient\": r}", GC_API_UNCERT_MAX_INPUTS * 2);
        json_decref(list);
        return;
    }
    size_t i;
    json_t *c;
    json_array_foreach(list, i, c) {
        char f[40];
        snprintf(f, sizeof f, "/correlations/%zu", i);
        if (!json_is_object(c))
            gc_api_errors_add(errs, f, "must be {\"inputs\": [a, b], \"coefficient\": r}");
        else
            decode_pair(q, c, f, errs);
    }
    json_decref(list);
}

/* ---- outputs ---------------------------------------------------------------------------------- */

static void decode_outputs(gc_api_ureq *q, gc_api_errors *errs)
{
    json_t *list = q->outs_given ? as_list(q->outs_given) : NULL;
    if (!q->outs_given)
        return;
    if (!list || json_array_size(list) == 0 ||
        json_array_size(list) > GC_API_UNCERT_MAX_OUTPUTS) {
        gc_api_errors_add(errs, "/outputs", "must be a list of 1 to %d JSON pointers into the "
                          "preset's result, such as '/summary/thermal_efficiency'",
                          GC_API_UNCERT_MAX_OUTPUTS);
        json_decref(list);
        return;
    }
    size_t i;
    json_t *v;
    json_array_foreach(list, i, v) {
        char f[32];
        const char *s = json_string_value(v);
        snprintf(f, sizeof f, "/outputs/%zu", i);
        if (!s || s[0] != '/' || strlen(s) >= GC_API_FIELD_LEN || strstr(s, "//"))
            gc_api_errors_add(errs, f, "must be a JSON pointer into the preset's result, such "
                              "as '/summary/thermal_efficiency'");
        else
            snprintf(q->out[q->n_out++].pointer, GC_API_FIELD_LEN, "%s", s);
    }
    json_decref(list);
}

void gc_api_ureq_decode(gc_api_ureq *q, gc_api_errors *errs)
{
    gc_api_unknown_keys(q->root, "", q->sensitivities ? s_keys : u_keys, errs);
    decode_preset(q, errs);
    q->inputs = json_object_get(q->root, "inputs");
    if (q->inputs && !json_is_object(q->inputs))
        gc_api_errors_add(errs, "/inputs", "must be an object with the preset's input fields");
    gc_uncert_options_init(&q->opt);
    decode_step(q, errs);
    q->outs_given = json_object_get(q->root, "outputs");
    decode_outputs(q, errs);
    if (q->sensitivities) {
        q->specs = json_object_get(q->root, "with_respect_to");
        decode_wrt(q, errs);
        return;
    }
    q->method = get_name(json_object_get(q->root, "method"), methods, "/method", 0, errs);
    decode_coverage(q, errs);
    decode_mc(q, errs);
    q->specs = json_object_get(q->root, "uncertainties");
    if (!json_is_object(q->specs) || json_object_size(q->specs) == 0)
        gc_api_errors_add(errs, "/uncertainties", "is required: an object of input names (or "
                          "pointers) and their standard uncertainties, e.g. "
                          "{\"turbine_inlet_temperature\": \"5 K\", \"compressor_efficiency\": "
                          "\"0.5 %%\"}");
    else
        walk_specs(q, q->specs, "", "/uncertainties", 0, errs);
    q->corr_given = json_object_get(q->root, "correlations");
    decode_correlations(q, errs);
}

void gc_api_ureq_free(gc_api_ureq *q)
{
    free(q->R);
    q->R = NULL;
    json_decref(q->base_warnings);
    q->base_warnings = NULL;
    gc_api_points_free(&q->ev);
    json_decref(q->root);
    q->root = NULL;
}

/* ---- units ------------------------------------------------------------------------------------ */

void gc_api_unit_map(int qty, gc_unit_system sys, double *a, double *b)
{
    if (qty < 0) {
        *a = 1.0;
        *b = 0.0;
        return;
    }
    *b = gc_units_from_si((gc_quantity)qty, sys, 0.0);
    *a = gc_units_from_si((gc_quantity)qty, sys, 1.0) - *b;
}

void gc_api_ratio_unit(const char *y, const char *x, char *out, size_t n)
{
    int ny = !y || !y[0] || strcmp(y, "-") == 0, nx = !x || !x[0] || strcmp(x, "-") == 0;
    if (ny && nx)
        snprintf(out, n, "-");
    else if (nx)
        snprintf(out, n, "%s", y);
    else if (strchr(x, '/') || strchr(x, ' '))
        snprintf(out, n, "%s/(%s)", ny ? "1" : y, x);
    else
        snprintf(out, n, "%s/%s", ny ? "1" : y, x);
}

/* ---- after the base evaluation: outputs ------------------------------------------------------ */

/* The default outputs: every number of /summary. */
static void default_outputs(gc_api_ureq *q, gc_api_errors *errs)
{
    char keys[GC_API_UNCERT_MAX_OUTPUTS][GC_JW_TOKEN_LEN];
    int n = gc_api_points_numbers_under(&q->ev, "/summary", keys, GC_API_UNCERT_MAX_OUTPUTS);
    for (int k = 0; k < n; k++) {
        snprintf(q->out[k].pointer, GC_API_FIELD_LEN, "/summary/%.100s", keys[k]);
        q->out[k].target = gc_api_points_target(&q->ev, q->out[k].pointer);
        q->out[k].by_default = 1;
    }
    q->n_out = n;
    if (n == 0)
        gc_api_errors_add(errs, "/outputs", "is required: the %s result has no /summary of "
                          "numbers to take by default; name the figures as JSON pointers",
                          q->p->name);
}

/* Each output names one number of the base result; its name and unit. */
static void check_outputs(gc_api_ureq *q, gc_api_errors *errs)
{
    for (int k = 0; k < q->n_out; k++) {
        gc_api_uoutput *o = &q->out[k];
        const gc_jw_target *t = o->target >= 0 ? &q->ev.t[o->target] : NULL;
        char f[32];
        snprintf(f, sizeof f, "/outputs/%d", k);
        if (o->by_default)   /* a number of /summary by construction */
            t = NULL;
        if (!o->by_default && (!t || !t->found))
            gc_api_errors_add(errs, f, "no value at '%s' in the %s result (e.g. "
                              "/summary/thermal_efficiency)", o->pointer, q->p->name);
        else if (t && t->kind != GC_JW_NUMBER)
            gc_api_errors_add(errs, f, "'%s' names %s, not a number that varies with the "
                              "inputs", o->pointer, t->kind == GC_JW_INTEGER ? "a whole number"
                              : t->kind == GC_JW_OBJECT ? "an object" : t->kind == GC_JW_ARRAY
                              ? "an array" : "a text or flag");
        snprintf(o->name, sizeof o->name, "%s", gc_api_pointer_last(o->pointer));
        const char *label = gc_api_points_unit(&q->ev, o->name);
        snprintf(o->unit, sizeof o->unit, "%s", label ? label : "-");
        o->quantity = gc_api_label_quantity(o->unit, q->sys);
        for (int j = 0; j < k; j++)
            if (strcmp(q->out[j].pointer, o->pointer) == 0)
                gc_api_errors_add(errs, f, "repeats /outputs/%d", j);
    }
}

/* ---- after the base evaluation: inputs ------------------------------------------------------- */

static gc_quantity difference_of(gc_quantity q)
{
    return q == GC_Q_TEMPERATURE || q == GC_Q_AMBIENT_TEMPERATURE ? GC_Q_TEMPERATURE_DIFFERENCE
                                                                     : q;
}

/* One amount of an uncertainty (SI, >= 0) into *u; 0, or -1 with an error. */
static int amount(gc_api_uinput *in, json_t *v, const char *f, double *u, gc_api_errors *errs)
{
    gc_quantity qd = difference_of(in->num.quantity);
    char unit[GC_API_UNCERT_UNIT_LEN];
    double x;
    gc_error e;
    if (gc_api_value_split(v, &x, unit, sizeof unit) != 0) {
        gc_api_errors_add(errs, f, "must be a number (in %s), a string with a unit of %s, or a "
                          "percentage of the value ('0.5 %%')", gc_units_label(qd, GC_UNITS_SI),
                          gc_quantity_words(qd));
        return -1;
    }
    if (x < 0.0) {
        gc_api_errors_add(errs, f, "must not be negative");
        return -1;
    }
    if (strcmp(unit, "%") == 0) {
        if (in->num.value == 0.0 && x > 0.0) {
            gc_api_errors_add(errs, f, "is relative, but the value of %s is 0: give an amount "
                              "with a unit", in->pointer);
            return -1;
        }
        *u = x / 100.0 * fabs(in->num.value);
        in->relative = 1;
    } else if (!unit[0]) {
        *u = gc_units_default_to_si(qd, x);
    } else if (gc_units_to_si(qd, x, unit, u, &e) != GC_OK) {
        gc_api_errors_add(errs, f, "%s", e.message);
        return -1;
    }
    if (!isfinite(*u) || *u < 0.0) {
        gc_api_errors_add(errs, f, "must be a finite amount");
        return -1;
    }
    return 0;
}

/* The member key of spec at f, or NULL when absent. */
static json_t *member(json_t *spec, const char *key, const char *base, char *f, size_t n)
{
    snprintf(f, n, "%s/%s", base, key);
    return json_object_get(spec, key);
}

/* {"systematic": a, "random": a}. */
static void spec_parts(gc_api_uinput *in, json_t *spec, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN + 24];
    json_t *b = member(spec, "systematic", in->field, f, sizeof f);
    if (b)
        amount(in, b, f, &in->u.u_sys, errs);
    json_t *s = member(spec, "random", in->field, f, sizeof f);
    if (s)
        amount(in, s, f, &in->u.u_rand, errs);
    in->u.has_parts = 1;
    in->u.u = 0.0;
    in->form = "parts";
}

/* {"expanded": a, "coverage_factor": k}. */
static void spec_expanded(gc_api_uinput *in, json_t *spec, json_t *e, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN + 24];
    json_t *kv = member(spec, "coverage_factor", in->field, f, sizeof f);
    double k = 0.0;
    in->form = "expanded";
    if (!kv)
        gc_api_errors_add(errs, f, "is required with expanded: the k of U = k u (GUM 6.2.1)");
    else if (get_number(kv, &k) != 0 || k <= 0.0 || k > 10.0)
        gc_api_errors_add(errs, f, "must be a number greater than 0 and at most 10");
    member(spec, "expanded", in->field, f, sizeof f);
    if (amount(in, e, f, &in->expanded, errs) == 0 && k > 0.0 && k <= 10.0) {
        in->k = k;
        in->u.u = in->expanded / k;
    }
}

/* Which of the four forms an object gives; -1 (error added) unless one. */
static int spec_form(gc_api_uinput *in, json_t *spec, gc_api_errors *errs)
{
    int st = json_object_get(spec, "standard") != NULL;
    int ex = json_object_get(spec, "expanded") != NULL;
    int hw = json_object_get(spec, "half_width") != NULL;
    int pa = json_object_get(spec, "systematic") || json_object_get(spec, "random");
    if (st + ex + hw + pa != 1) {
        gc_api_errors_add(errs, in->field, "must give one of standard, expanded (with "
                          "coverage_factor), half_width, or systematic and random");
        return -1;
    }
    if (!ex && json_object_get(spec, "coverage_factor")) {
        char f[GC_API_FIELD_LEN + 24];
        snprintf(f, sizeof f, "%s/coverage_factor", in->field);
        gc_api_errors_add(errs, f, "applies only with expanded");
    }
    return st ? 0 : ex ? 1 : hw ? 2 : 3;
}

static void spec_extras(gc_api_uinput *in, json_t *spec, int form, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN + 24];
    json_t *d = member(spec, "distribution", in->field, f, sizeof f);
    int dist = get_name(d, dists, f, form == 2 ? 1 : 0, errs);
    if (form == 2 && dist == 0)
        gc_api_errors_add(errs, f, "a half_width is the half-width of a rectangular "
                          "distribution (GUM 4.3.7)");
    in->u.dist = dist == 1 ? GC_UNCERT_RECTANGULAR : GC_UNCERT_NORMAL;
    json_t *dof = member(spec, "degrees_of_freedom", in->field, f, sizeof f);
    double nu = 0.0;
    if (dof && (get_number(dof, &nu) != 0 || nu < 1.0 || nu > 1e9))
        gc_api_errors_add(errs, f, "must be a number of at least 1 (leave it out for "
                          "infinitely many)");
    else if (dof)
        in->u.dof = nu;
}

static void spec_object(gc_api_uinput *in, json_t *spec, gc_api_errors *errs)
{
    char f[GC_API_FIELD_LEN + 24];
    gc_api_unknown_keys(spec, in->field, spec_keys, errs);
    int form = spec_form(in, spec, errs);
    if (form < 0)
        return;
    spec_extras(in, spec, form, errs);
    if (form == 0) {
        in->form = "standard";
        amount(in, member(spec, "standard", in->field, f, sizeof f), f, &in->u.u, errs);
    } else if (form == 1) {
        spec_expanded(in, spec, json_object_get(spec, "expanded"), errs);
    } else if (form == 2) {
        double a = 0.0;
        in->form = "half_width";
        if (amount(in, member(spec, "half_width", in->field, f, sizeof f), f, &a, errs) == 0)
            gc_uncert_from_half_width(a, &in->u.u);
    } else {
        spec_parts(in, spec, errs);
    }
}

/* The input's place, value, units and (for /v1/uncertainty) uncertainty. */
static void resolve_input(gc_api_ureq *q, gc_api_uinput *in, gc_api_errors *errs)
{
    char why[GC_API_MESSAGE_LEN];
    if (gc_api_points_num_find(&q->ev, in->pointer, &in->num, why, sizeof why) != 0) {
        gc_api_errors_add(errs, in->field, "'%s' %s", in->pointer, why);
        return;
    }
    snprintf(in->unit, sizeof in->unit, "%s", gc_units_label(in->num.quantity, q->sys));
    gc_api_unit_map((int)in->num.quantity, q->sys, &in->a, &in->b);
    gc_uncert_input_init(&in->u, in->num.value, 0.0);
    in->u.name = in->pointer;
    in->u.has_lo = in->num.has_lo;
    in->u.lo = in->num.lo;
    in->u.has_hi = in->num.has_hi;
    in->u.hi = in->num.hi;
    if (q->sensitivities) {
        /* h = relative_step x max(|x|, u) is 0 here: one display unit sets the scale */
        double h = q->opt.rel_step > 0.0 ? q->opt.rel_step
                 : q->opt.diff == GC_UNCERT_RICHARDSON ? GC_UNCERT_STEP_RICHARDSON
                                                      : GC_UNCERT_STEP_CENTRAL;
        if (in->num.value == 0.0)
            in->u.step = h / in->a;
        return;
    }
    in->form = "standard";
    if (json_is_object(in->given))
        spec_object(in, in->given, errs);
    else
        amount(in, in->given, in->field, &in->u.u, errs);
}

static int correlation_matrix(gc_api_ureq *q)
{
    int n = q->n_in;
    if (q->n_corr == 0)
        return 0;
    q->R = calloc((size_t)n * (size_t)n, sizeof *q->R);
    if (!q->R)
        return -2;
    for (int i = 0; i < n; i++)
        q->R[i * n + i] = 1.0;
    for (int k = 0; k < q->n_corr; k++) {
        q->R[q->corr[k].i * n + q->corr[k].j] = q->corr[k].r;
        q->R[q->corr[k].j * n + q->corr[k].i] = q->corr[k].r;
    }
    return 0;
}

/* /v1/sensitivities without with_respect_to: every plain number the inputs
 * give (in the order given), as far as it is a number input of the preset. */
static void default_wrt(gc_api_ureq *q, json_t *obj, const char *prefix, int depth)
{
    const char *key;
    json_t *v;
    json_object_foreach(obj, key, v) {
        char ptr[GC_API_FIELD_LEN], why[GC_API_MESSAGE_LEN], unit[GC_API_UNCERT_UNIT_LEN];
        double x;
        snprintf(ptr, sizeof ptr, "%s", prefix);
        gc_out_pointer_append(ptr, sizeof ptr, key);
        if (json_is_object(v) && depth < 4) {
            default_wrt(q, v, ptr, depth + 1);
            continue;
        }
        gc_api_points_num num;
        if (q->n_in >= GC_API_UNCERT_MAX_INPUTS ||
            gc_api_value_split(v, &x, unit, sizeof unit) != 0 ||
            gc_api_points_num_find(&q->ev, ptr, &num, why, sizeof why) != 0)
            continue;
        gc_api_uinput *in = &q->in[q->n_in++];
        snprintf(in->pointer, sizeof in->pointer, "%s", ptr);
        snprintf(in->field, sizeof in->field, "/inputs%.100s", ptr);
    }
}

int gc_api_ureq_resolve(gc_api_ureq *q, gc_api_errors *errs)
{
    if (q->sensitivities && !q->specs && q->inputs)
        default_wrt(q, q->inputs, "", 0);
    if (q->n_out == 0)
        default_outputs(q, errs);
    check_outputs(q, errs);
    for (int i = 0; i < q->n_in; i++)
        resolve_input(q, &q->in[i], errs);
    if (q->sensitivities && q->n_in == 0)
        gc_api_errors_add(errs, "/with_respect_to", "names no input: give the inputs to "
                          "differentiate with respect to (the default is every number given "
                          "in inputs, and inputs gives none)");
    if (errs->n || errs->dropped)
        return -1;
    return correlation_matrix(q);
}
