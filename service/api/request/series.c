/*
 * series.c — decoding of the GC_FT_SERIES and GC_FT_SERIES_LIST rows
 * (preset.h): long arrays of plain numbers, such as a recording's crank
 * angles and its pressure cycles, stored in arrays the decoder allocates
 * (freed by gc_api_fields_release).
 *
 *   SERIES       [v0, v1, ...]               GET: one comma list
 *   SERIES_LIST  [[v0, v1, ...], [...], ...]  GET: one key per series,
 *                                             numbered from 0 (cycles.0=...,
 *                                             cycles.1=...), or one comma list
 *                                             for a single series
 * A value is a JSON number (a query value: a plain decimal number), finite,
 * within the row's bounds when it has them; every series of a list holds
 * the same number of values. At most MAX_VALUE_ERRORS bad values are named
 * per series (the rest would only repeat the sentence).
 *
 * A JSON body's top-level series may have been read by the scanner
 * (series_scan.h) and stand as "[]" in the parsed document: their values
 * then come from the scanner, through the same checks and sentences. The
 * pointer of a bad value is written only for its error.
 */
#include "api/request/fields.h"
#include "api/request/series_scan.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAX_VALUE_ERRORS 5

static void elem_ptr(char *out, const char *ptr, long i, long j)
{
    char num[48];
    if (j >= 0)
        snprintf(num, sizeof num, "%ld/%ld", i, j);
    else
        snprintf(num, sizeof num, "%ld", i);
    snprintf(out, GC_API_FIELD_LEN, "%.60s/%s", ptr, num);
}

/* The pointer of value i of a series (series: its index in a list, or -1):
 * written only for an error. */
static void value_ptr(char *out, const char *ptr, long series, size_t i)
{
    if (series >= 0)
        elem_ptr(out, ptr, series, (long)i);
    else
        elem_ptr(out, ptr, (long)i, -1);
}

/* A value read: finite and within the row's bounds; 0, or -1 with the
 * error naming value i of the series. */
static int check_value(gc_decoder *d, const gc_field *f, double x, const char *ptr,
                       long series, size_t i)
{
    if (gc_field_check_value(f, x, NULL) == GC_OK)
        return 0;
    char p[GC_API_FIELD_LEN];
    value_ptr(p, ptr, series, i);
    if (!isfinite(x)) {
        gc_decode_error(d, p, "must be a finite number");
        return -1;
    }
    gc_error e;
    gc_error_clear(&e);
    gc_field_check_value(f, x, &e);
    gc_decode_error(d, p, "%s", e.message);
    return -1;
}

/* One value: a JSON number, or (query) a plain decimal number. 0 or -1. */
static int plain_value(gc_decoder *d, const gc_field *f, json_t *v, const char *ptr,
                       long series, size_t i, double *x)
{
    if (json_is_number(v))
        return *x = json_number_value(v), check_value(d, f, *x, ptr, series, i);
    char p[GC_API_FIELD_LEN];
    if (json_is_string(v) && d->from_query) {
        const char *s = json_string_value(v);
        if (gc_decode_plain_text(&s, x) != 0) {
            value_ptr(p, ptr, series, i);
            gc_decode_error(d, p, "must be a plain number, got '%.40s'", s);
            return -1;
        }
        return check_value(d, f, *x, ptr, series, i);
    }
    value_ptr(p, ptr, series, i);
    gc_decode_error(d, p, "must be a plain number (%s)", f->items ? f->items : "no unit");
    return -1;
}

/* One series: a JSON array (json), or n values the scanner read (x). */
typedef struct {
    json_t *json;
    const double *x;
    size_t n;
} source;

static source json_source(json_t *arr)
{
    source s = { arr, NULL, json_array_size(arr) };
    return s;
}

/* The values of one series into x[0..n); series: its index in a list, or
 * -1. Returns the number of bad values. */
