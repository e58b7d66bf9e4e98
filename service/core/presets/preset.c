/*
 * preset.c — what every preset descriptor shares (preset.h): the report of
 * warnings and errors, defaults and bounds read from a field table, field
 * paths for messages, and the descriptor-level evaluation (table bounds,
 * then the preset's own evaluate).
 *
 * Field tables are flat arrays; a row's parent is a lower row (an object,
 * list, gas or fuel row), so every walk here is a loop over the table. Lists
 * nest at most one level (a list of objects, or a list of numbers or pairs).
 *
 * Units: SI base units in the tables; messages give a bound in the
 * quantity's default unit (units.h), as the decoder does.
 */
#include "gascycle/preset.h"
#include "gascycle/combustion.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- report -------------------------------------------------------------------- */

void gc_report_init(gc_report *r)
{
    r->input = 0;
    r->n_warnings = 0;
    r->dropped_warnings = 0;
    r->n_errors = 0;
    r->skip_validity = 0;
}

void gc_report_warn(gc_report *r, const char *code, int field, int index, const char *fmt, ...)
{
    if (r == NULL)
        return;
    if (r->n_warnings >= GC_REPORT_MAX_WARNINGS) {
        r->dropped_warnings++;
        return;
    }
    gc_warning *w = &r->warnings[r->n_warnings++];
    w->code = code;
    w->field = field;
    w->index[0] = index;
    w->index[1] = -1;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(w->message, sizeof w->message, fmt, ap);
    va_end(ap);
}

int gc_report_add(gc_report *r, const gc_error *err)
{
    if (r != NULL && r->n_errors < GC_REPORT_MAX_ERRORS)
        r->errors[r->n_errors++] = *err;
    return err->code;
}

int gc_report_error(gc_report *r, int code, int field, int index, const char *fmt, ...)
{
    gc_error e;
    gc_error_clear(&e);
    e.code = code;
    e.field_id = field;
    e.index[0] = index;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(e.message, sizeof e.message, fmt, ap);
    va_end(ap);
    return gc_report_add(r, &e);
}

int gc_error_at(gc_error *err, int code, int field, int index)
{
    if (err != NULL) {
        err->code = code;
        err->field_id = field;
        err->index[0] = index;
        err->index[1] = -1;
        err->field[0] = '\0';
    }
    return code;
}

int gc_error_id(gc_error *err, int code, int field, int index, const char *fmt, ...)
{
    if (err == NULL)
        return code;
    gc_error_clear(err);
    err->code = code;
    err->field_id = field;
    err->index[0] = index;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(err->message, sizeof err->message, fmt, ap);
    va_end(ap);
    return code;
}

/* ---- table walks ------------------------------------------------------------------ */

static int is_list(gc_field_type t)
{
    return t == GC_FT_LIST || t == GC_FT_NUMBER_LIST || t == GC_FT_PAIR_LIST ||
           t == GC_FT_SERIES || t == GC_FT_SERIES_LIST;
}

int gc_preset_list_of(const gc_preset *p, int field)
{
    for (int r = field; r > 0; r = p->fields[r].parent)
        if (is_list(p->fields[r].type))
            return r;
    return -1;
}

int gc_preset_child(const gc_preset *p, int parent, const char *name)
{
    for (int r = 1; r < p->n_fields; r++)
        if (p->fields[r].name && p->fields[r].parent == parent &&
            strcmp(p->fields[r].name, name) == 0)
            return r;
    return -1;
}

static void append(char *buf, size_t n, const char *fmt, ...) __attribute__((format(printf, 3, 4)));
static void append(char *buf, size_t n, const char *fmt, ...)
{
    size_t used = strlen(buf);
    if (used + 1 >= n)
        return;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(buf + used, n - used, fmt, ap);
    va_end(ap);
}

char *gc_preset_field_path(const gc_preset *p, int field, const int index[2], char *buf,
                           size_t n)
{
    int chain[16], depth = 0;
    buf[0] = '\0';
    if (p == NULL || field <= 0 || field >= p->n_fields)
        return buf;
    for (int r = field; r > 0 && depth < 16; r = p->fields[r].parent)
        chain[depth++] = r;
    int k = 0;   /* list indices used */
    for (int d = depth - 1; d >= 0; d--) {
        const gc_field *f = &p->fields[chain[d]];
        append(buf, n, "/%s", f->name ? f->name : "");
        if (!is_list(f->type) || index == NULL)
            continue;
        if (k < 2 && index[k] >= 0)
            append(buf, n, "/%d", index[k]);
        else
            break;
        k++;
        if ((f->type == GC_FT_PAIR_LIST || f->type == GC_FT_SERIES_LIST) && d == 0 &&
            index[1] >= 0)
            append(buf, n, "/%d", index[1]);
    }
    return buf;
}

