/*
 * test_series_scan.c — the scanner of a JSON body's long series
 * (service/api/request/series_scan.c) against jansson, the reference it must
 * equal:
 *   - every number: the scanner's double bit for bit (memcmp: -0.0 and +0.0
 *     differ) the one jansson 2.14 gives for the same token in "[token]",
 *     and refused exactly when jansson refuses the document, over random
 *     doubles printed with 1 to 17 significant digits (%g, %e), random digit
 *     strings (up to 25 digits before and after the point, exponents to
 *     +-330), values as a recorder writes them (%.Nf), and the edge
 *     spellings: -0, -0.0, 0e0, 1e-320 and the smallest subnormals, 1e308
 *     and the largest double with its rounding boundary, the long long
 *     limits, 2^53 + 1 written as an integer and as a real, 17-digit
 *     mantissas, halfway cases, the bounds of the scanner's exact fast path
 *     (2^53, decimal exponents 22 and 23, 19 and 20 digits); and spellings jansson refuses (01, 1., .5,
 *     +1, 1e, 0x10, NaN, Infinity, 1e400, 9223372036854775808);
 *   - a whole request: the combustion route's body decoded through jansson
 *     alone and through the scanner gives the same normaliser outcome (the
 *     same problem, byte for byte), the same field errors (pointer and
 *     sentence, in order) and the same decoded series bit for bit; for
 *     valid recordings in varied spellings and whitespace, each error the
 *     series can carry (a bound, a non-number naming /cycles/k/j, ragged
 *     series, too few values, no series, a number jansson refuses, a
 *     duplicate member, a syntax error after the arrays with its line and
 *     column, nesting too deep elsewhere), and thousands of random byte
 *     mutations of a valid body. The tests also check that the valid bodies
 *     did go through the scanner (else the comparison would prove nothing);
 *   - the route's handler: a recording of the size answered, one
 *     over max_json_values still refused with 413 before any parsing.
 * Reference: jansson itself (the library the service parses JSON with).
 */
#include "api/api.h"
#include "api/handlers.h"
#include "api/request/decode.h"
#include "api/request/fields.h"
#include "api/request/series_scan.h"
#include "check.h"
#include "gascycle/preset.h"

#include <float.h>
#include <jansson.h>
#include <math.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- a fixed pseudo-random sequence (xorshift64*, fixed seed) ---------------------------- */

static uint64_t rng_state = 0x9e3779b97f4a7c15u;

static uint64_t rnd(void)
{
    rng_state ^= rng_state >> 12;
    rng_state ^= rng_state << 25;
    rng_state ^= rng_state >> 27;
    return rng_state * 2685821657736338717u;
}

static int rnd_int(int lo, int hi)
{
    return lo + (int)(rnd() % (uint64_t)(hi - lo + 1));
}

/* ---- one number against jansson -------------------------------------------------------- */

static long n_compared, n_mismatch;

/* The token in "[tok]" (an exact-size buffer: an overread shows under
 * ASan): jansson's value or refusal against the scanner's. */
static void compare_token(const char *tok)
{
    size_t n = strlen(tok);
    char *buf = malloc(n + 2);
    buf[0] = '[';
    memcpy(buf + 1, tok, n);
    buf[n + 1] = ']';
    json_error_t je;
    json_t *j = json_loadb(buf, n + 2, 0, &je);
    int j_ok = j && json_array_size(j) == 1 && json_is_number(json_array_get(j, 0));
    double jv = j_ok ? json_number_value(json_array_get(j, 0)) : 0.0;
    double sv = 0.0;
    const char *end = NULL;
    int s_ok = gc_api_scan_number(buf + 1, buf + n + 2, &sv, &end) == 0 && end == buf + n + 1;
    int same = j_ok == s_ok && (!j_ok || memcmp(&jv, &sv, sizeof jv) == 0);
    if (!same && n_mismatch++ < 10)
        fprintf(stderr, "token '%s': jansson %s %.17g, scanner %s %.17g\n", tok,
                j_ok ? "reads" : "refuses", jv, s_ok ? "reads" : "refuses", sv);
    n_compared++;
    json_decref(j);
    free(buf);
}

