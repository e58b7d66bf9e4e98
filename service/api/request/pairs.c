/*
 * pairs.c — decoding of a GC_FT_PAIR_LIST row (preset.h): an array of
 * [x, y] pairs of plain numbers (a GET gives one comma list of alternating
 * values), stored in two arrays the decoder allocates (released by the
 * preset's release hook). The row's names give the words of its messages:
 * { x words, short x word, y word }; its `items` the hint on plain numbers.
 * Two pair rows may share storage (trace or pv_trace): the second one given
 * is refused.
 */
#include "api/request/fields.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int plain_number(gc_decoder *d, const gc_field *f, json_t *v, const char *ptr, double *x)
{
    if (json_is_number(v)) {
        *x = json_number_value(v);
    } else if (json_is_string(v) && d->from_query) {
        const char *s = json_string_value(v);
        if (gc_decode_plain_text(&s, x) != 0) {
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
    return 0;
}

/* The other pair row sharing f's storage that was given already, or NULL. */
static const gc_field *sibling(const gc_preset *p, const gc_field *f, const char *base)
{
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *g = &p->fields[r];
        if (g != f && g->type == GC_FT_PAIR_LIST && g->offset == f->offset && g->given &&
            *(const int *)(const void *)(base + g->given - 1))
            return g;
    }
    return NULL;
}

static void elem_ptr(char *out, const char *ptr, size_t i, int j)
{
    char num[32];
    if (j >= 0)
        snprintf(num, sizeof num, "%zu/%d", i, j);
    else
        snprintf(num, sizeof num, "%zu", i);
    snprintf(out, GC_API_FIELD_LEN, "%.90s/%s", ptr, num);
}

static int one_pair(gc_decoder *d, const gc_field *f, json_t *a, json_t *b, const char *ptr,
                    size_t i, double *x, double *y)
{
    char p[GC_API_FIELD_LEN];
    int bad = 0;
    elem_ptr(p, ptr, i, 0);
    bad += plain_number(d, f, a, p, x) != 0;
    elem_ptr(p, ptr, i, 1);
    bad += plain_number(d, f, b, p, y) != 0;
    return bad;
}

static int samples_of(gc_decoder *d, const gc_field *f, json_t *arr, int flat, const char *ptr,
                      size_t *samples)
{
    size_t n = json_array_size(arr);
    *samples = flat ? n / 2 : n;
    if (flat && n % 2) {
        gc_decode_error(d, ptr, "holds %zu values; the comma list alternates %s and %s, so it "
                        "needs an even count", n, f->names[1], f->names[2]);
        return -1;
    }
    if (*samples < (size_t)f->min_items || *samples > (size_t)f->max_items) {
        gc_decode_error(d, ptr, "must hold %d to %d samples over one cycle, got %zu",
                        f->min_items, f->max_items, *samples);
        return -1;
    }
    return 0;
}

static int fill(gc_decoder *d, const gc_field *f, json_t *arr, int flat, const char *ptr,
                size_t samples, double *x, double *y)
{
    int bad = 0;
    for (size_t i = 0; i < samples && bad < 5; i++) {
        json_t *a, *b;
        if (flat) {
            a = json_array_get(arr, 2 * i);
            b = json_array_get(arr, 2 * i + 1);
        } else {
            json_t *pair = json_array_get(arr, i);
            if (!json_is_array(pair) || json_array_size(pair) != 2) {
                char p[GC_API_FIELD_LEN];
                elem_ptr(p, ptr, i, -1);
                gc_decode_error(d, p, "must be a pair [%s, %s]", f->names[0], f->names[2]);
                bad++;
                continue;
            }
            a = json_array_get(pair, 0);
            b = json_array_get(pair, 1);
        }
        bad += one_pair(d, f, a, b, ptr, i, &x[i], &y[i]);
    }
    return bad ? -1 : 0;
}

int gc__api_decode_pairs(gc_decoder *d, const gc_preset *p, const gc_field *f, json_t *value,
                         const char *ptr, char *base);

int gc__api_decode_pairs(gc_decoder *d, const gc_preset *p, const gc_field *f, json_t *value,
                         const char *ptr, char *base)
{
    double **xs = (double **)(void *)(base + f->offset);
    double **ys = (double **)(void *)(base + f->aux - 1);
    const gc_field *g = sibling(p, f, base);
    if (g) {
        gc_decode_error(d, ptr, "give either %s (%s, %s) or %s (%s, %s), not both", g->name,
                        g->names[0], g->names[2], f->name, f->names[0], f->names[2]);
        return -1;
    }
    if (f->given)
        *(int *)(void *)(base + f->given - 1) = 1;
    json_t *owned;
    json_t *arr = gc_decode_list(d, value, &owned);
    if (!json_is_array(arr)) {
        gc_decode_error(d, ptr, "must be an array of [%s, %s] pairs (GET: one comma list of "
                        "alternating values)", f->names[0], f->names[2]);
        return -1;
    }
    size_t samples = 0;
    int rc = samples_of(d, f, arr, owned != NULL, ptr, &samples);
    if (rc == 0) {
        *xs = malloc(samples * sizeof **xs);
        *ys = malloc(samples * sizeof **ys);
        if (!*xs || !*ys) {
            gc_decode_error(d, ptr, "is too large for the memory available");
            rc = -1;
        }
    }
    if (rc == 0)
        rc = fill(d, f, arr, owned != NULL, ptr, samples, *xs, *ys);
    if (rc == 0)
        *(int *)(void *)(base + f->count - 1) = (int)samples;
    json_decref(owned);
    return rc;
}
