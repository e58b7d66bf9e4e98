/*
 * fields.c — decoding through a preset's field table (fields.h). The
 * sentences are the decoder's of decode.c (same words for the same faults on
 * every route); bounds come from the table through the core's
 * gc_field_check_value. Gas models: the row's names ("air", "cold"), the
 * cold members cp and k decoded into the gc_gas and the model built by
 * gas.h. Fuels: a name, an analysis by mole fraction or a liquid formula
 * with its lower heating value (combustion.h), kept as given in the
 * gc_fuel_spec for the echo.
 */
#include "api/request/fields.h"
#include "api/respond/jw.h"
#include "gascycle/combustion.h"
#include "gascycle/species.h"

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct dec {
    gc_decoder d;
    const gc_preset *p;
} dec;

static const char *type_words(const json_t *v)
{
    switch (json_typeof(v)) {
    case JSON_OBJECT: return "an object";
    case JSON_ARRAY: return "an array";
    case JSON_STRING: return "a string";
    case JSON_INTEGER:
    case JSON_REAL: return "a number";
    case JSON_TRUE:
    case JSON_FALSE: return "a boolean";
    default: return "null";
    }
}

/* ptr (cut to the buffer as snprintf would) and "/name" escaped: the
 * pointer of a member (once per field of a preset's table: no printf). */
static void child_ptr(char *out, const char *ptr, const char *name)
{
    size_t n = strnlen(ptr, GC_API_FIELD_LEN - 1);
    memmove(out, ptr, n);
    out[n] = '\0';
    gc_out_pointer_append(out, GC_API_FIELD_LEN, name);
}

static void set_given(const gc_field *f, char *base)
{
    if (f->given)
        *(int *)(void *)(base + f->given - 1) = 1;
}

static void index_ptr(char *out, const char *ptr, size_t i)
{
    char num[24];
    snprintf(num, sizeof num, "%zu", i);
    child_ptr(out, ptr, num);
}

static int in_scope(const gc_field *f, int parent, int variant)
{
    return f->name && f->parent == parent && !(f->flags & GC_FF_DERIVED) &&
           (variant < 0 || f->variant == variant);
}

static void enum_error(gc_decoder *d, const char *ptr, const char *given,
                       const char *const *names)
{
    char list[180];
    size_t n = 0;
    while (names[n])
        n++;
    gc_decode_name_list(list, sizeof list, names, n, 1);
    const char *s = given ? gc_decode_suggest(given, names, n) : NULL;
    if (s)
        gc_decode_error(d, ptr, "must be one of %s; did you mean '%s'?", list, s);
    else
        gc_decode_error(d, ptr, "must be one of %s", list);
}

static int decode_members(dec *x, int parent, int variant, json_t *obj, const char *ptr,
                          char *base, const char *extra);
static void unknown_member(dec *x, const char *key, const char *ptr, const char *const *names,
                           size_t n);

/* ---- numbers --------------------------------------------------------------------------- */

static int range(dec *x, const gc_field *f, const char *ptr, double v)
{
    gc_error e;
    gc_error_clear(&e);
    if (gc_field_check_value(f, v, &e) == GC_OK)
        return 0;
    if (f->type == GC_FT_NUMBER || f->type == GC_FT_NUMBER_LIST)
        gc_decode_range_error(&x->d, ptr, f->quantity, e.message);
    else
        gc_decode_error(&x->d, ptr, "%s", e.message);
    return -1;
}

/* A number into t; a gauge pressure or standard volume is completed later
 * (context.c), with its bounds checked there. */
static int decode_number(dec *x, const gc_field *f, json_t *v, const char *ptr, char *t)
{
    double val = 0.0;
    int rc = gc_decode_number_at(&x->d, v, ptr, f->quantity, (double *)(void *)t, f, NULL);
    if (rc != 0)
        return rc < 0 ? -1 : 0;
    val = *(double *)(void *)t;
    return range(x, f, ptr, val);
}