static int fill(gc_decoder *d, const gc_field *f, source src, const char *ptr, long series,
                double *x)
{
    int bad = 0;
    if (src.x && src.x != x && src.n)
        memcpy(x, src.x, src.n * sizeof *x);
    for (size_t i = 0; i < src.n && bad < MAX_VALUE_ERRORS; i++) {
        if (src.x)
            bad += check_value(d, f, x[i], ptr, series, i) != 0;
        else
            bad += plain_value(d, f, json_array_get(src.json, i), ptr, series, i, &x[i]) != 0;
    }
    return bad;
}

/* The values of a SERIES into the input (src: an array, or is_array 0). */
static int take_one(gc_decoder *d, const gc_field *f, source src, int is_array,
                    const char *ptr, char *base)
{
    size_t n = src.n;
    if (!is_array || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        gc_decode_error(d, ptr, "must be an array of %d to %d %s (GET: one comma list)",
                        f->min_items, f->max_items, f->items ? f->items : "plain numbers");
        return -1;
    }
    double *x = malloc(n * sizeof *x);
    if (!x) {
        gc_decode_error(d, ptr, "is too large for the memory available");
        return -1;
    }
    if (fill(d, f, src, ptr, -1, x) > 0) {
        free(x);
        return -1;
    }
    *(double **)(void *)(base + f->offset) = x;
    *(int *)(void *)(base + f->count - 1) = (int)n;
    return 0;
}

static int decode_one(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                      char *base, const gc_api_scanned *m)
{
    if (m) {
        source src = { NULL, m->x, m->n_values };
        return take_one(d, f, src, 1, ptr, base);
    }
    json_t *owned;
    json_t *arr = gc_decode_list(d, value, &owned);
    int rc = take_one(d, f, json_source(arr), json_is_array(arr), ptr, base);
    json_decref(owned);
    return rc;
}

/* ---- a list of series -------------------------------------------------------------------- */

/* The series of a list as arrays: a JSON array of arrays as it is; a query's
 * numbered keys or single comma list turned into a new array (*owned). */
static json_t *series_of(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                         json_t **owned)
{
    *owned = NULL;
    if (!d->from_query || json_is_array(value))
        return value;
    json_t *a = json_array();
    if (!a)
        return NULL;
    *owned = a;
    if (json_is_string(value)) {
        json_array_append(a, value);
        return a;
    }
    size_t n = json_object_size(value);
    for (size_t i = 0; i < n; i++) {
        char key[24];
        snprintf(key, sizeof key, "%zu", i);
        json_t *v = json_object_get(value, key);
        if (!v) {
            gc_decode_error(d, ptr, "query keys %s.0, %s.1, ... must be numbered from 0 without "
                            "gaps (%s.%zu is missing)", f->name, f->name, f->name, i);
            return NULL;
        }
        json_array_append(a, v);
    }
    return a;
}

/* Series i (an array when is_array, of n values) against the row's count
 * of values and the first series' length (*len, -1 before the first).
 * Returns 1 with the error added when it does not fit. */
static int check_length(gc_decoder *d, const gc_field *f, const char *ptr, size_t i,
                        int is_array, size_t n, long *len)
{
    char p[GC_API_FIELD_LEN];
    elem_ptr(p, ptr, (long)i, -1);
    if (!is_array || n < (size_t)f->min_values || n > (size_t)f->max_values) {
        gc_decode_error(d, p, "must be an array of %d to %d %s", f->min_values,
                        f->max_values, f->items ? f->items : "plain numbers");
        return 1;
    }
    if (*len < 0) {
        *len = (long)n;
    } else if ((long)n != *len) {
        gc_decode_error(d, p, "holds %zu values, the first series %ld: every series must "
                        "hold the same number", n, *len);
        return 1;
    }
    return 0;
}

/* The common length of the series (each an array; a query's comma lists
 * split in place into *lists), or -1 with the errors added. */
static long common_length(gc_decoder *d, const gc_field *f, json_t *list, const char *ptr,
                          json_t **split)
{
    long len = -1;
    int bad = 0;
    for (size_t i = 0; i < json_array_size(list) && bad < MAX_VALUE_ERRORS; i++) {
        json_t *owned;
        json_t *s = gc_decode_list(d, json_array_get(list, i), &owned);
        if (owned)
            json_array_set_new(*split, i, owned);
        bad += check_length(d, f, ptr, i, json_is_array(s), json_array_size(s), &len);
    }
    return bad ? -1 : len;
}

