/*
 * jsonout.c — the fast JSON encoder of jsonout.h: byte-for-byte the output
 * of jansson's json_dumps(v, JSON_COMPACT | JSON_REAL_PRECISION(p)), except
 * that a negative zero is written "0.0" (never "-0.0").
 *
 * Reals ("%.<p>g" semantics, 1 <= p <= 15 on the fast path): with X the
 * decimal exponent of |v|, m = |v| 10^(p-1-X) lies in [10^(p-1), 10^p) and
 * is computed with one correctly rounded multiplication or division by an
 * exact power of ten (10^0 .. 10^22), so it is within half a unit in its
 * last place of the exact product; for small magnitudes (10^23 .. 10^44:
 * the residuals of the checks, about 1e-15) with two multiplications,
 * within one unit. Its nearest integer N holds the p
 * significant digits printf would print, unless the fraction of m lies
 * within two units in the last place of 1/2 (the exact value might fall on
 * the other side of the tie): there, and for subnormals, magnitudes whose
 * scaling needs a power of ten beyond 10^44 or below 10^-22, precision 0
 * (17 digits) or
 * above 15, the real goes through snprintf and jansson's own
 * post-processing. N = 10^p (rounding up to the next decade) moves to
 * 10^(p-1) with X + 1. Then %g's rule: exponential form when X < -4 or
 * X >= p, else fixed; trailing zeros dropped; jansson writes the exponent
 * without '+' and without leading zeros and appends ".0" to a real that has
 * neither '.' nor 'e'.
 *
 * Strings: validated as UTF-8 with jansson's rules (no overlong forms, no
 * surrogates, nothing above U+10FFFF); invalid text fails the dump, as in
 * json_dumps.
 */
#include "api/respond/jsonout.h"
#include "gascycle/strbuf.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- reals --------------------------------------------------------------- */

static const double pow10_exact[23] = {
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
    1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22
};

static const uint64_t pow10_int[16] = {
    1ull, 10ull, 100ull, 1000ull, 10000ull, 100000ull, 1000000ull, 10000000ull,
    100000000ull, 1000000000ull, 10000000000ull, 100000000000ull, 1000000000000ull,
    10000000000000ull, 100000000000000ull, 1000000000000000ull
};

static const char digit_pairs[201] =
    "00010203040506070809101112131415161718192021222324252627282930313233343536373839"
    "40414243444546474849505152535455565758596061626364656667686970717273747576777879"
    "8081828384858687888990919293949596979899";

/* jansson's route: snprintf("%.*g"), then ".0" if neither '.' nor 'e', then
 * the exponent without '+' and without leading zeros. */
static int format_real_slow(char *buf, double v, int precision)
{
    int n = snprintf(buf, GC_JSON_REAL_MAX, "%.*g", precision == 0 ? 17 : precision, v);
    if (n < 0 || n >= GC_JSON_REAL_MAX - 3) {
        buf[0] = '\0';
        return 0;
    }
    size_t len = (size_t)n;
    if (!strchr(buf, '.') && !strchr(buf, 'e')) {
        buf[len++] = '.';
        buf[len++] = '0';
        buf[len] = '\0';
    }
    char *start = strchr(buf, 'e');
    if (start) {
        start++;
        char *end = start + 1;
        if (*start == '-')
            start++;
        while (*end == '0')
            end++;
        if (end != start) {
            memmove(start, end, len - (size_t)(end - buf) + 1);
            len -= (size_t)(end - start);
        }
    }
    return (int)len;
}

/* a 10^k for -22 <= k <= 44: one correctly rounded operation up to
 * |k| = 22, two above (a 10^22 first, then 10^(k-22)): within one unit in
 * the last place of the exact product, inside scale_digits' margin of two.
 * a >= 1e-300, so a 10^22 is a normal number. */
static inline double scale(double a, int k)
{
    if (k > 22)
        return (a * pow10_exact[22]) * pow10_exact[k - 22];
    return k >= 0 ? a * pow10_exact[k] : a / pow10_exact[-k];
}