static int decode_integer(dec *x, const gc_field *f, json_t *v, const char *ptr, char *t)
{
    double val;
    if (json_is_number(v)) {
        val = json_number_value(v);
    } else if (json_is_string(v) && x->d.from_query) {
        const char *s = json_string_value(v);
        char *end = NULL;
        long long n = strtoll(s, &end, 10);
        if (!*s || *end || isspace((unsigned char)*s)) {
            gc_decode_error(&x->d, ptr, "must be a whole number, got '%.40s'", s);
            return -1;
        }
        val = (double)n;
    } else {
        gc_decode_error(&x->d, ptr, "must be a whole number, got %s", type_words(v));
        return -1;
    }
    /* The bounds first (as decode.c): a query value beyond long long's
     * range reads as LLONG_MAX or LLONG_MIN, far outside any bound. */
    if (val != floor(val)) {
        gc_decode_error(&x->d, ptr, "must be a whole number");
        return -1;
    }
    if (range(x, f, ptr, val) != 0)
        return -1;
    if (fabs(val) > 2147483647.0) {
        gc_decode_error(&x->d, ptr, "must be a whole number between -2147483647 and "
                        "2147483647");
        return -1;
    }
    *(int *)(void *)t = (int)val;
    return 0;
}

static int decode_bool(dec *x, json_t *v, const char *ptr, char *t)
{
    const char *s = json_is_string(v) && x->d.from_query ? json_string_value(v) : NULL;
    if (json_is_boolean(v)) {
        *(int *)(void *)t = json_is_true(v);
    } else if (s && (strcmp(s, "true") == 0 || strcmp(s, "false") == 0)) {
        *(int *)(void *)t = strcmp(s, "true") == 0;
    } else {
        gc_decode_error(&x->d, ptr, "must be true or false, got %s", type_words(v));
        return -1;
    }
    return 0;
}

static int decode_enum(dec *x, const gc_field *f, json_t *v, const char *ptr, char *t)
{
    if (!json_is_string(v)) {
        enum_error(&x->d, ptr, NULL, f->names);
        return -1;
    }
    for (int i = 0; f->names[i]; i++)
        if (strcmp(json_string_value(v), f->names[i]) == 0) {
            *(int *)(void *)t = i;
            return 0;
        }
    enum_error(&x->d, ptr, json_string_value(v), f->names);
    return -1;
}

static int decode_string(dec *x, json_t *v, const char *ptr, char *t)
{
    if (!json_is_string(v)) {
        gc_decode_error(&x->d, ptr, "must be a string, got %s", type_words(v));
        return -1;
    }
    const char *s = json_string_value(v);
    if (strlen(s) >= GC_FIELD_STRING_LEN) {
        gc_decode_error(&x->d, ptr, "is longer than %d characters", GC_FIELD_STRING_LEN - 1);
        return -1;
    }
    snprintf(t, GC_FIELD_STRING_LEN, "%s", s);
    return 0;
}

/* ---- gas models -------------------------------------------------------------------------- */

/* The cold members' defaults (the table's) before they are decoded. */
static void gas_member_defaults(dec *x, int gas_row, int variant, char *base)
{
    for (int r = 1; r < x->p->n_fields; r++) {
        const gc_field *f = &x->p->fields[r];
        if (in_scope(f, gas_row, variant) && f->type == GC_FT_NUMBER)
            *(double *)(void *)(base + f->offset) = f->def;
    }
}

static double gas_member(dec *x, int gas_row, const char *name, const char *base)
{
    int r = gc_preset_child(x->p, gas_row, name);
    return r > 0 ? *(const double *)(const void *)(base + x->p->fields[r].offset) : 0.0;
}

