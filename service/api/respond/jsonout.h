/*
 * jsonout.h — private to the API layer: a fast JSON encoder for response
 * documents built with jansson. It writes exactly what jansson's json_dumps
 * writes with the flags JSON_COMPACT | JSON_REAL_PRECISION(p) (jansson 2.14
 * built on snprintf, as Debian ships it), with one deliberate difference: a
 * negative zero is written "0.0", as +0 is (json_dumps writes "-0.0"; no
 * response may carry -0). The rest: compact separators, object members
 * in insertion order, strings escaped as jansson does (\" \\ \b \f \n \r \t,
 * other control characters as \u00XX with upper-case hex, everything else
 * including valid UTF-8 passed through), integers in decimal, reals as
 * "%.<p>g" with a leading '+' and leading zeros of the exponent removed and
 * ".0" appended when neither '.' nor 'e' appears.
 *
 * Why: json_dumps formats every real with snprintf (about 0.4 us a number
 * here), which dominates large replies. This encoder formats a real from a
 * scaled integer and falls back to snprintf only where that cannot decide
 * the rounding (values within a couple of units in the last place of a
 * rounding tie, subnormals, magnitudes below about 1e-35 or beyond 1e22 of
 * the printed digits).
 *
 * Errors as json_dumps: NULL for a string that is not valid UTF-8, for
 * nesting deeper than GC_JSON_MAX_DEPTH (json_dumps refuses reference
 * cycles), and when memory runs out. Unlike json_dumps, a scalar at the top
 * level is encoded too (json_dumps needs JSON_ENCODE_ANY for that).
 */
#ifndef GC_API_JSONOUT_H
#define GC_API_JSONOUT_H

#include "gascycle/strbuf.h"

#include <jansson.h>
#include <stddef.h>

#define GC_JSON_MAX_DEPTH 2048     /* nesting levels accepted */
#define GC_JSON_REAL_MAX 40        /* bytes a formatted real needs, NUL included */

/* Encodes v compactly with reals at `precision` significant digits (as
 * JSON_REAL_PRECISION(precision); 0 means 17, like jansson). Returns a
 * malloc'd NUL-terminated string (free() it) and its length in *len (may be
 * NULL), or NULL on error. v is only read (not const because jansson's
 * object iterators take a non-const pointer). */
char *gc_json_dump(json_t *v, int precision, size_t *len);

/* gc_json_dump, with the values at[0..n) (nodes of v) written as the JSON
 * texts text[i] (text_len[i] bytes) instead: documents another writer
 * wrote, placed without being parsed. */
char *gc_json_dump_with(json_t *v, int precision, size_t *len, const json_t *const *at,
                        const char *const *text, const size_t *text_len, int n);

/* Appends a string as a JSON string (quoted, escaped as jansson escapes);
 * invalid UTF-8 sets b->failed. */
void gc_json_put_string(gc_strbuf *b, const char *str, size_t len);

/* Appends a NUL-terminated member key as a JSON string and the ':' after it
 * (the text of gc_json_put_string, then ':'). */
void gc_json_put_key(gc_strbuf *b, const char *key);

/* Appends an integer in decimal. */
void gc_json_put_integer(gc_strbuf *b, long long v);

/* Formats one real as gc_json_dump does into buf (at least GC_JSON_REAL_MAX
 * bytes); returns the length. v must be finite (jansson reals are). */
int gc_json_format_real(char *buf, double v, int precision);

#endif
