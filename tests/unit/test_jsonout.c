/*
 * test_jsonout.c — the fast JSON encoder (service/api/respond/jsonout.h) against
 * jansson itself: every output must equal json_dumps(v, JSON_COMPACT |
 * JSON_REAL_PRECISION(p)) byte for byte (the reference is the library the
 * service links, Debian's jansson 2.14). Inputs: reals across all
 * magnitudes (random bit patterns, random decimals, values at and next to
 * rounding ties and decade boundaries, powers of ten, subnormals, negative
 * zero), integers to the int64 limits, strings with every control
 * character, quotes, backslashes, slashes, DEL and valid UTF-8 of one to
 * four bytes, member keys (gc_json_put_key, against the string writer),
 * and random nested documents. Invalid UTF-8 (which jansson
 * only admits through json_stringn_nocheck) must fail as json_dumps fails.
 */
#include "api/respond/jsonout.h"
#include "check.h"

#include <jansson.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

static uint64_t rng = 0x853c49e6748fea9bull;
static uint64_t next_u64(void)
{
    rng ^= rng << 13;
    rng ^= rng >> 7;
    rng ^= rng << 17;
    return rng;
}
static double urand(void) { return (double)(next_u64() >> 11) * (1.0 / 9007199254740992.0); }

static int mismatches;

/* Encodes v both ways and compares; prints the first few differences. */
static void same(json_t *v, int precision, const char *what)
{
    char *want = json_dumps(v, JSON_COMPACT | JSON_ENCODE_ANY | JSON_REAL_PRECISION(precision));
    size_t len = 0;
    char *got = gc_json_dump(v, precision, &len);
    int ok = want && got && strcmp(want, got) == 0 && len == strlen(want);
    if (!ok && mismatches++ < 10)
        fprintf(stderr, "jsonout (%s, precision %d): got %s, json_dumps %s\n", what, precision,
                got ? got : "(null)", want ? want : "(null)");
    CU_ASSERT(ok);
    free(want);
    free(got);
}

static double random_real(void)
{
    switch (next_u64() % 6) {
    case 0: { /* any finite bit pattern: every exponent, subnormals included */
        uint64_t bits;
        double d;
        do {
            bits = next_u64();
            memcpy(&d, &bits, sizeof d);
        } while (!isfinite(d));
        return d;
    }
    case 1: /* engineering magnitudes */
        return (urand() - 0.5) * pow(10.0, (double)(int)(next_u64() % 30) - 12.0);
    case 2: { /* short decimals, which often sit on or next to a printed tie */
        double d = (double)(int64_t)(next_u64() % 2000000001u) - 1e9;
        return d / pow(10.0, (double)(next_u64() % 16));
    }
    case 3: { /* a 10- or 11-digit decimal with a 5 at the end: a tie at 10 digits */
        double d = (double)(next_u64() % 9000000000ull + 1000000000ull) * 10.0 + 5.0;
        return d * pow(10.0, (double)(int)(next_u64() % 40) - 25.0);
    }
    case 4: { /* next to a decade boundary */
        double d = pow(10.0, (double)(int)(next_u64() % 60) - 30.0);
        int steps = (int)(next_u64() % 7) - 3;
        for (int i = 0; i < abs(steps); i++)
            d = nextafter(d, steps > 0 ? INFINITY : 0.0);
        return (next_u64() & 1) ? d : -d;
    }
    default: /* 1 - 1e-10 style values that round up to the next decade */
        return (1.0 - pow(10.0, -(double)(next_u64() % 16))) *
               pow(10.0, (double)(int)(next_u64() % 40) - 20.0);
    }
}

static void test_reals(void)
{
    static const double fixed[] = {
        0.0, -0.0, 1.0, -1.0, 0.1, 0.5, 1.5, 2.5, 1e-4, 1e-5, 9.999999999e-5, 1e9, 1e10,
        12345.0, 1234567890.0, 12345678901.0, 9999999999.0, 9999999999.5, 99999999995.0,
        1e15, 1e16, 1e22, 1e23, 1e100, 1e-100, 1e300, 1e-300, 1.7976931348623157e308,
        2.2250738585072014e-308, 4.9406564584124654e-324, 1.0 / 3.0, 2.0 / 3.0, 288.15,
        101325.0, 0.28571428571428571, 123456.78905, 1.00000000005, 3.14159265358979,
    };
    char buf[GC_JSON_REAL_MAX];
    for (size_t i = 0; i < sizeof fixed / sizeof fixed[0]; i++) {
        for (int sgn = 0; sgn < 2; sgn++) {
            double d = sgn ? -fixed[i] : fixed[i];
            json_t *r = json_real(d);
            for (int p = 0; p <= 17; p++) {
                if (d == 0.0 && signbit(d))
                    continue; /* the one deliberate difference: see test_negative_zero */
                same(r, p, "fixed real");
            }
            json_decref(r);
        }
    }
    /* 400000 random reals at the service's precision, 40000 at others */
    for (int i = 0; i < 440000; i++) {
        double d = random_real();
        int p = i < 400000 ? 10 : (int)(next_u64() % 18);
        json_t *r = json_real(d);
        same(r, p, "random real");
        json_decref(r);
    }
    /* the formatter alone gives the same text */
    json_t *r = json_real(-1.25e-7);
    char *want = json_dumps(r, JSON_ENCODE_ANY | JSON_REAL_PRECISION(10));
    int n = gc_json_format_real(buf, -1.25e-7, 10);
    CU_ASSERT(want && strcmp(buf, want) == 0 && n == (int)strlen(want));
    free(want);
    json_decref(r);
}

