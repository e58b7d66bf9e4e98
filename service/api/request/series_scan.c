/*
 * series_scan.c — a JSON body's top-level series members (a recording's
 * crank angles and pressure cycles) read without jansson (series_scan.h).
 *
 * Model: the scanner walks the top-level object of the body only (keys,
 * then each value skipped by its brackets and strings, without judging it);
 * the value of a member named as one of the preset's top-level SERIES or
 * SERIES_LIST rows must be an array of plain JSON numbers (SERIES_LIST: an
 * array of such arrays), with JSON whitespace anywhere between tokens. Each
 * number is read as jansson 2.14 reads it (its lexer's grammar, RFC 8259
 * section 6: -?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?):
 *   an integer token (no fraction, no exponent): strtoll, then converted to
 *     double (so "-0" is +0.0, as json_number_value gives); beyond long long
 *     jansson refuses the document: the scanner gives up;
 *   any other token: the correctly rounded double (strtod); beyond the
 *     double range jansson refuses the document: the scanner gives up. A
 *     token whose digits (at most 19 written) form an integer m <= 2^53,
 *     with a decimal exponent e within +-22, is computed as m x 10^e or
 *     m / 10^-e, one IEEE operation on two exactly representable doubles
 *     (Clinger 1990, "How to read floating point numbers accurately", the
 *     exact fast path): the correctly rounded value too (with
 *     FLT_EVAL_METHOD 0, round to nearest; otherwise strtod always).
 * Anything else in a series member (a string, null, a deeper array, a
 * trailing comma, a spelling jansson refuses), a series member given twice,
 * or a top level that is not an object of "key": value members: the scanner
 * reads nothing and the body goes to jansson as it is.
 *
 * The rest of the document (the body with each array read replaced by
 * "[]") is parsed by jansson through the same normaliser; when it refuses
 * it, the original body is normalised again so that the problem (its line
 * and column) is the one the whole body gives.
 */
#include "api/request/series_scan.h"
#include "api/request/decode.h"

#include <errno.h>
#include <float.h>
#include <limits.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

/* ---- numbers ----------------------------------------------------------------------------- */

#if defined(FLT_EVAL_METHOD) && FLT_EVAL_METHOD == 0
#define EXACT_FAST_PATH 1
#else
#define EXACT_FAST_PATH 0
#endif

static int is_digit(char c)
{
    return c >= '0' && c <= '9';
}

/* A token's digits: all of them (leading zeros too) as the integer m while
 * there are at most 19 (ndig counts them; beyond 19 m is unusable), the
 * decimal exponent to apply to m, the end of the token; is_int when it has
 * no fraction and no exponent. */
typedef struct {
    uint64_t m;
    int ndig;
    long exp10;
    int is_int, neg;
    const char *end;
} token;

static const char *digits(const char *p, const char *e, token *t)
{
    for (; p < e && is_digit(*p); p++) {
        t->m = t->m * 10u + (uint64_t)(*p - '0');   /* wraps past 19 digits: unused then */
        t->ndig++;
    }
    return p;
}

/* Lexes a JSON number at s; -1 when the bytes are not one jansson takes or
 * nothing follows it. */
static int lex(const char *s, const char *e, token *t)
{
    const char *p = s;
    t->m = 0;
    t->ndig = 0;
    t->exp10 = 0;
    t->is_int = 1;
    t->neg = p < e && *p == '-';
    p += t->neg;
    if (p >= e || !is_digit(*p) || (*p == '0' && p + 1 < e && is_digit(p[1])))
        return -1;                  /* no digit, or a leading zero: jansson refuses it */
    p = digits(p, e, t);
    if (p < e && *p == '.') {
        if (++p >= e || !is_digit(*p))
            return -1;
        int before = t->ndig;
        p = digits(p, e, t);
        t->exp10 = -(long)(t->ndig - before);
        t->is_int = 0;
    }
    if (p < e && (*p == 'e' || *p == 'E')) {
        p++;
        int eneg = p < e && *p == '-';
        if (p < e && (*p == '+' || *p == '-'))
            p++;
        if (p >= e || !is_digit(*p))
            return -1;
        long ev = 0;
        for (; p < e && is_digit(*p); p++)
            if (ev < 100000)
                ev = ev * 10 + (*p - '0');
        t->exp10 += eneg ? -ev : ev;
        t->is_int = 0;
    }
    t->end = p;
    return p < e ? 0 : -1;          /* a byte must follow (the array goes on) */
}