/* Scaled integer with p digits and the decimal exponent, or 0 where the
 * fast route cannot decide (then the caller uses snprintf). a > 0. */
static int scale_digits(double a, int p, uint64_t *digits, int *exp10)
{
    uint64_t bits;
    memcpy(&bits, &a, sizeof bits);
    int e2 = (int)((bits >> 52) & 0x7FF) - 1022;   /* a in [2^(e2-1), 2^e2) (normal a) */
    /* floor((e2 - 1) log10 2): floor(log10 a) or one less (exact for |e2| < 1700) */
    int X = ((e2 - 1) * 78913) >> 18;
    int k = p - 1 - X;
    if (k > 44 || k < -22)
        return 0;
    double m = scale(a, k);
    if (m >= pow10_exact[p]) {
        X++;
        k--;
        if (k < -22)
            return 0;
        m = scale(a, k);
    }
    uint64_t N = (uint64_t)m;                 /* floor: 0 < m < 2^53 */
    double fr = m - (double)N;                /* exact */
    if (fabs(fr - 0.5) <= 4.5e-16 * m)        /* two units in the last place of m */
        return 0;
    N += fr > 0.5;
    uint64_t lo = pow10_int[p - 1], hi = pow10_int[p];
    if (N == hi) {
        N = lo;
        X++;
    }
    if (N < lo || N >= hi)
        return 0;
    *digits = N;
    *exp10 = X;
    return 1;
}

/* The n decimal digits of v (v < 10^n), leading zeros included, into d. */
static inline void put_digits(char *d, uint32_t v, int n)
{
    while (n >= 2) {
        uint32_t r = v % 100u;
        v /= 100u;
        n -= 2;
        memcpy(d + n, digit_pairs + 2 * r, 2);
    }
    if (n == 1)
        d[0] = (char)('0' + v);
}

/* Copies 16 bytes, of which the caller keeps the first few (at most 15
 * digits): a fixed-size copy is two moves where a copy of n bytes is a call.
 * Room: the digits live in a 32-byte array, and the output never runs past
 * 33 of the GC_JSON_REAL_MAX (40) bytes of buf (sign, 15 integer digits,
 * '.', 16). */
static inline void copy16(char *o, const char *d)
{
    memcpy(o, d, 16);
}

/* The digits of v in scientific form: d[0].d[1..nd) e X. */
static char *put_scientific(char *o, const char *d, int nd, int X)
{
    *o++ = d[0];
    if (nd > 1) {
        *o++ = '.';
        copy16(o, d + 1);
        o += nd - 1;
    }
    *o++ = 'e';
    int e = X;
    if (e < 0) {
        *o++ = '-';
        e = -e;
    }
    char t[8];
    int nt = 0;
    do {
        t[nt++] = (char)('0' + e % 10);
        e /= 10;
    } while (e > 0);
    while (nt > 0)
        *o++ = t[--nt];
    return o;
}

/* The digits in positional form (X >= -4: the decimal exponent). */
static char *put_positional(char *o, const char *d, int nd, int X)
{
    if (X < 0) {
        *o++ = '0';
        *o++ = '.';
        for (int i = 0; i < -X - 1; i++)
            *o++ = '0';
        copy16(o, d);
        return o + nd;
    }
    int ni = X + 1; /* integer digits */
    if (nd <= ni) {
        copy16(o, d);
        o += nd;
        for (int i = nd; i < ni; i++)
            *o++ = '0';
        *o++ = '.';
        *o++ = '0';
        return o;
    }
    copy16(o, d);
    o += ni;
    *o++ = '.';
    copy16(o, d + ni);
    return o + nd - ni;
}