static int gas_variant(dec *x, const gc_field *f, json_t *v, const char *ptr, char *mptr,
                       json_t **members)
{
    const char *want;
    *members = NULL;
    snprintf(mptr, GC_API_FIELD_LEN, "%s", ptr);
    if (json_is_string(v)) {
        want = json_string_value(v);
    } else if (json_is_object(v)) {
        json_t *m = json_object_get(v, "model");
        child_ptr(mptr, ptr, "model");
        if (!m) {
            gc_decode_error(&x->d, mptr, "is required when %s is an object", f->name);
            return -1;
        }
        if (!json_is_string(m)) {
            enum_error(&x->d, mptr, NULL, f->names);
            return -1;
        }
        want = json_string_value(m);
        *members = v;
    } else {
        gc_decode_error(&x->d, ptr, "must be a model name or an object with \"model\", got %s",
                        type_words(v));
        return -1;
    }
    for (int i = 0; f->names[i]; i++)
        if (strcmp(want, f->names[i]) == 0)
            return i;
    enum_error(&x->d, mptr, want, f->names);
    return -1;
}

static int decode_gas(dec *x, int row, json_t *v, const char *ptr, char *base)
{
    const gc_field *f = &x->p->fields[row];
    char mptr[GC_API_FIELD_LEN];
    json_t *members;
    int idx = gas_variant(x, f, v, ptr, mptr, &members);
    if (idx < 0)
        return -1;
    gas_member_defaults(x, row, idx, base);
    if (decode_members(x, row, idx, members, ptr, base, "model") > 0)
        return -1;
    gc_gas *g = (gc_gas *)(void *)(base + f->offset);
    if (strcmp(f->names[idx], "cold") != 0) {
        gc_gas_init_air(g);
        return 0;
    }
    double cp = gas_member(x, row, "cp", base), k = gas_member(x, row, "k", base);
    gc_error err;
    gc_error_clear(&err);
    if (gc_gas_init_cold(g, cp, k, &err) != GC_OK) {
        gc_decode_error(&x->d, ptr, "%s", err.message);
        return -1;
    }
    return 0;
}

/* ---- fuels ---------------------------------------------------------------------------------- */

/* "C12H23", "CH3OH", "C7.1H13.6": atoms of C, H, O, N. 0 or -1. */
static int parse_formula(const char *s, double atoms[4])
{
    atoms[0] = atoms[1] = atoms[2] = atoms[3] = 0.0;
    if (!*s)
        return -1;
    while (*s) {
        const char *el = strchr("CHON", *s);
        if (*s == '\0' || el == NULL)
            return -1;
        s++;
        double n = 1.0;
        if (isdigit((unsigned char)*s) || *s == '.') {
            char *end = NULL;
            n = strtod(s, &end);
            if (end == s || !isfinite(n) || n <= 0.0 || n > 1000.0)
                return -1;
            s = end;
        }
        atoms[el - "CHON"] += n;
    }
    return 0;
}

static int fuel_analysis(dec *x, json_t *value, const char *ptr, gc_fuel *fuel,
                         gc_fuel_spec *spec)
{
    if (!json_is_object(value) || json_object_size(value) == 0) {
        gc_decode_error(&x->d, ptr, "must be an object of species names and mole fractions, "
                        "e.g. {\"CH4\": 0.93, \"C2H6\": 0.04, ...}");
        return -1;
    }
    int n = 0;
    if (gc_decode_mole_fractions(&x->d, value, ptr, spec->species, spec->x, &n, NULL, 0) != 0)
        return -1;
    spec->n = n;
    double sum = 0.0;
    for (int i = 0; i < n; i++)
        sum += spec->x[i];
    if (fabs(sum - 1.0) > 1e-6) {
        gc_decode_error(&x->d, ptr, "the mole fractions sum to %.8g, not 1", sum);
        return -1;
    }
    gc_error err;
    gc_error_clear(&err);
    if (gc_fuel_init_mixture(fuel, n, spec->species, spec->x, &err) != GC_OK) {
        gc_decode_error(&x->d, ptr, "%s", err.message);
        return -1;
    }
    return 0;
}