int gc_preset_name_error(const gc_preset *p, gc_error *err)
{
    if (err == NULL)
        return GC_OK;
    if (err->field_id > 0)
        gc_preset_field_path(p, err->field_id, err->index, err->field, sizeof err->field);
    return err->code;
}

void *gc_preset_member(const gc_preset *p, int field, const int index[2], void *input)
{
    char *base = input;
    int list = gc_preset_list_of(p, field);
    if (list >= 0 && list != field && p->fields[list].type == GC_FT_LIST)
        base += p->fields[list].offset + (size_t)(index ? index[0] : 0) * p->fields[list].item_size;
    return base + p->fields[field].offset;
}

/* ---- defaults ----------------------------------------------------------------------- */

static void set_default(const gc_field *f, char *base)
{
    char *t = base + f->offset;
    switch (f->type) {
    case GC_FT_NUMBER:
        *(double *)(void *)t = (f->flags & GC_FF_OPTIONAL) && !f->given ? GC_UNSET : f->def;
        break;
    case GC_FT_INTEGER:
    case GC_FT_BOOL:
    case GC_FT_ENUM:
        *(int *)(void *)t = (int)f->def;
        break;
    case GC_FT_STRING:
        snprintf(t, GC_FIELD_STRING_LEN, "%s", f->def_name ? f->def_name : "");
        break;
    case GC_FT_GAS:
        gc_gas_init_air((gc_gas *)(void *)t);
        break;
    case GC_FT_PRESET:
        *(int *)(void *)(base + f->count - 1) = (int)f->def;
        if (f->presets && f->presets[(int)f->def] &&
            f->presets[(int)f->def]->input_size <= f->item_size)
            gc_preset_input_init(f->presets[(int)f->def], t);
        break;
    default:
        break;
    }
}

/* Writes the defaults of every row whose nearest list is `list` (-1: rows
 * outside lists) into base. */
static void defaults_under(const gc_preset *p, int list, char *base)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->name == NULL || f->parent < 0)
            continue;
        int l = gc_preset_list_of(p, f->parent);
        if (l == list && !(f->flags & GC_FF_DERIVED))
            set_default(f, base);
    }
}

void gc_preset_input_init(const gc_preset *p, void *input)
{
    memset(input, 0, p->input_size);
    if (p->init)
        p->init(input);
    defaults_under(p, -1, input);
}

void gc_preset_item_init(const gc_preset *p, int list, void *item)
{
    memset(item, 0, p->fields[list].item_size);
    defaults_under(p, list, item);
}

/* ---- bounds ------------------------------------------------------------------------- */

static void bound_message(const gc_field *f, const char *what, double bound_si, gc_error *err)
{
    int num = f->type == GC_FT_NUMBER || f->type == GC_FT_NUMBER_LIST;
    double b = num ? gc_units_from_si(f->quantity, GC_UNITS_SI, bound_si) : bound_si;
    const char *label = num ? gc_units_label(f->quantity, GC_UNITS_SI) : "-";
    if (strcmp(label, "-") == 0)
        gc_error_set(err, GC_ERR_INVALID, NULL, "must be %s %.10g", what, b);
    else
        gc_error_set(err, GC_ERR_INVALID, NULL, "must be %s %.10g %s", what, b, label);
}

/* "must be greater than 0 and at most 1" (GC_FF_BOTH_BOUNDS). */
static int both_bounds(const gc_field *f, gc_error *err)
{
    int num = f->type == GC_FT_NUMBER || f->type == GC_FT_NUMBER_LIST;
    double lo = num ? gc_units_from_si(f->quantity, GC_UNITS_SI, f->min) : f->min;
    double hi = num ? gc_units_from_si(f->quantity, GC_UNITS_SI, f->max) : f->max;
    const char *label = num ? gc_units_label(f->quantity, GC_UNITS_SI) : "-";
    int plain = strcmp(label, "-") == 0;
    return gc_error_set(err, GC_ERR_INVALID, NULL, "must be %s %.10g and %s %.10g%s%s",
                        (f->flags & GC_FF_MIN_EXCL) ? "greater than" : "at least", lo,
                        (f->flags & GC_FF_MAX_EXCL) ? "less than" : "at most", hi,
                        plain ? "" : " ", plain ? "" : label);
}