int gc_json_format_real(char *buf, double v, int precision)
{
    int p = precision;
    if (v == 0.0) {
        /* both zeros as "0.0": no output carries a negative zero (json_dumps
         * would write "-0.0" for -0) */
        memcpy(buf, "0.0", 4);
        return 3;
    }
    if (p < 1 || p > 15)
        return format_real_slow(buf, v, precision);
    char *o = buf;
    const double v0 = v;
    if (signbit(v)) {
        *o++ = '-';
        v = -v;
    }
    uint64_t N;
    int X;
    if (!(v >= 1e-300 && v <= 1e300) || !scale_digits(v, p, &N, &X))
        return format_real_slow(buf, v0, precision);
    char d[32];
    if (p > 8) {   /* N < 10^15: eight low digits and the rest, in 32-bit steps */
        uint32_t hi = (uint32_t)(N / 100000000u);
        put_digits(d, hi, p - 8);
        put_digits(d + p - 8, (uint32_t)(N - (uint64_t)hi * 100000000u), 8);
    } else {
        put_digits(d, (uint32_t)N, p);
    }
    int nd = p;
    while (nd > 1 && d[nd - 1] == '0')
        nd--;
    if (X < -4 || X >= p)
        o = put_scientific(o, d, nd, X);
    else
        o = put_positional(o, d, nd, X);
    *o = '\0';
    return (int)(o - buf);
}

/* ---- integers and strings -------------------------------------------------- */

void gc_json_put_integer(gc_strbuf *b, long long v)
{
    char t[24];
    int n = 0;
    uint64_t u = v < 0 ? (uint64_t)0 - (uint64_t)v : (uint64_t)v;
    do {
        t[n++] = (char)('0' + u % 10);
        u /= 10;
    } while (u > 0);
    if (gc_strbuf_reserve(b, (size_t)n + 1) != 0)
        return;
    if (v < 0)
        b->s[b->len++] = '-';
    while (n > 0)
        b->s[b->len++] = t[--n];
}

/* Length of the valid UTF-8 sequence at p (first byte >= 0x80), or 0. */
static size_t utf8_seq(const unsigned char *p, const unsigned char *end)
{
    unsigned c = p[0];
    size_t n;
    uint32_t cp;
    if (c >= 0xC2 && c <= 0xDF) {
        n = 2;
        cp = c & 0x1F;
    } else if (c >= 0xE0 && c <= 0xEF) {
        n = 3;
        cp = c & 0x0F;
    } else if (c >= 0xF0 && c <= 0xF4) {
        n = 4;
        cp = c & 0x07;
    } else {
        return 0;
    }
    if ((size_t)(end - p) < n)
        return 0;
    for (size_t i = 1; i < n; i++) {
        if ((p[i] & 0xC0) != 0x80)
            return 0;
        cp = (cp << 6) | (p[i] & 0x3F);
    }
    if ((n == 3 && cp < 0x800) || (n == 4 && cp < 0x10000) || cp > 0x10FFFF ||
        (cp >= 0xD800 && cp <= 0xDFFF))
        return 0;
    return n;
}

/* 1 when the 8 bytes at p hold one that needs a look: a control character,
 * '"', '\\' or a byte of a multi-byte UTF-8 sequence (word-at-a-time test:
 * a byte is zero in v when (v - 0x01..) & ~v & 0x80.. has its high bit). */
static int word_needs_look(const unsigned char *p)
{
    const uint64_t ones = 0x0101010101010101ull, highs = 0x8080808080808080ull;
    uint64_t x;
    memcpy(&x, p, sizeof x);
    uint64_t q = x ^ (ones * '"'), bs = x ^ (ones * '\\');
    uint64_t ctl = (x - ones * 0x20) & ~x;
    uint64_t zq = (q - ones) & ~q, zb = (bs - ones) & ~bs;
    return ((x | ctl | zq | zb) & highs) != 0;
}

/* 1 for a byte a JSON string holds as it is and jansson writes unchanged
 * without a look: 0x20 .. 0x7F other than '"' (0x22) and '\\' (0x5C); NUL,
 * the other control characters and the bytes of multi-byte UTF-8 are 0. */