static double random_double(void)
{
    for (;;) {
        uint64_t bits = rnd();
        double x;
        memcpy(&x, &bits, sizeof x);
        if (isfinite(x))
            return x;
    }
}

static void random_digits(char *out, int n, int lead_ok)
{
    for (int i = 0; i < n; i++)
        out[i] = (char)('0' + rnd_int(i == 0 && !lead_ok ? 1 : 0, 9));
    out[n] = '\0';
}

/* A random JSON number: sign, 1 to 25 digits, maybe a fraction of 1 to 25
 * digits, maybe an exponent within +-330. */
static void random_token(char *tok)
{
    char ip[32], fp[32], ex[16] = "";
    int nint = rnd_int(1, 25);
    if (rnd_int(0, 3) == 0)
        strcpy(ip, "0");
    else
        random_digits(ip, nint, 0);
    fp[0] = '\0';
    if (rnd_int(0, 1))
        random_digits(fp, rnd_int(1, 25), 1);
    if (rnd_int(0, 1))
        snprintf(ex, sizeof ex, "%c%s%d", rnd_int(0, 1) ? 'e' : 'E',
                 rnd_int(0, 2) == 0 ? "+" : "", rnd_int(-330, 330));
    sprintf(tok, "%s%s%s%s%s", rnd_int(0, 1) ? "-" : "", ip, fp[0] ? "." : "", fp, ex);
}

static void test_numbers_random(void)
{
    char tok[128];
    n_compared = n_mismatch = 0;
    for (int i = 0; i < 40000; i++) {
        double x = random_double();
        snprintf(tok, sizeof tok, "%.*g", rnd_int(1, 17), x);
        compare_token(tok);
        snprintf(tok, sizeof tok, "%.17g", x);
        compare_token(tok);
        snprintf(tok, sizeof tok, "%.*e", rnd_int(0, 20), x);
        compare_token(tok);
        random_token(tok);
        compare_token(tok);
        snprintf(tok, sizeof tok, "%.*f", rnd_int(0, 6),
                 (double)(rnd() % 1440000) / 1000.0 - 720.0);   /* as a recorder writes */
        compare_token(tok);
    }
    printf("\n  %ld tokens compared with jansson, %ld differ\n", n_compared, n_mismatch);
    CU_ASSERT_EQUAL(n_mismatch, 0);
    CU_ASSERT(n_compared == 200000);
}

static void test_numbers_edges(void)
{
    static const char *const toks[] = {
        "0", "-0", "0.0", "-0.0", "0e0", "-0e-0", "0E+5", "0e500", "-0e-500", "1", "-1",
        "1e-320", "-1e-320", "4.9e-324", "5e-324", "2.4703282292062327e-324",
        "2.4703282292062328e-324", "1e-400", "2.2250738585072011e-308",
        "2.2250738585072014e-308", "1e308", "-1e308", "1.7976931348623157e308",
        "1.7976931348623158e308", "1.797693134862315807e308", "1.7976931348623159e308",
        "1e309", "-1e309", "1e400", "123456789012345678", "1234567890123456789",
        "9223372036854775807", "-9223372036854775808", "9223372036854775808",
        "-9223372036854775809", "99999999999999999999", "9007199254740993",
        "9007199254740993.0", "9007199254740993.000000000000000000001", "9007199254740995",
        "0.1", "0.2", "0.30000000000000004", "1.2345678901234567", "12345678901234567e-16",
        "123456789012345.6", "999999999999999", "9999999999999999", "1e22", "1e23", "1e-22",
        "1e-23", "8.98846567431158e307", "0.000000000000000000000000000001", "1E+2",
        "1e-0", "100000000000000000000000", "1.5e+0300", "7.2e2", "-720", "719.5",
        /* the bounds of the exact fast path: m = 2^53 and 2^53 + 1, exponents 22 and 23 */
        "9007199254740992e-22", "9007199254740993e-22", "9007199254740992e22",
        "9007199254740993e22", "-9007199254740991e-23", "4503599627370497e-22",
        "1234567890123456789e-5", "12345678901234567890e-5", "0.0000000000000000000001",
        "0.00000000000000000000001", "1.000000000000000000", "3.1415926535897932384626",
        /* refused by jansson: the scanner must refuse them too */
        "01", "-01", "00", "1.", "-", ".5", "+1", "1e", "1e+", "1E-", "0x10", "NaN",
        "Infinity", "-Infinity", "1.5.2", "1e5.3", "--1", "1 2", "", "1,", "true",
    };
    n_compared = n_mismatch = 0;
    for (size_t i = 0; i < sizeof toks / sizeof toks[0]; i++)
        compare_token(toks[i]);
    CU_ASSERT_EQUAL(n_mismatch, 0);
}