/* One real through gc_json_format_real against json_dumps (snprintf "%.*g"
 * and jansson's own post-processing); counts the differences. */
static int real_differs(double d, int p)
{
    char got[GC_JSON_REAL_MAX];
    json_t *r = json_real(d);
    char *want = json_dumps(r, JSON_ENCODE_ANY | JSON_REAL_PRECISION(p));
    int n = gc_json_format_real(got, d, p);
    int bad = !want || strcmp(got, want) != 0 || n != (int)strlen(want);
    if (bad && mismatches++ < 10)
        fprintf(stderr, "jsonout (format_real %a, precision %d): got %s, json_dumps %s\n", d,
                p, got, want ? want : "(null)");
    free(want);
    json_decref(r);
    return bad;
}

/* One million reals at the service's precision (10), weighted to where the
 * writer meets them and where the fast route is delicate: the residuals of
 * the checks (1e-45 .. 1e-12, scaled with two multiplications), values a
 * few units in the last place from a printed tie there and at engineering
 * magnitudes, neighbours of every power of ten from 1e-45 to 1e30,
 * subnormals and the smallest normals, and any bit pattern. Each text must
 * equal json_dumps's byte for byte. */
static void test_reals_million(void)
{
    int bad = 0;
    for (int i = 0; i < 1000000; i++) {
        double d;
        switch (i % 6) {
        case 0: /* small magnitudes, random mantissa */
            d = (0.1 + 0.9 * urand()) * pow(10.0, -12.0 - (double)(next_u64() % 34));
            break;
        case 1: { /* next to a 10-digit tie: (N + 1/2) 10^e, a few ulps either way */
            double N = (double)(next_u64() % 9000000000ull + 1000000000ull);
            d = (N + 0.5) * pow(10.0, (double)(int)(next_u64() % 60) - 54.0);
            int steps = (int)(next_u64() % 9) - 4;
            for (int k = 0; k < abs(steps); k++)
                d = nextafter(d, steps > 0 ? INFINITY : 0.0);
            break;
        }
        case 2: { /* neighbours of a power of ten */
            d = pow(10.0, (double)(int)(next_u64() % 76) - 45.0);
            int steps = (int)(next_u64() % 9) - 4;
            for (int k = 0; k < abs(steps); k++)
                d = nextafter(d, steps > 0 ? INFINITY : 0.0);
            break;
        }
        case 3: { /* subnormals and the smallest normals */
            uint64_t bits = next_u64() & ((1ull << 53) - 1);
            memcpy(&d, &bits, sizeof d);
            break;
        }
        case 4: /* engineering magnitudes */
            d = urand() * pow(10.0, (double)(int)(next_u64() % 24) - 8.0);
            break;
        default: { /* any finite bit pattern */
            uint64_t bits;
            do {
                bits = next_u64();
                memcpy(&d, &bits, sizeof d);
            } while (!isfinite(d));
        }
        }
        if (next_u64() & 1)
            d = -d;
        if (d == 0.0)
            continue;
        bad += real_differs(d, 10);
    }
    CU_ASSERT_EQUAL(bad, 0);
}

/* No output carries a negative zero (issue 10: "-0" in responses): -0.0 is
 * written "0.0" at every precision, alone and inside a document, where
 * json_dumps writes "-0.0" (the definition of IEEE 754 signed zero; common
 * practice for JSON numbers, which have no negative zero of their own). */