static void count_error(gc_decoder *d, const gc_field *f, const char *ptr)
{
    gc_decode_error(d, ptr, "must be an array of %d to %d series of %s (GET: %s.0, %s.1, ... "
                    "each one comma list)", f->min_items, f->max_items,
                    f->items ? f->items : "plain numbers", f->name, f->name);
}

/* Series i of a list of series of len values: split's array, or the
 * scanner's values (vals, series after series). */
static source list_item(json_t *split, const double *vals, size_t i, long len)
{
    if (vals) {
        source s = { NULL, vals + i * (size_t)len, (size_t)len };
        return s;
    }
    return json_source(json_array_get(split, i));
}

/* n series of len values (len -1: errors already added) into the input;
 * the scanner's values (m) are taken over where they lie (every series
 * of one length: already the input's layout). */
static int take_list(gc_decoder *d, const gc_field *f, json_t *split, gc_api_scanned *m,
                     size_t n, long len, const char *ptr, char *base)
{
    double *x = NULL;
    const double *vals = m ? m->x : NULL;
    int bad = len < 0;
    if (!bad && (size_t)len > SIZE_MAX / sizeof *x / n)
        bad = 1;
    if (!bad && vals) {
        x = m->x;
        m->x = NULL;
    } else if (!bad && !(x = malloc(n * (size_t)len * sizeof *x))) {
        gc_decode_error(d, ptr, "is too large for the memory available");
        bad = 1;
    }
    for (size_t i = 0; !bad && i < n; i++)
        bad = fill(d, f, list_item(split, vals, i, len), ptr, (long)i, x + i * (size_t)len) > 0;
    if (bad) {
        free(x);
        return -1;
    }
    *(double **)(void *)(base + f->offset) = x;
    *(int *)(void *)(base + f->count - 1) = (int)n;
    *(int *)(void *)(base + f->aux - 1) = (int)len;
    return 0;
}

static int decode_list(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                       char *base)
{
    json_t *owned = NULL;
    json_t *list = series_of(d, f, value, ptr, &owned);
    size_t n = json_array_size(list);
    if (!json_is_array(list) || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        if (list)
            count_error(d, f, ptr);
        json_decref(owned);
        return -1;
    }
    /* the series as arrays, a query's comma lists split (owned by split) */
    json_t *split = json_copy(list);
    long len = split ? common_length(d, f, list, ptr, &split) : -1;
    int rc = take_list(d, f, split, NULL, n, len, ptr, base);
    json_decref(split);
    json_decref(owned);
    return rc;
}

/* A list the scanner read (series_scan.h): the same checks, the same
 * sentences. */
static int decode_list_scanned(gc_decoder *d, const gc_field *f, gc_api_scanned *m,
                               const char *ptr, char *base)
{
    size_t n = m->n_series;
    if (n < (size_t)f->min_items || n > (size_t)f->max_items) {
        count_error(d, f, ptr);
        return -1;
    }
    long len = -1;
    int bad = 0;
    for (size_t i = 0; i < n && bad < MAX_VALUE_ERRORS; i++)
        bad += check_length(d, f, ptr, i, 1, m->len[i], &len);
    return take_list(d, f, NULL, m, n, bad ? -1 : len, ptr, base);
}

int gc__api_decode_series(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                          char *base);

int gc__api_decode_series(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                          char *base)
{
    if (f->given)
        *(int *)(void *)(base + f->given - 1) = 1;
    gc_api_scanned *m = gc_api_scan_find(d->ctx ? d->ctx->scan : NULL, f, value);
    if (f->type == GC_FT_SERIES_LIST)
        return m ? decode_list_scanned(d, f, m, ptr, base) : decode_list(d, f, value, ptr, base);
    return decode_one(d, f, value, ptr, base, m);
}