/* ---- a whole request, both ways -------------------------------------------------------- */

static const gc_preset *comb;
static int n_scanned;   /* requests that went through the scanner */

typedef struct {
    int rc;                 /* the normaliser's */
    int status;
    char *problem;          /* its body */
    size_t problem_len;
    gc_api_errors errs;
    char *input;
} outcome;

static void decode_way(const char *body, size_t len, int scan_it, outcome *o)
{
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_POST;
    req.path = "/v1/measured/combustion";
    req.body = body;
    req.body_len = len;
    req.content_type = "application/json";
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    memset(o, 0, sizeof *o);
    json_t *root = NULL;
    gc_api_scan scan;
    memset(&scan, 0, sizeof scan);
    int diagram = comb->kind == GC_PRESET_CYCLE || comb->svg;
    o->rc = scan_it ? gc_api_scan_normalise(comb, &req, diagram, &scan, &root, &resp)
                    : gc_decode_normalise_ex(&req, diagram, &root, &resp);
    o->status = resp.status;
    o->problem = resp.body;
    o->problem_len = resp.body_len;
    n_scanned += scan.n > 0;
    gc_api_errors_init(&o->errs);
    if (o->rc == 0) {
        gc_decode_ctx ctx;
        gc_decode_ctx_init(&ctx);
        ctx.scan = &scan;
        o->input = calloc(1, comb->input_size);
        gc_preset_input_init(comb, o->input);
        gc_api_fields_decode(comb, root, 0, o->input, "", &o->errs, &ctx);
    }
    json_decref(root);
    gc_api_scan_free(&scan);
}

/* The series of both inputs, bit for bit. */
static int same_series(const char *a, const char *b)
{
    for (int r = 1; r < comb->n_fields; r++) {
        const gc_field *f = &comb->fields[r];
        if (f->type != GC_FT_SERIES && f->type != GC_FT_SERIES_LIST)
            continue;
        double *xa = *(double *const *)(const void *)(a + f->offset);
        double *xb = *(double *const *)(const void *)(b + f->offset);
        int na = *(const int *)(const void *)(a + f->count - 1);
        int nb = *(const int *)(const void *)(b + f->count - 1);
        int la = 1, lb = 1;
        if (f->type == GC_FT_SERIES_LIST) {
            la = *(const int *)(const void *)(a + f->aux - 1);
            lb = *(const int *)(const void *)(b + f->aux - 1);
        }
        if (na != nb || la != lb || (!xa) != (!xb))
            return 0;
        if (xa && memcmp(xa, xb, (size_t)na * (size_t)la * sizeof *xa) != 0)
            return 0;
    }
    return 1;
}