static int fuel_unknown_members(dec *x, json_t *value, const char *ptr)
{
    static const char *const names[] = { "analysis", "formula", "lower_heating_value",
                                         "liquid_cp", NULL };
    const char *k;
    json_t *v;
    int bad = 0;
    json_object_foreach(value, k, v) {
        int known = 0;
        for (size_t i = 0; names[i]; i++)
            known |= strcmp(k, names[i]) == 0;
        if (known)
            continue;
        char p[GC_API_FIELD_LEN];
        child_ptr(p, ptr, k);
        const char *s = gc_decode_suggest(k, names, 4);
        if (s)
            gc_decode_error(&x->d, p, "unknown field '%.60s'; did you mean '%s'?", k, s);
        else
            gc_decode_error(&x->d, p, "unknown field '%.60s'; the fields here are: analysis, "
                            "formula, lower_heating_value, liquid_cp", k);
        bad = 1;
    }
    return bad;
}

static int fuel_formula(dec *x, json_t *value, const char *ptr, gc_fuel *fuel,
                        gc_fuel_spec *spec)
{
    json_t *formula = json_object_get(value, "formula");
    json_t *lhv = json_object_get(value, "lower_heating_value");
    json_t *cp = json_object_get(value, "liquid_cp");
    char p[GC_API_FIELD_LEN];
    double atoms[4], LHV = 0.0, cpl = 0.0;
    int bad = 0;
    child_ptr(p, ptr, "formula");
    if (!json_is_string(formula) || parse_formula(json_string_value(formula), atoms) != 0) {
        gc_decode_error(&x->d, p, "must be a formula of C, H, O and N atoms such as \"C12H23\" "
                        "or \"CH3OH\"");
        bad = 1;
    }
    child_ptr(p, ptr, "lower_heating_value");
    if (!lhv) {
        gc_decode_error(&x->d, p, "is required with a formula (the liquid's enthalpy of "
                        "formation comes from it)");
        bad = 1;
    } else if (gc_decode_number(&x->d, lhv, p, GC_Q_SPECIFIC_ENERGY, &LHV) != 0) {
        bad = 1;
    }
    child_ptr(p, ptr, "liquid_cp");
    if (cp && gc_decode_number(&x->d, cp, p, GC_Q_SPECIFIC_ENTROPY, &cpl) != 0)
        bad = 1;
    if (bad)
        return -1;
    gc_error err;
    gc_error_clear(&err);
    if (gc_fuel_init_liquid(fuel, atoms[0], atoms[1], atoms[2], atoms[3], LHV, cpl, &err) !=
        GC_OK) {
        gc_decode_error(&x->d, ptr, "%s", err.message);
        return -1;
    }
    spec->form = GC_FUEL_FORMULA;
    snprintf(spec->name, sizeof spec->name, "%s", json_string_value(formula));
    spec->lhv_J_per_kg = LHV;
    return 0;
}

static int decode_fuel(dec *x, const gc_field *f, json_t *value, const char *ptr, char *base)
{
    gc_fuel *fuel = (gc_fuel *)(void *)(base + f->offset);
    gc_fuel_spec scratch, *spec = f->aux ? (gc_fuel_spec *)(void *)(base + f->aux - 1) : &scratch;
    memset(spec, 0, sizeof *spec);
    if (json_is_string(value)) {
        gc_error err;
        gc_error_clear(&err);
        if (gc_fuel_init_named(fuel, json_string_value(value), &err) != GC_OK) {
            gc_decode_error(&x->d, ptr, "%s; or give {\"analysis\": {species: mole fraction}} "
                            "or {\"formula\": \"CxHyOzNw\", \"lower_heating_value\": ...}",
                            err.message);
            return -1;
        }
        spec->form = GC_FUEL_NAMED;
        snprintf(spec->name, sizeof spec->name, "%s", json_string_value(value));
        return 0;
    }
    if (!json_is_object(value)) {
        gc_decode_error(&x->d, ptr, "must be a fuel name (\"methane\") or an object with an "
                        "\"analysis\" or a \"formula\" and \"lower_heating_value\"");
        return -1;
    }
    if (fuel_unknown_members(x, value, ptr))
        return -1;
    json_t *analysis = json_object_get(value, "analysis");
    json_t *formula = json_object_get(value, "formula");
    if (analysis && !formula && !json_object_get(value, "lower_heating_value") &&
        !json_object_get(value, "liquid_cp")) {
        char p[GC_API_FIELD_LEN];
        child_ptr(p, ptr, "analysis");
        spec->form = GC_FUEL_ANALYSIS;
        return fuel_analysis(x, analysis, p, fuel, spec);
    }
    if (formula && !analysis)
        return fuel_formula(x, value, ptr, fuel, spec);
    gc_decode_error(&x->d, ptr, "give either \"analysis\" (a gas by mole fractions) or "
                    "\"formula\" with \"lower_heating_value\" (a liquid)");
    return -1;
}

