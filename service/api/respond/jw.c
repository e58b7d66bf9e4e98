/*
 * jw.c — the streaming JSON writer of jw.h.
 *
 * Path following: every open container keeps two bit sets over the targets,
 * `prefix` (the container's pointer is a proper prefix of the target's) and
 * `inside` (the container is the target's value or lies within it). A new
 * value inherits `inside`; a target still on `prefix` moves on when the
 * value's key (or array index) equals its next reference token, and is hit
 * when that token is its last. So following costs one bit test per value
 * off every target's path, and a token comparison only along the paths.
 */
#include "api/respond/jw.h"
#include "api/respond/jsonout.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gc_jw_init(gc_jw *w, gc_strbuf *b, gc_unit_system sys)
{
    w->b = b;
    w->sys = sys;
    w->depth = 0;
    memset(&w->lv[0], 0, sizeof w->lv[0]);
    w->n_units = 0;
    memset(w->unit_slot, 0, sizeof w->unit_slot);
    memset(w->unit_seen, 0, sizeof w->unit_seen);
    w->nonfinite = 0;
    w->nonfinite_at[0] = '\0';
    w->include = 0u;
    w->t = NULL;
    w->nt = 0;
    w->select = 0;
    w->sink = NULL;
    w->sink_ctx = NULL;
    w->overflow = 0;
    w->no_units = 0;
    w->quiet = 0;
}

/* ---- targets ------------------------------------------------------------------------- */

int gc_jw_target_parse(gc_jw_target *t, const char *pointer)
{
    memset(t, 0, sizeof *t);
    const char *p = pointer;
    if (p == NULL || (*p && *p != '/'))
        return -1;
    while (*p == '/') {
        if (t->ntok >= GC_JW_MAX_TOKENS)
            return -1;
        char *tok = t->tok[t->ntok++];
        size_t n = 0;
        p++;
        while (*p && *p != '/') {
            char c = *p++;
            if (c == '~') {
                if (*p != '0' && *p != '1')
                    return -1;
                c = *p++ == '0' ? '~' : '/';
            }
            if (n + 1 >= GC_JW_TOKEN_LEN)
                return -1;
            tok[n++] = c;
        }
        tok[n] = '\0';
        /* a canonical array index: digits, no leading zero */
        int *ix = &t->index[t->ntok - 1];
        *ix = n > 0 && n < 10 && strspn(tok, "0123456789") == n && (tok[0] != '0' || n == 1)
                  ? atoi(tok) : -1;
    }
    return 0;
}

void gc_jw_targets(gc_jw *w, gc_jw_target *t, int n, int select)
{
    w->t = t;
    w->nt = n < GC_JW_MAX_TARGETS ? n : GC_JW_MAX_TARGETS;
    w->select = select;
    unsigned all = w->nt >= 32 ? ~0u : (1u << w->nt) - 1u;
    w->lv[0].prefix = all;
    w->lv[0].inside = 0;
    for (int i = 0; i < w->nt; i++)
        if (t[i].ntok == 0)
            w->lv[0].inside |= 1u << i;
    w->lv[0].prefix &= ~w->lv[0].inside;
}

/* The target sets of the value about to be written under level p with key
 * (objects) or the level's next index (arrays); new hits in *hit. */
static void follow(gc_jw *w, int p, const char *key, int index, unsigned *prefix,
                   unsigned *inside, unsigned *hit)
{
    const gc_jw_level *up = &w->lv[p];
    *inside = up->inside;
    *prefix = 0;
    *hit = 0;
    if (p == 0) {   /* the document itself: lv[0] holds its sets */
        *inside = up->inside;
        *prefix = up->prefix;
        *hit = up->inside;
        return;
    }
    for (unsigned m = up->prefix; m; m &= m - 1) {
        int i = __builtin_ctz(m);
        const gc_jw_target *t = &w->t[i];
        int match = key ? strcmp(t->tok[p - 1], key) == 0 : t->index[p - 1] == index;
        if (!match)
            continue;
        if (p == t->ntok) {
            *inside |= 1u << i;
            *hit |= 1u << i;
        } else {
            *prefix |= 1u << i;
        }
    }
}