static int same_errors(const gc_api_errors *a, const gc_api_errors *b)
{
    if (a->n != b->n || a->dropped != b->dropped)
        return 0;
    for (int i = 0; i < a->n; i++)
        if (strcmp(a->e[i].field, b->e[i].field) || strcmp(a->e[i].message, b->e[i].message))
            return 0;
    return 1;
}

static void release(outcome *o)
{
    if (o->input) {
        gc_api_fields_release(comb, o->input);
        free(o->input);
    }
    free(o->problem);
}

/* Decodes body both ways; 1 when they agree. errs0: the first field error
 * of the scanner's way, for the caller's own check (may be NULL). */
static int both_ways(const char *text, size_t len, gc_api_field_error *first)
{
    char *body = malloc(len ? len : 1);   /* exact size, no NUL: as the HTTP layer passes it */
    memcpy(body, text, len);
    outcome a, b;
    decode_way(body, len, 0, &a);
    decode_way(body, len, 1, &b);
    int same = a.rc == b.rc && a.status == b.status && a.problem_len == b.problem_len &&
               (!a.problem_len || memcmp(a.problem, b.problem, a.problem_len) == 0) &&
               same_errors(&a.errs, &b.errs) && (a.rc != 0 || same_series(a.input, b.input));
    if (!same)
        fprintf(stderr, "\n  the two ways differ on '%.200s': rc %d/%d, status %d/%d, errors "
                "%d/%d (%s / %s)\n", text, a.rc, b.rc, a.status, b.status, a.errs.n, b.errs.n,
                a.errs.n ? a.errs.e[0].message : "", b.errs.n ? b.errs.e[0].message : "");
    if (first) {
        memset(first, 0, sizeof *first);
        if (b.errs.n)
            *first = b.errs.e[0];
        else if (b.problem)
            snprintf(first->message, sizeof first->message, "%.*s", (int)b.problem_len,
                     b.problem);
    }
    release(&a);
    release(&b);
    free(body);
    return same;
}

/* ---- recordings as JSON bodies (invented values: a plain curve plus noise) ------------- */

typedef struct {
    char *s;
    size_t n, cap;
} buf;

