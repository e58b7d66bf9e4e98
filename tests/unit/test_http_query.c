/*
 * test_http_query.c — the HTTP layer's request-target parser
 * (service/http/query.h) and the cost budget of api.h (service/api/limits.c):
 * percent-decoding rules, '+' as a space in the query only, parameters
 * without '=', empty parts, absolute-form targets (RFC 9112, section 3.2.2),
 * the limits on length and parameter count exactly at and one past, the
 * refusal of an encoded NUL (issue 12: "compression_ratio=10%00junk" must
 * not read as 10), JSON pointers of dotted keys (RFC 6901 escapes), and the
 * budget's evaluation count, deadline, cancel flag and stickiness.
 */
#include "check.h"
#include "http/query.h"

#include <stdatomic.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static void parse(const char *raw, size_t max_len, size_t max_params, gc_http_target *t)
{
    gc_http_target_parse(raw, strlen(raw), max_len, max_params, t);
}

static void test_decoding(void)
{
    gc_http_target t;
    parse("/v1/cycles/otto?compression_ratio=10.5&T=15%20degC&x=a+b&note=100%&z=%zz", 1000, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_OK);
    CU_ASSERT_STRING_EQUAL(t.path, "/v1/cycles/otto");
    CU_ASSERT_EQUAL(t.n_params, 5);
    CU_ASSERT_STRING_EQUAL(t.params[0].key, "compression_ratio");
    CU_ASSERT_STRING_EQUAL(t.params[0].value, "10.5");
    CU_ASSERT_STRING_EQUAL(t.params[1].value, "15 degC");
    CU_ASSERT_STRING_EQUAL(t.params[2].value, "a b");      /* '+' is a space in a query */
    CU_ASSERT_STRING_EQUAL(t.params[3].value, "100%");     /* a lone '%' stays as written */
    CU_ASSERT_STRING_EQUAL(t.params[4].value, "%zz");
    gc_http_target_free(&t);

    parse("/a+b/%7e?flag&&k=&=v", 1000, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_OK);
    CU_ASSERT_STRING_EQUAL(t.path, "/a+b/~");               /* '+' is literal in a path */
    CU_ASSERT_EQUAL(t.n_params, 3);                         /* the empty part is skipped */
    CU_ASSERT_STRING_EQUAL(t.params[0].key, "flag");
    CU_ASSERT_STRING_EQUAL(t.params[0].value, "");
    CU_ASSERT_STRING_EQUAL(t.params[1].key, "k");
    CU_ASSERT_STRING_EQUAL(t.params[1].value, "");
    CU_ASSERT_STRING_EQUAL(t.params[2].key, "");
    CU_ASSERT_STRING_EQUAL(t.params[2].value, "v");
    gc_http_target_free(&t);

    parse("http://plant.example:8080/healthz?a=1", 1000, 10, &t);
    CU_ASSERT_STRING_EQUAL(t.path, "/healthz");
    CU_ASSERT_EQUAL(t.n_params, 1);
    gc_http_target_free(&t);
    parse("*", 1000, 10, &t);
    CU_ASSERT_STRING_EQUAL(t.path, "*");
    gc_http_target_free(&t);
}

static void test_nul(void)
{
    gc_http_target t;
    parse("/v1/cycles/otto?compression_ratio=10%00junk", 1000, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_NUL_IN_QUERY);
    CU_ASSERT_STRING_EQUAL(t.bad_key, "compression_ratio");
    gc_http_target_free(&t);
    parse("/v1/properties?T=300&ga%00s=air", 1000, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_NUL_IN_QUERY);
    CU_ASSERT_STRING_EQUAL(t.bad_key, "ga%00s");            /* shown, not cut */
    gc_http_target_free(&t);
    parse("/v1/properties%00junk?T=300", 1000, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_NUL_IN_PATH);
    CU_ASSERT_STRING_EQUAL(t.path, "/v1/properties%00junk");
    gc_http_target_free(&t);
}

static void test_limits(void)
{
    gc_http_target t;
    char raw[64];
    memset(raw, 'a', sizeof raw);
    raw[0] = '/';
    gc_http_target_parse(raw, 32, 32, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_OK);               /* exactly at the limit */
    gc_http_target_free(&t);
    gc_http_target_parse(raw, 33, 32, 10, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_TOO_LONG);         /* one past */
    CU_ASSERT_EQUAL(t.raw_len, 33);
    gc_http_target_free(&t);
    parse("/p?a&b&c", 100, 3, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_OK);
    CU_ASSERT_EQUAL(t.n_params, 3);
    gc_http_target_free(&t);
    parse("/p?a&b&c&d", 100, 3, &t);
    CU_ASSERT_EQUAL(t.problem, GC_TARGET_TOO_MANY_PARAMS);
    CU_ASSERT_EQUAL(t.counted, 4);
    CU_ASSERT_EQUAL(t.n_params, 0);                         /* nothing decoded past the limit */
    gc_http_target_free(&t);
}

static void test_key_pointer(void)
{
    char p[32];
    gc_http_key_pointer("site.altitude", p, sizeof p);
    CU_ASSERT_STRING_EQUAL(p, "/site/altitude");
    gc_http_key_pointer("a~b/c", p, sizeof p);             /* RFC 6901: ~0 and ~1 */
    CU_ASSERT_STRING_EQUAL(p, "/a~0b~1c");
    gc_http_key_pointer("", p, sizeof p);
    CU_ASSERT_STRING_EQUAL(p, "/");
    gc_http_key_pointer("abcdefghijklmnopqrstuvwxyzabcdefghij", p, 8);
    CU_ASSERT_STRING_EQUAL(p, "/abcdef");                  /* cut to fit, still terminated */
}

static void test_budget(void)
{
    gc_api_budget b;
    memset(&b, 0, sizeof b);
    CU_ASSERT_EQUAL(gc_api_budget_charge(NULL, 1000000), 0);  /* no budget: no limit */
    b.max_evaluations = 3;
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), 0);
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 2), 0);          /* exactly 3 */
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), -1);         /* one past */
    CU_ASSERT_EQUAL(b.exceeded, GC_API_BUDGET_EVALUATIONS);
    CU_ASSERT_EQUAL(b.evaluations, 3);
    b.max_evaluations = 0;
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), -1);         /* sticky */

    memset(&b, 0, sizeof b);
    b.max_evaluations = 10;
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, (unsigned long)-1), -1);  /* no wrap-around */

    memset(&b, 0, sizeof b);
    b.deadline_ns = 1;   /* long past on CLOCK_MONOTONIC */
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), -1);
    CU_ASSERT_EQUAL(b.exceeded, GC_API_BUDGET_TIME);

    atomic_int cancel = 0;
    memset(&b, 0, sizeof b);
    b.cancel = &cancel;
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), 0);
    atomic_store(&cancel, 1);
    CU_ASSERT_EQUAL(gc_api_budget_charge(&b, 1), -1);
    CU_ASSERT_EQUAL(b.exceeded, GC_API_BUDGET_CANCELLED);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "percent-decoding, '+', empty parts, absolute form", test_decoding },
        { "an encoded NUL is refused, never decoded", test_nul },
        { "target length and parameter count at and one past the limit", test_limits },
        { "JSON pointers of dotted keys", test_key_pointer },
        { "the cost budget: count, deadline, cancel", test_budget },
        { NULL, NULL },
    };
    return gc_run_suite("http_query", cases);
}