static void record_hit(gc_jw *w, unsigned hit, const char *key, gc_jw_kind kind, double num,
                       const char *text)
{
    for (unsigned m = hit; m; m &= m - 1) {
        gc_jw_target *t = &w->t[__builtin_ctz(m)];
        t->found = 1;
        t->kind = kind;
        t->num = num;
        t->key = key;
        t->text[0] = '\0';
        if (text)
            snprintf(t->text, sizeof t->text, "%s", text);
    }
}

/* ---- the position of a value ---------------------------------------------------------- */

typedef struct pos {
    int emit;                   /* 1: write it */
    unsigned prefix, inside;    /* target sets of the value (for a container) */
} pos;

/* Begins a value: follows the targets, records hits (containers now,
 * scalars by the caller), writes comma and key when emitted. */
static inline __attribute__((always_inline)) pos begin(gc_jw *w, const char *key,
                                                      gc_jw_kind kind, double num,
                                                      const char *text)
{
    pos r = { 0, 0, 0 };
    int p = w->depth;
    gc_jw_level *up = &w->lv[p];
    int index = up->array ? up->index++ : -1;
    if (w->quiet && p > 0 && (up->prefix | up->inside) == 0)
        return r;
    unsigned hit = 0;
    if (w->nt) {
        follow(w, p, up->array ? NULL : key, index, &r.prefix, &r.inside, &hit);
        if (hit)
            record_hit(w, hit, up->array ? NULL : key, kind, num, text);
        if (w->sink && (r.inside & 1u) && kind != GC_JW_OBJECT && kind != GC_JW_ARRAY) {
            int rel = p - w->t[0].ntok;
            int row = rel >= 2 ? w->lv[w->t[0].ntok + 1].index - 1 : 0;
            w->sink(w->sink_ctx, rel, row, up->array ? NULL : key, kind, num, text);
        }
    }
    if (w->b == NULL || w->b->failed)
        return r;
    if (w->select && !(r.inside & 1u))
        return r;
    r.emit = 1;
    /* the selected value itself is written bare: no comma, no key */
    if (w->select && (hit & 1u))
        return r;
    if (p > 0) {
        if (up->comma)
            gc_strbuf_ch(w->b, ',');
        up->comma = 1;
        if (!up->array && key)
            gc_json_put_key(w->b, key);
    }
    return r;
}

static void open_level(gc_jw *w, const char *key, int array)
{
    pos r = begin(w, key, array ? GC_JW_ARRAY : GC_JW_OBJECT, 0.0, NULL);
    if (w->depth >= GC_JW_MAX_DEPTH) {
        w->overflow = 1;
        if (w->b)
            w->b->failed = 1;
        return;
    }
    gc_jw_level *lv = &w->lv[++w->depth];
    lv->array = (unsigned char)array;
    lv->comma = 0;
    lv->index = 0;
    lv->prefix = r.prefix;
    lv->inside = r.inside;
    if (r.emit)
        gc_strbuf_ch(w->b, array ? '[' : '{');
}

void gc_jw_object(gc_jw *w, const char *key)
{
    open_level(w, key, 0);
}

void gc_jw_array(gc_jw *w, const char *key)
{
    open_level(w, key, 1);
}

void gc_jw_end(gc_jw *w)
{
    if (w->depth <= 0)
        return;
    const gc_jw_level *lv = &w->lv[w->depth];
    int emit = w->b && !w->b->failed && (!w->select || (lv->inside & 1u));
    if (emit)
        gc_strbuf_ch(w->b, lv->array ? ']' : '}');
    w->depth--;
}

/* ---- units ------------------------------------------------------------------------------ */

static unsigned hash_key(const char *s)
{
    unsigned h = 2166136261u;
    while (*s)
        h = (h ^ (unsigned char)*s++) * 16777619u;
    return h;
}

static int unit_find(const gc_jw *w, const char *key, unsigned *slot)
{
    unsigned n = sizeof w->unit_slot / sizeof w->unit_slot[0];
    unsigned h = hash_key(key) & (n - 1);
    for (unsigned k = 0; k < n; k++, h = (h + 1) & (n - 1)) {
        int i = w->unit_slot[h];
        if (i == 0) {
            *slot = h;
            return -1;
        }
        if (strcmp(w->unit_key[i - 1], key) == 0)
            return i - 1;
    }
    *slot = n;
    return -1;
}