#define Z16 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0
#define O16 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1
static const unsigned char plain_table[256] = {
    Z16, Z16,                                               /* 0x00 .. 0x1F */
    1, 1, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1,         /* 0x20 .. 0x2F: '"' */
    O16, O16,                                               /* 0x30 .. 0x4F */
    1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 1, 1, 1,         /* 0x50 .. 0x5F: '\\' */
    O16, O16,                                               /* 0x60 .. 0x7F */
    Z16, Z16, Z16, Z16, Z16, Z16, Z16, Z16                  /* 0x80 .. 0xFF */
};
#undef Z16
#undef O16

static inline int plain_byte(unsigned char c)
{
    return plain_table[c];
}

/* Appends '"', n plain bytes of s, '"' and then tail (0: none) in one step. */
static void put_plain(gc_strbuf *b, const char *s, size_t n, char tail)
{
    size_t extra = n + 2 + (tail != 0);
    if (gc_strbuf_reserve(b, extra) != 0)
        return;
    char *o = b->s + b->len;
    o[0] = '"';
    memcpy(o + 1, s, n);
    o[n + 1] = '"';
    if (tail)
        o[n + 2] = tail;
    o[extra] = '\0';
    b->len += extra;
}

/* The general route: escapes and UTF-8 validation. */
static void put_string_escaped(gc_strbuf *b, const char *str, size_t len)
{
    static const char hex[] = "0123456789ABCDEF";
    const unsigned char *p = (const unsigned char *)str, *end = p + len;
    gc_strbuf_ch(b, '"');
    const unsigned char *run = p;
    while (p < end) {
        if (end - p >= 8 && !word_needs_look(p)) {
            p += 8;
            continue;
        }
        unsigned c = *p;
        if (c >= 0x20 && c != '"' && c != '\\' && c < 0x80) {
            p++;
            continue;
        }
        if (c >= 0x80) {
            size_t n = utf8_seq(p, end);
            if (n == 0) {
                b->failed = 1;
                return;
            }
            p += n;
            continue;
        }
        gc_strbuf_put(b, (const char *)run, (size_t)(p - run));
        char e[6] = { '\\', 0, 0, 0, 0, 0 };
        size_t ne = 2;
        switch (c) {
        case '"': e[1] = '"'; break;
        case '\\': e[1] = '\\'; break;
        case '\b': e[1] = 'b'; break;
        case '\f': e[1] = 'f'; break;
        case '\n': e[1] = 'n'; break;
        case '\r': e[1] = 'r'; break;
        case '\t': e[1] = 't'; break;
        default:
            e[1] = 'u';
            e[2] = '0';
            e[3] = '0';
            e[4] = hex[c >> 4];
            e[5] = hex[c & 15];
            ne = 6;
        }
        gc_strbuf_put(b, e, ne);
        p++;
        run = p;
    }
    gc_strbuf_put(b, (const char *)run, (size_t)(p - run));
    gc_strbuf_ch(b, '"');
}

void gc_json_put_string(gc_strbuf *b, const char *str, size_t len)
{
    const unsigned char *p = (const unsigned char *)str;
    size_t i = 0;
    while (len - i >= 8 && !word_needs_look(p + i))
        i += 8;
    while (i < len && plain_byte(p[i]))
        i++;
    if (i == len)
        put_plain(b, str, len, 0);   /* nothing to escape or validate: one copy */
    else
        put_string_escaped(b, str, len);
}

#define KEY_SHORT 61   /* keys up to this long are copied while they are read */

