/*
 * series_scan.h — private to the API layer: a JSON body's long series read
 * without building a jansson value per number (series_scan.c).
 *
 * A preset's top-level GC_FT_SERIES and GC_FT_SERIES_LIST members (preset.h)
 * hold most of a large recording's body (300 cycles x 1,440 pressures). The
 * scanner finds those members in the body, reads their arrays of plain JSON
 * numbers itself (the exact doubles jansson would give), and hands jansson
 * the rest of the document with each such array replaced by "[]"; the
 * series decoder (series.c) then takes the values the scanner read for that
 * placeholder. Whenever the scanner is not sure (anything but an array of
 * plain numbers, or of such arrays; a number jansson would refuse; a member
 * given twice; a document jansson refuses) the whole body goes to jansson as
 * it is, so every answer and every error stays the one jansson gives.
 */
#ifndef GC_API_SERIES_SCAN_H
#define GC_API_SERIES_SCAN_H

#include "api/api.h"
#include "gascycle/preset.h"

#include <jansson.h>
#include <stddef.h>

#define GC_API_SCAN_MAX 4   /* series members read per body (a preset has one or two) */

/* One member read by the scanner. */
typedef struct gc_api_scanned {
    const gc_field *f;        /* its row (SERIES or SERIES_LIST at the top of the table) */
    json_t *placeholder;      /* its "[]" in the parsed document (borrowed; bound after
                                 parsing), the decoder's key */
    double *x;                /* every value, series after series (owned; NULL once the
                                 decoder took them over) */
    size_t n_values;          /* values in x */
    size_t n_series;          /* SERIES_LIST: series in the list; SERIES: 0 */
    size_t *len;              /* SERIES_LIST: each series' count of values (owned) */
    size_t start, end;        /* the array's bytes in the body: [start, end) */
} gc_api_scanned;

typedef struct gc_api_scan {
    int n;                            /* members read */
    gc_api_scanned m[GC_API_SCAN_MAX];
} gc_api_scan;

/* Reads the JSON number that starts at s (bytes up to e) as jansson would
 * (an integer token through long long, then to double; any other number by
 * strtod, correctly rounded): 0 with *x and *end (just past the number), or
 * -1 when the bytes are not a JSON number jansson accepts (bad spelling, an
 * integer beyond long long, a real beyond the double range) or the number
 * runs to e (it must be followed by a byte of the document). */
int gc_api_scan_number(const char *s, const char *e, double *x, const char **end);

/* Finds p's top-level series members in the JSON body (len bytes) and reads
 * them into scan (which it initialises). Returns the number read (0: none,
 * nothing allocated: decode the body as it is); -1 when out of memory. */
int gc_api_scan_body(const gc_preset *p, const char *body, size_t len, gc_api_scan *scan);

/* The body with every member read replaced by "[]" (malloc'd, *out_len
 * bytes, NUL-terminated), or NULL when out of memory. */
char *gc_api_scan_skeleton(const gc_api_scan *scan, const char *body, size_t len,
                           size_t *out_len);

/* Normalises req as gc_decode_normalise_ex does (same answers, same
 * problems), reading p's series members with the scanner when it can;
 * scan receives what was read, bound to the placeholders of *root (empty
 * when the scanner was not used). Free it with gc_api_scan_free after
 * decoding. 0, or -1 with resp holding the problem. */
int gc_api_scan_normalise(const gc_preset *p, const gc_api_request *req, int diagram,
                          gc_api_scan *scan, json_t **root, gc_api_response *resp);

/* The member read for value v of row f (v must be its placeholder), or NULL.
 * The decoder may take its values over (x then NULL: freed with the input). */
gc_api_scanned *gc_api_scan_find(gc_api_scan *scan, const gc_field *f, const json_t *v);

void gc_api_scan_free(gc_api_scan *scan);

#endif
