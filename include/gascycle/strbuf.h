/*
 * strbuf.h — a growing text buffer (heap, doubling) for the writers of
 * documents: the SVG diagrams of the core (diagram.c) and the JSON and CSV
 * writers of the API layer (and gc_text_copy, the bounded copy of a name). An allocation failure sets `failed`, after which
 * every append is a no-op, so a writer checks once at the end. The text is
 * NUL-terminated after every append (s is NULL until the first one).
 *
 * Zero-initialise (`gc_strbuf b = { .first_cap = 4096 };` or `{ 0 }`); the
 * owner frees b.s (or hands it on).
 */
#ifndef GASCYCLE_STRBUF_H
#define GASCYCLE_STRBUF_H

#include <stddef.h>
#include <string.h>

typedef struct gc_strbuf {
    char *s;            /* the text (malloc'd), or NULL before the first append */
    size_t len;         /* bytes of text, without the final NUL */
    size_t cap;         /* bytes allocated */
    size_t first_cap;   /* bytes of the first allocation (0: 1024) */
    int failed;         /* 1 once an allocation failed (or the owner gave up): appends no-ops */
} gc_strbuf;

/* Slow path of gc_strbuf_reserve: grows the allocation (doubling from
 * first_cap) to hold extra more bytes and the NUL. 0, or -1 (failed). */
int gc_strbuf_grow(gc_strbuf *b, size_t extra);

/* Room for extra more bytes plus the final NUL: 0, or -1 when failed. */
static inline int gc_strbuf_reserve(gc_strbuf *b, size_t extra)
{
    if (!b->failed && b->len + extra + 1 <= b->cap)
        return 0;
    return gc_strbuf_grow(b, extra);
}

/* Appends n bytes of p. */
static inline void gc_strbuf_put(gc_strbuf *b, const char *p, size_t n)
{
    if (gc_strbuf_reserve(b, n) == 0) {
        memcpy(b->s + b->len, p, n);
        b->len += n;
        b->s[b->len] = '\0';
    }
}

/* Appends one byte. */
static inline void gc_strbuf_ch(gc_strbuf *b, char c)
{
    if (gc_strbuf_reserve(b, 1) == 0) {
        b->s[b->len++] = c;
        b->s[b->len] = '\0';
    }
}

/* The text of snprintf(dst, n, "%s", src) without printf (the name and
 * field copies of every evaluation): src cut to n - 1 bytes and
 * NUL-terminated; n > 0, dst and src apart. Returns dst. */
static inline char *gc_text_copy(char *dst, size_t n, const char *src)
{
    size_t k = 0;
    while (k + 1 < n && src[k])
        k++;
    memcpy(dst, src, k);
    dst[k] = '\0';
    return dst;
}

/* Appends a NUL-terminated string. */
void gc_strbuf_puts(gc_strbuf *b, const char *s);

/* Appends printf-style text. */
void gc_strbuf_printf(gc_strbuf *b, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

#endif