/* m x 10^exp10 when m < 2^53 and |exp10| <= 22: both factors exact, one
 * correctly rounded operation. */
static int exact_fast(const token *t, double *x)
{
    static const double pow10[] = { 1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
                                    1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19,
                                    1e20, 1e21, 1e22 };
    if (!EXACT_FAST_PATH || t->ndig > 19 || t->m > (UINT64_C(1) << 53) || t->exp10 < -22 ||
        t->exp10 > 22)
        return -1;
    double m = (double)t->m;
    double v = t->exp10 >= 0 ? m * pow10[t->exp10] : m / pow10[-t->exp10];
    *x = t->neg ? -v : v;
    return 0;
}

/* A token exact_fast cannot take: strtoll (integers) or strtod, as jansson. */
static int slow(const char *s, const token *t, double *x)
{
    char *stop = NULL;
    errno = 0;
    if (t->is_int) {
        long long v = strtoll(s, &stop, 10);
        if (errno == ERANGE || stop != t->end)
            return -1;
        *x = (double)v;
        return 0;
    }
    double v = strtod(s, &stop);
    if (stop != t->end || ((v == HUGE_VAL || v == -HUGE_VAL) && errno == ERANGE))
        return -1;
    *x = v;
    return 0;
}

int gc_api_scan_number(const char *s, const char *e, double *x, const char **end)
{
    token t;
    if (lex(s, e, &t) != 0)
        return -1;
    if (t.is_int && t.ndig <= 18) {  /* fits long long: as jansson's strtoll, then (double) */
        long long v = (long long)t.m;
        *x = (double)(t.neg ? -v : v);
    } else if ((t.is_int || exact_fast(&t, x) != 0) && slow(s, &t, x) != 0) {
        return -1;
    }
    *end = t.end;
    return 0;
}

/* ---- the document's top level ------------------------------------------------------------ */

typedef struct {
    const char *b, *p, *e;          /* the body, the cursor, the end */
} cursor;

static void ws(cursor *c)
{
    while (c->p < c->e && (*c->p == ' ' || *c->p == '\t' || *c->p == '\n' || *c->p == '\r'))
        c->p++;
}

static int eat(cursor *c, char ch)
{
    ws(c);
    if (c->p >= c->e || *c->p != ch)
        return -1;
    c->p++;
    return 0;
}

/* Past a string that starts at the cursor ('"'); escapes skipped, nothing
 * else judged (jansson does). */
static int skip_string(cursor *c)
{
    for (c->p++; c->p < c->e; c->p++) {
        if (*c->p == '\\')
            c->p++;
        else if (*c->p == '"')
            return c->p++, 0;
    }
    return -1;
}

static int is_delim(char ch)
{
    return ch == ',' || ch == '}' || ch == ']' || ch == ' ' || ch == '\t' || ch == '\n' ||
           ch == '\r';
}

/* Past one value: a string, an array or object by its brackets and
 * strings, or a scalar up to a delimiter (nothing judged). */
static int skip_value(cursor *c)
{
    ws(c);
    if (c->p >= c->e)
        return -1;
    if (*c->p == '"')
        return skip_string(c);
    if (*c->p != '[' && *c->p != '{') {
        const char *start = c->p;
        while (c->p < c->e && !is_delim(*c->p))
            c->p++;
        return c->p > start ? 0 : -1;
    }
    long depth = 0;
    while (c->p < c->e) {
        char ch = *c->p;
        if (ch == '"') {
            if (skip_string(c) != 0)
                return -1;
            continue;
        }
        c->p++;
        if (ch == '[' || ch == '{')
            depth++;
        else if ((ch == ']' || ch == '}') && --depth == 0)
            return 0;
    }
    return -1;
}

/* ---- series values ----------------------------------------------------------------------- */

