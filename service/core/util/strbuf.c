/*
 * strbuf.c — the growing text buffer of strbuf.h: doubling growth from the
 * first capacity, sticky failure, printf-style appends.
 */
#include "gascycle/strbuf.h"

#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>

int gc_strbuf_grow(gc_strbuf *b, size_t extra)
{
    if (b->failed)
        return -1;
    if (b->len + extra + 1 <= b->cap)
        return 0;
    size_t cap = b->cap ? b->cap : (b->first_cap ? b->first_cap : 1024);
    while (cap < b->len + extra + 1)
        cap *= 2;
    char *s = realloc(b->s, cap);
    if (!s) {
        b->failed = 1;
        return -1;
    }
    b->s = s;
    b->cap = cap;
    return 0;
}

void gc_strbuf_puts(gc_strbuf *b, const char *s)
{
    gc_strbuf_put(b, s, strlen(s));
}

void gc_strbuf_printf(gc_strbuf *b, const char *fmt, ...)
{
    if (gc_strbuf_reserve(b, 128) != 0)
        return;
    va_list ap;
    va_start(ap, fmt);
    int k = vsnprintf(b->s + b->len, b->cap - b->len, fmt, ap);
    va_end(ap);
    if (k < 0) {
        b->failed = 1;
        return;
    }
    if ((size_t)k >= b->cap - b->len) {
        if (gc_strbuf_reserve(b, (size_t)k) != 0)
            return;
        va_start(ap, fmt);
        vsnprintf(b->s + b->len, b->cap - b->len, fmt, ap);
        va_end(ap);
    }
    b->len += (size_t)k;
}
