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
 */
#include "api/request/fields.h"

#include <ctype.h>
#include <errno.h>
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

/* One value: a JSON number, or (query) a plain decimal number. 0 or -1. */
static int plain_value(gc_decoder *d, const gc_field *f, json_t *v, const char *ptr, double *x)
{
    if (json_is_number(v)) {
        *x = json_number_value(v);
    } else if (json_is_string(v) && d->from_query) {
        const char *s = json_string_value(v);
        char *end = NULL;
        while (isspace((unsigned char)*s))
            s++;
        errno = 0;
        *x = strtod(s, &end);
        while (end && isspace((unsigned char)*end))
            end++;
        if (!*s || !end || *end || errno == ERANGE || strpbrk(s, "xXnNiI")) {
            gc_decode_error(d, ptr, "must be a plain number, got '%.40s'", s);
            return -1;
        }
    } else {
        gc_decode_error(d, ptr, "must be a plain number (%s)", f->items ? f->items : "no unit");
        return -1;
    }
    if (!isfinite(*x)) {
        gc_decode_error(d, ptr, "must be a finite number");
        return -1;
    }
    gc_error e;
    gc_error_clear(&e);
    if (gc_field_check_value(f, *x, &e) != GC_OK) {
        gc_decode_error(d, ptr, "%s", e.message);
        return -1;
    }
    return 0;
}

/* The values of one series (an array) into x[0..n); series: its index in a
 * list, or -1. Returns the number of bad values. */
static int fill(gc_decoder *d, const gc_field *f, json_t *arr, const char *ptr, long series,
                double *x)
{
    int bad = 0;
    size_t n = json_array_size(arr);
    for (size_t i = 0; i < n && bad < MAX_VALUE_ERRORS; i++) {
        char p[GC_API_FIELD_LEN];
        if (series >= 0)
            elem_ptr(p, ptr, series, (long)i);
        else
            elem_ptr(p, ptr, (long)i, -1);
        bad += plain_value(d, f, json_array_get(arr, i), p, &x[i]) != 0;
    }
    return bad;
}

static int decode_one(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                      char *base)
{
    json_t *owned;
    json_t *arr = gc_decode_list(d, value, &owned);
    size_t n = json_array_size(arr);
    if (!json_is_array(arr) || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        gc_decode_error(d, ptr, "must be an array of %d to %d %s (GET: one comma list)",
                        f->min_items, f->max_items, f->items ? f->items : "plain numbers");
        json_decref(owned);
        return -1;
    }
    double *x = malloc(n * sizeof *x);
    int rc = 0;
    if (!x) {
        gc_decode_error(d, ptr, "is too large for the memory available");
        rc = -1;
    } else if (fill(d, f, arr, ptr, -1, x) > 0) {
        rc = -1;
    }
    json_decref(owned);
    if (rc != 0) {
        free(x);
        return rc;
    }
    *(double **)(void *)(base + f->offset) = x;
    *(int *)(void *)(base + f->count - 1) = (int)n;
    return 0;
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

/* The common length of the series (each an array; a query's comma lists
 * split in place into *lists), or -1 with the errors added. */
static long common_length(gc_decoder *d, const gc_field *f, json_t *list, const char *ptr,
                          json_t **split)
{
    long len = -1;
    int bad = 0;
    for (size_t i = 0; i < json_array_size(list) && bad < MAX_VALUE_ERRORS; i++) {
        char p[GC_API_FIELD_LEN];
        elem_ptr(p, ptr, (long)i, -1);
        json_t *owned;
        json_t *s = gc_decode_list(d, json_array_get(list, i), &owned);
        if (owned)
            json_array_set_new(*split, i, owned);
        size_t n = json_array_size(s);
        if (!json_is_array(s) || n < (size_t)f->min_values || n > (size_t)f->max_values) {
            gc_decode_error(d, p, "must be an array of %d to %d %s", f->min_values,
                            f->max_values, f->items ? f->items : "plain numbers");
            bad++;
        } else if (len < 0) {
            len = (long)n;
        } else if ((long)n != len) {
            gc_decode_error(d, p, "holds %zu values, the first series %ld: every series must "
                            "hold the same number", n, len);
            bad++;
        }
    }
    return bad ? -1 : len;
}

static int decode_list(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                       char *base)
{
    json_t *owned = NULL;
    json_t *list = series_of(d, f, value, ptr, &owned);
    size_t n = json_array_size(list);
    if (!json_is_array(list) || n < (size_t)f->min_items || n > (size_t)f->max_items) {
        if (list)
            gc_decode_error(d, ptr, "must be an array of %d to %d series of %s (GET: %s.0, "
                            "%s.1, ... each one comma list)", f->min_items, f->max_items,
                            f->items ? f->items : "plain numbers", f->name, f->name);
        json_decref(owned);
        return -1;
    }
    /* the series as arrays, a query's comma lists split (owned by split) */
    json_t *split = json_copy(list);
    long len = split ? common_length(d, f, list, ptr, &split) : -1;
    double *x = NULL;
    int bad = len < 0;
    if (!bad && (size_t)len > SIZE_MAX / sizeof *x / n)
        bad = 1;
    if (!bad && !(x = malloc(n * (size_t)len * sizeof *x))) {
        gc_decode_error(d, ptr, "is too large for the memory available");
        bad = 1;
    }
    for (size_t i = 0; !bad && i < n; i++)
        bad = fill(d, f, json_array_get(split, i), ptr, (long)i, x + i * (size_t)len) > 0;
    json_decref(split);
    json_decref(owned);
    if (bad) {
        free(x);
        return -1;
    }
    *(double **)(void *)(base + f->offset) = x;
    *(int *)(void *)(base + f->count - 1) = (int)n;
    *(int *)(void *)(base + f->aux - 1) = (int)len;
    return 0;
}

int gc__api_decode_series(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                          char *base);

int gc__api_decode_series(gc_decoder *d, const gc_field *f, json_t *value, const char *ptr,
                          char *base)
{
    if (f->given)
        *(int *)(void *)(base + f->given - 1) = 1;
    return f->type == GC_FT_SERIES_LIST ? decode_list(d, f, value, ptr, base)
                                        : decode_one(d, f, value, ptr, base);
}