/* ---- lists ------------------------------------------------------------------------------------ */

static int count_error(dec *x, const gc_field *f, const char *ptr, int list_of_numbers)
{
    gc_decode_error(&x->d, ptr, "must be an array of %d to %d %s%s", f->min_items, f->max_items,
                    f->items ? f->items : "items",
                    list_of_numbers ? " (GET: a comma list)" : "");
    return -1;
}

/* A list given in a query as an object keyed "0", "1", ... -> a new array. */
static json_t *numbered(dec *x, const gc_field *f, json_t *value, const char *ptr)
{
    size_t n = json_object_size(value);
    json_t *a = json_array();
    for (size_t i = 0; a && i < n; i++) {
        char key[24];
        snprintf(key, sizeof key, "%zu", i);
        json_t *v = json_object_get(value, key);
        if (!v) {
            gc_decode_error(&x->d, ptr, "query keys %s.0, %s.1, ... must be numbered from 0 "
                            "without gaps (%s.%zu is missing)", f->name, f->name, f->name, i);
            json_decref(a);
            return NULL;
        }
        json_array_append(a, v);
    }
    return a;
}

static int decode_list(dec *x, int row, json_t *value, const char *ptr, char *base)
{
    const gc_field *f = &x->p->fields[row];
    json_t *owned = NULL, *arr = value;
    if (json_is_object(value) && x->d.from_query) {
        arr = owned = numbered(x, f, value, ptr);
        if (!arr)
            return -1;
    }
    int *count = (int *)(void *)(base + f->count - 1);
    size_t n = json_array_size(arr);
    if (!json_is_array(arr) || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        json_decref(owned);
        return count_error(x, f, ptr, 0);
    }
    int bad = 0;
    for (size_t i = 0; i < n; i++) {
        char p[GC_API_FIELD_LEN];
        index_ptr(p, ptr, i);
        char *item = base + f->offset + i * f->item_size;
        gc_preset_item_init(x->p, row, item);
        json_t *it = json_array_get(arr, i);
        if (!json_is_object(it)) {
            gc_decode_error(&x->d, p, "must be an object, got %s", type_words(it));
            bad = 1;
            continue;
        }
        bad |= decode_members(x, row, -1, it, p, item, NULL) > 0;
    }
    *count = (int)n;
    json_decref(owned);
    return bad ? -1 : 0;
}

/* 1 when v[0..n) increases strictly and lies within the row's bounds. */
static int increasing_within(const gc_field *f, const double *v, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if (((f->flags & GC_FF_MIN) && v[i] < f->min) || ((f->flags & GC_FF_MAX) && v[i] > f->max))
            return 0;
        if (i > 0 && !(v[i - 1] < v[i]))
            return 0;
    }
    return 1;
}

