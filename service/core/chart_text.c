/*
 * chart_text.c — text and numbers for SVG writers (chart.h): XML escaping
 * with UTF-8 validation, character counts for the text-box estimate, and
 * number formatting as engineers read it (fixed decimals or significant
 * digits, thin-space thousands grouping, powers of ten as superscripts,
 * never "1e+04", no binary noise such as 0.30000000000000004).
 *
 * Locale: printf's digits are used but its decimal point is not (it is the
 * locale's): the digits are read back and the point written as '.', so a
 * process that calls setlocale still writes "0.5". Coordinates are written
 * with their own integer routine for the same reason and for speed.
 * UTF-8 validity follows RFC 3629 (no overlong forms, no surrogates, nothing
 * beyond U+10FFFF); U+FFFE and U+FFFF are refused too (not XML characters).
 */
#include "chart_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define THIN_SPACE "\xe2\x80\x89"
#define TIMES "\xc3\x97"

/* Length of the valid UTF-8 sequence at s (at most `left` bytes), 0 if invalid. */
static size_t utf8_len(const unsigned char *s, size_t left)
{
    unsigned c = s[0];
    size_t n;
    unsigned cp;
    if (c < 0x80)
        return 1;
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
    if (n > left)
        return 0;
    for (size_t i = 1; i < n; i++) {
        if ((s[i] & 0xC0) != 0x80)
            return 0;
        cp = (cp << 6) | (s[i] & 0x3F);
    }
    if ((n == 3 && cp < 0x800) || (n == 4 && cp < 0x10000) || cp > 0x10FFFF ||
        (cp >= 0xD800 && cp <= 0xDFFF) || cp == 0xFFFE || cp == 0xFFFF)
        return 0;
    return n;
}

/* Bytes of s that are used: at most max_bytes, not cutting a character. */
static size_t used_len(const char *s, size_t max_bytes)
{
    const unsigned char *u = (const unsigned char *)s;
    size_t len = strlen(s);
    if (len > max_bytes) {
        len = max_bytes;
        while (len > 0 && (u[len] & 0xC0) == 0x80)
            len--;
    }
    return len;
}

/* One character at u[i] (of len bytes) escaped into b; returns bytes consumed. */
static size_t escape_one(gc_strbuf *b, const unsigned char *u, size_t i, size_t len)
{
    unsigned c = u[i];
    switch (c) {
    case '&': gc_strbuf_puts(b, "&amp;"); return 1;
    case '<': gc_strbuf_puts(b, "&lt;"); return 1;
    case '>': gc_strbuf_puts(b, "&gt;"); return 1;
    case '"': gc_strbuf_puts(b, "&quot;"); return 1;
    case '\'': gc_strbuf_puts(b, "&#39;"); return 1;
    default: break;
    }
    if (c < 0x20 || c == 0x7F) {
        gc_strbuf_ch(b, ' ');            /* XML 1.0 forbids most controls */
        return 1;
    }
    size_t n = utf8_len(u + i, len - i);
    if (n == 0) {
        gc_strbuf_ch(b, '?');
        return 1;
    }
    gc_strbuf_put(b, (const char *)u + i, n);
    return n;
}

void gc_chart_escape(gc_strbuf *b, const char *s, size_t max_bytes)
{
    if (!s)
        return;
    const unsigned char *u = (const unsigned char *)s;
    size_t len = used_len(s, max_bytes);
    for (size_t i = 0; i < len;)
        i += escape_one(b, u, i, len);
}

size_t gc_chart_text_chars(const char *s, size_t max_bytes)
{
    if (!s)
        return 0;
    const unsigned char *u = (const unsigned char *)s;
    size_t len = used_len(s, max_bytes), n = 0;
    for (size_t i = 0; i < len; n++) {
        size_t k = utf8_len(u + i, len - i);
        i += k ? k : 1;
    }
    return n;
}

/* Escaped text of at most max_chars estimated characters: a longer text (or
 * one beyond GC_CHART_TEXT_LEN bytes) is cut one character short of its room
 * and ends in "…". */