int gc_field_check_value(const gc_field *f, double v, gc_error *err)
{
    if (!isfinite(v))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "must be a finite number");
    if ((f->flags & GC_FF_BOTH_BOUNDS) && (f->flags & GC_FF_MIN) && (f->flags & GC_FF_MAX)) {
        int lo_ok = (f->flags & GC_FF_MIN_EXCL) ? v > f->min : v >= f->min;
        int hi_ok = (f->flags & GC_FF_MAX_EXCL) ? v < f->max : v <= f->max;
        if (!lo_ok || !hi_ok)
            return both_bounds(f, err);
    }
    if (f->flags & GC_FF_MIN) {
        int excl = (f->flags & GC_FF_MIN_EXCL) != 0;
        if (excl ? !(v > f->min) : !(v >= f->min)) {
            bound_message(f, excl ? "greater than" : "at least", f->min, err);
            return GC_ERR_INVALID;
        }
    }
    if (f->flags & GC_FF_MAX) {
        int excl = (f->flags & GC_FF_MAX_EXCL) != 0;
        if (excl ? !(v < f->max) : !(v <= f->max)) {
            bound_message(f, excl ? "less than" : "at most", f->max, err);
            return GC_ERR_INVALID;
        }
    }
    if ((f->flags & GC_FF_MIN_OR_MAX) && v != f->min && v != f->max)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "must be %.10g or %.10g", f->min, f->max);
    return GC_OK;
}

/* Whether a member counts as given: a number holding GC_UNSET never (an
 * in-process caller leaves a member to its preset's own default that way);
 * a row with a `given` flag when the flag is set or (an in-process caller
 * that sets the member alone) when the number differs from the default. */
static int row_given(const gc_field *f, const char *base)
{
    double v = f->type == GC_FT_NUMBER ? *(const double *)(const void *)(base + f->offset) : 0.0;
    if (f->type == GC_FT_NUMBER && v < -1.0e299)   /* GC_UNSET (NaN is given: refused) */
        return 0;
    if (f->given)
        return *(const int *)(const void *)(base + f->given - 1) != 0 ||
               (f->type == GC_FT_NUMBER && v != f->def);
    return 1;
}

static int check_one(const gc_field *f, int id, int index, double v, gc_report *rep)
{
    gc_error e;
    gc_error_clear(&e);
    if (gc_field_check_value(f, v, &e) == GC_OK)
        return 0;
    e.field_id = id;
    e.index[0] = index;
    gc_report_add(rep, &e);
    return 1;
}

/* An enum member of an in-process caller: one of the names' indices. */
static int check_enum(const gc_field *f, int id, int index, int v, gc_report *rep)
{
    int n = 0;
    while (f->names[n])
        n++;
    if (v >= 0 && v < n)
        return 0;
    char list[256] = "";
    for (int i = 0; i < n; i++) {
        size_t used = strlen(list);
        snprintf(list + used, sizeof list - used, "%s'%s'", i ? ", " : "", f->names[i]);
    }
    gc_error e;
    gc_error_clear(&e);
    gc_error_set(&e, GC_ERR_INVALID, NULL, "must be one of %s", list);
    e.field_id = id;
    e.index[0] = index;
    gc_report_add(rep, &e);
    return 1;
}

static int gas_variant(const gc_field *gas_row, const char *base)
{
    const gc_gas *g = (const gc_gas *)(const void *)(base + gas_row->offset);
    if (g->kind != GC_GAS_COLD || gas_row->names == NULL)
        return 0;
    for (int i = 0; gas_row->names[i]; i++)
        if (strcmp(gas_row->names[i], "cold") == 0)
            return i;
    return 0;
}

/* ---- nested presets (GC_FT_PRESET) ---------------------------------------------------- */

const gc_preset *gc_preset_nested(const gc_preset *p, int row, const void *input)
{
    if (p == NULL || row <= 0 || row >= p->n_fields || p->fields[row].type != GC_FT_PRESET)
        return NULL;
    const gc_field *f = &p->fields[row];
    int idx = *(const int *)(const void *)((const char *)input + f->count - 1);
    for (int i = 0; f->presets && f->presets[i]; i++)
        if (i == idx)
            return f->presets[i]->input_size <= f->item_size ? f->presets[i] : NULL;
    return NULL;
}