static void put(buf *b, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void put(buf *b, const char *fmt, ...)
{
    va_list ap;
    for (;;) {
        va_start(ap, fmt);
        int k = vsnprintf(b->s + b->n, b->cap - b->n, fmt, ap);
        va_end(ap);
        if (k >= 0 && (size_t)k < b->cap - b->n) {
            b->n += (size_t)k;
            return;
        }
        b->cap = b->cap * 2 + (size_t)k + 64;
        b->s = realloc(b->s, b->cap);
    }
}

typedef struct {
    int cycles, samples;
    int style;                  /* how numbers are written: 0..4 */
    const char *sep;            /* whitespace after a comma */
    int cycles_first;           /* the cycles before crank_angle */
    int bad_cycle, bad_sample;  /* this value of the cycles written as bad_text */
    const char *bad_text;
    int bad_angle;              /* this crank angle written as bad_angle_text */
    const char *bad_angle_text;
    int short_cycle;            /* this cycle one value short (-1: none) */
    const char *cycles_key;     /* the key written for the cycles ("cycles") */
    const char *extra;          /* appended before the closing brace */
} rec;

static rec rec_default(int cycles, int samples)
{
    rec r = { cycles, samples, 0, " ", 0, -1, -1, NULL, -1, NULL, -1, "cycles", "" };
    return r;
}

static void put_number(buf *b, double v, int style)
{
    switch (style) {
    case 0: put(b, "%g", v); break;
    case 1: put(b, "%.3f", v); break;
    case 2: put(b, "%.17g", v); break;
    case 3: put(b, "%.6E", v); break;
    default: put(b, "%.0f", v); break;   /* an integer token */
    }
}

static void put_angles(buf *b, const rec *r)
{
    put(b, "\"crank_angle\":%s[", r->sep);
    for (int i = 0; i < r->samples; i++) {
        if (i)
            put(b, ",%s", r->sep);
        if (i == r->bad_angle)
            put(b, "%s", r->bad_angle_text);
        else
            put_number(b, -360.0 + 720.0 * i / r->samples, r->style);
    }
    put(b, "]");
}

static void put_cycles(buf *b, const rec *r)
{
    put(b, "\"%s\":%s[", r->cycles_key, r->sep);
    for (int k = 0; k < r->cycles; k++) {
        put(b, "%s[", k ? ",\n" : "");
        int n = k == r->short_cycle ? r->samples - 1 : r->samples;
        for (int i = 0; i < n; i++) {
            double th = (-360.0 + 720.0 * i / r->samples) / 57.29577951308232;
            double p = 1.0 + 40.0 * exp(-th * th * 8.0) + 0.0001 * (double)(rnd() % 1000);
            if (i)
                put(b, ",%s", r->sep);
            if (k == r->bad_cycle && i == r->bad_sample)
                put(b, "%s", r->bad_text);
            else
                put_number(b, p, r->style);
        }
        put(b, "]");
    }
    put(b, "]");
}

static buf build(const rec *r)
{
    buf b = { NULL, 0, 0 };
    put(&b, "{\"bore\": \"79 mm\", \"stroke\": \"81.5 mm\", \"connecting_rod_length\": \"129 mm\","
        "%s\"compression_ratio\": 10.5, \"pressure_unit\": \"bar\", \"pegging\": {\"method\": "
        "\"intake\", \"intake_pressure\": \"0.92 bar\"},%s", r->sep, r->sep);
    if (r->cycles_first) {
        put_cycles(&b, r);
        put(&b, ",%s", r->sep);
        put_angles(&b, r);
    } else {
        put_angles(&b, r);
        put(&b, ",%s", r->sep);
        put_cycles(&b, r);
    }
    put(&b, "%s}", r->extra);
    return b;
}

/* r's body both ways: they must agree; scanned: it must have gone through
 * the scanner; ptr: the first error's pointer (NULL: no field error
 * expected). Returns the first error (pointer, sentence) for further checks. */
static gc_api_field_error check_rec(const rec *r, int scanned, const char *ptr)
{
    buf b = build(r);
    int before = n_scanned;
    gc_api_field_error first;
    CU_ASSERT_TRUE(both_ways(b.s, b.n, &first));
    if (scanned)
        CU_ASSERT(n_scanned == before + 1);
    if (ptr) {
        if (strcmp(first.field, ptr) != 0)
            fprintf(stderr, "\n  first error at '%s' (%s), expected '%s'\n", first.field,
                    first.message, ptr);
        CU_ASSERT_STRING_EQUAL(first.field, ptr);
    }
    free(b.s);
    return first;
}

static void test_valid_recordings(void)
{
    static const char *const seps[] = { " ", "", "\n", "\t", "\r\n  " };
    for (int style = 0; style < 5; style++)
        for (int s = 0; s < 5; s++) {
            rec r = rec_default(3, 180 + 7 * s);
            r.style = style;
            r.sep = seps[s];
            r.cycles_first = s % 2;
            gc_api_field_error e = check_rec(&r, 1, NULL);
            CU_ASSERT_STRING_EQUAL(e.field, "");
        }
    rec big = rec_default(300, 1440);   /* the size */
    big.style = 1;
    check_rec(&big, 1, NULL);
}

static void test_errors_through_scanner(void)
{
    rec r = rec_default(4, 180);
    r.bad_angle = 17;                   /* beyond the row's bound: scanned, refused */
    r.bad_angle_text = "9000";
    gc_api_field_error e = check_rec(&r, 1, "/crank_angle/17");
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "7200"));
    r = rec_default(4, 200);
    r.short_cycle = 1;                  /* ragged */
    e = check_rec(&r, 1, "/cycles/1");
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "same number"));
    r = rec_default(2, 100);            /* too few values */
    check_rec(&r, 1, "/crank_angle");
    r = rec_default(0, 180);            /* no series */
    check_rec(&r, 1, "/cycles");
    r = rec_default(2, 180);            /* an unknown member beside the series */
    r.extra = ", \"cycels\": [[1, 2]]";
    e = check_rec(&r, 1, "/cycels");
    CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "cycles"));
}