void gc__chart_text_cut(gc_strbuf *b, const char *s, double max_chars)
{
    if (!s)
        return;
    size_t chars = gc_chart_text_chars(s, GC_CHART_TEXT_LEN);
    int too_long = strlen(s) > GC_CHART_TEXT_LEN;
    if ((double)chars <= max_chars && !too_long) {
        gc_chart_escape(b, s, GC_CHART_TEXT_LEN);
        return;
    }
    long keep = (long)floor(fmin(max_chars, (double)chars)) - 1;
    const unsigned char *u = (const unsigned char *)s;
    size_t len = used_len(s, GC_CHART_TEXT_LEN);
    size_t i = 0;
    for (long k = 0; k < keep && i < len; k++)
        i += escape_one(b, u, i, len);
    gc_strbuf_puts(b, "\xe2\x80\xa6");
}

/* px rounded to two decimals (trailing zeros dropped), without printf and
 * its locale. v is finite. */
void gc__chart_num(gc_strbuf *b, double v)
{
    char tmp[48];
    char *e = tmp + sizeof tmp, *p = e;
    if (!(fabs(v) < 1e15))
        v = v < 0.0 ? -1e15 : 1e15;   /* never reached with px inside the picture */
    long long q = llround(fabs(v) * 100.0);
    int neg = v < 0.0 && q != 0;
    int frac = (int)(q % 100);
    q /= 100;
    if (frac != 0) {
        if (frac % 10 != 0)
            *--p = (char)('0' + frac % 10);
        *--p = (char)('0' + frac / 10);
        *--p = '.';
    }
    do {
        *--p = (char)('0' + q % 10);
        q /= 10;
    } while (q > 0);
    if (neg)
        *--p = '-';
    gc_strbuf_put(b, p, (size_t)(e - p));
}

/* ---- numbers --------------------------------------------------------------- */

typedef struct numout {
    char *s;
    size_t n, len;
    int full;
} numout;

static void out_put(numout *o, const char *t, size_t k)
{
    if (o->full || o->len + k + 1 > o->n) {
        o->full = 1;
        return;
    }
    memcpy(o->s + o->len, t, k);
    o->len += k;
    o->s[o->len] = '\0';
}

static void out_ch(numout *o, char c)
{
    out_put(o, &c, 1);
}

/* Integer digits, grouped in threes by a thin space when there are 5 or more
 * (common practice: four-digit numbers stay whole, 10 000 is grouped; in a
 * column with larger numbers, GROUP4 groups 8 000 as well). */
static void out_int(numout *o, const char *d, size_t k, unsigned flags)
{
    int group = (flags & GC_CHART_FMT_GROUP) && (k >= 5 || (k == 4 && (flags & GC_CHART_FMT_GROUP4)));
    for (size_t i = 0; i < k; i++) {
        if (group && i > 0 && (k - i) % 3 == 0)
            out_put(o, THIN_SPACE, sizeof THIN_SPACE - 1);
        out_ch(o, d[i]);
    }
}

/* The exponent of a power of ten, as superscript characters or an SVG tspan. */
static void out_pow10(numout *o, int e, unsigned flags)
{
    static const char *const sup[10] = {
        "\xe2\x81\xb0", "\xc2\xb9", "\xc2\xb2", "\xc2\xb3", "\xe2\x81\xb4",
        "\xe2\x81\xb5", "\xe2\x81\xb6", "\xe2\x81\xb7", "\xe2\x81\xb8", "\xe2\x81\xb9",
    };
    char digits[16];
    snprintf(digits, sizeof digits, "%d", e < 0 ? -e : e);
    out_put(o, "10", 2);
    if (flags & GC_CHART_FMT_SVG) {
        static const char open[] = "<tspan baseline-shift=\"super\" font-size=\"75%\">";
        out_put(o, open, sizeof open - 1);
        if (e < 0)
            out_ch(o, '-');
        out_put(o, digits, strlen(digits));
        out_put(o, "</tspan>", 8);
        return;
    }
    if (e < 0)
        out_put(o, "\xe2\x81\xbb", 3);   /* superscript minus */
    for (const char *p = digits; *p; p++)
        out_put(o, sup[*p - '0'], strlen(sup[*p - '0']));
}