static int decode_number_list(dec *x, const gc_field *f, json_t *value, const char *ptr,
                              char *base)
{
    json_t *owned;
    json_t *arr = gc_decode_list(&x->d, value, &owned);
    size_t n = json_array_size(arr);
    const char *const *say = f->names;   /* the row's own sentences, or NULL */
    if (!json_is_array(arr) || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        json_decref(owned);
        if (say) {
            gc_decode_error(&x->d, ptr, "%s", say[0]);
            return -1;
        }
        return count_error(x, f, ptr, 1);
    }
    double *dst = (double *)(void *)(base + f->offset);
    int bad = 0;
    for (size_t i = 0; i < n; i++) {
        char p[GC_API_FIELD_LEN];
        index_ptr(p, ptr, i);
        /* a list with its own sentences checks its order after: no completion later */
        int rc = say ? gc_decode_number(&x->d, json_array_get(arr, i), p, f->quantity, &dst[i])
                     : gc_decode_number_at(&x->d, json_array_get(arr, i), p, f->quantity,
                                           &dst[i], f, NULL);
        if (rc < 0 || (rc == 0 && !say && range(x, f, p, dst[i]) != 0))
            bad = 1;
    }
    *(int *)(void *)(base + f->count - 1) = (int)n;
    json_decref(owned);
    if (!bad && say && !increasing_within(f, dst, n)) {
        gc_decode_error(&x->d, ptr, "%s", say[1]);
        return -1;
    }
    return bad ? -1 : 0;
}

/* ---- another preset's request (GC_FT_PRESET) ------------------------------------------------- */

/* The index of the preset named by "cycle" in obj, or -1 with the error. */
static int nested_which(dec *x, const gc_field *f, json_t *obj, const char *ptr)
{
    const char *names[16];
    int n = 0;
    for (; f->presets && f->presets[n] && n < 15; n++)
        names[n] = f->presets[n]->name;
    names[n] = NULL;
    char p[GC_API_FIELD_LEN];
    child_ptr(p, ptr, "cycle");
    json_t *c = json_object_get(obj, "cycle");
    if (c == NULL) {
        gc_decode_error(&x->d, p, "is required: the preset whose inputs follow in \"inputs\"");
        return -1;
    }
    if (json_is_string(c))
        for (int i = 0; i < n; i++)
            if (strcmp(json_string_value(c), names[i]) == 0)
                return i;
    enum_error(&x->d, p, json_is_string(c) ? json_string_value(c) : NULL, names);
    return -1;
}

static int decode_nested(dec *x, const gc_field *f, json_t *v, const char *ptr, char *base)
{
    static const char *const members[] = { "cycle", "inputs" };
    if (!json_is_object(v)) {
        gc_decode_error(&x->d, ptr, "must be an object {\"cycle\": name, \"inputs\": {...}}, "
                        "got %s", type_words(v));
        return -1;
    }
    const char *key;
    json_t *val;
    int bad = 0;
    json_object_foreach(v, key, val)
        if (strcmp(key, members[0]) != 0 && strcmp(key, members[1]) != 0) {
            unknown_member(x, key, ptr, members, 2);
            bad = 1;
        }
    int idx = nested_which(x, f, v, ptr);
    if (idx < 0)
        return -1;
    const gc_preset *sub = f->presets[idx];
    char p[GC_API_FIELD_LEN];
    child_ptr(p, ptr, "inputs");
    if (sub->input_size > f->item_size) {
        gc_decode_error(&x->d, p, "the preset '%s' cannot be taken here", sub->name);
        return -1;
    }
    *(int *)(void *)(base + f->count - 1) = idx;
    gc_preset_input_init(sub, base + f->offset);
    json_t *inputs = json_object_get(v, "inputs");
    if (inputs && !json_is_object(inputs)) {
        gc_decode_error(&x->d, p, "must be an object, got %s", type_words(inputs));
        return -1;
    }
    /* the nested request reads as the outer one (input_units, decimal) and
     * completes its own gauge pressures and standard volumes on its own site */
    gc_decode_ctx *sub_ctx = x->d.ctx ? malloc(sizeof *sub_ctx) : NULL;
    if (x->d.ctx && !sub_ctx) {
        gc_decode_error(&x->d, p, "no memory to read the nested request");
        return -1;
    }
    if (sub_ctx) {
        gc_decode_ctx_init(sub_ctx);
        sub_ctx->opts = x->d.ctx->opts;
    }
    if (gc_api_fields_decode(sub, inputs, x->d.from_query, base + f->offset, p, x->d.errs,
                             sub_ctx) > 0)
        bad = 1;
    free(sub_ctx);
    return bad ? -1 : 0;
}