static void test_negative_zero(void)
{
    char buf[GC_JSON_REAL_MAX];
    for (int p = 0; p <= 17; p++) {
        int n = gc_json_format_real(buf, -0.0, p);
        CU_ASSERT(n == 3 && strcmp(buf, "0.0") == 0);
    }
    json_t *doc = json_pack("{s:f,s:[f,f]}", "dissipated_work", -0.0, "v", 0.0, -0.0);
    char *got = gc_json_dump(doc, 10, NULL);
    CU_ASSERT_PTR_NOT_NULL_FATAL(got);
    CU_ASSERT_STRING_EQUAL(got, "{\"dissipated_work\":0.0,\"v\":[0.0,0.0]}");
    CU_ASSERT_PTR_NULL(strstr(got, "-0"));
    char *jd = json_dumps(doc, JSON_COMPACT | JSON_REAL_PRECISION(10));
    CU_ASSERT(jd && strstr(jd, "-0.0") != NULL); /* the difference this encoder makes */
    free(jd);
    free(got);
    json_decref(doc);
}

static void test_integers(void)
{
    static const json_int_t fixed[] = { 0, 1, -1, 9, 10, -10, 1000000, INT64_MAX, INT64_MIN,
                                        INT64_MAX - 1, INT64_MIN + 1 };
    for (size_t i = 0; i < sizeof fixed / sizeof fixed[0]; i++) {
        json_t *v = json_integer(fixed[i]);
        same(v, 10, "integer");
        json_decref(v);
    }
    for (int i = 0; i < 20000; i++) {
        json_int_t x = (json_int_t)next_u64() >> (next_u64() % 64);
        json_t *v = json_integer(x);
        same(v, 10, "random integer");
        json_decref(v);
    }
}

/* A random valid UTF-8 string of up to n code points with escapes mixed in. */
static size_t random_text(char *out, size_t n)
{
    size_t k = 0;
    for (size_t i = 0; i < n; i++) {
        unsigned r = (unsigned)(next_u64() % 10);
        uint32_t cp;
        if (r < 3)
            cp = (uint32_t)(next_u64() % 0x20);          /* control characters */
        else if (r < 4)
            cp = "\"\\/\x7f"[next_u64() % 4];
        else if (r < 7)
            cp = 0x20 + (uint32_t)(next_u64() % 0x5F);   /* printable ASCII */
        else if (r < 8)
            cp = 0x80 + (uint32_t)(next_u64() % 0x780);  /* two bytes */
        else if (r < 9) {
            do
                cp = 0x800 + (uint32_t)(next_u64() % 0xF800);  /* three bytes, no surrogates */
            while (cp >= 0xD800 && cp <= 0xDFFF);
        } else
            cp = 0x10000 + (uint32_t)(next_u64() % 0x100000); /* four bytes */
        if (cp < 0x80) {
            out[k++] = (char)cp;
        } else if (cp < 0x800) {
            out[k++] = (char)(0xC0 | (cp >> 6));
            out[k++] = (char)(0x80 | (cp & 0x3F));
        } else if (cp < 0x10000) {
            out[k++] = (char)(0xE0 | (cp >> 12));
            out[k++] = (char)(0x80 | ((cp >> 6) & 0x3F));
            out[k++] = (char)(0x80 | (cp & 0x3F));
        } else {
            out[k++] = (char)(0xF0 | (cp >> 18));
            out[k++] = (char)(0x80 | ((cp >> 12) & 0x3F));
            out[k++] = (char)(0x80 | ((cp >> 6) & 0x3F));
            out[k++] = (char)(0x80 | (cp & 0x3F));
        }
    }
    return k;
}

static void test_strings(void)
{
    char buf[4 * 4096 + 1];
    /* every control character and the escapes, one at a time */
    for (int c = 0; c < 0x80; c++) {
        char s[3] = { 'a', (char)c, 'b' };
        json_t *v = json_stringn(s, 3);
        CU_ASSERT_PTR_NOT_NULL_FATAL(v);
        same(v, 10, "one character");
        json_decref(v);
    }
    for (int i = 0; i < 3000; i++) {
        size_t n = random_text(buf, i < 2990 ? (size_t)(next_u64() % 64) : 4096);
        json_t *v = json_stringn(buf, n);
        CU_ASSERT_PTR_NOT_NULL_FATAL(v);
        same(v, 10, "random string");
        json_decref(v);
    }
    /* a member key: the string's text and ':' (plain keys up to 61 bytes take
     * a short route, longer ones and those with escapes the string writer's) */
    for (int i = 0; i < 3000; i++) {
        size_t n = i < 128 ? 3 : random_text(buf, (size_t)(next_u64() % (i % 2 ? 24 : 90)));
        if (i < 128) {
            buf[0] = 'k';
            buf[1] = (char)(i ? i : 'x');
            buf[2] = 'z';
        } else if (i < 400) {   /* plain keys of 0 .. 135 bytes, one escape at times */
            n = (size_t)(i - 128) / 2;
            for (size_t j = 0; j < n; j++)
                buf[j] = (char)('a' + (j * 7 + (size_t)i) % 26);
            if (i % 2 && n > 0)
                buf[(size_t)i % n] = '"';
        }
        buf[n] = '\0';
        n = strlen(buf);   /* a key ends at its first NUL */
        gc_strbuf a = { 0 }, b = { 0 };
        gc_json_put_key(&a, buf);
        gc_json_put_string(&b, buf, n);
        gc_strbuf_ch(&b, ':');
        int ok = a.s && b.s && a.failed == b.failed && a.len == b.len &&
                 memcmp(a.s, b.s, a.len) == 0 && a.s[a.len] == '\0';
        if (!ok && mismatches++ < 10)
            fprintf(stderr, "jsonout (key %s): got %s, want %s\n", buf, a.s ? a.s : "(null)",
                    b.s ? b.s : "(null)");
        CU_ASSERT(ok);
        free(a.s);
        free(b.s);
    }
    /* invalid UTF-8 fails both ways */
    static const char *const bad[] = { "\xc0\xaf", "\xed\xa0\x80", "\xf4\x90\x80\x80", "\x80",
                                       "a\xe2\x82", "\xf8\x88\x80\x80\x80" };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        json_t *v = json_stringn_nocheck(bad[i], strlen(bad[i]));
        char *w = json_dumps(v, JSON_ENCODE_ANY);
        char *g = gc_json_dump(v, 10, NULL);
        CU_ASSERT_PTR_NULL(w);
        CU_ASSERT_PTR_NULL(g);
        free(w);
        free(g);
        json_decref(v);
    }
}