static int finish(numout *o)
{
    if (o->full) {
        if (o->n > 0)
            o->s[0] = '\0';
        return -1;
    }
    return (int)o->len;
}

int gc_chart_format_sig(double v, int sig, unsigned flags, char *out, size_t n)
{
    numout o = { out, n, 0, 0 };
    if (n > 0)
        out[0] = '\0';
    if (!out || n == 0 || !isfinite(v) || sig < 1 || sig > 15)
        return -1;
    if (v == 0.0) {
        out_ch(&o, '0');
        return finish(&o);
    }
    /* significant digits and decimal exponent from printf's %e */
    char e[64], d[24];
    snprintf(e, sizeof e, "%.*e", sig - 1, fabs(v));
    size_t nd = 0;
    const char *p = e;
    for (; *p && *p != 'e' && *p != 'E'; p++)
        if (*p >= '0' && *p <= '9' && nd < sizeof d - 1)
            d[nd++] = *p;
    int ex = *p ? atoi(p + 1) : 0;
    while (!(flags & GC_CHART_FMT_ZEROS) && nd > 1 && d[nd - 1] == '0')
        nd--;                             /* trailing zeros, unless significant to the caller */
    d[nd] = '\0';
    if (v < 0.0)
        out_ch(&o, '-');
    if (ex < -5 || ex > 11) {             /* mantissa x 10^ex */
        out_ch(&o, d[0]);
        if (nd > 1) {
            out_ch(&o, '.');
            out_put(&o, d + 1, nd - 1);
        }
        out_put(&o, TIMES, sizeof TIMES - 1);
        out_pow10(&o, ex, flags);
        return finish(&o);
    }
    if (ex >= 0) {
        char ip[24];
        size_t ni = (size_t)ex + 1;
        for (size_t i = 0; i < ni; i++)
            ip[i] = i < nd ? d[i] : '0';
        out_int(&o, ip, ni, flags);
        if (nd > ni) {
            out_ch(&o, '.');
            out_put(&o, d + ni, nd - ni);
        }
    } else {
        out_put(&o, "0.", 2);
        for (int i = -1; i > ex; i--)
            out_ch(&o, '0');
        out_put(&o, d, nd);
    }
    return finish(&o);
}

int gc_chart_format_fixed(double v, int decimals, unsigned flags, char *out, size_t n)
{
    if (out && n > 0)
        out[0] = '\0';
    if (!out || n == 0 || !isfinite(v) || decimals < 0 || decimals > 12)
        return -1;
    if (fabs(v) >= 1e12)
        return gc_chart_format_sig(v, 6, flags, out, n);
    char t[64];
    snprintf(t, sizeof t, "%.*f", decimals, fabs(v));
    char ip[32] = { 0 }, fp[16] = { 0 };
    size_t ni = 0, nf = 0;
    const char *p = t;
    for (; *p >= '0' && *p <= '9'; p++)
        if (ni < sizeof ip)
            ip[ni++] = *p;
    if (*p)
        p++;                              /* the locale's decimal point */
    for (; *p >= '0' && *p <= '9'; p++)
        if (nf < sizeof fp)
            fp[nf++] = *p;
    int zero = 1;
    for (size_t i = 0; i < ni; i++)
        zero &= ip[i] == '0';
    for (size_t i = 0; i < nf; i++)
        zero &= fp[i] == '0';
    numout o = { out, n, 0, 0 };
    if (v < 0.0 && !zero)
        out_ch(&o, '-');
    out_int(&o, ip, ni, flags);
    if (nf > 0) {
        out_ch(&o, '.');
        out_put(&o, fp, nf);
    }
    return finish(&o);
}