void gc_json_put_key(gc_strbuf *b, const char *key)
{
    const unsigned char *p = (const unsigned char *)key;
    if (gc_strbuf_reserve(b, KEY_SHORT + 3) == 0) {
        /* one pass: each byte tested and stored after the opening quote;
         * the text counts only when the key ends plain within KEY_SHORT */
        char *o = b->s + b->len;
        size_t n = 0;
        o[0] = '"';
        while (n < KEY_SHORT && plain_byte(p[n])) {
            o[n + 1] = (char)p[n];
            n++;
        }
        if (p[n] == '\0') {
            o[n + 1] = '"';
            o[n + 2] = ':';
            o[n + 3] = '\0';
            b->len += n + 3;
            return;
        }
    }
    size_t n = 0;
    while (plain_byte(p[n]))
        n++;
    if (p[n] == '\0') {
        put_plain(b, key, n, ':');
        return;
    }
    put_string_escaped(b, key, n + strlen(key + n));
    gc_strbuf_ch(b, ':');
}

/* ---- the tree -------------------------------------------------------------- */

/* Values written as given text instead of their trees (gc_json_dump_with). */
typedef struct hole {
    const json_t *const *at;
    const char *const *text;
    const size_t *len;
    int n;
} hole;

static void put_value(gc_strbuf *b, json_t *v, int precision, int depth, const hole *h)
{
    if (b->failed)
        return;
    for (int i = 0; h && i < h->n; i++)
        if (v == h->at[i]) {
            gc_strbuf_put(b, h->text[i], h->len[i]);
            return;
        }
    if (depth > GC_JSON_MAX_DEPTH) {
        b->failed = 1;
        return;
    }
    switch (json_typeof(v)) {
    case JSON_OBJECT: {
        gc_strbuf_ch(b, '{');
        int first = 1;
        for (void *it = json_object_iter(v); it && !b->failed;
             it = json_object_iter_next(v, it)) {
            if (!first)
                gc_strbuf_ch(b, ',');
            first = 0;
            gc_json_put_string(b, json_object_iter_key(it), json_object_iter_key_len(it));
            gc_strbuf_ch(b, ':');
            put_value(b, json_object_iter_value(it), precision, depth + 1, h);
        }
        gc_strbuf_ch(b, '}');
        break;
    }
    case JSON_ARRAY: {
        gc_strbuf_ch(b, '[');
        size_t n = json_array_size(v);
        for (size_t i = 0; i < n && !b->failed; i++) {
            if (i)
                gc_strbuf_ch(b, ',');
            put_value(b, json_array_get(v, i), precision, depth + 1, h);
        }
        gc_strbuf_ch(b, ']');
        break;
    }
    case JSON_STRING:
        gc_json_put_string(b, json_string_value(v), json_string_length(v));
        break;
    case JSON_INTEGER:
        gc_json_put_integer(b, json_integer_value(v));
        break;
    case JSON_REAL:
        if (gc_strbuf_reserve(b, GC_JSON_REAL_MAX) == 0)
            b->len += (size_t)gc_json_format_real(b->s + b->len, json_real_value(v), precision);
        break;
    case JSON_TRUE: gc_strbuf_put(b, "true", 4); break;
    case JSON_FALSE: gc_strbuf_put(b, "false", 5); break;
    case JSON_NULL: gc_strbuf_put(b, "null", 4); break;
    default: b->failed = 1; break;
    }
}

char *gc_json_dump_with(json_t *v, int precision, size_t *len, const json_t *const *at,
                        const char *const *text, const size_t *text_len, int n)
{
    hole h = { at, text, text_len, n };
    if (!v)
        return NULL;
    gc_strbuf b = { .first_cap = 4096 };
    put_value(&b, v, precision, 0, n > 0 ? &h : NULL);
    if (b.failed || !b.s) {
        free(b.s);
        return NULL;
    }
    b.s[b.len] = '\0';
    if (len)
        *len = b.len;
    return b.s;
}

char *gc_json_dump(json_t *v, int precision, size_t *len)
{
    if (!v)
        return NULL;
    gc_strbuf b = { .first_cap = 4096 };
    put_value(&b, v, precision, 0, NULL);
    if (b.failed || !b.s) {
        free(b.s);
        return NULL;
    }
    b.s[b.len] = '\0';
    if (len)
        *len = b.len;
    return b.s;
}
