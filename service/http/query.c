/*
 * query.c — request-target parsing and percent-decoding for the HTTP layer
 * (see query.h for the rules). One allocation holds the decoded path, the
 * router's scratch space and every decoded key and value; a second one the
 * parameter list.
 */
#include "http/query.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

static int hex(char c)
{
    if (c >= '0' && c <= '9')
        return c - '0';
    if (c >= 'a' && c <= 'f')
        return c - 'a' + 10;
    if (c >= 'A' && c <= 'F')
        return c - 'A' + 10;
    return -1;
}

/* Decodes s[0..n) into out (room for n + 1); returns the decoded length and
 * sets *nul when a "%00" was met (then decoded as the text "%00"). */
static size_t decode(const char *s, size_t n, int plus_space, char *out, int *nul)
{
    size_t w = 0;
    for (size_t i = 0; i < n; i++) {
        char c = s[i];
        if (c == '+' && plus_space) {
            out[w++] = ' ';
        } else if (c == '%' && i + 2 < n && hex(s[i + 1]) >= 0 && hex(s[i + 2]) >= 0) {
            int v = hex(s[i + 1]) * 16 + hex(s[i + 2]);
            if (v == 0) {
                *nul = 1;
                memcpy(out + w, "%00", 3);
                w += 3;
            } else {
                out[w++] = (char)v;
            }
            i += 2;
        } else {
            out[w++] = c;
        }
    }
    out[w] = '\0';
    return w;
}

void gc_http_target_free(gc_http_target *t)
{
    free(t->buf);
    free(t->params);
    memset(t, 0, sizeof *t);
}

/* Skips "scheme://authority" of an absolute-form target. */
static const char *origin_part(const char *raw, size_t *len)
{
    size_t skip = 0;
    if (*len > 7 && strncasecmp(raw, "http://", 7) == 0)
        skip = 7;
    else if (*len > 8 && strncasecmp(raw, "https://", 8) == 0)
        skip = 8;
    if (!skip)
        return raw;
    const char *p = raw + skip, *end = raw + *len;
    while (p < end && *p != '/' && *p != '?')
        p++;
    *len = (size_t)(end - p);
    return p;
}

void gc_http_target_parse(const char *raw, size_t raw_len, size_t max_len, size_t max_params,
                          gc_http_target *t)
{
    memset(t, 0, sizeof *t);
    t->raw_len = raw_len;
    size_t len = raw_len;
    if (len > max_len) {
        t->problem = GC_TARGET_TOO_LONG;
        len = max_len;   /* keep a cut path for the log */
    }
    const char *s = origin_part(raw, &len);
    const char *q = memchr(s, '?', len);
    size_t plen = q ? (size_t)(q - s) : len;
    size_t qlen = q ? len - plen - 1 : 0;

    /* decoding never lengthens text ("%00" stays 3 bytes): the path, the
     * router's scratch of the same size, and each key and value with its NUL */
    t->buf = malloc(2 * (plen + 1) + 2 * (qlen + 1));
    if (!t->buf) {
        static char empty[1];
        t->problem = GC_TARGET_NO_MEMORY;
        t->path = empty;
        t->scratch = empty;
        return;
    }
    int nul = 0;
    t->path = t->buf;
    t->path_len = decode(s, plen, 0, t->path, &nul);
    t->scratch = t->path + t->path_len + 1;
    char *w = t->scratch + t->path_len + 1;
    if (nul && t->problem == GC_TARGET_OK)
        t->problem = GC_TARGET_NUL_IN_PATH;
    if (t->problem != GC_TARGET_OK || !q)
        return;

    /* count the parameters first: no allocation beyond the limit */
    const char *qs = q + 1, *qe = q + 1 + qlen;
    for (const char *p = qs; p < qe;) {
        const char *amp = memchr(p, '&', (size_t)(qe - p));
        const char *e = amp ? amp : qe;
        if (e > p)
            t->counted++;
        p = amp ? amp + 1 : qe;
    }
    if (t->counted > max_params) {
        t->problem = GC_TARGET_TOO_MANY_PARAMS;
        return;
    }
    t->params = t->counted ? malloc(t->counted * sizeof *t->params) : NULL;
    if (t->counted && !t->params) {
        t->problem = GC_TARGET_NO_MEMORY;
        return;
    }
    for (const char *p = qs; p < qe;) {
        const char *amp = memchr(p, '&', (size_t)(qe - p));
        const char *e = amp ? amp : qe;
        if (e > p) {
            const char *eq = memchr(p, '=', (size_t)(e - p));
            const char *ke = eq ? eq : e;
            int knul = 0, vnul = 0;
            char *key = w;
            w += decode(p, (size_t)(ke - p), 1, key, &knul) + 1;
            char *val = w;
            if (eq)
                w += decode(eq + 1, (size_t)(e - eq - 1), 1, val, &vnul) + 1;
            else
                *w++ = '\0';
            if ((knul || vnul) && t->problem == GC_TARGET_OK) {
                t->problem = GC_TARGET_NUL_IN_QUERY;
                snprintf(t->bad_key, sizeof t->bad_key, "%s", key);
            }
            t->params[t->n_params].key = key;
            t->params[t->n_params].value = val;
            t->n_params++;
        }
        p = amp ? amp + 1 : qe;
    }
}

void gc_http_key_pointer(const char *key, char *out, size_t len)
{
    size_t w = 0;
    if (len < 2) {
        if (len)
            out[0] = '\0';
        return;
    }
    out[w++] = '/';
    for (const char *p = key; *p; p++) {
        const char *piece = *p == '.' ? "/" : *p == '~' ? "~0" : *p == '/' ? "~1" : p;
        size_t n = (piece == p || *p == '.') ? 1 : 2;
        if (w + n >= len)
            break;
        memcpy(out + w, piece, n);
        w += n;
    }
    out[w] = '\0';
}