static void test_errors_left_to_jansson(void)
{
    static const char *const not_numbers[] = { "\"x\"", "null", "true", "[1]", "{}",
                                               "\"1.5\"" };
    for (size_t i = 0; i < sizeof not_numbers / sizeof not_numbers[0]; i++) {
        rec r = rec_default(5, 180);
        r.bad_cycle = 3;
        r.bad_sample = 17;
        r.bad_text = not_numbers[i];
        check_rec(&r, 0, "/cycles/3/17");
    }
    static const char *const refused[] = { "01", "1e400", "NaN", "-", "1.", ".5", "+1",
                                           "9223372036854775808", "1,", "1 2", "Infinity" };
    for (size_t i = 0; i < sizeof refused / sizeof refused[0]; i++) {
        rec r = rec_default(2, 180);
        r.bad_cycle = 1;
        r.bad_sample = 179;
        r.bad_text = refused[i];
        gc_api_field_error e = check_rec(&r, 0, "");
        CU_ASSERT_PTR_NOT_NULL(strstr(e.message, "malformed"));
    }
    static const char *const extras[] = {
        ", \"cycles\": [[1]]",                                   /* duplicate */
        ", \"cycl\\u0065s\": [[1]]",                              /* duplicate, escaped */
        ",\n\n  \"speed\": 2000 rpm",                             /* syntax error after */
        ", \"x\": [[[[[[[[[[[[[[[[[[1]]]]]]]]]]]]]]]]]]",         /* nesting too deep */
        "} trailing",
    };
    for (size_t i = 0; i < sizeof extras / sizeof extras[0]; i++) {
        rec r = rec_default(2, 180);
        r.extra = extras[i];
        check_rec(&r, 0, "");
    }
    rec r = rec_default(2, 180);        /* the cycles under an escaped key only */
    r.cycles_key = "cycl\\u0065s";
    check_rec(&r, 0, NULL);
}

static void test_small_documents(void)
{
    static const char *const docs[] = {
        "", " ", "{}", "[]", "[[1]]", "{\"cycles\": [[1, 2]]}", "{\"crank_angle\": []}",
        "{\"crank_angle\": [1, 2], \"crank_angle\": [1, 2]}", "{\"cycles\": [[1], [2]",
        "{\"cycles\": [[1], [2]]", "{\"cycles\": [[1], [2]]}}", "{\"cycles\" [[1]]}",
        "{\"cycles\": [[1],, [2]]}", "{\"cycles\": [[1] [2]]}", "{\"cycles\": [1, 2]}",
        "{\"crank_angle\": [[1, 2]]}", "{\"cycles\": [[]]}", "{\"cycles\": [ ]}",
        "{\"a\": \"]}\\\"\", \"cycles\": [[1]]}", "{\"crank_angle\": [1, 2] , }",
        "{\"crank_angle\":[-0,0.5e1,1E-2]}", "\xef\xbb\xbf{\"cycles\": [[1]]}",
        "{\"cycles\": [[1]]} {", "{\"cycles\": [[1.5]], \"bore\": 0.09}",
    };
    for (size_t i = 0; i < sizeof docs / sizeof docs[0]; i++)
        CU_ASSERT_TRUE(both_ways(docs[i], strlen(docs[i]), NULL));
}