static int push(gc_api_scanned *m, size_t *cap, double v)
{
    if (m->n_values == *cap) {
        size_t n = *cap ? 2 * *cap : 4096;
        double *x = realloc(m->x, n * sizeof *x);
        if (!x)
            return -2;
        m->x = x;
        *cap = n;
    }
    m->x[m->n_values++] = v;
    return 0;
}

/* One array of plain numbers at the cursor, appended to m->x. 0, -1 (not
 * such an array), -2 (out of memory). */
static int read_series(cursor *c, gc_api_scanned *m, size_t *cap)
{
    if (eat(c, '[') != 0)
        return -1;
    ws(c);
    if (c->p < c->e && *c->p == ']')
        return c->p++, 0;
    for (;;) {
        double v;
        const char *end;
        if (gc_api_scan_number(c->p, c->e, &v, &end) != 0)
            return -1;
        c->p = end;
        int rc = push(m, cap, v);
        if (rc != 0)
            return rc;
        ws(c);
        if (c->p >= c->e)
            return -1;
        char ch = *c->p++;
        if (ch == ']')
            return 0;
        if (ch != ',')
            return -1;
        ws(c);
    }
}

static int push_len(gc_api_scanned *m, size_t *cap, size_t n)
{
    if (m->n_series == *cap) {
        size_t k = *cap ? 2 * *cap : 64;
        size_t *len = realloc(m->len, k * sizeof *len);
        if (!len)
            return -2;
        m->len = len;
        *cap = k;
    }
    m->len[m->n_series++] = n;
    return 0;
}

/* An array of arrays of plain numbers at the cursor. */
static int read_list(cursor *c, gc_api_scanned *m, size_t *cap)
{
    size_t cap_len = 0;
    if (eat(c, '[') != 0)
        return -1;
    ws(c);
    if (c->p < c->e && *c->p == ']')
        return c->p++, 0;
    for (;;) {
        size_t before = m->n_values;
        int rc = read_series(c, m, cap);
        if (rc == 0)
            rc = push_len(m, &cap_len, m->n_values - before);
        if (rc != 0)
            return rc;
        if (eat(c, ',') == 0)
            continue;
        return eat(c, ']');
    }
}

/* ---- the members ------------------------------------------------------------------------- */

/* p's top-level series row named by the raw key k (n bytes; a key written
 * with escapes is left to jansson), or NULL. */
static const gc_field *series_row(const gc_preset *p, const char *k, size_t n)
{
    if (memchr(k, '\\', n))
        return NULL;
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->parent == 0 && f->name && (f->type == GC_FT_SERIES ||
                                          f->type == GC_FT_SERIES_LIST) &&
            strlen(f->name) == n && memcmp(f->name, k, n) == 0)
            return f;
    }
    return NULL;
}

static int read_member(cursor *c, const gc_field *f, gc_api_scan *s)
{
    for (int i = 0; i < s->n; i++)
        if (s->m[i].f == f)
            return -1;              /* given twice: jansson names the duplicate */
    if (s->n == GC_API_SCAN_MAX)
        return -1;
    gc_api_scanned *m = &s->m[s->n++];
    m->f = f;
    ws(c);
    m->start = (size_t)(c->p - c->b);
    size_t cap = 0;
    int rc = f->type == GC_FT_SERIES_LIST ? read_list(c, m, &cap) : read_series(c, m, &cap);
    m->end = (size_t)(c->p - c->b);
    return rc;
}

/* The top-level object: every member skipped but the series, read. */
static int walk(cursor *c, const gc_preset *p, gc_api_scan *s)
{
    if (eat(c, '{') != 0)
        return -1;
    ws(c);
    if (c->p < c->e && *c->p == '}')
        return 0;
    for (;;) {
        ws(c);
        if (c->p >= c->e || *c->p != '"')
            return -1;
        const char *k = c->p + 1;
        if (skip_string(c) != 0)
            return -1;
        size_t kn = (size_t)(c->p - 1 - k);
        if (eat(c, ':') != 0)
            return -1;
        const gc_field *f = series_row(p, k, kn);
        int rc = f ? read_member(c, f, s) : skip_value(c);
        if (rc != 0)
            return rc;
        if (eat(c, ',') == 0)
            continue;
        return eat(c, '}');
    }
}