/* The slot of key's address in unit_seen. */
static inline unsigned seen_slot(const char *key)
{
    uintptr_t a = (uintptr_t)key;
    return (unsigned)((a ^ (a >> 7)) >> 3) & (GC_JW_SEEN - 1);
}

void gc_jw_unit(gc_jw *w, const char *key, const char *label)
{
    if (key == NULL || w->no_units || w->quiet)
        return;
    /* the same key (static table names, so the same address) comes back for
     * every state and process: once its unit is settled, every later call is
     * a no-op (first use wins), told by the address alone */
    unsigned h = seen_slot(key);
    if (w->unit_seen[h] == key)
        return;
    unsigned slot;
    if (unit_find(w, key, &slot) < 0 && w->n_units < GC_JW_MAX_UNITS &&
        slot < sizeof w->unit_slot / sizeof w->unit_slot[0]) {
        w->unit_key[w->n_units] = key;
        w->unit_label[w->n_units] = label;
        w->unit_slot[slot] = (short)++w->n_units;
    }
    w->unit_seen[h] = key;
}

const char *gc_jw_unit_of(const gc_jw *w, const char *key)
{
    unsigned slot;
    int i = key ? unit_find(w, key, &slot) : -1;
    return i >= 0 ? w->unit_label[i] : NULL;
}

void gc_jw_units(gc_jw *w, const char *key)
{
    gc_jw_object(w, key);
    for (int i = 0; i < w->n_units; i++)
        gc_jw_str(w, w->unit_key[i], w->unit_label[i]);
    gc_jw_end(w);
}

/* ---- scalars ------------------------------------------------------------------------------ */

static void put_real(gc_jw *w, const char *key, double v)
{
    v += 0.0;   /* -0 + 0 = +0: no "-0" in any format */
    if (!isfinite(v)) {
        if (w->nonfinite++ == 0)
            snprintf(w->nonfinite_at, sizeof w->nonfinite_at, "%s", key ? key : "paths");
        pos r = begin(w, key, GC_JW_NULL, 0.0, NULL);
        if (r.emit)
            gc_strbuf_put(w->b, "null", 4);
        return;
    }
    pos r = begin(w, key, GC_JW_NUMBER, v, NULL);
    if (r.emit && gc_strbuf_reserve(w->b, GC_JSON_REAL_MAX) == 0)
        w->b->len += (size_t)gc_json_format_real(w->b->s + w->b->len, v, 10);
}

void gc_jw_q(gc_jw *w, const char *key, double si, gc_quantity q)
{
    if (key && !w->quiet)
        gc_jw_unit(w, key, gc_units_label(q, w->sys));
    put_real(w, key, gc_units_from_si(q, w->sys, si));
}

void gc_jw_num(gc_jw *w, const char *key, double v)
{
    put_real(w, key, v);
}

void gc_jw_num_unit(gc_jw *w, const char *key, double v, const char *label)
{
    gc_jw_unit(w, key, label);
    put_real(w, key, v);
}

void gc_jw_int(gc_jw *w, const char *key, long long v)
{
    pos r = begin(w, key, GC_JW_INTEGER, (double)v, NULL);
    if (r.emit)
        gc_json_put_integer(w->b, v);
}

void gc_jw_bool(gc_jw *w, const char *key, int v)
{
    pos r = begin(w, key, GC_JW_BOOL, v ? 1.0 : 0.0, NULL);
    if (r.emit)
        gc_strbuf_puts(w->b, v ? "true" : "false");
}

void gc_jw_str(gc_jw *w, const char *key, const char *s)
{
    pos r = begin(w, key, GC_JW_STRING, 0.0, s);
    if (r.emit)
        gc_json_put_string(w->b, s ? s : "", s ? strlen(s) : 0);
}

void gc_jw_null(gc_jw *w, const char *key)
{
    pos r = begin(w, key, GC_JW_NULL, 0.0, NULL);
    if (r.emit)
        gc_strbuf_put(w->b, "null", 4);
}

void gc_jw_raw(gc_jw *w, const char *key, const char *json, size_t len)
{
    pos r = begin(w, key, GC_JW_OBJECT, 0.0, NULL);
    if (r.emit)
        gc_strbuf_put(w->b, json, len);
}

int gc_jw_wants(const gc_jw *w)
{
    return w->nt > 0 || (w->b != NULL && !w->select);
}
