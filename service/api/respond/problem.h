/*
 * problem.h — private to the API layer: the list of field errors that request
 * decoding collects, and the RFC 9457 problem-details builders.
 *
 * Problem "type" URIs are our own: "https://gascycled.invalid/problems/<class>"
 * where <class> is the metrics error class ("validation", "malformed",
 * "not_found", ...). The .invalid top-level domain (RFC 2606) can never
 * resolve, which marks the URI as an identifier, not a link; the classes are
 * listed in openapi/openapi.json (components/schemas/Problem).
 *
 * Status convention (see README.md and the OpenAPI document):
 *   400  the request cannot be read: malformed JSON (with line and column),
 *        empty POST body, duplicate keys, nesting deeper than the limit, a body
 *        that is not an object, conflicting query keys, bad output parameters
 *        (format, units, select, table, diagram), a select pointer with no value.
 *   422  the request is readable but its fields are not acceptable: unknown
 *        fields, wrong types, values out of range, NaN/Infinity, wrong units,
 *        missing required fields, and inputs the models cannot evaluate
 *        (outside a validity range, a result that would not be finite).
 */
#ifndef GC_API_PROBLEM_H
#define GC_API_PROBLEM_H

#include "api/api.h"

#define GC_API_MAX_ERRORS 32
#define GC_API_FIELD_LEN 128
#define GC_API_MESSAGE_LEN 256

#define GC_API_PROBLEM_TYPE_BASE "https://gascycled.invalid/problems/"
#define GC_API_CT_PROBLEM "application/problem+json; charset=utf-8"
#define GC_API_CT_JSON "application/json; charset=utf-8"
#define GC_API_CT_CSV "text/csv; charset=utf-8; header=present"
#define GC_API_CT_TEXT "text/plain; charset=utf-8"
#define GC_API_CT_SVG "image/svg+xml; charset=utf-8"

typedef struct gc_api_field_error {
    char field[GC_API_FIELD_LEN];      /* JSON pointer ("/site/altitude"), "" = whole request */
    char message[GC_API_MESSAGE_LEN];  /* one sentence, no trailing period needed */
} gc_api_field_error;

/* Errors collected while decoding one request (on the stack: no heap). */
typedef struct gc_api_errors {
    int n;                                  /* entries used */
    int dropped;                            /* further errors not stored */
    gc_api_field_error e[GC_API_MAX_ERRORS];
} gc_api_errors;

void gc_api_errors_init(gc_api_errors *errs);

/* Appends one error (field may be NULL); printf-style message, truncated. */
void gc_api_errors_add(gc_api_errors *errs, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));

/* Problem with the collected errors[] (and "errors_not_shown" when some were
 * dropped). detail may be NULL: then a sentence counting the errors is used.
 * Returns 0, or -1 when memory ran out (resp->body NULL, status still set). */
int gc_api_problem_errors(gc_api_response *resp, int status, const char *error_class,
                          const char *title, const char *detail,
                          const gc_api_errors *errs);

/* Title of a status code ("Bad Request", "Unprocessable Content" ...). */
const char *gc_api_status_title(int status);

#endif