/* ---- rows and objects ----------------------------------------------------------------------- */

int gc__api_decode_pairs(gc_decoder *d, const gc_preset *p, const gc_field *f, json_t *value,
                         const char *ptr, char *base);
int gc__api_decode_series(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                          char *base);

static int decode_row(dec *x, int row, json_t *v, const char *ptr, char *base)
{
    const gc_field *f = &x->p->fields[row];
    char *t = base + f->offset;
    if (!v) {
        if ((f->flags & GC_FF_REQUIRED) && f->type != GC_FT_OBJECT) {
            gc_decode_error(&x->d, ptr, "is required");
            return -1;
        }
        if (f->type == GC_FT_OBJECT)
            return decode_members(x, row, -1, NULL, ptr, base, NULL) > 0 ? -1 : 0;
        return 0;
    }
    set_given(f, base);
    switch (f->type) {
    case GC_FT_NUMBER: return decode_number(x, f, v, ptr, t);
    case GC_FT_INTEGER: return decode_integer(x, f, v, ptr, t);
    case GC_FT_BOOL: return decode_bool(x, v, ptr, t);
    case GC_FT_ENUM: return decode_enum(x, f, v, ptr, t);
    case GC_FT_STRING: return decode_string(x, v, ptr, t);
    case GC_FT_OBJECT:
        if (!json_is_object(v)) {
            gc_decode_error(&x->d, ptr, "must be an object, got %s", type_words(v));
            return -1;
        }
        return decode_members(x, row, -1, v, ptr, base, NULL) > 0 ? -1 : 0;
    case GC_FT_GAS: return decode_gas(x, row, v, ptr, base);
    case GC_FT_FUEL: return decode_fuel(x, f, v, ptr, base);
    case GC_FT_LIST: return decode_list(x, row, v, ptr, base);
    case GC_FT_NUMBER_LIST: return decode_number_list(x, f, v, ptr, base);
    case GC_FT_PAIR_LIST: return gc__api_decode_pairs(&x->d, x->p, f, v, ptr, base);
    case GC_FT_PRESET: return decode_nested(x, f, v, ptr, base);
    case GC_FT_SERIES:
    case GC_FT_SERIES_LIST: return gc__api_decode_series(&x->d, f, v, ptr, base);
    default: return 0;
    }
}

static void unknown_member(dec *x, const char *key, const char *ptr, const char *const *names,
                           size_t n)
{
    char p[GC_API_FIELD_LEN];
    child_ptr(p, ptr, key);
    if (ptr[0] == '\0' && gc_out_is_reserved(key)) {
        gc_decode_error(&x->d, p, "'%s' is an output parameter, not an input field: give it in "
                        "the query string (?%s=...)", key, key);
        return;
    }
    const char *s = gc_decode_suggest(key, names, n);
    if (s) {
        gc_decode_error(&x->d, p, "unknown field '%.60s'; did you mean '%s'?", key, s);
        return;
    }
    char list[GC_API_MESSAGE_LEN];
    gc_decode_name_list(list, sizeof list - 48 - strnlen(key, 60), names, n, 0);
    gc_decode_error(&x->d, p, "unknown field '%.60s'; the fields here are: %s", key,
                    n ? list : "(none)");
}

/* Members of obj (NULL: an absent object, all members absent) against the
 * rows under parent (of one gas variant, or -1); extra: a further allowed
 * name ("model"). Returns the number of errors added. */