/* Random byte mutations of a small valid body: both ways agree on every one. */
static void test_mutations(void)
{
    static const char set[] = "0123456789-+.eE,[]{}\" \n:x\\";
    rec r = rec_default(2, 180);
    r.style = 0;
    buf base = build(&r);
    long differ = 0, scanned_before = n_scanned;
    for (int it = 0; it < 3000; it++) {
        char *m = malloc(base.n + 4);
        size_t n = base.n;
        memcpy(m, base.s, n);
        for (int k = rnd_int(1, 3); k > 0; k--) {
            size_t at = (size_t)(rnd() % n);
            int op = rnd_int(0, 2);
            char ch = set[rnd() % (sizeof set - 1)];
            if (op == 0) {
                m[at] = ch;
            } else if (op == 1 && n > 2) {
                memmove(m + at, m + at + 1, n - at - 1);
                n--;
            } else if (n < base.n + 3) {
                memmove(m + at + 1, m + at, n - at);
                m[at] = ch;
                n++;
            }
        }
        differ += !both_ways(m, n, NULL);
        free(m);
    }
    printf("\n  3000 mutated bodies, %ld through the scanner, %ld differ\n",
           n_scanned - scanned_before, differ);
    CU_ASSERT_EQUAL(differ, 0);
    CU_ASSERT(n_scanned - scanned_before > 100);   /* most mutations stay numbers */
    free(base.s);
}

/* ---- the route's handler ------------------------------------------------------------------ */

static int handle(const char *body, size_t len, gc_api_response *resp)
{
    gc_api_request req;
    memset(&req, 0, sizeof req);
    req.method = GC_M_POST;
    req.path = "/v1/measured/combustion";
    req.body = body;
    req.body_len = len;
    req.content_type = "application/json";
    memset(resp, 0, sizeof *resp);
    return gc_api_h_preset(&req, resp);
}

static void test_handler(void)
{
    rec r = rec_default(300, 1440);
    r.style = 1;
    buf b = build(&r);
    gc_api_response resp;
    handle(b.s, b.n, &resp);
    CU_ASSERT_EQUAL(resp.status, 200);
    if (resp.status != 200)
        fprintf(stderr, "\n  %.400s\n", resp.body ? resp.body : "");
    json_t *doc = resp.body ? json_loadb(resp.body, resp.body_len, 0, NULL) : NULL;
    json_t *rec_doc = json_object_get(doc, "recording");
    CU_ASSERT_EQUAL(json_integer_value(json_object_get(rec_doc, "cycles")), 300);
    CU_ASSERT_EQUAL(json_integer_value(json_object_get(rec_doc, "samples")), 1440);
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(rec_doc, "source")), "json");
    json_decref(doc);
    free(resp.body);
    free(b.s);
    long n = comb->max_json_values + 1;   /* one value over: 413 before parsing */
    buf big = { NULL, 0, 0 };
    put(&big, "{\"crank_angle\": [0], \"cycles\": [[");
    for (long i = 0; i < n; i++)
        put(&big, i ? ",1" : "1");
    put(&big, "]]}");
    handle(big.s, big.n, &resp);
    CU_ASSERT_EQUAL(resp.status, 413);
    CU_ASSERT_PTR_NOT_NULL(resp.body ? strstr(resp.body, "max_json_values") : NULL);
    free(resp.body);
    free(big.s);
}

int main(void)
{
    comb = gc_preset_find("combustion");
    if (!comb) {
        fprintf(stderr, "no combustion preset\n");
        return 1;
    }
    static const gc_test_case cases[] = {
        { "numbers: random, jansson's value bit for bit", test_numbers_random },
        { "numbers: edge spellings, read or refused as jansson does", test_numbers_edges },
        { "valid recordings: the same series both ways", test_valid_recordings },
        { "errors found with the scanner: same as jansson's", test_errors_through_scanner },
        { "errors left to jansson: same answer", test_errors_left_to_jansson },
        { "small and odd documents: same answer", test_small_documents },
        { "random mutations: same answer", test_mutations },
        { "the handler: a full recording, max_json_values", test_handler },
        { NULL, NULL },
    };
    return gc_run_suite("series_scan", cases);
}
