/*
 * query.h — private to the HTTP layer: the request target (RFC 9112 §3.2)
 * as the client sent it, split into the path and the query parameters and
 * percent-decoded by our own code, so every limit and every refusal is
 * ours and none is silent.
 *
 * Rules: origin-form "/path?query" (absolute-form "http://host/path?query"
 * is reduced to its path and query, RFC 9112 §3.2.2; "*" stays "*"). The
 * query is split at '&' (empty parts skipped), each part at its first '='
 * (a key without '=' gets ""); "%HH" decodes to a byte and '+' to a space in
 * keys and values (HTML forms and spreadsheet web queries send both), '+'
 * is literal in the path; a '%' not followed by two hex digits stays as
 * written. Refused: a target longer than max_len bytes, more than max_params
 * parameters, and "%00" anywhere (a NUL would cut the text short: "10%00junk"
 * must not read as 10). Pure functions: no libmicrohttpd, no globals.
 */
#ifndef GC_HTTP_QUERY_H
#define GC_HTTP_QUERY_H

#include "api/api.h"

#include <stddef.h>

enum gc_target_problem {
    GC_TARGET_OK = 0,
    GC_TARGET_TOO_LONG,        /* more than max_len bytes */
    GC_TARGET_TOO_MANY_PARAMS, /* more than max_params parameters */
    GC_TARGET_NUL_IN_PATH,     /* "%00" in the path */
    GC_TARGET_NUL_IN_QUERY,    /* "%00" in a key or value; bad_key names it */
    GC_TARGET_NO_MEMORY
};

#define GC_TARGET_KEY_SHOWN 64   /* bytes of bad_key kept (with NUL) */

typedef struct gc_http_target {
    char *path;                /* decoded path (inside buf) */
    size_t path_len;
    char *scratch;             /* path_len + 1 bytes for the router's path parameters */
    gc_api_param *params;      /* decoded keys and values (inside buf), arrival order */
    size_t n_params;
    size_t raw_len;            /* bytes of the target as sent */
    size_t counted;            /* parameters counted (also past max_params) */
    enum gc_target_problem problem;
    char bad_key[GC_TARGET_KEY_SHOWN]; /* GC_TARGET_NUL_IN_QUERY: the key, NULs shown as "%00" */
    char *buf;                 /* owned */
} gc_http_target;

/* Parses raw (raw_len bytes, need not be NUL-terminated) into t. Always
 * returns with t usable: on a problem t->problem says which and t->path is
 * still set (possibly "" or cut at the limit) for logs. Free with
 * gc_http_target_free. */
void gc_http_target_parse(const char *raw, size_t raw_len, size_t max_len, size_t max_params,
                          gc_http_target *t);
void gc_http_target_free(gc_http_target *t);

/* The JSON pointer of a dotted query key ("site.altitude" -> "/site/altitude",
 * '~' and '/' escaped per RFC 6901), cut to fit len bytes. */
void gc_http_key_pointer(const char *key, char *out, size_t len);

#endif