void gc_api_scan_free(gc_api_scan *scan)
{
    for (int i = 0; i < scan->n; i++) {
        free(scan->m[i].x);
        free(scan->m[i].len);
    }
    memset(scan, 0, sizeof *scan);
}

/* 1 when p has a series row at the top of its table (else nothing to read). */
static int has_series(const gc_preset *p)
{
    for (int r = 1; r < p->n_fields; r++)
        if (p->fields[r].parent == 0 && (p->fields[r].type == GC_FT_SERIES ||
                                         p->fields[r].type == GC_FT_SERIES_LIST))
            return 1;
    return 0;
}

int gc_api_scan_body(const gc_preset *p, const char *body, size_t len, gc_api_scan *scan)
{
    memset(scan, 0, sizeof *scan);
    if (!body || !has_series(p))
        return 0;
    cursor c = { body, body, body + len };
    int rc = walk(&c, p, scan);
    if (rc != 0 || scan->n == 0) {
        gc_api_scan_free(scan);
        return rc == -2 ? -1 : 0;
    }
    return scan->n;
}

char *gc_api_scan_skeleton(const gc_api_scan *scan, const char *body, size_t len,
                           size_t *out_len)
{
    size_t n = len;
    for (int i = 0; i < scan->n; i++)
        n -= scan->m[i].end - scan->m[i].start - 2;
    char *out = malloc(n + 1);
    if (!out)
        return NULL;
    size_t from = 0, o = 0;
    for (int i = 0; i < scan->n; i++) {   /* the members in the order of the body */
        const gc_api_scanned *m = &scan->m[i];
        memcpy(out + o, body + from, m->start - from);
        o += m->start - from;
        memcpy(out + o, "[]", 2);
        o += 2;
        from = m->end;
    }
    memcpy(out + o, body + from, len - from);
    out[n] = '\0';
    *out_len = n;
    return out;
}

/* Each member read finds its placeholder in root. 0, or -1 (not found). */
static int bind(gc_api_scan *scan, json_t *root)
{
    for (int i = 0; i < scan->n; i++) {
        json_t *v = json_object_get(root, scan->m[i].f->name);
        if (!json_is_array(v) || json_array_size(v) != 0)
            return -1;
        scan->m[i].placeholder = v;
    }
    return 0;
}

/* The skeleton normalised; 0, or -1 (nothing in resp: the caller goes on
 * with the whole body). */
static int try_skeleton(const gc_api_request *req, int diagram, gc_api_scan *scan,
                        json_t **root)
{
    size_t n;
    char *sk = gc_api_scan_skeleton(scan, req->body, req->body_len, &n);
    if (!sk)
        return -1;
    gc_api_request r = *req;
    r.body = sk;
    r.body_len = n;
    gc_api_response trial;
    memset(&trial, 0, sizeof trial);
    int rc = gc_decode_normalise_ex(&r, diagram, root, &trial);
    free(sk);
    free(trial.body);
    if (rc == 0 && bind(scan, *root) != 0) {
        json_decref(*root);
        *root = NULL;
        rc = -1;
    }
    return rc == 0 ? 0 : -1;
}

int gc_api_scan_normalise(const gc_preset *p, const gc_api_request *req, int diagram,
                          gc_api_scan *scan, json_t **root, gc_api_response *resp)
{
    memset(scan, 0, sizeof *scan);
    if (req->method == GC_M_POST && gc_api_scan_body(p, req->body, req->body_len, scan) > 0) {
        if (try_skeleton(req, diagram, scan, root) == 0)
            return 0;
        gc_api_scan_free(scan);
    }
    return gc_decode_normalise_ex(req, diagram, root, resp);
}

gc_api_scanned *gc_api_scan_find(gc_api_scan *scan, const gc_field *f, const json_t *v)
{
    for (int i = 0; scan && v && i < scan->n; i++)
        if (scan->m[i].f == f && scan->m[i].placeholder == v)
            return &scan->m[i];
    return NULL;
}