void gc_report_nested(gc_report *rep, const gc_preset *p, int row, const gc_preset *sub,
                      const gc_report *sub_rep)
{
    char base[GC_ERROR_FIELD_LEN], path[GC_ERROR_FIELD_LEN];
    gc_preset_field_path(p, row, NULL, base, sizeof base);
    for (int i = 0; i < sub_rep->n_errors; i++) {
        gc_error e = sub_rep->errors[i];
        if (e.field_id > 0)
            gc_preset_field_path(sub, e.field_id, e.index, path, sizeof path);
        else
            snprintf(path, sizeof path, "%s", e.field);
        snprintf(e.field, sizeof e.field, "%.24s/inputs%.60s", base, path);
        e.field_id = 0;
        e.index[0] = e.index[1] = -1;
        gc_report_add(rep, &e);
    }
    for (int i = 0; i < sub_rep->n_warnings; i++) {
        const gc_warning *w = &sub_rep->warnings[i];
        path[0] = '\0';
        if (w->field >= 0)
            gc_preset_field_path(sub, w->field, w->index, path, sizeof path);
        gc_report_warn(rep, w->code, row, -1, "%.24s%s%.60s: %.400s", base + 1,
                       path[0] ? "/inputs" : "", path, w->message);
    }
    rep->dropped_warnings += sub_rep->dropped_warnings;
    if (sub_rep->input)
        rep->input = 1;
}

/* The table checks of a nested preset's input, its errors by path. */
static int validate_nested(const gc_preset *p, int row, const char *base, gc_report *rep)
{
    const gc_field *f = &p->fields[row];
    const gc_preset *sub = gc_preset_nested(p, row, base);
    if (sub == NULL) {
        gc_error e;
        gc_error_clear(&e);
        gc_error_set(&e, GC_ERR_INVALID, NULL, "names no preset it may take");
        e.field_id = row;
        gc_report_add(rep, &e);
        return 1;
    }
    static _Thread_local gc_report inner;
    gc_report_init(&inner);
    gc_preset_validate(sub, base + f->offset, &inner);
    inner.n_warnings = 0;
    gc_report_nested(rep, p, row, sub, &inner);
    return inner.n_errors;
}

/* Checks the rows whose nearest list is `list` in base (index: the item). */
static int validate_under(const gc_preset *p, int list, int index, const char *base,
                          gc_report *rep)
{
    int bad = 0;
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->name == NULL || (f->flags & GC_FF_DERIVED) ||
            gc_preset_list_of(p, f->parent) != list)
            continue;
        const gc_field *up = f->parent > 0 ? &p->fields[f->parent] : NULL;
        if (up && up->type == GC_FT_GAS && gas_variant(up, base) != f->variant)
            continue;
        if ((f->type == GC_FT_NUMBER || f->type == GC_FT_INTEGER) && row_given(f, base)) {
            double v = f->type == GC_FT_NUMBER ? *(const double *)(const void *)(base + f->offset)
                                               : *(const int *)(const void *)(base + f->offset);
            bad += check_one(f, r, index, v, rep);
        } else if (f->type == GC_FT_ENUM && f->names != NULL) {
            bad += check_enum(f, r, index, *(const int *)(const void *)(base + f->offset), rep);
        } else if (f->type == GC_FT_NUMBER_LIST) {
            int n = *(const int *)(const void *)(base + f->count - 1);
            const double *x = (const double *)(const void *)(base + f->offset);
            for (int i = 0; i < n && i < f->max_items; i++)
                bad += check_one(f, r, i, x[i], rep);
        } else if (f->type == GC_FT_LIST) {
            int n = *(const int *)(const void *)(base + f->count - 1);
            for (int i = 0; i < n && i < f->max_items; i++)
                bad += validate_under(p, r, i, base + f->offset + (size_t)i * f->item_size, rep);
        } else if (f->type == GC_FT_PRESET) {
            bad += validate_nested(p, r, base, rep);
        }
    }
    return bad;
}

int gc_preset_validate(const gc_preset *p, const void *input, gc_report *rep)
{
    int before = rep->n_errors;
    validate_under(p, -1, -1, input, rep);
    return rep->n_errors > before ? rep->errors[before].code : GC_OK;
}

int gc_preset_evaluate(const gc_preset *p, const void *input, void *result, gc_report *rep)
{
    int rc = gc_preset_validate(p, input, rep);
    if (rc != GC_OK)
        return rc;
    return p->evaluate(input, result, rep);
}