static int decode_members(dec *x, int parent, int variant, json_t *obj, const char *ptr,
                          char *base, const char *extra)
{
    int before = x->d.errs->n + x->d.errs->dropped;
    if (obj && !json_is_object(obj)) {
        gc_decode_error(&x->d, ptr, "must be an object, got %s", type_words(obj));
        return 1;
    }
    const char *names[64];
    size_t n = 0;
    for (int r = 1; r < x->p->n_fields && n < 63; r++)
        if (in_scope(&x->p->fields[r], parent, variant))
            names[n++] = x->p->fields[r].name;
    if (extra)
        names[n++] = extra;
    const char *key;
    json_t *val;
    json_object_foreach(obj, key, val) {
        int known = 0;
        for (size_t i = 0; i < n && !known; i++)
            known = strcmp(key, names[i]) == 0;
        if (!known)
            unknown_member(x, key, ptr, names, n);
    }
    for (int r = 1; r < x->p->n_fields; r++) {
        const gc_field *f = &x->p->fields[r];
        if (!in_scope(f, parent, variant))
            continue;
        char p[GC_API_FIELD_LEN];
        child_ptr(p, ptr, f->name);
        decode_row(x, r, obj ? json_object_get(obj, f->name) : NULL, p, base);
    }
    return (x->d.errs->n + x->d.errs->dropped) - before;
}

int gc_api_fields_decode(const gc_preset *p, json_t *root, int from_query, void *input,
                         const char *base, gc_api_errors *errs, gc_decode_ctx *ctx)
{
    dec x = { { errs, NULL, from_query, ctx }, p };
    if (ctx)
        ctx->n = 0;
    int bad = decode_members(&x, 0, -1, root, base ? base : "", input, NULL);
    return bad + gc_decode_ctx_complete(&x.d, p, input);
}

int gc_api_field_settable(const gc_preset *p, int row)
{
    if (row <= 0 || row >= p->n_fields)
        return 0;
    const gc_field *f = &p->fields[row];
    if (f->type != GC_FT_NUMBER && f->type != GC_FT_INTEGER)
        return 0;
    for (int r = f->parent; r > 0; r = p->fields[r].parent)
        if (p->fields[r].type != GC_FT_OBJECT)
            return 0;
    return 1;
}

int gc_api_field_set(const gc_preset *p, int row, json_t *v, int from_query, void *input,
                     const char *base, gc_api_errors *errs, gc_decode_ctx *ctx)
{
    dec x = { { errs, NULL, from_query, ctx }, p };
    char ptr[GC_API_FIELD_LEN];
    gc_api_field_pointer(p, row, NULL, base, ptr, sizeof ptr);
    int before = errs->n + errs->dropped;
    if (ctx)
        ctx->n = 0;
    decode_row(&x, row, v, ptr, input);
    gc_decode_ctx_complete(&x.d, p, input);
    return (errs->n + errs->dropped) - before;
}

/* ---- pointers ------------------------------------------------------------------------------- */

void gc_api_field_pointer(const gc_preset *p, int f, const int idx[2], const char *prefix,
                          char *buf, size_t n)
{
    char path[GC_API_FIELD_LEN];
    gc_preset_field_path(p, f, idx, path, sizeof path);
    snprintf(buf, n, "%s%s", prefix ? prefix : "", path);
}

int gc_api_field_find(const gc_preset *p, const char *pointer, int idx[2])
{
    return gc_preset_field_find(p, pointer, idx);
}

void gc_api_fields_release(const gc_preset *p, void *input)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        const gc_preset *sub = f->type == GC_FT_PRESET ? gc_preset_nested(p, r, input) : NULL;
        if (sub)
            gc_api_fields_release(sub, (char *)input + f->offset);
        if (f->name == NULL || f->parent != 0)
            continue;
        if (f->type == GC_FT_SERIES || f->type == GC_FT_SERIES_LIST) {
            double **x = (double **)(void *)((char *)input + f->offset);
            free(*x);
            *x = NULL;
            continue;
        }
        if (f->type != GC_FT_PAIR_LIST)
            continue;
        double **x = (double **)(void *)((char *)input + f->offset);
        double **y = (double **)(void *)((char *)input + f->aux - 1);
        free(*x);
        free(*y);
        *x = *y = NULL;
    }
}
