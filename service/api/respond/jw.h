/*
 * jw.h — private to the API layer: the streaming JSON writer every response
 * document is written with, straight from the result structs (no tree).
 *
 * Output: compact JSON into a gc_strbuf, reals at 10 significant digits with
 * jansson's formatting (jsonout.h: "%.10g", ".0" appended to a whole number,
 * exponent without '+' or leading zeros; -0 written as 0.0), strings escaped
 * as jansson escapes them.
 *
 * Quantities: gc_jw_q takes an SI value and its quantity (units.h),
 * converts it to the writer's unit system and records the unit under the
 * member's key (first use wins), so the document's "units" object
 * (gc_jw_units) names every unit in the order of first use. A value that is
 * not finite is written null and remembered (gc_jw.nonfinite): the caller
 * then answers 422 "result not finite" instead of the document.
 *
 * Targets: up to GC_JW_MAX_TARGETS RFC 6901 pointers may be set before
 * writing. The writer follows every value's pointer while it writes and
 *  - captures the value at each target (kind, number in the output unit
 *    system, text), the resolver of the composite routes (sweeps, targets):
 *    a document is walked without formatting a single number when the
 *    writer has no buffer;
 *  - with select mode, writes only the value at target 0 (a select=
 *    answer: the subtree as JSON; the caller answers a scalar as text).
 * Keys are borrowed: they must outlive the writer (static table names).
 */
#ifndef GC_API_JW_H
#define GC_API_JW_H

#include "gascycle/strbuf.h"
#include "gascycle/units.h"

#define GC_JW_MAX_DEPTH 24
#define GC_JW_MAX_UNITS 192
#define GC_JW_MAX_TARGETS 32
#define GC_JW_MAX_TOKENS 8
#define GC_JW_TOKEN_LEN 64
#define GC_JW_TEXT_LEN 128
#define GC_JW_SEEN 256           /* direct-mapped cache of keys with a unit (power of 2) */

typedef enum gc_jw_kind {
    GC_JW_NONE = 0, GC_JW_NUMBER, GC_JW_INTEGER, GC_JW_STRING, GC_JW_BOOL, GC_JW_NULL,
    GC_JW_OBJECT, GC_JW_ARRAY
} gc_jw_kind;

typedef struct gc_jw_target {
    char tok[GC_JW_MAX_TOKENS][GC_JW_TOKEN_LEN];  /* reference tokens, unescaped */
    int index[GC_JW_MAX_TOKENS];                  /* a token as an array index, or -1 */
    int ntok;
    int found;                  /* 1 once the value at the pointer was written */
    gc_jw_kind kind;
    double num;                 /* NUMBER (output unit system) / INTEGER / BOOL (0/1) */
    char text[GC_JW_TEXT_LEN];  /* STRING (truncated) */
    const char *key;            /* the member's key, or NULL for an array element */
} gc_jw_target;

typedef struct gc_jw_level {
    unsigned char array;        /* 1: an array */
    unsigned char comma;        /* 1: a member was written */
    int index;                  /* next element's index (arrays) */
    unsigned prefix;            /* targets whose pointer runs through this container */
    unsigned inside;            /* targets this container lies in (at or below the pointer) */
} gc_jw_level;

/* Receives every scalar written inside target 0 (format=csv): rel = the
 * value's depth below the target (1: a member of the target object, 2: a
 * member of an element of the target array), row = that element's index. */
typedef void (*gc_jw_sink)(void *ctx, int rel, int row, const char *key, gc_jw_kind kind,
                           double num, const char *text);

typedef struct gc_jw {
    gc_strbuf *b;               /* output; NULL: nothing is written */
    gc_unit_system sys;
    int depth;                  /* open containers; lv[1..depth] */
    gc_jw_level lv[GC_JW_MAX_DEPTH + 1];
    int n_units;
    const char *unit_key[GC_JW_MAX_UNITS];
    const char *unit_label[GC_JW_MAX_UNITS];
    short unit_slot[512];       /* hash of keys: index + 1 into unit_key, 0 empty */
    const char *unit_seen[GC_JW_SEEN];  /* key pointers whose unit is settled, by
                                           address (first use wins: later calls no-ops) */
    int nonfinite;              /* values refused as NaN/Infinity */
    char nonfinite_at[GC_JW_TOKEN_LEN];
    gc_jw_target *t;            /* targets (borrowed), or NULL */
    int nt;
    int select;                 /* 1: write only the value at t[0] */
    gc_jw_sink sink;            /* scalars inside t[0], or NULL */
    void *sink_ctx;
    int overflow;               /* nesting beyond GC_JW_MAX_DEPTH (a bug: fails the write) */
    int no_units;               /* 1: record no units (a later pass records them) */
    int quiet;                  /* 1 (no buffer): only targets and non-finite values matter:
                                   no units recorded, values off every target's path skipped */
    unsigned include;           /* a preset's optional parts the document holds (doc.h:
                                   gc_api_docopts.include), read by its output rows */
} gc_jw;

/* Starts a writer into b (NULL: write nothing) in unit system sys. */
void gc_jw_init(gc_jw *w, gc_strbuf *b, gc_unit_system sys);

/* Parses an RFC 6901 pointer into t; 0, or -1 when it is not one (or too deep). */
int gc_jw_target_parse(gc_jw_target *t, const char *pointer);
/* Follows targets t[0..n) while writing; select: write only t[0]'s value. */
void gc_jw_targets(gc_jw *w, gc_jw_target *t, int n, int select);

/* Members (key != NULL inside an object) and elements (key NULL in arrays and
 * for the document itself). */
void gc_jw_object(gc_jw *w, const char *key);
void gc_jw_array(gc_jw *w, const char *key);
void gc_jw_end(gc_jw *w);
/* si converted for q; the unit recorded under key (key NULL: none). */
void gc_jw_q(gc_jw *w, const char *key, double si, gc_quantity q);
/* A plain number (no unit). */
void gc_jw_num(gc_jw *w, const char *key, double v);
/* A number with a fixed unit label recorded under key. */
void gc_jw_num_unit(gc_jw *w, const char *key, double v, const char *label);
void gc_jw_int(gc_jw *w, const char *key, long long v);
void gc_jw_bool(gc_jw *w, const char *key, int v);
void gc_jw_str(gc_jw *w, const char *key, const char *s);
void gc_jw_null(gc_jw *w, const char *key);
/* Records key's unit label without writing a value (first use wins). */
void gc_jw_unit(gc_jw *w, const char *key, const char *label);
/* The label recorded for key, or NULL. */
const char *gc_jw_unit_of(const gc_jw *w, const char *key);
/* The object of recorded units under key. */
void gc_jw_units(gc_jw *w, const char *key);
/* JSON text written as a member or element as it is (a body another route
 * wrote, in a batch). */
void gc_jw_raw(gc_jw *w, const char *key, const char *json, size_t len);

/* 1 when the value at the current position would be written (the caller may
 * skip building an expensive member). */
int gc_jw_wants(const gc_jw *w);

#endif