static json_t *random_doc(int depth)
{
    unsigned r = (unsigned)(next_u64() % (depth > 4 ? 6 : 9));
    char key[256];
    switch (r) {
    case 0: return json_real(random_real());
    case 1: return json_integer((json_int_t)(next_u64() % 2000001) - 1000000);
    case 2: {
        size_t n = random_text(key, next_u64() % 20);
        return json_stringn(key, n);
    }
    case 3: return json_true();
    case 4: return json_false();
    case 5: return json_null();
    case 6:
    case 7: {
        json_t *o = json_object();
        int n = (int)(next_u64() % 8);
        for (int i = 0; i < n; i++) {
            size_t k = random_text(key, next_u64() % 12);
            json_object_setn_new(o, key, k, random_doc(depth + 1));
        }
        return o;
    }
    default: {
        json_t *a = json_array();
        int n = (int)(next_u64() % 8);
        for (int i = 0; i < n; i++)
            json_array_append_new(a, random_doc(depth + 1));
        return a;
    }
    }
}

static void test_documents(void)
{
    for (int i = 0; i < 3000; i++) {
        json_t *d = random_doc(0);
        same(d, 10, "random document");
        json_decref(d);
    }
    /* key order is insertion order, not sorted */
    json_t *o = json_pack("{s:i,s:i,s:i}", "zeta", 1, "alpha", 2, "mid", 3);
    char *g = gc_json_dump(o, 10, NULL);
    CU_ASSERT_STRING_EQUAL(g, "{\"zeta\":1,\"alpha\":2,\"mid\":3}");
    free(g);
    json_decref(o);
    /* a document shaped like a cycle reply: states and processes tables */
    json_t *doc = json_object();
    json_t *states = json_array();
    for (int i = 0; i < 12; i++)
        json_array_append_new(states, json_pack("{s:f,s:f,s:f,s:f,s:f,s:f}", "T", 288.15 + 97.3 * i,
                                                "P", 101.325 * (1 + i), "v", 0.8 / (1 + i),
                                                "u", 205.9 * i, "h", 288.4 * i, "s", 5.6 + 0.01 * i));
    json_object_set_new(doc, "states", states);
    same(doc, 10, "cycle-shaped document");
    json_decref(doc);
}

static void test_empty_and_nesting(void)
{
    json_t *v = json_pack("{s:{},s:[],s:[[],[{}]]}", "a", "b", "c");
    same(v, 10, "empty containers");
    json_decref(v);
    /* deep nesting within the limit encodes; beyond it fails */
    json_t *root = json_array(), *cur = root;
    for (int i = 0; i < 500; i++) {
        json_t *n = json_array();
        json_array_append_new(cur, n);
        cur = n;
    }
    same(root, 10, "deep nesting");
    json_decref(root);
    CU_ASSERT_PTR_NULL(gc_json_dump(NULL, 10, NULL));
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "reals equal json_dumps", test_reals },
        { "a million reals at precision 10 equal json_dumps", test_reals_million },
        { "negative zero written 0.0", test_negative_zero },
        { "integers equal json_dumps", test_integers },
        { "strings equal json_dumps", test_strings },
        { "documents equal json_dumps", test_documents },
        { "empty containers and nesting", test_empty_and_nesting },
        { NULL, NULL },
    };
    return gc_run_suite("jsonout", cases);
}