/* ---- validity warnings -------------------------------------------------------------- */

static const char *validity_code(const char *code)
{
    static const char *const codes[] = { "real_gas", "real_gas_not_estimated", "dissociation" };
    for (size_t i = 0; i < sizeof codes / sizeof codes[0]; i++)
        if (strcmp(code, codes[i]) == 0)
            return codes[i];
    return "model";
}

void gc_report_validity(gc_report *rep, const gc_validity_scan *s, int field)
{
    gc_validity_note notes[3];
    int n = gc_validity_scan_notes(s, notes, 3);
    for (int i = 0; i < n; i++)
        gc_report_warn(rep, validity_code(notes[i].code), field, -1, "%s", notes[i].message);
}

void gc_report_validity_cycle(gc_report *rep, const gc_cycle_result *r)
{
    if (rep->skip_validity)
        return;
    gc_validity_scan s;
    gc_validity_scan_init(&s);
    gc_validity_scan_run(&s, &r->actual, NULL);
    if (r->has_ideal && !r->ideal_is_actual)
        gc_validity_scan_run(&s, &r->ideal, "ideal ");
    gc_report_validity(rep, &s, -1);
}

/* ---- pointers to ids ---------------------------------------------------------------- */

/* The next reference token of pointer p (after its '/') into tok; the rest,
 * or NULL when malformed or too long. */
static const char *next_token(const char *p, char *tok, size_t n)
{
    size_t k = 0;
    for (p++; *p && *p != '/'; p++) {
        char c = *p;
        if (c == '~') {
            if (p[1] != '0' && p[1] != '1')
                return NULL;
            c = *++p == '0' ? '~' : '/';
        }
        if (k + 1 >= n)
            return NULL;
        tok[k++] = c;
    }
    tok[k] = '\0';
    return p;
}

/* A canonical array index ("0", "12"), or -1. */
static int token_index(const char *tok)
{
    size_t n = strlen(tok);
    if (n == 0 || n > 6 || strspn(tok, "0123456789") != n || (tok[0] == '0' && n > 1))
        return -1;
    return atoi(tok);
}

/* The rest of a pointer into a pair list: "", "/<sample>" or
 * "/<sample>/<0|1>" (a series list: "/<series>/<value>", last_max 0: any
 * index); 0, or -1 when it is something else. */
static int pair_tail(const char *s, int idx[2], int last_max)
{
    char tok[16];
    for (int k = 0; k < 2 && *s; k++) {
        s = next_token(s, tok, sizeof tok);
        idx[k] = s ? token_index(tok) : -1;
        if (idx[k] < 0 || (k == 1 && last_max > 0 && idx[k] > last_max))
            return -1;
    }
    return *s == '\0' ? 0 : -1;
}

int gc_preset_field_find(const gc_preset *p, const char *pointer, int idx[2])
{
    char tok[GC_FIELD_STRING_LEN];
    int row = 0, k = 0;
    idx[0] = idx[1] = -1;
    if (pointer == NULL || pointer[0] != '/')
        return -1;
    for (const char *s = pointer; s && *s;) {
        s = next_token(s, tok, sizeof tok);
        if (s == NULL)
            return -1;
        int r = gc_preset_child(p, row, tok);
        if (r < 0 || (p->fields[r].flags & GC_FF_DERIVED))
            return -1;
        row = r;
        gc_field_type ty = p->fields[r].type;
        if (ty == GC_FT_PAIR_LIST)   /* the list, a sample, or one of its two numbers */
            return pair_tail(s, idx, 1) == 0 ? r : -1;
        if (ty == GC_FT_SERIES_LIST) /* the list, a series, or one of its values */
            return pair_tail(s, idx, 0) == 0 ? r : -1;
        if (ty == GC_FT_SERIES)      /* the series or one of its values */
            return *s == '\0' || (pair_tail(s, idx, 0) == 0 && idx[1] < 0) ? r : -1;
        if (ty != GC_FT_LIST && ty != GC_FT_NUMBER_LIST)
            continue;
        if (*s == '\0')
            return ty == GC_FT_NUMBER_LIST ? -1 : r;
        s = next_token(s, tok, sizeof tok);
        int ix = s ? token_index(tok) : -1;
        if (ix < 0 || k >= 2)
            return -1;
        idx[k++] = ix;
        if (ty == GC_FT_NUMBER_LIST)
            return *s == '\0' ? r : -1;
    }
    return row > 0 ? row : -1;
}
